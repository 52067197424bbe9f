//! The public API returns `Err` instead of panicking, and never returns a non-finite number, on
//! seeded random hostile input: NaN, ±∞, 0, 1e±300, negative values, wrong types and garbage
//! text, in models built directly (`models.rs`), in scenario JSON (`scenarios.rs`) and in the
//! input readers of sections, materials, extra masses and quantities (`readers.rs`), and in
//! tap-test recordings (`recordings.rs`), and the extremes of a double in every numeric field of
//! a section, its material and its extra mass (`extremes.rs`). Its error
//! messages stay short, never show a non-finite number, and name the place in the scenario they
//! concern. Design requests that are badly put or have no answer are in `design.rs`.

mod design;
mod extremes;
mod models;
mod readers;
mod recordings;
mod scenarios;

use modebench::Error;

/// Common practice, no source: a message an engineer reads beside a field fits in a few lines.
const LONGEST_MESSAGE: usize = 300;

/// The checks every error message passes: short, and no NaN or infinity shown as a number. What
/// the user typed is echoed as typed (they may well have typed "NaN"), so it is left out of the
/// search for words.
pub(crate) fn assert_plain(e: &Error, case: &str) {
    let shown = e.to_string();
    assert!(shown.chars().count() < LONGEST_MESSAGE, "{case}: {} characters: {shown}", shown.chars().count());
    let typed: Vec<String> = e.value.iter().cloned().collect();
    assert!(!shows_non_finite(&shown, &typed), "{case}: a non-finite number in {shown:?}");
    // A path is built of steps, so it reads back as itself once written out.
    let path = e.path.to_string();
    assert!(
        !path.starts_with('.') && !path.ends_with('.') && !path.contains(".."),
        "{case}: malformed path in {shown:?}"
    );
}

/// Whether `text`, once the user's own words `typed` are taken out, shows NaN or infinity.
pub(crate) fn shows_non_finite(text: &str, typed: &[String]) -> bool {
    let mut typed: Vec<&String> = typed.iter().filter(|t| !t.is_empty()).collect();
    typed.sort_by_key(|t| std::cmp::Reverse(t.len()));
    let engine_words = typed.iter().fold(text.to_string(), |t, u| t.replace(u.as_str(), ""));
    engine_words
        .split(|c: char| !c.is_alphanumeric())
        .any(|w| ["nan", "inf", "infinity"].contains(&w.to_ascii_lowercase().as_str()))
}
