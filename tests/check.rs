//! Loop checks: expected values through every transfer, errors, hysteresis, verdicts and
//! the reference instrument's warnings. Tags are from the invented Brindlemoor plant.

mod util;

use chrono::NaiveDate;
use loopside::check::{
    directions_of, Accuracy, CheckResult, CheckWarning, Device, Direction, InputRange, LoopCheck,
    ReferenceInstrument, Stage, DEFAULT_POINTS_PERCENT, LOG_KIND,
};
use loopside::scale::{CharTable, RootLocation, Scale, SignalSpan, TablePoint, Transfer};
use loopside::view::wording::check as words;
use util::close;

fn day(y: i32, m: u32, d: u32) -> NaiveDate {
    NaiveDate::from_ymd_opt(y, m, d).expect("valid date")
}

fn lt101() -> Scale {
    Scale::linear(0.0, 4.5, "m").unwrap()
}

fn ft310(root_in: RootLocation) -> Scale {
    Scale::new(
        0.0,
        3000.0,
        "m³/h",
        Transfer::SquareRoot {
            cutoff_percent: 1.0,
            root_in,
        },
        SignalSpan::default(),
    )
    .unwrap()
}

fn lt605() -> Scale {
    // Invented horizontal-cylinder table for the ferric dosing tank: level m → volume m³.
    let pts = [(0.0, 0.0), (0.5, 2.3), (1.0, 6.0), (1.5, 9.7), (2.0, 12.0)]
        .into_iter()
        .map(|(input, output)| TablePoint { input, output })
        .collect();
    Scale::new(
        0.0,
        2.0,
        "m",
        Transfer::Table(CharTable::new(pts, "m³").unwrap()),
        SignalSpan::default(),
    )
    .unwrap()
}

/// The worked error table: LT-101 transmitter, default points (0/25/50/75/100 % rising
/// then falling — common practice, ISA-51.1 terms). Errors in mA, by hand:
/// +0.008 +0.016 +0.020 +0.012 +0.004 | +0.030 +0.036 +0.024 +0.010,
/// i.e. in % of the 16 mA span: 0.05 0.10 0.125 0.075 0.025 | 0.1875 0.225 0.15 0.0625.
const MEASURED: [f64; 9] = [
    4.008, 8.016, 12.020, 16.012, 20.004, 16.030, 12.036, 8.024, 4.010,
];

fn worked(tolerance: f64) -> CheckResult {
    LoopCheck::new(&lt101(), Device::Transmitter, day(2026, 12, 1))
        .tolerance(tolerance)
        .run_planned(&MEASURED)
        .unwrap()
}

#[test]
fn worked_table_gives_max_error_and_hysteresis() {
    let r = worked(0.25);
    let applied: Vec<f64> = r.points.iter().map(|p| p.applied).collect();
    let want = [0.0, 1.125, 2.25, 3.375, 4.5, 3.375, 2.25, 1.125, 0.0];
    for (a, w) in applied.iter().zip(want) {
        close(*a, w, 1e-12, "applied level");
    }
    let errors = [0.05, 0.10, 0.125, 0.075, 0.025, 0.1875, 0.225, 0.15, 0.0625];
    for (p, e) in r.points.iter().zip(errors) {
        close(p.error_pct, e, 1e-9, "error % of span");
        close(p.error_ma, e / 100.0 * 16.0, 1e-9, "error mA");
        close(p.error_units, e / 100.0 * 4.5, 1e-9, "error m");
    }
    // Largest error: 0.225 % at point 7 (50 %, falling).
    close(r.max_error_pct, 0.225, 1e-9, "max error");
    assert_eq!(r.max_error_index, 6);
    // ISA-51.1 hysteresis: largest rising/falling difference at one input:
    // 75 %: 0.1875 − 0.075 = 0.1125 (50 %: 0.100, 25 %: 0.050, 0 %: 0.0125).
    close(r.hysteresis_pct.unwrap(), 0.1125, 1e-9, "hysteresis");
    close(r.hysteresis_at_percent.unwrap(), 75.0, 1e-9, "where");
    assert!(r.pass);
    assert_eq!(r.output_unit, "mA");
    assert_eq!(r.input_unit, "m");
}

#[test]
fn the_same_table_fails_a_tighter_tolerance_at_the_points_outside() {
    let r = worked(0.2);
    assert!(!r.pass);
    let failed: Vec<usize> = (0..9).filter(|i| !r.points[*i].pass).collect();
    assert_eq!(failed, vec![6], "only 0.225 % exceeds ±0.2 %");
    // A point exactly on the tolerance passes.
    let r = worked(0.225);
    assert!(r.pass);
}

