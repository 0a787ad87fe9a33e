//! `implica export`, checked by real simulators: every example and export
//! fixture is exported to Verilog and to VHDL, minimized and as written;
//! each module is compiled and simulated, Verilog with Icarus Verilog
//! (Debian package `iverilog`, `-g2005`), VHDL with GHDL (Debian package
//! `ghdl`, `--std=08`), by a generated test bench that drives every input
//! vector and compares every output with `implica table`'s answer wherever
//! that answer is not a don't-care.
//!
//! A missing simulator skips these tests with a loud message, except under
//! CI (`CI` set), where it fails them; scripts/test installs both.

mod common;
use common::{implica, root};
use serde_json::Value;
use std::path::{Path, PathBuf};
use std::process::Command;

/// Whether `tool` runs; under CI its absence is a failure.
fn have(tool: &str) -> bool {
    let ok = Command::new(tool)
        .arg(if tool == "iverilog" {
            "-V"
        } else {
            "--version"
        })
        .output()
        .is_ok_and(|o| o.status.success());
    if !ok {
        assert!(
            std::env::var_os("CI").is_none(),
            "{tool} is required under CI (scripts/test installs it: apt-get install iverilog ghdl)"
        );
        eprintln!(
            "\n*** WARNING: {tool} not found: the {tool} simulation test is SKIPPED (apt-get install {}) ***\n",
            if tool == "iverilog" {
                "iverilog"
            } else {
                "ghdl"
            }
        );
    }
    ok
}

/// The files every simulation covers.
fn documents() -> Vec<PathBuf> {
    let mut out = Vec::new();
    for dir in ["examples", "crates/implica/tests/fixtures/export"] {
        let mut stack = vec![root().join(dir)];
        while let Some(d) = stack.pop() {
            for e in std::fs::read_dir(&d).unwrap() {
                let p = e.unwrap().path();
                if p.is_dir() {
                    stack.push(p);
                } else if p.extension().is_some_and(|x| x == "imp") {
                    out.push(p);
                }
            }
        }
    }
    out.sort();
    assert!(
        out.len() >= 10,
        "expected the examples and fixtures: {out:?}"
    );
    out
}

/// What every output must be on each row of the full input space (first
/// declared input = most significant bit): `Some(value)` where
/// `implica table` fixes it, `None` where it is a don't-care.
struct Expected {
    inputs: usize,
    outputs: Vec<(String, Vec<Option<bool>>)>,
}

