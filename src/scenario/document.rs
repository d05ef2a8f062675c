//! Scenario document types. Field names carry their units; optional sections have stated defaults
//! that the plan echoes back in its assumptions.

use crate::sizing::energy_balance::LossAllowances;
use crate::sizing::generators::{GeneratorClass, Redundancy};
use crate::sizing::tunnel::ResidenceRule;
use crate::sizing::utilities::SiteInput;
use serde::{Deserialize, Serialize};

/// The scenario schema version this build writes and reads.
pub const SCHEMA_VERSION: u32 = 1;

/// What the line does to the product.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum ProcessKind {
    /// Raise the temperature, no phase change intended.
    Heating,
    /// Heat to a pasteurising temperature (holding is outside the tunnel).
    Pasteurising,
    /// Raise frozen product to just below its freezing point.
    Tempering,
    /// Take frozen product through its freezing point.
    Thawing,
    /// Remove water.
    Drying,
    /// Bring a compound or resin to its curing temperature.
    Curing,
}

impl ProcessKind {
    /// Lower-case name as in the JSON.
    pub fn as_str(self) -> &'static str {
        match self {
            ProcessKind::Heating => "heating",
            ProcessKind::Pasteurising => "pasteurising",
            ProcessKind::Tempering => "tempering",
            ProcessKind::Thawing => "thawing",
            ProcessKind::Drying => "drying",
            ProcessKind::Curing => "curing",
        }
    }
}

/// Free-text fields for the quote sheet.
#[derive(Debug, Clone, Default, PartialEq, Serialize, Deserialize)]
#[serde(default, deny_unknown_fields)]
pub struct ProjectFields {
    /// Who the line is for.
    pub customer: String,
    /// Where it will stand.
    pub site: String,
    /// Who planned it.
    pub author: String,
    /// Date of the plan, as written by the author.
    pub date: String,
    /// Quote or project reference.
    pub reference: String,
    /// Anything else.
    pub notes: String,
}

/// The product: a library material by name, or one the user describes.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct ProductSpec {
    /// Name of a library material (`doubleprime materials` lists them).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub library: Option<String>,
    /// A user-defined material.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub custom: Option<crate::materials::custom::CustomMaterialSpec>,
}

/// Product state at the inlet or outlet.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct ProductState {
    /// Product temperature, degC.
    pub temp_c: f64,
    /// Wet-basis moisture, kg water per kg product; defaults to the material's own.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub moisture_wb: Option<f64>,
}

/// Generator choice.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct GeneratorChoice {
    /// A class id from the catalogue, or none to pick automatically.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub class: Option<String>,
    /// `n` or `n_plus_1` (one standby unit).
    #[serde(default = "default_redundancy")]
    pub redundancy: Redundancy,
    /// Classes added to the built-in catalogue for this scenario.
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub extra_classes: Vec<GeneratorClass>,
}

fn default_redundancy() -> Redundancy {
    Redundancy::N
}

impl Default for GeneratorChoice {
    fn default() -> Self {
        Self { class: None, redundancy: Redundancy::N, extra_classes: Vec::new() }
    }
}

/// Efficiencies; generator and power supply default to the chosen class's figures.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct EfficiencyInput {
    /// Mains to generator input; default: the class's figure.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub power_supply: Option<f64>,
    /// Generator input to output; default: the class's figure.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub generator: Option<f64>,
    /// Generator output to forward power at the applicator.
    #[serde(default = "default_transmission")]
    pub transmission: f64,
    /// Forward power to absorbed power (applicator coupling).
    #[serde(default = "default_applicator")]
    pub applicator: f64,
}

/// Waveguide, circulator and tuner: 0.1-0.2 dB insertion loss, about 96 % (shared/sources.md 6.2, from memory).
fn default_transmission() -> f64 {
    0.96
}

/// A well-matched lossy load in a tunnel couples 80-95 % (shared/sources.md 6.2, from memory); 0.85 is cautious.
fn default_applicator() -> f64 {
    0.85
}

