//! Hand-overs and bundles through the application layer (no UI): one file format and one
//! wording from every front; an import takes a bundle in once.

mod util;

use chrono::{DateTime, FixedOffset};
use loopside::action::bundle::{
    export_handover, handover, import_bundle, Destination, Format, Imported,
};
use loopside::action::check::{sensor_inputs_of, sensor_of};
use loopside::journal::{parse_since, Kind, Query};
use loopside::store::{FileStore, MemoryStore, Store, StoreError};
use util::TempDir;

/// Evening hand-over at Brindlemoor, 1 December 2026, 18:30 (UTC+1).
fn now() -> DateTime<FixedOffset> {
    DateTime::parse_from_rfc3339("2026-12-01T18:30:00+01:00").unwrap()
}

fn brindlemoor() -> MemoryStore {
    util::brindlemoor(now())
}

#[test]
fn a_handover_is_written_in_each_format_under_its_own_name() {
    let store = brindlemoor();
    let dir = TempDir::new("action-export");
    let all = Query::default();
    for (format, typed) in [
        (Format::Markdown, "md"),
        (Format::Csv, "csv"),
        (Format::Json, "json"),
    ] {
        assert_eq!(Format::parse(typed).unwrap(), format);
        let done = export_handover(
            &store,
            now(),
            &all,
            format,
            &Destination::Folder(dir.0.join("exports")),
        )
        .unwrap();
        assert_eq!(
            done.path.file_name().unwrap().to_str().unwrap(),
            format!("loopside-handoff-2026-12-01-1830.{typed}")
        );
        assert_eq!(done.entries, store.entries().len());
        assert_eq!(done.tags, loopside::demo::tags().unwrap().len());
        assert_eq!(
            done.to_string(),
            format!(
                "Wrote {} entries on {} tags to {}.",
                done.entries,
                done.tags,
                done.path.display()
            )
        );
        let text = std::fs::read_to_string(&done.path).unwrap();
        assert!(text.contains("PT-204") && text.ends_with('\n'));
    }
    assert_eq!(
        Format::parse("pdf").unwrap_err().field,
        "format",
        "one list of formats"
    );
}

#[test]
fn a_shift_handover_holds_only_what_was_written_since_the_shift_began() {
    let store = brindlemoor();
    let q = Query {
        since: parse_since("today", now()).unwrap(),
        ..Query::default()
    };
    let shift = handover(&store, now(), &q, Format::Json);
    let b = loopside::report::parse_bundle(&shift.text).unwrap();
    assert_eq!(b.entries.len(), shift.entries);
    assert!(shift.entries < store.entries().len());
    assert!(b
        .entries
        .iter()
        .all(|e| e.time.date_naive().to_string().as_str() >= "2026-12-01"));
}

#[test]
fn a_bundle_imports_once_and_older_check_records_survive_the_trip() {
    let mut store = brindlemoor();
    // A check saved by an older app, with `sensor` and no version, travels as it is.
    let tt412 = store.tag("TT-412").unwrap().id.clone();
    let mut old =
        loopside::journal::Entry::new(&tt412, now(), "AB", Kind::LoopCheck, "old check").unwrap();
    old.payload = Some(serde_json::json!({
        "pass": true,
        "sensor": {"kind": "rtd", "element": "pt100", "wiring": "three-wire", "lead_ohms": 0.0},
    }));
    store.append(old).unwrap();
    // The readable hand-overs take it as they take any check.
    for format in [Format::Markdown, Format::Csv] {
        let h = handover(&store, now(), &Query::default(), format);
        assert!(h.text.contains("old check"), "{format:?}");
    }
    let dir = TempDir::new("action-import");
    let done = export_handover(
        &store,
        now(),
        &Query::default(),
        Format::Json,
        &Destination::File(dir.0.join("bundle.json")),
    )
    .unwrap();

    let mut other = FileStore::open(&dir.0.join("other")).unwrap();
    let first = import_bundle(&mut other, &done.path).unwrap();
    assert_eq!(first.0.tags_added, loopside::demo::tags().unwrap().len());
    assert_eq!(first.0.entries_added, store.entries().len());
    // The demo's three reference instruments travel in the bundle too.
    assert_eq!(
        first.to_string(),
        format!(
            "Imported {} tag(s) and {} entr(ies); 0 entr(ies) were already here. Added 3 reference instrument(s).",
            first.0.tags_added,
            store.entries().len()
        )
    );
    let again: Imported = import_bundle(&mut other, &done.path).unwrap();
    assert_eq!(again.0.entries_added, 0);
    assert_eq!(again.0.entries_already_here, store.entries().len());
    let came = other.entries().last().unwrap();
    assert_eq!(came.text, "old check");
    let p = came.payload.as_ref().unwrap();
    assert!(
        p.get("payload_version").is_none(),
        "records are not rewritten"
    );
    assert!(sensor_of(p).is_some());
    assert!(
        sensor_inputs_of(p).is_none(),
        "no points recorded, nothing to work out"
    );
}

#[test]
fn a_file_that_is_not_a_bundle_is_refused_and_nothing_changes() {
    let mut store = MemoryStore::new();
    let dir = TempDir::new("action-not-bundle");
    let md = dir.0.join("handoff.md");
    std::fs::write(&md, "# Hand-over\n").unwrap();
    for (path, field) in [
        (md.as_path(), "bundle"),
        (std::path::Path::new(""), "bundle file"),
        (dir.0.join("missing.json").as_path(), "bundle file"),
    ] {
        match import_bundle(&mut store, path).unwrap_err() {
            StoreError::Input(f) => assert_eq!(f.field, field, "{path:?}"),
            other => panic!("{other}"),
        }
    }
    assert!(store.is_empty());
}
