//! The calculator subcommands, run as a technician would run them.

mod util;

use util::{close, loopside, loopside_json, loopside_refuses};

#[test]
fn convert_a_pressure_reading() {
    // ISA blog worked example: 50–250 psig, 150 psig → 12.0 mA.
    let j = loopside_json(&[
        "convert", "--range", "50..250", "--unit", "psi", "--value", "150", "--json",
    ]);
    close(j["ma"].as_f64().unwrap(), 12.0, 1e-9, "ma");
    close(j["percent"].as_f64().unwrap(), 50.0, 1e-9, "percent");
    assert_eq!(j["unit"], "psi");
    assert_eq!(j["status"], "in-range");
}

#[test]
fn convert_accepts_decimal_comma_and_volts_across_a_resistor() {
    let j = loopside_json(&[
        "convert", "--range", "0..4,5", "--unit", "m", "--volts", "3,0", "--ohms", "250 ohm",
        "--json",
    ]);
    close(j["ma"].as_f64().unwrap(), 12.0, 1e-9, "ma");
    close(j["value"].as_f64().unwrap(), 2.25, 1e-9, "value");
}

#[test]
fn convert_square_root_flow_and_cutoff() {
    // ISO 5167 relation: 25 % DP → 50 % flow.
    let j = loopside_json(&[
        "convert",
        "--range",
        "0..3000",
        "--unit",
        "m3/h",
        "--sqrt",
        "--cutoff",
        "1",
        "--percent",
        "25",
        "--json",
    ]);
    close(j["value"].as_f64().unwrap(), 1500.0, 1e-9, "flow");
    close(j["dp_percent"].as_f64().unwrap(), 25.0, 1e-9, "dp");
    let j = loopside_json(&[
        "convert", "--range", "0..3000", "--unit", "m3/h", "--sqrt", "--cutoff", "1", "--ma",
        "4.001", "--json",
    ]);
    assert_eq!(j["value"].as_f64().unwrap(), 0.0);
    assert_eq!(j["cutoff_active"], true);
}

#[test]
fn convert_negative_and_reversed_ranges() {
    let j = loopside_json(&[
        "convert", "--range", "-20..80", "--unit", "degC", "--ma", "8", "--json",
    ]);
    close(j["value"].as_f64().unwrap(), 5.0, 1e-9, "TT-412 at 8 mA");
    let j = loopside_json(&[
        "convert", "--range", "250..0", "--unit", "mbar", "--ma", "20", "--json",
    ]);
    close(j["value"].as_f64().unwrap(), 0.0, 1e-9, "reversed");
}

#[test]
fn convert_to_another_unit() {
    let j = loopside_json(&[
        "convert", "--range", "0..10", "--unit", "bar", "--ma", "12", "--to", "psi", "--json",
    ]);
    close(j["value"].as_f64().unwrap(), 72.5189, 1e-4, "5 bar in psi");
    assert_eq!(j["unit"], "psi");
}

#[test]
fn convert_with_a_tank_table() {
    let j = loopside_json(&[
        "convert",
        "--range",
        "0..2",
        "--unit",
        "m",
        "--table",
        "0:0;1:6;2:12",
        "--table-unit",
        "m3",
        "--ma",
        "8",
        "--json",
    ]);
    close(j["measured"].as_f64().unwrap(), 0.5, 1e-9, "level");
    close(j["value"].as_f64().unwrap(), 3.0, 1e-9, "volume");
}

#[test]
fn convert_status_of_a_failure_current() {
    let j = loopside_json(&[
        "convert", "--range", "0..10", "--unit", "bar", "--ma", "3.55", "--json",
    ]);
    assert_eq!(j["status"], "fail-low");
}

#[test]
fn convert_text_output_is_readable() {
    let out = loopside(&["convert", "--range", "0..10", "--unit", "bar", "--ma", "12"]);
    let text = String::from_utf8(out.stdout).unwrap();
    assert!(text.contains("12.000 mA"), "{text}");
    assert!(text.contains("50.00 %"), "{text}");
    assert!(text.contains("5.000 bar"), "{text}");
    assert!(text.contains("in-range"), "{text}");
}

#[test]
fn budget_keys_and_numbers() {
    // Common practice: (24 − 10.5) / 0.020 = 675 Ω maximum loop resistance.
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
        "1.0",
        "--json",
    ]);
    close(
        j["max_load_ohms"].as_f64().unwrap(),
        675.0,
        1e-9,
        "max load",
    );
    close(
        j["cable_ohms"].as_f64().unwrap(),
        360.0 / 58.0,
        1e-9,
        "cable",
    );
    close(
        j["loop_ohms"].as_f64().unwrap(),
        250.0 + 360.0 / 58.0,
        1e-9,
        "loop",
    );
    close(
        j["spare_ohms"].as_f64().unwrap(),
        675.0 - 250.0 - 360.0 / 58.0,
        1e-9,
        "spare",
    );
    for key in [
        "min_supply_volts",
        "headroom_volts",
        "headroom_fault_volts",
        "max_cable_m",
        "spare_fault_ohms",
        "max_load_fault_ohms",
        "max_cable_fault_m",
        "ok",
        "limit",
        "hart_ok",
    ] {
        assert!(!j[key].is_null(), "key {key}");
    }
    assert_eq!(j["ok"], true);
    assert_eq!(j["hart_ok"], true);
}

