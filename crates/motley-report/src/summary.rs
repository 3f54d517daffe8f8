//! `summary.md`, the page a person reads first: what was claimed, what the run decided and how
//! strongly, the numbers behind it, the figures, how to reproduce it, and what a run of this kind can
//! and cannot show.
//!
//! # Design
//! Verdict words are fixed so that a reader (or `grep`) can find them: `not rejected at α = …`,
//! `REJECTED at α = …`, `holds exactly (…)`, `REJECTED exactly (…)`, `described (no claim tested)`.
//! The sentence the run itself gives (`ClaimResult::verdict`) follows on the next line. All tables are
//! plain GitHub-flavoured Markdown; each claim section has an explicit anchor so the overview table
//! can link to it whatever characters its id holds.

use std::fmt::Write as _;

use motley_scenario::result::{
    ClaimResult, DecidedBy, Decision, ErrorControl, ExactResult, RunResult, Sequential, StatedRole,
    StopReason, TestRole,
};

use crate::extras::ReportExtras;
use crate::figures::Figure;
use crate::format::{cell, code, duration, num, p_value, shell_line, short};
use crate::picture_draw::DrawnPicture;
use crate::side::side_label;

/// A bound written compactly: `0`, `1e-13`, `2.35e-14`.
fn bound(x: f64) -> String {
    if x == 0.0 {
        return "0".into();
    }
    let s = format!("{x:e}");
    if s.len() <= 8 {
        s
    } else {
        format!("{x:.2e}")
    }
}

/// Whether `claim` was decided by exact enumeration.
fn is_exact(claim: &ClaimResult) -> bool {
    claim.decided_by == DecidedBy::Exact && claim.exact.is_some()
}

/// Whether `claim` only describes (tests nothing).
fn is_describe(claim: &ClaimResult) -> bool {
    claim.kind.describes_only()
}

/// Whether `claim` was put to a test or an exact decision (and so could raise a false alarm).
fn is_tested(claim: &ClaimResult) -> bool {
    !is_describe(claim) && (is_exact(claim) || !claim.tests.is_empty())
}

/// The verdict of one claim in fixed words, e.g. `not rejected at α = 0.01` or
/// `holds exactly (total variation 0 up to 1e-13)`.
pub fn verdict_line(claim: &ClaimResult, alpha: f64) -> String {
    let a = short(alpha);
    if is_describe(claim) {
        return if is_exact(claim) {
            "described exactly (no claim tested)".into()
        } else {
            "described (no claim tested)".into()
        };
    }
    if let (true, Some(ex)) = (is_exact(claim), &claim.exact) {
        let d = ex.discrepancy;
        let what = measure_words(ex);
        let err = bound(ex.error_bound);
        return match (claim.rejected, d <= ex.error_bound) {
            (false, true) => format!("holds exactly ({what} 0 up to {err})"),
            (false, false) => format!(
                "holds exactly within the claim's tolerance ({what} {}, numerical error ≤ {err})",
                num(d)
            ),
            (true, _) => format!(
                "REJECTED exactly ({what} {}, numerical error ≤ {err})",
                num(d)
            ),
        };
    }
    let _ = a;
    let level = short(claim.level);
    let tol = claim.tolerance.map_or(String::new(), short);
    match claim.decision {
        Decision::NoClaim => "estimated (no test: nothing stated to test against)".into(),
        Decision::Rejected => format!("REJECTED at α = {level}"),
        Decision::EqualWithin => format!("EQUAL WITHIN {tol} (not rejected at α = {level})"),
        Decision::Undecided => {
            format!("UNDECIDED: not rejected at α = {level}, not shown within {tol}")
        }
        Decision::NotRejected => format!("not rejected at α = {level}"),
        Decision::HoldsExactly => "holds exactly".into(),
    }
}

/// Human name of how a claim was decided.
fn decided(claim: &ClaimResult) -> &'static str {
    match claim.decided_by {
        DecidedBy::Exact => "exact",
        DecidedBy::MonteCarlo => "Monte Carlo",
    }
}

/// What an exact discrepancy measures, in words (`discrepancy` when nothing was compared).
fn measure_words(ex: &ExactResult) -> &'static str {
    ex.measure.map_or("discrepancy", |m| m.words())
}

