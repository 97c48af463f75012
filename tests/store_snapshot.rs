//! The snapshot: a store opened from its snapshot and the journal after it holds exactly
//! what reading the whole journal gives, and a snapshot that does not fit (damaged,
//! truncated, stale, foreign, from another version) is passed over for the journal.

mod util;

use chrono::{DateTime, Duration, FixedOffset, TimeZone};
use loopside::journal::{Entry, EntryId, FollowUpStatus, Kind, Query, TagId};
use loopside::scale::Scale;
use loopside::store::record::{check, Record};
use loopside::store::{
    FileStore, RecoveryKind, Store, TagRecord, JOURNAL_FILE, SNAPSHOT_FILE, SNAPSHOT_TAIL_BYTES,
};
use loopside::tag::Tag;
use std::fs;
use std::path::Path;
use util::{Rng, TempDir};

const TEXTS: [&str; 6] = [
    "3.2 mA at the marshalling terminals; loose wire re-made",
    "ΔP cell impulse line blown through, ZERO re-trimmed",
    "as found 12.04 mA at 50 %, within tolerance",
    "ΣΟΦΟΣ tag plate replaced; \"quoted\", comma",
    "two lines:\nfirst, then\tsecond",
    "condensate drained from the low side",
];

/// Bytes in a snapshot's fixed header: the 16-byte magic, fifteen `u64` fields and the
/// header's check value.
const HEADER: usize = 16 + 15 * 8 + 8;

fn tag(i: usize) -> TagRecord {
    let mut tag = Tag::new(
        &format!("PT-{}", 100 + i),
        Scale::linear(0.0, 10.0, "bar").unwrap(),
    )
    .unwrap();
    tag.service = format!("Invented service {i}");
    TagRecord {
        id: TagId(format!("tag-{i}")),
        tag,
    }
}

/// `n` varied entries on tags `tag-0` … `tag-4`, starting at entry number `from`: local
/// offsets east and west, sub-second times, payloads, follow-ups opened and closed.
fn entries(from: usize, n: usize) -> Vec<Entry> {
    let mut out: Vec<Entry> = Vec::new();
    for i in from..from + n {
        let offset = FixedOffset::east_opt([3600, -5 * 3600 - 1800, 0, 45 * 60][i % 4]).unwrap();
        let time = offset.with_ymd_and_hms(2026, 3, 1, 6, 0, 0).unwrap()
            + Duration::milliseconds(i as i64 * 61_001);
        let kind = Kind::ALL[i % Kind::ALL.len()];
        let mut e = Entry {
            id: EntryId(format!("e-{i:06}")),
            tag: TagId(format!("tag-{}", i % 5)),
            time,
            author: ["AB", "", "ÅÖ"][i % 3].to_string(),
            kind,
            text: format!("{} #{i}", TEXTS[i % TEXTS.len()]),
            payload: None,
            status: (kind == Kind::FollowUp).then_some(FollowUpStatus::Open),
            refers_to: None,
        };
        if i % 7 == 0 {
            e.payload = Some(serde_json::json!({
                "ma": 4.0 + i as f64 / 1000.0,
                "points": [4.01, 0.1 + 0.2, -1e-9, u64::MAX, i],
                "note": "Ω ✓"
            }));
        }
        // Every other follow-up closes the one before (whatever the number of kinds).
        if kind == Kind::FollowUp && (i / Kind::ALL.len()).is_multiple_of(2) {
            if let Some(open) = out
                .iter()
                .rev()
                .find(|o| o.status == Some(FollowUpStatus::Open))
            {
                e.status = Some(FollowUpStatus::Done);
                e.refers_to = Some(open.id.clone());
            }
        }
        out.push(e);
    }
    out
}

/// A store in `dir` with five tags and enough entries that closing it writes a snapshot.
fn big_store(dir: &Path) {
    let mut s = FileStore::open(dir).unwrap();
    let mut records: Vec<Record> = (0..5).map(|i| Record::Tag(tag(i))).collect();
    records.extend(entries(0, 700).into_iter().map(Record::Entry));
    s.persist(records).unwrap();
    let len = fs::metadata(s.journal_path()).unwrap().len();
    assert!(len > SNAPSHOT_TAIL_BYTES, "journal {len} bytes");
    drop(s);
    assert!(
        dir.join(SNAPSHOT_FILE).is_file(),
        "closing wrote a snapshot"
    );
}

