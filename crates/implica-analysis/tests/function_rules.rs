//! The rules about signal functions (`constant-signal`, `vacuous-input`,
//! `equivalent-signals`, `shared-terms`) beyond their fixtures: small
//! documents worked out by hand (common practice: evaluating the
//! definitions row by row), and the examples.

use implica_analysis::{Diagnostic, analyze};
use std::path::Path;

fn of_rule(src: &str, rule: &str) -> Vec<Diagnostic> {
    let a = analyze(src);
    assert!(a.internal_errors.is_empty(), "{:?}", a.internal_errors);
    a.diagnostics
        .into_iter()
        .filter(|d| d.rule == rule)
        .collect()
}

fn messages(src: &str, rule: &str) -> Vec<String> {
    of_rule(src, rule).into_iter().map(|d| d.message).collect()
}

#[test]
fn the_examples_have_no_constant_signal_and_no_vacuous_input() {
    let dir = Path::new(env!("CARGO_MANIFEST_DIR")).join("../../examples");
    let mut paths: Vec<_> = std::fs::read_dir(dir)
        .unwrap()
        .map(|e| e.unwrap().path())
        .filter(|p| p.extension().is_some_and(|e| e == "imp"))
        .collect();
    paths.sort();
    for p in paths {
        let src = std::fs::read_to_string(&p).unwrap();
        for d in analyze(&src).diagnostics {
            println!("{}: {} {}", p.display(), d.rule, d.message);
            assert!(
                !matches!(d.rule, "constant-signal" | "vacuous-input"),
                "{}: {}: {}",
                p.display(),
                d.rule,
                d.message
            );
        }
    }
}

#[test]
fn a_constant_is_reported_where_it_starts() {
    // t = a & !a is 0 on both rows; y = t & b is then 0 too, but reading t
    // explains it: one report.
    let src = "input a, b\noutput y\nlet t = a & !a\ny = t & b\n";
    assert_eq!(messages(src, "constant-signal"), ["`t` is always 0"]);
    // Once t is written as 0 on purpose, y is still quiet.
    let src = "input a, b\noutput y\nlet t = 0\ny = t & b\n";
    assert!(messages(src, "constant-signal").is_empty());
    // A signal that reads a constant without being constant is fine.
    let src = "input a, b\noutput y\nlet t = a | !a\ny = t & b\n";
    assert_eq!(messages(src, "constant-signal"), ["`t` is always 1"]);
}

#[test]
fn a_shared_pick_that_cancels_out_is_constant() {
    // w is free on row 2 (a=1, b=0), but w ^ w is 0 whichever way w is
    // built (docs/language.md, "Don't-cares").
    let src =
        "input a, b\noutput same, copy\nlet w = on(1) dc(2) over (a, b)\nsame = w ^ w\ncopy = w\n";
    assert_eq!(messages(src, "constant-signal"), ["`same` is always 0"]);
}

#[test]
fn never_makes_a_signal_constant_without_a_fix() {
    // Rows (a, b): never a & !b leaves 00, 01, 11, where a => b holds.
    let src = "input a, b\noutput y\nnever a & !b\ny = a => b\n";
    let d = of_rule(src, "constant-signal");
    assert_eq!(d.len(), 1);
    assert_eq!(
        d[0].message,
        "`y` is 1 on every input combination that `never` allows"
    );
    assert!(d[0].fixes.is_empty());
    // When every combination is impossible, `never` is the fault, not y.
    let src = "input a\noutput y\nnever a | !a\ny = a\n";
    assert!(messages(src, "constant-signal").is_empty());
}
