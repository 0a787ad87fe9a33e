//! # `static-hazard`
//!
//! **What it finds.** A sum of products with a static-1 hazard: two input
//! combinations, differing in one signal, where the expression is 1 on both
//! but no single term covers both. When that signal changes, one term turns
//! off before the other turns on, and the output can glitch to 0.
//!
//! **Why it matters.** In logic built from gates with unequal delays, such
//! a glitch can be latched downstream or reach an actuator. A sum of
//! products is free of static-1 hazards when every such pair lies in one
//! term, which the consensus terms provide.
//!
//! **Example.**
//!
//! ```text
//! input  sel, a, b
//! output y
//! y = sel & a | !sel & b   # glitch risk when `sel` changes with a = b = 1
//! ```
//!
//! Off by default: turn it on for a project in `implica.toml`
//! (`static-hazard = "warning"` under `[rules]`), or for one file with the
//! comment line `# implica: enable static-hazard`. When it is on, `redundant-term` does not
//! report the consensus terms that keep a sum of products hazard-free.
//! Implica checks the Boolean structure only; whether a glitch matters
//! depends on the circuit, and safety functions follow the applicable
//! standards, local codes and licensed practice.
//!
//! **Fix.** Add the consensus terms (safe: proven not to change the
//! signal; it adds terms on purpose).
//!
//! Default severity: warning (when enabled).

use super::{Ctx, Rule};
use crate::forms::{Shape, two_level};
use crate::{Applicability, Diagnostic, Edit, Fix, Severity};
use implica_logic::{BoolExpr, Cover, Cube, hazard_free_cover, static1_hazards};

pub const RULE: Rule = Rule {
    name: "static-hazard",
    default_severity: Severity::Warning,
    summary: "a sum of products can glitch to 0 when one input changes",
    source: include_str!("static_hazard.rs"),
};

/// The sum of products as written, as a cover over its names, and the
/// hazardous pairs; `None` when the expression is not a sum of products.
pub(crate) fn hazards(
    f: &crate::forms::ExprFunction,
    t: &crate::forms::TwoLevel,
    skip: Option<usize>,
) -> (Cover, Vec<(usize, usize)>) {
    let k = f.names.len();
    let cubes = t
        .parts
        .iter()
        .enumerate()
        .filter(|&(i, _)| Some(i) != skip)
        .map(|(_, p)| {
            p.literals.iter().fold(Cube::universe(k), |c, l| {
                c.and(&Cube::literal(k, l.var, l.positive))
            })
        })
        .collect();
    let cover = Cover { vars: k, cubes };
    let pairs = static1_hazards(&cover, &!&f.reachable);
    (cover, pairs)
}

pub(crate) fn check(cx: &mut Ctx, out: &mut Vec<Diagnostic>) {
    if cx.config.severity(RULE.name).is_none() {
        return;
    }
    let m = cx.model;
    for (id, def, e) in super::expression_definitions(m) {
        let Some(f) = cx.expr_function(id, e) else {
            continue;
        };
        let Some(t) = two_level(e, &f.names) else {
            continue;
        };
        if t.shape != Shape::Sum || t.parts.len() < 2 {
            continue;
        }
        let (cover, pairs) = hazards(&f, &t, None);
        let Some(&(a, b)) = pairs.first() else {
            continue;
        };
        let k = f.names.len();
        let bit = (a ^ b).trailing_zeros() as usize;
        let changing = &f.names[k - 1 - bit];
        let held: Vec<String> = (0..k)
            .filter(|&i| i != k - 1 - bit)
            .map(|i| format!("{}={}", f.names[i], (a >> (k - 1 - i)) & 1))
            .collect();
        let more = if pairs.len() > 1 {
            format!(" ({} such changes in all)", pairs.len())
        } else {
            String::new()
        };
        let mut d = RULE.at(
            e.span,
            format!(
                "`{}` can glitch to 0 when `{changing}` changes with {}{more}",
                m.signals[def.signal].name,
                held.join(", ")
            ),
        );
        d.help = Some("add the consensus terms that cover each such change".to_string());
        let on = f.table.and(&f.reachable);
        let dc = !&f.reachable;
        if let Ok(free) = hazard_free_cover(&cover, &on, &dc, &cx.config.budget) {
            let added: Vec<String> = free.cubes[cover.len()..]
                .iter()
                .map(|c| {
                    BoolExpr::from_cover(&Cover {
                        vars: k,
                        cubes: vec![*c],
                    })
                    .to_text(&|i| f.names[i].to_string())
                })
                .collect();
            if !added.is_empty() {
                d.fixes.push(Fix {
                    title: format!("add the consensus terms `{}`", added.join(" | ")),
                    applicability: Applicability::Safe,
                    edits: vec![Edit {
                        span: implica_syntax::Span::new(e.span.end, e.span.end),
                        new_text: format!(" | {}", added.join(" | ")),
                    }],
                });
            }
        }
        out.push(d);
    }
}
