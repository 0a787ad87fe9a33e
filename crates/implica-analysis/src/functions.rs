//! Each signal's Boolean function over the primary inputs, with
//! intermediate signals composed in, as BDDs.
//!
//! Don't-cares belong to the signal that states them (a `dc(...)` list, a
//! `-` in a table's output column, a table row that is missing or in
//! conflict). Such a signal may be built as 0 or 1 there, and a signal that
//! reads it sees whichever value was built. So each signal with freedom
//! gets a *choice variable* (numbered after the primary inputs): its value
//! is `on | free & choice`. A reader's value then depends on those choices;
//! it is 1 for sure where it is 1 for every choice (`lower`), may be 1 where
//! it is 1 for some choice (`upper`), and free in between. Quantifying only
//! at the end keeps the choices shared: `w ^ w` is 0 even when `w` is free.
//!
//! The input combinations of `never` statements (those that are impossible
//! for every choice) are don't-cares of every signal.

use crate::model::{Body, Model, SignalId};
use implica_logic::{Bdd, BddRef, Effort, Interrupted};
use implica_syntax::ast::{BinOp, CellValue, Expr, ExprKind, RowKind, TermEntry, TermKind};

/// Why a signal has no known function.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Unknown {
    /// It reads this signal, which is neither an input nor defined.
    Undefined(SignalId),
    /// It is on a cycle of definitions, or reads a signal that is.
    Cyclic,
    /// Its definition (or one it reads) has a syntax error or does not fit
    /// together (a table row of the wrong width).
    Malformed,
    /// Its function needs more work or memory than the budget allows.
    TooLarge,
}

impl Unknown {
    /// Why a signal has no function, in words, as the end of "it has no
    /// function: ...".
    pub fn describe(self, model: &Model) -> String {
        match self {
            Unknown::Undefined(x) => format!(
                "it reads `{}`, which is neither an input nor defined",
                model.signals[x].name
            ),
            Unknown::Cyclic => {
                "it depends on itself through a cycle of definitions (see `implica check`)"
                    .to_string()
            }
            Unknown::Malformed => {
                "its definition, or one it reads, has errors (see `implica check`)".to_string()
            }
            Unknown::TooLarge => {
                "its function takes more work to compute than the budget allows".to_string()
            }
        }
    }
}

/// A signal's function.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Known {
    /// Over the primary inputs and the choice variables.
    pub full: BddRef,
    /// Where it is 1 whatever the choices (over the primary inputs).
    pub lower: BddRef,
    /// Where it is 1 for some choice (over the primary inputs).
    pub upper: BddRef,
}

/// A signal's function, or why there is none.
pub type Value = Result<Known, Unknown>;

/// The function of one signal over the inputs it reads, ready for the
/// logic engine: it is 1 on `on`, free on `dc`, 0 elsewhere, and depends on
/// no input outside `inputs`.
#[derive(Debug, Clone)]
pub struct Local {
    /// Indices of the primary inputs the signal reads, directly or through
    /// other signals, in declaration order.
    pub inputs: Vec<usize>,
    pub on: BddRef,
    pub dc: BddRef,
}

/// The functions of an edited document, in the manager of the original
/// (see [`Functions::edited`]).
pub struct Edited {
    /// By signal of the edited document's model.
    pub values: Vec<Value>,
    pub impossible: BddRef,
}

/// The names of a model's primary inputs, in declaration order.
fn input_names<'m>(m: &'m Model) -> Vec<&'m str> {
    m.inputs
        .iter()
        .map(|&s| m.signals[s].name.as_str())
        .collect()
}

/// Choice variables a new manager has room for, per signal.
pub(crate) const CHOICE_ROOM: usize = 16;

/// The functions of all signals of one document.
pub struct Functions {
    pub bdd: Bdd,
    /// Number of primary inputs (BDD variables `0..inputs`).
    pub inputs: usize,
    values: Vec<Value>,
    /// Primary inputs each signal reads, by input index, ascending.
    reads: Vec<Vec<usize>>,
    /// Where some `never` statement holds, for every choice.
    pub impossible: BddRef,
    next_choice: usize,
    /// While [`Functions::edited`] computes a version without some unread
    /// inputs: the variable of each of its inputs.
    input_vars: Option<Vec<usize>>,
}

