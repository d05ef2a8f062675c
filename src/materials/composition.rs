//! Food composition: Choi & Okos (1986) component specific heats and densities.
//!
//! Y. Choi & M. R. Okos, "Effects of temperature and composition on the thermal properties of
//! foods", in Food Engineering and Process Applications, Vol. 1 (Elsevier 1986), as tabulated in
//! the ASHRAE Handbook - Refrigeration, "Thermal properties of foods" (shared/sources.md 7).
//! Mixture rules: c_p = sum x_i c_p,i (mass fractions); 1/rho = sum x_i / rho_i (no air).
//! Specific heats, kJ/(kg K), t in degC (-40 to 150 degC):
//!   protein 2.0082 + 1.2089e-3 t - 1.3129e-6 t^2; fat 1.9842 + 1.4733e-3 t - 4.8008e-6 t^2;
//!   carbohydrate 1.5488 + 1.9625e-3 t - 5.9399e-6 t^2; fiber 1.8459 + 1.8306e-3 t - 4.6509e-6 t^2;
//!   ash 1.0926 + 1.8896e-3 t - 3.6817e-6 t^2; water 4.1762 - 9.0864e-5 t + 5.4731e-6 t^2 (the
//!   original Choi-Okos constant 4.1762, from memory; it reproduces IAPWS cp within 0.2 %, while the
//!   ASHRAE reprint's 4.1289 is 1.3 % low, shared/sources.md 7).
//! Densities, kg/m^3 (from memory; protein checked in public code): protein 1329.9 - 0.5184 t;
//!   fat 925.59 - 0.41757 t; carbohydrate 1599.1 - 0.31046 t; fiber 1311.5 - 0.36589 t;
//!   ash 2423.8 - 0.28063 t; water 997.18 + 3.1439e-3 t - 3.7574e-3 t^2; ice 916.89 - 0.13071 t.

use crate::error::InputError;
use serde::{Deserialize, Serialize};

/// Mass fractions of a food (they sum to 1 within 0.02; the rest is taken as carbohydrate-like).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Composition {
    /// Water, kg/kg.
    pub water: f64,
    /// Protein, kg/kg.
    pub protein: f64,
    /// Fat, kg/kg.
    pub fat: f64,
    /// Carbohydrate (sugars and starch, without fibre), kg/kg.
    pub carbohydrate: f64,
    /// Dietary fibre, kg/kg.
    #[serde(default)]
    pub fiber: f64,
    /// Ash (minerals, including salt), kg/kg.
    pub ash: f64,
}

/// Allowed deviation of the sum of mass fractions from 1 (rounding in food tables).
pub const COMPOSITION_SUM_TOLERANCE: f64 = 0.02;

impl Composition {
    /// The dry-solids fraction 1 - water.
    pub fn solids(&self) -> f64 {
        1.0 - self.water
    }

    /// Sum of all fractions.
    pub fn sum(&self) -> f64 {
        self.water + self.protein + self.fat + self.carbohydrate + self.fiber + self.ash
    }

    /// Every problem with the fractions, with field names under `prefix`.
    pub fn problems(&self, prefix: &str) -> Vec<InputError> {
        let mut problems = Vec::new();
        for (name, value) in [
            ("water", self.water),
            ("protein", self.protein),
            ("fat", self.fat),
            ("carbohydrate", self.carbohydrate),
            ("fiber", self.fiber),
            ("ash", self.ash),
        ] {
            if !(value.is_finite() && (0.0..=1.0).contains(&value)) {
                problems.push(InputError::new(format!("{prefix}.{name}"), value, "0 to 1 (mass fraction)"));
            }
        }
        let sum = self.sum();
        if !(sum.is_finite() && (sum - 1.0).abs() <= COMPOSITION_SUM_TOLERANCE) {
            problems.push(InputError::new(format!("{prefix} (sum of fractions)"), sum, "1 within 0.02"));
        }
        problems
    }

