//! Subcommand dispatch for the command-line tool. Each subcommand lives in its own file under
//! `src/cli/`, parses its arguments with [`args::Args`] and returns the text to print.

mod args;
mod bands;
mod compare;
mod dielectric;
mod generators;
mod layers;
mod material;
mod materials;
mod plan;
mod scenario_file;
mod search;
mod timing;

use args::CliError;

/// The one-line usage summary, shown for an unknown or missing subcommand.
const USAGE: &str =
    "usage: doubleprime <dielectric|bands|generators|layers|plan|compare|search|timing|material|materials> [options]; see README.md";

/// Run one command line (without the program name) and return what to print on stdout.
pub fn run(args: &[String]) -> Result<String, CliError> {
    let Some((command, rest)) = args.split_first() else {
        return Err(CliError::Usage(USAGE.to_string()));
    };
    match command.as_str() {
        "dielectric" => dielectric::run(rest),
        "bands" => bands::run(rest),
        "generators" => generators::run(rest),
        "material" => material::run(rest),
        "materials" => materials::run(rest),
        "layers" => layers::run(rest),
        "plan" => plan::run(rest),
        "compare" => compare::run(rest),
        "search" => search::run(rest),
        "timing" => timing::run(rest),
        "--help" | "-h" | "help" => Ok(USAGE.to_string()),
        other => Err(CliError::Usage(format!("unknown subcommand `{other}`; {USAGE}"))),
    }
}

/// Serialize a result document as pretty JSON. Serialization of our own plain structs cannot
/// fail; the fallback keeps the contract of one JSON document even so.
pub fn to_json<T: serde::Serialize>(value: &T) -> String {
    serde_json::to_string_pretty(value).unwrap_or_else(|error| format!("{{\"error\": \"{error}\"}}"))
}
