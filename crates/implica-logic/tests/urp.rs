//! Cover operations without minterm enumeration (tautology, complement,
//! containment, equivalence, dependence), checked against the truth tables
//! of the same covers, which are computed minterm by minterm and share no
//! code with the recursive cover algorithms.

mod common;

use implica_logic::{Cover, Cube, Effort, Interrupted, TruthTable};
use proptest::prelude::*;

/// A random cube over `vars` inputs: each variable free, positive or
/// negative, free with probability `free_pct` percent.
fn cube(vars: usize, free_pct: u32) -> impl Strategy<Value = Cube> {
    proptest::collection::vec(0u32..100, vars).prop_map(move |rolls| {
        let mut c = Cube::universe(vars);
        for (i, r) in rolls.into_iter().enumerate() {
            if r >= free_pct {
                if r % 2 == 0 {
                    c.zero &= !(1 << i);
                } else {
                    c.one &= !(1 << i);
                }
            }
        }
        c
    })
}

fn cover(vars: usize, max_cubes: usize) -> impl Strategy<Value = Cover> {
    (40u32..90).prop_flat_map(move |free| {
        proptest::collection::vec(cube(vars, free), 0..max_cubes)
            .prop_map(move |cubes| Cover { vars, cubes })
    })
}

fn index_of(point: &[bool]) -> usize {
    point.iter().fold(0, |acc, &b| (acc << 1) | usize::from(b))
}

fn big() -> Effort<'static> {
    Effort::new(u64::MAX / 2)
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(400))]

    #[test]
    fn tautology_and_zero_point_agree_with_the_truth_table(f in cover(7, 24)) {
        let t = f.truth_table();
        prop_assert_eq!(f.is_tautology(&mut big()).unwrap(), t.is_one());
        match f.find_zero(&mut big()).unwrap() {
            None => prop_assert!(t.is_one()),
            Some(p) => prop_assert!(!t.get(index_of(&p)), "claimed zero at {:?}", p),
        }
    }

    #[test]
    fn complement_is_the_negation(f in cover(8, 20)) {
        let c = f.complement(&mut big()).unwrap();
        prop_assert_eq!(c.truth_table(), !&f.truth_table());
    }

    #[test]
    fn covers_and_equivalent_give_true_counterexamples(
        f in cover(6, 12), g in cover(6, 12), d in cover(6, 4),
    ) {
        let (tf, tg, td) = (f.truth_table(), g.truth_table(), d.truth_table());
        match f.covers(&g, &mut big()).unwrap() {
            None => prop_assert!(tf.covers(&tg)),
            Some(p) => {
                let m = index_of(&p);
                prop_assert!(tg.get(m) && !tf.get(m));
            }
        }
        let differ = tf.xor(&tg).and_not(&td);
        match f.equivalent(&g, &d, &mut big()).unwrap() {
            None => prop_assert!(differ.is_zero()),
            Some(p) => prop_assert!(differ.get(index_of(&p)), "no difference at {:?}", p),
        }
    }

    #[test]
    fn support_agrees_with_the_truth_table(f in cover(7, 10)) {
        let t = f.truth_table();
        prop_assert_eq!(f.support(&mut big()).unwrap(), t.support());
        for i in 0..7 {
            match f.depends_on(i, &mut big()).unwrap() {
                None => prop_assert!(!t.depends_on(i)),
                Some(p) => {
                    let m = index_of(&p);
                    prop_assert_ne!(t.get(m), t.get(m ^ (1 << (6 - i))));
                }
            }
        }
    }

    #[test]
    fn cofactor_agrees_inside_the_cube(f in cover(6, 12), p in cube(6, 60)) {
        let (t, tc) = (f.truth_table(), f.cofactor(&p).truth_table());
        for m in 0..64 {
            if p.contains_minterm(6, m) {
                prop_assert_eq!(t.get(m), tc.get(m));
            }
        }
        // The cofactor no longer depends on the variables the cube fixes.
        for i in 0..6 {
            if p.literal_of(i).is_some() {
                prop_assert!(!tc.depends_on(i));
            }
        }
    }
}

/// n-input parity as the sum of its 2^(n-1) odd minterms.
fn parity_cover(vars: usize) -> Cover {
    let cubes = (0..1usize << vars)
        .filter(|m| m.count_ones() % 2 == 1)
        .map(|m| Cube::minterm(vars, m))
        .collect();
    Cover { vars, cubes }
}

#[test]
fn the_complement_of_parity_is_the_even_minterms() {
    // The complement of n-input parity is the even-parity function, whose
    // only primes are its 2^(n-1) minterms (standard textbook result, as in
    // the check-values reference for parity).
    let c = parity_cover(10).complement(&mut big()).unwrap();
    assert_eq!(c.len(), 512);
    assert!(c.cubes.iter().all(|q| q.literals(10) == 10));
    assert_eq!(c.truth_table(), !&parity_cover(10).truth_table());
}

