//! Times the exact minimizer on a batch of functions, for side-by-side
//! comparisons (`scripts/bench-vs-sympy`, `scripts/bench-vs-mip`).
//!
//! Reads `{"functions": [{"vars": n, "on": [minterm, ...], "dc": [...]}, ...]}`
//! on stdin and writes `{"results": [{"seconds": s, "runs": k, "terms": t,
//! "literals": l, "proven_minimal": b, "lower_bound": n, "primes": p}, ...]}`
//! on stdout: `seconds` is the median of `k` timed calls of `minimize_sop`
//! with the default budget (repeated until 20 ms have passed and at least 3
//! calls, or 1 s); `lower_bound` is the fewest terms any cover needs, as
//! proven.
//!
//! ```sh
//! cargo run --release -p implica-logic --example minimize_batch < functions.json
//! ```

use implica_logic::{Budget, TruthTable, minimize_sop};
use serde_json::{Value, json};
use std::io::Read;
use std::process::ExitCode;
use std::time::{Duration, Instant};

// The allocator of the `implica` binary, so that times match it.
#[global_allocator]
static GLOBAL: mimalloc::MiMalloc = mimalloc::MiMalloc;

fn table(vars: usize, minterms: &Value) -> Result<TruthTable, String> {
    let mut t = TruthTable::zero(vars);
    for m in minterms.as_array().ok_or("minterms must be a list")? {
        let m = m.as_u64().ok_or("a minterm must be a number")? as usize;
        if m >= 1 << vars {
            return Err(format!("minterm {m} out of range for {vars} inputs"));
        }
        t.set(m, true);
    }
    Ok(t)
}

fn run(input: &str) -> Result<Value, String> {
    let request: Value = serde_json::from_str(input).map_err(|e| format!("bad JSON: {e}"))?;
    let functions = request["functions"]
        .as_array()
        .ok_or("expected {\"functions\": [...]}")?;
    let mut results = Vec::with_capacity(functions.len());
    for f in functions {
        let vars = f["vars"].as_u64().ok_or("each function needs \"vars\"")? as usize;
        if vars > 16 {
            return Err(format!("{vars} inputs: at most 16"));
        }
        let (on, dc) = (table(vars, &f["on"])?, table(vars, &f["dc"])?);
        let budget = Budget::default();
        let mut times = Vec::new();
        let started = Instant::now();
        let result = loop {
            let t = Instant::now();
            let r = minimize_sop(&on, &dc, &budget);
            times.push(t.elapsed());
            let spent = started.elapsed();
            if (spent >= Duration::from_millis(20) && times.len() >= 3)
                || spent >= Duration::from_secs(1)
            {
                break r;
            }
        };
        times.sort();
        let median = times[times.len() / 2];
        results.push(match result {
            Ok(r) => json!({
                "seconds": median.as_secs_f64(),
                "runs": times.len(),
                "terms": r.cover.len(),
                "literals": r.cover.literals(),
                "proven_minimal": r.proven_minimal,
                "lower_bound": r.lower_bound,
                "primes": r.primes,
            }),
            Err(e) => json!({
                "seconds": median.as_secs_f64(),
                "runs": times.len(),
                "too_large": e.reason,
            }),
        });
    }
    Ok(json!({ "results": results }))
}

fn main() -> ExitCode {
    let mut input = String::new();
    if let Err(e) = std::io::stdin().read_to_string(&mut input) {
        eprintln!("minimize_batch: cannot read stdin: {e}");
        return ExitCode::FAILURE;
    }
    match run(&input) {
        Ok(out) => {
            println!("{out}");
            ExitCode::SUCCESS
        }
        Err(e) => {
            eprintln!("minimize_batch: {e}");
            ExitCode::FAILURE
        }
    }
}
