//! Multi-output minimization against a hand-checked example and an
//! independent search over every cube.

use implica_logic::{Budget, MAX_OUTPUTS, TruthTable, minimize_multi};
use implica_testkit::Rng;

fn random_output(rng: &mut Rng, vars: usize, dc_share: u64) -> (TruthTable, TruthTable) {
    let (mut on, mut dc) = (TruthTable::zero(vars), TruthTable::zero(vars));
    for m in 0..(1usize << vars) {
        match rng.next() % 8 {
            k if k < 3 => on.set(m, true),
            k if k < 3 + dc_share => dc.set(m, true),
            _ => {}
        }
    }
    (on, dc)
}

/// The least (distinct terms, literals over them) by a plain depth-first
/// search over every cube as a minterm mask: take the first required
/// (output, minterm) not yet covered and try each cube inside that output's
/// care set holding it. Independent of the engine.
fn reference(outputs: &[(TruthTable, TruthTable)]) -> (usize, usize) {
    let vars = outputs[0].0.vars();
    let mask = |t: &TruthTable| t.minterms().iter().fold(0u64, |acc, &m| acc | 1 << m);
    let care: Vec<u64> = outputs.iter().map(|(on, dc)| mask(&on.or(dc))).collect();
    let need: Vec<u64> = outputs
        .iter()
        .map(|(on, dc)| mask(&on.and_not(dc)))
        .collect();
    let mut cubes = Vec::new();
    for free in 0..(1u64 << vars) {
        for value in 0..(1u64 << vars) {
            if value & free == 0 {
                let m = (0..(1u64 << vars))
                    .filter(|&x| x & !free == value)
                    .fold(0u64, |acc, x| acc | 1 << x);
                cubes.push((m, vars - free.count_ones() as usize));
            }
        }
    }
    fn search(
        cubes: &[(u64, usize)],
        care: &[u64],
        left: &mut [u64],
        used: (usize, usize),
        best: &mut (usize, usize),
    ) {
        let Some(i) = left.iter().position(|&l| l != 0) else {
            *best = (*best).min(used);
            return;
        };
        let first = left[i].trailing_zeros();
        for &(m, l) in cubes {
            if m >> first & 1 == 0 || m & !care[i] != 0 {
                continue;
            }
            let next = (used.0 + 1, used.1 + l);
            if next >= *best {
                continue;
            }
            let saved: Vec<u64> = left.to_vec();
            for (k, l) in left.iter_mut().enumerate() {
                if m & !care[k] == 0 {
                    *l &= !m;
                }
            }
            search(cubes, care, left, next, best);
            left.copy_from_slice(&saved);
        }
    }
    let mut best = (usize::MAX, usize::MAX);
    let mut left = need.clone();
    search(&cubes, &care, &mut left, (0, 0), &mut best);
    best
}

fn check_outputs(outputs: &[(TruthTable, TruthTable)], r: &implica_logic::MultiMinimized) {
    for (i, (on, dc)) in outputs.iter().enumerate() {
        let f = r.cover(i).truth_table();
        assert!(
            f.covers(&on.and_not(dc)),
            "output {i} misses on-set minterms"
        );
        assert!(on.or(dc).covers(&f), "output {i} covers off-set minterms");
    }
    assert!(r.terms.len() <= r.separate_terms);
    assert!(r.lower_bound <= r.terms.len());
}

#[test]
fn a_term_too_small_for_either_output_alone_is_shared() {
    // f1(a,b,c) = Σm(3, 6, 7), alone ab + bc; f2 = Σm(3, 5), alone
    // a'bc + ab'c (neither minterm has a neighbour in f2). Together f1 can
    // take f2's a'bc instead of bc: 3 distinct terms, 8 literals, against 4
    // terms and 10 literals separately (sharing of product terms; common
    // practice for multi-output sums of products, checked by hand).
    let none = TruthTable::zero(3);
    let f1 = TruthTable::from_minterms(3, &[3, 6, 7]);
    let f2 = TruthTable::from_minterms(3, &[3, 5]);
    let outputs = [(f1, none.clone()), (f2, none)];
    let r = minimize_multi(&outputs, &Budget::default()).unwrap();
    check_outputs(&outputs, &r);
    assert!(r.proven_minimal);
    assert_eq!((r.terms.len(), r.literals()), (3, 8));
    assert_eq!((r.separate_terms, r.separate_literals), (4, 10));
    let text: Vec<String> = r.terms.iter().map(|c| format!("{c:?}")).collect();
    // a'bc: a may be 0, b and c 1; the one shared term.
    let shared = r.shared();
    assert_eq!(shared.len(), 1, "{text:?}");
    let t = r.terms[shared[0]];
    assert_eq!(
        (t.literal_of(0), t.literal_of(1), t.literal_of(2)),
        (Some(false), Some(true), Some(true))
    );
    assert_eq!(r.cover(0).len(), 2);
    assert_eq!(r.cover(1).len(), 2);
    assert_eq!(reference(&outputs), (3, 8));
}

#[test]
fn random_small_systems_match_a_search_over_every_cube() {
    let mut rng = Rng(0x5DEE_CE66_D1CE_4E5B);
    for (vars, outputs, count) in [(3usize, 2usize, 150), (3, 3, 60), (4, 2, 40)] {
        for _ in 0..count {
            let system: Vec<(TruthTable, TruthTable)> = (0..outputs)
                .map(|_| random_output(&mut rng, vars, 1))
                .collect();
            let r = minimize_multi(&system, &Budget::default()).unwrap();
            check_outputs(&system, &r);
            assert!(r.proven_minimal);
            assert_eq!(r.lower_bound, r.terms.len());
            assert_eq!(
                (r.terms.len(), r.literals()),
                reference(&system),
                "{system:?}"
            );
        }
    }
}

