//! Refactors: rewrites of one statement that a person asks for (a code
//! action at the cursor), not tied to any diagnostic.
//!
//! - **To a truth table** (`to-table`): `y = EXPR` (or `let y = EXPR`)
//!   becomes `table (n1, n2, ... -> y) { ... }` (`let table` for `let`) over
//!   the names the expression reads, in order of first appearance, one row
//!   per combination in counting order (the first name is the most
//!   significant), each output cell the expression's value. Offered for at
//!   most [`MAX_TABLE_NAMES`] names (64 rows), when the statement is the
//!   signal's only definition. A trailing comment of the definition moves
//!   to the table's `{` line; comments inside the expression become comment
//!   lines above the table. The table computes the same function of the
//!   same names, so the proof is [`fixes::verify`] and the refactor is
//!   [`Applicability::Safe`].
//! - **To a minimal expression** (`to-expression`): a term list definition,
//!   or a table (every output column: one definition per column, in column
//!   order, `let` kept for `let table`), becomes each column's minimal
//!   two-level form over the header's signals, using the list's or table's
//!   don't-cares and the form `implica.toml` prefers (`[minimize] form`,
//!   within its budget). Comments inside a table become comment lines above
//!   the definitions. The title says "not proven minimal" when the search
//!   stopped at its budget. Without don't-cares the function is the same
//!   (proof [`fixes::verify`], safe). With don't-cares (`dc(...)`, `-` output
//!   cells, rows missing or in conflict) the new text picks a value for
//!   each of them, which narrows the signal's freedom: then the proof is
//!   [`fixes::verify_narrowing`] (every signal's new value lies within its
//!   old interval wherever inputs can occur) and the refactor is
//!   [`Applicability::NeedsReview`].
//! - **To NAND only / NOR only** (`to-nand`, `to-nor`): an expression
//!   definition becomes the network `GateNetwork::from_expr` builds from
//!   gates of one kind, printed as a tree: a two-input gate as `a nand b`
//!   (`a nor b`), a wider gate as `!(a & b & c)` (`!(a | b | c)`), an
//!   inverter as `!a`, a two-input gate parenthesised wherever it is an
//!   operand (the words do not chain). A gate shared in the network is
//!   written at each of its readers. Not offered when the expression
//!   already has that form, reads more than [`MAX_GATE_NAMES`] names, or is
//!   a plain name or constant after folding. Same function: proof
//!   [`fixes::verify`], safe.
//! - **Inline an intermediate** (`inline-here` at a reference of `t`,
//!   `inline-everywhere` there or at `let t = EXPR`): references of `t` are
//!   replaced by its expression, in parentheses only where precedence
//!   needs them; `inline-everywhere` also deletes the `let` statement (its
//!   leading comment lines and a trailing comment stay in the file). Not
//!   offered when `t` is read by a table or `expect` header or a term
//!   list's `over (...)`, is on a cycle, has several definitions, is a table
//!   column or a term list, or when its definition has a comment inside.
//!   Same function for every signal that remains: proof [`fixes::verify`],
//!   safe.
//!
//! New statements are laid out as `implica fmt` lays out the statement on
//! its own (the text is formatted by [`implica_syntax::format`]), so the
//! alignment with neighbouring statements is left to `implica fmt`.
//! Nothing is offered for a statement with a syntax error in it.
//!
//! Architecture invariant: every refactor is applied to the text,
//! re-parsed and proven before it is offered; one whose proof fails is
//! withheld and described in [`Refactors::internal_errors`].

use crate::config::{Config, PreferredForm};
use crate::fixes;
use crate::functions::{DEFAULT_WORK_PER_DEFINITION, Functions};
use crate::model::{Body, Model, SignalId, SignalKind};
use crate::{Applicability, Edit, Fix};
use implica_logic::{BddRef, Effort, GateKind, GateNetwork};
use implica_syntax::ast::{
    BinOp, Comment, Expr, ExprKind, Item, ItemKind, OpToken, Rhs, RowKind, SmolStr, TermEntry,
};
use implica_syntax::{Span, SyntaxError};

