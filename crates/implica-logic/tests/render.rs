//! Truth tables and Karnaugh maps in plain text and Markdown: exact output
//! for small cases (checked by hand against the functions' minterms), and a
//! property test that reads rendered maps of random 4- to 6-input functions
//! back and compares each cell with the truth table and the cover. Maps run
//! in Gray-code order, 00, 01, 11, 10 (common practice).

use implica_logic::{
    Cover, Cube, DONT_CARE, Format, Function, RenderError, TruthTable, render_karnaugh_map,
    render_truth_table,
};
use proptest::prelude::*;

fn cube(vars: usize, lits: &[(usize, bool)]) -> Cube {
    lits.iter().fold(Cube::universe(vars), |c, &(i, p)| {
        c.and(&Cube::literal(vars, i, p))
    })
}

fn table(vars: usize, ms: &[usize]) -> TruthTable {
    TruthTable::from_minterms(vars, ms)
}

/// The cells of a Markdown table row: split at `|` not escaped by `\`,
/// without the empty ends outside the outer pipes.
fn md_cells(line: &str) -> Option<Vec<String>> {
    let inner = line.strip_prefix('|')?.strip_suffix('|')?;
    let mut cells = vec![String::new()];
    let mut chars = inner.chars();
    while let Some(c) = chars.next() {
        match c {
            '\\' => {
                let last = cells.last_mut()?;
                last.push(c);
                if let Some(d) = chars.next() {
                    last.push(d);
                }
            }
            '|' => cells.push(String::new()),
            c => cells.last_mut()?.push(c),
        }
    }
    Some(cells.iter().map(|c| c.trim().to_string()).collect())
}

/// Every line starting with `|` is a row of one pipe table per run of such
/// lines, all rows of a table have the header's cell count, and the second
/// row is the delimiter row.
fn assert_valid_pipe_tables(md: &str) {
    let mut table: Vec<Vec<String>> = Vec::new();
    for line in md.lines().chain(std::iter::once("")) {
        if line.starts_with('|') {
            let cells = md_cells(line).unwrap_or_else(|| panic!("not a table row: {line:?}"));
            table.push(cells);
            continue;
        }
        if let Some(header) = table.first() {
            assert!(table.len() >= 2, "a table without a delimiter row");
            assert!(table[1].iter().all(|c| c == "---"), "{:?}", table[1]);
            for row in &table {
                assert_eq!(row.len(), header.len(), "{row:?} against {header:?}");
            }
        }
        table.clear();
    }
}

#[test]
fn two_variable_map() {
    // smoke | heat: minterms 1, 2, 3; term a = smoke, b = heat.
    let on = table(2, &[1, 2, 3]);
    let f = Function {
        name: "alarm",
        on: &on,
        dc: None,
    };
    let cover = Cover {
        vars: 2,
        cubes: vec![cube(2, &[(0, true)]), cube(2, &[(1, true)])],
    };
    let names = ["smoke", "heat"];
    let text = render_karnaugh_map(&names, &f, Some(&cover), Format::Text).unwrap();
    assert_eq!(
        text,
        "alarm

smoke \\ heat | 0   | 1
-------------+-----+-----
0            | 0   | 1 b
1            | 1 a | 1 ab

terms
  a: smoke
  b: heat
"
    );
    let md = render_karnaugh_map(&names, &f, Some(&cover), Format::Markdown).unwrap();
    assert_eq!(
        md,
        "alarm

| smoke \\ heat | 0 | 1 |
| --- | --- | --- |
| 0 | 0 | 1 b |
| 1 | 1 a | 1 ab |

terms

- a: `smoke`
- b: `heat`
"
    );
    assert_valid_pipe_tables(&md);
}

