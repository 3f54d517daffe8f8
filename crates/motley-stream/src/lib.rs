//! The random-stream layout shared by every motley engine.
//!
//! # Reproducibility
//! Sample `i` of a scenario with seed `s` draws all of its randomness from one ChaCha8 generator keyed
//! by `(s, i)`: the 32-byte key is `s` (8 bytes, little-endian) ‖ `i` (8 bytes, little-endian) ‖ 16 zero
//! bytes. Inside that key, ChaCha's 64-bit stream number and 32-bit word position address every random
//! word directly, so what a sample draws never depends on the order in which it is computed, the
//! thread that computes it, or the shard it belongs to. Each engine documents which streams and words it
//! uses; the layout is frozen by value-stability tests, and changing it is a results-changing change
//! (see CHANGELOG.md).
//!
//! Probabilities are decided on 32-bit words: an event of probability `p` happens when the word `u`
//! satisfies `u < round(p · 2³²)` ([`Chance`]). This is exact for `p = 0` and `p = 1` and within 2⁻³³ of
//! `p` otherwise.
//!
//! # Examples
//! ```
//! use motley_stream::{sample_stream, Chance};
//! use rand_core::Rng;
//!
//! // Word 5 of stream 3 of sample 7 under seed 42, reached directly ...
//! let mut direct = sample_stream(42, 7, 3);
//! direct.set_word_pos(5);
//! let w = direct.next_u32();
//! // ... equals the sixth word drawn in order.
//! let mut seq = sample_stream(42, 7, 3);
//! for _ in 0..5 { seq.next_u32(); }
//! assert_eq!(seq.next_u32(), w);
//!
//! let half = Chance::new(0.5).unwrap();
//! assert!(half.happens(0) && !half.happens(u32::MAX));
//! ```
#![deny(missing_docs)]

mod chance;
mod key;

pub use chance::{Chance, ChanceError};
pub use key::{sample_key, sample_stream};
pub use rand_chacha::ChaCha8Rng;
