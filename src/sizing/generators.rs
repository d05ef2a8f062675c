//! Generator classes and how many of one class a line needs.
//!
//!   count = ceil(P_out / (P_rated * f_max)),  N+1 adds one standby unit,
//! where P_out is the generator output the line needs and f_max the highest fraction of its rating
//! a unit is run at (tubes last longer below full rating: common practice, 0.85-0.95 per
//! shared/sources.md 10.2). The built-in catalogue is the data file `generators.json` beside this
//! module; a scenario may add classes of its own (`extra_generators`).

use crate::error::{require_in, require_positive, InputError};
use crate::physics::bands::band_containing;
use serde::{Deserialize, Serialize};
use std::sync::OnceLock;

/// What kind of source a class is.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum GeneratorKind {
    /// Continuous-wave magnetron.
    Magnetron,
    /// Solid-state amplifier chain.
    SolidState,
    /// Valve (triode/tetrode) RF oscillator.
    RfOscillator,
}

/// One generic generator class.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct GeneratorClass {
    /// Short identifier used in scenarios (`mw-915-75`).
    pub id: String,
    /// Words for people.
    pub label: String,
    /// Magnetron, solid state or RF oscillator.
    pub kind: GeneratorKind,
    /// Operating frequency, MHz.
    pub freq_mhz: f64,
    /// Rated continuous output, kW.
    pub rated_output_kw: f64,
    /// Output power / electrical input to the generator stage (anode efficiency for a tube).
    pub generator_efficiency: f64,
    /// Efficiency of the high-voltage or DC supply feeding it, from the mains.
    pub power_supply_efficiency: f64,
    /// Highest fraction of the rating it is planned to run at.
    pub max_operating_fraction: f64,
    /// Lowest fraction of the rating at which it runs stably.
    pub min_operating_fraction: f64,
    /// `water` or `air`.
    pub cooling: String,
    /// Typical anode or supply voltage, kV (for the high-voltage caution).
    pub anode_kv: f64,
    /// How sure the figures are: `published`, `common practice`, `from memory`, `user`.
    pub confidence: String,
}

#[derive(Deserialize)]
struct CatalogueFile {
    classes: Vec<GeneratorClass>,
}

const CATALOGUE_JSON: &str = include_str!("generators.json");

/// The built-in catalogue, parsed once. A malformed file is caught by this module's tests.
pub fn builtin_catalogue() -> &'static [GeneratorClass] {
    static CATALOGUE: OnceLock<Vec<GeneratorClass>> = OnceLock::new();
    CATALOGUE.get_or_init(|| {
        serde_json::from_str::<serde_json::Value>(CATALOGUE_JSON)
            .and_then(serde_json::from_value::<CatalogueFile>)
            .map(|file| file.classes)
            .unwrap_or_default()
    })
}

impl GeneratorClass {
    /// Check a class entered by a user; every problem named at once.
    pub fn validate(&self) -> Vec<InputError> {
        let mut problems = Vec::new();
        let mut check = |result: Result<f64, InputError>| {
            if let Err(error) = result {
                problems.push(error);
            }
        };
        check(require_positive("freq_mhz", self.freq_mhz, 300_000.0));
        check(require_positive("rated_output_kw", self.rated_output_kw, 10_000.0));
        check(require_in("generator_efficiency", self.generator_efficiency, 0.05, 1.0));
        check(require_in("power_supply_efficiency", self.power_supply_efficiency, 0.05, 1.0));
        check(require_in("max_operating_fraction", self.max_operating_fraction, 0.1, 1.0));
        check(require_in(
            "min_operating_fraction",
            self.min_operating_fraction,
            0.0,
            self.max_operating_fraction.clamp(0.0, 1.0),
        ));
        check(require_in("anode_kv", self.anode_kv, 0.0, 100.0));
        if self.id.trim().is_empty() || self.id.len() > 64 {
            problems.push(InputError::new("id", crate::error::quoted(&self.id), "1 to 64 characters"));
        }
        problems
    }

    /// Output a unit may be planned to give, kW.
    pub fn usable_output_kw(&self) -> f64 {
        self.rated_output_kw * self.max_operating_fraction
    }

    /// True when the class can feed a line at `freq_mhz`: same ISM band, or within 0.5 % outside any band.
    pub fn serves_frequency(&self, freq_mhz: f64) -> bool {
        match (band_containing(self.freq_mhz), band_containing(freq_mhz)) {
            (Some(own), Some(wanted)) => own.name == wanted.name,
            _ => ((self.freq_mhz - freq_mhz) / freq_mhz).abs() < 0.005,
        }
    }
}

