//! The search space: which bands, generator classes, belt widths, bed depths, zone counts and
//! redundancies to try, the constraints a line must meet and the objective that ranks the lines
//! that meet them; its defaults around a scenario and its validation.
//!
//! Every field of the document is optional; an absent field takes the default stated in the
//! crate::search module documentation (the space around the scenario). Validation reports every
//! problem at once, each naming its field as `space.belt_width_m.steps` or `space.bands_mhz[2]`
//! with the valid range. The ranges of the belt width and bed depth are the scenario's own
//! (sizing::tunnel), the zone counts the scenario's (1 to 1000), and a class must be in the
//! catalogue (the built-in one, the scenario's `extra_classes` and the CLI's `--generators`).
//! A space of more than [`CONFIGURATIONS_MAX`] configurations is refused.

use super::rank::Objective;
use crate::error::{require_in, require_positive, InputError};
use crate::physics::bands::band_containing;
use crate::physics::waves::FREQUENCY_MAX_HZ;
use crate::plan::band_comparison::COMPARED_BANDS_MHZ;
use crate::plan::warnings::{BED_OVER_DP_LIMIT_ONE_SIDE, FIELD_ARCING_CONCERN_V_PER_M, LONG_TUNNEL_M};
use crate::scenario::validation::{TEMP_MAX_C, TEMP_MIN_C, ZONES_MAX};
use crate::scenario::{FeedSides, Scenario};
use crate::sizing::generators::{GeneratorClass, Redundancy};
use crate::sizing::tunnel::{ResidenceRule, TunnelInput};
use serde::{Deserialize, Deserializer, Serialize, Serializer};

/// Most configurations one search may hold (bands x classes x widths x depths x zone counts x
/// redundancies): at tens of microseconds each, well under a minute even in the browser.
pub const CONFIGURATIONS_MAX: usize = 1_000_000;
/// Most values along the belt-width or bed-depth axis.
pub const AXIS_VALUES_MAX: usize = 1000;
/// Most bands in one space.
pub const BANDS_MAX: usize = 12;
/// Most entries in `generator_classes`.
pub const CLASS_ENTRIES_MAX: usize = 100;
/// Most zone counts in one space (each distinct count solves its own zone marches).
pub const ZONE_COUNTS_MAX: usize = 20;
/// Best configurations shown when the space does not say.
pub const BEST_DEFAULT: u32 = 5;
/// Most best configurations shown (each is re-planned in full at the end).
pub const BEST_MAX: u32 = 50;
/// The default belt widths and bed depths: the scenario's value times these factors, those
/// outside the scenario's valid range dropped (a planning convention of our own: half to twice).
pub const AROUND_FACTORS: [f64; 7] = [0.5, 0.75, 1.0, 1.25, 1.5, 1.75, 2.0];
/// The `generator_classes` entry for the plan's automatic pick in each band.
pub const AUTO_CLASS: &str = "auto";
/// The `generator_classes` entry for every catalogue class serving each band.
pub const ALL_CLASSES: &str = "all";

/// Values along one axis: a list, or an even grid.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(untagged)]
pub enum Grid {
    /// These values, in this order.
    List(Vec<f64>),
    /// `steps` values evenly spaced from `from` to `to`, both ends included.
    Steps {
        /// First value.
        from: f64,
        /// Last value (at least `from`).
        to: f64,
        /// Number of values: 1 when `from` equals `to`, otherwise 2 to [`AXIS_VALUES_MAX`].
        steps: u32,
    },
}

