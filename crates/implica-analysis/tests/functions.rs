//! The semantic model and each signal's function, on small documents whose
//! truth tables are worked out by hand in the comments (common practice:
//! evaluating the definitions row by row).

use implica_analysis::functions::{Functions, Unknown};
use implica_analysis::model::{Model, SignalKind};
use implica_logic::{Effort, TruthTable};

/// For each named signal: the inputs it reads, its on-set and its
/// don't-cares, as minterm lists over those inputs (first = most significant).
fn tables(src: &str, signal: &str) -> (Vec<String>, Vec<usize>, Vec<usize>) {
    let (file, errors) = implica_syntax::parse(src);
    assert!(errors.is_empty(), "{errors:?}");
    let model = Model::build(&file);
    let mut f = Functions::compute(&model, 1_000_000, None).unwrap();
    let s = model.signal(signal).expect("signal");
    let local = f
        .local(s, &mut Effort::new(1_000_000))
        .unwrap()
        .unwrap_or_else(|u| panic!("{signal}: {u:?}"));
    let names = local
        .inputs
        .iter()
        .map(|&i| model.signals[model.inputs[i]].name.to_string())
        .collect();
    let on: TruthTable = f.bdd.to_truth_table(local.on, &local.inputs);
    let dc: TruthTable = f.bdd.to_truth_table(local.dc, &local.inputs);
    (names, on.minterms(), dc.minterms())
}

fn unknown(src: &str, signal: &str) -> Unknown {
    let (file, _) = implica_syntax::parse(src);
    let model = Model::build(&file);
    let f = Functions::compute(&model, 1_000_000, None).unwrap();
    f.value(model.signal(signal).unwrap()).unwrap_err()
}

#[test]
fn expressions_and_intermediates() {
    let src = "input a, b, c\noutput y, z\ny = t | !c\nlet t = a & b\nz = a => b => c\n";
    // y = ab + c': rows 0, 2, 4, 6 (c = 0) and 6, 7 (a = b = 1).
    let (names, on, dc) = tables(src, "y");
    assert_eq!(names, ["a", "b", "c"]);
    assert_eq!(on, [0, 2, 4, 6, 7]);
    assert!(dc.is_empty());
    // a => (b => c) is 0 only for a = 1, b = 1, c = 0: row 6.
    let (_, on, _) = tables(src, "z");
    assert_eq!(on, [0, 1, 2, 3, 4, 5, 7]);
}

#[test]
fn word_operators_and_comparisons() {
    let src =
        "input a, b\noutput p, q, r, s\np = a nand b\nq = a nor b\nr = a xnor b\ns = a != b\n";
    assert_eq!(tables(src, "p").1, [0, 1, 2]);
    assert_eq!(tables(src, "q").1, [0]);
    assert_eq!(tables(src, "r").1, [0, 3]);
    assert_eq!(tables(src, "s").1, [1, 2]);
}

#[test]
fn term_lists_with_ranges_and_dont_cares() {
    let src = "input b3, b2, b1, b0\noutput e, f\n\
               e = on(0, 2, 6, 8) dc(10..15) over (b3, b2, b1, b0)\n\
               f = off(0x1..0x3, 0b0111) dc(10..15) over (b3, b2, b1, b0)\n";
    let (_, on, dc) = tables(src, "e");
    assert_eq!(on, [0, 2, 6, 8]);
    assert_eq!(dc, [10, 11, 12, 13, 14, 15]);
    let (_, on, dc) = tables(src, "f");
    assert_eq!(on, [0, 4, 5, 6, 8, 9]);
    assert_eq!(dc, [10, 11, 12, 13, 14, 15]);
}

#[test]
fn overlapping_ranges_repeats_and_order_in_a_term_list() {
    // Rows 0, 3 to 9 (3..5 and 4..8 overlap, 9 is adjacent and repeated)
    // and 15 (wholly inside 12..15, given first); counted by hand.
    let src = "input b3, b2, b1, b0\noutput g\n\
               g = on(12..15, 9, 3..5, 4..8, 9, 0, 15) over (b3, b2, b1, b0)\n";
    let (_, on, _) = tables(src, "g");
    assert_eq!(on, [0, 3, 4, 5, 6, 7, 8, 9, 12, 13, 14, 15]);
    // Over signals given in an order other than their declaration: row 1
    // of `over (b0, b3)` is b0 = 0, b3 = 1, which is row 2 over (b3, b0).
    let src = "input b3, b2, b1, b0\noutput h\nh = on(1) over (b0, b3)\n";
    let (names, on, _) = tables(src, "h");
    assert_eq!(names, ["b3", "b0"]);
    assert_eq!(on, [2]);
}

