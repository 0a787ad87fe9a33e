//! The exact minimizer against an outside reference: sympy's `SOPform` and
//! `POSform` (`sympy.logic`, sympy 1.14, a general-purpose computer-algebra
//! library), run for the whole batch in one Python process by
//! `tests/oracle/sympy_minimize.py`.
//!
//! sympy is an upper bound, not a minimality oracle: per sympy's
//! documentation/source of SOPform, it finds every prime implicant, takes the
//! essential ones and applies dominance, then picks the remaining primes
//! greedily. So the checks are: both results are equivalent to the function
//! under its don't-cares (against the truth table), and ours never has more
//! terms, nor more literals (each on its own, not only one after the other:
//! the issue asks for both). Where ours is strictly
//! cheaper and claims `proven_minimal`, an exact check of this file's own
//! confirms the minimum: prime implicants by plain enumeration of all 3^n
//! cubes (not the crate's generator), then an exhaustive search over prime
//! covers for up to 6 inputs, and PySAT's RC2 MaxSAT solver (general
//! purpose) on the covering problem for 7 to 10 inputs. A strict gain not
//! claimed minimal goes to RC2 too, which checks that its lower bound is no
//! more than the true minimum (the seeded batch has none: every result in it
//! is proven). A second test checks
//! the certificates (claims of minimality, lower bounds) of denser 9- and
//! 10-input functions against the HiGHS mixed-integer solver.
//!
//! The Python environment is made by `scripts/test` (`.venv-test/` at the
//! repository root, exported as `IMPLICA_TEST_PYTHON`). Without one the test
//! skips with a loud message, except when `CI` is set, where it fails.

use implica_logic::{Budget, Cube, Minimized, TruthTable, minimize_pos, minimize_sop};
use implica_testkit::Rng;
use serde_json::{Value, json};
use std::io::{BufRead, BufReader, Write};
use std::path::{Path, PathBuf};
use std::process::{Child, ChildStdin, ChildStdout, Command, Stdio};

/// Which functions, how many: (inputs, count, shape). Sized so that sympy,
/// the slow side, needs well under a minute: its time grows steeply with the
/// care set (measured on balanced functions: about 2 ms per form at 5
/// inputs, 30 to 50 ms at 7, 0.2 to 0.5 s at 8, 3 s at 9, over a minute at
/// 10). At 9 and 10 inputs the functions are therefore sparse, in the on-set for
/// the sum and in the off-set for the product (sympy's POSform works on the
/// off-set and don't-cares, SOPform on the on-set and don't-cares).
const PLAN: &[(usize, usize, Shape)] = &[
    (5, 1100, Shape::Balanced),
    (6, 600, Shape::Balanced),
    (7, 160, Shape::Balanced),
    (8, 16, Shape::Balanced),
    (9, 36, Shape::SparseOn),
    (9, 36, Shape::SparseOff),
    (10, 26, Shape::SparseOn),
    (10, 26, Shape::SparseOff),
];

const SEED: u64 = 0x0DD5_EED5_1A7E_C0DE;

#[derive(Clone, Copy, Debug)]
enum Shape {
    /// On-set 1/4 to 5/8 of the minterms, don't-cares 1/16 to 3/8; both forms.
    Balanced,
    /// On-set and don't-cares 3/64 to 5/64 each; the sum of products only.
    SparseOn,
    /// Off-set and don't-cares 3/64 to 5/64 each; the product of sums only.
    SparseOff,
}

#[derive(Clone, Copy, Debug, PartialEq, Eq)]
enum Form {
    Sop,
    Pos,
}

impl Form {
    fn key(self) -> &'static str {
        match self {
            Form::Sop => "sop",
            Form::Pos => "pos",
        }
    }
}

struct Case {
    vars: usize,
    on: Vec<bool>,
    dc: Vec<bool>,
    forms: Vec<Form>,
}