/// Most names an expression may read to be written as a truth table.
pub const MAX_TABLE_NAMES: usize = 6;

/// Most names an expression may read to be rewritten with one gate kind.
pub const MAX_GATE_NAMES: usize = 16;

/// Largest gate tree (nodes, shared gates counted at every reader) that is
/// printed: sharing can make the tree exponential in the depth.
const MAX_GATE_TREE: usize = 4096;

/// The kinds of refactor.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum RefactorKind {
    /// An expression definition as a truth table.
    ToTable,
    /// A table or term list as minimal expressions.
    ToExpression,
    /// An expression with NAND gates only.
    ToNand,
    /// An expression with NOR gates only.
    ToNor,
    /// One reference of an intermediate replaced by its expression.
    InlineHere,
    /// Every reference of an intermediate replaced, its definition removed.
    InlineEverywhere,
}

impl RefactorKind {
    /// The stable kebab-case name, for clients that filter code actions.
    pub fn as_str(self) -> &'static str {
        match self {
            RefactorKind::ToTable => "to-table",
            RefactorKind::ToExpression => "to-expression",
            RefactorKind::ToNand => "to-nand",
            RefactorKind::ToNor => "to-nor",
            RefactorKind::InlineHere => "inline-here",
            RefactorKind::InlineEverywhere => "inline-everywhere",
        }
    }
}

/// One proven refactor: its kind and the edit that performs it.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Refactor {
    pub kind: RefactorKind,
    /// Title, applicability and edits (byte spans in the original text).
    pub fix: Fix,
}

/// What [`refactors_at`] found at one place.
#[derive(Debug, Clone, Default)]
pub struct Refactors {
    /// Proven refactors, in the order of [`RefactorKind`].
    pub offered: Vec<Refactor>,
    /// Refactors built but withheld because their proof failed, described:
    /// a bug here, never shown as an action.
    pub internal_errors: Vec<String>,
}

/// How a candidate is to be proven.
#[derive(Clone, Copy, PartialEq, Eq)]
enum Proof {
    /// Same function and freedom for every signal.
    Same,
    /// Freedom only narrowed.
    Narrowing,
}

struct Candidate {
    kind: RefactorKind,
    fix: Fix,
    proof: Proof,
}

/// The refactors offered for the statement under `at` (byte offsets into
/// `src`; any values are accepted), each proven.
pub fn refactors_at(src: &str, at: Span, config: &Config) -> Refactors {
    let (lo, hi) = (at.start.min(at.end), at.start.max(at.end));
    let at = Span::new(lo.min(src.len()), hi.min(src.len()));
    let (file, errors) = implica_syntax::parse(src);
    let model = Model::build(&file);
    let mut candidates = Vec::new();
    let mut internal_errors = Vec::new();
    let here = file
        .items
        .iter()
        .position(|it| it.span.start <= at.start && at.end <= it.span.end);
    if let Some(index) = here {
        let item = &file.items[index];
        if clean(item, &errors) {
            let mut push = |r: Option<Result<Candidate, String>>| match r {
                Some(Ok(c)) => candidates.push(c),
                Some(Err(e)) => internal_errors.push(e),
                None => {}
            };
            push(to_table(&model, index));
            push(to_expression(&model, index, config));
            push(to_gates(&model, index, GateKind::Nand));
            push(to_gates(&model, index, GateKind::Nor));
        }
    }
    candidates.extend(inline(src, &model, &errors, at, here));
    let mut offered = Vec::new();
    for c in candidates {
        let proven = match c.proof {
            Proof::Same => fixes::verify(src, &c.fix),
            Proof::Narrowing => fixes::verify_narrowing(src, &c.fix),
        };
        match proven {
            Ok(_) => offered.push(Refactor {
                kind: c.kind,
                fix: c.fix,
            }),
            Err(why) => internal_errors.push(format!(
                "{}: the refactor \"{}\" was withheld: {why}",
                c.kind.as_str(),
                c.fix.title
            )),
        }
    }
    Refactors {
        offered,
        internal_errors,
    }
}

