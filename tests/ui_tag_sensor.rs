//! The tag form's sensor and signal span, driven through Slint's testing backend by
//! accessible labels: the signal span, the sensor and the RTD wiring are picked from lists,
//! only the picked family's fields are shown, a bad cold junction is named, and the tag is
//! saved with what was picked.
#![cfg(feature = "ui")]

mod util;

use util::ui::{all, one, save_tag_form, tap, type_into};

use i_slint_backend_testing::AccessibleRole;
use loopside::app::{AppState, FormField, Screen, TagsAdapter};
use loopside::rtd::{RtdKind, Wiring};
use loopside::sensor::Sensor;
use loopside::thermocouple::TcType;
use slint::{ComponentHandle, Model};

/// Tap the picker option labelled `label` (`Signal: 0–20 mA`).
fn pick(app: &loopside::app::App, label: &str) {
    one(app, label, AccessibleRole::Checkbox).invoke_accessible_default_action();
}

/// Pick `label` in the sensor list (a drop-down: its options are read from the form).
fn pick_sensor(app: &loopside::app::App, label: &str) {
    one(app, "Sensor", AccessibleRole::Combobox);
    let tags = app.window.global::<TagsAdapter>();
    let i = tags
        .get_form()
        .sensor_options
        .iter()
        .position(|o| o == label)
        .unwrap_or_else(|| panic!("no {label:?} in the sensor list"));
    tags.invoke_pick_sensor(i32::try_from(i).unwrap());
}

#[test]
fn a_pt100_on_a_zero_to_twenty_card_is_picked_not_typed() {
    // TT-420 on the digester heating loop at Brindlemoor: 0–150 °C from a Pt100 wired with
    // two wires (0,8 Ω of lead in all) into an older 0–20 mA input card.
    let app = util::ui::app_sized(AppState::demo(), 1280.0, 6000.0);
    app.show_screen(Screen::Tags);
    tap(&app, "New tag");
    type_into(&app, "Tag number", "TT-420");
    type_into(&app, "URV", "150");
    type_into(&app, "Unit", "°C");
    // 4–20 mA until another span is picked.
    let signal = |label: &str| {
        one(&app, &format!("Signal: {label}"), AccessibleRole::Checkbox).accessible_checked()
    };
    assert_eq!(signal("4–20 mA"), Some(true));
    pick(&app, "Signal: 0–20 mA");
    assert_eq!(signal("0–20 mA"), Some(true));
    assert_eq!(signal("4–20 mA"), Some(false));
    // No wiring or cold junction asked for until a sensor is picked.
    assert!(all(&app, "RTD wiring: 3-wire", AccessibleRole::Checkbox).is_empty());
    assert!(all(&app, "Cold junction", AccessibleRole::TextInput).is_empty());
    pick_sensor(&app, "Pt100 RTD");
    assert_eq!(
        one(&app, "RTD wiring: 3-wire", AccessibleRole::Checkbox).accessible_checked(),
        Some(true),
        "three wires unless another is picked"
    );
    assert!(all(&app, "Cold junction", AccessibleRole::TextInput).is_empty());
    pick(&app, "RTD wiring: 2-wire");
    type_into(&app, "Lead resistance, both leads", "0,8");
    save_tag_form(&app);
    let tags = app.window.global::<TagsAdapter>();
    {
        let state = app.state.borrow();
        let tag = &state.store.tag("TT-420").expect("saved").tag;
        assert_eq!(
            (tag.scale.signal.low_ma, tag.scale.signal.high_ma),
            (0.0, 20.0)
        );
        assert_eq!(
            tag.sensor,
            Some(Sensor::Rtd {
                element: RtdKind::Pt100,
                wiring: Wiring::TwoWire,
                lead_ohms: 0.8
            })
        );
    }
    // The sheet says so.
    let facts: Vec<String> = tags
        .get_sheet_facts()
        .iter()
        .map(|f| format!("{}: {}", f.label, f.value))
        .collect();
    assert!(
        facts.contains(&"Sensor: Pt100 RTD, 2-wire, leads 0.8 Ω".to_string()),
        "{facts:?}"
    );

    // The sensor is changed for a type K: the RTD's fields go, the cold junction is asked
    // for; 250 °C is no transmitter terminal and is named.
    tap(&app, "Edit TT-420");
    assert_eq!(signal("0–20 mA"), Some(true), "the span is shown as saved");
    pick_sensor(&app, "type K thermocouple");
    assert!(all(&app, "RTD wiring: 2-wire", AccessibleRole::Checkbox).is_empty());
    type_into(&app, "Cold junction", "250");
    tap(&app, "Save");
    assert_eq!(tags.get_error_field(), FormField::ColdJunction);
    assert!(tags.get_editing(), "the form stays open");
    type_into(&app, "Cold junction", "25");
    save_tag_form(&app);
    assert_eq!(
        app.state.borrow().store.tag("TT-420").unwrap().tag.sensor,
        Some(Sensor::Thermocouple {
            tc: TcType::K,
            cj_c: 25.0
        })
    );
}

#[test]
fn on_a_400_px_phone_every_field_of_the_tag_form_is_reached() {
    // The window's preferred width: the phone layout (the form over the list), with the
    // fields that sit side by side (URV beside LRV, the supply's sag beside the supply,
    // the fault current beside the transmitter minimum) each in reach. PT-990, a spare
    // pressure loop: 0–16 bar, 24 V that may sag 10 %, 12 V transmitter, 21 mA fault.
    let app = util::ui::app_sized(AppState::demo(), 400.0, 6000.0);
    app.show_screen(Screen::Tags);
    tap(&app, "New tag");
    assert!(
        all(&app, "Search tags", AccessibleRole::TextInput).is_empty(),
        "the form covers the list on a phone"
    );
    type_into(&app, "Tag number", "PT-990");
    type_into(&app, "URV", "16");
    type_into(&app, "Unit", "bar");
    type_into(&app, "Supply may sag", "10");
    type_into(&app, "Transmitter minimum", "12");
    type_into(&app, "Fault current", "21");
    save_tag_form(&app);
    let state = app.state.borrow();
    let tag = &state.store.tag("PT-990").expect("saved").tag;
    assert_eq!((tag.scale.urv, tag.scale.unit.as_str()), (16.0, "bar"));
    let c = tag.loop_config.as_ref().expect("a loop");
    assert_eq!(
        (c.supply_tolerance_percent, c.tx_min_volts, c.fault_ma),
        (10.0, 12.0, Some(21.0))
    );
}
