//! Scenario files for motley: load, validate, run, and the machine-readable result.
//!
//! A scenario names models, observables read from them, and claims about the observables. Loading
//! goes in two stages (as the style guide asks): the raw form ([`raw`]) mirrors the YAML and rejects
//! unknown keys; [`validate`](mod@validate) checks every range and resolves every name into a
//! [`Scenario`]. Every error names the file, line, column and key path.
//!
//! # Examples
//! ```
//! let text = "
//! name: tiny
//! seed: 1
//! samples: 1000
//! models:
//!   rect:
//!     six-vertex: {width: 2, height: 2, b1: 0.5, b2: 0.5, left: rainbow, bottom: empty}
//! observables:
//!   top:
//!     of: rect
//!     read: {top: colors}
//! claims:
//!   - id: look
//!     describe: top
//! ";
//! let s = motley_scenario::load_str(text, "tiny.yaml").unwrap();
//! assert_eq!(s.models.len(), 1);
//!
//! let bad = text.replace("b1: 0.5", "b1: 1.5");
//! let e = motley_scenario::load_str(&bad, "tiny.yaml").unwrap_err();
//! assert!(e.first_line().starts_with("tiny.yaml:7:"));
//! assert!(e.first_line().contains("`models.rect.six-vertex.b1`: must be a probability in [0, 1], got 1.5"));
//! ```
#![deny(missing_docs)]
// A `ScenarioError` carries the file, position, key path, message and hint by value; it is built
// once, on the cold path of a refused scenario, so boxing it would only add noise.
#![allow(clippy::result_large_err)]

pub mod accumulate;
mod checker;
pub mod combination;
pub mod confirm;
pub mod cost;
pub mod error;
pub mod estimate;
pub mod evaluate;
pub mod evaluate_series;
mod exact_decide;
mod exclusion_classes;
mod exclusion_family;
mod exclusion_unit;
pub mod family;
pub mod finish;
#[cfg(test)]
mod fixtures;
pub mod load;
pub mod locate;
pub mod number_text;
pub mod partial_check;
pub mod picture;
pub mod plan;
pub mod raw;
mod read_set;
pub mod reference_law;
mod resolve_read;
pub mod result;
pub mod run;
pub mod scenario;
pub mod sequential;
mod six_vertex_family;
mod six_vertex_unit;
mod suggest;
mod table_law;
pub mod unit;
pub mod validate;
mod validate_series;
pub mod verdict;

pub use error::ScenarioError;
pub use load::load_str;
pub use scenario::Scenario;

/// motley's version, recorded in every result and partial.
pub const VERSION: &str = env!("CARGO_PKG_VERSION");
