//! The factorized evaluation of one configuration of the design search: each part of the plan is
//! computed once for the inputs it depends on and reused for every configuration that shares
//! them.
//!
//! | part | depends on | computed |
//! |---|---|---|
//! | energy balance, efficiency chain, generator selection, mains power, utilities, permittivity and penetration depth at the inlet and outlet | band, generator class, redundancy | once per (band, class, redundancy), by the plan core without its depth profiles, zone march, warnings or sensitivity (`plan::plan_parts`) |
//! | depth profiles, zone march: peak field, hot spot, core-to-surface ratio | band, bed depth, zone count | once per (band, depth, zones), by the plan core with its profiles and march |
//! | tunnel (belt speed, residence time, length) | belt width, bed depth (and the scenario's residence rule) | per configuration, by `sizing::tunnel::lay_out` (a few operations) |
//!
//! So the numbers are the plan's own, not a second model of them. The one rescaled figure is the
//! peak field: the zone march's shares, states and peak-to-mean ratios do not depend on the belt
//! width or the tunnel length (they follow the product's path and the bed's layered solution), so
//! each zone's power density scales as 1/V with V = W d L the bed volume under power, and the
//! field as 1/sqrt(V): peak(W, L) = peak(W_ref, L_ref) sqrt(V_ref / V). That is an identity of the
//! march, equal to a full plan's peak field to rounding (the tests check it).
//!
//! # Hot-spot temperature
//!
//! The plan's outlet temperature is the bed's mean. The hottest product is where the power density
//! through the depth peaks. With no conduction, product at depth z takes sum_i share_i p_i(z) /
//! mean_i p times the balance's net heat per kg, and the factor F = sum_i share_i max_i / mean_i,
//! with the zone march's peak-to-mean ratio per zone (the layered solution, plan::zone_march),
//! bounds that from above for every depth (the depth of the peak may move from zone to zone).
//! The hot spot is product that reached the balance's outlet state (T_out, x_out) and then took
//! the excess (F - 1) e_net per kg of product in, e_net the balance's net process heat per kg in:
//!
//! 1. moist product below the evaporation temperature T_e heats at x_out towards T_e;
//! 2. at T_e (or T_out, if that is higher) its water evaporates, x_out h_fg(T_e) per kg, the
//!    temperature held;
//! 3. the dry solids (moisture 0) heat from there, capped at the models' 300 degC.
//!
//! Enthalpies are the material's own (the balance's models), inverted as the zone march does.
//! So F = 1 gives T_out exactly, and a moist product's hot spot reads T_e while it boils. What
//! the estimate leaves out: conduction and surface cooling (it overstates), the loss factor
//! changing as the spot heats or dries (moisture levelling at a drying spot makes it overstate;
//! a loss factor rising with temperature, understate), and bound water (taken as free water
//! leaving at T_e). At RF the zone march takes the field as even through the bed (F = 1), so
//! there the hot spot is the outlet temperature: RF non-uniformity between electrodes is not
//! modelled. It is a planning estimate to rank configurations by, not a thermal simulation.

use super::rank::Figures;
use super::space::{ClassChoice, ResolvedSpace};
use crate::error::InputError;
use crate::materials::thermal::latent_heat_vaporization_j_per_kg;
use crate::materials::TEMP_MAX_C;
use crate::physics::heating::power_density_w_per_m3;
use crate::plan::band_comparison::in_band;
use crate::plan::product::Product;
use crate::plan::zone_march::temperature_at_enthalpy;
use crate::plan::{plan_parts, Plan, Zone};
use crate::scenario::Scenario;
use crate::sizing::generators::Redundancy;
use crate::sizing::tunnel::{lay_out, TunnelInput};
use serde::Serialize;
use std::collections::HashMap;

/// One point of the space.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Configuration {
    /// Operating frequency, MHz.
    pub frequency_mhz: f64,
    /// The generator class asked for: `auto` or an id.
    pub class_choice: ClassChoice,
    /// `n` or `n_plus_1`.
    pub redundancy: Redundancy,
    /// Loaded belt width, m.
    pub belt_width_m: f64,
    /// Bed depth, m.
    pub bed_depth_m: f64,
    /// Zones along the tunnel.
    pub zones: u32,
}

