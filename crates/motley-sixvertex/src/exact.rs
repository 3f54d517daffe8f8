//! The exact law of the exits of a small rectangle, by dynamic programming over row-by-row states.
//!
//! Vertices are processed in the sampler's order (row 1 left to right, then row 2, …). The state
//! after a vertex is the vector of the current vertical colors (one per column), the right exits of
//! the rows done so far and the horizontal color being carried; it is kept in a hashbrown map from
//! state to probability. A vertex whose two incoming colors differ splits a state in two. When the
//! last vertex is done the state is exactly the [`Outcome`]. Random (Bernoulli) boundary edges are
//! mixed in exactly: a bottom edge splits the initial state, a left edge splits the states at the
//! start of its row.
//!
//! # Precision
//! With [`num_rational::BigRational`] weights the law is exact. With `f64` each probability is a sum
//! of products of at most `W·H` factors, rounded at each step (relative error about `W·H·2⁻⁵³`).
//! The final list is sorted by outcome, so nothing depends on the hash map's iteration order.

use hashbrown::HashMap;
use motley_colorblind::Color;

use crate::{Boundary, Edge, ExactLaw, Outcome, SixVertexError, Weight};

/// The largest number of states the programme keeps at once before giving up.
pub const EXACT_STATE_LIMIT: usize = 20_000_000;

fn edge_law<W: Weight>(edge: &Edge) -> Vec<(Color, W)> {
    match *edge {
        Edge::Fixed(c) => vec![(c, W::one())],
        Edge::Random { density, color, .. } => {
            let p = W::from_f64(density);
            let q = p.one_minus();
            [(color, p), (0, q)]
                .into_iter()
                .filter(|(_, w)| !w.is_zero())
                .collect()
        }
    }
}

fn check<W: Weight>(name: &'static str, w: &W) -> Result<(), SixVertexError> {
    if w.is_probability() {
        Ok(())
    } else {
        Err(SixVertexError::WeightOutOfRange {
            name,
            value: w.to_string(),
        })
    }
}

fn add<W: Weight>(map: &mut HashMap<Vec<Color>, W>, key: Vec<Color>, w: W) {
    map.entry(key)
        .and_modify(|acc| acc.add_assign(&w))
        .or_insert(w);
}

fn guard<W>(map: &HashMap<Vec<Color>, W>) -> Result<(), SixVertexError> {
    if map.len() > EXACT_STATE_LIMIT {
        Err(SixVertexError::ExactTooLarge {
            states: map.len(),
            limit: EXACT_STATE_LIMIT,
        })
    } else {
        Ok(())
    }
}

