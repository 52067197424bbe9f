use super::*;
use serde_json::json;

fn tube(wall: &str) -> Value {
    json!({
        "left": "clamped", "right": "free",
        "segments": [{ "length": "1.2 m", "section": { "shape": "tube", "outer_diameter": "60 mm", "wall": wall },
                       "material": { "youngs_modulus": "200 GPa ±5%", "density": "7850 kg/m^3" } }],
        "excitations": [{ "frequency": "1780 rpm" }],
    })
}

/// The normalised scenario's wall as written, and the fraction of its tolerance entry.
fn wall(doc: &Value) -> (Value, Option<f64>) {
    let out = normalise(doc).map(Cow::into_owned).unwrap_or_else(|e| panic!("{e}"));
    let fraction = out["tolerances"]
        .as_array()
        .and_then(|list| list.iter().find(|t| t["field"] == "segments[0].section.wall"))
        .and_then(|t| t["plus_minus"].as_f64());
    (out["segments"][0]["section"]["wall"].clone(), fraction)
}

#[test]
fn a_value_and_its_tolerance_are_read_apart() {
    // The spellings the format accepts, and the arithmetic of an absolute tolerance: ± 0.5 mm of
    // 6.02 mm is ± 0.5/6.02 of it.
    assert_eq!(split("6.02 mm ± 12.5 %"), Some(("6.02 mm", "12.5 %")));
    assert_eq!(split("200 GPa ±5%"), Some(("200 GPa", "5%")));
    assert_eq!(split("6.02 mm +/- 0.5 mm"), Some(("6.02 mm", "0.5 mm")));
    assert_eq!(split("6.02 mm"), None);
    assert_eq!(wall(&tube("6.02 mm ± 12.5 %")), (json!("6.02 mm"), Some(0.125)));
    assert_eq!(wall(&tube("6.02 mm +/- 12.5%")), (json!("6.02 mm"), Some(0.125)));
    let (value, fraction) = wall(&tube("6.02 ± 0.5 mm"));
    assert_eq!(value, json!("6.02 mm"));
    assert!(fraction.is_some_and(|f| (f - 0.5 / 6.02).abs() < 1e-15), "{fraction:?}");
    let (value, fraction) = wall(&tube("6.02 mm ± 0.5"));
    assert_eq!(value, json!("6.02 mm"));
    assert!(fraction.is_some_and(|f| (f - 0.5 / 6.02).abs() < 1e-15), "{fraction:?}");
    // An inch tolerance on a millimetre value: 0.02 in = 0.508 mm.
    let (_, fraction) = wall(&tube("6.02 mm ± 0.02 in"));
    assert!(fraction.is_some_and(|f| (f - 0.508 / 6.02).abs() < 1e-12), "{fraction:?}");
    // The modulus's tolerance was read too, and a scenario without any is left as it is.
    let out = normalise(&tube("6 mm")).map(Cow::into_owned).unwrap_or_default();
    assert_eq!(out["segments"][0]["material"]["youngs_modulus"], json!("200 GPa"));
    assert_eq!(out["tolerances"][0]["plus_minus"], json!(0.05));
    let plain = json!({ "segments": [{ "length": "1 m" }], "title": "± nothing" });
    assert!(matches!(normalise(&plain), Ok(Cow::Borrowed(_))));
}

#[test]
fn a_malformed_tolerance_names_its_field_and_what_was_typed() {
    for typed in
        ["6.02 mm ± 150 %", "6.02 mm ± abc", "6.02 mm ± 7 mm", "± 5 %", "6.02 mm ± 0 %", "6 mm ± 1 % ± 2 %"]
    {
        let Err(e) = normalise(&tube(typed)) else { panic!("{typed} must be refused") };
        assert_eq!(e.path.to_string(), "segments[0].section.wall", "{typed}");
        assert_eq!(e.value.as_deref(), Some(typed), "{typed}");
        assert!(e.message.contains("\"6.02 mm ± 12.5 %\""), "{typed}: {}", e.message);
    }
    // Only the beam's inputs take a tolerance: a running speed does not.
    let mut doc = tube("6 mm");
    doc["excitations"][0]["frequency"] = json!("1780 rpm ± 2 %");
    let e = normalise(&doc).err().map(|e| (e.path.to_string(), e.kind));
    assert_eq!(e, Some(("excitations[0].frequency".to_string(), ErrorKind::Conflict)));
    // A tolerance typed with the value and another listed for the same input: one must go.
    let mut doc = tube("6 mm ± 10 %");
    doc["tolerances"] = json!([{ "field": "segments[0].section.wall", "plus_minus": "5 %" }]);
    let e = normalise(&doc).err().map(|e| (e.path.to_string(), e.kind));
    assert_eq!(e, Some(("segments[0].section.wall".to_string(), ErrorKind::Conflict)));
    // The reader of the whole scenario gives the same error.
    assert!(crate::scenario::Scenario::from_value(&tube("6.02 mm ± abc")).is_err());
}
