//! Initial data on the whole line `Z`: a far-left color, a far-right color and an explicit block.
//!
//! Sites `x < start` hold `left`, sites `start ≤ x < start + block.len()` hold the block, sites beyond
//! hold `right`. Step data, step data with a few second- or third-class particles, and the packed
//! rainbow block are constructors over this one form.

use motley_colorblind::{Color, Projection, Relabel};

use crate::ExclusionError;

/// Far-field colors and an explicit finite block on `Z`.
#[derive(Debug, Clone, PartialEq, Eq, Hash)]
pub struct LineData {
    left: Color,
    right: Color,
    start: i64,
    block: Vec<Color>,
}

impl LineData {
    /// `left` on `x < start`, `block[i]` at `start + i`, `right` beyond the block.
    ///
    /// # Errors
    /// [`ExclusionError::EmptyBlock`] if `block` is empty.
    pub fn new(
        left: Color,
        right: Color,
        start: i64,
        block: Vec<Color>,
    ) -> Result<Self, ExclusionError> {
        if block.is_empty() {
            return Err(ExclusionError::EmptyBlock);
        }
        Ok(LineData {
            left,
            right,
            start,
            block,
        })
    }

    /// Step data: color `particle` on `x ≤ 0`, holes on `x > 0`.
    pub fn step(particle: Color) -> Self {
        LineData {
            left: particle,
            right: 0,
            start: 0,
            block: vec![particle],
        }
    }

    /// `left` on `x ≤ 0`, `right` on `x > 0`, then each `(site, color)` of `specials` written over
    /// its site. Second-class particle at the origin of TASEP step data, in colors (first class = 2,
    /// second class = 1, hole = 0): `LineData::step_with(2, 0, &[(0, 1)])`.
    ///
    /// # Errors
    /// [`ExclusionError::DuplicateSite`] if a site is listed twice.
    pub fn step_with(
        left: Color,
        right: Color,
        specials: &[(i64, Color)],
    ) -> Result<Self, ExclusionError> {
        let lo = specials.iter().map(|s| s.0).min().unwrap_or(0).min(0);
        let hi = specials.iter().map(|s| s.0).max().unwrap_or(0).max(0);
        let mut block: Vec<Color> = (lo..=hi)
            .map(|x| if x <= 0 { left } else { right })
            .collect();
        let mut written = vec![false; block.len()];
        for &(x, c) in specials {
            let i = (x - lo) as usize;
            if written[i] {
                return Err(ExclusionError::DuplicateSite(x));
            }
            written[i] = true;
            block[i] = c;
        }
        Self::new(left, right, lo, block)
    }

    /// The packed rainbow block: site `start + i` holds class `i + 1` (class 1 strongest) for
    /// `i < len`, i.e. color `len − i`; holes on the right; on the left holes too, or, with
    /// `strong_left`, particles of color `len + 1`, stronger than the whole block.
    ///
    /// # Errors
    /// [`ExclusionError::EmptyBlock`] if `len` is 0.
    pub fn rainbow(start: i64, len: usize, strong_left: bool) -> Result<Self, ExclusionError> {
        let block: Vec<Color> = (0..len as u32).map(|i| len as u32 - i).collect();
        let left = if strong_left { len as u32 + 1 } else { 0 };
        Self::new(left, 0, start, block)
    }

    /// Line data given in classes (class 1 strongest, 0 = hole) with `class_count` classes, relabeled
    /// to colors by [`Relabel::reverse`].
    ///
    /// # Errors
    /// [`ExclusionError::Colorblind`] for a class above `class_count` or `class_count = 0`; as
    /// [`LineData::new`].
    pub fn from_classes(
        left: u32,
        right: u32,
        start: i64,
        block: &[u32],
        class_count: u32,
    ) -> Result<Self, ExclusionError> {
        let r = Relabel::reverse(class_count)?;
        let block = block
            .iter()
            .map(|&k| r.map(k))
            .collect::<Result<Vec<_>, _>>()?;
        Self::new(r.map(left)?, r.map(right)?, start, block)
    }

    /// Far-left color.
    pub fn left(&self) -> Color {
        self.left
    }

    /// Far-right color.
    pub fn right(&self) -> Color {
        self.right
    }

    /// First site of the block.
    pub fn start(&self) -> i64 {
        self.start
    }

    /// The block's colors.
    pub fn block(&self) -> &[Color] {
        &self.block
    }

    /// The color at site `x`.
    pub fn color_at(&self, x: i64) -> Color {
        if x < self.start {
            self.left
        } else if x >= self.start + self.block.len() as i64 {
            self.right
        } else {
            self.block[(x - self.start) as usize]
        }
    }

    /// The same data with every color projected.
    ///
    /// # Errors
    /// [`ExclusionError::Colorblind`] if a merge table does not cover a color.
    pub fn project(&self, projection: &Projection) -> Result<Self, ExclusionError> {
        Ok(LineData {
            left: projection.apply(self.left)?,
            right: projection.apply(self.right)?,
            start: self.start,
            block: projection.apply_slice(&self.block)?,
        })
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn constructors() {
        let s = LineData::step_with(2, 0, &[(0, 1), (3, 1)]).unwrap();
        assert_eq!(s.start(), 0);
        assert_eq!(s.block(), &[1, 0, 0, 1]);
        assert_eq!((s.color_at(-5), s.color_at(9)), (2, 0));
        assert!(LineData::step_with(2, 0, &[(1, 1), (1, 1)]).is_err());
        let r = LineData::rainbow(1, 3, true).unwrap();
        assert_eq!((r.left(), r.block(), r.right()), (4, &[3, 2, 1][..], 0));
        let c = LineData::from_classes(1, 0, 0, &[2], 2).unwrap();
        assert_eq!((c.left(), c.block(), c.right()), (2, &[1][..], 0));
        assert_eq!(LineData::step(1).color_at(0), 1);
        assert_eq!(LineData::step(1).color_at(1), 0);
    }
}
