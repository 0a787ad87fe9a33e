//! Diagnostics of Implica: the rules, their documentation, and the check of
//! one document.
//!
//! ```
//! let diags = implica_analysis::check_source("input a\noutput y\ny = a &\n");
//! assert_eq!(diags.len(), 1);
//! assert_eq!(diags[0].rule, "syntax-error");
//! ```
//!
//! Architecture invariant: the CLI and the language server only present what
//! this crate returns; every rule lives here, one file per rule under
//! `rules/`, with its documentation as the file's doc comment.

pub mod config;
pub mod fixes;
mod forms;
pub mod functions;
pub mod minimal;
pub mod model;
pub mod refactors;
pub mod rules;
pub mod session;
pub mod suppress;

pub use forms::to_bool_expr;
use implica_syntax::ast::SourceFile;
use implica_syntax::{Span, SyntaxError};

/// How serious a diagnostic is.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Hash)]
pub enum Severity {
    Error,
    Warning,
    Info,
    Hint,
}

impl Severity {
    /// The lower-case name used in output formats and configuration.
    pub fn as_str(self) -> &'static str {
        match self {
            Severity::Error => "error",
            Severity::Warning => "warning",
            Severity::Info => "info",
            Severity::Hint => "hint",
        }
    }
}

/// Whether a fix can be applied without review.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Applicability {
    /// Proven not to change any signal's function.
    Safe,
    /// Changes the file's meaning or intent; a person should look first.
    NeedsReview,
}

/// Replace the text at `span` with `new_text`.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Edit {
    pub span: Span,
    pub new_text: String,
}

/// A fix offered with a diagnostic.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Fix {
    pub title: String,
    pub applicability: Applicability,
    pub edits: Vec<Edit>,
}

/// A place related to a diagnostic, with a note.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Related {
    pub span: Span,
    pub message: String,
}

/// One finding in one document.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Diagnostic {
    /// The rule's stable kebab-case name.
    pub rule: &'static str,
    pub severity: Severity,
    pub message: String,
    pub span: Span,
    /// How to fix it, where there is an obvious way.
    pub help: Option<String>,
    pub related: Vec<Related>,
    pub fixes: Vec<Fix>,
}

/// Checks one document's text: syntax errors, then every semantic rule.
/// Fixes that do not pass [`fixes::verify`] are dropped.
pub fn check_source(src: &str) -> Vec<Diagnostic> {
    analyze(src).diagnostics
}

/// The findings of one document, and any internal errors met on the way.
#[derive(Debug, Default)]
pub struct Analysis {
    /// Sorted by position.
    pub diagnostics: Vec<Diagnostic>,
    /// Fixes a rule offered that failed their proof, described: a bug in
    /// that rule, never shown as a fix.
    pub internal_errors: Vec<String>,
}

/// Checks one document's text with the default configuration, reporting
/// internal errors too.
pub fn analyze(src: &str) -> Analysis {
    analyze_with(src, &config::Config::default())
}

/// Checks one document's text under a configuration: rules it turns off
/// do not report, severities are as it sets them, and suppression comments
/// quiet what they name.
pub fn analyze_with(src: &str, config: &config::Config) -> Analysis {
    let (file, errors) = implica_syntax::parse(src);
    analyze_tree(src, &file, errors, config).0
}

/// The analysis of a parsed document, with the functions it computed
/// (`None` when that was cancelled).
fn analyze_tree(
    src: &str,
    file: &SourceFile,
    errors: Vec<SyntaxError>,
    config: &config::Config,
) -> (Analysis, Option<functions::Functions>) {
    let model = model::Model::build(file);
    match functions::Functions::compute(&model, functions::DEFAULT_WORK_PER_DEFINITION, None) {
        Ok(functions) => {
            let mut cache = session::Cache::default();
            let run = run_rules(
                src, file, &model, errors, config, &mut cache, functions, None,
            );
            match run {
                Some((a, f)) => (a, Some(f)),
                None => (Analysis::default(), None),
            }
        }
        Err(_) => (syntax_only(errors), None),
    }
}

/// The syntax errors alone, when there are no functions to check with.
fn syntax_only(errors: Vec<SyntaxError>) -> Analysis {
    Analysis {
        diagnostics: errors
            .into_iter()
            .map(rules::syntax_error::diagnostic)
            .collect(),
        internal_errors: Vec::new(),
    }
}

