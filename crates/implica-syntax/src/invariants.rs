//! Properties that hold for every input, checked by the fuzz targets
//! (`fuzz/`) and by the regression tests that replay their inputs.
//!
//! For any input the parser must return, not panic, and report errors whose
//! spans are byte ranges inside the text that start and end on character
//! boundaries. The fast path of the parser must give exactly what the
//! combinator grammar alone gives (`parse_reference`). For an input that
//! parses without errors the formatter must succeed, be idempotent, keep the
//! tree's structure, and keep every comment.
//!
//! Each check panics, with the input, when a property fails.

use crate::dump::dump_structure;
use crate::format::format_source;
use crate::{SyntaxError, decode, parse, parse_reference};

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
    // The hand-written fast path must agree with the combinator grammar.
    let (ref_file, ref_errors) = parse_reference(src);
    assert!(
        file == ref_file && errors == ref_errors,
        "parse and parse_reference disagree\nsource: {src:?}"
    );
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
        Err(errors) => {
            panic!("the formatted text does not parse: {errors:?}\nformatted:\n{formatted:?}")
        }
    };
    assert_eq!(
        formatted, again,
        "formatting is not idempotent\nsource: {src:?}"
    );

    assert_same_structure(src, &formatted);

    let hashes = |s: &str| s.bytes().filter(|&b| b == b'#').count();
    assert_eq!(
        hashes(src),
        hashes(&formatted),
        "formatting lost or added a comment\nsource: {src:?}\nformatted: {formatted:?}"
    );
}

fn check_span(src: &str, error: &SyntaxError, from: &str) {
    let related = error.related.iter().map(|(span, _)| (*span, "related"));
    for (span, what) in std::iter::once((error.span, "error")).chain(related) {
        assert!(
            span.start <= span.end && span.end <= src.len(),
            "{from} {what} span {span:?} out of bounds (len {}): {error:?}",
            src.len()
        );
        assert!(
            src.is_char_boundary(span.start) && src.is_char_boundary(span.end),
            "{from} {what} span {span:?} not on char boundaries: {error:?}"
        );
    }
}

/// Panics unless `before` and `after` parse to the same tree, spans and
/// blank lines aside.
pub fn assert_same_structure(before: &str, after: &str) {
    let (a, _) = parse(before);
    let (b, _) = parse(after);
    assert_eq!(
        dump_structure(&a),
        dump_structure(&b),
        "the trees differ\nbefore: {before:?}\nafter: {after:?}"
    );
}
