//! The statement grammar, by [chumsky].
//!
//! The grammar sees one statement at a time: [`crate::parser`] has already
//! cut the token stream at statement boundaries, so a failure here never
//! spreads to the next statement.

use crate::Span;
use crate::ast::*;
use crate::lexer::TokenKind as Tok;
use chumsky::error::{EmptyErr, LabelError};
use chumsky::input::{Input, ValueInput};
use chumsky::prelude::*;

/// The error types the grammar runs with. Valid statements (nearly all
/// of them) are parsed with [`EmptyErr`], which costs nothing when an
/// alternative fails; a statement with an error is parsed again with
/// [`Rich`] to describe it.
pub(crate) trait GrammarError<'t, I: Input<'t>>:
    chumsky::error::Error<'t, I> + LabelError<'t, I, &'static str> + 't
{
    fn custom_at(span: Span, message: String) -> Self;
}

impl<'t, I> GrammarError<'t, I> for Rich<'t, Tok, SimpleSpan>
where
    I: Input<'t, Token = Tok, Span = SimpleSpan>,
{
    fn custom_at(span: Span, message: String) -> Self {
        Rich::custom(SimpleSpan::from(span.start..span.end), message)
    }
}

impl<'t, I: Input<'t>> GrammarError<'t, I> for EmptyErr {
    fn custom_at(_: Span, _: String) -> Self {
        EmptyErr::default()
    }
}

fn sp(s: SimpleSpan) -> Span {
    Span::new(s.start, s.end)
}

fn custom<'t, I: Input<'t>, Er: GrammarError<'t, I>>(s: Span, msg: impl ToString) -> Er {
    Er::custom_at(s, msg.to_string())
}

fn keyword_as_name(text: &str) -> String {
    format!(
        "`{text}` is a keyword and cannot be used as a signal name; rename it, for example `{text}_1`"
    )
}

/// A signal name in a declaration, a definition target, a table header or
/// an `over` list. Keywords are accepted with an error so the tree keeps
/// the name.
fn decl_name<'t, I, Er>(src: &'t str) -> impl Parser<'t, I, Name, extra::Err<Er>> + Clone
where
    I: ValueInput<'t, Token = Tok, Span = SimpleSpan>,
    Er: GrammarError<'t, I>,
{
    any()
        .filter(|k: &Tok| {
            *k == Tok::Ident || (k.is_keyword() && (!k.starts_statement() || *k == Tok::KwTable))
        })
        .validate(move |k, e, emitter| {
            let span = sp(e.span());
            let text = &src[span.range()];
            if k != Tok::Ident {
                emitter.emit(custom(span, keyword_as_name(text)));
            }
            Name {
                text: SmolStr::new(text),
                span,
            }
        })
        .labelled("a signal name")
}

/// A name in an expression. A keyword there is an error of the expression
/// (reported with a hint by the parse driver), not a name.
fn expr_name<'t, I, Er>(src: &'t str) -> impl Parser<'t, I, Name, extra::Err<Er>> + Clone
where
    I: ValueInput<'t, Token = Tok, Span = SimpleSpan>,
    Er: GrammarError<'t, I>,
{
    any()
        .filter(|k: &Tok| *k == Tok::Ident)
        .map_with(move |_, e| {
            let span = sp(e.span());
            Name {
                text: SmolStr::new(&src[span.range()]),
                span,
            }
        })
}

fn name_list<'t, I, Er>(src: &'t str) -> impl Parser<'t, I, Vec<Name>, extra::Err<Er>> + Clone
where
    I: ValueInput<'t, Token = Tok, Span = SimpleSpan>,
    Er: GrammarError<'t, I>,
{
    decl_name(src)
        .separated_by(just(Tok::Comma))
        .allow_trailing()
        .at_least(1)
        .collect::<Vec<_>>()
}

