//! The scenario form as plain text: every field as typed, and the two conversions between that and
//! a [`Scenario`]. Pure functions, so native unit tests cover them.
//!
//! Reading the form names every problem at once: a field whose text is not a number gets its own
//! message, and the core's validation runs over the rest (the unreadable fields stand in as NaN,
//! and the core's complaints about those are dropped, since the reading problem says more).

use crate::decimal_field::parse_decimal;
use crate::fields::{Key, Kind, KEY_COUNT};
use doubleprime::error::InputError;
use doubleprime::materials::custom::{CustomDielectric, CustomMaterialSpec};
use doubleprime::scenario::{
    validate, BackingSpec, EfficiencyInput, FeedSides, GeneratorChoice, LoadStack, ProcessKind, ProductSpec,
    ProductState, ProjectFields, Scenario, Slab, TunnelSpec, SCHEMA_VERSION,
};
use doubleprime::sizing::energy_balance::LossAllowances;
use doubleprime::sizing::generators::Redundancy;
use doubleprime::sizing::tunnel::ResidenceRule;
use doubleprime::sizing::utilities::SiteInput;

/// Every process kind, in the order the form lists them.
pub const PROCESSES: [ProcessKind; 6] = [
    ProcessKind::Heating,
    ProcessKind::Pasteurising,
    ProcessKind::Tempering,
    ProcessKind::Thawing,
    ProcessKind::Drying,
    ProcessKind::Curing,
];

/// Choice texts of [`Key::ProductSource`].
pub const SOURCE_LIBRARY: &str = "library";
/// The user describes the product.
pub const SOURCE_CUSTOM: &str = "custom";
/// Choice texts of [`Key::ResidenceRule`], named after the scenario's residence fields.
pub const RULE_LENGTH: &str = "tunnel_length_m";
/// Time under power given.
pub const RULE_TIME: &str = "residence_time_s";
/// Heating rate given.
pub const RULE_RATE: &str = "heating_rate_k_per_min";

/// Starting values of a user-defined product: a moist food-like material, so that switching to
/// "my own material" gives a plan straight away.
const CUSTOM_START: [(Key, &str); 5] = [
    (Key::CustomName, "My product"),
    (Key::CustomEpsReal, "50"),
    (Key::CustomEpsImag, "15"),
    (Key::CustomDensity, "1000"),
    (Key::CustomSpecificHeat, "3500"),
];

/// Every field's text, as typed.
#[derive(Debug, Clone, PartialEq)]
pub struct FormValues {
    texts: Vec<String>,
}

/// A number as form text: the shortest text that reads back to the same number.
fn number_text(value: f64) -> String {
    format!("{value}")
}

fn optional_text(value: Option<f64>) -> String {
    value.map(number_text).unwrap_or_default()
}

impl FormValues {
    /// An empty form (every text blank).
    pub fn blank() -> Self {
        Self { texts: vec![String::new(); KEY_COUNT] }
    }

    /// A form whose every field's text is `text_of(key)`.
    pub fn from_fn(text_of: impl Fn(Key) -> String) -> Self {
        Self { texts: Key::all().map(text_of).collect() }
    }

    /// The text of one field.
    pub fn get(&self, key: Key) -> &str {
        self.texts.get(key as usize).map_or("", String::as_str)
    }

    /// Replace the text of one field.
    pub fn set(&mut self, key: Key, text: impl Into<String>) {
        if let Some(slot) = self.texts.get_mut(key as usize) {
            *slot = text.into();
        }
    }

