//! The plan: everything computed from one scenario, with every assumption it used.
//!
//! `plan(&Scenario)` is the one entry point the CLI, the tests and the browser app all call.
//! Steps: resolve the product; balance the energy (sizing::energy_balance); walk the efficiency
//! chain back to the mains (sizing::efficiency_chain); choose and count generators
//! (sizing::generators); lay out the tunnel (sizing::tunnel); look up the permittivity at the
//! inlet and outlet states (materials) for penetration depth against bed depth; march the zones
//! along the tunnel (zone_march); add utilities, cost, warnings, the standing cautions and the
//! sensitivity of the quote (sensitivity, which re-runs the core without itself).

pub mod band_comparison;
pub mod depth_profile;
pub mod product;
pub mod sensitivity;
pub mod warnings;
pub mod zone_march;

use crate::error::InputError;
use crate::materials::thermal;
use crate::physics::bands::{band_containing, out_of_band_warning};
use crate::physics::heating::field_for_power_density_v_per_m;
use crate::physics::waves::penetration_depth_m;
use crate::safety::{cautions, Caution};
use crate::scenario::{self, FeedSides, ProcessKind, ProjectFields, Scenario};
use crate::sizing::efficiency_chain::{power_flow, EfficiencyChain, PowerFlow};
use crate::sizing::energy_balance::{balance, BalanceInput, EnergyBalance, LossAllowances};
use crate::sizing::generators::{builtin_catalogue, select, GeneratorClass, GeneratorKind, GeneratorSelection};
use crate::sizing::tunnel::{lay_out, Tunnel, TunnelInput};
use crate::sizing::utilities::{utilities, SiteInput, Utilities};
use product::Product;
use serde::Serialize;
use std::borrow::Cow;
use warnings::*;

/// The permittivity and penetration depth at one product state.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct DielectricState {
    /// Product temperature, degC.
    pub temp_c: f64,
    /// Wet-basis moisture.
    pub moisture_wb: f64,
    /// Fraction of the product's water that is ice.
    pub frozen_fraction: f64,
    /// Dielectric constant eps'.
    pub eps_real: f64,
    /// Loss factor eps''.
    pub eps_imag: f64,
    /// Power penetration depth, m (`None` for a lossless product).
    pub penetration_depth_m: Option<f64>,
    /// Whether the material data covers this state.
    pub in_range: bool,
    /// Which model or data gave the values.
    pub model: String,
}

/// One zone along the tunnel.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Zone {
    /// Zone number from the inlet, starting at 1.
    pub index: u32,
    /// Start of the zone from the tunnel inlet, m.
    pub start_m: f64,
    /// End of the zone, m.
    pub end_m: f64,
    /// Product temperature leaving the zone, degC.
    pub temp_c: f64,
    /// Moisture leaving the zone, wet basis.
    pub moisture_wb: f64,
    /// Frozen fraction of the water leaving the zone.
    pub frozen_fraction: f64,
    /// eps' at the zone's mean state.
    pub eps_real: f64,
    /// eps'' at the zone's mean state.
    pub eps_imag: f64,
    /// Power absorbed in the zone, kW.
    pub absorbed_kw: f64,
    /// Stage of the balance's path at the zone's mean state: `heating`, `evaporating` or
    /// `heating_dried`.
    pub stage: &'static str,
    /// Fraction of the zone's forward power the product absorbs (cavity model; RF: the scenario's
    /// applicator efficiency).
    pub coupling: f64,
    /// Fraction of the incident power the bed absorbs in one pass (layered solution; `None` at RF).
    pub single_pass_absorptance: Option<f64>,
    /// Power penetration depth at the zone's mean state, m (`None` for a lossless product).
    pub penetration_depth_m: Option<f64>,
    /// Mean absorbed power density in the zone's bed volume, kW/m^3.
    pub mean_power_density_kw_per_m3: f64,
    /// Highest RMS field in the product in the zone, V/m (`None` for a lossless product).
    pub peak_field_v_per_m: Option<f64>,
    /// Whether the loss factor rises with temperature in the zone (runaway risk).
    pub runaway: bool,
    /// Water evaporated in the zone, kg/h.
    pub water_removed_kg_per_h: f64,
}

