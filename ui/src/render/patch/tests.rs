//! The plan of replacements, checked by carrying it out on the old text: the result must be the
//! new text exactly, for the calculator's own results drawn before and after an edit.

use super::{parse, Drawing, Node, Plan};
use crate::render::{results_inner, View};

/// The span of every element of a drawing and its tag name, by document-order place.
fn spans(text: &str) -> Vec<(usize, usize, (usize, usize))> {
    fn walk(node: &Node, out: &mut Vec<(usize, usize, (usize, usize))>) {
        for c in &node.children {
            out.push((c.start, c.end, c.tag));
            walk(c, out);
        }
    }
    let (root, count) = parse(text).expect("our markup reads as a tree");
    let mut out = Vec::new();
    walk(&root, &mut out);
    assert_eq!(out.len(), count);
    out.sort_by_key(|s| s.0);
    out
}

/// The plan from `old` to `new`.
fn plan(old: &str, new: &str) -> Plan {
    super::plan(&Drawing::new(old.to_string()), &Drawing::new(new.to_string()))
}

/// `old` with the plan carried out, as the page does it.
fn carry_out(old: &str, new: &str) -> (String, Plan) {
    let plan = plan(old, new);
    let text = match &plan {
        Plan::Same => old.to_string(),
        Plan::Whole => new.to_string(),
        Plan::Patches { elements, patches } => {
            let spans = spans(old);
            assert_eq!(spans.len(), *elements);
            let mut targets: Vec<_> = patches
                .iter()
                .map(|p| {
                    let (start, end, _) = &spans[p.index];
                    (*start, *end, p.html.as_str())
                })
                .collect();
            targets.sort_by_key(|t| t.0);
            // No patch lies inside another: the page replaces each target once.
            assert!(targets.windows(2).all(|w| w[0].1 <= w[1].0), "nested patches");
            let mut out = String::new();
            let mut at = 0;
            for (start, end, html) in targets {
                out.push_str(&old[at..start]);
                out.push_str(html);
                at = end;
            }
            out.push_str(&old[at..]);
            out
        }
    };
    (text, plan)
}

fn results(json: &str) -> String {
    let report = modebench::solve_json(json).expect("the scenario solves");
    results_inner(Some(&report), false, &View::default())
}

/// The sensor boom of the documentation with `extra` masses of 5 g spread along it, and the
/// first attachment's mass as given.
fn boom(extra: usize, tip_mass: &str) -> String {
    let mut scenario: serde_json::Value =
        serde_json::from_str(include_str!("../../../../docs/scenarios/sensor-boom.json")).expect("JSON");
    scenario["attachments"][0]["mass"] = tip_mass.into();
    let list = scenario["attachments"].as_array_mut().expect("attachments");
    for i in 1..=extra {
        list.push(
            serde_json::json!({"type": "mass", "position": format!("{} mm", 100 + 5 * i), "mass": "5 g"}),
        );
    }
    scenario.to_string()
}

#[test]
fn carrying_out_the_plan_gives_the_new_drawing() {
    let cases = [
        (boom(0, "2.0 kg"), boom(0, "2.1 kg")),
        (boom(60, "2.0 kg"), boom(60, "2.5 kg")),
        // A row more: the echo's tables change length, the rest in place.
        (boom(60, "2.0 kg"), boom(61, "2.0 kg")),
        (boom(3, "2.0 kg"), boom(0, "2.0 kg")),
    ];
    for (a, b) in &cases {
        let (old, new) = (results(a), results(b));
        let (text, plan) = carry_out(&old, &new);
        assert_eq!(text, new);
        assert!(matches!(plan, Plan::Patches { .. }), "{plan:?}");
    }
}

#[test]
fn one_value_typed_into_a_long_model_replaces_a_small_part_of_its_results() {
    // 200 extra masses: the inputs as modelled and the conversions have a row for each, and one
    // mass changed changes one row of each, the frequencies, the plot and the bounds. The long
    // lists are patched row by row, never replaced whole; the mode table's four rows, which all
    // change, go as one.
    let (old, new) = (results(&boom(200, "2.0 kg")), results(&boom(200, "2.5 kg")));
    let Plan::Patches { patches, .. } = plan(&old, &new) else { panic!("a plan of patches") };
    let spans = spans(&old);
    let tags: Vec<&str> = patches.iter().map(|p| &old[spans[p.index].2 .0..spans[p.index].2 .1]).collect();
    assert!(tags.iter().all(|t| !matches!(*t, "details" | "table" | "ul")), "{tags:?}");
    let rows: usize = patches.iter().map(|p| p.html.matches("<tr").count()).sum();
    assert!(rows <= 4, "{rows} rows replaced: {tags:?}");
    let replaced: usize = patches.iter().map(|p| p.html.len()).sum();
    assert!(replaced * 3 < new.len(), "{replaced} of {} bytes replaced: {tags:?}", new.len());
    assert!(patches.len() <= 10, "{} replacements: {tags:?}", patches.len());
}

