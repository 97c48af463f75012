//! Thermocouple checks: ITS-90 reference functions against the NIST Monograph 175 tables,
//! the inverse functions against their published error bands, cold-junction compensation
//! and IEC 60584-1 tolerance classes.

use loopside::thermocouple::{source_mv, temp_c_from_measured, TcClass, TcType};
use proptest::prelude::*;

// The NIST Monograph 175 table values below are quoted from memory; the ones marked
// "inverse range edge" are printed in the NIST ITS-90 coefficient file itself (the EMF
// limits of each inverse polynomial), which was read for this work.

/// NIST Monograph 175 tables give EMF to 0.001 mV; a correct reference function rounds to
/// the printed value, so it lies within half a step of it (a little slack for the step).
const TABLE_MV: f64 = 0.0006;

fn table_check(tc: TcType, rows: &[(f64, f64)]) {
    for &(temp_c, mv) in rows {
        let e = tc.mv_at(temp_c).unwrap();
        assert!(
            (e - mv).abs() <= TABLE_MV,
            "{tc} at {temp_c} °C: {e:.4} mV, table {mv} mV"
        );
    }
}

#[test]
fn type_k_matches_nist_tables() {
    table_check(
        TcType::K,
        &[
            (-270.0, -6.458), // NIST Monograph 175, type K table: −270 °C → −6.458 mV
            (-200.0, -5.891), // NIST Monograph 175, type K table: −200 °C → −5.891 mV
            (-100.0, -3.554), // NIST Monograph 175, type K table: −100 °C → −3.554 mV
            (0.0, 0.000),     // NIST Monograph 175, type K table: 0 °C → 0.000 mV
            (18.0, 0.718),    // NIST Monograph 175, type K table: 18 °C → 0.718 mV
            (25.0, 1.000),    // NIST Monograph 175, type K table: 25 °C → 1.000 mV
            (100.0, 4.096),   // NIST Monograph 175, type K table: 100 °C → 4.096 mV
            (400.0, 16.397),  // NIST Monograph 175, type K table: 400 °C → 16.397 mV
            (500.0, 20.644),  // NIST Monograph 175, type K table: 500 °C → 20.644 mV
            (1000.0, 41.276), // NIST Monograph 175, type K table: 1000 °C → 41.276 mV
            (1372.0, 54.886), // NIST Monograph 175, type K table: 1372 °C → 54.886 mV
        ],
    );
}

#[test]
fn types_j_t_e_n_match_nist_tables() {
    table_check(
        TcType::J,
        &[
            (-210.0, -8.095), // NIST Monograph 175, type J table: −210 °C → −8.095 mV
            (-100.0, -4.633), // NIST Monograph 175, type J table: −100 °C → −4.633 mV
            (100.0, 5.269),   // NIST Monograph 175, type J table: 100 °C → 5.269 mV
            (400.0, 21.848),  // NIST Monograph 175, type J table: 400 °C → 21.848 mV
            (760.0, 42.919),  // NIST Monograph 175, type J table: 760 °C → 42.919 mV
            (1200.0, 69.553), // NIST Monograph 175, type J table: 1200 °C → 69.553 mV
        ],
    );
    table_check(
        TcType::T,
        &[
            (-270.0, -6.258), // NIST Monograph 175, type T table: −270 °C → −6.258 mV
            (-200.0, -5.603), // NIST Monograph 175, type T table: −200 °C → −5.603 mV
            (-100.0, -3.379), // NIST Monograph 175, type T table: −100 °C → −3.379 mV
            (100.0, 4.279),   // NIST Monograph 175, type T table: 100 °C → 4.279 mV
            (200.0, 9.288),   // NIST Monograph 175, type T table: 200 °C → 9.288 mV
            (400.0, 20.872),  // NIST Monograph 175, type T table: 400 °C → 20.872 mV
        ],
    );
    table_check(
        TcType::E,
        &[
            (-270.0, -9.835), // NIST Monograph 175, type E table: −270 °C → −9.835 mV
            (-200.0, -8.825), // NIST Monograph 175, type E table: −200 °C → −8.825 mV
            (100.0, 6.319),   // NIST Monograph 175, type E table: 100 °C → 6.319 mV
            (500.0, 37.005),  // NIST Monograph 175, type E table: 500 °C → 37.005 mV
            (1000.0, 76.373), // NIST Monograph 175, type E table: 1000 °C → 76.373 mV
        ],
    );
    table_check(
        TcType::N,
        &[
            (-270.0, -4.345), // NIST Monograph 175, type N table: −270 °C → −4.345 mV
            (-200.0, -3.990), // NIST Monograph 175, type N table: −200 °C → −3.990 mV
            (100.0, 2.774),   // NIST Monograph 175, type N table: 100 °C → 2.774 mV
            (600.0, 20.613),  // NIST Monograph 175, type N table: 600 °C → 20.613 mV
            (1000.0, 36.256), // NIST Monograph 175, type N table: 1000 °C → 36.256 mV
            (1300.0, 47.513), // NIST Monograph 175, type N table: 1300 °C → 47.513 mV
        ],
    );
}

