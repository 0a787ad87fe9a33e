//! The parse driver: statement splitting, nesting limit, error conversion
//! and trivia attachment around the chumsky grammar.
//!
//! Architecture invariant: [`parse`] never fails and never panics. It
//! returns a tree for any text, with an [`ItemKind::Error`] node for each
//! statement it could not read, and every error found.
//!
//! Statements need no separators, yet each one starts with a token that can
//! start nothing else: a statement keyword, or a name followed by `=`
//! (expressions contain `==` but never a lone `=`). The splitter cuts the
//! token stream there, so an error in one statement never hides the next,
//! and each statement is parsed on its own.

use crate::ast::*;
use crate::grammar;
use crate::lexer::{Token, TokenKind as Tok, tokens};
use crate::{Span, SyntaxError};
use chumsky::error::{EmptyErr, Rich, RichPattern, RichReason};
use chumsky::input::Input as _;
use chumsky::prelude::*;

/// Deepest nesting of parentheses and `!` accepted in one expression.
/// Deeper input is reported instead of parsed, so that neither the parser
/// nor any later pass over the tree can exhaust the stack.
pub const MAX_NESTING: usize = 128;

/// Parses `src` into a syntax tree and the list of every syntax error.
pub fn parse(src: &str) -> (SourceFile, Vec<SyntaxError>) {
    parse_with(src, true)
}

/// Parses with the combinator grammar alone and its error reporting, without
/// the fast paths (the direct reading of common statements, and the
/// error-free first attempt). It must give exactly what [`parse`] gives;
/// tests and the fuzzer compare the two.
#[doc(hidden)]
pub fn parse_reference(src: &str) -> (SourceFile, Vec<SyntaxError>) {
    parse_with(src, false)
}

fn parse_with(src: &str, fast_path: bool) -> (SourceFile, Vec<SyntaxError>) {
    let mut errors = Vec::new();
    // A statement takes at least 8 bytes but for the shortest; reserving
    // that many up front spares copying a long file's statements as the
    // list grows (capacity never touched costs no memory).
    let mut items = Vec::with_capacity(src.len() / 8 + 8);
    let comments = split_statements(src, |toks, chunks| {
        // Built per batch: the parsers borrow the batch's tokens.
        let fast = grammar::statement::<_, EmptyErr>(src);
        let rich = grammar::statement::<_, Rich<'_, Tok, SimpleSpan>>(src);
        for chunk in chunks {
            items.push(parse_statement(
                src,
                &toks[chunk.clone()],
                fast_path.then_some(&fast),
                &rich,
                &mut errors,
            ));
        }
    });
    let mut file = SourceFile {
        items,
        trailing_comments: Vec::new(),
        span: Span::new(0, src.len()),
    };
    attach_trivia(src, &mut file, &comments);
    errors.sort_by_key(|e: &SyntaxError| (e.span.start, e.span.end));
    errors.dedup_by(|a, b| a.span == b.span && a.message == b.message);
    (file, errors)
}

/// Replaces each byte of an invalid UTF-8 sequence by a space (keeping every
/// byte offset) and reports the first such byte.
pub fn decode(bytes: &[u8]) -> (String, Option<SyntaxError>) {
    match std::str::from_utf8(bytes) {
        Ok(s) => (s.to_string(), None),
        Err(first) => {
            let offset = first.valid_up_to();
            let mut text = String::with_capacity(bytes.len());
            let mut rest = bytes;
            let mut count = 0usize;
            loop {
                match std::str::from_utf8(rest) {
                    Ok(s) => {
                        text.push_str(s);
                        break;
                    }
                    Err(e) => {
                        let (good, bad) = rest.split_at(e.valid_up_to());
                        // `good` was just validated.
                        text.push_str(std::str::from_utf8(good).unwrap_or_default());
                        let n = e.error_len().unwrap_or(bad.len());
                        count += n;
                        text.extend(std::iter::repeat_n(' ', n));
                        rest = &bad[n..];
                    }
                }
            }
            let error = SyntaxError {
                span: Span::new(offset, offset + 1),
                message: format!(
                    "the file is not valid UTF-8: byte {offset} (0x{:02X}) starts an invalid sequence ({count} invalid byte{} in all)",
                    bytes[offset],
                    if count == 1 { "" } else { "s" }
                ),
                help: Some("save the file as UTF-8".to_string()),
                related: Vec::new(),
            };
            (text, Some(error))
        }
    }
}

