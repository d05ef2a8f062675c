//! Plain-text exports of a plan: the zone profiles as CSV with units in the headers.
//!
//! The CSV uses a comma separator, a point as decimal mark, one header row, and leaves a cell
//! empty where a value does not exist (a lossless zone has no penetration depth). RFC 4180
//! quoting is applied to text cells.

use crate::plan::Plan;
use std::fmt::Write;

/// Column headers of [`zones_csv`], units in brackets.
pub const ZONE_CSV_HEADERS: [&str; 17] = [
    "zone",
    "start [m]",
    "end [m]",
    "stage",
    "temperature out [degC]",
    "moisture out [kg/kg wet basis]",
    "frozen fraction of water [-]",
    "eps' [-]",
    "eps'' [-]",
    "absorbed power [kW]",
    "coupling [-]",
    "single-pass absorptance [-]",
    "penetration depth [m]",
    "mean power density [kW/m3]",
    "peak field [V/m]",
    "runaway risk [yes/no]",
    "water removed [kg/h]",
];

fn optional(value: Option<f64>) -> String {
    value.map(|v| v.to_string()).unwrap_or_default()
}

/// Quote a text cell if it holds a separator, a quote or a line break (RFC 4180).
fn text_cell(text: &str) -> String {
    if text.contains([',', '"', '\n', '\r']) {
        format!("\"{}\"", text.replace('"', "\"\""))
    } else {
        text.to_string()
    }
}

/// The plan's zones as CSV: one header row, one row per zone.
pub fn zones_csv(plan: &Plan) -> String {
    let mut out = ZONE_CSV_HEADERS.join(",");
    out.push_str("\r\n");
    for zone in &plan.zones {
        let cells = [
            zone.index.to_string(),
            zone.start_m.to_string(),
            zone.end_m.to_string(),
            text_cell(zone.stage),
            zone.temp_c.to_string(),
            zone.moisture_wb.to_string(),
            zone.frozen_fraction.to_string(),
            zone.eps_real.to_string(),
            zone.eps_imag.to_string(),
            zone.absorbed_kw.to_string(),
            zone.coupling.to_string(),
            optional(zone.single_pass_absorptance),
            optional(zone.penetration_depth_m),
            zone.mean_power_density_kw_per_m3.to_string(),
            optional(zone.peak_field_v_per_m),
            if zone.runaway { "yes" } else { "no" }.to_string(),
            zone.water_removed_kg_per_h.to_string(),
        ];
        let _ = write!(out, "{}\r\n", cells.join(","));
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn text_cells_are_quoted_per_rfc_4180() {
        assert_eq!(text_cell("heating"), "heating");
        assert_eq!(text_cell("a,b"), "\"a,b\"");
        assert_eq!(text_cell("say \"hi\""), "\"say \"\"hi\"\"\"");
    }
}
