//! `doubleprime plan FILE.json [--format json|text|csv] [--generators CATALOGUE.json]`; `csv` prints
//! the zone profiles (units in the headers).

use super::args::{Args, CliError};
use super::scenario_file;
use doubleprime::plan::{plan, Plan};
use std::fmt::Write;

pub fn run(rest: &[String]) -> Result<String, CliError> {
    let args = Args::parse(rest, &["format", "generators"])?;
    let scenario = scenario_file::load(&args)?;
    let path = args.positional.first().map(String::as_str).unwrap_or("scenario");
    let plan = plan(&scenario).map_err(|errors| scenario_file::with_file(path, errors))?;
    match args.text("format").unwrap_or("json") {
        "json" => Ok(super::to_json(&plan)),
        "text" => Ok(text_report(&plan)),
        "csv" => Ok(doubleprime::export::zones_csv(&plan).trim_end().to_string()),
        other => Err(CliError::Usage(format!("--format = {other:?} is not accepted: valid is json, text or csv"))),
    }
}

/// A plain-text summary for reading in a terminal. The JSON is the full record.
fn text_report(plan: &Plan) -> String {
    let mut out = String::new();
    let _ = writeln!(out, "{}", if plan.name.is_empty() { "Plan" } else { &plan.name });
    let band = plan.ism_band.unwrap_or("outside every ISM band");
    let _ = writeln!(out, "  frequency            {} MHz ({band})", plan.frequency_mhz);
    let _ = writeln!(out, "  absorbed power       {:.1} kW", plan.absorbed_power_kw);
    let _ = writeln!(out, "  forward power        {:.1} kW", plan.forward_power_kw);
    let _ = writeln!(out, "  generator output     {:.1} kW", plan.generator_output_kw);
    let _ = writeln!(out, "  mains power          {:.1} kW ({:.0} kVA)", plan.mains_power_kw, plan.utilities.mains_kva);
    let g = &plan.generators;
    let _ = writeln!(
        out,
        "  generators           {} x {} ({} running at {:.0} % of rating, {} standby)",
        plan.generator_count,
        g.class.label,
        g.running_count,
        g.operating_fraction * 100.0,
        g.standby_count
    );
    let _ = writeln!(out, "  belt speed           {:.2} m/min", plan.belt_speed_m_per_min);
    let _ = writeln!(out, "  residence time       {:.0} s", plan.residence_time_s);
    let _ = writeln!(out, "  tunnel length        {:.2} m", plan.tunnel_length_m);
    let _ = writeln!(out, "  water removed        {:.1} kg/h", plan.water_removed_kg_per_h);
    let _ = writeln!(out, "  energy               {:.4} kWh/kg (mains)", plan.specific_energy_kwh_per_kg);
    if let Some(per_water) = plan.specific_energy_kwh_per_kg_water {
        let _ = writeln!(out, "                       {per_water:.3} kWh per kg of water removed");
    }
    let _ = writeln!(out, "  cooling water        {:.1} L/min", plan.cooling_water_l_per_min);
    let u = &plan.utilities;
    let _ = writeln!(
        out,
        "  energy cost          {:.2} {} per hour, {:.2} per tonne",
        u.energy_cost_per_hour, u.currency, u.energy_cost_per_tonne
    );
    if plan.warnings.is_empty() {
        let _ = writeln!(out, "Warnings: none");
    } else {
        let _ = writeln!(out, "Warnings:");
        for warning in &plan.warnings {
            let _ = writeln!(out, "  [{}] {}", warning.code, warning.message);
        }
    }
    let _ = writeln!(out, "Cautions:");
    for caution in &plan.cautions {
        let _ = writeln!(out, "  {}: {}", caution.title, caution.text);
    }
    out.trim_end().to_string()
}
