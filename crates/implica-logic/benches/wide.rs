//! Operations on wide functions: equivalence of 20-input truth tables,
//! diagrams of 64-input expressions, and heuristic minimization of random
//! covers of 24 to 40 inputs. Run with `cargo bench -p implica-logic --bench
//! wide`; figures go in docs/benchmarks.md.

#[path = "../tests/common/mod.rs"]
mod common;
use common::{random_cover, random_functions};
use divan::Bencher;
use implica_logic::{Bdd, BoolExpr, Cover, Effort, TruthTable, minimize_heuristic};
use implica_testkit::Rng;

#[global_allocator]
static GLOBAL: mimalloc::MiMalloc = mimalloc::MiMalloc;

fn main() {
    // With IMPLICA_BENCH_SUMMARY=1, first print what the heuristic achieves.
    if std::env::var_os("IMPLICA_BENCH_SUMMARY").is_some() {
        for &(vars, terms) in HEURISTIC_CASES {
            let on = random_cover(&mut Rng(SEED ^ vars as u64 ^ terms as u64), vars, terms, 10);
            let mut e = Effort::new(BUDGET);
            let r = minimize_heuristic(&on, &Cover::zero(vars), &mut e).expect("not cancelled");
            println!(
                "{vars} inputs, {terms} terms ({} literals): {} terms, {} literals, complete: {}, work {}",
                on.literals(),
                r.cover.len(),
                r.cover.literals(),
                r.complete,
                e.used()
            );
        }
        for &vars in MINTERM_CASES {
            for (i, (on, dc)) in minterm_starts(vars).iter().enumerate() {
                let mut e = Effort::new(BUDGET);
                let r = minimize_heuristic(on, dc, &mut e).expect("not cancelled");
                println!(
                    "{vars} inputs from {} minterms (function {i}): {} terms, {} literals, complete: {}, work {}",
                    on.len(),
                    r.cover.len(),
                    r.cover.literals(),
                    r.complete,
                    e.used()
                );
            }
        }
    }
    divan::main();
}

const SEED: u64 = 0x0123_4567_89AB_CDEF;
const BUDGET: u64 = 200_000_000;
const HEURISTIC_CASES: &[(usize, usize)] = &[(24, 50), (24, 400), (32, 200), (40, 50), (40, 400)];

/// Two equal random 20-input functions: the comparison reads all 16,384
/// words, the worst case for an equivalence check.
#[divan::bench(sample_count = 50)]
fn equivalence_20_inputs(bencher: Bencher) {
    let mut rng = Rng(SEED);
    let mut a = TruthTable::zero(20);
    for m in 0..1usize << 20 {
        a.set(m, rng.next().is_multiple_of(2));
    }
    let b = a.clone();
    bencher.bench_local(|| divan::black_box(&a).counterexample(divan::black_box(&b)));
}

/// `a > b` for two 32-bit numbers, bits interleaved (a31 b31 a30 b30 ...),
/// as a ripple expression from the least significant bit: 64 inputs.
fn comparator_64() -> BoolExpr {
    let (a, b) = (
        |i: usize| BoolExpr::Var(2 * (31 - i)),
        |i: usize| BoolExpr::Var(2 * (31 - i) + 1),
    );
    let mut gt = BoolExpr::Const(false);
    for i in 0..32 {
        // gt_i = a_i & !b_i | (a_i == b_i) & gt_{i-1}
        let eq = BoolExpr::negate(BoolExpr::Xor(vec![a(i), b(i)]));
        gt = BoolExpr::Or(vec![
            BoolExpr::And(vec![a(i), BoolExpr::negate(b(i))]),
            BoolExpr::And(vec![eq, gt]),
        ]);
    }
    gt
}

/// Builds the 64-input comparator twice (once with the operands swapped
/// and negated: `a > b` is `!(b >= a)`) and compares them.
#[divan::bench(sample_count = 20)]
fn equivalence_64_inputs_by_diagram() -> bool {
    let f = comparator_64();
    let mut bdd = Bdd::new(64);
    let mut e = Effort::unlimited();
    let x = bdd.from_expr(&f, &mut e).expect("fits");
    let y = bdd.from_expr(&f, &mut e).expect("fits");
    bdd.counterexample(x, y, &mut e).expect("fits").is_none()
}

#[divan::bench(args = HEURISTIC_CASES, sample_count = 3)]
fn heuristic(bencher: Bencher, case: (usize, usize)) {
    let (vars, terms) = case;
    let on = random_cover(&mut Rng(SEED ^ vars as u64 ^ terms as u64), vars, terms, 10);
    let dc = Cover::zero(vars);
    bencher.bench_local(|| minimize_heuristic(&on, &dc, &mut Effort::new(BUDGET)));
}

const MINTERM_CASES: &[usize] = &[12, 14];

/// The first two random functions of the exact minimizer's benchmark
/// (`random_with_dont_cares` in benches/minimize.rs), as covers of their
/// required minterms and of their don't-care minterms: the heuristic's
/// hardest start, one cube per row.
fn minterm_starts(vars: usize) -> Vec<(Cover, Cover)> {
    random_functions(vars, 2, 0x9E37_79B9_7F4A_7C15 ^ vars as u64)
        .iter()
        .map(|(on, dc)| {
            (
                Cover::from_truth_table(&on.and_not(dc)),
                Cover::from_truth_table(dc),
            )
        })
        .collect()
}

#[divan::bench(args = MINTERM_CASES, sample_count = 3)]
fn heuristic_from_minterms(bencher: Bencher, vars: usize) {
    let starts = minterm_starts(vars);
    let (on, dc) = &starts[0];
    bencher.bench_local(|| minimize_heuristic(on, dc, &mut Effort::new(BUDGET)));
}
