//! # `undefined-output`
//!
//! **What it finds.** A name declared by `output` that no definition and no
//! table column defines.
//!
//! **Why it matters.** The output has no logic behind it: whatever is
//! built from the file leaves it floating or tied off, and every check of
//! it is silent.
//!
//! **Example.**
//!
//! ```text
//! input  call, at_floor
//! output door_cmd, lamp    # `lamp` is never defined
//! door_cmd = call & at_floor
//! ```
//!
//! **Fix.** Define it (`lamp = ...`), or remove it from the `output`
//! statement. No automatic fix: the intended logic is not known.
//!
//! Not reported while the file has syntax errors: the statement that does
//! not parse may be the one that defines it.
//!
//! Default severity: error.

use super::{Ctx, Rule};
use crate::model::SignalKind;
use crate::{Diagnostic, Severity};

pub const RULE: Rule = Rule {
    name: "undefined-output",
    default_severity: Severity::Error,
    summary: "a declared output is never defined",
    source: include_str!("undefined_output.rs"),
};

pub(crate) fn check(cx: &mut Ctx, out: &mut Vec<Diagnostic>) {
    if cx.has_syntax_errors {
        return;
    }
    for sig in &cx.model.signals {
        if sig.kind != SignalKind::Output || !sig.definitions.is_empty() {
            continue;
        }
        let Some(&decl) = sig.declarations.first() else {
            continue;
        };
        let mut d = RULE.at(
            decl,
            format!("output `{}` is declared but never defined", sig.name),
        );
        d.help = Some(format!(
            "define it with `{} = ...` or a table column, or remove it from `output`",
            sig.name
        ));
        out.push(d);
    }
}
