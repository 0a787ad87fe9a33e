//! `implica fmt`.

use crate::check::print_human;
use crate::files::{self, Input};
use std::io::Write;
use std::path::PathBuf;
use std::process::ExitCode;

pub fn run(paths: &[PathBuf], check: bool) -> ExitCode {
    let (inputs, problems) = files::collect(paths);
    let mut failed = !problems.is_empty();
    for p in problems {
        eprintln!("implica: {p}");
    }
    let mut would_change = Vec::new();
    for input in &inputs {
        let name = input.display();
        let Some(bytes) = files::read_or_report(input) else {
            failed = true;
            continue;
        };
        let Ok(text) = std::str::from_utf8(&bytes) else {
            let (text, diags) = implica_analysis::check_bytes(&bytes);
            print_human(&name, &text, &diags, true);
            eprintln!("implica: {name}: not formatted: the file is not valid UTF-8");
            failed = true;
            continue;
        };
        let formatted = match implica_syntax::format::format_source(text) {
            Ok(f) => f,
            Err(errors) => {
                let diags: Vec<_> = errors.into_iter().map(Into::into).collect();
                print_human(&name, text, &diags, true);
                eprintln!("implica: {name}: not formatted: fix the syntax errors first");
                failed = true;
                continue;
            }
        };
        match input {
            Input::Stdin => {
                if check {
                    if formatted != text {
                        would_change.push(name);
                    }
                } else {
                    let _ = std::io::stdout().write_all(formatted.as_bytes());
                }
            }
            Input::File(path) => {
                if formatted == text {
                    continue;
                }
                if check {
                    would_change.push(name);
                } else if let Err(e) = files::write_atomic(path, &bytes, formatted.as_bytes()) {
                    eprintln!("implica: {name}: cannot write: {e}");
                    failed = true;
                }
            }
        }
    }
    for name in &would_change {
        println!("would reformat {name}");
    }
    if failed {
        ExitCode::from(2)
    } else if !would_change.is_empty() {
        println!(
            "{} file{} would be reformatted; run `implica fmt` on {}",
            would_change.len(),
            if would_change.len() == 1 { "" } else { "s" },
            if would_change.len() == 1 {
                "it"
            } else {
                "them"
            }
        );
        ExitCode::from(1)
    } else {
        ExitCode::SUCCESS
    }
}