/// Whether a standby unit is added.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Redundancy {
    /// Exactly as many units as the load needs.
    N,
    /// One more than needed, kept as standby.
    #[serde(rename = "n_plus_1")]
    NPlus1,
}

/// The generators chosen for a line.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct GeneratorSelection {
    /// The class used.
    pub class: GeneratorClass,
    /// Units that carry the load.
    pub running_count: u32,
    /// Standby units (0 or 1).
    pub standby_count: u32,
    /// Output each running unit gives, kW.
    pub output_per_unit_kw: f64,
    /// That output as a fraction of the rating (the operating point).
    pub operating_fraction: f64,
    /// Whether the class was picked automatically.
    pub picked_automatically: bool,
}

impl GeneratorSelection {
    /// Running plus standby.
    pub fn total_count(&self) -> u32 {
        self.running_count + self.standby_count
    }
}

/// Why no generator could be chosen.
#[derive(Debug, Clone, PartialEq)]
pub enum SelectionError {
    /// The named class is not in the catalogue.
    UnknownClass(String),
    /// The named class runs at another frequency.
    WrongBand {
        /// The class named.
        class_id: String,
        /// Its frequency, MHz.
        class_mhz: f64,
        /// The scenario's frequency, MHz.
        wanted_mhz: f64,
    },
    /// No class in the catalogue serves the frequency.
    NoClassForBand(f64),
    /// More units than any line would hold.
    TooMany {
        /// The class named or tried.
        class_id: String,
        /// Units it would take.
        count: f64,
    },
}

impl SelectionError {
    /// As an input error on the scenario field that caused it.
    pub fn to_input_error(&self) -> InputError {
        match self {
            SelectionError::UnknownClass(id) => InputError::new("generator_class", crate::error::quoted(id), "an id from the generator catalogue (doubleprime generators)"),
            SelectionError::WrongBand { class_id, class_mhz, wanted_mhz } => InputError::new(
                "generator_class",
                crate::error::quoted(class_id),
                format!("a class at {wanted_mhz} MHz (this one runs at {class_mhz} MHz)"),
            ),
            SelectionError::NoClassForBand(freq) => InputError::new("frequency_mhz", freq, "a frequency served by a catalogue class (13.56, 27.12, 40.68, 896, 915 or 2450 MHz), or add a class in extra_generators"),
            SelectionError::TooMany { class_id, count } => InputError::new("generator_class", crate::error::quoted(class_id), format!("a larger class: {count:.0} units would be needed, more than 1000")),
        }
    }
}

/// Most units one plan may call for; beyond that the class is far too small for the load.
const MAX_UNITS: f64 = 1000.0;

/// Running units of `class` for a needed output and the output per unit, kW; the raw count
/// when it is more than [`MAX_UNITS`] (or not finite).
fn unit_count(class: &GeneratorClass, output_needed_kw: f64) -> Result<(u32, f64), f64> {
    let raw_count = (output_needed_kw / class.usable_output_kw()).ceil().max(1.0);
    if !raw_count.is_finite() || raw_count > MAX_UNITS {
        return Err(raw_count);
    }
    let running_count = raw_count as u32;
    Ok((running_count, output_needed_kw / f64::from(running_count)))
}

/// Size `class` for a needed generator output.
pub fn size_with(
    class: &GeneratorClass,
    output_needed_kw: f64,
    redundancy: Redundancy,
    picked_automatically: bool,
) -> Result<GeneratorSelection, SelectionError> {
    let (running_count, output_per_unit_kw) = unit_count(class, output_needed_kw)
        .map_err(|raw_count| SelectionError::TooMany { class_id: class.id.clone(), count: raw_count })?;
    Ok(GeneratorSelection {
        class: class.clone(),
        running_count,
        standby_count: u32::from(redundancy == Redundancy::NPlus1),
        output_per_unit_kw,
        operating_fraction: output_per_unit_kw / class.rated_output_kw,
        picked_automatically,
    })
}

