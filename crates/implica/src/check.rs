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

pub fn run(paths: &[PathBuf], format: OutputFormat, deny_warnings: bool) -> ExitCode {
    let (inputs, problems) = files::collect(paths);
    let mut summary = Summary::default();
    for p in &problems {
        eprintln!("implica: {p}");
    }
    summary.unreadable += problems.len();
    let mut json = JsonStream::default();
    let mut sarif_results: Vec<Value> = Vec::new();
    let mut configs = crate::project::Configs::default();
    // Configurations are found on this thread (each directory once); the
    // files are read and analysed on all cores, and reported in order.
    let jobs: Vec<_> = inputs
        .iter()
        .map(|input| (input, configs.for_input(input)))
        .collect();
    analyse_all(&jobs, |k, result| {
        let name = jobs[k].0.display();
        let (text, analysis) = match result {
            Ok(Ok(r)) => r,
            Ok(Err(e)) => {
                eprintln!("implica: {name}: cannot read: {e}");
                summary.unreadable += 1;
                return;
            }
            Err(_) => {
                eprintln!("implica: {name}: internal error: the analysis stopped");
                summary.unreadable += 1;
                return;
            }
        };
        summary.files += 1;
        for e in &analysis.internal_errors {
            eprintln!("implica: {name}: internal error (please report it): {e}");
        }
        let diags = analysis.diagnostics;
        summary.add(&diags);
        match format {
            OutputFormat::Human => print_human(&name, &text, &diags, false),
            OutputFormat::Json => {
                let index = LineIndex::new(&text);
                for d in &diags {
                    json.push(&to_json(&name, &text, &index, d));
                }
            }
            OutputFormat::Github => print_github(&name, &text, &diags),
            OutputFormat::Sarif => {
                let index = LineIndex::new(&text);
                sarif_results.extend(diags.iter().map(|d| sarif_result(&name, &text, &index, d)));
            }
        }
    });
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
        OutputFormat::Github => {}
        OutputFormat::Sarif => {
            println!(
                "{}",
                serde_json::to_string_pretty(&sarif_log(sarif_results)).unwrap_or_default()
            );
        }
        OutputFormat::Json => json.finish(&json!({
            "files": summary.files,
            "errors": summary.errors,
            "warnings": summary.warnings,
            "infos": summary.infos,
            "hints": summary.hints,
            "unreadable": summary.unreadable,
        })),
    }
    if summary.unreadable > 0 || configs.errors > 0 {
        ExitCode::from(2)
    } else if summary.errors > 0 || (deny_warnings && summary.warnings > 0) {
        ExitCode::from(1)
    } else {
        ExitCode::SUCCESS
    }
}

/// The JSON report, written as the files are analysed instead of held
/// until the end: `{"diagnostics": [...], "summary": {...}}`, laid out
/// exactly as `serde_json::to_string_pretty` lays out the whole document
/// (two spaces a level; keys in order).
#[derive(Default)]
struct JsonStream {
    started: bool,
}

impl JsonStream {
    /// Appends one diagnostic to the `diagnostics` array.
    fn push(&mut self, diagnostic: &Value) {
        use std::io::Write;
        let text = serde_json::to_string_pretty(diagnostic).unwrap_or_default();
        let mut out = std::io::stdout().lock();
        let lead = if self.started {
            ",\n"
        } else {
            "{\n  \"diagnostics\": [\n"
        };
        self.started = true;
        // JSON strings hold no raw line breaks: every line is a level of
        // the layout and moves in by the array's depth.
        let mut block = String::with_capacity(text.len() + text.len() / 8 + 32);
        block.push_str(lead);
        for (i, line) in text.lines().enumerate() {
            if i > 0 {
                block.push('\n');
            }
            block.push_str("    ");
            block.push_str(line);
        }
        let _ = out.write_all(block.as_bytes());
    }

