//! The results of a scenario, in SI, ready to be shown: one row per mode from every method, the
//! bounds on mode 1, the inputs echoed, every conversion applied, and the warnings.
//!
//! The report only presents: the analysis ([`crate::analysis`]) makes every judgement (the other
//! theory's frequencies, the separation margins). [`types`] holds what is shown, `pipeline` the
//! entry points from scenario to report, `echo` the inputs as modelled.

mod echo;
mod pipeline;
pub mod read;
#[cfg(test)]
mod tests;
pub mod types;

pub use crate::analysis::Separation;
pub use crate::model::{AttachmentKind, EndKind};
pub use pipeline::{frequencies_value, solve, solve_json, solve_value, solve_value_with_hints};
pub use read::{report_from_json, FromJson};
pub use types::*;