/// The power density through the bed at the product state where it is least even.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct DepthProfile {
    /// `inlet` or `outlet`: which state the profile is for.
    pub state: &'static str,
    /// The layered solution: reflectance, absorptance per layer, samples and uniformity.
    #[serde(flatten)]
    pub solution: crate::physics::layers::StackSolution,
}

/// Evenness of heating through the bed at one state.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct UniformityAtState {
    /// `inlet` or `outlet`.
    pub state: &'static str,
    /// Lowest over highest power density in the product.
    pub min_to_max_ratio: Option<f64>,
    /// Core (far face, or centre when fed from both sides) over surface power density.
    pub core_to_surface_ratio: Option<f64>,
    /// Depth where the power density first falls to half the surface value, m.
    pub half_power_depth_m: Option<f64>,
    /// Whether the core gets less than the threshold share.
    pub core_lags: bool,
    /// Fraction of the incident power the product absorbs in one pass (no cavity).
    pub single_pass_absorptance: f64,
}

/// Every assumption the plan used, echoed so the quote can be defended.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Assumptions {
    /// Process kind.
    pub process: ProcessKind,
    /// Material name and label.
    pub material: String,
    /// Where the material data comes from.
    pub material_source: String,
    /// Inlet and outlet moisture used (wet basis).
    pub inlet_moisture_wb: f64,
    /// Outlet moisture used.
    pub outlet_moisture_wb: f64,
    /// Salt, %, if any.
    pub salt_pct: Option<f64>,
    /// Tunnel pressure, kPa.
    pub pressure_kpa: f64,
    /// Evaporation temperature, degC.
    pub evaporation_temp_c: f64,
    /// Latent heat of vaporization there, kJ/kg (IAPWS saturation line).
    pub latent_heat_vaporization_kj_per_kg: f64,
    /// The efficiency chain used.
    pub efficiency: EfficiencyChain,
    /// Loss allowances used.
    pub losses: LossAllowances,
    /// Tunnel geometry used (bulk density resolved).
    pub tunnel: TunnelInput,
    /// Feeding.
    pub feed: FeedSides,
    /// Site figures used.
    pub site: SiteInput,
    /// The temperature rise the heating-rate rule applied to, K.
    pub heating_rate_basis_rise_k: f64,
    /// Models behind the numbers.
    pub models: Vec<&'static str>,
}

/// The computed plan.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Plan {
    /// Scenario title.
    pub name: String,
    /// Power the product absorbs, kW.
    pub absorbed_power_kw: f64,
    /// Forward power at the applicator, kW.
    pub forward_power_kw: f64,
    /// Generator output over all running units, kW.
    pub generator_output_kw: f64,
    /// Mains power of the generators and auxiliaries, kW.
    pub mains_power_kw: f64,
    /// Generators installed (running plus standby).
    pub generator_count: u32,
    /// Rated output of one generator, kW.
    pub generator_rating_kw: f64,
    /// Class id of the generators.
    pub generator_class: String,
    /// Operating frequency, MHz.
    pub frequency_mhz: f64,
    /// ISM band name, if the frequency is in one.
    pub ism_band: Option<&'static str>,
    /// Belt speed, m/min.
    pub belt_speed_m_per_min: f64,
    /// Time under power, s.
    pub residence_time_s: f64,
    /// Heated length, m.
    pub tunnel_length_m: f64,
    /// Water evaporated, kg/h.
    pub water_removed_kg_per_h: f64,
    /// Mains energy per kg of product in, kWh/kg.
    pub specific_energy_kwh_per_kg: f64,
    /// Mains energy per kg of water removed, kWh/kg (drying only).
    pub specific_energy_kwh_per_kg_water: Option<f64>,
    /// Cooling-water flow, L/min.
    pub cooling_water_l_per_min: f64,
    /// Mean RMS field in the product implied by the mean power density, V/m.
    pub mean_field_v_per_m: Option<f64>,
    /// Highest RMS field in the product over the zones (zone power density times the layered
    /// profile's peak-to-mean ratio), V/m.
    pub peak_field_v_per_m: Option<f64>,
    /// Bed depth over the smallest penetration depth met in the tunnel.
    pub bed_over_penetration_depth: Option<f64>,
    /// The energy balance.
    pub energy_balance: EnergyBalance,
    /// Power along the chain and where losses go.
    pub power_flow: PowerFlow,
    /// Generators chosen.
    pub generators: GeneratorSelection,
    /// Tunnel layout.
    pub tunnel: Tunnel,
    /// Utilities and cost.
    pub utilities: Utilities,
    /// Permittivity at the inlet.
    pub dielectric_inlet: DielectricState,
    /// Permittivity at the outlet.
    pub dielectric_outlet: DielectricState,
    /// Profiles along the tunnel.
    pub zones: Vec<Zone>,
    /// How the zone march shared the absorbed power out (`None` only inside a sensitivity row).
    pub zone_model: Option<zone_march::ZoneModel>,
    /// What the quote is most sensitive to, ranked.
    pub sensitivity: Vec<sensitivity::SensitivityRow>,
    /// Power density through the bed depth (the less even of inlet and outlet).
    pub depth_profile: Option<DepthProfile>,
    /// Evenness through the bed at the inlet and the outlet.
    pub uniformity: Vec<UniformityAtState>,
    /// Where the plan is weak.
    pub warnings: Vec<Warning>,
    /// Standing safety cautions.
    pub cautions: Vec<Caution>,
    /// Everything assumed.
    pub assumptions: Assumptions,
    /// Quote fields, echoed.
    pub project: ProjectFields,
    /// Doubleprime version that computed the plan.
    pub version: &'static str,
}

