//! Intrinsic safety by the entity concept, checked against worked examples published in
//! instrument manuals. Each reference value names its source beside it:
//!
//! - [RA-6.5.3] Rockwell Automation, "FLEX Ex HART Analog Modules User Manual",
//!   publication 1797-6.5.3 (March 2006), chapter 6, p. 6-6 "Intrinsic Safety Entity
//!   Verification": a pressure-to-current transmitter on a 1797-IE8H input, 10 m of
//!   cable, group IIC (as published at
//!   azmanual.top/manuals/580535/…1797-ie8h-flex-ex-hart-analog-modules-user-manual.html?page=104).
//! - [EH-P53] Endress+Hauser, "Proline Promag 53 FOUNDATION Fieldbus" operating
//!   instructions, "Technical safety considerations" worked for a bus segment on an MTL 5053
//!   bus power supply (pp. 23–26: Tab. 5 "External connection values", the cable on p. 24,
//!   Step 2 on p. 25 and Tab. 6 "Safety considerations (example)" on p. 26; the same
//!   manual's FISCO example on p. 30), as published at
//!   easymanua.ls/endressplushauser/proline-promag-53/manual/673251 (pages 59–62, 66).
//! - [RA-5.6] Rockwell Automation, "FLEX Ex I/O 24V DC 4 Non-Isolated Source Output
//!   Module", publication 1797-5.6 (June 2011), p. 20: the 1 % rule as the conditions of
//!   use state it (Lo and Co in full where the total Li or the total Ci, the cable not
//!   counted, is < 1 % of Lo or Co; reduced to 50 % where both are ≥ 1 %; the reduced
//!   capacitance, cable included, not above 1 µF for IIB and IIA and 600 nF for IIC), as
//!   published at azmanual.top/manuals/580084/…?page=20.
//! - [CM-S506] Compur Monitors, "Statox 506" operating manual, 3.2 "Electrical
//!   Connection", p. 6: the longest cable l_max = (Co − Ci) / C_L, worked for a repeater
//!   with Co = 705 nF, a sensor head with Ci = 24 nF and LiYCY 0.75 mm² cable of
//!   150 nF/km: l_max = 4540 m (as published at
//!   easymanua.ls/compur-monitors/statox-506/manual?p=6).
//! - [AM-3041] Ampac, "Orbis IS" fire detection installation manual MAN3041-1, p. 21,
//!   section 11 "Wiring and cable types": "The capacitance and either the inductance or
//!   the inductance to resistance (L/R) ratio of the hazardous area cables must not exceed
//!   the parameters specified in Table 4" (the L/R route, as a barrier's conditions of use
//!   state it); Table 4 for the barrier, IIC: 0.083 µF, 4.2 mH, 55 µH/Ω; Table 5 for a
//!   two-core 1.5 mm² mineral-insulated light-duty cable: 12.1 Ω/km per core, 0.534 mH/km,
//!   0.19 µF/km core to core and 0.21 µF/km core to sheath; and "All Orbis IS devices have
//!   zero equivalent capacitance and inductance" (as published at
//!   manualshive.com/en/manual/halma/ampac-orbis-is-orb-op-52027-apo/3371377?page=21).
//!
//! Both worked examples predate, or do not apply, the 1 % rule: their arithmetic compares
//! the sums with the full Co and Lo. loopside applies the rule, so where it changes an
//! answer the test says so and checks both: the sums against the manual, the verdict
//! against the rule.
//!
//! What no published source was found for (kept hand-worked in tests/intrinsic_entity.rs
//! and said so there): a whole circuit failing on capacitance because of the cable alone
//! ([CM-S506] publishes the capacitance limit only, checked below). The voltage failure
//! below combines two parameter sets the same manual publishes; the combination itself is
//! ours, not the manual's. The L/R route is checked on [AM-3041]'s published limits and
//! cable data; the manual states the rule and the figures but works no length itself, so
//! the lengths and sums there are ours (worked by hand beside each).

use loopside::intrinsic::{
    check, Cable, CableLimit, Check, CheckName, Circuit, Compared, Device, DeviceKind, GasGroup,
    Source, Verdict,
};