#[test]
fn noble_metal_types_r_s_b_match_nist_tables() {
    table_check(
        TcType::R,
        &[
            (-50.0, -0.226),  // NIST Monograph 175, type R table: −50 °C → −0.226 mV
            (100.0, 0.647),   // NIST Monograph 175, type R table: 100 °C → 0.647 mV
            (250.0, 1.923),   // NIST ITS-90 database, type R inverse range edge: 250 °C → 1.923 mV
            (1000.0, 10.506), // NIST Monograph 175, type R table: 1000 °C → 10.506 mV
            (1200.0, 13.228), // NIST ITS-90 database, type R inverse range edge: 1200 °C → 13.228 mV
            (1500.0, 17.451), // NIST Monograph 175, type R table: 1500 °C → 17.451 mV
            (1664.5, 19.739), // NIST ITS-90 database, type R inverse range edge: 1664.5 °C → 19.739 mV
            (1768.0, 21.101), // NIST Monograph 175, type R table: 1768 °C → 21.101 mV
        ],
    );
    table_check(
        TcType::S,
        &[
            (-50.0, -0.236),  // NIST Monograph 175, type S table: −50 °C → −0.236 mV
            (100.0, 0.646),   // NIST Monograph 175, type S table: 100 °C → 0.646 mV
            (250.0, 1.874),   // NIST ITS-90 database, type S inverse range edge: 250 °C → 1.874 mV
            (1000.0, 9.587),  // NIST Monograph 175, type S table: 1000 °C → 9.587 mV
            (1500.0, 15.582), // NIST Monograph 175, type S table: 1500 °C → 15.582 mV
            (1664.5, 17.536), // NIST ITS-90 database, type S inverse range edge: 1664.5 °C → 17.536 mV
            (1768.0, 18.693), // NIST Monograph 175, type S table: 1768 °C → 18.693 mV
        ],
    );
    table_check(
        TcType::B,
        &[
            (100.0, 0.033),   // NIST Monograph 175, type B table: 100 °C → 0.033 mV
            (250.0, 0.291),   // NIST ITS-90 database, type B inverse range edge: 250 °C → 0.291 mV
            (600.0, 1.792),   // NIST Monograph 175, type B table: 600 °C → 1.792 mV
            (700.0, 2.431),   // NIST ITS-90 database, type B inverse range edge: 700 °C → 2.431 mV
            (1000.0, 4.834),  // NIST Monograph 175, type B table: 1000 °C → 4.834 mV
            (1820.0, 13.820), // NIST Monograph 175, type B table: 1820 °C → 13.820 mV
        ],
    );
}

#[test]
fn inverse_of_table_values_is_within_the_published_error() {
    // NIST ITS-90 database, type K inverse 0…500 °C: error −0.05…0.04 °C. 16.397 mV is
    // the table value for 400 °C, itself rounded to 0.0005 mV ≈ 0.012 °C.
    let k = TcType::K.inverse_polynomial(16.397).unwrap();
    assert!((k.temp_c - 400.0).abs() <= 0.05 + 0.013, "{}", k.temp_c);
    assert_eq!(k.error_band_c, (-0.05, 0.04));
    // The exact inverse of the reference function for the same value.
    assert!((TcType::K.temp_c_at(16.397).unwrap() - 400.0).abs() <= 0.013);
    // NIST Monograph 175, type J table: 42.919 mV ↔ 760 °C.
    assert!((TcType::J.temp_c_at(42.919).unwrap() - 760.0).abs() <= 0.02);
    // NIST Monograph 175, type T table: −5.603 mV ↔ −200 °C.
    assert!((TcType::T.temp_c_at(-5.603).unwrap() + 200.0).abs() <= 0.02);
    // NIST Monograph 175, type S table: 9.587 mV ↔ 1000 °C.
    assert!((TcType::S.temp_c_at(9.587).unwrap() - 1000.0).abs() <= 0.05);
}

