//! Heuristic two-level minimization for functions beyond the exact limit:
//! the expand, irredundant, reduce loop of Brayton, Hachtel, McMullen and
//! Sangiovanni-Vincentelli (1984), on covers of up to 64 inputs, without
//! enumerating minterms.
//!
//! Architecture invariant: the returned cover is never larger (in terms,
//! then literals) than the input, and it has been checked equivalent to the
//! input under the don't-cares by cube containment before it is returned;
//! when that check cannot finish, the input comes back unchanged.

use crate::urp::{mask, polarities, split_variable};
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
/// incomplete.
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
    let unchanged = |complete| Heuristic {
        cover: on.clone(),
        complete,
        passes: 0,
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
        Ok(None) => Ok(Heuristic {
            cover: best,
            complete,
            passes,
        }),
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

fn improve(on: &Cover, dc: &Cover, effort: &mut Effort) -> Result<Found, Interrupted> {
    let vars = on.vars;
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
    let mut best: Option<Cover> = None;
    let mut passes = 0;
    let mut current = f;
    let first = (|| -> Result<Cover, Interrupted> {
        let g = expand(&current, &limit, effort)?;
        irredundant(&g, dc, effort)
    })();
    match first {
        Ok(g) => current = g,
        Err(Interrupted::OutOfBudget) => return Ok((None, false, 0)),
        Err(e) => return Err(e),
    }
    if cost(&current) < cost(on) {
        best = Some(current.clone());
    }
    loop {
        passes += 1;
        let step = (|| -> Result<Cover, Interrupted> {
            let g = reduce(&current, dc, effort)?;
            let g = expand(&g, &limit, effort)?;
            irredundant(&g, dc, effort)
        })();
        let next = match step {
            Ok(g) => g,
            Err(Interrupted::OutOfBudget) => return Ok((best, false, passes)),
            Err(e) => return Err(e),
        };
        if cost(&next) < cost(&current) {
            current = next;
            if cost(&current) < cost(on) {
                best = Some(current.clone());
            }
        } else {
            debug_assert_eq!(current.vars, vars);
            return Ok((best, true, passes));
        }
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
fn expand(f: &Cover, limit: &Limit, effort: &mut Effort) -> Result<Cover, Interrupted> {
    let vars = f.vars;
    let m = mask(vars);
    let mut order: Vec<Cube> = f.cubes.clone();
    // Small cubes are the most likely to be swallowed, so expand big ones first.
    order.sort_by_key(|c| c.literals(vars));
    let mut covered = vec![false; order.len()];
    let mut out = Vec::with_capacity(order.len());
    for k in 0..order.len() {
        if covered[k] {
            continue;
        }
        let c = order[k];
        let grow = |freed: u64| Cube {
            zero: c.zero | freed,
            one: c.one | freed,
        };
        // For each off-set cube, the variables where it and `c` disagree:
        // `c` grown over variables S stays off it while S misses one of them.
        let blocking: Vec<u64> = match limit {
            Limit::Offset(r) => r
                .cubes
                .iter()
                .map(|r| !((c.zero & r.zero) | (c.one & r.one)) & m)
                .collect(),
            Limit::Care(_) => Vec::new(),
        };
        effort.spend(1 + blocking.len() as u64 / 8)?;
        let feasible = |freed: u64, effort: &mut Effort| -> Result<bool, Interrupted> {
            match limit {
                Limit::Offset(_) => {
                    effort.spend(1 + blocking.len() as u64 / 64)?;
                    Ok(blocking.iter().all(|b| b & !freed != 0))
                }
                Limit::Care(care) => care.contains_cube(&grow(freed), effort),
            }
        };
        let lits = literal_vars(&c, m);
        let mut freed = 0u64;
        // First grow towards the other cubes, nearest first.
        let mut targets: Vec<(u32, usize, u64)> = (0..order.len())
            .filter(|&j| j != k && !covered[j])
            .map(|j| {
                let d = order[j];
                let same =
                    (c.zero & !c.one & d.zero & !d.one) | (c.one & !c.zero & d.one & !d.zero);
                let need = lits & !same;
                (need.count_ones(), j, need)
            })
            .collect();
        targets.sort_unstable();
        if let Limit::Care(_) = limit {
            targets.truncate(CARE_TARGETS);
        }
        for &(_, _, need) in &targets {
            let grown = freed | need;
            if grown != freed && feasible(grown, effort)? {
                freed = grown;
            }
        }
        // Then drop every literal that can still go.
        let mut rest = lits & !freed;
        while rest != 0 {
            let v = rest.trailing_zeros();
            rest &= rest - 1;
            let grown = freed | 1 << v;
            if feasible(grown, effort)? {
                freed = grown;
            }
        }
        let prime = grow(freed);
        for j in 0..order.len() {
            if !covered[j] && prime.contains(&order[j]) {
                covered[j] = true;
            }
        }
        out.push(prime);
    }
    Ok(Cover { vars, cubes: out })
}

/// Drops cubes the others and the don't-cares cover, smallest cubes first,
/// until none is left to drop.
fn irredundant(f: &Cover, dc: &Cover, effort: &mut Effort) -> Result<Cover, Interrupted> {
    let vars = f.vars;
    let mut cubes = f.cubes.clone();
    cubes.sort_by_key(|c| std::cmp::Reverse(c.literals(vars)));
    let mut keep = vec![true; cubes.len()];
    for i in 0..cubes.len() {
        let others = Cover {
            vars,
            cubes: cubes
                .iter()
                .enumerate()
                .filter(|&(j, _)| j != i && keep[j])
                .map(|(_, c)| *c)
                .chain(dc.cubes.iter().copied())
                .collect(),
        };
        if others.contains_cube(&cubes[i], effort)? {
            keep[i] = false;
        }
    }
    Ok(Cover {
        vars,
        cubes: cubes
            .into_iter()
            .zip(keep)
            .filter_map(|(c, k)| k.then_some(c))
            .collect(),
    })
}

/// Each cube shrunk, in turn, to the smallest cube holding what only it
/// covers, so that the next expand can grow it in another direction.
fn reduce(f: &Cover, dc: &Cover, effort: &mut Effort) -> Result<Cover, Interrupted> {
    let vars = f.vars;
    let mut cubes = f.cubes.clone();
    // The largest cube first: it has the most to give up.
    cubes.sort_by_key(|c| c.literals(vars));
    let mut alive = vec![true; cubes.len()];
    for i in 0..cubes.len() {
        let c = cubes[i];
        let others: Vec<Cube> = cubes
            .iter()
            .enumerate()
            .filter(|&(j, _)| j != i && alive[j])
            .map(|(_, d)| *d)
            .chain(dc.cubes.iter().copied())
            .filter_map(|d| d.cofactor(&c, vars))
            .collect();
        match supercube_of_complement(&others, vars, effort)? {
            None => alive[i] = false,
            Some(s) => cubes[i] = c.and(&s),
        }
    }
    Ok(Cover {
        vars,
        cubes: cubes
            .into_iter()
            .zip(alive)
            .filter_map(|(c, a)| a.then_some(c))
            .collect(),
    })
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
