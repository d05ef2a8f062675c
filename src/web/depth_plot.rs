//! Power density through the bed's depth (product, tray, belt, air gap) where it is least even.

use crate::format::{length, percent, sig};
use crate::state::AppState;
use crate::svg_chart::{
    chart_svg, plot_section, table_html, Axis, Cell, Chart, DataTable, PlotMarkup, Series, Span, Stroke,
};
use doubleprime::plan::Plan;
use doubleprime::scenario::Scenario;
use leptos::prelude::*;

/// The depth profile chart and its samples.
#[component]
pub fn DepthPlot(state: AppState) -> impl IntoView {
    let markup = Memo::new(move |_| {
        state
            .shown
            .with(|shown| shown.as_ref().map(|shown| depth_markup(&shown.scenario, &shown.plan)).unwrap_or_default())
    });
    plot_section("depth-plot", "depth-plot", "Through the bed", "depth", markup)
}

fn depth_markup(_scenario: &Scenario, plan: &Plan) -> PlotMarkup {
    let Some(profile) = &plan.depth_profile else {
        return PlotMarkup { figure: "<p>This plan has no depth profile.</p>".into(), ..PlotMarkup::default() };
    };
    let solution = &profile.solution;
    // Shown relative to the highest value in the product, so the shape reads at any power.
    let product_peak = solution
        .depth_profile
        .iter()
        .filter(|s| solution.layers.get(s.layer).is_some_and(|layer| layer.is_product))
        .map(|s| s.power_density_per_incident_flux_per_m)
        .fold(0.0, f64::max);
    let relative = |value: f64| if product_peak > 0.0 { value / product_peak * 100.0 } else { 0.0 };
    let points: Vec<(f64, f64)> = solution
        .depth_profile
        .iter()
        .map(|s| (s.depth_m * 1000.0, relative(s.power_density_per_incident_flux_per_m)))
        .collect();
    let total_mm = solution.layers.iter().map(|l| (l.top_depth_m + l.thickness_m) * 1000.0).fold(0.0, f64::max);
    let uniformity_words = solution.uniformity.as_ref().map_or_else(String::new, |u| {
        let core = u.core_to_surface_ratio.map_or_else(|| "no".to_string(), |r| percent(r, 2));
        format!(
            " The core ({} below the top) gets {core} of the surface power density; the lowest point in the product gets {} of the highest.",
            length(u.core_depth_m),
            u.min_to_max_ratio.map_or_else(|| "none".to_string(), |r| percent(r, 2)),
        )
    });
    let description = format!(
        "Power density through {} of bed and carrier at the {} state, {} MHz, as a percentage of the highest value in the product. The product absorbs {} of the incident power in one pass and reflects {}.{uniformity_words}",
        length(total_mm / 1000.0),
        profile.state,
        sig(plan.frequency_mhz, 4),
        percent(solution.product_absorptance, 3),
        percent(solution.reflectance, 3),
    );
    let mut chart = Chart::new(
        "depth-profile",
        format!("Power density through the bed, {} state", profile.state),
        description,
        Axis::fit("Depth below the top surface, mm", [0.0, total_mm], true),
        Axis::fit("Power density, %", points.iter().map(|p| p.1).chain([0.0, 100.0]), true),
    );
    chart.spans = solution
        .layers
        .iter()
        .map(|layer| Span {
            from: layer.top_depth_m * 1000.0,
            to: (layer.top_depth_m + layer.thickness_m) * 1000.0,
            label: layer.name.clone(),
            shaded: layer.is_product,
        })
        .collect();
    chart.series.push(Series {
        label: "power density".into(),
        class: "svg-chart-series-3",
        stroke: Stroke::Solid,
        points,
        dots: false,
    });
    chart.height = 250.0;
    let rows = solution
        .depth_profile
        .iter()
        .map(|s| {
            let name = solution.layers.get(s.layer).map_or_else(String::new, |layer| layer.name.clone());
            vec![
                Cell::number(s.depth_m, sig(s.depth_m * 1000.0, 3)),
                Cell::text(name),
                Cell::number(s.power_density_per_incident_flux_per_m, sig(s.power_density_per_incident_flux_per_m, 3)),
                Cell::text(sig(relative(s.power_density_per_incident_flux_per_m), 3)),
            ]
        })
        .collect();
    let table = DataTable {
        testid: "depth",
        caption: format!("power density through the bed, {} state", profile.state),
        columns: vec![
            ("depth_mm", "Depth, mm".into()),
            ("layer", "Layer".into()),
            ("density", "Power density per incident flux, 1/m".into()),
            ("relative", "% of the product's highest".into()),
        ],
        rows,
        footer: None,
    };
    PlotMarkup {
        figure: format!(
            r#"{}<figcaption class="plot-section-caption">Layered solution at normal incidence. Standing waves show as ripples where the carrier or a metal floor reflects. Shaded: the product.</figcaption>"#,
            chart_svg(&chart)
        ),
        caption: table.caption.clone(),
        table: table_html(&table),
    }
}