    /// The same food at another water content, dry solids kept in their proportions.
    pub fn at_moisture(&self, moisture_wb: f64) -> Composition {
        let solids = self.solids();
        let scale = if solids > 0.0 { (1.0 - moisture_wb) / solids } else { 0.0 };
        Composition {
            water: moisture_wb,
            protein: self.protein * scale,
            fat: self.fat * scale,
            carbohydrate: self.carbohydrate * scale,
            fiber: self.fiber * scale,
            ash: self.ash * scale,
        }
    }

    /// Choi-Okos specific heat of the unfrozen food, J/(kg K), at `temp_c` (all water liquid).
    pub fn specific_heat_j_per_kg_k(&self, temp_c: f64) -> f64 {
        1000.0
            * (self.water * polynomial(WATER_CP, temp_c)
                + self.protein * polynomial(PROTEIN_CP, temp_c)
                + self.fat * polynomial(FAT_CP, temp_c)
                + self.carbohydrate * polynomial(CARBOHYDRATE_CP, temp_c)
                + self.fiber * polynomial(FIBER_CP, temp_c)
                + self.ash * polynomial(ASH_CP, temp_c))
    }

    /// Specific heat of the dry solids alone (no water), J/(kg K), per kg of the whole food.
    pub fn solids_specific_heat_j_per_kg_k(&self, temp_c: f64) -> f64 {
        self.specific_heat_j_per_kg_k(temp_c) - 1000.0 * self.water * polynomial(WATER_CP, temp_c)
    }

    /// Integral of the unfrozen specific heat from `from_c` to `to_c`, J/kg (exact for the polynomials).
    pub fn sensible_heat_j_per_kg(&self, from_c: f64, to_c: f64) -> f64 {
        let integral = |coefficients: [f64; 3]| {
            integrate_polynomial(coefficients, to_c) - integrate_polynomial(coefficients, from_c)
        };
        1000.0
            * (self.water * integral(WATER_CP)
                + self.protein * integral(PROTEIN_CP)
                + self.fat * integral(FAT_CP)
                + self.carbohydrate * integral(CARBOHYDRATE_CP)
                + self.fiber * integral(FIBER_CP)
                + self.ash * integral(ASH_CP))
    }

    /// Choi-Okos density of the air-free food with all water liquid, kg/m^3.
    pub fn density_kg_per_m3(&self, temp_c: f64) -> f64 {
        let specific_volume = self.water / water_density_kg_per_m3(temp_c)
            + self.protein / polynomial(PROTEIN_DENSITY, temp_c)
            + self.fat / polynomial(FAT_DENSITY, temp_c)
            + self.carbohydrate / polynomial(CARBOHYDRATE_DENSITY, temp_c)
            + self.fiber / polynomial(FIBER_DENSITY, temp_c)
            + self.ash / polynomial(ASH_DENSITY, temp_c);
        1.0 / specific_volume
    }
}

// Coefficients [c0, c1, c2] of c0 + c1 t + c2 t^2, kJ/(kg K) or kg/m^3.
const WATER_CP: [f64; 3] = [4.1762, -9.0864e-5, 5.4731e-6];
const PROTEIN_CP: [f64; 3] = [2.0082, 1.2089e-3, -1.3129e-6];
const FAT_CP: [f64; 3] = [1.9842, 1.4733e-3, -4.8008e-6];
const CARBOHYDRATE_CP: [f64; 3] = [1.5488, 1.9625e-3, -5.9399e-6];
const FIBER_CP: [f64; 3] = [1.8459, 1.8306e-3, -4.6509e-6];
const ASH_CP: [f64; 3] = [1.0926, 1.8896e-3, -3.6817e-6];
pub(crate) const PROTEIN_DENSITY: [f64; 3] = [1329.9, -0.5184, 0.0];
pub(crate) const FAT_DENSITY: [f64; 3] = [925.59, -0.41757, 0.0];
pub(crate) const CARBOHYDRATE_DENSITY: [f64; 3] = [1599.1, -0.31046, 0.0];
pub(crate) const FIBER_DENSITY: [f64; 3] = [1311.5, -0.36589, 0.0];
pub(crate) const ASH_DENSITY: [f64; 3] = [2423.8, -0.28063, 0.0];
const WATER_DENSITY: [f64; 3] = [997.18, 3.1439e-3, -3.7574e-3];
const ICE_DENSITY: [f64; 3] = [916.89, -0.13071, 0.0];

