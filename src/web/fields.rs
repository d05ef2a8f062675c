//! Every field of the scenario form: the scenario field it fills (as the core's errors name it),
//! its label, unit, valid range and what leaving it blank means.
//!
//! The ranges repeat the core's checks (scenario::validation, sizing, materials::custom) so that
//! each field can show them before anything is typed; a unit test walks every range against the
//! core, so the two cannot drift apart unnoticed.

/// One field of the form. The order is the order of [`SPECS`].
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Key {
    ProductSource,
    Library,
    CustomName,
    CustomEpsReal,
    CustomEpsImag,
    CustomDensity,
    CustomSpecificHeat,
    CustomSource,
    SaltPct,
    Process,
    Throughput,
    InletTemp,
    OutletTemp,
    InletMoisture,
    OutletMoisture,
    Pressure,
    EvaporationTemp,
    Frequency,
    GeneratorClass,
    Redundancy,
    EffPowerSupply,
    EffGenerator,
    EffTransmission,
    EffApplicator,
    BeltWidth,
    BedDepth,
    BulkDensity,
    ResidenceRule,
    TunnelLength,
    ResidenceTime,
    HeatingRate,
    Feed,
    Zones,
    TrayThickness,
    TrayEpsReal,
    TrayEpsImag,
    CarrierBeltThickness,
    CarrierBeltEpsReal,
    CarrierBeltEpsImag,
    AirGap,
    Backing,
    SurfaceLoss,
    BeltLoss,
    VapourLoss,
    PowerFactor,
    CoolingRise,
    Tariff,
    Currency,
    OperatingHours,
    AuxiliaryPower,
    Name,
    Description,
    Customer,
    Site,
    Author,
    Date,
    Reference,
    Notes,
}

/// How a field's text is read.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Kind {
    /// A decimal number; `,` or `.` as the separator.
    Decimal,
    /// A whole number.
    Integer,
    /// Free text of at most this many characters.
    Text(usize),
    /// One of a fixed list (a select).
    Choice,
}

/// The valid range of a number, as the core checks it.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Range {
    /// Lowest value accepted (or the bound just above which values start, if `min_excluded`).
    pub min: f64,
    /// Highest value accepted.
    pub max: f64,
    /// True for "more than min", false for "min or more".
    pub min_excluded: bool,
}

/// Everything the form knows about one field.
#[derive(Debug, Clone, Copy)]
pub struct FieldSpec {
    /// The key.
    pub key: Key,
    /// The scenario field, as the core names it in its errors (`tunnel.bed_depth_m`).
    pub field: &'static str,
    /// Label shown to people.
    pub label: &'static str,
    /// Unit shown beside the label ("" for none).
    pub unit: &'static str,
    /// How the text is read.
    pub kind: Kind,
    /// Valid range for numbers.
    pub range: Option<Range>,
    /// What a blank field means; `None` when the field is required.
    pub blank: Option<&'static str>,
}

const fn closed(min: f64, max: f64) -> Option<Range> {
    Some(Range { min, max, min_excluded: false })
}

const fn above(min: f64, max: f64) -> Option<Range> {
    Some(Range { min, max, min_excluded: true })
}

const fn number(
    key: Key,
    field: &'static str,
    label: &'static str,
    unit: &'static str,
    range: Option<Range>,
    blank: Option<&'static str>,
) -> FieldSpec {
    FieldSpec { key, field, label, unit, kind: Kind::Decimal, range, blank }
}

const fn choice(key: Key, field: &'static str, label: &'static str) -> FieldSpec {
    FieldSpec { key, field, label, unit: "", kind: Kind::Choice, range: None, blank: None }
}

const fn text(key: Key, field: &'static str, label: &'static str, max_chars: usize) -> FieldSpec {
    FieldSpec { key, field, label, unit: "", kind: Kind::Text(max_chars), range: None, blank: Some("") }
}

/// Efficiencies are fractions from 0.05 to 1 (scenario::validation).
const EFFICIENCY: Option<Range> = closed(0.05, 1.0);
/// Loss allowances are 0 to 200 % (sizing::energy_balance).
const LOSS_PCT: Option<Range> = closed(0.0, 200.0);
/// Free text in the scenario: at most 4000 characters (scenario::validation).
const TEXT_MAX: usize = 4000;

use Key as K;

