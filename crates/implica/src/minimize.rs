//! `implica minimize`: each signal's minimal sum of products and product of
//! sums, with their cost and certificate.

use crate::document;
use implica_analysis::minimal::{Form, NoForm, minimal_forms};
use implica_analysis::model::Model;
use implica_logic::{Budget, Effort};
use serde_json::{Value, json};
use std::path::Path;
use std::process::ExitCode;

/// Which two-level forms to show.
#[derive(Clone, Copy, PartialEq, Eq, clap::ValueEnum)]
pub enum Form2 {
    /// Sum of products.
    Sop,
    /// Product of sums.
    Pos,
    /// Both.
    Both,
}

/// Output formats of `minimize`.
#[derive(Clone, Copy, PartialEq, Eq, clap::ValueEnum)]
pub enum MinimizeFormat {
    Text,
    Json,
}

/// Work allowed per signal for the heuristic and conversions.
const WORK_PER_SIGNAL: u64 = 200_000_000;

pub fn run(path: &Path, signals: &[String], form: Form2, format: MinimizeFormat) -> ExitCode {
    document::run_on(path, signals, |doc, model, selected, functions| {
        report(doc, model, selected, functions, form, format)
    })
}

fn report(
    doc: &document::Document,
    model: &Model,
    selected: Vec<usize>,
    functions: &mut implica_analysis::functions::Functions,
    form: Form2,
    format: MinimizeFormat,
) -> ExitCode {
    let (sop, pos) = (form != Form2::Pos, form != Form2::Sop);
    let mut failed = false;
    let mut out_json = Vec::new();
    let mut text = String::new();
    for s in selected {
        let name = model.signals[s].name.to_string();
        let mut effort = Effort::new(WORK_PER_SIGNAL);
        let forms = minimal_forms(functions, s, sop, pos, &Budget::default(), &mut effort);
        let forms = match forms {
            Ok(Ok(f)) => f,
            Ok(Err(u)) => {
                failed = true;
                let why = u.describe(model);
                text.push_str(&format!("{name}: no function: {why}\n\n"));
                out_json.push(json!({"name": name, "inputs": [], "error": why}));
                continue;
            }
            Err(_) => {
                failed = true;
                let why = "its minimization takes more work than the budget allows".to_string();
                text.push_str(&format!("{name}: {why}\n\n"));
                out_json.push(json!({"name": name, "inputs": [], "error": why}));
                continue;
            }
        };
        let inputs = document::input_names(model, &forms.local.inputs);
        let render = |f: &Form| f.expression.to_text(&|i| inputs[i].clone());
        let mut entry = json!({"name": name, "inputs": inputs});
        text.push_str(&name);
        if inputs.is_empty() {
            text.push_str("  (reads no input)\n");
        } else {
            text.push_str(&format!("  over {}\n", inputs.join(", ")));
        }
        for (key, label, found) in [
            ("sop", "sum of products", &forms.sop),
            ("pos", "product of sums", &forms.pos),
        ] {
            let Some(found) = found else { continue };
            match found {
                Ok(f) => {
                    let expr = render(f);
                    text.push_str(&format!("  {label}  {expr}\n"));
                    text.push_str(&format!(
                        "  {:width$}  {}\n",
                        "",
                        certificate(f, key == "pos"),
                        width = label.len()
                    ));
                    entry[key] = json!({
                        "expression": expr,
                        "terms": f.terms,
                        "literals": f.literals,
                        "proven_minimal": f.proven_minimal,
                        "lower_bound": f.lower_bound,
                        "method": f.method.as_str(),
                    });
                }
                Err(NoForm {
                    reason,
                    rows,
                    lower_bound,
                }) => {
                    failed = true;
                    text.push_str(&format!("  {label}  not found: {reason}\n"));
                    entry[key] = json!({"error": reason});
                    // Whole numbers print as integers (the counts are exact
                    // up to 2^53).
                    let count = |x: f64| {
                        if x.fract() == 0.0 && x < 9_007_199_254_740_992.0 {
                            json!(x as u64)
                        } else {
                            json!(x)
                        }
                    };
                    if let Some(rows) = rows {
                        entry[key]["rows"] = count(*rows);
                    }
                    if let Some(bound) = lower_bound {
                        entry[key]["lower_bound"] = count(*bound);
                    }
                }
            }
        }
        text.push('\n');
        out_json.push(entry);
    }
    match format {
        MinimizeFormat::Text => print!("{}", text.trim_end_matches('\n').to_string() + "\n"),
        MinimizeFormat::Json => {
            let doc_json = json!({"file": doc.name, "signals": Value::Array(out_json)});
            println!(
                "{}",
                serde_json::to_string_pretty(&doc_json).unwrap_or_default()
            );
        }
    }
    if failed {
        ExitCode::from(1)
    } else {
        ExitCode::SUCCESS
    }
}

/// "3 terms, 7 literals; proven minimal", or what is known instead.
fn certificate(f: &Form, sums: bool) -> String {
    let plural = |n: usize, w: &str| format!("{n} {w}{}", if n == 1 { "" } else { "s" });
    let kind = if sums { "sum term" } else { "term" };
    let size = format!(
        "{}, {}",
        plural(f.terms, kind),
        plural(f.literals, "literal")
    );
    match (f.proven_minimal, f.method) {
        (true, _) => format!("{size}; proven minimal"),
        (false, implica_analysis::minimal::Method::Exact) => format!(
            "{size}; not proven minimal: at least {} needed",
            plural(f.lower_bound, kind)
        ),
        (false, implica_analysis::minimal::Method::Heuristic) if f.lower_bound > 1 => format!(
            "{size}; found by the heuristic, not proven minimal: at least {} needed",
            plural(f.lower_bound, kind)
        ),
        (false, implica_analysis::minimal::Method::Heuristic) => {
            format!("{size}; found by the heuristic, not proven minimal")
        }
    }
}
