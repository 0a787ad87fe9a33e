//! `implica table`: truth tables of signals, with Karnaugh maps for up to
//! six inputs in text mode.

use crate::document;
use implica_analysis::minimal::minimal_forms;
use implica_analysis::model::Model;
use implica_logic::{
    Budget, Effort, Format, Function, MAX_VARS, TruthTable, render_karnaugh_map, render_truth_table,
};
use serde_json::{Value, json};
use std::path::Path;
use std::process::ExitCode;

/// Output formats of `table`.
#[derive(Clone, Copy, PartialEq, Eq, clap::ValueEnum)]
pub enum TableFormat {
    /// Truth tables, and Karnaugh maps marked with the minimal sum of products.
    Text,
    /// On-set and don't-care minterm indices.
    Json,
    /// One truth table over all the inputs the signals read.
    Csv,
}

/// Work allowed per signal.
const WORK_PER_SIGNAL: u64 = 50_000_000;

struct Tabled {
    name: String,
    inputs: Vec<usize>,
    on: TruthTable,
    dc: TruthTable,
}

pub fn run(path: &Path, signals: &[String], format: TableFormat, max_rows: usize) -> ExitCode {
    document::run_on(path, signals, |doc, model, selected, functions| {
        report(doc, model, selected, functions, format, max_rows)
    })
}

fn report(
    doc: &document::Document,
    model: &Model,
    selected: Vec<usize>,
    functions: &mut implica_analysis::functions::Functions,
    format: TableFormat,
    max_rows: usize,
) -> ExitCode {
    let mut failed = false;
    let mut tabled: Vec<Result<Tabled, (String, String)>> = Vec::new();
    for &s in &selected {
        let name = model.signals[s].name.to_string();
        let mut effort = Effort::new(WORK_PER_SIGNAL);
        let local = match functions.local(s, &mut effort) {
            Ok(Ok(l)) => l,
            Ok(Err(u)) => {
                failed = true;
                tabled.push(Err((name, u.describe(model))));
                continue;
            }
            Err(_) => {
                failed = true;
                tabled.push(Err((name, "its function takes too much work".into())));
                continue;
            }
        };
        if local.inputs.len() > MAX_VARS {
            failed = true;
            tabled.push(Err((
                name,
                format!(
                    "it reads {} inputs; tables are printed for at most {MAX_VARS}",
                    local.inputs.len()
                ),
            )));
            continue;
        }
        let on = functions.bdd.to_truth_table(local.on, &local.inputs);
        let dc = functions.bdd.to_truth_table(local.dc, &local.inputs);
        tabled.push(Ok(Tabled {
            name,
            inputs: local.inputs,
            on,
            dc,
        }));
        let _ = s;
    }
    let code = match format {
        TableFormat::Json => {
            let signals: Vec<Value> = tabled
                .iter()
                .map(|t| match t {
                    Ok(t) => json!({
                        "name": t.name,
                        "inputs": document::input_names(model, &t.inputs),
                        "on": t.on.minterms(),
                        "dc": t.dc.minterms(),
                    }),
                    Err((name, why)) => json!({"name": name, "inputs": [], "error": why}),
                })
                .collect();
            let out = json!({"file": doc.name, "signals": signals});
            println!("{}", serde_json::to_string_pretty(&out).unwrap_or_default());
            None
        }
        TableFormat::Text => {
            print_text(model, functions, &selected, &tabled, max_rows);
            None
        }
        TableFormat::Csv => Some(print_csv(model, &tabled)),
    };
    for t in &tabled {
        if let Err((name, why)) = t {
            eprintln!("implica: {}: {name}: {why}", doc.name);
        }
    }
    match code {
        Some(c) => c,
        None if failed => ExitCode::from(1),
        None => ExitCode::SUCCESS,
    }
}

fn print_text(
    model: &Model,
    functions: &mut implica_analysis::functions::Functions,
    selected: &[usize],
    tabled: &[Result<Tabled, (String, String)>],
    max_rows: usize,
) {
    let mut out = String::new();
    for (&s, t) in selected.iter().zip(tabled) {
        let t = match t {
            Ok(t) => t,
            Err((name, why)) => {
                out.push_str(&format!("{name}: no table: {why}\n\n"));
                continue;
            }
        };
        let names = document::input_names(model, &t.inputs);
        let f = Function {
            name: &t.name,
            on: &t.on,
            dc: Some(&t.dc),
        };
        match render_truth_table(&names, &[f], Format::Text, Some(max_rows)) {
            Ok(table) => out.push_str(&table),
            Err(e) => out.push_str(&format!("{}: no table: {e}\n", t.name)),
        }
        if (1..=6).contains(&names.len()) {
            // Mark the map with the minimal sum of products, when it is proven.
            let mut effort = Effort::new(WORK_PER_SIGNAL);
            let cover =
                match minimal_forms(functions, s, true, false, &Budget::default(), &mut effort) {
                    Ok(Ok(forms)) => forms.sop.and_then(|r| r.ok()).map(|f| f.cover),
                    _ => None,
                };
            if let Ok(map) = render_karnaugh_map(&names, &f, cover.as_ref(), Format::Text) {
                out.push('\n');
                out.push_str(&map);
            }
        }
        out.push('\n');
    }
    print!("{}", out.trim_end_matches('\n').to_string() + "\n");
}

/// One CSV table over the union of the signals' inputs, in declaration
/// order: a column per input, then one per signal (`0`, `1` or `-`).
fn print_csv(model: &Model, tabled: &[Result<Tabled, (String, String)>]) -> ExitCode {
    let ok: Vec<&Tabled> = tabled.iter().filter_map(|t| t.as_ref().ok()).collect();
    let mut all: Vec<usize> = ok.iter().flat_map(|t| t.inputs.iter().copied()).collect();
    all.sort_unstable();
    all.dedup();
    if all.len() > MAX_VARS {
        eprintln!(
            "implica: the signals read {} inputs together; a CSV table has at most {MAX_VARS} \
             (select fewer with --signal)",
            all.len()
        );
        return ExitCode::from(2);
    }
    let quote = |s: &str| {
        if s.contains([',', '"', '\n']) {
            format!("\"{}\"", s.replace('"', "\"\""))
        } else {
            s.to_string()
        }
    };
    let mut out = String::new();
    let header: Vec<String> = document::input_names(model, &all)
        .iter()
        .map(|n| quote(n))
        .chain(ok.iter().map(|t| quote(&t.name)))
        .collect();
    out.push_str(&header.join(","));
    out.push('\n');
    let n = all.len();
    // Where each signal's inputs sit among all of them.
    let positions: Vec<Vec<usize>> = ok
        .iter()
        .map(|t| {
            t.inputs
                .iter()
                .map(|i| all.iter().position(|a| a == i).unwrap_or(0))
                .collect()
        })
        .collect();
    for row in 0..1usize << n {
        let bit = |p: usize| (row >> (n - 1 - p)) & 1;
        let mut cells: Vec<String> = (0..n).map(|p| bit(p).to_string()).collect();
        for (t, pos) in ok.iter().zip(&positions) {
            let m = pos.iter().fold(0usize, |acc, &p| (acc << 1) | bit(p));
            cells.push(
                if t.dc.get(m) {
                    "-"
                } else if t.on.get(m) {
                    "1"
                } else {
                    "0"
                }
                .to_string(),
            );
        }
        out.push_str(&cells.join(","));
        out.push('\n');
    }
    print!("{out}");
    if ok.len() == tabled.len() {
        ExitCode::SUCCESS
    } else {
        ExitCode::from(1)
    }
}
