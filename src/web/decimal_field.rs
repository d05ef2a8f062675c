//! A labelled text field for one decimal number, kept as typed so that a half-typed `2,` survives.

use leptos::prelude::*;

/// One number input. The text stays a string in `text`; the caller parses it with
/// [`parse_decimal`], so the field never rewrites what the person is typing.
#[component]
pub fn DecimalField(
    /// Visible label, with the unit.
    label: &'static str,
    /// `data-testid` of the input, for the browser tests.
    testid: &'static str,
    /// The text as typed.
    text: RwSignal<String>,
) -> impl IntoView {
    view! {
        <label class="decimal-field">
            <span class="decimal-field-label">{label}</span>
            // A text input rather than type="number": number inputs refuse a decimal comma in
            // many locales and report half-typed values as empty.
            <input
                class="decimal-field-input"
                type="text"
                inputmode="decimal"
                autocomplete="off"
                spellcheck="false"
                data-testid=testid
                prop:value=move || text.get()
                on:input=move |event| text.set(event_target_value(&event))
            />
        </label>
    }
}

/// Reads a decimal number as a person types it: surrounding spaces are ignored and one decimal
/// comma is read as a point (`13,4` is 13.4). Text holding both a comma and a point is refused,
/// because `1,234.5` and `1.234,5` mean different things in different places.
pub fn parse_decimal(text: &str) -> Option<f64> {
    let trimmed = text.trim();
    if trimmed.contains(',') && trimmed.contains('.') {
        return None;
    }
    trimmed.replacen(',', ".", 1).parse().ok()
}

#[cfg(test)]
mod tests {
    use super::parse_decimal;

    #[test]
    fn decimal_comma_and_point_read_the_same() {
        assert_eq!(parse_decimal("13,4"), Some(13.4));
        assert_eq!(parse_decimal(" 13.4 "), Some(13.4));
        assert_eq!(parse_decimal("2450"), Some(2450.0));
    }

    #[test]
    fn ambiguous_or_unfinished_text_is_refused() {
        assert_eq!(parse_decimal("1,234.5"), None);
        assert_eq!(parse_decimal("1,2,3"), None);
        assert_eq!(parse_decimal(""), None);
        assert_eq!(parse_decimal("abc"), None);
    }
}
