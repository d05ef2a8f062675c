//! The scenario leaving and entering the page: a JSON file (the core's scenario format), a link
//! that carries the scenario in its `#` fragment, and the zone profiles as CSV.

use crate::download::{download, file_stem, picked_text};
use crate::form::FormValues;
use crate::state::AppState;
use doubleprime::export::zones_csv;
use doubleprime::scenario::link::scenario_to_fragment;
use doubleprime::scenario::parse_scenario;
use leptos::prelude::*;
use wasm_bindgen::JsCast;

/// Largest file the import reads, bytes: a scenario is a few kB.
const IMPORT_BYTES_MAX: f64 = 1_000_000.0;

/// What an imported text does to the form, and the message to show.
pub fn import_text(state: AppState, file_name: &str, text: &str) -> String {
    match parse_scenario(text) {
        Ok(scenario) => {
            state.form.load(&FormValues::from_scenario(&scenario));
            format!("Opened {file_name}. Save it to keep it in this browser.")
        }
        Err(problems) => format!(
            "{file_name} is not a scenario this version reads, so nothing changed: {}",
            problems.iter().map(ToString::to_string).collect::<Vec<_>>().join("; ")
        ),
    }
}

/// The address of this page without its fragment, with `#fragment`.
fn link_to(fragment: &str) -> String {
    let href = web_sys::window().and_then(|w| w.location().href().ok()).unwrap_or_default();
    let base = href.split('#').next().unwrap_or_default();
    format!("{base}#{fragment}")
}

/// Put `text` on the clipboard if the browser offers it; true if it took it.
async fn copy_to_clipboard(text: &str) -> bool {
    let Some(window) = web_sys::window() else { return false };
    let clipboard = js_sys::Reflect::get(&window.navigator(), &"clipboard".into()).unwrap_or_default();
    if clipboard.is_undefined() || clipboard.is_null() {
        return false;
    }
    let Ok(write) =
        js_sys::Reflect::get(&clipboard, &"writeText".into()).and_then(|f| f.dyn_into::<js_sys::Function>())
    else {
        return false;
    };
    let Ok(promise) = write.call1(&clipboard, &text.into()).and_then(|p| p.dyn_into::<js_sys::Promise>()) else {
        return false;
    };
    wasm_bindgen_futures::JsFuture::from(promise).await.is_ok()
}

/// Export, import, link and CSV buttons.
#[component]
pub fn ScenarioTransfer(state: AppState) -> impl IntoView {
    let message = RwSignal::new(None::<String>);
    let link = RwSignal::new(String::new());
    let export = move |_| {
        message.set(Some(match state.scenario.get_untracked() {
            Ok(scenario) => {
                let text = serde_json::to_string_pretty(scenario.as_ref()).unwrap_or_default();
                let file = format!("{}.json", file_stem(&scenario.name));
                match download(&file, "application/json", &text) {
                    Ok(()) => format!("Exported {file}."),
                    Err(why) => why,
                }
            }
            Err(_) => "The form holds problems: fix them before exporting.".to_string(),
        }));
    };
    let import = move |event: web_sys::Event| {
        let Some(input) = event.target().and_then(|t| t.dyn_into::<web_sys::HtmlInputElement>().ok()) else { return };
        leptos::task::spawn_local(async move {
            let shown = match picked_text(&input, IMPORT_BYTES_MAX).await {
                Ok((file_name, text)) => import_text(state, &file_name, &text),
                Err(why) => format!("Nothing was imported: {why}."),
            };
            // Cleared, so picking the same file again imports it again.
            input.set_value("");
            message.set(Some(shown));
        });
    };
    let share = move |_| {
        let Ok(scenario) = state.scenario.get_untracked() else {
            message.set(Some("The form holds problems: fix them before making a link.".to_string()));
            return;
        };
        let address = link_to(&scenario_to_fragment(&scenario));
        link.set(address.clone());
        message.set(Some("The link below opens this scenario: copy it into a mail.".to_string()));
        leptos::task::spawn_local(async move {
            if copy_to_clipboard(&address).await {
                message.set(Some("The link is on the clipboard (and below): paste it into a mail.".to_string()));
            }
        });
    };
    let csv = move |_| {
        let made = state.shown.with_untracked(|shown| {
            shown.as_ref().map(|shown| {
                let file = format!("{}-zones.csv", file_stem(&shown.plan.name));
                download(&file, "text/csv", &zones_csv(&shown.plan)).map(|()| format!("Downloaded {file}."))
            })
        });
        message.set(Some(match made {
            Some(Ok(done)) => done,
            Some(Err(why)) => why,
            None => "There is no plan yet to export.".to_string(),
        }));
    };
    let print = move |_| {
        if let Some(window) = web_sys::window() {
            let _ = window.print();
        }
    };
    view! {
        <details class="scenario-transfer scenario-editor-section" open>
            <summary class="scenario-editor-legend">"Files, link and quote"</summary>
            <div class="scenario-transfer-buttons">
                <button type="button" data-testid="export-json" on:click=export>"Export scenario (JSON)"</button>
                <label class="scenario-transfer-import">
                    "Import scenario (JSON) "
                    <input type="file" accept=".json,application/json" data-testid="import-json" on:change=import />
                </label>
                <button type="button" data-testid="share-link-make" on:click=share>"Copy link"</button>
                <button type="button" data-testid="export-csv" on:click=csv>"Download zone profiles (CSV)"</button>
                <button type="button" data-testid="print-quote" on:click=print>"Print the quote sheet"</button>
            </div>
            <p class="scenario-transfer-message" role="status" data-testid="transfer-message">{move || message.get()}</p>
            <Show when=move || link.with(|l| !l.is_empty())>
                <label class="text-field-label" for="scenario-transfer-link">"Link to this scenario"</label>
                <input id="scenario-transfer-link" class="text-field-input" type="text" readonly data-testid="share-link" prop:value=move || link.get() />
            </Show>
        </details>
    }
}
