//! The live calculator: finds the prerendered calculators on a page, gives each a solving
//! worker, restores the reader's edits once the page shows its example, and redraws the results
//! as the worker answers each edit, through one delegated listener per calculator.

mod calculator;
mod dom;
mod io;
mod solver;
mod storage;

use calculator::Calculator;
use std::cell::RefCell;
use std::rc::Rc;
use wasm_bindgen::convert::FromWasmAbi;
use wasm_bindgen::prelude::*;
use wasm_bindgen::JsCast;
use web_sys::{Event, MessageEvent};

/// Starts every calculator that is not live yet, each with a worker running the script at
/// `worker_url` (started by `start` when given, see `solver::new_worker`), sharing and saving
/// cases through `io` (see [`io::Io`]); returns how many were started.
pub(crate) fn mount_all(worker_url: &str, io: &JsValue, start: Option<js_sys::Function>) -> usize {
    let Some(document) = web_sys::window().and_then(|w| w.document()) else { return 0 };
    let Ok(roots) = document.query_selector_all(".mb-calc[data-modebench]") else { return 0 };
    let budget = solver::budget_ms();
    let mut started = 0;
    for (index, root) in dom::elements(&roots).into_iter().enumerate() {
        if root.get_attribute("data-live").as_deref() == Some("true") {
            continue;
        }
        if mount(root, index, worker_url, start.clone(), budget, io::Io::new(io)) {
            started += 1;
        }
    }
    started
}

type Shared = Rc<RefCell<Calculator>>;

/// A callback that runs `act` on the calculator, kept for the page's life. A plain `Fn`
/// closure, because the browser may call it again while it runs: replacing a focused input
/// during a redraw makes it fire `change` at once. That nested event finds the calculator busy
/// and is ignored (the redraw already shows the latest state). The one-shot kind of closure is
/// not used: wasm-bindgen would look for its glue in a function table that wasm-opt has already
/// rewritten.
fn callback<A: FromWasmAbi + 'static>(calculator: &Shared, act: fn(&mut Calculator, A)) -> js_sys::Function {
    let calculator = Rc::clone(calculator);
    let closure = Closure::<dyn Fn(A)>::new(move |argument: A| {
        if let Ok(mut c) = calculator.try_borrow_mut() {
            act(&mut c, argument);
        }
    });
    let function = closure.as_ref().unchecked_ref::<js_sys::Function>().clone();
    closure.forget();
    function
}

/// Takes over one calculator: draws its controls, starts its worker and listens.
fn mount(
    root: web_sys::Element,
    index: usize,
    worker_url: &str,
    start: Option<js_sys::Function>,
    budget_ms: f64,
    io: io::Io,
) -> bool {
    let calculator = Rc::new(RefCell::new(Calculator::new(root.clone(), index, worker_url, budget_ms, io)));
    let callbacks = solver::Callbacks {
        start,
        message: callback(&calculator, |c, event: MessageEvent| c.on_answer(&event)),
        error: callback(&calculator, |c, _: JsValue| c.on_worker_error()),
        deadline: callback(&calculator, |c, _: JsValue| c.on_deadline()),
        slow: callback(&calculator, |c, _: JsValue| c.on_slow()),
    };
    let replies = calculator::Replies {
        linked: callback(&calculator, |c, link: JsValue| c.on_link(link.as_string())),
        opened: callback(&calculator, |c, text: JsValue| c.on_file(text.as_string())),
    };
    if let Ok(mut c) = calculator.try_borrow_mut() {
        c.set_draw_later(callback(&calculator, |c, _: JsValue| c.on_later()));
        c.go_live(callbacks, replies);
    }
    // Every mode's shape is drawn for print only, as the page is printed or print is previewed.
    let print = callback(&calculator, |c, _: JsValue| c.on_print());
    if let Some(window) = web_sys::window() {
        let _ = window.add_event_listener_with_callback("beforeprint", &print);
        if let Ok(Some(media)) = window.match_media("print") {
            let _ = media.add_event_listener_with_callback("change", &print);
        }
    }
    let listener = callback(&calculator, |c, event: Event| c.handle(&event));
    // `modebench-measured` and `modebench-attach` are the tap-test panel's: the frequencies it
    // measured, to keep in the case, and the sensor fixed to the part, to add to the model (see
    // `Calculator::on_measured` and `on_attach`).
    let attached = ["input", "change", "click", calculator::MEASURED_EVENT, calculator::ATTACH_EVENT]
        .iter()
        .all(|kind| root.add_event_listener_with_callback(kind, &listener).is_ok());
    attached && root.set_attribute("data-live", "true").is_ok()
}