/// The scenario a configuration stands for: the base scenario moved to the band (outside the
/// scenario's own band the efficiency overrides of its class are dropped, as the band comparison
/// does), with the class, redundancy, belt width, bed depth and zone count set. A full `plan()` of
/// it is the configuration's plan.
pub fn configured_scenario(base: &Scenario, configuration: &Configuration) -> Scenario {
    let mut scenario = in_band(base, configuration.frequency_mhz);
    scenario.generator.class = configuration.class_choice.id().map(str::to_string);
    scenario.generator.redundancy = configuration.redundancy;
    scenario.tunnel.belt_width_m = configuration.belt_width_m;
    scenario.tunnel.bed_depth_m = configuration.bed_depth_m;
    scenario.tunnel.zones = configuration.zones;
    scenario
}

/// Why a configuration is not feasible: the first check it fails, in this order.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Rejection {
    /// The plan core refused it (a material lookup, the energy balance, a non-finite number).
    NotPlanned,
    /// No unit count of the class can be sized (over 1000 units), or the units would run below
    /// their stable minimum.
    GeneratorSelection,
    /// Longer than `max_tunnel_length_m`.
    TunnelLength,
    /// Deeper than `max_bed_over_penetration_depth` per fed face.
    BedOverPenetrationDepth,
    /// Peak field above `max_peak_field_v_per_m`.
    PeakField,
    /// Hot spot above `max_product_temp_c`.
    ProductTemp,
    /// Core-to-surface ratio below `min_core_to_surface_ratio`.
    CoreToSurface,
}

/// Configurations rejected, by the first check they failed; the keys are the constraint names.
#[derive(Debug, Clone, Copy, Default, PartialEq, Eq, Serialize)]
pub struct RejectionCounts {
    /// The plan core refused them.
    pub not_planned: usize,
    /// The class could not be sized or would run below its stable minimum.
    pub generator_selection: usize,
    /// Tunnel too long.
    pub max_tunnel_length_m: usize,
    /// Bed too deep for the penetration depth.
    pub max_bed_over_penetration_depth: usize,
    /// Field too high.
    pub max_peak_field_v_per_m: usize,
    /// Hot spot too hot.
    pub max_product_temp_c: usize,
    /// Core heats too little.
    pub min_core_to_surface_ratio: usize,
}

impl RejectionCounts {
    /// Count one rejection.
    pub fn add(&mut self, rejection: Rejection) {
        let count = match rejection {
            Rejection::NotPlanned => &mut self.not_planned,
            Rejection::GeneratorSelection => &mut self.generator_selection,
            Rejection::TunnelLength => &mut self.max_tunnel_length_m,
            Rejection::BedOverPenetrationDepth => &mut self.max_bed_over_penetration_depth,
            Rejection::PeakField => &mut self.max_peak_field_v_per_m,
            Rejection::ProductTemp => &mut self.max_product_temp_c,
            Rejection::CoreToSurface => &mut self.min_core_to_surface_ratio,
        };
        *count += 1;
    }

    /// Every count with its name, in the order of the checks.
    pub fn entries(&self) -> [(&'static str, usize); 7] {
        [
            ("not_planned", self.not_planned),
            ("generator_selection", self.generator_selection),
            ("max_tunnel_length_m", self.max_tunnel_length_m),
            ("max_bed_over_penetration_depth", self.max_bed_over_penetration_depth),
            ("max_peak_field_v_per_m", self.max_peak_field_v_per_m),
            ("max_product_temp_c", self.max_product_temp_c),
            ("min_core_to_surface_ratio", self.min_core_to_surface_ratio),
        ]
    }

    /// All rejections.
    pub fn total(&self) -> usize {
        self.entries().iter().map(|(_, count)| count).sum()
    }
}

/// A feasible configuration and its figures (the plan's, see the module documentation).
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Candidate {
    /// Place of the configuration in the space's order (0 first).
    pub index: usize,
    /// The configuration.
    #[serde(flatten)]
    pub configuration: Configuration,
    /// ISM band name, if the frequency is in one.
    pub ism_band: Option<&'static str>,
    /// Class id of the generators (the automatic pick resolved).
    pub generator_class: String,
    /// Rated output of one generator, kW.
    pub generator_rating_kw: f64,
    /// Generators installed (running plus standby).
    pub generator_count: u32,
    /// Generators carrying the load.
    pub running_count: u32,
    /// Output of each running unit over its rating.
    pub operating_fraction: f64,
    /// Belt speed, m/min.
    pub belt_speed_m_per_min: f64,
    /// Time under power, s.
    pub residence_time_s: f64,
    /// Heated length, m.
    pub tunnel_length_m: f64,
    /// Mains power with auxiliaries, kW.
    pub mains_power_kw: f64,
    /// Energy cost per tonne of product in.
    pub energy_cost_per_tonne: f64,
    /// Mains energy per kg of product in, kWh/kg.
    pub specific_energy_kwh_per_kg: f64,
    /// Bed depth over the smallest penetration depth at the inlet and outlet.
    pub bed_over_penetration_depth: Option<f64>,
    /// Highest RMS field in the product over the zones, V/m.
    pub peak_field_v_per_m: Option<f64>,
    /// Energy the hottest product takes over the bed's mean, F = sum_i share_i max_i / mean_i
    /// (module documentation; 1 at RF).
    pub hot_spot_energy_factor: f64,
    /// Hot-spot temperature estimate, degC (module documentation).
    pub hot_spot_temp_c: f64,
    /// Lowest core-to-surface power-density ratio at the inlet and outlet.
    pub core_to_surface_ratio: Option<f64>,
    /// Whether the material data cover the inlet and outlet states in this band (otherwise the
    /// permittivity is extrapolated and the full plan warns `material_data_out_of_range`).
    pub material_data_in_range: bool,
    /// The objective's value (smaller is better).
    pub objective_value: f64,
}

/// Where a configuration sits in the space: an index on each axis.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(crate) struct Point {
    pub band: usize,
    pub class: usize,
    pub redundancy: usize,
    pub zones: usize,
    pub depth: usize,
    pub width: usize,
}

