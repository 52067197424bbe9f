//! The plan of replacements, checked by carrying it out on the old text: the result must be the
//! new text exactly, for the calculator's own results drawn before and after an edit.

use super::{attributes, parse, unescape, Drawing, Edit, Node, Plan};
use crate::render::escape;
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

/// A drawing as the browser holds it: elements with their attributes read, and text.
#[derive(Clone, Debug)]
enum Item {
    Element { tag: String, attributes: Vec<(String, String)>, closed: bool, children: Vec<Item> },
    Text(String),
}

/// Reads markup as the browser would (our markup only).
fn items(text: &str) -> Vec<Item> {
    fn read(text: &str, at: &mut usize, out: &mut Vec<Item>) {
        while *at < text.len() {
            let rest = &text[*at..];
            if rest.starts_with("</") {
                *at += rest.find('>').expect("end tag") + 1;
                return;
            }
            if !rest.starts_with('<') {
                let end = rest.find('<').unwrap_or(rest.len());
                out.push(Item::Text(unescape(&rest[..end]).unwrap_or_else(|| rest[..end].to_string())));
                *at += end;
                continue;
            }
            let end = rest.find('>').expect("start tag") + 1;
            let name_end = rest[1..].find(|c: char| !c.is_ascii_alphanumeric()).expect("tag name") + 1;
            let pairs = attributes(&rest[name_end..end]).expect("attributes");
            let attributes =
                pairs.iter().map(|(n, v)| (n.to_string(), unescape(v).expect("value"))).collect();
            let closed = rest[..end].ends_with("/>");
            *at += end;
            let mut children = Vec::new();
            if !closed {
                read(text, at, &mut children);
            }
            out.push(Item::Element { tag: rest[1..name_end].to_string(), attributes, closed, children });
        }
    }
    let mut out = Vec::new();
    read(text, &mut 0, &mut out);
    out
}

/// Writes items back as markup, attributes in name order, so that two drawings the browser
/// holds alike are written alike.
fn write(items: &[Item]) -> String {
    let mut out = String::new();
    for item in items {
        match item {
            Item::Text(t) => out.push_str(&escape(t)),
            Item::Element { tag, attributes, closed, children } => {
                let mut sorted = attributes.clone();
                sorted.sort();
                out.push_str(&format!("<{tag}"));
                for (n, v) in sorted {
                    out.push_str(&format!(" {n}=\"{}\"", escape(&v)));
                }
                if *closed {
                    out.push_str("/>");
                } else {
                    out.push_str(&format!(">{}</{tag}>", write(children)));
                }
            }
        }
    }
    out
}

/// Calls `f` with the list that holds the element at document-order place `n` and its place
/// there; false when there is no such element.
fn at(list: &mut Vec<Item>, n: usize, seen: &mut usize, f: &mut dyn FnMut(&mut Vec<Item>, usize)) -> bool {
    for i in 0..list.len() {
        if let Item::Element { .. } = &list[i] {
            if *seen == n {
                f(list, i);
                return true;
            }
            *seen += 1;
            let Item::Element { children, .. } = &mut list[i] else { unreachable!() };
            if at(children, n, seen, f) {
                return true;
            }
        }
    }
    false
}

/// `old` with the plan carried out, as the page does it, and written back; with the plan.
fn carry_out(old: &str, new: &str) -> (String, Plan) {
    let plan = plan(old, new);
    let text = match &plan {
        Plan::Same => write(&items(old)),
        Plan::Whole => write(&items(new)),
        Plan::Patches { elements, patches } => {
            let spans = spans(old);
            assert_eq!(spans.len(), *elements);
            let mut held = items(old);
            // Texts and attributes first: they move no element. Then the replacements from the
            // last, so that each one's place is still as in the old drawing; none lies inside
            // another (the page finds every target before it replaces any).
            let mut replaced: Vec<(usize, &str)> = Vec::new();
            for p in patches {
                if let Edit::Replace(html) = &p.edit {
                    replaced.push((p.index, html));
                    continue;
                }
                let found = at(&mut held, p.index, &mut 0, &mut |list, i| {
                    let Item::Element { attributes, children, .. } = &mut list[i] else { unreachable!() };
                    match &p.edit {
                        Edit::Text(t) => *children = vec![Item::Text(t.clone())],
                        Edit::Set(n, v) => match attributes.iter_mut().find(|(name, _)| name == n) {
                            Some(a) => a.1 = v.clone(),
                            None => attributes.push((n.clone(), v.clone())),
                        },
                        Edit::Remove(n) => attributes.retain(|(name, _)| name != n),
                        Edit::Replace(_) => unreachable!(),
                    }
                });
                assert!(found, "patch {p:?} names no element of the old drawing");
            }
            replaced.sort_by_key(|r| std::cmp::Reverse(r.0));
            let ends: Vec<(usize, usize)> = replaced.iter().map(|r| (spans[r.0].0, spans[r.0].1)).collect();
            let mut sorted = ends.clone();
            sorted.sort();
            assert!(sorted.windows(2).all(|w| w[0].1 <= w[1].0), "nested replacements");
            for (index, html) in replaced {
                let found = at(&mut held, index, &mut 0, &mut |list, i| {
                    list.splice(i..=i, items(html));
                });
                assert!(found, "replacement {index} names no element of the old drawing");
            }
            write(&held)
        }
    };
    (text, plan)
}

