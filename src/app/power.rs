//! Power screen glue: the loop's fields as typed → [`LoopConfig`] →
//! [`crate::view::power`] → `PowerAdapter`.

use super::state::PowerForm;
use super::{model, navigate, AppState, AppWindow, FormField, PowerAdapter, Screen, Shared};
use crate::budget::{ElementKind, LoopConfig, DEFAULT_FAULT_MA};
use crate::display;
use crate::error::{FieldError, Result};
use crate::form::conductor;
use crate::form::loop_form::{ElementText, LoopForm};
use crate::form::{Field, FormError};
use crate::store::StoreError;
use crate::view::power::{view, PowerView, Slice};
use slint::ComponentHandle;

/// Wire the adapter's callbacks.
pub fn connect(window: &AppWindow, state: &Shared) {
    let adapter = window.global::<PowerAdapter>();
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_edited(move |field, text| {
        let Some(w) = weak.upgrade() else { return };
        {
            let mut s = st.borrow_mut();
            let f = &mut s.ui.power;
            let text = text.to_string();
            match field {
                FormField::Supply => f.supply = text,
                FormField::SupplySag => f.tolerance = text,
                FormField::TxMin => f.tx_min = text,
                FormField::FaultCurrent => f.fault = text,
                FormField::CableLength => f.cable_m = text,
                _ => {}
            }
        }
        update(&w, &st.borrow());
    });
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_cable_size_picked(move |i| {
        let Some(w) = weak.upgrade() else { return };
        {
            let mut s = st.borrow_mut();
            let f = &mut s.ui.power;
            let sizes = conductor::choices(&f.cable_size);
            f.cable_size = conductor::picked(&sizes, usize::try_from(i).unwrap_or(0));
        }
        refresh(&w, &st.borrow());
    });
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_element_edited(move |i, text| {
        let Some(w) = weak.upgrade() else { return };
        if let Ok(i) = usize::try_from(i) {
            if let Some(e) = st.borrow_mut().ui.power.elements.get_mut(i) {
                e.1 = text.to_string();
            }
        }
        update(&w, &st.borrow());
    });
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_element_renamed(move |i, text| {
        let Some(w) = weak.upgrade() else { return };
        if let Ok(i) = usize::try_from(i) {
            if let Some(e) = st.borrow_mut().ui.power.elements.get_mut(i) {
                e.0 = text.to_string();
            }
        }
        update(&w, &st.borrow());
    });
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_add_element(move |kind| {
        let Some(w) = weak.upgrade() else { return };
        {
            let mut s = st.borrow_mut();
            let n = s.ui.power.elements.len() + 1;
            s.ui.power
                .elements
                .push(new_element(n, kind == super::SeriesKind::Drop));
        }
        refresh(&w, &st.borrow());
    });
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_remove_element(move |i| {
        let Some(w) = weak.upgrade() else { return };
        if let Ok(i) = usize::try_from(i) {
            let mut s = st.borrow_mut();
            if i < s.ui.power.elements.len() {
                s.ui.power.elements.remove(i);
            }
        }
        refresh(&w, &st.borrow());
    });
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_hart_toggled(move |on| {
        let Some(w) = weak.upgrade() else { return };
        st.borrow_mut().ui.power.hart = on;
        w.global::<PowerAdapter>().set_hart(on);
        update(&w, &st.borrow());
    });
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_save_to_tag(move || {
        let Some(w) = weak.upgrade() else { return };
        let result = save_to_tag(&mut st.borrow_mut());
        let a = w.global::<PowerAdapter>();
        match result {
            Ok(number) => {
                a.set_message(format!("Saved this loop to {number}.").into());
                super::tags::refresh(&w, &st.borrow());
            }
            Err(e) => {
                a.set_message("".into());
                a.set_error_text(e.to_string().into());
            }
        }
    });
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_change_tag(move || {
        if let Some(w) = weak.upgrade() {
            st.borrow_mut().ui.return_to = Some(Screen::Power);
            navigate(&w, &st, Screen::Tags, true);
        }
    });
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_open_is(move || {
        if let Some(w) = weak.upgrade() {
            navigate(&w, &st, Screen::Intrinsic, true);
        }
    });
}

