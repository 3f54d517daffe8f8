//! Report folders for motley runs: a Markdown summary a person reads first, `result.json` for
//! scripts, the scenario file for rerunning, and SVG figures, all written atomically.
//!
//! A report folder looks like this:
//!
//! ```text
//! reports/<scenario>/
//!   summary.md          claims, verdicts, tests, effect sizes, estimates, figures, how to reproduce
//!   result.json         serde_json of RunResult (schema motley-result/2), pretty, trailing newline
//!   scenario.yaml       the scenario text as run
//!   figures/
//!     <claim>-ecdf.svg           empirical CDFs with confidence bands against the reference
//!     <claim>-inclusion.svg      per-element inclusion probabilities with interval bars
//!     <claim>-size-law.svg       law of the set size with interval bars
//!     <claim>-probabilities.svg  several event probabilities, against a parameter when labels allow
//!     sample.svg                 one six-vertex sample (≤ 80 × 80), or sample.png + sample-corner.svg
//! ```
//!
//! # Examples
//!
//! ```
//! use motley_report::{write_report, ReportExtras};
//! use motley_scenario::result::{
//!     ClaimKindName, ClaimResult, DecidedBy, Decision, ErrorControl, Estimates, Interval,
//!     RunResult, ScenarioInfo, TestResult, TestRole, Timing, SCHEMA,
//! };
//!
//! let claim = ClaimResult {
//!     id: "fair-coin".into(),
//!     kind: ClaimKindName::Probability,
//!     says: "The coin shows heads with probability 1/2.".into(),
//!     observables: vec!["heads".into()],
//!     decided_by: DecidedBy::MonteCarlo,
//!     rejected: false,
//!     decision: Decision::NotRejected,
//!     level: 0.01,
//!     tolerance: None,
//!     look: None,
//!     verdict: "No evidence against probability 1/2.".into(),
//!     samples: 1000,
//!     tests: vec![TestResult {
//!         name: "binomial test".into(),
//!         statistic: 507.0,
//!         dof: None,
//!         role: TestRole::Deciding,
//!         p_value: 0.68,
//!         adjusted_p_value: 0.68,
//!         rejected: false,
//!         note: String::new(),
//!     }],
//!     effect: None,
//!     exact: None,
//!     stated: None,
//!     estimates: Estimates {
//!         probabilities: vec![Interval {
//!             label: "heads".into(),
//!             successes: 507,
//!             trials: 1000,
//!             estimate: 0.507,
//!             wilson_lower: 0.4760,
//!             wilson_upper: 0.5379,
//!             exact_lower: 0.4755,
//!             exact_upper: 0.5384,
//!         }],
//!         ..Estimates::default()
//!     },
//! };
//! let result = RunResult {
//!     schema: SCHEMA.into(),
//!     motley_version: "0.1.0".into(),
//!     git_commit: "unknown".into(),
//!     scenario: ScenarioInfo {
//!         name: "coin".into(),
//!         title: "A fair coin".into(),
//!         description: "Checks a coin.".into(),
//!         hash: "0".repeat(64),
//!         seed: 7,
//!         samples: 1000,
//!         alpha: 0.01,
//!         power: 0.8,
//!         error_control: ErrorControl::PerClaim,
//!     },
//!     timing: Timing { wall_seconds: 0.1, threads: 1, samples_per_second: 1e4, shards: 1 },
//!     claims: vec![claim],
//!     sequential: None,
//! };
//! let tmp = tempfile::tempdir()?;
//! let dir = tmp.path().join("reports").join("coin");
//! let extras = ReportExtras::new("name: coin\n", vec!["motley".into(), "run".into(), "coin.yaml".into()]);
//! write_report(&dir, &result, &extras, false)?;
//! let summary = std::fs::read_to_string(dir.join("summary.md"))?;
//! assert!(summary.contains("not rejected at α = 0.01"));
//! // A second run must not silently replace the first.
//! assert!(write_report(&dir, &result, &extras, false).is_err());
//! write_report(&dir, &result, &extras, true)?;
//! # Ok::<(), Box<dyn std::error::Error>>(())
//! ```
//!
//! # Errors
//! Every failure is a [`ReportError`] naming the path concerned; an existing report is replaced only
//! when asked ([`ReportError::Exists`] otherwise), and a folder that does not look like a report is never
//! replaced ([`ReportError::NotAReport`]).
//!
//! # Reproducibility
//! The files depend only on the [`RunResult`](motley_scenario::result::RunResult) and the
//! [`ReportExtras`]: no clock, no randomness, no hash-map order. `result.json` is exactly
//! `serde_json::to_string_pretty(result)` plus a newline, so two runs that agree on the result agree
//! byte for byte; `summary.md` differs between them only in the wall-time line.

#![deny(missing_docs)]

mod atomic;
mod chart;
mod error;
mod extras;
mod figures;
mod format;
mod heatmap;
mod law_table;
mod palette;
mod picture_draw;
mod report;
mod side;
mod summary;

pub use atomic::{
    abandon_staging, check_destination, probe_destination, write_file_atomic, write_folder_atomic,
    write_json_atomic, WRITTEN,
};
pub use error::ReportError;
pub use extras::ReportExtras;
pub use motley_scenario::picture::Picture;
pub use picture_draw::{PNG_LIMIT, SVG_LIMIT};
pub use report::{files, write_report};
pub use summary::verdict_line;
