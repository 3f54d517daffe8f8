//! Turning a row of engine colors into the elements of a set observable, in the file's numbers:
//! the colorblind crate's set read-outs and index maps, composed as an observable asks.

use motley_colorblind::{push_colors, push_positions_at_least, Color, IndexMap};

use crate::scenario::{ModelSpec, SetRead};

/// Elements (increasing) of the set read from `colors`.
///
/// `Colors`: the nonzero colors present, written in the model's own numbers. `Positions`: the
/// 1-based positions whose color is at least `threshold` (any nonzero color when `None`). Then the
/// index map, whose fit was checked during validation.
pub(crate) fn set_elements(
    colors: &[Color],
    how: SetRead,
    threshold: Option<Color>,
    map: IndexMap,
    universe: usize,
    model: &ModelSpec,
    out: &mut Vec<usize>,
) {
    out.clear();
    match how {
        SetRead::Colors => push_colors(colors, |c| model.to_user(c) as usize, out),
        SetRead::Positions => push_positions_at_least(colors, threshold.unwrap_or(1), out),
    }
    map.map_elements(out, universe);
}
