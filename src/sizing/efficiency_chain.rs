//! The efficiency chain from the mains to the load, and where the lost power goes.
//!
//!   P_forward   = P_absorbed / eta_applicator      (coupling: forward power the load absorbs)
//!   P_generator = P_forward  / eta_transmission    (waveguide, circulator, tuner, or RF feeders)
//!   P_input     = P_generator / eta_generator      (anode or valve efficiency)
//!   P_mains     = P_input / eta_power_supply       (high-voltage or DC supply)
//! The method of shared/sources.md 10.2 steps 3 and 5, with the transmission stage made explicit.
//! Power the applicator does not couple into the load is taken to end in the circulator's water
//! load (reflected power) or the tunnel walls; this plan books all of it to the water loads, the
//! cautious choice for cooling-water sizing.

use crate::error::{require_in, InputError};
use serde::{Deserialize, Serialize};

/// The four efficiencies, each a fraction in (0, 1].
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct EfficiencyChain {
    /// Mains to generator input.
    pub power_supply: f64,
    /// Generator input to microwave or RF output.
    pub generator: f64,
    /// Generator output to forward power at the applicator.
    pub transmission: f64,
    /// Forward power to power absorbed by the load.
    pub applicator: f64,
}

/// Lowest efficiency accepted for any stage: below 5 % the figure is surely a typing slip.
const EFFICIENCY_MIN: f64 = 0.05;

impl EfficiencyChain {
    /// Check every stage; the field names are those of the scenario (`efficiency.applicator`).
    pub fn validate(&self) -> Vec<InputError> {
        [
            ("efficiency.power_supply", self.power_supply),
            ("efficiency.generator", self.generator),
            ("efficiency.transmission", self.transmission),
            ("efficiency.applicator", self.applicator),
        ]
        .into_iter()
        .filter_map(|(field, value)| require_in(field, value, EFFICIENCY_MIN, 1.0).err())
        .collect()
    }

    /// Mains to load, the product of all four.
    pub fn overall(&self) -> f64 {
        self.power_supply * self.generator * self.transmission * self.applicator
    }
}

/// Where the power that does not reach the load ends up, kW.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct LossDestinations {
    /// Power supply losses, to cabinet air.
    pub power_supply_to_cabinet_air_kw: f64,
    /// Generator losses (anode dissipation), to tube cooling water or air by the class's cooling.
    pub generator_to_tube_cooling_kw: f64,
    /// Waveguide, circulator and tuner losses, to the guide walls and cabinet air.
    pub transmission_to_waveguide_kw: f64,
    /// Power not coupled into the load, to the water loads (and tunnel walls).
    pub uncoupled_to_water_loads_kw: f64,
}

/// Power at each point of the chain, kW.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct PowerFlow {
    /// Into the product.
    pub absorbed_kw: f64,
    /// Forward power at the applicator.
    pub forward_kw: f64,
    /// Generator output (the sum over running units).
    pub generator_output_kw: f64,
    /// Electrical input to the generators.
    pub generator_input_kw: f64,
    /// From the mains (excluding auxiliaries).
    pub mains_kw: f64,
    /// Where the difference went.
    pub losses: LossDestinations,
}

/// Walk the chain back from the absorbed power.
pub fn power_flow(absorbed_kw: f64, chain: &EfficiencyChain) -> PowerFlow {
    let forward_kw = absorbed_kw / chain.applicator;
    let generator_output_kw = forward_kw / chain.transmission;
    let generator_input_kw = generator_output_kw / chain.generator;
    let mains_kw = generator_input_kw / chain.power_supply;
    PowerFlow {
        absorbed_kw,
        forward_kw,
        generator_output_kw,
        generator_input_kw,
        mains_kw,
        losses: LossDestinations {
            power_supply_to_cabinet_air_kw: mains_kw - generator_input_kw,
            generator_to_tube_cooling_kw: generator_input_kw - generator_output_kw,
            transmission_to_waveguide_kw: generator_output_kw - forward_kw,
            uncoupled_to_water_loads_kw: forward_kw - absorbed_kw,
        },
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn losses_add_up_to_the_mains_draw() {
        let chain = EfficiencyChain { power_supply: 0.95, generator: 0.88, transmission: 0.97, applicator: 0.9 };
        let flow = power_flow(100.0, &chain);
        let l = flow.losses;
        let total = flow.absorbed_kw
            + l.power_supply_to_cabinet_air_kw
            + l.generator_to_tube_cooling_kw
            + l.transmission_to_waveguide_kw
            + l.uncoupled_to_water_loads_kw;
        assert_relative_eq!(total, flow.mains_kw, max_relative = 1e-12);
        assert_relative_eq!(flow.mains_kw, 100.0 / chain.overall(), max_relative = 1e-12);
    }

    #[test]
    fn anode_dissipation_of_a_75_kw_tube() {
        // shared/sources.md 6.2 [CALC]: 75 kW output at 88 % -> 10.23 kW dissipated.
        let chain = EfficiencyChain { power_supply: 1.0, generator: 0.88, transmission: 1.0, applicator: 1.0 };
        assert_relative_eq!(power_flow(75.0, &chain).losses.generator_to_tube_cooling_kw, 10.227, max_relative = 1e-3);
    }

    #[test]
    fn every_stage_is_checked() {
        let chain = EfficiencyChain { power_supply: 1.2, generator: 0.0, transmission: f64::NAN, applicator: 0.9 };
        let fields: Vec<String> = chain.validate().into_iter().map(|e| e.field).collect();
        assert_eq!(fields, ["efficiency.power_supply", "efficiency.generator", "efficiency.transmission"]);
    }
}
