//! Plain-text and Markdown renderings of functions: truth tables and
//! Karnaugh maps, over named inputs.
//!
//! ```
//! use implica_logic::{Format, Function, TruthTable, render_karnaugh_map, render_truth_table};
//! // Lift door: `open` when the car is level and stopped; free when it is
//! // neither level nor stopped, which the controller never asks about.
//! let inputs = ["level", "stopped"];
//! let on = TruthTable::from_minterms(2, &[3]);
//! let dc = TruthTable::from_minterms(2, &[0]);
//! let open = Function { name: "open", on: &on, dc: Some(&dc) };
//! let table = render_truth_table(&inputs, &[open], Format::Text, None).unwrap();
//! assert_eq!(
//!     table,
//!     "level stopped | open\n\
//!      --------------+-----\n\
//!      0     0       | -\n\
//!      0     1       | 0\n\
//!      1     0       | 0\n\
//!      1     1       | 1\n"
//! );
//! let map = render_karnaugh_map(&inputs, &open, None, Format::Markdown).unwrap();
//! assert!(map.contains("| level \\ stopped | 0 | 1 |"));
//!
//! // The same table in Markdown.
//! let md = render_truth_table(&inputs, &[open], Format::Markdown, None).unwrap();
//! assert_eq!(
//!     md,
//!     "| level | stopped | open |\n\
//!      | --- | --- | --- |\n\
//!      | 0 | 0 | - |\n\
//!      | 0 | 1 | 0 |\n\
//!      | 1 | 0 | 0 |\n\
//!      | 1 | 1 | 1 |\n"
//! );
//! ```
//!
//! Five inputs give two maps of the last four, one for each value of the
//! first, with the groups of a cover marked:
//!
//! ```
//! use implica_logic::{Budget, Format, Function, TruthTable, minimize_sop, render_karnaugh_map};
//! // f = !d & e | a & b over (a, b, c, d, e).
//! let ones: Vec<usize> = (0..32).filter(|m| m & 3 == 1 || m >> 3 == 3).collect();
//! let f = TruthTable::from_minterms(5, &ones);
//! let m = minimize_sop(&f, &TruthTable::zero(5), &Budget::default()).unwrap();
//! let function = Function { name: "f", on: &f, dc: None };
//! let map = render_karnaugh_map(&["a", "b", "c", "d", "e"], &function, Some(&m.cover), Format::Text).unwrap();
//! assert_eq!(
//!     map,
//!     "f, a = 0\n\
//!      \n\
//!      b c \\ d e | 00 | 01  | 11 | 10\n\
//!      ----------+----+-----+----+---\n\
//!      00        | 0  | 1 a | 0  | 0\n\
//!      01        | 0  | 1 a | 0  | 0\n\
//!      11        | 0  | 1 a | 0  | 0\n\
//!      10        | 0  | 1 a | 0  | 0\n\
//!      \n\
//!      f, a = 1\n\
//!      \n\
//!      b c \\ d e | 00  | 01   | 11  | 10\n\
//!      ----------+-----+------+-----+----\n\
//!      00        | 0   | 1 a  | 0   | 0\n\
//!      01        | 0   | 1 a  | 0   | 0\n\
//!      11        | 1 b | 1 ab | 1 b | 1 b\n\
//!      10        | 1 b | 1 ab | 1 b | 1 b\n\
//!      \n\
//!      terms\n\
//!      \x20 a: !d & e\n\
//!      \x20 b: a & b\n"
//! );
//! ```
//!
//! Conventions: the first input is the most significant bit of a minterm
//! index; a don't-care shows as [`DONT_CARE`]. A map puts the first half of
//! its variables (rounded down) on the rows and the rest on the columns,
//! both in Gray-code order (00, 01, 11, 10), and labels the axes in its
//! corner cell as `rows \ columns`. Five and six variables give two and four
//! maps of the last four, one per value of the first one or two variables,
//! also in Gray-code order.

use crate::{BoolExpr, Cover, MAX_VARS, TruthTable};

/// The symbol of a don't-care in rendered tables and maps.
pub const DONT_CARE: char = '-';

/// The output format of a rendering.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Format {
    /// Aligned columns in plain text.
    Text,
    /// GitHub-flavoured Markdown pipe tables.
    Markdown,
}

/// A named function: 1 on `on`, free on `dc` (a don't-care wins over `on`).
#[derive(Clone, Copy, Debug)]
pub struct Function<'a> {
    /// The name shown in headers and titles.
    pub name: &'a str,
    /// Where the function is 1.
    pub on: &'a TruthTable,
    /// Where it is free, if anywhere.
    pub dc: Option<&'a TruthTable>,
}

