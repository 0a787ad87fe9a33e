//! The canonical layout of Implica source.
//!
//! One statement per line; in a block of consecutive statements (no blank
//! line between) the names after `input`/`output` line up, the `=` of
//! definitions line up, and trailing comments line up; table rows are
//! indented two spaces with `->` aligned. Runs of blank lines become one.
//! Expressions get one space around binary operators and keep their
//! parentheses. An expression longer than [`MAX_WIDTH`] breaks before its
//! top-level operators.
//!
//! Architecture invariant: formatting keeps every comment. A statement
//! with a comment inside it (say, within a multi-line expression) is kept
//! exactly as written; the rest of the file is still formatted.

use crate::ast::*;
use crate::{SyntaxError, parse};

/// Lines longer than this are broken where the layout allows.
pub const MAX_WIDTH: usize = 100;

/// Formats `src`, or returns its syntax errors: a file that does not parse
/// is not reformatted, since its meaning is unknown.
pub fn format_source(src: &str) -> Result<String, Vec<SyntaxError>> {
    let (file, errors) = parse(src);
    if errors.is_empty() {
        Ok(format_file(src, &file))
    } else {
        Err(errors)
    }
}

/// Formats a parsed file. `src` is the text it was parsed from (statements
/// kept as written are copied from it).
pub fn format_file(src: &str, file: &SourceFile) -> String {
    let mut out = Out::default();
    let blocks = blocks(&file.items);
    for block in blocks {
        format_block(src, block, &mut out);
    }
    for (blank, c) in &file.trailing_comments {
        out.blank_if(*blank);
        out.line(c.text.to_string());
    }
    let text = out.finish();
    // A byte-order mark is the file's, not layout: keep it.
    match src.strip_prefix('\u{FEFF}') {
        Some(_) if !text.is_empty() => format!("\u{FEFF}{text}"),
        _ => text,
    }
}

#[derive(Default)]
struct Out {
    lines: Vec<String>,
}

impl Out {
    /// A blank line, unless at the start of the file or after another blank.
    fn blank_if(&mut self, blank: bool) {
        if blank && self.lines.last().is_some_and(|l| !l.is_empty()) {
            self.lines.push(String::new());
        }
    }

    fn line(&mut self, line: String) {
        self.lines.push(line);
    }

    fn finish(mut self) -> String {
        while self.lines.last().is_some_and(|l| l.is_empty()) {
            self.lines.pop();
        }
        if self.lines.is_empty() {
            return String::new();
        }
        let mut s = self.lines.join("\n");
        s.push('\n');
        s
    }
}

fn starts_block(item: &Item) -> bool {
    item.trivia.blank_before || item.trivia.leading().iter().any(|(b, _)| *b)
}

fn blocks(items: &[Item]) -> Vec<&[Item]> {
    let mut out = Vec::new();
    let mut start = 0;
    for i in 1..items.len() {
        if starts_block(&items[i]) {
            out.push(&items[start..i]);
            start = i;
        }
    }
    if start < items.len() {
        out.push(&items[start..]);
    }
    out
}

fn kept_as_written(item: &Item) -> bool {
    matches!(item.kind, ItemKind::Error)
        || !item.trivia.interior().is_empty()
        || has_error_nodes(item)
}

fn has_error_nodes(item: &Item) -> bool {
    fn expr(e: &Expr) -> bool {
        match &e.kind {
            ExprKind::Error => true,
            ExprKind::Name(_) | ExprKind::Const(_) => false,
            ExprKind::Not { operand, .. } => expr(operand),
            ExprKind::Paren(inner) => expr(inner),
            ExprKind::Chain { operands, .. } => operands.iter().any(expr),
        }
    }
    match &item.kind {
        ItemKind::Define(d) => matches!(&d.rhs, Rhs::Expr(e) if expr(e)),
        ItemKind::Never(e) | ItemKind::Assert(e) => expr(e),
        ItemKind::Table(t) | ItemKind::Expect(t) => t.rows.iter().any(|r| r.kind == RowKind::Error),
        _ => false,
    }
}

/// The text before a definition's `=`, or a declaration's keyword.
fn define_head(d: &Define) -> String {
    match d.let_span {
        Some(_) => format!("let {}", d.target.text),
        None => d.target.text.to_string(),
    }
}

