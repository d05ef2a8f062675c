//! Energy balance of a continuous line, per kg and per hour.
//!
//! Dry-solids balance (wet basis x): m_s = m_in (1 - x_in), m_out = m_s / (1 - x_out),
//! m_evap = m_in - m_out = m_in (x_in - x_out) / (1 - x_out) (shared/sources.md 10.2 step 1).
//! Heat is a difference of specific enthalpies taken along a stated path:
//!   1. the wet product from T_in to the evaporation temperature T_e (or to T_out if nothing dries),
//!      including the latent heat of any ice melted (the product's enthalpy model carries it);
//!   2. the water removed, evaporated at T_e: m_evap h_fg(T_e);
//!   3. the dried product from T_e to T_out, counted only when T_out > T_e (a product that leaves
//!      cooler than T_e has lost that heat to the air; the generators still had to supply it).
//!
//! Losses are explicit allowances: surface and belt losses as percentages of the process heat,
//! vapour losses (exhaust air, vapour superheat) as a percentage of the evaporation heat.

use crate::error::{require_in, InputError};
use serde::{Deserialize, Serialize};

/// Thermal behaviour of a product, as the balance needs it.
pub trait ProductThermal {
    /// Specific enthalpy of the wet product at `temp_c` and wet-basis moisture, J/kg, from any
    /// fixed reference, including the latent heat of its frozen water.
    fn enthalpy_j_per_kg(&self, temp_c: f64, moisture_wb: f64) -> Result<f64, InputError>;
    /// Mass of ice per kg of product at `temp_c` and wet-basis moisture.
    fn ice_mass_fraction(&self, temp_c: f64, moisture_wb: f64) -> Result<f64, InputError>;
}

/// Loss allowances, each in percent.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(default, deny_unknown_fields)]
pub struct LossAllowances {
    /// Convection and radiation from the product surface, % of the process heat.
    pub surface_pct: f64,
    /// Heat carried away by the belt and carriers, % of the process heat.
    pub belt_pct: f64,
    /// Exhaust air and vapour superheat, % of the evaporation heat.
    pub vapour_pct: f64,
}

impl Default for LossAllowances {
    /// Starting allowances: 5 % surface, 2 % belt, 10 % vapour (common practice).
    fn default() -> Self {
        Self { surface_pct: 5.0, belt_pct: 2.0, vapour_pct: 10.0 }
    }
}

impl LossAllowances {
    /// Check each allowance (0 to 200 %).
    pub fn validate(&self) -> Vec<InputError> {
        [
            ("losses.surface_pct", self.surface_pct),
            ("losses.belt_pct", self.belt_pct),
            ("losses.vapour_pct", self.vapour_pct),
        ]
        .into_iter()
        .filter_map(|(field, value)| require_in(field, value, 0.0, 200.0).err())
        .collect()
    }
}

/// What the balance is asked.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct BalanceInput {
    /// Wet product in, kg/h.
    pub throughput_kg_per_h: f64,
    /// Product temperature at the inlet, degC.
    pub inlet_temp_c: f64,
    /// Product temperature at the outlet, degC.
    pub outlet_temp_c: f64,
    /// Wet-basis moisture at the inlet, kg water / kg product.
    pub inlet_moisture_wb: f64,
    /// Wet-basis moisture at the outlet.
    pub outlet_moisture_wb: f64,
    /// Temperature at which the removed water evaporates, degC.
    pub evaporation_temp_c: f64,
    /// Latent heat of vaporization at that temperature, J/kg.
    pub latent_heat_vaporization_j_per_kg: f64,
    /// Loss allowances.
    pub losses: LossAllowances,
}

/// The balance, per hour of operation.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct EnergyBalance {
    /// Wet product out, kg/h.
    pub product_out_kg_per_h: f64,
    /// Water evaporated, kg/h.
    pub water_removed_kg_per_h: f64,
    /// Moisture at the inlet on dry basis, kg water / kg dry solids.
    pub inlet_moisture_db: f64,
    /// Moisture at the outlet on dry basis.
    pub outlet_moisture_db: f64,
    /// Ice melted, kg/h.
    pub ice_melted_kg_per_h: f64,
    /// Sensible heat of solids and water (stages 1 and 3 less the latent heat of fusion), kW.
    pub sensible_kw: f64,
    /// Latent heat of the ice melted, kW.
    pub fusion_kw: f64,
    /// Latent heat of the water evaporated, kW.
    pub evaporation_kw: f64,
    /// Process heat: sensible + fusion + evaporation, kW.
    pub process_kw: f64,
    /// Surface-loss allowance, kW.
    pub surface_loss_kw: f64,
    /// Belt-loss allowance, kW.
    pub belt_loss_kw: f64,
    /// Vapour-loss allowance, kW.
    pub vapour_loss_kw: f64,
    /// Power the product must absorb: process heat plus allowances, kW.
    pub absorbed_kw: f64,
    /// Absorbed energy per kg of product in, J/kg.
    pub absorbed_j_per_kg: f64,
}

