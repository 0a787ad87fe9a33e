//! Bit-parallel truth tables.
//!
//! ```
//! use implica_logic::TruthTable;
//! // a ^ b and (a | b) & !(a & b) over (a, b) agree; a | b differs on row 3.
//! let (a, b) = (TruthTable::var(2, 0), TruthTable::var(2, 1));
//! let x = a.xor(&b);
//! assert_eq!(x.counterexample(&a.or(&b).and_not(&a.and(&b))), None);
//! assert_eq!(x.counterexample(&a.or(&b)), Some(3));
//! assert_eq!(x.support(), vec![0, 1]);
//! ```

/// The most inputs a [`TruthTable`] holds: 2^20 bits = 16,384 words = 128 KiB.
pub const MAX_VARS: usize = 20;

/// A Boolean function of `n` inputs as 2^n bits, 64 to a word. Bit `m` is
/// the value on minterm `m`; variable 0 is the most significant bit of `m`.
///
/// # Panics
///
/// As slices do on an index out of range, a table panics when asked for
/// more than [`MAX_VARS`] inputs, for a variable or minterm it does not
/// have, or for an operation with a table over a different number of
/// inputs: these are mistakes of the caller, not of the data (the analysis
/// checks the inputs of a signal against [`MAX_VARS`] before it builds one).
#[derive(Clone, PartialEq, Eq, Hash)]
pub struct TruthTable {
    vars: usize,
    words: Vec<u64>,
}

impl std::fmt::Debug for TruthTable {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        write!(
            f,
            "TruthTable({} vars, on = {:?})",
            self.vars,
            self.minterms()
        )
    }
}

/// Per bit position `b` < 6 within a word, the bits whose index has bit
/// `b` clear.
pub(crate) const LOW_HALF: [u64; 6] = [
    0x5555_5555_5555_5555,
    0x3333_3333_3333_3333,
    0x0F0F_0F0F_0F0F_0F0F,
    0x00FF_00FF_00FF_00FF,
    0x0000_FFFF_0000_FFFF,
    0x0000_0000_FFFF_FFFF,
];

/// Each bit of `x` exchanged with the bit whose index differs in bit `b` (< 6).
pub(crate) fn swap_bits(x: u64, b: usize) -> u64 {
    let s = 1u32 << b;
    ((x & LOW_HALF[b]) << s) | ((x >> s) & LOW_HALF[b])
}

/// Word `w` of variable `i` (0 = most significant) over `vars` inputs:
/// bit `k` is bit `vars - 1 - i` of the row number `64 * w + k`. Bits past
/// the last row are not masked.
pub(crate) fn var_word(vars: usize, i: usize, w: usize) -> u64 {
    let shift = vars - 1 - i;
    // Within a word, bit k is set when bit `shift` of k is: a fixed
    // pattern for shifts below 6, whole words above.
    const PATTERNS: [u64; 6] = [
        0xAAAA_AAAA_AAAA_AAAA,
        0xCCCC_CCCC_CCCC_CCCC,
        0xF0F0_F0F0_F0F0_F0F0,
        0xFF00_FF00_FF00_FF00,
        0xFFFF_0000_FFFF_0000,
        0xFFFF_FFFF_0000_0000,
    ];
    if shift < 6 {
        PATTERNS[shift]
    } else if (w >> (shift - 6)) & 1 == 1 {
        u64::MAX
    } else {
        0
    }
}

impl TruthTable {
    fn words_for(vars: usize) -> usize {
        assert!(
            vars <= MAX_VARS,
            "a truth table has at most {MAX_VARS} variables"
        );
        (1usize << vars).div_ceil(64)
    }

    /// The mask of valid bits in the last word.
    fn tail_mask(&self) -> u64 {
        let bits = 1usize << self.vars;
        if bits.is_multiple_of(64) {
            u64::MAX
        } else {
            (1u64 << bits) - 1
        }
    }

    /// The constant 0 over `vars` inputs. Panics above [`MAX_VARS`].
    pub fn zero(vars: usize) -> TruthTable {
        TruthTable {
            vars,
            words: vec![0; Self::words_for(vars)],
        }
    }

