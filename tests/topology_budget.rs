//! Loop topologies worked as on paper: who supplies the voltage and which limit applies.
//!
//! Where no published worked example exists for a topology, the expected values are
//! worked here independently from Kirchhoff's voltage law around the loop (the source's
//! volts equal the sum of the drops) and Ohm's law (a resistance takes I·R), with copper
//! at 1/58 Ω·mm²/m at 20 °C (IEC 60028), exactly as a technician would on paper.

mod util;

use loopside::budget::hart::{self, Binding, HartCable};
use loopside::budget::topology::{
    Compliance, Device, IsolatedLoop, SourceKind, Topology, TopologyFault, Wiring,
};
use loopside::budget::{BudgetLimit, Cable, LoopConfig, SeriesElement};
use loopside::view::wording::power as words;
use loopside::wire::Conductor;
use proptest::prelude::*;
use util::close;

/// One-way cable of 1.0 mm² copper at 20 °C.
fn cable_1mm2(one_way_m: f64) -> Option<Cable> {
    Some(Cable {
        one_way_m,
        conductor: Conductor::Mm2(1.0),
        temp_c: 20.0,
    })
}

/// Ω of one 1.0 mm² conductor `m` long at 20 °C (IEC 60028: 1/58 Ω·mm²/m).
fn one_conductor_ohms(m: f64) -> f64 {
    m / 58.0
}

#[test]
fn todays_loop_keeps_its_figures_and_names_its_source() {
    // 24 V, 10.5 V minimum, 250 Ω: (24 − 10.5) / 0.020 = 675 Ω (common practice).
    let mut c = LoopConfig::new(24.0, 10.5);
    c.elements.push(SeriesElement::ohms("PLC input", 250.0));
    let b = c.budget().unwrap();
    close(b.max_load_ohms, 675.0, 1e-9, "max load");
    assert_eq!(b.source, Some(SourceKind::Supply));
    assert_eq!(b.topology, Topology::TwoWireSupply);
    assert_eq!(b.topology_fault, None);
    assert_eq!(b.driver_min_volts, 10.5);
    // The stored shape of today's loop does not change: no wiring written.
    let json = serde_json::to_value(&c).unwrap();
    assert!(json.get("wiring").is_none(), "{json}");
    assert!(json.get("compliance").is_none(), "{json}");
}

#[test]
fn two_wire_on_an_active_input_card() {
    // The card powers the loop from its own 24 V through its 250 Ω input; the transmitter
    // needs 10.5 V. KVL at 20 mA: 24 − 0.020 × 250 − 0.020 × (2 × 100/58) = 18.9310 V at
    // the transmitter, 8.4310 V headroom.
    let mut c = LoopConfig::new(24.0, 10.5);
    c.wiring = Topology::TwoWireActiveInput.wiring();
    c.elements.push(SeriesElement::ohms("card input", 250.0));
    c.cable = cable_1mm2(100.0);
    let b = c.budget().unwrap();
    let cable = 2.0 * one_conductor_ohms(100.0);
    assert_eq!(b.source, Some(SourceKind::ActiveInput));
    assert_eq!(b.topology, Topology::TwoWireActiveInput);
    close(
        b.at_full_scale.terminal_volts,
        24.0 - 0.020 * (250.0 + cable),
        1e-9,
        "terminal volts",
    );
    close(
        b.at_full_scale.headroom_volts,
        24.0 - 0.020 * (250.0 + cable) - 10.5,
        1e-9,
        "headroom",
    );
    close(b.max_load_ohms, 675.0, 1e-9, "max load");
    assert!(b.ok);
}

/// AIT-531-like: a four-wire analyser whose output drives at most 750 Ω, into a 250 Ω
/// PLC input over 180 m of 1.0 mm² pair.
fn four_wire() -> LoopConfig {
    let mut c = LoopConfig::current_output(Device::FourWire, Compliance::MaxLoad { ohms: 750.0 });
    c.elements.push(SeriesElement::ohms("PLC input", 250.0));
    c.cable = cable_1mm2(180.0);
    c
}