const NF: f64 = 1e-9;
const PF: f64 = 1e-12;
const UH: f64 = 1e-6;
const MH: f64 = 1e-3;

fn entity(name: &str, ui: f64, ii_ma: f64, pi: f64, ci_nf: f64, li_uh: f64) -> Device {
    Device {
        name: name.into(),
        certificate: String::new(),
        kind: DeviceKind::Entity {
            ui_volts: ui,
            ii_ma,
            pi_watts: pi,
            group: Some(GasGroup::IIC),
            t_class: None,
        },
        ci_farads: ci_nf * NF,
        li_henries: li_uh * UH,
        temporary: false,
    }
}

fn find<'a>(v: &'a Verdict, name: CheckName, device: Option<&str>) -> &'a Check {
    v.checks
        .iter()
        .find(|c| c.name == name && (device.is_none() || c.device.as_deref() == device))
        .expect("check present")
}

fn numbers(c: &Check) -> (f64, f64, f64) {
    match c.compared {
        Compared::Numbers {
            source,
            field,
            margin,
            ..
        } => (source, field, margin),
        _ => panic!("numeric check expected"),
    }
}

fn close(a: f64, b: f64, tol: f64, what: &str) {
    assert!((a - b).abs() <= tol, "{what}: {a} vs {b}");
}

// ---------------------------------------------------------------------------------------
// [RA-6.5.3]: a transmitter on an analog input module, 10 m of cable: passes.
// ---------------------------------------------------------------------------------------

/// The manual's example gives U, I, C and L only (the North American entity form): no Po
/// and no Pi. loopside needs both, so the same value is put on each side here; equal
/// values pass with 0 margin whatever the value, leaving every other result as the
/// manual's numbers make it. This is not a value from the manual.
const POWER_NOT_GIVEN_W: f64 = 1.0;

fn ra_example() -> Circuit {
    Circuit {
        source: Source {
            name: "1797-IE8H input channel".into(),
            certificate: String::new(),
            uo_volts: 24.4, // [RA-6.5.3] Uo < 24.4 V
            io_ma: 92.5,    // [RA-6.5.3] Io < 92.5 mA
            po_watts: POWER_NOT_GIVEN_W,
            co_farads: 119.0 * NF, // [RA-6.5.3] Ca = 119 nF (IIC)
            lo_henries: 4.0 * MH,  // [RA-6.5.3] La = 4 mH (IIC)
            lo_ro_henries_per_ohm: None,
            group: Some(GasGroup::IIC), // [RA-6.5.3] "EEx ia/ib IIB/IIC", checked for IIC
        },
        // [RA-6.5.3] P/I transmitter EEx ia IIC T4: Ui = 30 V, Ii = 165 mA, Ci = 22.5 nF,
        // Li = 730 µH.
        devices: vec![entity(
            "P/I transmitter",
            30.0,
            165.0,
            POWER_NOT_GIVEN_W,
            22.5,
            730.0,
        )],
        // [RA-6.5.3] cable: Ci < 10 pF/m, Li < 0.5 µH/m, 10 m.
        cable: Cable {
            length_m: 10.0,
            farads_per_m: Some(10.0 * PF),
            henries_per_m: Some(0.5 * UH),
            lr_henries_per_ohm: None,
        },
        area_group: GasGroup::IIC, // [RA-6.5.3] "for a IIC gas application"
        area_t_class: None,
    }
}

