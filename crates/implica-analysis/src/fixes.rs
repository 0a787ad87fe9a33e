//! Applying fixes, and proving that a fix changes no signal's function.
//!
//! Architecture invariant: a fix reaches the user only after [`verify`] has
//! applied it to the text, re-parsed and re-analysed the result, and found
//! every signal's function (and its freedom) the same as before.

use crate::functions::{DEFAULT_WORK_PER_DEFINITION, Functions, Known};
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

/// `src[start..end]` with the edits applied, each of which lies within it
/// (its offsets are into `src`).
fn apply_within(src: &str, start: usize, end: usize, edits: &[Edit]) -> Result<String, String> {
    let local: Vec<Edit> = edits
        .iter()
        .map(|e| Edit {
            span: implica_syntax::Span::new(e.span.start - start, e.span.end - start),
            new_text: e.new_text.clone(),
        })
        .collect();
    apply(&src[start..end], &local)
}

/// The signal of the fixed document that stands for signal `s` of the
/// original: `None` for an input, or for an intermediate (or undefined)
/// signal the fix removed; an error for an output it would leave undefined.
fn counterpart(old: &Model, new: &Model, s: usize) -> Result<Option<usize>, String> {
    let sig = &old.signals[s];
    if sig.kind == SignalKind::Input {
        return Ok(None);
    }
    match new
        .signal(&sig.name)
        .filter(|&t| !new.signals[t].definitions.is_empty())
    {
        // An output stays one: a fix does not change the interface.
        Some(t) if sig.kind == SignalKind::Output && new.signals[t].kind != SignalKind::Output => {
            Err(format!("`{}` would no longer be an output", sig.name))
        }
        Some(t) => Ok(Some(t)),
        None if sig.kind == SignalKind::Intermediate || sig.definitions.is_empty() => Ok(None),
        None => Err(format!("`{}` would no longer be defined", sig.name)),
    }
}

/// The statement (by index) whose span holds `span`; statements are in
/// source order and do not overlap.
fn item_at(model: &Model, span: implica_syntax::Span) -> Option<usize> {
    let items = &model.file.items;
    let i = items.partition_point(|it| it.span.end < span.end);
    let it = items.get(i)?;
    (it.span.start <= span.start && span.end <= it.span.end).then_some(i)
}

/// What the proof of a rewrite of one expression depends on: the statement's
/// text, the edits within it, the functions of the signals it reads and its
/// own (in the session's BDD manager), and the impossible combinations.
#[derive(PartialEq, Eq, Hash)]
pub(crate) struct ProofKey {
    text: Box<str>,
    edits: Vec<(usize, usize, String)>,
    values: Vec<(implica_syntax::ast::SmolStr, Option<BddRef>)>,
    impossible: BddRef,
}

/// The key of [`verify_local`]'s proof of `fix`, when its edits lie in one
/// definition statement.
fn proof_key(model: &Model, functions: &Functions, src: &str, fix: &Fix) -> Option<ProofKey> {
    let first = fix.edits.first()?;
    let index = item_at(model, first.span)?;
    let item = &model.file.items[index];
    if !fix
        .edits
        .iter()
        .all(|e| item.span.start <= e.span.start && e.span.end <= item.span.end)
    {
        return None;
    }
    let def = model.definitions.iter().find(|d| d.item == index)?;
    let value = |s: usize| functions.value(s).ok().map(|k| k.full);
    let mut values: Vec<_> = def
        .reads
        .iter()
        .map(|&r| (model.signals[r].name.clone(), value(r)))
        .collect();
    values.push((model.signals[def.signal].name.clone(), value(def.signal)));
    Some(ProofKey {
        text: src.get(item.span.start..item.span.end)?.into(),
        edits: fix
            .edits
            .iter()
            .map(|e| {
                let base = item.span.start;
                (e.span.start - base, e.span.end - base, e.new_text.clone())
            })
            .collect(),
        values,
        impossible: functions.impossible,
    })
}

