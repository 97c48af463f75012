//! The app's saved state (`app-state.json`) as read at start-up: the reading and setting
//! aside of `store::saved::read_or_set_aside`, which `app::state::load_or_set_aside` calls.
//!
//! The app's own state type holds Slint's screen enum, so it is only built with the UI;
//! this target reads the file as two UI-free types in its place: any JSON value (a file
//! that is JSON at all), and a bundle (a strict shape with required fields, nested types
//! and dates, as the state's own fields are).
//!
//! Invariant: whatever the file holds, reading it never fails and never panics; a file
//! that reads is left exactly where and as it was; one that does not is renamed, never
//! deleted, kept byte for byte under a new name (a second one never overwrites the
//! first), and the caller is told where.
#![no_main]

use libfuzzer_sys::fuzz_target;
use loopside::store::bundle::Bundle;
use loopside::store::saved::{read_or_set_aside, SavedRead};
use serde::de::DeserializeOwned;
use std::path::Path;

const NAME: &str = "app-state.json";

fn check<T: DeserializeOwned>(dir: &Path, input: &[u8]) {
    let path = dir.join(NAME);
    std::fs::write(&path, input).unwrap();
    let kept_before: Vec<_> = std::fs::read_dir(dir)
        .unwrap()
        .map(|f| f.unwrap().path())
        .collect();
    match read_or_set_aside::<T>(dir, NAME).expect("reading the saved state never fails") {
        SavedRead::Missing => panic!("the file is there"),
        SavedRead::Read(_) => {
            assert!(serde_json::from_slice::<T>(input).is_ok());
            assert_eq!(
                std::fs::read(&path).unwrap(),
                input,
                "a readable state is left as it is"
            );
        }
        SavedRead::SetAside { kept_as, why } => {
            assert!(!why.is_empty());
            assert!(!path.exists(), "the unreadable file was not moved");
            assert!(
                !kept_before.contains(&kept_as),
                "an earlier copy was overwritten"
            );
            assert_eq!(
                std::fs::read(&kept_as).unwrap(),
                input,
                "kept byte for byte"
            );
            assert!(kept_as
                .file_name()
                .unwrap()
                .to_string_lossy()
                .starts_with("app-state.unreadable"));
        }
    }
    assert!(matches!(
        read_or_set_aside::<T>(dir, "no-such-state.json"),
        Ok(SavedRead::Missing)
    ));
}

fuzz_target!(|input: &[u8]| {
    let dir = loopside_fuzz::scratch_dir("app-state");
    check::<serde_json::Value>(&dir, input);
    // The second read finds the first unreadable copy (if any) still there.
    check::<Bundle>(&dir, input);
});