/// A random function of `n` inputs as one term list: each row on with
/// probability 3/8, a don't-care with probability 1/4; the source, and the
/// rows on and free.
fn random_term_list(n: usize, seed: u64) -> (String, Vec<usize>, Vec<usize>) {
    let mut rng = implica_testkit::Rng(seed);
    let (mut on, mut dc) = (Vec::new(), Vec::new());
    for m in 0..1usize << n {
        match rng.next() % 8 {
            0..=2 => on.push(m),
            3 | 4 => dc.push(m),
            _ => {}
        }
    }
    let names: Vec<String> = (0..n).map(|i| format!("x{i}")).collect();
    let list = |rows: &[usize]| {
        rows.iter()
            .map(|m| m.to_string())
            .collect::<Vec<_>>()
            .join(", ")
    };
    let src = format!(
        "input {}\noutput y\ny = on({}) dc({}) over ({})\n",
        names.join(", "),
        list(&on),
        list(&dc),
        names.join(", ")
    );
    (src, on, dc)
}

/// The functions of a model with a definition's default budget.
fn default_functions(model: &Model) -> Functions {
    Functions::compute(
        model,
        implica_analysis::functions::DEFAULT_WORK_PER_DEFINITION,
        None,
    )
    .unwrap()
}

#[test]
fn a_long_term_list_over_eighteen_inputs_is_computed_within_the_default_budget() {
    // About 98,000 single rows and 65,000 don't-cares over 18 inputs (a table
    // exported by another program, say): the list is built by splitting
    // the rows input by input, not row by row, so it fits the budget an
    // editor gives a definition.
    let n = 18;
    let (src, on, dc) = random_term_list(n, 18);
    let (file, errors) = implica_syntax::parse(&src);
    assert!(errors.is_empty(), "{errors:?}");
    let model = Model::build(&file);
    let mut f = default_functions(&model);
    let s = model.signal("y").unwrap();
    let local = f.local(s, &mut Effort::new(1_000_000)).unwrap().unwrap();
    assert_eq!(local.inputs.len(), n);
    let got_on = f.bdd.to_truth_table(local.on, &local.inputs).minterms();
    let got_dc = f.bdd.to_truth_table(local.dc, &local.inputs).minterms();
    assert_eq!(got_dc, dc);
    assert_eq!(got_on, on);
}

#[test]
fn both_forms_past_the_exact_limit_each_get_a_share_of_the_work() {
    // A random 17-input function with don't-cares: past the exact limit,
    // so both forms go to the heuristic, which here uses all the work it
    // is given. The sum must leave the product its share (without it, the
    // product's first step ran out), and each must come back as a form.
    let (src, _, _) = random_term_list(17, 17);
    let (file, _) = implica_syntax::parse(&src);
    let model = Model::build(&file);
    let mut f = default_functions(&model);
    let s = model.signal("y").unwrap();
    let budget = implica_logic::Budget::default();
    let mut effort = Effort::new(1_000_000);
    let forms =
        implica_analysis::minimal::minimal_forms(&mut f, s, true, true, &budget, &mut effort)
            .expect("the work is shared, not run out")
            .unwrap();
    let (sop, pos) = (forms.sop.unwrap().unwrap(), forms.pos.unwrap().unwrap());
    assert!(sop.terms > 0 && pos.terms > 0);
}

#[test]
fn a_term_list_over_intermediates_composes() {
    // u = a & b, v = c; w = on(1, 2) over (u, v) is u ^ v.
    let src = "input a, b, c\noutput w\nlet u = a & b\nlet v = c\nw = on(1, 2) over (u, v)\n";
    let (names, on, _) = tables(src, "w");
    assert_eq!(names, ["a", "b", "c"]);
    // u ^ c: rows with c = 1 except 7, and row 6.
    assert_eq!(on, [1, 3, 5, 6]);
}

