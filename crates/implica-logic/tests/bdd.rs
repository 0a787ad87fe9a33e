//! Binary decision diagrams, checked against truth tables computed minterm
//! by minterm for small functions, and against the cube-based operations
//! (an independent method) for functions of 40 to 64 inputs.

mod common;
use common::{expr, inputs, random_cover};
use implica_logic::{Bdd, BddRef, BoolExpr, Cover, Effort, Interrupted, TruthTable};
use implica_testkit::Rng;
use proptest::prelude::*;

fn index_of(point: &[bool]) -> usize {
    point.iter().fold(0, |acc, &b| (acc << 1) | usize::from(b))
}

fn big() -> Effort<'static> {
    Effort::new(u64::MAX / 2)
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(300))]

    #[test]
    fn a_diagram_computes_its_expression(e in expr(9), g in expr(9)) {
        let n = 9;
        let t = e.truth_table(n);
        let mut b = Bdd::new(n);
        let f = b.from_expr(&e, &mut big()).unwrap();
        for m in 0..1usize << n {
            prop_assert_eq!(b.eval(f, &inputs(n, m)), t.get(m));
        }
        prop_assert_eq!(b.support(f), t.support());
        prop_assert_eq!(b.count_ones(f), t.count_ones() as f64);
        prop_assert_eq!(b.constant(f), if t.is_zero() { Some(false) } else if t.is_one() { Some(true) } else { None });
        prop_assert_eq!(b.to_cover(f, 1 << n).unwrap().truth_table(), t.clone());
        match b.any_one(f) {
            None => prop_assert!(t.is_zero()),
            Some(p) => prop_assert!(t.get(index_of(&p))),
        }
        for i in 0..n {
            for v in [false, true] {
                let r = b.restrict(f, i, v, &mut big()).unwrap();
                let tr = t.cofactor(i, v);
                for m in 0..1usize << n {
                    prop_assert_eq!(b.eval(r, &inputs(n, m)), tr.get(m));
                }
            }
        }
        // Quantifying the last three variables, against the cofactors.
        let (mut some, mut every) = (TruthTable::zero(n), TruthTable::one(n));
        for k in 0..8usize {
            let c = (0..3).fold(t.clone(), |acc, j| acc.cofactor(6 + j, k >> j & 1 == 1));
            some = some.or(&c);
            every = every.and(&c);
        }
        let ex = b.exists_from(f, 6, &mut big()).unwrap();
        let all = b.forall_from(f, 6, &mut big()).unwrap();
        prop_assert_eq!(b.to_truth_table(ex, &(0..n).collect::<Vec<_>>()), some.clone());
        prop_assert_eq!(b.to_truth_table(all, &(0..n).collect::<Vec<_>>()), every);
        // Over a reordered subset of the variables: the first six, reversed.
        let order: Vec<usize> = (0..6).rev().collect();
        let sub = b.to_truth_table(ex, &order);
        let cover = b.to_cover_over(ex, &order, 1 << n).unwrap();
        prop_assert_eq!(cover.truth_table(), sub.clone());
        for m in 0..64usize {
            // Local minterm m sets x5 as its most significant bit.
            let global = (0..6).fold(0usize, |acc, j| acc | ((m >> j) & 1) << (n - 1 - j));
            prop_assert_eq!(sub.get(m), some.get(global));
        }
        // Canonical form: the same function is the same node.
        let tg = g.truth_table(n);
        let h = b.from_expr(&g, &mut big()).unwrap();
        prop_assert_eq!(f == h, t == tg);
        match b.counterexample(f, h, &mut big()).unwrap() {
            None => prop_assert_eq!(&t, &tg),
            Some(p) => prop_assert_ne!(t.get(index_of(&p)), tg.get(index_of(&p))),
        }
    }
}

fn parity(vars: usize) -> BoolExpr {
    BoolExpr::Xor((0..vars).map(BoolExpr::Var).collect())
}

