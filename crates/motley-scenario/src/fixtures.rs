//! Scenarios for the crate's unit tests.

use crate::Scenario;

/// The file name [`tiny`] is loaded under.
pub(crate) const TINY_FILE: &str = "tiny.yaml";

/// Scenario `tiny`: one 5 × 4 six-vertex model `rect` with rainbow colors 1..=4 entering on the left,
/// 100 samples, seed 3, one describe claim.
pub(crate) fn tiny() -> Scenario {
    let text = "
name: tiny
seed: 3
samples: 100
models:
  rect:
    six-vertex: {width: 5, height: 4, b1: 0.4, b2: 0.6, left: rainbow, bottom: empty}
observables:
  top:
    of: rect
    read: {top: colors}
claims:
  - id: look
    describe: top
";
    crate::load_str(text, TINY_FILE).unwrap()
}

/// Scenario [`tiny`] decided by Monte Carlo (`exact: off`), so that its plan has a slot to fill.
pub(crate) fn tiny_sampled() -> Scenario {
    let text = "
name: tiny-sampled
seed: 3
samples: 100
exact: off
models:
  rect:
    six-vertex: {width: 5, height: 4, b1: 0.4, b2: 0.6, left: rainbow, bottom: empty}
observables:
  top:
    of: rect
    read: {top: colors}
  h:
    of: rect
    read: {height: {x: 3, y: 4}}
claims:
  - id: look
    describe: top
  - id: height
    describe: h
";
    crate::load_str(text, TINY_FILE).unwrap()
}
