//! Operations on covers of up to 64 inputs that never enumerate minterms:
//! cofactors, tautology, complement, containment, equivalence with a
//! counterexample, and dependence. All follow the unate recursive paradigm
//! (Brayton, Hachtel, McMullen and Sangiovanni-Vincentelli, 1984): a unate
//! cover is easy, so split on the most binate variable until the pieces are.
//!
//! Their cost can be exponential in the inputs (the complement of n-input
//! parity has 2^(n-1) cubes), so each takes an [`Effort`].
//!
//! ```
//! use implica_logic::{Cover, Cube, Effort};
//! // Over 40 inputs: x3 & x7 | !x3 | !x7 is a tautology, and x3 & x7 | !x3 is
//! // not: it is 0 where x3 = 1 and x7 = 0.
//! let n = 40;
//! let both = Cube::literal(n, 3, true).and(&Cube::literal(n, 7, true));
//! let f = Cover { vars: n, cubes: vec![both, Cube::literal(n, 3, false), Cube::literal(n, 7, false)] };
//! let mut effort = Effort::new(1_000_000);
//! assert!(f.is_tautology(&mut effort).unwrap());
//! let g = Cover { vars: n, cubes: vec![both, Cube::literal(n, 3, false)] };
//! let zero = g.find_zero(&mut effort).unwrap().unwrap();
//! assert!(zero[3] && !zero[7]);
//! assert_eq!(g.complement(&mut effort).unwrap().len(), 1); // x3 & !x7
//! ```

use crate::index::CubeIndex;
use crate::{Cover, Cube, Effort, Interrupted};

pub(crate) fn mask(vars: usize) -> u64 {
    if vars >= 64 {
        u64::MAX
    } else {
        (1u64 << vars) - 1
    }
}

impl Cube {
    /// The cofactor of this cube with respect to `p`: `None` when they do not
    /// intersect; otherwise the cube with every variable `p` fixes made free.
    pub fn cofactor(&self, p: &Cube, vars: usize) -> Option<Cube> {
        if self.and(p).is_empty(vars) {
            return None;
        }
        let m = mask(vars);
        Some(Cube {
            zero: (self.zero | !p.zero) & m,
            one: (self.one | !p.one) & m,
        })
    }

    /// The smallest cube containing both.
    pub fn supercube(&self, other: &Cube) -> Cube {
        Cube {
            zero: self.zero | other.zero,
            one: self.one | other.one,
        }
    }

    /// One input vector inside the cube (free variables at 0), `None` when
    /// the cube is empty.
    pub fn point(&self, vars: usize) -> Option<Vec<bool>> {
        if self.is_empty(vars) {
            return None;
        }
        Some((0..vars).map(|i| self.zero >> i & 1 == 0).collect())
    }

    fn is_universe(&self, m: u64) -> bool {
        self.zero & self.one & m == m
    }
}

impl Cover {
    /// The empty cover (the constant 0) over `vars` inputs.
    pub fn zero(vars: usize) -> Cover {
        Cover {
            vars,
            cubes: Vec::new(),
        }
    }

    /// The cover of the constant 1 over `vars` inputs.
    pub fn one(vars: usize) -> Cover {
        Cover {
            vars,
            cubes: vec![Cube::universe(vars)],
        }
    }

    /// The value for an input vector (`inputs[i]` is variable `i`).
    pub fn eval(&self, inputs: &[bool]) -> bool {
        let point = inputs
            .iter()
            .enumerate()
            .fold(Cube { zero: 0, one: 0 }, |c, (i, &b)| {
                if b {
                    Cube {
                        one: c.one | 1 << i,
                        ..c
                    }
                } else {
                    Cube {
                        zero: c.zero | 1 << i,
                        ..c
                    }
                }
            });
        self.cubes.iter().any(|c| c.contains(&point))
    }

    /// The cofactor with respect to cube `p`: a cover, free in the variables
    /// `p` fixes, that equals this one everywhere inside `p`.
    ///
    /// ```
    /// use implica_logic::{Cover, Cube, Effort};
    /// // Over 50 inputs: f = x0 & x1 | !x0 & x49. With x0 = 1 it is x1, with
    /// // x0 = 0 it is x49; with x0 = 1 and x1 = 1, constant 1.
    /// let n = 50;
    /// let lit = |i, p| Cube::literal(n, i, p);
    /// let f = Cover { vars: n, cubes: vec![lit(0, true).and(&lit(1, true)), lit(0, false).and(&lit(49, true))] };
    /// assert_eq!(f.cofactor(&lit(0, true)).cubes, vec![lit(1, true)]);
    /// assert_eq!(f.cofactor(&lit(0, false)).cubes, vec![lit(49, true)]);
    /// let mut effort = Effort::new(100_000);
    /// let both = lit(0, true).and(&lit(1, true));
    /// assert!(f.cofactor(&both).is_tautology(&mut effort).unwrap());
    /// ```
    pub fn cofactor(&self, p: &Cube) -> Cover {
        Cover {
            vars: self.vars,
            cubes: self
                .cubes
                .iter()
                .filter_map(|c| c.cofactor(p, self.vars))
                .collect(),
        }
    }

