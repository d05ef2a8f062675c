//! Freezing of foods: ice fraction below the initial freezing point and the frozen-food enthalpy.
//!
//! Ice fraction (ASHRAE Handbook - Refrigeration, "Thermal properties of foods"; Schwartzberg 1976),
//! t and t_f in degC, t <= t_f < 0:
//!   x_ice = (x_w - x_b) (1 - t_f / t),   x_b = 0.4 x_protein (bound water, Schwartzberg 1976)
//! Enthalpy below t_f (Chen / Schwartzberg form as given by ASHRAE, shared/sources.md 7), kJ/kg:
//!   H(t) = (t - t_r) [1.55 + 1.26 x_s - (x_w - x_b) L0 t_f / (t_r t)],  t_r = -40 degC (H = 0),
//!   L0 = 333.6 kJ/kg (the ASHRAE constant; IAPWS gives 333.42, see [`crate::materials::thermal`]).
//! Above t_f the food is unfrozen and H(t) = H(t_f) + integral of the Choi-Okos c_p from t_f to t,
//! so H is continuous at t_f and rises monotonically everywhere (dH/dt = 1.55 + 1.26 x_s + (x_w - x_b)
//! L0 (-t_f) / t^2 > 0 below t_f). Assumptions: the freezing curve follows a dilute-solution
//! (Raoult) law, all freezable water is frozen at equilibrium, no supercooling. Validity: ASHRAE gives
//! the form for -40 degC to t_f; it is continued to -60 degC (monotonic, small values).
//! Moisture change: the solutes stay with the dry matter, so the freezing-point depression scales
//! with solids per water, t_f(x_w) = t_f0 [(1 - x_w)/x_w] / [(1 - x_w0)/x_w0] (Raoult's law; common
//! practice), and foods below 5 % water are treated as not freezing.

use crate::materials::composition::Composition;

/// Reference temperature of the ASHRAE frozen-food enthalpy (H = 0 there), degC.
pub const ENTHALPY_REFERENCE_C: f64 = -40.0;
/// Latent heat of fusion used by the ASHRAE form, kJ/kg.
pub const ASHRAE_LATENT_HEAT_KJ_PER_KG: f64 = 333.6;
/// Bound (non-freezable) water per kg of protein (Schwartzberg 1976, as in ASHRAE).
pub const BOUND_WATER_PER_PROTEIN: f64 = 0.4;
/// Below this water content a food is treated as not freezing.
pub const NON_FREEZING_MOISTURE_WB: f64 = 0.05;

/// Bound water x_b = 0.4 x_protein, kg/kg, never more than the water present.
pub fn bound_water(composition: &Composition) -> f64 {
    (BOUND_WATER_PER_PROTEIN * composition.protein).min(composition.water)
}

/// Ice mass fraction x_ice (kg ice per kg food) at `temp_c` for initial freezing point `tf_c` (< 0).
pub fn ice_mass_fraction(composition: &Composition, tf_c: f64, temp_c: f64) -> f64 {
    if temp_c >= tf_c || tf_c >= 0.0 {
        return 0.0;
    }
    let freezable = composition.water - bound_water(composition);
    (freezable * (1.0 - tf_c / temp_c)).clamp(0.0, composition.water)
}

/// Fraction of the food's water that is ice (0 above the freezing point).
pub fn frozen_fraction_of_water(composition: &Composition, tf_c: f64, temp_c: f64) -> f64 {
    if composition.water <= 0.0 {
        return 0.0;
    }
    ice_mass_fraction(composition, tf_c, temp_c) / composition.water
}

/// The initial freezing point at another water content (Raoult scaling), or `None` if the food is
/// then too dry to freeze.
pub fn freezing_point_at_moisture(tf0_c: f64, moisture0_wb: f64, moisture_wb: f64) -> Option<f64> {
    if moisture_wb < NON_FREEZING_MOISTURE_WB || moisture0_wb <= 0.0 || moisture0_wb >= 1.0 {
        return None;
    }
    let solids_per_water = (1.0 - moisture_wb) / moisture_wb;
    let solids_per_water0 = (1.0 - moisture0_wb) / moisture0_wb;
    let tf = tf0_c * solids_per_water / solids_per_water0;
    (tf.is_finite() && tf > -60.0 && tf < 0.0).then_some(tf)
}