/// A new series element, numbered `n`: a 250 Ω resistor (the common receiver input), or a
/// 2.5 V drop (a typical loop-powered indicator; common practice, check its data sheet).
pub fn new_element(n: usize, drop: bool) -> (String, String, bool) {
    if drop {
        (format!("Drop {n}"), "2.5".to_string(), true)
    } else {
        (format!("Resistor {n}"), "250".to_string(), false)
    }
}

/// Elements as the screens show them (name, value as typed, unit).
pub fn element_rows(elements: &[(String, String, bool)]) -> slint::ModelRc<super::ElementRow> {
    model(
        elements
            .iter()
            .map(|(name, value, drop)| super::ElementRow {
                name: name.clone().into(),
                value: value.clone().into(),
                unit: if *drop { "V" } else { "Ω" }.into(),
            })
            .collect(),
    )
}

/// Elements read back from the screen's rows (a unit of V marks a volt drop).
pub fn elements_of(rows: &slint::ModelRc<super::ElementRow>) -> Vec<(String, String, bool)> {
    use slint::Model;
    rows.iter()
        .map(|r| {
            (
                r.name.to_string(),
                r.value.to_string(),
                r.unit.as_str() == "V",
            )
        })
        .collect()
}

/// The form filled from a loop configuration.
pub fn form_from(tag: &str, c: &LoopConfig) -> PowerForm {
    PowerForm {
        tag: tag.to_string(),
        supply: display::setting_number(c.supply_volts),
        tolerance: display::trimmed(c.supply_tolerance_percent),
        tx_min: display::trimmed(c.tx_min_volts),
        // Empty when the device's configured fault current was not given: the field then
        // shows the default as a placeholder and the budget says it is a default.
        fault: c.fault_ma.map(display::trimmed).unwrap_or_default(),
        cable_m: c
            .cable
            .map(|k| display::trimmed(k.one_way_m))
            .unwrap_or_default(),
        cable_size: c.cable.map(|k| k.conductor.label()).unwrap_or_default(),
        elements: c
            .elements
            .iter()
            .map(|e| match e.kind {
                ElementKind::Resistance { ohms } => (e.name.clone(), display::trimmed(ohms), false),
                ElementKind::Drop { volts } => (e.name.clone(), display::trimmed(volts), true),
            })
            .collect(),
        hart: false,
    }
}

/// Keep what the screens do not show (the HART resistance window, the cable's
/// temperature, and how the loop is built: its wiring, a current source's compliance and
/// the cable's capacitance for HART) from the loop as it was saved.
pub fn keep_unshown(config: &mut LoopConfig, saved: Option<&LoopConfig>) {
    let Some(saved) = saved else { return };
    config.hart_window_ohms = saved.hart_window_ohms;
    if let (Some(cable), Some(old)) = (config.cable.as_mut(), saved.cable) {
        cable.temp_c = old.temp_c;
    }
    keep_topology(config, Some(saved));
}

/// Keep how the loop is built (wiring, compliance, the cable's capacitance for HART) from
/// the loop as saved: the screens do not show a topology picker yet, so a loop driven by
/// a current output is worked and saved as the tag has it, not as a 0 V supply.
pub fn keep_topology(config: &mut LoopConfig, saved: Option<&LoopConfig>) {
    let Some(saved) = saved else { return };
    config.wiring = saved.wiring;
    config.compliance = saved.compliance;
    config.hart_cable = saved.hart_cable;
}

/// The Power form as the loop form ([`crate::form::loop_form`]): the one parser the tag
/// form and the command line's loop flags use too.
pub fn loop_form(form: &PowerForm) -> LoopForm {
    LoopForm {
        supply: form.supply.clone(),
        sag: form.tolerance.clone(),
        tx_min: form.tx_min.clone(),
        fault: form.fault.clone(),
        elements: form
            .elements
            .iter()
            .map(|(name, value, drop)| ElementText {
                name: name.clone(),
                value: value.clone(),
                drop: *drop,
            })
            .collect(),
        cable_m: form.cable_m.clone(),
        conductor: form.cable_size.clone(),
        ..Default::default()
    }
}

