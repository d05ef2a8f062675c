//! The browser's local storage for the saved scenarios, or memory when the browser refuses it.
//!
//! A thin layer over `window.localStorage`: it is probed once, without `gloo-storage`'s
//! `LocalStorage`, which panics when storage is blocked. Blocked storage gives [`Shelf::Memory`]
//! and a notice; a write refused later (the storage full) comes back as a message, and the caller
//! keeps the work in memory. What the texts mean is `storage_records.rs`'s business.

/// Where the saved scenarios live.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Shelf {
    /// The browser's local storage.
    Local,
    /// This page's memory only: lost when the page closes.
    Memory,
}

/// A key outside our prefix, written and removed to see whether storage takes writes.
const PROBE_KEY: &str = "doubleprime-probe";

fn local() -> Option<web_sys::Storage> {
    web_sys::window()?.local_storage().ok().flatten()
}

fn error_text(error: &wasm_bindgen::JsValue) -> String {
    js_sys::Reflect::get(error, &"name".into())
        .ok()
        .and_then(|name| name.as_string())
        .or_else(|| error.as_string())
        .unwrap_or_else(|| "refused".to_string())
}

impl Shelf {
    /// Probe the browser's storage: the shelf to use, and a notice when it is memory.
    pub fn open() -> (Self, Option<String>) {
        let Some(storage) = local() else {
            return (
                Self::Memory,
                Some("This browser blocks storage for this page: saved scenarios stay in memory and are lost when the page closes. Export them as files to keep them.".to_string()),
            );
        };
        match storage.set_item(PROBE_KEY, "1") {
            Ok(()) => {
                let _ = storage.remove_item(PROBE_KEY);
                (Self::Local, None)
            }
            Err(error) => (
                Self::Local,
                Some(format!(
                    "The browser's storage refuses new saves ({}): what is saved now is kept in memory until the page closes. Export it as a file to keep it.",
                    error_text(&error)
                )),
            ),
        }
    }

    /// Every key and text in storage (none in memory).
    pub fn read_all(self) -> Vec<(String, String)> {
        let Some(storage) = local().filter(|_| self == Self::Local) else {
            return Vec::new();
        };
        let count = storage.length().unwrap_or(0);
        let keys: Vec<String> = (0..count).filter_map(|index| storage.key(index).ok().flatten()).collect();
        keys.into_iter().filter_map(|key| storage.get_item(&key).ok().flatten().map(|text| (key, text))).collect()
    }

    /// Store `text` under `key`; in memory there is nothing to do.
    pub fn write(self, key: &str, text: &str) -> Result<(), String> {
        if self == Self::Memory {
            return Ok(());
        }
        let storage = local().ok_or_else(|| "storage is no longer available".to_string())?;
        storage.set_item(key, text).map_err(|error| match error_text(&error).as_str() {
            "QuotaExceededError" => "the browser's storage is full".to_string(),
            other => format!("the browser's storage refused it ({other})"),
        })
    }

    /// Remove `key`.
    pub fn remove(self, key: &str) -> Result<(), String> {
        if self == Self::Memory {
            return Ok(());
        }
        let storage = local().ok_or_else(|| "storage is no longer available".to_string())?;
        storage.remove_item(key).map_err(|error| format!("the browser's storage refused it ({})", error_text(&error)))
    }
}

/// Now, as ISO 8601 in UTC (`2026-12-02T10:00:00.000Z`).
pub fn now_iso() -> String {
    js_sys::Date::new_0().to_iso_string().as_string().unwrap_or_default()
}

/// A new record id: the time in milliseconds and a random part, in base 36.
pub fn new_id() -> String {
    let time = js_sys::Date::now() as u64;
    let random = (js_sys::Math::random() * 36f64.powi(6)) as u64;
    format!("{}{}", base36(time), base36(random))
}

fn base36(mut value: u64) -> String {
    const DIGITS: &[u8; 36] = b"0123456789abcdefghijklmnopqrstuvwxyz";
    let mut out = Vec::new();
    loop {
        out.push(DIGITS[(value % 36) as usize]);
        value /= 36;
        if value == 0 {
            break;
        }
    }
    out.reverse();
    String::from_utf8(out).unwrap_or_default()
}
