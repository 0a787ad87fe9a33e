//! Redundancy and hazard analyses, checked against standard identities and
//! a published hazard example.

mod common;

use implica_logic::{
    Budget, Cover, Cube, Redundancy, TruthTable, classify_redundant_terms, hazard_free_cover,
    minimize_sop, redundant_literals, redundant_terms, static0_hazards, static1_hazards,
};

/// A cover from terms written as strings over A, B, C, D: `AB'` is A & !B.
fn cover(vars: usize, terms: &[&str]) -> Cover {
    let cubes = terms
        .iter()
        .map(|t| {
            let mut c = Cube::universe(vars);
            let chars: Vec<char> = t.chars().collect();
            let mut i = 0;
            while i < chars.len() {
                let v = (chars[i] as u8 - b'A') as usize;
                let negated = chars.get(i + 1) == Some(&'\'');
                c = c.and(&Cube::literal(vars, v, !negated));
                i += if negated { 2 } else { 1 };
            }
            c
        })
        .collect();
    Cover { vars, cubes }
}

#[test]
fn consensus_term_is_redundant() {
    // Consensus theorem xy + x'z + yz = xy + x'z: a standard Boolean-algebra
    // identity (common practice; stated in digital-design texts, e.g.
    // M. M. Mano, Digital Design, from memory).
    let c = cover(3, &["AB", "A'C", "BC"]);
    assert_eq!(redundant_terms(&c, &TruthTable::zero(3)), vec![2]);
    let without = Cover {
        vars: 3,
        cubes: c.cubes[..2].to_vec(),
    };
    assert_eq!(without.truth_table(), c.truth_table());
}

#[test]
fn absorbed_and_duplicate_terms_are_redundant() {
    // Absorption x + xy = x (standard identity, common practice).
    let c = cover(2, &["A", "AB"]);
    assert_eq!(redundant_terms(&c, &TruthTable::zero(2)), vec![1]);
    // A duplicate: each copy is redundant given the other.
    let d = cover(2, &["AB", "AB", "A'B'"]);
    assert_eq!(redundant_terms(&d, &TruthTable::zero(2)), vec![0, 1]);
    // An irredundant cover has none.
    assert!(redundant_terms(&cover(2, &["AB", "A'B'"]), &TruthTable::zero(2)).is_empty());
}

#[test]
fn a_term_covered_only_thanks_to_dont_cares_is_redundant() {
    // AB + A'B' + B'C with AB'C a don't-care (minterm 5): B'C covers 001 and
    // 101; 001 is in A'B', 101 is free.
    let c = cover(3, &["AB", "A'B'", "B'C"]);
    assert!(redundant_terms(&c, &TruthTable::zero(3)).is_empty());
    assert_eq!(
        redundant_terms(&c, &TruthTable::from_minterms(3, &[5])),
        vec![2]
    );
}

#[test]
fn redundant_literal() {
    // AB + AB'C = AB + AC (common practice): the B' of the second term can go.
    let c = cover(3, &["AB", "AB'C"]);
    assert_eq!(redundant_literals(&c, &TruthTable::zero(3)), vec![(1, 1)]);
}

#[test]
fn static_one_hazards_and_the_hazard_free_cover() {
    // R. H. Katz, Contemporary Logic Design, chapter on hazards:
    // f(A,B,C,D) = Σm(1, 3, 5, 7, 8, 9, 12, 13, 14, 15); the minimal sum
    // A'D + AC' + AB has static-1 hazards between (1,9), (5,13), (7,15); the
    // hazard-free sum needs all five primes A'D + AC' + AB + BD + C'D.
    let on = TruthTable::from_minterms(4, &[1, 3, 5, 7, 8, 9, 12, 13, 14, 15]);
    let none = TruthTable::zero(4);
    let minimal = minimize_sop(&on, &none, &Budget::default()).unwrap();
    assert_eq!(minimal.cover.len(), 3);
    assert_eq!(
        static1_hazards(&minimal.cover, &none),
        vec![(1, 9), (5, 13), (7, 15)]
    );
    let free = hazard_free_cover(&minimal.cover, &on, &none, &Budget::default()).unwrap();
    assert!(static1_hazards(&free, &none).is_empty());
    assert_eq!(free.truth_table(), on);
    let mut got: Vec<Cube> = free.cubes.clone();
    got.sort();
    let mut all = cover(4, &["A'D", "AC'", "AB", "BD", "C'D"]).cubes;
    all.sort();
    assert_eq!(got, all);
}

