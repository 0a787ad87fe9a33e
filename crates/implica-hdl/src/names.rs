//! Names in the target language: every signal keeps its Implica name where
//! that is a legal identifier there, and gets a close legal one where it is
//! not (a reserved word, or in VHDL a name with a leading, trailing or
//! doubled underscore, or one that differs from another only in case).

use crate::Language;
use std::collections::HashSet;

/// Verilog (IEEE 1364-2005, Annex B) keywords, and SystemVerilog's
/// (IEEE 1800-2017, Annex B), so that the module also reads in tools that
/// take SystemVerilog.
const VERILOG_RESERVED: &[&str] = &[
    "accept_on",
    "alias",
    "always",
    "always_comb",
    "always_ff",
    "always_latch",
    "and",
    "assert",
    "assign",
    "assume",
    "automatic",
    "before",
    "begin",
    "bind",
    "bins",
    "binsof",
    "bit",
    "break",
    "buf",
    "bufif0",
    "bufif1",
    "byte",
    "case",
    "casex",
    "casez",
    "cell",
    "chandle",
    "checker",
    "class",
    "clocking",
    "cmos",
    "config",
    "const",
    "constraint",
    "context",
    "continue",
    "cover",
    "covergroup",
    "coverpoint",
    "cross",
    "deassign",
    "default",
    "defparam",
    "design",
    "disable",
    "dist",
    "do",
    "edge",
    "else",
    "end",
    "endcase",
    "endchecker",
    "endclass",
    "endclocking",
    "endconfig",
    "endfunction",
    "endgenerate",
    "endgroup",
    "endinterface",
    "endmodule",
    "endpackage",
    "endprimitive",
    "endprogram",
    "endproperty",
    "endsequence",
    "endspecify",
    "endtable",
    "endtask",
    "enum",
    "event",
    "eventually",
    "expect",
    "export",
    "extends",
    "extern",
    "final",
    "first_match",
    "for",
    "force",
    "foreach",
    "forever",
    "fork",
    "forkjoin",
    "function",
    "generate",
    "genvar",
    "global",
    "highz0",
    "highz1",
    "if",
    "iff",
    "ifnone",
    "ignore_bins",
    "illegal_bins",
    "implements",
    "implies",
    "import",
    "incdir",
    "include",
    "initial",
    "inout",
    "input",
    "inside",
    "instance",
    "int",
    "integer",
    "interconnect",
    "interface",
    "intersect",
    "join",
    "join_any",
    "join_none",
    "large",
    "let",
    "liblist",
    "library",
    "local",
    "localparam",
    "logic",
    "longint",
    "macromodule",
    "matches",
    "medium",
    "modport",
    "module",
    "nand",
    "negedge",
    "nettype",
    "new",
    "nexttime",
    "nmos",
    "nor",
    "noshowcancelled",
    "not",
    "notif0",
    "notif1",
    "null",
    "or",
    "output",
    "package",
    "packed",
    "parameter",
    "pmos",
    "posedge",
    "primitive",
    "priority",
    "program",
    "property",
    "protected",
    "pull0",
    "pull1",
    "pulldown",
    "pullup",
    "pulsestyle_ondetect",
    "pulsestyle_onevent",
    "pure",
    "rand",
    "randc",
    "randcase",
    "randsequence",
    "rcmos",
    "real",
    "realtime",
    "ref",
    "reg",
    "reject_on",
    "release",
    "repeat",
    "restrict",
    "return",
    "rnmos",
    "rpmos",
    "rtran",
    "rtranif0",
    "rtranif1",
    "s_always",
    "s_eventually",
    "s_nexttime",
    "s_until",
    "s_until_with",
    "scalared",
    "sequence",
    "shortint",
    "shortreal",
    "showcancelled",
    "signed",
    "small",
    "soft",
    "solve",
    "specify",
    "specparam",
    "static",
    "string",
    "strong",
    "strong0",
    "strong1",
    "struct",
    "super",
    "supply0",
    "supply1",
    "sync_accept_on",
    "sync_reject_on",
    "table",
    "tagged",
    "task",
    "this",
    "throughout",
    "time",
    "timeprecision",
    "timeunit",
    "tran",
    "tranif0",
    "tranif1",
    "tri",
    "tri0",
    "tri1",
    "triand",
    "trior",
    "trireg",
    "type",
    "typedef",
    "union",
    "unique",
    "unique0",
    "unsigned",
    "until",
    "until_with",
    "untyped",
    "use",
    "uwire",
    "var",
    "vectored",
    "virtual",
    "void",
    "wait",
    "wait_order",
    "wand",
    "weak",
    "weak0",
    "weak1",
    "while",
    "wildcard",
    "wire",
    "with",
    "within",
    "wor",
    "xnor",
    "xor",
];

