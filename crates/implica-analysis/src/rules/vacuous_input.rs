//! # `vacuous-input`
//!
//! **What it finds.** An input that a definition names although the
//! signal's value never depends on it, neither where it is named nor
//! through the other signals the definition reads: for every value of the
//! other inputs, the signal is the same whether the input is 0 or 1.
//!
//! - Input combinations excluded by `never` do not count: where one of the
//!   two values of the input is impossible, there is nothing to compare.
//!   As when the signal is minimized, a combination is impossible only if
//!   it is impossible whatever the inputs the signal does not read. The
//!   message says when the finding rests on `never`.
//! - A signal with don't-cares is compared as specified: its fixed value
//!   and its freedom must both be the same for the input at 0 and at 1.
//!
//! **Why it matters.** The definition mentions an input that has no effect:
//! either a term is redundant (`a | a & b` does not need `b`), or the
//! logic is wrong and the input was meant to matter. Built as written, the
//! logic wires a sensor to gates that ignore it.
//!
//! **Example.**
//!
//! ```text
//! input  hot, humid
//! output fan
//! fan = hot | hot & humid   # `fan` is the same for humid=0 and humid=1
//! ```
//!
//! One fault, one report:
//!
//! - One report per signal and input, at the signal's definition, with
//!   every place where the definition names the input, and every signal
//!   it reads through which the input arrives and still matters, as
//!   related places. A signal read that already ignores the input is
//!   that signal's fault, and not related.
//! - When no signal at all depends on the input and more than one
//!   definition would be reported, one report at the input's declaration
//!   lists them instead.
//! - The columns of a table share its inputs, and one column may well
//!   ignore an input that another needs: an input of a table is reported
//!   only when every column ignores it, once for the table.
//! - A term list is not reported: its `over` list numbers the rows, so an
//!   address range such as `on(0x0..0x7) over (a15, a14, a13, a12)`
//!   ignores three of its names on purpose.
//! - A constant signal (`constant-signal`) and a signal without a known
//!   function are not reported.
//! - Only an input that the definition names itself is reported (with the
//!   signals through which it also arrives, if any). An input that arrives
//!   only through other signals, each of which depends on it, cancels out
//!   in the way they are combined: `bus_error = ... & !sel_uart & !sel_gpio`
//!   ignores `a4` when the device table selects nothing for `a5 = 1`, and
//!   `heater = cold & !vent_open` ignores `hot` under `never hot & cold`.
//!   That is what combining those signals means, not a term written in
//!   the definition.
//!
//! When the work budget of a signal runs out, nothing is said about it.
//!
//! **Fix.** None offered: which definition is right is for the author to
//! say. Rewriting the definition without the input (as `implica minimize`
//! prints it) keeps the signal's value.
//!
//! Default severity: warning.

use super::constant_signal::{WORK_PER_SIGNAL, constants, never_notes};
use super::{Ctx, Rule};
use crate::model::{Body, Model, SignalId, SignalKind};
use crate::{Diagnostic, Related, Severity};
use implica_logic::FastMap;
use implica_logic::{BddRef, Effort, Interrupted};
use implica_syntax::Span;
use implica_syntax::ast::Expr;

pub const RULE: Rule = Rule {
    name: "vacuous-input",
    default_severity: Severity::Warning,
    summary: "a signal reads an input its value does not depend on",
    source: include_str!("vacuous_input.rs"),
};

/// How a signal depends on one input it reads.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Dependence {
    Depends,
    /// The same for both values on every combination.
    Ignores,
    /// The same for both values wherever both are possible.
    IgnoresUnderNever,
}

impl Dependence {
    fn ignores(self) -> bool {
        self != Dependence::Depends
    }
}

/// How signals depend on inputs, worked out on demand and kept.
struct Deps {
    memo: FastMap<(SignalId, usize), Option<Dependence>>,
    support: FastMap<SignalId, Vec<usize>>,
    /// Per signal: the combinations impossible whatever the inputs it does
    /// not read.
    impossible: FastMap<SignalId, Option<BddRef>>,
}

impl Deps {
    /// How `s` depends on input `i`: `None` for an input, a signal without
    /// a known function, an input it does not read, or out of budget.
    fn of(&mut self, cx: &mut Ctx, s: SignalId, i: usize) -> Option<Dependence> {
        if let Some(&d) = self.memo.get(&(s, i)) {
            return d;
        }
        let d = self.work_out(cx, s, i);
        self.memo.insert((s, i), d);
        d
    }

