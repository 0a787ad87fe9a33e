//! # `non-minimal`
//!
//! **What it finds.** An expression for which an equivalent two-level form
//! (its minimal sum of products or minimal product of sums over the same
//! signal names) has fewer literals than the expression as written.
//! Combinations of the names' values that cannot occur (`never`, or how the
//! signals are computed) are don't-cares. A factored expression that is
//! already cheaper than both two-level forms is not reported, nor is a tie.
//!
//! **Why it matters.** The same logic in fewer literals is smaller to build
//! and easier to review; a much larger expression than needed is often one
//! that grew by edits nobody simplified.
//!
//! **Example.**
//!
//! ```text
//! input  hot, humid, rain
//! output vent
//! vent = hot & !rain | hot & rain & humid | hot & humid & !rain   # 8 literals; hot & (humid | !rain) has 3
//! ```
//!
//! Past the exact search budget the forms are the best found, and the
//! message says so ("12 terms found, at least 10 needed"); they are still
//! proven equivalent.
//!
//! One fault, one report: when dropping the terms and literals that
//! `redundant-term` and `redundant-literal` report already reaches the
//! minimal cost, only those are reported.
//!
//! **Fix.** Replace the expression by its minimal sum of products, or by
//! its minimal product of sums (whichever are cheaper than as written). The
//! preferred one is safe (proven equivalent, and `implica fix` may apply
//! it): the cheaper one, or the form `implica.toml` prefers (`form = "sop"`
//! or `"pos"` under `[minimize]`) when that one is cheaper than as written;
//! the other is offered for review. Expressions with a comment inside are
//! reported without a fix, so that no comment is lost.
//!
//! Default severity: warning.

use super::{Ctx, Rule};
use crate::config::PreferredForm;
use crate::forms::written_literals;
use crate::{Applicability, Diagnostic, Edit, Fix, Severity};
use implica_logic::BoolExpr;

pub const RULE: Rule = Rule {
    name: "non-minimal",
    default_severity: Severity::Warning,
    summary: "an equivalent two-level form has fewer literals",
    source: include_str!("non_minimal.rs"),
};

pub(crate) fn check(cx: &mut Ctx, out: &mut Vec<Diagnostic>) {
    let m = cx.model;
    for (id, def, e) in super::expression_definitions(m) {
        let written = written_literals(e);
        let Some(f) = cx.expr_function(id, e) else {
            continue;
        };
        let Some(pair) = cx.non_minimal(id, e, &f) else {
            continue;
        };
        let (sop, pos) = (&pair.0, &pair.1);
        let (sl, pl) = (sop.cover.literals(), pos.cover.literals());
        let name = |i: usize| f.names[i].to_string();
        let sop_text = BoolExpr::from_cover(&sop.cover).to_text(&name);
        let pos_text = BoolExpr::from_complement_cover(&pos.cover).to_text(&name);
        let signal = &m.signals[def.signal].name;
        let plural = |n: usize| if n == 1 { "" } else { "s" };
        let mut d = RULE.at(
            e.span,
            format!(
                "`{signal}` has {written} literals as written; its minimal sum of products has {sl} \
                 ({} term{}) and its minimal product of sums {pl} ({} factor{})",
                sop.cover.len(),
                plural(sop.cover.len()),
                pos.cover.len(),
                plural(pos.cover.len()),
            ),
        );
        // Past the search budget the forms are the best found: say what is
        // proven about them.
        for (m, kind) in [(sop, "sum of products"), (pos, "product of sums")] {
            if !m.proven_minimal {
                d.message.push_str(&format!(
                    "; the {kind} is not proven minimal: {} terms found, at least {} needed",
                    m.cover.len(),
                    m.lower_bound
                ));
            }
        }
        d.help = Some(if sl <= pl {
            format!("write `{sop_text}`")
        } else {
            format!("write `{pos_text}`")
        });
        let item = &m.file.items[def.item];
        if item.trivia.interior().is_empty() {
            let sop_first = match cx.config.form {
                PreferredForm::Sop => sl < written,
                PreferredForm::Pos => pl >= written,
                PreferredForm::Either => sl <= pl,
            };
            for (text, lits, is_sop) in [(&sop_text, sl, true), (&pos_text, pl, false)] {
                if lits >= written || (!is_sop && pos_text == sop_text) {
                    continue;
                }
                let kind = if is_sop {
                    "minimal sum of products"
                } else {
                    "minimal product of sums"
                };
                d.fixes.push(Fix {
                    title: format!("replace with the {kind} `{text}`"),
                    applicability: if is_sop == sop_first {
                        Applicability::Safe
                    } else {
                        Applicability::NeedsReview
                    },
                    edits: vec![Edit {
                        span: e.span,
                        new_text: text.clone(),
                    }],
                });
            }
        }
        out.push(d);
    }
}