#[test]
fn three_variable_map() {
    // Greenhouse vent = hot & !rain | manual: minterms 1, 3, 4, 5, 7.
    let on = table(3, &[1, 3, 4, 5, 7]);
    let f = Function {
        name: "vent",
        on: &on,
        dc: None,
    };
    let cover = Cover {
        vars: 3,
        cubes: vec![cube(3, &[(0, true), (1, false)]), cube(3, &[(2, true)])],
    };
    let names = ["hot", "rain", "manual"];
    let text = render_karnaugh_map(&names, &f, Some(&cover), Format::Text).unwrap();
    // Columns rain manual in Gray order: m0 m1 m3 m2 on the first row.
    assert_eq!(
        text,
        "vent

hot \\ rain manual | 00  | 01   | 11  | 10
------------------+-----+------+-----+---
0                 | 0   | 1 b  | 1 b | 0
1                 | 1 a | 1 ab | 1 b | 0

terms
  a: hot & !rain
  b: manual
"
    );
    let md = render_karnaugh_map(&names, &f, None, Format::Markdown).unwrap();
    assert_eq!(
        md,
        "vent

| hot \\ rain manual | 00 | 01 | 11 | 10 |
| --- | --- | --- | --- | --- |
| 0 | 0 | 1 | 1 | 0 |
| 1 | 1 | 1 | 1 | 0 |
"
    );
    assert_valid_pipe_tables(&md);
}

#[test]
fn four_variable_map_with_dont_cares() {
    // Kiosk display decoder, segment e of a BCD digit b3 b2 b1 b0: lit for
    // 0, 2, 6, 8 (the usual seven-segment shapes, from memory); codes 10 to
    // 15 never occur. Terms a = !b2 & !b0, b = b1 & !b0.
    let on = table(4, &[0, 2, 6, 8]);
    let dc = table(4, &[10, 11, 12, 13, 14, 15]);
    let f = Function {
        name: "seg_e",
        on: &on,
        dc: Some(&dc),
    };
    let cover = Cover {
        vars: 4,
        cubes: vec![
            cube(4, &[(1, false), (3, false)]),
            cube(4, &[(2, true), (3, false)]),
        ],
    };
    let names = ["b3", "b2", "b1", "b0"];
    let text = render_karnaugh_map(&names, &f, Some(&cover), Format::Text).unwrap();
    assert_eq!(
        text,
        "seg_e

b3 b2 \\ b1 b0 | 00  | 01 | 11 | 10
--------------+-----+----+----+-----
00            | 1 a | 0  | 0  | 1 ab
01            | 0   | 0  | 0  | 1 b
11            | -   | -  | -  | - b
10            | 1 a | 0  | -  | - ab

terms
  a: !b2 & !b0
  b: b1 & !b0
"
    );
    let md = render_karnaugh_map(&names, &f, Some(&cover), Format::Markdown).unwrap();
    assert_eq!(
        md,
        "seg_e

| b3 b2 \\ b1 b0 | 00 | 01 | 11 | 10 |
| --- | --- | --- | --- | --- |
| 00 | 1 a | 0 | 0 | 1 ab |
| 01 | 0 | 0 | 0 | 1 b |
| 11 | - | - | - | - b |
| 10 | 1 a | 0 | - | - ab |

terms

- a: `!b2 & !b0`
- b: `b1 & !b0`
"
    );
    assert_valid_pipe_tables(&md);
}

