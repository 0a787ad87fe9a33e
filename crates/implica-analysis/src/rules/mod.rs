//! The rules. Each rule is one file whose doc comment is its documentation,
//! shown by `implica explain RULE`.

pub mod syntax_error;

use crate::Severity;

/// A rule's identity and documentation.
#[derive(Debug, Clone, Copy)]
pub struct Rule {
    /// Stable kebab-case name, used in configuration and output.
    pub name: &'static str,
    pub default_severity: Severity,
    /// One line.
    pub summary: &'static str,
    /// The source file of the rule; its `//!` comment is the documentation.
    pub source: &'static str,
}

impl Rule {
    /// The full documentation, in Markdown: the rule file's `//!` comment.
    pub fn documentation(&self) -> String {
        let mut doc = String::new();
        for line in self.source.lines() {
            let Some(rest) = line.strip_prefix("//!") else {
                break;
            };
            doc.push_str(rest.strip_prefix(' ').unwrap_or(rest));
            doc.push('\n');
        }
        doc
    }
}

/// Every rule, in the order `implica rules` lists them.
pub const ALL: &[Rule] = &[syntax_error::RULE];

/// The rule named `name`.
pub fn find(name: &str) -> Option<&'static Rule> {
    ALL.iter().find(|r| r.name == name)
}