/// Whether a statement parsed without any error in or at it.
fn clean(item: &Item, errors: &[SyntaxError]) -> bool {
    fn expr_ok(e: &Expr) -> bool {
        let mut stack = vec![e];
        while let Some(e) = stack.pop() {
            match &e.kind {
                ExprKind::Error => return false,
                ExprKind::Name(_) | ExprKind::Const(_) => {}
                ExprKind::Not { operand, .. } => stack.push(operand),
                ExprKind::Paren(inner) => stack.push(inner),
                ExprKind::Chain { operands, ops } => {
                    if operands.len() != ops.len() + 1 {
                        return false;
                    }
                    stack.extend(operands);
                }
            }
        }
        true
    }
    let touched = errors
        .iter()
        .any(|e| e.span.start <= item.span.end && item.span.start <= e.span.end);
    let nodes_ok = match &item.kind {
        ItemKind::Error => false,
        ItemKind::Define(d) => match &d.rhs {
            Rhs::Expr(e) => expr_ok(e),
            Rhs::Terms(t) => t.parts.iter().flat_map(|p| &p.entries).all(|e| match e {
                TermEntry::Single(n) => n.value.is_some(),
                TermEntry::Range(a, b) => a.value.is_some() && b.value.is_some(),
            }),
        },
        ItemKind::Never(e) | ItemKind::Assert(e) => expr_ok(e),
        ItemKind::Table(t) | ItemKind::Expect(t) => t.rows.iter().all(|r| r.kind != RowKind::Error),
        ItemKind::Input(_) | ItemKind::Output(_) => true,
    };
    !touched && nodes_ok
}

fn on_cycle(model: &Model, s: SignalId) -> bool {
    model.cycles.iter().any(|c| c.contains(&s))
}

/// The signal a statement defines at `target` when that definition is its
/// only one, off every cycle, and of the kind its `let` says.
fn sole_definition<'m, 'f>(
    model: &'m Model<'f>,
    index: usize,
    target: Span,
) -> Option<&'m crate::model::Definition<'f>> {
    let def = model
        .definitions
        .iter()
        .find(|d| d.item == index && d.target == target)?;
    let sig = &model.signals[def.signal];
    let kind_fits = if def.is_let {
        sig.kind == SignalKind::Intermediate
    } else {
        sig.kind == SignalKind::Output
    };
    (sig.definitions.len() == 1 && kind_fits && !on_cycle(model, def.signal)).then_some(def)
}

/// `text` in the canonical layout of a statement on its own, without the
/// final line break.
fn canonical(text: &str) -> Result<String, String> {
    match implica_syntax::format::format_source(text) {
        Ok(t) => Ok(t.trim_end_matches('\n').to_string()),
        Err(e) => Err(format!(
            "the new statement does not parse: {}",
            e.first().map_or(String::new(), |e| e.message.clone())
        )),
    }
}

/// Comment lines to put above a new statement, one a line.
fn comment_lines(comments: &mut Vec<&Comment>) -> String {
    comments.sort_by_key(|c| c.span.start);
    comments.dedup_by_key(|c| c.span);
    comments.iter().map(|c| format!("{}\n", c.text)).collect()
}

