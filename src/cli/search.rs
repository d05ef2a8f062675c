//! `doubleprime search FILE.json [--space SPACE.json] [--generators CATALOGUE.json]`: the design
//! search over a space of bands, generator classes, belt widths, bed depths, zone counts and
//! redundancies (the space format is in the `doubleprime::search` module documentation; without
//! `--space` the default space around the scenario is searched).

use super::args::{Args, CliError};
use super::scenario_file;
use doubleprime::error::InputError;
use doubleprime::search::search;
use doubleprime::search::space::{parse_space, SearchSpace};

pub fn run(rest: &[String]) -> Result<String, CliError> {
    let args = Args::parse(rest, &["space", "generators"])?;
    let scenario = scenario_file::load(&args)?;
    let scenario_path = args.positional.first().map(String::as_str).unwrap_or("scenario");
    let space_path = args.text("space");
    let space = match space_path {
        Some(path) => {
            parse_space(&scenario_file::read_text(path)?).map_err(|errors| scenario_file::with_file(path, errors))?
        }
        None => SearchSpace::default(),
    };
    let result = search(&scenario, &space).map_err(|errors| {
        // Space problems belong to the space file, the rest to the scenario: one line for both.
        let (space_errors, scenario_errors): (Vec<InputError>, Vec<InputError>) =
            errors.into_iter().partition(|error| error.field == "space" || error.field.starts_with("space."));
        let mut parts = Vec::new();
        if !scenario_errors.is_empty() {
            parts.push(scenario_file::with_file(scenario_path, scenario_errors).to_string());
        }
        if !space_errors.is_empty() {
            parts.push(scenario_file::with_file(space_path.unwrap_or("default space"), space_errors).to_string());
        }
        CliError::File(parts.join("; "))
    })?;
    Ok(super::to_json(&result))
}
