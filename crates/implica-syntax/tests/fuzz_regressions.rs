//! Replays the fuzzer's seed inputs and every input that once made a fuzz
//! target fail (`tests/fixtures/fuzz/`) through the fuzz targets' checks.

mod common;

use implica_syntax::invariants::{check_bytes, check_text};

fn files(dir: &str) -> Vec<std::path::PathBuf> {
    let Ok(entries) = std::fs::read_dir(common::repo_root().join(dir)) else {
        return Vec::new();
    };
    let mut files: Vec<_> = entries
        .map(|e| e.unwrap().path())
        .filter(|p| p.is_file())
        .collect();
    files.sort();
    files
}

#[test]
fn fuzz_seeds_and_regressions_hold_every_property() {
    let seeds = files("fuzz/seeds");
    assert!(seeds.len() >= 10, "the fuzz seeds are missing");
    for path in seeds.iter().chain(&files("tests/fixtures/fuzz")) {
        let bytes = std::fs::read(path).unwrap();
        check_bytes(&bytes);
    }
}

#[test]
fn the_checks_hold_on_the_formatter_special_cases_and_can_fail() {
    // Statements kept as written, a comment on a table's `{` line, a file
    // ending in a comment.
    check_text("input a\noutput y\ny = a &  # inside\n  a\n# end\n");
    check_text("table (a -> y) {  # open\n  0 -> 1\n}\n");
    let result = std::panic::catch_unwind(|| {
        implica_syntax::invariants::assert_same_structure("input a\n", "input b\n");
    });
    assert!(result.is_err(), "a changed tree must be reported");
}
