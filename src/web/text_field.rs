//! A labelled free-text field (titles, project fields, the currency), single line or several.

use leptos::prelude::*;

/// One text input or text area, with its hint and error tied to it.
#[component]
pub fn TextField(
    /// Element id of the input.
    id: String,
    /// Visible label.
    label: String,
    /// What is accepted.
    hint: String,
    /// `data-testid` of the input.
    testid: String,
    /// The text as typed.
    text: RwSignal<String>,
    /// Why the text is refused, if it is.
    error: Signal<Option<String>>,
    /// A text area of this many rows instead of one line (0: one line).
    #[prop(default = 0)]
    rows: u32,
) -> impl IntoView {
    let hint_id = format!("{id}-hint");
    let error_id = format!("{id}-error");
    let described_by = format!("{hint_id} {error_id}");
    let error_testid = format!("error-{}", testid.trim_start_matches("input-"));
    let invalid = move || error.with(Option::is_some);
    let on_input = move |event: leptos::ev::Event| text.set(event_target_value(&event));
    let input = match rows {
        1.. => view! {
            <textarea
                id=id.clone()
                class="text-field-input"
                rows=rows
                data-testid=testid
                aria-describedby=described_by
                aria-invalid=move || if invalid() { "true" } else { "false" }
                prop:value=move || text.get()
                on:input=on_input
            ></textarea>
        }
        .into_any(),
        0 => view! {
            <input
                id=id.clone()
                class="text-field-input"
                type="text"
                data-testid=testid
                aria-describedby=described_by
                aria-invalid=move || if invalid() { "true" } else { "false" }
                prop:value=move || text.get()
                on:input=on_input
            />
        }
        .into_any(),
    };
    view! {
        <div class="text-field" class:text-field-invalid=invalid>
            <label class="text-field-label" for=id>
                {label}
            </label>
            {input}
            <p class="text-field-hint" id=hint_id>
                {hint}
            </p>
            <p class="text-field-error" id=error_id data-testid=error_testid>
                {move || error.get()}
            </p>
        </div>
    }
}
