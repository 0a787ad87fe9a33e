//! The `implica` binary, run as a user or a CI job would: exit codes,
//! output formats, and file handling.

mod common;
use common::{implica, implica_stdin, root};
use serde_json::Value;
use std::fs;
use std::path::PathBuf;
use std::process::{Command, Output};

/// The exit status of `implica args`.
fn status(args: &[&str]) -> Option<i32> {
    implica(args).status.code()
}

fn stdout(o: &Output) -> String {
    String::from_utf8_lossy(&o.stdout).into_owned()
}

fn stderr(o: &Output) -> String {
    String::from_utf8_lossy(&o.stderr).into_owned()
}

fn temp_file(dir: &tempfile::TempDir, name: &str, contents: &[u8]) -> PathBuf {
    let p = dir.path().join(name);
    fs::write(&p, contents).unwrap();
    p
}

const BROKEN: &str = "input a, b\noutput y\ny = (a & b\n";

#[test]
fn check_examples_passes() {
    let examples = root().join("examples");
    let out = implica(&["check", examples.to_str().unwrap()]);
    assert_eq!(
        out.status.code(),
        Some(0),
        "{}{}",
        stdout(&out),
        stderr(&out)
    );
    assert!(stdout(&out).contains("0 errors"), "{}", stdout(&out));
}

#[test]
fn fmt_check_examples_passes() {
    let examples = root().join("examples");
    let out = implica(&["fmt", "--check", examples.to_str().unwrap()]);
    assert_eq!(
        out.status.code(),
        Some(0),
        "{}{}",
        stdout(&out),
        stderr(&out)
    );
}

#[test]
fn json_reports_syntax_errors_with_exact_ranges_and_exits_1() {
    let dir = tempfile::tempdir().unwrap();
    let f = temp_file(&dir, "broken.imp", BROKEN.as_bytes());
    let out = implica(&["check", "--format", "json", f.to_str().unwrap()]);
    assert_eq!(out.status.code(), Some(1));
    let doc: Value = serde_json::from_slice(&out.stdout).expect("JSON output");
    let diags = doc["diagnostics"].as_array().unwrap();
    assert_eq!(diags.len(), 1);
    let d = &diags[0];
    assert_eq!(d["file"], f.to_str().unwrap());
    assert_eq!(d["rule"], "syntax-error");
    assert_eq!(d["severity"], "error");
    assert_eq!(d["message"], "expected `)`, found the end of the file");
    // The error is at the end of `y = (a & b`: line 3, after column 10.
    assert_eq!(d["range"]["start"]["line"], 3);
    assert_eq!(d["range"]["start"]["column"], 11);
    assert_eq!(d["range"]["end"]["column"], 11);
    assert_eq!(d["related"][0]["range"]["start"]["column"], 5);
    assert_eq!(d["fixes"], serde_json::json!([]));
    assert_eq!(doc["summary"]["errors"], 1);
    assert_eq!(doc["summary"]["files"], 1);
}

#[test]
fn json_columns_count_unicode_scalar_values() {
    let dir = tempfile::tempdir().unwrap();
    // `é` is two bytes but one column; the error is the `@` after it.
    let f = temp_file(
        &dir,
        "u.imp",
        "output y # é\ny = 1 # é\ny2 = é @\n".as_bytes(),
    );
    let out = implica(&["check", "--format", "json", f.to_str().unwrap()]);
    let doc: Value = serde_json::from_slice(&out.stdout).unwrap();
    let d = &doc["diagnostics"][0];
    assert_eq!(d["range"]["start"]["line"], 3);
    assert_eq!(d["range"]["start"]["column"], 6);
    assert_eq!(d["range"]["end"]["column"], 7);
}

#[test]
fn human_output_shows_the_snippet_rule_and_hint() {
    let dir = tempfile::tempdir().unwrap();
    let f = temp_file(&dir, "broken.imp", BROKEN.as_bytes());
    let out = implica(&["check", f.to_str().unwrap()]);
    assert_eq!(out.status.code(), Some(1));
    let text = stdout(&out).replace(f.to_str().unwrap(), "broken.imp");
    // Not a terminal: no colour codes.
    assert!(!text.contains('\u{1b}'));
    insta::assert_snapshot!(text);
}