#[test]
fn five_variable_maps() {
    // Minterms 0, 1, 5, 7, 16, 21, 31, don't-cares 2 and 30 (demo data);
    // terms a = !b & !c, b = c & e. The first map holds a = 0 (minterms
    // 0..15), the second a = 1 (16..31).
    let on = table(5, &[0, 1, 5, 7, 16, 21, 31]);
    let dc = table(5, &[2, 30]);
    let f = Function {
        name: "f",
        on: &on,
        dc: Some(&dc),
    };
    let cover = Cover {
        vars: 5,
        cubes: vec![
            cube(5, &[(1, false), (2, false)]),
            cube(5, &[(2, true), (4, true)]),
        ],
    };
    let names: Vec<String> = ["a", "b", "c", "d", "e"].map(String::from).to_vec();
    let text = render_karnaugh_map(&names, &f, Some(&cover), Format::Text).unwrap();
    assert_eq!(
        text,
        "f, a = 0

b c \\ d e | 00  | 01  | 11  | 10
----------+-----+-----+-----+----
00        | 1 a | 1 a | 0 a | - a
01        | 0   | 1 b | 1 b | 0
11        | 0   | 0 b | 0 b | 0
10        | 0   | 0   | 0   | 0

f, a = 1

b c \\ d e | 00  | 01  | 11  | 10
----------+-----+-----+-----+----
00        | 1 a | 0 a | 0 a | 0 a
01        | 0   | 1 b | 0 b | 0
11        | 0   | 0 b | 1 b | -
10        | 0   | 0   | 0   | 0

terms
  a: !b & !c
  b: c & e
"
    );
    let md = render_karnaugh_map(&names, &f, None, Format::Markdown).unwrap();
    assert_eq!(
        md,
        "f, a = 0

| b c \\ d e | 00 | 01 | 11 | 10 |
| --- | --- | --- | --- | --- |
| 00 | 1 | 1 | 0 | - |
| 01 | 0 | 1 | 1 | 0 |
| 11 | 0 | 0 | 0 | 0 |
| 10 | 0 | 0 | 0 | 0 |

f, a = 1

| b c \\ d e | 00 | 01 | 11 | 10 |
| --- | --- | --- | --- | --- |
| 00 | 1 | 0 | 0 | 0 |
| 01 | 0 | 1 | 0 | 0 |
| 11 | 0 | 0 | 1 | - |
| 10 | 0 | 0 | 0 | 0 |
"
    );
    assert_valid_pipe_tables(&md);
}

#[test]
fn six_variables_give_four_maps_in_gray_order() {
    let on = table(6, &[]);
    let f = Function {
        name: "",
        on: &on,
        dc: None,
    };
    let names = ["p", "q", "r", "s", "t", "u"];
    let text = render_karnaugh_map(&names, &f, None, Format::Text).unwrap();
    let titles: Vec<&str> = text.lines().filter(|l| l.starts_with("p q =")).collect();
    assert_eq!(titles, ["p q = 00", "p q = 01", "p q = 11", "p q = 10"]);
}

#[test]
fn one_variable_map() {
    let on = table(1, &[1]);
    let f = Function {
        name: "",
        on: &on,
        dc: None,
    };
    let text = render_karnaugh_map(&["door"], &f, None, Format::Text).unwrap();
    assert_eq!(text, "\\ door | 0 | 1\n-------+---+--\n       | 0 | 1\n");
}

#[test]
fn truth_table_of_two_functions_cut_to_six_rows() {
    let seg_e = table(4, &[0, 2, 6, 8]);
    let seg_b = table(4, &[0, 1, 2, 3, 4, 7, 8, 9]);
    let dc = table(4, &[10, 11, 12, 13, 14, 15]);
    let fs = [
        Function {
            name: "seg_e",
            on: &seg_e,
            dc: Some(&dc),
        },
        Function {
            name: "seg_b",
            on: &seg_b,
            dc: Some(&dc),
        },
    ];
    let names = ["b3", "b2", "b1", "b0"];
    let text = render_truth_table(&names, &fs, Format::Text, Some(6)).unwrap();
    assert_eq!(
        text,
        "b3 b2 b1 b0 | seg_e seg_b
------------+------------
0  0  0  0  | 1     1
0  0  0  1  | 0     1
0  0  1  0  | 1     1
0  0  1  1  | 0     1
0  1  0  0  | 0     1
0  1  0  1  | 0     0
10 of 16 rows not shown (minterms 6 to 15).
"
    );
    let md = render_truth_table(&names, &fs, Format::Markdown, None).unwrap();
    assert_valid_pipe_tables(&md);
    let lines: Vec<&str> = md.lines().collect();
    assert_eq!(lines.len(), 18);
    assert_eq!(lines[0], "| b3 | b2 | b1 | b0 | seg_e | seg_b |");
    assert_eq!(lines[11], "| 1 | 0 | 0 | 1 | 0 | 1 |");
    assert_eq!(lines[17], "| 1 | 1 | 1 | 1 | - | - |");
    // The first input is the most significant bit.
    for (m, line) in lines[2..].iter().enumerate() {
        let bits: String = md_cells(line).unwrap()[..4].concat();
        assert_eq!(usize::from_str_radix(&bits, 2).unwrap(), m);
    }
    let cut = render_truth_table(&names, &fs, Format::Markdown, Some(15)).unwrap();
    assert!(cut.ends_with("|\n\n1 of 16 rows not shown (minterm 15).\n"));
    assert_eq!(
        render_truth_table(&names, &fs, Format::Text, Some(16)).unwrap(),
        render_truth_table(&names, &fs, Format::Text, None).unwrap()
    );
}

