//! The checks of the `logic` target: a function built from the input bytes
//! goes through every operation of `implica_logic`, and the results must
//! agree with the function and with each other.

use implica_logic::{
    BoolExpr, Budget, Cover, Cube, Effort, GateKind, GateNetwork, TruthTable,
    classify_redundant_terms, hazard_free_cover, minimize_heuristic, minimize_multi, minimize_pos,
    minimize_sop, redundant_literals, static1_hazards,
};

/// Most inputs of a fuzzed function: 9 keeps an exact minimization with
/// the default budget to a few milliseconds, so the fuzzer stays fast.
pub const MAX_INPUTS: usize = 9;

/// The function a fuzz input stands for: byte 0 picks the number of inputs
/// (1 to [`MAX_INPUTS`]), byte 1 a budget, and from byte 2 on, two bits
/// per input row give its value: `00` and `11` off, `01` on, `10`
/// don't-care. Rows past the input's end are off. A second output (for the
/// multi-output check) is read the same way from where the first ends.
pub struct Case {
    /// Inputs of both outputs.
    pub vars: usize,
    /// The budget the checks run a second minimization with, beside the
    /// default one.
    pub budget: Budget,
    /// On-set and don't-cares of the two outputs.
    pub outputs: [(TruthTable, TruthTable); 2],
}

impl Case {
    /// Decodes a fuzz input.
    pub fn from_bytes(data: &[u8]) -> Case {
        let vars = 1 + data.first().map_or(0, |&b| b as usize % MAX_INPUTS);
        let budget = match data.get(1).map_or(0, |&b| b % 4) {
            0 => Budget::default(),
            1 => Budget {
                max_work: 0,
                ..Budget::default()
            },
            2 => Budget {
                max_work: 2_000,
                ..Budget::default()
            },
            _ => Budget {
                max_nodes: 1,
                ..Budget::default()
            },
        };
        let rows = 1usize << vars;
        let bits = data.get(2..).unwrap_or(&[]);
        let row = |k: usize| bits.get(k / 4).map_or(0, |&b| (b >> (2 * (k % 4))) & 3);
        let table = |first: usize| {
            let mut on = TruthTable::zero(vars);
            let mut dc = TruthTable::zero(vars);
            for m in 0..rows {
                match row(first + m) {
                    1 => on.set(m, true),
                    2 => dc.set(m, true),
                    _ => {}
                }
            }
            (on, dc)
        };
        Case {
            vars,
            budget,
            outputs: [table(0), table(rows)],
        }
    }
}

/// `cover` is 1 wherever `on` is required and 0 wherever the function is 0.
fn assert_implements(cover: &TruthTable, on: &TruthTable, dc: &TruthTable, what: &str) {
    assert!(
        cover.covers(&on.and_not(dc)),
        "{what} misses a required row"
    );
    assert!(
        on.or(dc).covers(cover),
        "{what} is 1 on a row where the function is 0"
    );
}

/// Every cube of `cover` lies in `allowed` and is maximal there: dropping
/// any one of its literals leaves `allowed`.
fn assert_primes(cover: &Cover, allowed: &TruthTable, what: &str) {
    let vars = cover.vars;
    for c in &cover.cubes {
        assert!(
            allowed.covers(&c.truth_table(vars)),
            "{what}: {c:?} is not an implicant"
        );
        for i in 0..vars {
            if c.literal_of(i).is_some() {
                let grown = Cube {
                    zero: c.zero | 1 << i,
                    one: c.one | 1 << i,
                };
                assert!(
                    !allowed.covers(&grown.truth_table(vars)),
                    "{what}: {c:?} is not prime (input {i} can go)"
                );
            }
        }
    }
}