#[test]
fn a_missing_file_exits_2_and_the_others_are_still_checked() {
    let dir = tempfile::tempdir().unwrap();
    let f = temp_file(&dir, "broken.imp", BROKEN.as_bytes());
    let missing = dir.path().join("nope.imp");
    let out = implica(&[
        "check",
        "--format",
        "json",
        missing.to_str().unwrap(),
        f.to_str().unwrap(),
    ]);
    assert_eq!(out.status.code(), Some(2));
    assert!(
        stderr(&out).contains("nope.imp: no such file or directory"),
        "{}",
        stderr(&out)
    );
    let doc: Value = serde_json::from_slice(&out.stdout).unwrap();
    assert_eq!(doc["summary"]["files"], 1);
    assert_eq!(doc["summary"]["unreadable"], 1);
    assert_eq!(doc["diagnostics"].as_array().unwrap().len(), 1);
}

#[test]
fn directories_are_searched_for_imp_files_only() {
    let dir = tempfile::tempdir().unwrap();
    fs::create_dir(dir.path().join("sub")).unwrap();
    temp_file(&dir, "sub/bad.imp", BROKEN.as_bytes());
    temp_file(&dir, "notes.txt", b"y = (");
    let out = implica(&["check", "--format", "json", dir.path().to_str().unwrap()]);
    let doc: Value = serde_json::from_slice(&out.stdout).unwrap();
    assert_eq!(doc["summary"]["files"], 1);
    assert!(
        doc["diagnostics"][0]["file"]
            .as_str()
            .unwrap()
            .ends_with("bad.imp")
    );
}

#[test]
fn standard_input_is_checked_with_dash() {
    let out = implica_stdin(&["check", "--format", "json", "-"], BROKEN.as_bytes());
    assert_eq!(out.status.code(), Some(1));
    let doc: Value = serde_json::from_slice(&out.stdout).unwrap();
    assert_eq!(doc["diagnostics"][0]["file"], "<stdin>");
}

#[test]
fn invalid_utf8_and_binary_files_are_reported_not_fatal() {
    let dir = tempfile::tempdir().unwrap();
    let f = temp_file(&dir, "bin.imp", b"input a\n\x00\xff\xfe\x01 output y\n");
    let out = implica(&["check", "--format", "json", f.to_str().unwrap()]);
    assert_eq!(out.status.code(), Some(1));
    let doc: Value = serde_json::from_slice(&out.stdout).unwrap();
    let first = &doc["diagnostics"][0];
    assert!(
        first["message"].as_str().unwrap().contains("byte 9"),
        "{first}"
    );
    assert_eq!(first["range"]["start"]["line"], 2);
    // fmt refuses it and leaves it untouched.
    let out = implica(&["fmt", f.to_str().unwrap()]);
    assert_eq!(out.status.code(), Some(2));
    assert_eq!(
        fs::read(&f).unwrap(),
        b"input a\n\x00\xff\xfe\x01 output y\n"
    );
}

#[test]
fn empty_file_is_clean() {
    let dir = tempfile::tempdir().unwrap();
    let f = temp_file(&dir, "empty.imp", b"");
    assert_eq!(status(&["check", f.to_str().unwrap()]), Some(0));
    assert_eq!(status(&["fmt", "--check", f.to_str().unwrap()]), Some(0));
}

#[test]
fn fmt_check_lists_files_that_would_change_and_fmt_rewrites_them() {
    let dir = tempfile::tempdir().unwrap();
    let f = temp_file(&dir, "a.imp", b"input a,b\noutput y\ny=a&b   # keep me\n");
    let out = implica(&["fmt", "--check", f.to_str().unwrap()]);
    assert_eq!(out.status.code(), Some(1));
    assert!(stdout(&out).contains(&format!("would reformat {}", f.display())));
    assert_eq!(
        fs::read_to_string(&f).unwrap(),
        "input a,b\noutput y\ny=a&b   # keep me\n"
    );
    let out = implica(&["fmt", f.to_str().unwrap()]);
    assert_eq!(out.status.code(), Some(0), "{}", stderr(&out));
    assert_eq!(
        fs::read_to_string(&f).unwrap(),
        "input  a, b\noutput y\ny = a & b  # keep me\n"
    );
    assert_eq!(status(&["fmt", "--check", f.to_str().unwrap()]), Some(0));
}

