//! Reading and checking a scenario: every problem reported at once, each naming the field, the
//! value and the valid range. A scenario with problems yields no plan.

use super::document::{ProcessKind, Scenario, SCHEMA_VERSION};
use crate::error::{require_in, require_positive, InputError};
use crate::physics::waves::FREQUENCY_MAX_HZ;

/// Coldest product temperature accepted, degC: below blast-freezer temperatures.
pub const TEMP_MIN_C: f64 = -60.0;
/// Hottest product temperature accepted, degC: above rubber curing and ceramic drying.
pub const TEMP_MAX_C: f64 = 300.0;
/// Highest wet-basis moisture accepted: a product of 95 % water is a liquid.
pub const MOISTURE_MAX_WB: f64 = 0.95;
/// Highest throughput accepted, kg/h.
pub const THROUGHPUT_MAX_KG_PER_H: f64 = 200_000.0;
/// Most zones along the tunnel.
pub const ZONES_MAX: u32 = 1000;

/// Parse scenario JSON. Wrong syntax, a wrong or missing schema version, unknown fields and wrong
/// types come back as errors naming what is wrong; the numbers are checked by [`validate`].
pub fn parse_scenario(text: &str) -> Result<Scenario, Vec<InputError>> {
    let value: serde_json::Value = serde_json::from_str(text)
        .map_err(|error| vec![InputError::new("scenario", format!("not JSON ({error})"), "a JSON object")])?;
    let Some(object) = value.as_object() else {
        return Err(vec![InputError::new("scenario", "not an object", "a JSON object with a schema field")]);
    };
    match object.get("schema").and_then(serde_json::Value::as_u64) {
        Some(version) if version == u64::from(SCHEMA_VERSION) => {}
        Some(version) => {
            return Err(vec![InputError::new(
                "schema",
                version,
                format!("{SCHEMA_VERSION} (this build reads schema {SCHEMA_VERSION} scenarios)"),
            )])
        }
        None => return Err(vec![InputError::new("schema", "missing", format!("{SCHEMA_VERSION}"))]),
    }
    serde_json::from_value(value).map_err(|error| {
        vec![InputError::new("scenario", error.to_string(), "the fields documented in demo-loads/README.md")]
    })
}

fn push(problems: &mut Vec<InputError>, result: Result<f64, InputError>) {
    if let Err(error) = result {
        problems.push(error);
    }
}