/// The proof of a fix that rewrites the right-hand side of one expression
/// definition: the new expression must compute the same function (where
/// inputs can occur) as the old, over the same signals; then no reader can
/// change either. `None` when the fix is of another kind.
fn verify_local(
    model: &Model,
    functions: &mut Functions,
    src: &str,
    fix: &Fix,
) -> Option<Result<(), String>> {
    use implica_syntax::ast::{ItemKind, Rhs};
    let first = fix.edits.first()?;
    let item = &model.file.items[item_at(model, first.span)?];
    let ItemKind::Define(old_def) = &item.kind else {
        return None;
    };
    let Rhs::Expr(old_expr) = &old_def.rhs else {
        return None;
    };
    if !fix
        .edits
        .iter()
        .all(|e| old_expr.span.start <= e.span.start && e.span.end <= old_expr.span.end)
    {
        return None;
    }
    let signal = model.signal(&old_def.target.text)?;
    let old = functions.value(signal).ok()?;
    if model.definition_of(signal).map(|d| d.item)
        != model
            .file
            .items
            .iter()
            .position(|it| std::ptr::eq(it, item))
    {
        return None;
    }
    // The statement alone, edited, parsed on its own.
    let text = match apply_within(src, item.span.start, item.span.end, &fix.edits) {
        Ok(t) => t,
        Err(e) => return Some(Err(e)),
    };
    let (file, errors) = implica_syntax::parse(&text);
    let [new_item] = &file.items[..] else {
        return None;
    };
    let ItemKind::Define(new_def) = &new_item.kind else {
        return None;
    };
    let Rhs::Expr(new_expr) = &new_def.rhs else {
        return None;
    };
    if !errors.is_empty()
        || new_def.target.text != old_def.target.text
        || new_def.let_span.is_some() != old_def.let_span.is_some()
    {
        return None;
    }
    // Reading only names the old expression read, it cannot make a loop.
    let was = crate::model::name_uses(old_expr);
    let now = crate::model::name_uses(new_expr);
    if !now.iter().all(|n| was.iter().any(|w| w.text == n.text)) {
        return None;
    }
    let mut effort = Effort::new(DEFAULT_WORK_PER_DEFINITION);
    let new = match functions.expr_value(model, new_expr, &mut effort) {
        Ok(Ok(v)) => v,
        // A name the document does not define: the general proof decides.
        Ok(Err(_)) => return None,
        Err(_) => return Some(Err("the proof ran out of budget".to_string())),
    };
    let differs = (|| {
        let d = functions.bdd.xor(old.full, new, &mut effort)?;
        let possible = functions.bdd.not(functions.impossible, &mut effort)?;
        functions.bdd.and(d, possible, &mut effort)
    })();
    Some(match differs {
        Ok(BddRef::FALSE) => Ok(()),
        Ok(_) => Err(format!("`{}` would change", old_def.target.text)),
        Err(_) => Err("the proof ran out of budget".to_string()),
    })
}

