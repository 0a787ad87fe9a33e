//! # `equivalent-signals`
//!
//! **What it finds.** Two or more outputs that compute the same function
//! of the inputs: the same value on every input combination (or on every
//! one that `never` allows; the message says so), and for outputs with
//! don't-cares, the same freedom too.
//!
//! Only outputs are compared. An intermediate signal often names a
//! sub-expression that an output then equals, which is no fault.
//!
//! **Why it matters.** Two outputs that always agree may be meant that way
//! (a lamp that repeats a coil), but as often one of them was copied and
//! not adapted. Written as one signal read twice, the intent is plain and
//! the logic is built once.
//!
//! **Example.**
//!
//! ```text
//! input  hot, rain
//! output vent_open, roof_fan
//! vent_open = hot & !rain
//! roof_fan  = !(rain | !hot)   # the same function as `vent_open`
//! ```
//!
//! One report per group of equivalent outputs, at the second of them in
//! source order, with the first and the others as related places. An
//! output defined as the bare name of another (`roof_fan = vent_open`), or
//! as the same bare name as another, says that they are equal and is not
//! reported; nor is a constant output (`constant-signal`).
//!
//! **Fix.** Define the later outputs as the first one (needs review: it
//! changes the form of the file, not any signal's value). Offered for
//! outputs defined by an expression or a term list with no comment inside,
//! equal to the first on every input combination and with no don't-cares,
//! and only where the first does not read them (which would make a cycle).
//!
//! An output whose comparison runs out of its work budget is left out.
//!
//! Default severity: info.

use super::constant_signal::{WORK_PER_SIGNAL, constants, rhs_span};
use super::vacuous_input::and_list;
use super::{Ctx, Rule};
use crate::functions::Known;
use crate::model::{Body, SignalId, SignalKind};
use crate::{Applicability, Diagnostic, Edit, Fix, Related, Severity};
use implica_logic::{BddRef, Effort};
use implica_syntax::ast::ExprKind;
use std::collections::HashMap;

pub const RULE: Rule = Rule {
    name: "equivalent-signals",
    default_severity: Severity::Info,
    summary: "two outputs compute the same function",
    source: include_str!("equivalent_signals.rs"),
};

/// The signal a bare-name definition (`y = x`, through parentheses)
/// stands for, followed to its end.
fn source(cx: &Ctx, s: SignalId) -> SignalId {
    let m = cx.model;
    let mut cur = s;
    // Bounded: a chain of aliases cannot be longer than the signals.
    for _ in 0..m.signals.len() {
        let Some(def) = m.definition_of(cur) else {
            break;
        };
        if m.signals[cur].kind == SignalKind::Input {
            break;
        }
        let Body::Expr(mut e) = def.body else {
            break;
        };
        while let ExprKind::Paren(inner) = &e.kind {
            e = inner;
        }
        let ExprKind::Name(n) = &e.kind else {
            break;
        };
        let Some(next) = m.signal(&n.text) else {
            break;
        };
        cur = next;
    }
    cur
}

/// Whether `from` reads `to`, directly or through other signals.
fn reaches(cx: &Ctx, from: SignalId, to: SignalId) -> bool {
    let m = cx.model;
    let mut seen = vec![false; m.signals.len()];
    let mut stack = vec![from];
    while let Some(s) = stack.pop() {
        if s == to {
            return true;
        }
        if std::mem::replace(&mut seen[s], true) || m.signals[s].kind == SignalKind::Input {
            continue;
        }
        if let Some(def) = m.definition_of(s) {
            stack.extend(def.reads.iter().copied());
        }
    }
    false
}

/// The bounds of a function on the combinations `never` allows: `f & p`
/// is canonical for the functions equal to `f` wherever `p` holds, so equal
/// keys are equal functions there. `None` when out of budget.
pub(crate) fn key(cx: &mut Ctx, k: Known) -> Option<(BddRef, BddRef)> {
    let impossible = cx.functions.impossible;
    if impossible == BddRef::FALSE {
        return Some((k.lower, k.upper));
    }
    let mut e = Effort::new(WORK_PER_SIGNAL);
    let bdd = &mut cx.functions.bdd;
    let possible = bdd.not(impossible, &mut e).ok()?;
    Some((
        bdd.and(k.lower, possible, &mut e).ok()?,
        bdd.and(k.upper, possible, &mut e).ok()?,
    ))
}

