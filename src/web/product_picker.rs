//! Choosing the product: a searchable list of the library with each material's category and the
//! range its data covers, or a material described by the user (constant eps', eps'', density and
//! specific heat).

use crate::fields::{plain_number, Key};
use crate::form::{SOURCE_CUSTOM, SOURCE_LIBRARY};
use crate::form_field::form_fields;
use crate::format::{qty, sig};
use crate::state::AppState;
use doubleprime::materials::{library, Material};
use leptos::prelude::*;

/// `[a, b]` as `a–b`, each to three significant figures without trailing zeros (`10–3000`).
pub fn range_text(range: [f64; 2]) -> String {
    let short = |x: f64| {
        if x == 0.0 || !x.is_finite() {
            return plain_number(x);
        }
        let scale = 10f64.powi(2 - x.abs().log10().floor() as i32);
        plain_number((x * scale).round() / scale)
    };
    if (range[1] - range[0]).abs() < 1e-12 {
        short(range[0])
    } else {
        format!("{}\u{2013}{}", short(range[0]), short(range[1]))
    }
}

fn matches(material: &Material, query: &str) -> bool {
    let query = query.trim().to_lowercase();
    query.is_empty()
        || material.label.to_lowercase().contains(&query)
        || material.name.contains(&query)
        || material.category.as_str().contains(&query)
}