#[test]
fn many_small_changes_inside_one_element_replace_it_whole() {
    // One mass of the camera boom changed: every cell of the mode table and most lines of the
    // frequency map change. Each replacement costs the page a call into its parser, so the
    // table's body and the map go whole, in a handful of replacements instead of dozens.
    let (old, new) = (results(&boom(0, "2.0 kg")), results(&boom(0, "2.1 kg")));
    let (text, plan) = carry_out(&old, &new);
    assert_eq!(text, new);
    let Plan::Patches { patches, .. } = plan else { panic!("a plan of patches") };
    assert!(patches.len() <= 12, "{} replacements", patches.len());
    let spans = spans(&old);
    let tags: Vec<&str> = patches.iter().map(|p| &old[spans[p.index].2 .0..spans[p.index].2 .1]).collect();
    assert!(tags.contains(&"tbody"), "{tags:?}");
}

#[test]
fn the_same_drawing_needs_nothing_and_text_at_the_top_replaces_the_whole() {
    let old = results(&boom(0, "2.0 kg"));
    assert_eq!(plan(&old, &old), Plan::Same);
    // A stale note put first is written with the first element, which is kept.
    let stale = format!("<p class=\"mb-stale-note\">x</p>{old}");
    let (text, Plan::Patches { patches, .. }) = carry_out(&old, &stale) else { panic!("patches") };
    assert_eq!(text, stale);
    assert_eq!(patches.len(), 1);
    assert!(patches[0].html.len() < 200, "{patches:?}");
    // Text beside the block's elements: the block is drawn whole.
    assert_eq!(plan(&old, &format!("x{old}")), Plan::Whole);
}

#[test]
fn markup_that_is_not_well_formed_is_drawn_whole() {
    // An element left open, an end tag that closes another, a comment, a void element without
    // `/>`, a `<` that starts no tag: none is in the results' markup, and the page draws the
    // block whole rather than guess which element is which.
    for broken in
        ["<div><p>a</div>", "<div>a", "<p>a</p></div>", "<!-- x --><p>a</p>", "<p>a<br></p>", "<p>1 < 2</p>"]
    {
        assert_eq!(plan("<p>b</p>", broken), Plan::Whole, "{broken}");
    }
    // Self-closed elements have no end tag.
    let old = "<p title=\"a&gt;b\">x<svg><path d=\"M0 0\"/><rect/></svg></p><p>1</p>";
    let new = "<p title=\"a&gt;b\">x<svg><path d=\"M0 0\"/><rect/></svg></p><p>2</p>";
    let (text, plan) = carry_out(old, new);
    assert_eq!(text, new);
    let Plan::Patches { elements, patches } = plan else { panic!("patches") };
    assert_eq!(elements, 5);
    assert_eq!(patches.len(), 1);
    assert_eq!(patches[0].index, 4);
}

#[test]
fn children_that_came_or_went_are_written_in_place_of_the_old_ones() {
    // A list that gains a row in the middle, loses one, gains one at either end, and loses all
    // but one: the rows alike at both ends are kept. Its rows are long, as a long model's are, so
    // that replacing them one by one is cheaper than the list whole.
    let list = |rows: &[&str]| {
        let items: String = rows.iter().map(|r| format!("<li>{}</li>", r.repeat(5_000))).collect();
        format!("<h4>t</h4><ul class=\"x\">{items}</ul><p>end</p>")
    };
    let cases: [(&[&str], &[&str]); 6] = [
        (&["a", "b", "c", "d", "e", "f"], &["a", "b", "c", "x", "d", "e", "f"]),
        (&["a", "b", "c", "d", "e", "f"], &["a", "b", "d", "e", "f"]),
        (&["a", "b", "c", "d", "e", "f"], &["x", "a", "b", "c", "d", "e", "f"]),
        (&["a", "b", "c", "d", "e", "f"], &["a", "b", "c", "d", "e", "f", "x"]),
        (&["a", "b", "c", "d", "e", "f"], &["a", "y", "z", "f"]),
        (&["a", "b", "c", "d", "e", "f"], &["c"]),
    ];
    for (before, after) in cases {
        let (old, new) = (list(before), list(after));
        let (text, plan) = carry_out(&old, &new);
        assert_eq!(text, new, "{before:?} to {after:?}");
        let Plan::Patches { patches, .. } = plan else { panic!("{before:?} to {after:?}: patches") };
        // Only rows are written, never the list whole, and fewer rows than the list has.
        let written: usize = patches.iter().map(|p| p.html.matches("<li>").count()).sum();
        assert!(written < after.len().max(2), "{before:?} to {after:?}: {patches:?}");
    }
    // An element with text between its children is replaced whole when they change.
    let (old, new) = ("<p>a <b>1</b></p>", "<p>a <b>2</b></p>");
    let (text, plan) = carry_out(old, new);
    assert_eq!(text, new);
    assert_eq!(
        plan,
        Plan::Patches { elements: 2, patches: vec![super::Patch { index: 0, html: new.to_string() }] }
    );
}
