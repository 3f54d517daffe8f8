//! Colorblind projections and set observables shared by every motley model.
//!
//! A *colored configuration* is a slice of colors ([`Color`], an integer ≥ 0) indexed by position:
//! the colors on a row of vertical edges of the six-vertex model, or the classes on the sites of an
//! exclusion process. This crate is model-agnostic: it knows nothing of vertices or jumps.
//!
//! # Color convention
//! Color `0` means "nothing here" (no path, a hole). Among nonzero colors, **a larger color is
//! stronger**. Every engine of motley reads colors this way. A scenario that wants the opposite order
//! (class 1 strongest, as is usual for multi-species exclusion) goes through [`Relabel`], never through a
//! second code path.
//!
//! # What is here
//! - [`Projection`]: colored → colorblind by a threshold, or any order-preserving merge of colors.
//! - [`Relabel`]: an order-reversing relabeling between "class" and "color" conventions.
//! - [`ElementSet`]: a random set over `{1, …, n}` stored as a bit set; built by
//!   [`colors_present`] ("which colors are found here") or [`occupied_positions`] ("which positions are
//!   occupied"), summarised by [`Summary`] (size, min, max, sum).
//! - [`IndexMap`]: maps that line two sets up (identity, reflection `k ↦ n + 1 − k`, shift).
//!
//! # Examples
//! ```
//! use motley_colorblind::{colors_present, occupied_positions, IndexMap, Projection, Summary};
//!
//! // Colors leaving through four edges; 0 = no path.
//! let top = [0, 3, 1, 0];
//! let colors = colors_present(&top, 3).unwrap();
//! assert_eq!(colors.elements(), vec![1, 3]);
//!
//! // Colorblind view: colors ≥ 2 become paths.
//! let blind = Projection::threshold(2).apply_slice(&top).unwrap();
//! assert_eq!(blind, vec![0, 1, 0, 0]);
//! let occupied = occupied_positions(&blind);
//! assert_eq!(occupied.elements(), vec![2]);
//!
//! // Reflect {1, 3} inside {1, 2, 3}: {1, 3} again; summaries of the result.
//! let reflected = IndexMap::Reflection.apply(&colors, 3).unwrap();
//! assert_eq!(reflected.elements(), vec![1, 3]);
//! assert_eq!(Summary::of(&reflected).sum, 4);
//! ```
#![deny(missing_docs)]

mod element_set;
mod error;
mod index_map;
mod observe;
mod projection;
mod relabel;
mod summary;

pub use element_set::ElementSet;
pub use error::ColorblindError;
pub use index_map::IndexMap;
pub use observe::{colors_present, occupied_positions, push_colors, push_positions_at_least};
pub use projection::Projection;
pub use relabel::Relabel;
pub use summary::{Summary, SummaryKind};

/// A color (or class) on an edge or site. `0` is "empty"; a larger color is stronger.
pub type Color = u32;
