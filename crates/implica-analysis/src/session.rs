//! Re-analysis of one document after an edit: a [`Session`] keeps what the
//! last analysis computed, so that the next one computes again only what
//! the edit changed.
//!
//! ```
//! use implica_analysis::{config::Config, session::Session};
//! let config = Config::default();
//! let mut session = Session::new();
//! let first = session.analyze("input a, b\noutput y\ny = a & b | a & b\n", &config);
//! // The edit: the repeated term removed.
//! let again = session.analyze("input a, b\noutput y\ny = a & b\n", &config);
//! assert_eq!(first.diagnostics[0].rule, "redundant-term");
//! assert!(again.diagnostics.is_empty());
//! ```
//!
//! What is kept, and why it is sound:
//! - **Every signal's function**, in the same BDD manager: a signal whose
//!   statement has the same text and whose read signals have the same
//!   functions keeps its function ([`Functions::update`]); the rest is
//!   composed again. Functions are canonical in one manager, so a kept one
//!   is the one a fresh computation would build.
//! - **Per-definition results by content**: the minimal forms and the
//!   redundant terms and literals of an expression definition depend only
//!   on the expression's text, on which combinations of its names' values
//!   can occur, and on the budget; they are kept under exactly that key.
//!
//! Architecture invariant: a session's analysis reports exactly what
//! [`crate::analyze_with`] reports for the same text and configuration
//! (tested on random edit sequences in `tests/session.rs`); the session
//! only saves work.
//!
//! Memory stays bounded: results the last analysis did not use are dropped
//! when the next one starts, and the BDD manager is built afresh when it
//! has grown to four times its fresh size (functions of earlier versions
//! are garbage in it), or has used half its choice variables (each version
//! of a signal with don't-cares takes one).

use crate::config::Config;
use crate::functions::{DEFAULT_WORK_PER_DEFINITION, Functions};
use crate::model::Model;
use crate::rules::MinimalPair;
use implica_logic::FastMap;
use implica_logic::{BddRef, Budget, DEFAULT_MAX_NODES, Interrupted, TruthTable};
use implica_syntax::ast::SmolStr;
use implica_syntax::ast::SourceFile;
use std::hash::Hash;
use std::sync::Arc;

/// Results kept by key for the next analysis. Each entry carries the number
/// of the last analysis that used it; a new analysis drops the entries the
/// one before did not use.
pub(crate) struct Memo<K, V> {
    map: FastMap<K, (V, u64)>,
    epoch: u64,
}

impl<K, V> Default for Memo<K, V> {
    fn default() -> Self {
        Memo {
            map: FastMap::default(),
            epoch: 0,
        }
    }
}

impl<K: Hash + Eq, V: Clone> Memo<K, V> {
    /// The value under `key`, computed by `compute` when not kept.
    pub(crate) fn get_or(&mut self, key: K, compute: impl FnOnce() -> V) -> V {
        let epoch = self.epoch;
        match self.map.entry(key) {
            std::collections::hash_map::Entry::Occupied(mut o) => {
                o.get_mut().1 = epoch;
                o.get().0.clone()
            }
            std::collections::hash_map::Entry::Vacant(v) => v.insert((compute(), epoch)).0.clone(),
        }
    }

    /// [`Memo::get_or`] for a computation that can be stopped: when
    /// `compute` gives `None` nothing is kept, and `None` comes back.
    pub(crate) fn try_get_or(&mut self, key: K, compute: impl FnOnce() -> Option<V>) -> Option<V> {
        let epoch = self.epoch;
        match self.map.entry(key) {
            std::collections::hash_map::Entry::Occupied(mut o) => {
                o.get_mut().1 = epoch;
                Some(o.get().0.clone())
            }
            std::collections::hash_map::Entry::Vacant(v) => {
                let value = compute()?;
                Some(v.insert((value, epoch)).0.clone())
            }
        }
    }

    /// Starts a new analysis: what the last one did not use goes.
    fn age(&mut self) {
        let keep = self.epoch;
        self.map.retain(|_, (_, used)| *used >= keep);
        self.epoch += 1;
    }

    fn len(&self) -> usize {
        self.map.len()
    }
}

/// What an expression definition's two-level results depend on: its text,
/// the combinations of its names' values that can occur, and the budget.
#[derive(PartialEq, Eq, Hash)]
pub(crate) struct ShapeKey {
    pub text: Box<str>,
    pub reachable: TruthTable,
    pub budget: (usize, usize, u64, u64),
}

impl ShapeKey {
    pub(crate) fn new(text: &str, reachable: &TruthTable, budget: &Budget) -> ShapeKey {
        ShapeKey {
            text: text.into(),
            reachable: reachable.clone(),
            budget: (
                budget.max_vars,
                budget.max_primes,
                budget.max_nodes,
                budget.max_work,
            ),
        }
    }
}

/// What an expression's function over its names depends on: its text, the
/// function of each name it reads (`None`: unknown), and the impossible
/// combinations, all in one BDD manager.
#[derive(PartialEq, Eq, Hash)]
pub(crate) struct ValueKey {
    pub text: Box<str>,
    pub values: Vec<(SmolStr, Option<BddRef>)>,
    pub impossible: BddRef,
}

