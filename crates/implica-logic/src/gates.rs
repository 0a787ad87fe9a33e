//! Gate-level forms: NAND-only and NOR-only networks of an expression, and
//! cost metrics of expressions, two-level covers and networks.
//!
//! ```
//! use implica_logic::{BoolExpr, Cost, GateKind, GateNetwork};
//! // Greenhouse vent: open when it is hot and not raining, or on manual.
//! // hot = 0, raining = 1, manual = 2.
//! let vent = BoolExpr::Or(vec![
//!     BoolExpr::And(vec![BoolExpr::Var(0), BoolExpr::negate(BoolExpr::Var(1))]),
//!     BoolExpr::Var(2),
//! ]);
//! let net = GateNetwork::from_expr(&vent, GateKind::Nand);
//! assert!(net.uses_only(GateKind::Nand));
//! assert_eq!(net.truth_table(3).unwrap(), vent.truth_table(3));
//! // A NAND for the product, a NAND for the sum, and inverters on `raining`
//! // and on `manual` (a one-literal term enters the sum complemented).
//! let cost = net.cost();
//! assert_eq!((cost.gates, cost.inverters, cost.depth), (4, 2, 3));
//!
//! // As written: two terms, three literals, a two-input AND and OR, the
//! // inverter of `raining`, two levels.
//! let c = Cost::of_expr(&vent);
//! assert_eq!((c.terms, c.literals, c.gates2, c.inverters, c.depth), (2, 3, 2, 1, 2));
//!
//! // NOR only: the product `hot & !raining` is the NOR of `raining` and
//! // `!hot`, the sum a NOR of `manual` and that, inverted.
//! let nor = GateNetwork::from_expr(&vent, GateKind::Nor);
//! assert!(nor.uses_only(GateKind::Nor));
//! assert_eq!(nor.truth_table(3).unwrap(), vent.truth_table(3));
//! let names = |i: usize| ["hot", "raining", "manual"][i].to_string();
//! assert_eq!(
//!     nor.to_text(&names),
//!     "g0 = !hot\n\
//!      g1 = !(raining | g0)\n\
//!      g2 = !(manual | g1)\n\
//!      g3 = !g2\n\
//!      out = g3\n"
//! );
//! ```
//!
//! Conventions (ours, documented here once):
//! - An inverter is a one-input NAND or NOR gate (`NAND(x) = NOR(x) = !x`),
//!   not a two-input gate with its input tied twice.
//! - An n-input gate counts as n - 1 two-input gates (common practice);
//!   inverters are counted separately, never in the two-input count.
//! - In a network every gate, inverters included, is one level of depth. In
//!   an expression or a cover an n-input AND, OR or XOR is one level,
//!   negated inputs are free (complemented inputs are taken as available, as
//!   is usual for two-level logic) and a negation of anything else is one
//!   level.

use std::collections::HashMap;

use crate::{BoolExpr, Cover, MAX_VARS, TruthTable};

/// The kind of every gate of a universal network.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub enum GateKind {
    /// `!(x1 & x2 & ...)`; with one input, an inverter.
    Nand,
    /// `!(x1 | x2 | ...)`; with one input, an inverter.
    Nor,
}

impl GateKind {
    /// The gate's output on a word of 64 parallel input values per input.
    fn apply(self, inputs: impl Iterator<Item = u64>) -> u64 {
        match self {
            GateKind::Nand => !inputs.fold(u64::MAX, |acc, x| acc & x),
            GateKind::Nor => !inputs.fold(0, |acc, x| acc | x),
        }
    }
}

/// What a gate input or the network output reads.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub enum Signal {
    /// A constant input.
    Const(bool),
    /// Primary input `i` (variable `i`).
    Input(usize),
    /// The output of gate `j` of the network's list.
    Gate(usize),
}

/// One gate: its kind and what its inputs read.
#[derive(Clone, Debug, PartialEq, Eq, Hash)]
pub struct Gate {
    /// NAND or NOR.
    pub kind: GateKind,
    /// What each input reads (one input: an inverter).
    pub inputs: Vec<Signal>,
}

/// A single-output network of NAND and NOR gates in list order: a gate
/// reads primary inputs, constants and earlier gates only, so the network is
/// acyclic and a gate's output may feed any number of later gates.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct GateNetwork {
    inputs: usize,
    gates: Vec<Gate>,
    output: Signal,
}

