//! The chosen product's eps' and eps'' against temperature at the plan's frequency.

use crate::format::{qty, sig};
use crate::markup::escape;
use crate::state::AppState;
use crate::svg_chart::{
    chart_svg, plot_section, table_html, Axis, Cell, Chart, DataTable, Marker, PlotMarkup, Series, Stroke,
};
use doubleprime::materials::PermittivityLookup;
use doubleprime::plan::product::Product;
use doubleprime::plan::Plan;
use doubleprime::scenario::Scenario;
use leptos::prelude::*;

/// Temperatures sampled across the chart.
const SAMPLES: usize = 49;
/// How far beyond the inlet and outlet temperatures the chart reaches, K.
const MARGIN_K: f64 = 20.0;

/// eps' and eps'' against temperature, with the inlet and outlet marked.
#[component]
pub fn PermittivityPlot(state: AppState) -> impl IntoView {
    let markup = Memo::new(move |_| {
        state.shown.with(|shown| {
            shown.as_ref().map(|shown| permittivity_markup(&shown.scenario, &shown.plan)).unwrap_or_default()
        })
    });
    plot_section("permittivity-plot", "permittivity-plot", "Permittivity against temperature", "permittivity", markup)
}

/// One moisture's curve: (temperature, lookup) per sample.
struct Curve {
    moisture_wb: f64,
    samples: Vec<(f64, Option<PermittivityLookup>)>,
}

/// Chart points, (x, y).
type Points = Vec<(f64, f64)>;

/// Points inside the data (solid) and outside it (dashed), each joined to the other at the seams.
fn split_by_range(curve: &Curve, value: impl Fn(&PermittivityLookup) -> f64) -> (Points, Points) {
    let flags: Vec<Option<bool>> = curve.samples.iter().map(|(_, l)| l.as_ref().map(|l| l.in_range)).collect();
    let mut inside = Vec::new();
    let mut outside = Vec::new();
    for (index, (temp, lookup)) in curve.samples.iter().enumerate() {
        let y = lookup.as_ref().map_or(f64::NAN, &value);
        let here = flags[index];
        let neighbour_out = [index.checked_sub(1), Some(index + 1)]
            .into_iter()
            .flatten()
            .any(|i| flags.get(i).copied().flatten() == Some(false));
        inside.push((*temp, if here == Some(true) { y } else { f64::NAN }));
        outside.push((*temp, if here == Some(false) || (here == Some(true) && neighbour_out) { y } else { f64::NAN }));
    }
    (inside, outside)
}

