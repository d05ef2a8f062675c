//! `doubleprime bands`: the ISM bands as JSON.

use super::args::{Args, CliError};
use doubleprime::physics::bands::ISM_BANDS;

pub fn run(rest: &[String]) -> Result<String, CliError> {
    let args = Args::parse(rest, &[])?;
    args.at_most_positional(0, "no arguments")?;
    Ok(super::to_json(&serde_json::json!({ "bands": ISM_BANDS })))
}
