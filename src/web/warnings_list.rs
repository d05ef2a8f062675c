//! The plan's warnings: a heading per warning, the core's explanation of what is weak and what to
//! change, and a button that takes the keyboard to the field to change.

use crate::fields::Key;
use crate::focus::focus_field;
use crate::markup::{escape, event_data};
use crate::state::AppState;
use leptos::prelude::*;
use std::fmt::Write;

/// A short heading for a warning code, and the field most worth changing for it.
pub fn warning_meaning(code: &str) -> (&'static str, Option<Key>) {
    match code {
        "outside_ism_band" => ("Frequency outside the ISM bands", Some(Key::Frequency)),
        "material_data_out_of_range" => ("Beyond the material data", Some(Key::Library)),
        "bed_deeper_than_penetration" => ("Bed deeper than the energy reaches", Some(Key::BedDepth)),
        "core_lags" => ("The core of the bed lags", Some(Key::BedDepth)),
        "runaway_risk" => ("Risk of thermal runaway", Some(Key::OutletTemp)),
        "generator_lightly_loaded" => ("Generators lightly loaded", Some(Key::GeneratorClass)),
        "generator_below_stable_minimum" => ("Generators below their stable minimum", Some(Key::GeneratorClass)),
        "arcing_risk" => ("Field strong enough to arc", Some(Key::BeltWidth)),
        "low_loss_product" => ("The product couples poorly", Some(Key::EffApplicator)),
        "coupling_below_assumed" => ("Applicator efficiency looks optimistic", Some(Key::EffApplicator)),
        "long_tunnel" => ("A very long tunnel", Some(Key::BeltWidth)),
        "tempering_too_close_to_thaw" => ("Tempering too close to thawing", Some(Key::OutletTemp)),
        "thawing_not_complete" => ("Thawing not complete", Some(Key::OutletTemp)),
        "single_generator" => ("One generator carries the line", Some(Key::Redundancy)),
        _ => ("Worth a look", None),
    }
}

/// The heading alone.
pub fn warning_heading(code: &str) -> &'static str {
    warning_meaning(code).0
}

/// A button (inside markup) that moves the focus to `key`'s field; see [`focus_from_event`].
pub fn focus_button(class: &str, key: Key, text: &str) -> String {
    format!(r#"<button type="button" class="{class}" data-focus="{}">{}</button>"#, key.spec().field, escape(text))
}

/// The handler for a container of [`focus_button`]s.
pub fn focus_from_event(event: &web_sys::Event) {
    if let Some(key) = event_data(event, "data-focus").and_then(|field| Key::for_error_field(&field)) {
        focus_field(key);
    }
}

/// The list of warnings of the plan shown.
#[component]
pub fn WarningsList(state: AppState) -> impl IntoView {
    let markup = Memo::new(move |_| {
        state.shown.with(|shown| {
            let Some(shown) = shown else { return String::new() };
            let warnings = &shown.plan.warnings;
            if warnings.is_empty() {
                return r#"<p class="warnings-list-none" data-testid="warnings-none">No warnings: nothing in this plan looks weak.</p>"#.to_string();
            }
            let count = warnings.len();
            let mut out = format!(
                r#"<p class="warnings-list-count">{count} warning{}</p><ul class="warnings-list-items">"#,
                if count == 1 { "" } else { "s" }
            );
            for warning in warnings {
                let (heading, key) = warning_meaning(warning.code);
                let _ = write!(
                    out,
                    r#"<li class="warnings-list-item" data-testid="warning" data-code="{}"><h3 class="warnings-list-heading">{}</h3><p class="warnings-list-message">{}</p>{}</li>"#,
                    warning.code,
                    escape(heading),
                    escape(&warning.message),
                    key.map(|key| focus_button("warnings-list-go", key, &format!("Change {}", key.spec().label.to_lowercase())))
                        .unwrap_or_default()
                );
            }
            out.push_str("</ul>");
            out
        })
    });
    view! {
        <section class="warnings-list" id="warnings" aria-labelledby="warnings-list-title">
            <h2 class="warnings-list-title" id="warnings-list-title">
                "Warnings"
            </h2>
            <div class="warnings-list-body" on:click=move |event| focus_from_event(&event) inner_html=move || markup.get()></div>
        </section>
    }
}
