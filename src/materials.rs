//! Materials: how a product absorbs microwave and RF energy and stores heat, as it heats, thaws and dries.
//!
//! Every permittivity comes from a named model or named data (see each submodule):
//! - water and brines: Ellison (2007) relaxation model plus an NaCl model ([`water`], [`saline`]);
//! - ice: Maetzler (2006) ([`ice`]); frozen foods through the ASHRAE ice fraction ([`freezing`]);
//! - moist materials: a named mixing rule of the Birchak family ([`mixing`]);
//! - tabulated materials: interpolation that reports its points and flags requests outside the
//!   data ([`interpolation`]); the data is `src/materials/library.json` ([`library()`]);
//! - heat: IAPWS saturation properties and latent heats ([`thermal`]), Choi-Okos specific heats
//!   ([`composition`]) and the ASHRAE frozen-food enthalpy ([`freezing`]).
//!
//! The public entry points ([`permittivity`], [`Material::enthalpy_j_per_kg`] and the rest) check
//! their inputs and never panic or return NaN: a value they cannot use is an [`InputError`].

pub mod composition;
pub mod custom;
mod enthalpy_curve;
pub mod freezing;
pub mod ice;
pub mod interpolation;
pub mod library;
pub mod mixing;
mod models;
pub mod saline;
pub mod thermal;
pub mod warnings;
pub mod water;

#[cfg(test)]
mod tests;

pub use enthalpy_curve::EnthalpyCurve;
pub use library::{library, Category, Confidence, DielectricModel, Library, Material, Source, ThermalModel};

use crate::error::{require_in, require_positive, InputError};
use crate::physics::permittivity::ComplexPermittivity;
use crate::physics::waves::FREQUENCY_MAX_HZ;
use serde::Serialize;

/// Lowest temperature accepted, degC.
pub const TEMP_MIN_C: f64 = -60.0;
/// Highest temperature accepted, degC.
pub const TEMP_MAX_C: f64 = 300.0;
/// Highest moisture accepted, wet basis.
pub const MOISTURE_MAX_WB: f64 = 0.95;
/// Highest salt content accepted, % by mass (a saturated NaCl solution holds 26.4 %).
pub const SALT_MAX_PCT: f64 = 26.0;
/// Highest conductivity accepted, S/m (saturated brine at 100 degC is about 50 S/m).
pub const CONDUCTIVITY_MAX_S_PER_M: f64 = 100.0;

/// The state of a product at which a property is wanted.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct MaterialState {
    /// Temperature, degC (-60 to 300).
    pub temp_c: f64,
    /// Moisture, wet basis (0 to 0.95); `None` means the material's nominal moisture.
    pub moisture_wb: Option<f64>,
    /// Dissolved salt, % by mass (0 to 26): of the solution for water, of the product for foods and
    /// moist materials (NaCl-equivalent); `None` means the entry's own value (0 for water).
    pub salt_pct: Option<f64>,
}

impl MaterialState {
    /// The nominal product at `temp_c`.
    pub fn at(temp_c: f64) -> Self {
        Self { temp_c, moisture_wb: None, salt_pct: None }
    }

    /// Check every field; all problems are returned.
    pub fn problems(&self) -> Vec<InputError> {
        let mut problems = Vec::new();
        if let Err(error) = require_in("temp_c", self.temp_c, TEMP_MIN_C, TEMP_MAX_C) {
            problems.push(error);
        }
        if let Some(moisture) = self.moisture_wb {
            if let Err(error) = require_in("moisture_wb", moisture, 0.0, MOISTURE_MAX_WB) {
                problems.push(error);
            }
        }
        if let Some(salt) = self.salt_pct {
            if let Err(error) = require_in("salt_pct", salt, 0.0, SALT_MAX_PCT) {
                problems.push(error);
            }
        }
        problems
    }

    fn checked(&self) -> Result<(), InputError> {
        match self.problems().into_iter().next() {
            Some(error) => Err(error),
            None => Ok(()),
        }
    }
}

