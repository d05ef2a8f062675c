//! The page: header with the section links and the plan's headline, the scenario form on the
//! left, the plan and everything derived from it on the right. The one scenario state is made
//! here and handed to every component.

use crate::band_table::BandTable;
use crate::cautions_panel::CautionsPanel;
use crate::demos::{demo, DEFAULT_DEMO, DEMOS};
use crate::depth_plot::DepthPlot;
use crate::form::FormValues;
use crate::material_explorer::MaterialExplorer;
use crate::penetration_plot::PenetrationPlot;
use crate::permittivity_plot::PermittivityPlot;
use crate::plan_status::PlanStatus;
use crate::quote_sheet::QuoteSheet;
use crate::results_summary::ResultsSummary;
use crate::scenario_editor::ScenarioEditor;
use crate::search_panel::SearchPanel;
use crate::sensitivity_chart::SensitivityChart;
use crate::state::AppState;
use crate::warnings_list::WarningsList;
use crate::zone_plot::ZonePlot;
use doubleprime::scenario::link::{scenario_from_fragment, LINK_PREFIX};
use leptos::prelude::*;

/// The whole page.
#[component]
pub fn App() -> impl IntoView {
    let (opened, values, notice) = match linked_form(location_hash().as_deref()) {
        Some((values, notice)) => (DEFAULT_DEMO, values, notice),
        None => opening_form(requested_demo().as_deref()),
    };
    let state = AppState::new(&values, notice);
    let stale = move || state.is_stale();
    after_first_frame(move || state.first_plan_shown.set(true));
    view! {
        <a class="app-skip" href="#scenario-editor-title">
            "Skip to the scenario"
        </a>
        <header class="app-header">
            <div class="app-brand">
                <h1 class="app-title">"Doubleprime"</h1>
                <p class="app-tagline">"Microwave and RF heating lines, planned"</p>
            </div>
            <nav class="app-nav" aria-label="Sections">
                <a href="#scenario">"Scenario"</a>
                <a href="#results">"Plan"</a>
                <a href="#warnings">"Warnings"</a>
                <a href="#profiles">"Profiles"</a>
                <a href="#bands">"Bands"</a>
                <a href="#sensitivity">"Sensitivity"</a>
                <a href="#search">"Cheaper lines"</a>
                <a href="#materials">"Materials"</a>
                <a class="app-nav-safety" href="#safety" data-testid="nav-safety">
                    "Safety"
                </a>
            </nav>
            <PlanStatus state=state />
        </header>
        <div class="app-body">
            <section class="app-editor" id="scenario" aria-label="Scenario form">
                <ScenarioEditor state=state opened=opened />
            </section>
            <main class="app-results" class:app-results-stale=stale id="main">
                <Show when=stale>
                    <p class="app-stale" data-testid="stale-notice">
                        "Out of date: a field in the scenario needs fixing. What follows is the last valid plan."
                    </p>
                </Show>
                <ResultsSummary state=state />
                <WarningsList state=state />
                <section class="app-profiles" id="profiles" aria-labelledby="app-profiles-title">
                    <h2 class="app-profiles-title" id="app-profiles-title">
                        "Profiles"
                    </h2>
                    <ZonePlot state=state />
                    <DepthPlot state=state />
                    <PermittivityPlot state=state />
                    <PenetrationPlot state=state />
                </section>
                <BandTable state=state />
                <SensitivityChart state=state />
                <SearchPanel state=state />
                <MaterialExplorer state=state />
                <CautionsPanel state=state />
                <footer class="app-footer">
                    {format!("Doubleprime {}. ", env!("CARGO_PKG_VERSION"))}
                    "An engineering estimate computed in this browser; nothing leaves it. Design, installation and commissioning follow local codes and are signed off by licensed professionals."
                </footer>
            </main>
        </div>
        <QuoteSheet state=state />
    }
}

