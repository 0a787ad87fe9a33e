//! The heuristic minimizer: equivalent and never larger, on small functions
//! (checked by truth table and against the exact minimum) and on wide covers
//! of 24 to 40 inputs (checked without enumeration: by cube containment,
//! which tests/urp.rs and tests/bdd.rs check against truth tables and
//! diagrams, by a diagram where one fits, and by simulation on random
//! vectors, which shares no code with either).

mod common;
use common::{random_cover, random_functions};
use implica_logic::{
    Bdd, Budget, Cover, Cube, Effort, Interrupted, TruthTable, minimize_heuristic, minimize_sop,
};
use implica_testkit::Rng;

fn cost(c: &Cover) -> (usize, usize) {
    (c.len(), c.literals())
}

fn big() -> Effort<'static> {
    Effort::new(u64::MAX / 2)
}

/// Every cube lies in `allowed` and loses it when any literal is dropped:
/// a converged loop ends on an expansion, which leaves only primes.
fn assert_primes(cover: &Cover, allowed: &TruthTable, round: usize) {
    for c in &cover.cubes {
        assert!(
            allowed.covers(&c.truth_table(cover.vars)),
            "round {round}: {c:?} leaves on | dc"
        );
        for i in (0..cover.vars).filter(|&i| c.literal_of(i).is_some()) {
            let grown = Cube {
                zero: c.zero | 1 << i,
                one: c.one | 1 << i,
            };
            assert!(
                !allowed.covers(&grown.truth_table(cover.vars)),
                "round {round}: {c:?} is not prime (input {i} can go)"
            );
        }
    }
}

#[test]
fn small_functions_are_equivalent_and_no_smaller_than_the_exact_minimum() {
    let mut rng = Rng(0xA11CE);
    let mut reached_minimum = 0;
    let rounds = 300;
    for round in 0..rounds {
        let vars = 3 + round % 6;
        let on = random_cover(&mut rng, vars, 2 + round % 12, 2 + round % 3);
        let dc = random_cover(&mut rng, vars, round % 3, vars - 1);
        let r = minimize_heuristic(&on, &dc, &mut big()).unwrap();
        assert!(r.complete);
        let (ton, tdc) = (on.truth_table(), dc.truth_table());
        let need = ton.and_not(&tdc);
        let got = r.cover.truth_table();
        assert!(got.covers(&need), "round {round}: lost part of the on-set");
        assert!(ton.or(&tdc).covers(&got), "round {round}: left on | dc");
        assert!(cost(&r.cover) <= cost(&on), "round {round}: grew");
        assert_primes(&r.cover, &ton.or(&tdc), round);
        let exact = minimize_sop(&need, &tdc, &Budget::default()).unwrap();
        assert!(exact.proven_minimal);
        // The heuristic's certificate never claims more than is true.
        assert!(
            r.lower_bound <= exact.cover.len(),
            "round {round}: bound above the minimum"
        );
        if r.proven_minimal {
            assert_eq!(
                cost(&r.cover),
                cost(&exact.cover),
                "round {round}: proven, not minimal"
            );
        }
        assert!(
            cost(&exact.cover) <= cost(&r.cover),
            "round {round}: better than a proven minimum"
        );
        if cost(&exact.cover) == cost(&r.cover) {
            reached_minimum += 1;
        }
    }
    eprintln!("heuristic reached the exact minimum in {reached_minimum} of {rounds}");
    // A heuristic, but a good one: it finds the minimum most of the time on
    // functions this small (the figure is what this implementation does,
    // kept as a guard against quality regressions).
    assert!(
        reached_minimum * 100 >= rounds * 95,
        "minimum reached in only {reached_minimum} of {rounds}"
    );
}

