//! Looking up one material at one state: eps', eps'', loss tangent, penetration depth,
//! reflectance, the data points used and their sources.

use crate::decimal_field::{parse_decimal, DecimalField};
use crate::format::{exact, length, percent, sig};
use crate::markup::escape;
use crate::state::AppState;
use doubleprime::error::InputError;
use doubleprime::materials::{library, permittivity, MaterialState, PermittivityLookup};
use doubleprime::physics::waves::{checked_frequency_hz, wave_properties, WaveProperties};
use doubleprime::plan::band_comparison::COMPARED_BANDS_MHZ;
use leptos::prelude::*;
use std::fmt::Write;

/// One lookup and what follows from it.
#[derive(Debug, Clone, PartialEq)]
pub struct Exploration {
    /// Material label.
    pub label: String,
    /// The permittivity and how it was found.
    pub lookup: PermittivityLookup,
    /// Waves at that permittivity.
    pub waves: WaveProperties,
    /// Share of the water frozen.
    pub frozen_fraction: Option<f64>,
}

fn read(field: &str, text: &str) -> Result<f64, InputError> {
    parse_decimal(text).ok_or_else(|| {
        InputError::new(field, format!("\u{201c}{}\u{201d}", text.trim()), "a number such as 12.5 or 12,5")
    })
}

fn read_optional(field: &str, text: &str) -> Result<Option<f64>, InputError> {
    if text.trim().is_empty() {
        Ok(None)
    } else {
        read(field, text).map(Some)
    }
}

/// Look `name` up at the typed state; every problem at once.
pub fn explore(
    name: &str,
    freq_text: &str,
    temp_text: &str,
    moisture_text: &str,
    salt_text: &str,
) -> Result<Exploration, Vec<InputError>> {
    let material = library().get(name).ok_or_else(|| vec![doubleprime::materials::library::unknown_material(name)]);
    let frequency_hz = read("freq_mhz", freq_text).and_then(checked_frequency_hz);
    let temp_c = read("temp_c", temp_text);
    let moisture_wb = read_optional("moisture_wb", moisture_text);
    let salt_pct = read_optional("salt_pct", salt_text);
    let (material, frequency_hz, temp_c, moisture_wb, salt_pct) =
        match (material, frequency_hz, temp_c, moisture_wb, salt_pct) {
            (Ok(m), Ok(f), Ok(t), Ok(w), Ok(s)) => (m, f, t, w, s),
            (m, f, t, w, s) => {
                let mut problems = m.err().unwrap_or_default();
                problems.extend(f.err());
                problems.extend(t.err());
                problems.extend(w.err());
                problems.extend(s.err());
                return Err(problems);
            }
        };
    let state = MaterialState { temp_c, moisture_wb, salt_pct };
    let problems = state.problems();
    if !problems.is_empty() {
        return Err(problems);
    }
    let lookup = permittivity(material, frequency_hz, &state).map_err(|e| vec![e])?;
    let waves = wave_properties(frequency_hz, lookup.eps);
    let frozen_fraction = material.frozen_fraction_at(temp_c, moisture_wb).ok();
    Ok(Exploration { label: material.label.clone(), lookup, waves, frozen_fraction })
}

fn field_error(result: Memo<Result<Exploration, Vec<InputError>>>, field: &'static str) -> Signal<Option<String>> {
    Signal::derive(move || {
        result.with(|r| {
            r.as_ref().err().and_then(|problems| {
                problems
                    .iter()
                    .find(|p| p.field == field)
                    .map(|p| format!("{} is not accepted: valid is {}.", p.value, p.valid))
            })
        })
    })
}

fn figure(out: &mut String, label: &str, testid: &str, value: f64, text: &str) {
    let _ = write!(
        out,
        r#"<div class="material-explorer-item"><dt>{}</dt><dd data-testid="explorer-{testid}" data-value="{}">{}</dd></div>"#,
        escape(label),
        exact(value),
        escape(text)
    );
}

