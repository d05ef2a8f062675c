//! User-defined materials (a constant permittivity or a small table, with thermal properties) and
//! the checks every material, built-in or user-defined, must pass. Every problem is named at once.

use crate::error::{range_text, InputError};
use crate::materials::library::{Category, Confidence, DielectricModel, Material, Source, TablePoint, ThermalModel};
use crate::materials::{MOISTURE_MAX_WB, TEMP_MAX_C, TEMP_MIN_C};
use crate::physics::permittivity::{EPS_IMAG_MAX, EPS_REAL_MAX};
use crate::physics::waves::FREQUENCY_MAX_HZ;
use serde::{Deserialize, Serialize};

/// Lowest density accepted, kg/m^3 (foams, loose fibre).
pub const DENSITY_MIN_KG_PER_M3: f64 = 1.0;
/// Highest density accepted, kg/m^3 (denser than any metal oxide or ceramic).
pub const DENSITY_MAX_KG_PER_M3: f64 = 25_000.0;
/// Lowest specific heat accepted, J/(kg K) (heavy metals are about 130).
pub const SPECIFIC_HEAT_MIN_J_PER_KG_K: f64 = 100.0;
/// Highest specific heat accepted, J/(kg K) (liquid water is 4180).
pub const SPECIFIC_HEAT_MAX_J_PER_KG_K: f64 = 10_000.0;
/// Most points in a user table.
pub const TABLE_POINTS_MAX: usize = 200;
/// Longest user-given name, characters.
pub const NAME_MAX_CHARS: usize = 60;

/// One user-given data point.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct CustomPoint {
    /// Frequency, MHz.
    pub freq_mhz: f64,
    /// Temperature, degC.
    pub temp_c: f64,
    /// Moisture, wet basis (all points or none).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub moisture_wb: Option<f64>,
    /// eps'.
    pub eps_real: f64,
    /// eps''.
    pub eps_imag: f64,
}

/// The user's permittivity data.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(tag = "model", rename_all = "snake_case")]
pub enum CustomDielectric {
    /// One value, valid over the given (or any) frequencies and temperatures.
    Constant {
        /// eps'.
        eps_real: f64,
        /// eps''.
        eps_imag: f64,
        /// Declared frequency range, MHz (default: all).
        #[serde(default)]
        freq_range_mhz: Option<[f64; 2]>,
        /// Declared temperature range, degC (default: all).
        #[serde(default)]
        temp_range_c: Option<[f64; 2]>,
    },
    /// A small table of measured points.
    Table {
        /// The points.
        points: Vec<CustomPoint>,
    },
}

/// A user-defined material as entered.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct CustomMaterialSpec {
    /// Name (any text up to 60 characters).
    pub name: String,
    /// Bulk density, kg/m^3.
    pub density_kg_per_m3: f64,
    /// Specific heat, J/(kg K) (constant).
    pub specific_heat_j_per_kg_k: f64,
    /// Permittivity data.
    pub dielectric: CustomDielectric,
    /// Where the user's data comes from (free text).
    #[serde(default)]
    pub source: Option<String>,
}

