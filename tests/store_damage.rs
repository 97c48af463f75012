//! Damage at open: truncation at every byte, random bit flips, foreign files. Opening
//! never panics, keeps every intact record, never keeps a changed one, and reports and
//! sets aside the rest.

mod util;

use chrono::DateTime;
use loopside::journal::{Entry, Kind};
use loopside::scale::Scale;
use loopside::store::{FileStore, RecoveryKind, Store, JOURNAL_FILE};
use loopside::tag::Tag;
use util::{Rng, TempDir};

/// A small store's journal bytes and the records in it, in order, as (start, end) of
/// each line (end = index of its newline).
fn small_store() -> (Vec<u8>, Vec<Entry>, Vec<(usize, usize)>) {
    let dir = TempDir::new("damage-src");
    let mut entries = Vec::new();
    {
        let mut s = FileStore::open(dir.path()).unwrap();
        let id = s
            .add_tag(Tag::new("LT-101", Scale::linear(0.0, 4.5, "m").unwrap()).unwrap())
            .unwrap();
        for (i, text) in ["3.2 mA at terminals", "loose wire re-made", "=1+1 as found"]
            .iter()
            .enumerate()
        {
            let time =
                DateTime::parse_from_rfc3339(&format!("2026-11-30T07:4{i}:00+01:00")).unwrap();
            let e = Entry::new(&id, time, "CD", Kind::FaultFinding, text).unwrap();
            s.append(e.clone()).unwrap();
            entries.push(e);
        }
    }
    let bytes = std::fs::read(dir.path().join(JOURNAL_FILE)).unwrap();
    let mut lines = Vec::new();
    let mut start = 0;
    for (i, b) in bytes.iter().enumerate() {
        if *b == b'\n' {
            lines.push((start, i));
            start = i + 1;
        }
    }
    assert_eq!(lines.len(), 5, "header, one tag, three entries");
    (bytes, entries, lines)
}

fn open_damaged(bytes: &[u8]) -> (TempDir, FileStore) {
    let dir = TempDir::new("damage");
    std::fs::write(dir.path().join(JOURNAL_FILE), bytes).unwrap();
    let s = FileStore::open(dir.path()).expect("a damaged store still opens");
    (dir, s)
}

#[test]
fn truncation_at_every_byte_keeps_every_complete_record() {
    let (bytes, entries, lines) = small_store();
    for cut in 0..=bytes.len() {
        let (dir, mut s) = open_damaged(&bytes[..cut]);
        // A record survives when all of its line (not necessarily its newline) remains.
        let complete = |i: usize| lines[i].1 <= cut;
        let want_tag = complete(1);
        let want: Vec<&Entry> = (0..3)
            .filter(|&i| complete(i + 2))
            .map(|i| &entries[i])
            .collect();
        assert_eq!(s.tags().len(), usize::from(want_tag), "cut at {cut}");
        let got: Vec<&Entry> = s.entries().iter().collect();
        assert_eq!(got, want, "cut at {cut}");
        let partial = cut > 0
            && !lines
                .iter()
                .any(|&(a, e)| cut == a || cut == e || cut == e + 1);
        if partial {
            assert_eq!(s.recoveries().len(), 1, "cut at {cut} is reported");
            let r = &s.recoveries()[0];
            let aside = std::fs::read(&r.aside).unwrap();
            match r.kind {
                RecoveryKind::TornTail => {
                    assert!(
                        bytes[..cut].ends_with(&aside),
                        "torn bytes set aside, cut {cut}"
                    )
                }
                RecoveryKind::Damaged => assert_eq!(aside, &bytes[..cut]),
                RecoveryKind::Migrated => panic!("no migration expected"),
            }
            assert!(r.records_lost >= 1 && !r.message.is_empty());
        }
        // The store works after recovery, and recovery happens once.
        if want_tag {
            let id = s.tags()[0].id.clone();
            let e = Entry::new(&id, entries[0].time, "AB", Kind::Note, "after recovery").unwrap();
            s.append(e).unwrap();
        }
        drop(s);
        let again = FileStore::open(dir.path()).unwrap();
        assert!(
            again.recoveries().is_empty(),
            "cut at {cut}: {:?}",
            again.recoveries()
        );
        assert_eq!(again.entries().len(), want.len() + usize::from(want_tag));
    }
}

#[test]
fn random_bit_flips_never_change_a_kept_record() {
    let (bytes, entries, lines) = small_store();
    let mut rng = Rng::from_clock("bit flips");
    for _ in 0..400 {
        let pos = rng.below(bytes.len() as u64) as usize;
        let bit = rng.below(8);
        let mut bad = bytes.clone();
        bad[pos] ^= 1 << bit;
        let (_dir, s) = open_damaged(&bad);
        // Lines touched: the one holding the byte, and the next if the byte was its newline.
        let touched = |i: usize| {
            let (a, e) = lines[i];
            (a..=e).contains(&pos) || (i > 0 && lines[i - 1].1 == pos)
        };
        for (i, e) in entries.iter().enumerate() {
            let kept = s.entries().iter().find(|k| k.id == e.id);
            if let Some(k) = kept {
                assert_eq!(k, e, "a kept record is unchanged (flip at {pos} bit {bit})");
            } else {
                assert!(
                    touched(i + 2),
                    "untouched record {i} lost (flip at {pos} bit {bit})"
                );
            }
        }
        assert!(s.entries().len() <= entries.len());
        if s.entries().len() < entries.len() || s.tags().is_empty() {
            let r = s.recoveries();
            assert_eq!(r.len(), 1, "loss is reported (flip at {pos} bit {bit})");
            assert!(r[0].records_lost >= 1);
            assert!(
                r[0].message.contains("could not be read") || r[0].message.contains("incomplete")
            );
        }
    }
}

#[test]
fn a_foreign_file_is_set_aside_and_an_empty_store_started() {
    let foreign: [&[u8]; 5] = [
        b"\x89PNG\r\n\x1a\n\x00\x00\x00\rIHDR\x00\x00",
        b"hello, this is a shopping list\nmilk\n",
        b"[1, 2, 3]\n",
        b"{\"loopside\":\"journal\",\"schema\":1}\n",
        &[0u8; 4096],
    ];
    for bytes in foreign {
        let (dir, mut s) = open_damaged(bytes);
        assert!(s.is_empty());
        let r = &s.recoveries()[0];
        assert_eq!(r.kind, RecoveryKind::Damaged);
        assert_eq!(
            std::fs::read(&r.aside).unwrap(),
            bytes,
            "the original is kept aside"
        );
        let id = s
            .add_tag(Tag::new("PT-204", Scale::linear(0.0, 10.0, "bar").unwrap()).unwrap())
            .unwrap();
        assert!(s.tag_by_id(&id).is_some());
        drop(s);
        assert!(FileStore::open(dir.path()).unwrap().recoveries().is_empty());
    }
}

#[test]
fn a_folder_in_place_of_the_journal_is_an_error_not_a_panic() {
    let dir = TempDir::new("folder-journal");
    std::fs::create_dir(dir.path().join(JOURNAL_FILE)).unwrap();
    let err = FileStore::open(dir.path()).unwrap_err();
    assert!(err.to_string().contains(JOURNAL_FILE), "{err}");
}
