//! Notes and follow-ups through the application layer (no UI): the same limits and the
//! same initials rule the command line and the app both use.

mod util;

use loopside::action::note::{add_note, close_follow_up, NewNote, MAX_NOTE_CHARS};
use loopside::journal::{closed_follow_ups, Kind};
use loopside::store::{MemoryStore, Store, StoreError};

use util::afternoon as now;

fn brindlemoor() -> MemoryStore {
    util::brindlemoor(now())
}

fn field(e: StoreError) -> String {
    match e {
        StoreError::Input(f) => f.field,
        other => panic!("expected bad input, got {other}"),
    }
}

#[test]
fn a_note_is_saved_signed_in_capitals() {
    let mut store = brindlemoor();
    let added = add_note(
        &mut store,
        now(),
        NewNote::new(
            "PT-204",
            "  -5 mbar offset found at zero; isolating valve was cracked open  ",
            "cd",
            false,
        ),
    )
    .unwrap();
    assert_eq!(added.to_string(), format!("Saved as {}.", added.id));
    assert_eq!(added.tag, "PT-204");
    let saved = store.entry(&added.id).unwrap();
    assert_eq!(saved.kind, Kind::Note);
    assert_eq!(saved.author, "CD", "ab and AB are one technician");
    assert_eq!(
        saved.text,
        "-5 mbar offset found at zero; isolating valve was cracked open"
    );
}

#[test]
fn a_pasted_report_is_kept_whole_up_to_the_one_limit() {
    let mut store = brindlemoor();
    // A long commissioning note pasted from a report: 5 000 characters is more than the
    // screen used to take, and well inside the one limit every front now shares.
    let long = "Filter 3 backwash sequence observed. ".repeat(135);
    assert!(long.chars().count() > 2_000);
    let added = add_note(
        &mut store,
        now(),
        NewNote::new("PDT-707", &long, "ef", false),
    );
    assert!(added.is_ok());
    let too_long = "x".repeat(MAX_NOTE_CHARS + 1);
    let e = add_note(
        &mut store,
        now(),
        NewNote::new("PDT-707", &too_long, "ef", false),
    );
    assert_eq!(field(e.unwrap_err()), "note");
}

#[test]
fn bad_notes_name_their_field_and_save_nothing() {
    let mut store = brindlemoor();
    let before = store.entries().len();
    let cases = [
        (NewNote::new("LT-101", "   ", "AB", false), "note"),
        (NewNote::new("XX-999", "Walk-down", "AB", false), "tag"),
        (
            NewNote::new("LT-101", "Walk-down", "Anna Brown", false),
            "author",
        ),
    ];
    for (note, expected) in cases {
        assert_eq!(
            field(add_note(&mut store, now(), note).unwrap_err()),
            expected
        );
    }
    let mut correction = NewNote::new("TT-412", "Reference read 36.4 °C", "EF", false);
    correction.refers_to = Some("ffffffffffff");
    assert_eq!(
        field(add_note(&mut store, now(), correction).unwrap_err()),
        "refers-to"
    );
    assert_eq!(store.entries().len(), before);
}

#[test]
fn a_follow_up_is_closed_once_by_a_new_entry() {
    let mut store = brindlemoor();
    let open = add_note(
        &mut store,
        now(),
        NewNote::new("FT-310", "Order a spare 250 Ω input card", "gh", true),
    )
    .unwrap();
    assert_eq!(store.entry(&open.id).unwrap().kind, Kind::FollowUp);
    let done = close_follow_up(&mut store, now(), &open.id.0[..12], "ij", "Card fitted").unwrap();
    assert_eq!(done.follow_up, open.id);
    let closing = store.entry(&done.id).unwrap();
    assert_eq!(closing.refers_to.as_ref(), Some(&open.id));
    assert_eq!(closing.author, "IJ");
    assert_eq!(closing.text, "Card fitted");
    assert!(closed_follow_ups(store.entries()).contains(&open.id));
    // The follow-up itself is kept as written.
    assert_eq!(
        store.entry(&open.id).unwrap().text,
        "Order a spare 250 Ω input card"
    );
    // Closing it twice is refused, naming the id, and writes nothing.
    let count = store.entries().len();
    let e = close_follow_up(&mut store, now(), &open.id.0, "IJ", "").unwrap_err();
    assert!(e.to_string().contains("already done"), "{e}");
    assert_eq!(field(e), "id");
    assert_eq!(store.entries().len(), count);
}