impl Function<'_> {
    fn cell(&self, m: usize) -> char {
        if self.dc.is_some_and(|dc| dc.get(m)) {
            DONT_CARE
        } else if self.on.get(m) {
            '1'
        } else {
            '0'
        }
    }

    fn check(&self, names: usize) -> Result<(), RenderError> {
        for vars in std::iter::once(self.on.vars()).chain(self.dc.map(TruthTable::vars)) {
            if vars != names {
                return Err(RenderError::InputCount {
                    function: self.name.to_string(),
                    names,
                    vars,
                });
            }
        }
        Ok(())
    }
}

/// Why a rendering was refused.
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum RenderError {
    /// `names` input names were given for `function`, whose on-set or
    /// don't-care set has `vars` inputs.
    InputCount {
        /// The function's name.
        function: String,
        /// The input names given.
        names: usize,
        /// The function's inputs.
        vars: usize,
    },
    /// More than [`MAX_VARS`] inputs for a truth table.
    TooManyInputs {
        /// The input names given.
        names: usize,
    },
    /// A truth table with no column at all.
    Empty,
    /// A map has 1 to 6 variables.
    MapVars {
        /// The variables asked for.
        vars: usize,
    },
    /// The cover is over `cover` variables, the function over `vars`.
    CoverVars {
        /// The cover's variables.
        cover: usize,
        /// The function's variables.
        vars: usize,
    },
}

impl std::fmt::Display for RenderError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            RenderError::InputCount {
                function,
                names,
                vars,
            } => write!(
                f,
                "{names} input names for `{function}`, a function of {vars} inputs"
            ),
            RenderError::TooManyInputs { names } => {
                write!(f, "{names} inputs: a truth table has at most {MAX_VARS}")
            }
            RenderError::Empty => write!(f, "a truth table needs an input or a function"),
            RenderError::MapVars { vars } => write!(
                f,
                "a Karnaugh map is drawn for 1 to 6 variables, not {vars}"
            ),
            RenderError::CoverVars { cover, vars } => write!(
                f,
                "the cover is over {cover} variables, the function over {vars}"
            ),
        }
    }
}

impl std::error::Error for RenderError {}

/// Column widths and separators of a table, to write it a line at a time:
/// `bars[k]` says whether columns `k` and `k + 1` are separated by a bar in
/// plain text (Markdown has one between all).
struct Layout {
    widths: Vec<usize>,
    bars: Vec<bool>,
    format: Format,
}

impl Layout {
    /// The layout fitting every line of `lines`.
    fn new(format: Format, bars: Vec<bool>, lines: &[&[String]]) -> Layout {
        let columns = lines.iter().map(|l| l.len()).max().unwrap_or(0);
        let widths = (0..columns)
            .map(|k| {
                lines
                    .iter()
                    .map(|l| l.get(k).map_or(0, |c| c.chars().count()))
                    .max()
                    .unwrap_or(0)
            })
            .collect();
        Layout {
            widths,
            bars,
            format,
        }
    }

    /// Writes one line of cells (the header or a row).
    fn line<S: AsRef<str>>(&self, out: &mut String, cells: &[S]) {
        let cell = |k: usize| cells.get(k).map_or("", |c| c.as_ref());
        match self.format {
            Format::Text => self.text_line(out, cell, ' ', " | ", " "),
            Format::Markdown => {
                out.push('|');
                for k in 0..self.widths.len() {
                    out.push(' ');
                    out.push_str(&md_escape(cell(k)));
                    out.push_str(" |");
                }
                out.push('\n');
            }
        }
    }

    /// Writes the line under the header.
    fn rule(&self, out: &mut String) {
        match self.format {
            Format::Text => self.text_line(out, |_| "", '-', "-+-", "-"),
            Format::Markdown => {
                out.push('|');
                for _ in &self.widths {
                    out.push_str(" --- |");
                }
                out.push('\n');
            }
        }
    }

    fn text_line<'a>(
        &self,
        out: &mut String,
        cell: impl Fn(usize) -> &'a str,
        fill: char,
        bar: &str,
        gap: &str,
    ) {
        let start = out.len();
        for (k, w) in self.widths.iter().enumerate() {
            if k > 0 {
                let barred = self.bars.get(k - 1).copied().unwrap_or(false);
                out.push_str(if barred { bar } else { gap });
            }
            let c = cell(k);
            out.push_str(c);
            out.extend(std::iter::repeat_n(
                fill,
                w.saturating_sub(c.chars().count()),
            ));
        }
        let kept = out[start..].trim_end().len();
        out.truncate(start + kept);
        out.push('\n');
    }
}