/// Why a network could not be built or converted.
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum GateError {
    /// Gate `gate` (`None`: the output) reads a primary input beyond the
    /// network's inputs, or itself or a later gate.
    BadSignal {
        /// The gate, or `None` for the output.
        gate: Option<usize>,
        /// What it reads.
        signal: Signal,
    },
    /// Gate `gate` has no input.
    NoInputs {
        /// The gate.
        gate: usize,
    },
    /// A truth table was asked over `vars` variables: fewer than the
    /// network's `inputs`, or more than [`MAX_VARS`].
    Vars {
        /// The variables asked for.
        vars: usize,
        /// The network's inputs.
        inputs: usize,
    },
    /// The expression would have more than `limit` nodes.
    TooLarge {
        /// The most nodes allowed.
        limit: usize,
    },
}

impl std::fmt::Display for GateError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            GateError::BadSignal { gate, signal } => {
                match gate {
                    Some(g) => write!(f, "gate {g}")?,
                    None => write!(f, "the output")?,
                }
                write!(
                    f,
                    " reads {signal:?}, which is not an input or an earlier gate"
                )
            }
            GateError::NoInputs { gate } => write!(f, "gate {gate} has no input"),
            GateError::Vars { vars, inputs } => write!(
                f,
                "a truth table over {vars} variables: the network has {inputs} inputs and a \
                 table holds at most {MAX_VARS}"
            ),
            GateError::TooLarge { limit } => {
                write!(f, "the expanded expression would exceed {limit} nodes")
            }
        }
    }
}

impl std::error::Error for GateError {}

/// Size and depth of a network.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Default)]
pub struct NetworkCost {
    /// Every gate of the list, inverters included.
    pub gates: usize,
    /// One-input gates.
    pub inverters: usize,
    /// Two-input gate equivalents: an n-input gate (n >= 2) counts n - 1;
    /// inverters are not included. A rating of size: an n-input NAND is not
    /// itself n - 1 two-input NANDs.
    pub gates2: usize,
    /// Gates on the longest path from an input to the output, inverters
    /// included.
    pub depth: usize,
}

impl GateNetwork {
    /// A network over `inputs` primary inputs, checked: every signal reads an
    /// existing input or an earlier gate, and every gate has an input.
    pub fn new(inputs: usize, gates: Vec<Gate>, output: Signal) -> Result<GateNetwork, GateError> {
        let ok = |s: &Signal, before: usize| match *s {
            Signal::Const(_) => true,
            Signal::Input(i) => i < inputs,
            Signal::Gate(j) => j < before,
        };
        for (j, g) in gates.iter().enumerate() {
            if g.inputs.is_empty() {
                return Err(GateError::NoInputs { gate: j });
            }
            if let Some(&signal) = g.inputs.iter().find(|s| !ok(s, j)) {
                return Err(GateError::BadSignal {
                    gate: Some(j),
                    signal,
                });
            }
        }
        if !ok(&output, gates.len()) {
            return Err(GateError::BadSignal {
                gate: None,
                signal: output,
            });
        }
        Ok(GateNetwork {
            inputs,
            gates,
            output,
        })
    }

    /// The network of `e` built from `kind` gates alone (NAND and NOR are
    /// each universal). Constants are folded first and nested operators of
    /// one kind merged, so the network has no constant input unless it is a
    /// constant itself. A sum of products becomes NAND-NAND (a product of
    /// sums NOR-NOR) with inverters on the complemented inputs; an inverter
    /// is shared by all its readers, a double negation cancels, identical
    /// gates are built once, and each two-input XOR takes four gates (NOR
    /// gives the complement, XNOR, whose inversion is pushed to its reader).
    /// The network's inputs are `e.vars_needed()`.
    pub fn from_expr(e: &BoolExpr, kind: GateKind) -> GateNetwork {
        let mut b = Builder {
            kind,
            gates: Vec::new(),
            memo: HashMap::new(),
        };
        let lit = b.build(&fold(e));
        let output = b.positive(lit);
        GateNetwork {
            inputs: e.vars_needed(),
            gates: b.gates,
            output,
        }
    }

