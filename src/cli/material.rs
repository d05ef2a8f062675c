//! `doubleprime material NAME --freq-mhz F --temp-c T [--moisture-wb X] [--salt-pct S]
//! [--conductivity-s-per-m C] [--to-temp-c T2] [--bed-depth-m D]`: one material at one state.

use super::args::{Args, CliError};
use doubleprime::materials::warnings::{bed_depth_check, runaway_risk};
use doubleprime::materials::{
    library, permittivity_with_conductivity, MaterialState, CONDUCTIVITY_MAX_S_PER_M, MOISTURE_MAX_WB, SALT_MAX_PCT,
    TEMP_MAX_C, TEMP_MIN_C,
};
use doubleprime::physics::bands::out_of_band_warning;
use doubleprime::physics::waves::{checked_frequency_hz, wave_properties, FREQUENCY_MAX_HZ};
use serde_json::{json, Value};

pub fn run(rest: &[String]) -> Result<String, CliError> {
    let args = Args::parse(
        rest,
        &["freq-mhz", "temp-c", "moisture-wb", "salt-pct", "conductivity-s-per-m", "to-temp-c", "bed-depth-m"],
    )?;
    args.at_most_positional(1, "one material name")?;
    let Some(name) = args.positional.first() else {
        return Err(CliError::Usage(
            "material needs a name, e.g. `doubleprime material water --freq-mhz 2450 --temp-c 20`; `doubleprime materials` lists them".into(),
        ));
    };
    let Some(material) = library().get(name) else {
        return Err(CliError::Usage(format!(
            "unknown material `{name}`; `doubleprime materials` lists the {} names (e.g. water, ice, beef-lean)",
            library().len()
        )));
    };
    let freq_mhz = args.required_number("freq-mhz", 1e-3, FREQUENCY_MAX_HZ / 1e6)?;
    let frequency_hz = checked_frequency_hz(freq_mhz)?;
    let temp_c = args.required_number("temp-c", TEMP_MIN_C, TEMP_MAX_C)?;
    let moisture_wb = args.number("moisture-wb", 0.0, MOISTURE_MAX_WB)?;
    let salt_pct = args.number("salt-pct", 0.0, SALT_MAX_PCT)?;
    let conductivity = args.number("conductivity-s-per-m", 0.0, CONDUCTIVITY_MAX_S_PER_M)?;
    let to_temp_c = args.number("to-temp-c", TEMP_MIN_C, TEMP_MAX_C)?;
    let bed_depth_m = args.number("bed-depth-m", 1e-4, 10.0)?;

    let state = MaterialState { temp_c, moisture_wb, salt_pct };
    let lookup = permittivity_with_conductivity(material, frequency_hz, &state, conductivity)?;
    let waves = wave_properties(frequency_hz, lookup.eps);
    let mut warnings: Vec<Value> = out_of_band_warning(freq_mhz)
        .map(|message| json!({ "code": "outside_ism_band", "message": message }))
        .into_iter()
        .collect();
    for flag in &lookup.out_of_range {
        warnings.push(json!({ "code": "outside_data_range", "message": flag }));
    }
    let runaway = match to_temp_c {
        Some(to) => {
            let end = MaterialState { temp_c: to, ..state };
            let risk = runaway_risk(material, frequency_hz, &state, &end)?;
            if let Some(risk) = &risk {
                warnings.push(json!({ "code": "thermal_runaway_risk", "message": risk.message }));
            }
            json!(risk)
        }
        None => Value::Null,
    };
    let bed = match bed_depth_m {
        Some(depth) => {
            let check = bed_depth_check(waves.penetration_depth_m, depth)?;
            if !matches!(check.verdict, doubleprime::materials::warnings::BedVerdict::Even) {
                warnings.push(json!({ "code": "bed_depth", "message": check.message }));
            }
            json!(check)
        }
        None => Value::Null,
    };
    let out = json!({
        "material": material.name,
        "label": material.label,
        "category": material.category.as_str(),
        "freq_mhz": freq_mhz,
        "temp_c": temp_c,
        "moisture_wb": moisture_wb.or(material.nominal_moisture_wb()),
        "salt_pct": salt_pct,
        "eps_real": lookup.eps.eps_real,
        "eps_imag": lookup.eps.eps_imag,
        "loss_tangent": waves.loss_tangent,
        "penetration_depth_m": waves.penetration_depth_m,
        "half_power_depth_m": waves.half_power_depth_m,
        "density_kg_per_m3": material.bulk_density_kg_per_m3(moisture_wb)?,
        "specific_heat_j_per_kg_k": material.specific_heat_j_per_kg_k(temp_c, moisture_wb)?,
        "enthalpy_j_per_kg": material.enthalpy_j_per_kg(temp_c, moisture_wb)?,
        "enthalpy_reference": material.enthalpy_reference(),
        "initial_freezing_point_c": material.initial_freezing_point_c(),
        "frozen_fraction": material.frozen_fraction_at(temp_c, moisture_wb)?,
        "in_range": lookup.in_range,
        "out_of_range": lookup.out_of_range,
        "points_used": lookup.points_used,
        "model": lookup.model,
        "source": lookup.source,
        "sources": material.sources,
        "notes": lookup.notes,
        "runaway_risk": runaway,
        "bed_depth": bed,
        "warnings": warnings,
    });
    Ok(super::to_json(&out))
}
