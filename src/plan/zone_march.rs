//! The zone march: the product's temperature, moisture and frozen fraction advanced zone by zone
//! along the tunnel, with its permittivity looked up again at each zone's state, so that the power
//! each zone absorbs follows the product as it changes.
//!
//! # The distribution (microwave: a cavity of many passes)
//!
//! The total power the product absorbs is the energy balance's, P_abs (sizing::energy_balance):
//! the march does not change it, it distributes it. Each of the N zones receives the same forward
//! power; zone i turns a fraction eta_i of it into heat in the product, so
//!
//! ```text
//! P_i = P_abs eta_i / sum_j eta_j          (sum_i P_i = P_abs: energy is conserved exactly)
//! eta = a / (a + w (1 - a))                cavity coupling after a geometric series of passes
//! ```
//!
//! where a is the load's single-pass absorptance at the zone's state and w the fraction of the
//! power left after a pass that the walls, chokes and openings (the feed port included) take
//! before the next pass. The series: the load takes a; of the (1 - a) that passes, w is lost and
//! (1 - w)(1 - a) comes back for another pass, so the load takes a sum_k [(1 - a)(1 - w)]^k.
//! This is the loaded-Q form of an applicator's efficiency, eta = 1 - Q_L / Q_0 (Metaxas &
//! Meredith, *Industrial Microwave Heating*, IEE 1983, ch. 5 on applicator efficiency and Q
//! factors; from memory), with a standing for 1/Q of the load and w for 1/Q of the empty cavity.
//! a comes from the layered solution through the bed at the zone's permittivity
//! (plan::depth_profile, physics::layers: slab absorption with the surface reflection, the tray,
//! the belt and the backing; normal incidence). w = [`WALL_LOSS_PER_PASS`] = 0.03 is a stated
//! default for a metal tunnel with chokes (common practice, from memory), not a measurement. The
//! mean coupling sum eta_i / N is what the cavity model gives for the applicator efficiency; the
//! plan keeps the scenario's assumed efficiency for the forward power and warns when the model
//! falls well short of it ([`COUPLING_SHORTFALL`]).
//!
//! # The distribution (RF: capacitive applicators)
//!
//! Below [`RF_CAPACITIVE_BELOW_MHZ`] the applicator is a pair of electrodes, not a cavity, and the
//! bed is a small fraction of a wavelength thick (11 m at 27.12 MHz): the plane-wave passes above
//! do not describe it. There every zone gets P_abs / N, its coupling is reported as the scenario's
//! applicator efficiency, no single-pass absorptance is given, and the field in the bed is taken
//! as even through its depth (peak-to-mean ratio 1). How the power would follow eps'' between
//! electrodes depends on the electrode gap, which the scenario does not give.
//!
//! # The states: enthalpy along the balance's path
//!
//! Each zone adds its net energy per kg of product in, q_i = (P_i / P_abs) e_process, with
//! e_process the balance's process heat per kg (the loss allowances are taken off in proportion:
//! net = absorbed x process / absorbed). The march follows the balance's stated path:
//!
//! 1. heat the wet product from T_in to the evaporation temperature T_e (to T_out when nothing
//!    dries): T from H(T, x_in) = H(T_in, x_in) + e, inverted by a bracketed root search (the
//!    Illinois variant of regula falsi: it keeps the bisection's bracket and guarantee and needs a
//!    handful of evaluations; H rises monotonically in T, latent heat of ice included);
//! 2. evaporate at T_e: the water removed per kg in is w = e / h_fg(T_e), the moisture
//!    x = (x_in - w) / (1 - w) (wet basis, water left over mass left);
//! 3. heat the dried product from T_e to T_out: H(T, x_out) per kg of product out, counted only
//!    when T_out > T_e (a product leaving cooler than T_e leaves the last zone at T_e, as in the
//!    balance). A product entering hotter than T_e flashes at the inlet: its excess heat evaporates
//!    water as it enters, as the balance credits it, and that water counts in the first zone.
//!
//! The permittivity of a zone is taken at its energy midpoint: with steady power along a zone the
//! product's energy rises linearly in time there, so this is the state the zone holds on average
//! over the product's stay.
//!
//! # The fixed point
//!
//! eta_i depends on the states and the states on the distribution, so the march starts from an
//! even split and repeats: states, couplings, new split, until no zone's share moves by more than
//! [`DISTRIBUTION_TOLERANCE`] of the mean share, or [`PASSES_MAX`] passes. When the properties do
//! not change along the tunnel every eta_i is equal, one pass suffices, every zone gets P_abs / N
//! and the last zone leaves at the balance's outlet state. The reported permittivities and
//! couplings are those of the last pass; the states are advanced with the final split. A
//! permittivity met before (a constant or flat-table product) is not solved again.
//!
//! # Per zone, besides the state
//!
//! - Peak field: the mean power density in the zone's bed volume, times the layered profile's
//!   peak-to-mean ratio through the depth (max p over mean p in the product), converted with
//!   E_rms = sqrt(p / (2 pi f eps0 eps'')) (physics::heating). The depth profile has 41 samples
//!   per layer (plan::depth_profile), so a standing-wave crest between samples is missed: the
//!   peak is a lower bound in deep, wet beds at 2450 MHz.
//! - Runaway: a zone in which the temperature rises is flagged when eps'' at the zone's moisture
//!   rises with temperature faster than [`RUNAWAY_SLOPE_PER_K`] (relative, per kelvin) across the
//!   zone's temperature range widened to at least [`RUNAWAY_WINDOW_K`] and out to whole kelvins
//!   (so the flag does not depend on how finely the tunnel is divided, and neighbouring zones
//!   share their lookups). Zones that only evaporate are not flagged: their temperature is held
//!   at T_e while water remains.
//!
//! # Validity
//!
//! One-dimensional: the bed is taken to cover the belt and to be fed at normal incidence; a narrow
//! profile in a wide tunnel intercepts less than the slab model says. No conduction between zones
//! or through the depth, no surface cooling distributed along the tunnel (the allowances are
//! taken off in proportion), no moisture gradient through the bed.

use super::depth_profile::Bed;
use super::product::{Product, ProductPermittivity};
use super::warnings::Warning;
use super::Zone;
use crate::error::InputError;
use crate::materials::{EnthalpyCurve, TEMP_MAX_C, TEMP_MIN_C};
use crate::physics::heating::field_for_power_density_v_per_m;
use crate::physics::permittivity::ComplexPermittivity;
use crate::physics::waves::penetration_depth_m;
use crate::scenario::Scenario;
use crate::sizing::energy_balance::EnergyBalance;
use crate::sizing::tunnel::Tunnel;
use serde::Serialize;
use std::cell::RefCell;
use std::collections::HashMap;
use std::hash::{BuildHasherDefault, Hasher};

