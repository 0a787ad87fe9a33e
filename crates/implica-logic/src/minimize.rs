//! Exact two-level minimization with don't-cares: all prime implicants by a
//! bit-parallel form of the tabular method (one implicant table per set of
//! free inputs, visited depth first, so only the primes are held), then a
//! minimum cover by branch and bound: essential columns, row and column
//! dominance, independent connected components searched apart, and a lower
//! bound by Lagrangian relaxation (started from an independent set of rows,
//! read against the true costs, as a whole number of terms, and, once the
//! number of terms is known, with the terms held to it, which bounds the
//! literals). Its reduced costs drop columns, pick the column to branch on
//! (with it, then without it) and steer the greedy covers that give the
//! upper bounds.
//!
//! Cost: fewest product terms, then fewest literals.

use crate::truth_table::{LOW_HALF, swap_bits};
use crate::{Cover, Cube, Interrupted, TruthTable};

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
    /// Most work in the cover search (its bounds, the refinement of the
    /// best cover, branch and bound), counted in covering-matrix entries
    /// visited (a measure of time that does not depend on the machine:
    /// about 10^7 entries take 0.03 to 0.05 s on the machine of
    /// docs/benchmarks.md). Past this, as past `max_nodes`: more
    /// subgradient steps and branching stop, and each independent part of
    /// the matrix still gets a cover and a bound, on up to four times this
    /// work. The dominance reductions and the exchanges that improve a
    /// cover have a meter of their own, also four times this work, past
    /// which they stop (their results so far are kept).
    pub max_work: u64,
    /// Most entries of the covering matrix (the required minterms each
    /// prime holds, summed over the primes). The cover search holds about
    /// three copies of the matrix at 4 bytes an entry, so this bounds its
    /// memory (the default, 2^23, to about 100 MB and well under a second
    /// of work); a larger matrix is refused as too large.
    pub max_entries: u64,
}

