//! The before-you-leave list on the Check and Find fault screens, through Slint's testing
//! backend: ticked by its accessible labels, "done"/"not done" in words, what is not ticked
//! said before saving, the record the same as the command line's, and half-ticked lists
//! kept across a restart.
#![cfg(feature = "ui")]

mod util;

use util::ui::{all, one, tap};

use i_slint_backend_testing::{AccessibleRole, ElementHandle};
use loopside::app::{
    load_or_demo, save, App, AppState, CheckAdapter, FaultAdapter, LeaveStatus, Screen, DEMO_DIR,
};
use loopside::journal::{Entry, Kind};
use loopside::leave::Item;
use loopside::store::{FileStore, Store};
use slint::{ComponentHandle, Model};

/// The app on `state` in a tall desktop window, so every element is in view for the search.
fn app_over(state: AppState) -> App {
    util::ui::app_sized(state, 1280.0, 6000.0)
}

/// The tick box of `item`, found by its label.
fn tick_box(app: &App, item: Item) -> ElementHandle {
    one(app, item.label(), AccessibleRole::Checkbox)
}

/// LT-101 (0–4.5 m) read true at every point of the default check: 4, 8, 12, 16, 20 mA
/// and back down.
const TRUE_READINGS: [&str; 9] = ["4", "8", "12", "16", "20", "16", "12", "8", "4"];

#[test]
fn ticking_the_list_on_check_and_saving() {
    let app = app_over(AppState::demo());
    app.show_screen(Screen::Check);
    tap(&app, "I have read these; start");
    let check = app.window.global::<CheckAdapter>();
    check.invoke_pick_stage(loopside::app::CheckStage::AsLeft);
    for (i, ma) in TRUE_READINGS.iter().enumerate() {
        check.invoke_found_edited(i as i32, (*ma).into());
    }
    assert_eq!(check.get_verdict_title(), "Pass");

    // Nothing ticked yet: each box says "not done" in words, is a 48 px target, and the
    // line above Save to log names all four.
    assert!(all(&app, "Before you leave", AccessibleRole::Text).len() == 1);
    for item in Item::ALL {
        let b = tick_box(&app, item);
        assert_eq!(b.accessible_checked(), Some(false), "{item:?}");
        assert_eq!(b.accessible_value().unwrap(), "not done");
        assert!(b.size().height >= 48.0, "{item:?}: {:?}", b.size());
    }
    assert_eq!(check.get_leave_status(), LeaveStatus::NotAllDone);

    // The loop is back in auto, links closed, forces off; operations are not told yet
    // (the shift supervisor is on the radio).
    for item in [Item::Loop, Item::Links, Item::Forces] {
        tick_box(&app, item).invoke_accessible_default_action();
        assert_eq!(tick_box(&app, item).accessible_checked(), Some(true));
        assert_eq!(tick_box(&app, item).accessible_value().unwrap(), "done");
    }
    // A second tap unticks, a third ticks again.
    tick_box(&app, Item::Forces).invoke_accessible_default_action();
    assert_eq!(
        tick_box(&app, Item::Forces).accessible_value().unwrap(),
        "not done"
    );
    tick_box(&app, Item::Forces).invoke_accessible_default_action();

    // Before saving, the screen says what the log will call not done.
    let warning = check.get_leave_summary().to_string();
    assert!(
        warning.starts_with("Not ticked, so the log will say NOT done: operations told."),
        "{warning}"
    );
    assert_eq!(all(&app, &warning, AccessibleRole::Text).len(), 1, "shown");
    assert_eq!(check.get_leave_status(), LeaveStatus::NotAllDone);

    // Saving is not blocked; the record and the message say it plainly.
    one(&app, "Initials", AccessibleRole::TextInput).set_accessible_value("gh");
    tap(&app, "Save to log");
    assert_eq!(check.get_error_text(), "");
    let message = check.get_message().to_string();
    assert!(
        message.contains("NOT done (not confirmed): operations told."),
        "{message}"
    );
    let state = app.state.borrow();
    let saved = state.store.entries().last().unwrap();
    assert_eq!(saved.kind, Kind::LoopCheck);
    let done: Vec<bool> = saved.payload.as_ref().unwrap()["before_leaving"]["items"]
        .as_array()
        .unwrap()
        .iter()
        .map(|i| i["done"].as_bool().unwrap())
        .collect();
    assert_eq!(done, [true, true, true, false]);
    assert!(saved
        .text
        .ends_with("Before you leave: NOT done (not confirmed): operations told. Done: loop back in its normal mode; links closed; forces and bypasses removed."));
    drop(state);

    // The next check starts with nothing ticked.
    assert!(check.get_leave_rows().iter().all(|r| !r.done));
}

#[test]
fn all_ticked_says_so_before_saving() {
    let app = app_over(AppState::demo());
    app.show_screen(Screen::Check);
    tap(&app, "I have read these; start");
    for item in Item::ALL {
        tick_box(&app, item).invoke_accessible_default_action();
    }
    let check = app.window.global::<CheckAdapter>();
    assert_eq!(check.get_leave_status(), LeaveStatus::AllDone);
    assert!(check.get_leave_summary().starts_with("All ticked"));
}

/// The entries a store folder holds, read after the app or the command line let go of it.
fn entries_in(folder: &std::path::Path) -> Vec<Entry> {
    FileStore::open(folder).unwrap().entries().to_vec()
}