/// The proof of a fix that only takes names out of one `input` statement
/// (or deletes the statement with its line): that line, edited and parsed
/// on its own, declares the old names less some, keeps its comments, and
/// each name taken out is an input that nothing in the document reads or
/// defines. The rest of the text is untouched, so every definition,
/// `never`, assertion and test vector reads the same signals as before and
/// every signal keeps its function. `None` when the fix is of another kind.
fn verify_unread_inputs(model: &Model, src: &str, fix: &Fix) -> Option<Result<(), String>> {
    use implica_syntax::ast::{ItemKind, Trivia};
    let first = fix.edits.first()?;
    // The first statement that ends at or after the edit: the one whose
    // lines it is on, if any (checked below). Statements are in order.
    let items = &model.file.items;
    let item = items.get(items.partition_point(|it| it.span.end < first.span.start))?;
    let ItemKind::Input(old_decl) = &item.kind else {
        return None;
    };
    // The statement's own lines: from the start of its first line through
    // its line break.
    let start = src[..item.span.start].rfind('\n').map_or(0, |i| i + 1);
    let end = src[item.span.end..]
        .find('\n')
        .map_or(src.len(), |i| item.span.end + i + 1);
    // The lines hold this statement alone, and the edits stay on them.
    let alone = model
        .file
        .items
        .iter()
        .filter(|it| it.span.start < end && start < it.span.end)
        .count()
        == 1;
    if !alone
        || !fix
            .edits
            .iter()
            .all(|e| start <= e.span.start && e.span.end <= end)
    {
        return None;
    }
    let text = match apply_within(src, start, end, &fix.edits) {
        Ok(t) => t,
        Err(e) => return Some(Err(e)),
    };
    // What remains of the lines still ends a line, so that the next line
    // reads as before (no statement joined onto this one).
    if end < src.len() && !(text.is_empty() || text.ends_with('\n')) {
        return None;
    }
    let (file, errors) = implica_syntax::parse(&text);
    if !errors.is_empty() {
        return None;
    }
    // The comments on the edited lines: the statement's own, not those on
    // the lines above it.
    let own = |t: &Trivia| -> Vec<String> {
        t.trailing()
            .into_iter()
            .chain(t.interior())
            .map(|c| c.text.to_string())
            .collect()
    };
    let (kept, mut now): (Vec<&str>, Vec<String>) = match &file.items[..] {
        [] => (Vec::new(), Vec::new()),
        [it] => match &it.kind {
            ItemKind::Input(d) => (
                d.names.iter().map(|n| n.text.as_str()).collect(),
                own(&it.trivia),
            ),
            _ => return None,
        },
        _ => return None,
    };
    now.extend(
        file.items
            .iter()
            .flat_map(|it| it.trivia.leading())
            .map(|(_, c)| c.text.to_string()),
    );
    now.extend(
        file.trailing_comments
            .iter()
            .map(|(_, c)| c.text.to_string()),
    );
    if !own(&item.trivia).iter().all(|c| now.contains(c)) {
        return None;
    }
    let mut rest = kept.iter().peekable();
    for n in &old_decl.names {
        if rest.peek() == Some(&&n.text.as_str()) {
            rest.next();
            continue;
        }
        let s = model.signal(&n.text)?;
        let sig = &model.signals[s];
        if sig.kind != SignalKind::Input
            || !sig.references.is_empty()
            || !sig.definitions.is_empty()
        {
            return Some(Err(format!(
                "`{}` is read or defined, and would no longer be an input",
                n.text
            )));
        }
    }
    if rest.next().is_some() {
        return None;
    }
    Some(Ok(()))
}

/// [`verify_in`] for the analysis, which knows how many syntax errors `src`
/// has and needs only the verdict.
pub(crate) fn prove_in(
    model: &Model,
    functions: &mut Functions,
    src: &str,
    syntax_errors: usize,
    fix: &Fix,
    cache: &mut crate::session::Cache,
) -> Result<(), String> {
    let local = match proof_key(model, functions, src, fix) {
        Some(key) => cache
            .proofs
            .get_or(key, || verify_local(model, functions, src, fix)),
        None => verify_local(model, functions, src, fix),
    };
    if let Some(r) = local {
        return r;
    }
    if let Some(r) = verify_unread_inputs(model, src, fix) {
        return r;
    }
    verify_general(model, functions, src, Some(syntax_errors), fix).map(drop)
}

/// [`verify`], reusing the analysis of `src` (its model and functions): only
/// the definitions the fix touches, and those that read them, are computed
/// again, in the same BDD manager.
pub fn verify_in(
    model: &Model,
    functions: &mut Functions,
    src: &str,
    fix: &Fix,
) -> Result<String, String> {
    match verify_local(model, functions, src, fix) {
        Some(r) => r.and_then(|()| apply(src, &fix.edits)),
        None => verify_general(model, functions, src, None, fix),
    }
}

