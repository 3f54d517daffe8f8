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
//! # Heights
//! [`exact_law_with_heights`] runs the same programme and, when row `b` is done, evaluates each
//! height query `(a, b, t)` on every state (the vertical colors above row `b` in columns `a + 1..=W`
//! and the right exits of rows `1..=b` are all in the state then) and keeps its value at the front
//! of the key. [`exact_height_law`] first merges the boundary colors into one class per threshold
//! interval, which the heights cannot tell apart.
//!
//! # Precision
//! With [`num_rational::BigRational`] weights the law is exact. With `f64` each probability is a sum
//! of products of at most `W·H` factors, rounded at each step (relative error about `W·H·2⁻⁵³`).
//! The final list is sorted by outcome, so nothing depends on the hash map's iteration order.

use hashbrown::HashMap;
use motley_colorblind::{Color, Projection};

use crate::{Boundary, Edge, ExactLaw, HeightQuery, Outcome, SixVertexError, Weight};

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
    let width = boundary.width();
    let states = run(b1, b2, boundary, &[])?;
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

/// The exact joint law of the exits and of the heights `H_t(a, b)` of `queries` (defined in
/// [`HeightQuery`] and the crate docs), sorted by key. The key is `(outcome, heights)` with
/// `heights[k]` the value of `queries[k]` (queries may repeat). With no query this is [`exact_law`]
/// with an empty height list attached: the same probabilities, bit for bit.
///
/// The dynamic programme is that of [`exact_law`]; when row `b` is done (`b = 0`: before the first
/// row) each query with that `b` is evaluated on the state, which then holds the vertical colors
/// above row `b` and the right exits of rows `1..=b`, and its value is kept in the state from then
/// on. A state therefore splits only by the values of the heights already recorded.
///
/// # Errors
/// As [`exact_law`], and [`SixVertexError::HeightPointOutOfRange`] if a query lies outside the
/// rectangle.
///
/// # Examples
/// ```
/// use motley_sixvertex::{exact_law_with_heights, ratio, Boundary, HeightQuery};
/// // One column, rainbow from two rows: H(0, 1) = 1 always; H(1, 1) counts color 1 leaving
/// // right at row 1 (probability b2).
/// let law = exact_law_with_heights(
///     ratio(1, 3),
///     ratio(1, 4),
///     &Boundary::rainbow(1, 2)?,
///     &[HeightQuery::all(0, 1), HeightQuery::all(1, 1)],
/// )?;
/// let heights = law.map(|(_, h)| h.clone());
/// assert_eq!(heights.probability(&vec![1, 1]), ratio(1, 4));
/// assert_eq!(heights.probability(&vec![1, 0]), ratio(3, 4));
/// # Ok::<(), motley_sixvertex::SixVertexError>(())
/// ```
pub fn exact_law_with_heights<W: Weight>(
    b1: W,
    b2: W,
    boundary: &Boundary,
    queries: &[HeightQuery],
) -> Result<ExactLaw<(Outcome, Vec<u64>), W>, SixVertexError> {
    let (width, height) = (boundary.width(), boundary.height());
    check_queries(width, height, queries)?;
    let order = query_order(queries);
    let n = queries.len();
    let states = run(b1, b2, boundary, queries)?;
    Ok(ExactLaw::from_entries(states.into_iter().map(
        |(key, w)| {
            let mut heights = vec![0u64; n];
            for (slot, &k) in order.iter().enumerate() {
                heights[k] = u64::from(key[slot]);
            }
            let outcome = Outcome {
                top: key[n..n + width].to_vec(),
                right: key[n + width..].to_vec(),
            };
            ((outcome, heights), w)
        },
    )))
}

/// The exact joint law of the heights of `queries` alone (`heights[k]` is the value of
/// `queries[k]`), computed on a coarser model: the boundary colors are merged into one class per
/// interval between consecutive distinct thresholds (an order-preserving merge, so by the basic
/// coupling of the crate docs the merged model's heights have exactly the same joint law), which
/// keeps far fewer states than [`exact_law_with_heights`] on many-colored boundaries.
///
/// # Errors
/// As [`exact_law_with_heights`].
pub fn exact_height_law<W: Weight>(
    b1: W,
    b2: W,
    boundary: &Boundary,
    queries: &[HeightQuery],
) -> Result<ExactLaw<Vec<u64>, W>, SixVertexError> {
    check_queries(boundary.width(), boundary.height(), queries)?;
    let mut thresholds: Vec<Color> = queries.iter().map(|q| q.threshold.max(1)).collect();
    thresholds.sort_unstable();
    thresholds.dedup();
    // Class of a color: the number of distinct thresholds it reaches (0 stays 0).
    let class = |c: Color| thresholds.partition_point(|&t| t <= c) as Color;
    let table: Vec<Color> = (0..=boundary.max_color()).map(class).collect();
    let merged = boundary.project(&Projection::merge(table)?)?;
    let coarse: Vec<HeightQuery> = queries
        .iter()
        .map(|q| HeightQuery {
            threshold: class(q.threshold.max(1)),
            ..*q
        })
        .collect();
    Ok(exact_law_with_heights(b1, b2, &merged, &coarse)?.map(|(_, h)| h.clone()))
}

