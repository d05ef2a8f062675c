//! Penetration depth of the product against frequency at the inlet and outlet states, with the
//! heating bands marked and the bed depth drawn across.

use crate::format::{length, sig};
use crate::state::AppState;
use crate::svg_chart::{
    chart_svg, plot_section, table_html, Axis, Cell, Chart, DataTable, Level, Marker, PlotMarkup, Series, Stroke,
};
use doubleprime::physics::waves::penetration_depth_m;
use doubleprime::plan::band_comparison::COMPARED_BANDS_MHZ;
use doubleprime::plan::product::Product;
use doubleprime::plan::Plan;
use doubleprime::scenario::Scenario;
use leptos::prelude::*;

/// Lowest and highest frequency drawn, MHz.
const FREQ_MIN_MHZ: f64 = 5.0;
const FREQ_MAX_MHZ: f64 = 5000.0;
/// Log-spaced samples between them (the band centres are added).
const SAMPLES: usize = 46;

/// Dp against frequency.
#[component]
pub fn PenetrationPlot(state: AppState) -> impl IntoView {
    let markup = Memo::new(move |_| {
        state.shown.with(|shown| {
            shown.as_ref().map(|shown| penetration_markup(&shown.scenario, &shown.plan)).unwrap_or_default()
        })
    });
    plot_section("penetration-plot", "penetration-plot", "Penetration depth against frequency", "penetration", markup)
}

/// The frequencies sampled: log-spaced, plus each band centre, sorted.
fn frequencies() -> Vec<f64> {
    let span = (FREQ_MAX_MHZ / FREQ_MIN_MHZ).log10();
    let mut list: Vec<f64> = (0..SAMPLES)
        .map(|i| FREQ_MIN_MHZ * 10f64.powf(span * i as f64 / (SAMPLES - 1) as f64))
        .chain(COMPARED_BANDS_MHZ)
        .collect();
    list.sort_by(f64::total_cmp);
    list
}