/// Plan a scenario: every problem at once, or the plan.
pub fn plan(scenario: &Scenario) -> Result<Plan, Vec<InputError>> {
    plan_to_depth(scenario, &PlanDepth::FULL)
}

/// A plan without its sensitivity study, for callers that read none of it (the band comparison's
/// rows): the same validation, numbers, warnings and finiteness check as [`plan`].
pub(crate) fn plan_without_sensitivity(scenario: &Scenario) -> Result<Plan, Vec<InputError>> {
    plan_to_depth(scenario, &PlanDepth::NO_SENSITIVITY)
}

/// The plan core for the design search (crate::search), on a scenario and product it has already
/// validated: no warnings, no sensitivity; with `march` the depth profiles and the zone march too,
/// without it only the sizing and the dielectric states. Its numbers are those of [`plan`].
pub(crate) fn plan_parts(scenario: &Scenario, product: &Product, march: bool) -> Result<Plan, Vec<InputError>> {
    plan_core(scenario, product, if march { &PlanDepth::SEARCH_MARCH } else { &PlanDepth::SEARCH_SIZING })
}

fn plan_to_depth(scenario: &Scenario, depth: &PlanDepth) -> Result<Plan, Vec<InputError>> {
    let mut problems = scenario::validate(scenario);
    let product = Product::from_scenario(scenario).map_err(|errors| problems.extend(errors)).ok();
    match product {
        Some(product) if problems.is_empty() => plan_core(scenario, &product, depth).and_then(finite_or_error),
        _ => Err(problems),
    }
}

/// Refuse a plan holding a NaN or an infinity: a named error beats a silent blank.
fn finite_or_error(plan: Plan) -> Result<Plan, Vec<InputError>> {
    match crate::finite::first_non_finite(&plan) {
        None => Ok(plan),
        Some(path) => Err(vec![InputError::new(
            "scenario",
            format!("a plan whose {path} is not a finite number"),
            "inputs inside the models' ranges (this combination drives a model outside them)",
        )]),
    }
}

/// Plan scenario JSON text.
pub fn plan_json(text: &str) -> Result<Plan, Vec<InputError>> {
    plan(&scenario::parse_scenario(text)?)
}

/// The built-in catalogue plus the scenario's own classes (borrowed when there are none: a plan
/// and each of its sensitivity rows look the catalogue up).
pub(crate) fn catalogue_for(scenario: &Scenario) -> Cow<'static, [GeneratorClass]> {
    if scenario.generator.extra_classes.is_empty() {
        return Cow::Borrowed(builtin_catalogue());
    }
    let mut catalogue = builtin_catalogue().to_vec();
    catalogue.extend(scenario.generator.extra_classes.iter().cloned());
    Cow::Owned(catalogue)
}

