//! Raw scenario → validated [`Scenario`]: every range checked, every name resolved.
//!
//! Each check names the key path, what was found and what is allowed; positions come from
//! [`Locations`]. Checks run in file order and the first failure is returned, so a corpus of bad files
//! can pin the exact first line of each message.

use indexmap::IndexMap;
use motley_colorblind::{Color, Relabel};

use crate::checker::Checker;
pub use crate::checker::{MAX_COLOR, MAX_SIDE};
use crate::error::ScenarioError;
use crate::locate::Locations;
use crate::raw::*;
use crate::result::ErrorControl;
use crate::scenario::*;

/// Validates `raw` (read from `file`, located by `locations`); `hash` is the file's SHA-256.
///
/// # Errors
/// The largest sample count of a scenario (in the file or on the command line).
pub const MAX_SAMPLES: u64 = 1 << 40;

/// The first problem found, as a located [`ScenarioError`].
pub fn validate(
    raw: &RawScenario,
    file: &str,
    locations: &Locations,
    hash: String,
) -> Result<Scenario, ScenarioError> {
    let ck = Checker { file, locations };
    ck.name("name", &raw.name)?;
    if raw.samples == 0 || raw.samples > MAX_SAMPLES {
        return Err(ck.error(
            "samples",
            format!("must be an integer in [1, 2^40], got {}", raw.samples),
        ));
    }
    let alpha = raw.alpha.unwrap_or(0.01);
    if !(alpha.is_finite() && alpha > 0.0 && alpha < 0.5) {
        return Err(ck.error("alpha", format!("must lie in (0, 0.5), got {alpha}")));
    }
    let power = raw.power.unwrap_or(0.8);
    if !(power.is_finite() && power > 0.0 && power < 1.0) {
        return Err(ck.error("power", format!("must lie in (0, 1), got {power}")));
    }
    let exact = mode(raw.exact.unwrap_or(RawExactMode::Auto));
    let error_control = match raw.error_control.unwrap_or(RawErrorControl::PerClaim) {
        RawErrorControl::PerClaim => ErrorControl::PerClaim,
        RawErrorControl::FalseDiscoveryRate => ErrorControl::FalseDiscoveryRate,
    };
    let looks = looks(&ck, raw.looks.as_ref(), raw.samples)?;
    if looks.is_some() && error_control == ErrorControl::FalseDiscoveryRate {
        return Err(ck.error(
            "error-control",
            "false-discovery-rate control and `looks` cannot be combined: remove one of them",
        ));
    }
    if raw.models.is_empty() {
        return Err(ck.error("models", "at least one model is needed"));
    }

    // Times are collected per model from the observables before the models are built.
    let mut times: Vec<Vec<f64>> = vec![Vec::new(); raw.models.len()];
    for (oname, o) in &raw.observables {
        if let Some(m) = raw.models.get_index_of(&o.of) {
            if let Some((t, read)) = o.read.as_ref().and_then(|r| Some((r.time()?, r.name()))) {
                let path = format!("observables.{oname}.read.{read}.time");
                times[m].push(ck.time(&path, t)?);
            }
        }
    }

    let mut models = Vec::new();
    for (i, (name, m)) in raw.models.iter().enumerate() {
        let path = format!("models.{name}");
        ck.name(&path, name)?;
        models.push(model(&ck, &path, name, m, std::mem::take(&mut times[i]))?);
    }
    let model_names: Vec<&str> = raw.models.keys().map(|s| s.as_str()).collect();

    let mut observables = Vec::new();
    for (name, o) in &raw.observables {
        let path = format!("observables.{name}");
        ck.name(&path, name)?;
        let Some(mi) = raw.models.get_index_of(&o.of) else {
            return Err(ck.unknown_name(&format!("{path}.of"), "model", &o.of, &model_names));
        };
        let resolved =
            crate::resolve_read::observable(&ck, &path, name, (mi, &models[mi]), o, &observables)?;
        observables.push(resolved);
    }
    let obs_names: Vec<&str> = raw.observables.keys().map(|s| s.as_str()).collect();

    let mut claims: Vec<ClaimSpec> = Vec::new();
    let mut ids = IndexMap::new();
    for (i, c) in raw.claims.iter().enumerate() {
        let path = format!("claims[{i}]");
        ck.name(&format!("{path}.id"), &c.id)?;
        if let Some(prev) = ids.insert(c.id.clone(), i) {
            return Err(ck.error(
                &format!("{path}.id"),
                format!("claim id \"{}\" is already used by claims[{prev}]", c.id),
            ));
        }
        claims.push(claim(
            &ck,
            &path,
            c,
            &observables,
            &models,
            &obs_names,
            exact,
        )?);
    }
    if claims.is_empty() {
        return Err(ck.error(
            "claims",
            "at least one claim is needed (use `describe:` for no claim)",
        ));
    }

    Ok(Scenario {
        name: raw.name.clone(),
        title: raw.title.clone().unwrap_or_else(|| raw.name.clone()),
        description: raw.description.clone().unwrap_or_default(),
        seed: raw.seed,
        samples: raw.samples,
        alpha,
        power,
        error_control,
        looks,
        models,
        observables,
        claims,
        hash,
    })
}

