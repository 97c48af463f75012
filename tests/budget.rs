//! Loop voltage budgets worked as on paper.

mod util;

use loopside::budget::{BudgetLimit, Cable, LoopConfig, SeriesElement};
use loopside::resistor::{ma_from_volts, sense_resistor, volts_at};
use loopside::scale::SignalSpan;
use loopside::view::wording::power as words;
use loopside::wire::Conductor;
use util::close;

#[test]
fn max_loop_resistance_is_supply_less_minimum_over_20_ma() {
    // Common practice: R_max = (V_supply − V_tx,min) / 20 mA. (24 − 10.5) / 0.020 = 675 Ω.
    let b = LoopConfig::new(24.0, 10.5).budget().unwrap();
    close(b.max_load_ohms, 675.0, 1e-9, "max load");
    // (24 − 12) / 0.020 = 600 Ω.
    close(
        LoopConfig::new(24.0, 12.0).budget().unwrap().max_load_ohms,
        600.0,
        1e-9,
        "12 V min",
    );
}

/// Demo plant LT-101: 24 V, 10.5 V minimum, 250 Ω PLC input, 180 m of 1.0 mm² pair at
/// 20 °C (the cable temperature the screens and `budget` use unless told otherwise).
fn lt101() -> LoopConfig {
    let mut c = LoopConfig::new(24.0, 10.5);
    c.elements.push(SeriesElement::ohms("PLC input", 250.0));
    c.cable = Some(Cable {
        one_way_m: 180.0,
        conductor: Conductor::Mm2(1.0),
        temp_c: 20.0,
    });
    c
}

#[test]
fn inlet_level_loop_lt_101() {
    let b = lt101().budget().unwrap();
    // Cable: 2 × 180 m × (1/58 Ω·mm²/m) / 1.0 mm² = 6.2069 Ω (IEC 60028 resistivity).
    close(b.cable_ohms, 360.0 / 58.0, 1e-9, "cable");
    close(b.loop_ohms, 256.2069, 1e-4, "loop");
    // At 20 mA: 24 − 0.020 × 256.2069 = 18.876 V at the terminals, 8.376 V headroom.
    close(
        b.at_full_scale.terminal_volts,
        18.8759,
        1e-4,
        "terminal at 20 mA",
    );
    close(
        b.at_full_scale.headroom_volts,
        8.3759,
        1e-4,
        "headroom at 20 mA",
    );
    close(
        b.at_fault.headroom_volts,
        24.0 - 0.022 * 256.2069 - 10.5,
        1e-4,
        "at 22 mA",
    );
    // The classic figures at 20 mA (common practice): 675 − 256.2069 = 418.79 Ω spare.
    close(b.spare_ohms, 675.0 - 256.2069, 1e-4, "spare");
    // Max cable: (675 − 250) Ω / (2 × 0.017241 Ω/m) = 12 325 m one way.
    close(
        b.max_cable_m.unwrap(),
        425.0 / (2.0 / 58.0),
        1e-6,
        "max cable",
    );
    close(
        b.min_supply_volts,
        10.5 + 0.020 * 256.2069,
        1e-4,
        "min supply",
    );
    assert!(b.ok && b.hart_ok);
}

