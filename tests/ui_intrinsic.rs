//! The intrinsic-safety screen through Slint's testing backend, found by accessible labels:
//! reached from TT-412's sheet, the demo circuit passing with the caution shown first, a
//! HART hand-held added and typed in turning it into a FAIL, the check saved to the log
//! with the initials — and the same record as `loopside intrinsic check --save` writes;
//! the gas groups and temperature classes picked from lists in words, not typed.
#![cfg(feature = "ui")]

mod util;

use i_slint_backend_testing::AccessibleRole;
use loopside::app::{self, App, AppState, IsAdapter, PowerAdapter, Screen, Tone};
use loopside::journal::{Entry, Kind};
use loopside::store::{FileStore, Store};
use slint::{ComponentHandle, Model};
use util::ui::{all, app_sized, one, tap, type_into};
use util::TempDir;

fn tall(state: AppState) -> App {
    app_sized(state, 1280.0, 9000.0)
}

/// TT-412 opened on Tags and its IS screen reached from the sheet's button.
fn tt412_is(state: AppState) -> App {
    let app = tall(state);
    app.show_screen(Screen::Tags);
    app::tags::open(&app.window, &app.state, "TT-412");
    tap(&app, "Intrinsic safety of TT-412");
    assert_eq!(app.state.borrow().ui.screen, Screen::Intrinsic);
    app
}

/// The hand-held a technician clips on: Ui 30 V, Ii 200 mA, Pi 1 W and a large Ci of
/// 700 nF (invented, to show it can fail a circuit).
fn clip_on_hand_held(app: &App) {
    tap(app, "Add HART hand-held");
    type_into(app, "Ui of HART hand-held", "30");
    type_into(app, "Ii of HART hand-held", "200");
    type_into(app, "Pi of HART hand-held", "1");
    type_into(app, "Ci of HART hand-held", "700");
}

#[test]
fn tt412_passes_with_the_caution_first_and_a_hand_held_fails_it() {
    let app = tt412_is(AppState::demo());
    let a = app.window.global::<IsAdapter>();
    assert!(a.get_cautions().row_count() == 3);
    assert!(a
        .get_cautions()
        .row_data(0)
        .unwrap()
        .contains("competent person"));
    assert_eq!(a.get_verdict_kind(), Tone::Good);
    assert!(a
        .get_verdict_title()
        .starts_with("Every entity check passes"));
    assert!(a.get_verdict_detail().contains("5864 m"));
    // The demo's source values are in the fields, each by its label.
    assert_eq!(
        one(&app, "Uo", AccessibleRole::TextInput)
            .accessible_value()
            .unwrap(),
        "28"
    );
    assert_eq!(
        one(&app, "Co", AccessibleRole::TextInput)
            .accessible_value()
            .unwrap(),
        "650"
    );
    // Each check is listed in words.
    assert!(!all(
        &app,
        "pass Voltage: Ui ≥ Uo — TT-412 transmitter: Uo 28.00 V, Ui 30.00 V; margin 2.00 V (6.7 %)",
        AccessibleRole::Text
    )
    .is_empty());

    clip_on_hand_held(&app);
    // 5 + 700 nF of devices exceed 1 % of Co and 10 µH does not exceed 1 % of Lo: no
    // halving; C 725.35 nF > 650 nF → FAIL on capacitance; without it, a pass.
    assert_eq!(a.get_verdict_kind(), Tone::Bad);
    assert!(a.get_verdict_title().starts_with("NOT intrinsically safe"));
    let rows = a.get_rows();
    let failed: Vec<String> = rows
        .iter()
        .filter(|r| r.mark == "FAIL")
        .map(|r| r.title.to_string())
        .collect();
    assert_eq!(failed, vec!["Capacitance: Co ≥ ΣCi + C cable".to_string()]);
    let notes: Vec<String> = a.get_notes().iter().map(|n| n.to_string()).collect();
    assert!(
        notes
            .iter()
            .any(|n| n.contains("without them the circuit would pass")),
        "{notes:?}"
    );

    type_into(&app, "Initials", "ef");
    tap(&app, "Save the IS check to the log");
    assert!(
        a.get_message()
            .starts_with("Saved the IS check of TT-412 (FAIL) as "),
        "{}",
        a.get_message()
    );
    let s = app.state.borrow();
    let e = s.store.entries().last().unwrap();
    assert_eq!(e.kind, Kind::IsCheck);
    assert_eq!(e.author, "EF");
}

