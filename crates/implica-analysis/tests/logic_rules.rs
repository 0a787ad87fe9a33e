//! The rules about tables, constraints, assertions and test vectors,
//! checked against brute-force evaluation written here, independently of
//! the BDDs the rules use: seeded random programs over three inputs, every
//! input combination and every choice of a don't-care enumerated.

use implica_analysis::{Diagnostic, analyze, fixes};

fn diags(src: &str, rule: &str) -> Vec<Diagnostic> {
    let a = analyze(src);
    assert!(
        a.internal_errors.is_empty(),
        "{src}\n{:?}",
        a.internal_errors
    );
    a.diagnostics
        .into_iter()
        .filter(|d| d.rule == rule)
        .collect()
}

/// A small deterministic generator (64-bit LCG, Knuth's MMIX constants;
/// common practice).
struct Rng(u64);

impl Rng {
    fn next(&mut self) -> u64 {
        self.0 = self
            .0
            .wrapping_mul(6364136223846793005)
            .wrapping_add(1442695040888963407);
        self.0 >> 33
    }
    fn below(&mut self, n: u64) -> u64 {
        self.next() % n
    }
}

/// An expression over named variables, written fully parenthesized.
enum E {
    Var(usize),
    Not(Box<E>),
    Bin(char, Box<E>, Box<E>),
}

fn random_expr(r: &mut Rng, depth: u32, vars: usize) -> E {
    if depth == 0 || r.below(3) == 0 {
        return E::Var(r.below(vars as u64) as usize);
    }
    match r.below(4) {
        0 => E::Not(Box::new(random_expr(r, depth - 1, vars))),
        k => E::Bin(
            ['&', '|', '^'][k as usize - 1],
            Box::new(random_expr(r, depth - 1, vars)),
            Box::new(random_expr(r, depth - 1, vars)),
        ),
    }
}

fn text(e: &E, names: &[&str]) -> String {
    match e {
        E::Var(i) => names[*i].to_string(),
        E::Not(x) => format!("!({})", text(x, names)),
        E::Bin(op, a, b) => format!("({} {op} {})", text(a, names), text(b, names)),
    }
}

fn eval(e: &E, v: &[bool]) -> bool {
    match e {
        E::Var(i) => v[*i],
        E::Not(x) => !eval(x, v),
        E::Bin('&', a, b) => eval(a, v) & eval(b, v),
        E::Bin('|', a, b) => eval(a, v) | eval(b, v),
        E::Bin(_, a, b) => eval(a, v) ^ eval(b, v),
    }
}

/// Bits of minterm `m` of three inputs, `a` the most significant.
fn bits(m: usize) -> [bool; 3] {
    [m & 4 != 0, m & 2 != 0, m & 1 != 0]
}

/// `name=0/1` pairs of a message, after `marker`.
fn vector_after(message: &str, marker: &str) -> Vec<(String, bool)> {
    let rest = &message[message.find(marker).unwrap() + marker.len()..];
    let end = rest.find([':', ';']).unwrap_or(rest.len());
    let rest = rest[..end].split(" for some").next().unwrap();
    rest.split(", ")
        .map(|p| {
            let (n, v) = p.split_once('=').unwrap();
            (n.to_string(), v == "1")
        })
        .collect()
}

/// A random program: inputs `a, b, c`; `w` with on-set and don't-cares
/// over them; `y` an expression over `a, b, c, w`; maybe one `never` over
/// the inputs.
struct Program {
    on: [bool; 8],
    dc: [bool; 8],
    y: E,
    never: Option<E>,
}

impl Program {
    fn random(r: &mut Rng) -> Program {
        let mut on = [false; 8];
        let mut dc = [false; 8];
        for m in 0..8 {
            match r.below(4) {
                0 | 1 => on[m] = true,
                2 if r.below(2) == 0 => dc[m] = true,
                _ => {}
            }
        }
        let never = (r.below(2) == 0).then(|| random_expr(r, 2, 3));
        Program {
            on,
            dc,
            y: random_expr(r, 3, 4),
            never,
        }
    }