/// VHDL-2008 (IEEE 1076-2008, 15.10) reserved words, and the names the
/// generated text itself uses (the library, package and type of every
/// port, and the architecture's name), which a port of that name would
/// hide.
const VHDL_RESERVED: &[&str] = &[
    "abs",
    "access",
    "after",
    "alias",
    "all",
    "and",
    "architecture",
    "array",
    "assert",
    "assume",
    "assume_guarantee",
    "attribute",
    "begin",
    "block",
    "body",
    "buffer",
    "bus",
    "case",
    "component",
    "configuration",
    "constant",
    "context",
    "cover",
    "default",
    "disconnect",
    "downto",
    "else",
    "elsif",
    "end",
    "entity",
    "exit",
    "fairness",
    "file",
    "for",
    "force",
    "function",
    "generate",
    "generic",
    "group",
    "guarded",
    "if",
    "impure",
    "in",
    "inertial",
    "inout",
    "is",
    "label",
    "library",
    "linkage",
    "literal",
    "loop",
    "map",
    "mod",
    "nand",
    "new",
    "next",
    "nor",
    "not",
    "null",
    "of",
    "on",
    "open",
    "or",
    "others",
    "out",
    "package",
    "parameter",
    "port",
    "postponed",
    "procedure",
    "process",
    "property",
    "protected",
    "pure",
    "range",
    "record",
    "register",
    "reject",
    "release",
    "rem",
    "report",
    "restrict",
    "restrict_guarantee",
    "return",
    "rol",
    "ror",
    "select",
    "sequence",
    "severity",
    "shared",
    "signal",
    "sla",
    "sll",
    "sra",
    "srl",
    "strong",
    "subtype",
    "then",
    "to",
    "transport",
    "type",
    "unaffected",
    "units",
    "until",
    "use",
    "variable",
    "vmode",
    "vprop",
    "vunit",
    "wait",
    "when",
    "while",
    "with",
    "xnor",
    "xor",
    // Used by the generated text.
    "ieee",
    "std",
    "std_logic_1164",
    "std_logic",
    "std_ulogic",
    "work",
    "rtl",
];

/// Why a name cannot be used as it is, or `None` when it can.
pub fn problem(language: Language, name: &str) -> Option<String> {
    let lang = language.title();
    let valid_start = name.starts_with(|c: char| c.is_ascii_alphabetic() || c == '_');
    if name.is_empty()
        || !valid_start
        || !name.chars().all(|c| c.is_ascii_alphanumeric() || c == '_')
    {
        return Some(format!("not an identifier in {lang}"));
    }
    match language {
        Language::Verilog => VERILOG_RESERVED
            .contains(&name)
            .then(|| format!("a reserved word in {lang}")),
        Language::Vhdl => {
            let lower = name.to_ascii_lowercase();
            if VHDL_RESERVED.contains(&lower.as_str()) {
                Some(
                    if lower.starts_with("std")
                        || lower == "ieee"
                        || lower == "work"
                        || lower == "rtl"
                    {
                        "a name the generated VHDL uses itself".to_string()
                    } else {
                        format!("a reserved word in {lang}")
                    },
                )
            } else if name.starts_with('_') {
                Some(format!("{lang} names cannot start with `_`"))
            } else if name.ends_with('_') {
                Some(format!("{lang} names cannot end with `_`"))
            } else if name.contains("__") {
                Some(format!("{lang} names cannot contain `__`"))
            } else {
                None
            }
        }
    }
}

/// The key two names collide under: VHDL does not tell case apart.
fn key(language: Language, name: &str) -> String {
    match language {
        Language::Verilog => name.to_string(),
        Language::Vhdl => name.to_ascii_lowercase(),
    }
}