#[test]
fn tables_with_dashes_unlisted_missing_and_conflicting_rows() {
    let src = "input a, b\noutput x, y, z\n\
               table (a, b -> x, y) {\n  0 0 -> 1 -\n  1 - -> 0 1\n  unlisted -> 1 0\n}\n\
               table (a, b -> z) {\n  0 0 -> 1\n  0 - -> 0\n  1 1 -> 1\n}\n";
    // x: row 00 -> 1, rows 10 and 11 -> 0, row 01 unlisted -> 1.
    let (_, on, dc) = tables(src, "x");
    assert_eq!((on, dc), (vec![0, 1], vec![]));
    // y: row 00 is '-', 10 and 11 are 1, 01 is 0.
    let (_, on, dc) = tables(src, "y");
    assert_eq!((on, dc), (vec![2, 3], vec![0]));
    // z: 00 in conflict (1 and 0), 01 is 0, 10 missing, 11 is 1.
    let (_, on, dc) = tables(src, "z");
    assert_eq!((on, dc), (vec![3], vec![0, 2]));
}

#[test]
fn dont_cares_of_a_signal_are_one_choice_for_all_its_readers() {
    // w is 1 on row 1, free on row 2, 0 on rows 0 and 3.
    let src = "input a, b\noutput y, z, v\nlet w = on(1) dc(2) over (a, b)\n\
               y = w ^ w\nz = w & b | w & !b\nv = w | a\n";
    // w ^ w is 0 whatever w is built as: no freedom passes on.
    assert_eq!(tables(src, "y").1, Vec::<usize>::new());
    assert_eq!(tables(src, "y").2, Vec::<usize>::new());
    // z is w: free on row 2.
    assert_eq!(tables(src, "z").1, [1]);
    assert_eq!(tables(src, "z").2, [2]);
    // v = w | a is 1 on rows 1, 2, 3 whatever w is on row 2.
    assert_eq!(tables(src, "v").1, [1, 2, 3]);
    assert_eq!(tables(src, "v").2, Vec::<usize>::new());
}

#[test]
fn impossible_inputs_are_dont_cares_only_over_what_a_signal_reads() {
    let src = "input a, b, c\noutput y, z\nnever a & b\ny = a | b\nz = a ^ c\n";
    // y reads a and b: row 11 is impossible.
    assert_eq!(
        tables(src, "y"),
        (vec!["a".into(), "b".into()], vec![1, 2], vec![3])
    );
    // z reads a and c: no row of (a, c) is impossible for every b.
    assert_eq!(tables(src, "z").2, Vec::<usize>::new());
}

#[test]
fn cycles_undefined_names_and_bad_tables() {
    let src = "input a\noutput y, z\nlet p = q & a\nlet q = !p\ny = p\nz = a & nowhere\n";
    let (file, _) = implica_syntax::parse(src);
    let model = Model::build(&file);
    let names = |ids: &[usize]| -> Vec<String> {
        ids.iter()
            .map(|&s| model.signals[s].name.to_string())
            .collect()
    };
    assert_eq!(model.cycles.len(), 1);
    assert_eq!(names(&model.cycles[0]), ["p", "q"]);
    assert_eq!(unknown(src, "y"), Unknown::Cyclic);
    let nowhere = model.signal("nowhere").unwrap();
    assert_eq!(model.signals[nowhere].kind, SignalKind::Undeclared);
    assert_eq!(unknown(src, "z"), Unknown::Undefined(nowhere));
    // A self-reference is a cycle of one.
    let src = "input a\noutput y\ny = y | a\n";
    let (file, _) = implica_syntax::parse(src);
    assert_eq!(Model::build(&file).cycles.len(), 1);
    // A row of the wrong width leaves the column unknown.
    let src = "input a, b\noutput x\ntable (a, b -> x) {\n  0 -> 1\n}\n";
    assert_eq!(unknown(src, "x"), Unknown::Malformed);
}

#[test]
fn a_long_chain_of_definitions() {
    // 100,000 intermediates in reverse order: evaluation order comes from the
    // graph, without recursion.
    let n = 100_000;
    let mut src = String::from("input a, b\noutput y\ny = s0\n");
    for i in 0..n {
        src.push_str(&format!("let s{i} = s{} ^ b\n", i + 1));
    }
    src.push_str(&format!("let s{n} = a\n"));
    // An even number of `^ b`: y = a.
    let (names, on, dc) = tables(&src, "y");
    assert_eq!(names, ["a", "b"]);
    assert_eq!(on, [2, 3]);
    assert!(dc.is_empty());
}

