//! The discrete-time exclusion process read off the six-vertex model: a view, not a second engine.
//!
//! Read row by row, the model is a particle system in discrete time on the sites `1..=W`: at time
//! `t` (`0 ≤ t ≤ H`) site `x` holds the color on the vertical edge just above vertex `(x, t)` (at
//! `t = 0`, the bottom boundary). Between times `t − 1` and `t` the row-`t` sweep moves each
//! particle some columns to the right, a stronger particle displacing a weaker one by the vertex
//! rule, and injects the color entering row `t` from the left. This module only asks the sampler for
//! the horizontal lines at the chosen times.

use motley_colorblind::Color;

use crate::{Model, ReadoutSpec, SixVertexError};

impl Model {
    /// The exclusion configurations at `times` (each in `0..=H`) of sample `index` under `seed`, in
    /// the order asked: entry `k` has one color per site, site 1 first.
    ///
    /// # Errors
    /// [`SixVertexError::LineOutOfRange`] if a time exceeds `H`.
    pub fn exclusion_view(
        &self,
        seed: u64,
        index: u64,
        times: &[usize],
    ) -> Result<Vec<Vec<Color>>, SixVertexError> {
        let mut r = self.readout(ReadoutSpec {
            horizontal_lines: times.to_vec(),
            ..ReadoutSpec::default()
        })?;
        self.sample(seed, index, &mut r);
        Ok(times
            .iter()
            .map(|&t| {
                r.horizontal_line(t)
                    .map(<[Color]>::to_vec)
                    .unwrap_or_default()
            })
            .collect())
    }
}

#[cfg(test)]
mod tests {
    use crate::{Boundary, Model, ReadoutSpec};

    /// The view at the last time is the top exits; at time 0 it is the bottom boundary; and the
    /// number of particles grows by one per time step exactly when the injected color does not
    /// leave through the right.
    #[test]
    fn view_matches_the_sample() {
        let m = Model::new(0.5, 0.3, Boundary::rainbow(6, 5).unwrap()).unwrap();
        let v = m.exclusion_view(3, 4, &[5, 0, 2]).unwrap();
        let mut r = m.readout(ReadoutSpec::default()).unwrap();
        m.sample(3, 4, &mut r);
        assert_eq!(v[0], r.top());
        assert_eq!(v[1], vec![0; 6]);
        assert!(m.exclusion_view(3, 4, &[6]).is_err());
    }
}
