//! Level checks: hydrostatic head, DP transmitter ranging for each mount against published
//! worked examples, and a consistency check that every mount reads back the same level
//! from the pressures a real installation would put on its ports.

use loopside::level::{
    dp_at_level, head_in, head_pa, height_m_from_pa, level_from_dp, range, LevelSetup, Mount,
    ZeroShift,
};
use loopside::view::level::zero_words;

const FT: f64 = 0.3048;

fn close(actual: f64, expected: f64, tolerance: f64) -> bool {
    (actual - expected).abs() <= tolerance
}

fn setup(sg: f64, min_m: f64, max_m: f64, mount: Mount) -> LevelSetup {
    LevelSetup {
        sg,
        min_m,
        max_m,
        mount,
        ports_swapped: false,
    }
}

#[test]
fn one_metre_of_water_is_the_conventional_metre_of_water() {
    // Conventional: 1 m of water at SG 1 = 9.80665 kPa (NIST SP 811, mmH2O conventional
    // = 9.80665 Pa; standard gravity 9.80665 m/s²).
    assert!(close(head_pa(1.0, 1.0).unwrap(), 9806.65, 1e-9));
    assert!(close(head_in(1.0, 1.0, "kPa").unwrap(), 9.80665, 1e-12));
    assert!(close(head_in(1.0, 1.0, "mmH2O").unwrap(), 1000.0, 1e-9));
    // Twice the density, half the height for the same pressure.
    assert!(close(height_m_from_pa(2.0, 9806.65).unwrap(), 0.5, 1e-12));
    // 10 m of SG 1.02 sludge is 1.00028 bar (worked by hand: 1.02 × 10 × 9806.65 Pa).
    assert!(close(
        head_in(1.02, 10.0, "bar").unwrap(),
        1.000_278_3,
        1e-9
    ));
}

#[test]
fn open_tank_bottom_mounted_heptane_vessel() {
    // T. Kuphaldt, Lessons in Industrial Instrumentation (CC BY), level-measurement
    // question "transmitter calibration range of a vessel level" (as republished by
    // instrumentationtools.com): heptane SG 0.68, 0–14 ft, transmitter at the bottom →
    // 0 to 114.24 "W.C.; 8 ft of level → 13.14 mA.
    let s = setup(0.68, 0.0, 14.0 * FT, Mount::OpenTank { tx_m: 0.0 });
    let r = range(&s).unwrap();
    let (lrv, urv, span) = r.in_unit("inH2O(conv)").unwrap();
    assert!(close(lrv, 0.0, 1e-9));
    assert!(close(urv, 114.24, 0.005));
    assert!(close(span, 114.24, 0.005));
    assert_eq!(r.zero, ZeroShift::None);
    let dp = dp_at_level(&s, 8.0 * FT).unwrap();
    let ma = 4.0 + 16.0 * (dp - r.lrv_pa) / r.span_pa;
    assert!(close(ma, 13.14, 0.005), "{ma}");
}

#[test]
fn open_tank_transmitter_below_the_tap_is_a_suppressed_zero() {
    // instrumentationtoolbox.com, "Zero Suppression Calibration in Level Measurement":
    // SG 0.9, 40 ft of level, transmitter 6 ft below the tank base → 64.8 to 496.8 "W.C.
    let s = setup(0.9, 0.0, 40.0 * FT, Mount::OpenTank { tx_m: -6.0 * FT });
    let r = range(&s).unwrap();
    let (lrv, urv, span) = r.in_unit("inH2O(conv)").unwrap();
    assert!(close(lrv, 64.8, 0.005));
    assert!(close(urv, 496.8, 0.005));
    match r.zero {
        ZeroShift::Suppressed { by_pa } => assert!(close(by_pa, r.lrv_pa, 1e-9)),
        other => panic!("expected a suppressed zero, got {other:?}"),
    }
    assert_eq!(
        zero_words(&r.zero, "inH2O(conv)", span).unwrap(),
        "suppressed zero by 64.80 inH2O(conv) (LRV above 0)"
    );
}

