//! The IS actions on the demo plant: TT-412's IS data stored on the tag, an IS check saved
//! to its log with who checked (one record shape, the same the demo wrote), the Log list's
//! title for it, the hand-over report's section, and old stores opening unchanged.

mod util;

use loopside::action::bundle::{handover, Format};
use loopside::action::intrinsic::{payload, record_of, save_is_check, set_circuit, NewIsCheck};
use loopside::demo::tt412_circuit;
use loopside::intrinsic::{check, Device, DeviceKind, GasGroup, TempClass};
use loopside::journal::{Kind, Query};
use loopside::store::Store;
use loopside::tag::Tag;
use loopside::view::wording::intrinsic as words;
use util::{afternoon, brindlemoor};

#[test]
fn tt412_check_is_saved_with_its_inputs_results_and_who_checked() {
    let mut store = brindlemoor(afternoon());
    let circuit = tt412_circuit();
    let saved = save_is_check(
        &mut store,
        afternoon(),
        NewIsCheck {
            tag: "tt-412",
            initials: "ef",
            circuit: &circuit,
            note: "after the transmitter swap",
        },
    )
    .unwrap();
    assert!(saved.ok);
    assert_eq!(
        saved.to_string(),
        format!("Saved the IS check of TT-412 (pass) as {}.", saved.id)
    );
    let e = store.entries().last().unwrap().clone();
    assert_eq!(e.kind, Kind::IsCheck);
    assert_eq!(e.author, "EF");
    let verdict = check(&circuit).unwrap();
    assert_eq!(
        e.payload.as_ref().unwrap(),
        &payload(&circuit, &verdict, "after the transmitter swap").unwrap()
    );
    assert!(e.text.starts_with(&words::log_text(&circuit, &verdict)));
    assert!(e.text.ends_with("Note: after the transmitter swap"));
    assert_eq!(record_of(&e), Some((circuit, verdict)));
}

#[test]
fn the_demo_record_has_the_shape_the_action_writes() {
    let store = brindlemoor(afternoon());
    let e = store
        .entries()
        .iter()
        .find(|e| e.kind == Kind::IsCheck)
        .expect("the demo has one IS check")
        .clone();
    let circuit = tt412_circuit();
    let verdict = check(&circuit).unwrap();
    assert_eq!(e.payload.unwrap(), payload(&circuit, &verdict, "").unwrap());
    assert_eq!(
        store.tag("TT-412").unwrap().tag.intrinsic,
        Some(tt412_circuit())
    );
}

#[test]
fn a_failed_check_is_saved_too_and_the_log_says_failed() {
    // A field indicator with Ui 24 V added to TT-412's circuit: Ui 24 V < Uo 28 V → FAIL
    // on voltage (every other check as in the demo: pass).
    let mut store = brindlemoor(afternoon());
    let mut circuit = tt412_circuit();
    circuit.devices.push(Device {
        name: "field indicator".into(),
        certificate: String::new(),
        kind: DeviceKind::Entity {
            ui_volts: 24.0,
            ii_ma: 100.0,
            pi_watts: 1.0,
            group: Some(GasGroup::IIC),
            t_class: Some(TempClass::T4),
        },
        ci_farads: 0.0,
        li_henries: 0.0,
        temporary: false,
    });
    let saved = save_is_check(
        &mut store,
        afternoon(),
        NewIsCheck {
            tag: "TT-412",
            initials: "CD",
            circuit: &circuit,
            note: "",
        },
    )
    .unwrap();
    assert!(!saved.ok);
    let e = store.entries().last().unwrap();
    assert!(e.text.contains("FAIL"), "{}", e.text);
    assert!(
        e.text.contains("Voltage: Ui ≥ Uo — field indicator"),
        "{}",
        e.text
    );
    let closed = Default::default();
    let kind = loopside::view::log::row_kind(e, &closed);
    assert_eq!(
        loopside::view::log::title(e, kind),
        "IS check FAILED".to_string()
    );
}

#[test]
fn the_is_data_is_stored_on_the_tag_and_can_be_removed() {
    let mut store = brindlemoor(afternoon());
    let mut circuit = tt412_circuit();
    circuit.cable.length_m = 260.0;
    let saved = set_circuit(&mut store, "TT-412", Some(circuit.clone())).unwrap();
    assert_eq!(saved.to_string(), "Saved the IS data of TT-412.");
    assert_eq!(store.tag("TT-412").unwrap().tag.intrinsic, Some(circuit));
    let stored = store.tag("TT-412").unwrap().tag.intrinsic.clone();
    let again = set_circuit(&mut store, "TT-412", stored).unwrap();
    assert!(!again.changed);
    let removed = set_circuit(&mut store, "TT-412", None).unwrap();
    assert_eq!(removed.to_string(), "Removed the IS data of TT-412.");
    assert_eq!(store.tag("TT-412").unwrap().tag.intrinsic, None);
    // Bad input is refused naming the field; the tag is left as it was.
    let mut bad = tt412_circuit();
    bad.source.co_farads = -1.0;
    let e = set_circuit(&mut store, "TT-412", Some(bad)).unwrap_err();
    assert!(e.to_string().starts_with("co:"), "{e}");
    assert_eq!(store.tag("TT-412").unwrap().tag.intrinsic, None);
}

#[test]
fn a_tag_written_before_intrinsic_safety_opens_unchanged() {
    // TT-412 as stores held it before this field: the same tag with no "intrinsic" key.
    let store = brindlemoor(afternoon());
    let now = store.tag("TT-412").unwrap().tag.clone();
    let mut old = serde_json::to_value(&now).unwrap();
    assert!(old.get("intrinsic").is_some());
    old.as_object_mut().unwrap().remove("intrinsic");
    let t: Tag = serde_json::from_value(old).unwrap();
    assert_eq!(t.intrinsic, None);
    assert_eq!(
        Tag {
            intrinsic: now.intrinsic.clone(),
            ..t
        },
        now
    );
    // And the tag as the store writes it now round-trips, without the key when None.
    let tag = Tag::new(
        "LT-101",
        loopside::scale::Scale::linear(0.0, 4.5, "m").unwrap(),
    )
    .unwrap();
    let v = serde_json::to_value(&tag).unwrap();
    assert!(v.get("intrinsic").is_none());
    let back: Tag = serde_json::from_value(v).unwrap();
    assert_eq!(back, tag);
}

#[test]
fn the_hand_over_report_shows_the_is_check_with_its_checks() {
    let store = brindlemoor(afternoon());
    let h = handover(&store, afternoon(), &Query::default(), Format::Markdown);
    assert!(h.text.contains("**is-check**"), "kind shown");
    assert!(
        h.text.contains("  - pass  Capacitance: Co ≥ ΣCi + C cable"),
        "{}",
        h.text
    );
    assert!(h.text.contains("Longest cable that still passes"));
    assert!(h.text.contains("BWR-DEMO-IS-0412 (invented)"));
}