#[test]
fn a_bad_value_names_the_field_and_saving_the_data_stores_it_on_the_tag() {
    let app = tt412_is(AppState::demo());
    let a = app.window.global::<IsAdapter>();
    type_into(&app, "Uo", "-28");
    assert_eq!(a.get_verdict_title(), "Not checked yet");
    assert!(
        a.get_verdict_detail().contains("uo:"),
        "{}",
        a.get_verdict_detail()
    );
    tap(&app, "Save the IS data to TT-412");
    assert!(a.get_message().starts_with("uo:"), "{}", a.get_message());
    type_into(&app, "Uo", "28");
    type_into(&app, "Cable length", "260");
    tap(&app, "Save the IS data to TT-412");
    assert_eq!(a.get_message(), "Saved the IS data of TT-412.");
    let s = app.state.borrow();
    let stored = s
        .store
        .tag("TT-412")
        .unwrap()
        .tag
        .intrinsic
        .clone()
        .unwrap();
    assert_eq!(stored.cable.length_m, 260.0);
}

/// The command line over its own data folder with the demo in it.
fn desk(dir: &TempDir, args: &[&str]) {
    let d = dir.arg();
    let mut all_args = vec!["--data-dir", d.as_str()];
    all_args.extend_from_slice(args);
    let out = util::loopside(&all_args);
    assert!(
        out.status.success(),
        "loopside {args:?}: {}",
        String::from_utf8_lossy(&out.stderr)
    );
}

#[test]
fn the_app_and_the_command_line_save_the_same_is_record() {
    let cli_dir = TempDir::new("is-cli");
    desk(&cli_dir, &["demo"]);
    desk(
        &cli_dir,
        &[
            "intrinsic",
            "check",
            "--tag",
            "TT-412",
            "--hand-held",
            "HART hand-held:ui=30,ii=200,pi=1,ci=700",
            "--save",
            "--author",
            "EF",
        ],
    );
    let cli: Entry = FileStore::open(cli_dir.path())
        .unwrap()
        .entries()
        .last()
        .unwrap()
        .clone();

    let app_dir = TempDir::new("is-app");
    desk(&app_dir, &["demo"]);
    let store = FileStore::open(app_dir.path()).unwrap();
    let app = tt412_is(AppState::with_store(Box::new(store)));
    clip_on_hand_held(&app);
    type_into(&app, "Initials", "EF");
    tap(&app, "Save the IS check to the log");
    let phone = app.state.borrow().store.entries().last().unwrap().clone();

    assert_eq!(phone.kind, cli.kind);
    assert_eq!(phone.author, cli.author);
    assert_eq!(phone.text, cli.text);
    assert_eq!(phone.payload, cli.payload);
}

#[test]
fn power_shows_tt412_is_verdict_beside_its_budget_and_opens_the_is_screen() {
    let app = tall(AppState::demo());
    app::tags::open(&app.window, &app.state, "TT-412");
    app.show_screen(Screen::Power);
    let p = app.window.global::<PowerAdapter>();
    assert!(p.get_has_is());
    assert_eq!(p.get_is_kind(), Tone::Good);
    assert!(p
        .get_is_title()
        .starts_with("Intrinsic safety: Every entity check passes"));
    // The budget is still there (TT-412's 340 Ω barrier in the loop).
    assert!(!p.get_verdict_title().is_empty());
    tap(&app, "Open the IS check of TT-412");
    assert_eq!(app.state.borrow().ui.screen, Screen::Intrinsic);
    // LT-101 has no IS data: no card.
    app::tags::open(&app.window, &app.state, "LT-101");
    assert!(!p.get_has_is());
}

