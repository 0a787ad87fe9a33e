//! Exact two-level minimization with don't-cares: all prime implicants by
//! the tabular method of Quine and McCluskey, then a minimum cover by
//! branch and bound (essential primes, row and column dominance, and a lower
//! bound from a maximal independent set of rows).
//!
//! Cost: fewest product terms, then fewest literals.

use crate::{Cover, Cube, TruthTable};

/// Limits of one minimization. Past them the result is not proven minimal
/// (or, for the inputs and primes, not attempted); nothing runs unbounded.
#[derive(Debug, Clone)]
pub struct Budget {
    /// Most inputs handled exactly.
    pub max_vars: usize,
    /// Most prime implicants generated (the generation holds only these and
    /// one implicant table per free input, so memory stays bounded).
    pub max_primes: usize,
    /// Most branch-and-bound nodes explored; past this the best cover found
    /// so far is returned with its lower bound.
    pub max_nodes: u64,
}

impl Default for Budget {
    fn default() -> Budget {
        Budget {
            max_vars: 16,
            max_primes: 200_000,
            max_nodes: 200_000,
        }
    }
}

/// A minimized cover with its certificate.
#[derive(Debug, Clone)]
pub struct Minimized {
    /// The sum of products found.
    pub cover: Cover,
    /// Whether no cover with fewer terms, or as few terms and fewer
    /// literals, exists.
    pub proven_minimal: bool,
    /// Fewest terms any cover needs, as proven (equals `cover.len()` when
    /// `proven_minimal`).
    pub lower_bound: usize,
    /// Number of prime implicants of the function.
    pub primes: usize,
}

/// Why a function was not minimized exactly, with what is known of it.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct TooLarge {
    /// What limit was reached.
    pub reason: String,
    /// Inputs of the function.
    pub vars: usize,
    /// Minterms in the on-set (outside the don't-cares).
    pub on_set: usize,
}

/// An implicant in minterm-index space: `value` with the bits of `free`
/// eliminated (`value & free == 0`).
#[derive(Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord)]
struct Implicant {
    value: u32,
    free: u32,
}

impl Implicant {
    fn to_cube(self, vars: usize) -> Cube {
        let mut c = Cube { zero: 0, one: 0 };
        for i in 0..vars {
            let bit = 1u32 << (vars - 1 - i);
            if self.free & bit != 0 {
                c.zero |= 1 << i;
                c.one |= 1 << i;
            } else if self.value & bit != 0 {
                c.one |= 1 << i;
            } else {
                c.zero |= 1 << i;
            }
        }
        c
    }

    /// Every minterm of the implicant.
    fn minterms(self) -> impl Iterator<Item = usize> {
        let free = self.free;
        let mut sub = 0u32;
        let mut done = false;
        std::iter::from_fn(move || {
            if done {
                return None;
            }
            let m = (self.value | sub) as usize;
            sub = sub.wrapping_sub(free) & free;
            done = sub == 0;
            Some(m)
        })
    }
}

fn check_size(on: &TruthTable, dc: &TruthTable, budget: &Budget) -> Result<(), TooLarge> {
    assert_eq!(
        on.vars(),
        dc.vars(),
        "on-set and don't-care set over different inputs"
    );
    if on.vars() > budget.max_vars {
        return Err(TooLarge {
            reason: format!(
                "{} inputs, more than the {} handled exactly",
                on.vars(),
                budget.max_vars
            ),
            vars: on.vars(),
            on_set: on.and_not(dc).count_ones(),
        });
    }
    Ok(())
}

/// Masks of the bit positions `l` of a 64-bit word whose index bit `b` is 0.
const LOW_HALF: [u64; 6] = [
    0x5555_5555_5555_5555,
    0x3333_3333_3333_3333,
    0x0F0F_0F0F_0F0F_0F0F,
    0x00FF_00FF_00FF_00FF,
    0x0000_FFFF_0000_FFFF,
    0x0000_0000_FFFF_FFFF,
];

/// Each bit of `x` exchanged with the bit whose index differs in bit `b` (< 6).
fn swap_bits(x: u64, b: usize) -> u64 {
    let s = 1u32 << b;
    ((x & LOW_HALF[b]) << s) | ((x >> s) & LOW_HALF[b])
}

