//! The `rtd`, `tc` and `level` subcommands, run as a technician would run them.

mod util;

use util::{close, loopside, loopside_json, loopside_refuses};

#[test]
fn rtd_resistance_to_source_for_a_temperature() {
    // IEC 60751 equation, worked by hand: Pt100 at 100 °C → 138.5055 Ω; class A there is
    // ±0.35 °C (IEC 60751:2008 Table 3).
    let j = loopside_json(&[
        "rtd", "--type", "pt100", "--temp-c", "100", "--class", "A", "--json",
    ]);
    close(j["ohms"].as_f64().unwrap(), 138.5055, 1e-9, "ohms");
    close(j["temp_c"].as_f64().unwrap(), 100.0, 1e-12, "temp_c");
    close(
        j["class_tolerance_c"].as_f64().unwrap(),
        0.35,
        1e-12,
        "class",
    );
    assert!(j["lead_error_c"].is_null());
}

#[test]
fn rtd_temperature_for_a_resistance_with_decimal_comma() {
    // IEC 60751:2008 Table 1 (Pt1000 = Pt100 × 10): 1385.055 Ω ↔ 100 °C.
    let j = loopside_json(&["rtd", "--type", "pt1000", "--ohms", "1385,055", "--json"]);
    close(j["temp_c"].as_f64().unwrap(), 100.0, 1e-9, "temp_c");
}

#[test]
fn rtd_two_wire_lead_error_from_a_cable() {
    // 100 m of 0.5 mm² copper at 20 °C, out and back: 200/58/0.5 = 6.8966 Ω (IEC 60028
    // resistivity); on a Pt100 at 0 °C that is 6.8966 / 0.39083 = 17.646 °C.
    let j = loopside_json(&[
        "rtd",
        "--type",
        "pt100",
        "--temp-c",
        "0",
        "--wires",
        "2",
        "--cable-m",
        "100",
        "--mm2",
        "0.5",
        "--json",
    ]);
    close(
        j["lead_ohms"].as_f64().unwrap(),
        200.0 / 58.0 / 0.5,
        1e-9,
        "lead ohms",
    );
    close(
        j["lead_error_c"].as_f64().unwrap(),
        200.0 / 58.0 / 0.5 / 0.39083,
        1e-9,
        "lead error",
    );
    let j = loopside_json(&[
        "rtd",
        "--type",
        "pt100",
        "--temp-c",
        "0",
        "--wires",
        "3",
        "--cable-m",
        "100",
        "--mm2",
        "0.5",
        "--json",
    ]);
    assert_eq!(j["lead_error_c"].as_f64().unwrap(), 0.0);
}

#[test]
fn tc_source_mv_with_a_cold_junction() {
    // NIST Monograph 175 type K table: E(400 °C) − E(18 °C) = 16.397 − 0.718 = 15.679 mV.
    let j = loopside_json(&[
        "tc", "--type", "K", "--temp-c", "400", "--cj-c", "18", "--json",
    ]);
    close(j["mv"].as_f64().unwrap(), 15.679, 0.0012, "mv");
    // And back from the measured millivolts.
    let j = loopside_json(&[
        "tc", "--type", "k", "--mv", "15,679", "--cj-c", "18", "--json",
    ]);
    close(j["temp_c"].as_f64().unwrap(), 400.0, 0.03, "temp_c");
    // NIST Monograph 175 type J table: 100 °C → 5.269 mV with the junction at 0 °C.
    let j = loopside_json(&["tc", "--type", "J", "--temp-c", "100", "--json"]);
    close(j["mv"].as_f64().unwrap(), 5.269, 0.0006, "type J");
}