    /// The form showing `scenario`. For every scenario the form can hold,
    /// `FormValues::from_scenario(s).to_scenario() == Ok(s)`.
    pub fn from_scenario(scenario: &Scenario) -> Self {
        let mut form = Self::blank();
        let mut set = |key: Key, text: String| form.set(key, text);
        for (key, text) in CUSTOM_START {
            set(key, text.to_string());
        }
        set(Key::Library, "water".to_string());
        match (&scenario.product.library, &scenario.product.custom) {
            (_, Some(custom)) => {
                set(Key::ProductSource, SOURCE_CUSTOM.to_string());
                set(Key::CustomName, custom.name.clone());
                set(Key::CustomDensity, number_text(custom.density_kg_per_m3));
                set(Key::CustomSpecificHeat, number_text(custom.specific_heat_j_per_kg_k));
                set(Key::CustomSource, custom.source.clone().unwrap_or_default());
                // The form holds one constant value; a table brings its first point.
                let (eps_real, eps_imag) = match &custom.dielectric {
                    CustomDielectric::Constant { eps_real, eps_imag, .. } => (*eps_real, *eps_imag),
                    CustomDielectric::Table { points } => {
                        points.first().map_or((1.0, 0.0), |p| (p.eps_real, p.eps_imag))
                    }
                };
                set(Key::CustomEpsReal, number_text(eps_real));
                set(Key::CustomEpsImag, number_text(eps_imag));
            }
            (library, None) => {
                set(Key::ProductSource, SOURCE_LIBRARY.to_string());
                set(Key::Library, library.clone().unwrap_or_default());
            }
        }
        set(Key::SaltPct, optional_text(scenario.salt_pct));
        set(Key::Process, scenario.process.as_str().to_string());
        set(Key::Throughput, number_text(scenario.throughput_kg_per_h));
        set(Key::InletTemp, number_text(scenario.inlet.temp_c));
        set(Key::OutletTemp, number_text(scenario.outlet.temp_c));
        set(Key::InletMoisture, optional_text(scenario.inlet.moisture_wb));
        set(Key::OutletMoisture, optional_text(scenario.outlet.moisture_wb));
        set(Key::Pressure, number_text(scenario.pressure_kpa));
        set(Key::EvaporationTemp, optional_text(scenario.evaporation_temp_c));
        set(Key::Frequency, number_text(scenario.frequency_mhz));
        set(Key::GeneratorClass, scenario.generator.class.clone().unwrap_or_default());
        set(Key::Redundancy, redundancy_text(scenario.generator.redundancy).to_string());
        let efficiency = &scenario.efficiency;
        set(Key::EffPowerSupply, optional_text(efficiency.power_supply));
        set(Key::EffGenerator, optional_text(efficiency.generator));
        set(Key::EffTransmission, number_text(efficiency.transmission));
        set(Key::EffApplicator, number_text(efficiency.applicator));
        let tunnel = &scenario.tunnel;
        set(Key::BeltWidth, number_text(tunnel.belt_width_m));
        set(Key::BedDepth, number_text(tunnel.bed_depth_m));
        set(Key::BulkDensity, optional_text(tunnel.bulk_density_kg_per_m3));
        // The rules not chosen keep a sensible value for when the user switches to them.
        set(Key::TunnelLength, "5".to_string());
        set(Key::ResidenceTime, "300".to_string());
        set(Key::HeatingRate, "20".to_string());
        let (rule, key, value) = match tunnel.residence {
            ResidenceRule::TunnelLengthM(length) => (RULE_LENGTH, Key::TunnelLength, length),
            ResidenceRule::ResidenceTimeS(time) => (RULE_TIME, Key::ResidenceTime, time),
            ResidenceRule::HeatingRateKPerMin(rate) => (RULE_RATE, Key::HeatingRate, rate),
        };
        set(Key::ResidenceRule, rule.to_string());
        set(key, number_text(value));
        set(Key::Feed, feed_text(tunnel.feed).to_string());
        set(Key::Zones, tunnel.zones.to_string());
        // Typical carrier values, used only once a thickness is entered.
        set(Key::TrayEpsReal, "2.25".to_string());
        set(Key::TrayEpsImag, "0.001".to_string());
        set(Key::CarrierBeltEpsReal, "2.9".to_string());
        set(Key::CarrierBeltEpsImag, "0.004".to_string());
        set(Key::Backing, "air".to_string());
        if let Some(stack) = &tunnel.load_stack {
            for (slab, thickness, eps_real, eps_imag) in [
                (&stack.tray, Key::TrayThickness, Key::TrayEpsReal, Key::TrayEpsImag),
                (&stack.belt, Key::CarrierBeltThickness, Key::CarrierBeltEpsReal, Key::CarrierBeltEpsImag),
            ] {
                if let Some(slab) = slab {
                    set(thickness, number_text(slab.thickness_m));
                    set(eps_real, number_text(slab.eps_real));
                    set(eps_imag, number_text(slab.eps_imag));
                }
            }
            if stack.air_gap_m != 0.0 {
                set(Key::AirGap, number_text(stack.air_gap_m));
            }
            set(Key::Backing, backing_text(stack.backing).to_string());
        }
        let losses = &scenario.losses;
        set(Key::SurfaceLoss, number_text(losses.surface_pct));
        set(Key::BeltLoss, number_text(losses.belt_pct));
        set(Key::VapourLoss, number_text(losses.vapour_pct));
        let site = &scenario.site;
        set(Key::PowerFactor, number_text(site.power_factor));
        set(Key::CoolingRise, number_text(site.cooling_water_rise_k));
        set(Key::Tariff, number_text(site.tariff_per_kwh));
        set(Key::Currency, site.currency.clone());
        set(Key::OperatingHours, number_text(site.operating_hours_per_year));
        set(Key::AuxiliaryPower, number_text(site.auxiliary_kw));
        set(Key::Name, scenario.name.clone());
        set(Key::Description, scenario.description.clone());
        let project = &scenario.project;
        for (key, text) in [
            (Key::Customer, &project.customer),
            (Key::Site, &project.site),
            (Key::Author, &project.author),
            (Key::Date, &project.date),
            (Key::Reference, &project.reference),
            (Key::Notes, &project.notes),
        ] {
            set(key, text.clone());
        }
        form
    }