/// The proof of any fix: the fixed text parsed and its functions computed
/// in the same manager, every signal compared. `syntax_errors`: how many
/// `src` has, when known.
fn verify_general(
    model: &Model,
    functions: &mut Functions,
    src: &str,
    syntax_errors: Option<usize>,
    fix: &Fix,
) -> Result<String, String> {
    let after = apply(src, &fix.edits)?;
    let old_errors = syntax_errors.unwrap_or_else(|| implica_syntax::parse(src).1.len());
    let (new_file, new_errors) = implica_syntax::parse(&after);
    if new_errors.len() > old_errors {
        return Err(format!(
            "the fixed text does not parse: {}",
            new_errors
                .first()
                .map_or(String::new(), |e| e.message.clone())
        ));
    }
    let new = Model::build(&new_file);
    let edited = match functions.edited((model, src), (&new, &after), DEFAULT_WORK_PER_DEFINITION) {
        None => return verify(src, fix),
        Some(Ok(e)) => e,
        Some(Err(_)) => return Err("the analysis was cancelled".to_string()),
    };
    if edited.impossible != functions.impossible {
        return Err("the impossible inputs (`never`) would change".to_string());
    }
    let mut effort = Effort::new(50_000_000);
    let possible = functions
        .bdd
        .not(functions.impossible, &mut effort)
        .map_err(|_| "out of budget".to_string())?;
    for (s, sig) in model.signals.iter().enumerate() {
        let Some(t) = counterpart(model, &new, s)? else {
            continue;
        };
        match (functions.value(s), edited.values[t]) {
            (Ok(a), Ok(b)) => {
                for (x, y, what) in [
                    (a.lower, b.lower, ""),
                    (a.upper, b.upper, "the freedom of "),
                ] {
                    if x == y {
                        continue;
                    }
                    let d = functions
                        .bdd
                        .xor(x, y, &mut effort)
                        .and_then(|d| functions.bdd.and(d, possible, &mut effort));
                    match d {
                        Ok(BddRef::FALSE) => {}
                        Ok(_) => return Err(format!("{what}`{}` would change", sig.name)),
                        Err(_) => {
                            return Err(format!(
                                "{what}`{}` could not be compared within the budget",
                                sig.name
                            ));
                        }
                    }
                }
            }
            (Ok(_), Err(_)) => {
                return Err(format!("`{}` would no longer have a function", sig.name));
            }
            (Err(_), _) => {}
        }
    }
    Ok(after)
}

/// The functions of both versions of a fix, for a proof from scratch: each
/// computed in its own manager, with the new variable of each old input
/// (by name; `None` for an input the fix removes).
struct Versions<'v> {
    fo: &'v Functions,
    fnew: &'v mut Functions,
    rename: &'v dyn Fn(usize) -> Option<usize>,
}

impl Versions<'_> {
    /// Old function `f` in the new manager; `what` names it in errors.
    fn moved(&mut self, f: BddRef, what: &str, effort: &mut Effort) -> Result<BddRef, String> {
        match self.fnew.bdd.transfer(&self.fo.bdd, f, self.rename, effort) {
            Ok(Some(m)) => Ok(m),
            Ok(None) => Err(format!("{what} reads an input the fix removes")),
            Err(_) => Err(budget(what)),
        }
    }
}

fn budget(what: &str) -> String {
    format!("{what} could not be compared within the budget")
}

/// Applies `fix`, parses and computes both versions (the fixed text may have
/// no more syntax errors than the original, and the same impossible
/// combinations), and runs `prove` on each signal of the original that has
/// a function, with its name, its old and new value and the combinations
/// that can occur (in the new manager); the fixed text when all hold. A
/// signal without a function before cannot be made worse; one that loses
/// its function, or an output that loses its definition, fails the proof.
fn from_scratch(
    src: &str,
    fix: &Fix,
    mut prove: impl FnMut(&mut Versions, &str, Known, Known, BddRef, &mut Effort) -> Result<(), String>,
) -> Result<String, String> {
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
    let mut v = Versions {
        fo: &fo,
        fnew: &mut fnew,
        rename: &rename,
    };
    let mut effort = Effort::new(50_000_000);
    // The impossible combinations themselves must not change.
    let moved = v.moved(fo.impossible, "`never`", &mut effort);
    if !matches!(moved, Ok(m) if m == v.fnew.impossible) {
        return Err("the impossible inputs (`never`) would change".to_string());
    }
    // Only combinations that can occur count: on a `never` combination
    // every signal is free.
    let possible = v
        .fnew
        .bdd
        .not(v.fnew.impossible, &mut effort)
        .map_err(|_| budget("the possible inputs"))?;
    for (s, sig) in old.signals.iter().enumerate() {
        let Some(t) = counterpart(&old, &new, s)? else {
            continue;
        };
        match (fo.value(s), v.fnew.value(t)) {
            (Ok(a), Ok(b)) => prove(&mut v, &sig.name, a, b, possible, &mut effort)?,
            (Ok(_), Err(_)) => {
                return Err(format!("`{}` would no longer have a function", sig.name));
            }
            (Err(_), _) => {}
        }
    }
    Ok(after)
}