/// The p-value of a claim's deciding test as compared with its level, if it has one.
fn deciding_p(claim: &ClaimResult) -> Option<f64> {
    claim
        .tests
        .iter()
        .find(|t| t.role == TestRole::Deciding)
        .map(|t| t.adjusted_p_value)
}

/// The anchor of a claim's section.
fn anchor(stem: &str) -> String {
    format!("claim-{stem}")
}

/// Renders the whole summary.
pub(crate) fn render(
    result: &RunResult,
    extras: &ReportExtras,
    stems: &[String],
    figures: &[Vec<Figure>],
    picture: Option<&DrawnPicture>,
) -> String {
    let sc = &result.scenario;
    let alpha = sc.alpha;
    let mut s = String::new();
    let title = if sc.title.trim().is_empty() {
        sc.name.as_str()
    } else {
        sc.title.as_str()
    };
    let _ = writeln!(s, "# {}\n", title.trim());
    if !sc.description.trim().is_empty() {
        let _ = writeln!(s, "{}\n", sc.description.trim());
    }
    let rejected = result.claims.iter().filter(|c| c.rejected).count();
    let control = match sc.error_control {
        ErrorControl::PerClaim => format!("α = {} per claim", short(alpha)),
        ErrorControl::FalseDiscoveryRate => format!(
            "false discovery rate ≤ {} across claims (Benjamini–Hochberg)",
            short(alpha)
        ),
    };
    let _ = writeln!(
        s,
        "Scenario {} · {} claim{} · {} rejected · {control} · motley {} · schema `{}`\n",
        code(&sc.name),
        result.claims.len(),
        if result.claims.len() == 1 { "" } else { "s" },
        rejected,
        result.motley_version,
        result.schema
    );
    if let Some(q) = &result.sequential {
        sequence_note(&mut s, q);
    }

    overview(&mut s, result, stems);
    for (i, claim) in result.claims.iter().enumerate() {
        claim_section(&mut s, result, claim, &stems[i], &figures[i]);
    }
    if let Some(p) = picture {
        let _ = writeln!(s, "## Sample configuration\n");
        for f in &p.files {
            let _ = writeln!(s, "![sample configuration]({f})\n");
        }
        let _ = writeln!(s, "{}\n", p.caption);
    }
    reproduce(&mut s, result, extras);
    limits(&mut s, result);
    s
}

/// Where a sequential run stopped and why.
fn sequence_note(s: &mut String, q: &Sequential) {
    let why = match q.stopped {
        StopReason::AllDecided => "every claim was decided",
        StopReason::LastLook => "the last planned look was reached",
        StopReason::LookAsked => {
            "only this look was asked for; the next look continues the sequence"
        }
    };
    let looks: Vec<String> = q
        .looks
        .iter()
        .zip(&q.levels)
        .map(|(n, a)| format!("{n} (α {})", num(*a)))
        .collect();
    let _ = writeln!(
        s,
        "Sampled until decided: stopped at look {} of {} with {} samples per side because {why}. \
         Planned looks (samples per side, level): {}. The levels add up to α (quadratic α-spending, \
         union bound), so the error over all looks stays at most α.\n",
        q.looks_taken,
        q.looks.len(),
        q.samples_used,
        looks.join(", ")
    );
}

/// The table of claims with their verdicts.
fn overview(s: &mut String, result: &RunResult, stems: &[String]) {
    let _ = writeln!(s, "## Claims\n");
    if result.claims.is_empty() {
        let _ = writeln!(s, "This scenario states no claims.\n");
        return;
    }
    let _ = writeln!(
        s,
        "| Claim | Kind | Decided by | Verdict | Deciding p | Effect (upper bound) |"
    );
    let _ = writeln!(s, "|---|---|---|---|---|---|");
    for (claim, stem) in result.claims.iter().zip(stems) {
        let p = deciding_p(claim).map_or("—".into(), p_value);
        let effect = match (&claim.exact, &claim.effect) {
            (Some(ex), _) if is_exact(claim) => {
                format!("{} {}", measure_words(ex), num(ex.discrepancy))
            }
            (_, Some(e)) => format!(
                "{} {} (≤ {})",
                e.measure,
                num(e.estimate),
                num(e.upper_bound)
            ),
            _ => "—".into(),
        };
        let _ = writeln!(
            s,
            "| [{}](#{}) | {} | {} | {} | {} | {} |",
            code(&claim.id),
            anchor(stem),
            cell(claim.kind.as_str()),
            decided(claim),
            cell(&verdict_line(claim, result.scenario.alpha)),
            p,
            cell(&effect)
        );
    }
    s.push('\n');
}

