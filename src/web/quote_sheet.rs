//! The quote sheet: the page as it prints. Hidden on screen; `style/quote-sheet.css` shows it,
//! and only it, on paper: the project fields, the key inputs, the plan, the assumptions, the
//! warnings, the cautions, the Doubleprime version and the date, on one or two pages.

use crate::format::{percent, qty, sig};
use crate::markup::escape;
use crate::state::{AppState, Planned};
use std::fmt::Write;

use leptos::prelude::*;

/// Rows of a two-column table; every text escaped.
fn table(out: &mut String, title: &str, rows: &[(&str, String)]) {
    let _ = write!(out, r#"<section class="quote-sheet-block"><h2>{}</h2><table>"#, escape(title));
    for (label, value) in rows {
        let _ = write!(out, "<tr><th>{}</th><td>{}</td></tr>", escape(label), escape(value));
    }
    out.push_str("</table></section>");
}

fn quote_html(shown: &Planned, today: &str) -> String {
    let (scenario, plan) = (&shown.scenario, &shown.plan);
    let project = &scenario.project;
    let assumptions = &plan.assumptions;
    let utilities = &plan.utilities;
    let currency = &utilities.currency;
    let mut out = String::with_capacity(8192);
    let _ = write!(
        out,
        r#"<header class="quote-sheet-head"><h1 data-testid="quote-name">{}</h1><p>{}</p></header><div class="quote-sheet-columns">"#,
        escape(&plan.name),
        escape(&scenario.description)
    );
    table(
        &mut out,
        "Project",
        &[
            ("Customer", project.customer.clone()),
            ("Site", project.site.clone()),
            ("Prepared by", project.author.clone()),
            ("Date", project.date.clone()),
            ("Reference", project.reference.clone()),
            ("Notes", project.notes.clone()),
        ],
    );
    table(
        &mut out,
        "Inputs",
        &[
            ("Process", scenario.process.as_str().to_string()),
            ("Product", assumptions.material.clone()),
            ("Throughput", qty(scenario.throughput_kg_per_h, 4, "kg/h")),
            (
                "Temperature in \u{2192} out",
                format!("{} \u{2192} {} \u{b0}C", sig(scenario.inlet.temp_c, 4), sig(scenario.outlet.temp_c, 4)),
            ),
            (
                "Moisture in \u{2192} out (wet basis)",
                format!(
                    "{} \u{2192} {}",
                    percent(assumptions.inlet_moisture_wb, 3),
                    percent(assumptions.outlet_moisture_wb, 3)
                ),
            ),
            ("Frequency", qty(plan.frequency_mhz, 4, "MHz")),
            (
                "Belt width \u{d7} bed depth",
                format!(
                    "{} \u{d7} {}",
                    qty(scenario.tunnel.belt_width_m, 3, "m"),
                    qty(scenario.tunnel.bed_depth_m, 3, "m")
                ),
            ),
            ("Zones", scenario.tunnel.zones.to_string()),
        ],
    );
    out.push_str(r#"</div><div class="quote-sheet-columns">"#);
    table(
        &mut out,
        "Plan",
        &[
            (
                "Generators",
                format!(
                    "{} \u{d7} {} ({})",
                    plan.generator_count,
                    qty(plan.generator_rating_kw, 3, "kW"),
                    plan.generators.class.label
                ),
            ),
            (
                "From the mains",
                format!("{} ({})", qty(plan.mains_power_kw, 3, "kW"), qty(utilities.mains_kva, 3, "kVA")),
            ),
            ("Absorbed by the product", qty(plan.absorbed_power_kw, 3, "kW")),
            ("Forward at the applicator", qty(plan.forward_power_kw, 3, "kW")),
            ("Heated length", qty(plan.tunnel_length_m, 3, "m")),
            ("Belt speed", qty(plan.belt_speed_m_per_min, 3, "m/min")),
            ("Time under power", qty(plan.residence_time_s, 3, "s")),
            ("Specific energy", qty(plan.specific_energy_kwh_per_kg, 3, "kWh/kg")),
            ("Cooling water", qty(plan.cooling_water_l_per_min, 3, "L/min")),
            (
                "Energy cost",
                format!(
                    "{} {currency}/h, {} {currency}/t",
                    sig(utilities.energy_cost_per_hour, 3),
                    sig(utilities.energy_cost_per_tonne, 3)
                ),
            ),
        ],
    );
    let efficiency = &assumptions.efficiency;
    let losses = &assumptions.losses;
    let site = &assumptions.site;
    table(
        &mut out,
        "Assumptions",
        &[
            (
                "Efficiency chain",
                format!(
                    "supply {} \u{b7} generator {} \u{b7} transmission {} \u{b7} applicator {}",
                    percent(efficiency.power_supply, 3),
                    percent(efficiency.generator, 3),
                    percent(efficiency.transmission, 3),
                    percent(efficiency.applicator, 3)
                ),
            ),
            (
                "Loss allowances",
                format!(
                    "surface {} % \u{b7} belt {} % \u{b7} vapour {} %",
                    sig(losses.surface_pct, 3),
                    sig(losses.belt_pct, 3),
                    sig(losses.vapour_pct, 3)
                ),
            ),
            (
                "Site",
                format!(
                    "power factor {} \u{b7} {} h/year \u{b7} tariff {} {currency}/kWh",
                    sig(site.power_factor, 2),
                    sig(site.operating_hours_per_year, 4),
                    sig(site.tariff_per_kwh, 3)
                ),
            ),
        ],
    );
    out.push_str("</div>");
    let _ = write!(
        out,
        r#"<section class="quote-sheet-block quote-sheet-small"><h2>Sources and models</h2><p>Material data: {}</p><p>Models: {}</p></section>"#,
        escape(&assumptions.material_source),
        escape(&assumptions.models.join("; "))
    );
    out.push_str(r#"<section class="quote-sheet-block"><h2>Warnings</h2>"#);
    if plan.warnings.is_empty() {
        out.push_str("<p>None: nothing in this plan looks weak.</p>");
    } else {
        out.push_str("<ul>");
        for warning in &plan.warnings {
            let _ = write!(out, r#"<li data-testid="quote-warning">{}</li>"#, escape(&warning.message));
        }
        out.push_str("</ul>");
    }
    out.push_str(r#"</section><section class="quote-sheet-block quote-sheet-small"><h2>Safety cautions</h2><ul>"#);
    for caution in &plan.cautions {
        let _ = write!(out, "<li><strong>{}.</strong> {}</li>", escape(caution.title), escape(&caution.text));
    }
    let _ = write!(
        out,
        r#"</ul></section><footer class="quote-sheet-foot" data-testid="quote-foot">Doubleprime {} &middot; printed {} &middot; An engineering estimate; design, installation and commissioning follow local codes and are signed off by licensed professionals.</footer>"#,
        escape(env!("CARGO_PKG_VERSION")),
        escape(today)
    );
    out
}

/// The quote sheet of the plan shown.
#[component]
pub fn QuoteSheet(state: AppState) -> impl IntoView {
    let markup = Memo::new(move |_| {
        let today = crate::storage::now_iso().get(..10).unwrap_or_default().to_string();
        state.shown.with(|shown| shown.as_ref().map(|shown| quote_html(shown, &today))).unwrap_or_default()
    });
    view! { <article class="quote-sheet" data-testid="quote-sheet" inner_html=move || markup.get()></article> }
}