#[test]
fn four_wire_transmitter_by_its_maximum_load() {
    // A data sheet's load line "maximum load 750 Ω" means 750 Ω × 20 mA = 15 V available
    // at full scale (Ohm's law). Loop: 250 + 2 × 180/58 = 256.2069 Ω.
    let b = four_wire().budget().unwrap();
    let loop_ohms = 250.0 + 2.0 * one_conductor_ohms(180.0);
    assert_eq!(b.source, Some(SourceKind::CurrentOutput));
    assert_eq!(b.topology, Topology::FourWire);
    assert_eq!(b.driver_min_volts, 0.0, "no lift-off voltage");
    close(b.lowest_supply_volts, 15.0, 1e-12, "compliance");
    // The maximum load at 20 mA is the data sheet's own figure back.
    close(b.max_load_ohms, 750.0, 1e-9, "max load");
    close(b.spare_ohms, 750.0 - loop_ohms, 1e-9, "spare");
    // At 20 mA the loads take 0.020 × 256.2069 = 5.1241 V: 9.8759 V of compliance left.
    close(
        b.at_full_scale.headroom_volts,
        15.0 - 0.020 * loop_ohms,
        1e-9,
        "headroom at 20 mA",
    );
    // At the default 22 mA: 15 − 0.022 × 256.2069 = 9.3635 V.
    close(
        b.at_fault.headroom_volts,
        15.0 - 0.022 * loop_ohms,
        1e-9,
        "headroom at 22 mA",
    );
    // Longest cable at 20 mA: (750 − 250) Ω / (2/58 Ω per metre) = 14 500 m.
    close(b.max_cable_m.unwrap(), 500.0 * 29.0, 1e-6, "longest cable");
    assert!(b.ok);
    // The compliance is not sagged even if a sag was typed for some supply.
    let mut sagged = four_wire();
    sagged.supply_tolerance_percent = 10.0;
    close(
        sagged.budget().unwrap().lowest_supply_volts,
        15.0,
        1e-12,
        "no sag",
    );
}

/// FV-315-like: an analog output with 18 V compliance driving a positioner that drops
/// 9 V at 20 mA, 250 m of 1.0 mm² pair.
fn output_loop() -> LoopConfig {
    let mut c = LoopConfig::current_output(Device::AnalogOutput, Compliance::Volts { volts: 18.0 });
    c.elements.push(SeriesElement::drop("positioner", 9.0));
    c.cable = cable_1mm2(250.0);
    c
}

#[test]
fn analog_output_driving_a_positioner() {
    // KVL at 20 mA: 18 − 9 − 0.020 × (2 × 250/58) = 8.8276 V of compliance left.
    let b = output_loop().budget().unwrap();
    let cable = 2.0 * one_conductor_ohms(250.0);
    assert_eq!(b.topology, Topology::AnalogOutput);
    close(
        b.at_full_scale.headroom_volts,
        18.0 - 9.0 - 0.020 * cable,
        1e-9,
        "headroom at 20 mA",
    );
    // Max load: what the compliance leaves after the positioner's drop, over 20 mA:
    // (18 − 9) / 0.020 = 450 Ω.
    close(b.max_load_ohms, 450.0, 1e-9, "max load");
    close(b.spare_ohms, 450.0 - cable, 1e-9, "spare");
    assert!(b.ok);
    assert!(words::verdict(&b).starts_with("enough voltage"));
}

#[test]
fn an_i_p_converter_entered_as_its_input_resistance() {
    // An I/P converter of 240 Ω input resistance on the same output: 0.020 × 240 = 4.8 V
    // at 20 mA and 0.022 × 240 = 5.28 V at 22 mA (Ohm's law).
    let mut c = LoopConfig::current_output(Device::AnalogOutput, Compliance::Volts { volts: 18.0 });
    c.elements.push(SeriesElement::ohms("I/P converter", 240.0));
    let b = c.budget().unwrap();
    close(b.at_full_scale.headroom_volts, 18.0 - 4.8, 1e-9, "20 mA");
    close(b.at_fault.headroom_volts, 18.0 - 5.28, 1e-9, "22 mA");
}

