//! Tokens, by [logos].
//!
//! The lexer never fails: a character that starts no token becomes an
//! [`TokenKind::Error`] token, and a few spellings from other notations
//! (`&&`, `~`, `+`) get tokens of their own so the parser can say what to
//! write instead.

use crate::Span;
use logos::Logos;

/// The kind of a token. Trivia (whitespace, line breaks, comments) are tokens too.
#[derive(Logos, Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum TokenKind {
    /// Spaces, tabs, carriage returns, form feeds, and the byte-order mark
    /// some editors put at the start of a UTF-8 file.
    #[regex(r"[ \t\r\f\u{FEFF}]+")]
    Whitespace,
    #[token("\n")]
    Newline,
    #[regex(r"#[^\n]*", allow_greedy = true)]
    Comment,

    #[regex(r"[A-Za-z_][A-Za-z0-9_]*")]
    Ident,
    /// Digits, possibly followed by letters (`0x1F`, `0b01`, or a bad `12ab`).
    #[regex(r"[0-9][0-9A-Za-z_]*")]
    Number,

    #[token("input")]
    KwInput,
    #[token("output")]
    KwOutput,
    #[token("let")]
    KwLet,
    #[token("table")]
    KwTable,
    #[token("never")]
    KwNever,
    #[token("assert")]
    KwAssert,
    #[token("expect")]
    KwExpect,
    #[token("on")]
    KwOn,
    #[token("off")]
    KwOff,
    #[token("dc")]
    KwDc,
    #[token("over")]
    KwOver,
    #[token("unlisted")]
    KwUnlisted,
    #[token("not")]
    KwNot,
    #[token("and")]
    KwAnd,
    #[token("or")]
    KwOr,
    #[token("xor")]
    KwXor,
    #[token("nand")]
    KwNand,
    #[token("nor")]
    KwNor,
    #[token("xnor")]
    KwXnor,

    #[token("(")]
    LParen,
    #[token(")")]
    RParen,
    #[token("{")]
    LBrace,
    #[token("}")]
    RBrace,
    #[token(",")]
    Comma,
    #[token("->")]
    Arrow,
    #[token("-")]
    Dash,
    #[token("..")]
    DotDot,
    #[token("=")]
    Assign,
    #[token("==")]
    EqEq,
    #[token("!=")]
    NotEq,
    #[token("=>")]
    Implies,
    #[token("!")]
    Bang,
    #[token("&")]
    Amp,
    #[token("|")]
    Pipe,
    #[token("^")]
    Caret,

    /// `&&`, `||`, `~`, `+`, `*`, `'`, `;`: not Implica operators; the
    /// parser reports them with the spelling to use instead.
    #[token("&&")]
    #[token("||")]
    #[token("~")]
    #[token("+")]
    #[token("*")]
    #[token("'")]
    #[token(";")]
    Foreign,

    /// Inserted by the statement splitter at line ends inside table and
    /// `expect` bodies, where rows end at the end of a line. Never produced by
    /// the lexer itself.
    RowEnd,
    /// Characters that start no token.
    Error,
}

/// A token: its kind and byte span.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Token {
    pub kind: TokenKind,
    pub span: Span,
}

impl TokenKind {
    /// Whitespace, line breaks and comments.
    pub fn is_trivia(self) -> bool {
        matches!(
            self,
            TokenKind::Whitespace | TokenKind::Newline | TokenKind::Comment
        )
    }

    /// Keywords that begin a statement.
    pub fn starts_statement(self) -> bool {
        matches!(
            self,
            TokenKind::KwInput
                | TokenKind::KwOutput
                | TokenKind::KwLet
                | TokenKind::KwTable
                | TokenKind::KwNever
                | TokenKind::KwAssert
                | TokenKind::KwExpect
        )
    }

    /// Reserved words.
    pub fn is_keyword(self) -> bool {
        use TokenKind::*;
        matches!(
            self,
            KwInput
                | KwOutput
                | KwLet
                | KwTable
                | KwNever
                | KwAssert
                | KwExpect
                | KwOn
                | KwOff
                | KwDc
                | KwOver
                | KwUnlisted
                | KwNot
                | KwAnd
                | KwOr
                | KwXor
                | KwNand
                | KwNor
                | KwXnor
        )
    }