impl Point {
    /// The first point of a non-empty space.
    pub fn first(space: &ResolvedSpace) -> Option<Point> {
        let start = Point { band: 0, class: 0, redundancy: 0, zones: 0, depth: 0, width: 0 };
        if space.configurations_in_band(0) > 0 {
            Some(start)
        } else {
            start.next_band(space)
        }
    }

    /// The next point: the belt width turns fastest, then the bed depth, the zone count, the
    /// redundancy, the class and the band (an odometer).
    pub fn next(self, space: &ResolvedSpace) -> Option<Point> {
        let mut point = self;
        point.width += 1;
        if point.width < space.belt_width_m.len() {
            return Some(point);
        }
        point.width = 0;
        point.depth += 1;
        if point.depth < space.bed_depth_m.len() {
            return Some(point);
        }
        point.depth = 0;
        point.zones += 1;
        if point.zones < space.zones.len() {
            return Some(point);
        }
        point.zones = 0;
        point.redundancy += 1;
        if point.redundancy < space.redundancy.len() {
            return Some(point);
        }
        point.redundancy = 0;
        point.class += 1;
        if point.class < space.bands.get(point.band).map_or(0, |b| b.generator_classes.len()) {
            return Some(point);
        }
        point.next_band(space)
    }

    fn next_band(self, space: &ResolvedSpace) -> Option<Point> {
        ((self.band + 1)..space.bands.len()).find(|band| space.configurations_in_band(*band) > 0).map(|band| Point {
            band,
            class: 0,
            redundancy: 0,
            zones: 0,
            depth: 0,
            width: 0,
        })
    }
}

/// What one evaluation gave.
#[derive(Debug, Clone, PartialEq)]
pub(crate) enum Outcome {
    /// Meets every constraint.
    Feasible(Box<Candidate>),
    /// Failed a check; for `NotPlanned` and `GeneratorSelection` the reason in words.
    Rejected(Rejection, Option<String>),
}

/// The figures of one (band, class, redundancy), copied out for each configuration.
#[derive(Debug, Clone, Copy, PartialEq)]
struct SizingNumbers {
    generator_count: u32,
    running_count: u32,
    generator_rating_kw: f64,
    operating_fraction: f64,
    stable: bool,
    mains_power_kw: f64,
    energy_cost_per_tonne: f64,
    specific_energy_kwh_per_kg: f64,
    penetration_depth_min_m: Option<f64>,
    material_data_in_range: bool,
    tunnel_input: TunnelInput,
    heating_rate_basis_rise_k: f64,
    absorbed_kw: f64,
}

#[derive(Debug, Clone, PartialEq)]
struct Sizing {
    numbers: SizingNumbers,
    class_id: String,
}

#[derive(Debug, Clone, PartialEq)]
struct Failure {
    rejection: Rejection,
    reason: String,
}

