//! A session's re-analysis after edits reports exactly what a fresh analysis
//! of the same text reports (the session only saves work), through random
//! edit sequences on every example and on a generated specification.

use implica_analysis::config::Config;
use implica_analysis::session::Session;
use implica_analysis::{Analysis, analyze_with};
use implica_testkit::Rng;

fn same(a: &Analysis, b: &Analysis, text: &str, step: usize) {
    assert_eq!(
        a.diagnostics, b.diagnostics,
        "step {step}: the session and a fresh analysis differ on\n{text}"
    );
    assert_eq!(a.internal_errors, b.internal_errors, "step {step}");
}

/// What an editor sends: a character typed, deleted or replaced, a token
/// pasted, a line duplicated, or an undo back to an earlier version.
fn edit(rng: &mut Rng, text: &str, history: &[String]) -> String {
    const PIECES: &[&str] = &[
        "&", "|", "!", "^", "(", ")", " ", "\n", "a", "1", "0", "_", "x", "# note", " & !", "let ",
        "output ", "never ", "=",
    ];
    let mut t = text.to_string();
    let at = |t: &str, rng: &mut Rng| -> usize {
        let mut i = rng.below(t.len() as u64 + 1) as usize;
        while !t.is_char_boundary(i) {
            i -= 1;
        }
        i
    };
    match rng.below(6) {
        0 if !t.is_empty() => {
            let i = at(&t, rng);
            let end = (i + 1..=t.len())
                .find(|&j| t.is_char_boundary(j))
                .unwrap_or(i);
            t.replace_range(i..end, "");
        }
        1 | 2 => {
            let i = at(&t, rng);
            let p = PIECES[rng.below(PIECES.len() as u64) as usize];
            t.insert_str(i, p);
        }
        3 if !t.is_empty() => {
            // Replace one character of a name, as when retyping it.
            let i = at(&t, rng);
            let end = (i + 1..=t.len())
                .find(|&j| t.is_char_boundary(j))
                .unwrap_or(i);
            let p = ["a", "b", "c", "1", "&", "|"][rng.below(6) as usize];
            t.replace_range(i..end, p);
        }
        4 => {
            let lines: Vec<&str> = t.lines().collect();
            if !lines.is_empty() {
                let k = rng.below(lines.len() as u64) as usize;
                let line = format!("{}\n", lines[k]);
                let start: usize = lines[..k].iter().map(|l| l.len() + 1).sum();
                t.insert_str(start.min(t.len()), &line);
            }
        }
        _ if !history.is_empty() => {
            t = history[rng.below(history.len() as u64) as usize].clone();
        }
        _ => {}
    }
    t
}

fn run(start: &str, steps: usize, seed: u64, config: &Config) {
    let mut rng = Rng(seed);
    let mut session = Session::new();
    let mut text = start.to_string();
    let mut history = vec![text.clone()];
    for step in 0..steps {
        let a = session.analyze(&text, config);
        same(&a, &analyze_with(&text, config), &text, step);
        text = edit(&mut rng, &text, &history);
        history.push(text.clone());
    }
}

fn examples() -> Vec<(String, String)> {
    let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("../../examples");
    let mut out: Vec<(String, String)> = std::fs::read_dir(&dir)
        .unwrap()
        .filter_map(|e| {
            let p = e.ok()?.path();
            (p.extension()? == "imp").then(|| {
                let name = p.file_name().unwrap().to_string_lossy().to_string();
                (name, std::fs::read_to_string(&p).unwrap())
            })
        })
        .collect();
    out.sort();
    assert!(out.len() >= 4, "the examples are missing");
    out
}

#[test]
fn edits_of_every_example_are_reported_as_a_fresh_analysis_reports_them() {
    let config = Config::default();
    for (k, (name, src)) in examples().iter().enumerate() {
        eprintln!("{name}");
        run(src, 40, 0x5E55_1011 + k as u64, &config);
    }
}

