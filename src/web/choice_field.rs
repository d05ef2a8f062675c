//! A labelled select over a list of choices (process, band, generator class, ...).

use crate::fields::Key;
use crate::state::AppState;
use leptos::prelude::*;

/// One choice of the form: `options` are (value, label) pairs; choosing one goes through
/// [`crate::state::FormState::choose`], which keeps the rule between band and generator class.
#[component]
pub fn ChoiceField(
    /// The page state.
    state: AppState,
    /// Which field.
    key: Key,
    /// The choices, (value, label).
    options: Signal<Vec<(String, String)>>,
    /// A remark under the field.
    #[prop(optional_no_strip)]
    note: Option<Signal<String>>,
) -> impl IntoView {
    let spec = key.spec();
    let id = spec.dom_id();
    let note_id = format!("{id}-hint");
    let error_id = format!("{id}-error");
    let text = state.form.text(key);
    let error = Signal::derive(move || state.field_error(key));
    let invalid = move || error.with(Option::is_some);
    view! {
        <div class="choice-field" class:choice-field-invalid=invalid>
            <label class="choice-field-label" for=id.clone()>
                {spec.label_with_unit()}
            </label>
            <select
                id=id
                class="choice-field-input"
                data-testid=format!("input-{}", spec.field)
                aria-describedby=format!("{note_id} {error_id}")
                aria-invalid=move || if invalid() { "true" } else { "false" }
                prop:value=move || text.get()
                on:change=move |event| state.form.choose(key, event_target_value(&event))
            >
                {move || {
                    options
                        .get()
                        .into_iter()
                        .map(|(value, label)| {
                            let selected = text.with(|current| *current == value);
                            view! {
                                <option value=value prop:selected=selected>
                                    {label}
                                </option>
                            }
                        })
                        .collect_view()
                }}
            </select>
            <p class="choice-field-hint" id=note_id>
                {note.map(|note| move || note.get())}
            </p>
            <p class="choice-field-error" id=error_id data-testid=format!("error-{}", spec.field)>
                {move || error.get()}
            </p>
        </div>
    }
}