/// A data point that went into a tabulated permittivity, with its weight.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct PointUsed {
    /// Frequency of the point, MHz.
    pub freq_mhz: f64,
    /// Temperature of the point, degC.
    pub temp_c: f64,
    /// Moisture of the point, wet basis, if the data has that axis.
    pub moisture_wb: Option<f64>,
    /// The point's eps'.
    pub eps_real: f64,
    /// The point's eps''.
    pub eps_imag: f64,
    /// Its weight in the result (the weights sum to 1).
    pub weight: f64,
    /// Its source: citation, locator and confidence.
    pub source: String,
}

/// A permittivity and everything needed to judge it.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct PermittivityLookup {
    /// eps' - j eps''.
    pub eps: ComplexPermittivity,
    /// False when any axis of the request lies outside the data or the model's range.
    pub in_range: bool,
    /// One message per axis outside: the axis, the request and the range of the data.
    pub out_of_range: Vec<String>,
    /// For tabulated data, the points used and their weights (empty for models).
    pub points_used: Vec<PointUsed>,
    /// Which model or data produced the value.
    pub model: String,
    /// The sources of the model or data.
    pub source: String,
    /// Remarks that do not affect `in_range` (volume fractions, ignored inputs, conductivity).
    pub notes: Vec<String>,
}

/// The ranges a material's data or model covers (for listings).
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Ranges {
    /// Frequencies, MHz [min, max].
    pub freq_mhz: [f64; 2],
    /// Temperatures, degC [min, max].
    pub temp_c: [f64; 2],
    /// Moistures, wet basis [min, max], if the material has a moisture axis.
    pub moisture_wb: Option<[f64; 2]>,
}

fn checked_frequency(frequency_hz: f64) -> Result<f64, InputError> {
    require_positive("freq_mhz", frequency_hz / 1e6, FREQUENCY_MAX_HZ / 1e6).map(|f| f * 1e6)
}

/// Complex permittivity of `material` at `frequency_hz` and `state`.
pub fn permittivity(
    material: &Material,
    frequency_hz: f64,
    state: &MaterialState,
) -> Result<PermittivityLookup, InputError> {
    permittivity_with_conductivity(material, frequency_hz, state, None)
}

