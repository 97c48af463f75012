//! The characterisation table in the tag form, driven through Slint's testing backend by
//! accessible labels: pick the table, type its rows, see a bad row named, fix it, save, and
//! read the table back from the store; a half-typed table survives a restart.
#![cfg(feature = "ui")]

mod util;

use util::ui::{all, one, save_tag_form, tap, type_into};

use i_slint_backend_testing::AccessibleRole;
use loopside::app::{App, AppState, FormField, Screen, TagsAdapter};
use loopside::scale::{TablePoint, Transfer};
use slint::{ComponentHandle, Model};

/// The demo plant in a tall window (`width` 1280 is the desktop, 560 the phone), so every
/// element is in view for the search.
fn app_in(state: AppState, width: f32) -> App {
    util::ui::app_sized(state, width, 6000.0)
}

/// The points the curve shows, as (x, y) fractions of the plot.
fn curve_points(app: &App) -> Vec<(f32, f32)> {
    app.window
        .global::<TagsAdapter>()
        .get_table_curve()
        .points
        .iter()
        .map(|p| (p.x, p.y))
        .collect()
}

#[test]
fn a_level_to_volume_table_is_typed_checked_saved_and_read_back() {
    // LT-140 on the horizontal sludge-holding tank at Brindlemoor (2 m across, 5 m long):
    // level 0–2 m, shown as volume through the tank's table. The volumes are the circular
    // segment V = L·(r²·acos((r−h)/r) − (r−h)·√(2rh−h²)) with r = 1 m, L = 5 m, worked by
    // hand: 0.5 m → 3.071 m³, 1 m → 7.854 m³ (half of π·r²·L), 2 m → 15.708 m³ (full).
    let app = app_in(AppState::demo(), 1280.0);
    app.show_screen(Screen::Tags);
    tap(&app, "New tag");
    type_into(&app, "Tag number", "LT-140");
    type_into(&app, "Service", "Sludge holding tank volume");
    type_into(&app, "LRV", "0");
    type_into(&app, "URV", "2");
    type_into(&app, "Unit", "m");
    // No table editor until the table is picked.
    assert!(all(&app, "Table output unit", AccessibleRole::TextInput).is_empty());
    one(
        &app,
        "Transfer: characterisation table",
        AccessibleRole::Checkbox,
    )
    .invoke_accessible_default_action();
    // Two empty rows to start from.
    assert_eq!(all(&app, "Row 2 input", AccessibleRole::TextInput).len(), 1);
    assert!(curve_points(&app).is_empty());
    type_into(&app, "Table output unit", "m³");
    type_into(&app, "Row 1 input", "0");
    type_into(&app, "Row 1 output", "0");
    type_into(&app, "Row 2 input", "0,5");
    type_into(&app, "Row 2 output", "3,071");
    // The curve is drawn as soon as two rows read.
    assert_eq!(curve_points(&app), vec![(0.0, 1.0), (1.0, 0.0)]);
    tap(&app, "Add table row");
    type_into(&app, "Row 3 input", "1");
    // A slip: 7,854 typed with a letter for a digit.
    type_into(&app, "Row 3 output", "7,8S4");
    tap(&app, "Add table row");
    type_into(&app, "Row 4 input", "2");
    type_into(&app, "Row 4 output", "15,708");
    // Only the three readable rows are on the curve while row 3 is wrong.
    assert_eq!(curve_points(&app).len(), 3);
    tap(&app, "Save");
    let tags = app.window.global::<TagsAdapter>();
    assert_eq!(tags.get_error_field(), FormField::Table);
    assert_eq!(tags.get_table_error_row(), 2);
    assert!(
        tags.get_error_text().starts_with("table: row 3: output"),
        "{}",
        tags.get_error_text()
    );
    assert!(tags.get_editing(), "the form stays open");
    assert!(
        app.state.borrow().store.tag("LT-140").is_none(),
        "nothing saved"
    );
    // A row out of order is named too: 0,2 m cannot hold more than 0,5 m.
    type_into(&app, "Row 3 output", "7,854");
    tap(&app, "Add table row");
    type_into(&app, "Row 5 input", "0,2");
    type_into(&app, "Row 5 output", "4");
    tap(&app, "Save");
    assert_eq!(tags.get_table_error_row(), 4);
    assert!(
        app.state.borrow().store.tag("LT-140").is_none(),
        "nothing saved"
    );
    tap(&app, "Remove row 5");
    assert!(all(&app, "Row 5 input", AccessibleRole::TextInput).is_empty());
    // Half full at mid-level: the middle point at half the plot's height.
    let points = curve_points(&app);
    assert_eq!(points.len(), 4);
    assert!((points[2].1 - 0.5).abs() < 1e-4, "{points:?}");
    save_tag_form(&app);
    assert!(!tags.get_editing());

    let state = app.state.borrow();
    let record = state.store.tag("LT-140").expect("saved");
    let Transfer::Table(table) = &record.tag.scale.transfer else {
        panic!("{:?}", record.tag.scale.transfer)
    };
    assert_eq!(table.output_unit(), "m³");
    assert_eq!(
        table.points(),
        [
            TablePoint {
                input: 0.0,
                output: 0.0
            },
            TablePoint {
                input: 0.5,
                output: 3.071
            },
            TablePoint {
                input: 1.0,
                output: 7.854
            },
            TablePoint {
                input: 2.0,
                output: 15.708
            },
        ]
    );
    drop(state);

    // Editing the tag again shows its rows and its curve.
    tap(&app, "Edit LT-140");
    assert_eq!(
        one(&app, "Row 4 output", AccessibleRole::TextInput).accessible_value(),
        Some("15.708".into())
    );
    assert_eq!(curve_points(&app).len(), 4);
}