enum Fail {
    Unknown(Unknown),
    Stop(Interrupted),
}

impl From<Interrupted> for Fail {
    fn from(i: Interrupted) -> Fail {
        Fail::Stop(i)
    }
}

impl From<Unknown> for Fail {
    fn from(u: Unknown) -> Fail {
        Fail::Unknown(u)
    }
}

/// A computation's outcome, with running out of budget as
/// [`Unknown::TooLarge`]; only cancellation is an error.
fn settled<T>(r: Result<T, Fail>) -> Result<Result<T, Unknown>, Interrupted> {
    match r {
        Ok(v) => Ok(Ok(v)),
        Err(Fail::Unknown(u)) => Ok(Err(u)),
        Err(Fail::Stop(Interrupted::OutOfBudget)) => Ok(Err(Unknown::TooLarge)),
        Err(Fail::Stop(Interrupted::Cancelled)) => Err(Interrupted::Cancelled),
    }
}

/// Work allowed per definition (and per `never` statement) by default.
pub const DEFAULT_WORK_PER_DEFINITION: u64 = 2_000_000;

impl Functions {
    /// Computes every signal's function. Each definition gets
    /// `work_per_definition` units; past them that signal (and those that
    /// read it) is [`Unknown::TooLarge`]. Only cancellation stops the whole.
    pub fn compute(
        model: &Model,
        work_per_definition: u64,
        cancel: Option<&dyn Fn() -> bool>,
    ) -> Result<Functions, Interrupted> {
        let inputs = model.inputs.len();
        // Room for a choice variable per signal, and for those of edited
        // versions computed in the same manager (`edited`, and a session's
        // later versions: `update`). A variable costs nothing until used.
        let vars = inputs + CHOICE_ROOM * model.signals.len() + 4096;
        let mut f = Functions {
            bdd: Bdd::new(vars),
            inputs,
            values: vec![Err(Unknown::Cyclic); model.signals.len()],
            reads: vec![Vec::new(); model.signals.len()],
            impossible: BddRef::FALSE,
            next_choice: inputs,
            input_vars: None,
        };
        let effort = || {
            let e = Effort::new(work_per_definition);
            match cancel {
                Some(c) => e.with_cancel(c),
                None => e,
            }
        };
        for &s in &model.order {
            f.values[s] = f.computed(model, s, &mut effort())?;
            f.reads[s] = f.input_reads(model, s);
        }
        f.impossible = f.impossible_of(model, &effort)?;
        Ok(f)
    }

    /// The functions of an edited version of the document, computed in
    /// this manager so that they compare with this version's by reference.
    /// A signal whose definition reads the same text and whose inputs have
    /// the same values keeps its function without recomputing it; only
    /// what an edit touches is computed again. The edited version may drop
    /// inputs that nothing reads (its inputs keep this version's variables);
    /// returns `None` when the primary inputs differ otherwise (a new
    /// manager is needed then). The values of this version are left as they
    /// were.
    pub fn edited(
        &mut self,
        old: (&Model, &str),
        new: (&Model, &str),
        work_per_definition: u64,
    ) -> Option<Result<Edited, Interrupted>> {
        let (om, nm) = (old.0, new.0);
        let (old_names, new_names) = (input_names(om), input_names(nm));
        // The old variable of each new input: the same names in the same
        // order, less inputs the old version never reads.
        let mut map = Vec::with_capacity(new_names.len());
        let mut j = 0;
        for n in &new_names {
            while j < old_names.len() && &old_names[j] != n {
                if !om.signals[om.inputs[j]].references.is_empty() {
                    return None;
                }
                j += 1;
            }
            if j == old_names.len() {
                return None;
            }
            map.push(j);
            j += 1;
        }
        if om.inputs[j..]
            .iter()
            .any(|&x| !om.signals[x].references.is_empty())
        {
            return None;
        }
        let identity = map.iter().enumerate().all(|(i, &v)| i == v) && map.len() == old_names.len();
        self.input_vars = (!identity).then_some(map);
        let saved_values = std::mem::replace(
            &mut self.values,
            vec![Err(Unknown::Cyclic); nm.signals.len()],
        );
        let saved_reads = std::mem::replace(&mut self.reads, vec![Vec::new(); nm.signals.len()]);
        let saved_impossible = self.impossible;
        let result = self.recompute(
            old,
            new,
            (&saved_values, &saved_reads),
            work_per_definition,
            None,
        );
        self.input_vars = None;
        let values = std::mem::replace(&mut self.values, saved_values);
        self.reads = saved_reads;
        let impossible = std::mem::replace(&mut self.impossible, saved_impossible);
        Some(result.map(|()| Edited { values, impossible }))
    }