    fn text(&self) -> String {
        let list = |s: &[bool; 8]| {
            (0..8)
                .filter(|&m| s[m])
                .map(|m| m.to_string())
                .collect::<Vec<_>>()
                .join(", ")
        };
        let mut t = format!(
            "input a, b, c\noutput y\nlet w = on({}) dc({}) over (a, b, c)\ny = {}\n",
            list(&self.on),
            list(&self.dc),
            text(&self.y, &["a", "b", "c", "w"])
        );
        if let Some(n) = &self.never {
            t.push_str(&format!("never {}\n", text(n, &["a", "b", "c"])));
        }
        t
    }

    fn possible(&self, m: usize) -> bool {
        self.never.as_ref().is_none_or(|n| !eval(n, &bits(m)))
    }

    /// `[a, b, c, w, y]` at minterm `m` with `w`'s pick `pick` where it
    /// is free.
    fn values(&self, m: usize, pick: bool) -> [bool; 5] {
        let [a, b, c] = bits(m);
        let w = self.on[m] || (self.dc[m] && pick);
        let y = eval(&self.y, &[a, b, c, w]);
        [a, b, c, w, y]
    }
}

fn minterm_of(vector: &[(String, bool)]) -> Vec<usize> {
    (0..8)
        .filter(|&m| {
            vector.iter().all(|(n, v)| {
                let i = ["a", "b", "c"].iter().position(|x| x == n).unwrap();
                bits(m)[i] == *v
            })
        })
        .collect()
}

#[test]
fn assertions_fail_exactly_where_some_possible_vector_and_pick_makes_them_0() {
    let mut r = Rng(7);
    let (mut fired, mut weak) = (0, 0);
    for _ in 0..300 {
        let p = Program::random(&mut r);
        let a = random_expr(&mut r, 3, 5);
        let src = format!(
            "{}assert {}\n",
            p.text(),
            text(&a, &["a", "b", "c", "w", "y"])
        );
        let fails = |m: usize, pick: bool| p.possible(m) && !eval(&a, &p.values(m, pick));
        let expected = (0..8).any(|m| fails(m, false) || fails(m, true));
        let found = diags(&src, "assertion-failed");
        assert_eq!(found.len(), usize::from(expected), "{src}\n{found:?}");
        if let Some(d) = found.first() {
            fired += 1;
            weak += usize::from(d.message.contains("for some choices"));
            // Every vector the counterexample stands for fails: for every
            // pick unless the message says "for some choices".
            let every = !d.message.contains("for some choices");
            // The vector names the inputs the assertion reads; the rest may
            // take any value that is possible, and some value is.
            let ms: Vec<usize> = minterm_of(&vector_after(&d.message, "fails at "))
                .into_iter()
                .filter(|&m| p.possible(m))
                .collect();
            assert!(!ms.is_empty(), "{src}\n{}", d.message);
            for m in ms {
                let ok = if every {
                    fails(m, false) && fails(m, true)
                } else {
                    fails(m, false) || fails(m, true)
                };
                assert!(ok, "{src}\n{} (minterm {m})", d.message);
            }
            // A failure for every pick, when there is one, is preferred.
            let strong = (0..8).any(|m| fails(m, false) && fails(m, true));
            assert_eq!(every, strong, "{src}\n{}", d.message);
        }
    }
    // Both outcomes, and both kinds of counterexample, were exercised.
    assert!((50..295).contains(&fired) && weak > 5, "{fired} {weak}");
}

