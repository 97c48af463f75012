//! The journal as read when a data folder is opened, including the recovery of a torn or
//! damaged tail (`FileStore::open`).
//!
//! Input: the journal file, line by line; a line starting with `+` gets its correct check
//! value (see `loopside_fuzz::sealed_journal`), any other line is written as it is.
//!
//! Invariant:
//! - opening never panics and either opens the store or refuses a journal from a newer
//!   loopside, leaving it byte for byte as it was;
//! - every record that is intact in the file (its check value matches and it reads as a
//!   record), before or after any damage, is in the store: each entry, and for each tag id
//!   its last intact definition;
//! - nothing is lost: the file's bytes are still all there, in the journal, in the copy
//!   set aside, or in the journal (or the backup made when upgrading it) followed by the
//!   torn tail cut off;
//! - opening the repaired folder again needs no recovery and gives the same store.
#![no_main]

use libfuzzer_sys::fuzz_target;
use loopside::store::record::{decode_line, Record};
use loopside::store::{FileStore, Store, StoreError, JOURNAL_FILE};
use std::collections::HashMap;

fuzz_target!(|input: &[u8]| {
    let bytes = loopside_fuzz::sealed_journal(input);
    let dir = loopside_fuzz::scratch_dir("journal");
    let path = dir.join(JOURNAL_FILE);
    std::fs::write(&path, &bytes).expect("write the journal");

    let store = match FileStore::open(&dir) {
        Ok(store) => store,
        Err(StoreError::NewerSchema { .. }) => {
            assert_eq!(
                std::fs::read(&path).unwrap(),
                bytes,
                "a newer journal is left untouched"
            );
            return;
        }
        Err(e) => panic!("the journal did not open: {e}"),
    };

    // Every intact record is kept.
    let mut last_tag = HashMap::new();
    let mut last_reference = HashMap::new();
    for line in bytes.split(|&b| b == b'\n') {
        match decode_line::<Record>(line) {
            Some(Record::Entry(e)) => assert!(
                store.entries().contains(&e),
                "intact entry {} was lost",
                e.id
            ),
            Some(Record::Tag(t)) => {
                last_tag.insert(t.id.clone(), t);
            }
            Some(Record::Reference(r)) => {
                last_reference.insert(r.id.trim().to_ascii_lowercase(), r);
            }
            None => {}
        }
    }
    for (id, t) in &last_tag {
        assert_eq!(store.tag_by_id(id), Some(t), "intact tag {id} was lost");
    }
    for (id, r) in &last_reference {
        assert_eq!(store.reference(id), Some(r), "intact reference {id} was lost");
    }

    // Nothing is lost from the file.
    let journal = std::fs::read(&path).unwrap();
    let mut set_aside = Vec::new();
    for f in std::fs::read_dir(&dir).unwrap() {
        let f = f.unwrap().path();
        let name = f.file_name().unwrap().to_string_lossy().to_string();
        if name.starts_with("loopside.journal.") {
            set_aside.push((name, std::fs::read(&f).unwrap()));
        }
    }
    let torn: Vec<&Vec<u8>> = set_aside
        .iter()
        .filter(|(name, _)| name.contains(".torn-"))
        .map(|(_, kept)| kept)
        .collect();
    let whole = journal == bytes
        || bytes.is_empty()
        || journal == [bytes.as_slice(), b"\n"].concat()
        || set_aside.iter().any(|(_, kept)| kept == &bytes)
        || torn.iter().any(|t| {
            // Cut off (and perhaps the rest upgraded, with a backup of what was left).
            [journal.as_slice(), t].concat() == bytes
                || set_aside
                    .iter()
                    .any(|(_, kept)| [kept.as_slice(), t].concat() == bytes)
        });
    assert!(
        whole,
        "bytes of the journal were lost; set aside: {:?}",
        set_aside.iter().map(|s| &s.0).collect::<Vec<_>>()
    );

    // The repair holds: a second open finds nothing to recover and the same store.
    let first = loopside_fuzz::contents(&store);
    drop(store);
    let again = FileStore::open(&dir).expect("the repaired journal opens");
    assert!(again.recoveries().is_empty(), "{:?}", again.recoveries());
    assert_eq!(loopside_fuzz::contents(&again), first);
});
