//! UI behaviour through Slint's testing backend: find elements by accessible label, type,
//! tap, and read what the screen shows.
#![cfg(feature = "ui")]

mod util;

use i_slint_backend_testing::{AccessibleRole, ElementHandle};
use loopside::app::{App, AppState, CalcField, ConvertAdapter, Screen};
use slint::ComponentHandle;

/// The app on the testing backend, in a tall desktop-size window so every screen fits
/// without scrolling (the backend finds only elements it counts as visible).
fn app() -> App {
    util::ui::app_sized(AppState::demo(), 1280.0, 3000.0)
}

/// The one element with this label and role (a field's or button's visible text carries
/// the same label, with the role `text`).
fn with_role(app: &App, label: &str, role: AccessibleRole) -> ElementHandle {
    util::ui::one(app, label, role)
}

/// The input field with this label.
fn field(app: &App, label: &str) -> ElementHandle {
    with_role(app, label, AccessibleRole::TextInput)
}

/// The button with this label.
fn button(app: &App, label: &str) -> ElementHandle {
    with_role(app, label, AccessibleRole::Button)
}

fn value_of(app: &App, label: &str) -> String {
    field(app, label)
        .accessible_value()
        .unwrap_or_default()
        .to_string()
}

#[test]
fn typing_ma_updates_percent_and_value() {
    let app = app();
    app.show_screen(Screen::Convert);
    // LT-101, 0–4.5 m: 8 mA is 25 % and 1.125 m.
    field(&app, "Loop current").set_accessible_value("8");
    assert_eq!(value_of(&app, "Percent of span"), "25.00");
    assert_eq!(value_of(&app, "Value"), "1.1250");
    // A decimal comma is a decimal point.
    field(&app, "Loop current").set_accessible_value("12,4");
    assert_eq!(value_of(&app, "Percent of span"), "52.50");
    // Typing the value works the other way.
    field(&app, "Value").set_accessible_value("4,5");
    assert_eq!(value_of(&app, "Loop current"), "20.000");
    assert_eq!(value_of(&app, "Percent of span"), "100.00");
}

#[test]
fn bad_input_names_the_field_and_keeps_the_text() {
    let app = app();
    app.show_screen(Screen::Convert);
    field(&app, "Loop current").set_accessible_value("12 furlongs");
    let adapter = app.window.global::<ConvertAdapter>();
    assert_eq!(adapter.get_error_field(), loopside::app::FormField::Ma);
    assert!(adapter.get_error_text().starts_with("mA:"));
    assert_eq!(value_of(&app, "Loop current"), "12 furlongs");
    field(&app, "Loop current").set_accessible_value("4");
    assert_eq!(adapter.get_error_text(), "");
    assert_eq!(adapter.get_status_title(), "In range");
}

#[test]
fn volts_across_the_resistor_give_the_current() {
    let app = app();
    app.show_screen(Screen::Convert);
    // 250 Ω sense resistor: 1–5 V over 4–20 mA (common practice).
    field(&app, "Volts measured").set_accessible_value("3");
    assert_eq!(value_of(&app, "Loop current"), "12.000");
}

#[test]
fn editing_the_loop_moves_the_verdict() {
    let app = app();
    app.show_screen(Screen::Power);
    let adapter = app.window.global::<loopside::app::PowerAdapter>();
    assert_eq!(
        adapter.get_verdict_kind(),
        loopside::app::Tone::Good,
        "LT-101 has enough voltage"
    );
    field(&app, "Supply").set_accessible_value("15");
    assert_eq!(
        adapter.get_verdict_kind(),
        loopside::app::Tone::Bad,
        "15 V is not enough for LT-101"
    );
    field(&app, "Supply").set_accessible_value("24 V x");
    assert_eq!(adapter.get_error_field(), loopside::app::FormField::Supply);
}

