//! The scenario planned in every heating band, side by side, with the plan's own band marked and
//! a button on every other row to plan in that band instead.

use crate::fields::Key;
use crate::format::{exact, length, sig};
use crate::markup::{escape, event_data, focus_container};
use crate::state::AppState;
use crate::warnings_list::warning_heading;
use doubleprime::plan::band_comparison::{BandComparison, BandOutcome};
use doubleprime::sizing::generators::builtin_catalogue;
use leptos::prelude::*;
use std::fmt::Write;

const HEADERS: [&str; 10] = [
    "Band",
    "Generators",
    "Absorbed, kW",
    "Forward, kW",
    "Mains, kW",
    "Smallest Dp",
    "Bed / Dp",
    "Mains energy, kWh/kg",
    "Energy cost per tonne",
    "Warnings",
];

fn comparison_html(comparison: &BandComparison, currency: &str) -> String {
    let mut out = format!(
        r#"<table class="band-table-table" data-testid="band-table"><caption>The same line in each band. {}</caption><thead><tr>"#,
        escape(comparison.note)
    );
    for header in HEADERS {
        let currency_note =
            if header.starts_with("Energy cost") { format!(", {}", escape(currency)) } else { String::new() };
        let _ = write!(out, r#"<th scope="col">{header}{currency_note}</th>"#);
    }
    out.push_str(r#"<th scope="col"><span class="visually-hidden">Action</span></th></tr></thead><tbody>"#);
    for row in &comparison.bands {
        let freq = exact(row.frequency_mhz);
        let band = format!("{} MHz", row.frequency_mhz);
        let current = row.is_scenario_band;
        let (class, aria) = if current {
            ("band-table-row band-table-row-current", r#" aria-current="true""#)
        } else {
            ("band-table-row", "")
        };
        let tag = if current { r#"<span class="band-table-current-tag">this plan</span>"# } else { "" };
        let action = if current {
            String::new()
        } else {
            format!(
                r#"<button type="button" class="band-table-use" data-band="{freq}" data-testid="band-use-{freq}" aria-label="Plan in the {band} band">Use</button>"#
            )
        };
        let _ =
            write!(out, r#"<tr class="{class}" data-testid="band-row-{freq}"{aria}><th scope="row">{band}{tag}</th>"#);
        match &row.outcome {
            BandOutcome::Planned {
                generator_class,
                generator_count,
                generator_rating_kw,
                absorbed_power_kw,
                forward_power_kw,
                mains_power_kw,
                penetration_depth_min_m,
                bed_over_penetration_depth,
                specific_energy_kwh_per_kg,
                energy_cost_per_tonne,
                warning_codes,
            } => {
                let class_label = builtin_catalogue()
                    .iter()
                    .find(|class| &class.id == generator_class)
                    .map_or_else(|| generator_class.clone(), |class| class.label.clone());
                let warnings = if warning_codes.is_empty() {
                    "none".to_string()
                } else {
                    warning_codes.iter().map(|code| warning_heading(code)).collect::<Vec<_>>().join("; ")
                };
                let dash = || "\u{2014}".to_string();
                let _ = write!(
                    out,
                    r#"<td data-testid="band-generators" data-value="{generator_count}">{generator_count} × {} kW<span class="band-table-class">{}</span></td><td data-value="{}">{}</td><td data-value="{}">{}</td><td data-testid="band-mains" data-value="{}">{}</td><td>{}</td><td>{}</td><td>{}</td><td>{}</td><td class="band-table-warnings">{}</td>"#,
                    sig(*generator_rating_kw, 3),
                    escape(&class_label),
                    exact(*absorbed_power_kw),
                    sig(*absorbed_power_kw, 3),
                    exact(*forward_power_kw),
                    sig(*forward_power_kw, 3),
                    exact(*mains_power_kw),
                    sig(*mains_power_kw, 3),
                    penetration_depth_min_m.map_or_else(dash, length),
                    bed_over_penetration_depth.map_or_else(dash, |r| sig(r, 2)),
                    sig(*specific_energy_kwh_per_kg, 3),
                    sig(*energy_cost_per_tonne, 3),
                    escape(&warnings)
                );
            }
            BandOutcome::NotPlanned { reason } => {
                let _ = write!(out, r#"<td colspan="9" class="band-table-none">Not planned: {}</td>"#, escape(reason));
            }
        }
        let _ = write!(out, "<td>{action}</td></tr>");
    }
    out.push_str("</tbody></table>");
    out
}

/// The band comparison table.
#[component]
pub fn BandTable(state: AppState) -> impl IntoView {
    let markup = Memo::new(move |_| {
        let currency = state.shown.with(|s| s.as_ref().map(|s| s.plan.utilities.currency.clone())).unwrap_or_default();
        state.comparison.with(|comparison| match comparison {
            Some(comparison) => comparison_html(comparison, &currency),
            None if !state.first_plan_shown.get() => "<p>Comparing the bands\u{2026}</p>".to_string(),
            None => "<p>No comparison: the scenario has not been planned yet.</p>".to_string(),
        })
    });
    let on_click = move |event: leptos::ev::MouseEvent| {
        if let Some(freq) = event_data(&event, "data-band") {
            state.form.choose(Key::Frequency, freq);
            focus_container(&event);
        }
    };
    view! {
        <section class="band-table" id="bands" aria-labelledby="band-table-title">
            <h2 class="band-table-title" id="band-table-title">
                "Bands compared"
            </h2>
            <div
                class="band-table-scroll"
                tabindex="0"
                role="region"
                aria-label="Bands compared"
                on:click=on_click
                inner_html=move || markup.get()
            ></div>
        </section>
    }
}
