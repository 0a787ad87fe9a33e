//! NAND-only and NOR-only networks and cost metrics. Property tests over
//! random expressions of up to twelve inputs: both networks compute the
//! original function (compared by truth table) with gates of one kind, and
//! two-level forms map to two levels of gates. Gate counts of small circuits
//! are checked by hand against common practice.

mod common;
use common::{expr, inputs};
use implica_logic::{
    BoolExpr, Budget, Cost, Cover, Cube, Gate, GateError, GateKind, GateNetwork, NetworkCost,
    Signal, TruthTable, minimize_pos, minimize_sop,
};
use proptest::prelude::*;

/// A cover of up to six cubes over `vars` inputs: per variable, 0 for the
/// negated literal, 1 for the positive one, 2 for none.
fn cover(vars: usize) -> impl Strategy<Value = Cover> {
    proptest::collection::vec(proptest::collection::vec(0..3u8, vars), 0..6).prop_map(move |cs| {
        let cubes = cs
            .iter()
            .map(|lits| {
                lits.iter()
                    .enumerate()
                    .filter(|&(_, &l)| l < 2)
                    .fold(Cube::universe(vars), |c, (i, &l)| {
                        c.and(&Cube::literal(vars, i, l == 1))
                    })
            })
            .collect();
        Cover { vars, cubes }
    })
}

use BoolExpr::{And, Const, Or, Var, Xor};

fn not(e: BoolExpr) -> BoolExpr {
    BoolExpr::negate(e)
}

fn names(i: usize) -> String {
    ["a", "b", "c", "d"]
        .get(i)
        .map_or(format!("x{i}"), |s| s.to_string())
}

/// Gates of two or more inputs.
fn multi_input(net: &GateNetwork) -> usize {
    net.gates().iter().filter(|g| g.inputs.len() >= 2).count()
}

/// The check every converted network must pass: one gate kind, the same
/// truth table as `e`, no constant unless it is a constant, no inverter of
/// an inverter, no gate twice, and its own expression back.
fn check_network(e: &BoolExpr, kind: GateKind, vars: usize) -> Result<(), TestCaseError> {
    let net = GateNetwork::from_expr(e, kind);
    prop_assert!(net.uses_only(kind));
    let f = e.truth_table(vars);
    prop_assert_eq!(net.truth_table(vars).unwrap(), f.clone());
    let gates = net.gates();
    for (j, g) in gates.iter().enumerate() {
        prop_assert!(!g.inputs.iter().any(|s| matches!(s, Signal::Const(_))));
        if let [Signal::Gate(k)] = g.inputs[..] {
            prop_assert!(
                gates[k].inputs.len() >= 2,
                "inverter {} of inverter {}",
                j,
                k
            );
        }
        prop_assert!(!gates[..j].contains(g), "gate {} built twice", j);
    }
    if let Ok(back) = net.to_expr(100_000) {
        prop_assert_eq!(back.truth_table(vars), f);
    }
    Ok(())
}