/// As [`permittivity`], with a user-given ionic conductivity of the water phase, S/m, replacing the
/// NaCl conductivity model (the salt content still depresses the dipolar part). Only water and
/// moist-model materials have a water phase of their own; for the others this is an error.
pub fn permittivity_with_conductivity(
    material: &Material,
    frequency_hz: f64,
    state: &MaterialState,
    conductivity_s_per_m: Option<f64>,
) -> Result<PermittivityLookup, InputError> {
    let frequency_hz = checked_frequency(frequency_hz)?;
    state.checked()?;
    if let Some(sigma) = conductivity_s_per_m {
        require_in("conductivity_s_per_m", sigma, 0.0, CONDUCTIVITY_MAX_S_PER_M)?;
        if !matches!(material.dielectric, DielectricModel::Water { .. } | DielectricModel::Moist { .. }) {
            return Err(InputError::new(
                "conductivity_s_per_m",
                sigma,
                format!("only for water and moist-model materials ({} has its loss in its data)", material.name),
            ));
        }
    }
    let temp_c = state.temp_c;
    let mut notes = Vec::new();
    let mut points_used = Vec::new();
    let value = match &material.dielectric {
        DielectricModel::Water { .. } => {
            ignore_moisture(material, state, &mut notes);
            models::water_value(frequency_hz, temp_c, state.salt_pct.unwrap_or(0.0) / 100.0, conductivity_s_per_m)
        }
        DielectricModel::Ice { .. } => {
            ignore_moisture(material, state, &mut notes);
            ignore_salt(material, state, &mut notes);
            models::ice_value(frequency_hz, temp_c)
        }
        DielectricModel::Constant { eps_real, eps_imag, freq_range_mhz, temp_range_c, source } => {
            ignore_moisture(material, state, &mut notes);
            ignore_salt(material, state, &mut notes);
            let mut out_of_range = Vec::new();
            let what = "the declared range of this constant value";
            models::flag_range(&mut out_of_range, "freq_mhz", frequency_hz / 1e6, *freq_range_mhz, what);
            models::flag_range(&mut out_of_range, "temp_c", temp_c, *temp_range_c, what);
            let source_text = source_text(material, source);
            points_used.push(PointUsed {
                freq_mhz: frequency_hz / 1e6,
                temp_c,
                moisture_wb: None,
                eps_real: *eps_real,
                eps_imag: *eps_imag,
                weight: 1.0,
                source: source_text,
            });
            models::ModelValue {
                eps: crate::physics::complex::Complex::new(*eps_real, -eps_imag),
                model: "constant value over a declared range".into(),
                out_of_range,
                notes: Vec::new(),
            }
        }
        DielectricModel::Table { points, nominal_moisture_wb } => {
            ignore_salt(material, state, &mut notes);
            let has_moisture = points.iter().any(|p| p.moisture_wb.is_some());
            if !has_moisture {
                ignore_moisture(material, state, &mut notes);
            }
            let moisture = state.moisture_wb.or(*nominal_moisture_wb);
            let result = interpolation::interpolate(points, frequency_hz / 1e6, temp_c, moisture);
            for weighted in &result.points {
                let p = &points[weighted.index];
                points_used.push(PointUsed {
                    freq_mhz: p.freq_mhz,
                    temp_c: p.temp_c,
                    moisture_wb: p.moisture_wb,
                    eps_real: p.eps_real,
                    eps_imag: p.eps_imag,
                    weight: weighted.weight,
                    source: source_text(material, &p.source),
                });
            }
            models::ModelValue {
                eps: crate::physics::complex::Complex::new(result.eps_real, -result.eps_imag),
                model: "table: linear in ln(frequency), moisture and temperature".into(),
                out_of_range: result.out_of_range,
                notes: Vec::new(),
            }
        }
        DielectricModel::Moist { .. } => models::moist_value(
            &material.dielectric,
            frequency_hz,
            temp_c,
            state.moisture_wb,
            state.salt_pct,
            conductivity_s_per_m,
        )
        .ok_or_else(|| broken(material))?,
        DielectricModel::Frozen { .. } => {
            models::frozen_value(material, frequency_hz, temp_c, state.moisture_wb, state.salt_pct)
                .ok_or_else(|| broken(material))?
        }
    };
    notes.extend(value.notes);
    let eps = finished(material, temp_c, value.eps)?;
    Ok(PermittivityLookup {
        eps,
        in_range: value.out_of_range.is_empty(),
        out_of_range: value.out_of_range,
        points_used,
        model: value.model,
        source: material.source.clone(),
        notes,
    })
}

/// The permittivity alone: the value, checks and errors of [`permittivity`] without the texts a
/// lookup carries (model, sources, points, notes, range flags). For loops that read only the
/// number (the zone march, the runaway scan), where writing the texts costs more than the physics.
pub fn permittivity_value(
    material: &Material,
    frequency_hz: f64,
    state: &MaterialState,
) -> Result<ComplexPermittivity, InputError> {
    let frequency_hz = checked_frequency(frequency_hz)?;
    state.checked()?;
    let temp_c = state.temp_c;
    // Each arm computes what the same arm of `permittivity_with_conductivity` does, by the same
    // functions, so the two agree bit for bit (a unit test holds them to it).
    let value = match &material.dielectric {
        DielectricModel::Water { .. } => {
            saline::permittivity(frequency_hz, temp_c, state.salt_pct.unwrap_or(0.0) / 100.0, None).eps
        }
        DielectricModel::Ice { .. } => ice::permittivity(frequency_hz, temp_c.min(0.0)),
        DielectricModel::Constant { eps_real, eps_imag, .. } => {
            crate::physics::complex::Complex::new(*eps_real, -eps_imag)
        }
        DielectricModel::Table { points, nominal_moisture_wb } => {
            let moisture = state.moisture_wb.or(*nominal_moisture_wb);
            let (eps_real, eps_imag) = interpolation::interpolate_eps(points, frequency_hz / 1e6, temp_c, moisture);
            crate::physics::complex::Complex::new(eps_real, -eps_imag)
        }
        DielectricModel::Moist { .. } => {
            models::moist_eps(&material.dielectric, frequency_hz, temp_c, state.moisture_wb, state.salt_pct, None)
                .ok_or_else(|| broken(material))?
        }
        DielectricModel::Frozen { .. } => {
            models::frozen_eps(material, frequency_hz, temp_c, state.moisture_wb, state.salt_pct)
                .ok_or_else(|| broken(material))?
        }
    };
    finished(material, temp_c, value)
}

