//! # `undefined-signal`
//!
//! **What it finds.** A name that is read (in an expression, an `over`
//! list, a table header, `never`, `assert` or `expect`) but is neither
//! declared as an input nor defined.
//!
//! **Why it matters.** Nothing that reads it has a value: every signal
//! computed from it, and every check of those signals, is silent. It is
//! usually a misspelling or a signal that was renamed.
//!
//! **Example.**
//!
//! ```text
//! input  door_a, door_b
//! output closed
//! closed = door_a & door_bb   # `door_bb` is neither an input nor defined
//! ```
//!
//! **Fix.** Where a declared or defined name is one or two edits away, the
//! help names it and a fix (to review) replaces this use with it. Otherwise
//! declare the name with `input`, or define it.
//!
//! The diagnostic is given once per name, at its first use; the other uses
//! are listed as related places.
//!
//! Not reported while the file has syntax errors: the statement that does
//! not parse may be the one that defines it.
//!
//! Default severity: error.

use super::{Ctx, Rule};
use crate::model::SignalKind;
use crate::{Applicability, Diagnostic, Edit, Fix, Related, Severity};

pub const RULE: Rule = Rule {
    name: "undefined-signal",
    default_severity: Severity::Error,
    summary: "a name is read but neither declared as an input nor defined",
    source: include_str!("undefined_signal.rs"),
};

pub(crate) fn check(cx: &mut Ctx, out: &mut Vec<Diagnostic>) {
    if cx.has_syntax_errors {
        return;
    }
    let m = cx.model;
    for sig in &m.signals {
        // A declared output without a definition is `undefined-output`.
        if sig.kind == SignalKind::Input
            || !sig.definitions.is_empty()
            || !sig.declarations.is_empty()
        {
            continue;
        }
        let Some(&first) = sig.references.first() else {
            continue;
        };
        let mut d = RULE.at(
            first,
            format!("`{}` is neither declared as an input nor defined", sig.name),
        );
        d.related = sig.references[1..]
            .iter()
            .map(|&span| Related {
                span,
                message: format!("`{}` is also read here", sig.name),
            })
            .collect();
        let near = m
            .signals
            .iter()
            .filter(|o| {
                o.kind == SignalKind::Input
                    || !o.definitions.is_empty()
                    || !o.declarations.is_empty()
            })
            .filter(|o| edit_distance(&o.name, &sig.name) <= 2 && super::is_plain_name(&o.name))
            .min_by_key(|o| (edit_distance(&o.name, &sig.name), o.name.clone()));
        match near {
            Some(o) => {
                d.help = Some(format!("did you mean `{}`?", o.name));
                d.fixes.push(Fix {
                    title: format!("replace with `{}`", o.name),
                    applicability: Applicability::NeedsReview,
                    edits: vec![Edit {
                        span: first,
                        new_text: o.name.to_string(),
                    }],
                });
            }
            None => {
                d.help = Some(format!(
                    "declare it with `input {}`, or define it with `{} = ...`",
                    sig.name, sig.name
                ));
            }
        }
        out.push(d);
    }
}

/// Levenshtein distance, by characters.
pub(crate) fn edit_distance(a: &str, b: &str) -> usize {
    let b: Vec<char> = b.chars().collect();
    let mut prev: Vec<usize> = (0..=b.len()).collect();
    for (i, ca) in a.chars().enumerate() {
        let mut cur = vec![i + 1; b.len() + 1];
        for (j, &cb) in b.iter().enumerate() {
            cur[j + 1] = (prev[j] + usize::from(ca != cb))
                .min(prev[j + 1] + 1)
                .min(cur[j] + 1);
        }
        prev = cur;
    }
    prev[b.len()]
}
