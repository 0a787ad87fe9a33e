//! Hostile input: arbitrary bytes, invalid UTF-8, extreme nesting and size.
//! None of it may panic, hang or overflow the stack.

use implica_syntax::ast::{ExprKind, ItemKind, Rhs};
use implica_syntax::{MAX_NESTING, decode, format::format_source, parse, parse_reference};
use proptest::prelude::*;

/// Runs `f` on a thread with a small stack, so that a recursion that grows
/// with the input fails here rather than only on large inputs.
fn on_small_stack<T: Send + 'static>(f: impl FnOnce() -> T + Send + 'static) -> T {
    std::thread::Builder::new()
        .stack_size(1 << 20)
        .spawn(f)
        .expect("spawn")
        .join()
        .expect("no panic or stack overflow")
}

fn assert_spans_valid(src: &str) {
    let (_, errors) = parse(src);
    for e in &errors {
        assert!(
            e.span.start <= e.span.end && e.span.end <= src.len(),
            "span {:?} out of bounds",
            e.span
        );
        assert!(src.is_char_boundary(e.span.start) && src.is_char_boundary(e.span.end));
        assert!(!e.message.is_empty());
    }
}

proptest! {
    #[test]
    fn arbitrary_bytes_never_panic(bytes in proptest::collection::vec(any::<u8>(), 0..400)) {
        let (text, _) = decode(&bytes);
        prop_assert_eq!(text.len(), bytes.len());
        assert_spans_valid(&text);
        let _ = format_source(&text);
    }

    #[test]
    fn token_soup_never_panics(words in proptest::collection::vec(
        prop::sample::select(vec![
            "a", "b", "y", "input", "output", "let", "table", "never", "assert", "expect", "on", "off",
            "dc", "over", "unlisted", "not", "and", "nand", "xnor", "(", ")", "{", "}", ",", "->", "-",
            "..", "=", "==", "!=", "=>", "!", "&", "|", "^", "0", "1", "01", "0x1F", "\n", " ", "# c\n", "&&", "@",
        ]),
        0..80,
    )) {
        let src: String = words.concat();
        assert_spans_valid(&src);
        prop_assert_eq!(parse(&src), parse_reference(&src), "fast path disagrees on {:?}", src);
        if let Ok(once) = format_source(&src) {
            prop_assert_eq!(format_source(&once).ok(), Some(once.clone()));
        }
    }
}

#[test]
fn invalid_utf8_names_the_byte_offset_and_the_rest_is_parsed() {
    let bytes = b"input a\n\xff\xfeoutput y\ny = a &\n";
    let (text, error) = decode(bytes);
    let error = error.expect("an encoding error");
    assert_eq!(error.span.start, 8);
    assert!(error.message.contains("byte 8"), "{}", error.message);
    assert!(
        error.message.contains("2 invalid bytes"),
        "{}",
        error.message
    );
    // Offsets are kept, so the syntax error after it is still found, where it is.
    let (_, errors) = parse(&text);
    assert_eq!(errors.len(), 1);
    assert_eq!(errors[0].span.start, bytes.len() - 1);
}

#[test]
fn hundred_thousand_nested_parentheses_give_one_clear_error() {
    on_small_stack(|| {
        let n = 100_000;
        let src = format!(
            "input a\noutput y, z\ny = {}a{}\nz = a\n",
            "(".repeat(n),
            ")".repeat(n)
        );
        let (file, errors) = parse(&src);
        assert_eq!(errors.len(), 1, "{errors:?}");
        assert!(
            errors[0]
                .message
                .contains(&format!("more than {MAX_NESTING} levels"))
        );
        assert_eq!(errors[0].span.start, src.find('(').unwrap() + MAX_NESTING);
        assert_eq!(
            errors[0].help.as_deref(),
            Some("split it into intermediate signals with `let`")
        );
        // The statement after it is parsed.
        assert!(matches!(
            file.items.last().unwrap().kind,
            ItemKind::Define(_)
        ));
    });
}

#[test]
fn hundred_thousand_nots_give_one_clear_error() {
    on_small_stack(|| {
        let src = format!("input a\noutput y\ny = {}a\n", "!".repeat(100_000));
        let (_, errors) = parse(&src);
        assert_eq!(errors.len(), 1);
        assert!(errors[0].message.contains("nests more than"));
    });
}

#[test]
fn nesting_at_the_limit_parses_and_formats_on_a_small_stack() {
    on_small_stack(|| {
        let half = MAX_NESTING / 2;
        let inner = format!("{}a{}", "(".repeat(half), ")".repeat(half));
        let src = format!(
            "input  a\noutput y\ny = {}{inner}\n",
            "!".repeat(MAX_NESTING - half)
        );
        let (_, errors) = parse(&src);
        assert!(errors.is_empty(), "{errors:?}");
        assert_eq!(format_source(&src).unwrap(), src);
    });
}

#[test]
fn a_million_operands_make_a_flat_chain() {
    on_small_stack(|| {
        let n = 1_000_000;
        let src = format!("input a\noutput y\ny = a{}\n", " & a".repeat(n - 1));
        let (file, errors) = parse(&src);
        assert!(errors.is_empty());
        let ItemKind::Define(d) = &file.items[2].kind else {
            panic!("a definition")
        };
        let Rhs::Expr(e) = &d.rhs else {
            panic!("an expression")
        };
        let ExprKind::Chain { operands, .. } = &e.kind else {
            panic!("a chain")
        };
        assert_eq!(operands.len(), n);
        drop(file);
    });
}

#[test]
fn a_million_line_file_parses() {
    let mut src = String::from("input a, b, c\n");
    for i in 0..1_000_000 {
        src.push_str(&format!("let s{i} = a & b | !c\n"));
    }
    let (file, errors) = parse(&src);
    assert!(errors.is_empty());
    assert_eq!(file.items.len(), 1_000_001);
}

#[test]
fn empty_and_blank_files() {
    for src in ["", "\n", "\n\n\n", "   ", "\r\n", "# only\n"] {
        let (file, errors) = parse(src);
        assert!(errors.is_empty(), "{src:?}");
        assert!(file.items.is_empty());
    }
    assert_eq!(format_source("\n\n").unwrap(), "");
}

#[test]
fn crlf_line_ends_are_read_and_formatted_to_lf() {
    let src = "input a\r\noutput y  # out\r\ny = a\r\ntable (a -> y) {\r\n  0 -> 1\r\n}\r\n";
    let (_, errors) = parse(src);
    assert!(errors.is_empty(), "{errors:?}");
    let out = format_source(src).unwrap();
    assert!(!out.contains('\r'));
    assert!(out.contains("output y  # out\n"));
}

#[test]
fn a_byte_order_mark_is_accepted_and_kept() {
    let src = "\u{FEFF}input a\noutput y\ny=a\n";
    let (_, errors) = parse(src);
    assert!(errors.is_empty(), "{errors:?}");
    assert_eq!(
        format_source(src).unwrap(),
        "\u{FEFF}input  a\noutput y\ny = a\n"
    );
}