/// The markup of the replacements in a plan, with the tag of each element they replace.
fn replacements<'a>(old: &'a str, plan: &'a Plan) -> Vec<(&'a str, &'a str)> {
    let Plan::Patches { patches, .. } = plan else { panic!("a plan of patches: {plan:?}") };
    let spans = spans(old);
    patches
        .iter()
        .filter_map(|p| match &p.edit {
            Edit::Replace(html) => Some((&old[spans[p.index].2 .0..spans[p.index].2 .1], html.as_str())),
            _ => None,
        })
        .collect()
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

/// A drawing as the browser holds it, written back.
fn held(text: &str) -> String {
    write(&items(text))
}

#[test]
fn carrying_out_the_plan_gives_the_new_drawing() {
    let cases = [
        (boom(0, "2.0 kg"), boom(0, "2.1 kg")),
        (boom(60, "2.0 kg"), boom(60, "2.5 kg")),
        // A row more: the echo's tables change length, the rest in place.
        (boom(60, "2.0 kg"), boom(61, "2.0 kg")),
        (boom(3, "2.0 kg"), boom(0, "2.0 kg")),
        // A mass far out of range: warnings come, and go again.
        (boom(0, "2.0 kg"), boom(0, "200 kg")),
        (boom(0, "200 kg"), boom(0, "2.0 kg")),
    ];
    for (a, b) in &cases {
        let (old, new) = (results(a), results(b));
        let (text, plan) = carry_out(&old, &new);
        assert_eq!(text, held(&new));
        assert!(matches!(plan, Plan::Patches { .. }), "{plan:?}");
    }
}

#[test]
fn one_value_typed_into_a_long_model_changes_a_small_part_of_its_results_in_place() {
    // 200 extra masses: the inputs as modelled and the conversions have a row for each, and one
    // mass changed changes one row of each, the frequencies, the plot and the bounds: texts and
    // attributes set in place, no element replaced, and far fewer changes than elements.
    let (old, new) = (results(&boom(200, "2.0 kg")), results(&boom(200, "2.5 kg")));
    // The frequency map gains a mark (mode 2 comes too close to an excitation), and is the only
    // element written whole.
    let plan = plan(&old, &new);
    let written = replacements(&old, &plan);
    assert!(written.iter().all(|(tag, _)| *tag == "svg") && written.len() <= 1, "{written:?}");
    let Plan::Patches { patches, elements } = &plan else { panic!("a plan of patches") };
    assert!(patches.len() * 10 < *elements, "{} changes of {elements} elements", patches.len());
}

#[test]
fn one_mass_changed_sets_texts_and_attributes_and_replaces_nothing() {
    // One mass of the camera boom changed: every cell of the mode table and every line of the
    // frequency map and the plot change, and none changes its kind: the page sets their texts
    // and attributes and parses no markup.
    let (old, new) = (results(&boom(0, "2.0 kg")), results(&boom(0, "2.1 kg")));
    let (text, plan) = carry_out(&old, &new);
    assert_eq!(text, held(&new));
    assert_eq!(replacements(&old, &plan), vec![]);
    let Plan::Patches { patches, .. } = &plan else { panic!("a plan of patches") };
    assert!(patches.iter().any(|p| matches!(p.edit, Edit::Text(_))), "{patches:?}");
    assert!(
        patches.iter().any(|p| matches!(&p.edit, Edit::Set(n, _) if n == "points")),
        "the plot's line: {patches:?}"
    );
}

