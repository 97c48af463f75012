//! Intrinsic-safety screen glue: the open tag's IS circuit as typed (kept in the saved
//! state, started from the tag's stored IS data) → [`crate::view::intrinsic`] →
//! `IsAdapter`; *Save the IS data* and *Save the IS check to the log* go through
//! [`crate::action::intrinsic`], the same actions as `loopside intrinsic set` and
//! `loopside intrinsic check --save`.

use super::{model, navigate, AppState, AppWindow, IsAdapter, Screen, Shared};
use super::{IsBoxRow, IsCheckRow, IsDeviceField, IsDeviceRow, IsField};
use crate::action::intrinsic::{save_is_check, set_circuit, NewIsCheck};
use crate::form::intrinsic::{circuit_text, CircuitText, DeviceText};
use crate::view::intrinsic::{class_choices, group_choices, view, IsChoices};
use serde::{Deserialize, Serialize};
use slint::ComponentHandle;

/// The IS form as typed, for one tag.
#[derive(Debug, Clone, Default, PartialEq, Serialize, Deserialize)]
#[serde(default)]
pub struct IsForm {
    /// The tag the form is for (the form is started again when another tag is opened).
    pub tag: String,
    /// The circuit as typed.
    pub text: CircuitText,
}

/// A new field device's form: empty, to be typed from its certificate.
fn new_device(n: usize) -> DeviceText {
    DeviceText {
        name: format!("Device {n}"),
        ..DeviceText::default()
    }
}

/// A HART hand-held's form: marked temporary, its values to be typed from its certificate.
fn new_hand_held() -> DeviceText {
    DeviceText {
        name: "HART hand-held".to_string(),
        temporary: true,
        ..DeviceText::default()
    }
}

/// The form for the open tag: the one being typed, or the tag's stored IS data, or an
/// empty circuit with one device.
pub fn current(state: &AppState) -> IsForm {
    let tag = state.ui.open_tag.clone().unwrap_or_default();
    if state.ui.intrinsic.tag == tag && !tag.is_empty() {
        return state.ui.intrinsic.clone();
    }
    let text = match state.open_tag().and_then(|t| t.intrinsic.as_ref()) {
        Some(c) => circuit_text(c),
        None => CircuitText {
            devices: vec![new_device(1)],
            ..CircuitText::default()
        },
    };
    IsForm { tag, text }
}

/// Make the state's form the open tag's (before an edit).
fn sync(state: &mut AppState) {
    state.ui.intrinsic = current(state);
}

fn field_slot(t: &mut CircuitText, f: IsField) -> &mut String {
    match f {
        IsField::Uo => &mut t.source.uo,
        IsField::Io => &mut t.source.io,
        IsField::Po => &mut t.source.po,
        IsField::Co => &mut t.source.co,
        IsField::Lo => &mut t.source.lo,
        IsField::LoRo => &mut t.source.lo_ro,
        IsField::SourceName => &mut t.source.name,
        IsField::SourceCert => &mut t.source.certificate,
        IsField::SourceGroup => &mut t.source.group,
        IsField::CableM => &mut t.cable.length,
        IsField::CableC => &mut t.cable.c_per_m,
        IsField::CableL => &mut t.cable.l_per_m,
        IsField::CableLr => &mut t.cable.lr,
        IsField::AreaGroup => &mut t.area_group,
        IsField::AreaTClass => &mut t.area_t_class,
    }
}

fn device_slot(d: &mut DeviceText, f: IsDeviceField) -> &mut String {
    match f {
        IsDeviceField::Name => &mut d.name,
        IsDeviceField::Cert => &mut d.certificate,
        IsDeviceField::Ui => &mut d.ui,
        IsDeviceField::Ii => &mut d.ii,
        IsDeviceField::Pi => &mut d.pi,
        IsDeviceField::Ci => &mut d.ci,
        IsDeviceField::Li => &mut d.li,
        IsDeviceField::Group => &mut d.group,
        IsDeviceField::TClass => &mut d.t_class,
    }
}

