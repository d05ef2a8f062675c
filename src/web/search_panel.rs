//! The design search over the space around the current scenario: started by the person, run in
//! slices between which the browser gets the page back (a zero-delay timeout), cancelled by the
//! Cancel button or by any edit of the scenario, and on completion the best configurations as a
//! table and the tunnel-length / generator-count frontier as a chart with its data table.

use crate::format::{exact, length, sig};
use crate::markup::escape;
use crate::state::AppState;
use crate::svg_chart::{chart_svg, table_html, Axis, Cell, Chart, DataTable, PlotMarkup, Series, Stroke};
use doubleprime::scenario::Scenario;
use doubleprime::search::evaluate::Candidate;
use doubleprime::search::space::SearchSpace;
use doubleprime::search::{Progress, Search, SearchResult};
use doubleprime::sizing::generators::builtin_catalogue;
use leptos::prelude::*;
use std::fmt::Write;
use std::sync::Arc;
use wasm_bindgen::JsCast;

/// Configurations evaluated per slice before the browser gets the page back.
const SLICE: usize = 500;

/// A search under way: which start it belongs to, the scenario it searches, and the search.
struct Run {
    id: u64,
    scenario: Arc<Scenario>,
    search: Search,
}

/// Where the panel is.
#[derive(Debug, Clone, PartialEq)]
enum Status {
    /// Never started.
    Idle,
    /// Evaluating.
    Running,
    /// Stopped before the end, and why.
    Stopped(&'static str),
    /// Could not start, and why.
    Refused(String),
    /// Every configuration evaluated.
    Done,
}

/// A finished search's markup, with the scenario it was for.
#[derive(Debug, Clone, PartialEq)]
struct Found {
    scenario: Arc<Scenario>,
    best: String,
    frontier: PlotMarkup,
    summary: String,
}

/// The panel's signals and the search it runs. Copied into its handlers.
#[derive(Clone, Copy)]
struct Searcher {
    state: AppState,
    run: StoredValue<Option<Run>, LocalStorage>,
    next_id: StoredValue<u64>,
    status: RwSignal<Status>,
    progress: RwSignal<Option<Progress>>,
    found: RwSignal<Option<Found>>,
}

impl Searcher {
    fn start(self) {
        self.found.set(None);
        let Ok(scenario) = self.state.scenario.get_untracked() else {
            self.status.set(Status::Refused("The scenario has a field to fix first.".into()));
            return;
        };
        match Search::new(&scenario, &SearchSpace::default()) {
            Ok(search) => {
                let id = self.next_id.with_value(|id| *id);
                self.next_id.set_value(id.wrapping_add(1));
                self.progress.set(Some(search.progress()));
                self.run.set_value(Some(Run { id, scenario, search }));
                self.status.set(Status::Running);
                self.schedule(id);
            }
            Err(problems) => {
                let why = problems.iter().map(ToString::to_string).collect::<Vec<_>>().join("; ");
                self.run.set_value(None);
                self.progress.set(None);
                self.status.set(Status::Refused(format!("The search cannot start: {why}")));
            }
        }
    }

    fn cancel(self, why: &'static str) {
        if self.run.with_value(Option::is_some) {
            self.run.set_value(None);
            self.status.set(Status::Stopped(why));
        }
    }

    /// Run the next slice of search `id` once the browser has had the page back.
    fn schedule(self, id: u64) {
        let callback = wasm_bindgen::closure::Closure::once_into_js(move || self.slice(id));
        let scheduled = web_sys::window().and_then(|window| {
            window.set_timeout_with_callback_and_timeout_and_arguments_0(callback.unchecked_ref(), 0).ok()
        });
        if scheduled.is_none() {
            self.cancel("the browser would not schedule the next part of the search");
        }
    }

