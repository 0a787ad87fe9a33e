//! Applying fixes, and proving that a fix changes no signal's function.
//!
//! Architecture invariant: a fix reaches the user only after [`verify`] has
//! applied it to the text, re-parsed and re-analysed the result, and found
//! every signal's function (and its freedom) the same as before.

use crate::functions::{DEFAULT_WORK_PER_DEFINITION, Functions};
use crate::model::{Model, SignalKind};
use crate::{Edit, Fix};
use implica_logic::{BddRef, Effort};

/// The text with the edits applied. Identical edits count once; others
/// must not overlap. They are applied from the end so that earlier offsets
/// stay valid.
pub fn apply(src: &str, edits: &[Edit]) -> Result<String, String> {
    let mut sorted: Vec<&Edit> = edits.iter().collect();
    sorted.sort_by(|a, b| {
        (a.span.start, a.span.end, &a.new_text).cmp(&(b.span.start, b.span.end, &b.new_text))
    });
    sorted.dedup_by(|a, b| a == b);
    for w in sorted.windows(2) {
        if w[0].span.end > w[1].span.start {
            return Err("the fix's edits overlap".to_string());
        }
    }
    let mut out = src.to_string();
    for e in sorted.iter().rev() {
        if e.span.end > out.len()
            || !out.is_char_boundary(e.span.start)
            || !out.is_char_boundary(e.span.end)
        {
            return Err("an edit falls outside the text".to_string());
        }
        out.replace_range(e.span.start..e.span.end, &e.new_text);
    }
    Ok(out)
}

/// Whether applying `fix` to `src` keeps every signal's function: the text
/// still parses (with no more syntax errors than before), every output is
/// still there, the `never` combinations are the same, and every signal of
/// both versions has the same on-set and the same don't-cares over the
/// inputs (matched by name) on every combination that can occur. Intermediate
/// signals and inputs may disappear only if nothing depended on them.
pub fn verify(src: &str, fix: &Fix) -> Result<String, String> {
    let after = apply(src, &fix.edits)?;
    let (old_file, old_errors) = implica_syntax::parse(src);
    let (new_file, new_errors) = implica_syntax::parse(&after);
    if new_errors.len() > old_errors.len() {
        return Err(format!(
            "the fixed text does not parse: {}",
            new_errors
                .first()
                .map_or(String::new(), |e| e.message.clone())
        ));
    }
    let (old, new) = (Model::build(&old_file), Model::build(&new_file));
    let (Ok(fo), Ok(mut fnew)) = (
        Functions::compute(&old, DEFAULT_WORK_PER_DEFINITION, None),
        Functions::compute(&new, DEFAULT_WORK_PER_DEFINITION, None),
    ) else {
        return Err("the analysis was cancelled".to_string());
    };
    // New input index of each old input, by name; declaration order is kept
    // by every fix, so the renaming keeps the variable order.
    let old_to_new: Vec<Option<usize>> = old
        .inputs
        .iter()
        .map(|&s| {
            new.signal(&old.signals[s].name)
                .and_then(|t| new.signals[t].input_index)
        })
        .collect();
    let rename = |v: usize| old_to_new.get(v).copied().flatten();
    let mut effort = Effort::new(50_000_000);
    let impossible = fnew.impossible;
    let mut same = |fnew: &mut Functions, a: BddRef, b: BddRef, what: &str| -> Result<(), String> {
        let moved = match fnew.bdd.transfer(&fo.bdd, a, &rename, &mut effort) {
            Ok(Some(moved)) => moved,
            Ok(None) => return Err(format!("{what} reads an input the fix removes")),
            Err(_) => return Err(format!("{what} could not be compared within the budget")),
        };
        // Only combinations that can occur count: on a `never` combination
        // every signal is free.
        let differs = (|| {
            let d = fnew.bdd.xor(moved, b, &mut effort)?;
            let possible = fnew.bdd.not(impossible, &mut effort)?;
            fnew.bdd.and(d, possible, &mut effort)
        })();
        match differs {
            Ok(BddRef::FALSE) => Ok(()),
            Ok(_) => Err(format!("{what} would change")),
            Err(_) => Err(format!("{what} could not be compared within the budget")),
        }
    };
    // The impossible combinations themselves must not change.
    let moved = fnew.bdd.transfer(
        &fo.bdd,
        fo.impossible,
        &rename,
        &mut Effort::new(50_000_000),
    );
    if !matches!(moved, Ok(Some(m)) if m == impossible) {
        return Err("the impossible inputs (`never`) would change".to_string());
    }
    for (s, sig) in old.signals.iter().enumerate() {
        if sig.kind == SignalKind::Input {
            continue;
        }
        let Some(t) = new
            .signal(&sig.name)
            .filter(|&t| !new.signals[t].definitions.is_empty())
        else {
            if sig.kind == SignalKind::Intermediate || sig.definitions.is_empty() {
                continue;
            }
            return Err(format!("`{}` would no longer be defined", sig.name));
        };
        match (fo.value(s), fnew.value(t)) {
            (Ok(a), Ok(b)) => {
                same(&mut fnew, a.lower, b.lower, &format!("`{}`", sig.name))?;
                same(
                    &mut fnew,
                    a.upper,
                    b.upper,
                    &format!("the freedom of `{}`", sig.name),
                )?;
            }
            (Ok(_), Err(_)) => {
                return Err(format!("`{}` would no longer have a function", sig.name));
            }
            // Unknown before: the fix cannot make it worse.
            (Err(_), _) => {}
        }
    }
    Ok(after)
}
