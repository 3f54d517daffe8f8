//! The scenario guide (`docs/GUIDE.md`) documents every key the loader accepts, and its complete
//! examples load.
//!
//! The accepted keys are not listed by hand: each raw type is asked for them by feeding it an unknown
//! key, and serde's "expected one of …" answer is the authoritative list.

use std::collections::BTreeSet;

use motley_scenario::raw::*;
use serde::de::DeserializeOwned;

fn guide() -> String {
    let p = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("../../docs/GUIDE.md");
    std::fs::read_to_string(p).expect("docs/GUIDE.md")
}

/// The keys (or variant names) `T` accepts, from the error an unknown one provokes.
fn accepted<T: DeserializeOwned + std::fmt::Debug>(probe: &str) -> Vec<String> {
    let r: Result<T, _> = serde_yaml::with::singleton_map_recursive::deserialize(
        serde_yaml::Deserializer::from_str(probe),
    );
    let msg = r.expect_err("the probe must be refused").to_string();
    let tail = msg
        .split_once("expected ")
        .map(|(_, t)| t)
        .unwrap_or_else(|| panic!("no expected list in: {msg}"));
    let keys: Vec<String> = tail
        .split('`')
        .skip(1)
        .step_by(2)
        .map(|s| s.to_string())
        .collect();
    assert!(!keys.is_empty(), "no keys found in: {msg}");
    keys
}

fn all_keys() -> BTreeSet<String> {
    let s = "zz-unknown-key: 1";
    let m = "{zz-unknown-key: 1}";
    let u = "zz-unknown-key";
    let lists = [
        accepted::<RawScenario>(s),
        accepted::<RawModel>(m),
        accepted::<RawSixVertex>(s),
        accepted::<RawBoundary>(m),
        accepted::<RawBoundary>(u),
        accepted::<RawBlocks>(s),
        accepted::<RawBernoulli>(s),
        accepted::<RawExclusion>(s),
        accepted::<RawLattice>(m),
        accepted::<RawInitial>(m),
        accepted::<RawLineStep>(s),
        accepted::<RawObservable>(s),
        accepted::<RawIndexMap>(m),
        accepted::<RawSetKind>(u),
        accepted::<RawRead>(m),
        accepted::<RawRowRead>(s),
        accepted::<RawColumnRead>(s),
        accepted::<RawHeightRead>(s),
        accepted::<RawWindowRead>(s),
        accepted::<RawPositionRead>(s),
        accepted::<RawTimeRead>(s),
        accepted::<RawCurrentRead>(s),
        accepted::<RawPairRead>(s),
        accepted::<RawNamedTime>(u),
        accepted::<RawClaim>(s),
        accepted::<RawLawOf>(s),
        accepted::<RawReference>(m),
        accepted::<RawNormal>(s),
        accepted::<RawProbability>(s),
        accepted::<RawMean>(s),
        accepted::<RawPermutationRead>(u),
        accepted::<RawCombine>(m),
        accepted::<RawCompare>(s),
        accepted::<RawRelation>(u),
        accepted::<RawExactMode>(u),
        accepted::<RawErrorControl>(u),
        accepted::<RawStrength>(u),
    ];
    lists.into_iter().flatten().collect()
}

/// Words inside backtick spans of the guide.
fn documented_words(text: &str) -> BTreeSet<String> {
    let mut words = BTreeSet::new();
    for span in text.split('`').skip(1).step_by(2) {
        for w in span.split(|c: char| !(c.is_ascii_alphanumeric() || c == '-')) {
            if !w.is_empty() {
                words.insert(w.to_string());
            }
        }
    }
    words
}

#[test]
fn every_accepted_key_is_documented() {
    let keys = all_keys();
    assert!(keys.len() > 60, "suspiciously few keys: {keys:?}");
    let words = documented_words(&guide());
    let missing: Vec<&String> = keys.iter().filter(|k| !words.contains(*k)).collect();
    assert!(
        missing.is_empty(),
        "keys accepted by the loader but not in docs/GUIDE.md: {missing:?}"
    );
}

#[test]
fn the_guide_examples_load() {
    let text = guide();
    let mut complete = 0;
    for (i, block) in text.split("```yaml").skip(1).enumerate() {
        let body = block.split("```").next().unwrap();
        if body.trim_start().starts_with("name:") {
            motley_scenario::load_str(body, &format!("guide example {i}"))
                .unwrap_or_else(|e| panic!("guide example {i} does not load: {e}"));
            complete += 1;
        } else {
            let _: serde_yaml::Value = serde_yaml::from_str(body)
                .unwrap_or_else(|e| panic!("guide fragment {i} is not YAML: {e}"));
        }
    }
    assert!(complete >= 1);
}

#[test]
fn the_worked_scenarios_load() {
    let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("../../scenarios");
    let mut n = 0;
    for e in std::fs::read_dir(dir).unwrap() {
        let p = e.unwrap().path();
        if p.extension().is_some_and(|x| x == "yaml") {
            let text = std::fs::read_to_string(&p).unwrap();
            motley_scenario::load_str(&text, &p.display().to_string())
                .unwrap_or_else(|e| panic!("{e}"));
            n += 1;
        }
    }
    assert!(n >= 6);
}
