//! Verilog and VHDL from an Implica document: a module (or an entity with
//! its architecture) with the document's inputs and outputs, and one
//! continuous assignment per signal.
//!
//! The assignments are built as a netlist of Boolean expressions first, and
//! the netlist is proven, by BDD, to give every signal it drives the value
//! the document fixes (the same value wherever the signal is not free).
//! Only then is it printed; what is left unproven is the printing into the
//! target language, which the tests check with real simulators.
//!
//! Architecture invariant: this crate reads the semantic model and the
//! functions of `implica-analysis`; it neither parses nor reports
//! diagnostics. Refusing documents with errors is the caller's job.

mod names;
mod text;

pub use names::Renamed;

use implica_analysis::config::{Config, PreferredForm};
use implica_analysis::functions::{Functions, Local, Unknown};
use implica_analysis::minimal::{Form, NoForm, forms_of};
use implica_analysis::model::{Body, Model, SignalId, SignalKind};
use implica_logic::{BddRef, BoolExpr, Effort, Interrupted, MAX_VARS, hazard_free_cover};
use implica_syntax::LineIndex;
use implica_syntax::ast::Expr;
use std::fmt;

/// The target language.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Language {
    /// Verilog, IEEE 1364-2005.
    Verilog,
    /// VHDL, IEEE 1076-2008.
    Vhdl,
}

impl Language {
    /// The language's name, as in messages.
    pub fn title(self) -> &'static str {
        match self {
            Language::Verilog => "Verilog",
            Language::Vhdl => "VHDL",
        }
    }
}

/// Which logic the assignments carry.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Logic {
    /// Each output as a minimal two-level form over the inputs it reads,
    /// with its don't-cares (and the `never` combinations) used to make it
    /// small.
    Minimized,
    /// Each definition the way the document writes it, intermediate signals
    /// as internal wires; tables and term lists, which have no expression,
    /// as minimal forms over their own columns.
    AsWritten,
}

/// What to export and how.
#[derive(Debug, Clone, Copy)]
pub struct Options<'a> {
    pub language: Language,
    pub logic: Logic,
    /// The module or entity name; `None` derives one from `stem`.
    pub name: Option<&'a str>,
    /// The document's file name without its extension.
    pub stem: &'a str,
    /// The document as the header names it (a path, or `<stdin>`).
    pub source: &'a str,
    /// The command that regenerates the text, for the header.
    pub command: &'a str,
    /// The project's configuration: the preferred form, the exact budget,
    /// and whether `static-hazard` is on (then sums of products are made
    /// free of static-1 hazards).
    pub config: &'a Config,
    /// Work allowed per signal for its minimal form, and for the proof.
    pub work_per_signal: u64,
}

/// An exported document.
#[derive(Debug, Clone)]
pub struct Exported {
    pub text: String,
    /// The module or entity name.
    pub module: String,
    /// Signals whose names had to change in the target language.
    pub renamed: Vec<Renamed>,
}

/// Why a document was not exported.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum ExportError {
    /// The document declares no output.
    NoOutputs,
    /// The requested module name cannot be used.
    BadName { name: String, why: String },
    /// A signal the module needs has no function.
    NoFunction { signal: String, why: String },
    /// A signal's minimal form could not be found.
    NoForm { signal: String, reason: String },
    /// The netlist could not be proven to compute the document: a bug in
    /// the exporter; nothing is written.
    Unproven { signal: String, detail: String },
}

impl fmt::Display for ExportError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            ExportError::NoOutputs => write!(
                f,
                "the document declares no output, so there is nothing to export (declare one with `output NAME`)"
            ),
            ExportError::BadName { name, why } => {
                write!(f, "`{name}` cannot be the module name: {why}")
            }
            ExportError::NoFunction { signal, why } => {
                write!(f, "`{signal}` has no function: {why}")
            }
            ExportError::NoForm { signal, reason } => write!(
                f,
                "no minimal form of `{signal}`: {reason} (`--as-written` exports the expressions as written)"
            ),
            ExportError::Unproven { signal, detail } => write!(
                f,
                "internal error: the exported logic of `{signal}` could not be proven to compute it ({detail}); nothing was written. Please report this"
            ),
        }
    }
}

