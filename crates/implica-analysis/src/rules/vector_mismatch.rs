//! # `vector-mismatch`
//!
//! **What it finds.** A row of an `expect (inputs -> outputs) { ... }`
//! block where a computed output differs from the expected cell. A row
//! with `-` input cells checks every combination it stands for; inputs the
//! header does not name may take any value; an expected `-` is not
//! checked. Where the signal has a don't-care on the vector, it is not
//! fixed there, so it counts as a mismatch (it equals the expected value
//! only for some ways of building it).
//!
//! Combinations that a `never` excludes are not checked: every signal is
//! free there.
//!
//! **Why it matters.** Test vectors pin down behaviour the author worked
//! out by hand; a mismatch means the logic and the vectors disagree.
//!
//! **Example.**
//!
//! ```text
//! input  hot, humid
//! output fan_fast
//! fan_fast = hot & humid
//! expect (hot, humid -> fan_fast) {
//!   1 - -> 1       # fails at hot=1, humid=0
//! }
//! ```
//!
//! The message gives the input vector (the header's inputs, then any other
//! input the checked signal reads; the vector is possible for some value of
//! the inputs it leaves out), the computed value and the expected one, at
//! the differing output cell.
//!
//! A test vector drives primary inputs only. A header that names some
//! other signal as an input is reported by this rule too, at that name,
//! and its block is not checked (a name that is not defined at all is left
//! to `undefined-signal`).
//!
//! **Fix.** None is offered: correct the logic or the expected value.
//!
//! Default severity: error.

use super::assertion_failed::{value_at, vector};
use super::table_width::well_formed;
use super::{Ctx, Rule};
use crate::functions::{DEFAULT_WORK_PER_DEFINITION, Functions};
use crate::model::{Model, SignalKind};
use crate::{Diagnostic, Severity};
use implica_logic::{BddRef, Effort, Interrupted};
use implica_syntax::ast::{CellValue, RowKind, Table};

pub const RULE: Rule = Rule {
    name: "vector-mismatch",
    default_severity: Severity::Error,
    summary: "a test vector's expected output differs from the computed one",
    source: include_str!("vector_mismatch.rs"),
};

pub(crate) fn check(cx: &mut Ctx, out: &mut Vec<Diagnostic>) {
    let m = cx.model;
    for st in &m.expects {
        let table = st.body;
        if !well_formed(table) {
            continue;
        }
        let mut inputs = Vec::new();
        let mut drivable = true;
        for n in &table.inputs {
            let Some(s) = m.signal(&n.text) else {
                drivable = false;
                continue;
            };
            let sig = &m.signals[s];
            match sig.input_index {
                Some(i) => inputs.push(i),
                None => {
                    drivable = false;
                    if sig.kind != SignalKind::Undeclared || !sig.definitions.is_empty() {
                        let mut d = RULE.at(
                            n.span,
                            format!(
                                "`{}` is not a primary input, so this block is not checked",
                                n.text
                            ),
                        );
                        d.help = Some(
                            "a test vector drives primary inputs only: name inputs left of `->` \
                             and the signals to check right of it"
                                .to_string(),
                        );
                        out.push(d);
                    }
                }
            }
        }
        if !drivable {
            continue;
        }
        let mut e = Effort::new(DEFAULT_WORK_PER_DEFINITION);
        // Out of budget: say nothing rather than something unproven.
        let _ = check_block(cx.functions, m, table, &inputs, &mut e, out);
    }
}

fn check_block(
    f: &mut Functions,
    m: &Model,
    table: &Table,
    inputs: &[usize],
    e: &mut Effort,
    out: &mut Vec<Diagnostic>,
) -> Result<(), Interrupted> {
    let possible = f.bdd.not(f.impossible, e)?;
    for row in &table.rows {
        let RowKind::Cells {
            inputs: in_cells,
            outputs: out_cells,
        } = &row.kind
        else {
            continue;
        };
        let mut covered = possible;
        for (cell, &i) in in_cells.iter().zip(inputs) {
            let v = f.bdd.var(i)?;
            let lit = match cell.value {
                CellValue::One => v,
                CellValue::Zero => f.bdd.not(v, e)?,
                CellValue::Dash => continue,
            };
            covered = f.bdd.and(covered, lit, e)?;
        }
        if covered == BddRef::FALSE {
            continue;
        }
        for (cell, name) in out_cells.iter().zip(&table.outputs) {
            let Some(s) = m.signal(&name.text) else {
                continue;
            };
            let Ok(k) = f.value(s) else {
                continue;
            };
            // First where it is surely wrong, then where it is only free.
            let (surely_wrong, maybe_wrong) = match cell.value {
                CellValue::Dash => continue,
                CellValue::One => (f.bdd.not(k.upper, e)?, f.bdd.not(k.lower, e)?),
                CellValue::Zero => (k.lower, k.upper),
            };
            let sure = f.bdd.and(covered, surely_wrong, e)?;
            let wrong = if sure != BddRef::FALSE {
                sure
            } else {
                f.bdd.and(covered, maybe_wrong, e)?
            };
            let Some(point) = f.bdd.any_one(wrong) else {
                continue;
            };
            let mut shown: Vec<usize> = Vec::new();
            for &i in inputs {
                if !shown.contains(&i) {
                    shown.push(i);
                }
            }
            for &i in f.reads(s) {
                if !shown.contains(&i) {
                    shown.push(i);
                }
            }
            let expected = if cell.value == CellValue::One { 1 } else { 0 };
            let mut d = RULE.at(
                cell.span,
                format!(
                    "at {}: `{}` is {}, expected {expected}",
                    vector(m, &shown, &point),
                    name.text,
                    value_at(f, k, &point)
                ),
            );
            d.help = Some(
                "correct the logic or the expected value; `-` leaves an output unchecked"
                    .to_string(),
            );
            out.push(d);
        }
    }
    Ok(())
}