    /// Closes the array and writes the summary.
    fn finish(self, summary: &Value) {
        let text = serde_json::to_string_pretty(summary).unwrap_or_default();
        let summary = text.replace('\n', "\n  ");
        if self.started {
            println!("\n  ],\n  \"summary\": {summary}\n}}");
        } else {
            println!("{{\n  \"diagnostics\": [],\n  \"summary\": {summary}\n}}");
        }
    }
}

type Analysed = std::io::Result<(String, implica_analysis::Analysis)>;

/// Reads and analyses every input on a pool of threads (one per core) and
/// hands the results to `report` on this thread, in input order, each as
/// soon as it and those before it are done. A result that never comes (a
/// worker that panicked) is an `Err`.
fn analyse_all(
    jobs: &[(
        &files::Input,
        std::sync::Arc<implica_analysis::config::Config>,
    )],
    mut report: impl FnMut(usize, Result<Analysed, std::sync::mpsc::RecvError>),
) {
    use std::sync::atomic::{AtomicUsize, Ordering};
    use std::sync::{Mutex, mpsc};
    let work = |k: usize| -> Analysed {
        let (input, config) = &jobs[k];
        let bytes = files::read(input)?;
        Ok(implica_analysis::check_bytes_with(&bytes, config))
    };
    let threads = std::thread::available_parallelism()
        .map_or(1, usize::from)
        .min(jobs.len());
    if threads <= 1 {
        for k in 0..jobs.len() {
            report(k, Ok(work(k)));
        }
        return;
    }
    let (senders, receivers): (Vec<_>, Vec<_>) = jobs.iter().map(|_| mpsc::channel()).unzip();
    let senders: Vec<Mutex<Option<mpsc::Sender<Analysed>>>> =
        senders.into_iter().map(|s| Mutex::new(Some(s))).collect();
    let next = AtomicUsize::new(0);
    std::thread::scope(|scope| {
        for _ in 0..threads {
            scope.spawn(|| {
                loop {
                    let k = next.fetch_add(1, Ordering::Relaxed);
                    if k >= jobs.len() {
                        break;
                    }
                    // Taken before the work, so that a panic drops it and
                    // the report of this input does not wait forever.
                    let tx = senders[k].lock().ok().and_then(|mut s| s.take());
                    let result = work(k);
                    if let Some(tx) = tx {
                        let _ = tx.send(result);
                    }
                }
            });
        }
        for (k, rx) in receivers.iter().enumerate() {
            report(k, rx.recv());
        }
    });
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

/// A file name as a relative URI reference: `/` separators, and the
/// characters a URI does not allow percent-encoded.
fn uri(name: &str) -> String {
    let mut out = String::new();
    for b in name.replace('\\', "/").bytes() {
        if b.is_ascii_alphanumeric() || b"-._~/!$&'()*+,;=:@".contains(&b) {
            out.push(b as char);
        } else {
            out.push_str(&format!("%{b:02X}"));
        }
    }
    out
}

/// A SARIF region: 1-based lines and columns, end exclusive, columns in
/// Unicode scalar values (`columnKind` is `unicodeCodePoints`).
fn sarif_region(text: &str, index: &LineIndex, span: implica_syntax::Span) -> Value {
    let (a, b) = (
        index.line_col(text, span.start),
        index.line_col(text, span.end),
    );
    json!({
        "startLine": a.line + 1,
        "startColumn": a.col + 1,
        "endLine": b.line + 1,
        "endColumn": b.col + 1,
    })
}

fn sarif_level(s: Severity) -> &'static str {
    match s {
        Severity::Error => "error",
        Severity::Warning => "warning",
        Severity::Info | Severity::Hint => "note",
    }
}

