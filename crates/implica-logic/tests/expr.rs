//! The expression tree: evaluation, truth tables, and covers turned back
//! into expressions. Property tests over random expressions of up to eight
//! inputs: the minimized sum of products and product of sums, and the
//! hazard-free cover, all compute the original function.

mod common;
use common::{expr, inputs};
use implica_logic::{
    BoolExpr, Budget, GateKind, GateNetwork, TruthTable, hazard_free_cover, minimize_pos,
    minimize_sop, static1_hazards,
};
use proptest::prelude::*;

proptest! {
    #[test]
    fn truth_table_agrees_with_evaluation(e in expr(6)) {
        let t = e.truth_table(6);
        for m in 0..64 {
            prop_assert_eq!(t.get(m), e.eval(&inputs(6, m)));
        }
    }

    /// The table operations on one input, against their definitions row by
    /// row (input `i` is bit `n - 1 - i` of the row number), over 1 to 9
    /// inputs so that inputs inside a word and across words are both met.
    #[test]
    fn flips_cofactors_and_dependence_follow_their_definitions(
        n in 1usize..=9,
        bits in prop::collection::vec(any::<bool>(), 512),
        care_bits in prop::collection::vec(any::<bool>(), 512),
    ) {
        let rows: Vec<usize> = (0..1usize << n).collect();
        let t = TruthTable::from_minterms(n, &rows.iter().copied().filter(|&m| bits[m]).collect::<Vec<_>>());
        let care = TruthTable::from_minterms(n, &rows.iter().copied().filter(|&m| care_bits[m]).collect::<Vec<_>>());
        for i in 0..n {
            let bit = 1usize << (n - 1 - i);
            let flipped = t.flip(i);
            let (low, high) = (t.cofactor(i, false), t.cofactor(i, true));
            let mut differs = false;
            let mut differs_within = false;
            for &m in &rows {
                prop_assert_eq!(flipped.get(m), t.get(m ^ bit));
                prop_assert_eq!(low.get(m), t.get(m & !bit));
                prop_assert_eq!(high.get(m), t.get(m | bit));
                differs |= t.get(m) != t.get(m ^ bit);
                differs_within |= care.get(m) && care.get(m ^ bit) && t.get(m) != t.get(m ^ bit);
            }
            prop_assert_eq!(flipped.count_ones(), t.count_ones());
            prop_assert_eq!(t.depends_on(i), differs);
            prop_assert_eq!(t.depends_on_within(i, &care), differs_within);
        }
    }

    #[test]
    fn minimized_forms_compute_the_same_function(e in expr(8)) {
        let f = e.truth_table(8);
        let none = TruthTable::zero(8);
        let sop = minimize_sop(&f, &none, &Budget::default()).unwrap();
        prop_assert_eq!(BoolExpr::from_cover(&sop.cover).truth_table(8), f.clone());
        let pos = minimize_pos(&f, &none, &Budget::default()).unwrap();
        prop_assert_eq!(BoolExpr::from_complement_cover(&pos.cover).truth_table(8), f.clone());
        let free = hazard_free_cover(&sop.cover, &f, &none, &Budget::default()).unwrap();
        prop_assert!(static1_hazards(&free, &none).is_empty());
        prop_assert_eq!(free.truth_table(), f);
    }
}

proptest! {
    // Twelve inputs, as the engine's issue asks; fewer cases, since each
    // runs an exact minimization (which may stop at its search budget: the
    // cover must be equivalent either way) and a NAND and a NOR network.
    #![proptest_config(ProptestConfig::with_cases(48))]

    #[test]
    fn twelve_input_forms_compute_the_same_function(e in expr(12)) {
        let n = 12;
        let f = e.truth_table(n);
        let none = TruthTable::zero(n);
        let sop = minimize_sop(&f, &none, &Budget::default()).unwrap();
        prop_assert_eq!(BoolExpr::from_cover(&sop.cover).truth_table(n), f.clone());
        let pos = minimize_pos(&f, &none, &Budget::default()).unwrap();
        prop_assert_eq!(BoolExpr::from_complement_cover(&pos.cover).truth_table(n), f.clone());
        let free = hazard_free_cover(&sop.cover, &f, &none, &Budget::default()).unwrap();
        prop_assert!(static1_hazards(&free, &none).is_empty());
        prop_assert_eq!(free.truth_table(), f.clone());
        for kind in [GateKind::Nand, GateKind::Nor] {
            let net = GateNetwork::from_expr(&BoolExpr::from_cover(&sop.cover), kind);
            prop_assert!(net.uses_only(kind));
            prop_assert_eq!(net.truth_table(n).unwrap(), f.clone());
        }
    }
}

#[test]
fn text_has_only_the_parentheses_precedence_needs() {
    use BoolExpr::*;
    let name = |i: usize| ["a", "b", "c"][i].to_string();
    let e = Or(vec![
        And(vec![Var(0), BoolExpr::negate(Var(1))]),
        Xor(vec![Var(1), Var(2)]),
        Const(false),
    ]);
    assert_eq!(e.to_text(&name), "a & !b | b ^ c | 0");
    let f = And(vec![
        Or(vec![Var(0), Var(1)]),
        BoolExpr::negate(And(vec![Var(1), Var(2)])),
    ]);
    assert_eq!(f.to_text(&name), "(a | b) & !(b & c)");
    assert_eq!(Xor(vec![And(vec![]), Or(vec![])]).to_text(&name), "1 ^ 0");
}

#[test]
fn variables_have_their_bit_of_the_row_number() {
    // Row m has variable i (0 = most significant) equal to bit vars-1-i of m.
    for vars in 1..=12 {
        for i in 0..vars {
            let t = TruthTable::var(vars, i);
            for m in 0..1usize << vars {
                assert_eq!(t.get(m), (m >> (vars - 1 - i)) & 1 == 1, "{vars} {i} {m}");
            }
            assert_eq!(t.count_ones(), 1 << (vars - 1));
        }
    }
}

/// Whether an operator has one operand or an operand of its own kind.
fn nested(e: &BoolExpr) -> bool {
    let same = |a: &BoolExpr, b: &BoolExpr| std::mem::discriminant(a) == std::mem::discriminant(b);
    match e {
        BoolExpr::Not(x) => nested(x),
        BoolExpr::And(v) | BoolExpr::Or(v) | BoolExpr::Xor(v) => {
            v.len() == 1 || v.iter().any(|x| same(e, x) || nested(x))
        }
        _ => false,
    }
}

proptest! {
    /// Flattening keeps the function and leaves no operator of one operand
    /// and none directly inside one of its own kind.
    #[test]
    fn flattened_expressions_keep_their_function(e in expr(6)) {
        let f = e.clone().flattened();
        prop_assert_eq!(f.truth_table(6), e.truth_table(6));
        prop_assert!(!nested(&f), "{:?}", f);
    }
}

#[test]
fn flattening_merges_and_drops() {
    use BoolExpr::{And, Or, Var};
    let e = And(vec![
        Var(0),
        And(vec![Var(1), And(vec![])]),
        Or(vec![Var(2)]),
    ]);
    assert_eq!(e.flattened(), And(vec![Var(0), Var(1), Var(2)]));
    assert_eq!(Or(vec![Or(vec![])]).flattened(), Or(vec![]));
}
