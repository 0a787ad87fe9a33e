//! # `table-missing-rows`
//!
//! **What it finds.** Combinations of a `table`'s input cells that no row
//! covers, in a table without an `unlisted` row. They are listed as input
//! patterns over the table's inputs, merged into patterns with `-` where
//! possible (at most eight, then how many more), with their number.
//!
//! "Missing" is over the table's own inputs, which may be intermediate
//! signals. Combinations that cannot occur are left out: those where the
//! table's input signals never take those values together on an input
//! combination that `never` allows (for primary inputs: a combination that
//! is impossible whatever the other inputs are). For tables of up to 16
//! inputs this is exact: the count is of the missing combinations that can
//! occur, though a listed pattern may also cover some that cannot, where
//! that merges patterns. For wider tables a pattern is dropped only when
//! none of its combinations can occur, and the count includes every
//! combination of the patterns listed.
//!
//! Nothing is reported when none of the missing combinations can occur.
//! When the missing set is too scattered to list within the budget, the
//! message says so and gives its size.
//!
//! **Why it matters.** A missing row is a don't-care: whoever builds the
//! logic picks its value. That may be intended, but a table that says so
//! by omission is easily misread, and a row forgotten by mistake looks the
//! same. Implica asks for the intent to be written down.
//!
//! **Example.**
//!
//! ```text
//! input  s1, s0
//! output vent_a, vent_b
//! table (s1, s0 -> vent_a, vent_b) {
//!   00 -> 00
//!   01 -> 10     # row `1-` is missing
//! }
//! ```
//!
//! **Fix.** Write the missing rows, or say what they mean with an
//! `unlisted` row as the table's last row: `unlisted -> 00` makes them 0,
//! and `unlisted -> --` leaves them open, as don't-cares. The latter is
//! offered (safe: missing rows are don't-cares already, so no signal
//! changes); it is placed before the closing `}` with the rows'
//! indentation.
//!
//! Tables whose rows have the wrong width (`table-width`) or whose inputs
//! have no function are not checked; nor are tables of more than 64
//! inputs.
//!
//! Default severity: warning.

use super::table_conflict::{header_values, pattern, value};
use super::table_width::well_formed;
use super::{Ctx, Rule};
use crate::functions::{DEFAULT_WORK_PER_DEFINITION, Functions};
use crate::model::Model;
use crate::{Applicability, Diagnostic, Edit, Fix, Severity};
use implica_logic::{
    Bdd, BddRef, Budget, Cover, Cube, Effort, Interrupted, TruthTable, minimize_heuristic,
    minimize_sop_cancellable,
};
use implica_syntax::Span;
use implica_syntax::ast::{Item, ItemKind, RowKind, Table};

pub const RULE: Rule = Rule {
    name: "table-missing-rows",
    default_severity: Severity::Warning,
    summary: "a table without an `unlisted` row leaves input combinations out",
    source: include_str!("table_missing_rows.rs"),
};

/// Patterns shown in the message.
const SHOWN: usize = 8;
/// Inputs beyond which a table's missing rows are not listed (cube width).
const MAX_INPUTS: usize = 64;
/// Inputs up to which every missing combination is checked on its own.
const EXACT_INPUTS: usize = 16;
/// Disjoint patterns the missing set may start as before merging.
const MAX_START_CUBES: usize = 20_000;

pub(crate) fn check(cx: &mut Ctx, out: &mut Vec<Diagnostic>) {
    let m = cx.model;
    for item in &m.file.items {
        let ItemKind::Table(table) = &item.kind else {
            continue;
        };
        if !well_formed(table)
            || table.inputs.len() > MAX_INPUTS
            || table
                .rows
                .iter()
                .any(|r| matches!(r.kind, RowKind::Unlisted { .. }))
        {
            continue;
        }
        let Some(ins) = header_values(cx.functions, m, &table.inputs) else {
            continue;
        };
        let cancel = cx.cancel;
        let stop = || cancel.is_some_and(|c| c());
        let mut e = Effort::new(DEFAULT_WORK_PER_DEFINITION).with_cancel(&stop);
        // Out of budget: say nothing rather than something unproven (and
        // when cancelled, the driver drops the whole analysis).
        let Ok(Some(missing)) = find(cx.functions, m, table, &ins, &mut e) else {
            continue;
        };
        out.push(diagnostic(cx.src, item, table, missing));
    }
}