/// Adds `op rhs` to `lhs`: to its chain when `lhs` is a chain of the same
/// precedence level (not parenthesized), else to a new chain.
fn extend_chain(lhs: Expr, op: OpToken, rhs: Expr) -> Expr {
    let span = lhs.span.to(rhs.span);
    match lhs.kind {
        ExprKind::Chain {
            mut operands,
            mut ops,
        } if ops[0].op.precedence() == op.op.precedence() => {
            ops.push(op);
            operands.push(rhs);
            Expr {
                kind: ExprKind::Chain { operands, ops },
                span,
            }
        }
        kind => Expr {
            kind: ExprKind::Chain {
                operands: vec![
                    Expr {
                        kind,
                        span: lhs.span,
                    },
                    rhs,
                ],
                ops: vec![op],
            },
            span,
        },
    }
}

/// The first chain, outside parentheses, that mixes a non-associative
/// operator with another operator of its level.
fn unchainable(e: &Expr) -> Option<(OpToken, OpToken, OpToken)> {
    match &e.kind {
        ExprKind::Chain { operands, ops } => {
            if ops.len() > 1
                && let Some(bad) = ops.iter().find(|o| !o.op.chains())
            {
                return Some((*bad, ops[0], ops[1]));
            }
            operands.iter().find_map(unchainable)
        }
        ExprKind::Not { operand, .. } => unchainable(operand),
        // Checked when the parenthesized expression itself was parsed.
        _ => None,
    }
}

fn unchainable_message(bad: OpToken, o1: OpToken, o2: OpToken) -> String {
    let (o1, o2) = (o1.op.spelling(o1.word), o2.op.spelling(o2.word));
    if bad.op == BinOp::Xnor {
        format!(
            "`xnor` needs parentheses when chained with another operator of its level, \
             since `a xnor b xnor c` is easily misread as \"all three equal\": \
             write `(a {o1} b) {o2} c` or `a {o1} (b {o2} c)`"
        )
    } else {
        let name = bad.op.spelling(true);
        format!(
            "`{name}` is not associative, so it needs parentheses when chained with \
             another operator of its level: write `(a {o1} b) {o2} c` or `a {o1} (b {o2} c)`"
        )
    }
}

/// Expressions, by precedence (tightest first): `!`/`not`; `&`/`and`/`nand`;
/// `^`/`xor`/`xnor`; `|`/`or`/`nor`; `==`/`!=`; `=>`.
///
/// A Pratt parser over one operator table. Every level folds into a flat
/// chain (so `=>` is folded like the others; its grouping to the right is
/// applied by consumers of [`ExprKind::Chain`]).
pub(crate) fn expr<'t, I, Er>(src: &'t str) -> impl Parser<'t, I, Expr, extra::Err<Er>> + Clone
where
    I: ValueInput<'t, Token = Tok, Span = SimpleSpan>,
    Er: GrammarError<'t, I>,
{
    use chumsky::pratt::{infix, left, prefix};
    recursive(move |expr| {
        let constant = just(Tok::Number).validate(move |_, e, emitter| {
            let span = sp(e.span());
            match &src[span.range()] {
                "0" => Expr {
                    kind: ExprKind::Const(false),
                    span,
                },
                "1" => Expr {
                    kind: ExprKind::Const(true),
                    span,
                },
                text => {
                    emitter.emit(custom(
                        span,
                        format!("`{text}` is not a value: the only constants are `0` and `1`"),
                    ));
                    Expr {
                        kind: ExprKind::Error,
                        span,
                    }
                }
            }
        });
        let paren = expr
            .delimited_by(just(Tok::LParen), just(Tok::RParen))
            .map_with(|inner: Expr, e| Expr {
                kind: ExprKind::Paren(Box::new(inner)),
                span: sp(e.span()),
            })
            .recover_with(via_parser(nested_delimiters(
                Tok::LParen,
                Tok::RParen,
                [(Tok::LBrace, Tok::RBrace)],
                |s| Expr {
                    kind: ExprKind::Error,
                    span: sp(s),
                },
            )));
        let atom = choice((
            expr_name(src).map(|n| Expr {
                span: n.span,
                kind: ExprKind::Name(n),
            }),
            constant,
            paren,
        ))
        .labelled("an expression")
        .boxed();
        let op =
            |(op, word): (BinOp, bool),
             e: &mut chumsky::input::MapExtra<'t, '_, I, extra::Err<Er>>| OpToken {
                op,
                word,
                span: sp(e.span()),
            };
        let and_ops = select! { Tok::Amp => (BinOp::And, false), Tok::KwAnd => (BinOp::And, true), Tok::KwNand => (BinOp::Nand, true) }.map_with(op);
        let xor_ops = select! { Tok::Caret => (BinOp::Xor, false), Tok::KwXor => (BinOp::Xor, true), Tok::KwXnor => (BinOp::Xnor, true) }.map_with(op);
        let or_ops = select! { Tok::Pipe => (BinOp::Or, false), Tok::KwOr => (BinOp::Or, true), Tok::KwNor => (BinOp::Nor, true) }.map_with(op);
        let eq_ops = select! { Tok::EqEq => (BinOp::Eq, false), Tok::NotEq => (BinOp::Ne, false) }
            .map_with(op);
        let implies_ops = select! { Tok::Implies => (BinOp::Implies, false) }.map_with(op);
        let not =
            select! { Tok::Bang => false, Tok::KwNot => true }.map_with(|w, e| (w, sp(e.span())));
        atom.pratt((
            prefix(6, not, |(word, span): (bool, Span), operand: Expr, _| {
                Expr {
                    span: span.to(operand.span),
                    kind: ExprKind::Not {
                        word,
                        operand: Box::new(operand),
                    },
                }
            }),
            infix(left(5), and_ops, |l, o, r, _| extend_chain(l, o, r)),
            infix(left(4), xor_ops, |l, o, r, _| extend_chain(l, o, r)),
            infix(left(3), or_ops, |l, o, r, _| extend_chain(l, o, r)),
            infix(left(2), eq_ops, |l, o, r, _| extend_chain(l, o, r)),
            infix(left(1), implies_ops, |l, o, r, _| extend_chain(l, o, r)),
        ))
        .validate(|e: Expr, _, emitter| {
            if let Some((bad, o1, o2)) = unchainable(&e) {
                emitter.emit(custom(bad.span, unchainable_message(bad, o1, o2)));
            }
            e
        })
    })
}