fn to_table(model: &Model, index: usize) -> Option<Result<Candidate, String>> {
    let item = &model.file.items[index];
    let ItemKind::Define(d) = &item.kind else {
        return None;
    };
    let Rhs::Expr(e) = &d.rhs else {
        return None;
    };
    sole_definition(model, index, d.target.span)?;
    let mut names: Vec<SmolStr> = Vec::new();
    let value = crate::forms::to_bool_expr(e, &mut names)?;
    if names.len() > MAX_TABLE_NAMES || names.contains(&d.target.text) {
        return None;
    }
    let k = names.len();
    let mut text = comment_lines(&mut item.trivia.interior().iter().collect());
    let kw = if d.let_span.is_some() {
        "let table"
    } else {
        "table"
    };
    let ins: Vec<&str> = names.iter().map(SmolStr::as_str).collect();
    let sep = if k == 0 { "" } else { " " };
    text.push_str(&format!(
        "{kw} ({}{sep}-> {}) {{",
        ins.join(", "),
        d.target.text
    ));
    // The definition's trailing comment describes the signal: it goes with
    // the table's head, where the formatter keeps it.
    let trailing = item.trivia.trailing();
    if let Some(c) = trailing {
        text.push_str(&format!("  {}", c.text));
    }
    text.push('\n');
    let mut vals = vec![false; k];
    for row in 0..1usize << k {
        let mut cells = Vec::with_capacity(k);
        for (j, v) in vals.iter_mut().enumerate() {
            *v = (row >> (k - 1 - j)) & 1 == 1;
            cells.push(if *v { "1" } else { "0" });
        }
        let out = if value.eval(&vals) { 1 } else { 0 };
        text.push_str(&format!("  {} -> {out}\n", cells.join(" ")));
    }
    text.push_str("}\n");
    let end = trailing.map_or(item.span.end, |c| c.span.end);
    Some(canonical(&text).map(|new_text| Candidate {
        kind: RefactorKind::ToTable,
        fix: Fix {
            title: format!("Write `{}` as a truth table", d.target.text),
            applicability: Applicability::Safe,
            edits: vec![Edit {
                span: Span::new(item.span.start, end),
                new_text,
            }],
        },
        proof: Proof::Same,
    }))
}

fn to_expression(
    model: &Model,
    index: usize,
    config: &Config,
) -> Option<Result<Candidate, String>> {
    let item = &model.file.items[index];
    let (targets, is_let, mut comments): (Vec<Span>, bool, Vec<&Comment>) = match &item.kind {
        ItemKind::Define(d) if matches!(d.rhs, Rhs::Terms(_)) => {
            (vec![d.target.span], d.let_span.is_some(), Vec::new())
        }
        ItemKind::Table(t) => {
            let mut cs: Vec<&Comment> = t.open_comment.iter().collect();
            for r in &t.rows {
                cs.extend(r.trivia.leading().iter().map(|(_, c)| c));
                cs.extend(r.trivia.trailing());
            }
            cs.extend(t.closing_comments.iter().map(|(_, c)| c));
            (
                t.outputs.iter().map(|n| n.span).collect(),
                t.let_span.is_some(),
                cs,
            )
        }
        _ => return None,
    };
    if targets.is_empty() {
        return None;
    }
    comments.extend(item.trivia.interior());
    let defs = targets
        .iter()
        .map(|&t| sole_definition(model, index, t))
        .collect::<Option<Vec<_>>>()?;
    let mut functions = Functions::compute(model, DEFAULT_WORK_PER_DEFINITION, None).ok()?;
    let mut effort = Effort::new(50_000_000);
    let (mut free, mut proven) = (false, true);
    let mut lines = Vec::new();
    for def in &defs {
        let header = def.body.header()?;
        let local = functions
            .listed_over_header(def.body, &mut effort)
            .ok()?
            .ok()?;
        free |= local.dc != BddRef::FALSE;
        let (sop, pos) = match config.form {
            PreferredForm::Sop => (true, false),
            PreferredForm::Pos => (false, true),
            PreferredForm::Either => (true, true),
        };
        let forms =
            crate::minimal::forms_of(&mut functions, local, sop, pos, &config.budget, &mut effort)
                .ok()?;
        let form = match (
            forms.sop.and_then(Result::ok),
            forms.pos.and_then(Result::ok),
        ) {
            (Some(s), Some(p)) => {
                if p.literals < s.literals {
                    p
                } else {
                    s
                }
            }
            (Some(f), None) | (None, Some(f)) => f,
            (None, None) => return None,
        };
        proven &= form.proven_minimal;
        let name = |i: usize| {
            header
                .get(i)
                .map_or_else(String::new, |n| n.text.to_string())
        };
        let head = if is_let { "let " } else { "" };
        let signal = &model.signals[def.signal].name;
        lines.push(format!(
            "{head}{signal} = {}",
            form.expression.to_text(&name)
        ));
    }
    let mut text = comment_lines(&mut comments);
    for l in &lines {
        text.push_str(l);
        text.push('\n');
    }
    let names: Vec<String> = defs
        .iter()
        .map(|d| format!("`{}`", model.signals[d.signal].name))
        .collect();
    let mut title = match &item.kind {
        ItemKind::Table(_) => format!(
            "Replace the table by minimal expressions of {}",
            names.join(", ")
        ),
        _ => format!("Write {} as a minimal expression", names.join(", ")),
    };
    if free {
        title.push_str(", choosing values for its don't-cares");
    }
    if !proven {
        title.push_str(" (not proven minimal)");
    }
    Some(canonical(&text).map(|new_text| Candidate {
        kind: RefactorKind::ToExpression,
        fix: Fix {
            title,
            applicability: if free {
                Applicability::NeedsReview
            } else {
                Applicability::Safe
            },
            edits: vec![Edit {
                span: item.span,
                new_text,
            }],
        },
        proof: if free { Proof::Narrowing } else { Proof::Same },
    }))
}