#[test]
fn test_vectors_mismatch_exactly_where_a_covered_possible_vector_differs() {
    let mut r = Rng(11);
    let mut fired = 0;
    for _ in 0..300 {
        let p = Program::random(&mut r);
        let cell = |r: &mut Rng| ["0", "1", "-"][r.below(3) as usize];
        let rows: Vec<([&str; 3], &str)> = (0..3)
            .map(|_| ([cell(&mut r), cell(&mut r), cell(&mut r)], cell(&mut r)))
            .collect();
        let mut src = format!("{}expect (a, b, c -> y) {{\n", p.text());
        for (ins, out) in &rows {
            src.push_str(&format!("  {} {} {} -> {out}\n", ins[0], ins[1], ins[2]));
        }
        src.push_str("}\n");
        let found = diags(&src, "vector-mismatch");
        for (k, (ins, out)) in rows.iter().enumerate() {
            let covers = |m: usize| {
                ins.iter()
                    .zip(bits(m))
                    .all(|(c, b)| *c == "-" || (*c == "1") == b)
            };
            let differs = |m: usize| {
                *out != "-"
                    && covers(m)
                    && p.possible(m)
                    && [false, true]
                        .iter()
                        .any(|&pick| p.values(m, pick)[4] != (*out == "1"))
            };
            let expected = (0..8).any(differs);
            let line = 6 + k + usize::from(p.never.is_some());
            let at_row: Vec<&Diagnostic> = found
                .iter()
                .filter(|d| src[..d.span.start].lines().count() == line)
                .collect();
            assert_eq!(
                at_row.len(),
                usize::from(expected),
                "{src}\nrow {k}: {found:?}"
            );
            if let Some(d) = at_row.first() {
                fired += 1;
                let ms: Vec<usize> = minterm_of(&vector_after(&d.message, "at "))
                    .into_iter()
                    .filter(|&m| p.possible(m))
                    .collect();
                assert!(!ms.is_empty(), "{src}\n{}", d.message);
                for m in ms {
                    assert!(differs(m), "{src}\n{} (minterm {m})", d.message);
                }
            }
        }
    }
    assert!((100..800).contains(&fired), "{fired}");
}

/// A random table over `a, b, c` with two outputs, maybe with a `never`.
/// Input and output cells of a table row.
type Row = ([char; 3], [char; 2]);

fn random_table(r: &mut Rng) -> (String, Vec<Row>, Option<E>) {
    let cell = |r: &mut Rng| ['0', '1', '-'][r.below(3) as usize];
    let n = 1 + r.below(5) as usize;
    let rows: Vec<Row> = (0..n)
        .map(|_| {
            (
                [cell(&mut *r), cell(&mut *r), cell(&mut *r)],
                [cell(&mut *r), cell(&mut *r)],
            )
        })
        .collect();
    let never = (r.below(2) == 0).then(|| random_expr(r, 2, 3));
    let mut src = String::from("input a, b, c\noutput y, z\n");
    if let Some(e) = &never {
        src.push_str(&format!("never {}\n", text(e, &["a", "b", "c"])));
    }
    src.push_str("table (a, b, c -> y, z) {\n");
    for (i, o) in &rows {
        src.push_str(&format!("  {}{}{} -> {}{}\n", i[0], i[1], i[2], o[0], o[1]));
    }
    src.push_str("}\n");
    (src, rows, never)
}

fn covers(cells: &[char; 3], m: usize) -> bool {
    cells
        .iter()
        .zip(bits(m))
        .all(|(c, b)| *c == '-' || (*c == '1') == b)
}

#[test]
fn missing_rows_are_the_possible_uncovered_combinations() {
    let mut r = Rng(5);
    let (mut fired, mut spared) = (0, 0);
    for _ in 0..400 {
        let (src, rows, never) = random_table(&mut r);
        let possible = |m: usize| never.as_ref().is_none_or(|n| !eval(n, &bits(m)));
        let missing: Vec<usize> = (0..8)
            .filter(|&m| !rows.iter().any(|(i, _)| covers(i, m)))
            .collect();
        let expected: Vec<usize> = missing.iter().copied().filter(|&m| possible(m)).collect();
        let found = diags(&src, "table-missing-rows");
        fired += usize::from(!found.is_empty());
        spared += usize::from(found.is_empty() && !missing.is_empty());
        assert_eq!(
            found.len(),
            usize::from(!expected.is_empty()),
            "{src}\n{found:?}"
        );
        let Some(d) = found.first() else { continue };
        assert!(
            d.message
                .starts_with(&format!("no row covers {} combination", expected.len())),
            "{src}\n{}",
            d.message
        );
        // The listed patterns cover every possible missing combination and
        // nothing that a row covers.
        let listed: Vec<[char; 3]> = d
            .message
            .split('`')
            .skip(1)
            .step_by(2)
            .map(|p| {
                let c: Vec<char> = p.chars().collect();
                [c[0], c[1], c[2]]
            })
            .collect();
        for m in 0..8 {
            let in_list = listed.iter().any(|p| covers(p, m));
            if expected.contains(&m) {
                assert!(in_list, "{src}\n{} (minterm {m})", d.message);
            }
            if in_list {
                assert!(missing.contains(&m), "{src}\n{} (minterm {m})", d.message);
            }
        }
        // The fix keeps every function and silences the rule.
        let fix = &d.fixes[0];
        let after = fixes::verify(&src, fix).unwrap();
        assert!(diags(&after, "table-missing-rows").is_empty(), "{after}");
    }
    // Some tables had only impossible rows missing.
    assert!(fired > 100 && spared > 5, "{fired} {spared}");
}

