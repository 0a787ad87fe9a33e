//! The Boolean engine of Implica: bit-parallel truth tables, cubes, and exact
//! two-level minimization with don't-cares, of one output or of several
//! sharing product terms.
//!
//! ```
//! use implica_logic::{TruthTable, minimize_sop, Budget};
//! // f(a, b, c) = a'b + ab'c + abc'  over 3 inputs, `a` the most significant.
//! let on = TruthTable::from_minterms(3, &[2, 3, 5, 6]);
//! let dc = TruthTable::zero(3);
//! let result = minimize_sop(&on, &dc, &Budget::default()).unwrap();
//! assert!(result.proven_minimal);
//! assert_eq!(result.cover.len(), 3);
//! ```
//!
//! Architecture invariant: this crate knows nothing of the Implica syntax; it
//! works on variables numbered `0..n`, variable 0 being the most significant
//! bit of a minterm index.

#![warn(missing_docs)]

mod analysis;
mod bdd;
mod cube;
mod effort;
mod expr;
mod gates;
mod hash;
mod heuristic;
mod index;
mod minimize;
mod multi;
mod render;
mod truth_table;
mod urp;

pub use analysis::{
    Redundancy, classify_redundant_terms, hazard_free_cover, redundant_literals, redundant_terms,
    static0_hazards, static1_hazards,
};
pub use bdd::{Bdd, BddRef, DEFAULT_MAX_NODES};
pub use cube::{Cover, Cube};
pub use effort::{Effort, Interrupted};
pub use expr::BoolExpr;
pub use gates::{Cost, Gate, GateError, GateKind, GateNetwork, NetworkCost, Signal};
pub use hash::{FastHasher, FastMap, FastSet};
pub use heuristic::{Heuristic, minimize_heuristic};
pub use minimize::{
    Budget, Minimized, TooLarge, minimize_pos, minimize_pos_cancellable, minimize_sop,
    minimize_sop_cancellable, prime_implicants,
};
pub use multi::{MAX_OUTPUTS, MultiMinimized, minimize_multi, minimize_multi_cancellable};
pub use render::{
    DONT_CARE, Format, Function, RenderError, render_karnaugh_map, render_truth_table,
};
pub use truth_table::{MAX_VARS, TruthTable};
