//! What is due: calibration intervals on tags, the last check that left each loop
//! calibrated (at the check's own date), and overdue or due-soon tags around a month's end
//! and a leap day. Calendar arithmetic worked by hand beside each case.

mod util;

use chrono::NaiveDate;
use loopside::action::check::{save_check, NewCheck};
use loopside::calibration::due::{due_list, parse_within, DueStatus};
use loopside::check::{Device, LoopCheck, Stage};
use loopside::store::{MemoryStore, Store};
use loopside::tag::Tag;
use util::{loopside, loopside_json, loopside_refuses, TempDir};

fn date(y: i32, m: u32, d: u32) -> NaiveDate {
    NaiveDate::from_ymd_opt(y, m, d).unwrap()
}

/// A store with `PT-1` on `interval` days and loop checks saved on the given dates.
fn store_with(interval: Option<u32>, checks: &[(NaiveDate, Stage, f64)]) -> MemoryStore {
    let mut store = MemoryStore::new();
    let mut tag = Tag::new(
        "PT-1",
        loopside::scale::Scale::linear(0.0, 10.0, "bar").unwrap(),
    )
    .unwrap();
    tag.calibration_interval_days = interval;
    store.add_tag(tag.clone()).unwrap();
    for (day, stage, offset_ma) in checks {
        let measured: Vec<f64> = [4.0, 12.0, 20.0].iter().map(|m| m + offset_ma).collect();
        let result = LoopCheck::for_tag(&tag, Device::Transmitter, *day)
            .points(vec![0.0, 50.0, 100.0])
            .stage(*stage)
            .run_planned(&measured)
            .unwrap();
        // Typed in on a later day than the check itself: the check's date counts.
        save_check(
            &mut store,
            util::afternoon(),
            NewCheck {
                tag: "PT-1",
                initials: "ab",
                result: &result,
                sensor: None,
            },
        )
        .unwrap();
    }
    store
}

fn one(
    store: &MemoryStore,
    today: NaiveDate,
    within: u32,
) -> Option<loopside::calibration::due::DueItem> {
    due_list(
        store.tags().iter().map(|t| (&t.id, &t.tag)),
        store.entries(),
        today,
        within,
        true,
    )
    .into_iter()
    .next()
}

#[test]
fn thirty_days_from_the_end_of_january() {
    // As left on 31 January 2026, every 30 days: 31 Jan + 30 days = 2 March 2026
    // (28 days in February 2026, a common year).
    let store = store_with(Some(30), &[(date(2026, 1, 31), Stage::AsLeft, 0.0)]);
    let on = |d| one(&store, d, 7).unwrap();
    let i = on(date(2026, 2, 28));
    assert_eq!(i.due, Some(date(2026, 3, 2)));
    assert_eq!(i.days_left, Some(2));
    assert_eq!(i.status, DueStatus::Due);
    assert_eq!(on(date(2026, 3, 2)).status, DueStatus::Due, "due today");
    let late = on(date(2026, 3, 3));
    assert_eq!(
        (late.status, late.days_left),
        (DueStatus::Overdue, Some(-1))
    );
    // 23 February: 7 days left, the edge of a 7-day window; 22 February is outside it.
    assert_eq!(on(date(2026, 2, 23)).status, DueStatus::Due);
    assert_eq!(on(date(2026, 2, 22)).status, DueStatus::NotDue);
    assert_eq!(
        loopside::view::wording::due::line(&late),
        "PT-1  OVERDUE by 1 day (due 2026-03-02; last calibrated 2026-01-31; every 30 days)"
    );
}

#[test]
fn a_year_from_a_leap_day() {
    // As left on 29 February 2024, every 365 days: 2025 is a common year, so 365 days on
    // is 28 February 2025; on 1 March 2025 it is a day overdue.
    let store = store_with(Some(365), &[(date(2024, 2, 29), Stage::AsLeft, 0.0)]);
    let i = one(&store, date(2025, 3, 1), 7).unwrap();
    assert_eq!(i.due, Some(date(2025, 2, 28)));
    assert_eq!(i.status, DueStatus::Overdue);
    // And across a leap day: as left 1 February 2028, every 30 days → 2 March 2028
    // (29 days in February 2028).
    let store = store_with(Some(30), &[(date(2028, 2, 1), Stage::AsLeft, 0.0)]);
    assert_eq!(
        one(&store, date(2028, 3, 1), 7).unwrap().due,
        Some(date(2028, 3, 2))
    );
}

