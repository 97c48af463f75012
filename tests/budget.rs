//! Loop voltage budgets worked as on paper.

mod util;

use loopside::budget::{Cable, LoopConfig, SeriesElement};
use loopside::resistor::{ma_from_volts, sense_resistor, volts_at};
use loopside::scale::SignalSpan;
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

#[test]
fn inlet_level_loop_lt_101() {
    // Demo plant LT-101: 24 V, 10.5 V minimum, 250 Ω PLC input, 180 m of 1.0 mm² pair.
    let mut c = LoopConfig::new(24.0, 10.5);
    c.elements.push(SeriesElement::ohms("PLC input", 250.0));
    c.cable = Some(Cable {
        one_way_m: 180.0,
        conductor: Conductor::Mm2(1.0),
        temp_c: 20.0,
    });
    let b = c.budget().unwrap();
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
    assert!(b.limit.contains("IS barrier"), "{}", b.limit);
    assert!(b.limit.contains("short by"), "{}", b.limit);
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
    assert!(b.hart_note.contains("above"));
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
