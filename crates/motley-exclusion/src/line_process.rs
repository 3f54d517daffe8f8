//! Multi-species ASEP on the whole line `Z`, exact: a lazily grown active region.
//!
//! The configuration equals the far-left color `A` on `x < lo` and the far-right color `B` on
//! `x ≥ hi`. Every bond outside `[lo − 1, hi]` joins two equal colors and can change nothing, so only
//! the `m = hi − lo + 1` *candidate* bonds `(x, x+1)`, `lo − 1 ≤ x ≤ hi − 1`, are simulated: attempts
//! come at total rate `m (p + q)`, each on a uniform candidate bond, rightward with probability
//! `p / (p + q)`. (Attempts on candidate bonds with equal colors are null events; this is
//! uniformization over the candidates, exact in law.) When an attempt on the boundary bond
//! `(lo − 1, lo)` leaves a color other than `A` at `lo − 1`, the region grows to `lo − 1`; likewise on
//! the right. Nothing is truncated: the result is the process on `Z` exactly.
//!
//! # Reproducibility
//! Sample `index` under `seed` uses stream 0 of [`motley_stream::sample_stream`]`(seed, index, ·)`,
//! words in order: the gap to the first attempt, then per attempt its bond word (more only on a
//! Lemire rejection), its direction word when both `p > 0` and `q > 0`, and the gap to the next
//! attempt. A gap is `E / (m (p + q))` with `E` drawn by `rand_distr` 0.6's `Exp1` (ziggurat on
//! 64-bit values made of two consecutive words, low word first) and `m` the number of candidate bonds
//! after the previous attempt. The gap that crosses a read-out time is kept (not redrawn).
//!
//! Hitting times ([`Readout::SwapTime`], [`Readout::FirstAttemptTime`]) are the exact times of the
//! attempts at which the events happen (the running sum of the gaps above); they and
//! [`Readout::Displacement`] draw nothing, so the layout is the same for every plan.

use motley_colorblind::{Color, Projection};
use motley_stream::sample_stream;
use rand_distr::{Distribution, Exp1};

use crate::observer::{Observer, Silent};
use crate::rates::Direction;
use crate::readout::{build_plan, read, SiteView, Target};
use crate::words::Words;
use crate::{ExclusionError, LineData, Rates, Readings, Readout, ReadoutPlan};

/// The stream used on the line.
pub const LINE_STREAM: u64 = 0;

/// Multi-species ASEP on `Z`.
#[derive(Debug, Clone, PartialEq)]
pub struct LineProcess {
    data: LineData,
    rates: Rates,
}

/// The configuration on `Z` during a run.
struct LineState {
    left: Color,
    right: Color,
    /// Site of `cells[0]`.
    base: i64,
    /// Colors of sites `base..base + cells.len()`; `left` below `lo`, `right` from `hi` on.
    cells: Vec<Color>,
    lo: i64,
    hi: i64,
}

impl LineState {
    fn new(data: &LineData) -> Self {
        let len = data.block().len() as i64;
        let margin = 64;
        let mut cells = vec![data.left(); margin as usize];
        cells.extend_from_slice(data.block());
        cells.extend(std::iter::repeat_n(data.right(), margin as usize));
        LineState {
            left: data.left(),
            right: data.right(),
            base: data.start() - margin,
            cells,
            lo: data.start(),
            hi: data.start() + len,
        }
    }

    #[cold]
    fn grow_left(&mut self) {
        let extra = self.cells.len().max(64);
        let mut cells = vec![self.left; extra];
        cells.extend_from_slice(&self.cells);
        self.cells = cells;
        self.base -= extra as i64;
    }

    #[cold]
    fn grow_right(&mut self) {
        let extra = self.cells.len().max(64);
        let right = self.right;
        self.cells.extend(std::iter::repeat_n(right, extra));
    }

    /// Keeps sites `lo − 1 ..= hi` inside the buffer.
    #[inline]
    fn ensure(&mut self) {
        if self.lo - 1 < self.base {
            self.grow_left();
        }
        if self.hi >= self.base + self.cells.len() as i64 {
            self.grow_right();
        }
    }

    fn at(&self, x: i64) -> Color {
        if x < self.lo {
            self.left
        } else if x >= self.hi {
            self.right
        } else {
            self.cells[(x - self.base) as usize]
        }
    }

