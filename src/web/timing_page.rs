//! The page's timing mode, `?timing` (or `?timing=MS`, the time per workload): instead of the app,
//! it runs the core's shared timing workloads (`doubleprime::timing`) inside WebAssembly against
//! `performance.now()` and shows the report as JSON in `#timing-report`, which the browser timing
//! harness (`bash .ci/browser-timing.sh`) reads. Plain DOM, no Leptos: this mode should cost the
//! module as little as possible.
//!
//! In the normal mode it leaves marks for the harness: `doubleprime-wasm-started` when the module
//! starts, `doubleprime-first-plan` once the app is mounted with its first plan in the page, and
//! `doubleprime-first-plan-frame` at the next frame (the boot script adds
//! `doubleprime-module-unpacked`).

use doubleprime::error::range_text;
use doubleprime::timing::time_workloads;
use wasm_bindgen::JsCast;

/// Time per workload when `?timing` gives none, in milliseconds.
const DEFAULT_BUDGET_MS: f64 = 500.0;
const MIN_BUDGET_MS: f64 = 1.0;
const MAX_BUDGET_MS: f64 = 60_000.0;

/// `Some` when the address asks for the timing mode: the budget, or why it was refused.
pub fn requested() -> Option<Result<f64, String>> {
    let search = web_sys::window()?.location().search().ok()?;
    let value = web_sys::UrlSearchParams::new_with_str(&search).ok()?.get("timing")?;
    Some(budget_from(&value))
}

fn budget_from(value: &str) -> Result<f64, String> {
    let value = value.trim();
    if value.is_empty() {
        return Ok(DEFAULT_BUDGET_MS);
    }
    match value.parse::<f64>() {
        Ok(ms) if (MIN_BUDGET_MS..=MAX_BUDGET_MS).contains(&ms) => Ok(ms),
        _ => Err(format!(
            "timing = {value} is not accepted: valid is a time per workload in ms, {}",
            range_text(MIN_BUDGET_MS, MAX_BUDGET_MS)
        )),
    }
}

/// Show the timing page and run the workloads once it has been painted.
pub fn run(requested: Result<f64, String>) {
    let Some(document) = web_sys::window().and_then(|window| window.document()) else { return };
    let Some(body) = document.body() else { return };
    let status = match &requested {
        Ok(ms) => format!("Timing each workload for about {ms} ms in WebAssembly; this takes a few seconds."),
        Err(why) => why.clone(),
    };
    body.set_inner_html(&format!(
        "<main class=\"timing-page\"><h1>Doubleprime timing</h1><p id=\"timing-status\">{}</p>\
         <pre id=\"timing-report\" data-state=\"running\"></pre></main>",
        crate::markup::escape(&status)
    ));
    let Ok(budget_ms) = requested else {
        set_report(&document, "refused", "");
        return;
    };
    // A timeout, so the status line is on screen before the main thread is busy for seconds.
    let callback = wasm_bindgen::closure::Closure::once_into_js(move || time_and_show(budget_ms));
    if let Some(window) = web_sys::window() {
        let _ = window.set_timeout_with_callback_and_timeout_and_arguments_0(callback.unchecked_ref(), 50);
    }
}

fn time_and_show(budget_ms: f64) {
    let Some(window) = web_sys::window() else { return };
    let Some(document) = window.document() else { return };
    let Some(performance) = window.performance() else {
        set_report(&document, "refused", "this browser has no performance clock");
        return;
    };
    match time_workloads("wasm", budget_ms, &|| performance.now()) {
        Ok(report) => {
            let json = serde_json::to_string_pretty(&report).unwrap_or_default();
            set_report(&document, "done", &json);
        }
        Err(problems) => {
            let why: Vec<String> = problems.iter().map(ToString::to_string).collect();
            set_report(&document, "refused", &why.join("; "));
        }
    }
}

fn set_report(document: &web_sys::Document, state: &str, text: &str) {
    if let Some(report) = document.get_element_by_id("timing-report") {
        report.set_text_content(Some(text));
        let _ = report.set_attribute("data-state", state);
    }
    if state == "done" {
        if let Some(status) = document.get_element_by_id("timing-status") {
            status.set_text_content(Some("Done: the report below is JSON, times in ms per run."));
        }
    }
}

/// Leave a named mark on the page's performance timeline, for the timing harness.
pub fn mark(name: &str) {
    if let Some(performance) = web_sys::window().and_then(|window| window.performance()) {
        let _ = performance.mark(name);
    }
}

/// Mark the first plan in the page now, and the frame that shows it.
pub fn mark_first_plan() {
    mark("doubleprime-first-plan");
    let callback = wasm_bindgen::closure::Closure::once_into_js(move || mark("doubleprime-first-plan-frame"));
    if let Some(window) = web_sys::window() {
        let _ = window.request_animation_frame(callback.unchecked_ref());
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_budget_is_read_and_checked() {
        assert_eq!(budget_from(""), Ok(DEFAULT_BUDGET_MS));
        assert_eq!(budget_from(" 250 "), Ok(250.0));
        let refused = budget_from("0").unwrap_err();
        assert!(refused.contains("timing = 0") && refused.contains("60000"), "{refused}");
        assert!(budget_from("fast").is_err());
        assert!(budget_from("NaN").is_err());
    }
}