/// Fraction of the power left after a pass that the walls, chokes and openings of a metal tunnel
/// take before the next pass (common practice, from memory: a few per cent for a closed metal
/// applicator with chokes). A stated default, not a measurement.
pub const WALL_LOSS_PER_PASS: f64 = 0.03;
/// Below this frequency the applicator is taken as capacitive (electrodes), not a cavity, MHz: the
/// conventional lower edge of the microwave range.
pub const RF_CAPACITIVE_BELOW_MHZ: f64 = 300.0;
/// The split has converged when no zone's share moves by more than this fraction of the mean
/// share between passes (0.1 %: well inside the uncertainty of any permittivity data).
pub const DISTRIBUTION_TOLERANCE: f64 = 1e-3;
/// Most passes of the fixed point; lossy loads converge in two or three.
pub const PASSES_MAX: u32 = 8;
/// Width of bracket at which the enthalpy inversion stops, K.
pub const TEMPERATURE_TOLERANCE_K: f64 = 1e-9;
/// Relative rise of eps'' per kelvin above which a zone is flagged for runaway (1 %/K: eps''
/// doubling within 70 K; a planning threshold of our own, common practice in spirit, not a
/// published criterion).
pub const RUNAWAY_SLOPE_PER_K: f64 = 0.01;
/// Narrowest temperature window over which a zone's eps'' slope is taken, K.
pub const RUNAWAY_WINDOW_K: f64 = 1.0;
/// The cavity model's mean coupling is "well below" the assumed applicator efficiency when it
/// falls short by more than this (5 percentage points; common practice for a planning margin).
pub const COUPLING_SHORTFALL: f64 = 0.05;

/// Everything the march needs from the plan.
#[derive(Debug, Clone, Copy)]
pub struct MarchInput<'a> {
    /// The scenario (tunnel, feed, load stack, zones).
    pub scenario: &'a Scenario,
    /// The product (permittivity and enthalpy).
    pub product: &'a Product,
    /// The energy balance whose absorbed power is distributed.
    pub energy: &'a EnergyBalance,
    /// The tunnel layout (length, mean power density).
    pub tunnel: &'a Tunnel,
    /// Operating frequency, Hz.
    pub frequency_hz: f64,
    /// Moisture in, wet basis.
    pub inlet_moisture_wb: f64,
    /// Moisture out, wet basis.
    pub outlet_moisture_wb: f64,
    /// Evaporation temperature, degC.
    pub evaporation_temp_c: f64,
    /// Latent heat of vaporization there, J/kg.
    pub latent_heat_j_per_kg: f64,
    /// The applicator efficiency the scenario assumes (forward to absorbed).
    pub applicator_efficiency: f64,
}

/// How the march distributed the power, for the plan's record.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ZoneModel {
    /// `cavity` (microwave, geometric series of passes) or `capacitive` (RF, even split).
    pub applicator: &'static str,
    /// The model in one sentence, with its source.
    pub description: &'static str,
    /// Wall and opening loss per pass used (cavity only).
    pub wall_loss_per_pass: Option<f64>,
    /// Mean coupling over the zones: the applicator efficiency the model gives.
    pub mean_coupling: f64,
    /// The applicator efficiency the scenario assumes, for comparison.
    pub assumed_applicator_efficiency: f64,
    /// Passes of the fixed point made.
    pub passes: u32,
    /// Whether the split settled within the tolerance.
    pub converged: bool,
    /// The tolerance on the split, as a fraction of the mean share.
    pub distribution_tolerance: f64,
    /// Sum of the zones' absorbed power, kW (equals the balance's absorbed power).
    pub zones_absorbed_sum_kw: f64,
    /// Temperature leaving the last zone, degC.
    pub outlet_temp_c: f64,
    /// Moisture leaving the last zone, wet basis.
    pub outlet_moisture_wb: f64,
    /// Zones flagged for runaway (loss factor rising with temperature), by index.
    pub runaway_zones: Vec<u32>,
}

/// The zones and the record of how they were computed.
#[derive(Debug, Clone, PartialEq)]
pub struct ZoneMarch {
    /// One entry per zone, inlet first.
    pub zones: Vec<Zone>,
    /// The distribution model and its outcome.
    pub model: ZoneModel,
}

/// Coupling of a cavity: the fraction of the forward power the load absorbs over all passes,
/// eta = a / (a + w (1 - a)) for single-pass absorptance `a` and wall loss per pass `w` (both
/// clamped to 0..1). A lossless load couples nothing (0), also in a lossless cavity.
pub fn cavity_coupling(single_pass_absorptance: f64, wall_loss_per_pass: f64) -> f64 {
    let a = clean_fraction(single_pass_absorptance);
    let w = clean_fraction(wall_loss_per_pass);
    let denominator = a + w * (1.0 - a);
    if denominator > 0.0 {
        (a / denominator).min(1.0)
    } else {
        0.0
    }
}

fn clean_fraction(value: f64) -> f64 {
    if value.is_finite() {
        value.clamp(0.0, 1.0)
    } else {
        0.0
    }
}

/// Whether a frequency is served by a capacitive (RF) applicator in this model.
pub fn is_capacitive(frequency_hz: f64) -> bool {
    frequency_hz < RF_CAPACITIVE_BELOW_MHZ * 1e6
}

/// Where the product is on the balance's path.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Stage {
    Heating,
    Evaporating,
    HeatingDried,
}

impl Stage {
    fn name(self) -> &'static str {
        match self {
            Stage::Heating => "heating",
            Stage::Evaporating => "evaporating",
            Stage::HeatingDried => "heating_dried",
        }
    }
}

/// The product at one point of the path.
#[derive(Debug, Clone, Copy, PartialEq)]
struct Point {
    temp_c: f64,
    moisture_wb: f64,
    /// Water evaporated so far per kg of product in.
    water_removed_per_kg_in: f64,
    stage: Stage,
}

