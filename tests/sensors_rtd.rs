//! RTD checks: the Callendar–Van Dusen equation against IEC 60751 table values, the
//! inverse, tolerance classes, 2-wire lead error and refusals of bad input.

use loopside::rtd::{ElementBuild, Rtd, RtdClass, RtdKind, Wiring};
use loopside::wire::Conductor;
use proptest::prelude::*;

fn close(actual: f64, expected: f64, tolerance: f64) -> bool {
    (actual - expected).abs() <= tolerance
}

#[test]
fn pt100_matches_the_standard_table() {
    let pt100 = Rtd::pt100();
    // IEC 60751:2008 reference table for Pt100 (the table number, "Table 1", and the
    // values are from memory) gives 0.01 Ω; the 3-decimal values are the same table as
    // commonly published to 0.001 Ω (from memory), which the issue asks to meet within
    // 0.001 Ω. The 0.01 Ω values are also re-derived by hand in
    // `equation_values_worked_by_hand`.
    let table = [
        (-200.0, 18.520), // IEC 60751:2008 Table 1: −200 °C → 18.52 Ω
        (-100.0, 60.256), // IEC 60751:2008 Table 1: −100 °C → 60.26 Ω
        (0.0, 100.000),   // IEC 60751:2008 Table 1: 0 °C → 100.00 Ω
        (100.0, 138.506), // IEC 60751:2008 Table 1: 100 °C → 138.51 Ω
        (200.0, 175.856), // IEC 60751:2008 Table 1: 200 °C → 175.86 Ω
        (500.0, 280.978), // IEC 60751:2008 Table 1: 500 °C → 280.98 Ω
        (850.0, 390.481), // IEC 60751:2008 Table 1: 850 °C → 390.48 Ω
    ];
    for (temp_c, ohms) in table {
        let r = pt100.ohms_at(temp_c).unwrap();
        assert!(close(r, ohms, 0.001), "{temp_c} °C: {r} Ω, table {ohms} Ω");
    }
}

#[test]
fn equation_values_worked_by_hand() {
    let pt100 = Rtd::pt100();
    // Worked by hand from the IEC 60751 equation and coefficients:
    // 100 °C: 100·(1 + 0.39083 − 0.005775) = 138.5055 Ω
    assert!(close(pt100.ohms_at(100.0).unwrap(), 138.5055, 1e-9));
    // 500 °C: 100·(1 + 1.95415 − 0.144375) = 280.9775 Ω
    assert!(close(pt100.ohms_at(500.0).unwrap(), 280.9775, 1e-9));
    // −100 °C: 100·(1 − 0.39083 − 0.005775 − 4.183e-12·(−200)·(−1e6)) = 60.25584 Ω
    assert!(close(pt100.ohms_at(-100.0).unwrap(), 60.25584, 1e-9));
    // Slope at 0 °C is R0·A = 0.39083 Ω/°C (IEC 60751 coefficient A).
    assert!(close(pt100.slope_ohms_per_c(0.0).unwrap(), 0.39083, 1e-12));
}

#[test]
fn pt500_pt1000_and_custom_scale_with_r0() {
    // IEC 60751:2008: the Pt1000 table is the Pt100 table × 10; 100 °C → 1385.055 Ω.
    let pt1000 = Rtd::standard(RtdKind::Pt1000);
    assert!(close(pt1000.ohms_at(100.0).unwrap(), 1385.055, 1e-6));
    // Pt500 = Pt100 × 5: 100 °C → 692.5275 Ω (same equation, worked by hand).
    let pt500 = Rtd::standard(RtdKind::Pt500);
    assert!(close(pt500.ohms_at(100.0).unwrap(), 692.5275, 1e-6));
    let odd = Rtd::custom(100.04).unwrap();
    assert!(close(odd.ohms_at(0.0).unwrap(), 100.04, 1e-12));
    assert!(close(odd.ohms_at(100.0).unwrap(), 138.5055 * 1.0004, 1e-9));
    assert_eq!("PT-1000".parse::<RtdKind>().unwrap(), RtdKind::Pt1000);
}

#[test]
fn resistance_to_temperature_both_sides_of_zero() {
    let pt100 = Rtd::pt100();
    // IEC 60751 equation (closed form above 0 °C): 138.5055 Ω → 100 °C.
    assert!(close(pt100.temp_c_at(138.5055).unwrap(), 100.0, 1e-9));
    // IEC 60751 equation (iterated below 0 °C): 60.25584 Ω → −100 °C.
    assert!(close(pt100.temp_c_at(60.25584).unwrap(), -100.0, 1e-9));
    // IEC 60751:2008 Table 1 at 0.01 Ω: 18.52 Ω ↔ −200 °C within a table step
    // (0.01 Ω ≈ 0.05 °C at −200 °C).
    assert!(close(pt100.temp_c_at(18.52).unwrap(), -200.0, 0.01));
    assert!(close(pt100.temp_c_at(100.0).unwrap(), 0.0, 1e-12));
}

