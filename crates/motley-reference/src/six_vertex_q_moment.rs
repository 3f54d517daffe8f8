//! The exact q-moment E[q^H(x, y)] of the height function of the colorblind stochastic six-vertex
//! model with the step boundary, on a whole grid, from a four-point linear relation.
//!
//! # Conventions
//! Those of `motley-sixvertex`: vertex (x, y) for x, y ≥ 1, paths go up and right; a path from below
//! alone continues up with probability b1 (else turns right), a path from the left alone continues
//! right with probability b2 (else turns up), two paths both go straight. Step boundary: a path
//! enters every row from the left, none from below. H(a, b) is the number of paths crossing the
//! horizontal line b + ½ to the right of a + ½ plus those leaving through the right side in rows
//! ≤ b; under the step boundary H(0, b) = b, H(a, 0) = 0, and H(a, b) counts the paths crossing the
//! vertical line a + ½ in rows 1..=b.
//!
//! # Formula
//! Let **q = b1/b2** and take the vertex (x + 1, y + 1). Then
//!
//! ξ = q^H(x+1, y+1) − b2·q^H(x, y+1) − b1·q^H(x+1, y) + (b1 + b2 − 1)·q^H(x, y)
//!
//! has conditional expectation 0 given the configuration below and to the left of the vertex (every
//! vertex (x', y') with x' ≤ x + 1, y' ≤ y + 1 other than (x + 1, y + 1) itself). Note the order:
//! b2 multiplies the neighbour to the left, b1 the neighbour below.
//!
//! **Derivation** (ours). Let i, j ∈ {0, 1} be the paths entering the vertex from below and from
//! the left, i', j' those leaving up and right, and A = H(x + 1, y). Then H(x, y) = A + i,
//! H(x, y + 1) = A + i + j and H(x + 1, y + 1) = A + j'. Dividing by q^A, ξ has conditional mean 0
//! iff E[q^j'] − c₁q^(i+j) − c₂ + c₃q^i = 0 for the four inputs, with coefficients c₁, c₂, c₃ to be
//! found:
//! * i = j = 0 (j' = 0): 1 − c₁ − c₂ + c₃ = 0;
//! * i = 0, j = 1 (E q^j' = 1 − b2 + b2·q): with the first line, (q − 1)(b2 − c₁) = 0;
//! * i = 1, j = 0 (E q^j' = b1 + (1 − b1)q): then (1 − q)(b1 − c₂) = 0;
//! * i = j = 1 (j' = 1): then (q − 1)(b2·q − b1) = 0.
//!
//! For q ≠ 1 this forces c₁ = b2, c₂ = b1, c₃ = b1 + b2 − 1 and q = b1/b2, and nothing else
//! works: in particular neither q = b2/b1 nor the relation with b1 and b2 exchanged (the tests of
//! `motley-sixvertex` show both failing exactly, in rationals).
//!
//! The vertex's own randomness is independent of everything below and to the left, so taking
//! expectations gives the linear recursion, for x, y ≥ 0,
//!
//! E q^H(x+1, y+1) = b2·E q^H(x, y+1) + b1·E q^H(x+1, y) − (b1 + b2 − 1)·E q^H(x, y),
//!
//! with the step-boundary values E q^H(x, 0) = 1 and E q^H(0, y) = q^y. [`SixVertexQMoments`]
//! fills the (W + 1) × (H + 1) table in O(W·H) operations. The four-point relation does not depend
//! on the boundary; only these boundary values are particular to the step boundary.
//!
//! # Source
//! A. Borodin and V. Gorin, "A stochastic telegraph equation from the six-vertex model", Ann.
//! Probab. 47 (2019): a four-point relation of this kind for q^H, stated there in the paper's own
//! conventions. The attribution and its general shape are from memory; the exact form above is
//! re-derived in our conventions (the four cases above) and checked in rationals against the exact
//! law of small rectangles in `motley-sixvertex` (`tests/q_moment.rs`).
//!
//! # Precision
//! Rounding errors are not amplified, they only accumulate: a perturbation δ of the value at (x₀, y₀) moves the value at
//! (x₀ + m, y₀ + n) by G(m, n)·δ, where G, the Green function of the recursion, has generating
//! function 1/(1 − b2·s − b1·t + (b1 + b2 − 1)·s·t). Writing the denominator as
//! (1 − b2·s)(1 − b1·t) − (1 − b1)(1 − b2)·s·t and expanding (our derivation) gives
//! G(m, n) = Σ_k C(m, k)·b2^(m−k)(1 − b2)^k · C(n, k)·b1^(n−k)(1 − b1)^k = P(X = Y) for independent
//! X ~ Binomial(m, 1 − b2), Y ~ Binomial(n, 1 − b1). So 0 ≤ G ≤ 1 even when b1 + b2 > 1 makes a
//! weight of the recursion negative, and the error at (x, y) is at most the G-weighted sum of the
//! local rounding errors at the points (x', y') ≤ (x, y).
//!
//! [`SixVertexQMoments::error_bound`] carries that sum: with u = 2⁻⁵³, the boundary value q^y (q
//! rounded once, then y multiplications) is off by at most β_y = 4·y·u·q^y; each interior value
//! gets the local term 6u·(b2|E₁| + b1|E₂| + (|b1 + b2 − 1| + 1)|E₃|) (twice the first-order error
//! of three products and two sums plus that of rounding b1 + b2 − 1, the factor 2 covering
//! second-order terms and the rounding of the bound itself), and the bound obeys the recursion
//! itself with these local terms as sources (the boundary column as the source β_y + b1·β_(y−1)).
//! It grows at most like u·max|E| times the number of points (x', y') ≤ (x, y): below 1e-12 on a
//! 60 × 60 grid with q ≤ 1 for the weights of the tests (b1 + b2 below and above 1); for q > 1 it
//! scales with the values, up to q^y. The tests of `motley-sixvertex` hold it against the exact
//! rational recursion on 20 × 20: the true error is at most 13% of the bound, relative error
//! below 2e-14. For q > 1 the values themselves reach q^y and overflow beyond y ≈ 709/ln q; for
//! q < 1 they may underflow (the error bound is then absolute, not relative).