fn sarif_result(name: &str, text: &str, index: &LineIndex, d: &Diagnostic) -> Value {
    let location = |span| {
        json!({
            "physicalLocation": {
                "artifactLocation": { "uri": uri(name) },
                "region": sarif_region(text, index, span),
            }
        })
    };
    let rule_index = implica_analysis::rules::ALL
        .iter()
        .position(|r| r.name == d.rule)
        .unwrap_or(0);
    let mut message = d.message.clone();
    if let Some(h) = &d.help {
        message.push_str(&format!(" Help: {h}"));
    }
    let related: Vec<Value> = d
        .related
        .iter()
        .enumerate()
        .map(|(i, r)| {
            let mut l = location(r.span);
            l["id"] = json!(i);
            l["message"] = json!({ "text": r.message });
            l
        })
        .collect();
    let fixes: Vec<Value> = d
        .fixes
        .iter()
        .map(|f| {
            let kind = match f.applicability {
                Applicability::Safe => "safe",
                Applicability::NeedsReview => "to review",
            };
            json!({
                "description": { "text": format!("{} ({kind})", f.title) },
                "artifactChanges": [{
                    "artifactLocation": { "uri": uri(name) },
                    "replacements": f.edits.iter().map(|e| json!({
                        "deletedRegion": sarif_region(text, index, e.span),
                        "insertedContent": { "text": e.new_text },
                    })).collect::<Vec<_>>(),
                }],
            })
        })
        .collect();
    json!({
        "ruleId": d.rule,
        "ruleIndex": rule_index,
        "level": sarif_level(d.severity),
        "message": { "text": message },
        "locations": [location(d.span)],
        "relatedLocations": related,
        "fixes": fixes,
    })
}

/// The whole SARIF log: one run of `implica`, its rules, the results.
fn sarif_log(results: Vec<Value>) -> Value {
    let rules: Vec<Value> = implica_analysis::rules::ALL
        .iter()
        .map(|r| {
            let off = implica_analysis::rules::OFF_BY_DEFAULT.contains(&r.name);
            json!({
                "id": r.name,
                "shortDescription": { "text": r.summary },
                "fullDescription": { "text": r.summary },
                "help": { "text": r.documentation(), "markdown": r.documentation() },
                "defaultConfiguration": {
                    "enabled": !off,
                    "level": sarif_level(r.default_severity),
                },
            })
        })
        .collect();
    json!({
        "$schema": "https://docs.oasis-open.org/sarif/sarif/v2.1.0/errata01/os/schemas/sarif-schema-2.1.0.json",
        "version": "2.1.0",
        "runs": [{
            "tool": {
                "driver": {
                    "name": "implica",
                    "version": env!("CARGO_PKG_VERSION"),
                    "rules": rules,
                }
            },
            "columnKind": "unicodeCodePoints",
            "results": results,
        }]
    })
}

/// Prints one workflow command per diagnostic, in the format GitHub Actions
/// documents for annotations: `::error file=F,line=L,col=C,endLine=L,endColumn=C,title=T::MESSAGE`,
/// with `%`, line breaks, and (in properties) `:` and `,` escaped.
fn print_github(name: &str, text: &str, diags: &[Diagnostic]) {
    let index = LineIndex::new(text);
    let data = |s: &str| {
        s.replace('%', "%25")
            .replace('\r', "%0D")
            .replace('\n', "%0A")
    };
    let prop = |s: &str| data(s).replace(':', "%3A").replace(',', "%2C");
    for d in diags {
        let level = match d.severity {
            Severity::Error => "error",
            Severity::Warning => "warning",
            Severity::Info | Severity::Hint => "notice",
        };
        let (a, b) = (
            index.line_col(text, d.span.start),
            index.line_col(text, d.span.end),
        );
        let mut message = d.message.clone();
        if let Some(h) = &d.help {
            message.push_str(&format!("\nhelp: {h}"));
        }
        println!(
            "::{level} file={},line={},col={},endLine={},endColumn={},title={}::{}",
            prop(name),
            a.line + 1,
            a.col + 1,
            b.line + 1,
            b.col + 1,
            prop(&format!("implica {}", d.rule)),
            data(&message)
        );
    }
}

