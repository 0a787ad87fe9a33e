//! `implica refactor`: listing the refactors at a place, applying one
//! (atomically, or to standard output, or as a diff), and its errors. The
//! refactors themselves, and their independent check by brute-force
//! evaluation, are tested in `crates/implica-analysis/tests/refactors.rs`;
//! here every applied result is also compared with the original through
//! `implica table`.

mod common;
use common::{implica, implica_stdin, root};
use serde_json::Value;

fn text(b: &[u8]) -> String {
    String::from_utf8_lossy(b).into_owned()
}

fn greenhouse() -> String {
    root()
        .join("examples/greenhouse_vents.imp")
        .to_string_lossy()
        .into_owned()
}

/// Every signal's truth table, as `implica table --format json` gives it,
/// by name.
fn tables(path: &str) -> std::collections::BTreeMap<String, Value> {
    let out = implica(&["table", "--format", "json", path]);
    assert_eq!(out.status.code(), Some(0), "{}", text(&out.stderr));
    let doc: Value = serde_json::from_slice(&out.stdout).unwrap();
    doc["signals"]
        .as_array()
        .unwrap()
        .iter()
        .map(|s| (s["name"].as_str().unwrap().to_string(), s.clone()))
        .collect()
}

#[test]
fn the_refactors_at_a_name_are_listed() {
    // Line 45 is `let auto_open = needs_air & !rain`; column 18 is in
    // `needs_air`, an intermediate signal.
    let out = implica(&["refactor", &greenhouse(), "--at", "45:18"]);
    assert_eq!(out.status.code(), Some(0), "{}", text(&out.stderr));
    assert_eq!(
        text(&out.stdout),
        "to-table           safe       Write `auto_open` as a truth table\n\
         to-nand            safe       Rewrite `auto_open` with NAND only\n\
         to-nor             safe       Rewrite `auto_open` with NOR only\n\
         inline-here        safe       Inline `needs_air` here\n\
         inline-everywhere  safe       Inline `needs_air` everywhere and remove its definition\n"
    );
    // A comment line offers nothing.
    let out = implica(&["refactor", &greenhouse(), "--at", "20"]);
    assert_eq!(out.status.code(), Some(1));
    assert!(text(&out.stderr).contains("no refactor is offered here"));
}

#[test]
fn an_applied_refactor_is_written_atomically_and_changes_no_output() {
    let dir = tempfile::tempdir().unwrap();
    let copy = dir.path().join("greenhouse.imp");
    std::fs::copy(greenhouse(), &copy).unwrap();
    let copy = copy.to_string_lossy().into_owned();
    let before_text = std::fs::read_to_string(&copy).unwrap();
    let before = tables(&copy);

    // --diff shows it and writes nothing.
    let out = implica(&[
        "refactor",
        &copy,
        "--at",
        "44",
        "--apply",
        "inline-everywhere",
        "--diff",
    ]);
    assert_eq!(out.status.code(), Some(0), "{}", text(&out.stderr));
    assert!(text(&out.stdout).contains("-let needs_air = hot | humid\n"));
    assert_eq!(std::fs::read_to_string(&copy).unwrap(), before_text);

    for (at, kind) in [
        ("44", "inline-everywhere"),
        ("39", "to-nand"),
        ("40", "to-table"),
    ] {
        let out = implica(&["refactor", &copy, "--at", at, "--apply", kind]);
        assert_eq!(out.status.code(), Some(0), "{kind}: {}", text(&out.stderr));
        assert!(
            text(&out.stderr).contains("(safe)"),
            "{}",
            text(&out.stderr)
        );
        // Every signal left has the table it had (the inlined intermediate
        // is gone); lines 39 and 40 stay where they were, above it.
        let now = tables(&copy);
        for (name, t) in &now {
            assert_eq!(Some(t), before.get(name), "{kind} changed `{name}`");
        }
        let gone: Vec<&String> = before.keys().filter(|n| !now.contains_key(*n)).collect();
        assert_eq!(gone, ["needs_air"], "{kind}");
        let check = implica(&["check", &copy]);
        assert_eq!(check.status.code(), Some(0), "{}", text(&check.stdout));
    }
    let after = std::fs::read_to_string(&copy).unwrap();
    assert!(!after.contains("let needs_air"), "{after}");
    assert!(after.contains("nand"), "{after}");
    assert!(
        after.contains("table (vent_open -> vent_close) {"),
        "{after}"
    );
    // Every comment of the original is still there.
    assert_eq!(after.matches('#').count(), before_text.matches('#').count());
}

#[test]
fn a_refactor_that_settles_dont_cares_is_marked_to_review() {
    let src = std::fs::read_to_string(root().join("examples/kiosk_seven_segment.imp")).unwrap();
    // Line 35: `let raw_a = off(1, 4) dc(10..15) over (b3, b2, b1, b0)`.
    let out = implica_stdin(
        &["refactor", "-", "--at", "35", "--apply", "to-expression"],
        src.as_bytes(),
    );
    assert_eq!(out.status.code(), Some(0), "{}", text(&out.stderr));
    assert!(text(&out.stderr).contains("(to review)"));
    let written = text(&out.stdout);
    let line = written
        .lines()
        .find(|l| l.starts_with("let raw_a = "))
        .unwrap_or_else(|| panic!("{written}"));
    assert!(!line.contains("off("), "{line}");
    // The rest of the file is as it was.
    assert_eq!(written.lines().count(), src.lines().count());
}

#[test]
fn places_and_kinds_that_do_not_fit_are_reported() {
    let g = greenhouse();
    for (at, message) in [
        ("0", "is not a place"),
        ("x:1", "is not a place"),
        ("999", "line 999 is past the end: the file has"),
        ("39:500", "column 500 is past the end of line 39"),
    ] {
        let out = implica(&["refactor", &g, "--at", at]);
        assert_eq!(out.status.code(), Some(2), "{at}");
        assert!(
            text(&out.stderr).contains(message),
            "{at}: {}",
            text(&out.stderr)
        );
    }
    let out = implica(&["refactor", &g, "--at", "39", "--apply", "inline-here"]);
    assert_eq!(out.status.code(), Some(1));
    assert!(
        text(&out.stderr)
            .contains("`inline-here` is not offered here (offered: to-table, to-nand, to-nor)"),
        "{}",
        text(&out.stderr)
    );
    let out = implica(&["refactor", "no-such-file.imp", "--at", "1"]);
    assert_eq!(out.status.code(), Some(2));
}