/// Every field, in [`Key`] order.
pub const SPECS: [FieldSpec; 58] = [
    choice(K::ProductSource, "product", "Product data"),
    choice(K::Library, "product.library", "Library material"),
    FieldSpec {
        key: K::CustomName,
        field: "product.custom.name",
        label: "Name",
        unit: "",
        kind: Kind::Text(60),
        range: None,
        blank: None,
    },
    number(
        K::CustomEpsReal,
        "product.custom.dielectric.eps_real",
        "Dielectric constant \u{3b5}\u{2032}",
        "",
        closed(1.0, 1000.0),
        None,
    ),
    number(
        K::CustomEpsImag,
        "product.custom.dielectric.eps_imag",
        "Loss factor \u{3b5}\u{2033}",
        "",
        closed(0.0, 1.0e6),
        None,
    ),
    number(K::CustomDensity, "product.custom.density_kg_per_m3", "Density", "kg/m\u{b3}", closed(1.0, 25_000.0), None),
    number(
        K::CustomSpecificHeat,
        "product.custom.specific_heat_j_per_kg_k",
        "Specific heat",
        "J/(kg\u{b7}K)",
        closed(100.0, 10_000.0),
        None,
    ),
    text(K::CustomSource, "product.custom.source", "Where the data comes from", 400),
    number(K::SaltPct, "salt_pct", "Salt", "% by mass", closed(0.0, 26.0), Some("the material's own")),
    choice(K::Process, "process", "Process"),
    number(K::Throughput, "throughput_kg_per_h", "Throughput (wet product in)", "kg/h", above(0.0, 200_000.0), None),
    number(K::InletTemp, "inlet.temp_c", "Inlet temperature", "\u{b0}C", closed(-60.0, 300.0), None),
    number(K::OutletTemp, "outlet.temp_c", "Outlet temperature", "\u{b0}C", closed(-60.0, 300.0), None),
    number(
        K::InletMoisture,
        "inlet.moisture_wb",
        "Inlet moisture, wet basis",
        "kg/kg",
        closed(0.0, 0.95),
        Some("the material's own"),
    ),
    number(
        K::OutletMoisture,
        "outlet.moisture_wb",
        "Outlet moisture, wet basis",
        "kg/kg",
        closed(0.0, 0.95),
        Some("the inlet moisture"),
    ),
    number(K::Pressure, "pressure_kpa", "Tunnel pressure (absolute)", "kPa", closed(2.0, 200.0), None),
    number(
        K::EvaporationTemp,
        "evaporation_temp_c",
        "Evaporation temperature",
        "\u{b0}C",
        closed(10.0, 150.0),
        Some("the boiling point at the tunnel pressure"),
    ),
    choice(K::Frequency, "frequency_mhz", "Band"),
    choice(K::GeneratorClass, "generator.class", "Generator class"),
    choice(K::Redundancy, "generator.redundancy", "Standby"),
    number(
        K::EffPowerSupply,
        "efficiency.power_supply",
        "Power supply efficiency",
        "fraction",
        EFFICIENCY,
        Some("the generator class's figure"),
    ),
    number(
        K::EffGenerator,
        "efficiency.generator",
        "Generator efficiency",
        "fraction",
        EFFICIENCY,
        Some("the generator class's figure"),
    ),
    number(K::EffTransmission, "efficiency.transmission", "Transmission efficiency", "fraction", EFFICIENCY, None),
    number(K::EffApplicator, "efficiency.applicator", "Applicator efficiency", "fraction", EFFICIENCY, None),
    number(K::BeltWidth, "tunnel.belt_width_m", "Loaded belt width", "m", closed(0.02, 10.0), None),
    number(K::BedDepth, "tunnel.bed_depth_m", "Bed depth", "m", closed(0.0005, 2.0), None),
    number(
        K::BulkDensity,
        "tunnel.bulk_density_kg_per_m3",
        "Bulk density as loaded",
        "kg/m\u{b3}",
        closed(5.0, 8000.0),
        Some("the material's density"),
    ),
    choice(K::ResidenceRule, "tunnel.residence", "Time under power set by"),
    number(K::TunnelLength, "tunnel.residence.tunnel_length_m", "Heated length", "m", closed(0.1, 1000.0), None),
    number(K::ResidenceTime, "tunnel.residence.residence_time_s", "Residence time", "s", closed(1.0, 86_400.0), None),
    number(
        K::HeatingRate,
        "tunnel.residence.heating_rate_k_per_min",
        "Highest heating rate",
        "K/min",
        above(0.0, 10_000.0),
        None,
    ),
    choice(K::Feed, "tunnel.feed", "Energy enters the bed from"),
    FieldSpec {
        key: K::Zones,
        field: "tunnel.zones",
        label: "Zones along the tunnel",
        unit: "",
        kind: Kind::Integer,
        range: closed(1.0, 1000.0),
        blank: None,
    },
    number(
        K::TrayThickness,
        "tunnel.load_stack.tray.thickness_m",
        "Tray base thickness",
        "m",
        above(0.0, 0.5),
        Some("no tray"),
    ),
    number(K::TrayEpsReal, "tunnel.load_stack.tray.eps_real", "Tray \u{3b5}\u{2032}", "", closed(1.0, 1000.0), None),
    number(K::TrayEpsImag, "tunnel.load_stack.tray.eps_imag", "Tray \u{3b5}\u{2033}", "", closed(0.0, 1.0e6), None),
    number(
        K::CarrierBeltThickness,
        "tunnel.load_stack.belt.thickness_m",
        "Belt thickness",
        "m",
        above(0.0, 0.5),
        Some("no belt layer"),
    ),
    number(
        K::CarrierBeltEpsReal,
        "tunnel.load_stack.belt.eps_real",
        "Belt \u{3b5}\u{2032}",
        "",
        closed(1.0, 1000.0),
        None,
    ),
    number(
        K::CarrierBeltEpsImag,
        "tunnel.load_stack.belt.eps_imag",
        "Belt \u{3b5}\u{2033}",
        "",
        closed(0.0, 1.0e6),
        None,
    ),
    number(K::AirGap, "tunnel.load_stack.air_gap_m", "Air gap below the belt", "m", closed(0.0, 2.0), Some("no gap")),
    choice(K::Backing, "tunnel.load_stack.backing", "Below the stack"),
    number(K::SurfaceLoss, "losses.surface_pct", "Surface losses", "% of process heat", LOSS_PCT, None),
    number(K::BeltLoss, "losses.belt_pct", "Belt and carrier losses", "% of process heat", LOSS_PCT, None),
    number(K::VapourLoss, "losses.vapour_pct", "Exhaust and vapour losses", "% of evaporation heat", LOSS_PCT, None),
    number(K::PowerFactor, "site.power_factor", "Power factor", "", closed(0.5, 1.0), None),
    number(K::CoolingRise, "site.cooling_water_rise_k", "Cooling-water temperature rise", "K", closed(1.0, 60.0), None),
    number(K::Tariff, "site.tariff_per_kwh", "Energy tariff", "per kWh", closed(0.0, 100.0), None),
    text(K::Currency, "site.currency", "Currency", 12),
    number(K::OperatingHours, "site.operating_hours_per_year", "Operating hours", "h/year", closed(0.0, 8784.0), None),
    number(
        K::AuxiliaryPower,
        "site.auxiliary_kw",
        "Auxiliaries (conveyor, fans, pumps)",
        "kW",
        closed(0.0, 100_000.0),
        None,
    ),
    text(K::Name, "name", "Scenario title", TEXT_MAX),
    text(K::Description, "description", "Description", TEXT_MAX),
    text(K::Customer, "project.customer", "Customer", TEXT_MAX),
    text(K::Site, "project.site", "Site", TEXT_MAX),
    text(K::Author, "project.author", "Planned by", TEXT_MAX),
    text(K::Date, "project.date", "Date", TEXT_MAX),
    text(K::Reference, "project.reference", "Reference", TEXT_MAX),
    text(K::Notes, "project.notes", "Notes", TEXT_MAX),
];