/// Build the loop from the form; the error names the first field that is wrong (and the
/// row of a series element).
pub fn read_loop(form: &PowerForm) -> std::result::Result<LoopConfig, FormError> {
    loop_form(form).parse()
}

/// Build the loop from the form, the error as the screens show it.
pub fn config_from(form: &PowerForm) -> Result<LoopConfig> {
    read_loop(form).map_err(FieldError::from)
}

/// Fill the form from the open tag when the tag changed, then copy everything in.
pub fn refresh(window: &AppWindow, state: &AppState) {
    let adapter = window.global::<PowerAdapter>();
    let f = &state.ui.power;
    adapter.set_supply_text(f.supply.clone().into());
    adapter.set_tolerance_text(f.tolerance.clone().into());
    adapter.set_tx_min_text(f.tx_min.clone().into());
    adapter.set_fault_text(f.fault.clone().into());
    adapter.set_fault_placeholder(
        format!("{} (default)", display::setting_number(DEFAULT_FAULT_MA)).into(),
    );
    adapter.set_cable_m_text(f.cable_m.clone().into());
    let sizes = conductor::choices(&f.cable_size);
    adapter.set_cable_sizes(model(sizes.options.into_iter().map(Into::into).collect()));
    adapter.set_cable_size_index(i32::try_from(sizes.current).unwrap_or(0));
    adapter.set_elements(element_rows(&f.elements));
    adapter.set_hart(f.hart);
    update(window, state);
}

/// Save the loop as typed (supply, transmitter minimum, elements, cable) to the open tag's
/// definition in the register; returns the tag number.
pub fn save_to_tag(state: &mut AppState) -> std::result::Result<String, StoreError> {
    let record = state
        .open_record()
        .cloned()
        .ok_or_else(|| FieldError::new("tag", "no tag is open; open one on Tags first"))?;
    let mut config = config_from(&state.ui.power)?;
    let mut tag = record.tag;
    keep_unshown(&mut config, tag.loop_config.as_ref());
    tag.loop_config = Some(config);
    tag.hart = state.ui.power.hart;
    state.store.update_tag(&record.id, tag.clone())?;
    Ok(tag.number)
}

/// Make sure the Power form belongs to the open tag (called when a tag is opened).
pub fn sync_form(state: &mut AppState) {
    let Some(tag) = state.open_tag().cloned() else {
        return;
    };
    if state.ui.power.tag == tag.number {
        return;
    }
    let config = tag
        .loop_config
        .clone()
        .unwrap_or_else(|| LoopConfig::new(24.0, 12.0));
    state.ui.power = form_from(&tag.number, &config);
    state.ui.power.hart = tag.hart;
}

fn update(window: &AppWindow, state: &AppState) {
    let adapter = window.global::<PowerAdapter>();
    let tag = state.open_tag();
    adapter.set_tag_title(
        tag.map(|t| t.number.clone())
            .unwrap_or_else(|| "No tag open".to_string())
            .into(),
    );
    adapter.set_tag_detail(tag.map(|t| t.service.clone()).unwrap_or_default().into());
    adapter.set_can_save(tag.is_some());
    adapter.set_message("".into());
    match tag.and_then(crate::view::intrinsic::power_card) {
        Some((title, detail, tone)) => {
            adapter.set_has_is(true);
            adapter.set_is_title(title.into());
            adapter.set_is_detail(detail.into());
            adapter.set_is_kind(super::tone(tone));
        }
        None => adapter.set_has_is(false),
    }
    let saved = tag
        .filter(|t| t.number == state.ui.power.tag)
        .and_then(|t| t.loop_config.as_ref());
    let worked = read_loop(&state.ui.power).and_then(|mut c| {
        keep_topology(&mut c, saved);
        view(&c, state.ui.power.hart).map_err(|e| FormError::from_core(e, Field::Supply))
    });
    match worked {
        Ok(v) => map_power(&adapter, &v),
        Err(e) => {
            adapter.set_error_field(super::form_field(e.field.name()));
            adapter.set_error_row(super::error_row(&e));
            adapter.set_error_text(e.to_string().into());
        }
    }
}