/// The constraints as written: absent takes the default, `null` switches a constraint off.
#[derive(Debug, Clone, Copy, Default, PartialEq, Serialize, Deserialize)]
#[serde(default, deny_unknown_fields)]
pub struct ConstraintSettings {
    /// Longest heated length, m (default [`LONG_TUNNEL_M`], the plan's `long_tunnel` threshold).
    #[serde(deserialize_with = "present", skip_serializing_if = "Option::is_none")]
    pub max_tunnel_length_m: Option<Option<f64>>,
    /// Largest bed depth over the smallest penetration depth, per fed face (default
    /// [`BED_OVER_DP_LIMIT_ONE_SIDE`]: 1 for a top-fed bed, so 2 for a bed fed from both sides, the
    /// plan's `bed_deeper_than_penetration` thresholds).
    #[serde(deserialize_with = "present", skip_serializing_if = "Option::is_none")]
    pub max_bed_over_penetration_depth: Option<Option<f64>>,
    /// Highest RMS field in the product, V/m (default [`FIELD_ARCING_CONCERN_V_PER_M`], the plan's
    /// `arcing_risk` threshold).
    #[serde(deserialize_with = "present", skip_serializing_if = "Option::is_none")]
    pub max_peak_field_v_per_m: Option<Option<f64>>,
    /// Highest hot-spot temperature of the product, degC (default: none). See the estimate in the
    /// crate::search module documentation.
    #[serde(deserialize_with = "present", skip_serializing_if = "Option::is_none")]
    pub max_product_temp_c: Option<Option<f64>>,
    /// Lowest core-to-surface power-density ratio through the bed at the inlet and the outlet
    /// (default: none; the plan's `core_lags` warning reads 0.5).
    #[serde(deserialize_with = "present", skip_serializing_if = "Option::is_none")]
    pub min_core_to_surface_ratio: Option<Option<f64>>,
}

/// A field that is present: `null` becomes `Some(None)` (switched off), a number `Some(Some(x))`.
fn present<'de, D: Deserializer<'de>>(deserializer: D) -> Result<Option<Option<f64>>, D::Error> {
    Option::<f64>::deserialize(deserializer).map(Some)
}

/// The search space document. Every field is optional (see the crate::search module documentation
/// for the defaults).
#[derive(Debug, Clone, Default, PartialEq, Serialize, Deserialize)]
#[serde(default, deny_unknown_fields)]
pub struct SearchSpace {
    /// Operating frequencies to try, MHz; each must be served by a catalogue class.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub bands_mhz: Option<Vec<f64>>,
    /// `auto` (the plan's automatic pick), `all` (every class serving the band) or class ids.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub generator_classes: Option<Vec<String>>,
    /// Loaded belt widths, m.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub belt_width_m: Option<Grid>,
    /// Bed depths, m.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub bed_depth_m: Option<Grid>,
    /// Zone counts along the tunnel.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub zones: Option<Vec<u32>>,
    /// `n` and/or `n_plus_1`.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub redundancy: Option<Vec<Redundancy>>,
    /// The limits a line must meet.
    pub constraints: ConstraintSettings,
    /// What ranks the feasible lines (default `generator_count`).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub objective: Option<Objective>,
    /// How many of the best to show and re-plan (default [`BEST_DEFAULT`]).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub best: Option<u32>,
}

/// One entry of a band's generator classes.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum ClassChoice {
    /// The plan's automatic pick (fewest units, then the smallest rating, among stable ones).
    Auto,
    /// This catalogue class.
    Named(String),
}

impl ClassChoice {
    /// The class id for the scenario's `generator.class` (`None` for the automatic pick).
    pub fn id(&self) -> Option<&str> {
        match self {
            ClassChoice::Auto => None,
            ClassChoice::Named(id) => Some(id),
        }
    }

    /// As written in the space: `auto` or the id.
    pub fn label(&self) -> &str {
        self.id().unwrap_or(AUTO_CLASS)
    }
}

impl Serialize for ClassChoice {
    fn serialize<S: Serializer>(&self, serializer: S) -> Result<S::Ok, S::Error> {
        serializer.serialize_str(self.label())
    }
}

/// One band and the generator classes tried in it.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct BandChoices {
    /// Operating frequency, MHz.
    pub frequency_mhz: f64,
    /// ISM band name, if the frequency is in one.
    pub ism_band: Option<&'static str>,
    /// The classes tried, in the order of `generator_classes` (catalogue order for `all`).
    pub generator_classes: Vec<ClassChoice>,
}

/// The constraints in force (`None`: not applied).
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Constraints {
    /// Longest heated length, m.
    pub max_tunnel_length_m: Option<f64>,
    /// Largest bed depth over the smallest penetration depth, per fed face.
    pub max_bed_over_penetration_depth: Option<f64>,
    /// Highest RMS field in the product, V/m.
    pub max_peak_field_v_per_m: Option<f64>,
    /// Highest hot-spot temperature, degC.
    pub max_product_temp_c: Option<f64>,
    /// Lowest core-to-surface power-density ratio.
    pub min_core_to_surface_ratio: Option<f64>,
}

