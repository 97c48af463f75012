//! Trip and alarm tests worked as a technician would on the ladder: a high trip tested
//! rising and a low alarm tested falling over several runs, the current to inject for the
//! setpoint on linear, square-root, reversed and table loops, bad input named by field,
//! and the test saved as a `trip-test` log entry through the application layer.
//!
//! Definitions (stated in `loopside::calibration::trip`): trip error = (trip − setpoint)
//! ÷ span, worst run; deadband = trip − reset (rising) or reset − trip (falling), largest
//! run; repeatability = max − min of the trip values; all in % of span.

mod util;

use chrono::NaiveDate;
use loopside::action::trip::{payload, result_of, save_trip, NewTrip, PAYLOAD_VERSION};
use loopside::calibration::trip::{TripDirection, TripTest};
use loopside::form::trip::{judge, TripText};
use loopside::journal::Kind;
use loopside::scale::{CharTable, RootLocation, Scale, SignalSpan, TablePoint, Transfer};
use loopside::store::Store;
use loopside::tag::Tag;
use util::{close, loopside_json, loopside_refuses, TempDir};

fn day() -> NaiveDate {
    NaiveDate::from_ymd_opt(2026, 12, 1).unwrap()
}

#[test]
fn a_high_trip_tested_rising_three_times() {
    // A high-pressure trip on a 50–250 psig transmitter, set at 150 psig. The current for
    // 150 psig on 50–250 psig is 12.0 mA (ISA blog, "Linear relationships for 4–20 mA
    // transmitters"). Tolerance ±1 % of the 200 psig span = ±2 psig.
    let scale = Scale::linear(50.0, 250.0, "psi").unwrap();
    let r = TripTest::new(&scale, day(), 150.0, TripDirection::Rising, 1.0)
        .run(&[151.0, 151.6, 150.8], &[147.0, 147.4, 146.8])
        .unwrap();
    close(r.setpoint_ma, 12.0, 1e-12, "current for 150 psig");
    assert!(r.current_rises_with_value);
    // Worked by hand: errors +1.0/200 = +0.5 %, +1.6/200 = +0.8 %, +0.8/200 = +0.4 %.
    close(r.runs[0].trip_error_pct, 0.5, 1e-9, "run 1 error");
    close(r.runs[1].trip_error_pct, 0.8, 1e-9, "run 2 error");
    close(r.runs[2].trip_error_pct, 0.4, 1e-9, "run 3 error");
    close(r.trip_error_pct, 0.8, 1e-9, "worst error");
    assert_eq!(r.worst_run, 1);
    // Deadbands 4.0, 4.2, 4.0 psig of 200 → 2.0, 2.1, 2.0 %; the largest is 2.1 %.
    close(r.deadband_pct, 2.1, 1e-9, "deadband");
    // Trips spread from 150.8 to 151.6 psig: 0.8 / 200 = 0.4 %.
    close(r.repeatability_pct.unwrap(), 0.4, 1e-9, "repeatability");
    assert!(r.pass);
    let summary = loopside::view::wording::trip::summary(&r);
    assert!(
        summary.starts_with("PASS: trip error +0.80 % of span (worst, run 2)"),
        "{summary}"
    );
    assert!(
        summary.contains("repeatability 0.40 % (max − min of 3 trips)"),
        "{summary}"
    );
}