/// The balance's path, parametrised by the net energy e added per kg of product in, J/kg.
struct Path<'a> {
    /// H(T) of the wet product (x_in), and of the dried product (x_out; x_in when nothing dries),
    /// prepared once for the root searches.
    wet_enthalpy: EnthalpyCurve<'a>,
    dried_enthalpy: EnthalpyCurve<'a>,
    drying: bool,
    inlet_temp_c: f64,
    inlet_moisture_wb: f64,
    evaporation_temp_c: f64,
    outlet_temp_c: f64,
    outlet_moisture_wb: f64,
    latent_heat_j_per_kg: f64,
    /// H(T_in, x_in).
    inlet_enthalpy: f64,
    /// H(T_e, x_out), per kg of dried product.
    dried_enthalpy_at_evaporation: f64,
    /// Stage 1 per kg in (may be negative: a product entering above T_e flashes).
    heat_one: f64,
    /// Stage 2 per kg in.
    evaporate: f64,
    /// Stage 3 per kg in (0 or more).
    heat_three: f64,
    /// Product out per product in.
    out_per_in: f64,
    /// Water evaporated per kg in over the whole path.
    water_total: f64,
}

impl<'a> Path<'a> {
    fn new(input: &MarchInput<'a>) -> Result<Self, InputError> {
        let scenario = input.scenario;
        let product = input.product;
        let (x_in, x_out) = (input.inlet_moisture_wb, input.outlet_moisture_wb);
        // The balance's own test for drying.
        let drying = x_out < x_in;
        let enthalpy = |temp_c: f64, moisture: f64| product.material.enthalpy_j_per_kg(temp_c, Some(moisture));
        let (t_in, t_out, t_e) = (scenario.inlet.temp_c, scenario.outlet.temp_c, input.evaporation_temp_c);
        let inlet_enthalpy = enthalpy(t_in, x_in)?;
        let outlet_moisture_wb = if drying { x_out } else { x_in };
        // (heat_one, evaporate, dried_enthalpy_at_evaporation, heat_three, out_per_in, water_total)
        let stages = if drying {
            let out_per_in = (1.0 - x_in) / (1.0 - x_out);
            let water_total = 1.0 - out_per_in;
            let heat_one = enthalpy(t_e, x_in)? - inlet_enthalpy;
            let evaporate = water_total * input.latent_heat_j_per_kg;
            let dried_enthalpy_at_evaporation = enthalpy(t_e, x_out)?;
            let heat_three = out_per_in * (enthalpy(t_out, x_out)? - dried_enthalpy_at_evaporation).max(0.0);
            (heat_one, evaporate, dried_enthalpy_at_evaporation, heat_three, out_per_in, water_total)
        } else {
            (enthalpy(t_out, x_in)? - inlet_enthalpy, 0.0, 0.0, 0.0, 1.0, 0.0)
        };
        let (heat_one, evaporate, dried_enthalpy_at_evaporation, heat_three, out_per_in, water_total) = stages;
        Ok(Path {
            // Both moistures have just been read through the same checks, so neither can fail here.
            wet_enthalpy: product.material.enthalpy_curve(Some(x_in))?,
            dried_enthalpy: product.material.enthalpy_curve(Some(outlet_moisture_wb))?,
            drying,
            inlet_temp_c: t_in,
            inlet_moisture_wb: x_in,
            evaporation_temp_c: t_e,
            outlet_temp_c: t_out,
            outlet_moisture_wb,
            latent_heat_j_per_kg: input.latent_heat_j_per_kg,
            inlet_enthalpy,
            dried_enthalpy_at_evaporation,
            heat_one,
            evaporate,
            heat_three,
            out_per_in,
            water_total,
        })
    }

    /// Net energy per kg in over the whole path (the balance's process heat per kg), J/kg.
    fn total(&self) -> f64 {
        let total = self.heat_one + self.evaporate + self.heat_three;
        if total.is_finite() {
            total.max(0.0)
        } else {
            0.0
        }
    }

    /// Where the product is after `energy` J per kg in, before any temperature is searched for.
    fn place(&self, energy: f64) -> Place {
        let energy = energy.clamp(0.0, self.total());
        // The first heating stage: all of the path when nothing dries, else up to the boiling point.
        if !self.drying || (self.heat_one > 0.0 && energy < self.heat_one) {
            return Place::Heating { enthalpy: self.inlet_enthalpy + energy };
        }
        // From here on energy - heat_one >= 0, also when heat_one < 0 (the flash at the inlet).
        let after_heating = energy - self.heat_one;
        if after_heating < self.evaporate || self.heat_three <= 0.0 {
            let water = (after_heating / self.latent_heat_j_per_kg).clamp(0.0, self.water_total);
            let moisture = ((self.inlet_moisture_wb - water) / (1.0 - water)).max(self.outlet_moisture_wb);
            return Place::Evaporating(Point {
                temp_c: self.evaporation_temp_c,
                moisture_wb: moisture,
                water_removed_per_kg_in: water,
                stage: Stage::Evaporating,
            });
        }
        let dried = (after_heating - self.evaporate).min(self.heat_three);
        Place::HeatingDried { enthalpy: self.dried_enthalpy_at_evaporation + dried / self.out_per_in }
    }

    /// The product after `energy` J per kg in.
    fn at(&self, energy: f64) -> Result<Point, InputError> {
        match self.place(energy) {
            Place::Heating { enthalpy } => {
                let stage_end_c = if self.drying { self.evaporation_temp_c } else { self.outlet_temp_c };
                let temp_c = temperature_at_enthalpy(
                    |temp_c| self.wet_enthalpy.enthalpy_j_per_kg(temp_c),
                    enthalpy,
                    (self.inlet_temp_c, self.inlet_enthalpy),
                    (stage_end_c, self.inlet_enthalpy + self.heat_one),
                )?;
                Ok(Point {
                    temp_c,
                    moisture_wb: self.inlet_moisture_wb,
                    water_removed_per_kg_in: 0.0,
                    stage: Stage::Heating,
                })
            }
            Place::Evaporating(point) => Ok(point),
            Place::HeatingDried { enthalpy } => {
                let dried_enthalpy = self.dried_enthalpy_at_evaporation;
                let temp_c = temperature_at_enthalpy(
                    |temp_c| self.dried_enthalpy.enthalpy_j_per_kg(temp_c),
                    enthalpy,
                    (self.evaporation_temp_c, dried_enthalpy),
                    (self.outlet_temp_c, dried_enthalpy + self.heat_three / self.out_per_in),
                )?;
                Ok(Point {
                    temp_c,
                    moisture_wb: self.outlet_moisture_wb,
                    water_removed_per_kg_in: self.water_total,
                    stage: Stage::HeatingDried,
                })
            }
        }
    }

