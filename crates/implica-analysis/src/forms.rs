//! An expression definition as a function of the names it reads, and its
//! two-level shape, for the rules about redundant terms and literals and
//! non-minimal expressions.
//!
//! The expression is judged over the signals it names (each a variable),
//! not over the primary inputs: a fix keeps the intermediate signals the
//! author wrote. Combinations of those signals' values that cannot occur
//! (because of how the signals are computed, or `never`) are don't-cares.
//! A replacement that agrees on every combination that can occur computes
//! the same function of the inputs, for every pick of don't-cares.

use crate::functions::Functions;
use implica_logic::{
    BddRef, BoolExpr, Budget, Effort, Interrupted, Minimized, TruthTable, minimize_pos_cancellable,
    minimize_sop_cancellable,
};
use implica_syntax::ast::{BinOp, Expr, ExprKind, SmolStr};

/// Most names an expression may read to be analysed (2^16 combinations).
pub(crate) const MAX_NAMES: usize = 16;

/// An expression over the names it reads.
pub(crate) struct ExprFunction {
    /// Variable `i` is `names[i]`, in order of first appearance.
    pub names: Vec<SmolStr>,
    /// The truth table of the expression over the names.
    pub table: TruthTable,
    /// Combinations of the names' values that can occur.
    pub reachable: TruthTable,
}

/// The function of `expr` over its names, or `None` when it has errors,
/// reads an unknown signal, reads too many names, or the budget runs out.
pub(crate) fn expr_function(
    model: &crate::model::Model,
    functions: &mut Functions,
    expr: &Expr,
    effort: &mut Effort,
) -> Option<ExprFunction> {
    // When `never` excludes every input, everything is free: that is
    // `empty-constraint`'s to report, not each expression's.
    if functions.impossible == BddRef::TRUE {
        return None;
    }
    let mut names = Vec::new();
    let e = to_bool_expr(expr, &mut names)?;
    if names.len() > MAX_NAMES {
        return None;
    }
    let mut vals = Vec::with_capacity(names.len());
    for n in &names {
        let s = model.signal(n)?;
        vals.push(functions.value(s).ok()?.full);
    }
    let k = names.len();
    let table = e.truth_table(k);
    // Distinct primary inputs with nothing excluded take every combination.
    let mut seen = Vec::new();
    let all_inputs = functions.impossible == BddRef::FALSE
        && vals.iter().all(|&v| {
            let support = functions.bdd.support(v);
            let plain = support.len() == 1
                && support[0] < functions.inputs
                && functions.bdd.var(support[0]).ok() == Some(v)
                && !seen.contains(&support[0]);
            seen.extend(support);
            plain
        });
    let reachable = if all_inputs {
        TruthTable::one(k)
    } else {
        let possible = functions.bdd.not(functions.impossible, effort).ok()?;
        let mut reachable = TruthTable::zero(k);
        mark_reachable(functions, &vals, 0, 0, possible, &mut reachable, effort).ok()?;
        reachable
    };
    Some(ExprFunction {
        names,
        table,
        reachable,
    })
}

/// Depth first over the names' values, keeping the set of inputs (and
/// picks) that give the values so far; an empty set prunes the branch.
fn mark_reachable(
    f: &mut Functions,
    vals: &[BddRef],
    depth: usize,
    row: usize,
    region: BddRef,
    out: &mut TruthTable,
    effort: &mut Effort,
) -> Result<(), Interrupted> {
    if region == BddRef::FALSE {
        return Ok(());
    }
    if depth == vals.len() {
        out.set(row, true);
        return Ok(());
    }
    let v = vals[depth];
    let nv = f.bdd.not(v, effort)?;
    let lo = f.bdd.and(region, nv, effort)?;
    mark_reachable(f, vals, depth + 1, row << 1, lo, out, effort)?;
    let hi = f.bdd.and(region, v, effort)?;
    mark_reachable(f, vals, depth + 1, row << 1 | 1, hi, out, effort)
}