#[test]
fn a_transmitter_on_10_m_of_cable_passes_as_the_module_manual_works_it() {
    let v = check(&ra_example()).unwrap();
    // [RA-6.5.3] "Total Loop": Ci = 22.6 nF, Li = 735 µH.
    close(v.c_total_farads, 22.6 * NF, 1e-15, "total C");
    close(v.l_total_henries, 735.0 * UH, 1e-12, "total L");
    // [RA-6.5.3] Ui = 30 V ≥ Uo 24.4 V; Ii = 165 mA ≥ Io 92.5 mA.
    let (uo, ui, m) = numbers(find(&v, CheckName::Voltage, None));
    assert_eq!((uo, ui), (24.4, 30.0));
    close(m, 5.6, 1e-12, "V margin");
    let (io, ii, m) = numbers(find(&v, CheckName::Current, None));
    assert_eq!((io, ii), (92.5, 165.0));
    close(m, 72.5, 1e-12, "I margin");
    // [RA-6.5.3] "the loop is acceptable".
    assert!(v.ok);
    // The 1 % rule [RA-5.6] applies here (Ci 22.5 nF ≥ 1 % of 119 nF = 1.19 nF and Li
    // 730 µH ≥ 1 % of 4 mH = 40 µH), which the manual's arithmetic does not show; with
    // half of Co and Lo the loop still passes (worked by hand): 59.5 nF − 22.6 nF =
    // 36.9 nF left, 2 mH − 0.735 mH = 1.265 mH left.
    assert!(v.halved);
    close(v.co_allowed_farads, 59.5 * NF, 1e-15, "halved Co");
    close(v.lo_allowed_henries, 2.0 * MH, 1e-12, "halved Lo");
    close(
        numbers(find(&v, CheckName::Capacitance, None)).2,
        36.9 * NF,
        1e-15,
        "C margin",
    );
    close(
        numbers(find(&v, CheckName::Inductance, None)).2,
        1.265 * MH,
        1e-12,
        "L margin",
    );
    // Longest cable (by hand): C (59.5 − 22.5) nF / 10 pF/m = 3700 m; L (2 − 0.73) mH /
    // 0.5 µH/m = 2540 m → 2540 m, set by inductance.
    match v.max_cable {
        CableLimit::Metres { metres, by } => {
            close(metres, 2540.0, 1e-6, "longest cable");
            assert_eq!(by, CheckName::Inductance);
        }
        other => panic!("{other:?}"),
    }
}

// ---------------------------------------------------------------------------------------
// [EH-P53]: a fieldbus segment of four devices on an entity bus supply.
// ---------------------------------------------------------------------------------------

/// [EH-P53] Bus cable: C' = 82 nF/km between the wires, C'LS = 147 nF/km wire to shield,
/// taken as C'eff = C' + 0.5 × C'LS = 155.5 nF/km (the manual's formula, p. 24);
/// L' = 623 µH/km; R' = 24 Ω/km loop resistance.
fn eh_cable(length_m: f64) -> Cable {
    Cable {
        length_m,
        farads_per_m: Some((82.0 + 0.5 * 147.0) * PF),
        henries_per_m: Some(0.623 * UH),
        // L'/R' = 623 µH/km / 24 Ω/km = 25.96 µH/Ω (worked from the manual's values).
        lr_henries_per_ohm: Some(623.0 / 24.0 * UH),
    }
}

fn eh_example(length_m: f64) -> Circuit {
    Circuit {
        // [EH-P53] Bus power supply MTL 5053: Uo = 22 V, Io = 216 mA, Po = 1.2 W; Tab. 5,
        // IIC: Co = 0.165 µF, Lo = 0.32 mH, L/R = 31 µH/Ω.
        source: Source {
            name: "MTL 5053 bus power supply".into(),
            certificate: String::new(),
            uo_volts: 22.0,
            io_ma: 216.0,
            po_watts: 1.2,
            co_farads: 165.0 * NF,
            lo_henries: 0.32 * MH,
            lo_ro_henries_per_ohm: Some(31.0 * UH),
            group: Some(GasGroup::IIC),
        },
        // [EH-P53] two Promag 53 (Ui 30 V, Ii 500 mA, Pi 5.5 W, Li 10 µH, Ci 5 nF) and two
        // Cerabar S, entity values (Ui 24 V, Ii 250 mA, Pi 1.2 W, Li 10 µH, Ci 5 nF). The
        // bus termination (Ui 30 V, Pi 1.2 W, Ci negligible) is left out: the manual gives
        // it no Ii and nothing that adds to the sums.
        devices: vec![
            entity("Promag 53 (1)", 30.0, 500.0, 5.5, 5.0, 10.0),
            entity("Promag 53 (2)", 30.0, 500.0, 5.5, 5.0, 10.0),
            entity("Cerabar S (1)", 24.0, 250.0, 1.2, 5.0, 10.0),
            entity("Cerabar S (2)", 24.0, 250.0, 1.2, 5.0, 10.0),
        ],
        cable: eh_cable(length_m),
        area_group: GasGroup::IIC, // [EH-P53] "can be used for gases in explosion group IIC"
        area_t_class: None,
    }
}

