//! Heuristic two-level minimization for functions beyond the exact limit:
//! the expand, irredundant, reduce loop of Brayton, Hachtel, McMullen and
//! Sangiovanni-Vincentelli (1984), on covers of up to 64 inputs, without
//! enumerating minterms.
//!
//! Architecture invariant: the returned cover is never larger (in terms,
//! then literals) than the input, and it has been checked equivalent to the
//! input under the don't-cares by cube containment before it is returned;
//! when that check cannot finish, the input comes back unchanged.

use crate::index::CubeIndex;
use crate::minimize::isolated;
use crate::urp::{mask, polarities, split_variable, zero_point};
use crate::{Cover, Cube, Effort, Interrupted};

/// The outcome of [`minimize_heuristic`].
#[derive(Debug, Clone)]
pub struct Heuristic {
    /// The sum of products found: equivalent to the input under the
    /// don't-cares, and no larger.
    pub cover: Cover,
    /// Whether the loop ran until a pass gained nothing (false when the
    /// budget ended it early; the cover is then the best found so far).
    pub complete: bool,
    /// Passes of reduce, expand and irredundant that were run.
    pub passes: usize,
    /// Whether no cover has fewer terms, or as many and fewer literals:
    /// when the cover is empty, or has no more terms than `lower_bound`
    /// (it is then those lone rows and nothing else).
    pub proven_minimal: bool,
    /// Fewest terms any sum of products of the function needs, as known:
    /// the required rows with no neighbour (one input flipped) in the
    /// function or the don't-cares, each a term of its own in every cover.
    /// Counted on truth tables, when the function has at most
    /// [`crate::MAX_VARS`] inputs and the tables of the input's cubes take
    /// at most 2^24 words; 0 otherwise (nothing is known then).
    pub lower_bound: usize,
}

/// Most table words spent on the certificate.
const CERTIFICATE_WORDS: usize = 1 << 24;

/// The certificate of a verified `cover` of `on` free on `dc`.
fn certificate(cover: &Cover, on: &Cover, dc: &Cover) -> (bool, usize) {
    let vars = cover.vars;
    if cover.is_empty() {
        return (true, 0);
    }
    let words = (1usize << vars.min(crate::MAX_VARS)).div_ceil(64);
    if vars > crate::MAX_VARS || (on.len() + dc.len()).saturating_mul(words) > CERTIFICATE_WORDS {
        return (false, 0);
    }
    let alone = isolated(&on.truth_table(), &dc.truth_table()).count_ones();
    (cover.len() <= alone, alone)
}

/// Terms, then literals.
fn cost(cover: &Cover) -> (usize, usize) {
    (cover.len(), cover.literals())
}

