//! Shared helpers for the cross-crate checks.
