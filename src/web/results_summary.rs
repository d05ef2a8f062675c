//! The plan's numbers: generators, power along the chain, the tunnel, energy, utilities and cost,
//! the heat balance and where the losses go.

use crate::format::{duration, exact, length, percent, qty, sig};
use crate::markup::escape;
use crate::state::AppState;
use doubleprime::plan::Plan;
use leptos::prelude::*;
use std::fmt::Write;

/// One figure: a label, the value as shown, and the exact value for tests.
fn item(label: &str, testid: &str, value: f64, text: String) -> String {
    format!(
        r#"<div class="results-summary-item"><dt>{}</dt><dd data-testid="result-{testid}" data-value="{}">{}</dd></div>"#,
        escape(label),
        exact(value),
        escape(&text)
    )
}

fn optional_item(label: &str, testid: &str, value: Option<f64>, text: impl Fn(f64) -> String) -> String {
    value.map(|value| item(label, testid, value, text(value))).unwrap_or_default()
}

/// A group of figures under a heading.
fn group(out: &mut String, title: &str, items: &[String]) {
    let _ = write!(
        out,
        r#"<div class="results-summary-group"><h3 class="results-summary-group-title">{}</h3><dl class="results-summary-list">"#,
        escape(title)
    );
    for item in items {
        out.push_str(item);
    }
    out.push_str("</dl></div>");
}

