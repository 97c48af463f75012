//! Check screen glue: cautions first, then the table; readings typed per point go through
//! [`crate::view::check`]. Saving waits for the store and the check engine.

use super::{model, AppState, AppWindow, CheckAdapter, Shared};
use crate::view::check::view;
use slint::{ComponentHandle, Model, ModelRc, VecModel};
use std::cell::RefCell;
use std::rc::Rc;

/// Wire the adapter's callbacks. Readings are held here until the check engine and the
/// store land (then they become the unfinished check in the saved state).
pub fn connect(window: &AppWindow, state: &Shared) {
    let adapter = window.global::<CheckAdapter>();
    let readings = Rc::new(RefCell::new(preview_readings()));
    // One model for the table's life, updated row by row, so the field being typed in is
    // not rebuilt (and does not lose focus) on every key.
    let rows: Rc<VecModel<super::CheckRow>> = Rc::new(VecModel::default());
    adapter.set_rows(ModelRc::from(rows.clone()));
    let weak = window.as_weak();
    adapter.on_read_cautions(move || {
        if let Some(w) = weak.upgrade() {
            w.global::<CheckAdapter>().set_cautions_read(true);
        }
    });
    let weak = window.as_weak();
    adapter.on_pick_stage(move |stage| {
        if let Some(w) = weak.upgrade() {
            w.global::<CheckAdapter>().set_stage(stage);
        }
    });
    let weak = window.as_weak();
    let st = state.clone();
    let r = readings.clone();
    let table = rows.clone();
    adapter.on_found_edited(move |i, text| {
        let Some(w) = weak.upgrade() else { return };
        if let Ok(i) = usize::try_from(i) {
            if let Some(slot) = r.borrow_mut().get_mut(i) {
                *slot = text.to_string();
            }
        }
        update(&w, &st.borrow(), &r.borrow(), &table);
    });
    let weak = window.as_weak();
    adapter.on_save(move || {
        if let Some(w) = weak.upgrade() {
            w.global::<CheckAdapter>().set_error_text(
                "Saving checks arrives with the store and check engine (branches store, check)."
                    .into(),
            );
        }
    });
    update(window, &state.borrow(), &readings.borrow(), &rows);
}

/// As-found readings of the demo plant's PT-204 check (zero shifted up), for the preview.
fn preview_readings() -> Vec<String> {
    [
        "4.150", "8.140", "12.090", "16.050", "20.010", "16.060", "12.100", "8.150", "4.160",
    ]
    .iter()
    .map(|s| s.to_string())
    .collect()
}

/// Copy what does not depend on readings.
pub fn refresh(window: &AppWindow, state: &AppState) {
    let a = window.global::<CheckAdapter>();
    a.set_cautions(model(
        crate::view::CAUTIONS.iter().map(|c| (*c).into()).collect(),
    ));
    if let Some(tag) = state.open_tag() {
        a.set_tag_title(tag.number.clone().into());
        a.set_tolerance_text(
            format!(
                "± {} of span",
                crate::display::percent(tag.tolerance_percent)
            )
            .into(),
        );
    }
}

fn update(
    window: &AppWindow,
    state: &AppState,
    readings: &[String],
    table: &VecModel<super::CheckRow>,
) {
    let a = window.global::<CheckAdapter>();
    let (tolerance, signal) = state
        .open_tag()
        .map(|t| (t.tolerance_percent, t.scale.signal))
        .unwrap_or((crate::tag::DEFAULT_TOLERANCE_PERCENT, Default::default()));
    let v = view(readings, tolerance, &signal);
    for (i, (r, found)) in v.rows.iter().zip(readings).enumerate() {
        let row = super::CheckRow {
            point: r.point.clone().into(),
            expected: r.expected.clone().into(),
            found: found.clone().into(),
            error: r.error.clone().into(),
            kind: r.tone.code(),
        };
        if i < table.row_count() {
            table.set_row_data(i, row);
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
                label: crate::display::fixed(*p, 0).into(),
            })
            .collect(),
    ));
    a.set_plot_description(format!("{}. {}", v.verdict.0, v.verdict.1).into());
    a.set_verdict_title(v.verdict.0.into());
    a.set_verdict_detail(v.verdict.1.into());
    a.set_verdict_kind(v.verdict.2.code());
}
