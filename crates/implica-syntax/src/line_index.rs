//! Byte offsets to line and column, for messages and editors.

/// Line starts of a text, for converting byte offsets to positions.
#[derive(Debug, Clone)]
pub struct LineIndex {
    starts: Vec<usize>,
    len: usize,
}

/// A position: 0-based line, and 0-based column in Unicode scalar values.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct LineCol {
    pub line: usize,
    pub col: usize,
}

impl LineIndex {
    /// Indexes `text`.
    pub fn new(text: &str) -> LineIndex {
        let mut starts = vec![0];
        starts.extend(
            text.bytes()
                .enumerate()
                .filter(|(_, b)| *b == b'\n')
                .map(|(i, _)| i + 1),
        );
        LineIndex {
            starts,
            len: text.len(),
        }
    }

    /// The position of byte `offset` (clamped to the text; an offset inside a
    /// multi-byte character counts as that character).
    pub fn line_col(&self, text: &str, offset: usize) -> LineCol {
        let offset = offset.min(self.len);
        let line = self.starts.partition_point(|&s| s <= offset) - 1;
        let start = self.starts[line];
        let col = text
            .get(start..)
            .unwrap_or("")
            .char_indices()
            .take_while(|(i, _)| start + i < offset)
            .count();
        LineCol { line, col }
    }

    /// The byte offset where 0-based `line` starts, if it exists.
    pub fn line_start(&self, line: usize) -> Option<usize> {
        self.starts.get(line).copied()
    }

    /// The number of lines (a final line break starts an empty last line).
    pub fn line_count(&self) -> usize {
        self.starts.len()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn columns_count_scalar_values() {
        let text = "ab\n\u{e9}x y\n";
        let idx = LineIndex::new(text);
        assert_eq!(idx.line_col(text, 0), LineCol { line: 0, col: 0 });
        assert_eq!(idx.line_col(text, 3), LineCol { line: 1, col: 0 });
        // `x` follows a two-byte character.
        assert_eq!(idx.line_col(text, 5), LineCol { line: 1, col: 1 });
        assert_eq!(idx.line_col(text, text.len()), LineCol { line: 2, col: 0 });
    }
}
