//! The summary a person reads first: verdict lines, test tables with Holm-adjusted p-values, effect
//! sizes, estimates, figure links and the reproduce section, for a hand-built result.

use crate::common;

use std::fs;
use std::path::Path;

use motley_report::{verdict_line, write_report, ReportExtras};
use motley_scenario::result::Discrepancy;

fn write_full(dir: &Path) -> String {
    let extras = ReportExtras::new(
        "name: demo-rainbow\nseed: 20240611\n",
        vec![
            "motley".into(),
            "run".into(),
            "scenarios/demo rainbow.yaml".into(),
            "--threads".into(),
            "2".into(),
        ],
    )
    .with_picture(common::picture(), "Sample 0 of model `rect`");
    write_report(dir, &common::full(), &extras, false).unwrap();
    fs::read_to_string(dir.join("summary.md")).unwrap()
}

#[test]
fn verdict_lines_use_the_fixed_words() {
    let r = common::full();
    let alpha = r.scenario.alpha;
    let lines: Vec<String> = r.claims.iter().map(|c| verdict_line(c, alpha)).collect();
    assert_eq!(
        lines,
        [
            "not rejected at α = 0.01",
            "REJECTED at α = 0.01",
            "holds exactly (Kolmogorov distance 0 up to 1e-13)",
            "estimated (no test: nothing stated to test against)",
            "described (no claim tested)",
        ]
    );
    // An exact rejection states the discrepancy under its own name.
    let mut c = common::exact_law("x");
    c.rejected = true;
    c.exact.as_mut().unwrap().discrepancy = 0.0417;
    assert_eq!(
        verdict_line(&c, alpha),
        "REJECTED exactly (Kolmogorov distance 0.0417, numerical error ≤ 1e-13)"
    );
    c.exact.as_mut().unwrap().measure = Some(Discrepancy::MeanGap);
    assert_eq!(
        verdict_line(&c, alpha),
        "REJECTED exactly (|mean − m₀| 0.0417, numerical error ≤ 1e-13)"
    );
}

#[test]
fn summary_has_overview_verdicts_and_test_table() {
    let tmp = tempfile::tempdir().unwrap();
    let md = write_full(&tmp.path().join("rep"));
    assert!(md.starts_with("# Rainbow exits against the transposed occupation\n"));
    assert!(md.contains("An invented scenario for the report tests."));
    // Overview row of the rejected claim, linking to its section by a sanitized anchor.
    assert!(
        md.contains(
            "| [`near miss`](#claim-near-miss) | same-law | Monte Carlo | REJECTED at α = 0.01 |"
        ),
        "{md}"
    );
    assert!(md.contains("<a id=\"claim-near-miss\"></a>"));
    assert!(md.contains(
        "**Verdict: not rejected at α = 0.01.**\nNo difference found between the two laws."
    ));
    assert!(md.contains("**Verdict: REJECTED at α = 0.01.**"));
    assert!(md.contains("**Verdict: holds exactly (Kolmogorov distance 0 up to 1e-13).**"));
    // Test table header and rows: role, statistic, dof, p-value; only the deciding test rejects.
    assert!(md.contains(
        "| Test | Role | Statistic | Degrees of freedom | p-value | At α = 0.01 | Note |"
    ));
    assert!(md.contains(
        "| chi-square on the joint law | deciding | 18.2 | 14 | 4.12e-1 | does not reject | pooled cells with expected count below 5 |"
    ), "{md}");
    assert!(md.contains(
        "| Kolmogorov–Smirnov on the set size | diagnostic | 0.0121 | — | 7.31e-1 | — |"
    ));
    assert!(
        md.contains("diagnostics are shown with their own p-values and do not move the verdict")
    );
    // An underflowed p-value is never printed as 0.
    assert!(
        md.contains(
            "| chi-square on the joint law | deciding | 18.2 | 14 | < 1e-300 | **rejects** |"
        ),
        "{md}"
    );
}

#[test]
fn summary_states_effect_power_and_limits() {
    let tmp = tempfile::tempdir().unwrap();
    let md = write_full(&tmp.path().join("rep"));
    assert!(md.contains(
        "| Measure | Estimate | Upper bound (99% confidence) | Smallest detectable difference (power 0.8) |"
    ));
    assert!(md.contains(
        "| total variation | 0.0061 (plug-in 0.0103 minus its same-law level 0.0042) | 0.0143 | 0.0187 (total variation on the 14 compared cells) |"
    ), "{md}");
    assert!(md.contains("The power statement covers differences between the 14 compared cells."));
    assert!(md.contains(
        "not rejected at α = 0.01 with power 0.8 against differences of total variation on the 14 compared cells ≥ 0.0187"
    ));
    assert!(md.contains("Monte Carlo never proves an identity."));
    assert!(md.contains("proves the identity only for the size enumerated"));
    // Three tested claims (the describe claim and the untested probability excluded) at 0.01 each.
    assert!(
        md.contains("with 3 tested claims, the chance of at least one false alarm is at most 0.03")
    );
}