#[test]
fn conflicts_are_reported_at_each_row_that_disagrees_with_an_earlier_one() {
    let mut r = Rng(3);
    let mut fired = 0;
    for _ in 0..400 {
        let (src, rows, never) = random_table(&mut r);
        let possible = |m: usize| never.as_ref().is_none_or(|n| !eval(n, &bits(m)));
        let found = diags(&src, "table-conflict");
        let first_row_line = 4 + usize::from(never.is_some());
        for (k, (ins, outs)) in rows.iter().enumerate() {
            let clash = rows[..k].iter().any(|(i2, o2)| {
                let disagree = outs
                    .iter()
                    .zip(o2)
                    .any(|(x, y)| (*x == '0' && *y == '1') || (*x == '1' && *y == '0'));
                disagree && (0..8).any(|m| possible(m) && covers(ins, m) && covers(i2, m))
            });
            let at_row: Vec<&Diagnostic> = found
                .iter()
                .filter(|d| src[..d.span.start].lines().count() == first_row_line + k)
                .collect();
            assert_eq!(
                at_row.len(),
                usize::from(clash),
                "{src}\nrow {k}: {found:?}"
            );
            if let Some(d) = at_row.first() {
                fired += 1;
                let ms = minterm_of(&vector_after(&d.message, "both cover "));
                assert_eq!(ms.len(), 1, "{}", d.message);
                assert!(
                    possible(ms[0]) && covers(ins, ms[0]),
                    "{src}\n{}",
                    d.message
                );
            }
        }
    }
    assert!(fired > 100, "{fired}");
}

#[test]
fn constraints_that_together_exclude_everything_are_an_error() {
    let src = "input a, b\noutput y\ny = a & b\nnever a\nnever !a & b\nnever !b\n";
    let found = diags(src, "empty-constraint");
    assert_eq!(found.len(), 1, "{found:?}");
    assert_eq!(found[0].severity, implica_analysis::Severity::Error);
    assert!(found[0].message.starts_with("together with"));
    assert_eq!(&src[found[0].span.start..found[0].span.end], "!b");
    assert_eq!(found[0].related.len(), 2);
    // With everything excluded, no `never` is called unused.
    assert!(diags(src, "unused-constraint").is_empty());
}

#[test]
fn a_constraint_is_unused_when_no_reader_sees_its_combinations() {
    // `never a & b`: `y` reads `a` only, `z` reads `b` only, so neither is
    // freed (common practice: a combination frees a signal only where it is
    // impossible whatever the signal's other inputs).
    let src = "input a, b\noutput y, z\ny = a\nz = b\nnever a & b\n";
    assert_eq!(diags(src, "unused-constraint").len(), 1);
    // A signal that reads both is freed on a=1, b=1.
    let src = "input a, b\noutput y, z\ny = a\nz = b\nlet t = a | b\nnever a & b\n";
    let a = analyze(src);
    assert!(!a.diagnostics.iter().any(|d| d.rule == "unused-constraint"));
    // So is an assertion that reads both.
    let src = "input a, b\noutput y, z\ny = a\nz = b\nnever a & b\nassert !(y & z)\n";
    assert!(diags(src, "unused-constraint").is_empty());
    // `never a` seen together with `never !a & c`: `y` reads only `c`, and
    // c=1 is impossible whatever `a` is only with both constraints.
    let src = "input a, c\noutput y\ny = c\nnever a & c\nnever !a & c\n";
    assert!(diags(src, "unused-constraint").is_empty());
}