#[test]
fn a_low_alarm_tested_falling_fails_on_its_worst_run() {
    // PT-204 (0–10 bar), low discharge pressure alarm at 2 bar, ±0.5 % of span = ±0.05 bar.
    // Current for 2 bar: 4 + 16 × 0.2 = 7.2 mA (linear 4–20 mA relation).
    let scale = Scale::linear(0.0, 10.0, "bar").unwrap();
    let r = TripTest::new(&scale, day(), 2.0, TripDirection::Falling, 0.5)
        .run(&[1.97, 1.93, 1.98], &[2.10, 2.08, 2.11])
        .unwrap();
    close(r.setpoint_ma, 7.2, 1e-12, "current for 2 bar");
    // Errors −0.03, −0.07, −0.02 bar of 10 → −0.3, −0.7, −0.2 %: run 2 is beyond ±0.5 %.
    close(r.trip_error_pct, -0.7, 1e-9, "worst error");
    assert_eq!(r.worst_run, 1);
    assert!(r.runs[0].pass && !r.runs[1].pass && r.runs[2].pass);
    assert!(!r.pass);
    // Deadbands (reset − trip) 0.13, 0.15, 0.13 bar → 1.3, 1.5, 1.3 %.
    close(r.deadband_pct, 1.5, 1e-9, "deadband");
    // Trips from 1.93 to 1.98 bar: 0.5 %.
    close(r.repeatability_pct.unwrap(), 0.5, 1e-9, "repeatability");
    let ramp = loopside::view::wording::trip::ramp(&r);
    assert_eq!(
        ramp,
        "inject 7.200 mA for the setpoint; ramp the current down slowly to trip"
    );
}

#[test]
fn one_run_has_no_repeatability_and_says_so() {
    let scale = Scale::linear(0.0, 10.0, "bar").unwrap();
    let r = TripTest::new(&scale, day(), 8.0, TripDirection::Rising, 0.5)
        .run(&[8.02], &[7.9])
        .unwrap();
    assert_eq!(r.repeatability_pct, None);
    assert!(
        loopside::view::wording::trip::summary(&r).contains("repeatability not measured (one run)")
    );
}

#[test]
fn the_current_to_inject_follows_the_tags_own_scale() {
    // Reversed: PDT-707 sends 20 mA at 0 mbar and 4 mA at 250 mbar. A high-DP alarm at
    // 200 mbar: 20 − 16 × 200/250 = 7.2 mA, and the current falls as the DP rises.
    let reversed = Scale::linear(250.0, 0.0, "mbar").unwrap();
    let r = TripTest::new(&reversed, day(), 200.0, TripDirection::Rising, 0.5)
        .run(&[200.5], &[195.0])
        .unwrap();
    close(r.setpoint_ma, 7.2, 1e-12, "reversed");
    assert!(!r.current_rises_with_value);
    assert!(loopside::view::wording::trip::ramp(&r).contains("ramp the current down"));
    // Square root in the receiver: 50 % of flow is 25 % of DP (ISO 5167 relation: 25 % DP
    // → 50 % flow), so a low-flow alarm at 1500 of 0–3000 m³/h is injected at
    // 4 + 16 × 0.25 = 8 mA.
    let sqrt = Scale::new(
        0.0,
        3000.0,
        "m3/h",
        Transfer::SquareRoot {
            cutoff_percent: 1.0,
            root_in: RootLocation::Receiver,
        },
        SignalSpan::default(),
    )
    .unwrap();
    let r = TripTest::new(&sqrt, day(), 1500.0, TripDirection::Falling, 1.0)
        .run(&[1490.0], &[1530.0])
        .unwrap();
    close(r.setpoint_ma, 8.0, 1e-9, "square root");
    // Errors in % of the flow span: −10 / 3000 = −0.333 %.
    close(r.trip_error_pct, -10.0 / 3000.0 * 100.0, 1e-9, "flow error");
    // Table: level 0, 1, 2 m → volume 0, 4, 12 m³ on a 0–2 m transmitter. A high-volume
    // alarm at 8 m³ lies halfway up the second segment: 1.5 m = 75 % → 16 mA (by hand).
    let table = CharTable::new(
        vec![
            TablePoint {
                input: 0.0,
                output: 0.0,
            },
            TablePoint {
                input: 1.0,
                output: 4.0,
            },
            TablePoint {
                input: 2.0,
                output: 12.0,
            },
        ],
        "m3",
    )
    .unwrap();
    let tank = Scale::new(0.0, 2.0, "m", Transfer::Table(table), SignalSpan::default()).unwrap();
    let r = TripTest::new(&tank, day(), 8.0, TripDirection::Rising, 1.0)
        .run(&[8.06], &[7.7])
        .unwrap();
    close(r.setpoint_ma, 16.0, 1e-9, "table");
    // Span is the table's output span, 12 m³: +0.06 / 12 = +0.5 %.
    close(r.span, 12.0, 1e-12, "volume span");
    close(r.trip_error_pct, 0.5, 1e-9, "volume error");
}

