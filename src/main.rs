//! `doubleprime`: the command-line face of the computation core.
//!
//! Every subcommand prints one JSON document on stdout. On bad input it prints one line on
//! stderr naming the argument and its valid range, and exits with status 2.

mod cli;

use std::io::Write;
use std::process::ExitCode;

fn main() -> ExitCode {
    let args: Vec<String> = std::env::args().skip(1).collect();
    match cli::run(&args) {
        Ok(output) => {
            // A reader that stops early (`| head`) closes the pipe; that is not our failure, and
            // println! would panic on it.
            let mut stdout = std::io::stdout().lock();
            let _ = writeln!(stdout, "{output}").and_then(|()| stdout.flush());
            ExitCode::SUCCESS
        }
        Err(error) => {
            eprintln!("doubleprime: {error}");
            ExitCode::from(2)
        }
    }
}
