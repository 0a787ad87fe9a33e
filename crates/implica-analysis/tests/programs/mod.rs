//! Generators of program text shared by the property tests of fixes and
//! refactors.

use proptest::prelude::*;

/// The primary inputs of the generated programs.
pub const INPUTS: [&str; 5] = ["a", "b", "c", "d", "e"];

/// A name, negated or not.
pub fn literal(names: Vec<String>) -> impl Strategy<Value = String> {
    (proptest::sample::select(names), any::<bool>())
        .prop_map(|(n, neg)| if neg { format!("!{n}") } else { n })
}

/// A product of one to three literals.
pub fn product(names: Vec<String>) -> impl Strategy<Value = String> {
    proptest::collection::vec(literal(names), 1..4).prop_map(|ls| ls.join(" & "))
}