/// The missing combinations that can occur.
struct Missing {
    /// Patterns over the table's inputs, in reading order; empty when
    /// there are too many to list.
    patterns: Vec<String>,
    /// Combinations they stand for (those that can occur, where known).
    count: f64,
}

fn find(
    f: &mut Functions,
    m: &Model,
    table: &Table,
    ins: &[BddRef],
    e: &mut Effort,
) -> Result<Option<Missing>, Interrupted> {
    let k = table.inputs.len();
    let rows: Vec<Vec<Option<bool>>> = table
        .rows
        .iter()
        .filter_map(|r| match &r.kind {
            RowKind::Cells { inputs, .. } => Some(inputs.iter().map(|c| value(c.value)).collect()),
            _ => None,
        })
        .collect();
    // Over the primary inputs first: can any missing combination occur?
    let mut listed = BddRef::FALSE;
    for row in &rows {
        let p = pattern(f, ins, row, e)?;
        listed = f.bdd.or(listed, p, e)?;
    }
    let unlisted = f.bdd.not(listed, e)?;
    let possible = f.bdd.not(f.impossible, e)?;
    if f.bdd.and(unlisted, possible, e)? == BddRef::FALSE {
        return Ok(None);
    }
    // The missing set over the table's own inputs.
    let mut local = Bdd::new(k);
    let mut covered = BddRef::FALSE;
    for row in &rows {
        let mut c = BddRef::TRUE;
        for (j, cell) in row.iter().enumerate() {
            let Some(v) = *cell else { continue };
            let x = local.var(j)?;
            let lit = if v { x } else { local.not(x, e)? };
            c = local.and(c, lit, e)?;
        }
        covered = local.or(covered, c, e)?;
    }
    let missing = local.not(covered, e)?;
    let order: Vec<usize> = (0..k).collect();
    let inputs: Option<Vec<usize>> = table
        .inputs
        .iter()
        .map(|n| m.signal(&n.text).and_then(|s| m.signals[s].input_index))
        .collect();
    let distinct = inputs.as_ref().is_some_and(|v| {
        let mut w = v.clone();
        w.sort_unstable();
        w.dedup();
        w.len() == v.len()
    });
    if let (Some(inputs), true) = (&inputs, distinct && k <= 16) {
        // Exact: the missing rows that can occur, with the impossible ones
        // free to merge with them.
        let mut others = vec![true; f.inputs];
        for &i in inputs {
            others[i] = false;
        }
        let never = f.bdd.forall(f.impossible, &others, e)?;
        let never = f.bdd.to_truth_table(never, inputs);
        let all = local.to_truth_table(missing, &order);
        let on = all.and_not(&never);
        let dc = all.and(&never);
        if on.is_zero() {
            return Ok(None);
        }
        if let Some(mut cover) = merged(&on, &dc, e)? {
            return Ok(Some(Missing {
                patterns: patterns(&mut cover),
                count: on.count_ones() as f64,
            }));
        }
    }
    if k <= EXACT_INPUTS {
        // Each missing combination checked on its own.
        let all = local.to_truth_table(missing, &order);
        let mut part = Effort::new(e.remaining() / 2);
        let reach = occurring(f, ins, &all, possible, &mut part);
        e.spend(part.used())?;
        match reach {
            Ok(on) if on.is_zero() => return Ok(None),
            Ok(on) => {
                let dc = all.and_not(&on);
                if let Some(mut cover) = merged(&on, &dc, e)? {
                    return Ok(Some(Missing {
                        patterns: patterns(&mut cover),
                        count: on.count_ones() as f64,
                    }));
                }
            }
            Err(Interrupted::Cancelled) => return Err(Interrupted::Cancelled),
            Err(Interrupted::OutOfBudget) => {}
        }
    }
    // Merged heuristically, then each pattern kept only if it can occur.
    let Ok(start) = local.to_cover_over(missing, &order, MAX_START_CUBES) else {
        // Too scattered to list; that some can occur is proven above.
        return Ok(Some(Missing {
            patterns: Vec::new(),
            count: local.fraction_ones(missing) * 2f64.powi(k as i32),
        }));
    };
    let merged = minimize_heuristic(
        &start,
        &Cover {
            vars: k,
            cubes: Vec::new(),
        },
        e,
    )?
    .cover;
    let mut kept = Cover {
        vars: k,
        cubes: Vec::new(),
    };
    for cube in &merged.cubes {
        let cells: Vec<Option<bool>> = (0..k).map(|j| cube.literal_of(j)).collect();
        let p = pattern(f, ins, &cells, e)?;
        if f.bdd.and(p, possible, e)? != BddRef::FALSE {
            kept.cubes.push(*cube);
        }
    }
    if kept.cubes.is_empty() {
        return Ok(None);
    }
    let union = local.from_cover(&kept, e)?;
    let count = local.fraction_ones(union) * 2f64.powi(k as i32);
    Ok(Some(Missing {
        patterns: patterns(&mut kept),
        count,
    }))
}

