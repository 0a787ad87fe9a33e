//! Operator precedence and grouping.
//!
//! The reference is the textbook convention that AND binds tighter than OR
//! (common practice in Boolean algebra texts, e.g. `a + b·c` = `a + (b·c)`),
//! checked here by evaluating generated expressions: a model tree is printed
//! with only the parentheses precedence requires, parsed, and the parsed tree
//! is evaluated (by an evaluator written in this test) against the model on
//! every input.

use implica_syntax::ast::{BinOp, Expr, ExprKind, ItemKind, Rhs};
use implica_syntax::parse;
use proptest::prelude::*;

fn parse_expr(text: &str) -> Expr {
    let src = format!("y = {text}\n");
    let (file, errors) = parse(&src);
    assert!(errors.is_empty(), "{text}: {errors:?}");
    match &file.items[0].kind {
        ItemKind::Define(d) => match &d.rhs {
            Rhs::Expr(e) => e.clone(),
            Rhs::Terms(_) => panic!("not an expression"),
        },
        _ => panic!("not a definition"),
    }
}

fn apply(op: BinOp, a: bool, b: bool) -> bool {
    match op {
        BinOp::And => a && b,
        BinOp::Nand => !(a && b),
        BinOp::Xor | BinOp::Ne => a != b,
        BinOp::Xnor | BinOp::Eq => a == b,
        BinOp::Or => a || b,
        BinOp::Nor => !(a || b),
        BinOp::Implies => !a || b,
    }
}

/// Evaluates a parsed expression; variables are `v0`..`v3`.
fn eval(e: &Expr, env: u32) -> bool {
    match &e.kind {
        ExprKind::Name(n) => env >> n.text[1..].parse::<u32>().unwrap() & 1 == 1,
        ExprKind::Const(b) => *b,
        ExprKind::Not { operand, .. } => !eval(operand, env),
        ExprKind::Paren(inner) => eval(inner, env),
        ExprKind::Chain { operands, ops } => {
            if ops[0].op == BinOp::Implies {
                let mut acc = eval(operands.last().unwrap(), env);
                for (op, x) in ops.iter().zip(operands.iter()).rev() {
                    acc = apply(op.op, eval(x, env), acc);
                }
                acc
            } else {
                let mut acc = eval(&operands[0], env);
                for (op, x) in ops.iter().zip(&operands[1..]) {
                    acc = apply(op.op, acc, eval(x, env));
                }
                acc
            }
        }
        ExprKind::Error => panic!("error node"),
    }
}

#[test]
fn and_binds_tighter_than_or() {
    // Textbook convention: a + bc means a + (bc).
    let e = parse_expr("a | b & c");
    let ExprKind::Chain { operands, ops } = &e.kind else {
        panic!()
    };
    assert_eq!(ops[0].op, BinOp::Or);
    assert!(matches!(&operands[1].kind, ExprKind::Chain { ops, .. } if ops[0].op == BinOp::And));
}

#[test]
fn precedence_table_by_truth_value() {
    // Each line: an expression and the same with every grouping explicit.
    let cases = [
        ("v0 | v1 & v2", "v0 | (v1 & v2)"),
        ("v0 & v1 | v2", "(v0 & v1) | v2"),
        ("v0 ^ v1 & v2", "v0 ^ (v1 & v2)"),
        ("v0 | v1 ^ v2", "v0 | (v1 ^ v2)"),
        ("!v0 & v1", "(!v0) & v1"),
        ("not v0 | v1", "(not v0) | v1"),
        ("v0 == v1 | v2", "v0 == (v1 | v2)"),
        ("v0 => v1 == v2", "v0 => (v1 == v2)"),
        ("v0 => v1 => v2", "v0 => (v1 => v2)"),
        ("v0 == v1 != v2", "(v0 == v1) != v2"),
        ("v0 nand v1 | v2", "(v0 nand v1) | v2"),
        ("v0 nor v1 ^ v2", "v0 nor (v1 ^ v2)"),
        ("v0 xnor v1 & v2", "v0 xnor (v1 & v2)"),
    ];
    for (plain, grouped) in cases {
        let (a, b) = (parse_expr(plain), parse_expr(grouped));
        for env in 0..8 {
            assert_eq!(
                eval(&a, env),
                eval(&b, env),
                "{plain} vs {grouped} at {env:03b}"
            );
        }
    }
}

