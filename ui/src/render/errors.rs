//! Placing an input error beside the field it concerns, and wording it for that place.

use super::escape::escape;
use modebench::error::mentions;
use modebench::{Error, FieldPath};

/// The field an error belongs beside, given the paths of the fields on show: the field it names;
/// else the first field inside the part it names (`attachments[1]` → that row's first field);
/// else the field that contains it; else the same for the enclosing part. `None` when nothing
/// fits (a problem with the whole scenario), and the message then goes above the editor.
pub fn placement<'a>(error_path: &FieldPath, fields: &[&'a str]) -> Option<&'a str> {
    let parsed: Vec<(FieldPath, &'a str)> =
        fields.iter().filter_map(|f| Some((FieldPath::parse(f)?, *f))).collect();
    let mut path = error_path.clone();
    while !path.is_empty() {
        if let Some((_, f)) = parsed.iter().find(|(p, _)| *p == path) {
            return Some(f);
        }
        if let Some((_, f)) = parsed.iter().find(|(p, _)| p.is_inside(&path)) {
            return Some(f);
        }
        if let Some((_, f)) =
            parsed.iter().filter(|(p, _)| path.is_inside(p)).max_by_key(|(p, _)| p.steps().len())
        {
            return Some(f);
        }
        path = path.parent().unwrap_or_default();
    }
    None
}

/// The message shown beside the field: what is wrong and what was typed (with its value in SI
/// when the check was made in SI), without the field path (the position says it) and without
/// JSON line numbers (the user typed into a field).
pub fn message(error: &Error) -> String {
    let plain = strip_location(&error.message);
    let typed = error.value.as_deref().filter(|v| !mentions(plain, v));
    let si = error.si.as_deref().filter(|si| !mentions(plain, si) && Some(*si) != error.value.as_deref());
    let mut text = curly(plain);
    match (typed, si) {
        (Some(typed), Some(si)) => text.push_str(&format!(" (you typed “{typed}”, which is {si})")),
        (Some(typed), None) => text.push_str(&format!(" (you typed “{typed}”)")),
        _ => {}
    }
    text
}

/// The engine quotes values with straight quotes, as its messages also go to files and
/// terminals; beside a field they are paired as the page's own “…” are. Only quotation is
/// changed: an opening quote after a space or a bracket, a closing one before a space or a
/// punctuation mark. A message with any other straight quote (an inch mark typed and repeated) is
/// left as it is.
fn curly(text: &str) -> String {
    let chars: Vec<char> = text.chars().collect();
    let mut out = String::with_capacity(text.len() + 8);
    let mut open = false;
    for (i, &c) in chars.iter().enumerate() {
        if c != '"' {
            out.push(c);
            continue;
        }
        let before = i.checked_sub(1).map(|j| chars[j]);
        let after = chars.get(i + 1).copied();
        let opens = !open && matches!(before, None | Some(' ' | '(')) && after.is_some_and(|a| a != ' ');
        let closes = open
            && before.is_some_and(|b| b != ' ')
            && matches!(after, None | Some(' ' | ')' | ',' | ';' | ':' | '.'));
        if !opens && !closes {
            return text.to_string();
        }
        open = !open;
        out.push(if open { '“' } else { '”' });
    }
    if open {
        return text.to_string();
    }
    out
}

/// Serde ends its messages with "at line 1 column 230", which means nothing in a form.
fn strip_location(message: &str) -> &str {
    match message.rfind(" at line ") {
        Some(i) if message[i + 9..].chars().all(|c| c.is_ascii_digit() || " column".contains(c)) => {
            &message[..i]
        }
        _ => message,
    }
}

/// The element holding an error message beside a field (or above the editor, when `general`).
pub fn field_error_html(error: &Error, general: bool) -> String {
    let text = if general && !error.path.is_empty() {
        format!("{}: {}", modebench::schema::words(&error.path), message(error))
    } else {
        message(error)
    };
    format!(
        "<span class=\"mb-field-error\" data-for=\"{}\" role=\"alert\">{}</span>",
        escape(&error.path.to_string()),
        escape(&text)
    )
}

/// The note beside a required field still empty (a new row's, a new shape's): what it needs,
/// not an error, since nothing wrong has been typed. It is tied to its field like an error.
pub fn needed_html(error: &Error) -> String {
    format!(
        "<span class=\"mb-field-error mb-needed\" data-for=\"{}\">Still to fill in: type a value here to see \
         the results.</span>",
        escape(&error.path.to_string())
    )
}

/// Whether `error` only says that the field it is placed beside is still empty: its kind is a
/// missing or unreadable value and the field holds nothing (`typed` is what it holds).
pub fn is_unfilled(error: &Error, typed: &str) -> bool {
    use modebench::ErrorKind;
    matches!(error.kind, ErrorKind::Syntax | ErrorKind::Missing) && typed.trim().is_empty()
}

#[cfg(test)]
mod tests {
    use super::*;

    const FIELDS: [&str; 5] = [
        "modes",
        "segments[0].length",
        "segments[0].section.wall",
        "attachments[1].type",
        "attachments[1].position",
    ];

    #[test]
    fn errors_go_to_the_named_or_nearest_field() {
        let at = |text: &str| placement(&FieldPath::from(text), &FIELDS);
        assert_eq!(at("segments[0].section.wall"), Some("segments[0].section.wall"));
        assert_eq!(at("attachments[1]"), Some("attachments[1].type"));
        assert_eq!(at("segments[0].flexural_rigidity"), Some("segments[0].length"));
        assert_eq!(at("modes.x"), Some("modes"));
        assert_eq!(at("fe.elements"), None);
        assert_eq!(at(""), None);
    }

    #[test]
    fn messages_give_what_was_typed_and_its_si_value() {
        let mut doc: serde_json::Value = serde_json::from_str(
            r#"{"left": "clamped", "right": "free", "segments": [{"length": "1450 mm",
                "flexural_rigidity": "1e4 N*m^2", "mass_per_length": "2 kg/m"}],
                "attachments": [{"type": "mass", "position": "2100 mm", "mass": "1 kg"}]}"#,
        )
        .unwrap();
        let e = modebench::solve_value(&doc).unwrap_err();
        assert_eq!(
            message(&e),
            "the position must lie on the beam (0 to 1.45 m) (you typed “2100 mm”, which is 2.1 m)"
        );
        doc["attachments"][0]["position"] = serde_json::json!("2.1 m");
        let e = modebench::solve_value(&doc).unwrap_err();
        assert_eq!(message(&e), "the position must lie on the beam (0 to 1.45 m) (you typed “2.1 m”)");
    }

    #[test]
    fn quotes_beside_a_field_are_paired_as_the_pages_own() {
        let e = modebench::error::Error::new(
            modebench::ErrorKind::Syntax,
            "the number is missing: write it before the unit, as in \"27.2 kg\"",
        )
        .with_value("kg");
        assert_eq!(
            message(&e),
            "the number is missing: write it before the unit, as in “27.2 kg” (you typed “kg”)"
        );
        assert_eq!(curly("unknown unit \"kgs\"; did you mean kg?"), "unknown unit “kgs”; did you mean kg?");
        // An inch mark typed and repeated leaves the quotes as they are.
        for text in
            ["unexpected '\"' after the unit \"", "not two (\" then 3…)", "unknown unit \"4\"\"", "a \"b"]
        {
            assert_eq!(curly(text), text);
        }
    }

    #[test]
    fn messages_drop_json_locations() {
        assert_eq!(strip_location("unknown field name `x` at line 1 column 23"), "unknown field name `x`");
        assert_eq!(strip_location("keep at line endings"), "keep at line endings");
    }
}