    /// Attempts until the pending attempt time passes `until`; returns the attempts made.
    fn advance<O: Observer>(
        &mut self,
        until: f64,
        next: &mut f64,
        words: &mut Words,
        direction: Direction,
        bond_rate: f64,
        observer: &mut O,
    ) -> u64 {
        let cut = match direction {
            Direction::Mixed(c) => c.cut(),
            _ => 0,
        };
        let mut done = 0;
        while *next <= until {
            let m = (self.hi - self.lo + 1) as u32;
            let x = self.lo - 1 + i64::from(words.below(m));
            let right = match direction {
                Direction::Right => true,
                Direction::Left => false,
                Direction::Mixed(_) => u64::from(words.word()) < cut,
            };
            let i = (x - self.base) as usize;
            let a = self.cells[i];
            let b = self.cells[i + 1];
            let (lo, hi) = (a.min(b), a.max(b));
            let (new_left, new_right) = if right { (lo, hi) } else { (hi, lo) };
            self.cells[i] = new_left;
            self.cells[i + 1] = new_right;
            if O::ACTIVE {
                observer.set_time(*next);
                observer.attempt(x, right, (a, b), new_right);
            }
            if x == self.lo - 1 && new_left != self.left {
                self.lo -= 1;
            }
            if x + 1 == self.hi && new_right != self.right {
                self.hi += 1;
            }
            self.ensure();
            done += 1;
            let m = (self.hi - self.lo + 1) as f64;
            let e: f64 = Exp1.sample(words);
            *next += e / (m * bond_rate);
        }
        done
    }
}

impl SiteView for LineState {
    fn lattice_name(&self) -> &'static str {
        "the line Z"
    }
    fn site_range(&self) -> Option<(i64, i64)> {
        None
    }
    fn bond_range(&self) -> Option<(i64, i64)> {
        None
    }
    fn color(&self, x: i64) -> Color {
        self.at(x)
    }
    fn positions(&self, c: Color) -> Vec<i64> {
        (self.lo..self.hi).filter(|&x| self.at(x) == c).collect()
    }
    fn count(&self, c: Color) -> u64 {
        if c == self.left || c == self.right {
            u64::MAX
        } else {
            (self.lo..self.hi).filter(|&x| self.at(x) == c).count() as u64
        }
    }
    fn count_right_of(&self, x: i64, c: Color) -> Result<i64, ExclusionError> {
        if self.right >= c {
            return Err(ExclusionError::InfiniteHeight {
                threshold: c,
                right: self.right,
            });
        }
        let far_left = if self.left >= c {
            (self.lo - x - 1).max(0)
        } else {
            0
        };
        let inside = ((x + 1).max(self.lo)..self.hi)
            .filter(|&y| self.at(y) >= c)
            .count() as i64;
        Ok(far_left + inside)
    }
    fn is_packed(&self) -> bool {
        false
    }
}

impl LineProcess {
    /// The process on `Z` with initial data `data` and rates `rates`.
    pub fn new(data: LineData, rates: Rates) -> Self {
        LineProcess { data, rates }
    }

    /// The initial data.
    pub fn data(&self) -> &LineData {
        &self.data
    }

    /// The rates.
    pub fn rates(&self) -> Rates {
        self.rates
    }

    /// The same process from projected initial data. (On `Z` the attempts depend on the active
    /// region, so the coupling with the colored run is in law, not pathwise.)
    ///
    /// # Errors
    /// [`ExclusionError::Colorblind`] if a merge table does not cover a color.
    pub fn project(&self, projection: &Projection) -> Result<Self, ExclusionError> {
        Ok(LineProcess {
            data: self.data.project(projection)?,
            rates: self.rates,
        })
    }

    /// Checks read-outs against the initial data.
    ///
    /// # Errors
    /// As [`crate::FiniteProcess::plan`], plus [`ExclusionError::FarFieldColor`] for positions of a
    /// far-field color, [`ExclusionError::InfiniteHeight`] for a height whose threshold does not
    /// exceed the far-right color, [`ExclusionError::NotOnLattice`] for the permutation read-out.
    pub fn plan(
        &self,
        times: &[f64],
        readouts: Vec<Readout>,
    ) -> Result<ReadoutPlan, ExclusionError> {
        build_plan(&LineState::new(&self.data), Target::Line, times, readouts)
    }