#[test]
fn lt_101_spare_load_and_cable_at_the_22_ma_fault_current() {
    // Worked by hand. Copper 1/58 Ω·mm²/m at 20 °C (IEC 60028); the cable is taken at
    // 20 °C, so no temperature correction.
    //   loop: 250 + 2 × 180 m × (1/58) Ω/m = 256.2069 Ω
    //   maximum load at 22 mA: (24 − 10.5) V / 0.022 A = 613.636 Ω (the common-practice
    //   formula, at the fault current instead of 20 mA)
    //   spare at 22 mA: 613.636 − 256.207 = 357.43 Ω (the 20 mA spare, 418.8 Ω, would
    //   leave the transmitter 61.4 Ω × 22 mA = 1.35 V short at 22 mA)
    //   longest cable at 22 mA: (613.636 − 250) Ω / (2/58 Ω per metre of route)
    //   = 363.636 × 29 = 10 545 m one way, about 10.5 km
    let b = lt101().budget().unwrap();
    close(
        b.max_load_fault_ohms,
        13.5 / 0.022,
        1e-9,
        "max load at 22 mA",
    );
    close(b.spare_fault_ohms, 357.43, 0.01, "spare at 22 mA");
    close(
        b.max_cable_fault_m.unwrap(),
        10_545.45,
        0.01,
        "max cable at 22 mA",
    );
    // Adding the 20 mA spare really does starve the transmitter at 22 mA; adding the
    // 22 mA spare leaves it exactly its minimum.
    let mut more = lt101();
    more.elements
        .push(SeriesElement::ohms("added", b.spare_ohms));
    assert!(!more.budget().unwrap().ok_fault);
    let mut more = lt101();
    more.elements
        .push(SeriesElement::ohms("added", b.spare_fault_ohms));
    close(
        more.budget().unwrap().at_fault.headroom_volts,
        0.0,
        1e-9,
        "headroom at 22 mA with the 22 mA spare added",
    );
    // The verdict is given at 22 mA, so it quotes the 22 mA spare, not 419 Ω.
    assert!(
        words::limit(&b.limit)
            .contains("7.86 V spare at 22.0 mA, 357 Ω of load still available at 22.0 mA"),
        "{}",
        words::limit(&b.limit)
    );
    assert!(
        !words::limit(&b.limit).contains("419"),
        "{}",
        words::limit(&b.limit)
    );
    assert!(
        b.fault_ma_is_default,
        "nobody gave the device's fault current"
    );
}

#[test]
fn a_configured_fault_current_is_used_and_not_called_a_default() {
    // LT-101 with its transmitter configured to drive 21.5 mA on an upscale failure:
    //   maximum load (24 − 10.5) / 0.0215 = 627.907 Ω (common practice, at 21.5 mA)
    //   spare 627.907 − 256.207 = 371.70 Ω; cable (627.907 − 250) × 29 = 10 959.3 m
    let mut c = lt101();
    c.fault_ma = Some(21.5);
    let b = c.budget().unwrap();
    assert!(!b.fault_ma_is_default);
    close(b.at_fault.current_ma, 21.5, 0.0, "fault current");
    close(b.spare_fault_ohms, 371.70, 0.01, "spare at 21.5 mA");
    close(
        b.max_cable_fault_m.unwrap(),
        10_959.30,
        0.01,
        "max cable at 21.5 mA",
    );
    assert!(words::limit(&b.limit).contains("372 Ω of load still available at 21.5 mA"));
}

#[test]
fn the_fault_current_given_survives_a_save_and_an_old_record_reads_sensibly() {
    let mut c = lt101();
    // Given as 22.0 on purpose: still the device's value, not the default.
    c.fault_ma = Some(22.0);
    let back: LoopConfig = serde_json::from_str(&serde_json::to_string(&c).unwrap()).unwrap();
    assert_eq!(back, c);
    let none: LoopConfig = serde_json::from_str(&serde_json::to_string(&lt101()).unwrap()).unwrap();
    assert_eq!(none.fault_ma, None);
    // Records written before the flag always carried fault_ma, 22.0 when nobody typed
    // one: that reads as not given, any other value as given.
    let old = r#"{"supply_volts":24.0,"tx_min_volts":10.5,"fault_ma":22.0}"#;
    assert_eq!(
        serde_json::from_str::<LoopConfig>(old).unwrap().fault_ma,
        None
    );
    let old = r#"{"supply_volts":24.0,"tx_min_volts":10.5,"fault_ma":21.0}"#;
    assert_eq!(
        serde_json::from_str::<LoopConfig>(old).unwrap().fault_ma,
        Some(21.0)
    );
}

#[test]
fn barrier_and_indicator_that_starve_the_fault_current() {
    // Demo values: 24 V −10 %, 12 V minimum, 340 Ω barrier, 250 Ω input, 2.5 V indicator.
    let mut c = LoopConfig::new(24.0, 12.0);
    c.supply_tolerance_percent = 10.0;
    c.elements.push(SeriesElement::ohms("IS barrier", 340.0));
    c.elements.push(SeriesElement::ohms("DCS input", 250.0));
    c.elements.push(SeriesElement::drop("field indicator", 2.5));
    let b = c.budget().unwrap();
    close(b.lowest_supply_volts, 21.6, 1e-12, "low line");
    // 21.6 − 2.5 − 0.020 × 590 = 7.3 V → 4.7 V short at 20 mA.
    close(
        b.at_full_scale.terminal_volts,
        7.3,
        1e-9,
        "terminal at 20 mA",
    );
    assert!(!b.ok_full_scale && !b.ok);
    close(
        b.max_load_ohms,
        (21.6 - 12.0 - 2.5) / 0.020,
        1e-9,
        "max load",
    );
    // The core names the limiting element; the words quote it.
    match &b.limit {
        BudgetLimit::Short { largest, .. } => {
            assert_eq!(
                largest.as_ref().map(|p| p.name.as_str()),
                Some("IS barrier")
            )
        }
        other => panic!("expected a short loop, got {other:?}"),
    }
    assert!(
        words::limit(&b.limit).contains("IS barrier"),
        "{}",
        words::limit(&b.limit)
    );
    assert!(
        words::limit(&b.limit).contains("short by"),
        "{}",
        words::limit(&b.limit)
    );
}