    /// The constant 1 over `vars` inputs.
    pub fn one(vars: usize) -> TruthTable {
        !&TruthTable::zero(vars)
    }

    /// Variable `i` (0 = most significant) over `vars` inputs.
    pub fn var(vars: usize, i: usize) -> TruthTable {
        assert!(i < vars, "variable {i} of {vars}");
        let mut t = TruthTable::zero(vars);
        for (w, word) in t.words.iter_mut().enumerate() {
            *word = var_word(vars, i, w);
        }
        let last = t.words.len() - 1;
        t.words[last] &= t.tail_mask();
        t
    }

    /// The function that is 1 exactly on `minterms`.
    pub fn from_minterms(vars: usize, minterms: &[usize]) -> TruthTable {
        let mut t = TruthTable::zero(vars);
        for &m in minterms {
            t.set(m, true);
        }
        t
    }

    /// The table's words: bit `m % 64` of word `m / 64` is the value on
    /// minterm `m`; bits past the last minterm are 0.
    pub(crate) fn words(&self) -> &[u64] {
        &self.words
    }

    /// Number of inputs.
    pub fn vars(&self) -> usize {
        self.vars
    }

    /// The value on minterm `m`.
    pub fn get(&self, m: usize) -> bool {
        (self.words[m / 64] >> (m % 64)) & 1 == 1
    }

    /// Sets the value on minterm `m`.
    pub fn set(&mut self, m: usize, value: bool) {
        let bit = 1u64 << (m % 64);
        if value {
            self.words[m / 64] |= bit;
        } else {
            self.words[m / 64] &= !bit;
        }
    }

    /// The minterms where the function is 1, ascending.
    pub fn minterms(&self) -> Vec<usize> {
        let mut out = Vec::with_capacity(self.count_ones());
        for (w, &word) in self.words.iter().enumerate() {
            let mut bits = word;
            while bits != 0 {
                out.push(w * 64 + bits.trailing_zeros() as usize);
                bits &= bits - 1;
            }
        }
        out
    }

    /// How many minterms are 1.
    pub fn count_ones(&self) -> usize {
        self.words.iter().map(|w| w.count_ones() as usize).sum()
    }

    /// Whether the function is 0 everywhere.
    pub fn is_zero(&self) -> bool {
        self.words.iter().all(|&w| w == 0)
    }

    /// Whether the function is 1 everywhere.
    pub fn is_one(&self) -> bool {
        (!self).is_zero()
    }

    /// The value for an input vector, `inputs[0]` being variable 0.
    pub fn eval(&self, inputs: &[bool]) -> bool {
        assert_eq!(inputs.len(), self.vars);
        let m = inputs
            .iter()
            .fold(0usize, |acc, &b| (acc << 1) | usize::from(b));
        self.get(m)
    }

    /// The first minterm where `self` and `other` differ, or `None` when they
    /// are equivalent. Panics if the variable counts differ.
    pub fn counterexample(&self, other: &TruthTable) -> Option<usize> {
        assert_eq!(self.vars, other.vars);
        self.words
            .iter()
            .zip(&other.words)
            .position(|(a, b)| a != b)
            .map(|w| w * 64 + (self.words[w] ^ other.words[w]).trailing_zeros() as usize)
    }

    /// Whether `self` is 1 wherever `other` is 1.
    pub fn covers(&self, other: &TruthTable) -> bool {
        self.words
            .iter()
            .zip(&other.words)
            .all(|(a, b)| b & !a == 0)
    }

    /// The function with input `i` negated: its value on minterm `m` is
    /// this one's on `m` with input `i`'s bit inverted.
    ///
    /// ```
    /// use implica_logic::TruthTable;
    /// // a & !b with b negated is a & b.
    /// let (a, b) = (TruthTable::var(2, 0), TruthTable::var(2, 1));
    /// assert_eq!(a.and_not(&b).flip(1), a.and(&b));
    /// ```
    pub fn flip(&self, i: usize) -> TruthTable {
        assert!(i < self.vars, "variable {i} of {}", self.vars);
        let shift = self.vars - 1 - i;
        let words = if shift < 6 {
            self.words.iter().map(|&w| swap_bits(w, shift)).collect()
        } else {
            // Rows differing in a bit from the seventh up lie in another word.
            let apart = 1usize << (shift - 6);
            (0..self.words.len())
                .map(|w| self.words[w ^ apart])
                .collect()
        };
        TruthTable {
            vars: self.vars,
            words,
        }
    }