impl std::error::Error for ExportError {}

/// One continuous assignment: `nets[target] = expr`, where variable `i`
/// of `expr` is net `i`.
#[derive(Debug, Clone)]
pub(crate) struct Assign {
    pub target: usize,
    pub expr: BoolExpr,
    /// The document's comments on the definition, without the `#`.
    pub comments: Vec<String>,
    /// How the expression was found, when it is not the one written.
    pub note: Option<String>,
}

/// The module before it is printed.
#[derive(Debug, Clone)]
pub(crate) struct Netlist {
    /// Target-language names, by net.
    pub names: Vec<String>,
    /// Nets `0..inputs` are the input ports, in declaration order.
    pub inputs: usize,
    /// Nets `inputs..inputs + outputs` are the output ports.
    pub outputs: usize,
    /// The remaining nets are internal wires.
    pub assigns: Vec<Assign>,
    pub header: Vec<String>,
    pub module: String,
}

/// Exports a document whose model and functions are given. `src` is the
/// document's text (for line numbers in notes).
pub fn export(
    src: &str,
    model: &Model,
    functions: &mut Functions,
    options: &Options,
) -> Result<Exported, ExportError> {
    let mut outputs: Vec<SignalId> = (0..model.signals.len())
        .filter(|&s| model.signals[s].kind == SignalKind::Output)
        .collect();
    if outputs.is_empty() {
        return Err(ExportError::NoOutputs);
    }
    outputs.sort_by_key(|&s| model.signals[s].declarations.first().map(|d| d.start));
    // The nets: inputs, outputs, then (as written) the intermediate signals
    // the outputs read, in source order.
    let mut signals: Vec<SignalId> = model.inputs.clone();
    signals.extend(&outputs);
    if options.logic == Logic::AsWritten {
        let needed = needed_by(model, &outputs);
        for d in &model.definitions {
            let s = d.signal;
            if needed[s]
                && !matches!(
                    model.signals[s].kind,
                    SignalKind::Input | SignalKind::Output
                )
                && !signals.contains(&s)
            {
                signals.push(s);
            }
        }
    }
    let mut net_of = vec![None; model.signals.len()];
    for (n, &s) in signals.iter().enumerate() {
        net_of[s] = Some(n);
    }
    let original: Vec<&str> = signals
        .iter()
        .map(|&s| model.signals[s].name.as_str())
        .collect();
    let (names, renamed) = names::assign(options.language, &original);
    let module = match options.name {
        Some(n) => {
            if let Some(why) = names::problem(options.language, n) {
                return Err(ExportError::BadName {
                    name: n.to_string(),
                    why,
                });
            }
            if names::collides(options.language, n, &names) {
                return Err(ExportError::BadName {
                    name: n.to_string(),
                    why: "a signal of the module has that name".to_string(),
                });
            }
            n.to_string()
        }
        None => names::module_from(options.language, options.stem, &names),
    };

    // The file's own directives (`# implica: enable static-hazard`) count
    // as they do for `implica check`.
    let config = options.config.for_file(model.file);
    let config = &*config;
    let hazard_free = config.severity("static-hazard").is_some();
    let index = LineIndex::new(src);
    let line_of = |at: usize| index.line_col(src, at).line + 1;
    let mut assigns = Vec::new();
    let mut listed_bodies = false;
    let targets: Vec<SignalId> = match options.logic {
        Logic::Minimized => outputs.clone(),
        // Source order, as the document reads.
        Logic::AsWritten => {
            let mut t: Vec<SignalId> = model
                .definitions
                .iter()
                .map(|d| d.signal)
                .filter(|&s| net_of[s].is_some_and(|n| n >= model.inputs.len()))
                .collect();
            let mut seen = vec![false; model.signals.len()];
            t.retain(|&s| !std::mem::replace(&mut seen[s], true));
            t
        }
    };
    for &s in &targets {
        let name = model.signals[s].name.to_string();
        let Some(def) = model.definition_of(s) else {
            return Err(ExportError::NoFunction {
                signal: name,
                why: "it is never defined".to_string(),
            });
        };
        if let Err(u) = functions.value(s) {
            return Err(no_function(model, &name, u));
        }
        let first_column = !matches!(def.body, Body::Column { column, .. } if column > 0);
        let comments = if first_column {
            comments_of(model, def.item)
        } else {
            Vec::new()
        };
        let mut effort = Effort::new(options.work_per_signal);
        let (expr, note) = match (options.logic, def.body) {
            (Logic::AsWritten, Body::Expr(x)) => {
                let e = from_syntax(model, x, &net_of).ok_or_else(|| ExportError::NoFunction {
                    signal: name.clone(),
                    why: "its definition has errors (see `implica check`)".to_string(),
                })?;
                (e, None)
            }
            // A minimal form: of the signal over the inputs it reads, or
            // (as written) of a table or term list over its own columns.
            (logic, body) => {
                let (local, header) = if logic == Logic::Minimized {
                    (functions.local(s, &mut effort), None)
                } else {
                    listed_bodies = true;
                    let header_nets = body
                        .header()
                        .unwrap_or_default()
                        .iter()
                        .map(|h| model.signal(&h.text).and_then(|x| net_of[x]))
                        .collect::<Option<Vec<usize>>>()
                        .ok_or_else(|| ExportError::NoFunction {
                            signal: name.clone(),
                            why: "its header names a signal that is not defined".to_string(),
                        })?;
                    let what = match body {
                        Body::Terms(_) => "term list",
                        _ => "table",
                    };
                    let line = line_of(model.file.items[def.item].span.start);
                    let place = format!("the {what} at line {line}");
                    (
                        functions.listed_over_header(body, &mut effort),
                        Some((header_nets, place)),
                    )
                };
                let local = match local {
                    Ok(Ok(l)) => l,
                    Ok(Err(u)) => return Err(no_function(model, &name, u)),
                    Err(_) => return Err(too_much(&name)),
                };
                let nets = match &header {
                    Some((nets, _)) => nets.clone(),
                    None => local.inputs.clone(),
                };
                let (e, note) =
                    pick_form(functions, local, config, hazard_free, &name, &mut effort)?;
                let note = match header {
                    Some((_, place)) => format!("{place}: {note}"),
                    None => note,
                };
                (map_vars(&e, &|i| nets[i]), Some(note))
            }
        };
        let target = net_of[s].unwrap_or_else(|| unreachable!("targets have nets"));
        assigns.push(Assign {
            target,
            expr,
            comments,
            note,
        });
    }

    prove(
        model,
        functions,
        &signals,
        &assigns,
        options.work_per_signal,
    )?;

    let header = header_lines(
        functions,
        options,
        &module,
        &renamed,
        hazard_free,
        listed_bodies,
    );
    let netlist = Netlist {
        names,
        inputs: model.inputs.len(),
        outputs: outputs.len(),
        assigns,
        header,
        module: module.clone(),
    };
    let text = match options.language {
        Language::Verilog => text::verilog(&netlist),
        Language::Vhdl => text::vhdl(&netlist),
    };
    Ok(Exported {
        text,
        module,
        renamed,
    })
}

