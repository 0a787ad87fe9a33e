//! `implica export` as a user runs it: the text it writes (snapshots),
//! exit codes, refusals, names, and atomic writes with `--output`. Whether
//! the modules compute the right functions is checked by simulation in
//! export_sim.rs.

mod common;
use common::{implica_stdin_in, root};
use std::path::Path;
use std::process::Output;

fn run_in(dir: &Path, args: &[&str], stdin: &str) -> Output {
    implica_stdin_in(dir, args, stdin.as_bytes())
}

fn run(args: &[&str], stdin: &str) -> Output {
    run_in(&root(), args, stdin)
}

fn text(b: &[u8]) -> String {
    String::from_utf8_lossy(b).into_owned()
}

#[test]
fn minimized_verilog_of_an_example() {
    let out = run(
        &["export", "--to", "verilog", "examples/greenhouse_vents.imp"],
        "",
    );
    assert_eq!(out.status.code(), Some(0), "{}", text(&out.stderr));
    insta::assert_snapshot!(text(&out.stdout));
}

#[test]
fn as_written_vhdl_of_an_example() {
    let out = run(
        &[
            "export",
            "--to",
            "vhdl",
            "--as-written",
            "examples/lift_door_interlock.imp",
        ],
        "",
    );
    assert_eq!(out.status.code(), Some(0), "{}", text(&out.stderr));
    insta::assert_snapshot!(text(&out.stdout));
}

#[test]
fn as_written_verilog_declares_the_intermediate_signals_as_wires() {
    let src = "input a, b, c\noutput y\nlet w = a & b\ny = w | c\n";
    let out = run(&["export", "--to", "verilog", "--as-written", "-"], src);
    assert_eq!(out.status.code(), Some(0), "{}", text(&out.stderr));
    let v = text(&out.stdout);
    assert!(v.contains("module stdin ("), "{v}");
    assert!(v.contains("    wire w;\n"), "{v}");
    assert!(v.contains("    assign w = a & b;\n"), "{v}");
    assert!(v.contains("    assign y = w | c;\n"), "{v}");
    // Minimized, the intermediate is composed in and not declared.
    let out = run(&["export", "--to", "verilog", "-"], src);
    let v = text(&out.stdout);
    assert!(!v.contains("wire w;"), "{v}");
    assert!(v.contains("    assign y = a & b | c;\n"), "{v}");
}

#[test]
fn a_document_with_errors_is_not_exported_and_its_errors_are_listed() {
    let src = "input a\noutput y, z\ny = a & q\n";
    let out = run(&["export", "--to", "verilog", "-"], src);
    assert_eq!(out.status.code(), Some(1));
    assert!(out.stdout.is_empty());
    let err = text(&out.stderr);
    assert!(
        err.contains("<stdin>: not exported: the document has 2 errors"),
        "{err}"
    );
    assert!(err.contains("<stdin>:3:9: undefined-signal:"), "{err}");
    assert!(err.contains("<stdin>:2:11: undefined-output:"), "{err}");
}

#[test]
fn hostile_inputs_are_refused_clearly() {
    // An empty document declares no output.
    let out = run(&["export", "--to", "vhdl", "-"], "");
    assert_eq!(out.status.code(), Some(1));
    assert!(
        text(&out.stderr).contains("declares no output, so there is nothing to export"),
        "{}",
        text(&out.stderr)
    );
    // Binary data is a syntax error, not a crash.
    let dir = tempfile::tempdir().unwrap();
    let bin = dir.path().join("blob.imp");
    std::fs::write(&bin, [0u8, 159, 146, 150, 255, 10, 1, 2]).unwrap();
    let out = run(&["export", "--to", "verilog", bin.to_str().unwrap()], "");
    assert_eq!(out.status.code(), Some(1));
    assert!(
        text(&out.stderr).contains("syntax-error"),
        "{}",
        text(&out.stderr)
    );
    // A missing file is an I/O failure.
    let out = run(&["export", "--to", "verilog", "no/such/file.imp"], "");
    assert_eq!(out.status.code(), Some(2));
    assert!(
        text(&out.stderr).contains("no/such/file.imp: cannot read"),
        "{}",
        text(&out.stderr)
    );
    // A missing --to is a usage error.
    let out = run(&["export", "examples/greenhouse_vents.imp"], "");
    assert_eq!(out.status.code(), Some(2));
}

