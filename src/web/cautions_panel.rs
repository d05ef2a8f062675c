//! The safety cautions that go with every line: exposure and leakage, high voltage, interlocks,
//! arcing and fire, thermal runaway, broken tube insulators, and deferring to local codes.

use crate::markup::escape;
use crate::state::AppState;
use doubleprime::safety::{cautions, Caution};
use leptos::prelude::*;
use std::fmt::Write;

/// Frequency and supply voltage of the cautions shown before any plan exists, MHz and kV.
const FALLBACK_FREQ_MHZ: f64 = 915.0;
const FALLBACK_KV: f64 = 20.0;

fn cautions_html(list: &[Caution]) -> String {
    let mut out = String::from(r#"<ul class="cautions-panel-items">"#);
    for caution in list {
        let _ = write!(
            out,
            r#"<li class="cautions-panel-item" data-testid="caution" data-code="{}"><h3 class="cautions-panel-heading">{}</h3><p class="cautions-panel-text">{}</p></li>"#,
            caution.code,
            escape(caution.title),
            escape(&caution.text)
        );
    }
    out.push_str("</ul>");
    out
}

/// The cautions of the plan shown (they depend on its band and generator voltage).
#[component]
pub fn CautionsPanel(state: AppState) -> impl IntoView {
    let markup = Memo::new(move |_| {
        state
            .shown
            .with(|shown| shown.as_ref().map(|shown| cautions_html(&shown.plan.cautions)))
            .unwrap_or_else(|| cautions_html(&cautions(FALLBACK_FREQ_MHZ, FALLBACK_KV, true)))
    });
    view! {
        <section class="cautions-panel" id="safety" aria-labelledby="cautions-panel-title" tabindex="-1">
            <h2 class="cautions-panel-title" id="cautions-panel-title">
                "Safety cautions"
            </h2>
            <p class="cautions-panel-lead">
                "Microwave and RF heating lines carry lethal voltages and radiate energy that burns. These notes go with every plan; they are reference points for planning, not a compliance check. Applicable standards, local regulations and licensed practice prevail."
            </p>
            <div class="cautions-panel-body" inner_html=move || markup.get()></div>
        </section>
    }
}
