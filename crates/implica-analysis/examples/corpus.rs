//! Writes a corpus of generated specifications for timing `implica check`
//! on many files (scripts/bench-check-corpus):
//!
//! ```sh
//! cargo run --release -p implica-analysis --example corpus -- DIR FILES SIGNALS
//! ```
//!
//! Each file is the analysis benchmark's spec with SIGNALS signals (five
//! lines each, a few of them with a repeated term), about 5 * SIGNALS lines.

#[path = "../benches/common/mod.rs"]
mod common;

fn main() {
    let args: Vec<String> = std::env::args().skip(1).collect();
    let usage = || -> ! {
        eprintln!("usage: corpus DIR FILES SIGNALS");
        std::process::exit(2)
    };
    let [dir, files, signals] = args.as_slice() else {
        usage()
    };
    let (Ok(files), Ok(signals)) = (files.parse::<usize>(), signals.parse::<usize>()) else {
        usage()
    };
    let dir = std::path::Path::new(dir);
    if let Err(e) = std::fs::create_dir_all(dir) {
        eprintln!("corpus: {}: {e}", dir.display());
        std::process::exit(2);
    }
    let text = common::spec(signals, false);
    let mut lines = 0;
    for k in 0..files {
        let path = dir.join(format!("spec_{k:03}.imp"));
        if let Err(e) = std::fs::write(&path, &text) {
            eprintln!("corpus: {}: {e}", path.display());
            std::process::exit(2);
        }
        lines += text.lines().count();
    }
    println!("{files} files, {lines} lines in {}", dir.display());
}