/// Minimizes the sum of products `on` (over at most 64 inputs), free on the
/// don't-cares `dc`, within `effort`.
///
/// Three quarters of the budget go to the loop and the rest is kept for
/// the final equivalence check. Cancellation is an error; running out of
/// budget is not: the best verified cover so far comes back, marked
/// incomplete, and a pass the budget stops part-way counts (the cubes it
/// reached are improved, the others kept as they were), so even a budget
/// too small for one whole pass can give a smaller cover.
///
/// ```
/// use implica_logic::{Cover, Cube, Effort, minimize_heuristic};
/// // a&b | a&!b | !a&b  over 2 inputs is  a | b.
/// let t = |s: &str| {
///     let mut c = Cube::universe(2);
///     for (i, ch) in s.chars().enumerate() {
///         match ch { '1' => c.zero &= !(1 << i), '0' => c.one &= !(1 << i), _ => {} }
///     }
///     c
/// };
/// let on = Cover { vars: 2, cubes: vec![t("11"), t("10"), t("01")] };
/// let r = minimize_heuristic(&on, &Cover::zero(2), &mut Effort::new(1_000_000)).unwrap();
/// assert_eq!(r.cover.len(), 2);
/// assert_eq!(r.cover.literals(), 2);
/// ```
///
/// # Panics
///
/// When `on` and `dc` are over different numbers of inputs, or over more
/// than 64.
pub fn minimize_heuristic(
    on: &Cover,
    dc: &Cover,
    effort: &mut Effort,
) -> Result<Heuristic, Interrupted> {
    assert_eq!(
        on.vars, dc.vars,
        "on-set and don't-cares over different inputs"
    );
    assert!(on.vars <= 64, "a cover has at most 64 inputs");
    let unchanged = |complete| {
        let (proven_minimal, lower_bound) = certificate(on, on, dc);
        Heuristic {
            cover: on.clone(),
            complete,
            passes: 0,
            proven_minimal,
            lower_bound,
        }
    };
    let mut work = effort.part(effort.remaining() / 4 * 3);
    let outcome = improve(on, dc, &mut work);
    effort.spend(work.used())?;
    let (best, complete, passes) = match outcome {
        Ok(found) => found,
        Err(Interrupted::Cancelled) => return Err(Interrupted::Cancelled),
        Err(Interrupted::OutOfBudget) => return Ok(unchanged(false)),
    };
    let Some(best) = best else {
        return Ok(unchanged(complete));
    };
    // The loop only ever replaces cubes by cubes inside on | dc that keep
    // on covered; check that, independently of how it got there.
    let mut check = effort.part(effort.remaining());
    let verdict = best.union(dc).covers(on, &mut check).and_then(|w| match w {
        Some(w) => Ok(Some(w)),
        None => on.union(dc).covers(&best, &mut check),
    });
    effort.spend(check.used())?;
    match verdict {
        Ok(None) => {
            let (proven_minimal, lower_bound) = certificate(&best, on, dc);
            Ok(Heuristic {
                cover: best,
                complete,
                passes,
                proven_minimal,
                lower_bound,
            })
        }
        Ok(Some(point)) => {
            debug_assert!(false, "heuristic result differs at {point:?}");
            Ok(unchanged(false))
        }
        Err(Interrupted::Cancelled) => Err(Interrupted::Cancelled),
        Err(Interrupted::OutOfBudget) => Ok(unchanged(false)),
    }
}

/// The loop. `Ok((None, ..))` when nothing smaller than `on` was found;
/// otherwise the best cover, whether the loop converged, and its passes.
type Found = (Option<Cover>, bool, usize);

/// A pass's cover, and whether the pass ran to its end. A pass the budget
/// stops part-way still gives a cover of the same function: each of its
/// steps keeps the function, and the cubes it did not reach stay as they
/// were.
type Pass = Result<(Cover, bool), Interrupted>;

/// A step's value, or `Ok(None)` when the budget ran out; cancellation
/// stays an error.
fn finished<T>(step: Result<T, Interrupted>) -> Result<Option<T>, Interrupted> {
    match step {
        Ok(v) => Ok(Some(v)),
        Err(Interrupted::OutOfBudget) => Ok(None),
        Err(e) => Err(e),
    }
}

fn improve(on: &Cover, dc: &Cover, effort: &mut Effort) -> Result<Found, Interrupted> {
    let mut f = on.clone();
    f.remove_contained();
    let care = f.union(dc);
    // The off-set makes expansion fast, but it can be far larger than the
    // function; past a third of the budget, expand against the care set.
    let mut part = effort.part(effort.remaining() / 3);
    let offset = care.complement(&mut part);
    effort.spend(part.used())?;
    let offset = match offset {
        Ok(r) => Some(r),
        Err(Interrupted::OutOfBudget) => None,
        Err(e) => return Err(e),
    };
    let limit = match &offset {
        Some(r) => Limit::Offset(r),
        None => Limit::Care(&care),
    };
    // Each pass is reduce (skipped the first time), expand, irredundant;
    // a pass cut short by the budget ends the loop with what it made.
    let mut best: Option<Cover> = None;
    let mut current = f;
    let mut passes = 0;
    loop {
        let (g, done) = if passes == 0 {
            (current.clone(), true)
        } else {
            reduce(&current, dc, effort)?
        };
        let (g, done) = if done {
            expand(&g, &limit, effort)?
        } else {
            (g, false)
        };
        let (g, done) = if done {
            irredundant(&g, dc, effort)?
        } else {
            (g, false)
        };
        // The first pass only grows and drops cubes, so it never costs more.
        let gained = cost(&g) < cost(&current);
        if gained || passes == 0 {
            current = g;
            if cost(&current) < cost(on) {
                best = Some(current.clone());
            }
        }
        if !done {
            return Ok((best, false, passes));
        }
        if !gained && passes > 0 {
            return Ok((best, true, passes));
        }
        passes += 1;
    }
}

