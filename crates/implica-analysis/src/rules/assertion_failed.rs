//! # `assertion-failed`
//!
//! **What it finds.** An `assert EXPR` that is 0 for some input combination
//! that no `never` excludes. Where a signal the assertion reads has
//! don't-cares, the assertion must hold however they are built: it fails
//! if some choice of them makes it 0 on a possible combination.
//!
//! **Why it matters.** An assertion states what the author knows must be
//! true of the logic; a counterexample means the logic or the assertion is
//! wrong. (Implica checks Boolean consistency only: a passing assertion on
//! an interlock says that the file agrees with itself, not that the
//! interlock is safe.)
//!
//! **Example.**
//!
//! ```text
//! input  door_closed, call
//! output motor_on
//! motor_on = call              # forgot the door
//! assert motor_on => door_closed
//! ```
//!
//! reports the counterexample `door_closed=0, call=1`, with `motor_on` = 1
//! there. The vector lists every primary input the assertion reads,
//! directly or through the signals it names, in declaration order (the
//! assertion does not depend on the others; the vector is possible for
//! some value of them), and the
//! message gives the value of each named signal that is not an input
//! (`free` for a don't-care). A counterexample that fails for every choice
//! of the don't-cares is preferred; otherwise the message says that it
//! fails only for some.
//!
//! **Fix.** None is offered: correct the logic or the assertion, or, if
//! the combination cannot occur, say so with `never`.
//!
//! Assertions whose signals have no function (undefined, cyclic, malformed
//! or too large) are not checked; other rules report why.
//!
//! Default severity: error.

use super::{Ctx, Rule};
use crate::functions::{DEFAULT_WORK_PER_DEFINITION, Functions, Known};
use crate::model::{Model, SignalId, SignalKind};
use crate::{Diagnostic, Severity};
use implica_logic::{BddRef, Effort, Interrupted};
use implica_syntax::ast::Expr;

pub const RULE: Rule = Rule {
    name: "assertion-failed",
    default_severity: Severity::Error,
    summary: "an assertion is 0 for a possible input combination",
    source: include_str!("assertion_failed.rs"),
};

pub(crate) fn check(cx: &mut Ctx, out: &mut Vec<Diagnostic>) {
    let m = cx.model;
    for st in &m.asserts {
        let mut e = Effort::new(DEFAULT_WORK_PER_DEFINITION);
        // Out of budget: say nothing rather than something unproven.
        if let Ok(Some(d)) = check_one(cx.functions, m, st.body, &mut e) {
            out.push(d);
        }
    }
}

fn check_one(
    f: &mut Functions,
    m: &Model,
    body: &Expr,
    e: &mut Effort,
) -> Result<Option<Diagnostic>, Interrupted> {
    let Ok(a) = f.expr_value(m, body, e)? else {
        return Ok(None);
    };
    let inputs = f.inputs;
    let possible = f.bdd.not(f.impossible, e)?;
    let not_a = f.bdd.not(a, e)?;
    let always = f.bdd.forall_from(not_a, inputs, e)?;
    let always = f.bdd.and(always, possible, e)?;
    let some = f.bdd.exists_from(not_a, inputs, e)?;
    let some = f.bdd.and(some, possible, e)?;
    let (fails, for_every_choice) = if always != BddRef::FALSE {
        (always, true)
    } else if some != BddRef::FALSE {
        (some, false)
    } else {
        return Ok(None);
    };
    let Some(point) = f.bdd.any_one(fails) else {
        return Ok(None);
    };
    let named = names_in(m, body);
    let mut read: Vec<usize> = named.iter().flat_map(|&s| f.reads(s).to_vec()).collect();
    read.sort_unstable();
    read.dedup();
    let values: Vec<String> = named
        .iter()
        .filter(|&&s| m.signals[s].kind != SignalKind::Input)
        .filter_map(|&s| {
            let k = f.value(s).ok()?;
            Some(format!(
                "`{}` = {}",
                m.signals[s].name,
                value_at(f, k, &point)
            ))
        })
        .collect();
    let mut message = if read.is_empty() {
        "the assertion is 0".to_string()
    } else {
        format!("the assertion fails at {}", vector(m, &read, &point))
    };
    if !for_every_choice {
        message.push_str(" for some choices of the don't-cares");
    }
    if !values.is_empty() {
        message.push_str(&format!(": {}", values.join(", ")));
    }
    let mut d = RULE.at(body.span, message);
    d.help = Some(
        "an assertion must hold on every input combination that no `never` excludes, however \
         the don't-cares are built; correct the logic or the assertion, or exclude combinations \
         that cannot occur with `never`"
            .to_string(),
    );
    Ok(Some(d))
}

/// The signals an expression names, each once, in order of appearance.
pub(crate) fn names_in(m: &Model, e: &Expr) -> Vec<SignalId> {
    let mut out = Vec::new();
    for n in crate::model::name_uses(e) {
        if let Some(s) = m.signal(&n.text)
            && !out.contains(&s)
        {
            out.push(s);
        }
    }
    out
}

/// `a=1, b=0` for the primary inputs `inputs` (by index) at `point`.
pub(crate) fn vector(m: &Model, inputs: &[usize], point: &[bool]) -> String {
    inputs
        .iter()
        .map(|&i| {
            format!(
                "{}={}",
                m.signals[m.inputs[i]].name,
                u8::from(point.get(i).copied().unwrap_or(false))
            )
        })
        .collect::<Vec<_>>()
        .join(", ")
}

/// A signal's value at an input vector: `0`, `1`, or `free` where it is a
/// don't-care.
pub(crate) fn value_at(f: &Functions, k: Known, point: &[bool]) -> &'static str {
    match (f.bdd.eval(k.lower, point), f.bdd.eval(k.upper, point)) {
        (true, _) => "1",
        (false, false) => "0",
        (false, true) => "free (a don't-care)",
    }
}