/// How much of a plan to compute: all of it, or only what a sensitivity row reads.
#[derive(Debug, Clone, Copy)]
struct PlanDepth {
    /// Solve the layered depth profiles at the inlet and outlet (uniformity).
    depth_profiles: bool,
    /// March the zones along the tunnel.
    zone_march: bool,
    /// Collect the warnings (the runaway scan and the band suggestion are their costly part).
    warnings: bool,
    /// Run the sensitivity study (never inside a sensitivity row: no recursion).
    sensitivity: bool,
    /// Write the texts: the cautions, the material and its sources, the permittivity models of the
    /// dielectric states and whether their data cover them. A sensitivity row reads none of them:
    /// without, its plan carries no cautions, empty texts and `in_range` true, and its numbers
    /// (and its refusals) are the same.
    texts: bool,
}

impl PlanDepth {
    /// The whole plan.
    const FULL: PlanDepth =
        PlanDepth { depth_profiles: true, zone_march: true, warnings: true, sensitivity: true, texts: true };
    /// A sensitivity row whose input moves the product's permittivity: sizing, dielectric states
    /// and depth profiles.
    const ROW_DIELECTRIC: PlanDepth =
        PlanDepth { depth_profiles: true, zone_march: false, warnings: false, sensitivity: false, texts: false };
    /// A sensitivity row whose input leaves the permittivity alone: sizing and dielectric states.
    const ROW_SIZING: PlanDepth =
        PlanDepth { depth_profiles: false, zone_march: false, warnings: false, sensitivity: false, texts: false };
    /// The design search's sizing: sizing and dielectric states, with the texts (it reads whether
    /// the material data cover the states).
    const SEARCH_SIZING: PlanDepth =
        PlanDepth { depth_profiles: false, zone_march: false, warnings: false, sensitivity: false, texts: true };
    /// Everything but the sensitivity study (a band comparison row).
    const NO_SENSITIVITY: PlanDepth =
        PlanDepth { depth_profiles: true, zone_march: true, warnings: true, sensitivity: false, texts: true };
    /// The design search's bed figures: sizing, depth profiles and the zone march.
    const SEARCH_MARCH: PlanDepth =
        PlanDepth { depth_profiles: true, zone_march: true, warnings: false, sensitivity: false, texts: true };
}