fn permittivity_markup(scenario: &Scenario, plan: &Plan) -> PlotMarkup {
    let Ok(product) = Product::from_scenario(scenario) else {
        return PlotMarkup { figure: "<p>The product could not be read.</p>".into(), ..PlotMarkup::default() };
    };
    let frequency_hz = plan.frequency_mhz * 1e6;
    let (t_in, t_out) = (scenario.inlet.temp_c, scenario.outlet.temp_c);
    let low = (t_in.min(t_out) - MARGIN_K).max(doubleprime::materials::TEMP_MIN_C);
    let high = (t_in.max(t_out) + MARGIN_K).min(doubleprime::materials::TEMP_MAX_C);
    let temps: Vec<f64> = (0..SAMPLES).map(|i| low + (high - low) * i as f64 / (SAMPLES - 1) as f64).collect();
    let (w_in, w_out) = (plan.assumptions.inlet_moisture_wb, plan.assumptions.outlet_moisture_wb);
    let mut moistures = vec![w_in];
    if (w_out - w_in).abs() > 1e-9 {
        moistures.push(w_out);
    }
    let curves: Vec<Curve> = moistures
        .iter()
        .map(|&moisture_wb| Curve {
            moisture_wb,
            samples: temps.iter().map(|&t| (t, product.permittivity(frequency_hz, t, moisture_wb).ok())).collect(),
        })
        .collect();
    let any_outside = curves.iter().any(|c| c.samples.iter().any(|(_, l)| l.as_ref().is_some_and(|l| !l.in_range)));
    let classes = ["svg-chart-series-1", "svg-chart-series-2"];
    let mut markers = vec![
        Marker { at: t_in, label: "inlet".into(), strong: true },
        Marker { at: t_out, label: "outlet".into(), strong: true },
    ];
    if let Some(freezing) = product.material.initial_freezing_point_c() {
        markers.push(Marker { at: freezing, label: "freezing point".into(), strong: false });
    }
    let chart_for = |id: &'static str, symbol: &str, name: &str, value: fn(&PermittivityLookup) -> f64| {
        let mut all = Vec::new();
        let mut series = Vec::new();
        for (index, curve) in curves.iter().enumerate() {
            let (inside, outside) = split_by_range(curve, value);
            all.extend(curve.samples.iter().filter_map(|(_, l)| l.as_ref().map(value)));
            let moisture = format!("at moisture {}", sig(curve.moisture_wb, 3));
            series.push(Series {
                label: format!("{symbol} {moisture}"),
                class: classes[index % 2],
                stroke: Stroke::Solid,
                points: inside,
                dots: false,
            });
            series.push(Series {
                label: if any_outside { format!("outside the data, {moisture}") } else { String::new() },
                class: classes[index % 2],
                stroke: Stroke::Dashed,
                points: outside,
                dots: false,
            });
        }
        let at = |t: f64| {
            curves[0]
                .samples
                .iter()
                .min_by(|a, b| (a.0 - t).abs().total_cmp(&(b.0 - t).abs()))
                .and_then(|(_, l)| l.as_ref().map(value))
        };
        let words = match (at(t_in), at(t_out)) {
            (Some(a), Some(b)) => format!(
                "{name} of {} at {} MHz from {} to {}: about {} at the inlet and {} at the outlet.",
                product.material.label,
                sig(plan.frequency_mhz, 4),
                qty(low, 3, "\u{b0}C"),
                qty(high, 3, "\u{b0}C"),
                sig(a, 3),
                sig(b, 3)
            ),
            _ => format!("{name} of {} at {} MHz.", product.material.label, sig(plan.frequency_mhz, 4)),
        };
        let mut chart = Chart::new(
            id,
            format!("{name} against temperature at {} MHz", sig(plan.frequency_mhz, 4)),
            words,
            Axis::fit("Temperature, \u{b0}C", [low, high], false),
            Axis::fit(symbol.to_string(), all, true),
        );
        chart.series = series;
        chart.markers = markers.clone();
        chart.height = 210.0;
        chart
    };
    let eps_real = chart_for("permittivity-real", "\u{3b5}\u{2032}", "Dielectric constant", |l| l.eps.eps_real);
    let eps_imag = chart_for("permittivity-imag", "\u{3b5}\u{2033}", "Loss factor", |l| l.eps.eps_imag);

    let mut columns = vec![("temp_c", "Temperature, \u{b0}C".to_string())];
    let ids = [("eps_real_1", "eps_imag_1", "in_range_1"), ("eps_real_2", "eps_imag_2", "in_range_2")];
    for (curve, (real_id, imag_id, range_id)) in curves.iter().zip(ids) {
        let at = format!(" at {}", sig(curve.moisture_wb, 3));
        columns.push((real_id, format!("\u{3b5}\u{2032}{at}")));
        columns.push((imag_id, format!("\u{3b5}\u{2033}{at}")));
        columns.push((range_id, "In the data".to_string()));
    }
    let rows = temps
        .iter()
        .enumerate()
        .map(|(index, &t)| {
            let mut row = vec![Cell::number(t, sig(t, 3))];
            for curve in &curves {
                match curve.samples.get(index).and_then(|(_, l)| l.as_ref()) {
                    Some(l) => {
                        row.push(Cell::number(l.eps.eps_real, sig(l.eps.eps_real, 4)));
                        row.push(Cell::number(l.eps.eps_imag, sig(l.eps.eps_imag, 4)));
                        row.push(Cell::text(if l.in_range { "yes" } else { "no: extrapolated" }));
                    }
                    None => row.extend([Cell::text("\u{2014}"), Cell::text("\u{2014}"), Cell::text("not computed")]),
                }
            }
            row
        })
        .collect();
    let source = product.material.source_summary();
    let table = DataTable {
        testid: "permittivity",
        caption: format!("permittivity of {} at {} MHz", product.material.label, sig(plan.frequency_mhz, 4)),
        columns,
        rows,
        footer: None,
    };
    PlotMarkup {
        figure: format!(
            r#"{}{}<figcaption class="plot-section-caption">Source: {}. Dashed: outside the data or model range (extrapolated).</figcaption>"#,
            chart_svg(&eps_real),
            chart_svg(&eps_imag),
            escape(&source)
        ),
        caption: table.caption.clone(),
        table: table_html(&table),
    }
}