    /// The stage and the moisture after `energy` J per kg in: what [`Path::at`] gives for them,
    /// without the temperature search.
    fn stage_at(&self, energy: f64) -> StageAt {
        match self.place(energy) {
            Place::Heating { .. } => StageAt { stage: Stage::Heating, moisture_wb: self.inlet_moisture_wb },
            Place::Evaporating(point) => StageAt { stage: point.stage, moisture_wb: point.moisture_wb },
            Place::HeatingDried { .. } => StageAt { stage: Stage::HeatingDried, moisture_wb: self.outlet_moisture_wb },
        }
    }
}

/// Where on the path a product is ([`Path::place`]).
enum Place {
    /// Heating the wet product, to this enthalpy per kg, J/kg.
    Heating { enthalpy: f64 },
    /// Evaporating at T_e: the state needs no search.
    Evaporating(Point),
    /// Heating the dried product, to this enthalpy per kg of dried product, J/kg.
    HeatingDried { enthalpy: f64 },
}

/// The stage and moisture of a state without its temperature.
#[derive(Debug, Clone, Copy, PartialEq)]
struct StageAt {
    stage: Stage,
    moisture_wb: f64,
}

/// The temperature between `start.0` and `end.0` at which the rising function `enthalpy` reaches
/// `target`, given its values `start.1` and `end.1` at the two ends; a target outside them gives
/// the nearer end (and a stage of no width its start). Illinois regula falsi: each step keeps a
/// bracket, so it cannot fail to converge, and the stale end's value is halved so the bracket
/// shrinks from both sides.
pub fn temperature_at_enthalpy(
    enthalpy: impl Fn(f64) -> Result<f64, InputError>,
    target: f64,
    start: (f64, f64),
    end: (f64, f64),
) -> Result<f64, InputError> {
    let ((mut low, h_low), (mut high, h_high)) = (start, end);
    let mut f_low = h_low - target;
    if high <= low || high.is_nan() || f_low >= 0.0 {
        return Ok(low);
    }
    let mut f_high = h_high - target;
    if f_high <= 0.0 {
        return Ok(high);
    }
    // 1e-9 K of a bracket or 1e-6 J/kg of enthalpy (about 2.5e-10 K of water), whichever first.
    const ENTHALPY_TOLERANCE_J_PER_KG: f64 = 1e-6;
    let mut side = 0_i8;
    let mut estimate = 0.5 * (low + high);
    for _ in 0..200 {
        if high - low <= TEMPERATURE_TOLERANCE_K {
            break;
        }
        let mut next = high - f_high * (high - low) / (f_high - f_low);
        if !(next > low && next < high) {
            next = 0.5 * (low + high);
        }
        estimate = next;
        let f_next = enthalpy(next)? - target;
        if f_next.abs() <= ENTHALPY_TOLERANCE_J_PER_KG {
            break;
        }
        if f_next < 0.0 {
            low = next;
            f_low = f_next;
            if side == -1 {
                f_high *= 0.5;
            }
            side = -1;
        } else {
            high = next;
            f_high = f_next;
            if side == 1 {
                f_low *= 0.5;
            }
            side = 1;
        }
        estimate = 0.5 * (low + high);
    }
    Ok(estimate)
}

/// The permittivity and coupling of one zone at its mean state.
#[derive(Debug, Clone, Copy)]
struct Optics {
    eps: ComplexPermittivity,
    coupling: f64,
    single_pass_absorptance: Option<f64>,
    /// Peak over mean power density through the bed; `None` for a lossless product.
    peak_to_mean: Option<f64>,
}

struct Marcher<'a> {
    input: MarchInput<'a>,
    path: Path<'a>,
    /// The product's permittivity at the inlet and at the outlet moisture (the same when nothing
    /// dries): every zone of a heating stage is at one of the two.
    permittivity_at: [ProductPermittivity<'a>; 2],
    capacitive: bool,
    /// The bed's stack, built once for all zones and passes.
    bed: Bed,
    /// Layered solutions by permittivity: a product whose permittivity does not change along the
    /// tunnel (a constant or a flat table) is solved once, not once per zone and pass.
    optics_by_eps: HashMap<(u64, u64), Optics, BitsHash>,
    /// eps'' on the whole-kelvin grid of the runaway windows, by (moisture, temperature).
    loss_on_grid: RefCell<HashMap<(u64, i32), f64, BitsHash>>,
}

/// The hasher of the march's lookups, keyed by the bits of numbers it computed itself (no key
/// comes from outside, so nothing needs the default hasher's resistance to chosen keys, and its
/// cost was a few per cent of a 200-zone plan): a multiply-rotate mix of each word (the FxHash
/// step), folded so that the high bits reach the low ones.
#[derive(Debug, Default, Clone, Copy)]
struct BitsHasher(u64);

type BitsHash = BuildHasherDefault<BitsHasher>;

impl BitsHasher {
    const MULTIPLIER: u64 = 0x517c_c1b7_2722_0a95;

    fn add(&mut self, word: u64) {
        self.0 = (self.0.rotate_left(5) ^ word).wrapping_mul(Self::MULTIPLIER);
    }
}

impl Hasher for BitsHasher {
    fn write(&mut self, bytes: &[u8]) {
        for chunk in bytes.chunks(8) {
            let mut word = [0_u8; 8];
            word[..chunk.len()].copy_from_slice(chunk);
            self.add(u64::from_le_bytes(word));
        }
    }

    fn write_u64(&mut self, word: u64) {
        self.add(word);
    }

    fn write_i32(&mut self, word: i32) {
        self.add(u64::from(word as u32));
    }

    fn finish(&self) -> u64 {
        self.0 ^ (self.0 >> 32)
    }
}

/// Boundary states (N + 1, inlet first) and the stages at the energy midpoints (N) for a split.
struct States {
    boundaries: Vec<Point>,
    midpoints: Vec<StageAt>,
}

/// The net energy per kg in at the start and at the end of each zone for a split, J/kg: the
/// running sum of the shares of `total`, the last end being `total` exactly, whatever the rounding
/// of the sum.
fn zone_energies(shares: &[f64], total: f64) -> impl Iterator<Item = (f64, f64)> + '_ {
    let mut cumulative = 0.0;
    shares.iter().enumerate().map(move |(index, share)| {
        let before = cumulative;
        cumulative += share * total;
        if index + 1 == shares.len() {
            cumulative = total;
        }
        (before, cumulative)
    })
}