impl Case {
    fn describe(&self, form: Form) -> String {
        let list = |v: &[bool]| -> Vec<usize> { (0..v.len()).filter(|&m| v[m]).collect() };
        format!(
            "{:?} of {} inputs, on = {:?}, dc = {:?}",
            form,
            self.vars,
            list(&self.on),
            list(&self.dc)
        )
    }

    /// The minterms the form's terms must cover, and those they may: the
    /// on-set for a sum; the off-set for a product (its clauses are the
    /// terms of the complement).
    fn required_and_care(&self, form: Form) -> (Vec<bool>, Vec<bool>) {
        let required: Vec<bool> = (0..self.on.len())
            .map(|m| {
                !self.dc[m]
                    && match form {
                        Form::Sop => self.on[m],
                        Form::Pos => !self.on[m],
                    }
            })
            .collect();
        let care = (0..self.on.len())
            .map(|m| required[m] || self.dc[m])
            .collect();
        (required, care)
    }
}

fn cases() -> Vec<Case> {
    let mut rng = Rng(SEED);
    let mut out = Vec::new();
    for &(vars, count, shape) in PLAN {
        for _ in 0..count {
            // Probabilities in 64ths: (of the "first" set, of the don't-cares).
            let (first, dc) = match shape {
                Shape::Balanced => (rng.range(16, 40), rng.range(4, 24)),
                Shape::SparseOn | Shape::SparseOff => (rng.range(3, 5), rng.range(3, 5)),
            };
            let size = 1usize << vars;
            let (mut on, mut dcs) = (vec![false; size], vec![false; size]);
            for m in 0..size {
                let r = rng.next() % 64;
                let in_first = r < first;
                dcs[m] = !in_first && r < first + dc;
                on[m] = match shape {
                    Shape::SparseOff => !in_first && !dcs[m],
                    _ => in_first,
                };
            }
            let forms = match shape {
                Shape::Balanced => vec![Form::Sop, Form::Pos],
                Shape::SparseOn => vec![Form::Sop],
                Shape::SparseOff => vec![Form::Pos],
            };
            out.push(Case {
                vars,
                on,
                dc: dcs,
                forms,
            });
        }
    }
    out
}

/// A term (of a sum) or a clause (of a product): per variable, `Some(true)`
/// for the plain literal, `Some(false)` for the negated one.
type Part = Vec<Option<bool>>;

fn bit(vars: usize, m: usize, i: usize) -> bool {
    (m >> (vars - 1 - i)) & 1 == 1
}

/// The value of a sum of products or a product of sums on minterm `m`,
/// evaluated literally.
fn value(form: Form, parts: &[Part], vars: usize, m: usize) -> bool {
    let lit = |l: &Option<bool>, i: usize| *l == Some(bit(vars, m, i));
    match form {
        Form::Sop => parts
            .iter()
            .any(|t| t.iter().enumerate().all(|(i, l)| l.is_none() || lit(l, i))),
        Form::Pos => parts
            .iter()
            .all(|c| c.iter().enumerate().any(|(i, l)| lit(l, i))),
    }
}

/// The first care minterm where the expression differs from the function.
fn mismatch(case: &Case, form: Form, parts: &[Part]) -> Option<usize> {
    (0..case.on.len()).find(|&m| !case.dc[m] && value(form, parts, case.vars, m) != case.on[m])
}

/// (terms, literals).
fn cost(parts: &[Part]) -> (usize, usize) {
    let literals = parts.iter().flatten().filter(|l| l.is_some()).count();
    (parts.len(), literals)
}

/// Our result as terms or clauses. `minimize_pos` returns cubes of the
/// complement: each stands for the clause of its literals negated.
fn our_parts(form: Form, r: &Minimized) -> Vec<Part> {
    let vars = r.cover.vars;
    let part = |c: &Cube| -> Part {
        (0..vars)
            .map(|i| match form {
                Form::Sop => c.literal_of(i),
                Form::Pos => c.literal_of(i).map(|b| !b),
            })
            .collect()
    };
    r.cover.cubes.iter().map(part).collect()
}

