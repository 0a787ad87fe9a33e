//! # `unused-constraint`
//!
//! **What it finds.** A `never` statement that excludes some combinations,
//! yet that nothing depends on. Precisely, one of:
//!
//! 1. **Covered by the others**: every combination it excludes is already
//!    excluded by the other `never` statements. Of several that cover each
//!    other, the later ones are reported, so that removing every reported
//!    one keeps the excluded set.
//! 2. **Seen by nothing**: a `never` frees a signal only on combinations of
//!    the inputs the signal reads that are impossible whatever its other
//!    inputs are (docs/language.md, "Don't-cares"); an assertion and a test
//!    vector likewise see it only through the inputs they read. The
//!    constraint is reported when, for every defined signal, every
//!    `assert` and every `expect` block, that set (the combinations of the
//!    inputs it reads that are impossible whatever the rest) is the same
//!    with and without the constraint. Removing it then changes no
//!    signal's don't-cares and no check.
//!
//! For example `never a & b` where one output reads only `a` and another
//! only `b` frees neither: `a=1` is possible (with `b=0`), and so is `b=1`.
//!
//! **Why it matters.** A constraint is knowledge about the inputs that the
//! logic was meant to use. One that nothing uses often names the wrong
//! inputs, or was left behind when the logic that needed it was removed.
//!
//! **Example.**
//!
//! ```text
//! input  frost, heatwave, vent
//! output open
//! open = vent
//! never  frost & heatwave     # no signal reads `frost` or `heatwave`
//! ```
//!
//! **Fix.** For a constraint covered by the others: remove it (safe: the
//! excluded set stays the same). For one that nothing sees, none is
//! offered, since removing it does change the excluded set: remove it by
//! hand, or make the logic read the inputs it constrains.
//!
//! Constraints that exclude nothing, or every combination, are
//! `empty-constraint`. Not reported while the file has syntax errors: the
//! statement that does not parse may be the one that depends on it.
//!
//! Default severity: warning.

use super::assertion_failed::names_in;
use super::empty_constraint::{excluded_sets, quoted, remove_never};
use super::{Ctx, Rule};
use crate::functions::{DEFAULT_WORK_PER_DEFINITION, Functions};
use crate::model::SignalKind;
use crate::{Diagnostic, Related, Severity};
use implica_logic::{BddRef, Effort, Interrupted};

pub const RULE: Rule = Rule {
    name: "unused-constraint",
    default_severity: Severity::Warning,
    summary: "nothing depends on a `never` constraint",
    source: include_str!("unused_constraint.rs"),
};