#[test]
fn a_fieldbus_segment_on_615_m_fails_on_inductance_as_the_flowmeter_manual_finds() {
    // [EH-P53] L_SEG = 580 m main line + 35 m of spurs = 615 m.
    let v = check(&eh_example(615.0)).unwrap();
    // [EH-P53] C'eff/cable = 155.5 nF/km × 0.615 km = 95.6 nF; L'eff/cable = 623 µH/km ×
    // 0.615 km = 383.1 µH; Ceff = 4 × 5 nF + 95.6 nF = 115.6 nF; Leff = 4 × 10 µH +
    // 383.1 µH = 423.1 µH (the manual rounds to 0.1).
    close(v.cable_farads, 95.6 * NF, 0.05 * NF, "cable C");
    close(v.cable_henries, 383.1 * UH, 0.05 * UH, "cable L");
    close(v.c_total_farads, 115.6 * NF, 0.05 * NF, "Ceff");
    close(v.l_total_henries, 423.1 * UH, 0.05 * UH, "Leff");
    // [EH-P53] Tab. 6: "Leff = 423.1 µH < perm. inductance for IIC Lo = 320 µH: No" — the
    // segment as drawn is not intrinsically safe; loopside says the same.
    assert!(v.l_total_henries > 320.0 * UH);
    assert!(!v.ok);
    assert!(!find(&v, CheckName::Inductance, None).ok);
    // [EH-P53] Step 2: every device's Ui, Ii, Pi ≥ the supply's Uo, Io, Po; the Cerabar
    // S's Pi = 1.2 W equals Po = 1.2 W and counts as met ("✓ Yes").
    for c in v.checks.iter().filter(|c| {
        matches!(
            c.name,
            CheckName::Voltage | CheckName::Current | CheckName::Power
        )
    }) {
        assert!(c.ok, "{c:?}");
    }
    let (po, pi, m) = numbers(find(&v, CheckName::Power, Some("Cerabar S (1)")));
    assert_eq!((po, pi, m), (1.2, 1.2, 0.0));
    // The manual finds the capacitance met against the full Co ("115.6 nF < 165 nF ✓").
    // Its arithmetic does not apply the 1 % rule [RA-5.6]; here ΣCi = 20 nF ≥ 1.65 nF and
    // ΣLi = 40 µH ≥ 3.2 µH, so only half of Co and Lo may be used: 82.5 nF and 160 µH
    // (worked by hand), and the capacitance fails too.
    assert!(v.c_total_farads <= 165.0 * NF);
    assert!(v.halved && !v.capped);
    close(v.co_allowed_farads, 82.5 * NF, 1e-15, "halved Co");
    close(v.lo_allowed_henries, 160.0 * UH, 1e-12, "halved Lo");
    assert!(!find(&v, CheckName::Capacitance, None).ok);
    // [EH-P53] suggests asking whether the supply's maker allows the L/R ratio instead.
    // The cable's L/R (25.96 µH/Ω, from the manual's L' and R') is within the supply's
    // 31 µH/Ω, but the devices carry 40 µH of lumped Li: loopside keeps the Lo comparison
    // (safe side, see src/intrinsic) and says nothing passes by L/R.
    assert!(!v.lr_route);
    assert!(!v.checks.iter().any(|c| c.name == CheckName::InductanceLr));
}

