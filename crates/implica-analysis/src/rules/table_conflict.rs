//! # `table-conflict`
//!
//! **What it finds.** Two rows of a `table` that overlap (cover a common
//! combination of the table's inputs) and give different values, `0` and
//! `1`, in some output column; a `-` output cell agrees with anything.
//! Likewise two overlapping rows of an `expect` block that expect
//! different values of some signal.
//!
//! The combination must be able to occur: where the table's inputs are
//! primary inputs, a combination that `never` excludes is no conflict;
//! where they are intermediate signals, the combination must be one those
//! signals can take together. Each later row is reported once, at the
//! first earlier row it conflicts with, which is shown as related; the
//! message names the columns and gives a common input combination.
//!
//! **Why it matters.** Where two rows disagree, the table does not say
//! what the output is. Implica treats such combinations as don't-cares, so
//! the logic built from the table may take either value there, which is
//! seldom what the author meant. In an `expect` block, no logic can pass
//! both rows.
//!
//! **Example.**
//!
//! ```text
//! table (hot, humid -> fan_fast) {
//!   1-       -> 1
//!   -1       -> 0      # overlaps the row above on hot=1, humid=1
//!   unlisted -> 0
//! }
//! ```
//!
//! **Fix.** None is offered: only the author knows which row is right.
//! Make the rows agree, narrow one with `0`/`1` input cells so that they no
//! longer overlap, or write `-` where either value is acceptable.
//!
//! Default severity: error.

use super::table_width::well_formed;
use super::{Ctx, Rule};
use crate::functions::{DEFAULT_WORK_PER_DEFINITION, Functions};
use crate::model::Model;
use crate::{Diagnostic, Related, Severity};
use implica_logic::{BddRef, Effort, Interrupted};
use implica_syntax::LineIndex;
use implica_syntax::ast::{Cell, CellValue, ItemKind, Name, RowKind, Table};

pub const RULE: Rule = Rule {
    name: "table-conflict",
    default_severity: Severity::Error,
    summary: "two overlapping rows give different values",
    source: include_str!("table_conflict.rs"),
};

pub(crate) fn check(cx: &mut Ctx, out: &mut Vec<Diagnostic>) {
    let m = cx.model;
    let mut lines = None;
    for item in &m.file.items {
        let (table, expect) = match &item.kind {
            ItemKind::Table(t) => (&**t, false),
            ItemKind::Expect(t) => (&**t, true),
            _ => continue,
        };
        if !well_formed(table) {
            continue;
        }
        let Some(ins) = header_values(cx.functions, m, &table.inputs) else {
            continue;
        };
        let mut e = Effort::new(DEFAULT_WORK_PER_DEFINITION);
        let lines = lines.get_or_insert_with(|| LineIndex::new(cx.src));
        // Out of budget: keep what was proven, say nothing more.
        let _ = check_table(cx, table, expect, &ins, lines, &mut e, out);
    }
}