fn expected(path: &Path) -> Expected {
    let src = std::fs::read_to_string(path).unwrap();
    let (file, errors) = implica_syntax::parse(&src);
    assert!(errors.is_empty(), "{}: {errors:?}", path.display());
    let model = implica_analysis::model::Model::build(&file);
    let inputs: Vec<String> = model
        .inputs
        .iter()
        .map(|&s| model.signals[s].name.to_string())
        .collect();
    let mut outputs: Vec<usize> = (0..model.signals.len())
        .filter(|&s| model.signals[s].kind == implica_analysis::model::SignalKind::Output)
        .collect();
    outputs.sort_by_key(|&s| model.signals[s].declarations[0].start);
    let n = inputs.len();
    assert!(
        (1..=12).contains(&n),
        "{}: the benches drive 1 to 12 inputs",
        path.display()
    );
    let out = implica(&["table", path.to_str().unwrap(), "--format", "json"]);
    assert_eq!(
        out.status.code(),
        Some(0),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    let doc: Value = serde_json::from_slice(&out.stdout).unwrap();
    let rows = 1usize << n;
    let outputs = outputs
        .iter()
        .map(|&s| {
            let name = model.signals[s].name.to_string();
            let t = doc["signals"]
                .as_array()
                .unwrap()
                .iter()
                .find(|t| t["name"] == name.as_str())
                .unwrap_or_else(|| panic!("no table of {name}"));
            let set = |key: &str| -> Vec<usize> {
                t[key]
                    .as_array()
                    .unwrap()
                    .iter()
                    .map(|v| v.as_u64().unwrap() as usize)
                    .collect()
            };
            let (on, dc) = (set("on"), set("dc"));
            let positions: Vec<usize> = t["inputs"]
                .as_array()
                .unwrap()
                .iter()
                .map(|i| {
                    inputs
                        .iter()
                        .position(|x| x == i.as_str().unwrap())
                        .unwrap()
                })
                .collect();
            let values = (0..rows)
                .map(|r| {
                    let m = positions
                        .iter()
                        .fold(0usize, |acc, &p| (acc << 1) | ((r >> (n - 1 - p)) & 1));
                    if dc.contains(&m) {
                        None
                    } else {
                        Some(on.contains(&m))
                    }
                })
                .collect();
            (name, values)
        })
        .collect();
    Expected { inputs: n, outputs }
}

/// Row `r`'s bit first: the bits of a literal of `rows` bits, written with
/// the highest row first, as both languages write vectors.
fn bits(values: impl DoubleEndedIterator<Item = bool>) -> String {
    values.rev().map(|b| if b { '1' } else { '0' }).collect()
}

fn value_bits(v: &[Option<bool>]) -> String {
    bits(v.iter().map(|x| x.unwrap_or(false)))
}

fn care_bits(v: &[Option<bool>]) -> String {
    bits(v.iter().map(Option::is_some))
}

fn checks(e: &Expected) -> usize {
    e.outputs
        .iter()
        .map(|(_, v)| v.iter().filter(|x| x.is_some()).count())
        .sum()
}

fn verilog_bench(e: &Expected) -> String {
    let (n, m, rows) = (e.inputs, e.outputs.len(), 1usize << e.inputs);
    let mut s = String::from("module bench;\n");
    s.push_str(&format!(
        "    reg [{}:0] v;\n    wire [{}:0] y;\n",
        n - 1,
        m - 1
    ));
    let actuals: Vec<String> = (0..n)
        .map(|i| format!("v[{}]", n - 1 - i))
        .chain((0..m).map(|k| format!("y[{k}]")))
        .collect();
    s.push_str(&format!("    dut u ({});\n", actuals.join(", ")));
    for (k, (_, v)) in e.outputs.iter().enumerate() {
        s.push_str(&format!(
            "    localparam [{}:0] E{k} = {rows}'b{};\n    localparam [{}:0] C{k} = {rows}'b{};\n",
            rows - 1,
            value_bits(v),
            rows - 1,
            care_bits(v)
        ));
    }
    s.push_str("    integer r, checks, errors;\n    initial begin\n");
    s.push_str("        checks = 0; errors = 0;\n");
    s.push_str(&format!(
        "        for (r = 0; r < {rows}; r = r + 1) begin\n            v = r;\n            #1;\n"
    ));
    for k in 0..m {
        s.push_str(&format!(
            "            if (C{k}[r]) begin\n                checks = checks + 1;\n                if (y[{k}] !== E{k}[r]) begin\n                    errors = errors + 1;\n                    $display(\"MISMATCH output {k} row %0d: %b\", r, y[{k}]);\n                end\n            end\n"
        ));
    }
    s.push_str("        end\n        $display(\"RESULT checks=%0d errors=%0d\", checks, errors);\n        $finish;\n    end\nendmodule\n");
    s
}

fn vhdl_bench(e: &Expected) -> String {
    let (n, m, rows) = (e.inputs, e.outputs.len(), 1usize << e.inputs);
    let mut s = String::from(
        "library ieee;\nuse ieee.std_logic_1164.all;\nuse ieee.numeric_std.all;\n\nentity bench is\nend entity bench;\n\narchitecture sim of bench is\n",
    );
    s.push_str(&format!(
        "    signal v : std_logic_vector({} downto 0);\n    signal y : std_logic_vector({} downto 0);\n",
        n - 1,
        m - 1
    ));
    for (k, (_, v)) in e.outputs.iter().enumerate() {
        s.push_str(&format!(
            "    constant E{k} : std_logic_vector({} downto 0) := \"{}\";\n    constant C{k} : std_logic_vector({} downto 0) := \"{}\";\n",
            rows - 1,
            value_bits(v),
            rows - 1,
            care_bits(v)
        ));
    }
    let actuals: Vec<String> = (0..n)
        .map(|i| format!("v({})", n - 1 - i))
        .chain((0..m).map(|k| format!("y({k})")))
        .collect();
    s.push_str(&format!(
        "begin\n    u : entity work.dut port map ({});\n",
        actuals.join(", ")
    ));
    s.push_str("    process\n        variable checks, errors : natural := 0;\n    begin\n");
    s.push_str(&format!(
        "        for r in 0 to {} loop\n            v <= std_logic_vector(to_unsigned(r, {n}));\n            wait for 1 ns;\n",
        rows - 1
    ));
    for k in 0..m {
        s.push_str(&format!(
            "            if C{k}(r) = '1' then\n                checks := checks + 1;\n                if y({k}) /= E{k}(r) then\n                    errors := errors + 1;\n                    report \"MISMATCH output {k} row \" & integer'image(r);\n                end if;\n            end if;\n"
        ));
    }
    s.push_str("        end loop;\n        report \"RESULT checks=\" & integer'image(checks) & \" errors=\" & integer'image(errors);\n        wait;\n    end process;\nend architecture sim;\n");
    s
}

/// `checks` and `errors` from the bench's `RESULT` line.
fn result(out: &str) -> (usize, usize) {
    let line = out
        .lines()
        .find_map(|l| l.split_once("RESULT ").map(|(_, r)| r.to_string()))
        .unwrap_or_else(|| panic!("no RESULT line in:\n{out}"));
    let num = |key: &str| -> usize {
        line.split_whitespace()
            .find_map(|w| w.strip_prefix(key))
            .and_then(|v| v.parse().ok())
            .unwrap_or_else(|| panic!("no {key} in {line}"))
    };
    (num("checks="), num("errors="))
}

fn export(path: &Path, to: &str, as_written: bool) -> String {
    let mut args = vec![
        "export",
        "--to",
        to,
        "--name",
        "dut",
        path.to_str().unwrap(),
    ];
    if as_written {
        args.insert(3, "--as-written");
    }
    let out = implica(&args);
    assert_eq!(
        out.status.code(),
        Some(0),
        "{} {args:?}: {}",
        path.display(),
        String::from_utf8_lossy(&out.stderr)
    );
    String::from_utf8(out.stdout).unwrap()
}

fn run_ok(cmd: &mut Command, what: &str) -> String {
    let out = cmd.output().unwrap_or_else(|e| panic!("{what}: {e}"));
    let text = format!(
        "{}{}",
        String::from_utf8_lossy(&out.stdout),
        String::from_utf8_lossy(&out.stderr)
    );
    assert!(out.status.success(), "{what} failed:\n{text}");
    text
}

/// Compiles and simulates a Verilog module with its bench; the compiler
/// must not warn about the module (`-Wall`).
fn simulate_verilog(dir: &Path, module: &str, bench: &str) -> (usize, usize) {
    std::fs::write(dir.join("dut.v"), module).unwrap();
    std::fs::write(dir.join("bench.v"), bench).unwrap();
    let warnings = run_ok(
        Command::new("iverilog")
            .args(["-g2005", "-Wall", "-o"])
            .arg(dir.join("dut.vvp"))
            .arg(dir.join("dut.v")),
        "iverilog (module alone)",
    );
    assert!(
        warnings.trim().is_empty(),
        "iverilog warns:\n{warnings}\n{module}"
    );
    run_ok(
        Command::new("iverilog")
            .args(["-g2005", "-Wall", "-o"])
            .arg(dir.join("sim.vvp"))
            .arg(dir.join("dut.v"))
            .arg(dir.join("bench.v")),
        "iverilog",
    );
    result(&run_ok(
        Command::new("vvp").arg("-n").arg(dir.join("sim.vvp")),
        "vvp",
    ))
}

fn simulate_vhdl(dir: &Path, module: &str, bench: &str) -> (usize, usize) {
    std::fs::write(dir.join("dut.vhd"), module).unwrap();
    std::fs::write(dir.join("bench.vhd"), bench).unwrap();
    let work = format!("--workdir={}", dir.display());
    run_ok(
        Command::new("ghdl")
            .args(["-a", "--std=08", &work])
            .arg(dir.join("dut.vhd"))
            .arg(dir.join("bench.vhd")),
        "ghdl -a",
    );
    result(&run_ok(
        Command::new("ghdl")
            .args(["--elab-run", "--std=08", &work, "bench"])
            .current_dir(dir),
        "ghdl --elab-run",
    ))
}

fn simulate_all(language: &str) {
    let tool = if language == "verilog" {
        "iverilog"
    } else {
        "ghdl"
    };
    if !have(tool) {
        return;
    }
    let mut simulated = 0;
    for path in documents() {
        let e = expected(&path);
        let want = checks(&e);
        assert!(want > 0, "{}: nothing to check", path.display());
        for as_written in [false, true] {
            let module = export(&path, language, as_written);
            let dir = tempfile::tempdir().unwrap();
            let (got, errors) = if language == "verilog" {
                simulate_verilog(dir.path(), &module, &verilog_bench(&e))
            } else {
                simulate_vhdl(dir.path(), &module, &vhdl_bench(&e))
            };
            let label = format!(
                "{} ({language}, {})",
                path.display(),
                if as_written {
                    "as written"
                } else {
                    "minimized"
                }
            );
            assert_eq!(got, want, "{label}: the bench compared too few values");
            assert_eq!(errors, 0, "{label}: the simulated module differs\n{module}");
            simulated += 1;
        }
    }
    eprintln!("{tool}: {simulated} modules simulated, every care value equal");
}

#[test]
fn verilog_of_every_document_simulates_to_its_tables() {
    simulate_all("verilog");
}

#[test]
fn vhdl_of_every_document_simulates_to_its_tables() {
    simulate_all("vhdl");
}

/// The benches can fail: with one expected value flipped, each simulator
/// reports exactly that one mismatch.
#[test]
fn a_wrong_expectation_is_caught_by_both_benches() {
    let path = root().join("examples/lift_door_interlock.imp");
    let mut e = expected(&path);
    let row = e.outputs[0].1.iter().position(Option::is_some).unwrap();
    let v = e.outputs[0].1[row].unwrap();
    e.outputs[0].1[row] = Some(!v);
    let want = checks(&e);
    if have("iverilog") {
        let dir = tempfile::tempdir().unwrap();
        let module = export(&path, "verilog", false);
        assert_eq!(
            simulate_verilog(dir.path(), &module, &verilog_bench(&e)),
            (want, 1)
        );
    }
    if have("ghdl") {
        let dir = tempfile::tempdir().unwrap();
        let module = export(&path, "vhdl", true);
        assert_eq!(
            simulate_vhdl(dir.path(), &module, &vhdl_bench(&e)),
            (want, 1)
        );
    }
}