fn strip(e: &Expr) -> &Expr {
    match &e.kind {
        ExprKind::Paren(inner) => strip(inner),
        _ => e,
    }
}

/// Whether the expression is already written with `kind` gates only: names,
/// constants, `!x`, two-input `nand` (`nor`), and `!(x & y & ...)`
/// (`!(x | y | ...)`).
fn in_gate_form(e: &Expr, kind: GateKind) -> bool {
    let (word, wide) = match kind {
        GateKind::Nand => (BinOp::Nand, BinOp::And),
        GateKind::Nor => (BinOp::Nor, BinOp::Or),
    };
    let mut stack = vec![e];
    while let Some(e) = stack.pop() {
        match &strip(e).kind {
            ExprKind::Name(_) | ExprKind::Const(_) => {}
            ExprKind::Not { operand, .. } => match &strip(operand).kind {
                ExprKind::Chain { operands, ops } if ops.iter().all(|o| o.op == wide) => {
                    stack.extend(operands);
                }
                _ => stack.push(operand),
            },
            ExprKind::Chain { operands, ops } if ops.len() == 1 && ops[0].op == word => {
                stack.extend(operands);
            }
            _ => return false,
        }
    }
    true
}

/// The network as Implica text, built in gate order (a gate reads only
/// earlier ones), each gate's text kept with whether it is a two-input
/// gate, which needs parentheses wherever it is an operand.
fn gate_text(net: &GateNetwork, names: &[SmolStr], kind: GateKind) -> String {
    use implica_logic::Signal as Wire;
    let (word, op) = match kind {
        GateKind::Nand => ("nand", " & "),
        GateKind::Nor => ("nor", " | "),
    };
    let mut texts: Vec<(String, bool)> = Vec::with_capacity(net.gates().len());
    let wire = |s: &Wire, texts: &[(String, bool)]| -> (String, bool) {
        match *s {
            Wire::Const(b) => (if b { "1" } else { "0" }.to_string(), false),
            Wire::Input(i) => (
                names.get(i).map_or_else(String::new, |n| n.to_string()),
                false,
            ),
            Wire::Gate(j) => texts.get(j).cloned().unwrap_or_default(),
        }
    };
    let operand = |(t, binary): (String, bool)| if binary { format!("({t})") } else { t };
    for g in net.gates() {
        let ins: Vec<(String, bool)> = g.inputs.iter().map(|s| wire(s, &texts)).collect();
        let text = match ins.len() {
            1 => (format!("!{}", operand(ins[0].clone())), false),
            2 => {
                let mut it = ins.into_iter().map(operand);
                let (a, b) = (it.next().unwrap_or_default(), it.next().unwrap_or_default());
                (format!("{a} {word} {b}"), true)
            }
            _ => {
                let parts: Vec<String> = ins.into_iter().map(operand).collect();
                (format!("!({})", parts.join(op)), false)
            }
        };
        texts.push(text);
    }
    wire(&net.output(), &texts).0
}

