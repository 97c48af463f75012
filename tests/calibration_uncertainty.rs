//! References with their real uncertainty: a worked TUR example with two references whose
//! data sheets give % of reading + % of full scale (computed independently here), the
//! decision rules of ILAC-G8:09/2019 §4.2 on points inside, between and outside the
//! guarded limits, the warnings, reference records in the store (file store reopened,
//! with and without its snapshot), bundles that carry them, and the command line.

mod util;

use chrono::NaiveDate;
use loopside::calibration::reference::{FullScaleBasis, Reference, ReferenceAccuracy};
use loopside::check::uncertainty::{assess, decide, Decision, DecisionRule, UncertaintyWarning};
use loopside::check::{CheckResult, Device, LoopCheck, Stage};
use loopside::scale::Scale;
use loopside::store::{FileStore, MemoryStore, Store};
use util::{close, loopside, loopside_json, loopside_refuses, TempDir};

fn day() -> NaiveDate {
    NaiveDate::from_ymd_opt(2026, 12, 1).unwrap()
}

fn date(y: i32, m: u32, d: u32) -> NaiveDate {
    NaiveDate::from_ymd_opt(y, m, d).unwrap()
}

/// An invented pressure module, 0–20 bar: ±(0.025 % of reading + 0.01 % of full scale).
fn module() -> Reference {
    Reference {
        id: "PM-07".into(),
        description: "Pressure module 0–20 bar".into(),
        unit: "bar".into(),
        range_low: 0.0,
        range_high: 20.0,
        accuracy: ReferenceAccuracy {
            percent_of_reading: 0.025,
            percent_of_full_scale: 0.01,
            basis: FullScaleBasis::FullScale,
            fixed: 0.0,
        },
        calibration_due: date(2027, 3, 31),
    }
}

/// An invented loop meter, 0–24 mA: ±(0.01 % of reading + 0.01 % of full scale).
fn meter() -> Reference {
    Reference {
        id: "MM-02".into(),
        description: "Loop meter".into(),
        unit: "mA".into(),
        range_low: 0.0,
        range_high: 24.0,
        accuracy: ReferenceAccuracy {
            percent_of_reading: 0.01,
            percent_of_full_scale: 0.01,
            basis: FullScaleBasis::FullScale,
            fixed: 0.0,
        },
        calibration_due: date(2027, 1, 15),
    }
}

/// PT-204 (0–10 bar, ±0.5 % of span) checked as a transmitter at the five points up and
/// down, reading `offset_ma` high everywhere.
fn pt204(offset_ma: f64) -> CheckResult {
    let scale = Scale::linear(0.0, 10.0, "bar").unwrap();
    let measured: Vec<f64> = [4.0, 8.0, 12.0, 16.0, 20.0, 16.0, 12.0, 8.0, 4.0]
        .iter()
        .map(|m| m + offset_ma)
        .collect();
    LoopCheck::new(&scale, Device::Transmitter, day())
        .tag_number("PT-204")
        .tolerance(0.5)
        .stage(Stage::AsFound)
        .run_planned(&measured)
        .unwrap()
}

