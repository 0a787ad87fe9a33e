//! Analyses of a given sum of products: redundant terms, redundant literals,
//! static hazards, and the hazard-free cover.
//!
//! They work on truth tables: each panics, as [`TruthTable`] does, when the
//! cover has more than [`crate::MAX_VARS`] inputs or the don't-cares are
//! over a different number of inputs. Each reads every term's table once
//! (redundancy: the rows one term covers and those two or more do;
//! hazards: per input, the rows a term free on it holds), so its cost
//! grows with the terms times the table, not with the square of the terms.
//!
//! ```
//! use implica_logic::{Budget, Cover, Cube, TruthTable, hazard_free_cover, redundant_terms, static1_hazards};
//! // a&b | !a&c | b&c over (a, b, c): the consensus term b&c is redundant,
//! // and without it the cover has a static-1 hazard when a changes with b = c = 1.
//! let lit = |i, p| Cube::literal(3, i, p);
//! let (ab, nac, bc) = (lit(0, true).and(&lit(1, true)), lit(0, false).and(&lit(2, true)), lit(1, true).and(&lit(2, true)));
//! let dc = TruthTable::zero(3);
//! let full = Cover { vars: 3, cubes: vec![ab, nac, bc] };
//! assert_eq!(redundant_terms(&full, &dc), vec![2]);
//! let minimal = Cover { vars: 3, cubes: vec![ab, nac] };
//! assert_eq!(static1_hazards(&minimal, &dc), vec![(3, 7)]); // rows 011 and 111
//! let fixed = hazard_free_cover(&minimal, &minimal.truth_table(), &dc, &Budget::default()).unwrap();
//! assert!(static1_hazards(&fixed, &dc).is_empty());
//! ```

use crate::{Budget, Cover, Cube, TooLarge, TruthTable, prime_implicants};

/// The minterms the function must be 1 on: the on-set outside the don't-cares.
fn required(on: &TruthTable, dc: &TruthTable) -> TruthTable {
    on.and_not(dc)
}

/// Terms of `cover` that can be removed without changing the function under
/// the don't-cares `dc`: duplicates, absorbed terms, and terms the others
/// cover together (such as consensus terms). Each index is redundant given
/// all the other terms; removing them one at a time, rechecking after each,
/// keeps the function.
pub fn redundant_terms(cover: &Cover, dc: &TruthTable) -> Vec<usize> {
    Coverage::of(cover).redundant(dc)
}

/// Each term's truth table, and the rows at least one term covers and at
/// least two do: a term is needed exactly on the required rows it alone
/// covers, so one pass over the terms answers for all of them.
struct Coverage {
    tables: Vec<TruthTable>,
    once: TruthTable,
    twice: TruthTable,
}

impl Coverage {
    fn of(cover: &Cover) -> Coverage {
        let vars = cover.vars;
        let tables: Vec<TruthTable> = cover.cubes.iter().map(|c| c.truth_table(vars)).collect();
        let (mut once, mut twice) = (TruthTable::zero(vars), TruthTable::zero(vars));
        for t in &tables {
            twice = twice.or(&once.and(t));
            once = once.or(t);
        }
        Coverage {
            tables,
            once,
            twice,
        }
    }

    /// The terms that cover no required row alone.
    fn redundant(&self, dc: &TruthTable) -> Vec<usize> {
        let need = required(&self.once, dc);
        (0..self.tables.len())
            .filter(|&i| self.tables[i].and(&need).and_not(&self.twice).is_zero())
            .collect()
    }
}

/// Why a term of a cover is redundant (see [`classify_redundant_terms`]).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Redundancy {
    /// The term lies inside the don't-cares: it is 1 only where the value
    /// is free.
    DontCaresOnly,
    /// The same term as another.
    Duplicate {
        /// The index of the first other copy.
        of: usize,
    },
    /// A different term contains it (absorption, `x | x & y`).
    Absorbed {
        /// The index of the first term that contains it.
        by: usize,
    },
    /// No one term contains it, but the others together cover it (such as
    /// a consensus term).
    Covered {
        /// Whether they do only thanks to the don't-cares.
        with_dont_cares: bool,
    },
}

