//! Limit laws of single second-class particles: the uniform speed law in ASEP, and the
//! probability that a second- and a third-class particle started side by side ever meet.
//!
//! # Formula
//! * Speed law (Ferrari and Kipnis 1995): in TASEP/ASEP from step data (particles at x < 0, holes
//!   at x > 0) with a second-class particle at 0, X(t)/t → Uniform[−(p − q), p − q] in law.
//!   At finite t, P(X(t) ≥ x) equals P(site x occupied) in the one-species system started from
//!   the matching step data (a coupling identity exact at every t); its limit is the Rost density.
//! * Meeting probability (Ferrari, Gonçalves and Martin 2009): a second-class particle at 0 and a
//!   third-class particle at 1, all other sites of step data: the probability that they
//!   eventually interact is 2/3 in TASEP and (1 + p)/(3p) in ASEP with p + q = 1, p > 1/2.
//!
//! # Swap versus attempt
//! Ferrari, Gonçalves and Martin's "collision" counts the event that the pair ever *attempts* an
//! exchange — a clock of the bond between them rings while they are adjacent — whichever way the
//! exchange goes. In TASEP (q = 0) the only possible attempt is the second-class particle jumping
//! over the third-class one, which always succeeds, so attempt = swap and the limit is 2/3. When
//! q > 0 an attempt is not the same event as a swap (a completed exchange leaving the
//! second-class particle on the right), so (1 + p)/(3p) must not be read as a swap probability.
//! [`asep_collision_probability`] returns the collision (attempt) probability only.

use crate::error::ReferenceError;

/// The TASEP limit probability that the second- and third-class particles started at 0 and 1
/// ever swap: 2/3 (Ferrari, Gonçalves and Martin 2009; also 1/2 + 1/6 from the speed-process
/// law of Amir, Angel and Valkó 2011, see [`crate::SpeedProcessPair`]).
pub const TASEP_SWAP_PROBABILITY: f64 = 2.0 / 3.0;

/// The ASEP (p + q = 1) limit probability that the second- and third-class particles started at
/// 0 and 1 ever *collide* (attempt an exchange): (1 + p)/(3p) (Ferrari, Gonçalves and Martin
/// 2009). Equals 2/3 at p = 1 and tends to 1 as p ↓ 1/2. Not a swap probability when q > 0; see
/// the module documentation.
///
/// # Errors
/// [`ReferenceError::NotRightBiased`] unless 1/2 < p ≤ 1.
pub fn asep_collision_probability(p: f64) -> Result<f64, ReferenceError> {
    if !(p > 0.5 && p <= 1.0) {
        return Err(ReferenceError::NotRightBiased { p });
    }
    Ok((1.0 + p) / (3.0 * p))
}

/// The limit half-width p − q of the second-class speed law Uniform[−(p − q), p − q].
///
/// # Errors
/// [`ReferenceError::NotFinite`] for non-finite rates, [`ReferenceError::NotPositive`] unless
/// p − q > 0 and q ≥ 0.
pub fn second_class_speed_half_width(p: f64, q: f64) -> Result<f64, ReferenceError> {
    Ok(crate::TasepStep::asep(p, q)?.speed())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn collision_probability_values() {
        assert!((asep_collision_probability(1.0).unwrap() - TASEP_SWAP_PROBABILITY).abs() < 1e-15);
        assert!((asep_collision_probability(0.75).unwrap() - 1.75 / 2.25).abs() < 1e-15);
        assert!(asep_collision_probability(0.5 + 1e-12).unwrap() < 1.0 + 1e-11);
        assert!(asep_collision_probability(0.5).is_err());
        assert!(asep_collision_probability(1.01).is_err());
        assert!(asep_collision_probability(f64::NAN).is_err());
        // decreasing in p
        assert!(
            asep_collision_probability(0.6).unwrap() > asep_collision_probability(0.9).unwrap()
        );
        assert!((second_class_speed_half_width(0.8, 0.2).unwrap() - 0.6).abs() < 1e-15);
        assert!(second_class_speed_half_width(0.2, 0.8).is_err());
    }
}
