//! `doubleprime material` and `doubleprime materials`: keys, values, flags and refusals.

use crate::support::{number, run_json, run_refused};
use approx::assert_relative_eq;

#[test]
fn material_prints_the_contract_keys() {
    let out = run_json(&["material", "water", "--freq-mhz", "2450", "--temp-c", "25"]);
    for key in ["eps_real", "eps_imag", "penetration_depth_m", "density_kg_per_m3", "specific_heat_j_per_kg_k"] {
        assert!(out[key].is_number(), "missing {key}: {out}");
    }
    assert!(out["source"].as_str().unwrap().contains("Ellison"));
    assert_eq!(out["in_range"], true);
    assert!(out["points_used"].is_array());
    // Water at 25 degC, 2.45 GHz: Ellison (2007) 77.16 - j9.28; Meissner & Wentz (2004) 77.23 - j9.18 [CALC].
    assert_relative_eq!(number(&out, "eps_real"), 77.2, max_relative = 0.01);
    assert_relative_eq!(number(&out, "eps_imag"), 9.3, max_relative = 0.05);
    // Rule of thumb for water at 2.45 GHz, 25 degC: Dp about 1.4-1.9 cm (shared/sources.md 4).
    let dp = number(&out, "penetration_depth_m");
    assert!((0.014..0.02).contains(&dp), "{dp}");
}

#[test]
fn ice_exists_and_is_nearly_transparent() {
    let out = run_json(&["material", "ice", "--freq-mhz", "915", "--temp-c", "-10"]);
    assert!(number(&out, "eps_imag") < 1e-2);
    assert!(number(&out, "penetration_depth_m") > 10.0);
    assert_eq!(out["frozen_fraction"], 1.0);
}

#[test]
fn salt_raises_loss_at_rf() {
    let plain = run_json(&["material", "water", "--freq-mhz", "27.12", "--temp-c", "20"]);
    let brine = run_json(&["material", "water", "--freq-mhz", "27.12", "--temp-c", "20", "--salt-pct", "1"]);
    assert!(number(&brine, "eps_imag") > 100.0 * number(&plain, "eps_imag"));
}

#[test]
fn tabulated_material_lists_its_points_and_flags_outside() {
    let out = run_json(&["material", "potato-raw", "--freq-mhz", "2450", "--temp-c", "22"]);
    assert_eq!(out["in_range"], true);
    assert_eq!(out["eps_real"], 57.0);
    assert!(out["points_used"][0]["source"].as_str().unwrap().contains("Datta"));
    let outside = run_json(&["material", "potato-raw", "--freq-mhz", "2450", "--temp-c", "80"]);
    assert_eq!(outside["in_range"], false);
    assert!(outside["out_of_range"][0].as_str().unwrap().starts_with("temp_c = 80"));
}

#[test]
fn tempering_reports_frozen_fraction_and_runaway() {
    let out = run_json(&[
        "material",
        "beef-lean",
        "--freq-mhz",
        "915",
        "--temp-c",
        "-18",
        "--to-temp-c",
        "-2",
        "--bed-depth-m",
        "0.15",
    ]);
    assert!(number(&out, "frozen_fraction") > 0.7);
    assert_eq!(out["runaway_risk"]["severity"], "high");
    assert!(out["bed_depth"]["depth_ratio"].is_number());
}

#[test]
fn moisture_changes_a_drying_product() {
    let wet = run_json(&["material", "paper", "--freq-mhz", "915", "--temp-c", "60", "--moisture-wb", "0.5"]);
    let dry = run_json(&["material", "paper", "--freq-mhz", "915", "--temp-c", "60", "--moisture-wb", "0.05"]);
    assert!(number(&wet, "eps_imag") > 5.0 * number(&dry, "eps_imag"));
}

#[test]
fn bad_input_is_refused_with_the_argument_and_range() {
    let line = run_refused(&["material", "granite", "--freq-mhz", "915", "--temp-c", "20"]);
    assert!(line.contains("granite") && line.contains("doubleprime materials"), "{line}");
    let line = run_refused(&["material", "water", "--freq-mhz", "915", "--temp-c", "500"]);
    assert!(line.contains("--temp-c") && line.contains("-60 to 300"), "{line}");
    let line = run_refused(&["material", "water", "--freq-mhz", "915", "--temp-c", "20", "--salt-pct", "40"]);
    assert!(line.contains("--salt-pct") && line.contains("0 to 26"), "{line}");
    let line = run_refused(&["material", "water", "--temp-c", "20"]);
    assert!(line.contains("--freq-mhz"), "{line}");
}

#[test]
fn materials_lists_the_library() {
    let out = run_json(&["materials"]);
    let list = out["materials"].as_array().unwrap();
    assert!(list.len() >= 30);
    for entry in list {
        for key in ["name", "category", "freq_mhz_range", "temp_c_range", "source"] {
            assert!(!entry[key].is_null(), "missing {key}: {entry}");
        }
    }
    assert!(list.iter().any(|m| m["name"] == "water"));
    assert!(list.iter().any(|m| m["name"] == "ice"));
    let polymers = run_json(&["materials", "--category", "polymer"]);
    assert!(polymers["materials"].as_array().unwrap().iter().all(|m| m["category"] == "polymer"));
    let line = run_refused(&["materials", "--category", "metal"]);
    assert!(line.contains("metal"), "{line}");
}