    /// The union of two covers over the same inputs (panics when their
    /// inputs differ).
    pub fn union(&self, other: &Cover) -> Cover {
        assert_eq!(self.vars, other.vars, "covers over different inputs");
        let mut cubes = self.cubes.clone();
        cubes.extend_from_slice(&other.cubes);
        Cover {
            vars: self.vars,
            cubes,
        }
    }

    /// Drops empty cubes and cubes contained in another one (single-cube
    /// containment); keeps the first of equal cubes.
    pub fn remove_contained(&mut self) {
        let vars = self.vars;
        self.cubes.retain(|c| !c.is_empty(vars));
        // Larger cubes first, so a cube is only checked against earlier ones,
        // and of those only the ones that meet it (a cube containing it
        // does), found by an index rather than a scan.
        self.cubes.sort_by_key(|c| c.literals(vars));
        let index = CubeIndex::new(&self.cubes, vars);
        let mut keep = vec![true; self.cubes.len()];
        let mut meeting = Vec::new();
        for (i, c) in self.cubes.iter().enumerate() {
            index.meeting(c, &mut meeting);
            keep[i] = !meeting
                .iter()
                .map(|&j| j as usize)
                .take_while(|&j| j < i)
                .any(|j| keep[j] && self.cubes[j].contains(c));
        }
        let mut keep = keep.into_iter();
        self.cubes.retain(|_| keep.next().unwrap_or(false));
    }

    /// Whether the cover is 1 everywhere.
    pub fn is_tautology(&self, effort: &mut Effort) -> Result<bool, Interrupted> {
        Ok(zero_point(&self.cubes, self.vars, effort)?.is_none())
    }

    /// An input vector where the cover is 0, or `None` when it is a tautology.
    pub fn find_zero(&self, effort: &mut Effort) -> Result<Option<Vec<bool>>, Interrupted> {
        Ok(zero_point(&self.cubes, self.vars, effort)?.and_then(|c| c.point(self.vars)))
    }

    /// Whether every input vector of cube `c` makes the cover 1.
    pub fn contains_cube(&self, c: &Cube, effort: &mut Effort) -> Result<bool, Interrupted> {
        Ok(self.uncovered_point(c, effort)?.is_none())
    }

    /// An input vector inside `c` where the cover is 0, if any.
    fn uncovered_point(&self, c: &Cube, effort: &mut Effort) -> Result<Option<Cube>, Interrupted> {
        if c.is_empty(self.vars) {
            return Ok(None);
        }
        // The cofactor scans the whole cover: count it, at the rate of the
        // heuristic's own scans, or containment checks against a large
        // cover would run past any budget.
        effort.spend(1 + self.cubes.len() as u64 / 8)?;
        let f = self.cofactor(c);
        Ok(zero_point(&f.cubes, self.vars, effort)?.map(|w| w.and(c)))
    }

    /// Whether `self` is 1 wherever `other` is 1. On failure, an input vector
    /// where `other` is 1 and `self` is 0.
    pub fn covers(
        &self,
        other: &Cover,
        effort: &mut Effort,
    ) -> Result<Option<Vec<bool>>, Interrupted> {
        assert_eq!(self.vars, other.vars, "covers over different inputs");
        // Each cube of `other` is checked against the cubes of `self` that
        // meet it, found by an index rather than a scan of all of `self`.
        let vars = self.vars;
        let index = CubeIndex::new(&self.cubes, vars);
        let (mut meeting, mut f) = (Vec::new(), Vec::new());
        for c in &other.cubes {
            if c.is_empty(vars) {
                continue;
            }
            f.clear();
            let visited = index.cofactors(&self.cubes, c, vars, |_| true, &mut meeting, &mut f);
            effort.spend(1 + visited as u64 / 8)?;
            if let Some(w) = zero_point(&f, vars, effort)? {
                return Ok(w.and(c).point(vars));
            }
        }
        Ok(None)
    }