#[test]
fn negative_errors_count_by_magnitude() {
    let r = LoopCheck::new(&lt101(), Device::Transmitter, day(2026, 12, 1))
        .points(vec![0.0, 50.0, 100.0])
        .run_planned(&[3.99, 11.92, 20.0])
        .unwrap();
    close(r.points[1].error_pct, -0.5, 1e-9, "−0.08 mA of 16");
    close(r.max_error_pct, 0.5, 1e-9, "magnitude");
    assert_eq!(r.max_error_index, 1);
    assert!(r.hysteresis_pct.is_none(), "only rising points");
}

#[test]
fn receiver_check_on_square_root_flow() {
    // ISO 5167 relation: 25 % ΔP → 50 % flow; 50 % → 70.71 %; 75 % → 86.60 %.
    let scale = ft310(RootLocation::Receiver);
    let check = LoopCheck::new(&scale, Device::Receiver, day(2026, 12, 1)).tolerance(0.5);
    let plan = check.plan().unwrap();
    let expected: Vec<f64> = plan.iter().map(|p| p.expected).collect();
    let want = [
        0.0,
        1500.0,
        3000.0 * 0.5f64.sqrt(),
        3000.0 * 0.75f64.sqrt(),
        3000.0,
    ];
    for (e, w) in expected.iter().zip(want) {
        close(*e, w, 1e-9, "expected flow");
    }
    close(plan[1].applied, 8.0, 1e-12, "25 % = 8 mA injected");
    let r = check
        .run_planned(&[
            0.0, 1506.0, 2121.0, 2598.0, 3000.0, 2598.0, 2121.0, 1494.0, 0.0,
        ])
        .unwrap();
    // 6 m³/h of a 3000 m³/h span = 0.2 %.
    close(r.points[1].error_pct, 0.2, 1e-9, "error % of flow span");
    close(r.points[7].error_pct, -0.2, 1e-9, "falling");
    close(r.hysteresis_pct.unwrap(), 0.4, 1e-9, "hysteresis at 25 %");
    assert_eq!(r.output_unit, "m³/h");
    assert!(r.pass);
}

#[test]
fn transmitter_check_on_square_root_flow_with_and_without_the_dp_range() {
    let dp = InputRange {
        lrv: 0.0,
        urv: 2500.0,
        unit: "Pa".to_string(),
    };
    let date = day(2026, 12, 1);
    // Root in the receiver: the transmitter is linear in ΔP, 625 Pa (25 %) → 8 mA.
    let rx = LoopCheck::new(&ft310(RootLocation::Receiver), Device::Transmitter, date)
        .input_range(dp.clone());
    let r = rx
        .run(&[0.0, 625.0, 1250.0, 2500.0], &[4.0, 8.0, 12.0, 20.0])
        .unwrap();
    close(r.points[1].expected, 8.0, 1e-9, "linear in ΔP");
    assert_eq!(r.input_unit, "Pa");
    assert!(r.pass);
    // Root in the transmitter: 25 % ΔP → 50 % flow → 12 mA (ISO 5167 relation).
    let tx = LoopCheck::new(&ft310(RootLocation::Transmitter), Device::Transmitter, date)
        .input_range(dp);
    let r = tx.run(&[625.0], &[12.0]);
    assert_eq!(r.unwrap_err().field, "points", "one point is not a check");
    let r = tx.run(&[0.0, 625.0, 2500.0], &[4.0, 12.0, 20.0]).unwrap();
    close(r.points[1].expected, 12.0, 1e-9, "root in transmitter");
    // Without a ΔP range the applied values are flows: 1500 m³/h is 25 % ΔP → 8 mA when
    // the receiver takes the root.
    let plain = LoopCheck::new(&ft310(RootLocation::Receiver), Device::Transmitter, date);
    let plan = plain.plan().unwrap();
    close(plan[1].applied, 1500.0, 1e-9, "25 % ΔP as flow");
    close(plan[1].expected, 8.0, 1e-9, "8 mA");
    let r = plain
        .run(&[0.0, 1500.0, 3000.0], &[4.0, 8.0, 20.0])
        .unwrap();
    close(r.points[1].percent, 25.0, 1e-9, "points are % of ΔP");
    assert!(r.pass);
}

