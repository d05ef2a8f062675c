//! `doubleprime layers FILE.json`: keys, energy balance, feeds, and every refusal on one stderr line.

use crate::support::{number, run_json, run_refused};
use approx::assert_relative_eq;

fn fixture(name: &str) -> String {
    format!("{}/tests/fixtures/layers/{name}", env!("CARGO_MANIFEST_DIR"))
}

fn absorbed(out: &serde_json::Value) -> f64 {
    out["layers"].as_array().expect("layers is an array").iter().map(|layer| number(layer, "absorptance")).sum()
}

#[test]
fn layers_prints_the_contract_keys_and_balances_energy() {
    let file = fixture("product-in-tray-on-belt.stack.json");
    let out = run_json(&["layers", &file, "--freq-mhz", "2450"]);
    for key in ["reflectance", "transmittance", "absorptance", "product_absorptance"] {
        assert!(out[key].is_number(), "missing {key}: {out}");
    }
    assert_eq!(out["feed"], "top");
    assert_eq!(out["backing"], "air");
    let layers = out["layers"].as_array().unwrap();
    assert_eq!(layers.len(), 3);
    assert_eq!(layers[0]["name"], "product");
    assert_eq!(layers[2]["name"], "belt");
    for layer in layers {
        for key in ["thickness_m", "absorptance", "top_depth_m"] {
            assert!(layer[key].is_number(), "layer lacks {key}: {layer}");
        }
    }
    // Energy balance (exact for a passive stack; the core checks it to 1e-9).
    let total = number(&out, "reflectance") + number(&out, "transmittance") + absorbed(&out);
    assert_relative_eq!(total, 1.0, epsilon = 1e-9);

    let profile = out["depth_profile"].as_array().unwrap();
    assert_eq!(profile.len(), 3 * 101, "101 samples per layer by default");
    let mut previous = 0.0;
    for sample in profile {
        let depth = number(sample, "depth_m");
        assert!(depth >= previous, "depths run top to bottom");
        previous = depth;
        assert!(number(sample, "power_density_per_incident_flux_per_m") >= 0.0);
        assert!(sample["layer"].is_u64());
    }
    assert_relative_eq!(previous, 0.045, max_relative = 1e-12);

    let uniformity = &out["uniformity"];
    for key in ["min_to_max_ratio", "surface_power_density_per_m", "core_to_surface_ratio", "core_lag_threshold"] {
        assert!(uniformity[key].is_number(), "uniformity lacks {key}: {uniformity}");
    }
    assert!(uniformity["core_lags"].is_boolean());
    assert_eq!(uniformity["fraction_depths"].as_array().unwrap().len(), 2);
    assert!(out["warnings"].is_array());
}

#[test]
fn half_wave_window_is_invisible() {
    // Exact identity (shared/sources.md §11): lambda0 / (2 n) of lossless eps' = 4 at 2450 MHz.
    let file = fixture("half-wave-window.stack.json");
    let out = run_json(&["layers", &file, "--freq-mhz", "2450"]);
    assert!(number(&out, "reflectance") < 1e-12, "{out}");
    assert_relative_eq!(number(&out, "transmittance"), 1.0, epsilon = 1e-12);
    // No product layer: no uniformity, and a warning that says why.
    assert!(out["uniformity"].is_null());
    let codes: Vec<&str> =
        out["warnings"].as_array().unwrap().iter().filter_map(|warning| warning["code"].as_str()).collect();
    assert!(codes.contains(&"no_product_layer"), "{codes:?}");
}

#[test]
fn two_sided_feed_reports_both_sides() {
    let file = fixture("product-in-tray-on-belt.stack.json");
    let out = run_json(&["layers", &file, "--freq-mhz", "915", "--feed", "both", "--samples", "11"]);
    assert_eq!(out["feed"], "both_sides");
    let sides = out["sides"].as_array().unwrap();
    assert_eq!(sides.len(), 2);
    assert_eq!(sides[0]["side"], "top");
    assert_eq!(sides[1]["side"], "bottom");
    assert_relative_eq!(number(&sides[0], "incident_share"), 0.5);
    assert_eq!(out["depth_profile"].as_array().unwrap().len(), 33);
    let total = number(&out, "reflectance") + number(&out, "transmittance") + absorbed(&out);
    assert_relative_eq!(total, 1.0, epsilon = 1e-9);
}

