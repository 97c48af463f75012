//! Conductor resistance against published wire tables.

mod util;

use loopside::wire::{loop_ohms, Conductor};
use proptest::prelude::*;
use util::close;

/// 1000 ft in km is 0.3048, so Ω/1000 ft = Ω/km × 0.3048.
const KFT_PER_KM: f64 = 1.0 / 0.3048;

#[test]
fn awg_resistance_matches_astm_b258_derived_tables_at_20c() {
    // ASTM B258-derived tables, Ω/1000 ft at 20 °C, solid annealed copper, given to
    // four significant figures: compare within half a unit of the last digit shown.
    let table = [
        (12, 1.588, 0.0005),
        (14, 2.525, 0.0005),
        (16, 4.016, 0.0005),
        (18, 6.385, 0.0005),
        (20, 10.15, 0.005),
        (22, 16.14, 0.005),
        (24, 25.67, 0.005),
    ];
    for (gauge, per_kft, half_digit) in table {
        let per_km = Conductor::awg(gauge).unwrap().ohms_per_km(20.0).unwrap();
        close(
            per_km / KFT_PER_KM,
            per_kft,
            half_digit + 1e-9,
            &format!("AWG {gauge}"),
        );
    }
}

#[test]
#[allow(clippy::approx_constant)] // 3.14 is NEC's AWG 14 stranded figure, not π.
fn awg_resistance_at_75c_against_nec_chapter_9_table_8() {
    // NEC Chapter 9, Table 8, uncoated copper at 75 °C, Ω/1000 ft (solid / stranded).
    // Our solid-conductor model with α = 0.00393 (IEC 60028) should sit within 0.5 % of
    // the solid figure and below the stranded one (stranding adds length).
    let table = [
        (18, 7.77, 7.95),
        (16, 4.89, 4.99),
        (14, 3.07, 3.14),
        (12, 1.93, 1.98),
    ];
    for (gauge, solid, stranded) in table {
        let ours = Conductor::awg(gauge).unwrap().ohms_per_km(75.0).unwrap() / KFT_PER_KM;
        assert!(
            (ours - solid).abs() / solid < 0.005,
            "AWG {gauge}: {ours} vs {solid}"
        );
        assert!(
            ours < stranded,
            "AWG {gauge}: {ours} vs stranded {stranded}"
        );
    }
}

#[test]
fn metric_sizes_sit_below_iec_60228_maximum_resistance() {
    // IEC 60228, class 1/2 plain copper, maximum Ω/km at 20 °C. The nominal-area figure
    // (1/58 Ω·mm²/m ÷ area) must be below the maximum and within 8 % of it.
    let table = [
        (0.5, 36.0),
        (0.75, 24.5),
        (1.0, 18.1),
        (1.5, 12.1),
        (2.5, 7.41),
    ];
    for (mm2, max_per_km) in table {
        let ours = Conductor::mm2(mm2).unwrap().ohms_per_km(20.0).unwrap();
        assert!(ours < max_per_km, "{mm2} mm²: {ours} ≥ {max_per_km}");
        assert!((max_per_km - ours) / max_per_km < 0.08, "{mm2} mm²: {ours}");
    }
}

#[test]
fn awg_diameter_formula() {
    // ASTM B258: d = 0.005 in × 92^((36 − n)/39); AWG 36 = 0.005 in, AWG 4/0 = 0.46 in.
    close(
        Conductor::awg(36).unwrap().diameter_mm(),
        0.127,
        1e-12,
        "AWG 36",
    );
    close(
        Conductor::awg(-3).unwrap().diameter_mm(),
        0.46 * 25.4,
        1e-9,
        "AWG 4/0",
    );
}

#[test]
fn warm_cable_has_more_resistance() {
    // IEC 60028: R(t) = R20 (1 + 0.00393 (t − 20)); at 40 °C +7.86 %.
    let c = Conductor::mm2(1.0).unwrap();
    let r20 = c.ohms_per_km(20.0).unwrap();
    close(c.ohms_per_km(40.0).unwrap() / r20, 1.0786, 1e-12, "ratio");
}

#[test]
fn bad_sizes_are_refused() {
    assert_eq!(Conductor::awg(41).unwrap_err().field, "awg");
    assert_eq!(Conductor::awg(-4).unwrap_err().field, "awg");
    assert_eq!(Conductor::mm2(-1.0).unwrap_err().field, "mm2");
    let c = Conductor::mm2(1.0).unwrap();
    assert_eq!(loop_ohms(&c, -5.0, 20.0).unwrap_err().field, "cable_m");
    assert_eq!(c.ohms_per_km(f64::NAN).unwrap_err().field, "temp_c");
}

proptest! {
    #[test]
    fn length_and_resistance_round_trip(gauge in -3i32..=40, metres in 0.0f64..5000.0, t in -40.0f64..120.0) {
        let c = Conductor::awg(gauge).unwrap();
        let ohms = c.ohms(metres, t).unwrap();
        let back = c.length_for_ohms(ohms, t).unwrap();
        prop_assert!((back - metres).abs() < 1e-9 * metres.max(1.0));
    }
}