/// The expression as a [`BoolExpr`] over its names (variable `i` is
/// `names[i]`, appended in order of first use), operator by operator as
/// written; `None` on error nodes.
pub fn to_bool_expr(e: &Expr, names: &mut Vec<SmolStr>) -> Option<BoolExpr> {
    Some(match &e.kind {
        ExprKind::Name(n) => {
            let i = match names.iter().position(|x| *x == n.text) {
                Some(i) => i,
                None => {
                    names.push(n.text.clone());
                    names.len() - 1
                }
            };
            BoolExpr::Var(i)
        }
        ExprKind::Const(b) => BoolExpr::Const(*b),
        ExprKind::Not { operand, .. } => BoolExpr::negate(to_bool_expr(operand, names)?),
        ExprKind::Paren(inner) => to_bool_expr(inner, names)?,
        ExprKind::Error => return None,
        ExprKind::Chain { operands, ops } => {
            let vals = operands
                .iter()
                .map(|o| to_bool_expr(o, names))
                .collect::<Option<Vec<_>>>()?;
            if vals.len() != ops.len() + 1 {
                return None;
            }
            if ops.iter().all(|o| o.op == BinOp::Implies) {
                let mut it = vals.into_iter().rev();
                let mut acc = it.next()?;
                for v in it {
                    acc = BoolExpr::Or(vec![BoolExpr::negate(v), acc]);
                }
                return Some(acc);
            }
            let mut it = vals.into_iter();
            let mut acc = it.next()?;
            for (op, v) in ops.iter().zip(it) {
                acc = match op.op {
                    BinOp::And => BoolExpr::And(vec![acc, v]),
                    BinOp::Or => BoolExpr::Or(vec![acc, v]),
                    BinOp::Xor | BinOp::Ne => BoolExpr::Xor(vec![acc, v]),
                    BinOp::Nand => BoolExpr::negate(BoolExpr::And(vec![acc, v])),
                    BinOp::Nor => BoolExpr::negate(BoolExpr::Or(vec![acc, v])),
                    BinOp::Xnor | BinOp::Eq => BoolExpr::negate(BoolExpr::Xor(vec![acc, v])),
                    BinOp::Implies => return None,
                };
            }
            acc
        }
    })
}

/// Literal occurrences as written: every name in the expression.
pub(crate) fn written_literals(e: &Expr) -> usize {
    match &e.kind {
        ExprKind::Name(_) => 1,
        ExprKind::Not { operand, .. } => written_literals(operand),
        ExprKind::Paren(inner) => written_literals(inner),
        ExprKind::Chain { operands, .. } => operands.iter().map(written_literals).sum(),
        ExprKind::Const(_) | ExprKind::Error => 0,
    }
}

/// A sum of products or a product of sums, as written.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(crate) enum Shape {
    /// Terms joined by `|`, each a product of literals.
    Sum,
    /// Factors joined by `&`, each a sum of literals.
    Product,
}

/// A literal as written.
pub(crate) struct Lit<'e> {
    pub var: usize,
    pub positive: bool,
    pub expr: &'e Expr,
}

/// One term (of a sum) or factor (of a product), as written.
pub(crate) struct Part<'e> {
    /// The operand of the outer chain (parentheses included).
    pub expr: &'e Expr,
    pub literals: Vec<Lit<'e>>,
    /// The inner chain joining the literals, when there are several.
    pub inner: Option<&'e [Expr]>,
}

/// A two-level expression, as written.
pub(crate) struct TwoLevel<'e> {
    pub shape: Shape,
    pub parts: Vec<Part<'e>>,
    /// The outer chain's operands (for edits), when there are several parts.
    pub outer: Option<&'e [Expr]>,
}

fn strip(e: &Expr) -> &Expr {
    match &e.kind {
        ExprKind::Paren(inner) => strip(inner),
        _ => e,
    }
}

fn literal<'e>(e: &'e Expr, names: &[SmolStr]) -> Option<Lit<'e>> {
    match &strip(e).kind {
        ExprKind::Name(n) => Some(Lit {
            var: names.iter().position(|x| *x == n.text)?,
            positive: true,
            expr: e,
        }),
        ExprKind::Not { operand, .. } => match &strip(operand).kind {
            ExprKind::Name(n) => Some(Lit {
                var: names.iter().position(|x| *x == n.text)?,
                positive: false,
                expr: e,
            }),
            _ => None,
        },
        _ => None,
    }
}