/// The figures of one (band, bed depth, zone count).
#[derive(Debug, Clone, Copy, PartialEq)]
struct BedFigures {
    /// The march's peak field at the reference bed volume.
    peak_field_v_per_m: Option<f64>,
    /// W d L of the plan the march ran in, m^3.
    reference_volume_m3: f64,
    hot_spot_energy_factor: f64,
    hot_spot_temp_c: f64,
    core_to_surface_ratio: Option<f64>,
}

/// Evaluates configurations, keeping every part it computed for the next ones.
pub(crate) struct Evaluator {
    base: Scenario,
    product: Product,
    space: ResolvedSpace,
    /// Start of each band's classes in the sizing cache.
    class_offsets: Vec<usize>,
    sizing: Vec<Option<Result<Sizing, Failure>>>,
    beds: HashMap<(usize, usize, usize), Result<BedFigures, String>>,
}

fn joined(errors: &[InputError]) -> String {
    errors.iter().map(ToString::to_string).collect::<Vec<_>>().join("; ")
}

fn all_finite(values: &[f64]) -> bool {
    values.iter().all(|value| value.is_finite())
}

impl Evaluator {
    pub fn new(base: Scenario, product: Product, space: ResolvedSpace) -> Self {
        let mut class_offsets = Vec::with_capacity(space.bands.len());
        let mut classes = 0;
        for band in &space.bands {
            class_offsets.push(classes);
            classes += band.generator_classes.len();
        }
        let sizing = vec![None; classes * space.redundancy.len()];
        Self { base, product, space, class_offsets, sizing, beds: HashMap::new() }
    }

    pub fn space(&self) -> &ResolvedSpace {
        &self.space
    }

    pub fn base(&self) -> &Scenario {
        &self.base
    }

    /// The configuration at a point (the indices come from the space, so they are in range; a
    /// stray index falls back to the first value rather than panicking).
    pub fn configuration(&self, point: &Point) -> Configuration {
        let space = &self.space;
        let band = space.bands.get(point.band);
        Configuration {
            frequency_mhz: band.map_or(self.base.frequency_mhz, |b| b.frequency_mhz),
            class_choice: band.and_then(|b| b.generator_classes.get(point.class)).cloned().unwrap_or(ClassChoice::Auto),
            redundancy: space.redundancy.get(point.redundancy).copied().unwrap_or(Redundancy::N),
            belt_width_m: space.belt_width_m.get(point.width).copied().unwrap_or(self.base.tunnel.belt_width_m),
            bed_depth_m: space.bed_depth_m.get(point.depth).copied().unwrap_or(self.base.tunnel.bed_depth_m),
            zones: space.zones.get(point.zones).copied().unwrap_or(self.base.tunnel.zones),
        }
    }

    fn sizing_slot(&self, point: &Point) -> usize {
        let offset = self.class_offsets.get(point.band).copied().unwrap_or(0);
        (offset + point.class) * self.space.redundancy.len() + point.redundancy
    }

    /// The sizing of a point's (band, class, redundancy), computed on first use.
    fn sizing(&mut self, point: &Point) -> Result<SizingNumbers, Failure> {
        let slot = self.sizing_slot(point);
        if let Some(Some(entry)) = self.sizing.get(slot) {
            return entry.as_ref().map(|sizing| sizing.numbers).map_err(Clone::clone);
        }
        let scenario = configured_scenario(&self.base, &self.configuration(point));
        let entry = match plan_parts(&scenario, &self.product, false) {
            Ok(plan) => sizing_from(&plan).ok_or_else(|| Failure {
                rejection: Rejection::NotPlanned,
                reason: "a sizing figure is not a finite number".into(),
            }),
            Err(errors) => Err(Failure {
                rejection: if errors.iter().any(|e| e.field.starts_with("generator_class")) {
                    Rejection::GeneratorSelection
                } else {
                    Rejection::NotPlanned
                },
                reason: joined(&errors),
            }),
        };
        let result = entry.as_ref().map(|sizing| sizing.numbers).map_err(Clone::clone);
        if let Some(cell) = self.sizing.get_mut(slot) {
            *cell = Some(entry);
        }
        result
    }

