//! Find fault screen glue: cautions first, then a symptom starts a session of the procedure
//! engine ([`crate::diagnose`]) on the open tag; each step's answer goes to the session and
//! the screen is worked out by [`crate::view::fault`].
//!
//! The session lives in the saved screen state ([`FaultState`]: the session as JSON, the
//! values half-typed at its step, the technician's words), so an unfinished session
//! survives the app being killed and is resumed with [`Session::resume`] on the next start.
//! The before-you-leave list is ticked above "Save to log" and its ticks are kept in the
//! same saved state. Saving writes the session to the tag's log (kind fault-finding, the
//! session with the list as ticked as the payload), and clears it.

use super::state::FaultState;
use super::{model, AppState, AppWindow, FaultAdapter, Shared};
use crate::action::session::SessionSaved;
use crate::diagnose::{procedure, Answer, Measurement, Procedure, Progress, Session, Settings};
use crate::error::{FieldError, Result};
use crate::leave::{self, LeaveList};
use crate::number::parse_in;
use crate::store::StoreError;
use crate::tag::Tag;
use crate::view::fault::{self as fv, Inputs};
use slint::{ComponentHandle, Model};
use std::sync::OnceLock;

/// The sub-folder of the data folder that holds a plant's own procedures.
pub const PROCEDURES_DIR: &str = "procedures";

/// The built-in procedures, read and checked once.
fn builtin() -> Result<&'static [Procedure]> {
    static BUILTIN: OnceLock<std::result::Result<Vec<Procedure>, FieldError>> = OnceLock::new();
    BUILTIN
        .get_or_init(procedure::builtin)
        .as_deref()
        .map_err(Clone::clone)
}

/// Every procedure the app offers, in menu order: the plant's own first, then the
/// built-in ones (a plant file with a built-in's id takes its place).
fn procedures(state: &AppState) -> Result<Vec<Procedure>> {
    let plant = &state.plant_procedures;
    let mut all = plant.clone();
    all.extend(
        builtin()?
            .iter()
            .filter(|b| !plant.iter().any(|p| p.id == b.id))
            .cloned(),
    );
    Ok(all)
}

/// The procedures the menu offers for the open tag: one per symptom, the one written for
/// how its loop is built (a four-wire transmitter, an analog output …; see
/// [`procedure::for_loop`]).
fn menu(state: &AppState) -> Result<Vec<Procedure>> {
    let topology = state.open_tag().map_or(
        crate::budget::topology::Topology::TwoWireSupply,
        procedure::loop_of,
    );
    Ok(procedure::for_loop(&procedures(state)?, topology))
}

/// Read a plant's procedures: every `*.json` file in `folder`, in file-name order, each
/// checked as the built-in ones are. A file that cannot be read or fails a check is left
/// out and named in the second list, with why. A missing folder is no procedures.
pub fn plant_procedures(folder: &std::path::Path) -> (Vec<Procedure>, Vec<String>) {
    let Ok(dir) = std::fs::read_dir(folder) else {
        return (Vec::new(), Vec::new());
    };
    let mut files: Vec<std::path::PathBuf> = dir
        .filter_map(|e| e.ok().map(|e| e.path()))
        .filter(|p| p.extension().is_some_and(|x| x == "json"))
        .collect();
    files.sort();
    let mut found: Vec<Procedure> = Vec::new();
    let mut problems = Vec::new();
    for path in files {
        let read = std::fs::read_to_string(&path)
            .map_err(|e| e.to_string())
            .and_then(|text| Procedure::from_json(&text).map_err(|e| e.to_string()));
        match read {
            Ok(p) if found.iter().any(|f| f.id == p.id) => problems.push(format!(
                "Procedure file {} is not offered: another file already has the id '{}'.",
                path.display(),
                p.id
            )),
            Ok(p) => found.push(p),
            Err(why) => problems.push(format!(
                "Procedure file {} is not offered: {why}.",
                path.display()
            )),
        }
    }
    (found, problems)
}

