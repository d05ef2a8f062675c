//! A scenario carried in a link: `#s1.` followed by the scenario's compact JSON in base64url
//! (RFC 4648 section 5, no padding), so a plan can be mailed and opened with nothing installed.
//!
//! The prefix names the link format's version; the JSON inside carries its own `schema`. A link
//! is read with the same parser and checks as a file, so a tampered link is refused by field.

use super::validation::parse_scenario;
use super::Scenario;
use crate::error::InputError;

/// What a link's fragment starts with (after `#`).
pub const LINK_PREFIX: &str = "s1.";
/// Longest fragment accepted, characters: far above any real scenario (a demo load is about
/// 2 kB), short enough that a pasted wrong text is refused before it is decoded.
pub const LINK_CHARS_MAX: usize = 65_536;

const ALPHABET: &[u8; 64] = b"ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789-_";

fn encode(bytes: &[u8]) -> String {
    let mut out = String::with_capacity(bytes.len().div_ceil(3) * 4);
    for chunk in bytes.chunks(3) {
        let b = [chunk[0], *chunk.get(1).unwrap_or(&0), *chunk.get(2).unwrap_or(&0)];
        let n = (u32::from(b[0]) << 16) | (u32::from(b[1]) << 8) | u32::from(b[2]);
        let symbols = chunk.len() + 1;
        for i in 0..symbols {
            out.push(char::from(ALPHABET[((n >> (18 - 6 * i)) & 63) as usize]));
        }
    }
    out
}

fn decode(text: &str) -> Option<Vec<u8>> {
    let mut values = Vec::with_capacity(text.len());
    for byte in text.bytes() {
        values.push(ALPHABET.iter().position(|&a| a == byte)? as u32);
    }
    if values.len() % 4 == 1 {
        return None;
    }
    let mut out = Vec::with_capacity(values.len() * 3 / 4);
    for chunk in values.chunks(4) {
        let n = chunk.iter().enumerate().fold(0u32, |acc, (i, v)| acc | (v << (18 - 6 * i)));
        for i in 0..chunk.len() - 1 {
            out.push((n >> (16 - 8 * i)) as u8);
        }
    }
    Some(out)
}

/// The link fragment (without `#`) for a scenario.
pub fn scenario_to_fragment(scenario: &Scenario) -> String {
    let json = serde_json::to_string(scenario).unwrap_or_default();
    format!("{LINK_PREFIX}{}", encode(json.as_bytes()))
}

/// Read a scenario from a link fragment (with or without the leading `#`).
pub fn scenario_from_fragment(fragment: &str) -> Result<Scenario, Vec<InputError>> {
    let fragment = fragment.trim().trim_start_matches('#');
    if fragment.len() > LINK_CHARS_MAX {
        return Err(vec![InputError::new(
            "link",
            format!("{} characters", fragment.len()),
            format!("at most {LINK_CHARS_MAX} characters"),
        )]);
    }
    let Some(body) = fragment.strip_prefix(LINK_PREFIX) else {
        return Err(vec![InputError::new(
            "link",
            "an unknown format",
            format!("a Doubleprime scenario link (#{LINK_PREFIX}...)"),
        )]);
    };
    let bytes =
        decode(body).ok_or_else(|| vec![InputError::new("link", "damaged text", "the link exactly as it was sent")])?;
    let text = String::from_utf8(bytes)
        .map_err(|_| vec![InputError::new("link", "damaged text", "the link exactly as it was sent")])?;
    parse_scenario(&text)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn base64url_matches_rfc_4648_test_vectors() {
        // RFC 4648 section 10 test vectors, in the URL-safe alphabet without padding.
        for (plain, coded) in [
            ("", ""),
            ("f", "Zg"),
            ("fo", "Zm8"),
            ("foo", "Zm9v"),
            ("foob", "Zm9vYg"),
            ("fooba", "Zm9vYmE"),
            ("foobar", "Zm9vYmFy"),
        ] {
            assert_eq!(encode(plain.as_bytes()), coded);
            assert_eq!(decode(coded).unwrap(), plain.as_bytes());
        }
        // The URL-safe symbols for 62 and 63 (section 5).
        assert_eq!(encode(&[0xfb, 0xff]), "-_8");
        assert_eq!(decode("Z"), None, "a lone symbol cannot end a group");
        assert_eq!(decode("Zg=="), None, "padding is not part of this format");
    }

    #[test]
    fn damaged_and_foreign_links_are_refused_by_name() {
        assert_eq!(scenario_from_fragment("#x9.abc").unwrap_err()[0].field, "link");
        assert_eq!(scenario_from_fragment("#s1.@@@").unwrap_err()[0].field, "link");
        assert_eq!(
            scenario_from_fragment(&format!("#s1.{}", encode(b"{\"schema\": 9}"))).unwrap_err()[0].field,
            "schema"
        );
        let huge = format!("s1.{}", "A".repeat(LINK_CHARS_MAX));
        assert!(scenario_from_fragment(&huge).unwrap_err()[0].valid.contains("at most"));
    }
}
