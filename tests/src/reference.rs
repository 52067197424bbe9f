//! The bridge to the Python reference computations in `tests/python/` (mpmath, scipy).
//!
//! The checks run when `python3` with the needed modules is present. `cargo xtask test` (and CI)
//! installs them and sets `MODEBENCH_REQUIRE_REFERENCE=1`, which turns a missing interpreter or
//! module into a failure instead of a skipped check.

use std::io::Write;
use std::process::{Command, Stdio};

/// Runs `tests/python/<script>` with `input` on stdin and returns its stdout, or `None` when
/// Python or a module is missing and the reference is not required.
///
/// # Panics
/// When the script fails, or when it cannot run and `MODEBENCH_REQUIRE_REFERENCE=1`.
pub fn run(script: &str, modules: &[&str], input: &str) -> Option<String> {
    let required = std::env::var("MODEBENCH_REQUIRE_REFERENCE").is_ok_and(|v| v == "1");
    let probe = format!("import {}", modules.join(", "));
    let available = Command::new("python3").args(["-c", &probe]).output().is_ok_and(|o| o.status.success());
    if !available {
        assert!(
            !required,
            "python3 with {modules:?} is required (MODEBENCH_REQUIRE_REFERENCE=1) but not available"
        );
        eprintln!("skipped: python3 with {modules:?} is not available; `cargo xtask test` installs it");
        return None;
    }
    let path = format!("{}/python/{script}", env!("CARGO_MANIFEST_DIR"));
    let mut child = Command::new("python3")
        .arg(&path)
        .stdin(Stdio::piped())
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .spawn()
        .expect("python3 starts");
    child.stdin.take().expect("stdin is piped").write_all(input.as_bytes()).expect("write to python3");
    let out = child.wait_with_output().expect("python3 finishes");
    if !out.status.success() {
        let saved = std::env::temp_dir().join(format!("modebench-{script}-input.json"));
        let _ = std::fs::write(&saved, input);
        panic!(
            "{script} failed (input saved to {}):\n{}",
            saved.display(),
            String::from_utf8_lossy(&out.stderr)
        );
    }
    Some(String::from_utf8(out.stdout).expect("utf-8 output"))
}

/// A model in the input format of `tests/python/beam_roots.py`.
pub fn model_json(id: &str, model: &modebench::Model, count: usize) -> serde_json::Value {
    use modebench::{Attachment, End};
    use serde_json::json;
    let end = |e: End| match e {
        End::Free => json!("free"),
        End::Pinned => json!("pinned"),
        End::Clamped => json!("clamped"),
        End::Guided => json!("guided"),
        End::Elastic { translational, rotational } => json!({ "kt": translational, "kr": rotational }),
    };
    let attachments: Vec<serde_json::Value> = model
        .attachments()
        .iter()
        .map(|a| match *a {
            Attachment::Mass { position, mass, rotary_inertia } => {
                json!({ "type": "mass", "x": position, "m": mass, "j": rotary_inertia })
            }
            Attachment::Spring { position, stiffness } => {
                json!({ "type": "spring", "x": position, "k": stiffness })
            }
            Attachment::RotationalSpring { position, stiffness } => {
                json!({ "type": "rotational-spring", "x": position, "k": stiffness })
            }
            Attachment::Support { position } => json!({ "type": "support", "x": position }),
            Attachment::SprungMass { position, mass, stiffness } => {
                json!({ "type": "sprung-mass", "x": position, "m": mass, "k": stiffness })
            }
        })
        .collect();
    json!({
        "id": id,
        "segments": model.segments().iter().map(|s| json!([s.length, s.flexural_rigidity, s.mass_per_length])).collect::<Vec<_>>(),
        "left": end(model.left()),
        "right": end(model.right()),
        "attachments": attachments,
        "count": count,
    })
}

/// A model in the input format of `tests/python/timoshenko_roots.py` (segments with their shear
/// rigidity, `null` for a slender one, and rotary inertia), with frequencies (rad/s) to check.
pub fn transfer_matrix_json(id: &str, model: &modebench::Model, omegas: &[f64]) -> serde_json::Value {
    let mut m = model_json(id, model, omegas.len());
    let shear = model.theory() == modebench::Theory::Timoshenko;
    m["segments"] = model
        .segments()
        .iter()
        .map(|s| {
            serde_json::json!([
                s.length,
                s.flexural_rigidity,
                s.mass_per_length,
                s.shear_rigidity.filter(|_| shear),
                s.rotary_inertia_per_length
            ])
        })
        .collect();
    m["omegas"] = serde_json::json!(omegas);
    m
}