#[test]
fn power_says_what_it_assumed() {
    let app = app();
    app.show_screen(Screen::Power);
    let adapter = app.window.global::<loopside::app::PowerAdapter>();
    let notes = || {
        use slint::Model;
        adapter
            .get_notes()
            .iter()
            .map(|n| n.to_string())
            .collect::<Vec<_>>()
    };
    // The demo LT-101 gives neither a supply sag nor the device's fault current, and the
    // screen says so in words the technician can read.
    let first = notes();
    assert!(
        first.iter().any(|n| n.starts_with("No supply sag assumed")),
        "{first:?}"
    );
    assert!(
        first.iter().any(|n| n.contains("22.0 mA is a default")),
        "{first:?}"
    );
    for note in &first {
        assert!(
            with_role(&app, note, AccessibleRole::Text).is_valid(),
            "{note} is on the screen"
        );
    }
    assert_eq!(
        value_of(&app, "Fault current"),
        "",
        "empty: the default is used"
    );
    // The device is configured for 21.5 mA, and the supply may sag 5 %.
    field(&app, "Fault current").set_accessible_value("21,5");
    field(&app, "Supply may sag").set_accessible_value("5");
    let now = notes().join(" ");
    assert!(!now.contains("default"), "{now}");
    assert!(!now.contains("No supply sag"), "{now}");
    assert!(now.contains("5 % sag"), "{now}");
    assert_eq!(adapter.get_fault_title(), "At 21.5 mA (upscale fault)");
}

#[test]
fn a_note_appears_in_the_log() {
    let app = app();
    app.show_screen(Screen::Log);
    field(&app, "Note").set_accessible_value("Cable gland loose at JB-01, tightened");
    button(&app, "Add note").invoke_accessible_default_action();
    let entry = with_role(
        &app,
        "LT-101 Note: Cable gland loose at JB-01, tightened",
        AccessibleRole::Text,
    );
    assert!(entry.is_valid());
    assert_eq!(
        value_of(&app, "Note"),
        "",
        "the field is cleared after adding"
    );
}

#[test]
fn cautions_come_before_fault_finding_steps() {
    let app = app();
    app.show_screen(Screen::Fault);
    assert_eq!(
        ElementHandle::find_by_accessible_label(&app.window, "Reading stuck at or below zero")
            .count(),
        0,
        "no symptom or step before the cautions are read"
    );
    button(&app, "I have read these; start").invoke_accessible_default_action();
    assert!(button(&app, "Reading stuck at or below zero").is_valid());
}

#[test]
fn picking_a_tag_returns_to_convert_with_its_range() {
    let app = app();
    app.show_screen(Screen::Convert);
    button(&app, "Change tag").invoke_accessible_default_action();
    // The list shows what fits; search brings the tag into view, as a technician would.
    field(&app, "Search tags").set_accessible_value("707");
    button(&app, "PDT-707").invoke_accessible_default_action();
    let adapter = app.window.global::<ConvertAdapter>();
    assert_eq!(adapter.get_tag_title(), "PDT-707");
    // Reversed 250–0 mbar: 12 mA is 125 mbar.
    field(&app, "Loop current").set_accessible_value("12");
    assert_eq!(value_of(&app, "Value"), "125.00");
    // Picking a tag returned to Convert, so Tags is not on the back stack.
    assert!(!app.back(), "nothing to go back to");
}

#[test]
fn the_sensor_calculator_works_both_ways() {
    let app = app();
    app.show_screen(Screen::Convert);
    let a = app.window.global::<ConvertAdapter>();
    // Pt100 at 75 °C: 128.99 Ω in the IEC 60751 table.
    a.invoke_calc_edited(CalcField::Temperature, "75".into());
    assert_eq!(a.get_calc_signal(), "128.987");
    // Type K with the transmitter's terminals at 20 °C: 12,209 mV − E(20 °C) 0,798 mV =
    // 11,411 mV read back is 300 °C (NIST ITS-90 type K table; table values are rounded
    // to 1 µV, about 0.03 °C here).
    // The sensor is picked from the core's list, not typed.
    with_role(&app, "Sensor", AccessibleRole::Combobox);
    let sensors: Vec<String> = slint::Model::iter(&a.get_calc_sensors())
        .map(|s| s.to_string())
        .collect();
    assert_eq!(sensors.len(), 11, "three RTDs and eight thermocouple types");
    let k = sensors
        .iter()
        .position(|s| s == "type K thermocouple")
        .unwrap();
    a.invoke_calc_pick_sensor(i32::try_from(k).unwrap());
    assert!(a.get_calc_tc());
    assert_eq!(a.get_calc_sensor_index(), i32::try_from(k).unwrap());
    a.invoke_calc_edited(CalcField::Signal, "11,411".into());
    let t: f64 = a.get_calc_temp().parse().unwrap();
    assert!((t - 300.0).abs() <= 0.05, "{t}");
    a.invoke_calc_edited(CalcField::ColdJunction, "cold".into());
    assert_eq!(
        a.get_calc_error_field(),
        loopside::app::FormField::ColdJunction
    );
}

