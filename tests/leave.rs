//! The before-you-leave list (links closed, loop back in its normal mode, forces and bypasses
//! removed, operations told): how it is recorded with a loop check and a fault-finding
//! session, what the log text and the handoff report say when something was not done, and
//! that records saved before the list existed still read.
//!
//! The four items are common practice at the end of work on a live loop (restore what was
//! broken or forced, tell the people who run the plant); the list itself is ours.

use chrono::{FixedOffset, NaiveDate, TimeZone};
use loopside::check::{CheckResult, Device, LoopCheck};
use loopside::diagnose::{procedure, Answer, Measurement, Session};
use loopside::journal::{Entry, Kind, Query};
use loopside::leave::{self, Item, LeaveList, LEAVE_VERSION, PAYLOAD_KEY};
use loopside::store::{MemoryStore, Store};
use loopside::tag::Tag;
use loopside::view::wording::check as words;

/// LT-101, inlet wet well level, 0–4.5 m on a 24 V loop (the invented Brindlemoor plant).
fn lt101() -> Tag {
    loopside::demo::tags()
        .unwrap()
        .into_iter()
        .find(|t| t.number == "LT-101")
        .unwrap()
}

/// An as-left check of LT-101 that reads true at every point.
fn as_left_check() -> CheckResult {
    let date = NaiveDate::from_ymd_opt(2026, 12, 1).unwrap();
    LoopCheck::for_tag(&lt101(), Device::Transmitter, date)
        .run_planned(&[4.0, 8.0, 12.0, 16.0, 20.0, 16.0, 12.0, 8.0, 4.0])
        .unwrap()
}

/// The stuck-low session on LT-101 that finds the wiring open: 0 mA, 24 V at the supply,
/// 0.1 V at the transmitter's terminals.
fn open_wiring_session() -> Session {
    let tag = lt101();
    let p = procedure::find("stuck-low", &[]).unwrap();
    let mut s = Session::start(&p, &tag);
    for (m, v) in [
        (Measurement::TxMa, 0.0),
        (Measurement::SupplyV, 24.0),
        (Measurement::TerminalV, 0.1),
    ] {
        s.answer(&p, &tag, Answer::Values([(m, v)].into_iter().collect()))
            .unwrap();
    }
    assert!(s.is_finished());
    s
}

#[test]
fn the_record_names_every_item_and_whether_it_was_done() {
    // Links closed and operations told; the loop stays in manual and the trip bypass stays
    // on, on purpose, until the transmitter is replaced tomorrow.
    let mut check = as_left_check();
    check.left(&[Item::Links, Item::Operations]);
    let payload = serde_json::to_value(&check).unwrap();
    let list = &payload[PAYLOAD_KEY];
    assert_eq!(list["version"], LEAVE_VERSION);
    let items = list["items"].as_array().unwrap();
    let ids: Vec<&str> = items.iter().map(|i| i["id"].as_str().unwrap()).collect();
    assert_eq!(ids, ["loop", "links", "forces", "operations"]);
    let done: Vec<bool> = items.iter().map(|i| i["done"].as_bool().unwrap()).collect();
    assert_eq!(done, [false, true, false, true]);
    for (i, item) in items.iter().zip(Item::ALL) {
        assert_eq!(i["text"], item.text(), "the words the technician saw");
    }

    // The session carries the same shape under the same key.
    let mut session = open_wiring_session();
    session.left(&[Item::Links, Item::Operations]);
    let s = serde_json::to_value(&session).unwrap();
    assert_eq!(s[PAYLOAD_KEY], *list);
}

