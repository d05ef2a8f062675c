//! The product as the plan uses it: a library or user-defined material with the scenario's salt
//! and default moisture, giving permittivity and enthalpy at any state.
//!
//! One explicit knob, [`Product::loss_factor_multiplier`], scales every loss factor the plan looks
//! up (eps'' -> m eps'', eps' unchanged). It is 1 for a plan from a scenario; the sensitivity
//! study (plan::sensitivity) sets it to 0.8 and 1.2 to ask what an error in the measured loss
//! factor would do. It lives here, on the value the plan is computed from, rather than in any
//! global, so two plans computed at once can never see each other's setting.

use crate::error::InputError;
use crate::materials::{self, Material, MaterialState, PermittivityCurve, PermittivityLookup};
use crate::physics::permittivity::ComplexPermittivity;
use crate::scenario::Scenario;
use crate::sizing::energy_balance::ProductThermal;

/// A material resolved from the scenario.
#[derive(Debug, Clone)]
pub struct Product {
    /// The material.
    pub material: Material,
    /// Salt, % by mass, if the scenario or the material gives it.
    pub salt_pct: Option<f64>,
    /// Factor applied to every loss factor eps'' looked up through [`Product::permittivity`]
    /// (finite, 0 or more; 1 = the material's own data). Enthalpies are not affected.
    pub loss_factor_multiplier: f64,
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
        Ok(Product { material, salt_pct: scenario.salt_pct, loss_factor_multiplier: 1.0 })
    }

    /// Moisture to use when the scenario gives none: the material's own, or 0 for a dry material.
    pub fn default_moisture_wb(&self) -> f64 {
        self.material.nominal_moisture_wb().unwrap_or(0.0)
    }

    /// The state at a temperature and moisture.
    pub fn state(&self, temp_c: f64, moisture_wb: f64) -> MaterialState {
        MaterialState { temp_c, moisture_wb: Some(moisture_wb), salt_pct: self.salt_pct }
    }

    /// Permittivity at a state and frequency, with eps'' scaled by
    /// [`Product::loss_factor_multiplier`] (the lookup's model text says so when it is not 1).
    pub fn permittivity(
        &self,
        frequency_hz: f64,
        temp_c: f64,
        moisture_wb: f64,
    ) -> Result<PermittivityLookup, InputError> {
        let multiplier = self.checked_multiplier()?;
        let mut lookup = materials::permittivity(&self.material, frequency_hz, &self.state(temp_c, moisture_wb))?;
        // An exact 1 is the plain plan: leave the lookup untouched, bit for bit.
        if multiplier != 1.0 {
            lookup.eps.eps_imag *= multiplier;
            lookup.model = format!("{} (eps'' x {multiplier})", lookup.model);
        }
        Ok(lookup)
    }

    /// The permittivity of [`Product::permittivity`] alone, without the lookup's texts (for the
    /// zone march, which reads only the number at hundreds of states).
    pub fn permittivity_value(
        &self,
        frequency_hz: f64,
        temp_c: f64,
        moisture_wb: f64,
    ) -> Result<ComplexPermittivity, InputError> {
        let multiplier = self.checked_multiplier()?;
        let mut eps = materials::permittivity_value(&self.material, frequency_hz, &self.state(temp_c, moisture_wb))?;
        if multiplier != 1.0 {
            eps.eps_imag *= multiplier;
        }
        Ok(eps)
    }

    /// [`Product::permittivity_value`] at one moisture for many temperatures (see
    /// [`PermittivityCurve`]): the same values and errors, bit for bit.
    pub fn permittivity_curve(&self, moisture_wb: f64) -> ProductPermittivity<'_> {
        ProductPermittivity {
            product: self,
            moisture: moisture_wb,
            curve: self.material.permittivity_curve(Some(moisture_wb), self.salt_pct),
        }
    }

    fn checked_multiplier(&self) -> Result<f64, InputError> {
        let multiplier = self.loss_factor_multiplier;
        if !(multiplier.is_finite() && multiplier >= 0.0) {
            return Err(InputError::new("loss_factor_multiplier", multiplier, "a finite factor of 0 or more"));
        }
        Ok(multiplier)
    }
}

/// The product's permittivity at one moisture ([`Product::permittivity_curve`]).
#[derive(Debug, Clone)]
pub struct ProductPermittivity<'a> {
    product: &'a Product,
    moisture: f64,
    curve: PermittivityCurve<'a>,
}