    fn slice(self, id: u64) {
        // A search whose scenario is no longer the form's stops here (an edit cancels it).
        let current = self.state.scenario.with_untracked(|scenario| scenario.as_ref().ok().cloned());
        let stepped = self.run.try_update_value(|run| match run {
            Some(run) if run.id == id => {
                if current.as_deref() != Some(&*run.scenario) {
                    return Some(None);
                }
                let progress = run.search.step(SLICE);
                let found = progress.done.then(|| found_markup(&run.search.finish(), run.scenario.clone()));
                Some(Some((progress, found)))
            }
            _ => None,
        });
        match stepped.flatten() {
            // Cancelled, or replaced by a newer start: nothing more to do for this one.
            None => {}
            Some(None) => self.cancel("the scenario changed"),
            Some(Some((progress, found))) => {
                self.progress.set(Some(progress));
                match found {
                    Some(found) => {
                        self.run.set_value(None);
                        self.found.set(Some(found));
                        self.status.set(Status::Done);
                    }
                    None => self.schedule(id),
                }
            }
        }
    }
}

fn class_label(id: &str) -> String {
    builtin_catalogue().iter().find(|class| class.id == id).map_or_else(|| id.to_string(), |class| class.label.clone())
}

fn band_words(candidate: &Candidate) -> String {
    candidate.ism_band.map_or_else(|| format!("{} MHz", sig(candidate.configuration.frequency_mhz, 4)), str::to_string)
}

const BEST_HEADERS: [&str; 8] =
    ["Rank", "Band", "Generators", "Belt width", "Bed depth", "Tunnel length", "Mains, kW", "Energy cost per tonne"];

fn best_html(result: &SearchResult, currency: &str) -> String {
    if result.best.is_empty() {
        return r#"<p class="search-panel-none" data-testid="search-none">No configuration in the space meets the constraints.</p>"#.into();
    }
    let mut out = String::with_capacity(512 + 512 * result.best.len());
    let _ = write!(
        out,
        r#"<table class="search-panel-table" data-testid="search-best"><caption>The {} cheapest configurations found, best first (fewest generators)</caption><thead><tr>"#,
        result.best.len()
    );
    for (index, header) in BEST_HEADERS.iter().enumerate() {
        let header =
            if index == 7 && !currency.is_empty() { format!("{header}, {currency}") } else { header.to_string() };
        let _ = write!(out, r#"<th scope="col">{}</th>"#, escape(&header));
    }
    out.push_str("</tr></thead><tbody>");
    for entry in &result.best {
        let candidate = &entry.candidate;
        let configuration = &candidate.configuration;
        let _ = write!(
            out,
            r#"<tr data-testid="search-best-row"><th scope="row">{}</th><td data-testid="search-best-band" data-value="{}">{}</td><td data-testid="search-best-generators" data-class="{}" data-value="{}">{} × {} kW<span class="search-panel-class">{}</span></td><td data-testid="search-best-belt" data-value="{}">{}</td><td data-testid="search-best-bed" data-value="{}">{}</td><td data-testid="search-best-length" data-value="{}">{}</td><td data-testid="search-best-mains" data-value="{}">{}</td><td data-testid="search-best-cost" data-value="{}">{}</td></tr>"#,
            entry.rank,
            exact(configuration.frequency_mhz),
            escape(&band_words(candidate)),
            escape(&candidate.generator_class),
            candidate.generator_count,
            candidate.generator_count,
            sig(candidate.generator_rating_kw, 3),
            escape(&class_label(&candidate.generator_class)),
            exact(configuration.belt_width_m),
            length(configuration.belt_width_m),
            exact(configuration.bed_depth_m),
            length(configuration.bed_depth_m),
            exact(candidate.tunnel_length_m),
            length(candidate.tunnel_length_m),
            exact(candidate.mains_power_kw),
            sig(candidate.mains_power_kw, 3),
            exact(candidate.energy_cost_per_tonne),
            sig(candidate.energy_cost_per_tonne, 3),
        );
    }
    out.push_str("</tbody></table>");
    out
}

fn frontier_markup(result: &SearchResult) -> PlotMarkup {
    let frontier = &result.frontier;
    if frontier.is_empty() {
        return PlotMarkup {
            figure: "<p>No frontier: no configuration is feasible.</p>".into(),
            ..PlotMarkup::default()
        };
    }
    let points: Vec<(f64, f64)> = frontier.iter().map(|c| (f64::from(c.generator_count), c.tunnel_length_m)).collect();
    let most = points.iter().map(|p| p.0).fold(0.0, f64::max);
    let ends = |pick: fn(&Candidate) -> String| (pick(&frontier[0]), frontier.last().map(pick).unwrap_or_default());
    let (first, last) =
        ends(|c| format!("{} generators and {} of tunnel", c.generator_count, length(c.tunnel_length_m)));
    let description = if frontier.len() == 1 {
        format!("One configuration is best on both counts: {first}.")
    } else {
        format!(
            "{} configurations trade tunnel length against generator count: from {first} to {last}. None of the others has both fewer generators and a shorter tunnel.",
            frontier.len()
        )
    };
    let mut chart = Chart::new(
        "search-frontier",
        "Shortest tunnel for each generator count".into(),
        description,
        Axis::fit("Generators installed", points.iter().map(|p| p.0).chain([0.0, most + 1.0]), true),
        Axis::fit("Tunnel length, m", points.iter().map(|p| p.1).chain([0.0]), true),
    );
    chart.series.push(Series {
        label: "frontier".into(),
        class: "svg-chart-series-1",
        stroke: Stroke::Solid,
        points,
        dots: true,
    });
    let table = DataTable {
        testid: "search-frontier",
        caption: "tunnel length against generator count".into(),
        columns: vec![
            ("generators", "Generators".into()),
            ("class", "Class".into()),
            ("band", "Band".into()),
            ("belt_m", "Belt width, m".into()),
            ("bed_m", "Bed depth, m".into()),
            ("length_m", "Tunnel length, m".into()),
            ("mains_kw", "Mains, kW".into()),
        ],
        rows: frontier
            .iter()
            .map(|c| {
                vec![
                    Cell::number(f64::from(c.generator_count), c.generator_count.to_string()),
                    Cell::text(class_label(&c.generator_class)),
                    Cell::text(band_words(c)),
                    Cell::number(c.configuration.belt_width_m, sig(c.configuration.belt_width_m, 3)),
                    Cell::number(c.configuration.bed_depth_m, sig(c.configuration.bed_depth_m, 3)),
                    Cell::number(c.tunnel_length_m, sig(c.tunnel_length_m, 3)),
                    Cell::number(c.mains_power_kw, sig(c.mains_power_kw, 3)),
                ]
            })
            .collect(),
        footer: None,
    };
    PlotMarkup {
        figure: format!(
            r#"{}<figcaption class="plot-section-caption">Each point: the fewest generators for a tunnel no longer than its length, over the space searched.</figcaption>"#,
            chart_svg(&chart)
        ),
        caption: table.caption.clone(),
        table: table_html(&table),
    }
}

fn found_markup(result: &SearchResult, scenario: Arc<Scenario>) -> Found {
    let summary = format!(
        "{} of {} configurations meet the constraints (bands, generator classes, belt widths and bed depths around the scenario's).",
        result.feasible, result.configurations
    );
    let warnings: String = result
        .warnings
        .iter()
        .map(|warning| format!(r#"<li data-code="{}">{}</li>"#, escape(warning.code), escape(&warning.message)))
        .collect();
    let summary = if warnings.is_empty() {
        format!("<p>{}</p>", escape(&summary))
    } else {
        format!(r#"<p>{}</p><ul class="search-panel-warnings">{warnings}</ul>"#, escape(&summary))
    };
    Found { best: best_html(result, &scenario.site.currency), frontier: frontier_markup(result), summary, scenario }
}

fn progress_words(progress: &Progress) -> String {
    format!("{} of {} configurations", progress.evaluated, progress.total)
}

/// The search section.
#[component]
pub fn SearchPanel(state: AppState) -> impl IntoView {
    let searcher = Searcher {
        state,
        run: StoredValue::new_local(None),
        next_id: StoredValue::new(0),
        status: RwSignal::new(Status::Idle),
        progress: RwSignal::new(None),
        found: RwSignal::new(None),
    };
    let running = move || searcher.status.with(|status| *status == Status::Running);
    let valid = move || state.scenario.with(Result::is_ok);
    // A finished search is shown while the form still describes the scenario it searched.
    let current = Memo::new(move |_| {
        searcher.found.with(|found| {
            found
                .as_ref()
                .filter(|found| state.scenario.with(|s| s.as_ref().is_ok_and(|s| **s == *found.scenario)))
                .cloned()
        })
    });
    let outdated = move || searcher.found.with(Option::is_some) && current.with(Option::is_none);
    let status_words = move || {
        match searcher.status.get() {
        Status::Idle => "Searches the bands, generator classes, belt widths and bed depths around the scenario for the line with the fewest generators.".to_string(),
        Status::Running => "Searching\u{2026}".to_string(),
        Status::Stopped(why) => format!("Stopped: {why}. Nothing is shown for a search that did not finish."),
        Status::Refused(why) => why,
        Status::Done => "Done.".to_string(),
    }
    };
    view! {
        <section class="search-panel" id="search" aria-labelledby="search-panel-title">
            <h2 class="search-panel-title" id="search-panel-title">
                "Search for cheaper lines"
            </h2>
            <div class="search-panel-controls">
                <button
                    type="button"
                    class="search-panel-start"
                    data-testid="search-start"
                    disabled=move || running() || !valid()
                    on:click=move |_| searcher.start()
                >
                    "Start the search"
                </button>
                <button
                    type="button"
                    class="search-panel-cancel"
                    data-testid="search-cancel"
                    disabled=move || !running()
                    on:click=move |_| searcher.cancel("cancelled")
                >
                    "Cancel"
                </button>
                <p class="search-panel-status" data-testid="search-status" role="status">
                    {status_words}
                </p>
            </div>
            {move || {
                searcher
                    .progress
                    .get()
                    .map(|progress| {
                        let words = progress_words(&progress);
                        view! {
                            <div class="search-panel-progress">
                                <progress
                                    data-testid="search-progress"
                                    max=progress.total.max(1).to_string()
                                    value=progress.evaluated.to_string()
                                    aria-label="Search progress"
                                    aria-valuetext=words.clone()
                                >
                                    {words.clone()}
                                </progress>
                                <span data-testid="search-progress-text">{words}</span>
                            </div>
                        }
                    })
            }}
            <Show when=outdated>
                <p class="search-panel-outdated" data-testid="search-outdated">
                    "The scenario has changed since the last search: start it again for results."
                </p>
            </Show>
            <Show when=move || current.with(Option::is_some)>
                <div
                    class="search-panel-summary"
                    inner_html=move || current.with(|f| f.as_ref().map(|f| f.summary.clone()).unwrap_or_default())
                ></div>
                <div
                    class="search-panel-scroll"
                    tabindex="0"
                    role="region"
                    aria-label="Best configurations found"
                    inner_html=move || current.with(|f| f.as_ref().map(|f| f.best.clone()).unwrap_or_default())
                ></div>
                <h3 class="plot-section-title">"Tunnel length against generator count"</h3>
                <figure
                    class="plot-section-figure"
                    inner_html=move || current.with(|f| f.as_ref().map(|f| f.frontier.figure.clone()).unwrap_or_default())
                ></figure>
                <details class="svg-chart-data">
                    <summary data-testid="search-frontier-toggle">
                        "Data table: tunnel length against generator count"
                    </summary>
                    <div
                        class="svg-chart-data-scroll"
                        tabindex="0"
                        role="region"
                        aria-label="Data table of the frontier"
                        inner_html=move || current.with(|f| f.as_ref().map(|f| f.frontier.table.clone()).unwrap_or_default())
                    ></div>
                </details>
            </Show>
        </section>
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::demos::{demo, DEFAULT_DEMO};

    #[test]
    fn a_finished_search_shows_its_best_and_frontier() {
        let scenario = demo(DEFAULT_DEMO).unwrap().scenario().unwrap();
        let result = doubleprime::search::search(&scenario, &SearchSpace::default()).unwrap();
        let found = found_markup(&result, Arc::new(scenario));
        assert!(found.best.contains(r#"data-testid="search-best""#));
        assert_eq!(found.best.matches(r#"data-testid="search-best-row""#).count(), result.best.len());
        assert!(found.frontier.figure.contains("<desc"));
        assert!(found.frontier.table.contains(r#"data-testid="search-frontier""#));
        assert!(found.summary.contains(&result.configurations.to_string()));
    }
}
