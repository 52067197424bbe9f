//! The design tools against results known in closed form, published values and re-solves:
//! as functions of input values on models built directly (`functions.rs`), and through the
//! scenario format and the report, as the page and the command line use them (`scenarios.rs`).

mod functions;
mod scenarios;
