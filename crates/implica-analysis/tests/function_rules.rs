//! The rules about signal functions (`constant-signal`, `vacuous-input`,
//! `equivalent-signals`, `shared-terms`) beyond their fixtures: small
//! documents worked out by hand (common practice: evaluating the
//! definitions row by row), random documents against the test's own
//! evaluation of every row, and the examples.

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
        "`y` is 1 on every input combination that `never` allows (it is 0 only where `never` excludes the inputs, as for a=1, b=0)"
    );
    assert!(d[0].fixes.is_empty());
    // When every combination is impossible, `never` is the fault, not y.
    let src = "input a\noutput y\nnever a | !a\ny = a\n";
    assert!(messages(src, "constant-signal").is_empty());
}

#[test]
fn a_vacuous_input_is_compared_with_its_freedom() {
    // Rows over (a, b): 1 on 01 and 11 is b; free on 00 only, its freedom
    // depends on a and a matters.
    let src = "input a, b\noutput y\ntable (a, b -> y) {\n  01 -> 1\n  11 -> 1\n  00 -> -\n  10 -> 0\n}\n";
    assert!(messages(src, "vacuous-input").is_empty());
    // Free on 00 and 10: both its value and its freedom are the same for
    // a=0 and a=1.
    let src = "input a, b\noutput y\ntable (a, b -> y) {\n  01 -> 1\n  11 -> 1\n  -0 -> -\n}\n";
    assert_eq!(
        messages(src, "vacuous-input"),
        ["`y` is the same for `a`=0 and `a`=1 under every input"]
    );
}

#[test]
fn a_constant_signal_has_no_vacuous_input() {
    let src = "input a, b\noutput y\ny = a & !a & b\n";
    assert!(messages(src, "vacuous-input").is_empty());
    assert_eq!(messages(src, "constant-signal"), ["`y` is always 0"]);
}

#[test]
fn a_vacuous_input_is_reported_where_it_stops_mattering() {
    // t = a & b | a & !b is a: b is reported at t only, not at y or z,
    // which read b through t.
    let src = "input a, b, c\noutput y, z\nlet t = a & b | a & !b\ny = t & c\nz = t | c\n";
    let d = of_rule(src, "vacuous-input");
    assert_eq!(d.len(), 1);
    assert_eq!(
        d[0].message,
        "`t` is the same for `b`=0 and `b`=1 under every input"
    );
    // u = b ^ c and v = u ^ b: v is c, so b is vacuous for v although it
    // matters for u, which v reads: reported at v, with both places where
    // v's definition brings b in.
    let src = "input b, c\noutput v\nlet u = b ^ c\nv = u ^ b\n";
    let d = of_rule(src, "vacuous-input");
    assert_eq!(d.len(), 1);
    assert_eq!(
        d[0].message,
        "`v` is the same for `b`=0 and `b`=1 under every input"
    );
    let notes: Vec<&str> = d[0].related.iter().map(|r| r.message.as_str()).collect();
    assert_eq!(
        notes,
        ["`b` reaches `v` through `u` here", "`b` is read here"]
    );
    // Arriving only through signals that depend on it, b cancels out in
    // how they are combined: not reported.
    let src = "input b, c\noutput v\nlet u = b & c\nlet w = !b & c\nv = u | w\n";
    assert!(messages(src, "vacuous-input").is_empty());
}

#[test]
fn an_input_that_only_matters_to_one_signal_is_reported_there() {
    // b is vacuous for y, and y is the only reader: one report at y.
    let src = "input a, b\noutput y\ny = a | a & b\n";
    let d = of_rule(src, "vacuous-input");
    assert_eq!(d.len(), 1);
    assert!(d[0].message.starts_with("`y` is the same"));
    // If another signal depends on b, each vacuous reader is reported at
    // its own definition.
    let src = "input a, b\noutput y, z, w\ny = a | a & b\nz = a & (b | !b)\nw = b\n";
    assert_eq!(
        messages(src, "vacuous-input"),
        [
            "`y` is the same for `b`=0 and `b`=1 under every input",
            "`z` is the same for `b`=0 and `b`=1 under every input"
        ]
    );
}

#[test]
fn never_alone_does_not_make_an_unnamed_input_vacuous() {
    // With never a & c, y = c & !t ignores a (where c is 1, a is 0), but a
    // reaches y only through t: not reported. Named in the definition, it
    // is; z is c there, so b is vacuous too.
    let src =
        "input a, b, c\noutput y, z\nnever a & c\nlet t = a & b\ny = c & !t\nz = c & !(a & b)\n";
    assert_eq!(
        messages(src, "vacuous-input"),
        [
            "`z` is the same for `a`=0 and `a`=1 under every input combination that `never` allows",
            "`z` is the same for `b`=0 and `b`=1 under every input combination that `never` allows"
        ]
    );
}