/// Whether applying `fix` to `src` keeps every signal's function: the text
/// still parses (with no more syntax errors than before), every output is
/// still there, the `never` combinations are the same, and every signal of
/// both versions has the same on-set and the same don't-cares over the
/// inputs (matched by name) on every combination that can occur. Intermediate
/// signals and inputs may disappear only if nothing depended on them.
pub fn verify(src: &str, fix: &Fix) -> Result<String, String> {
    from_scratch(src, fix, |v, name, a, b, possible, effort| {
        for (x, y, what) in [
            (a.lower, b.lower, format!("`{name}`")),
            (a.upper, b.upper, format!("the freedom of `{name}`")),
        ] {
            let moved = v.moved(x, &what, effort)?;
            let differs = v
                .fnew
                .bdd
                .xor(moved, y, effort)
                .and_then(|d| v.fnew.bdd.and(d, possible, effort));
            match differs {
                Ok(BddRef::FALSE) => {}
                Ok(_) => return Err(format!("{what} would change")),
                Err(_) => return Err(budget(&what)),
            }
        }
        Ok(())
    })
}

/// Whether applying `fix` to `src` only narrows freedom: the text still
/// parses (with no more syntax errors than before), every output is still
/// there, the `never` combinations are the same, and on every combination
/// that can occur each signal's new interval lies inside its old one (where
/// it was surely 1 it still is, and where it may now be 1 it could be
/// before), signals matched by name. This is the proof of a rewrite that
/// settles don't-cares, such as a table minimized into an expression: any
/// value the new text allows, the old text allowed too, so no reader can
/// see a value the specification forbade. [`verify`] is the stricter proof
/// for rewrites that must keep the freedom as well.
pub fn verify_narrowing(src: &str, fix: &Fix) -> Result<String, String> {
    from_scratch(src, fix, |v, name, a, b, possible, effort| {
        let what = format!("`{name}`");
        let old_lower = v.moved(a.lower, &what, effort)?;
        let old_upper = v.moved(a.upper, &what, effort)?;
        // Each must be empty where inputs can occur: a sure 1 lost, and a
        // possible 1 gained.
        for (inside, outside, how) in [
            (old_lower, b.lower, "would lose a value it must have"),
            (b.upper, old_upper, "would take a value it must not"),
        ] {
            let escaped = v
                .fnew
                .bdd
                .not(outside, effort)
                .and_then(|n| v.fnew.bdd.and(inside, n, effort))
                .and_then(|d| v.fnew.bdd.and(d, possible, effort));
            match escaped {
                Ok(BddRef::FALSE) => {}
                Ok(_) => return Err(format!("{what} {how}")),
                Err(_) => return Err(budget(&what)),
            }
        }
        Ok(())
    })
}

