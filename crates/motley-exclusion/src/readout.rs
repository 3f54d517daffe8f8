//! Read-outs at chosen times: what a sample reports, and the plan that says what to report when.
//!
//! A [`ReadoutPlan`] is built by a process ([`crate::FiniteProcess::plan`],
//! [`crate::LineProcess::plan`]), which checks every read-out against the initial data once; the
//! samplers then cannot fail. Each read-out is resolved into what the loops need: a tracker slot for
//! currents, heights and attempts, the initial order for swaps.
//!
//! # Height function
//! For a threshold `c ≥ 1`, with `J_c(x, t)` the net number of particles of color `≥ c` that crossed
//! the bond `(x, x+1)` from left to right during `[0, t]`,
//! `h_c(x, t) = h_c(x, 0) + J_c(x, t)` with `h_c(x, 0) = #{y > x : color₀(y) ≥ c}` (on the segment
//! and ring `y` runs over `x+1..=n`; on `Z` over all `y > x`, finite only when the far-right color is
//! `< c`). On the segment and on `Z` this equals `#{y > x : color_t(y) ≥ c}` at every time, because
//! particles are conserved; on the ring it is the usual lifted height (`h_c(x) − h_c(x')` counts the
//! particles in `(x, x']`).
//!
//! # Hitting times and displacements
//! [`Readout::SwapTime`] and [`Readout::FirstAttemptTime`] are first times along the path, answered
//! by [`Reading::Time`]: at read-out time `t`, the first time if it is `≤ t`, else `t` marked
//! censored. [`Readout::Displacement`] is the unwrapped displacement of one particle. The definitions
//! (overtaking on the ring included) and how the times are drawn are in the crate docs.

use std::cmp::Ordering;
use std::hash::{Hash, Hasher};

use motley_colorblind::Color;

use crate::observer::{HitKind, Tracker};
use crate::ExclusionError;

/// Longest window a read-out may ask for.
pub const MAX_WINDOW: u64 = 1 << 24;

/// One thing to read at every read-out time.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum Readout {
    /// The colors at sites `from..=to`.
    Window {
        /// First site.
        from: i64,
        /// Last site.
        to: i64,
    },
    /// The sites holding `color`, increasing.
    Positions {
        /// The color followed.
        color: Color,
    },
    /// Packed data on a segment or ring: the class at each site (position → class, class 1
    /// strongest, i.e. class `n + 1 − color`).
    Permutation,
    /// `J_c`: net number of particles of color `≥ threshold` that crossed bond `(bond, bond+1)` left
    /// to right (on the ring bond `n` is `(n, 1)`).
    Current {
        /// Left end of the bond.
        bond: i64,
        /// The threshold `c ≥ 1`.
        threshold: Color,
    },
    /// The height `h_c(site, t)` defined in the module docs.
    Height {
        /// The site `x`.
        site: i64,
        /// The threshold `c ≥ 1`.
        threshold: Color,
    },
    /// Whether the two (unique) colors are now in the opposite order from time 0 (order of site
    /// numbers; on the ring, as seen from the cut between sites `n` and `1`).
    ///
    /// On the ring this compares site numbers, not overtaking: a particle crossing the bond
    /// `(n, 1)` changes the order of site numbers without passing anyone, and two overtakings in a
    /// row leave it unchanged. For the first overtaking on the ring use [`Readout::SwapTime`].
    Swapped {
        /// One color.
        a: Color,
        /// The other.
        b: Color,
    },
    /// Whether the particle of color `from` ever attempted a jump onto the site of color `onto`
    /// during `[0, t]`, successful or not (a rate-`p` attempt on a bond is its left occupant
    /// trying to jump right, a rate-`q` attempt its right occupant trying to jump left).
    Attempted {
        /// The particle attempting.
        from: Color,
        /// The particle jumped onto.
        onto: Color,
    },
    /// The first time the two (unique, different) colors `a` and `b` are in the opposite order
    /// from time 0, answered by [`Reading::Time`] (censored at the read-out time if not yet).
    ///
    /// On the segment and on `Z`: the first time the order of their site numbers flips. On the ring:
    /// the first time one has overtaken the other. With unwrapped positions `X = s + D` (initial site
    /// `s`, unwrapped displacement `D` as in [`Readout::Displacement`]) and `Δ = X_a − X_b`, which is
    /// never a multiple of `n`, `a` and `b` have swapped at time `t` when `⌊Δ(t)/n⌋ ≠ ⌊Δ(0)/n⌋`, i.e.
    /// when `Δ` has crossed a multiple of `n`. (On the segment `|Δ| < n`, so the same formula is the
    /// flip of the order there.) On every lattice this first happens exactly at the first exchange of
    /// `a` and `b` with each other: moves against other colors change `Δ` by `±1` and cannot cross a
    /// multiple of `n` (they would put `a` and `b` on one site), an exchange of the two changes it by
    /// `±2` across one.
    SwapTime {
        /// One color.
        a: Color,
        /// The other.
        b: Color,
    },
    /// The first time the particle of color `from` attempts a jump onto the site of color `onto`,
    /// successful or not (attempts as in [`Readout::Attempted`]), answered by [`Reading::Time`]
    /// (censored at the read-out time if not yet). `Attempted` is `true` at `t` exactly when this is
    /// not censored at `t`.
    FirstAttemptTime {
        /// The particle attempting.
        from: Color,
        /// The particle jumped onto.
        onto: Color,
    },
    /// The net number of steps the particle of a unique color has moved since time 0 (a step right,
    /// `x → x + 1`, counts `+1`, a step left `−1`; on the ring a step across the bond `(n, 1)` from
    /// `n` to `1` counts `+1` and is not reduced mod `n`), answered by [`Reading::Count`]. On the
    /// segment and on `Z` it is the current site minus the initial site.
    Displacement {
        /// The color followed.
        color: Color,
    },
}