#[test]
fn fmt_refuses_files_with_syntax_errors() {
    let dir = tempfile::tempdir().unwrap();
    let f = temp_file(&dir, "b.imp", BROKEN.as_bytes());
    let out = implica(&["fmt", f.to_str().unwrap()]);
    assert_eq!(out.status.code(), Some(2));
    assert!(stderr(&out).contains("fix the syntax errors first"));
    assert!(stderr(&out).contains("syntax-error"));
    assert_eq!(fs::read_to_string(&f).unwrap(), BROKEN);
}

#[test]
fn fmt_dash_formats_standard_input_to_standard_output() {
    let out = implica_stdin(&["fmt", "-"], b"output y\ny=1\n");
    assert_eq!(out.status.code(), Some(0));
    assert_eq!(stdout(&out), "output y\ny = 1\n");
}

#[cfg(unix)]
#[test]
fn fmt_keeps_permissions_and_leaves_the_original_when_the_write_fails() {
    use std::os::unix::fs::PermissionsExt;
    let dir = tempfile::tempdir().unwrap();
    let f = temp_file(&dir, "p.imp", b"output y\ny=1\n");
    fs::set_permissions(&f, fs::Permissions::from_mode(0o640)).unwrap();
    assert_eq!(status(&["fmt", f.to_str().unwrap()]), Some(0));
    assert_eq!(
        fs::metadata(&f).unwrap().permissions().mode() & 0o777,
        0o640
    );

    // A write that fails (file size limit 0, which binds root too): the
    // original stays as it was and no temporary file is left.
    let g = temp_file(&dir, "q.imp", b"output y\ny=1\n");
    let script = format!(
        "trap '' XFSZ; ulimit -f 0; exec '{}' fmt '{}'",
        env!("CARGO_BIN_EXE_implica"),
        g.display()
    );
    let out = Command::new("sh").arg("-c").arg(&script).output().unwrap();
    assert_eq!(out.status.code(), Some(2), "{}", stderr(&out));
    assert!(stderr(&out).contains("cannot write"), "{}", stderr(&out));
    assert_eq!(fs::read_to_string(&g).unwrap(), "output y\ny=1\n");
    let left: Vec<_> = fs::read_dir(dir.path())
        .unwrap()
        .filter(|e| {
            e.as_ref()
                .unwrap()
                .file_name()
                .to_string_lossy()
                .starts_with(".implica-")
        })
        .collect();
    assert!(left.is_empty(), "temporary file left behind");
}

#[test]
fn help_is_available_on_every_subcommand() {
    for sub in ["check", "fmt", "minimize", "table", "rules", "explain"] {
        let out = implica(&[sub, "--help"]);
        assert_eq!(out.status.code(), Some(0));
        assert!(stdout(&out).contains("Usage: implica"), "{sub}");
    }
    // A usage error exits 2.
    assert_eq!(status(&["check"]), Some(2));
    assert_eq!(status(&["check", "--format", "xml", "x"]), Some(2));
}

#[test]
fn the_nearest_implica_toml_applies_and_its_errors_exit_2() {
    let dir = tempfile::tempdir().unwrap();
    let sub = dir.path().join("logic");
    fs::create_dir_all(&sub).unwrap();
    let spec = temp_file(
        &dir,
        "logic/mux.imp",
        b"input sel, a, b\noutput y\ny = sel & a | !sel & b\n",
    );
    // Without a configuration the hazard rule is off: clean.
    assert_eq!(status(&["check", spec.to_str().unwrap()]), Some(0));
    fs::write(
        dir.path().join("implica.toml"),
        "[rules]\nstatic-hazard = \"error\"\n",
    )
    .unwrap();
    let out = implica(&["check", "--format", "json", spec.to_str().unwrap()]);
    assert_eq!(out.status.code(), Some(1));
    let doc: Value = serde_json::from_slice(&out.stdout).unwrap();
    assert_eq!(doc["diagnostics"][0]["rule"], "static-hazard");
    assert_eq!(doc["diagnostics"][0]["severity"], "error");
    // A misspelt rule name is reported with its place, and exits 2.
    fs::write(
        dir.path().join("implica.toml"),
        "[rules]\nstatic-hazards = \"error\"\n",
    )
    .unwrap();
    let out = implica(&["check", spec.to_str().unwrap()]);
    assert_eq!(out.status.code(), Some(2));
    assert!(
        stderr(&out).contains("implica.toml:2:1: there is no rule `static-hazards`"),
        "{}",
        stderr(&out)
    );
}

