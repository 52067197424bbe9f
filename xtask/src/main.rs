//! Build, serve and test orchestration for Modebench (`cargo xtask <command>`).

fn main() {}