#[test]
fn tur_with_a_pressure_module_and_a_loop_meter_worked_by_hand() {
    let check = pt204(0.0);
    let a = assess(&check, &[module(), meter()], DecisionRule::Simple).unwrap();
    // Worked independently from the data sheets (the arithmetic written out, not the
    // code's): at 100 % the module reads 10 bar and the meter 20 mA.
    //   module: 0.025 % × 10 bar + 0.01 % × 20 bar = 0.0025 + 0.0020 = 0.0045 bar
    //           = 0.0045 / 10 bar of span = 0.045 % of span
    //   meter:  0.01 % × 20 mA + 0.01 % × 24 mA = 0.0020 + 0.0024 = 0.0044 mA
    //           = 0.0044 / 16 mA of span = 0.0275 % of span
    //   combined (root-sum-square): √(0.045² + 0.0275²) = √0.00278125 = 0.0527376 %
    //   TUR = 0.5 / 0.0527376 = 9.4809
    let at_full = &a.points[4];
    close(at_full.reference_pct[0], 0.045, 1e-12, "module at 100 %");
    close(at_full.reference_pct[1], 0.0275, 1e-12, "meter at 100 %");
    close(
        at_full.combined_pct,
        0.002_781_25_f64.sqrt(),
        1e-12,
        "combined at 100 %",
    );
    close(
        at_full.tur.unwrap(),
        0.5 / 0.002_781_25_f64.sqrt(),
        1e-9,
        "TUR at 100 %",
    );
    close(at_full.tur.unwrap(), 9.4809, 1e-4, "TUR at 100 %, rounded");
    // At 0 %: module 0.01 % × 20 = 0.002 bar = 0.02 %; meter 0.0004 + 0.0024 = 0.0028 mA
    // = 0.0175 %; combined √(0.0004 + 0.00030625) = 0.0265754 %; TUR 18.81.
    let at_zero = &a.points[0];
    close(at_zero.reference_pct[0], 0.02, 1e-12, "module at 0 %");
    close(at_zero.reference_pct[1], 0.0175, 1e-12, "meter at 0 %");
    close(
        at_zero.tur.unwrap(),
        0.5 / 0.000_706_25_f64.sqrt(),
        1e-9,
        "TUR at 0 %",
    );
    // The smallest TUR is where both read most: 100 %, point 5.
    assert_eq!(a.min_tur_index, 4);
    close(a.min_tur.unwrap(), 9.4809, 1e-4, "smallest TUR");
    assert!(a.warnings.is_empty(), "{:?}", a.warnings);
    assert_eq!(a.decision, Decision::Pass);
    let words = loopside::view::wording::uncertainty::summary(&a);
    assert_eq!(
        words,
        "References PM-07, MM-02; smallest TUR 9.5:1 (point 5); simple acceptance: pass"
    );
}

#[test]
fn a_module_in_kpa_on_a_bar_loop_gives_the_same_share() {
    // 1 bar = 100 kPa (NIST SP 811). The same module described in kPa.
    let mut kpa = module();
    kpa.unit = "kPa".into();
    kpa.range_high = 2000.0;
    let a = assess(&pt204(0.0), &[kpa], DecisionRule::Simple).unwrap();
    close(
        a.points[4].reference_pct[0],
        0.045,
        1e-12,
        "module in kPa at 100 %",
    );
}

#[test]
fn full_scale_or_range_is_what_the_data_sheet_says() {
    // A compound module −1 to 10 bar, ±0.05 % of full scale: of full scale (10 bar) it
    // is ±0.005 bar; of range (11 bar) ±0.0055 bar.
    let mut compound = module();
    compound.range_low = -1.0;
    compound.range_high = 10.0;
    compound.accuracy = ReferenceAccuracy {
        percent_of_reading: 0.0,
        percent_of_full_scale: 0.05,
        basis: FullScaleBasis::FullScale,
        fixed: 0.0,
    };
    close(compound.accuracy_at(5.0), 0.005, 1e-15, "of full scale");
    compound.accuracy.basis = FullScaleBasis::Range;
    close(compound.accuracy_at(5.0), 0.0055, 1e-15, "of range");
    compound.accuracy.fixed = 0.001;
    close(
        compound.accuracy_at(5.0),
        0.0065,
        1e-15,
        "with a fixed part",
    );
}

#[test]
fn decision_rules_inside_between_and_outside_the_guarded_limits() {
    // Tolerance ±0.5 % of span, combined reference accuracy U = 0.1 %: guarded acceptance
    // limit 0.4 %, and FAIL beyond 0.6 % (ILAC-G8:09/2019 §4.2.3 with w = U).
    let (tl, u) = (0.5, 0.1);
    let guarded = |e: f64| decide(DecisionRule::Guarded, e, tl, u);
    let simple = |e: f64| decide(DecisionRule::Simple, e, tl, u);
    for (error, want_guarded, want_simple) in [
        (0.30, Decision::Pass, Decision::Pass),
        (-0.40, Decision::Pass, Decision::Pass),
        (0.45, Decision::PassWithinUncertainty, Decision::Pass),
        (-0.50, Decision::PassWithinUncertainty, Decision::Pass),
        (0.55, Decision::FailWithinUncertainty, Decision::Fail),
        (-0.60, Decision::FailWithinUncertainty, Decision::Fail),
        (0.65, Decision::Fail, Decision::Fail),
        (-2.0, Decision::Fail, Decision::Fail),
    ] {
        assert_eq!(guarded(error), want_guarded, "guarded, error {error}");
        assert_eq!(simple(error), want_simple, "simple, error {error}");
    }
    use loopside::view::wording::uncertainty::decision;
    assert_eq!(
        decision(Decision::PassWithinUncertainty),
        "pass, within the uncertainty"
    );
    assert_eq!(
        decision(Decision::FailWithinUncertainty),
        "FAIL, within the uncertainty"
    );
}

