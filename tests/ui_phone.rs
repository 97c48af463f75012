//! What used to be command-line only, on the screens, through Slint's testing backend:
//! the check's reference instrument, the unit converter, DP level ranging and the
//! characterisation table of a tag. Elements are found by their accessible labels.
#![cfg(feature = "ui")]

mod util;

use util::ui::{one, tap, type_into};

use i_slint_backend_testing::AccessibleRole;
use loopside::app::{App, AppState, CheckAdapter, LevelAdapter, Screen, UnitsAdapter};
use loopside::journal::Kind;
use slint::{ComponentHandle, Model};

/// The demo plant (LT-101 open, 0–4.5 m, ±0.5 % of span) in a tall desktop window, so
/// every element is in view for the search.
fn app() -> App {
    util::ui::app_sized(AppState::demo(), 1280.0, 6000.0)
}

#[test]
fn the_reference_instrument_is_judged_as_it_is_typed_and_saved_with_the_check() {
    let app = app();
    app.show_screen(Screen::Check);
    tap(&app, "I have read these; start");
    let check = app.window.global::<CheckAdapter>();
    // A calibrator good to ±0.02 % of span against LT-101's ±0.5 %: TUR 25:1.
    type_into(&app, "Reference id", "CAL-07");
    type_into(&app, "Reference accuracy", "0,02");
    type_into(&app, "Calibration due", "2099-12-31");
    assert_eq!(
        check.get_reference_tur(),
        "TUR 25.0:1 (4:1 or better asked, common practice)"
    );
    assert_eq!(check.get_reference_warnings().row_count(), 0);
    // Its calibration fell due in 2020: past due whatever today is.
    type_into(&app, "Calibration due", "2020-01-01");
    let warnings: Vec<String> = check
        .get_reference_warnings()
        .iter()
        .map(|w| w.to_string())
        .collect();
    assert_eq!(warnings.len(), 1, "{warnings:?}");
    assert!(
        warnings[0].starts_with("reference CAL-07 was due for calibration on 2020-01-01"),
        "{warnings:?}"
    );
    // A ±0.25 % meter gives TUR 2:1, under 4:1 (common practice): warned too.
    type_into(&app, "Reference accuracy", "0.25 %");
    assert_eq!(check.get_reference_warnings().row_count(), 2);
    // A date that cannot be read is named, and the typed text is kept.
    type_into(&app, "Calibration due", "March");
    assert!(
        check.get_reference_problem().starts_with("reference-due:"),
        "{}",
        check.get_reference_problem()
    );
    assert_eq!(check.get_reference_due(), "March");
    type_into(&app, "Calibration due", "2099-12-31");
    assert_eq!(check.get_reference_problem(), "");

    // Read true at every point and save: the record carries the reference and its TUR.
    for (i, ma) in ["4", "8", "12", "16", "20", "16", "12", "8", "4"]
        .iter()
        .enumerate()
    {
        check.invoke_found_edited(i as i32, (*ma).into());
    }
    check.invoke_save();
    assert_eq!(check.get_error_text(), "");
    let state = app.state.borrow();
    let entry = state
        .store
        .entries()
        .iter()
        .rev()
        .find(|e| e.kind == Kind::LoopCheck)
        .cloned()
        .unwrap();
    let payload = entry.payload.unwrap();
    assert_eq!(payload["reference"]["id"], "CAL-07");
    assert_eq!(payload["reference"]["calibration_due"], "2099-12-31");
    assert!((payload["tur"].as_f64().unwrap() - 2.0).abs() < 1e-9);
    assert_eq!(payload["warnings"][0]["code"], "low-tur");
    // The as-left check goes on with the same reference.
    assert_eq!(check.get_reference_id(), "CAL-07");
}

/// The index of `symbol` in the Units screen's unit list.
fn unit_index(app: &App, symbol: &str) -> i32 {
    let units = app.window.global::<UnitsAdapter>().get_units();
    units
        .iter()
        .position(|u| u == symbol)
        .unwrap_or_else(|| panic!("{symbol} is not offered")) as i32
}

fn result_text(app: &App) -> String {
    one(app, "Result", AccessibleRole::Text)
        .accessible_value()
        .unwrap_or_default()
        .to_string()
}