/// `s` with line breaks and other control characters as spaces, so that a
/// name keeps to its line and column.
fn one_line(s: &str) -> String {
    s.chars()
        .map(|c| if c.is_control() { ' ' } else { c })
        .collect()
}

/// Text safe inside a Markdown table cell or paragraph: characters that
/// Markdown would read are escaped, line breaks and other controls become
/// spaces. An underscore inside a word and a backslash before anything but
/// punctuation are literal in Markdown and stay as they are, so that names
/// like `roof_high` read well in the source.
fn md_escape(s: &str) -> String {
    let chars: Vec<char> = s.chars().collect();
    let mut out = String::with_capacity(s.len());
    for (k, &c) in chars.iter().enumerate() {
        let before = k.checked_sub(1).and_then(|j| chars.get(j));
        let after = chars.get(k + 1);
        let escape = match c {
            '|' | '`' | '*' | '[' | ']' | '<' | '>' | '~' => true,
            '_' => {
                !(before.is_some_and(|b| b.is_alphanumeric())
                    && after.is_some_and(|a| a.is_alphanumeric()))
            }
            '\\' => after.is_none_or(|a| a.is_ascii_punctuation()),
            '#' => k == 0,
            _ => false,
        };
        if c.is_control() {
            out.push(' ');
        } else {
            if escape {
                out.push('\\');
            }
            out.push(c);
        }
    }
    out
}

/// `s` as a Markdown code span, fenced by more backticks than it holds in a
/// row.
fn md_code(s: &str) -> String {
    let s: String = s
        .chars()
        .map(|c| if c.is_control() { ' ' } else { c })
        .collect();
    let mut longest = 0;
    let mut run = 0;
    for c in s.chars() {
        run = if c == '`' { run + 1 } else { 0 };
        longest = longest.max(run);
    }
    let fence = "`".repeat(longest + 1);
    if longest > 0 {
        format!("{fence} {s} {fence}")
    } else {
        format!("{fence}{s}{fence}")
    }
}

/// `value`'s low `width` bits, most significant first.
fn bits(value: usize, width: usize) -> String {
    (0..width)
        .rev()
        .map(|k| if (value >> k) & 1 == 1 { '1' } else { '0' })
        .collect()
}

/// The Gray code of `i`: consecutive codes differ in one bit.
fn gray(i: usize) -> usize {
    i ^ (i >> 1)
}

