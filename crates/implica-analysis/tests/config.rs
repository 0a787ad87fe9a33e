//! `implica.toml` and suppression comments.

use implica_analysis::config::{Config, PreferredForm};
use implica_analysis::{Severity, analyze, analyze_with};

fn rules_of(src: &str, config: &Config) -> Vec<(&'static str, Severity)> {
    analyze_with(src, config)
        .diagnostics
        .iter()
        .map(|d| (d.rule, d.severity))
        .collect()
}

const SRC: &str = "input a, b\noutput y\ny = a & b | a & b\n";

#[test]
fn severities_and_rules_turned_off() {
    assert_eq!(
        rules_of(SRC, &Config::default()),
        [("redundant-term", Severity::Warning)]
    );
    let (config, errors) = Config::parse("[rules]\nredundant-term = \"error\"\n");
    assert!(errors.is_empty());
    assert_eq!(
        rules_of(SRC, &config),
        [("redundant-term", Severity::Error)]
    );
    let (config, errors) = Config::parse("[rules]\nredundant-term = \"off\"\n");
    assert!(errors.is_empty());
    assert!(rules_of(SRC, &config).is_empty());
}

#[test]
fn the_hazard_rule_is_off_until_turned_on() {
    let src = "input sel, a, b\noutput y\ny = sel & a | !sel & b\n";
    assert!(rules_of(src, &Config::default()).is_empty());
    let (config, errors) = Config::parse("[rules]\nstatic-hazard = \"warning\"\n");
    assert!(errors.is_empty());
    assert_eq!(
        rules_of(src, &config),
        [("static-hazard", Severity::Warning)]
    );
    // With it on, a consensus term is needed, not redundant.
    let src = "input sel, a, b\noutput y\ny = sel & a | !sel & b | a & b\n";
    assert!(rules_of(src, &config).is_empty());
    assert_eq!(
        rules_of(src, &Config::default()),
        [("redundant-term", Severity::Warning)]
    );
}

#[test]
fn errors_in_the_file_name_their_place() {
    let text = "[rules]\nunused-inputs = \"warning\"\nnon-minimal = \"loud\"\n\n[minimize]\nform = \"both\"\nmax-inputs = 40\n";
    let (config, errors) = Config::parse(text);
    let at: Vec<(&str, &str)> = errors
        .iter()
        .map(|e| (&text[e.span.start..e.span.end], e.message.as_str()))
        .collect();
    assert_eq!(at.len(), 4, "{at:?}");
    assert_eq!(at[0].0, "unused-inputs");
    assert!(at[0].1.contains("no rule `unused-inputs`"));
    assert_eq!(at[1].0, "\"loud\"");
    assert!(at[1].1.contains("not a severity"));
    assert_eq!(at[2].0, "\"both\"");
    assert_eq!(at[3].0, "40");
    // What could be read still applies; the rest keeps its default.
    assert_eq!(config.form, PreferredForm::Either);
    assert_eq!(config.severity("non-minimal"), Some(Severity::Warning));
    // Malformed TOML and unknown keys are errors too.
    let (_, errors) = Config::parse("[rules\n");
    assert_eq!(errors.len(), 1);
    let (_, errors) = Config::parse("[minimise]\n");
    assert_eq!(errors.len(), 1);
    // `syntax-error` cannot be turned off.
    let (config, errors) = Config::parse("[rules]\nsyntax-error = \"off\"\n");
    assert_eq!(errors.len(), 1);
    assert_eq!(config.severity("syntax-error"), Some(Severity::Error));
}

#[test]
fn suppression_comments_quiet_what_they_name() {
    // At the end of the statement's line.
    let src = "input a, b\noutput y\ny = a & b | a & b  # implica: quiet redundant-term -- kept for review\n";
    assert!(analyze(src).diagnostics.is_empty());
    // On the line right above.
    let src =
        "input a, b\noutput y\n# implica: quiet redundant-term, non-minimal\ny = a & b | a & b\n";
    assert!(analyze(src).diagnostics.is_empty());
    // Not across a blank line, and not for other rules.
    let src = "input a, b\noutput y\n# implica: quiet redundant-term\n\ny = a & b | a & b\n";
    assert_eq!(analyze(src).diagnostics.len(), 1);
    let src = "input a, b\noutput y\ny = a & b | a & b  # implica: quiet unused-input\n";
    assert_eq!(analyze(src).diagnostics[0].rule, "redundant-term");
    // Syntax errors cannot be quieted.
    let src = "input a\noutput y\ny = a &  # implica: quiet syntax-error\n";
    assert_eq!(analyze(src).diagnostics[0].rule, "syntax-error");
}

