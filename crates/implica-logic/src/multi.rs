//! Multi-output minimization: several functions of the same inputs, each
//! with its own don't-cares, as sums of products drawing on one shared set
//! of product terms (as in a programmable logic array, where a term is
//! built once and may feed every output).
//!
//! Cost: fewest distinct product terms, then fewest literals over the
//! distinct terms (each term's literals counted once, however many outputs
//! use it). The columns of the cover search are the multi-output prime
//! implicants: for every set of outputs, the primes of the product of their
//! care sets, each tagged with every output it lies inside. A minimum
//! solution needs no other terms, since any term can grow to such a prime
//! without losing an output or gaining a literal.
//!
//! ```
//! use implica_logic::{Budget, TruthTable, minimize_multi};
//! // Over (a, b, c): x = a&b | !a&c (rows 1, 3, 6, 7) and y = a&b | b&c
//! // (rows 3, 6, 7). Alone they take 2 + 2 terms; together a&b is built once.
//! let none = TruthTable::zero(3);
//! let x = TruthTable::from_minterms(3, &[1, 3, 6, 7]);
//! let y = TruthTable::from_minterms(3, &[3, 6, 7]);
//! let m = minimize_multi(&[(x, none.clone()), (y, none)], &Budget::default()).unwrap();
//! assert!(m.proven_minimal);
//! assert_eq!((m.terms.len(), m.separate_terms), (3, 4));
//! assert_eq!(m.shared().len(), 1);
//! ```

use crate::minimize::{
    Implicant, PASSES_SHARE, Stop, Stopped, isolated, never, pack_rows, primes_and_work,
    solve_cover, sop,
};
use crate::{Budget, Cover, Cube, Interrupted, Minimized, TooLarge, TruthTable};
use std::collections::HashSet;

/// Most outputs minimized together (the prime generation visits sets of
/// outputs).
pub const MAX_OUTPUTS: usize = 16;

/// Several outputs minimized together, with the certificate.
#[derive(Debug, Clone)]
pub struct MultiMinimized {
    /// Inputs of every output.
    pub vars: usize,
    /// The distinct product terms, ascending.
    pub terms: Vec<Cube>,
    /// For each output, the indices in `terms` of the terms it sums.
    pub uses: Vec<Vec<usize>>,
    /// Whether no solution has fewer distinct terms, or as many and fewer
    /// literals.
    pub proven_minimal: bool,
    /// Fewest distinct terms any solution needs, as proven (equals
    /// `terms.len()` when `proven_minimal`).
    pub lower_bound: usize,
    /// Number of multi-output prime implicants.
    pub primes: usize,
    /// Terms of the outputs minimized one at a time, summed over outputs.
    pub separate_terms: usize,
    /// Literals of the outputs minimized one at a time, summed over outputs.
    pub separate_literals: usize,
}

impl MultiMinimized {
    /// The sum of products of output `output`.
    pub fn cover(&self, output: usize) -> Cover {
        Cover {
            vars: self.vars,
            cubes: self.uses[output].iter().map(|&t| self.terms[t]).collect(),
        }
    }

    /// Literals over the distinct terms.
    pub fn literals(&self) -> usize {
        self.terms.iter().map(|c| c.literals(self.vars)).sum()
    }

    /// Indices in `terms` of the terms used by more than one output.
    pub fn shared(&self) -> Vec<usize> {
        let mut count = vec![0usize; self.terms.len()];
        for uses in &self.uses {
            for &t in uses {
                count[t] += 1;
            }
        }
        (0..self.terms.len()).filter(|&t| count[t] > 1).collect()
    }
}

