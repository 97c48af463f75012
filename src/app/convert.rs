//! Convert screen glue: typed text → [`crate::view::convert`] → `ConvertAdapter`.

use super::{
    model, navigate, AppState, AppWindow, CalcField, ConvertAdapter, FormField, Screen, Shared,
};
use crate::error::Result;
use crate::form::sensor::{parse_kind, SensorKind};
use crate::number::parse_number;
use crate::rtd::RtdKind;
use crate::scale::{Scale, Transfer};
use crate::signal::BandLimits;
use crate::view::bands::BandBar;
use crate::view::convert::{view, ConvertInput, ConvertView, Source};
use crate::view::sensor_calc::{self, CalcSource};
use slint::ComponentHandle;

/// Wire the adapter's callbacks.
pub fn connect(window: &AppWindow, state: &Shared) {
    let adapter = window.global::<ConvertAdapter>();
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_edited(move |field, text| {
        let Some(w) = weak.upgrade() else { return };
        {
            let mut s = st.borrow_mut();
            let c = &mut s.ui.convert;
            let text = text.to_string();
            match field {
                FormField::Ohms => c.ohms = text,
                FormField::Lrv => c.lrv = text,
                FormField::Urv => c.urv = text,
                FormField::Unit => c.unit = text,
                FormField::Ma | FormField::Percent | FormField::Value | FormField::Volts => {
                    c.source = match field {
                        FormField::Ma => Source::Ma,
                        FormField::Percent => Source::Percent,
                        FormField::Value => Source::Value,
                        _ => Source::Volts,
                    };
                    c.text = text;
                }
                _ => {}
            }
        }
        update(&w, &st.borrow(), false);
    });
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_calc_edited(move |field, text| {
        let Some(w) = weak.upgrade() else { return };
        {
            let mut s = st.borrow_mut();
            let c = &mut s.ui.convert;
            let text = text.to_string();
            match field {
                CalcField::ColdJunction => c.calc_cj = text,
                CalcField::Temperature => {
                    c.calc_source = CalcSource::Temperature.name().to_string();
                    c.calc_text = text;
                }
                CalcField::Signal => {
                    c.calc_source = CalcSource::Signal.name().to_string();
                    c.calc_text = text;
                }
            }
        }
        update_calc(&w, &st.borrow(), false);
    });
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_calc_pick_sensor(move |i| {
        let Some(w) = weak.upgrade() else { return };
        if let Some(kind) = usize::try_from(i).ok().and_then(|i| SensorKind::ALL.get(i)) {
            st.borrow_mut().ui.convert.calc_sensor = kind.name();
        }
        // The sensor changes both fields' meaning: the signal is worked out again from the
        // temperature (or the temperature from the signal) and shown.
        update_calc(&w, &st.borrow(), true);
    });
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_change_tag(move || {
        if let Some(w) = weak.upgrade() {
            st.borrow_mut().ui.return_to = Some(super::Screen::Convert);
            navigate(&w, &st, Screen::Tags, true);
        }
    });
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_use_typed_range(move |on| {
        if let Some(w) = weak.upgrade() {
            st.borrow_mut().ui.convert.typed_range = on;
            refresh(&w, &st.borrow());
        }
    });
}

/// The sensor the calculator works with: the one picked (kept in the screen state by the
/// name a nameplate writes, so states saved when it was typed still read), or a Pt100.
fn calc_sensor(state: &AppState) -> SensorKind {
    parse_kind(&state.ui.convert.calc_sensor).unwrap_or(SensorKind::Rtd(RtdKind::Pt100))
}

/// Copy the sensor calculator in; the field being typed in keeps its text unless `all`.
pub fn update_calc(window: &AppWindow, state: &AppState, all: bool) {
    let a = window.global::<ConvertAdapter>();
    let c = &state.ui.convert;
    let sensor = calc_sensor(state);
    let source = CalcSource::from_name(&c.calc_source);
    let v = sensor_calc::view(&sensor_calc::CalcInput {
        sensor,
        cold_junction: c.calc_cj.clone(),
        source,
        text: c.calc_text.clone(),
    });
    if all {
        a.set_calc_sensors(model(
            sensor_calc::sensor_options()
                .into_iter()
                .map(Into::into)
                .collect(),
        ));
        a.set_calc_sensor_index(i32::try_from(sensor.index()).unwrap_or(0));
        a.set_calc_cj(c.calc_cj.clone().into());
    }
    let from_signal = source == CalcSource::Signal;
    if all || from_signal {
        a.set_calc_temp(v.temp_c.into());
    }
    if all || !from_signal {
        a.set_calc_signal(v.signal.into());
    }
    a.set_calc_unit(v.signal_unit.into());
    a.set_calc_tc(v.thermocouple);
    a.set_calc_note(v.note.into());
    a.set_calc_error_field(super::form_field(&v.error_field));
    a.set_calc_error(v.error_text.into());
}

/// The scale Convert works through: the open tag's, or the range typed on the screen.
fn scale_and_bands(state: &AppState) -> Result<(Scale, BandLimits, String, String)> {
    let c = &state.ui.convert;
    if c.typed_range || state.open_tag().is_none() {
        let lrv = parse_number("LRV", &c.lrv)?;
        let urv = parse_number("URV", &c.urv)?;
        let scale = Scale::linear(lrv, urv, &c.unit)?;
        let detail = format!(
            "{} – {} {} · linear",
            c.lrv.trim(),
            c.urv.trim(),
            c.unit.trim()
        );
        return Ok((
            scale,
            BandLimits::default(),
            "Range typed here".to_string(),
            detail,
        ));
    }
    let tag = state
        .open_tag()
        .ok_or_else(|| crate::FieldError::new("tag", "no tag is open"))?;
    Ok((
        tag.scale.clone(),
        tag.bands,
        tag.number.clone(),
        tag_detail(tag),
    ))
}

