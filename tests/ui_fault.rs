//! Find fault through Slint's testing backend: cautions, a symptom, measurements typed and
//! submitted, a question answered, the conclusion shown; the session kept across the app
//! being killed and started again.
#![cfg(feature = "ui")]

mod util;

use util::ui::{all, one, tap, type_into};

use i_slint_backend_testing::AccessibleRole;
use loopside::app::state::Saved;
use loopside::app::{App, AppState, FaultAdapter, LogAdapter, Screen};
use loopside::journal::Kind;
use slint::{ComponentHandle, Model};

/// The app on `state`, showing Find fault in a tall window (so the whole procedure is in
/// view for the element search).
fn app_with(state: AppState) -> App {
    let app = util::ui::app_sized(state, 420.0, 6000.0);
    app.show_screen(Screen::Fault);
    app
}

fn shows(app: &App, text: &str) -> bool {
    !all(app, text, AccessibleRole::Text).is_empty()
}

/// The entry id the "saved" message names.
fn saved_id(app: &App) -> String {
    let message = app
        .window
        .global::<FaultAdapter>()
        .get_message()
        .to_string();
    // The message may go on to say what was not put right before leaving.
    message
        .strip_prefix("Saved to the log as ")
        .and_then(|m| m.split_once('.'))
        .map(|(id, _)| id.to_string())
        .unwrap_or_else(|| panic!("not saved: {message}"))
}

/// Past the cautions, the stuck-low procedure started on LT-101 (open in the demo).
fn started() -> App {
    let app = app_with(AppState::demo());
    assert!(shows(&app, "Before you start"));
    assert!(
        all(
            &app,
            "Reading stuck at or below zero",
            AccessibleRole::Button
        )
        .is_empty(),
        "no symptom before the cautions are read"
    );
    tap(&app, "I have read these; start");
    tap(&app, "Reading stuck at or below zero");
    assert_eq!(
        app.window.global::<FaultAdapter>().get_tag_title(),
        "LT-101"
    );
    app
}

#[test]
fn stuck_low_walked_through_the_screen_to_a_starved_transmitter() {
    let app = started();
    let a = app.window.global::<FaultAdapter>();
    // The first step's cautions are on the screen with it.
    assert!(shows(&app, "Take care at this step"));
    let first: Vec<String> = a
        .get_step_cautions()
        .iter()
        .map(|c| c.to_string())
        .collect();
    assert!(first.iter().any(|c| c.contains("flameproof")), "{first:?}");
    assert!(shows(&app, &format!("! {}", first[0])));
    // LT-101 sits at 3.5 mA: a downscale failure signal (NE 43).
    type_into(&app, "Loop current at the transmitter", "3,5");
    tap(&app, "Next");
    assert_eq!(a.get_error_text(), "");
    // Volts next: the meter-lead reminder is shown at this step.
    assert!(a
        .get_step_cautions()
        .iter()
        .any(|c| c.contains("red lead back to the V socket")));
    assert!(shows(&app, "Loop current at the transmitter: 3.500 mA"));
    assert!(shows(&app, "Failure signal, downscale"));
    // The next step asks for two voltages. Typing key by key updates the field's row in
    // the same model: the fields are not rebuilt (so the one typed in keeps the focus).
    let rows = a.get_inputs();
    for text in ["2", "24", "24 ", "24 V"] {
        type_into(&app, "Supply voltage at the supply terminals (DC)", text);
        assert!(
            a.get_inputs() == rows,
            "the inputs were rebuilt after {text:?}"
        );
    }
    assert_eq!(rows.row_data(0).unwrap().value, "24 V");
    // A value out of range is refused and named.
    type_into(
        &app,
        "Voltage across the transmitter terminals (DC)",
        "2000",
    );
    assert!(a.get_inputs().row_data(1).unwrap().error.starts_with(
        "Voltage across the transmitter terminals (DC) (V): must be between 0 and 1000"
    ));
    tap(&app, "Next");
    assert!(
        a.get_error_text()
            .starts_with("Voltage across the transmitter terminals (DC) (V):"),
        "{}",
        a.get_error_text()
    );
    assert_eq!(a.get_step_number(), 2, "still waiting at step 2");
    assert_eq!(a.get_phase(), loopside::app::FaultPhase::Asking);
    // 8 V is under LT-101's 10.5 V minimum (plant standard in the demo).
    type_into(&app, "Voltage across the transmitter terminals (DC)", "8");
    tap(&app, "Next");
    assert_eq!(a.get_error_text(), "");
    assert_eq!(a.get_step_number(), 0, "concluded");
    assert_eq!(a.get_phase(), loopside::app::FaultPhase::Concluded);
    assert!(a.get_inputs() != rows, "a new step gets new inputs");
    assert!(shows(&app, "Not enough voltage at the transmitter"));
    let conclusion = a.get_conclusion_detail().to_string();
    assert!(conclusion.starts_with("The transmitter does not get its minimum voltage"));
    assert!(shows(&app, &format!("Conclusion. {conclusion}")));
    assert_eq!(
        a.get_conclusion_kind(),
        loopside::app::Tone::Bad,
        "it points at a fault"
    );
    // Taking resistance out means opening the loop: its caution is shown with it.
    assert!(a
        .get_conclusion_cautions()
        .iter()
        .any(|c| c.contains("in manual or bypassed")));
    assert!(shows(&app, "Take care doing this"));
}

