//! `doubleprime plan` and `doubleprime compare`: output keys, formats, and refusals.

use crate::support::{number, run, run_json, run_refused};
use std::io::Write;

fn demo(name: &str) -> String {
    format!("{}/demo-loads/{name}", env!("CARGO_MANIFEST_DIR"))
}

fn temp_file(name: &str, text: &str) -> String {
    let path = std::env::temp_dir().join(format!("doubleprime-cli-plan-{}-{name}", std::process::id()));
    std::fs::File::create(&path).unwrap().write_all(text.as_bytes()).unwrap();
    path.to_string_lossy().into_owned()
}

#[test]
fn plan_prints_the_contract_keys() {
    let plan = run_json(&["plan", &demo("tempering-beef-blocks.json")]);
    for key in [
        "absorbed_power_kw",
        "forward_power_kw",
        "mains_power_kw",
        "generator_rating_kw",
        "frequency_mhz",
        "belt_speed_m_per_min",
        "residence_time_s",
        "tunnel_length_m",
        "water_removed_kg_per_h",
        "specific_energy_kwh_per_kg",
    ] {
        assert!(plan[key].is_number(), "missing {key}");
    }
    assert!(plan["generator_count"].is_u64());
    assert!(!plan["zones"].as_array().unwrap().is_empty());
    assert!(plan["depth_profile"].is_object());
    for warning in plan["warnings"].as_array().unwrap() {
        assert!(warning["code"].is_string() && warning["message"].is_string());
    }
    assert!(plan["cautions"].as_array().unwrap().len() >= 7);
    assert!(plan["assumptions"]["efficiency"]["applicator"].is_number(), "assumptions echo the chain");
    // The chain only loses power on the way back to the mains.
    assert!(number(&plan, "mains_power_kw") > number(&plan, "forward_power_kw"));
    assert!(number(&plan, "forward_power_kw") > number(&plan, "absorbed_power_kw"));
}

#[test]
fn text_format_and_compare() {
    let output = run(&["plan", &demo("drying-sand-cores.json"), "--format", "text"]);
    assert!(output.status.success());
    let text = String::from_utf8_lossy(&output.stdout);
    assert!(text.contains("kWh per kg of water removed"), "{text}");
    let comparison = run_json(&["compare", &demo("drying-sand-cores.json")]);
    let bands: Vec<f64> =
        comparison["bands"].as_array().unwrap().iter().map(|b| b["frequency_mhz"].as_f64().unwrap()).collect();
    assert_eq!(bands, [13.56, 27.12, 40.68, 896.0, 915.0, 2450.0]);
}

#[test]
fn extra_generator_classes_from_a_file() {
    let catalogue = temp_file(
        "classes.json",
        r#"{"classes": [{"id": "user-915-200", "label": "915 MHz tube, 200 kW (user)", "kind": "magnetron", "freq_mhz": 915,
        "rated_output_kw": 200, "generator_efficiency": 0.88, "power_supply_efficiency": 0.95, "max_operating_fraction": 0.9,
        "min_operating_fraction": 0.15, "cooling": "water", "anode_kv": 20, "confidence": "user"}]}"#,
    );
    let scenario = std::fs::read_to_string(demo("tempering-beef-blocks.json"))
        .unwrap()
        .replace(r#""generator": { "redundancy": "n" }"#, r#""generator": { "class": "user-915-200" }"#);
    let path = temp_file("scenario.json", &scenario);
    let plan = run_json(&["plan", &path, "--generators", &catalogue]);
    assert_eq!(plan["generator_class"], "user-915-200");
    assert_eq!(plan["generator_count"], 1);
}

#[test]
fn refusals_are_one_line_naming_the_problem() {
    let line = run_refused(&["plan", "/nonexistent/scenario.json"]);
    assert!(line.contains("/nonexistent/scenario.json"), "{line}");
    let bad = temp_file("bad.json", r#"{"schema": 1, "process": "heating"}"#);
    let line = run_refused(&["plan", &bad]);
    assert!(line.contains("product") || line.contains("missing field"), "{line}");
    let scenario = std::fs::read_to_string(demo("tempering-beef-blocks.json"))
        .unwrap()
        .replace(r#""throughput_kg_per_h": 3000"#, r#""throughput_kg_per_h": -5"#)
        .replace(r#""belt_width_m": 1.0"#, r#""belt_width_m": 50"#);
    let line = run_refused(&["plan", &temp_file("two-problems.json", &scenario)]);
    assert!(
        line.contains("throughput_kg_per_h") && line.contains("tunnel.belt_width_m"),
        "every problem at once: {line}"
    );
    let line = run_refused(&["plan", &demo("tempering-beef-blocks.json"), "--format", "yaml"]);
    assert!(line.contains("--format"), "{line}");
    let line = run_refused(&["compare"]);
    assert!(line.contains("scenario file"), "{line}");
}

#[test]
fn csv_carries_one_row_per_zone_with_units_in_the_headers() {
    let output = run(&["plan", &demo("drying-sand-cores.json"), "--format", "csv"]);
    assert!(output.status.success());
    let text = String::from_utf8_lossy(&output.stdout).to_string();
    let lines: Vec<&str> = text.lines().collect();
    assert!(lines[0].contains("absorbed power [kW]") && lines[0].contains("temperature out [degC]"), "{}", lines[0]);
    let plan = run_json(&["plan", &demo("drying-sand-cores.json")]);
    let zones = plan["zones"].as_array().unwrap();
    assert_eq!(lines.len(), zones.len() + 1);
    // The absorbed kW column sums to the plan's absorbed power (the zones distribute the balance).
    let column = lines[0].split(',').position(|h| h == "absorbed power [kW]").unwrap();
    let sum: f64 = lines[1..].iter().map(|row| row.split(',').nth(column).unwrap().parse::<f64>().unwrap()).sum();
    assert!((sum - number(&plan, "absorbed_power_kw")).abs() < 1e-6 * sum);
}

#[test]
fn generators_lists_the_catalogue_by_band() {
    let all = run_json(&["generators"]);
    let in_band = run_json(&["generators", "--freq-mhz", "2450"]);
    assert!(all["count"].as_u64().unwrap() > in_band["count"].as_u64().unwrap());
    for class in in_band["classes"].as_array().unwrap() {
        assert_eq!(class["freq_mhz"], 2450.0);
    }
    let line = run_refused(&["generators", "--freq-mhz", "-1"]);
    assert!(line.contains("--freq-mhz"), "{line}");
}