#[test]
fn large_tables_are_cut_with_a_note() {
    let names: Vec<String> = (0..20).map(|i| format!("i{i}")).collect();
    let on = TruthTable::var(20, 19);
    let f = Function {
        name: "odd",
        on: &on,
        dc: None,
    };
    let text = render_truth_table(&names, &[f], Format::Text, Some(3)).unwrap();
    let lines: Vec<&str> = text.lines().collect();
    assert_eq!(lines.len(), 2 + 3 + 1);
    // Minterm 2: only the second-to-last input is 1.
    assert!(lines[4].ends_with(" 1   0   | 0"), "{:?}", lines[4]);
    assert_eq!(
        lines[5],
        "1048573 of 1048576 rows not shown (minterms 3 to 1048575)."
    );
    let full = render_truth_table(&names[..12], &[], Format::Markdown, None).unwrap();
    assert_eq!(full.lines().count(), 2 + 4096);
    assert_valid_pipe_tables(&full);
}

#[test]
fn odd_and_non_ascii_names_stay_aligned() {
    let names = ["température", "λ", "门禁", "x|y"];
    let on = table(4, &[3, 9]);
    let f = Function {
        name: "ouvre_porte",
        on: &on,
        dc: None,
    };
    let text = render_truth_table(&names, &[f], Format::Text, None).unwrap();
    let bar = |l: &str| l.chars().position(|c| c == '|' || c == '+');
    let first = bar(text.lines().next().unwrap());
    // The name x|y holds a bar of its own: the header's first bar is in it.
    assert_eq!(first, Some("température λ 门禁 x".chars().count()));
    let header_bar = "température λ 门禁 x|y ".chars().count();
    for line in text.lines().skip(1) {
        assert_eq!(bar(line), Some(header_bar), "{line:?}");
    }
    let md = render_truth_table(&names, &[f], Format::Markdown, None).unwrap();
    assert_valid_pipe_tables(&md);
    assert!(md.starts_with("| température | λ | 门禁 | x\\|y | ouvre_porte |\n"));
    let map = render_karnaugh_map(&names, &f, None, Format::Markdown).unwrap();
    assert_valid_pipe_tables(&map);
    assert!(map.contains("| température λ \\ 门禁 x\\|y | 00 |"));
    // Markdown's own characters in names are escaped; a line break is a space.
    let odd = ["*a*", "_b", "c\nd", "#e"];
    let md = render_truth_table(&odd, &[f], Format::Markdown, Some(0)).unwrap();
    assert!(md.starts_with("| \\*a\\* | \\_b | c d | \\#e | ouvre_porte |\n"));
    let text = render_truth_table(&odd, &[f], Format::Text, Some(0)).unwrap();
    assert!(text.starts_with("*a* _b c d #e | ouvre_porte\n"));
}

#[test]
fn more_than_26_terms_are_joined_by_commas() {
    let on = table(1, &[0, 1]);
    let f = Function {
        name: "",
        on: &on,
        dc: None,
    };
    let cover = Cover {
        vars: 1,
        cubes: vec![Cube::universe(1); 28],
    };
    let text = render_karnaugh_map(&["x"], &f, Some(&cover), Format::Text).unwrap();
    let labels = "a,b,c,d,e,f,g,h,i,j,k,l,m,n,o,p,q,r,s,t,u,v,w,x,y,z,aa,ab";
    assert!(text.contains(&format!("| 1 {labels} | 1 {labels}\n")));
    assert!(text.ends_with("  z: 1\n  aa: 1\n  ab: 1\n"));
}