#[test]
fn inverse_polynomials_stay_inside_their_published_error_bands() {
    // NIST ITS-90 database: each inverse polynomial's error range against the reference
    // function (e.g. type E 0…1000 °C: −0.02…0.02 °C). The published bands are rounded,
    // so allow 0.005 °C beyond them.
    for tc in TcType::ALL {
        let (low_mv, high_mv) = tc.mv_range();
        let steps = 2000;
        for i in 0..=steps {
            let mv = low_mv + (high_mv - low_mv) * f64::from(i) / f64::from(steps);
            let Ok(estimate) = tc.inverse_polynomial(mv) else {
                continue;
            };
            let exact = tc.temp_c_at(mv).unwrap();
            let error = estimate.temp_c - exact;
            let (lo, hi) = estimate.error_band_c;
            assert!(
                error >= lo - 0.005 && error <= hi + 0.005,
                "{tc} at {mv:.4} mV: polynomial {:.4} °C, exact {exact:.4} °C",
                estimate.temp_c
            );
        }
    }
}

#[test]
fn inverse_polynomial_refuses_emf_outside_its_published_range() {
    // NIST ITS-90 database: type K inverse covers −5.891…54.886 mV (−200…1372 °C);
    // type B's starts at 0.291 mV (250 °C).
    let e = TcType::K.inverse_polynomial(-6.2).unwrap_err();
    assert_eq!(e.field, "mv");
    assert!(e.reason.contains("\u{2212}5.891…54.886 mV"), "{}", e.reason);
    assert!(TcType::B.inverse_polynomial(0.2).is_err());
    // The exact inverse covers the whole reference function: −6.2 mV on type K is
    // between −270 °C (−6.458 mV) and −200 °C (−5.891 mV).
    let t = TcType::K.temp_c_at(-6.2).unwrap();
    assert!(t > -270.0 && t < -200.0, "{t}");
    assert!((TcType::K.mv_at(t).unwrap() + 6.2).abs() < 1e-9);
}

#[test]
fn cold_junction_worked_example() {
    // Worked by hand from the NIST Monograph 175 type K table: to simulate 400 °C with
    // the transmitter's terminals at 18 °C, source E(400) − E(18) = 16.397 − 0.718
    // = 15.679 mV.
    let mv = source_mv(TcType::K, 400.0, 18.0).unwrap();
    assert!((mv - 15.679).abs() <= 2.0 * TABLE_MV, "{mv}");
    // And back: 15.679 mV measured with the cold junction at 18 °C is 400 °C (within the
    // tables' 0.001 mV rounding, about 0.03 °C on type K here).
    let t = temp_c_from_measured(TcType::K, 15.679, 18.0).unwrap();
    assert!((t - 400.0).abs() <= 0.03, "{t}");
    // The cold junction above the simulated temperature gives a negative EMF to source:
    // NIST type J table, E(0) − E(25) = −1.277 mV.
    let below = source_mv(TcType::J, 0.0, 25.0).unwrap();
    assert!((below + 1.277).abs() <= TABLE_MV);
    // With the cold junction at 0 °C compensation changes nothing.
    assert_eq!(
        source_mv(TcType::T, 150.0, 0.0).unwrap(),
        TcType::T.mv_at(150.0).unwrap()
    );
}

