//! Gauss–Legendre quadrature rules on [−1, 1], with an affine map to [a, b].
//!
//! Nodes are the roots of the Legendre polynomial P_m found by Newton's method from the
//! Tricomi-type initial guess cos(π(i − 1/4)/(m + 1/2)); the three-term recurrence gives P_m and
//! P_m'. This is the textbook method (e.g. Golub and Welsch 1969 discuss the alternatives); for
//! m ≤ a few hundred it gives nodes and weights accurate to a few ulps, which the tests check by
//! integrating polynomials of degree up to 2m − 1 exactly.

/// A Gauss–Legendre rule with `m` nodes on [−1, 1].
#[derive(Debug, Clone, PartialEq)]
pub struct GaussLegendre {
    nodes: Vec<f64>,
    weights: Vec<f64>,
}

impl GaussLegendre {
    /// Builds the `m`-node rule (m ≥ 1). It integrates polynomials of degree ≤ 2m − 1 exactly.
    ///
    /// # Panics
    /// If `m == 0`.
    pub fn new(m: usize) -> Self {
        assert!(m > 0, "a Gauss–Legendre rule needs at least one node");
        let mut nodes = vec![0.0; m];
        let mut weights = vec![0.0; m];
        let mf = m as f64;
        for i in 0..m.div_ceil(2) {
            let mut x = (std::f64::consts::PI * (i as f64 + 0.75) / (mf + 0.5)).cos();
            let mut dp = 1.0;
            for _ in 0..100 {
                let (p, d) = legendre(m, x);
                dp = d;
                let dx = p / d;
                x -= dx;
                if dx.abs() < 1e-16 {
                    break;
                }
            }
            let (_, d) = legendre(m, x);
            if d != 0.0 {
                dp = d;
            }
            let w = 2.0 / ((1.0 - x * x) * dp * dp);
            nodes[i] = -x;
            nodes[m - 1 - i] = x;
            weights[i] = w;
            weights[m - 1 - i] = w;
        }
        if m % 2 == 1 {
            nodes[m / 2] = 0.0;
        }
        GaussLegendre { nodes, weights }
    }

    /// Number of nodes.
    pub fn len(&self) -> usize {
        self.nodes.len()
    }

    /// Always false: a rule has at least one node.
    pub fn is_empty(&self) -> bool {
        self.nodes.is_empty()
    }

    /// Nodes and weights mapped affinely to [a, b], in increasing order of the node.
    pub fn on(&self, a: f64, b: f64) -> (Vec<f64>, Vec<f64>) {
        let half = 0.5 * (b - a);
        let mid = 0.5 * (a + b);
        let x = self.nodes.iter().map(|t| mid + half * t).collect();
        let w = self.weights.iter().map(|w| half * w).collect();
        (x, w)
    }

    /// ∫_a^b f(x) dx by this rule.
    pub fn integrate(&self, a: f64, b: f64, mut f: impl FnMut(f64) -> f64) -> f64 {
        let half = 0.5 * (b - a);
        let mid = 0.5 * (a + b);
        let mut sum = 0.0;
        for (t, w) in self.nodes.iter().zip(&self.weights) {
            sum += w * f(mid + half * t);
        }
        half * sum
    }
}

/// (P_m(x), P_m'(x)) by the three-term recurrence.
fn legendre(m: usize, x: f64) -> (f64, f64) {
    let mut p0 = 1.0;
    let mut p1 = x;
    for k in 2..=m {
        let kf = k as f64;
        let p2 = ((2.0 * kf - 1.0) * x * p1 - (kf - 1.0) * p0) / kf;
        p0 = p1;
        p1 = p2;
    }
    if m == 0 {
        return (1.0, 0.0);
    }
    let d = m as f64 * (x * p1 - p0) / (x * x - 1.0);
    (p1, d)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn integrates_polynomials_exactly() {
        for m in [1usize, 2, 5, 20, 64, 120] {
            let rule = GaussLegendre::new(m);
            let total: f64 = rule.weights.iter().sum();
            assert!((total - 2.0).abs() < 1e-13, "m = {m}");
            for k in 0..(2 * m) {
                let got = rule.integrate(0.0, 1.0, |x| x.powi(k as i32));
                let want = 1.0 / (k as f64 + 1.0);
                assert!(
                    (got - want).abs() < 1e-13,
                    "m = {m}, k = {k}: {got} vs {want}"
                );
            }
            // Degree 2m is not integrated exactly (near miss must visibly fail; for large m the
            // error 2^{2m}(m!)^4/((2m+1)((2m)!)^3) · (2m)! falls below rounding, so small m only).
            if m <= 20 {
                let k = 2 * m as i32;
                let got = rule.integrate(-1.0, 1.0, |x| x.powi(k));
                assert!((got - 2.0 / (k as f64 + 1.0)).abs() > 1e-13, "m = {m}");
            }
        }
    }

    #[test]
    fn nodes_are_sorted_and_symmetric() {
        let rule = GaussLegendre::new(41);
        assert!(rule.nodes.windows(2).all(|w| w[0] < w[1]));
        for i in 0..41 {
            assert_eq!(rule.nodes[i], -rule.nodes[40 - i]);
        }
        let (x, w) = rule.on(2.0, 6.0);
        assert!(x[0] > 2.0 && x[40] < 6.0);
        assert!((w.iter().sum::<f64>() - 4.0).abs() < 1e-13);
    }
}