#[test]
fn split_range_sums_both_positioners_and_runs_short() {
    // Two positioners of 9 V each on one 18 V output, plus 250 m of cable: the drops sum
    // to 18 + 0.020 × 8.6207 = 18.1724 V at 20 mA, so 0.1724 V short (KVL).
    let mut c = output_loop();
    c.elements[0].name = "positioner A".to_string();
    c.elements.push(SeriesElement::drop("positioner B", 9.0));
    let b = c.budget().unwrap();
    let cable = 2.0 * one_conductor_ohms(250.0);
    close(
        b.at_full_scale.headroom_volts,
        -(0.020 * cable),
        1e-9,
        "short at 20 mA",
    );
    assert!(!b.ok && !b.ok_full_scale && !b.ok_fault);
    let BudgetLimit::Short {
        short_volts,
        min_supply_volts,
        ..
    } = b.limit
    else {
        panic!("{:?}", b.limit)
    };
    // The verdict is given at 22 mA: short by 0.022 × 8.6207 = 0.1897 V, and the output
    // needs 18 + 0.1897 V of compliance there.
    close(short_volts, 0.022 * cable, 1e-9, "short at 22 mA");
    close(
        min_supply_volts,
        18.0 + 0.022 * cable,
        1e-9,
        "compliance needed",
    );
    let text = words::verdict(&b);
    assert!(
        text.contains("current source with at least 18.19 V of compliance"),
        "{text}"
    );
    assert!(!text.contains("supply"), "{text}");
}

#[test]
fn three_wire_counts_its_own_current_in_the_supply_conductor() {
    // Supply 24 V, the transmitter needs 12 V between its supply and signal terminals,
    // it draws 3 mA itself; a 250 Ω receiver; 300 m of 1.0 mm² (Rc = 300/58 Ω a
    // conductor). The signal leaves on the supply conductor with the transmitter's own
    // current and returns through the receiver; KVL at the signal current I:
    // V = 24 − (I + 0.003)·Rc − I·(Rc + 250).
    let mut c = LoopConfig::new(24.0, 12.0);
    c.wiring = Wiring {
        device: Device::ThreeWire { own_ma: 3.0 },
        ..Topology::ThreeWire.wiring()
    };
    c.elements.push(SeriesElement::ohms("receiver", 250.0));
    c.cable = cable_1mm2(300.0);
    let b = c.budget().unwrap();
    let rc = one_conductor_ohms(300.0);
    let at = |i: f64| 24.0 - (i + 0.003) * rc - i * (rc + 250.0);
    assert_eq!(b.topology, Topology::ThreeWire);
    close(b.at_full_scale.terminal_volts, at(0.020), 1e-9, "20 mA");
    close(b.at_fault.terminal_volts, at(0.022), 1e-9, "22 mA");
    close(
        b.at_full_scale.headroom_volts,
        at(0.020) - 12.0,
        1e-9,
        "headroom",
    );
    // Longest cable at 20 mA: 24 − 12 − 0.020 × 250 = 7 V over (2 × 0.020 + 0.003) A
    // through 1/58 Ω per metre: 7 × 58 / 0.043 = 9441.86 m.
    close(
        b.max_cable_m.unwrap(),
        7.0 * 58.0 / 0.043,
        1e-6,
        "longest cable",
    );
    // With no own current given, the figures are the two-wire ones.
    let mut plain = c.clone();
    plain.wiring.device = Device::ThreeWire { own_ma: 0.0 };
    let mut two_wire = c.clone();
    two_wire.wiring = Wiring::default();
    close(
        plain.budget().unwrap().at_fault.headroom_volts,
        two_wire.budget().unwrap().at_fault.headroom_volts,
        1e-12,
        "own current 0",
    );
}