/// Variables with a literal in `c`.
fn literal_vars(c: &Cube, m: u64) -> u64 {
    !(c.zero & c.one) & m
}

/// What a cube may not grow into: the off-set, when its cover could be
/// computed within budget, or else the care set `on | dc` it must stay in
/// (slower: every step is a containment check instead of bit tests).
enum Limit<'c> {
    Offset(&'c Cover),
    Care(&'c Cover),
}

/// Targets tried per cube when each try is a containment check.
const CARE_TARGETS: usize = 12;

/// Each cube of `f` made prime (no literal can be dropped without leaving
/// `on | dc`), preferring growth that swallows other cubes; swallowed cubes
/// are dropped.
fn expand(f: &Cover, limit: &Limit, effort: &mut Effort) -> Pass {
    let vars = f.vars;
    let mut order: Vec<Cube> = f.cubes.clone();
    // Small cubes are the most likely to be swallowed, so expand big ones first.
    order.sort_by_key(|c| c.literals(vars));
    let mut covered = vec![false; order.len()];
    let mut out = Vec::with_capacity(order.len());
    for k in 0..order.len() {
        if covered[k] {
            continue;
        }
        let prime = match finished(expand_cube(k, &order, &covered, vars, limit, effort))? {
            Some(prime) => prime,
            None => {
                out.extend((k..order.len()).filter(|&j| !covered[j]).map(|j| order[j]));
                return Ok((Cover { vars, cubes: out }, false));
            }
        };
        for j in 0..order.len() {
            if !covered[j] && prime.contains(&order[j]) {
                covered[j] = true;
            }
        }
        out.push(prime);
    }
    Ok((Cover { vars, cubes: out }, true))
}

/// Cube `order[k]` grown to a prime: first towards the other uncovered
/// cubes, nearest first, then by every literal that can still go.
///
/// Against the off-set, each off-set cube gives a blocking row: the
/// variables where it and the cube disagree, one of which must keep its
/// literal. A row left with one variable makes that literal required for
/// good, and a row holding a required literal is met for good, so both
/// leave the rows checked; a target that needs a required literal is
/// refused without a check. The primes are those of checking every row
/// every time, found in time that shrinks with the rows.
fn expand_cube(
    k: usize,
    order: &[Cube],
    covered: &[bool],
    vars: usize,
    limit: &Limit,
    effort: &mut Effort,
) -> Result<Cube, Interrupted> {
    let m = mask(vars);
    let c = order[k];
    let lits = literal_vars(&c, m);
    let grow = |freed: u64| Cube {
        zero: c.zero | freed,
        one: c.one | freed,
    };
    let offset_len = match limit {
        Limit::Offset(r) => r.len(),
        Limit::Care(_) => 0,
    };
    effort.spend(1 + (order.len() + offset_len) as u64 / 8)?;
    // Required literals, and the rows not yet met for good.
    let mut required = 0u64;
    let mut rows: Vec<u64> = Vec::new();
    let settle = |rows: &mut Vec<u64>, required: &mut u64, freed: u64| {
        rows.retain_mut(|b| {
            *b &= !freed;
            if *b & *required != 0 {
                false
            } else if b.count_ones() == 1 {
                *required |= *b;
                false
            } else {
                true
            }
        });
    };
    if let Limit::Offset(r) = limit {
        rows = r
            .cubes
            .iter()
            .map(|r| !((c.zero & r.zero) | (c.one & r.one)) & m)
            .collect();
        if rows.contains(&0) {
            // The cube meets the off-set (never for a cover inside the
            // care set): it cannot grow.
            debug_assert!(false, "a cube of the cover meets the off-set");
            return Ok(c);
        }
        settle(&mut rows, &mut required, 0);
    }
    let feasible = |grown: u64, rows: &[u64], effort: &mut Effort| -> Result<bool, Interrupted> {
        match limit {
            Limit::Offset(_) => {
                effort.spend(1 + rows.len() as u64 / 64)?;
                Ok(rows.iter().all(|b| b & !grown != 0))
            }
            Limit::Care(care) => care.contains_cube(&grow(grown), effort),
        }
    };
    // The other cubes as targets, by how many literals reaching each frees
    // (a counting sort keeps equal distances in cube order).
    let mut by_distance = [0usize; 66];
    let mut needs: Vec<(u32, u64)> = Vec::new();
    for (j, d) in order.iter().enumerate() {
        if j == k || covered[j] {
            continue;
        }
        let same = (c.zero & !c.one & d.zero & !d.one) | (c.one & !c.zero & d.one & !d.zero);
        let need = lits & !same;
        if need != 0 && need & required == 0 {
            let distance = need.count_ones();
            by_distance[distance as usize + 1] += 1;
            needs.push((distance, need));
        }
    }
    for i in 1..by_distance.len() {
        by_distance[i] += by_distance[i - 1];
    }
    let mut targets = vec![0u64; needs.len()];
    for &(distance, need) in &needs {
        let slot = &mut by_distance[distance as usize];
        targets[*slot] = need;
        *slot += 1;
    }
    if let Limit::Care(_) = limit {
        targets.truncate(CARE_TARGETS);
    }
    let mut freed = 0u64;
    for need in targets {
        let grown = freed | need;
        if grown != freed && need & required == 0 && feasible(grown, &rows, effort)? {
            freed = grown;
            settle(&mut rows, &mut required, freed);
        }
    }
    // Then drop every literal that can still go.
    let mut rest = lits & !freed & !required;
    while rest != 0 {
        let v = rest.trailing_zeros();
        rest &= rest - 1;
        let grown = freed | 1 << v;
        if grown & required == 0 && feasible(grown, &rows, effort)? {
            freed = grown;
            settle(&mut rows, &mut required, freed);
        }
    }
    Ok(grow(freed))
}

/// Drops cubes the others and the don't-cares cover, smallest cubes first,
/// until none is left to drop (or the budget ends it: the cubes not yet
/// looked at stay).
fn irredundant(f: &Cover, dc: &Cover, effort: &mut Effort) -> Pass {
    let vars = f.vars;
    let mut cubes = f.cubes.clone();
    cubes.sort_by_key(|c| std::cmp::Reverse(c.literals(vars)));
    let mut keep = vec![true; cubes.len()];
    let near = Near::new(&cubes, dc);
    let mut scratch = Scratch::default();
    let redundant = |i: usize, keep: &[bool], scratch: &mut Scratch, effort: &mut Effort| {
        let c = cubes[i];
        if c.is_empty(vars) {
            return Ok(true);
        }
        // The others and the don't-cares, cofactored by the cube: a
        // tautology when they cover it.
        near.cofactors(&cubes, dc, &c, |j| j != i && keep[j], scratch, effort)?;
        Ok(zero_point(&scratch.cofactors, vars, effort)?.is_none())
    };
    let mut done = true;
    for i in 0..cubes.len() {
        match finished(redundant(i, &keep, &mut scratch, effort))? {
            Some(r) => keep[i] = !r,
            None => {
                done = false;
                break;
            }
        }
    }
    let cubes = cubes
        .iter()
        .zip(keep)
        .filter_map(|(c, k)| k.then_some(*c))
        .collect();
    Ok((Cover { vars, cubes }, done))
}

/// Indexes of a cover's cubes and of the don't-cares, for the cofactors of
/// both by one cube after another.
struct Near {
    cubes: CubeIndex,
    dc: CubeIndex,
}

/// Buffers reused from one cube to the next.
#[derive(Default)]
struct Scratch {
    meeting: Vec<u32>,
    cofactors: Vec<Cube>,
}

impl Near {
    fn new(cubes: &[Cube], dc: &Cover) -> Near {
        Near {
            cubes: CubeIndex::new(cubes, dc.vars),
            dc: CubeIndex::new(&dc.cubes, dc.vars),
        }
    }

    /// Into `scratch.cofactors`: the cofactors by `c` of the cubes `j` of
    /// `cubes` (as indexed, or shrunk since) with `take(j)`, then of the
    /// don't-cares, each in cover order. Counts one unit per eight cubes
    /// visited.
    fn cofactors(
        &self,
        cubes: &[Cube],
        dc: &Cover,
        c: &Cube,
        take: impl Fn(usize) -> bool,
        scratch: &mut Scratch,
        effort: &mut Effort,
    ) -> Result<(), Interrupted> {
        let Scratch { meeting, cofactors } = scratch;
        cofactors.clear();
        let visited = self
            .cubes
            .cofactors(cubes, c, dc.vars, take, meeting, cofactors)
            + self
                .dc
                .cofactors(&dc.cubes, c, dc.vars, |_| true, meeting, cofactors);
        effort.spend(1 + visited as u64 / 8)
    }
}

/// Each cube shrunk, in turn, to the smallest cube holding what only it
/// covers, so that the next expand can grow it in another direction (or
/// until the budget ends it: the cubes not yet reached stay as they are).
fn reduce(f: &Cover, dc: &Cover, effort: &mut Effort) -> Pass {
    let vars = f.vars;
    let mut cubes = f.cubes.clone();
    // The largest cube first: it has the most to give up.
    cubes.sort_by_key(|c| c.literals(vars));
    let mut alive = vec![true; cubes.len()];
    let near = Near::new(&cubes, dc);
    let mut scratch = Scratch::default();
    let mut done = true;
    for i in 0..cubes.len() {
        let c = cubes[i];
        let shrunk = (|| {
            near.cofactors(&cubes, dc, &c, |j| j != i && alive[j], &mut scratch, effort)?;
            supercube_of_complement(&scratch.cofactors, vars, effort)
        })();
        match finished(shrunk)? {
            Some(None) => alive[i] = false,
            Some(Some(s)) => cubes[i] = c.and(&s),
            None => {
                done = false;
                break;
            }
        }
    }
    let cubes = cubes
        .into_iter()
        .zip(alive)
        .filter_map(|(c, a)| a.then_some(c))
        .collect();
    Ok((Cover { vars, cubes }, done))
}

/// The smallest cube containing the complement of the cover, or `None`
/// when the cover is a tautology.
fn supercube_of_complement(
    cubes: &[Cube],
    vars: usize,
    effort: &mut Effort,
) -> Result<Option<Cube>, Interrupted> {
    effort.spend(1 + cubes.len() as u64)?;
    let m = mask(vars);
    if cubes.iter().any(|c| c.zero & c.one & m == m) {
        return Ok(None);
    }
    match cubes {
        [] => return Ok(Some(Cube::universe(vars))),
        [c] => {
            let lits = literal_vars(c, m);
            // The complement of one cube is the sum of its opposite
            // literals; their supercube is that literal when there is one.
            if lits.count_ones() == 1 {
                let i = lits.trailing_zeros() as usize;
                let p = c.literal_of(i).unwrap_or(true);
                return Ok(Some(Cube::literal(vars, i, !p)));
            }
            return Ok(Some(Cube::universe(vars)));
        }
        _ => {}
    }
    let (pos, neg) = polarities(cubes, m);
    let candidates = if pos & neg != 0 { pos & neg } else { pos | neg };
    let i = split_variable(cubes, vars, candidates);
    let mut result: Option<Cube> = None;
    for positive in [true, false] {
        let lit = Cube::literal(vars, i, positive);
        let half: Vec<Cube> = cubes
            .iter()
            .filter_map(|c| c.cofactor(&lit, vars))
            .collect();
        if let Some(s) = supercube_of_complement(&half, vars, effort)? {
            let s = s.and(&lit);
            result = Some(result.map_or(s, |r| r.supercube(&s)));
        }
    }
    Ok(result)
}