impl Readout {
    /// A short name for messages.
    pub fn name(&self) -> &'static str {
        match self {
            Readout::Window { .. } => "window",
            Readout::Positions { .. } => "positions",
            Readout::Permutation => "permutation",
            Readout::Current { .. } => "current",
            Readout::Height { .. } => "height",
            Readout::Swapped { .. } => "swapped",
            Readout::Attempted { .. } => "attempted",
            Readout::SwapTime { .. } => "swap-time",
            Readout::FirstAttemptTime { .. } => "first-attempt-time",
            Readout::Displacement { .. } => "displacement",
        }
    }
}

/// The value of one read-out at one time.
///
/// Equality, order and hashing are structural, with times compared by [`f64::total_cmp`] (so
/// `Eq`, `Ord` and `Hash` agree; the engine never reports a NaN or `−0.0` time). Variants order as
/// listed.
#[derive(Debug, Clone)]
pub enum Reading {
    /// Colors of a window.
    Colors(Vec<Color>),
    /// Sites.
    Positions(Vec<i64>),
    /// Classes by site (permutation read-out).
    Classes(Vec<u32>),
    /// A current or a height.
    Count(i64),
    /// A yes/no read-out.
    Flag(bool),
    /// A hitting time read at time `t`: the first time of the event if it is `≤ t`
    /// (`censored = false`), else `time = t` and `censored = true`.
    Time {
        /// The hitting time, or the read-out time if censored.
        time: f64,
        /// Whether the event had not happened by the read-out time.
        censored: bool,
    },
}

