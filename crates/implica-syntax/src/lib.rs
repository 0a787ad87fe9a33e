//! The Implica language front end: text → tokens → syntax tree, and back to
//! canonical text.
//!
//! ```
//! let (file, errors) = implica_syntax::parse("input a, b\noutput y\ny = a & !b\n");
//! assert!(errors.is_empty());
//! assert_eq!(file.items.len(), 3);
//! ```
//!
//! Architecture invariant: this crate knows nothing of Boolean functions,
//! diagnostics or editors; it depends only on the lexer and parser libraries.

pub mod ast;
pub mod dump;
pub mod format;
mod grammar;
#[doc(hidden)]
pub mod invariants;
pub mod lexer;
pub mod line_index;
mod parser;

pub use grammar::parse_number;
pub use line_index::LineIndex;
pub use parser::{MAX_NESTING, decode, parse, parse_reference};

/// A byte range `start..end` in the source text.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord, Default)]
pub struct Span {
    pub start: usize,
    pub end: usize,
}

impl Span {
    /// The span `start..end`.
    pub fn new(start: usize, end: usize) -> Span {
        Span { start, end }
    }

    /// As a standard range, for slicing.
    pub fn range(self) -> std::ops::Range<usize> {
        self.start..self.end
    }

    /// From the start of `self` to the end of `other`.
    pub fn to(self, other: Span) -> Span {
        Span::new(self.start.min(other.start), self.end.max(other.end))
    }

    /// Length in bytes.
    pub fn len(self) -> usize {
        self.end - self.start
    }

    /// Whether the span is empty.
    pub fn is_empty(self) -> bool {
        self.start == self.end
    }
}

/// A syntax error: where, what was found and expected, and how to fix it.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct SyntaxError {
    pub span: Span,
    /// One sentence: what was expected and what was found.
    pub message: String,
    /// The fix, where there is an obvious one.
    pub help: Option<String>,
    /// Other places that explain the error, such as an unclosed `(`.
    pub related: Vec<(Span, String)>,
}
