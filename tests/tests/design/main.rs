//! The design tools against results known in closed form, published values and re-solves:
//! as functions of input values on models built directly (`functions.rs`), through the
//! scenario format and the report, as the page and the command line use them (`scenarios.rs`),
//! and the derivative of each frequency through its mode shape (`gradient.rs`).

mod functions;
mod gradient;
mod scenarios;
