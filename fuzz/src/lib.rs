//! The properties checked by the fuzz targets, shared by both.
//!
//! For any input the parser must return, not panic, and report errors whose
//! spans are byte ranges inside the text that start and end on character
//! boundaries. For an input that parses without errors the formatter must
//! succeed, be idempotent, keep the tree's structure, and keep every comment.

use implica_syntax::dump::dump_structure;
use implica_syntax::format::format_source;
use implica_syntax::{SyntaxError, decode, parse};

/// Decodes `bytes` as a source file would be, then checks [`check_text`].
pub fn check_bytes(bytes: &[u8]) {
    let (text, error) = decode(bytes);
    assert_eq!(
        text.len(),
        bytes.len(),
        "decode must keep every byte offset"
    );
    if let Some(error) = &error {
        check_span(&text, error, "decode");
    }
    check_text(&text);
}

/// Parses `src` and checks every property listed in the module comment.
pub fn check_text(src: &str) {
    let (file, errors) = parse(src);
    for error in &errors {
        check_span(src, error, "parse");
    }
    if !errors.is_empty() {
        return;
    }

    let formatted = match format_source(src) {
        Ok(f) => f,
        Err(errors) => panic!("format_source failed on text that parses cleanly: {errors:?}"),
    };
    let again = match format_source(&formatted) {
        Ok(f) => f,
        Err(errors) => panic!(
            "the formatted text does not parse: {errors:?}\nformatted:\n{formatted:?}"
        ),
    };
    assert_eq!(
        formatted, again,
        "formatting is not idempotent\nsource: {src:?}"
    );

    let (refile, reerrors) = parse(&formatted);
    assert!(
        reerrors.is_empty(),
        "the formatted text does not parse: {reerrors:?}"
    );
    assert_eq!(
        dump_structure(&file),
        dump_structure(&refile),
        "formatting changed the structure\nsource: {src:?}\nformatted: {formatted:?}"
    );

    let hashes = |s: &str| s.bytes().filter(|&b| b == b'#').count();
    assert_eq!(
        hashes(src),
        hashes(&formatted),
        "formatting lost or added a comment\nsource: {src:?}\nformatted: {formatted:?}"
    );
}

fn check_span(src: &str, error: &SyntaxError, from: &str) {
    let span = error.span;
    assert!(
        span.start <= span.end && span.end <= src.len(),
        "{from} error span {span:?} out of bounds (len {}): {error:?}",
        src.len()
    );
    assert!(
        src.is_char_boundary(span.start) && src.is_char_boundary(span.end),
        "{from} error span {span:?} not on char boundaries: {error:?}"
    );
    for (related, _) in &error.related {
        assert!(
            related.start <= related.end && related.end <= src.len(),
            "{from} related span {related:?} out of bounds (len {}): {error:?}",
            src.len()
        );
        assert!(
            src.is_char_boundary(related.start) && src.is_char_boundary(related.end),
            "{from} related span {related:?} not on char boundaries: {error:?}"
        );
    }
}

/// The pieces that [`tokens_to_text`] maps input bytes to: names, keywords,
/// punctuation, numbers and trivia of the language.
pub const ALPHABET: &[&str] = &[
    // names
    "a", "b", "c", "sig_1",
    // keywords
    "input", "output", "let", "table", "never", "assert", "expect", "on", "off", "dc", "over",
    "unlisted", "not", "and", "or", "xor", "nand", "nor", "xnor",
    // punctuation
    "(", ")", "{", "}", ",", "->", "-", "..", "=", "==", "!=", "=>", "!", "&", "|", "^",
    // numbers
    "0", "1", "01", "0x1F", "12",
    // trivia
    " ", "\n", "# c\n",
];

/// Builds source text by mapping each byte to a piece of [`ALPHABET`], so
/// that random bytes make text the grammar gets further into.
pub fn tokens_to_text(bytes: &[u8]) -> String {
    let mut text = String::new();
    for &b in bytes {
        text.push_str(ALPHABET[b as usize % ALPHABET.len()]);
    }
    text
}
