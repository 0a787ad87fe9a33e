//! # `cyclic-definition`
//!
//! **What it finds.** Signals that depend on themselves, directly
//! (`y = y | a`) or through other signals (`p` reads `q`, `q` reads `p`).
//!
//! **Why it matters.** Implica describes combinational logic: a loop makes
//! the value depend on its own past (a latch, or an oscillator), which the
//! file cannot express and no check can analyse. Every signal on the loop,
//! and every signal that reads one, has no function.
//!
//! **Example.**
//!
//! ```text
//! input  set, reset
//! output q
//! q = set | hold
//! let hold = q & !reset   # `q` depends on itself: q -> hold -> q
//! ```
//!
//! Each loop is reported once, at the first of its signals in the file,
//! with the whole path and each definition on it as related places.
//!
//! **Fix.** Break the loop: storage belongs outside the combinational
//! logic (bring the stored value in as an input). No automatic fix.
//!
//! Default severity: error.

use super::{Ctx, Rule};
use crate::model::SignalId;
use crate::{Diagnostic, Related, Severity};
use std::collections::{HashMap, VecDeque};

pub const RULE: Rule = Rule {
    name: "cyclic-definition",
    default_severity: Severity::Error,
    summary: "signals depend on themselves",
    source: include_str!("cyclic_definition.rs"),
};

pub(crate) fn check(cx: &mut Ctx, out: &mut Vec<Diagnostic>) {
    let m = cx.model;
    for comp in &m.cycles {
        let start = comp[0];
        let path = loop_through(m, comp, start);
        let names: Vec<String> = path
            .iter()
            .map(|&s| m.signals[s].name.to_string())
            .collect();
        let Some(def) = m.definition_of(start) else {
            continue;
        };
        let message = if path.len() == 2 {
            format!("`{}` reads itself", names[0])
        } else {
            format!("`{}` depends on itself: {}", names[0], names.join(" -> "))
        };
        let mut d = RULE.at(def.target, message);
        for w in path.windows(2).skip(1) {
            if let Some(def) = m.definition_of(w[0]) {
                d.related.push(Related {
                    span: def.target,
                    message: format!(
                        "`{}` reads `{}`",
                        m.signals[w[0]].name, m.signals[w[1]].name
                    ),
                });
            }
        }
        if comp.len() > path.len() - 1 {
            let others: Vec<String> = comp
                .iter()
                .filter(|s| !path.contains(s))
                .map(|&s| format!("`{}`", m.signals[s].name))
                .collect();
            d.message.push_str(&format!(
                " (also on loops through it: {})",
                others.join(", ")
            ));
        }
        d.help = Some(
            "combinational logic cannot depend on itself: bring a stored value in as an input"
                .to_string(),
        );
        out.push(d);
    }
}

/// A shortest loop from `start` back to itself inside the component,
/// `[start, ..., start]`.
fn loop_through(m: &crate::model::Model, comp: &[SignalId], start: SignalId) -> Vec<SignalId> {
    let reads = |s: SignalId| -> &[SignalId] { m.definition_of(s).map_or(&[], |d| &d.reads[..]) };
    let mut parent: HashMap<SignalId, SignalId> = HashMap::new();
    let mut queue = VecDeque::from([start]);
    while let Some(s) = queue.pop_front() {
        for &r in reads(s) {
            if r == start {
                let mut path = vec![start];
                let mut at = s;
                while at != start {
                    path.push(at);
                    at = parent[&at];
                }
                path.reverse();
                // path is [.., start]: rotate so it starts and ends at start.
                let mut out = vec![start];
                out.extend(path.into_iter().filter(|&x| x != start));
                out.push(start);
                return out;
            }
            if comp.contains(&r) && !parent.contains_key(&r) {
                parent.insert(r, s);
                queue.push_back(r);
            }
        }
    }
    vec![start, start]
}