#[test]
fn loop_that_makes_20_ma_but_not_the_fault_current() {
    // 24 V, 12 V minimum, 590 Ω: at 20 mA 0.2 V spare; at 22 mA 12.98 − 12 is short.
    let mut c = LoopConfig::new(24.0, 12.0);
    c.elements.push(SeriesElement::ohms("load", 590.0));
    let b = c.budget().unwrap();
    assert!(b.ok_full_scale);
    assert!(!b.ok_fault);
    assert!(!b.ok);
    close(
        b.at_fault.headroom_volts,
        24.0 - 0.022 * 590.0 - 12.0,
        1e-9,
        "fault headroom",
    );
}

#[test]
fn supply_below_transmitter_minimum_is_an_answer() {
    let b = LoopConfig::new(9.0, 10.5).budget().unwrap();
    assert!(!b.ok);
    assert_eq!(b.max_load_ohms, 0.0);
    assert!(b.at_low.headroom_volts < 0.0);
}

#[test]
fn hart_window() {
    // HART physical layer (HCF_SPEC-54): at least 230 Ω; 1100 Ω upper end from memory.
    let mut c = LoopConfig::new(24.0, 10.5);
    assert!(!c.budget().unwrap().hart_ok, "0 Ω: no HART");
    c.elements.push(SeriesElement::ohms("HART resistor", 250.0));
    assert!(c.budget().unwrap().hart_ok);
    c.elements.push(SeriesElement::ohms("barrier", 900.0));
    let b = c.budget().unwrap();
    assert!(!b.hart_ok);
    assert!(words::hart(&b.hart).contains("above"));
    c.hart_window_ohms = (230.0, 1200.0);
    assert!(c.budget().unwrap().hart_ok, "window is configurable");
}

#[test]
fn bad_loop_input_names_the_field() {
    let mut c = LoopConfig::new(f64::NAN, 10.5);
    assert_eq!(c.budget().unwrap_err().field, "supply_volts");
    c = LoopConfig::new(24.0, 10.5);
    c.elements.push(SeriesElement::drop("indicator", -1.0));
    assert_eq!(c.budget().unwrap_err().field, "indicator");
    c = LoopConfig::new(24.0, 10.5);
    c.supply_tolerance_percent = 80.0;
    assert_eq!(c.budget().unwrap_err().field, "supply_tolerance_percent");
    // An upscale fault current sits at or above 20 mA; 3.6 mA is a downscale one.
    c = LoopConfig::new(24.0, 10.5);
    c.fault_ma = Some(3.6);
    let e = c.budget().unwrap_err();
    assert_eq!(e.field, "fault_ma");
    assert!(e.reason.contains("20"), "{e}");
}

#[test]
fn a_250_ohm_resistor_gives_1_to_5_volts() {
    // Common practice: 250 Ω turns 4–20 mA into 1–5 V.
    close(volts_at(250.0, 4.0), 1.0, 1e-12, "4 mA");
    close(volts_at(250.0, 20.0), 5.0, 1e-12, "20 mA");
    close(ma_from_volts(3.0, 250.0).unwrap(), 12.0, 1e-12, "3 V");
    let r = sense_resistor(250.0, 0.1, &SignalSpan::default(), 22.0).unwrap();
    // 22 mA² × 250 Ω = 0.121 W; 0.1 % of 20 mA is 0.02 mA = 0.125 % of span.
    close(r.points[3].watts, 0.121, 1e-12, "power at 22 mA");
    close(
        r.points[2].error_percent_of_span,
        0.125,
        1e-12,
        "error at 20 mA",
    );
    assert!(ma_from_volts(1.0, 0.0).is_err());
}