    fn work_out(&mut self, cx: &mut Ctx, s: SignalId, i: usize) -> Option<Dependence> {
        let m = cx.model;
        if m.signals[s].kind == SignalKind::Input
            || m.definition_of(s).is_none()
            || !cx.functions.reads(s).contains(&i)
        {
            return None;
        }
        let k = cx.functions.value(s).ok()?;
        let support = self.support.entry(s).or_insert_with(|| {
            let bdd = &cx.functions.bdd;
            let mut of = |f: BddRef| cx.cache.supports.get_or(f, || bdd.support(f).into());
            let mut v = of(k.lower).to_vec();
            if k.upper != k.lower {
                v.extend_from_slice(&of(k.upper));
            }
            v
        });
        if !support.contains(&i) {
            return Some(Dependence::Ignores);
        }
        let impossible = cx.functions.impossible;
        if impossible == BddRef::FALSE {
            return Some(Dependence::Depends);
        }
        let mut effort = Effort::new(WORK_PER_SIGNAL);
        let e = &mut effort;
        let imp = match self.impossible.get(&s) {
            Some(&x) => x?,
            None => {
                let mut others = vec![true; cx.functions.inputs];
                for &r in cx.functions.reads(s) {
                    others[r] = false;
                }
                let x = cx.functions.bdd.forall(impossible, &others, e).ok();
                self.impossible.insert(s, x);
                x?
            }
        };
        // A constraint on inputs the signal does not depend on cannot
        // hide a dependence.
        if imp == BddRef::FALSE
            || (imp != BddRef::TRUE
                && !cx
                    .functions
                    .bdd
                    .support(imp)
                    .iter()
                    .any(|v| support.contains(v)))
        {
            return Some(Dependence::Depends);
        }
        let bdd = &mut cx.functions.bdd;
        let depends = (|| -> Result<bool, Interrupted> {
            let (i0, i1) = (
                bdd.restrict(imp, i, false, e)?,
                bdd.restrict(imp, i, true, e)?,
            );
            let either = bdd.or(i0, i1, e)?;
            let both_possible = bdd.not(either, e)?;
            for bound in [k.lower, k.upper] {
                let (b0, b1) = (
                    bdd.restrict(bound, i, false, e)?,
                    bdd.restrict(bound, i, true, e)?,
                );
                let differ = bdd.xor(b0, b1, e)?;
                if bdd.and(differ, both_possible, e)? != BddRef::FALSE {
                    return Ok(true);
                }
            }
            Ok(false)
        })()
        .ok()?;
        Some(if depends {
            Dependence::Depends
        } else {
            Dependence::IgnoresUnderNever
        })
    }
}

/// The names in an expression, in source order.
fn names<'e>(e: &'e Expr, out: &mut Vec<(&'e str, Span)>) {
    out.extend(
        crate::model::name_uses(e)
            .into_iter()
            .map(|n| (n.text.as_str(), n.span)),
    );
}

/// Every name the definition of `s` reads, with its span.
fn occurrences<'c>(m: &'c Model, s: SignalId) -> Vec<(&'c str, Span)> {
    let mut out = Vec::new();
    if let Some(def) = m.definition_of(s) {
        match (def.body, def.body.header()) {
            (Body::Expr(e), _) => names(e, &mut out),
            (_, header) => out.extend(
                header
                    .unwrap_or_default()
                    .iter()
                    .map(|n| (n.text.as_str(), n.span)),
            ),
        }
    }
    out
}

/// One signal found to ignore one input.
struct Finding {
    /// The signal, or the columns of its table that are not constant.
    signals: Vec<SignalId>,
    under_never: bool,
    /// Where the definition reads the input, or a signal through which
    /// the input still matters.
    carriers: Vec<Related>,
}

