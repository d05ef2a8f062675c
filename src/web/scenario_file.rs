//! The scenario as the JSON the command-line tool reads, and pasting one in to open it.

use crate::form::FormValues;
use crate::state::AppState;
use doubleprime::scenario::parse_scenario;
use leptos::prelude::*;

/// The scenario file: shown, and openable from pasted text.
#[component]
pub fn ScenarioFile(state: AppState) -> impl IntoView {
    let pasted = RwSignal::new(String::new());
    let json = move || {
        state.scenario.with(|scenario| match scenario {
            Ok(scenario) => serde_json::to_string_pretty(scenario.as_ref()).unwrap_or_default(),
            Err(_) => "The form holds problems: fix them to see the scenario file.".to_string(),
        })
    };
    let open = move |_| {
        let text = pasted.get_untracked();
        match parse_scenario(&text) {
            Ok(scenario) => {
                let dropped = !scenario.generator.extra_classes.is_empty();
                state.form.load(&FormValues::from_scenario(&scenario));
                pasted.set(String::new());
                state.notice.set(Some(if dropped {
                    "Opened the pasted scenario. Its extra generator classes are not kept: the form offers the built-in catalogue only.".to_string()
                } else {
                    "Opened the pasted scenario.".to_string()
                }));
            }
            Err(problems) => state.notice.set(Some(format!(
                "The pasted text is not a scenario this version reads: {}",
                problems.iter().map(ToString::to_string).collect::<Vec<_>>().join("; ")
            ))),
        }
    };
    view! {
        <details class="scenario-file scenario-editor-section">
            <summary class="scenario-editor-legend">"Scenario file (JSON)"</summary>
            <p class="scenario-file-note">
                "The same file " <code>"doubleprime plan FILE.json"</code> " reads. Copy it to keep the scenario; paste one below to open it."
            </p>
            <pre class="scenario-file-json" data-testid="scenario-json" tabindex="0" aria-label="Scenario file">
                {json}
            </pre>
            <label class="text-field-label" for="scenario-file-paste">
                "Paste a scenario file"
            </label>
            <textarea
                id="scenario-file-paste"
                class="text-field-input"
                rows="4"
                data-testid="scenario-paste"
                prop:value=move || pasted.get()
                on:input=move |event| pasted.set(event_target_value(&event))
            ></textarea>
            <button type="button" class="scenario-file-open" data-testid="scenario-paste-open" on:click=open>
                "Open the pasted scenario"
            </button>
        </details>
    }
}