#[test]
fn the_unit_converter_converts_as_typed_and_refuses_a_plain_pressure_against_a_gauge_one() {
    let app = app();
    app.show_screen(Screen::Units);
    let units = app.window.global::<UnitsAdapter>();
    // 2,5 bar is 36.25943 psi (1 psi = 6 894.757 Pa, NIST SP 811 B.8).
    type_into(&app, "Value", "2,5");
    assert_eq!(result_text(&app), "36.25943 psi");
    assert_eq!(
        one(&app, "From unit", AccessibleRole::Combobox).accessible_value(),
        Some("bar".into())
    );
    // Picking bara → psig crosses the reference: 1 bara is −0.192175 psig at the
    // standard atmosphere (101.325 kPa, NIST SP 811), and the screen says which was used.
    type_into(&app, "Value", "1");
    units.invoke_pick_from(unit_index(&app, "bara"));
    units.invoke_pick_to(unit_index(&app, "psig"));
    assert_eq!(result_text(&app), "-0.192175 psig");
    assert!(units
        .get_atm_line()
        .starts_with("atmosphere 101.325 kPa, the standard atmosphere"));
    // With the local atmosphere typed: 0 psig at 0,95 bar is 95 kPa(a).
    type_into(&app, "Atmosphere", "0,95 bar");
    type_into(&app, "Value", "0");
    units.invoke_pick_from(unit_index(&app, "psig"));
    units.invoke_pick_to(unit_index(&app, "kPa(a)"));
    assert_eq!(result_text(&app), "95 kPa(a)");
    assert_eq!(units.get_atm_line(), "atmosphere 95 kPa, as given");
    // A plain bar against psig is refused with the command line's words.
    units.invoke_pick_from(unit_index(&app, "bar"));
    units.invoke_pick_to(unit_index(&app, "psig"));
    assert!(units.get_has_problem());
    let expected = loopside::units::convert(1.0, "bar", "psig")
        .unwrap_err()
        .to_string();
    assert_eq!(units.get_problem(), expected);
    // Swap, and a temperature: −40 °C is −40 °F (NIST SP 811 B.9).
    units.invoke_swap();
    assert_eq!(
        one(&app, "From unit", AccessibleRole::Combobox).accessible_value(),
        Some("psig".into())
    );
    let temperature = loopside::view::units::QUANTITIES
        .iter()
        .position(|q| *q == loopside::units::Quantity::Temperature)
        .unwrap() as i32;
    units.invoke_pick_quantity(temperature);
    units.invoke_pick_from(unit_index(&app, "°C"));
    units.invoke_pick_to(unit_index(&app, "°F"));
    type_into(&app, "Value", "-40");
    assert_eq!(result_text(&app), "-40 °F");
    assert!(!units.get_shows_atm(), "no atmosphere for a temperature");
}

fn level_row(app: &App, what: &str) -> String {
    app.window
        .global::<LevelAdapter>()
        .get_rows()
        .iter()
        .find(|r| r.what == what)
        .map(|r| r.value.to_string())
        .unwrap_or_default()
}

#[test]
fn a_wet_leg_is_ranged_and_drawn_as_it_is_typed() {
    let app = app();
    app.show_screen(Screen::Level);
    let level = app.window.global::<LevelAdapter>();
    tap(&app, "Wet leg");
    // learninstrumentationengineering.com, "Calibration of DP level transmitter
    // (elevation)": SG 1.12 over 5470 mm, transmitter 1250 mm above the HP tap, wet leg
    // of SG 1.17 filled 4490 mm → −6653.3 to −526.9 mmH2O.
    type_into(&app, "Specific gravity", "1,12");
    type_into(&app, "Level at 4 mA", "0");
    type_into(&app, "Level at 20 mA", "5,47");
    type_into(&app, "Transmitter elevation", "1,25");
    type_into(&app, "Wet leg height", "4,49");
    assert!(level.get_has_problem(), "the fill is not typed yet");
    assert!(
        level.get_problem().starts_with("fill-sg:"),
        "{}",
        level.get_problem()
    );
    type_into(&app, "Fill specific gravity", "1,17");
    type_into(&app, "Pressure unit", "mmH2O");
    assert!(!level.get_has_problem(), "{}", level.get_problem());
    assert_eq!(level_row(&app, "LRV"), "-6653.3 mmH2O");
    assert_eq!(level_row(&app, "URV"), "-526.9 mmH2O");
    assert_eq!(level_row(&app, "span"), "6126.4 mmH2O");
    assert!(level_row(&app, "zero").starts_with("elevated zero by 6653.3"));
    // The sketch follows: the leg is drawn full of fill and the words say so.
    let sketch = one(&app, &level.get_sketch_description(), AccessibleRole::Image);
    assert!(sketch
        .accessible_label()
        .unwrap()
        .contains("transmitter 1.25 m above the HP tap; LP leg full of SG 1.17 fill"));
    let before = level.get_transmitter().y;
    type_into(&app, "Transmitter elevation", "-1");
    assert!(
        level.get_transmitter().y > before,
        "the transmitter moved down"
    );
    // The wet leg's own caution comes first, before the process-side one.
    let cautions: Vec<String> = level.get_cautions().iter().map(|c| c.to_string()).collect();
    assert!(
        cautions[0].starts_with("Wet leg: draining or refilling"),
        "{cautions:?}"
    );
    assert!(cautions.iter().any(|c| c.starts_with("Process side")));
}