fn parse_parts(value: &Value) -> Vec<Part> {
    let list = value.as_array().expect("a list of terms");
    list.iter()
        .map(|t| {
            t.as_str()
                .expect("a term string")
                .chars()
                .map(|ch| match ch {
                    '1' => Some(true),
                    '0' => Some(false),
                    '-' => None,
                    _ => panic!("unexpected character {ch:?} in a term"),
                })
                .collect()
        })
        .collect()
}

/// Every prime implicant, by plain enumeration of the 3^n cubes (a value and
/// a set of free minterm-index bits): an implicant lies within `care`; a
/// prime is an implicant that no one-variable expansion keeps an implicant.
/// Only primes covering a `required` minterm are kept. Returns each prime's
/// minterms and literal count.
fn primes_by_enumeration(
    vars: usize,
    required: &[bool],
    care: &[bool],
) -> Vec<(Vec<usize>, usize)> {
    let size = 1usize << vars;
    // The minterms of a cube: `value` with every subset of `free` added.
    let subset_minterms = |value: usize, free: usize| {
        let mut out = Vec::new();
        let mut sub = 0usize;
        loop {
            out.push(value | sub);
            sub = sub.wrapping_sub(free) & free;
            if sub == 0 {
                return out;
            }
        }
    };
    let mut implicant = vec![false; size * size];
    for free in 0..size {
        for value in 0..size {
            if value & free == 0 {
                implicant[free * size + value] =
                    subset_minterms(value, free).iter().all(|&m| care[m]);
            }
        }
    }
    let mut primes = Vec::new();
    for free in 0..size {
        for value in 0..size {
            if value & free != 0 || !implicant[free * size + value] {
                continue;
            }
            let expandable = (0..vars)
                .map(|b| 1usize << b)
                .any(|b| free & b == 0 && implicant[(free | b) * size + (value & !b)]);
            let covered = subset_minterms(value, free);
            if !expandable && covered.iter().any(|&m| required[m]) {
                primes.push((covered, vars - free.count_ones() as usize));
            }
        }
    }
    primes
}

/// Whether some cover by the primes is cheaper than `bound` (fewer terms,
/// or as many and fewer literals), by exhaustive search: every cover holds
/// a prime through the uncovered required minterm with the fewest primes,
/// so branching over those primes misses no cover; a branch stops only when
/// it can no longer be cheaper. Minterms as bits of a u64 (up to 6 inputs).
fn cheaper_cover_exists(
    primes: &[(Vec<usize>, usize)],
    required: &[bool],
    bound: (usize, usize),
) -> bool {
    let masks: Vec<(u64, usize)> = primes
        .iter()
        .map(|(ms, l)| (ms.iter().fold(0u64, |acc, &m| acc | 1 << m), *l))
        .collect();
    let need = (0..required.len())
        .filter(|&m| required[m])
        .fold(0u64, |acc, m| acc | 1 << m);
    fn go(masks: &[(u64, usize)], left: u64, cost: (usize, usize), bound: (usize, usize)) -> bool {
        if cost >= bound {
            return false;
        }
        if left == 0 {
            return true;
        }
        if cost.0 + 1 > bound.0 {
            return false;
        }
        let mut bits = left;
        let mut pick = (usize::MAX, 0u64);
        while bits != 0 {
            let b = bits & bits.wrapping_neg();
            bits &= bits - 1;
            let n = masks.iter().filter(|(mask, _)| mask & b != 0).count();
            if n < pick.0 {
                pick = (n, b);
            }
        }
        masks
            .iter()
            .filter(|(mask, _)| mask & pick.1 != 0)
            .any(|&(mask, l)| go(masks, left & !mask, (cost.0 + 1, cost.1 + l), bound))
    }
    go(&masks, need, (0, 0), bound)
}

/// The Python interpreter of the test environment, if there is one.
fn python() -> Option<PathBuf> {
    if let Some(p) = std::env::var_os("IMPLICA_TEST_PYTHON") {
        return Some(PathBuf::from(p));
    }
    let local = Path::new(env!("CARGO_MANIFEST_DIR")).join("../../.venv-test/bin/python");
    local.exists().then_some(local)
}

