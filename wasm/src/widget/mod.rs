//! The live calculator: finds the prerendered calculators on a page, restores the reader's
//! edits, and redraws the results on every edit through one delegated listener per calculator.

mod calculator;
mod dom;
mod storage;

use calculator::Calculator;
use std::cell::RefCell;
use std::rc::Rc;
use wasm_bindgen::prelude::*;
use wasm_bindgen::JsCast;
use web_sys::Event;

/// Starts every calculator that is not live yet; returns how many were started.
pub(crate) fn mount_all() -> usize {
    let Some(document) = web_sys::window().and_then(|w| w.document()) else { return 0 };
    let Ok(roots) = document.query_selector_all(".mb-calc[data-modebench]") else { return 0 };
    let mut started = 0;
    for (index, root) in dom::elements(&roots).into_iter().enumerate() {
        if root.get_attribute("data-live").as_deref() == Some("true") {
            continue;
        }
        if mount(root, index) {
            started += 1;
        }
    }
    started
}

/// How long after going live a calculator whose report waits computes it, ms: after the page's
/// first frames, and most likely before the reader's first touch (which computes it anyway).
const COMPLETE_AFTER_MS: i32 = 200;

/// Computes a waiting report once the page has settled.
fn complete_later(calculator: &Rc<RefCell<Calculator>>) {
    let Some(window) = web_sys::window() else { return };
    let calculator = Rc::clone(calculator);
    // A plain closure kept for the page's life, like the others: the one-shot kind would need
    // wasm-bindgen to find its glue in a function table that wasm-opt has already rewritten.
    let later = Closure::<dyn Fn()>::new(move || {
        if let Ok(mut c) = calculator.try_borrow_mut() {
            c.complete();
        }
    });
    let _ = window.set_timeout_with_callback_and_timeout_and_arguments_0(
        later.as_ref().unchecked_ref(),
        COMPLETE_AFTER_MS,
    );
    later.forget();
}

/// Takes over one calculator: draws it from the stored or the page's scenario and listens.
fn mount(root: web_sys::Element, index: usize) -> bool {
    let calculator = Rc::new(RefCell::new(Calculator::new(root.clone(), index)));
    let for_frame = Rc::clone(&calculator);
    let frame = Closure::<dyn Fn()>::new(move || {
        if let Ok(mut c) = for_frame.try_borrow_mut() {
            c.flush();
        }
    });
    let mut deferred = false;
    if let Ok(mut c) = calculator.try_borrow_mut() {
        c.set_frame(frame.as_ref().unchecked_ref::<js_sys::Function>().clone());
        deferred = c.go_live();
    }
    // Both callbacks live as long as the page.
    frame.forget();
    if deferred {
        complete_later(&calculator);
    }
    let state = Rc::clone(&calculator);
    // A plain `Fn` closure, because the browser may call it again while it runs: replacing a
    // focused input during a redraw makes it fire `change` at once. That nested event finds the
    // calculator busy and is ignored (the redraw already shows the latest state).
    let listener = Closure::<dyn Fn(Event)>::new(move |event: Event| {
        if let Ok(mut c) = state.try_borrow_mut() {
            c.handle(&event);
        }
    });
    let callback = listener.as_ref().unchecked_ref();
    let attached = ["input", "change", "click"]
        .iter()
        .all(|kind| root.add_event_listener_with_callback(kind, callback).is_ok());
    listener.forget();
    attached && root.set_attribute("data-live", "true").is_ok()
}