/// The operator a token stands for, and whether it is spelt as a word.
fn binary_op(t: Tok) -> Option<(BinOp, bool)> {
    Some(match t {
        Tok::Amp => (BinOp::And, false),
        Tok::KwAnd => (BinOp::And, true),
        Tok::KwNand => (BinOp::Nand, true),
        Tok::Caret => (BinOp::Xor, false),
        Tok::KwXor => (BinOp::Xor, true),
        Tok::KwXnor => (BinOp::Xnor, true),
        Tok::Pipe => (BinOp::Or, false),
        Tok::KwOr => (BinOp::Or, true),
        Tok::KwNor => (BinOp::Nor, true),
        Tok::EqEq => (BinOp::Eq, false),
        Tok::NotEq => (BinOp::Ne, false),
        Tok::Implies => (BinOp::Implies, false),
        _ => return None,
    })
}

fn number<'t, I, Er>(src: &'t str) -> impl Parser<'t, I, Number, extra::Err<Er>> + Clone
where
    I: ValueInput<'t, Token = Tok, Span = SimpleSpan>,
    Er: GrammarError<'t, I>,
{
    just(Tok::Number)
        .validate(move |_, e, emitter| {
            let span = sp(e.span());
            let text = &src[span.range()];
            let value = parse_number(text);
            if value.is_none() {
                emitter.emit(custom(
                    span,
                    format!(
                        "`{text}` is not a row number; write it in decimal (`12`), hex (`0xC`) or binary (`0b1100`), below 2^64"
                    ),
                ));
            }
            Number {
                text: text.to_string(),
                value,
                span,
            }
        })
        .labelled("a row number")
}

/// The value of a row number: decimal, `0x` hex or `0b` binary.
pub fn parse_number(text: &str) -> Option<u64> {
    let (digits, radix) =
        if let Some(h) = text.strip_prefix("0x").or_else(|| text.strip_prefix("0X")) {
            (h, 16)
        } else if let Some(b) = text.strip_prefix("0b").or_else(|| text.strip_prefix("0B")) {
            (b, 2)
        } else {
            (text, 10)
        };
    if digits.is_empty() || !digits.chars().all(|c| c.is_digit(radix)) {
        return None;
    }
    u64::from_str_radix(digits, radix).ok()
}