/// `Inlet wet well level · 0 – 4.5 m · linear`.
pub fn tag_detail(tag: &crate::tag::Tag) -> String {
    let s = &tag.scale;
    let transfer = match &s.transfer {
        Transfer::Linear => "linear".to_string(),
        Transfer::SquareRoot { cutoff_percent, .. } => {
            format!(
                "square root, cutoff {}",
                crate::view::cutoff(*cutoff_percent)
            )
        }
        Transfer::Table(t) => format!("table → {}", t.output_unit()),
    };
    let range = crate::view::range_text(s);
    if tag.service.is_empty() {
        format!("{range} · {transfer}")
    } else {
        format!("{} · {range} · {transfer}", tag.service)
    }
}

/// Copy everything (also the source field's text) into the adapter.
pub fn refresh(window: &AppWindow, state: &AppState) {
    let adapter = window.global::<ConvertAdapter>();
    let c = &state.ui.convert;
    adapter.set_typed_range(c.typed_range || state.open_tag().is_none());
    adapter.set_lrv_text(c.lrv.clone().into());
    adapter.set_urv_text(c.urv.clone().into());
    adapter.set_unit_text(c.unit.clone().into());
    adapter.set_ohms_text(c.ohms.clone().into());
    update(window, state, true);
    update_calc(window, state, true);
}

/// Work out the view and copy it in. The source field keeps the text as typed unless
/// `all` is set (start-up, tag changed).
fn update(window: &AppWindow, state: &AppState, all: bool) {
    let adapter = window.global::<ConvertAdapter>();
    let c = &state.ui.convert;
    let source = c.source;
    adapter.set_source(match source {
        Source::Ma => super::ConvertSource::Ma,
        Source::Percent => super::ConvertSource::Percent,
        Source::Value => super::ConvertSource::Value,
        Source::Volts => super::ConvertSource::Volts,
    });
    let result = scale_and_bands(state).and_then(|(scale, bands, title, detail)| {
        adapter.set_tag_title(title.into());
        adapter.set_tag_detail(detail.into());
        adapter.set_value_label(value_label(&scale).into());
        adapter.set_value_unit(scale.value_unit().into());
        view(&ConvertInput {
            scale: &scale,
            bands: &bands,
            source,
            text: &c.text,
            ohms_text: &c.ohms,
        })
    });
    match result {
        Ok(v) => {
            map_convert(&adapter, &v, source, all);
            if all {
                set_source_text(&adapter, source, &c.text);
            }
        }
        Err(e) => {
            if all {
                set_source_text(&adapter, source, &c.text);
            }
            adapter.set_error_field(super::form_field(&e.field));
            adapter.set_error_text(e.to_string().into());
        }
    }
}

fn value_label(scale: &Scale) -> String {
    match &scale.transfer {
        Transfer::Table(_) => "Value (after the table)".to_string(),
        Transfer::SquareRoot { .. } => "Flow".to_string(),
        Transfer::Linear => "Value".to_string(),
    }
}

fn set_source_text(adapter: &ConvertAdapter, source: Source, text: &str) {
    match source {
        Source::Ma => adapter.set_ma_text(text.into()),
        Source::Percent => adapter.set_percent_text(text.into()),
        Source::Value => adapter.set_value_text(text.into()),
        Source::Volts => adapter.set_volts_text(text.into()),
    }
}

/// Copy a worked view into the adapter, leaving the source field alone unless `all`.
pub fn map_convert(adapter: &ConvertAdapter, v: &ConvertView, source: Source, all: bool) {
    if all || source != Source::Ma {
        adapter.set_ma_text(v.ma.clone().into());
    }
    if all || source != Source::Percent {
        adapter.set_percent_text(v.percent.clone().into());
    }
    if all || source != Source::Value {
        adapter.set_value_text(v.value.clone().into());
    }
    if all || source != Source::Volts {
        adapter.set_volts_text(v.volts.clone().into());
    }
    adapter.set_value_unit(v.value_unit.clone().into());
    adapter.set_status_title(v.status_title.clone().into());
    adapter.set_status_detail(v.status_detail.clone().into());
    adapter.set_status_kind(super::tone(v.tone));
    adapter.set_notes(model(v.notes.iter().map(|n| n.into()).collect()));
    map_band_bar(adapter, &v.bar);
    adapter.set_bar_description(v.bar_description.clone().into());
    adapter.set_error_field(super::FormField::None);
    adapter.set_error_text("".into());
}

fn map_band_bar(adapter: &ConvertAdapter, bar: &BandBar) {
    adapter.set_bands(model(
        bar.bands
            .iter()
            .map(|b| super::BandSeg {
                start: b.start as f32,
                end: b.end as f32,
                tone: super::tone(crate::view::convert::tone(b.status)),
            })
            .collect(),
    ));
    adapter.set_ticks(model(
        bar.ticks
            .iter()
            .map(|t| super::Tick {
                pos: t.pos as f32,
                label: t.label.clone().into(),
            })
            .collect(),
    ));
    adapter.set_marker(bar.marker.unwrap_or(0.0) as f32);
    adapter.set_marker_visible(bar.marker.is_some());
}