fn to_gates(model: &Model, index: usize, kind: GateKind) -> Option<Result<Candidate, String>> {
    let item = &model.file.items[index];
    let ItemKind::Define(d) = &item.kind else {
        return None;
    };
    let Rhs::Expr(e) = &d.rhs else {
        return None;
    };
    let def = model
        .definitions
        .iter()
        .find(|x| x.item == index && x.target == d.target.span)?;
    if model.signals[def.signal].definitions.len() != 1 || in_gate_form(e, kind) {
        return None;
    }
    let mut names = Vec::new();
    let value = crate::forms::to_bool_expr(e, &mut names)?;
    if names.len() > MAX_GATE_NAMES {
        return None;
    }
    let net = GateNetwork::from_expr(&value, kind);
    if net.gates().is_empty() || net.to_expr(MAX_GATE_TREE).is_err() {
        return None;
    }
    let written = gate_text(&net, &names, kind);
    let mut text = comment_lines(&mut item.trivia.interior().iter().collect());
    let head = match d.let_span {
        Some(_) => format!("let {}", d.target.text),
        None => d.target.text.to_string(),
    };
    text.push_str(&format!("{head} = {written}\n"));
    let (refactor, what) = match kind {
        GateKind::Nand => (RefactorKind::ToNand, "NAND"),
        GateKind::Nor => (RefactorKind::ToNor, "NOR"),
    };
    Some(canonical(&text).map(|new_text| Candidate {
        kind: refactor,
        fix: Fix {
            title: format!("Rewrite `{}` with {what} only", d.target.text),
            applicability: Applicability::Safe,
            edits: vec![Edit {
                span: item.span,
                new_text,
            }],
        },
        proof: Proof::Same,
    }))
}

/// Where a name stands in an expression: what the text replacing it must
/// fit into.
#[derive(Clone, Copy)]
enum Place<'e> {
    /// The whole expression, or inside parentheses.
    Loose,
    /// The operand of `!` or `not`.
    Negated,
    /// An operand of a chain of these operators.
    Operand(&'e [OpToken]),
}

/// The place of the name whose span is `span` in `e`, if it is there.
fn place_of(e: &Expr, span: Span) -> Option<Place<'_>> {
    let mut stack = vec![(e, Place::Loose)];
    while let Some((e, place)) = stack.pop() {
        if e.span.start > span.start || span.end > e.span.end {
            continue;
        }
        match &e.kind {
            ExprKind::Name(n) if n.span == span => return Some(place),
            ExprKind::Name(_) | ExprKind::Const(_) | ExprKind::Error => {}
            ExprKind::Not { operand, .. } => stack.push((operand, Place::Negated)),
            ExprKind::Paren(inner) => stack.push((inner, Place::Loose)),
            ExprKind::Chain { operands, ops } => {
                stack.extend(operands.iter().map(|o| (o, Place::Operand(ops))));
            }
        }
    }
    None
}

/// Whether `e` written at `place` needs parentheses to keep its grouping.
fn needs_parens(e: &Expr, place: Place) -> bool {
    let ExprKind::Chain { ops, .. } = &e.kind else {
        // A name, constant, negation or parenthesised expression is one
        // operand wherever it stands.
        return false;
    };
    match place {
        Place::Loose => false,
        Place::Negated => true,
        Place::Operand(outer) => {
            let (Some(mine), Some(theirs)) = (ops.first(), outer.first()) else {
                return true;
            };
            if mine.op.precedence() > theirs.op.precedence() {
                return false;
            }
            // One associative operator throughout: the grouping does not
            // matter.
            let op = mine.op;
            !(matches!(op, BinOp::And | BinOp::Or | BinOp::Xor)
                && ops.iter().chain(outer).all(|o| o.op == op))
        }
    }
}

