//! The crate's integration tests, linked into one binary; each module is one concern.

mod color_position;
mod common;
mod hitting_times;
mod line_published;
mod monte_carlo_exact;
mod properties;
mod ring_stationary;
mod sparse_exact;
mod tracy_widom_trend;