    /// Whether the two covers agree on every input vector outside the
    /// don't-cares `dc`; on failure, an input vector where they differ.
    ///
    /// ```
    /// use implica_logic::{Cover, Cube, Effort};
    /// // Over 48 inputs: x0 & x1 | !x0 & x2 | x1 & x2 equals x0 & x1 | !x0 & x2
    /// // (the consensus theorem, common practice), and x0 | x2 does not: it
    /// // differs where x0 = 1 and x1 = 0.
    /// let n = 48;
    /// let lit = |i, p| Cube::literal(n, i, p);
    /// let with = Cover { vars: n, cubes: vec![lit(0, true).and(&lit(1, true)), lit(0, false).and(&lit(2, true)), lit(1, true).and(&lit(2, true))] };
    /// let without = Cover { vars: n, cubes: with.cubes[..2].to_vec() };
    /// let mut effort = Effort::new(100_000);
    /// assert_eq!(with.equivalent(&without, &Cover::zero(n), &mut effort).unwrap(), None);
    /// let other = Cover { vars: n, cubes: vec![lit(0, true), lit(2, true)] };
    /// let w = with.equivalent(&other, &Cover::zero(n), &mut effort).unwrap().unwrap();
    /// assert_ne!(with.eval(&w), other.eval(&w));
    /// ```
    pub fn equivalent(
        &self,
        other: &Cover,
        dc: &Cover,
        effort: &mut Effort,
    ) -> Result<Option<Vec<bool>>, Interrupted> {
        if let Some(w) = self.union(dc).covers(other, effort)? {
            return Ok(Some(w));
        }
        other.union(dc).covers(self, effort)
    }

    /// The complement, as a cover.
    pub fn complement(&self, effort: &mut Effort) -> Result<Cover, Interrupted> {
        let mut cubes = complement(&self.cubes, self.vars, effort)?;
        cubes.sort();
        Ok(Cover {
            vars: self.vars,
            cubes,
        })
    }

    /// Whether the function's value depends on variable `i`. On success, an
    /// input vector where flipping `i` flips the value.
    ///
    /// ```
    /// use implica_logic::{Cover, Cube, Effort};
    /// // x3 & x40 | x3 & !x40 over 50 inputs is x3: x40 is vacuous.
    /// let n = 50;
    /// let lit = |i, p| Cube::literal(n, i, p);
    /// let f = Cover { vars: n, cubes: vec![lit(3, true).and(&lit(40, true)), lit(3, true).and(&lit(40, false))] };
    /// let mut effort = Effort::new(100_000);
    /// assert_eq!(f.depends_on(40, &mut effort).unwrap(), None);
    /// let mut w = f.depends_on(3, &mut effort).unwrap().unwrap();
    /// let before = f.eval(&w);
    /// w[3] = !w[3];
    /// assert_ne!(f.eval(&w), before);
    /// assert_eq!(f.support(&mut effort).unwrap(), vec![3]);
    /// ```
    pub fn depends_on(
        &self,
        i: usize,
        effort: &mut Effort,
    ) -> Result<Option<Vec<bool>>, Interrupted> {
        let lo = self.cofactor(&Cube::literal(self.vars, i, false));
        let hi = self.cofactor(&Cube::literal(self.vars, i, true));
        lo.equivalent(&hi, &Cover::zero(self.vars), effort)
    }

    /// The variables the function depends on.
    pub fn support(&self, effort: &mut Effort) -> Result<Vec<usize>, Interrupted> {
        let m = mask(self.vars);
        // A variable no cube has a literal of cannot matter.
        let mentioned = self
            .cubes
            .iter()
            .fold(0u64, |acc, c| acc | (!(c.zero & c.one) & m));
        let mut out = Vec::new();
        for i in 0..self.vars {
            if mentioned >> i & 1 == 1 && self.depends_on(i, effort)?.is_some() {
                out.push(i);
            }
        }
        Ok(out)
    }
}

/// Variables with a positive literal somewhere, and with a negative one.
pub(crate) fn polarities(cubes: &[Cube], m: u64) -> (u64, u64) {
    cubes.iter().fold((0, 0), |(pos, neg), c| {
        (pos | (!c.zero & m), neg | (!c.one & m))
    })
}

/// The variable to split on: the one with literals in the most cubes,
/// ties to the most balanced, among `candidates` (binate ones, when any).
pub(crate) fn split_variable(cubes: &[Cube], vars: usize, candidates: u64) -> usize {
    let m = mask(vars);
    let (mut pos, mut neg) = ([0u32; 64], [0u32; 64]);
    for c in cubes {
        let mut p = !c.zero & m & candidates;
        while p != 0 {
            pos[p.trailing_zeros() as usize] += 1;
            p &= p - 1;
        }
        let mut n = !c.one & m & candidates;
        while n != 0 {
            neg[n.trailing_zeros() as usize] += 1;
            n &= n - 1;
        }
    }
    let mut best_var = candidates.trailing_zeros() as usize;
    let mut best = (0u32, 0u32);
    let mut rest = candidates;
    while rest != 0 {
        let i = rest.trailing_zeros() as usize;
        rest &= rest - 1;
        let key = (pos[i] + neg[i], pos[i].min(neg[i]));
        if key > best {
            best = key;
            best_var = i;
        }
    }
    best_var
}