impl Default for EfficiencyInput {
    fn default() -> Self {
        Self {
            power_supply: None,
            generator: None,
            transmission: default_transmission(),
            applicator: default_applicator(),
        }
    }
}

/// Which faces of the bed the energy enters.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum FeedSides {
    /// From above only.
    Top,
    /// From above and below (through the belt).
    Both,
}

/// Tunnel geometry.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct TunnelSpec {
    /// Loaded belt width, m.
    pub belt_width_m: f64,
    /// Bed depth, m.
    pub bed_depth_m: f64,
    /// Bulk density as loaded, kg/m^3; defaults to the material's density.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub bulk_density_kg_per_m3: Option<f64>,
    /// How the residence time is fixed.
    pub residence: ResidenceRule,
    /// Feeding from the top or both sides.
    #[serde(default = "default_feed")]
    pub feed: FeedSides,
    /// Number of zones along the tunnel for the profiles.
    #[serde(default = "default_zones")]
    pub zones: u32,
    /// What carries the product: tray, belt, air gap and backing, for the depth profile.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub load_stack: Option<LoadStack>,
}

/// A flat layer under the product.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Slab {
    /// Thickness, m.
    pub thickness_m: f64,
    /// eps'.
    pub eps_real: f64,
    /// eps''.
    pub eps_imag: f64,
}

/// What lies below the stack.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum BackingSpec {
    /// Open: the wave leaves into air (or, fed from both sides, comes in from below).
    Air,
    /// A metal plate or tunnel floor: reflects everything; top feeding only.
    Metal,
}

/// The carrier under the product, top down: tray, belt, air gap, backing.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct LoadStack {
    /// A tray or carton base under the product.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub tray: Option<Slab>,
    /// The conveyor belt.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub belt: Option<Slab>,
    /// Air between the belt and the backing, m.
    #[serde(default)]
    pub air_gap_m: f64,
    /// What lies below.
    #[serde(default = "default_backing")]
    pub backing: BackingSpec,
}

fn default_backing() -> BackingSpec {
    BackingSpec::Air
}

fn default_feed() -> FeedSides {
    FeedSides::Top
}

fn default_zones() -> u32 {
    1
}

/// The whole scenario document.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Scenario {
    /// Schema version; this build reads [`SCHEMA_VERSION`].
    pub schema: u32,
    /// Short title.
    #[serde(default)]
    pub name: String,
    /// What the scenario is about.
    #[serde(default)]
    pub description: String,
    /// Quote fields.
    #[serde(default)]
    pub project: ProjectFields,
    /// What the line does.
    pub process: ProcessKind,
    /// The product.
    pub product: ProductSpec,
    /// Salt in the product's water phase, % by mass of product; defaults to the material's own.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub salt_pct: Option<f64>,
    /// Wet product in, kg/h.
    pub throughput_kg_per_h: f64,
    /// State at the inlet.
    pub inlet: ProductState,
    /// State at the outlet.
    pub outlet: ProductState,
    /// Absolute pressure in the tunnel, kPa (vacuum drying below 101.325).
    #[serde(default = "default_pressure_kpa")]
    pub pressure_kpa: f64,
    /// Evaporation temperature, degC; default: the boiling point at `pressure_kpa`.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub evaporation_temp_c: Option<f64>,
    /// Operating frequency, MHz.
    pub frequency_mhz: f64,
    /// Generator choice.
    #[serde(default)]
    pub generator: GeneratorChoice,
    /// Efficiency chain.
    #[serde(default)]
    pub efficiency: EfficiencyInput,
    /// Tunnel geometry.
    pub tunnel: TunnelSpec,
    /// Loss allowances.
    #[serde(default)]
    pub losses: LossAllowances,
    /// Site and tariff.
    #[serde(default)]
    pub site: SiteInput,
}

fn default_pressure_kpa() -> f64 {
    101.325
}
