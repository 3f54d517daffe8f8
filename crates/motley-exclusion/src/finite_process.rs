//! Multi-species ASEP on a segment or ring: the sampler.
//!
//! # Reproducibility
//! Sample `index` under `seed` uses two streams of [`motley_stream::sample_stream`]`(seed, index, ·)`:
//! - stream 0, *counts*: for each interval `(t_{k−1}, t_k]` between read-out times (`t_0 = 0`) of
//!   positive length, the number of attempts `N_k ~ Poisson(B (p + q)(t_k − t_{k−1}))` (`B` bonds),
//!   drawn in order by `rand_distr` 0.6's `Poisson<f64>` from the stream's words (an interval of
//!   length 0 draws nothing);
//! - stream 1, *attempts*: the words of the attempts in order, per attempt one bond word (more only on
//!   a Lemire rejection, probability < B / 2³²) and, when both `p > 0` and `q > 0`, one direction word;
//! - stream 2, *attempt times* ([`TIME_STREAM`]), opened only when the plan holds a hitting-time
//!   read-out ([`Readout::SwapTime`], [`Readout::FirstAttemptTime`]): the times of the attempts of each
//!   interval as the order statistics of `N_k` uniforms on `(t_{k−1}, t_k]`, drawn in increasing
//!   order, one 64-bit value (two words, low first) per attempt, from the first attempt on and only
//!   while some hitting time of the plan is still unknown (see `observer::OrderClock`).
//!
//! Streams 0 and 1 are read exactly as they were before stream 2 existed, whatever the plan holds:
//! stream 2 is a separate stream, and the observer that follows hitting times and displacements only
//! reads the configuration. So every other read-out of a sample is the same with or without
//! hitting-time or displacement read-outs in the plan. Given the attempt count of an interval, the
//! attempts' order statistics are independent of which bonds and directions they pick, so attaching
//! them afterwards gives the ASEP's attempt times exactly in law.
//!
//! Attempts form a Poisson process of rate `B (p + q)`, each on a uniform bond with direction right
//! with probability `p / (p + q)`: this is the ASEP exactly in law (direction probabilities are
//! realised to within 2⁻³³, see [`motley_stream::Chance`]). None of these draws depends on the
//! configuration, so colored and colorblind runs with the same seed are coupled pathwise.

use motley_colorblind::{Color, Projection};
use motley_stream::sample_stream;
use rand_distr::{Distribution, Poisson};

use crate::kernel;
use crate::observer::{Clocked, OrderClock, Silent, Tracker};
use crate::readout::{build_plan, read, SiteView, Target};
use crate::words::Words;
use crate::{ExclusionError, FiniteLattice, FiniteSystem, Rates, Readings, Readout, ReadoutPlan};

/// Stream of the Poisson numbers of attempts.
pub const COUNT_STREAM: u64 = 0;
/// Stream of the attempts' words.
pub const ATTEMPT_STREAM: u64 = 1;
/// Stream of the attempt times, read only for hitting-time read-outs.
pub const TIME_STREAM: u64 = 2;

/// Multi-species ASEP on a finite lattice.
#[derive(Debug, Clone, PartialEq)]
pub struct FiniteProcess {
    system: FiniteSystem,
    rates: Rates,
}

struct FiniteView<'a> {
    lattice: FiniteLattice,
    colors: &'a [Color],
}

impl SiteView for FiniteView<'_> {
    fn lattice_name(&self) -> &'static str {
        self.lattice.name()
    }
    fn site_range(&self) -> Option<(i64, i64)> {
        Some((1, self.colors.len() as i64))
    }
    fn bond_range(&self) -> Option<(i64, i64)> {
        Some((1, self.lattice.bonds(self.colors.len()) as i64))
    }
    fn color(&self, x: i64) -> Color {
        self.colors[(x - 1) as usize]
    }
    fn positions(&self, c: Color) -> Vec<i64> {
        (1..=self.colors.len() as i64)
            .filter(|&x| self.color(x) == c)
            .collect()
    }
    fn count(&self, c: Color) -> u64 {
        self.colors.iter().filter(|&&d| d == c).count() as u64
    }
    fn count_right_of(&self, x: i64, c: Color) -> Result<i64, ExclusionError> {
        Ok(self.colors[x as usize..]
            .iter()
            .filter(|&&d| d >= c)
            .count() as i64)
    }
    fn is_packed(&self) -> bool {
        FiniteSystem::new(self.lattice, self.colors.to_vec()).is_ok_and(|s| s.is_packed())
    }
}

impl FiniteProcess {
    /// The process with initial data `system` and rates `rates`.
    pub fn new(system: FiniteSystem, rates: Rates) -> Self {
        FiniteProcess { system, rates }
    }