fn no_function(model: &Model, name: &str, u: Unknown) -> ExportError {
    ExportError::NoFunction {
        signal: name.to_string(),
        why: u.describe(model),
    }
}

fn too_much(name: &str) -> ExportError {
    ExportError::NoForm {
        signal: name.to_string(),
        reason: "it takes more work than the budget allows".to_string(),
    }
}

/// The signals the outputs read, directly or not (the outputs included).
fn needed_by(model: &Model, outputs: &[SignalId]) -> Vec<bool> {
    let mut needed = vec![false; model.signals.len()];
    let mut stack: Vec<SignalId> = outputs.to_vec();
    while let Some(s) = stack.pop() {
        if std::mem::replace(&mut needed[s], true) {
            continue;
        }
        if let Some(d) = model.definition_of(s) {
            stack.extend(d.reads.iter().copied().filter(|&r| !needed[r]));
        }
    }
    needed
}

/// The comments written on a definition: on the lines above it, and at the
/// end of its line; suppression comments (`# implica: ...`) speak to
/// Implica, not to the reader of the module, and stay behind.
fn comments_of(model: &Model, item: usize) -> Vec<String> {
    let trivia = &model.file.items[item].trivia;
    let strip = |t: &str| {
        let t = t.strip_prefix('#').unwrap_or(t);
        t.strip_prefix(' ').unwrap_or(t).trim_end().to_string()
    };
    trivia
        .leading()
        .iter()
        .map(|(_, c)| strip(&c.text))
        .chain(trivia.trailing().map(|c| strip(&c.text)))
        .filter(|c| !c.trim_start().starts_with("implica:"))
        .collect()
}