#[test]
fn an_isolator_is_budgeted_side_by_side() {
    // PT-208-like. Input side: the isolator powers the transmitter with 16.5 V (an active
    // input), the transmitter needs 10.5 V, 60 m of 1.0 mm²; at 22 mA:
    // 16.5 − 0.022 × 2 × 60/58 − 10.5 = 5.9545 V. Output side: the isolator drives
    // at most 600 Ω (12 V at 20 mA) into a 250 Ω PLC input: 12 − 0.022 × 250 = 6.5 V.
    let mut input = LoopConfig::new(16.5, 10.5);
    input.wiring = Topology::TwoWireActiveInput.wiring();
    input.cable = cable_1mm2(60.0);
    let mut output =
        LoopConfig::current_output(Device::AnalogOutput, Compliance::MaxLoad { ohms: 600.0 });
    output
        .elements
        .push(SeriesElement::ohms("PLC input", 250.0));
    let isolated = IsolatedLoop {
        input,
        outputs: vec![output.clone()],
    };
    let b = isolated.budget().unwrap();
    close(
        b.input.at_fault.headroom_volts,
        16.5 - 0.022 * 2.0 * one_conductor_ohms(60.0) - 10.5,
        1e-9,
        "input side",
    );
    close(
        b.outputs[0].at_fault.headroom_volts,
        6.5,
        1e-9,
        "output side",
    );
    assert!(b.ok);
    // A second output side into a 750 Ω recorder input is too much for 12 V at 20 mA:
    // that side fails, the first does not, and the loop is not ok.
    let mut recorder = output.clone();
    recorder.elements = vec![SeriesElement::ohms("recorder", 750.0)];
    let two = IsolatedLoop {
        outputs: vec![output, recorder],
        ..isolated.clone()
    };
    let b = two.budget().unwrap();
    assert!(b.outputs[0].ok && !b.outputs[1].ok && !b.ok);
    // An output side given as a supply is refused, naming the side.
    let wrong = IsolatedLoop {
        outputs: vec![LoopConfig::new(24.0, 10.5)],
        ..isolated
    };
    assert_eq!(wrong.budget().unwrap_err().field, "output side 1");
}

#[test]
fn two_sources_in_one_loop_is_a_typed_fault_never_ok() {
    // An active input card with an external 24 V supply in the loop as well.
    let mut c = LoopConfig::new(24.0, 10.5);
    c.wiring.active_input = true;
    c.elements.push(SeriesElement::ohms("card input", 250.0));
    let b = c.budget().unwrap();
    assert_eq!(
        b.topology_fault,
        Some(TopologyFault::TwoSources {
            sources: vec![SourceKind::ActiveInput, SourceKind::Supply]
        })
    );
    assert_eq!(b.source, None);
    assert_eq!(b.topology, Topology::Faulty);
    assert!(!b.ok && !b.ok_full_scale && !b.ok_fault);
    assert!(matches!(b.limit, BudgetLimit::Topology { .. }));
    let text = words::verdict(&b);
    assert!(text.starts_with("two sources in one loop"), "{text}");
    assert!(
        text.contains("an input card that powers the loop and a DC supply"),
        "{text}"
    );
    // A four-wire output into an active input.
    let mut c = four_wire();
    c.wiring.active_input = true;
    c.supply_volts = 24.0;
    let b = c.budget().unwrap();
    assert_eq!(
        b.topology_fault.as_ref().map(|f| f.code()),
        Some("two-sources")
    );
    assert!(!b.ok);
}

#[test]
fn no_source_works_from_zero_volts_and_says_so() {
    // A two-wire transmitter into a passive input with nothing to power it: 0 V, so the
    // transmitter is 10.5 V short at every current, and the verdict names the fault.
    let mut c = LoopConfig::new(0.0, 10.5);
    c.wiring.supply = false;
    let b = c.budget().unwrap();
    assert_eq!(b.topology_fault, Some(TopologyFault::NoSource));
    close(b.at_full_scale.headroom_volts, -10.5, 1e-12, "no volts");
    assert!(!b.ok);
    assert!(words::verdict(&b).starts_with("nothing supplies this loop"));
}