    /// The cofactor with variable `i` fixed to `value`, still over `vars` inputs
    /// (it no longer depends on `i`).
    ///
    /// ```
    /// use implica_logic::TruthTable;
    /// // Lift door over (level, stopped, service): open = level & (stopped | service).
    /// let v = |i| TruthTable::var(3, i);
    /// let open = v(0).and(&v(1).or(&v(2)));
    /// assert!(open.eval(&[true, false, true]));
    /// assert!(!open.eval(&[false, true, true]));
    /// // Not level: shut whatever the rest, a constant; level: it still
    /// // depends on `stopped`, not on `level` any more.
    /// assert!(open.cofactor(0, false).is_zero());
    /// let level = open.cofactor(0, true);
    /// assert!(!level.is_zero() && !level.is_one());
    /// assert!(level.depends_on(1) && !level.depends_on(0));
    /// assert_eq!(open.support(), vec![0, 1, 2]);
    /// ```
    pub fn cofactor(&self, i: usize, value: bool) -> TruthTable {
        let side = TruthTable::var(self.vars, i);
        let half = if value {
            self.and(&side)
        } else {
            self.and_not(&side)
        };
        half.or(&half.flip(i))
    }

    /// Whether the function's value depends on variable `i`.
    pub fn depends_on(&self, i: usize) -> bool {
        *self != self.flip(i)
    }

    /// Whether every function that agrees with this one on `care` depends
    /// on variable `i`: two rows of `care` that differ in input `i` alone
    /// have different values. Every sum of products and every product of
    /// sums of such a function then reads input `i`.
    ///
    /// ```
    /// use implica_logic::TruthTable;
    /// // a & b over (a, b), cared for only where a is 1, is b there.
    /// let (a, b) = (TruthTable::var(2, 0), TruthTable::var(2, 1));
    /// let f = a.and(&b);
    /// assert!(f.depends_on_within(1, &a));
    /// assert!(!f.depends_on_within(0, &a));
    /// ```
    pub fn depends_on_within(&self, i: usize, care: &TruthTable) -> bool {
        let both = care.and(&care.flip(i));
        !self.xor(&self.flip(i)).and(&both).is_zero()
    }

    /// The variables the function depends on.
    pub fn support(&self) -> Vec<usize> {
        (0..self.vars).filter(|&i| self.depends_on(i)).collect()
    }

    fn zip(&self, other: &TruthTable, f: impl Fn(u64, u64) -> u64) -> TruthTable {
        assert_eq!(self.vars, other.vars, "truth tables over different inputs");
        let mut t = TruthTable {
            vars: self.vars,
            words: self
                .words
                .iter()
                .zip(&other.words)
                .map(|(&a, &b)| f(a, b))
                .collect(),
        };
        let last = t.words.len() - 1;
        t.words[last] &= t.tail_mask();
        t
    }

    /// `self & other`.
    pub fn and(&self, other: &TruthTable) -> TruthTable {
        self.zip(other, |a, b| a & b)
    }

    /// `self | other`.
    pub fn or(&self, other: &TruthTable) -> TruthTable {
        self.zip(other, |a, b| a | b)
    }

    /// `self ^ other`.
    pub fn xor(&self, other: &TruthTable) -> TruthTable {
        self.zip(other, |a, b| a ^ b)
    }

    /// `self & !other`.
    pub fn and_not(&self, other: &TruthTable) -> TruthTable {
        self.zip(other, |a, b| a & !b)
    }
}

impl std::ops::Not for &TruthTable {
    type Output = TruthTable;

    fn not(self) -> TruthTable {
        let mut t = TruthTable {
            vars: self.vars,
            words: self.words.iter().map(|w| !w).collect(),
        };
        let last = t.words.len() - 1;
        t.words[last] &= self.tail_mask();
        t
    }
}
