//! A small SVG chart: axes with ticks and units, lines, bars, vertical markers, horizontal levels
//! and shaded spans, a legend, and a `<title>`/`<desc>` text alternative; plus the data table
//! that goes beside every chart. Concrete structs, no generics: each plot fills a [`Chart`] and
//! a [`DataTable`] and the page draws them.

use crate::format::{exact, fixed};
use crate::markup::escape;
use leptos::prelude::*;
use std::fmt::Write;

/// Drawing width in SVG user units; the SVG scales to its container.
const WIDTH: f64 = 640.0;
const MARGIN_LEFT: f64 = 62.0;
const MARGIN_RIGHT: f64 = 18.0;
const MARGIN_TOP: f64 = 34.0;
const MARGIN_BOTTOM: f64 = 42.0;

/// One axis: its label (with the unit), range and scale.
#[derive(Debug, Clone, PartialEq)]
pub struct Axis {
    /// Label with unit: `Temperature, °C`.
    pub label: String,
    /// Lowest value shown.
    pub min: f64,
    /// Highest value shown.
    pub max: f64,
    /// Logarithmic scale (both bounds must then be above 0).
    pub log: bool,
}

impl Axis {
    /// A linear axis spanning `values` with round ends, from 0 if `from_zero`.
    pub fn fit(label: impl Into<String>, values: impl IntoIterator<Item = f64>, from_zero: bool) -> Self {
        let (mut low, mut high) = finite_span(values);
        if from_zero {
            low = low.min(0.0);
            high = high.max(0.0);
        }
        if high - low < 1e-12 * high.abs().max(1.0) {
            // A flat series: show a band around it (from 0 up when 0 is wanted and nothing is below).
            let pad = if high == 0.0 { 1.0 } else { high.abs() * 0.1 };
            low -= pad;
            high += pad;
            if from_zero && high - pad >= 0.0 {
                low = low.max(0.0);
            }
        }
        let step = nice_step((high - low) / 5.0);
        Self { label: label.into(), min: (low / step).floor() * step, max: (high / step).ceil() * step, log: false }
    }

    /// A logarithmic axis spanning the positive `values`, widened to whole decades.
    pub fn fit_log(label: impl Into<String>, values: impl IntoIterator<Item = f64>) -> Self {
        let (low, high) = finite_span(values.into_iter().filter(|v| *v > 0.0));
        let (low, high) = if low > 0.0 && high >= low { (low, high) } else { (1.0, 10.0) };
        Self {
            label: label.into(),
            min: 10f64.powf(low.log10().floor()),
            max: 10f64.powf(high.log10().ceil().max(low.log10().floor() + 1.0)),
            log: true,
        }
    }

    /// Where `value` falls between the ends, 0 to 1 (outside for values outside).
    pub fn fraction(&self, value: f64) -> f64 {
        if self.log {
            (value.ln() - self.min.ln()) / (self.max.ln() - self.min.ln())
        } else {
            (value - self.min) / (self.max - self.min)
        }
    }

    /// Tick values and their labels.
    pub fn ticks(&self) -> Vec<(f64, String)> {
        if self.log {
            let first = self.min.log10().floor() as i32;
            let last = self.max.log10().ceil() as i32;
            (first..=last)
                .map(|power| 10f64.powi(power))
                .filter(|v| *v >= self.min * 0.999 && *v <= self.max * 1.001)
                .map(|v| (v, decade_label(v)))
                .collect()
        } else {
            let step = nice_step((self.max - self.min) / 5.0);
            let decimals = (-step.log10().floor()).max(0.0) as usize;
            let first = (self.min / step).ceil() as i64;
            let last = (self.max / step).floor() as i64;
            (first..=last)
                .map(|index| {
                    let value = index as f64 * step;
                    (value, fixed(value, decimals))
                })
                .collect()
        }
    }

    /// Minor grid values of a log axis (2 and 5 in each decade).
    fn minor_ticks(&self) -> Vec<f64> {
        if !self.log {
            return Vec::new();
        }
        let first = self.min.log10().floor() as i32;
        let last = self.max.log10().ceil() as i32;
        (first..last)
            .flat_map(|power| [2.0, 5.0].map(|m| m * 10f64.powi(power)))
            .filter(|v| *v > self.min && *v < self.max)
            .collect()
    }
}

