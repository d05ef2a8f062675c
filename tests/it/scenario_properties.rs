//! Property tests over scenario JSON: whatever numbers, types or gaps a scenario holds, planning
//! never panics, every refusal names a field and a valid range, and an accepted plan is finite
//! and positive where it must be.

use doubleprime::plan::{band_comparison::compare, plan_json};
use proptest::prelude::*;
use serde_json::Value;
use std::path::Path;

/// Numbers a hostile or careless file might hold (JSON has no NaN or infinity).
fn awkward_number() -> impl Strategy<Value = Value> {
    prop_oneof![
        Just(Value::from(0)),
        Just(Value::from(-1)),
        Just(Value::from(1e308)),
        Just(Value::from(-1e308)),
        Just(Value::from(5e-324)),
        Just(Value::from(1e-9)),
        Just(Value::from(u64::MAX)),
        (-1e6..1e6f64).prop_map(Value::from),
        (0.0..2.0f64).prop_map(Value::from),
        Just(Value::from("12")),
        Just(Value::Null),
        Just(Value::from(true)),
    ]
}

fn demo(name: &str) -> Value {
    let path = Path::new(env!("CARGO_MANIFEST_DIR")).join("demo-loads").join(name);
    serde_json::from_str(&std::fs::read_to_string(path).unwrap()).unwrap()
}

/// Paths to every number in a document (`tunnel.bed_depth_m`, `inlet.temp_c`, ...).
fn number_paths(value: &Value, prefix: &str, out: &mut Vec<String>) {
    match value {
        Value::Number(_) => out.push(prefix.to_string()),
        Value::Object(map) => {
            for (key, child) in map {
                let path = if prefix.is_empty() { key.clone() } else { format!("{prefix}.{key}") };
                number_paths(child, &path, out);
            }
        }
        _ => {}
    }
}

fn set_path(value: &mut Value, path: &str, new: Value) {
    let mut current = value;
    let parts: Vec<&str> = path.split('.').collect();
    for part in &parts[..parts.len() - 1] {
        current = &mut current[*part];
    }
    current[parts[parts.len() - 1]] = new;
}

const DEMOS: [&str; 6] = [
    "tempering-beef-blocks.json",
    "pasteurising-potato-trays.json",
    "drying-sand-cores.json",
    "rf-drying-cotton-packages.json",
    "curing-rubber-profile.json",
    "layered-meal-trays.json",
];

proptest! {
    #![proptest_config(ProptestConfig { cases: 300, ..ProptestConfig::default() })]

    #[test]
    fn any_numbers_in_any_demo_plan_or_are_refused_by_name(
        demo_index in 0..DEMOS.len(),
        picks in proptest::collection::vec((any::<proptest::sample::Index>(), awkward_number()), 1..4),
    ) {
        let mut document = demo(DEMOS[demo_index]);
        let mut paths = Vec::new();
        number_paths(&document, "", &mut paths);
        paths.retain(|p| p != "schema");
        for (index, number) in picks {
            let path = index.get(&paths).clone();
            set_path(&mut document, &path, number);
        }
        let text = document.to_string();
        match plan_json(&text) {
            Ok(plan) => {
                prop_assert!(doubleprime::finite::first_non_finite(&plan).is_none());
                prop_assert!(plan.absorbed_power_kw > 0.0);
                prop_assert!(plan.mains_power_kw >= plan.absorbed_power_kw);
                prop_assert!(plan.generator_count >= 1);
                prop_assert!(plan.tunnel_length_m > 0.0 && plan.belt_speed_m_per_min > 0.0);
            }
            Err(errors) => {
                prop_assert!(!errors.is_empty());
                for error in errors {
                    prop_assert!(!error.field.is_empty() && !error.valid.is_empty(), "{error:?}");
                }
            }
        }
    }

    #[test]
    fn truncated_or_reshaped_files_are_refused_cleanly(demo_index in 0..DEMOS.len(), cut in 0.0..1.0f64, drop in any::<proptest::sample::Index>()) {
        let text = demo(DEMOS[demo_index]).to_string();
        let mut end = (text.len() as f64 * cut) as usize;
        while !text.is_char_boundary(end) {
            end -= 1;
        }
        let truncated = &text[..end];
        prop_assert!(plan_json(truncated).is_err());
        let mut document = demo(DEMOS[demo_index]);
        let keys: Vec<String> = document.as_object().unwrap().keys().cloned().collect();
        let key = drop.get(&keys).clone();
        document.as_object_mut().unwrap().remove(&key);
        // A missing optional section still plans; a missing required one is named.
        if let Err(errors) = plan_json(&document.to_string()) {
            prop_assert!(errors.iter().all(|e| !e.field.is_empty()));
        }
    }
}

#[test]
fn comparison_survives_every_demo_with_extreme_throughput() {
    for name in DEMOS {
        let mut document = demo(name);
        document["throughput_kg_per_h"] = Value::from(200_000.0);
        let scenario = doubleprime::scenario::parse_scenario(&document.to_string()).unwrap();
        if let Ok(comparison) = compare(&scenario) {
            assert!(doubleprime::finite::first_non_finite(&comparison).is_none(), "{name}");
        }
    }
}