pub(crate) fn check(cx: &mut Ctx, out: &mut Vec<Diagnostic>) {
    if cx.has_syntax_errors || cx.model.never.is_empty() {
        return;
    }
    let m = cx.model;
    let f = &mut *cx.functions;
    let sets: Vec<Option<BddRef>> = excluded_sets(f, m)
        .into_iter()
        .map(|x| x.map(|x| x.sure))
        .collect();
    let mut e = Effort::new(DEFAULT_WORK_PER_DEFINITION);
    // The sets must add up to the impossible set the functions use, or the
    // comparison below would be with something else.
    let Ok(union) = union_of(f, sets.iter().map(|s| s.unwrap_or(BddRef::FALSE)), &mut e) else {
        return;
    };
    if union != f.impossible || union == BddRef::TRUE {
        return;
    }
    let mut removed = vec![false; sets.len()];
    // Latest first: of two that cover each other, the later goes.
    for i in (0..sets.len()).rev() {
        let Some(x) = sets[i].filter(|&x| x != BddRef::FALSE) else {
            continue;
        };
        let mut e = Effort::new(DEFAULT_WORK_PER_DEFINITION);
        let others: Vec<usize> = (0..sets.len())
            .filter(|&j| j != i && !removed[j] && sets[j].is_some())
            .collect();
        let Ok(Some(related)) = covered(f, x, &others, &sets, &mut e) else {
            continue;
        };
        removed[i] = true;
        let st = &m.never[i];
        let mut d = RULE.at(
            st.body.span,
            format!(
                "`never {}` adds nothing: every combination it excludes is already excluded by \
                 other `never` statements",
                quoted(cx.src, st.body.span)
            ),
        );
        d.help = Some("remove it, or correct it if it was meant to exclude more".to_string());
        d.related = related
            .into_iter()
            .map(|j| Related {
                span: m.never[j].body.span,
                message: "excludes these combinations too".to_string(),
            })
            .collect();
        d.fixes.push(remove_never(cx.src, st.span));
        out.push(d);
    }
    // The input sets through which signals and checks see the constraints.
    let mut readers: Vec<Vec<usize>> = Vec::new();
    let mut known = implica_logic::FastSet::default();
    let mut add = |r: Vec<usize>| {
        if known.insert(r.clone()) {
            readers.push(r);
        }
    };
    for (s, sig) in m.signals.iter().enumerate() {
        // Signals without a function too: once fixed, they may need it.
        if sig.kind != SignalKind::Input && !sig.definitions.is_empty() {
            add(f.reads(s).to_vec());
        }
    }
    let read_by = |signals: Vec<usize>| {
        let mut r: Vec<usize> = signals.iter().flat_map(|&s| f.reads(s).to_vec()).collect();
        r.sort_unstable();
        r.dedup();
        r
    };
    for st in &m.asserts {
        add(read_by(names_in(m, st.body)));
    }
    for st in &m.expects {
        let t = st.body;
        add(read_by(
            t.inputs
                .iter()
                .chain(&t.outputs)
                .filter_map(|n| m.signal(&n.text))
                .collect(),
        ));
    }
    for i in 0..sets.len() {
        if removed[i] || !sets[i].is_some_and(|x| x != BddRef::FALSE) {
            continue;
        }
        let mut e = Effort::new(DEFAULT_WORK_PER_DEFINITION);
        let others = (0..sets.len()).filter(|&j| j != i).filter_map(|j| sets[j]);
        let Ok(without) = union_of(f, others, &mut e) else {
            continue;
        };
        if let Ok(false) = seen(f, union, without, &readers, &mut e) {
            let st = &m.never[i];
            let mut d = RULE.at(
                st.body.span,
                format!(
                    "nothing depends on `never {}`: it frees no signal, and hides no combination \
                     from an assertion or test vector",
                    quoted(cx.src, st.body.span)
                ),
            );
            d.help = Some(
                "a `never` frees a signal only where the combination is impossible whatever the \
                 inputs the signal does not read; check that it names the right inputs, or \
                 remove it"
                    .to_string(),
            );
            out.push(d);
        }
    }
}

fn union_of(
    f: &mut Functions,
    sets: impl Iterator<Item = BddRef>,
    e: &mut Effort,
) -> Result<BddRef, Interrupted> {
    let mut u = BddRef::FALSE;
    for s in sets {
        u = f.bdd.or(u, s, e)?;
    }
    Ok(u)
}

/// When `x` lies within the union of the sets `others` (indices into
/// `sets`): those of them that share a combination with it.
fn covered(
    f: &mut Functions,
    x: BddRef,
    others: &[usize],
    sets: &[Option<BddRef>],
    e: &mut Effort,
) -> Result<Option<Vec<usize>>, Interrupted> {
    let u = union_of(f, others.iter().filter_map(|&j| sets[j]), e)?;
    let not_u = f.bdd.not(u, e)?;
    if f.bdd.and(x, not_u, e)? != BddRef::FALSE {
        return Ok(None);
    }
    // One statement that covers it alone is the clearest evidence.
    let mut related = Vec::new();
    for &j in others {
        let Some(s) = sets[j] else { continue };
        let not_s = f.bdd.not(s, e)?;
        if f.bdd.and(x, not_s, e)? == BddRef::FALSE {
            return Ok(Some(vec![j]));
        }
        if f.bdd.and(x, s, e)? != BddRef::FALSE {
            related.push(j);
        }
    }
    Ok(Some(related))
}

/// Whether some reader (by the inputs it reads) sees a difference between
/// the impossible sets `with` and `without`.
fn seen(
    f: &mut Functions,
    with: BddRef,
    without: BddRef,
    readers: &[Vec<usize>],
    e: &mut Effort,
) -> Result<bool, Interrupted> {
    for r in readers {
        let mut others = vec![true; f.inputs];
        for &i in r {
            others[i] = false;
        }
        let a = f.bdd.forall(with, &others, e)?;
        let b = f.bdd.forall(without, &others, e)?;
        if a != b {
            return Ok(true);
        }
    }
    Ok(false)
}
