//! Frozen-food enthalpy and ice fraction of lean beef against the ASHRAE Handbook - Refrigeration
//! ("Thermal properties of foods", Chen/Schwartzberg form, L0 = 333.6 kJ/kg, t_r = -40 degC), check
//! values evaluated in shared/sources.md section 7 [CALC] for x_w 0.74, x_p 0.22, x_s 0.26,
//! t_f = -1.7 degC (the library's `beef-lean`).

use crate::materials::library;
use approx::assert_relative_eq;

struct Row {
    temp_c: f64,
    enthalpy_kj_per_kg: f64,
}

const ROWS: [Row; 8] = [
    Row { temp_c: -20.0, enthalpy_kj_per_kg: 46.80 },
    Row { temp_c: -18.0, enthalpy_kj_per_kg: 52.61 },
    Row { temp_c: -10.0, enthalpy_kj_per_kg: 84.06 },
    Row { temp_c: -5.0, enthalpy_kj_per_kg: 130.42 },
    Row { temp_c: -4.0, enthalpy_kj_per_kg: 150.79 },
    Row { temp_c: -3.0, enthalpy_kj_per_kg: 183.48 },
    Row { temp_c: -2.0, enthalpy_kj_per_kg: 246.99 },
    Row { temp_c: -1.7, enthalpy_kj_per_kg: 280.18 },
];

/// The values are printed to 0.01 kJ/kg; 0.02 kJ/kg covers the rounding.
const ENTHALPY_ABS_KJ_PER_KG: f64 = 0.02;

fn check(row: &Row) {
    let beef = library().get("beef-lean").unwrap();
    let h = beef.enthalpy_j_per_kg(row.temp_c, None).unwrap() / 1e3;
    assert!(
        (h - row.enthalpy_kj_per_kg).abs() <= ENTHALPY_ABS_KJ_PER_KG,
        "{} degC: {h} vs ASHRAE {}",
        row.temp_c,
        row.enthalpy_kj_per_kg
    );
}

#[test]
fn lean_beef_enthalpy_table() {
    for row in &ROWS {
        check(row);
    }
}

#[test]
fn tempering_energy_minus_18_to_minus_4() {
    // shared/sources.md 7: Delta H(-18 -> -4) = 98.18 kJ/kg; (-18 -> -2) 194.38; full thaw 227.6,
    // cf. a supplier's "232 kJ/kg for 90 % lean beef from -18 degC".
    let beef = library().get("beef-lean").unwrap();
    let h = |t: f64| beef.enthalpy_j_per_kg(t, None).unwrap() / 1e3;
    assert_relative_eq!(h(-4.0) - h(-18.0), 98.18, epsilon = 0.02);
    assert_relative_eq!(h(-2.0) - h(-18.0), 194.38, epsilon = 0.02);
    assert_relative_eq!(h(-1.7) - h(-18.0), 227.6, epsilon = 0.05);
}

#[test]
fn thawed_side_is_sensible_heat() {
    // Above t_f the enthalpy rises by the Choi-Okos specific heat (3.6 kJ/(kg K) near 5 degC).
    let beef = library().get("beef-lean").unwrap();
    let rise = beef.enthalpy_j_per_kg(6.0, None).unwrap() - beef.enthalpy_j_per_kg(4.0, None).unwrap();
    let cp = beef.specific_heat_j_per_kg_k(5.0, None).unwrap();
    assert_relative_eq!(rise / 2.0, cp, max_relative = 1e-4);
}

#[test]
fn frozen_fraction_at_and_below_the_freezing_point() {
    let beef = library().get("beef-lean").unwrap();
    assert_eq!(beef.initial_freezing_point_c(), Some(-1.7));
    assert_eq!(beef.frozen_fraction(-1.7).unwrap(), 0.0);
    assert_eq!(beef.frozen_fraction(10.0).unwrap(), 0.0);
    // (x_w - x_b)(1 - t_f/t)/x_w = 0.652 (1 - 1.7/10)/0.74 = 0.73130 at -10 degC.
    assert_relative_eq!(beef.frozen_fraction(-10.0).unwrap(), 0.652 * 0.83 / 0.74, max_relative = 1e-9);
    assert!(beef.frozen_fraction(-3.0).unwrap() < beef.frozen_fraction(-20.0).unwrap());
    let ice = library().get("ice").unwrap();
    assert_eq!(ice.frozen_fraction(-5.0).unwrap(), 1.0);
}
