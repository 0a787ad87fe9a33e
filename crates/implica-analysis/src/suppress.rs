//! Comments that steer the checks.
//!
//! - Suppression: `# implica: quiet RULE, RULE` at the end of a statement's
//!   (or table row's) line, or on the line right above it, silences those
//!   rules for that statement or row.
//! - File directives: `# implica: enable RULE, RULE` and
//!   `# implica: disable RULE, RULE`, anywhere in the file, turn rules on
//!   (at their default severity, or the project's) or off for the whole
//!   file, over the project configuration; of two directives naming one
//!   rule, the later counts.
//!
//! Text after ` -- ` is a reason, for the reader.

use implica_syntax::Span;
use implica_syntax::ast::{Comment, ItemKind, SourceFile, Trivia};

/// The marker that starts a suppression comment, after `#`.
pub const MARKER: &str = "implica: quiet";

/// A statement or row with the rules quieted on it.
pub(crate) struct Quiet {
    pub span: Span,
    /// Each named rule with the place of its name in the comment.
    pub rules: Vec<(String, Span)>,
}

/// The marker of a directive that turns rules on for the file.
pub const ENABLE: &str = "implica: enable";

/// The marker of a directive that turns rules off for the file.
pub const DISABLE: &str = "implica: disable";

/// A file directive: rules turned on (`enable`) or off, each name with its
/// place in the comment.
pub(crate) struct Directive {
    pub enable: bool,
    pub rules: Vec<(String, Span)>,
}

/// The rule names of one comment, if it is a suppression comment.
fn parse(c: &Comment) -> Option<Vec<(String, Span)>> {
    parse_marked(c, MARKER)
}

/// The rule names after `marker` in a comment that starts with it.
fn parse_marked(c: &Comment, marker: &str) -> Option<Vec<(String, Span)>> {
    let body = c.text.strip_prefix('#')?;
    let lead = body.len() - body.trim_start().len();
    let rest = body.trim_start().strip_prefix(marker)?;
    // `implica: enabled` is not the directive.
    if !(rest.is_empty() || rest.starts_with(char::is_whitespace)) {
        return None;
    }
    let offset = c.span.start + 1 + lead + marker.len();
    let list = rest.split(" -- ").next().unwrap_or("");
    let mut out = Vec::new();
    let mut pos = 0;
    for piece in list.split(',') {
        let trimmed = piece.trim();
        if !trimmed.is_empty() {
            let start = offset + pos + (piece.len() - piece.trim_start().len());
            out.push((trimmed.to_string(), Span::new(start, start + trimmed.len())));
        }
        pos += piece.len() + 1;
    }
    Some(out)
}

fn from_trivia(span: Span, trivia: &Trivia, out: &mut Vec<Quiet>) {
    let mut rules = Vec::new();
    if let Some(c) = trivia.trailing() {
        rules.extend(parse(c).into_iter().flatten());
    }
    // The comment right above: the last leading one, with no blank line
    // between it and the statement.
    if !trivia.blank_before
        && let Some((_, c)) = trivia.leading().last()
    {
        rules.extend(parse(c).into_iter().flatten());
    }
    if !rules.is_empty() {
        out.push(Quiet { span, rules });
    }
}

/// Every suppression of a document.
pub(crate) fn collect(file: &SourceFile) -> Vec<Quiet> {
    let mut out = Vec::new();
    for item in &file.items {
        from_trivia(item.span, &item.trivia, &mut out);
        if let ItemKind::Table(t) | ItemKind::Expect(t) = &item.kind {
            for row in &t.rows {
                from_trivia(row.span, &row.trivia, &mut out);
            }
        }
    }
    out
}

/// Whether a diagnostic of `rule` at `span` is quieted.
pub(crate) fn quieted(quiet: &[Quiet], rule: &str, span: Span) -> bool {
    quiet.iter().any(|q| {
        q.span.start <= span.start
            && span.start <= q.span.end
            && q.rules.iter().any(|(r, _)| r == rule)
    })
}

/// Every comment of a document, in source order.
fn comments(file: &SourceFile) -> Vec<&Comment> {
    fn of<'a>(t: &'a Trivia, out: &mut Vec<&'a Comment>) {
        out.extend(t.leading().iter().map(|(_, c)| c));
        out.extend(t.interior());
        out.extend(t.trailing());
    }
    let mut out = Vec::new();
    for item in &file.items {
        of(&item.trivia, &mut out);
        if let ItemKind::Table(t) | ItemKind::Expect(t) = &item.kind {
            for row in &t.rows {
                of(&row.trivia, &mut out);
            }
        }
    }
    out.extend(file.trailing_comments.iter().map(|(_, c)| c));
    out.sort_by_key(|c| c.span.start);
    out
}

/// The file directives of a document, in source order.
pub(crate) fn directives(file: &SourceFile) -> Vec<Directive> {
    comments(file)
        .into_iter()
        .filter_map(|c| {
            if let Some(rules) = parse_marked(c, ENABLE) {
                return Some(Directive {
                    enable: true,
                    rules,
                });
            }
            parse_marked(c, DISABLE).map(|rules| Directive {
                enable: false,
                rules,
            })
        })
        .collect()
}