#[test]
fn a_finished_session_is_saved_to_the_log() {
    let app = started();
    let a = app.window.global::<FaultAdapter>();
    // No current, the supply is there, nothing at the transmitter: the loop is open.
    type_into(&app, "Loop current at the transmitter", "0");
    tap(&app, "Next");
    type_into(&app, "Supply voltage at the supply terminals (DC)", "24,0");
    tap(&app, "Next");
    type_into(&app, "Voltage across the transmitter terminals (DC)", "0 V");
    tap(&app, "Next");
    let conclusion = a.get_conclusion_detail().to_string();
    assert!(conclusion.starts_with("The supply is there but does not reach the transmitter"));
    type_into(
        &app,
        "What you found and did",
        "Wire lifted at JB-01 terminal 4; re-terminated",
    );
    type_into(&app, "Initials", "cd");
    tap(&app, "Save to log");
    assert_eq!(a.get_error_text(), "");
    let id = saved_id(&app);
    // The session is cleared and the cautions come first again.
    assert!(!a.get_running());
    assert!(!a.get_cautions_read());
    assert!(app.state.borrow().ui.fault.session.is_none());

    // In the store: the text, the initials and the whole session as the payload.
    {
        let st = app.state.borrow();
        let entry = st
            .store
            .entries()
            .iter()
            .find(|e| e.id.as_str() == id)
            .expect("the entry is in the store");
        assert_eq!(entry.kind, Kind::FaultFinding);
        assert_eq!(entry.author, "CD");
        let payload = entry.payload.as_ref().unwrap();
        assert_eq!(payload["procedure"], "stuck-low");
        assert_eq!(payload["conclusion"]["step"], "open-wiring");
        assert_eq!(payload["measurements"]["supply_v"]["value"], 24.0);
        assert_eq!(
            payload["technician_conclusion"],
            "Wire lifted at JB-01 terminal 4; re-terminated"
        );
    }

    // And on the Log screen.
    app.show_screen(Screen::Log);
    // Nothing was ticked before leaving, and the log says so.
    let text = format!(
        "Reading stuck at or below zero: {conclusion}\nTechnician: Wire lifted at JB-01 terminal 4; re-terminated\n\
         Before you leave: NOT done (not confirmed): loop back in its normal mode; links closed; \
         forces and bypasses removed; operations told."
    );
    let rows = app.window.global::<LogAdapter>().get_rows();
    let row = rows
        .iter()
        .find(|r| r.id == id.as_str())
        .expect("the entry is listed");
    assert_eq!(row.text, text.as_str());
    assert_eq!(row.tag, "LT-101");
    assert!(shows(&app, &format!("LT-101 {}: {text}", row.title)));
}

#[test]
fn an_unfinished_session_can_be_saved_and_says_so() {
    let app = started();
    type_into(&app, "Loop current at the transmitter", "0");
    tap(&app, "Next");
    type_into(&app, "Initials", "AB");
    tap(&app, "Save to log");
    let id = saved_id(&app);
    let st = app.state.borrow();
    let entry = st
        .store
        .entries()
        .iter()
        .find(|e| e.id.as_str() == id)
        .unwrap();
    // Saved midway, nothing is claimed as put right before leaving.
    assert_eq!(
        entry.text,
        "Reading stuck at or below zero: not finished\nBefore you leave: NOT done (not confirmed): \
         loop back in its normal mode; links closed; forces and bypasses removed; operations told."
    );
    assert_eq!(entry.payload.as_ref().unwrap()["current"], "supply");
}

