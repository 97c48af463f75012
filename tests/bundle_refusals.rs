//! A bundle that is refused says which part of it is wrong: the tag or entry by its place
//! in the file and its id, and the field, not only a line and column. A technician handed
//! a bundle from another phone can then say "the third entry's time is broken" to whoever
//! sent it.

mod util;

use chrono::{DateTime, FixedOffset};
use loopside::action::bundle::import_bundle;
use loopside::journal::Query;
use loopside::report;
use loopside::store::{MemoryStore, Store, StoreError};
use serde_json::Value;
use util::TempDir;

/// Evening hand-over at Brindlemoor, 1 December 2026, 18:30 (UTC+1).
fn now() -> DateTime<FixedOffset> {
    DateTime::parse_from_rfc3339("2026-12-01T18:30:00+01:00").unwrap()
}

/// The demo plant's whole register and log as a bundle, as JSON to damage.
fn brindlemoor_bundle() -> Value {
    let store = util::brindlemoor(now());
    let bundle = report::select(&store, &Query::default(), now());
    serde_json::from_str(&report::json(&bundle)).unwrap()
}

/// What importing `bundle` (written to a file) into an empty store says.
fn refusal(bundle: &Value) -> String {
    let dir = TempDir::new("bundle-refusal");
    let file = dir.path().join("from-night-shift.json");
    std::fs::write(&file, serde_json::to_string_pretty(bundle).unwrap()).unwrap();
    let mut store = MemoryStore::new();
    match import_bundle(&mut store, &file) {
        Err(StoreError::Input(e)) => {
            assert_eq!(e.field, "bundle");
            assert!(store.is_empty(), "a refused bundle adds nothing");
            e.to_string()
        }
        other => panic!("the damaged bundle was not refused: {other:?}"),
    }
}

#[test]
fn an_entry_with_a_broken_time_is_named_by_place_id_and_field() {
    let mut b = brindlemoor_bundle();
    let id = b["entries"][2]["id"].as_str().unwrap().to_string();
    b["entries"][2]["time"] = Value::from("yesterday evening");
    let message = refusal(&b);
    assert!(
        message.contains(&format!("entry 3 (id {id}), field time:")),
        "{message}"
    );
    assert!(
        message.contains("line "),
        "the line is still given: {message}"
    );
}

#[test]
fn an_entry_missing_its_text_is_named() {
    let mut b = brindlemoor_bundle();
    let id = b["entries"][0]["id"].as_str().unwrap().to_string();
    b["entries"][0].as_object_mut().unwrap().remove("text");
    let message = refusal(&b);
    assert!(message.contains(&format!("entry 1 (id {id})")), "{message}");
    assert!(message.contains("missing field `text`"), "{message}");
}

#[test]
fn a_tag_with_a_range_typed_as_words_is_named_with_its_number() {
    let mut b = brindlemoor_bundle();
    let number = b["tags"][1]["tag"]["number"].as_str().unwrap().to_string();
    b["tags"][1]["tag"]["scale"]["urv"] = Value::from("four and a half");
    let message = refusal(&b);
    assert!(
        message.contains("tag 2 (id ") && message.contains(&format!("number '{number}'")),
        "{message}"
    );
    assert!(message.contains("field tag.scale.urv"), "{message}");
}

#[test]
fn an_entry_that_reads_but_is_not_valid_is_named_at_import() {
    // The JSON is well formed, but the fourth entry's text is blank: the store refuses it
    // when merging, naming the entry and the field.
    let mut b = brindlemoor_bundle();
    let id = b["entries"][3]["id"].as_str().unwrap().to_string();
    b["entries"][3]["text"] = Value::from("   ");
    let message = refusal(&b);
    assert!(
        message.contains(&format!("entry 4 (id {id}), field text: is empty")),
        "{message}"
    );
}

#[test]
fn a_tag_that_reads_but_is_not_valid_is_named_at_import() {
    // LRV equal to URV: no span. The first tag is refused by place, id and number.
    let mut b = brindlemoor_bundle();
    let id = b["tags"][0]["id"].as_str().unwrap().to_string();
    let number = b["tags"][0]["tag"]["number"].as_str().unwrap().to_string();
    let lrv = b["tags"][0]["tag"]["scale"]["lrv"].clone();
    b["tags"][0]["tag"]["scale"]["urv"] = lrv;
    let message = refusal(&b);
    assert!(
        message.contains(&format!("tag 1 (id {id}, number '{number}') is not valid")),
        "{message}"
    );
}

#[test]
fn an_entry_for_a_tag_nobody_defined_is_named() {
    let mut b = brindlemoor_bundle();
    let id = b["entries"][1]["id"].as_str().unwrap().to_string();
    b["entries"][1]["tag"] = Value::from("0190aaaaaaaa-0000000000000000");
    let message = refusal(&b);
    assert!(
        message.contains(&format!("entry 2 (id {id}), field tag:")),
        "{message}"
    );
}

#[test]
fn a_file_cut_short_names_where_the_reading_stopped() {
    // A bundle cut off in the middle of an entry (a copy that did not finish).
    let b = brindlemoor_bundle();
    let text = serde_json::to_string_pretty(&b).unwrap();
    let cut = text.find("\"entries\"").unwrap() + 200;
    let dir = TempDir::new("bundle-cut");
    let file = dir.path().join("half.json");
    std::fs::write(&file, &text[..cut]).unwrap();
    let mut store = MemoryStore::new();
    let Err(StoreError::Input(e)) = import_bundle(&mut store, &file) else {
        panic!("a bundle cut short was not refused");
    };
    assert!(e.reason.contains("entry 1"), "{e}");
    assert!(e.reason.contains("EOF"), "{e}");
}

#[test]
fn two_tags_with_one_number_are_refused_naming_both() {
    // A hand-edited bundle defines LT-101 twice under two ids. Merging both would leave two
    // tags answering to one number in the register.
    let mut b = brindlemoor_bundle();
    let mut twin = b["tags"][0].clone();
    twin["id"] = Value::from("0190aaaaaaaa-1111111111111111");
    let number = twin["tag"]["number"].as_str().unwrap().to_string();
    b["tags"].as_array_mut().unwrap().push(twin);
    let count = b["tags"].as_array().unwrap().len();
    let message = refusal(&b);
    assert!(
        message.contains(&format!("tags 1 and {count} are both numbered '{number}'")),
        "{message}"
    );
}