/// The test environment's Python; without one, `None` after a loud skip
/// message, or a failure when `CI` is set.
fn python_or_skip() -> Option<PathBuf> {
    if let Some(python) = python() {
        return Some(python);
    }
    let banner = "=".repeat(72);
    let why = "the cross-checks of tests/oracle.rs need the Python test \
               environment: run scripts/test, which creates .venv-test/, or set \
               IMPLICA_TEST_PYTHON to a Python with the packages of \
               scripts/requirements-test.txt";
    if std::env::var_os("CI").is_some() {
        panic!("{why} (CI is set, so this is a failure)");
    }
    // Straight to the process's stderr: the test harness would swallow
    // `eprintln!` of a passing test, and a skip must be seen.
    let _ = writeln!(std::io::stderr(), "\n{banner}\nSKIPPED: {why}\n{banner}\n");
    None
}

/// The covering problem of the primes (each with its minterms and
/// literals) over the required minterms, as the oracle script reads it.
fn covering_problem(required: &[bool], primes: &[(Vec<usize>, usize)]) -> Value {
    let rows: Vec<Vec<usize>> = (0..required.len())
        .filter(|&m| required[m])
        .map(|m| {
            (0..primes.len())
                .filter(|&p| primes[p].0.contains(&m))
                .collect()
        })
        .collect();
    let literals: Vec<usize> = primes.iter().map(|p| p.1).collect();
    json!({"rows": rows, "literals": literals})
}

/// The columns of an exact answer, checked to cover every required minterm.
fn exact_answer(
    what: &str,
    answer: &Value,
    required: &[bool],
    primes: &[(Vec<usize>, usize)],
) -> (usize, usize) {
    let columns: Vec<usize> = answer["columns"]
        .as_array()
        .expect("columns")
        .iter()
        .map(|c| c.as_u64().expect("a column") as usize)
        .collect();
    let uncovered = (0..required.len())
        .find(|&m| required[m] && !columns.iter().any(|&p| primes[p].0.contains(&m)));
    assert_eq!(
        uncovered, None,
        "{what}: the solver's cover misses a minterm"
    );
    let minimum = (
        answer["terms"].as_u64().expect("terms") as usize,
        answer["literals"].as_u64().expect("literals") as usize,
    );
    let literals: usize = columns.iter().map(|&p| primes[p].1).sum();
    assert_eq!(
        minimum,
        (columns.len(), literals),
        "{what}: the solver's cost does not match its cover"
    );
    minimum
}

struct Oracle {
    child: Child,
    stdin: Option<ChildStdin>,
    stdout: BufReader<ChildStdout>,
}

impl Oracle {
    fn start(python: &Path) -> Oracle {
        let script = Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/oracle/sympy_minimize.py");
        let mut child = Command::new(python)
            .arg(&script)
            .stdin(Stdio::piped())
            .stdout(Stdio::piped())
            .stderr(Stdio::inherit())
            .spawn()
            .unwrap_or_else(|e| panic!("cannot start {}: {e}", python.display()));
        let stdin = child.stdin.take();
        let stdout = BufReader::new(child.stdout.take().expect("piped stdout"));
        Oracle {
            child,
            stdin,
            stdout,
        }
    }

    fn send(&mut self, request: &Value) {
        let stdin = self.stdin.as_mut().expect("oracle still open");
        let line = serde_json::to_string(request).expect("serializable request");
        writeln!(stdin, "{line}")
            .and_then(|()| stdin.flush())
            .expect("the Python oracle stopped reading (see its error above)");
    }

    fn receive(&mut self) -> Vec<Value> {
        let mut line = String::new();
        self.stdout
            .read_line(&mut line)
            .expect("read the oracle's answer");
        assert!(
            !line.is_empty(),
            "the Python oracle ended without an answer (see its error above)"
        );
        let answer: Value = serde_json::from_str(&line).expect("the oracle answers JSON");
        answer["results"]
            .as_array()
            .expect("a list of results")
            .clone()
    }