#[test]
fn larger_systems_are_never_worse_than_separate_covers() {
    let mut rng = Rng(0x2545_F491_4F6C_DD1D);
    for (vars, outputs) in [(5usize, 3usize), (6, 4), (7, 2)] {
        for _ in 0..6 {
            let system: Vec<(TruthTable, TruthTable)> = (0..outputs)
                .map(|_| random_output(&mut rng, vars, 2))
                .collect();
            let r = minimize_multi(&system, &Budget::default()).unwrap();
            check_outputs(&system, &r);
            // Limited search still returns working covers, never worse.
            let quick = minimize_multi(
                &system,
                &Budget {
                    max_nodes: 0,
                    ..Budget::default()
                },
            )
            .unwrap();
            check_outputs(&system, &quick);
            assert!(quick.lower_bound <= r.terms.len());
            if r.proven_minimal {
                assert!((r.terms.len(), r.literals()) <= (quick.terms.len(), quick.literals()));
            }
        }
    }
}

#[test]
fn clear_outcomes_for_odd_requests() {
    let empty = minimize_multi(&[], &Budget::default()).unwrap();
    assert!(empty.terms.is_empty() && empty.proven_minimal);
    let mixed = [
        (TruthTable::var(3, 0), TruthTable::zero(3)),
        (TruthTable::var(4, 0), TruthTable::zero(4)),
    ];
    let err = minimize_multi(&mixed, &Budget::default()).unwrap_err();
    assert!(err.reason.contains("different inputs"), "{}", err.reason);
    let many = vec![(TruthTable::var(3, 1), TruthTable::zero(3)); MAX_OUTPUTS + 1];
    let err = minimize_multi(&many, &Budget::default()).unwrap_err();
    assert!(err.reason.contains("outputs"), "{}", err.reason);
    // The same function twice: one set of terms serves both.
    let f = TruthTable::var(3, 0).or(&TruthTable::var(3, 2));
    let twice = [(f.clone(), TruthTable::zero(3)), (f, TruthTable::zero(3))];
    let r = minimize_multi(&twice, &Budget::default()).unwrap();
    assert_eq!(
        (r.terms.len(), r.separate_terms, r.shared().len()),
        (2, 4, 2)
    );
}

#[test]
fn kiosk_digit_display_shares_terms() {
    // A 4-bit digit drives seven segments; codes 10 to 15 never occur (the
    // segment patterns of decimal digits are common practice; six and nine
    // drawn with their tails).
    const SEGMENTS: [u8; 10] = [
        0b111_1110, 0b011_0000, 0b110_1101, 0b111_1001, 0b011_0011, 0b101_1011, 0b101_1111,
        0b111_0000, 0b111_1111, 0b111_1011,
    ];
    let unused = TruthTable::from_minterms(4, &[10, 11, 12, 13, 14, 15]);
    let outputs: Vec<(TruthTable, TruthTable)> = (0..7)
        .map(|s| {
            let lit: Vec<usize> = (0..10)
                .filter(|&d| SEGMENTS[d] >> (6 - s) & 1 == 1)
                .collect();
            (TruthTable::from_minterms(4, &lit), unused.clone())
        })
        .collect();
    let r = minimize_multi(&outputs, &Budget::default()).unwrap();
    check_outputs(&outputs, &r);
    assert!(r.proven_minimal);
    assert!(!r.shared().is_empty());
    assert!(r.terms.len() < r.separate_terms);
}

#[test]
fn identical_outputs_cost_one_search() {
    // Sixteen outputs, all the constant 1 over 12 inputs: every set of them
    // has the same product, so none is branched on; the answer is the one
    // empty product, shared (common practice: 1 is the empty product).
    let one = (TruthTable::one(12), TruthTable::zero(12));
    let outputs = vec![one; MAX_OUTPUTS];
    let r = minimize_multi(&outputs, &Budget::default()).unwrap();
    check_outputs(&outputs, &r);
    assert_eq!((r.terms.len(), r.separate_terms), (1, 16));
    assert!(r.proven_minimal);
}

#[test]
fn past_the_work_for_the_sets_of_outputs_the_separate_covers_come_back_pooled() {
    // out_i = x9 | x_(i mod 9) over 10 inputs: sets of outputs with
    // different x_i have products of their own, 2^9 of them. With little
    // work the shared search is cut short, and the separate covers come
    // back put together: x9 once and each x_i, 10 terms (worked out by
    // hand), not proven, bounded by the 2 terms each output needs.
    let outputs: Vec<_> = (0..12)
        .map(|i| {
            let f = TruthTable::var(10, 9).or(&TruthTable::var(10, i % 9));
            (f, TruthTable::zero(10))
        })
        .collect();
    let small = Budget {
        max_work: 10_000,
        ..Budget::default()
    };
    let r = minimize_multi(&outputs, &small).unwrap();
    check_outputs(&outputs, &r);
    assert_eq!((r.terms.len(), r.separate_terms), (10, 24));
    assert!(!r.proven_minimal);
    assert_eq!(r.lower_bound, 2);
    // With the default budget the shared search runs, and finds the same.
    let full = minimize_multi(&outputs, &Budget::default()).unwrap();
    check_outputs(&outputs, &full);
    assert_eq!(full.terms.len(), 10);
    assert!(full.proven_minimal);
}