/// The chain's operands when every operator is `op`.
fn chain_of(e: &Expr, op: BinOp) -> Option<&[Expr]> {
    match &strip(e).kind {
        ExprKind::Chain { operands, ops } if ops.iter().all(|o| o.op == op) => Some(operands),
        _ => None,
    }
}

fn part<'e>(e: &'e Expr, inner_op: BinOp, names: &[SmolStr]) -> Option<Part<'e>> {
    if let Some(l) = literal(e, names) {
        return Some(Part {
            expr: e,
            literals: vec![l],
            inner: None,
        });
    }
    let ops = chain_of(e, inner_op)?;
    let literals = ops
        .iter()
        .map(|o| literal(o, names))
        .collect::<Option<Vec<_>>>()?;
    Some(Part {
        expr: e,
        literals,
        inner: Some(ops),
    })
}

/// The two-level shape of an expression, if it has one: a sum (`|`) of
/// products of literals, or a product (`&`) of sums of literals. A lone
/// product of literals counts as a sum of one term.
pub(crate) fn two_level<'e>(e: &'e Expr, names: &[SmolStr]) -> Option<TwoLevel<'e>> {
    if let Some(ops) = chain_of(e, BinOp::Or) {
        let parts = ops
            .iter()
            .map(|o| part(o, BinOp::And, names))
            .collect::<Option<Vec<_>>>()?;
        return Some(TwoLevel {
            shape: Shape::Sum,
            parts,
            outer: Some(ops),
        });
    }
    if let Some(ops) = chain_of(e, BinOp::And) {
        if let Some(p) = part(e, BinOp::And, names) {
            return Some(TwoLevel {
                shape: Shape::Sum,
                parts: vec![p],
                outer: None,
            });
        }
        let parts = ops
            .iter()
            .map(|o| part(o, BinOp::Or, names))
            .collect::<Option<Vec<_>>>()?;
        return Some(TwoLevel {
            shape: Shape::Product,
            parts,
            outer: Some(ops),
        });
    }
    None
}

/// What can be dropped from a two-level expression without changing it
/// where its names' values can occur: parts (terms or factors), then
/// literals of the remaining parts, each chosen greedily so that all of
/// them can be dropped together.
pub(crate) struct Redundancy {
    pub parts: Vec<usize>,
    /// `(part, literal index within the part)`.
    pub literals: Vec<(usize, usize)>,
    /// Literal occurrences left after dropping all of them.
    pub literals_left: usize,
}

pub(crate) fn redundancy(t: &TwoLevel, f: &ExprFunction) -> Redundancy {
    let k = f.names.len();
    let care = &f.reachable;
    let tables: Vec<TruthTable> = t
        .parts
        .iter()
        .map(|p| part_without(p, k, t.shape, &[]))
        .collect();
    let mut alive = vec![true; t.parts.len()];
    let mut parts = Vec::new();
    // From the last part back, so that of two equal parts the later goes.
    for i in (0..t.parts.len()).rev() {
        if alive.iter().filter(|&&a| a).count() <= 1 {
            break;
        }
        let others = (0..t.parts.len()).filter(|&j| j != i && alive[j]).fold(
            match t.shape {
                Shape::Sum => TruthTable::zero(k),
                Shape::Product => TruthTable::one(k),
            },
            |acc, j| match t.shape {
                Shape::Sum => acc.or(&tables[j]),
                Shape::Product => acc.and(&tables[j]),
            },
        );
        let redundant = match t.shape {
            // A term the others cover where it matters.
            Shape::Sum => others.covers(&tables[i].and(care)),
            // A factor the others' product already lies inside.
            Shape::Product => tables[i].covers(&others.and(care)),
        };
        if redundant {
            alive[i] = false;
            parts.push(i);
        }
    }
    parts.reverse();
    let mut literals = Vec::new();
    let mut left = 0;
    for (i, p) in t.parts.iter().enumerate() {
        if !alive[i] {
            continue;
        }
        let mut dropped: Vec<usize> = Vec::new();
        for l in 0..p.literals.len() {
            if p.literals.len() - dropped.len() <= 1 {
                break;
            }
            let mut trial = dropped.clone();
            trial.push(l);
            let part = part_without(p, k, t.shape, &trial);
            let fine = match t.shape {
                // The grown term stays inside the function.
                Shape::Sum => f.table.or(&!care).covers(&part),
                // The shrunk factor still holds wherever the function is 1.
                Shape::Product => part.covers(&f.table.and(care)),
            };
            if fine {
                dropped.push(l);
                literals.push((i, l));
            }
        }
        left += p.literals.len() - dropped.len();
    }
    Redundancy {
        parts,
        literals,
        literals_left: left,
    }
}

