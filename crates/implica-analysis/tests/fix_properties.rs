//! Property test: on generated programs, applying every safe fix at once
//! keeps every output's value on every input combination. The values are
//! computed here by evaluating the syntax tree directly, a brute force that
//! shares no code with the analysis (which proved each fix with BDDs).

use implica_analysis::{Applicability, analyze, fixes};
use implica_syntax::ast::{BinOp, Expr, ExprKind, ItemKind, Rhs, SourceFile};
use proptest::prelude::*;
use std::collections::HashMap;

mod programs;
use programs::{INPUTS, product};

/// A sum of products, as text.
fn sum(names: Vec<String>) -> impl Strategy<Value = String> {
    proptest::collection::vec(product(names), 1..5).prop_flat_map(|terms| {
        // Sometimes repeat a term, or add an absorbed copy, so that the
        // redundancy rules have something to fix.
        let n = terms.len();
        (Just(terms), 0..n, 0..3u8).prop_map(|(mut terms, k, how)| {
            match how {
                0 => terms.push(terms[k].clone()),
                1 => {
                    let t = format!("{} & {}", terms[k], INPUTS[k % INPUTS.len()]);
                    terms.push(t);
                }
                _ => {}
            }
            terms.join(" | ")
        })
    })
}

/// A program: five inputs, two intermediates and three outputs, each a sum
/// of products over the inputs and the intermediates defined before it;
/// one intermediate may be unused, one input may be unused.
fn program() -> impl Strategy<Value = String> {
    let base: Vec<String> = INPUTS.iter().map(|s| s.to_string()).collect();
    let with_t: Vec<String> = base.iter().cloned().chain(["t1".to_string()]).collect();
    let with_both: Vec<String> = with_t.iter().cloned().chain(["t2".to_string()]).collect();
    (
        sum(base.clone()),
        sum(with_t.clone()),
        sum(with_both.clone()),
        sum(with_both.clone()),
        sum(with_t),
        any::<bool>(),
    )
        .prop_map(|(t1, t2, y1, y2, y3, spare)| {
            let extra = if spare { ", spare" } else { "" };
            format!(
                "input a, b, c, d, e{extra}\noutput y1, y2, y3\nlet t1 = {t1}\nlet t2 = {t2}\ny1 = {y1}\ny2 = {y2}\ny3 = {y3}\n"
            )
        })
}

/// Every defined signal's value on one input combination, by direct
/// evaluation of the tree.
fn evaluate(file: &SourceFile, inputs: &HashMap<&str, bool>) -> HashMap<String, bool> {
    let mut defs: HashMap<String, &Expr> = HashMap::new();
    for item in &file.items {
        if let ItemKind::Define(d) = &item.kind
            && let Rhs::Expr(e) = &d.rhs
        {
            defs.entry(d.target.text.to_string()).or_insert(e);
        }
    }
    fn value(name: &str, defs: &HashMap<String, &Expr>, inputs: &HashMap<&str, bool>) -> bool {
        if let Some(&v) = inputs.get(name) {
            return v;
        }
        eval(defs[name], defs, inputs)
    }
    fn eval(e: &Expr, defs: &HashMap<String, &Expr>, inputs: &HashMap<&str, bool>) -> bool {
        match &e.kind {
            ExprKind::Name(n) => value(&n.text, defs, inputs),
            ExprKind::Const(b) => *b,
            ExprKind::Not { operand, .. } => !eval(operand, defs, inputs),
            ExprKind::Paren(inner) => eval(inner, defs, inputs),
            ExprKind::Chain { operands, ops } => {
                let mut acc = eval(&operands[0], defs, inputs);
                for (op, o) in ops.iter().zip(&operands[1..]) {
                    let v = eval(o, defs, inputs);
                    acc = match op.op {
                        BinOp::And => acc && v,
                        BinOp::Or => acc || v,
                        BinOp::Xor | BinOp::Ne => acc ^ v,
                        other => panic!("not generated: {other:?}"),
                    };
                }
                acc
            }
            ExprKind::Error => panic!("an error node"),
        }
    }
    defs.keys()
        .map(|n| (n.clone(), value(n, &defs, inputs)))
        .collect()
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(96))]

    #[test]
    fn safe_fixes_keep_every_output(src in program()) {
        let a = analyze(&src);
        prop_assert!(a.internal_errors.is_empty(), "{:?}", a.internal_errors);
        // Every safe fix whose edits do not overlap one taken before.
        let mut taken: Vec<implica_analysis::Edit> = Vec::new();
        for d in &a.diagnostics {
            if let Some(f) = d.fixes.iter().find(|f| f.applicability == Applicability::Safe) {
                let clash = f.edits.iter().any(|e| taken.iter().any(|t| {
                    t != e && e.span.start < t.span.end.max(t.span.start + 1)
                        && t.span.start < e.span.end.max(e.span.start + 1)
                }));
                if !clash {
                    taken.extend(f.edits.iter().cloned());
                }
            }
        }
        let fixed = fixes::apply(&src, &taken).expect("non-overlapping edits apply");
        let (before, e1) = implica_syntax::parse(&src);
        let (after, e2) = implica_syntax::parse(&fixed);
        prop_assert!(e1.is_empty() && e2.is_empty(), "{fixed}");
        for m in 0..32usize {
            let inputs: HashMap<&str, bool> = INPUTS
                .iter()
                .enumerate()
                .map(|(i, &n)| (n, (m >> (4 - i)) & 1 == 1))
                .chain([("spare", false)])
                .collect();
            let (v1, v2) = (evaluate(&before, &inputs), evaluate(&after, &inputs));
            for y in ["y1", "y2", "y3"] {
                prop_assert_eq!(v1[y], v2[y], "{} differs on row {}:\n{}\n---\n{}", y, m, src, fixed);
            }
        }
    }
}