fn map_slices(slices: &[Slice]) -> slint::ModelRc<super::BudgetSeg> {
    model(
        slices
            .iter()
            .map(|s| super::BudgetSeg {
                start: s.start as f32,
                width: s.width as f32,
                kind: super::slice_kind(s.kind),
                label: s.label.clone().into(),
            })
            .collect(),
    )
}

/// Copy a worked budget into the adapter.
pub fn map_power(adapter: &PowerAdapter, v: &PowerView) {
    adapter.set_full_title(v.full_title.clone().into());
    adapter.set_fault_title(v.fault_title.clone().into());
    adapter.set_bar_full(map_slices(&v.full));
    adapter.set_bar_fault(map_slices(&v.fault));
    adapter.set_supply_pos(v.supply_pos as f32);
    adapter.set_supply_label(v.supply_label.clone().into());
    adapter.set_bar_full_description(v.full_description.clone().into());
    adapter.set_bar_fault_description(v.fault_description.clone().into());
    adapter.set_legend(model(
        v.legend
            .iter()
            .map(|l| super::LegendRow {
                kind: super::slice_kind(l.kind),
                name: l.name.clone().into(),
                full: l.full.clone().into(),
                fault: l.fault.clone().into(),
            })
            .collect(),
    ));
    adapter.set_figures(model(
        v.figures
            .iter()
            .map(|f| super::Figure {
                label: f.label.clone().into(),
                value: f.value.clone().into(),
                kind: super::tone(f.tone),
            })
            .collect(),
    ));
    adapter.set_notes(model(v.notes.iter().map(|n| n.clone().into()).collect()));
    adapter.set_verdict_title(v.verdict_title.clone().into());
    adapter.set_verdict_detail(v.verdict_detail.clone().into());
    adapter.set_verdict_kind(super::tone(v.verdict_tone));
    match &v.hart {
        Some((title, detail, tone)) => {
            adapter.set_hart_title(title.clone().into());
            adapter.set_hart_detail(detail.clone().into());
            adapter.set_hart_kind(super::tone(*tone));
        }
        None => {
            adapter.set_hart_title("".into());
            adapter.set_hart_detail("".into());
            adapter.set_hart_kind(super::Tone::Neutral);
        }
    }
    adapter.set_error_field(super::FormField::None);
    adapter.set_error_row(-1);
    adapter.set_error_text("".into());
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn form_round_trips_and_names_bad_fields() {
        let tags = crate::demo::tags().unwrap();
        let c = tags[0].loop_config.clone().unwrap();
        let form = form_from("LT-101", &c);
        let back = config_from(&form).unwrap();
        assert_eq!(back.elements, c.elements);
        assert_eq!(back.supply_volts, 24.0);
        let mut bad = form.clone();
        bad.supply = "24 V x".to_string();
        assert_eq!(config_from(&bad).unwrap_err().field, "supply");
        let mut bad = form;
        bad.elements[0].1 = "-250".to_string();
        let e = read_loop(&bad).unwrap_err();
        assert_eq!((e.field, e.row), (Field::SeriesElement, Some(0)));
        assert!(e.reason.starts_with("PLC input:"), "{e}");
    }

    #[test]
    fn an_output_loop_keeps_its_topology_through_the_screens() {
        // FV-315 is driven by an analog output (max load 750 Ω): the Power form shows its
        // elements and cable; what it does not show is kept, so saving the form does not
        // turn it into a 0 V supply loop, and the budget is worked against its compliance.
        let tags = crate::demo::tags().unwrap();
        let fv315 = tags.iter().find(|t| t.number == "FV-315").unwrap();
        let c = fv315.loop_config.clone().unwrap();
        let mut back = config_from(&form_from("FV-315", &c)).unwrap();
        keep_unshown(&mut back, Some(&c));
        assert_eq!(back, c);
        let b = back.budget().unwrap();
        assert_eq!(
            b.source,
            Some(crate::budget::topology::SourceKind::CurrentOutput)
        );
        assert!(b.ok);
    }
}