#[test]
fn static_zero_hazard_of_a_product_of_sums() {
    // f = (A + B)(A' + C): the sum terms are 0 on A'B' and on AC'; the
    // adjacent zeros 000 and 100 lie in no single sum term (the dual of the
    // static-1 case; common practice). The complement's sum of products is
    // A'B' + AC'.
    let complement = cover(3, &["A'B'", "AC'"]);
    assert_eq!(
        static0_hazards(&complement, &TruthTable::zero(3)),
        vec![(0, 4)]
    );
}

#[test]
fn a_hazard_free_cover_of_another_function_is_refused() {
    // The cover A'D + AC' (the example above without its third term) is not
    // the function Σm(1, 3, 5, 7, 8, 9, 12, 13, 14, 15): it misses rows 14
    // and 15 (ABCD' and ABCD, which only AB covered). Asked to mend it, the analysis says
    // where they differ instead of adding primes of a function the cover
    // does not compute (this used to end in a panic).
    let on = TruthTable::from_minterms(4, &[1, 3, 5, 7, 8, 9, 12, 13, 14, 15]);
    let none = TruthTable::zero(4);
    let partial = cover(4, &["A'D", "AC'"]);
    let err = hazard_free_cover(&partial, &on, &none, &Budget::default()).unwrap_err();
    assert!(
        err.reason.contains("differ at input row 14"),
        "{}",
        err.reason
    );
    // Under don't-cares on rows 14 and 15 the same cover is the function,
    // and is mended.
    let dc = TruthTable::from_minterms(4, &[14, 15]);
    let free = hazard_free_cover(&partial, &on, &dc, &Budget::default()).unwrap();
    assert!(static1_hazards(&free, &dc).is_empty());
    // A cover over other inputs is refused too.
    let three = TruthTable::zero(3);
    let err = hazard_free_cover(&partial, &three, &three, &Budget::default()).unwrap_err();
    assert!(err.reason.contains("over 4 inputs"), "{}", err.reason);
}

#[test]
fn redundant_terms_are_classified() {
    // Absorption x + xy = x and the consensus theorem xy + x'z + yz =
    // xy + x'z (Boolean-algebra identities; the project's reference list
    // gives them as "any digital-design text").
    let none = TruthTable::zero(3);
    assert_eq!(
        classify_redundant_terms(&cover(3, &["A", "AB"]), &none),
        vec![(1, Redundancy::Absorbed { by: 0 })]
    );
    assert_eq!(
        classify_redundant_terms(&cover(3, &["AB", "A'C", "BC"]), &none),
        vec![(
            2,
            Redundancy::Covered {
                with_dont_cares: false
            }
        )]
    );
    // B'C is covered by A'B' on 001 and by the don't-care on 101.
    let dc = TruthTable::from_minterms(3, &[5]);
    assert_eq!(
        classify_redundant_terms(&cover(3, &["AB", "A'B'", "B'C"]), &dc),
        vec![(
            2,
            Redundancy::Covered {
                with_dont_cares: true
            }
        )]
    );
    // AB'C alone is the don't-care: 1 only where the value is free.
    assert_eq!(
        classify_redundant_terms(&cover(3, &["AB", "AB'C"]), &dc),
        vec![(1, Redundancy::DontCaresOnly)]
    );
    // Two copies: each names the other.
    assert_eq!(
        classify_redundant_terms(&cover(3, &["AB", "C", "AB"]), &none),
        vec![
            (0, Redundancy::Duplicate { of: 2 }),
            (2, Redundancy::Duplicate { of: 0 })
        ]
    );
}

/// The definitions, evaluated directly on minterms: a term holds a row
/// when it evaluates to 1 there.
mod direct {
    use implica_logic::{Cover, Cube, TruthTable};