#[test]
fn test_vectors_over_undefined_or_intermediate_names() {
    // An undefined name is `undefined-signal`'s; an intermediate is reported.
    let src = "input a\noutput y\ny = a\nexpect (q -> y) {\n  1 -> 1\n}\n";
    assert!(diags(src, "vector-mismatch").is_empty());
    let src = "input a\noutput y\nlet t = a\ny = t\nexpect (t -> y) {\n  1 -> 0\n}\n";
    let found = diags(src, "vector-mismatch");
    assert_eq!(found.len(), 1);
    assert!(found[0].message.contains("not a primary input"));
}

#[test]
fn the_examples_break_none_of_these_rules() {
    let root = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("../../examples");
    let mut paths: Vec<_> = std::fs::read_dir(root)
        .unwrap()
        .map(|e| e.unwrap().path())
        .filter(|p| p.extension().is_some_and(|e| e == "imp"))
        .collect();
    paths.sort();
    assert!(!paths.is_empty());
    for p in paths {
        let src = std::fs::read_to_string(&p).unwrap();
        for rule in [
            "table-width",
            "table-missing-rows",
            "table-conflict",
            "assertion-failed",
            "vector-mismatch",
            "empty-constraint",
            "unused-constraint",
        ] {
            assert!(diags(&src, rule).is_empty(), "{}: {rule}", p.display());
        }
    }
}

#[test]
fn missing_rows_over_intermediate_signals_leave_out_what_cannot_occur() {
    // `lo` and `hi` are never 1 together, so `11` is not missing; `10` is.
    let src = "input b1, b0\noutput seg\nlet lo = !b1 & !b0\nlet hi = b1 & b0\n\
               table (lo, hi -> seg) {\n  00 -> 0\n  01 -> 1\n}\n";
    let found = diags(src, "table-missing-rows");
    assert_eq!(found.len(), 1);
    assert_eq!(
        found[0].message,
        "no row covers 1 combination of (lo, hi): `10`"
    );
    // The same input twice: `01` and `10` cannot occur.
    let src = "input a\noutput y\ntable (a, a -> y) {\n  00 -> 0\n  01 -> 1\n}\n";
    let found = diags(src, "table-missing-rows");
    assert_eq!(found.len(), 1);
    assert_eq!(
        found[0].message,
        "no row covers 1 combination of (a, a): `11`"
    );
    let src = "input a\noutput y\ntable (a, a -> y) {\n  00 -> 0\n  11 -> 1\n}\n";
    assert!(diags(src, "table-missing-rows").is_empty());
}

#[test]
fn missing_rows_of_a_wide_table_are_merged_and_counted() {
    // 24 inputs, past the exact route: one row, so the missing set is its
    // complement, 24 patterns of one literal each (common practice: the
    // complement of a minterm is the sum of its negated literals).
    let names: Vec<String> = (0..24).map(|i| format!("x{i}")).collect();
    let src = format!(
        "input {}\noutput y\ntable ({} -> y) {{\n  {} -> 1\n}}\n",
        names.join(", "),
        names.join(", "),
        "1".repeat(24)
    );
    let found = diags(&src, "table-missing-rows");
    assert_eq!(found.len(), 1);
    let m = &found[0].message;
    assert!(
        m.starts_with(&format!("no row covers {} combinations", (1u64 << 24) - 1)),
        "{m}"
    );
    assert!(m.ends_with(", and 16 more patterns"), "{m}");
    assert_eq!(found[0].fixes.len(), 1);
}

#[test]
fn a_table_with_no_inputs_and_no_row() {
    let src = "output y\ntable (-> y) {\n}\n";
    let found = diags(src, "table-missing-rows");
    assert_eq!(found.len(), 1);
    assert_eq!(found[0].message, "this table has no row");
    let after = fixes::verify(src, &found[0].fixes[0]).unwrap();
    assert_eq!(after, "output y\ntable (-> y) {\n  unlisted -> -\n}\n");
}

