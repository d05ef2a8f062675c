//! The product as the plan uses it: a library or user-defined material with the scenario's salt
//! and default moisture, giving permittivity and enthalpy at any state.

use crate::error::InputError;
use crate::materials::{self, Material, MaterialState, PermittivityLookup};
use crate::scenario::Scenario;
use crate::sizing::energy_balance::ProductThermal;

/// A material resolved from the scenario.
#[derive(Debug, Clone)]
pub struct Product {
    /// The material.
    pub material: Material,
    /// Salt, % by mass, if the scenario or the material gives it.
    pub salt_pct: Option<f64>,
}

impl Product {
    /// Resolve the scenario's product: exactly one of `library` or `custom`.
    pub fn from_scenario(scenario: &Scenario) -> Result<Product, Vec<InputError>> {
        let material = match (&scenario.product.library, &scenario.product.custom) {
            (Some(name), None) => materials::library()
                .get(name)
                .cloned()
                .ok_or_else(|| vec![materials::library::unknown_material(name).within("product")])?,
            (None, Some(custom)) => materials::custom::custom_material(custom)
                .map_err(|errors| errors.into_iter().map(|e| e.within("product.custom")).collect::<Vec<_>>())?,
            (Some(_), Some(_)) => {
                return Err(vec![InputError::new(
                    "product",
                    "both library and custom",
                    "exactly one of library or custom",
                )])
            }
            (None, None) => return Err(vec![InputError::new("product", "empty", "exactly one of library or custom")]),
        };
        Ok(Product { material, salt_pct: scenario.salt_pct })
    }

    /// Moisture to use when the scenario gives none: the material's own, or 0 for a dry material.
    pub fn default_moisture_wb(&self) -> f64 {
        self.material.nominal_moisture_wb().unwrap_or(0.0)
    }

    /// The state at a temperature and moisture.
    pub fn state(&self, temp_c: f64, moisture_wb: f64) -> MaterialState {
        MaterialState { temp_c, moisture_wb: Some(moisture_wb), salt_pct: self.salt_pct }
    }

    /// Permittivity at a state and frequency.
    pub fn permittivity(
        &self,
        frequency_hz: f64,
        temp_c: f64,
        moisture_wb: f64,
    ) -> Result<PermittivityLookup, InputError> {
        materials::permittivity(&self.material, frequency_hz, &self.state(temp_c, moisture_wb))
    }
}

impl ProductThermal for Product {
    fn enthalpy_j_per_kg(&self, temp_c: f64, moisture_wb: f64) -> Result<f64, InputError> {
        self.material.enthalpy_j_per_kg(temp_c, Some(moisture_wb))
    }

    fn ice_mass_fraction(&self, temp_c: f64, moisture_wb: f64) -> Result<f64, InputError> {
        Ok(self.material.frozen_fraction_at(temp_c, Some(moisture_wb))? * moisture_wb)
    }
}