    /// The initial data.
    pub fn system(&self) -> &FiniteSystem {
        &self.system
    }

    /// The rates.
    pub fn rates(&self) -> Rates {
        self.rates
    }

    /// The same process started from the projected initial data. With the same seed, its sample
    /// is the projection of this process's sample, at every time (pathwise coupling).
    ///
    /// # Errors
    /// [`ExclusionError::Colorblind`] if a merge table does not cover a color.
    pub fn project(&self, projection: &Projection) -> Result<Self, ExclusionError> {
        Ok(FiniteProcess {
            system: self.system.project(projection)?,
            rates: self.rates,
        })
    }

    fn view<'a>(&self, colors: &'a [Color]) -> FiniteView<'a> {
        FiniteView {
            lattice: self.system.lattice(),
            colors,
        }
    }

    /// Checks read-outs against this process's initial data.
    ///
    /// # Errors
    /// Bad times ([`ExclusionError::NoTimes`], [`ExclusionError::BadTime`],
    /// [`ExclusionError::TimesNotIncreasing`]), a site or bond outside the lattice, a followed color
    /// not present exactly once, a zero threshold, the permutation read-out on non-packed data.
    pub fn plan(
        &self,
        times: &[f64],
        readouts: Vec<Readout>,
    ) -> Result<ReadoutPlan, ExclusionError> {
        let target = Target::Finite(self.system.lattice(), self.system.len());
        build_plan(&self.view(self.system.colors()), target, times, readouts)
    }

    /// Sample `index` under `seed`: the plan's read-outs at each of its times.
    ///
    /// # Panics
    /// If `plan` was built for a lattice of another kind or size.
    pub fn sample(&self, seed: u64, index: u64, plan: &ReadoutPlan) -> Readings {
        assert_eq!(
            plan.target,
            Target::Finite(self.system.lattice(), self.system.len()),
            "read-out plan built for another lattice"
        );
        let mut tracker = plan.tracker.clone();
        let mut values = Vec::with_capacity(plan.times().len());
        let attempts = self.drive(
            seed,
            index,
            plan.times(),
            &mut tracker,
            |colors, tracker, t| {
                values.push(read(&self.view(colors), plan, tracker, t));
            },
        );
        Readings {
            values,
            attempts,
            active_region: None,
        }
    }

    /// Sample `index` under `seed`: the whole configuration at each of `times` (which must increase
    /// strictly and be ≥ 0; unchecked here, use [`FiniteProcess::plan`] to check).
    pub fn configurations(&self, seed: u64, index: u64, times: &[f64]) -> Vec<Vec<Color>> {
        let mut out = Vec::with_capacity(times.len());
        self.drive(seed, index, times, &mut Tracker::default(), |c, _, _| {
            out.push(c.to_vec())
        });
        out
    }

    /// Runs the process, calling `at_time` at each read-out time; returns the number of attempts.
    fn drive(
        &self,
        seed: u64,
        index: u64,
        times: &[f64],
        tracker: &mut Tracker,
        mut at_time: impl FnMut(&[Color], &Tracker, f64),
    ) -> u64 {
        let mut sites = self.system.colors().to_vec();
        let ring = self.system.lattice() == FiniteLattice::Ring;
        let bonds = self.system.lattice().bonds(sites.len()) as f64;
        let rate = bonds * self.rates.total();
        let direction = self.rates.direction();
        let mut counts = Words::new(sample_stream(seed, index, COUNT_STREAM));
        let mut words = Words::new(sample_stream(seed, index, ATTEMPT_STREAM));
        // Only plans with hitting times open the time stream.
        let mut clock = (tracker.pending > 0)
            .then(|| OrderClock::new(Words::new(sample_stream(seed, index, TIME_STREAM))));
        let mut previous = 0.0;
        let mut total = 0u64;
        for &t in times {
            let start = previous;
            let mean = rate * (t - previous);
            previous = t;
            let n = if mean > 0.0 {
                // mean is finite and positive; Poisson::new only fails above 1.8e19.
                match Poisson::new(mean) {
                    Ok(d) => d.sample(&mut counts) as u64,
                    Err(_) => panic!("Poisson mean {mean} out of range"),
                }
            } else {
                0
            };
            total += n;
            match clock.as_mut() {
                Some(clock) if tracker.pending > 0 => {
                    clock.interval(start, t, n);
                    let mut clocked = Clocked { tracker, clock };
                    kernel::run(&mut sites, ring, n, &mut words, direction, &mut clocked);
                }
                _ if tracker.is_needed() => {
                    kernel::run(&mut sites, ring, n, &mut words, direction, tracker);
                }
                _ => kernel::run(&mut sites, ring, n, &mut words, direction, &mut Silent),
            }
            at_time(&sites, tracker, t);
        }
        total
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn plans_are_checked() {
        let p = FiniteProcess::new(
            FiniteSystem::ring(vec![2, 1, 0, 0]).unwrap(),
            Rates::tasep(1.0).unwrap(),
        );
        assert!(p.plan(&[1.0], vec![Readout::Permutation]).is_err());
        assert!(matches!(
            p.plan(&[1.0], vec![Readout::Swapped { a: 0, b: 1 }]),
            Err(ExclusionError::ColorNotUnique { color: 0, count: 2 })
        ));
        assert!(p
            .plan(
                &[1.0],
                vec![Readout::Current {
                    bond: 4,
                    threshold: 1
                }]
            )
            .is_ok());
        assert!(p
            .plan(
                &[1.0],
                vec![Readout::Current {
                    bond: 5,
                    threshold: 1
                }]
            )
            .is_err());
        assert!(p
            .plan(
                &[1.0],
                vec![Readout::Height {
                    site: 0,
                    threshold: 1
                }]
            )
            .is_err());
        assert!(p
            .plan(&[1.0], vec![Readout::Window { from: 2, to: 1 }])
            .is_err());
        let seg = FiniteProcess::new(
            FiniteSystem::segment(vec![2, 1, 0, 0]).unwrap(),
            Rates::tasep(1.0).unwrap(),
        );
        assert!(seg
            .plan(
                &[1.0],
                vec![Readout::Current {
                    bond: 4,
                    threshold: 1
                }]
            )
            .is_err());
    }

    #[test]
    fn new_readouts_are_checked() {
        let p = FiniteProcess::new(
            FiniteSystem::ring(vec![2, 1, 0, 0]).unwrap(),
            Rates::tasep(1.0).unwrap(),
        );
        assert!(matches!(
            p.plan(&[1.0], vec![Readout::SwapTime { a: 2, b: 2 }]),
            Err(ExclusionError::SameColor { color: 2, .. })
        ));
        assert!(matches!(
            p.plan(&[1.0], vec![Readout::Displacement { color: 0 }]),
            Err(ExclusionError::ColorNotUnique { color: 0, count: 2 })
        ));
        assert!(matches!(
            p.plan(&[1.0], vec![Readout::FirstAttemptTime { from: 3, onto: 1 }]),
            Err(ExclusionError::ColorNotUnique { color: 3, count: 0 })
        ));
        let plan = p
            .plan(
                &[0.0, 1.0],
                vec![
                    Readout::SwapTime { a: 2, b: 1 },
                    Readout::FirstAttemptTime { from: 1, onto: 2 },
                    Readout::Displacement { color: 1 },
                ],
            )
            .unwrap();
        // At time 0 nothing has happened: both times censored at 0, displacement 0.
        for i in 0..50 {
            let r = p.sample(1, i, &plan);
            let at0 = &r.values[0];
            assert_eq!(
                at0[..],
                [
                    Reading::Time {
                        time: 0.0,
                        censored: true
                    },
                    Reading::Time {
                        time: 0.0,
                        censored: true
                    },
                    Reading::Count(0)
                ]
            );
            // At time 1: a censored time is the read-out time, an event time lies in (0, 1].
            let Reading::Time { time, censored } = r.values[1][1] else {
                panic!()
            };
            assert!(time > 0.0 && time <= 1.0 && (!censored || time == 1.0));
        }
    }

    #[test]
    fn height_on_a_segment_counts_particles_to_the_right() {
        let p = FiniteProcess::new(
            FiniteSystem::segment(vec![3, 2, 0, 1, 0, 2]).unwrap(),
            Rates::new(1.0, 0.4).unwrap(),
        );
        let times = [0.3, 1.0, 4.0];
        let plan = p
            .plan(
                &times,
                vec![
                    Readout::Height {
                        site: 2,
                        threshold: 2,
                    },
                    Readout::Current {
                        bond: 2,
                        threshold: 2,
                    },
                    Readout::Window { from: 1, to: 6 },
                ],
            )
            .unwrap();
        for i in 0..20 {
            let r = p.sample(5, i, &plan);
            for v in &r.values {
                let (h, j, w) = match (&v[0], &v[1], &v[2]) {
                    (Reading::Count(h), Reading::Count(j), Reading::Colors(w)) => (*h, *j, w),
                    _ => panic!("unexpected readings"),
                };
                let right = w[2..].iter().filter(|&&c| c >= 2).count() as i64;
                assert_eq!(h, right);
                // h(2, 0) = 1 (the 2 at site 6).
                assert_eq!(h, 1 + j);
            }
        }
    }

    use crate::Reading;
}
