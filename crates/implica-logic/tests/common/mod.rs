//! Generators shared by the engine's tests and benchmarks (the benchmarks
//! include this file by path); each test uses a part of them.
#![allow(dead_code)]

use implica_logic::{BoolExpr, Cover, Cube, TruthTable};
use implica_testkit::Rng;
use proptest::prelude::*;

/// Random expressions over variables `0..vars`: NOT, and AND, OR and XOR
/// of up to three operands (none gives the constant), up to five levels.
pub fn expr(vars: usize) -> impl Strategy<Value = BoolExpr> {
    let leaf = prop_oneof![
        (0..vars).prop_map(BoolExpr::Var),
        any::<bool>().prop_map(BoolExpr::Const)
    ];
    leaf.prop_recursive(5, 48, 4, |inner| {
        prop_oneof![
            inner.clone().prop_map(BoolExpr::negate),
            proptest::collection::vec(inner.clone(), 0..4).prop_map(BoolExpr::And),
            proptest::collection::vec(inner.clone(), 0..4).prop_map(BoolExpr::Or),
            proptest::collection::vec(inner, 0..4).prop_map(BoolExpr::Xor),
        ]
    })
}

/// The input vector of row `m` of a table over `vars` inputs (the first
/// input is the most significant bit).
pub fn inputs(vars: usize, m: usize) -> Vec<bool> {
    (0..vars).map(|i| (m >> (vars - 1 - i)) & 1 == 1).collect()
}

/// The product of `literals` random literals (fewer when a variable
/// repeats; the empty cube when two clash).
pub fn random_cube(rng: &mut Rng, vars: usize, literals: usize) -> Cube {
    let mut c = Cube::universe(vars);
    for _ in 0..literals {
        let i = (rng.next() % vars as u64) as usize;
        c = c.and(&Cube::literal(vars, i, rng.next().is_multiple_of(2)));
    }
    c
}

/// A random cube in which each variable is, with probability `1/one_in`
/// each, a positive or a negative literal, and free otherwise.
pub fn random_cube_each(rng: &mut Rng, vars: usize, one_in: u64) -> Cube {
    let mut c = Cube::universe(vars);
    for i in 0..vars {
        match rng.next() % one_in {
            0 => c = c.and(&Cube::literal(vars, i, true)),
            1 => c = c.and(&Cube::literal(vars, i, false)),
            _ => {}
        }
    }
    c
}

/// `cubes` random cubes of `literals` literals each.
pub fn random_cover(rng: &mut Rng, vars: usize, cubes: usize, literals: usize) -> Cover {
    Cover {
        vars,
        cubes: (0..cubes)
            .map(|_| random_cube(rng, vars, literals))
            .collect(),
    }
}

/// Random functions: each minterm on with probability 3/8, a don't-care with
/// probability 1/4, off otherwise.
pub fn random_functions(vars: usize, count: usize, seed: u64) -> Vec<(TruthTable, TruthTable)> {
    let mut rng = Rng(seed);
    (0..count)
        .map(|_| {
            let (mut on, mut dc) = (TruthTable::zero(vars), TruthTable::zero(vars));
            for m in 0..(1usize << vars) {
                match rng.next() % 8 {
                    0..=2 => on.set(m, true),
                    3 | 4 => dc.set(m, true),
                    _ => {}
                }
            }
            (on, dc)
        })
        .collect()
}
