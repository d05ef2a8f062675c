//! `doubleprime generators [--freq-mhz F]`: the generator catalogue, optionally for one band.

use super::args::{Args, CliError};
use doubleprime::sizing::generators::builtin_catalogue;

pub fn run(rest: &[String]) -> Result<String, CliError> {
    let args = Args::parse(rest, &["freq-mhz"])?;
    args.at_most_positional(0, "only options")?;
    let freq_mhz = args.number("freq-mhz", 1e-3, 300_000.0)?;
    let classes: Vec<_> =
        builtin_catalogue().iter().filter(|class| freq_mhz.is_none_or(|f| class.serves_frequency(f))).collect();
    Ok(super::to_json(&serde_json::json!({ "count": classes.len(), "classes": classes })))
}
