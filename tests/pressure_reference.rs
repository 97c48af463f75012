//! Gauge and absolute pressure are different quantities: a technician at an absolute
//! transmitter must never be one atmosphere out because a unit lost its `a`.
//!
//! Reference values: the standard atmosphere 101 325 Pa and the psi 6 894.757 Pa (NIST SP
//! 811, 2008, Appendix B.8; ISO 2533 for the atmosphere). Every expected value below is
//! worked by hand from those two numbers in the comment beside it.

mod util;

use loopside::number::{parse_atmosphere, parse_in};
use loopside::units::{convert, convert_difference, convert_units_at, lookup, PressureRef};
use util::{close, loopside, loopside_json, loopside_refuses, TempDir};

/// The psi in pascals, NIST SP 811 B.8 (6.894 757 E+03, exact 4.448 221 615 260 5 N/in²).
const PSI_PA: f64 = 6_894.757_293_168_361;

#[test]
fn one_bar_absolute_is_a_little_below_zero_gauge() {
    // 1 bara = 100 000 Pa absolute; minus the standard atmosphere 101 325 Pa leaves
    // −1 325 Pa gauge; ÷ 6 894.757 Pa/psi = −0.192 175 psig.
    let psig = convert(1.0, "bara", "psig").unwrap();
    close(psig, -1_325.0 / PSI_PA, 1e-9, "1 bara in psig");
    close(psig, -0.192_175, 5e-7, "1 bara in psig, rounded");
    // 0 psig is the atmosphere itself: 101.325 kPa(a).
    close(
        convert(0.0, "psig", "kPa(a)").unwrap(),
        101.325,
        1e-9,
        "0 psig",
    );
    // 14.7 psia (a common round figure) is 14.7 − 14.695 949 = 0.004 051 psig.
    close(
        convert(14.7, "psia", "psig").unwrap(),
        14.7 - 101_325.0 / PSI_PA,
        1e-9,
        "14.7 psia",
    );
}

#[test]
fn a_local_atmosphere_replaces_the_standard_one() {
    // A plant at about 550 m reads 95 kPa on its barometer: 0 barg there is 0.95 bara,
    // and 2.5 barg is 250 + 95 = 345 kPa(a).
    let atm = parse_atmosphere("atm", "95kPa").unwrap();
    assert_eq!(atm, 95_000.0);
    let barg = lookup("barg").unwrap();
    let bara = lookup("bara").unwrap();
    let kpa_a = lookup("kPa(a)").unwrap();
    close(
        convert_units_at(0.0, barg, bara, atm).unwrap(),
        0.95,
        1e-12,
        "0 barg",
    );
    close(
        convert_units_at(2.5, barg, kpa_a, atm).unwrap(),
        345.0,
        1e-9,
        "2,5 barg",
    );
    // Typed with a decimal comma and another unit: 0,95 bar = 95 000 Pa.
    assert_eq!(parse_atmosphere("atm", "0,95 bar").unwrap(), 95_000.0);
    // A gauge atmosphere, a bare number and an impossible one are refused by name.
    for bad in ["0 barg", "95", "5 kPa", "2 bar"] {
        let e = parse_atmosphere("atm", bad).unwrap_err();
        assert_eq!(e.field, "atm", "{bad}");
    }
}

#[test]
fn a_plain_unit_against_a_marked_one_asks_for_g_or_a() {
    // bar says neither gauge nor absolute: loopside does not guess (a guess is wrong by
    // one atmosphere, 14.7 psi).
    let e = convert(1.0, "bar", "psia").unwrap_err();
    assert_eq!(e.field, "from");
    assert!(
        e.reason.contains("barg") && e.reason.contains("bara"),
        "{e}"
    );
    let e = convert(1.0, "psig", "kPa").unwrap_err();
    assert_eq!(e.field, "to");
    assert!(e.reason.contains("kPa(g)"), "{e}");
    // Plain units among themselves convert as they always did: 1 bar = 14.503 77 psi.
    close(
        convert(1.0, "bar", "psi").unwrap(),
        100_000.0 / PSI_PA,
        1e-12,
        "bar to psi",
    );
    // Same reference, only the factor: 1 barg = 14.503 77 psig.
    close(
        convert(1.0, "barg", "psig").unwrap(),
        100_000.0 / PSI_PA,
        1e-12,
        "barg to psig",
    );
}

#[test]
fn a_difference_carries_no_atmosphere() {
    // A 10 bar span is 145.04 psi whether both ends are gauge or absolute.
    let barg = lookup("barg").unwrap();
    let psia = lookup("psia").unwrap();
    close(
        convert_difference(10.0, barg, psia).unwrap(),
        1_000_000.0 / PSI_PA,
        1e-9,
        "10 bar span",
    );
    // A differential unit converts as before: 100 inH2O (39.2 °F) = 24.9082 kPa
    // (NIST SP 811 B.8: 249.082 Pa).
    close(
        convert(100.0, "inH2O", "kPa").unwrap(),
        24.9082,
        1e-9,
        "100 inH2O",
    );
    assert_eq!(lookup("inH2O").unwrap().reference, PressureRef::Plain);
}

#[test]
fn a_field_does_not_cross_gauge_and_absolute_on_its_own() {
    // Typing 2 barg into a field of a tag ranged in bara would need an atmosphere the
    // field does not have: it is refused by the field's name.
    let e = parse_in("value", "2 barg", "bara").unwrap_err();
    assert_eq!(e.field, "value");
    assert!(e.reason.contains("bara"), "{e}");
    // Same reference, other size: 150 kPa(a) in bara is 1.5.
    close(
        parse_in("value", "150 kPa(a)", "bara").unwrap(),
        1.5,
        1e-12,
        "150 kPa(a)",
    );
}

