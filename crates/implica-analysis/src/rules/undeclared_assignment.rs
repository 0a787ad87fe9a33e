//! # `undeclared-assignment`
//!
//! **What it finds.** A definition `name = ...` (or a column of a `table`
//! without `let`) whose name is not declared by `output`.
//!
//! **Why it matters.** Without `let`, a definition defines an output, but
//! this name is not one: either the `output` declaration was forgotten, and
//! the signal will be missing from whatever is built from the file, or the
//! signal was meant to be intermediate and `let` was forgotten.
//!
//! **Example.**
//!
//! ```text
//! input  hot, rain
//! output vent
//! vent   = wanted & !rain
//! wanted = hot          # not an output: write `let wanted = hot`
//! ```
//!
//! **Fix.** Two, to choose from (both to review: which one was meant is
//! not known): add `let` (no signal changes), or declare the name as an
//! output (it changes what the file exports).
//!
//! No fix is offered while the file has syntax errors.
//!
//! Default severity: error.

use super::{Ctx, Rule};
use crate::model::{Body, SignalKind};
use crate::{Applicability, Diagnostic, Edit, Fix, Severity};
use implica_syntax::ast::ItemKind;

pub const RULE: Rule = Rule {
    name: "undeclared-assignment",
    default_severity: Severity::Error,
    summary: "a definition without `let` of a name that is not a declared output",
    source: include_str!("undeclared_assignment.rs"),
};

pub(crate) fn check(cx: &mut Ctx, out: &mut Vec<Diagnostic>) {
    let m = cx.model;
    // Where a new output name goes: after the last name of the last
    // `output` statement.
    let last_output = m.file.items.iter().rev().find_map(|it| match &it.kind {
        ItemKind::Output(d) => d.names.last().map(|n| n.span.end),
        _ => None,
    });
    for def in &m.definitions {
        let sig = &m.signals[def.signal];
        if def.is_let || sig.kind != SignalKind::Undeclared {
            continue;
        }
        let mut d = RULE.at(
            def.target,
            format!(
                "`{}` is defined without `let` but is not a declared output",
                sig.name
            ),
        );
        d.help = Some(format!(
            "write `let {}` for an intermediate signal, or add `{}` to an `output` statement",
            sig.name, sig.name
        ));
        if !super::is_plain_name(&sig.name) || cx.has_syntax_errors {
            // A keyword used as a name, or text that does not parse: where
            // the new name would go is not known for sure.
            out.push(d);
            continue;
        }
        let item = &m.file.items[def.item];
        let let_at = match def.body {
            Body::Column { .. } => {
                // `let table` makes every column intermediate: only when
                // none of them is an output.
                let all_undeclared = match &item.kind {
                    ItemKind::Table(t) => t.outputs.iter().all(|o| {
                        m.signal(&o.text)
                            .is_some_and(|s| m.signals[s].kind == SignalKind::Undeclared)
                    }),
                    _ => false,
                };
                all_undeclared.then_some(item.span.start)
            }
            _ => Some(def.target.start),
        };
        if let Some(at) = let_at {
            d.fixes.push(Fix {
                title: "make it an intermediate signal with `let`".to_string(),
                applicability: Applicability::NeedsReview,
                edits: vec![Edit {
                    span: implica_syntax::Span::new(at, at),
                    new_text: "let ".to_string(),
                }],
            });
        }
        let declare = match last_output {
            Some(end) => Edit {
                span: implica_syntax::Span::new(end, end),
                new_text: format!(", {}", sig.name),
            },
            None => {
                let at = m.file.items.first().map_or(0, |it| it.span.start);
                Edit {
                    span: implica_syntax::Span::new(at, at),
                    new_text: format!("output {}\n", sig.name),
                }
            }
        };
        d.fixes.push(Fix {
            title: format!("declare `{}` as an output", sig.name),
            applicability: Applicability::NeedsReview,
            edits: vec![declare],
        });
        out.push(d);
    }
}
