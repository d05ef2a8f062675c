//! `doubleprime`: the command-line face of the computation core.
//!
//! Every subcommand prints one JSON document on stdout. On bad input it prints one line on
//! stderr naming the argument and its valid range, and exits with status 2.

mod cli;

use std::process::ExitCode;

fn main() -> ExitCode {
    let args: Vec<String> = std::env::args().skip(1).collect();
    match cli::run(&args) {
        Ok(output) => {
            println!("{output}");
            ExitCode::SUCCESS
        }
        Err(error) => {
            eprintln!("doubleprime: {error}");
            ExitCode::from(2)
        }
    }
}