#[test]
fn the_file_is_found_by_walking_up() {
    let dir = tempfile::tempdir().unwrap();
    let deep = dir.path().join("a/b");
    std::fs::create_dir_all(&deep).unwrap();
    assert_eq!(Config::find(&deep), None);
    std::fs::write(dir.path().join("implica.toml"), "").unwrap();
    assert_eq!(Config::find(&deep), Some(dir.path().join("implica.toml")));
}

/// A file turns the hazard rule on for itself, over the project's default,
/// with a directive on a line of its own; and turns a rule off the same way.
#[test]
fn file_directives_enable_and_disable_rules_for_their_file() {
    let mux = "input sel, a, b\noutput y\ny = sel & a | !sel & b\n";
    let on =
        format!("# implica: enable static-hazard -- a glitch here reaches the door motor\n{mux}");
    assert!(rules_of(mux, &Config::default()).is_empty());
    assert_eq!(
        rules_of(&on, &Config::default()),
        [("static-hazard", Severity::Warning)]
    );
    // The project's severity for the rule is kept when a file enables it.
    let (config, errors) =
        Config::parse("[rules]\nstatic-hazard = \"off\"\nredundant-term = \"error\"\n");
    assert!(errors.is_empty());
    assert_eq!(
        rules_of(&on, &config),
        [("static-hazard", Severity::Warning)]
    );
    let (config, _) = Config::parse("[rules]\nstatic-hazard = \"error\"\n");
    assert_eq!(
        rules_of(&format!("{mux}# implica: enable static-hazard\n"), &config),
        [("static-hazard", Severity::Error)]
    );
    // With the rule on, the consensus term is needed, not redundant.
    let with_consensus = "# implica: enable static-hazard\ninput sel, a, b\noutput y\ny = sel & a | !sel & b | a & b\n";
    assert!(rules_of(with_consensus, &Config::default()).is_empty());

    // Off for the file, wherever the directive stands; the later of two wins.
    let off = format!("{SRC}# implica: disable redundant-term\n");
    assert!(rules_of(&off, &Config::default()).is_empty());
    let (config, _) = Config::parse("[rules]\nredundant-term = \"error\"\n");
    assert!(rules_of(&off, &config).is_empty());
    let both =
        format!("# implica: disable redundant-term\n{SRC}# implica: enable redundant-term\n");
    assert_eq!(
        rules_of(&both, &Config::default()),
        [("redundant-term", Severity::Warning)]
    );
    // The configuration for a file says the same as its analysis.
    let (file, _) = implica_syntax::parse(&on);
    assert!(
        Config::default()
            .for_file(&file)
            .severity("static-hazard")
            .is_some()
    );
    let (file, _) = implica_syntax::parse(mux);
    assert!(
        Config::default()
            .for_file(&file)
            .severity("static-hazard")
            .is_none()
    );
}

#[test]
fn a_directive_naming_no_rule_is_reported_where_the_name_stands() {
    let src = "# implica: enable static-hazards, unused-input\n# implica: disable syntax-error\ninput a\noutput y\ny = a\n";
    let a = analyze(src);
    let found: Vec<(&str, &str, &str)> = a
        .diagnostics
        .iter()
        .map(|d| (d.rule, &src[d.span.start..d.span.end], d.message.as_str()))
        .collect();
    assert_eq!(
        found,
        [
            (
                "unknown-rule",
                "static-hazards",
                "there is no rule `static-hazards`"
            ),
            (
                "unknown-rule",
                "syntax-error",
                "`syntax-error` cannot be disabled"
            ),
        ]
    );
    // The nearest name is offered, to review.
    assert_eq!(a.diagnostics[0].fixes[0].edits[0].new_text, "static-hazard");
    // A word that only begins like the marker is no directive.
    let src = "# implica: enabled by the site survey\ninput a\noutput y\ny = a\n";
    assert!(analyze(src).diagnostics.is_empty());
    // syntax-error stays on.
    let src = "# implica: disable syntax-error\ninput a\noutput y\ny = a &\n";
    assert!(
        analyze(src)
            .diagnostics
            .iter()
            .any(|d| d.rule == "syntax-error")
    );
}
