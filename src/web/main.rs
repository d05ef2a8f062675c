//! `doubleprime-web`: the browser face of the computation core, a Leptos app mounted on the page body.
//!
//! Built for wasm32 only with `--features web` (see `.ci/build-web.sh`); `index.html` and
//! `src/web/boot.js` load it. All numbers come from the `doubleprime` library, as in the CLI.

mod app;
mod decimal_field;

fn main() {
    // Panics show as readable messages in the browser console instead of "unreachable".
    console_error_panic_hook::set_once();
    leptos::mount::mount_to_body(app::App);
}