/// A claim's `tolerance`: only where a distance is tested, positive, at most 1 for distances
/// between laws.
fn tolerance(
    ck: &Checker,
    path: &str,
    value: Option<f64>,
    kind: &ClaimKind,
) -> Result<Option<f64>, ScenarioError> {
    let Some(eps) = value else {
        return Ok(None);
    };
    let key = format!("{path}.tolerance");
    let bounded = match kind {
        ClaimKind::SameLaw(..) | ClaimKind::LawOf(..) | ClaimKind::Probability(_, Some(_)) => true,
        ClaimKind::Mean(_, Some(_)) => false,
        ClaimKind::Probability(_, None)
        | ClaimKind::Mean(_, None)
        | ClaimKind::Describe(..)
        | ClaimKind::Series(_)
        | ClaimKind::Joint(..) => {
            return Err(ck.error(
                &key,
                "a tolerance applies to claims that test something: same-law, law-of, probability \
                 with `equals`, mean with `equals`",
            ))
        }
    };
    let ok = eps.is_finite() && eps > 0.0 && (!bounded || eps <= 1.0);
    if !ok {
        let range = if bounded { "(0, 1]" } else { "(0, ∞)" };
        return Err(ck.error(&key, format!("must lie in {range}, got {eps}")));
    }
    Ok(Some(eps))
}

/// `looks`: increasing positive sample counts up to `samples`; `samples` is appended as the last
/// look when it is not listed. At most 64 looks.
fn looks(
    ck: &Checker,
    raw: Option<&Vec<u64>>,
    samples: u64,
) -> Result<Option<Vec<u64>>, ScenarioError> {
    let Some(list) = raw else {
        return Ok(None);
    };
    let mut out = list.clone();
    if out.last() != Some(&samples) {
        out.push(samples);
    }
    for (k, w) in out.windows(2).enumerate() {
        if w[0] >= w[1] {
            return Err(ck.error(
                &format!("looks[{}]", (k + 1).min(list.len() - 1)),
                format!(
                    "looks must increase and stay at most `samples` ({samples}); got {} after {}",
                    w[1], w[0]
                ),
            ));
        }
    }
    if out[0] == 0 {
        return Err(ck.error("looks[0]", "a look needs at least 1 sample"));
    }
    if out.len() > 64 {
        return Err(ck.error("looks", format!("at most 64 looks, got {}", out.len())));
    }
    Ok(Some(out))
}

fn mode(m: RawExactMode) -> ExactMode {
    match m {
        RawExactMode::Auto => ExactMode::Auto,
        RawExactMode::On => ExactMode::On,
        RawExactMode::Off => ExactMode::Off,
    }
}

