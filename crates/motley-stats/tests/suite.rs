//! The crate's integration tests, linked into one binary; each module is one concern.

mod calibration;
mod common;
mod merging;
mod power;
mod reference_values;
mod serde_forms;