/// Check every number and every rule between fields that does not need the material.
pub fn validate(scenario: &Scenario) -> Vec<InputError> {
    let mut problems = Vec::new();
    let p = &mut problems;
    push(p, require_positive("throughput_kg_per_h", scenario.throughput_kg_per_h, THROUGHPUT_MAX_KG_PER_H));
    push(p, require_in("inlet.temp_c", scenario.inlet.temp_c, TEMP_MIN_C, TEMP_MAX_C));
    push(p, require_in("outlet.temp_c", scenario.outlet.temp_c, TEMP_MIN_C, TEMP_MAX_C));
    if let Some(moisture) = scenario.inlet.moisture_wb {
        push(p, require_in("inlet.moisture_wb", moisture, 0.0, MOISTURE_MAX_WB));
    }
    if let Some(moisture) = scenario.outlet.moisture_wb {
        push(p, require_in("outlet.moisture_wb", moisture, 0.0, MOISTURE_MAX_WB));
    }
    if let Some(salt) = scenario.salt_pct {
        push(p, require_in("salt_pct", salt, 0.0, 26.0));
    }
    push(p, require_in("pressure_kpa", scenario.pressure_kpa, 2.0, 200.0));
    if let Some(temp) = scenario.evaporation_temp_c {
        push(p, require_in("evaporation_temp_c", temp, 10.0, 150.0));
    }
    push(p, require_in("frequency_mhz", scenario.frequency_mhz, 1.0, FREQUENCY_MAX_HZ / 1e6));

    let efficiency = &scenario.efficiency;
    for (field, value) in
        [("efficiency.power_supply", efficiency.power_supply), ("efficiency.generator", efficiency.generator)]
    {
        if let Some(value) = value {
            push(p, require_in(field, value, 0.05, 1.0));
        }
    }
    push(p, require_in("efficiency.transmission", efficiency.transmission, 0.05, 1.0));
    push(p, require_in("efficiency.applicator", efficiency.applicator, 0.05, 1.0));

    let tunnel = &scenario.tunnel;
    let geometry = crate::sizing::tunnel::TunnelInput {
        belt_width_m: tunnel.belt_width_m,
        bed_depth_m: tunnel.bed_depth_m,
        bulk_density_kg_per_m3: tunnel.bulk_density_kg_per_m3.unwrap_or(1000.0),
        residence: tunnel.residence,
    };
    p.extend(geometry.validate());
    if tunnel.zones == 0 || tunnel.zones > ZONES_MAX {
        p.push(InputError::new("tunnel.zones", tunnel.zones, format!("1 to {ZONES_MAX}")));
    }
    if let Some(stack) = &tunnel.load_stack {
        for (name, slab) in [("tray", &stack.tray), ("belt", &stack.belt)] {
            if let Some(slab) = slab {
                let prefix = format!("tunnel.load_stack.{name}");
                push(p, require_positive(&format!("{prefix}.thickness_m"), slab.thickness_m, 0.5));
                push(
                    p,
                    require_in(
                        &format!("{prefix}.eps_real"),
                        slab.eps_real,
                        1.0,
                        crate::physics::permittivity::EPS_REAL_MAX,
                    ),
                );
                push(
                    p,
                    require_in(
                        &format!("{prefix}.eps_imag"),
                        slab.eps_imag,
                        0.0,
                        crate::physics::permittivity::EPS_IMAG_MAX,
                    ),
                );
            }
        }
        push(p, require_in("tunnel.load_stack.air_gap_m", stack.air_gap_m, 0.0, 2.0));
        if stack.backing == super::document::BackingSpec::Metal && tunnel.feed == super::document::FeedSides::Both {
            p.push(InputError::new(
                "tunnel.load_stack.backing",
                "metal",
                "air when the bed is fed from both sides (a metal floor blocks the lower feed)",
            ));
        }
    }
    p.extend(scenario.losses.validate());
    p.extend(scenario.site.validate());
    for (index, class) in scenario.generator.extra_classes.iter().enumerate() {
        p.extend(class.validate().into_iter().map(|error| error.within(&format!("generator.extra_classes[{index}]"))));
    }
    check_process_rules(scenario, p);
    for (field, text) in [
        ("name", &scenario.name),
        ("description", &scenario.description),
        ("project.customer", &scenario.project.customer),
        ("project.site", &scenario.project.site),
        ("project.author", &scenario.project.author),
        ("project.date", &scenario.project.date),
        ("project.reference", &scenario.project.reference),
        ("project.notes", &scenario.project.notes),
    ] {
        if text.chars().count() > 4000 {
            p.push(InputError::new(field, format!("{} characters", text.chars().count()), "at most 4000 characters"));
        }
    }
    problems
}