#[test]
fn table_transfer_only_changes_what_the_receiver_shows() {
    let date = day(2026, 12, 1);
    // Transmitter: linear in level. 0.5 m of 2.0 m → 8 mA.
    let t = LoopCheck::new(&lt605(), Device::Transmitter, date)
        .run(&[0.0, 0.5, 2.0], &[4.0, 8.0, 20.0])
        .unwrap();
    close(t.points[1].expected, 8.0, 1e-12, "level → mA");
    // Receiver: 8 mA → 0.5 m → 2.3 m³ from the table; 10 mA → 0.75 m → 4.15 m³.
    let r = LoopCheck::new(&lt605(), Device::Receiver, date)
        .run(&[4.0, 8.0, 10.0, 20.0], &[0.0, 2.3, 4.2, 12.0])
        .unwrap();
    close(r.points[1].expected, 2.3, 1e-12, "table point");
    close(r.points[2].expected, 4.15, 1e-12, "interpolated");
    // 0.05 m³ of a 12 m³ span.
    close(
        r.points[2].error_pct,
        0.05 / 12.0 * 100.0,
        1e-9,
        "error % of volume span",
    );
    assert_eq!(r.output_unit, "m³");
}

#[test]
fn reversed_range_plans_from_the_lrv() {
    // PDT-707: 4 mA at 250 mbar, 20 mA at 0 mbar (reversed output).
    let scale = Scale::linear(250.0, 0.0, "mbar").unwrap();
    let check = LoopCheck::new(&scale, Device::Transmitter, day(2026, 12, 1));
    let plan = check.plan().unwrap();
    close(plan[0].applied, 250.0, 1e-12, "0 % at LRV");
    close(plan[1].applied, 187.5, 1e-12, "25 %");
    close(plan[4].expected, 20.0, 1e-12, "100 %");
    let r = check
        .run(
            &[250.0, 125.0, 0.0, 125.0, 250.0],
            &[4.0, 12.08, 20.0, 12.0, 4.0],
        )
        .unwrap();
    close(r.points[1].error_pct, 0.5, 1e-9, "+0.08 mA of 16");
    close(r.points[1].error_units, 1.25, 1e-9, "0.5 % of 250 mbar");
    assert_eq!(
        r.points.iter().map(|p| p.direction).collect::<Vec<_>>(),
        vec![
            Direction::Rising,
            Direction::Rising,
            Direction::Rising,
            Direction::Falling,
            Direction::Falling
        ]
    );
    close(r.hysteresis_pct.unwrap(), 0.5, 1e-9, "at 50 %");
}

#[test]
fn default_points_are_five_rising_then_falling() {
    assert_eq!(
        DEFAULT_POINTS_PERCENT,
        [0.0, 25.0, 50.0, 75.0, 100.0, 75.0, 50.0, 25.0, 0.0]
    );
    let d = directions_of(&DEFAULT_POINTS_PERCENT);
    assert_eq!(d[4], Direction::Rising);
    assert_eq!(d[5], Direction::Falling);
    assert_eq!(d[8], Direction::Falling);
}

fn reference(accuracy: Accuracy, due: NaiveDate) -> ReferenceInstrument {
    ReferenceInstrument {
        id: "BWR-CAL-07".to_string(),
        accuracy,
        calibration_due: due,
    }
}

fn with_reference(tolerance: f64, r: ReferenceInstrument, date: NaiveDate) -> CheckResult {
    LoopCheck::new(&lt101(), Device::Transmitter, date)
        .tolerance(tolerance)
        .reference(r)
        .run_planned(&[4.0, 8.0, 12.0, 16.0, 20.0, 16.0, 12.0, 8.0, 4.0])
        .unwrap()
}

#[test]
fn test_uncertainty_ratio_below_four_to_one_warns() {
    // Common practice: TUR = tolerance / reference accuracy ≥ 4:1.
    let date = day(2026, 12, 1);
    let due = day(2027, 6, 1);
    let r = with_reference(0.5, reference(Accuracy::PercentOfSpan(0.2), due), date);
    close(r.tur.unwrap(), 2.5, 1e-9, "0.5 / 0.2");
    assert!(matches!(
        r.warnings.as_slice(),
        [CheckWarning::LowTur { .. }]
    ));
    assert!(words::warning(&r.warnings[0]).contains("2.5:1"));
    // Exactly 4:1 is enough.
    let r = with_reference(0.5, reference(Accuracy::PercentOfSpan(0.125), due), date);
    close(r.tur.unwrap(), 4.0, 1e-9, "0.5 / 0.125");
    assert!(r.warnings.is_empty());
    // Accuracy in mA: 0.016 mA of a 16 mA span is 0.1 % → 5:1.
    let r = with_reference(0.5, reference(Accuracy::Ma(0.016), due), date);
    close(r.tur.unwrap(), 5.0, 1e-9, "mA accuracy");
    // Accuracy in the range unit: 0.009 m of 4.5 m is 0.2 % → 2.5:1.
    let r = with_reference(0.5, reference(Accuracy::Units(0.009), due), date);
    close(r.tur.unwrap(), 2.5, 1e-9, "unit accuracy");
}

