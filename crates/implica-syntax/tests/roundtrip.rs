//! Formatting is idempotent and keeps the tree: for every valid fixture and
//! every example, `fmt(fmt(x)) == fmt(x)` and `fmt(x)` parses to the same
//! tree as `x`, spans and blank lines aside, comments included.

mod common;

use implica_syntax::dump::dump_structure;
use implica_syntax::format::format_source;
use implica_syntax::parse;

fn check_roundtrip(name: &str, src: &str) {
    let once = format_source(src).unwrap_or_else(|e| panic!("{name}: does not parse: {e:?}"));
    let twice = format_source(&once)
        .unwrap_or_else(|e| panic!("{name}: formatted text does not parse: {e:?}"));
    assert_eq!(once, twice, "{name}: formatting is not idempotent");
    let (before, _) = parse(src);
    let (after, _) = parse(&once);
    assert_eq!(
        dump_structure(&before),
        dump_structure(&after),
        "{name}: formatting changed the tree"
    );
    let comments = |s: &str| s.matches('#').count();
    assert_eq!(comments(src), comments(&once), "{name}: a comment was lost");
}

#[test]
fn fixtures_roundtrip() {
    for path in common::imp_files("tests/fixtures/syntax") {
        let name = path.file_name().unwrap().to_string_lossy().to_string();
        if name.starts_with("err_") {
            continue;
        }
        check_roundtrip(&name, &std::fs::read_to_string(&path).unwrap());
    }
}

#[test]
fn examples_roundtrip_and_are_formatted() {
    for path in common::imp_files("examples") {
        let name = path.file_name().unwrap().to_string_lossy().to_string();
        let src = std::fs::read_to_string(&path).unwrap();
        check_roundtrip(&name, &src);
        assert_eq!(
            format_source(&src).unwrap(),
            src,
            "{name}: not in canonical layout; run `implica fmt`"
        );
    }
}

/// Formatted output of some fixtures, to pin the canonical layout itself.
#[test]
fn canonical_layout() {
    for name in [
        "comments",
        "free_form",
        "declarations",
        "tables",
        "term_lists",
        "operators",
    ] {
        let path = common::repo_root().join(format!("tests/fixtures/syntax/{name}.imp"));
        let src = std::fs::read_to_string(&path).unwrap();
        insta::assert_snapshot!(format!("fmt_{name}"), format_source(&src).unwrap());
    }
}

#[test]
fn long_expressions_break_before_top_level_operators() {
    let terms: Vec<String> = (0..12)
        .map(|i| format!("sensor_{i:02} & !bypass_{i:02}"))
        .collect();
    let src = format!("output y\ny = {}\n", terms.join(" | "));
    let out = format_source(&src).unwrap();
    let lines: Vec<&str> = out.lines().collect();
    assert_eq!(lines[1], "y = sensor_00 & !bypass_00");
    assert_eq!(lines[2], "  | sensor_01 & !bypass_01");
    assert_eq!(lines.len(), 1 + 12);
    assert!(
        lines
            .iter()
            .all(|l| l.len() <= implica_syntax::format::MAX_WIDTH)
    );
    check_roundtrip("long", &src);
}