#[test]
fn water_columns_say_which_water() {
    // At 20 °C (68 °F): 0.0254 m × 998.2071 kg/m³ (CRC Handbook, water at 20 °C) ×
    // 9.806 65 m/s² (standard gravity) = 248.642 Pa.
    close(
        convert(1.0, "inH2O@20C", "Pa").unwrap(),
        0.0254 * 998.2071 * 9.80665,
        1e-9,
        "inH2O at 20 °C",
    );
    close(
        convert(1.0, "inH2O@68F", "Pa").unwrap(),
        248.64,
        0.005,
        "inH2O at 68 °F",
    );
    // 1 mmH2O at 20 °C = 0.001 × 998.2071 × 9.806 65 = 9.789 07 Pa.
    close(
        convert(1.0, "mmH2O@20C", "Pa").unwrap(),
        9.789_07,
        5e-6,
        "mmH2O at 20 °C",
    );
    // The four inch-of-water units are told apart by their notes.
    let notes: Vec<&str> = ["inH2O", "inH2O@60F", "inH2O@20C", "inH2O(conv)"]
        .iter()
        .map(|u| lookup(u).unwrap().note)
        .collect();
    assert!(notes[0].contains("39.2 °F"));
    assert!(notes[1].contains("60 °F"));
    assert!(notes[2].contains("68 °F") && notes[2].contains("20 °C"));
    assert!(notes[3].contains("conventional"));
}

#[test]
fn the_command_line_says_which_atmosphere_it_used() {
    let j = loopside_json(&["units", "1", "bara", "psig", "--json"]);
    close(j["value"].as_f64().unwrap(), -0.192_175, 5e-7, "1 bara");
    assert_eq!(j["unit"], "psig");
    assert_eq!(j["atm_kpa"].as_f64(), Some(101.325));
    let j = loopside_json(&[
        "units", "0", "psig", "kPa(a)", "--atm", "0,95 bar", "--json",
    ]);
    close(j["value"].as_f64().unwrap(), 95.0, 1e-9, "0 psig at 95 kPa");
    assert_eq!(j["atm_kpa"].as_f64(), Some(95.0));
    // Plain to plain: no atmosphere involved, and the key says so.
    let j = loopside_json(&["units", "2,5", "bar", "psi", "--json"]);
    assert!(j["atm_kpa"].is_null());
    // The text output names the atmosphere and the water.
    let out = loopside(&["units", "1", "bara", "psig"]);
    let text = String::from_utf8_lossy(&out.stdout);
    assert!(text.contains("-0.192175 psig"), "{text}");
    assert!(text.contains("standard atmosphere"), "{text}");
    let out = loopside(&["units", "10", "inH2O@20C", "Pa"]);
    let text = String::from_utf8_lossy(&out.stdout);
    assert!(text.contains("68 °F (20 °C)"), "{text}");
    // Refusals exit 2 and name the field.
    assert!(loopside_refuses(&["units", "1", "bar", "psig"]).contains("from"));
    assert!(loopside_refuses(&["units", "1", "bara", "psig", "--atm", "95"]).contains("atm"));
    // convert --to crosses references with the same option.
    let j = loopside_json(&[
        "convert", "--range", "0..2", "--unit", "bara", "--ma", "12", "--to", "barg", "--atm",
        "95kPa", "--json",
    ]);
    // 12 mA is 50 % of 0–2 bara = 1 bara; at 95 kPa that is 1 − 0.95 = 0.05 barg.
    close(j["value"].as_f64().unwrap(), 0.05, 1e-9, "1 bara as barg");
    assert_eq!(j["atm_kpa"].as_f64(), Some(95.0));
}

#[test]
fn a_range_in_bara_stays_bara_in_the_register_and_the_export() {
    let dir = TempDir::new("pressure-bara");
    let d = dir.arg();
    let ok = |args: &[&str]| {
        let mut all = args.to_vec();
        all.extend(["--data-dir", d.as_str()]);
        let out = loopside(&all);
        assert!(
            out.status.success(),
            "{args:?}: {}",
            String::from_utf8_lossy(&out.stderr)
        );
        String::from_utf8(out.stdout).unwrap()
    };
    ok(&[
        "tag",
        "add",
        "PT-290",
        "--range",
        "0..4",
        "--unit",
        "bara",
        "--service",
        "Digester gas holder absolute pressure",
    ]);
    let shown = ok(&["tag", "show", "PT-290"]);
    assert!(shown.contains("bara"), "{shown}");
    let bundle = dir.path().join("handoff.json");
    ok(&[
        "export",
        "--format",
        "json",
        "--out",
        bundle.to_str().unwrap(),
    ]);
    let text = std::fs::read_to_string(&bundle).unwrap();
    let j: serde_json::Value = serde_json::from_str(&text).unwrap();
    let found = text.contains("\"bara\"");
    assert!(found, "the bundle keeps the unit as bara: {j}");
    // Imported on another phone, it is still bara.
    let other = TempDir::new("pressure-bara-b");
    let out = loopside(&[
        "import",
        bundle.to_str().unwrap(),
        "--data-dir",
        other.arg().as_str(),
    ]);
    assert!(out.status.success());
    let out = loopside(&["tag", "show", "PT-290", "--data-dir", other.arg().as_str()]);
    assert!(String::from_utf8_lossy(&out.stdout).contains("bara"));
}
