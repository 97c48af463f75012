//! The app's saved screen state (`app-state.json`) never keeps the app from starting: a
//! file that cannot be read is set aside — renamed, kept byte for byte, never deleted —
//! and the app starts with its defaults and says so once. On a phone the technician
//! cannot reach the data folder to remove the file, so this is the only way out.
//!
//! The reading and setting aside are UI-free (`store::saved`); the app's own wording and
//! banner are tested with the app in `tests/ui_store.rs`, and here too when it is built.

mod util;

use loopside::store::saved::{read_or_set_aside, SavedRead};
use serde_json::Value;
use util::{Rng, TempDir};

const STATE: &str = "app-state.json";

#[test]
fn random_bytes_in_place_of_the_state_are_kept_aside_and_the_app_starts_afresh() {
    // A phone's storage returned garbage for the state file after a bad shutdown.
    let dir = TempDir::new("state-random");
    let mut rng = Rng::from_clock("random state bytes");
    let garbage: Vec<u8> = (0..4096).map(|_| rng.next() as u8).collect();
    std::fs::write(dir.path().join(STATE), &garbage).unwrap();

    let read = read_or_set_aside::<Value>(dir.path(), STATE).expect("start-up goes on");
    let SavedRead::SetAside { kept_as, why } = read else {
        panic!("random bytes were read as a state: {read:?}");
    };
    assert_eq!(
        kept_as.file_name().unwrap(),
        "app-state.unreadable.json",
        "renamed beside the state"
    );
    assert_eq!(
        std::fs::read(&kept_as).unwrap(),
        garbage,
        "kept byte for byte"
    );
    assert!(!dir.path().join(STATE).exists(), "the next start is clean");
    assert!(why.contains("line"), "the parser's reason is kept: {why}");

    // Started with defaults; it saves a fresh state, which reads back, and the set-aside
    // copy is still there.
    std::fs::write(dir.path().join(STATE), br#"{"ui": {"screen": "power"}}"#).unwrap();
    let SavedRead::Read(v) = read_or_set_aside::<Value>(dir.path(), STATE).unwrap() else {
        panic!("a good state was not read");
    };
    assert_eq!(v["ui"]["screen"], "power");
    assert!(
        dir.path().join(STATE).exists(),
        "a readable state stays where it is"
    );
    assert_eq!(std::fs::read(&kept_as).unwrap(), garbage);
}

#[test]
fn a_second_damaged_state_never_overwrites_the_first_one_kept() {
    let dir = TempDir::new("state-twice");
    std::fs::write(dir.path().join(STATE), b"{\"ui\": {\"scr").unwrap();
    let first = read_or_set_aside::<Value>(dir.path(), STATE).unwrap();
    std::fs::write(dir.path().join(STATE), b"\xff\xfe not json").unwrap();
    let second = read_or_set_aside::<Value>(dir.path(), STATE).unwrap();
    let (SavedRead::SetAside { kept_as: a, .. }, SavedRead::SetAside { kept_as: b, .. }) =
        (first, second)
    else {
        panic!("both damaged files must be set aside");
    };
    assert_eq!(a.file_name().unwrap(), "app-state.unreadable.json");
    assert_eq!(b.file_name().unwrap(), "app-state.unreadable-2.json");
    assert_eq!(std::fs::read(&a).unwrap(), b"{\"ui\": {\"scr");
    assert_eq!(std::fs::read(&b).unwrap(), b"\xff\xfe not json");
}

#[test]
fn no_state_yet_is_not_a_problem() {
    let dir = TempDir::new("state-none");
    assert_eq!(
        read_or_set_aside::<Value>(dir.path(), STATE).unwrap(),
        SavedRead::Missing
    );
    assert!(
        util::files_under(dir.path()).is_empty(),
        "nothing was written"
    );
}

#[cfg(feature = "ui")]
#[test]
fn the_app_itself_starts_over_random_bytes_and_says_so_once() {
    use loopside::app::state::load_or_set_aside;
    let dir = TempDir::new("state-app");
    let mut rng = Rng::from_clock("random app state");
    let garbage: Vec<u8> = (0..2048).map(|_| rng.next() as u8).collect();
    std::fs::write(dir.path().join(STATE), &garbage).unwrap();
    let (saved, notice) = load_or_set_aside(dir.path()).expect("the app starts");
    assert!(saved.is_none(), "defaults");
    let notice = notice.expect("the screen says what happened");
    assert!(notice.contains("app-state.unreadable.json"), "{notice}");
    assert_eq!(
        std::fs::read(dir.path().join("app-state.unreadable.json")).unwrap(),
        garbage
    );
    // Said once: the next start finds no damaged file and says nothing.
    let (_, again) = load_or_set_aside(dir.path()).unwrap();
    assert_eq!(again, None);
}
