//! The tag register through the application layer (no UI): add, edit, rename, archive,
//! each worded once.

mod util;

use loopside::action::tag::{add_tag, archive_tag, edit_tag, rename_tag};
use loopside::scale::Scale;
use loopside::store::{MemoryStore, Store, StoreError};
use loopside::tag::Tag;

fn brindlemoor() -> MemoryStore {
    util::brindlemoor(util::afternoon())
}

#[test]
fn a_new_sludge_tank_tag_is_added_edited_renamed_and_archived() {
    let mut store = brindlemoor();
    let mut lt606 = Tag::new("LT-606", Scale::linear(0.0, 3.2, "m").unwrap()).unwrap();
    lt606.service = "Sludge holding tank level".into();
    let added = add_tag(&mut store, lt606.clone()).unwrap();
    assert_eq!(added.to_string(), "Added LT-606.");
    // The same number again is refused, naming the field.
    match add_tag(&mut store, lt606.clone()).unwrap_err() {
        StoreError::Input(f) => assert!(f.reason.contains("already in the register"), "{f}"),
        other => panic!("{other}"),
    }

    let unchanged = edit_tag(&mut store, "LT-606", lt606.clone()).unwrap();
    assert_eq!(unchanged.to_string(), "LT-606: nothing changed.");
    lt606.area = "Sludge building, JB-06".into();
    let saved = edit_tag(&mut store, "lt-606", lt606.clone()).unwrap();
    assert_eq!(saved.to_string(), "Saved LT-606.");
    assert_eq!(saved.id, added.id);
    // A new number in the form renames it; its id (and so its log) stays.
    lt606.number = "LT-606A".into();
    let renamed = edit_tag(&mut store, "LT-606", lt606).unwrap();
    assert_eq!(
        renamed.to_string(),
        "Saved LT-606A (was LT-606; its log follows)."
    );

    let back = rename_tag(&mut store, "LT-606A", " LT-606 ").unwrap();
    assert_eq!(
        back.to_string(),
        "Renamed LT-606A to LT-606; its log follows."
    );
    assert_eq!(store.tag("LT-606").unwrap().id, added.id);

    let archived = archive_tag(&mut store, "LT-606", true).unwrap();
    assert_eq!(archived.to_string(), "LT-606 archived (its log is kept).");
    assert!(store.tag("LT-606").unwrap().tag.archived);
    let restored = archive_tag(&mut store, "LT-606", false).unwrap();
    assert_eq!(restored.to_string(), "LT-606 restored.");
    assert!(!store.tag("LT-606").unwrap().tag.archived);
}