/// The minimal form the configuration asks for, with a note on its cost
/// and certificate; `effort` is what is left of the signal's work (the
/// exact search has its own budget, `config.budget`).
fn pick_form(
    functions: &mut Functions,
    local: Local,
    config: &Config,
    hazard_free: bool,
    name: &str,
    effort: &mut Effort,
) -> Result<(BoolExpr, String), ExportError> {
    // Hazard-free covers are sums of products.
    let (sop, pos) = match (hazard_free, config.form) {
        (true, _) | (false, PreferredForm::Sop) => (true, false),
        (false, PreferredForm::Pos) => (false, true),
        (false, PreferredForm::Either) => (true, true),
    };
    let forms = match forms_of(functions, local, sop, pos, &config.budget, effort) {
        Ok(f) => f,
        Err(Interrupted::OutOfBudget | Interrupted::Cancelled) => return Err(too_much(name)),
    };
    let ok = |r: &Option<Result<Form, NoForm>>| r.as_ref().and_then(|r| r.as_ref().ok()).cloned();
    let (s, p) = (ok(&forms.sop), ok(&forms.pos));
    let chosen = match (s, p) {
        (Some(s), Some(p)) => {
            if (p.literals, p.terms) < (s.literals, s.terms) {
                (p, true)
            } else {
                (s, false)
            }
        }
        (Some(s), None) => (s, false),
        (None, Some(p)) => (p, true),
        (None, None) => {
            let reason = [&forms.sop, &forms.pos]
                .into_iter()
                .flatten()
                .find_map(|r| r.as_ref().err())
                .map_or_else(|| "no form was requested".to_string(), |e| e.reason.clone());
            return Err(ExportError::NoForm {
                signal: name.to_string(),
                reason,
            });
        }
    };
    let (form, is_pos) = chosen;
    let kind = if is_pos {
        "minimal product of sums"
    } else {
        "minimal sum of products"
    };
    let certificate = if form.proven_minimal {
        "proven minimal".to_string()
    } else if form.method == implica_analysis::minimal::Method::Heuristic {
        "found by the heuristic".to_string()
    } else {
        format!("at least {} terms needed", form.lower_bound)
    };
    let plural = |n: usize, w: &str| format!("{n} {w}{}", if n == 1 { "" } else { "s" });
    let size = format!(
        "{}, {}",
        plural(form.terms, if is_pos { "sum term" } else { "term" }),
        plural(form.literals, "literal")
    );
    let k = forms.local.inputs.len();
    if hazard_free && !is_pos && k <= MAX_VARS && k <= config.budget.max_vars {
        let on = functions
            .bdd
            .to_truth_table(forms.local.on, &forms.local.inputs);
        let dc = functions
            .bdd
            .to_truth_table(forms.local.dc, &forms.local.inputs);
        if let Ok(mut cover) = hazard_free_cover(&form.cover, &on, &dc, &config.budget) {
            let added = cover.len() - form.cover.len();
            if added > 0 {
                cover.sort_for_reading();
                let e = BoolExpr::from_cover(&cover);
                return Ok((
                    e,
                    format!(
                        "{kind}: {size}; {certificate}; {} added against static-1 hazards",
                        plural(added, "consensus term")
                    ),
                ));
            }
            return Ok((
                form.expression,
                format!("{kind}, free of static-1 hazards: {size}; {certificate}"),
            ));
        }
        return Ok((
            form.expression,
            format!("{kind}: {size}; {certificate}; too large to make free of static-1 hazards"),
        ));
    }
    Ok((form.expression, format!("{kind}: {size}; {certificate}")))
}

