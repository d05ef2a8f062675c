//! Temperature, moisture and absorbed power along the tunnel, zone by zone, with the zone table.

use crate::format::{qty, sig};
use crate::markup::escape;
use crate::state::AppState;
use crate::svg_chart::{
    chart_svg, plot_section, table_html, Axis, Bars, Cell, Chart, DataTable, PlotMarkup, Series, Stroke,
};
use doubleprime::plan::Plan;
use doubleprime::scenario::Scenario;
use leptos::prelude::*;

/// The three profiles along the heated length and the table of zones.
#[component]
pub fn ZonePlot(state: AppState) -> impl IntoView {
    let markup = Memo::new(move |_| {
        state
            .shown
            .with(|shown| shown.as_ref().map(|shown| zone_markup(&shown.scenario, &shown.plan)).unwrap_or_default())
    });
    plot_section("zone-plot", "zone-plot", "Along the tunnel", "zones", markup)
}

fn zone_markup(scenario: &Scenario, plan: &Plan) -> PlotMarkup {
    let zones = &plan.zones;
    let length = plan.tunnel_length_m;
    let inlet_temp = scenario.inlet.temp_c;
    let inlet_moisture = plan.assumptions.inlet_moisture_wb;
    let position = || Axis::fit("Position along the heated length, m", [0.0, length], true);

    let temperatures: Vec<(f64, f64)> =
        std::iter::once((0.0, inlet_temp)).chain(zones.iter().map(|z| (z.end_m, z.temp_c))).collect();
    let outlet_temp = zones.last().map_or(scenario.outlet.temp_c, |z| z.temp_c);
    let mut temperature = Chart::new(
        "zone-temperature",
        "Product temperature along the tunnel".into(),
        format!(
            "The product enters at {} and leaves at {} after {} of heated length, in {} zones.",
            qty(inlet_temp, 3, "\u{b0}C"),
            qty(outlet_temp, 3, "\u{b0}C"),
            qty(length, 3, "m"),
            zones.len()
        ),
        position(),
        Axis::fit("Temperature, \u{b0}C", temperatures.iter().map(|p| p.1), false),
    );
    temperature.series.push(Series {
        label: "temperature leaving each zone".into(),
        class: "svg-chart-series-1",
        stroke: Stroke::Solid,
        points: temperatures,
        dots: true,
    });
    temperature.height = 200.0;

    let moistures: Vec<(f64, f64)> =
        std::iter::once((0.0, inlet_moisture)).chain(zones.iter().map(|z| (z.end_m, z.moisture_wb))).collect();
    let outlet_moisture = zones.last().map_or(inlet_moisture, |z| z.moisture_wb);
    let moisture_words = if (outlet_moisture - inlet_moisture).abs() < 1e-9 {
        format!("Moisture stays at {} (wet basis) along the tunnel.", qty(inlet_moisture, 3, "kg/kg"))
    } else {
        format!(
            "Moisture falls from {} at the inlet to {} at the outlet (wet basis).",
            qty(inlet_moisture, 3, "kg/kg"),
            qty(outlet_moisture, 3, "kg/kg")
        )
    };
    let mut moisture = Chart::new(
        "zone-moisture",
        "Product moisture along the tunnel".into(),
        moisture_words,
        position(),
        Axis::fit("Moisture, kg/kg", moistures.iter().map(|p| p.1), false),
    );
    moisture.series.push(Series {
        label: "moisture leaving each zone".into(),
        class: "svg-chart-series-2",
        stroke: Stroke::Solid,
        points: moistures,
        dots: true,
    });
    moisture.height = 180.0;

    let absorbed_sum = plan
        .zone_model
        .as_ref()
        .map_or_else(|| zones.iter().map(|z| z.absorbed_kw).sum(), |model| model.zones_absorbed_sum_kw);
    let (low, high) = zones
        .iter()
        .fold((f64::INFINITY, f64::NEG_INFINITY), |(low, high), z| (low.min(z.absorbed_kw), high.max(z.absorbed_kw)));
    let mut power = Chart::new(
        "zone-power",
        "Absorbed power per zone".into(),
        format!(
            "Each zone absorbs between {} and {}; {} in all.",
            qty(low, 3, "kW"),
            qty(high, 3, "kW"),
            qty(absorbed_sum, 4, "kW")
        ),
        position(),
        Axis::fit("Absorbed, kW", zones.iter().map(|z| z.absorbed_kw), true),
    );
    power.bars.push(Bars {
        label: "power absorbed in the zone".into(),
        class: "svg-chart-series-3",
        bars: zones.iter().map(|z| (z.start_m, z.end_m, z.absorbed_kw)).collect(),
    });
    power.height = 200.0;

    let rows = zones
        .iter()
        .map(|z| {
            vec![
                Cell::number(f64::from(z.index), z.index.to_string()),
                Cell::number(z.start_m, sig(z.start_m, 3)),
                Cell::number(z.end_m, sig(z.end_m, 3)),
                Cell::number(z.temp_c, sig(z.temp_c, 3)),
                Cell::number(z.moisture_wb, sig(z.moisture_wb, 3)),
                Cell::number(z.frozen_fraction, sig(z.frozen_fraction * 100.0, 3)),
                Cell::number(z.eps_real, sig(z.eps_real, 3)),
                Cell::number(z.eps_imag, sig(z.eps_imag, 3)),
                Cell::number(z.absorbed_kw, sig(z.absorbed_kw, 4)),
                Cell::number(z.mean_power_density_kw_per_m3, sig(z.mean_power_density_kw_per_m3, 3)),
                Cell::text(z.stage.replace('_', " ")),
            ]
        })
        .collect();
    let footer = vec![
        Cell::text("all"),
        Cell::number(0.0, "0".into()),
        Cell::number(length, sig(length, 3)),
        Cell::number(outlet_temp, sig(outlet_temp, 3)),
        Cell::number(outlet_moisture, sig(outlet_moisture, 3)),
        Cell::text(""),
        Cell::text(""),
        Cell::text(""),
        Cell::number(absorbed_sum, sig(absorbed_sum, 4)),
        Cell::number(plan.tunnel.mean_power_density_kw_per_m3, sig(plan.tunnel.mean_power_density_kw_per_m3, 3)),
        Cell::text(""),
    ];
    let table = DataTable {
        testid: "zones",
        caption: "zones along the tunnel".into(),
        columns: vec![
            ("index", "Zone".into()),
            ("start_m", "From, m".into()),
            ("end_m", "To, m".into()),
            ("temp_c", "Temperature out, \u{b0}C".into()),
            ("moisture_wb", "Moisture out, kg/kg".into()),
            ("frozen_pct", "Water frozen, %".into()),
            ("eps_real", "\u{3b5}\u{2032}".into()),
            ("eps_imag", "\u{3b5}\u{2033}".into()),
            ("absorbed_kw", "Absorbed, kW".into()),
            ("power_density", "Power density, kW/m\u{b3}".into()),
            ("stage", "Stage".into()),
        ],
        rows,
        footer: Some(footer),
    };
    let model = plan
        .zone_model
        .as_ref()
        .map_or_else(String::new, |model| format!(" Zone model: {}.", escape(model.description)));
    PlotMarkup {
        figure: format!(
            r#"{}{}{}<figcaption class="plot-section-caption">Each point is the state leaving a zone; the first point is the inlet.{}</figcaption>"#,
            chart_svg(&temperature),
            chart_svg(&moisture),
            chart_svg(&power),
            model
        ),
        caption: table.caption.clone(),
        table: table_html(&table),
    }
}