/// The space with every default filled in and every list expanded: what the search walks.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ResolvedSpace {
    /// The bands, each with its classes.
    pub bands: Vec<BandChoices>,
    /// Belt widths, m.
    pub belt_width_m: Vec<f64>,
    /// Bed depths, m.
    pub bed_depth_m: Vec<f64>,
    /// Zone counts.
    pub zones: Vec<u32>,
    /// Redundancies.
    pub redundancy: Vec<Redundancy>,
    /// The constraints in force.
    pub constraints: Constraints,
    /// Faces the bed is fed from (the scenario's feed): the bed-depth limit applied is
    /// `max_bed_over_penetration_depth` times this.
    pub fed_faces: u32,
    /// The objective.
    pub objective: Objective,
    /// How many of the best are shown and re-planned.
    pub best: u32,
    /// Configurations in the space.
    pub configurations: usize,
}

impl ResolvedSpace {
    /// Configurations in one band: its classes times every other axis.
    pub fn configurations_in_band(&self, band: usize) -> usize {
        let classes = self.bands.get(band).map_or(0, |b| b.generator_classes.len());
        classes
            .saturating_mul(self.redundancy.len())
            .saturating_mul(self.zones.len())
            .saturating_mul(self.bed_depth_m.len())
            .saturating_mul(self.belt_width_m.len())
    }
}

/// Read a search space document. Wrong syntax, unknown fields and wrong types come back naming the
/// field (`space.belt_width_m`); the numbers are checked by [`resolve`].
pub fn parse_space(text: &str) -> Result<SearchSpace, Vec<InputError>> {
    let value: serde_json::Value = serde_json::from_str(text)
        .map_err(|error| vec![InputError::new("space", format!("not JSON ({error})"), "a JSON object")])?;
    let Some(object) = value.as_object() else {
        return Err(vec![InputError::new("space", "not an object", "a JSON object (see the search documentation)")]);
    };
    let mut space = SearchSpace::default();
    let mut problems = Vec::new();
    for (key, field_value) in object {
        let field = format!("space.{key}");
        let shape_error = |valid: &str, error: serde_json::Error| InputError::new(&field, error, valid);
        match key.as_str() {
            "bands_mhz" => match serde_json::from_value(field_value.clone()) {
                Ok(list) => space.bands_mhz = Some(list),
                Err(error) => problems.push(shape_error("a list of frequencies, MHz", error)),
            },
            "generator_classes" => match serde_json::from_value(field_value.clone()) {
                Ok(list) => space.generator_classes = Some(list),
                Err(error) => problems.push(shape_error("a list of \"auto\", \"all\" or class ids", error)),
            },
            "belt_width_m" => match grid_from_value(&field, field_value) {
                Ok(grid) => space.belt_width_m = Some(grid),
                Err(error) => problems.push(error),
            },
            "bed_depth_m" => match grid_from_value(&field, field_value) {
                Ok(grid) => space.bed_depth_m = Some(grid),
                Err(error) => problems.push(error),
            },
            "zones" => match serde_json::from_value(field_value.clone()) {
                Ok(list) => space.zones = Some(list),
                Err(error) => problems.push(shape_error(&format!("a list of whole numbers 1 to {ZONES_MAX}"), error)),
            },
            "redundancy" => match serde_json::from_value(field_value.clone()) {
                Ok(list) => space.redundancy = Some(list),
                Err(error) => problems.push(shape_error("a list of \"n\" and \"n_plus_1\"", error)),
            },
            "constraints" => match serde_json::from_value(field_value.clone()) {
                Ok(constraints) => space.constraints = constraints,
                Err(error) => problems.push(shape_error(
                    "an object of max_tunnel_length_m, max_bed_over_penetration_depth, max_peak_field_v_per_m, max_product_temp_c, min_core_to_surface_ratio (numbers, or null for off)",
                    error,
                )),
            },
            "objective" => match serde_json::from_value(field_value.clone()) {
                Ok(objective) => space.objective = Some(objective),
                Err(error) => problems.push(shape_error(
                    "\"generator_count\", \"mains_kw\", \"energy_cost_per_tonne\", \"tunnel_length_m\" or {\"weighted\": {those names: weights}}",
                    error,
                )),
            },
            "best" => match serde_json::from_value(field_value.clone()) {
                Ok(best) => space.best = Some(best),
                Err(error) => problems.push(shape_error(&format!("a whole number 1 to {BEST_MAX}"), error)),
            },
            _ => problems.push(InputError::new(
                &field,
                "an unknown field",
                "one of bands_mhz, generator_classes, belt_width_m, bed_depth_m, zones, redundancy, constraints, objective, best",
            )),
        }
    }
    if problems.is_empty() {
        Ok(space)
    } else {
        Err(problems)
    }
}

