//! # `shared-terms`
//!
//! **What it finds.** Outputs that need fewer product terms when they are
//! minimized together, sharing terms, than when each is minimized alone:
//! the message gives both counts and the shared terms.
//!
//! Outputs are taken together when they read common inputs (directly or
//! through other signals), each group over the inputs its outputs read,
//! with each output's own don't-cares and the `never` combinations it may
//! use. A group is looked at only when every output in it has a known
//! function, it reads at most 12 inputs and holds at most 8 outputs, and
//! every output alone is minimized exactly within the default budget (so
//! that "instead of" compares with true minima). Groups are taken in
//! source order until 65,536 rows (outputs times input combinations) have
//! been minimized in the document; later groups are not looked at. Constant outputs and
//! outputs equal to an earlier one (`constant-signal`,
//! `equivalent-signals`) are left out, and so is a saving that shares
//! only single literals (`a` read by two outputs is no gate built once).
//!
//! **Why it matters.** Built as a programmable logic array, or as gates
//! where a product term may feed several outputs, each shared term is
//! built once. The saving shows where the outputs have common structure
//! worth naming, for example as an intermediate signal.
//!
//! **Example.**
//!
//! ```text
//! input  hot, humid, rain
//! output vent, fan
//! vent = hot & !rain | humid & !rain
//! fan  = hot & !rain | hot & humid
//! # minimized together, `vent` and `fan` need 3 product terms instead of 4
//! ```
//!
//! **Fix.** None: sharing is a choice of how to build the logic, not a
//! change to the file. Naming a shared term with `let` and reading it
//! from both outputs makes it visible.
//!
//! Default severity: info.

use super::constant_signal::{WORK_PER_SIGNAL, constants};
use super::equivalent_signals::key;
use super::vacuous_input::and_list;
use super::{Ctx, Rule};
use crate::model::{SignalId, SignalKind};
use crate::{Diagnostic, Related, Severity};
use implica_logic::{
    BddRef, BoolExpr, Budget, Cover, Effort, MAX_OUTPUTS, TruthTable, minimize_multi_cancellable,
    minimize_sop_cancellable,
};
use std::collections::HashSet;

pub const RULE: Rule = Rule {
    name: "shared-terms",
    default_severity: Severity::Info,
    summary: "outputs minimized together share product terms",
    source: include_str!("shared_terms.rs"),
};

/// Most inputs of one group of outputs.
const MAX_INPUTS: usize = 12;
/// Most outputs of one group (the multi-output prime generation visits
/// sets of outputs).
const MAX_GROUP: usize = if MAX_OUTPUTS < 8 { MAX_OUTPUTS } else { 8 };
/// Most rows (outputs times input combinations) minimized per document,
/// so that a file of many small groups stays quick to check.
const MAX_TOTAL_ROWS: usize = 1 << 16;
/// Shared terms listed in the message.
const MAX_LISTED: usize = 6;

fn find(parent: &mut [usize], mut x: usize) -> usize {
    while parent[x] != x {
        parent[x] = parent[parent[x]];
        x = parent[x];
    }
    x
}