    fn finish(mut self) {
        drop(self.stdin.take());
        let status = self.child.wait().expect("wait for the oracle");
        assert!(status.success(), "the Python oracle failed: {status}");
    }
}

fn budget(vars: usize) -> Budget {
    if vars >= 8 {
        // A random function of 8 or more inputs with many don't-cares can
        // take our branch and bound seconds before its default node budget
        // runs out (measured: 10 s for some of this file's 8-input ones; see
        // also docs/benchmarks.md for 10 inputs); a smaller budget bounds the
        // test's time. Results past it are still checked
        // for equivalence and against sympy, only not counted as minimal.
        Budget {
            max_nodes: 20_000,
            ..Default::default()
        }
    } else {
        Budget::default()
    }
}

#[derive(Default, Clone, Copy)]
struct Tally {
    results: usize,
    proven: usize,
    equal: usize,
    cheaper: usize,
    confirmed: usize,
    /// Strict gains not claimed minimal: their bound is checked instead.
    unproven_cheaper: usize,
}

#[test]
fn never_worse_than_sympy_and_strict_gains_are_minimal() {
    let Some(python) = python_or_skip() else {
        return;
    };
    let started = std::time::Instant::now();
    let cases = cases();
    let mut oracle = Oracle::start(&python);
    let functions: Vec<Value> = cases
        .iter()
        .map(|c| {
            let list = |v: &[bool]| -> Vec<usize> { (0..v.len()).filter(|&m| v[m]).collect() };
            json!({
                "vars": c.vars,
                "on": list(&c.on),
                "dc": list(&c.dc),
                "forms": c.forms.iter().map(|f| f.key()).collect::<Vec<_>>(),
            })
        })
        .collect();
    oracle.send(&json!({"op": "sympy", "functions": functions}));

    // Ours, while sympy works.
    let ours: Vec<Vec<Minimized>> = cases
        .iter()
        .map(|c| {
            let table = |v: &[bool]| {
                let mut t = TruthTable::zero(c.vars);
                for (m, &b) in v.iter().enumerate() {
                    t.set(m, b);
                }
                t
            };
            let (on, dc) = (table(&c.on), table(&c.dc));
            c.forms
                .iter()
                .map(|&f| {
                    let r = match f {
                        Form::Sop => minimize_sop(&on, &dc, &budget(c.vars)),
                        Form::Pos => minimize_pos(&on, &dc, &budget(c.vars)),
                    };
                    r.unwrap_or_else(|e| panic!("{}: too large: {}", c.describe(f), e.reason))
                })
                .collect()
        })
        .collect();

    let ours_done = started.elapsed();
    let answers = oracle.receive();
    let sympy_done = started.elapsed();
    assert_eq!(answers.len(), cases.len(), "one sympy answer per function");

    let mut tally = [Tally::default(); 11];
    // Strict gains for RC2: (case, form, our cost, required, primes, our
    // result).
    let mut for_maxsat = Vec::new();
    for ((case, results), answer) in cases.iter().zip(&ours).zip(&answers) {
        for (&form, r) in case.forms.iter().zip(results) {
            let what = case.describe(form);
            let mine = our_parts(form, r);
            let theirs = parse_parts(&answer[form.key()]);
            if let Some(m) = mismatch(case, form, &mine) {
                panic!("{what}: our result {mine:?} is wrong on minterm {m}");
            }
            if let Some(m) = mismatch(case, form, &theirs) {
                panic!("{what}: sympy's result {theirs:?} is wrong on minterm {m}");
            }
            let (c_ours, c_sympy) = (cost(&mine), cost(&theirs));
            // Never more terms, and never more literals either (not only
            // lexicographically: fewer terms with more literals fails too).
            assert!(
                c_ours.0 <= c_sympy.0 && c_ours.1 <= c_sympy.1,
                "{what}: ours costs {c_ours:?} (terms, literals), sympy's {c_sympy:?}\n\
                 ours: {mine:?}\nsympy: {theirs:?}"
            );
            let t = &mut tally[case.vars];
            t.results += 1;
            t.proven += usize::from(r.proven_minimal);
            t.equal += usize::from(c_ours == c_sympy);
            if c_ours < c_sympy {
                let (required, care) = case.required_and_care(form);
                let primes = primes_by_enumeration(case.vars, &required, &care);
                if !r.proven_minimal {
                    // Not claimed minimal: RC2 checks its lower bound.
                    t.unproven_cheaper += 1;
                    for_maxsat.push((case, form, c_ours, required, primes, r));
                    continue;
                }
                t.cheaper += 1;
                if case.vars <= 6 {
                    assert!(
                        !cheaper_cover_exists(&primes, &required, c_ours),
                        "{what}: claimed minimal at {c_ours:?}, but a cheaper cover exists"
                    );
                    t.confirmed += 1;
                } else {
                    for_maxsat.push((case, form, c_ours, required, primes, r));
                }
            }
        }
    }

    let problems: Vec<Value> = for_maxsat
        .iter()
        .map(|(_, _, _, required, primes, _)| covering_problem(required, primes))
        .collect();
    oracle.send(&json!({"op": "maxsat", "problems": problems}));
    let exact = oracle.receive();
    assert_eq!(exact.len(), for_maxsat.len(), "one RC2 answer per problem");
    for ((case, form, c_ours, required, primes, r), answer) in for_maxsat.iter().zip(&exact) {
        let what = case.describe(*form);
        let minimum = exact_answer(&what, answer, required, primes);
        if r.proven_minimal {
            assert_eq!(
                *c_ours, minimum,
                "{what}: claimed minimal at {c_ours:?}, RC2's minimum is {minimum:?}"
            );
            tally[case.vars].confirmed += 1;
        } else {
            assert!(
                r.lower_bound <= minimum.0 && minimum <= *c_ours,
                "{what}: found {c_ours:?} with a bound of {} terms, RC2's minimum is {minimum:?}",
                r.lower_bound
            );
        }
    }
    oracle.finish();
    eprintln!(
        "ours finished after {ours_done:.1?}, sympy after {sympy_done:.1?}, the exact checks after {:.1?}",
        started.elapsed()
    );

    eprintln!(
        "inputs  results  proven minimal  equal to sympy  cheaper (proven)  confirmed exact  \
         cheaper (unproven, bound checked)"
    );
    for (vars, t) in tally.iter().enumerate().filter(|(_, t)| t.results > 0) {
        eprintln!(
            "{vars:>6}  {:>7}  {:>14}  {:>14}  {:>16}  {:>15}  {:>33}",
            t.results, t.proven, t.equal, t.cheaper, t.confirmed, t.unproven_cheaper
        );
    }
    let total = |f: fn(&Tally) -> usize| tally.iter().map(f).sum::<usize>();
    assert_eq!(total(|t| t.cheaper), total(|t| t.confirmed));
    // The seeded batch holds strict gains on both sides of the 6-input
    // line, so both exact checks above have run.
    let confirmed =
        |sizes: std::ops::Range<usize>| tally[sizes].iter().map(|t| t.confirmed).sum::<usize>();
    assert!(
        confirmed(5..7) > 0 && confirmed(7..11) > 0,
        "no strict gain was checked"
    );
}