/// Rules between fields that follow from the process kind.
fn check_process_rules(scenario: &Scenario, problems: &mut Vec<InputError>) {
    let (t_in, t_out) = (scenario.inlet.temp_c, scenario.outlet.temp_c);
    let moisture_in = scenario.inlet.moisture_wb;
    let moisture_out = scenario.outlet.moisture_wb;
    match scenario.process {
        ProcessKind::Drying => match (moisture_in, moisture_out) {
            (Some(w_in), Some(w_out)) if w_out >= w_in && w_in.is_finite() && w_out.is_finite() => {
                problems.push(InputError::new(
                    "outlet.moisture_wb",
                    w_out,
                    format!("below the inlet moisture {w_in} for drying"),
                ));
            }
            (None, _) | (_, None) => problems.push(InputError::new(
                if moisture_in.is_none() { "inlet.moisture_wb" } else { "outlet.moisture_wb" },
                "missing",
                "a wet-basis moisture 0 to 0.95 (drying needs both inlet and outlet moisture)",
            )),
            _ => {}
        },
        ProcessKind::Heating
        | ProcessKind::Pasteurising
        | ProcessKind::Curing
        | ProcessKind::Tempering
        | ProcessKind::Thawing => {
            if t_out <= t_in && t_in.is_finite() && t_out.is_finite() {
                problems.push(InputError::new(
                    "outlet.temp_c",
                    t_out,
                    format!("above the inlet temperature {t_in} for {}", scenario.process.as_str()),
                ));
            }
            if let (Some(w_in), Some(w_out)) = (moisture_in, moisture_out) {
                if (w_in - w_out).abs() > 1e-9 {
                    problems.push(InputError::new(
                        "outlet.moisture_wb",
                        w_out,
                        format!("equal to the inlet moisture {w_in} unless the process is drying"),
                    ));
                }
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    const MINIMAL: &str = r#"{
        "schema": 1, "process": "heating", "product": {"library": "water"},
        "throughput_kg_per_h": 500, "inlet": {"temp_c": 10}, "outlet": {"temp_c": 70},
        "frequency_mhz": 915,
        "tunnel": {"belt_width_m": 0.6, "bed_depth_m": 0.05, "residence": {"tunnel_length_m": 5}}
    }"#;

    #[test]
    fn a_minimal_scenario_parses_with_defaults() {
        let scenario = parse_scenario(MINIMAL).unwrap();
        assert!(validate(&scenario).is_empty(), "{:?}", validate(&scenario));
        assert_eq!(scenario.efficiency.applicator, 0.85);
        assert_eq!(scenario.site.power_factor, 0.95);
        assert_eq!(scenario.tunnel.zones, 1);
    }

    #[test]
    fn schema_problems_are_named() {
        assert_eq!(parse_scenario("{").unwrap_err()[0].field, "scenario");
        assert_eq!(parse_scenario("[1]").unwrap_err()[0].field, "scenario");
        assert_eq!(parse_scenario(r#"{"process": "heating"}"#).unwrap_err()[0].field, "schema");
        assert_eq!(parse_scenario(&MINIMAL.replace("\"schema\": 1", "\"schema\": 7")).unwrap_err()[0].field, "schema");
        let unknown =
            parse_scenario(&MINIMAL.replace("\"frequency_mhz\"", "\"colour\": 1, \"frequency_mhz\"")).unwrap_err();
        assert!(unknown[0].value.contains("colour"), "{unknown:?}");
    }

    #[test]
    fn every_problem_is_reported_at_once() {
        let text = MINIMAL
            .replace("\"throughput_kg_per_h\": 500", "\"throughput_kg_per_h\": 0")
            .replace("\"temp_c\": 70", "\"temp_c\": 5")
            .replace("\"bed_depth_m\": 0.05", "\"bed_depth_m\": -1")
            .replace("\"frequency_mhz\": 915", "\"frequency_mhz\": 1e9");
        let fields: Vec<String> = validate(&parse_scenario(&text).unwrap()).into_iter().map(|e| e.field).collect();
        for expected in ["throughput_kg_per_h", "frequency_mhz", "tunnel.bed_depth_m", "outlet.temp_c"] {
            assert!(fields.iter().any(|f| f == expected), "{expected} not in {fields:?}");
        }
    }

    #[test]
    fn drying_needs_falling_moisture() {
        let text = MINIMAL
            .replace("\"heating\"", "\"drying\"")
            .replace("{\"temp_c\": 10}", "{\"temp_c\": 10, \"moisture_wb\": 0.2}")
            .replace("{\"temp_c\": 70}", "{\"temp_c\": 70, \"moisture_wb\": 0.3}");
        let problems = validate(&parse_scenario(&text).unwrap());
        assert_eq!(problems[0].field, "outlet.moisture_wb");
    }
}
