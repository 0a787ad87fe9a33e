//! The syntax tree.
//!
//! Every node carries its byte [`Span`] in the source. Comments and blank
//! lines are kept as [`Trivia`] on statements and table rows, so that the
//! formatter and fixes can reproduce them.
//!
//! Architecture invariant: the tree is plain data with no references into the
//! source text, so later layers may keep it while the text is edited.

use crate::Span;
pub use smol_str::SmolStr;

/// A parsed `.imp` file.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct SourceFile {
    /// Statements in source order, including [`ItemKind::Error`] nodes.
    pub items: Vec<Item>,
    /// Comments after the last statement, each with whether a blank line precedes it.
    pub trailing_comments: Vec<(bool, Comment)>,
    /// The whole text.
    pub span: Span,
}

/// A comment, `#` to the end of the line.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Comment {
    /// Text including the `#`, without the line break or trailing spaces.
    pub text: SmolStr,
    pub span: Span,
}

/// Comments and blank lines attached to a statement or a table row.
///
/// Most statements have no comment, so the comments live behind one
/// optional allocation and a statement without them costs 16 bytes here.
#[derive(Debug, Clone, Default, PartialEq, Eq)]
pub struct Trivia {
    /// Whether at least one blank line precedes this node (after its leading comments).
    pub blank_before: bool,
    comments: Option<Box<TriviaComments>>,
}

/// The comments of a [`Trivia`].
#[derive(Debug, Clone, Default, PartialEq, Eq)]
pub struct TriviaComments {
    /// Full-line comments before the node, each with whether a blank line precedes it.
    pub leading: Vec<(bool, Comment)>,
    /// A comment at the end of the node's last line.
    pub trailing: Option<Comment>,
    /// Comments strictly inside the node (e.g. within a multi-line expression).
    /// The formatter keeps such a node as written.
    pub interior: Vec<Comment>,
}

impl Trivia {
    /// Full-line comments before the node, each with whether a blank line precedes it.
    pub fn leading(&self) -> &[(bool, Comment)] {
        self.comments.as_ref().map_or(&[], |c| &c.leading)
    }

    /// The comment at the end of the node's last line.
    pub fn trailing(&self) -> Option<&Comment> {
        self.comments.as_ref().and_then(|c| c.trailing.as_ref())
    }

    /// Comments strictly inside the node.
    pub fn interior(&self) -> &[Comment] {
        self.comments.as_ref().map_or(&[], |c| &c.interior)
    }

    /// The comments, for adding to them.
    pub fn comments_mut(&mut self) -> &mut TriviaComments {
        self.comments.get_or_insert_with(Default::default)
    }
}

/// A statement.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Item {
    pub kind: ItemKind,
    pub span: Span,
    pub trivia: Trivia,
}

/// The kinds of statement.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum ItemKind {
    /// `input a, b, c`
    Input(Decl),
    /// `output x, y`
    Output(Decl),
    /// `x = ...` or `let x = ...`
    Define(Define),
    /// `table (a, b -> y) { ... }` or `let table ...`
    Table(Box<Table>),
    /// `never expr`
    Never(Expr),
    /// `assert expr`
    Assert(Expr),
    /// `expect (a, b -> y) { ... }`
    Expect(Box<Table>),
    /// A statement that could not be parsed; its errors are in the error list.
    Error,
}

/// A signal name with its span.
#[derive(Debug, Clone, PartialEq, Eq, Hash)]
pub struct Name {
    /// The name; short names are stored inline, without allocation.
    pub text: SmolStr,
    pub span: Span,
}

/// The names of an `input` or `output` statement.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Decl {
    pub names: Vec<Name>,
}

/// A definition: `target = rhs`, optionally with `let`.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Define {
    /// Span of the `let` keyword, when the signal is intermediate.
    pub let_span: Option<Span>,
    pub target: Name,
    pub rhs: Rhs,
}

/// The right-hand side of a definition.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum Rhs {
    Expr(Expr),
    Terms(TermList),
}

/// `on(...) dc(...) over (...)`: a function given by row numbers.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct TermList {
    /// The `on`, `off` and `dc` lists in source order.
    pub parts: Vec<TermPart>,
    /// The variables, most significant first.
    pub over: Vec<Name>,
    pub span: Span,
}

/// Which rows a [`TermPart`] lists.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum TermKind {
    /// `on(...)`: rows where the function is 1.
    On,
    /// `off(...)`: rows where the function is 0.
    Off,
    /// `dc(...)`: rows whose value does not matter.
    Dc,
}

impl TermKind {
    /// The keyword as written.
    pub fn keyword(self) -> &'static str {
        match self {
            TermKind::On => "on",
            TermKind::Off => "off",
            TermKind::Dc => "dc",
        }
    }
}

