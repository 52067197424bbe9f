//! Keeping the reader's edits in `localStorage`, so that nothing typed is lost on reload.
//!
//! The reader's cases are stored as JSON with every field's text exactly as typed, invalid input
//! included, in the form `modebench_ui::cases::Cases::to_stored` writes (which reads the older
//! single-scenario form too). A stored case that could not be solved within the budget when the page opened is
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

/// What is stored under `key`, read as JSON, if anything.
pub(super) fn load_value(key: &str) -> Option<Value> {
    let text = storage()?.get_item(key).ok().flatten()?;
    crate::doc::text::read(&text).ok()
}

/// Stores a JSON value under `key`.
pub(super) fn save_value(key: &str, value: &Value) {
    if let Some(s) = storage() {
        let _ = s.set_item(key, &crate::doc::text::write(value));
    }
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
    let stored = load_value(key)?;
    let doc = stored.get("scenario")?.clone();
    let mode = stored.get("mode").and_then(Value::as_u64).unwrap_or(0) as usize;
    doc.is_object().then_some((doc, mode))
}

/// Stores the scenario as typed and the mode shown (the form a set-aside case keeps).
fn save(key: &str, doc: &Value, mode: usize) {
    if let Some(s) = storage() {
        let mut stored = serde_json::Map::new();
        stored.insert("version".into(), Value::from(1u64));
        stored.insert("scenario".into(), doc.clone());
        stored.insert("mode".into(), Value::from(mode as u64));
        let stored = Value::Object(stored);
        let _ = s.set_item(key, &crate::doc::text::write(&stored));
    }
}

/// Forgets what is stored under `key`.
fn clear(key: &str) {
    if let Some(s) = storage() {
        let _ = s.remove_item(key);
    }
}
