//! Cubes in positional notation and covers (sums of products).

use crate::TruthTable;

/// A product term over up to 64 variables in positional notation: two bits
/// per variable, bit `i` of `zero` set when variable `i` may be 0 and bit `i`
/// of `one` set when it may be 1. A variable absent from the term has both;
/// `x` has only `one`, `!x` only `zero`.
#[derive(Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub struct Cube {
    /// Bit `i`: variable `i` may be 0.
    pub zero: u64,
    /// Bit `i`: variable `i` may be 1.
    pub one: u64,
}

impl std::fmt::Debug for Cube {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        write!(f, "Cube({:#x}, {:#x})", self.zero, self.one)
    }
}

fn mask(vars: usize) -> u64 {
    if vars >= 64 {
        u64::MAX
    } else {
        (1u64 << vars) - 1
    }
}

impl Cube {
    /// The cube of every input combination over `vars` variables (the constant 1).
    pub fn universe(vars: usize) -> Cube {
        Cube {
            zero: mask(vars),
            one: mask(vars),
        }
    }

    /// The single minterm `m` over `vars` variables (variable 0 = most significant bit).
    pub fn minterm(vars: usize, m: usize) -> Cube {
        let mut c = Cube { zero: 0, one: 0 };
        for i in 0..vars {
            if (m >> (vars - 1 - i)) & 1 == 1 {
                c.one |= 1 << i;
            } else {
                c.zero |= 1 << i;
            }
        }
        c
    }

    /// The literal of variable `i`, positive or negated, over `vars` variables.
    pub fn literal(vars: usize, i: usize, positive: bool) -> Cube {
        let mut c = Cube::universe(vars);
        if positive {
            c.zero &= !(1 << i);
        } else {
            c.one &= !(1 << i);
        }
        c
    }

    /// Number of literals among the first `vars` variables.
    pub fn literals(&self, vars: usize) -> usize {
        vars - (self.zero & self.one & mask(vars)).count_ones() as usize
    }

    /// Whether the term is empty (some variable may be neither 0 nor 1).
    pub fn is_empty(&self, vars: usize) -> bool {
        (self.zero | self.one) & mask(vars) != mask(vars)
    }

    /// Whether every combination of `other` is in `self`.
    pub fn contains(&self, other: &Cube) -> bool {
        other.zero & !self.zero == 0 && other.one & !self.one == 0
    }

    /// The intersection (possibly empty).
    pub fn and(&self, other: &Cube) -> Cube {
        Cube {
            zero: self.zero & other.zero,
            one: self.one & other.one,
        }
    }

    /// The value of literal `i`: `Some(true)` for `x`, `Some(false)` for `!x`,
    /// `None` when the variable is absent.
    pub fn literal_of(&self, i: usize) -> Option<bool> {
        match ((self.zero >> i) & 1, (self.one >> i) & 1) {
            (0, 1) => Some(true),
            (1, 0) => Some(false),
            _ => None,
        }
    }

    /// Whether the cube contains minterm `m` over `vars` variables.
    pub fn contains_minterm(&self, vars: usize, m: usize) -> bool {
        self.contains(&Cube::minterm(vars, m))
    }

    /// The truth table of the cube over `vars` (≤ [`crate::MAX_VARS`]) variables.
    pub fn truth_table(&self, vars: usize) -> TruthTable {
        if self.is_empty(vars) {
            return TruthTable::zero(vars);
        }
        let mut t = TruthTable::one(vars);
        for i in 0..vars {
            match self.literal_of(i) {
                Some(true) => t = t.and(&TruthTable::var(vars, i)),
                Some(false) => t = t.and_not(&TruthTable::var(vars, i)),
                None => {}
            }
        }
        t
    }
}

/// A sum of products over `vars` variables.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Cover {
    /// The number of variables (at most 64).
    pub vars: usize,
    /// The product terms, in no particular order.
    pub cubes: Vec<Cube>,
}

impl Cover {
    /// The cover of a truth table's rows at 1, one full cube (minterm) each,
    /// in row order: the table as a sum of products, unminimized.
    ///
    /// ```
    /// use implica_logic::{Cover, TruthTable};
    /// let t = TruthTable::from_minterms(3, &[1, 6]);
    /// let c = Cover::from_truth_table(&t);
    /// assert_eq!((c.len(), c.literals()), (2, 6));
    /// assert_eq!(c.truth_table(), t);
    /// ```
    pub fn from_truth_table(t: &TruthTable) -> Cover {
        Cover {
            vars: t.vars(),
            cubes: t
                .minterms()
                .into_iter()
                .map(|m| Cube::minterm(t.vars(), m))
                .collect(),
        }
    }

    /// Number of product terms.
    pub fn len(&self) -> usize {
        self.cubes.len()
    }

    /// Whether the cover has no term (the constant 0).
    pub fn is_empty(&self) -> bool {
        self.cubes.is_empty()
    }

    /// Total literal count.
    pub fn literals(&self) -> usize {
        self.cubes.iter().map(|c| c.literals(self.vars)).sum()
    }

    /// Puts the terms in reading order: by their literals, variable 0
    /// first, a positive literal before a negative one before none.
    pub fn sort_for_reading(&mut self) {
        let vars = self.vars;
        self.cubes.sort_by_cached_key(|c| {
            (0..vars)
                .map(|i| match c.literal_of(i) {
                    Some(true) => 0u8,
                    Some(false) => 1,
                    None => 2,
                })
                .collect::<Vec<u8>>()
        });
    }

    /// The truth table of the sum.
    pub fn truth_table(&self) -> TruthTable {
        self.cubes
            .iter()
            .fold(TruthTable::zero(self.vars), |acc, c| {
                acc.or(&c.truth_table(self.vars))
            })
    }
}
