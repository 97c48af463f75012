//! The file store: saving, reopening, one writer, renames, archive, schema versions,
//! hostile tag numbers, and the in-memory store behaving the same.

mod util;

use chrono::{DateTime, FixedOffset};
use loopside::journal::{Entry, Kind, Query};
use loopside::scale::Scale;
use loopside::store::record::{encode_line, Header, Record};
use loopside::store::{
    FileStore, MemoryStore, RecoveryKind, Store, StoreError, JOURNAL_FILE, LOCK_FILE,
};
use loopside::tag::Tag;
use std::time::Duration;
use util::{files_under, TempDir};

fn t(s: &str) -> DateTime<FixedOffset> {
    DateTime::parse_from_rfc3339(s).unwrap()
}

fn lt101() -> Tag {
    let mut tag = Tag::new("LT-101", Scale::linear(0.0, 4.5, "m").unwrap()).unwrap();
    tag.service = "Inlet wet well level".into();
    tag
}

fn exercise(store: &mut dyn Store) {
    let id = store.add_tag(lt101()).unwrap();
    let e = Entry::new(
        &id,
        t("2026-11-30T07:40:00+01:00"),
        "AB",
        Kind::Note,
        "walk-down",
    )
    .unwrap();
    let eid = store.append(e.clone()).unwrap();
    assert_eq!(store.entry(&eid), Some(&e));
    // Same id twice is refused; the log is unchanged.
    assert_eq!(
        store.append(e).unwrap_err().to_string(),
        format!("id: {eid} is already in the log")
    );
    // Duplicate number refused.
    let err = store.add_tag(lt101()).unwrap_err();
    assert!(
        err.to_string().starts_with("tag: 'LT-101' is already"),
        "{err}"
    );
    // Unknown tag refused with the field named.
    assert!(matches!(store.require_tag("XX-1"), Err(StoreError::Input(f)) if f.field == "tag"));
    assert_eq!(store.entries().len(), 1);
}

#[test]
fn memory_and_file_stores_follow_the_same_rules() {
    exercise(&mut MemoryStore::new());
    let dir = TempDir::new("rules");
    exercise(&mut FileStore::open(dir.path()).unwrap());
}

#[test]
fn everything_saved_is_there_after_reopening() {
    let dir = TempDir::new("reopen");
    let (tag_id, ids) = {
        let mut s = FileStore::open(dir.path()).unwrap();
        let tag_id = s.add_tag(lt101()).unwrap();
        let mut ids = Vec::new();
        for i in 0..20 {
            let mut e = Entry::new(
                &tag_id,
                t("2026-11-30T07:40:00+01:00"),
                "AB",
                Kind::Finding,
                &format!("reading {i}: \"quoted\", comma, newline\nsecond line"),
            )
            .unwrap();
            e.payload = Some(serde_json::json!({"ma": 12.0 + f64::from(i), "unit": "mA"}));
            ids.push(s.append(e).unwrap());
        }
        (tag_id, ids)
    };
    let s = FileStore::open(dir.path()).unwrap();
    assert!(s.recoveries().is_empty());
    assert_eq!(s.tag("LT-101").unwrap().id, tag_id);
    let got: Vec<_> = s.entries().iter().map(|e| e.id.clone()).collect();
    assert_eq!(got, ids);
    assert_eq!(s.entries()[3].payload.as_ref().unwrap()["ma"], 15.0);
    assert!(s.entries()[0].text.contains('\n'));
    // The local offset written is the one read back.
    assert_eq!(s.entries()[0].time.offset().local_minus_utc(), 3600);
}

#[test]
fn a_second_writer_is_told_the_folder_is_in_use() {
    let dir = TempDir::new("lock");
    let first = FileStore::open(dir.path()).unwrap();
    let err = FileStore::open(dir.path()).unwrap_err();
    assert!(matches!(err, StoreError::InUse { .. }), "{err}");
    assert!(err.to_string().contains("in use by another loopside"));
    drop(first);
    FileStore::open(dir.path()).expect("free again once the first store is closed");
}

#[test]
fn a_second_writer_can_wait_for_the_first_to_close() {
    let dir = TempDir::new("lock-wait");
    let first = FileStore::open(dir.path()).unwrap();
    let (tx, rx) = std::sync::mpsc::channel();
    let closer = std::thread::spawn(move || {
        // Close the first store once the second has started waiting.
        rx.recv().unwrap();
        std::thread::sleep(Duration::from_millis(200));
        drop(first);
    });
    tx.send(()).unwrap();
    let second = FileStore::open_waiting(dir.path(), Duration::from_secs(30));
    closer.join().unwrap();
    assert!(second.is_ok(), "{:?}", second.err());
}

#[test]
fn a_second_writer_gives_up_when_the_first_stays_open() {
    let dir = TempDir::new("lock-held");
    let _first = FileStore::open(dir.path()).unwrap();
    let err = FileStore::open_waiting(dir.path(), Duration::from_millis(200)).unwrap_err();
    assert!(matches!(err, StoreError::InUse { .. }), "{err}");
    assert!(err.to_string().contains("in use by another loopside"));
}