/// A cube on which the cover is 0 everywhere, or `None` for a tautology.
pub(crate) fn zero_point(
    cubes: &[Cube],
    vars: usize,
    effort: &mut Effort,
) -> Result<Option<Cube>, Interrupted> {
    effort.spend(1 + cubes.len() as u64)?;
    let m = mask(vars);
    let live: Vec<Cube> = cubes
        .iter()
        .copied()
        .filter(|c| !c.is_empty(vars))
        .collect();
    if live.iter().any(|c| c.is_universe(m)) {
        return Ok(None);
    }
    let (pos, neg) = polarities(&live, m);
    let binate = pos & neg;
    if binate == 0 {
        // Unate without the universal cube: every cube has a literal, and
        // setting each variable against its literals makes all of them 0.
        return Ok(Some(Cube {
            zero: m & !neg,
            one: m & !pos,
        }));
    }
    zero_by_split(&live, vars, binate, effort)
}

fn zero_by_split(
    live: &[Cube],
    vars: usize,
    binate: u64,
    effort: &mut Effort,
) -> Result<Option<Cube>, Interrupted> {
    let i = split_variable(live, vars, binate);
    for positive in [true, false] {
        let lit = Cube::literal(vars, i, positive);
        let f: Vec<Cube> = live.iter().filter_map(|c| c.cofactor(&lit, vars)).collect();
        if let Some(w) = zero_point(&f, vars, effort)? {
            return Ok(Some(w.and(&lit)));
        }
    }
    Ok(None)
}

fn complement(cubes: &[Cube], vars: usize, effort: &mut Effort) -> Result<Vec<Cube>, Interrupted> {
    effort.spend(1 + cubes.len() as u64)?;
    let m = mask(vars);
    let live: Vec<Cube> = cubes
        .iter()
        .copied()
        .filter(|c| !c.is_empty(vars))
        .collect();
    if live.is_empty() {
        return Ok(vec![Cube::universe(vars)]);
    }
    if live.iter().any(|c| c.is_universe(m)) {
        return Ok(Vec::new());
    }
    if live.len() == 1 {
        // De Morgan: one cube of the opposite literal per literal.
        let c = live[0];
        let mut out = Vec::new();
        for i in 0..vars {
            if let Some(p) = c.literal_of(i) {
                out.push(Cube::literal(vars, i, !p));
            }
        }
        effort.spend(out.len() as u64)?;
        return Ok(out);
    }
    let (pos, neg) = polarities(&live, m);
    let binate = pos & neg;
    let i = split_variable(&live, vars, if binate != 0 { binate } else { pos | neg });
    let mut halves: Vec<Vec<Cube>> = Vec::with_capacity(2);
    for positive in [true, false] {
        let lit = Cube::literal(vars, i, positive);
        let f: Vec<Cube> = live.iter().filter_map(|c| c.cofactor(&lit, vars)).collect();
        halves.push(complement(&f, vars, effort)?);
    }
    let (mut hi, mut lo) = (halves.swap_remove(0), halves.swap_remove(0));
    hi.sort_unstable();
    lo.sort_unstable();
    // Cubes in both halves do not need the split literal. Each half is free
    // of contained cubes (by induction), and cubes with opposite split
    // literals cannot contain each other, so the only containment left is
    // a one-sided cube inside a shared one.
    let (mut common, mut hi_only, mut lo_only) = (Vec::new(), Vec::new(), Vec::new());
    let (mut a, mut b) = (0, 0);
    while a < hi.len() || b < lo.len() {
        match (hi.get(a), lo.get(b)) {
            (Some(x), Some(y)) if x == y => {
                common.push(*x);
                a += 1;
                b += 1;
            }
            (Some(x), Some(y)) if x < y => {
                hi_only.push(*x);
                a += 1;
            }
            (Some(x), None) => {
                hi_only.push(*x);
                a += 1;
            }
            (_, Some(y)) => {
                lo_only.push(*y);
                b += 1;
            }
            (None, None) => break,
        }
    }
    effort.spend((hi_only.len() + lo_only.len()) as u64 * (1 + common.len() as u64 / 16))?;
    let outside = |c: &Cube| !common.iter().any(|d| d.contains(c));
    let (plit, nlit) = (Cube::literal(vars, i, true), Cube::literal(vars, i, false));
    let mut out = Vec::with_capacity(hi.len() + lo.len());
    out.extend(hi_only.iter().filter(|c| outside(c)).map(|c| c.and(&plit)));
    out.extend(lo_only.iter().filter(|c| outside(c)).map(|c| c.and(&nlit)));
    out.extend_from_slice(&common);
    Ok(out)
}