/// Statements are handed to the parser in batches of about this many
/// tokens, so that the token buffer stays small however long the file.
const BATCH_TOKENS: usize = 1 << 14;

/// Lexes and splits in one pass, without keeping trivia tokens. Complete
/// statements go to `parse_batch` as token ranges, in order, a batch at a
/// time; the comments are returned.
fn split_statements(
    src: &str,
    mut parse_batch: impl FnMut(&[(Tok, SimpleSpan)], &[std::ops::Range<usize>]),
) -> Vec<Comment> {
    let mut significant: Vec<(Tok, SimpleSpan)> = Vec::with_capacity(BATCH_TOKENS + 256);
    let mut chunks = Vec::new();
    let mut comments = Vec::new();
    let mut chunk_start = 0usize;
    // Table/expect body state of the current statement.
    let mut awaiting_body = false;
    let mut body_depth = 0usize;
    for Token { kind, span } in tokens(src) {
        let range = span.range();
        match kind {
            Tok::Whitespace => continue,
            Tok::Comment => {
                // Trailing spaces and a carriage return are not part of the comment.
                let text = src[range.clone()].trim_end();
                comments.push(Comment {
                    text: SmolStr::new(text),
                    span: Span::new(range.start, range.start + text.len()),
                });
                continue;
            }
            Tok::Newline => {
                if body_depth > 0 && significant.last().is_some_and(|t| t.0 != Tok::RowEnd) {
                    significant.push((Tok::RowEnd, (range.start..range.start).into()));
                }
                continue;
            }
            _ => {}
        }
        let prev = significant[chunk_start..].last().map(|t| t.0);
        // Where a new statement starts, if at all: here, or (for `name =`)
        // at the name just pushed.
        let split_at = match kind {
            Tok::KwTable if prev != Some(Tok::KwLet) => Some(significant.len()),
            Tok::KwTable => None,
            k if k.starts_statement() => Some(significant.len()),
            Tok::Assign => {
                let n = significant.len();
                let name = significant[chunk_start..].last().copied();
                let before = (n > chunk_start + 1).then(|| significant[n - 2]);
                match (name, before) {
                    (Some((k, name_span)), before) if k == Tok::Ident || k.is_keyword() => {
                        let before_kind = before.map(|b| b.0);
                        // After `assert` or `never`, `x = y` on the same line is a
                        // mistyped comparison, reported there, not a definition.
                        let comparison = matches!(before_kind, Some(Tok::KwAssert | Tok::KwNever))
                            && before.is_some_and(|b| same_line(src, b.1.end, name_span.start));
                        (before_kind != Some(Tok::KwLet) && !comparison).then_some(n - 1)
                    }
                    _ => None,
                }
            }
            _ => None,
        };
        if let Some(at) = split_at {
            if at > chunk_start {
                chunks.push(chunk_start..at);
            }
            chunk_start = at;
            awaiting_body = false;
            body_depth = 0;
            if chunk_start >= BATCH_TOKENS {
                parse_batch(&significant, &chunks);
                chunks.clear();
                significant.drain(..chunk_start);
                chunk_start = 0;
            }
        }
        match kind {
            Tok::KwTable | Tok::KwExpect => awaiting_body = true,
            Tok::LBrace if awaiting_body || body_depth > 0 => {
                awaiting_body = false;
                body_depth += 1;
            }
            Tok::RBrace if body_depth > 0 => {
                body_depth -= 1;
                if significant.last().is_some_and(|t| t.0 == Tok::RowEnd) {
                    significant.pop();
                }
            }
            _ => {}
        }
        significant.push((kind, (range.start..range.end).into()));
    }
    if significant.len() > chunk_start {
        chunks.push(chunk_start..significant.len());
    }
    parse_batch(&significant, &chunks);
    comments
}

