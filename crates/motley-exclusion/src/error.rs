//! Errors of the exclusion engine's constructors and plan checks (one variant per cause).

use motley_colorblind::{Color, ColorblindError};
use thiserror::Error;

/// What can go wrong when building a process, a read-out plan or an exact solver.
#[derive(Debug, Clone, PartialEq, Error)]
pub enum ExclusionError {
    /// A jump rate that is NaN or infinite.
    #[error("rate `{name}` must be finite, got {value}")]
    RateNotFinite {
        /// `p` or `q`.
        name: &'static str,
        /// The value given.
        value: f64,
    },
    /// A negative jump rate.
    #[error("rate `{name}` must be ≥ 0, got {value}")]
    RateNegative {
        /// `p` or `q`.
        name: &'static str,
        /// The value given.
        value: f64,
    },
    /// Both rates zero: nothing would ever move.
    #[error("rates `p` and `q` are both 0; at least one must be positive (TASEP: p > 0, q = 0)")]
    RatesBothZero,
    /// A segment or ring needs at least two sites.
    #[error("a {lattice} needs at least 2 sites, got {sites}")]
    TooFewSites {
        /// `segment` or `ring`.
        lattice: &'static str,
        /// The number of sites given.
        sites: usize,
    },
    /// A read-out time that is negative or not finite.
    #[error("read-out time must be finite and ≥ 0, got {0}")]
    BadTime(f64),
    /// Read-out times must increase strictly.
    #[error("read-out times must increase strictly: time #{index} is {value}, after {previous}")]
    TimesNotIncreasing {
        /// Position of the offending time.
        index: usize,
        /// Its value.
        value: f64,
        /// The time before it.
        previous: f64,
    },
    /// A plan with no read-out time.
    #[error("a read-out plan needs at least one time")]
    NoTimes,
    /// A site outside the lattice.
    #[error("site {site} is outside the lattice (sites {first}..={last})")]
    SiteOutside {
        /// The site.
        site: i64,
        /// First site of the lattice.
        first: i64,
        /// Last site of the lattice.
        last: i64,
    },
    /// A bond outside the lattice.
    #[error("bond ({site}, {site}+1) is not a bond of the lattice (left ends {first}..={last})")]
    BondOutside {
        /// Left end of the bond.
        site: i64,
        /// Smallest left end.
        first: i64,
        /// Largest left end.
        last: i64,
    },
    /// A window whose end lies before its start, or that is too long.
    #[error("window [{from}, {to}] must have from ≤ to and at most {max} sites")]
    BadWindow {
        /// First site.
        from: i64,
        /// Last site.
        to: i64,
        /// Longest window allowed.
        max: u64,
    },
    /// A read-out that follows one particle needs a color present exactly once.
    #[error("color {color} must occur exactly once in the initial data, found {count} times")]
    ColorNotUnique {
        /// The color.
        color: Color,
        /// How often it occurs (`u64::MAX`: infinitely often, it is a far-field color).
        count: u64,
    },
    /// A read-out about two particles given the same color twice.
    #[error("read-out `{readout}` needs two different colors, got {color} twice")]
    SameColor {
        /// The read-out's name.
        readout: &'static str,
        /// The color given twice.
        color: Color,
    },
    /// A threshold of 0 would count holes as particles.
    #[error("a current or height threshold must be ≥ 1 (colors ≥ c count as particles), got 0")]
    ZeroThreshold,
    /// The height at a site counts particles to its right, which must be finitely many.
    #[error("height with threshold {threshold} is infinite: the far-right color {right} is ≥ {threshold}")]
    InfiniteHeight {
        /// The threshold.
        threshold: Color,
        /// The far-right color.
        right: Color,
    },
    /// Positions of a far-field color are infinitely many.
    #[error("color {0} fills a half-line of the initial data; its positions cannot be listed")]
    FarFieldColor(Color),
    /// The permutation read-out needs packed data: colors 1..=n each exactly once.
    #[error("the permutation read-out needs packed data (colors 1..={sites} each once) on a segment or ring")]
    NotPacked {
        /// Number of sites.
        sites: usize,
    },
    /// The read-out is not defined on this lattice.
    #[error("read-out `{readout}` is not available on {lattice}")]
    NotOnLattice {
        /// The read-out's name.
        readout: &'static str,
        /// The lattice.
        lattice: &'static str,
    },
    /// The explicit block of line data must not be empty.
    #[error("the explicit block of line data must hold at least one site")]
    EmptyBlock,
    /// A site given twice in a list of special particles.
    #[error("site {0} is given twice")]
    DuplicateSite(i64),
    /// The exact solver handles small systems only.
    #[error("exact laws are limited to {max} sites, got {sites}")]
    TooManySitesForExact {
        /// Sites given.
        sites: usize,
        /// The limit.
        max: usize,
    },
    /// The exact solver's state space would be too large.
    #[error("exact laws are limited to {max} arrangements, this system reaches more")]
    TooManyStates {
        /// The limit.
        max: usize,
    },
    /// The sparse exact solver's state space is above its limit.
    #[error("this exact law needs {} arrangements of the (merged) colors, above the limit of {max}; merge more colors (read fewer classes) or use Monte Carlo", .states.map_or("more than 2^64".to_string(), |s| s.to_string()))]
    ExactStatesAbove {
        /// Arrangements needed (`None`: more than `u64::MAX`).
        states: Option<u64>,
        /// The limit.
        max: u64,
    },
    /// The sparse exact solver would need more memory than allowed.
    #[error("this exact law needs about {} MiB, above the limit of {} MiB; merge more colors (read fewer classes) or use Monte Carlo", .bytes / (1 << 20), .max / (1 << 20))]
    ExactMemoryAbove {
        /// Bytes estimated.
        bytes: u64,
        /// The limit.
        max: u64,
    },
    /// A stationary law asked of a lattice or rates this engine cannot treat that way.
    #[error("{0}")]
    NoStationaryLaw(&'static str),
    /// A truncation bound outside (0, 1).
    #[error("the truncation bound must lie in (0, 1), got {0}")]
    BadTolerance(f64),
    /// A class outside `1..=classes` (class constructors).
    #[error("class {class} is outside 0..={classes} (0 = hole)")]
    ClassOutside {
        /// The class.
        class: u32,
        /// Number of classes.
        classes: u32,
    },
    /// An error from the relabeling or projection layer.
    #[error(transparent)]
    Colorblind(#[from] ColorblindError),
}