#[test]
fn parity_of_sixty_four_inputs() {
    // A parity diagram has 2n - 1 nodes in any order (common practice).
    let mut b = Bdd::new(64);
    let p = b.from_expr(&parity(64), &mut big()).unwrap();
    assert_eq!(b.size(p), 127);
    assert_eq!(b.support(p), (0..64).collect::<Vec<_>>());
    assert_eq!(b.count_ones(p), 2f64.powi(63));
    // Its complement, written as a chain with one operand negated.
    let mut ops: Vec<BoolExpr> = (0..64).map(BoolExpr::Var).collect();
    ops[17] = BoolExpr::negate(BoolExpr::Var(17));
    let q = b.from_expr(&BoolExpr::Xor(ops), &mut big()).unwrap();
    let not_p = b.not(p, &mut big()).unwrap();
    assert_eq!(q, not_p);
}

#[test]
fn de_morgan_over_seventy_inputs() {
    // !(x0 & ... & x69) = !x0 | ... | !x69 (De Morgan, any digital-design
    // text); more inputs than a cube holds, so only the diagram can say.
    let n = 70;
    let mut b = Bdd::new(n);
    let lhs = BoolExpr::negate(BoolExpr::And((0..n).map(BoolExpr::Var).collect()));
    let rhs = BoolExpr::Or((0..n).map(|i| BoolExpr::negate(BoolExpr::Var(i))).collect());
    let (l, r) = (
        b.from_expr(&lhs, &mut big()).unwrap(),
        b.from_expr(&rhs, &mut big()).unwrap(),
    );
    assert_eq!(l, r);
    assert_eq!(b.counterexample(l, r, &mut big()).unwrap(), None);
    // Dropping one input from the right side: the counterexample is the
    // vector with that input 0 and all others 1.
    let short = BoolExpr::Or((1..n).map(|i| BoolExpr::negate(BoolExpr::Var(i))).collect());
    let s = b.from_expr(&short, &mut big()).unwrap();
    let p = b.counterexample(l, s, &mut big()).unwrap().unwrap();
    assert!(!p[0] && p[1..].iter().all(|&x| x));
}

#[test]
fn node_limit_and_cancellation() {
    // Parity of 64 needs 127 nodes.
    let mut b = Bdd::with_max_nodes(64, 60);
    assert_eq!(
        b.from_expr(&parity(64), &mut big()).unwrap_err(),
        Interrupted::OutOfBudget
    );
    let stop = || true;
    let mut b = Bdd::new(64);
    // x0&x32 | x1&x33 | ... : exponential in this order, so plenty of work.
    let e = BoolExpr::Or(
        (0..32)
            .map(|i| BoolExpr::And(vec![BoolExpr::Var(i), BoolExpr::Var(i + 32)]))
            .collect(),
    );
    assert_eq!(
        b.from_expr(&e, &mut Effort::unlimited().with_cancel(&stop))
            .unwrap_err(),
        Interrupted::Cancelled
    );
    assert_eq!(
        Bdd::new(64)
            .from_expr(&e, &mut Effort::new(5_000))
            .unwrap_err(),
        Interrupted::OutOfBudget
    );
}

#[test]
fn diagrams_and_cube_operations_agree_on_wide_covers() {
    let mut rng = Rng(0x0005_EED0_FB00_u64);
    for round in 0..40 {
        let vars = 40 + round % 25;
        let f = random_cover(&mut rng, vars, 20, 6);
        // g: f with one cube dropped or one cube added, or f reordered.
        let mut g = f.clone();
        match round % 3 {
            0 => {
                g.cubes.remove(round % g.cubes.len());
            }
            1 => g.cubes.push(random_cover(&mut rng, vars, 1, 3).cubes[0]),
            _ => g.cubes.reverse(),
        }
        let mut b = Bdd::new(vars);
        let (bf, bg) = (
            b.from_cover(&f, &mut big()).unwrap(),
            b.from_cover(&g, &mut big()).unwrap(),
        );
        let by_cubes = f.equivalent(&g, &Cover::zero(vars), &mut big()).unwrap();
        assert_eq!(bf == bg, by_cubes.is_none(), "round {round}");
        if let Some(p) = by_cubes {
            assert_ne!(b.eval(bf, &p), b.eval(bg, &p));
            assert_ne!(f.eval(&p), g.eval(&p));
        }
        assert_eq!(
            b.support(bf),
            f.support(&mut big()).unwrap(),
            "round {round}"
        );
        assert_eq!(
            b.constant(bf) == Some(true),
            f.is_tautology(&mut big()).unwrap()
        );
        let _ = BddRef::TRUE;
    }
}
