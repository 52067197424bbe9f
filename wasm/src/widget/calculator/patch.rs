//! Draws the results over the drawing before them by replacing only the elements that changed
//! ([`render::patch`]), so that an answer for a model with hundreds of rows costs the page the
//! rows that changed, not all of them.

use crate::render::patch::{self, Drawing, Plan};
use wasm_bindgen::JsCast;
use web_sys::Element;

/// Makes the inside of `block` the drawing `html`, given that `shown` is what was drawn there
/// last (`None` when unknown), and returns it, read, for the next. Anything unexpected (the
/// element count or a tag not as drawn, because something else changed the block) draws the
/// block whole.
pub(super) fn draw(block: &Element, shown: Option<&Drawing>, html: String) -> Drawing {
    let new = Drawing::new(html);
    let plan = shown.map_or(Plan::Whole, |old| patch::plan(old, &new));
    let html = new.text();
    let patches = match plan {
        Plan::Same => return new,
        Plan::Whole => None,
        Plan::Patches { elements, patches } => {
            // Only the targets are taken out of the list, not its thousands of other elements.
            let all = block.query_selector_all("*").ok().filter(|l| l.length() as usize == elements);
            let targets: Option<Vec<(Element, &str)>> = all.and_then(|all| {
                patches
                    .iter()
                    .map(|p| {
                        let element = u32::try_from(p.index).ok().and_then(|i| all.get(i));
                        element
                            .and_then(|e| e.dyn_into::<Element>().ok())
                            .filter(|e| e.tag_name().eq_ignore_ascii_case(&p.tag))
                            .map(|e| (e, p.html.as_str()))
                    })
                    .collect()
            });
            targets.map(|t| t.into_iter().for_each(|(e, html)| e.set_outer_html(html)))
        }
    };
    if patches.is_none() {
        block.set_inner_html(html);
    }
    new
}