#[test]
fn tolerance_classes_follow_iec_60751() {
    // IEC 60751:2008 Table 3: class A ±(0.15 + 0.002|t|): at 100 °C, ±0.35 °C.
    let a = RtdClass::A
        .tolerance_c(100.0, ElementBuild::WireWound)
        .unwrap();
    assert!(close(a, 0.35, 1e-12));
    // Class B ±(0.3 + 0.005|t|): at −196 °C, ±1.28 °C.
    let b = RtdClass::B
        .tolerance_c(-196.0, ElementBuild::WireWound)
        .unwrap();
    assert!(close(b, 1.28, 1e-12));
    // Class AA ±(0.1 + 0.0017|t|): at 250 °C, ±0.525 °C.
    let aa = RtdClass::AA
        .tolerance_c(250.0, ElementBuild::WireWound)
        .unwrap();
    assert!(close(aa, 0.525, 1e-12));
    // Class C ±(0.6 + 0.01|t|): at 600 °C, ±6.6 °C.
    let c = RtdClass::C
        .tolerance_c(600.0, ElementBuild::WireWound)
        .unwrap();
    assert!(close(c, 6.6, 1e-12));
    // Validity ranges, IEC 60751:2008 Table 3 (from memory): wire-wound A −100…450 °C;
    // thin-film A −30…300 °C; thin-film AA 0…150 °C. The wire-wound ranges are the ones
    // the issue quotes.
    assert!(RtdClass::A
        .tolerance_c(450.0, ElementBuild::WireWound)
        .is_ok());
    assert!(RtdClass::A
        .tolerance_c(460.0, ElementBuild::WireWound)
        .is_err());
    assert!(RtdClass::A
        .tolerance_c(-50.0, ElementBuild::ThinFilm)
        .is_err());
    assert!(RtdClass::AA
        .tolerance_c(-10.0, ElementBuild::ThinFilm)
        .is_err());
    let e = RtdClass::B
        .tolerance_c(650.0, ElementBuild::WireWound)
        .unwrap_err();
    assert_eq!(e.field, "true_temp_c");
    assert!(e.reason.contains("\u{2212}196…600"), "{}", e.reason);
}

#[test]
fn is_within_class_reads_the_element_against_the_class() {
    let pt100 = Rtd::pt100();
    // At 100 °C the slope is 0.37928 Ω/°C (IEC 60751 equation); 138.60 Ω reads about
    // 0.25 °C high, inside class A (±0.35 °C); 138.70 Ω reads about 0.51 °C high, outside
    // class A but inside class B (±0.8 °C).
    assert!(pt100.is_within_class(138.60, 100.0, RtdClass::A).unwrap());
    assert!(!pt100.is_within_class(138.70, 100.0, RtdClass::A).unwrap());
    assert!(pt100.is_within_class(138.70, 100.0, RtdClass::B).unwrap());
    let check = pt100
        .check_class(138.70, 100.0, RtdClass::B, ElementBuild::WireWound)
        .unwrap();
    assert!(close(check.deviation_c, 0.5128, 0.001));
    assert!(close(check.tolerance_c, 0.8, 1e-12));
    // Below zero the deviation is read with the C term: 60.25584 Ω is exactly −100 °C.
    assert!(pt100
        .is_within_class(60.25584, -100.0, RtdClass::AA)
        .is_err());
    assert!(pt100
        .is_within_class(60.25584, -100.0, RtdClass::A)
        .unwrap());
}