/// What reading the whole journal of `dir` gives: opened from a copy of the journal
/// alone.
fn full_read(dir: &Path) -> (TempDir, FileStore) {
    let copy = TempDir::new("snapshot-full");
    fs::copy(dir.join(JOURNAL_FILE), copy.path().join(JOURNAL_FILE)).unwrap();
    let s = FileStore::open(copy.path()).unwrap();
    assert!(!s.opened_from_snapshot());
    (copy, s)
}

/// The two stores hold the same register: search answers, each tag's newest entry and the
/// closed follow-ups (asked first, so a store opened from its snapshot answers them from
/// the snapshot's aid, before its entries are read), then tags and entries (with their
/// local offsets), then the same searches again over the entries read.
#[track_caller]
fn assert_same(got: &FileStore, want: &FileStore, what: &str) {
    let queries = [
        Query {
            text: Some("impulse".into()),
            ..Query::default()
        },
        Query {
            text: Some("σοφος".into()),
            kinds: vec![Kind::Note, Kind::FollowUp],
            ..Query::default()
        },
        Query {
            text: Some("TERMINALS".into()),
            tags: vec![TagId("tag-2".into())],
            ..Query::default()
        },
        Query {
            open_only: true,
            tags: vec![TagId("tag-3".into())],
            ..Query::default()
        },
    ];
    for q in &queries[..3] {
        assert_eq!(got.search(q), want.search(q), "{what}: first search {q:?}");
    }
    let newest = |s: &FileStore| {
        let mut v: Vec<(TagId, EntryId)> = s
            .newest_by_tag()
            .into_iter()
            .map(|(t, e)| (t.clone(), e.id.clone()))
            .collect();
        v.sort();
        v
    };
    assert_eq!(
        newest(got),
        newest(want),
        "{what}: newest entry of each tag"
    );
    let closed = |s: &FileStore| {
        let mut v: Vec<EntryId> = s.closed_follow_ups().into_iter().cloned().collect();
        v.sort();
        v
    };
    assert_eq!(closed(got), closed(want), "{what}: closed follow-ups");
    assert_eq!(got.tags(), want.tags(), "{what}: tags");
    assert_eq!(got.entries(), want.entries(), "{what}: entries");
    for (a, b) in got.entries().iter().zip(want.entries()) {
        assert_eq!(
            a.time.offset(),
            b.time.offset(),
            "{what}: offset of {}",
            a.id
        );
    }
    for q in &queries {
        assert_eq!(got.search(q), want.search(q), "{what}: search {q:?}");
    }
}

#[test]
fn the_first_search_and_the_tags_list_do_not_read_the_whole_log() {
    // A store of 700 entries (#0 … #699), opened from its snapshot, with two entries
    // (#703 and #704) saved since.
    let dir = TempDir::new("snapshot-aid");
    big_store(dir.path());
    {
        let mut s = FileStore::open(dir.path()).unwrap();
        s.persist(entries(703, 2).into_iter().map(Record::Entry).collect())
            .unwrap();
    }
    let s = FileStore::open(dir.path()).unwrap();
    assert!(s.opened_from_snapshot());
    let unread = |s: &FileStore| format!("{:?}", s.register()).contains("entries: None");
    assert!(unread(&s), "nothing read on open");
    // "impulse" is in every sixth text (#1, #7, … #697) and in #703, saved since.
    let q = Query {
        text: Some("IMPULSE".into()),
        ..Query::default()
    };
    let found: Vec<String> = s.search(&q).iter().map(|e| e.id.0.clone()).collect();
    let want: Vec<String> = (1..704).step_by(6).map(|i| format!("e-{i:06}")).collect();
    assert_eq!(found, want);
    assert_eq!(s.newest_by_tag().len(), 5, "every tag has entries");
    assert!(!s.closed_follow_ups().is_empty());
    assert!(unread(&s), "answered from the snapshot's aid");
    // Anything else reads the log, and the answers stay the same.
    assert_eq!(s.entries().len(), 702);
    assert!(!unread(&s));
    let again: Vec<String> = s.search(&q).iter().map(|e| e.id.0.clone()).collect();
    assert_eq!(again, want);
}

