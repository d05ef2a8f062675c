//! Handing a text to the person as a file (a Blob behind an object URL and an `<a download>`,
//! which is no network request), and reading a file they pick.

use wasm_bindgen::JsCast;

/// Offer `text` as a file called `file_name`.
pub fn download(file_name: &str, mime: &str, text: &str) -> Result<(), String> {
    let failed = |_| format!("the browser refused to make the file {file_name}");
    let document = web_sys::window().and_then(|w| w.document()).ok_or("no document")?;
    let parts = js_sys::Array::of1(&text.into());
    let options = web_sys::BlobPropertyBag::new();
    options.set_type(mime);
    let blob = web_sys::Blob::new_with_str_sequence_and_options(&parts, &options).map_err(failed)?;
    let url = web_sys::Url::create_object_url_with_blob(&blob).map_err(failed)?;
    let anchor = document.create_element("a").map_err(failed)?.unchecked_into::<web_sys::HtmlAnchorElement>();
    anchor.set_href(&url);
    anchor.set_download(file_name);
    anchor.click();
    let _ = web_sys::Url::revoke_object_url(&url);
    Ok(())
}

/// A file name made of a scenario's name: lower-case letters, digits and dashes.
pub fn file_stem(name: &str) -> String {
    let mut stem = String::new();
    for c in name.chars().flat_map(char::to_lowercase) {
        if c.is_ascii_alphanumeric() {
            stem.push(c);
        } else if !stem.ends_with('-') && !stem.is_empty() {
            stem.push('-');
        }
    }
    let stem = stem.trim_end_matches('-');
    if stem.is_empty() {
        "scenario".to_string()
    } else {
        stem.chars().take(60).collect()
    }
}

/// The text of the first file chosen in a file input, or why it cannot be read.
pub async fn picked_text(input: &web_sys::HtmlInputElement, size_max: f64) -> Result<(String, String), String> {
    let file = input.files().and_then(|files| files.get(0)).ok_or("no file was chosen")?;
    let name = file.name();
    if file.size() > size_max {
        return Err(format!("{name} is {:.0} kB, more than a scenario file can be", file.size() / 1000.0));
    }
    let text = wasm_bindgen_futures::JsFuture::from(file.text())
        .await
        .map_err(|_| format!("{name} could not be read"))?
        .as_string()
        .ok_or_else(|| format!("{name} is not text"))?;
    Ok((name, text))
}

#[cfg(test)]
mod tests {
    use super::file_stem;

    #[test]
    fn file_names_are_tame() {
        assert_eq!(file_stem("Tempering frozen beef blocks at 915 MHz"), "tempering-frozen-beef-blocks-at-915-mhz");
        assert_eq!(file_stem("<script>alert(1)</script>"), "script-alert-1-script");
        assert_eq!(file_stem("../.."), "scenario");
    }
}