    /// The bed figures of a point's (band, depth, zones), computed on first use from a plan of
    /// this configuration.
    fn bed(&mut self, point: &Point) -> Result<BedFigures, String> {
        let key = (point.band, point.depth, point.zones);
        if let Some(entry) = self.beds.get(&key) {
            return entry.clone();
        }
        let scenario = configured_scenario(&self.base, &self.configuration(point));
        let entry = match plan_parts(&scenario, &self.product, true) {
            Ok(plan) => bed_from(&plan, &scenario, &self.product).map_err(|error| error.to_string()),
            Err(errors) => Err(joined(&errors)),
        };
        self.beds.insert(key, entry.clone());
        entry
    }

    /// The class id of a point whose sizing succeeded.
    fn class_id(&self, point: &Point) -> String {
        match self.sizing.get(self.sizing_slot(point)) {
            Some(Some(Ok(sizing))) => sizing.class_id.clone(),
            _ => String::new(),
        }
    }

    /// Evaluate the configuration at `point`, the `index`-th of the space.
    pub fn evaluate(&mut self, point: &Point, index: usize) -> Outcome {
        let sizing = match self.sizing(point) {
            Ok(sizing) => sizing,
            Err(failure) => return Outcome::Rejected(failure.rejection, Some(failure.reason)),
        };
        if !sizing.stable {
            return Outcome::Rejected(
                Rejection::GeneratorSelection,
                Some("the units would run below their stable minimum".into()),
            );
        }
        let configuration = self.configuration(point);
        let (width, depth) = (configuration.belt_width_m, configuration.bed_depth_m);
        let tunnel_input = TunnelInput { belt_width_m: width, bed_depth_m: depth, ..sizing.tunnel_input };
        let tunnel =
            lay_out(&tunnel_input, self.base.throughput_kg_per_h, sizing.absorbed_kw, sizing.heating_rate_basis_rise_k);
        let volume_m3 = width * depth * tunnel.tunnel_length_m;
        if !(all_finite(&[tunnel.tunnel_length_m, tunnel.belt_speed_m_per_min, tunnel.residence_time_s, volume_m3])
            && volume_m3 > 0.0)
        {
            return Outcome::Rejected(Rejection::NotPlanned, Some("the tunnel layout is not finite".into()));
        }
        let constraints = self.space.constraints;
        if constraints.max_tunnel_length_m.is_some_and(|max| tunnel.tunnel_length_m > max) {
            return Outcome::Rejected(Rejection::TunnelLength, None);
        }
        let bed_over_penetration_depth = sizing.penetration_depth_min_m.map(|dp| depth / dp);
        let depth_limit =
            constraints.max_bed_over_penetration_depth.map(|per_face| per_face * f64::from(self.space.fed_faces));
        if let (Some(limit), Some(ratio)) = (depth_limit, bed_over_penetration_depth) {
            if ratio > limit {
                return Outcome::Rejected(Rejection::BedOverPenetrationDepth, None);
            }
        }
        let bed = match self.bed(point) {
            Ok(bed) => bed,
            Err(reason) => return Outcome::Rejected(Rejection::NotPlanned, Some(reason)),
        };
        let peak_field_v_per_m = bed.peak_field_v_per_m.map(|peak| peak * (bed.reference_volume_m3 / volume_m3).sqrt());
        if let (Some(max), Some(peak)) = (constraints.max_peak_field_v_per_m, peak_field_v_per_m) {
            if peak > max {
                return Outcome::Rejected(Rejection::PeakField, None);
            }
        }
        if constraints.max_product_temp_c.is_some_and(|max| bed.hot_spot_temp_c > max) {
            return Outcome::Rejected(Rejection::ProductTemp, None);
        }
        if let (Some(min), Some(ratio)) = (constraints.min_core_to_surface_ratio, bed.core_to_surface_ratio) {
            if ratio < min {
                return Outcome::Rejected(Rejection::CoreToSurface, None);
            }
        }
        let figures = Figures {
            generator_count: sizing.generator_count,
            mains_kw: sizing.mains_power_kw,
            energy_cost_per_tonne: sizing.energy_cost_per_tonne,
            tunnel_length_m: tunnel.tunnel_length_m,
        };
        let objective_value = self.space.objective.value(&figures);
        let optional = [bed_over_penetration_depth, peak_field_v_per_m, bed.core_to_surface_ratio];
        if !(all_finite(&[objective_value, bed.hot_spot_temp_c, bed.hot_spot_energy_factor])
            && optional.iter().flatten().all(|v| v.is_finite()))
        {
            return Outcome::Rejected(Rejection::NotPlanned, Some("a figure is not a finite number".into()));
        }
        Outcome::Feasible(Box::new(Candidate {
            index,
            ism_band: self.space.bands.get(point.band).and_then(|band| band.ism_band),
            configuration,
            generator_class: self.class_id(point),
            generator_rating_kw: sizing.generator_rating_kw,
            generator_count: sizing.generator_count,
            running_count: sizing.running_count,
            operating_fraction: sizing.operating_fraction,
            belt_speed_m_per_min: tunnel.belt_speed_m_per_min,
            residence_time_s: tunnel.residence_time_s,
            tunnel_length_m: tunnel.tunnel_length_m,
            mains_power_kw: sizing.mains_power_kw,
            energy_cost_per_tonne: sizing.energy_cost_per_tonne,
            specific_energy_kwh_per_kg: sizing.specific_energy_kwh_per_kg,
            bed_over_penetration_depth,
            peak_field_v_per_m,
            hot_spot_energy_factor: bed.hot_spot_energy_factor,
            hot_spot_temp_c: bed.hot_spot_temp_c,
            core_to_surface_ratio: bed.core_to_surface_ratio,
            material_data_in_range: sizing.material_data_in_range,
            objective_value,
        }))
    }
}