/// [`permittivity_value`] at one moisture and salt for many frequencies and temperatures, with
/// what does not change between them worked out once: for the frozen-food model, the food's state
/// at the moisture and the mixing terms of fat and the solids (a zone march looks its product up
/// hundreds of times at one moisture). Every value and error is [`permittivity_value`]'s, bit for
/// bit.
#[derive(Debug, Clone)]
pub struct PermittivityCurve<'a> {
    material: &'a Material,
    moisture_wb: Option<f64>,
    salt_pct: Option<f64>,
    frozen: Option<models::FrozenCurve>,
}

impl Material {
    /// This material's permittivity at `moisture_wb` and `salt_pct` (as in [`MaterialState`]).
    pub fn permittivity_curve(&self, moisture_wb: Option<f64>, salt_pct: Option<f64>) -> PermittivityCurve<'_> {
        // A moisture or salt the checks refuse is never prepared: every value refuses it.
        let state = MaterialState { temp_c: 0.0, moisture_wb, salt_pct };
        let frozen = if state.checked().is_ok() { models::FrozenCurve::new(self, moisture_wb, salt_pct) } else { None };
        PermittivityCurve { material: self, moisture_wb, salt_pct, frozen }
    }
}

impl PermittivityCurve<'_> {
    /// [`permittivity_value`] of the material at `temp_c` and the curve's moisture and salt.
    pub fn value(&self, frequency_hz: f64, temp_c: f64) -> Result<ComplexPermittivity, InputError> {
        let state = MaterialState { temp_c, moisture_wb: self.moisture_wb, salt_pct: self.salt_pct };
        let Some(frozen) = &self.frozen else {
            return permittivity_value(self.material, frequency_hz, &state);
        };
        // The checks of `permittivity_value`, in its order, then its frozen-food arm.
        let frequency_hz = checked_frequency(frequency_hz)?;
        state.checked()?;
        finished(self.material, temp_c, frozen.eps(frequency_hz, temp_c))
    }
}

/// A model's eps' - j eps'' as a checked permittivity.
fn finished(
    material: &Material,
    temp_c: f64,
    value: crate::physics::complex::Complex,
) -> Result<ComplexPermittivity, InputError> {
    // Loss can only be zero or positive; a tiny negative value from rounding is shown as zero.
    let eps = ComplexPermittivity::new(value.re, (-value.im).max(0.0));
    if !(eps.eps_real.is_finite() && eps.eps_imag.is_finite() && eps.eps_real > 0.0) {
        return Err(InputError::new("temp_c", temp_c, format!("a state {} can be evaluated at", material.name)));
    }
    Ok(eps)
}

fn broken(material: &Material) -> InputError {
    InputError::new("material", &material.name, "an entry whose dielectric and thermal models fit together")
}

fn source_text(material: &Material, id: &str) -> String {
    material.source_by_id(id).map_or_else(|| id.to_string(), library::Source::summary)
}

fn ignore_moisture(material: &Material, state: &MaterialState, notes: &mut Vec<String>) {
    if state.moisture_wb.is_some() {
        notes.push(format!("moisture_wb ignored: {} has no moisture axis", material.name));
    }
}