const LT_101: [&str; 11] = [
    "budget",
    "--supply",
    "24",
    "--min-volts",
    "10,5",
    "--load",
    "PLC input=250",
    "--cable-m",
    "180",
    "--mm2",
    "1.0",
];

#[test]
fn budget_quotes_spare_and_cable_at_the_fault_current() {
    // LT-101, worked by hand. Copper 1/58 Ω·mm²/m at 20 °C (IEC 60028), and `budget`
    // takes the cable at 20 °C unless --temp-c says otherwise:
    //   loop 250 + 2 × 180 / 58 = 256.2069 Ω
    //   at 22 mA (the default fault current) the loop may hold (24 − 10.5) / 0.022
    //   = 613.636 Ω (common-practice formula at the fault current): 357.43 Ω spare, and
    //   (613.636 − 250) × 58 / 2 = 10 545.45 m of this pair one way, about 10.5 km.
    let mut args = LT_101.to_vec();
    args.push("--json");
    let j = loopside_json(&args);
    close(
        j["max_load_fault_ohms"].as_f64().unwrap(),
        13.5 / 0.022,
        1e-9,
        "max load at 22 mA",
    );
    close(
        j["spare_fault_ohms"].as_f64().unwrap(),
        357.43,
        0.01,
        "spare at 22 mA",
    );
    close(
        j["max_cable_fault_m"].as_f64().unwrap(),
        10_545.45,
        0.01,
        "cable at 22 mA",
    );
    assert_eq!(j["fault_ma"].as_f64().unwrap(), 22.0);
    assert_eq!(j["fault_ma_is_default"], true);
    assert_eq!(j["supply_sag_percent"].as_f64().unwrap(), 0.0);
    assert!(
        j["limit"]
            .as_str()
            .unwrap()
            .contains("357 Ω of load still available at 22.0 mA"),
        "{}",
        j["limit"]
    );

    let text = String::from_utf8(loopside(&LT_101).stdout).unwrap();
    assert!(
        text.contains(
            "limits at 22.0 mA: max loop resistance 614 Ω (spare 357 Ω), supply needed 16.14 V, longest cable run 10545 m one way"
        ),
        "{text}"
    );
    assert!(
        text.contains(
            "limits at 20.0 mA: max loop resistance 675 Ω (spare 419 Ω), supply needed 15.62 V, longest cable run 12325 m one way"
        ),
        "{text}"
    );
    assert!(
        text.contains("7.86 V spare at 22.0 mA, 357 Ω of load still available at 22.0 mA"),
        "{text}"
    );
    // No line puts the 20 mA spare (419 Ω) or cable (12 325 m) beside a 22 mA figure.
    for line in text.lines() {
        if line.contains("22.0 mA") {
            assert!(!line.contains("419") && !line.contains("12325"), "{line}");
        }
    }
    assert!(text.contains("by voltage only"), "{text}");
    assert!(text.contains("No supply sag assumed"), "{text}");
    assert!(text.contains("22.0 mA is a default"), "{text}");
}

#[test]
fn budget_with_a_configured_fault_current_and_a_sag() {
    // The device is configured for 21.5 mA and the supply may sag 5 %: worked at
    // 24 × 0.95 = 22.80 V; at 21.5 mA the loop may hold (22.8 − 10.5) / 0.0215
    // = 572.09 Ω, 315.89 Ω spare (common-practice formula at the fault current).
    let mut args = LT_101.to_vec();
    args.extend(["--fault-ma", "21,5", "--supply-tolerance", "5"]);
    let text = String::from_utf8(loopside(&args).stdout).unwrap();
    assert!(!text.contains("default"), "{text}");
    assert!(!text.contains("No supply sag"), "{text}");
    assert!(text.contains("22.80 V: the nominal less 5 % sag"), "{text}");
    assert!(text.contains("limits at 21.5 mA"), "{text}");
    args.push("--json");
    let j = loopside_json(&args);
    assert_eq!(j["fault_ma_is_default"], false);
    close(j["fault_ma"].as_f64().unwrap(), 21.5, 0.0, "fault current");
    close(
        j["spare_fault_ohms"].as_f64().unwrap(),
        315.89,
        0.01,
        "spare at 21.5 mA",
    );
    close(j["supply_sag_percent"].as_f64().unwrap(), 5.0, 0.0, "sag");
}

#[test]
fn budget_not_enough_is_an_answer_with_exit_0() {
    let j = loopside_json(&["budget", "--supply", "10", "--min-volts", "10.5", "--json"]);
    assert_eq!(j["ok"], false);
    assert_eq!(j["max_load_ohms"].as_f64().unwrap(), 0.0);
}