/// One claim: words, verdict, tests, effect, exact decision, estimates, figures.
fn claim_section(
    s: &mut String,
    result: &RunResult,
    claim: &ClaimResult,
    stem: &str,
    figures: &[Figure],
) {
    let alpha = result.scenario.alpha;
    let _ = writeln!(s, "<a id=\"{}\"></a>\n", anchor(stem));
    let _ = writeln!(s, "## Claim {}\n", code(&claim.id));
    if !claim.says.trim().is_empty() {
        for line in claim.says.trim().lines() {
            let _ = writeln!(s, "> {line}");
        }
        s.push('\n');
    }
    let _ = writeln!(s, "**Verdict: {}.**", verdict_line(claim, alpha));
    if !claim.verdict.trim().is_empty() {
        let _ = writeln!(s, "{}", claim.verdict.trim());
    }
    s.push('\n');
    let obs = if claim.observables.is_empty() {
        "none".to_string()
    } else {
        claim
            .observables
            .iter()
            .map(|o| code(o))
            .collect::<Vec<_>>()
            .join(", ")
    };
    let samples = if is_exact(claim) {
        "decided by exact enumeration".to_string()
    } else {
        format!("{} samples per side", claim.samples)
    };
    let _ = writeln!(
        s,
        "Kind: {} · observables: {obs} · {samples}.\n",
        code(claim.kind.as_str())
    );

    if !claim.tests.is_empty() {
        let _ = writeln!(s, "### Tests\n");
        let _ = writeln!(
            s,
            "| Test | Role | Statistic | Degrees of freedom | p-value | At α = {} | Note |",
            short(claim.level)
        );
        let _ = writeln!(s, "|---|---|---|---|---|---|---|");
        for t in &claim.tests {
            let (role, verdict) = match t.role {
                TestRole::Deciding => (
                    "deciding",
                    if t.rejected {
                        "**rejects**"
                    } else {
                        "does not reject"
                    },
                ),
                TestRole::Diagnostic => ("diagnostic", "—"),
            };
            let p = if t.adjusted_p_value != t.p_value {
                format!(
                    "{} (adjusted {})",
                    p_value(t.p_value),
                    p_value(t.adjusted_p_value)
                )
            } else {
                p_value(t.p_value)
            };
            let _ = writeln!(
                s,
                "| {} | {role} | {} | {} | {p} | {verdict} | {} |",
                cell(&t.name),
                num(t.statistic),
                t.dof.map_or("—".into(), num),
                cell(&t.note)
            );
        }
        let _ = writeln!(
            s,
            "\nThe claim is decided by its one deciding test at level α = {}; diagnostics are shown \
             with their own p-values and do not move the verdict.\n",
            short(claim.level)
        );
    }

    if let Some(e) = &claim.effect {
        let alpha = claim.level;
        let _ = writeln!(s, "### Effect size\n");
        let _ = writeln!(
            s,
            "| Measure | Estimate | Upper bound ({}% confidence) | Smallest detectable difference (power {}) |",
            num(100.0 * (1.0 - alpha)),
            short(result.scenario.power)
        );
        let _ = writeln!(s, "|---|---|---|---|");
        let estimate = match (e.plug_in, e.same_law_level) {
            (Some(plug), Some(level)) => format!(
                "{} (plug-in {} minus its same-law level {})",
                num(e.estimate),
                num(plug),
                num(level)
            ),
            _ => num(e.estimate),
        };
        let _ = writeln!(
            s,
            "| {} | {estimate} | {} | {} ({}) |\n",
            cell(&e.measure),
            num(e.upper_bound),
            num(e.detectable),
            cell(&e.detectable_measure)
        );
        if !e.covers.is_empty() {
            let _ = writeln!(
                s,
                "The power statement covers {}.\n",
                e.covers.trim_end_matches('.')
            );
        }
        if let (Some(plug), Some(level)) = (e.plug_in, e.same_law_level) {
            if level > 0.5 * plug && level > 0.01 {
                let _ = writeln!(
                    s,
                    "Most of the plug-in value is sampling noise: two samples of one law this size \
                     would show about {} on these outcomes. The estimate subtracts it; the upper bound \
                     holds either way.\n",
                    num(level)
                );
            }
        }
        if is_describe(claim) {
            let _ = writeln!(
                s,
                "Nothing is tested here: the distance to the reference is shown with its {}% upper bound. \
                 On integer-valued data the distance includes the lattice's own steps.\n",
                num(100.0 * (1.0 - alpha))
            );
        } else if !is_exact(claim) {
            let shows = if claim.rejected {
                format!(
                    "What the run shows: a difference was found; the {} is estimated at {} and is at most {} \
                     at {}% confidence.",
                    e.measure,
                    num(e.estimate),
                    num(e.upper_bound),
                    num(100.0 * (1.0 - alpha))
                )
            } else {
                format!(
                    "What the run shows: not rejected at α = {} with power {} against differences of {} ≥ {}; \
                     the {} is at most {} at {}% confidence. Smaller differences could go unseen.",
                    short(alpha),
                    short(result.scenario.power),
                    e.detectable_measure,
                    num(e.detectable),
                    e.measure,
                    num(e.upper_bound),
                    num(100.0 * (1.0 - alpha))
                )
            };
            let _ = writeln!(s, "{shows}\n");
        }
    }

    if let Some(ex) = &claim.exact {
        let _ = writeln!(s, "### Exact decision\n");
        let _ = writeln!(
            s,
            "| Measure | Value | Numerical error bound | Outcomes enumerated | Exact probability |"
        );
        let _ = writeln!(s, "|---|---|---|---|---|");
        let _ = writeln!(
            s,
            "| {} | {} | {} | {} | {} |\n",
            measure_words(ex),
            num(ex.discrepancy),
            bound(ex.error_bound),
            ex.outcomes,
            ex.probability.map_or("—".into(), num)
        );
    }

    estimates(s, claim, stem);

    if !figures.is_empty() {
        let _ = writeln!(s, "### Figures\n");
        for f in figures {
            let _ = writeln!(s, "![{}]({})\n", cell(&f.title), f.file);
            let _ = writeln!(s, "{}\n", f.caption);
        }
    }
}