/// What [`Reading`]'s comparisons see: the same variants, a time as its `total_cmp` key.
#[derive(PartialEq, Eq, Hash, PartialOrd, Ord)]
enum ReadingKey<'a> {
    Colors(&'a [Color]),
    Positions(&'a [i64]),
    Classes(&'a [u32]),
    Count(i64),
    Flag(bool),
    Time(i64, bool),
}

impl Reading {
    /// The colors of a window reading.
    pub fn colors(&self) -> Option<&[Color]> {
        match self {
            Reading::Colors(c) => Some(c),
            Reading::Positions(_)
            | Reading::Classes(_)
            | Reading::Count(_)
            | Reading::Flag(_)
            | Reading::Time { .. } => None,
        }
    }

    /// The sites of a positions reading.
    pub fn positions(&self) -> Option<&[i64]> {
        match self {
            Reading::Positions(p) => Some(p),
            Reading::Colors(_)
            | Reading::Classes(_)
            | Reading::Count(_)
            | Reading::Flag(_)
            | Reading::Time { .. } => None,
        }
    }

    /// The value of a count (current, height, displacement).
    pub fn count(&self) -> Option<i64> {
        match self {
            Reading::Count(v) => Some(*v),
            Reading::Colors(_)
            | Reading::Positions(_)
            | Reading::Classes(_)
            | Reading::Flag(_)
            | Reading::Time { .. } => None,
        }
    }

    /// The value of a yes/no reading.
    pub fn flag(&self) -> Option<bool> {
        match self {
            Reading::Flag(f) => Some(*f),
            Reading::Colors(_)
            | Reading::Positions(_)
            | Reading::Classes(_)
            | Reading::Count(_)
            | Reading::Time { .. } => None,
        }
    }

    /// The time of a first-time reading (the read-out time when censored).
    pub fn time(&self) -> Option<f64> {
        match self {
            Reading::Time { time, .. } => Some(*time),
            Reading::Colors(_)
            | Reading::Positions(_)
            | Reading::Classes(_)
            | Reading::Count(_)
            | Reading::Flag(_) => None,
        }
    }

    fn key(&self) -> ReadingKey<'_> {
        match self {
            Reading::Colors(c) => ReadingKey::Colors(c),
            Reading::Positions(p) => ReadingKey::Positions(p),
            Reading::Classes(c) => ReadingKey::Classes(c),
            Reading::Count(v) => ReadingKey::Count(*v),
            Reading::Flag(f) => ReadingKey::Flag(*f),
            Reading::Time { time, censored } => {
                // The order of `f64::total_cmp` as an integer: flip the magnitude bits of negatives.
                let bits = time.to_bits() as i64;
                ReadingKey::Time(bits ^ (((bits >> 63) as u64) >> 1) as i64, *censored)
            }
        }
    }
}

impl PartialEq for Reading {
    fn eq(&self, other: &Self) -> bool {
        self.key() == other.key()
    }
}

impl Eq for Reading {}

impl Hash for Reading {
    fn hash<H: Hasher>(&self, state: &mut H) {
        self.key().hash(state);
    }
}

impl PartialOrd for Reading {
    fn partial_cmp(&self, other: &Self) -> Option<Ordering> {
        Some(self.cmp(other))
    }
}

impl Ord for Reading {
    fn cmp(&self, other: &Self) -> Ordering {
        self.key().cmp(&other.key())
    }
}

/// Everything one sample reports.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Readings {
    /// `values[k][j]`: read-out `j` of the plan at time `k`.
    pub values: Vec<Vec<Reading>>,
    /// Number of attempted exchanges performed (including attempts on equal colors).
    pub attempts: u64,
    /// On `Z`: the sites `[lo, hi)` outside which the configuration still equals the far-field
    /// colors at the last read-out time (the active region); `None` on finite lattices.
    pub active_region: Option<(i64, i64)>,
}

/// The shape a plan was checked against.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(crate) enum Target {
    Finite(crate::FiniteLattice, usize),
    Line,
}

/// A read-out resolved against the initial data.
#[derive(Debug, Clone, PartialEq, Eq)]
pub(crate) enum Resolved {
    Window(i64, i64),
    Positions(Color),
    Permutation,
    /// Tracker slot.
    Current(usize),
    /// Tracker slot and `h_c(x, 0)`.
    Height(usize, i64),
    /// The two colors and whether `a` started left of `b`.
    Swapped(Color, Color, bool),
    /// Tracker slot.
    Attempted(usize),
    /// Tracker slot of the event.
    HitTime(usize),
    /// Tracker slot.
    Displacement(usize),
}

/// Read-out times and read-outs, checked against one process.
#[derive(Debug, Clone, PartialEq)]
pub struct ReadoutPlan {
    times: Vec<f64>,
    readouts: Vec<Readout>,
    pub(crate) resolved: Vec<Resolved>,
    pub(crate) tracker: Tracker,
    pub(crate) target: Target,
}

impl ReadoutPlan {
    /// The read-out times, increasing.
    pub fn times(&self) -> &[f64] {
        &self.times
    }

    /// The read-outs, in the order of each time's readings.
    pub fn readouts(&self) -> &[Readout] {
        &self.readouts
    }
}