/// A headline figure.
fn key_figure(out: &mut String, label: &str, value_html: &str, note: &str) {
    let testid = if label == "Generators" { r#" data-testid="result-generator_class""# } else { "" };
    let _ = write!(
        out,
        r#"<div class="results-summary-key-item"><span class="results-summary-key-label">{}</span><span class="results-summary-key-value">{value_html}</span><span class="results-summary-key-note"{testid}>{}</span></div>"#,
        escape(label),
        escape(note)
    );
}

/// The summary of the plan shown.
#[component]
pub fn ResultsSummary(state: AppState) -> impl IntoView {
    let summary = Memo::new(move |_| {
        state.shown.with(|shown| shown.as_ref().map(|shown| summary_html(&shown.plan)).unwrap_or_default())
    });
    view! {
        <section class="results-summary" id="results" aria-labelledby="results-summary-title">
            <h2 class="results-summary-title" id="results-summary-title">
                "Plan"
            </h2>
            <div class="results-summary-body" inner_html=move || summary.get()></div>
        </section>
    }
}

fn summary_html(plan: &Plan) -> String {
    let selection = &plan.generators;
    let utilities = &plan.utilities;
    let currency = utilities.currency.clone();
    let flow = &plan.power_flow;
    let balance = &plan.energy_balance;
    let standby = if selection.standby_count > 0 {
        format!(", {} of them standby", selection.standby_count)
    } else {
        String::new()
    };
    let how_chosen = if selection.picked_automatically { "picked automatically" } else { "as chosen" };
    let money = |value: f64| format!("{} {currency}", sig(value, 3));
    let dp = |value: Option<f64>| value.map_or_else(|| "unlimited (lossless)".to_string(), length);
    let kw = |value: f64| qty(value, 3, "kW");
    let mut out = String::with_capacity(8192);
    let _ = write!(
        out,
        r#"<p class="results-summary-name" data-testid="result-name">{}</p><div class="results-summary-key">"#,
        escape(&plan.name)
    );
    key_figure(
        &mut out,
        "Generators",
        &format!(
            r#"<span data-testid="result-generator_count" data-value="{0}">{0}</span> × <span data-testid="result-generator_rating_kw" data-value="{1}">{2}</span>"#,
            plan.generator_count,
            exact(plan.generator_rating_kw),
            escape(&kw(plan.generator_rating_kw))
        ),
        &format!("{} ({how_chosen}){standby}", selection.class.label),
    );
    key_figure(
        &mut out,
        "From the mains",
        &format!(
            r#"<span data-testid="result-mains_power_kw" data-value="{}">{}</span>"#,
            exact(plan.mains_power_kw),
            kw(plan.mains_power_kw)
        ),
        &format!(
            "{} at power factor {}",
            qty(utilities.mains_kva, 3, "kVA"),
            sig(plan.assumptions.site.power_factor, 2)
        ),
    );
    key_figure(
        &mut out,
        "Heated length",
        &format!(
            r#"<span data-testid="result-tunnel_length_m" data-value="{}">{}</span>"#,
            exact(plan.tunnel_length_m),
            qty(plan.tunnel_length_m, 3, "m")
        ),
        &format!("belt at {}", qty(plan.belt_speed_m_per_min, 3, "m/min")),
    );
    key_figure(
        &mut out,
        "Energy cost",
        &format!(
            r#"<span data-testid="result-energy_cost_per_hour" data-value="{}">{}/h</span>"#,
            exact(utilities.energy_cost_per_hour),
            escape(&money(utilities.energy_cost_per_hour))
        ),
        &format!("{} per tonne", money(utilities.energy_cost_per_tonne)),
    );
    out.push_str(r#"</div><div class="results-summary-groups">"#);
    group(
        &mut out,
        "Power",
        &[
            item("Absorbed by the product", "absorbed_power_kw", plan.absorbed_power_kw, kw(plan.absorbed_power_kw)),
            item("Forward at the applicator", "forward_power_kw", plan.forward_power_kw, kw(plan.forward_power_kw)),
            item("Generator output", "generator_output_kw", plan.generator_output_kw, kw(plan.generator_output_kw)),
            item("Mains, with auxiliaries", "mains_power_kw_detail", plan.mains_power_kw, kw(plan.mains_power_kw)),
            item("Apparent power", "mains_kva", utilities.mains_kva, qty(utilities.mains_kva, 3, "kVA")),
            item(
                "Each generator runs at",
                "operating_fraction",
                selection.operating_fraction,
                format!("{} of its rating", percent(selection.operating_fraction, 2)),
            ),
        ],
    );
    let tunnel = &plan.tunnel;
    group(
        &mut out,
        "Tunnel",
        &[
            item(
                "Belt speed",
                "belt_speed_m_per_min",
                plan.belt_speed_m_per_min,
                qty(plan.belt_speed_m_per_min, 3, "m/min"),
            ),
            item("Residence time", "residence_time_s", plan.residence_time_s, duration(plan.residence_time_s)),
            item("Heated length", "tunnel_length_m_detail", plan.tunnel_length_m, qty(plan.tunnel_length_m, 3, "m")),
            item(
                "Belt loading",
                "belt_loading",
                tunnel.belt_loading_kg_per_m2,
                qty(tunnel.belt_loading_kg_per_m2, 3, "kg/m²"),
            ),
            item(
                "Power per metre",
                "power_per_metre",
                tunnel.absorbed_power_per_metre_kw_per_m,
                qty(tunnel.absorbed_power_per_metre_kw_per_m, 3, "kW/m"),
            ),
            item(
                "Mean power density in the bed",
                "power_density",
                tunnel.mean_power_density_kw_per_m3,
                qty(tunnel.mean_power_density_kw_per_m3, 3, "kW/m³"),
            ),
        ],
    );
    group(
        &mut out,
        "Energy and utilities",
        &[
            item(
                "Mains energy per kg of product",
                "specific_energy_kwh_per_kg",
                plan.specific_energy_kwh_per_kg,
                qty(plan.specific_energy_kwh_per_kg, 3, "kWh/kg"),
            ),
            optional_item(
                "Mains energy per kg of water removed",
                "specific_energy_kwh_per_kg_water",
                plan.specific_energy_kwh_per_kg_water,
                |v| qty(v, 3, "kWh/kg"),
            ),
            item(
                "Water removed",
                "water_removed_kg_per_h",
                plan.water_removed_kg_per_h,
                qty(plan.water_removed_kg_per_h, 3, "kg/h"),
            ),
            item(
                "Cooling water",
                "cooling_water_l_per_min",
                plan.cooling_water_l_per_min,
                format!(
                    "{} for {}",
                    qty(plan.cooling_water_l_per_min, 3, "L/min"),
                    kw(utilities.cooling_water_heat_kw)
                ),
            ),
            item(
                "Energy per year",
                "annual_energy_mwh",
                utilities.annual_energy_mwh,
                qty(utilities.annual_energy_mwh, 3, "MWh"),
            ),
            item(
                "Energy cost per year",
                "annual_energy_cost",
                utilities.annual_energy_cost,
                money(utilities.annual_energy_cost),
            ),
        ],
    );
    let allowances = balance.surface_loss_kw + balance.belt_loss_kw + balance.vapour_loss_kw;
    group(
        &mut out,
        "Heat balance",
        &[
            item("Sensible heat", "sensible_kw", balance.sensible_kw, kw(balance.sensible_kw)),
            item("Melting ice", "fusion_kw", balance.fusion_kw, kw(balance.fusion_kw)),
            item("Evaporating water", "evaporation_kw", balance.evaporation_kw, kw(balance.evaporation_kw)),
            item("Loss allowances", "loss_allowances_kw", allowances, kw(allowances)),
            item("Absorbed in all", "balance_absorbed_kw", balance.absorbed_kw, kw(balance.absorbed_kw)),
        ],
    );
    let losses = &flow.losses;
    group(
        &mut out,
        "Where the losses go",
        &[
            item(
                "Supplies, to cabinet air",
                "loss_supply_kw",
                losses.power_supply_to_cabinet_air_kw,
                kw(losses.power_supply_to_cabinet_air_kw),
            ),
            item(
                "Tubes, to their cooling",
                "loss_generator_kw",
                losses.generator_to_tube_cooling_kw,
                kw(losses.generator_to_tube_cooling_kw),
            ),
            item(
                "Waveguides and feeders",
                "loss_transmission_kw",
                losses.transmission_to_waveguide_kw,
                kw(losses.transmission_to_waveguide_kw),
            ),
            item(
                "Not coupled, to water loads",
                "loss_uncoupled_kw",
                losses.uncoupled_to_water_loads_kw,
                kw(losses.uncoupled_to_water_loads_kw),
            ),
        ],
    );
    let (inlet, outlet) = (&plan.dielectric_inlet, &plan.dielectric_outlet);
    group(
        &mut out,
        "In the product",
        &[
            item(
                "ε′ − jε″ at the inlet",
                "eps_inlet",
                inlet.eps_imag,
                format!("{} − j{}", sig(inlet.eps_real, 3), sig(inlet.eps_imag, 3)),
            ),
            item(
                "ε′ − jε″ at the outlet",
                "eps_outlet",
                outlet.eps_imag,
                format!("{} − j{}", sig(outlet.eps_real, 3), sig(outlet.eps_imag, 3)),
            ),
            item(
                "Penetration depth at the inlet",
                "dp_inlet",
                inlet.penetration_depth_m.unwrap_or(f64::INFINITY),
                dp(inlet.penetration_depth_m),
            ),
            item(
                "Penetration depth at the outlet",
                "dp_outlet",
                outlet.penetration_depth_m.unwrap_or(f64::INFINITY),
                dp(outlet.penetration_depth_m),
            ),
            optional_item("Bed depth over the smallest Dp", "bed_over_dp", plan.bed_over_penetration_depth, |v| {
                sig(v, 2)
            }),
            optional_item("Mean field in the product", "mean_field", plan.mean_field_v_per_m, |v| {
                qty(v / 1000.0, 3, "kV/m")
            }),
        ],
    );
    out.push_str("</div>");
    out
}