proptest! {
    #[test]
    fn nand_network_computes_the_expression(e in expr(12)) {
        check_network(&e, GateKind::Nand, 12)?;
    }

    #[test]
    fn nor_network_computes_the_expression(e in expr(12)) {
        check_network(&e, GateKind::Nor, 12)?;
    }

    #[test]
    fn evaluation_agrees_with_the_truth_table(e in expr(12), m in 0..4096usize) {
        for kind in [GateKind::Nand, GateKind::Nor] {
            let net = GateNetwork::from_expr(&e, kind);
            let mut v = inputs(12, m);
            v.truncate(net.inputs());
            prop_assert_eq!(net.eval(&v), e.eval(&inputs(12, m)));
        }
    }

    #[test]
    fn cover_cost_is_the_cost_of_its_expression(c in (1..=8usize).prop_flat_map(cover)) {
        prop_assert_eq!(Cost::of_expr(&BoolExpr::from_cover(&c)), Cost::of_cover(&c));
    }

    /// A sum of k >= 2 products is NAND-NAND: one NAND per product of two or
    /// more literals, one for the sum, and one shared inverter per variable
    /// that a product holds complemented or that is a one-literal term on its
    /// own; three levels at most. The product of sums is NOR-NOR, dually.
    #[test]
    fn two_level_forms_map_to_two_levels_of_gates(e in expr(8)) {
        let f = e.truth_table(8);
        let none = TruthTable::zero(8);
        let budget = Budget::default();
        let sop = minimize_sop(&f, &none, &budget).unwrap().cover;
        let pos = minimize_pos(&f, &none, &budget).unwrap().cover;
        for (cover, kind, expr) in [
            (&sop, GateKind::Nand, BoolExpr::from_cover(&sop)),
            (&pos, GateKind::Nor, BoolExpr::from_complement_cover(&pos)),
        ] {
            if cover.len() < 2 {
                continue;
            }
            // For NOR the cubes are of the complement: a sum's literal is
            // the cube's, negated.
            let inverted = |positive: bool| positive == (kind == GateKind::Nor);
            let mut need = 0u64;
            let mut products = 0;
            for c in &cover.cubes {
                let lits: Vec<(usize, bool)> = (0..8)
                    .filter_map(|i| c.literal_of(i).map(|p| (i, p)))
                    .collect();
                if lits.len() >= 2 {
                    products += 1;
                    for &(i, p) in &lits {
                        if inverted(p) {
                            need |= 1 << i;
                        }
                    }
                } else if let [(i, p)] = lits[..]
                    && !inverted(p)
                {
                    need |= 1 << i;
                }
            }
            let net = GateNetwork::from_expr(&expr, kind);
            let cost = net.cost();
            prop_assert_eq!(multi_input(&net), products + 1);
            prop_assert_eq!(cost.inverters, need.count_ones() as usize);
            prop_assert!(cost.depth <= 3);
            prop_assert_eq!(net.truth_table(8).unwrap(), f.clone());
        }
    }
}

#[test]
fn xor_of_two_inputs_is_four_nand_gates() {
    // The four-NAND XOR (common practice).
    let net = GateNetwork::from_expr(&Xor(vec![Var(0), Var(1)]), GateKind::Nand);
    assert_eq!(
        net.to_text(&names),
        "g0 = !(a & b)\ng1 = !(a & g0)\ng2 = !(b & g0)\ng3 = !(g1 & g2)\nout = g3\n"
    );
    assert_eq!(
        net.cost(),
        NetworkCost {
            gates: 4,
            inverters: 0,
            gates2: 4,
            depth: 3
        }
    );
    // XNOR takes a fifth gate, an inverter (common practice).
    let xnor = GateNetwork::from_expr(&not(Xor(vec![Var(0), Var(1)])), GateKind::Nand);
    assert_eq!((xnor.cost().gates, xnor.cost().inverters), (5, 1));
}

#[test]
fn xor_of_two_inputs_is_five_nor_gates() {
    // Four NORs make XNOR; XOR adds an inverter (common practice).
    let xnor = GateNetwork::from_expr(&not(Xor(vec![Var(0), Var(1)])), GateKind::Nor);
    assert_eq!(
        xnor.to_text(&names),
        "g0 = !(a | b)\ng1 = !(a | g0)\ng2 = !(b | g0)\ng3 = !(g1 | g2)\nout = g3\n"
    );
    let xor = GateNetwork::from_expr(&Xor(vec![Var(0), Var(1)]), GateKind::Nor);
    assert_eq!((xor.cost().gates, xor.cost().inverters), (5, 1));
    assert_eq!(
        xor.truth_table(2).unwrap(),
        TruthTable::from_minterms(2, &[1, 2])
    );
}

#[test]
fn complemented_xor_operands_need_no_inverter() {
    // !a ^ b = !(a ^ b): the complement moves to the output.
    let e = Xor(vec![not(Var(0)), Var(1)]);
    let nor = GateNetwork::from_expr(&e, GateKind::Nor);
    assert_eq!((nor.cost().gates, nor.cost().inverters), (4, 0));
    assert_eq!(nor.truth_table(2).unwrap(), e.truth_table(2));
}

#[test]
fn full_adder_sum_is_eight_nand_gates() {
    // Two four-NAND XORs in a chain (common practice).
    let net = GateNetwork::from_expr(&Xor(vec![Var(0), Var(1), Var(2)]), GateKind::Nand);
    assert_eq!(net.cost().gates, 8);
    assert_eq!(net.cost().depth, 6);
    assert_eq!(
        net.truth_table(3).unwrap(),
        TruthTable::from_minterms(3, &[1, 2, 4, 7])
    );
}

