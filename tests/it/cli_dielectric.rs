//! `doubleprime dielectric` and `doubleprime bands`: keys, values, exit codes and messages.

use crate::support::{number, run_json, run_refused};
use approx::assert_relative_eq;

#[test]
fn dielectric_prints_the_contract_keys() {
    let out = run_json(&["dielectric", "--freq-mhz", "2450", "--eps-real", "78", "--eps-imag", "13.4"]);
    for key in [
        "wavelength_free_space_m",
        "wavelength_in_material_m",
        "attenuation_np_per_m",
        "penetration_depth_m",
        "half_power_depth_m",
        "loss_tangent",
        "reflectance_normal",
    ] {
        assert!(out[key].is_number(), "missing {key}: {out}");
    }
    assert!(out.get("power_density_w_per_m3").is_none(), "no power without --e-rms");
    // Water at 2.45 GHz as 78 - j13.4 (Datta & Ramaswamy 2001): Dp = 1.29 cm (sources.md 4, [CALC]).
    assert_relative_eq!(number(&out, "penetration_depth_m"), 0.0129, max_relative = 0.01);
    // lambda0 = c0/f exactly.
    assert_relative_eq!(number(&out, "wavelength_free_space_m"), 299_792_458.0 / 2.45e9, max_relative = 1e-12);
    assert_eq!(out["ism_band"], "2 450 MHz");
}

#[test]
fn field_and_volume_add_power() {
    let out = run_json(&[
        "dielectric",
        "--freq-mhz",
        "915",
        "--eps-real",
        "56",
        "--eps-imag",
        "21",
        "--e-rms",
        "2000",
        "--volume-m3",
        "0.01",
    ]);
    // Komarov, Wang & Tang (2005) Eq. (3): P_v = 5.563e-11 f E^2 eps''.
    let expected = 5.563e-11 * 915e6 * 2000.0_f64.powi(2) * 21.0;
    assert_relative_eq!(number(&out, "power_density_w_per_m3"), expected, max_relative = 1e-4);
    assert_relative_eq!(number(&out, "power_w"), expected * 0.01, max_relative = 1e-4);
}

#[test]
fn decimal_comma_is_accepted() {
    let out = run_json(&["dielectric", "--freq-mhz", "27,12", "--eps-real", "60", "--eps-imag", "662,8"]);
    assert_relative_eq!(number(&out, "freq_mhz"), 27.12);
}

#[test]
fn out_of_band_frequency_warns() {
    let out = run_json(&["dielectric", "--freq-mhz", "1000", "--eps-real", "10", "--eps-imag", "1"]);
    assert_eq!(out["warnings"][0]["code"], "outside_ism_band");
    assert!(out["ism_band"].is_null());
}

#[test]
fn bad_arguments_exit_2_naming_the_argument_and_range() {
    let line = run_refused(&["dielectric", "--freq-mhz", "-3", "--eps-real", "78", "--eps-imag", "1"]);
    assert!(line.contains("--freq-mhz") && line.contains("0.001 to 300000"), "{line}");
    let line = run_refused(&["dielectric", "--freq-mhz", "915", "--eps-real", "0.5", "--eps-imag", "1"]);
    assert!(line.contains("--eps-real") && line.contains("1 to 1000"), "{line}");
    let line = run_refused(&["dielectric", "--freq-mhz", "915", "--eps-real", "5", "--eps-imag", "NaN"]);
    assert!(line.contains("--eps-imag"), "{line}");
    let line = run_refused(&["dielectric", "--freq-mhz", "915", "--eps-real", "5"]);
    assert!(line.contains("--eps-imag") && line.contains("required"), "{line}");
    let line =
        run_refused(&["dielectric", "--freq-mhz", "915", "--eps-real", "5", "--eps-imag", "1", "--colour", "red"]);
    assert!(line.contains("--colour"), "{line}");
    let line = run_refused(&["dielectric", "--freq-mhz", "abc", "--eps-real", "5", "--eps-imag", "1"]);
    assert!(line.contains("--freq-mhz") && line.contains("\"abc\""), "{line}");
    let line = run_refused(&["frobnicate"]);
    assert!(line.contains("frobnicate"), "{line}");
}

#[test]
fn bands_lists_the_heating_bands() {
    let out = run_json(&["bands"]);
    let bands = out["bands"].as_array().expect("bands array");
    let centres: Vec<f64> = bands.iter().map(|b| b["centre_mhz"].as_f64().unwrap()).collect();
    for required in [13.56, 27.12, 40.68, 433.92, 896.0, 915.0, 2450.0, 5800.0] {
        assert!(centres.contains(&required), "{required} MHz missing");
    }
    for band in bands {
        assert!(band["low_mhz"].as_f64() < band["high_mhz"].as_f64());
        assert!(band["designation"].is_string());
    }
}
