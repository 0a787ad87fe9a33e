//! `implica eval`: the value of every signal for one input vector.

use crate::document;
use implica_analysis::model::SignalKind;
use serde_json::json;
use std::path::Path;
use std::process::ExitCode;

/// Output formats of `eval`.
#[derive(Clone, Copy, PartialEq, Eq, clap::ValueEnum)]
pub enum EvalFormat {
    Text,
    Json,
}

pub fn run(path: &Path, set: &[String], format: EvalFormat) -> ExitCode {
    document::run_on(path, &[], |doc, model, selected, functions| {
        // `a=1,b=0` (repeatable), every primary input exactly once.
        let mut vector = vec![None; model.inputs.len()];
        for pair in set
            .iter()
            .flat_map(|s| s.split(','))
            .filter(|p| !p.trim().is_empty())
        {
            let Some((name, value)) = pair.split_once('=') else {
                eprintln!("implica: `{pair}`: write NAME=0 or NAME=1");
                return ExitCode::from(2);
            };
            let (name, value) = (name.trim(), value.trim());
            let Some(i) = model
                .signal(name)
                .and_then(|s| model.signals[s].input_index)
            else {
                eprintln!("implica: {}: `{name}` is not an input", doc.name);
                return ExitCode::from(2);
            };
            let v = match value {
                "0" => false,
                "1" => true,
                _ => {
                    eprintln!("implica: `{pair}`: the value must be 0 or 1");
                    return ExitCode::from(2);
                }
            };
            if vector[i].replace(v).is_some() {
                eprintln!("implica: `{name}` is set twice");
                return ExitCode::from(2);
            }
        }
        let missing: Vec<String> = model
            .inputs
            .iter()
            .zip(&vector)
            .filter(|(_, v)| v.is_none())
            .map(|(&s, _)| format!("`{}`", model.signals[s].name))
            .collect();
        if !missing.is_empty() {
            eprintln!(
                "implica: {}: set every input; missing: {}",
                doc.name,
                missing.join(", ")
            );
            return ExitCode::from(2);
        }
        let mut point = vec![false; functions.bdd.vars()];
        for (i, v) in vector.iter().enumerate() {
            point[i] = v.unwrap_or(false);
        }
        let impossible = functions.bdd.eval(functions.impossible, &point);
        let mut rows = Vec::new();
        let mut unknown = false;
        for s in selected {
            let sig = &model.signals[s];
            if sig.kind == SignalKind::Input {
                continue;
            }
            let value = match functions.value(s) {
                Ok(k) => match (
                    functions.bdd.eval(k.lower, &point),
                    functions.bdd.eval(k.upper, &point),
                ) {
                    (true, _) => "1".to_string(),
                    (false, false) => "0".to_string(),
                    (false, true) => "free".to_string(),
                },
                Err(u) => {
                    unknown = true;
                    format!("unknown ({})", u.describe(model))
                }
            };
            rows.push((sig.name.to_string(), value));
        }
        match format {
            EvalFormat::Text => {
                if impossible {
                    println!("# this input vector is excluded by `never`");
                }
                let width = rows
                    .iter()
                    .map(|(n, _)| n.chars().count())
                    .max()
                    .unwrap_or(0);
                for (n, v) in &rows {
                    println!("{n:width$} = {v}");
                }
            }
            EvalFormat::Json => {
                let inputs: serde_json::Map<String, serde_json::Value> = model
                    .inputs
                    .iter()
                    .zip(&vector)
                    .map(|(&s, v)| {
                        (
                            model.signals[s].name.to_string(),
                            json!(u8::from(v.unwrap_or(false))),
                        )
                    })
                    .collect();
                let signals: Vec<_> = rows
                    .iter()
                    .map(|(n, v)| json!({"name": n, "value": v}))
                    .collect();
                let out = json!({"file": doc.name, "inputs": inputs, "impossible": impossible, "signals": signals});
                println!("{}", serde_json::to_string_pretty(&out).unwrap_or_default());
            }
        }
        if unknown {
            ExitCode::from(1)
        } else {
            ExitCode::SUCCESS
        }
    })
}