#[test]
fn with_the_hazard_rule_on_and_a_small_budget_too() {
    let (mut config, errors) =
        Config::parse("[rules]\nstatic-hazard = \"warning\"\n[minimize]\nmax-work = 2000\n");
    assert!(errors.is_empty());
    assert!(config.set(
        "equivalent-signals",
        Some(implica_analysis::Severity::Warning)
    ));
    for (k, (_, src)) in examples().iter().enumerate().take(3) {
        run(src, 25, 0xBADC_0FFE + k as u64, &config);
    }
}

#[path = "../benches/common/mod.rs"]
mod common;

#[test]
fn edits_of_a_generated_specification() {
    run(
        &common::spec(40, false),
        30,
        0x00DD_BA11,
        &Config::default(),
    );
}

/// Edits that change the inputs (declaring, removing, reordering) make the
/// session build its functions afresh; it still agrees.
#[test]
fn changing_the_inputs_starts_afresh_and_agrees() {
    let config = Config::default();
    let versions = [
        "input a, b, c\noutput y\ny = a & b | a & b & c\n",
        "input a, b, c, d\noutput y\ny = a & b | a & b & c\n",
        "input b, a, c\noutput y\ny = a & b | a & !b\n",
        "input a, b\noutput y\ny = a & b | a & b & c\n",
        "input a, b, c\noutput y\ny = a & b | a & b & c\n",
    ];
    let mut session = Session::new();
    for (step, v) in versions.iter().cycle().take(15).enumerate() {
        same(
            &session.analyze(v, &config),
            &analyze_with(v, &config),
            v,
            step,
        );
    }
}

#[test]
fn a_cancelled_analysis_returns_nothing_and_the_next_one_agrees() {
    let config = Config::default();
    let src = common::spec(30, false);
    let mut session = Session::new();
    session.analyze(&src, &config);
    let edited = src.replacen("in_1", "in_2", 1);
    let stop = || true;
    assert!(
        session
            .analyze_cancellable(&edited, &config, Some(&stop))
            .is_none()
    );
    let go = || false;
    let a = session
        .analyze_cancellable(&edited, &config, Some(&go))
        .unwrap();
    same(&a, &analyze_with(&edited, &config), &edited, 0);
}

/// Results the last analysis did not use are dropped: switching between two
/// unrelated documents many times keeps no more than both hold.
#[test]
fn what_the_session_keeps_stays_bounded() {
    let config = Config::default();
    let (one, two) = (common::spec(30, false), common::spec(30, true));
    let mut session = Session::new();
    session.analyze(&one, &config);
    session.analyze(&two, &config);
    let both = session.kept();
    assert!(both > 0);
    for _ in 0..10 {
        session.analyze(&one, &config);
        session.analyze(&two, &config);
    }
    assert!(session.kept() <= both, "{} > {both}", session.kept());
    // A third document: what only the first used is gone after two analyses.
    let three = "input a\noutput y\ny = a\n";
    session.analyze(three, &config);
    session.analyze(three, &config);
    assert!(session.kept() < both / 4, "{} of {both}", session.kept());
}

/// Cancelled at any point (after the k-th poll, for many k), an analysis
/// returns nothing or a whole answer, and leaves nothing behind that makes
/// a later one differ from a fresh analysis.
#[test]
fn a_cancellation_anywhere_leaves_the_session_sound() {
    let config = Config::default();
    let src = common::spec(30, false);
    let edited = src.replacen("in_1", "in_2", 1);
    // How often an analysis of the edit polls, when nothing stops it.
    let total = {
        let mut session = Session::new();
        session.analyze(&src, &config);
        let polls = std::cell::Cell::new(0usize);
        let count = || {
            polls.set(polls.get() + 1);
            false
        };
        session.analyze_cancellable(&edited, &config, Some(&count));
        polls.get()
    };
    assert!(total > 20, "{total} polls");
    let mut stopped = 0;
    for k in (0..total + 5).step_by(total / 20) {
        let mut session = Session::new();
        session.analyze(&src, &config);
        let polls = std::cell::Cell::new(0usize);
        let stop = || {
            polls.set(polls.get() + 1);
            polls.get() > k
        };
        match session.analyze_cancellable(&edited, &config, Some(&stop)) {
            None => stopped += 1,
            Some(a) => same(&a, &analyze_with(&edited, &config), &edited, k),
        }
        for text in [&edited, &src, &edited] {
            same(
                &session.analyze(text, &config),
                &analyze_with(text, &config),
                text,
                k,
            );
        }
    }
    assert!(stopped >= 15, "only {stopped} analyses were stopped");
}