#[test]
fn a_new_tag_is_entered_with_its_whole_loop() {
    // A flow loop at the filter house: 24 V supply, transmitter needs 10,5 V, a 250 Ω card
    // input, an isolating barrier dropping 8 V, 220 m of 18 AWG pair, and HART on it.
    let app = app();
    app.show_screen(Screen::Tags);
    button(&app, "New tag").invoke_accessible_default_action();
    field(&app, "Tag number").set_accessible_value("FT-640");
    field(&app, "Service").set_accessible_value("Backwash water flow");
    field(&app, "URV").set_accessible_value("120");
    field(&app, "Unit").set_accessible_value("m³/h");
    // The transfer is picked from the list, not typed; the cutoff field then appears.
    let root_in_receiver = || {
        with_role(
            &app,
            "Transfer: square root in the receiver",
            AccessibleRole::Checkbox,
        )
    };
    assert_eq!(root_in_receiver().accessible_checked(), Some(false));
    root_in_receiver().invoke_accessible_default_action();
    assert_eq!(root_in_receiver().accessible_checked(), Some(true));
    field(&app, "Low-flow cutoff, % of flow").set_accessible_value("1");
    field(&app, "Loop supply").set_accessible_value("24");
    field(&app, "Transmitter minimum").set_accessible_value("10,5");
    button(&app, "Add resistor").invoke_accessible_default_action();
    field(&app, "Element 1 name").set_accessible_value("Card input");
    field(&app, "Card input").set_accessible_value("250");
    button(&app, "Add volt drop").invoke_accessible_default_action();
    field(&app, "Element 2 name").set_accessible_value("Barrier");
    field(&app, "Barrier").set_accessible_value("8");
    field(&app, "Cable, one way").set_accessible_value("220");
    // The conductor is picked from the list of common sizes, not typed.
    let tags = app.window.global::<loopside::app::TagsAdapter>();
    let sizes: Vec<String> = slint::Model::iter(&tags.get_form().cable_sizes)
        .map(|s| s.to_string())
        .collect();
    with_role(&app, "Conductor", AccessibleRole::Combobox);
    let awg18 = sizes.iter().position(|s| s == "AWG 18").unwrap();
    tags.invoke_pick_conductor(i32::try_from(awg18).unwrap());
    assert_eq!(tags.get_form().cable_size, "AWG 18");
    with_role(&app, "HART on this loop", AccessibleRole::Checkbox)
        .invoke_accessible_default_action();
    button(&app, "Save").invoke_accessible_default_action();

    let state = app.state.borrow();
    let tag = state.open_tag().expect("the new tag is open");
    assert_eq!(tag.number, "FT-640");
    assert_eq!(
        tag.scale.transfer,
        loopside::scale::Transfer::SquareRoot {
            cutoff_percent: 1.0,
            root_in: loopside::scale::RootLocation::Receiver
        }
    );
    assert!(tag.hart);
    let c = tag.loop_config.as_ref().expect("the loop is recorded");
    assert_eq!(c.tx_min_volts, 10.5);
    let names: Vec<_> = c.elements.iter().map(|e| e.name.as_str()).collect();
    assert_eq!(names, ["Card input", "Barrier"]);
    assert_eq!(c.cable.unwrap().one_way_m, 220.0);
    assert_eq!(
        c.cable.unwrap().conductor,
        loopside::wire::Conductor::Awg(18)
    );
    drop(state);
    // Power works on the loop as entered, HART verdict included.
    app.show_screen(Screen::Power);
    let power = app.window.global::<loopside::app::PowerAdapter>();
    assert!(power.get_hart());
    assert_ne!(power.get_hart_title(), "");
}

#[test]
fn the_back_key_still_works_after_the_focused_field_has_gone() {
    use slint::platform::{Key, WindowEvent};
    let app = app();
    app.window
        .window()
        .set_size(slint::LogicalSize::new(400.0, 860.0));
    app.window.show().unwrap();
    app.show_screen(Screen::Convert);
    // The technician taps into the mA field, then goes to Log: the field goes with Convert.
    let key = |e: fn(slint::SharedString) -> WindowEvent, text: slint::SharedString| {
        app.window.window().dispatch_event(e(text));
    };
    let press = |text: slint::SharedString| {
        key(|text| WindowEvent::KeyPressed { text }, text.clone());
        key(|text| WindowEvent::KeyReleased { text }, text);
    };
    field(&app, "Loop current").set_accessible_value("");
    field(&app, "Loop current").mock_single_click(slint::platform::PointerEventButton::Left);
    press("7".into());
    assert_eq!(
        value_of(&app, "Loop current"),
        "7",
        "the tap put the focus in the field"
    );
    app.show_screen(Screen::Log);
    press(Key::Back.into());
    assert_eq!(
        app.window
            .global::<loopside::app::AppAdapter>()
            .get_screen(),
        Screen::Convert,
        "the back button returns to Convert"
    );
}

