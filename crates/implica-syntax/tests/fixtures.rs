//! Snapshot tests: the syntax tree (with spans) and the errors of every
//! fixture under `tests/fixtures/syntax/`. Fixtures named `err_*` must have
//! errors; the others must have none.

mod common;

use implica_syntax::{dump, parse, parse_reference};

#[test]
fn syntax_fixtures() {
    for path in common::imp_files("tests/fixtures/syntax") {
        let name = path.file_stem().unwrap().to_string_lossy().to_string();
        let src = std::fs::read_to_string(&path).unwrap();
        let (tree, errors) = parse(&src);
        let (ref_tree, ref_errors) = parse_reference(&src);
        assert_eq!(
            tree, ref_tree,
            "{name}: fast path and reference grammar disagree"
        );
        assert_eq!(
            errors, ref_errors,
            "{name}: fast path and reference grammar disagree"
        );
        if name.starts_with("err_") {
            assert!(!errors.is_empty(), "{name}: expected syntax errors");
        } else {
            assert!(
                errors.is_empty(),
                "{name}: unexpected errors:\n{}",
                common::render_errors(&src, &errors)
            );
        }
        let snapshot = format!(
            "{}\n--- errors ---\n{}",
            dump::dump(&tree, true),
            common::render_errors(&src, &errors)
        );
        insta::with_settings!({ description => src.clone(), omit_expression => true }, {
            insta::assert_snapshot!(name, snapshot);
        });
    }
}