    /// Read the form into a scenario, or every problem found, each naming its field.
    pub fn to_scenario(&self) -> Result<Scenario, Vec<InputError>> {
        let mut reader = Reader { form: self, problems: Vec::new(), unreadable: Vec::new() };
        let r = &mut reader;
        let product = if self.get(Key::ProductSource) == SOURCE_CUSTOM {
            let source = self.get(Key::CustomSource).trim();
            ProductSpec {
                library: None,
                custom: Some(CustomMaterialSpec {
                    name: self.get(Key::CustomName).to_string(),
                    density_kg_per_m3: r.required(Key::CustomDensity),
                    specific_heat_j_per_kg_k: r.required(Key::CustomSpecificHeat),
                    dielectric: CustomDielectric::Constant {
                        eps_real: r.required(Key::CustomEpsReal),
                        eps_imag: r.required(Key::CustomEpsImag),
                        freq_range_mhz: None,
                        temp_range_c: None,
                    },
                    source: (!source.is_empty()).then(|| source.to_string()),
                }),
            }
        } else {
            ProductSpec { library: Some(self.get(Key::Library).to_string()), custom: None }
        };
        let process = r.choice(Key::Process, parse_process).unwrap_or(ProcessKind::Heating);
        let residence = match self.get(Key::ResidenceRule) {
            RULE_TIME => ResidenceRule::ResidenceTimeS(r.required(Key::ResidenceTime)),
            RULE_RATE => ResidenceRule::HeatingRateKPerMin(r.required(Key::HeatingRate)),
            _ => ResidenceRule::TunnelLengthM(r.required(Key::TunnelLength)),
        };
        let slab = |r: &mut Reader, thickness: Key, eps_real: Key, eps_imag: Key| {
            r.optional(thickness).map(|thickness_m| Slab {
                thickness_m,
                eps_real: r.required(eps_real),
                eps_imag: r.required(eps_imag),
            })
        };
        let tray = slab(r, Key::TrayThickness, Key::TrayEpsReal, Key::TrayEpsImag);
        let belt = slab(r, Key::CarrierBeltThickness, Key::CarrierBeltEpsReal, Key::CarrierBeltEpsImag);
        let air_gap_m = r.optional(Key::AirGap).unwrap_or(0.0);
        let backing = r.choice(Key::Backing, parse_backing).unwrap_or(BackingSpec::Air);
        let load_stack = (tray.is_some() || belt.is_some() || air_gap_m != 0.0 || backing != BackingSpec::Air)
            .then_some(LoadStack { tray, belt, air_gap_m, backing });
        let class = self.get(Key::GeneratorClass).trim();
        let scenario = Scenario {
            schema: SCHEMA_VERSION,
            name: self.get(Key::Name).to_string(),
            description: self.get(Key::Description).to_string(),
            project: ProjectFields {
                customer: self.get(Key::Customer).to_string(),
                site: self.get(Key::Site).to_string(),
                author: self.get(Key::Author).to_string(),
                date: self.get(Key::Date).to_string(),
                reference: self.get(Key::Reference).to_string(),
                notes: self.get(Key::Notes).to_string(),
            },
            process,
            product,
            salt_pct: r.optional(Key::SaltPct),
            throughput_kg_per_h: r.required(Key::Throughput),
            inlet: ProductState { temp_c: r.required(Key::InletTemp), moisture_wb: r.optional(Key::InletMoisture) },
            outlet: ProductState { temp_c: r.required(Key::OutletTemp), moisture_wb: r.optional(Key::OutletMoisture) },
            pressure_kpa: r.required(Key::Pressure),
            evaporation_temp_c: r.optional(Key::EvaporationTemp),
            frequency_mhz: r.required(Key::Frequency),
            generator: GeneratorChoice {
                class: (!class.is_empty()).then(|| class.to_string()),
                redundancy: r.choice(Key::Redundancy, parse_redundancy).unwrap_or(Redundancy::N),
                extra_classes: Vec::new(),
            },
            efficiency: EfficiencyInput {
                power_supply: r.optional(Key::EffPowerSupply),
                generator: r.optional(Key::EffGenerator),
                transmission: r.required(Key::EffTransmission),
                applicator: r.required(Key::EffApplicator),
            },
            tunnel: TunnelSpec {
                belt_width_m: r.required(Key::BeltWidth),
                bed_depth_m: r.required(Key::BedDepth),
                bulk_density_kg_per_m3: r.optional(Key::BulkDensity),
                residence,
                feed: r.choice(Key::Feed, parse_feed).unwrap_or(FeedSides::Top),
                zones: r.integer(Key::Zones),
                load_stack,
            },
            losses: LossAllowances {
                surface_pct: r.required(Key::SurfaceLoss),
                belt_pct: r.required(Key::BeltLoss),
                vapour_pct: r.required(Key::VapourLoss),
            },
            site: SiteInput {
                power_factor: r.required(Key::PowerFactor),
                cooling_water_rise_k: r.required(Key::CoolingRise),
                tariff_per_kwh: r.required(Key::Tariff),
                currency: self.get(Key::Currency).to_string(),
                operating_hours_per_year: r.required(Key::OperatingHours),
                auxiliary_kw: r.required(Key::AuxiliaryPower),
            },
        };
        let Reader { mut problems, unreadable, .. } = reader;
        if problems.is_empty() {
            return Ok(scenario);
        }
        let unreadable_fields: Vec<&str> = unreadable.iter().map(|key| key.spec().field).collect();
        problems
            .extend(validate(&scenario).into_iter().filter(|error| !unreadable_fields.contains(&error.field.as_str())));
        Err(problems)
    }
}

