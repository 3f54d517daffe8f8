//! Reference laws and limit shapes to hold simulations of interacting particle systems against:
//! the Tracy–Widom distributions F₂ (GUE) and F₁ (GOE), the TASEP/ASEP step profile, the
//! six-vertex step-boundary limit shape with its Tracy–Widom fluctuation scale, the exact q-moments
//! E[q^H] of the six-vertex step-boundary height function on a grid, and the limit laws of
//! second-class particles. Pure numerics: no I/O, no dependency on the simulators.
//!
//! # Examples
//! ```
//! use motley_reference::{second_class_speed_half_width, SixVertexFluctuation, SixVertexStep, TasepStepFluctuation,
//!     TasepStep, TracyWidom};
//!
//! // Scale a TASEP particle count at t = 1000 and evaluate F₂ there.
//! let scaling = TasepStepFluctuation::new(TasepStep::tasep(), 0.0).unwrap();
//! let s = scaling.scaled(255.0, 1000.0);
//! let f2 = TracyWidom::gue();
//! assert!(s < -1.0 && f2.cdf(s) > 0.6 && f2.cdf(s) < 0.8); // F₂(−1.26)
//!
//! // F₂ moments are known (Bornemann 2010): the mean is −1.7710868074.
//! let mean: f64 = {
//!     let gl = motley_reference::GaussLegendre::new(40);
//!     (0..24).map(|i| { let a = -10.0 + i as f64; gl.integrate(a, a + 1.0, |x| x * f2.pdf(x)) }).sum()
//! };
//! assert!((mean + 1.771_086_807_4).abs() < 1e-8);
//!
//! // The six-vertex limit shape and its fluctuation scale at a point of the curved region.
//! let model = SixVertexStep::from_weights(0.3, 0.6).unwrap();
//! let point = SixVertexFluctuation::new(model, 1.0, 1.0).unwrap();
//! assert!(point.sigma() > 0.0);
//!
//! // The second-class particle of ASEP from step data moves at a speed uniform on [−(p − q), p − q].
//! assert_eq!(second_class_speed_half_width(1.0, 0.25).unwrap(), 0.75);
//! ```
//!
//! # Errors
//! Constructors check their parameters once and return [`ReferenceError`]; evaluations cannot
//! fail (outside their natural domain they return the obvious limits, documented per function).
//!
//! # Precision
//! Tracy–Widom CDFs: absolute error below 1e-14 on [−8, 6] (target 1e-10), survival functions
//! with relative error about 1e-13 in the right tail; see [`TracyWidom`]. Reference values in the
//! tests come from an independent Painlevé II computation (mpmath 1.3.0, script in `scripts/`)
//! and from Bornemann's published moments. The closed-form laws are exact up to rounding.
//!
//! # Reproducibility
//! Everything is deterministic: no randomness, tables built by the same arithmetic on every run.
//!
//! # Sources
//! Tracy and Widom (1994, 1996); Bornemann (2010, Math. Comp. 79; 2010, Markov Processes Relat.
//! Fields 16); Ferrari and Spohn (2005); Rost (1981); Johansson (2000); Tracy and Widom (2009,
//! ASEP); Borodin, Corwin and Gorin (2016); Borodin and Gorin (2019, Ann. Probab. 47); Ferrari
//! and Kipnis (1995); Amir, Angel and Valkó (2011); Ferrari, Gonçalves and Martin (2009).

#![deny(missing_docs)]

mod airy;
mod chebyshev;
mod error;
mod fredholm;
mod gauss_legendre;
mod kpz_scaling;
mod second_class;
mod six_vertex_q_moment;
mod six_vertex_step;
mod speed_process;
mod tasep_step;
mod tracy_widom;

pub use airy::{airy, AI_0, AI_PRIME_0};
pub use error::ReferenceError;
pub use gauss_legendre::GaussLegendre;
pub use kpz_scaling::{SixVertexFluctuation, TasepStepFluctuation};
pub use second_class::{
    asep_collision_probability, second_class_speed_half_width, TASEP_SWAP_PROBABILITY,
};
pub use six_vertex_q_moment::SixVertexQMoments;
pub use six_vertex_step::SixVertexStep;
pub use speed_process::SpeedProcessPair;
pub use tasep_step::TasepStep;
pub use tracy_widom::{TracyWidom, TracyWidomKind};