/// A session under way, read back from the saved state, with its procedure and tag.
pub struct Run {
    /// The procedure it runs.
    pub procedure: Procedure,
    /// The session.
    pub session: Session,
    /// The tag it runs on.
    pub tag: Tag,
}

/// The tag with this number in the register.
fn find_tag(state: &AppState, number: &str) -> Option<Tag> {
    state.store.tag(number).map(|r| r.tag.clone())
}

/// The session under way (None when there is none); an error when the saved session can
/// no longer be carried on (its procedure or tag is gone).
pub fn current(state: &AppState) -> Result<Option<Run>> {
    let f = &state.ui.fault;
    let Some(json) = &f.session else {
        return Ok(None);
    };
    let procedure = procedures(state)?
        .into_iter()
        .find(|p| p.id == f.procedure)
        .ok_or_else(|| {
            FieldError::new(
                "session",
                format!(
                    "runs procedure '{}', which is neither built in nor in the data folder's {PROCEDURES_DIR}/",
                    f.procedure
                ),
            )
        })?;
    let session = Session::resume(json, &procedure)?;
    let tag = find_tag(state, &session.tag).ok_or_else(|| {
        FieldError::new(
            "session",
            format!(
                "is on tag {}, which is no longer in the register",
                session.tag
            ),
        )
    })?;
    Ok(Some(Run {
        procedure,
        session,
        tag,
    }))
}

/// Keep the session in the saved state.
fn keep(state: &mut AppState, run: &Run) -> Result<()> {
    state.ui.fault.procedure = run.procedure.id.clone();
    state.ui.fault.session = Some(run.session.to_json()?);
    Ok(())
}

/// The values typed at the current step, by measurement.
fn typed(f: &FaultState) -> Inputs {
    f.inputs
        .iter()
        .filter_map(|(k, v)| Measurement::from_key(k).map(|m| (m, v.clone())))
        .collect()
}

/// The settings a new session runs with: the meter allowance as typed, else the default.
/// The error names `meter tolerance` and its range.
pub fn settings(f: &FaultState) -> Result<Settings> {
    let mut s = Settings::default();
    let typed = f.meter_tolerance.trim();
    if !typed.is_empty() {
        s.meter_tolerance_ma = parse_in("meter tolerance", typed, "mA")?;
        s.validate().map_err(|e| e.renamed("meter tolerance"))?;
    }
    Ok(s)
}

/// Start the procedure for symptom `index` (in menu order) on the open tag.
pub fn start(state: &mut AppState, index: usize) -> Result<()> {
    let tag = state
        .open_tag()
        .cloned()
        .ok_or_else(|| FieldError::new("tag", "none is open; open a tag on Tags first"))?;
    let procedure = menu(state)?
        .into_iter()
        .nth(index)
        .ok_or_else(|| FieldError::new("symptom", "is not on the list; choose one shown"))?;
    let run = Run {
        session: Session::start_with(&procedure, &tag, settings(&state.ui.fault)?),
        procedure,
        tag,
    };
    state.ui.fault.inputs.clear();
    state.ui.fault.technician.clear();
    state.ui.fault.leave_ticked.clear();
    keep(state, &run)
}

/// Submit the values typed at the current measure step.
pub fn submit(state: &mut AppState) -> Result<Progress> {
    let mut run = current(state)?
        .ok_or_else(|| FieldError::new("session", "none is under way; choose a symptom"))?;
    let values = fv::answers(
        &run.procedure,
        &run.session,
        &run.tag,
        &typed(&state.ui.fault),
    )?;
    let progress = run
        .session
        .answer(&run.procedure, &run.tag, Answer::Values(values))?;
    state.ui.fault.inputs.clear();
    keep(state, &run)?;
    Ok(progress)
}