/// Tables of probabilities, top outcomes and moments.
fn estimates(s: &mut String, claim: &ClaimResult, stem: &str) {
    let est = &claim.estimates;
    if !est.series.is_empty() {
        series_table(s, claim);
        return;
    }
    if let Some(law) = &est.joint {
        joint_table(s, law);
        return;
    }
    if let Some(st) = &claim.stated {
        let what = match st.role {
            StatedRole::Limit => "Limit quoted beside the measured mean (not tested)",
            StatedRole::Equals => "Stated value",
        };
        let _ = writeln!(s, "### {what}\n");
        let _ = writeln!(
            s,
            "| Value | Estimate | Estimate − value | ± (1 − α interval) |"
        );
        let _ = writeln!(s, "|---|---|---|---|");
        let _ = writeln!(
            s,
            "| {} | {} | {} | {} |\n",
            num(st.value),
            num(st.estimate),
            num(st.difference),
            num(st.half_width)
        );
    }
    if !est.probabilities.is_empty() {
        let _ = writeln!(s, "### Probabilities\n");
        let _ = writeln!(s, "| Event | Successes / trials | Estimate | Wilson interval | Clopper–Pearson interval |");
        let _ = writeln!(s, "|---|---|---|---|---|");
        for p in &est.probabilities {
            let _ = writeln!(
                s,
                "| {} | {} / {} | {} | [{}, {}] | [{}, {}] |",
                cell(&p.label),
                p.successes,
                p.trials,
                num(p.estimate),
                num(p.wilson_lower),
                num(p.wilson_upper),
                num(p.exact_lower),
                num(p.exact_upper)
            );
        }
        s.push('\n');
    }
    let tops: Vec<_> = est
        .top_outcomes
        .iter()
        .enumerate()
        .filter(|(_, t)| !t.is_empty())
        .collect();
    if !tops.is_empty() {
        let _ = writeln!(s, "### Most frequent outcomes\n");
        let mut head = String::from("| Rank |");
        let mut rule = String::from("|---|");
        for (i, _) in &tops {
            let name = side_label(claim, "", *i);
            let _ = write!(head, " {} | Probability |", code(&name));
            rule.push_str("---|---|");
        }
        let _ = writeln!(s, "{head}\n{rule}");
        let rows = tops.iter().map(|(_, t)| t.len()).max().unwrap_or(0);
        for r in 0..rows {
            let _ = write!(s, "| {} |", r + 1);
            for (_, t) in &tops {
                match t.get(r) {
                    Some(o) => {
                        let _ = write!(s, " {} | {} |", code(&o.value), num(o.probability));
                    }
                    None => s.push_str(" | |"),
                }
            }
            s.push('\n');
        }
        s.push('\n');
    }
    for c in &est.censoring {
        let _ = writeln!(
            s,
            "Censored: {} had not happened in {} of {} samples ({}) by the horizon; those samples read the horizon, {}.\n",
            code(&c.observable),
            c.censored,
            c.samples,
            num(c.censored as f64 / c.samples.max(1) as f64),
            num(c.at)
        );
    }
    if !est.laws.is_empty() {
        let sizes: Vec<String> = est
            .laws
            .iter()
            .map(|l| {
                if l.truncated {
                    format!(
                        "{}: {} outcomes, cut at the first {} in value order",
                        code(&l.observable),
                        l.distinct,
                        l.rows.len()
                    )
                } else {
                    format!("{}: {} outcomes", code(&l.observable), l.distinct)
                }
            })
            .collect();
        let _ = writeln!(
            s,
            "Every outcome: [`laws/{stem}.csv`](laws/{stem}.csv) ({}).\n",
            sizes.join("; "),
            stem = stem
        );
    }
    if !est.moments.is_empty() {
        let _ = writeln!(s, "### Moments\n");
        let _ = writeln!(s, "| Observable | Count | Mean | Standard deviation |");
        let _ = writeln!(s, "|---|---|---|---|");
        for (i, m) in est.moments.iter().enumerate() {
            let _ = writeln!(
                s,
                "| {} | {} | {} | {} |",
                cell(&side_label(claim, &m.label, i)),
                m.count,
                num(m.mean),
                num(m.sd)
            );
        }
        s.push('\n');
    }
}