#[test]
fn closed_tank_dry_leg_and_wet_leg_with_the_transmitter_above_the_tap() {
    // learninstrumentationengineering.com, "Calibration of DP level transmitter
    // (elevation)": taps 5470 mm apart, SG 1.12, transmitter 1250 mm above the 0 % (HP)
    // tap. Dry leg: LRV −1400, URV 4726.4 mmH2O.
    let dry = setup(1.12, 0.0, 5.47, Mount::DryLeg { tx_m: 1.25 });
    let (lrv, urv, span) = range(&dry).unwrap().in_unit("mmH2O").unwrap();
    assert!(close(lrv, -1400.0, 1e-6));
    assert!(close(urv, 4726.4, 1e-6));
    assert!(close(span, 6126.4, 1e-6));
    // Same page, wet leg of SG 1.17 filled 4490 mm above the transmitter:
    // LRV −6653.3, URV −526.9 mmH2O.
    let wet = setup(
        1.12,
        0.0,
        5.47,
        Mount::WetLeg {
            tx_m: 1.25,
            leg_m: 4.49,
            fill_sg: 1.17,
        },
    );
    let r = range(&wet).unwrap();
    let (lrv, urv, span) = r.in_unit("mmH2O").unwrap();
    assert!(close(lrv, -6653.3, 1e-6));
    assert!(close(urv, -526.9, 1e-6));
    assert!(close(span, 6126.4, 1e-6));
    assert!(matches!(r.zero, ZeroShift::Elevated { .. }));
}

#[test]
fn wet_leg_with_the_transmitter_at_the_tap() {
    // learninstrumentationengineering.com, "Calibration of DP level transmitter (zero
    // elevation)", wet calibration: 7270 mm of SG 0.92, sealed leg 8210 mm of SG 0.94 →
    // LRV −7717.4, URV −1029 mmH2O.
    let s = setup(
        0.92,
        0.0,
        7.27,
        Mount::WetLeg {
            tx_m: 0.0,
            leg_m: 8.21,
            fill_sg: 0.94,
        },
    );
    let r = range(&s).unwrap();
    let (lrv, urv, span) = r.in_unit("mmH2O").unwrap();
    assert!(close(lrv, -7717.4, 1e-6));
    assert!(close(urv, -1029.0, 1e-6));
    assert!(close(span, 6688.4, 1e-6));
    match r.zero {
        ZeroShift::Elevated { by_pa } => assert!(close(by_pa, -r.lrv_pa, 1e-9)),
        other => panic!("expected an elevated zero, got {other:?}"),
    }
}

#[test]
fn two_seals_with_capillaries() {
    // mycelectric.com, "Level Calculation for Diaphragm Seal Transmitter": process
    // density 0.96 g/cm³, fill 1.05 g/cm³, 100 % at 4 m above the HP seal, seals 5 m
    // apart → −5250 to −1410 mmH2O.
    for tx_m in [0.0, -1.0, 2.5] {
        // With a seal on each side the transmitter's own elevation cancels.
        let s = setup(
            0.96,
            0.0,
            4.0,
            Mount::Seals {
                hp_seal_m: 0.0,
                lp_seal_m: 5.0,
                tx_m,
                fill_sg: 1.05,
            },
        );
        let (lrv, urv, span) = range(&s).unwrap().in_unit("mmH2O").unwrap();
        assert!(close(lrv, -5250.0, 1e-6), "tx {tx_m}: {lrv}");
        assert!(close(urv, -1410.0, 1e-6), "tx {tx_m}: {urv}");
        assert!(close(span, 3840.0, 1e-6));
    }
}

#[test]
fn open_tank_single_seal_below_and_above_the_transmitter() {
    // Worked by hand: SG 1.0, 0–3 m above the seal, fill SG 0.93. Transmitter 2 m below
    // the seal: LRV = 0.93 × 2 = 1.86 mH2O (suppressed); 1 m above it: LRV = −0.93 mH2O
    // (elevated). Span 3 mH2O either way.
    let below = setup(
        1.0,
        0.0,
        3.0,
        Mount::OpenTankSeal {
            hp_seal_m: 0.0,
            tx_m: -2.0,
            fill_sg: 0.93,
        },
    );
    let (lrv, urv, _) = range(&below).unwrap().in_unit("mH2O").unwrap();
    assert!(close(lrv, 1.86, 1e-9) && close(urv, 4.86, 1e-9));
    let above = setup(
        1.0,
        0.0,
        3.0,
        Mount::OpenTankSeal {
            hp_seal_m: 0.0,
            tx_m: 1.0,
            fill_sg: 0.93,
        },
    );
    let r = range(&above).unwrap();
    let (lrv, urv, _) = r.in_unit("mH2O").unwrap();
    assert!(close(lrv, -0.93, 1e-9) && close(urv, 2.07, 1e-9));
    assert!(matches!(r.zero, ZeroShift::Elevated { .. }));
}

