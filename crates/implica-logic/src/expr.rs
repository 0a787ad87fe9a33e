//! A compact Boolean expression tree: what the analysis builds functions
//! from and what minimized covers are printed as.
//!
//! ```
//! use implica_logic::{BoolExpr, Budget, TruthTable, minimize_sop};
//! // !(a & b) over (a, b), minimized and printed: !a | !b.
//! let e = BoolExpr::negate(BoolExpr::And(vec![BoolExpr::Var(0), BoolExpr::Var(1)]));
//! let t = e.truth_table(2);
//! let mut m = minimize_sop(&t, &TruthTable::zero(2), &Budget::default()).unwrap();
//! m.cover.sort_for_reading();
//! let names = ["a", "b"];
//! assert_eq!(BoolExpr::from_cover(&m.cover).to_text(&|i| names[i].to_string()), "!a | !b");
//! ```

use crate::{Cover, TruthTable};

/// A Boolean expression over variables `0..n`.
///
/// Its operations (and its `Drop`) recurse once per level of nesting: a tree
/// nested some tens of thousands of levels deep can exhaust the thread's
/// stack. Trees from `.imp` files are nested at most 128 levels (the parser's
/// limit); a caller building deeper trees should flatten them (an `And` takes
/// any number of operands).
#[derive(Debug, Clone, PartialEq, Eq, Hash)]
pub enum BoolExpr {
    /// A constant.
    Const(bool),
    /// Variable `i`.
    Var(usize),
    /// The negation of the operand.
    Not(Box<BoolExpr>),
    /// The conjunction of the operands (1 when there are none).
    And(Vec<BoolExpr>),
    /// The disjunction of the operands (0 when there are none).
    Or(Vec<BoolExpr>),
    /// The parity of the operands (0 when there are none).
    Xor(Vec<BoolExpr>),
}

impl BoolExpr {
    /// The negation.
    pub fn negate(e: BoolExpr) -> BoolExpr {
        BoolExpr::Not(Box::new(e))
    }

    /// The largest variable index used, plus one (0 for a constant).
    pub fn vars_needed(&self) -> usize {
        match self {
            BoolExpr::Const(_) => 0,
            BoolExpr::Var(i) => i + 1,
            BoolExpr::Not(e) => e.vars_needed(),
            BoolExpr::And(es) | BoolExpr::Or(es) | BoolExpr::Xor(es) => {
                es.iter().map(BoolExpr::vars_needed).max().unwrap_or(0)
            }
        }
    }

    /// The value for an input vector (`inputs[i]` is variable `i`).
    pub fn eval(&self, inputs: &[bool]) -> bool {
        match self {
            BoolExpr::Const(b) => *b,
            BoolExpr::Var(i) => inputs[*i],
            BoolExpr::Not(e) => !e.eval(inputs),
            BoolExpr::And(es) => es.iter().all(|e| e.eval(inputs)),
            BoolExpr::Or(es) => es.iter().any(|e| e.eval(inputs)),
            BoolExpr::Xor(es) => es.iter().fold(false, |acc, e| acc ^ e.eval(inputs)),
        }
    }

    /// The truth table over `vars` inputs (at least [`BoolExpr::vars_needed`]).
    pub fn truth_table(&self, vars: usize) -> TruthTable {
        assert!(
            vars >= self.vars_needed(),
            "the expression uses more than {vars} variables"
        );
        match self {
            BoolExpr::Const(false) => TruthTable::zero(vars),
            BoolExpr::Const(true) => TruthTable::one(vars),
            BoolExpr::Var(i) => TruthTable::var(vars, *i),
            BoolExpr::Not(e) => !&e.truth_table(vars),
            BoolExpr::And(es) => es.iter().fold(TruthTable::one(vars), |acc, e| {
                acc.and(&e.truth_table(vars))
            }),
            BoolExpr::Or(es) => es.iter().fold(TruthTable::zero(vars), |acc, e| {
                acc.or(&e.truth_table(vars))
            }),
            BoolExpr::Xor(es) => es.iter().fold(TruthTable::zero(vars), |acc, e| {
                acc.xor(&e.truth_table(vars))
            }),
        }
    }

    /// The sum of products a cover stands for.
    pub fn from_cover(cover: &Cover) -> BoolExpr {
        two_level(cover, false, BoolExpr::And, BoolExpr::Or)
    }

    /// The product of sums a cover of the complement stands for (as
    /// [`crate::minimize_pos`] returns it): each cube becomes the sum of its
    /// literals negated.
    pub fn from_complement_cover(complement: &Cover) -> BoolExpr {
        two_level(complement, true, BoolExpr::Or, BoolExpr::And)
    }