impl ProductPermittivity<'_> {
    /// The moisture the curve is at, wet basis.
    pub fn moisture_wb(&self) -> f64 {
        self.moisture
    }

    /// [`Product::permittivity_value`] at `temp_c` and the curve's moisture.
    pub fn value(&self, frequency_hz: f64, temp_c: f64) -> Result<ComplexPermittivity, InputError> {
        let multiplier = self.product.checked_multiplier()?;
        let mut eps = self.curve.value(frequency_hz, temp_c)?;
        if multiplier != 1.0 {
            eps.eps_imag *= multiplier;
        }
        Ok(eps)
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

/// A user-defined product with c_p = 2000 J/(kg K) whatever the moisture and constant eps = 10 - j2,
/// so every stage of a path is linear and can be worked by hand (shared by the tests).
#[cfg(test)]
pub(crate) fn by_hand_constant_product() -> Product {
    let spec: crate::materials::custom::CustomMaterialSpec = serde_json::from_str(
        r#"{"name": "by hand", "density_kg_per_m3": 800, "specific_heat_j_per_kg_k": 2000,
            "dielectric": {"model": "constant", "eps_real": 10, "eps_imag": 2}}"#,
    )
    .expect("the test material parses");
    Product {
        material: crate::materials::custom::custom_material(&spec).expect("the test material is valid"),
        salt_pct: None,
        loss_factor_multiplier: 1.0,
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::materials::library;

    fn beef(multiplier: f64) -> Product {
        let material = library().get("beef-lean").cloned().expect("beef-lean is in the library");
        Product { material, salt_pct: None, loss_factor_multiplier: multiplier }
    }

    #[test]
    fn the_multiplier_scales_only_the_loss_factor() {
        // Exact identity: eps'' x m, eps' untouched.
        let plain = beef(1.0).permittivity(915e6, 10.0, 0.74).unwrap();
        let raised = beef(1.2).permittivity(915e6, 10.0, 0.74).unwrap();
        assert_eq!(raised.eps.eps_real, plain.eps.eps_real);
        assert_eq!(raised.eps.eps_imag, plain.eps.eps_imag * 1.2);
        assert!(raised.model.contains("x 1.2"));
        assert_eq!(
            plain.model,
            materials::permittivity(&beef(1.0).material, 915e6, &beef(1.0).state(10.0, 0.74)).unwrap().model
        );
    }

    #[test]
    fn the_value_alone_is_the_lookups_value() {
        for multiplier in [0.0, 0.8, 1.0, 1.2] {
            for temp_c in [-18.0, -4.0, 10.0] {
                let product = beef(multiplier);
                let lookup = product.permittivity(915e6, temp_c, 0.74).unwrap();
                assert_eq!(product.permittivity_value(915e6, temp_c, 0.74).unwrap(), lookup.eps);
            }
        }
        assert_eq!(beef(-1.0).permittivity_value(915e6, 10.0, 0.74).unwrap_err().field, "loss_factor_multiplier");
    }

    #[test]
    fn the_curve_gives_the_value_alone_bit_for_bit() {
        let bits = |eps: ComplexPermittivity| (eps.eps_real.to_bits(), eps.eps_imag.to_bits());
        for multiplier in [0.0, 0.8, 1.0, 1.2] {
            let product = beef(multiplier);
            for moisture in [0.5, 0.74] {
                let curve = product.permittivity_curve(moisture);
                for temp_c in [-40.0, -18.0, -4.0, -1.5, -0.25, 0.0, 10.0, 72.0] {
                    let value = product.permittivity_value(915e6, temp_c, moisture).unwrap();
                    assert_eq!(
                        bits(curve.value(915e6, temp_c).unwrap()),
                        bits(value),
                        "{multiplier} {moisture} {temp_c}"
                    );
                }
            }
        }
        // The same refusals: the multiplier first, then the state.
        assert_eq!(beef(-1.0).permittivity_curve(0.74).value(915e6, 10.0).unwrap_err().field, "loss_factor_multiplier");
        assert_eq!(
            beef(1.0).permittivity_curve(0.74).value(915e6, 400.0).unwrap_err(),
            beef(1.0).permittivity_value(915e6, 400.0, 0.74).unwrap_err()
        );
        assert_eq!(
            beef(1.0).permittivity_curve(2.0).value(915e6, 10.0).unwrap_err(),
            beef(1.0).permittivity_value(915e6, 10.0, 2.0).unwrap_err()
        );
    }

    #[test]
    fn a_bad_multiplier_is_refused() {
        for bad in [-0.1, f64::NAN, f64::INFINITY] {
            assert_eq!(beef(bad).permittivity(915e6, 10.0, 0.74).unwrap_err().field, "loss_factor_multiplier");
        }
        assert_eq!(beef(0.0).permittivity(915e6, 10.0, 0.74).unwrap().eps.eps_imag, 0.0);
    }
}
