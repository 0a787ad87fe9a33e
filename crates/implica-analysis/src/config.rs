//! Project configuration: `implica.toml`, found by walking up from the
//! checked file's directory.
//!
//! ```toml
//! [rules]
//! static-hazard = "warning"   # off by default: turn it on
//! unused-input  = "off"
//! non-minimal   = "info"
//!
//! [minimize]
//! form      = "either"        # which minimal form `non-minimal` offers first: sop, pos or either
//! max-inputs = 16             # most inputs minimized exactly
//! max-work   = 30000000       # search budget of one exact minimization
//! ```
//!
//! Every key is optional. An unknown rule name, severity, key or value is
//! an error in the file, reported with its place; the rest of the file
//! still applies.

use crate::Severity;
use crate::rules::{self, OFF_BY_DEFAULT};
use implica_logic::Budget;
use implica_syntax::Span;
use serde::Deserialize;
use std::collections::BTreeMap;
use std::path::{Path, PathBuf};
use toml::Spanned;

/// The name of the configuration file.
pub const CONFIG_FILE: &str = "implica.toml";

/// Which two-level form a rule prefers when both are minimal.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum PreferredForm {
    Sop,
    Pos,
    /// The one with fewer literals (the sum of products on a tie).
    Either,
}

/// The settings that apply to one document.
#[derive(Debug, Clone)]
pub struct Config {
    /// `None`: the rule is off.
    severities: implica_logic::FastMap<&'static str, Option<Severity>>,
    /// Rules whose severity the configuration sets (the others keep the
    /// severity each diagnostic comes with: a rule may raise its default
    /// for a worse case).
    explicit: implica_logic::FastSet<&'static str>,
    pub form: PreferredForm,
    pub budget: Budget,
}

/// A problem in a configuration file.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct ConfigError {
    /// Byte range in the configuration text.
    pub span: Span,
    pub message: String,
}

impl Default for Config {
    fn default() -> Config {
        let mut severities = implica_logic::FastMap::default();
        for r in rules::ALL {
            let on = !OFF_BY_DEFAULT.contains(&r.name);
            severities.insert(r.name, on.then_some(r.default_severity));
        }
        Config {
            severities,
            explicit: Default::default(),
            form: PreferredForm::Either,
            budget: Budget::default(),
        }
    }
}

#[derive(Deserialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
struct Raw {
    rules: Option<BTreeMap<Spanned<String>, Spanned<String>>>,
    minimize: Option<RawMinimize>,
}

#[derive(Deserialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
struct RawMinimize {
    form: Option<Spanned<String>>,
    max_inputs: Option<Spanned<u64>>,
    max_work: Option<Spanned<u64>>,
}

fn span(r: std::ops::Range<usize>) -> Span {
    Span::new(r.start, r.end)
}

impl Config {
    /// The severity of a rule, or `None` when it is off.
    pub fn severity(&self, rule: &str) -> Option<Severity> {
        self.severities.get(rule).copied().flatten()
    }

    /// Whether the configuration sets this rule's severity.
    pub fn sets(&self, rule: &str) -> bool {
        self.explicit.contains(rule)
    }

    /// Sets a rule's severity (`None`: off); false when there is no such rule.
    pub fn set(&mut self, rule: &str, severity: Option<Severity>) -> bool {
        match rules::find(rule) {
            Some(r) => {
                self.severities.insert(r.name, severity);
                self.explicit.insert(r.name);
                true
            }
            None => false,
        }
    }

    /// The configuration for one document: this one, with the document's
    /// file directives (`# implica: enable RULE` / `disable RULE`) applied
    /// in source order. An enabled rule keeps the severity set here, or
    /// takes its default; names that are not rules are left to
    /// `unknown-rule`, and `syntax-error` cannot be turned off.
    pub fn for_file(&self, file: &implica_syntax::ast::SourceFile) -> std::borrow::Cow<'_, Config> {
        let directives = crate::suppress::directives(file);
        if directives.is_empty() {
            return std::borrow::Cow::Borrowed(self);
        }
        let mut c = self.clone();
        for d in directives {
            for (name, _) in &d.rules {
                let Some(rule) = rules::find(name) else {
                    continue;
                };
                if rule.name == "syntax-error" {
                    continue;
                }
                let severity = if d.enable {
                    Some(self.severity(rule.name).unwrap_or(rule.default_severity))
                } else {
                    None
                };
                c.severities.insert(rule.name, severity);
            }
        }
        std::borrow::Cow::Owned(c)
    }

    /// Reads a configuration text; what cannot be read is reported and
    /// left at its default.
    pub fn parse(text: &str) -> (Config, Vec<ConfigError>) {
        let mut config = Config::default();
        let mut errors = Vec::new();
        let raw: Raw = match toml::from_str(text) {
            Ok(r) => r,
            Err(e) => {
                errors.push(ConfigError {
                    span: e.span().map_or(Span::new(0, 0), span),
                    message: e.message().to_string(),
                });
                return (config, errors);
            }
        };
        for (name, value) in raw.rules.into_iter().flatten() {
            let Some(rule) = rules::find(name.get_ref()) else {
                errors.push(ConfigError {
                    span: span(name.span()),
                    message: format!(
                        "there is no rule `{}` (`implica rules` lists them)",
                        name.get_ref()
                    ),
                });
                continue;
            };
            let setting = match value.get_ref().as_str() {
                "off" => None,
                "error" => Some(Severity::Error),
                "warning" => Some(Severity::Warning),
                "info" => Some(Severity::Info),
                "hint" => Some(Severity::Hint),
                other => {
                    errors.push(ConfigError {
                        span: span(value.span()),
                        message: format!(
                            "`{other}` is not a severity: use error, warning, info, hint or off"
                        ),
                    });
                    continue;
                }
            };
            if rule.name == "syntax-error" && setting != Some(Severity::Error) {
                errors.push(ConfigError {
                    span: span(value.span()),
                    message: "`syntax-error` is always an error".to_string(),
                });
                continue;
            }
            config.severities.insert(rule.name, setting);
            config.explicit.insert(rule.name);
        }
        if let Some(m) = raw.minimize {
            if let Some(form) = m.form {
                match form.get_ref().as_str() {
                    "sop" => config.form = PreferredForm::Sop,
                    "pos" => config.form = PreferredForm::Pos,
                    "either" => config.form = PreferredForm::Either,
                    other => errors.push(ConfigError {
                        span: span(form.span()),
                        message: format!("`{other}` is not a form: use sop, pos or either"),
                    }),
                }
            }
            if let Some(n) = m.max_inputs {
                if (1..=implica_logic::MAX_VARS as u64).contains(n.get_ref()) {
                    config.budget.max_vars = *n.get_ref() as usize;
                } else {
                    errors.push(ConfigError {
                        span: span(n.span()),
                        message: format!(
                            "max-inputs must be from 1 to {}",
                            implica_logic::MAX_VARS
                        ),
                    });
                }
            }
            if let Some(w) = m.max_work {
                config.budget.max_work = *w.get_ref();
            }
        }
        errors.sort_by_key(|e| e.span.start);
        (config, errors)
    }

    /// The configuration file that applies to a file in `dir`: the first
    /// `implica.toml` in `dir` or a directory above it.
    pub fn find(dir: &Path) -> Option<PathBuf> {
        dir.ancestors()
            .map(|d| d.join(CONFIG_FILE))
            .find(|p| p.is_file())
    }
}
