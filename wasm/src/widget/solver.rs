//! The page's side of a calculator's solving worker: starts it, hands it one scenario at a time,
//! takes its answers, and stops it and starts a fresh one when a solve runs past the budget.
//! Which scenario goes next, and which answers count, is decided by [`Latest`].

use crate::render::View;
use crate::worker::latest::{Expiry, Job, Latest, Purpose, Verdict};
use crate::worker::message::{self, Drawn};
use js_sys::{Function, Object, Reflect};
use wasm_bindgen::{JsCast, JsValue};
use web_sys::{MessageEvent, Worker, WorkerOptions, WorkerType};

use super::dom;

/// How long an edit's solve runs before the results on show are greyed as belonging to an
/// earlier input, ms: a documented scenario answers well within it, so quick edits never flicker.
pub(super) const GREY_AFTER_MS: i32 = 300;

/// What starts a calculator's worker, and the callbacks the worker and its timers call; they live
/// as long as the page.
pub(super) struct Callbacks {
    /// What starts the worker in place of `new Worker`, if the page gave that ([`new_worker`]).
    pub(super) start: Option<Function>,
    /// Takes a worker's `message` event.
    pub(super) message: Function,
    /// Takes a worker's `error` event.
    pub(super) error: Function,
    /// Called when a solve may have run past its budget.
    pub(super) deadline: Function,
    /// Called when an edit's solve may have run long enough to grey the results.
    pub(super) slow: Function,
}

/// One calculator's worker and its queue.
pub(super) struct Solver {
    url: String,
    worker: Option<Worker>,
    latest: Latest,
    callbacks: Option<Callbacks>,
    /// The reader's view as of the newest scenario submitted, which the worker draws the
    /// results for.
    view: View,
}

/// A worker's answer, as the page takes it: what it is worth, and its texts as JavaScript
/// strings, not copied into the engine until read (a long model's whole answer is a megabyte,
/// and the page reads only what it draws).
pub(super) struct Answer {
    pub(super) verdict: Verdict,
    /// The answer the page reads: its shapes cut to what the plot needs.
    pub(super) thinned: JsValue,
    /// The whole answer, for the results file and the tap-test panel.
    pub(super) whole: JsValue,
    /// The message itself, which may hold the results and summary the worker drew.
    data: JsValue,
}

impl Answer {
    /// The results and summary the worker drew, with the view it drew them for; `None` when it
    /// drew none (an error, or a long answer).
    pub(super) fn drawn(&self) -> Option<(View, Drawn)> {
        let get = |key: &str| Reflect::get(&self.data, &key.into()).ok();
        let results = get("results")?.as_string()?;
        let summary = get("summary")?.as_string()?;
        let view = message::view_from_message(get("mode")?.as_f64()?, &get("open")?.as_string()?);
        Some((view, Drawn { results, summary }))
    }
}

impl Solver {
    pub(super) fn new(url: &str, budget_ms: f64) -> Solver {
        Solver {
            url: url.to_string(),
            worker: None,
            latest: Latest::new(budget_ms),
            callbacks: None,
            view: View::default(),
        }
    }

    /// Gives the solver its callbacks and starts the worker, so that it has loaded its engine by
    /// the time the first scenario comes.
    pub(super) fn connect(&mut self, callbacks: Callbacks) {
        self.callbacks = Some(callbacks);
        self.start();
    }

    /// How long a solve may take, ms.
    pub(super) fn budget_ms(&self) -> f64 {
        self.latest.budget_ms()
    }

    /// Asks for a scenario to be solved, its results drawn for `view`: at once if the worker is
    /// free, else after the solve under way, in place of any scenario already waiting.
    pub(super) fn submit(&mut self, purpose: Purpose, text: String, view: &View) {
        self.view.clone_from(view);
        if let Some(job) = self.latest.submit(purpose, text, dom::now()) {
            self.send(job);
        }
    }

    /// After the newest edit was refused, asks for the edit before it to be solved again if its
    /// answer was never drawn ([`Latest::earlier`]).
    pub(super) fn submit_earlier(&mut self, view: &View) {
        if let Some(text) = self.latest.earlier() {
            self.submit(Purpose::Earlier, text, view);
        }
    }

    /// Takes a worker's message ([`Answer`]), or `None` when the worker reports that it could
    /// not load its engine (the caller then calls [`Solver::fail`]). Hands the worker the next
    /// scenario, if one waits.
    pub(super) fn answered(&mut self, event: &MessageEvent) -> Option<Answer> {
        let data = event.data();
        let id = Reflect::get(&data, &"id".into()).ok()?.as_f64()?;
        let whole = Reflect::get(&data, &"answer".into()).ok().filter(JsValue::is_string)?;
        // Sent with every answer; were it missing, reading it would say the answer is unreadable.
        let thinned = Reflect::get(&data, &"thinned".into()).ok()?;
        let (verdict, next) = self.latest.answered(id as u32, dom::now());
        if let Some(job) = next {
            self.send(job);
        }
        Some(Answer { verdict, thinned, whole, data })
    }