    pub fn holds(c: &Cube, vars: usize, m: usize) -> bool {
        let inputs: Vec<bool> = (0..vars).map(|i| (m >> (vars - 1 - i)) & 1 == 1).collect();
        Cover {
            vars,
            cubes: vec![*c],
        }
        .eval(&inputs)
    }

    fn required(cover: &Cover, dc: &TruthTable) -> Vec<bool> {
        (0..1usize << cover.vars)
            .map(|m| !dc.get(m) && cover.cubes.iter().any(|c| holds(c, cover.vars, m)))
            .collect()
    }

    /// Adjacent required rows that no single term holds both of.
    pub fn hazards(cover: &Cover, dc: &TruthTable) -> Vec<(usize, usize)> {
        let (vars, need) = (cover.vars, required(cover, dc));
        let mut out = Vec::new();
        for a in 0..1usize << vars {
            for bit in 0..vars {
                let b = a | 1 << bit;
                if b != a && need[a] && need[b] {
                    let one = cover
                        .cubes
                        .iter()
                        .any(|c| holds(c, vars, a) && holds(c, vars, b));
                    if !one {
                        out.push((a, b));
                    }
                }
            }
        }
        out.sort();
        out
    }

    /// Terms whose required rows the other terms all hold.
    pub fn redundant(cover: &Cover, dc: &TruthTable) -> Vec<usize> {
        let (vars, need) = (cover.vars, required(cover, dc));
        (0..cover.len())
            .filter(|&i| {
                (0..1usize << vars).all(|m| {
                    !need[m]
                        || cover
                            .cubes
                            .iter()
                            .enumerate()
                            .any(|(j, c)| j != i && holds(c, vars, m))
                })
            })
            .collect()
    }
}

#[test]
fn the_analyses_agree_with_their_definitions_evaluated_row_by_row() {
    let mut rng = implica_testkit::Rng(0x4A2A);
    let mut seen = (0, 0);
    for round in 0..400 {
        let vars = 2 + round % 7;
        let cubes = (0..1 + round % 14)
            .map(|_| common::random_cube_each(&mut rng, vars, 3))
            .collect();
        let f = Cover { vars, cubes };
        let mut dc = TruthTable::zero(vars);
        for m in 0..1usize << vars {
            if rng.next().is_multiple_of(6) {
                dc.set(m, true);
            }
        }
        let hazards = static1_hazards(&f, &dc);
        assert_eq!(hazards, direct::hazards(&f, &dc), "round {round}");
        let redundant = redundant_terms(&f, &dc);
        assert_eq!(redundant, direct::redundant(&f, &dc), "round {round}");
        let classes = classify_redundant_terms(&f, &dc);
        assert_eq!(
            classes.iter().map(|&(i, _)| i).collect::<Vec<_>>(),
            redundant
        );
        for &(i, why) in &classes {
            if let Redundancy::Covered { with_dont_cares } = why {
                // Covered without the don't-cares: every row of the term is
                // held by another term.
                let by_others = (0..1usize << vars).all(|m| {
                    !direct::holds(&f.cubes[i], vars, m)
                        || f.cubes
                            .iter()
                            .enumerate()
                            .any(|(j, c)| j != i && direct::holds(c, vars, m))
                });
                assert_eq!(with_dont_cares, !by_others, "round {round}");
            }
        }
        // The hazard-free cover: the same function, no hazard left, and
        // only primes added.
        let on = f.truth_table();
        let free = hazard_free_cover(&f, &on, &dc, &Budget::default()).unwrap();
        assert!(direct::hazards(&free, &dc).is_empty(), "round {round}");
        let care = !&dc;
        assert_eq!(
            free.truth_table().and(&care),
            on.and(&care),
            "round {round}"
        );
        assert_eq!(&free.cubes[..f.len()], &f.cubes[..]);
        seen.0 += hazards.len();
        seen.1 += redundant.len();
    }
    // The random covers have hazards and redundant terms to find.
    assert!(seen.0 > 100 && seen.1 > 100, "{seen:?}");
}
