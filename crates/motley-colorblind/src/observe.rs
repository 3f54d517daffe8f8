//! Set-valued observables of a configuration window: which colors are present, which positions are
//! occupied.

use crate::{Color, ColorblindError, ElementSet};

/// The set of nonzero colors found in `window`, as a subset of `{1, …, max_color}`.
///
/// # Errors
/// [`ColorblindError::ElementOutside`] if a color exceeds `max_color`.
pub fn colors_present(window: &[Color], max_color: u32) -> Result<ElementSet, ColorblindError> {
    ElementSet::from_elements(
        max_color as usize,
        window.iter().filter(|&&c| c != 0).map(|&c| c as usize),
    )
}

/// The set of positions `k ∈ {1, …, window.len()}` whose color is nonzero (position 1 is
/// `window[0]`).
pub fn occupied_positions(window: &[Color]) -> ElementSet {
    let mut set = ElementSet::empty(window.len());
    for (i, &c) in window.iter().enumerate() {
        if c != 0 {
            // Always inside the universe: 1 ≤ i + 1 ≤ len.
            let _ = set.insert(i + 1);
        }
    }
    set
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
    }
}
