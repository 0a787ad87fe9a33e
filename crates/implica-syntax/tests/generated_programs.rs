//! Property test over generated programs: every statement kind, random
//! spacing, line breaks, blank lines and comments. Each program parses
//! without errors; formatting is idempotent, keeps every comment, and gives
//! the same tree (spans and blank lines aside).

use implica_syntax::dump::dump_structure;
use implica_syntax::format::format_source;
use implica_syntax::{parse, parse_reference};
use proptest::prelude::*;

const NAMES: [&str; 6] = ["a", "b", "c", "door_ok", "t1", "x_2"];

fn name() -> impl Strategy<Value = String> {
    prop::sample::select(&NAMES[..]).prop_map(str::to_string)
}

/// Space between tokens: one or more spaces or a line break (expressions may span lines).
fn gap() -> impl Strategy<Value = &'static str> {
    prop::sample::select(vec![" ", " ", " ", "  ", "\n  ", "\t"])
}

fn expr() -> impl Strategy<Value = String> {
    let leaf = prop_oneof![name(), Just("0".to_string()), Just("1".to_string())];
    leaf.prop_recursive(4, 24, 3, |inner| {
        let op = prop::sample::select(vec![
            "&", "and", "|", "or", "^", "xor", "==", "!=", "=>", "nand", "nor", "xnor",
        ]);
        prop_oneof![
            inner.clone().prop_map(|e| format!("!{e}")),
            inner.clone().prop_map(|e| format!("not {e}")),
            (inner.clone(), gap()).prop_map(|(e, g)| format!("({g}{e}{g})")),
            // Operands of a binary operator are parenthesized, so any mix of
            // operators is valid.
            (inner.clone(), op, inner, gap())
                .prop_map(|(a, o, b, g)| format!("({a}){g}{o}{g}({b})")),
        ]
    })
}

fn names(min: usize) -> impl Strategy<Value = String> {
    proptest::collection::vec(name(), min..4).prop_map(|v| v.join(", "))
}

fn cells(n: usize) -> impl Strategy<Value = String> {
    (
        proptest::collection::vec(prop::sample::select(vec!['0', '1', '-']), n),
        any::<bool>(),
    )
        .prop_map(|(c, spaced)| {
            let strs: Vec<String> = c.iter().map(|c| c.to_string()).collect();
            strs.join(if spaced { " " } else { "" })
        })
}

fn comment() -> impl Strategy<Value = String> {
    prop_oneof![
        Just(String::new()),
        "[a-z ]{0,10}".prop_map(|t| format!("  # {t}"))
    ]
}

fn table(kw: &'static str) -> impl Strategy<Value = String> {
    (1usize..4, 1usize..3).prop_flat_map(move |(ni, no)| {
        (
            proptest::collection::vec(name(), ni),
            proptest::collection::vec(name(), no),
            proptest::collection::vec((cells(ni), cells(no), comment()), 0..5),
            comment(),
        )
            .prop_map(move |(ins, outs, rows, open)| {
                let mut s = format!(
                    "{kw} ({} -> {}) {{{open}\n",
                    ins.join(", "),
                    outs.join(", ")
                );
                for (i, o, c) in rows {
                    s.push_str(&format!("  {i} -> {o}{c}\n"));
                }
                s.push('}');
                s
            })
    })
}

fn statement() -> impl Strategy<Value = String> {
    let num = prop_oneof![
        (0u64..16).prop_map(|n| n.to_string()),
        (0u64..16).prop_map(|n| format!("0x{n:X}"))
    ];
    // Row numbers below 16, over four signals; ranges ascending.
    let range = (0u64..16, 0u64..16).prop_map(|(a, b)| format!("{}..{}", a.min(b), a.max(b)));
    let entry = prop_oneof![num, range];
    let list = proptest::collection::vec(entry, 0..4).prop_map(|v| v.join(", "));
    prop_oneof![
        names(1).prop_map(|n| format!("input {n}")),
        names(1).prop_map(|n| format!("output {n}")),
        (name(), expr()).prop_map(|(n, e)| format!("{n} = {e}")),
        (name(), expr()).prop_map(|(n, e)| format!("let {n} = {e}")),
        expr().prop_map(|e| format!("never {e}")),
        expr().prop_map(|e| format!("assert {e}")),
        (
            name(),
            prop::sample::select(vec!["on", "off"]),
            list.clone(),
            list,
            proptest::collection::vec(name(), 4).prop_map(|v| v.join(", "))
        )
            .prop_map(|(n, k, l, d, o)| format!("{n} = {k}({l}) dc({d}) over ({o})")),
        table("table"),
        table("let table"),
        table("expect"),
    ]
}

fn program() -> impl Strategy<Value = String> {
    let sep = prop::sample::select(vec!["\n", "\n", "\n\n", "\n\n\n", " "]);
    proptest::collection::vec((statement(), comment(), sep, comment()), 0..12).prop_map(|parts| {
        let mut s = String::new();
        for (stmt, trailing, sep, leading) in parts {
            if !leading.is_empty() {
                s.push_str(leading.trim_start());
                s.push('\n');
            }
            s.push_str(&stmt);
            s.push_str(&trailing);
            // A trailing comment runs to the end of the line.
            s.push_str(if trailing.is_empty() { sep } else { "\n" });
        }
        s
    })
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(512))]
    #[test]
    fn generated_programs_roundtrip(src in program()) {
        let (before, errors) = parse(&src);
        prop_assert_eq!(&(before.clone(), errors.clone()), &parse_reference(&src), "fast path disagrees");
        prop_assert!(errors.is_empty(), "errors {:?} in\n{}", errors, src);
        let once = format_source(&src).expect("parses");
        let twice = format_source(&once).expect("formatted text parses");
        prop_assert_eq!(&once, &twice, "not idempotent for\n{}", src);
        let (after, _) = parse(&once);
        prop_assert_eq!(dump_structure(&before), dump_structure(&after));
        prop_assert_eq!(src.matches('#').count(), once.matches('#').count());
    }
}
