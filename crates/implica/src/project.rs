//! The `implica.toml` that applies to each checked file, read once per
//! directory tree; its errors are reported once, on standard error.

use crate::files::Input;
use implica_analysis::config::Config;
use implica_syntax::LineIndex;
use std::collections::HashMap;
use std::path::{Path, PathBuf};
use std::sync::Arc;

#[derive(Default)]
pub struct Configs {
    by_file: HashMap<Option<PathBuf>, Arc<Config>>,
    /// Problems found in configuration files (each also printed).
    pub errors: usize,
}

impl Configs {
    /// The configuration for an input: the nearest `implica.toml` above
    /// the file (above the working directory for standard input), or the
    /// defaults.
    pub fn for_input(&mut self, input: &Input) -> Arc<Config> {
        let dir = match input {
            Input::File(p) => p
                .canonicalize()
                .ok()
                .and_then(|p| p.parent().map(Path::to_path_buf)),
            Input::Stdin => std::env::current_dir().ok(),
        };
        let found = dir.and_then(|d| Config::find(&d));
        if let Some(c) = self.by_file.get(&found) {
            return c.clone();
        }
        let config = match &found {
            None => Config::default(),
            Some(path) => match std::fs::read_to_string(path) {
                Ok(text) => {
                    let (config, errors) = Config::parse(&text);
                    let index = LineIndex::new(&text);
                    for e in &errors {
                        let at = index.line_col(&text, e.span.start);
                        eprintln!(
                            "implica: {}:{}:{}: {}",
                            path.display(),
                            at.line + 1,
                            at.col + 1,
                            e.message
                        );
                    }
                    self.errors += errors.len();
                    config
                }
                Err(e) => {
                    eprintln!("implica: {}: cannot read: {e}", path.display());
                    self.errors += 1;
                    Config::default()
                }
            },
        };
        let config = Arc::new(config);
        self.by_file.insert(found, config.clone());
        config
    }
}
