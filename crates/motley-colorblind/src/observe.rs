//! Set-valued observables of a configuration window: which colors are present, which positions are
//! occupied.

use crate::{Color, ColorblindError, ElementSet};

/// The set of nonzero colors found in `window`, as a subset of `{1, …, max_color}`.
///
/// # Errors
/// [`ColorblindError::ElementOutside`] if a color exceeds `max_color`.
pub fn colors_present(window: &[Color], max_color: u32) -> Result<ElementSet, ColorblindError> {
    let mut colors = Vec::new();
    push_colors(window, |c| c as usize, &mut colors);
    ElementSet::from_elements(max_color as usize, colors)
}

/// The set of positions `k ∈ {1, …, window.len()}` whose color is nonzero (position 1 is
/// `window[0]`).
pub fn occupied_positions(window: &[Color]) -> ElementSet {
    let mut positions = Vec::new();
    push_positions_at_least(window, 1, &mut positions);
    // Always inside the universe: 1 ≤ k ≤ len.
    ElementSet::from_elements(window.len(), positions).expect("positions lie in the window")
}

/// Appends the nonzero colors of `window` to `out`, each written as `name(color)`, in window order
/// (repeats kept): the allocation-free form of [`colors_present`], for hot loops that reuse `out`.
pub fn push_colors(window: &[Color], name: impl Fn(Color) -> usize, out: &mut Vec<usize>) {
    out.extend(window.iter().filter(|&&c| c != 0).map(|&c| name(c)));
}

/// Appends the positions `k ∈ {1, …, window.len()}` whose color is at least `threshold` (taken as
/// 1 when 0) to `out`, increasing: the allocation-free form of [`occupied_positions`] and of a
/// threshold projection followed by it.
pub fn push_positions_at_least(window: &[Color], threshold: Color, out: &mut Vec<usize>) {
    let t = threshold.max(1);
    out.extend(
        window
            .iter()
            .enumerate()
            .filter(|(_, &c)| c >= t)
            .map(|(i, _)| i + 1),
    );
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn colors_and_positions() {
        let w = [2, 0, 2, 5];
        assert_eq!(colors_present(&w, 5).unwrap().elements(), vec![2, 5]);
        assert!(colors_present(&w, 4).is_err());
        assert_eq!(occupied_positions(&w).elements(), vec![1, 3, 4]);
        assert_eq!(occupied_positions(&[]).universe(), 0);
        let mut out = vec![9];
        push_positions_at_least(&w, 3, &mut out);
        assert_eq!(out, vec![9, 4]);
        out.clear();
        push_colors(&w, |c| 10 - c as usize, &mut out);
        assert_eq!(out, vec![8, 8, 5]);
    }
}
