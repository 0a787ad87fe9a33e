//! Test and benchmark support shared by the workspace's crates (a
//! dev-dependency only): a small seeded generator, so that generated test
//! data and benchmark inputs are the same on every run and a failing case
//! repeats.

/// Marsaglia's xorshift64 generator, shifts 13, 7 and 17 ("Xorshift RNGs",
/// Journal of Statistical Software 8(14), 2003). The seed must not be 0.
#[derive(Debug, Clone)]
pub struct Rng(pub u64);

impl Rng {
    /// The next value.
    #[allow(clippy::should_implement_trait)] // an endless generator, not an iterator
    pub fn next(&mut self) -> u64 {
        self.0 ^= self.0 << 13;
        self.0 ^= self.0 >> 7;
        self.0 ^= self.0 << 17;
        self.0
    }

    /// A value in `0..n` (`n` > 0).
    pub fn below(&mut self, n: u64) -> u64 {
        self.next() % n
    }

    /// A value in `lo..=hi`.
    pub fn range(&mut self, lo: u64, hi: u64) -> u64 {
        lo + self.next() % (hi - lo + 1)
    }
}

#[cfg(test)]
mod tests {
    use super::Rng;

    #[test]
    fn the_sequence_is_xorshift64() {
        // From the seed 1: 1 ^ 1 << 13 = 8193; 8193 ^ 8193 >> 7 = 8257;
        // 8257 ^ 8257 << 17 = 1082269761 (worked by hand).
        let mut r = Rng(1);
        assert_eq!(r.next(), 1_082_269_761);
        let mut a = Rng(0x5EED);
        let mut b = Rng(0x5EED);
        assert!((0..100).all(|_| a.next() == b.next()));
        assert!((0..100).all(|_| a.range(3, 5) <= 5 && b.below(7) < 7));
    }
}