/// Number of fields.
pub const KEY_COUNT: usize = SPECS.len();

/// Other names under which the core reports a field's problems.
const ALIASES: [(&str, Key); 2] = [("generator_class", K::GeneratorClass), ("product.material", K::Library)];

impl Key {
    /// The field's description.
    pub fn spec(self) -> &'static FieldSpec {
        &SPECS[self as usize]
    }

    /// Every key, in form order.
    pub fn all() -> impl Iterator<Item = Key> {
        SPECS.iter().map(|spec| spec.key)
    }

    /// The key whose field the core names `field`, if the form has one.
    pub fn for_error_field(field: &str) -> Option<Key> {
        SPECS
            .iter()
            .find(|spec| spec.field == field)
            .map(|spec| spec.key)
            .or_else(|| ALIASES.iter().find(|(name, _)| *name == field).map(|(_, key)| *key))
    }
}

impl FieldSpec {
    /// The element id of the field's input (`field-tunnel-bed_depth_m`).
    pub fn dom_id(&self) -> String {
        format!("field-{}", self.field.replace('.', "-"))
    }

    /// The label with its unit, as read aloud and shown.
    pub fn label_with_unit(&self) -> String {
        if self.unit.is_empty() {
            self.label.to_string()
        } else {
            format!("{}, {}", self.label, self.unit)
        }
    }

