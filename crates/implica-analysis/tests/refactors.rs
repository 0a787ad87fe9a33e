//! Refactors (`refactors::refactors_at`): exact results on small documents,
//! where each must and must not be offered, and for every refactor offered
//! anywhere (hand-written cases, the examples, generated programs) a check
//! by brute force: the new text parses, its new statements are in the
//! canonical layout, and every signal keeps its value on every input
//! combination that can occur, wherever the original fixed it. The values
//! come from evaluating the syntax tree directly in three-valued logic
//! (0, 1, free), sharing no code with the analysis that proved them.

use implica_analysis::config::Config;
use implica_analysis::refactors::{Refactor, RefactorKind, refactors_at};
use implica_analysis::{Applicability, fixes};
use implica_syntax::Span;
use implica_syntax::ast::{
    BinOp, CellValue, Expr, ExprKind, ItemKind, Rhs, RowKind, SourceFile, Table, TermEntry,
    TermKind, TermList,
};
use proptest::prelude::*;
use std::collections::HashMap;
use std::path::Path;

// ---------------------------------------------------------------------------
// The brute-force evaluator: `None` is a free value.

type V = Option<bool>;

enum Def<'a> {
    Expr(&'a Expr),
    Terms(&'a TermList),
    Column(&'a Table, usize),
}

struct Doc<'a> {
    inputs: Vec<String>,
    defs: HashMap<String, Def<'a>>,
    never: Vec<&'a Expr>,
    /// Definitions being evaluated: a cycle evaluates to free.
    depth: std::cell::Cell<usize>,
}

impl<'a> Doc<'a> {
    fn new(file: &'a SourceFile) -> Doc<'a> {
        let mut doc = Doc {
            inputs: Vec::new(),
            defs: HashMap::new(),
            never: Vec::new(),
            depth: Default::default(),
        };
        for item in &file.items {
            match &item.kind {
                ItemKind::Input(d) => doc
                    .inputs
                    .extend(d.names.iter().map(|n| n.text.to_string())),
                ItemKind::Define(d) => {
                    let def = match &d.rhs {
                        Rhs::Expr(e) => Def::Expr(e),
                        Rhs::Terms(t) => Def::Terms(t),
                    };
                    doc.defs.entry(d.target.text.to_string()).or_insert(def);
                }
                ItemKind::Table(t) => {
                    for (i, o) in t.outputs.iter().enumerate() {
                        doc.defs
                            .entry(o.text.to_string())
                            .or_insert(Def::Column(t, i));
                    }
                }
                ItemKind::Never(e) => doc.never.push(e),
                _ => {}
            }
        }
        doc
    }

    fn value(&self, name: &str, env: &HashMap<String, bool>) -> V {
        if let Some(&v) = env.get(name) {
            return Some(v);
        }
        if self.depth.get() > 64 {
            return None;
        }
        self.depth.set(self.depth.get() + 1);
        let v = self.defined(name, env);
        self.depth.set(self.depth.get() - 1);
        v
    }

    fn defined(&self, name: &str, env: &HashMap<String, bool>) -> V {
        match self.defs.get(name)? {
            Def::Expr(e) => self.eval(e, env),
            Def::Terms(t) => {
                let over: Vec<V> = t.over.iter().map(|n| self.value(&n.text, env)).collect();
                each_completion(&over, |row| terms_row(t, row))
            }
            Def::Column(t, c) => {
                let over: Vec<V> = t.inputs.iter().map(|n| self.value(&n.text, env)).collect();
                each_completion(&over, |row| table_row(t, *c, row))
            }
        }
    }

    fn eval(&self, e: &Expr, env: &HashMap<String, bool>) -> V {
        match &e.kind {
            ExprKind::Name(n) => self.value(&n.text, env),
            ExprKind::Const(b) => Some(*b),
            ExprKind::Not { operand, .. } => self.eval(operand, env).map(|v| !v),
            ExprKind::Paren(inner) => self.eval(inner, env),
            ExprKind::Chain { operands, ops } => {
                let vals: Vec<V> = operands.iter().map(|o| self.eval(o, env)).collect();
                if ops.iter().all(|o| o.op == BinOp::Implies) {
                    let mut it = vals.into_iter().rev();
                    let mut acc = it.next().unwrap();
                    for v in it {
                        acc = or(v.map(|v| !v), acc);
                    }
                    return acc;
                }
                let mut acc = vals[0];
                for (op, &v) in ops.iter().zip(&vals[1..]) {
                    acc = match op.op {
                        BinOp::And => and(acc, v),
                        BinOp::Nand => and(acc, v).map(|x| !x),
                        BinOp::Or => or(acc, v),
                        BinOp::Nor => or(acc, v).map(|x| !x),
                        BinOp::Xor | BinOp::Ne => acc.zip(v).map(|(a, b)| a ^ b),
                        BinOp::Xnor | BinOp::Eq => acc.zip(v).map(|(a, b)| a == b),
                        BinOp::Implies => unreachable!("a chain has one level"),
                    };
                }
                acc
            }
            ExprKind::Error => None,
        }
    }
}

fn and(a: V, b: V) -> V {
    match (a, b) {
        (Some(false), _) | (_, Some(false)) => Some(false),
        (Some(true), Some(true)) => Some(true),
        _ => None,
    }
}

fn or(a: V, b: V) -> V {
    and(a.map(|x| !x), b.map(|x| !x)).map(|x| !x)
}

/// The value over every completion of the free header values: the common
/// value, or free when they differ.
fn each_completion(over: &[V], row: impl Fn(&[bool]) -> V) -> V {
    let free: Vec<usize> = (0..over.len()).filter(|&i| over[i].is_none()).collect();
    let mut seen: Option<V> = None;
    for m in 0..1usize << free.len() {
        let mut vals: Vec<bool> = over.iter().map(|v| v.unwrap_or(false)).collect();
        for (k, &i) in free.iter().enumerate() {
            vals[i] = (m >> k) & 1 == 1;
        }
        let v = row(&vals);
        match seen {
            None => seen = Some(v),
            Some(s) if s != v => return None,
            Some(_) => {}
        }
    }
    seen.flatten()
}

fn terms_row(t: &TermList, vals: &[bool]) -> V {
    let row = vals.iter().fold(0u64, |acc, &b| acc << 1 | u64::from(b));
    let listed = |kind: TermKind| {
        t.parts.iter().filter(|p| p.kind == kind).any(|p| {
            p.entries.iter().any(|e| match e {
                TermEntry::Single(n) => n.value == Some(row),
                TermEntry::Range(a, b) => a.value <= Some(row) && Some(row) <= b.value,
            })
        })
    };
    if listed(TermKind::Dc) {
        return None;
    }
    if t.parts.iter().any(|p| p.kind == TermKind::On) {
        Some(listed(TermKind::On))
    } else {
        Some(!listed(TermKind::Off))
    }
}

fn table_row(t: &Table, column: usize, vals: &[bool]) -> V {
    let (mut ones, mut zeros, mut matched) = (false, false, false);
    let mut unlisted = None;
    for r in &t.rows {
        match &r.kind {
            RowKind::Cells { inputs, outputs } => {
                let hit = inputs.iter().zip(vals).all(|(c, &v)| match c.value {
                    CellValue::Dash => true,
                    CellValue::One => v,
                    CellValue::Zero => !v,
                });
                if hit {
                    matched = true;
                    match outputs[column].value {
                        CellValue::One => ones = true,
                        CellValue::Zero => zeros = true,
                        CellValue::Dash => {}
                    }
                }
            }
            RowKind::Unlisted { outputs } => unlisted = Some(outputs[column].value),
            RowKind::Error => {}
        }
    }
    if !matched {
        match unlisted {
            Some(CellValue::One) => ones = true,
            Some(CellValue::Zero) => zeros = true,
            _ => {}
        }
    }
    match (ones, zeros) {
        (true, false) => Some(true),
        (false, true) => Some(false),
        _ => None,
    }
}

/// Every signal the original fixes on a combination that can occur keeps
/// that value; with `exact`, no signal defined before may become free
/// where it was fixed either (the same check, stated for the message).
fn same_values(before: &str, after: &str) -> Result<(), String> {
    let (f1, e1) = implica_syntax::parse(before);
    let (f2, e2) = implica_syntax::parse(after);
    if e2.len() > e1.len() {
        return Err(format!("does not parse: {:?}", e2[0].message));
    }
    let (d1, d2) = (Doc::new(&f1), Doc::new(&f2));
    if d1.inputs != d2.inputs {
        return Err("the inputs changed".to_string());
    }
    let n = d1.inputs.len();
    assert!(n <= 12, "too many inputs for the brute force");
    for m in 0..1usize << n {
        let env: HashMap<String, bool> = d1
            .inputs
            .iter()
            .enumerate()
            .map(|(i, name)| (name.clone(), (m >> (n - 1 - i)) & 1 == 1))
            .collect();
        if d1.never.iter().any(|e| d1.eval(e, &env) != Some(false)) {
            continue;
        }
        for name in d1.defs.keys() {
            let old = d1.value(name, &env);
            if old.is_none() {
                continue;
            }
            // An intermediate may go (inlined); an output must stay.
            if !d2.defs.contains_key(name) {
                if f1.items.iter().any(|it| matches!(&it.kind, ItemKind::Output(d) if d.names.iter().any(|x| x.text == name.as_str()))) {
                    return Err(format!("`{name}` is no longer defined"));
                }
                continue;
            }
            let new = d2.value(name, &env);
            if new != old {
                return Err(format!("`{name}` is {new:?} instead of {old:?} on row {m}"));
            }
        }
    }
    Ok(())
}

// ---------------------------------------------------------------------------
// Checks of one refactor.

fn apply(src: &str, r: &Refactor) -> String {
    fixes::apply(src, &r.fix.edits).expect("the edits apply")
}

/// Everything every offered refactor must satisfy.
fn check_refactor(src: &str, r: &Refactor) {
    let after = apply(src, r);
    let (_, before_errors) = implica_syntax::parse(src);
    let (_, errors) = implica_syntax::parse(&after);
    assert!(
        errors.len() <= before_errors.len(),
        "{}: {:?}\n{after}",
        r.kind.as_str(),
        errors
    );
    if let Err(e) = same_values(src, &after) {
        panic!(
            "{} ({}): {e}\n{src}\n---\n{after}",
            r.kind.as_str(),
            r.fix.title
        );
    }
    // Statement rewrites are laid out as the formatter lays them out.
    if !matches!(
        r.kind,
        RefactorKind::InlineHere | RefactorKind::InlineEverywhere
    ) {
        for e in &r.fix.edits {
            let formatted = implica_syntax::format::format_source(&e.new_text).expect("parses");
            assert_eq!(
                formatted,
                format!("{}\n", e.new_text),
                "{}",
                r.kind.as_str()
            );
        }
    }
}

fn config() -> Config {
    Config::default()
}

/// The refactors at the first occurrence of `needle`, checked, with no
/// internal error.
fn at(src: &str, needle: &str) -> Vec<Refactor> {
    let start = src
        .find(needle)
        .unwrap_or_else(|| panic!("{needle} not in the text"));
    let found = refactors_at(src, Span::new(start, start), &config());
    assert!(
        found.internal_errors.is_empty(),
        "{:?}",
        found.internal_errors
    );
    for r in &found.offered {
        check_refactor(src, r);
    }
    found.offered
}

fn kinds(rs: &[Refactor]) -> Vec<&'static str> {
    rs.iter().map(|r| r.kind.as_str()).collect()
}

fn result_of(src: &str, needle: &str, kind: RefactorKind) -> (String, Refactor) {
    let rs = at(src, needle);
    let r = rs
        .iter()
        .find(|r| r.kind == kind)
        .unwrap_or_else(|| panic!("{kind:?} not offered at {needle}: {:?}", kinds(&rs)))
        .clone();
    (apply(src, &r), r)
}

/// Every refactor offered at every statement and every name of `src`.
fn check_everywhere(src: &str) -> usize {
    let (file, _) = implica_syntax::parse(src);
    let mut places: Vec<Span> = file.items.iter().map(|it| it.span).collect();
    for item in &file.items {
        let mut names = Vec::new();
        let mut visit = |e: &Expr| {
            let mut stack = vec![e];
            while let Some(e) = stack.pop() {
                match &e.kind {
                    ExprKind::Name(n) => names.push(n.span),
                    ExprKind::Not { operand, .. } => stack.push(operand),
                    ExprKind::Paren(inner) => stack.push(inner),
                    ExprKind::Chain { operands, .. } => stack.extend(operands),
                    _ => {}
                }
            }
        };
        match &item.kind {
            ItemKind::Define(d) => {
                if let Rhs::Expr(e) = &d.rhs {
                    visit(e);
                }
            }
            ItemKind::Never(e) | ItemKind::Assert(e) => visit(e),
            _ => {}
        }
        places.extend(names);
    }
    let mut count = 0;
    for p in places {
        let found = refactors_at(src, p, &config());
        assert!(
            found.internal_errors.is_empty(),
            "{:?}\n{src}",
            found.internal_errors
        );
        for r in &found.offered {
            check_refactor(src, r);
            count += 1;
        }
    }
    count
}

// ---------------------------------------------------------------------------
// To a truth table.

const VENTS: &str = "\
input  hot, rain, storm
output vent

# Open the roof vent when it is hot, unless it rains or storms.
vent = hot & !(rain | storm)  # the storm beats everything
";

#[test]
fn an_expression_becomes_a_table_in_counting_order() {
    let (after, r) = result_of(VENTS, "vent =", RefactorKind::ToTable);
    assert_eq!(r.fix.applicability, Applicability::Safe);
    assert_eq!(
        after,
        "\
input  hot, rain, storm
output vent

# Open the roof vent when it is hot, unless it rains or storms.
table (hot, rain, storm -> vent) {  # the storm beats everything
  0 0 0 -> 0
  0 0 1 -> 0
  0 1 0 -> 0
  0 1 1 -> 0
  1 0 0 -> 1
  1 0 1 -> 0
  1 1 0 -> 0
  1 1 1 -> 0
}
"
    );
}

#[test]
fn a_let_becomes_a_let_table_and_a_constant_a_table_without_inputs() {
    let src = "input a, b\noutput y\nlet t = b ^ a\ny = t | 0\nlet k = 1\n";
    let (after, _) = result_of(src, "let t", RefactorKind::ToTable);
    assert_eq!(
        after,
        "input a, b\noutput y\nlet table (b, a -> t) {\n  0 0 -> 0\n  0 1 -> 1\n  1 0 -> 1\n  1 1 -> 0\n}\ny = t | 0\nlet k = 1\n"
    );
    let (after, _) = result_of(src, "let k", RefactorKind::ToTable);
    assert!(
        after.ends_with("let table (-> k) {\n  -> 1\n}\n"),
        "{after}"
    );
}

#[test]
fn no_table_past_six_names_nor_for_a_signal_defined_twice_nor_with_errors() {
    let wide = "input a, b, c, d, e, f, g\noutput y\ny = a & b & c & d & e & f & g\n";
    assert!(!kinds(&at(wide, "y =")).contains(&"to-table"));
    let six = "input a, b, c, d, e, f\noutput y\ny = a & b & c & d & e & f\n";
    assert!(kinds(&at(six, "y =")).contains(&"to-table"));
    let twice = "input a\noutput y\ny = a\ny = !a\n";
    assert!(at(twice, "y = a").is_empty());
    let broken = "input a\noutput y\ny = a &\n";
    assert!(at(broken, "y =").is_empty());
    let cyclic = "input a\noutput y\ny = a & z\nlet z = y\n";
    assert!(!kinds(&at(cyclic, "y =")).contains(&"to-table"));
}

// ---------------------------------------------------------------------------
// To a minimal expression.

#[test]
fn a_table_becomes_one_definition_per_column_with_its_comments() {
    let src = "\
input  hot, cold, humid
output fan_fast, fan_slow

table (hot, cold, humid -> fan_fast, fan_slow) {  # circulation fan
  # Hot air is stirred hard.
  1--      -> 10  # whatever the humidity
  001      -> 01  # mild and humid
  unlisted -> 00
}
";
    let (after, r) = result_of(src, "table", RefactorKind::ToExpression);
    assert_eq!(r.fix.applicability, Applicability::Safe);
    assert_eq!(
        r.fix.title,
        "Replace the table by minimal expressions of `fan_fast`, `fan_slow`"
    );
    assert_eq!(
        after,
        "\
input  hot, cold, humid
output fan_fast, fan_slow

# circulation fan
# Hot air is stirred hard.
# whatever the humidity
# mild and humid
fan_fast = hot
fan_slow = !hot & !cold & humid
"
    );
}

#[test]
fn a_term_list_with_dont_cares_is_minimized_for_review() {
    let src = "\
input  b3, b2, b1, b0
output seg_e

# The lower left stroke of a kiosk digit; codes 10 to 15 never come.
seg_e = on(0, 2, 6, 8) dc(10..15) over (b3, b2, b1, b0)  # even shapes
";
    let (after, r) = result_of(src, "seg_e =", RefactorKind::ToExpression);
    assert_eq!(r.fix.applicability, Applicability::NeedsReview);
    assert_eq!(
        r.fix.title,
        "Write `seg_e` as a minimal expression, choosing values for its don't-cares"
    );
    assert!(
        after.ends_with("seg_e = (!b2 | b1) & !b0  # even shapes\n"),
        "{after}"
    );
}

#[test]
fn the_preferred_form_is_used_and_a_let_table_keeps_let() {
    let src = "input a, b, c\noutput y\nlet table (a, b, c -> t) {\n  1-- -> 1\n  -1- -> 1\n  unlisted -> 0\n}\ny = t & c\n";
    let mut pos = config();
    pos.form = implica_analysis::config::PreferredForm::Pos;
    let start = src.find("let table").unwrap();
    let found = refactors_at(src, Span::new(start, start + 3), &pos);
    assert!(found.internal_errors.is_empty());
    let r = found
        .offered
        .iter()
        .find(|r| r.kind == RefactorKind::ToExpression)
        .unwrap();
    check_refactor(src, r);
    assert_eq!(r.fix.edits[0].new_text, "let t = a | b");
}

#[test]
fn no_expression_for_an_expression_or_a_broken_table() {
    assert!(!kinds(&at(VENTS, "vent =")).contains(&"to-expression"));
    let broken = "input a\noutput y\ntable (a -> y) {\n  1 -> 1\n  0 -> 2\n}\n";
    assert!(at(broken, "table").is_empty());
}

/// The narrowing proof accepts a pick within the freedom and refuses a
/// change of a fixed value or a widening.
#[test]
fn the_narrowing_proof_refuses_what_the_specification_forbids() {
    let src = "input a, b\noutput y, z\ny = on(1) dc(3) over (a, b)\nz = y | a\n";
    let rhs = src.find("on(").unwrap()..src.find("\nz").unwrap();
    let with = |text: &str| implica_analysis::Fix {
        title: String::new(),
        applicability: Applicability::NeedsReview,
        edits: vec![implica_analysis::Edit {
            span: Span::new(rhs.start, rhs.end),
            new_text: text.to_string(),
        }],
    };
    assert!(fixes::verify_narrowing(src, &with("!a & b")).is_ok());
    assert!(fixes::verify_narrowing(src, &with("b")).is_ok());
    // Exact proofs refuse both picks: the freedom is gone.
    assert!(fixes::verify(src, &with("b")).is_err());
    let flipped = fixes::verify_narrowing(src, &with("a & b")).unwrap_err();
    assert!(flipped.contains("`y`"), "{flipped}");
    let wider = fixes::verify_narrowing(src, &with("on(1) dc(2, 3) over (a, b)")).unwrap_err();
    assert!(wider.contains("`y`"), "{wider}");
}

// ---------------------------------------------------------------------------
// NAND and NOR only.

/// De Morgan's law, a standard identity of Boolean algebra, gives NAND
/// universality (common practice): `a | b` is `!a nand !b`, and `a & b` is
/// `!a nor !b`; the result is checked row by row like every refactor.
#[test]
fn de_morgan_gives_the_nand_and_nor_forms() {
    let src = "input a, b\noutput y, z\ny = a | b\nz = a & b\n";
    let (after, r) = result_of(src, "y =", RefactorKind::ToNand);
    assert_eq!(r.fix.applicability, Applicability::Safe);
    assert_eq!(
        after,
        "input a, b\noutput y, z\ny = !a nand !b\nz = a & b\n"
    );
    let (after, _) = result_of(src, "z =", RefactorKind::ToNor);
    assert_eq!(after, "input a, b\noutput y, z\ny = a | b\nz = !a nor !b\n");
    let (after, _) = result_of(src, "z =", RefactorKind::ToNand);
    assert!(after.contains("z = !(a nand b)\n"), "{after}");
}

#[test]
fn two_input_gates_are_parenthesised_as_operands() {
    let src = "input hot, rain, manual\noutput vent\nvent = hot & !rain | manual\n";
    let (after, _) = result_of(src, "vent =", RefactorKind::ToNand);
    assert!(
        after.ends_with("vent = (hot nand !rain) nand !manual\n"),
        "{after}"
    );
    let wide = "input a, b, c, d\noutput y\ny = a & b & c | d\n";
    let (after, _) = result_of(wide, "y =", RefactorKind::ToNand);
    assert!(after.ends_with("y = !(a & b & c) nand !d\n"), "{after}");
}

#[test]
fn no_gate_form_when_already_written_so() {
    let src = "input a, b, c\noutput y, z, w\ny = (a nand b) nand !c\nz = !(a | b | c)\nw = a\n";
    assert!(!kinds(&at(src, "y =")).contains(&"to-nand"));
    assert!(kinds(&at(src, "y =")).contains(&"to-nor"));
    assert!(!kinds(&at(src, "z =")).contains(&"to-nor"));
    assert!(!kinds(&at(src, "w =")).iter().any(|k| k.starts_with("to-n")));
}

// ---------------------------------------------------------------------------
// Inlining.

const LIFT: &str = "\
input  door_a, door_b, run
output drive_ok, sw_fault

# CAUTION: Implica checks Boolean consistency only, not safety.
# The closed position is read by two contacts.
let closed = door_a & door_b  # both contacts agree
let agree  = door_a xnor door_b
drive_ok   = closed & run & agree
sw_fault   = !agree
assert drive_ok => closed
";

#[test]
fn inlining_at_a_reference_or_everywhere() {
    let (after, r) = result_of(LIFT, "closed & run", RefactorKind::InlineHere);
    assert_eq!(r.fix.title, "Inline `closed` here");
    assert!(
        after.contains("drive_ok   = door_a & door_b & run & agree\n"),
        "{after}"
    );
    let (after, _) = result_of(LIFT, "let agree", RefactorKind::InlineEverywhere);
    assert_eq!(
        after,
        "\
input  door_a, door_b, run
output drive_ok, sw_fault

# CAUTION: Implica checks Boolean consistency only, not safety.
# The closed position is read by two contacts.
let closed = door_a & door_b  # both contacts agree
drive_ok   = closed & run & (door_a xnor door_b)
sw_fault   = !(door_a xnor door_b)
assert drive_ok => closed
"
    );
    let (after, _) = result_of(LIFT, "let closed", RefactorKind::InlineEverywhere);
    assert!(
        after.contains("# The closed position is read by two contacts.\n# both contacts agree\n"),
        "{after}"
    );
    assert!(
        after.contains("assert drive_ok => door_a & door_b\n"),
        "{after}"
    );
    // At the definition, only everywhere; at a reference, both.
    assert_eq!(
        kinds(&at(LIFT, "let agree")).last(),
        Some(&"inline-everywhere")
    );
    assert!(!kinds(&at(LIFT, "let agree")).contains(&"inline-here"));
}

#[test]
fn inlining_is_not_offered_where_a_name_is_needed() {
    let header = "input a, b\noutput y, z\nlet t = a & b\ny = on(1) over (t, a)\nz = t | b\n";
    assert!(!kinds(&at(header, "let t")).contains(&"inline-everywhere"));
    assert!(kinds(&at(header, "t | b")).contains(&"inline-here"));
    let table = "input a, b\noutput y\nlet t = a & b\ntable (t -> y) {\n  1 -> 1\n  0 -> 0\n}\n";
    assert!(
        !kinds(&at(table, "let t"))
            .iter()
            .any(|k| k.starts_with("inline"))
    );
    let expect =
        "input a, b\noutput y\nlet t = a & b\ny = t\nexpect (a, b -> t) {\n  1 1 -> 1\n}\n";
    assert!(!kinds(&at(expect, "let t")).contains(&"inline-everywhere"));
    let column = "input a\noutput y\nlet table (a -> t) {\n  1 -> 1\n  0 -> 0\n}\ny = t\n";
    assert!(
        !kinds(&at(column, "t\n"))
            .iter()
            .any(|k| k.starts_with("inline"))
    );
    let cycle = "input a\noutput y\nlet t = a & u\nlet u = t | a\ny = t\n";
    assert!(
        !kinds(&at(cycle, "t\n"))
            .iter()
            .any(|k| k.starts_with("inline"))
    );
    let output = "input a\noutput y, z\ny = a\nz = y\n";
    assert!(
        !kinds(&at(output, "y\n"))
            .iter()
            .any(|k| k.starts_with("inline"))
    );
}

#[test]
fn parentheses_only_where_precedence_needs_them() {
    let src = "input a, b, c\noutput y1, y2, y3, y4\nlet t = a | b\nlet n = !a\ny1 = t | c\ny2 = t & c\ny3 = c ^ n\ny4 = t == c\n";
    let (after, _) = result_of(src, "let t", RefactorKind::InlineEverywhere);
    assert!(after.contains("y1 = a | b | c\n"), "{after}");
    assert!(after.contains("y2 = (a | b) & c\n"), "{after}");
    assert!(after.contains("y4 = a | b == c\n"), "{after}");
    let (after, _) = result_of(src, "let n", RefactorKind::InlineEverywhere);
    assert!(after.contains("y3 = c ^ !a\n"), "{after}");
}

// ---------------------------------------------------------------------------
// Any input.

#[test]
fn no_panic_at_any_offset_of_odd_texts() {
    let texts = [
        "",
        "input a\noutput y\ny = a &\n",
        "let = \ntable (a -> ) {\n  1 ->\n}\n",
        "input a\noutput y\ny = on(9) over (a)\n",
        "input é\n# ünïcode\ny = (((a\n",
        "input a, b\noutput y\nlet t = a & b\ny = t t = 1\n",
    ];
    for src in texts {
        for start in 0..=src.len() + 2 {
            for len in [0, 1, 5] {
                let found = refactors_at(src, Span::new(start, start + len), &config());
                assert!(
                    found.internal_errors.is_empty(),
                    "{src}: {:?}",
                    found.internal_errors
                );
                for r in &found.offered {
                    check_refactor(src, r);
                }
            }
        }
    }
    // A reversed span is taken as the range it names.
    let found = refactors_at(VENTS, Span::new(usize::MAX, 0), &config());
    assert!(found.internal_errors.is_empty());
}

#[test]
fn every_refactor_of_the_examples_is_proven_and_checked() {
    let dir = Path::new(env!("CARGO_MANIFEST_DIR")).join("../../examples");
    let mut files: Vec<_> = std::fs::read_dir(&dir)
        .unwrap()
        .map(|e| e.unwrap().path())
        .filter(|p| p.extension().is_some_and(|e| e == "imp"))
        .collect();
    files.sort();
    assert!(files.len() >= 5);
    let mut total = 0;
    for f in files {
        let src = std::fs::read_to_string(&f).unwrap();
        total += check_everywhere(&src);
    }
    assert!(total > 50, "only {total} refactors offered in the examples");
}

// ---------------------------------------------------------------------------
// Generated programs.

mod programs;
use programs::{INPUTS, literal, product};

/// A sum of products, sometimes with a `nand`, an `xor` or parentheses.
fn expression(names: Vec<String>) -> impl Strategy<Value = String> {
    (
        proptest::collection::vec(product(names.clone()), 1..4),
        literal(names.clone()),
        literal(names),
        0..4u8,
    )
        .prop_map(|(terms, x, y, how)| {
            let sum = terms.join(" | ");
            match how {
                0 => format!("({sum}) & ({x} nand {y})"),
                1 => format!("{x} ^ ({sum})"),
                2 => format!("!({sum}) | {x} nor {y}"),
                _ => sum,
            }
        })
}

fn rows(n: usize) -> impl Strategy<Value = Vec<Vec<u8>>> {
    proptest::collection::vec(proptest::collection::vec(0..3u8, n), 0..6)
}

/// Five inputs, two intermediate expressions, a term list, a table, and
/// three outputs over all of them.
fn program() -> impl Strategy<Value = String> {
    let base: Vec<String> = INPUTS.iter().map(|s| s.to_string()).collect();
    let with_t: Vec<String> = base.iter().cloned().chain(["t1".to_string()]).collect();
    let all: Vec<String> = with_t
        .iter()
        .cloned()
        .chain(["t2".to_string(), "t3".to_string()])
        .collect();
    (
        (expression(base), expression(with_t)),
        (
            expression(all.clone()),
            expression(all.clone()),
            expression(all),
        ),
        (
            proptest::collection::btree_set(0..8u8, 0..6),
            proptest::collection::btree_set(0..8u8, 0..3),
        ),
        (rows(4), any::<bool>()),
    )
        .prop_map(|((t1, t2), (y1, y2, y3), (on, dc), (table, unlisted))| {
            let list = |s: &std::collections::BTreeSet<u8>| {
                s.iter().map(u8::to_string).collect::<Vec<_>>().join(", ")
            };
            let cell = |c: u8| ['0', '1', '-'][c as usize];
            let mut body = String::new();
            for r in &table {
                // Input cells of a row: two; its outputs: two.
                body.push_str(&format!(
                    "  {}{} -> {}{}\n",
                    cell(r[0]),
                    cell(r[1]),
                    cell(r[2]),
                    cell(r[3])
                ));
            }
            if unlisted || table.is_empty() {
                body.push_str("  unlisted -> 01\n");
            }
            format!(
                "input a, b, c, d, e\noutput y1, y2, y3, y4, y5\n\
                 let t1 = {t1}\nlet t2 = {t2}\nlet t3 = on({}) dc({}) over (a, b, t1)\n\
                 y1 = {y1}\ny2 = {y2}\ny3 = {y3}\n\
                 table (d, t2 -> y4, y5) {{\n{body}}}\n",
                list(&on),
                list(&dc),
            )
        })
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(24))]

    #[test]
    fn every_refactor_of_generated_programs_keeps_every_value(src in program()) {
        prop_assert!(check_everywhere(&src) > 0);
    }
}