/// Numbers of a model block, in the file's order, to find the class count of a reversal.
fn model_numbers(m: &RawModel) -> Vec<i64> {
    let mut v = Vec::new();
    let mut boundary = |b: &RawBoundary, len: i64| match b {
        RawBoundary::Rainbow => v.push(len.max(0)),
        RawBoundary::Empty => {}
        RawBoundary::Step(c) => v.push(*c),
        RawBoundary::List(l) => v.extend(l),
        RawBoundary::Blocks(b) => v.extend([b.color, b.rest]),
        RawBoundary::Bernoulli(b) => match b.color {
            RawColorRule::Fixed(c) => v.push(c),
            RawColorRule::Named(_) => v.push(len.max(0)),
        },
    };
    match m {
        RawModel::SixVertex(s) => {
            boundary(&s.left, s.height);
            boundary(&s.bottom, s.width);
        }
        RawModel::Exclusion(e) => match &e.initial {
            RawInitial::Packed => match e.lattice {
                RawLattice::Segment(n) | RawLattice::Ring(n) => v.push(n.max(0)),
                RawLattice::Line => {}
            },
            RawInitial::List(l) => v.extend(l),
            RawInitial::Step(s) => {
                v.extend([s.left, s.right]);
                v.extend(&s.block);
            }
        },
    }
    v
}

fn model(
    ck: &Checker,
    path: &str,
    name: &str,
    m: &RawModel,
    mut times: Vec<f64>,
) -> Result<ModelSpec, ScenarioError> {
    let strength = match m {
        RawModel::SixVertex(s) => s.strength,
        RawModel::Exclusion(e) => e.strength,
    };
    let relabel = match strength {
        Some(RawStrength::SmallerWins) => {
            let k = model_numbers(m)
                .into_iter()
                .max()
                .unwrap_or(0)
                .clamp(1, MAX_COLOR);
            Some(Relabel::reverse(k as u32).expect("k ≥ 1"))
        }
        _ => None,
    };
    let color = |p: &str, c: i64| -> Result<Color, ScenarioError> {
        let c = ck.int_in(p, c, 0, MAX_COLOR)? as Color;
        Ok(match relabel {
            Some(r) => r.map(c).expect("within the class count"),
            None => c,
        })
    };
    let kind = match m {
        RawModel::SixVertex(s) => {
            let p = format!("{path}.six-vertex");
            let width = ck.int_in(&format!("{p}.width"), s.width, 1, MAX_SIDE)? as usize;
            let height = ck.int_in(&format!("{p}.height"), s.height, 1, MAX_SIDE)? as usize;
            let b1 = ck.probability(&format!("{p}.b1"), &s.b1)?;
            let b2 = ck.probability(&format!("{p}.b2"), &s.b2)?;
            let left = boundary(ck, &format!("{p}.left"), &s.left, height, &color)?;
            let bottom = boundary(ck, &format!("{p}.bottom"), &s.bottom, width, &color)?;
            // What the engine cannot draw is refused here, located, not when the run starts.
            for (key, b) in [("left", &left), ("bottom", &bottom)] {
                crate::six_vertex_unit::side(b)
                    .map_err(|message| ck.error(&format!("{p}.{key}.bernoulli.color"), message))?;
            }
            if !times.is_empty() {
                times.clear();
            }
            ModelKind::SixVertex(SixVertexSpec {
                width,
                height,
                b1,
                b2,
                left,
                bottom,
            })
        }
        RawModel::Exclusion(e) => {
            let p = format!("{path}.exclusion");
            let lattice = match e.lattice {
                RawLattice::Segment(n) => LatticeSpec::Segment(ck.int_in(
                    &format!("{p}.lattice.segment"),
                    n,
                    2,
                    MAX_SIDE,
                )? as usize),
                RawLattice::Ring(n) => {
                    LatticeSpec::Ring(
                        ck.int_in(&format!("{p}.lattice.ring"), n, 2, MAX_SIDE)? as usize
                    )
                }
                RawLattice::Line => LatticeSpec::Line,
            };
            let pr = ck.rate(&format!("{p}.p"), &e.p)?;
            let qr = ck.rate(&format!("{p}.q"), &e.q)?;
            if pr.value + qr.value <= 0.0 {
                return Err(ck.error(
                    &format!("{p}.q"),
                    "p and q cannot both be 0: nothing would move",
                ));
            }
            let ip = format!("{p}.initial");
            let initial = match (&e.initial, lattice) {
                (RawInitial::Packed, LatticeSpec::Segment(n) | LatticeSpec::Ring(n)) => {
                    let raw: Vec<i64> = (1..=n as i64).collect();
                    InitialSpec::Sites(
                        raw.iter()
                            .map(|&c| color(&ip, c))
                            .collect::<Result<_, _>>()?,
                    )
                }
                (RawInitial::List(l), LatticeSpec::Segment(n) | LatticeSpec::Ring(n)) => {
                    if l.len() != n {
                        return Err(ck.error(
                            &format!("{ip}.list"),
                            format!("needs one color per site: {n} entries, got {}", l.len()),
                        ));
                    }
                    InitialSpec::Sites(
                        l.iter()
                            .enumerate()
                            .map(|(i, &c)| color(&format!("{ip}.list[{i}]"), c))
                            .collect::<Result<_, _>>()?,
                    )
                }
                (RawInitial::Step(s), LatticeSpec::Line) => {
                    if s.block.len() > 1 << 16 {
                        return Err(ck.error(&format!("{ip}.step.block"), "at most 65536 entries"));
                    }
                    let at = ck.int_in(&format!("{ip}.step.at"), s.at.unwrap_or(1), -MAX_SIDE, MAX_SIDE)?;
                    InitialSpec::Line {
                        left: color(&format!("{ip}.step.left"), s.left)?,
                        right: color(&format!("{ip}.step.right"), s.right)?,
                        at,
                        block: s
                            .block
                            .iter()
                            .enumerate()
                            .map(|(i, &c)| color(&format!("{ip}.step.block[{i}]"), c))
                            .collect::<Result<_, _>>()?,
                    }
                }
                (RawInitial::Step(_), _) => {
                    return Err(ck.error(&ip, "`step` initial data is for `lattice: line`; use `packed` or `list` on a segment or ring"))
                }
                (_, LatticeSpec::Line) => {
                    return Err(ck.error(&ip, "on `lattice: line` the initial data must be `step: {left, right, at, block}`"))
                }
            };
            let packed = match &initial {
                InitialSpec::Sites(s) => {
                    let mut v = s.clone();
                    v.sort_unstable();
                    v.dedup();
                    v.len() == s.len() && !s.contains(&0)
                }
                InitialSpec::Line { .. } => false,
            };
            times.sort_by(f64::total_cmp);
            times.dedup();
            ModelKind::Exclusion(ExclusionSpec {
                lattice,
                p: pr,
                q: qr,
                initial,
                packed,
                times,
            })
        }
    };
    let max_color = match &kind {
        ModelKind::SixVertex(s) => s
            .left
            .colors()
            .iter()
            .chain(s.bottom.colors())
            .copied()
            .max()
            .unwrap_or(0),
        ModelKind::Exclusion(e) => match &e.initial {
            InitialSpec::Sites(s) => s.iter().copied().max().unwrap_or(0),
            InitialSpec::Line {
                left, right, block, ..
            } => block
                .iter()
                .copied()
                .chain([*left, *right])
                .max()
                .unwrap_or(0),
        },
    };
    Ok(ModelSpec {
        name: name.to_string(),
        kind,
        relabel,
        max_color,
    })
}

