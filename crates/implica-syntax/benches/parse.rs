//! Parse and format throughput on a generated 100,000-line spec.
//! Run with `cargo bench -p implica-syntax --bench parse`; figures go in
//! docs/benchmarks.md.

use divan::Bencher;
use divan::counter::BytesCount;

// The allocator the `implica` binary ships with, so that the figures are
// those of the tool as used.
#[global_allocator]
static GLOBAL: mimalloc::MiMalloc = mimalloc::MiMalloc;

fn main() {
    divan::main();
}

/// A dense spec of about `lines` lines mixing every statement kind: short
/// names, few comments, about 3 bytes per token (a worst case for MB/s).
pub fn generated_spec(lines: usize) -> String {
    let mut s = String::with_capacity(lines * 40);
    s.push_str("# generated benchmark spec\ninput a0, a1, a2, a3, a4, a5, a6, a7\n");
    let mut n = 2;
    let mut i = 0usize;
    while n < lines {
        match i % 10 {
            0..=5 => {
                s.push_str(&format!(
                    "let s{i} = a{} & !a{} | (a{} ^ a{}) & s{}  # term {i}\n",
                    i % 8,
                    (i + 3) % 8,
                    (i + 5) % 8,
                    (i + 1) % 8,
                    i.saturating_sub(1)
                ));
                n += 1;
            }
            6 => {
                s.push_str(&format!(
                    "let t{i} = on(0, 3, 5..7) dc(0x8..0xF) over (a0, a1, a2, a3)\n"
                ));
                n += 1;
            }
            7 => {
                s.push_str(&format!(
                    "let table (a0, a1, a2 -> u{i}, v{i}) {{\n  000 -> 01\n  01- -> 10\n  1-1 -> 1-\n  unlisted -> 00\n}}\n"
                ));
                n += 6;
            }
            8 => {
                s.push_str(&format!("assert s{} => a{} | !a{}\n", i - 2, i % 8, i % 8));
                n += 1;
            }
            _ => {
                s.push_str("\n# a section comment\n");
                n += 2;
            }
        }
        i += 1;
    }
    s
}

/// A spec shaped like the bundled examples (descriptive names, a comment on
/// about a third of the lines, tables and row lists): about 9 bytes per
/// token, where `generated_spec` has about 3.
pub fn typical_spec(lines: usize) -> String {
    const PLACES: [&str; 8] = [
        "north", "south", "roof", "door", "pump", "tank", "lift", "fan",
    ];
    const STATES: [&str; 8] = [
        "open", "closed", "high", "low", "ready", "fault", "busy", "enabled",
    ];
    let sig = |i: usize| format!("{}_{}_{}", PLACES[i % 8], STATES[(i / 8) % 8], i % 97);
    let mut s = String::with_capacity(lines * 48);
    s.push_str("# Generated benchmark spec, shaped like the bundled examples.\n");
    s.push_str("input  ");
    s.push_str(&(0..16).map(sig).collect::<Vec<_>>().join(", "));
    s.push('\n');
    let mut n = 2;
    let mut i = 0usize;
    while n < lines {
        match i % 12 {
            0..=6 => {
                let comment = if i.is_multiple_of(3) {
                    "  # keep the vents shut while it rains"
                } else {
                    ""
                };
                s.push_str(&format!(
                    "let {}_cmd = {} and not {} or {}{}\n",
                    sig(i + 20),
                    sig(i % 16),
                    sig((i + 5) % 16),
                    sig((i + 9) % 16),
                    comment
                ));
                n += 1;
            }
            7 => {
                s.push_str(&format!(
                    "let {}_sel = on(0, 3, 5..7) dc(0x8..0xF) over ({}, {}, {}, {})\n",
                    sig(i + 20),
                    sig(0),
                    sig(1),
                    sig(2),
                    sig(3)
                ));
                n += 1;
            }
            8 => {
                s.push_str(&format!(
                    "let table ({}, {}, {} -> {}_a, {}_b) {{\n  0 0 0    -> 0 1  # idle\n  0 1 -    -> 1 0\n  1 - 1    -> 1 -\n  unlisted -> 0 0\n}}\n",
                    sig(4),
                    sig(5),
                    sig(6),
                    sig(i + 20),
                    sig(i + 20)
                ));
                n += 6;
            }
            9 => {
                s.push_str(&format!(
                    "assert {}_cmd => {} | !{}\n",
                    sig(i + 18),
                    sig(i % 16),
                    sig(i % 16)
                ));
                n += 1;
            }
            10 => {
                s.push_str("\n# The next group drives the roof vents of one greenhouse bay.\n");
                n += 2;
            }
            _ => {
                s.push_str(&format!("never {} & {}\n", sig(i % 16), sig((i + 1) % 16)));
                n += 1;
            }
        }
        i += 1;
    }
    s
}

#[divan::bench(sample_count = 20)]
fn parse_100k_lines_typical(bencher: Bencher) {
    let src = typical_spec(100_000);
    assert!(implica_syntax::parse(&src).1.is_empty());
    bencher
        .counter(BytesCount::new(src.len()))
        .bench(|| implica_syntax::parse(divan::black_box(&src)));
}

#[divan::bench(sample_count = 20)]
fn parse_100k_lines_dense(bencher: Bencher) {
    let src = generated_spec(100_000);
    assert!(implica_syntax::parse(&src).1.is_empty());
    bencher
        .counter(BytesCount::new(src.len()))
        .bench(|| implica_syntax::parse(divan::black_box(&src)));
}

#[divan::bench(sample_count = 10)]
fn parse_1m_lines_dense(bencher: Bencher) {
    let src = generated_spec(1_000_000);
    bencher
        .counter(BytesCount::new(src.len()))
        .bench(|| implica_syntax::parse(divan::black_box(&src)));
}

#[divan::bench(sample_count = 20)]
fn lex_100k_lines(bencher: Bencher) {
    let src = generated_spec(100_000);
    bencher
        .counter(BytesCount::new(src.len()))
        .bench(|| implica_syntax::lexer::lex(divan::black_box(&src)));
}

#[divan::bench(sample_count = 20)]
fn format_100k_lines(bencher: Bencher) {
    let src = generated_spec(100_000);
    bencher
        .counter(BytesCount::new(src.len()))
        .bench(|| implica_syntax::format::format_source(divan::black_box(&src)));
}