#[test]
fn an_open_tank_with_the_transmitter_below_is_a_suppressed_zero() {
    let app = app();
    app.show_screen(Screen::Level);
    // The demo's open sump: 0–4,5 m of water, transmitter 0,6 m below the tap, in mbar.
    // LRV = 1000 kg/m³ × 9.80665 m/s² × 0.6 m = 5884 Pa = 58.84 mbar (hydrostatics,
    // g_n from NIST SP 811), URV = 5.1 m of water = 500.14 mbar.
    assert_eq!(level_row(&app, "LRV"), "58.84 mbar");
    assert_eq!(level_row(&app, "URV"), "500.14 mbar");
    assert!(level_row(&app, "zero").starts_with("suppressed zero by 58.84 mbar"));
    // A DP read back: 279.49 mbar is half-way, 2.250 m.
    type_into(&app, "Measured DP", "279,49");
    assert_eq!(level_row(&app, "level"), "2.250 m");
    // An absolute unit is refused for a DP, naming the unit field.
    type_into(&app, "Pressure unit", "bara");
    let level = app.window.global::<LevelAdapter>();
    assert!(
        level.get_problem().starts_with("unit:"),
        "{}",
        level.get_problem()
    );
}

#[test]
fn the_about_screen_lists_the_toolkit_the_font_and_every_crate() {
    use loopside::app::AboutAdapter;
    let app = app();
    app.show_screen(Screen::About);
    let lines: Vec<String> = app
        .window
        .global::<AboutAdapter>()
        .get_licences()
        .iter()
        .map(|l| l.to_string())
        .collect();
    let all = lines.join("\n");
    assert!(all.contains("Slint"), "{all}");
    assert!(all.contains("SIL Open Font License 1.1"), "{all}");
    for c in loopside::licence::third_party() {
        assert!(
            all.contains(&format!("{} {}", c.name, c.version)),
            "{} missing",
            c.name
        );
    }
}

/// Press and release one key in the window (the focused element takes it).
fn press(app: &App, key: impl Into<slint::SharedString>) {
    use slint::platform::WindowEvent;
    let text = key.into();
    let window = app.window.window();
    window.dispatch_event(WindowEvent::KeyPressed { text: text.clone() });
    window.dispatch_event(WindowEvent::KeyReleased { text });
}

#[test]
fn a_unit_picked_in_its_box_then_swapped_shows_the_swapped_unit_in_the_box() {
    use slint::platform::{Key, PointerEventButton};
    let app = app();
    app.show_screen(Screen::Units);
    let units = app.window.global::<UnitsAdapter>();
    let from = || one(&app, "From unit", AccessibleRole::Combobox);
    let to = || one(&app, "To unit", AccessibleRole::Combobox);
    assert_eq!(from().accessible_value(), Some("bar".into()));
    // The technician opens the From box and moves one unit down with the keys: the box
    // sets its own index (a pick by hand), and the screen converts from that unit.
    from().mock_single_click(PointerEventButton::Left);
    press(&app, Key::DownArrow);
    press(&app, Key::Return);
    let picked = from().accessible_value().unwrap();
    assert_ne!(picked, "bar", "the keys moved the box");
    let from_index = usize::try_from(units.get_from_index()).unwrap();
    assert_eq!(
        units.get_units().row_data(from_index),
        Some(picked.clone()),
        "the screen converts from the unit the box shows"
    );
    let to_before = to().accessible_value().unwrap();
    // Swap: the boxes show the swapped units, the one picked by hand included (a box's
    // own index binding is dropped by a pick by hand; the widget puts it back).
    units.invoke_swap();
    // The event loop's next turn (change handlers run there, before the window is drawn).
    slint::platform::update_timers_and_animations();
    assert_eq!(from().accessible_value(), Some(to_before));
    assert_eq!(to().accessible_value(), Some(picked));
}