fn check_queries(
    width: usize,
    height: usize,
    queries: &[HeightQuery],
) -> Result<(), SixVertexError> {
    match queries.iter().find(|q| q.a > width || q.b > height) {
        Some(q) => Err(SixVertexError::HeightPointOutOfRange {
            a: q.a,
            b: q.b,
            width,
            height,
        }),
        None => Ok(()),
    }
}

/// Query indices in the order the programme records them (by row `b`, stable).
fn query_order(queries: &[HeightQuery]) -> Vec<usize> {
    let mut order: Vec<usize> = (0..queries.len()).collect();
    order.sort_by_key(|&k| queries[k].b);
    order
}

/// Records, in every state, the heights of the queries with `b = y` (in `order`, from position
/// `*recorded` on). A state's key is `[recorded heights | vertical colors (W) | right exits of rows
/// 1..=y]`.
fn record<W: Weight>(
    states: HashMap<Vec<Color>, W>,
    queries: &[HeightQuery],
    order: &[usize],
    recorded: &mut usize,
    width: usize,
    y: usize,
) -> HashMap<Vec<Color>, W> {
    let start = *recorded;
    let due: Vec<HeightQuery> = order[start..]
        .iter()
        .map(|&k| queries[k])
        .take_while(|q| q.b == y)
        .collect();
    if due.is_empty() {
        return states;
    }
    *recorded += due.len();
    states
        .into_iter()
        .map(|(key, w)| {
            let vert = &key[start..start + width];
            let right = &key[start + width..start + width + y];
            let mut k = Vec::with_capacity(key.len() + due.len());
            k.extend_from_slice(&key[..start]);
            for q in &due {
                let t = q.threshold.max(1);
                let h = vert[q.a..].iter().filter(|&&c| c >= t).count()
                    + right.iter().filter(|&&c| c >= t).count();
                k.push(h as Color);
            }
            k.extend_from_slice(&key[start..]);
            (k, w)
        })
        .collect()
}

/// The programme: the final states, keyed `[heights in `query_order` | top exits (W) | right exits
/// (H)]`, with their probabilities. With no query, the keys and the arithmetic are those of the
/// plain exit law.
fn run<W: Weight>(
    b1: W,
    b2: W,
    boundary: &Boundary,
    queries: &[HeightQuery],
) -> Result<HashMap<Vec<Color>, W>, SixVertexError> {
    check("b1", &b1)?;
    check("b2", &b2)?;
    let (width, height) = (boundary.width(), boundary.height());
    let (not_b1, not_b2) = (b1.one_minus(), b2.one_minus());
    let order = query_order(queries);
    let mut recorded = 0;

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
    states = record(states, queries, &order, &mut recorded, width, 0);

    for (row, left) in boundary.left().iter().enumerate() {
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
        let off = recorded;
        for x in off..off + width {
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
        states = record(states, queries, &order, &mut recorded, width, row + 1);
    }
    debug_assert_eq!(recorded, queries.len());
    debug_assert!(height == boundary.left().len());
    Ok(states)
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

    /// With no query the general programme gives the plain exit law, entry for entry.
    #[test]
    fn no_query_is_the_exit_law() {
        let b = Boundary::new(
            3,
            2,
            Side::Explicit(vec![2, 1]),
            Side::Explicit(vec![0, 3, 1]),
        )
        .unwrap();
        let plain = exact_law(0.3, 0.65, &b).unwrap();
        let general = exact_law_with_heights(0.3, 0.65, &b, &[]).unwrap();
        let back = general.map(|(o, h)| {
            assert!(h.is_empty());
            o.clone()
        });
        assert_eq!(back.entries(), plain.entries());
    }

    /// Heights by hand on one vertex (color 2 from below, 1 from the left): 2 goes up with
    /// probability b1. H_2(1, 1) = 1 iff 2 leaves right; H_1(0, 1) = 2 always.
    #[test]
    fn heights_by_hand_and_errors() {
        let b = Boundary::new(1, 1, Side::Explicit(vec![1]), Side::Explicit(vec![2])).unwrap();
        let qs = [
            HeightQuery {
                a: 1,
                b: 1,
                threshold: 2,
            },
            HeightQuery::all(0, 1),
            HeightQuery::all(1, 0),
        ];
        let law = exact_law_with_heights(ratio(1, 3), ratio(1, 2), &b, &qs).unwrap();
        let h = law.map(|(_, h)| h.clone());
        assert_eq!(h.probability(&vec![1, 2, 0]), ratio(2, 3));
        assert_eq!(h.probability(&vec![0, 2, 0]), ratio(1, 3));
        let coarse = exact_height_law(ratio(1, 3), ratio(1, 2), &b, &qs).unwrap();
        assert_eq!(coarse, h);
        assert_eq!(
            exact_law_with_heights(0.5, 0.5, &b, &[HeightQuery::all(2, 0)]).unwrap_err(),
            SixVertexError::HeightPointOutOfRange {
                a: 2,
                b: 0,
                width: 1,
                height: 1
            }
        );
    }
}
