//! Exact minimization of random and structured functions. Run with
//! `cargo bench -p implica-logic --bench minimize`; figures go in
//! docs/benchmarks.md.

#[path = "../tests/common/mod.rs"]
mod common;
use common::random_functions;
use divan::Bencher;
use implica_logic::{Budget, TruthTable, minimize_multi, minimize_sop};

#[global_allocator]
static GLOBAL: mimalloc::MiMalloc = mimalloc::MiMalloc;

fn main() {
    // How often the default budget proves the result minimal (slow: set
    // IMPLICA_BENCH_SUMMARY=1 to print it).
    let summary = std::env::var_os("IMPLICA_BENCH_SUMMARY").is_some();
    for vars in [8usize, 10, 12, 14, 16].into_iter().filter(|_| summary) {
        let functions = random_functions(vars, 30, 0x9E37_79B9_7F4A_7C15 ^ vars as u64);
        let (mut proven, mut terms, mut bound) = (0, 0, 0);
        for (on, dc) in &functions {
            if let Ok(r) = minimize_sop(on, dc, &Budget::default()) {
                proven += usize::from(r.proven_minimal);
                terms += r.cover.len();
                bound += r.lower_bound;
            }
        }
        println!(
            "{vars} inputs: {proven} of {} random functions proven minimal; \
             {terms} terms in all, lower bound {bound}",
            functions.len()
        );
    }
    for name in ["comparator", "carry", "decoder"]
        .into_iter()
        .filter(|_| summary)
    {
        let r = minimize_sop(&structured(name), &TruthTable::zero(16), &Budget::default());
        match r {
            Ok(r) => println!(
                "{name}: {} terms, {} literals, proven minimal: {}",
                r.cover.len(),
                r.cover.literals(),
                r.proven_minimal
            ),
            Err(e) => println!("{name}: too large: {}", e.reason),
        }
    }
    if summary {
        let r = minimize_multi(&kiosk_digits(), &Budget::default()).expect("4 inputs");
        println!(
            "kiosk display: {} shared terms, {} literals, proven minimal: {}; \
             apart: {} terms, {} literals",
            r.terms.len(),
            r.literals(),
            r.proven_minimal,
            r.separate_terms,
            r.separate_literals
        );
    }
    divan::main();
}

/// The seven segments (top, upper right, lower right, bottom, lower left,
/// upper left, middle) of a kiosk's digit display driven by a 4-bit digit;
/// codes 10 to 15 never occur. Six and nine are drawn with their tails.
fn kiosk_digits() -> Vec<(TruthTable, TruthTable)> {
    const SEGMENTS: [u8; 10] = [
        0b111_1110, 0b011_0000, 0b110_1101, 0b111_1001, 0b011_0011, 0b101_1011, 0b101_1111,
        0b111_0000, 0b111_1111, 0b111_1011,
    ];
    let unused = TruthTable::from_minterms(4, &[10, 11, 12, 13, 14, 15]);
    (0..7)
        .map(|s| {
            let lit: Vec<usize> = (0..10)
                .filter(|&d| SEGMENTS[d] >> (6 - s) & 1 == 1)
                .collect();
            (TruthTable::from_minterms(4, &lit), unused.clone())
        })
        .collect()
}

#[divan::bench(sample_count = 10)]
fn multi_output_kiosk_display(bencher: Bencher) {
    let outputs = kiosk_digits();
    bencher.bench_local(|| minimize_multi(&outputs, &Budget::default()));
}

#[divan::bench(args = [8, 10, 12, 14, 16], sample_count = 10)]
fn random_with_dont_cares(bencher: Bencher, vars: usize) {
    let functions = random_functions(vars, 30, 0x9E37_79B9_7F4A_7C15 ^ vars as u64);
    let mut i = 0;
    bencher.bench_local(|| {
        let (on, dc) = &functions[i % functions.len()];
        i += 1;
        minimize_sop(on, dc, &Budget::default())
    });
}

/// Structured 16-input functions: an 8-bit comparator `a > b`, the carry out
/// of an 8-bit adder, and a 4-to-16 address decoder output gated by 12 more
/// address lines.
fn structured(name: &str) -> TruthTable {
    let mut t = TruthTable::zero(16);
    for m in 0..(1usize << 16) {
        let (a, b) = (m >> 8, m & 0xFF);
        let value = match name {
            "comparator" => a > b,
            "carry" => a + b > 0xFF,
            _ => (m >> 12) == 0xA && (m & 0xFFF) >= 0x800,
        };
        t.set(m, value);
    }
    t
}

#[divan::bench(args = ["comparator", "carry", "decoder"], sample_count = 5)]
fn structured_16_inputs(bencher: Bencher, name: &str) {
    let on = structured(name);
    let dc = TruthTable::zero(16);
    bencher.bench_local(|| minimize_sop(&on, &dc, &Budget::default()));
}