/// The picker for a field that is picked (a gas group or a temperature class) as the form
/// holds it; `None` for a typed field.
fn choices_of(f: IsField, t: &CircuitText) -> Option<IsChoices> {
    match f {
        IsField::SourceGroup => Some(group_choices(&t.source.group)),
        IsField::AreaGroup => Some(group_choices(&t.area_group)),
        IsField::AreaTClass => Some(class_choices(&t.area_t_class)),
        _ => None,
    }
}

/// The picker for a device's field that is picked; `None` for a typed field.
fn device_choices_of(f: IsDeviceField, d: &DeviceText) -> Option<IsChoices> {
    match f {
        IsDeviceField::Group => Some(group_choices(&d.group)),
        IsDeviceField::TClass => Some(class_choices(&d.t_class)),
        _ => None,
    }
}

/// Option `i` of the picker of `f` picked: the form's text becomes the option's.
pub fn pick(t: &mut CircuitText, f: IsField, i: i32) {
    let Some(c) = choices_of(f, t) else { return };
    if let Some(text) = usize::try_from(i).ok().and_then(|i| c.text_of(i)) {
        *field_slot(t, f) = text.to_string();
    }
}

/// Option `option` of the picker of field `f` of device `index` picked.
pub fn pick_device(t: &mut CircuitText, index: i32, f: IsDeviceField, option: i32) {
    let Some(d) = usize::try_from(index)
        .ok()
        .and_then(|i| t.devices.get_mut(i))
    else {
        return;
    };
    let Some(c) = device_choices_of(f, d) else {
        return;
    };
    if let Some(text) = usize::try_from(option).ok().and_then(|i| c.text_of(i)) {
        *device_slot(d, f) = text.to_string();
    }
}

/// Apply `change` to the open tag's form, then show the result (`rows` also copies the
/// device list in, after a device was added, removed or toggled; a typed field keeps its
/// text and focus otherwise).
fn edit(
    weak: &slint::Weak<AppWindow>,
    st: &Shared,
    rows: bool,
    change: impl FnOnce(&mut CircuitText),
) {
    let Some(w) = weak.upgrade() else { return };
    {
        let mut s = st.borrow_mut();
        sync(&mut s);
        change(&mut s.ui.intrinsic.text);
    }
    let s = st.borrow();
    if rows {
        refresh(&w, &s);
    } else {
        show(&w, &s);
    }
}

