//! Loop checks and fault-finding sessions saved through the application layer (no UI):
//! one payload shape per log kind, one log text with the technician's own words, and
//! older records of both earlier shapes still read.

mod util;

use loopside::action::check::{
    payload, save_check, sensor_inputs_of, sensor_of, NewCheck, SensorInputs, PAYLOAD_VERSION,
};
use loopside::action::session::{findings_of, save_session, session_of};
use loopside::check::Stage;
use loopside::diagnose::{procedure, session::AnswerSheet, Session};
use loopside::journal::Kind;
use loopside::leave::Item;
use loopside::sensor::Sensor;
use loopside::store::{MemoryStore, Store};
use loopside::view::check::{check_for, result};

use util::afternoon as now;

fn brindlemoor() -> MemoryStore {
    util::brindlemoor(now())
}

/// Readings as typed, with a decimal comma, each `offset_ma` off the ideal current at the
/// five-point up-and-down plan (0, 25, 50, 75, 100, 75, 50, 25, 0 %).
fn readings(offset_ma: f64) -> Vec<String> {
    [4.0, 8.0, 12.0, 16.0, 20.0, 16.0, 12.0, 8.0, 4.0]
        .iter()
        .map(|ma: &f64| format!("{:.2}", ma + offset_ma).replace('.', ","))
        .collect()
}

#[test]
fn a_five_point_check_as_found_is_saved_with_the_technicians_words() {
    let mut store = brindlemoor();
    // LT-101 (0–4.5 m, ±0.5 % of span). As found, the zero reads 0.12 mA high all the way
    // up and down: 0.12 / 16 mA of span = +0.75 % of span at every point, a fail.
    let tag = store.tag("LT-101").unwrap().tag.clone();
    let check = check_for(&tag, Stage::AsFound, now().date_naive())
        .note("Reference: loop calibrator LC-07");
    let mut res = result(&check, &readings(0.12)).unwrap();
    res.left(&[Item::Loop, Item::Operations]);
    assert!(!res.pass);
    let saved = save_check(
        &mut store,
        now(),
        NewCheck {
            tag: "lt-101",
            initials: "ef",
            result: &res,
            sensor: None,
        },
    )
    .unwrap();
    assert_eq!(
        saved.to_string(),
        format!("Saved the as found check as {}.", saved.id)
    );
    assert!(!saved.pass);
    let e = store.entry(&saved.id).unwrap();
    assert_eq!(e.kind, Kind::LoopCheck);
    assert_eq!(e.author, "EF");
    let lines: Vec<&str> = e.text.lines().collect();
    assert!(
        lines[0].starts_with("transmitter check, as found: FAIL"),
        "{}",
        e.text
    );
    assert_eq!(
        lines[1], "Reference: loop calibrator LC-07",
        "own words kept"
    );
    assert!(lines[2].starts_with("Before you leave:"), "{}", e.text);
    let p = e.payload.as_ref().unwrap();
    assert_eq!(p["payload_version"], PAYLOAD_VERSION);
    assert_eq!(p["pass"], false);
    assert!((p["max_error_pct"].as_f64().unwrap() - 0.75).abs() < 1e-9);
    assert!(p.get("sensor").is_none() && p.get("sensor_inputs").is_none());
}

#[test]
fn a_missing_reading_is_named_and_nothing_is_saved() {
    let store = brindlemoor();
    let tag = store.tag("LT-101").unwrap().tag.clone();
    let check = check_for(&tag, Stage::AsFound, now().date_naive());
    let e = result(&check, &["4.01".to_string()]).unwrap_err();
    assert_eq!(e.field, "reading at 25 % ↑");
}

