//! Numbers as text, for verdict sentences and the report: p-values in scientific notation with three
//! significant digits, other numbers with four, user parameters in their shortest exact form.
//!
//! p-values are always printed in scientific notation, so that a reader compares exponents at a
//! glance; a p-value that underflowed to 0 is printed `< 1e-300`, never `0`.

/// Smallest p-value printed as a number; below it (including an underflow to 0) `< 1e-300`.
const P_FLOOR: f64 = 1e-300;

/// A p-value: `3.42e-1`, `1.00e0`, `< 1e-300`, `NaN`.
pub fn p_value(p: f64) -> String {
    if p.is_nan() {
        "NaN".to_string()
    } else if p < P_FLOOR {
        "< 1e-300".to_string()
    } else {
        format!("{p:.2e}")
    }
}

/// A general number with four significant digits: `0.1235`, `12.35`, `1235`, `1.235e-5`, `20000`.
pub fn num(x: f64) -> String {
    if !x.is_finite() {
        return if x.is_nan() {
            "NaN".into()
        } else if x > 0.0 {
            "∞".into()
        } else {
            "−∞".into()
        };
    }
    if x == x.trunc() && x.abs() < 1e15 {
        return format!("{x:.0}");
    }
    let a = x.abs();
    if (1e-3..1e6).contains(&a) {
        let digits_before = a.log10().floor() as i32 + 1;
        let decimals = (4 - digits_before).max(0) as usize;
        let s = format!("{x:.decimals$}");
        trim_zeros(&s)
    } else {
        format!("{x:.3e}")
    }
}

/// A parameter given by the user (α, power): shortest exact form when it is short, else [`num`].
pub fn short(x: f64) -> String {
    let s = format!("{x}");
    if s.len() <= 8 {
        s
    } else {
        num(x)
    }
}

/// Drops trailing zeros after a decimal point (`0.1200` → `0.12`, `3.000` → `3`).
fn trim_zeros(s: &str) -> String {
    if s.contains('.') {
        s.trim_end_matches('0').trim_end_matches('.').to_string()
    } else {
        s.to_string()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn p_values_are_scientific_with_three_digits() {
        assert_eq!(p_value(0.34156), "3.42e-1");
        assert_eq!(p_value(1.0), "1.00e0");
        assert_eq!(p_value(1.234e-7), "1.23e-7");
        assert_eq!(p_value(2.5e-300), "2.50e-300");
    }

    #[test]
    fn tiny_p_values_are_never_zero() {
        assert_eq!(p_value(0.0), "< 1e-300");
        assert_eq!(p_value(1e-320), "< 1e-300");
        assert_eq!(p_value(f64::NAN), "NaN");
    }

    #[test]
    fn numbers_have_four_significant_digits() {
        assert_eq!(num(0.123456), "0.1235");
        assert_eq!(num(12.3456), "12.35");
        assert_eq!(num(1234.56), "1235");
        assert_eq!(num(0.5), "0.5");
        assert_eq!(num(20000.0), "20000");
        assert_eq!(num(-0.25), "-0.25");
        assert_eq!(num(1.2346e-5), "1.235e-5");
        assert_eq!(num(f64::INFINITY), "∞");
    }

    #[test]
    fn short_keeps_user_parameters() {
        assert_eq!(short(0.01), "0.01");
        assert_eq!(short(0.8), "0.8");
        assert_eq!(short(1.0 / 3.0), "0.3333");
    }
}
