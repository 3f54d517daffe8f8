//! Pooling of sparse cells before a chi-square test.
//!
//! # Rule (common practice, Cochran's rule of thumb)
//! Each cell has a *weight*: its smallest expected count (for goodness of fit `n p`, for two-sample
//! homogeneity `min(n_a, n_b) * total_cell / N`). Cells of weight below `min_expected` (default 5) are
//! merged into one "rest" cell. If the rest cell is non-empty but its own weight is still below
//! `min_expected`, the kept cell of smallest weight (first in key order on ties) is moved into the
//! rest, repeatedly, until the rest reaches the threshold or no kept cell is left. Weights are additive,
//! so the rule is a pure function of the weights in key order and hence deterministic.

/// Result of pooling: for each input cell the group it belongs to.
#[derive(Clone, Debug, PartialEq, Eq)]
pub(crate) struct Pooling {
    /// Group index of each cell, in the input order.
    pub group_of: Vec<usize>,
    /// Number of groups (tested cells).
    pub groups: usize,
    /// Number of input cells that ended up in the rest cell.
    pub pooled_cells: usize,
}

/// Applies the rule documented at the top of this file to `weights` (given in key order).
pub(crate) fn pool(weights: &[f64], min_expected: f64) -> Pooling {
    let mut in_rest: Vec<bool> = weights.iter().map(|&w| w < min_expected).collect();
    let mut rest_weight: f64 = weights
        .iter()
        .zip(&in_rest)
        .filter(|(_, &r)| r)
        .map(|(w, _)| *w)
        .sum();
    let mut rest_nonempty = in_rest.iter().any(|&r| r);
    while rest_nonempty && rest_weight < min_expected {
        // Smallest kept cell, first in key order on ties.
        let mut best: Option<usize> = None;
        for (i, &w) in weights.iter().enumerate() {
            if !in_rest[i] && best.is_none_or(|b| w < weights[b]) {
                best = Some(i);
            }
        }
        match best {
            Some(i) => {
                in_rest[i] = true;
                rest_weight += weights[i];
            }
            None => break,
        }
        rest_nonempty = true;
    }
    let mut group_of = vec![0usize; weights.len()];
    let mut next = 0usize;
    for (i, &r) in in_rest.iter().enumerate() {
        if !r {
            group_of[i] = next;
            next += 1;
        }
    }
    let pooled_cells = in_rest.iter().filter(|&&r| r).count();
    if pooled_cells > 0 {
        for (i, &r) in in_rest.iter().enumerate() {
            if r {
                group_of[i] = next;
            }
        }
        next += 1;
    }
    Pooling {
        group_of,
        groups: next,
        pooled_cells,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn no_pooling_when_all_large() {
        let p = pool(&[6.0, 10.0, 5.0], 5.0);
        assert_eq!(p.groups, 3);
        assert_eq!(p.pooled_cells, 0);
        assert_eq!(p.group_of, vec![0, 1, 2]);
    }

    #[test]
    fn sparse_cells_go_to_rest() {
        let p = pool(&[1.0, 20.0, 3.0, 2.0, 30.0], 5.0);
        // rest = 1 + 3 + 2 = 6 >= 5: kept cells 20 and 30.
        assert_eq!(p.groups, 3);
        assert_eq!(p.pooled_cells, 3);
        assert_eq!(p.group_of, vec![2, 0, 2, 2, 1]);
    }

    #[test]
    fn small_rest_absorbs_smallest_kept_cell() {
        let p = pool(&[1.0, 20.0, 7.0, 30.0], 5.0);
        // rest = 1 < 5, so the 7-cell joins it.
        assert_eq!(p.groups, 3);
        assert_eq!(p.pooled_cells, 2);
        assert_eq!(p.group_of, vec![2, 0, 2, 1]);
    }

    #[test]
    fn everything_pooled_gives_one_group() {
        let p = pool(&[1.0, 1.0, 1.0], 5.0);
        assert_eq!(p.groups, 1);
        assert_eq!(p.pooled_cells, 3);
    }
}
