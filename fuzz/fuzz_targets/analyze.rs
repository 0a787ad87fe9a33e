//! Bytes → a sequence of Implica tokens → the whole analysis: every rule,
//! and the proof of every fix, must finish without a panic; every fix
//! offered must apply, parse and pass its proof again. The same text is
//! then analysed in a session after an edit (the text cut at a place the
//! input picks, then whole again), which must report what a fresh analysis
//! reports; and the refactors at that place must all prove.
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

    // A place in the text, chosen by the input.
    let mut at = data.first().map_or(0, |&b| b as usize * text.len() / 256);
    while !text.is_char_boundary(at) {
        at -= 1;
    }
    let config = implica_analysis::config::Config::default();
    let mut session = implica_analysis::session::Session::new();
    for version in [&text[..at], &text[..], &text[at..]] {
        let s = session.analyze(version, &config);
        let fresh = implica_analysis::analyze_with(version, &config);
        assert_eq!(
            s.diagnostics, fresh.diagnostics,
            "session differs on {version:?}"
        );
        assert_eq!(s.internal_errors, fresh.internal_errors);
    }
    let r = implica_analysis::refactors::refactors_at(
        &text,
        implica_syntax::Span::new(at, at),
        &config,
    );
    assert!(r.internal_errors.is_empty(), "{:?}", r.internal_errors);
});
