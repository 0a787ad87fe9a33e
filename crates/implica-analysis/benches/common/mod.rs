//! The generated specification of the analysis benchmark, shared with the
//! `corpus` example (which writes many of them for `implica check`).

use implica_testkit::Rng;

/// Five lines per signal: a comment, a definition over two lines (a sum of
/// 3 to 5 products over 10 of the 40 inputs), an assertion line for every
/// tenth signal or a blank line. `clean` specs are already minimal sums of
/// distinct minterm-free terms, so that few rules fire; the others repeat a
/// term now and then, as real files do.
pub fn spec(signals: usize, clean: bool) -> String {
    let mut rng = Rng(0x00C0_FFEE_1234_5678);
    let mut out = String::from("# Generated for the analysis benchmark.\n");
    let inputs: Vec<String> = (0..40).map(|i| format!("in_{i:02}")).collect();
    out.push_str(&format!("input  {}\n", inputs.join(", ")));
    let outs: Vec<String> = (0..signals).map(|i| format!("out_{i:04}")).collect();
    for chunk in outs.chunks(20) {
        out.push_str(&format!("output {}\n", chunk.join(", ")));
    }
    for (k, name) in outs.iter().enumerate() {
        let base = (rng.next() % 30) as usize;
        let pick = |rng: &mut Rng| &inputs[base + (rng.next() % 10) as usize];
        let terms = 3 + (rng.next() % 3) as usize;
        let mut ts: Vec<String> = (0..terms)
            .map(|_| {
                let lits = 2 + (rng.next() % 3) as usize;
                let mut ls: Vec<String> = Vec::new();
                for _ in 0..lits {
                    let n = pick(&mut rng).clone();
                    if ls.iter().any(|l| l.trim_start_matches('!') == n) {
                        continue;
                    }
                    ls.push(if rng.next().is_multiple_of(2) {
                        format!("!{n}")
                    } else {
                        n
                    });
                }
                ls.join(" & ")
            })
            .collect();
        if !clean && k % 7 == 0 {
            ts.push(ts[0].clone());
        }
        let (first, rest) = ts.split_at(2);
        out.push_str(&format!("# signal {k}\n"));
        out.push_str(&format!("{name} = {}\n", first.join(" | ")));
        out.push_str(&format!("    | {}\n", rest.join(" | ")));
        if k % 10 == 0 {
            out.push_str(&format!("assert {name} | !{name}\n"));
        } else {
            out.push('\n');
        }
    }
    out
}

/// `src` with one character changed in the middle signal's definition: the
/// last digit of the first input name on its line, moved to the next digit.
#[allow(dead_code)] // not every user of this module edits
pub fn edit_one_character(src: &str) -> String {
    let mid = src.len() / 2;
    let line = mid + src[mid..].find("\nout_").expect("a definition line") + 1;
    let name = line + src[line..].find("in_").expect("an input name") + 4;
    let mut bytes = src.as_bytes().to_vec();
    bytes[name] = if bytes[name] == b'9' {
        b'0'
    } else {
        bytes[name] + 1
    };
    String::from_utf8(bytes).expect("an ASCII digit replaced")
}
