//! Check screen glue: cautions first, then the as-found / as-left table of the open tag,
//! and the before-you-leave list above "Save to log". Readings and ticks are kept in the
//! saved screen state as they are made (an unfinished check survives the app being
//! killed); the table, the plot and the verdict come from [`crate::view::check`], the list
//! from [`crate::view::leave`], and "Save to log" stores the
//! [`crate::check::CheckResult`] with the list as ticked.

use super::{model, AppState, AppWindow, CheckAdapter, Shared};
use crate::action::check::{self as action, CheckSaved, NewCheck, SensorInputs};
use crate::check::Stage;
use crate::error::FieldError;
use crate::leave::{self, LeaveList};
use crate::store::StoreError;
use crate::view::check::{check_for, result, view};
use crate::view::reference::{self, ReferenceText};
use slint::{ComponentHandle, Model, ModelRc, VecModel};
use std::rc::Rc;

/// Wire the adapter's callbacks.
pub fn connect(window: &AppWindow, state: &Shared) {
    let adapter = window.global::<CheckAdapter>();
    // One model for the table's life, updated row by row, so the field being typed in is
    // not rebuilt (and does not lose focus) on every key.
    let rows: Rc<VecModel<super::CheckRow>> = Rc::new(VecModel::default());
    adapter.set_rows(ModelRc::from(rows.clone()));
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_read_cautions(move || {
        if let Some(w) = weak.upgrade() {
            st.borrow_mut().ui.check.cautions_read = true;
            w.global::<CheckAdapter>().set_cautions_read(true);
        }
    });
    let weak = window.as_weak();
    let st = state.clone();
    let table = rows.clone();
    adapter.on_pick_stage(move |stage| {
        let Some(w) = weak.upgrade() else { return };
        {
            let mut s = st.borrow_mut();
            let wanted = stage_of(stage);
            if s.ui.check.stage != wanted {
                // A new stage is a new set of readings (as-left is read after the work).
                s.ui.check.stage = wanted;
                s.ui.check.readings.clear();
            }
        }
        w.global::<CheckAdapter>().set_stage(stage);
        update(&w, &st.borrow(), &table);
        show_leave(&w, &st.borrow());
    });
    let weak = window.as_weak();
    let st = state.clone();
    let table = rows.clone();
    adapter.on_found_edited(move |i, text| {
        let Some(w) = weak.upgrade() else { return };
        if let Ok(i) = usize::try_from(i) {
            let mut s = st.borrow_mut();
            let readings = &mut s.ui.check.readings;
            if readings.len() <= i {
                readings.resize(i + 1, String::new());
            }
            readings[i] = text.to_string();
        }
        update(&w, &st.borrow(), &table);
    });
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_leave_toggled(move |i, on| {
        let Some(w) = weak.upgrade() else { return };
        if let Ok(i) = usize::try_from(i) {
            crate::view::leave::toggle(&mut st.borrow_mut().ui.check.leave_ticked, i, on);
        }
        show_leave(&w, &st.borrow());
    });
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_save(move || {
        let Some(w) = weak.upgrade() else { return };
        let a = w.global::<CheckAdapter>();
        {
            let mut s = st.borrow_mut();
            collect_reference(&a, &mut s);
            s.ui.initials = a.get_initials_text().to_string();
        }
        let saved = save(&mut st.borrow_mut());
        match saved {
            Ok((saved, left)) => {
                let stage = saved.stage;
                a.set_error_text("".into());
                let mut message = saved.to_string();
                if !left.all_done() {
                    message.push(' ');
                    message.push_str(&left.summary());
                }
                if stage == Stage::AsFound {
                    message.push_str(" The table is ready for the as-left readings.");
                }
                a.set_message(message.into());
                // Refresh copies the new (as-left, empty) table in as well.
                refresh(&w, &st.borrow());
                super::log::refresh(&w, &st.borrow());
                super::tags::refresh(&w, &st.borrow());
            }
            Err(e) => a.set_error_text(e.to_string().into()),
        }
    });
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_reference_edited(move || {
        let Some(w) = weak.upgrade() else { return };
        collect_reference(&w.global::<CheckAdapter>(), &mut st.borrow_mut());
        show_reference(&w, &st.borrow());
    });
    sync(&mut state.borrow_mut());
    update(window, &state.borrow(), &rows);
}

