//! `doubleprime layers FILE.json --freq-mhz F [--feed top|bottom|both] [--samples N]`: solve a
//! layered load (the stack file format is documented in `doubleprime::physics::layers`) and print
//! reflectance, transmittance, absorptance per layer, the depth profile and the uniformity.

use super::args::{Args, CliError};
use doubleprime::error::InputError;
use doubleprime::physics::bands::out_of_band_warning;
use doubleprime::physics::layers::{
    solve_stack, Backing, Feed, StackDocument, SAMPLES_PER_LAYER_MAX, SAMPLES_PER_LAYER_MIN,
};
use doubleprime::physics::waves::{checked_frequency_hz, FREQUENCY_MAX_HZ};
use serde_json::{json, Value};

/// Depth samples per layer when `--samples` is not given: resolves the standing wave in a few
/// centimetres of wet product at 2450 MHz (about 10 points per half wavelength in 5 cm of water).
const SAMPLES_DEFAULT: usize = 101;

pub fn run(rest: &[String]) -> Result<String, CliError> {
    let args = Args::parse(rest, &["freq-mhz", "feed", "samples"])?;
    args.at_most_positional(1, "one stack file")?;
    let Some(path) = args.positional.first() else {
        return Err(CliError::Usage(
            "layers needs a stack file: doubleprime layers FILE.json --freq-mhz F \
             [--feed top|bottom|both] [--samples N]"
                .to_string(),
        ));
    };
    let freq_mhz = args.required_number("freq-mhz", 1e-3, FREQUENCY_MAX_HZ / 1e6)?;
    let frequency_hz = checked_frequency_hz(freq_mhz)?;
    let feed = match args.text("feed") {
        None | Some("top") => Feed::Top,
        Some("bottom") => Feed::Bottom,
        Some("both") | Some("both_sides") => Feed::BothSides,
        Some(other) => {
            return Err(CliError::Input(InputError::new("feed", format!("{other:?}"), "top, bottom or both")))
        }
    };
    let samples = match args.number("samples", SAMPLES_PER_LAYER_MIN as f64, SAMPLES_PER_LAYER_MAX as f64)? {
        None => SAMPLES_DEFAULT,
        Some(value) if value.fract() == 0.0 => value as usize,
        Some(value) => {
            return Err(CliError::Input(InputError::new(
                "samples",
                value,
                format!("a whole number from {SAMPLES_PER_LAYER_MIN} to {SAMPLES_PER_LAYER_MAX}"),
            )))
        }
    };

    let text =
        std::fs::read_to_string(path).map_err(|error| CliError::File(format!("{path}: cannot be read: {error}")))?;
    let document: StackDocument = serde_json::from_str(&text)
        .map_err(|error| CliError::File(format!("{path}: not a valid stack file: {error}")))?;
    let (layers, backing) = document.to_stack().map_err(|error| CliError::File(format!("{path}: {error}")))?;
    let solution = solve_stack(frequency_hz, &layers, backing, feed, samples).map_err(|error| {
        // Errors about the stack itself come from the file; the rest from the flags.
        if error.field.starts_with("layers") || error.field.starts_with("backing") {
            CliError::File(format!("{path}: {error}"))
        } else {
            CliError::Input(error)
        }
    })?;

    let layer_rows: Vec<Value> = solution
        .layers
        .iter()
        .zip(&layers)
        .map(|(result, layer)| {
            json!({
                "name": result.name,
                "thickness_m": result.thickness_m,
                "top_depth_m": result.top_depth_m,
                "eps_real": layer.permittivity.eps_real,
                "eps_imag": layer.permittivity.eps_imag,
                "product": result.is_product,
                "absorptance": result.absorptance,
            })
        })
        .collect();
    let backing_value = match backing {
        Backing::Air => json!("air"),
        Backing::Metal => json!("metal"),
        Backing::Material(eps) => json!({ "eps_real": eps.eps_real, "eps_imag": eps.eps_imag }),
    };
    let mut warnings: Vec<Value> =
        solution.warnings.iter().map(|warning| json!({ "code": warning.code, "message": warning.message })).collect();
    if let Some(message) = out_of_band_warning(freq_mhz) {
        warnings.push(json!({ "code": "outside_ism_band", "message": message }));
    }
    let out = json!({
        "freq_mhz": freq_mhz,
        "feed": solution.feed,
        "backing": backing_value,
        "samples_per_layer": solution.samples_per_layer,
        "reflectance": solution.reflectance,
        "transmittance": solution.transmittance,
        "absorptance": solution.absorptance,
        "product_absorptance": solution.product_absorptance,
        "layers": layer_rows,
        "sides": solution.sides,
        "depth_profile": solution.depth_profile,
        "uniformity": solution.uniformity,
        "warnings": warnings,
    });
    Ok(super::to_json(&out))
}