/// A model expression with its own structure.
#[derive(Debug, Clone)]
enum M {
    Var(u32),
    Const(bool),
    Not(bool, Box<M>),
    Bin(BinOp, bool, Box<M>, Box<M>),
}

const OPS: [BinOp; 9] = [
    BinOp::And,
    BinOp::Nand,
    BinOp::Xor,
    BinOp::Xnor,
    BinOp::Or,
    BinOp::Nor,
    BinOp::Eq,
    BinOp::Ne,
    BinOp::Implies,
];

fn model() -> impl Strategy<Value = M> {
    let leaf = prop_oneof![(0u32..4).prop_map(M::Var), any::<bool>().prop_map(M::Const)];
    leaf.prop_recursive(5, 40, 2, |inner| {
        prop_oneof![
            (any::<bool>(), inner.clone()).prop_map(|(w, m)| M::Not(w, Box::new(m))),
            (0..OPS.len(), any::<bool>(), inner.clone(), inner).prop_map(|(i, w, a, b)| M::Bin(
                OPS[i],
                w,
                Box::new(a),
                Box::new(b)
            )),
        ]
    })
}

fn eval_model(m: &M, env: u32) -> bool {
    match m {
        M::Var(i) => env >> i & 1 == 1,
        M::Const(b) => *b,
        M::Not(_, x) => !eval_model(x, env),
        M::Bin(op, _, a, b) => apply(*op, eval_model(a, env), eval_model(b, env)),
    }
}

/// Prints with only the parentheses the grammar requires, plus redundant
/// ones where `extra` says so.
fn print(m: &M, extra: &mut impl Iterator<Item = bool>) -> String {
    match m {
        M::Var(i) => format!("v{i}"),
        M::Const(b) => u8::from(*b).to_string(),
        M::Not(word, x) => {
            let inner = print(x, extra);
            let bare = matches!(**x, M::Var(_) | M::Const(_) | M::Not(..));
            let inner = if bare { inner } else { format!("({inner})") };
            if *word {
                format!("not {inner}")
            } else {
                format!("!{inner}")
            }
        }
        M::Bin(op, word, a, b) => {
            let needs = |child: &M, right: bool| match child {
                M::Bin(cop, ..) => {
                    let (pc, pp) = (cop.precedence(), op.precedence());
                    pc < pp
                        || (pc == pp
                            && (!op.chains()
                                || !cop.chains()
                                || (right != (*op == BinOp::Implies))))
                }
                _ => false,
            };
            let (na, nb) = (needs(a, false), needs(b, true));
            let (ea, eb) = (extra.next().unwrap_or(false), extra.next().unwrap_or(false));
            let wrap = |s: String, n: bool| if n { format!("({s})") } else { s };
            let sa = wrap(print(a, extra), na || ea);
            let sb = wrap(print(b, extra), nb || eb);
            format!("{sa} {} {sb}", op.spelling(*word))
        }
    }
}

proptest! {
    #[test]
    fn parsed_grouping_matches_the_model(m in model(), extra in proptest::collection::vec(any::<bool>(), 64)) {
        let text = print(&m, &mut extra.into_iter());
        let e = parse_expr(&text);
        let src = format!("y = {text}\n");
        prop_assert_eq!(parse(&src), implica_syntax::parse_reference(&src));
        for env in 0..16 {
            prop_assert_eq!(eval(&e, env), eval_model(&m, env), "{} at {:04b}", text, env);
        }
    }
}