fn finite_span(values: impl IntoIterator<Item = f64>) -> (f64, f64) {
    let (low, high) = values
        .into_iter()
        .filter(|v| v.is_finite())
        .fold((f64::INFINITY, f64::NEG_INFINITY), |(low, high), v| (low.min(v), high.max(v)));
    if low.is_finite() {
        (low, high)
    } else {
        (0.0, 1.0)
    }
}

/// 1, 2 or 5 times a power of ten, near `raw`.
fn nice_step(raw: f64) -> f64 {
    if !(raw.is_finite() && raw > 0.0) {
        return 1.0;
    }
    let power = 10f64.powf(raw.log10().floor());
    let scaled = raw / power;
    let nice = if scaled < 1.5 {
        1.0
    } else if scaled < 3.5 {
        2.0
    } else if scaled < 7.5 {
        5.0
    } else {
        10.0
    };
    nice * power
}

fn decade_label(value: f64) -> String {
    let power = value.log10().round() as i32;
    fixed(value, (-power).max(0) as usize)
}

/// How a series is drawn.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Stroke {
    /// A solid line.
    Solid,
    /// A dashed line (extrapolated or secondary data).
    Dashed,
}

/// A line through points; non-finite points break it.
#[derive(Debug, Clone, PartialEq)]
pub struct Series {
    /// Legend text.
    pub label: String,
    /// CSS class giving the colour (`svg-chart-series-1`).
    pub class: &'static str,
    /// Solid or dashed.
    pub stroke: Stroke,
    /// Points (x, y).
    pub points: Vec<(f64, f64)>,
    /// Draw a dot at every point too.
    pub dots: bool,
}

/// Bars over x ranges, rising from 0.
#[derive(Debug, Clone, PartialEq)]
pub struct Bars {
    /// Legend text.
    pub label: String,
    /// CSS class giving the colour.
    pub class: &'static str,
    /// (x from, x to, height).
    pub bars: Vec<(f64, f64, f64)>,
}

/// A vertical line at one x, labelled at the top.
#[derive(Debug, Clone, PartialEq)]
pub struct Marker {
    /// Position on the x axis.
    pub at: f64,
    /// Label above the plot.
    pub label: String,
    /// Emphasised (the scenario's own band, say).
    pub strong: bool,
}

/// A horizontal line at one y, labelled at the right.
#[derive(Debug, Clone, PartialEq)]
pub struct Level {
    /// Position on the y axis.
    pub at: f64,
    /// Label.
    pub label: String,
}

/// A shaded x range (a layer of the bed), labelled inside.
#[derive(Debug, Clone, PartialEq)]
pub struct Span {
    /// Start on the x axis.
    pub from: f64,
    /// End on the x axis.
    pub to: f64,
    /// Label.
    pub label: String,
    /// Shade it (the product) or leave it plain (carriers).
    pub shaded: bool,
}

/// Everything one chart shows.
#[derive(Debug, Clone, PartialEq)]
pub struct Chart {
    /// Unique prefix for element ids.
    pub id: &'static str,
    /// Title (also the SVG `<title>`).
    pub title: String,
    /// What the chart shows, in sentences: the text alternative (`<desc>`).
    pub description: String,
    /// Horizontal axis.
    pub x: Axis,
    /// Vertical axis.
    pub y: Axis,
    /// Lines.
    pub series: Vec<Series>,
    /// Bars.
    pub bars: Vec<Bars>,
    /// Vertical markers.
    pub markers: Vec<Marker>,
    /// Horizontal levels.
    pub levels: Vec<Level>,
    /// Shaded spans.
    pub spans: Vec<Span>,
    /// Drawing height in user units.
    pub height: f64,
}

impl Chart {
    /// An empty chart with these axes.
    pub fn new(id: &'static str, title: String, description: String, x: Axis, y: Axis) -> Self {
        Self {
            id,
            title,
            description,
            x,
            y,
            series: Vec::new(),
            bars: Vec::new(),
            markers: Vec::new(),
            levels: Vec::new(),
            spans: Vec::new(),
            height: 230.0,
        }
    }
}

/// One decimal is plenty for coordinates in a 640-unit drawing.
pub fn c(value: f64) -> String {
    format!("{value:.1}")
}

struct Frame {
    left: f64,
    right: f64,
    top: f64,
    bottom: f64,
}

impl Frame {
    fn x(&self, axis: &Axis, value: f64) -> f64 {
        self.left + axis.fraction(value) * (self.right - self.left)
    }

    fn y(&self, axis: &Axis, value: f64) -> f64 {
        self.bottom - axis.fraction(value) * (self.bottom - self.top)
    }
}

