//! # `table-width`
//!
//! **What it finds.** A row of a `table` or of an `expect` block with more
//! or fewer input cells than the header names inputs, or more or fewer
//! output cells than it names outputs. An `unlisted` row has output cells
//! only, and is checked against the outputs.
//!
//! **Why it matters.** A row of the wrong width cannot be read: a cell is
//! missing, one too many was typed, or the header lost a name. Implica does
//! not guess which, so the signals the table defines have no function
//! until the row is fixed, and every check that needs them stays silent.
//!
//! **Example.**
//!
//! ```text
//! input  hot, humid
//! output fan_fast, fan_slow
//! table (hot, humid -> fan_fast, fan_slow) {
//!   1-  -> 10
//!   01  -> 011     # three output cells for two outputs
//!   00  -> 00
//! }
//! ```
//!
//! The message gives the expected and the found number of cells.
//!
//! **Fix.** None is offered: only the author knows which cell is wrong.
//! Add or remove cells, or correct the header.
//!
//! Default severity: error.

use super::{Ctx, Rule};
use crate::{Diagnostic, Severity};
use implica_syntax::Span;
use implica_syntax::ast::{Cell, ItemKind, Name, RowKind, Table};

pub const RULE: Rule = Rule {
    name: "table-width",
    default_severity: Severity::Error,
    summary: "a table or test-vector row has the wrong number of cells",
    source: include_str!("table_width.rs"),
};

pub(crate) fn check(cx: &mut Ctx, out: &mut Vec<Diagnostic>) {
    for item in &cx.model.file.items {
        let (table, what) = match &item.kind {
            ItemKind::Table(t) => (&**t, "table"),
            ItemKind::Expect(t) => (&**t, "test-vector block"),
            _ => continue,
        };
        for row in &table.rows {
            let (inputs, outputs) = match &row.kind {
                RowKind::Cells { inputs, outputs } => (Some(&inputs[..]), &outputs[..]),
                RowKind::Unlisted { outputs } => (None, &outputs[..]),
                RowKind::Error => continue,
            };
            let mut faults = Vec::new();
            if let Some(inputs) = inputs
                && inputs.len() != table.inputs.len()
            {
                faults.push(side("input", inputs.len(), &table.inputs));
            }
            if outputs.len() != table.outputs.len() {
                faults.push(side("output", outputs.len(), &table.outputs));
            }
            if faults.is_empty() {
                continue;
            }
            let cells: Vec<&Cell> = inputs.unwrap_or(&[]).iter().chain(outputs).collect();
            let span = match (cells.first(), cells.last()) {
                (Some(a), Some(b)) => Span::new(a.span.start, b.span.end),
                _ => row.span,
            };
            let mut d = RULE.at(span, format!("this row {}", faults.join(", and ")));
            d.help = Some(format!(
                "give every row of the {what} one cell per name of its header, or correct the header"
            ));
            out.push(d);
        }
    }
}

/// "has 3 input cells, but the header names 2 inputs (`a`, `b`)".
fn side(kind: &str, found: usize, names: &[Name]) -> String {
    let plural = |n: usize, word: &str| {
        if n == 1 {
            format!("{n} {word}")
        } else {
            format!("{n} {word}s")
        }
    };
    let listed = if names.is_empty() {
        String::new()
    } else {
        format!(
            " ({})",
            names
                .iter()
                .map(|n| format!("`{}`", n.text))
                .collect::<Vec<_>>()
                .join(", ")
        )
    };
    format!(
        "has {} but the header names {}{listed}",
        plural(found, &format!("{kind} cell")),
        plural(names.len(), kind),
    )
}

/// Whether every row of the table has the header's width (rows that did
/// not parse count as wrong): the other table rules read only such tables.
pub(crate) fn well_formed(table: &Table) -> bool {
    table.rows.iter().all(|row| match &row.kind {
        RowKind::Cells { inputs, outputs } => {
            inputs.len() == table.inputs.len() && outputs.len() == table.outputs.len()
        }
        RowKind::Unlisted { outputs } => outputs.len() == table.outputs.len(),
        RowKind::Error => false,
    })
}