/// Prints diagnostics with source snippets, in colour only on a terminal.
pub fn print_human(name: &str, text: &str, diags: &[Diagnostic], to_stderr: bool) {
    if diags.is_empty() {
        return;
    }
    let shown = displayable(text);
    let file = SimpleFile::new(name, shown.as_ref());
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
    // One write per file rather than one per line.
    let mut stream = if to_stderr {
        termcolor::BufferedStandardStream::stderr(choice)
    } else {
        termcolor::BufferedStandardStream::stdout(choice)
    };
    let config = term::Config::default();
    let index = LineIndex::new(text);
    for d in diags.iter().take(MAX_SHOWN) {
        let severity = match d.severity {
            Severity::Error => ReportSeverity::Error,
            Severity::Warning => ReportSeverity::Warning,
            Severity::Info => ReportSeverity::Note,
            Severity::Hint => ReportSeverity::Help,
        };
        let clamp = |s: implica_syntax::Span| s.start.min(text.len())..s.end.min(text.len());
        let mut report = Report::new(severity)
            .with_code(d.rule)
            .with_message(&d.message);
        let mut notes = Vec::new();
        if line_length(text, d.span.start) <= MAX_SNIPPET_LINE {
            let mut labels = vec![Label::primary((), clamp(d.span))];
            labels.extend(
                d.related
                    .iter()
                    .map(|r| Label::secondary((), clamp(r.span)).with_message(&r.message)),
            );
            report = report.with_labels(labels);
        } else {
            // A snippet of a huge line (a binary or minified file) would bury the message.
            let at = index.line_col(text, d.span.start);
            notes.push(format!(
                "at {name}:{}:{} (the line is too long to show)",
                at.line + 1,
                at.col + 1
            ));
        }
        for f in &d.fixes {
            let kind = match f.applicability {
                Applicability::Safe => "fix",
                Applicability::NeedsReview => "fix to review",
            };
            notes.push(format!("{kind}: {}", f.title));
        }
        if let Some(help) = &d.help {
            notes.push(format!("help: {help}"));
        }
        report = report.with_notes(notes);
        let _ = term::emit_to_write_style(&mut stream, &config, &file, &report);
    }
    use std::io::Write;
    if diags.len() > MAX_SHOWN {
        let _ = writeln!(
            stream,
            "... and {} more in {name} (all of them: --format json)\n",
            diags.len() - MAX_SHOWN
        );
    }
    let _ = stream.flush();
}

/// Diagnostics shown per file in human output.
const MAX_SHOWN: usize = 50;

/// Lines longer than this (in bytes) are not shown as snippets.
const MAX_SNIPPET_LINE: usize = 400;

fn line_length(text: &str, offset: usize) -> usize {
    let offset = offset.min(text.len());
    let bytes = text.as_bytes();
    let start = bytes[..offset]
        .iter()
        .rposition(|&b| b == b'\n')
        .map_or(0, |i| i + 1);
    let end = bytes[offset..]
        .iter()
        .position(|&b| b == b'\n')
        .map_or(text.len(), |i| offset + i);
    end - start
}

/// `text` with control and bidirectional-override characters replaced by
/// visible ones of the same UTF-8 length, so that snippets of a binary or
/// hostile file cannot drive the terminal, and byte offsets stay valid.
fn displayable(text: &str) -> std::borrow::Cow<'_, str> {
    let bad = |c: char| {
        (c.is_control() && c != '\n' && c != '\t' && c != '\r')
            || matches!(c, '\u{202A}'..='\u{202E}' | '\u{2066}'..='\u{2069}')
    };
    if !text.chars().any(bad) {
        return text.into();
    }
    text.chars()
        .map(|c| match (bad(c), c.len_utf8()) {
            (false, _) => c,
            (true, 1) => '?',
            (true, 2) => '\u{BF}',
            (true, _) => '\u{FFFD}',
        })
        .collect::<String>()
        .into()
}

#[cfg(test)]
mod tests {
    use super::displayable;

    #[test]
    fn control_characters_are_masked_without_moving_offsets() {
        let text = "a\u{1b}[31mb\u{85}c\u{202E}d\n\te";
        let shown = displayable(text);
        assert_eq!(shown.len(), text.len());
        assert_eq!(shown, "a?[31mb\u{BF}c\u{FFFD}d\n\te");
        assert!(matches!(
            displayable("plain"),
            std::borrow::Cow::Borrowed(_)
        ));
    }
}
