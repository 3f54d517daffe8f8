//! Turning a row of engine colors into the elements of a set observable, in the file's numbers.

use motley_colorblind::{Color, IndexMap};

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
        SetRead::Colors => {
            out.extend(
                colors
                    .iter()
                    .filter(|&&c| c != 0)
                    .map(|&c| model.to_user(c) as usize),
            );
        }
        SetRead::Positions => {
            let t = threshold.unwrap_or(1).max(1);
            out.extend(
                colors
                    .iter()
                    .enumerate()
                    .filter(|(_, &c)| c >= t)
                    .map(|(i, _)| i + 1),
            );
        }
    }
    let n = universe as i64;
    match map {
        IndexMap::Identity => {}
        IndexMap::Reflection => {
            for e in out.iter_mut() {
                *e = (n + 1 - *e as i64) as usize;
            }
        }
        IndexMap::Shift(s) => {
            for e in out.iter_mut() {
                *e = (*e as i64 + s) as usize;
            }
        }
    }
    out.sort_unstable();
    out.dedup();
}