impl Marcher<'_> {
    /// The energy-midpoint states of a split (all a pass needs; the boundaries are worked out
    /// once, for the final split, by [`Marcher::states`]).
    fn midpoints(&self, shares: &[f64]) -> Result<Vec<Point>, InputError> {
        zone_energies(shares, self.path.total()).map(|(before, after)| self.path.at(0.5 * (before + after))).collect()
    }

    /// The final split's boundaries, and the stages at its midpoints (the zones read no midpoint
    /// temperature: their permittivities are those of the pass before).
    fn states(&self, shares: &[f64]) -> Result<States, InputError> {
        let total = self.path.total();
        let mut boundaries = Vec::with_capacity(shares.len() + 1);
        boundaries.push(self.path.at(0.0)?);
        for (_, after) in zone_energies(shares, total) {
            boundaries.push(self.path.at(after)?);
        }
        let midpoints =
            zone_energies(shares, total).map(|(before, after)| self.path.stage_at(0.5 * (before + after))).collect();
        Ok(States { boundaries, midpoints })
    }

    /// The product's permittivity at a state (`Product::permittivity_value`, bit for bit).
    fn permittivity(&self, temp_c: f64, moisture_wb: f64) -> Result<ComplexPermittivity, InputError> {
        let input = &self.input;
        match self.permittivity_at.iter().find(|curve| curve.moisture_wb().to_bits() == moisture_wb.to_bits()) {
            Some(curve) => curve.value(input.frequency_hz, temp_c),
            None => input.product.permittivity_value(input.frequency_hz, temp_c, moisture_wb),
        }
    }

    fn optics(&mut self, point: &Point) -> Result<Optics, InputError> {
        let eps = self.permittivity(point.temp_c, point.moisture_wb)?;
        let key = (eps.eps_real.to_bits(), eps.eps_imag.to_bits());
        if let Some(optics) = self.optics_by_eps.get(&key) {
            return Ok(*optics);
        }
        let optics = self.optics_uncached(eps)?;
        self.optics_by_eps.insert(key, optics);
        Ok(optics)
    }

    fn optics_uncached(&mut self, eps: ComplexPermittivity) -> Result<Optics, InputError> {
        let input = &self.input;
        if self.capacitive {
            return Ok(Optics {
                eps,
                coupling: input.applicator_efficiency,
                single_pass_absorptance: None,
                peak_to_mean: (eps.eps_imag > 0.0).then_some(1.0),
            });
        }
        let optics = self.bed.optics(input.frequency_hz, eps)?;
        let absorptance = clean_fraction(optics.product_absorptance);
        let bed_m = input.scenario.tunnel.bed_depth_m;
        // Mean of p / S_inc over the product is its absorptance over its thickness.
        let peak_to_mean = optics
            .max_product_power_density_per_m
            .filter(|_| absorptance > 0.0)
            .map(|max| (max * bed_m / absorptance).max(1.0))
            .filter(|ratio| ratio.is_finite());
        Ok(Optics {
            eps,
            coupling: cavity_coupling(absorptance, WALL_LOSS_PER_PASS),
            single_pass_absorptance: Some(absorptance),
            peak_to_mean,
        })
    }

    /// Whether eps'' rises faster than the runaway threshold across the zone. The window is the
    /// zone's temperature range widened to at least [`RUNAWAY_WINDOW_K`] and out to whole kelvins,
    /// so that neighbouring zones share their lookups (a fine division costs no more lookups than
    /// the kelvins the product crosses).
    fn runaway(&self, entry: &Point, exit: &Point, mid: &StageAt) -> Result<bool, InputError> {
        let span = exit.temp_c - entry.temp_c;
        if span.is_nan() || span <= TEMPERATURE_TOLERANCE_K {
            return Ok(false);
        }
        let centre = 0.5 * (entry.temp_c + exit.temp_c);
        let half = 0.5 * RUNAWAY_WINDOW_K;
        let low = (entry.temp_c.min(centre - half)).floor().max(TEMP_MIN_C);
        let high = (exit.temp_c.max(centre + half)).ceil().min(TEMP_MAX_C);
        if high <= low || high.is_nan() {
            return Ok(false);
        }
        let (loss_low, loss_high) = (self.loss_at(low, mid.moisture_wb)?, self.loss_at(high, mid.moisture_wb)?);
        if loss_high <= loss_low {
            return Ok(false);
        }
        if loss_low <= 0.0 {
            return Ok(true);
        }
        Ok((loss_high - loss_low) / (loss_low * (high - low)) > RUNAWAY_SLOPE_PER_K)
    }

    /// eps'' at a whole-kelvin temperature and a moisture, looked up once.
    fn loss_at(&self, temp_c: f64, moisture_wb: f64) -> Result<f64, InputError> {
        // temp_c is a whole number within -60..300 here, so the cast is exact.
        let key = (moisture_wb.to_bits(), temp_c as i32);
        if let Some(loss) = self.loss_on_grid.borrow().get(&key) {
            return Ok(*loss);
        }
        let loss = self.permittivity(temp_c, moisture_wb)?.eps_imag;
        self.loss_on_grid.borrow_mut().insert(key, loss);
        Ok(loss)
    }
}

