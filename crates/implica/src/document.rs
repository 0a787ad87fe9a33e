//! Loading one document for the commands that compute with its signals
//! (`minimize`, `table`), and choosing the signals they report on.

use crate::files;
use implica_analysis::functions::Functions;
use implica_analysis::model::{Model, SignalId, SignalKind};
use implica_syntax::ast::SourceFile;
use std::path::Path;

/// A parsed document.
pub struct Document {
    pub name: String,
    pub file: SourceFile,
}

/// Reads and parses `path` (`-` is standard input). Syntax errors are
/// summarized on standard error; the signals they do not touch still work.
pub fn load(path: &Path) -> Result<Document, String> {
    let input = files::Input::from_path(path);
    let name = input.display();
    let bytes = files::read(&input).map_err(|e| format!("{name}: cannot read: {e}"))?;
    let (text, encoding) = implica_syntax::decode(&bytes);
    let (file, errors) = implica_syntax::parse(&text);
    let count = errors.len() + usize::from(encoding.is_some());
    if count > 0 {
        eprintln!(
            "implica: {name}: {count} syntax error{}; signals whose definitions they touch are \
             skipped (run `implica check {name}` for details)",
            if count == 1 { "" } else { "s" }
        );
    }
    Ok(Document { name, file })
}

/// The signals to report on: those named by `--signal`, in the order given,
/// or else every defined signal that is not an input, in definition order.
pub fn select(model: &Model, doc: &Document, names: &[String]) -> Result<Vec<SignalId>, String> {
    if names.is_empty() {
        let mut out: Vec<SignalId> = Vec::new();
        for d in &model.definitions {
            let s = d.signal;
            if model.signals[s].kind != SignalKind::Input && !out.contains(&s) {
                out.push(s);
            }
        }
        return Ok(out);
    }
    names
        .iter()
        .map(|n| match model.signal(n) {
            None => Err(format!("{}: no signal named `{n}`", doc.name)),
            Some(s) if model.signals[s].kind == SignalKind::Input => Err(format!(
                "{}: `{n}` is an input; name a defined signal",
                doc.name
            )),
            Some(s) if model.signals[s].definitions.is_empty() => {
                Err(format!("{}: `{n}` is never defined", doc.name))
            }
            Some(s) => Ok(s),
        })
        .collect()
}

/// Loads `path`, builds its model, selects the signals and computes their
/// functions, then hands them to `report`; a file that cannot be read or a
/// `--signal` that names no defined signal exits with status 2.
pub fn run_on(
    path: &Path,
    signals: &[String],
    report: impl FnOnce(&Document, &Model, Vec<SignalId>, &mut Functions) -> std::process::ExitCode,
) -> std::process::ExitCode {
    let doc = match load(path) {
        Ok(d) => d,
        Err(e) => {
            eprintln!("implica: {e}");
            return std::process::ExitCode::from(2);
        }
    };
    let model = Model::build(&doc.file);
    let selected = match select(&model, &doc, signals) {
        Ok(s) => s,
        Err(e) => {
            eprintln!("implica: {e}");
            return std::process::ExitCode::from(2);
        }
    };
    let mut f = functions(&model);
    report(&doc, &model, selected, &mut f)
}

/// Computes every signal's function, with the default work per definition.
pub fn functions(model: &Model) -> Functions {
    Functions::compute(
        model,
        implica_analysis::functions::DEFAULT_WORK_PER_DEFINITION,
        None,
    )
    .unwrap_or_else(|_| unreachable!("nothing cancels a command-line run"))
}

/// The names of a signal's inputs.
pub fn input_names(model: &Model, inputs: &[usize]) -> Vec<String> {
    inputs
        .iter()
        .map(|&i| model.signals[model.inputs[i]].name.to_string())
        .collect()
}