/// The sizing figures of a plan, or `None` if one is not finite.
fn sizing_from(plan: &Plan) -> Option<Sizing> {
    let numbers = SizingNumbers {
        generator_count: plan.generator_count,
        running_count: plan.generators.running_count,
        generator_rating_kw: plan.generator_rating_kw,
        operating_fraction: plan.generators.operating_fraction,
        stable: plan.generators.operating_fraction >= plan.generators.class.min_operating_fraction,
        mains_power_kw: plan.mains_power_kw,
        energy_cost_per_tonne: plan.utilities.energy_cost_per_tonne,
        specific_energy_kwh_per_kg: plan.specific_energy_kwh_per_kg,
        // The plan's own reduction, so bed / dp is the plan's bed_over_penetration_depth exactly.
        penetration_depth_min_m: [
            plan.dielectric_inlet.penetration_depth_m,
            plan.dielectric_outlet.penetration_depth_m,
        ]
        .into_iter()
        .flatten()
        .reduce(f64::min),
        material_data_in_range: plan.dielectric_inlet.in_range && plan.dielectric_outlet.in_range,
        tunnel_input: plan.assumptions.tunnel,
        heating_rate_basis_rise_k: plan.assumptions.heating_rate_basis_rise_k,
        absorbed_kw: plan.energy_balance.absorbed_kw,
    };
    let finite = all_finite(&[
        numbers.generator_rating_kw,
        numbers.operating_fraction,
        numbers.mains_power_kw,
        numbers.energy_cost_per_tonne,
        numbers.specific_energy_kwh_per_kg,
        numbers.heating_rate_basis_rise_k,
        numbers.absorbed_kw,
        numbers.tunnel_input.bulk_density_kg_per_m3,
    ]) && numbers.penetration_depth_min_m.is_none_or(f64::is_finite);
    finite.then(|| Sizing { numbers, class_id: plan.generator_class.clone() })
}

/// Peak over mean power density through the bed in one zone, read back from the zone's peak
/// field (E_rms = sqrt(p / (2 pi f eps0 eps'')), so p_peak = 2 pi f eps0 eps'' E^2); 1 for a
/// lossless zone or where it cannot be read.
fn peak_to_mean(zone: &Zone, frequency_hz: f64) -> f64 {
    let mean_w_per_m3 = zone.mean_power_density_kw_per_m3 * 1000.0;
    match zone.peak_field_v_per_m {
        Some(field) if mean_w_per_m3 > 0.0 => {
            let ratio = power_density_w_per_m3(frequency_hz, zone.eps_imag, field) / mean_w_per_m3;
            if ratio.is_finite() {
                ratio.max(1.0)
            } else {
                1.0
            }
        }
        _ => 1.0,
    }
}