/// Build a checked material from the user's entry; every problem is returned at once.
pub fn custom_material(spec: &CustomMaterialSpec) -> Result<Material, Vec<InputError>> {
    let mut problems = Vec::new();
    let name = spec.name.trim();
    if name.is_empty() || name.chars().count() > NAME_MAX_CHARS {
        problems.push(InputError::new("name", crate::error::quoted(&spec.name), "1 to 60 characters"));
    }
    let source_id = "user".to_string();
    let dielectric = match &spec.dielectric {
        CustomDielectric::Constant { eps_real, eps_imag, freq_range_mhz, temp_range_c } => DielectricModel::Constant {
            eps_real: *eps_real,
            eps_imag: *eps_imag,
            freq_range_mhz: freq_range_mhz.unwrap_or([0.0, FREQUENCY_MAX_HZ / 1e6]),
            temp_range_c: temp_range_c.unwrap_or([TEMP_MIN_C, TEMP_MAX_C]),
            source: source_id.clone(),
        },
        CustomDielectric::Table { points } => {
            if points.len() > TABLE_POINTS_MAX {
                problems.push(InputError::new(
                    "dielectric.points",
                    format!("{} points", points.len()),
                    "1 to 200 points",
                ));
            }
            DielectricModel::Table {
                nominal_moisture_wb: points.iter().find_map(|p| p.moisture_wb),
                points: points
                    .iter()
                    .map(|p| TablePoint {
                        freq_mhz: p.freq_mhz,
                        temp_c: p.temp_c,
                        moisture_wb: p.moisture_wb,
                        eps_real: p.eps_real,
                        eps_imag: p.eps_imag,
                        source: source_id.clone(),
                    })
                    .collect(),
            }
        }
    };
    let mut material = Material {
        name: name.to_string(),
        label: name.to_string(),
        category: Category::UserDefined,
        density_kg_per_m3: spec.density_kg_per_m3,
        thermal: ThermalModel::Constant {
            specific_heat_j_per_kg_k: spec.specific_heat_j_per_kg_k,
            source: source_id.clone(),
        },
        dielectric,
        sources: vec![Source {
            id: source_id,
            citation: spec
                .source
                .clone()
                .filter(|s| !s.trim().is_empty())
                .unwrap_or_else(|| "user-defined material".into()),
            locator: "entered by the user".into(),
            confidence: Confidence::UserGiven,
        }],
        notes: String::new(),
        reference_points: Vec::new(),
        source: String::new(),
    };
    material.source = material.source_summary();
    // The user's name may contain anything; only the built-in identifiers are restricted.
    problems.extend(material_problems(&material).into_iter().filter(|p| p.field != "name"));
    if problems.is_empty() {
        Ok(material)
    } else {
        Err(problems)
    }
}

fn check(problems: &mut Vec<InputError>, field: &str, value: f64, min: f64, max: f64) {
    if !(value.is_finite() && value >= min && value <= max) {
        problems.push(InputError::new(field, value, range_text(min, max)));
    }
}

fn check_range(problems: &mut Vec<InputError>, field: &str, range: [f64; 2], min: f64, max: f64) {
    check(problems, &format!("{field}[0]"), range[0], min, max);
    check(problems, &format!("{field}[1]"), range[1], min, max);
    if range[0] > range[1] {
        problems.push(InputError::new(field, format!("[{}, {}]", range[0], range[1]), "[min, max] with min <= max"));
    }
}

fn check_source(problems: &mut Vec<InputError>, material: &Material, field: &str, id: &str) {
    if material.source_by_id(id).is_none() {
        problems.push(InputError::new(field, crate::error::quoted(id), "the id of an entry in `sources`"));
    }
}

fn check_eps(problems: &mut Vec<InputError>, prefix: &str, eps_real: f64, eps_imag: f64) {
    check(problems, &format!("{prefix}eps_real"), eps_real, 1.0, EPS_REAL_MAX);
    check(problems, &format!("{prefix}eps_imag"), eps_imag, 0.0, EPS_IMAG_MAX);
}

const FREQ_MAX_MHZ: f64 = FREQUENCY_MAX_HZ / 1e6;

