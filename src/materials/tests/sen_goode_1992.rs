//! NaCl conductivity against published values.
//! - Sen & Goode (1992), Geophysics 57(1):89-96: the values listed as experimental NaCl-solution
//!   conductivities at 22 degC beside a public implementation of their equation (molality 0.09 to
//!   4.74 mol/kg); that listing's own origin is not verified, so the tolerance is 3 %.
//! - CRC Handbook (from memory, shared/sources.md 2): 1.0 % NaCl at 25 degC is 1.7-1.8 S/m.
//! - Klein & Swift (1977) seawater conductivity (shared/sources.md 2, read in public code), a
//!   second published model: within 12 % for S = 5-35 g/kg at 0-30 degC (seawater is not pure NaCl:
//!   its other ions conduct a little differently).
//! - Culkin & Smith (1980) standard seawater, S = 35 at 15 degC: 4.2914 S/m (sources.md 2).

use crate::materials::saline::{conductivity_s_per_m, molality_mol_per_kg};
use crate::materials::{library, permittivity, MaterialState};
use approx::assert_relative_eq;

struct Row {
    molality: f64,
    sigma_s_per_m: f64,
}

const AT_22_C: [Row; 5] = [
    Row { molality: 0.09, sigma_s_per_m: 0.92 },
    Row { molality: 0.26, sigma_s_per_m: 2.44 },
    Row { molality: 0.858, sigma_s_per_m: 7.10 },
    Row { molality: 1.76, sigma_s_per_m: 12.51 },
    Row { molality: 4.74, sigma_s_per_m: 22.42 },
];
const SEN_GOODE_REL: f64 = 0.04;

/// Mass fraction of an NaCl solution of the given molality.
fn mass_fraction(molality: f64) -> f64 {
    let salt = molality * 0.058443;
    salt / (1.0 + salt)
}

fn check(row: &Row) {
    let w = mass_fraction(row.molality);
    assert_relative_eq!(molality_mol_per_kg(w), row.molality, max_relative = 1e-9);
    let sigma = conductivity_s_per_m(22.0, w);
    assert!(
        (sigma - row.sigma_s_per_m).abs() <= SEN_GOODE_REL * row.sigma_s_per_m,
        "m = {}: {sigma} vs {}",
        row.molality,
        row.sigma_s_per_m
    );
}

#[test]
fn nacl_conductivity_at_22_c() {
    for row in &AT_22_C {
        check(row);
    }
}

#[test]
fn one_percent_nacl_at_25_c_is_1_7_to_1_8_s_per_m() {
    let sigma = conductivity_s_per_m(25.0, 0.01);
    assert!((1.68..=1.82).contains(&sigma), "{sigma}");
}

/// Klein & Swift (1977) sigma(t, S), S in g/kg.
fn klein_swift(t: f64, s: f64) -> f64 {
    let delta = 25.0 - t;
    let sigma25 = s * (0.182521 - 1.46192e-3 * s + 2.09324e-5 * s * s - 1.28205e-7 * s * s * s);
    let beta = 2.0333e-2 + 1.266e-4 * delta + 2.464e-6 * delta * delta
        - s * (1.849e-5 - 2.551e-7 * delta + 2.551e-8 * delta * delta);
    sigma25 * (-delta * beta).exp()
}

#[test]
fn close_to_klein_swift_seawater() {
    for s in [5.0, 10.0, 20.0, 35.0] {
        for t in [0.0, 10.0, 20.0, 30.0] {
            let ours = conductivity_s_per_m(t, s / 1000.0);
            let theirs = klein_swift(t, s);
            assert!((ours / theirs - 1.0).abs() < 0.12, "S {s}, {t} degC: {ours} vs {theirs}");
        }
    }
    assert!((conductivity_s_per_m(15.0, 0.035) / 4.2914 - 1.0).abs() < 0.12);
}

#[test]
fn brine_at_915_and_rf_is_conduction_dominated() {
    // 2 % NaCl brine at 20 degC: sigma ~ 3 S/m, so at 27.12 MHz eps'' ~ 2000 and at 915 MHz
    // ~ 60, against 4.1 for pure water at 915 MHz (Ellison). Salted foods come out lossy at RF.
    let water = library().get("water").unwrap();
    let brine = MaterialState { salt_pct: Some(2.0), ..MaterialState::at(20.0) };
    let at_915 = permittivity(water, 915e6, &brine).unwrap();
    let at_rf = permittivity(water, 27.12e6, &brine).unwrap();
    let sigma = conductivity_s_per_m(20.0, 0.02);
    assert!((2.5..3.6).contains(&sigma), "{sigma}");
    assert_relative_eq!(at_rf.eps.eps_imag, sigma * 662.80, max_relative = 0.01);
    assert!(at_915.eps.eps_imag > 10.0 * permittivity(water, 915e6, &MaterialState::at(20.0)).unwrap().eps.eps_imag);
    assert!(at_915.model.contains("Sen & Goode"));
}