fn term_list<'t, I, Er>(src: &'t str) -> impl Parser<'t, I, TermList, extra::Err<Er>> + Clone
where
    I: ValueInput<'t, Token = Tok, Span = SimpleSpan>,
    Er: GrammarError<'t, I>,
{
    let entry = number(src)
        .then(just(Tok::DotDot).ignore_then(number(src)).or_not())
        .map(|(a, b)| match b {
            Some(b) => TermEntry::Range(a, b),
            None => TermEntry::Single(a),
        });
    let part = select! { Tok::KwOn => TermKind::On, Tok::KwOff => TermKind::Off, Tok::KwDc => TermKind::Dc }
        .then(
            entry
                .separated_by(just(Tok::Comma))
                .allow_trailing()
                .collect::<Vec<_>>()
                .delimited_by(just(Tok::LParen), just(Tok::RParen)),
        )
        .map_with(|(kind, entries), e| TermPart {
            kind,
            entries,
            span: sp(e.span()),
        });
    let over = just(Tok::KwOver)
        .ignore_then(name_list(src).delimited_by(just(Tok::LParen), just(Tok::RParen)));
    part.repeated()
        .at_least(1)
        .collect::<Vec<_>>()
        .then(over)
        .validate(|(parts, over), e, emitter| {
            let span = sp(e.span());
            let count = |k: TermKind| parts.iter().filter(|p| p.kind == k).count();
            let (on, off, dc) = (count(TermKind::On), count(TermKind::Off), count(TermKind::Dc));
            if on + off == 0 {
                emitter.emit(custom(
                    span,
                    "a row list needs an `on(...)` list (rows that are 1) or an `off(...)` list (rows that are 0)",
                ));
            } else if on > 0 && off > 0 {
                let second = parts.iter().find(|p| p.kind == TermKind::Off).map_or(span, |p| p.span);
                emitter.emit(custom(
                    second,
                    "give either `on(...)` or `off(...)`, not both: the rows not listed take the other value",
                ));
            }
            for (kind, n) in [(TermKind::On, on), (TermKind::Off, off), (TermKind::Dc, dc)] {
                if n > 1 {
                    let second = parts.iter().filter(|p| p.kind == kind).nth(1).map_or(span, |p| p.span);
                    let kw = kind.keyword();
                    emitter.emit(custom(
                        second,
                        format!("`{kw}(...)` is given more than once; merge the lists into one"),
                    ));
                }
            }
            // Row numbers must exist over the listed signals.
            let rows = if over.len() >= 64 { u64::MAX } else { (1u64 << over.len()) - 1 };
            for part in &parts {
                for entry in &part.entries {
                    let (lo, hi) = match entry {
                        TermEntry::Single(n) => (n, n),
                        TermEntry::Range(a, b) => (a, b),
                    };
                    if let (Some(l), Some(h)) = (lo.value, hi.value)
                        && l > h {
                            emitter.emit(custom(
                                lo.span.to(hi.span),
                                format!("the range `{}..{}` is empty: write the smaller row number first", lo.text, hi.text),
                            ));
                        }
                    for n in [lo, hi] {
                        if n.value.is_some_and(|v| v > rows) {
                            emitter.emit(custom(
                                n.span,
                                format!(
                                    "row {} does not exist: over {} signal{}, the rows are 0 to {rows}",
                                    n.text,
                                    over.len(),
                                    if over.len() == 1 { "" } else { "s" }
                                ),
                            ));
                        }
                    }
                }
            }
            TermList { parts, over, span }
        })
}