/// Every rule on a document whose functions are computed, each fix proven;
/// `None` when `cancel` says stop. Gives the functions back, grown by the
/// proofs, for a session to keep.
#[allow(clippy::too_many_arguments)]
fn run_rules(
    src: &str,
    file: &SourceFile,
    model: &model::Model,
    errors: Vec<SyntaxError>,
    config: &config::Config,
    cache: &mut session::Cache,
    mut functions: functions::Functions,
    cancel: Option<&dyn Fn() -> bool>,
) -> Option<(Analysis, functions::Functions)> {
    // Once any computation saw the caller cancel, the driver sees it too,
    // whatever the callback says later: a computation stopped halfway gave
    // nothing, so the analysis must not be returned as whole.
    let seen = std::cell::Cell::new(false);
    let sticky = || {
        if !seen.get() && cancel.is_some_and(|c| c()) {
            seen.set(true);
        }
        seen.get()
    };
    let cancel: Option<&dyn Fn() -> bool> = cancel.map(|_| &sticky as &dyn Fn() -> bool);
    let stop = || cancel.is_some_and(|c| c());
    let config = &*config.for_file(file);
    let mut diagnostics = syntax_only(errors).diagnostics;
    let syntax_errors = diagnostics.len();
    let mut cx = rules::Ctx {
        src,
        config,
        has_syntax_errors: !diagnostics.is_empty(),
        model,
        functions: &mut functions,
        cache,
        cancel,
        forms: Default::default(),
        non_minimal: Default::default(),
    };
    let mut found = Vec::new();
    for check in rules::CHECKS {
        if stop() {
            return None;
        }
        check(&mut cx, &mut found);
    }
    let quiet = suppress::collect(file);
    let mut internal_errors = Vec::new();
    for mut d in found {
        let Some(severity) = config.severity(d.rule) else {
            continue;
        };
        if d.rule != rules::unknown_rule::RULE.name && suppress::quieted(&quiet, d.rule, d.span) {
            continue;
        }
        if config.sets(d.rule) {
            d.severity = severity;
        }
        if stop() {
            return None;
        }
        d.fixes.retain(|fix| {
            match fixes::prove_in(model, &mut functions, src, syntax_errors, fix, cache) {
                Ok(_) => true,
                Err(why) => {
                    internal_errors.push(format!(
                        "{}: the fix \"{}\" was withheld: {why}",
                        d.rule, fix.title
                    ));
                    false
                }
            }
        });
        diagnostics.push(d);
    }
    diagnostics.sort_by_key(|d| (d.span.start, d.span.end));
    let analysis = Analysis {
        diagnostics,
        internal_errors,
    };
    Some((analysis, functions))
}

/// Checks raw bytes: invalid UTF-8 is reported (with its byte offset) and
/// the rest of the document is still checked. Returns the decoded text,
/// whose byte offsets equal those of `bytes`, with the diagnostics.
pub fn check_bytes(bytes: &[u8]) -> (String, Vec<Diagnostic>) {
    let (text, a) = check_bytes_with(bytes, &config::Config::default());
    (text, a.diagnostics)
}

/// [`check_bytes`] under a configuration, with the internal errors.
pub fn check_bytes_with(bytes: &[u8], config: &config::Config) -> (String, Analysis) {
    let c = check_bytes_keeping(bytes, config);
    (c.text, c.analysis)
}

/// A checked document with what its analysis built, for a caller that goes
/// on computing with it (`implica export`).
pub struct Checked {
    /// The decoded text (byte offsets as in the input).
    pub text: String,
    pub file: SourceFile,
    pub analysis: Analysis,
    /// Every signal's function, indexed by the signals of
    /// `Model::build(&file)` (the model is rebuilt the same way from the
    /// same tree); `None` when the analysis was cancelled.
    pub functions: Option<functions::Functions>,
}

/// [`check_bytes_with`], keeping the syntax tree and the functions.
pub fn check_bytes_keeping(bytes: &[u8], config: &config::Config) -> Checked {
    let (text, encoding_error) = implica_syntax::decode(bytes);
    let (file, errors) = implica_syntax::parse(&text);
    let (mut analysis, functions) = analyze_tree(&text, &file, errors, config);
    if let Some(e) = encoding_error {
        analysis
            .diagnostics
            .insert(0, rules::syntax_error::diagnostic(e));
    }
    Checked {
        text,
        file,
        analysis,
        functions,
    }
}

impl From<SyntaxError> for Diagnostic {
    fn from(e: SyntaxError) -> Diagnostic {
        rules::syntax_error::diagnostic(e)
    }
}