#[test]
fn a_guarded_check_says_which_zone_each_point_fell_in() {
    // A coarse module: ±0.1 % of full scale on 0–10 bar is ±0.01 bar = 0.1 % of span at
    // every point; alone, U = 0.1 %. Reading +0.072 mA high is +0.45 % of span: inside the
    // tolerance but within U of it.
    let mut coarse = module();
    coarse.range_high = 10.0;
    coarse.accuracy = ReferenceAccuracy {
        percent_of_reading: 0.0,
        percent_of_full_scale: 0.1,
        basis: FullScaleBasis::FullScale,
        fixed: 0.0,
    };
    let mut check = pt204(0.072);
    assert!(check.pass, "simple acceptance passes it");
    check
        .with_references(&[coarse.clone()], DecisionRule::Guarded)
        .unwrap();
    let a = check.uncertainty.as_ref().unwrap();
    assert_eq!(a.decision, Decision::PassWithinUncertainty);
    close(
        a.points[2].acceptance_limit_pct,
        0.4,
        1e-12,
        "acceptance limit",
    );
    assert!(check.pass, "a conditional pass is still a pass");
    let text = loopside::view::wording::check::log_text(&check);
    assert!(
        text.contains("guarded acceptance: pass, within the uncertainty"),
        "{text}"
    );
    // +0.088 mA is +0.55 %: FAIL, within the uncertainty.
    let mut check = pt204(0.088);
    check
        .with_references(&[coarse], DecisionRule::Guarded)
        .unwrap();
    assert_eq!(
        check.uncertainty.as_ref().unwrap().decision,
        Decision::FailWithinUncertainty
    );
    assert!(!check.pass);
}

#[test]
fn warnings_for_a_low_tur_a_reference_past_due_and_a_reading_outside_its_range() {
    // A 0–5 bar test gauge, ±0.5 % of full scale (0.025 bar = 0.25 % of span): TUR 2:1,
    // under 4:1 (common practice); due 2026-11-20, 11 days before the check; and the
    // 7.5 and 10 bar points are beyond its range.
    let gauge = Reference {
        id: "TG-11".into(),
        description: "Test gauge".into(),
        unit: "bar".into(),
        range_low: 0.0,
        range_high: 5.0,
        accuracy: ReferenceAccuracy {
            percent_of_reading: 0.0,
            percent_of_full_scale: 0.5,
            basis: FullScaleBasis::FullScale,
            fixed: 0.0,
        },
        calibration_due: date(2026, 11, 20),
    };
    let a = assess(&pt204(0.0), &[gauge], DecisionRule::Simple).unwrap();
    close(a.min_tur.unwrap(), 2.0, 1e-9, "TUR");
    assert!(a.warnings.contains(&UncertaintyWarning::ReferencePastDue {
        id: "TG-11".into(),
        due: date(2026, 11, 20),
        days_over: 11
    }));
    assert!(a
        .warnings
        .iter()
        .any(|w| matches!(w, UncertaintyWarning::LowTur { point: 1, .. })));
    assert!(a.warnings.iter().any(
        |w| matches!(w, UncertaintyWarning::OutsideRange { point: 4, reading, .. } if *reading == 7.5)
    ));
    let words: Vec<String> = a
        .warnings
        .iter()
        .map(loopside::view::wording::uncertainty::warning)
        .collect();
    assert!(
        words
            .iter()
            .any(|w| w.contains("below 4:1 (common practice)")),
        "{words:?}"
    );
}

#[test]
fn a_reference_that_cannot_be_compared_is_named() {
    let mut thermometer = module();
    thermometer.id = "TC-3".into();
    thermometer.unit = "°C".into();
    let e = assess(&pt204(0.0), &[thermometer], DecisionRule::Simple).unwrap_err();
    assert_eq!(e.field, "reference TC-3");
    let e = assess(
        &pt204(0.0),
        &[module(), meter(), module()],
        DecisionRule::Simple,
    )
    .unwrap_err();
    assert_eq!(e.field, "reference");
    let e = assess(&pt204(0.0), &[module(), module()], DecisionRule::Simple).unwrap_err();
    assert!(e.reason.contains("named twice"), "{}", e.reason);
}

