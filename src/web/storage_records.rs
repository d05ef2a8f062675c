//! What the saved scenarios look like in the browser's storage, and reading a stored text back:
//! saved as it is, migrated from an older layout, or set aside with the reason. Pure functions,
//! so native unit tests cover every case; `storage.rs` does the browser I/O.
//!
//! Layout (documented in DEVELOPERS.md, "Saved scenarios in the browser"): one key per record,
//! under [`PREFIX`]. A saved scenario is under `doubleprime.v1.scenario.ID` as
//! `{"format": "doubleprime-saved-scenario", "version": 1, "id", "name", "created", "changed",
//! "scenario": <the core's scenario JSON>}`. A text that cannot be used as one is moved to
//! `doubleprime.v1.set-aside.ID` as `{"format": "doubleprime-set-aside", "version": 1, "id",
//! "key", "reason", "set_aside", "text"}`, with the stored text unchanged, so nothing is lost.

use doubleprime::scenario::{parse_scenario, Scenario};
use serde::{Deserialize, Serialize};

/// Every key this app writes starts with this.
pub const PREFIX: &str = "doubleprime.v1.";
/// Keys of saved scenarios: the prefix, this, and the record's id.
pub const SCENARIO_KEYS: &str = "doubleprime.v1.scenario.";
/// Keys of set-aside texts.
pub const SET_ASIDE_KEYS: &str = "doubleprime.v1.set-aside.";
/// The `format` of a saved scenario record.
pub const SAVED_FORMAT: &str = "doubleprime-saved-scenario";
/// The `format` of a set-aside record.
pub const SET_ASIDE_FORMAT: &str = "doubleprime-set-aside";
/// Envelope version this build writes and reads.
pub const ENVELOPE_VERSION: u64 = 1;

/// A saved scenario, as the page holds it.
#[derive(Debug, Clone, PartialEq)]
pub struct SavedScenario {
    /// Unique among the saved scenarios; part of the storage key.
    pub id: String,
    /// The person's name for it.
    pub name: String,
    /// When it was first saved (ISO 8601, UTC).
    pub created: String,
    /// When it was last saved.
    pub changed: String,
    /// The scenario.
    pub scenario: Scenario,
}

/// A stored text that could not be used, kept as it was.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct SetAside {
    /// Always [`SET_ASIDE_FORMAT`].
    pub format: String,
    /// Always [`ENVELOPE_VERSION`].
    pub version: u64,
    /// Unique among the set-aside records; part of the storage key.
    pub id: String,
    /// The key the text was found under.
    pub key: String,
    /// Why it was set aside, in words for the person.
    pub reason: String,
    /// When it was set aside (ISO 8601, UTC).
    pub set_aside: String,
    /// The stored text, unchanged.
    pub text: String,
}

/// What a stored text turned out to be.
#[derive(Debug, Clone, PartialEq)]
pub enum Stored {
    /// A saved scenario in the current envelope.
    Saved(SavedScenario),
    /// A saved scenario in an older layout, now in the current envelope (to be written back).
    Migrated(SavedScenario),
    /// Not usable: to be moved to a set-aside key, with the reason.
    SetAside(String),
    /// A text set aside earlier.
    Quarantined(SetAside),
    /// Not under our prefix: another program's, left alone.
    Foreign,
}

/// The storage key of a saved scenario.
pub fn scenario_key(id: &str) -> String {
    format!("{SCENARIO_KEYS}{id}")
}

/// The storage key of a set-aside record.
pub fn set_aside_key(id: &str) -> String {
    format!("{SET_ASIDE_KEYS}{id}")
}

/// The stored text of a saved scenario.
pub fn saved_text(saved: &SavedScenario) -> String {
    serde_json::json!({
        "format": SAVED_FORMAT,
        "version": ENVELOPE_VERSION,
        "id": saved.id,
        "name": saved.name,
        "created": saved.created,
        "changed": saved.changed,
        "scenario": saved.scenario,
    })
    .to_string()
}

/// The stored text of a set-aside record.
pub fn set_aside_text(record: &SetAside) -> String {
    serde_json::to_string(record).unwrap_or_default()
}

