//! Natural frequencies and mode shapes of beams that carry masses, springs and supports.
//!
//! # Conventions
//! - Everything inside the crate is SI (m, kg, s, N, Pa, rad) in `f64`; units are converted only
//!   where a scenario is read and where results are displayed.
//! - Frequencies are reported in hertz, ascending; angular frequency ω = 2πf is used internally.

pub mod error;
pub mod extra_mass;
pub mod material;
pub mod path;
pub mod schema;
pub mod section;
pub mod units;

pub use error::{Error, ErrorKind, Result};
pub use path::FieldPath;
pub mod model;

mod band;
mod det;
mod layout;
mod member;
mod roots;

pub use model::{Attachment, End, Model, ModelParts, Segment, Theory};
pub mod analysis;
pub mod axial;
#[cfg(feature = "bench")]
pub mod bench;
pub mod bounds;
pub mod design;
pub mod exact;
pub mod fe;

pub use analysis::{analyse, Analysis, Options};
pub mod report;
pub mod scenario;

pub use report::{frequencies_value, solve, solve_json, solve_value, solve_value_with_hints, Report};
pub use scenario::Scenario;
mod sort;