#[test]
fn equivalent_outputs_get_no_fix_that_would_make_a_cycle() {
    // y1 = y2 | a & b & !a is y2 (the second term is 0), and y1 comes first:
    // defining y2 as y1 would make y2 read itself.
    let src = "input a, b\noutput y1, y2\ny1 = y2 | a & b & !a\ny2 = a & b\n";
    let d = of_rule(src, "equivalent-signals");
    assert_eq!(d.len(), 1);
    assert_eq!(d[0].message, "`y2` computes the same function as `y1`");
    assert!(d[0].fixes.is_empty());
}

#[test]
fn equivalent_outputs_with_dont_cares_share_their_freedom() {
    // Both are 1 on row 11 and free on row 10 (rows over a, b): equal,
    // but no fix, since each has its own pick of the free row.
    let table =
        |name: &str| format!("table (a, b -> {name}) {{\n  11 -> 1\n  10 -> -\n  0- -> 0\n}}\n");
    let src = format!("input a, b\noutput y, z\n{}{}", table("y"), table("z"));
    let d = of_rule(&src, "equivalent-signals");
    assert_eq!(d.len(), 1);
    assert_eq!(d[0].message, "`z` computes the same function as `y`");
    assert!(d[0].fixes.is_empty());
    // Free on another row: not the same specification.
    let other = "table (a, b -> z) {\n  11 -> 1\n  01 -> -\n  10 -> 0\n  00 -> 0\n}\n";
    let src = format!("input a, b\noutput y, z\n{}{other}", table("y"));
    assert!(messages(&src, "equivalent-signals").is_empty());
}

#[test]
fn constant_outputs_are_not_equivalent_signals() {
    let src = "input a\noutput y, z\ny = a & !a\nz = 0\n";
    assert!(messages(src, "equivalent-signals").is_empty());
}

#[test]
fn shared_terms_are_looked_for_only_in_small_known_groups() {
    // Two outputs sharing x0 & x1 over 13 inputs: past the 12-input limit.
    let names: Vec<String> = (0..13).map(|i| format!("x{i}")).collect();
    let src = format!(
        "input {}\noutput p, q\np = x0 & x1 | {}\nq = x0 & x1 | x2 & x3\n",
        names.join(", "),
        names[2..].join(" & ")
    );
    assert!(messages(&src, "shared-terms").is_empty());
    // The same over 12 inputs fires: alone 2 + 2 terms, together 3.
    let src = format!(
        "input {}\noutput p, q\np = x0 & x1 | {}\nq = x0 & x1 | x2 & x3\n",
        names[..12].join(", "),
        names[2..12].join(" & ")
    );
    assert_eq!(
        messages(&src, "shared-terms"),
        ["minimized together, `p` and `q` need 3 product terms instead of 4; shared: `x0 & x1`"]
    );
    // An output of the group with no known function: nothing is said.
    let src = "input a, b, c\noutput p, q, r\np = a & b | c\nq = a & b | !c\nr = a & nowhere\n";
    assert!(messages(src, "shared-terms").is_empty());
    let src = "input a, b, c\noutput p, q\np = a & b | c\nq = a & b | !c\n";
    assert_eq!(messages(src, "shared-terms").len(), 1);
}

#[test]
fn an_input_no_signal_depends_on_is_reported_once_at_its_declaration() {
    // y = a | a & b is a, z = a & (b | !b) is a: neither depends on b.
    let src = "input a, b\noutput y, z\ny = a | a & b\nz = a & (b | !b)\n";
    let d = of_rule(src, "vacuous-input");
    assert_eq!(d.len(), 1);
    assert_eq!(
        d[0].message,
        "no signal depends on input `b`: `y` and `z` read it, but each is the same for `b`=0 and `b`=1 under every input"
    );
    assert_eq!(&src[d[0].span.start..d[0].span.end], "b");
    assert_eq!(d[0].related.len(), 3);
    // While a statement does not parse (it may read b), each is reported
    // where it is.
    let broken = format!("{src}let w = (b &\n");
    assert_eq!(
        messages(&broken, "vacuous-input"),
        [
            "`y` is the same for `b`=0 and `b`=1 under every input",
            "`z` is the same for `b`=0 and `b`=1 under every input"
        ]
    );
}

#[test]
fn never_on_other_inputs_can_hide_an_input() {
    // never c & !a: where c is 1, a is 1, so in y = a | c & b the term c & b
    // adds nothing: y is a, and neither b nor c matters. A constraint on an
    // input z does not read (never d) hides nothing.
    let src = "input a, b, c, d\noutput y, z\nnever c & !a\ny = a | c & b\nnever d\nz = a & b\n";
    assert_eq!(
        messages(src, "vacuous-input"),
        [
            "`y` is the same for `b`=0 and `b`=1 under every input combination that `never` allows",
            "`y` is the same for `c`=0 and `c`=1 under every input combination that `never` allows"
        ]
    );
}

