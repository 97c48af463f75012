//! Find fault screen glue: cautions first, then symptom, steps and finding.
//!
//! Preview: the steps and the finding shown are the demo plant's LT-101 loose-wire case,
//! laid out so the screen can be built and tested; the procedure engine (`crate::diagnose`,
//! branch `check`) supplies real steps and findings when it lands on main.

use super::{model, AppState, AppWindow, FaultAdapter, Shared};
use slint::ComponentHandle;

/// Symptoms offered (the engine will supply its own list).
const SYMPTOMS: [&str; 4] = [
    "Reading stuck low or at zero",
    "Reading stuck high or over range",
    "Reading wrong but moving",
    "Reading noisy or jumping",
];

/// Wire the adapter's callbacks.
pub fn connect(window: &AppWindow, state: &Shared) {
    let a = window.global::<FaultAdapter>();
    let weak = window.as_weak();
    a.on_read_cautions(move || {
        if let Some(w) = weak.upgrade() {
            w.global::<FaultAdapter>().set_cautions_read(true);
        }
    });
    let weak = window.as_weak();
    a.on_pick_symptom(move |i| {
        if let Some(w) = weak.upgrade() {
            w.global::<FaultAdapter>().set_symptom(i);
        }
    });
    let weak = window.as_weak();
    a.on_step_edited(move |_, _| {
        if let Some(w) = weak.upgrade() {
            w.global::<FaultAdapter>().set_error_text(
                "Preview: findings arrive with the fault-finding engine (branch check).".into(),
            );
        }
    });
    let weak = window.as_weak();
    a.on_save(move || {
        if let Some(w) = weak.upgrade() {
            w.global::<FaultAdapter>()
                .set_error_text("Saving sessions arrives with the store (branch store).".into());
        }
    });
    let weak = window.as_weak();
    let st = state.clone();
    a.on_restart(move || {
        if let Some(w) = weak.upgrade() {
            let a = w.global::<FaultAdapter>();
            a.set_cautions_read(false);
            a.set_symptom(-1);
            a.set_error_text("".into());
            refresh(&w, &st.borrow());
        }
    });
}

/// Copy the cautions, symptoms and the preview procedure in.
pub fn refresh(window: &AppWindow, state: &AppState) {
    let a = window.global::<FaultAdapter>();
    a.set_tag_title(state.ui.open_tag.clone().unwrap_or_default().into());
    a.set_cautions(model(
        crate::view::CAUTIONS.iter().map(|c| (*c).into()).collect(),
    ));
    a.set_symptoms(model(SYMPTOMS.iter().map(|s| (*s).into()).collect()));
    let step = |title: &str, detail: &str, label: &str, unit: &str, value: &str, st: i32| {
        super::FaultStep {
            title: title.into(),
            detail: detail.into(),
            input_label: label.into(),
            unit: unit.into(),
            value: value.into(),
            state: st,
        }
    };
    a.set_steps(model(vec![
        step(
            "Loop current at the marshalling",
            "Clamp or series meter on the PLC input terminals.",
            "Loop current",
            "mA",
            "3.50",
            2,
        ),
        step(
            "Supply at the cabinet",
            "Across the loop supply terminals, with the loop connected.",
            "Supply",
            "V",
            "24.1",
            1,
        ),
        step(
            "Volts at the transmitter terminals",
            "At the transmitter, loop connected. Compare with its 10.5 V minimum.",
            "Terminal volts",
            "V",
            "0.0",
            2,
        ),
    ]));
    a.set_finding_title("Open circuit between the cabinet and the transmitter".into());
    a.set_finding_detail(
        "Supply is present but no volts reach the transmitter: look for a loose or broken termination on the way (junction box first).".into(),
    );
    a.set_finding_kind(3);
    a.set_resume_text(
        "Preview: the steps are an example until the fault-finding engine lands.".into(),
    );
}
