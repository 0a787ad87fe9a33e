//! Full analysis of a generated 5,000-line spec with 1,000 signals of up to
//! 10 inputs each. Run with `cargo bench -p implica-analysis --bench
//! analyze`; figures go in docs/benchmarks.md.

use divan::Bencher;

#[global_allocator]
static GLOBAL: mimalloc::MiMalloc = mimalloc::MiMalloc;

fn main() {
    divan::main();
}

mod common;
use common::spec;

#[divan::bench(args = [false, true], sample_count = 5)]
fn analyze_5000_lines(bencher: Bencher, clean: bool) {
    let src = spec(1000, clean);
    bencher.bench_local(|| implica_analysis::analyze(&src).diagnostics.len());
}