pub(crate) fn part_without(p: &Part, k: usize, shape: Shape, skip: &[usize]) -> TruthTable {
    let lits = p
        .literals
        .iter()
        .enumerate()
        .filter(|(i, _)| !skip.contains(i))
        .map(|(_, l)| {
            let v = TruthTable::var(k, l.var);
            if l.positive { v } else { !&v }
        });
    match shape {
        Shape::Sum => lits.fold(TruthTable::one(k), |a, l| a.and(&l)),
        Shape::Product => lits.fold(TruthTable::zero(k), |a, l| a.or(&l)),
    }
}

/// The byte range that removes operand `i` of a chain with its operator.
pub(crate) fn operand_removal(ops: &[Expr], i: usize) -> implica_syntax::Span {
    if i + 1 < ops.len() {
        implica_syntax::Span::new(ops[i].span.start, ops[i + 1].span.start)
    } else {
        implica_syntax::Span::new(ops[i - 1].span.end, ops[i].span.end)
    }
}

/// The minimal sum of products and product of sums of the expression over
/// its names, terms in reading order; `None` past the exact budget.
/// The minimal sum of products and product of sums of `f`, `None` when
/// either is out of `budget`; `Err` when `cancel` stopped them.
pub(crate) fn minimal_forms(
    f: &ExprFunction,
    budget: &Budget,
    cancel: &dyn Fn() -> bool,
) -> Result<Option<(Minimized, Minimized)>, Interrupted> {
    let dc = !&f.reachable;
    let on = f.table.and(&f.reachable);
    let Ok(mut sop) = minimize_sop_cancellable(&on, &dc, budget, cancel)? else {
        return Ok(None);
    };
    let Ok(mut pos) = minimize_pos_cancellable(&on, &dc, budget, cancel)? else {
        return Ok(None);
    };
    sop.cover.sort_for_reading();
    pos.cover.sort_for_reading();
    Ok(Some((sop, pos)))
}

/// Whether `non-minimal` reports the expression: a two-level form has
/// fewer literals than written, is not a constant (that is
/// `constant-signal`'s), and dropping the redundant terms and literals
/// does not already reach it. Then it is the one report for the
/// expression, and the redundancy rules stay quiet.
pub(crate) fn non_minimal_applies(
    e: &Expr,
    f: &ExprFunction,
    budget: &Budget,
    cancel: &dyn Fn() -> bool,
) -> Result<Option<(Minimized, Minimized)>, Interrupted> {
    let written = written_literals(e);
    // Every two-level form reads each input the function needs at least
    // once; when the expression reads no more, no form can have fewer
    // literals, and the minimization is not needed to say so.
    let needed = (0..f.table.vars())
        .filter(|&i| f.table.depends_on_within(i, &f.reachable))
        .count();
    if needed >= written {
        return Ok(None);
    }
    let Some((sop, pos)) = minimal_forms(f, budget, cancel)? else {
        return Ok(None);
    };
    let best = sop.cover.literals().min(pos.cover.literals());
    if best >= written || best == 0 {
        return Ok(None);
    }
    if let Some(t) = two_level(e, &f.names)
        && redundancy(&t, f).literals_left <= best
    {
        return Ok(None);
    }
    Ok(Some((sop, pos)))
}