/// Copy the reference fields as typed into the state.
fn collect_reference(a: &CheckAdapter<'_>, state: &mut AppState) {
    state.ui.check.reference_id = a.get_reference_id().to_string();
    state.ui.check.reference_accuracy = a.get_reference_accuracy().to_string();
    state.ui.check.reference_due = a.get_reference_due().to_string();
}

/// The reference fields as the form holds them.
fn reference_text(form: &super::state::CheckForm) -> ReferenceText<'_> {
    ReferenceText {
        id: &form.reference_id,
        accuracy: &form.reference_accuracy,
        due: &form.reference_due,
    }
}

/// Copy the reference's TUR, warnings and any field that cannot be read in.
fn show_reference(window: &AppWindow, state: &AppState) {
    let a = window.global::<CheckAdapter>();
    let Some(tag) = state.open_tag() else {
        a.set_reference_tur("".into());
        a.set_reference_warnings(model(Vec::new()));
        a.set_reference_problem("".into());
        a.set_has_reference_problem(false);
        a.set_has_reference_tur(false);
        return;
    };
    let v = reference::view(
        &check_for(tag, stage(state), state.now().date_naive()),
        reference_text(&state.ui.check),
    );
    a.set_has_reference_tur(!v.tur_text.is_empty());
    a.set_has_reference_problem(!v.problem.is_empty());
    a.set_reference_tur(v.tur_text.into());
    a.set_reference_warnings(model(v.warnings.into_iter().map(Into::into).collect()));
    a.set_reference_problem(v.problem.into());
}

fn stage_of(picked: super::CheckStage) -> Stage {
    match picked {
        super::CheckStage::AsLeft => Stage::AsLeft,
        super::CheckStage::AsFound => Stage::AsFound,
    }
}

/// The stage the saved form is at.
fn stage(state: &AppState) -> Stage {
    state.ui.check.stage
}

/// Readings belong to one tag: when another tag is open, start a fresh check.
pub fn sync(state: &mut AppState) {
    let open = state
        .open_tag()
        .map(|t| t.number.clone())
        .unwrap_or_default();
    if state.ui.check.tag != open {
        state.ui.check = super::state::CheckForm {
            tag: open,
            ..Default::default()
        };
    }
}

/// Save the check to the open tag's log, with the before-you-leave list as ticked; returns
/// what was saved ([`action::save_check`]) and the list as recorded. After an as-found check the
/// form moves on to as-left with an empty table and nothing ticked.
pub fn save(state: &mut AppState) -> Result<(CheckSaved, LeaveList), StoreError> {
    let record = state
        .open_record()
        .cloned()
        .ok_or_else(|| FieldError::new("tag", "no tag is open; open one on Tags first"))?;
    let stage = stage(state);
    let now = state.now();
    let form = &state.ui.check;
    let mut check = check_for(&record.tag, stage, now.date_naive());
    if let Some(r) = reference::parse(reference_text(form), &check.input_unit())? {
        check = check.reference(r);
    }
    let mut res = result(&check, &form.readings)?;
    res.left(&leave::items_of(&form.leave_ticked));
    let left = res
        .before_leaving
        .clone()
        .unwrap_or_else(|| LeaveList::from_done(&[]));
    let sensor = match record.tag.sensor {
        Some(sensor) => Some(SensorInputs::planned(sensor, &res)?),
        None => None,
    };
    let saved = action::save_check(
        state.store.as_mut(),
        now,
        NewCheck {
            tag: &record.tag.number,
            initials: &state.ui.initials,
            result: &res,
            sensor,
        },
    )?;
    let tag = record.tag.number.clone();
    // The same reference is usually used for the as-left readings: keep it.
    let old = std::mem::take(&mut state.ui.check);
    state.ui.check = super::state::CheckForm {
        tag,
        stage: Stage::AsLeft,
        readings: Vec::new(),
        reference_id: old.reference_id,
        reference_accuracy: old.reference_accuracy,
        reference_due: old.reference_due,
        cautions_read: true,
        leave_ticked: Vec::new(),
    };
    Ok((saved, left))
}