    /// Number of primary inputs.
    pub fn inputs(&self) -> usize {
        self.inputs
    }

    /// The gates in list order.
    pub fn gates(&self) -> &[Gate] {
        &self.gates
    }

    /// What the output reads.
    pub fn output(&self) -> Signal {
        self.output
    }

    /// Whether every gate is of `kind`.
    pub fn uses_only(&self, kind: GateKind) -> bool {
        self.gates.iter().all(|g| g.kind == kind)
    }

    /// Runs the network on 64 input vectors at once, `input(i)` giving the
    /// word of primary input `i`; `values` is scratch space.
    fn run(&self, input: impl Fn(usize) -> u64, values: &mut Vec<u64>) -> u64 {
        values.clear();
        for g in &self.gates {
            let v = g
                .kind
                .apply(g.inputs.iter().map(|s| read(s, &input, values)));
            values.push(v);
        }
        read(&self.output, &input, values)
    }

    /// The output for an input vector (`inputs[i]` is primary input `i`;
    /// inputs beyond the slice read as 0).
    pub fn eval(&self, inputs: &[bool]) -> bool {
        let word = |i: usize| {
            if inputs.get(i).copied().unwrap_or(false) {
                u64::MAX
            } else {
                0
            }
        };
        self.run(word, &mut Vec::with_capacity(self.gates.len())) & 1 == 1
    }

    /// The truth table over `vars` inputs, at least [`GateNetwork::inputs`]
    /// and at most [`MAX_VARS`]. Evaluated 64 minterms at a time.
    pub fn truth_table(&self, vars: usize) -> Result<TruthTable, GateError> {
        if vars < self.inputs || vars > MAX_VARS {
            return Err(GateError::Vars {
                vars,
                inputs: self.inputs,
            });
        }
        let rows = 1usize << vars;
        let mut t = TruthTable::zero(vars);
        let mut values = Vec::with_capacity(self.gates.len());
        for base in (0..rows).step_by(64) {
            let word = |i: usize| crate::truth_table::var_word(vars, i, base / 64);
            let out = self.run(word, &mut values);
            for k in 0..64.min(rows - base) {
                if (out >> k) & 1 == 1 {
                    t.set(base + k, true);
                }
            }
        }
        Ok(t)
    }

    /// The expression the network computes, each gate as `!(x & ...)` or
    /// `!(x | ...)` and an inverter as `!x`. A gate read by several others
    /// is copied into each, so the tree can grow exponentially with the
    /// depth of sharing: more than `limit` nodes is an error.
    ///
    /// ```
    /// use implica_logic::{BoolExpr, GateKind, GateNetwork};
    /// // a & b as NAND gates: a NAND, then a NAND used as an inverter.
    /// let e = BoolExpr::And(vec![BoolExpr::Var(0), BoolExpr::Var(1)]);
    /// let net = GateNetwork::from_expr(&e, GateKind::Nand);
    /// let back = net.to_expr(100).unwrap();
    /// assert_eq!(back.truth_table(2), e.truth_table(2));
    /// assert_eq!(back.to_text(&|i| ["a", "b"][i].into()), "!!(a & b)");
    /// assert!(net.to_expr(1).is_err());
    /// ```
    pub fn to_expr(&self, limit: usize) -> Result<BoolExpr, GateError> {
        let mut size: Vec<usize> = Vec::with_capacity(self.gates.len());
        let sig_size = |s: &Signal, size: &[usize]| match *s {
            Signal::Gate(j) => size[j],
            _ => 1,
        };
        for g in &self.gates {
            let inner = g
                .inputs
                .iter()
                .fold(0usize, |acc, s| acc.saturating_add(sig_size(s, &size)));
            let own = if g.inputs.len() == 1 { 1 } else { 2 };
            size.push(inner.saturating_add(own));
        }
        if sig_size(&self.output, &size) > limit {
            return Err(GateError::TooLarge { limit });
        }
        Ok(self.signal_expr(&self.output))
    }