#[test]
fn reference_past_due_on_the_check_date_warns() {
    let acc = Accuracy::PercentOfSpan(0.02);
    let r = with_reference(0.5, reference(acc, day(2026, 11, 30)), day(2026, 12, 1));
    match r.warnings.as_slice() {
        [CheckWarning::ReferencePastDue { days_over, .. }] => assert_eq!(*days_over, 1),
        other => panic!("expected one past-due warning, got {other:?}"),
    }
    // Due on the day of the check: still in date.
    let r = with_reference(0.5, reference(acc, day(2026, 12, 1)), day(2026, 12, 1));
    assert!(r.warnings.is_empty());
    assert!(words::markdown(&r).contains("BWR-CAL-07"));
}

#[test]
fn bad_input_names_the_field_and_never_panics() {
    let check = LoopCheck::new(&lt101(), Device::Transmitter, day(2026, 12, 1));
    let e = check.run(&[0.0, 2.25], &[4.0]).unwrap_err();
    assert_eq!(e.field, "measured");
    assert!(e.reason.contains("1 value"), "{e}");
    let e = check.run(&[0.0, 9.0], &[4.0, 20.0]).unwrap_err();
    assert_eq!(e.field, "applied[2]");
    // The limits are quoted as messages quote numbers, a negative with the minus sign.
    assert!(e.reason.contains("\u{2212}25 to 125 %"), "{e}");
    let e = check.run(&[0.0, f64::NAN], &[4.0, 20.0]).unwrap_err();
    assert_eq!(e.field, "applied[2]");
    let e = check.run(&[0.0, 4.5], &[4.0, f64::INFINITY]).unwrap_err();
    assert_eq!(e.field, "measured[2]");
    let e = check
        .clone()
        .tolerance(0.0)
        .run_planned(&MEASURED)
        .unwrap_err();
    assert_eq!(e.field, "tolerance");
    let e = check.clone().points(vec![0.0]).plan().unwrap_err();
    assert_eq!(e.field, "points");
    let e = check.clone().points(vec![0.0, 300.0]).plan().unwrap_err();
    assert_eq!(e.field, "points[2]");
    let e = check
        .clone()
        .reference(reference(Accuracy::Ma(0.0), day(2027, 1, 1)))
        .plan()
        .unwrap_err();
    assert_eq!(e.field, "reference accuracy");
    // Square-root flow has no values below zero flow.
    let e = LoopCheck::new(
        &ft310(RootLocation::Receiver),
        Device::Transmitter,
        day(2026, 12, 1),
    )
    .run(&[-10.0, 3000.0], &[4.0, 20.0])
    .unwrap_err();
    assert_eq!(e.field, "applied[1]");
}

#[test]
fn result_is_a_log_payload_and_a_markdown_table() {
    assert_eq!(LOG_KIND, "loop-check");
    let r = LoopCheck::new(&lt101(), Device::Transmitter, day(2026, 12, 1))
        .tag_number("LT-101")
        .stage(Stage::AsLeft)
        .adjusted(true)
        .note("zero trimmed | span checked")
        .run_planned(&MEASURED)
        .unwrap();
    let json = serde_json::to_value(&r).unwrap();
    for key in [
        "points",
        "max_error_pct",
        "hysteresis_pct",
        "pass",
        "stage",
        "adjusted",
    ] {
        assert!(!json[key].is_null(), "key {key}");
    }
    for key in [
        "applied",
        "expected",
        "measured",
        "error_pct",
        "pass",
        "direction",
    ] {
        assert!(!json["points"][0][key].is_null(), "point key {key}");
    }
    assert_eq!(json["stage"], "as-left");
    let back: CheckResult = serde_json::from_value(json).unwrap();
    assert_eq!(back.points.len(), r.points.len());
    assert_eq!(
        (back.pass, back.stage, back.date),
        (r.pass, r.stage, r.date)
    );
    close(
        back.max_error_pct,
        r.max_error_pct,
        1e-12,
        "max error read back",
    );
    close(back.points[6].measured, 12.036, 1e-12, "measured read back");

    let md = words::markdown(&r);
    assert!(
        md.contains("### LT-101 — transmitter check, as left (2026-12-01)"),
        "{md}"
    );
    assert!(
        md.contains("| # | direction | applied | expected | measured |"),
        "{md}"
    );
    assert_eq!(
        md.lines().filter(|l| l.starts_with("| ")).count(),
        10,
        "{md}"
    );
    assert!(
        md.contains(
            "| 7 | falling | 2.2500 m | 12.000 mA | 12.036 mA | +0.036 mA | +0.22 % | pass |"
        ),
        "{md}"
    );
    assert!(md.contains("PASS"), "{md}");
    assert!(md.contains("Adjustment made"), "{md}");
    assert!(
        md.contains("zero trimmed \\| span checked"),
        "pipes escaped: {md}"
    );
}
