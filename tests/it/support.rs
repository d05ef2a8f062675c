//! Helpers shared by the integration tests: run the CLI and read its JSON.

use std::process::{Command, Output};

/// Run the `doubleprime` binary with `args`.
pub fn run(args: &[&str]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_doubleprime")).args(args).output().expect("the doubleprime binary runs")
}

/// Run and parse stdout as JSON, asserting success.
pub fn run_json(args: &[&str]) -> serde_json::Value {
    let output = run(args);
    assert!(output.status.success(), "doubleprime {args:?} failed: {}", String::from_utf8_lossy(&output.stderr));
    serde_json::from_slice(&output.stdout).expect("stdout is one JSON document")
}

/// Run, expect exit status 2 and exactly one line on stderr; return that line.
pub fn run_refused(args: &[&str]) -> String {
    let output = run(args);
    assert_eq!(output.status.code(), Some(2), "doubleprime {args:?} should exit 2");
    assert!(output.stdout.is_empty(), "nothing on stdout when refused");
    let stderr = String::from_utf8_lossy(&output.stderr).to_string();
    assert_eq!(stderr.trim_end().lines().count(), 1, "one stderr line, got: {stderr}");
    stderr.trim_end().to_string()
}

/// A number field of a JSON object, or a test failure naming the key.
pub fn number(value: &serde_json::Value, key: &str) -> f64 {
    value[key].as_f64().unwrap_or_else(|| panic!("`{key}` is a number in {value}"))
}
