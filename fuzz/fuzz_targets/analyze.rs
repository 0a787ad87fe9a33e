//! Bytes → a sequence of Implica tokens → the whole analysis: every rule,
//! and the proof of every fix, must finish without a panic; every fix
//! offered must apply, parse and pass its proof again.
#![no_main]

use libfuzzer_sys::fuzz_target;

fuzz_target!(|data: &[u8]| {
    let text = implica_fuzz::tokens_to_text(data);
    let a = implica_analysis::analyze(&text);
    assert!(a.internal_errors.is_empty(), "{:?}", a.internal_errors);
    for d in &a.diagnostics {
        assert!(d.span.start <= d.span.end && d.span.end <= text.len());
        for f in &d.fixes {
            implica_analysis::fixes::verify(&text, f).expect("an offered fix proves again");
        }
    }
});
