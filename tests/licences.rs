//! The About screen's and `loopside licences`' list of third-party crates is the list
//! `Cargo.lock` actually resolves: every crate compiled into the app (normal dependencies,
//! followed from loopside, on each platform the app is built for) with the licence its
//! manifest declares.
//!
//! Source of truth: `cargo metadata` (Cargo's own resolver). Run with `LOOPSIDE_BLESS=1`
//! after a dependency change to rewrite `src/third_party_licences.tsv`.

use std::collections::{BTreeSet, HashMap};
use std::process::Command;

/// One `cargo metadata` run for one platform: the (name, version, licence) of every
/// package reachable from loopside through normal (not dev-only) dependencies.
fn shipped_on(platform: &str) -> BTreeSet<(String, String, String)> {
    // One platform per run: Cargo 1.95 panics when given several `--filter-platform`s.
    let out = Command::new(env!("CARGO"))
        .args(["metadata", "--format-version", "1", "--locked"])
        .args(["--filter-platform", platform])
        .current_dir(env!("CARGO_MANIFEST_DIR"))
        .output()
        .expect("cargo metadata runs");
    assert!(
        out.status.success(),
        "cargo metadata for {platform} failed: {}",
        String::from_utf8_lossy(&out.stderr)
    );
    let meta: serde_json::Value = serde_json::from_slice(&out.stdout).expect("metadata is JSON");
    let packages: HashMap<&str, &serde_json::Value> = meta["packages"]
        .as_array()
        .expect("packages")
        .iter()
        .map(|p| (p["id"].as_str().expect("id"), p))
        .collect();
    let nodes: HashMap<&str, &serde_json::Value> = meta["resolve"]["nodes"]
        .as_array()
        .expect("nodes")
        .iter()
        .map(|n| (n["id"].as_str().expect("id"), n))
        .collect();
    let root = meta["resolve"]["root"].as_str().expect("root");
    let mut seen = BTreeSet::new();
    let mut stack = vec![root];
    while let Some(id) = stack.pop() {
        for dep in nodes[id]["deps"].as_array().expect("deps") {
            let normal = dep["dep_kinds"]
                .as_array()
                .expect("dep_kinds")
                .iter()
                .any(|k| k["kind"].is_null());
            let pkg = dep["pkg"].as_str().expect("pkg");
            if normal && seen.insert(pkg) {
                stack.push(pkg);
            }
        }
    }
    seen.into_iter()
        .map(|id| {
            let p = packages[id];
            (
                p["name"].as_str().expect("name").to_string(),
                p["version"].as_str().expect("version").to_string(),
                p["license"].as_str().unwrap_or("").to_string(),
            )
        })
        .collect()
}

fn expected_file() -> String {
    let mut all = BTreeSet::new();
    for platform in loopside::licence::PLATFORMS {
        all.extend(shipped_on(platform));
    }
    let mut text = String::from(
        "# Third-party crates compiled into loopside, with the licence each declares.\n\
         # Written by `LOOPSIDE_BLESS=1 cargo test --test licences` from `cargo metadata`;\n\
         # that test fails when this file and Cargo.lock disagree.\n",
    );
    for (name, version, licence) in all {
        text.push_str(&format!("{name}\t{version}\t{licence}\n"));
    }
    text
}

#[test]
fn the_licence_list_matches_cargo_lock() {
    let path = concat!(env!("CARGO_MANIFEST_DIR"), "/src/third_party_licences.tsv");
    let expected = expected_file();
    if std::env::var_os("LOOPSIDE_BLESS").is_some() {
        std::fs::write(path, &expected).expect("write the list");
    }
    let actual = std::fs::read_to_string(path).unwrap_or_default();
    assert!(
        actual == expected,
        "src/third_party_licences.tsv does not match Cargo.lock; run \
         `LOOPSIDE_BLESS=1 cargo test --test licences` and review the change"
    );
}

#[test]
fn every_shipped_crate_declares_a_licence() {
    // A crate with no `license` field would need its licence file read by hand.
    let missing: Vec<_> = loopside::licence::third_party()
        .into_iter()
        .filter(|c| c.licence.trim().is_empty())
        .map(|c| c.name)
        .collect();
    assert!(missing.is_empty(), "no licence declared: {missing:?}");
}

#[test]
fn the_user_interface_toolkit_and_the_serialiser_are_listed() {
    // Two crates the app cannot run without: if they are missing the list was cut short.
    let names: Vec<_> = loopside::licence::third_party()
        .into_iter()
        .map(|c| c.name)
        .collect();
    for wanted in ["slint", "serde_json", "chrono", "clap"] {
        assert!(names.contains(&wanted), "{wanted} missing from the list");
    }
}

#[test]
fn the_command_line_lists_the_same_crates_as_the_about_screen() {
    let out = Command::new(env!("CARGO_BIN_EXE_loopside"))
        .args(["licences", "--json"])
        .output()
        .expect("loopside runs");
    assert!(out.status.success());
    let v: serde_json::Value = serde_json::from_slice(&out.stdout).expect("JSON");
    let listed = v["crates"].as_array().expect("crates").len();
    assert_eq!(listed, loopside::licence::third_party().len());
    assert_eq!(v["font"]["licence"], "OFL-1.1");
    assert_eq!(v["own"], "MIT");
    // The About screen's paragraphs name every one of them too.
    let about = loopside::view::about::licence_lines().join("\n");
    for c in v["crates"].as_array().expect("crates") {
        let line = format!(
            "{} {}",
            c["name"].as_str().unwrap(),
            c["version"].as_str().unwrap()
        );
        assert!(about.contains(&line), "{line} not on the About screen");
    }
}
