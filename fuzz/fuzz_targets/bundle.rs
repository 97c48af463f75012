//! A JSON bundle as imported (`parse_bundle`, then `Store::import`) into a store that
//! already holds the demo plant.
//!
//! Invariant:
//! - a refused bundle names the field `bundle`, and one refused at import changes
//!   nothing in the store;
//! - an accepted bundle merges completely: every entry of it is in the store afterwards
//!   (by id), the counts add up, and no two tags share a number;
//! - importing the same bundle again, or the merged store exported as a bundle, adds
//!   nothing and changes nothing.
#![no_main]

use chrono::DateTime;
use libfuzzer_sys::fuzz_target;
use loopside::journal::Query;
use loopside::store::bundle::{parse_bundle, select};
use loopside::store::record::Record;
use loopside::store::{MemoryStore, Store};
use std::collections::HashSet;
use std::sync::OnceLock;

fn demo_records() -> &'static Vec<Record> {
    static R: OnceLock<Vec<Record>> = OnceLock::new();
    R.get_or_init(|| {
        let b = loopside_fuzz::demo_bundle();
        let mut records: Vec<Record> = b.tags.into_iter().map(Record::Tag).collect();
        records.extend(b.entries.into_iter().map(Record::Entry));
        records
    })
}

fuzz_target!(|input: &[u8]| {
    let Ok(text) = std::str::from_utf8(input) else {
        return;
    };
    let bundle = match parse_bundle(text) {
        Ok(b) => b,
        Err(e) => {
            assert_eq!(e.field, "bundle");
            return;
        }
    };
    let mut store = MemoryStore::new();
    store.persist(demo_records().clone()).unwrap();
    let before = loopside_fuzz::contents(&store);

    let report = match store.import(&bundle) {
        Ok(r) => r,
        Err(e) => {
            assert!(e.to_string().starts_with("bundle: "), "{e}");
            assert_eq!(
                loopside_fuzz::contents(&store),
                before,
                "a refused import changed the store"
            );
            return;
        }
    };
    let after = loopside_fuzz::contents(&store);
    for e in &bundle.entries {
        assert!(
            store.entry(&e.id).is_some(),
            "entry {} was not merged",
            e.id
        );
    }
    assert_eq!(after.0.len(), before.0.len() + report.tags_added);
    assert_eq!(after.1.len(), before.1.len() + report.entries_added);
    assert_eq!(
        report.entries_added + report.entries_already_here,
        bundle.entries.len()
    );
    let mut numbers = HashSet::new();
    for t in &after.0 {
        assert!(
            numbers.insert(t.tag.number.clone()),
            "two tags numbered {}",
            t.tag.number
        );
    }

    // Importing the same bundle twice adds nothing.
    let again = store
        .import(&bundle)
        .expect("the bundle imports a second time");
    assert_eq!((again.tags_added, again.entries_added), (0, 0));
    assert_eq!(loopside_fuzz::contents(&store), after);

    // Nor does the merged store exported as a bundle and imported back.
    let exported = DateTime::parse_from_rfc3339("2026-12-01T18:30:00+01:00").unwrap();
    let merged = select(&store, &Query::default(), exported);
    let text = loopside::report::json(&merged);
    let merged = parse_bundle(&text).expect("an exported bundle reads back");
    let back = store.import(&merged).expect("the merged bundle imports");
    assert_eq!((back.tags_added, back.entries_added), (0, 0));
    assert_eq!(loopside_fuzz::contents(&store), after);
});