/// The truth table of `functions` over the inputs `inputs` (first = most
/// significant bit), one row per minterm in ascending order. With
/// `max_rows`, only the first rows are shown and a last line says how many
/// were left out. Every function must have `inputs.len()` inputs.
pub fn render_truth_table<S: AsRef<str>>(
    inputs: &[S],
    functions: &[Function<'_>],
    format: Format,
    max_rows: Option<usize>,
) -> Result<String, RenderError> {
    let n = inputs.len();
    if n > MAX_VARS {
        return Err(RenderError::TooManyInputs { names: n });
    }
    for f in functions {
        f.check(n)?;
    }
    if n == 0 && functions.is_empty() {
        return Err(RenderError::Empty);
    }
    let total = 1usize << n;
    let shown = max_rows.map_or(total, |r| r.min(total));
    let header = inputs
        .iter()
        .map(|s| one_line(s.as_ref()))
        .chain(functions.iter().map(|f| one_line(f.name)))
        .collect::<Vec<_>>();
    let mut bars = vec![false; header.len().saturating_sub(1)];
    if n > 0 && !functions.is_empty() {
        bars[n - 1] = true;
    }
    // Every body cell is one character wide.
    let ones = vec![String::from("0"); header.len()];
    let layout = Layout::new(format, bars, &[&header, &ones]);
    let mut out = String::new();
    layout.line(&mut out, &header);
    layout.rule(&mut out);
    let dc = DONT_CARE.to_string();
    let symbol = |c: char| match c {
        '1' => "1",
        '0' => "0",
        _ => dc.as_str(),
    };
    let mut cells: Vec<&str> = Vec::with_capacity(header.len());
    for m in 0..shown {
        cells.clear();
        cells.extend((0..n).map(|i| {
            if (m >> (n - 1 - i)) & 1 == 1 {
                "1"
            } else {
                "0"
            }
        }));
        cells.extend(functions.iter().map(|f| symbol(f.cell(m))));
        layout.line(&mut out, &cells);
    }
    if shown < total {
        let cut = total - shown;
        let note = if cut == 1 {
            format!("1 of {total} rows not shown (minterm {shown}).\n")
        } else {
            format!(
                "{cut} of {total} rows not shown (minterms {shown} to {}).\n",
                total - 1
            )
        };
        if format == Format::Markdown {
            out.push('\n');
        }
        out.push_str(&note);
    }
    Ok(out)
}

/// Label of term `t`: a, b, ..., z, aa, ab, ...
fn term_label(t: usize) -> String {
    let mut t = t + 1;
    let mut out = Vec::new();
    while t > 0 {
        t -= 1;
        out.push(b'a' + (t % 26) as u8);
        t /= 26;
    }
    out.reverse();
    String::from_utf8(out).unwrap_or_default()
}

/// The Karnaugh map of `function` over `inputs` (1 to 6 names). Each cell
/// shows the value (1, 0 or [`DONT_CARE`]); with a `cover`, each term gets a
/// label (a, b, c, ...), each cell lists after its value the labels of the
/// terms containing it (joined by commas when there are more than 26
/// terms), and a legend gives each term as an expression over the names.
/// Five and six variables give one map per value of the first one or two,
/// titled with that value.
pub fn render_karnaugh_map<S: AsRef<str>>(
    inputs: &[S],
    function: &Function<'_>,
    cover: Option<&Cover>,
    format: Format,
) -> Result<String, RenderError> {
    let n = inputs.len();
    if !(1..=6).contains(&n) {
        return Err(RenderError::MapVars { vars: n });
    }
    function.check(n)?;
    if let Some(c) = cover
        && c.vars != n
    {
        return Err(RenderError::CoverVars {
            cover: c.vars,
            vars: n,
        });
    }
    let names: Vec<String> = inputs.iter().map(|s| one_line(s.as_ref())).collect();
    let extra = n.saturating_sub(4);
    let k = n - extra;
    let (r, c) = (k / 2, k - k / 2);
    let join = |vars: std::ops::Range<usize>| names[vars].join(" ");
    let corner = format!("{} \\ {}", join(extra..extra + r), join(extra + r..n))
        .trim()
        .to_string();
    let terms = cover.map_or(&[][..], |c| &c.cubes[..]);
    let sep = if terms.len() > 26 { "," } else { "" };
    let mut out = String::new();
    for map in 0..1usize << extra {
        let e = gray(map);
        let mut title = Vec::new();
        if !function.name.is_empty() {
            title.push(one_line(function.name));
        }
        if extra > 0 {
            title.push(format!("{} = {}", join(0..extra), bits(e, extra)));
        }
        if !title.is_empty() {
            let title = title.join(", ");
            match format {
                Format::Text => out.push_str(&title),
                Format::Markdown => {
                    // A leading `-`, `+` or `=` would start a list or
                    // underline a heading.
                    if title.starts_with(['-', '+', '=']) {
                        out.push('\\');
                    }
                    out.push_str(&md_escape(&title));
                }
            }
            out.push_str("\n\n");
        }
        let header = std::iter::once(corner.clone())
            .chain((0..1usize << c).map(|j| bits(gray(j), c)))
            .collect::<Vec<_>>();
        let rows: Vec<Vec<String>> = (0..1usize << r)
            .map(|i| {
                let gr = gray(i);
                std::iter::once(bits(gr, r))
                    .chain((0..1usize << c).map(|j| {
                        let m = (e << k) | (gr << c) | gray(j);
                        let labels: Vec<String> = terms
                            .iter()
                            .enumerate()
                            .filter(|(_, t)| t.contains_minterm(n, m))
                            .map(|(t, _)| term_label(t))
                            .collect();
                        let value = function.cell(m);
                        if labels.is_empty() {
                            value.to_string()
                        } else {
                            format!("{value} {}", labels.join(sep))
                        }
                    }))
                    .collect()
            })
            .collect();
        let bars = vec![true; 1usize << c];
        let mut lines: Vec<&[String]> = vec![&header];
        lines.extend(rows.iter().map(|r| &r[..]));
        let layout = Layout::new(format, bars, &lines);
        layout.line(&mut out, &header);
        layout.rule(&mut out);
        for r in &rows {
            layout.line(&mut out, r);
        }
        out.push('\n');
    }
    if !terms.is_empty() {
        out.push_str("terms\n");
        if format == Format::Markdown {
            out.push('\n');
        }
        let name = |i: usize| names.get(i).map_or_else(String::new, |s| s.to_string());
        for (t, cube) in terms.iter().enumerate() {
            let one = Cover {
                vars: n,
                cubes: vec![*cube],
            };
            let text = BoolExpr::from_cover(&one).to_text(&name);
            match format {
                Format::Text => out.push_str(&format!("  {}: {text}\n", term_label(t))),
                Format::Markdown => {
                    out.push_str(&format!("- {}: {}\n", term_label(t), md_code(&text)))
                }
            }
        }
    } else {
        // No trailing blank line after the last map.
        out.pop();
    }
    Ok(out)
}
