//! `implica refactor`: the refactors offered at a place in a file, and
//! applying one of them (each proven before it is offered; see
//! docs/refactors.md).

use crate::files::{self, Input};
use implica_analysis::Applicability;
use implica_analysis::refactors::{Refactor, refactors_at};
use implica_syntax::line_index::LineIndex;
use std::io::Write;
use std::path::Path;
use std::process::ExitCode;

/// What to do with the refactors found.
pub enum Action<'a> {
    /// Print them, one a line.
    List,
    /// Apply the one of this kind (`diff`: print a unified diff instead of
    /// writing).
    Apply { kind: &'a str, diff: bool },
}

/// A 1-based `LINE` or `LINE:COLUMN` (columns in characters) as a byte
/// offset of `text`; an error that says what is wrong otherwise.
fn offset_of(text: &str, at: &str) -> Result<usize, String> {
    let bad = || format!("`{at}` is not a place: write LINE or LINE:COLUMN, counted from 1");
    let (line, col) = match at.split_once(':') {
        Some((l, c)) => (l, Some(c)),
        None => (at, None),
    };
    let line: usize = line.trim().parse().map_err(|_| bad())?;
    let col: usize = match col {
        Some(c) => c.trim().parse().map_err(|_| bad())?,
        None => 1,
    };
    if line == 0 || col == 0 {
        return Err(bad());
    }
    let index = LineIndex::new(text);
    let start = index.line_start(line - 1).ok_or_else(|| {
        format!(
            "line {line} is past the end: the file has {} line{}",
            index.line_count(),
            if index.line_count() == 1 { "" } else { "s" }
        )
    })?;
    let rest = &text[start..];
    let line_text = &rest[..rest.find('\n').unwrap_or(rest.len())];
    let chars = line_text.chars().count();
    if col > chars + 1 {
        return Err(format!(
            "column {col} is past the end of line {line}, which has {chars} character{}",
            if chars == 1 { "" } else { "s" }
        ));
    }
    Ok(start
        + line_text
            .char_indices()
            .nth(col - 1)
            .map_or(line_text.len(), |(i, _)| i))
}

fn applicability(a: Applicability) -> &'static str {
    match a {
        Applicability::Safe => "safe",
        Applicability::NeedsReview => "to review",
    }
}

pub fn run(file: &Path, at: &str, action: Action) -> ExitCode {
    let input = Input::from_path(file);
    let name = input.display();
    let Some(bytes) = files::read_or_report(&input) else {
        return ExitCode::from(2);
    };
    let Ok(text) = std::str::from_utf8(&bytes) else {
        eprintln!("implica: {name}: the file is not valid UTF-8 (run `implica check {name}`)");
        return ExitCode::from(2);
    };
    let offset = match offset_of(text, at) {
        Ok(o) => o,
        Err(e) => {
            eprintln!("implica: {name}: {e}");
            return ExitCode::from(2);
        }
    };
    let config = crate::project::Configs::default().for_input(&input);
    let found = refactors_at(text, implica_syntax::Span::new(offset, offset), &config);
    for e in &found.internal_errors {
        eprintln!("implica: {name}: internal error (please report it): {e}");
    }
    match action {
        Action::List => {
            if found.offered.is_empty() {
                eprintln!("implica: {name}:{at}: no refactor is offered here");
                return ExitCode::from(1);
            }
            let width = found
                .offered
                .iter()
                .map(|r| r.kind.as_str().len())
                .max()
                .unwrap_or(0);
            let mut out = std::io::stdout().lock();
            for r in &found.offered {
                let _ = writeln!(
                    out,
                    "{:width$}  {:9}  {}",
                    r.kind.as_str(),
                    applicability(r.fix.applicability),
                    r.fix.title
                );
            }
            ExitCode::SUCCESS
        }
        Action::Apply { kind, diff } => {
            let Some(r) = found.offered.iter().find(|r| r.kind.as_str() == kind) else {
                let offered: Vec<&str> = found.offered.iter().map(|r| r.kind.as_str()).collect();
                eprintln!(
                    "implica: {name}:{at}: `{kind}` is not offered here{}",
                    if offered.is_empty() {
                        " (no refactor is)".to_string()
                    } else {
                        format!(" (offered: {})", offered.join(", "))
                    }
                );
                return ExitCode::from(1);
            };
            apply(&input, &name, &bytes, text, r, diff)
        }
    }
}

fn apply(
    input: &Input,
    name: &str,
    bytes: &[u8],
    text: &str,
    r: &Refactor,
    diff: bool,
) -> ExitCode {
    let after = match implica_analysis::fixes::apply(text, &r.fix.edits) {
        Ok(t) => t,
        Err(e) => {
            eprintln!("implica: {name}: internal error (please report it): {e}");
            return ExitCode::from(2);
        }
    };
    let done = format!(
        "{name}: {} ({})",
        r.fix.title,
        applicability(r.fix.applicability)
    );
    if diff {
        print!("{}", crate::fix::unified_diff(name, text, &after));
        eprintln!("{done} (not written: --diff)");
        return ExitCode::SUCCESS;
    }
    match input {
        Input::Stdin => {
            let _ = std::io::stdout().write_all(after.as_bytes());
        }
        Input::File(path) => {
            if let Err(e) = files::write_atomic(path, bytes, after.as_bytes()) {
                eprintln!("implica: {name}: cannot write: {e}");
                return ExitCode::from(2);
            }
        }
    }
    eprintln!("{done}");
    ExitCode::SUCCESS
}