fn table_words(t: &TruthTable) -> Vec<u64> {
    let mut words = vec![0u64; (1usize << t.vars()).div_ceil(64)];
    for m in t.minterms() {
        words[m / 64] |= 1 << (m % 64);
    }
    words
}

/// Prime generation over bit-parallel implicant tables, one per set of free
/// minterm bits, visited depth first (each set from the set without its
/// highest bit). The table of a set says, for each cube of that shape,
/// whether it is an implicant: bit `l` of word `c` stands for the cube whose
/// low six minterm bits are `l` (replicated along the free ones) and whose
/// other bound bits are `c`, packed. Freeing a low bit ANDs each word with
/// itself, bits exchanged; freeing a high bit ANDs pairs of words and halves
/// the table. A cube is prime when no neighbour across a bound bit is an
/// implicant. Memory is one table per depth plus the primes; work is at most
/// 64 * 3^(n-6) words per bound bit.
struct PrimeSearch<'a> {
    vars: usize,
    low: usize,
    budget: &'a Budget,
    primes: Vec<Implicant>,
    too_many: bool,
}

impl PrimeSearch<'_> {
    /// `care`: implicant table of `free`; `need`: whether each cube holds a
    /// required minterm; `bound_high`: the minterm bit of each packed bit of
    /// the word index.
    fn visit(&mut self, free: u32, care: &[u64], need: &[u64], bound_high: &[u32], next: usize) {
        self.collect(free, care, need, bound_high);
        if self.too_many {
            return;
        }
        for b in next..self.vars {
            let (c, n, h): (Vec<u64>, Vec<u64>, Vec<u32>) = if b < self.low {
                (
                    care.iter().map(|&w| w & swap_bits(w, b)).collect(),
                    need.iter().map(|&w| w | swap_bits(w, b)).collect(),
                    bound_high.to_vec(),
                )
            } else {
                let Some(p) = bound_high.iter().position(|&h| h as usize == b) else {
                    continue;
                };
                let stride = 1usize << p;
                let pair = |i: usize| ((i >> p) << (p + 1)) | (i & (stride - 1));
                let half = care.len() / 2;
                let mut h = bound_high.to_vec();
                h.remove(p);
                (
                    (0..half)
                        .map(|i| care[pair(i)] & care[pair(i) | stride])
                        .collect(),
                    (0..half)
                        .map(|i| need[pair(i)] | need[pair(i) | stride])
                        .collect(),
                    h,
                )
            };
            if c.iter().all(|&w| w == 0) {
                continue;
            }
            self.visit(free | 1 << b, &c, &n, &h, b + 1);
            if self.too_many {
                return;
            }
        }
    }

    fn collect(&mut self, free: u32, care: &[u64], need: &[u64], bound_high: &[u32]) {
        let low_free = free & ((1u32 << self.low) - 1);
        let mut representative = u64::MAX;
        let mut bound_low = Vec::new();
        for b in 0..self.low {
            if low_free >> b & 1 == 1 {
                representative &= LOW_HALF[b];
            } else {
                bound_low.push(b);
            }
        }
        for (c, (&w, &r)) in care.iter().zip(need).enumerate() {
            if w == 0 {
                continue;
            }
            let mut larger = 0u64;
            for &b in &bound_low {
                larger |= swap_bits(w, b);
            }
            for p in 0..bound_high.len() {
                larger |= care[c ^ (1 << p)];
            }
            let mut prime = w & !larger & r & representative;
            if prime == 0 {
                continue;
            }
            let mut high = 0u32;
            for (p, &h) in bound_high.iter().enumerate() {
                if c >> p & 1 == 1 {
                    high |= 1 << h;
                }
            }
            while prime != 0 {
                let l = prime.trailing_zeros();
                prime &= prime - 1;
                if self.primes.len() == self.budget.max_primes {
                    self.too_many = true;
                    return;
                }
                self.primes.push(Implicant {
                    value: high | l,
                    free,
                });
            }
        }
    }
}

