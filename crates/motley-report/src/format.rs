//! Number and text formatting for the Markdown summary.
//!
//! p-values are always printed in scientific notation with three significant digits, so that a reader
//! compares exponents at a glance; a p-value that underflowed to 0 is printed `< 1e-300`, never `0`.
//! Other numbers get four significant digits, fixed-point in the usual range and scientific outside it.

pub(crate) use motley_scenario::number_text::{num, p_value, short};

/// Text made safe for one Markdown table cell: no line breaks, `|` escaped.
pub(crate) fn cell(text: &str) -> String {
    text.replace('|', "\\|")
        .replace("\r\n", " ")
        .replace(['\n', '\r'], " ")
}

/// Inline code that survives backticks in the text.
pub(crate) fn code(text: &str) -> String {
    if text.contains('`') {
        format!("`` {} ``", cell(text))
    } else {
        format!("`{}`", cell(text))
    }
}

/// A command line, each argument quoted for a POSIX shell when it needs it.
pub(crate) fn shell_line(args: &[String]) -> String {
    args.iter()
        .map(|a| shell_quote(a))
        .collect::<Vec<_>>()
        .join(" ")
}

/// One argument quoted for a POSIX shell when it holds anything beyond a safe set.
fn shell_quote(arg: &str) -> String {
    let safe = !arg.is_empty()
        && arg
            .chars()
            .all(|c| c.is_ascii_alphanumeric() || "-_./=:,+@%".contains(c));
    if safe {
        arg.to_string()
    } else {
        format!("'{}'", arg.replace('\'', "'\\''"))
    }
}

/// Seconds as `0.42 s`, `12.3 s`, `4 min 05 s`, `2 h 03 min`.
pub(crate) fn duration(seconds: f64) -> String {
    if !seconds.is_finite() || seconds < 0.0 {
        return "unknown".into();
    }
    if seconds < 60.0 {
        format!("{} s", num(seconds))
    } else if seconds < 3600.0 {
        let s = seconds.round() as u64;
        format!("{} min {:02} s", s / 60, s % 60)
    } else {
        let m = (seconds / 60.0).round() as u64;
        format!("{} h {:02} min", m / 60, m % 60)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn cells_and_code_are_escaped() {
        assert_eq!(cell("a|b\nc"), "a\\|b c");
        assert_eq!(code("x"), "`x`");
        assert_eq!(code("a`b"), "`` a`b ``");
    }

    #[test]
    fn shell_line_quotes_only_when_needed() {
        let args: Vec<String> = ["motley", "run", "my file.yaml", "--out", "it's"]
            .iter()
            .map(|s| s.to_string())
            .collect();
        assert_eq!(
            shell_line(&args),
            "motley run 'my file.yaml' --out 'it'\\''s'"
        );
    }

    #[test]
    fn durations_read_naturally() {
        assert_eq!(duration(0.42), "0.42 s");
        assert_eq!(duration(245.0), "4 min 05 s");
        assert_eq!(duration(7380.0), "2 h 03 min");
    }
}