/// The bed figures from a plan with its depth profiles and zone march.
fn bed_from(plan: &Plan, scenario: &Scenario, product: &Product) -> Result<BedFigures, InputError> {
    let frequency_hz = plan.frequency_mhz * 1e6;
    let zones_kw: f64 = plan.zones.iter().map(|zone| zone.absorbed_kw).sum();
    let hot_spot_energy_factor: f64 = if zones_kw > 0.0 && zones_kw.is_finite() {
        plan.zones.iter().map(|zone| zone.absorbed_kw / zones_kw * peak_to_mean(zone, frequency_hz)).sum()
    } else {
        1.0
    };
    let net_j_per_kg_in = plan.energy_balance.process_kw * 3.6e6 / scenario.throughput_kg_per_h;
    let assumptions = &plan.assumptions;
    let (x_in, x_out) = (assumptions.inlet_moisture_wb, assumptions.outlet_moisture_wb);
    let outlet = OutletState {
        temp_c: scenario.outlet.temp_c,
        moisture_wb: x_out,
        // The balance's own test for drying; dry solids are conserved.
        product_out_per_in: if x_out < x_in { (1.0 - x_in) / (1.0 - x_out) } else { 1.0 },
        evaporation_temp_c: assumptions.evaporation_temp_c,
        latent_heat_j_per_kg: latent_heat_vaporization_j_per_kg(assumptions.evaporation_temp_c)?,
    };
    let hot_spot_temp_c = hot_spot_temp_c(product, &outlet, (hot_spot_energy_factor - 1.0) * net_j_per_kg_in)?;
    Ok(BedFigures {
        peak_field_v_per_m: plan.peak_field_v_per_m,
        // The product order of the zone march's zone volume (W d L / N).
        reference_volume_m3: scenario.tunnel.belt_width_m * scenario.tunnel.bed_depth_m * plan.tunnel.tunnel_length_m,
        hot_spot_energy_factor,
        hot_spot_temp_c,
        core_to_surface_ratio: plan.uniformity.iter().filter_map(|u| u.core_to_surface_ratio).reduce(f64::min),
    })
}

/// The balance's outlet state, where the hot-spot estimate starts.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct OutletState {
    /// Outlet temperature, degC.
    pub temp_c: f64,
    /// Outlet moisture, wet basis.
    pub moisture_wb: f64,
    /// Product out per product in (below 1 when drying).
    pub product_out_per_in: f64,
    /// Evaporation temperature, degC.
    pub evaporation_temp_c: f64,
    /// Latent heat of vaporization there, J/kg.
    pub latent_heat_j_per_kg: f64,
}

/// The temperature of product that reached the outlet state and took `excess_j_per_kg_in` more
/// (per kg of product in), degC: heating towards the evaporation temperature, evaporating its
/// water there, then heating dry (module documentation); capped at the models' 300 degC.
pub fn hot_spot_temp_c(product: &Product, outlet: &OutletState, excess_j_per_kg_in: f64) -> Result<f64, InputError> {
    let enthalpy = |temp_c: f64, moisture_wb: f64| product.material.enthalpy_j_per_kg(temp_c, Some(moisture_wb));
    let top = TEMP_MAX_C;
    let (mut temp_c, moisture) = (outlet.temp_c, outlet.moisture_wb);
    let per_out = excess_j_per_kg_in / outlet.product_out_per_in;
    // Per kg of product at the outlet.
    let mut left = if per_out.is_finite() { per_out.max(0.0) } else { 0.0 };
    if left <= 0.0 {
        return Ok(temp_c);
    }
    if moisture > 0.0 {
        let t_e = outlet.evaporation_temp_c;
        if temp_c < t_e {
            let (h_start, h_end) = (enthalpy(temp_c, moisture)?, enthalpy(t_e, moisture)?);
            if left < h_end - h_start {
                return temperature_at_enthalpy(
                    |t| enthalpy(t, moisture),
                    h_start + left,
                    (temp_c, h_start),
                    (t_e, h_end),
                );
            }
            left -= h_end - h_start;
            temp_c = t_e;
        }
        let evaporate_all = moisture * outlet.latent_heat_j_per_kg;
        if left <= evaporate_all {
            return Ok(temp_c);
        }
        // What is left heats the dry solids, (1 - x) kg of them per kg.
        left = (left - evaporate_all) / (1.0 - moisture);
    }
    let h_start = enthalpy(temp_c, 0.0)?;
    temperature_at_enthalpy(|t| enthalpy(t, 0.0), h_start + left, (temp_c, h_start), (top, enthalpy(top, 0.0)?))
}

#[cfg(test)]
pub(crate) mod tests {
    use super::*;
    use approx::assert_relative_eq;