/// The table of a `series` claim: one row per observable.
fn series_table(s: &mut String, claim: &ClaimResult) {
    let est = &claim.estimates;
    let axis = est.series_axis.as_deref().unwrap_or("parameter");
    let theory = est.series_theory.as_deref().unwrap_or("theory");
    let events = est.series.iter().all(|p| p.sd.is_none());
    let with_distance = est.series.iter().any(|p| p.distance.is_some());
    let _ = writeln!(
        s,
        "### Along {}
",
        code(axis)
    );
    let _ = writeln!(
        s,
        "Theory: {} (drawn beside the estimates, not tested).\n",
        cell(theory)
    );
    let mut head = format!(
        "| {} | Observable | Samples | {} | 1 − α interval |",
        cell(axis),
        if events { "Probability" } else { "Mean" }
    );
    let mut rule = String::from("|---|---|---|---|---|");
    if !events {
        head.push_str(" Standard deviation |");
        rule.push_str("---|");
    }
    head.push_str(" Theory | Estimate − theory |");
    rule.push_str("---|---|");
    if with_distance {
        head.push_str(" Reference sd | Kolmogorov distance (upper bound) |");
        rule.push_str("---|---|");
    }
    let _ = writeln!(s, "{head}\n{rule}");
    let opt = |v: Option<f64>| v.map(num).unwrap_or_else(|| "—".into());
    for p in &est.series {
        let _ = write!(
            s,
            "| {} | {} | {} | {} | [{}, {}] |",
            num(p.at),
            code(&p.label),
            p.count,
            num(p.estimate),
            num(p.lower),
            num(p.upper)
        );
        if !events {
            let _ = write!(s, " {} |", opt(p.sd));
        }
        let _ = write!(
            s,
            " {} | {} |",
            opt(p.predicted),
            opt(p.predicted.map(|v| p.estimate - v))
        );
        if with_distance {
            let _ = write!(
                s,
                " {} | {} ({}) |",
                opt(p.predicted_sd),
                opt(p.distance),
                opt(p.distance_upper)
            );
        }
        s.push('\n');
    }
    s.push('\n');
}