#[test]
fn a_current_source_without_compliance_names_the_field() {
    let mut c = LoopConfig::new(0.0, 0.0);
    c.wiring = Topology::AnalogOutput.wiring();
    let e = c.budget().unwrap_err();
    assert_eq!(e.field, "compliance_volts");
    assert!(e.reason.contains("0 to 1000 V"), "{e}");
    c.compliance = Some(Compliance::MaxLoad { ohms: -5.0 });
    assert_eq!(c.budget().unwrap_err().field, "max_load_ohms");
    // Compliance given for a supplied loop is refused, not ignored.
    let mut s = LoopConfig::new(24.0, 10.5);
    s.compliance = Some(Compliance::Volts { volts: 18.0 });
    assert_eq!(s.budget().unwrap_err().field, "compliance_volts");
}

#[test]
fn hart_time_constant_as_a_level_switch_manual_works_it() {
    // Published worked example (a HART level switch's instruction manual, "selecting the
    // cable"): 250 Ω sensing resistor, cable 0.0736 Ω/m and 0.1 nF/m, 100 m, a 68 nF
    // device: t = (250 + 7.36) Ω × (68 + 10) nF = 20 µs, within 65 µs.
    let t = hart::time_constant_s(250.0, 0.0736, 68e-9, 0.1e-9, 100.0);
    close(t * 1e6, 20.07, 0.01, "time constant, µs");
    // Same manual: a 280 Ω barrier, 250 Ω and 7.36 Ω of cable: C ≤ 65 µs / 537.36 Ω =
    // 121 nF in all.
    close(
        hart::MAX_TIME_CONSTANT_S / 537.36 * 1e9,
        121.0,
        0.5,
        "capacitance allowed, nF",
    );
}

#[test]
fn hart_longest_cable_from_the_published_allowance() {
    // A transmitter manual's HART section: a 250 Ω host load and no other resistance
    // allow 65 µs / 250 Ω = 0.26 µF; less 0.01 µF for the host and the field device,
    // 0.25 µF of cable, which at 200 pF/m is 1250 m (published: "0.25 uF").
    let l = hart::max_cable_m(250.0, 0.0, 10e-9, 200e-12).unwrap();
    close(l, 1250.0, 1e-6, "longest cable");
    // With the cable's own resistance counted the limit is shorter, and the time
    // constant at that length is exactly 65 µs.
    let per_m = 2.0 / 58.0;
    let l2 = hart::max_cable_m(250.0, per_m, 10e-9, 200e-12).unwrap();
    assert!(l2 < l);
    close(
        hart::time_constant_s(250.0, per_m, 10e-9, 200e-12, l2),
        65e-6,
        1e-15,
        "τ at the limit",
    );
}

#[test]
fn hart_or_voltage_says_which_limit_binds() {
    // LT-101: 24 V, 10.5 V, 250 Ω, 1.0 mm² pair of 100 pF/m, devices 10 nF by default.
    // Voltage allows 10 545 m at 22 mA; HART far less: HART binds.
    let mut c = LoopConfig::new(24.0, 10.5);
    c.elements.push(SeriesElement::ohms("PLC input", 250.0));
    c.cable = cable_1mm2(180.0);
    c.hart_cable = Some(HartCable {
        cable_pf_per_m: 100.0,
        devices_nf: None,
    });
    let b = c.budget().unwrap();
    let h = b.hart_cable.clone().unwrap();
    assert!(h.devices_is_default);
    let expected = hart::max_cable_m(250.0, 2.0 / 58.0, 10e-9, 100e-12).unwrap();
    close(h.max_cable_m.unwrap(), expected, 1e-9, "HART longest cable");
    // Without the cable's resistance the published formula gives
    // 65e6 / (250 × 100) − 10 000 / 100 = 2500 m; the cable's 2/58 Ω/m shortens it. By
    // the quadratic formula on (250 + L/29)(10 nF + 0.1 nF·L) = 65 µs, worked by hand:
    // a = 3.44828e-12, b = 2.534483e-8, c = −62.5e-6 → L = 1949.1 m.
    close(expected, 1949.1, 0.1, "HART longest cable by hand");
    assert_eq!(h.binding, Some(Binding::Hart));
    // RC with the 180 m as entered: (250 + 360/58) × (10 nF + 18 nF) = 7.17 µs.
    close(
        h.time_constant_s.unwrap(),
        (250.0 + 360.0 / 58.0) * 28e-9,
        1e-15,
        "τ",
    );
    // A loop starved of volts: the voltage budget binds.
    let mut tight = c.clone();
    tight.supply_volts = 16.0;
    let b = tight.budget().unwrap();
    assert_eq!(b.hart_cable.unwrap().binding, Some(Binding::Voltage));
    // The figure's field is named when out of range.
    let mut bad = c;
    bad.hart_cable = Some(HartCable {
        cable_pf_per_m: 0.0,
        devices_nf: None,
    });
    assert_eq!(bad.budget().unwrap_err().field, "cable_pf_per_m");
}

