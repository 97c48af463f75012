//! Inputs the fuzz targets in `fuzz/` found wrong, each kept as a worked example named after
//! what it guards, so the fix stays fixed without running the fuzzer. The fuzz target and
//! the input that first showed it are named beside each test.

mod util;

use loopside::journal::TagId;
use loopside::scale::Scale;
use loopside::store::record::{encode_line, Record};
use loopside::store::{FileStore, RecoveryKind, Store, TagRecord, JOURNAL_FILE};
use loopside::tag::Tag;
use util::{files_under, TempDir};

fn tag_record(id: &str, number: &str) -> TagRecord {
    TagRecord {
        id: TagId(id.into()),
        tag: Tag::new(number, Scale::linear(0.0, 4.5, "m").unwrap()).unwrap(),
    }
}

/// fuzz target `journal`: a journal written before schema versions existed whose last
/// record was torn by a power cut. The open cut the torn tail off but left the file at
/// schema 0, so the next open upgraded it and told the technician a second story.
#[test]
fn an_old_journal_with_a_torn_last_record_is_upgraded_on_the_same_open() {
    let dir = TempDir::new("fuzz-old-torn");
    let path = dir.path().join(JOURNAL_FILE);
    // Schema 0 (a header without a version), the inlet and outlet level tags, then half of
    // a third record: the tablet died while saving it.
    let mut old = Vec::new();
    encode_line(&serde_json::json!({"loopside": "journal"}), &mut old).unwrap();
    encode_line(&Record::Tag(tag_record("t-1", "LT-101")), &mut old).unwrap();
    encode_line(&Record::Tag(tag_record("t-2", "LT-102")), &mut old).unwrap();
    let whole = old.len();
    let mut third = Vec::new();
    encode_line(&Record::Tag(tag_record("t-3", "LT-103")), &mut third).unwrap();
    old.extend_from_slice(&third[..third.len() / 2]);
    std::fs::write(&path, &old).unwrap();

    let s = FileStore::open(dir.path()).unwrap();
    let kinds: Vec<&RecoveryKind> = s.recoveries().iter().map(|r| &r.kind).collect();
    assert_eq!(kinds, [&RecoveryKind::TornTail, &RecoveryKind::Migrated]);
    assert!(s.tag("LT-101").is_some() && s.tag("LT-102").is_some());
    assert!(
        s.tag("LT-103").is_none(),
        "the torn record is not taken as whole"
    );
    // Nothing lost: the backup is the old file up to the tear, the torn copy the rest.
    let torn = std::fs::read(&s.recoveries()[0].aside).unwrap();
    let backup = std::fs::read(&s.recoveries()[1].aside).unwrap();
    assert_eq!([backup.as_slice(), torn.as_slice()].concat(), old);
    assert_eq!(backup.len(), whole);
    drop(s);

    let s = FileStore::open(dir.path()).unwrap();
    assert!(
        s.recoveries().is_empty(),
        "upgraded once: {:?}",
        s.recoveries()
    );
    assert_eq!(s.tags().len(), 2);
    assert_eq!(
        files_under(dir.path()).len(),
        4,
        "journal, lock, torn copy and backup: {:?}",
        files_under(dir.path())
    );
}

/// fuzz target `period`: `-26-1- 1` typed as the start of a hand-over was read as 1 January
/// of the year 26 BC (the date reader takes a signed, unpadded year), a moment no log holds
/// and that cannot even be written out as a time with its offset. Typed dates now lie in
/// 1970 to 2999 and anything else is refused naming the field.
#[test]
fn a_typed_date_outside_1970_to_2999_is_refused_not_read_as_an_ancient_year() {
    use loopside::journal::{parse_period, Bound};
    let now = chrono::DateTime::parse_from_rfc3339("2026-12-01T18:30:00+01:00").unwrap();
    for typed in [
        "-26-1- 1",
        "0001-01-01",
        "1969-12-31",
        "3000-01-01 06:00",
        "0999-05-05T00:00:00Z",
    ] {
        for bound in [Bound::Since, Bound::Until] {
            let e = parse_period("since", typed, bound, now, now.offset()).unwrap_err();
            assert_eq!(e.field, "since");
            assert!(e.reason.contains("1970 to 2999"), "{typed}: {e}");
        }
    }
    // The night shift's own dates still read.
    let start = parse_period("since", "2026-11-30", Bound::Since, now, now.offset()).unwrap();
    assert_eq!(
        start.unwrap().to_rfc3339(),
        "2026-11-29T23:00:00+00:00",
        "local midnight at UTC+1"
    );
    assert!(parse_period("since", "1970-01-02", Bound::Since, now, now.offset()).is_ok());
    assert!(parse_period("since", "2999-12-31", Bound::Until, now, now.offset()).is_ok());
}