#[test]
fn refusals_are_errors() {
    let seven = table(7, &[1]);
    let f = Function {
        name: "f",
        on: &seven,
        dc: None,
    };
    let names: Vec<String> = (0..7).map(|i| format!("x{i}")).collect();
    assert_eq!(
        render_karnaugh_map(&names, &f, None, Format::Text),
        Err(RenderError::MapVars { vars: 7 })
    );
    assert!(render_truth_table(&names, &[f], Format::Text, Some(3)).is_ok());
    let none: [&str; 0] = [];
    let zero = table(0, &[]);
    let g = Function {
        name: "g",
        on: &zero,
        dc: None,
    };
    assert_eq!(
        render_karnaugh_map(&none, &g, None, Format::Text),
        Err(RenderError::MapVars { vars: 0 })
    );
    assert_eq!(
        render_truth_table(&none, &[g], Format::Text, None).unwrap(),
        "g\n-\n0\n"
    );
    assert_eq!(
        render_truth_table(&none, &[], Format::Text, None),
        Err(RenderError::Empty)
    );
    assert_eq!(
        render_truth_table(&names[..6], &[f], Format::Markdown, None),
        Err(RenderError::InputCount {
            function: "f".into(),
            names: 6,
            vars: 7
        })
    );
    let wrong_dc = table(6, &[]);
    let h = Function {
        name: "h",
        on: &table(7, &[]),
        dc: Some(&wrong_dc),
    };
    assert!(matches!(
        render_truth_table(&names, &[h], Format::Text, None),
        Err(RenderError::InputCount { vars: 6, .. })
    ));
    let many: Vec<String> = (0..21).map(|i| format!("x{i}")).collect();
    assert_eq!(
        render_truth_table(&many, &[], Format::Text, Some(1)),
        Err(RenderError::TooManyInputs { names: 21 })
    );
    let four = table(4, &[]);
    let k = Function {
        name: "k",
        on: &four,
        dc: None,
    };
    let cover = Cover {
        vars: 3,
        cubes: vec![],
    };
    assert_eq!(
        render_karnaugh_map(&names[..4], &k, Some(&cover), Format::Text),
        Err(RenderError::CoverVars { cover: 3, vars: 4 })
    );
    assert!(
        RenderError::MapVars { vars: 7 }
            .to_string()
            .contains("1 to 6")
    );
}

/// What one map cell says: the minterm, its symbol and its term labels.
type Cell = (usize, char, String);

