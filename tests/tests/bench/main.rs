//! The tap test against records with known answers: seeded synthetic ring-downs (`synthetic.rs`),
//! files written by independent writers and scipy's own reading of the same signals
//! (`reference.rs`), and malformed files (`files.rs`).

mod files;
mod reference;
mod synthetic;