/// `(a, b -> y) { rows }`, shared by `table` and `expect`.
fn table_body<'t, I, Er>(
    src: &'t str,
    allow_unlisted: bool,
) -> impl Parser<'t, I, Table, extra::Err<Er>> + Clone
where
    I: ValueInput<'t, Token = Tok, Span = SimpleSpan>,
    Er: GrammarError<'t, I>,
{
    let header = name_list(src)
        .or_not()
        .map(Option::unwrap_or_default)
        .then_ignore(just(Tok::Arrow))
        .then(name_list(src))
        .delimited_by(just(Tok::LParen), just(Tok::RParen));
    // A packed run such as `0101` lexes as one number: the cells of a side
    // are its `0`/`1` runs and dashes, split into one cell per character.
    let cells = select! { Tok::Number = e => sp(e.span()), Tok::Dash = e => sp(e.span()) }
        .labelled("a table cell")
        .repeated()
        .collect::<Vec<Span>>()
        .validate(move |runs, _, emitter| {
            let mut cells = Vec::with_capacity(runs.len());
            for run in runs {
                for (i, c) in src[run.range()].char_indices() {
                    let span = Span::new(run.start + i, run.start + i + c.len_utf8());
                    let value = match c {
                        '0' => CellValue::Zero,
                        '1' => CellValue::One,
                        '-' => CellValue::Dash,
                        _ => {
                            emitter.emit(custom(
                                span,
                                format!("`{c}` is not a table cell: cells are `0`, `1` or `-`"),
                            ));
                            continue;
                        }
                    };
                    cells.push(Cell { value, span });
                }
            }
            cells
        });
    let cell_row = cells
        .then_ignore(just(Tok::Arrow))
        .then(cells)
        .map(|(inputs, outputs)| RowKind::Cells { inputs, outputs });
    let unlisted = just(Tok::KwUnlisted)
        .map_with(|_, e| sp(e.span()))
        .then_ignore(just(Tok::Arrow))
        .then(cells)
        .validate(move |(kw, outputs), _, emitter| {
            if !allow_unlisted {
                emitter.emit(custom(
                    kw,
                    "`unlisted` rows belong in tables; test vectors check only the rows they list",
                ));
            }
            RowKind::Unlisted { outputs }
        });
    let row = unlisted
        .or(cell_row)
        .map_with(|kind, e| Row {
            kind,
            span: sp(e.span()),
            trivia: Trivia::default(),
        })
        .recover_with(via_parser(
            none_of([Tok::RowEnd, Tok::RBrace])
                .repeated()
                .at_least(1)
                .map_with(|_, e| Row {
                    kind: RowKind::Error,
                    span: sp(e.span()),
                    trivia: Trivia::default(),
                }),
        ));
    let row_ends = just(Tok::RowEnd).repeated();
    let rows = row_ends.ignore_then(row.then_ignore(row_ends).repeated().collect::<Vec<_>>());
    header
        .then(rows.delimited_by(just(Tok::LBrace), just(Tok::RBrace)))
        .validate(|((inputs, outputs), rows): ((Vec<Name>, Vec<Name>), Vec<Row>), _, emitter| {
            let mut unlisted = rows.iter().filter(|r| matches!(r.kind, RowKind::Unlisted { .. }));
            if let (Some(_), Some(second)) = (unlisted.next(), unlisted.next()) {
                emitter.emit(custom(
                    second.span,
                    "a table has at most one `unlisted` row; remove this one or merge it with the first",
                ));
            }
            ((inputs, outputs), rows)
        })
        .map(|((inputs, outputs), rows)| Table::parsed(inputs, outputs, rows))
}