/// A random expression over `n` inputs, as text with its truth table
/// worked out by the test's own evaluation (independent of the engine).
fn random_expr(
    rnd: &mut impl FnMut(usize) -> usize,
    n: usize,
    depth: usize,
) -> (String, Vec<bool>) {
    let rows = 1usize << n;
    if depth == 0 || rnd(4) == 0 {
        let v = rnd(n);
        // Variable 0 is the most significant bit of the row number.
        let t = (0..rows).map(|r| (r >> (n - 1 - v)) & 1 == 1).collect();
        return (format!("x{v}"), t);
    }
    match rnd(4) {
        0 => {
            let (s, t) = random_expr(rnd, n, depth - 1);
            (format!("!({s})"), t.iter().map(|b| !b).collect())
        }
        k => {
            let (a, ta) = random_expr(rnd, n, depth - 1);
            let (b, tb) = random_expr(rnd, n, depth - 1);
            let (op, f): (&str, fn(bool, bool) -> bool) = match k {
                1 => ("&", |x, y| x & y),
                2 => ("|", |x, y| x | y),
                _ => ("^", |x, y| x ^ y),
            };
            let t = ta.iter().zip(&tb).map(|(&x, &y)| f(x, y)).collect();
            (format!("({a}) {op} ({b})"), t)
        }
    }
}

#[test]
fn findings_agree_with_brute_force_evaluation() {
    let mut state = 0x9e37_79b9_7f4a_7c15u64;
    let mut rnd = move |k: usize| {
        state ^= state << 13;
        state ^= state >> 7;
        state ^= state << 17;
        (state % k as u64) as usize
    };
    let n = 3;
    let rows = 1usize << n;
    let (mut constants, mut vacuous, mut equal) = (0, 0, 0);
    for _ in 0..300 {
        let (ys, yt) = random_expr(&mut rnd, n, 3);
        let (zs, zt) = random_expr(&mut rnd, n, 3);
        let src = format!("input x0, x1, x2\noutput y, z\ny = {ys}\nz = {zs}\n");
        let a = analyze(&src);
        assert!(
            a.internal_errors.is_empty(),
            "{src}: {:?}",
            a.internal_errors
        );
        let got = |rule: &str| -> Vec<String> {
            a.diagnostics
                .iter()
                .filter(|d| d.rule == rule)
                .map(|d| d.message.clone())
                .collect()
        };
        let is_const = |t: &[bool]| t.iter().all(|&b| b == t[0]);
        let mut want_const = Vec::new();
        for (name, t) in [("y", &yt), ("z", &zt)] {
            if is_const(t) {
                want_const.push(format!("`{name}` is always {}", u8::from(t[0])));
            }
        }
        constants += want_const.len();
        assert_eq!(got("constant-signal"), want_const, "{src}");
        // Per signal, each named input it does not depend on; one input
        // that neither signal depends on, named by both, is reported once
        // at its declaration.
        let named = |s: &str, v: usize| {
            s.split(|c: char| !c.is_alphanumeric())
                .any(|w| w == format!("x{v}"))
        };
        let ignores = |t: &[bool], v: usize| (0..rows).all(|r| t[r] == t[r ^ (1 << (n - 1 - v))]);
        let mut want_vacuous = Vec::new();
        for v in 0..n {
            let mut found = Vec::new();
            let mut every = true;
            for (name, s, t) in [("y", &ys, &yt), ("z", &zs, &zt)] {
                if !named(s, v) {
                    continue;
                }
                every &= ignores(t, v);
                if ignores(t, v) && !is_const(t) {
                    found.push(name);
                }
            }
            if found.len() == 2 && every {
                want_vacuous.push(format!(
                    "no signal depends on input `x{v}`: `y` and `z` read it, but each is the same for `x{v}`=0 and `x{v}`=1 under every input"
                ));
            } else {
                for name in found {
                    want_vacuous.push(format!(
                        "`{name}` is the same for `x{v}`=0 and `x{v}`=1 under every input"
                    ));
                }
            }
        }
        vacuous += want_vacuous.len();
        let mut got_vacuous = got("vacuous-input");
        got_vacuous.sort();
        want_vacuous.sort();
        assert_eq!(got_vacuous, want_vacuous, "{src}");
        // The same bare name twice says they are equal on purpose.
        let same_name = ys == zs && ys.starts_with('x') && ys.len() == 2;
        let want_equal = yt == zt && !is_const(&yt) && !same_name;
        equal += usize::from(want_equal);
        assert_eq!(
            got("equivalent-signals"),
            if want_equal {
                vec!["`z` computes the same function as `y`".to_string()]
            } else {
                vec![]
            },
            "{src}"
        );
    }
    // The generated cases exercise every rule.
    assert!(
        constants > 10 && vacuous > 10 && equal > 3,
        "{constants} {vacuous} {equal}"
    );
}