#[test]
fn sixty_four_inputs_without_enumeration() {
    let n = 64;
    let lit = |i, p| Cube::literal(n, i, p);
    // x0 | !x0 is a tautology; x0 & x63 | !x0 | !x63 too (common practice).
    let f = Cover {
        vars: n,
        cubes: vec![
            lit(0, true).and(&lit(63, true)),
            lit(0, false),
            lit(63, false),
        ],
    };
    assert!(f.is_tautology(&mut big()).unwrap());
    // Consensus theorem: xy + x'z + yz = xy + x'z (any digital-design text),
    // here with x = x10, y = x40, z = x63.
    let xy = lit(10, true).and(&lit(40, true));
    let xz = lit(10, false).and(&lit(63, true));
    let yz = lit(40, true).and(&lit(63, true));
    let with = Cover {
        vars: n,
        cubes: vec![xy, xz, yz],
    };
    let without = Cover {
        vars: n,
        cubes: vec![xy, xz],
    };
    assert_eq!(
        with.equivalent(&without, &Cover::zero(n), &mut big())
            .unwrap(),
        None
    );
    assert_eq!(with.support(&mut big()).unwrap(), vec![10, 40, 63]);
    // Dropping x'z changes the function; the counterexample shows where.
    let broken = Cover {
        vars: n,
        cubes: vec![xy, yz],
    };
    let p = with
        .equivalent(&broken, &Cover::zero(n), &mut big())
        .unwrap()
        .unwrap();
    assert_ne!(with.eval(&p), broken.eval(&p));
    // The product of 64 literals has a 64-cube complement.
    let all = (0..n).fold(Cube::universe(n), |c, i| c.and(&lit(i, i % 3 == 0)));
    let comp = Cover {
        vars: n,
        cubes: vec![all],
    }
    .complement(&mut big())
    .unwrap();
    assert_eq!(comp.len(), 64);
    assert!(!comp.eval(&all.point(n).unwrap()));
}

#[test]
fn budgets_and_cancellation_stop_the_work() {
    // 16-input parity: 2^15 cubes, and a complement as large.
    let f = parity_cover(16);
    assert_eq!(
        f.complement(&mut Effort::new(10_000)).unwrap_err(),
        Interrupted::OutOfBudget
    );
    assert_eq!(
        f.is_tautology(&mut Effort::new(10_000)).unwrap_err(),
        Interrupted::OutOfBudget
    );
    let stop = || true;
    assert_eq!(
        f.is_tautology(&mut Effort::unlimited().with_cancel(&stop))
            .unwrap_err(),
        Interrupted::Cancelled
    );
    // With enough budget the same questions are answered.
    assert!(!f.is_tautology(&mut big()).unwrap());
}

#[test]
fn empty_and_universal_covers() {
    let mut e = big();
    assert!(!Cover::zero(5).is_tautology(&mut e).unwrap());
    assert!(Cover::one(5).is_tautology(&mut e).unwrap());
    assert_eq!(Cover::zero(5).complement(&mut e).unwrap(), Cover::one(5));
    assert_eq!(Cover::one(5).complement(&mut e).unwrap(), Cover::zero(5));
    assert_eq!(Cover::zero(0).find_zero(&mut e).unwrap(), Some(vec![]));
    assert_eq!(TruthTable::one(5), Cover::one(5).truth_table());
}

#[test]
fn single_cube_containment_keeps_the_first_of_equal_cubes_and_drops_the_contained() {
    // Against the definition, cube by cube: larger cubes first (stable),
    // each kept unless an earlier kept cube contains it; empty cubes go.
    let mut rng = implica_testkit::Rng(0xC0_11A);
    for round in 0..300 {
        let vars = 1 + round % 40;
        let cubes: Vec<Cube> = (0..round % 600)
            .map(|_| {
                let mut c = common::random_cube_each(&mut rng, vars, 5);
                // A few empty cubes and many repeats.
                if rng.next().is_multiple_of(50) {
                    c = c
                        .and(&Cube::literal(vars, 0, true))
                        .and(&Cube::literal(vars, 0, false));
                }
                c
            })
            .collect();
        let mut want: Vec<Cube> = cubes
            .iter()
            .copied()
            .filter(|c| !c.is_empty(vars))
            .collect();
        want.sort_by_key(|c| c.literals(vars));
        let mut kept: Vec<Cube> = Vec::new();
        for c in want {
            if !kept.iter().any(|k| k.contains(&c)) {
                kept.push(c);
            }
        }
        let mut got = Cover { vars, cubes };
        got.remove_contained();
        assert_eq!(got.cubes, kept, "round {round}");
    }
}