/// The result of [`fix_all`].
#[derive(Debug, Clone)]
pub struct FixAll {
    /// The text with the fixes applied.
    pub text: String,
    /// Each applied fix: its rule and title.
    pub applied: Vec<(&'static str, String)>,
    /// Fixes a rule offered that failed their proof (see [`crate::Analysis`]).
    pub internal_errors: Vec<String>,
}

/// Most rounds of [`fix_all`]: a fix may make another finding appear (a
/// signal left unused), which the next round fixes.
const MAX_ROUNDS: usize = 8;

/// Applies every safe fix (and, with `review`, the fixes to review too),
/// round after round until none is left. In a round, the first fix of each
/// diagnostic is taken unless its edits overlap one already taken; the
/// round's result is proven equivalent as a whole, and when that proof
/// fails the round's fixes are applied one at a time instead, each proven
/// again.
pub fn fix_all(src: &str, config: &crate::config::Config, review: bool) -> FixAll {
    let mut text = src.to_string();
    let mut applied = Vec::new();
    let mut internal_errors = Vec::new();
    for _ in 0..MAX_ROUNDS {
        let a = crate::analyze_with(&text, config);
        internal_errors.extend(a.internal_errors);
        let mut taken: Vec<(&'static str, &Fix)> = Vec::new();
        for d in &a.diagnostics {
            let Some(f) = d
                .fixes
                .iter()
                .find(|f| review || f.applicability == crate::Applicability::Safe)
            else {
                continue;
            };
            let clash = f.edits.iter().any(|e| {
                taken.iter().flat_map(|(_, t)| &t.edits).any(|t| {
                    t != e
                        && e.span.start < t.span.end.max(t.span.start + 1)
                        && t.span.start < e.span.end.max(e.span.start + 1)
                })
            });
            if !clash {
                taken.push((d.rule, f));
            }
        }
        if taken.is_empty() {
            break;
        }
        let together = Fix {
            title: "all fixes of this round".to_string(),
            applicability: crate::Applicability::Safe,
            edits: taken.iter().flat_map(|(_, f)| f.edits.clone()).collect(),
        };
        match verify(&text, &together) {
            Ok(next) => {
                applied.extend(taken.iter().map(|(r, f)| (*r, f.title.clone())));
                text = next;
            }
            Err(_) => {
                // One at a time: the first that still proves goes in, and the
                // next round looks again.
                let Some((rule, next)) = taken
                    .iter()
                    .find_map(|(r, f)| verify(&text, f).ok().map(|t| ((*r, f.title.clone()), t)))
                else {
                    break;
                };
                applied.push(rule);
                text = next;
            }
        }
    }
    FixAll {
        text,
        applied,
        internal_errors,
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use implica_syntax::Span;

    fn prove(src: &str, span: (usize, usize), new_text: &str) -> Result<(), String> {
        let (file, errors) = implica_syntax::parse(src);
        let model = Model::build(&file);
        let mut functions = Functions::compute(&model, DEFAULT_WORK_PER_DEFINITION, None).unwrap();
        let mut cache = crate::session::Cache::default();
        let fix = Fix {
            title: "test".to_string(),
            applicability: crate::Applicability::Safe,
            edits: vec![Edit {
                span: Span::new(span.0, span.1),
                new_text: new_text.to_string(),
            }],
        };
        prove_in(&model, &mut functions, src, errors.len(), &fix, &mut cache)
    }

    /// The proof of taking unread names out of an `input` statement holds
    /// for exactly those edits, whichever way it is reached.
    #[test]
    fn taking_inputs_out_is_proven_only_when_nothing_reads_them() {
        let src = "input a, b, spare  # sensors\noutput y\ny = a & b\n";
        let at = |s: &str| src.find(s).unwrap();
        // `, spare` out: nothing reads it.
        let spare = at(", spare");
        assert_eq!(prove(src, (spare, spare + 7), ""), Ok(()));
        // `, b` out: `y` reads it.
        let b = at(", b");
        assert!(prove(src, (b, b + 3), "").is_err());
        // The whole statement with its line: `a` and `b` are read.
        assert!(prove(src, (0, at("output")), "").is_err());
        // The line break gone: `output` would join the statement.
        let nl = at("\noutput");
        assert!(prove(src, (nl, nl + 1), "").is_err());
        // Two statements on one line: the other one may not go with it.
        let two = "input a, spare output y\ny = a\n";
        let s = two.find(", spare").unwrap();
        assert_eq!(prove(two, (s, s + 7), ""), Ok(()));
        assert!(prove(two, (s, two.find('\n').unwrap()), "").is_err());
    }
}