#[test]
fn the_manuals_remedy_passes_on_full_co_and_lo_but_the_one_percent_rule_fails_it() {
    // [EH-P53] "Reduce the main line by 175 m to 405 m": 405 m + 35 m = 440 m. Worked by
    // hand from the manual's values: L = 40 µH + 0.44 km × 623 µH/km = 314.12 µH ≤ 320 µH;
    // C = 20 nF + 0.44 km × 155.5 nF/km = 88.42 nF ≤ 165 nF: by the manual's arithmetic
    // (full Co and Lo) the segment passes.
    let v = check(&eh_example(440.0)).unwrap();
    close(v.l_total_henries, 314.12 * UH, 1e-10, "L total");
    close(v.c_total_farads, 88.42 * NF, 1e-13, "C total");
    assert!(v.l_total_henries <= 320.0 * UH);
    assert!(v.c_total_farads <= 165.0 * NF);
    // The 1 % rule [RA-5.6] changes the verdict: both ΣCi and ΣLi are ≥ 1 %, so only
    // 82.5 nF and 160 µH may be used and both checks fail (88.42 > 82.5, 314.12 > 160).
    assert!(v.halved);
    assert!(!v.ok);
    close(
        numbers(find(&v, CheckName::Capacitance, None)).2,
        -5.92 * NF,
        1e-13,
        "C margin",
    );
    close(
        numbers(find(&v, CheckName::Inductance, None)).2,
        -154.12 * UH,
        1e-10,
        "L margin",
    );
    // Longest segment under the rule (by hand): L (160 − 40) µH / 0.623 µH/m = 192.6 m;
    // C (82.5 − 20) nF / 155.5 pF/m = 401.9 m → 192.6 m, set by inductance.
    match v.max_cable {
        CableLimit::Metres { metres, by } => {
            close(metres, 120.0 / 0.623, 1e-6, "longest cable");
            assert_eq!(by, CheckName::Inductance);
        }
        other => panic!("{other:?}"),
    }
}

#[test]
fn a_fisco_rated_transmitter_on_the_entity_supply_fails_on_voltage() {
    // Not a published example: the combination is ours, the values are the manual's.
    // [EH-P53] p. 30 gives the Cerabar S's FISCO input values: Ui = 17.5 V, Ii = 500 mA,
    // Pi = 5.5 W, Li = 10 µH, Ci = 5 nF. On the MTL 5053 of the example (Uo = 22 V) its
    // Ui is short by 4.5 V (−25.7 % of 17.5 V): the mix-up a technician makes when the
    // certificate's other column is read. 100 m of the same cable (by hand): C = 5 nF +
    // 15.55 nF = 20.55 nF ≤ 82.5 nF; L = 10 µH + 62.3 µH = 72.3 µH ≤ 160 µH (halved: Ci
    // 5 nF ≥ 1.65 nF and Li 10 µH ≥ 3.2 µH); I 500 ≥ 216 mA; P 5.5 ≥ 1.2 W.
    let mut c = eh_example(100.0);
    c.devices = vec![entity(
        "Cerabar S (FISCO values)",
        17.5,
        500.0,
        5.5,
        5.0,
        10.0,
    )];
    let v = check(&c).unwrap();
    assert!(!v.ok);
    let failed: Vec<CheckName> = v.checks.iter().filter(|c| !c.ok).map(|c| c.name).collect();
    assert_eq!(failed, vec![CheckName::Voltage]);
    let c = find(&v, CheckName::Voltage, None);
    let (uo, ui, m) = numbers(c);
    assert_eq!((uo, ui), (22.0, 17.5));
    close(m, -4.5, 1e-12, "V margin");
    match c.compared {
        Compared::Numbers { margin_percent, .. } => {
            close(margin_percent, -4.5 / 17.5 * 100.0, 1e-9, "V margin %")
        }
        _ => unreachable!(),
    }
}

// ---------------------------------------------------------------------------------------
// [CM-S506]: the longest cable a repeater's Co allows a sensor head; one longer fails.
// ---------------------------------------------------------------------------------------