/// Answer the current question step.
pub fn answer(state: &mut AppState, yes: bool) -> Result<Progress> {
    let mut run = current(state)?
        .ok_or_else(|| FieldError::new("session", "none is under way; choose a symptom"))?;
    let progress = run
        .session
        .answer(&run.procedure, &run.tag, Answer::YesNo(yes))?;
    keep(state, &run)?;
    Ok(progress)
}

/// Drop the session and what was typed; the cautions are shown again.
pub fn restart(state: &mut AppState) {
    state.ui.fault = FaultState::default();
}

/// Save the session, finished or not, to its tag's log: the text says what the procedure
/// concluded (or that it is not finished), the technician's own words and what was not
/// put right before leaving; the session with the before-you-leave list as ticked is the
/// payload, and `initials` sign it. The session is then cleared; returns the entry's id
/// once it is durable, and the list as recorded.
pub fn save(
    state: &mut AppState,
    initials: &str,
) -> std::result::Result<(SessionSaved, LeaveList), StoreError> {
    let run = current(state)?
        .ok_or_else(|| FieldError::new("session", "none is under way; choose a symptom first"))?;
    let mut session = run.session;
    session.conclude(&state.ui.fault.technician);
    session.left(&leave::items_of(&state.ui.fault.leave_ticked));
    let left = session
        .before_leaving
        .clone()
        .unwrap_or_else(|| LeaveList::from_done(&[]));
    let now = state.now();
    let saved =
        crate::action::session::save_session(state.store.as_mut(), now, &session, initials)?;
    state.ui.initials = saved.initials.clone();
    restart(state);
    Ok((saved, left))
}

/// The line shown when an unfinished session is carried on after a restart.
pub fn resume_text(run: &Run) -> String {
    let at = if run.session.is_finished() {
        "concluded, not yet saved".to_string()
    } else {
        format!("at step {}", run.session.steps.len() + 1)
    };
    format!(
        "Resumed the unfinished session on {}: {}, {at}.",
        run.session.tag, run.session.title
    )
}

/// Wire the adapter's callbacks, and say so when an unfinished session is resumed.
pub fn connect(window: &AppWindow, state: &Shared) {
    let a = window.global::<FaultAdapter>();
    match current(&state.borrow()) {
        Ok(Some(run)) => a.set_resume_text(resume_text(&run).into()),
        Ok(None) => {}
        Err(e) => a.set_error_text(
            format!("The unfinished session cannot be carried on ({e}); choose a symptom to start a new one.")
                .into(),
        ),
    }
    let weak = window.as_weak();
    let st = state.clone();
    a.on_read_cautions(move || {
        let Some(w) = weak.upgrade() else { return };
        st.borrow_mut().ui.fault.cautions_read = true;
        refresh(&w, &st.borrow());
    });
    let weak = window.as_weak();
    let st = state.clone();
    a.on_pick_symptom(move |i| {
        let Some(w) = weak.upgrade() else { return };
        let result = start(
            &mut st.borrow_mut(),
            usize::try_from(i).unwrap_or(usize::MAX),
        );
        after(&w, &st, result.map(|_| ()));
    });
    let weak = window.as_weak();
    let st = state.clone();
    a.on_input_edited(move |i, text| {
        let Some(w) = weak.upgrade() else { return };
        edited(&w, &mut st.borrow_mut(), i, &text);
    });
    let weak = window.as_weak();
    let st = state.clone();
    a.on_next(move || {
        let Some(w) = weak.upgrade() else { return };
        let result = submit(&mut st.borrow_mut());
        after(&w, &st, result.map(|_| ()));
    });
    let weak = window.as_weak();
    let st = state.clone();
    a.on_answer(move |yes| {
        let Some(w) = weak.upgrade() else { return };
        let result = answer(&mut st.borrow_mut(), yes);
        after(&w, &st, result.map(|_| ()));
    });
    let st = state.clone();
    a.on_technician_edited(move |text| {
        st.borrow_mut().ui.fault.technician = text.to_string();
    });
    let st = state.clone();
    a.on_meter_edited(move |text| {
        st.borrow_mut().ui.fault.meter_tolerance = text.to_string();
    });
    let st = state.clone();
    a.on_initials_edited(move |text| {
        st.borrow_mut().ui.initials = text.to_string();
    });
    let weak = window.as_weak();
    let st = state.clone();
    a.on_leave_toggled(move |i, on| {
        let Some(w) = weak.upgrade() else { return };
        if let Ok(i) = usize::try_from(i) {
            crate::view::leave::toggle(&mut st.borrow_mut().ui.fault.leave_ticked, i, on);
        }
        show_leave(&w, &st.borrow());
    });
    let weak = window.as_weak();
    let st = state.clone();
    a.on_save(move || {
        let Some(w) = weak.upgrade() else { return };
        let a = w.global::<FaultAdapter>();
        let initials = a.get_initials_text().to_string();
        let saved = save(&mut st.borrow_mut(), &initials);
        match saved {
            Ok((saved, left)) => {
                a.set_error_text("".into());
                a.set_resume_text("".into());
                let mut message = saved.to_string();
                if !left.all_done() {
                    message.push(' ');
                    message.push_str(&left.summary());
                }
                a.set_message(message.into());
                refresh(&w, &st.borrow());
                super::log::refresh(&w, &st.borrow());
                super::tags::refresh(&w, &st.borrow());
            }
            Err(e) => a.set_error_text(e.to_string().into()),
        }
    });
    let weak = window.as_weak();
    let st = state.clone();
    a.on_restart(move || {
        let Some(w) = weak.upgrade() else { return };
        restart(&mut st.borrow_mut());
        let a = w.global::<FaultAdapter>();
        a.set_message("".into());
        a.set_resume_text("".into());
        a.set_error_text("".into());
        refresh(&w, &st.borrow());
    });
}