fn refuse(reason: String, outputs: &[(TruthTable, TruthTable)]) -> TooLarge {
    let vars = outputs.first().map_or(0, |o| o.0.vars());
    let parts: Vec<TooLarge> = outputs
        .iter()
        .map(|(on, dc)| TooLarge::of(String::new(), on, dc))
        .collect();
    let mut support: Vec<usize> = parts.iter().flat_map(|p| p.support.clone()).collect();
    support.sort_unstable();
    support.dedup();
    // A minterm isolated in an output is a term of its own there; the
    // outputs may share it, so the bound counts each such minterm once.
    let lower_bound = if outputs
        .iter()
        .all(|(on, dc)| on.vars() == vars && dc.vars() == vars)
    {
        outputs
            .iter()
            .fold(TruthTable::zero(vars), |acc, (on, dc)| {
                acc.or(&isolated(on, dc))
            })
            .count_ones()
    } else {
        0
    };
    TooLarge {
        reason,
        vars,
        on_set: parts.iter().map(|p| p.on_set).sum(),
        support,
        lower_bound,
    }
}

/// Minimizes the outputs `(on, dc)` together: output `i` must be 1 on
/// `on_i` outside `dc_i`, 0 outside `on_i | dc_i`, and is free on `dc_i`.
/// Each output is first minimized alone (for the comparison and a bound),
/// then the shared cover is searched; each of these gets the whole budget,
/// except `max_primes`, which counts the primes of every set of outputs
/// together. The sets of outputs, up to 2^outputs of them (outputs that
/// leave a set's product as it is are not branched on), have their table
/// work counted against four times `max_work`: past it, the separate
/// covers come back put together, not proven minimal, with the largest
/// of their bounds.
pub fn minimize_multi(
    outputs: &[(TruthTable, TruthTable)],
    budget: &Budget,
) -> Result<MultiMinimized, TooLarge> {
    multi(outputs, budget, &never).map_err(Stopped::too_large)
}

/// [`minimize_multi`], stopped early when `cancel` returns true, as
/// [`crate::minimize_sop_cancellable`] is.
pub fn minimize_multi_cancellable(
    outputs: &[(TruthTable, TruthTable)],
    budget: &Budget,
    cancel: &dyn Fn() -> bool,
) -> Result<Result<MultiMinimized, TooLarge>, Interrupted> {
    Stopped::split(multi(outputs, budget, cancel))
}