#[test]
fn a_receiver_check_takes_the_sources_current() {
    // Injecting 4–20 mA with a source ±(0.01 % of reading + 0.01 % of 24 mA): at 20 mA
    // 0.0044 mA = 0.0275 % of span, as for the meter above.
    let scale = Scale::linear(0.0, 10.0, "bar").unwrap();
    let check = LoopCheck::new(&scale, Device::Receiver, day())
        .tolerance(0.5)
        .run(&[4.0, 12.0, 20.0], &[0.0, 5.0, 10.0])
        .unwrap();
    let a = assess(&check, &[meter()], DecisionRule::Simple).unwrap();
    close(
        a.points[2].reference_pct[0],
        0.0275,
        1e-12,
        "source at 20 mA",
    );
}

#[test]
fn an_older_check_record_without_references_still_reads() {
    // A version-2 loop-check payload as written before references were kept in the store:
    // no `uncertainty` key. It reads, and a check without references writes none.
    let check = pt204(0.01);
    let mut old = loopside::action::check::payload(&check, None).unwrap();
    assert!(old.get("uncertainty").is_none());
    old.as_object_mut().unwrap().remove("uncertainty");
    let back: CheckResult = serde_json::from_value(old).unwrap();
    assert_eq!(back.uncertainty, None);
    assert_eq!(back, check);
    // With references, the payload carries them and reads back whole.
    let mut with = pt204(0.01);
    with.with_references(&[module(), meter()], DecisionRule::Guarded)
        .unwrap();
    let v = loopside::action::check::payload(&with, None).unwrap();
    assert_eq!(v["uncertainty"]["references"][1]["id"], "MM-02");
    let back: CheckResult = serde_json::from_value(v).unwrap();
    assert_eq!(back, with);
}

#[test]
fn references_are_kept_across_reopening_from_a_snapshot_and_travel_in_bundles() {
    let dir = TempDir::new("ref-store");
    // Other tests of this file start the binary: a child process holds a copy of a store's
    // lock between its fork and its exec, so a store reopened at once may wait a moment.
    let open = |p: &std::path::Path| FileStore::open_waiting(p, std::time::Duration::from_secs(10));
    let now = util::afternoon();
    {
        let mut s = open(dir.path()).unwrap();
        let tag = loopside::tag::Tag::new("PT-204", Scale::linear(0.0, 10.0, "bar").unwrap());
        s.add_tag(tag.unwrap()).unwrap();
        s.write_snapshot().unwrap();
        s.save_reference(module()).unwrap();
        s.save_reference(meter()).unwrap();
        let mut later = module();
        later.calibration_due = date(2028, 3, 31);
        s.save_reference(later).unwrap();
    }
    let s = open(dir.path()).unwrap();
    assert!(s.opened_from_snapshot());
    assert_eq!(s.references().len(), 2);
    assert_eq!(
        s.reference("pm-07").unwrap().calibration_due,
        date(2028, 3, 31)
    );
    let bundle = loopside::store::bundle::select(&s, &Default::default(), now);
    assert_eq!(bundle.references.len(), 2);
    drop(s);
    // The store still opens with both after a snapshot is asked for again.
    {
        let mut s = open(dir.path()).unwrap();
        s.write_snapshot().unwrap();
    }
    let reopened = open(dir.path()).unwrap();
    assert!(
        reopened.opened_from_snapshot(),
        "a snapshot is written with references too"
    );
    assert_eq!(reopened.references().len(), 2);
    assert_eq!(
        reopened.reference("PM-07").unwrap().calibration_due,
        date(2028, 3, 31)
    );
    drop(reopened);
    // Importing the bundle twice into another store adds them once.
    let mut other = MemoryStore::new();
    let first = other.import(&bundle).unwrap();
    assert_eq!(first.references_added, 2);
    let second = other.import(&bundle).unwrap();
    assert_eq!(second.references_added, 0);
    assert!(second.reference_conflicts.is_empty());
    assert_eq!(other.references().len(), 2);
    // A different definition here is kept and reported.
    let mut mine = meter();
    mine.description = "Another meter".into();
    let mut third = MemoryStore::new();
    third.save_reference(mine).unwrap();
    let r = third.import(&bundle).unwrap();
    assert_eq!(r.reference_conflicts, vec!["MM-02".to_string()]);
    assert_eq!(
        third.reference("MM-02").unwrap().description,
        "Another meter"
    );
}

