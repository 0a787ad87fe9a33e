//! # `syntax-error`
//!
//! **What it finds.** Text that is not Implica: a missing `)`, a table row
//! without `->`, a keyword used as a signal name, an operator from another
//! notation (`&&`, `~`, `+`), bytes that are not UTF-8.
//!
//! **Why it matters.** A statement that does not parse defines nothing, so
//! every check that depends on it is silent. The parser reads on at the
//! next statement, so all syntax errors of a file are reported at once.
//!
//! **Example.**
//!
//! ```text
//! input a, b
//! output y
//! y = (a & b      # expected `)`: add `)` to close the `(`
//! ```
//!
//! **Fix.** The message says what was found and what was expected there; the
//! help line gives the fix where there is an obvious one. No automatic fix
//! is offered: the intent of broken text is not known.
//!
//! Default severity: error. It cannot be disabled.

use super::Rule;
use crate::{Diagnostic, Related, Severity};
use implica_syntax::SyntaxError;

pub const RULE: Rule = Rule {
    name: "syntax-error",
    default_severity: Severity::Error,
    summary: "text that does not parse as Implica",
    source: include_str!("syntax_error.rs"),
};

pub(crate) fn diagnostic(e: SyntaxError) -> Diagnostic {
    Diagnostic {
        rule: RULE.name,
        severity: RULE.default_severity,
        message: e.message,
        span: e.span,
        help: e.help,
        related: e
            .related
            .into_iter()
            .map(|(span, message)| Related { span, message })
            .collect(),
        fixes: Vec::new(),
    }
}