/// `e` with variable `i` renamed to `f(i)`.
fn map_vars(e: &BoolExpr, f: &dyn Fn(usize) -> usize) -> BoolExpr {
    match e {
        BoolExpr::Const(b) => BoolExpr::Const(*b),
        BoolExpr::Var(i) => BoolExpr::Var(f(*i)),
        BoolExpr::Not(x) => BoolExpr::negate(map_vars(x, f)),
        BoolExpr::And(es) => BoolExpr::And(es.iter().map(|x| map_vars(x, f)).collect()),
        BoolExpr::Or(es) => BoolExpr::Or(es.iter().map(|x| map_vars(x, f)).collect()),
        BoolExpr::Xor(es) => BoolExpr::Xor(es.iter().map(|x| map_vars(x, f)).collect()),
    }
}

/// A definition's expression over the nets, operator by operator as
/// written; `None` where it has an error node or names a signal with no
/// net.
fn from_syntax(model: &Model, x: &Expr, net_of: &[Option<usize>]) -> Option<BoolExpr> {
    let mut names = Vec::new();
    let e = implica_analysis::to_bool_expr(x, &mut names)?;
    let nets = names
        .iter()
        .map(|n| net_of[model.signal(n)?])
        .collect::<Option<Vec<usize>>>()?;
    Some(map_vars(&e, &|i| nets[i]).flattened())
}

/// Proves that the assignments give each signal they drive its function,
/// wherever the document fixes it: composed in dependency order from the
/// inputs, each driven net equals the signal's on-set outside its
/// don't-cares.
fn prove(
    model: &Model,
    functions: &mut Functions,
    signals: &[SignalId],
    assigns: &[Assign],
    work: u64,
) -> Result<(), ExportError> {
    let inputs = model.inputs.len();
    let mut value: Vec<Option<BddRef>> = vec![None; signals.len()];
    let mut assign_of = vec![None; signals.len()];
    for (k, a) in assigns.iter().enumerate() {
        assign_of[a.target] = Some(k);
    }
    let fail = |n: usize, detail: String| ExportError::Unproven {
        signal: model.signals[signals[n]].name.to_string(),
        detail,
    };
    let mut effort = Effort::new(work.saturating_mul(4));
    for (n, v) in value.iter_mut().enumerate().take(inputs) {
        *v = Some(
            functions
                .bdd
                .var(n)
                .map_err(|_| fail(n, "out of memory".into()))?,
        );
    }
    let position: std::collections::HashMap<SignalId, usize> =
        signals.iter().enumerate().map(|(n, &s)| (s, n)).collect();
    for &s in &model.order {
        let Some(&n) = position.get(&s) else { continue };
        let Some(k) = assign_of[n] else { continue };
        let v = eval(&mut functions.bdd, &assigns[k].expr, &value, &mut effort)
            .map_err(|why| fail(n, why))?;
        value[n] = Some(v);
    }
    for a in assigns {
        let n = a.target;
        let s = signals[n];
        let Some(v) = value[n] else {
            return Err(fail(n, "it was never computed".into()));
        };
        let local = match functions.local(s, &mut effort) {
            Ok(Ok(l)) => l,
            _ => return Err(fail(n, "its function is not known".into())),
        };
        let bad = (|| {
            let bdd = &mut functions.bdd;
            let diff = bdd.xor(v, local.on, &mut effort)?;
            let care = bdd.not(local.dc, &mut effort)?;
            bdd.and(diff, care, &mut effort)
        })()
        .map_err(|_| fail(n, "the proof takes more work than allowed".into()))?;
        if bad != BddRef::FALSE {
            let at = functions.bdd.any_one(bad).unwrap_or_default();
            let vector: Vec<String> = model
                .inputs
                .iter()
                .enumerate()
                .map(|(i, &x)| {
                    format!(
                        "{}={}",
                        model.signals[x].name,
                        u8::from(at.get(i).copied().unwrap_or(false))
                    )
                })
                .collect();
            return Err(fail(n, format!("it differs at {}", vector.join(", "))));
        }
    }
    Ok(())
}