/// Where an expression first nests deeper than [`MAX_NESTING`].
fn too_deep(toks: &[(Tok, SimpleSpan)]) -> Option<SimpleSpan> {
    // Open parentheses, each with the run of `!` before it.
    let mut stack: Vec<usize> = Vec::new();
    let mut run = 0usize;
    let mut depth = 0usize;
    for (kind, span) in toks {
        match kind {
            Tok::Bang | Tok::KwNot => {
                run += 1;
                depth += 1;
            }
            Tok::LParen => {
                stack.push(run);
                run = 0;
                depth += 1;
            }
            Tok::RParen => {
                depth -= run;
                run = 0;
                if let Some(outer) = stack.pop() {
                    depth -= 1 + outer;
                }
            }
            _ => {
                depth -= run;
                run = 0;
            }
        }
        if depth > MAX_NESTING {
            return Some(*span);
        }
    }
    None
}

type Tokens<'t> = chumsky::input::MappedInput<'t, Tok, SimpleSpan, &'t [(Tok, SimpleSpan)]>;

fn parse_statement<'t, F, R>(
    src: &'t str,
    toks: &'t [(Tok, SimpleSpan)],
    fast: Option<&F>,
    rich: &R,
    errors: &mut Vec<SyntaxError>,
) -> Item
where
    F: Parser<'t, Tokens<'t>, ItemKind, extra::Err<EmptyErr>>,
    R: Parser<'t, Tokens<'t>, ItemKind, extra::Err<Rich<'t, Tok, SimpleSpan>>>,
{
    let first = toks[0];
    let last_end = toks
        .iter()
        .rev()
        .find(|t| t.0 != Tok::RowEnd)
        .map_or(first.1.end, |t| t.1.end);
    let span = Span::new(first.1.start, last_end);
    let error_item = Item {
        kind: ItemKind::Error,
        span,
        trivia: Trivia::default(),
    };
    let defines = toks.len() > 1 && toks[1].0 == Tok::Assign;
    if !(first.0.starts_statement() || defines) {
        errors.push(not_a_statement(src, first));
        return error_item;
    }
    if let Some(at) = too_deep(toks) {
        errors.push(SyntaxError {
            span: Span::new(at.start, at.end),
            message: format!(
                "this expression nests more than {MAX_NESTING} levels of parentheses and `!`, the most Implica reads"
            ),
            help: Some("split it into intermediate signals with `let`".to_string()),
            related: Vec::new(),
        });
        return error_item;
    }
    if fast.is_some()
        && let Some(kind) = grammar::statement_direct(src, toks)
    {
        return Item {
            kind,
            span,
            trivia: Trivia::default(),
        };
    }
    let eoi: SimpleSpan = (last_end..last_end).into();
    if let Some(Ok(kind)) = fast.map(|f| f.parse(toks.split_token_span(eoi)).into_result()) {
        return Item {
            kind,
            span,
            trivia: Trivia::default(),
        };
    }
    let (out, errs) = rich.parse(toks.split_token_span(eoi)).into_output_errors();
    // Nothing but blank lines and comments follows.
    let at_file_end = src[last_end..]
        .lines()
        .all(|l| l.trim().is_empty() || l.trim_start().starts_with('#'));
    for e in errs {
        errors.push(convert_error(src, toks, &e, at_file_end));
    }
    match out {
        Some(kind) => Item {
            kind,
            span,
            trivia: Trivia::default(),
        },
        None => error_item,
    }
}

