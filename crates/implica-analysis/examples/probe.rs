#[path = "../benches/common/mod.rs"]
mod common;
#[global_allocator]
static GLOBAL: mimalloc::MiMalloc = mimalloc::MiMalloc;
fn main() {
    let src = common::spec(1000, false);
    let at = src.find("out_0500 = ").unwrap();
    let line_end = at + src[at..].find('\n').unwrap();
    let bang = at + src[at..line_end].find("in_").unwrap() + 4;
    let mut edited = src.clone().into_bytes();
    edited[bang] = if edited[bang] == b'9' {
        b'8'
    } else {
        edited[bang] + 1
    };
    let edited = String::from_utf8(edited).unwrap();
    let config = implica_analysis::config::Config::default();
    let mut session = implica_analysis::session::Session::new();
    session.analyze(&src, &config);
    let n: usize = std::env::var("N")
        .ok()
        .and_then(|v| v.parse().ok())
        .unwrap_or(15);
    let mut ts = vec![];
    for i in 0..n {
        let text = if i % 2 == 0 { &edited } else { &src };
        let t = std::time::Instant::now();
        let a = session.analyze(text, &config);
        ts.push(t.elapsed().as_secs_f64() * 1000.0);
        if i < 2 {
            assert_eq!(a.diagnostics, implica_analysis::analyze(text).diagnostics);
        }
    }
    ts.sort_by(|a, b| a.partial_cmp(b).unwrap());
    println!("session median {:.1} ms min {:.1}", ts[ts.len() / 2], ts[0]);
}
