//! A readable, stable text form of the syntax tree, for snapshot tests and
//! for comparing trees with or without spans.

use crate::ast::*;
use std::fmt::Write;

/// Renders `file` as an indented outline; with `spans`, each node shows its
/// byte range. Blank lines kept as trivia are shown.
pub fn dump(file: &SourceFile, spans: bool) -> String {
    render(file, spans, true)
}

/// The outline without spans and blank lines: two files that differ only in
/// layout give the same text.
pub fn dump_structure(file: &SourceFile) -> String {
    render(file, false, false)
}

fn render(file: &SourceFile, spans: bool, blanks: bool) -> String {
    let mut d = Dumper {
        out: String::new(),
        spans,
        blanks,
    };
    for item in &file.items {
        d.item(item, 0);
    }
    for (_, c) in &file.trailing_comments {
        d.line(0, &format!("comment {:?}", c.text), Some(c.span));
    }
    d.out
}

struct Dumper {
    out: String,
    spans: bool,
    blanks: bool,
}

impl Dumper {
    fn line(&mut self, depth: usize, text: &str, span: Option<crate::Span>) {
        for _ in 0..depth {
            self.out.push_str("  ");
        }
        self.out.push_str(text);
        if let (true, Some(s)) = (self.spans, span) {
            let _ = write!(self.out, " @{}..{}", s.start, s.end);
        }
        self.out.push('\n');
    }

    fn trivia(&mut self, t: &Trivia, depth: usize) {
        for (blank, c) in t.leading() {
            let b = if *blank && self.blanks {
                " (after blank)"
            } else {
                ""
            };
            self.line(
                depth,
                &format!("leading comment{b} {:?}", c.text),
                Some(c.span),
            );
        }
        if t.blank_before && self.blanks {
            self.line(depth, "blank line", None);
        }
    }

    fn trailing(&mut self, t: &Trivia, depth: usize) {
        for c in t.interior() {
            self.line(
                depth + 1,
                &format!("interior comment {:?}", c.text),
                Some(c.span),
            );
        }
        if let Some(c) = t.trailing() {
            self.line(
                depth + 1,
                &format!("trailing comment {:?}", c.text),
                Some(c.span),
            );
        }
    }

    fn names(&self, names: &[Name]) -> String {
        names
            .iter()
            .map(|n| n.text.as_str())
            .collect::<Vec<_>>()
            .join(", ")
    }

    fn item(&mut self, item: &Item, depth: usize) {
        self.trivia(&item.trivia, depth);
        let s = Some(item.span);
        match &item.kind {
            ItemKind::Input(d) => self.line(depth, &format!("input {}", self.names(&d.names)), s),
            ItemKind::Output(d) => self.line(depth, &format!("output {}", self.names(&d.names)), s),
            ItemKind::Define(def) => {
                let kw = if def.let_span.is_some() { "let " } else { "" };
                self.line(depth, &format!("define {kw}{}", def.target.text), s);
                match &def.rhs {
                    Rhs::Expr(e) => self.expr(e, depth + 1),
                    Rhs::Terms(t) => {
                        for p in &t.parts {
                            let entries: Vec<String> = p
                                .entries
                                .iter()
                                .map(|e| match e {
                                    TermEntry::Single(n) => n.text.clone(),
                                    TermEntry::Range(a, b) => format!("{}..{}", a.text, b.text),
                                })
                                .collect();
                            self.line(
                                depth + 1,
                                &format!("{} [{}]", p.kind.keyword(), entries.join(", ")),
                                Some(p.span),
                            );
                        }
                        self.line(depth + 1, &format!("over {}", self.names(&t.over)), None);
                    }
                }
            }
            ItemKind::Table(t) | ItemKind::Expect(t) => {
                let kw = match (&item.kind, t.let_span.is_some()) {
                    (ItemKind::Expect(_), _) => "expect",
                    (_, true) => "let table",
                    _ => "table",
                };
                self.line(
                    depth,
                    &format!(
                        "{kw} ({} -> {})",
                        self.names(&t.inputs),
                        self.names(&t.outputs)
                    ),
                    s,
                );
                if let Some(c) = &t.open_comment {
                    self.line(
                        depth + 1,
                        &format!("open comment {:?}", c.text),
                        Some(c.span),
                    );
                }
                for row in &t.rows {
                    self.trivia(&row.trivia, depth + 1);
                    let cells =
                        |c: &[Cell]| c.iter().map(|c| c.value.as_char()).collect::<String>();
                    let text = match &row.kind {
                        RowKind::Cells { inputs, outputs } => {
                            format!("row {} -> {}", cells(inputs), cells(outputs))
                        }
                        RowKind::Unlisted { outputs } => {
                            format!("row unlisted -> {}", cells(outputs))
                        }
                        RowKind::Error => "row error".to_string(),
                    };
                    self.line(depth + 1, &text, Some(row.span));
                    self.trailing(&row.trivia, depth + 1);
                }
                for (_, c) in &t.closing_comments {
                    self.line(
                        depth + 1,
                        &format!("closing comment {:?}", c.text),
                        Some(c.span),
                    );
                }
            }
            ItemKind::Never(e) => {
                self.line(depth, "never", s);
                self.expr(e, depth + 1);
            }
            ItemKind::Assert(e) => {
                self.line(depth, "assert", s);
                self.expr(e, depth + 1);
            }
            ItemKind::Error => self.line(depth, "error", s),
        }
        self.trailing(&item.trivia, depth);
    }

    fn expr(&mut self, e: &Expr, depth: usize) {
        let s = Some(e.span);
        match &e.kind {
            ExprKind::Name(n) => self.line(depth, &format!("name {}", n.text), s),
            ExprKind::Const(b) => self.line(depth, &format!("const {}", u8::from(*b)), s),
            ExprKind::Not { word, operand } => {
                self.line(depth, if *word { "not" } else { "!" }, s);
                self.expr(operand, depth + 1);
            }
            ExprKind::Paren(inner) => {
                self.line(depth, "paren", s);
                self.expr(inner, depth + 1);
            }
            ExprKind::Chain { operands, ops } => {
                let ops: Vec<&str> = ops.iter().map(|o| o.op.spelling(o.word)).collect();
                self.line(depth, &format!("chain {}", ops.join(" ")), s);
                for x in operands {
                    self.expr(x, depth + 1);
                }
            }
            ExprKind::Error => self.line(depth, "error", s),
        }
    }
}