#[test]
fn module_names_are_checked() {
    let src = "input a\noutput y\ny = !a\n";
    let out = run(&["export", "--to", "vhdl", "--name", "9lives", "-"], src);
    assert_eq!(out.status.code(), Some(2));
    assert!(
        text(&out.stderr).contains("`9lives` cannot be the module name: not an identifier in VHDL"),
        "{}",
        text(&out.stderr)
    );
    let out = run(&["export", "--to", "verilog", "--name", "module", "-"], src);
    assert_eq!(out.status.code(), Some(2));
    assert!(text(&out.stderr).contains("a reserved word in Verilog"));
    // VHDL does not tell `Y` from the port `y`.
    let out = run(&["export", "--to", "vhdl", "--name", "Y", "-"], src);
    assert_eq!(out.status.code(), Some(2));
    assert!(text(&out.stderr).contains("a signal of the module has that name"));
    let out = run(&["export", "--to", "vhdl", "--name", "inverter", "-"], src);
    assert_eq!(out.status.code(), Some(0));
    let v = text(&out.stdout);
    assert!(v.contains("entity inverter is"), "{v}");
    assert!(v.contains("    y <= not a;\n"), "{v}");
}

#[test]
fn renamed_signals_are_listed_in_the_header_and_on_standard_error() {
    let out = run(
        &[
            "export",
            "--to",
            "verilog",
            "crates/implica/tests/fixtures/export/names.imp",
        ],
        "",
    );
    assert_eq!(out.status.code(), Some(0));
    let v = text(&out.stdout);
    assert!(
        v.contains("//   begin is begin_sig (a reserved word in Verilog)"),
        "{v}"
    );
    assert!(v.contains("    input  wire begin_sig,\n"), "{v}");
    // Verilog keeps `_arm`, `x__y` and the case of `Door`/`door`.
    assert!(v.contains("    input  wire _arm,\n"), "{v}");
    assert!(v.contains("    input  wire door,\n"), "{v}");
    // The comment's non-ASCII characters are replaced.
    assert!(v.contains("    // T?rschalter ? 2\n"), "{v}");
    let err = text(&out.stderr);
    assert!(
        err.contains("note: `wire` is `wire_sig` in the Verilog (a reserved word in Verilog)"),
        "{err}"
    );
}

#[test]
fn never_combinations_are_named_as_dont_cares_only_when_minimized() {
    let path = "examples/lift_door_interlock.imp";
    let minimized = text(&run(&["export", "--to", "verilog", path], "").stdout);
    assert!(
        minimized.contains("The input combinations that `never` statements exclude"),
        "{minimized}"
    );
    let written = text(&run(&["export", "--to", "verilog", "--as-written", path], "").stdout);
    assert!(!written.contains("`never`"), "{written}");
}

#[test]
fn the_hazard_rule_turned_on_keeps_the_consensus_term() {
    let path = "crates/implica/tests/fixtures/export/hazard/selector.imp";
    let out = run(&["export", "--to", "verilog", path], "");
    assert_eq!(out.status.code(), Some(0), "{}", text(&out.stderr));
    let v = text(&out.stdout);
    // The consensus term of s & a | !s & b (the consensus theorem).
    assert!(
        v.contains("    assign y = s & a | ~s & b | a & b;\n"),
        "{v}"
    );
    assert!(
        v.contains("1 consensus term added against static-1 hazards"),
        "{v}"
    );
    // The suppression comment is not carried into the module.
    assert!(!v.contains("quiet"), "{v}");
    // Without the configuration the minimal sum stays as it is.
    let src = std::fs::read_to_string(root().join(path)).unwrap();
    let out = run(&["export", "--to", "verilog", "-"], &src);
    assert!(text(&out.stdout).contains("    assign y = s & a | ~s & b;\n"));
    // A file directive turns the rule on for its own file, as the
    // configuration does; the directive stays behind too.
    let directed = format!("# implica: enable static-hazard\n{src}");
    let out = run(&["export", "--to", "verilog", "-"], &directed);
    assert_eq!(out.status.code(), Some(0), "{}", text(&out.stderr));
    let v = text(&out.stdout);
    assert!(
        v.contains("    assign y = s & a | ~s & b | a & b;\n"),
        "{v}"
    );
    assert!(!v.contains("enable"), "{v}");
}