/// Run `then` once the first frame is painted: a timeout from inside an animation frame callback
/// runs after that frame. Without a window (native tests) it never runs.
fn after_first_frame(then: impl FnOnce() + 'static) {
    use wasm_bindgen::JsCast;
    let Some(window) = web_sys::window() else { return };
    let after_paint = wasm_bindgen::closure::Closure::once_into_js(move || {
        let later = wasm_bindgen::closure::Closure::once_into_js(then);
        if let Some(window) = web_sys::window() {
            let _ = window.set_timeout_with_callback_and_timeout_and_arguments_0(later.unchecked_ref(), 0);
        }
    });
    let _ = window.request_animation_frame(after_paint.unchecked_ref());
}

/// The form a link opens (`#s1.` and a scenario), with a notice if the link does not read; `None`
/// when the address carries no scenario link.
fn linked_form(hash: Option<&str>) -> Option<(FormValues, Option<String>)> {
    let fragment = hash?.trim_start_matches('#');
    if !fragment.starts_with(LINK_PREFIX) {
        return None;
    }
    Some(match scenario_from_fragment(fragment) {
        Ok(scenario) => (FormValues::from_scenario(&scenario), Some("Opened the scenario in the link.".to_string())),
        Err(problems) => {
            let (_, values, _) = opening_form(None);
            let why = problems.iter().map(ToString::to_string).collect::<Vec<_>>().join("; ");
            (values, Some(format!("The link does not hold a scenario this version reads ({why}); opened the default demo load instead.")))
        }
    })
}

/// The address's `#` fragment, if any.
fn location_hash() -> Option<String> {
    web_sys::window()?.location().hash().ok().filter(|hash| !hash.is_empty())
}

/// The demo to open, the form showing it, and a notice when the address asked for a demo that
/// does not exist.
fn opening_form(requested: Option<&str>) -> (&'static str, FormValues, Option<String>) {
    let (chosen, notice) = match requested {
        Some(name) => match demo(name) {
            Some(found) => (found, None),
            None => (
                demo(DEFAULT_DEMO).unwrap_or(DEMOS[0]),
                Some(format!("There is no demo load called \u{201c}{name}\u{201d}; opened the default one instead.")),
            ),
        },
        None => (demo(DEFAULT_DEMO).unwrap_or(DEMOS[0]), None),
    };
    match chosen.scenario() {
        Ok(scenario) => (chosen.name, FormValues::from_scenario(&scenario), notice),
        // Every demo parses (a unit test says so); should one not, the page still opens.
        Err(_) => (chosen.name, FormValues::blank(), Some(format!("The demo load {} could not be read.", chosen.name))),
    }
}

/// The `demo` query parameter (`?demo=NAME`), if the address has a non-empty one.
fn requested_demo() -> Option<String> {
    let search = web_sys::window()?.location().search().ok()?;
    let params = web_sys::UrlSearchParams::new_with_str(&search).ok()?;
    params.get("demo").filter(|name| !name.trim().is_empty())
}

#[cfg(test)]
mod tests {
    use super::*;
    use doubleprime::scenario::link::scenario_to_fragment;

    #[test]
    fn the_address_picks_the_demo() {
        let (name, values, notice) = opening_form(Some("drying-sand-cores"));
        assert_eq!(name, "drying-sand-cores");
        assert!(notice.is_none());
        assert!(values.to_scenario().is_ok());
        let (name, _, notice) = opening_form(Some("no-such-demo"));
        assert_eq!(name, DEFAULT_DEMO);
        assert!(notice.unwrap().contains("no-such-demo"));
        assert_eq!(opening_form(None).0, DEFAULT_DEMO);
    }

    #[test]
    fn a_link_opens_its_scenario_and_a_bad_one_says_so() {
        let scenario = demo("drying-sand-cores").unwrap().scenario().unwrap();
        let (values, notice) = linked_form(Some(&format!("#{}", scenario_to_fragment(&scenario)))).unwrap();
        assert_eq!(values.to_scenario().unwrap(), scenario);
        assert!(notice.unwrap().contains("in the link"));
        let (values, notice) = linked_form(Some("#s1.@@@")).unwrap();
        assert!(values.to_scenario().is_ok());
        assert!(notice.unwrap().contains("does not hold"));
        assert!(linked_form(Some("#results")).is_none());
        assert!(linked_form(None).is_none());
    }
}
