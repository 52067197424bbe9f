//! Keeping the reader's edits in `localStorage`, so that nothing typed is lost on reload.
//!
//! The scenario is stored as JSON with every field's text exactly as typed, invalid input
//! included. A stored case that could not be solved within the budget when the page opened is
//! also copied aside (under the key with `:set-aside` added), so that editing the page's example
//! meanwhile does not overwrite it; the calculator offers it back. Storage that is missing, full
//! or refused (private browsing) is silently skipped: the calculator works, it just forgets on
//! reload.

use serde_json::Value;

/// The storage key of a calculator: the page's path and the calculator's place on the page.
pub(super) fn key(index: usize) -> String {
    let path = web_sys::window().and_then(|w| w.location().pathname().ok()).unwrap_or_default();
    format!("modebench:{path}#{index}")
}

fn storage() -> Option<web_sys::Storage> {
    web_sys::window()?.local_storage().ok().flatten()
}

/// The stored scenario and the mode shown, if any.
pub(super) fn load(key: &str) -> Option<(Value, usize)> {
    read(key)
}

/// The case set aside, if any.
pub(super) fn load_set_aside(key: &str) -> Option<(Value, usize)> {
    read(&set_aside_key(key))
}

/// Copies a case aside: it stays in storage, whatever is saved under `key` later.
pub(super) fn set_aside(key: &str, doc: &Value, mode: usize) {
    save(&set_aside_key(key), doc, mode);
}

/// Forgets the copy set aside, once it has been opened again (and so saved under `key`).
pub(super) fn clear_set_aside(key: &str) {
    clear(&set_aside_key(key));
}

fn set_aside_key(key: &str) -> String {
    format!("{key}:set-aside")
}

fn read(key: &str) -> Option<(Value, usize)> {
    let text = storage()?.get_item(key).ok().flatten()?;
    let stored = crate::doc::text::read(&text).ok()?;
    let doc = stored.get("scenario")?.clone();
    let mode = stored.get("mode").and_then(Value::as_u64).unwrap_or(0) as usize;
    doc.is_object().then_some((doc, mode))
}

/// Stores the scenario as typed and the mode shown.
pub(super) fn save(key: &str, doc: &Value, mode: usize) {
    if let Some(s) = storage() {
        let mut stored = serde_json::Map::new();
        stored.insert("version".into(), Value::from(1u64));
        stored.insert("scenario".into(), doc.clone());
        stored.insert("mode".into(), Value::from(mode as u64));
        let stored = Value::Object(stored);
        let _ = s.set_item(key, &crate::doc::text::write(&stored));
    }
}

/// Forgets the stored edits.
pub(super) fn clear(key: &str) {
    if let Some(s) = storage() {
        let _ = s.remove_item(key);
    }
}
