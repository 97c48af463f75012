//! The snapshot file (`loopside.snapshot`) as read when a data folder is opened.
//!
//! The target makes a genuine journal and snapshot once (the demo plant imported into a
//! file store), then each input damages the snapshot: the first byte chooses whether the
//! damaged snapshot is sealed again (its check values recomputed, so the section decoders
//! see the damage) and the rest is a list of patches (`loopside_fuzz::patched`).
//!
//! Invariant: the snapshot is only a cache, the journal is the record. Whatever the
//! snapshot holds, opening never panics, never changes the journal, and its log can be
//! read; a snapshot that is not sealed after damage (one an accident made) gives exactly
//! the store the journal alone gives (its tags, its entries, and what a first text search
//! finds, which the snapshot's aid section answers).
#![no_main]

use libfuzzer_sys::fuzz_target;
use loopside::journal::{Entry, EntryId, Query};
use loopside::store::{FileStore, Store, TagRecord, JOURNAL_FILE, SNAPSHOT_FILE};
use std::sync::OnceLock;

const MAGIC: &[u8; 16] = b"loopside-snap\n\0\0";

struct Genuine {
    journal: Vec<u8>,
    /// Ids of the entries a text search finds (answered from the snapshot's aid section).
    found: Vec<EntryId>,
    snapshot: Vec<u8>,
    tags: Vec<TagRecord>,
    entries: Vec<Entry>,
}

fn genuine() -> &'static Genuine {
    static G: OnceLock<Genuine> = OnceLock::new();
    G.get_or_init(|| {
        let dir = loopside_fuzz::scratch_dir("snapshot-genuine");
        let mut store = FileStore::open(&dir).expect("open");
        store
            .import(&loopside_fuzz::demo_bundle())
            .expect("import the demo plant");
        store.write_snapshot().expect("write the snapshot");
        let (tags, entries) = loopside_fuzz::contents(&store);
        let found = ids(&store);
        drop(store);
        let g = Genuine {
            found,
            journal: std::fs::read(dir.join(JOURNAL_FILE)).unwrap(),
            snapshot: std::fs::read(dir.join(SNAPSHOT_FILE)).unwrap(),
            tags,
            entries,
        };
        let _ = std::fs::remove_dir_all(&dir);
        g
    })
}

/// What a search of the log for "loop" finds, as the first thing asked of the store.
fn ids(store: &FileStore) -> Vec<EntryId> {
    let query = Query {
        text: Some("loop".into()),
        ..Query::default()
    };
    store
        .search(&query)
        .into_iter()
        .map(|e| e.id.clone())
        .collect()
}

fuzz_target!(|input: &[u8]| {
    let g = genuine();
    let (seal, patches) = match input.split_first() {
        Some((flags, rest)) => (flags & 1 == 1, rest),
        None => (false, input),
    };
    let mut snapshot = loopside_fuzz::patched(&g.snapshot, patches);
    if seal {
        loopside_fuzz::seal_snapshot(&mut snapshot, &g.journal, MAGIC);
    }
    let dir = loopside_fuzz::scratch_dir("snapshot");
    std::fs::write(dir.join(JOURNAL_FILE), &g.journal).unwrap();
    std::fs::write(dir.join(SNAPSHOT_FILE), &snapshot).unwrap();

    let store = FileStore::open(&dir).expect("a store with a damaged snapshot opens");
    assert!(
        store.recoveries().is_empty(),
        "the journal needed no repair"
    );
    let found = ids(&store);
    let (tags, entries) = loopside_fuzz::contents(&store);
    assert!(
        store.register().load_failure().is_none(),
        "{:?}",
        store.register().load_failure()
    );
    if !seal || !store.opened_from_snapshot() || snapshot == g.snapshot {
        assert_eq!(tags, g.tags, "tags differ from the journal's");
        assert_eq!(entries, g.entries, "entries differ from the journal's");
        assert_eq!(
            found, g.found,
            "a search finds other entries than the journal's"
        );
    }
    drop(store);
    assert_eq!(
        std::fs::read(dir.join(JOURNAL_FILE)).unwrap(),
        g.journal,
        "the journal was changed"
    );
});
