//! Reading a scenario file named on the command line, with `--generators FILE` merged in.

use super::args::{Args, CliError};
use doubleprime::scenario::{parse_scenario, Scenario};
use doubleprime::sizing::generators::GeneratorClass;

/// Largest scenario or catalogue file read, bytes: far above any real scenario, small enough
/// that a wrong file (a video, a disk image) is refused before it is read into memory whole.
const FILE_BYTES_MAX: u64 = 4 * 1024 * 1024;

/// The text of a file named on the command line, refused if it is too large.
pub fn read_text(path: &str) -> Result<String, CliError> {
    let metadata = std::fs::metadata(path).map_err(|error| CliError::File(format!("{path}: cannot read ({error})")))?;
    if metadata.len() > FILE_BYTES_MAX {
        return Err(CliError::File(format!(
            "{path}: {} bytes is too large (at most {FILE_BYTES_MAX})",
            metadata.len()
        )));
    }
    std::fs::read_to_string(path).map_err(|error| CliError::File(format!("{path}: cannot read ({error})")))
}

/// The scenario named by the one positional argument, with extra generator classes from
/// `--generators` if given.
pub fn load(args: &Args) -> Result<Scenario, CliError> {
    let [path] = args.positional.as_slice() else {
        return Err(CliError::Usage("expected one scenario file (FILE.json)".into()));
    };
    let text = read_text(path)?;
    let mut scenario = parse_scenario(&text).map_err(|errors| with_file(path, errors))?;
    if let Some(catalogue_path) = args.text("generators") {
        #[derive(serde::Deserialize)]
        struct Extra {
            classes: Vec<GeneratorClass>,
        }
        let extra: Extra = serde_json::from_str(&read_text(catalogue_path)?)
            .map_err(|error| CliError::File(format!("{catalogue_path}: not a generator catalogue ({error})")))?;
        scenario.generator.extra_classes.extend(extra.classes);
    }
    Ok(scenario)
}

/// Scenario errors, prefixed with the file they came from.
pub fn with_file(path: &str, errors: Vec<doubleprime::error::InputError>) -> CliError {
    let lines: Vec<String> = errors.iter().map(ToString::to_string).collect();
    CliError::File(format!("{path}: {}", lines.join("; ")))
}