fn format_block(src: &str, block: &[Item], out: &mut Out) {
    let decl_width = block
        .iter()
        .filter(|i| !kept_as_written(i))
        .filter_map(|i| match i.kind {
            ItemKind::Input(_) => Some(5),
            ItemKind::Output(_) => Some(6),
            _ => None,
        })
        .max()
        .unwrap_or(0);
    let head_width = block
        .iter()
        .filter(|i| !kept_as_written(i))
        .filter_map(|i| match &i.kind {
            ItemKind::Define(d) => Some(define_head(d).len()),
            _ => None,
        })
        .max()
        .unwrap_or(0);
    let rendered: Vec<Vec<String>> = block
        .iter()
        .map(|item| render_item(src, item, decl_width, head_width))
        .collect();
    // Trailing comments of one-line statements line up.
    let comment_col = block
        .iter()
        .zip(&rendered)
        .filter(|(item, lines)| item.trivia.trailing().is_some() && lines.len() == 1)
        .map(|(_, lines)| lines[0].chars().count())
        .max()
        .unwrap_or(0)
        + 2;
    for (item, mut lines) in block.iter().zip(rendered) {
        for (blank, c) in item.trivia.leading() {
            out.blank_if(*blank);
            out.line(c.text.to_string());
        }
        out.blank_if(item.trivia.blank_before);
        if let Some(c) = item.trivia.trailing() {
            let single = lines.len() == 1;
            if let Some(last) = lines.last_mut() {
                let col = if single {
                    comment_col
                } else {
                    last.chars().count() + 2
                };
                pad_to(last, col);
                last.push_str(&c.text);
            }
        }
        for l in lines {
            out.line(l);
        }
    }
}

fn pad_to(s: &mut String, col: usize) {
    let n = s.chars().count();
    s.extend(std::iter::repeat_n(' ', col.saturating_sub(n)));
}

fn render_item(src: &str, item: &Item, decl_width: usize, head_width: usize) -> Vec<String> {
    if kept_as_written(item) {
        return src[item.span.range()]
            .lines()
            .map(|l| l.trim_end().to_string())
            .collect();
    }
    match &item.kind {
        ItemKind::Input(d) => render_decl("input", &d.names, decl_width),
        ItemKind::Output(d) => render_decl("output", &d.names, decl_width),
        ItemKind::Define(d) => {
            let mut head = define_head(d);
            pad_to(&mut head, head_width);
            head.push_str(" = ");
            match &d.rhs {
                Rhs::Expr(e) => render_long(head, e),
                Rhs::Terms(t) => vec![format!("{head}{}", terms(t))],
            }
        }
        ItemKind::Never(e) => render_long("never ".to_string(), e),
        ItemKind::Assert(e) => render_long("assert ".to_string(), e),
        ItemKind::Table(t) => {
            let kw = if t.let_span.is_some() {
                "let table"
            } else {
                "table"
            };
            render_table(kw, t)
        }
        ItemKind::Expect(t) => render_table("expect", t),
        ItemKind::Error => Vec::new(),
    }
}

fn names(names: &[Name]) -> String {
    names
        .iter()
        .map(|n| n.text.as_str())
        .collect::<Vec<_>>()
        .join(", ")
}

fn render_decl(kw: &str, list: &[Name], width: usize) -> Vec<String> {
    let mut head = kw.to_string();
    pad_to(&mut head, width.max(kw.len()));
    head.push(' ');
    let indent = head.len();
    let mut lines = vec![head];
    for (i, n) in list.iter().enumerate() {
        let last = i + 1 == list.len();
        let piece = if last {
            n.text.to_string()
        } else {
            format!("{},", n.text)
        };
        let cur = lines.last_mut().expect("lines starts non-empty");
        let fresh = cur.len() == indent;
        if !fresh && cur.len() + 1 + piece.len() > MAX_WIDTH {
            lines.push(" ".repeat(indent) + &piece);
        } else {
            if !fresh {
                cur.push(' ');
            }
            cur.push_str(&piece);
        }
    }
    lines
}

/// `head` followed by `e`, broken before the top-level operators when too long.
fn render_long(head: String, e: &Expr) -> Vec<String> {
    let one = format!("{head}{}", expr(e));
    if one.chars().count() <= MAX_WIDTH {
        return vec![one];
    }
    let ExprKind::Chain { operands, ops } = &e.kind else {
        return vec![one];
    };
    // The operator goes two columns left of the first operand, so operands line up.
    let op_col = head.chars().count().saturating_sub(2);
    let mut lines = vec![format!("{head}{}", expr(&operands[0]))];
    for (op, x) in ops.iter().zip(&operands[1..]) {
        lines.push(format!(
            "{}{} {}",
            " ".repeat(op_col),
            op.op.spelling(op.word),
            expr(x)
        ));
    }
    lines
}

