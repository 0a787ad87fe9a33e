//! # `redundant-term`
//!
//! **What it finds.** A product term of a sum of products (or a sum factor
//! of a product of sums) that can be removed without changing the signal:
//! a duplicate, a term another term absorbs (`x | x & y`), or a term the
//! others cover together, such as a consensus term (`x & y | !x & z | y & z`:
//! `y & z` is covered by the other two). Combinations of the signals' values
//! that cannot occur (`never`, or how the signals are computed) are
//! don't-cares, so a term that only covers those is redundant too.
//!
//! **Why it matters.** A redundant term is logic that does nothing, or a
//! sign that a term meant to say something else. In hardware it costs a
//! gate; in review it costs attention.
//!
//! **Example.**
//!
//! ```text
//! input  call, at_floor, door_open
//! output chime
//! chime = call & at_floor | call & at_floor & door_open   # the second term is absorbed
//! ```
//!
//! (A consensus term that keeps a sum of products free of static hazards is
//! redundant too; when the hazard rule is enabled, such terms are left to
//! it.)
//!
//! The terms reported can all be removed together: each is redundant given
//! the terms that remain after the earlier ones are removed. When removing
//! them (and the redundant literals) still leaves the expression larger
//! than its minimal form, `non-minimal` reports the expression instead,
//! once.
//!
//! **Fix.** Remove the term (safe: proven not to change any signal).
//!
//! Default severity: warning.

use super::{Ctx, Rule};
use crate::forms::{Shape, operand_removal, two_level};
use crate::{Applicability, Diagnostic, Edit, Fix, Severity};

pub const RULE: Rule = Rule {
    name: "redundant-term",
    default_severity: Severity::Warning,
    summary: "a term can be removed without changing the signal",
    source: include_str!("redundant_term.rs"),
};

pub(crate) fn check(cx: &mut Ctx, out: &mut Vec<Diagnostic>) {
    let m = cx.model;
    for (id, def, e) in super::expression_definitions(m) {
        let Some((f, r)) = cx.redundancy_target(id, e) else {
            continue;
        };
        if r.parts.is_empty() {
            continue;
        }
        let Some(t) = two_level(e, &f.names) else {
            continue;
        };
        let Some(outer) = t.outer else { continue };
        let what = match t.shape {
            Shape::Sum => "term",
            Shape::Product => "factor",
        };
        // With the hazard rule on, consensus terms that keep the sum free
        // of static-1 hazards are its to judge.
        let hazards_on = cx.config.severity("static-hazard").is_some() && t.shape == Shape::Sum;
        let before = if hazards_on {
            super::static_hazard::hazards(&f, &t, None).1.len()
        } else {
            0
        };
        for &i in &r.parts {
            if hazards_on && super::static_hazard::hazards(&f, &t, Some(i)).1.len() > before {
                continue;
            }
            let part = &t.parts[i];
            let text = &cx.src[part.expr.span.start..part.expr.span.end];
            let why = explain(&t, &f, i, cx.src);
            let mut d = RULE.at(
                part.expr.span,
                format!("the {what} `{text}` is redundant: {why}"),
            );
            d.help = Some(format!(
                "remove the {what}; `{}` stays the same",
                m.signals[def.signal].name
            ));
            d.fixes.push(Fix {
                title: format!("remove the {what} `{text}`"),
                applicability: Applicability::Safe,
                edits: vec![Edit {
                    span: operand_removal(outer, i),
                    new_text: String::new(),
                }],
            });
            out.push(d);
        }
    }
}

/// Why part `i` is redundant, in words: a duplicate, absorbed by one other
/// part, covered by the others together, or only where nothing occurs.
fn explain(
    t: &crate::forms::TwoLevel,
    f: &crate::forms::ExprFunction,
    i: usize,
    src: &str,
) -> String {
    let k = f.names.len();
    let own = crate::forms::part_without(&t.parts[i], k, t.shape, &[]);
    let matters = match t.shape {
        Shape::Sum => !own.and(&f.reachable).is_zero(),
        Shape::Product => !(!&own).and(&f.reachable).is_zero(),
    };
    if !matters {
        return match t.shape {
            Shape::Sum => "it is 1 only on combinations that cannot occur".to_string(),
            Shape::Product => "it is 0 only on combinations that cannot occur".to_string(),
        };
    }
    let key = |p: &crate::forms::Part| {
        let mut v: Vec<(usize, bool)> = p.literals.iter().map(|l| (l.var, l.positive)).collect();
        v.sort_unstable();
        v.dedup();
        v
    };
    let mine = key(&t.parts[i]);
    for (j, p) in t.parts.iter().enumerate() {
        if j == i {
            continue;
        }
        let theirs = key(p);
        let text = &src[p.expr.span.start..p.expr.span.end];
        if theirs == mine {
            return format!("it repeats `{text}`");
        }
        if theirs != mine && theirs.iter().all(|l| mine.contains(l)) {
            return match t.shape {
                Shape::Sum => format!("`{text}` already covers it"),
                Shape::Product => format!("`{text}` already implies it"),
            };
        }
    }
    match t.shape {
        Shape::Sum => {
            "the other terms cover it where the signals can take those values".to_string()
        }
        Shape::Product => {
            "the other factors imply it where the signals can take those values".to_string()
        }
    }
}
