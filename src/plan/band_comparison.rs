//! The same scenario planned in each heating band served by the catalogue, side by side.
//!
//! Each band gets its own generator class (picked automatically) and that class's generator and
//! supply efficiencies; the applicator and transmission efficiencies, the tunnel and the losses
//! are the scenario's. That a tunnel applicator and an RF electrode system couple alike is an
//! assumption the row states, not a finding.

use super::product::Product;
use super::{plan_without_sensitivity, Plan};
use crate::physics::waves::penetration_depth_m;
use crate::scenario::Scenario;
use serde::Serialize;

/// Band centres compared, MHz: the RF and microwave heating bands with catalogue classes.
pub const COMPARED_BANDS_MHZ: [f64; 6] = [13.56, 27.12, 40.68, 896.0, 915.0, 2450.0];

/// One band's outcome.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct BandRow {
    /// Band centre, MHz.
    pub frequency_mhz: f64,
    /// Whether the scenario's own frequency is in this band.
    pub is_scenario_band: bool,
    /// The plan in this band, or why there is none.
    #[serde(flatten)]
    pub outcome: BandOutcome,
}

/// A band's plan summary or the reason it could not be planned.
#[derive(Debug, Clone, PartialEq, Serialize)]
#[serde(untagged)]
pub enum BandOutcome {
    /// Planned.
    Planned {
        /// Generator class chosen.
        generator_class: String,
        /// Generators installed.
        generator_count: u32,
        /// Rating of one, kW.
        generator_rating_kw: f64,
        /// Absorbed power, kW.
        absorbed_power_kw: f64,
        /// Forward power, kW.
        forward_power_kw: f64,
        /// Mains power, kW.
        mains_power_kw: f64,
        /// Smallest penetration depth in the tunnel, m.
        penetration_depth_min_m: Option<f64>,
        /// Bed depth over that.
        bed_over_penetration_depth: Option<f64>,
        /// Mains energy per kg of product, kWh/kg.
        specific_energy_kwh_per_kg: f64,
        /// Energy cost per tonne.
        energy_cost_per_tonne: f64,
        /// Warning codes of the plan in this band.
        warning_codes: Vec<&'static str>,
    },
    /// Not planned.
    NotPlanned {
        /// Why.
        reason: String,
    },
}

/// The comparison over every band.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct BandComparison {
    /// Scenario title.
    pub name: String,
    /// One row per band.
    pub bands: Vec<BandRow>,
    /// The assumption behind comparing them.
    pub note: &'static str,
}

/// The scenario moved to another frequency; outside its own band the generator class and its
/// efficiencies are left to the new band's automatic pick.
pub(crate) fn in_band(scenario: &Scenario, centre_mhz: f64) -> Scenario {
    let mut copy = scenario.clone();
    copy.frequency_mhz = centre_mhz;
    if crate::physics::bands::band_containing(centre_mhz)
        != crate::physics::bands::band_containing(scenario.frequency_mhz)
    {
        // Another band needs another class, with that class's own efficiencies.
        copy.generator.class = None;
        copy.efficiency.generator = None;
        copy.efficiency.power_supply = None;
    }
    copy
}

fn summary(plan: &Plan) -> BandOutcome {
    BandOutcome::Planned {
        generator_class: plan.generator_class.clone(),
        generator_count: plan.generator_count,
        generator_rating_kw: plan.generator_rating_kw,
        absorbed_power_kw: plan.absorbed_power_kw,
        forward_power_kw: plan.forward_power_kw,
        mains_power_kw: plan.mains_power_kw,
        penetration_depth_min_m: [
            plan.dielectric_inlet.penetration_depth_m,
            plan.dielectric_outlet.penetration_depth_m,
        ]
        .into_iter()
        .flatten()
        .reduce(f64::min),
        bed_over_penetration_depth: plan.bed_over_penetration_depth,
        specific_energy_kwh_per_kg: plan.specific_energy_kwh_per_kg,
        energy_cost_per_tonne: plan.utilities.energy_cost_per_tonne,
        warning_codes: plan.warnings.iter().map(|w| w.code).collect(),
    }
}

/// Plan `scenario` in every compared band.
pub fn compare(scenario: &Scenario) -> Result<BandComparison, Vec<crate::error::InputError>> {
    // The scenario itself must be valid; a band that cannot be planned is a row, not an error.
    // The rows read no sensitivity, so none is computed (the rows' numbers are the full plan's).
    plan_without_sensitivity(scenario)?;
    let own_band = crate::physics::bands::band_containing(scenario.frequency_mhz);
    let bands = COMPARED_BANDS_MHZ
        .iter()
        .map(|&centre| {
            let outcome = match plan_without_sensitivity(&in_band(scenario, centre)) {
                Ok(plan) => summary(&plan),
                Err(errors) => BandOutcome::NotPlanned {
                    reason: errors.iter().map(ToString::to_string).collect::<Vec<_>>().join("; "),
                },
            };
            BandRow {
                frequency_mhz: centre,
                is_scenario_band: own_band.is_some() && own_band == crate::physics::bands::band_containing(centre),
                outcome,
            }
        })
        .collect();
    Ok(BandComparison {
        name: scenario.name.clone(),
        bands,
        note: "Each band uses its own automatically chosen generator class and that class's efficiencies; applicator and transmission efficiencies, tunnel and losses are the scenario's in every band.",
    })
}

/// A sentence naming the highest-frequency band whose penetration depth suits the bed, if any.
pub fn deeper_band_suggestion(scenario: &Scenario, product: &Product, limit: f64) -> String {
    let moisture_in = scenario.inlet.moisture_wb.unwrap_or_else(|| product.default_moisture_wb());
    let moisture_out = scenario.outlet.moisture_wb.unwrap_or(moisture_in);
    let smallest_dp = |freq_mhz: f64| {
        [(scenario.inlet.temp_c, moisture_in), (scenario.outlet.temp_c, moisture_out)]
            .into_iter()
            .filter_map(|(temp, moisture)| product.permittivity(freq_mhz * 1e6, temp, moisture).ok())
            .filter_map(|lookup| penetration_depth_m(freq_mhz * 1e6, lookup.eps))
            .reduce(f64::min)
    };
    COMPARED_BANDS_MHZ
        .iter()
        .rev()
        .filter(|&&freq| freq < scenario.frequency_mhz)
        .find_map(|&freq| {
            smallest_dp(freq).filter(|dp| scenario.tunnel.bed_depth_m / dp <= limit).map(|dp| {
                format!(" At {freq} MHz the smallest penetration depth is {:.0} mm, which suits this bed.", dp * 1000.0)
            })
        })
        .unwrap_or_default()
}