#[test]
fn interface_between_two_liquids() {
    // Worked by hand: water (SG 1.0) under oil (SG 0.85), taps 2.0 m apart, both legs
    // filled with SG 0.93; interface range 0.2–1.8 m above the bottom tap.
    // LRV = 1.0×0.2 + 0.85×1.8 − 0.93×2.0 = −0.13 mH2O;
    // URV = 1.0×1.8 + 0.85×0.2 − 0.93×2.0 = +0.11 mH2O; span = (1.0 − 0.85)×1.6 = 0.24.
    let s = setup(
        1.0,
        0.2,
        1.8,
        Mount::Interface {
            upper_sg: 0.85,
            hp_tap_m: 0.0,
            lp_tap_m: 2.0,
            tx_m: -0.5,
            fill_sg: 0.93,
        },
    );
    let (lrv, urv, span) = range(&s).unwrap().in_unit("mH2O").unwrap();
    assert!(close(lrv, -0.13, 1e-12));
    assert!(close(urv, 0.11, 1e-12));
    assert!(close(span, 0.24, 1e-12));
    // A lighter liquid under a heavier one is not an error: the span comes out negative.
    let upside_down = LevelSetup { sg: 0.8, ..s };
    assert!(range(&upside_down).unwrap().span_pa < 0.0);
}

/// Hydrostatic pressure of a column, written out again here so the consistency check does
/// not lean on the module under test: SG × 1000 kg/m³ × 9.80665 m/s² × h.
fn column(sg: f64, h: f64) -> f64 {
    sg * 1000.0 * 9.80665 * h
}

#[test]
fn every_mount_reads_back_the_same_level_from_its_port_pressures() {
    // The same closed tank (liquid SG 1.05, vapour at 50 kPa gauge, level 2.0 m above the
    // bottom tap) instrumented five ways. Elevations for the seal mounts are taken from
    // the tank floor, with the bottom tap 0.3 m up. For each mount the pressures on the HP
    // and LP ports are summed from the columns a technician would trace on site; every
    // mount must turn its own DP back into 2.0 m.
    let sg = 1.05;
    let vapour = 50_000.0;
    let level = 2.0;
    let cases: Vec<(Mount, f64, f64)> = vec![
        (
            // Transmitter 1.3 m below the bottom tap.
            Mount::OpenTank { tx_m: -1.3 },
            // Open tank: no vapour pressure, LP vented.
            column(sg, level) + column(sg, 1.3),
            0.0,
        ),
        (
            Mount::DryLeg { tx_m: -1.3 },
            vapour + column(sg, level) + column(sg, 1.3),
            vapour,
        ),
        (
            Mount::WetLeg {
                tx_m: -1.3,
                leg_m: 5.5,
                fill_sg: 1.0,
            },
            vapour + column(sg, level) + column(sg, 1.3),
            vapour + column(1.0, 5.5),
        ),
        (
            // Seals at 0.3 m and 4.5 m above the floor, transmitter at 1.2 m.
            Mount::Seals {
                hp_seal_m: 0.3,
                lp_seal_m: 4.5,
                tx_m: 1.2,
                fill_sg: 0.93,
            },
            vapour + column(sg, level) + column(0.93, 0.3 - 1.2),
            vapour + column(0.93, 4.5 - 1.2),
        ),
        (
            // Open tank with one seal at 0.3 m, transmitter at grade (0 m).
            Mount::OpenTankSeal {
                hp_seal_m: 0.3,
                tx_m: 0.0,
                fill_sg: 0.93,
            },
            column(sg, level) + column(0.93, 0.3),
            0.0,
        ),
    ];
    for (mount, p_hp, p_lp) in cases {
        let straight = setup(sg, 0.2, 3.7, mount);
        let read = level_from_dp(&straight, p_hp - p_lp).unwrap();
        assert!(close(read, level, 1e-9), "{}: {read} m", mount.name());
        // The same installation with the ports swapped sees the negative DP and still
        // reads the same level once told so.
        let swapped = LevelSetup {
            ports_swapped: true,
            ..straight
        };
        let read = level_from_dp(&swapped, p_lp - p_hp).unwrap();
        assert!(
            close(read, level, 1e-9),
            "{} swapped: {read} m",
            mount.name()
        );
        // And the forward direction agrees with the hand-summed pressures.
        let dp = dp_at_level(&straight, level).unwrap();
        assert!(close(dp, p_hp - p_lp, 1e-6), "{}", mount.name());
    }

    // Interface: water under oil, vessel full to 6 m above the floor with 20 kPa of gas
    // above; taps at 0.3 m and 2.3 m; interface 0.8 m above the bottom tap (1.1 m above
    // the floor); legs filled with SG 0.93, transmitter at the floor.
    let (water, oil, top) = (1.0, 0.85, 6.0);
    let interface_floor = 1.1;
    let p_hp = 20_000.0
        + column(oil, top - interface_floor)
        + column(water, interface_floor - 0.3)
        + column(0.93, 0.3);
    let p_lp = 20_000.0 + column(oil, top - 2.3) + column(0.93, 2.3);
    let s = setup(
        water,
        0.2,
        1.7,
        Mount::Interface {
            upper_sg: oil,
            hp_tap_m: 0.3,
            lp_tap_m: 2.3,
            tx_m: 0.0,
            fill_sg: 0.93,
        },
    );
    assert!(close(level_from_dp(&s, p_hp - p_lp).unwrap(), 0.8, 1e-9));
}

