//! Offline use: the service worker written into the built site's root, listing every file the
//! builder wrote and named by a digest of them all, so that a rebuilt site (any file changed)
//! has a new worker, which replaces the old cache on the reader's next visit.

use std::path::Path;

use anyhow::{Context, Result};

/// The worker's file in the site's root; its scope is the whole site.
pub(crate) const WORKER: &str = "sw.js";

/// Files in the output that are not part of the site the reader sees.
const SKIPPED: [&str; 2] = [WORKER, ".modebench-site"];

/// Writes `sw.js` into `dist`, after every other file is written.
pub(crate) fn write_worker(dist: &Path) -> Result<String> {
    let files = site_files(dist)?;
    let mut digest = Fnv::default();
    for file in &files {
        let bytes = std::fs::read(dist.join(file)).with_context(|| format!("reading {file}"))?;
        digest.add(file.as_bytes());
        digest.add(&[0]);
        digest.add(&bytes);
        digest.add(&[0]);
    }
    let version = format!("{:016x}", digest.0);
    let list: Vec<String> = files.iter().map(|f| format!("\"{f}\"")).collect();
    let worker = include_str!("../offline/sw.js").replacen("@VERSION@", &version, 1).replacen(
        "@FILES@",
        &format!("[{}]", list.join(", ")),
        1,
    );
    let path = dist.join(WORKER);
    std::fs::write(&path, worker).with_context(|| format!("writing {}", path.display()))?;
    Ok(version)
}

/// Every file of the site (the root and `assets/`), as relative URLs, sorted.
fn site_files(dist: &Path) -> Result<Vec<String>> {
    let mut files = Vec::new();
    for (dir, prefix) in [(dist.to_path_buf(), ""), (dist.join("assets"), "assets/")] {
        for entry in std::fs::read_dir(&dir).with_context(|| format!("reading {}", dir.display()))? {
            let path = entry?.path();
            let name = path.file_name().and_then(|n| n.to_str()).unwrap_or_default();
            if path.is_file() && !SKIPPED.contains(&name) {
                // The builder names files plainly; one that would need escaping in a URL or in
                // the script is left to the network.
                if name.chars().all(|c| c.is_ascii_alphanumeric() || "._-".contains(c)) {
                    files.push(format!("{prefix}{name}"));
                }
            }
        }
    }
    files.sort();
    Ok(files)
}

/// FNV-1a, 64 bits: a digest that is the same on every machine and Rust version.
struct Fnv(u64);

impl Default for Fnv {
    fn default() -> Self {
        Fnv(0xcbf2_9ce4_8422_2325)
    }
}

impl Fnv {
    fn add(&mut self, bytes: &[u8]) {
        for b in bytes {
            self.0 ^= u64::from(*b);
            self.0 = self.0.wrapping_mul(0x0100_0000_01b3);
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_digest_is_fnv_1a() {
        // FNV-1a 64 of "a" is af63dc4c8601ec8c (the published test vectors of the FNV hash).
        let mut d = Fnv::default();
        d.add(b"a");
        assert_eq!(d.0, 0xaf63_dc4c_8601_ec8c);
    }

    #[test]
    fn the_worker_lists_every_file_and_changes_with_any_of_them() {
        let dir = std::env::temp_dir().join(format!("modebench-offline-test-{}", std::process::id()));
        let _ = std::fs::remove_dir_all(&dir);
        std::fs::create_dir_all(dir.join("assets")).unwrap();
        std::fs::write(dir.join("index.html"), "one").unwrap();
        std::fs::write(dir.join(".modebench-site"), "marker").unwrap();
        std::fs::write(dir.join("assets/site.css"), "p {}").unwrap();
        let first = write_worker(&dir).unwrap();
        let worker = std::fs::read_to_string(dir.join(WORKER)).unwrap();
        assert!(worker.contains("const FILES = [\"assets/site.css\", \"index.html\"];"), "{worker}");
        assert!(worker.contains(&format!("const VERSION = \"{first}\";")));
        assert_eq!(write_worker(&dir).unwrap(), first, "the worker itself is not part of the digest");
        std::fs::write(dir.join("index.html"), "two").unwrap();
        assert_ne!(write_worker(&dir).unwrap(), first);
        std::fs::remove_dir_all(&dir).unwrap();
    }
}