/// One `on(...)`, `off(...)` or `dc(...)` list.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct TermPart {
    pub kind: TermKind,
    pub entries: Vec<TermEntry>,
    pub span: Span,
}

/// A row number or an inclusive range of row numbers.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum TermEntry {
    Single(Number),
    Range(Number, Number),
}

/// A number as written (`12`, `0x1F`, `0b101`).
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Number {
    pub text: String,
    /// The value, or `None` when the text is not a valid number (an error was reported).
    pub value: Option<u64>,
    pub span: Span,
}

/// A truth table or a block of test vectors.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Table {
    /// Span of `let`, for a table of intermediate signals.
    pub let_span: Option<Span>,
    pub inputs: Vec<Name>,
    pub outputs: Vec<Name>,
    pub rows: Vec<Row>,
    /// A comment on the line of the opening `{`.
    pub open_comment: Option<Comment>,
    /// Comments after the last row, before the closing `}`.
    pub closing_comments: Vec<(bool, Comment)>,
}

impl Table {
    /// A table as parsed, before `let` and comments are attached.
    pub(crate) fn parsed(inputs: Vec<Name>, outputs: Vec<Name>, rows: Vec<Row>) -> Table {
        Table {
            let_span: None,
            inputs,
            outputs,
            rows,
            open_comment: None,
            closing_comments: Vec::new(),
        }
    }
}

/// A table row.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Row {
    pub kind: RowKind,
    pub span: Span,
    pub trivia: Trivia,
}

/// The kinds of table row.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum RowKind {
    /// `01- -> 10`
    Cells {
        inputs: Vec<Cell>,
        outputs: Vec<Cell>,
    },
    /// `unlisted -> 0-`: the value of every row not listed.
    Unlisted { outputs: Vec<Cell> },
    /// A row that could not be parsed.
    Error,
}

/// One table cell.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Cell {
    pub value: CellValue,
    pub span: Span,
}

/// The value of a table cell.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum CellValue {
    Zero,
    One,
    /// `-`: both values in an input cell, don't-care in an output cell.
    Dash,
}

impl CellValue {
    /// The character as written.
    pub fn as_char(self) -> char {
        match self {
            CellValue::Zero => '0',
            CellValue::One => '1',
            CellValue::Dash => '-',
        }
    }
}

/// An expression.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Expr {
    pub kind: ExprKind,
    pub span: Span,
}

/// The kinds of expression.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum ExprKind {
    Name(Name),
    /// `0` or `1`.
    Const(bool),
    /// `!x` or `not x`; `word` is true for `not`.
    Not {
        word: bool,
        operand: Box<Expr>,
    },
    /// `( ... )`, kept so that the formatter and fixes preserve grouping.
    Paren(Box<Expr>),
    /// Operands joined by operators of one precedence level, as written:
    /// `ops.len() == operands.len() - 1`. A chain groups to the left,
    /// except `=>`, which groups to the right. Flat chains keep the tree
    /// shallow however long the expression is.
    Chain {
        operands: Vec<Expr>,
        ops: Vec<OpToken>,
    },
    /// An expression that could not be parsed; its error is in the error list.
    Error,
}

/// A binary operator occurrence.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct OpToken {
    pub op: BinOp,
    /// True when spelled as a word (`and`, `or`, `xor`); `nand`, `nor`,
    /// `xnor` are always words.
    pub word: bool,
    pub span: Span,
}

/// Binary operators.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum BinOp {
    And,
    Nand,
    Xor,
    Xnor,
    Or,
    Nor,
    Eq,
    Ne,
    Implies,
}

impl BinOp {
    /// Binding strength: higher binds tighter. `!` is above all of these.
    pub fn precedence(self) -> u8 {
        match self {
            BinOp::And | BinOp::Nand => 5,
            BinOp::Xor | BinOp::Xnor => 4,
            BinOp::Or | BinOp::Nor => 3,
            BinOp::Eq | BinOp::Ne => 2,
            BinOp::Implies => 1,
        }
    }

    /// Whether `a op b op c` is accepted without parentheses.
    pub fn chains(self) -> bool {
        !matches!(self, BinOp::Nand | BinOp::Nor | BinOp::Xnor)
    }

    /// The spelling, as a symbol where one exists and `word` is false.
    pub fn spelling(self, word: bool) -> &'static str {
        match (self, word) {
            (BinOp::And, false) => "&",
            (BinOp::And, true) => "and",
            (BinOp::Nand, _) => "nand",
            (BinOp::Xor, false) => "^",
            (BinOp::Xor, true) => "xor",
            (BinOp::Xnor, _) => "xnor",
            (BinOp::Or, false) => "|",
            (BinOp::Or, true) => "or",
            (BinOp::Nor, _) => "nor",
            (BinOp::Eq, _) => "==",
            (BinOp::Ne, _) => "!=",
            (BinOp::Implies, _) => "=>",
        }
    }
}