fn usable(axis: &Axis, value: f64) -> bool {
    value.is_finite() && (!axis.log || value > 0.0)
}

fn line(out: &mut String, class: &str, x1: f64, x2: f64, y1: f64, y2: f64) {
    let _ = write!(out, r#"<line class="{class}" x1="{}" x2="{}" y1="{}" y2="{}"/>"#, c(x1), c(x2), c(y1), c(y2));
}

fn text(out: &mut String, class: &str, x: f64, y: f64, anchor: &str, content: &str) {
    let _ = write!(
        out,
        r#"<text class="{class}" x="{}" y="{}" text-anchor="{anchor}">{}</text>"#,
        c(x),
        c(y),
        escape(content)
    );
}

/// Characters to SVG units at the 11-unit label size (an average, for layout only).
const CHAR_WIDTH: f64 = 6.4;
/// Height of a legend row and of a marker-label row, in user units.
const LEGEND_ROW: f64 = 15.0;
const MARKER_ROW: f64 = 12.0;

/// One legend entry: label, class, dashed, bar.
type LegendEntry<'a> = (&'a str, &'static str, bool, bool);

/// Where each legend entry goes: (x, row). Entries flow left to right and wrap.
fn legend_layout(entries: &[LegendEntry], left: f64, right: f64) -> Vec<(f64, usize)> {
    let mut placed = Vec::with_capacity(entries.len());
    let (mut x, mut row) = (left, 0);
    for (label, ..) in entries {
        let width = 23.0 + CHAR_WIDTH * label.chars().count() as f64;
        if x > left && x + width > right {
            row += 1;
            x = left;
        }
        placed.push((x, row));
        x += width + 16.0;
    }
    placed
}

/// The label row of each marker (0 nearest the plot), so that no two labels overlap.
fn marker_rows(centres_and_widths: &[(f64, f64)]) -> Vec<usize> {
    let mut order: Vec<usize> = (0..centres_and_widths.len()).collect();
    order.sort_by(|a, b| centres_and_widths[*a].0.total_cmp(&centres_and_widths[*b].0));
    let mut row_ends: Vec<f64> = Vec::new();
    let mut rows = vec![0; centres_and_widths.len()];
    for index in order {
        let (centre, width) = centres_and_widths[index];
        let start = centre - 0.5 * width;
        let row = row_ends.iter().position(|end| *end + 4.0 <= start).unwrap_or(row_ends.len());
        if row == row_ends.len() {
            row_ends.push(f64::NEG_INFINITY);
        }
        row_ends[row] = centre + 0.5 * width;
        rows[index] = row;
    }
    rows
}

/// The chart as SVG markup (every text escaped). The legend and the marker labels take the
/// rows they need above the plot; the plot keeps the height the chart asks for.
pub fn chart_svg(chart: &Chart) -> String {
    let (x_axis, y_axis) = (&chart.x, &chart.y);
    let (left, right) = (MARGIN_LEFT, WIDTH - MARGIN_RIGHT);
    let entries: Vec<LegendEntry> = chart
        .series
        .iter()
        .map(|s| (s.label.as_str(), s.class, s.stroke == Stroke::Dashed, false))
        .chain(chart.bars.iter().map(|b| (b.label.as_str(), b.class, false, true)))
        .filter(|(label, ..)| !label.is_empty())
        .collect();
    let legend = legend_layout(&entries, left, right);
    let legend_rows = legend.iter().map(|(_, row)| row + 1).max().unwrap_or(0);
    let x_of = |value: f64| left + x_axis.fraction(value) * (right - left);
    let markers: Vec<&Marker> = chart
        .markers
        .iter()
        .filter(|marker| usable(x_axis, marker.at) && (0.0..=1.0).contains(&x_axis.fraction(marker.at)))
        .collect();
    let label_rows = marker_rows(
        &markers.iter().map(|m| (x_of(m.at), CHAR_WIDTH * m.label.chars().count() as f64)).collect::<Vec<_>>(),
    );
    let marker_row_count = label_rows.iter().map(|row| row + 1).max().unwrap_or(0);
    let top = 8.0 + LEGEND_ROW * legend_rows as f64 + MARKER_ROW * marker_row_count as f64 + 6.0;
    let plot_height = (chart.height - MARGIN_TOP - MARGIN_BOTTOM).max(60.0);
    let height = top + plot_height + MARGIN_BOTTOM;
    let frame = Frame { left, right, top, bottom: top + plot_height };
    let id = chart.id;
    let mut out = String::with_capacity(8192);
    let _ = write!(
        out,
        r#"<svg class="svg-chart-svg" viewBox="0 0 {WIDTH} {}" role="img" aria-labelledby="{id}-title {id}-desc" data-testid="chart-{id}"><title id="{id}-title">{}</title><desc id="{id}-desc">{}</desc><defs><clipPath id="{id}-clip"><rect x="{}" y="{}" width="{}" height="{}"/></clipPath></defs>"#,
        c(height),
        escape(&chart.title),
        escape(&chart.description),
        c(frame.left),
        c(frame.top),
        c(frame.right - frame.left),
        c(frame.bottom - frame.top)
    );
    for span in &chart.spans {
        let x0 = frame.x(x_axis, span.from).clamp(frame.left, frame.right);
        let x1 = frame.x(x_axis, span.to).clamp(frame.left, frame.right);
        let class = if span.shaded { "svg-chart-span svg-chart-span-shaded" } else { "svg-chart-span" };
        let _ = write!(
            out,
            r#"<rect class="{class}" x="{}" y="{}" width="{}" height="{}"/>"#,
            c(x0),
            c(frame.top),
            c((x1 - x0).max(0.0)),
            c(frame.bottom - frame.top)
        );
        text(&mut out, "svg-chart-span-label", 0.5 * (x0 + x1), frame.top + 14.0, "middle", &span.label);
    }
    for (value, label) in y_axis.ticks() {
        let y = frame.y(y_axis, value);
        line(&mut out, "svg-chart-grid", frame.left, frame.right, y, y);
        text(&mut out, "svg-chart-tick", frame.left - 6.0, y + 4.0, "end", &label);
    }
    for (value, label) in x_axis.ticks() {
        let x = frame.x(x_axis, value);
        line(&mut out, "svg-chart-grid", x, x, frame.top, frame.bottom);
        text(&mut out, "svg-chart-tick", x, frame.bottom + 16.0, "middle", &label);
    }
    for value in x_axis.minor_ticks() {
        let x = frame.x(x_axis, value);
        line(&mut out, "svg-chart-grid-minor", x, x, frame.top, frame.bottom);
    }
    for value in y_axis.minor_ticks() {
        let y = frame.y(y_axis, value);
        line(&mut out, "svg-chart-grid-minor", frame.left, frame.right, y, y);
    }
    let _ = write!(
        out,
        r#"<rect class="svg-chart-frame" x="{}" y="{}" width="{}" height="{}"/><g clip-path="url(#{id}-clip)">"#,
        c(frame.left),
        c(frame.top),
        c(frame.right - frame.left),
        c(frame.bottom - frame.top)
    );
    for bars in &chart.bars {
        for &(x0, x1, height) in &bars.bars {
            if !(usable(x_axis, x0) && usable(x_axis, x1) && height.is_finite()) {
                continue;
            }
            let bar_left = frame.x(x_axis, x0);
            let bar_right = frame.x(x_axis, x1);
            let base = frame.y(y_axis, 0.0_f64.max(y_axis.min));
            let bar_top = frame.y(y_axis, height);
            let (y, h) = if bar_top < base { (bar_top, base - bar_top) } else { (base, bar_top - base) };
            let inset = ((bar_right - bar_left) * 0.08).min(3.0);
            let _ = write!(
                out,
                r#"<rect class="svg-chart-bar {}" x="{}" y="{}" width="{}" height="{}"/>"#,
                bars.class,
                c(bar_left + inset),
                c(y),
                c((bar_right - bar_left - 2.0 * inset).max(0.5)),
                c(h)
            );
        }
    }
    for series in &chart.series {
        let mut runs: Vec<Vec<(f64, f64)>> = vec![Vec::new()];
        for &(x, y) in &series.points {
            if usable(x_axis, x) && usable(y_axis, y) {
                if let Some(run) = runs.last_mut() {
                    run.push((frame.x(x_axis, x), frame.y(y_axis, y)));
                }
            } else if runs.last().is_some_and(|run| !run.is_empty()) {
                runs.push(Vec::new());
            }
        }
        let dashed = if series.stroke == Stroke::Dashed { " svg-chart-line-dashed" } else { "" };
        for run in runs.iter().filter(|run| !run.is_empty()) {
            let _ = write!(out, r#"<polyline class="svg-chart-line{dashed} {}" points=""#, series.class);
            for (index, (x, y)) in run.iter().enumerate() {
                let _ = write!(out, "{}{},{}", if index == 0 { "" } else { " " }, c(*x), c(*y));
            }
            out.push_str(r#""/>"#);
            if series.dots {
                for (x, y) in run {
                    let _ = write!(
                        out,
                        r#"<circle class="svg-chart-dot {}" cx="{}" cy="{}" r="2.6"/>"#,
                        series.class,
                        c(*x),
                        c(*y)
                    );
                }
            }
        }
    }
    out.push_str("</g>");
    for level in &chart.levels {
        if usable(y_axis, level.at) && (0.0..=1.0).contains(&y_axis.fraction(level.at)) {
            let y = frame.y(y_axis, level.at);
            line(&mut out, "svg-chart-level", frame.left, frame.right, y, y);
            text(&mut out, "svg-chart-level-label", frame.right - 4.0, y - 5.0, "end", &level.label);
        }
    }
    for (marker, row) in markers.iter().zip(&label_rows) {
        let x = frame.x(x_axis, marker.at);
        let class = if marker.strong { "svg-chart-marker svg-chart-marker-strong" } else { "svg-chart-marker" };
        line(&mut out, class, x, x, frame.top, frame.bottom);
        text(
            &mut out,
            "svg-chart-marker-label",
            x,
            frame.top - 4.0 - MARKER_ROW * *row as f64,
            "middle",
            &marker.label,
        );
    }
    text(&mut out, "svg-chart-axis-label", 0.5 * (frame.left + frame.right), height - 6.0, "middle", &x_axis.label);
    let _ = write!(
        out,
        r#"<text class="svg-chart-axis-label" transform="translate(14 {}) rotate(-90)" text-anchor="middle">{}</text>"#,
        c(0.5 * (frame.top + frame.bottom)),
        escape(&y_axis.label)
    );
    for ((label, class, dashed, bar), (x, row)) in entries.iter().zip(&legend) {
        let baseline = 8.0 + LEGEND_ROW * (*row as f64 + 1.0) - 4.0;
        if *bar {
            let _ = write!(
                out,
                r#"<rect class="svg-chart-bar {class}" x="{}" y="{}" width="14" height="10"/>"#,
                c(*x),
                c(baseline - 9.0)
            );
        } else {
            let dash = if *dashed { " svg-chart-line-dashed" } else { "" };
            line(&mut out, &format!("svg-chart-line{dash} {class}"), *x, x + 18.0, baseline - 4.0, baseline - 4.0);
        }
        text(&mut out, "svg-chart-legend", x + 23.0, baseline, "start", label);
    }
    out.push_str("</svg>");
    out
}

/// One cell of a data table: the text shown and, for numbers, the exact value (`data-value`).
#[derive(Debug, Clone, PartialEq)]
pub struct Cell {
    /// Shown.
    pub text: String,
    /// The number behind it.
    pub value: Option<f64>,
}

impl Cell {
    /// A number shown as `text`.
    pub fn number(value: f64, text: String) -> Self {
        Self { text, value: Some(value) }
    }

    /// Plain text.
    pub fn text(text: impl Into<String>) -> Self {
        Self { text: text.into(), value: None }
    }
}

/// The data behind a chart, as a table.
#[derive(Debug, Clone, PartialEq)]
pub struct DataTable {
    /// `data-testid` of the table; rows are `{testid}-row`, cells `{testid}-{column id}`.
    pub testid: &'static str,
    /// The caption.
    pub caption: String,
    /// (column id, header with unit).
    pub columns: Vec<(&'static str, String)>,
    /// Rows of cells, one per column.
    pub rows: Vec<Vec<Cell>>,
    /// A closing row (totals), if any.
    pub footer: Option<Vec<Cell>>,
}

fn cells_html(out: &mut String, testid: &str, columns: &[(&'static str, String)], cells: &[Cell]) {
    for (index, (cell, (column, _))) in cells.iter().zip(columns).enumerate() {
        let tag = if index == 0 { r#"th scope="row""# } else { "td" };
        let close = if index == 0 { "th" } else { "td" };
        let _ = write!(out, r#"<{tag} data-testid="{testid}-{column}""#);
        if let Some(value) = cell.value {
            let _ = write!(out, r#" data-value="{}""#, exact(value));
        }
        let _ = write!(out, ">{}</{close}>", escape(&cell.text));
    }
}

/// The table as markup.
pub fn table_html(table: &DataTable) -> String {
    let testid = table.testid;
    let mut out = String::with_capacity(256 + 96 * table.rows.len() * table.columns.len());
    let _ = write!(
        out,
        r#"<table class="svg-chart-table" data-testid="{testid}"><caption>{}</caption><thead><tr>"#,
        escape(&table.caption)
    );
    for (_, header) in &table.columns {
        let _ = write!(out, r#"<th scope="col">{}</th>"#, escape(header));
    }
    out.push_str("</tr></thead><tbody>");
    for row in &table.rows {
        let _ = write!(out, r#"<tr data-testid="{testid}-row">"#);
        cells_html(&mut out, testid, &table.columns, row);
        out.push_str("</tr>");
    }
    out.push_str("</tbody>");
    if let Some(footer) = &table.footer {
        let _ = write!(out, r#"<tfoot><tr data-testid="{testid}-total">"#);
        cells_html(&mut out, testid, &table.columns, footer);
        out.push_str("</tr></tfoot>");
    }
    out.push_str("</table>");
    out
}

/// What a plot section shows: the figure markup (charts and caption) and its data table.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct PlotMarkup {
    /// The charts and the caption.
    pub figure: String,
    /// The data table.
    pub table: String,
    /// The table's name, for its disclosure.
    pub caption: String,
}

/// A plot section: heading, the figure, and the data table in a disclosure that stays open or
/// shut across updates (only its contents are replaced).
pub fn plot_section(
    class: &'static str,
    id: &'static str,
    title: &'static str,
    testid: &'static str,
    markup: Memo<PlotMarkup>,
) -> impl IntoView {
    let title_id = format!("{id}-title");
    let labelled_by = title_id.clone();
    view! {
        <section class=format!("plot-section {class}") id=id aria-labelledby=labelled_by>
            <h3 class="plot-section-title" id=title_id>
                {title}
            </h3>
            <figure class="plot-section-figure" inner_html=move || markup.with(|m| m.figure.clone())></figure>
            <details class="svg-chart-data">
                <summary data-testid=format!("{testid}-toggle")>
                    "Data table: " {move || markup.with(|m| m.caption.clone())}
                </summary>
                <div
                    class="svg-chart-data-scroll"
                    tabindex="0"
                    role="region"
                    aria-label=format!("Data table of {title}")
                    inner_html=move || markup.with(|m| m.table.clone())
                ></div>
            </details>
        </section>
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn crowded_marker_labels_take_separate_rows() {
        // "outlet" at x = 100 and "freezing point" at x = 110 overlap; a label far away does not.
        assert_eq!(marker_rows(&[(100.0, 38.0), (110.0, 90.0), (400.0, 20.0)]), [0, 1, 0]);
    }

    #[test]
    fn long_legends_wrap() {
        let entries: Vec<LegendEntry> = vec![("a rather long legend entry", "c", false, false); 3];
        let rows: Vec<usize> = legend_layout(&entries, 60.0, 620.0).into_iter().map(|(_, row)| row).collect();
        assert_eq!(rows, [0, 0, 1]);
    }

    #[test]
    fn linear_axes_end_on_round_numbers() {
        let axis = Axis::fit("T", [-18.0, -4.0], false);
        assert_eq!((axis.min, axis.max), (-18.0, -4.0));
        let ticks: Vec<String> = axis.ticks().into_iter().map(|(_, label)| label).collect();
        assert_eq!(
            ticks,
            [
                "\u{2212}18",
                "\u{2212}16",
                "\u{2212}14",
                "\u{2212}12",
                "\u{2212}10",
                "\u{2212}8",
                "\u{2212}6",
                "\u{2212}4"
            ]
        );
        let power = Axis::fit("P", [7.1, 7.2], true);
        assert_eq!(power.min, 0.0);
        assert!(power.max >= 7.2);
    }

    #[test]
    fn flat_and_empty_series_still_get_an_axis() {
        let flat = Axis::fit("w", [0.74, 0.74], false);
        assert!(flat.min < 0.74 && flat.max > 0.74);
        let empty = Axis::fit("w", [f64::NAN], false);
        assert!(empty.max > empty.min);
    }

    #[test]
    fn log_axes_span_whole_decades() {
        let axis = Axis::fit_log("Dp", [3.2, 450.0, -1.0, f64::NAN]);
        assert_eq!((axis.min, axis.max), (1.0, 1000.0));
        let ticks: Vec<String> = axis.ticks().into_iter().map(|(_, label)| label).collect();
        assert_eq!(ticks, ["1", "10", "100", "1000"]);
        assert_eq!(Axis::fit_log("f", [0.05, 0.2]).ticks()[0].1, "0.01");
    }
}