#[test]
fn summary_has_estimate_tables() {
    let tmp = tempfile::tempdir().unwrap();
    let md = write_full(&tmp.path().join("rep"));
    assert!(md.contains(
        "| Event | Successes / trials | Estimate | Wilson interval | Clopper–Pearson interval |"
    ));
    assert!(
        md.contains("| t = 10 | 2200 / 4000 | 0.55 | [0.53, 0.57] | [0.525, 0.575] |"),
        "{md}"
    );
    // Top outcomes side by side; the shorter side padded.
    assert!(
        md.contains("| Rank | `top-exits` | Probability | `transposed-occupation` | Probability |")
    );
    assert!(md.contains("| 1 | `{1, 3}` | 0.12 | `{1, 3}` | 0.118 |"));
    assert!(md.contains("| 2 | `{3}` | 0.09 | | |"));
    // Moments: an empty label falls back to the observable's name.
    assert!(md.contains("| top-exits | 20000 | 2.4 | 1.21 |"));
    assert!(md.contains("### Exact decision\n\n| Measure | Value | Numerical error bound | Outcomes enumerated | Exact probability |"));
    assert!(md.contains("| Kolmogorov distance | 0 | 1e-13 | 11 | — |"));
}

#[test]
fn summary_links_only_existing_figures() {
    let tmp = tempfile::tempdir().unwrap();
    let dir = tmp.path().join("rep");
    let md = write_full(&dir);
    let links: Vec<&str> = md
        .split("](")
        .skip(1)
        .map(|rest| rest.split(')').next().unwrap())
        .filter(|l| l.starts_with("figures/"))
        .collect();
    assert!(!links.is_empty());
    for l in &links {
        assert!(dir.join(l).is_file(), "summary links missing {l}");
    }
    for f in fs::read_dir(dir.join("figures")).unwrap() {
        let name = format!("figures/{}", f.unwrap().file_name().to_string_lossy());
        assert!(
            links.contains(&name.as_str()),
            "figure {name} is not linked"
        );
    }
    assert!(md.contains("![sample configuration](figures/sample.svg)"));
    assert!(md.contains("Sample 0 of model `rect` (2 × 2 vertices)."));
}

#[test]
fn summary_reproduce_section_has_everything_to_rerun() {
    let tmp = tempfile::tempdir().unwrap();
    let md = write_full(&tmp.path().join("rep"));
    let repro = &md[md.find("## Reproduce").expect("no Reproduce section")..];
    for row in [
        "| Samples per side | 20000 |",
        "| Seed | 20240611 |",
        "| motley version | 0.1.0 |",
        "| Git commit | `0123456789abcdef0123456789abcdef01234567` |",
        &format!("| Scenario hash (SHA-256) | `{}` |", "ab".repeat(32)),
        "| Wall time | 12.34 s on 2 threads (3241 samples/s) |",
    ] {
        assert!(repro.contains(row), "missing {row}");
    }
    assert!(repro.contains("```sh\nmotley run 'scenarios/demo rainbow.yaml' --threads 2\n```"));
}

#[test]
fn summary_differs_between_reruns_only_in_timing() {
    let tmp = tempfile::tempdir().unwrap();
    let extras = ReportExtras::new("x: 1\n", vec![]);
    let a = common::full();
    let mut b = common::full();
    b.timing.wall_seconds = 99.0;
    write_report(&tmp.path().join("a"), &a, &extras, false).unwrap();
    write_report(&tmp.path().join("b"), &b, &extras, false).unwrap();
    let read = |d: &str| fs::read_to_string(tmp.path().join(d).join("summary.md")).unwrap();
    let (sa, sb) = (read("a"), read("b"));
    let diff: Vec<(&str, &str)> = sa.lines().zip(sb.lines()).filter(|(x, y)| x != y).collect();
    assert_eq!(diff.len(), 1, "{diff:?}");
    assert!(diff[0].0.starts_with("| Wall time |"));
    // Figures are byte-identical.
    for f in fs::read_dir(tmp.path().join("a/figures")).unwrap() {
        let name = f.unwrap().file_name();
        assert_eq!(
            fs::read(tmp.path().join("a/figures").join(&name)).unwrap(),
            fs::read(tmp.path().join("b/figures").join(&name)).unwrap()
        );
    }
}