#[test]
fn bad_input_names_the_field() {
    let open =
        |sg: f64, min_m: f64, max_m: f64| setup(sg, min_m, max_m, Mount::OpenTank { tx_m: 0.0 });
    assert_eq!(range(&open(-1.0, 0.0, 2.0)).unwrap_err().field, "sg");
    assert_eq!(range(&open(0.0, 0.0, 2.0)).unwrap_err().field, "sg");
    let e = range(&open(1.0, 2.0, 2.0)).unwrap_err();
    assert_eq!(e.field, "max_m");
    assert_eq!(range(&open(1.0, 3.0, 2.0)).unwrap_err().field, "max_m");
    assert_eq!(range(&open(1.0, -0.5, 2.0)).unwrap_err().field, "min_m");
    assert_eq!(range(&open(1.0, f64::NAN, 2.0)).unwrap_err().field, "min_m");
    assert_eq!(head_pa(-0.2, 1.0).unwrap_err().field, "sg");
    assert_eq!(head_in(1.0, 1.0, "furlongs").unwrap_err().field, "unit");
    let seals = setup(
        1.0,
        0.0,
        6.0,
        Mount::Seals {
            hp_seal_m: 0.0,
            lp_seal_m: 5.0,
            tx_m: 0.0,
            fill_sg: 0.93,
        },
    );
    // Level above the LP seal stops moving the DP.
    assert_eq!(range(&seals).unwrap_err().field, "max_m");
    let same = setup(
        1.0,
        0.2,
        1.0,
        Mount::Interface {
            upper_sg: 1.0,
            hp_tap_m: 0.0,
            lp_tap_m: 2.0,
            tx_m: 0.0,
            fill_sg: 1.0,
        },
    );
    assert_eq!(range(&same).unwrap_err().field, "upper_sg");
    let ok = open(1.0, 0.0, 2.0);
    assert_eq!(dp_at_level(&ok, -1.0).unwrap_err().field, "level_m");
    assert_eq!(level_from_dp(&ok, -5000.0).unwrap_err().field, "dp_pa");
    assert_eq!(
        level_from_dp(&ok, f64::INFINITY).unwrap_err().field,
        "dp_pa"
    );
}

#[test]
fn levels_outside_the_range_extend_the_same_line() {
    // A DP above the URV reads as a level above max_m (the transmitter would saturate,
    // but the technician still wants to know what the pressure means).
    let s = setup(1.0, 0.0, 2.0, Mount::OpenTank { tx_m: 0.0 });
    assert!(close(
        level_from_dp(&s, column(1.0, 2.5)).unwrap(),
        2.5,
        1e-12
    ));
}

#[test]
fn a_setup_can_be_stored_with_a_tag() {
    // The tag register stores a level setup as JSON; it must read back unchanged.
    let s = LevelSetup {
        sg: 1.02,
        min_m: 0.3,
        max_m: 7.0,
        mount: Mount::WetLeg {
            tx_m: -0.4,
            leg_m: 8.0,
            fill_sg: 1.0,
        },
        ports_swapped: false,
    };
    let text = serde_json::to_string(&s).unwrap();
    assert!(text.contains("\"mount\":\"wet-leg\""), "{text}");
    let back: LevelSetup = serde_json::from_str(&text).unwrap();
    assert_eq!(back, s);
}
