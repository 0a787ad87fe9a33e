//! `implica export`: a Verilog module or a VHDL entity computing the
//! document's outputs, proven before it is written.

use crate::files::{self, Input};
use implica_analysis::Severity;
use implica_analysis::model::Model;
use implica_hdl::{ExportError, Language, Logic, Options};
use implica_syntax::LineIndex;
use std::io::Write;
use std::path::{Path, PathBuf};
use std::process::ExitCode;

/// Target languages of `export`.
#[derive(Clone, Copy, PartialEq, Eq, clap::ValueEnum)]
pub enum Target {
    /// A Verilog module (IEEE 1364-2005).
    Verilog,
    /// A VHDL entity and architecture (IEEE 1076-2008).
    Vhdl,
}

/// Work allowed per signal, for its minimal form and for the proof.
const WORK_PER_SIGNAL: u64 = 200_000_000;

/// Errors listed before giving up on a document.
const ERRORS_SHOWN: usize = 10;

pub fn run(
    path: &Path,
    to: Target,
    as_written: bool,
    name: Option<&str>,
    output: Option<&Path>,
) -> ExitCode {
    let input = Input::from_path(path);
    let shown = input.display();
    let Some(bytes) = files::read_or_report(&input) else {
        return ExitCode::from(2);
    };
    let mut configs = crate::project::Configs::default();
    let config = configs.for_input(&input);
    let implica_analysis::Checked {
        text,
        file,
        analysis,
        functions,
    } = implica_analysis::check_bytes_keeping(&bytes, &config);
    let errors: Vec<_> = analysis
        .diagnostics
        .iter()
        .filter(|d| d.severity == Severity::Error)
        .collect();
    if !errors.is_empty() {
        let index = LineIndex::new(&text);
        eprintln!(
            "implica: {shown}: not exported: the document has {} error{}; export writes only \
             documents without errors (`implica check {shown}` shows them in full):",
            errors.len(),
            if errors.len() == 1 { "" } else { "s" }
        );
        for d in errors.iter().take(ERRORS_SHOWN) {
            let at = index.line_col(&text, d.span.start);
            eprintln!(
                "  {shown}:{}:{}: {}: {}",
                at.line + 1,
                at.col + 1,
                d.rule,
                d.message
            );
        }
        if errors.len() > ERRORS_SHOWN {
            eprintln!("  ... and {} more", errors.len() - ERRORS_SHOWN);
        }
        return ExitCode::from(1);
    }
    let model = Model::build(&file);
    let mut functions = functions.unwrap_or_else(|| crate::document::functions(&model));
    let language = match to {
        Target::Verilog => Language::Verilog,
        Target::Vhdl => Language::Vhdl,
    };
    let stem = match &input {
        Input::Stdin => "stdin".to_string(),
        Input::File(p) => p.file_stem().map_or_else(
            || "module".to_string(),
            |s| s.to_string_lossy().into_owned(),
        ),
    };
    let command = command_line(path, to, as_written, name, output);
    let options = Options {
        language,
        logic: if as_written {
            Logic::AsWritten
        } else {
            Logic::Minimized
        },
        name,
        stem: &stem,
        source: &shown,
        command: &command,
        config: &config,
        work_per_signal: WORK_PER_SIGNAL,
    };
    let exported = match implica_hdl::export(&text, &model, &mut functions, &options) {
        Ok(x) => x,
        Err(e) => {
            eprintln!("implica: {shown}: not exported: {e}");
            return ExitCode::from(match e {
                ExportError::BadName { .. } => 2,
                _ => 1,
            });
        }
    };
    for r in &exported.renamed {
        eprintln!(
            "implica: {shown}: note: `{}` is `{}` in the {} ({})",
            r.from,
            r.to,
            language.title(),
            r.why
        );
    }
    match output {
        None => {
            let mut out = std::io::stdout().lock();
            if out
                .write_all(exported.text.as_bytes())
                .and_then(|()| out.flush())
                .is_err()
            {
                return ExitCode::from(2);
            }
        }
        Some(out) => {
            if let Err(e) = files::write_new(out, exported.text.as_bytes()) {
                eprintln!("implica: {}: cannot write: {e}", out.display());
                return ExitCode::from(2);
            }
        }
    }
    ExitCode::SUCCESS
}

/// The command that regenerates the output, for its header.
fn command_line(
    path: &Path,
    to: Target,
    as_written: bool,
    name: Option<&str>,
    output: Option<&Path>,
) -> String {
    let mut c = format!(
        "implica export --to {}",
        match to {
            Target::Verilog => "verilog",
            Target::Vhdl => "vhdl",
        }
    );
    if as_written {
        c.push_str(" --as-written");
    }
    if let Some(n) = name {
        c.push_str(&format!(" --name {n}"));
    }
    if let Some(o) = output {
        c.push_str(&format!(" --output {}", o.display()));
    }
    c.push(' ');
    c.push_str(&PathBuf::from(path).display().to_string());
    c
}