/// The function of `e` over nets whose functions are `value`.
fn eval(
    bdd: &mut implica_logic::Bdd,
    e: &BoolExpr,
    value: &[Option<BddRef>],
    effort: &mut Effort,
) -> Result<BddRef, String> {
    let stop = |_| "the proof takes more work than allowed".to_string();
    Ok(match e {
        BoolExpr::Const(b) => {
            if *b {
                BddRef::TRUE
            } else {
                BddRef::FALSE
            }
        }
        BoolExpr::Var(i) => value
            .get(*i)
            .copied()
            .flatten()
            .ok_or_else(|| "it reads a net computed after it".to_string())?,
        BoolExpr::Not(x) => {
            let v = eval(bdd, x, value, effort)?;
            bdd.not(v, effort).map_err(stop)?
        }
        BoolExpr::And(es) | BoolExpr::Or(es) | BoolExpr::Xor(es) => {
            let mut acc = match e {
                BoolExpr::And(_) => BddRef::TRUE,
                _ => BddRef::FALSE,
            };
            for x in es {
                let v = eval(bdd, x, value, effort)?;
                acc = match e {
                    BoolExpr::And(_) => bdd.and(acc, v, effort),
                    BoolExpr::Or(_) => bdd.or(acc, v, effort),
                    _ => bdd.xor(acc, v, effort),
                }
                .map_err(stop)?;
            }
            acc
        }
    })
}

/// The header comment's lines.
fn header_lines(
    functions: &Functions,
    options: &Options,
    module: &str,
    renamed: &[Renamed],
    hazard_free: bool,
    listed_bodies: bool,
) -> Vec<String> {
    let mut h = vec![
        format!(
            "{module}: generated by implica {} from {}.",
            env!("CARGO_PKG_VERSION"),
            options.source
        ),
        format!("Regenerate it rather than edit it: {}", options.command),
        String::new(),
    ];
    match options.logic {
        Logic::Minimized => {
            h.push(
                "Each output is a minimal two-level form over the inputs it reads; its don't-cares"
                    .to_string(),
            );
            h.push("were chosen to make it small.".to_string());
            if functions.impossible != BddRef::FALSE {
                h.push(
                    "The input combinations that `never` statements exclude are don't-cares too:"
                        .to_string(),
                );
                h.push(
                    "there the outputs may differ from the document's expressions (--as-written keeps them)."
                        .to_string(),
                );
            }
        }
        Logic::AsWritten => {
            h.push("Each signal is assigned as the document writes it.".to_string());
            if listed_bodies {
                h.push(
                    "Tables and term lists are minimal forms over their columns; their don't-cares"
                        .to_string(),
                );
                h.push("were chosen to make them small.".to_string());
            }
        }
    }
    if hazard_free {
        h.push(
            "static-hazard is on: sums of products carry the consensus terms that keep them free"
                .to_string(),
        );
        h.push(
            "of static-1 hazards (a synthesis tool may remove them unless told to keep them)."
                .to_string(),
        );
    }
    h.push(
        "Every assignment was proven to give its signal the document's value wherever that value"
            .to_string(),
    );
    h.push("is fixed.".to_string());
    if !renamed.is_empty() {
        h.push(String::new());
        h.push(format!("Renamed for {}:", options.language.title()));
        for r in renamed {
            h.push(format!("  {} is {} ({})", r.from, r.to, r.why));
        }
    }
    h
}

#[cfg(test)]
mod tests {
    use super::*;
    use implica_testkit::Rng;

    fn with_doc<R>(src: &str, f: impl FnOnce(&Model, &mut Functions) -> R) -> R {
        let (file, errors) = implica_syntax::parse(src);
        assert!(errors.is_empty(), "{errors:?}");
        let model = Model::build(&file);
        let mut functions = Functions::compute(&model, 1_000_000, None).unwrap();
        f(&model, &mut functions)
    }

    fn proves(src: &str, expr: BoolExpr) -> Result<(), ExportError> {
        with_doc(src, |model, functions| {
            let y = model.signal("y").unwrap();
            let mut signals = model.inputs.clone();
            signals.push(y);
            let assign = Assign {
                target: signals.len() - 1,
                expr,
                comments: Vec::new(),
                note: None,
            };
            prove(model, functions, &signals, &[assign], 1_000_000)
        })
    }

    use BoolExpr::{And, Not, Or, Var};