use crate::error::ReferenceError;

/// Half the machine epsilon of `f64`: the unit roundoff u = 2⁻⁵³.
const UNIT_ROUNDOFF: f64 = f64::EPSILON / 2.0;

/// The table of E[q^H(x, y)], 0 ≤ x ≤ W, 0 ≤ y ≤ H, for the colorblind stochastic six-vertex model
/// with the step boundary, q = b1/b2, computed once by the four-point recursion of the module
/// documentation.
///
/// # Examples
/// ```
/// use motley_reference::SixVertexQMoments;
/// let m = SixVertexQMoments::new(0.4, 0.8, 3, 3).unwrap();
/// assert_eq!(m.q(), 0.5);
/// assert_eq!(m.mean_q_power(0, 3), 0.125); // H(0, y) = y
/// assert_eq!(m.mean_q_power(3, 0), 1.0); // H(x, 0) = 0
/// // One vertex: the row-1 path crosses x = 1.5 with probability b2, so E q^H(1, 1) = 0.2 + 0.8 q.
/// assert!((m.mean_q_power(1, 1) - 0.6).abs() < 1e-15);
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct SixVertexQMoments {
    b1: f64,
    b2: f64,
    q: f64,
    width: usize,
    height: usize,
    /// E q^H(x, y) at index y·(W + 1) + x.
    mean: Vec<f64>,
    /// The running rounding-error bound of each entry, same layout.
    bound: Vec<f64>,
}

