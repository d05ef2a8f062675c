//! A material's specific enthalpy along temperature at one moisture, with the moisture's part
//! (a food's composition and freezing point there) worked out once.
//!
//! The zone march inverts H(T) by a root search, some ten evaluations per zone state, and for a
//! food the composition and freezing point at the moisture cost more than H itself.
//! [`Material::enthalpy_j_per_kg`] is a curve made and read once, so the two cannot disagree.

use super::composition::Composition;
use super::library::SpecificHeatPoint;
use super::{
    broken, checked_moisture, checked_temp, freezing, models, table_enthalpy, thermal, Material, ThermalModel,
};
use crate::error::InputError;

/// H(T) of one material at one moisture (see [`Material::enthalpy_curve`]).
#[derive(Debug, Clone)]
pub struct EnthalpyCurve<'a> {
    model: Model<'a>,
}

/// The thermal model with everything that depends only on the moisture evaluated.
#[derive(Debug, Clone)]
enum Model<'a> {
    Water,
    Ice,
    Food { food: Composition, freezing_point_c: Option<f64> },
    Constant { specific_heat_j_per_kg_k: f64 },
    Table { points: &'a [SpecificHeatPoint] },
    DryPlusWater { dry_specific_heat_j_per_kg_k: f64, moisture_wb: f64 },
}

impl Material {
    /// The enthalpy of [`Material::enthalpy_j_per_kg`] at `moisture_wb` (nominal if `None`), as a
    /// function of temperature; the moisture is checked here, the temperature at each reading.
    pub fn enthalpy_curve(&self, moisture_wb: Option<f64>) -> Result<EnthalpyCurve<'_>, InputError> {
        let moisture_wb = checked_moisture(moisture_wb)?;
        let model = match &self.thermal {
            ThermalModel::Water { .. } => Model::Water,
            ThermalModel::Ice { .. } => Model::Ice,
            ThermalModel::Composition { .. } => {
                let (food, freezing_point_c) = models::food_state(self, moisture_wb).ok_or_else(|| broken(self))?;
                Model::Food { food, freezing_point_c }
            }
            ThermalModel::Constant { specific_heat_j_per_kg_k, .. } => {
                Model::Constant { specific_heat_j_per_kg_k: *specific_heat_j_per_kg_k }
            }
            ThermalModel::Table { points, .. } => Model::Table { points },
            ThermalModel::DryPlusWater { dry_specific_heat_j_per_kg_k, moisture_wb: nominal, .. } => {
                Model::DryPlusWater {
                    dry_specific_heat_j_per_kg_k: *dry_specific_heat_j_per_kg_k,
                    moisture_wb: moisture_wb.unwrap_or(*nominal),
                }
            }
        };
        Ok(EnthalpyCurve { model })
    }
}

impl EnthalpyCurve<'_> {
    /// Specific enthalpy at `temp_c`, J/kg (the reference as [`Material::enthalpy_reference`]).
    pub fn enthalpy_j_per_kg(&self, temp_c: f64) -> Result<f64, InputError> {
        let temp_c = checked_temp(temp_c)?;
        Ok(match &self.model {
            Model::Water => thermal::liquid_enthalpy_from_zero(temp_c),
            Model::Ice => {
                if temp_c < 0.0 {
                    thermal::ice_enthalpy_unchecked(temp_c)
                } else {
                    thermal::liquid_enthalpy_from_zero(temp_c)
                }
            }
            Model::Food { food, freezing_point_c: Some(tf) } => freezing::food_enthalpy_j_per_kg(food, *tf, temp_c),
            Model::Food { food, freezing_point_c: None } => food.sensible_heat_j_per_kg(0.0, temp_c),
            Model::Constant { specific_heat_j_per_kg_k } => specific_heat_j_per_kg_k * temp_c,
            Model::Table { points } => table_enthalpy(points, temp_c),
            Model::DryPlusWater { dry_specific_heat_j_per_kg_k, moisture_wb } => {
                moisture_wb * thermal::liquid_enthalpy_from_zero(temp_c)
                    + (1.0 - moisture_wb) * dry_specific_heat_j_per_kg_k * temp_c
            }
        })
    }
}