    #[test]
    fn the_proof_rejects_a_wrong_assignment_with_a_counterexample() {
        let src = "input a, b\noutput y\ny = a & b\n";
        assert_eq!(proves(src, And(vec![Var(0), Var(1)])), Ok(()));
        assert_eq!(
            proves(src, Or(vec![Var(0), Var(1)])),
            Err(ExportError::Unproven {
                signal: "y".into(),
                detail: "it differs at a=0, b=1".into()
            })
        );
    }

    #[test]
    fn the_proof_allows_exactly_the_dont_cares() {
        // y is 1 on row 3 (a=1, b=1), free on row 1 (a=0, b=1), 0 elsewhere.
        let src = "input a, b\noutput y\ny = on(3) dc(1) over (a, b)\n";
        assert_eq!(proves(src, And(vec![Var(0), Var(1)])), Ok(()));
        assert_eq!(proves(src, Var(1)), Ok(()));
        assert!(proves(src, Var(0)).is_err(), "row 2 must be 0");
        assert!(proves(src, Not(Box::new(Var(0)))).is_err());
        // A `never` combination is free too.
        let src = "input a, b\noutput y\nnever a & !b\ny = a & b\n";
        assert_eq!(proves(src, Var(0)), Ok(()));
    }

    fn random_expr(r: &mut Rng, names: &[String], depth: u32) -> String {
        if depth == 0 || r.below(3) == 0 {
            return match r.below(12) {
                0 => "1".into(),
                1 => "0".into(),
                _ => names[r.below(names.len() as u64) as usize].clone(),
            };
        }
        let a = random_expr(r, names, depth - 1);
        let b = random_expr(r, names, depth - 1);
        match r.below(10) {
            0 => format!("!({a})"),
            1 => format!("({a}) & ({b})"),
            2 => format!("({a}) | ({b})"),
            3 => format!("({a}) ^ ({b})"),
            4 => format!("({a}) nand ({b})"),
            5 => format!("({a}) nor ({b})"),
            6 => format!("({a}) xnor ({b})"),
            7 => format!("({a}) == ({b})"),
            8 => format!("({a}) != ({b})"),
            _ => format!("({a}) => ({b})"),
        }
    }

    /// Random documents (intermediates, a table, a term list, a `never`)
    /// export in both languages, minimized and as written: the proof holds
    /// for every one of them.
    #[test]
    fn random_documents_export_with_a_proof() {
        let mut r = Rng(0x9e37_79b9_7f4a_7c15);
        for round in 0..150 {
            let inputs: Vec<String> = (0..5).map(|i| format!("i{i}")).collect();
            let mut src = format!("input {}\noutput o0, o1, o2, o3\n", inputs.join(", "));
            let mut known = inputs.clone();
            for k in 0..3 {
                let e = random_expr(&mut r, &known, 3);
                src.push_str(&format!("let w{k} = {e}\n"));
                known.push(format!("w{k}"));
            }
            if r.below(2) == 0 {
                src.push_str(&format!("never {}\n", random_expr(&mut r, &inputs, 2)));
            }
            let (p, q) = (
                &known[r.below(known.len() as u64) as usize],
                &known[r.below(known.len() as u64) as usize],
            );
            src.push_str(&format!(
                "table ({p}, {q} -> o0) {{\n  00 -> {}\n  01 -> -\n  1- -> {}\n}}\n",
                r.below(2),
                r.below(2)
            ));
            src.push_str(&format!(
                "o1 = on({}) dc({}) over (w0, i1, i2)\n",
                r.below(8),
                r.below(8)
            ));
            src.push_str(&format!("o2 = {}\n", random_expr(&mut r, &known, 4)));
            src.push_str(&format!("o3 = o2 ^ ({})\n", random_expr(&mut r, &known, 2)));
            for language in [Language::Verilog, Language::Vhdl] {
                for logic in [Logic::Minimized, Logic::AsWritten] {
                    let config = Config::default();
                    let options = Options {
                        language,
                        logic,
                        name: None,
                        stem: "random",
                        source: "random.imp",
                        command: "implica export",
                        config: &config,
                        work_per_signal: 10_000_000,
                    };
                    let result = with_doc(&src, |model, functions| {
                        export(&src, model, functions, &options)
                    });
                    if let Err(e) = result {
                        panic!("round {round}, {language:?}, {logic:?}: {e}\n{src}");
                    }
                }
            }
        }
    }
}
