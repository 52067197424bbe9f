//! Draws the results over the drawing before them by changing only what changed
//! ([`render::patch`]): texts and attributes set in place, elements replaced only where their
//! kind changed, so that an answer costs the page no parsing and no styling of what it already
//! shows.

use crate::render::patch::{self, Drawing, Edit, Plan};
use wasm_bindgen::JsCast;
use web_sys::Element;

/// Makes the inside of `block` the drawing `html`, given that `shown` is what was drawn there
/// last (`None` when unknown), and returns it, read, for the next. Anything unexpected (an
/// element count not as drawn, because something else changed the block) draws the block whole.
pub(super) fn draw(block: &Element, shown: Option<&Drawing>, html: String) -> Drawing {
    let new = Drawing::new(html);
    let plan = shown.map_or(Plan::Whole, |old| patch::plan(old, &new));
    let html = new.text();
    let whole = match plan {
        Plan::Same => return new,
        Plan::Whole => true,
        Plan::Patches { elements, patches } => {
            // Only the targets are taken out of the list, not its thousands of other elements;
            // every one is found before any is replaced, and none lies inside one replaced.
            let all = block.query_selector_all("*").ok().filter(|l| l.length() as usize == elements);
            let mut targets = Vec::new();
            for p in &patches {
                let element = all.as_ref().and_then(|all| all.get(p.index as u32));
                match element.and_then(|e| e.dyn_into::<Element>().ok()) {
                    Some(e) => targets.push(e),
                    _ => break,
                }
            }
            let whole = targets.len() < patches.len();
            if !whole {
                for (e, p) in targets.iter().zip(&patches) {
                    match &p.edit {
                        Edit::Replace(html) => e.set_outer_html(html),
                        Edit::Text(text) => e.set_text_content(Some(text)),
                        Edit::Set(name, value) => {
                            let _ = e.set_attribute(name, value);
                        }
                        Edit::Remove(name) => {
                            let _ = e.remove_attribute(name);
                        }
                    }
                }
            }
            whole
        }
    };
    if whole {
        block.set_inner_html(html);
    }
    new
}
