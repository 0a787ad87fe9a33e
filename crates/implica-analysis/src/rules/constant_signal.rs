//! # `constant-signal`
//!
//! **What it finds.** An output or an intermediate signal whose value is
//! the same on every input combination: always 0 or always 1. Input
//! combinations excluded by `never` do not count, so a signal that is 1 on
//! every combination `never` allows is reported too (the message says so).
//!
//! A signal with don't-cares is constant only when its fixed value and its
//! freedom both leave no choice: 1 (or 0) on every combination, whichever
//! way its don't-cares are built. A signal that *could* be built as a
//! constant by picking its don't-cares is not reported here.
//!
//! **Why it matters.** A signal that never changes needs no logic. Most
//! often it is a slip: a term that contradicts another (`a & !a`), an
//! operator that was meant the other way, or a condition that `never`
//! makes impossible.
//!
//! **Example.**
//!
//! ```text
//! input  hot, cold
//! output frost_guard
//! never  hot & cold
//! frost_guard = cold | !cold & !hot | hot   # always 1
//! ```
//!
//! Not reported, as they say what they mean:
//!
//! - a definition written as a constant (`wait_n = 1`, an empty term list
//!   such as `on() over (a, b)`, a table with no inputs);
//! - a signal that reads another constant signal (one fault, one report:
//!   the signal it reads is reported, or is written as a constant on
//!   purpose, as a placeholder).
//!
//! **Fix.** Replace the right-hand side of the definition by `0` or `1`
//! (needs review: it changes the form of the file, not any signal's value).
//! Offered for definitions by an expression or a term list that are
//! constant on every input combination (not only on those that `never`
//! allows), and not when a comment stands inside the right-hand side, which
//! the replacement would lose. Table columns are left to the author.
//!
//! When the work budget of a signal runs out, nothing is said about it.
//!
//! Default severity: warning.

use super::{Ctx, Rule};
use crate::model::{Body, SignalId, SignalKind};
use crate::{Applicability, Diagnostic, Edit, Fix, Related, Severity};
use implica_logic::{BddRef, Effort, Interrupted};
use implica_syntax::Span;
use implica_syntax::ast::{ExprKind, ItemKind, Rhs};

pub const RULE: Rule = Rule {
    name: "constant-signal",
    default_severity: Severity::Warning,
    summary: "a signal is always 0 or always 1",
    source: include_str!("constant_signal.rs"),
};

/// Work allowed for the functional checks of one signal.
pub(crate) const WORK_PER_SIGNAL: u64 = 1_000_000;

/// A signal's constant value.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(crate) struct Constant {
    pub value: bool,
    /// Constant on every input combination, not only on those that
    /// `never` allows.
    pub everywhere: bool,
}

/// Whether signal `s` (defined, with a known function) is constant on every
/// input combination that no `never` excludes, with both bounds equal.
/// `Ok(None)` when it is not constant or has no known function. When every
/// combination is impossible nothing is constant here (`never` is then the
/// fault).
pub(crate) fn constant(
    cx: &mut Ctx,
    s: SignalId,
    effort: &mut Effort,
) -> Result<Option<Constant>, Interrupted> {
    let Ok(k) = cx.functions.value(s) else {
        return Ok(None);
    };
    if k.lower == k.upper && (k.lower == BddRef::TRUE || k.lower == BddRef::FALSE) {
        return Ok(Some(Constant {
            value: k.lower == BddRef::TRUE,
            everywhere: true,
        }));
    }
    let impossible = cx.functions.impossible;
    if impossible == BddRef::FALSE || impossible == BddRef::TRUE {
        return Ok(None);
    }
    let bdd = &mut cx.functions.bdd;
    if bdd.or(k.lower, impossible, effort)? == BddRef::TRUE {
        return Ok(Some(Constant {
            value: true,
            everywhere: false,
        }));
    }
    let possible = bdd.not(impossible, effort)?;
    if bdd.and(k.upper, possible, effort)? == BddRef::FALSE {
        return Ok(Some(Constant {
            value: false,
            everywhere: false,
        }));
    }
    Ok(None)
}

/// The constant signals worth a report or worth keeping quiet about, by
/// signal: every defined, non-input signal with a known function that is
/// constant (`None` where the budget ran out or it is not constant).
pub(crate) fn constants(cx: &mut Ctx) -> Vec<Option<Constant>> {
    let m = cx.model;
    let mut out = vec![None; m.signals.len()];
    for &s in &m.order {
        if m.signals[s].kind == SignalKind::Input || m.definition_of(s).is_none() {
            continue;
        }
        let mut e = Effort::new(WORK_PER_SIGNAL);
        out[s] = constant(cx, s, &mut e).ok().flatten();
    }
    out
}

