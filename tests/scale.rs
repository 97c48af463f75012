//! Range scaling worked the way a technician would check it by hand.

mod util;

use loopside::scale::{CharTable, RootLocation, Scale, SignalSpan, TablePoint, Transfer, ZeroKind};
use proptest::prelude::*;
use util::close;

fn sqrt_scale(lrv: f64, urv: f64, cutoff: f64, root_in: RootLocation) -> Scale {
    Scale::new(
        lrv,
        urv,
        "m³/h",
        Transfer::SquareRoot {
            cutoff_percent: cutoff,
            root_in,
        },
        SignalSpan::default(),
    )
    .unwrap()
}

#[test]
fn isa_worked_example_150_psig_on_50_to_250_is_12_ma() {
    // ISA blog, "Linear relationships for 4–20 mA transmitters": 50–250 psig, 150 psig → 12.0 mA.
    let s = Scale::linear(50.0, 250.0, "psi").unwrap();
    close(s.from_value(150.0).unwrap().ma, 12.0, 1e-12, "mA");
    close(s.from_ma(12.0).unwrap().value, 150.0, 1e-12, "psig");
}

#[test]
fn kuphaldt_34_7_percent_is_9_552_ma() {
    // T. Kuphaldt, Lessons in Industrial Instrumentation, §13.2 (CC BY): 34.7 % → 9.552 mA.
    let s = Scale::linear(0.0, 100.0, "%").unwrap();
    close(s.from_percent(34.7).unwrap().ma, 9.552, 1e-12, "mA");
}

#[test]
fn inlet_wet_well_level_at_three_readings() {
    // Demo plant LT-101, 0–4.5 m: worked by hand (value = LRV + (mA − 4)/16 × span).
    let s = Scale::linear(0.0, 4.5, "m").unwrap();
    close(s.from_ma(4.0).unwrap().value, 0.0, 1e-12, "4 mA");
    close(s.from_ma(8.0).unwrap().value, 1.125, 1e-12, "8 mA");
    close(s.from_ma(20.0).unwrap().value, 4.5, 1e-12, "20 mA");
    close(
        s.from_volts(3.0, 250.0).unwrap().value,
        2.25,
        1e-12,
        "3 V across 250 Ω",
    );
}

#[test]
fn reversed_range_gives_20_ma_at_lrv_end() {
    // PDT-707 style: 250..0 mbar, so 4 mA at 250 mbar and 20 mA at 0 mbar.
    let s = Scale::linear(250.0, 0.0, "mbar").unwrap();
    assert!(s.is_reversed());
    close(s.from_value(0.0).unwrap().ma, 20.0, 1e-12, "0 mbar");
    close(s.from_value(62.5).unwrap().ma, 16.0, 1e-12, "62.5 mbar");
    close(s.from_ma(12.0).unwrap().value, 125.0, 1e-12, "12 mA");
}

#[test]
fn elevated_and_suppressed_zero() {
    // ISA-51.1 terms: −25…100 is elevated zero, 20…100 suppressed zero.
    let elevated = Scale::linear(-25.0, 100.0, "kPa").unwrap();
    assert_eq!(elevated.zero_kind(), ZeroKind::Elevated);
    close(elevated.from_value(0.0).unwrap().ma, 7.2, 1e-12, "0 kPa");
    let suppressed = Scale::linear(20.0, 100.0, "kPa").unwrap();
    assert_eq!(suppressed.zero_kind(), ZeroKind::Suppressed);
    close(
        suppressed.from_value(60.0).unwrap().ma,
        12.0,
        1e-12,
        "60 kPa",
    );
}

#[test]
fn square_root_flow_follows_iso_5167() {
    // ISO 5167 relation Q/Qmax = √(ΔP/ΔPmax): 25 % → 50 %, 1 % → 10 %, 4 % → 20 %.
    let s = sqrt_scale(0.0, 3000.0, 0.0, RootLocation::Receiver);
    close(s.from_percent(25.0).unwrap().value, 1500.0, 1e-9, "25 % DP");
    close(s.from_percent(1.0).unwrap().value, 300.0, 1e-9, "1 % DP");
    close(s.from_percent(4.0).unwrap().value, 600.0, 1e-9, "4 % DP");
    close(
        s.from_value(1500.0).unwrap().ma,
        8.0,
        1e-9,
        "50 % flow → 25 % DP → 8 mA",
    );
}

#[test]
fn root_in_transmitter_makes_current_linear_in_flow() {
    let s = sqrt_scale(0.0, 3000.0, 0.0, RootLocation::Transmitter);
    let r = s.from_ma(12.0).unwrap();
    close(r.value, 1500.0, 1e-9, "flow");
    close(r.dp_percent.unwrap(), 25.0, 1e-9, "DP behind 50 % flow");
}

#[test]
fn low_flow_cutoff_reads_zero() {
    // FT-310: 1 % cutoff in the receiver. 0.005 % DP is 0.707 % flow: below the cutoff.
    let s = sqrt_scale(0.0, 3000.0, 1.0, RootLocation::Receiver);
    let r = s.from_percent(0.005).unwrap();
    assert!(r.cutoff_active);
    assert_eq!(r.value, 0.0);
    let above = s.from_percent(0.02).unwrap(); // 1.414 % flow
    assert!(!above.cutoff_active);
    close(
        above.value,
        3000.0 * 0.02f64.sqrt() / 10.0,
        1e-9,
        "just above cutoff",
    );
}