/// The certificates of the exact minimizer against a general-purpose
/// mixed-integer solver: HiGHS (through highspy, pinned in
/// scripts/requirements-test.txt) finds the proven minimum cover (fewest
/// terms, then fewest literals) of each function's primes, the primes found
/// by this file's own enumeration. The functions have the shape of
/// docs/benchmarks.md's random ones (each minterm on with probability 3/8,
/// a don't-care with probability 1/4), at 7 to 9 inputs, where our search
/// proves most results, and at 10, where the default budget leaves most
/// unproven and only the bound certifies. The checks: a result claimed minimal is
/// the solver's minimum; a lower bound never exceeds the solver's number of
/// terms (so "at least N terms needed" is true); no result beats the
/// solver's minimum (the solver's own sanity, with its cover checked).
#[test]
fn certificates_agree_with_a_mixed_integer_solver() {
    let Some(python) = python_or_skip() else {
        return;
    };
    let mut rng = Rng(0x005E_ED0F_CE87_1F1C);
    let mut cases = Vec::new();
    for (vars, count) in [(7usize, 20usize), (8, 20), (9, 24), (10, 6)] {
        for _ in 0..count {
            let (mut on, mut dc) = (TruthTable::zero(vars), TruthTable::zero(vars));
            for m in 0..1usize << vars {
                match rng.next() % 8 {
                    0..=2 => on.set(m, true),
                    3 | 4 => dc.set(m, true),
                    _ => {}
                }
            }
            cases.push((vars, on, dc));
        }
    }
    let started = std::time::Instant::now();
    let mut problems = Vec::new();
    let mut checks = Vec::new();
    for (vars, on, dc) in &cases {
        let r = minimize_sop(on, dc, &Budget::default()).expect("within the default budget");
        let what = format!(
            "{vars} inputs, on = {:?}, dc = {:?}",
            on.minterms(),
            dc.minterms()
        );
        assert_eq!(
            r.cover.truth_table().and_not(dc),
            on.and_not(dc),
            "{what}: our cover is wrong"
        );
        let required: Vec<bool> = (0..1usize << vars)
            .map(|m| on.get(m) && !dc.get(m))
            .collect();
        let care: Vec<bool> = (0..1usize << vars)
            .map(|m| on.get(m) || dc.get(m))
            .collect();
        let primes = primes_by_enumeration(*vars, &required, &care);
        problems.push(covering_problem(&required, &primes));
        checks.push((what, r, required, primes));
    }
    let ours_done = started.elapsed();
    let mut oracle = Oracle::start(&python);
    oracle.send(&json!({"op": "mip", "problems": problems}));
    let answers = oracle.receive();
    oracle.finish();
    assert_eq!(answers.len(), checks.len(), "one HiGHS answer per problem");
    // Per input count: (results, proven minimal, terms proven, bound sum,
    // our terms, minimum terms).
    let mut tally = std::collections::BTreeMap::<usize, [usize; 6]>::new();
    for ((vars, _, _), ((what, r, required, primes), answer)) in
        cases.iter().zip(checks.iter().zip(&answers))
    {
        let minimum = exact_answer(what, answer, required, primes);
        let ours = (r.cover.len(), r.cover.literals());
        assert!(
            ours >= minimum,
            "{what}: ours {ours:?} beats the solver's minimum {minimum:?}"
        );
        assert!(
            r.lower_bound <= minimum.0,
            "{what}: claims at least {} terms, the solver covers with {}",
            r.lower_bound,
            minimum.0
        );
        if r.proven_minimal {
            assert_eq!(ours, minimum, "{what}: claimed minimal");
        }
        if r.lower_bound == ours.0 {
            assert_eq!(ours.0, minimum.0, "{what}: claimed fewest terms");
        }
        let t = tally.entry(*vars).or_default();
        t[0] += 1;
        t[1] += usize::from(r.proven_minimal);
        t[2] += usize::from(r.lower_bound == ours.0);
        t[3] += r.lower_bound;
        t[4] += ours.0;
        t[5] += minimum.0;
    }
    eprintln!(
        "ours after {ours_done:.1?}, HiGHS after {:.1?}",
        started.elapsed()
    );
    eprintln!(
        "inputs  results  proven minimal  fewest terms proven  bound  ours  minimum (terms, sums)"
    );
    for (vars, t) in &tally {
        eprintln!(
            "{vars:>6}  {:>7}  {:>14}  {:>19}  {:>5}  {:>4}  {:>7}",
            t[0], t[1], t[2], t[3], t[4], t[5]
        );
    }
}