/// A set-aside record for `text` found under `key`.
pub fn set_aside(id: &str, key: &str, text: &str, reason: &str, now: &str) -> SetAside {
    SetAside {
        format: SET_ASIDE_FORMAT.to_string(),
        version: ENVELOPE_VERSION,
        id: id.to_string(),
        key: key.to_string(),
        reason: reason.to_string(),
        set_aside: now.to_string(),
        text: text.to_string(),
    }
}

fn problems_text(problems: &[doubleprime::error::InputError]) -> String {
    problems.iter().map(ToString::to_string).collect::<Vec<_>>().join("; ")
}

/// Read what is stored under `key`. `now` dates a migration.
///
/// Migration, concretely: a record written before the envelope existed is a bare scenario (an
/// object with a `schema` field and no `format`) under a scenario key; it becomes an envelope
/// named after the scenario, dated `now`. A scenario of an older `schema` would be migrated by
/// the core; there is only schema 1 so far, so any other schema is set aside with its reason, as
/// is a text that is not JSON, a record of a newer envelope, and another program's record.
pub fn classify(key: &str, text: &str, now: &str) -> Stored {
    if !key.starts_with(PREFIX) {
        return Stored::Foreign;
    }
    if let Some(id) = key.strip_prefix(SET_ASIDE_KEYS) {
        return match serde_json::from_str::<SetAside>(text) {
            Ok(record) if record.format == SET_ASIDE_FORMAT => Stored::Quarantined(record),
            // A damaged set-aside record is still shown, whole, as its own text.
            _ => Stored::Quarantined(set_aside(id, key, text, "A set-aside record that is itself damaged.", now)),
        };
    }
    let value: serde_json::Value = match serde_json::from_str(text) {
        Ok(value) => value,
        Err(error) => return Stored::SetAside(format!("The stored text is not readable JSON ({error}).")),
    };
    let Some(object) = value.as_object() else {
        return Stored::SetAside("The stored text is not a Doubleprime record (not a JSON object).".to_string());
    };
    let format = object.get("format").and_then(serde_json::Value::as_str);
    let Some(id) = key.strip_prefix(SCENARIO_KEYS).filter(|id| !id.is_empty()) else {
        return Stored::SetAside("A key under Doubleprime's prefix that this version does not write.".to_string());
    };
    match format {
        Some(SAVED_FORMAT) => {
            let version = object.get("version").and_then(serde_json::Value::as_u64);
            if version != Some(ENVELOPE_VERSION) {
                return Stored::SetAside(format!(
                    "Saved by a Doubleprime with record version {}; this version reads version {ENVELOPE_VERSION}.",
                    version.map_or_else(|| "(none)".to_string(), |v| v.to_string())
                ));
            }
            let field = |name: &str| object.get(name).and_then(serde_json::Value::as_str).unwrap_or("").to_string();
            let scenario_text = object.get("scenario").map(ToString::to_string).unwrap_or_default();
            match parse_scenario(&scenario_text) {
                Ok(scenario) => Stored::Saved(SavedScenario {
                    id: id.to_string(),
                    name: field("name"),
                    created: field("created"),
                    changed: field("changed"),
                    scenario,
                }),
                Err(problems) => {
                    Stored::SetAside(format!("The saved scenario does not read: {}", problems_text(&problems)))
                }
            }
        }
        Some(other) => Stored::SetAside(format!("A record of another program (format \u{201c}{other}\u{201d}).")),
        None if object.contains_key("schema") => match parse_scenario(text) {
            Ok(scenario) => Stored::Migrated(SavedScenario {
                id: id.to_string(),
                name: if scenario.name.trim().is_empty() {
                    "Untitled scenario".to_string()
                } else {
                    scenario.name.clone()
                },
                created: now.to_string(),
                changed: now.to_string(),
                scenario,
            }),
            Err(problems) => {
                Stored::SetAside(format!("An older saved scenario that does not read: {}", problems_text(&problems)))
            }
        },
        None => Stored::SetAside("The stored text is not a Doubleprime record (no format field).".to_string()),
    }
}