#[test]
fn rules_and_explain() {
    let out = implica(&["rules"]);
    assert_eq!(out.status.code(), Some(0));
    let text = stdout(&out);
    // Every rule of the analysis, one line each; the hazard rule is off.
    for rule in implica_rule_names() {
        assert!(
            text.lines().any(|l| l.starts_with(&format!("{rule} "))),
            "{rule}"
        );
    }
    assert!(
        text.lines()
            .any(|l| l.starts_with("static-hazard") && l.contains(" off "))
    );
    let out = implica(&["explain", "redundant-term"]);
    assert_eq!(out.status.code(), Some(0));
    assert!(stdout(&out).starts_with("# `redundant-term`"));
    assert!(stdout(&out).contains("**Fix.**"));
    let out = implica(&["explain", "redundant-terms"]);
    assert_eq!(out.status.code(), Some(2));
    assert!(stderr(&out).contains("no rule `redundant-terms`"));
}

/// The rule names the issue fixes (users' configurations depend on them).
fn implica_rule_names() -> Vec<&'static str> {
    vec![
        "syntax-error",
        "undefined-signal",
        "duplicate-definition",
        "undefined-output",
        "undeclared-assignment",
        "unused-input",
        "vacuous-input",
        "unused-signal",
        "cyclic-definition",
        "redundant-term",
        "redundant-literal",
        "non-minimal",
        "constant-signal",
        "table-missing-rows",
        "table-conflict",
        "table-width",
        "assertion-failed",
        "vector-mismatch",
        "empty-constraint",
        "unused-constraint",
        "static-hazard",
        "equivalent-signals",
        "shared-terms",
    ]
}

#[test]
fn fix_applies_proven_fixes_and_keeps_every_output() {
    let dir = tempfile::tempdir().unwrap();
    let src = "input a, b, c, spare\noutput y, z\n# the lift chime\ny = a & b | a & b & c | !a & b  # as first drafted\nz = a | !a & c\n";
    let path = temp_file(&dir, "chime.imp", src.as_bytes());
    let p = path.to_str().unwrap();
    // One CSV table over every input both outputs read, before and after.
    let before = stdout(&implica(&["table", p, "--format", "csv"]));
    // --diff shows the change and writes nothing.
    let out = implica(&["fix", "--diff", p]);
    assert_eq!(out.status.code(), Some(0));
    let diff = stdout(&out);
    assert!(
        diff.starts_with(&format!("--- {p}\n+++ {p} (fixed)\n@@ ")),
        "{diff}"
    );
    for line in [
        "-y = a & b | a & b & c | !a & b  # as first drafted\n",
        "+y = b  # as first drafted\n",
        "-z = a | !a & c\n",
        "+z = a | c\n",
        " # the lift chime\n",
    ] {
        assert!(diff.contains(line), "{line} not in {diff}");
    }
    assert_eq!(fs::read_to_string(&path).unwrap(), src);
    // Without --diff the file is rewritten; comments stay; the unused input
    // stays too (removing it changes the interface: only with --unsafe).
    let out = implica(&["fix", p]);
    assert_eq!(out.status.code(), Some(0), "{}", stderr(&out));
    let fixed = fs::read_to_string(&path).unwrap();
    assert_eq!(
        fixed,
        "input a, b, c, spare\noutput y, z\n# the lift chime\ny = b  # as first drafted\nz = a | c\n"
    );
    // Every output computes what it did, row by row.
    assert!(before.starts_with("a,b,c,y,z\n"), "{before}");
    assert_eq!(stdout(&implica(&["table", p, "--format", "csv"])), before);
    // --unsafe also removes the unused inputs.
    let out = implica(&["fix", "--unsafe", p]);
    assert_eq!(out.status.code(), Some(0));
    assert!(
        fs::read_to_string(&path)
            .unwrap()
            .starts_with("input a, b, c\n")
    );
    // Nothing left to fix.
    let out = implica(&["fix", p]);
    assert_eq!(out.status.code(), Some(0));
    assert!(stderr(&out).contains("nothing to fix"));
}