#[test]
fn renamed_tags_keep_their_log_and_archive_keeps_everything() {
    let dir = TempDir::new("rename");
    {
        let mut s = FileStore::open(dir.path()).unwrap();
        let id = s.add_tag(lt101()).unwrap();
        s.append(Entry::new(&id, t("2026-11-30T07:40:00Z"), "AB", Kind::Note, "before").unwrap())
            .unwrap();
        s.rename_tag("LT-101", "LT-101A").unwrap();
        s.add_tag(lt101()).unwrap(); // the old number is free for a new instrument
        s.set_archived("LT-101A", true).unwrap();
    }
    let s = FileStore::open(dir.path()).unwrap();
    let renamed = s.tag("LT-101A").unwrap();
    assert!(renamed.tag.archived);
    let q = Query {
        tags: vec![renamed.id.clone()],
        ..Query::default()
    };
    assert_eq!(s.search(&q).len(), 1, "the log followed the rename");
    assert_eq!(s.tag_number(&s.entries()[0].tag), "LT-101A");
    let new_one = s.tag("LT-101").unwrap();
    assert_ne!(new_one.id, renamed.id);
    assert_eq!(s.tags().len(), 2, "archive hides, never deletes");
}

#[test]
fn rename_onto_a_used_number_is_refused() {
    let mut s = MemoryStore::new();
    s.add_tag(lt101()).unwrap();
    s.add_tag(Tag::new("PT-204", Scale::linear(0.0, 10.0, "bar").unwrap()).unwrap())
        .unwrap();
    let e = s.rename_tag("PT-204", "LT-101").unwrap_err();
    assert!(e.to_string().starts_with("new number:"), "{e}");
    let e = s.rename_tag("PT-204", "a\u{7}b").unwrap_err();
    assert!(e.to_string().starts_with("new number:"), "{e}");
}

#[test]
fn hostile_tag_numbers_never_touch_the_file_system() {
    let outer = TempDir::new("hostile");
    let dir = outer.path().join("data");
    let numbers = [
        "../../x",
        "../escape",
        "CON",
        "NUL.txt",
        "a/b",
        "a\\b",
        "/etc/passwd",
        "C:\\x",
        "LT-101\u{202e}",
        "ΔP-7 ✓",
    ];
    {
        let mut s = FileStore::open(&dir).unwrap();
        for n in numbers {
            let id = s
                .add_tag(Tag::new(n, Scale::linear(0.0, 1.0, "m").unwrap()).unwrap())
                .unwrap();
            s.append(Entry::new(&id, t("2026-11-30T07:40:00Z"), "AB", Kind::Note, n).unwrap())
                .unwrap();
        }
        for bad in ["a\nb", "tab\there", "bell\u{7}", "\u{0}"] {
            let r = Tag::new(bad, Scale::linear(0.0, 1.0, "m").unwrap());
            assert_eq!(
                r.unwrap_err().field,
                "tag",
                "{bad:?} refused with a message"
            );
        }
    }
    assert_eq!(
        files_under(outer.path()),
        vec![format!("data/{JOURNAL_FILE}"), format!("data/{LOCK_FILE}")],
        "only the store's own files exist"
    );
    let s = FileStore::open(&dir).unwrap();
    for n in numbers {
        assert_eq!(s.tag(n).map(|t| t.tag.number.as_str()), Some(n));
    }
}

#[test]
fn a_store_from_a_newer_loopside_is_left_untouched() {
    let dir = TempDir::new("newer");
    let mut bytes = Vec::new();
    encode_line(
        &Header {
            loopside: "journal".into(),
            schema: 99,
        },
        &mut bytes,
    )
    .unwrap();
    let path = dir.path().join(JOURNAL_FILE);
    std::fs::write(&path, &bytes).unwrap();
    let err = FileStore::open(dir.path()).unwrap_err();
    assert!(
        matches!(err, StoreError::NewerSchema { found: 99, .. }),
        "{err}"
    );
    assert_eq!(std::fs::read(&path).unwrap(), bytes);
}

#[test]
fn an_older_schema_is_migrated_with_a_backup() {
    let dir = TempDir::new("migrate");
    let path = dir.path().join(JOURNAL_FILE);
    // Schema 0: a header without a version (written before versions existed).
    let mut old = Vec::new();
    encode_line(&serde_json::json!({"loopside": "journal"}), &mut old).unwrap();
    let tag = loopside::store::TagRecord {
        id: loopside::journal::TagId("t-1".into()),
        tag: lt101(),
    };
    encode_line(&Record::Tag(tag), &mut old).unwrap();
    std::fs::write(&path, &old).unwrap();
    let s = FileStore::open(dir.path()).unwrap();
    assert_eq!(s.recoveries().len(), 1);
    let r = &s.recoveries()[0];
    assert_eq!(r.kind, RecoveryKind::Migrated);
    assert_eq!(
        std::fs::read(&r.aside).unwrap(),
        old,
        "backup is the old file"
    );
    assert!(s.tag("LT-101").is_some());
    drop(s);
    let s = FileStore::open(dir.path()).unwrap();
    assert!(s.recoveries().is_empty(), "migrated once");
}

#[test]
fn a_record_missing_only_its_newline_is_kept() {
    let dir = TempDir::new("newline");
    {
        let mut s = FileStore::open(dir.path()).unwrap();
        s.add_tag(lt101()).unwrap();
    }
    let path = dir.path().join(JOURNAL_FILE);
    let mut bytes = std::fs::read(&path).unwrap();
    bytes.pop();
    std::fs::write(&path, &bytes).unwrap();
    let mut s = FileStore::open(dir.path()).unwrap();
    assert!(s.recoveries().is_empty());
    assert!(s.tag("LT-101").is_some());
    let id = s.tag("LT-101").unwrap().id.clone();
    s.append(Entry::new(&id, t("2026-11-30T07:40:00Z"), "AB", Kind::Note, "after").unwrap())
        .unwrap();
    drop(s);
    let s = FileStore::open(dir.path()).unwrap();
    assert!(s.recoveries().is_empty());
    assert_eq!(s.entries().len(), 1);
}
