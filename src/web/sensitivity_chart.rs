//! What the quote is most sensitive to: the change in mains power when one input moves, ranked,
//! drawn as bars either side of zero (one row per input), with the rows as a table.

use crate::fields::Key;
use crate::format::{qty, sig, signed_qty};
use crate::markup::escape;
use crate::state::AppState;
use crate::svg_chart::{c, table_html, Axis, Cell, DataTable, PlotMarkup};
use doubleprime::plan::sensitivity::SensitivityRow;
use doubleprime::plan::Plan;
use leptos::prelude::*;
use std::fmt::Write;

const WIDTH: f64 = 640.0;
const LABEL_WIDTH: f64 = 190.0;
/// Right end of the bars; the moves are written in a column beyond it.
const RIGHT: f64 = 430.0;
const VALUE_X: f64 = 442.0;
const ROW_HEIGHT: f64 = 34.0;
const TOP: f64 = 30.0;
const BOTTOM: f64 = 44.0;

/// The ranked chart and its table.
#[component]
pub fn SensitivityChart(state: AppState) -> impl IntoView {
    let markup = Memo::new(move |_| {
        state.shown.with(|shown| shown.as_ref().map(|shown| sensitivity_markup(&shown.plan)).unwrap_or_default())
    });
    view! {
        <section class="sensitivity-chart" id="sensitivity" aria-labelledby="sensitivity-chart-title">
            <h2 class="sensitivity-chart-title" id="sensitivity-chart-title">
                "What moves the quote"
            </h2>
            <figure class="plot-section-figure" inner_html=move || markup.with(|m| m.figure.clone())></figure>
            <details class="svg-chart-data">
                <summary data-testid="sensitivity-toggle">"Data table: sensitivity of the quote"</summary>
                <div
                    class="svg-chart-data-scroll"
                    tabindex="0"
                    role="region"
                    aria-label="Data table of the sensitivity"
                    inner_html=move || markup.with(|m| m.table.clone())
                ></div>
            </details>
        </section>
    }
}

/// The input's name as the form labels it, without the form's explanations in brackets.
pub fn parameter_label(parameter: &str) -> String {
    match parameter {
        "product.loss_factor" => "Loss factor \u{3b5}\u{2033}".to_string(),
        other => Key::for_error_field(other).map_or_else(
            || other.to_string(),
            |key| key.spec().label.split(" (").next().unwrap_or(key.spec().label).to_string(),
        ),
    }
}

fn change_words(row: &SensitivityRow) -> String {
    let power = row.mains_power_change_kw.map_or_else(|| "not planned".to_string(), |kw| signed_qty(kw, 2, "kW"));
    match row.generator_count_change {
        Some(units) if units != 0 => {
            let sign = if units > 0 { "+" } else { "\u{2212}" };
            format!("{power}, {sign}{} generator{}", units.abs(), if units.abs() == 1 { "" } else { "s" })
        }
        _ => power,
    }
}