/// After an action: redraw on success, or show the error and keep everything as typed.
fn after(window: &AppWindow, state: &Shared, result: Result<()>) {
    let a = window.global::<FaultAdapter>();
    match result {
        Ok(()) => {
            a.set_error_text("".into());
            a.set_error_field(super::FormField::None);
            a.set_message("".into());
            refresh(window, &state.borrow());
        }
        Err(e) => {
            a.set_error_field(super::form_field(&e.field));
            a.set_error_text(e.to_string().into());
        }
    }
}

/// One input typed into: keep the text, and update that row only (so the field keeps its
/// focus), with the reason it cannot be used if it cannot.
fn edited(window: &AppWindow, state: &mut AppState, row: i32, text: &str) {
    let Ok(row) = usize::try_from(row) else {
        return;
    };
    let Ok(Some(run)) = current(state) else {
        return;
    };
    let Some(m) = run.session.pending(&run.procedure).get(row).copied() else {
        return;
    };
    state
        .ui
        .fault
        .inputs
        .insert(m.key().to_string(), text.to_string());
    let v = fv::view(
        &run.procedure,
        &run.session,
        &run.tag,
        &typed(&state.ui.fault),
    );
    let a = window.global::<FaultAdapter>();
    if let Some(input) = v.current.as_ref().and_then(|c| c.inputs.get(row)) {
        let inputs = a.get_inputs();
        if row < inputs.row_count() {
            inputs.set_row_data(row, map_input(input));
        }
        if input.error.is_empty() {
            a.set_error_text("".into());
        }
    }
}

fn map_input(i: &fv::Input) -> super::FaultInput {
    super::FaultInput {
        label: i.label.clone().into(),
        unit: i.unit.clone().into(),
        value: i.text.clone().into(),
        error: i.error.clone().into(),
    }
}

/// Copy the before-you-leave list, as ticked so far, in.
fn show_leave(window: &AppWindow, state: &AppState) {
    let a = window.global::<FaultAdapter>();
    let v = crate::view::leave::view(&state.ui.fault.leave_ticked, false);
    let (rows, status) = super::map_leave(&v);
    a.set_leave_heading(v.heading.into());
    a.set_leave_rows(rows);
    a.set_leave_status(status);
    a.set_leave_summary(v.summary.into());
}

