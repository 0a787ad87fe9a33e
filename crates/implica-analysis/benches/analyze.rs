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

/// The same spec in a session, after a one-character edit in one
/// definition (a digit of an input name in the middle signal's first
/// line): each sample analyses the other of the two versions, so every
/// analysis follows an edit and finds the rest of the document unchanged.
#[divan::bench(args = [false, true], sample_count = 20, sample_size = 2)]
fn reanalyze_after_one_character_edit(bencher: Bencher, clean: bool) {
    let src = spec(1000, clean);
    let edited = common::edit_one_character(&src);
    let config = implica_analysis::config::Config::default();
    let mut session = implica_analysis::session::Session::new();
    session.analyze(&src, &config);
    let mut flip = false;
    bencher.bench_local(|| {
        flip = !flip;
        let text = if flip { &edited } else { &src };
        session.analyze(text, &config).diagnostics.len()
    });
}