#[test]
fn published_examples() {
    // Wikipedia, "Quine–McCluskey algorithm": f = Σm(4,8,10,11,12,15) +
    // d(9,14) has a minimum of 3 terms and 7 literals.
    let on = TruthTable::from_minterms(4, &[4, 8, 10, 11, 12, 15]);
    let dc = TruthTable::from_minterms(4, &[9, 14]);
    let r = minimize_heuristic(
        &Cover::from_truth_table(&on),
        &Cover::from_truth_table(&dc),
        &mut big(),
    )
    .unwrap();
    assert_eq!(cost(&r.cover), (3, 7));
    // Full adder carry = AB + ACin + BCin (common practice): 3 terms, 6 literals.
    let carry = TruthTable::from_minterms(3, &[3, 5, 6, 7]);
    let r = minimize_heuristic(
        &Cover::from_truth_table(&carry),
        &Cover::zero(3),
        &mut big(),
    )
    .unwrap();
    assert_eq!(cost(&r.cover), (3, 6));
    // n-input parity cannot be made smaller than its 2^(n-1) minterms
    // (standard textbook result); the heuristic returns it unchanged.
    let odd: Vec<usize> = (0..256)
        .filter(|m: &usize| m.count_ones() % 2 == 1)
        .collect();
    let parity = Cover::from_truth_table(&TruthTable::from_minterms(8, &odd));
    let r = minimize_heuristic(&parity, &Cover::zero(8), &mut big()).unwrap();
    assert_eq!(cost(&r.cover), (128, 1024));
    // Every minterm of parity is alone (its neighbours are even), so the
    // certificate proves it: 128 terms, at least 128 needed.
    assert_eq!((r.proven_minimal, r.lower_bound), (true, 128));
    // The Quine–McCluskey example's minterms all have neighbours: no bound
    // beyond 0 is known, and nothing is proven.
    let qm = minimize_heuristic(
        &Cover::from_truth_table(&on),
        &Cover::from_truth_table(&dc),
        &mut big(),
    )
    .unwrap();
    assert_eq!((qm.proven_minimal, qm.lower_bound), (false, 0));
}

#[test]
fn a_shattered_cover_of_forty_inputs_comes_back_whole() {
    // f = x0 x1 | x2 !x3 x4 | x30 x39 over 40 inputs, each term split into
    // pieces along other variables: the three terms are its only primes
    // that matter (no two have opposite literals, so there is no consensus),
    // hence its unique minimum.
    let n = 40;
    let lit = |i, p| Cube::literal(n, i, p);
    let terms = [
        lit(0, true).and(&lit(1, true)),
        lit(2, true).and(&lit(3, false)).and(&lit(4, true)),
        lit(30, true).and(&lit(39, true)),
    ];
    let mut pieces = Vec::new();
    for (k, t) in terms.iter().enumerate() {
        let splits = [10 + k, 17 + k, 25 + k, 33 + k];
        for m in 0..16usize {
            let mut c = *t;
            for (b, &v) in splits.iter().enumerate() {
                c = c.and(&lit(v, m >> b & 1 == 1));
            }
            pieces.push(c);
        }
    }
    let on = Cover {
        vars: n,
        cubes: pieces,
    };
    let r = minimize_heuristic(&on, &Cover::zero(n), &mut big()).unwrap();
    let mut got = r.cover.cubes.clone();
    got.sort();
    let mut want = terms.to_vec();
    want.sort();
    assert_eq!(got, want);
}

/// The value of a cover at a random vector, evaluated directly.
fn simulate(rng: &mut Rng, a: &Cover, b: &Cover, dc: &Cover, vectors: usize) -> Option<Vec<bool>> {
    for _ in 0..vectors {
        let bits = rng.next();
        let p: Vec<bool> = (0..a.vars).map(|i| bits >> i & 1 == 1).collect();
        if !dc.eval(&p) && a.eval(&p) != b.eval(&p) {
            return Some(p);
        }
    }
    None
}

