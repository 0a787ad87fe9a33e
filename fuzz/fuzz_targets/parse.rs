//! Raw bytes → decode → parse (and format, when the parse is clean).
#![no_main]

use libfuzzer_sys::fuzz_target;

fuzz_target!(|data: &[u8]| {
    implica_fuzz::check_bytes(data);
});
