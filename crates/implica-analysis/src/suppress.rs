//! Suppression comments: `# implica: quiet RULE, RULE` at the end of a
//! statement's (or table row's) line, or on the line right above it,
//! silences those rules for that statement or row. Text after ` -- ` is a
//! reason, for the reader.

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

/// The rule names of one comment, if it is a suppression comment.
fn parse(c: &Comment) -> Option<Vec<(String, Span)>> {
    let body = c.text.strip_prefix('#')?;
    let lead = body.len() - body.trim_start().len();
    let rest = body.trim_start().strip_prefix(MARKER)?;
    let offset = c.span.start + 1 + lead + MARKER.len();
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
