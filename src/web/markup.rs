//! Markup as text, for the parts of the page that only show data (charts, tables, summaries).
//!
//! Those parts are built as escaped HTML or SVG strings and set as an element's `inner_html`
//! rather than as Leptos views: a view is compiled into code for every element it holds, a
//! string is only data, and the charts and tables hold thousands of elements between them.
//! Measured on this app, that halves the wasm (see DEVELOPERS.md). Everything interactive
//! (inputs, buttons, selects) stays a Leptos view; buttons inside markup are handled by one
//! listener on their container that reads the button's `data-` attributes.

/// `text` with `& < > " '` replaced by entities, safe inside elements and quoted attributes.
pub fn escape(text: &str) -> String {
    let mut out = String::with_capacity(text.len());
    for c in text.chars() {
        match c {
            '&' => out.push_str("&amp;"),
            '<' => out.push_str("&lt;"),
            '>' => out.push_str("&gt;"),
            '"' => out.push_str("&quot;"),
            '\'' => out.push_str("&#39;"),
            c => out.push(c),
        }
    }
    out
}

/// The value of `attribute` on the element an event started from, or its nearest ancestor
/// that has one (a click on a button's text reaches the button's `data-` attribute).
pub fn event_data(event: &web_sys::Event, attribute: &str) -> Option<String> {
    use wasm_bindgen::JsCast;
    let target = event.target()?.dyn_into::<web_sys::Element>().ok()?;
    let holder = target.closest(&format!("[{attribute}]")).ok().flatten()?;
    holder.get_attribute(attribute)
}

/// Put the focus on the element whose listener is handling `event` (a container that stays
/// while its markup is replaced, so the keyboard does not fall back to the page's start).
pub fn focus_container(event: &web_sys::Event) {
    use wasm_bindgen::JsCast;
    if let Some(container) = event.current_target().and_then(|t| t.dyn_into::<web_sys::HtmlElement>().ok()) {
        let _ = container.focus();
    }
}

#[cfg(test)]
mod tests {
    use super::escape;

    #[test]
    fn markup_characters_are_escaped() {
        assert_eq!(escape(r#"<b>"Tom's" & co</b>"#), "&lt;b&gt;&quot;Tom&#39;s&quot; &amp; co&lt;/b&gt;");
        assert_eq!(escape("\u{3b5}\u{2032} 20 \u{b0}C"), "\u{3b5}\u{2032} 20 \u{b0}C");
    }
}
