//! A fast hasher, for the engine's BDD tables and the analysis's tables.

use std::hash::{BuildHasherDefault, Hasher};

/// A hash map with [`FastHasher`].
pub type FastMap<K, V> = std::collections::HashMap<K, V, BuildHasherDefault<FastHasher>>;

/// A hash set with [`FastHasher`].
pub type FastSet<K> = std::collections::HashSet<K, BuildHasherDefault<FastHasher>>;

/// A fast hasher for tables keyed by small integers (BDD nodes and
/// operations), names, texts and truth-table words. The standard one
/// resists adversarial keys; these come from the user's own document, and
/// hashing them with it was half the time of building diagrams and a third
/// of a re-analysis. Bytes are taken eight at a time.
#[derive(Default)]
pub struct FastHasher(u64);

impl FastHasher {
    fn add(&mut self, i: u64) {
        self.0 = (self.0.rotate_left(5) ^ i).wrapping_mul(0x51_7c_c1_b7_27_22_0a_95);
    }
}

impl Hasher for FastHasher {
    fn finish(&self) -> u64 {
        self.0
    }

    fn write(&mut self, bytes: &[u8]) {
        let mut chunks = bytes.chunks_exact(8);
        for c in &mut chunks {
            let mut w = [0u8; 8];
            w.copy_from_slice(c);
            self.add(u64::from_le_bytes(w));
        }
        let mut w = [0u8; 8];
        let rest = chunks.remainder();
        w[..rest.len()].copy_from_slice(rest);
        self.add(u64::from_le_bytes(w) ^ ((rest.len() as u64) << 56));
    }

    fn write_u8(&mut self, i: u8) {
        self.add(u64::from(i));
    }

    fn write_u32(&mut self, i: u32) {
        self.add(u64::from(i));
    }

    fn write_u64(&mut self, i: u64) {
        self.add(i);
    }

    fn write_usize(&mut self, i: usize) {
        self.add(i as u64);
    }
}
