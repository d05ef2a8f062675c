//! A bounded fuzz campaign over command lines: whatever words reach the CLI, it answers with one
//! JSON document (exit 0) or one line on stderr (exit 2), and never panics.

use proptest::prelude::*;

fn demo(name: &str) -> String {
    format!("{}/demo-loads/{name}", env!("CARGO_MANIFEST_DIR"))
}

/// Words a user or a script might pass: subcommands, flags, numbers of every kind, junk.
fn word() -> impl Strategy<Value = String> {
    prop_oneof![
        prop::sample::select(vec![
            "dielectric",
            "bands",
            "material",
            "materials",
            "layers",
            "plan",
            "compare",
            "search",
            "help",
        ])
        .prop_map(String::from),
        prop::sample::select(vec![
            "--freq-mhz",
            "--eps-real",
            "--eps-imag",
            "--e-rms",
            "--volume-m3",
            "--temp-c",
            "--moisture-wb",
            "--salt-pct",
            "--format",
            "--generators",
            "--space",
            "--feed",
            "--samples",
            "--category",
            "--",
        ])
        .prop_map(String::from),
        prop::sample::select(vec![
            "915",
            "2450",
            "27,12",
            "-3",
            "0",
            "1e308",
            "-1e308",
            "NaN",
            "inf",
            "1e-320",
            "abc",
            "",
            " ",
            "é°C",
            "json",
            "text",
            "csv",
            "top",
            "both",
            "water",
            "beef-lean",
            "ice",
            "no-such-material",
        ])
        .prop_map(String::from),
        Just(demo("tempering-beef-blocks.json")),
        Just(demo("README.md")),
        Just("/nonexistent/file.json".to_string()),
        "[a-z0-9\\-\\.]{0,12}",
    ]
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 160, ..ProptestConfig::default() })]

    #[test]
    fn any_command_line_is_answered_or_refused_in_one_line(words in proptest::collection::vec(word(), 0..7)) {
        let args: Vec<&str> = words.iter().map(String::as_str).collect();
        let output = crate::support::run(&args);
        let stderr = String::from_utf8_lossy(&output.stderr);
        prop_assert!(!stderr.contains("panicked"), "panic for {args:?}: {stderr}");
        match output.status.code() {
            Some(0) => {
                let stdout = String::from_utf8_lossy(&output.stdout);
                let textual = args.windows(2).any(|w| w[0] == "--format" && (w[1] == "text" || w[1] == "csv"));
                let help = args.first().is_some_and(|first| *first == "help");
                if !textual && !help {
                    prop_assert!(serde_json::from_str::<serde_json::Value>(&stdout).is_ok(), "not JSON for {args:?}");
                }
            }
            Some(2) => prop_assert_eq!(stderr.trim_end().lines().count(), 1, "one stderr line for {:?}: {}", args, stderr),
            other => prop_assert!(false, "exit {other:?} for {args:?}"),
        }
    }
}
