//! Small helpers over web-sys: the elements of a node list, and attributes read as Rust values.

use wasm_bindgen::JsCast;
use web_sys::{Element, NodeList};

/// The elements of a node list, in document order.
pub(super) fn elements(list: &NodeList) -> Vec<Element> {
    (0..list.length()).filter_map(|i| list.get(i)).filter_map(|n| n.dyn_into::<Element>().ok()).collect()
}

/// The elements under `root` matching `selector` (none if the selector is rejected).
pub(super) fn all(root: &Element, selector: &str) -> Vec<Element> {
    root.query_selector_all(selector).map(|l| elements(&l)).unwrap_or_default()
}

/// The first element under `root` matching `selector`.
pub(super) fn first(root: &Element, selector: &str) -> Option<Element> {
    root.query_selector(selector).ok().flatten()
}

/// An attribute as a whole number.
pub(super) fn number(element: &Element, name: &str) -> Option<usize> {
    element.get_attribute(name)?.trim().parse().ok()
}

/// Puts the focus back on an element after the editor was redrawn.
pub(super) fn focus(element: &Element) {
    if let Some(e) = element.dyn_ref::<web_sys::HtmlElement>() {
        // Focusing can only fail on elements that cannot take the focus; then nothing is lost.
        let _ = e.focus();
    }
}

/// Milliseconds from the page's clock, for timing redraws (0 where there is no clock).
pub(super) fn now() -> f64 {
    web_sys::window().and_then(|w| w.performance()).map_or(0.0, |p| p.now())
}