#[test]
fn sum_of_k_products_is_k_plus_one_nands_and_input_inverters() {
    // a & !b | !a & b & c | b & !c: three NANDs for the products, one for
    // the sum (NAND-NAND, common practice), inverters on a, b and c.
    let e = Or(vec![
        And(vec![Var(0), not(Var(1))]),
        And(vec![not(Var(0)), Var(1), Var(2)]),
        And(vec![Var(1), not(Var(2))]),
    ]);
    let net = GateNetwork::from_expr(&e, GateKind::Nand);
    assert_eq!(
        net.cost(),
        NetworkCost {
            gates: 7,
            inverters: 3,
            gates2: 6,
            depth: 3
        }
    );
    assert_eq!(multi_input(&net), 4);
    assert_eq!(net.truth_table(3).unwrap(), e.truth_table(3));
}

#[test]
fn product_of_sums_is_nor_nor() {
    // (a | b) & (!a | c): two NORs for the sums, one for the product, an
    // inverter on a (common practice).
    let e = And(vec![
        Or(vec![Var(0), Var(1)]),
        Or(vec![not(Var(0)), Var(2)]),
    ]);
    let net = GateNetwork::from_expr(&e, GateKind::Nor);
    assert_eq!(
        net.to_text(&names),
        "g0 = !(a | b)\ng1 = !a\ng2 = !(c | g1)\ng3 = !(g0 | g2)\nout = g3\n"
    );
}

#[test]
fn and_and_or_in_the_other_gate() {
    // AND from NORs: NOR of the complements, three gates; OR from NANDs
    // likewise (De Morgan, common practice).
    let and = GateNetwork::from_expr(&And(vec![Var(0), Var(1)]), GateKind::Nor);
    assert_eq!((and.cost().gates, and.cost().inverters), (3, 2));
    let or = GateNetwork::from_expr(&Or(vec![Var(0), Var(1)]), GateKind::Nand);
    assert_eq!((or.cost().gates, or.cost().inverters), (3, 2));
    // The complement of the gate's own function is one gate.
    let nand = GateNetwork::from_expr(&not(And(vec![Var(0), Var(1)])), GateKind::Nand);
    assert_eq!(nand.cost().gates, 1);
    let nor = GateNetwork::from_expr(&not(Or(vec![Var(0), Var(1)])), GateKind::Nor);
    assert_eq!(nor.cost().gates, 1);
}

#[test]
fn double_negation_and_constants_cancel() {
    let net = GateNetwork::from_expr(&not(not(Var(1))), GateKind::Nand);
    assert!(net.gates().is_empty());
    assert_eq!(net.output(), Signal::Input(1));
    assert_eq!(net.inputs(), 2);
    let zero = GateNetwork::from_expr(&And(vec![Var(0), Const(false)]), GateKind::Nor);
    assert_eq!(
        (zero.gates().len(), zero.output()),
        (0, Signal::Const(false))
    );
    let one = GateNetwork::from_expr(&Or(vec![Var(0), Const(true)]), GateKind::Nand);
    assert_eq!(one.output(), Signal::Const(true));
    assert_eq!(one.to_text(&names), "out = 1\n");
    // x ^ 1 is an inverter.
    let inv = GateNetwork::from_expr(&Xor(vec![Var(0), Const(true)]), GateKind::Nand);
    assert_eq!(inv.to_text(&names), "g0 = !a\nout = g0\n");
    assert!(inv.eval(&[false]));
    assert!(!inv.eval(&[true]));
    // A missing input reads as 0.
    assert!(inv.eval(&[]));
}

#[test]
fn a_shared_inverter_is_built_once() {
    // !a & b | !a & c: one inverter on a feeds both products.
    let e = Or(vec![
        And(vec![not(Var(0)), Var(1)]),
        And(vec![not(Var(0)), Var(2)]),
    ]);
    let net = GateNetwork::from_expr(&e, GateKind::Nand);
    assert_eq!(net.cost().inverters, 1);
    assert_eq!(Cost::of_expr(&e).inverters, 1);
}