/// An expression on one line.
pub fn expr(e: &Expr) -> String {
    let mut s = String::new();
    write_expr(e, &mut s);
    s
}

fn write_expr(e: &Expr, s: &mut String) {
    match &e.kind {
        ExprKind::Name(n) => s.push_str(&n.text),
        ExprKind::Const(b) => s.push(if *b { '1' } else { '0' }),
        ExprKind::Not { word, operand } => {
            s.push_str(if *word { "not " } else { "!" });
            write_expr(operand, s);
        }
        ExprKind::Paren(inner) => {
            s.push('(');
            write_expr(inner, s);
            s.push(')');
        }
        ExprKind::Chain { operands, ops } => {
            write_expr(&operands[0], s);
            for (op, x) in ops.iter().zip(&operands[1..]) {
                s.push(' ');
                s.push_str(op.op.spelling(op.word));
                s.push(' ');
                write_expr(x, s);
            }
        }
        // Unreachable for files without errors; keeps the tree printable.
        ExprKind::Error => s.push_str("<error>"),
    }
}

fn terms(t: &TermList) -> String {
    let mut s = String::new();
    for p in &t.parts {
        let entries: Vec<String> = p
            .entries
            .iter()
            .map(|e| match e {
                TermEntry::Single(n) => n.text.clone(),
                TermEntry::Range(a, b) => format!("{}..{}", a.text, b.text),
            })
            .collect();
        s.push_str(&format!("{}({}) ", p.kind.keyword(), entries.join(", ")));
    }
    s.push_str(&format!("over ({})", names(&t.over)));
    s
}

/// Whether a row side was written without spaces between its cells.
fn packed(cells: &[Cell]) -> bool {
    cells.windows(2).all(|w| w[0].span.end == w[1].span.start)
}

fn render_table(kw: &str, t: &Table) -> Vec<String> {
    let ins = names(&t.inputs);
    let sep = if ins.is_empty() { "" } else { " " };
    let mut head = format!("{kw} ({ins}{sep}-> {}) {{", names(&t.outputs));
    if let Some(c) = &t.open_comment {
        head.push_str("  ");
        head.push_str(&c.text);
    }
    let mut lines = vec![head];
    let sides = |r: &Row| match &r.kind {
        RowKind::Cells { inputs, outputs } => (Some(inputs.clone()), outputs.clone()),
        RowKind::Unlisted { outputs } => (None, outputs.clone()),
        RowKind::Error => (None, Vec::new()),
    };
    let packed_in = t.rows.iter().all(|r| sides(r).0.is_none_or(|c| packed(&c)));
    let packed_out = t.rows.iter().all(|r| packed(&sides(r).1));
    let join = |cells: &[Cell], packed: bool| {
        let chars: Vec<String> = cells
            .iter()
            .map(|c| c.value.as_char().to_string())
            .collect();
        chars.join(if packed { "" } else { " " })
    };
    let lefts: Vec<String> = t
        .rows
        .iter()
        .map(|r| match sides(r).0 {
            Some(c) => join(&c, packed_in),
            None => "unlisted".to_string(),
        })
        .collect();
    let left_width = lefts.iter().map(|l| l.len()).max().unwrap_or(0);
    let bodies: Vec<String> = t
        .rows
        .iter()
        .zip(&lefts)
        .map(|(r, l)| {
            let mut s = format!("  {l}");
            pad_to(&mut s, left_width + 2);
            if left_width > 0 {
                s.push(' ');
            }
            s.push_str("->");
            let right = join(&sides(r).1, packed_out);
            if !right.is_empty() {
                s.push(' ');
                s.push_str(&right);
            }
            s
        })
        .collect();
    let comment_col = t
        .rows
        .iter()
        .zip(&bodies)
        .filter(|(r, _)| r.trivia.trailing().is_some())
        .map(|(_, b)| b.len())
        .max()
        .unwrap_or(0)
        + 2;
    let mut first = true;
    for (r, mut body) in t.rows.iter().zip(bodies) {
        for (blank, c) in r.trivia.leading() {
            if *blank && !first {
                lines.push(String::new());
            }
            lines.push(format!("  {}", c.text));
            first = false;
        }
        if r.trivia.blank_before && !first {
            lines.push(String::new());
        }
        if let Some(c) = r.trivia.trailing() {
            pad_to(&mut body, comment_col);
            body.push_str(&c.text);
        }
        lines.push(body);
        first = false;
    }
    for (blank, c) in &t.closing_comments {
        if *blank && !first {
            lines.push(String::new());
        }
        lines.push(format!("  {}", c.text));
        first = false;
    }
    lines.push("}".to_string());
    lines
}