/// One statement, up to the end of its token chunk.
pub(crate) fn statement<'t, I, Er>(
    src: &'t str,
) -> impl Parser<'t, I, ItemKind, extra::Err<Er>> + Clone
where
    I: ValueInput<'t, Token = Tok, Span = SimpleSpan>,
    Er: GrammarError<'t, I>,
{
    let expr = expr(src).boxed();
    let decl = select! { Tok::KwInput => true, Tok::KwOutput => false }
        .then(name_list(src).labelled("a signal name"))
        .map(|(is_input, names)| {
            if is_input {
                ItemKind::Input(Decl { names })
            } else {
                ItemKind::Output(Decl { names })
            }
        });
    let rhs = term_list(src)
        .map(Rhs::Terms)
        .or(expr.clone().map(Rhs::Expr));
    let define = decl_name(src).then_ignore(just(Tok::Assign)).then(rhs);
    let table = just(Tok::KwTable).ignore_then(table_body(src, true));
    let let_stmt = just(Tok::KwLet)
        .map_with(|_, e| sp(e.span()))
        .then(
            table
                .clone()
                .map(either::Left)
                .or(define.clone().map(either::Right)),
        )
        .map(|(let_span, body)| match body {
            either::Left(mut t) => {
                t.let_span = Some(let_span);
                ItemKind::Table(Box::new(t))
            }
            either::Right((target, rhs)) => ItemKind::Define(Define {
                let_span: Some(let_span),
                target,
                rhs,
            }),
        });
    let define = define.map(|(target, rhs)| {
        ItemKind::Define(Define {
            let_span: None,
            target,
            rhs,
        })
    });
    let never = just(Tok::KwNever)
        .ignore_then(expr.clone())
        .map(ItemKind::Never);
    let assert = just(Tok::KwAssert).ignore_then(expr).map(ItemKind::Assert);
    let expect = just(Tok::KwExpect)
        .ignore_then(table_body(src, false))
        .map(|t| ItemKind::Expect(Box::new(t)));
    choice((
        decl,
        let_stmt,
        table.map(|t| ItemKind::Table(Box::new(t))),
        never,
        assert,
        expect,
        define,
    ))
    .then_ignore(end())
}

mod either {
    pub enum Either<L, R> {
        Left(L),
        Right(R),
    }
    pub use Either::{Left, Right};
}

/// Statements read straight off their tokens, without the combinators:
/// declarations, definitions (by expression or term list), tables, test
/// vectors, `never` and `assert`. It accepts only what [`statement`]
/// accepts without error and builds the same tree; on anything else
/// (keywords used as names, any error) it returns `None` and the statement
/// goes to the combinator grammar, which describes the error. The tests and the fuzzer
/// compare [`crate::parse`] with `parse_reference`, which never takes this
/// path.
pub(crate) fn statement_direct(src: &str, toks: &[(Tok, SimpleSpan)]) -> Option<ItemKind> {
    let mut c = Cursor { src, toks, at: 0 };
    let kind = match c.peek()? {
        Tok::KwInput | Tok::KwOutput => {
            let is_input = c.next()?.0 == Tok::KwInput;
            let decl = Decl { names: c.names()? };
            if is_input {
                ItemKind::Input(decl)
            } else {
                ItemKind::Output(decl)
            }
        }
        Tok::KwNever => {
            c.next();
            ItemKind::Never(c.climb(1)?)
        }
        Tok::KwAssert => {
            c.next();
            ItemKind::Assert(c.climb(1)?)
        }
        Tok::KwTable => {
            c.next();
            ItemKind::Table(Box::new(c.table(true)?))
        }
        Tok::KwExpect => {
            c.next();
            ItemKind::Expect(Box::new(c.table(false)?))
        }
        Tok::KwLet if c.toks.get(1).map(|t| t.0) == Some(Tok::KwTable) => {
            let let_span = Some(c.next()?.1);
            c.next();
            let mut t = c.table(true)?;
            t.let_span = let_span;
            ItemKind::Table(Box::new(t))
        }
        Tok::KwLet | Tok::Ident => {
            let let_span = if c.peek() == Some(Tok::KwLet) {
                Some(c.next()?.1)
            } else {
                None
            };
            let target = c.name()?;
            if c.next()?.0 != Tok::Assign {
                return None;
            }
            let rhs = match c.peek()? {
                Tok::KwOn | Tok::KwOff | Tok::KwDc => Rhs::Terms(c.term_list()?),
                _ => Rhs::Expr(c.climb(1)?),
            };
            ItemKind::Define(Define {
                let_span,
                target,
                rhs,
            })
        }
        _ => return None,
    };
    // Every token read, or the statement is not what it seemed.
    (c.at == toks.len()).then_some(kind)
}

