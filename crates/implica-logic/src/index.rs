//! An index of a cover's cubes by their values on a few variables, so that
//! the cubes that may meet a given cube are found without scanning the
//! whole cover. Containment checks, irredundant and reduce each cofactor a
//! cover by one cube after another; only the cubes meeting that cube have a
//! cofactor, and on covers of thousands of cubes with many literals each
//! they are a small share.

use crate::Cube;
use crate::urp::mask;

/// Most index variables: 2^12 buckets.
const MAX_INDEX_VARS: usize = 12;

/// Cube positions bucketed by their values on the index variables: a cube
/// free on some index variables is in the bucket of each of their values.
pub(crate) struct CubeIndex {
    index_vars: Vec<usize>,
    buckets: Vec<Vec<u32>>,
}

impl CubeIndex {
    /// Indexes `cubes` over `vars` variables on up to one index variable
    /// per doubling of the cubes past 16, those with the most literals
    /// first, as long as the copies of cubes free on them stay under four
    /// per cube.
    pub(crate) fn new(cubes: &[Cube], vars: usize) -> CubeIndex {
        let m = mask(vars);
        let mut with_literal = vec![0usize; vars];
        for c in cubes {
            let mut lits = !(c.zero & c.one) & m;
            while lits != 0 {
                with_literal[lits.trailing_zeros() as usize] += 1;
                lits &= lits - 1;
            }
        }
        let mut order: Vec<usize> = (0..vars).collect();
        order.sort_by_key(|&i| std::cmp::Reverse(with_literal[i]));
        let mut index_vars = Vec::new();
        let mut copies = vec![1u64; cubes.len()];
        for v in order {
            if index_vars.len() == MAX_INDEX_VARS || 16usize << index_vars.len() >= cubes.len() {
                break;
            }
            let free = |c: &Cube| ((c.zero & c.one) >> v) & 1 == 1;
            let total: u64 = cubes
                .iter()
                .zip(&copies)
                .map(|(c, &k)| if free(c) { 2 * k } else { k })
                .sum();
            if total > 4 * cubes.len() as u64 {
                continue;
            }
            for (c, k) in cubes.iter().zip(copies.iter_mut()) {
                if free(c) {
                    *k *= 2;
                }
            }
            index_vars.push(v);
        }
        let mut index = CubeIndex {
            buckets: vec![Vec::new(); 1 << index_vars.len()],
            index_vars,
        };
        for (p, c) in cubes.iter().enumerate() {
            if let Some((fixed, free)) = index.keys(c) {
                each_key(fixed, free, |k| index.buckets[k].push(p as u32));
            }
        }
        index
    }

    /// The bits of the keys of `c`: those its literals fix, and those it
    /// leaves free; `None` when it is empty in an index variable.
    fn keys(&self, c: &Cube) -> Option<(usize, usize)> {
        let (mut fixed, mut free) = (0usize, 0usize);
        for (bit, &v) in self.index_vars.iter().enumerate() {
            match ((c.zero >> v) & 1, (c.one >> v) & 1) {
                (0, 1) => fixed |= 1 << bit,
                (1, 0) => {}
                (1, 1) => free |= 1 << bit,
                _ => return None,
            }
        }
        Some((fixed, free))
    }

    /// The positions of every indexed cube that may meet `c` (a superset
    /// of those that do), ascending and once each, into `out` (cleared
    /// first).
    pub(crate) fn meeting(&self, c: &Cube, out: &mut Vec<u32>) {
        out.clear();
        // Empty in an index variable: `c` meets nothing.
        let Some((fixed, free)) = self.keys(c) else {
            return;
        };
        each_key(fixed, free, |k| out.extend_from_slice(&self.buckets[k]));
        if free != 0 {
            out.sort_unstable();
            out.dedup();
        }
    }
}

impl CubeIndex {
    /// Appends to `out` the cofactors by `c` of the cubes `cubes[j]` (the
    /// cubes indexed, or those cubes shrunk since: a cube shrunk keeps the
    /// literals it had, so it stays where it was indexed) that meet it and
    /// have `take(j)`, in cover order; `meeting` is scratch. Returns how
    /// many cubes were visited, for the caller's budget.
    pub(crate) fn cofactors(
        &self,
        cubes: &[Cube],
        c: &Cube,
        vars: usize,
        take: impl Fn(usize) -> bool,
        meeting: &mut Vec<u32>,
        out: &mut Vec<Cube>,
    ) -> usize {
        self.meeting(c, meeting);
        out.extend(
            meeting
                .iter()
                .map(|&j| j as usize)
                .filter(|&j| take(j))
                .filter_map(|j| cubes[j].cofactor(c, vars)),
        );
        meeting.len()
    }
}

/// Calls `f` with every key that agrees with `fixed` outside `free`.
fn each_key(fixed: usize, free: usize, mut f: impl FnMut(usize)) {
    let mut sub = free;
    loop {
        f(fixed | sub);
        if sub == 0 {
            break;
        }
        sub = (sub - 1) & free;
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Every cube that meets the query is among those the index gives.
    #[test]
    fn the_index_finds_every_cube_that_meets_the_query() {
        let vars = 10;
        let mut state = 0x2545_F491_4F6C_DD1Du64;
        let mut next = move || {
            state ^= state << 13;
            state ^= state >> 7;
            state ^= state << 17;
            state
        };
        let mut random_cube = |literals: usize| {
            let mut c = Cube::universe(vars);
            for _ in 0..literals {
                let i = (next() % vars as u64) as usize;
                let positive = next() & 1 == 1;
                if c.literal_of(i).is_none() {
                    c = c.and(&Cube::literal(vars, i, positive));
                }
            }
            c
        };
        let cubes: Vec<Cube> = (0..3_000).map(|k| random_cube(2 + k % 9)).collect();
        let index = CubeIndex::new(&cubes, vars);
        assert!(!index.index_vars.is_empty());
        let mut found = Vec::new();
        let (mut visited, mut narrow) = (0, 0);
        for k in 0..300 {
            let q = random_cube(k % 8);
            index.meeting(&q, &mut found);
            if q.literals(vars) >= 5 {
                visited += found.len();
                narrow += 1;
            }
            let meets: Vec<u32> = (0..cubes.len() as u32)
                .filter(|&p| !cubes[p as usize].and(&q).is_empty(vars))
                .collect();
            assert!(
                meets.iter().all(|p| found.binary_search(p).is_ok()),
                "query {k}"
            );
            assert!(found.windows(2).all(|w| w[0] < w[1]));
        }
        // It is worth having: for a query of 5 or more of the 10 literals,
        // fewer than all the cubes are visited (these random cubes of 2 to
        // 10 literals meet such a query about half the time).
        assert!(
            narrow > 0 && visited < narrow * cubes.len() * 3 / 4,
            "{visited} for {narrow}"
        );
    }
}