/// The per-definition results one analysis leaves for the next.
#[derive(Default)]
pub(crate) struct Cache {
    /// Whether `non-minimal` reports an expression, with its minimal forms.
    pub non_minimal: Memo<ShapeKey, Option<Arc<MinimalPair>>>,
    /// The redundant parts and literals of a two-level expression.
    pub redundancy: Memo<ShapeKey, Option<Arc<crate::forms::Redundancy>>>,
    /// Expressions over their names. Keyed by functions of the session's
    /// manager: emptied when the manager is built afresh.
    pub expr_functions: Memo<ValueKey, Option<Arc<crate::forms::ExprFunction>>>,
    /// Proofs of fixes that rewrite one expression (`None`: not such a fix).
    /// Keyed by functions, as `expr_functions`.
    pub proofs: Memo<crate::fixes::ProofKey, Option<Result<(), String>>>,
    /// The variables each function depends on. Keyed by functions.
    pub supports: Memo<BddRef, Arc<[usize]>>,
}

impl Cache {
    fn age(&mut self) {
        self.non_minimal.age();
        self.redundancy.age();
        self.expr_functions.age();
        self.proofs.age();
        self.supports.age();
    }

    /// Forgets what is keyed by the functions of a manager no longer used.
    fn new_manager(&mut self) {
        self.expr_functions = Memo::default();
        self.proofs = Memo::default();
        self.supports = Memo::default();
    }
}

/// The last version analysed, with its functions.
struct Previous {
    text: String,
    file: SourceFile,
    functions: Functions,
    /// Nodes in the manager when it was last built afresh.
    fresh_nodes: usize,
}

/// The analyses of one document, one version after another (a language
/// server keeps one per open document).
#[derive(Default)]
pub struct Session {
    cache: Cache,
    previous: Option<Previous>,
}

/// Most nodes a manager may grow to, as a multiple of its fresh size, before
/// it is rebuilt.
const GROWTH: usize = 4;

impl Session {
    /// A session that has analysed nothing yet.
    pub fn new() -> Session {
        Session::default()
    }

    /// Checks this version of the document, as [`crate::analyze_with`]
    /// does, reusing what the last version computed.
    pub fn analyze(&mut self, src: &str, config: &Config) -> crate::Analysis {
        // Only a cancel callback stops an analysis.
        self.analyze_cancellable(src, config, None)
            .unwrap_or_default()
    }

    /// [`Session::analyze`], stopped (returning `None`) when `cancel`
    /// returns true; the session stays usable, and the next analysis starts
    /// from what is still known.
    pub fn analyze_cancellable(
        &mut self,
        src: &str,
        config: &Config,
        cancel: Option<&dyn Fn() -> bool>,
    ) -> Option<crate::Analysis> {
        self.cache.age();
        let (file, errors) = implica_syntax::parse(src);
        let model = Model::build(&file);
        let functions = match self.previous.take() {
            // Kept while it has not grown too much (and is far from its
            // node limit, which a fresh manager would not meet), and has
            // choice variables to spare (each recomputed signal with
            // don't-cares takes a new one; running out, or out of nodes,
            // would leave a signal unknown that a fresh analysis knows).
            Some(mut p)
                if p.functions.bdd.len()
                    < (GROWTH * p.fresh_nodes.max(1 << 16)).min(DEFAULT_MAX_NODES / 2)
                    && p.functions.choices_left()
                        > crate::functions::CHOICE_ROOM / 2 * model.signals.len() + 2048 =>
            {
                let old = Model::build(&p.file);
                match p.functions.update(
                    (&old, &p.text),
                    (&model, src),
                    DEFAULT_WORK_PER_DEFINITION,
                    cancel,
                ) {
                    Some(Ok(())) => Some((p.functions, p.fresh_nodes)),
                    // Cancelled halfway: the manager's values are of neither
                    // version; start afresh next time.
                    Some(Err(Interrupted::Cancelled)) => return None,
                    _ => None,
                }
            }
            _ => None,
        };
        let (functions, fresh_nodes) = match functions {
            Some(f) => f,
            None => match Functions::compute(&model, DEFAULT_WORK_PER_DEFINITION, cancel) {
                Ok(f) => {
                    self.cache.new_manager();
                    let n = f.bdd.len();
                    (f, n)
                }
                Err(Interrupted::Cancelled) => return None,
                // Each definition has its own budget, so this does not
                // happen; the syntax errors are still reported if it does.
                Err(Interrupted::OutOfBudget) => return Some(crate::syntax_only(errors)),
            },
        };
        let (analysis, functions) = crate::run_rules(
            src,
            &file,
            &model,
            errors,
            config,
            &mut self.cache,
            functions,
            cancel,
        )?;
        drop(model);
        self.previous = Some(Previous {
            text: src.to_string(),
            file,
            functions,
            fresh_nodes,
        });
        Some(analysis)
    }

    /// How many per-definition results the session holds (for tests of its
    /// bound).
    pub fn kept(&self) -> usize {
        self.cache.non_minimal.len() + self.cache.redundancy.len() + self.cache.expr_functions.len()
    }
}
