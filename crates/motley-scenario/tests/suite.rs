//! The crate's integration tests, linked into one binary; each module is one concern.

mod calibration;
mod fuzz_loader;
mod guide;
mod no_catch_all;
mod partial_fuzz;