fn not_a_statement(src: &str, (kind, span): (Tok, SimpleSpan)) -> SyntaxError {
    let text = &src[span.start..span.end];
    let help = match kind {
        Tok::Ident => Some(format!(
            "to define `{text}`, write `{text} = expression`; to use it, put it on the right of a definition"
        )),
        Tok::RBrace => Some("this `}` closes nothing; remove it".to_string()),
        Tok::Foreign if text == ";" => {
            Some("statements need no separator; remove the `;`".to_string())
        }
        _ => None,
    };
    SyntaxError {
        span: Span::new(span.start, span.end),
        message: format!(
            "expected a statement (`input`, `output`, `let`, `table`, `never`, `assert`, `expect` or `name = ...`), found {}",
            describe_found(src, Some(kind), span)
        ),
        help,
        related: Vec::new(),
    }
}

fn describe_found(src: &str, kind: Option<Tok>, span: SimpleSpan) -> String {
    match kind {
        None => "the end of the statement".to_string(),
        Some(Tok::RowEnd) => "the end of the row".to_string(),
        Some(k) if k.is_keyword() => format!("the keyword `{}`", &src[span.start..span.end]),
        Some(Tok::Ident) => format!("`{}`", &src[span.start..span.end]),
        Some(Tok::Error) => {
            let text = &src[span.start..span.end];
            let shown: String = text.chars().take(8).flat_map(char::escape_debug).collect();
            if text.chars().count() > 8 {
                format!("the unexpected characters `{shown}…`")
            } else {
                format!(
                    "the unexpected character{} `{shown}`",
                    if text.chars().count() > 1 { "s" } else { "" }
                )
            }
        }
        Some(_) => format!("`{}`", &src[span.start..span.end]),
    }
}

fn is_binary_op(k: Tok) -> bool {
    matches!(
        k,
        Tok::Amp
            | Tok::KwAnd
            | Tok::KwNand
            | Tok::Caret
            | Tok::KwXor
            | Tok::KwXnor
            | Tok::Pipe
            | Tok::KwOr
            | Tok::KwNor
            | Tok::EqEq
            | Tok::NotEq
            | Tok::Implies
    )
}

fn foreign_help(text: &str) -> Option<&'static str> {
    Some(match text {
        "&&" => "`&&` is not an Implica operator; write `&` (or `and`) for AND",
        "||" => "`||` is not an Implica operator; write `|` (or `or`) for OR",
        "~" => "`~` is not an Implica operator; write `!` (or `not`) for NOT",
        "+" => "`+` is not an Implica operator; write `|` (or `or`) for OR",
        "*" => "`*` is not an Implica operator; write `&` (or `and`) for AND",
        "'" => "a postfix `'` is not NOT in Implica; write `!x` (or `not x`)",
        ";" => "statements need no separator; remove the `;`",
        _ => return None,
    })
}