impl Default for Budget {
    fn default() -> Budget {
        Budget {
            max_vars: 16,
            max_primes: 200_000,
            max_nodes: 200_000,
            max_work: 30_000_000,
            max_entries: 1 << 23,
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
    /// Minterms in the on-set (outside the don't-cares). For a product of
    /// sums, which is minimized as the sum of products of the complement,
    /// this and the fields below are of the complement: the off-set.
    pub on_set: usize,
    /// The inputs every sum of products of the function reads: those where
    /// two specified rows differing in that input alone have different
    /// values (ascending).
    pub support: Vec<usize>,
    /// Fewest terms any sum of products needs, as known without the search:
    /// the required minterms with no neighbour (one input flipped) in the
    /// on-set or the don't-cares, each of which is a term of its own in
    /// every cover. 24-input parity has 2^23 of them, its minimum.
    pub lower_bound: usize,
}

impl TooLarge {
    /// The outcome for the function 1 on `on`, free on `dc`, with what is
    /// known of it (nothing but the reason when the two tables' inputs
    /// differ).
    pub(crate) fn of(reason: String, on: &TruthTable, dc: &TruthTable) -> TooLarge {
        if on.vars() != dc.vars() {
            return TooLarge {
                reason,
                vars: on.vars(),
                on_set: on.count_ones(),
                support: Vec::new(),
                lower_bound: 0,
            };
        }
        let specified = !dc;
        TooLarge {
            reason,
            vars: on.vars(),
            on_set: on.and_not(dc).count_ones(),
            support: (0..on.vars())
                .filter(|&i| on.depends_on_within(i, &specified))
                .collect(),
            lower_bound: isolated(on, dc).count_ones(),
        }
    }
}

/// The required minterms of `on` (outside `dc`) with no neighbour in
/// `on | dc`: each is a prime implicant, and essential.
pub(crate) fn isolated(on: &TruthTable, dc: &TruthTable) -> TruthTable {
    let care = on.or(dc);
    (0..on.vars()).fold(on.and_not(dc), |alone, i| alone.and_not(&care.flip(i)))
}

/// An implicant in minterm-index space: `value` with the bits of `free`
/// eliminated (`value & free == 0`).
#[derive(Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub(crate) struct Implicant {
    pub(crate) value: u32,
    pub(crate) free: u32,
}

impl Implicant {
    pub(crate) fn to_cube(self, vars: usize) -> Cube {
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
    pub(crate) fn minterms(self) -> impl Iterator<Item = usize> {
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
    if on.vars() != dc.vars() {
        return Err(TooLarge::of(
            format!(
                "on-set over {} inputs, don't-cares over {}",
                on.vars(),
                dc.vars()
            ),
            on,
            dc,
        ));
    }
    if on.vars() > budget.max_vars {
        return Err(TooLarge::of(
            format!(
                "{} inputs, more than the {} handled exactly",
                on.vars(),
                budget.max_vars
            ),
            on,
            dc,
        ));
    }
    Ok(())
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
    /// Set when the search must end: too many primes, or the caller
    /// stopped it (`cancelled`).
    too_many: bool,
    stop: Stop<'a>,
    visits: u32,
    /// Table words the search has read, for callers that bound the work
    /// of many searches together.
    words: u64,
    cancelled: bool,
    /// The child tables of each depth.
    scratch: Vec<Scratch>,
}

/// One depth's tables of [`PrimeSearch::visit`].
#[derive(Default)]
struct Scratch {
    care: Vec<u64>,
    need: Vec<u64>,
    high: Vec<u32>,
}

impl PrimeSearch<'_> {
    /// `care`: implicant table of `free`; `need`: whether each cube holds a
    /// required minterm; `bound_high`: the minterm bit of each packed bit of
    /// the word index. The child tables are built in `scratch[depth]`,
    /// reused from one sibling to the next, so the search allocates only
    /// when a depth is first reached.
    fn visit(&mut self, free: u32, tables: (&[u64], &[u64], &[u32]), next: usize, depth: usize) {
        let (care, need, bound_high) = tables;
        self.visits = self.visits.wrapping_add(1);
        self.words += care.len() as u64;
        if self.visits.is_multiple_of(PRIME_POLL) && (self.stop)() {
            self.cancelled = true;
            self.too_many = true;
            return;
        }
        self.collect(free, care, need, bound_high);
        if self.too_many {
            return;
        }
        if self.scratch.len() <= depth {
            self.scratch.push(Scratch::default());
        }
        let mut buf = std::mem::take(&mut self.scratch[depth]);
        for b in next..self.vars {
            buf.care.clear();
            buf.need.clear();
            buf.high.clear();
            // The implicant table first: most shapes have no implicant, and
            // then the rest is not built.
            if b < self.low {
                buf.care.extend(care.iter().map(|&w| w & swap_bits(w, b)));
                if buf.care.iter().all(|&w| w == 0) {
                    continue;
                }
                buf.need.extend(need.iter().map(|&w| w | swap_bits(w, b)));
                buf.high.extend_from_slice(bound_high);
            } else {
                let Some(p) = bound_high.iter().position(|&h| h as usize == b) else {
                    continue;
                };
                let stride = 1usize << p;
                let pair = |i: usize| ((i >> p) << (p + 1)) | (i & (stride - 1));
                let half = care.len() / 2;
                buf.care
                    .extend((0..half).map(|i| care[pair(i)] & care[pair(i) | stride]));
                if buf.care.iter().all(|&w| w == 0) {
                    continue;
                }
                buf.need
                    .extend((0..half).map(|i| need[pair(i)] | need[pair(i) | stride]));
                buf.high.extend_from_slice(bound_high);
                buf.high.remove(p);
            }
            self.visit(
                free | 1 << b,
                (&buf.care, &buf.need, &buf.high),
                b + 1,
                depth + 1,
            );
            if self.too_many {
                break;
            }
        }
        self.scratch[depth] = buf;
    }

    fn collect(&mut self, free: u32, care: &[u64], need: &[u64], bound_high: &[u32]) {
        let low_free = free & ((1u32 << self.low) - 1);
        let mut representative = u64::MAX;
        let mut bound_low = [0usize; 6];
        let mut bound_count = 0;
        for (b, &half) in LOW_HALF.iter().enumerate().take(self.low) {
            if low_free >> b & 1 == 1 {
                representative &= half;
            } else {
                bound_low[bound_count] = b;
                bound_count += 1;
            }
        }
        let bound_low = &bound_low[..bound_count];
        for (c, (&w, &r)) in care.iter().zip(need).enumerate() {
            if w == 0 {
                continue;
            }
            let mut larger = 0u64;
            for &b in bound_low {
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

/// Implicant tables visited between two polls of the caller's stop check.
const PRIME_POLL: u32 = 1024;

/// The caller's check for stopping a minimization early: polled between
/// the steps of the prime generation and of the cover search.
pub(crate) type Stop<'a> = &'a dyn Fn() -> bool;

/// Why a minimization gave no result.
pub(crate) enum Stopped {
    TooLarge(TooLarge),
    Cancelled,
}

impl From<TooLarge> for Stopped {
    fn from(t: TooLarge) -> Stopped {
        Stopped::TooLarge(t)
    }
}

impl Stopped {
    /// For the callers that cannot stop: their check never says so.
    pub(crate) fn too_large(self) -> TooLarge {
        match self {
            Stopped::TooLarge(t) => t,
            // Unreachable: these callers' check never stops.
            Stopped::Cancelled => TooLarge {
                reason: "cancelled".to_string(),
                vars: 0,
                on_set: 0,
                support: Vec::new(),
                lower_bound: 0,
            },
        }
    }

    /// For the cancellable callers.
    pub(crate) fn split<T>(r: Result<T, Stopped>) -> Result<Result<T, TooLarge>, Interrupted> {
        match r {
            Ok(v) => Ok(Ok(v)),
            Err(Stopped::TooLarge(t)) => Ok(Err(t)),
            Err(Stopped::Cancelled) => Err(Interrupted::Cancelled),
        }
    }
}

/// A check that never stops.
pub(crate) fn never() -> bool {
    false
}

pub(crate) fn primes_of(
    on: &TruthTable,
    dc: &TruthTable,
    budget: &Budget,
    stop: Stop,
) -> Result<Vec<Implicant>, Stopped> {
    primes_and_work(on, dc, budget, stop).map(|(primes, _)| primes)
}

/// [`primes_of`], with the number of table words the search read.
pub(crate) fn primes_and_work(
    on: &TruthTable,
    dc: &TruthTable,
    budget: &Budget,
    stop: Stop,
) -> Result<(Vec<Implicant>, u64), Stopped> {
    check_size(on, dc, budget)?;
    let vars = on.vars();
    let low = vars.min(6);
    let mut search = PrimeSearch {
        vars,
        low,
        budget,
        primes: Vec::new(),
        too_many: false,
        stop,
        visits: 0,
        words: 0,
        cancelled: false,
        scratch: Vec::new(),
    };
    let (care, need) = (on.or(dc), on.and_not(dc));
    let (care, need) = (care.words(), need.words());
    let bound_high: Vec<u32> = (low as u32..vars as u32).collect();
    if care.iter().any(|&w| w != 0) {
        search.visit(0, (care, need, &bound_high), 0, 0);
    }
    if search.cancelled {
        return Err(Stopped::Cancelled);
    }
    if search.too_many {
        return Err(Stopped::TooLarge(TooLarge::of(
            format!("more than {} prime implicants", budget.max_primes),
            on,
            dc,
        )));
    }
    let mut primes = search.primes;
    primes.sort();
    Ok((primes, search.words))
}

/// Refuses a covering matrix of more than [`Budget::max_entries`] entries,
/// counted before it is built from the required minterms of its columns,
/// and primes whose minterms, don't-cares included, are too many to visit
/// (four times as many), since building the matrix visits them all.
fn check_matrix(
    primes: &[Implicant],
    on: &TruthTable,
    dc: &TruthTable,
    budget: &Budget,
) -> Result<(), TooLarge> {
    let visits: u64 = primes.iter().map(|p| 1u64 << p.free.count_ones()).sum();
    if visits > budget.max_entries.saturating_mul(4) {
        return Err(TooLarge::of(
            format!(
                "{} prime implicants holding more than {} minterms in all",
                primes.len(),
                budget.max_entries.saturating_mul(4)
            ),
            on,
            dc,
        ));
    }
    if visits <= budget.max_entries {
        // The entries are at most the minterms visited.
        return Ok(());
    }
    let required = on.and_not(dc);
    let mut entries = 0u64;
    for p in primes {
        entries += p.minterms().filter(|&m| required.get(m)).count() as u64;
        if entries > budget.max_entries {
            return Err(TooLarge::of(
                format!(
                    "a covering matrix of more than {} entries ({} prime implicants)",
                    budget.max_entries,
                    primes.len()
                ),
                on,
                dc,
            ));
        }
    }
    Ok(())
}

/// A covering matrix's rows from its entries, which `each` hands to its
/// argument as (row, column) in ascending column order; it is called twice,
/// to count and to fill, so that no list per row is held.
pub(crate) fn pack_rows(rows: usize, each: impl Fn(&mut dyn FnMut(u32, u32))) -> Rows {
    let mut start = vec![0u32; rows + 1];
    each(&mut |r, _| start[r as usize + 1] += 1);
    for r in 0..rows {
        start[r + 1] += start[r];
    }
    let mut fill = start.clone();
    let mut entries = vec![0u32; start[rows] as usize];
    each(&mut |r, c| {
        entries[fill[r as usize] as usize] = c;
        fill[r as usize] += 1;
    });
    Rows { start, entries }
}

/// All prime implicants of the function that is 1 on `on`, free on `dc`,
/// that cover at least one minterm of `on` outside `dc`.
///
/// ```
/// use implica_logic::{Budget, TruthTable, prime_implicants};
/// // The worked example of the Wikipedia article "Quine–McCluskey
/// // algorithm": Σm(4, 8, 10, 11, 12, 15) + d(9, 14) has 4 primes.
/// let on = TruthTable::from_minterms(4, &[4, 8, 10, 11, 12, 15]);
/// let dc = TruthTable::from_minterms(4, &[9, 14]);
/// assert_eq!(prime_implicants(&on, &dc, &Budget::default()).unwrap().len(), 4);
/// ```
pub fn prime_implicants(
    on: &TruthTable,
    dc: &TruthTable,
    budget: &Budget,
) -> Result<Cover, TooLarge> {
    let vars = on.vars();
    let primes = primes_of(on, dc, budget, &never).map_err(Stopped::too_large)?;
    Ok(Cover {
        vars,
        cubes: primes.into_iter().map(|p| p.to_cube(vars)).collect(),
    })
}

/// The minimal sum of products of the function that is 1 on `on`, 0 outside
/// `on | dc`, and free on `dc`.
///
/// The certificate says whether the cover is proven minimal, and otherwise
/// how many terms any cover needs:
///
/// ```
/// use implica_logic::{Budget, TruthTable, minimize_sop};
/// // 1 when two to six of eight inputs are 1: 420 primes, none essential.
/// let ones: Vec<usize> = (0..256usize).filter(|m| (2..=6).contains(&m.count_ones())).collect();
/// let f = TruthTable::from_minterms(8, &ones);
/// let none = TruthTable::zero(8);
/// // Without search work: a greedy cover, and a bound it does not meet.
/// let quick = minimize_sop(&f, &none, &Budget { max_work: 0, ..Budget::default() }).unwrap();
/// assert_eq!((quick.cover.len(), quick.proven_minimal, quick.lower_bound), (29, false, 28));
/// // "29 terms found, at least 28 needed"; the default budget settles it.
/// let exact = minimize_sop(&f, &none, &Budget::default()).unwrap();
/// assert_eq!((exact.cover.len(), exact.proven_minimal, exact.lower_bound), (28, true, 28));
/// assert_eq!((exact.primes, exact.cover.truth_table()), (420, f));
/// ```
pub fn minimize_sop(
    on: &TruthTable,
    dc: &TruthTable,
    budget: &Budget,
) -> Result<Minimized, TooLarge> {
    sop(on, dc, budget, &never).map_err(Stopped::too_large)
}

/// [`minimize_sop`], stopped early when `cancel` returns true, so that an
/// editor can drop a minimization of a document that has changed. The check
/// is polled between implicant tables of the prime generation, subgradient
/// steps and nodes of the cover search, and every 1,024 rows or columns of
/// a matrix reduction (the longest gap between two polls: about 1 ms on a
/// random 12-input function, 35 ms on a 16-input one, on the machine of
/// docs/benchmarks.md). A cancelled minimization gives
/// `Err(Interrupted::Cancelled)`; otherwise the result is exactly
/// [`minimize_sop`]'s.
///
/// ```
/// use implica_logic::{Budget, Interrupted, TruthTable, minimize_sop_cancellable};
/// let parity = TruthTable::var(3, 0).xor(&TruthTable::var(3, 1)).xor(&TruthTable::var(3, 2));
/// let none = TruthTable::zero(3);
/// let go = || false;
/// let m = minimize_sop_cancellable(&parity, &none, &Budget::default(), &go).unwrap().unwrap();
/// assert_eq!(m.cover.len(), 4);
/// let stop = || true;
/// let r = minimize_sop_cancellable(&parity, &none, &Budget::default(), &stop);
/// assert_eq!(r.err(), Some(Interrupted::Cancelled));
/// ```
pub fn minimize_sop_cancellable(
    on: &TruthTable,
    dc: &TruthTable,
    budget: &Budget,
    cancel: &dyn Fn() -> bool,
) -> Result<Result<Minimized, TooLarge>, Interrupted> {
    Stopped::split(sop(on, dc, budget, cancel))
}

/// [`minimize_pos`], stopped early when `cancel` returns true, as
/// [`minimize_sop_cancellable`] is.
pub fn minimize_pos_cancellable(
    on: &TruthTable,
    dc: &TruthTable,
    budget: &Budget,
    cancel: &dyn Fn() -> bool,
) -> Result<Result<Minimized, TooLarge>, Interrupted> {
    Stopped::split(pos(on, dc, budget, cancel))
}

pub(crate) fn sop(
    on: &TruthTable,
    dc: &TruthTable,
    budget: &Budget,
    stop: Stop,
) -> Result<Minimized, Stopped> {
    // A stop that holds from the start stops here, whatever the size.
    if stop() {
        return Err(Stopped::Cancelled);
    }
    let vars = on.vars();
    let primes = primes_of(on, dc, budget, stop)?;
    check_matrix(&primes, on, dc, budget)?;
    let required = on.and_not(dc).minterms();
    let mut row_of = vec![u32::MAX; 1usize << vars];
    for (r, &m) in required.iter().enumerate() {
        row_of[m] = r as u32;
    }
    let rows = pack_rows(required.len(), |entry| {
        for (c, p) in primes.iter().enumerate() {
            for m in p.minterms() {
                if row_of[m] != u32::MAX {
                    entry(row_of[m], c as u32);
                }
            }
        }
    });
    let literals: Vec<u64> = primes
        .iter()
        .map(|p| (vars - p.free.count_ones() as usize) as u64)
        .collect();
    let solution = solve_cover(rows, &literals, vars, budget, stop)?;
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
///
/// ```
/// use implica_logic::{BoolExpr, Budget, TruthTable, minimize_pos};
/// // The carry of a full adder over (a, b, c) is (a | b) & (a | c) & (b | c)
/// // (common practice).
/// let carry = TruthTable::from_minterms(3, &[3, 5, 6, 7]);
/// let mut m = minimize_pos(&carry, &TruthTable::zero(3), &Budget::default()).unwrap();
/// m.cover.sort_for_reading();
/// let text = BoolExpr::from_complement_cover(&m.cover).to_text(&|i| ["a", "b", "c"][i].into());
/// assert_eq!(text, "(a | b) & (a | c) & (b | c)");
/// ```
pub fn minimize_pos(
    on: &TruthTable,
    dc: &TruthTable,
    budget: &Budget,
) -> Result<Minimized, TooLarge> {
    pos(on, dc, budget, &never).map_err(Stopped::too_large)
}

fn pos(
    on: &TruthTable,
    dc: &TruthTable,
    budget: &Budget,
    stop: Stop,
) -> Result<Minimized, Stopped> {
    check_size(on, dc, budget)?;
    let off = !&on.or(dc);
    sop(&off, dc, budget, stop)
}

/// The columns of the cover found, whether it is proven of least cost, and
/// the fewest columns any cover needs, as proven.
pub(crate) struct Solution {
    pub(crate) columns: Vec<usize>,
    pub(crate) proven: bool,
    pub(crate) lower_bound_terms: usize,
}

/// Unate covering: choose columns so that every row is covered, at least
/// cost. Rows list their columns; a column of `literals[c]` literals costs
/// `term + literals[c]`, where `term` exceeds the literals of any cover, so
/// that fewer terms always win.
pub(crate) fn solve_cover(
    rows: Rows,
    literals: &[u64],
    vars: usize,
    budget: &Budget,
    stop: Stop,
) -> Result<Solution, Stopped> {
    // A search never picks more columns than there are rows.
    let term = (rows.len() as u64) * (vars as u64) + 1;
    let matrix = Matrix {
        mult: vec![[0; 2]; rows.len()],
        rows,
        cost: literals.iter().map(|&l| term + l).collect(),
        id: (0..literals.len() as u32).collect(),
    };
    let mut solver = Solver {
        term,
        depth: 0,
        cut: false,
        nodes: 0,
        max_nodes: budget.max_nodes,
        work: Work::new(budget.max_work),
        exhausted: false,
        stop,
        cancelled: false,
    };
    let part = solver.solve(matrix, ROOT);
    if solver.cancelled {
        return Err(Stopped::Cancelled);
    }
    let mut columns: Vec<usize> = part.columns.iter().map(|&c| c as usize).collect();
    columns.sort_unstable();
    Ok(Solution {
        proven: part.proven,
        lower_bound_terms: ((part.lower_bound / term) as usize).min(columns.len()),
        columns,
    })
}

/// Lagrange multipliers are fixed point, in units of 1/`SCALE` of a cost,
/// so that every bound is computed exactly.
const SCALE: i64 = 256;

/// Lists of column indices, one per row, stored end to end: row `r` is
/// `entries[start[r]..start[r + 1]]`.
#[derive(Clone)]
pub(crate) struct Rows {
    start: Vec<u32>,
    entries: Vec<u32>,
}

impl Default for Rows {
    fn default() -> Rows {
        Rows {
            start: vec![0],
            entries: Vec::new(),
        }
    }
}

impl Rows {
    fn len(&self) -> usize {
        self.start.len() - 1
    }

    fn is_empty(&self) -> bool {
        self.len() == 0
    }

    fn push(&mut self, row: impl Iterator<Item = u32>) {
        self.entries.extend(row);
        self.start.push(self.entries.len() as u32);
    }

    fn iter(&self) -> impl Iterator<Item = &[u32]> {
        (0..self.len()).map(|r| &self[r])
    }
}

impl std::ops::Index<usize> for Rows {
    type Output = [u32];

    fn index(&self, r: usize) -> &[u32] {
        &self.entries[self.start[r] as usize..self.start[r + 1] as usize]
    }
}

/// A covering matrix: each row's columns (ascending local indices), each
/// column's cost and its index in the whole problem, and two Lagrange
/// multipliers per row carried from the parent problem as warm starts (on
/// the scale of terms, and on the scale of literals once the number of
/// terms is known; see [`lagrange`]).
#[derive(Clone)]
struct Matrix {
    rows: Rows,
    cost: Vec<u64>,
    id: Vec<u32>,
    mult: Vec<[i64; 2]>,
}

impl Matrix {
    fn col_rows(&self) -> Rows {
        let mut start = vec![0u32; self.cost.len() + 1];
        for &c in &self.rows.entries {
            start[c as usize + 1] += 1;
        }
        for c in 0..self.cost.len() {
            start[c + 1] += start[c];
        }
        let mut fill = start.clone();
        let mut entries = vec![0u32; self.rows.entries.len()];
        for (r, row) in self.rows.iter().enumerate() {
            for &c in row {
                entries[fill[c as usize] as usize] = r as u32;
                fill[c as usize] += 1;
            }
        }
        Rows { start, entries }
    }

    /// The submatrix of the live rows and columns, renumbered in order.
    fn restrict(&self, row_live: &[bool], col_live: &[bool]) -> Matrix {
        let mut index = vec![u32::MAX; self.cost.len()];
        let mut cost = Vec::new();
        let mut id = Vec::new();
        for c in 0..self.cost.len() {
            if col_live[c] {
                index[c] = cost.len() as u32;
                cost.push(self.cost[c]);
                id.push(self.id[c]);
            }
        }
        let mut rows = Rows::default();
        let mut mult = Vec::new();
        for (r, row) in self.rows.iter().enumerate() {
            if row_live[r] {
                rows.push(
                    row.iter()
                        .filter(|&&c| col_live[c as usize])
                        .map(|&c| index[c as usize]),
                );
                mult.push(self.mult[r]);
            }
        }
        Matrix {
            rows,
            cost,
            id,
            mult,
        }
    }

    /// The matrix after choosing column `c` and dropping the columns in `drop`.
    fn choose(&self, col_rows: &Rows, c: usize, drop: &[bool]) -> Matrix {
        let mut row_live = vec![true; self.rows.len()];
        for &r in &col_rows[c] {
            row_live[r as usize] = false;
        }
        let mut col_live: Vec<bool> = drop.iter().map(|d| !d).collect();
        col_live[c] = false;
        self.restrict(&row_live, &col_live)
    }

    /// The connected components (rows linked by shared columns), each as
    /// its own matrix; a cover of the whole is a cover of each. Empty when
    /// the matrix is connected.
    fn components(&self) -> Vec<Matrix> {
        let cols = self.cost.len();
        let mut parent: Vec<u32> = (0..cols as u32).collect();
        fn find(parent: &mut [u32], mut x: u32) -> u32 {
            while parent[x as usize] != x {
                parent[x as usize] = parent[parent[x as usize] as usize];
                x = parent[x as usize];
            }
            x
        }
        for row in self.rows.iter() {
            let a = find(&mut parent, row[0]);
            for &c in &row[1..] {
                let b = find(&mut parent, c);
                if a != b {
                    parent[b as usize] = a;
                }
            }
        }
        let roots: Vec<u32> = (0..cols as u32).map(|c| find(&mut parent, c)).collect();
        let mut group_of = vec![usize::MAX; cols];
        let mut groups = 0;
        for row in self.rows.iter() {
            let root = roots[row[0] as usize] as usize;
            if group_of[root] == usize::MAX {
                group_of[root] = groups;
                groups += 1;
            }
        }
        if groups <= 1 {
            return Vec::new();
        }
        (0..groups)
            .map(|g| {
                let row_live: Vec<bool> = self
                    .rows
                    .iter()
                    .map(|row| group_of[roots[row[0] as usize] as usize] == g)
                    .collect();
                let col_live: Vec<bool> = roots
                    .iter()
                    .map(|&root| group_of[root as usize] == g)
                    .collect();
                self.restrict(&row_live, &col_live)
            })
            .collect()
    }
}

/// Whether the live entries of ascending `a` are all in ascending `b`.
fn subset_live(a: &[u32], b: &[u32], live: impl Fn(u32) -> bool) -> bool {
    let mut j = 0;
    for &x in a.iter().filter(|&&x| live(x)) {
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

/// Essential columns, row dominance and column dominance until nothing
/// changes; chosen columns are added to `chosen` and `cost`. `None` when a
/// row can no longer be covered.
///
/// When `stop` says so, or the work is over budget, the reductions made so
/// far come back (each of them sound on its own), so that a cancelled or
/// costly search ends soon: on a matrix of tens of millions of entries the
/// dominance checks alone would take tens of seconds.
fn reduce(
    mut m: Matrix,
    chosen: &mut Vec<u32>,
    cost: &mut u64,
    work: &mut Work,
    stop: Stop,
) -> Option<Matrix> {
    loop {
        let (rows, cols) = (m.rows.len(), m.cost.len());
        let mut row_live = vec![true; rows];
        let mut col_live = vec![true; cols];
        let mut picked = vec![false; cols];
        let mut changed = false;
        // The scan, and the restriction when it picks columns.
        work.add_pass(2 * m.rows.entries.len() as u64);
        for row in m.rows.iter() {
            match row {
                [] => return None,
                &[c] if !picked[c as usize] => {
                    picked[c as usize] = true;
                    col_live[c as usize] = false;
                    chosen.push(m.id[c as usize]);
                    *cost += m.cost[c as usize];
                    changed = true;
                }
                _ => {}
            }
        }
        if changed {
            for (r, row) in m.rows.iter().enumerate() {
                row_live[r] = !row.iter().any(|&c| picked[c as usize]);
            }
            // Dropping the rows of the picked columns, and those columns,
            // leaves no row empty: the result may be handed back.
            m = m.restrict(&row_live, &col_live);
            if work.passes_over() {
                return Some(m);
            }
            continue;
        }
        // No row is empty here, so the matrix may be handed back.
        if work.passes_over() || stop() {
            return Some(m);
        }
        let col_rows = m.col_rows();
        work.add_pass(m.rows.entries.len() as u64);
        // Row dominance: a row whose columns include all of another row's is
        // covered whenever that row is. Such a row holds the other row's
        // first column, so only that column's rows are candidates.
        for q in 0..rows {
            if work.passes_over() || (q % REDUCE_POLL == REDUCE_POLL - 1 && stop()) {
                return Some(m.restrict(&row_live, &col_live));
            }
            if !row_live[q] {
                continue;
            }
            let len_q = m.rows[q].len();
            let candidates = &col_rows[m.rows[q][0] as usize];
            work.add_pass(candidates.len() as u64);
            for &r in candidates {
                let r = r as usize;
                if r == q || !row_live[r] {
                    continue;
                }
                let len_r = m.rows[r].len();
                if len_r >= len_q && (len_r > len_q || q < r) {
                    work.add_pass((len_q + len_r) as u64);
                    if subset_live(&m.rows[q], &m.rows[r], |_| true) {
                        row_live[r] = false;
                        changed = true;
                    }
                }
            }
        }
        // Column dominance: a column whose live rows another column of no
        // greater cost also covers is never needed. Such a column covers the
        // first of those rows, so only its columns are candidates.
        let live_count: Vec<usize> = col_rows
            .iter()
            .map(|rs| rs.iter().filter(|&&r| row_live[r as usize]).count())
            .collect();
        work.add_pass(m.rows.entries.len() as u64);
        for a in 0..cols {
            if work.passes_over() || (a % REDUCE_POLL == REDUCE_POLL - 1 && stop()) {
                return Some(m.restrict(&row_live, &col_live));
            }
            let Some(&first) = col_rows[a].iter().find(|&&r| row_live[r as usize]) else {
                col_live[a] = false;
                changed = true;
                continue;
            };
            let candidates = &m.rows[first as usize];
            work.add_pass(candidates.len() as u64);
            let dominated = candidates.iter().any(|&b| {
                let b = b as usize;
                if b == a || !col_live[b] {
                    return false;
                }
                let (ca, cb) = (m.cost[a], m.cost[b]);
                let (na, nb) = (live_count[a], live_count[b]);
                let better = cb < ca || (cb == ca && (nb > na || b < a));
                if !(better && nb >= na) {
                    return false;
                }
                work.add_pass((col_rows[a].len() + col_rows[b].len()) as u64);
                subset_live(&col_rows[a], &col_rows[b], |r| row_live[r as usize])
            });
            if dominated {
                col_live[a] = false;
                changed = true;
            }
        }
        if !changed {
            return Some(m);
        }
        work.add_pass(m.rows.entries.len() as u64);
        m = m.restrict(&row_live, &col_live);
    }
}

/// Rows or columns between two polls of the stop check in [`reduce`] and
/// [`swap_down`].
const REDUCE_POLL: usize = 1024;

/// The reductions and exchanges may do this many times the search's work
/// budget, on a meter of their own.
pub(crate) const PASSES_SHARE: u64 = 4;

/// The floor of subgradient steps that gives every component a bound runs
/// on to this many times the work budget, and no further.
const HARD_SHARE: u64 = 4;

/// Work of the cover search against [`Budget::max_work`], in covering-matrix
/// entries visited. Past the budget, more subgradient steps and branching
/// are skipped; the few that give every component a bound and a cover run
/// on to [`HARD_SHARE`] times the budget. The reductions and exchanges,
/// which the search needs at full strength on usual matrices (counted with
/// the rest, they halved the quality of the bounds on random 16-input
/// functions) but which cost more than everything else on a matrix of
/// millions of entries, have a meter of their own. So the search as a whole
/// never runs past a few times its budget, whatever the matrix.
struct Work {
    spent: u64,
    limit: u64,
    /// The reductions' and exchanges' own work, against their own limit.
    passes: u64,
    passes_limit: u64,
}

impl Work {
    fn new(limit: u64) -> Work {
        Work {
            spent: 0,
            limit,
            passes: 0,
            passes_limit: limit.saturating_mul(PASSES_SHARE),
        }
    }

    fn add(&mut self, entries: u64) {
        self.spent = self.spent.saturating_add(entries);
    }

    fn over(&self) -> bool {
        self.spent > self.limit
    }

    fn add_pass(&mut self, entries: u64) {
        self.passes = self.passes.saturating_add(entries);
    }

    fn passes_over(&self) -> bool {
        self.passes > self.passes_limit
    }

    /// What is left of the budget.
    fn left(&self) -> u64 {
        self.limit.saturating_sub(self.spent)
    }

    /// What is left before the hard limit, [`HARD_SHARE`] times the budget.
    fn hard_left(&self) -> u64 {
        self.limit
            .saturating_mul(HARD_SHARE)
            .saturating_sub(self.spent)
    }
}

/// A cover of part of the problem: its columns, cost, a lower bound on the
/// cost of any cover, and whether the cover is proven of least cost.
struct Part {
    columns: Vec<u32>,
    cost: u64,
    lower_bound: u64,
    proven: bool,
}

struct Solver<'a> {
    /// The cost of a term, beside its literals.
    term: u64,
    /// Columns chosen by branching on the way to the current node.
    depth: usize,
    /// Whether a subtree of the current component was left unsearched.
    cut: bool,
    nodes: u64,
    max_nodes: u64,
    work: Work,
    exhausted: bool,
    stop: Stop<'a>,
    /// Whether `stop` said so: everything left is skipped, and the result
    /// thrown away.
    cancelled: bool,
}

/// How long the subgradient search runs: at most `steps` steps, the step
/// halved after every `patience` steps without gain.
#[derive(Clone, Copy)]
struct Effort {
    steps: usize,
    patience: usize,
}

/// At the root of a component the bound is worth time: it decides the
/// certificate, and its reduced costs steer every greedy cover.
const ROOT: Effort = Effort {
    steps: 400,
    patience: 20,
};
/// At a node, warm-started from the parent's multipliers.
///
/// More steps per node than a warm start seems to need pay for themselves:
/// each node's bound is tighter, so far fewer nodes are searched. On random
/// 10-input functions (two sets of 30), 120 steps with a patience of 20
/// prove the minimum in a third to a half of the time that 40 steps with a
/// patience of 5 take (docs/benchmarks.md).
const NODE: Effort = Effort {
    steps: 120,
    patience: 20,
};
/// From this many rows a component's bound climbs on after the refinement
/// (the random 12-input functions' cores have about 1,400 rows, the
/// 10-input ones' about 300).
const CLIMB_ROWS: usize = 500;
/// The refinement of a component's best cover: from this many rows, with
/// these shares (in percent) of the rows kept covered by the fixed columns,
/// one round each, and this effort for the rest's bound.
const REFINE_ROWS: usize = 64;
const REFINE_SHARES: [usize; 6] = [30, 40, 50, 60, 70, 80];
const REFINE: Effort = Effort {
    steps: 150,
    patience: 10,
};
/// Most columns chosen by branching along one path, which bounds the
/// recursion; deeper subtrees are left unsearched (and nothing is proven).
const MAX_DEPTH: usize = 1000;
/// Subgradient steps between two covers built from the reduced costs.
const PRIMAL_EVERY: usize = 10;
/// Passes over the matrix per subgradient step when covers are built from
/// the reduced costs: the reduced costs, the subgradient, and a tenth of
/// a greedy cover (about ten passes: its heap and its redundancy check).
const PRIMAL_PASSES: u64 = 3;
/// Fewest subgradient steps at the root of a component and in a
/// refinement, whatever the work left.
const MIN_STEPS: usize = 50;

impl Solver<'_> {
    /// Polls the caller's stop check; once it says stop, the search is
    /// over (as when out of budget) and the result will be dropped.
    fn stopped(&mut self) -> bool {
        if !self.cancelled && (self.stop)() {
            self.cancelled = true;
            self.exhausted = true;
        }
        self.cancelled
    }

    /// The least-cost cover of `m` (a feasible matrix), each connected
    /// component searched on its own.
    fn solve(&mut self, m: Matrix, effort: Effort) -> Part {
        let mut chosen = Vec::new();
        let mut cost = 0;
        let Some(m) = reduce(m, &mut chosen, &mut cost, &mut self.work, self.stop) else {
            // Unreachable for feasible matrices; claim nothing.
            return Part {
                columns: chosen,
                cost: u64::MAX,
                lower_bound: 0,
                proven: false,
            };
        };
        let mut part = Part {
            columns: chosen,
            cost,
            lower_bound: cost,
            proven: true,
        };
        if m.rows.is_empty() {
            return part;
        }
        let mut components = m.components();
        if components.is_empty() {
            components.push(m);
        }
        for mut component in components {
            if self.stopped() {
                // The result is dropped; claim nothing.
                part.proven = false;
                break;
            }
            let col_rows = component.col_rows();
            // The root's bound takes at most half the work left, so that the
            // refinement and the search get the other half.
            let effort = self.affordable(effort, component.rows.entries.len(), 2);
            let (mut best, bound) = self.cover_and_bound(&mut component, &col_rows, effort);
            if bound.cost < best.0 && self.depth == 0 && component.rows.len() >= REFINE_ROWS {
                self.refine(&component, &col_rows, &bound.reduced, &mut best);
            }
            let mut bound = bound.cost;
            if bound < best.0 && self.depth == 0 && component.rows.len() >= CLIMB_ROWS {
                // Too large for the search to settle within a usual budget:
                // the bound gets more steps, from where the root's climb
                // stopped (at most a root's worth; the search gets the rest).
                let effort = self.affordable(ROOT, component.rows.entries.len(), 1);
                let more = lagrange(
                    &mut component,
                    &col_rows,
                    self.term,
                    best.0,
                    effort,
                    self.stop,
                    &mut |_, _| best.0,
                );
                self.work.add(
                    component.rows.entries.len() as u64 * (PRIMAL_PASSES * more.steps as u64 + 8),
                );
                bound = bound.max(more.cost);
            }
            let outer_cut = std::mem::take(&mut self.cut);
            if bound < best.0 {
                self.branch(component, 0, &mut Vec::new(), &mut best);
            }
            let proven = bound >= best.0 || !(self.exhausted || self.cut);
            self.cut |= outer_cut;
            part.cost = part.cost.saturating_add(best.0);
            part.columns.extend(best.1);
            part.lower_bound += if proven { best.0 } else { bound.min(best.0) };
            part.proven &= proven;
        }
        part
    }

    /// A cover of `m` and a bound on its cost: greedy covers steered by the
    /// reduced costs as the bound rises, the best then improved by
    /// exchanges unless the bound proves it.
    fn cover_and_bound(
        &mut self,
        m: &mut Matrix,
        col_rows: &Rows,
        effort: Effort,
    ) -> ((u64, Vec<u32>), Bound) {
        let mut best = greedy(m, col_rows, None);
        let bound = lagrange(
            m,
            col_rows,
            self.term,
            best.0,
            effort,
            self.stop,
            &mut |m: &Matrix, reduced: &[i64]| {
                let cover = greedy(m, col_rows, Some(reduced));
                if cover.0 < best.0 {
                    best = cover;
                }
                best.0
            },
        );
        self.work
            .add(m.rows.entries.len() as u64 * (PRIMAL_PASSES * bound.steps as u64 + 8));
        if bound.cost < best.0 {
            let better = swap_down(m, col_rows, &best.1, &mut self.work, self.stop);
            if better.0 < best.0 {
                best = better;
            }
        }
        (best, bound)
    }

    /// `effort` with no more steps than the work left, divided by `share`,
    /// affords (at `PRIMAL_PASSES` passes over `entries` each), but at least
    /// `MIN_STEPS` while the hard limit affords them, so that every
    /// component gets a bound and a cover without the search running past
    /// the hard limit.
    fn affordable(&self, effort: Effort, entries: usize, share: u64) -> Effort {
        let per_step = PRIMAL_PASSES * entries.max(1) as u64;
        let steps = (self.work.left() / share / per_step) as usize;
        let floor = ((self.work.hard_left() / per_step) as usize)
            .min(MIN_STEPS)
            .min(effort.steps);
        Effort {
            steps: steps.clamp(floor, effort.steps),
            ..effort
        }
    }

    /// Fix and solve again from the best cover (after the refinement of
    /// Caprara, Fischetti and Toth's set-covering heuristic, 1999): keep the
    /// columns of the best cover of least reduced cost until they cover a
    /// share of the rows, cover the rest by the relaxation's greedy covers
    /// and exchanges, and keep the whole when it is cheaper. The share grows
    /// each round, so later rounds search closer to the best cover.
    fn refine(&mut self, m: &Matrix, col_rows: &Rows, reduced: &[i64], best: &mut (u64, Vec<u32>)) {
        let rows = m.rows.len();
        for share in REFINE_SHARES {
            if self.work.over() || self.stopped() {
                break;
            }
            let mut columns: Vec<usize> = best
                .1
                .iter()
                .filter_map(|id| m.id.binary_search(id).ok())
                .collect();
            columns.sort_by_key(|&c| reduced[c]);
            let mut covered = vec![false; rows];
            let mut count = 0;
            let mut chosen = Vec::new();
            let mut cost = 0;
            let mut col_live = vec![true; m.cost.len()];
            for c in columns {
                if count * 100 >= rows * share {
                    break;
                }
                col_live[c] = false;
                chosen.push(m.id[c]);
                cost += m.cost[c];
                for &r in &col_rows[c] {
                    if !covered[r as usize] {
                        covered[r as usize] = true;
                        count += 1;
                    }
                }
            }
            let row_live: Vec<bool> = covered.iter().map(|&c| !c).collect();
            let Some(mut rest) = reduce(
                m.restrict(&row_live, &col_live),
                &mut chosen,
                &mut cost,
                &mut self.work,
                self.stop,
            ) else {
                continue;
            };
            if !rest.rows.is_empty() {
                let rest_rows = rest.col_rows();
                let effort = self.affordable(REFINE, rest.rows.entries.len(), 1);
                let (found, _) = self.cover_and_bound(&mut rest, &rest_rows, effort);
                cost += found.0;
                chosen.extend(found.1);
            }
            if cost < best.0 {
                chosen.sort_unstable();
                let cover = without_redundant(m, col_rows, &chosen);
                let better = swap_down(m, col_rows, &cover.1, &mut self.work, self.stop);
                *best = if better.0 < cover.0 { better } else { cover };
            }
        }
    }

    /// Branch and bound below a node whose chosen columns (`path`) cost
    /// `cost`; `best` is the least-cost cover found so far.
    /// The branch without a column is searched in the same frame (the loop),
    /// so the recursion is only as deep as the columns chosen, each covering
    /// a row more.
    fn branch(
        &mut self,
        mut m: Matrix,
        mut cost: u64,
        path: &mut Vec<u32>,
        best: &mut (u64, Vec<u32>),
    ) {
        let depth = path.len();
        loop {
            self.nodes += 1;
            // Reduction visits the matrix about this often (the bound's
            // steps are counted as they are taken; the reduction's own
            // passes, on their own meter, bound its worst case).
            self.work.add(m.rows.entries.len() as u64 * 8);
            if self.nodes > self.max_nodes || self.work.over() || self.stopped() {
                self.exhausted = true;
                break;
            }
            let Some(reduced) = reduce(m, path, &mut cost, &mut self.work, self.stop) else {
                break;
            };
            match self.branch_reduced(reduced, cost, path, best) {
                Some(next) => m = next,
                None => break,
            }
        }
        path.truncate(depth);
    }

    /// Searches below a reduced node; returns the node without its branching
    /// column when that is still to be searched.
    fn branch_reduced(
        &mut self,
        mut m: Matrix,
        cost: u64,
        path: &mut Vec<u32>,
        best: &mut (u64, Vec<u32>),
    ) -> Option<Matrix> {
        if cost >= best.0 {
            return None;
        }
        if m.rows.is_empty() {
            *best = (cost, path.clone());
            return None;
        }
        let components = m.components();
        if !components.is_empty() {
            // Components are independent: bound each, then solve each.
            let mut bound = cost;
            let mut parts = Vec::with_capacity(components.len());
            for mut c in components {
                let col_rows = c.col_rows();
                let b = lagrange(
                    &mut c,
                    &col_rows,
                    self.term,
                    u64::MAX,
                    NODE,
                    self.stop,
                    &mut |_, _| u64::MAX,
                );
                self.work
                    .add(c.rows.entries.len() as u64 * 2 * b.steps as u64);
                bound = bound.saturating_add(b.cost);
                parts.push(c);
            }
            if bound >= best.0 {
                return None;
            }
            let mut total = cost;
            let mut columns = path.clone();
            for c in parts {
                let part = self.solve(c, NODE);
                total = total.saturating_add(part.cost);
                columns.extend(part.columns);
            }
            if total < best.0 {
                *best = (total, columns);
            }
            return None;
        }
        let col_rows = m.col_rows();
        let room = best.0 - cost;
        let bound = lagrange(
            &mut m,
            &col_rows,
            self.term,
            room,
            NODE,
            self.stop,
            &mut |_, _| room,
        );
        self.work
            .add(m.rows.entries.len() as u64 * 2 * bound.steps as u64);
        if bound.cost >= room {
            return None;
        }
        // A cover completed greedily from here, by the reduced costs.
        let (extra, columns) = greedy(&m, &col_rows, Some(&bound.reduced));
        if cost.saturating_add(extra) < best.0 {
            let mut cover = path.clone();
            cover.extend(columns);
            *best = (cost + extra, cover);
        }
        let room = best.0 - cost;
        if bound.cost >= room {
            return None;
        }
        // A column whose reduced cost lifts the bound to the best cover's
        // cost is in no better cover.
        let drop: Vec<bool> = (0..m.cost.len())
            .map(|c| bound.excludes(c, m.cost[c].saturating_sub(self.term), self.term, room))
            .collect();
        // Branch on the column the multipliers favour most: first with it,
        // then without it.
        let c = (0..m.cost.len())
            .filter(|&c| !drop[c])
            .min_by_key(|&c| (bound.reduced[c], m.cost[c]))?;
        if self.depth >= MAX_DEPTH {
            // The greedy completion above stands for this subtree.
            self.cut = true;
            return None;
        }
        let child = m.choose(&col_rows, c, &drop);
        path.push(m.id[c]);
        self.depth += 1;
        self.branch(child, cost + m.cost[c], path, best);
        self.depth -= 1;
        path.pop();
        if self.exhausted {
            return None;
        }
        let mut live: Vec<bool> = drop.iter().map(|d| !d).collect();
        live[c] = false;
        Some(m.restrict(&vec![true; m.rows.len()], &live))
    }
}

/// A cover by repeatedly taking the column covering the most uncovered
/// rows per cost, then dropping columns the others make redundant.
fn greedy(m: &Matrix, col_rows: &Rows, reduced: Option<&[i64]>) -> (u64, Vec<u32>) {
    // The price of a column: its cost, or its reduced cost (at least a
    // small share of its cost, so that every price is positive).
    let price: Vec<f64> = match reduced {
        None => m.cost.iter().map(|&c| c as f64).collect(),
        Some(rc) => rc
            .iter()
            .zip(&m.cost)
            .map(|(&r, &c)| (r as f64 / SCALE as f64).max(c as f64 * 1e-3))
            .collect(),
    };
    let mut covered = vec![false; m.rows.len()];
    let mut gain: Vec<usize> = col_rows.iter().map(<[u32]>::len).collect();
    let mut times = vec![0u32; m.rows.len()];
    let mut picked = Vec::new();
    let mut left = m.rows.len();
    // Gains only fall, so a column whose recomputed ratio still tops the
    // heap is the best (lazy evaluation). Positive floats order as their bits.
    let key = |c: usize, gain: usize| (gain as f64 / price[c]).to_bits();
    let mut heap: std::collections::BinaryHeap<(u64, std::cmp::Reverse<usize>)> = (0..gain.len())
        .filter(|&c| gain[c] > 0)
        .map(|c| (key(c, gain[c]), std::cmp::Reverse(c)))
        .collect();
    while left > 0 {
        let Some((k, std::cmp::Reverse(c))) = heap.pop() else {
            break;
        };
        if gain[c] == 0 {
            continue;
        }
        let now = key(c, gain[c]);
        if now != k {
            heap.push((now, std::cmp::Reverse(c)));
            continue;
        }
        picked.push(c);
        for &r in &col_rows[c] {
            times[r as usize] += 1;
            if !covered[r as usize] {
                covered[r as usize] = true;
                left -= 1;
                for &d in &m.rows[r as usize] {
                    gain[d as usize] -= 1;
                }
            }
        }
    }
    let keep = drop_redundant(m, col_rows, picked, &mut times);
    let cost = keep.iter().map(|&c| m.cost[c]).sum();
    (cost, keep.into_iter().map(|c| m.id[c]).collect())
}

/// The columns (local indices) without those whose rows the others also
/// cover, most expensive dropped first, in that order; `times` counts how
/// often the columns cover each row.
fn drop_redundant(
    m: &Matrix,
    col_rows: &Rows,
    mut columns: Vec<usize>,
    times: &mut [u32],
) -> Vec<usize> {
    columns.sort_by_key(|&c| std::cmp::Reverse(m.cost[c]));
    columns.retain(|&c| {
        if col_rows[c].iter().all(|&r| times[r as usize] > 1) {
            for &r in &col_rows[c] {
                times[r as usize] -= 1;
            }
            false
        } else {
            true
        }
    });
    columns
}

/// A cover (of column ids) without the columns whose rows the others also
/// cover, dearest dropped first.
fn without_redundant(m: &Matrix, col_rows: &Rows, cover: &[u32]) -> (u64, Vec<u32>) {
    let columns: Vec<usize> = cover
        .iter()
        .filter_map(|id| m.id.binary_search(id).ok())
        .collect();
    let mut times = vec![0u32; m.rows.len()];
    for &c in &columns {
        for &r in &col_rows[c] {
            times[r as usize] += 1;
        }
    }
    let mut columns = drop_redundant(m, col_rows, columns, &mut times);
    columns.sort_unstable();
    let cost = columns.iter().map(|&c| m.cost[c]).sum();
    (cost, columns.into_iter().map(|c| m.id[c]).collect())
}

/// Local improvement of a cover (of column ids): a column outside it that holds every row that only chosen
/// columns `S` cover alone replaces them all when that saves a term (two or
/// more) or a literal (one, dearer), provided the other rows of `S` stay
/// covered.
fn swap_down(
    m: &Matrix,
    col_rows: &Rows,
    cover: &[u32],
    work: &mut Work,
    stop: Stop,
) -> (u64, Vec<u32>) {
    let cols = m.cost.len();
    let mut chosen = vec![false; cols];
    let mut times = vec![0u32; m.rows.len()];
    // Columns are numbered in the order of their ids.
    for c in cover.iter().filter_map(|id| m.id.binary_search(id).ok()) {
        chosen[c] = true;
        for &r in &col_rows[c] {
            times[r as usize] += 1;
        }
    }
    let mut stamp = vec![usize::MAX; cols];
    let mut hits = vec![0u32; cols];
    let mut in_d = vec![usize::MAX; m.rows.len()];
    'passes: for _ in 0..4 {
        let mut changed = false;
        for d in 0..cols {
            // Stopped or out of budget: the cover so far is a cover.
            if work.passes_over() || (d % REDUCE_POLL == REDUCE_POLL - 1 && stop()) {
                break 'passes;
            }
            if chosen[d] {
                continue;
            }
            let mut candidates = Vec::new();
            work.add_pass(col_rows[d].len() as u64);
            for &r in &col_rows[d] {
                in_d[r as usize] = d;
                if times[r as usize] != 1 {
                    continue;
                }
                work.add_pass(m.rows[r as usize].len() as u64);
                for &c in &m.rows[r as usize] {
                    let c = c as usize;
                    if chosen[c] {
                        if stamp[c] != d {
                            stamp[c] = d;
                            hits[c] = 0;
                            candidates.push(c);
                        }
                        hits[c] += 1;
                    }
                }
            }
            let replaced: Vec<usize> = candidates
                .into_iter()
                .filter(|&c| {
                    work.add_pass(col_rows[c].len() as u64);
                    let alone = col_rows[c]
                        .iter()
                        .filter(|&&r| times[r as usize] == 1)
                        .count();
                    alone as u32 == hits[c]
                })
                .collect();
            let saves = match replaced.as_slice() {
                [] => false,
                [c] => m.cost[d] < m.cost[*c],
                _ => true,
            };
            if !saves {
                continue;
            }
            // Rows of the replaced columns outside `d` must keep a cover.
            let mut rows_out = Vec::new();
            for &c in &replaced {
                for &r in &col_rows[c] {
                    if in_d[r as usize] != d {
                        rows_out.push(r as usize);
                    }
                }
            }
            rows_out.sort_unstable();
            let mut ok = true;
            let mut i = 0;
            while i < rows_out.len() {
                let j = rows_out[i..]
                    .iter()
                    .take_while(|&&r| r == rows_out[i])
                    .count();
                if times[rows_out[i]] as usize <= j {
                    ok = false;
                    break;
                }
                i += j;
            }
            if !ok {
                continue;
            }
            for &c in &replaced {
                chosen[c] = false;
                for &r in &col_rows[c] {
                    times[r as usize] -= 1;
                }
            }
            chosen[d] = true;
            for &r in &col_rows[d] {
                times[r as usize] += 1;
            }
            changed = true;
        }
        if !changed {
            break;
        }
    }
    let keep: Vec<usize> = (0..cols).filter(|&c| chosen[c]).collect();
    let cost = keep.iter().map(|&c| m.cost[c]).sum();
    (cost, keep.into_iter().map(|c| m.id[c]).collect())
}

/// A lower bound on the cost of a cover, with what it was computed from.
struct Bound {
    /// Whole units of cost: no cover costs less, or every cover costs at
    /// least the limit the bound was computed against.
    cost: u64,
    /// The Lagrangian value with the true costs, in 1/SCALE units.
    weighted: i64,
    /// The Lagrangian value with every column costing one term, in
    /// 1/SCALE units of a term's cost.
    unit: i64,
    /// The Lagrangian value with the true costs and the number of columns
    /// held to what a cover under the limit can have, in 1/SCALE units.
    counted: i64,
    /// What `counted` loses when one column outside `chosen` is forced in
    /// (the dearest chosen column leaves, or nothing when the count has
    /// room both ways).
    displaced: i64,
    /// The columns of the counted relaxation's solution.
    chosen: Vec<bool>,
    /// Each column's reduced cost (true costs), in 1/SCALE units.
    reduced: Vec<i64>,
    /// Subgradient steps taken.
    steps: usize,
}

impl Bound {
    /// Whether every cover holding column `c`, whose literals cost `literals`,
    /// costs at least `room` more (`room` at most the limit of the bound).
    fn excludes(&self, c: usize, literals: u64, term: u64, room: u64) -> bool {
        let rc = self.reduced[c];
        let whole = |value: i64| (value.max(0) as u64).div_ceil(SCALE as u64);
        if rc > 0 && whole(self.weighted).saturating_add((rc / SCALE) as u64) >= room {
            return true;
        }
        if !self.chosen[c] && whole(self.counted + rc - self.displaced) >= room {
            return true;
        }
        let unit_rc = rc - SCALE * literals as i64;
        unit_rc > 0
            && ((self.unit + unit_rc).max(0) as u64)
                .div_ceil(SCALE as u64 * term)
                .saturating_mul(term)
                >= room
    }
}

/// The Lagrangian relaxation of one covering matrix, evaluated at given
/// multipliers.
struct Relaxation<'a> {
    col_rows: &'a Rows,
    /// Each column's cost, in 1/SCALE units.
    scaled: Vec<i64>,
    /// Each column's literals alone, in 1/SCALE units.
    literal_part: Vec<i64>,
    term: u64,
}

/// One evaluation of a [`Relaxation`].
#[derive(Clone, Copy)]
struct Value {
    /// The bound in whole units of cost (see [`Bound::cost`]).
    cost: u64,
    weighted: i64,
    unit: i64,
    counted: i64,
    displaced: i64,
    /// Fewest columns any cover has, as the unit reading proves.
    fewest: u64,
    /// Whether a cover under the limit has exactly `fewest` columns.
    exact: bool,
}

impl Relaxation<'_> {
    /// The bound at multipliers `u`, for covers of fewer than `limit` cost
    /// and at least `fewest` columns (known from earlier multipliers).
    /// Fills the buffers: the reduced costs, the counted relaxation's
    /// columns, the plain reading's subgradient.
    fn evaluate(&self, u: &[i64], limit: u64, fewest: u64, buf: &mut Buffers) -> Value {
        let col_rows = self.col_rows;
        let Buffers {
            reduced,
            chosen,
            order,
            plain,
        } = buf;
        reduced.clear();
        // The plain reading's subgradient comes with the reduced costs, in
        // the same pass: 1 minus how often each row is covered by the
        // columns of negative reduced cost.
        plain.clear();
        plain.resize(u.len(), 1);
        for (w, &c) in col_rows.start.windows(2).zip(&self.scaled) {
            let rows = &col_rows.entries[w[0] as usize..w[1] as usize];
            let rc = c - rows.iter().map(|&r| u[r as usize]).sum::<i64>();
            if rc < 0 {
                for &r in rows {
                    plain[r as usize] -= 1;
                }
            }
            reduced.push(rc);
        }
        let total: i64 = u.iter().sum();
        let weighted = total + reduced.iter().filter(|&&rc| rc < 0).sum::<i64>();
        let unit = total
            + reduced
                .iter()
                .zip(&self.literal_part)
                .map(|(&rc, &l)| (rc - l).min(0))
                .sum::<i64>();
        let unit_scale = SCALE as u64 * self.term;
        let fewest = fewest.max((unit.max(0) as u64).div_ceil(unit_scale));
        // Every column costs at least a term, so a cover under the limit
        // has at most this many; with `fewest`, a cover's value in the
        // relaxation is at least the sum of the cheapest `fewest` reduced
        // costs and of further negative ones up to `most`.
        let cols = reduced.len() as u64;
        let most = if limit == u64::MAX {
            cols
        } else {
            (limit.saturating_sub(1) / self.term).min(cols)
        };
        chosen.clear();
        chosen.resize(reduced.len(), false);
        if fewest > most {
            // No cover has few enough columns to cost less than the limit.
            return Value {
                cost: limit,
                weighted,
                unit,
                counted: i64::MAX / 4,
                displaced: 0,
                fewest,
                exact: false,
            };
        }
        let negative = reduced.iter().filter(|&&rc| rc < 0).count() as u64;
        let take = negative.clamp(fewest, most) as usize;
        let (counted, displaced) = if take == 0 {
            (total, 0)
        } else {
            // The `take`-th least reduced cost: the greatest negative one
            // when all negative ones are taken (most often), else by
            // selection.
            let threshold = if take as u64 == negative {
                reduced
                    .iter()
                    .copied()
                    .filter(|&rc| rc < 0)
                    .max()
                    .unwrap_or(0)
            } else {
                order.clear();
                order.extend_from_slice(reduced);
                *order.select_nth_unstable(take - 1).1
            };
            let mut ties = take - reduced.iter().filter(|&&rc| rc < threshold).count();
            let mut sum = 0i64;
            for (c, &rc) in reduced.iter().enumerate() {
                if rc < threshold || (rc == threshold && ties > 0) {
                    ties -= usize::from(rc == threshold);
                    chosen[c] = true;
                    sum += rc;
                }
            }
            // With one column forced in, the others number one fewer
            // at most and may number one fewer at least.
            let others = negative.clamp(fewest.saturating_sub(1), most.saturating_sub(1));
            (
                total + sum,
                if others < take as u64 { threshold } else { 0 },
            )
        };
        let whole = |value: i64| (value.max(0) as u64).div_ceil(SCALE as u64);
        Value {
            cost: whole(weighted)
                .max(whole(counted))
                .max(fewest.saturating_mul(self.term)),
            weighted,
            unit,
            counted,
            displaced,
            fewest,
            exact: fewest == most,
        }
    }
}

/// A lower bound on the cost of any cover of `m`, by Lagrangian relaxation
/// of the covering constraints: for multipliers `u >= 0` on the rows, every
/// cover costs at least `sum(u) + sum over its columns of (cost - u of
/// their rows)`. That is read three ways: over all columns of negative
/// reduced cost; against a cost of one term per column, which bounds the
/// number of terms, an integer (rounded up, times the cost of a term, that
/// often bounds the cost better); and over the cheapest reduced costs for a
/// number of columns between those fewest terms and the most a cover under
/// `limit` can have, which bounds the literals once the terms are known.
/// Subgradient steps (of the counted reading) move `u` (kept in `m.mult`)
/// towards the best bound, stopping early once it reaches `limit` or after
/// the step has been halved ten times (after every `effort.patience` steps without
/// gain); every few steps `primal`
/// gets the reduced costs and returns the cost of the best cover known,
/// which lowers the limit. The first guess is an independent set of rows
/// (no two share a column), each row's multiplier its cheapest column.
fn lagrange(
    m: &mut Matrix,
    col_rows: &Rows,
    term: u64,
    limit: u64,
    effort: Effort,
    stop: Stop,
    primal: &mut dyn FnMut(&Matrix, &[i64]) -> u64,
) -> Bound {
    let (rows, cols) = (m.rows.len(), m.cost.len());
    let relaxation = Relaxation {
        col_rows,
        scaled: m.cost.iter().map(|&c| c as i64 * SCALE).collect(),
        literal_part: m
            .cost
            .iter()
            .map(|&c| c.saturating_sub(term) as i64 * SCALE)
            .collect(),
        term,
    };
    // An independent set of rows, each at its cheapest column's price.
    let mut independent = vec![false; rows];
    {
        let mut order: Vec<usize> = (0..rows).collect();
        order.sort_by_key(|&r| m.rows[r].len());
        let mut used = vec![false; cols];
        for r in order {
            if m.rows[r].iter().all(|&c| !used[c as usize]) {
                for &c in &m.rows[r] {
                    used[c as usize] = true;
                }
                independent[r] = true;
            }
        }
    }
    let start = |price: &[i64]| -> Vec<i64> {
        (0..rows)
            .map(|r| {
                let cheapest = m.rows[r].iter().map(|&c| price[c as usize]).min();
                if independent[r] {
                    cheapest.unwrap_or(0)
                } else {
                    0
                }
            })
            .collect()
    };
    let mut scratch = Buffers {
        reduced: Vec::with_capacity(cols),
        chosen: Vec::with_capacity(cols),
        order: Vec::with_capacity(cols),
        plain: Vec::with_capacity(rows),
    };
    let warm = |k: usize| -> Option<Vec<i64>> {
        let u: Vec<i64> = m.mult.iter().map(|w| w[k]).collect();
        u.iter().any(|&x| x != 0).then_some(u)
    };
    let mut climb = Climb {
        relaxation: &relaxation,
        limit,
        fewest: 0,
        steps: 0,
        stop,
    };
    let plain = climb.run(
        &*m,
        [Some(start(&relaxation.scaled)), warm(0)],
        false,
        effort,
        primal,
        &mut scratch,
    );
    // Once the number of columns is known, the counted reading is climbed,
    // its multipliers on the scale of literals, not terms.
    let counted = (plain.exact && plain.cost < climb.limit).then(|| {
        climb.run(
            &*m,
            [Some(start(&relaxation.literal_part)), warm(1)],
            true,
            effort,
            primal,
            &mut scratch,
        )
    });
    let result = match &counted {
        Some(c) if c.cost >= plain.cost => c,
        _ => &plain,
    };
    let last = climb
        .relaxation
        .evaluate(&result.u, climb.limit, climb.fewest, &mut scratch);
    // The warm starts of the children: the counted climb's multipliers
    // replace those the parent passed down only when it ran.
    if let Some(c) = &counted {
        for (w, &b) in m.mult.iter_mut().zip(&c.u) {
            w[1] = b;
        }
    }
    for (w, &a) in m.mult.iter_mut().zip(&plain.u) {
        w[0] = a;
    }
    Bound {
        cost: last.cost.max(plain.cost),
        weighted: last.weighted,
        unit: last.unit,
        counted: last.counted,
        displaced: last.displaced,
        chosen: scratch.chosen,
        reduced: scratch.reduced,
        steps: climb.steps,
    }
}

/// Buffers of [`Relaxation::evaluate`].
struct Buffers {
    reduced: Vec<i64>,
    chosen: Vec<bool>,
    /// Scratch of the selection.
    order: Vec<i64>,
    /// The plain reading's subgradient.
    plain: Vec<i64>,
}

/// The best multipliers one subgradient climb found, with their bound.
struct Climbed {
    u: Vec<i64>,
    cost: u64,
    /// Whether the number of columns of a cover under the limit is known.
    exact: bool,
}

/// A subgradient search's state across its climbs: the limit (lowered by
/// the covers found), the fewest columns proven, the steps taken.
struct Climb<'a, 'b> {
    relaxation: &'a Relaxation<'b>,
    limit: u64,
    fewest: u64,
    steps: usize,
    /// Polled every few steps; stopping early leaves a weaker bound, still
    /// a bound.
    stop: Stop<'a>,
}

impl Climb<'_, '_> {
    /// Subgradient steps from the better of `starts`, following the
    /// counted reading or the plain one; the plain climb stops once the
    /// number of columns is known.
    fn run(
        &mut self,
        m: &Matrix,
        starts: [Option<Vec<i64>>; 2],
        counted: bool,
        effort: Effort,
        primal: &mut dyn FnMut(&Matrix, &[i64]) -> u64,
        scratch: &mut Buffers,
    ) -> Climbed {
        let rows = m.rows.len();
        let reading = |v: &Value| if counted { v.counted } else { v.weighted };
        let eval = |u: &[i64], limit: u64, fewest: &mut u64, scratch: &mut Buffers| {
            let v = self.relaxation.evaluate(u, limit, *fewest, scratch);
            *fewest = (*fewest).max(v.fewest);
            v
        };
        let mut best: Option<(Vec<i64>, Value)> = None;
        let mut best_is_last = false;
        for u in starts.into_iter().flatten() {
            let v = eval(&u, self.limit, &mut self.fewest, scratch);
            best_is_last = best
                .as_ref()
                .is_none_or(|(_, b)| (v.cost, reading(&v)) > (b.cost, reading(b)));
            if best_is_last {
                best = Some((u, v));
            }
        }
        let (mut best_u, first) = best.expect("a start is given");
        let mut u = best_u.clone();
        // The buffers hold the last evaluation: redo the best start's
        // unless it was the last.
        let mut now = if best_is_last {
            first
        } else {
            eval(&u, self.limit, &mut self.fewest, scratch)
        };
        let mut best = (first.cost, reading(&first), first.exact);
        let mut value = reading(&now);
        let mut best_value = value;
        let mut lambda = 1.0f64;
        let mut stall = 0;
        let mut g: Vec<i64> = Vec::with_capacity(rows);
        let mut shifted = Vec::new();
        for step_index in 0..effort.steps {
            if (!counted && now.exact) || best.0 >= self.limit {
                break;
            }
            // Each step is a pass over the matrix: polling is cheap beside it.
            if (self.stop)() {
                break;
            }
            if step_index % PRIMAL_EVERY == PRIMAL_EVERY - 1 {
                let prices = if counted {
                    // The number of columns is settled: the greedy cover
                    // should weigh the literals alone.
                    let term = self.relaxation.term as i64 * SCALE;
                    shifted.clear();
                    shifted.extend(scratch.reduced.iter().map(|&rc| rc - term));
                    &shifted
                } else {
                    &scratch.reduced
                };
                self.limit = self.limit.min(primal(m, prices));
            }
            self.steps += 1;
            // Subgradient: 1 minus how often each row is covered by the
            // relaxation's columns; a row at multiplier 0 is not pushed lower.
            if counted {
                g.clear();
                g.resize(rows, 1);
                for (c, rs) in self.relaxation.col_rows.iter().enumerate() {
                    if scratch.chosen[c] {
                        for &r in rs {
                            g[r as usize] -= 1;
                        }
                    }
                }
            } else {
                g.clone_from(&scratch.plain);
            }
            for (gr, &x) in g.iter_mut().zip(&u) {
                if x == 0 && *gr < 0 {
                    *gr = 0;
                }
            }
            let norm: i64 = g.iter().map(|x| x * x).sum();
            if norm == 0 {
                break;
            }
            let goal = if self.limit == u64::MAX {
                value as f64 * 1.05 + SCALE as f64
            } else {
                self.limit as f64 * SCALE as f64
            };
            let step = lambda * (goal - value as f64).max(SCALE as f64) / norm as f64;
            for (x, &gr) in u.iter_mut().zip(&g) {
                *x = (*x + (step * gr as f64) as i64).max(0);
            }
            now = eval(&u, self.limit, &mut self.fewest, scratch);
            value = reading(&now);
            if (now.cost, value) > (best.0, best.1) {
                best = (now.cost, value, now.exact);
                best_u.clone_from(&u);
            }
            if value > best_value {
                best_value = value;
                stall = 0;
            } else {
                stall += 1;
                if stall >= effort.patience {
                    lambda /= 2.0;
                    stall = 0;
                    if lambda < 1e-3 {
                        break;
                    }
                }
            }
        }
        Climbed {
            u: best_u,
            cost: best.0,
            exact: best.2 || now.exact,
        }
    }
}
