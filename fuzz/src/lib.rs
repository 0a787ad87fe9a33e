//! The fuzz targets' input builders. The properties the syntax targets
//! check live in `implica_syntax::invariants`, shared with the regression
//! tests; those of the `logic` target in [`logic`].

pub mod logic;

pub use implica_syntax::invariants::{check_bytes, check_text};

/// The pieces that [`tokens_to_text`] maps input bytes to: names, keywords,
/// punctuation, numbers and trivia of the language.
#[rustfmt::skip]
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