fn boundary(
    ck: &Checker,
    path: &str,
    b: &RawBoundary,
    len: usize,
    color: &dyn Fn(&str, i64) -> Result<Color, ScenarioError>,
) -> Result<BoundarySpec, ScenarioError> {
    Ok(match b {
        RawBoundary::Rainbow => BoundarySpec::Fixed(
            (1..=len as i64)
                .map(|k| color(path, k))
                .collect::<Result<_, _>>()?,
        ),
        RawBoundary::Empty => BoundarySpec::Fixed(vec![0; len]),
        RawBoundary::Step(c) => BoundarySpec::Fixed(vec![color(&format!("{path}.step"), *c)?; len]),
        RawBoundary::List(l) => {
            if l.len() != len {
                return Err(ck.error(
                    &format!("{path}.list"),
                    format!("needs one color per edge: {len} entries, got {}", l.len()),
                ));
            }
            BoundarySpec::Fixed(
                l.iter()
                    .enumerate()
                    .map(|(i, &c)| color(&format!("{path}.list[{i}]"), c))
                    .collect::<Result<_, _>>()?,
            )
        }
        RawBoundary::Blocks(bl) => {
            let p = format!("{path}.blocks");
            let first = ck.int_in(&format!("{p}.first"), bl.first, 0, len as i64)? as usize;
            let a = color(&format!("{p}.color"), bl.color)?;
            let r = color(&format!("{p}.rest"), bl.rest)?;
            BoundarySpec::Fixed((0..len).map(|k| if k < first { a } else { r }).collect())
        }
        RawBoundary::Bernoulli(be) => {
            let p = format!("{path}.bernoulli");
            let d = ck.finite(&format!("{p}.density"), be.density)?;
            if !(0.0..=1.0).contains(&d) {
                return Err(ck.error(
                    &format!("{p}.density"),
                    format!("must be a probability in [0, 1], got {d}"),
                ));
            }
            let colors = match &be.color {
                RawColorRule::Fixed(c) => {
                    let c = color(&format!("{p}.color"), *c)?;
                    if c == 0 {
                        return Err(ck.error(
                            &format!("{p}.color"),
                            "an occupied edge needs a color ≥ 1, got 0",
                        ));
                    }
                    vec![c; len]
                }
                RawColorRule::Named(n) if n == "rainbow" => (1..=len as i64)
                    .map(|k| color(&format!("{p}.color"), k))
                    .collect::<Result<_, _>>()?,
                RawColorRule::Named(n) => {
                    return Err(ck.error(
                        &format!("{p}.color"),
                        format!("must be a color number or `rainbow`, got \"{n}\""),
                    ))
                }
            };
            BoundarySpec::Bernoulli { density: d, colors }
        }
    })
}