#[test]
fn the_same_drawing_needs_nothing_and_text_at_the_top_replaces_the_whole() {
    let old = results(&boom(0, "2.0 kg"));
    assert_eq!(plan(&old, &old), Plan::Same);
    // A stale note put first is written with the first element, which is kept.
    let stale = format!("<p class=\"mb-stale-note\">x</p>{old}");
    let (text, plan) = carry_out(&old, &stale);
    assert_eq!(text, held(&stale));
    let written = replacements(&old, &plan);
    assert_eq!(written.len(), 1);
    assert!(written[0].1.len() < 200, "{written:?}");
    // Text beside the block's elements: the block is drawn whole.
    assert_eq!(super::plan(&Drawing::new(old.clone()), &Drawing::new(format!("x{old}"))), Plan::Whole);
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
    assert_eq!(text, held(new));
    assert_eq!(
        plan,
        Plan::Patches { elements: 5, patches: vec![super::Patch { index: 4, edit: Edit::Text("2".into()) }] }
    );
}

#[test]
fn texts_and_attributes_are_set_as_the_browser_reads_them() {
    // Escaped text and values are handed over unescaped (the page sets them as text, not
    // markup); an attribute that went is removed and one that came is set.
    let old = "<table><tr><td class=\"a\">1 &lt; 2</td><td>x</td></tr></table><svg><path d=\"M0 0\" class=\"m1\"/></svg>";
    let new = "<table><tr><td class=\"b &amp; c\">3 &gt; 2 &#39;q&#39;</td><td hidden>x</td></tr></table><svg><path d=\"M1 1\"/></svg>";
    let (text, plan) = carry_out(old, new);
    assert_eq!(text, held(new));
    let Plan::Patches { patches, .. } = plan else { panic!("patches") };
    let edits: Vec<(usize, Edit)> = patches.into_iter().map(|p| (p.index, p.edit)).collect();
    assert_eq!(
        edits,
        vec![
            (2, Edit::Set("class".into(), "b & c".into())),
            (2, Edit::Text("3 > 2 'q'".into())),
            (3, Edit::Set("hidden".into(), String::new())),
            (5, Edit::Set("d".into(), "M1 1".into())),
            (5, Edit::Remove("class".into())),
        ]
    );
    // A tag that changed, and a reference our markup never writes, replace the element whole.
    for (old, new) in [("<p><b>1</b></p>", "<p><i>1</i></p>"), ("<p><b>1</b></p>", "<p><b>&nbsp;</b></p>")] {
        let (text, plan) = carry_out(old, new);
        assert_eq!(text, held(new));
        assert_eq!(
            plan,
            Plan::Patches {
                elements: 2,
                patches: vec![super::Patch { index: 1, edit: Edit::Replace(new[3..new.len() - 4].into()) }]
            }
        );
    }
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
        assert_eq!(text, held(&new), "{before:?} to {after:?}");
        // Only rows are written, never the list whole, and fewer rows than the list has.
        let written: usize =
            replacements(&old, &plan).iter().map(|(_, html)| html.matches("<li>").count()).sum();
        assert!(written < after.len().max(2), "{before:?} to {after:?}: {plan:?}");
    }
    // An element with text between its children keeps that text while it stays the same, and
    // is replaced whole when it changes or a child comes.
    let cases = [
        ("<p>a <b>1</b></p>", "<p>a <b>2</b></p>", Edit::Text("2".into()), 1),
        ("<p>a <b>1</b></p>", "<p>c <b>1</b></p>", Edit::Replace("<p>c <b>1</b></p>".into()), 0),
        (
            "<p>a <b>1</b></p>",
            "<p>a <b>1</b><b>2</b></p>",
            Edit::Replace("<p>a <b>1</b><b>2</b></p>".into()),
            0,
        ),
    ];
    for (old, new, edit, index) in cases {
        let (text, plan) = carry_out(old, new);
        assert_eq!(text, held(new));
        assert_eq!(plan, Plan::Patches { elements: 2, patches: vec![super::Patch { index, edit }] });
    }
}