fn exploration_html(result: &Result<Exploration, Vec<InputError>>) -> String {
    let found = match result {
        Err(problems) => {
            return format!(
                r#"<p class="material-explorer-problem" data-testid="explorer-problem">{}</p>"#,
                escape(&problems.iter().map(ToString::to_string).collect::<Vec<_>>().join("; "))
            )
        }
        Ok(found) => found,
    };
    let eps = found.lookup.eps;
    let waves = &found.waves;
    let depth = |d: Option<f64>| d.map_or_else(|| "unlimited (lossless)".to_string(), length);
    let mut out = String::from(r#"<dl class="material-explorer-figures">"#);
    figure(&mut out, "Dielectric constant ε′", "eps_real", eps.eps_real, &sig(eps.eps_real, 4));
    figure(&mut out, "Loss factor ε″", "eps_imag", eps.eps_imag, &sig(eps.eps_imag, 4));
    figure(&mut out, "Loss tangent tan δ", "loss_tangent", waves.loss_tangent, &sig(waves.loss_tangent, 3));
    let dp = waves.penetration_depth_m;
    figure(&mut out, "Penetration depth Dp", "penetration_depth", dp.unwrap_or(f64::INFINITY), &depth(dp));
    let dp_low = waves.penetration_depth_low_loss_m;
    figure(
        &mut out,
        "Dp, low-loss formula",
        "penetration_depth_low_loss",
        dp_low.unwrap_or(f64::INFINITY),
        &depth(dp_low),
    );
    let half = waves.half_power_depth_m;
    figure(&mut out, "Half-power depth", "half_power_depth", half.unwrap_or(f64::INFINITY), &depth(half));
    figure(
        &mut out,
        "Wavelength in the material",
        "wavelength",
        waves.wavelength_in_material_m,
        &length(waves.wavelength_in_material_m),
    );
    figure(
        &mut out,
        "Reflectance from air, normal incidence",
        "reflectance",
        waves.reflectance_normal,
        &percent(waves.reflectance_normal, 3),
    );
    if let Some(frozen) = found.frozen_fraction {
        figure(&mut out, "Water frozen", "frozen_fraction", frozen, &percent(frozen, 3));
    }
    out.push_str("</dl>");
    if found.lookup.in_range {
        out.push_str(r#"<p class="material-explorer-in-range" data-testid="explorer-in-range">Inside the range of the data or model.</p>"#);
    } else {
        out.push_str(r#"<div class="material-explorer-out-of-range" data-testid="explorer-in-range"><p>Outside the data: the value is extrapolated.</p><ul>"#);
        for message in &found.lookup.out_of_range {
            let _ = write!(out, "<li>{}</li>", escape(message));
        }
        out.push_str("</ul></div>");
    }
    let _ = write!(
        out,
        r#"<p class="material-explorer-model"><strong>Model: </strong>{}</p><p class="material-explorer-source" data-testid="explorer-source"><strong>Source: </strong>{}</p>"#,
        escape(&found.lookup.model),
        escape(&found.lookup.source)
    );
    if !found.lookup.notes.is_empty() {
        out.push_str(r#"<ul class="material-explorer-notes">"#);
        for note in &found.lookup.notes {
            let _ = write!(out, "<li>{}</li>", escape(note));
        }
        out.push_str("</ul>");
    }
    if !found.lookup.points_used.is_empty() {
        out.push_str(r#"<div class="material-explorer-points" tabindex="0" role="region" aria-label="Data points used"><table class="svg-chart-table"><caption>Data points used, with their weights</caption><thead><tr><th scope="col">MHz</th><th scope="col">°C</th><th scope="col">Moisture</th><th scope="col">ε′</th><th scope="col">ε″</th><th scope="col">Weight</th><th scope="col">Source</th></tr></thead><tbody>"#);
        for p in &found.lookup.points_used {
            let _ = write!(
                out,
                "<tr><td>{}</td><td>{}</td><td>{}</td><td>{}</td><td>{}</td><td>{}</td><td>{}</td></tr>",
                sig(p.freq_mhz, 4),
                sig(p.temp_c, 3),
                p.moisture_wb.map_or_else(|| "\u{2014}".to_string(), |w| sig(w, 3)),
                sig(p.eps_real, 4),
                sig(p.eps_imag, 4),
                percent(p.weight, 3),
                escape(&p.source)
            );
        }
        out.push_str("</tbody></table></div>");
    }
    out
}

/// The explorer section.
#[component]
pub fn MaterialExplorer(state: AppState) -> impl IntoView {
    let start = state.shown.with_untracked(|shown| {
        shown.as_ref().map(|s| {
            (
                s.scenario.product.library.clone().unwrap_or_else(|| "water".into()),
                format!("{}", s.plan.frequency_mhz),
                format!("{}", s.scenario.inlet.temp_c),
            )
        })
    });
    let (start_name, start_freq, start_temp) = start.unwrap_or_else(|| ("water".into(), "2450".into(), "20".into()));
    let material = RwSignal::new(start_name);
    let freq = RwSignal::new(start_freq);
    let temp = RwSignal::new(start_temp);
    let moisture = RwSignal::new(String::new());
    let salt = RwSignal::new(String::new());
    let result = Memo::new(move |_| explore(&material.get(), &freq.get(), &temp.get(), &moisture.get(), &salt.get()));
    let use_plan = move |_| {
        state.shown.with_untracked(|shown| {
            if let Some(s) = shown {
                if let Some(name) = &s.scenario.product.library {
                    material.set(name.clone());
                }
                freq.set(format!("{}", s.plan.frequency_mhz));
                temp.set(format!("{}", s.scenario.inlet.temp_c));
                moisture.set(format!("{}", s.plan.assumptions.inlet_moisture_wb));
            }
        })
    };
    let mut categories: Vec<&'static str> = Vec::new();
    for m in library() {
        if !categories.contains(&m.category.as_str()) {
            categories.push(m.category.as_str());
        }
    }
    let options = categories
        .into_iter()
        .map(|category| {
            let items = library()
                .iter()
                .filter(|m| m.category.as_str() == category)
                .map(|m| {
                    let name = m.name.clone();
                    let selected_name = name.clone();
                    view! {
                        <option value=name prop:selected=move || material.with(|c| *c == selected_name)>
                            {m.label.clone()}
                        </option>
                    }
                })
                .collect_view();
            view! { <optgroup label=category>{items}</optgroup> }
        })
        .collect_view();
    let bands = COMPARED_BANDS_MHZ
        .iter()
        .map(|&band| {
            let text = format!("{band}");
            view! {
                <button type="button" class="material-explorer-band" on:click=move |_| freq.set(text.clone())>
                    {format!("{band} MHz")}
                </button>
            }
        })
        .collect_view();
    let output = Memo::new(move |_| result.with(exploration_html));
    view! {
        <section class="material-explorer" id="materials" aria-labelledby="material-explorer-title">
            <h2 class="material-explorer-title" id="material-explorer-title">
                "Material explorer"
            </h2>
            <p class="material-explorer-lead">
                "Any library material at any frequency and state, apart from the plan."
            </p>
            <div class="material-explorer-form">
                <div class="choice-field">
                    <label class="choice-field-label" for="explorer-material">
                        "Material"
                    </label>
                    <select
                        id="explorer-material"
                        class="choice-field-input"
                        data-testid="explorer-material"
                        on:change=move |event| material.set(event_target_value(&event))
                    >
                        {options}
                    </select>
                </div>
                <DecimalField
                    id="explorer-freq".into()
                    label="Frequency, MHz".into()
                    hint="Valid: more than 0, at most 300\u{202f}000.".into()
                    testid="explorer-freq_mhz".into()
                    text=freq
                    error=field_error(result, "freq_mhz")
                />
                <DecimalField
                    id="explorer-temp".into()
                    label="Temperature, \u{b0}C".into()
                    hint="Valid: \u{2212}60 to 300.".into()
                    testid="explorer-temp_c".into()
                    text=temp
                    error=field_error(result, "temp_c")
                />
                <DecimalField
                    id="explorer-moisture".into()
                    label="Moisture, wet basis, kg/kg".into()
                    hint="Valid: 0 to 0.95. Blank: the material's own.".into()
                    testid="explorer-moisture_wb".into()
                    text=moisture
                    error=field_error(result, "moisture_wb")
                />
                <DecimalField
                    id="explorer-salt".into()
                    label="Salt, % by mass".into()
                    hint="Valid: 0 to 26. Blank: the material's own.".into()
                    testid="explorer-salt_pct".into()
                    text=salt
                    error=field_error(result, "salt_pct")
                />
            </div>
            <div class="material-explorer-bands" role="group" aria-label="Set the frequency to a heating band">
                {bands}
                <button type="button" class="material-explorer-use-plan" on:click=use_plan>
                    "Use the plan's product and inlet state"
                </button>
            </div>
            <div class="material-explorer-output" inner_html=move || output.get()></div>
        </section>
    }
}