fn claim(
    ck: &Checker,
    path: &str,
    c: &RawClaim,
    obs: &[ObservableSpec],
    models: &[ModelSpec],
    names: &[&str],
    default_mode: ExactMode,
) -> Result<ClaimSpec, ScenarioError> {
    let given = [
        c.same_law.is_some(),
        c.law_of.is_some(),
        c.probability.is_some(),
        c.describe.is_some(),
        c.series.is_some(),
        c.joint.is_some(),
        c.mean.is_some(),
    ]
    .iter()
    .filter(|b| **b)
    .count();
    if given != 1 {
        return Err(ck.error(
            path,
            format!("a claim needs exactly one of `same-law`, `law-of`, `probability`, `describe`, `series`, `joint`, `mean`; found {given}"),
        ));
    }
    let find = |p: &str, n: &str| -> Result<usize, ScenarioError> {
        names
            .iter()
            .position(|k| *k == n)
            .ok_or_else(|| ck.unknown_name(p, "observable", n, names))
    };
    let reference_at =
        |rp: &str, r: &RawReference, i: usize| reference(ck, rp, r, i, (obs, models), &find);
    let kind = if let Some(sr) = &c.series {
        crate::validate_series::series(ck, path, sr, c, (obs, models), &find, &reference_at)?
    } else if let Some(pair) = &c.joint {
        crate::validate_series::joint(ck, path, pair, c, obs, models, &find)?
    } else if let Some([a, b]) = &c.same_law {
        let ia = find(&format!("{path}.same-law[0]"), a)?;
        let ib = find(&format!("{path}.same-law[1]"), b)?;
        let (ka, kb) = (obs[ia].kind, obs[ib].kind);
        let compatible = match (ka, kb) {
            (ValueKind::Scalar { .. }, ValueKind::Scalar { .. }) => true,
            (x, y) => x == y,
        };
        if !compatible {
            return Err(ck.error(
                &format!("{path}.same-law"),
                format!(
                    "cannot compare observables of different kinds: \"{a}\" is {}, \"{b}\" is {}",
                    ka.describe(),
                    kb.describe()
                ),
            ));
        }
        if ia == ib {
            return Err(ck.error(
                &format!("{path}.same-law"),
                format!("compares \"{a}\" with itself"),
            ));
        }
        ClaimKind::SameLaw(ia, ib)
    } else if let Some(mn) = &c.mean {
        let p = format!("{path}.mean");
        let i = find(&format!("{p}.observable"), &mn.observable)?;
        if !matches!(obs[i].kind, ValueKind::Scalar { .. }) {
            return Err(ck.error(
                &format!("{p}.observable"),
                format!(
                    "`mean` needs a number, but \"{}\" is {}",
                    mn.observable,
                    obs[i].kind.describe()
                ),
            ));
        }
        let stated = match (mn.equals, &mn.profile) {
            (Some(_), Some(_)) => {
                return Err(ck.error(&p, "give `equals` or `profile`, not both"));
            }
            (Some(v), None) => Some(ck.finite(&format!("{p}.equals"), v)?),
            (None, Some(name)) => {
                let pr = crate::validate_series::profile(
                    ck,
                    &format!("{p}.profile"),
                    name,
                    &[i],
                    obs,
                    models,
                )?;
                Some(pr.values[0])
            }
            (None, None) => None,
        };
        ClaimKind::Mean(i, stated)
    } else if let Some(l) = &c.law_of {
        let p = format!("{path}.law-of");
        let i = find(&format!("{p}.observable"), &l.observable)?;
        let table = matches!(l.reference, RawReference::Table(_));
        if !table && !matches!(obs[i].kind, ValueKind::Scalar { .. }) {
            return Err(ck.error(
                &format!("{p}.observable"),
                format!(
                    "`law-of` needs a number, but \"{}\" is {}",
                    l.observable,
                    obs[i].kind.describe()
                ),
            ));
        }
        let reference = reference(
            ck,
            &format!("{p}.reference"),
            &l.reference,
            i,
            (obs, models),
            &find,
        )?;
        ClaimKind::LawOf(i, reference)
    } else if let Some(pr) = &c.probability {
        let p = format!("{path}.probability");
        let i = find(&format!("{p}.event"), &pr.event)?;
        if obs[i].kind != ValueKind::Event {
            return Err(ck.error(
                &format!("{p}.event"),
                format!(
                    "`probability` needs an event, but \"{}\" is {}",
                    pr.event,
                    obs[i].kind.describe()
                ),
            ));
        }
        if let Some(v) = pr.equals {
            if !(v.is_finite() && (0.0..=1.0).contains(&v)) {
                return Err(ck.error(
                    &format!("{p}.equals"),
                    format!("must be a probability in [0, 1], got {v}"),
                ));
            }
        }
        ClaimKind::Probability(i, pr.equals)
    } else {
        let name = c.describe.as_deref().unwrap_or_default();
        let i = find(&format!("{path}.describe"), name)?;
        let scalar = matches!(obs[i].kind, ValueKind::Scalar { .. });
        if (c.reference.is_some() || c.limit.is_some()) && !scalar {
            let key = if c.reference.is_some() {
                "reference"
            } else {
                "limit"
            };
            return Err(ck.error(
                &format!("{path}.{key}"),
                format!(
                    "`{key}` goes with `describe` of a number, but \"{name}\" is {}",
                    obs[i].kind.describe()
                ),
            ));
        }
        let reference = match &c.reference {
            None => None,
            Some(r) => Some(reference(
                ck,
                &format!("{path}.reference"),
                r,
                i,
                (obs, models),
                &find,
            )?),
        };
        if let Some(l) = c.limit {
            ck.finite(&format!("{path}.limit"), l)?;
        }
        ClaimKind::Describe(i, reference, c.limit)
    };
    if !matches!(
        kind,
        ClaimKind::Describe(..) | ClaimKind::Series(_) | ClaimKind::Joint(..)
    ) {
        if c.profile.is_some() {
            return Err(ck.error(
                &format!("{path}.profile"),
                "`profile` goes with `series` only",
            ));
        }
        if c.reference.is_some() {
            return Err(ck.error(
                &format!("{path}.reference"),
                "`reference` at claim level goes with `describe`; `law-of` has its own",
            ));
        }
        if c.limit.is_some() {
            return Err(ck.error(
                &format!("{path}.limit"),
                "`limit` goes with `describe` only",
            ));
        }
    }
    let tolerance = tolerance(ck, path, c.tolerance, &kind)?;
    Ok(ClaimSpec {
        id: c.id.clone(),
        says: c.says.clone().unwrap_or_default(),
        kind,
        exact: c.exact.map(mode).unwrap_or(default_mode),
        tolerance,
    })
}