/// The view of a configuration that plans and readings need: finite or on `Z`.
pub(crate) trait SiteView {
    /// Name for messages.
    fn lattice_name(&self) -> &'static str;
    /// Sites `first..=last`, or `None` on `Z`.
    fn site_range(&self) -> Option<(i64, i64)>;
    /// Left ends of bonds `first..=last`, or `None` on `Z`.
    fn bond_range(&self) -> Option<(i64, i64)>;
    /// The color at site `x` (inside the lattice).
    fn color(&self, x: i64) -> Color;
    /// The sites holding `c`, increasing (`c` not a far-field color).
    fn positions(&self, c: Color) -> Vec<i64>;
    /// How many sites hold `c` (`u64::MAX`: infinitely many).
    fn count(&self, c: Color) -> u64;
    /// `#{y > x : color(y) ≥ c}`.
    fn count_right_of(&self, x: i64, c: Color) -> Result<i64, ExclusionError>;
    /// Whether the data are packed (colors 1..=n each once on a finite lattice).
    fn is_packed(&self) -> bool;
}

fn check_times(times: &[f64]) -> Result<(), ExclusionError> {
    if times.is_empty() {
        return Err(ExclusionError::NoTimes);
    }
    for (i, &t) in times.iter().enumerate() {
        if !t.is_finite() || t < 0.0 {
            return Err(ExclusionError::BadTime(t));
        }
        if i > 0 && t <= times[i - 1] {
            return Err(ExclusionError::TimesNotIncreasing {
                index: i,
                value: t,
                previous: times[i - 1],
            });
        }
    }
    Ok(())
}

fn unique(view: &dyn SiteView, c: Color) -> Result<(), ExclusionError> {
    match view.count(c) {
        1 => Ok(()),
        count => Err(ExclusionError::ColorNotUnique { color: c, count }),
    }
}

fn check_site(view: &dyn SiteView, x: i64) -> Result<(), ExclusionError> {
    match view.site_range() {
        Some((first, last)) if x < first || x > last => Err(ExclusionError::SiteOutside {
            site: x,
            first,
            last,
        }),
        _ => Ok(()),
    }
}

/// Checks `readouts` against the initial data in `view` and resolves them.
pub(crate) fn build_plan(
    view: &dyn SiteView,
    target: Target,
    times: &[f64],
    readouts: Vec<Readout>,
) -> Result<ReadoutPlan, ExclusionError> {
    check_times(times)?;
    let mut tracker = Tracker::default();
    let mut resolved = Vec::with_capacity(readouts.len());
    for r in &readouts {
        let item = match *r {
            Readout::Window { from, to } => {
                if to < from || (to - from) as u64 >= MAX_WINDOW {
                    return Err(ExclusionError::BadWindow {
                        from,
                        to,
                        max: MAX_WINDOW,
                    });
                }
                check_site(view, from)?;
                check_site(view, to)?;
                Resolved::Window(from, to)
            }
            Readout::Positions { color } => {
                if view.count(color) == u64::MAX {
                    return Err(ExclusionError::FarFieldColor(color));
                }
                Resolved::Positions(color)
            }
            Readout::Permutation => {
                if view.site_range().is_none() {
                    return Err(ExclusionError::NotOnLattice {
                        readout: r.name(),
                        lattice: view.lattice_name(),
                    });
                }
                if !view.is_packed() {
                    let (first, last) = view.site_range().unwrap_or((1, 0));
                    return Err(ExclusionError::NotPacked {
                        sites: (last - first + 1) as usize,
                    });
                }
                Resolved::Permutation
            }
            Readout::Current { bond, threshold }
            | Readout::Height {
                site: bond,
                threshold,
            } => {
                if threshold == 0 {
                    return Err(ExclusionError::ZeroThreshold);
                }
                let is_height = matches!(r, Readout::Height { .. });
                if is_height {
                    check_site(view, bond)?;
                } else if let Some((first, last)) = view.bond_range() {
                    if bond < first || bond > last {
                        return Err(ExclusionError::BondOutside {
                            site: bond,
                            first,
                            last,
                        });
                    }
                }
                // On the segment, the "bond" to the right of site n does not exist and carries
                // no current; the height there is 0.
                let slot = tracker.currents.len();
                tracker.currents.push((bond, threshold, 0));
                if is_height {
                    Resolved::Height(slot, view.count_right_of(bond, threshold)?)
                } else {
                    Resolved::Current(slot)
                }
            }
            Readout::Swapped { a, b } => {
                unique(view, a)?;
                unique(view, b)?;
                let pa = view.positions(a)[0];
                let pb = view.positions(b)[0];
                Resolved::Swapped(a, b, pa < pb)
            }
            Readout::Attempted { from, onto } => {
                unique(view, from)?;
                unique(view, onto)?;
                let slot = tracker.attempts.len();
                tracker.attempts.push((from, onto, false));
                Resolved::Attempted(slot)
            }
            Readout::SwapTime { a, b } => {
                unique(view, a)?;
                unique(view, b)?;
                if a == b {
                    return Err(ExclusionError::SameColor {
                        readout: r.name(),
                        color: a,
                    });
                }
                Resolved::HitTime(tracker.add_hit(HitKind::Swap(a, b)))
            }
            Readout::FirstAttemptTime { from, onto } => {
                unique(view, from)?;
                unique(view, onto)?;
                Resolved::HitTime(tracker.add_hit(HitKind::Attempt(from, onto)))
            }
            Readout::Displacement { color } => {
                unique(view, color)?;
                tracker.displacements.push((color, 0));
                Resolved::Displacement(tracker.displacements.len() - 1)
            }
        };
        resolved.push(item);
    }
    Ok(ReadoutPlan {
        times: times.to_vec(),
        readouts,
        resolved,
        tracker,
        target,
    })
}