pub(crate) fn polynomial(coefficients: [f64; 3], t: f64) -> f64 {
    coefficients[0] + coefficients[1] * t + coefficients[2] * t * t
}

fn integrate_polynomial(coefficients: [f64; 3], t: f64) -> f64 {
    coefficients[0] * t + coefficients[1] * t * t / 2.0 + coefficients[2] * t * t * t / 3.0
}

/// Choi-Okos density of liquid water, kg/m^3 (used also for supercooled water down to -40 degC).
pub fn water_density_kg_per_m3(temp_c: f64) -> f64 {
    polynomial(WATER_DENSITY, temp_c.clamp(-40.0, 150.0))
}

/// Choi-Okos density of ice, kg/m^3.
pub fn ice_density_kg_per_m3(temp_c: f64) -> f64 {
    polynomial(ICE_DENSITY, temp_c.min(0.0))
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    const LEAN_BEEF: Composition =
        Composition { water: 0.74, protein: 0.22, fat: 0.02, carbohydrate: 0.01, fiber: 0.0, ash: 0.01 };

    #[test]
    fn lean_beef_specific_heat_at_20_c() {
        // shared/sources.md 7 [CALC]: lean beef (74/22/2/1/1) at 20 degC, Choi-Okos with the 4.1762
        // water constant: 3.6051 kJ/(kg K).
        assert_relative_eq!(LEAN_BEEF.specific_heat_j_per_kg_k(20.0), 3605.1, max_relative = 2e-4);
    }

    #[test]
    fn component_check_values_at_20_c() {
        // shared/sources.md 7 [CALC] at 20 degC: protein 2.0319, fat 2.0117, carbohydrate 1.5857,
        // fiber 1.8807, ash 1.1289, water 4.1766 kJ/(kg K).
        for (coefficients, expected) in [
            (PROTEIN_CP, 2.0319),
            (FAT_CP, 2.0117),
            (CARBOHYDRATE_CP, 1.5857),
            (FIBER_CP, 1.8807),
            (ASH_CP, 1.1289),
            (WATER_CP, 4.1766),
        ] {
            assert_relative_eq!(polynomial(coefficients, 20.0), expected, max_relative = 1e-4);
        }
    }

    #[test]
    fn sensible_heat_is_the_integral_of_specific_heat() {
        let exact = LEAN_BEEF.sensible_heat_j_per_kg(5.0, 65.0);
        let steps = 6000;
        let width = 60.0 / steps as f64;
        let midpoint: f64 =
            (0..steps).map(|i| LEAN_BEEF.specific_heat_j_per_kg_k(5.0 + (i as f64 + 0.5) * width) * width).sum();
        assert_relative_eq!(exact, midpoint, max_relative = 1e-8);
    }

    #[test]
    fn moisture_change_keeps_solids_in_proportion() {
        let dried = LEAN_BEEF.at_moisture(0.48);
        assert_relative_eq!(dried.sum(), 1.0, max_relative = 1e-12);
        assert_relative_eq!(dried.protein / dried.fat, 11.0, max_relative = 1e-12);
    }

    #[test]
    fn lean_beef_density_is_near_1070() {
        // Choi-Okos mixture, air-free: about 1070 kg/m^3 for lean beef [CALC]; ASHRAE tables list
        // 1050-1090 for lean meats (from memory).
        let rho = LEAN_BEEF.density_kg_per_m3(5.0);
        assert!((1050.0..1090.0).contains(&rho), "{rho}");
    }

    #[test]
    fn bad_fractions_are_all_named() {
        let bad = Composition { water: 1.2, protein: -0.1, ..LEAN_BEEF };
        let problems = bad.problems("thermal.composition");
        assert!(problems.iter().any(|p| p.field == "thermal.composition.water"));
        assert!(problems.iter().any(|p| p.field == "thermal.composition.protein"));
        assert!(problems.iter().any(|p| p.field.contains("sum")));
    }
}