/// Wire the adapter's callbacks.
pub fn connect(window: &AppWindow, state: &Shared) {
    let adapter = window.global::<IsAdapter>();
    let (weak, st) = (window.as_weak(), state.clone());
    adapter.on_edited(move |f, text| {
        edit(&weak, &st, false, |t| *field_slot(t, f) = text.to_string());
    });
    let (weak, st) = (window.as_weak(), state.clone());
    adapter.on_device_edited(move |i, f, text| {
        edit(&weak, &st, false, |t| {
            if let Some(d) = usize::try_from(i).ok().and_then(|i| t.devices.get_mut(i)) {
                *device_slot(d, f) = text.to_string();
            }
        });
    });
    let (weak, st) = (window.as_weak(), state.clone());
    adapter.on_picked(move |f, i| {
        edit(&weak, &st, true, |t| pick(t, f, i));
    });
    let (weak, st) = (window.as_weak(), state.clone());
    adapter.on_device_picked(move |d, f, i| {
        edit(&weak, &st, true, |t| pick_device(t, d, f, i));
    });
    let (weak, st) = (window.as_weak(), state.clone());
    adapter.on_device_simple(move |i, on| {
        edit(&weak, &st, true, |t| {
            if let Some(d) = usize::try_from(i).ok().and_then(|i| t.devices.get_mut(i)) {
                d.simple = on;
            }
        });
    });
    let (weak, st) = (window.as_weak(), state.clone());
    adapter.on_device_temporary(move |i, on| {
        edit(&weak, &st, true, |t| {
            if let Some(d) = usize::try_from(i).ok().and_then(|i| t.devices.get_mut(i)) {
                d.temporary = on;
            }
        });
    });
    let (weak, st) = (window.as_weak(), state.clone());
    adapter.on_add_device(move || {
        edit(&weak, &st, true, |t| {
            let n = t.devices.len() + 1;
            t.devices.push(new_device(n));
        });
    });
    let (weak, st) = (window.as_weak(), state.clone());
    adapter.on_add_hand_held(move || {
        edit(&weak, &st, true, |t| t.devices.push(new_hand_held()));
    });
    let (weak, st) = (window.as_weak(), state.clone());
    adapter.on_remove_device(move |i| {
        edit(&weak, &st, true, |t| {
            if let Ok(i) = usize::try_from(i) {
                if i < t.devices.len() {
                    t.devices.remove(i);
                }
            }
        });
    });
    let (weak, st) = (window.as_weak(), state.clone());
    adapter.on_save_data(move || {
        let Some(w) = weak.upgrade() else { return };
        let message = save_data(&mut st.borrow_mut());
        let s = st.borrow();
        super::tags::refresh(&w, &s);
        super::power::refresh(&w, &s);
        show(&w, &s);
        w.global::<IsAdapter>().set_message(message.into());
    });
    let (weak, st) = (window.as_weak(), state.clone());
    adapter.on_save_check(move || {
        let Some(w) = weak.upgrade() else { return };
        let initials = w.global::<IsAdapter>().get_initials_text().to_string();
        let message = save_check(&mut st.borrow_mut(), &initials);
        let s = st.borrow();
        super::log::refresh(&w, &s);
        super::tags::refresh(&w, &s);
        show(&w, &s);
        w.global::<IsAdapter>().set_message(message.into());
    });
    let (weak, st) = (window.as_weak(), state.clone());
    adapter.on_change_tag(move || {
        if let Some(w) = weak.upgrade() {
            st.borrow_mut().ui.return_to = Some(Screen::Intrinsic);
            navigate(&w, &st, Screen::Tags, true);
        }
    });
}

/// Store the circuit as typed on the open tag; the message to show (what was saved, or
/// the field to correct).
pub fn save_data(state: &mut AppState) -> String {
    sync(state);
    let form = state.ui.intrinsic.clone();
    let v = view(&form.text);
    let Some(circuit) = v.circuit else {
        return v.problem;
    };
    match set_circuit(state.store.as_mut(), &form.tag, Some(circuit)) {
        Ok(saved) => saved.to_string(),
        Err(e) => e.to_string(),
    }
}

/// Save the check of the circuit as typed to the open tag's log, signed with `initials`;
/// the message to show.
pub fn save_check(state: &mut AppState, initials: &str) -> String {
    sync(state);
    state.ui.initials = initials.to_string();
    let form = state.ui.intrinsic.clone();
    let v = view(&form.text);
    let Some(circuit) = v.circuit else {
        return v.problem;
    };
    let now = state.now();
    match save_is_check(
        state.store.as_mut(),
        now,
        NewIsCheck {
            tag: &form.tag,
            initials,
            circuit: &circuit,
            note: "",
        },
    ) {
        Ok(saved) => saved.to_string(),
        Err(e) => e.to_string(),
    }
}

/// A picker's options for Slint.
fn options(c: &IsChoices) -> slint::ModelRc<slint::SharedString> {
    model(c.options.iter().map(|o| o.clone().into()).collect())
}

/// A picker's option picked, for Slint.
fn index(c: &IsChoices) -> i32 {
    i32::try_from(c.current).unwrap_or(0)
}

