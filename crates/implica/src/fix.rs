//! `implica fix`: apply the proven fixes in place, or show them as a diff.

use crate::files::{self, Input};
use std::io::Write;
use std::path::PathBuf;
use std::process::ExitCode;

pub fn run(paths: &[PathBuf], review: bool, diff: bool) -> ExitCode {
    let (inputs, problems) = files::collect(paths);
    let mut failed = !problems.is_empty();
    for p in problems {
        eprintln!("implica: {p}");
    }
    let mut configs = crate::project::Configs::default();
    let mut errors_left = 0;
    let mut fixed_files = 0;
    for input in &inputs {
        let name = input.display();
        let Some(bytes) = files::read_or_report(input) else {
            failed = true;
            continue;
        };
        let Ok(text) = std::str::from_utf8(&bytes) else {
            eprintln!("implica: {name}: not fixed: the file is not valid UTF-8");
            failed = true;
            continue;
        };
        let config = configs.for_input(input);
        let result = implica_analysis::fixes::fix_all(text, &config, review);
        for e in &result.internal_errors {
            eprintln!("implica: {name}: internal error (please report it): {e}");
        }
        errors_left += implica_analysis::analyze_with(&result.text, &config)
            .diagnostics
            .iter()
            .filter(|d| d.severity == implica_analysis::Severity::Error)
            .count();
        if result.text == text {
            if matches!(input, Input::Stdin) && !diff {
                let _ = std::io::stdout().write_all(text.as_bytes());
            }
            continue;
        }
        fixed_files += 1;
        let summary = format!(
            "{name}: {} fix{} applied",
            result.applied.len(),
            if result.applied.len() == 1 { "" } else { "es" }
        );
        if diff {
            print!("{}", unified_diff(&name, text, &result.text));
            eprintln!("{summary} (not written: --diff)");
            continue;
        }
        match input {
            Input::Stdin => {
                let _ = std::io::stdout().write_all(result.text.as_bytes());
                eprintln!("{summary}");
            }
            Input::File(path) => match files::write_atomic(path, &bytes, result.text.as_bytes()) {
                Ok(()) => eprintln!("{summary}"),
                Err(e) => {
                    eprintln!("implica: {name}: cannot write: {e}");
                    failed = true;
                }
            },
        }
        for (rule, title) in &result.applied {
            eprintln!("  {rule}: {title}");
        }
    }
    if configs.errors > 0 {
        failed = true;
    }
    if fixed_files == 0 && !failed {
        eprintln!("implica: nothing to fix");
    }
    if failed {
        ExitCode::from(2)
    } else if errors_left > 0 {
        eprintln!(
            "implica: {errors_left} error{} left that no fix resolves (run `implica check`)",
            if errors_left == 1 { "" } else { "s" }
        );
        ExitCode::from(1)
    } else {
        ExitCode::SUCCESS
    }
}

/// A unified diff of two texts, three lines of context, by lines. The
/// middle that differs is compared line by line when it is small enough,
/// and shown as one replaced block otherwise.
pub fn unified_diff(name: &str, before: &str, after: &str) -> String {
    let a: Vec<&str> = before.lines().collect();
    let b: Vec<&str> = after.lines().collect();
    let ops = line_ops(&a, &b);
    let mut out = format!("--- {name}\n+++ {name} (fixed)\n");
    // Changes closer than twice the context share a hunk.
    const CONTEXT: usize = 3;
    let changed: Vec<usize> = (0..ops.len())
        .filter(|&k| !matches!(ops[k], Op::Same(_)))
        .collect();
    let mut hunks: Vec<(usize, usize)> = Vec::new();
    for &k in &changed {
        match hunks.last_mut() {
            Some((_, last)) if k - *last <= 2 * CONTEXT + 1 => *last = k,
            _ => hunks.push((k, k)),
        }
    }
    for (first, last) in hunks {
        let (start, end) = (
            first.saturating_sub(CONTEXT),
            (last + CONTEXT + 1).min(ops.len()),
        );
        let (mut a0, mut b0) = (0, 0);
        for op in &ops[..start] {
            match op {
                Op::Same(_) => {
                    a0 += 1;
                    b0 += 1;
                }
                Op::Del(_) => a0 += 1,
                Op::Add(_) => b0 += 1,
            }
        }
        let (mut an, mut bn) = (0, 0);
        let mut body = String::new();
        for op in &ops[start..end] {
            match op {
                Op::Same(l) => {
                    an += 1;
                    bn += 1;
                    body.push_str(&format!(" {l}\n"));
                }
                Op::Del(l) => {
                    an += 1;
                    body.push_str(&format!("-{l}\n"));
                }
                Op::Add(l) => {
                    bn += 1;
                    body.push_str(&format!("+{l}\n"));
                }
            }
        }
        // An empty side is numbered after the line it follows.
        out.push_str(&format!(
            "@@ -{},{an} +{},{bn} @@\n{body}",
            a0 + usize::from(an > 0),
            b0 + usize::from(bn > 0)
        ));
    }
    out
}

enum Op<'s> {
    Same(&'s str),
    Del(&'s str),
    Add(&'s str),
}

fn line_ops<'s>(a: &[&'s str], b: &[&'s str]) -> Vec<Op<'s>> {
    let prefix = a.iter().zip(b).take_while(|(x, y)| x == y).count();
    let suffix = a[prefix..]
        .iter()
        .rev()
        .zip(b[prefix..].iter().rev())
        .take_while(|(x, y)| x == y)
        .count();
    let (ma, mb) = (&a[prefix..a.len() - suffix], &b[prefix..b.len() - suffix]);
    let mut ops: Vec<Op<'s>> = a[..prefix].iter().map(|l| Op::Same(l)).collect();
    if ma.len() * mb.len() <= 4_000_000 {
        // Longest common subsequence of the middle.
        let (n, m) = (ma.len(), mb.len());
        let mut lcs = vec![0u32; (n + 1) * (m + 1)];
        for i in (0..n).rev() {
            for j in (0..m).rev() {
                lcs[i * (m + 1) + j] = if ma[i] == mb[j] {
                    lcs[(i + 1) * (m + 1) + j + 1] + 1
                } else {
                    lcs[(i + 1) * (m + 1) + j].max(lcs[i * (m + 1) + j + 1])
                };
            }
        }
        let (mut i, mut j) = (0, 0);
        while i < n || j < m {
            if i < n && j < m && ma[i] == mb[j] {
                ops.push(Op::Same(ma[i]));
                i += 1;
                j += 1;
            } else if i < n && (j == m || lcs[(i + 1) * (m + 1) + j] >= lcs[i * (m + 1) + j + 1]) {
                ops.push(Op::Del(ma[i]));
                i += 1;
            } else {
                ops.push(Op::Add(mb[j]));
                j += 1;
            }
        }
    } else {
        ops.extend(ma.iter().map(|l| Op::Del(l)));
        ops.extend(mb.iter().map(|l| Op::Add(l)));
    }
    ops.extend(a[a.len() - suffix..].iter().map(|l| Op::Same(l)));
    ops
}