fn ignore_salt(material: &Material, state: &MaterialState, notes: &mut Vec<String>) {
    if state.salt_pct.is_some() {
        notes.push(format!("salt_pct ignored: the data of {} already includes its ionic loss", material.name));
    }
}

#[inline]
#[allow(clippy::manual_range_contains)] // see the comparison's comment
fn checked_temp(temp_c: f64) -> Result<f64, InputError> {
    // The accepted case inline: root searches check every temperature they try.
    // Plain comparisons (a NaN fails both): the size-optimised build calls `contains` out of line.
    if temp_c >= TEMP_MIN_C && temp_c <= TEMP_MAX_C {
        return Ok(temp_c);
    }
    require_in("temp_c", temp_c, TEMP_MIN_C, TEMP_MAX_C)
}

fn checked_moisture(moisture_wb: Option<f64>) -> Result<Option<f64>, InputError> {
    moisture_wb.map(|m| require_in("moisture_wb", m, 0.0, MOISTURE_MAX_WB)).transpose()
}

impl Material {
    /// The ranges of frequency, temperature and moisture the data or model covers.
    pub fn ranges(&self) -> Ranges {
        let span = |values: &mut dyn Iterator<Item = f64>| -> [f64; 2] {
            let mut range = [f64::INFINITY, f64::NEG_INFINITY];
            for v in values {
                range[0] = range[0].min(v);
                range[1] = range[1].max(v);
            }
            range
        };
        match &self.dielectric {
            DielectricModel::Water { .. } => Ranges {
                freq_mhz: [0.0, water::FIT_FREQUENCY_MAX_HZ / 1e6],
                temp_c: [water::FIT_TEMP_MIN_C, water::FIT_TEMP_MAX_C],
                moisture_wb: None,
            },
            DielectricModel::Ice { .. } => Ranges {
                freq_mhz: [10.0, 300_000.0],
                temp_c: [ice::MODEL_TEMP_MIN_C, ice::MODEL_TEMP_MAX_C],
                moisture_wb: None,
            },
            DielectricModel::Constant { freq_range_mhz, temp_range_c, .. } => {
                Ranges { freq_mhz: *freq_range_mhz, temp_c: *temp_range_c, moisture_wb: None }
            }
            DielectricModel::Table { points, .. } => {
                let has_moisture = points.iter().any(|p| p.moisture_wb.is_some());
                Ranges {
                    freq_mhz: span(&mut points.iter().map(|p| p.freq_mhz)),
                    temp_c: span(&mut points.iter().map(|p| p.temp_c)),
                    moisture_wb: has_moisture.then(|| span(&mut points.iter().filter_map(|p| p.moisture_wb))),
                }
            }
            DielectricModel::Moist { moisture_range_wb, temp_range_c, freq_range_mhz, .. }
            | DielectricModel::Frozen { moisture_range_wb, temp_range_c, freq_range_mhz, .. } => {
                Ranges { freq_mhz: *freq_range_mhz, temp_c: *temp_range_c, moisture_wb: Some(*moisture_range_wb) }
            }
        }
    }

    /// The nominal moisture (wet basis) of the material, if it has one.
    pub fn nominal_moisture_wb(&self) -> Option<f64> {
        match (&self.thermal, &self.dielectric) {
            (ThermalModel::Composition { composition, .. }, _) => Some(composition.water),
            (_, DielectricModel::Moist { moisture_wb, .. }) => Some(*moisture_wb),
            (ThermalModel::DryPlusWater { moisture_wb, .. }, _) => Some(*moisture_wb),
            (_, DielectricModel::Table { nominal_moisture_wb, .. }) => *nominal_moisture_wb,
            _ => None,
        }
    }