/// `name`, or `name (2)`, `name (3)`... whichever no saved scenario has yet.
pub fn unused_name(name: &str, saved: &[SavedScenario]) -> String {
    let taken = |candidate: &str| saved.iter().any(|s| s.name == candidate);
    if !taken(name) {
        return name.to_string();
    }
    (2..).map(|n| format!("{name} ({n})")).find(|candidate| !taken(candidate)).unwrap_or_default()
}

/// A date as the list shows it: `2026-12-02 14:05 UTC` from an ISO 8601 text (unchanged if not one).
pub fn date_shown(iso: &str) -> String {
    match (iso.get(..10), iso.get(11..16)) {
        (Some(day), Some(time)) if iso.as_bytes().get(10) == Some(&b'T') => format!("{day} {time} UTC"),
        _ => iso.to_string(),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    const NOW: &str = "2026-12-02T10:00:00.000Z";

    fn demo_text() -> &'static str {
        include_str!("../../demo-loads/tempering-beef-blocks.json")
    }

    fn demo_saved() -> SavedScenario {
        SavedScenario {
            id: "abc".to_string(),
            name: "Beef <b>".to_string(),
            created: "2026-12-01T09:00:00.000Z".to_string(),
            changed: NOW.to_string(),
            scenario: parse_scenario(demo_text()).unwrap(),
        }
    }

    #[test]
    fn a_saved_record_reads_back_as_written() {
        let saved = demo_saved();
        assert_eq!(classify(&scenario_key("abc"), &saved_text(&saved), NOW), Stored::Saved(saved));
    }

    #[test]
    fn a_bare_scenario_from_before_the_envelope_migrates() {
        match classify(&scenario_key("old"), demo_text(), NOW) {
            Stored::Migrated(saved) => {
                assert_eq!(saved.id, "old");
                assert_eq!(saved.name, "Tempering frozen beef blocks at 915 MHz");
                assert_eq!(saved.created, NOW);
                assert_eq!(saved.scenario, parse_scenario(demo_text()).unwrap());
            }
            other => panic!("not migrated: {other:?}"),
        }
    }

    #[test]
    fn unusable_texts_are_set_aside_with_a_reason() {
        let key = scenario_key("x");
        let reason = |text: &str| match classify(&key, text, NOW) {
            Stored::SetAside(reason) => reason,
            other => panic!("{text:?} was not set aside: {other:?}"),
        };
        assert!(reason(&demo_text()[..40]).contains("not readable JSON"));
        assert!(reason("[1, 2]").contains("not a JSON object"));
        assert!(reason(r#"{"format": "someone-else", "data": 1}"#).contains("another program"));
        assert!(reason(r#"{"hello": 1}"#).contains("no format field"));
        assert!(reason(&demo_text().replacen("\"schema\": 1", "\"schema\": 9", 1)).contains("schema"));
        let newer = saved_text(&demo_saved()).replacen("\"version\":1", "\"version\":2", 1);
        assert!(reason(&newer).contains("record version 2"));
        let broken = saved_text(&demo_saved()).replacen("\"schema\":1", "\"schema\":0", 1);
        assert!(reason(&broken).contains("does not read"));
        assert!(matches!(classify("doubleprime.v1.settings", "{}", NOW), Stored::SetAside(_)));
        assert_eq!(classify("another-app.key", "{}", NOW), Stored::Foreign);
    }

    #[test]
    fn a_set_aside_record_keeps_the_text_whole() {
        let record = set_aside("q1", &scenario_key("x"), "{\"trunc", "not JSON", NOW);
        assert_eq!(classify(&set_aside_key("q1"), &set_aside_text(&record), NOW), Stored::Quarantined(record));
        match classify(&set_aside_key("q2"), "garbage", NOW) {
            Stored::Quarantined(record) => assert_eq!(record.text, "garbage"),
            other => panic!("{other:?}"),
        }
    }

    #[test]
    fn names_and_dates() {
        let saved = vec![demo_saved()];
        assert_eq!(unused_name("Other", &saved), "Other");
        assert_eq!(unused_name("Beef <b>", &saved), "Beef <b> (2)");
        assert_eq!(date_shown(NOW), "2026-12-02 10:00 UTC");
        assert_eq!(date_shown("yesterday"), "yesterday");
    }
}