/// Reads numbers out of the form, collecting a problem per unreadable field.
struct Reader<'a> {
    form: &'a FormValues,
    problems: Vec<InputError>,
    unreadable: Vec<Key>,
}

impl Reader<'_> {
    fn refuse(&mut self, key: Key, value: &str, valid: &str) {
        self.problems.push(InputError::new(key.spec().field, format!("\u{201c}{value}\u{201d}"), valid));
        self.unreadable.push(key);
    }

    /// A number the scenario needs; NaN (and a problem) when the text is blank or not a number.
    fn required(&mut self, key: Key) -> f64 {
        let text = self.form.get(key).trim().to_string();
        if text.is_empty() {
            self.refuse(key, "", "a number (this field is needed)");
            return f64::NAN;
        }
        match parse_decimal(&text) {
            Some(value) => value,
            None => {
                self.refuse(key, &text, "a number such as 12.5 or 12,5");
                f64::NAN
            }
        }
    }

    /// A number the scenario may leave out: blank is `None`.
    fn optional(&mut self, key: Key) -> Option<f64> {
        if self.form.get(key).trim().is_empty() {
            None
        } else {
            Some(self.required(key))
        }
    }

    /// A whole number; 0 (and a problem) when unreadable.
    fn integer(&mut self, key: Key) -> u32 {
        debug_assert_eq!(key.spec().kind, Kind::Integer);
        let text = self.form.get(key).trim().to_string();
        match text.parse::<u32>() {
            Ok(value) => value,
            Err(_) => {
                self.refuse(key, &text, "a whole number");
                0
            }
        }
    }

    fn choice<T>(&mut self, key: Key, parse: fn(&str) -> Option<T>) -> Option<T> {
        let text = self.form.get(key).to_string();
        let value = parse(&text);
        if value.is_none() {
            self.refuse(key, &text, "one of the listed choices");
        }
        value
    }
}