#[test]
fn the_app_and_the_command_line_record_the_same_shape() {
    // The same as-left check of LT-101, and the same open-wiring session, once on the
    // screens with the loop and the links ticked and once with `--done loop,links`.
    let dir = util::TempDir::new("ui-leave-same");
    let store_dir = dir.path().join(DEMO_DIR);
    {
        let app = app_over(load_or_demo(dir.path().to_path_buf()).unwrap());
        app.show_screen(Screen::Check);
        let check = app.window.global::<CheckAdapter>();
        check.invoke_read_cautions();
        check.invoke_pick_stage(loopside::app::CheckStage::AsLeft);
        for (i, ma) in TRUE_READINGS.iter().enumerate() {
            check.invoke_found_edited(i as i32, (*ma).into());
        }
        check.invoke_leave_toggled(0, true);
        check.invoke_leave_toggled(1, true);
        check.invoke_save();
        assert_eq!(check.get_error_text(), "");

        let fault = app.window.global::<FaultAdapter>();
        fault.invoke_read_cautions();
        fault.invoke_pick_symptom(0);
        for (key, value) in [("tx_ma", "0"), ("supply_v", "24"), ("terminal_v", "0.1")] {
            let _ = key;
            fault.invoke_input_edited(0, value.into());
            fault.invoke_next();
            assert_eq!(fault.get_error_text(), "", "{key}");
        }
        fault.invoke_leave_toggled(0, true);
        fault.invoke_leave_toggled(1, true);
        fault.invoke_save();
        assert_eq!(fault.get_error_text(), "");
    }
    let applied = "0,1.125,2.25,3.375,4.5,3.375,2.25,1.125,0";
    let measured = TRUE_READINGS.join(",");
    let d = store_dir.to_string_lossy().into_owned();
    let out = util::loopside(&[
        "check",
        "--tag",
        "LT-101",
        "--data-dir",
        &d,
        "--device",
        "transmitter",
        "--stage",
        "as-left",
        "--applied",
        applied,
        "--measured",
        &measured,
        "--done",
        "loop,links",
        "--save",
    ]);
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    let answers = dir.path().join("answers.json");
    std::fs::write(
        &answers,
        r#"{"tx_ma": 0, "supply_v": 24, "terminal_v": 0.1}"#,
    )
    .unwrap();
    let out = util::loopside(&[
        "diagnose",
        "--tag",
        "LT-101",
        "--data-dir",
        &d,
        "--symptom",
        "stuck-low",
        "--answers",
        answers.to_str().unwrap(),
        "--done",
        "loop,links",
        "--save",
    ]);
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );

    let entries = entries_in(&store_dir);
    let n = entries.len();
    let (app_check, app_fault, cli_check, cli_fault) = (
        &entries[n - 4],
        &entries[n - 3],
        &entries[n - 2],
        &entries[n - 1],
    );
    for (app, cli, kind) in [
        (app_check, cli_check, Kind::LoopCheck),
        (app_fault, cli_fault, Kind::FaultFinding),
    ] {
        assert_eq!((app.kind, cli.kind), (kind, kind));
        let (a, c) = (app.payload.as_ref().unwrap(), cli.payload.as_ref().unwrap());
        assert_eq!(a["before_leaving"], c["before_leaving"], "{kind:?}");
        let keys = |v: &serde_json::Value| -> Vec<String> {
            v.as_object().unwrap().keys().cloned().collect()
        };
        assert_eq!(keys(a), keys(c), "{kind:?}: the same payload keys");
        assert_eq!(app.text, cli.text, "{kind:?}: the same log text");
        assert!(
            app.text.ends_with(
                "Before you leave: NOT done (not confirmed): forces and bypasses removed; \
                 operations told. Done: loop back in its normal mode; links closed."
            ),
            "{}",
            app.text
        );
    }
    // The check's whole payload is the same from both fronts (same tag, readings, date).
    assert_eq!(app_check.payload, cli_check.payload);
}

#[test]
fn a_half_ticked_list_survives_a_restart() {
    let dir = util::TempDir::new("ui-leave-restart");
    {
        let app = app_over(load_or_demo(dir.path().to_path_buf()).unwrap());
        let check = app.window.global::<CheckAdapter>();
        check.invoke_read_cautions();
        check.invoke_found_edited(0, "4,01".into());
        check.invoke_leave_toggled(1, true);
        let fault = app.window.global::<FaultAdapter>();
        fault.invoke_read_cautions();
        fault.invoke_pick_symptom(0);
        fault.invoke_leave_toggled(3, true);
        save(&app.state.borrow()).unwrap();
    }
    let app = app_over(load_or_demo(dir.path().to_path_buf()).unwrap());
    app.show_screen(Screen::Check);
    let check = app.window.global::<CheckAdapter>();
    let ticked: Vec<bool> = check.get_leave_rows().iter().map(|r| r.done).collect();
    assert_eq!(ticked, [false, true, false, false]);
    assert_eq!(
        tick_box(&app, Item::Links).accessible_value().unwrap(),
        "done"
    );
    let fault = app.window.global::<FaultAdapter>();
    let ticked: Vec<bool> = fault.get_leave_rows().iter().map(|r| r.done).collect();
    assert_eq!(ticked, [false, false, false, true]);
    assert!(fault.get_running(), "the session was resumed too");
}
