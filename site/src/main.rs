//! Builds and serves the Modebench documentation site.

fn main() {}