/// Every problem with a material entry (field names as in the data file).
pub fn material_problems(material: &Material) -> Vec<InputError> {
    let mut problems = Vec::new();
    let valid_name = !material.name.is_empty()
        && material.name.chars().all(|c| c.is_ascii_lowercase() || c.is_ascii_digit() || c == '-');
    if !valid_name {
        problems.push(InputError::new(
            "name",
            crate::error::quoted(&material.name),
            "lower-case letters, digits and hyphens",
        ));
    }
    if material.label.trim().is_empty() {
        problems.push(InputError::new("label", "\"\"", "a display label"));
    }
    check(&mut problems, "density_kg_per_m3", material.density_kg_per_m3, DENSITY_MIN_KG_PER_M3, DENSITY_MAX_KG_PER_M3);
    if material.sources.is_empty() {
        problems.push(InputError::new("sources", "[]", "at least one source"));
    }
    for (index, source) in material.sources.iter().enumerate() {
        if source.id.is_empty() || source.citation.trim().is_empty() {
            problems.push(InputError::new(
                format!("sources[{index}]"),
                crate::error::quoted(&source.id),
                "an id and a citation",
            ));
        }
        if material.sources[..index].iter().any(|s| s.id == source.id) {
            problems.push(InputError::new(
                format!("sources[{index}].id"),
                crate::error::quoted(&source.id),
                "an id not used twice",
            ));
        }
    }
    thermal_problems(material, &mut problems);
    dielectric_problems(material, &mut problems);
    for (index, point) in material.reference_points.iter().enumerate() {
        let prefix = format!("reference_points[{index}].");
        check_source(&mut problems, material, &format!("{prefix}source"), &point.source);
        check(&mut problems, &format!("{prefix}freq_mhz"), point.freq_mhz, 1e-3, FREQ_MAX_MHZ);
        check(&mut problems, &format!("{prefix}temp_c"), point.temp_c, TEMP_MIN_C, TEMP_MAX_C);
        check_eps(&mut problems, &prefix, point.eps_real, point.eps_imag.unwrap_or(0.0));
    }
    problems
}

fn thermal_problems(material: &Material, problems: &mut Vec<InputError>) {
    match &material.thermal {
        ThermalModel::Water { source } | ThermalModel::Ice { source } => {
            check_source(problems, material, "thermal.source", source);
        }
        ThermalModel::Composition { composition, initial_freezing_point_c, source } => {
            check_source(problems, material, "thermal.source", source);
            problems.extend(composition.problems("thermal.composition"));
            if let Some(tf) = initial_freezing_point_c {
                if !(tf.is_finite() && *tf > -40.0 && *tf < 0.0) {
                    problems.push(InputError::new(
                        "thermal.initial_freezing_point_c",
                        tf,
                        "more than -40 and less than 0",
                    ));
                }
            }
        }
        ThermalModel::Constant { specific_heat_j_per_kg_k, source } => {
            check_source(problems, material, "thermal.source", source);
            check(
                problems,
                "specific_heat_j_per_kg_k",
                *specific_heat_j_per_kg_k,
                SPECIFIC_HEAT_MIN_J_PER_KG_K,
                SPECIFIC_HEAT_MAX_J_PER_KG_K,
            );
        }
        ThermalModel::Table { points, source } => {
            check_source(problems, material, "thermal.source", source);
            if points.is_empty() {
                problems.push(InputError::new("thermal.points", "[]", "at least one point"));
            }
            for (index, point) in points.iter().enumerate() {
                check(problems, &format!("thermal.points[{index}].temp_c"), point.temp_c, TEMP_MIN_C, TEMP_MAX_C);
                check(
                    problems,
                    &format!("thermal.points[{index}].specific_heat_j_per_kg_k"),
                    point.specific_heat_j_per_kg_k,
                    SPECIFIC_HEAT_MIN_J_PER_KG_K,
                    SPECIFIC_HEAT_MAX_J_PER_KG_K,
                );
                if index > 0 && point.temp_c <= points[index - 1].temp_c {
                    problems.push(InputError::new(
                        format!("thermal.points[{index}].temp_c"),
                        point.temp_c,
                        "temperatures in rising order",
                    ));
                }
            }
        }
        ThermalModel::DryPlusWater { dry_specific_heat_j_per_kg_k, moisture_wb, source } => {
            check_source(problems, material, "thermal.source", source);
            check(
                problems,
                "thermal.dry_specific_heat_j_per_kg_k",
                *dry_specific_heat_j_per_kg_k,
                SPECIFIC_HEAT_MIN_J_PER_KG_K,
                SPECIFIC_HEAT_MAX_J_PER_KG_K,
            );
            check(problems, "thermal.moisture_wb", *moisture_wb, 0.0, MOISTURE_MAX_WB);
        }
    }
}

