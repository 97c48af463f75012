//! Drift across visits: three as-found checks a year apart whose errors grow linearly give
//! that rate exactly; when the trend reaches the tolerance; the interval the stated policy
//! suggests; one check gives no rate and says why.
//!
//! Rates are per Julian year of 365.25 days (`calibration::drift::DAYS_PER_YEAR`); the
//! checks below are 365 days apart (1 June 2021, 2022, 2023: no 29 February between), so
//! +0.1 % of span per 365 days is 0.1 × 365.25 / 365 % of span per year.

mod util;

use chrono::NaiveDate;
use loopside::action::check::{save_check, NewCheck};
use loopside::calibration::drift::{drift, NoRate, Policy};
use loopside::check::{Device, LoopCheck, Stage};
use loopside::store::{MemoryStore, Store};
use loopside::tag::Tag;
use util::{close, loopside_json, TempDir};

fn date(y: i32, m: u32, d: u32) -> NaiveDate {
    NaiveDate::from_ymd_opt(y, m, d).unwrap()
}

/// PT-9 (0–10 bar, ±0.5 %) with as-found checks reading `offset_ma` high at every point.
fn history(checks: &[(NaiveDate, f64)]) -> MemoryStore {
    let mut store = MemoryStore::new();
    let tag = Tag::new(
        "PT-9",
        loopside::scale::Scale::linear(0.0, 10.0, "bar").unwrap(),
    )
    .unwrap();
    store.add_tag(tag.clone()).unwrap();
    for (day, offset_ma) in checks {
        let measured: Vec<f64> = [4.0, 8.0, 12.0, 16.0, 20.0, 16.0, 12.0, 8.0, 4.0]
            .iter()
            .map(|m| m + offset_ma)
            .collect();
        let result = LoopCheck::for_tag(&tag, Device::Transmitter, *day)
            .stage(Stage::AsFound)
            .run_planned(&measured)
            .unwrap();
        save_check(
            &mut store,
            util::afternoon(),
            NewCheck {
                tag: "PT-9",
                initials: "gh",
                result: &result,
                sensor: None,
            },
        )
        .unwrap();
    }
    store
}

#[test]
fn three_checks_a_year_apart_growing_linearly_give_that_rate_exactly() {
    // +0.016 mA = +0.1 % of the 16 mA span; +0.032 = +0.2 %; +0.048 = +0.3 %.
    let store = history(&[
        (date(2021, 6, 1), 0.016),
        (date(2022, 6, 1), 0.032),
        (date(2023, 6, 1), 0.048),
    ]);
    let policy = Policy::default();
    let d = drift(store.entries(), 0.5, Some(365), policy).unwrap();
    let per_year = 0.1 * 365.25 / 365.0;
    close(d.rate_pct_per_year.unwrap(), per_year, 1e-9, "rate");
    // Nine series: 0, 25, 50 and 75 % met rising and falling, 100 % rising only.
    assert_eq!(d.points.len(), 9);
    for p in &d.points {
        close(p.rate_pct_per_year.unwrap(), per_year, 1e-9, "each point");
    }
    // The line is +0.1 % on 1 June 2021 and gains 0.1 % every 365 days: it reaches
    // +0.5 % after 4 × 365 = 1460 days, on 31 May 2025.
    assert_eq!(d.reaches_tolerance_on, Some(date(2025, 5, 31)));
    // Policy f = 0.5: 0.25 % of span / (0.1 % per 365 days) = 912.5 days; one step from
    // 365 days may reach at most 730 days (factor 2).
    close(
        d.ideal_interval_days.unwrap(),
        912.5,
        1e-6,
        "ideal interval",
    );
    assert_eq!(d.suggested_interval_days, Some(730));
    // A factor of 3 lets it reach the ideal, in whole days.
    let wide = Policy {
        max_step: 3.0,
        ..policy
    };
    assert_eq!(
        drift(store.entries(), 0.5, Some(365), wide)
            .unwrap()
            .suggested_interval_days,
        Some(912)
    );
    let words = loopside::view::wording::drift::interval_reasoning(&d).unwrap();
    assert!(words.contains("suggested interval 730 days"), "{words}");
    assert!(
        words.contains("current 365 days by a factor of up to 2"),
        "{words}"
    );
}

#[test]
fn a_transmitter_that_drifts_fast_is_checked_sooner() {
    // +0.4 % of span in 365 days on a ±0.5 % tolerance: f·TL / rate = 0.25 / 0.4 × 365
    // = 228.1 days; from 365 days the step allows down to 182.5, so 228 days.
    let store = history(&[(date(2021, 6, 1), 0.0), (date(2022, 6, 1), 0.064)]);
    let d = drift(store.entries(), 0.5, Some(365), Policy::default()).unwrap();
    close(
        d.rate_pct_per_year.unwrap(),
        0.4 * 365.25 / 365.0,
        1e-9,
        "rate",
    );
    assert_eq!(d.suggested_interval_days, Some(228));
}

#[test]
fn one_check_gives_no_rate_and_says_why() {
    let store = history(&[(date(2026, 11, 30), 0.02)]);
    let d = drift(store.entries(), 0.5, Some(365), Policy::default()).unwrap();
    assert_eq!(d.rate_pct_per_year, None);
    assert_eq!(d.suggested_interval_days, None);
    assert_eq!(
        d.no_rate,
        Some(NoRate::OneDate {
            date: date(2026, 11, 30),
            checks: 1
        })
    );
    let why = loopside::view::wording::drift::no_rate(d.no_rate.as_ref().unwrap());
    assert!(why.contains("at least two dates"), "{why}");
    let none = drift(MemoryStore::new().entries(), 0.5, None, Policy::default()).unwrap();
    assert_eq!(none.no_rate, Some(NoRate::NoChecks));
}

