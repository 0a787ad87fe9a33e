//! # `duplicate-definition`
//!
//! **What it finds.** A signal defined more than once (by two definitions,
//! a definition and a table column, or two table columns), or a name
//! declared more than once (twice as an input, as an input and an output).
//!
//! **Why it matters.** Only one definition can hold. Implica uses the first
//! and ignores the others, which is rarely what the author meant: the two
//! usually disagree, and whoever reads the file may trust the wrong one.
//!
//! **Example.**
//!
//! ```text
//! input  hot, rain
//! output vent
//! vent = hot & !rain
//! vent = hot          # `vent` is already defined above
//! ```
//!
//! **Fix.** Remove or rename one of them. No automatic fix: which one is
//! right is not known.
//!
//! Default severity: error.

use super::{Ctx, Rule};
use crate::{Diagnostic, Related, Severity};

pub const RULE: Rule = Rule {
    name: "duplicate-definition",
    default_severity: Severity::Error,
    summary: "a signal is defined, or a name declared, more than once",
    source: include_str!("duplicate_definition.rs"),
};

pub(crate) fn check(cx: &mut Ctx, out: &mut Vec<Diagnostic>) {
    let m = cx.model;
    for sig in &m.signals {
        if let Some((&first, rest)) = sig.definitions.split_first() {
            let first = &m.definitions[first];
            for &d in rest {
                let def = &m.definitions[d];
                let mut diag = RULE.at(
                    def.target,
                    format!(
                        "`{}` is already defined; this definition is ignored",
                        sig.name
                    ),
                );
                diag.related.push(Related {
                    span: first.target,
                    message: "the definition that counts".to_string(),
                });
                diag.help = Some("remove one of the definitions, or rename one".to_string());
                out.push(diag);
            }
        }
        if let Some((&first, rest)) = sig.declarations.split_first() {
            for &span in rest {
                let mut diag = RULE.at(span, format!("`{}` is already declared", sig.name));
                diag.related.push(Related {
                    span: first,
                    message: "first declared here".to_string(),
                });
                diag.help = Some("declare each name once, as an input or an output".to_string());
                out.push(diag);
            }
        }
    }
}
