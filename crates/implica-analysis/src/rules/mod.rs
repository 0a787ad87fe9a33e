//! The rules. Each rule is one file whose doc comment is its documentation,
//! shown by `implica explain RULE`.

pub mod assertion_failed;
pub mod constant_signal;
pub mod cyclic_definition;
pub mod duplicate_definition;
pub mod empty_constraint;
pub mod equivalent_signals;
pub mod non_minimal;
pub mod redundant_literal;
pub mod redundant_term;
pub mod shared_terms;
pub mod static_hazard;
pub mod syntax_error;
pub mod table_conflict;
pub mod table_missing_rows;
pub mod table_width;
pub mod undeclared_assignment;
pub mod undefined_output;
pub mod undefined_signal;
pub mod unknown_rule;
pub mod unused_constraint;
pub mod unused_input;
pub mod unused_signal;
pub mod vacuous_input;
pub mod vector_mismatch;

use crate::functions::Functions;
use crate::model::Model;
use crate::{Diagnostic, Severity};
use implica_syntax::Span;

/// A rule's identity and documentation.
#[derive(Debug, Clone, Copy)]
pub struct Rule {
    /// Stable kebab-case name, used in configuration and output.
    pub name: &'static str,
    pub default_severity: Severity,
    /// One line.
    pub summary: &'static str,
    /// The source file of the rule; its `//!` comment is the documentation.
    pub source: &'static str,
}

impl Rule {
    /// The full documentation, in Markdown: the rule file's `//!` comment.
    pub fn documentation(&self) -> String {
        let mut doc = String::new();
        for line in self.source.lines() {
            let Some(rest) = line.strip_prefix("//!") else {
                break;
            };
            doc.push_str(rest.strip_prefix(' ').unwrap_or(rest));
            doc.push('\n');
        }
        doc
    }
}

/// Every rule, in the order `implica rules` lists them.
pub const ALL: &[Rule] = &[
    syntax_error::RULE,
    undefined_signal::RULE,
    duplicate_definition::RULE,
    undefined_output::RULE,
    undeclared_assignment::RULE,
    unused_input::RULE,
    vacuous_input::RULE,
    unused_signal::RULE,
    cyclic_definition::RULE,
    redundant_term::RULE,
    redundant_literal::RULE,
    non_minimal::RULE,
    static_hazard::RULE,
    table_missing_rows::RULE,
    table_conflict::RULE,
    table_width::RULE,
    assertion_failed::RULE,
    vector_mismatch::RULE,
    empty_constraint::RULE,
    unused_constraint::RULE,
    constant_signal::RULE,
    equivalent_signals::RULE,
    shared_terms::RULE,
    unknown_rule::RULE,
];

/// Rules that run only when the configuration turns them on.
pub const OFF_BY_DEFAULT: &[&str] = &["static-hazard"];

/// Whether `name` reads back as one plain name: not a keyword kept by the
/// parser's recovery, so that a fix may write it into new places.
pub(crate) fn is_plain_name(name: &str) -> bool {
    let t = implica_syntax::lexer::lex(name);
    t.len() == 1 && t[0].kind == implica_syntax::lexer::TokenKind::Ident
}

/// The definitions that count (each signal's first) whose right-hand side
/// is an expression, with their ids.
pub(crate) fn expression_definitions<'a, 'f>(
    m: &'a Model<'f>,
) -> impl Iterator<
    Item = (
        usize,
        &'a crate::model::Definition<'f>,
        &'f implica_syntax::ast::Expr,
    ),
> + 'a {
    m.definitions
        .iter()
        .enumerate()
        .filter_map(move |(id, def)| {
            let crate::model::Body::Expr(e) = def.body else {
                return None;
            };
            (m.signals[def.signal].definitions.first() == Some(&id)).then_some((id, def, e))
        })
}

/// What a rule sees of one document.
pub struct Ctx<'a, 'f> {
    pub src: &'a str,
    pub config: &'a crate::config::Config,
    /// Whether the text has syntax errors: rules that report something
    /// missing ("never read") stay quiet then, since the statement that
    /// did not parse may be the one that reads it.
    pub has_syntax_errors: bool,
    pub model: &'a Model<'f>,
    pub functions: &'a mut Functions,
    /// Per-definition results kept from the last analysis (see
    /// [`crate::session`]).
    pub(crate) cache: &'a mut crate::session::Cache,
    /// The caller's cancellation check. The per-definition computations
    /// poll it and give nothing once it says stop (nothing is kept for the
    /// next analysis then); the driver drops the analysis after the rule.
    pub(crate) cancel: Option<&'a dyn Fn() -> bool>,
    /// Expression definitions as functions of the names they read, by
    /// definition, computed once for the rules that need them.
    pub(crate) forms:
        implica_logic::FastMap<usize, Option<std::sync::Arc<crate::forms::ExprFunction>>>,
    /// Whether `non-minimal` reports a definition, with the minimal forms.
    pub(crate) non_minimal: implica_logic::FastMap<usize, Option<std::sync::Arc<MinimalPair>>>,
}

/// The minimal sum of products and product of sums of an expression.
pub(crate) type MinimalPair = (implica_logic::Minimized, implica_logic::Minimized);