#[test]
fn metal_backing_transmits_nothing_and_refuses_a_feed_from_below() {
    let file = fixture("product-over-air-gap-on-metal.stack.json");
    let out = run_json(&["layers", &file, "--freq-mhz", "2450"]);
    assert_eq!(out["transmittance"], 0.0);
    assert_eq!(out["backing"], "metal");
    let total = number(&out, "reflectance") + absorbed(&out);
    assert_relative_eq!(total, 1.0, epsilon = 1e-9);
    for feed in ["bottom", "both"] {
        let line = run_refused(&["layers", &file, "--freq-mhz", "2450", "--feed", feed]);
        assert!(line.contains("--feed") && line.contains("metal backing"), "{line}");
    }
}

#[test]
fn half_a_metre_of_water_stays_finite_and_warns_that_the_core_lags() {
    let file = fixture("thick-water.stack.json");
    let out = run_json(&["layers", &file, "--freq-mhz", "2450", "--samples", "5000"]);
    for sample in out["depth_profile"].as_array().unwrap() {
        // serde_json writes a NaN or infinity as null, which `number` would refuse.
        number(sample, "power_density_per_incident_flux_per_m");
    }
    let codes: Vec<&str> =
        out["warnings"].as_array().unwrap().iter().filter_map(|warning| warning["code"].as_str()).collect();
    assert!(codes.contains(&"core_lags"), "{codes:?}");
    assert_eq!(out["uniformity"]["core_lags"], true);
}

#[test]
fn outside_a_band_the_warning_says_so() {
    let file = fixture("product-in-tray-on-belt.stack.json");
    let out = run_json(&["layers", &file, "--freq-mhz", "1000"]);
    let codes: Vec<&str> =
        out["warnings"].as_array().unwrap().iter().filter_map(|warning| warning["code"].as_str()).collect();
    assert!(codes.contains(&"outside_ism_band"), "{codes:?}");
}

#[test]
fn a_bad_file_is_refused_naming_the_file_and_the_problem() {
    let malformed = fixture("malformed.stack.json");
    let line = run_refused(&["layers", &malformed, "--freq-mhz", "2450"]);
    assert!(line.contains("malformed.stack.json"), "{line}");
    assert!(line.contains("not a valid stack file") && line.contains("line"), "{line}");

    let bad_thickness = fixture("bad-thickness.stack.json");
    let line = run_refused(&["layers", &bad_thickness, "--freq-mhz", "2450"]);
    assert!(line.contains("bad-thickness.stack.json"), "{line}");
    assert!(line.contains("layers[2].thickness_m"), "{line}");
    assert!(line.contains("more than 0 and at most 10"), "{line}");

    let unknown_backing = fixture("unknown-backing.stack.json");
    let line = run_refused(&["layers", &unknown_backing, "--freq-mhz", "2450"]);
    assert!(line.contains("steel") && line.contains("\"metal\""), "{line}");

    let missing = fixture("no-such-file.stack.json");
    let line = run_refused(&["layers", &missing, "--freq-mhz", "2450"]);
    assert!(line.contains("no-such-file.stack.json") && line.contains("cannot be read"), "{line}");
}

#[test]
fn bad_flags_are_refused_naming_the_flag() {
    let file = fixture("product-in-tray-on-belt.stack.json");
    let line = run_refused(&["layers", &file]);
    assert!(line.contains("--freq-mhz is required"), "{line}");
    let line = run_refused(&["layers", "--freq-mhz", "2450"]);
    assert!(line.contains("needs a stack file"), "{line}");
    let line = run_refused(&["layers", &file, "--freq-mhz", "0"]);
    assert!(line.contains("--freq-mhz"), "{line}");
    let line = run_refused(&["layers", &file, "--freq-mhz", "2450", "--feed", "sideways"]);
    assert!(line.contains("--feed") && line.contains("top, bottom or both"), "{line}");
    let line = run_refused(&["layers", &file, "--freq-mhz", "2450", "--samples", "1"]);
    assert!(line.contains("--samples") && line.contains("2 to 5000"), "{line}");
    let line = run_refused(&["layers", &file, "--freq-mhz", "2450", "--samples", "2.5"]);
    assert!(line.contains("--samples") && line.contains("whole number"), "{line}");
    let line = run_refused(&["layers", &file, &file, "--freq-mhz", "2450"]);
    assert!(line.contains("one stack file"), "{line}");
}