/// A position in one statement's tokens, for [`statement_direct`].
struct Cursor<'s, 't> {
    src: &'s str,
    toks: &'t [(Tok, SimpleSpan)],
    at: usize,
}

impl Cursor<'_, '_> {
    fn peek(&self) -> Option<Tok> {
        self.toks.get(self.at).map(|t| t.0)
    }

    fn next(&mut self) -> Option<(Tok, Span)> {
        let &(t, s) = self.toks.get(self.at)?;
        self.at += 1;
        Some((t, sp(s)))
    }

    /// The next token, when it is `kind`.
    fn expect(&mut self, kind: Tok) -> Option<Span> {
        match self.next()? {
            (k, span) if k == kind => Some(span),
            _ => None,
        }
    }

    /// Names separated by commas, at least one, a trailing comma allowed.
    fn names(&mut self) -> Option<Vec<Name>> {
        let mut names = vec![self.name()?];
        while self.peek() == Some(Tok::Comma) {
            self.next();
            if self.peek() != Some(Tok::Ident) {
                break;
            }
            names.push(self.name()?);
        }
        Some(names)
    }

    /// A valid row number.
    fn number(&mut self) -> Option<Number> {
        let span = self.expect(Tok::Number)?;
        let text = &self.src[span.range()];
        Some(Number {
            text: text.to_string(),
            value: Some(parse_number(text)?),
            span,
        })
    }

    /// `on(...) dc(...) over (...)`, with the checks of [`term_list`]: one
    /// of `on` and `off`, no list twice, row numbers that exist, ranges in
    /// order.
    fn term_list(&mut self) -> Option<TermList> {
        let start = sp(self.toks.get(self.at)?.1);
        let mut parts = Vec::new();
        while let Some(kind) = self.peek().and_then(|k| match k {
            Tok::KwOn => Some(TermKind::On),
            Tok::KwOff => Some(TermKind::Off),
            Tok::KwDc => Some(TermKind::Dc),
            _ => None,
        }) {
            let (_, kw) = self.next()?;
            self.expect(Tok::LParen)?;
            let mut entries = Vec::new();
            while self.peek() != Some(Tok::RParen) {
                let a = self.number()?;
                entries.push(if self.peek() == Some(Tok::DotDot) {
                    self.next();
                    TermEntry::Range(a, self.number()?)
                } else {
                    TermEntry::Single(a)
                });
                if self.peek() != Some(Tok::Comma) {
                    break;
                }
                self.next();
            }
            let close = self.expect(Tok::RParen)?;
            parts.push(TermPart {
                kind,
                entries,
                span: kw.to(close),
            });
        }
        self.expect(Tok::KwOver)?;
        self.expect(Tok::LParen)?;
        let over = self.names()?;
        let close = self.expect(Tok::RParen)?;
        let count = |k: TermKind| parts.iter().filter(|p| p.kind == k).count();
        let (on, off, dc) = (
            count(TermKind::On),
            count(TermKind::Off),
            count(TermKind::Dc),
        );
        if on + off != 1 || dc > 1 {
            return None;
        }
        let rows = if over.len() >= 64 {
            u64::MAX
        } else {
            (1u64 << over.len()) - 1
        };
        for entry in parts.iter().flat_map(|p| &p.entries) {
            let (lo, hi) = match entry {
                TermEntry::Single(n) => (n.value?, n.value?),
                TermEntry::Range(a, b) => (a.value?, b.value?),
            };
            if lo > hi || hi > rows {
                return None;
            }
        }
        Some(TermList {
            parts,
            over,
            span: start.to(close),
        })
    }