fn primes_of(
    on: &TruthTable,
    dc: &TruthTable,
    budget: &Budget,
) -> Result<Vec<Implicant>, TooLarge> {
    check_size(on, dc, budget)?;
    let vars = on.vars();
    let low = vars.min(6);
    let mut search = PrimeSearch {
        vars,
        low,
        budget,
        primes: Vec::new(),
        too_many: false,
    };
    let care = table_words(&on.or(dc));
    let need = table_words(&on.and_not(dc));
    let bound_high: Vec<u32> = (low as u32..vars as u32).collect();
    if care.iter().any(|&w| w != 0) {
        search.visit(0, &care, &need, &bound_high, 0);
    }
    if search.too_many {
        return Err(TooLarge {
            reason: format!("more than {} prime implicants", budget.max_primes),
            vars,
            on_set: on.and_not(dc).count_ones(),
        });
    }
    let mut primes = search.primes;
    primes.sort();
    Ok(primes)
}

/// All prime implicants of the function that is 1 on `on`, free on `dc`,
/// that cover at least one minterm of `on` outside `dc`.
pub fn prime_implicants(
    on: &TruthTable,
    dc: &TruthTable,
    budget: &Budget,
) -> Result<Cover, TooLarge> {
    let vars = on.vars();
    let primes = primes_of(on, dc, budget)?;
    Ok(Cover {
        vars,
        cubes: primes.into_iter().map(|p| p.to_cube(vars)).collect(),
    })
}

/// The minimal sum of products of the function that is 1 on `on`, 0 outside
/// `on | dc`, and free on `dc`.
pub fn minimize_sop(
    on: &TruthTable,
    dc: &TruthTable,
    budget: &Budget,
) -> Result<Minimized, TooLarge> {
    let vars = on.vars();
    let primes = primes_of(on, dc, budget)?;
    let required = on.and_not(dc).minterms();
    let mut row_of = std::collections::HashMap::with_capacity(required.len());
    for (r, &m) in required.iter().enumerate() {
        row_of.insert(m, r as u32);
    }
    let col_rows: Vec<Vec<u32>> = primes
        .iter()
        .map(|p| {
            p.minterms()
                .filter_map(|m| row_of.get(&m).copied())
                .collect()
        })
        .collect();
    let col_cost: Vec<u64> = primes
        .iter()
        .map(|p| (1u64 << 32) + (vars - p.free.count_ones() as usize) as u64)
        .collect();
    let solution = CoverProblem::new(required.len(), col_rows, col_cost).solve(budget.max_nodes);
    let mut cubes: Vec<Cube> = solution
        .columns
        .iter()
        .map(|&c| primes[c].to_cube(vars))
        .collect();
    cubes.sort();
    Ok(Minimized {
        proven_minimal: solution.proven,
        lower_bound: if solution.proven {
            cubes.len()
        } else {
            solution.lower_bound_terms
        },
        cover: Cover { vars, cubes },
        primes: primes.len(),
    })
}

/// The minimal product of sums, as the minimal sum of products of the
/// complement: each cube `c` of the returned cover stands for the sum term
/// of `c`'s literals negated, and the function is the product of those sums.
pub fn minimize_pos(
    on: &TruthTable,
    dc: &TruthTable,
    budget: &Budget,
) -> Result<Minimized, TooLarge> {
    let off = !&on.or(dc);
    minimize_sop(&off, dc, budget)
}

/// Unate covering: choose columns so that every row is covered, at least cost.
struct CoverProblem {
    row_cols: Vec<Vec<u32>>,
    col_rows: Vec<Vec<u32>>,
    col_cost: Vec<u64>,
}

struct Solution {
    columns: Vec<usize>,
    proven: bool,
    lower_bound_terms: usize,
}

#[derive(Clone)]
struct State {
    row_alive: Vec<bool>,
    col_alive: Vec<bool>,
    chosen: Vec<usize>,
    cost: u64,
}

struct Search<'a> {
    p: &'a CoverProblem,
    best: Option<(u64, Vec<usize>)>,
    nodes: u64,
    max_nodes: u64,
    exhausted: bool,
}

impl CoverProblem {
    fn new(rows: usize, col_rows: Vec<Vec<u32>>, col_cost: Vec<u64>) -> CoverProblem {
        let mut row_cols = vec![Vec::new(); rows];
        for (c, rs) in col_rows.iter().enumerate() {
            for &r in rs {
                row_cols[r as usize].push(c as u32);
            }
        }
        CoverProblem {
            row_cols,
            col_rows,
            col_cost,
        }
    }