#[test]
fn the_command_line_keeps_references_and_a_check_names_them() {
    let dir = TempDir::new("cli-ref");
    let d = dir.arg();
    let pt204 = ["tag", "add", "PT-204", "--range", "0..10", "--unit", "bar"];
    assert!(
        loopside(&[&["--data-dir", d.as_str()][..], &pt204[..]].concat())
            .status
            .success()
    );
    let added = loopside(&[
        "--data-dir",
        &d,
        "ref",
        "add",
        "PM-07",
        "--description",
        "Pressure module 0–20 bar",
        "--unit",
        "bar",
        "--range",
        "0..20",
        "--reading",
        "0,025",
        "--full-scale",
        "0,01",
        "--due",
        "2027-03-31",
    ]);
    assert!(
        added.status.success(),
        "{}",
        String::from_utf8_lossy(&added.stderr)
    );
    assert!(String::from_utf8_lossy(&added.stdout).starts_with("Added reference PM-07."));
    let v = loopside_json(&[
        "--data-dir",
        &d,
        "ref",
        "add",
        "MM-02",
        "--unit",
        "mA",
        "--range",
        "0..24",
        "--reading",
        "0.01",
        "--full-scale",
        "0.01",
        "--due",
        "2027-01-15",
        "--json",
    ]);
    assert_eq!(v["id"], "MM-02");
    let e = loopside_refuses(&[
        "--data-dir",
        &d,
        "ref",
        "add",
        "PM-07",
        "--unit",
        "bar",
        "--range",
        "0..20",
        "--reading",
        "0.1",
        "--due",
        "2027-03-31",
    ]);
    assert!(e.contains("already in the store"), "{e}");
    let e = loopside_refuses(&[
        "--data-dir",
        &d,
        "ref",
        "add",
        "XX-1",
        "--unit",
        "bar",
        "--range",
        "0..20",
        "--due",
        "2027-03-31",
    ]);
    assert!(e.contains("accuracy"), "{e}");
    let e = loopside_refuses(&[
        "--data-dir",
        &d,
        "ref",
        "edit",
        "PM-07",
        "--due",
        "31/03/2028",
    ]);
    assert!(e.contains("due"), "{e}");
    let edited = loopside_json(&[
        "--data-dir",
        &d,
        "ref",
        "edit",
        "pm-07",
        "--due",
        "2028-03-31",
        "--json",
    ]);
    assert_eq!(edited["calibration_due"], "2028-03-31");
    let list = loopside_json(&["--data-dir", &d, "ref", "list", "--json"]);
    assert_eq!(list.as_array().unwrap().len(), 2);
    let show = loopside(&["--data-dir", &d, "ref", "show", "MM-02"]);
    let show = String::from_utf8_lossy(&show.stdout);
    assert!(
        show.contains("MM-02: current 0 – 24 mA, ±(0.01 % of reading + 0.01 % of full scale)"),
        "{show}"
    );

    let v = loopside_json(&[
        "--data-dir",
        &d,
        "check",
        "--tag",
        "PT-204",
        "--device",
        "transmitter",
        "--applied",
        "0,2.5,5,7.5,10,7.5,5,2.5,0",
        "--measured",
        "4,8,12,16,20,16,12,8,4",
        "--reference",
        "PM-07",
        "--reference",
        "mm-02",
        "--decision-rule",
        "guarded",
        "--date",
        "2026-12-01",
        "--json",
    ]);
    let u = &v["uncertainty"];
    assert_eq!(u["rule"], "guarded");
    close(u["min_tur"].as_f64().unwrap(), 9.4809, 1e-4, "smallest TUR");
    assert_eq!(u["decision"], "pass");
    assert_eq!(u["references"][0]["id"], "PM-07");
    let e = loopside_refuses(&[
        "--data-dir",
        &d,
        "check",
        "--tag",
        "PT-204",
        "--device",
        "transmitter",
        "--applied",
        "0,10",
        "--measured",
        "4,20",
        "--reference",
        "NOPE",
    ]);
    assert!(e.contains("no reference instrument 'NOPE'"), "{e}");
}