fn penetration_markup(scenario: &Scenario, plan: &Plan) -> PlotMarkup {
    let Ok(product) = Product::from_scenario(scenario) else {
        return PlotMarkup { figure: "<p>The product could not be read.</p>".into(), ..PlotMarkup::default() };
    };
    let states = [
        ("inlet", scenario.inlet.temp_c, plan.assumptions.inlet_moisture_wb, "svg-chart-series-1"),
        ("outlet", scenario.outlet.temp_c, plan.assumptions.outlet_moisture_wb, "svg-chart-series-2"),
    ];
    let freqs = frequencies();
    // (Dp in m, in the data) per state per frequency.
    let depths: Vec<Vec<Option<(f64, bool)>>> = states
        .iter()
        .map(|(_, temp, moisture, _)| {
            freqs
                .iter()
                .map(|&f| {
                    let lookup = product.permittivity(f * 1e6, *temp, *moisture).ok()?;
                    penetration_depth_m(f * 1e6, lookup.eps).map(|dp| (dp, lookup.in_range))
                })
                .collect()
        })
        .collect();
    let mut series = Vec::new();
    let mut all_mm = Vec::new();
    for ((name, temp, moisture, class), values) in states.iter().zip(&depths) {
        let label = format!("{name}: {} \u{b0}C, moisture {}", sig(*temp, 3), sig(*moisture, 3));
        let inside = freqs.iter().zip(values).map(|(f, v)| (*f, v.filter(|v| v.1).map_or(f64::NAN, |v| v.0 * 1000.0)));
        let outside = freqs.iter().zip(values).enumerate().map(|(index, (f, v))| {
            let out_here = v.is_some_and(|v| !v.1);
            let out_near = [index.checked_sub(1), Some(index + 1)]
                .into_iter()
                .flatten()
                .any(|i| values.get(i).copied().flatten().is_some_and(|v| !v.1));
            (*f, v.filter(|_| out_here || out_near).map_or(f64::NAN, |v| v.0 * 1000.0))
        });
        all_mm.extend(values.iter().flatten().map(|v| v.0 * 1000.0));
        series.push(Series {
            label: label.clone(),
            class,
            stroke: Stroke::Solid,
            points: inside.collect(),
            dots: false,
        });
        let any_out = values.iter().flatten().any(|v| !v.1);
        series.push(Series {
            label: if any_out { format!("{name}, outside the data") } else { String::new() },
            class,
            stroke: Stroke::Dashed,
            points: outside.collect(),
            dots: false,
        });
    }
    let bed_mm = scenario.tunnel.bed_depth_m * 1000.0;
    all_mm.push(bed_mm);
    let markers = COMPARED_BANDS_MHZ
        .iter()
        .map(|&band| Marker {
            at: band,
            // 896 and 915 MHz sit 2 % apart: one label for the pair.
            label: match band {
                b if (b - 896.0).abs() < 0.5 => String::new(),
                b if (b - 915.0).abs() < 0.5 => "896/915".to_string(),
                b => sig(b, 4),
            },
            strong: (band - plan.frequency_mhz).abs() < 1e-6,
        })
        .collect();
    let at_plan = |index: usize| {
        freqs
            .iter()
            .position(|f| (f - plan.frequency_mhz).abs() < 1e-9)
            .and_then(|i| depths[index].get(i).copied().flatten())
            .map(|v| length(v.0))
    };
    let description = format!(
        "Power penetration depth of {} from {} to {} MHz on logarithmic scales, at the inlet and outlet states. At the plan's {} MHz: {} at the inlet and {} at the outlet; the bed is {} deep. Vertical lines mark the heating bands 13.56, 27.12, 40.68, 896, 915 and 2450 MHz.",
        product.material.label,
        sig(FREQ_MIN_MHZ, 3),
        sig(FREQ_MAX_MHZ, 4),
        sig(plan.frequency_mhz, 4),
        at_plan(0).unwrap_or_else(|| "not computed".into()),
        at_plan(1).unwrap_or_else(|| "not computed".into()),
        length(scenario.tunnel.bed_depth_m),
    );
    let x = Axis { label: "Frequency, MHz (logarithmic scale)".into(), min: 1.0, max: 10_000.0, log: true };
    let mut chart = Chart::new(
        "penetration-depth",
        format!("Penetration depth of {} against frequency", product.material.label),
        description,
        x,
        Axis::fit_log("Dp, mm (log scale)", all_mm),
    );
    chart.series = series;
    chart.markers = markers;
    chart.levels = vec![Level { at: bed_mm, label: format!("bed depth {}", length(scenario.tunnel.bed_depth_m)) }];
    chart.height = 280.0;

    let rows = freqs
        .iter()
        .enumerate()
        .map(|(index, f)| {
            let mut row = vec![Cell::number(*f, sig(*f, 4))];
            for values in &depths {
                match values.get(index).copied().flatten() {
                    Some((dp, in_range)) => {
                        row.push(Cell::number(dp, sig(dp * 1000.0, 3)));
                        row.push(Cell::text(if in_range { "yes" } else { "no" }));
                    }
                    None => row.extend([Cell::text("\u{2014}"), Cell::text("\u{2014}")]),
                }
            }
            row
        })
        .collect();
    let table = DataTable {
        testid: "penetration",
        caption: format!("penetration depth of {}", product.material.label),
        columns: vec![
            ("freq_mhz", "Frequency, MHz".into()),
            ("dp_inlet", "Dp at the inlet, mm".into()),
            ("in_range_inlet", "In the data".into()),
            ("dp_outlet", "Dp at the outlet, mm".into()),
            ("in_range_outlet", "In the data".into()),
        ],
        rows,
        footer: None,
    };
    PlotMarkup {
        figure: format!(
            r#"{}<figcaption class="plot-section-caption">A bed deeper than the penetration depth per fed face heats unevenly. Dashed: outside the material's data (extrapolated).</figcaption>"#,
            chart_svg(&chart)
        ),
        caption: table.caption.clone(),
        table: table_html(&table),
    }
}
