//! `loopside budget` for every topology, as a technician would type it. Expected values
//! are worked by Kirchhoff's voltage law and Ohm's law beside each check (the same
//! loops as tests/topology_budget.rs), copper at 1/58 Ω·mm²/m at 20 °C (IEC 60028).

mod util;

use util::{close, loopside_json, loopside_refuses};

fn num(j: &serde_json::Value, key: &str) -> f64 {
    j[key]
        .as_f64()
        .unwrap_or_else(|| panic!("no number {key} in {j}"))
}

#[test]
fn todays_loop_keeps_its_keys_and_says_its_source() {
    // 24 V, 10.5 V, 250 Ω: at 20 mA 24 − 5 − 10.5 = 8.5 V; max load 675 Ω (common
    // practice).
    let j = loopside_json(&[
        "budget",
        "--supply",
        "24",
        "--min-volts",
        "10,5",
        "--load",
        "250",
        "--json",
    ]);
    close(num(&j, "headroom_volts"), 8.5, 1e-9, "headroom");
    close(
        num(&j, "headroom_fault_volts"),
        24.0 - 5.5 - 10.5,
        1e-9,
        "fault",
    );
    close(num(&j, "max_load_ohms"), 675.0, 1e-9, "max load");
    close(num(&j, "spare_ohms"), 425.0, 1e-9, "spare");
    assert_eq!(j["ok"], true);
    assert_eq!(j["source"], "supply");
    assert!(j.get("topology_fault").is_none(), "{j}");
    assert!(j.get("hart_max_cable_m").is_none(), "{j}");
}

#[test]
fn an_analog_output_by_its_compliance() {
    // 18 V output, positioner 9 V, 250 m of 1.0 mm²: 18 − 9 − 0.020 × 500/58 = 8.8276 V.
    let j = loopside_json(&[
        "budget",
        "--source",
        "current-output",
        "--compliance-volts",
        "18",
        "--drop",
        "positioner=9",
        "--cable-m",
        "250",
        "--mm2",
        "1,0",
        "--json",
    ]);
    assert_eq!(j["source"], "current-output");
    assert_eq!(j["topology"], "analog-output");
    close(
        num(&j, "headroom_volts"),
        9.0 - 0.020 * 500.0 / 58.0,
        1e-9,
        "20 mA",
    );
    close(
        num(&j, "headroom_fault_volts"),
        9.0 - 0.022 * 500.0 / 58.0,
        1e-9,
        "22 mA",
    );
    close(num(&j, "max_load_ohms"), 450.0, 1e-9, "(18 − 9) / 0.020");
    close(num(&j, "spare_ohms"), 450.0 - 500.0 / 58.0, 1e-9, "spare");
    assert_eq!(j["ok"], true);
}

#[test]
fn a_split_range_pair_on_one_output_runs_short() {
    // Two 9 V positioners on one 18 V output and 250 m of cable: short by 0.022 × 8.62 Ω
    // = 0.19 V at 22 mA (KVL).
    let j = loopside_json(&[
        "budget",
        "--source",
        "current-output",
        "--compliance-volts",
        "18",
        "--drop",
        "TV-418A positioner=9",
        "--drop",
        "TV-418B positioner=9",
        "--cable-m",
        "250",
        "--mm2",
        "1,0",
        "--json",
    ]);
    assert_eq!(j["ok"], false);
    close(
        num(&j, "headroom_fault_volts"),
        -0.022 * 500.0 / 58.0,
        1e-9,
        "short",
    );
    let limit = j["limit"].as_str().unwrap();
    assert!(limit.contains("compliance"), "{limit}");
}

#[test]
fn a_four_wire_transmitter_by_its_maximum_load() {
    // Max load 750 Ω into 250 Ω: 15 − 5 = 10 V at 20 mA, 15 − 5.5 = 9.5 V at 22 mA.
    let j = loopside_json(&[
        "budget",
        "--topology",
        "four-wire",
        "--max-load-ohms",
        "750",
        "--load",
        "PLC input=250",
        "--json",
    ]);
    assert_eq!(j["topology"], "four-wire");
    assert_eq!(j["source"], "current-output");
    close(num(&j, "headroom_volts"), 10.0, 1e-9, "20 mA");
    close(num(&j, "headroom_fault_volts"), 9.5, 1e-9, "22 mA");
    close(
        num(&j, "max_load_ohms"),
        750.0,
        1e-9,
        "the data sheet's figure back",
    );
    close(num(&j, "spare_ohms"), 500.0, 1e-9, "spare");
}

#[test]
fn an_active_input_and_a_three_wire_transmitter() {
    // Active input card at 24 V with 250 Ω: as a supply, 8.5 V headroom at 20 mA.
    let j = loopside_json(&[
        "budget",
        "--source",
        "active-input",
        "--supply",
        "24",
        "--min-volts",
        "10,5",
        "--load",
        "card=250",
        "--json",
    ]);
    assert_eq!(j["source"], "active-input");
    assert_eq!(j["topology"], "two-wire-active-input");
    close(num(&j, "headroom_volts"), 8.5, 1e-9, "active input");
    // Three-wire, own current 3 mA, 300 m of 1.0 mm² (Rc = 300/58 Ω a conductor), 250 Ω:
    // V = 24 − (I + 0.003)·Rc − I·(Rc + 250) − 12 at I = 20 mA.
    let j = loopside_json(&[
        "budget",
        "--topology",
        "three-wire",
        "--own-ma",
        "3",
        "--supply",
        "24",
        "--min-volts",
        "12",
        "--load",
        "250",
        "--cable-m",
        "300",
        "--mm2",
        "1,0",
        "--json",
    ]);
    let rc = 300.0 / 58.0;
    close(
        num(&j, "headroom_volts"),
        24.0 - 0.023 * rc - 0.020 * (rc + 250.0) - 12.0,
        1e-9,
        "three-wire",
    );
}