/// Choose a class: the named one, or automatically the one needing fewest units, and among
/// those the smallest rating (it runs nearest its planned operating point).
pub fn select(
    catalogue: &[GeneratorClass],
    class_id: Option<&str>,
    freq_mhz: f64,
    output_needed_kw: f64,
    redundancy: Redundancy,
) -> Result<GeneratorSelection, SelectionError> {
    if let Some(id) = class_id {
        let class = catalogue
            .iter()
            .find(|class| class.id == id)
            .ok_or_else(|| SelectionError::UnknownClass(id.to_string()))?;
        if !class.serves_frequency(freq_mhz) {
            return Err(SelectionError::WrongBand {
                class_id: id.to_string(),
                class_mhz: class.freq_mhz,
                wanted_mhz: freq_mhz,
            });
        }
        return size_with(class, output_needed_kw, redundancy, false);
    }
    // Classes are compared by reference; only the one chosen is copied into the selection (a
    // plan's sensitivity rows select a dozen times).
    struct Candidate<'c> {
        class: &'c GeneratorClass,
        running_count: u32,
        operating_fraction: f64,
    }
    let candidates: Vec<Candidate> = catalogue
        .iter()
        .filter(|class| class.serves_frequency(freq_mhz))
        .filter_map(|class| {
            let (running_count, output_per_unit_kw) = unit_count(class, output_needed_kw).ok()?;
            Some(Candidate { class, running_count, operating_fraction: output_per_unit_kw / class.rated_output_kw })
        })
        .collect();
    // A unit run below its stable minimum is a poor pick; use such classes only if nothing else fits.
    let stable: Vec<&Candidate> =
        candidates.iter().filter(|c| c.operating_fraction >= c.class.min_operating_fraction).collect();
    let pool: Vec<&Candidate> = if stable.is_empty() { candidates.iter().collect() } else { stable };
    let chosen = pool.into_iter().min_by(|a, b| {
        (a.running_count, a.class.rated_output_kw)
            .partial_cmp(&(b.running_count, b.class.rated_output_kw))
            .unwrap_or(std::cmp::Ordering::Equal)
    });
    match chosen {
        Some(candidate) => size_with(candidate.class, output_needed_kw, redundancy, true),
        None => Err(SelectionError::NoClassForBand(freq_mhz)),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn builtin_catalogue_parses_and_validates() {
        let catalogue = builtin_catalogue();
        assert!(catalogue.len() >= 15, "catalogue failed to parse or is short: {}", catalogue.len());
        for class in catalogue {
            assert!(class.validate().is_empty(), "{}: {:?}", class.id, class.validate());
            assert!(band_containing(class.freq_mhz).is_some(), "{} is outside every band", class.id);
        }
        let mut ids: Vec<&str> = catalogue.iter().map(|c| c.id.as_str()).collect();
        ids.sort_unstable();
        ids.dedup();
        assert_eq!(ids.len(), catalogue.len(), "ids are unique");
    }

    #[test]
    fn count_is_the_ceiling_over_the_derated_rating() {
        // sources.md 10.2 step 4: N = ceil(P_MW / (P_tube k_derate)). 200 kW over 75 kW x 0.9 = 2.96 -> 3.
        let class = builtin_catalogue().iter().find(|c| c.id == "mw-915-75").unwrap();
        let plan = size_with(class, 200.0, Redundancy::N, false).unwrap();
        assert_eq!(plan.running_count, 3);
        assert_relative_eq!(plan.operating_fraction, 200.0 / 3.0 / 75.0);
        let spare = size_with(class, 200.0, Redundancy::NPlus1, false).unwrap();
        assert_eq!(spare.total_count(), 4);
        // Exactly at the derated rating: 2 units of 67.5 kW make 135 kW, no third unit.
        assert_eq!(size_with(class, 135.0, Redundancy::N, false).unwrap().running_count, 2);
    }

    #[test]
    fn automatic_pick_prefers_fewest_units_then_smallest_rating() {
        let catalogue = builtin_catalogue();
        // 40 kW at 915 MHz: 50, 75 and 100 kW classes all need one unit; 50 kW runs nearest its point.
        let pick = select(catalogue, None, 915.0, 40.0, Redundancy::N).unwrap();
        assert_eq!(pick.class.id, "mw-915-50");
        let pick = select(catalogue, None, 2450.0, 20.0, Redundancy::N).unwrap();
        assert_eq!((pick.class.id.as_str(), pick.running_count), ("mw-2450-30", 1));
    }

    #[test]
    fn named_class_must_match_the_band() {
        let catalogue = builtin_catalogue();
        assert!(matches!(
            select(catalogue, Some("mw-2450-6"), 915.0, 10.0, Redundancy::N),
            Err(SelectionError::WrongBand { .. })
        ));
        assert!(matches!(
            select(catalogue, Some("nope"), 915.0, 10.0, Redundancy::N),
            Err(SelectionError::UnknownClass(_))
        ));
        assert!(matches!(select(catalogue, None, 5800.0, 10.0, Redundancy::N), Err(SelectionError::NoClassForBand(_))));
        assert!(matches!(
            select(catalogue, Some("mw-2450-1"), 2450.0, 5000.0, Redundancy::N),
            Err(SelectionError::TooMany { .. })
        ));
    }
}