#[test]
fn gas_groups_and_temperature_classes_are_picked_from_lists_in_words() {
    use loopside::app::{IsDeviceField, IsField};
    let app = tt412_is(AppState::demo());
    let a = app.window.global::<IsAdapter>();
    // The demo's area asks IIB and T3 (src/demo.rs): the pickers show them, in words.
    one(&app, "Area gas group", AccessibleRole::Combobox);
    one(&app, "Area T class", AccessibleRole::Combobox);
    one(&app, "Gas group of the source", AccessibleRole::Combobox);
    one(
        &app,
        "Gas group of TT-412 transmitter",
        AccessibleRole::Combobox,
    );
    one(
        &app,
        "Temperature class of TT-412 transmitter",
        AccessibleRole::Combobox,
    );
    assert!(all(&app, "Area gas group", AccessibleRole::TextInput).is_empty());
    let options = a.get_area_group_options();
    let picked = usize::try_from(a.get_area_group_index()).unwrap();
    assert_eq!(options.row_data(picked).unwrap(), "IIB (ethylene)");
    let classes = a.get_area_t_class_options();
    let picked = usize::try_from(a.get_area_t_class_index()).unwrap();
    assert_eq!(classes.row_data(picked).unwrap(), "T3 (200 °C)");
    assert_eq!(a.get_verdict_kind(), Tone::Good);

    // The area asks IIC: the IIB barrier no longer covers it (a IIC device may go where
    // IIB is asked, not the reverse).
    a.invoke_picked(IsField::AreaGroup, 3);
    assert_eq!(app.state.borrow().ui.intrinsic.text.area_group, "IIC");
    assert_eq!(a.get_area_group_index(), 3);
    assert_eq!(a.get_verdict_kind(), Tone::Bad);
    let failed: Vec<String> = a
        .get_rows()
        .iter()
        .filter(|r| r.mark == "FAIL")
        .map(|r| r.title.to_string())
        .collect();
    assert_eq!(failed.len(), 1, "{failed:?}");
    a.invoke_picked(IsField::AreaGroup, 2);
    assert_eq!(a.get_verdict_kind(), Tone::Good);

    // The area asks T5: the T4 transmitter and the Pt100 (simple apparatus, T4 at most)
    // fail; the transmitter picked as T6 passes, the Pt100 still fails.
    a.invoke_picked(IsField::AreaTClass, 5);
    assert_eq!(app.state.borrow().ui.intrinsic.text.area_t_class, "T5");
    assert_eq!(a.get_verdict_kind(), Tone::Bad);
    a.invoke_device_picked(0, IsDeviceField::TClass, 6);
    assert_eq!(
        app.state.borrow().ui.intrinsic.text.devices[0].t_class,
        "T6"
    );
    let row = a.get_devices().row_data(0).unwrap();
    assert_eq!(row.t_class_index, 6);
    assert_eq!(row.t_class_options.row_data(6).unwrap(), "T6 (85 °C)");
    let failed: Vec<String> = a
        .get_rows()
        .iter()
        .filter(|r| r.mark == "FAIL")
        .map(|r| r.title.to_string())
        .collect();
    assert!(failed.iter().all(|t| t.contains("Pt100")), "{failed:?}");

    // "not given" for the area's group: the check asks for it by name.
    a.invoke_picked(IsField::AreaGroup, 0);
    assert_eq!(a.get_verdict_title(), "Not checked yet");
    assert!(
        a.get_verdict_detail().contains("group"),
        "{}",
        a.get_verdict_detail()
    );
    // What was picked is what is saved on the tag.
    a.invoke_picked(IsField::AreaGroup, 2);
    a.invoke_picked(IsField::AreaTClass, 3);
    a.invoke_device_picked(0, IsDeviceField::Group, 2);
    tap(&app, "Save the IS data to TT-412");
    let s = app.state.borrow();
    let stored = s
        .store
        .tag("TT-412")
        .unwrap()
        .tag
        .intrinsic
        .clone()
        .unwrap();
    assert_eq!(stored.area_group, loopside::intrinsic::GasGroup::IIB);
    assert_eq!(
        stored.area_t_class,
        Some(loopside::intrinsic::TempClass::T3)
    );
    match stored.devices[0].kind {
        loopside::intrinsic::DeviceKind::Entity { group, t_class, .. } => {
            assert_eq!(group, Some(loopside::intrinsic::GasGroup::IIB));
            assert_eq!(t_class, Some(loopside::intrinsic::TempClass::T6));
        }
        _ => panic!("the transmitter has entity parameters"),
    }
}