/// A grid written as a list of numbers or as `{"from", "to", "steps"}`, each part named if wrong.
fn grid_from_value(field: &str, value: &serde_json::Value) -> Result<Grid, InputError> {
    const SHAPE: &str = "a list of numbers or {\"from\": A, \"to\": B, \"steps\": N}";
    match value {
        serde_json::Value::Array(items) => items
            .iter()
            .enumerate()
            .map(|(index, item)| {
                item.as_f64().ok_or_else(|| InputError::new(format!("{field}[{index}]"), item, "a number"))
            })
            .collect::<Result<Vec<f64>, InputError>>()
            .map(Grid::List),
        serde_json::Value::Object(map) => {
            if let Some(unknown) = map.keys().find(|key| !["from", "to", "steps"].contains(&key.as_str())) {
                return Err(InputError::new(format!("{field}.{unknown}"), "an unknown field", "from, to and steps"));
            }
            let number = |name: &str| -> Result<f64, InputError> {
                let item =
                    map.get(name).ok_or_else(|| InputError::new(format!("{field}.{name}"), "missing", "a number"))?;
                item.as_f64().ok_or_else(|| InputError::new(format!("{field}.{name}"), item, "a number"))
            };
            let (from, to, steps) = (number("from")?, number("to")?, number("steps")?);
            let steps_max = AXIS_VALUES_MAX as f64;
            if !(steps.fract() == 0.0 && (1.0..=steps_max).contains(&steps)) {
                return Err(InputError::new(
                    format!("{field}.steps"),
                    steps,
                    format!("a whole number 1 to {AXIS_VALUES_MAX}"),
                ));
            }
            // A whole number within 1..=1000, so the cast is exact.
            Ok(Grid::Steps { from, to, steps: steps as u32 })
        }
        other => Err(InputError::new(field, other, SHAPE)),
    }
}

/// Which tunnel dimension a grid is for.
#[derive(Clone, Copy)]
enum Dimension {
    BeltWidth,
    BedDepth,
}

impl Dimension {
    fn space_field(self) -> &'static str {
        match self {
            Dimension::BeltWidth => "space.belt_width_m",
            Dimension::BedDepth => "space.bed_depth_m",
        }
    }

    /// The scenario's own range check for this dimension (sizing::tunnel), as an error on `field`.
    fn check(self, field: &str, value: f64) -> Option<InputError> {
        let (belt_width_m, bed_depth_m, scenario_field) = match self {
            Dimension::BeltWidth => (value, 0.1, "tunnel.belt_width_m"),
            Dimension::BedDepth => (1.0, value, "tunnel.bed_depth_m"),
        };
        let probe = TunnelInput {
            belt_width_m,
            bed_depth_m,
            bulk_density_kg_per_m3: 1000.0,
            residence: ResidenceRule::ResidenceTimeS(60.0),
        };
        probe.validate().into_iter().find(|error| error.field == scenario_field).map(|mut error| {
            error.field = field.to_string();
            error
        })
    }

    /// The scenario's value times [`AROUND_FACTORS`], those outside the valid range dropped.
    fn around(self, base: f64) -> Vec<f64> {
        let mut values: Vec<f64> = AROUND_FACTORS
            .iter()
            .map(|factor| if *factor == 1.0 { base } else { on_grid(base * factor) })
            .filter(|value| self.check(self.space_field(), *value).is_none())
            .collect();
        values.dedup();
        if values.is_empty() {
            values.push(base);
        }
        values
    }
}