#[test]
fn the_open_tags_sheet_sits_beside_the_list_on_a_wide_window() {
    let app = app();
    app.show_screen(Screen::Tags);
    // LT-101 (demo): 0–4.5 m linear, a 24 V loop with a 250 Ω PLC input and 180 m of cable.
    assert!(with_role(&app, "0 – 4.5 m, linear", AccessibleRole::Text).is_valid());
    assert!(with_role(
        &app,
        "24 V supply, transmitter min 10.5 V, PLC input 250 Ω, cable 180 m 1 mm²",
        AccessibleRole::Text
    )
    .is_valid());
    // Opening another tag changes the sheet.
    field(&app, "Search tags").set_accessible_value("204");
    button(&app, "PT-204").invoke_accessible_default_action();
    assert!(with_role(&app, "0 – 10 bar, linear", AccessibleRole::Text).is_valid());
    // From the sheet straight to the tag's Power screen.
    button(&app, "Power of PT-204").invoke_accessible_default_action();
    assert_eq!(
        app.window
            .global::<loopside::app::AppAdapter>()
            .get_screen(),
        Screen::Power
    );
    assert_eq!(
        app.window
            .global::<loopside::app::PowerAdapter>()
            .get_tag_title(),
        "PT-204"
    );
}

#[test]
fn the_log_and_its_hand_over_start_when_the_technician_says() {
    use slint::Model;
    let app = app();
    app.show_screen(Screen::Log);
    button(&app, "All tags").invoke_accessible_default_action();
    let log = app.window.global::<loopside::app::LogAdapter>();
    let whens = |log: &loopside::app::LogAdapter| -> Vec<String> {
        let rows = log.get_rows();
        (0..rows.row_count())
            .filter_map(|i| rows.row_data(i))
            .map(|r| r.when.to_string())
            .collect()
    };
    let everything = whens(&log);
    assert!(everything.iter().any(|w| w.as_str() < "2026-11-30"));
    // The demo log runs from late November; the shift being handed over began on the 30th.
    field(&app, "Since").set_accessible_value("2026-11-30");
    let since = whens(&log);
    assert!(!since.is_empty() && since.len() < everything.len());
    assert!(
        since.iter().all(|w| w.as_str() >= "2026-11-30"),
        "{since:?}"
    );
    assert!(
        log.get_count_text().ends_with("since 2026-11-30 00:00"),
        "{}",
        log.get_count_text()
    );
    // What cannot be read is named, and the list falls back to the whole period.
    field(&app, "Since").set_accessible_value("last week");
    assert!(log.get_since_error().starts_with("since"));
    assert_eq!(whens(&log).len(), everything.len());
}

#[test]
fn the_conductor_on_power_is_picked_from_a_list() {
    // LT-101's loop (demo plant) is entered with its cable; on Power the technician picks
    // the conductor size rather than typing it, and an uncommon size stays on the list.
    let app = app();
    app.show_screen(Screen::Power);
    let picker = with_role(&app, "Conductor", AccessibleRole::Combobox);
    let power = app.window.global::<loopside::app::PowerAdapter>();
    let sizes: Vec<String> = slint::Model::iter(&power.get_cable_sizes())
        .map(|s| s.to_string())
        .collect();
    assert_eq!(sizes[0], "no cable");
    assert!(sizes.contains(&"AWG 18".to_string()), "{sizes:?}");
    let shown = picker.accessible_value().unwrap_or_default().to_string();
    let index = usize::try_from(power.get_cable_size_index()).unwrap();
    assert_eq!(shown, sizes[index], "the picker shows the loop's own size");
    // Picking AWG 18 is what the loop then uses.
    let awg18 = sizes.iter().position(|s| s == "AWG 18").unwrap();
    power.invoke_cable_size_picked(i32::try_from(awg18).unwrap());
    assert_eq!(app.state.borrow().ui.power.cable_size, "AWG 18");
    assert_eq!(power.get_cable_size_index(), i32::try_from(awg18).unwrap());
    // "no cable" leaves the size empty.
    power.invoke_cable_size_picked(0);
    assert_eq!(app.state.borrow().ui.power.cable_size, "");
}
