//! One field of the scenario form, drawn from its description in `fields` and its extras in
//! `field_extras`: a number field, a text field or a select, wired to its text signal and to the
//! problems the core names for it. Every field of the form goes through this one component.

use crate::choice_field::ChoiceField;
use crate::decimal_field::DecimalField;
use crate::field_extras::{choice_options, field_hidden, field_note, text_rows};
use crate::fields::{Key, Kind};
use crate::state::AppState;
use crate::text_field::TextField;
use leptos::prelude::*;

/// The input for `key`.
#[component]
pub fn FormField(
    /// The page state.
    state: AppState,
    /// Which field.
    key: Key,
) -> impl IntoView {
    let spec = key.spec();
    let id = spec.dom_id();
    let testid = format!("input-{}", spec.field);
    let text = state.form.text(key);
    let error = Signal::derive(move || state.field_error(key));
    let note = field_note(state, key);
    let hidden = field_hidden(state, key);
    let field = match spec.kind {
        Kind::Text(_) => view! {
            <TextField id=id label=spec.label_with_unit() hint=spec.hint() testid=testid text=text error=error rows=text_rows(key) />
        }
        .into_any(),
        Kind::Choice => view! { <ChoiceField state=state key=key options=choice_options(state, key) note=note /> }.into_any(),
        Kind::Integer | Kind::Decimal => {
            let inputmode = if spec.kind == Kind::Integer { "numeric" } else { "decimal" };
            view! {
                <DecimalField id=id label=spec.label_with_unit() hint=spec.hint() testid=testid text=text error=error note=note inputmode=inputmode />
            }
            .into_any()
        }
    };
    view! { <div class="form-field" hidden=move || hidden.is_some_and(|hidden| hidden.get())>{field}</div> }
}

/// Every field of `keys`, in order.
pub fn form_fields(state: AppState, keys: &'static [Key]) -> impl IntoView {
    keys.iter().map(|&key| view! { <FormField state=state key=key /> }).collect_view()
}
