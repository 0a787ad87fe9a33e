//! `implica minimize` and `implica table`, run as a user would, checked
//! against published worked examples and textbook facts.

mod common;
use common::implica_stdin;
use serde_json::Value;
use std::process::Output;

fn run(args: &[&str], input: &str) -> Output {
    implica_stdin(args, input.as_bytes())
}

fn json(args: &[&str], input: &str) -> (Value, Output) {
    let out = run(args, input);
    let v = serde_json::from_slice(&out.stdout)
        .unwrap_or_else(|e| panic!("{e}: {}", String::from_utf8_lossy(&out.stdout)));
    (v, out)
}

fn signal<'v>(doc: &'v Value, name: &str) -> &'v Value {
    doc["signals"]
        .as_array()
        .unwrap()
        .iter()
        .find(|s| s["name"] == name)
        .unwrap_or_else(|| panic!("no {name} in {doc}"))
}

/// The on-set of `expr` over `inputs`, computed by `implica table` from a
/// new document, so a printed form is checked by re-parsing it.
fn on_set_of(inputs: &str, expr: &str) -> Vec<u64> {
    let src = format!("input {inputs}\noutput g\ng = {expr}\n");
    let (doc, out) = json(&["table", "-", "--format", "json"], &src);
    assert_eq!(out.status.code(), Some(0), "{src}");
    signal(&doc, "g")["on"]
        .as_array()
        .unwrap()
        .iter()
        .map(|v| v.as_u64().unwrap())
        .collect()
}

// The worked example of the Wikipedia article "Quine–McCluskey algorithm":
// f = Σm(4, 8, 10, 11, 12, 15) + d(9, 14), minimum 3 terms and 7 literals,
// as BC'D' + AB' + AC or BC'D' + AD' + AC.
const WORKED: &str =
    "input a, b, c, d\noutput f\nf = on(4, 8, 10, 11, 12, 15) dc(9, 14) over (a, b, c, d)\n";

#[test]
fn minimize_finds_the_published_minimum() {
    let (doc, out) = json(&["minimize", "-", "--format", "json"], WORKED);
    assert_eq!(out.status.code(), Some(0));
    let f = signal(&doc, "f");
    assert_eq!(f["inputs"], serde_json::json!(["a", "b", "c", "d"]));
    let sop = &f["sop"];
    assert_eq!(sop["terms"], 3);
    assert_eq!(sop["literals"], 7);
    assert_eq!(sop["proven_minimal"], true);
    assert_eq!(sop["lower_bound"], 3);
    assert_eq!(sop["method"], "exact");
    let e = sop["expression"].as_str().unwrap();
    let mut terms: Vec<&str> = e.split(" | ").collect();
    terms.sort();
    assert!(
        terms == ["a & !b", "a & c", "b & !c & !d"] || terms == ["a & !d", "a & c", "b & !c & !d"],
        "{e}"
    );
    // The printed form parses and is 1 on every on-row, 0 on every off-row.
    let on = on_set_of("a, b, c, d", e);
    for m in [4, 8, 10, 11, 12, 15] {
        assert!(on.contains(&m), "{e} misses {m}");
    }
    for m in [0, 1, 2, 3, 5, 6, 7, 13] {
        assert!(!on.contains(&m), "{e} has {m}");
    }
    // The product of sums is also printed and checked the same way.
    let pos = f["pos"]["expression"].as_str().unwrap();
    let on = on_set_of("a, b, c, d", pos);
    assert!(
        [4, 8, 10, 11, 12, 15].iter().all(|m| on.contains(m)),
        "{pos}"
    );
    assert!(
        [0, 1, 2, 3, 5, 6, 7, 13].iter().all(|m| !on.contains(m)),
        "{pos}"
    );
}

#[test]
fn full_adder_forms() {
    // Full adder (common practice, any digital-design text): the sum is a
    // 3-input parity, 4 terms of 3 literals; the carry AB + ACin + BCin, and
    // by duality (A + B)(A + Cin)(B + Cin).
    let src = "input a, b, cin\noutput s, cout\ns = a ^ b ^ cin\ncout = a & b | cin & (a ^ b)\n";
    let (doc, out) = json(&["minimize", "-", "--format", "json"], src);
    assert_eq!(out.status.code(), Some(0));
    let s = signal(&doc, "s");
    assert_eq!(
        (s["sop"]["terms"].as_u64(), s["sop"]["literals"].as_u64()),
        (Some(4), Some(12))
    );
    let c = signal(&doc, "cout");
    assert_eq!(c["sop"]["expression"], "a & b | a & cin | b & cin");
    assert_eq!(c["pos"]["expression"], "(a | b) & (a | cin) & (b | cin)");
    assert_eq!(c["pos"]["terms"], 3);
}

#[test]
fn minimize_text_and_form_selection() {
    let out = run(
        &["minimize", "-", "--form", "sop", "--signal", "cout"],
        "input a, b, cin\noutput cout\ncout = a & b | cin & (a ^ b)\n",
    );
    assert_eq!(out.status.code(), Some(0));
    assert_eq!(
        String::from_utf8_lossy(&out.stdout),
        "cout  over a, b, cin\n  sum of products  a & b | a & cin | b & cin\n                   3 terms, 6 literals; proven minimal\n"
    );
}

