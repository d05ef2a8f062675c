//! The page: power penetration depth of a plane wave into one material, recomputed as the user types.
//!
//! Scaffolding for the planner to come. It exercises the whole path on one number: Leptos
//! mounted, the form text parsed, the core computing in WebAssembly, its errors shown as written.

use crate::decimal_field::{parse_decimal, DecimalField};
use doubleprime::error::InputError;
use doubleprime::physics::permittivity::ComplexPermittivity;
use doubleprime::physics::waves::{checked_frequency_hz, wave_properties, WaveProperties};
use leptos::prelude::*;

/// The values the page opens with: water at 2450 MHz, eps* = 78 - j13.4, so Dp is about 12.9 mm.
const START_FREQ_MHZ: &str = "2450";
const START_EPS_REAL: &str = "78";
const START_EPS_IMAG: &str = "13.4";

/// The whole page.
#[component]
pub fn App() -> impl IntoView {
    let freq_mhz_text = RwSignal::new(START_FREQ_MHZ.to_string());
    let eps_real_text = RwSignal::new(START_EPS_REAL.to_string());
    let eps_imag_text = RwSignal::new(START_EPS_IMAG.to_string());
    let waves =
        Memo::new(move |_| waves_from_text(&freq_mhz_text.read(), &eps_real_text.read(), &eps_imag_text.read()));
    let depth = move || match waves.get() {
        Ok(props) => depth_text(props.penetration_depth_m),
        Err(_) => "not computed".to_string(),
    };
    let problems = move || {
        waves
            .get()
            .err()
            .unwrap_or_default()
            .into_iter()
            .map(|problem| view! { <li>{problem.to_string()}</li> })
            .collect_view()
    };

    view! {
        <header class="app-header">
            <h1 class="app-title">"Doubleprime"</h1>
            <p class="app-tagline">"Planning microwave and RF dielectric heating lines"</p>
        </header>
        <main class="app-main">
            {requested_demo()
                .map(|name| {
                    view! {
                        <p class="app-demo" data-testid="demo-name">
                            "Demo load requested: " <strong>{name}</strong>
                            ". Demo loads open in the planner, which is not part of this page yet."
                        </p>
                    }
                })}
            <section class="depth-probe">
                <h2 class="depth-probe-title">"Power penetration depth"</h2>
                <p class="depth-probe-note">
                    "Depth at which a plane wave's power has fallen to 1/e inside the material."
                </p>
                <form class="depth-probe-form" on:submit=|event| event.prevent_default()>
                    <DecimalField label="Frequency, MHz" testid="freq-mhz" text=freq_mhz_text />
                    <DecimalField
                        label="Dielectric constant \u{3b5}\u{2032}"
                        testid="eps-real"
                        text=eps_real_text
                    />
                    <DecimalField
                        label="Loss factor \u{3b5}\u{2033}"
                        testid="eps-imag"
                        text=eps_imag_text
                    />
                </form>
                <p class="depth-probe-result">
                    "D" <sub>"p"</sub> " = "
                    <output class="depth-probe-value" data-testid="penetration-depth">
                        {depth}
                    </output>
                </p>
                <ul class="depth-probe-problems" data-testid="input-problems" role="alert">
                    {problems}
                </ul>
            </section>
        </main>
    }
}

/// Parses the three fields and computes the wave properties, or lists every field problem found.
fn waves_from_text(
    freq_mhz_text: &str,
    eps_real_text: &str,
    eps_imag_text: &str,
) -> Result<WaveProperties, Vec<InputError>> {
    let frequency_hz = read_number("freq_mhz", freq_mhz_text).and_then(checked_frequency_hz);
    let permittivity = match (read_number("eps_real", eps_real_text), read_number("eps_imag", eps_imag_text)) {
        (Ok(eps_real), Ok(eps_imag)) => {
            ComplexPermittivity::checked(eps_real, eps_imag).map_err(|problem| vec![problem])
        }
        (eps_real, eps_imag) => Err(eps_real.err().into_iter().chain(eps_imag.err()).collect()),
    };
    match (frequency_hz, permittivity) {
        (Ok(frequency_hz), Ok(permittivity)) => Ok(wave_properties(frequency_hz, permittivity)),
        (frequency_hz, permittivity) => {
            Err(frequency_hz.err().into_iter().chain(permittivity.err().into_iter().flatten()).collect())
        }
    }
}

/// A field's text as a number, or an error naming the field the way the core does.
fn read_number(field: &str, text: &str) -> Result<f64, InputError> {
    parse_decimal(text).ok_or_else(|| InputError::new(field, format!("{:?}", text.trim()), "a number (13.4 or 13,4)"))
}

/// A depth in metres as three significant figures: in m from 1 m, in µm below 1 mm, else in mm.
fn depth_text(depth_m: Option<f64>) -> String {
    match depth_m {
        None => "unlimited (lossless material)".to_string(),
        Some(depth_m) if depth_m >= 1.0 => format!("{} m", three_significant(depth_m)),
        Some(depth_m) if depth_m >= 1e-3 => format!("{} mm", three_significant(depth_m * 1e3)),
        Some(depth_m) => format!("{} \u{b5}m", three_significant(depth_m * 1e6)),
    }
}

fn three_significant(value: f64) -> String {
    // Digits before the point: 12.88 has 2, so it keeps 1 decimal.
    let integer_digits = value.abs().log10().floor() as i32 + 1;
    let decimals = (3 - integer_digits).max(0) as usize;
    format!("{value:.decimals$}")
}

/// The `demo` query parameter (`?demo=NAME`), if the address has a non-empty one.
fn requested_demo() -> Option<String> {
    let search = web_sys::window()?.location().search().ok()?;
    let params = web_sys::UrlSearchParams::new_with_str(&search).ok()?;
    params.get("demo").filter(|name| !name.trim().is_empty())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn opening_values_give_water_depth() {
        let props = waves_from_text(START_FREQ_MHZ, START_EPS_REAL, START_EPS_IMAG).unwrap();
        assert_eq!(depth_text(props.penetration_depth_m), "12.9 mm");
    }

    #[test]
    fn every_bad_field_is_reported() {
        let problems = waves_from_text("-5", "abc", "13,4").unwrap_err();
        let fields: Vec<_> = problems.iter().map(|p| p.field.as_str()).collect();
        assert_eq!(fields, ["freq_mhz", "eps_real"]);
    }

    #[test]
    fn depth_units_follow_magnitude() {
        assert_eq!(depth_text(Some(1.2345)), "1.23 m");
        assert_eq!(depth_text(Some(0.5)), "500 mm");
        assert_eq!(depth_text(Some(2.5e-4)), "250 \u{b5}m");
        assert_eq!(depth_text(None), "unlimited (lossless material)");
    }
}