    /// `(a, b -> y) { rows }`, with the checks of [`table_body`].
    fn table(&mut self, allow_unlisted: bool) -> Option<Table> {
        self.expect(Tok::LParen)?;
        let inputs = if self.peek() == Some(Tok::Arrow) {
            Vec::new()
        } else {
            self.names()?
        };
        self.expect(Tok::Arrow)?;
        let outputs = self.names()?;
        self.expect(Tok::RParen)?;
        self.expect(Tok::LBrace)?;
        let mut rows = Vec::new();
        let mut unlisted = 0;
        loop {
            while self.peek() == Some(Tok::RowEnd) {
                self.next();
            }
            if self.peek()? == Tok::RBrace {
                self.next();
                break;
            }
            let start = sp(self.toks.get(self.at)?.1);
            let kind = if self.peek() == Some(Tok::KwUnlisted) {
                self.next();
                unlisted += 1;
                if !allow_unlisted || unlisted > 1 {
                    return None;
                }
                self.expect(Tok::Arrow)?;
                RowKind::Unlisted {
                    outputs: self.cells()?,
                }
            } else {
                let inputs = self.cells()?;
                self.expect(Tok::Arrow)?;
                RowKind::Cells {
                    inputs,
                    outputs: self.cells()?,
                }
            };
            let end = sp(self.toks[self.at - 1].1);
            rows.push(Row {
                kind,
                span: start.to(end),
                trivia: Trivia::default(),
            });
        }
        Some(Table::parsed(inputs, outputs, rows))
    }

    /// Table cells: runs of `0`, `1` and `-`, one cell per character.
    fn cells(&mut self) -> Option<Vec<Cell>> {
        let mut cells = Vec::new();
        while let Some(Tok::Number | Tok::Dash) = self.peek() {
            let (_, run) = self.next()?;
            for (i, ch) in self.src[run.range()].char_indices() {
                let value = match ch {
                    '0' => CellValue::Zero,
                    '1' => CellValue::One,
                    '-' => CellValue::Dash,
                    _ => return None,
                };
                let at = run.start + i;
                cells.push(Cell {
                    value,
                    span: Span::new(at, at + 1),
                });
            }
        }
        Some(cells)
    }

    /// A plain signal name (a keyword there is left to the grammar, which
    /// reports it).
    fn name(&mut self) -> Option<Name> {
        match self.next()? {
            (Tok::Ident, span) => Some(Name {
                text: SmolStr::new(&self.src[span.range()]),
                span,
            }),
            _ => None,
        }
    }

    /// Precedence climbing over operators of precedence `min` and above.
    fn climb(&mut self, min: u8) -> Option<Expr> {
        let mut lhs = self.unary()?;
        while let Some((op, _)) = self.peek().and_then(binary_op) {
            let level = op.precedence();
            if level < min {
                break;
            }
            let mut operands = Vec::with_capacity(2);
            operands.push(lhs);
            let mut ops = Vec::with_capacity(1);
            while let Some((op, word)) = self
                .peek()
                .and_then(binary_op)
                .filter(|(o, _)| o.precedence() == level)
            {
                let (_, span) = self.next()?;
                ops.push(OpToken { op, word, span });
                operands.push(self.climb(level + 1)?);
            }
            if ops.len() > 1 && ops.iter().any(|o| !o.op.chains()) {
                return None;
            }
            let span = operands[0].span.to(operands[operands.len() - 1].span);
            lhs = Expr {
                kind: ExprKind::Chain { operands, ops },
                span,
            };
        }
        Some(lhs)
    }

    /// A name, constant, negation or parenthesised expression.
    fn unary(&mut self) -> Option<Expr> {
        let (tok, span) = self.next()?;
        let kind = match tok {
            Tok::Bang | Tok::KwNot => {
                let operand = self.unary()?;
                return Some(Expr {
                    span: span.to(operand.span),
                    kind: ExprKind::Not {
                        word: tok == Tok::KwNot,
                        operand: Box::new(operand),
                    },
                });
            }
            Tok::Ident => ExprKind::Name(Name {
                text: SmolStr::new(&self.src[span.range()]),
                span,
            }),
            Tok::Number => match &self.src[span.range()] {
                "0" => ExprKind::Const(false),
                "1" => ExprKind::Const(true),
                _ => return None,
            },
            Tok::LParen => {
                let inner = self.climb(1)?;
                return match self.next()? {
                    (Tok::RParen, end) => Some(Expr {
                        kind: ExprKind::Paren(Box::new(inner)),
                        span: span.to(end),
                    }),
                    _ => None,
                };
            }
            _ => return None,
        };
        Some(Expr { kind, span })
    }
}