fn check_table(
    cx: &mut Ctx,
    table: &Table,
    expect: bool,
    ins: &[BddRef],
    lines: &LineIndex,
    e: &mut Effort,
    out: &mut Vec<Diagnostic>,
) -> Result<(), Interrupted> {
    let rows: Vec<(&[Cell], &[Cell], implica_syntax::Span)> = table
        .rows
        .iter()
        .filter_map(|r| match &r.kind {
            RowKind::Cells { inputs, outputs } => Some((&inputs[..], &outputs[..], r.span)),
            _ => None,
        })
        .collect();
    // Each row's combinations that can occur, over the primary inputs: the
    // overlap of two rows is the conjunction of theirs.
    let possible = cx.functions.bdd.not(cx.functions.impossible, e)?;
    let mut occurs = Vec::with_capacity(rows.len());
    for (cells, _, _) in &rows {
        let cells: Vec<Option<bool>> = cells.iter().map(|c| value(c.value)).collect();
        let p = pattern(cx.functions, ins, &cells, e)?;
        occurs.push(cx.functions.bdd.and(p, possible, e)?);
    }
    for (i, (in_i, out_i, span_i)) in rows.iter().enumerate() {
        if occurs[i] == BddRef::FALSE {
            continue;
        }
        for (j, (in_j, out_j, span_j)) in rows[..i].iter().enumerate() {
            e.spend(1)?;
            if occurs[j] == BddRef::FALSE || !overlap(in_i, in_j) {
                continue;
            }
            let cols: Vec<usize> = (0..out_i.len())
                .filter(|&c| differ(out_i[c].value, out_j[c].value))
                .collect();
            if cols.is_empty() {
                continue;
            }
            let both = cx.functions.bdd.and(occurs[i], occurs[j], e)?;
            let Some(point) = cx.functions.bdd.any_one(both) else {
                continue;
            };
            let at: Vec<bool> = ins
                .iter()
                .map(|&v| cx.functions.bdd.eval(v, &point))
                .collect();
            let verb = if expect { "expects" } else { "gives" };
            let vals = |cells: &[Cell]| {
                cols.iter()
                    .map(|&c| format!("`{}` = {}", table.outputs[c].text, bit(cells[c].value)))
                    .collect::<Vec<_>>()
                    .join(", ")
            };
            let line = lines.line_col(cx.src, span_j.start).line + 1;
            let mut d = RULE.at(
                *span_i,
                format!(
                    "this row {verb} {} where the row on line {line} {verb} {}; both cover {}",
                    vals(out_i),
                    vals(out_j),
                    named_vector(&table.inputs, &at)
                ),
            );
            d.related.push(Related {
                span: *span_j,
                message: format!("this row {verb} {}", vals(out_j)),
            });
            d.help = Some(if expect {
                "no logic can pass both rows: correct one of them".to_string()
            } else {
                "make the rows agree, give one of them `0`/`1` input cells so that they no longer \
                 overlap, or write `-` where either value is acceptable"
                    .to_string()
            });
            out.push(d);
            break;
        }
    }
    Ok(())
}

fn differ(a: CellValue, b: CellValue) -> bool {
    matches!(
        (a, b),
        (CellValue::Zero, CellValue::One) | (CellValue::One, CellValue::Zero)
    )
}

fn bit(v: CellValue) -> &'static str {
    match v {
        CellValue::Zero => "0",
        CellValue::One => "1",
        CellValue::Dash => "-",
    }
}

/// Whether two rows' input cells share a combination.
fn overlap(a: &[Cell], b: &[Cell]) -> bool {
    a.iter().zip(b).all(|(x, y)| !differ(x.value, y.value))
}

/// The value of an input cell: `None` for `-`.
pub(crate) fn value(v: CellValue) -> Option<bool> {
    match v {
        CellValue::Zero => Some(false),
        CellValue::One => Some(true),
        CellValue::Dash => None,
    }
}

/// The function (`full`, over inputs and choices) of each signal a table
/// header names; `None` when one has none (other rules say why).
pub(crate) fn header_values(f: &Functions, m: &Model, names: &[Name]) -> Option<Vec<BddRef>> {
    names
        .iter()
        .map(|n| {
            let s = m.signal(&n.text)?;
            f.value(s).ok().map(|k| k.full)
        })
        .collect()
}

/// Where the table's inputs show the pattern `cells` (`None` for `-`), as
/// a function of the primary inputs and the choices.
pub(crate) fn pattern(
    f: &mut Functions,
    ins: &[BddRef],
    cells: &[Option<bool>],
    e: &mut Effort,
) -> Result<BddRef, Interrupted> {
    let mut acc = BddRef::TRUE;
    for (&v, &c) in ins.iter().zip(cells) {
        let lit = match c {
            Some(true) => v,
            Some(false) => f.bdd.not(v, e)?,
            None => continue,
        };
        acc = f.bdd.and(acc, lit, e)?;
    }
    Ok(acc)
}

/// `a=1, b=0` over the names of a table header, each name once.
pub(crate) fn named_vector(names: &[Name], values: &[bool]) -> String {
    let mut seen: Vec<&str> = Vec::new();
    let mut parts = Vec::new();
    for (n, &v) in names.iter().zip(values) {
        if seen.contains(&n.text.as_str()) {
            continue;
        }
        seen.push(&n.text);
        parts.push(format!("{}={}", n.text, u8::from(v)));
    }
    if parts.is_empty() {
        "the only combination (the table has no inputs)".to_string()
    } else {
        parts.join(", ")
    }
}
