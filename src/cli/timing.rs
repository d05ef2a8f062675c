//! `doubleprime timing [--budget-ms MS]`: the shared timing workloads (`doubleprime::timing`) run
//! natively, as JSON, for the browser timing harness to set beside the page's figures.

use super::args::{Args, CliError};
use doubleprime::timing::time_workloads;
use std::time::Instant;

pub fn run(rest: &[String]) -> Result<String, CliError> {
    let args = Args::parse(rest, &["budget-ms"])?;
    args.at_most_positional(0, "no file")?;
    let budget_ms = args.number("budget-ms", 1.0, 600_000.0)?.unwrap_or(500.0);
    let started = Instant::now();
    let now_ms = || started.elapsed().as_secs_f64() * 1e3;
    let report = time_workloads("native", budget_ms, &now_ms).map_err(CliError::Inputs)?;
    Ok(super::to_json(&report))
}