fn multi(
    outputs: &[(TruthTable, TruthTable)],
    budget: &Budget,
    stop: Stop,
) -> Result<MultiMinimized, Stopped> {
    let vars = outputs.first().map_or(0, |o| o.0.vars());
    if outputs.len() > MAX_OUTPUTS {
        return Err(refuse(
            format!(
                "{} outputs, more than the {MAX_OUTPUTS} minimized together",
                outputs.len()
            ),
            outputs,
        )
        .into());
    }
    if outputs
        .iter()
        .any(|(on, dc)| on.vars() != vars || dc.vars() != vars)
    {
        return Err(refuse("outputs over different inputs".to_string(), outputs).into());
    }
    // Each output alone: the comparison, and a bound (every output needs
    // its own minimum of distinct terms).
    let mut separate = Vec::with_capacity(outputs.len());
    for (on, dc) in outputs {
        separate.push(sop(on, dc, budget, stop)?);
    }
    let care: Vec<TruthTable> = outputs.iter().map(|(on, dc)| on.or(dc)).collect();
    let need: Vec<TruthTable> = outputs.iter().map(|(on, dc)| on.and_not(dc)).collect();

    // Primes of the product of every set of outputs' care sets, depth first
    // over the sets; an empty product ends a branch.
    let mut found: HashSet<Implicant> = HashSet::new();
    let mut columns: Vec<Implicant> = Vec::new();
    let mut generated = 0usize;
    // The sets of outputs are up to 2^outputs: the table words read for
    // them, by the products and by each prime search, are counted against
    // the budget, as the cover search's reductions are.
    let work_limit = budget.max_work.saturating_mul(PASSES_SHARE);
    let mut words = 0u64;
    let mut cut = false;
    let table_words = (1u64 << vars).div_ceil(64);
    let mut stack: Vec<(usize, TruthTable, TruthTable)> = Vec::new();
    for i in 0..outputs.len() {
        stack.push((i, care[i].clone(), need[i].clone()));
    }
    while let Some((last, product, wanted)) = stack.pop() {
        words += table_words * (outputs.len() - last) as u64;
        if words > work_limit {
            cut = true;
            break;
        }
        let mut wanted = wanted.and(&product);
        // An output whose care set holds the whole product leaves it as it
        // is: every set with it has the primes of a set without it, wanted
        // on more minterms. Its required minterms join this set's, and the
        // search does not branch on it (identical outputs cost one search).
        let mut branch = Vec::with_capacity(outputs.len() - last);
        for next in last + 1..outputs.len() {
            if care[next].covers(&product) {
                wanted = wanted.or(&need[next].and(&product));
            } else {
                branch.push(next);
            }
        }
        if !wanted.is_zero() {
            let left = Budget {
                max_primes: budget.max_primes.saturating_sub(generated),
                ..budget.clone()
            };
            let (primes, read) = primes_and_work(&wanted, &product.and_not(&wanted), &left, stop)
                .map_err(|e| match e {
                Stopped::Cancelled => Stopped::Cancelled,
                Stopped::TooLarge(_) => refuse(
                    format!(
                        "more than {} prime implicants over the sets of outputs",
                        budget.max_primes
                    ),
                    outputs,
                )
                .into(),
            })?;
            generated += primes.len();
            words += read;
            for p in primes {
                if found.insert(p) {
                    columns.push(p);
                }
            }
        }
        for next in branch {
            let narrower = product.and(&care[next]);
            if !narrower.is_zero() {
                stack.push((next, narrower, wanted.or(&need[next])));
            }
        }
    }
    columns.sort();
    // Every solution has at least the distinct terms of the output that
    // needs the most.
    let separate_bound = separate.iter().map(|s| s.lower_bound).max().unwrap_or(0);
    if cut {
        // Past the work: the separate covers put together.
        let mut result = pooled(vars, &separate, &need, &care);
        result.primes = columns.len();
        result.proven_minimal = false;
        result.lower_bound = separate_bound.min(result.terms.len());
        return Ok(result);
    }

    // Rows: (output, required minterm). A column covers the rows of every
    // output whose care set holds it.
    let mut row_base = Vec::with_capacity(outputs.len());
    let mut rows_of_output: Vec<Vec<u32>> = Vec::with_capacity(outputs.len());
    let mut total_rows = 0usize;
    for n in &need {
        let mut index = vec![u32::MAX; 1usize << vars];
        for (k, m) in n.minterms().into_iter().enumerate() {
            index[m] = (total_rows + k) as u32;
        }
        row_base.push(total_rows);
        total_rows += n.count_ones();
        rows_of_output.push(index);
    }
    // Which outputs each column serves, and the matrix's entries, take a
    // visit of each column's minterms per output: refused past four times
    // the entry limit, and the entries counted exactly past the limit, as
    // for one output.
    let visits: u64 = columns
        .iter()
        .map(|p| (1u64 << p.free.count_ones()) * outputs.len() as u64)
        .sum();
    let too_large = |what: String| -> Stopped { refuse(what, outputs).into() };
    if visits > budget.max_entries.saturating_mul(4) {
        return Err(too_large(format!(
            "{} prime implicants holding more than {} minterms over the outputs",
            columns.len(),
            budget.max_entries.saturating_mul(4)
        )));
    }
    let serves: Vec<Vec<usize>> = columns
        .iter()
        .map(|p| {
            (0..outputs.len())
                .filter(|&i| p.minterms().all(|m| care[i].get(m)))
                .collect()
        })
        .collect();
    if visits > budget.max_entries {
        let mut entries = 0u64;
        for (p, outs) in columns.iter().zip(&serves) {
            for &i in outs {
                entries += p.minterms().filter(|&m| need[i].get(m)).count() as u64;
            }
            if entries > budget.max_entries {
                return Err(too_large(format!(
                    "a covering matrix of more than {} entries",
                    budget.max_entries
                )));
            }
        }
    }
    let rows = pack_rows(total_rows, |entry| {
        for (c, p) in columns.iter().enumerate() {
            for &i in &serves[c] {
                for m in p.minterms() {
                    let r = rows_of_output[i][m];
                    if r != u32::MAX {
                        entry(r, c as u32);
                    }
                }
            }
        }
    });
    let literals: Vec<u64> = columns
        .iter()
        .map(|p| (vars - p.free.count_ones() as usize) as u64)
        .collect();
    let solution = solve_cover(rows, &literals, vars, budget, stop)?;

    let chosen: Vec<Cube> = solution
        .columns
        .iter()
        .map(|&c| columns[c].to_cube(vars))
        .collect();
    let mut result = assemble(vars, chosen, &need, &care);
    let lower = separate_bound.max(solution.lower_bound_terms);
    result.proven_minimal = solution.proven;
    result.primes = columns.len();
    // A search cut short may do worse than the separate covers put
    // together; never return that.
    let pooled = pooled(vars, &separate, &need, &care);
    result.separate_terms = pooled.separate_terms;
    result.separate_literals = pooled.separate_literals;
    if (pooled.terms.len(), pooled.literals()) < (result.terms.len(), result.literals()) {
        result.terms = pooled.terms;
        result.uses = pooled.uses;
    }
    result.lower_bound = if result.proven_minimal {
        result.terms.len()
    } else {
        lower.min(result.terms.len())
    };
    Ok(result)
}

