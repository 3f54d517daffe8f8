//! Initial data on a finite lattice: a segment `{1, …, n}` or a ring `Z/nZ`, one color per site.
//!
//! Sites are numbered `1..=n` on both lattices; on the ring site `n` is followed by site `1`.
//! Bonds are named by their left end: on the segment `(x, x+1)` for `x = 1..n−1`, on the ring also
//! `(n, 1)`, named `n`.

use motley_colorblind::{Color, Projection, Relabel};

use crate::ExclusionError;

/// Which finite lattice.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum FiniteLattice {
    /// The closed segment `{1, …, n}` with bonds `(x, x+1)`, `x = 1..n−1`.
    Segment,
    /// The ring `Z/nZ` with `n` bonds, bond `n` joining site `n` to site `1`.
    Ring,
}

impl FiniteLattice {
    /// `"segment"` or `"ring"`.
    pub fn name(self) -> &'static str {
        match self {
            FiniteLattice::Segment => "segment",
            FiniteLattice::Ring => "ring",
        }
    }

    /// Number of bonds of this lattice with `n` sites.
    pub fn bonds(self, n: usize) -> usize {
        match self {
            FiniteLattice::Segment => n - 1,
            FiniteLattice::Ring => n,
        }
    }
}

/// A finite lattice with one color per site (`colors[x − 1]` at site `x`).
#[derive(Debug, Clone, PartialEq, Eq, Hash)]
pub struct FiniteSystem {
    lattice: FiniteLattice,
    colors: Vec<Color>,
}

impl FiniteSystem {
    /// Colors on a lattice.
    ///
    /// # Errors
    /// [`ExclusionError::TooFewSites`] for fewer than 2 sites.
    pub fn new(lattice: FiniteLattice, colors: Vec<Color>) -> Result<Self, ExclusionError> {
        if colors.len() < 2 {
            return Err(ExclusionError::TooFewSites {
                lattice: lattice.name(),
                sites: colors.len(),
            });
        }
        Ok(FiniteSystem { lattice, colors })
    }

    /// Colors on the segment `{1, …, n}`.
    ///
    /// # Errors
    /// As [`FiniteSystem::new`].
    pub fn segment(colors: Vec<Color>) -> Result<Self, ExclusionError> {
        Self::new(FiniteLattice::Segment, colors)
    }

    /// Colors on the ring `Z/nZ`.
    ///
    /// # Errors
    /// As [`FiniteSystem::new`].
    pub fn ring(colors: Vec<Color>) -> Result<Self, ExclusionError> {
        Self::new(FiniteLattice::Ring, colors)
    }

    /// Classes (class 1 strongest, 0 = hole) on a lattice, with `classes` classes: class `k` becomes
    /// color `classes + 1 − k` through [`Relabel::reverse`].
    ///
    /// # Errors
    /// [`ExclusionError::Colorblind`] if `classes` is 0 or a class exceeds it; as
    /// [`FiniteSystem::new`].
    pub fn from_classes(
        lattice: FiniteLattice,
        classes: &[u32],
        class_count: u32,
    ) -> Result<Self, ExclusionError> {
        let relabel = Relabel::reverse(class_count)?;
        let colors = classes
            .iter()
            .map(|&k| relabel.map(k))
            .collect::<Result<Vec<_>, _>>()?;
        Self::new(lattice, colors)
    }

    /// Packed data: class `x` at site `x` (class 1 strongest), i.e. color `n + 1 − x` at site `x`.
    ///
    /// # Errors
    /// As [`FiniteSystem::new`].
    pub fn packed(lattice: FiniteLattice, n: usize) -> Result<Self, ExclusionError> {
        let classes: Vec<u32> = (1..=n as u32).collect();
        Self::from_classes(lattice, &classes, (n as u32).max(1))
    }

    /// The lattice.
    pub fn lattice(&self) -> FiniteLattice {
        self.lattice
    }

    /// Number of sites `n`.
    pub fn len(&self) -> usize {
        self.colors.len()
    }

    /// Always false: a system has at least two sites.
    pub fn is_empty(&self) -> bool {
        self.colors.is_empty()
    }

    /// The colors, site 1 first.
    pub fn colors(&self) -> &[Color] {
        &self.colors
    }

    /// Whether the colors are `1..=n`, each once (packed data in color form).
    pub fn is_packed(&self) -> bool {
        let n = self.colors.len();
        let mut seen = vec![false; n + 1];
        for &c in &self.colors {
            let c = c as usize;
            if c == 0 || c > n || seen[c] {
                return false;
            }
            seen[c] = true;
        }
        true
    }

    /// The same lattice with every color projected.
    ///
    /// # Errors
    /// [`ExclusionError::Colorblind`] if a merge table does not cover a color.
    pub fn project(&self, projection: &Projection) -> Result<Self, ExclusionError> {
        Ok(FiniteSystem {
            lattice: self.lattice,
            colors: projection.apply_slice(&self.colors)?,
        })
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn constructors() {
        let s = FiniteSystem::packed(FiniteLattice::Segment, 4).unwrap();
        assert_eq!(s.colors(), &[4, 3, 2, 1]);
        assert!(s.is_packed());
        let r = FiniteSystem::from_classes(FiniteLattice::Ring, &[2, 0, 1], 2).unwrap();
        assert_eq!(r.colors(), &[1, 0, 2]);
        assert!(!r.is_packed());
        assert!(FiniteSystem::from_classes(FiniteLattice::Ring, &[3, 0], 2).is_err());
        assert!(matches!(
            FiniteSystem::segment(vec![1]),
            Err(ExclusionError::TooFewSites { sites: 1, .. })
        ));
        let p = s.project(&Projection::threshold(3)).unwrap();
        assert_eq!(p.colors(), &[1, 1, 0, 0]);
    }
}