#[test]
fn a_half_typed_table_survives_a_restart_on_the_phone() {
    let app = app_in(AppState::demo(), 560.0);
    app.show_screen(Screen::Tags);
    tap(&app, "New tag");
    type_into(&app, "Tag number", "LT-141");
    one(
        &app,
        "Transfer: characterisation table",
        AccessibleRole::Checkbox,
    )
    .invoke_accessible_default_action();
    type_into(&app, "Table output unit", "m³");
    type_into(&app, "Row 1 input", "0");
    type_into(&app, "Row 1 output", "0");
    type_into(&app, "Row 2 input", "100");
    type_into(&app, "Row 2 output", "12,5");
    tap(&app, "Add table row");
    type_into(&app, "Row 3 input", "150");
    // The app is closed: what is typed goes with the screen state to app-state.json.
    let saved = {
        let mut state = app.state.borrow_mut();
        loopside::app::collect(&app.window, &mut state);
        serde_json::to_string(&state.ui).unwrap()
    };
    drop(app);
    let mut state = AppState::demo();
    state.ui = serde_json::from_str(&saved).unwrap();
    let app = app_in(state, 560.0);
    assert_eq!(
        one(&app, "Row 2 output", AccessibleRole::TextInput).accessible_value(),
        Some("12,5".into())
    );
    assert_eq!(
        one(&app, "Row 3 input", AccessibleRole::TextInput).accessible_value(),
        Some("150".into())
    );
    assert_eq!(
        one(&app, "Table output unit", AccessibleRole::TextInput).accessible_value(),
        Some("m³".into())
    );
    // The curve is drawn again from the rows as typed (row 3 has no output yet).
    assert_eq!(curve_points(&app).len(), 2);
}

#[test]
fn removing_every_row_leaves_the_tank_with_no_table() {
    // LT-605 in the demo plant reads its horizontal tank's volume through a 21-row table.
    // The tank is replaced by a vertical one, whose volume is linear in level: the
    // technician removes the table row by row and saves; the tag then has no table.
    let app = app_in(AppState::demo(), 1280.0);
    app.show_screen(Screen::Tags);
    tap(&app, "LT-605");
    tap(&app, "Edit LT-605");
    for left in (1..=21).rev() {
        assert_eq!(
            all(
                &app,
                &format!("Row {left} input"),
                AccessibleRole::TextInput
            )
            .len(),
            1,
            "row {left} is still there"
        );
        tap(&app, "Remove row 1");
    }
    // With the last row gone the form says so: linear is picked and the editor is gone.
    assert_eq!(
        one(&app, "Transfer: linear", AccessibleRole::Checkbox).accessible_checked(),
        Some(true)
    );
    assert!(all(&app, "Table output unit", AccessibleRole::TextInput).is_empty());
    save_tag_form(&app);
    assert_eq!(
        app.state
            .borrow()
            .store
            .tag("LT-605")
            .unwrap()
            .tag
            .scale
            .transfer,
        Transfer::Linear,
        "the saved table is gone, not kept"
    );
}

#[test]
fn an_order_fault_is_told_by_the_rows_as_numbered_on_screen() {
    // LT-142, a cone-bottomed tank (invented volumes): 0 m → 0 m³, 1 m → 2 m³, 2 m → 6 m³,
    // then a fourth row typed later for 1,5 m with 1,5 m³ by mistake (3,5 was meant). In
    // input order the slip is the third point; on the screen it is row 4, and the error
    // says row 4 and the row it clashes with, as numbered there.
    let app = app_in(AppState::demo(), 1280.0);
    app.show_screen(Screen::Tags);
    tap(&app, "New tag");
    type_into(&app, "Tag number", "LT-142");
    type_into(&app, "URV", "2");
    type_into(&app, "Unit", "m");
    one(
        &app,
        "Transfer: characterisation table",
        AccessibleRole::Checkbox,
    )
    .invoke_accessible_default_action();
    type_into(&app, "Table output unit", "m³");
    for (row, (input, output)) in [("0", "0"), ("1", "2"), ("2", "6"), ("1,5", "1,5")]
        .into_iter()
        .enumerate()
    {
        if row >= 2 {
            tap(&app, "Add table row");
        }
        type_into(&app, &format!("Row {} input", row + 1), input);
        type_into(&app, &format!("Row {} output", row + 1), output);
    }
    tap(&app, "Save");
    let tags = app.window.global::<TagsAdapter>();
    assert_eq!(tags.get_table_error_row(), 3, "row 4 is outlined");
    assert_eq!(
        tags.get_error_text(),
        "table: row 4: outputs must rise (or fall) steadily with input; 1.5 → 1.5 breaks that (against row 2)"
    );
    type_into(&app, "Row 4 output", "3,5");
    save_tag_form(&app);
    assert!(app.state.borrow().store.tag("LT-142").is_some());
}