fn convert_error(
    src: &str,
    toks: &[(Tok, SimpleSpan)],
    e: &Rich<'_, Tok, SimpleSpan>,
    at_file_end: bool,
) -> SyntaxError {
    let span = *e.span();
    let mut out = SyntaxError {
        span: Span::new(span.start, span.end),
        message: String::new(),
        help: None,
        related: Vec::new(),
    };
    let (expected, found) = match e.reason() {
        RichReason::Custom(msg) => {
            out.message = msg.clone();
            return out;
        }
        RichReason::ExpectedFound { expected, found } => (expected, found.as_deref().copied()),
    };
    if found == Some(Tok::Foreign)
        && let Some(h) = foreign_help(&src[span.start..span.end])
    {
        out.message = h.to_string();
        return out;
    }
    let mut words: Vec<String> = Vec::new();
    let mut push = |w: String| {
        if !words.contains(&w) {
            words.push(w);
        }
    };
    let wants = |k: Tok| {
        expected
            .iter()
            .any(|p| matches!(p, RichPattern::Token(t) if **t == k))
    };
    let wants_close_paren = wants(Tok::RParen);
    let wants_close_brace = wants(Tok::RBrace);
    let wants_arrow = wants(Tok::Arrow);
    for p in expected {
        match p {
            RichPattern::Token(t) if is_binary_op(**t) => push("an operator".to_string()),
            RichPattern::Token(t) if **t == Tok::RowEnd => push("the end of the row".to_string()),
            RichPattern::Token(t) => push(t.describe().to_string()),
            RichPattern::Label(l) => push(l.to_string()),
            RichPattern::EndOfInput => push("the end of the statement".to_string()),
            RichPattern::Identifier(s) => push(format!("`{s}`")),
            RichPattern::Any => push("more input".to_string()),
            RichPattern::SomethingElse => push("something else".to_string()),
            _ => push("something else".to_string()),
        }
    }
    if words.len() > 1 {
        words.retain(|w| w != "something else" && w != "more input");
    }
    if found == Some(Tok::Error) {
        let text = &src[span.start..span.end];
        let shown: String = text.chars().take(8).flat_map(char::escape_debug).collect();
        out.message = format!(
            "unexpected character{} `{shown}`",
            if text.chars().count() > 1 { "s" } else { "" }
        );
        if !text.is_ascii() {
            out.help = Some("names use ASCII letters, digits and `_` only".to_string());
        }
        return out;
    }
    if found == Some(Tok::Assign) {
        out.message = "unexpected `=` inside an expression".to_string();
        out.help = Some("to compare two signals, write `==`; to define a signal, start a new statement `name = ...`".to_string());
        return out;
    }
    if wants_close_brace
        && found.is_none()
        && let Some(open) = unclosed(before_error(toks, span), Tok::LBrace, Tok::RBrace)
    {
        out.message = "expected `}` to close the table, found the end of the statement".to_string();
        out.help = Some("add `}` after the last row".to_string());
        out.related.push((
            Span::new(open.start, open.end),
            "this `{` is not closed".to_string(),
        ));
        return out;
    }
    if found.is_some() && words == ["the end of the statement"] {
        out.message = format!(
            "expected a new statement, found {} after a complete one",
            describe_found(src, found, span)
        );
        out.help = Some(
            "a statement starts with a keyword or with `name =`; to define a signal, write `name = expression`"
                .to_string(),
        );
        return out;
    }
    let found_text = match found {
        None if at_file_end => "the end of the file".to_string(),
        other => describe_found(src, other, span),
    };
    out.message = if words.is_empty() {
        format!("unexpected {found_text}")
    } else {
        format!("expected {}, found {found_text}", join_or(&words))
    };
    if let Some(k) = found.filter(|k| k.is_keyword())
        && words.iter().any(|w| w == "an expression")
        && !is_binary_op(k)
        && k != Tok::KwNot
    {
        out.help = Some(format!(
            "`{}` is a keyword and cannot be used as a signal name",
            &src[span.start..span.end]
        ));
    }
    if found.is_some()
        && expected
            .iter()
            .any(|p| matches!(p, RichPattern::EndOfInput))
    {
        out.help = Some("a statement starts with a keyword or with `name =`".to_string());
    }
    // Point at the opening delimiter that is never closed.
    let before = before_error(toks, span);
    if wants_close_paren && let Some(open) = unclosed(before, Tok::LParen, Tok::RParen) {
        out.help = Some("add `)` to close the `(`".to_string());
        out.related.push((
            Span::new(open.start, open.end),
            "this `(` is not closed".to_string(),
        ));
    }
    if wants_arrow && out.help.is_none() {
        out.help = Some(
            "write a row as input cells, `->`, output cells, for example `01 -> 1`".to_string(),
        );
    }
    out
}

fn before_error(toks: &[(Tok, SimpleSpan)], at: SimpleSpan) -> &[(Tok, SimpleSpan)] {
    &toks[..toks.partition_point(|t| t.1.start < at.start)]
}