/// The example gives capacitances only. Everything else is set so that it cannot decide:
/// the same voltage, current and power on both sides (they pass with 0 margin), Lo
/// 10 mH, no Li and a cable with no inductance per metre. With no Li the 1 % rule does not
/// apply; a sensor head with Li of 1 % of Lo or more would halve Co (see src/intrinsic).
/// None of these are values from the manual.
fn cm_example(length_m: f64) -> Circuit {
    Circuit {
        source: Source {
            name: "repeater".into(),
            certificate: String::new(),
            uo_volts: 20.0,
            io_ma: 100.0,
            po_watts: POWER_NOT_GIVEN_W,
            co_farads: 705.0 * NF, // [CM-S506] repeater Co = 705 nF
            lo_henries: 10.0 * MH,
            lo_ro_henries_per_ohm: None,
            group: None,
        },
        // [CM-S506] sensor head Ci = 24 nF.
        devices: vec![entity(
            "sensor head",
            20.0,
            100.0,
            POWER_NOT_GIVEN_W,
            24.0,
            0.0,
        )],
        cable: Cable {
            length_m,
            farads_per_m: Some(150.0 * PF), // [CM-S506] LiYCY 0.75 mm²: C_L = 150 nF/km
            henries_per_m: Some(0.0),
            lr_henries_per_ohm: None,
        },
        area_group: GasGroup::IIB,
        area_t_class: None,
    }
}

#[test]
fn a_sensor_head_cable_longer_than_the_manuals_4540_m_fails_on_capacitance() {
    // [CM-S506] l_max = (705 nF − 24 nF) / 150 nF/km = 4540 m.
    let v = check(&cm_example(1000.0)).unwrap();
    assert!(v.ok && !v.halved);
    match v.max_cable {
        CableLimit::Metres { metres, by } => {
            close(metres, 4540.0, 1e-6, "longest cable");
            assert_eq!(by, CheckName::Capacitance);
        }
        other => panic!("{other:?}"),
    }
    // At 4540 m nothing is left; 100 m more (by hand: 24 nF + 4.64 km × 150 nF/km =
    // 720 nF > 705 nF) fails on capacitance alone, short by 15 nF: the cable did it.
    let at = check(&cm_example(4540.0)).unwrap();
    close(
        numbers(find(&at, CheckName::Capacitance, None)).2,
        0.0,
        1e-15,
        "margin at l_max",
    );
    let v = check(&cm_example(4640.0)).unwrap();
    assert!(!v.ok);
    let failed: Vec<CheckName> = v.checks.iter().filter(|c| !c.ok).map(|c| c.name).collect();
    assert_eq!(failed, vec![CheckName::Capacitance]);
    close(
        numbers(find(&v, CheckName::Capacitance, None)).2,
        -15.0 * NF,
        1e-15,
        "C margin",
    );
}

// ---------------------------------------------------------------------------------------
// [AM-3041]: the L/R route on a barrier's published cable limits and a published cable.
// ---------------------------------------------------------------------------------------

/// [AM-3041] Table 5: 0.534 mH/km; the resistance is 12.1 Ω/km per core, so 24.2 Ω/km for
/// the pair (both cores carry the loop current): L/R = 0.534 mH / 24.2 Ω = 22.07 µH/Ω.
/// Capacitance: the larger of the two published figures, 0.21 µF/km core to sheath
/// (safe side, our choice: the manual does not say which one to count).
fn am_cable(length_m: f64) -> Cable {
    Cable {
        length_m,
        farads_per_m: Some(0.21e-6 / 1000.0),
        henries_per_m: Some(0.534e-3 / 1000.0),
        lr_henries_per_ohm: Some(0.534e-3 / (2.0 * 12.1)),
    }
}

/// The manual publishes the barrier's cable limits, not its Uo, Io and Po, nor the
/// detectors' Ui, Ii and Pi: the same value is put on each side (NOT from the manual), so
/// those checks pass with 0 margin and only the cable decides.
fn am_example(length_m: f64) -> Circuit {
    Circuit {
        source: Source {
            name: "IS barrier".into(),
            certificate: String::new(),
            uo_volts: 24.0,
            io_ma: 100.0,
            po_watts: POWER_NOT_GIVEN_W,
            co_farads: 83.0 * NF, // [AM-3041] Table 4, IIC: 0.083 µF
            lo_henries: 4.2 * MH, // [AM-3041] Table 4, IIC: 4.2 mH
            lo_ro_henries_per_ohm: Some(55.0 * UH), // [AM-3041] Table 4, IIC: 55 µH/Ω
            group: Some(GasGroup::IIC),
        },
        // [AM-3041] "zero equivalent capacitance and inductance".
        devices: vec![entity("detector", 24.0, 100.0, POWER_NOT_GIVEN_W, 0.0, 0.0)],
        cable: am_cable(length_m),
        area_group: GasGroup::IIC,
        area_t_class: None,
    }
}

