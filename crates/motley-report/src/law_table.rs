//! The full laws of a claim as a CSV table beside the report (`laws/<claim>.csv`): one row per
//! outcome of each observable, so that a notebook or a spreadsheet reads every outcome, not only the
//! likeliest ones the summary shows.
//!
//! Columns: `observable`, `value` (as the summary prints it), `count` (empty for an exact law),
//! `probability` (frequency or exact probability, shortest round-trip decimal), `fraction` (the exact
//! probability as `p/q` when it was computed in rationals, else empty). Fields holding a comma, a
//! quote or a line break are quoted (RFC 4180).

use motley_scenario::result::FullLaw;

/// The folder of the law tables inside a report.
pub const LAWS: &str = "laws";

/// One CSV field, quoted when it needs to be.
fn field(s: &str) -> String {
    if s.contains([',', '"', '\n', '\r']) {
        format!("\"{}\"", s.replace('"', "\"\""))
    } else {
        s.to_string()
    }
}

/// The CSV text of `laws` (header first, a trailing newline).
pub fn csv(laws: &[FullLaw]) -> String {
    let mut out = String::from("observable,value,count,probability,fraction\n");
    for law in laws {
        for r in &law.rows {
            out.push_str(&field(&law.observable));
            out.push(',');
            out.push_str(&field(&r.value));
            out.push(',');
            if let Some(c) = r.count {
                out.push_str(&c.to_string());
            }
            out.push(',');
            out.push_str(&format!("{:?}", r.probability));
            out.push(',');
            out.push_str(&field(r.fraction.as_deref().unwrap_or("")));
            out.push('\n');
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use motley_scenario::result::LawRow;

    #[test]
    fn rows_are_quoted_where_needed() {
        let law = FullLaw {
            observable: "top".into(),
            samples: 0,
            distinct: 2,
            truncated: false,
            rows: vec![
                LawRow {
                    value: "{1, 3}".into(),
                    count: None,
                    probability: 0.25,
                    fraction: Some("1/4".into()),
                },
                LawRow {
                    value: "(2 1)".into(),
                    count: Some(3),
                    probability: 0.75,
                    fraction: None,
                },
            ],
        };
        assert_eq!(
            csv(&[law]),
            "observable,value,count,probability,fraction\ntop,\"{1, 3}\",,0.25,1/4\ntop,(2 1),3,0.75,\n"
        );
        assert_eq!(field("a\"b"), "\"a\"\"b\"");
    }
}
