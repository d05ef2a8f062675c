//! Opening one of the demo loads, which replaces everything in the form.

use crate::demos::{demo, DEMOS};
use crate::form::FormValues;
use crate::state::AppState;
use leptos::prelude::*;

/// A list of the demo loads and a button to open the one chosen.
#[component]
pub fn DemoPicker(
    /// The page state.
    state: AppState,
    /// The demo the page opened with.
    opened: &'static str,
) -> impl IntoView {
    let choice = RwSignal::new(opened.to_string());
    let description = move || {
        choice.with(|name| demo(name).and_then(|d| d.scenario().ok()).map(|s| s.description).unwrap_or_default())
    };
    let open = move |_| {
        let name = choice.get_untracked();
        match demo(&name).map(|d| d.scenario()) {
            Some(Ok(scenario)) => {
                state.form.load(&FormValues::from_scenario(&scenario));
                state.notice.set(Some(format!("Opened the demo load \u{201c}{}\u{201d}.", scenario.name)));
            }
            Some(Err(problems)) => state.notice.set(Some(format!(
                "The demo load {name} could not be read: {}",
                problems.iter().map(ToString::to_string).collect::<Vec<_>>().join("; ")
            ))),
            None => state.notice.set(Some(format!("There is no demo load called {name}."))),
        }
    };
    let options = DEMOS
        .iter()
        .map(|d| {
            let name = d.name;
            view! {
                <option value=name prop:selected=move || choice.with(|c| c == name)>
                    {d.title()}
                </option>
            }
        })
        .collect_view();
    view! {
        <div class="demo-picker">
            <label class="demo-picker-label" for="demo-picker-select">
                "Start from a demo load"
            </label>
            <div class="demo-picker-row">
                <select
                    id="demo-picker-select"
                    class="demo-picker-select"
                    data-testid="demo-select"
                    aria-describedby="demo-picker-description"
                    on:change=move |event| choice.set(event_target_value(&event))
                >
                    {options}
                </select>
                <button type="button" class="demo-picker-open" data-testid="demo-open" on:click=open>
                    "Open"
                </button>
            </div>
            <p class="demo-picker-description" id="demo-picker-description">
                {description} " Opening replaces every field."
            </p>
        </div>
    }
}