fn dielectric_problems(material: &Material, problems: &mut Vec<InputError>) {
    match &material.dielectric {
        DielectricModel::Water { source } | DielectricModel::Ice { source } => {
            check_source(problems, material, "dielectric.source", source);
        }
        DielectricModel::Constant { eps_real, eps_imag, freq_range_mhz, temp_range_c, source } => {
            check_source(problems, material, "dielectric.source", source);
            check_eps(problems, "dielectric.", *eps_real, *eps_imag);
            check_range(problems, "dielectric.freq_range_mhz", *freq_range_mhz, 0.0, FREQ_MAX_MHZ);
            check_range(problems, "dielectric.temp_range_c", *temp_range_c, TEMP_MIN_C, TEMP_MAX_C);
        }
        DielectricModel::Table { points, nominal_moisture_wb } => {
            if points.is_empty() {
                problems.push(InputError::new("dielectric.points", "[]", "at least one point"));
            }
            for (index, point) in points.iter().enumerate() {
                let prefix = format!("dielectric.points[{index}].");
                check_source(problems, material, &format!("{prefix}source"), &point.source);
                check(problems, &format!("{prefix}freq_mhz"), point.freq_mhz, 1e-3, FREQ_MAX_MHZ);
                check(problems, &format!("{prefix}temp_c"), point.temp_c, TEMP_MIN_C, TEMP_MAX_C);
                if let Some(moisture) = point.moisture_wb {
                    check(problems, &format!("{prefix}moisture_wb"), moisture, 0.0, MOISTURE_MAX_WB);
                }
                check_eps(problems, &prefix, point.eps_real, point.eps_imag);
            }
            let with_moisture = points.iter().filter(|p| p.moisture_wb.is_some()).count();
            if with_moisture != 0 && with_moisture != points.len() {
                problems.push(InputError::new(
                    "dielectric.points",
                    format!("{with_moisture} of {} with moisture_wb", points.len()),
                    "moisture_wb on every point or on none",
                ));
            }
            if with_moisture > 0 && nominal_moisture_wb.is_none() {
                problems.push(InputError::new(
                    "dielectric.nominal_moisture_wb",
                    "none",
                    "a nominal moisture when the points have moisture",
                ));
            }
            if let Some(nominal) = nominal_moisture_wb {
                check(problems, "dielectric.nominal_moisture_wb", *nominal, 0.0, MOISTURE_MAX_WB);
            }
        }
        DielectricModel::Moist {
            solid_eps_real,
            solid_eps_imag,
            solid_density_kg_per_m3,
            dry_bulk_density_kg_per_m3,
            moisture_wb,
            moisture_range_wb,
            salt_pct,
            temp_range_c,
            freq_range_mhz,
            source,
            ..
        } => {
            check_source(problems, material, "dielectric.source", source);
            check_eps(problems, "dielectric.solid_", *solid_eps_real, *solid_eps_imag);
            check(
                problems,
                "dielectric.solid_density_kg_per_m3",
                *solid_density_kg_per_m3,
                DENSITY_MIN_KG_PER_M3,
                DENSITY_MAX_KG_PER_M3,
            );
            check(
                problems,
                "dielectric.dry_bulk_density_kg_per_m3",
                *dry_bulk_density_kg_per_m3,
                DENSITY_MIN_KG_PER_M3,
                *solid_density_kg_per_m3,
            );
            check(problems, "dielectric.moisture_wb", *moisture_wb, 0.0, MOISTURE_MAX_WB);
            check_range(problems, "dielectric.moisture_range_wb", *moisture_range_wb, 0.0, MOISTURE_MAX_WB);
            check(problems, "dielectric.salt_pct", *salt_pct, 0.0, 26.0);
            check_range(problems, "dielectric.temp_range_c", *temp_range_c, TEMP_MIN_C, TEMP_MAX_C);
            check_range(problems, "dielectric.freq_range_mhz", *freq_range_mhz, 0.0, FREQ_MAX_MHZ);
        }
        DielectricModel::Frozen {
            solids_eps_real,
            solids_eps_imag,
            salt_pct,
            temp_range_c,
            freq_range_mhz,
            moisture_range_wb,
            source,
            ..
        } => {
            check_source(problems, material, "dielectric.source", source);
            check_eps(problems, "dielectric.solids_", *solids_eps_real, *solids_eps_imag);
            check(problems, "dielectric.salt_pct", *salt_pct, 0.0, 26.0);
            check_range(problems, "dielectric.temp_range_c", *temp_range_c, TEMP_MIN_C, TEMP_MAX_C);
            check_range(problems, "dielectric.freq_range_mhz", *freq_range_mhz, 0.0, FREQ_MAX_MHZ);
            check_range(problems, "dielectric.moisture_range_wb", *moisture_range_wb, 0.0, MOISTURE_MAX_WB);
            if !matches!(material.thermal, ThermalModel::Composition { initial_freezing_point_c: Some(_), .. }) {
                problems.push(InputError::new(
                    "thermal",
                    "not a composition with a freezing point",
                    "a composition model with initial_freezing_point_c (the frozen model needs it)",
                ));
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::materials::{permittivity, MaterialState};

    fn spec(dielectric: CustomDielectric) -> CustomMaterialSpec {
        CustomMaterialSpec {
            name: "Customer's pet food".into(),
            density_kg_per_m3: 950.0,
            specific_heat_j_per_kg_k: 3200.0,
            dielectric,
            source: Some("own measurement, open-ended coaxial probe, 2024".into()),
        }
    }

    #[test]
    fn constant_material_is_usable() {
        let material = custom_material(&spec(CustomDielectric::Constant {
            eps_real: 40.0,
            eps_imag: 12.0,
            freq_range_mhz: None,
            temp_range_c: None,
        }))
        .unwrap();
        let lookup = permittivity(&material, 915e6, &MaterialState::at(20.0)).unwrap();
        assert_eq!(lookup.eps.eps_imag, 12.0);
        assert!(lookup.in_range);
        assert!(lookup.source.contains("own measurement"));
        assert_eq!(material.specific_heat_j_per_kg_k(50.0, None).unwrap(), 3200.0);
    }

    #[test]
    fn every_problem_is_named_at_once() {
        let mut bad = spec(CustomDielectric::Table {
            points: vec![
                CustomPoint { freq_mhz: -915.0, temp_c: 20.0, moisture_wb: None, eps_real: 0.5, eps_imag: f64::NAN },
                CustomPoint { freq_mhz: 915.0, temp_c: 500.0, moisture_wb: Some(0.5), eps_real: 40.0, eps_imag: 10.0 },
            ],
        });
        bad.density_kg_per_m3 = 0.0;
        bad.specific_heat_j_per_kg_k = f64::INFINITY;
        bad.name = "  ".into();
        let problems = custom_material(&bad).unwrap_err();
        let fields: Vec<&str> = problems.iter().map(|p| p.field.as_str()).collect();
        for expected in [
            "name",
            "density_kg_per_m3",
            "specific_heat_j_per_kg_k",
            "dielectric.points[0].freq_mhz",
            "dielectric.points[0].eps_real",
            "dielectric.points[0].eps_imag",
            "dielectric.points[1].temp_c",
            "dielectric.points",
        ] {
            assert!(fields.contains(&expected), "{expected} missing in {fields:?}");
        }
    }

    #[test]
    fn table_material_interpolates() {
        let material = custom_material(&spec(CustomDielectric::Table {
            points: vec![
                CustomPoint { freq_mhz: 2450.0, temp_c: 20.0, moisture_wb: None, eps_real: 40.0, eps_imag: 10.0 },
                CustomPoint { freq_mhz: 2450.0, temp_c: 60.0, moisture_wb: None, eps_real: 36.0, eps_imag: 14.0 },
            ],
        }))
        .unwrap();
        let lookup = permittivity(&material, 2.45e9, &MaterialState::at(40.0)).unwrap();
        assert!((lookup.eps.eps_imag - 12.0).abs() < 1e-12);
        assert_eq!(lookup.points_used.len(), 2);
        let outside = permittivity(&material, 915e6, &MaterialState::at(40.0)).unwrap();
        assert!(!outside.in_range);
    }
}