#[test]
fn a_question_is_answered_with_yes() {
    let app = started();
    let a = app.window.global::<FaultAdapter>();
    // 3.9 mA is under range: the procedure asks whether the process really is that low.
    type_into(&app, "Loop current at the transmitter", "3.9");
    tap(&app, "Next");
    assert!(a.get_question().starts_with("Is the process really below"));
    assert!(all(&app, "Next", AccessibleRole::Button).is_empty());
    tap(&app, "Yes");
    assert!(a
        .get_conclusion_detail()
        .starts_with("The loop reads the process correctly"));
    assert_eq!(
        a.get_conclusion_kind(),
        loopside::app::Tone::Neutral,
        "nothing pointed at a fault"
    );
}

#[test]
fn no_open_tag_means_no_session() {
    let mut state = AppState::demo();
    state.ui.open_tag = None;
    let app = app_with(state);
    tap(&app, "I have read these; start");
    tap(&app, "Reading stuck at or below zero");
    let a = app.window.global::<FaultAdapter>();
    assert!(a.get_error_text().contains("open a tag on Tags first"));
    assert!(!a.get_running());
}

#[test]
fn a_killed_app_comes_back_where_the_session_was() {
    let app = started();
    type_into(&app, "Loop current at the transmitter", "0");
    tap(&app, "Next");
    // Half-typed at step 2, and some words of the technician's own.
    type_into(&app, "Supply voltage at the supply terminals (DC)", "24,");
    type_into(&app, "What you found and did", "JB-01 lid open");
    let saved = Saved::from_state(&app.state.borrow());
    drop(app);

    // A new app from what was saved, as after the process was killed.
    let mut state = AppState::demo();
    state.ui = saved.ui;
    let app = app_with(state);
    let a = app.window.global::<FaultAdapter>();
    assert!(a.get_cautions_read());
    assert!(a.get_running());
    assert_eq!(
        a.get_resume_text(),
        "Resumed the unfinished session on LT-101: Reading stuck at or below zero, at step 2."
    );
    assert_eq!(a.get_step_number(), 2);
    assert!(shows(&app, "Loop current at the transmitter: 0.000 mA"));
    let field = one(
        &app,
        "Supply voltage at the supply terminals (DC)",
        AccessibleRole::TextInput,
    );
    assert_eq!(field.accessible_value().unwrap_or_default(), "24,");
    assert_eq!(a.get_technician_text(), "JB-01 lid open");
    // And it carries on from there.
    type_into(&app, "Supply voltage at the supply terminals (DC)", "24");
    tap(&app, "Next");
    type_into(&app, "Voltage across the transmitter terminals (DC)", "0");
    tap(&app, "Next");
    assert!(a
        .get_conclusion_detail()
        .starts_with("The supply is there but does not reach the transmitter"));
}

#[test]
fn a_saved_session_that_cannot_be_read_is_reported() {
    let mut state = AppState::demo();
    state.ui.fault.cautions_read = true;
    state.ui.fault.procedure = "stuck-low".to_string();
    state.ui.fault.session = Some("{ half a file".to_string());
    let app = app_with(state);
    let a = app.window.global::<FaultAdapter>();
    assert!(
        a.get_error_text()
            .starts_with("The unfinished session cannot be carried on (session: cannot be read"),
        "{}",
        a.get_error_text()
    );
    assert!(!a.get_running());
    // A new session replaces it.
    tap(&app, "Reading stuck at or below zero");
    assert_eq!(a.get_error_text(), "");
    assert!(a.get_running());
    assert_eq!(a.get_step_number(), 1);
}

#[test]
fn a_coarser_meter_widens_the_allowance_of_the_next_session() {
    let app = app_with(AppState::demo());
    let fault = app.window.global::<FaultAdapter>();
    fault.invoke_read_cautions();
    // A bad allowance is named with its range, and nothing starts.
    fault.invoke_meter_edited("9".into());
    fault.invoke_pick_symptom(0);
    assert!(!fault.get_running());
    assert_eq!(
        fault.get_error_field(),
        loopside::app::FormField::MeterTolerance
    );
    assert!(
        fault.get_error_text().contains("5"),
        "{}",
        fault.get_error_text()
    );
    // An older analogue meter read to ±0.2 mA: the session carries that allowance.
    fault.invoke_meter_edited("0,2".into());
    fault.invoke_pick_symptom(0);
    assert!(fault.get_running());
    let json = app.state.borrow().ui.fault.session.clone().unwrap();
    let session: serde_json::Value = serde_json::from_str(&json).unwrap();
    assert_eq!(session["settings"]["meter_tolerance_ma"], 0.2);
}
