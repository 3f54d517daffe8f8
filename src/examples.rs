//! The built-in example scenarios (the worked scenarios of `scenarios/`, embedded at build time).

use std::path::Path;

use crate::cli::{ExamplesAction, ExamplesArgs};
use crate::exit::Failure;

/// Name and text of every built-in example.
pub const EXAMPLES: &[(&str, &str)] = &[
    (
        "rainbow-symmetry",
        include_str!("../scenarios/rainbow-symmetry.yaml"),
    ),
    (
        "rainbow-near-miss",
        include_str!("../scenarios/rainbow-near-miss.yaml"),
    ),
    (
        "second-class-tasep",
        include_str!("../scenarios/second-class-tasep.yaml"),
    ),
    (
        "packed-inverse",
        include_str!("../scenarios/packed-inverse.yaml"),
    ),
    (
        "second-third-swap",
        include_str!("../scenarios/second-third-swap.yaml"),
    ),
    ("step-height", include_str!("../scenarios/step-height.yaml")),
    (
        "tasep-tracy-widom",
        include_str!("../scenarios/tasep-tracy-widom.yaml"),
    ),
    (
        "speed-process-pair",
        include_str!("../scenarios/speed-process-pair.yaml"),
    ),
    (
        "sampling-until-decided",
        include_str!("../scenarios/sampling-until-decided.yaml"),
    ),
    (
        "strongest-exit-table",
        include_str!("../scenarios/strongest-exit-table.yaml"),
    ),
    (
        "permutation-symmetry",
        include_str!("../scenarios/permutation-symmetry.yaml"),
    ),
    ("q-moments", include_str!("../scenarios/q-moments.yaml")),
    (
        "shift-invariance",
        include_str!("../scenarios/shift-invariance.yaml"),
    ),
    ("swap-time", include_str!("../scenarios/swap-time.yaml")),
    (
        "inverse-nine-sites",
        include_str!("../scenarios/inverse-nine-sites.yaml"),
    ),
    (
        "stationary-ring",
        include_str!("../scenarios/stationary-ring.yaml"),
    ),
];

/// The text of example `name`.
pub fn find(name: &str) -> Result<&'static str, Failure> {
    EXAMPLES
        .iter()
        .find(|(n, _)| *n == name)
        .map(|(_, t)| *t)
        .ok_or_else(|| {
            let names: Vec<&str> = EXAMPLES.iter().map(|(n, _)| *n).collect();
            Failure::BadInput(format!(
                "no built-in example named \"{name}\"; the examples are: {}",
                names.join(", ")
            ))
        })
}

fn title(text: &str) -> String {
    text.lines()
        .find_map(|l| l.strip_prefix("title:"))
        .map(|t| t.trim().trim_matches('"').to_string())
        .unwrap_or_default()
}

/// `motley examples`.
pub fn command(a: ExamplesArgs) -> Result<(), Failure> {
    match a.action.unwrap_or(ExamplesAction::List) {
        ExamplesAction::List => {
            for (name, text) in EXAMPLES {
                say!("{name:<22} {}", title(text));
            }
            Ok(())
        }
        ExamplesAction::Show { name } => {
            let text = find(&name)?;
            let _ = std::io::Write::write_all(&mut std::io::stdout().lock(), text.as_bytes());
            Ok(())
        }
        ExamplesAction::Copy { name, to } => {
            let list: Vec<(&str, &str)> = if name == "all" {
                EXAMPLES.to_vec()
            } else {
                vec![(
                    EXAMPLES
                        .iter()
                        .find(|(n, _)| *n == name)
                        .map(|(n, _)| *n)
                        .unwrap_or(""),
                    find(&name)?,
                )]
            };
            std::fs::create_dir_all(&to)
                .map_err(|e| Failure::Runtime(format!("cannot create {}: {e}", to.display())))?;
            for (n, text) in list {
                let path = to.join(format!("{n}.yaml"));
                copy_one(&path, text)?;
                say!("{}", path.display());
            }
            Ok(())
        }
    }
}

fn copy_one(path: &Path, text: &str) -> Result<(), Failure> {
    if path.exists() {
        return Err(Failure::BadInput(format!(
            "{} exists; not overwriting it",
            path.display()
        )));
    }
    std::fs::write(path, text)
        .map_err(|e| Failure::Runtime(format!("cannot write {}: {e}", path.display())))
}