#[test]
fn what_was_not_done_is_said_plainly_in_the_log_text() {
    let mut check = as_left_check();
    check.left(&[Item::Links, Item::Operations]);
    let text = words::log_text(&check);
    assert!(
        text.starts_with("transmitter check, as found: PASS"),
        "{text}"
    );
    assert!(
        text.ends_with(
            "Before you leave: NOT done (not confirmed): loop back in its normal mode; \
             forces and bypasses removed. Done: links closed; operations told."
        ),
        "{text}"
    );
    // The check's own report section says the same.
    assert!(
        words::markdown(&check).contains("NOT done (not confirmed): loop back in its normal mode")
    );

    check.left(&Item::ALL);
    assert!(words::log_text(&check).ends_with(
        "Before you leave: all done (loop back in its normal mode; links closed; \
         forces and bypasses removed; operations told)."
    ));

    let mut session = open_wiring_session();
    session.conclude("Lifted wire at JB-01 terminal 4, re-terminated");
    session.left(&[]);
    let text = loopside::view::wording::fault::log_text(&session);
    let lines: Vec<&str> = text.lines().collect();
    assert!(lines[0].starts_with("Reading stuck at or below zero: "));
    assert_eq!(
        lines[1],
        "Technician: Lifted wire at JB-01 terminal 4, re-terminated"
    );
    assert_eq!(
        lines[2],
        "Before you leave: NOT done (not confirmed): loop back in its normal mode; links closed; \
         forces and bypasses removed; operations told."
    );
}

#[test]
fn the_handoff_report_shows_what_was_not_done() {
    let now = FixedOffset::east_opt(3600)
        .unwrap()
        .with_ymd_and_hms(2026, 12, 1, 16, 30, 0)
        .unwrap();
    let mut store = MemoryStore::new();
    loopside::demo::fill(&mut store, now).unwrap();
    let id = store.tag("LT-101").unwrap().id.clone();
    let mut check = as_left_check();
    check.left(&[Item::Loop, Item::Links, Item::Operations]);
    let mut entry = Entry::new(&id, now, "EF", Kind::LoopCheck, &words::log_text(&check)).unwrap();
    entry.payload = Some(serde_json::to_value(&check).unwrap());
    store.append(entry).unwrap();
    let bundle = loopside::report::select(&store, &Query::default(), now);
    let md = loopside::report::markdown(&bundle);
    assert!(
        md.contains("Before you leave: NOT done (not confirmed): forces and bypasses removed."),
        "{md}"
    );
    let csv = loopside::report::csv(&bundle);
    assert!(csv.contains("NOT done (not confirmed): forces and bypasses removed"));
}

#[test]
fn records_saved_before_the_list_existed_still_read() {
    // A loop-check payload and a session as an earlier loopside wrote them: no
    // `before_leaving` key at all.
    let mut old_check = serde_json::to_value(as_left_check()).unwrap();
    old_check.as_object_mut().unwrap().remove(PAYLOAD_KEY);
    assert!(old_check.get(PAYLOAD_KEY).is_none());
    let read: CheckResult = serde_json::from_value(old_check).unwrap();
    assert_eq!(read.before_leaving, None);
    assert!(words::markdown(&read).contains("Before you leave: not recorded"));
    assert!(!words::log_text(&read).contains("Before you leave"));

    let mut old_session = serde_json::to_value(open_wiring_session()).unwrap();
    old_session.as_object_mut().unwrap().remove(PAYLOAD_KEY);
    let p = procedure::find("stuck-low", &[]).unwrap();
    let resumed = Session::resume(&old_session.to_string(), &p).unwrap();
    assert_eq!(resumed.before_leaving, None);
    assert_eq!(
        leave::summary_of(resumed.before_leaving.as_ref()),
        "Before you leave: not recorded (saved before loopside asked)."
    );

    // A record from a later version with an item this build does not know still reads,
    // in the words it was recorded with.
    let later = r#"{"version": 2, "items": [
        {"id": "loop", "text": "Loop back in its normal mode", "done": true},
        {"id": "tags", "text": "Isolation tags removed", "done": false}]}"#;
    let list: LeaveList = serde_json::from_str(later).unwrap();
    assert_eq!(
        list.summary(),
        "Before you leave: NOT done (not confirmed): Isolation tags removed. \
         Done: loop back in its normal mode."
    );
}