#[test]
fn budget_names_the_limiting_element() {
    let j = loopside_json(&[
        "budget",
        "--supply",
        "24",
        "--supply-tolerance",
        "10",
        "--min-volts",
        "12",
        "--load",
        "barrier=340",
        "--load",
        "input=250",
        "--drop",
        "indicator=2.5",
        "--json",
    ]);
    assert_eq!(j["ok"], false);
    assert!(
        j["limit"].as_str().unwrap().contains("barrier"),
        "{}",
        j["limit"]
    );
}

#[test]
fn wire_round_trip_resistance() {
    // AWG 18 at 20 °C: 6.385 Ω/1000 ft (ASTM B258-derived table) = 20.95 Ω/km.
    let j = loopside_json(&["wire", "--awg", "18", "--length-m", "100", "--json"]);
    close(j["ohms_per_km"].as_f64().unwrap(), 20.95, 0.01, "Ω/km");
    close(
        j["ohms"].as_f64().unwrap(),
        2.0 * 2.095,
        0.002,
        "round trip over 100 m",
    );
}

#[test]
fn units_and_status() {
    let j = loopside_json(&["units", "1", "psi", "Pa", "--json"]);
    close(
        j["value"].as_f64().unwrap(),
        6894.757,
        0.0005,
        "NIST SP 811 psi",
    );
    let j = loopside_json(&["units", "-40", "degC", "degF", "--json"]);
    close(j["value"].as_f64().unwrap(), -40.0, 1e-9, "-40 °C");
    let j = loopside_json(&["status", "21,0", "--json"]);
    assert_eq!(j["status"], "fail-high");
    let j = loopside_json(&["status", "0.2", "--json"]);
    assert_eq!(j["status"], "no-loop-current");
}

#[test]
fn bad_input_exits_2_naming_the_field() {
    let cases: &[(&[&str], &str)] = &[
        (
            &["convert", "--range", "5..5", "--unit", "bar", "--ma", "12"],
            "range",
        ),
        (
            &[
                "convert", "--range", "0..10", "--unit", "bar", "--ma", "NaN",
            ],
            "ma",
        ),
        (
            &[
                "convert", "--range", "0..10", "--unit", "bar", "--ma", "inf",
            ],
            "ma",
        ),
        (
            &["convert", "--range", "0..inf", "--unit", "bar", "--ma", "4"],
            "range",
        ),
        (
            &[
                "convert", "--range", "0..10", "--unit", "bar", "--ma", "12", "--to", "m3/h",
            ],
            "to",
        ),
        (
            &[
                "convert", "--range", "0..10", "--unit", "pH", "--ma", "12", "--to", "bar",
            ],
            "to",
        ),
        (
            &[
                "convert", "--range", "0..10", "--unit", "m3/h", "--sqrt", "--cutoff", "101",
                "--ma", "12",
            ],
            "cutoff",
        ),
        (
            &[
                "convert", "--range", "0..10", "--unit", "m3/h", "--sqrt", "--cutoff", "-1",
                "--ma", "12",
            ],
            "cutoff",
        ),
        (
            &[
                "convert", "--range", "0..10", "--unit", "bar", "--volts", "3", "--ohms", "-250",
            ],
            "ohms",
        ),
        (
            &[
                "budget",
                "--supply",
                "24",
                "--min-volts",
                "10",
                "--load",
                "-250",
            ],
            "load",
        ),
        (
            &["budget", "--supply", "nan", "--min-volts", "10"],
            "supply",
        ),
        (
            &[
                "budget",
                "--supply",
                "24",
                "--min-volts",
                "10",
                "--cable-m",
                "-5",
                "--awg",
                "18",
            ],
            "cable-m",
        ),
        (
            &[
                "budget",
                "--supply",
                "24",
                "--min-volts",
                "10",
                "--cable-m",
                "100",
                "--awg",
                "41",
            ],
            "awg",
        ),
        (&["wire", "--awg", "5/0", "--length-m", "10"], "awg"),
        (&["wire", "--awg", "41", "--length-m", "10"], "awg"),
        (&["wire", "--mm2", "1.5", "--length-m", "-10"], "length-m"),
        (&["units", "1", "bar", "degC"], "to"),
        (&["units", "x", "bar", "psi"], "value"),
        (&["status", "abc"], "ma"),
    ];
    for (args, field) in cases {
        let stderr = loopside_refuses(args);
        assert!(
            stderr.contains(field),
            "loopside {args:?}: message should name {field}: {stderr}"
        );
    }
}

#[test]
fn usage_errors_also_exit_2() {
    let out = loopside(&["convert", "--range", "0..10", "--unit", "bar"]);
    assert_eq!(out.status.code(), Some(2));
    let out = loopside(&[
        "convert",
        "--range",
        "0..10",
        "--unit",
        "bar",
        "--ma",
        "4",
        "--percent",
        "5",
    ]);
    assert_eq!(out.status.code(), Some(2));
}

#[test]
fn every_subcommand_has_help_with_an_example() {
    for sub in ["convert", "budget", "wire", "units", "status", "resistor"] {
        let out = loopside(&[sub, "--help"]);
        assert!(out.status.success());
        let text = String::from_utf8(out.stdout).unwrap();
        assert!(
            text.contains(&format!("loopside {sub} ")),
            "{sub} --help has an example:\n{text}"
        );
    }
}