/// ASHRAE frozen-food enthalpy at `temp_c <= tf_c`, J/kg, reference -40 degC.
fn frozen_enthalpy_j_per_kg(composition: &Composition, tf_c: f64, temp_c: f64) -> f64 {
    let tr = ENTHALPY_REFERENCE_C;
    let solids = composition.solids();
    let freezable = composition.water - bound_water(composition);
    let bracket = 1.55 + 1.26 * solids - freezable * ASHRAE_LATENT_HEAT_KJ_PER_KG * tf_c / (tr * temp_c);
    1000.0 * (temp_c - tr) * bracket
}

/// Specific enthalpy of a freezing food at `temp_c`, J/kg, relative to the frozen food at -40 degC:
/// the ASHRAE form up to `tf_c`, then the Choi-Okos sensible heat of the unfrozen food.
pub fn food_enthalpy_j_per_kg(composition: &Composition, tf_c: f64, temp_c: f64) -> f64 {
    if temp_c <= tf_c {
        frozen_enthalpy_j_per_kg(composition, tf_c, temp_c)
    } else {
        frozen_enthalpy_j_per_kg(composition, tf_c, tf_c) + composition.sensible_heat_j_per_kg(tf_c, temp_c)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    /// Lean beef of shared/sources.md 7: x_w 0.74, x_p 0.22, x_s 0.26, t_f = -1.7 degC.
    const LEAN_BEEF: Composition =
        Composition { water: 0.74, protein: 0.22, fat: 0.02, carbohydrate: 0.01, fiber: 0.0, ash: 0.01 };
    const TF: f64 = -1.7;

    #[test]
    fn no_ice_at_and_above_the_freezing_point() {
        assert_eq!(ice_mass_fraction(&LEAN_BEEF, TF, TF), 0.0);
        assert_eq!(ice_mass_fraction(&LEAN_BEEF, TF, 5.0), 0.0);
    }

    #[test]
    fn ice_fraction_below_the_freezing_point() {
        // x_ice = (0.74 - 0.088)(1 - 1.7/10) = 0.54116 at -10 degC [CALC from the ASHRAE form].
        assert_relative_eq!(ice_mass_fraction(&LEAN_BEEF, TF, -10.0), 0.652 * 0.83, max_relative = 1e-12);
        // Far below, it tends to the freezable water x_w - x_b.
        assert!(ice_mass_fraction(&LEAN_BEEF, TF, -60.0) < 0.652);
        assert!(frozen_fraction_of_water(&LEAN_BEEF, TF, -60.0) > 0.83);
    }

    #[test]
    fn enthalpy_is_continuous_and_monotonic() {
        let below = food_enthalpy_j_per_kg(&LEAN_BEEF, TF, TF - 1e-9);
        let above = food_enthalpy_j_per_kg(&LEAN_BEEF, TF, TF + 1e-9);
        assert!((above - below).abs() < 1e-3);
        let mut previous = f64::NEG_INFINITY;
        let mut t = -60.0;
        while t <= 100.0 {
            let h = food_enthalpy_j_per_kg(&LEAN_BEEF, TF, t);
            assert!(h > previous, "{t}");
            previous = h;
            t += 0.05;
        }
    }

    #[test]
    fn freezing_point_follows_moisture() {
        assert_relative_eq!(freezing_point_at_moisture(TF, 0.74, 0.74).unwrap(), TF, max_relative = 1e-12);
        let drier = freezing_point_at_moisture(TF, 0.74, 0.5).unwrap();
        assert!(drier < TF);
        assert_eq!(freezing_point_at_moisture(TF, 0.74, 0.02), None);
    }
}