/// March along the tunnel. See the module documentation for the model.
pub fn march(input: &MarchInput) -> Result<ZoneMarch, InputError> {
    let count = input.scenario.tunnel.zones.clamp(1, 100_000) as usize;
    let mut marcher = Marcher {
        input: *input,
        path: Path::new(input)?,
        permittivity_at: [
            input.product.permittivity_curve(input.inlet_moisture_wb),
            input.product.permittivity_curve(input.outlet_moisture_wb),
        ],
        capacitive: is_capacitive(input.frequency_hz),
        bed: Bed::new(input.scenario),
        // Room for a pass's zones at once, so the map does not regrow zone by zone.
        optics_by_eps: HashMap::with_capacity_and_hasher(count.min(4096), BitsHash::default()),
        loss_on_grid: RefCell::new(HashMap::default()),
    };
    let absorbed_kw = input.energy.absorbed_kw;
    let even = 1.0 / count as f64;
    let mut shares = vec![even; count];
    let mut passes = 0;
    let mut converged = false;
    let mut optics: Vec<Optics>;
    // Each pass takes the optics at the midpoints of `shares`, then moves `shares` on: the final
    // optics belong to the split before the final one.
    loop {
        passes += 1;
        let midpoints = marcher.midpoints(&shares)?;
        optics = midpoints.iter().map(|point| marcher.optics(point)).collect::<Result<_, _>>()?;
        if marcher.capacitive {
            // The split does not depend on the state: one pass is the answer.
            converged = true;
            break;
        }
        let coupling_sum: f64 = optics.iter().map(|o| o.coupling).sum();
        let next: Vec<f64> = if coupling_sum > 0.0 && coupling_sum.is_finite() {
            optics.iter().map(|o| o.coupling / coupling_sum).collect()
        } else {
            // A lossless product couples nowhere: keep the even split (the plan warns).
            vec![even; count]
        };
        let largest_move = next.iter().zip(&shares).map(|(new, old)| (new - old).abs()).fold(0.0, f64::max) / even;
        shares = next;
        if largest_move <= DISTRIBUTION_TOLERANCE {
            converged = true;
            break;
        }
        if passes >= PASSES_MAX {
            break;
        }
    }
    let states = marcher.states(&shares)?;
    let zones = build_zones(&marcher, &states, &optics, &shares, absorbed_kw)?;
    let mean_coupling = if marcher.capacitive {
        input.applicator_efficiency
    } else {
        optics.iter().map(|o| o.coupling).sum::<f64>() / count as f64
    };
    let last = states.boundaries.last().copied().unwrap_or(Point {
        temp_c: input.scenario.outlet.temp_c,
        moisture_wb: input.outlet_moisture_wb,
        water_removed_per_kg_in: 0.0,
        stage: Stage::Heating,
    });
    let model = ZoneModel {
        applicator: if marcher.capacitive { "capacitive" } else { "cavity" },
        description: if marcher.capacitive {
            "RF electrodes, not a cavity: every zone gets the same share of the absorbed power and the scenario's applicator efficiency as its coupling; the field is taken as even through the bed"
        } else {
            "equal forward power per zone; each zone couples a / (a + w (1 - a)) of it (geometric series of passes, loaded-Q form of applicator efficiency, Metaxas & Meredith 1983 ch. 5, from memory), a the bed's single-pass absorptance from the layered solution at the zone's state, w the wall and opening loss per pass; the zones share the balance's absorbed power in proportion"
        },
        wall_loss_per_pass: (!marcher.capacitive).then_some(WALL_LOSS_PER_PASS),
        mean_coupling,
        assumed_applicator_efficiency: input.applicator_efficiency,
        passes,
        converged,
        distribution_tolerance: DISTRIBUTION_TOLERANCE,
        zones_absorbed_sum_kw: zones.iter().map(|z| z.absorbed_kw).sum(),
        outlet_temp_c: last.temp_c,
        outlet_moisture_wb: last.moisture_wb,
        runaway_zones: zones.iter().filter(|z| z.runaway).map(|z| z.index).collect(),
    };
    Ok(ZoneMarch { zones, model })
}

fn build_zones(
    marcher: &Marcher,
    states: &States,
    optics: &[Optics],
    shares: &[f64],
    absorbed_kw: f64,
) -> Result<Vec<Zone>, InputError> {
    let input = &marcher.input;
    let count = shares.len();
    let length_m = input.tunnel.tunnel_length_m;
    let zone_volume_m3 =
        input.scenario.tunnel.belt_width_m * input.scenario.tunnel.bed_depth_m * length_m / count as f64;
    let throughput = input.scenario.throughput_kg_per_h;
    let mut zones = Vec::with_capacity(count);
    for index in 0..count {
        let (entry, exit, mid) = (&states.boundaries[index], &states.boundaries[index + 1], &states.midpoints[index]);
        let zone_optics = &optics[index];
        // Water a product entering above T_e flashes off at the inlet counts in the first zone.
        let water_before = if index == 0 { 0.0 } else { entry.water_removed_per_kg_in };
        let zone_kw = absorbed_kw * shares[index];
        let power_density_w_per_m3 = if zone_volume_m3 > 0.0 { zone_kw * 1000.0 / zone_volume_m3 } else { 0.0 };
        let peak_field_v_per_m = zone_optics.peak_to_mean.and_then(|ratio| {
            field_for_power_density_v_per_m(
                input.frequency_hz,
                zone_optics.eps.eps_imag,
                power_density_w_per_m3 * ratio,
            )
        });
        zones.push(Zone {
            index: index as u32 + 1,
            start_m: length_m * index as f64 / count as f64,
            end_m: length_m * (index + 1) as f64 / count as f64,
            temp_c: exit.temp_c,
            moisture_wb: exit.moisture_wb,
            frozen_fraction: input.product.material.frozen_fraction_at(exit.temp_c, Some(exit.moisture_wb))?,
            eps_real: zone_optics.eps.eps_real,
            eps_imag: zone_optics.eps.eps_imag,
            absorbed_kw: zone_kw,
            stage: mid.stage.name(),
            coupling: zone_optics.coupling,
            single_pass_absorptance: zone_optics.single_pass_absorptance,
            penetration_depth_m: penetration_depth_m(input.frequency_hz, zone_optics.eps),
            mean_power_density_kw_per_m3: power_density_w_per_m3 / 1000.0,
            peak_field_v_per_m,
            runaway: marcher.runaway(entry, exit, mid)?,
            water_removed_kg_per_h: (throughput * (exit.water_removed_per_kg_in - water_before)).max(0.0),
        });
    }
    Ok(zones)
}

/// Zone indices as compact ranges: `1-4, 7, 9-12`.
fn index_ranges(indices: &[u32]) -> String {
    let mut parts: Vec<String> = Vec::new();
    let mut start: Option<(u32, u32)> = None;
    for &index in indices {
        start = match start {
            Some((first, last)) if index == last + 1 => Some((first, index)),
            Some((first, last)) => {
                parts.push(range_text(first, last));
                Some((index, index))
            }
            None => Some((index, index)),
        };
    }
    if let Some((first, last)) = start {
        parts.push(range_text(first, last));
    }
    parts.join(", ")
}

fn range_text(first: u32, last: u32) -> String {
    if first == last {
        format!("{first}")
    } else {
        format!("{first}-{last}")
    }
}

/// The sentence naming the zones where eps'' rises with temperature, if any.
pub fn runaway_zones_sentence(zones: &[Zone], model: &ZoneModel) -> Option<String> {
    let first = zones.iter().find(|z| z.runaway)?;
    let last = zones.iter().rev().find(|z| z.runaway)?;
    Some(format!(
        "Along the tunnel (zone march), zone{} {} of {} ({:.2} to {:.2} m) see the loss factor rise by more than {:.0} %/K with temperature: watch the product there for hot spots.",
        if model.runaway_zones.len() == 1 { "" } else { "s" },
        index_ranges(&model.runaway_zones),
        zones.len(),
        first.start_m,
        last.end_m,
        RUNAWAY_SLOPE_PER_K * 100.0,
    ))
}