/// The fewest patterns that cover `on`, allowed to spill into `dc` (the
/// combinations that cannot occur) only where that saves a pattern, so
/// that a pattern is not widened for nothing.
fn merged(on: &TruthTable, dc: &TruthTable, e: &Effort) -> Result<Option<Cover>, Interrupted> {
    let budget = Budget::default();
    let stop = || e.cancelled();
    let Ok(with) = minimize_sop_cancellable(on, dc, &budget, &stop)? else {
        return Ok(None);
    };
    let with = with.cover;
    Ok(Some(
        match minimize_sop_cancellable(on, &TruthTable::zero(on.vars()), &budget, &stop)? {
            Ok(exact) if exact.cover.len() <= with.len() => exact.cover,
            _ => with,
        },
    ))
}

/// The combinations of `all` (over the table's inputs) that the input
/// signals can show on a possible input combination.
fn occurring(
    f: &mut Functions,
    ins: &[BddRef],
    all: &TruthTable,
    possible: BddRef,
    e: &mut Effort,
) -> Result<TruthTable, Interrupted> {
    let k = ins.len();
    let mut on = TruthTable::zero(k);
    for m in all.minterms() {
        let cells: Vec<Option<bool>> = (0..k).map(|j| Some((m >> (k - 1 - j)) & 1 == 1)).collect();
        let p = pattern(f, ins, &cells, e)?;
        if f.bdd.and(p, possible, e)? != BddRef::FALSE {
            on.set(m, true);
        }
    }
    Ok(on)
}

/// The cubes as table patterns, in table order (`0` before `-` before `1`).
fn patterns(cover: &mut Cover) -> Vec<String> {
    let k = cover.vars;
    let text = |c: &Cube| -> String {
        (0..k)
            .map(|j| match c.literal_of(j) {
                Some(false) => '0',
                Some(true) => '1',
                None => '-',
            })
            .collect()
    };
    let mut v: Vec<String> = cover.cubes.iter().map(text).collect();
    v.sort_by_cached_key(|p| {
        p.chars()
            .map(|c| match c {
                '0' => 0u8,
                '-' => 1,
                _ => 2,
            })
            .collect::<Vec<u8>>()
    });
    v
}