/// Reads a rendered map back (text or Markdown) over inputs `x0..`: each
/// cell as the minterm its map title, row and column codes give. Checks on
/// the way that the codes run in Gray order and the corner names the axes.
fn read_map(out: &str, n: usize, md: bool) -> Vec<Cell> {
    let extra = n.saturating_sub(4);
    let k = n - extra;
    let (r, c) = (k / 2, k - k / 2);
    let gray = |w: usize| -> Vec<String> {
        (0..1usize << w)
            .map(|i| format!("{:0w$b}", i ^ (i >> 1)))
            .collect()
    };
    let names =
        |vars: std::ops::Range<usize>| vars.map(|i| format!("x{i}")).collect::<Vec<_>>().join(" ");
    let corner = format!("{} \\ {}", names(extra..extra + r), names(extra + r..n));
    let split = |line: &str| -> Vec<String> {
        if md {
            md_cells(line).unwrap()
        } else {
            line.split('|').map(|s| s.trim().to_string()).collect()
        }
    };
    let mut cells = Vec::new();
    let mut lines = out.lines().peekable();
    let mut maps = Vec::new();
    while let Some(line) = lines.next() {
        if !line.starts_with("f") {
            continue;
        }
        let e = match line.split_once(" = ") {
            Some((vars, bits)) => {
                assert_eq!(vars, format!("f, {}", names(0..extra)));
                usize::from_str_radix(bits, 2).unwrap()
            }
            None => 0,
        };
        maps.push(format!("{e:0extra$b}"));
        assert_eq!(lines.next(), Some(""));
        let header = split(lines.next().unwrap());
        assert_eq!(header[0], corner);
        assert_eq!(header[1..], gray(c)[..]);
        let rule = lines.next().unwrap();
        if md {
            assert!(split(rule).iter().all(|s| s == "---"));
        } else {
            assert!(rule.chars().all(|ch| ch == '-' || ch == '+'));
        }
        let mut rows = Vec::new();
        while let Some(line) = lines.next_if(|l| !l.is_empty()) {
            let row = split(line);
            rows.push(row[0].clone());
            let gr = usize::from_str_radix(&row[0], 2).unwrap_or(0);
            for (code, cell) in header[1..].iter().zip(&row[1..]) {
                let gc = usize::from_str_radix(code, 2).unwrap();
                let mut chars = cell.chars();
                let value = chars.next().unwrap();
                let labels = chars.as_str().trim().to_string();
                cells.push(((e << k) | (gr << c) | gc, value, labels));
            }
        }
        assert_eq!(rows, gray(r));
    }
    if extra > 0 {
        assert_eq!(maps, gray(extra));
    }
    cells
}

fn random_map_case() -> impl Strategy<Value = (usize, Vec<bool>, Vec<bool>, Vec<Vec<u8>>)> {
    (4..=6usize).prop_flat_map(|n| {
        (
            Just(n),
            proptest::collection::vec(any::<bool>(), 1 << n),
            proptest::collection::vec(proptest::bool::weighted(0.2), 1 << n),
            proptest::collection::vec(proptest::collection::vec(0..3u8, n), 0..6),
        )
    })
}

proptest! {
    #[test]
    fn every_map_cell_is_the_function_at_its_minterm(
        (n, on_bits, dc_bits, terms) in random_map_case()
    ) {
        let ms = |bits: &[bool]| -> Vec<usize> { (0..bits.len()).filter(|&m| bits[m]).collect() };
        let on = table(n, &ms(&on_bits));
        let dc = table(n, &ms(&dc_bits));
        let cubes: Vec<Cube> = terms
            .iter()
            .map(|t| {
                let lits: Vec<(usize, bool)> = t
                    .iter()
                    .enumerate()
                    .filter(|&(_, &l)| l < 2)
                    .map(|(i, &l)| (i, l == 1))
                    .collect();
                cube(n, &lits)
            })
            .collect();
        let cover = Cover { vars: n, cubes };
        let f = Function { name: "f", on: &on, dc: Some(&dc) };
        let names: Vec<String> = (0..n).map(|i| format!("x{i}")).collect();
        for format in [Format::Text, Format::Markdown] {
            let out = render_karnaugh_map(&names, &f, Some(&cover), format).unwrap();
            if format == Format::Markdown {
                assert_valid_pipe_tables(&out);
            }
            let mut cells = read_map(&out, n, format == Format::Markdown);
            cells.sort();
            prop_assert_eq!(cells.len(), 1 << n);
            for (m, (cell_m, value, labels)) in cells.into_iter().enumerate() {
                prop_assert_eq!(cell_m, m);
                let want = if dc.get(m) { DONT_CARE } else if on.get(m) { '1' } else { '0' };
                prop_assert_eq!(value, want, "minterm {}", m);
                let expect: String = cover
                    .cubes
                    .iter()
                    .enumerate()
                    .filter(|(_, c)| c.contains_minterm(n, m))
                    .map(|(t, _)| char::from(b'a' + t as u8))
                    .collect();
                prop_assert_eq!(labels, expect, "minterm {}", m);
            }
            let legend = out.lines().filter(|l| l.starts_with("  ") || l.starts_with("- ")).count();
            prop_assert_eq!(legend, cover.len());
        }
    }
}
