//! # `unknown-rule`
//!
//! **What it finds.** A suppression comment (`# implica: quiet RULE, ...`)
//! or a file directive (`# implica: enable RULE, ...`,
//! `# implica: disable RULE, ...`) that names a rule that does not exist,
//! and a directive that would turn `syntax-error` off.
//!
//! **Why it matters.** A misspelt name silences (or enables) nothing, so
//! the finding it was meant to quiet is still reported, or the check it
//! was meant to run does not run, and the comment misleads whoever reads
//! it. (A misspelt rule name in `implica.toml` is reported as an
//! error in that file.)
//!
//! **Example.**
//!
//! ```text
//! input  a, b, spare
//! output y
//! y = a & b  # implica: quiet unused-inputs -- `unused-input` was meant
//! ```
//!
//! **Fix.** Correct the name; `implica rules` lists them. A fix (to review)
//! replaces it with the nearest rule name when one is close.
//!
//! Default severity: warning.

use super::{Ctx, Rule};
use crate::{Applicability, Diagnostic, Edit, Fix, Severity};

pub const RULE: Rule = Rule {
    name: "unknown-rule",
    default_severity: Severity::Warning,
    summary: "a suppression comment or file directive names a rule that does not exist",
    source: include_str!("unknown_rule.rs"),
};

pub(crate) fn check(cx: &mut Ctx, out: &mut Vec<Diagnostic>) {
    let file = cx.model.file;
    let quiet = crate::suppress::collect(file).into_iter().map(|q| q.rules);
    let directives = crate::suppress::directives(file);
    for d in &directives {
        for (name, span) in &d.rules {
            if !d.enable && name == "syntax-error" {
                let mut diag = RULE.at(*span, "`syntax-error` cannot be disabled".to_string());
                diag.help = Some("remove the name from the directive".to_string());
                out.push(diag);
            }
        }
    }
    let named = quiet.chain(directives.into_iter().map(|d| d.rules));
    for rules in named {
        for (name, span) in &rules {
            if super::find(name).is_some() {
                continue;
            }
            let mut d = RULE.at(span.to_owned(), format!("there is no rule `{name}`"));
            let near = super::ALL
                .iter()
                .map(|r| (super::undefined_signal::edit_distance(r.name, name), r.name))
                .filter(|&(dist, _)| dist <= 3)
                .min();
            match near {
                Some((_, r)) => {
                    d.help = Some(format!("did you mean `{r}`? (`implica rules` lists them)"));
                    d.fixes.push(Fix {
                        title: format!("replace with `{r}`"),
                        applicability: Applicability::NeedsReview,
                        edits: vec![Edit {
                            span: *span,
                            new_text: r.to_string(),
                        }],
                    });
                }
                None => d.help = Some("`implica rules` lists the rules".to_string()),
            }
            out.push(d);
        }
    }
}