/// The expression an intermediate can be inlined from: its only
/// definition, an expression, in a statement without errors or comments
/// inside, off every cycle.
fn inlinable<'f>(
    model: &Model<'f>,
    errors: &[SyntaxError],
    t: SignalId,
) -> Option<(&'f Expr, Span)> {
    let sig = &model.signals[t];
    if sig.kind != SignalKind::Intermediate || sig.definitions.len() != 1 || on_cycle(model, t) {
        return None;
    }
    let def = model.definition_of(t)?;
    let Body::Expr(e) = def.body else {
        return None;
    };
    let item = &model.file.items[def.item];
    if !def.is_let || !clean(item, errors) || !item.trivia.interior().is_empty() {
        return None;
    }
    Some((e, item.span))
}

/// The edit that replaces the reference at `r` by `e`, when `r` is a name
/// in an expression that can take one there.
fn inline_edit(
    model: &Model,
    errors: &[SyntaxError],
    e: &Expr,
    text: &str,
    r: Span,
) -> Option<Edit> {
    let item = model
        .file
        .items
        .iter()
        .find(|it| it.span.start <= r.start && r.end <= it.span.end)?;
    if !clean(item, errors) {
        return None;
    }
    let host = match &item.kind {
        ItemKind::Define(d) => match &d.rhs {
            Rhs::Expr(x) => x,
            Rhs::Terms(_) => return None,
        },
        ItemKind::Never(x) | ItemKind::Assert(x) => x,
        _ => return None,
    };
    let place = place_of(host, r)?;
    let new_text = if needs_parens(e, place) {
        format!("({text})")
    } else {
        text.to_string()
    };
    Some(Edit { span: r, new_text })
}

fn inline(
    src: &str,
    model: &Model,
    errors: &[SyntaxError],
    at: Span,
    here: Option<usize>,
) -> Vec<Candidate> {
    let mut out = Vec::new();
    // A reference under the cursor, else the `let` statement under it.
    let reference = model.signals.iter().enumerate().find_map(|(s, sig)| {
        sig.references
            .iter()
            .find(|r| r.start <= at.start && at.end <= r.end)
            .map(|&r| (s, Some(r)))
    });
    let target = reference.or_else(|| {
        let item = &model.file.items[here?];
        let ItemKind::Define(d) = &item.kind else {
            return None;
        };
        d.let_span?;
        Some((model.signal(&d.target.text)?, None))
    });
    let Some((t, at_ref)) = target else {
        return out;
    };
    let Some((e, def_span)) = inlinable(model, errors, t) else {
        return out;
    };
    let name = &model.signals[t].name;
    let text = implica_syntax::format::expr(e);
    if let Some(r) = at_ref {
        let Some(edit) = inline_edit(model, errors, e, &text, r) else {
            return out;
        };
        out.push(Candidate {
            kind: RefactorKind::InlineHere,
            fix: Fix {
                title: format!("Inline `{name}` here"),
                applicability: Applicability::Safe,
                edits: vec![edit],
            },
            proof: Proof::Same,
        });
    }
    let refs = &model.signals[t].references;
    if refs.is_empty() {
        return out;
    }
    let Some(mut edits) = refs
        .iter()
        .map(|&r| inline_edit(model, errors, e, &text, r))
        .collect::<Option<Vec<Edit>>>()
    else {
        return out;
    };
    edits.push(Edit {
        span: crate::rules::statement_line(src, def_span),
        new_text: String::new(),
    });
    out.push(Candidate {
        kind: RefactorKind::InlineEverywhere,
        fix: Fix {
            title: format!("Inline `{name}` everywhere and remove its definition"),
            applicability: Applicability::Safe,
            edits,
        },
        proof: Proof::Same,
    });
    out
}
