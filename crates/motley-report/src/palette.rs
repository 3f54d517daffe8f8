//! The report's colours: one fixed colour per side, a grey for references, and a continuous scale for
//! the colors of six-vertex paths.
//!
//! # Design
//! Side colours are a dark teal and a burnt orange: they differ in hue and in lightness, so they stay
//! apart in greyscale print and for the common red–green colour-vision deficiencies. Confidence bands use
//! the side colour at low opacity. The path scale runs indigo → teal → moss → amber → brick, increasing in
//! lightness to amber, so neighbouring colors are distinguishable and the order is readable.

/// A colour as 8-bit red, green, blue.
pub(crate) type Rgb = (u8, u8, u8);

/// Side colours, in order: deep teal, burnt orange, plum, olive, steel blue, rose.
pub(crate) const SIDES: [Rgb; 6] = [
    (11, 110, 116),
    (200, 88, 30),
    (123, 63, 140),
    (107, 127, 26),
    (52, 94, 150),
    (176, 66, 110),
];

/// References and limits: slate grey.
pub(crate) const REFERENCE: Rgb = (91, 103, 112);

/// Faint lines: empty edges of a sample picture.
pub(crate) const FAINT: Rgb = (226, 230, 233);

/// Text.
pub(crate) const INK: Rgb = (34, 34, 34);

/// Anchors of the continuous path scale, evenly spaced on [0, 1].
const SCALE: [Rgb; 5] = [
    (38, 42, 110),
    (11, 122, 128),
    (110, 154, 47),
    (224, 168, 46),
    (184, 52, 47),
];

/// The colour of side `i` (cycling past six sides).
pub(crate) fn side(i: usize) -> Rgb {
    SIDES[i % SIDES.len()]
}

/// The colour at position `t` in [0, 1] of the continuous scale (clamped), by linear interpolation.
pub(crate) fn scale(t: f64) -> Rgb {
    let t = if t.is_finite() {
        t.clamp(0.0, 1.0)
    } else {
        0.0
    };
    let pos = t * (SCALE.len() - 1) as f64;
    let i = (pos.floor() as usize).min(SCALE.len() - 2);
    let f = pos - i as f64;
    let (a, b) = (SCALE[i], SCALE[i + 1]);
    let mix = |u: u8, v: u8| (u as f64 + (v as f64 - u as f64) * f).round() as u8;
    (mix(a.0, b.0), mix(a.1, b.1), mix(a.2, b.2))
}

/// The colour of path color `c` among `1..=max_color` (`c ≥ 1`).
pub(crate) fn path_color(c: u32, max_color: u32) -> Rgb {
    if max_color <= 1 {
        scale(0.0)
    } else {
        scale((c.saturating_sub(1)) as f64 / (max_color - 1) as f64)
    }
}

/// `#rrggbb`.
pub(crate) fn hex(c: Rgb) -> String {
    format!("#{:02x}{:02x}{:02x}", c.0, c.1, c.2)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn scale_hits_its_anchors_and_clamps() {
        assert_eq!(scale(0.0), SCALE[0]);
        assert_eq!(scale(0.25), SCALE[1]);
        assert_eq!(scale(1.0), SCALE[4]);
        assert_eq!(scale(2.0), SCALE[4]);
        assert_eq!(scale(-1.0), SCALE[0]);
        assert_eq!(scale(f64::NAN), SCALE[0]);
    }

    #[test]
    fn path_colors_span_the_scale() {
        assert_eq!(path_color(1, 10), SCALE[0]);
        assert_eq!(path_color(10, 10), SCALE[4]);
        assert_eq!(path_color(1, 1), SCALE[0]);
        assert_ne!(path_color(2, 10), path_color(3, 10));
    }

    #[test]
    fn hex_is_lowercase_six_digits() {
        assert_eq!(hex((11, 110, 116)), "#0b6e74");
    }

    #[test]
    fn side_colours_cycle() {
        assert_eq!(side(0), side(6));
        assert_ne!(side(0), side(1));
    }
}