#[test]
fn bad_input_names_the_field() {
    let scale = Scale::linear(0.0, 10.0, "bar").unwrap();
    let rising = TripTest::new(&scale, day(), 8.0, TripDirection::Rising, 0.5);
    // A rising trip cannot reset above where it tripped: the lists are swapped.
    let e = rising.run(&[8.0, 8.02], &[7.9, 8.1]).unwrap_err();
    assert_eq!(e.field, "reset-at[2]");
    assert!(e.reason.contains("swapped"), "{}", e.reason);
    assert_eq!(
        rising.run(&[8.0, 8.02], &[7.9]).unwrap_err().field,
        "reset-at"
    );
    assert_eq!(rising.run(&[], &[]).unwrap_err().field, "trip-at");
    assert_eq!(
        rising.run(&[f64::NAN], &[7.9]).unwrap_err().field,
        "trip-at[1]"
    );
    let beyond = TripTest::new(&scale, day(), 13.0, TripDirection::Rising, 0.5);
    let e = beyond.run(&[13.0], &[12.0]).unwrap_err();
    assert_eq!(e.field, "setpoint");
    assert!(e.reason.contains("130.00 %"), "{}", e.reason);
    let no_tolerance = TripTest::new(&scale, day(), 8.0, TripDirection::Rising, 0.0);
    assert_eq!(
        no_tolerance.run(&[8.0], &[7.9]).unwrap_err().field,
        "tolerance"
    );
}

#[test]
fn the_form_reads_decimal_commas_units_and_the_tags_tolerance() {
    let mut tag = Tag::new("PT-204", Scale::linear(0.0, 10.0, "bar").unwrap()).unwrap();
    tag.tolerance_percent = 0.5;
    // 850 kPa is 8.5 bar (NIST SP 811: 1 bar = 100 000 Pa).
    let r = judge(
        &tag,
        day(),
        TripText {
            setpoint: "850 kPa",
            direction: "rising",
            trip_at: "8,52; 8,53",
            reset_at: "8,41; 8,42",
            tolerance: "",
            note: "  switch PS-204H  ",
        },
    )
    .unwrap();
    close(r.setpoint, 8.5, 1e-12, "setpoint in bar");
    close(r.tolerance_pct, 0.5, 0.0, "the tag's tolerance");
    close(r.trip_error_pct, 0.3, 1e-9, "worst error");
    assert_eq!(r.tag, "PT-204");
    assert_eq!(r.note, "switch PS-204H");
    let e = judge(
        &tag,
        day(),
        TripText {
            setpoint: "8.5",
            direction: "upwards",
            trip_at: "8.5",
            reset_at: "8.4",
            ..TripText::default()
        },
    )
    .unwrap_err();
    assert_eq!(e.field, "direction");
    let e = judge(
        &tag,
        day(),
        TripText {
            setpoint: "2 m",
            direction: "rising",
            trip_at: "8.5",
            reset_at: "8.4",
            ..TripText::default()
        },
    )
    .unwrap_err();
    assert_eq!(e.field, "setpoint");
}

