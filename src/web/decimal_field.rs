//! A labelled text field for one decimal number, kept as typed so that a half-typed `2,` survives.

use leptos::prelude::*;

/// One number input with its label and unit, its valid range and, when the value is refused, the
/// reason, both tied to the input with `aria-describedby`. The text stays a string in `text`; the
/// form parses it with [`parse_decimal`], so the field never rewrites what the person is typing.
#[component]
pub fn DecimalField(
    /// Element id of the input (the label's `for`).
    id: String,
    /// Visible label, with the unit.
    label: String,
    /// The valid range and what a blank means.
    hint: String,
    /// `data-testid` of the input; the error carries `error-` and the same name.
    testid: String,
    /// The text as typed.
    text: RwSignal<String>,
    /// Why the value is refused, if it is.
    error: Signal<Option<String>>,
    /// A live remark under the field (the dry-basis moisture, the default in use).
    #[prop(optional_no_strip)]
    note: Option<Signal<String>>,
    /// `decimal` for numbers, `numeric` for whole numbers.
    #[prop(default = "decimal")]
    inputmode: &'static str,
) -> impl IntoView {
    let hint_id = format!("{id}-hint");
    let error_id = format!("{id}-error");
    let described_by = format!("{hint_id} {error_id}");
    let error_testid = format!("error-{}", testid.trim_start_matches("input-"));
    let invalid = move || error.with(Option::is_some);
    view! {
        <div class="decimal-field" class:decimal-field-invalid=invalid>
            <label class="decimal-field-label" for=id.clone()>
                {label}
            </label>
            // A text input rather than type="number": number inputs refuse a decimal comma in
            // many locales and report half-typed values as empty.
            <input
                id=id
                class="decimal-field-input"
                type="text"
                inputmode=inputmode
                autocomplete="off"
                spellcheck="false"
                data-testid=testid
                aria-describedby=described_by
                aria-invalid=move || if invalid() { "true" } else { "false" }
                prop:value=move || text.get()
                on:input=move |event| text.set(event_target_value(&event))
            />
            <p class="decimal-field-hint" id=hint_id>
                {hint}
                {note.map(|note| view! { " " <span class="decimal-field-note">{move || note.get()}</span> })}
            </p>
            <p class="decimal-field-error" id=error_id data-testid=error_testid>
                {move || error.get()}
            </p>
        </div>
    }
}

/// Reads a decimal number as a person types it: surrounding spaces are ignored, one decimal
/// comma is read as a point (`13,4` is 13.4), a typographic minus is a minus, and thousands may
/// be set apart with spaces (`12 500`). Text holding both a comma and a point is refused,
/// because `1,234.5` and `1.234,5` mean different things in different places; so are NaN and
/// infinities.
pub fn parse_decimal(text: &str) -> Option<f64> {
    let trimmed: String = text.trim().chars().map(|c| if c == '\u{2212}' { '-' } else { c }).collect();
    if trimmed.contains(',') && trimmed.contains('.') {
        return None;
    }
    let joined = join_thousands(&trimmed)?;
    let value: f64 = joined.replacen(',', ".", 1).parse().ok()?;
    value.is_finite().then_some(value)
}

/// `12 500,5` as `12500,5`: groups after the first must be three digits, and only the last may
/// carry the decimal part. Text without inner spaces comes back unchanged.
fn join_thousands(text: &str) -> Option<String> {
    let groups: Vec<&str> = text.split(|c: char| c.is_whitespace() || c == '\u{202f}').collect();
    if groups.len() == 1 {
        return Some(text.to_string());
    }
    let (first, rest) = groups.split_first()?;
    let first_digits = first.strip_prefix(['-', '+']).unwrap_or(first);
    let first_ok = (1..=3).contains(&first_digits.len()) && first_digits.chars().all(|c| c.is_ascii_digit());
    let rest_ok = rest.iter().enumerate().all(|(index, group)| {
        let is_last = index + 1 == rest.len();
        // Split on a character boundary: the text may hold anything the person typed.
        let split = group.char_indices().nth(3).map_or(group.len(), |(at, _)| at);
        let (digits, tail) = group.split_at(split);
        digits.chars().count() == 3
            && digits.chars().all(|c| c.is_ascii_digit())
            && (tail.is_empty() || is_last && tail.starts_with([',', '.']))
    });
    (first_ok && rest_ok).then(|| groups.concat())
}

#[cfg(test)]
mod tests {
    use super::parse_decimal;

    #[test]
    fn decimal_comma_and_point_read_the_same() {
        assert_eq!(parse_decimal("13,4"), Some(13.4));
        assert_eq!(parse_decimal(" 13.4 "), Some(13.4));
        assert_eq!(parse_decimal("2450"), Some(2450.0));
        assert_eq!(parse_decimal("2,"), Some(2.0));
        assert_eq!(parse_decimal("\u{2212}18"), Some(-18.0));
        assert_eq!(parse_decimal("-18"), Some(-18.0));
    }

    #[test]
    fn thousands_may_be_set_apart() {
        assert_eq!(parse_decimal("12 500"), Some(12500.0));
        assert_eq!(parse_decimal("1 234 567,5"), Some(1234567.5));
        assert_eq!(parse_decimal("12\u{202f}500"), Some(12500.0));
        assert_eq!(parse_decimal("12 50"), None);
        assert_eq!(parse_decimal("1,5 000"), None);
        assert_eq!(parse_decimal("1 \u{e9}\u{e9}\u{e9}\u{e9}"), None);
    }

    #[test]
    fn ambiguous_or_unfinished_text_is_refused() {
        assert_eq!(parse_decimal("1,234.5"), None);
        assert_eq!(parse_decimal("1,2,3"), None);
        assert_eq!(parse_decimal(""), None);
        assert_eq!(parse_decimal("abc"), None);
        assert_eq!(parse_decimal("NaN"), None);
        assert_eq!(parse_decimal("inf"), None);
    }
}