/// A process kind from its scenario name.
pub fn parse_process(text: &str) -> Option<ProcessKind> {
    PROCESSES.into_iter().find(|process| process.as_str() == text)
}

fn redundancy_text(redundancy: Redundancy) -> &'static str {
    match redundancy {
        Redundancy::N => "n",
        Redundancy::NPlus1 => "n_plus_1",
    }
}

fn parse_redundancy(text: &str) -> Option<Redundancy> {
    match text {
        "n" => Some(Redundancy::N),
        "n_plus_1" => Some(Redundancy::NPlus1),
        _ => None,
    }
}

fn feed_text(feed: FeedSides) -> &'static str {
    match feed {
        FeedSides::Top => "top",
        FeedSides::Both => "both",
    }
}

fn parse_feed(text: &str) -> Option<FeedSides> {
    match text {
        "top" => Some(FeedSides::Top),
        "both" => Some(FeedSides::Both),
        _ => None,
    }
}

fn backing_text(backing: BackingSpec) -> &'static str {
    match backing {
        BackingSpec::Air => "air",
        BackingSpec::Metal => "metal",
    }
}

fn parse_backing(text: &str) -> Option<BackingSpec> {
    match text {
        "air" => Some(BackingSpec::Air),
        "metal" => Some(BackingSpec::Metal),
        _ => None,
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::demos::DEMOS;
    use crate::fields::SPECS;

    fn start() -> FormValues {
        FormValues::from_scenario(&DEMOS[0].scenario().unwrap())
    }

    fn fields_of(errors: &[InputError]) -> Vec<&str> {
        errors.iter().map(|error| error.field.as_str()).collect()
    }

    #[test]
    fn every_demo_round_trips_through_the_form() {
        for demo in DEMOS {
            let scenario = demo.scenario().unwrap();
            assert_eq!(FormValues::from_scenario(&scenario).to_scenario(), Ok(scenario), "{}", demo.name);
        }
    }

    #[test]
    fn decimal_commas_and_points_read_alike() {
        let mut form = start();
        form.set(Key::Throughput, "2500,5");
        assert_eq!(form.to_scenario().unwrap().throughput_kg_per_h, 2500.5);
        form.set(Key::Throughput, " 2500.5 ");
        assert_eq!(form.to_scenario().unwrap().throughput_kg_per_h, 2500.5);
    }

    #[test]
    fn unreadable_and_invalid_fields_are_all_named() {
        let mut form = start();
        form.set(Key::Throughput, "abc");
        form.set(Key::BedDepth, "-1");
        form.set(Key::Zones, "2.5");
        let errors = form.to_scenario().unwrap_err();
        let fields = fields_of(&errors);
        assert!(fields.contains(&"throughput_kg_per_h"), "{fields:?}");
        assert!(fields.contains(&"tunnel.bed_depth_m"), "{fields:?}");
        assert!(fields.contains(&"tunnel.zones"), "{fields:?}");
        // The reading problem, not the core's complaint about a NaN.
        let throughput: Vec<_> = errors.iter().filter(|e| e.field == "throughput_kg_per_h").collect();
        assert_eq!(throughput.len(), 1);
        assert!(throughput[0].valid.contains("a number"), "{throughput:?}");
    }

    #[test]
    fn a_blank_optional_field_is_the_default() {
        let mut form = start();
        form.set(Key::InletMoisture, "");
        form.set(Key::EffGenerator, "  ");
        let scenario = form.to_scenario().unwrap();
        assert_eq!(scenario.inlet.moisture_wb, None);
        assert_eq!(scenario.efficiency.generator, None);
        form.set(Key::Throughput, "");
        assert_eq!(fields_of(&form.to_scenario().unwrap_err()), ["throughput_kg_per_h"]);
    }

    #[test]
    fn a_user_defined_product_plans() {
        let mut form = start();
        form.set(Key::ProductSource, SOURCE_CUSTOM);
        form.set(Key::Process, "heating");
        form.set(Key::InletTemp, "10");
        form.set(Key::OutletTemp, "60");
        let scenario = form.to_scenario().unwrap();
        assert!(scenario.product.custom.is_some());
        assert!(doubleprime::plan::plan(&scenario).is_ok());
    }

    /// Each field's stated range is the core's: the bounds are accepted, a step beyond is refused.
    #[test]
    fn stated_ranges_match_the_core() {
        for spec in SPECS.iter() {
            let Some(range) = spec.range else { continue };
            let mut form = start();
            // Put the field in play: custom fields need a custom product, residence fields their rule,
            // the carrier's eps fields a thickness, drying keeps the moisture fields apart.
            match spec.key {
                Key::CustomEpsReal | Key::CustomEpsImag | Key::CustomDensity | Key::CustomSpecificHeat => {
                    form.set(Key::ProductSource, SOURCE_CUSTOM)
                }
                Key::TunnelLength => form.set(Key::ResidenceRule, RULE_LENGTH),
                Key::ResidenceTime => form.set(Key::ResidenceRule, RULE_TIME),
                Key::HeatingRate => form.set(Key::ResidenceRule, RULE_RATE),
                Key::TrayEpsReal | Key::TrayEpsImag => form.set(Key::TrayThickness, "0.002"),
                Key::CarrierBeltEpsReal | Key::CarrierBeltEpsImag => form.set(Key::CarrierBeltThickness, "0.002"),
                _ => {}
            }
            // Only range problems count: rules between fields (outlet above inlet) are not the range.
            let is_range_problem = |error: &InputError| {
                error.field == spec.field
                    && (error.valid.starts_with(|c: char| c.is_ascii_digit() || c == '-')
                        || error.valid.starts_with("more than"))
            };
            let problems_at = |value: f64| {
                let mut form = form.clone();
                form.set(spec.key, format!("{value}"));
                let errors = match form.to_scenario() {
                    Ok(scenario) => doubleprime::plan::plan(&scenario).err().unwrap_or_default(),
                    Err(errors) => errors,
                };
                errors.iter().any(is_range_problem)
            };
            let step = if spec.kind == Kind::Integer { 1.0 } else { (range.max - range.min).abs().max(1.0) * 1e-6 };
            let below = if range.min_excluded { range.min } else { range.min - step };
            if !range.min_excluded {
                assert!(!problems_at(range.min), "{} refuses its minimum {}", spec.field, range.min);
            }
            assert!(problems_at(below), "{} accepts {below}, below its range", spec.field);
            assert!(!problems_at(range.max), "{} refuses its maximum {}", spec.field, range.max);
            assert!(problems_at(range.max + step), "{} accepts above its maximum", spec.field);
        }
    }
}
