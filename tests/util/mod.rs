//! Shared helpers for the integration tests: run the binary, compare numbers.
#![allow(dead_code)]

use std::process::{Command, Output};

/// Run the `loopside` binary with `args` and no standard input.
pub fn loopside(args: &[&str]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_loopside"))
        .args(args)
        .env_remove("LOOPSIDE_DATA")
        .stdin(std::process::Stdio::null())
        .output()
        .expect("the loopside binary runs")
}

/// Run the binary expecting success, and parse its single JSON object.
pub fn loopside_json(args: &[&str]) -> serde_json::Value {
    let out = loopside(args);
    assert!(
        out.status.success(),
        "loopside {args:?} failed: {}",
        String::from_utf8_lossy(&out.stderr)
    );
    serde_json::from_slice(&out.stdout).unwrap_or_else(|e| {
        panic!(
            "loopside {args:?} printed no JSON ({e}): {}",
            String::from_utf8_lossy(&out.stdout)
        )
    })
}

/// Run the binary expecting bad-input exit code 2; return stderr.
pub fn loopside_refuses(args: &[&str]) -> String {
    let out = loopside(args);
    let stderr = String::from_utf8_lossy(&out.stderr).to_string();
    assert_eq!(
        out.status.code(),
        Some(2),
        "loopside {args:?} should exit 2; stdout {} stderr {stderr}",
        String::from_utf8_lossy(&out.stdout)
    );
    assert!(out.stdout.is_empty(), "nothing on stdout for bad input");
    assert_eq!(
        stderr.trim().lines().count(),
        1,
        "one-line message: {stderr}"
    );
    stderr
}

/// Assert `actual` is within `tol` of `expected`, with a message naming `what`.
#[track_caller]
pub fn close(actual: f64, expected: f64, tol: f64, what: &str) {
    assert!(
        (actual - expected).abs() <= tol,
        "{what}: got {actual}, expected {expected} ± {tol}"
    );
}