#[test]
fn fix_on_standard_input_and_errors_left() {
    let out = implica_stdin(&["fix", "-"], b"input a, b\noutput y\ny = a & b | a & b\n");
    assert_eq!(out.status.code(), Some(0));
    assert_eq!(stdout(&out), "input a, b\noutput y\ny = a & b\n");
    // An undefined name has no safe fix: the error is left, exit 1.
    let out = implica_stdin(
        &["fix", "-"],
        b"input a\noutput y\ny = a & ghost | a & ghost\n",
    );
    assert_eq!(out.status.code(), Some(1));
    assert!(
        stderr(&out).contains("error left that no fix resolves"),
        "{}",
        stderr(&out)
    );
}

#[test]
fn deny_warnings_turns_warnings_into_a_failure() {
    let src: &[u8] = b"input a, b\noutput y\ny = a & b | a & b\n";
    let out = implica_stdin(&["check", "-"], src);
    assert_eq!(out.status.code(), Some(0));
    let out = implica_stdin(&["check", "--deny", "warnings", "-"], src);
    assert_eq!(out.status.code(), Some(1));
    // Notes do not count.
    let clean: &[u8] = b"input a, b\noutput y\ny = a & b\n";
    let out = implica_stdin(&["check", "--deny", "warnings", "-"], clean);
    assert_eq!(out.status.code(), Some(0));
}

#[test]
fn github_annotations() {
    let src: &[u8] = b"input a, b\noutput y\ny = a & b | a & b\n";
    let out = implica_stdin(&["check", "--format", "github", "-"], src);
    assert_eq!(out.status.code(), Some(0));
    assert_eq!(
        stdout(&out),
        "::warning file=<stdin>,line=3,col=13,endLine=3,endColumn=18,title=implica redundant-term::\
         the term `a & b` is redundant: it repeats `a & b`%0Ahelp: remove the term; `y` stays the same\n"
    );
}

/// Files are analysed in parallel but reported in the order they are found
/// (sorted within a directory), with an unreadable one in its place.
#[test]
fn many_files_are_reported_in_order() {
    let dir = tempfile::tempdir().unwrap();
    for k in 0..12 {
        // Each file's one error names it: `undefined-signal` on `q<k>`.
        let src = format!("input a\noutput y\ny = a & q{k:02}\n");
        std::fs::write(dir.path().join(format!("f{k:02}.imp")), src).unwrap();
    }
    let d = dir.path().to_str().unwrap();
    let missing = format!("{d}/missing.imp");
    let out = implica(&["check", "--format", "json", d, &missing, d]);
    assert_eq!(out.status.code(), Some(2));
    let v: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    let files: Vec<String> = v["diagnostics"]
        .as_array()
        .unwrap()
        .iter()
        .filter(|x| x["rule"] == "undefined-signal")
        .map(|x| {
            x["file"]
                .as_str()
                .unwrap()
                .rsplit('/')
                .next()
                .unwrap()
                .to_string()
        })
        .collect();
    let once: Vec<String> = (0..12).map(|k| format!("f{k:02}.imp")).collect();
    assert_eq!(files, [once.clone(), once].concat());
    assert_eq!(v["summary"]["files"], 24);
    assert!(String::from_utf8_lossy(&out.stderr).contains("missing.imp"));
}

/// The JSON report is written file by file as the analysis goes; it is still
/// one document, laid out as a pretty-printer lays out the whole (serde_json's
/// own printer is the reference), with and without diagnostics.
#[test]
fn the_streamed_json_report_is_one_pretty_document() {
    let examples = root().join("examples");
    let clean = tempfile::tempdir().unwrap();
    temp_file(&clean, "ok.imp", b"input a\noutput y\ny = a\n");
    for path in [examples.as_path(), clean.path()] {
        let out = implica(&["check", "--format", "json", path.to_str().unwrap()]);
        let text = String::from_utf8(out.stdout).unwrap();
        let doc: Value = serde_json::from_str(&text).unwrap();
        assert_eq!(text, serde_json::to_string_pretty(&doc).unwrap() + "\n");
        let n = doc["diagnostics"].as_array().unwrap().len();
        let s = &doc["summary"];
        let counted: u64 = ["errors", "warnings", "infos", "hints"]
            .iter()
            .map(|k| s[k].as_u64().unwrap())
            .sum();
        assert_eq!(n as u64, counted, "{text}");
    }
}