#[test]
fn a_mineral_insulated_cable_passes_the_barriers_l_over_r_limit_at_any_length() {
    // By hand from [AM-3041]: cable L/R = 0.534 mH/km ÷ 24.2 Ω/km = 22.066 µH/Ω ≤ 55 µH/Ω,
    // margin 32.934 µH/Ω = 59.88 % of Lo/Ro. Read the other way (12.1 Ω of one core only)
    // it would be 44.13 µH/Ω, still within 55 µH/Ω: the verdict does not hang on it.
    let one_core_lr: f64 = 0.534e-3 / 12.1;
    close(one_core_lr, 44.132_231_4 * UH, 1e-12, "L/R on one core's R");
    assert!(one_core_lr <= 55.0 * UH);
    let v = check(&am_example(380.0)).unwrap();
    let lr = find(&v, CheckName::InductanceLr, None);
    assert!(lr.ok);
    let (lo_ro, cable_lr, m) = numbers(lr);
    close(lo_ro, 55.0 * UH, 1e-15, "Lo/Ro");
    close(cable_lr, 22.066_115_7 * UH, 1e-12, "cable L/R");
    close(m, 32.933_884_3 * UH, 1e-12, "L/R margin");
    // 380 m: C = 0.38 km × 0.21 µF/km = 79.8 nF ≤ 83 nF (margin 3.2 nF); L = 0.38 km ×
    // 0.534 mH/km = 0.20292 mH ≤ 4.2 mH, so the Lo comparison passes and decides; the
    // detectors add nothing, so the full Co and Lo are used (1 % rule not met).
    assert!(v.ok && !v.halved);
    assert!(!v.lr_route);
    close(
        numbers(find(&v, CheckName::Capacitance, None)).2,
        3.2 * NF,
        1e-15,
        "C margin",
    );
    close(v.l_total_henries, 0.20292 * MH, 1e-12, "L total");
    // Longest cable, by capacitance: 83 nF / 0.21 µF/km = 395.238 m (the inductance
    // would allow 4.2 / 0.534 = 7865 m, and the L/R route lifts even that).
    match v.max_cable {
        CableLimit::Metres { metres, by } => {
            close(metres, 83.0 / 0.21, 1e-6, "longest cable");
            assert_eq!(by, CheckName::Capacitance);
        }
        other => panic!("{other:?}"),
    }
}

#[test]
fn past_the_inductance_limit_the_l_over_r_route_decides_the_inductance_but_not_the_capacitance() {
    // [AM-3041]: "the capacitance and EITHER the inductance OR the L/R ratio". At 8 km (by
    // hand): L = 8 × 0.534 mH = 4.272 mH > 4.2 mH, so the Lo comparison fails; the cable's
    // L/R (22.07 µH/Ω ≤ 55 µH/Ω) passes and decides instead. The capacitance still counts:
    // 8 × 0.21 µF = 1.68 µF > 0.083 µF, and the circuit fails on it alone.
    let v = check(&am_example(8000.0)).unwrap();
    assert!(v.lr_route);
    let lo = find(&v, CheckName::Inductance, None);
    assert!(!lo.ok && !lo.decides);
    close(numbers(lo).2, -0.072 * MH, 1e-12, "Lo margin");
    let lr = find(&v, CheckName::InductanceLr, None);
    assert!(lr.ok && lr.decides);
    assert!(!v.ok);
    let failed: Vec<CheckName> = v
        .checks
        .iter()
        .filter(|c| !c.ok && c.decides)
        .map(|c| c.name)
        .collect();
    assert_eq!(failed, vec![CheckName::Capacitance]);
    close(v.cable_farads, 1680.0 * NF, 1e-12, "cable C");
}