    /// Makes these the functions of an edited version of the document, as
    /// [`Functions::edited`] computes them, in place: what the edit did not
    /// touch is kept. Returns `None` (and changes nothing) unless both
    /// versions have the same inputs in the same order; after an error the
    /// values are of neither version and must not be used.
    pub fn update(
        &mut self,
        old: (&Model, &str),
        new: (&Model, &str),
        work_per_definition: u64,
        cancel: Option<&dyn Fn() -> bool>,
    ) -> Option<Result<(), Interrupted>> {
        if input_names(old.0) != input_names(new.0) || self.input_vars.is_some() {
            return None;
        }
        let saved_values = std::mem::replace(
            &mut self.values,
            vec![Err(Unknown::Cyclic); new.0.signals.len()],
        );
        let saved_reads = std::mem::replace(&mut self.reads, vec![Vec::new(); new.0.signals.len()]);
        Some(self.recompute(
            old,
            new,
            (&saved_values, &saved_reads),
            work_per_definition,
            cancel,
        ))
    }

    /// The values, reads and impossible combinations of version `new` into
    /// `self` (whose vectors are fresh), reusing version `old`'s (`saved`)
    /// for each signal whose statement text and read values are the same.
    fn recompute<'s>(
        &mut self,
        old: (&Model, &'s str),
        new: (&Model, &'s str),
        saved: (&[Value], &[Vec<usize>]),
        work_per_definition: u64,
        cancel: Option<&dyn Fn() -> bool>,
    ) -> Result<(), Interrupted> {
        let (om, osrc) = old;
        let (nm, nsrc) = new;
        let (saved_values, saved_reads) = saved;
        let effort = || {
            let e = Effort::new(work_per_definition);
            match cancel {
                Some(c) => e.with_cancel(c),
                None => e,
            }
        };
        let text_of = |m: &Model, src: &'s str, s: SignalId| -> Option<(&'s str, usize)> {
            let d = m.definition_of(s)?;
            let item = &m.file.items[d.item];
            let column = match d.body {
                Body::Column { column, .. } => column,
                _ => usize::MAX,
            };
            Some((src.get(item.span.start..item.span.end)?, column))
        };
        for &s in &nm.order {
            let name = &nm.signals[s].name;
            let reuse = om.signal(name).and_then(|o| {
                let same_text =
                    text_of(om, osrc, o).is_some() && text_of(om, osrc, o) == text_of(nm, nsrc, s);
                let same_reads = nm.definition_of(s).is_some_and(|d| {
                    d.reads.iter().all(|&r| {
                        om.signal(&nm.signals[r].name)
                            .is_some_and(|or| saved_values[or] == self.values[r])
                    })
                });
                let same_kind = om.signals[o].input_index
                    == nm.signals[s].input_index.map(|i| self.input_var(i));
                // An unknown value names signals of the old model: computed
                // again (it is cheap), so that it names the new one's.
                (same_text && same_reads && same_kind && saved_values[o].is_ok())
                    .then(|| (saved_values[o], saved_reads[o].clone()))
            });
            if let Some((v, r)) = reuse {
                self.values[s] = v;
                self.reads[s] = r;
                continue;
            }
            self.values[s] = self.computed(nm, s, &mut effort())?;
            self.reads[s] = self.input_reads(nm, s);
        }
        self.impossible = BddRef::FALSE;
        self.impossible = self.impossible_of(nm, &effort)?;
        Ok(())
    }

