//! `doubleprime-web`: the browser face of the computation core, a Leptos app mounted on the page body.
//!
//! Built for wasm32 only with `--features web` (see `.ci/build-web.sh`), which packs it with
//! `index.html` and the styles into one self-contained page. All numbers come from the `doubleprime` library, as in the CLI; the
//! files here only read the form, lay out the page and draw. One file per part of the page.

mod app;
mod band_table;
mod cautions_panel;
mod choice_field;
mod decimal_field;
mod demo_picker;
mod demos;
mod depth_plot;
mod download;
mod error_summary;
mod field_extras;
mod fields;
mod focus;
mod form;
mod form_field;
mod format;
mod markup;
mod material_explorer;
mod penetration_plot;
mod permittivity_plot;
mod plan_status;
mod product_picker;
mod quote_sheet;
mod results_summary;
mod saved_scenarios;
mod scenario_editor;
mod scenario_file;
mod scenario_transfer;
mod search_panel;
mod sensitivity_chart;
mod state;
mod storage;
mod storage_records;
mod svg_chart;
mod text_field;
mod timing_page;
mod warnings_list;
mod zone_plot;

fn main() {
    // Panics show as readable messages in the browser console instead of "unreachable".
    console_error_panic_hook::set_once();
    timing_page::mark("doubleprime-wasm-started");
    if let Some(requested) = timing_page::requested() {
        timing_page::run(requested);
        return;
    }
    leptos::mount::mount_to_body(app::App);
    timing_page::mark_first_plan();
}