/// The product section of the form.
#[component]
pub fn ProductPicker(state: AppState) -> impl IntoView {
    let source = state.form.text(Key::ProductSource);
    let chosen = state.form.text(Key::Library);
    let query = RwSignal::new(String::new());
    let is_custom = move || source.with(|s| s == SOURCE_CUSTOM);
    let library_error = Signal::derive(move || state.field_error(Key::Library));
    let source_radio = move |value: &'static str, label: &'static str, id: &'static str| {
        view! {
            <label class="product-picker-source">
                <input
                    type="radio"
                    name="product-source"
                    id=id
                    value=value
                    data-testid=format!("product-source-{value}")
                    prop:checked=move || source.with(|s| s == value)
                    on:change=move |_| state.form.choose(Key::ProductSource, value.to_string())
                />
                {label}
            </label>
        }
    };
    let rows = move || {
        let query_now = query.get();
        let materials: Vec<&Material> = library().iter().filter(|m| matches(m, &query_now)).collect();
        let shown = materials.len();
        let rows = materials
            .into_iter()
            .map(|material| {
                let name = material.name.clone();
                let checked_name = name.clone();
                let ranges = material.ranges();
                let moisture = ranges.moisture_wb.map_or_else(|| "\u{2014}".to_string(), range_text);
                let radio_id = format!("product-library-{name}");
                view! {
                    <tr class="product-picker-row" class:product-picker-row-chosen=move || chosen.with(|c| *c == checked_name)>
                        <td>
                            <input
                                type="radio"
                                name="product-library"
                                id=radio_id.clone()
                                value=name.clone()
                                data-testid=format!("material-{name}")
                                prop:checked={
                                    let name = name.clone();
                                    move || chosen.with(|c| *c == name)
                                }
                                on:change={
                                    let name = name.clone();
                                    move |_| state.form.choose(Key::Library, name.clone())
                                }
                            />
                            <label for=radio_id>{material.label.clone()}</label>
                        </td>
                        <td>{material.category.as_str()}</td>
                        <td>{range_text(ranges.freq_mhz)}</td>
                        <td>{range_text(ranges.temp_c)}</td>
                        <td>{moisture}</td>
                    </tr>
                }
            })
            .collect_view();
        view! {
            <p class="product-picker-count" aria-live="polite">
                {format!("{shown} of {} materials", library().len())}
            </p>
            <div class="product-picker-list" tabindex="-1">
                <table class="product-picker-table">
                    <caption class="visually-hidden">"Library materials with the range of their data"</caption>
                    <thead>
                        <tr>
                            <th scope="col">"Material"</th>
                            <th scope="col">"Category"</th>
                            <th scope="col">"Data, MHz"</th>
                            <th scope="col">"Data, \u{b0}C"</th>
                            <th scope="col">"Moisture, wb"</th>
                        </tr>
                    </thead>
                    <tbody>{rows}</tbody>
                </table>
            </div>
        }
    };
    let details = move || {
        chosen.with(|name| {
            library().get(name).map(|material| {
                let ranges = material.ranges();
                let nominal = material.nominal_moisture_wb().map(|w| {
                    format!("nominal moisture {} wet basis ({} dry basis)", sig(w, 3), sig(w / (1.0 - w), 3))
                });
                let freezing = material.initial_freezing_point_c().map(|t| format!("freezing from {}", qty(t, 3, "\u{b0}C")));
                let facts: Vec<String> = [
                    Some(material.category.as_str().to_string()),
                    Some(format!("density {}", qty(material.density_kg_per_m3, 4, "kg/m\u{b3}"))),
                    nominal,
                    freezing,
                    Some(format!(
                        "data {} MHz, {} \u{b0}C{}",
                        range_text(ranges.freq_mhz),
                        range_text(ranges.temp_c),
                        ranges.moisture_wb.map_or_else(String::new, |m| format!(", moisture {}", range_text(m)))
                    )),
                ]
                .into_iter()
                .flatten()
                .collect();
                let sources = material
                    .sources
                    .iter()
                    .map(|source| {
                        view! {
                            <li>
                                {source.citation.clone()} ", " {source.locator.clone()} " "
                                <span class="product-picker-confidence">{format!("({})", source.confidence.as_str())}</span>
                            </li>
                        }
                    })
                    .collect_view();
                view! {
                    <div class="product-picker-details" data-testid="product-details">
                        <p class="product-picker-details-title">
                            <strong>{material.label.clone()}</strong> ": " {facts.join("; ")} "."
                        </p>
                        {(!material.notes.is_empty()).then(|| view! { <p class="product-picker-notes">{material.notes.clone()}</p> })}
                        <details class="product-picker-sources">
                            <summary>"Sources"</summary>
                            <ul>{sources}</ul>
                        </details>
                    </div>
                }
            })
        })
    };
    view! {
        <fieldset class="product-picker scenario-editor-section" id="product">
            <legend class="scenario-editor-legend product-picker-legend">"Product"</legend>
            <div class="product-picker-sources-choice" role="radiogroup" aria-label="Product data">
                {source_radio(SOURCE_LIBRARY, "From the library", "field-product")}
                {source_radio(SOURCE_CUSTOM, "Described by me", "product-source-custom")}
            </div>
            <Show when=move || !is_custom()>
                <div class="product-picker-library">
                    <label class="product-picker-search-label" for="field-product-library">
                        "Search the library"
                    </label>
                    <input
                        id="field-product-library"
                        class="product-picker-search"
                        type="search"
                        autocomplete="off"
                        placeholder="name or category, e.g. beef, wood"
                        data-testid="material-search"
                        aria-describedby="field-product-library-error"
                        prop:value=move || query.get()
                        on:input=move |event| query.set(event_target_value(&event))
                    />
                    {rows}
                    <p class="choice-field-error" id="field-product-library-error" data-testid="error-product.library">
                        {move || library_error.get()}
                    </p>
                    {details}
                </div>
            </Show>
            <p class="product-picker-custom-note" hidden=move || !is_custom()>
                "A constant permittivity over all temperatures and frequencies, and a constant specific heat: no freezing, no change with moisture."
            </p>
            <div class="scenario-editor-grid">
                {form_fields(
                    state,
                    &[Key::CustomName, Key::CustomEpsReal, Key::CustomEpsImag, Key::CustomDensity, Key::CustomSpecificHeat, Key::CustomSource, Key::SaltPct],
                )}
            </div>
        </fieldset>
    }
}

#[cfg(test)]
mod tests {
    use super::range_text;

    #[test]
    fn ranges_are_short() {
        assert_eq!(range_text([10.0, 3000.0]), "10\u{2013}3000");
        assert_eq!(range_text([-40.0, 60.0]), "\u{2212}40\u{2013}60");
        assert_eq!(range_text([0.6, 0.8]), "0.6\u{2013}0.8");
        assert_eq!(range_text([0.123456, 0.8]), "0.123\u{2013}0.8");
        assert_eq!(range_text([20.0, 20.0]), "20");
    }
}