fn device_rows(t: &CircuitText) -> Vec<IsDeviceRow> {
    t.devices
        .iter()
        .enumerate()
        .map(|(i, d)| {
            let n = i + 1;
            IsDeviceRow {
                title: if d.temporary {
                    format!("Temporary device {n}")
                } else {
                    format!("Field device {n}")
                }
                .into(),
                label: if d.name.trim().is_empty() {
                    format!("device {n}")
                } else {
                    d.name.trim().to_string()
                }
                .into(),
                name: d.name.clone().into(),
                cert: d.certificate.clone().into(),
                ui: d.ui.clone().into(),
                ii: d.ii.clone().into(),
                pi: d.pi.clone().into(),
                ci: d.ci.clone().into(),
                li: d.li.clone().into(),
                group_options: options(&group_choices(&d.group)),
                group_index: index(&group_choices(&d.group)),
                t_class_options: options(&class_choices(&d.t_class)),
                t_class_index: index(&class_choices(&d.t_class)),
                simple: d.simple,
                temporary: d.temporary,
            }
        })
        .collect()
}

/// Copy the whole form and the result in (start-up, another tag, a device added).
pub fn refresh(window: &AppWindow, state: &AppState) {
    let a = window.global::<IsAdapter>();
    let form = current(state);
    let t = &form.text;
    a.set_uo(t.source.uo.clone().into());
    a.set_io(t.source.io.clone().into());
    a.set_po(t.source.po.clone().into());
    a.set_co(t.source.co.clone().into());
    a.set_lo(t.source.lo.clone().into());
    a.set_lo_ro(t.source.lo_ro.clone().into());
    a.set_source_name(t.source.name.clone().into());
    a.set_source_cert(t.source.certificate.clone().into());
    let c = group_choices(&t.source.group);
    a.set_source_group_options(options(&c));
    a.set_source_group_index(index(&c));
    a.set_cable_m(t.cable.length.clone().into());
    a.set_cable_c(t.cable.c_per_m.clone().into());
    a.set_cable_l(t.cable.l_per_m.clone().into());
    a.set_cable_lr(t.cable.lr.clone().into());
    let c = group_choices(&t.area_group);
    a.set_area_group_options(options(&c));
    a.set_area_group_index(index(&c));
    let c = class_choices(&t.area_t_class);
    a.set_area_t_class_options(options(&c));
    a.set_area_t_class_index(index(&c));
    a.set_devices(model(device_rows(t)));
    a.set_initials_text(state.ui.initials.clone().into());
    a.set_message("".into());
    show(window, state);
}

/// Copy the result in (after each keystroke).
pub fn show(window: &AppWindow, state: &AppState) {
    let a = window.global::<IsAdapter>();
    let form = current(state);
    let v = view(&form.text);
    a.set_tag_title(if form.tag.is_empty() {
        "No tag open".into()
    } else {
        form.tag.clone().into()
    });
    a.set_can_save(!form.tag.is_empty() && state.open_tag().is_some());
    a.set_cautions(model(v.caution.iter().map(|c| c.clone().into()).collect()));
    a.set_verdict_title(v.verdict_title.into());
    a.set_verdict_detail(v.verdict_detail.into());
    a.set_verdict_kind(super::tone(v.verdict_tone));
    a.set_rows(model(
        v.rows
            .into_iter()
            .map(|r| IsCheckRow {
                mark: r.mark.into(),
                title: r.title.into(),
                numbers: r.numbers.into(),
                margin: r.margin.into(),
                tone: super::tone(r.tone),
            })
            .collect(),
    ));
    a.set_sums(model(v.sums.into_iter().map(Into::into).collect()));
    a.set_notes(model(v.notes.into_iter().map(Into::into).collect()));
    a.set_picture(model(
        v.picture
            .into_iter()
            .map(|b| IsBoxRow {
                title: b.title.into(),
                detail: b.detail.into(),
            })
            .collect(),
    ));
}
