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
    let mut out: Vec<Token> = Vec::with_capacity(src.len() / 3 + 1);
    let mut lexer = TokenKind::lexer(src);
    while let Some(result) = lexer.next() {
        let range = lexer.span();
        let span = Span::new(range.start, range.end);
        let kind = result.unwrap_or(TokenKind::Error);
        if kind == TokenKind::Error
            && let Some(last) = out.last_mut()
            && last.kind == TokenKind::Error
            && last.span.end == span.start
        {
            last.span.end = span.end;
            continue;
        }
        out.push(Token { kind, span });
    }
    out
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
