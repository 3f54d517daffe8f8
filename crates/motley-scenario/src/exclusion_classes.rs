//! The coarsest merge of an exclusion model's colors that still determines what a claim reads.
//!
//! Merging contiguous colors (in strength order) gives again a multi-species exclusion, whose law is
//! the pushforward of the unmerged one (`motley_exclusion::SparseSolver`, *Merging colors*). Each
//! read-out needs some colors kept apart, written as *cuts*: a cut at `t` keeps colors `< t` apart
//! from colors `≥ t`. A threshold read-out (heights, currents, positions above a threshold) needs
//! one cut; following one color `c` (its position, displacement, a swap) needs `c` alone, cuts at
//! `c` and `c + 1`; reading the colors themselves (arrangements, configurations, windows read as
//! colors) needs every cut. Each merged class is then represented by its smallest color: every cut
//! read-out gives the same value on the representatives as on the true colors, so the family's one
//! reading function reads merged arrangements unchanged.

use std::collections::BTreeSet;

use motley_colorblind::Color;

use crate::exclusion_family::{read_of, ExclusionRead};
use crate::scenario::{ObservableSpec, SetRead};

/// The cuts a set of observables needs (`None`: every one).
#[derive(Debug, Clone, Default, PartialEq, Eq)]
pub(crate) struct Cuts {
    all: bool,
    at: BTreeSet<Color>,
}

impl Cuts {
    /// The cuts observable `o` needs.
    pub(crate) fn of(o: &ObservableSpec) -> Self {
        let mut c = Cuts::default();
        let threshold = o.threshold.unwrap_or(1).max(1);
        let alone = |x: Color, c: &mut Cuts| {
            c.at.insert(x);
            c.at.insert(x + 1);
        };
        match *read_of(o) {
            ExclusionRead::Window(_, _, _, SetRead::Colors)
            | ExclusionRead::Arrangement(_)
            | ExclusionRead::InverseArrangement(_)
            | ExclusionRead::Configuration(_)
            | ExclusionRead::Attempted(..)
            | ExclusionRead::SwapTime(..)
            | ExclusionRead::AttemptTime(..) => c.all = true,
            ExclusionRead::Window(_, _, _, SetRead::Positions)
            | ExclusionRead::Current(..)
            | ExclusionRead::Height(..) => {
                c.at.insert(threshold);
            }
            ExclusionRead::Position(x, _) | ExclusionRead::Displacement(x, _) => alone(x, &mut c),
            ExclusionRead::Swapped(a, b, _) | ExclusionRead::Overtaken { a, b, .. } => {
                alone(a, &mut c);
                alone(b, &mut c);
            }
        }
        c
    }

    /// The cuts of all of `observables`.
    pub(crate) fn union(observables: &[&ObservableSpec]) -> Self {
        let mut c = Cuts::default();
        for o in observables {
            let d = Cuts::of(o);
            c.all |= d.all;
            c.at.extend(d.at);
        }
        c
    }

    /// Whether colors `a < b` must stay apart.
    fn separates(&self, a: Color, b: Color) -> bool {
        self.all || self.at.range(a + 1..=b).next().is_some()
    }

    /// `colors` with each merged class replaced by its smallest color.
    pub(crate) fn merge(&self, colors: &[Color]) -> Vec<Color> {
        let mut present: Vec<Color> = colors.to_vec();
        present.sort_unstable();
        present.dedup();
        let mut representative = Vec::with_capacity(present.len());
        for (i, &c) in present.iter().enumerate() {
            let r = if i > 0 && !self.separates(present[i - 1], c) {
                representative[i - 1]
            } else {
                c
            };
            representative.push(r);
        }
        colors
            .iter()
            .map(|c| representative[present.binary_search(c).unwrap_or(0)])
            .collect()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn merges_only_what_no_cut_separates() {
        let colors = [9, 8, 7, 6, 5, 4, 3, 2, 1];
        let mut c = Cuts::default();
        assert_eq!(c.merge(&colors), vec![1; 9]);
        c.at.insert(4);
        assert_eq!(c.merge(&colors), vec![4, 4, 4, 4, 4, 4, 1, 1, 1]);
        c.at.extend([7, 8]);
        assert_eq!(c.merge(&colors), vec![8, 8, 7, 4, 4, 4, 1, 1, 1]);
        c.all = true;
        assert_eq!(c.merge(&colors), colors.to_vec());
        // Holes are a color like any other.
        let mut h = Cuts::default();
        h.at.insert(2);
        assert_eq!(h.merge(&[0, 1, 2, 3, 0]), vec![0, 0, 2, 2, 0]);
    }
}