#[test]
fn topology_faults_are_named_in_json() {
    let j = loopside_json(&[
        "budget",
        "--source",
        "supply",
        "--source",
        "active-input",
        "--supply",
        "24",
        "--min-volts",
        "10,5",
        "--load",
        "250",
        "--json",
    ]);
    assert_eq!(j["ok"], false);
    assert_eq!(j["topology_fault"]["code"], "two-sources");
    assert_eq!(j["topology_fault"]["sources"][0], "active-input");
    assert_eq!(j["topology_fault"]["sources"][1], "supply");
    assert!(j["source"].is_null());
    let j = loopside_json(&[
        "budget",
        "--topology",
        "four-wire",
        "--source",
        "current-output,active-input",
        "--supply",
        "24",
        "--max-load-ohms",
        "750",
        "--json",
    ]);
    assert_eq!(j["topology_fault"]["code"], "two-sources");
    let j = loopside_json(&[
        "budget",
        "--source",
        "none",
        "--min-volts",
        "10,5",
        "--json",
    ]);
    assert_eq!(j["topology_fault"]["code"], "no-source");
    assert_eq!(j["ok"], false);
    close(num(&j, "headroom_volts"), -10.5, 1e-12, "0 V");
}

#[test]
fn hart_cable_limit_from_the_command_line() {
    // 250 Ω, 1.0 mm² (2/58 Ω/m), 100 pF/m, devices 10 nF by default: 1949.1 m by the
    // quadratic formula on (250 + L/29)(10 nF + 0.1 nF·L) = 65 µs (worked by hand, see
    // tests/topology_budget.rs).
    let j = loopside_json(&[
        "budget",
        "--supply",
        "24",
        "--min-volts",
        "10,5",
        "--load",
        "250",
        "--cable-m",
        "180",
        "--mm2",
        "1,0",
        "--hart",
        "--cable-pf-per-m",
        "100",
        "--json",
    ]);
    close(
        num(&j, "hart_max_cable_m"),
        1949.1,
        0.1,
        "HART longest cable",
    );
    assert_eq!(j["hart_cable_binding"], "hart");
    // Devices given: 50 nF and no cable resistance counted (no conductor): the published
    // formula L = 65e6/(R·C) − (Cf + 10 000)/C counts 10 nF besides Cf; with our devices'
    // figure standing for all of them, L = (65 µs/250 Ω − 50 nF) / 100 pF/m = 2100 m.
    let j = loopside_json(&[
        "budget",
        "--supply",
        "24",
        "--min-volts",
        "10,5",
        "--load",
        "250",
        "--hart",
        "--cable-pf-per-m",
        "100",
        "--devices-nf",
        "50",
        "--json",
    ]);
    close(num(&j, "hart_max_cable_m"), 2100.0, 1e-6, "no conductor");
    assert!(j["hart_cable_binding"].is_null());
}

#[test]
fn bad_topology_input_names_the_field_and_its_flag() {
    for (args, want) in [
        (
            vec!["budget", "--source", "current-output", "--drop", "9"],
            "compliance (--compliance-volts / --max-load-ohms): is empty",
        ),
        (
            vec![
                "budget",
                "--source",
                "current-output",
                "--compliance-volts",
                "2000",
            ],
            "compliance (--compliance-volts / --max-load-ohms): must be between 0 and 1000",
        ),
        (
            vec![
                "budget",
                "--source",
                "battery",
                "--supply",
                "24",
                "--min-volts",
                "10",
            ],
            "source (--source): must be supply, active-input, current-output or none",
        ),
        (
            vec![
                "budget",
                "--topology",
                "five-wire",
                "--supply",
                "24",
                "--min-volts",
                "10",
            ],
            "topology (--topology): must be one of",
        ),
        (
            vec![
                "budget",
                "--own-ma",
                "3",
                "--supply",
                "24",
                "--min-volts",
                "10",
            ],
            "transmitter's own current (--own-ma): applies only to a three-wire transmitter",
        ),
        (
            vec![
                "budget",
                "--supply",
                "24",
                "--min-volts",
                "10",
                "--cable-pf-per-m",
                "100",
            ],
            "is for HART's cable limit: add --hart",
        ),
        (
            vec![
                "budget",
                "--supply",
                "24",
                "--min-volts",
                "10",
                "--hart",
                "--cable-pf-per-m",
                "0",
            ],
            "cable capacitance",
        ),
        (
            vec![
                "budget",
                "--topology",
                "four-wire",
                "--max-load-ohms",
                "600",
                "--min-volts",
                "10",
            ],
            "transmitter minimum (--min-volts): is not used",
        ),
    ] {
        let e = loopside_refuses(&args);
        assert!(e.contains(want), "{args:?}: {e}");
    }
}