/// Each new version of a signal with don't-cares takes a choice variable of
/// the session's manager; a long editing session runs through them, and the
/// session starts a new manager before they run out.
#[test]
fn a_long_session_of_edits_to_dont_care_signals_stays_exact() {
    let config = Config::default();
    let mut src = String::from("input a, b, c, d\noutput y\n");
    for k in 0..40 {
        src.push_str(&format!(
            "let t{k} = on({}) dc(15) over (a, b, c, d)\n",
            k % 15
        ));
    }
    // An assertion that fails, so that an unknown `y` would show.
    src.push_str("y = t0 | t1 & t2\nassert y\n");
    let mut session = Session::new();
    for step in 0..150 {
        // Every version changes every term list (the row numbers move).
        let text = src.replace("dc(15)", &format!("dc({})", 15 - step % 2));
        same(
            &session.analyze(&text, &config),
            &analyze_with(&text, &config),
            &text,
            step,
        );
    }
}

/// A language server keeps a session per document across its tasks, so a
/// session must move between threads (this fails to compile otherwise).
#[test]
fn a_session_can_move_to_another_thread() {
    fn movable<T: Send + 'static>(_: &T) {}
    let mut session = Session::new();
    movable(&session);
    let src = "input a, b\noutput y\ny = a & b | a & b\n";
    session.analyze(src, &Config::default());
    let moved = std::thread::spawn(move || {
        let a = session.analyze(src, &Config::default());
        (a.diagnostics.len(), session)
    })
    .join()
    .unwrap();
    assert_eq!(moved.0, 1);
}

/// One expression over 13 inputs whose minimal forms take most of the
/// analysis: the cancellation check is polled inside the minimization (not
/// only between definitions), so an editor's cancellation stops it there,
/// and whatever the point, the analysis gives nothing or the whole answer,
/// and the session stays sound.
#[test]
fn a_cancellation_inside_a_long_minimization_leaves_the_session_sound() {
    let mut rng = Rng(0x2F1E_8C44_90A7_3B65);
    let inputs: Vec<String> = (0..13).map(|i| format!("s{i}")).collect();
    let terms: Vec<String> = (0..70)
        .map(|_| {
            let mut picked: Vec<usize> = Vec::new();
            while picked.len() < 6 {
                let v = rng.below(13) as usize;
                if !picked.contains(&v) {
                    picked.push(v);
                }
            }
            picked
                .iter()
                .map(|&v| {
                    let neg = if rng.below(2) == 0 { "!" } else { "" };
                    format!("{neg}{}", inputs[v])
                })
                .collect::<Vec<_>>()
                .join(" & ")
        })
        .collect();
    let src = format!(
        "input {}\noutput y\ny = {}\n",
        inputs.join(", "),
        terms.join("\n  | ")
    );
    let config = Config::default();
    let fresh = analyze_with(&src, &config);
    let polls = std::cell::Cell::new(0usize);
    let count = || {
        polls.set(polls.get() + 1);
        false
    };
    let counted = Session::new()
        .analyze_cancellable(&src, &config, Some(&count))
        .unwrap();
    same(&counted, &fresh, &src, 0);
    let total = polls.get();
    assert!(total >= 100, "{total} polls");
    let mut stopped = 0;
    for k in (0..total + 2).step_by(total / 16) {
        let mut session = Session::new();
        let polls = std::cell::Cell::new(0usize);
        let stop = || {
            polls.set(polls.get() + 1);
            polls.get() > k
        };
        match session.analyze_cancellable(&src, &config, Some(&stop)) {
            None => stopped += 1,
            Some(a) => same(&a, &fresh, &src, k),
        }
        same(&session.analyze(&src, &config), &fresh, &src, k);
    }
    assert!(stopped >= 12, "only {stopped} analyses were stopped");
}