#[test]
fn never_constraints_and_dont_cares_reach_the_minimizer() {
    // With a and b never both 1, a & !b | !a & b is a | b (the row a = b = 1
    // is free).
    let src = "input a, b\noutput y\nnever a & b\ny = a & !b | !a & b\n";
    let (doc, _) = json(&["minimize", "-", "--format", "json"], src);
    assert_eq!(signal(&doc, "y")["sop"]["expression"], "a | b");
    let (doc, _) = json(&["table", "-", "--format", "json"], src);
    let y = signal(&doc, "y");
    assert_eq!(y["on"], serde_json::json!([1, 2]));
    assert_eq!(y["dc"], serde_json::json!([3]));
}

#[test]
fn wide_signals_use_the_heuristic() {
    // 18 inputs, past the exact limit of 16: a0 a1 | a2 a3 | ... | a16 a17
    // (nine terms of two literals is its only minimal form: each term is an
    // essential prime; common practice).
    let inputs: Vec<String> = (0..18).map(|i| format!("a{i}")).collect();
    let expr: Vec<String> = (0..9)
        .map(|i| format!("a{} & a{}", 2 * i, 2 * i + 1))
        .collect();
    let src = format!(
        "input {}\noutput y\ny = {}\n",
        inputs.join(", "),
        expr.join(" | ")
    );
    let (doc, out) = json(
        &["minimize", "-", "--format", "json", "--form", "sop"],
        &src,
    );
    assert_eq!(out.status.code(), Some(0));
    let sop = &signal(&doc, "y")["sop"];
    assert_eq!(sop["method"], "heuristic");
    assert_eq!(sop["proven_minimal"], false);
    assert_eq!(
        (sop["terms"].as_u64(), sop["literals"].as_u64()),
        (Some(9), Some(18))
    );
}

#[test]
fn heuristic_forms_carry_the_bound_of_isolated_rows() {
    // 18 inputs: y is 1 where a0 ^ a1 ^ a2 and a3 .. a17 are all 1 (four
    // rows, each with every neighbour at 0: a term of its own in every sum
    // of products; common practice), or where a3 and a4 are both 0.
    let inputs: Vec<String> = (0..18).map(|i| format!("a{i}")).collect();
    let rest: Vec<String> = (3..18).map(|i| format!("a{i}")).collect();
    let isolated = format!("(a0 ^ a1 ^ a2) & {}", rest.join(" & "));
    let header = format!("input {}\noutput y\n", inputs.join(", "));
    // The four rows alone: the heuristic's four terms are the only cover of
    // that size, so the form is proven minimal.
    let (doc, out) = json(
        &["minimize", "-", "--format", "json", "--form", "sop"],
        &format!("{header}y = {isolated}\n"),
    );
    assert_eq!(out.status.code(), Some(0));
    let sop = &signal(&doc, "y")["sop"];
    assert_eq!(sop["method"], "heuristic");
    assert_eq!(
        (
            &sop["terms"],
            &sop["literals"],
            &sop["lower_bound"],
            &sop["proven_minimal"]
        ),
        (
            &Value::from(4),
            &Value::from(72),
            &Value::from(4),
            &Value::from(true)
        )
    );
    // With !a3 & !a4 besides, five terms are found, at least four needed.
    let src = format!("{header}y = {isolated} | !a3 & !a4\n");
    let out = run(&["minimize", "-", "--form", "sop"], &src);
    assert_eq!(out.status.code(), Some(0));
    let text = String::from_utf8_lossy(&out.stdout);
    assert!(
        text.contains(
            "5 terms, 74 literals; found by the heuristic, not proven minimal: at least 4 terms needed"
        ),
        "{text}"
    );
}

#[test]
fn table_formats() {
    let src = "input a, b, c\noutput x, y\nx = a & b\ny = on(1) dc(2) over (b, c)\n";
    let (doc, out) = json(&["table", "-", "--format", "json"], src);
    assert_eq!(out.status.code(), Some(0));
    let y = signal(&doc, "y");
    assert_eq!(y["inputs"], serde_json::json!(["b", "c"]));
    assert_eq!(y["on"], serde_json::json!([1]));
    assert_eq!(y["dc"], serde_json::json!([2]));
    // CSV: one table over a, b, c.
    let out = run(&["table", "-", "--format", "csv"], src);
    assert_eq!(
        String::from_utf8_lossy(&out.stdout),
        "a,b,c,x,y\n0,0,0,0,0\n0,0,1,0,1\n0,1,0,0,-\n0,1,1,0,0\n1,0,0,0,0\n1,0,1,0,1\n1,1,0,1,-\n1,1,1,1,0\n"
    );
    // Text: the table, then the map with the minimal sum's groups.
    let out = run(&["table", "-", "--signal", "x"], src);
    let text = String::from_utf8_lossy(&out.stdout);
    assert!(
        text.starts_with("a b | x\n----+--\n0 0 | 0\n0 1 | 0\n1 0 | 0\n1 1 | 1\n"),
        "{text}"
    );
    assert!(text.contains("a: a & b"), "{text}");
}

