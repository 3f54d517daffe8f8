//! Key derivation: one ChaCha8 key per (scenario seed, sample index).

use rand_chacha::ChaCha8Rng;
use rand_core::SeedableRng;

/// The 32-byte ChaCha8 key of sample `index` under scenario seed `seed`:
/// `seed` LE ‖ `index` LE ‖ 16 zero bytes.
pub fn sample_key(seed: u64, index: u64) -> [u8; 32] {
    let mut key = [0u8; 32];
    key[..8].copy_from_slice(&seed.to_le_bytes());
    key[8..16].copy_from_slice(&index.to_le_bytes());
    key
}

/// The generator for stream `stream` of sample `index`, positioned at word 0.
///
/// The stream is set right after seeding, before any word is drawn (see the crate docs).
pub fn sample_stream(seed: u64, index: u64, stream: u64) -> ChaCha8Rng {
    let mut rng = ChaCha8Rng::from_seed(sample_key(seed, index));
    rng.set_stream(stream);
    rng.set_word_pos(0);
    rng
}

#[cfg(test)]
mod tests {
    use super::*;
    use rand_core::Rng;

    /// Value stability: these words freeze the key layout and rand_chacha's ChaCha8 output.
    /// They were produced by this code (rand_chacha 0.10.0) when the layout was fixed; any change
    /// here is a results-changing change.
    #[test]
    fn frozen_words() {
        let mut r = sample_stream(1, 2, 3);
        let words: Vec<u32> = (0..4).map(|_| r.next_u32()).collect();
        assert_eq!(words, FROZEN);
    }

    const FROZEN: [u32; 4] = [2875993226, 1016781388, 2618372854, 3245618412];

    #[test]
    fn streams_and_samples_differ() {
        let a = sample_stream(1, 2, 3).next_u64();
        assert_ne!(a, sample_stream(1, 2, 4).next_u64());
        assert_ne!(a, sample_stream(1, 3, 3).next_u64());
        assert_ne!(a, sample_stream(2, 2, 3).next_u64());
    }
}
