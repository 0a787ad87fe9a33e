//! # `empty-constraint`
//!
//! **What it finds.** A `never EXPR` whose expression is 0 on every input
//! combination, so that it excludes nothing (it is unsatisfiable); and, at
//! the other extreme, a `never` that excludes every input combination,
//! alone or together with the `never` statements before it.
//!
//! A `never` counts only where it holds for every choice of the
//! don't-cares of the signals it reads (docs/language.md, "Don't-cares"),
//! so one that is 1 only for some choices excludes nothing either; the
//! message says so.
//!
//! **Why it matters.** A constraint that excludes nothing was meant to say
//! something and says nothing: typically two sensor ends that were negated
//! by mistake (`never full & !full`). One that excludes everything is worse:
//! every combination is a don't-care, so every signal is free everywhere
//! and no assertion or test vector is checked at all.
//!
//! **Example.**
//!
//! ```text
//! input  tank_full, tank_empty
//! never  tank_full & !tank_full    # excludes nothing
//! never  tank_full | !tank_full    # excludes every combination
//! ```
//!
//! **Fix.** For a constraint that excludes nothing: remove it (safe: no
//! signal changes, nothing was excluded). For one that excludes
//! everything no fix is offered; correct the expression.
//!
//! Default severity: warning; a constraint that excludes every combination
//! is reported as an error.

use super::{Ctx, Rule, statement_line};
use crate::functions::{DEFAULT_WORK_PER_DEFINITION, Functions};
use crate::model::{Model, Statement};
use crate::{Applicability, Diagnostic, Edit, Fix, Related, Severity};
use implica_logic::{BddRef, Effort, Interrupted};
use implica_syntax::ast::Expr;

pub const RULE: Rule = Rule {
    name: "empty-constraint",
    default_severity: Severity::Warning,
    summary: "a `never` excludes no input combination, or every one",
    source: include_str!("empty_constraint.rs"),
};

/// What one `never` excludes, over the primary inputs.
#[derive(Debug, Clone, Copy)]
pub(crate) struct Excluded {
    /// Where it holds for every choice of the don't-cares: what it adds to
    /// the impossible set.
    pub sure: BddRef,
    /// Where it holds for some choice.
    pub some: BddRef,
}

/// What each `never` statement excludes, in source order; `None` where its
/// expression has no function or its computation ran out of budget.
pub(crate) fn excluded_sets(f: &mut Functions, m: &Model) -> Vec<Option<Excluded>> {
    m.never
        .iter()
        .map(|st| {
            let mut e = Effort::new(DEFAULT_WORK_PER_DEFINITION);
            excluded(f, m, st, &mut e).ok().flatten()
        })
        .collect()
}

fn excluded(
    f: &mut Functions,
    m: &Model,
    st: &Statement<Expr>,
    e: &mut Effort,
) -> Result<Option<Excluded>, Interrupted> {
    let Ok(v) = f.expr_value(m, st.body, e)? else {
        return Ok(None);
    };
    let sure = f.bdd.forall_from(v, f.inputs, e)?;
    let some = f.bdd.exists_from(v, f.inputs, e)?;
    Ok(Some(Excluded { sure, some }))
}

pub(crate) fn check(cx: &mut Ctx, out: &mut Vec<Diagnostic>) {
    let m = cx.model;
    let sets = excluded_sets(cx.functions, m);
    let mut union = BddRef::FALSE;
    let mut union_known = true;
    for (k, (st, set)) in m.never.iter().zip(&sets).enumerate() {
        let Some(x) = set else {
            union_known = false;
            continue;
        };
        if x.sure == BddRef::FALSE {
            let why = if x.some == BddRef::FALSE {
                "it is 0 for every input combination"
            } else {
                "it is 1 only for some choices of the don't-cares it reads, and a `never` counts \
                 only where it holds for every choice"
            };
            let mut d = RULE.at(
                st.body.span,
                format!(
                    "`never {}` excludes nothing: {why}",
                    quoted(cx.src, st.body.span)
                ),
            );
            d.help = Some(
                "write the combination that cannot occur (for example `never a & b`), or remove \
                 the statement"
                    .to_string(),
            );
            d.fixes.push(remove_never(cx.src, st.span));
            out.push(d);
            continue;
        }
        if x.sure == BddRef::TRUE {
            out.push(everything(
                st.body.span,
                format!(
                    "`never {}` excludes every input combination: it is 1 everywhere",
                    quoted(cx.src, st.body.span)
                ),
                Vec::new(),
            ));
            union = BddRef::TRUE;
            continue;
        }
        if union == BddRef::TRUE || !union_known {
            continue;
        }
        let mut e = Effort::new(DEFAULT_WORK_PER_DEFINITION);
        let Ok(next) = cx.functions.bdd.or(union, x.sure, &mut e) else {
            union_known = false;
            continue;
        };
        union = next;
        if union == BddRef::TRUE {
            let related = m.never[..k]
                .iter()
                .map(|o| Related {
                    span: o.body.span,
                    message: "excludes part of the combinations".to_string(),
                })
                .collect();
            out.push(everything(
                st.body.span,
                "together with the `never` statements before it, this one excludes every input \
                 combination"
                    .to_string(),
                related,
            ));
        }
    }
}

/// The text of an expression for a message, on one line and cut short.
pub(crate) fn quoted(src: &str, span: implica_syntax::Span) -> String {
    let text: String = src
        .get(span.start..span.end)
        .unwrap_or("")
        .split_whitespace()
        .collect::<Vec<_>>()
        .join(" ");
    if text.chars().count() > 48 {
        format!("{}...", text.chars().take(45).collect::<String>())
    } else {
        text
    }
}

fn everything(span: implica_syntax::Span, message: String, related: Vec<Related>) -> Diagnostic {
    let mut d = RULE.at(span, message);
    d.severity = Severity::Error;
    d.help = Some(
        "with every combination excluded, every signal is free and no assertion or test vector \
         is checked; a `never` should name only the combinations that cannot occur"
            .to_string(),
    );
    d.related = related;
    d
}

/// The fix that deletes a `never` statement with its line (a comment after
/// it stays).
pub(crate) fn remove_never(src: &str, statement: implica_syntax::Span) -> Fix {
    Fix {
        title: "remove the `never` statement".to_string(),
        applicability: Applicability::Safe,
        edits: vec![Edit {
            span: statement_line(src, statement),
            new_text: String::new(),
        }],
    }
}