/// Runs every check on the function `data` stands for; panics on the first
/// that fails.
pub fn check_logic(data: &[u8]) {
    let case = Case::from_bytes(data);
    let vars = case.vars;
    let (on, dc) = &case.outputs[0];
    let allowed = on.or(dc);
    let off = !&allowed;

    // Exact sum of products, with the default budget and with the case's.
    let best = minimize_sop(on, dc, &Budget::default()).expect("within the default budget");
    let quick = minimize_sop(on, dc, &case.budget).expect("within the case's budget");
    for (m, what) in [
        (&best, "sum of products"),
        (&quick, "sum of products, case budget"),
    ] {
        assert_implements(&m.cover.truth_table(), on, dc, what);
        assert_primes(&m.cover, &allowed, what);
        assert!(
            m.lower_bound <= m.cover.len(),
            "{what}: bound above the cover"
        );
        assert!(
            !m.proven_minimal || m.lower_bound == m.cover.len(),
            "{what}: proven, yet below its bound"
        );
        assert!(
            redundant_literals(&m.cover, dc).is_empty(),
            "{what}: a prime has a redundant literal"
        );
    }
    // The two searches bound each other: no cover is below either's bound.
    assert!(quick.lower_bound <= best.cover.len() && best.lower_bound <= quick.cover.len());
    if best.proven_minimal {
        assert!(
            quick.cover.len() > best.cover.len() || quick.cover.literals() >= best.cover.literals()
        );
        assert!(
            classify_redundant_terms(&best.cover, dc).is_empty(),
            "a minimal cover has a redundant term"
        );
        if quick.proven_minimal {
            assert_eq!(
                (quick.cover.len(), quick.cover.literals()),
                (best.cover.len(), best.cover.literals())
            );
        }
    }

    // Product of sums: its cubes are the complement's terms.
    let pos = minimize_pos(on, dc, &Budget::default()).expect("within the default budget");
    assert_implements(&!&pos.cover.truth_table(), on, dc, "product of sums");
    assert_primes(&pos.cover, &off.or(dc), "product of sums");

    // The heuristic, from the on-set's minterms: never larger, never wrong,
    // never below the exact search's proven bound.
    let minterms = Cover::from_truth_table;
    let start = minterms(&on.and_not(dc));
    let h = minimize_heuristic(&start, &minterms(dc), &mut Effort::new(5_000_000))
        .expect("not cancelled");
    assert_implements(&h.cover.truth_table(), on, dc, "heuristic");
    assert!(h.cover.len() <= start.len(), "the heuristic grew the cover");
    assert!(
        h.cover.len() >= best.lower_bound,
        "the heuristic beat a proven bound"
    );
    assert!(
        h.lower_bound <= best.cover.len(),
        "the heuristic's bound is above a cover"
    );
    if h.proven_minimal && best.proven_minimal {
        assert_eq!(
            (h.cover.len(), h.cover.literals()),
            (best.cover.len(), best.cover.literals()),
            "the heuristic's proof disagrees with the exact one"
        );
    }

    // Hazard-free cover: the same function, with no static-1 hazard left.
    let free = hazard_free_cover(&best.cover, on, dc, &Budget::default())
        .expect("the cover is the function");
    assert_implements(&free.truth_table(), on, dc, "hazard-free cover");
    assert!(static1_hazards(&free, dc).is_empty(), "a hazard is left");
    assert!(free.len() >= best.cover.len());

    // NAND-only and NOR-only networks compute the expression they came from.
    let e = BoolExpr::from_cover(&best.cover);
    let want = e.truth_table(vars);
    for kind in [GateKind::Nand, GateKind::Nor] {
        let net = GateNetwork::from_expr(&e, kind);
        assert!(net.uses_only(kind));
        assert_eq!(
            net.truth_table(vars).expect("inputs in range"),
            want,
            "{kind:?} network"
        );
    }

    // Both outputs together: each is right, and sharing never costs more
    // terms than minimizing them one by one.
    let multi =
        minimize_multi(&case.outputs, &Budget::default()).expect("within the default budget");
    for (i, (on, dc)) in case.outputs.iter().enumerate() {
        assert_implements(&multi.cover(i).truth_table(), on, dc, "multi-output cover");
    }
    assert!(multi.lower_bound <= multi.terms.len());
    assert!(
        multi.terms.len() <= multi.separate_terms,
        "sharing cost more terms"
    );
}
