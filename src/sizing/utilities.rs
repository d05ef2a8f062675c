//! Utilities and running cost: kVA at a power factor, cooling-water flow, energy per kg and cost.
//!
//!   S = P / PF;   cooling flow = Q / (rho c_p dT)
//! with water at 25 degC: rho = 997.05 kg/m^3 and c_p = 4.1819 kJ/kg K (IAPWS-95, as tabulated
//! in shared/sources.md 7). Cost is mains energy times the tariff; the tariff's currency is the user's.

use crate::error::{require_in, InputError};
use serde::{Deserialize, Serialize};

/// Density of cooling water, kg/m^3 (IAPWS-95 at 25 degC, 0.1 MPa).
const COOLING_WATER_DENSITY_KG_PER_M3: f64 = 997.05;
/// Specific heat of cooling water, kJ/kg K (IAPWS-95 at 25 degC, 0.1 MPa).
const COOLING_WATER_CP_KJ_PER_KG_K: f64 = 4.1819;

/// Site figures from the scenario.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(default, deny_unknown_fields)]
pub struct SiteInput {
    /// Power factor of the line at the supply, 0.5 to 1.
    pub power_factor: f64,
    /// Allowed temperature rise of the cooling water, K.
    pub cooling_water_rise_k: f64,
    /// Energy tariff, currency units per kWh.
    pub tariff_per_kwh: f64,
    /// Currency of the tariff, free text (`EUR`).
    pub currency: String,
    /// Operating hours per year.
    pub operating_hours_per_year: f64,
    /// Conveyor, fans, pumps and controls, kW from the mains.
    pub auxiliary_kw: f64,
}

impl Default for SiteInput {
    /// Starting figures for a quote: PF 0.95, 10 K cooling-water rise, 0.15 per kWh, 4000 h/year,
    /// no auxiliaries (common practice; the user replaces them with the site's own).
    fn default() -> Self {
        Self {
            power_factor: 0.95,
            cooling_water_rise_k: 10.0,
            tariff_per_kwh: 0.15,
            currency: "EUR".to_string(),
            operating_hours_per_year: 4000.0,
            auxiliary_kw: 0.0,
        }
    }
}

impl SiteInput {
    /// Check every figure; names as in the scenario (`site.power_factor`).
    pub fn validate(&self) -> Vec<InputError> {
        let mut problems: Vec<InputError> = [
            require_in("site.power_factor", self.power_factor, 0.5, 1.0).err(),
            require_in("site.cooling_water_rise_k", self.cooling_water_rise_k, 1.0, 60.0).err(),
            require_in("site.tariff_per_kwh", self.tariff_per_kwh, 0.0, 100.0).err(),
            require_in("site.operating_hours_per_year", self.operating_hours_per_year, 0.0, 8784.0).err(),
            require_in("site.auxiliary_kw", self.auxiliary_kw, 0.0, 100_000.0).err(),
        ]
        .into_iter()
        .flatten()
        .collect();
        if self.currency.chars().count() > 12 {
            problems.push(InputError::new(
                "site.currency",
                crate::error::quoted(&self.currency),
                "at most 12 characters",
            ));
        }
        problems
    }
}

/// Cooling-water flow that carries `heat_kw` away with a temperature rise `rise_k`, L/min.
pub fn cooling_water_l_per_min(heat_kw: f64, rise_k: f64) -> f64 {
    let mass_flow_kg_per_s = heat_kw / (COOLING_WATER_CP_KJ_PER_KG_K * rise_k);
    mass_flow_kg_per_s / COOLING_WATER_DENSITY_KG_PER_M3 * 1000.0 * 60.0
}

