//! Shared helpers of the syntax tests.
#![allow(dead_code)]

use implica_syntax::{LineIndex, SyntaxError};
use std::path::{Path, PathBuf};

pub fn repo_root() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("../..")
}

/// The `.imp` files of a directory under the repository root, sorted.
pub fn imp_files(dir: &str) -> Vec<PathBuf> {
    let mut files: Vec<PathBuf> = std::fs::read_dir(repo_root().join(dir))
        .unwrap_or_else(|e| panic!("cannot read {dir}: {e}"))
        .map(|e| e.expect("directory entry").path())
        .filter(|p| p.extension().is_some_and(|e| e == "imp"))
        .collect();
    files.sort();
    assert!(!files.is_empty(), "no .imp files in {dir}");
    files
}

/// Errors as `line:col-line:col message` with 1-based positions.
pub fn render_errors(src: &str, errors: &[SyntaxError]) -> String {
    let index = LineIndex::new(src);
    let pos = |o: usize| {
        let lc = index.line_col(src, o);
        format!("{}:{}", lc.line + 1, lc.col + 1)
    };
    let mut out = String::new();
    for e in errors {
        out.push_str(&format!(
            "{}-{} {}\n",
            pos(e.span.start),
            pos(e.span.end),
            e.message
        ));
        if let Some(h) = &e.help {
            out.push_str(&format!("    help: {h}\n"));
        }
        for (s, m) in &e.related {
            out.push_str(&format!(
                "    related {}-{}: {m}\n",
                pos(s.start),
                pos(s.end)
            ));
        }
    }
    out
}