/// The tables of a `joint` claim: regions and the correlation.
fn joint_table(s: &mut String, law: &motley_scenario::result::JointLaw) {
    let _ = writeln!(s, "### Regions\n");
    let _ = writeln!(
        s,
        "| Region | Successes / trials | Estimate | Wilson interval | Reference |"
    );
    let _ = writeln!(s, "|---|---|---|---|---|");
    for r in &law.regions {
        let e = &r.estimate;
        let _ = writeln!(
            s,
            "| {} | {} / {} | {} | [{}, {}] | {} |",
            code(&e.label),
            e.successes,
            e.trials,
            num(e.estimate),
            num(e.wilson_lower),
            num(e.wilson_upper),
            r.reference.map(num).unwrap_or_else(|| "—".into())
        );
    }
    if law.reference.as_deref() == Some("speed-process-pair") {
        let _ = writeln!(
            s,
            "\nThe reference of `>` is P(U₀ ≥ U₁) = 1/2 + 1/6: the limit's mass 1/6 on the diagonal (swapped, then equal speeds) sits among the swapped pairs at finite t, where the two particles never share a site."
        );
    }
    let _ = writeln!(
        s,
        "\nCorrelation of {} and {}: {} over {} samples. Grid: {}×{} cells on [{}, {}] × [{}, {}].\n",
        code(&law.labels[0]),
        code(&law.labels[1]),
        num(law.correlation),
        law.count,
        law.bins,
        law.bins,
        num(law.x_range[0]),
        num(law.x_range[1]),
        num(law.y_range[0]),
        num(law.y_range[1])
    );
}

/// Everything needed to rerun.
fn reproduce(s: &mut String, result: &RunResult, extras: &ReportExtras) {
    let sc = &result.scenario;
    let t = &result.timing;
    let _ = writeln!(s, "## Reproduce\n");
    let _ = writeln!(s, "| | |\n|---|---|");
    let rows = [
        ("Samples per side", sc.samples.to_string()),
        ("Seed", sc.seed.to_string()),
        ("α", short(sc.alpha)),
        ("Power for detectable differences", short(sc.power)),
        ("Shards merged", t.shards.to_string()),
        ("motley version", result.motley_version.clone()),
        ("Git commit", code(&result.git_commit)),
        ("Scenario hash (SHA-256)", code(&sc.hash)),
        (
            "Wall time",
            format!(
                "{} on {} thread{} ({} samples/s)",
                duration(t.wall_seconds),
                t.threads,
                if t.threads == 1 { "" } else { "s" },
                num(t.samples_per_second)
            ),
        ),
    ];
    for (k, v) in rows {
        let _ = writeln!(s, "| {k} | {v} |");
    }
    s.push('\n');
    if !extras.command.is_empty() {
        let _ = writeln!(s, "The command that produced this report:\n");
        let _ = writeln!(s, "```sh\n{}\n```\n", shell_line(&extras.command));
    }
    let _ = writeln!(
        s,
        "The scenario file is copied beside this summary as `scenario.yaml`; running it again with the \
         same motley version and seed gives the same `result.json`, except the `timing` fields, whatever \
         the number of threads or shards.\n"
    );
}

/// What a run can and cannot show.
fn limits(s: &mut String, result: &RunResult) {
    let a = short(result.scenario.alpha);
    let k = result.claims.iter().filter(|c| is_tested(c)).count();
    let _ = writeln!(s, "## Limits\n");
    let _ = writeln!(
        s,
        "- Monte Carlo never proves an identity. \"Not rejected at α = {a}\" means the tests found no \
         difference; what the run shows is \"not rejected at α = {a} with power P against differences ≥ d\", \
         with P and d given per claim above. Smaller differences could go unseen."
    );
    let _ = writeln!(
        s,
        "- A true claim is wrongly rejected with probability at most α = {a} (Holm's method holds this \
         across the claim's tests). Claims are not adjusted against each other: with {k} tested claim{}, \
         the chance of at least one false alarm is at most {}.",
        if k == 1 { "" } else { "s" },
        num((k as f64 * result.scenario.alpha).min(1.0))
    );
    let _ = writeln!(
        s,
        "- An exact decision proves the identity only for the size enumerated, up to the stated numerical \
         error bound; it says nothing about other sizes."
    );
    let _ = writeln!(
        s,
        "- Reference and limit curves in the figures are drawn for comparison; only the claims above are tested."
    );
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn bounds_are_compact() {
        assert_eq!(bound(0.0), "0");
        assert_eq!(bound(1e-13), "1e-13");
        assert_eq!(bound(2.3456789e-14), "2.35e-14");
    }
}
