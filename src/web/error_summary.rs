//! Every problem with the form at once, each a button to its field; problems the form cannot
//! place (a scenario-wide one) are listed as the core wrote them. Also loading notices.

use crate::fields::Key;
use crate::markup::escape;
use crate::state::{field_message, AppState};
use crate::warnings_list::{focus_button, focus_from_event};
use leptos::prelude::*;
use std::fmt::Write;

/// The problems list above the form.
#[component]
pub fn ErrorSummary(state: AppState) -> impl IntoView {
    let markup = Memo::new(move |_| {
        state.problems.with(|problems| {
            if problems.is_empty() {
                return String::new();
            }
            let count = problems.len();
            let mut out = format!(
                r#"<div class="error-summary" data-testid="error-summary"><h2 class="error-summary-title">{count} problem{} to fix before the plan updates</h2><ul class="error-summary-items">"#,
                if count == 1 { "" } else { "s" }
            );
            for problem in problems {
                match Key::for_error_field(&problem.field) {
                    Some(key) => {
                        let text = format!("{}: {}", key.spec().label, field_message(problem, key.spec()));
                        let _ = write!(out, "<li>{}</li>", focus_button("error-summary-go", key, &text));
                    }
                    None => {
                        let _ = write!(out, r#"<li class="error-summary-general" data-testid="general-problem">{}</li>"#, escape(&problem.to_string()));
                    }
                }
            }
            out.push_str("</ul></div>");
            out
        })
    });
    let notice = move || {
        state.notice.get().map(|text| {
            view! {
                <p class="error-summary-notice" data-testid="notice" role="status">
                    {text} " "
                    <button type="button" class="error-summary-dismiss" on:click=move |_| state.notice.set(None)>
                        "Dismiss"
                    </button>
                </p>
            }
        })
    };
    view! {
        // No live region around the problems: they change with every keystroke, and the plan
        // status in the header already says, politely, when the plan goes out of date.
        <div class="error-summary-area">
            {notice}
            <div on:click=move |event| focus_from_event(&event) inner_html=move || markup.get()></div>
        </div>
    }
}