#[test]
fn problems_are_reported_with_the_right_exit_status() {
    // An unknown --signal is a usage error.
    let out = run(&["minimize", "-", "--signal", "nope"], WORKED);
    assert_eq!(out.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&out.stderr).contains("no signal named `nope`"));
    let out = run(&["table", "-", "--signal", "a"], WORKED);
    assert_eq!(out.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&out.stderr).contains("`a` is an input"));
    // A signal that reads an undefined name has no function; the others are
    // still minimized.
    let src = "input a\noutput y, z\ny = a & ghost\nz = !a\n";
    let (doc, out) = json(&["minimize", "-", "--format", "json"], src);
    assert_eq!(out.status.code(), Some(1));
    assert!(
        signal(&doc, "y")["error"]
            .as_str()
            .unwrap()
            .contains("`ghost`")
    );
    assert_eq!(signal(&doc, "z")["sop"]["expression"], "!a");
    // Syntax errors elsewhere leave the intact signals usable.
    let src = "input a, b\noutput y, z\ny = a & (b\nz = a | b\n";
    let out = run(&["table", "-", "--signal", "z", "--format", "json"], src);
    assert_eq!(out.status.code(), Some(0));
    assert!(String::from_utf8_lossy(&out.stderr).contains("1 syntax error"));
    // A table of more than 20 inputs is refused for that signal.
    let inputs: Vec<String> = (0..22).map(|i| format!("x{i}")).collect();
    let src = format!(
        "input {}\noutput y\ny = {}\n",
        inputs.join(", "),
        inputs.join(" ^ ")
    );
    let (doc, out) = json(&["table", "-", "--format", "json"], &src);
    assert_eq!(out.status.code(), Some(1));
    assert!(
        signal(&doc, "y")["error"]
            .as_str()
            .unwrap()
            .contains("22 inputs")
    );
    // A missing file.
    let out = run(&["minimize", "/nonexistent/x.imp"], "");
    assert_eq!(out.status.code(), Some(2));
}

#[test]
fn twenty_four_input_parity_is_too_large_and_says_what_is_known() {
    // Its minimal sum has 2^23 terms (standard textbook result on parity).
    let inputs: Vec<String> = (0..24).map(|i| format!("x{i}")).collect();
    let src = format!(
        "input {}\noutput p\np = {}\n",
        inputs.join(", "),
        inputs.join(" ^ ")
    );
    let (doc, out) = json(&["minimize", "-", "--format", "json"], &src);
    assert_eq!(out.status.code(), Some(1));
    let p = signal(&doc, "p");
    assert_eq!(p["inputs"].as_array().unwrap().len(), 24);
    let why = p["sop"]["error"].as_str().unwrap();
    assert!(
        why.contains("24 inputs") && why.contains("8388608"),
        "{why}"
    );
    // The same figures as numbers: 2^23 rows at 1 (and at 0), each with
    // only neighbours of the other value, so each a term of its own.
    for form in ["sop", "pos"] {
        assert_eq!(p[form]["rows"], 8_388_608, "{form}");
        assert_eq!(p[form]["lower_bound"], 8_388_608, "{form}");
    }
}

#[test]
fn eval_gives_every_signal_for_one_vector() {
    // Worked by hand from the definitions: t = a & b = 1, y = t | !c = 1,
    // z = a => b => c = 1 => (1 => 0) = 0.
    let src = "input a, b, c\noutput y, z\ny = t | !c\nlet t = a & b\nz = a => b => c\n";
    let out = run(&["eval", "-", "--set", "a=1,b=1", "--set", "c=0"], src);
    assert_eq!(out.status.code(), Some(0));
    assert_eq!(
        String::from_utf8_lossy(&out.stdout),
        "y = 1\nt = 1\nz = 0\n"
    );
    // A don't-care shows as free, and a reader that does not care as fixed.
    let src =
        "input a, b\noutput same, copy\nlet w = on(1) dc(2) over (a, b)\nsame = w ^ w\ncopy = w\n";
    let (doc, out) = json(&["eval", "-", "--set", "a=1,b=0", "--format", "json"], src);
    assert_eq!(out.status.code(), Some(0));
    let values: Vec<(String, String)> = doc["signals"]
        .as_array()
        .unwrap()
        .iter()
        .map(|s| {
            (
                s["name"].as_str().unwrap().into(),
                s["value"].as_str().unwrap().into(),
            )
        })
        .collect();
    assert_eq!(
        values,
        [
            ("w".into(), "free".into()),
            ("same".into(), "0".into()),
            ("copy".into(), "free".into())
        ]
    );
    // Every input must be set, once, to 0 or 1.
    for bad in [
        vec!["--set", "a=1"],
        vec!["--set", "a=1,b=2"],
        vec!["--set", "a=1,a=0,b=1"],
        vec!["--set", "a=1,q=0"],
    ] {
        let mut args = vec!["eval", "-"];
        args.extend(bad.iter());
        assert_eq!(run(&args, src).status.code(), Some(2), "{bad:?}");
    }
}