pub(crate) fn check(cx: &mut Ctx, out: &mut Vec<Diagnostic>) {
    if cx.functions.impossible == BddRef::TRUE {
        return;
    }
    let consts = constants(cx);
    let m = cx.model;
    let mut outputs: Vec<SignalId> = (0..m.signals.len())
        .filter(|&s| m.signals[s].kind == SignalKind::Output && m.definition_of(s).is_some())
        .collect();
    outputs.sort_by_key(|&s| m.definition_of(s).map_or(usize::MAX, |d| d.target.start));
    // Groups: outputs joined by a common input.
    let mut parent: Vec<usize> = (0..outputs.len()).collect();
    let mut owner: Vec<Option<usize>> = vec![None; cx.functions.inputs];
    for (k, &s) in outputs.iter().enumerate() {
        for &i in cx.functions.reads(s) {
            match owner[i] {
                Some(o) => {
                    let (a, b) = (find(&mut parent, o), find(&mut parent, k));
                    parent[a.max(b)] = a.min(b);
                }
                None => owner[i] = Some(k),
            }
        }
    }
    let mut groups: Vec<Vec<SignalId>> = vec![Vec::new(); outputs.len()];
    for (k, &s) in outputs.iter().enumerate() {
        let root = find(&mut parent, k);
        groups[root].push(s);
    }
    let mut rows_spent = 0usize;
    for group in groups {
        if group.iter().any(|&s| cx.functions.value(s).is_err()) {
            continue;
        }
        // One fault, one report: constants and repeats are other rules'.
        let mut seen = HashSet::new();
        let mut members = Vec::new();
        for s in group {
            let Ok(k) = cx.functions.value(s) else {
                continue;
            };
            if consts[s].is_some() {
                continue;
            }
            // Out of budget: leave the group alone rather than guess.
            let Some(key) = key(cx, k) else {
                members.clear();
                break;
            };
            if seen.insert(key) {
                members.push(s);
            }
        }
        if members.len() < 2 || members.len() > MAX_GROUP {
            continue;
        }
        let mut inputs: Vec<usize> = members
            .iter()
            .flat_map(|&s| cx.functions.reads(s).to_vec())
            .collect();
        inputs.sort_unstable();
        inputs.dedup();
        if inputs.len() > MAX_INPUTS {
            continue;
        }
        let rows = members.len() << inputs.len();
        if rows_spent + rows > MAX_TOTAL_ROWS {
            continue;
        }
        rows_spent += rows;
        if let Some(d) = group_report(cx, &members, &inputs) {
            out.push(d);
        }
    }
}

/// The report for one group of outputs over `inputs`, if sharing saves
/// terms; `None` also when any step is out of budget.
fn group_report(cx: &mut Ctx, members: &[SignalId], inputs: &[usize]) -> Option<Diagnostic> {
    let m = cx.model;
    let mut tables = Vec::with_capacity(members.len());
    for &s in members {
        let mut e = Effort::new(WORK_PER_SIGNAL);
        let local = cx.functions.local(s, &mut e).ok()?.ok()?;
        let on: TruthTable = cx.functions.bdd.to_truth_table(local.on, inputs);
        let dc: TruthTable = cx.functions.bdd.to_truth_table(local.dc, inputs);
        tables.push((on, dc));
    }
    let budget = Budget::default();
    let cancel = cx.cancel;
    let stop = || cancel.is_some_and(|c| c());
    let mut separate = 0usize;
    for (on, dc) in &tables {
        let alone = minimize_sop_cancellable(on, dc, &budget, &stop)
            .ok()?
            .ok()?;
        if !alone.proven_minimal {
            return None;
        }
        separate += alone.cover.len();
    }
    let together = minimize_multi_cancellable(&tables, &budget, &stop)
        .ok()?
        .ok()?;
    if together.terms.len() >= separate {
        return None;
    }
    let shared = together.shared();
    // A lone literal shared saves no gate.
    if shared
        .iter()
        .all(|&t| together.terms[t].literals(together.vars) < 2)
    {
        return None;
    }
    let name = |j: usize| m.signals[m.inputs[inputs[j]]].name.to_string();
    let mut listed: Vec<String> = shared
        .iter()
        .take(MAX_LISTED)
        .map(|&t| {
            let cover = Cover {
                vars: together.vars,
                cubes: vec![together.terms[t]],
            };
            format!("`{}`", BoolExpr::from_cover(&cover).to_text(&name))
        })
        .collect();
    if shared.len() > MAX_LISTED {
        let last = listed.pop().unwrap_or_default();
        listed.push(format!("{last} and {} more", shared.len() - MAX_LISTED));
    }
    let names = and_list(members.iter().map(|&s| format!("`{}`", m.signals[s].name)));
    let need = if together.proven_minimal {
        "need"
    } else {
        "need at most"
    };
    let mut message = format!(
        "minimized together, {names} {need} {} product terms instead of {separate}",
        together.terms.len()
    );
    if !listed.is_empty() {
        message.push_str(&format!("; shared: {}", listed.join(", ")));
    }
    let def = m.definition_of(members[0])?;
    let mut d = RULE.at(def.target, message);
    d.help = Some(
        "a shared term is built once; naming it with `let` and reading it from each output makes that visible"
            .to_string(),
    );
    for &s in &members[1..] {
        if let Some(def) = m.definition_of(s) {
            d.related.push(Related {
                span: def.target,
                message: format!("`{}` shares terms with them", m.signals[s].name),
            });
        }
    }
    Some(d)
}