/// Whether the definition of `s` is written as a constant on purpose: a
/// constant expression, an empty term list, a table without inputs.
pub(crate) fn written_constant(cx: &Ctx, s: SignalId) -> bool {
    let Some(def) = cx.model.definition_of(s) else {
        return false;
    };
    match def.body {
        Body::Expr(e) => {
            let mut e = e;
            while let ExprKind::Paren(inner) = &e.kind {
                e = inner;
            }
            matches!(e.kind, ExprKind::Const(_))
        }
        Body::Terms(t) => t.parts.iter().all(|p| p.entries.is_empty()),
        Body::Column { table, .. } => table.inputs.is_empty(),
    }
}

/// The span of the right-hand side of the definition of `s`, when it is a
/// `name = ...` statement (not a table column).
pub(crate) fn rhs_span(cx: &Ctx, s: SignalId) -> Option<Span> {
    let def = cx.model.definition_of(s)?;
    match &cx.model.file.items[def.item].kind {
        ItemKind::Define(d) => Some(match &d.rhs {
            Rhs::Expr(e) => e.span,
            Rhs::Terms(t) => t.span,
        }),
        _ => None,
    }
}

/// The `never` statements, as related places.
pub(crate) fn never_notes(cx: &Ctx) -> Vec<Related> {
    cx.model
        .never
        .iter()
        .map(|st| Related {
            span: st.span,
            message: "the inputs this `never` excludes do not count".to_string(),
        })
        .collect()
}

/// An excluded input combination where `s` differs from `value`, written
/// `a=1, b=0` over the inputs it reads.
fn excluded_witness(cx: &mut Ctx, s: SignalId, value: bool) -> Option<String> {
    let k = cx.functions.value(s).ok()?;
    let mut e = Effort::new(WORK_PER_SIGNAL);
    let bdd = &mut cx.functions.bdd;
    let differs = if value {
        bdd.not(k.lower, &mut e).ok()?
    } else {
        k.upper
    };
    let there = bdd.and(differs, cx.functions.impossible, &mut e).ok()?;
    let point = bdd.any_one(there)?;
    let m = cx.model;
    let parts: Vec<String> = cx
        .functions
        .reads(s)
        .iter()
        .map(|&i| format!("{}={}", m.signals[m.inputs[i]].name, u8::from(point[i])))
        .collect();
    (!parts.is_empty()).then(|| parts.join(", "))
}

pub(crate) fn check(cx: &mut Ctx, out: &mut Vec<Diagnostic>) {
    let consts = constants(cx);
    let m = cx.model;
    for (s, sig) in m.signals.iter().enumerate() {
        let Some(c) = consts[s] else {
            continue;
        };
        if written_constant(cx, s) {
            continue;
        }
        let Some(def) = m.definition_of(s) else {
            continue;
        };
        // One fault, one report: a signal that reads a constant is
        // explained by that one.
        if def
            .reads
            .iter()
            .any(|&t| m.signals[t].kind != SignalKind::Input && consts[t].is_some())
        {
            continue;
        }
        let bit = u8::from(c.value);
        let message = if c.everywhere {
            format!("`{}` is always {bit}", sig.name)
        } else {
            let mut text = format!(
                "`{}` is {bit} on every input combination that `never` allows",
                sig.name
            );
            if let Some(w) = excluded_witness(cx, s, c.value) {
                text.push_str(&format!(
                    " (it is {} only where `never` excludes the inputs, as for {w})",
                    1 - bit
                ));
            }
            text
        };
        let mut d = RULE.at(def.target, message);
        d.help = Some(format!(
            "if it is meant to be {bit}, write `{bit}`; otherwise check the logic that makes it so"
        ));
        if !c.everywhere {
            d.related = never_notes(cx);
        }
        if c.everywhere
            && let Some(span) = rhs_span(cx, s)
            && !cx.src[span.start..span.end].contains('#')
        {
            d.fixes.push(Fix {
                title: format!("replace the definition of `{}` by `{bit}`", sig.name),
                applicability: Applicability::NeedsReview,
                edits: vec![Edit {
                    span,
                    new_text: bit.to_string(),
                }],
            });
        }
        out.push(d);
    }
}