#[test]
fn a_trip_test_is_saved_as_its_own_kind_of_entry() {
    let now = util::afternoon();
    let mut store = util::brindlemoor(now);
    let tag = store.tag("PT-204").unwrap().tag.clone();
    let r = TripTest::new(&tag.scale, day(), 2.0, TripDirection::Falling, 0.5)
        .tag_number(&tag.number)
        .run(&[1.97, 1.98], &[2.10, 2.11])
        .unwrap();
    let saved = save_trip(
        &mut store,
        now,
        NewTrip {
            tag: "pt-204",
            initials: "mk",
            result: &r,
        },
    )
    .unwrap();
    assert!(saved.pass);
    assert_eq!(
        saved.to_string(),
        format!("Saved the trip test of PT-204 as {}.", saved.id)
    );
    let entry = store.entry(&saved.id).unwrap().clone();
    assert_eq!(entry.kind, Kind::TripTest);
    assert_eq!(entry.author, "MK");
    assert!(
        entry
            .text
            .starts_with("Trip test at 2.000 bar, trips on falling: PASS"),
        "{}",
        entry.text
    );
    let p = entry.payload.unwrap();
    assert_eq!(p["payload_version"], PAYLOAD_VERSION);
    assert_eq!(result_of(&p).unwrap(), r);
    assert_eq!(payload(&r).unwrap(), p);
    let closed = store.closed_follow_ups();
    let row = loopside::view::log::row(&store, store.entry(&saved.id).unwrap(), &closed);
    assert_eq!(row.title, "Trip test passed");
    // Unknown tag: nothing written.
    let before = store.entries().len();
    assert!(save_trip(
        &mut store,
        now,
        NewTrip {
            tag: "XX-1",
            initials: "",
            result: &r
        }
    )
    .is_err());
    assert_eq!(store.entries().len(), before);
}

#[test]
fn the_command_line_gives_the_issue_keys_and_saves() {
    let v = loopside_json(&[
        "trip",
        "--range",
        "50..250",
        "--unit",
        "psi",
        "--setpoint",
        "150",
        "--rising",
        "--trip-at",
        "151,151.6,150.8",
        "--reset-at",
        "147,147.4,146.8",
        "--tolerance",
        "1",
        "--date",
        "2026-12-01",
        "--json",
    ]);
    close(
        v["trip_error_pct"].as_f64().unwrap(),
        0.8,
        1e-9,
        "trip_error_pct",
    );
    close(
        v["deadband_pct"].as_f64().unwrap(),
        2.1,
        1e-9,
        "deadband_pct",
    );
    close(
        v["repeatability_pct"].as_f64().unwrap(),
        0.4,
        1e-9,
        "repeatability_pct",
    );
    assert_eq!(v["pass"], true);
    close(
        v["setpoint_ma"].as_f64().unwrap(),
        12.0,
        1e-12,
        "setpoint_ma",
    );

    let e = loopside_refuses(&[
        "trip",
        "--range",
        "0..10",
        "--unit",
        "bar",
        "--setpoint",
        "2",
        "--falling",
        "--trip-at",
        "1.9",
        "--reset-at",
        "1.8",
        "--tolerance",
        "0.5",
    ]);
    assert!(e.contains("reset-at[1]"), "{e}");
    // Both directions at once, or none: a usage error (exit 2).
    for both_or_none in [&["--falling", "--rising"][..], &[][..]] {
        let mut args = vec![
            "trip",
            "--range",
            "0..10",
            "--unit",
            "bar",
            "--setpoint",
            "2",
            "--trip-at",
            "1.9",
            "--reset-at",
            "2.1",
        ];
        args.extend_from_slice(both_or_none);
        let out = util::loopside(&args);
        assert_eq!(out.status.code(), Some(2), "{both_or_none:?}");
    }

    let dir = TempDir::new("cli-trip");
    let d = dir.arg();
    let out = util::loopside(&["--data-dir", &d, "demo"]);
    assert!(out.status.success());
    let text = util::loopside(&[
        "--data-dir",
        &d,
        "trip",
        "--tag",
        "PT-204",
        "--setpoint",
        "2",
        "--falling",
        "--trip-at",
        "1.97;1.98",
        "--reset-at",
        "2,10;2,11",
        "--save",
        "--author",
        "mk",
    ]);
    assert!(
        text.status.success(),
        "{}",
        String::from_utf8_lossy(&text.stderr)
    );
    let text = String::from_utf8_lossy(&text.stdout);
    assert!(
        text.starts_with("! A trip test on a live loop can trip the plant or a safety function"),
        "{text}"
    );
    assert!(text.contains("Saved the trip test of PT-204 as "), "{text}");
    let list = util::loopside(&[
        "--data-dir",
        &d,
        "note",
        "list",
        "PT-204",
        "--kind",
        "trip-test",
    ]);
    let list = String::from_utf8_lossy(&list.stdout);
    assert!(list.contains("Trip test at 2.000 bar"), "{list}");
}