    fn signal_expr(&self, s: &Signal) -> BoolExpr {
        match *s {
            Signal::Const(b) => BoolExpr::Const(b),
            Signal::Input(i) => BoolExpr::Var(i),
            Signal::Gate(j) => {
                let g = &self.gates[j];
                let mut ins: Vec<BoolExpr> = g.inputs.iter().map(|s| self.signal_expr(s)).collect();
                let inner = match (ins.len(), g.kind) {
                    (1, _) => ins.pop().unwrap_or(BoolExpr::Const(false)),
                    (_, GateKind::Nand) => BoolExpr::And(ins),
                    (_, GateKind::Nor) => BoolExpr::Or(ins),
                };
                BoolExpr::negate(inner)
            }
        }
    }

    /// A listing, one gate a line (`g3 = !(a & g1)`, `g4 = !(b | c)`,
    /// `g5 = !a`), then `out = ...`, naming input `i` by `name(i)`.
    pub fn to_text(&self, name: &dyn Fn(usize) -> String) -> String {
        let sig = |s: &Signal| match *s {
            Signal::Const(b) => if b { "1" } else { "0" }.to_string(),
            Signal::Input(i) => name(i),
            Signal::Gate(j) => format!("g{j}"),
        };
        let mut out = String::new();
        for (j, g) in self.gates.iter().enumerate() {
            let ins: Vec<String> = g.inputs.iter().map(sig).collect();
            let op = match g.kind {
                GateKind::Nand => " & ",
                GateKind::Nor => " | ",
            };
            if ins.len() == 1 {
                out.push_str(&format!("g{j} = !{}\n", ins[0]));
            } else {
                out.push_str(&format!("g{j} = !({})\n", ins.join(op)));
            }
        }
        out.push_str(&format!("out = {}\n", sig(&self.output)));
        out
    }

    /// Gate counts and depth (see [`NetworkCost`]).
    pub fn cost(&self) -> NetworkCost {
        let mut level: Vec<usize> = Vec::with_capacity(self.gates.len());
        let sig_level = |s: &Signal, level: &[usize]| match *s {
            Signal::Gate(j) => level[j],
            _ => 0,
        };
        let mut cost = NetworkCost::default();
        for g in &self.gates {
            let l = g
                .inputs
                .iter()
                .map(|s| sig_level(s, &level))
                .max()
                .unwrap_or(0)
                + 1;
            level.push(l);
            cost.gates += 1;
            if g.inputs.len() == 1 {
                cost.inverters += 1;
            } else {
                cost.gates2 += g.inputs.len() - 1;
            }
        }
        cost.depth = sig_level(&self.output, &level);
        cost
    }
}

fn read(s: &Signal, input: &impl Fn(usize) -> u64, values: &[u64]) -> u64 {
    match *s {
        Signal::Const(true) => u64::MAX,
        Signal::Const(false) => 0,
        Signal::Input(i) => input(i),
        Signal::Gate(j) => values.get(j).copied().unwrap_or(0),
    }
}

/// `e` with constants folded away (the result is a constant or has none),
/// double negations cancelled, operators of fewer than two operands removed
/// and nested operators of one kind merged.
fn fold(e: &BoolExpr) -> BoolExpr {
    fn not(f: BoolExpr) -> BoolExpr {
        match f {
            BoolExpr::Const(b) => BoolExpr::Const(!b),
            BoolExpr::Not(x) => *x,
            f => BoolExpr::negate(f),
        }
    }
    fn finish(
        mut out: Vec<BoolExpr>,
        empty: bool,
        wrap: fn(Vec<BoolExpr>) -> BoolExpr,
    ) -> BoolExpr {
        match out.len() {
            0 => BoolExpr::Const(empty),
            1 => out.pop().unwrap_or(BoolExpr::Const(empty)),
            _ => wrap(out),
        }
    }
    match e {
        BoolExpr::Const(_) | BoolExpr::Var(_) => e.clone(),
        BoolExpr::Not(x) => not(fold(x)),
        BoolExpr::And(xs) | BoolExpr::Or(xs) => {
            let is_and = matches!(e, BoolExpr::And(_));
            let mut out = Vec::new();
            for x in xs {
                match fold(x) {
                    // The absorbing constant decides; the neutral one vanishes.
                    BoolExpr::Const(b) if b != is_and => return BoolExpr::Const(b),
                    BoolExpr::Const(_) => {}
                    BoolExpr::And(ys) if is_and => out.extend(ys),
                    BoolExpr::Or(ys) if !is_and => out.extend(ys),
                    f => out.push(f),
                }
            }
            finish(
                out,
                is_and,
                if is_and { BoolExpr::And } else { BoolExpr::Or },
            )
        }
        BoolExpr::Xor(xs) => {
            let mut parity = false;
            let mut out = Vec::new();
            for x in xs {
                match fold(x) {
                    BoolExpr::Const(b) => parity ^= b,
                    BoolExpr::Xor(ys) => out.extend(ys),
                    // A negated operand of a parity only flips it.
                    BoolExpr::Not(y) => {
                        parity ^= true;
                        match *y {
                            BoolExpr::Xor(ys) => out.extend(ys),
                            y => out.push(y),
                        }
                    }
                    f => out.push(f),
                }
            }
            let f = finish(out, false, BoolExpr::Xor);
            if parity { not(f) } else { f }
        }
    }
}