    /// Bulk density at `moisture_wb` (nominal if `None`), kg/m^3: the moist model's no-shrinkage
    /// density where the entry has one, otherwise the entry's density.
    pub fn bulk_density_kg_per_m3(&self, moisture_wb: Option<f64>) -> Result<f64, InputError> {
        let moisture_wb = checked_moisture(moisture_wb)?;
        Ok(match (&self.dielectric, moisture_wb) {
            (DielectricModel::Moist { dry_bulk_density_kg_per_m3, solid_density_kg_per_m3, .. }, Some(x)) => {
                models::moist_fractions(*dry_bulk_density_kg_per_m3, *solid_density_kg_per_m3, x, 20.0).3
            }
            _ => self.density_kg_per_m3,
        })
    }

    /// Initial freezing point, degC: the food's (at its nominal moisture), 0 for water and ice,
    /// `None` for materials whose freezing is not modelled.
    pub fn initial_freezing_point_c(&self) -> Option<f64> {
        match &self.thermal {
            ThermalModel::Composition { initial_freezing_point_c, .. } => *initial_freezing_point_c,
            ThermalModel::Water { .. } | ThermalModel::Ice { .. } => Some(0.0),
            _ => None,
        }
    }

    /// Fraction of the material's water that is ice at `temp_c` (nominal moisture): the ASHRAE
    /// form for foods, 1 below and 0 above 0 degC for `ice`, 0 for liquid `water` (supercooled below
    /// 0 degC) and for materials without a freezing model.
    pub fn frozen_fraction(&self, temp_c: f64) -> Result<f64, InputError> {
        self.frozen_fraction_at(temp_c, None)
    }

    /// As [`Material::frozen_fraction`] at a moisture other than the nominal one.
    pub fn frozen_fraction_at(&self, temp_c: f64, moisture_wb: Option<f64>) -> Result<f64, InputError> {
        let temp_c = checked_temp(temp_c)?;
        let moisture_wb = checked_moisture(moisture_wb)?;
        Ok(match &self.thermal {
            ThermalModel::Ice { .. } if temp_c < 0.0 => 1.0,
            ThermalModel::Composition { .. } => match models::food_state(self, moisture_wb) {
                Some((food, Some(tf))) => freezing::frozen_fraction_of_water(&food, tf, temp_c),
                _ => 0.0,
            },
            _ => 0.0,
        })
    }

    /// Specific heat, J/(kg K), at `temp_c` and `moisture_wb` (nominal if `None`). For a food
    /// below its freezing point this is the sensible specific heat of the partly frozen mixture
    /// (ice, water and solids by Choi-Okos), WITHOUT the latent heat: energy balances across
    /// freezing must use differences of [`Material::enthalpy_j_per_kg`].
    pub fn specific_heat_j_per_kg_k(&self, temp_c: f64, moisture_wb: Option<f64>) -> Result<f64, InputError> {
        let temp_c = checked_temp(temp_c)?;
        let moisture_wb = checked_moisture(moisture_wb)?;
        Ok(match &self.thermal {
            ThermalModel::Water { .. } => water_specific_heat(temp_c),
            ThermalModel::Ice { .. } => {
                if temp_c < 0.0 {
                    thermal::ice_cp_unchecked(temp_c)
                } else {
                    water_specific_heat(temp_c)
                }
            }
            ThermalModel::Composition { .. } => {
                let (food, tf) = models::food_state(self, moisture_wb).ok_or_else(|| broken(self))?;
                let ice = tf.map_or(0.0, |tf| freezing::ice_mass_fraction(&food, tf, temp_c));
                let unfrozen = food.specific_heat_j_per_kg_k(temp_c);
                // Replace the frozen part of the water by ice.
                let water_cp = if food.water > 0.0 {
                    (unfrozen - food.solids_specific_heat_j_per_kg_k(temp_c)) / food.water
                } else {
                    0.0
                };
                unfrozen - ice * water_cp + ice * thermal::ice_cp_unchecked(temp_c.min(0.0))
            }
            ThermalModel::Constant { specific_heat_j_per_kg_k, .. } => *specific_heat_j_per_kg_k,
            ThermalModel::Table { points, .. } => table_specific_heat(points, temp_c),
            ThermalModel::DryPlusWater { dry_specific_heat_j_per_kg_k, moisture_wb: nominal, .. } => {
                let x = moisture_wb.unwrap_or(*nominal);
                x * water_specific_heat(temp_c) + (1.0 - x) * dry_specific_heat_j_per_kg_k
            }
        })
    }