#[test]
fn an_rtd_check_records_the_ohms_applied_and_the_sensor() {
    let mut store = brindlemoor();
    // TT-412: −20 to 80 °C on a 3-wire Pt100. The planned points are applied as ohms;
    // IEC 60751 table: Pt100 at −20 °C is 92.16 Ω, at 30 °C 111.67 Ω, at 80 °C 130.90 Ω.
    let tag = store.tag("TT-412").unwrap().tag.clone();
    let sensor = tag.sensor.unwrap();
    let check = check_for(&tag, Stage::AsFound, now().date_naive());
    let res = result(&check, &readings(0.0)).unwrap();
    let inputs = SensorInputs::planned(sensor, &res).unwrap();
    assert_eq!(inputs.unit, "Ω");
    for (i, ohms) in [(0, 92.16), (2, 111.67), (4, 130.90)] {
        assert!(
            (inputs.values[i] - ohms).abs() < 0.01,
            "{:?}",
            inputs.values
        );
    }
    let saved = save_check(
        &mut store,
        now(),
        NewCheck {
            tag: "TT-412",
            initials: "GH",
            result: &res,
            sensor: Some(inputs.clone()),
        },
    )
    .unwrap();
    assert!(saved.pass);
    let p = store.entry(&saved.id).unwrap().payload.clone().unwrap();
    assert_eq!(p["sensor"]["kind"], "rtd");
    assert_eq!(p["sensor"]["element"], "pt100");
    assert_eq!(p["sensor_inputs"]["unit"], "Ω");
    assert_eq!(sensor_of(&p), Some(sensor));
    assert_eq!(sensor_inputs_of(&p).unwrap().values, inputs.values);
}

#[test]
fn older_check_records_of_both_shapes_still_read() {
    let store = brindlemoor();
    let tag = store.tag("TT-412").unwrap().tag.clone();
    let Some(sensor @ Sensor::Rtd { .. }) = tag.sensor else {
        panic!("TT-412 has a Pt100")
    };
    let res = result(
        &check_for(&tag, Stage::AsFound, now().date_naive()),
        &readings(0.0),
    )
    .unwrap();
    let v2 = payload(&res, Some(&SensorInputs::planned(sensor, &res).unwrap())).unwrap();
    // The app's older shape: the result and `sensor`, no inputs, no version.
    let mut app_v1 = serde_json::to_value(&res).unwrap();
    app_v1["sensor"] = serde_json::to_value(sensor).unwrap();
    // The command line's older shape: the result and `sensor_inputs`, no sensor.
    let mut cli_v1 = serde_json::to_value(&res).unwrap();
    cli_v1["sensor_inputs"] = v2["sensor_inputs"].clone();
    let want = sensor_inputs_of(&v2).unwrap().values;
    for old in [&app_v1, &cli_v1] {
        let got = sensor_inputs_of(old).unwrap().values;
        assert_eq!(got.len(), want.len());
        for (g, w) in got.iter().zip(&want) {
            assert!((g - w).abs() < 1e-9, "{got:?} vs {want:?}");
        }
    }
    assert_eq!(sensor_of(&app_v1), Some(sensor));
    assert_eq!(sensor_of(&cli_v1), None, "the command line did not name it");
}

#[test]
fn a_fault_session_keeps_the_technicians_conclusion() {
    let mut store = brindlemoor();
    // LT-101 reads 0 mA: 24 V at the supply, 0.1 V at the transmitter — open wiring.
    let tag = store.tag("LT-101").unwrap().tag.clone();
    let p = procedure::find("stuck-low", &[]).unwrap();
    let mut s = Session::start(&p, &tag);
    let sheet = AnswerSheet::from_json(
        r#"{"tx_ma": 0, "supply_v": 24, "terminal_v": 0.1, "conclusion": "re-terminated JB-01/4"}"#,
        &tag,
    )
    .unwrap();
    s.run_sheet(&p, &tag, &sheet).unwrap();
    s.left(&Item::ALL);
    let saved = save_session(&mut store, now(), &s, "cd").unwrap();
    assert_eq!(
        saved.to_string(),
        format!("Saved to the log as {}.", saved.id)
    );
    let e = store.entry(&saved.id).unwrap();
    assert_eq!(e.kind, Kind::FaultFinding);
    assert_eq!(e.author, "CD");
    assert!(
        e.text.contains("\nTechnician: re-terminated JB-01/4\n"),
        "{}",
        e.text
    );
    assert!(e.text.ends_with("operations told)."), "{}", e.text);
    let payload = e.payload.as_ref().unwrap();
    assert_eq!(payload["payload_version"], 3);
    assert_eq!(payload["technician_conclusion"], "re-terminated JB-01/4");
    // Version 3 keeps each finding as its code and numbers; the words are written when
    // it is shown.
    let findings = payload["findings"].as_array().unwrap();
    let codes: Vec<&str> = findings
        .iter()
        .map(|f| f["code"].as_str().unwrap())
        .collect();
    assert_eq!(
        codes,
        vec![
            "band-no-loop-current",
            "supply-ok",
            "no-voltage-at-transmitter"
        ]
    );
    for f in findings {
        assert!(f.get("text").is_none(), "no stored words: {f}");
    }
    assert_eq!(findings[2]["detail"]["terminal_v"], 0.1);
    let words = findings_of(payload);
    assert_eq!(words[2].0, "terminals-open");
    assert!(
        words[2]
            .1
            .starts_with("Only 0.10 V reaches the transmitter terminals"),
        "{}",
        words[2].1
    );
}