/// The exact joint law of (top exits, right exits) of the model with weights `b1`, `b2` on
/// `boundary`, sorted by outcome. Random boundary edges are mixed over exactly, with their density
/// converted by [`Weight::from_f64`].
///
/// # Errors
/// [`SixVertexError::WeightOutOfRange`] if `b1` or `b2` is outside [0, 1];
/// [`SixVertexError::ExactTooLarge`] if more than [`EXACT_STATE_LIMIT`] states arise.
///
/// # Examples
/// ```
/// use motley_sixvertex::{exact_law, ratio, Boundary};
/// // One vertex, color 1 from the left: it turns up with probability 1 − b2.
/// let law = exact_law(ratio(1, 3), ratio(1, 4), &Boundary::rainbow(1, 1).unwrap()).unwrap();
/// let up = law.map(|o| o.top[0]);
/// assert_eq!(up.probability(&1), ratio(3, 4));
/// ```
pub fn exact_law<W: Weight>(
    b1: W,
    b2: W,
    boundary: &Boundary,
) -> Result<ExactLaw<Outcome, W>, SixVertexError> {
    check("b1", &b1)?;
    check("b2", &b2)?;
    let (width, height) = (boundary.width(), boundary.height());
    let (not_b1, not_b2) = (b1.one_minus(), b2.one_minus());

    // Initial states: the bottom colors.
    let mut states: HashMap<Vec<Color>, W> = HashMap::new();
    states.insert(Vec::with_capacity(width + height), W::one());
    for edge in boundary.bottom() {
        let law = edge_law::<W>(edge);
        let mut next = HashMap::with_capacity(states.len() * law.len());
        for (key, w) in states {
            for (c, p) in &law {
                let mut k = key.clone();
                k.push(*c);
                add(&mut next, k, w.times(p));
            }
        }
        states = next;
    }

    for left in boundary.left() {
        // Start of the row: the carried color (the last entry of the key) enters from the left.
        let law = edge_law::<W>(left);
        let mut next = HashMap::with_capacity(states.len() * law.len());
        for (key, w) in states {
            for (c, p) in &law {
                let mut k = key.clone();
                k.push(*c);
                add(&mut next, k, w.times(p));
            }
        }
        states = next;
        let carry = states.keys().next().map_or(0, |k| k.len() - 1);
        for x in 0..width {
            let mut next = HashMap::with_capacity(states.len() * 2);
            for (key, w) in states {
                let (i, j) = (key[x], key[carry]);
                if i == j {
                    add(&mut next, key, w);
                    continue;
                }
                // Probability that the stronger color goes straight.
                let (straight, turn) = if i > j {
                    (&b1, &not_b1)
                } else {
                    (&b2, &not_b2)
                };
                if !turn.is_zero() {
                    let mut k = key.clone();
                    k.swap(x, carry);
                    add(&mut next, k, w.times(turn));
                }
                if !straight.is_zero() {
                    add(&mut next, key, w.times(straight));
                }
            }
            guard(&next)?;
            states = next;
        }
        // The carried color has left through the right side: it stays in the key as that row's exit.
    }

    let mut entries: Vec<(Outcome, W)> = states
        .into_iter()
        .map(|(key, w)| {
            (
                Outcome {
                    top: key[..width].to_vec(),
                    right: key[width..].to_vec(),
                },
                w,
            )
        })
        .collect();
    entries.sort_by(|a, b| a.0.cmp(&b.0));
    Ok(ExactLaw::from_entries(entries))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::{ratio, Side};
    use num_rational::BigRational;

    /// Hand computation on one column of two rows, rainbow from the left: the top color is 2 with
    /// probability 1 − b2, 1 with probability b2(1 − b2), none with probability b2².
    #[test]
    fn one_column_two_rows_by_hand() {
        let b2 = ratio(2, 5);
        let law = exact_law(ratio(1, 7), b2.clone(), &Boundary::rainbow(1, 2).unwrap()).unwrap();
        let top = law.map(|o| o.top[0]);
        let one = ratio(1, 1);
        assert_eq!(top.probability(&2), &one - &b2);
        assert_eq!(top.probability(&1), &b2 * (&one - &b2));
        assert_eq!(top.probability(&0), &b2 * &b2);
        assert_eq!(law.total(), one);
    }

    /// One vertex, 2 from below and 1 from the left: 2 continues up with probability b1.
    #[test]
    fn one_vertex_from_below() {
        let b = Boundary::new(1, 1, Side::Explicit(vec![1]), Side::Explicit(vec![2])).unwrap();
        let law = exact_law(ratio(1, 3), ratio(1, 2), &b).unwrap();
        assert_eq!(
            law.entries(),
            &[
                (
                    Outcome {
                        top: vec![1],
                        right: vec![2]
                    },
                    ratio(2, 3)
                ),
                (
                    Outcome {
                        top: vec![2],
                        right: vec![1]
                    },
                    ratio(1, 3)
                ),
            ]
        );
    }

    #[test]
    fn rational_and_float_agree_and_bad_weights_fail() {
        let b = Boundary::new(
            3,
            2,
            Side::Bernoulli {
                density: 0.5,
                color: crate::ColorRule::Index { offset: 3 },
            },
            Side::Rainbow,
        )
        .unwrap();
        let exact = exact_law(ratio(1, 4), ratio(3, 5), &b).unwrap();
        let float = exact_law(0.25, 0.6, &b).unwrap();
        assert_eq!(exact.total(), ratio(1, 1));
        assert!(exact.to_f64().total_variation(&float) < 1e-15);
        assert!(matches!(
            exact_law(ratio(5, 4), ratio(1, 2), &b),
            Err(SixVertexError::WeightOutOfRange { name: "b1", .. })
        ));
        assert!(exact_law(0.5, f64::NAN, &b).is_err());
        let _: &BigRational = &exact.entries()[0].1;
    }
}