impl SixVertexQMoments {
    /// The table for weights `b1`, `b2` on `width` columns × `height` rows (x ∈ 0..=width,
    /// y ∈ 0..=height), q = b1/b2. b1 = b2 gives q = 1 and a table of ones.
    ///
    /// # Errors
    /// [`ReferenceError::ProbabilityOutOfRange`] if b1 or b2 ∉ [0, 1] (or NaN);
    /// [`ReferenceError::NotPositive`] if b2 = 0, where q = b1/b2 is undefined.
    pub fn new(b1: f64, b2: f64, width: usize, height: usize) -> Result<Self, ReferenceError> {
        for (name, v) in [("b1", b1), ("b2", b2)] {
            if !(0.0..=1.0).contains(&v) {
                return Err(ReferenceError::ProbabilityOutOfRange { name, value: v });
            }
        }
        if b2 == 0.0 {
            return Err(ReferenceError::NotPositive {
                name: "b2",
                value: b2,
            });
        }
        let q = b1 / b2;
        let c = b1 + b2 - 1.0;
        let row = width + 1;
        let cells = row * (height + 1);
        let mut mean = vec![0.0; cells];
        let mut bound = vec![0.0; cells];
        // y = 0: H(x, 0) = 0, so the value is exactly 1 (no error).
        mean[..row].fill(1.0);
        // x = 0: H(0, y) = y, q^y by repeated multiplication, off by at most β_y; the bound
        // there is the recursion's response to the sources β_y − b1·β_(y−1), bounded in absolute
        // value by β_y + b1·β_(y−1).
        let mut power = 1.0;
        let mut beta_below = 0.0;
        for y in 1..=height {
            power *= q;
            mean[y * row] = power;
            let beta = 4.0 * y as f64 * UNIT_ROUNDOFF * power.abs();
            bound[y * row] = b1 * bound[(y - 1) * row] + beta + b1 * beta_below;
            beta_below = beta;
        }
        for y in 1..=height {
            for x in 1..=width {
                let left = y * row + x - 1; // (x − 1, y)
                let below = (y - 1) * row + x; // (x, y − 1)
                let diagonal = (y - 1) * row + x - 1; // (x − 1, y − 1)
                let (e1, e2, e3) = (mean[left], mean[below], mean[diagonal]);
                mean[y * row + x] = b2 * e1 + b1 * e2 - c * e3;
                // G ≥ 0: the bound propagates by the same signed recursion.
                bound[y * row + x] = b2 * bound[left] + b1 * bound[below] - c * bound[diagonal]
                    + 6.0
                        * UNIT_ROUNDOFF
                        * (b2 * e1.abs() + b1 * e2.abs() + (c.abs() + 1.0) * e3.abs());
            }
        }
        Ok(SixVertexQMoments {
            b1,
            b2,
            q,
            width,
            height,
            mean,
            bound,
        })
    }

    /// q = b1/b2, the base of the moment.
    pub fn q(&self) -> f64 {
        self.q
    }

    /// The weight b1 (a path from below continues up).
    pub fn b1(&self) -> f64 {
        self.b1
    }

    /// The weight b2 (a path from the left continues right).
    pub fn b2(&self) -> f64 {
        self.b2
    }

    /// Number of columns W of the table (x runs over 0..=W).
    pub fn width(&self) -> usize {
        self.width
    }

    /// Number of rows H of the table (y runs over 0..=H).
    pub fn height(&self) -> usize {
        self.height
    }

    fn index(&self, x: usize, y: usize) -> usize {
        assert!(
            x <= self.width && y <= self.height,
            "({x}, {y}) outside the table 0..={} × 0..={}",
            self.width,
            self.height
        );
        y * (self.width + 1) + x
    }

    /// E[q^H(x, y)].
    ///
    /// # Panics
    /// If x > W or y > H.
    pub fn mean_q_power(&self, x: usize, y: usize) -> f64 {
        self.mean[self.index(x, y)]
    }