/// The separate covers put together (a term two outputs chose is shared),
/// with their cost apart.
fn pooled(
    vars: usize,
    separate: &[Minimized],
    need: &[TruthTable],
    care: &[TruthTable],
) -> MultiMinimized {
    let mut union: Vec<Cube> = separate
        .iter()
        .flat_map(|s| s.cover.cubes.clone())
        .collect();
    union.sort();
    union.dedup();
    let mut result = assemble(vars, union, need, care);
    result.separate_terms = separate.iter().map(|s| s.cover.len()).sum();
    result.separate_literals = separate.iter().map(|s| s.cover.literals()).sum();
    result
}

/// The solution of the given distinct terms: each output sums the terms
/// inside its care set, less those the others already make redundant for it.
fn assemble(
    vars: usize,
    mut terms: Vec<Cube>,
    need: &[TruthTable],
    care: &[TruthTable],
) -> MultiMinimized {
    terms.sort();
    let tables: Vec<TruthTable> = terms.iter().map(|c| c.truth_table(vars)).collect();
    let mut uses = Vec::with_capacity(need.len());
    for (n, k) in need.iter().zip(care) {
        let mut used: Vec<usize> = (0..terms.len())
            .filter(|&t| k.covers(&tables[t]) && !tables[t].and(n).is_zero())
            .collect();
        // Drop terms whose required minterms the output's other terms cover,
        // most literals first.
        let mut order = used.clone();
        order.sort_by_key(|&t| std::cmp::Reverse(terms[t].literals(vars)));
        for t in order {
            let others = used
                .iter()
                .filter(|&&u| u != t)
                .fold(TruthTable::zero(vars), |acc, &u| acc.or(&tables[u]));
            if others.covers(n) {
                used.retain(|&u| u != t);
            }
        }
        uses.push(used);
    }
    // Terms no output uses are not part of the solution.
    let mut keep = vec![false; terms.len()];
    for u in &uses {
        for &t in u {
            keep[t] = true;
        }
    }
    let mut renumber = vec![usize::MAX; terms.len()];
    let mut kept = Vec::new();
    for t in 0..terms.len() {
        if keep[t] {
            renumber[t] = kept.len();
            kept.push(terms[t]);
        }
    }
    for u in &mut uses {
        for t in u.iter_mut() {
            *t = renumber[*t];
        }
    }
    MultiMinimized {
        vars,
        terms: kept,
        uses,
        proven_minimal: false,
        lower_bound: 0,
        primes: 0,
        separate_terms: 0,
        separate_literals: 0,
    }
}