#[test]
fn iec_60584_tolerance_classes() {
    let tol = |tc: TcType, class: TcClass, t: f64| tc.class_tolerance_c(class, t).unwrap();
    // IEC 60584-1:2013 (values from memory, matching the IEC 584-2 column of the published
    // tolerance table at therncway.net "Thermocouple Tolerance and Applicable Standards"):
    // type K class 1 is ±1.5 °C from −40 to 375 °C, then ±0.004·|t| to 1000 °C.
    assert_eq!(tol(TcType::K, TcClass::One, 100.0), 1.5);
    assert!((tol(TcType::K, TcClass::One, 500.0) - 2.0).abs() < 1e-12);
    // Type K class 2: ±2.5 °C to 333 °C, then ±0.0075·|t| to 1200 °C.
    assert!((tol(TcType::K, TcClass::Two, 1000.0) - 7.5).abs() < 1e-12);
    // Type K class 3: ±2.5 °C from −167 to 40 °C, ±0.015·|t| from −200 to −167 °C.
    assert!((tol(TcType::K, TcClass::Three, -200.0) - 3.0).abs() < 1e-12);
    assert_eq!(tol(TcType::K, TcClass::Three, 0.0), 2.5);
    // Type T class 1: ±0.5 °C from −40 to 125 °C, ±0.004·|t| to 350 °C.
    assert_eq!(tol(TcType::T, TcClass::One, 100.0), 0.5);
    assert!((tol(TcType::T, TcClass::One, 300.0) - 1.2).abs() < 1e-12);
    // Type T class 3: ±1 °C from −67 to 40 °C, ±0.015·|t| below −67 °C.
    assert!((tol(TcType::T, TcClass::Three, -100.0) - 1.5).abs() < 1e-12);
    // Types R and S class 1: ±1 °C to 1100 °C, ±[1 + 0.003·(t − 1100)] °C to 1600 °C.
    assert_eq!(tol(TcType::R, TcClass::One, 1000.0), 1.0);
    assert!((tol(TcType::S, TcClass::One, 1200.0) - 1.3).abs() < 1e-12);
    // Type B class 2: ±0.0025·|t| from 600 to 1700 °C; class 3: ±4 °C to 800 °C, then
    // ±0.005·|t|.
    assert!((tol(TcType::B, TcClass::Two, 1000.0) - 2.5).abs() < 1e-12);
    assert_eq!(tol(TcType::B, TcClass::Three, 700.0), 4.0);
    assert!((tol(TcType::B, TcClass::Three, 1000.0) - 5.0).abs() < 1e-12);
    // Classes that do not exist for a type, and temperatures outside a class.
    assert_eq!(
        TcType::B
            .class_tolerance_c(TcClass::One, 1000.0)
            .unwrap_err()
            .field,
        "class"
    );
    assert_eq!(
        TcType::J
            .class_tolerance_c(TcClass::Three, 0.0)
            .unwrap_err()
            .field,
        "class"
    );
    let e = TcType::K
        .class_tolerance_c(TcClass::One, 1100.0)
        .unwrap_err();
    assert_eq!(e.field, "temp_c");
    assert!(e.reason.contains("\u{2212}40…1000 °C"), "{}", e.reason);
    // A type K reading 402 °C at a true 400 °C is inside class 2 (±3.0 °C) but not class 1
    // (±1.6 °C).
    assert!(TcType::K
        .is_within_class(402.0, 400.0, TcClass::Two)
        .unwrap());
    assert!(!TcType::K
        .is_within_class(402.0, 400.0, TcClass::One)
        .unwrap());
}

#[test]
fn bad_input_names_the_field_and_the_range() {
    let e = TcType::K.mv_at(1400.0).unwrap_err();
    assert_eq!(e.field, "temp_c");
    assert_eq!(
        e.to_string(),
        "temp_c: 1400 °C is outside type K's range \u{2212}270…1372 °C"
    );
    let e = TcType::T.temp_c_at(21.0).unwrap_err();
    assert_eq!(e.field, "mv");
    assert!(e.reason.contains("\u{2212}6.258…20.872 mV"), "{}", e.reason);
    assert_eq!(TcType::B.temp_c_at(-0.001).unwrap_err().field, "mv");
    assert_eq!(
        source_mv(TcType::K, 100.0, f64::NAN).unwrap_err().field,
        "cj_temp_c"
    );
    assert_eq!(
        source_mv(TcType::R, 100.0, -60.0).unwrap_err().field,
        "cj_temp_c"
    );
    assert_eq!("Q".parse::<TcType>().unwrap_err().field, "tc_type");
    assert_eq!("type k".parse::<TcType>().unwrap(), TcType::K);
    assert_eq!("4".parse::<TcClass>().unwrap_err().field, "class");
}

proptest! {
    #[test]
    fn temperature_round_trips_through_emf(
        tc in prop::sample::select(TcType::ALL.to_vec()),
        fraction in 0.0f64..=1.0,
    ) {
        let (mut low, high) = tc.temp_range_c();
        if tc == TcType::B {
            // Type B is single-valued only from about 42 °C (E = 0) upwards.
            low = 42.0;
        }
        let t = low + fraction * (high - low);
        let mv = tc.mv_at(t).unwrap();
        let back = tc.temp_c_at(mv).unwrap();
        // Below −200 °C the reference polynomials (up to degree 14) cancel terms of
        // thousands of mV to leave a few mV, so E(t) itself is good to about 1e-12 mV;
        // with the Seebeck coefficient falling toward zero near −270 °C that is worth
        // more than 1e-9 °C. Elsewhere the inverse is held to 1e-9 °C.
        let allowed = if t < -260.0 {
            1e-6
        } else if t < -200.0 {
            1e-8
        } else {
            1e-9
        };
        prop_assert!((back - t).abs() < allowed, "{} {} °C → {} mV → {} °C", tc, t, mv, back);
    }

    #[test]
    fn cold_junction_compensation_round_trips(
        tc in prop::sample::select(vec![TcType::E, TcType::J, TcType::K, TcType::N, TcType::T]),
        t in -150.0f64..400.0,
        cj in -20.0f64..50.0,
    ) {
        let mv = source_mv(tc, t, cj).unwrap();
        let back = temp_c_from_measured(tc, mv, cj).unwrap();
        prop_assert!((back - t).abs() < 1e-8);
    }
}