#[cfg(unix)]
#[test]
fn output_files_are_written_atomically() {
    use std::os::unix::fs::PermissionsExt;
    let dir = tempfile::tempdir().unwrap();
    let src = "input a, b\noutput y\ny = a ^ b\n";
    let spec = dir.path().join("xor.imp");
    std::fs::write(&spec, src).unwrap();
    let args = |out: &str| -> Vec<String> {
        ["export", "--to", "verilog", "xor.imp", "--output", out]
            .iter()
            .map(|s| s.to_string())
            .collect()
    };
    let call = |out: &str| {
        let a = args(out);
        let a: Vec<&str> = a.iter().map(String::as_str).collect();
        run_in(dir.path(), &a, "")
    };
    // A new file: the usual permissions, no temporary file left behind.
    let out = call("xor.v");
    assert_eq!(out.status.code(), Some(0), "{}", text(&out.stderr));
    let written = std::fs::read_to_string(dir.path().join("xor.v")).unwrap();
    assert!(written.contains("module xor_sig ("), "{written}");
    assert!(written.contains("--output xor.v xor.imp"), "{written}");
    let mode = std::fs::metadata(dir.path().join("xor.v"))
        .unwrap()
        .permissions()
        .mode();
    assert_eq!(mode & 0o600, 0o600, "{mode:o}");
    let names: Vec<String> = std::fs::read_dir(dir.path())
        .unwrap()
        .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
        .collect();
    assert!(
        names.iter().all(|n| !n.starts_with(".implica-")),
        "{names:?}"
    );
    // An existing file keeps its permissions.
    std::fs::set_permissions(
        dir.path().join("xor.v"),
        std::fs::Permissions::from_mode(0o640),
    )
    .unwrap();
    std::fs::write(dir.path().join("xor.v"), "old").unwrap();
    assert_eq!(call("xor.v").status.code(), Some(0));
    let meta = std::fs::metadata(dir.path().join("xor.v")).unwrap();
    assert_eq!(meta.permissions().mode() & 0o777, 0o640);
    assert_eq!(
        std::fs::read_to_string(dir.path().join("xor.v")).unwrap(),
        written
    );
    // A directory that cannot be written to: exit 2, the old file intact.
    let locked = dir.path().join("locked");
    std::fs::create_dir(&locked).unwrap();
    std::fs::write(locked.join("xor.v"), "old").unwrap();
    std::fs::set_permissions(&locked, std::fs::Permissions::from_mode(0o555)).unwrap();
    let probe = locked.join("probe");
    let writable = std::fs::write(&probe, "").is_ok();
    if writable {
        // Running as root: directory permissions do not stop writes.
        std::fs::remove_file(&probe).unwrap();
        eprintln!(
            "note: running as root; the read-only directory case is checked with a missing directory"
        );
        let out = call("missing/dir/xor.v");
        assert_eq!(out.status.code(), Some(2));
        assert!(
            text(&out.stderr).contains("cannot write"),
            "{}",
            text(&out.stderr)
        );
    } else {
        let out = call("locked/xor.v");
        assert_eq!(out.status.code(), Some(2));
        assert!(
            text(&out.stderr).contains("cannot write"),
            "{}",
            text(&out.stderr)
        );
        assert_eq!(
            std::fs::read_to_string(locked.join("xor.v")).unwrap(),
            "old"
        );
    }
    std::fs::set_permissions(&locked, std::fs::Permissions::from_mode(0o755)).unwrap();
}