/// Computed grid values are rounded to whole multiples of 1 / this, m (a nanometre: far below any
/// tolerance of a belt or a bed, and it keeps `0.45` from printing as `0.44999999999999996`).
/// Listed values are kept as written. The divisor is exact in binary, so the division lands on
/// the double nearest the decimal value.
const GRID_STEPS_PER_M: f64 = 1e9;

fn on_grid(value: f64) -> f64 {
    (value * GRID_STEPS_PER_M).round() / GRID_STEPS_PER_M
}

/// Two values closer than this (relative) count as the same point of an axis.
const SAME_VALUE_RELATIVE: f64 = 1e-12;

fn same_value(a: f64, b: f64) -> bool {
    (a - b).abs() <= SAME_VALUE_RELATIVE * a.abs().max(b.abs())
}

/// The values of a grid, every problem pushed.
fn grid_values(dimension: Dimension, grid: &Grid, problems: &mut Vec<InputError>) -> Vec<f64> {
    let field = dimension.space_field();
    let before = problems.len();
    let values = match grid {
        Grid::List(values) => {
            if values.is_empty() || values.len() > AXIS_VALUES_MAX {
                problems.push(InputError::new(
                    field,
                    format!("{} values", values.len()),
                    format!("1 to {AXIS_VALUES_MAX} values"),
                ));
            }
            for (index, value) in values.iter().enumerate() {
                let item = format!("{field}[{index}]");
                problems.extend(dimension.check(&item, *value));
                if values[..index].iter().any(|earlier| same_value(*earlier, *value)) {
                    problems.push(InputError::new(item, value, "a value not listed before (distinct values)"));
                }
            }
            values.clone()
        }
        Grid::Steps { from, to, steps } => {
            let (from, to, steps) = (*from, *to, *steps);
            problems.extend(dimension.check(&format!("{field}.from"), from));
            problems.extend(dimension.check(&format!("{field}.to"), to));
            if problems.len() == before {
                if to < from {
                    problems.push(InputError::new(format!("{field}.to"), to, format!("at least from ({from})")));
                } else if from == to && steps != 1 {
                    problems.push(InputError::new(format!("{field}.steps"), steps, "1 when from equals to"));
                } else if from < to && !(2..=AXIS_VALUES_MAX as u32).contains(&steps) {
                    problems.push(InputError::new(
                        format!("{field}.steps"),
                        steps,
                        format!("2 to {AXIS_VALUES_MAX} when from is below to"),
                    ));
                }
            }
            if steps <= 1 {
                vec![from]
            } else {
                let last = f64::from(steps - 1);
                (0..steps)
                    .map(|k| if k + 1 == steps { to } else { on_grid(from + (to - from) * f64::from(k) / last) })
                    .collect()
            }
        }
    };
    if problems.len() == before {
        values
    } else {
        Vec::new()
    }
}

/// The default bands: the scenario's own frequency and the compared band centres of the other
/// bands, those the catalogue serves, ascending.
fn default_bands(scenario: &Scenario, catalogue: &[GeneratorClass]) -> Vec<f64> {
    let own_band = band_containing(scenario.frequency_mhz).map(|band| band.name);
    let mut bands: Vec<f64> = std::iter::once(scenario.frequency_mhz)
        .chain(
            COMPARED_BANDS_MHZ
                .iter()
                .copied()
                .filter(|centre| own_band.is_none() || band_containing(*centre).map(|band| band.name) != own_band),
        )
        .filter(|freq| catalogue.iter().any(|class| class.serves_frequency(*freq)))
        .collect();
    bands.sort_by(f64::total_cmp);
    bands.dedup();
    bands
}

/// A constraint as set: its default when absent, off when `null`, else checked against its range.
fn constraint(
    field: &str,
    setting: Option<Option<f64>>,
    default: Option<f64>,
    check: impl Fn(&str, f64) -> Result<f64, InputError>,
    problems: &mut Vec<InputError>,
) -> Option<f64> {
    match setting {
        None => default,
        Some(None) => None,
        Some(Some(value)) => match check(&format!("space.constraints.{field}"), value) {
            Ok(value) => Some(value),
            Err(error) => {
                problems.push(error);
                None
            }
        },
    }
}

