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