/// Every wiring the budget knows, faults included.
fn wirings() -> Vec<Wiring> {
    let mut out: Vec<Wiring> = Topology::ALL.iter().map(|t| t.wiring()).collect();
    out.push(Wiring {
        device: Device::ThreeWire { own_ma: 4.0 },
        ..Topology::ThreeWire.wiring()
    });
    out.push(Wiring {
        active_input: true,
        ..Wiring::default()
    });
    out.push(Wiring {
        supply: false,
        ..Wiring::default()
    });
    out.push(Wiring {
        active_input: true,
        ..Topology::FourWire.wiring()
    });
    out
}

fn config(
    wiring: Wiring,
    volts: f64,
    tx_min: f64,
    ohms: f64,
    drop: f64,
    cable_m: f64,
) -> LoopConfig {
    let mut c = LoopConfig::new(volts, tx_min);
    c.wiring = wiring;
    if wiring.device.is_current_source() {
        c.compliance = Some(Compliance::Volts { volts });
    }
    c.elements.push(SeriesElement::ohms("input", ohms));
    c.elements.push(SeriesElement::drop("indicator", drop));
    c.cable = cable_1mm2(cable_m);
    c
}

proptest! {
    // For every topology: a resistance added in series never increases the headroom, at
    // 20 mA or at the fault current (Ohm's law: it can only take volts).
    #[test]
    fn adding_series_resistance_never_increases_headroom(
        which in 0usize..8,
        volts in 1.0f64..60.0,
        tx_min in 0.0f64..20.0,
        ohms in 0.0f64..2000.0,
        drop in 0.0f64..10.0,
        cable_m in 0.0f64..3000.0,
        added in 0.0f64..2000.0,
        fault_ma in 20.0f64..30.0,
    ) {
        let w = wirings()[which];
        let mut c = config(w, volts, tx_min, ohms, drop, cable_m);
        c.fault_ma = Some(fault_ma);
        let before = c.budget().unwrap();
        c.elements.push(SeriesElement::ohms("added", added));
        let after = c.budget().unwrap();
        prop_assert!(after.at_full_scale.headroom_volts <= before.at_full_scale.headroom_volts + 1e-9);
        prop_assert!(after.at_fault.headroom_volts <= before.at_fault.headroom_volts + 1e-9);
        prop_assert!(after.spare_ohms <= before.spare_ohms + 1e-9);
        prop_assert!(!after.ok || before.ok, "adding a resistance cannot make a loop good");
    }

    // For every topology: the verdict at the fault current is never better than at
    // 20 mA, since every drop grows (or stays) with the current.
    #[test]
    fn the_fault_current_is_never_better_than_20_ma(
        which in 0usize..8,
        volts in 0.5f64..60.0,
        tx_min in 0.0f64..20.0,
        ohms in 0.0f64..2000.0,
        drop in 0.0f64..10.0,
        cable_m in 0.0f64..3000.0,
        fault_ma in 20.0f64..30.0,
    ) {
        let mut c = config(wirings()[which], volts, tx_min, ohms, drop, cable_m);
        c.fault_ma = Some(fault_ma);
        let b = c.budget().unwrap();
        prop_assert!(b.at_fault.headroom_volts <= b.at_full_scale.headroom_volts + 1e-9);
        prop_assert!(!b.ok_fault || b.ok_full_scale);
        prop_assert!(b.ok == (b.ok_full_scale && b.ok_fault));
        prop_assert!(b.max_load_fault_ohms <= b.max_load_ohms + 1e-9);
        if b.topology_fault.is_some() {
            prop_assert!(!b.ok);
        }
    }
}