/// The readings of `plan` at read-out time `time` on the configuration `view` with tracker state
/// `tracker`.
pub(crate) fn read(
    view: &dyn SiteView,
    plan: &ReadoutPlan,
    tracker: &Tracker,
    time: f64,
) -> Vec<Reading> {
    plan.resolved
        .iter()
        .map(|r| match *r {
            Resolved::Window(from, to) => {
                Reading::Colors((from..=to).map(|x| view.color(x)).collect())
            }
            Resolved::Positions(c) => Reading::Positions(view.positions(c)),
            Resolved::Permutation => {
                let (first, last) = view.site_range().unwrap_or((1, 0));
                let n = (last - first + 1) as u32;
                Reading::Classes((first..=last).map(|x| n + 1 - view.color(x)).collect())
            }
            Resolved::Current(slot) => Reading::Count(tracker.currents[slot].2),
            Resolved::Height(slot, h0) => Reading::Count(h0 + tracker.currents[slot].2),
            Resolved::Swapped(a, b, a_left) => {
                let pa = view.positions(a)[0];
                let pb = view.positions(b)[0];
                Reading::Flag((pa < pb) != a_left)
            }
            Resolved::Attempted(slot) => Reading::Flag(tracker.attempts[slot].2),
            Resolved::HitTime(slot) => match tracker.hits[slot].1 {
                Some(hit) => Reading::Time {
                    time: hit,
                    censored: false,
                },
                None => Reading::Time {
                    time,
                    censored: true,
                },
            },
            Resolved::Displacement(slot) => Reading::Count(tracker.displacements[slot].1),
        })
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn times_are_checked() {
        assert_eq!(check_times(&[]), Err(ExclusionError::NoTimes));
        assert!(check_times(&[0.0, 1.0, 2.5]).is_ok());
        assert!(matches!(
            check_times(&[1.0, 1.0]),
            Err(ExclusionError::TimesNotIncreasing { index: 1, .. })
        ));
        assert_eq!(check_times(&[-1.0]), Err(ExclusionError::BadTime(-1.0)));
        assert!(check_times(&[f64::INFINITY]).is_err());
    }

    #[test]
    fn time_readings_compare_by_total_order() {
        let t = |time: f64, censored: bool| Reading::Time { time, censored };
        assert_eq!(t(1.5, false), t(1.5, false));
        assert_ne!(t(1.5, false), t(1.5, true));
        assert_ne!(t(1.5, false), t(1.5 + 1e-15, false));
        assert!(t(0.25, true) < t(0.5, false));
        assert!(t(1.0, false) < t(1.0, true));
        assert!(t(-2.0, false) < t(-1.0, false));
        assert!(t(-1.0, false) < t(0.0, false));
        // total_cmp puts −0.0 before +0.0; the integer key must agree everywhere.
        for (x, y) in [(-0.0, 0.0), (-3.5, 2.0), (1e-300, 1e300), (-1e300, -1e-300)] {
            assert_eq!(t(x, false).cmp(&t(y, false)), x.total_cmp(&y));
            assert_eq!(t(y, false).cmp(&t(x, false)), y.total_cmp(&x));
        }
        // Variants keep their order: every earlier variant sorts before a time.
        assert!(Reading::Flag(true) < t(0.0, false));
        assert!(Reading::Count(5) < Reading::Flag(false));
    }
}
