//! Moving the keyboard focus to a field of the form, from a warning or the list of problems.

use crate::fields::Key;
use wasm_bindgen::JsCast;

/// Focus `key`'s input, unfolding any closed section around it first.
pub fn focus_field(key: Key) {
    let Some(document) = web_sys::window().and_then(|window| window.document()) else {
        return;
    };
    let Some(element) = document.get_element_by_id(&key.spec().dom_id()) else {
        return;
    };
    let mut parent = element.parent_element();
    while let Some(ancestor) = parent {
        if ancestor.tag_name().eq_ignore_ascii_case("details") {
            let _ = ancestor.set_attribute("open", "");
        }
        parent = ancestor.parent_element();
    }
    if let Ok(input) = element.dyn_into::<web_sys::HtmlElement>() {
        let _ = input.focus();
    }
}