impl<'a> Ctx<'a, '_> {
    /// Definition `id`'s expression as a function of the names it reads.
    pub(crate) fn expr_function(
        &mut self,
        id: usize,
        e: &implica_syntax::ast::Expr,
    ) -> Option<std::sync::Arc<crate::forms::ExprFunction>> {
        if let Some(f) = self.forms.get(&id) {
            return f.clone();
        }
        if self.cancel.is_some_and(|c| c()) {
            return None;
        }
        // What the result depends on: the text, the functions of the names
        // it reads (in this manager), and the impossible combinations.
        let def = &self.model.definitions[id];
        let key = crate::session::ValueKey {
            text: self.text_of(e).into(),
            values: def
                .reads
                .iter()
                .map(|&r| {
                    let v = self.functions.value(r).ok().map(|k| k.full);
                    (self.model.signals[r].name.clone(), v)
                })
                .collect(),
            impossible: self.functions.impossible,
        };
        let (model, functions) = (self.model, &mut *self.functions);
        let f = self.cache.expr_functions.get_or(key, || {
            let mut effort = implica_logic::Effort::new(5_000_000);
            crate::forms::expr_function(model, functions, e, &mut effort).map(std::sync::Arc::new)
        });
        self.forms.insert(id, f.clone());
        f
    }

    /// What can be dropped from definition `id`'s expression, with the
    /// expression as a function of its names, for the redundancy rules:
    /// `None` when it is not a two-level form, or when `non-minimal`
    /// reports it (with a fix that goes further). Kept for the next
    /// analysis under the expression's content.
    pub(crate) fn redundancy_target(
        &mut self,
        id: usize,
        e: &implica_syntax::ast::Expr,
    ) -> Option<(
        std::sync::Arc<crate::forms::ExprFunction>,
        std::sync::Arc<crate::forms::Redundancy>,
    )> {
        let f = self.expr_function(id, e)?;
        if self.non_minimal(id, e, &f).is_some() {
            return None;
        }
        let key = crate::session::ShapeKey::new(self.text_of(e), &f.reachable, &self.config.budget);
        let r = self.cache.redundancy.get_or(key, || {
            let t = crate::forms::two_level(e, &f.names)?;
            Some(std::sync::Arc::new(crate::forms::redundancy(&t, &f)))
        })?;
        Some((f, r))
    }

    /// [`crate::forms::non_minimal_applies`] for definition `id`, once, and
    /// kept for the next analysis under the expression's content.
    pub(crate) fn non_minimal(
        &mut self,
        id: usize,
        e: &implica_syntax::ast::Expr,
        f: &crate::forms::ExprFunction,
    ) -> Option<std::sync::Arc<MinimalPair>> {
        if let Some(r) = self.non_minimal.get(&id) {
            return r.clone();
        }
        let budget = &self.config.budget;
        let key = crate::session::ShapeKey::new(self.text_of(e), &f.reachable, budget);
        let cancel = self.cancel;
        let stop = || cancel.is_some_and(|c| c());
        // Cancelled: nothing is kept, and the driver drops the analysis.
        let r = self.cache.non_minimal.try_get_or(key, || {
            crate::forms::non_minimal_applies(e, f, budget, &stop)
                .ok()
                .map(|r| r.map(std::sync::Arc::new))
        })?;
        self.non_minimal.insert(id, r.clone());
        r
    }

    /// The source text of an expression (empty if its span does not fit).
    fn text_of(&self, e: &implica_syntax::ast::Expr) -> &'a str {
        let src: &'a str = self.src;
        src.get(e.span.start..e.span.end).unwrap_or("")
    }
}

/// The semantic rules, run in order on one document.
pub(crate) const CHECKS: &[fn(&mut Ctx, &mut Vec<Diagnostic>)] = &[
    undefined_signal::check,
    duplicate_definition::check,
    undefined_output::check,
    undeclared_assignment::check,
    unused_input::check,
    vacuous_input::check,
    unused_signal::check,
    cyclic_definition::check,
    redundant_term::check,
    redundant_literal::check,
    non_minimal::check,
    static_hazard::check,
    table_missing_rows::check,
    table_conflict::check,
    table_width::check,
    assertion_failed::check,
    vector_mismatch::check,
    empty_constraint::check,
    unused_constraint::check,
    constant_signal::check,
    equivalent_signals::check,
    shared_terms::check,
    unknown_rule::check,
];

impl Rule {
    /// A diagnostic of this rule at its default severity.
    pub(crate) fn at(&self, span: Span, message: String) -> Diagnostic {
        Diagnostic {
            rule: self.name,
            severity: self.default_severity,
            message,
            span,
            help: None,
            related: Vec::new(),
            fixes: Vec::new(),
        }
    }
}

/// The span from `span` through the end of its line's trailing spaces and
/// line break, for deleting a whole statement without leaving a blank line;
/// when a comment follows on the line, only up to the comment, so that it
/// stays.
pub(crate) fn statement_line(src: &str, span: Span) -> Span {
    let rest = &src[span.end..];
    let line_end = rest.find('\n').map_or(src.len(), |i| span.end + i);
    let tail = &src[span.end..line_end];
    if tail.trim().is_empty() {
        let start = src[..span.start].rfind('\n').map_or(0, |i| i + 1);
        let before = &src[start..span.start];
        let end = if line_end < src.len() {
            line_end + 1
        } else {
            line_end
        };
        if before.trim().is_empty() {
            return Span::new(start, end);
        }
        return Span::new(span.start, line_end);
    }
    let code_end = span.end + (tail.len() - tail.trim_start().len());
    Span::new(span.start, code_end)
}

/// The rule named `name`.
pub fn find(name: &str) -> Option<&'static Rule> {
    ALL.iter().find(|r| r.name == name)
}