fn plan_core(scenario: &Scenario, product: &Product, depth: &PlanDepth) -> Result<Plan, Vec<InputError>> {
    let drying = scenario.process == ProcessKind::Drying;
    let moisture_in = scenario.inlet.moisture_wb.unwrap_or_else(|| product.default_moisture_wb());
    let moisture_out = scenario.outlet.moisture_wb.unwrap_or(moisture_in);
    let evaporation_temp_c = match scenario.evaporation_temp_c {
        Some(temp) => temp,
        None => thermal::boiling_point_c(scenario.pressure_kpa * 1000.0).map_err(|e| vec![e.within("pressure")])?,
    };
    let latent_heat =
        thermal::latent_heat_vaporization_j_per_kg(evaporation_temp_c).map_err(|e| vec![e.within("evaporation")])?;
    let frequency_hz = scenario.frequency_mhz * 1e6;

    let energy = balance(
        product,
        &BalanceInput {
            throughput_kg_per_h: scenario.throughput_kg_per_h,
            inlet_temp_c: scenario.inlet.temp_c,
            outlet_temp_c: scenario.outlet.temp_c,
            inlet_moisture_wb: moisture_in,
            outlet_moisture_wb: moisture_out,
            evaporation_temp_c,
            latent_heat_vaporization_j_per_kg: latent_heat,
            losses: scenario.losses,
        },
    )
    .map_err(|e| vec![e.within("product")])?;
    if !(energy.absorbed_kw.is_finite() && energy.absorbed_kw > 0.0) {
        return Err(vec![InputError::new(
            "outlet.temp_c",
            scenario.outlet.temp_c,
            format!("a state that needs heat: the balance from the inlet gives {:.3} kW", energy.absorbed_kw),
        )]);
    }

    // Size the generators on their output, then take their efficiencies for the rest of the chain.
    let generator_output_needed_kw =
        energy.absorbed_kw / (scenario.efficiency.applicator * scenario.efficiency.transmission);
    let catalogue = catalogue_for(scenario);
    let selection = select(
        &catalogue,
        scenario.generator.class.as_deref(),
        scenario.frequency_mhz,
        generator_output_needed_kw,
        scenario.generator.redundancy,
    )
    .map_err(|error| vec![error.to_input_error()])?;
    let chain = EfficiencyChain {
        power_supply: scenario.efficiency.power_supply.unwrap_or(selection.class.power_supply_efficiency),
        generator: scenario.efficiency.generator.unwrap_or(selection.class.generator_efficiency),
        transmission: scenario.efficiency.transmission,
        applicator: scenario.efficiency.applicator,
    };
    let flow = power_flow(energy.absorbed_kw, &chain);

    let tunnel_input = TunnelInput {
        belt_width_m: scenario.tunnel.belt_width_m,
        bed_depth_m: scenario.tunnel.bed_depth_m,
        bulk_density_kg_per_m3: scenario.tunnel.bulk_density_kg_per_m3.unwrap_or(product.material.density_kg_per_m3),
        residence: scenario.tunnel.residence,
    };
    let heating_rate_basis_rise_k = if drying {
        let cp = product
            .material
            .specific_heat_j_per_kg_k(scenario.inlet.temp_c.max(0.0), Some(moisture_in))
            .map_err(|e| vec![e.within("product")])?;
        energy.absorbed_j_per_kg / cp
    } else {
        scenario.outlet.temp_c - scenario.inlet.temp_c
    };
    let tunnel = lay_out(&tunnel_input, scenario.throughput_kg_per_h, energy.absorbed_kw, heating_rate_basis_rise_k);

    let water_cooled = selection.class.cooling == "water";
    let cooling_water_heat_kw = flow.losses.uncoupled_to_water_loads_kw
        + if water_cooled { flow.losses.generator_to_tube_cooling_kw } else { 0.0 };
    let utilities = utilities(
        &scenario.site,
        flow.mains_kw,
        flow.absorbed_kw,
        cooling_water_heat_kw,
        scenario.throughput_kg_per_h,
        energy.water_removed_kg_per_h,
    );

    let dielectric_at = |temp_c: f64, moisture_wb: f64| -> Result<DielectricState, Vec<InputError>> {
        let lookup = if depth.texts {
            product
                .permittivity(frequency_hz, temp_c, moisture_wb)
                .map(|lookup| (lookup.eps, lookup.in_range, lookup.model))
        } else {
            // The same number and the same refusals, without the texts.
            product.permittivity_value(frequency_hz, temp_c, moisture_wb).map(|eps| (eps, true, String::new()))
        };
        let (eps, in_range, model) = lookup.map_err(|e| vec![e.within("product")])?;
        Ok(DielectricState {
            temp_c,
            moisture_wb,
            frozen_fraction: product
                .material
                .frozen_fraction_at(temp_c, Some(moisture_wb))
                .map_err(|e| vec![e.within("product")])?,
            eps_real: eps.eps_real,
            eps_imag: eps.eps_imag,
            penetration_depth_m: penetration_depth_m(frequency_hz, eps),
            in_range,
            model,
        })
    };
    let dielectric_inlet = dielectric_at(scenario.inlet.temp_c, moisture_in)?;
    let dielectric_outlet = dielectric_at(scenario.outlet.temp_c, moisture_out)?;

    let smallest_dp = [dielectric_inlet.penetration_depth_m, dielectric_outlet.penetration_depth_m]
        .into_iter()
        .flatten()
        .reduce(f64::min);
    let bed_over_penetration_depth = smallest_dp.map(|dp| scenario.tunnel.bed_depth_m / dp);
    let mean_eps_imag = 0.5 * (dielectric_inlet.eps_imag + dielectric_outlet.eps_imag);
    let mean_field_v_per_m =
        field_for_power_density_v_per_m(frequency_hz, mean_eps_imag, tunnel.mean_power_density_kw_per_m3 * 1000.0);

    let mut profiles = Vec::new();
    let profiled: &[(&'static str, &DielectricState)] =
        if depth.depth_profiles { &[("inlet", &dielectric_inlet), ("outlet", &dielectric_outlet)] } else { &[] };
    for &(state, dielectric) in profiled {
        let eps = crate::physics::permittivity::ComplexPermittivity::new(dielectric.eps_real, dielectric.eps_imag);
        profiles.push((state, depth_profile::depth_profile(scenario, frequency_hz, eps).map_err(|e| vec![e])?));
    }
    let uniformity: Vec<UniformityAtState> = profiles
        .iter()
        .map(|(state, solution)| {
            let u = solution.uniformity.as_ref();
            UniformityAtState {
                state,
                min_to_max_ratio: u.and_then(|u| u.min_to_max_ratio),
                core_to_surface_ratio: u.and_then(|u| u.core_to_surface_ratio),
                half_power_depth_m: u.and_then(|u| {
                    u.fraction_depths.iter().find(|d| (d.fraction - 0.5).abs() < 1e-9).and_then(|d| d.depth_m)
                }),
                core_lags: u.is_some_and(|u| u.core_lags),
                single_pass_absorptance: solution.product_absorptance,
            }
        })
        .collect();
    // Show the state whose core gets the smallest share: that is where the plan is weakest.
    let depth_profile = profiles
        .into_iter()
        .min_by(|a, b| {
            let share = |s: &crate::physics::layers::StackSolution| {
                s.uniformity.as_ref().and_then(|u| u.core_to_surface_ratio).unwrap_or(1.0)
            };
            share(&a.1).partial_cmp(&share(&b.1)).unwrap_or(std::cmp::Ordering::Equal)
        })
        .map(|(state, solution)| DepthProfile { state, solution });

    let march = if depth.zone_march {
        Some(
            zone_march::march(&zone_march::MarchInput {
                scenario,
                product,
                energy: &energy,
                tunnel: &tunnel,
                frequency_hz,
                inlet_moisture_wb: moisture_in,
                outlet_moisture_wb: moisture_out,
                evaporation_temp_c,
                latent_heat_j_per_kg: latent_heat,
                applicator_efficiency: scenario.efficiency.applicator,
            })
            .map_err(|e| vec![e.within("zones")])?,
        )
    } else {
        None
    };
    let peak_field_v_per_m =
        march.as_ref().and_then(|m| m.zones.iter().filter_map(|zone| zone.peak_field_v_per_m).reduce(f64::max));
    let (zones, zone_model) = match march {
        Some(march) => (march.zones, Some(march.model)),
        None => (Vec::new(), None),
    };

    let mut plan = Plan {
        name: scenario.name.clone(),
        absorbed_power_kw: flow.absorbed_kw,
        forward_power_kw: flow.forward_kw,
        generator_output_kw: flow.generator_output_kw,
        mains_power_kw: utilities.total_mains_kw,
        generator_count: selection.total_count(),
        generator_rating_kw: selection.class.rated_output_kw,
        generator_class: selection.class.id.clone(),
        frequency_mhz: scenario.frequency_mhz,
        ism_band: band_containing(scenario.frequency_mhz).map(|band| band.name),
        belt_speed_m_per_min: tunnel.belt_speed_m_per_min,
        residence_time_s: tunnel.residence_time_s,
        tunnel_length_m: tunnel.tunnel_length_m,
        water_removed_kg_per_h: energy.water_removed_kg_per_h,
        specific_energy_kwh_per_kg: utilities.mains_energy_kwh_per_kg,
        specific_energy_kwh_per_kg_water: utilities.mains_energy_kwh_per_kg_water,
        cooling_water_l_per_min: utilities.cooling_water_l_per_min,
        mean_field_v_per_m,
        peak_field_v_per_m,
        bed_over_penetration_depth,
        energy_balance: energy,
        power_flow: flow,
        generators: selection.clone(),
        tunnel,
        utilities,
        dielectric_inlet,
        dielectric_outlet,
        zones,
        zone_model,
        sensitivity: Vec::new(),
        depth_profile,
        uniformity,
        warnings: Vec::new(),
        cautions: if depth.texts {
            cautions(scenario.frequency_mhz, selection.class.anode_kv, is_combustible(&product.material))
        } else {
            Vec::new()
        },
        assumptions: Assumptions {
            process: scenario.process,
            material: if depth.texts {
                format!("{} ({})", product.material.name, product.material.label)
            } else {
                String::new()
            },
            material_source: if depth.texts { product.material.source_summary() } else { String::new() },
            inlet_moisture_wb: moisture_in,
            outlet_moisture_wb: moisture_out,
            salt_pct: product.salt_pct,
            pressure_kpa: scenario.pressure_kpa,
            evaporation_temp_c,
            latent_heat_vaporization_kj_per_kg: latent_heat / 1000.0,
            efficiency: chain,
            losses: scenario.losses,
            tunnel: tunnel_input,
            feed: scenario.tunnel.feed,
            site: scenario.site.clone(),
            heating_rate_basis_rise_k,
            models: vec![
                "energy balance on specific enthalpy differences (sources.md 10.2)",
                "latent heat of vaporization: IAPWS supplementary release on saturation properties (1992)",
                "efficiency chain absorbed <- forward <- generator <- supply <- mains",
                "generator count = ceil(output / (rating x max operating fraction))",
            ],
        },
        project: scenario.project.clone(),
        version: env!("CARGO_PKG_VERSION"),
    };
    if depth.warnings {
        plan.warnings = plan_warnings(scenario, product, &plan);
    }
    if depth.sensitivity {
        plan.sensitivity = sensitivity::sensitivity(scenario, product, &plan);
    }
    Ok(plan)
}

/// Whether a dried or heated product of this category burns (for the combustible-product caution).
fn is_combustible(material: &crate::materials::Material) -> bool {
    use crate::materials::Category;
    matches!(
        material.category,
        Category::Wood | Category::Paper | Category::Textile | Category::Bakery | Category::Rubber | Category::Polymer
    )
}

/// The warnings that follow from a computed plan.
fn plan_warnings(scenario: &Scenario, product: &Product, plan: &Plan) -> Vec<Warning> {
    let mut list = Vec::new();
    if let Some(message) = out_of_band_warning(scenario.frequency_mhz) {
        list.push(Warning::new("outside_ism_band", message));
    }
    for (where_, state) in [("inlet", &plan.dielectric_inlet), ("outlet", &plan.dielectric_outlet)] {
        if !state.in_range {
            list.push(Warning::new(
                "material_data_out_of_range",
                format!("The {where_} state ({:.1} °C, moisture {:.3}) lies outside the data for {}: its permittivity is extrapolated ({}). Check against measured data for this product.", state.temp_c, state.moisture_wb, product.material.name, state.model),
            ));
        }
    }
    let limit = match scenario.tunnel.feed {
        FeedSides::Top => BED_OVER_DP_LIMIT_ONE_SIDE,
        FeedSides::Both => BED_OVER_DP_LIMIT_TWO_SIDES,
    };
    if let Some(ratio) = plan.bed_over_penetration_depth {
        if ratio > limit {
            let suggestion = band_comparison::deeper_band_suggestion(scenario, product, limit);
            list.push(Warning::new(
                "bed_deeper_than_penetration",
                format!(
                    "The bed is {:.0} mm deep, {ratio:.1} times the smallest penetration depth in the tunnel: the far side will lag and the near side overheat. {}{suggestion}",
                    scenario.tunnel.bed_depth_m * 1000.0,
                    match scenario.tunnel.feed {
                        FeedSides::Top => "Make the bed shallower, feed from both sides, or use a lower frequency.",
                        FeedSides::Both => "Even fed from both sides that is too deep: make the bed shallower or use a lower frequency.",
                    }
                ),
            ));
        }
    }
    if let Some(lagging) = plan.uniformity.iter().find(|u| u.core_lags) {
        let share = lagging
            .core_to_surface_ratio
            .map(|r| format!("{:.0} %", r * 100.0))
            .unwrap_or_else(|| "almost none".into());
        list.push(Warning::new(
            "core_lags",
            format!("At the {} the product's core receives {share} of the surface power density (layered solution through the bed): the core will lag behind the surface. {}", lagging.state, match scenario.tunnel.feed {
                FeedSides::Top => "Make the bed thinner, feed from both sides, add equalising time, or use a lower frequency.",
                FeedSides::Both => "Make the bed thinner, add equalising time, or use a lower frequency.",
            }),
        ));
    }
    let runaway_zones =
        plan.zone_model.as_ref().and_then(|model| zone_march::runaway_zones_sentence(&plan.zones, model));
    match crate::materials::warnings::runaway_risk(
        &product.material,
        scenario.frequency_mhz * 1e6,
        &product.state(scenario.inlet.temp_c, plan.assumptions.inlet_moisture_wb),
        &product.state(scenario.outlet.temp_c, plan.assumptions.outlet_moisture_wb),
    ) {
        Ok(Some(risk)) => list.push(Warning::new(
            "runaway_risk",
            match runaway_zones {
                Some(zones) => format!("{}. {zones}", risk.message),
                None => risk.message,
            },
        )),
        _ => {
            if let Some(zones) = runaway_zones {
                list.push(Warning::new("runaway_risk", format!("{}: {zones}", product.material.label)));
            }
        }
    }
    let selection = &plan.generators;
    if selection.operating_fraction < LOW_OPERATING_FRACTION {
        list.push(Warning::new(
            "generator_lightly_loaded",
            format!("Each {} runs at {:.0} % of its rating: a smaller class would run nearer its best point, or the line has room to grow.", selection.class.label, selection.operating_fraction * 100.0),
        ));
    }
    if selection.operating_fraction < selection.class.min_operating_fraction {
        list.push(Warning::new(
            "generator_below_stable_minimum",
            format!("Each {} would run at {:.0} % of its rating, below its stable minimum of {:.0} %. Choose a smaller class.", selection.class.label, selection.operating_fraction * 100.0, selection.class.min_operating_fraction * 100.0),
        ));
    }
    // The zones' peak field where the march ran; the mean field otherwise.
    let (field, which) = match plan.peak_field_v_per_m {
        Some(peak) => {
            (Some(peak), "peak field in the product (zone power density times the peak-to-mean ratio through the bed)")
        }
        None => (plan.mean_field_v_per_m, "mean field in the product"),
    };
    if let Some(field) = field {
        if field > FIELD_ARCING_CONCERN_V_PER_M {
            list.push(Warning::new(
                "arcing_risk",
                format!("The {which} is about {:.0} kV/m, above the {:.0} kV/m kept as margin below the breakdown of air: arcing at edges and in vapour is likely. Spread the power over a longer tunnel or a wider belt.", field / 1000.0, FIELD_ARCING_CONCERN_V_PER_M / 1000.0),
            ));
        }
    }
    let loss_factor = plan.dielectric_inlet.eps_imag.min(plan.dielectric_outlet.eps_imag);
    if loss_factor < LOW_LOSS_FACTOR {
        list.push(Warning::new(
            "low_loss_product",
            format!("The loss factor falls to {loss_factor:.3}: such a product couples poorly, so the applicator efficiency of {:.0} % assumed is optimistic and the walls and belt take a larger share.", plan.assumptions.efficiency.applicator * 100.0),
        ));
    }
    list.extend(plan.zone_model.as_ref().and_then(zone_march::coupling_warning));
    if plan.tunnel_length_m > LONG_TUNNEL_M {
        list.push(Warning::new(
            "long_tunnel",
            format!(
                "The heated length is {:.0} m: consider a wider belt, a deeper bed or several parallel lines.",
                plan.tunnel_length_m
            ),
        ));
    }
    if let Some(freezing_point) = product.material.initial_freezing_point_c() {
        match scenario.process {
            ProcessKind::Tempering if scenario.outlet.temp_c > freezing_point - TEMPERING_MARGIN_K => list.push(Warning::new(
                "tempering_too_close_to_thaw",
                format!("The outlet at {:.1} °C is within {TEMPERING_MARGIN_K} K of the initial freezing point {freezing_point:.1} °C: the enthalpy rises steeply there, so the plan's power is very sensitive to the outlet temperature and the surface may thaw and run away.", scenario.outlet.temp_c),
            )),
            ProcessKind::Thawing if scenario.outlet.temp_c < freezing_point => list.push(Warning::new(
                "thawing_not_complete",
                format!("The outlet at {:.1} °C is below the initial freezing point {freezing_point:.1} °C: the product leaves partly frozen. That is tempering; set the process to tempering or raise the outlet temperature.", scenario.outlet.temp_c),
            )),
            _ => {}
        }
    }
    if matches!(scenario.generator.redundancy, crate::sizing::generators::Redundancy::N)
        && plan.generators.running_count == 1
        && plan.generators.class.kind == GeneratorKind::Magnetron
    {
        list.push(Warning::new(
            "single_generator",
            "The line hangs on one magnetron: a tube failure stops production. Consider N+1 for lines that must not stop.",
        ));
    }
    list
}