fn diagnostic(src: &str, item: &Item, table: &Table, missing: Missing) -> Diagnostic {
    let header = header_span(src, item, table);
    let names = table
        .inputs
        .iter()
        .map(|n| n.text.as_str())
        .collect::<Vec<_>>()
        .join(", ");
    let message = if table.inputs.is_empty() {
        "this table has no row".to_string()
    } else {
        let count = missing.count;
        let what = if count == 1.0 {
            "1 combination".to_string()
        } else {
            format!("{count} combinations")
        };
        let shown: Vec<String> = missing
            .patterns
            .iter()
            .take(SHOWN)
            .map(|p| format!("`{p}`"))
            .collect();
        let more = missing.patterns.len().saturating_sub(SHOWN);
        let tail = match more {
            0 => String::new(),
            1 => ", and 1 more pattern".to_string(),
            n => format!(", and {n} more patterns"),
        };
        if shown.is_empty() {
            format!(
                "no row covers some combinations of ({names}) that can occur: at most {what}, \
                 too scattered to list"
            )
        } else {
            format!(
                "no row covers {what} of ({names}): {}{tail}",
                shown.join(", ")
            )
        }
    };
    let mut d = RULE.at(header, message);
    let dashes = unlisted_cells(table);
    d.help = Some(format!(
        "add the missing rows, or say what they mean with an `unlisted` row: `unlisted -> {}` \
         makes them 0, `unlisted -> {dashes}` leaves them open (don't-cares)",
        dashes.replace('-', "0")
    ));
    if let Some(edit) = unlisted_edit(src, item, table, &dashes) {
        d.fixes.push(Fix {
            title: format!("mark the missing rows as don't-cares (`unlisted -> {dashes}`)"),
            applicability: Applicability::Safe,
            edits: vec![edit],
        });
    }
    d
}

/// `table (a, b -> y, z)`: from the statement's start through the `)`.
fn header_span(src: &str, item: &Item, table: &Table) -> Span {
    let after = table.outputs.last().map_or(item.span.start, |n| n.span.end);
    let end = src
        .get(after..item.span.end)
        .and_then(|rest| rest.find(')'))
        .map_or(after, |i| after + i + 1);
    Span::new(item.span.start, end)
}

/// One `-` per output, packed when every row writes its outputs packed.
fn unlisted_cells(table: &Table) -> String {
    let mut packed = true;
    for row in &table.rows {
        if let RowKind::Cells { outputs, .. } = &row.kind {
            packed &= outputs.windows(2).all(|w| w[0].span.end == w[1].span.start);
        }
    }
    let sep = if packed { "" } else { " " };
    vec!["-"; table.outputs.len()].join(sep)
}

/// Inserts `unlisted -> CELLS` as the last row, before the closing `}`,
/// with the indentation of the first row (two spaces if there is none).
fn unlisted_edit(src: &str, item: &Item, table: &Table, cells: &str) -> Option<Edit> {
    let close = item.span.end.checked_sub(1)?;
    if src.get(close..item.span.end) != Some("}") {
        return None;
    }
    let indent = table
        .rows
        .first()
        .and_then(|r| {
            let line_start = src[..r.span.start].rfind('\n').map_or(0, |i| i + 1);
            let before = &src[line_start..r.span.start];
            before.trim().is_empty().then(|| before.to_string())
        })
        .unwrap_or_else(|| "  ".to_string());
    // Aligned with the rows' `->` where they leave room for `unlisted`.
    let arrow = table.rows.first().and_then(|r| {
        let line_start = src[..r.span.start].rfind('\n').map_or(0, |i| i + 1);
        let at = src.get(r.span.start..r.span.end)?.find("->")?;
        Some(r.span.start + at - line_start)
    });
    let label = match arrow {
        Some(col) if col > indent.len() + "unlisted".len() => {
            format!("{:<width$}", "unlisted", width = col - indent.len())
        }
        _ => "unlisted ".to_string(),
    };
    let body_end = src[..close].trim_end().len();
    Some(Edit {
        span: Span::new(body_end, close),
        new_text: format!("\n{indent}{label}-> {cells}\n"),
    })
}
