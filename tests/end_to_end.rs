//! The end-to-end tests, one binary: each module runs the real `motley` binary on scenarios.

mod bad_scenarios;
mod combined_observables;
mod committed_reports;
mod common;
mod interruption;
mod output_safety;
mod reproducibility;
mod result_schema;
mod small_inputs;
mod theory_series;
mod worked_scenarios;
