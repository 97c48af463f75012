//! What used to be command-line only, on the screens, through Slint's testing backend:
//! the check's reference instrument, the unit converter, DP level ranging and the
//! characterisation table of a tag. Elements are found by their accessible labels.
#![cfg(feature = "ui")]

mod util;

use i_slint_backend_testing::{AccessibleRole, ElementHandle};
use loopside::app::{App, AppState, CheckAdapter, Screen};
use loopside::journal::Kind;
use slint::{ComponentHandle, Model};

/// The demo plant (LT-101 open, 0–4.5 m, ±0.5 % of span) in a tall desktop window, so
/// every element is in view for the search.
fn app() -> App {
    util::ui_backend();
    let app = App::new(AppState::demo()).unwrap();
    app.window
        .window()
        .set_size(slint::LogicalSize::new(1280.0, 6000.0));
    app
}

/// The one element with this label and role.
fn one(app: &App, label: &str, role: AccessibleRole) -> ElementHandle {
    let mut found: Vec<_> = ElementHandle::find_by_accessible_label(&app.window, label)
        .filter(|e| e.accessible_role() == Some(role))
        .collect();
    assert_eq!(found.len(), 1, "expected one {role:?} labelled {label:?}");
    found.remove(0)
}

/// Type `text` into the field labelled `label`.
fn type_into(app: &App, label: &str, text: &str) {
    one(app, label, AccessibleRole::TextInput).set_accessible_value(text);
}

fn tap(app: &App, label: &str) {
    one(app, label, AccessibleRole::Button).invoke_accessible_default_action();
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