#[test]
fn a_damaged_aid_falls_back_to_reading_the_log() {
    let dir = TempDir::new("snapshot-aid-damaged");
    big_store(dir.path());
    let (_copy, full) = full_read(dir.path());
    let mut bad = fs::read(dir.path().join(SNAPSHOT_FILE)).unwrap();
    // The last bytes are the aid's list of closed follow-ups.
    let last = bad.len() - 1;
    bad[last] ^= 0x20;
    assert!(opens_as_full_read(dir.path(), &bad, &full, "aid flipped"));
}

#[test]
fn a_large_store_opens_from_its_snapshot_with_the_same_register() {
    let dir = TempDir::new("snapshot-open");
    big_store(dir.path());
    let journal = fs::read(dir.path().join(JOURNAL_FILE)).unwrap();
    let s = FileStore::open(dir.path()).unwrap();
    assert!(s.opened_from_snapshot());
    assert!(s.recoveries().is_empty());
    let (_copy, full) = full_read(dir.path());
    assert_eq!(full.entries().len(), 700);
    assert_same(&s, &full, "no tail");
    drop(s);
    assert_eq!(
        fs::read(dir.path().join(JOURNAL_FILE)).unwrap(),
        journal,
        "the journal is never touched by the snapshot"
    );
}

/// Something done to an open store, and its name.
type Step = (&'static str, Box<dyn Fn(&mut FileStore)>);

/// Things saved after the snapshot, each replayed from the journal on the next open.
fn tail_steps() -> Vec<Step> {
    vec![
        ("nothing", Box::new(|_s: &mut FileStore| {})),
        (
            "entries appended",
            Box::new(|s: &mut FileStore| {
                for e in entries(700, 5) {
                    s.append(e).unwrap();
                }
            }),
        ),
        (
            "a tag renamed, one archived, one added",
            Box::new(|s: &mut FileStore| {
                s.rename_tag("PT-101", "PT-101A").unwrap();
                s.set_archived("PT-102", true).unwrap();
                let id = s
                    .add_tag(Tag::new("LT-9", Scale::linear(0.0, 4.5, "m").unwrap()).unwrap())
                    .unwrap();
                let mut e = entries(705, 1).remove(0);
                e.tag = id;
                s.append(e).unwrap();
            }),
        ),
        (
            "an open follow-up closed",
            Box::new(|s: &mut FileStore| {
                let open = s
                    .search(&Query {
                        open_only: true,
                        ..Query::default()
                    })
                    .first()
                    .map(|e| (*e).clone())
                    .unwrap();
                let done = Entry::closing(&open, open.time, "CD", "").unwrap();
                s.append(done).unwrap();
            }),
        ),
        (
            "the first entries' text searched, then more appended",
            Box::new(|s: &mut FileStore| {
                let q = Query {
                    text: Some("TAIL WORD".into()),
                    ..Query::default()
                };
                assert!(s.search(&q).is_empty());
                let mut e = entries(706, 1).remove(0);
                e.text = "tail word, written after the snapshot".into();
                s.append(e).unwrap();
                assert_eq!(s.search(&q).len(), 1);
            }),
        ),
    ]
}

#[test]
fn snapshot_and_journal_tail_equal_a_full_read() {
    for (what, step) in tail_steps() {
        let dir = TempDir::new("snapshot-tail");
        big_store(dir.path());
        {
            let mut s = FileStore::open(dir.path()).unwrap();
            step(&mut s);
        }
        let s = FileStore::open(dir.path()).unwrap();
        assert!(s.opened_from_snapshot(), "{what}");
        let (_copy, full) = full_read(dir.path());
        assert_same(&s, &full, what);
        drop(s);
        // The same once a new snapshot covers the step too.
        FileStore::open(dir.path())
            .unwrap()
            .write_snapshot()
            .unwrap();
        let s = FileStore::open(dir.path()).unwrap();
        assert!(s.opened_from_snapshot(), "{what}");
        assert_same(&s, &full, &format!("{what}, new snapshot"));
    }
}

#[test]
fn tags_of_every_shape_come_back_from_the_snapshot() {
    let dir = TempDir::new("snapshot-demo");
    {
        let mut s = FileStore::open(dir.path()).unwrap();
        let now = DateTime::parse_from_rfc3339("2026-11-30T07:40:00+01:00").unwrap();
        loopside::demo::fill(&mut s, now).unwrap();
        let first = s.tags()[0].clone();
        let mut t = first.tag;
        t.hart = !t.hart;
        t.notes = "re-ranged after the pump change".into();
        t.tolerance_percent = 0.25;
        t.archived = true;
        s.update_tag(&first.id, t).unwrap();
        let tt = s
            .tags()
            .iter()
            .find(|t| t.tag.number.starts_with("TT"))
            .unwrap()
            .clone();
        let mut t = tt.tag;
        t.sensor = Some(loopside::sensor::Sensor::Thermocouple {
            tc: loopside::thermocouple::TcType::K,
            cj_c: 23.5,
        });
        s.update_tag(&tt.id, t).unwrap();
        s.write_snapshot().unwrap();
    }
    let s = FileStore::open(dir.path()).unwrap();
    assert!(s.opened_from_snapshot());
    let (_copy, full) = full_read(dir.path());
    assert!(full.tags().iter().any(|t| t.tag.loop_config.is_some()));
    assert!(full.tags().iter().any(|t| t.tag.sensor.is_some()));
    assert_same(&s, &full, "demo plant");
}

#[test]
fn a_long_tail_is_folded_into_a_new_snapshot_on_open() {
    let dir = TempDir::new("snapshot-long-tail");
    big_store(dir.path());
    let old = fs::read(dir.path().join(SNAPSHOT_FILE)).unwrap();
    {
        let mut s = FileStore::open(dir.path()).unwrap();
        s.persist(entries(700, 500).into_iter().map(Record::Entry).collect())
            .unwrap();
    }
    // Put the old snapshot back in place of the one closing wrote, as if the app had been
    // killed instead of closed.
    fs::write(dir.path().join(SNAPSHOT_FILE), &old).unwrap();
    let s = FileStore::open(dir.path()).unwrap();
    assert!(s.opened_from_snapshot());
    assert_eq!(s.entries().len(), 1200);
    assert_ne!(
        fs::read(dir.path().join(SNAPSHOT_FILE)).unwrap(),
        old,
        "a new snapshot was written"
    );
    drop(s);
    let again = FileStore::open(dir.path()).unwrap();
    let (_copy, full) = full_read(dir.path());
    assert_same(&again, &full, "after the new snapshot");
}

/// Open `dir` with `snapshot` in place of its snapshot; it must hold what a full read
/// holds, report nothing, and leave the journal alone.
#[track_caller]
fn opens_as_full_read(dir: &Path, snapshot: &[u8], full: &FileStore, what: &str) -> bool {
    let journal = fs::read(dir.join(JOURNAL_FILE)).unwrap();
    fs::write(dir.join(SNAPSHOT_FILE), snapshot).unwrap();
    let s = FileStore::open(dir).unwrap();
    assert!(s.recoveries().is_empty(), "{what}: {:?}", s.recoveries());
    assert_same(&s, full, what);
    let used = s.opened_from_snapshot();
    drop(s);
    assert_eq!(fs::read(dir.join(JOURNAL_FILE)).unwrap(), journal, "{what}");
    used
}

#[test]
fn a_damaged_snapshot_is_passed_over() {
    let dir = TempDir::new("snapshot-damaged");
    big_store(dir.path());
    let good = fs::read(dir.path().join(SNAPSHOT_FILE)).unwrap();
    let (_copy, full) = full_read(dir.path());
    let mut rng = Rng::from_clock("snapshot bit flips");
    // Every byte of the fixed header, then bytes anywhere.
    let mut positions: Vec<usize> = (0..HEADER).collect();
    positions.extend((0..60).map(|_| rng.below(good.len() as u64) as usize));
    for pos in positions {
        let mut bad = good.clone();
        bad[pos] ^= 1 << rng.below(8);
        opens_as_full_read(dir.path(), &bad, &full, &format!("flip at {pos}"));
    }
}

#[test]
fn a_truncated_snapshot_is_passed_over() {
    let dir = TempDir::new("snapshot-truncated");
    big_store(dir.path());
    let good = fs::read(dir.path().join(SNAPSHOT_FILE)).unwrap();
    let (_copy, full) = full_read(dir.path());
    let mut cuts = vec![
        0,
        1,
        15,
        16,
        100,
        HEADER - 9,
        HEADER - 8,
        HEADER - 1,
        HEADER,
        HEADER + 1,
        4096,
        good.len() / 2,
    ];
    cuts.extend((1..=8).map(|k| good.len() - k));
    for cut in cuts {
        let used = opens_as_full_read(dir.path(), &good[..cut], &full, &format!("cut at {cut}"));
        assert!(!used, "cut at {cut}: a short snapshot is never used");
    }
    assert!(opens_as_full_read(dir.path(), &good, &full, "whole"));
}

#[test]
fn a_stale_or_foreign_snapshot_is_passed_over() {
    let dir = TempDir::new("snapshot-stale");
    big_store(dir.path());
    let journal_path = dir.path().join(JOURNAL_FILE);
    let journal = fs::read(&journal_path).unwrap();
    let snapshot = fs::read(dir.path().join(SNAPSHOT_FILE)).unwrap();

    // Another store's snapshot (same tags, different entries).
    let other = TempDir::new("snapshot-other");
    {
        let mut s = FileStore::open(other.path()).unwrap();
        let mut records: Vec<Record> = (0..5).map(|i| Record::Tag(tag(i))).collect();
        records.extend(entries(3000, 700).into_iter().map(Record::Entry));
        s.persist(records).unwrap();
    }
    let other_snapshot = fs::read(other.path().join(SNAPSHOT_FILE)).unwrap();
    let (_c1, full) = full_read(dir.path());
    let foreign: Vec<(&str, Vec<u8>)> = vec![
        ("another store's snapshot", other_snapshot),
        ("empty", Vec::new()),
        ("the journal itself", journal.clone()),
        ("zeros", vec![0; snapshot.len()]),
        ("newer format", with_field(&snapshot, 0, 3)),
        (
            "the first format, without the aid",
            with_field(&snapshot, 0, 1),
        ),
        ("older journal schema", with_field(&snapshot, 1, 0)),
        ("covers more than the journal", {
            with_field(&snapshot, 2, journal.len() as u64 + 10)
        }),
    ];
    for (what, bytes) in &foreign {
        let used = opens_as_full_read(dir.path(), bytes, &full, what);
        assert!(!used, "{what}");
    }
    assert!(opens_as_full_read(dir.path(), &snapshot, &full, "its own"));

    // The journal put back to an older copy: the snapshot covers more than it holds.
    let older_end = journal.len() * 2 / 3;
    let older_end = older_end
        + journal[older_end..]
            .iter()
            .position(|&b| b == b'\n')
            .unwrap()
        + 1;
    fs::write(&journal_path, &journal[..older_end]).unwrap();
    let (_c2, older_full) = full_read(dir.path());
    fs::write(dir.path().join(SNAPSHOT_FILE), &snapshot).unwrap();
    let s = FileStore::open(dir.path()).unwrap();
    assert!(!s.opened_from_snapshot(), "older journal");
    assert_same(&s, &older_full, "older journal");
    drop(s);

    // The journal replaced by another, longer store's journal.
    {
        let mut o = FileStore::open(other.path()).unwrap();
        o.persist(entries(5000, 50).into_iter().map(Record::Entry).collect())
            .unwrap();
    }
    fs::copy(other.path().join(JOURNAL_FILE), &journal_path).unwrap();
    let (_c3, other_full) = full_read(dir.path());
    fs::write(dir.path().join(SNAPSHOT_FILE), &snapshot).unwrap();
    let s = FileStore::open(dir.path()).unwrap();
    assert!(!s.opened_from_snapshot(), "another journal");
    assert_same(&s, &other_full, "another journal");
}

/// `snapshot` with header field `i` (0 = format, 1 = schema, 2 = covered) set to `value`
/// and the header's check value made to fit, so only the field's meaning is wrong.
fn with_field(snapshot: &[u8], i: usize, value: u64) -> Vec<u8> {
    let mut b = snapshot.to_vec();
    let at = 16 + i * 8;
    b[at..at + 8].copy_from_slice(&value.to_le_bytes());
    let sum = check(&b[..HEADER - 8]);
    b[HEADER - 8..HEADER].copy_from_slice(&sum.to_le_bytes());
    b
}

#[test]
fn damage_after_the_snapshot_is_repaired_as_before() {
    let dir = TempDir::new("snapshot-torn-tail");
    big_store(dir.path());
    {
        let mut s = FileStore::open(dir.path()).unwrap();
        for e in entries(700, 3) {
            s.append(e).unwrap();
        }
    }
    let path = dir.path().join(JOURNAL_FILE);
    let bytes = fs::read(&path).unwrap();
    // Cut the last record in half, as a power cut would.
    fs::write(&path, &bytes[..bytes.len() - 30]).unwrap();
    let s = FileStore::open(dir.path()).unwrap();
    assert_eq!(s.recoveries().len(), 1);
    assert_eq!(s.recoveries()[0].kind, RecoveryKind::TornTail);
    assert_eq!(s.entries().len(), 702);
    drop(s);
    let s = FileStore::open(dir.path()).unwrap();
    assert!(s.recoveries().is_empty());
    assert!(
        s.opened_from_snapshot(),
        "the snapshot still fits the repaired journal"
    );
    let (_copy, full) = full_read(dir.path());
    assert_same(&s, &full, "after repair");
}

#[test]
fn snapshot_leftovers_are_removed_and_a_folder_in_its_place_is_harmless() {
    let dir = TempDir::new("snapshot-leftover");
    big_store(dir.path());
    let leftover = dir.path().join(format!(".{SNAPSHOT_FILE}.tmp-1-2"));
    fs::write(&leftover, b"half a snapshot").unwrap();
    let (_copy, full) = full_read(dir.path());
    let s = FileStore::open(dir.path()).unwrap();
    assert!(!leftover.exists(), "leftover removed");
    assert_same(&s, &full, "with a leftover");
    drop(s);

    fs::remove_file(dir.path().join(SNAPSHOT_FILE)).unwrap();
    fs::create_dir(dir.path().join(SNAPSHOT_FILE)).unwrap();
    let mut s = FileStore::open(dir.path()).unwrap();
    assert!(!s.opened_from_snapshot());
    assert_same(&s, &full, "folder in place of the snapshot");
    let err = s.write_snapshot().unwrap_err();
    assert!(err.to_string().contains(SNAPSHOT_FILE), "{err}");
}

#[test]
fn a_small_store_has_no_snapshot_until_asked() {
    let dir = TempDir::new("snapshot-small");
    let when = DateTime::parse_from_rfc3339("2026-11-30T07:40:00+01:00").unwrap();
    {
        let mut s = FileStore::open(dir.path()).unwrap();
        let id = s
            .add_tag(Tag::new("LT-101", Scale::linear(0.0, 4.5, "m").unwrap()).unwrap())
            .unwrap();
        s.append(Entry::new(&id, when, "AB", Kind::Note, "walk-down").unwrap())
            .unwrap();
    }
    assert!(!dir.path().join(SNAPSHOT_FILE).exists());
    {
        let mut s = FileStore::open(dir.path()).unwrap();
        s.write_snapshot().unwrap();
    }
    let s = FileStore::open(dir.path()).unwrap();
    assert!(s.opened_from_snapshot());
    assert_eq!(s.entries().len(), 1);
    assert_eq!(s.entries()[0].text, "walk-down");
}

#[test]
fn a_log_that_cannot_be_read_back_is_reported_and_nothing_is_saved_on_top() {
    let dir = TempDir::new("snapshot-unreadable");
    big_store(dir.path());
    let mut s = FileStore::open(dir.path()).unwrap();
    assert!(s.opened_from_snapshot());
    // Before the log is first read, its snapshot is overwritten and the journal goes.
    fs::write(dir.path().join(SNAPSHOT_FILE), b"overwritten").unwrap();
    fs::remove_file(dir.path().join(JOURNAL_FILE)).unwrap();
    assert!(s.entries().is_empty());
    assert_eq!(s.tags().len(), 5, "the tags were read on open");
    let err = s.append(entries(700, 1).remove(0)).unwrap_err();
    let msg = err.to_string();
    assert!(
        msg.contains(JOURNAL_FILE) && msg.contains("could not be read back"),
        "{msg}"
    );
    assert!(s.write_snapshot().is_err());
}

#[test]
fn a_store_opened_from_its_snapshot_can_move_to_another_thread() {
    let dir = TempDir::new("snapshot-thread");
    big_store(dir.path());
    let s = FileStore::open(dir.path()).unwrap();
    assert!(s.opened_from_snapshot());
    let n = std::thread::spawn(move || s.entries().len())
        .join()
        .unwrap();
    assert_eq!(n, 700);
}
