//! Reading a scenario (file or built-in example) into a validated scenario.

use motley_scenario::Scenario;

use crate::cli::Source;
use crate::exit::Failure;

/// A loaded scenario with its text and the name used in messages.
pub struct Loaded {
    /// The validated scenario.
    pub scenario: Scenario,
    /// Its text.
    pub text: String,
    /// File name (or `example:NAME`).
    pub file: String,
}

/// Loads `text`, named `file` in messages; `samples` overrides the sample count.
pub fn load_text(text: String, file: String, samples: Option<u64>) -> Result<Loaded, Failure> {
    let mut scenario =
        motley_scenario::load_str(&text, &file).map_err(|e| Failure::BadInput(e.to_string()))?;
    if let Some(n) = samples {
        if n == 0 {
            return Err(Failure::BadInput("--samples must be at least 1".into()));
        }
        scenario.samples = n;
    }
    Ok(Loaded {
        scenario,
        text,
        file,
    })
}

/// Loads the scenario named by `source`.
pub fn load(source: &Source, samples: Option<u64>) -> Result<Loaded, Failure> {
    let (text, file) = match (&source.file, &source.example) {
        (_, Some(name)) => (crate::examples::find(name)?.to_string(), format!("example:{name}")),
        (Some(path), None) => {
            let file = path.display().to_string();
            let bytes = std::fs::read(path)
                .map_err(|e| Failure::BadInput(format!("{file}: cannot read the scenario: {e}")))?;
            let text = String::from_utf8(bytes)
                .map_err(|_| Failure::BadInput(format!("{file}: not a text file (invalid UTF-8); a scenario is a YAML file")))?;
            (text, file)
        }
        (None, None) => return Err(Failure::BadInput("give a scenario file or --example NAME".into())),
    };
    load_text(text, file, samples)
}

/// Number of worker threads: as asked, or every core.
pub fn threads(asked: Option<usize>) -> Result<usize, Failure> {
    match asked {
        Some(0) => Err(Failure::BadInput("--threads must be at least 1".into())),
        Some(n) if n > 1024 => Err(Failure::BadInput(format!("--threads must be at most 1024, got {n}"))),
        Some(n) => Ok(n),
        None => Ok(num_cpus::get().max(1)),
    }
}