fn sensitivity_markup(plan: &Plan) -> PlotMarkup {
    let mut rows: Vec<&SensitivityRow> = plan.sensitivity.iter().collect();
    if rows.is_empty() {
        return PlotMarkup { figure: "<p>This plan has no sensitivity study.</p>".into(), ..PlotMarkup::default() };
    }
    rows.sort_by_key(|row| row.rank);
    // One chart row per input, in the order of its best-ranked move.
    let mut groups: Vec<(&'static str, Vec<&SensitivityRow>)> = Vec::new();
    for row in &rows {
        match groups.iter_mut().find(|(parameter, _)| *parameter == row.parameter) {
            Some((_, moves)) => moves.push(row),
            None => groups.push((row.parameter, vec![row])),
        }
    }
    let largest = rows.iter().filter_map(|r| r.mains_power_change_kw).map(f64::abs).fold(0.0, f64::max);
    let reach = if largest > 0.0 { largest } else { 1.0 };
    let axis = Axis::fit("Change in mains power, kW", [-reach, reach], true);
    let height = TOP + ROW_HEIGHT * groups.len() as f64 + BOTTOM;
    let bottom = height - BOTTOM;
    let plot_left = LABEL_WIDTH + 10.0;
    let x = |value: f64| plot_left + axis.fraction(value) * (RIGHT - plot_left);
    let zero = x(0.0);
    let mut svg = String::with_capacity(8192);
    let _ = write!(
        svg,
        r#"<svg class="svg-chart-svg" viewBox="0 0 {WIDTH} {}" role="img" aria-labelledby="sensitivity-title sensitivity-desc" data-testid="chart-sensitivity"><title id="sensitivity-title">Change in mains power for each input, ranked</title>"#,
        c(height)
    );
    let desc_at = svg.len();
    for (value, label) in axis.ticks() {
        let _ = write!(
            svg,
            r#"<line class="svg-chart-grid" x1="{0}" x2="{0}" y1="{1}" y2="{2}"/><text class="svg-chart-tick" x="{0}" y="{3}" text-anchor="middle">{4}</text>"#,
            c(x(value)),
            c(TOP),
            c(bottom),
            c(bottom + 16.0),
            escape(&label)
        );
    }
    let _ = write!(
        svg,
        r#"<line class="sensitivity-chart-zero" x1="{0}" x2="{0}" y1="{1}" y2="{2}"/>"#,
        c(zero),
        c(TOP - 6.0),
        c(bottom)
    );
    for (index, (parameter, moves)) in groups.iter().enumerate() {
        let y = TOP + ROW_HEIGHT * index as f64;
        let _ = write!(
            svg,
            r#"<text class="sensitivity-chart-label" x="{}" y="{}" text-anchor="end">{}. {}</text>"#,
            c(LABEL_WIDTH),
            c(y + ROW_HEIGHT * 0.5 + 4.0),
            index + 1,
            escape(&parameter_label(parameter))
        );
        let bar_height = (ROW_HEIGHT - 10.0) / moves.len().max(1) as f64;
        for (slot, row) in moves.iter().enumerate() {
            let change = row.mains_power_change_kw.unwrap_or(0.0);
            let end = x(change);
            let (left, width) = if end < zero { (end, zero - end) } else { (zero, end - zero) };
            let top = y + 5.0 + bar_height * slot as f64;
            let class = if change > 0.0 { "sensitivity-chart-bar-up" } else { "sensitivity-chart-bar-down" };
            let _ = write!(
                svg,
                r#"<rect class="{class}" x="{}" y="{}" width="{}" height="{}"/><text class="sensitivity-chart-value" x="{}" y="{}">{}: {}</text>"#,
                c(left),
                c(top),
                c(width.max(1.0)),
                c((bar_height - 2.0).max(1.0)),
                c(VALUE_X),
                c(top + bar_height * 0.5 + 2.0),
                escape(&row.change),
                escape(&change_words(row))
            );
        }
    }
    let _ = write!(
        svg,
        r#"<text class="svg-chart-axis-label" x="{}" y="{}" text-anchor="middle">{}</text><text class="svg-chart-legend" x="{}" y="16">Bars: change in mains power from the plan's own figure; to the right it rises.</text></svg>"#,
        c(0.5 * (plot_left + RIGHT)),
        c(height - 6.0),
        escape(&axis.label),
        c(plot_left)
    );
    let first = rows[0];
    let description = format!(
        "Inputs ranked by how much the mains power moves when each is changed by a stated step. Most: {} {} ({}). The plan draws {} from the mains.",
        parameter_label(first.parameter),
        first.change,
        change_words(first),
        qty(plan.mains_power_kw, 3, "kW")
    );
    svg.insert_str(desc_at, &format!(r#"<desc id="sensitivity-desc">{}</desc>"#, escape(&description)));
    let table = DataTable {
        testid: "sensitivity",
        caption: "sensitivity of the quote".into(),
        columns: vec![
            ("rank", "Rank".into()),
            ("parameter", "Input".into()),
            ("change", "Move".into()),
            ("mains_kw", "Mains, kW".into()),
            ("mains_change_kw", "Change, kW".into()),
            ("mains_change_pct", "Change, %".into()),
            ("generators", "Generators".into()),
            ("generator_change", "Change in generators".into()),
            ("dp_min", "Smallest Dp, mm".into()),
            ("note", "Note".into()),
        ],
        rows: rows
            .iter()
            .map(|row| {
                let number = |value: Option<f64>, digits: u32| match value {
                    Some(v) => Cell::number(v, sig(v, digits)),
                    None => Cell::text("\u{2014}"),
                };
                vec![
                    Cell::number(f64::from(row.rank), row.rank.to_string()),
                    Cell::text(parameter_label(row.parameter)),
                    Cell::text(row.change.clone()),
                    number(row.mains_power_kw, 4),
                    number(row.mains_power_change_kw, 3),
                    number(row.mains_power_change_pct, 2),
                    number(row.generator_count.map(f64::from), 3),
                    row.generator_count_change
                        .map_or_else(|| Cell::text("\u{2014}"), |d| Cell::number(d as f64, format!("{d:+}"))),
                    number(row.penetration_depth_min_m.map(|m| m * 1000.0), 3),
                    Cell::text(row.note.clone().unwrap_or_default()),
                ]
            })
            .collect(),
        footer: None,
    };
    PlotMarkup {
        figure: format!(
            r#"{svg}<figcaption class="plot-section-caption">Each input is moved on its own, everything else held. The loss factor changes how evenly and how well the bed couples, not the mains power the plan assumes: see the table's notes.</figcaption>"#
        ),
        caption: table.caption.clone(),
        table: table_html(&table),
    }
}