/// Fill in the defaults around `scenario`, expand the lists and check everything; every problem
/// at once. `catalogue` is the catalogue the plans will use (built-in plus the scenario's classes).
pub fn resolve(
    space: &SearchSpace,
    scenario: &Scenario,
    catalogue: &[GeneratorClass],
) -> Result<ResolvedSpace, Vec<InputError>> {
    let mut problems = Vec::new();

    let bands_mhz = space.bands_mhz.clone().unwrap_or_else(|| default_bands(scenario, catalogue));
    if bands_mhz.is_empty() || bands_mhz.len() > BANDS_MAX {
        problems.push(InputError::new(
            "space.bands_mhz",
            format!("{} bands", bands_mhz.len()),
            format!("1 to {BANDS_MAX} bands served by the generator catalogue"),
        ));
    }
    for (index, freq) in bands_mhz.iter().enumerate() {
        let field = format!("space.bands_mhz[{index}]");
        match require_positive(&field, *freq, FREQUENCY_MAX_HZ / 1e6) {
            Err(error) => problems.push(error),
            Ok(freq) if !catalogue.iter().any(|class| class.serves_frequency(freq)) => problems.push(InputError::new(
                &field,
                freq,
                "a frequency served by a catalogue class (13.56, 27.12, 40.68, 896, 915 or 2450 MHz, or one of the scenario's extra classes)",
            )),
            Ok(freq) if bands_mhz[..index].iter().any(|earlier| same_value(*earlier, freq)) => {
                problems.push(InputError::new(&field, freq, "a band not listed before (distinct values)"))
            }
            Ok(_) => {}
        }
    }

    let class_entries = space.generator_classes.clone().unwrap_or_else(|| vec![ALL_CLASSES.to_string()]);
    if class_entries.is_empty() || class_entries.len() > CLASS_ENTRIES_MAX {
        problems.push(InputError::new(
            "space.generator_classes",
            format!("{} entries", class_entries.len()),
            format!("1 to {CLASS_ENTRIES_MAX} entries"),
        ));
    }
    let before_classes = problems.len();
    for (index, entry) in class_entries.iter().enumerate() {
        if entry == AUTO_CLASS || entry == ALL_CLASSES {
            continue;
        }
        let field = format!("space.generator_classes[{index}]");
        match catalogue.iter().find(|class| &class.id == entry) {
            None => problems.push(InputError::new(
                &field,
                crate::error::quoted(entry),
                "\"auto\", \"all\" or an id from the generator catalogue",
            )),
            Some(class) if !bands_mhz.iter().any(|freq| class.serves_frequency(*freq)) => {
                problems.push(InputError::new(
                    &field,
                    crate::error::quoted(entry),
                    format!("a class serving one of bands_mhz (this one runs at {} MHz)", class.freq_mhz),
                ))
            }
            Some(_) => {}
        }
    }
    let bands: Vec<BandChoices> = bands_mhz
        .iter()
        .map(|&freq| {
            let mut choices: Vec<ClassChoice> = Vec::new();
            for entry in &class_entries {
                let expanded: Vec<ClassChoice> = if entry == AUTO_CLASS {
                    vec![ClassChoice::Auto]
                } else if entry == ALL_CLASSES {
                    catalogue
                        .iter()
                        .filter(|class| class.serves_frequency(freq))
                        .map(|class| ClassChoice::Named(class.id.clone()))
                        .collect()
                } else {
                    catalogue
                        .iter()
                        .filter(|class| &class.id == entry && class.serves_frequency(freq))
                        .map(|class| ClassChoice::Named(class.id.clone()))
                        .collect()
                };
                for choice in expanded {
                    if !choices.contains(&choice) {
                        choices.push(choice);
                    }
                }
            }
            BandChoices {
                frequency_mhz: freq,
                ism_band: band_containing(freq).map(|band| band.name),
                generator_classes: choices,
            }
        })
        .collect();
    // A band left without classes, unless a wrong class entry (already named) is the cause.
    let classes_valid = problems.len() == before_classes;
    for (index, band) in bands.iter().enumerate() {
        let served = catalogue.iter().any(|class| class.serves_frequency(band.frequency_mhz));
        if band.generator_classes.is_empty() && served && classes_valid {
            problems.push(InputError::new(
                format!("space.bands_mhz[{index}]"),
                band.frequency_mhz,
                "a band served by one of generator_classes",
            ));
        }
    }

    let belt_width_m = match &space.belt_width_m {
        Some(grid) => grid_values(Dimension::BeltWidth, grid, &mut problems),
        None => Dimension::BeltWidth.around(scenario.tunnel.belt_width_m),
    };
    let bed_depth_m = match &space.bed_depth_m {
        Some(grid) => grid_values(Dimension::BedDepth, grid, &mut problems),
        None => Dimension::BedDepth.around(scenario.tunnel.bed_depth_m),
    };

    let zones = space.zones.clone().unwrap_or_else(|| vec![scenario.tunnel.zones]);
    if zones.is_empty() || zones.len() > ZONE_COUNTS_MAX {
        problems.push(InputError::new(
            "space.zones",
            format!("{} zone counts", zones.len()),
            format!("1 to {ZONE_COUNTS_MAX} zone counts"),
        ));
    }
    for (index, count) in zones.iter().enumerate() {
        let field = format!("space.zones[{index}]");
        if *count == 0 || *count > ZONES_MAX {
            problems.push(InputError::new(&field, count, format!("1 to {ZONES_MAX}")));
        } else if zones[..index].contains(count) {
            problems.push(InputError::new(&field, count, "a zone count not listed before (distinct values)"));
        }
    }

    let redundancy = space.redundancy.clone().unwrap_or_else(|| vec![scenario.generator.redundancy]);
    if redundancy.is_empty() || (redundancy.len() == 2 && redundancy[0] == redundancy[1]) || redundancy.len() > 2 {
        problems.push(InputError::new(
            "space.redundancy",
            format!("{} entries", redundancy.len()),
            "\"n\", \"n_plus_1\" or both, each once",
        ));
    }

    let settings = &space.constraints;
    let p = &mut problems;
    let constraints = Constraints {
        max_tunnel_length_m: constraint(
            "max_tunnel_length_m",
            settings.max_tunnel_length_m,
            Some(LONG_TUNNEL_M),
            |field, value| require_in(field, value, 0.1, 1000.0),
            p,
        ),
        max_bed_over_penetration_depth: constraint(
            "max_bed_over_penetration_depth",
            settings.max_bed_over_penetration_depth,
            Some(BED_OVER_DP_LIMIT_ONE_SIDE),
            |field, value| require_in(field, value, 0.01, 100.0),
            p,
        ),
        max_peak_field_v_per_m: constraint(
            "max_peak_field_v_per_m",
            settings.max_peak_field_v_per_m,
            Some(FIELD_ARCING_CONCERN_V_PER_M),
            |field, value| require_positive(field, value, 1e9),
            p,
        ),
        max_product_temp_c: constraint(
            "max_product_temp_c",
            settings.max_product_temp_c,
            None,
            |field, value| require_in(field, value, TEMP_MIN_C, TEMP_MAX_C),
            p,
        ),
        min_core_to_surface_ratio: constraint(
            "min_core_to_surface_ratio",
            settings.min_core_to_surface_ratio,
            None,
            |field, value| require_in(field, value, 0.0, 1.0),
            p,
        ),
    };

    let objective = space.objective.unwrap_or(Objective::GeneratorCount);
    problems.extend(objective.validate());
    let best = space.best.unwrap_or(BEST_DEFAULT);
    if best == 0 || best > BEST_MAX {
        problems.push(InputError::new("space.best", best, format!("1 to {BEST_MAX}")));
    }

    let mut resolved = ResolvedSpace {
        bands,
        belt_width_m,
        bed_depth_m,
        zones,
        redundancy,
        constraints,
        fed_faces: match scenario.tunnel.feed {
            FeedSides::Top => 1,
            FeedSides::Both => 2,
        },
        objective,
        best,
        configurations: 0,
    };
    if !problems.is_empty() {
        return Err(problems);
    }
    let total =
        (0..resolved.bands.len()).fold(0_usize, |sum, band| sum.saturating_add(resolved.configurations_in_band(band)));
    if total > CONFIGURATIONS_MAX {
        return Err(vec![InputError::new(
            "space",
            format!("{total} configurations"),
            format!(
                "at most {CONFIGURATIONS_MAX} (bands x generator classes x belt widths x bed depths x zone counts x redundancies); narrow an axis"
            ),
        )]);
    }
    resolved.configurations = total;
    Ok(resolved)
}