/// `coupling_below_assumed`: the cavity model couples well below the efficiency the plan assumed.
pub fn coupling_warning(model: &ZoneModel) -> Option<Warning> {
    if model.applicator != "cavity" || model.mean_coupling >= model.assumed_applicator_efficiency - COUPLING_SHORTFALL {
        return None;
    }
    Some(Warning::new(
        "coupling_below_assumed",
        format!(
            "Over the zones the bed absorbs on average {:.0} % of the forward power (cavity model: single-pass absorptance of the layered bed, {:.0} % lost to walls and openings per pass), well below the {:.0} % applicator efficiency assumed: the forward power and generator count are likely short. Lower the applicator efficiency, deepen the bed or choose a lossier band.",
            model.mean_coupling * 100.0,
            WALL_LOSS_PER_PASS * 100.0,
            model.assumed_applicator_efficiency * 100.0
        ),
    ))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::sizing::energy_balance::{balance, BalanceInput, LossAllowances};
    use crate::sizing::tunnel::{lay_out, ResidenceRule, TunnelInput};
    use approx::assert_relative_eq;

    #[test]
    fn the_bits_hasher_tells_neighbouring_keys_apart() {
        use std::hash::{BuildHasher, Hash};
        let hash = |key: &dyn Fn(&mut BitsHasher)| {
            let mut hasher = BitsHash::default().build_hasher();
            key(&mut hasher);
            hasher.finish()
        };
        // Permittivities one bit apart and whole-kelvin temperatures side by side: the keys the
        // march meets. Every hash differs, also in the low bits a table picks its bucket by.
        let mut seen = std::collections::HashSet::new();
        for step in 0..64_u64 {
            let eps = (12.5_f64.to_bits() + step, 4.25_f64.to_bits());
            assert!(seen.insert(hash(&|h| eps.hash(h))));
            let grid = (0.75_f64.to_bits(), step as i32 - 30);
            assert!(seen.insert(hash(&|h| grid.hash(h))));
        }
        let low_bits: std::collections::HashSet<u64> = seen.iter().map(|h| h & 0x7f).collect();
        assert!(low_bits.len() > 64, "{} distinct low bits", low_bits.len());
        // The byte path hashes the same words as the word path.
        assert_eq!(hash(&|h| h.write(&7_u64.to_le_bytes())), hash(&|h| h.write_u64(7)));
        // A map keyed by bits finds what it holds.
        let mut map: HashMap<(u64, i32), f64, BitsHash> = HashMap::default();
        map.insert((1, 2), 3.0);
        assert_eq!(map.get(&(1, 2)), Some(&3.0));
        assert_eq!(map.get(&(2, 1)), None);
    }

    #[test]
    fn zone_energies_run_from_zero_to_the_total_exactly() {
        // Shares that do not sum to 1 in floating point (0.1 ten times is 0.9999999999999999).
        let shares = [0.1; 10];
        let energies: Vec<(f64, f64)> = zone_energies(&shares, 3.0).collect();
        assert_eq!(energies.len(), 10);
        assert_eq!(energies[0].0, 0.0);
        assert_eq!(energies[9].1, 3.0);
        for pair in energies.windows(2) {
            // Each zone starts where the one before ends, bit for bit.
            assert_eq!(pair[0].1.to_bits(), pair[1].0.to_bits());
        }
        assert_relative_eq!(energies[4].1, 1.5, max_relative = 1e-12);
        assert_eq!(zone_energies(&[], 3.0).count(), 0);
    }

    fn constant_product() -> Product {
        crate::plan::product::by_hand_constant_product()
    }

    fn drying_scenario(inlet_c: f64, outlet_c: f64) -> Scenario {
        crate::scenario::parse_scenario(&format!(
            r#"{{"schema": 1, "process": "drying", "product": {{"library": "paper"}}, "throughput_kg_per_h": 360,
                "inlet": {{"temp_c": {inlet_c}, "moisture_wb": 0.5}}, "outlet": {{"temp_c": {outlet_c}, "moisture_wb": 0.2}},
                "frequency_mhz": 2450, "tunnel": {{"belt_width_m": 1, "bed_depth_m": 0.02, "residence": {{"tunnel_length_m": 2}}, "zones": 4}}}}"#
        ))
        .unwrap()
    }

    /// Drying by hand with h_fg = 2.257e6 J/kg and T_e = 100 degC.
    fn with_path(inlet_c: f64, outlet_c: f64, check: impl Fn(&Path)) {
        let product = constant_product();
        let scenario = drying_scenario(inlet_c, outlet_c);
        let no_losses = LossAllowances { surface_pct: 0.0, belt_pct: 0.0, vapour_pct: 0.0 };
        let balance_input = BalanceInput {
            throughput_kg_per_h: 360.0,
            inlet_temp_c: inlet_c,
            outlet_temp_c: outlet_c,
            inlet_moisture_wb: 0.5,
            outlet_moisture_wb: 0.2,
            evaporation_temp_c: 100.0,
            latent_heat_vaporization_j_per_kg: 2.257e6,
            losses: no_losses,
        };
        let energy = balance(&product, &balance_input).unwrap();
        let geometry = TunnelInput {
            belt_width_m: 1.0,
            bed_depth_m: 0.02,
            bulk_density_kg_per_m3: 800.0,
            residence: ResidenceRule::TunnelLengthM(2.0),
        };
        let tunnel = lay_out(&geometry, 360.0, energy.absorbed_kw, 1.0);
        let input = MarchInput {
            scenario: &scenario,
            product: &product,
            energy: &energy,
            tunnel: &tunnel,
            frequency_hz: 2.45e9,
            inlet_moisture_wb: 0.5,
            outlet_moisture_wb: 0.2,
            evaporation_temp_c: 100.0,
            latent_heat_j_per_kg: 2.257e6,
            applicator_efficiency: 0.85,
        };
        let path = Path::new(&input).unwrap();
        // The path's total is the balance's process heat per kg in (exact identity).
        assert_relative_eq!(path.total(), energy.process_kw * 3.6e6 / 360.0, max_relative = 1e-12);
        check(&path);
    }

    #[test]
    fn the_drying_path_by_hand() {
        with_path(20.0, 120.0, |path| {
            // Stage 1: 2000 x 80 = 160 kJ/kg; water 1 - 0.5/0.8 = 0.375 kg/kg in, 846.375 kJ/kg;
            // stage 3: 0.625 x 2000 x 20 = 25 kJ/kg (by hand).
            assert_relative_eq!(path.heat_one, 160_000.0, max_relative = 1e-12);
            assert_relative_eq!(path.evaporate, 846_375.0, max_relative = 1e-12);
            assert_relative_eq!(path.heat_three, 25_000.0, max_relative = 1e-12);
            let halfway_heating = path.at(80_000.0).unwrap();
            assert_eq!(halfway_heating.stage, Stage::Heating);
            assert_relative_eq!(halfway_heating.temp_c, 60.0, epsilon = 1e-9);
            let halfway_evaporating = path.at(160_000.0 + 846_375.0 / 2.0).unwrap();
            assert_eq!(halfway_evaporating.stage, Stage::Evaporating);
            assert_eq!(halfway_evaporating.temp_c, 100.0);
            assert_relative_eq!(halfway_evaporating.water_removed_per_kg_in, 0.1875, max_relative = 1e-12);
            assert_relative_eq!(halfway_evaporating.moisture_wb, 0.3125 / 0.8125, max_relative = 1e-12);
            let dried = path.at(path.total() - 12_500.0).unwrap();
            assert_eq!(dried.stage, Stage::HeatingDried);
            // H = 2000 x 100 + 12500 / 0.625 per kg out -> 110 degC.
            assert_relative_eq!(dried.temp_c, 110.0, epsilon = 1e-9);
            let end = path.at(path.total()).unwrap();
            assert_relative_eq!(end.temp_c, 120.0, epsilon = 1e-9);
            assert_eq!(end.moisture_wb, 0.2);
        });
    }

    #[test]
    fn the_stage_alone_is_the_states_stage_and_moisture() {
        // Along both drying paths (three stages; a flash at the inlet), at and between the stage
        // ends: exact, the same branch computes both.
        for (inlet_c, outlet_c) in [(20.0, 120.0), (110.0, 90.0)] {
            with_path(inlet_c, outlet_c, |path| {
                let total = path.total();
                let ends = [0.0, path.heat_one, path.heat_one + path.evaporate, total];
                let mut energies: Vec<f64> = (0..=64).map(|step| total * f64::from(step) / 64.0).collect();
                energies.extend(ends.iter().flat_map(|&end| [end, end - 1e-3, end + 1e-3]));
                let mut stages = std::collections::HashSet::new();
                for energy in energies {
                    let point = path.at(energy).unwrap();
                    let stage = path.stage_at(energy);
                    assert_eq!(stage.stage, point.stage, "{energy}");
                    assert_eq!(stage.moisture_wb.to_bits(), point.moisture_wb.to_bits(), "{energy}");
                    stages.insert(point.stage.name());
                }
                assert_eq!(stages.len(), if inlet_c < 100.0 { 3 } else { 1 });
            });
        }
    }

    #[test]
    fn a_hot_inlet_flashes_and_a_cool_outlet_stops_at_the_boiling_point() {
        with_path(110.0, 90.0, |path| {
            // Stage 1 is negative (-20 kJ/kg), stage 3 is not counted (T_out < T_e).
            assert_relative_eq!(path.heat_one, -20_000.0, max_relative = 1e-12);
            assert_eq!(path.heat_three, 0.0);
            let inlet = path.at(0.0).unwrap();
            assert_eq!(inlet.stage, Stage::Evaporating);
            assert_eq!(inlet.temp_c, 100.0);
            assert_relative_eq!(inlet.water_removed_per_kg_in, 20_000.0 / 2.257e6, max_relative = 1e-12);
            let end = path.at(path.total()).unwrap();
            assert_eq!(end.temp_c, 100.0);
            assert_relative_eq!(end.moisture_wb, 0.2, max_relative = 1e-12);
        });
    }

    #[test]
    fn cavity_coupling_limits_and_series() {
        // Exact identities: a perfect absorber takes everything; a lossless cavity lets any lossy
        // load take everything; a lossless load takes nothing.
        assert_eq!(cavity_coupling(1.0, 0.03), 1.0);
        assert_eq!(cavity_coupling(0.2, 0.0), 1.0);
        assert_eq!(cavity_coupling(0.0, 0.03), 0.0);
        assert_eq!(cavity_coupling(0.0, 0.0), 0.0);
        assert_eq!(cavity_coupling(f64::NAN, 0.03), 0.0);
        // The closed form is the sum of the passes (by hand: a sum_k [(1 - a)(1 - w)]^k).
        let (a, w): (f64, f64) = (0.3, 0.05);
        let series: f64 = (0..2000).map(|k| a * ((1.0 - a) * (1.0 - w)).powi(k)).sum();
        assert_relative_eq!(cavity_coupling(a, w), series, max_relative = 1e-12);
        // By hand: a = 0.5, w = 0.03 -> 0.5 / 0.515 = 0.970874.
        assert_relative_eq!(cavity_coupling(0.5, 0.03), 0.970_873_786, max_relative = 1e-9);
    }

    #[test]
    fn inversion_of_a_linear_and_a_steep_enthalpy() {
        // Linear: H = 4000 T -> T = H / 4000 exactly (exact identity).
        let linear = |t: f64| Ok(4000.0 * t);
        let t = temperature_at_enthalpy(linear, 4000.0 * 37.25, (0.0, 0.0), (100.0, 4e5)).unwrap();
        assert_relative_eq!(t, 37.25, epsilon = 1e-9);
        // A steep step like thawing: H = 2000 T + 3e5 / (1 + e^{-(T + 2)/0.2}).
        let h = |t: f64| 2000.0 * t + 3e5 / (1.0 + (-(t + 2.0) / 0.2).exp());
        let target = h(-2.3);
        let t = temperature_at_enthalpy(|t| Ok(h(t)), target, (-20.0, h(-20.0)), (10.0, h(10.0))).unwrap();
        assert_relative_eq!(t, -2.3, epsilon = 1e-7);
        // Outside the bracket: the nearer end; a stage of no width: its start.
        let identity = |t: f64| Ok(t);
        assert_eq!(temperature_at_enthalpy(identity, -5.0, (0.0, 0.0), (1.0, 1.0)).unwrap(), 0.0);
        assert_eq!(temperature_at_enthalpy(identity, 5.0, (0.0, 0.0), (1.0, 1.0)).unwrap(), 1.0);
        assert_eq!(temperature_at_enthalpy(identity, 0.5, (1.0, 1.0), (1.0, 1.0)).unwrap(), 1.0);
    }

    #[test]
    fn zone_ranges_read_compactly() {
        assert_eq!(index_ranges(&[1, 2, 3, 4, 7, 9, 10]), "1-4, 7, 9-10");
        assert_eq!(index_ranges(&[5]), "5");
        assert_eq!(index_ranges(&[]), "");
    }

    #[test]
    fn rf_is_capacitive_and_microwave_is_not() {
        assert!(is_capacitive(27.12e6));
        assert!(is_capacitive(40.68e6));
        assert!(!is_capacitive(915e6));
        assert!(!is_capacitive(2450e6));
    }
}
