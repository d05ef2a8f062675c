//! `doubleprime dielectric --freq-mhz F --eps-real A --eps-imag B [--e-rms V] [--volume-m3 V]`.

use super::args::{Args, CliError};
use doubleprime::physics::bands::{band_containing, out_of_band_warning};
use doubleprime::physics::heating::{absorbed_power_w, heating_rate_k_per_s, power_density_w_per_m3};
use doubleprime::physics::permittivity::{ComplexPermittivity, EPS_IMAG_MAX, EPS_REAL_MAX};
use doubleprime::physics::waves::{checked_frequency_hz, wave_properties, FREQUENCY_MAX_HZ};
use serde_json::{json, Map, Value};

/// Highest RMS field accepted, V/m: ten times the breakdown field of air (about 3 MV/m).
const E_RMS_MAX_V_PER_M: f64 = 3.0e7;
/// Largest volume accepted, m^3.
const VOLUME_MAX_M3: f64 = 1.0e4;

pub fn run(rest: &[String]) -> Result<String, CliError> {
    let args = Args::parse(
        rest,
        &["freq-mhz", "eps-real", "eps-imag", "e-rms", "volume-m3", "density-kg-per-m3", "specific-heat-j-per-kg-k"],
    )?;
    args.at_most_positional(0, "only options")?;
    let freq_mhz = args.required_number("freq-mhz", 1e-3, FREQUENCY_MAX_HZ / 1e6)?;
    let frequency_hz = checked_frequency_hz(freq_mhz)?;
    let eps_real = args.required_number("eps-real", 1.0, EPS_REAL_MAX)?;
    let eps_imag = args.required_number("eps-imag", 0.0, EPS_IMAG_MAX)?;
    let e_rms = args.number("e-rms", 0.0, E_RMS_MAX_V_PER_M)?;
    let volume_m3 = args.number("volume-m3", 0.0, VOLUME_MAX_M3)?;
    let density = args.number("density-kg-per-m3", 1.0, 25_000.0)?;
    let specific_heat = args.number("specific-heat-j-per-kg-k", 100.0, 10_000.0)?;
    if volume_m3.is_some() && e_rms.is_none() {
        return Err(CliError::Usage("--volume-m3 needs --e-rms (the field sets the power)".into()));
    }

    let eps = ComplexPermittivity::checked(eps_real, eps_imag)?;
    let waves = wave_properties(frequency_hz, eps);
    let mut out = match serde_json::to_value(waves) {
        Ok(Value::Object(map)) => map,
        _ => Map::new(),
    };
    out.insert("freq_mhz".into(), json!(freq_mhz));
    out.insert("eps_real".into(), json!(eps_real));
    out.insert("eps_imag".into(), json!(eps_imag));
    out.insert("ism_band".into(), json!(band_containing(freq_mhz).map(|band| band.name)));
    if let Some(e_rms) = e_rms {
        let density_w_per_m3 = power_density_w_per_m3(frequency_hz, eps_imag, e_rms);
        out.insert("e_rms_v_per_m".into(), json!(e_rms));
        out.insert("power_density_w_per_m3".into(), json!(density_w_per_m3));
        if let Some(volume_m3) = volume_m3 {
            out.insert("volume_m3".into(), json!(volume_m3));
            out.insert("power_w".into(), json!(absorbed_power_w(density_w_per_m3, volume_m3)));
        }
        if let (Some(rho), Some(cp)) = (density, specific_heat) {
            out.insert("heating_rate_k_per_s".into(), json!(heating_rate_k_per_s(density_w_per_m3, rho, cp)));
        }
    }
    let warnings: Vec<Value> = out_of_band_warning(freq_mhz)
        .map(|message| json!({ "code": "outside_ism_band", "message": message }))
        .into_iter()
        .collect();
    out.insert("warnings".into(), Value::Array(warnings));
    Ok(super::to_json(&Value::Object(out)))
}
