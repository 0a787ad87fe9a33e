//! # `redundant-literal`
//!
//! **What it finds.** A literal (a signal name, or its negation) in a
//! product term of a sum of products, or in a sum factor of a product of
//! sums, that can be dropped without changing the signal:
//! `x | !x & y` is `x | y`, so `!x` is redundant there. Combinations of the
//! signals' values that cannot occur (`never`, or how the signals are
//! computed) are don't-cares.
//!
//! **Why it matters.** A redundant literal makes a term narrower than it
//! needs to be: a wider term is a smaller gate, and the narrow one often
//! hides a misunderstanding of when the term applies.
//!
//! **Example.**
//!
//! ```text
//! input  hot, storm
//! output vent_open
//! vent_open = !storm & hot | storm & !storm   # both `storm` and `!storm` in one term
//! ```
//!
//! The literals reported can all be dropped together; terms reported by
//! `redundant-term` are not examined for literals. When dropping them all
//! still leaves the expression larger than its minimal form, `non-minimal`
//! reports the expression instead, once.
//!
//! **Fix.** Drop the literal (safe: proven not to change any signal).
//!
//! Default severity: warning.

use super::{Ctx, Rule};
use crate::forms::{Shape, operand_removal, two_level};
use crate::{Applicability, Diagnostic, Edit, Fix, Severity};

pub const RULE: Rule = Rule {
    name: "redundant-literal",
    default_severity: Severity::Warning,
    summary: "a literal can be dropped from its term without changing the signal",
    source: include_str!("redundant_literal.rs"),
};

pub(crate) fn check(cx: &mut Ctx, out: &mut Vec<Diagnostic>) {
    let m = cx.model;
    for (id, def, e) in super::expression_definitions(m) {
        let Some((f, r)) = cx.redundancy_target(id, e) else {
            continue;
        };
        if r.literals.is_empty() {
            continue;
        }
        let Some(t) = two_level(e, &f.names) else {
            continue;
        };
        for &(i, l) in &r.literals {
            let part = &t.parts[i];
            let (Some(inner), lit) = (part.inner, &part.literals[l]) else {
                continue;
            };
            let text = &cx.src[lit.expr.span.start..lit.expr.span.end];
            let whole = &cx.src[part.expr.span.start..part.expr.span.end];
            let what = match t.shape {
                Shape::Sum => "term",
                Shape::Product => "factor",
            };
            let mut d = RULE.at(
                lit.expr.span,
                format!("`{text}` is redundant in the {what} `{whole}`"),
            );
            d.help = Some(format!(
                "drop it; `{}` stays the same",
                m.signals[def.signal].name
            ));
            // `(a | b)` losing `b` becomes `a`, not `(a)`.
            let edit = if part.literals.len() == 2
                && part.expr.span != part.literals[1 - l].expr.span
                && cx.src[part.expr.span.start..].starts_with('(')
            {
                let keep = &part.literals[1 - l].expr.span;
                Edit {
                    span: part.expr.span,
                    new_text: cx.src[keep.start..keep.end].to_string(),
                }
            } else {
                Edit {
                    span: operand_removal(inner, l),
                    new_text: String::new(),
                }
            };
            d.fixes.push(Fix {
                title: format!("drop `{text}`"),
                applicability: Applicability::Safe,
                edits: vec![edit],
            });
            out.push(d);
        }
    }
}