    /// How a token of this kind is named in messages when its text is not shown.
    pub fn describe(self) -> &'static str {
        use TokenKind::*;
        match self {
            Whitespace => "whitespace",
            Newline => "a line break",
            Comment => "a comment",
            Ident => "a name",
            Number => "a number",
            KwInput => "`input`",
            KwOutput => "`output`",
            KwLet => "`let`",
            KwTable => "`table`",
            KwNever => "`never`",
            KwAssert => "`assert`",
            KwExpect => "`expect`",
            KwOn => "`on`",
            KwOff => "`off`",
            KwDc => "`dc`",
            KwOver => "`over`",
            KwUnlisted => "`unlisted`",
            KwNot => "`not`",
            KwAnd => "`and`",
            KwOr => "`or`",
            KwXor => "`xor`",
            KwNand => "`nand`",
            KwNor => "`nor`",
            KwXnor => "`xnor`",
            LParen => "`(`",
            RParen => "`)`",
            LBrace => "`{`",
            RBrace => "`}`",
            Comma => "`,`",
            Arrow => "`->`",
            Dash => "`-`",
            DotDot => "`..`",
            Assign => "`=`",
            EqEq => "`==`",
            NotEq => "`!=`",
            Implies => "`=>`",
            Bang => "`!`",
            Amp => "`&`",
            Pipe => "`|`",
            Caret => "`^`",
            Foreign => "an unknown operator",
            RowEnd => "the end of the row",
            Error => "an unexpected character",
        }
    }
}

/// Splits `src` into tokens, trivia included. Adjacent unknown characters
/// are merged into one [`TokenKind::Error`] token.
pub fn lex(src: &str) -> Vec<Token> {
    tokens(src).collect()
}

/// The tokens of `src`, trivia included, one at a time: what [`lex`]
/// collects and the parser reads.
pub fn tokens(src: &str) -> Tokens<'_> {
    Tokens {
        lexer: TokenKind::lexer(src),
        pending: None,
    }
}

/// The iterator of [`tokens`].
pub struct Tokens<'a> {
    lexer: logos::Lexer<'a, TokenKind>,
    /// A token read while looking for the end of a run of errors.
    pending: Option<Token>,
}

impl Tokens<'_> {
    #[inline]
    fn raw(&mut self) -> Option<Token> {
        let result = self.lexer.next()?;
        let range = self.lexer.span();
        Some(Token {
            kind: result.unwrap_or(TokenKind::Error),
            span: Span::new(range.start, range.end),
        })
    }
}

impl Iterator for Tokens<'_> {
    type Item = Token;

    #[inline]
    fn next(&mut self) -> Option<Token> {
        // Checked before taking: the common path only reads the tag.
        let mut tok = if self.pending.is_some() {
            self.pending.take()?
        } else {
            self.raw()?
        };
        if tok.kind == TokenKind::Error {
            while let Some(next) = self.raw() {
                if next.kind == TokenKind::Error && next.span.start == tok.span.end {
                    tok.span.end = next.span.end;
                } else {
                    self.pending = Some(next);
                    break;
                }
            }
        }
        Some(tok)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn kinds(src: &str) -> Vec<TokenKind> {
        lex(src)
            .into_iter()
            .filter(|t| !t.kind.is_trivia())
            .map(|t| t.kind)
            .collect()
    }

    #[test]
    fn arrow_is_preferred_over_dash() {
        use TokenKind::*;
        assert_eq!(kinds("1-->0"), vec![Number, Dash, Arrow, Number]);
        assert_eq!(kinds("00->0001"), vec![Number, Arrow, Number]);
        assert_eq!(kinds("11--"), vec![Number, Dash, Dash]);
    }

    #[test]
    fn keywords_are_whole_words() {
        use TokenKind::*;
        assert_eq!(kinds("on only nor norm"), vec![KwOn, Ident, KwNor, Ident]);
    }

    #[test]
    fn unknown_characters_merge() {
        let toks = lex("a @@@ b");
        let errors: Vec<_> = toks.iter().filter(|t| t.kind == TokenKind::Error).collect();
        assert_eq!(errors.len(), 1);
        assert_eq!(errors[0].span, Span::new(2, 5));
    }

    #[test]
    fn comment_runs_to_line_end() {
        let toks = lex("a # x & y\nb");
        assert_eq!(toks[2].kind, TokenKind::Comment);
        assert_eq!(toks[2].span, Span::new(2, 9));
    }
}
