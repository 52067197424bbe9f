//! Solving in a Web Worker, off the page's main thread: the messages both sides exchange
//! ([`message`]) and which scenario the worker solves next ([`latest`]). Both are plain Rust,
//! tested natively; the page's side of the worker is in the widget, the worker's entry point in
//! the JS API (`solveForPage`).

pub mod latest;
pub mod message;

/// How long one solve may take before the page stops the worker and starts a fresh one, ms.
/// Far above what any documented scenario needs (tens of milliseconds), and short enough that a
/// reader who made a slip is told while they still remember it.
pub const SOLVE_BUDGET_MS: f64 = 3000.0;

/// The global a page may set before its script starts to give solves another budget, in ms (the
/// browser tests use it to make a slow model overrun at once).
pub const BUDGET_OVERRIDE: &str = "modebenchSolveBudgetMs";