    /// A bound on the rounding error of [`Self::mean_q_power`]`(x, y)` (module docs, `# Precision`).
    ///
    /// # Panics
    /// If x > W or y > H.
    pub fn error_bound(&self, x: usize, y: usize) -> f64 {
        self.bound[self.index(x, y)]
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    const WEIGHTS: [(f64, f64); 5] = [(0.4, 0.8), (0.3, 0.6), (0.7, 0.2), (0.8, 0.9), (0.5, 0.5)];

    /// Column 1 by hand (our derivation): the path of row y' reaches the vertical edge above
    /// (1, y') unless it goes right; once that edge is occupied it stays occupied (two paths go
    /// straight), so P(edge above (1, y) empty) = b2^y, and H(1, y) = y − 1{edge occupied}.
    /// Hence E q^H(1, y) = q^y·b2^y + q^(y−1)(1 − b2^y) = b1^y + q^(y−1)(1 − b2^y).
    #[test]
    fn first_column_closed_form() {
        for (b1, b2) in WEIGHTS {
            let m = SixVertexQMoments::new(b1, b2, 1, 30).unwrap();
            let q = b1 / b2;
            for y in 1..=30 {
                let want = b1.powi(y as i32) + q.powi(y as i32 - 1) * (1.0 - b2.powi(y as i32));
                let got = m.mean_q_power(1, y);
                assert!(
                    (got - want).abs() <= 1e-14 * want.abs().max(1.0),
                    "b1 = {b1}, b2 = {b2}, y = {y}: {got} vs {want}"
                );
            }
        }
    }

    /// Row 1 by hand: no path from below, so the row-1 path crosses x + ½ iff it went straight at
    /// x vertices: H(x, 1) = 1 with probability b2^x, else 0.
    #[test]
    fn first_row_closed_form() {
        for (b1, b2) in WEIGHTS {
            let m = SixVertexQMoments::new(b1, b2, 30, 1).unwrap();
            let q = b1 / b2;
            for x in 0..=30 {
                let p = b2.powi(x as i32);
                let want = 1.0 - p + q * p;
                let got = m.mean_q_power(x, 1);
                assert!(
                    (got - want).abs() <= 1e-14 * want.abs().max(1.0),
                    "b1 = {b1}, b2 = {b2}, x = {x}: {got} vs {want}"
                );
            }
        }
    }

    /// b2 = 1: paths from the left never turn, so H(x, y) = y and E q^H = b1^y everywhere.
    #[test]
    fn deterministic_when_b2_is_one() {
        let b1 = 0.375;
        let m = SixVertexQMoments::new(b1, 1.0, 20, 20).unwrap();
        for y in 0..=20 {
            for x in 0..=20 {
                let want = b1.powi(y as i32);
                assert!((m.mean_q_power(x, y) - want).abs() <= 1e-15 * want);
            }
        }
    }

    /// b1 = b2: q = 1 and every entry is exactly 1 (the recursion's weights then sum to 1).
    #[test]
    fn q_one_gives_ones() {
        let m = SixVertexQMoments::new(0.5, 0.5, 10, 10).unwrap();
        assert_eq!(m.q(), 1.0);
        for y in 0..=10 {
            for x in 0..=10 {
                assert_eq!(m.mean_q_power(x, y), 1.0);
            }
        }
    }

    /// 0 ≤ H(x, y) ≤ y, H nonincreasing in x and nondecreasing in y, so for q < 1 the moment
    /// lies in [q^y, 1], is nondecreasing in x and nonincreasing in y (reversed for q > 1).
    #[test]
    fn range_and_monotonicity() {
        for (b1, b2) in WEIGHTS {
            let m = SixVertexQMoments::new(b1, b2, 60, 60).unwrap();
            let q = m.q();
            let slack = 1e-12;
            for y in 0..=60 {
                let (lo, hi) = if q <= 1.0 {
                    (q.powi(y as i32), 1.0)
                } else {
                    (1.0, q.powi(y as i32))
                };
                for x in 0..=60 {
                    let v = m.mean_q_power(x, y);
                    assert!(
                        v >= lo * (1.0 - slack) && v <= hi * (1.0 + slack),
                        "b1 = {b1}, b2 = {b2}, ({x}, {y}): {v} outside [{lo}, {hi}]"
                    );
                    let sign = if q <= 1.0 { 1.0 } else { -1.0 };
                    if x > 0 {
                        let step = sign * (v - m.mean_q_power(x - 1, y));
                        assert!(step >= -slack * hi, "not monotone in x at ({x}, {y})");
                    }
                    if y > 0 {
                        let step = sign * (m.mean_q_power(x, y - 1) - v);
                        assert!(step >= -slack * hi, "not monotone in y at ({x}, {y})");
                    }
                }
            }
        }
    }

    /// The Green function of the recursion (the response to a unit source at the origin, with
    /// zero boundary values outside the quadrant) is P(X = Y) for X ~ Binomial(m, 1 − b2),
    /// Y ~ Binomial(n, 1 − b1), as derived in the module documentation.
    #[test]
    fn green_function_is_a_probability() {
        let n_max = 12;
        let binomial = |n: usize, p: f64, k: usize| -> f64 {
            let mut c = 1.0;
            for i in 0..k {
                c = c * (n - i) as f64 / (i + 1) as f64;
            }
            c * p.powi(k as i32) * (1.0 - p).powi((n - k) as i32)
        };
        for (b1, b2) in WEIGHTS {
            let c = b1 + b2 - 1.0;
            let mut g = vec![vec![0.0f64; n_max + 1]; n_max + 1];
            for m in 0..=n_max {
                for n in 0..=n_max {
                    g[m][n] = if m == 0 && n == 0 {
                        1.0
                    } else {
                        let left = if m > 0 { b2 * g[m - 1][n] } else { 0.0 };
                        let below = if n > 0 { b1 * g[m][n - 1] } else { 0.0 };
                        let diag = if m > 0 && n > 0 {
                            c * g[m - 1][n - 1]
                        } else {
                            0.0
                        };
                        left + below - diag
                    };
                    let want: f64 = (0..=m.min(n))
                        .map(|k| binomial(m, 1.0 - b2, k) * binomial(n, 1.0 - b1, k))
                        .sum();
                    assert!(
                        (g[m][n] - want).abs() < 1e-14,
                        "b1 = {b1}, b2 = {b2}, G({m}, {n}) = {} vs {want}",
                        g[m][n]
                    );
                }
            }
        }
    }

    /// The rounding-error bound is tiny on a 60 × 60 grid with q ≤ 1, also when b1 + b2 > 1.
    #[test]
    fn error_bounds() {
        for (b1, b2) in [(0.4, 0.6), (0.5, 0.7), (0.8, 0.9), (0.9, 0.95)] {
            let m = SixVertexQMoments::new(b1, b2, 60, 60).unwrap();
            let worst = (0..=60)
                .flat_map(|y| (0..=60).map(move |x| (x, y)))
                .map(|(x, y)| m.error_bound(x, y))
                .fold(0.0, f64::max);
            println!("b1 = {b1}, b2 = {b2}: largest bound on 60 x 60 {worst:.3e}");
            assert!(worst < 1e-12);
            assert_eq!(m.error_bound(5, 0), 0.0);
        }
    }

    #[test]
    fn rejects_bad_weights() {
        assert!(matches!(
            SixVertexQMoments::new(0.5, 0.0, 2, 2),
            Err(ReferenceError::NotPositive { name: "b2", .. })
        ));
        assert!(matches!(
            SixVertexQMoments::new(1.5, 0.5, 2, 2),
            Err(ReferenceError::ProbabilityOutOfRange { name: "b1", .. })
        ));
        assert!(SixVertexQMoments::new(0.5, f64::NAN, 2, 2).is_err());
        assert!(SixVertexQMoments::new(0.0, 0.5, 2, 2).is_ok()); // q = 0: E 1{H = 0}
    }

    #[test]
    #[should_panic(expected = "outside the table")]
    fn out_of_range_panics() {
        SixVertexQMoments::new(0.4, 0.8, 2, 3)
            .unwrap()
            .mean_q_power(3, 1);
    }
}