    /// Gives up a solve that has run past its budget: stops the worker, starts a fresh one and
    /// hands it the waiting scenario, if any. `None` when nothing is overdue.
    pub(super) fn expire(&mut self) -> Option<Expiry> {
        let expiry = self.latest.expire(dom::now())?;
        self.replace(&expiry);
        Some(expiry)
    }

    /// Gives up the solve under way because the worker failed (it could not load, or stopped on
    /// an internal error), as [`Solver::expire`] does.
    pub(super) fn fail(&mut self) -> Option<Expiry> {
        // A failed worker is not used again, even with nothing under way: the next scenario
        // starts a fresh one (and, should that fail too, is told so at once, not at its deadline).
        if let Some(worker) = self.worker.take() {
            worker.terminate();
        }
        let expiry = self.latest.fail(dom::now())?;
        self.replace(&expiry);
        Some(expiry)
    }

    /// Whether a scenario is with the worker or waiting for it.
    pub(super) fn busy(&self) -> bool {
        self.latest.busy()
    }

    /// Why the solve under way was asked for and how long it has run, ms.
    pub(super) fn running(&self) -> Option<(Purpose, f64)> {
        self.latest.running(dom::now())
    }

    fn replace(&mut self, expiry: &Expiry) {
        if let Some(worker) = self.worker.take() {
            worker.terminate();
        }
        self.start();
        if let Some(job) = expiry.next.clone() {
            self.send(job);
        }
    }

    /// Starts a worker if there is none. A worker that cannot be created (a browser without
    /// module workers, a policy that forbids it) leaves none, and each solve then fails at once.
    fn start(&mut self) {
        let Some(callbacks) = &self.callbacks else { return };
        if self.worker.is_some() {
            return;
        }
        if let Ok(worker) = new_worker(&self.url, callbacks.start.as_ref()) {
            worker.set_onmessage(Some(&callbacks.message));
            worker.set_onerror(Some(&callbacks.error));
            self.worker = Some(worker);
        }
    }

    fn send(&mut self, job: Job) {
        self.start();
        let (Some(callbacks), Some(window)) = (&self.callbacks, web_sys::window()) else { return };
        let later = |callback: &Function, ms: i32| {
            let _ = window.set_timeout_with_callback_and_timeout_and_arguments_0(callback, ms);
        };
        let request = Object::new();
        let _ = Reflect::set(&request, &"id".into(), &JsValue::from(job.id));
        let _ = Reflect::set(&request, &"scenario".into(), &JsValue::from_str(&job.text));
        let (mode, open) = message::view_to_message(&self.view);
        let _ = Reflect::set(&request, &"mode".into(), &JsValue::from(mode));
        let _ = Reflect::set(&request, &"open".into(), &JsValue::from_str(&open));
        let posted = self.worker.as_ref().is_some_and(|w| w.post_message(&request).is_ok());
        if !posted {
            // No worker to solve it: the solve fails as soon as this edit has been handled,
            // rather than at its deadline.
            later(&callbacks.error, 0);
            return;
        }
        // One timer per solve, a millisecond past its budget; a timer that finds its solve
        // answered does nothing.
        later(&callbacks.deadline, (self.latest.budget_ms() + 1.0).min(f64::from(i32::MAX)) as i32);
        if job.purpose == Purpose::Edit {
            later(&callbacks.slow, GREY_AFTER_MS);
        }
    }
}

/// A worker for the script at `url`, started by `start` when the page gave one: called with the
/// URL, it returns an object with a worker's methods (`postMessage`, `terminate`) and handlers
/// (`onmessage`, `onerror`), whose answers come as a worker's would, in a later task or
/// microtask, never from inside `postMessage`. Otherwise a module worker.
fn new_worker(url: &str, start: Option<&Function>) -> Result<Worker, JsValue> {
    match start {
        Some(start) => match start.call1(&JsValue::NULL, &url.into()) {
            Ok(worker) if worker.is_object() => Ok(worker.unchecked_into()),
            other => Err(other.unwrap_or_else(|error| error)),
        },
        None => {
            let options = WorkerOptions::new();
            options.set_type(WorkerType::Module);
            Worker::new_with_options(url, &options)
        }
    }
}

/// The budget of a solve, ms: [`crate::worker::SOLVE_BUDGET_MS`], unless the page set
/// `globalThis.modebenchSolveBudgetMs` to a positive number before its script started.
pub(super) fn budget_ms() -> f64 {
    let set = Reflect::get(&js_sys::global(), &crate::worker::BUDGET_OVERRIDE.into()).ok();
    set.and_then(|v| v.as_f64())
        .filter(|ms| ms.is_finite() && *ms > 0.0)
        .unwrap_or(crate::worker::SOLVE_BUDGET_MS)
}
