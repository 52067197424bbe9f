//! The calculator's markup, checked natively: no number the page cannot show, errors beside the
//! right field, user text escaped, and the contract's data attributes exact.
#![cfg(not(target_arch = "wasm32"))]

use modebench_ui::render::{self, Editing, View};
use modebench_ui::{doc, render::widget_html};

const SCENARIOS: [(&str, &str); 8] = [
    ("sensor-boom", include_str!("../../docs/scenarios/sensor-boom.json")),
    ("fan-floor-beam-us", include_str!("../../docs/scenarios/fan-floor-beam-us.json")),
    ("filled-pipe-span", include_str!("../../docs/scenarios/filled-pipe-span.json")),
    ("absorber-on-platform-beam", include_str!("../../docs/scenarios/absorber-on-platform-beam.json")),
    ("pump-discharge-valve-us", include_str!("../../docs/scenarios/pump-discharge-valve-us.json")),
    ("fan-set-on-mounts", include_str!("../../docs/scenarios/fan-set-on-mounts.json")),
    ("hot-line-between-anchors", include_str!("../../docs/scenarios/hot-line-between-anchors.json")),
    ("stub-shaft-timoshenko", include_str!("../../docs/scenarios/stub-shaft-timoshenko.json")),
];

/// Words that would mean a number escaped its guard: Rust writes NaN and inf, JavaScript NaN,
/// Infinity and undefined.
fn assert_no_bad_numbers(case: &str, html: &str) {
    for word in html.split(|c: char| !c.is_ascii_alphanumeric()) {
        assert!(
            !matches!(word, "NaN" | "nan" | "inf" | "Infinity" | "undefined" | "null"),
            "{case}: the markup contains \"{word}\""
        );
    }
}

/// The value of the `name="…"` attribute in one tag.
fn attribute<'a>(tag: &'a str, name: &str) -> Option<&'a str> {
    attributes(tag, name).into_iter().next()
}

/// The value of every `name="…"` attribute in order.
fn attributes<'a>(html: &'a str, name: &str) -> Vec<&'a str> {
    let needle = format!(" {name}=\"");
    html.match_indices(&needle)
        .filter_map(|(i, _)| {
            let rest = &html[i + needle.len()..];
            rest.find('"').map(|end| &rest[..end])
        })
        .collect()
}

#[test]
fn every_docs_scenario_renders_without_bad_numbers() {
    for (case, json) in SCENARIOS {
        let html = widget_html(json);
        assert_no_bad_numbers(case, &html);
        assert!(html.starts_with("<div class=\"mb-calc\" data-modebench=\""), "{case}");
        assert!(html.contains("<table class=\"mb-modes\">"), "{case}");
        assert!(html.contains("<svg class=\"mb-plot\""), "{case}");
        assert!(!html.contains("mb-stale"), "{case}: the example should solve");
        assert!(!html.contains(" style="), "{case}: inline styles break the pages' CSP");
        for mode in 1..=4 {
            assert!(html.contains(&format!("data-show-mode=\"{mode}\"")), "{case}: mode {mode} button");
        }
    }
}

#[test]
fn data_attributes_hold_the_reports_values_in_full() {
    for (case, json) in SCENARIOS {
        let report = modebench::solve_json(json).map_err(|e| e.to_string());
        let Ok(report) = report else { panic!("{case}: {report:?}") };
        let html = widget_html(json);
        let exact: Vec<String> = report.modes.iter().map(|m| format!("{}", m.frequency_hz)).collect();
        assert_eq!(attributes(&html, "data-hz"), exact, "{case}");
        let fe: Vec<String> =
            report.modes.iter().filter_map(|m| m.fe_frequency_hz).map(|f| format!("{f}")).collect();
        assert_eq!(attributes(&html, "data-fe-hz"), fe, "{case}");
        let data_mode: Vec<String> = report.modes.iter().map(|m| m.number.to_string()).collect();
        assert_eq!(attributes(&html, "data-mode"), data_mode, "{case}");
        let f = report.fundamental;
        let rayleigh = f.and_then(|f| f.rayleigh_hz).map(|v| format!("{v}"));
        assert_eq!(attributes(&html, "data-rayleigh-hz").first().map(|s| s.to_string()), rayleigh, "{case}");
        let dunkerley = f.and_then(|f| f.dunkerley_hz).map(|v| format!("{v}"));
        assert_eq!(
            attributes(&html, "data-dunkerley-hz").first().map(|s| s.to_string()),
            dunkerley,
            "{case}"
        );
    }
}