/// The variables an expression names.
fn vars_of(e: &E, out: &mut Vec<usize>) {
    match e {
        E::Var(i) => {
            if !out.contains(i) {
                out.push(*i);
            }
        }
        E::Not(x) => vars_of(x, out),
        E::Bin(_, a, b) => {
            vars_of(a, out);
            vars_of(b, out);
        }
    }
}

#[test]
fn unused_constraints_against_a_brute_force_of_what_each_reader_sees() {
    let mut r = Rng(13);
    let (mut covered, mut unseen) = (0, 0);
    for _ in 0..400 {
        // Outputs over random subsets of the inputs, up to three `never`s.
        let y = random_expr(&mut r, 2, 3);
        let z = random_expr(&mut r, 1, 3);
        let nevers: Vec<E> = (0..1 + r.below(3))
            .map(|_| random_expr(&mut r, 2, 3))
            .collect();
        let names = ["a", "b", "c"];
        let mut src = format!(
            "input a, b, c\noutput y, z\ny = {}\nz = {}\n",
            text(&y, &names),
            text(&z, &names)
        );
        for n in &nevers {
            src.push_str(&format!("never {}\n", text(n, &names)));
        }
        let set = |e: &E| -> Vec<bool> { (0..8).map(|m| eval(e, &bits(m))).collect() };
        let sets: Vec<Vec<bool>> = nevers.iter().map(set).collect();
        let union = |skip: &[bool]| -> Vec<bool> {
            (0..8)
                .map(|m| (0..sets.len()).any(|j| !skip[j] && sets[j][m]))
                .collect()
        };
        let all = union(&vec![false; sets.len()]);
        let found = diags(&src, "unused-constraint");
        let line_of = |d: &Diagnostic| src[..d.span.start].lines().count() - 5;
        if all.iter().all(|&x| x) {
            assert!(found.is_empty(), "{src}\n{found:?}");
            continue;
        }
        // Covered by the others, the later ones first.
        let mut removed = vec![false; sets.len()];
        for i in (0..sets.len()).rev() {
            if !sets[i].iter().any(|&x| x) {
                continue;
            }
            let mut skip = removed.clone();
            skip[i] = true;
            let rest = union(&skip);
            if (0..8).all(|m| !sets[i][m] || rest[m]) {
                removed[i] = true;
            }
        }
        let mut readers = Vec::new();
        for e in [&y, &z] {
            let mut v = Vec::new();
            vars_of(e, &mut v);
            readers.push(v);
        }
        // The assignments of a reader's inputs that are impossible whatever
        // the rest.
        let sure = |imp: &[bool], r: &[usize]| -> Vec<bool> {
            (0..8)
                .map(|m| {
                    (0..8)
                        .filter(|&n| r.iter().all(|&i| bits(n)[i] == bits(m)[i]))
                        .all(|n| imp[n])
                })
                .collect()
        };
        for i in 0..sets.len() {
            let at: Vec<&Diagnostic> = found.iter().filter(|d| line_of(d) == i).collect();
            if !sets[i].iter().any(|&x| x) {
                assert!(at.is_empty(), "{src}\n{found:?}");
                continue;
            }
            if removed[i] {
                covered += 1;
                assert!(
                    at.len() == 1 && at[0].message.contains("adds nothing"),
                    "{src}\nnever {i}: {found:?}"
                );
                continue;
            }
            let mut skip = vec![false; sets.len()];
            skip[i] = true;
            let without = union(&skip);
            let seen = readers.iter().any(|r| sure(&all, r) != sure(&without, r));
            unseen += usize::from(!seen);
            assert_eq!(at.len(), usize::from(!seen), "{src}\nnever {i}: {found:?}");
            if let Some(d) = at.first() {
                assert!(d.message.starts_with("nothing depends on"), "{}", d.message);
            }
        }
    }
    assert!(covered > 20 && unseen > 20, "{covered} {unseen}");
}