/// A legal name close to `name`, not yet in `used`.
fn legal_near(language: Language, name: &str, used: &HashSet<String>) -> String {
    let mut base: String = name
        .chars()
        .map(|c| if c.is_ascii_alphanumeric() { c } else { '_' })
        .collect();
    if language == Language::Vhdl {
        while base.contains("__") {
            base = base.replace("__", "_");
        }
        base = base.trim_matches('_').to_string();
    }
    if base.is_empty() {
        base = "s".to_string();
    } else if base.starts_with(|c: char| c.is_ascii_digit()) {
        base = format!("s_{base}");
    }
    if problem(language, &base).is_some() {
        base.push_str("_sig");
    }
    let mut candidate = base.clone();
    let mut n = 2;
    while used.contains(&key(language, &candidate)) {
        candidate = format!("{base}_{n}");
        n += 1;
    }
    candidate
}

/// One name given a different spelling.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Renamed {
    /// The name in the Implica document.
    pub from: String,
    /// The name in the generated text.
    pub to: String,
    /// Why, in words ("a reserved word in VHDL").
    pub why: String,
}

/// Target-language names for `names` (in this order of priority: a legal
/// name is kept unless an earlier one already took it), and what changed.
pub fn assign(language: Language, names: &[&str]) -> (Vec<String>, Vec<Renamed>) {
    let mut used: HashSet<String> = HashSet::new();
    let mut out: Vec<Option<String>> = vec![None; names.len()];
    // Legal names first, so that a renamed one never takes a legal name.
    for (i, n) in names.iter().enumerate() {
        if problem(language, n).is_none() && used.insert(key(language, n)) {
            out[i] = Some(n.to_string());
        }
    }
    let mut renamed = Vec::new();
    for (i, n) in names.iter().enumerate() {
        if out[i].is_some() {
            continue;
        }
        let why = problem(language, n).unwrap_or_else(|| {
            format!(
                "{} does not tell it from another name that differs only in case",
                language.title()
            )
        });
        let to = legal_near(language, n, &used);
        used.insert(key(language, &to));
        renamed.push(Renamed {
            from: n.to_string(),
            to: to.clone(),
            why,
        });
        out[i] = Some(to);
    }
    (
        out.into_iter().map(Option::unwrap_or_default).collect(),
        renamed,
    )
}

/// A module or entity name derived from a file name, legal and different
/// from every name in `taken`.
pub fn module_from(language: Language, stem: &str, taken: &[String]) -> String {
    let used: HashSet<String> = taken.iter().map(|t| key(language, t)).collect();
    let mut name = legal_near(language, stem, &HashSet::new());
    while used.contains(&key(language, &name)) {
        name.push_str("_logic");
    }
    name
}

/// Whether `name` (a user's choice of module name) collides with `taken`.
pub fn collides(language: Language, name: &str, taken: &[String]) -> bool {
    taken
        .iter()
        .any(|t| key(language, t) == key(language, name))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn reserved_words_get_a_suffix_and_legal_names_stay() {
        let (names, renamed) = assign(Language::Verilog, &["begin", "door", "wire"]);
        assert_eq!(names, ["begin_sig", "door", "wire_sig"]);
        assert_eq!(renamed.len(), 2);
        assert_eq!(renamed[0].why, "a reserved word in Verilog");
    }

    #[test]
    fn vhdl_underscores_and_case() {
        let (names, renamed) = assign(
            Language::Vhdl,
            &["_arm", "a__b", "x_", "Door", "door", "Signal", "_"],
        );
        assert_eq!(
            names,
            ["arm", "a_b", "x", "Door", "door_2", "Signal_sig", "s"]
        );
        assert_eq!(renamed.len(), 6);
        assert!(renamed[3].why.contains("case"), "{}", renamed[3].why);
        // Every rename is legal itself.
        for n in &names {
            assert_eq!(problem(Language::Vhdl, n), None, "{n}");
        }
    }

    #[test]
    fn a_rename_never_takes_a_legal_name() {
        // `begin` would become `begin_sig`, which a later signal holds.
        let (names, _) = assign(Language::Verilog, &["begin", "begin_sig"]);
        assert_eq!(names, ["begin_sig_2", "begin_sig"]);
    }

    #[test]
    fn module_names_from_file_names() {
        assert_eq!(
            module_from(Language::Verilog, "lift-door.v2", &[]),
            "lift_door_v2"
        );
        assert_eq!(module_from(Language::Vhdl, "9_lives", &[]), "s_9_lives");
        assert_eq!(
            module_from(Language::Vhdl, "Pump", &["pump".to_string()]),
            "Pump_logic"
        );
        assert_eq!(module_from(Language::Verilog, "module", &[]), "module_sig");
    }
}