/// Copy the before-you-leave list, as ticked so far, in.
fn show_leave(window: &AppWindow, state: &AppState) {
    let a = window.global::<CheckAdapter>();
    let v = crate::view::leave::view(&state.ui.check.leave_ticked, stage(state) == Stage::AsFound);
    let (rows, status) = super::map_leave(&v);
    a.set_leave_heading(v.heading.into());
    a.set_leave_rows(rows);
    a.set_leave_status(status);
    a.set_leave_summary(v.summary.into());
}

/// Copy what does not depend on readings.
pub fn refresh(window: &AppWindow, state: &AppState) {
    let a = window.global::<CheckAdapter>();
    a.set_cautions(model(
        crate::view::CAUTIONS.iter().map(|c| (*c).into()).collect(),
    ));
    let form = &state.ui.check;
    a.set_cautions_read(form.cautions_read);
    a.set_stage(match stage(state) {
        Stage::AsLeft => super::CheckStage::AsLeft,
        Stage::AsFound => super::CheckStage::AsFound,
    });
    a.set_reference_id(form.reference_id.clone().into());
    a.set_reference_accuracy(form.reference_accuracy.clone().into());
    a.set_reference_due(form.reference_due.clone().into());
    show_reference(window, state);
    a.set_initials_text(state.ui.initials.clone().into());
    show_leave(window, state);
    match state.open_tag() {
        Some(tag) => {
            a.set_tag_title(tag.number.clone().into());
            a.set_tolerance_text(
                format!(
                    "± {} of span",
                    crate::display::percent(tag.tolerance_percent)
                )
                .into(),
            );
        }
        None => {
            a.set_tag_title("—".into());
            a.set_tolerance_text("".into());
        }
    }
    let rows = a.get_rows();
    if let Some(table) = rows.as_any().downcast_ref::<VecModel<super::CheckRow>>() {
        update(window, state, table);
    }
}

fn update(window: &AppWindow, state: &AppState, table: &VecModel<super::CheckRow>) {
    let a = window.global::<CheckAdapter>();
    let Some(tag) = state.open_tag() else {
        table.set_vec(Vec::new());
        a.set_points(model(Vec::new()));
        a.set_verdict_title("".into());
        a.set_error_text("No tag is open: open one on Tags to check it.".into());
        return;
    };
    let readings = &state.ui.check.readings;
    let v = view(tag, stage(state), readings, state.now().date_naive());
    if table.row_count() > v.rows.len() {
        table.set_vec(Vec::new());
    }
    for (i, r) in v.rows.iter().enumerate() {
        let row = super::CheckRow {
            point: r.point.clone().into(),
            apply: r.apply.clone().into(),
            expected: r.expected.clone().into(),
            found: readings.get(i).cloned().unwrap_or_default().into(),
            error: r.error.clone().into(),
            tone: super::tone(r.tone),
            verdict: r.verdict.clone().into(),
        };
        if i < table.row_count() {
            if table.row_data(i).as_ref() != Some(&row) {
                table.set_row_data(i, row);
            }
        } else {
            table.push(row);
        }
    }
    a.set_points(model(
        v.points
            .iter()
            .map(|p| super::PlotPoint {
                x: p.x as f32,
                y: p.y as f32,
                pass: p.pass,
                rising: p.rising,
            })
            .collect(),
    ));
    a.set_band_top(v.band.0 as f32);
    a.set_band_bottom(v.band.1 as f32);
    a.set_zero(v.band.2 as f32);
    a.set_y_labels(model(
        v.y_labels
            .iter()
            .map(|(pos, label)| super::AxisLabel {
                pos: *pos as f32,
                label: label.clone().into(),
            })
            .collect(),
    ));
    a.set_x_labels(model(
        [0.0, 25.0, 50.0, 75.0, 100.0]
            .iter()
            .map(|p: &f64| super::AxisLabel {
                pos: (0.05 + 0.9 * p / 100.0) as f32,
                label: crate::display::test_point(*p).into(),
            })
            .collect(),
    ));
    a.set_tolerance_text(v.tolerance_text.into());
    a.set_plot_description(format!("{}. {}", v.verdict.0, v.verdict.1).into());
    a.set_verdict_title(v.verdict.0.into());
    a.set_verdict_detail(v.verdict.1.into());
    a.set_verdict_kind(super::tone(v.verdict.2));
    a.set_error_text(v.problem.into());
}