fn reference(
    ck: &Checker,
    rp: &str,
    raw: &RawReference,
    i: usize,
    (obs, models): (&[ObservableSpec], &[ModelSpec]),
    find: &dyn Fn(&str, &str) -> Result<usize, ScenarioError>,
) -> Result<ReferenceSpec, ScenarioError> {
    let p = rp.trim_end_matches(".reference");
    let r = match raw {
        RawReference::Uniform([a, b]) => {
            let (a, b) = (ck.finite(rp, *a)?, ck.finite(rp, *b)?);
            if a >= b {
                return Err(ck.error(
                    &format!("{rp}.uniform"),
                    format!("needs a < b, got [{a}, {b}]"),
                ));
            }
            ReferenceSpec::Uniform(a, b)
        }
        RawReference::Normal(n) => {
            let m = ck.finite(&format!("{rp}.normal.mean"), n.mean)?;
            let s = ck.finite(&format!("{rp}.normal.sd"), n.sd)?;
            if s <= 0.0 {
                return Err(ck.error(&format!("{rp}.normal.sd"), format!("must be > 0, got {s}")));
            }
            ReferenceSpec::Normal(m, s)
        }
        RawReference::SpeedProcessPair => {
            return Err(ck.error(
                &format!("{rp}.speed-process-pair"),
                "`speed-process-pair` is a joint law: it goes with `joint`",
            ))
        }
        RawReference::SixVertexExitSpeed(w) => {
            let k = format!("{rp}.six-vertex-exit-speed");
            let b1 = ck.finite(&format!("{k}.b1"), w.b1)?;
            let b2 = ck.finite(&format!("{k}.b2"), w.b2)?;
            if !(0.0..1.0).contains(&b1) || !(0.0..1.0).contains(&b2) || b1 >= b2 {
                return Err(ck.error(
                    &k,
                    format!(
                        "needs 0 ≤ b1 < b2 < 1 (a curved region, κ > 1), got b1 = {b1}, b2 = {b2}"
                    ),
                ));
            }
            ReferenceSpec::SixVertexExitSpeed((1.0 - b1) / (1.0 - b2))
        }
        RawReference::Table(rows) => ReferenceSpec::Table(crate::table_law::table(
            ck,
            &format!("{rp}.table"),
            rows,
            &obs[i],
        )?),
        RawReference::TracyWidomGue => ReferenceSpec::TracyWidomGue,
        RawReference::TracyWidomGoe => ReferenceSpec::TracyWidomGoe,
        RawReference::SecondClassSpeed(r) => {
            let p = ck.finite(&format!("{rp}.second-class-speed.p"), r.p)?;
            let q = ck.finite(&format!("{rp}.second-class-speed.q"), r.q)?;
            if p < 0.0 || q < 0.0 || p <= q {
                return Err(ck.error(
                    &format!("{rp}.second-class-speed"),
                    format!("needs rates p > q ≥ 0, got p = {p}, q = {q}"),
                ));
            }
            ReferenceSpec::Uniform(-(p - q), p - q)
        }
        RawReference::TailFromProfile(name) => {
            let j = find(&format!("{rp}.tail-from-profile"), name)?;
            let ok = models[obs[j].model]
                .kind
                .family()
                .window_origin(&obs[j].read)
                .is_some();
            if !ok {
                return Err(ck.error(
                    &format!("{rp}.tail-from-profile"),
                    format!("\"{name}\" must be an exclusion `window` read `as: positions`"),
                ));
            }
            if !matches!(obs[i].kind, ValueKind::Scalar { integer: true, .. }) {
                return Err(ck.error(
                    &format!("{p}.observable"),
                    format!(
                        "a tail from a profile needs an integer position, but \"{}\" is scaled",
                        obs[i].name
                    ),
                ));
            }
            ReferenceSpec::TailFromProfile(j)
        }
    };
    Ok(r)
}