#[test]
fn which_checks_leave_a_loop_calibrated() {
    // An as-found FAIL (0.16 mA = 1 % of span, beyond ±0.5 %) does not; the as-left after
    // it does; a later as-found pass with no adjustment does too (left as found).
    let store = store_with(
        Some(365),
        &[
            (date(2025, 5, 1), Stage::AsFound, 0.16),
            (date(2025, 5, 1), Stage::AsLeft, 0.0),
            (date(2026, 4, 20), Stage::AsFound, 0.01),
            (date(2026, 6, 1), Stage::AsFound, 0.16),
        ],
    );
    let i = one(&store, date(2026, 12, 1), 7).unwrap();
    assert_eq!(i.last_calibrated, Some(date(2026, 4, 20)));
    assert_eq!(i.due, Some(date(2027, 4, 20)));
}

#[test]
fn never_checked_tags_are_listed_and_tags_without_an_interval_are_not() {
    let store = store_with(Some(90), &[]);
    let i = one(&store, date(2026, 12, 1), 7).unwrap();
    assert_eq!(i.status, DueStatus::NeverChecked);
    assert!(loopside::view::wording::due::line(&i).contains("never checked"));
    let store = store_with(None, &[(date(2026, 1, 1), Stage::AsLeft, 0.0)]);
    assert!(one(&store, date(2026, 12, 1), 7).is_none());
}

#[test]
fn windows_are_read_as_typed() {
    for (text, days) in [
        ("7d", 7),
        ("7 d", 7),
        ("30 days", 30),
        ("2w", 14),
        ("2 weeks", 14),
        ("0", 0),
        ("1 day", 1),
    ] {
        assert_eq!(parse_within(text).unwrap(), days, "{text}");
    }
    for bad in ["soon", "-3d", "1,5d", "d", "20000 days"] {
        assert_eq!(parse_within(bad).unwrap_err().field, "within", "{bad}");
    }
}

#[test]
fn the_command_line_lists_what_is_due() {
    let dir = TempDir::new("cli-due");
    let d = dir.arg();
    let run = |args: &[&str]| {
        let mut all = vec!["--data-dir", d.as_str()];
        all.extend_from_slice(args);
        let out = loopside(&all);
        assert!(
            out.status.success(),
            "{args:?}: {}",
            String::from_utf8_lossy(&out.stderr)
        );
        String::from_utf8_lossy(&out.stdout).to_string()
    };
    run(&[
        "tag",
        "add",
        "PT-1",
        "--range",
        "0..10",
        "--unit",
        "bar",
        "--interval",
        "30",
    ]);
    run(&[
        "tag",
        "add",
        "PT-2",
        "--range",
        "0..10",
        "--unit",
        "bar",
        "--interval",
        "365",
    ]);
    run(&["tag", "add", "PT-3", "--range", "0..10", "--unit", "bar"]);
    run(&[
        "check",
        "--tag",
        "PT-1",
        "--device",
        "transmitter",
        "--applied",
        "0,10",
        "--measured",
        "4,20",
        "--stage",
        "as-left",
        "--date",
        "2026-01-31",
        "--save",
    ]);
    run(&[
        "check",
        "--tag",
        "PT-2",
        "--device",
        "transmitter",
        "--applied",
        "0,10",
        "--measured",
        "4,20",
        "--stage",
        "as-left",
        "--date",
        "2025-12-01",
        "--save",
    ]);
    let v = loopside_json(&["--data-dir", &d, "due", "--date", "2026-03-03", "--json"]);
    let tags = v["tags"].as_array().unwrap();
    assert_eq!(tags.len(), 1, "{v}");
    assert_eq!(tags[0]["tag"], "PT-1");
    assert_eq!(tags[0]["status"], "overdue");
    assert_eq!(tags[0]["due"], "2026-03-02");
    // PT-2, as left 1 December 2025 every 365 days, falls due 1 December 2026.
    let v = loopside_json(&[
        "--data-dir",
        &d,
        "due",
        "--date",
        "2026-11-20",
        "--within",
        "2w",
        "--json",
    ]);
    let names: Vec<&str> = v["tags"]
        .as_array()
        .unwrap()
        .iter()
        .map(|t| t["tag"].as_str().unwrap())
        .collect();
    assert_eq!(names, ["PT-1", "PT-2"]);
    let text = run(&["due", "--date", "2026-11-20", "--within", "2w"]);
    assert!(
        text.contains("PT-2  due in 11 days (on 2026-12-01"),
        "{text}"
    );
    let e = loopside_refuses(&["--data-dir", &d, "due", "--within", "soon"]);
    assert!(e.contains("within"), "{e}");
    let e = loopside_refuses(&["--data-dir", &d, "tag", "edit", "PT-3", "--interval", "0"]);
    assert!(e.contains("interval"), "{e}");
}