fn unclosed(toks: &[(Tok, SimpleSpan)], open: Tok, close: Tok) -> Option<SimpleSpan> {
    let mut stack = Vec::new();
    for (k, s) in toks {
        if *k == open {
            stack.push(*s);
        } else if *k == close {
            stack.pop();
        }
    }
    stack.pop()
}

fn join_or(words: &[String]) -> String {
    match words {
        [] => String::new(),
        [one] => one.clone(),
        [init @ .., last] => format!("{} or {last}", init.join(", ")),
    }
}

/// Whether only spaces and tabs separate `from` and `to` (no line break).
fn same_line(src: &str, from: usize, to: usize) -> bool {
    !src.as_bytes()[from.min(to)..to].contains(&b'\n')
}

/// Whether the line above the one holding `pos` is blank.
fn blank_line_before(src: &str, pos: usize) -> bool {
    let bytes = src.as_bytes();
    let line_start = bytes[..pos]
        .iter()
        .rposition(|&b| b == b'\n')
        .map_or(0, |i| i + 1);
    if line_start == 0 {
        return false;
    }
    let prev_start = bytes[..line_start - 1]
        .iter()
        .rposition(|&b| b == b'\n')
        .map_or(0, |i| i + 1);
    bytes[prev_start..line_start - 1]
        .iter()
        .all(|b| b.is_ascii_whitespace())
}

fn attach_trivia(src: &str, file: &mut SourceFile, comments: &[Comment]) {
    for item in &mut file.items {
        item.trivia.blank_before = blank_line_before(src, item.span.start);
        if let ItemKind::Table(t) | ItemKind::Expect(t) = &mut item.kind {
            for row in &mut t.rows {
                row.trivia.blank_before = blank_line_before(src, row.span.start);
            }
        }
    }
    for c in comments {
        let next = file
            .items
            .partition_point(|it| it.span.start <= c.span.start);
        if next > 0 {
            let prev = &mut file.items[next - 1];
            if prev.span.end > c.span.start {
                attach_inside(src, prev, c);
                continue;
            }
            if same_line(src, prev.span.end, c.span.start) && prev.trivia.trailing().is_none() {
                prev.trivia.comments_mut().trailing = Some(c.clone());
                continue;
            }
        }
        let blank = blank_line_before(src, c.span.start);
        match file.items.get_mut(next) {
            Some(item) => item.trivia.comments_mut().leading.push((blank, c.clone())),
            None => file.trailing_comments.push((blank, c.clone())),
        }
    }
}

fn attach_inside(src: &str, item: &mut Item, c: &Comment) {
    let table = match &mut item.kind {
        ItemKind::Table(t) | ItemKind::Expect(t) => t,
        _ => {
            item.trivia.comments_mut().interior.push(c.clone());
            return;
        }
    };
    // The body starts at the `{`, which ends the header.
    let body_start = src[item.span.start..c.span.start]
        .find('{')
        .map(|i| item.span.start + i);
    let Some(body_start) = body_start else {
        item.trivia.comments_mut().interior.push(c.clone());
        return;
    };
    let next = table.rows.partition_point(|r| r.span.start <= c.span.start);
    if next > 0 {
        let prev = &mut table.rows[next - 1];
        if prev.span.end > c.span.start {
            item.trivia.comments_mut().interior.push(c.clone());
            return;
        }
        if same_line(src, prev.span.end, c.span.start) && prev.trivia.trailing().is_none() {
            prev.trivia.comments_mut().trailing = Some(c.clone());
            return;
        }
    } else if same_line(src, body_start, c.span.start) && table.open_comment.is_none() {
        table.open_comment = Some(c.clone());
        return;
    }
    let blank = blank_line_before(src, c.span.start);
    match table.rows.get_mut(next) {
        Some(row) => row.trivia.comments_mut().leading.push((blank, c.clone())),
        None => table.closing_comments.push((blank, c.clone())),
    }
}