/// Running figures of the line.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Utilities {
    /// Mains power including auxiliaries, kW.
    pub total_mains_kw: f64,
    /// Apparent power at the stated power factor, kVA.
    pub mains_kva: f64,
    /// Heat carried by the cooling water (water-cooled generators and the water loads), kW.
    pub cooling_water_heat_kw: f64,
    /// Cooling-water flow for the stated rise, L/min.
    pub cooling_water_l_per_min: f64,
    /// Mains energy per kg of product in, kWh/kg.
    pub mains_energy_kwh_per_kg: f64,
    /// Absorbed energy per kg of product in, kWh/kg.
    pub absorbed_energy_kwh_per_kg: f64,
    /// Mains energy per kg of water removed, kWh/kg; `None` when nothing is dried.
    pub mains_energy_kwh_per_kg_water: Option<f64>,
    /// Energy cost per hour of operation.
    pub energy_cost_per_hour: f64,
    /// Energy cost per tonne of product in.
    pub energy_cost_per_tonne: f64,
    /// Mains energy per year, MWh.
    pub annual_energy_mwh: f64,
    /// Energy cost per year.
    pub annual_energy_cost: f64,
    /// Currency of the cost figures.
    pub currency: String,
}

/// Work out the utilities for a line drawing `mains_kw` (generators only) that sheds
/// `cooling_water_heat_kw` into water.
pub fn utilities(
    site: &SiteInput,
    mains_kw: f64,
    absorbed_kw: f64,
    cooling_water_heat_kw: f64,
    throughput_kg_per_h: f64,
    water_removed_kg_per_h: f64,
) -> Utilities {
    let total_mains_kw = mains_kw + site.auxiliary_kw;
    let energy_cost_per_hour = total_mains_kw * site.tariff_per_kwh;
    Utilities {
        total_mains_kw,
        mains_kva: total_mains_kw / site.power_factor,
        cooling_water_heat_kw,
        cooling_water_l_per_min: cooling_water_l_per_min(cooling_water_heat_kw, site.cooling_water_rise_k),
        mains_energy_kwh_per_kg: total_mains_kw / throughput_kg_per_h,
        absorbed_energy_kwh_per_kg: absorbed_kw / throughput_kg_per_h,
        mains_energy_kwh_per_kg_water: (water_removed_kg_per_h > 0.0).then(|| total_mains_kw / water_removed_kg_per_h),
        energy_cost_per_hour,
        energy_cost_per_tonne: energy_cost_per_hour / (throughput_kg_per_h / 1000.0),
        annual_energy_mwh: total_mains_kw * site.operating_hours_per_year / 1000.0,
        annual_energy_cost: energy_cost_per_hour * site.operating_hours_per_year,
        currency: site.currency.clone(),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn cooling_water_for_tube_dissipation() {
        // shared/sources.md 6.2 [CALC], dT = 10 K: 10.23 kW -> 14.7 L/min; 13.64 kW -> 19.6 L/min;
        // 2.57 kW -> 3.7 L/min.
        assert_relative_eq!(cooling_water_l_per_min(10.23, 10.0), 14.7, max_relative = 3e-3);
        assert_relative_eq!(cooling_water_l_per_min(13.64, 10.0), 19.6, max_relative = 3e-3);
        assert_relative_eq!(cooling_water_l_per_min(2.57, 10.0), 3.7, max_relative = 5e-3);
    }

    #[test]
    fn cost_and_kva_by_hand() {
        let site = SiteInput {
            power_factor: 0.9,
            cooling_water_rise_k: 10.0,
            tariff_per_kwh: 0.2,
            currency: "EUR".into(),
            operating_hours_per_year: 5000.0,
            auxiliary_kw: 10.0,
        };
        let u = utilities(&site, 170.0, 100.0, 20.0, 2000.0, 0.0);
        assert_relative_eq!(u.mains_kva, 200.0, max_relative = 1e-12);
        assert_relative_eq!(u.energy_cost_per_hour, 36.0, max_relative = 1e-12);
        assert_relative_eq!(u.energy_cost_per_tonne, 18.0, max_relative = 1e-12);
        assert_relative_eq!(u.mains_energy_kwh_per_kg, 0.09, max_relative = 1e-12);
        assert_eq!(u.mains_energy_kwh_per_kg_water, None);
        assert_relative_eq!(u.annual_energy_mwh, 900.0, max_relative = 1e-12);
    }
}