/// A signal and whether the value it stands for is its complement.
#[derive(Clone, Copy)]
struct Lit {
    signal: Signal,
    inverted: bool,
}

struct Builder {
    kind: GateKind,
    gates: Vec<Gate>,
    memo: HashMap<Gate, usize>,
}

impl Builder {
    /// The gate over `inputs`: inputs are sorted and repeated inputs dropped
    /// (both gates are commutative and idempotent), so a gate left with one
    /// input is an inverter, and cancels against one.
    fn gate(&mut self, mut inputs: Vec<Signal>) -> Signal {
        inputs.sort();
        inputs.dedup();
        match inputs[..] {
            [s] => self.not(s),
            _ => self.shared(inputs),
        }
    }

    /// The gate over `inputs` as given, built once.
    fn shared(&mut self, inputs: Vec<Signal>) -> Signal {
        let g = Gate {
            kind: self.kind,
            inputs,
        };
        if let Some(&j) = self.memo.get(&g) {
            return Signal::Gate(j);
        }
        let j = self.gates.len();
        self.gates.push(g.clone());
        self.memo.insert(g, j);
        Signal::Gate(j)
    }

    fn not(&mut self, s: Signal) -> Signal {
        match s {
            Signal::Const(b) => Signal::Const(!b),
            Signal::Gate(j) if self.gates[j].inputs.len() == 1 => self.gates[j].inputs[0],
            s => self.shared(vec![s]),
        }
    }

    fn positive(&mut self, l: Lit) -> Signal {
        if l.inverted {
            self.not(l.signal)
        } else {
            l.signal
        }
    }

    fn negative(&mut self, l: Lit) -> Signal {
        if l.inverted {
            l.signal
        } else {
            self.not(l.signal)
        }
    }

    /// `e` (already folded) as a signal of either polarity: NAND gives the
    /// complement of a product and a sum of complements directly, NOR the
    /// complement of a sum and a product of complements.
    fn build(&mut self, e: &BoolExpr) -> Lit {
        let lit = |signal, inverted| Lit { signal, inverted };
        match e {
            BoolExpr::Const(b) => lit(Signal::Const(*b), false),
            BoolExpr::Var(i) => lit(Signal::Input(*i), false),
            BoolExpr::Not(x) => {
                let l = self.build(x);
                lit(l.signal, !l.inverted)
            }
            BoolExpr::And(xs) | BoolExpr::Or(xs) => {
                // NAND(x..) = !AND(x..) = OR(!x..); NOR(x..) = !OR(x..) = AND(!x..).
                let direct = matches!(
                    (e, self.kind),
                    (BoolExpr::And(_), GateKind::Nand) | (BoolExpr::Or(_), GateKind::Nor)
                );
                let mut ins = Vec::with_capacity(xs.len());
                for x in xs {
                    let l = self.build(x);
                    ins.push(if direct {
                        self.positive(l)
                    } else {
                        self.negative(l)
                    });
                }
                lit(self.gate(ins), direct)
            }
            BoolExpr::Xor(xs) => {
                let mut acc = lit(Signal::Const(false), false);
                for (k, x) in xs.iter().enumerate() {
                    let l = self.build(x);
                    acc = if k == 0 { l } else { self.xor(acc, l) };
                }
                acc
            }
        }
    }