/// Copy the cautions, the symptom menu, the session (if one is under way) and the
/// before-you-leave list in.
pub fn refresh(window: &AppWindow, state: &AppState) {
    let a = window.global::<FaultAdapter>();
    let f = &state.ui.fault;
    a.set_cautions(model(
        crate::caution::CAUTIONS
            .iter()
            .map(|c| (*c).into())
            .collect(),
    ));
    a.set_cautions_read(f.cautions_read);
    a.set_procedure_problems(state.procedure_problems.join(" ").into());
    a.set_symptoms(model(
        menu(state)
            .map(|all| fv::symptoms(&all))
            .unwrap_or_default()
            .into_iter()
            .map(|s| super::FaultSymptom {
                title: s.title.into(),
                summary: s.summary.into(),
            })
            .collect(),
    ));
    a.set_technician_text(f.technician.clone().into());
    a.set_meter_text(f.meter_tolerance.clone().into());
    a.set_initials_text(state.ui.initials.clone().into());
    show_leave(window, state);
    let run = current(state).ok().flatten();
    let Some(run) = run else {
        a.set_running(false);
        a.set_tag_title(
            state
                .open_tag()
                .map_or_else(|| "—".to_string(), |t| t.number.clone())
                .into(),
        );
        a.set_procedure_title("".into());
        a.set_steps(model(Vec::new()));
        a.set_step_number(0);
        a.set_phase(super::FaultPhase::Idle);
        a.set_inputs(model(Vec::new()));
        a.set_findings(model(Vec::new()));
        a.set_conclusion_detail("".into());
        a.set_step_cautions(model(Vec::new()));
        a.set_conclusion_cautions(model(Vec::new()));
        return;
    };
    let v = fv::view(&run.procedure, &run.session, &run.tag, &typed(f));
    a.set_running(true);
    a.set_tag_title(v.tag.clone().into());
    a.set_procedure_title(v.title.clone().into());
    a.set_steps(model(
        v.done
            .iter()
            .map(|d| super::FaultStep {
                number: d.number as i32,
                instruction: d.instruction.clone().into(),
                measured: d.lines.join("\n").into(),
                outcome: d.outcome.clone().into(),
                kind: super::tone(d.tone),
                fault: d.points_to_fault,
            })
            .collect(),
    ));
    match &v.current {
        Some(c) => {
            a.set_step_number(c.number as i32);
            a.set_phase(super::FaultPhase::Asking);
            a.set_step_instruction(c.instruction.clone().into());
            a.set_step_cautions(model(
                c.cautions.iter().map(|t| t.as_str().into()).collect(),
            ));
            a.set_question(c.question.clone().unwrap_or_default().into());
            a.set_known(model(c.known.iter().map(|k| k.clone().into()).collect()));
            a.set_inputs(model(c.inputs.iter().map(map_input).collect()));
        }
        None => {
            a.set_step_number(0);
            a.set_phase(super::FaultPhase::Concluded);
            a.set_step_instruction("".into());
            a.set_step_cautions(model(Vec::new()));
            a.set_question("".into());
            a.set_known(model(Vec::new()));
            a.set_inputs(model(Vec::new()));
        }
    }
    a.set_findings(model(
        v.findings
            .iter()
            .map(|f| super::FaultFinding {
                text: f.text.clone().into(),
                kind: super::tone(f.tone),
            })
            .collect(),
    ));
    match &v.conclusion {
        Some(c) => {
            a.set_conclusion_title(c.title.clone().into());
            a.set_conclusion_detail(c.detail.clone().into());
            a.set_conclusion_kind(super::tone(c.tone));
            a.set_conclusion_cautions(model(
                c.cautions.iter().map(|t| t.as_str().into()).collect(),
            ));
        }
        None => {
            a.set_conclusion_detail("".into());
            a.set_conclusion_cautions(model(Vec::new()));
        }
    }
}