/// The terms [`redundant_terms`] finds, each with the reason, the most
/// specific first: inside the don't-cares, a duplicate, absorbed by one
/// other term, or covered by the others together.
///
/// ```
/// use implica_logic::{Cover, Cube, Redundancy, TruthTable, classify_redundant_terms};
/// // a | a & b | a & b | !a & c | b & c over (a, b, c).
/// let lit = |i, p| Cube::literal(3, i, p);
/// let (a, ab, nac, bc) = (lit(0, true), lit(0, true).and(&lit(1, true)), lit(0, false).and(&lit(2, true)), lit(1, true).and(&lit(2, true)));
/// let f = Cover { vars: 3, cubes: vec![a, ab, ab, nac, bc] };
/// assert_eq!(
///     classify_redundant_terms(&f, &TruthTable::zero(3)),
///     vec![
///         (1, Redundancy::Duplicate { of: 2 }),
///         (2, Redundancy::Duplicate { of: 1 }),
///         (4, Redundancy::Covered { with_dont_cares: false }),
///     ]
/// );
/// ```
pub fn classify_redundant_terms(cover: &Cover, dc: &TruthTable) -> Vec<(usize, Redundancy)> {
    let coverage = Coverage::of(cover);
    coverage
        .redundant(dc)
        .into_iter()
        .map(|i| {
            let c = cover.cubes[i];
            let own = &coverage.tables[i];
            let others = || cover.cubes.iter().enumerate().filter(move |&(j, _)| j != i);
            let why = if dc.covers(own) {
                Redundancy::DontCaresOnly
            } else if let Some((j, _)) = others().find(|&(_, d)| *d == c) {
                Redundancy::Duplicate { of: j }
            } else if let Some((j, _)) = others().find(|&(_, d)| d.contains(&c)) {
                Redundancy::Absorbed { by: j }
            } else {
                // The others cover all of the term exactly where another
                // term covers each of its rows.
                Redundancy::Covered {
                    with_dont_cares: !coverage.twice.covers(own),
                }
            };
            (i, why)
        })
        .collect()
}

/// Literals that can be dropped from their term without changing the
/// function under `dc`: `(term index, variable)`. The function is the one
/// `cover` computes; dropping a literal only grows the term, so it is
/// redundant when the grown term stays inside the function or the
/// don't-cares.
///
/// ```
/// use implica_logic::{Cover, Cube, TruthTable, redundant_literals};
/// // a | !a & b over (a, b): the `!a` of the second term is redundant
/// // (a | b is the same function; common practice).
/// let lit = |i, p| Cube::literal(2, i, p);
/// let f = Cover { vars: 2, cubes: vec![lit(0, true), lit(0, false).and(&lit(1, true))] };
/// assert_eq!(redundant_literals(&f, &TruthTable::zero(2)), vec![(1, 0)]);
/// ```
pub fn redundant_literals(cover: &Cover, dc: &TruthTable) -> Vec<(usize, usize)> {
    let allowed = cover.truth_table().or(dc);
    let mut out = Vec::new();
    for (t, cube) in cover.cubes.iter().enumerate() {
        for v in 0..cover.vars {
            if cube.literal_of(v).is_none() {
                continue;
            }
            let grown = Cube {
                zero: cube.zero | 1 << v,
                one: cube.one | 1 << v,
            };
            if allowed.covers(&grown.truth_table(cover.vars)) {
                out.push((t, v));
            }
        }
    }
    out
}

/// Static-1 hazards of a sum of products: pairs of minterms `(a, b)`,
/// `a < b`, differing in one input, where the function must be 1 on both
/// (outside `dc`) but no single term covers both, so a change of that input
/// can glitch the output to 0.
pub fn static1_hazards(cover: &Cover, dc: &TruthTable) -> Vec<(usize, usize)> {
    let vars = cover.vars;
    let coverage = Coverage::of(cover);
    let need = required(&coverage.once, dc);
    let mut out = Vec::new();
    for (v, h) in hazards(cover, &coverage.tables, &need).iter().enumerate() {
        out.extend(
            h.minterms()
                .into_iter()
                .map(|a| (a, a + (1 << (vars - 1 - v)))),
        );
    }
    out.sort();
    out
}

/// For each variable `v`, the required rows `a` with `v = 0` whose
/// neighbour across `v` is required too and that no term free on `v`
/// holds: the hazards `(a, a with v = 1)`. One pass over the terms and one
/// table operation per variable, whatever the number of terms.
fn hazards(cover: &Cover, tables: &[TruthTable], need: &TruthTable) -> Vec<TruthTable> {
    let vars = cover.vars;
    let mut joined = vec![TruthTable::zero(vars); vars];
    for (c, t) in cover.cubes.iter().zip(tables) {
        for (v, j) in joined.iter_mut().enumerate() {
            if c.literal_of(v).is_none() {
                *j = j.or(t);
            }
        }
    }
    joined
        .iter()
        .enumerate()
        .map(|(v, j)| {
            need.and(&need.flip(v))
                .and_not(&TruthTable::var(vars, v))
                .and_not(j)
        })
        .collect()
}

