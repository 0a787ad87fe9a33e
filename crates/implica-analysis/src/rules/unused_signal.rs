//! # `unused-signal`
//!
//! **What it finds.** An intermediate signal (`let`) that no output, no
//! `never`, `assert` or `expect`, and no other used signal reads, directly
//! or through other signals.
//!
//! **Why it matters.** Dead logic: it costs nothing when built, but it
//! misleads whoever reads the file into thinking it matters, and it is
//! often a sign that an output reads the wrong signal.
//!
//! **Example.**
//!
//! ```text
//! input  hot, humid
//! output fan
//! fan = hot
//! let damp = humid      # nothing reads `damp`
//! ```
//!
//! Every dead signal is reported at once, including those read only by
//! other dead signals, so that removing them all converges in one pass.
//!
//! **Fix.** Remove the definition (safe: no output changes). Offered for
//! `let` definitions; a column of a `let table` is left to the author.
//!
//! Not reported while the file has syntax errors: the statement that does
//! not parse may be the one that reads it.
//!
//! Default severity: warning.

use super::{Ctx, Rule, statement_line};
use crate::model::{Body, SignalId, SignalKind};
use crate::{Applicability, Diagnostic, Edit, Fix, Severity};

pub const RULE: Rule = Rule {
    name: "unused-signal",
    default_severity: Severity::Warning,
    summary: "an intermediate signal is never used",
    source: include_str!("unused_signal.rs"),
};

pub(crate) fn check(cx: &mut Ctx, out: &mut Vec<Diagnostic>) {
    if cx.has_syntax_errors {
        return;
    }
    let m = cx.model;
    let mut live = vec![false; m.signals.len()];
    let mut stack: Vec<SignalId> = Vec::new();
    // Roots: everything that is not an intermediate, and what the
    // statements about the logic read.
    for (s, sig) in m.signals.iter().enumerate() {
        if sig.kind != SignalKind::Intermediate {
            stack.push(s);
        }
    }
    let mut reads_of_statements = Vec::new();
    for st in m.never.iter().chain(&m.asserts) {
        reads_of_statements.extend(
            crate::model::name_uses(st.body)
                .into_iter()
                .map(|n| n.text.to_string()),
        );
    }
    for st in &m.expects {
        for n in st.body.inputs.iter().chain(&st.body.outputs) {
            reads_of_statements.push(n.text.to_string());
        }
    }
    stack.extend(reads_of_statements.iter().filter_map(|n| m.signal(n)));
    while let Some(s) = stack.pop() {
        if live[s] {
            continue;
        }
        live[s] = true;
        for &d in &m.signals[s].definitions {
            stack.extend(m.definitions[d].reads.iter().copied());
        }
    }
    for (s, sig) in m.signals.iter().enumerate() {
        if live[s] || sig.kind != SignalKind::Intermediate {
            continue;
        }
        let Some(&first) = sig.definitions.first() else {
            continue;
        };
        let def = &m.definitions[first];
        let mut d = RULE.at(def.target, format!("`{}` is never used", sig.name));
        d.help = Some("remove it, or read it where it was meant to be used".to_string());
        // Removing it must take the dead signals that read it along.
        let mut doomed = vec![s];
        let mut k = 0;
        while k < doomed.len() {
            let t = doomed[k];
            k += 1;
            for def in &m.definitions {
                if !live[def.signal] && def.reads.contains(&t) && !doomed.contains(&def.signal) {
                    doomed.push(def.signal);
                }
            }
        }
        let removable = doomed.iter().all(|&t| {
            let defs = &m.signals[t].definitions;
            defs.len() == 1 && matches!(m.definitions[defs[0]].body, Body::Expr(_) | Body::Terms(_))
        });
        if removable {
            let mut edits: Vec<Edit> = doomed
                .iter()
                .map(|&t| Edit {
                    span: statement_line(
                        cx.src,
                        m.file.items[m.definitions[m.signals[t].definitions[0]].item].span,
                    ),
                    new_text: String::new(),
                })
                .collect();
            edits.sort_by_key(|e| e.span.start);
            let title = if doomed.len() == 1 {
                format!("remove the definition of `{}`", sig.name)
            } else {
                format!(
                    "remove the definition of `{}` and of the unused signals that read it",
                    sig.name
                )
            };
            d.fixes.push(Fix {
                title,
                applicability: Applicability::Safe,
                edits,
            });
        }
        out.push(d);
    }
}