#[test]
fn wide_random_covers_stay_equivalent_and_shrink() {
    let mut rng = Rng(0x0DD_BA11);
    let mut shrunk = 0;
    let mut by_diagram = 0;
    let cases = [
        (24, 50),
        (24, 400),
        (28, 120),
        (32, 50),
        (32, 200),
        (36, 80),
        (40, 50),
        (40, 150),
    ];
    for (round, &(vars, terms)) in cases.iter().enumerate() {
        let on = random_cover(&mut rng, vars, terms, 10);
        let dc = random_cover(&mut rng, vars, terms / 10, 14);
        let r = minimize_heuristic(&on, &dc, &mut Effort::new(60_000_000)).unwrap();
        assert!(cost(&r.cover) <= cost(&on), "round {round}: grew");
        if cost(&r.cover) < cost(&on) {
            shrunk += 1;
        }
        // Containment both ways, under the don't-cares.
        assert_eq!(
            r.cover.equivalent(&on, &dc, &mut big()).unwrap(),
            None,
            "round {round}"
        );
        assert_eq!(
            simulate(&mut rng, &r.cover, &on, &dc, 20_000),
            None,
            "round {round}"
        );
        // A diagram, when it fits in 1M nodes: (on & !dc) must imply the
        // result, and the result must imply on | dc.
        let mut b = Bdd::with_max_nodes(vars, 1 << 20);
        let mut e = Effort::new(20_000_000);
        let check = (|| {
            let (fo, fd, fr) = (
                b.from_cover(&on, &mut e)?,
                b.from_cover(&dc, &mut e)?,
                b.from_cover(&r.cover, &mut e)?,
            );
            let d = b.xor(fo, fr, &mut e)?;
            let nd = b.not(fd, &mut e)?;
            b.and(d, nd, &mut e)
        })();
        if let Ok(diff) = check {
            by_diagram += 1;
            assert_eq!(b.any_one(diff), None, "round {round}");
        }
    }
    eprintln!(
        "{shrunk} of {} shrank, {by_diagram} checked by a diagram",
        cases.len()
    );
    assert!(
        shrunk >= cases.len() - 1,
        "only {shrunk} of {} shrank",
        cases.len()
    );
    assert!(by_diagram >= 3, "only {by_diagram} checked by a diagram");
}

#[test]
fn budget_and_cancellation() {
    let mut rng = Rng(0xFEED);
    let on = random_cover(&mut rng, 32, 200, 10);
    // Far too little work: the input comes back, marked incomplete.
    let r = minimize_heuristic(&on, &Cover::zero(32), &mut Effort::new(1_000)).unwrap();
    assert!(!r.complete);
    assert_eq!(r.cover, on);
    let stop = || true;
    let e = minimize_heuristic(
        &on,
        &Cover::zero(32),
        &mut Effort::unlimited().with_cancel(&stop),
    );
    assert_eq!(e.unwrap_err(), Interrupted::Cancelled);
}

#[test]
fn a_budget_too_small_for_one_pass_still_gives_a_smaller_verified_cover() {
    // A random 12-input function started from its 1,505 required minterms
    // (the exact minimizer's benchmark distribution). The budget ends the
    // first expansion part-way: the cubes expanded so far, with the others
    // as they were, are the function, and smaller than the start.
    let (on, dc) = random_functions(12, 1, 0x9E37_79B9_7F4A_7C15 ^ 12).remove(0);
    let need = on.and_not(&dc);
    let (start, free) = (Cover::from_truth_table(&need), Cover::from_truth_table(&dc));
    assert_eq!(start.len(), 1_505);
    let whole = minimize_heuristic(&start, &free, &mut big()).unwrap();
    assert!(whole.complete);
    let mut effort = Effort::new(BUDGET_FOR_PART_OF_A_PASS);
    let r = minimize_heuristic(&start, &free, &mut effort).unwrap();
    assert!(!r.complete);
    assert_eq!(r.passes, 0, "the budget should end the first pass");
    let got = r.cover.truth_table();
    assert!(got.covers(&need) && on.or(&dc).covers(&got));
    assert!(
        r.cover.len() < start.len() && r.cover.len() > whole.cover.len(),
        "{} terms from {}, {} when converged",
        r.cover.len(),
        start.len(),
        whole.cover.len()
    );
    assert!(effort.used() <= BUDGET_FOR_PART_OF_A_PASS);
}

/// Enough for the off-set and part of the first expansion of the function
/// above, and for the check of what it made.
const BUDGET_FOR_PART_OF_A_PASS: u64 = 200_000;