    /// Signal `s`'s value, with running out of budget as
    /// [`Unknown::TooLarge`]; only cancellation is an error.
    fn computed(
        &mut self,
        model: &Model,
        s: SignalId,
        e: &mut Effort,
    ) -> Result<Value, Interrupted> {
        settled(self.signal_value(model, s, e))
    }

    /// The primary inputs `s` reads, from those of the signals it reads
    /// (which come before it in the evaluation order).
    fn input_reads(&self, model: &Model, s: SignalId) -> Vec<usize> {
        if let Some(i) = model.signals[s].input_index {
            return vec![i];
        }
        let mut r: Vec<usize> = model
            .definition_of(s)
            .map(|d| {
                d.reads
                    .iter()
                    .flat_map(|&x| self.reads[x].clone())
                    .collect()
            })
            .unwrap_or_default();
        r.sort_unstable();
        r.dedup();
        r
    }

    /// Where some `never` statement holds for every choice. A statement
    /// that cannot be computed within its budget frees nothing.
    fn impossible_of<'c>(
        &mut self,
        model: &Model,
        effort: &dyn Fn() -> Effort<'c>,
    ) -> Result<BddRef, Interrupted> {
        let mut impossible = BddRef::FALSE;
        for st in &model.never {
            let mut e = effort();
            let sure = (|| -> Result<BddRef, Fail> {
                let v = self.expr(model, st.body, &mut e)?;
                Ok(self.bdd.forall_from(v, self.inputs, &mut e)?)
            })();
            match sure {
                Ok(v) => match self.bdd.or(impossible, v, &mut effort()) {
                    Ok(i) => impossible = i,
                    Err(Interrupted::Cancelled) => return Err(Interrupted::Cancelled),
                    Err(Interrupted::OutOfBudget) => {}
                },
                Err(Fail::Stop(Interrupted::Cancelled)) => return Err(Interrupted::Cancelled),
                Err(_) => {}
            }
        }
        Ok(impossible)
    }

    /// Choice variables not yet given to a signal with don't-cares (each
    /// computation of such a signal takes a new one).
    pub fn choices_left(&self) -> usize {
        self.bdd.vars().saturating_sub(self.next_choice)
    }

    /// The function of a signal.
    pub fn value(&self, s: SignalId) -> Value {
        self.values[s]
    }

    /// The primary inputs (by index) a signal reads, directly or not.
    pub fn reads(&self, s: SignalId) -> &[usize] {
        &self.reads[s]
    }

    /// The function of a signal over the inputs it reads, with its own and
    /// its readers' freedom and the impossible combinations as don't-cares.
    /// An impossible combination counts only where it is impossible for
    /// every value of the inputs the signal does not read.
    pub fn local(
        &mut self,
        s: SignalId,
        effort: &mut Effort,
    ) -> Result<Result<Local, Unknown>, Interrupted> {
        let k = match self.values[s] {
            Ok(k) => k,
            Err(u) => return Ok(Err(u)),
        };
        let inputs = self.reads[s].clone();
        let mut others = vec![true; self.inputs];
        for &i in &inputs {
            others[i] = false;
        }
        let impossible = self.bdd.forall(self.impossible, &others, effort)?;
        let free = self.bdd.xor(k.upper, k.lower, effort)?;
        let dc = self.bdd.or(free, impossible, effort)?;
        let not_dc = self.bdd.not(dc, effort)?;
        let on = self.bdd.and(k.lower, not_dc, effort)?;
        Ok(Ok(Local { inputs, on, dc }))
    }

    /// The function a term list or a table column states over its own
    /// header, before the header signals' functions are composed in: in
    /// the result, variable `j` (and `inputs[j] == j`) is the `j`-th name of
    /// the `over (...)` list or of the table's input columns. Rows listed
    /// as don't-cares, in conflict or missing are its don't-cares. An
    /// expression body has no header: [`Unknown::Malformed`].
    pub fn listed_over_header(
        &mut self,
        body: Body,
        effort: &mut Effort,
    ) -> Result<Result<Local, Unknown>, Interrupted> {
        let Some(k) = body.header().map(<[_]>::len) else {
            return Ok(Err(Unknown::Malformed));
        };
        if k > self.bdd.vars() {
            return Ok(Err(Unknown::TooLarge));
        }
        let computed = (|| -> Result<Local, Fail> {
            let over = (0..k)
                .map(|j| self.bdd.var(j))
                .collect::<Result<Vec<_>, _>>()?;
            let (on, dc) = self.listed(body, &over, effort)?;
            Ok(Local {
                inputs: (0..k).collect(),
                on,
                dc,
            })
        })();
        settled(computed)
    }

    /// The value of an expression (of a `never`, an `assert`, or a
    /// definition's right-hand side) over the primary inputs and the choice
    /// variables, the way definitions read signals: each name stands for
    /// its signal's `full` function.
    pub fn expr_value(
        &mut self,
        model: &Model,
        x: &Expr,
        effort: &mut Effort,
    ) -> Result<Result<BddRef, Unknown>, Interrupted> {
        match self.expr(model, x, effort) {
            Ok(v) => Ok(Ok(v)),
            Err(Fail::Unknown(u)) => Ok(Err(u)),
            Err(Fail::Stop(i)) => Err(i),
        }
    }

    fn signal_value(&mut self, model: &Model, s: SignalId, e: &mut Effort) -> Result<Known, Fail> {
        if let Some(i) = model.signals[s].input_index {
            let v = self.bdd.var(self.input_var(i))?;
            return Ok(Known {
                full: v,
                lower: v,
                upper: v,
            });
        }
        let Some(def) = model.definition_of(s) else {
            return Err(Unknown::Undefined(s).into());
        };
        let (on, free) = match (def.body, def.body.header()) {
            (Body::Expr(x), _) => (self.expr(model, x, e)?, BddRef::FALSE),
            (body, header) => {
                let header = header.unwrap_or_default().iter();
                let over = self.names(model, header.map(|n| n.text.as_str()))?;
                self.listed(body, &over, e)?
            }
        };
        let full = if free == BddRef::FALSE {
            on
        } else {
            if self.next_choice >= self.bdd.vars() {
                return Err(Unknown::TooLarge.into());
            }
            let choice = self.bdd.var(self.next_choice)?;
            self.next_choice += 1;
            let chosen = self.bdd.and(free, choice, e)?;
            self.bdd.or(on, chosen, e)?
        };
        let lower = self.bdd.forall_from(full, self.inputs, e)?;
        let upper = self.bdd.exists_from(full, self.inputs, e)?;
        Ok(Known { full, lower, upper })
    }

    /// The value of a term list or a table column as a function of its
    /// header signals, whose values are `over`: where it is 1, and where it
    /// is free (rows listed as don't-cares, in conflict, or missing).
    fn listed(
        &mut self,
        body: Body,
        over: &[BddRef],
        e: &mut Effort,
    ) -> Result<(BddRef, BddRef), Fail> {
        Ok(match body {
            Body::Terms(t) => {
                let list = |kind| t.parts.iter().find(|p| p.kind == kind);
                let dc = match list(TermKind::Dc) {
                    Some(p) => self.rows(over, &p.entries, e)?,
                    None => BddRef::FALSE,
                };
                let listed_on = match (list(TermKind::On), list(TermKind::Off)) {
                    (Some(p), None) => self.rows(over, &p.entries, e)?,
                    (None, Some(p)) => {
                        let off = self.rows(over, &p.entries, e)?;
                        self.bdd.not(off, e)?
                    }
                    _ => return Err(Unknown::Malformed.into()),
                };
                // A row listed both as a value and as a don't-care is free.
                let not_dc = self.bdd.not(dc, e)?;
                (self.bdd.and(listed_on, not_dc, e)?, dc)
            }
            Body::Column { table, column } => {
                let ins = over;
                let width = table.outputs.len();
                let (mut ones, mut zeros, mut listed) =
                    (BddRef::FALSE, BddRef::FALSE, BddRef::FALSE);
                let mut unlisted = None;
                for row in &table.rows {
                    match &row.kind {
                        RowKind::Cells { inputs, outputs } => {
                            if inputs.len() != ins.len() || outputs.len() != width {
                                return Err(Unknown::Malformed.into());
                            }
                            let mut pattern = BddRef::TRUE;
                            for (cell, &v) in inputs.iter().zip(ins) {
                                let lit = match cell.value {
                                    CellValue::One => v,
                                    CellValue::Zero => self.bdd.not(v, e)?,
                                    CellValue::Dash => continue,
                                };
                                pattern = self.bdd.and(pattern, lit, e)?;
                            }
                            listed = self.bdd.or(listed, pattern, e)?;
                            match outputs[column].value {
                                CellValue::One => ones = self.bdd.or(ones, pattern, e)?,
                                CellValue::Zero => zeros = self.bdd.or(zeros, pattern, e)?,
                                CellValue::Dash => {}
                            }
                        }
                        RowKind::Unlisted { outputs } => {
                            if outputs.len() != width {
                                return Err(Unknown::Malformed.into());
                            }
                            unlisted = Some(outputs[column].value);
                        }
                        RowKind::Error => return Err(Unknown::Malformed.into()),
                    }
                }
                if let Some(value) = unlisted {
                    let rest = self.bdd.not(listed, e)?;
                    match value {
                        CellValue::One => ones = self.bdd.or(ones, rest, e)?,
                        CellValue::Zero => zeros = self.bdd.or(zeros, rest, e)?,
                        CellValue::Dash => {}
                    }
                }
                // Rows in conflict, rows with `-` and missing rows are free.
                let (not_ones, not_zeros) = (self.bdd.not(ones, e)?, self.bdd.not(zeros, e)?);
                let on = self.bdd.and(ones, not_zeros, e)?;
                let off = self.bdd.and(zeros, not_ones, e)?;
                let fixed = self.bdd.or(on, off, e)?;
                (on, self.bdd.not(fixed, e)?)
            }
            Body::Expr(_) => return Err(Unknown::Malformed.into()),
        })
    }

    /// The BDD variable of primary input `i` (its own index, except while
    /// an edited version with fewer inputs is computed).
    fn input_var(&self, i: usize) -> usize {
        self.input_vars.as_ref().map_or(i, |m| m[i])
    }

    fn name(&self, model: &Model, name: &str) -> Result<BddRef, Fail> {
        let Some(s) = model.signal(name) else {
            return Err(Unknown::Malformed.into());
        };
        match self.values[s] {
            Ok(k) => Ok(k.full),
            Err(u) => Err(u.into()),
        }
    }

    fn names<'n>(
        &self,
        model: &Model,
        names: impl Iterator<Item = &'n str>,
    ) -> Result<Vec<BddRef>, Fail> {
        names.map(|n| self.name(model, n)).collect()
    }

    /// The rows listed by term-list entries, as a function of the `over`
    /// signals (the first one the most significant bit). The entries are
    /// merged into disjoint ranges, and the function is built by splitting
    /// the rows on one `over` signal at a time, first to last: a part
    /// with no listed row is 0 and a part wholly listed is 1, so the work
    /// grows with the ranges times the signals, never with the rows a
    /// range spans.
    fn rows(
        &mut self,
        over: &[BddRef],
        entries: &[TermEntry],
        e: &mut Effort,
    ) -> Result<BddRef, Fail> {
        let k = over.len();
        if k > 64 {
            return Err(Unknown::Malformed.into());
        }
        let last = if k == 64 { u64::MAX } else { (1u64 << k) - 1 };
        let mut ranges = Vec::with_capacity(entries.len());
        for entry in entries {
            let (lo, hi) = match entry {
                TermEntry::Single(n) => (n.value, n.value),
                TermEntry::Range(a, b) => (a.value, b.value),
            };
            let (Some(lo), Some(hi)) = (lo, hi) else {
                return Err(Unknown::Malformed.into());
            };
            if lo > hi || hi > last {
                return Err(Unknown::Malformed.into());
            }
            ranges.push((lo, hi));
        }
        ranges.sort_unstable();
        let mut merged: Vec<(u64, u64)> = Vec::with_capacity(ranges.len());
        for (lo, hi) in ranges {
            match merged.last_mut() {
                Some(prev) if lo <= prev.1.saturating_add(1) => prev.1 = prev.1.max(hi),
                _ => merged.push((lo, hi)),
            }
        }
        let negated = over
            .iter()
            .map(|&v| self.bdd.not(v, e))
            .collect::<Result<Vec<_>, _>>()?;
        Ok(self.split_rows(over, &negated, 0, 0, &merged, e)?)
    }

    /// The rows of `ranges` (disjoint, ascending, not adjacent, each
    /// meeting the part) within the part of the rows whose bits before
    /// `j` are those of `base`, as a function of `over[j..]`.
    fn split_rows(
        &mut self,
        over: &[BddRef],
        negated: &[BddRef],
        j: usize,
        base: u128,
        ranges: &[(u64, u64)],
        e: &mut Effort,
    ) -> Result<BddRef, Interrupted> {
        let k = over.len();
        let end = base + (1u128 << (k - j)) - 1;
        match ranges {
            [] => return Ok(BddRef::FALSE),
            [(lo, hi)] if u128::from(*lo) <= base && u128::from(*hi) >= end => {
                return Ok(BddRef::TRUE);
            }
            _ => {}
        }
        e.spend(1)?;
        // Ranges not adjacent cannot fill a part together, so a part with
        // a range left has a row to split on: j < k.
        let mid = base + (1u128 << (k - j - 1));
        let below = ranges.partition_point(|&(lo, _)| u128::from(lo) < mid);
        let above = ranges.partition_point(|&(_, hi)| u128::from(hi) < mid);
        let zero = self.split_rows(over, negated, j + 1, base, &ranges[..below], e)?;
        let one = self.split_rows(over, negated, j + 1, mid, &ranges[above..], e)?;
        if zero == one {
            return Ok(zero);
        }
        let with_one = self.bdd.and(over[j], one, e)?;
        let with_zero = self.bdd.and(negated[j], zero, e)?;
        self.bdd.or(with_one, with_zero, e)
    }

    fn expr(&mut self, model: &Model, x: &Expr, e: &mut Effort) -> Result<BddRef, Fail> {
        match &x.kind {
            ExprKind::Name(n) => self.name(model, &n.text),
            ExprKind::Const(b) => Ok(if *b { BddRef::TRUE } else { BddRef::FALSE }),
            ExprKind::Not { operand, .. } => {
                let v = self.expr(model, operand, e)?;
                Ok(self.bdd.not(v, e)?)
            }
            ExprKind::Paren(inner) => self.expr(model, inner, e),
            ExprKind::Error => Err(Unknown::Malformed.into()),
            ExprKind::Chain { operands, ops } => {
                let vals = operands
                    .iter()
                    .map(|o| self.expr(model, o, e))
                    .collect::<Result<Vec<_>, _>>()?;
                if vals.len() != ops.len() + 1 {
                    return Err(Unknown::Malformed.into());
                }
                if ops.iter().all(|o| o.op == BinOp::Implies) {
                    // `a => b => c` is `a => (b => c)`.
                    let mut acc = vals[vals.len() - 1];
                    for &v in vals[..vals.len() - 1].iter().rev() {
                        let nv = self.bdd.not(v, e)?;
                        acc = self.bdd.or(nv, acc, e)?;
                    }
                    return Ok(acc);
                }
                let mut acc = vals[0];
                for (op, &v) in ops.iter().zip(&vals[1..]) {
                    acc = match op.op {
                        BinOp::And => self.bdd.and(acc, v, e)?,
                        BinOp::Or => self.bdd.or(acc, v, e)?,
                        BinOp::Xor | BinOp::Ne => self.bdd.xor(acc, v, e)?,
                        BinOp::Nand => {
                            let a = self.bdd.and(acc, v, e)?;
                            self.bdd.not(a, e)?
                        }
                        BinOp::Nor => {
                            let a = self.bdd.or(acc, v, e)?;
                            self.bdd.not(a, e)?
                        }
                        BinOp::Xnor | BinOp::Eq => {
                            let a = self.bdd.xor(acc, v, e)?;
                            self.bdd.not(a, e)?
                        }
                        // A chain mixes `=>` only with itself (one level).
                        BinOp::Implies => return Err(Unknown::Malformed.into()),
                    };
                }
                Ok(acc)
            }
        }
    }
}
