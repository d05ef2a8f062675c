//! `doubleprime compare FILE.json [--generators CATALOGUE.json]`: the scenario in every band.

use super::args::{Args, CliError};
use super::scenario_file;
use doubleprime::plan::band_comparison::compare;

pub fn run(rest: &[String]) -> Result<String, CliError> {
    let args = Args::parse(rest, &["generators"])?;
    let scenario = scenario_file::load(&args)?;
    let path = args.positional.first().map(String::as_str).unwrap_or("scenario");
    let comparison = compare(&scenario).map_err(|errors| scenario_file::with_file(path, errors))?;
    Ok(super::to_json(&comparison))
}
