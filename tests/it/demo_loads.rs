//! Every demo load plans, with exactly the warnings it is expected to raise.

use crate::support::{run, run_json};
use std::path::Path;

/// Each demo load and the warning codes its plan must carry, in order. A change here is a change
/// in what the tool tells a user about that scenario: review it as such.
const EXPECTED: &[(&str, &[&str])] = &[
    ("tempering-beef-blocks.json", &["bed_deeper_than_penetration", "runaway_risk"]),
    (
        "pasteurising-potato-trays.json",
        &[
            "material_data_out_of_range",
            "material_data_out_of_range",
            "bed_deeper_than_penetration",
            "core_lags",
            "single_generator",
        ],
    ),
    ("drying-sand-cores.json", &["bed_deeper_than_penetration", "core_lags", "runaway_risk"]),
    (
        "layered-meal-trays.json",
        &["material_data_out_of_range", "material_data_out_of_range", "bed_deeper_than_penetration", "core_lags"],
    ),
    ("rf-drying-cotton-packages.json", &[]),
    ("curing-rubber-profile.json", &["material_data_out_of_range", "single_generator"]),
];

fn demo_path(name: &str) -> String {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("demo-loads").join(name).to_string_lossy().into_owned()
}

#[test]
fn every_demo_load_is_listed_here() {
    let mut on_disk: Vec<String> = std::fs::read_dir(Path::new(env!("CARGO_MANIFEST_DIR")).join("demo-loads"))
        .unwrap()
        .filter_map(|entry| entry.ok()?.file_name().into_string().ok())
        .filter(|name| name.ends_with(".json"))
        .collect();
    on_disk.sort();
    let mut listed: Vec<String> = EXPECTED.iter().map(|(name, _)| name.to_string()).collect();
    listed.sort();
    assert_eq!(on_disk, listed);
    assert!(listed.len() >= 6, "the issue asks for at least six demo loads");
}

#[test]
fn every_demo_load_plans_with_its_expected_warnings() {
    for (name, expected) in EXPECTED {
        let plan = run_json(&["plan", &demo_path(name)]);
        let codes: Vec<&str> =
            plan["warnings"].as_array().unwrap().iter().map(|w| w["code"].as_str().unwrap()).collect();
        assert_eq!(&codes, expected, "{name}");
        for warning in plan["warnings"].as_array().unwrap() {
            assert!(warning["message"].as_str().unwrap().len() > 40, "{name}: a warning says what to change");
        }
        assert!(plan["generator_count"].as_u64().unwrap() >= 1, "{name}");
        let description = serde_json::from_str::<serde_json::Value>(&std::fs::read_to_string(demo_path(name)).unwrap())
            .unwrap()["description"]
            .as_str()
            .unwrap_or("")
            .len();
        assert!(description > 30, "{name} has a short description");
    }
}

#[test]
fn every_demo_load_compares_across_bands() {
    for (name, _) in EXPECTED {
        let comparison = run_json(&["compare", &demo_path(name)]);
        let bands = comparison["bands"].as_array().unwrap();
        assert!(bands.iter().any(|band| band["is_scenario_band"] == true), "{name}");
        assert!(
            bands.iter().filter(|band| band["generator_count"].is_u64()).count() >= 3,
            "{name}: at least three bands plan"
        );
    }
    let output = run(&["plan", &demo_path("tempering-beef-blocks.json"), "--format", "text"]);
    assert!(output.status.success());
    assert!(String::from_utf8_lossy(&output.stdout).contains("generators"));
}

#[test]
fn every_demo_load_survives_a_link_round_trip() {
    use doubleprime::scenario::link::{scenario_from_fragment, scenario_to_fragment};
    for (name, _) in EXPECTED {
        let text = std::fs::read_to_string(demo_path(name)).unwrap();
        let scenario = doubleprime::scenario::parse_scenario(&text).unwrap();
        let fragment = scenario_to_fragment(&scenario);
        assert!(fragment.chars().all(|c| c.is_ascii_alphanumeric() || "-_.".contains(c)), "URL-safe: {name}");
        assert_eq!(scenario_from_fragment(&format!("#{fragment}")).unwrap(), scenario, "{name}");
    }
}