#[test]
fn two_wire_lead_error_uses_the_local_slope() {
    let pt100 = Rtd::pt100();
    // 1 Ω of loop lead resistance on a 2-wire Pt100 at 0 °C: 1 / 0.39083 = 2.5586 °C
    // ("about 2.5 °C per ohm" is common practice for Pt100).
    let two = pt100.lead_error(Wiring::TwoWire, 1.0, 0.0).unwrap();
    assert!(close(two.error_ohms, 1.0, 1e-12));
    assert!(close(two.error_c, 2.5586, 1e-4));
    // At 200 °C the slope is 100·(A + 2B·200) = 0.36773 Ω/°C, so the same lead is 2.7194 °C.
    let hot = pt100.lead_error(Wiring::TwoWire, 1.0, 200.0).unwrap();
    assert!(close(hot.error_c, 1.0 / 0.36773, 1e-4));
    // A Pt1000 suffers ten times less for the same cable.
    let pt1000 = Rtd::standard(RtdKind::Pt1000);
    let small = pt1000.lead_error(Wiring::TwoWire, 1.0, 0.0).unwrap();
    assert!(close(small.error_c, 0.25586, 1e-5));
    // 3- and 4-wire compensate; the 3-wire note states the equal-leads assumption.
    let three = pt100.lead_error(Wiring::ThreeWire, 1.0, 0.0).unwrap();
    assert_eq!(three.error_c, 0.0);
    assert!(three.note.contains("equal"));
    let four = pt100.lead_error(Wiring::FourWire, 1.0, 0.0).unwrap();
    assert_eq!(four.error_ohms, 0.0);
    assert_eq!(Wiring::from_count(3).unwrap(), Wiring::ThreeWire);
    assert_eq!(Wiring::from_count(5).unwrap_err().field, "wires");
}

#[test]
fn lead_error_from_a_cable_run() {
    // 100 m of 0.5 mm² copper at 20 °C: 2 × 100 m × (1/58 Ω·mm²/m) / 0.5 mm² = 6.8966 Ω
    // loop (IEC 60028 resistivity), which on a 2-wire Pt100 at 0 °C is
    // 6.8966 / 0.39083 = 17.646 °C — why 2-wire Pt100s are kept to short runs
    // (common practice).
    let pt100 = Rtd::pt100();
    let conductor = Conductor::mm2(0.5).unwrap();
    let err = pt100
        .lead_error_for_cable(Wiring::TwoWire, &conductor, 100.0, 20.0, 0.0)
        .unwrap();
    assert!(close(err.lead_ohms, 200.0 / 58.0 / 0.5, 1e-9));
    assert!(close(err.error_c, 200.0 / 58.0 / 0.5 / 0.39083, 1e-9));
    let e = pt100
        .lead_error_for_cable(Wiring::TwoWire, &conductor, 100.0, 400.0, 0.0)
        .unwrap_err();
    assert_eq!(e.field, "cable_temp_c");
}

#[test]
fn bad_input_names_the_field_and_the_range() {
    let pt100 = Rtd::pt100();
    let e = pt100.ohms_at(900.0).unwrap_err();
    assert_eq!(e.field, "temp_c");
    assert!(e.to_string().contains("\u{2212}200…850 °C"), "{e}");
    let e = pt100.ohms_at(f64::NAN).unwrap_err();
    assert_eq!(e.field, "temp_c");
    let e = pt100.temp_c_at(10.0).unwrap_err();
    assert_eq!(e.field, "ohms");
    assert!(e.reason.contains("18.520…390.481 Ω"), "{}", e.reason);
    assert_eq!(Rtd::custom(-5.0).unwrap_err().field, "r0_ohms");
    assert_eq!(Rtd::custom(0.0).unwrap_err().field, "r0_ohms");
    assert_eq!(
        pt100
            .lead_error(Wiring::TwoWire, -1.0, 0.0)
            .unwrap_err()
            .field,
        "lead_ohms"
    );
    assert_eq!("pt99".parse::<RtdKind>().unwrap_err().field, "rtd_type");
    assert_eq!("D".parse::<RtdClass>().unwrap_err().field, "class");
}

proptest! {
    #[test]
    fn temperature_round_trips_through_resistance(
        temp_c in -200.0f64..=850.0,
        r0 in prop::sample::select(vec![100.0, 500.0, 1000.0, 99.96, 200.0]),
    ) {
        let rtd = Rtd::custom(r0).unwrap();
        let ohms = rtd.ohms_at(temp_c).unwrap();
        let back = rtd.temp_c_at(ohms).unwrap();
        prop_assert!((back - temp_c).abs() < 1e-9, "{} °C → {} Ω → {} °C", temp_c, ohms, back);
    }

    #[test]
    fn resistance_round_trips_through_temperature(fraction in 0.0f64..=1.0) {
        let rtd = Rtd::standard(RtdKind::Pt1000);
        let (low, high) = rtd.ohms_range();
        let ohms = low + fraction * (high - low);
        let back = rtd.ohms_at(rtd.temp_c_at(ohms).unwrap()).unwrap();
        prop_assert!((back - ohms).abs() < 1e-9 * high);
    }

    #[test]
    fn resistance_rises_with_temperature(a in -200.0f64..850.0, step in 0.001f64..50.0) {
        let pt100 = Rtd::pt100();
        let b = (a + step).min(850.0);
        prop_assume!(b > a);
        prop_assert!(pt100.ohms_at(b).unwrap() > pt100.ohms_at(a).unwrap());
    }
}