    /// The same function with nested operators of one kind merged
    /// (`a & (b & c)` is `a & b & c`; an empty `And` inside an `And` goes)
    /// and operators of one operand replaced by it.
    pub fn flattened(self) -> BoolExpr {
        fn kind(e: &BoolExpr) -> u8 {
            match e {
                BoolExpr::And(_) => 1,
                BoolExpr::Or(_) => 2,
                BoolExpr::Xor(_) => 3,
                _ => 0,
            }
        }
        let k = kind(&self);
        let (BoolExpr::And(es) | BoolExpr::Or(es) | BoolExpr::Xor(es)) = self else {
            return match self {
                BoolExpr::Not(x) => BoolExpr::negate(x.flattened()),
                leaf => leaf,
            };
        };
        let mut out = Vec::with_capacity(es.len());
        for x in es.into_iter().map(BoolExpr::flattened) {
            if kind(&x) != k {
                out.push(x);
            } else if let BoolExpr::And(v) | BoolExpr::Or(v) | BoolExpr::Xor(v) = x {
                out.extend(v);
            }
        }
        match <[BoolExpr; 1]>::try_from(out) {
            Ok([x]) => x,
            Err(out) => match k {
                1 => BoolExpr::And(out),
                2 => BoolExpr::Or(out),
                _ => BoolExpr::Xor(out),
            },
        }
    }

    /// Infix text with `!`, `&`, `^`, `|`, naming variable `i` by `name(i)`.
    /// Parentheses appear only where precedence (`!` over `&` over `^` over
    /// `|`) requires them.
    pub fn to_text(&self, name: &dyn Fn(usize) -> String) -> String {
        fn level(e: &BoolExpr) -> u8 {
            match e {
                BoolExpr::Or(es) if es.len() > 1 => 1,
                BoolExpr::Xor(es) if es.len() > 1 => 2,
                BoolExpr::And(es) if es.len() > 1 => 3,
                _ => 4,
            }
        }
        fn go(e: &BoolExpr, name: &dyn Fn(usize) -> String, out: &mut String) {
            let join = |es: &[BoolExpr], op: &str, mine: u8, out: &mut String| {
                for (k, x) in es.iter().enumerate() {
                    if k > 0 {
                        out.push_str(op);
                    }
                    if level(x) <= mine {
                        out.push('(');
                        go(x, name, out);
                        out.push(')');
                    } else {
                        go(x, name, out);
                    }
                }
            };
            match e {
                BoolExpr::Const(b) => out.push(if *b { '1' } else { '0' }),
                BoolExpr::Var(i) => out.push_str(&name(*i)),
                BoolExpr::Not(x) => {
                    out.push('!');
                    if level(x) < 4
                        || matches!(**x, BoolExpr::And(_) | BoolExpr::Or(_) | BoolExpr::Xor(_))
                    {
                        out.push('(');
                        go(x, name, out);
                        out.push(')');
                    } else {
                        go(x, name, out);
                    }
                }
                BoolExpr::And(es) if es.is_empty() => out.push('1'),
                BoolExpr::Or(es) | BoolExpr::Xor(es) if es.is_empty() => out.push('0'),
                BoolExpr::And(es) => join(es, " & ", 3, out),
                BoolExpr::Xor(es) => join(es, " ^ ", 2, out),
                BoolExpr::Or(es) => join(es, " | ", 1, out),
            }
        }
        let mut out = String::new();
        go(self, name, &mut out);
        out
    }
}

/// A two-level expression: `outer` of one `inner` per cube, each of the
/// cube's literals (negated when `negate`). An empty `And` is 1 and an empty
/// `Or` is 0, so the empty cover and the universal cube need no special case.
fn two_level(
    cover: &Cover,
    negate: bool,
    inner: fn(Vec<BoolExpr>) -> BoolExpr,
    outer: fn(Vec<BoolExpr>) -> BoolExpr,
) -> BoolExpr {
    let single = |mut v: Vec<BoolExpr>, wrap: fn(Vec<BoolExpr>) -> BoolExpr| match v.len() {
        1 => v.pop().unwrap_or(BoolExpr::Const(false)),
        _ => wrap(v),
    };
    let terms = cover
        .cubes
        .iter()
        .map(|c| {
            let lits: Vec<BoolExpr> = (0..cover.vars)
                .filter_map(|i| c.literal_of(i).map(|p| (i, p)))
                .map(|(i, p)| {
                    if p != negate {
                        BoolExpr::Var(i)
                    } else {
                        BoolExpr::negate(BoolExpr::Var(i))
                    }
                })
                .collect();
            single(lits, inner)
        })
        .collect();
    single(terms, outer)
}