#[test]
fn an_as_found_failure_is_flagged_for_the_planner() {
    // +0.12 mA = +0.75 % of span: outside ±0.5 %.
    let store = history(&[(date(2025, 6, 1), 0.02), (date(2026, 6, 1), 0.12)]);
    let d = drift(store.entries(), 0.5, None, Policy::default()).unwrap();
    assert!(!d.visits[1].pass);
    let lines = loopside::view::wording::drift::lines("PT-9", &d);
    assert_eq!(
        lines[1],
        "For the planner: as found OUT OF TOLERANCE on 2026-06-01."
    );
}

#[test]
fn a_policy_out_of_range_is_named() {
    let bad = Policy {
        fraction_of_tolerance: 1.5,
        ..Policy::default()
    };
    assert_eq!(
        drift(MemoryStore::new().entries(), 0.5, None, bad)
            .unwrap_err()
            .field,
        "fraction"
    );
    let bad = Policy {
        max_step: 0.5,
        ..Policy::default()
    };
    assert_eq!(
        drift(MemoryStore::new().entries(), 0.5, None, bad)
            .unwrap_err()
            .field,
        "max-step"
    );
}

#[test]
fn the_command_line_gives_the_issue_keys() {
    let dir = TempDir::new("cli-drift");
    let d = dir.arg();
    let run = |args: &[&str]| {
        let mut all = vec!["--data-dir", d.as_str()];
        all.extend_from_slice(args);
        let out = util::loopside(&all);
        assert!(
            out.status.success(),
            "{args:?}: {}",
            String::from_utf8_lossy(&out.stderr)
        );
    };
    run(&[
        "tag",
        "add",
        "PT-9",
        "--range",
        "0..10",
        "--unit",
        "bar",
        "--interval",
        "365",
    ]);
    for (day, m0, m1) in [
        ("2021-06-01", "4.016", "20.016"),
        ("2022-06-01", "4.032", "20.032"),
        ("2023-06-01", "4.048", "20.048"),
    ] {
        let measured = format!("{m0},{m1}");
        run(&[
            "check",
            "--tag",
            "PT-9",
            "--device",
            "transmitter",
            "--applied",
            "0,10",
            "--measured",
            &measured,
            "--date",
            day,
            "--save",
        ]);
    }
    let v = loopside_json(&["--data-dir", &d, "drift", "PT-9", "--json"]);
    close(
        v["rate_pct_per_year"].as_f64().unwrap(),
        0.1 * 365.25 / 365.0,
        1e-9,
        "rate",
    );
    assert_eq!(v["reaches_tolerance_on"], "2025-05-31");
    assert_eq!(v["suggested_interval_days"], 730);
    assert!(v["suggested_interval_reasoning"]
        .as_str()
        .unwrap()
        .contains("730 days"));
}

#[test]
fn the_demo_plant_carries_references_intervals_a_trip_loop_and_three_years_of_history() {
    let now = util::afternoon();
    let store = util::brindlemoor(now);
    // Three invented references; the decade box is past due.
    let ids: Vec<&str> = store.references().iter().map(|r| r.id.as_str()).collect();
    assert_eq!(ids, ["PM-07", "MC-02", "DB-03"]);
    assert!(store
        .reference("DB-03")
        .unwrap()
        .days_past_due(now.date_naive())
        .is_some());
    // Every tag has an interval.
    assert!(store
        .tags()
        .iter()
        .all(|t| t.tag.calibration_interval_days.is_some()));
    // LT-101: as found +0.10, +0.18, +0.27 % of span one, two and three years ago, each
    // 365 days apart: least squares over (0, 0.10), (1, 0.18), (2, 0.27) per 365 days
    // gives 0.085 % per 365 days, = 0.085 × 365.25 / 365 per year.
    let lt101 = store.tag("LT-101").unwrap();
    let d = drift(
        store.entries().iter().filter(|e| e.tag == lt101.id),
        lt101.tag.tolerance_percent,
        lt101.tag.calibration_interval_days,
        Policy::default(),
    )
    .unwrap();
    close(
        d.rate_pct_per_year.unwrap(),
        0.085 * 365.25 / 365.0,
        1e-9,
        "LT-101 drift",
    );
    assert_eq!(d.visits.len(), 3);
    // The demo's payloads are the shape the application layer writes.
    for e in store
        .entries()
        .iter()
        .filter(|e| e.tag == lt101.id && e.kind == loopside::journal::Kind::LoopCheck)
    {
        let p = e.payload.clone().unwrap();
        let result: loopside::check::CheckResult = serde_json::from_value(p.clone()).unwrap();
        assert_eq!(loopside::action::check::payload(&result, None).unwrap(), p);
    }
    // LT-610: two yearly trip tests, in the shape `action::trip` writes, both passed.
    let lt610 = store.tag("LT-610").unwrap();
    let trips: Vec<_> = store
        .entries()
        .iter()
        .filter(|e| e.tag == lt610.id && e.kind == loopside::journal::Kind::TripTest)
        .collect();
    assert_eq!(trips.len(), 2);
    for e in trips {
        let p = e.payload.clone().unwrap();
        let r = loopside::action::trip::result_of(&p).unwrap();
        assert!(r.pass);
        assert_eq!(loopside::action::trip::payload(&r).unwrap(), p);
    }
    // What is due a year after LT-101's last visit: it falls due today.
    let due = loopside::calibration::due::due_list(
        store.tags().iter().map(|t| (&t.id, &t.tag)),
        store.entries(),
        now.date_naive(),
        7,
        false,
    );
    assert!(
        due.iter()
            .any(|i| i.tag == "LT-101" && i.days_left == Some(0)),
        "{due:?}"
    );
}
