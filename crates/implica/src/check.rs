//! `implica check` and the presentation of diagnostics.

use crate::OutputFormat;
use crate::files;
use codespan_reporting::diagnostic::{Diagnostic as Report, Label, Severity as ReportSeverity};
use codespan_reporting::files::SimpleFile;
use codespan_reporting::term::{self, termcolor};
use implica_analysis::{Applicability, Diagnostic, Severity};
use implica_syntax::LineIndex;
use serde_json::{Value, json};
use std::io::IsTerminal;
use std::path::PathBuf;
use std::process::ExitCode;

/// Counts per severity.
#[derive(Default)]
struct Summary {
    files: usize,
    errors: usize,
    warnings: usize,
    infos: usize,
    hints: usize,
    unreadable: usize,
}

impl Summary {
    fn add(&mut self, diags: &[Diagnostic]) {
        for d in diags {
            match d.severity {
                Severity::Error => self.errors += 1,
                Severity::Warning => self.warnings += 1,
                Severity::Info => self.infos += 1,
                Severity::Hint => self.hints += 1,
            }
        }
    }
}

pub fn run(paths: &[PathBuf], format: OutputFormat) -> ExitCode {
    let (inputs, problems) = files::collect(paths);
    let mut summary = Summary::default();
    for p in &problems {
        eprintln!("implica: {p}");
    }
    summary.unreadable += problems.len();
    let mut json_diags: Vec<Value> = Vec::new();
    for input in &inputs {
        let name = input.display();
        let bytes = match files::read(input) {
            Ok(b) => b,
            Err(e) => {
                eprintln!("implica: {name}: cannot read: {e}");
                summary.unreadable += 1;
                continue;
            }
        };
        summary.files += 1;
        let (text, diags) = implica_analysis::check_bytes(&bytes);
        summary.add(&diags);
        match format {
            OutputFormat::Human => print_human(&name, &text, &diags, false),
            OutputFormat::Json => {
                let index = LineIndex::new(&text);
                json_diags.extend(diags.iter().map(|d| to_json(&name, &text, &index, d)));
            }
        }
    }
    match format {
        OutputFormat::Human => {
            let plural = |n: usize, w: &str| format!("{n} {w}{}", if n == 1 { "" } else { "s" });
            let mut line = format!(
                "checked {}: {}, {}, {}",
                plural(summary.files, "file"),
                plural(summary.errors, "error"),
                plural(summary.warnings, "warning"),
                plural(summary.infos + summary.hints, "note"),
            );
            if summary.unreadable > 0 {
                line.push_str(&format!(
                    "; {} could not be read",
                    plural(summary.unreadable, "path")
                ));
            }
            println!("{line}");
        }
        OutputFormat::Json => {
            let doc = json!({
                "diagnostics": json_diags,
                "summary": {
                    "files": summary.files,
                    "errors": summary.errors,
                    "warnings": summary.warnings,
                    "infos": summary.infos,
                    "hints": summary.hints,
                    "unreadable": summary.unreadable,
                },
            });
            println!("{}", serde_json::to_string_pretty(&doc).unwrap_or_default());
        }
    }
    if summary.unreadable > 0 {
        ExitCode::from(2)
    } else if summary.errors > 0 {
        ExitCode::from(1)
    } else {
        ExitCode::SUCCESS
    }
}

fn position(text: &str, index: &LineIndex, offset: usize) -> Value {
    let lc = index.line_col(text, offset);
    json!({ "line": lc.line + 1, "column": lc.col + 1 })
}

fn range(text: &str, index: &LineIndex, span: implica_syntax::Span) -> Value {
    json!({ "start": position(text, index, span.start), "end": position(text, index, span.end) })
}

/// One diagnostic in the JSON schema of docs/json-output.md.
fn to_json(file: &str, text: &str, index: &LineIndex, d: &Diagnostic) -> Value {
    let fixes: Vec<Value> = d
        .fixes
        .iter()
        .map(|f| {
            json!({
                "title": f.title,
                "applicability": match f.applicability {
                    Applicability::Safe => "safe",
                    Applicability::NeedsReview => "needs-review",
                },
                "edits": f.edits.iter().map(|e| json!({
                    "range": range(text, index, e.span),
                    "new_text": e.new_text,
                })).collect::<Vec<_>>(),
            })
        })
        .collect();
    let related: Vec<Value> = d
        .related
        .iter()
        .map(|r| json!({ "range": range(text, index, r.span), "message": r.message }))
        .collect();
    json!({
        "file": file,
        "rule": d.rule,
        "severity": d.severity.as_str(),
        "message": d.message,
        "help": d.help,
        "range": range(text, index, d.span),
        "related": related,
        "fixes": fixes,
    })
}

/// Prints diagnostics with source snippets, in colour only on a terminal.
pub fn print_human(name: &str, text: &str, diags: &[Diagnostic], to_stderr: bool) {
    if diags.is_empty() {
        return;
    }
    let file = SimpleFile::new(name, text);
    let terminal = if to_stderr {
        std::io::stderr().is_terminal()
    } else {
        std::io::stdout().is_terminal()
    };
    let choice = if terminal && std::env::var_os("NO_COLOR").is_none() {
        termcolor::ColorChoice::Auto
    } else {
        termcolor::ColorChoice::Never
    };
    let stream = if to_stderr {
        termcolor::StandardStream::stderr(choice)
    } else {
        termcolor::StandardStream::stdout(choice)
    };
    let config = term::Config::default();
    for d in diags {
        let severity = match d.severity {
            Severity::Error => ReportSeverity::Error,
            Severity::Warning => ReportSeverity::Warning,
            Severity::Info => ReportSeverity::Note,
            Severity::Hint => ReportSeverity::Help,
        };
        let clamp = |s: implica_syntax::Span| s.start.min(text.len())..s.end.min(text.len());
        let mut labels = vec![Label::primary((), clamp(d.span))];
        labels.extend(
            d.related
                .iter()
                .map(|r| Label::secondary((), clamp(r.span)).with_message(&r.message)),
        );
        let mut report = Report::new(severity)
            .with_code(d.rule)
            .with_message(&d.message)
            .with_labels(labels);
        if let Some(help) = &d.help {
            report = report.with_notes(vec![format!("help: {help}")]);
        }
        let _ = term::emit_to_write_style(&mut stream.lock(), &config, &file, &report);
    }
}
