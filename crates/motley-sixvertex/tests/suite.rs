//! The crate's integration tests, linked into one binary; each module is one concern.

mod color_position_symmetry;
mod common;
mod exact_heights;
mod exact_sizes;
mod exit_speed;
mod kernels;
mod limit_shape;
mod mean_height_band;
mod monte_carlo_vs_exact;
mod permutation_symmetry;
mod properties;
mod q_moment;
mod shift_invariance;
mod value_stability;