#[test]
fn the_scenario_round_trips_through_its_attribute() {
    let (_, json) = SCENARIOS[0];
    let html = widget_html(json);
    let attr = attributes(&html, "data-modebench")[0];
    let unescaped =
        attr.replace("&quot;", "\"").replace("&lt;", "<").replace("&gt;", ">").replace("&#39;", "'");
    assert_eq!(unescaped.replace("&amp;", "&"), json);
}

#[test]
fn a_broken_field_gets_its_message_beside_it_and_stale_results() {
    let (_, json) = SCENARIOS[0];
    let broken = json.replace("\"2.8 kg\"", "\"2.8 kgs\"");
    let html = widget_html(&broken);
    assert_no_bad_numbers("broken mass", &html);
    assert_eq!(attributes(&html, "data-for"), vec!["attachments[0].mass"]);
    assert!(html.contains("class=\"mb-results mb-stale\""));
    // The error sits inside the mass field, right after its value.
    let field = html.find("data-field=\"attachments[0].mass\"").unwrap_or(usize::MAX);
    let error = html.find("class=\"mb-field-error\"").unwrap_or(0);
    assert!(
        field < error && !html[field + 1..error].contains("data-field="),
        "the message is not beside the field"
    );
    assert!(
        html.contains("data-field=\"attachments[0].mass\">2.8 kgs</span>"),
        "what was typed is shown as typed"
    );
    let Ok(doc) = doc::read(&broken) else { panic!("the broken scenario is still JSON") };
    let error = modebench::solve_json(&broken).err();
    let live = render::editor_html(&doc, error.as_ref(), Editing::Live);
    assert!(live.contains("value=\"2.8 kgs\" placeholder=\"\" aria-invalid=\"true\">"), "{live}");
}

#[test]
fn errors_without_a_field_of_their_own_go_to_the_nearest_one_or_above_the_editor() {
    let (_, json) = SCENARIOS[0];
    // A support beyond the end of the beam: core names the attachment's position.
    let beyond = json.replace("\"position\": \"1450 mm\"", "\"position\": \"1600 mm\"");
    let html = widget_html(&beyond);
    assert_eq!(attributes(&html, "data-for"), vec!["attachments[0].position"]);
    // Not JSON at all: the message goes above the editor, and nothing breaks.
    let html = widget_html("{ not json");
    assert_no_bad_numbers("not json", &html);
    assert_eq!(attributes(&html, "data-for"), vec![""]);
    assert!(html.contains("mb-general-errors\"><span class=\"mb-field-error\""));
    assert!(html.contains("mb-stale"));
}

#[test]
fn labels_are_escaped_everywhere() {
    let (_, json) = SCENARIOS[0];
    let hostile = json.replace("\"camera head\"", r#""<b>&\"x'""#).replace("\"cell fan\"", r#""<i>fan</i>""#);
    let html = widget_html(&hostile);
    assert!(!html.contains("<b>") && !html.contains("<i>"), "user markup reached the page");
    assert!(html.contains("&lt;b&gt;&amp;&quot;x&#39;"), "the label is shown escaped");
    assert!(html.contains("&lt;i&gt;fan&lt;/i&gt;"));
}

#[test]
fn rigid_body_modes_show_as_zero_hz_and_labelled() {
    let json = r#"{"left": "free", "right": "free", "modes": 2,
        "segments": [{"length": "1 m", "flexural_rigidity": 1, "mass_per_length": 1}]}"#;
    let html = widget_html(json);
    assert_no_bad_numbers("free-free", &html);
    assert!(html.contains(
        "data-hz=\"0\"><span class=\"mb-main\">0 Hz</span> <span class=\"mb-tag\">rigid-body motion</span>"
    ));
}

