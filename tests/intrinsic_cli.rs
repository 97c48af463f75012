//! `loopside entity` / `loopside intrinsic …` end to end: the worked examples of
//! `tests/intrinsic_entity.rs` typed as a technician would, with unit suffixes and
//! decimal commas; bad input exits 2 naming the field; a failed check exits 0 with
//! `ok: false`; a tag's IS data stored, checked with a hand-held added, and saved.

mod util;

use util::{close, loopside, loopside_json, loopside_refuses, TempDir};

/// The barrier of the worked examples: 28 V, 93 mA, 0.65 W, Co 83 nF, Lo 4.2 mH (IIC
/// output parameters typical of such a channel; see tests/intrinsic_entity.rs).
const BARRIER: [&str; 10] = [
    "--uo", "28V", "--io", "93mA", "--po", "0,65W", "--co", "83nF", "--lo", "4.2mH",
];

fn with(extra: &[&'static str]) -> Vec<&'static str> {
    let mut v = vec!["entity"];
    v.extend_from_slice(&BARRIER);
    v.extend_from_slice(extra);
    v
}

#[test]
fn a_transmitter_on_200_m_passes_and_json_has_the_issue_keys() {
    // Worked by hand in tests/intrinsic_entity.rs: C 25 nF of 83 nF, L 0.14 mH of 4.2 mH,
    // longest cable 780 m.
    let v = loopside_json(&with(&[
        "--device",
        "TT tx:ui=30,ii=100,pi=0.75,ci=5nF,li=10uH,group=IIC,t=T4",
        "--cable-m",
        "200",
        "--cable-pf-per-m",
        "100",
        "--cable-uh-per-m",
        "0.65",
        "--group",
        "IIC",
        "--t-class",
        "T3",
        "--json",
    ]));
    assert_eq!(v["ok"], true);
    assert_eq!(v["halved"], false);
    close(v["c_total_nf"].as_f64().unwrap(), 25.0, 1e-9, "C total nF");
    close(v["l_total_mh"].as_f64().unwrap(), 0.14, 1e-12, "L total mH");
    close(
        v["co_allowed_nf"].as_f64().unwrap(),
        83.0,
        1e-9,
        "Co allowed",
    );
    close(
        v["lo_allowed_mh"].as_f64().unwrap(),
        4.2,
        1e-12,
        "Lo allowed",
    );
    close(
        v["max_cable_m"].as_f64().unwrap(),
        780.0,
        1e-6,
        "longest cable",
    );
    let checks = v["checks"].as_array().unwrap();
    for c in checks {
        for key in ["name", "source", "field", "ok"] {
            assert!(c.get(key).is_some(), "check without {key}: {c}");
        }
    }
    let voltage = checks.iter().find(|c| c["name"] == "voltage").unwrap();
    assert_eq!(voltage["source"], 28.0);
    assert_eq!(voltage["field"], 30.0);
    close(voltage["margin"].as_f64().unwrap(), 2.0, 1e-12, "V margin");
}

#[test]
fn a_failed_check_is_an_answer_exit_0_ok_false() {
    // Ui 24 V < Uo 28 V (single-device flags, no unit suffixes: V, mA, W, nF, mH).
    let out = loopside(&with(&[
        "--ui",
        "24",
        "--ii",
        "100",
        "--pi",
        "0.75",
        "--ci",
        "5",
        "--li",
        "0.01",
        "--cable-m",
        "100",
        "--group",
        "IIC",
    ]));
    assert!(out.status.success());
    let text = String::from_utf8(out.stdout).unwrap();
    assert!(text.contains("competent person"), "the caution comes first");
    assert!(text.contains("FAIL  Voltage: Ui ≥ Uo"), "{text}");
    assert!(text.contains("margin \u{2212}4.00 V"), "{text}");
    // Cable data not given: the defaults are said.
    assert!(text.contains("200 pF and 1 µH per metre"), "{text}");
}

#[test]
fn the_one_percent_rule_and_the_l_over_r_route_on_the_command_line() {
    // 1 % rule (tests/intrinsic_entity.rs): Ci 5 nF and Li 100 µH → halved; 400 m of
    // 100 pF/m → 45 nF > 41.5 nF → FAIL.
    let v = loopside_json(&with(&[
        "--device",
        "tx:ui=30;ii=100;pi=0,75;ci=5;li=0,1",
        "--cable-m",
        "400",
        "--cable-pf-per-m",
        "100",
        "--cable-uh-per-m",
        "0.65",
        "--group",
        "IIC",
        "--json",
    ]));
    assert_eq!(v["halved"], true);
    assert_eq!(v["ok"], false);
    close(
        v["co_allowed_nf"].as_f64().unwrap(),
        41.5,
        1e-9,
        "halved Co",
    );
    // L/R route: 5000 m of 1 µH/m fails Lo, but L/R 25 ≤ Lo/Ro 55 µH/Ω with Li 0.
    let v = loopside_json(&with(&[
        "--lo-ro",
        "55",
        "--device",
        "tx:ui=30,ii=100,pi=0.75",
        "--cable-m",
        "5km",
        "--cable-pf-per-m",
        "10",
        "--cable-uh-per-m",
        "1",
        "--cable-uh-per-ohm",
        "25uH/ohm",
        "--group",
        "IIC",
        "--json",
    ]));
    assert_eq!(v["ok"], true);
    assert_eq!(v["lr_route"], true);
    close(
        v["max_cable_m"].as_f64().unwrap(),
        8300.0,
        1e-6,
        "C-limited length",
    );
}

#[test]
fn bad_input_exits_2_naming_the_field() {
    let e = loopside_refuses(&with(&[
        "--ui",
        "30",
        "--ii",
        "100",
        "--pi",
        "0.75",
        "--cable-m",
        "100",
        "--group",
        "IID",
    ]));
    assert!(e.contains("group"), "{e}");
    let e = loopside_refuses(&[
        "entity",
        "--uo",
        "-28",
        "--io",
        "93",
        "--po",
        "0.65",
        "--co",
        "83",
        "--lo",
        "4.2",
        "--ui",
        "30",
        "--ii",
        "100",
        "--pi",
        "0.75",
        "--cable-m",
        "100",
        "--group",
        "IIC",
    ]);
    assert!(e.contains("uo"), "{e}");
    let e = loopside_refuses(&with(&[
        "--ui",
        "30",
        "--ii",
        "100",
        "--cable-m",
        "1",
        "--group",
        "IIC",
    ]));
    assert!(e.contains("pi (field device)"), "{e}");
    let e = loopside_refuses(&[
        "entity",
        "--uo",
        "28",
        "--io",
        "93",
        "--po",
        "0.65",
        "--lo",
        "4.2",
        "--ui",
        "30",
        "--ii",
        "100",
        "--pi",
        "0.75",
        "--cable-m",
        "100",
        "--group",
        "IIC",
    ]);
    assert!(e.contains("co"), "{e}");
    let e = loopside_refuses(&with(&["--cable-m", "100", "--group", "IIC"]));
    assert!(e.contains("devices"), "{e}");
}

#[test]
fn a_tag_keeps_its_is_data_and_the_check_is_saved_to_its_log() {
    let dir = TempDir::new("intrinsic-cli");
    let d = dir.arg();
    assert!(loopside(&["--data-dir", &d, "demo"]).status.success());
    // The demo's TT-412 has IS data: a pass (see src/demo.rs).
    let v = loopside_json(&[
        "--data-dir",
        &d,
        "intrinsic",
        "check",
        "--tag",
        "TT-412",
        "--json",
    ]);
    assert_eq!(v["ok"], true);
    // A HART hand-held clipped on: it is listed and what it adds is said.
    let v = loopside_json(&[
        "--data-dir",
        &d,
        "intrinsic",
        "check",
        "--tag",
        "TT-412",
        "--hand-held",
        "HART hand-held:ui=30,ii=200,pi=1,ci=10nF,li=0",
        "--json",
    ]);
    close(
        v["temporary"]["ci_nf"].as_f64().unwrap(),
        10.0,
        1e-9,
        "hand-held Ci",
    );
    // Store a longer cable on the tag, then check and save with initials.
    let out = loopside(&[
        "--data-dir",
        &d,
        "intrinsic",
        "set",
        "TT-412",
        "--cable-m",
        "260",
    ]);
    assert!(out.status.success());
    assert_eq!(
        String::from_utf8_lossy(&out.stdout).trim(),
        "Saved the IS data of TT-412."
    );
    let v = loopside_json(&[
        "--data-dir",
        &d,
        "intrinsic",
        "check",
        "--tag",
        "TT-412",
        "--save",
        "--author",
        "ef",
        "--json",
    ]);
    assert!(v["saved"].is_string());
    let list = loopside_json(&[
        "--data-dir",
        &d,
        "note",
        "list",
        "--kind",
        "is-check",
        "--json",
    ]);
    let entries = list.as_array().unwrap();
    let newest = entries
        .iter()
        .find(|e| e["id"] == v["saved"])
        .expect("the saved entry is listed");
    assert_eq!(newest["author"], "EF");
    assert_eq!(newest["payload"]["payload_version"], 1);
    assert_eq!(newest["payload"]["circuit"]["cable"]["length_m"], 260.0);
    // A tag without IS data is refused with the way to add it.
    let e = loopside_refuses(&["--data-dir", &d, "intrinsic", "check", "--tag", "LT-101"]);
    assert!(e.contains("intrinsic set LT-101"), "{e}");
    // --save needs --tag.
    let out = loopside(&with(&[
        "--ui",
        "30",
        "--ii",
        "100",
        "--pi",
        "1",
        "--cable-m",
        "1",
        "--group",
        "IIC",
        "--save",
    ]));
    assert_eq!(out.status.code(), Some(2));
}

#[test]
fn a_tag_gets_its_is_circuit_when_it_is_made_and_edits_it_like_intrinsic_set() {
    // The worked barrier and transmitter of tests/intrinsic_entity.rs (28 V, 93 mA,
    // 0.65 W, Co 83 nF, Lo 4.2 mH; Ci 5 nF, Li 10 µH) on 200 m of 100 pF/m and 0.65 µH/m:
    // C 25 nF, L 0.14 mH, a pass. The IS cable is --is-cable-m here; --cable-m stays the
    // loop's cable for the voltage budget.
    let dir = TempDir::new("intrinsic-tag-flags");
    let d = dir.arg();
    let mut add = vec![
        "--data-dir",
        d.as_str(),
        "tag",
        "add",
        "TT-420",
        "--range",
        "-20..80",
        "--unit",
        "°C",
        "--supply",
        "24",
        "--min-volts",
        "10,5",
        "--cable-m",
        "180",
        "--mm2",
        "1,0",
    ];
    add.extend_from_slice(&BARRIER);
    add.extend_from_slice(&[
        "--source-group",
        "IIC",
        "--device",
        "TT-420 tx:ui=30,ii=100,pi=0.75,ci=5nF,li=10uH,group=IIC,t=T4",
        "--is-cable-m",
        "200",
        "--cable-pf-per-m",
        "100",
        "--cable-uh-per-m",
        "0.65",
        "--group",
        "IIC",
        "--t-class",
        "T3",
    ]);
    let out = loopside(&add);
    assert!(out.status.success(), "{out:?}");
    let shown = loopside_json(&["--data-dir", &d, "tag", "show", "TT-420", "--json"]);
    let is = &shown["tag"]["intrinsic"];
    assert_eq!(is["cable"]["length_m"], 200.0);
    assert_eq!(is["devices"][0]["name"], "TT-420 tx");
    // The loop's own cable is kept apart from the IS cable.
    assert_eq!(shown["tag"]["loop_config"]["cable"]["one_way_m"], 180.0);
    let v = loopside_json(&[
        "--data-dir",
        &d,
        "intrinsic",
        "check",
        "--tag",
        "TT-420",
        "--json",
    ]);
    assert_eq!(v["ok"], true);
    close(v["c_total_nf"].as_f64().unwrap(), 25.0, 1e-9, "C total nF");
    // `tag show` prints the circuit (wording::intrinsic::circuit_summary).
    let text = loopside(&["--data-dir", &d, "tag", "show", "TT-420"]);
    assert!(String::from_utf8_lossy(&text.stdout).contains("TT-420 tx"));

    // Edit: a flag given replaces that value, the rest is kept (as `intrinsic set`):
    // 800 m → 5 + 80 = 85 nF > 83 nF, a fail on capacitance.
    let out = loopside(&[
        "--data-dir",
        &d,
        "tag",
        "edit",
        "TT-420",
        "--is-cable-m",
        "800",
    ]);
    assert!(out.status.success(), "{out:?}");
    let v = loopside_json(&[
        "--data-dir",
        &d,
        "intrinsic",
        "check",
        "--tag",
        "TT-420",
        "--json",
    ]);
    assert_eq!(v["ok"], false);
    close(v["c_total_nf"].as_f64().unwrap(), 85.0, 1e-9, "C total nF");
    // A tag made without IS data gets it by `tag edit`, with the same flags.
    let mut edit = vec!["--data-dir", d.as_str(), "tag", "edit", "LT-999"];
    let made = loopside(&[
        "--data-dir",
        &d,
        "tag",
        "add",
        "LT-999",
        "--range",
        "0..4,5",
        "--unit",
        "m",
    ]);
    assert!(made.status.success());
    edit.extend_from_slice(&BARRIER);
    edit.extend_from_slice(&[
        "--ui",
        "30",
        "--ii",
        "100",
        "--pi",
        "0.75",
        "--is-cable-m",
        "10",
        "--group",
        "IIC",
    ]);
    assert!(loopside(&edit).status.success());
    let shown = loopside_json(&["--data-dir", &d, "tag", "show", "LT-999", "--json"]);
    assert_eq!(
        shown["tag"]["intrinsic"]["devices"][0]["name"],
        "field device"
    );
    // --no-intrinsic removes it; giving it with IS values is refused.
    let out = loopside(&[
        "--data-dir",
        &d,
        "tag",
        "edit",
        "LT-999",
        "--no-intrinsic",
        "--uo",
        "28",
    ]);
    assert_eq!(out.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&out.stderr).contains("--no-intrinsic"));
    let out = loopside(&["--data-dir", &d, "tag", "edit", "LT-999", "--no-intrinsic"]);
    assert!(out.status.success());
    let shown = loopside_json(&["--data-dir", &d, "tag", "show", "LT-999", "--json"]);
    assert!(shown["tag"]["intrinsic"].is_null());
    // Bad IS input on `tag add` exits 2 naming the field, and no tag is made.
    let e = loopside_refuses(&[
        "--data-dir",
        &d,
        "tag",
        "add",
        "TT-421",
        "--range",
        "0..100",
        "--unit",
        "°C",
        "--uo",
        "-28",
        "--io",
        "93",
        "--po",
        "0.65",
        "--co",
        "83",
        "--lo",
        "4.2",
        "--ui",
        "30",
        "--ii",
        "100",
        "--pi",
        "0.75",
        "--is-cable-m",
        "10",
        "--group",
        "IIC",
    ]);
    assert!(e.contains("uo"), "{e}");
    let out = loopside(&["--data-dir", &d, "tag", "show", "TT-421"]);
    assert!(!out.status.success());
    assert!(String::from_utf8_lossy(&out.stderr).contains("TT-421"));
}