pub(crate) fn check(cx: &mut Ctx, out: &mut Vec<Diagnostic>) {
    let consts = constants(cx);
    let m = cx.model;
    let n = m.signals.len();
    let mut deps = Deps {
        memo: Default::default(),
        support: Default::default(),
        impossible: Default::default(),
    };
    // Findings by input.
    let mut by_input: Vec<Vec<Finding>> = (0..m.inputs.len()).map(|_| Vec::new()).collect();
    for s in 0..n {
        if m.signals[s].kind == SignalKind::Input
            || consts[s].is_some()
            || cx.functions.value(s).is_err()
        {
            continue;
        }
        // The columns of a table share its inputs: one column ignoring an
        // input is normal; only an input every column ignores is reported,
        // once, at the first column that is not constant.
        let columns: Vec<SignalId> = match m.definition_of(s).map(|d| (d.item, d.body)) {
            Some((item, Body::Column { table, .. })) => table
                .outputs
                .iter()
                .filter_map(|o| m.signal(&o.text))
                .filter(|&t| m.definition_of(t).is_some_and(|d| d.item == item))
                .collect(),
            // The `over` list numbers the rows: an address range such as
            // `on(0x0..0x7) over (a15, a14, a13, a12)` ignores three of
            // its names on purpose.
            Some((_, Body::Terms(_))) => continue,
            _ => vec![s],
        };
        if columns.iter().find(|&&t| consts[t].is_none()) != Some(&s) {
            continue;
        }
        let occ = occurrences(m, s);
        // Only an input the definition names is reported: one that arrives
        // only through other signals, each depending on it, cancels out in
        // how they are combined, which is what combining them means.
        let mut named: Vec<usize> = occ
            .iter()
            .filter_map(|&(name, _)| m.signal(name).and_then(|t| m.signals[t].input_index))
            .collect();
        named.sort_unstable();
        named.dedup();
        for i in named {
            let mut d = Dependence::Ignores;
            for &t in &columns {
                match deps.of(cx, t, i) {
                    Some(Dependence::IgnoresUnderNever) => d = Dependence::IgnoresUnderNever,
                    Some(Dependence::Ignores) => {}
                    _ => d = Dependence::Depends,
                }
            }
            if !d.ignores() {
                continue;
            }
            let input = &m.signals[m.inputs[i]].name;
            let mut carriers = Vec::new();
            for &(name, span) in &occ {
                if name == input.as_str() {
                    carriers.push(Related {
                        span,
                        message: format!("`{input}` is read here"),
                    });
                    continue;
                }
                let Some(t) = m.signal(name) else { continue };
                if m.signals[t].kind == SignalKind::Input || !cx.functions.reads(t).contains(&i) {
                    continue;
                }
                // Through a signal that already ignores the input, the
                // fault is that signal's.
                if deps.of(cx, t, i).is_some_and(|d| d.ignores()) {
                    continue;
                }
                carriers.push(Related {
                    span,
                    message: format!(
                        "`{input}` reaches `{}` through `{name}` here",
                        m.signals[s].name
                    ),
                });
            }
            by_input[i].push(Finding {
                signals: columns
                    .iter()
                    .copied()
                    .filter(|&t| consts[t].is_none())
                    .collect(),
                under_never: d == Dependence::IgnoresUnderNever,
                carriers,
            });
        }
    }
    for (i, findings) in by_input.into_iter().enumerate() {
        if findings.is_empty() {
            continue;
        }
        let b = m.inputs[i];
        let input = m.signals[b].name.clone();
        let under_never = findings.iter().any(|f| f.under_never);
        let condition = if under_never {
            "under every input combination that `never` allows"
        } else {
            "under every input"
        };
        // Does any signal depend on the input (or might it)?
        let ignored_everywhere = !cx.has_syntax_errors
            && findings.len() > 1
            && (0..n).all(|s| {
                m.signals[s].kind == SignalKind::Input
                    || !cx.functions.reads(s).contains(&i)
                    || deps.of(cx, s, i).is_some_and(|d| d.ignores())
            });
        let declaration = m.signals[b].declarations.first().copied();
        if let (true, true, Some(decl)) = (ignored_everywhere, findings.len() > 1, declaration) {
            let list = and_list(
                findings
                    .iter()
                    .flat_map(|f| &f.signals)
                    .map(|&s| format!("`{}`", m.signals[s].name)),
            );
            let mut d = RULE.at(
                decl,
                format!(
                    "no signal depends on input `{input}`: {list} read it, but each is the same for `{input}`=0 and `{input}`=1 {condition}"
                ),
            );
            d.help = Some(format!(
                "remove `{input}` from these definitions, or check whether they were meant to depend on it"
            ));
            for f in &findings {
                let name = &m.signals[f.signals[0]].name;
                for c in &f.carriers {
                    d.related.push(Related {
                        span: c.span,
                        message: format!("in `{name}`: {}", c.message),
                    });
                }
            }
            if under_never {
                d.related.extend(never_notes(cx));
            }
            out.push(d);
            continue;
        }
        for f in findings {
            let Some(def) = m.definition_of(f.signals[0]) else {
                continue;
            };
            let names = and_list(
                f.signals
                    .iter()
                    .map(|&s| format!("`{}`", m.signals[s].name)),
            );
            let subject = if f.signals.len() == 1 {
                names.clone()
            } else {
                format!("each of {names}")
            };
            let condition = if f.under_never {
                "under every input combination that `never` allows"
            } else {
                "under every input"
            };
            let mut d = RULE.at(
                def.target,
                format!("{subject} is the same for `{input}`=0 and `{input}`=1 {condition}"),
            );
            d.help = Some(if f.signals.len() == 1 {
                format!(
                    "{names} can be written without `{input}`; check whether it was meant to depend on it"
                )
            } else {
                format!(
                    "the table can do without the input `{input}`; check whether it was meant to depend on it"
                )
            });
            d.related = f.carriers;
            if f.under_never {
                d.related.extend(never_notes(cx));
            }
            out.push(d);
        }
    }
}

/// `a`, `a and b`, `a, b and c`.
pub(crate) fn and_list(items: impl Iterator<Item = String>) -> String {
    let items: Vec<String> = items.collect();
    match items.len() {
        0 => String::new(),
        1 => items[0].clone(),
        k => format!("{} and {}", items[..k - 1].join(", "), items[k - 1]),
    }
}