#[test]
fn the_editor_shows_a_field_for_every_part_of_the_scenario() {
    let (_, json) = SCENARIOS[2];
    let Ok(doc) = doc::read(json) else { panic!("the pipe scenario is JSON") };
    let fields = render::field_paths(&doc);
    for path in [
        "units",
        "theory",
        "modes",
        "margin",
        "left",
        "right",
        "right.translational",
        "right.rotational",
        "segments[0].length",
        "segments[0].section.shape",
        "segments[0].section.outer_diameter",
        "segments[0].section.wall",
        "segments[0].material",
        "segments[0].extra_mass.contents_density",
        "segments[0].extra_mass.lining",
        "segments[0].extra_mass.submerged",
        "attachments[0].type",
        "attachments[0].position",
        "attachments[0].label",
        "attachments[1].mass",
        "attachments[1].rotary_inertia",
        "excitations[0].label",
        "excitations[0].frequency",
        "excitations[0].up_to",
        "excitations[0].orders",
    ] {
        assert!(fields.iter().any(|f| f == path), "no field for {path}");
    }
    let html = render::editor_html(&doc, None, Editing::Live);
    assert!(
        html.contains("data-field=\"right.rotational\" data-unit=\"N·m/rad\" value=\"0\""),
        "numbers are shown as written, in SI units where the system's are SI"
    );
}

#[test]
fn the_page_as_built_shows_every_field_fixed_and_no_form_control() {
    for (case, json) in SCENARIOS {
        let Ok(doc) = doc::read(json) else { panic!("{case}: the scenario is JSON") };
        let live = render::editor_html(&doc, None, Editing::Live);
        let fixed = render::editor_html(&doc, None, Editing::Fixed);
        for control in ["<input", "<select", "<option", "<label"] {
            assert!(live.contains(control) || control == "<label", "{case}: the live editor has {control}");
            assert!(!fixed.contains(control), "{case}: the fixed editor has {control}");
        }
        // The same fields in the same order, each showing what was typed (or, when nothing
        // was, the hint the input would show).
        assert_eq!(attributes(&fixed, "data-field"), attributes(&live, "data-field"), "{case}");
        let html = widget_html(json);
        let mut inputs = 0;
        for tag in live.split("<input ").skip(1) {
            let tag = &tag[..tag.find('>').unwrap_or(tag.len())];
            let (Some(field), Some(value), Some(hint)) =
                (attribute(tag, "data-field"), attribute(tag, "value"), attribute(tag, "placeholder"))
            else {
                continue;
            };
            let shown = if value.is_empty() { hint } else { value };
            assert!(
                html.contains(&format!("data-field=\"{field}\">{shown}</span>")),
                "{case}: {field} not shown fixed"
            );
            inputs += 1;
        }
        assert!(inputs > 10, "{case}: only {inputs} inputs checked");
        assert!(html.contains(&fixed), "{case}: the page is built with the fixed editor");
    }
}

#[test]
fn a_fixed_select_shows_the_choice_by_name() {
    let (_, json) = SCENARIOS[0];
    let Ok(doc) = doc::read(json) else { panic!("the boom scenario is JSON") };
    let fixed = render::editor_html(&doc, None, Editing::Fixed);
    assert!(fixed.contains("data-field=\"left\">Clamped</span>"), "{fixed}");
    assert!(fixed.contains(">Section and material</span>"), "{fixed}");
}

#[test]
fn results_keep_the_mode_chosen_and_the_sections_opened() {
    let (_, json) = SCENARIOS[0];
    let report = modebench::solve_json(json).ok();
    let view = View { mode: 3, open: vec!["conversions".to_string()] };
    let html = render::results_html(report.as_ref(), false, &view);
    assert!(html.contains("data-show-mode=\"3\" aria-pressed=\"true\""));
    assert!(html.contains("data-part=\"conversions\" open"));
    assert!(html.contains("Mode 3: "));
}

#[test]
fn an_end_spring_left_empty_says_it_is_no_spring() {
    // An elastic end's spring left out is 0 (the schema's default): its empty box says so,
    // where a grounded spring's stiffness, which must be given, asks for a number.
    let json = r#"{ "units": "SI", "left": { "type": "elastic", "rotational": "60000 N*m/rad" }, "right": "free",
        "segments": [ { "length": "1.2 m", "section": { "shape": "round", "diameter": "40 mm" },
                        "material": "steel" } ],
        "attachments": [ { "type": "spring", "position": "0.6 m" } ] }"#;
    let Ok(doc) = doc::read(json) else { panic!("the scenario is JSON") };
    let live = render::editor_html(&doc, None, Editing::Live);
    let hint = |field: &str| {
        let tag = live.split("<input ").find(|tag| tag.contains(&format!("data-field=\"{field}\"")));
        tag.and_then(|tag| attribute(&tag[..tag.find('>').unwrap_or(tag.len())], "placeholder"))
    };
    assert_eq!(hint("left.translational"), Some("none if empty, or rigid"), "{live}");
    assert_eq!(hint("attachments[0].stiffness"), Some("a number, or rigid"), "{live}");
}