    /// The valid range in words, with the unit: `0.02 to 10 m`, `more than 0, at most 200 000 kg/h`.
    pub fn range_words(&self) -> Option<String> {
        let range = self.range?;
        let unit =
            if self.unit.is_empty() || self.unit == "fraction" { String::new() } else { format!(" {}", self.unit) };
        let (low, high) = (plain_number(range.min), plain_number(range.max));
        Some(if range.min_excluded {
            format!("more than {low}, at most {high}{unit}")
        } else {
            format!("{low} to {high}{unit}")
        })
    }

    /// The valid range and the blank meaning, in words (`Valid: 0.02 to 10 m.`).
    pub fn hint(&self) -> String {
        let mut hint = match (self.range_words(), self.kind) {
            (Some(words), _) => format!("Valid: {words}."),
            (None, Kind::Text(max_chars)) if max_chars < TEXT_MAX => format!("At most {max_chars} characters."),
            _ => String::new(),
        };
        if let Some(blank) = self.blank.filter(|blank| !blank.is_empty()) {
            if !hint.is_empty() {
                hint.push(' ');
            }
            hint.push_str(&format!("Blank: {blank}."));
        }
        hint
    }
}

/// A bound as people write it: no exponent, no trailing zeros, thousands apart (`200 000`).
pub fn plain_number(value: f64) -> String {
    let text = format!("{value}");
    let (integer, fraction) = text.split_once('.').map_or((text.as_str(), ""), |(i, f)| (i, f));
    let (sign, digits) = integer.strip_prefix('-').map_or(("", integer), |d| ("\u{2212}", d));
    let grouped = if digits.len() > 4 { group_thousands(digits) } else { digits.to_string() };
    if fraction.is_empty() {
        format!("{sign}{grouped}")
    } else {
        format!("{sign}{grouped}.{fraction}")
    }
}

/// `1234567` as `1 234 567`, with narrow no-break spaces.
pub fn group_thousands(digits: &str) -> String {
    let mut out = String::with_capacity(digits.len() + digits.len() / 3 * 3);
    for (index, digit) in digits.chars().enumerate() {
        if index > 0 && (digits.len() - index).is_multiple_of(3) {
            out.push('\u{202f}');
        }
        out.push(digit);
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn specs_are_in_key_order_with_unique_fields() {
        for (index, spec) in SPECS.iter().enumerate() {
            assert_eq!(spec.key as usize, index, "{:?} is out of place", spec.key);
            assert!(SPECS[..index].iter().all(|other| other.field != spec.field), "{} twice", spec.field);
        }
    }

    #[test]
    fn errors_find_their_fields() {
        assert_eq!(Key::for_error_field("tunnel.bed_depth_m"), Some(Key::BedDepth));
        assert_eq!(Key::for_error_field("generator_class"), Some(Key::GeneratorClass));
        assert_eq!(Key::for_error_field("efficiency.applicator"), Some(Key::EffApplicator));
        assert_eq!(Key::for_error_field("scenario"), None);
    }

    #[test]
    fn hints_state_range_unit_and_blank() {
        assert_eq!(Key::BeltWidth.spec().hint(), "Valid: 0.02 to 10 m.");
        assert_eq!(Key::Throughput.spec().hint(), "Valid: more than 0, at most 200\u{202f}000 kg/h.");
        assert_eq!(Key::InletMoisture.spec().hint(), "Valid: 0 to 0.95 kg/kg. Blank: the material's own.");
        assert_eq!(Key::InletTemp.spec().hint(), "Valid: \u{2212}60 to 300 \u{b0}C.");
        assert_eq!(Key::EffApplicator.spec().hint(), "Valid: 0.05 to 1.");
    }

    #[test]
    fn dom_ids_have_no_dots() {
        assert_eq!(Key::BedDepth.spec().dom_id(), "field-tunnel-bed_depth_m");
    }
}