    fn solve(&self, max_nodes: u64) -> Solution {
        let mut state = State {
            row_alive: vec![true; self.row_cols.len()],
            col_alive: vec![true; self.col_rows.len()],
            chosen: Vec::new(),
            cost: 0,
        };
        let mut search = Search {
            p: self,
            best: None,
            nodes: 0,
            max_nodes,
            exhausted: false,
        };
        // The root's bound, in terms: the essentials plus an independent set of rows.
        let root_bound = if search.reduce(&mut state) {
            state.chosen.len() + search.independent_rows(&state).len()
        } else {
            0
        };
        search.best = Some(search.greedy(state.clone()));
        search.branch(state);
        let (_, columns) = search.best.take().unwrap_or_default();
        Solution {
            proven: !search.exhausted,
            lower_bound_terms: root_bound.min(columns.len()),
            columns,
        }
    }
}

impl Search<'_> {
    fn select(&self, s: &mut State, c: usize) {
        s.chosen.push(c);
        s.cost += self.p.col_cost[c];
        s.col_alive[c] = false;
        for &r in &self.p.col_rows[c] {
            s.row_alive[r as usize] = false;
        }
    }

    fn alive_cols_of<'s>(&'s self, s: &'s State, r: usize) -> impl Iterator<Item = usize> + 's {
        self.p.row_cols[r]
            .iter()
            .map(|&c| c as usize)
            .filter(move |&c| s.col_alive[c])
    }

    /// Essential columns and dominance until nothing changes. False when a
    /// row can no longer be covered.
    fn reduce(&self, s: &mut State) -> bool {
        loop {
            let mut changed = false;
            for r in 0..s.row_alive.len() {
                if !s.row_alive[r] {
                    continue;
                }
                let mut cols = self.p.row_cols[r]
                    .iter()
                    .map(|&c| c as usize)
                    .filter(|&c| s.col_alive[c]);
                match (cols.next(), cols.next()) {
                    (None, _) => return false,
                    (Some(c), None) => {
                        self.select(s, c);
                        changed = true;
                    }
                    _ => {}
                }
            }
            // Live rows of each column and live columns of each row, sorted.
            let col_live = live_lists(&self.p.col_rows, &s.col_alive, &s.row_alive);
            // Column dominance: a column whose live rows another column of no
            // greater cost also covers is never needed. Such a column covers
            // the first of those rows, so only its columns are candidates.
            for a in 0..s.col_alive.len() {
                if !s.col_alive[a] {
                    continue;
                }
                let rows_a = &col_live[a];
                let Some(&first) = rows_a.first() else {
                    s.col_alive[a] = false;
                    changed = true;
                    continue;
                };
                let dominated = self.p.row_cols[first as usize]
                    .iter()
                    .map(|&b| b as usize)
                    .any(|b| {
                        if b == a || !s.col_alive[b] {
                            return false;
                        }
                        let rows_b = &col_live[b];
                        let (ca, cb) = (self.p.col_cost[a], self.p.col_cost[b]);
                        let better =
                            cb < ca || (cb == ca && (rows_b.len() > rows_a.len() || b < a));
                        better && rows_b.len() >= rows_a.len() && subset(rows_a, rows_b)
                    });
                if dominated {
                    s.col_alive[a] = false;
                    changed = true;
                }
            }
            // Row dominance: a row whose live columns include all of another
            // row's is covered whenever that row is. Such a row is covered by
            // the other row's first column, so only that column's rows are
            // candidates.
            let row_live = live_lists(&self.p.row_cols, &s.row_alive, &s.col_alive);
            for q in 0..s.row_alive.len() {
                if !s.row_alive[q] {
                    continue;
                }
                let cols_q = &row_live[q];
                let Some(&first) = cols_q.first() else {
                    continue;
                };
                for &r in &self.p.col_rows[first as usize] {
                    let r = r as usize;
                    if r == q || !s.row_alive[r] {
                        continue;
                    }
                    let cols_r = &row_live[r];
                    if cols_r.len() >= cols_q.len()
                        && (cols_r.len() > cols_q.len() || q < r)
                        && subset(cols_q, cols_r)
                    {
                        s.row_alive[r] = false;
                        changed = true;
                    }
                }
            }
            if !changed {
                return true;
            }
        }
    }

    /// Rows no two of which share a live column: each needs its own term.
    fn independent_rows(&self, s: &State) -> Vec<usize> {
        let mut rows: Vec<usize> = (0..s.row_alive.len()).filter(|&r| s.row_alive[r]).collect();
        rows.sort_by_key(|&r| self.alive_cols_of(s, r).count());
        let mut used = vec![false; s.col_alive.len()];
        let mut picked = Vec::new();
        for r in rows {
            let cols: Vec<usize> = self.alive_cols_of(s, r).collect();
            if cols.iter().all(|&c| !used[c]) {
                for c in cols {
                    used[c] = true;
                }
                picked.push(r);
            }
        }
        picked
    }

    fn lower_bound(&self, s: &State) -> u64 {
        self.independent_rows(s)
            .into_iter()
            .map(|r| {
                self.alive_cols_of(s, r)
                    .map(|c| self.p.col_cost[c])
                    .min()
                    .unwrap_or(0)
            })
            .sum()
    }

    /// A cover by repeatedly taking the column that covers the most live rows per cost.
    fn greedy(&self, mut s: State) -> (u64, Vec<usize>) {
        while let Some(r) = (0..s.row_alive.len()).find(|&r| s.row_alive[r]) {
            let best = self
                .alive_cols_of(&s, r)
                .max_by(|&a, &b| {
                    let gain = |c: usize| {
                        let n = self.p.col_rows[c]
                            .iter()
                            .filter(|&&r| s.row_alive[r as usize])
                            .count();
                        (n as f64) / (self.p.col_cost[c] as f64)
                    };
                    gain(a).total_cmp(&gain(b)).then(b.cmp(&a))
                })
                .expect("a live row has a live column");
            self.select(&mut s, best);
        }
        (s.cost, s.chosen)
    }

    fn branch(&mut self, mut s: State) {
        self.nodes += 1;
        if self.nodes > self.max_nodes {
            self.exhausted = true;
            return;
        }
        if !self.reduce(&mut s) {
            return;
        }
        let best_cost = self.best.as_ref().map_or(u64::MAX, |b| b.0);
        if s.cost + self.lower_bound(&s) >= best_cost {
            return;
        }
        let Some(r) = (0..s.row_alive.len())
            .filter(|&r| s.row_alive[r])
            .min_by_key(|&r| self.alive_cols_of(&s, r).count())
        else {
            self.best = Some((s.cost, s.chosen));
            return;
        };
        let mut cols: Vec<usize> = self.alive_cols_of(&s, r).collect();
        // Columns covering the most live rows first: good covers early make the bound bite.
        let live = |c: usize| {
            self.p.col_rows[c]
                .iter()
                .filter(|&&r| s.row_alive[r as usize])
                .count()
        };
        cols.sort_by_key(|&c| (std::cmp::Reverse(live(c)), self.p.col_cost[c]));
        for (k, &c) in cols.iter().enumerate() {
            let mut next = s.clone();
            // Columns tried before this one are excluded: their branches are done.
            for &earlier in &cols[..k] {
                next.col_alive[earlier] = false;
            }
            self.select(&mut next, c);
            self.branch(next);
            if self.exhausted {
                return;
            }
        }
    }
}

/// For each live owner (row or column), its live entries; empty for the dead.
fn live_lists(lists: &[Vec<u32>], owner_alive: &[bool], entry_alive: &[bool]) -> Vec<Vec<u32>> {
    lists
        .iter()
        .zip(owner_alive)
        .map(|(list, &alive)| {
            if !alive {
                return Vec::new();
            }
            list.iter()
                .copied()
                .filter(|&e| entry_alive[e as usize])
                .collect()
        })
        .collect()
}

/// Whether sorted `a` is a subset of sorted `b`.
fn subset(a: &[u32], b: &[u32]) -> bool {
    let mut j = 0;
    for &x in a {
        while j < b.len() && b[j] < x {
            j += 1;
        }
        if j == b.len() || b[j] != x {
            return false;
        }
        j += 1;
    }
    true
}
