//! Bytes → a sequence of Implica tokens and trivia → parse (and format, when
//! the parse is clean).
#![no_main]

use libfuzzer_sys::fuzz_target;

fuzz_target!(|data: &[u8]| {
    implica_fuzz::check_text(&implica_fuzz::tokens_to_text(data));
});