    /// A candidate with the figures the ranking reads; the rest are placeholders.
    pub(crate) fn candidate(index: usize, count: u32, tunnel_m: f64, mains_kw: f64, objective: f64) -> Candidate {
        Candidate {
            index,
            configuration: Configuration {
                frequency_mhz: 915.0,
                class_choice: ClassChoice::Auto,
                redundancy: Redundancy::N,
                belt_width_m: 1.0,
                bed_depth_m: 0.1,
                zones: 1,
            },
            ism_band: None,
            generator_class: "test".into(),
            generator_rating_kw: 75.0,
            generator_count: count,
            running_count: count,
            operating_fraction: 0.8,
            belt_speed_m_per_min: 1.0,
            residence_time_s: 60.0,
            tunnel_length_m: tunnel_m,
            mains_power_kw: mains_kw,
            energy_cost_per_tonne: mains_kw / 10.0,
            specific_energy_kwh_per_kg: 0.1,
            bed_over_penetration_depth: None,
            peak_field_v_per_m: None,
            hot_spot_energy_factor: 1.0,
            hot_spot_temp_c: 20.0,
            core_to_surface_ratio: None,
            material_data_in_range: true,
            objective_value: objective,
        }
    }

    fn constant_product() -> Product {
        crate::plan::product::by_hand_constant_product()
    }

    fn outlet(temp_c: f64, moisture_wb: f64, product_out_per_in: f64) -> OutletState {
        OutletState {
            temp_c,
            moisture_wb,
            product_out_per_in,
            evaporation_temp_c: 100.0,
            latent_heat_j_per_kg: 2.257e6,
        }
    }

    #[test]
    fn hot_spot_heats_then_boils_then_heats_dry_by_hand() {
        let product = constant_product();
        let moist = outlet(70.0, 0.5, 1.0);
        // No excess: the outlet exactly; 40 kJ/kg at 2000 J/(kg K): 20 K more (by hand).
        assert_eq!(hot_spot_temp_c(&product, &moist, 0.0).unwrap(), 70.0);
        assert_eq!(hot_spot_temp_c(&product, &moist, f64::NAN).unwrap(), 70.0);
        assert_relative_eq!(hot_spot_temp_c(&product, &moist, 40_000.0).unwrap(), 90.0, epsilon = 1e-6);
        // 60 kJ/kg reaches 100 degC; then 0.5 x 2.257 MJ/kg boils the water off at 100 degC.
        assert_eq!(hot_spot_temp_c(&product, &moist, 500_000.0).unwrap(), 100.0);
        // 20 kJ/kg beyond that heats 0.5 kg of dry solids: 20000 / 0.5 / 2000 = 20 K (by hand).
        let beyond = 60_000.0 + 0.5 * 2.257e6 + 20_000.0;
        assert_relative_eq!(hot_spot_temp_c(&product, &moist, beyond).unwrap(), 120.0, epsilon = 1e-6);
        // Far past: capped at the models' 300 degC.
        assert_eq!(hot_spot_temp_c(&product, &moist, 1e9).unwrap(), 300.0);
    }

    #[test]
    fn hot_spot_of_a_dry_or_a_dried_product_by_hand() {
        let product = constant_product();
        // Dry: sensible only, 20 kJ/kg -> 10 K.
        assert_relative_eq!(
            hot_spot_temp_c(&product, &outlet(200.0, 0.0, 1.0), 20_000.0).unwrap(),
            210.0,
            epsilon = 1e-6
        );
        // Dried to 0.2 from 0.5: 0.625 kg out per kg in, so 12.5 kJ per kg in is 20 kJ per kg out
        // (by hand): 10 K below the boiling point.
        assert_relative_eq!(
            hot_spot_temp_c(&product, &outlet(80.0, 0.2, 0.625), 12_500.0).unwrap(),
            90.0,
            epsilon = 1e-6
        );
        // Leaving above the boiling point with water left: held there while it boils.
        assert_eq!(hot_spot_temp_c(&product, &outlet(120.0, 0.2, 0.625), 100_000.0).unwrap(), 120.0);
    }

    #[test]
    fn rejection_counts_add_up_and_keep_their_names() {
        let mut counts = RejectionCounts::default();
        for rejection in [Rejection::NotPlanned, Rejection::PeakField, Rejection::PeakField, Rejection::CoreToSurface] {
            counts.add(rejection);
        }
        assert_eq!(counts.total(), 4);
        assert_eq!(counts.max_peak_field_v_per_m, 2);
        let json = serde_json::to_value(counts).unwrap();
        for (name, count) in counts.entries() {
            assert_eq!(json[name], count, "{name}");
        }
    }
}
