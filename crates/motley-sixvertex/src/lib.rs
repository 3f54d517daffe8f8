//! The colored stochastic six-vertex model on a rectangle: a seeded row-by-row sampler with
//! read-outs, its colorblind projections, and exact laws of small rectangles.
//!
//! # Conventions
//! - **Rectangle.** `W` columns `x = 1..=W` (left to right) × `H` rows `y = 1..=H` (bottom to top).
//!   Vertex `(x, y)` has one edge entering from below, one from the left, one leaving up and one
//!   leaving right. Paths go up and right. A large enough rectangle is the quadrant.
//! - **Colors.** Every edge carries a [`Color`] (`u32`); 0 = no path; **a larger color is stronger**
//!   (the convention of [`motley_colorblind`]). A scenario wanting the opposite order relabels.
//! - **Boundary.** `left[y]` is the color entering row `y` from the left, `bottom[x]` the color
//!   entering column `x` from below ([`Boundary`], [`Side`]): rainbow, step, empty, explicit lists,
//!   blocks, or random Bernoulli(ρ) occupation with a [`ColorRule`].
//! - **Local rule.** Color `i` from below and `j` from the left. If `i = j` both go straight. If
//!   `i > j`: with probability `b1` color `i` continues up (and `j` goes right), else `i` turns right
//!   (and `j` goes up). If `j > i`: with probability `b2` color `j` continues right (and `i` goes up),
//!   else `j` turns up (and `i` goes right). A lone path (the other color 0) is the case of a
//!   stronger color meeting 0, so the colorblind model (colors 0/1) is the stochastic six-vertex model
//!   where a path from below goes up with probability `b1` and a path from the left goes right with
//!   probability `b2`.
//! - **Height function** ([`HeightQuery`]): `H(a, b)` = paths crossing the
//!   horizontal line `b + ½` right of `a + ½` plus paths leaving through the right side in rows
//!   `≤ b`. Under the step boundary, `H(0, b) = b`, `H(a, 0) = 0`, and `H(a, b)` is the number of
//!   paths crossing the vertical line `a + ½` in rows `1..=b`. A threshold `t` counts only colors
//!   `≥ t` (the height of the colorblind projection at `t`).
//!
//! # Reproducibility
//! Sample `i` of a scenario with seed `s` uses the streams of [`motley_stream::sample_stream`]`(s, i,
//! ·)`:
//! - **stream `y` (`1 ≤ y ≤ H`), word `x − 1`**: the one uniform 32-bit word of vertex `(x, y)`. The
//!   stronger color goes straight iff [`motley_stream::Chance::happens`] on that word for `b1` (from
//!   below) or `b2` (from the left). Each row's words are generated in bulk from its own stream, and
//!   a vertex's word never depends on the processing order, so a kernel sweeping several rows at once
//!   reads the same words.
//! - **stream 0**: random boundary edges; the left edge of row `y` uses word `y − 1`, the bottom edge
//!   of column `x` uses word `H + x − 1`.
//!
//! Nothing depends on the thread or the order in which samples are drawn; value-stability tests
//! freeze this layout (changing it is results-changing).
//!
//! # The basic coupling
//! A colorblind run is the same engine on projected boundary data ([`Model::project`]). A projection
//! (threshold or order-preserving merge, [`motley_colorblind::Projection`]) keeps the order of two
//! colors it keeps apart and merges equal colors, and the decision at a vertex depends only on which
//! incoming color is stronger and on the vertex's word. So the projection of a colored sample equals,
//! edge for edge, the sample of the projected model on the same seed and index.
//!
//! # Kernel
//! The reference kernel sweeps rows one at a time with O(W) state (the vertical colors), in
//! `sweep.rs`: one small branch-free vertex function (arithmetic masks; an empty `asm!` block stops
//! LLVM from turning the masks back into branches) and a row loop around it. [`Model::sample`] uses
//! the strip kernel of `strip.rs` instead whenever no read-out needs every horizontal edge (vertical
//! lines, the whole configuration): strips of rows swept as a wavefront along anti-diagonals, with
//! AVX2 intrinsics (16 rows of `u16` colors, `strip_avx2.rs`) when the processor has it and the
//! colors fit, else a portable build (32, 16 or 8 rows of `u8`, `u16` or `u32` colors, the
//! narrowest that holds the boundary's colors). A strip ends at every row a read-out records (horizontal lines,
//! heights). Tests check both kernels bit for bit on the same words; the state stays O(W).
//!
//! # Exact laws
//! [`exact_law`] gives the joint law of (top exits, right exits) as an [`ExactLaw`] sorted by
//! [`Outcome`], in rationals ([`num_rational::BigRational`], via [`ratio`]) or `f64`. Every read-out
//! of the exits, projection or set observable follows by [`ExactLaw::map`]. [`exact_law_with_heights`]
//! adds the joint law of a list of [`HeightQuery`] values, and [`exact_height_law`] gives the heights
//! alone on the coarsest colors that determine them.
//!
//! # Examples
//! ```
//! use motley_sixvertex::{exact_law, ratio, Boundary, HeightQuery, Model, ReadoutSpec};
//! use motley_colorblind::{occupied_positions, Projection};
//!
//! // Rainbow from the left on 4 columns × 3 rows.
//! let boundary = Boundary::rainbow(4, 3)?;
//! let model = Model::new(0.3, 0.6, boundary.clone())?;
//! let mut out = model.readout(ReadoutSpec {
//!     heights: vec![HeightQuery::all(2, 3)],
//!     ..ReadoutSpec::default()
//! })?;
//! model.sample(42, 0, &mut out);
//! // Colors are conserved: 1, 2, 3 leave through the top or the right.
//! let mut exits: Vec<u32> = out.top().iter().chain(out.right()).copied().filter(|&c| c > 0).collect();
//! exits.sort();
//! assert_eq!(exits, vec![1, 2, 3]);
//!
//! // The colorblind model on the same seed is the projection of the colored sample.
//! let blind = model.project(&Projection::threshold(2))?;
//! let blind_exits = blind.sample_exits(42, 0);
//! assert_eq!(blind_exits.top, Projection::threshold(2).apply_slice(out.top())?);
//!
//! // Exact law of the set of columns where a path leaves the top.
//! let law = exact_law(ratio(3, 10), ratio(3, 5), &boundary)?;
//! let occupied = law.map(|o| occupied_positions(&o.top));
//! assert_eq!(occupied.total(), ratio(1, 1));
//! # Ok::<(), Box<dyn std::error::Error>>(())
//! ```
//!
//! # Errors
//! Constructors return [`SixVertexError`]; once a [`Model`] and its [`Readout`] exist, sampling cannot
//! fail.
#![deny(missing_docs)]

mod boundary;
mod configuration;
mod error;
mod exact;
mod exclusion_view;
mod law;
mod model;
mod outcome;
mod readout;
mod strip;
mod strip_avx2;
mod sweep;
mod weight;
mod weights;

pub use boundary::{Boundary, ColorRule, Edge, Side};
pub use configuration::Configuration;
pub use error::SixVertexError;
pub use exact::{exact_height_law, exact_law, exact_law_with_heights, EXACT_STATE_LIMIT};
pub use law::ExactLaw;
pub use model::Model;
pub use motley_colorblind::Color;
pub use outcome::Outcome;
pub use readout::{HeightQuery, Readout, ReadoutSpec};
#[doc(hidden)]
pub use strip::Kernel;
pub use weight::{ratio, Weight};
#[doc(hidden)]
pub use weights::VertexRule;
pub use weights::VertexWeights;