pub(crate) fn check(cx: &mut Ctx, out: &mut Vec<Diagnostic>) {
    let impossible = cx.functions.impossible;
    if impossible == BddRef::TRUE {
        return;
    }
    let consts = constants(cx);
    let m = cx.model;
    let mut outputs: Vec<SignalId> = (0..m.signals.len())
        .filter(|&s| {
            m.signals[s].kind == SignalKind::Output
                && m.definition_of(s).is_some()
                && cx.functions.value(s).is_ok()
                && consts[s].is_none()
        })
        .collect();
    outputs.sort_by_key(|&s| m.definition_of(s).map_or(usize::MAX, |d| d.target.start));
    // Grouped by their bounds on the possible combinations.
    let mut groups: Vec<Vec<SignalId>> = Vec::new();
    let mut by_key: HashMap<(BddRef, BddRef), usize> = HashMap::new();
    for &s in &outputs {
        let Ok(k) = cx.functions.value(s) else {
            continue;
        };
        let key = key(cx, k);
        // Out of budget: say nothing about this signal.
        let Some(key) = key else { continue };
        match by_key.get(&key) {
            Some(&g) => groups[g].push(s),
            None => {
                by_key.insert(key, groups.len());
                groups.push(vec![s]);
            }
        }
    }
    for group in groups {
        if group.len() < 2 {
            continue;
        }
        let first = group[0];
        let mut sources = vec![source(cx, first)];
        let mut later = Vec::new();
        for &s in &group[1..] {
            let src = source(cx, s);
            if sources.contains(&src) || sources.contains(&s) {
                continue;
            }
            sources.push(src);
            later.push(s);
        }
        if later.is_empty() {
            continue;
        }
        let (Ok(kf), name) = (cx.functions.value(first), &m.signals[first].name) else {
            continue;
        };
        let exact = |s: SignalId| {
            cx.functions
                .value(s)
                .is_ok_and(|k| k.lower == kf.lower && k.upper == kf.upper)
        };
        let everywhere = later.iter().all(|&s| exact(s));
        let names = and_list(later.iter().map(|&s| format!("`{}`", m.signals[s].name)));
        let verb = if later.len() == 1 {
            "computes"
        } else {
            "compute"
        };
        let condition = if everywhere {
            ""
        } else {
            " on every input combination that `never` allows"
        };
        let Some(at) = m.definition_of(later[0]).map(|d| d.target) else {
            continue;
        };
        let mut d = RULE.at(
            at,
            format!("{names} {verb} the same function as `{name}`{condition}"),
        );
        d.help = Some(format!(
            "if they are meant to be equal, define them as `{name}`; otherwise check which one is wrong"
        ));
        if let Some(def) = m.definition_of(first) {
            d.related.push(Related {
                span: def.target,
                message: format!("`{name}` is defined here"),
            });
        }
        for &s in &later[1..] {
            if let Some(def) = m.definition_of(s) {
                d.related.push(Related {
                    span: def.target,
                    message: format!("`{}` computes it too", m.signals[s].name),
                });
            }
        }
        let rewritable: Vec<SignalId> = later
            .iter()
            .copied()
            .filter(|&s| {
                exact(s)
                    && kf.lower == kf.upper
                    && !reaches(cx, first, s)
                    && rhs_span(cx, s)
                        .is_some_and(|span| !cx.src[span.start..span.end].contains('#'))
            })
            .collect();
        if !rewritable.is_empty() && super::is_plain_name(name) {
            let edits = rewritable
                .iter()
                .filter_map(|&s| rhs_span(cx, s))
                .map(|span| Edit {
                    span,
                    new_text: name.to_string(),
                })
                .collect();
            let which = and_list(
                rewritable
                    .iter()
                    .map(|&s| format!("`{}`", m.signals[s].name)),
            );
            d.fixes.push(Fix {
                title: format!("define {which} as `{name}`"),
                applicability: Applicability::NeedsReview,
                edits,
            });
        }
        out.push(d);
    }
}