    /// Specific enthalpy, J/kg, at `temp_c` and `moisture_wb` (nominal if `None`), so that the heat
    /// to go from T1 to T2 at constant moisture is `enthalpy(T2) - enthalpy(T1)`. Continuous and
    /// rising in T, with the latent heat of the frozen fraction for foods with a freezing point.
    /// The reference differs between models (see [`Material::enthalpy_reference`]): only
    /// differences within one material are meaningful.
    pub fn enthalpy_j_per_kg(&self, temp_c: f64, moisture_wb: Option<f64>) -> Result<f64, InputError> {
        // The temperature first, as every entry point checks it before the moisture.
        let temp_c = checked_temp(temp_c)?;
        self.enthalpy_curve(moisture_wb)?.enthalpy_j_per_kg(temp_c)
    }

    /// What [`Material::enthalpy_j_per_kg`] is measured from.
    pub fn enthalpy_reference(&self) -> &'static str {
        match &self.thermal {
            ThermalModel::Water { .. } | ThermalModel::Ice { .. } => {
                "liquid water at 0 degC (ice at 0 degC is -333.42 kJ/kg)"
            }
            ThermalModel::Composition { initial_freezing_point_c: Some(_), .. } => {
                "the frozen food at -40 degC (ASHRAE)"
            }
            _ => "the material at 0 degC (water in it liquid)",
        }
    }
}

/// Specific heat of liquid water from the IAPWS saturation-line enthalpy, J/(kg K) (a central
/// difference of h'; below 0.01 degC the supercooled straight line of thermal.rs).
fn water_specific_heat(temp_c: f64) -> f64 {
    let step = 0.01;
    (thermal::liquid_enthalpy_from_zero(temp_c + step) - thermal::liquid_enthalpy_from_zero(temp_c - step))
        / (2.0 * step)
}

fn table_specific_heat(points: &[library::SpecificHeatPoint], temp_c: f64) -> f64 {
    let (Some(first), Some(last)) = (points.first(), points.last()) else {
        return 0.0;
    };
    if temp_c <= first.temp_c {
        return first.specific_heat_j_per_kg_k;
    }
    if temp_c >= last.temp_c {
        return last.specific_heat_j_per_kg_k;
    }
    for pair in points.windows(2) {
        let (a, b) = (pair[0], pair[1]);
        if temp_c <= b.temp_c {
            let fraction = (temp_c - a.temp_c) / (b.temp_c - a.temp_c);
            return a.specific_heat_j_per_kg_k + fraction * (b.specific_heat_j_per_kg_k - a.specific_heat_j_per_kg_k);
        }
    }
    last.specific_heat_j_per_kg_k
}

/// Integral of the piecewise-linear (held beyond the ends) specific heat from 0 degC, J/kg.
fn table_enthalpy(points: &[library::SpecificHeatPoint], temp_c: f64) -> f64 {
    // Integrate with the trapezoid rule over the breakpoints between 0 and temp_c (exact for a
    // piecewise-linear function).
    let (low, high, sign) = if temp_c >= 0.0 { (0.0, temp_c, 1.0) } else { (temp_c, 0.0, -1.0) };
    let mut knots: Vec<f64> = vec![low, high];
    knots.extend(points.iter().map(|p| p.temp_c).filter(|&t| t > low && t < high));
    knots.sort_by(f64::total_cmp);
    let integral: f64 = knots
        .windows(2)
        .map(|pair| {
            0.5 * (pair[1] - pair[0]) * (table_specific_heat(points, pair[0]) + table_specific_heat(points, pair[1]))
        })
        .sum();
    sign * integral
}