#[test]
fn networks_are_checked_when_built() {
    let nand = |inputs: Vec<Signal>| Gate {
        kind: GateKind::Nand,
        inputs,
    };
    let forward = GateNetwork::new(1, vec![nand(vec![Signal::Gate(0)])], Signal::Gate(0));
    assert_eq!(
        forward,
        Err(GateError::BadSignal {
            gate: Some(0),
            signal: Signal::Gate(0)
        })
    );
    let input = GateNetwork::new(1, vec![nand(vec![Signal::Input(1)])], Signal::Gate(0));
    assert!(matches!(
        input,
        Err(GateError::BadSignal { gate: Some(0), .. })
    ));
    let empty = GateNetwork::new(1, vec![nand(vec![])], Signal::Gate(0));
    assert_eq!(empty, Err(GateError::NoInputs { gate: 0 }));
    let output = GateNetwork::new(1, vec![], Signal::Gate(0));
    assert!(matches!(
        output,
        Err(GateError::BadSignal { gate: None, .. })
    ));
    // A hand-built mixed network, NOR(a, NAND(a, b)): the constant 0, as the
    // NOR has a 1 input either way (a itself, or the NAND when a = 0).
    let mixed = GateNetwork::new(
        2,
        vec![
            nand(vec![Signal::Input(0), Signal::Input(1)]),
            Gate {
                kind: GateKind::Nor,
                inputs: vec![Signal::Input(0), Signal::Gate(0)],
            },
        ],
        Signal::Gate(1),
    )
    .unwrap();
    assert!(!mixed.uses_only(GateKind::Nand));
    assert!(mixed.truth_table(2).unwrap().is_zero());
    assert_eq!(
        mixed.to_expr(100).unwrap().to_text(&names),
        "!(a | !(a & b))"
    );
}

#[test]
fn truth_tables_of_up_to_twenty_inputs() {
    let parity = Xor((0..20).map(Var).collect());
    let net = GateNetwork::from_expr(&parity, GateKind::Nand);
    assert_eq!(net.cost().gates, 4 * 19);
    let t = net.truth_table(20).unwrap();
    assert_eq!(t, parity.truth_table(20));
    assert_eq!(
        net.truth_table(21),
        Err(GateError::Vars {
            vars: 21,
            inputs: 20
        })
    );
    assert!(matches!(net.truth_table(19), Err(GateError::Vars { .. })));
    // Each XOR copies its operands twice: the expanded tree is too large.
    assert_eq!(
        net.to_expr(10_000),
        Err(GateError::TooLarge { limit: 10_000 })
    );
}

#[test]
fn cost_of_a_cover() {
    // a & !b | b & c | !a & !c: three two-input ANDs and a three-input OR,
    // that is 3 + 2 two-input gates; inverters on a, b and c.
    let v = 3;
    let term = |lits: &[(usize, bool)]| {
        lits.iter().fold(Cube::universe(v), |c, &(i, p)| {
            c.and(&Cube::literal(v, i, p))
        })
    };
    let cover = Cover {
        vars: v,
        cubes: vec![
            term(&[(0, true), (1, false)]),
            term(&[(1, true), (2, true)]),
            term(&[(0, false), (2, false)]),
        ],
    };
    let cost = Cost {
        terms: 3,
        literals: 6,
        gates: 4,
        gates2: 5,
        inverters: 3,
        depth: 2,
    };
    assert_eq!(Cost::of_cover(&cover), cost);
    assert_eq!(
        Cost::of_cover(&Cover {
            vars: v,
            cubes: vec![]
        }),
        Cost::default()
    );
    let one = Cost::of_cover(&Cover {
        vars: v,
        cubes: vec![Cube::universe(v)],
    });
    assert_eq!((one.terms, one.gates, one.depth), (1, 0, 0));
}

#[test]
fn cost_of_an_expression() {
    // (a ^ b ^ c) & d: a three-input XOR (two two-input gates) under an AND.
    let e = And(vec![Xor(vec![Var(0), Var(1), Var(2)]), Var(3)]);
    let cost = Cost {
        terms: 1,
        literals: 4,
        gates: 2,
        gates2: 3,
        inverters: 0,
        depth: 2,
    };
    assert_eq!(Cost::of_expr(&e), cost);
    // !(a & b) | c: the inverter of a product is a level of its own.
    let f = Or(vec![not(And(vec![Var(0), Var(1)])), Var(2)]);
    let cost = Cost::of_expr(&f);
    assert_eq!(
        (cost.terms, cost.gates, cost.inverters, cost.depth),
        (2, 2, 1, 3)
    );
    assert_eq!(Cost::of_expr(&Const(false)).terms, 0);
}