/// Static-0 hazards of a product of sums, given as the sum of products of
/// its complement (as [`crate::minimize_pos`] returns it): pairs of adjacent
/// minterms where the function must be 0 on both but no single sum term is 0
/// on both.
///
/// ```
/// use implica_logic::{Cover, Cube, TruthTable, static0_hazards};
/// // (a | b) & (!a | c) over (a, b, c) is 0 on !a & !b and on a & !c, so
/// // its complement's sum is !a & !b | a & !c. Rows 000 and 100 are both
/// // 0, adjacent, and no one sum term is 0 on both: a change of `a` with
/// // b = c = 0 can glitch the output to 1 (common practice).
/// let lit = |i, p| Cube::literal(3, i, p);
/// let complement = Cover {
///     vars: 3,
///     cubes: vec![lit(0, false).and(&lit(1, false)), lit(0, true).and(&lit(2, false))],
/// };
/// assert_eq!(static0_hazards(&complement, &TruthTable::zero(3)), vec![(0, 4)]);
/// ```
pub fn static0_hazards(complement: &Cover, dc: &TruthTable) -> Vec<(usize, usize)> {
    static1_hazards(complement, dc)
}

/// `cover` with prime implicants (of the function `on`, free on `dc`) added
/// until no static-1 hazard is left: for each hazardous pair, a prime with
/// fewest literals that contains both minterms. The function is unchanged.
///
/// # Errors
///
/// When the primes are past `budget`, or when `cover` does not compute `on`
/// outside `dc` (the reason names an input row where they differ): the
/// primes of `on` are then not the terms that could mend the cover.
pub fn hazard_free_cover(
    cover: &Cover,
    on: &TruthTable,
    dc: &TruthTable,
    budget: &Budget,
) -> Result<Cover, TooLarge> {
    let vars = cover.vars;
    let mismatch = |reason: String| TooLarge::of(reason, on, dc);
    if on.vars() != vars || dc.vars() != vars {
        return Err(mismatch(format!(
            "a cover over {vars} inputs, a function over {} and don't-cares over {}",
            on.vars(),
            dc.vars()
        )));
    }
    let care = !dc;
    if let Some(row) = cover
        .truth_table()
        .and(&care)
        .counterexample(&on.and(&care))
    {
        return Err(mismatch(format!(
            "the cover is not the function: they differ at input row {row}"
        )));
    }
    let primes = prime_implicants(on, dc, budget)?;
    let mut out = cover.clone();
    let coverage = Coverage::of(cover);
    // A prime added lies inside the function or the don't-cares, so the
    // required rows stay those of `cover`, and the hazards only shrink.
    let mut left = hazards(cover, &coverage.tables, &required(&coverage.once, dc));
    loop {
        // The smallest pair first, as `static1_hazards` lists them: the
        // lowest row, then the nearest neighbour (the last variable).
        let mut first: Option<(usize, usize)> = None;
        for (v, h) in left.iter().enumerate() {
            if let Some(a) = h.counterexample(&TruthTable::zero(vars)) {
                let pair = (a, a + (1 << (vars - 1 - v)));
                if first.is_none_or(|f| pair < f) {
                    first = Some(pair);
                }
            }
        }
        let Some((a, b)) = first else {
            return Ok(out);
        };
        let (ca, cb) = (Cube::minterm(vars, a), Cube::minterm(vars, b));
        // Both rows are required and adjacent, so the cube joining them is
        // an implicant, inside some prime.
        let Some(fix) = primes
            .cubes
            .iter()
            .filter(|p| p.contains(&ca) && p.contains(&cb))
            .min_by_key(|p| p.literals(vars))
            .copied()
        else {
            return Err(mismatch(format!(
                "no prime implicant joins input rows {a} and {b}"
            )));
        };
        out.cubes.push(fix);
        let t = fix.truth_table(vars);
        for (v, h) in left.iter_mut().enumerate() {
            if fix.literal_of(v).is_none() {
                *h = h.and_not(&t);
            }
        }
    }
}