#[test]
fn square_root_refuses_values_beyond_zero_flow() {
    let s = sqrt_scale(0.0, 3000.0, 0.0, RootLocation::Receiver);
    assert_eq!(s.from_value(-10.0).unwrap_err().field, "value");
}

fn ferric_tank() -> Scale {
    // LT-605 demo table: level 0–2.0 m in a horizontal cylinder → 0–12 m³ (demo numbers).
    let pts = [
        (0.0, 0.0),
        (0.25, 0.84),
        (0.5, 2.3),
        (1.0, 6.0),
        (1.5, 9.7),
        (1.75, 11.16),
        (2.0, 12.0),
    ]
    .iter()
    .map(|&(input, output)| TablePoint { input, output })
    .collect();
    let table = CharTable::new(pts, "m³").unwrap();
    Scale::new(0.0, 2.0, "m", Transfer::Table(table), SignalSpan::default()).unwrap()
}

#[test]
fn table_turns_level_into_volume_and_back() {
    let s = ferric_tank();
    let half = s.from_ma(12.0).unwrap();
    close(half.measured.unwrap(), 1.0, 1e-12, "level at 12 mA");
    close(half.value, 6.0, 1e-12, "volume at 12 mA");
    assert_eq!(half.unit, "m³");
    // Between points: 0.375 m is halfway from 0.84 to 2.3 m³.
    close(
        s.from_value(1.57).unwrap().measured.unwrap(),
        0.375,
        1e-12,
        "level for 1.57 m³",
    );
}

#[test]
fn table_validation_names_the_problem() {
    let one = vec![TablePoint {
        input: 0.0,
        output: 0.0,
    }];
    assert_eq!(CharTable::new(one, "m³").unwrap_err().field, "table");
    let flat = vec![
        TablePoint {
            input: 0.0,
            output: 0.0,
        },
        TablePoint {
            input: 1.0,
            output: 5.0,
        },
        TablePoint {
            input: 2.0,
            output: 5.0,
        },
    ];
    assert!(CharTable::new(flat, "m³")
        .unwrap_err()
        .reason
        .contains("point 3"));
    let many: Vec<_> = (0..33)
        .map(|i| TablePoint {
            input: i as f64,
            output: i as f64,
        })
        .collect();
    assert!(CharTable::new(many, "m³").is_err());
}

#[test]
fn custom_signal_span_0_to_20() {
    let s = Scale::new(
        0.0,
        100.0,
        "%",
        Transfer::Linear,
        SignalSpan::new(0.0, 20.0).unwrap(),
    )
    .unwrap();
    close(
        s.from_ma(5.0).unwrap().percent,
        25.0,
        1e-12,
        "5 mA on 0–20 mA",
    );
    assert!(SignalSpan::new(20.0, 4.0).is_err());
}

#[test]
fn bad_ranges_and_readings_are_refused() {
    assert!(Scale::linear(f64::NAN, 1.0, "bar").is_err());
    assert!(Scale::linear(0.0, f64::INFINITY, "bar").is_err());
    let s = Scale::linear(0.0, 10.0, "bar").unwrap();
    assert_eq!(s.from_ma(f64::NAN).unwrap_err().field, "mA");
    assert_eq!(s.from_volts(1.0, 0.0).unwrap_err().field, "ohms");
    let cut = Scale::new(
        0.0,
        1.0,
        "m³/h",
        Transfer::SquareRoot {
            cutoff_percent: 120.0,
            root_in: RootLocation::Receiver,
        },
        SignalSpan::default(),
    );
    assert_eq!(cut.unwrap_err().field, "cutoff");
}

proptest! {
    // Round trips mA → value → mA within 1e-9 of span, for every transfer.
    #[test]
    fn linear_round_trip(lrv in -1e4f64..1e4, span in prop_oneof![-1e4f64..-1e-3, 1e-3f64..1e4], ma in 3.0f64..21.0) {
        let s = Scale::linear(lrv, lrv + span, "u").unwrap();
        let v = s.from_ma(ma).unwrap().value;
        let back = s.from_value(v).unwrap().ma;
        prop_assert!((back - ma).abs() <= 1e-9 * 16.0, "{ma} → {v} → {back}");
    }

    #[test]
    fn sqrt_round_trip(urv in 1.0f64..1e5, ma in 4.0f64..21.0, receiver in any::<bool>()) {
        let root_in = if receiver { RootLocation::Receiver } else { RootLocation::Transmitter };
        let s = sqrt_scale(0.0, urv, 0.0, root_in);
        let v = s.from_ma(ma).unwrap().value;
        let back = s.from_value(v).unwrap().ma;
        prop_assert!((back - ma).abs() <= 1e-9 * 16.0, "{ma} → {v} → {back}");
    }

    #[test]
    fn table_round_trip(ma in 2.0f64..22.0) {
        let s = ferric_tank();
        let v = s.from_ma(ma).unwrap().value;
        let back = s.from_value(v).unwrap().ma;
        prop_assert!((back - ma).abs() <= 1e-9 * 16.0, "{ma} → {v} → {back}");
    }

    #[test]
    fn percent_and_ma_agree(p in -25.0f64..125.0) {
        let s = Scale::linear(0.0, 10.0, "bar").unwrap();
        let r = s.from_percent(p).unwrap();
        prop_assert!((s.from_ma(r.ma).unwrap().percent - p).abs() < 1e-9);
    }
}