    /// Four gates: g1 = G(p, q), g2 = G(p, g1), g3 = G(q, g1), g4 = G(g2, g3)
    /// is `p ^ q` for NAND and `!(p ^ q)` for NOR (common practice).
    /// Complemented operands only complement the result, so no inverter is
    /// needed here.
    fn xor(&mut self, a: Lit, b: Lit) -> Lit {
        let (p, q) = (a.signal, b.signal);
        let g1 = self.gate(vec![p, q]);
        let g2 = self.gate(vec![p, g1]);
        let g3 = self.gate(vec![q, g1]);
        let g4 = self.gate(vec![g2, g3]);
        Lit {
            signal: g4,
            inverted: (a.inverted ^ b.inverted) ^ (self.kind == GateKind::Nor),
        }
    }
}

/// Size and depth of an expression or a two-level form, with gates of any
/// number of inputs (see the module's conventions).
#[derive(Clone, Copy, Debug, PartialEq, Eq, Default)]
pub struct Cost {
    /// Product terms: of a cover, its cubes; of an expression, the operands
    /// of a top-level OR, none for the constant 0 or an empty OR, else one.
    pub terms: usize,
    /// Literal occurrences (a variable, negated or not, each time it appears).
    pub literals: usize,
    /// AND, OR and XOR gates of two or more inputs, each counted once.
    pub gates: usize,
    /// Two-input gate equivalents of those: an n-input gate counts n - 1.
    pub gates2: usize,
    /// One per variable used complemented (shared by all its uses), plus one
    /// per negation of anything but a variable.
    pub inverters: usize,
    /// Levels of gates on the longest path; a negated variable adds none, a
    /// negation of anything else one.
    pub depth: usize,
}

impl Cost {
    /// The cost of `e` as written (nothing is folded or shared but the
    /// input inverters).
    pub fn of_expr(e: &BoolExpr) -> Cost {
        fn go(e: &BoolExpr, cost: &mut Cost, negated: &mut Vec<usize>) -> usize {
            match e {
                BoolExpr::Const(_) => 0,
                BoolExpr::Var(_) => {
                    cost.literals += 1;
                    0
                }
                BoolExpr::Not(x) => match **x {
                    BoolExpr::Var(i) => {
                        cost.literals += 1;
                        negated.push(i);
                        0
                    }
                    _ => {
                        cost.inverters += 1;
                        go(x, cost, negated) + 1
                    }
                },
                BoolExpr::And(xs) | BoolExpr::Or(xs) | BoolExpr::Xor(xs) => {
                    let d = xs.iter().map(|x| go(x, cost, negated)).max().unwrap_or(0);
                    if xs.len() >= 2 {
                        cost.gates += 1;
                        cost.gates2 += xs.len() - 1;
                        d + 1
                    } else {
                        d
                    }
                }
            }
        }
        let mut cost = Cost {
            terms: match e {
                BoolExpr::Or(xs) => xs.len(),
                BoolExpr::Const(false) => 0,
                _ => 1,
            },
            ..Cost::default()
        };
        let mut negated = Vec::new();
        cost.depth = go(e, &mut cost, &mut negated);
        negated.sort_unstable();
        negated.dedup();
        cost.inverters += negated.len();
        cost
    }

    /// The cost of a sum of products: one AND per cube of two or more
    /// literals, one OR of the cubes when there are two or more. Equal to
    /// `Cost::of_expr(&BoolExpr::from_cover(cover))`.
    pub fn of_cover(cover: &Cover) -> Cost {
        let vars = cover.vars.min(64);
        let mut negated = 0u64;
        let mut cost = Cost {
            terms: cover.len(),
            ..Cost::default()
        };
        let mut and_level = 0;
        for c in &cover.cubes {
            let l = c.literals(vars);
            cost.literals += l;
            if l >= 2 {
                cost.gates += 1;
                cost.gates2 += l - 1;
                and_level = 1;
            }
            for i in 0..vars {
                if c.literal_of(i) == Some(false) {
                    negated |= 1 << i;
                }
            }
        }
        cost.depth = and_level;
        if cover.len() >= 2 {
            cost.gates += 1;
            cost.gates2 += cover.len() - 1;
            cost.depth += 1;
        }
        cost.inverters = negated.count_ones() as usize;
        cost
    }
}