#[test]
fn level_wet_leg_ranging() {
    // learninstrumentationengineering.com, "Calibration of DP level transmitter
    // (elevation)": SG 1.12 over 5470 mm, transmitter 1250 mm above the HP tap, wet leg of
    // SG 1.17 filled 4490 mm → −6653.3 to −526.9 mmH2O.
    let j = loopside_json(&[
        "level",
        "--sg",
        "1,12",
        "--min-m",
        "0",
        "--max-m",
        "5,47",
        "--mount",
        "wet-leg",
        "--tx-m",
        "1,25",
        "--leg-m",
        "4,49",
        "--fill-sg",
        "1,17",
        "--unit",
        "mmH2O",
        "--json",
    ]);
    close(j["lrv"].as_f64().unwrap(), -6653.3, 1e-6, "lrv");
    close(j["urv"].as_f64().unwrap(), -526.9, 1e-6, "urv");
    close(j["span"].as_f64().unwrap(), 6126.4, 1e-6, "span");
    assert_eq!(j["unit"], "mmH2O");
    assert_eq!(j["zero"], "elevated");
}

#[test]
fn level_seals_and_dp_back_to_level() {
    // mycelectric.com, "Level Calculation for Diaphragm Seal Transmitter": SG 0.96 over
    // 4 m, seals 5 m apart filled with SG 1.05 → −5250 to −1410 mmH2O.
    let j = loopside_json(&[
        "level",
        "--sg",
        "0.96",
        "--min-m",
        "0",
        "--max-m",
        "4",
        "--mount",
        "seals",
        "--lp-seal-m",
        "5",
        "--tx-m",
        "-1",
        "--fill-sg",
        "1.05",
        "--unit",
        "mmH2O",
        "--dp",
        "-3330",
        "--json",
    ]);
    close(j["lrv"].as_f64().unwrap(), -5250.0, 1e-6, "lrv");
    close(j["urv"].as_f64().unwrap(), -1410.0, 1e-6, "urv");
    // −3330 mmH2O is half-way: 2 m.
    close(j["level_m"].as_f64().unwrap(), 2.0, 1e-9, "level");
}

#[test]
fn level_text_output_names_the_zero_shift() {
    // instrumentationtoolbox.com, "Zero Suppression Calibration in Level Measurement":
    // transmitter 6 ft below the base, SG 0.9 → LRV 64.8 "W.C., a suppressed zero.
    let out = loopside(&[
        "level",
        "--sg",
        "0.9",
        "--min-m",
        "0",
        "--max-m",
        "12.192",
        "--tx-m",
        "-1.8288",
        "--unit",
        "inH2O(conv)",
    ]);
    assert!(out.status.success());
    let text = String::from_utf8_lossy(&out.stdout);
    assert!(text.contains("suppressed zero by 64.80"), "{text}");
}

#[test]
fn bad_input_exits_2_naming_the_field() {
    let e = loopside_refuses(&["tc", "--type", "K", "--temp-c", "1400"]);
    assert!(
        e.contains("temp-c: 1400 °C is outside type K's range"),
        "{e}"
    );
    let e = loopside_refuses(&["rtd", "--type", "pt100", "--temp-c", "900"]);
    assert!(e.contains("temp-c:"), "{e}");
    let e = loopside_refuses(&["rtd", "--type", "pt100", "--ohms", "5"]);
    assert!(e.contains("ohms:"), "{e}");
    let e = loopside_refuses(&["level", "--sg", "-1", "--min-m", "0", "--max-m", "2"]);
    assert!(e.contains("sg:"), "{e}");
    let e = loopside_refuses(&["level", "--sg", "1", "--min-m", "2", "--max-m", "2"]);
    assert!(e.contains("max-m:"), "{e}");
    let e = loopside_refuses(&[
        "level", "--sg", "1", "--min-m", "0", "--max-m", "2", "--mount", "wet-leg",
    ]);
    assert!(e.contains("leg-m:"), "{e}");
    let e = loopside_refuses(&["tc", "--type", "Q", "--temp-c", "10"]);
    assert!(e.contains("type:"), "{e}");
    let e = loopside_refuses(&["tc", "--type", "K", "--temp-c", "10", "--cj-c", "abc"]);
    assert!(e.contains("cj-c:"), "{e}");
    let e = loopside_refuses(&[
        "level", "--sg", "1", "--min-m", "0", "--max-m", "2", "--unit", "volt",
    ]);
    assert!(e.contains("unit:"), "{e}");
}
