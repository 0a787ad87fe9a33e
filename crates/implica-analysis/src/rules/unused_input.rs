//! # `unused-input`
//!
//! **What it finds.** An input declared by `input` that nothing reads: no
//! definition, `never`, `assert` or `expect` mentions it.
//!
//! **Why it matters.** A declared input that no logic uses is usually a
//! sensor that was wired in the specification and then forgotten, or the
//! remains of logic that was deleted. Either way the file no longer says
//! what the input is for.
//!
//! **Example.**
//!
//! ```text
//! input  hot, rain, storm   # `storm` is never read
//! output vent
//! vent = hot & !rain
//! ```
//!
//! (An input that is read, but that a signal's value does not depend on, is
//! `vacuous-input`.)
//!
//! **Fix.** Remove the declaration (to review: no signal changes, but the
//! inputs of whatever is exported from the file do, so `implica fix`
//! applies it only with `--unsafe`).
//!
//! Not reported while the file has syntax errors: the statement that does
//! not parse may be the one that reads it.
//!
//! Default severity: warning.

use super::{Ctx, Rule, statement_line};
use crate::model::SignalKind;
use crate::{Applicability, Diagnostic, Edit, Fix, Severity};
use implica_syntax::Span;
use implica_syntax::ast::ItemKind;

pub const RULE: Rule = Rule {
    name: "unused-input",
    default_severity: Severity::Warning,
    summary: "a declared input is never read",
    source: include_str!("unused_input.rs"),
};

pub(crate) fn check(cx: &mut Ctx, out: &mut Vec<Diagnostic>) {
    if cx.has_syntax_errors {
        return;
    }
    let m = cx.model;
    for sig in &m.signals {
        if sig.kind != SignalKind::Input || !sig.references.is_empty() {
            continue;
        }
        let Some(&decl) = sig.declarations.first() else {
            continue;
        };
        let mut d = RULE.at(decl, format!("input `{}` is never read", sig.name));
        d.help = Some("remove it from the `input` statement, or use it".to_string());
        if let Some(edit) = removal(cx.src, m.file, decl) {
            d.fixes.push(Fix {
                title: format!("remove the input `{}`", sig.name),
                applicability: Applicability::NeedsReview,
                edits: vec![edit],
            });
        }
        out.push(d);
    }
}

/// The edit that removes the declared name at `decl` from its statement,
/// with its comma, or the whole statement when it is the only name.
fn removal(src: &str, file: &implica_syntax::ast::SourceFile, decl: Span) -> Option<Edit> {
    for item in &file.items {
        let ItemKind::Input(d) = &item.kind else {
            continue;
        };
        let Some(k) = d.names.iter().position(|n| n.span == decl) else {
            continue;
        };
        let span = if d.names.len() == 1 {
            statement_line(src, item.span)
        } else if k + 1 < d.names.len() {
            Span::new(d.names[k].span.start, d.names[k + 1].span.start)
        } else {
            Span::new(d.names[k - 1].span.end, d.names[k].span.end)
        };
        return Some(Edit {
            span,
            new_text: String::new(),
        });
    }
    None
}
