//! Printing a proven netlist as Verilog or VHDL.
//!
//! Both printers parenthesize by the same rule, stricter than either
//! language needs: an operand that is itself an AND, OR or XOR of a
//! different kind is put in parentheses (VHDL requires this; in Verilog it
//! keeps the reading independent of its precedence table), except the
//! products of a sum of products in Verilog, where `&` binding tighter than
//! `|` is the form every reader expects.

use crate::{Assign, Netlist};
use implica_logic::BoolExpr;

/// Lines longer than this are broken before each operand of a top-level OR
/// (or AND).
const WIDTH: usize = 96;

/// The spelling of a target language's operators.
struct Syntax {
    t: &'static str,
    f: &'static str,
    not: &'static str,
    and: &'static str,
    or: &'static str,
    xor: &'static str,
    /// Whether an AND inside an OR goes without parentheses.
    bare_products: bool,
}

const VERILOG: Syntax = Syntax {
    t: "1'b1",
    f: "1'b0",
    not: "~",
    and: " & ",
    or: " | ",
    xor: " ^ ",
    bare_products: true,
};

const VHDL: Syntax = Syntax {
    t: "'1'",
    f: "'0'",
    not: "not ",
    and: " and ",
    or: " or ",
    xor: " xor ",
    bare_products: false,
};

fn is_operator(e: &BoolExpr) -> bool {
    matches!(e, BoolExpr::And(v) | BoolExpr::Or(v) | BoolExpr::Xor(v) if v.len() > 1)
}

fn expr(e: &BoolExpr, names: &[String], sx: &Syntax) -> String {
    match e {
        BoolExpr::Const(true) => sx.t.to_string(),
        BoolExpr::Const(false) => sx.f.to_string(),
        BoolExpr::Var(i) => names[*i].clone(),
        BoolExpr::Not(x) => {
            let inner = expr(x, names, sx);
            if is_operator(x) || matches!(**x, BoolExpr::Not(_)) {
                format!("{}({inner})", sx.not)
            } else {
                format!("{}{inner}", sx.not)
            }
        }
        BoolExpr::And(es) | BoolExpr::Or(es) | BoolExpr::Xor(es) => {
            let (empty, sep) = match e {
                BoolExpr::And(_) => (sx.t, sx.and),
                BoolExpr::Or(_) => (sx.f, sx.or),
                _ => (sx.f, sx.xor),
            };
            if es.is_empty() {
                return empty.to_string();
            }
            es.iter()
                .map(|x| operand(e, x, names, sx))
                .collect::<Vec<_>>()
                .join(sep)
        }
    }
}

/// An operand of `parent`, in parentheses when it is an operator.
fn operand(parent: &BoolExpr, x: &BoolExpr, names: &[String], sx: &Syntax) -> String {
    let text = expr(x, names, sx);
    let bare = !is_operator(x)
        || (sx.bare_products && matches!(parent, BoolExpr::Or(_)) && matches!(x, BoolExpr::And(_)));
    if bare { text } else { format!("({text})") }
}

/// `lead` followed by `e`, broken before each operand of a top-level OR or
/// AND when one line would be too long; `end` closes the statement.
fn statement(lead: &str, e: &BoolExpr, names: &[String], sx: &Syntax, end: &str) -> String {
    let one = format!("{lead}{}{end}", expr(e, names, sx));
    let (terms, op) = match e {
        BoolExpr::Or(terms) => (terms, sx.or),
        BoolExpr::And(terms) => (terms, sx.and),
        _ => return one,
    };
    if one.len() <= WIDTH || terms.len() < 2 {
        return one;
    }
    let op = op.trim_start();
    let indent = " ".repeat(lead.len().saturating_sub(op.len()));
    let mut out = String::new();
    for (k, t) in terms.iter().enumerate() {
        if k == 0 {
            out.push_str(lead);
        } else {
            out.push('\n');
            out.push_str(&indent);
            out.push_str(op);
        }
        out.push_str(&operand(e, t, names, sx));
    }
    out.push_str(end);
    out
}

fn comment_block(out: &mut String, prefix: &str, indent: &str, lines: &[String]) {
    for l in lines {
        out.push_str(indent);
        if l.is_empty() {
            out.push_str(prefix.trim_end());
        } else {
            out.push_str(prefix);
            out.push_str(&ascii(l));
        }
        out.push('\n');
    }
}

/// Comments in plain ASCII: Verilog source is ASCII and VHDL's is
/// ISO 8859-1, so other characters become `?`.
fn ascii(s: &str) -> String {
    s.chars()
        .map(|c| {
            if c.is_ascii() && !c.is_ascii_control() {
                c
            } else {
                '?'
            }
        })
        .collect()
}

fn assign_comments(a: &Assign) -> Vec<String> {
    let mut lines = a.comments.clone();
    if let Some(n) = &a.note {
        lines.push(n.clone());
    }
    lines
}

/// A Verilog-2005 module.
pub(crate) fn verilog(n: &Netlist) -> String {
    let mut out = String::new();
    comment_block(&mut out, "// ", "", &n.header);
    out.push_str("\n`default_nettype none\n\nmodule ");
    out.push_str(&n.module);
    out.push_str(" (\n");
    let ports = n.inputs + n.outputs;
    for p in 0..ports {
        let dir = if p < n.inputs { "input " } else { "output" };
        out.push_str(&format!(
            "    {dir} wire {}{}\n",
            n.names[p],
            if p + 1 < ports { "," } else { "" }
        ));
    }
    out.push_str(");\n");
    if n.names.len() > ports {
        out.push('\n');
        for name in &n.names[ports..] {
            out.push_str(&format!("    wire {name};\n"));
        }
    }
    for a in &n.assigns {
        let comments = assign_comments(a);
        out.push('\n');
        comment_block(&mut out, "// ", "    ", &comments);
        let lead = format!("    assign {} = ", n.names[a.target]);
        out.push_str(&statement(&lead, &a.expr, &n.names, &VERILOG, ";"));
        out.push('\n');
    }
    out.push_str("\nendmodule\n\n`default_nettype wire\n");
    out
}

/// A VHDL-2008 entity and its architecture.
pub(crate) fn vhdl(n: &Netlist) -> String {
    let mut out = String::new();
    comment_block(&mut out, "-- ", "", &n.header);
    out.push_str("\nlibrary ieee;\nuse ieee.std_logic_1164.all;\n\n");
    out.push_str(&format!("entity {} is\n    port (\n", n.module));
    let ports = n.inputs + n.outputs;
    let width = n.names[..ports].iter().map(String::len).max().unwrap_or(0);
    for p in 0..ports {
        let dir = if p < n.inputs { "in " } else { "out" };
        out.push_str(&format!(
            "        {:width$} : {dir} std_logic{}\n",
            n.names[p],
            if p + 1 < ports { ";" } else { "" }
        ));
    }
    out.push_str(&format!("    );\nend entity {};\n\n", n.module));
    out.push_str(&format!("architecture rtl of {} is\n", n.module));
    for name in &n.names[ports..] {
        out.push_str(&format!("    signal {name} : std_logic;\n"));
    }
    out.push_str("begin\n");
    for (k, a) in n.assigns.iter().enumerate() {
        let comments = assign_comments(a);
        if k > 0 && !comments.is_empty() {
            out.push('\n');
        }
        comment_block(&mut out, "-- ", "    ", &comments);
        let lead = format!("    {} <= ", n.names[a.target]);
        out.push_str(&statement(&lead, &a.expr, &n.names, &VHDL, ";"));
        out.push('\n');
    }
    out.push_str("end architecture rtl;\n");
    out
}