/// Latent heat of fusion used to split out the melting share, J/kg: IAPWS-95 liquid minus
/// IAPWS-06 ice at 273.15 K and 0.101325 MPa (shared/sources.md 7).
pub const LATENT_HEAT_FUSION_J_PER_KG: f64 = 333_420.0;

const SECONDS_PER_HOUR: f64 = 3600.0;

/// Balance a line. The caller has validated the input (positive throughput, moisture in 0..0.95,
/// outlet moisture not above inlet); the product's own checks can still refuse a state.
pub fn balance(product: &dyn ProductThermal, input: &BalanceInput) -> Result<EnergyBalance, InputError> {
    let m_in = input.throughput_kg_per_h;
    let (x_in, x_out) = (input.inlet_moisture_wb, input.outlet_moisture_wb);
    let drying = x_out < x_in;
    let dry_solids_kg_per_h = m_in * (1.0 - x_in);
    let product_out_kg_per_h = if drying { dry_solids_kg_per_h / (1.0 - x_out) } else { m_in };
    let water_removed_kg_per_h = m_in - product_out_kg_per_h;

    let to_kw = |kg_per_h: f64, j_per_kg: f64| kg_per_h * j_per_kg / SECONDS_PER_HOUR / 1000.0;
    let enthalpy = |temp_c: f64, moisture: f64| product.enthalpy_j_per_kg(temp_c, moisture);

    let (stage_one_kw, evaporation_kw, stage_three_kw) = if drying {
        let t_e = input.evaporation_temp_c;
        let one = to_kw(m_in, enthalpy(t_e, x_in)? - enthalpy(input.inlet_temp_c, x_in)?);
        let evaporation = to_kw(water_removed_kg_per_h, input.latent_heat_vaporization_j_per_kg);
        let three = to_kw(product_out_kg_per_h, enthalpy(input.outlet_temp_c, x_out)? - enthalpy(t_e, x_out)?).max(0.0);
        (one, evaporation, three)
    } else {
        (to_kw(m_in, enthalpy(input.outlet_temp_c, x_in)? - enthalpy(input.inlet_temp_c, x_in)?), 0.0, 0.0)
    };

    let ice_in = product.ice_mass_fraction(input.inlet_temp_c, x_in)? * m_in;
    let ice_out = product.ice_mass_fraction(input.outlet_temp_c, x_out)? * product_out_kg_per_h;
    let ice_melted_kg_per_h = (ice_in - ice_out).max(0.0);
    let fusion_kw = to_kw(ice_melted_kg_per_h, LATENT_HEAT_FUSION_J_PER_KG);
    let sensible_kw = stage_one_kw + stage_three_kw - fusion_kw;
    let process_kw = stage_one_kw + evaporation_kw + stage_three_kw;

    let percent = |p: f64| p / 100.0;
    let surface_loss_kw = process_kw.max(0.0) * percent(input.losses.surface_pct);
    let belt_loss_kw = process_kw.max(0.0) * percent(input.losses.belt_pct);
    let vapour_loss_kw = evaporation_kw * percent(input.losses.vapour_pct);
    let absorbed_kw = process_kw + surface_loss_kw + belt_loss_kw + vapour_loss_kw;

    Ok(EnergyBalance {
        product_out_kg_per_h,
        water_removed_kg_per_h,
        inlet_moisture_db: x_in / (1.0 - x_in),
        outlet_moisture_db: x_out / (1.0 - x_out),
        ice_melted_kg_per_h,
        sensible_kw,
        fusion_kw,
        evaporation_kw,
        process_kw,
        surface_loss_kw,
        belt_loss_kw,
        vapour_loss_kw,
        absorbed_kw,
        absorbed_j_per_kg: absorbed_kw * 1000.0 * SECONDS_PER_HOUR / m_in,
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    /// Liquid water with enthalpy from IAPWS-95 saturated-liquid values (iapws 1.5.5 as tabulated in
    /// shared/sources.md 7: cp 4.1848 kJ/kg K at 20 degC), linear between 20 and 100 degC.
    struct WaterOnly;
    impl ProductThermal for WaterOnly {
        fn enthalpy_j_per_kg(&self, temp_c: f64, _moisture_wb: f64) -> Result<f64, InputError> {
            // h(20 degC) = 83.91 kJ/kg and h(100 degC) = 419.10 kJ/kg (IAPWS-95 saturated liquid, from memory).
            Ok(83_910.0 + (temp_c - 20.0) * (419_100.0 - 83_910.0) / 80.0)
        }
        fn ice_mass_fraction(&self, _temp_c: f64, _moisture_wb: f64) -> Result<f64, InputError> {
            Ok(0.0)
        }
    }

    fn no_losses() -> LossAllowances {
        LossAllowances { surface_pct: 0.0, belt_pct: 0.0, vapour_pct: 0.0 }
    }

    #[test]
    fn water_removed_on_wet_basis() {
        // m_evap = m_in (x_in - x_out)/(1 - x_out): 1000 kg/h from 30 % to 12 % -> 204.545 kg/h (by hand).
        let input = BalanceInput {
            throughput_kg_per_h: 1000.0,
            inlet_temp_c: 20.0,
            outlet_temp_c: 20.0,
            inlet_moisture_wb: 0.30,
            outlet_moisture_wb: 0.12,
            evaporation_temp_c: 100.0,
            latent_heat_vaporization_j_per_kg: 2_256_470.0,
            losses: no_losses(),
        };
        let b = balance(&WaterOnly, &input).unwrap();
        assert_relative_eq!(b.water_removed_kg_per_h, 204.545_454, max_relative = 1e-6);
        assert_relative_eq!(b.inlet_moisture_db, 0.428_571, max_relative = 1e-5);
        assert_relative_eq!(b.outlet_moisture_db, 0.136_364, max_relative = 1e-5);
        assert_relative_eq!(b.product_out_kg_per_h, 795.454_545, max_relative = 1e-6);
    }

    #[test]
    fn boiling_off_water_from_20_degc() {
        // sources.md 7 [CALC, iapws]: h_liq(20 degC) -> h_vap(100 degC) = 2591.65 kJ/kg = 0.71990 kWh/kg.
        // A product that is almost all water, dried to almost nothing at 1 atm, needs that per kg evaporated.
        let input = BalanceInput {
            throughput_kg_per_h: 100.0,
            inlet_temp_c: 20.0,
            outlet_temp_c: 100.0,
            inlet_moisture_wb: 0.9,
            outlet_moisture_wb: 0.0,
            evaporation_temp_c: 100.0,
            latent_heat_vaporization_j_per_kg: 2_256_470.0,
            losses: no_losses(),
        };
        let b = balance(&WaterOnly, &input).unwrap();
        assert_relative_eq!(b.water_removed_kg_per_h, 90.0, max_relative = 1e-12);
        // Heating the whole 100 kg/h (here modelled as water) plus evaporating 90 kg/h.
        let expected_kw = (100.0 * (419_100.0 - 83_910.0) + 90.0 * 2_256_470.0) / 3.6e6;
        assert_relative_eq!(b.absorbed_kw, expected_kw, max_relative = 1e-9);
        let per_kg_water =
            (100.0 / 90.0 * (419.10 - 83.91) + 2256.47 - (100.0 / 90.0 - 1.0) * (419.10 - 83.91)) / 3600.0;
        assert_relative_eq!(per_kg_water, 0.71990, max_relative = 2e-4);
    }

    #[test]
    fn sensible_heating_and_allowances() {
        let input = BalanceInput {
            throughput_kg_per_h: 3600.0,
            inlet_temp_c: 20.0,
            outlet_temp_c: 100.0,
            inlet_moisture_wb: 0.5,
            outlet_moisture_wb: 0.5,
            evaporation_temp_c: 100.0,
            latent_heat_vaporization_j_per_kg: 2_256_470.0,
            losses: LossAllowances { surface_pct: 10.0, belt_pct: 5.0, vapour_pct: 50.0 },
        };
        let b = balance(&WaterOnly, &input).unwrap();
        // 3600 kg/h x 335.19 kJ/kg = 335.19 kW; +10 % +5 %; no evaporation so no vapour loss.
        assert_relative_eq!(b.process_kw, 335.19, max_relative = 1e-9);
        assert_relative_eq!(b.absorbed_kw, 335.19 * 1.15, max_relative = 1e-9);
        assert_eq!(b.water_removed_kg_per_h, 0.0);
        assert_eq!(b.vapour_loss_kw, 0.0);
        assert_relative_eq!(b.sensible_kw, b.process_kw, max_relative = 1e-12);
    }
}