#[test]
fn the_examples_compute_every_signal() {
    let dir = concat!(env!("CARGO_MANIFEST_DIR"), "/../../examples");
    let mut seen = 0;
    for entry in std::fs::read_dir(dir).unwrap() {
        let path = entry.unwrap().path();
        if path.extension().is_none_or(|e| e != "imp") {
            continue;
        }
        let src = std::fs::read_to_string(&path).unwrap();
        let (file, _) = implica_syntax::parse(&src);
        let model = Model::build(&file);
        let f = Functions::compute(&model, 1_000_000, None).unwrap();
        for (s, sig) in model.signals.iter().enumerate() {
            if sig.kind != SignalKind::Undeclared {
                assert!(
                    f.value(s).is_ok(),
                    "{}: {}: {:?}",
                    path.display(),
                    sig.name,
                    f.value(s)
                );
            }
        }
        seen += 1;
    }
    assert!(seen >= 4);
}

#[test]
fn cancellation_stops_the_computation() {
    let stop = || true;
    // The check is polled every few hundred units of work: a job of many.
    let mut src = String::from("input ");
    src.push_str(
        &(0..40)
            .map(|i| format!("x{i}"))
            .collect::<Vec<_>>()
            .join(", "),
    );
    src.push_str("\noutput y\ny = ");
    src.push_str(
        &(0..20)
            .map(|i| format!("x{i} & x{}", i + 20))
            .collect::<Vec<_>>()
            .join(" | "),
    );
    src.push('\n');
    let (big, _) = implica_syntax::parse(&src);
    let big_model = Model::build(&big);
    assert!(Functions::compute(&big_model, u64::MAX, Some(&stop)).is_err());
    assert!(Functions::compute(&big_model, u64::MAX, None).is_ok());
}

/// Removing inputs that nothing reads is proven in the original manager
/// (`Functions::edited` maps the remaining inputs to their old variables),
/// with the same verdict as the proof from scratch (`fixes::verify`); a
/// removal that changes what is read, or an input that is read, is not.
#[test]
fn edits_that_drop_unread_inputs_are_proven_in_place() {
    use implica_analysis::{Applicability, Edit, Fix, fixes};
    use implica_syntax::Span;
    let src = "input a, spare, b, c, last\noutput y, z\ny = a & b | c\nlet w = b ^ c\nz = w & a\n";
    let fix = |from: &str, to: &str| {
        let start = src.find(from).unwrap();
        Fix {
            title: "edit".into(),
            applicability: Applicability::Safe,
            edits: vec![Edit {
                span: Span::new(start, start + from.len()),
                new_text: to.into(),
            }],
        }
    };
    let (file, _) = implica_syntax::parse(src);
    let model = Model::build(&file);
    let mut f = Functions::compute(&model, 1_000_000, None).unwrap();
    // The unread `spare` and `last` go: proven both ways, same text.
    let drop_two = fix("input a, spare, b, c, last", "input a, b, c");
    let in_place = fixes::verify_in(&model, &mut f, src, &drop_two).unwrap();
    assert_eq!(in_place, fixes::verify(src, &drop_two).unwrap());
    assert!(in_place.starts_with("input a, b, c\n"));
    // `b` is read: removing it leaves `y` and `w` reading an undefined name.
    let drop_read = fix("input a, spare, b, c, last", "input a, spare, c, last");
    assert!(fixes::verify_in(&model, &mut f, src, &drop_read).is_err());
    assert!(fixes::verify(src, &drop_read).is_err());
    // Inputs reordered: each signal keeps its function, which both prove.
    let reorder = fix("input a, spare, b, c, last", "input spare, a, b, c, last");
    assert_eq!(
        fixes::verify_in(&model, &mut f, src, &reorder).is_ok(),
        fixes::verify(src, &reorder).is_ok()
    );
    // Dropping `spare` while changing `y` is caught in place.
    let both = Fix {
        edits: vec![
            drop_two.edits[0].clone(),
            Edit {
                span: Span::new(src.find("a & b").unwrap(), src.find("a & b").unwrap() + 5),
                new_text: "a | b".into(),
            },
        ],
        ..drop_two.clone()
    };
    let err = fixes::verify_in(&model, &mut f, src, &both).unwrap_err();
    assert!(err.contains("`y` would change"), "{err}");
    // The original's functions are untouched by all this.
    let y = model.signal("y").unwrap();
    let again = Functions::compute(&model, 1_000_000, None).unwrap();
    assert_eq!(
        f.bdd
            .to_truth_table(f.value(y).unwrap().lower, &[0, 1, 2, 3, 4]),
        again
            .bdd
            .to_truth_table(again.value(y).unwrap().lower, &[0, 1, 2, 3, 4])
    );
}
