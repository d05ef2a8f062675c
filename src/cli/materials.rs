//! `doubleprime materials [--category C]`: the material library, one entry per material.

use super::args::{Args, CliError};
use doubleprime::materials::{library, Confidence, DielectricModel};
use serde_json::{json, Value};

pub fn run(rest: &[String]) -> Result<String, CliError> {
    let args = Args::parse(rest, &["category"])?;
    args.at_most_positional(0, "only --category")?;
    let category = args.text("category");
    if let Some(wanted) = category {
        if !library().iter().any(|m| m.category.as_str() == wanted) {
            let mut known: Vec<&str> = library().iter().map(|m| m.category.as_str()).collect();
            known.dedup();
            return Err(CliError::Usage(format!("unknown category `{wanted}`; one of: {}", known.join(", "))));
        }
    }
    let entries: Vec<Value> = library()
        .iter()
        .filter(|m| category.is_none_or(|wanted| m.category.as_str() == wanted))
        .map(|m| {
            let ranges = m.ranges();
            // The weakest confidence among the entry's sources tells how far to trust it.
            let weakest = m
                .sources
                .iter()
                .map(|s| s.confidence)
                .max_by_key(|c| match c {
                    Confidence::Published => 0,
                    Confidence::CommonPractice => 1,
                    Confidence::FromMemory => 2,
                    Confidence::UserGiven => 3,
                })
                .map(|c| c.as_str());
            let model = match &m.dielectric {
                DielectricModel::Water { .. } => "water",
                DielectricModel::Ice { .. } => "ice",
                DielectricModel::Constant { .. } => "constant",
                DielectricModel::Table { .. } => "table",
                DielectricModel::Moist { .. } => "moist",
                DielectricModel::Frozen { .. } => "frozen",
            };
            json!({
                "name": m.name,
                "label": m.label,
                "category": m.category.as_str(),
                "dielectric_model": model,
                "freq_mhz_range": ranges.freq_mhz,
                "temp_c_range": ranges.temp_c,
                "moisture_wb_range": ranges.moisture_wb,
                "density_kg_per_m3": m.density_kg_per_m3,
                "initial_freezing_point_c": m.initial_freezing_point_c(),
                "weakest_confidence": weakest,
                "source": m.source,
            })
        })
        .collect();
    Ok(super::to_json(&json!({
        "count": entries.len(),
        "materials": entries,
    })))
}