/// The same LT-101 session as saved by loopside before version 3: each finding with its
/// words, which said the supply "measures" rather than "reads"; and one finding under a
/// code this loopside does not make (as a plant's own procedure might have left).
fn version_2_record() -> serde_json::Value {
    let mut store = brindlemoor();
    let tag = store.tag("LT-101").unwrap().tag.clone();
    let p = procedure::find("stuck-low", &[]).unwrap();
    let mut s = Session::start(&p, &tag);
    let sheet =
        AnswerSheet::from_json(r#"{"tx_ma": 0, "supply_v": 24, "terminal_v": 0.1}"#, &tag).unwrap();
    s.run_sheet(&p, &tag, &sheet).unwrap();
    let saved = save_session(&mut store, now(), &s, "cd").unwrap();
    let mut payload = store.entry(&saved.id).unwrap().payload.clone().unwrap();
    payload["payload_version"] = serde_json::json!(2);
    let findings = payload["findings"].as_array_mut().unwrap();
    findings[1]["text"] = serde_json::json!("The supply measures 24.00 V: enough for the loop.");
    findings.push(serde_json::json!({
        "step": "terminals-open",
        "code": "polarity-reversed",
        "text": "The pair is reversed at JB-01: +24 V on the transmitter's negative terminal.",
        "detail": {"terminal_v": -23.9}
    }));
    for f in findings.iter_mut().filter(|f| f.get("text").is_none()) {
        f["text"] = serde_json::json!("(words as stored)");
    }
    payload
}

#[test]
fn a_version_2_record_is_reworded_where_its_code_is_known_and_kept_where_not() {
    let old = version_2_record();
    let words = findings_of(&old);
    assert_eq!(words.len(), 4);
    // A known code with the numbers its words need: today's words, from the record's own
    // numbers (24 V measured; LT-101's 24 V supply has no sag set, and the loop needs
    // 10.5 V + 256.2 Ω × 22 mA = 16.14 V at its fault current: Ohm's law).
    assert_eq!(
        words[1].1,
        "The supply reads 24.00 V: at or above the 24.00 V it should hold and the 16.14 V the loop needs."
    );
    // A code this loopside does not make: the words the record kept.
    assert_eq!(
        words[3],
        (
            "terminals-open".to_string(),
            "The pair is reversed at JB-01: +24 V on the transmitter's negative terminal."
                .to_string()
        )
    );
    // The record reads back as a session; saved again it is written as version 3, the
    // words kept only where nothing else can give them.
    let session = session_of(&old).unwrap();
    assert_eq!(session.findings[1].saved_text, None);
    assert_eq!(
        session.findings[3].saved_text.as_deref(),
        Some("The pair is reversed at JB-01: +24 V on the transmitter's negative terminal.")
    );
    let again = loopside::action::session::payload(&session).unwrap();
    assert_eq!(again["payload_version"], 3);
    assert!(again["findings"][1].get("text").is_none());
    assert_eq!(
        again["findings"][3]["text"],
        "The pair is reversed at JB-01: +24 V on the transmitter's negative terminal."
    );
}
