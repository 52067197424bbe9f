//! The tap test against records with known answers: seeded synthetic ring-downs (`synthetic.rs`),
//! files written by independent writers and scipy's own reading of the same signals
//! (`reference.rs`), malformed files (`files.rs`), and the worked page's recording (`page.rs`).

mod files;
mod page;
mod reference;
mod synthetic;