    /// Sample `index` under `seed`.
    ///
    /// # Panics
    /// If `plan` was built for a finite lattice.
    pub fn sample(&self, seed: u64, index: u64, plan: &ReadoutPlan) -> Readings {
        assert_eq!(
            plan.target,
            Target::Line,
            "read-out plan built for a finite lattice"
        );
        let mut state = LineState::new(&self.data);
        let mut tracker = plan.tracker.clone();
        let mut words = Words::new(sample_stream(seed, index, LINE_STREAM));
        let bond_rate = self.rates.total();
        let direction = self.rates.direction();
        let m = (state.hi - state.lo + 1) as f64;
        let e: f64 = Exp1.sample(&mut words);
        let mut next = e / (m * bond_rate);
        let mut attempts = 0;
        let mut values = Vec::with_capacity(plan.times().len());
        for &t in plan.times() {
            attempts += if tracker.is_needed() {
                state.advance(t, &mut next, &mut words, direction, bond_rate, &mut tracker)
            } else {
                state.advance(t, &mut next, &mut words, direction, bond_rate, &mut Silent)
            };
            values.push(read(&state, plan, &tracker, t));
        }
        Readings {
            values,
            attempts,
            active_region: Some((state.lo, state.hi)),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::Reading;

    #[test]
    fn far_field_is_respected_and_region_grows() {
        let p = LineProcess::new(LineData::step(1), Rates::tasep(1.0).unwrap());
        let plan = p
            .plan(
                &[5.0, 50.0],
                vec![
                    Readout::Window {
                        from: -200,
                        to: 200,
                    },
                    Readout::Height {
                        site: 0,
                        threshold: 1,
                    },
                    Readout::Current {
                        bond: 0,
                        threshold: 1,
                    },
                ],
            )
            .unwrap();
        let r = p.sample(3, 0, &plan);
        let (lo, hi) = r.active_region.unwrap();
        assert!(lo < -10 && hi > 10, "{lo} {hi}");
        for v in &r.values {
            let w = match &v[0] {
                Reading::Colors(w) => w,
                _ => panic!(),
            };
            // Conservation: particles to the right of 0 = current through bond (0, 1).
            let right = w[201..].iter().filter(|&&c| c >= 1).count() as i64;
            assert_eq!(v[1], Reading::Count(right));
            assert_eq!(v[2], Reading::Count(right));
            assert_eq!(w[0], 1);
            assert_eq!(*w.last().unwrap(), 0);
        }
        assert!(matches!(
            p.plan(&[1.0], vec![Readout::Positions { color: 1 }]),
            Err(ExclusionError::FarFieldColor(1))
        ));
        let q = LineProcess::new(
            LineData::new(1, 1, 0, vec![0]).unwrap(),
            Rates::tasep(1.0).unwrap(),
        );
        assert!(matches!(
            q.plan(
                &[1.0],
                vec![Readout::Height {
                    site: 0,
                    threshold: 1
                }]
            ),
            Err(ExclusionError::InfiniteHeight { .. })
        ));
        // A far-field color is not one particle.
        assert!(matches!(
            p.plan(&[1.0], vec![Readout::Displacement { color: 1 }]),
            Err(ExclusionError::ColorNotUnique { color: 1, .. })
        ));
    }

    /// Two particles on `Z` among holes, TASEP: the stronger one behind. Hitting times are attempt
    /// times, so they are exact sums of gaps: an uncensored swap time lies in the interval where it
    /// first appears, and the displacements agree with the positions.
    #[test]
    fn hitting_times_and_displacements_on_the_line() {
        let p = LineProcess::new(
            LineData::new(0, 0, 0, vec![2, 1]).unwrap(),
            Rates::tasep(1.0).unwrap(),
        );
        let plan = p
            .plan(
                &[0.5, 3.0],
                vec![
                    Readout::SwapTime { a: 2, b: 1 },
                    Readout::Displacement { color: 2 },
                    Readout::Displacement { color: 1 },
                    Readout::Positions { color: 2 },
                    Readout::Positions { color: 1 },
                ],
            )
            .unwrap();
        let mut swapped = 0;
        for i in 0..200 {
            let r = p.sample(8, i, &plan);
            for (v, t) in r.values.iter().zip([0.5, 3.0]) {
                assert_eq!(
                    v[3],
                    Reading::Positions(vec![match v[1] {
                        Reading::Count(d) => d,
                        _ => panic!(),
                    }])
                );
                assert_eq!(
                    v[4],
                    Reading::Positions(vec![match v[2] {
                        Reading::Count(d) => 1 + d,
                        _ => panic!(),
                    }])
                );
                let Reading::Time { time, censored } = v[0] else {
                    panic!()
                };
                assert!(time <= t && (!censored || time == t));
                // TASEP, stronger behind: swapped now ⇔ swap time not censored.
                let (Reading::Positions(a), Reading::Positions(b)) = (&v[3], &v[4]) else {
                    panic!()
                };
                assert_eq!(a[0] > b[0], !censored);
                swapped += usize::from(!censored);
            }
        }
        assert!(swapped > 0 && swapped < 400);
    }
}
