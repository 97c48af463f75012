//! Tags screen glue: search the register, open a tag, add or edit one through
//! [`crate::tag::Tag::validate`]. Every change is saved to the store before it is shown.

use super::state::{PowerForm, TagDraft};
use super::{model, navigate, refresh_all, AppState, AppWindow, Shared, TagsAdapter};
use crate::budget::LoopConfig;
use crate::display;
use crate::error::{FieldError, Result};
use crate::form::conductor;
use crate::form::range::{
    choice_from_words, cutoff_text, parse_table, Bounds, CutoffOf, RangeForm, TransferChoice,
};
use crate::form::{Field, FormError};
use crate::journal::{Entry, TagId};
use crate::number::parse_number;
use crate::scale::Transfer;
use crate::store::StoreError;
use crate::tag::{clean_number, Tag};
use slint::{ComponentHandle, Model};
use std::collections::HashMap;

/// Wire the adapter's callbacks.
pub fn connect(window: &AppWindow, state: &Shared) {
    let adapter = window.global::<TagsAdapter>();
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_search(move |text| {
        let Some(w) = weak.upgrade() else { return };
        st.borrow_mut().ui.tag_search = text.to_string();
        refresh_list(&w, &st.borrow());
    });
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_open(move |number| {
        let Some(w) = weak.upgrade() else { return };
        open(&w, &st, number.as_str());
    });
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_go_to(move |screen| {
        let Some(w) = weak.upgrade() else { return };
        navigate(&w, &st, screen, true);
    });
    let weak = window.as_weak();
    adapter.on_new_tag(move || {
        let Some(w) = weak.upgrade() else { return };
        let a = w.global::<TagsAdapter>();
        a.set_form(empty_form());
        a.set_is_new(true);
        a.set_editing(true);
        clear_error(&a);
        show_curve(&a);
    });
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_edit_open(move || {
        let Some(w) = weak.upgrade() else { return };
        if let Some(tag) = st.borrow().open_tag() {
            let a = w.global::<TagsAdapter>();
            a.set_form(form_of(tag));
            a.set_is_new(false);
            a.set_editing(true);
            clear_error(&a);
            show_curve(&a);
        }
    });
    let weak = window.as_weak();
    adapter.on_element_renamed(move |i, text| {
        edit_elements(&weak, |e| {
            if let Some(row) = usize::try_from(i).ok().and_then(|i| e.get_mut(i)) {
                row.0 = text.to_string();
            }
        })
    });
    let weak = window.as_weak();
    adapter.on_element_edited(move |i, text| {
        edit_elements(&weak, |e| {
            if let Some(row) = usize::try_from(i).ok().and_then(|i| e.get_mut(i)) {
                row.1 = text.to_string();
            }
        })
    });
    let weak = window.as_weak();
    adapter.on_add_element(move |kind| {
        edit_elements(&weak, |e| {
            e.push(super::power::new_element(
                e.len() + 1,
                kind.as_str() == "volts",
            ))
        })
    });
    let weak = window.as_weak();
    adapter.on_remove_element(move |i| {
        edit_elements(&weak, |e| {
            if let Some(i) = usize::try_from(i).ok().filter(|&i| i < e.len()) {
                e.remove(i);
            }
        })
    });
    let weak = window.as_weak();
    adapter.on_pick_conductor(move |i| {
        let Some(w) = weak.upgrade() else { return };
        let a = w.global::<TagsAdapter>();
        let mut form = a.get_form();
        let sizes = conductor::choices(form.cable_size.as_str());
        let size = conductor::picked(&sizes, usize::try_from(i).unwrap_or(0));
        set_conductor(&mut form, &size);
        a.set_form(form);
    });
    let weak = window.as_weak();
    adapter.on_pick_transfer(move |i| {
        let Some(w) = weak.upgrade() else { return };
        let a = w.global::<TagsAdapter>();
        let mut form = a.get_form();
        form.transfer = TransferChoice::from_index(i).index();
        form.cutoff_shown = cutoff_shown(form.transfer);
        form.table_shown = table_shown(form.transfer);
        // A table picked with no rows yet: two empty rows to type into (a table has at
        // least two points).
        if form.table_shown && form.table_rows.row_count() == 0 {
            form.table_rows = table_rows(&[Default::default(), Default::default()]);
        }
        a.set_form(form);
        show_curve(&a);
    });
    let weak = window.as_weak();
    adapter.on_table_input_edited(move |i, text| {
        edit_table_row(&weak, i, |row| row.input = text.clone())
    });
    let weak = window.as_weak();
    adapter.on_table_output_edited(move |i, text| {
        edit_table_row(&weak, i, |row| row.output = text.clone())
    });
    let weak = window.as_weak();
    adapter.on_add_table_row(move || edit_table(&weak, |rows| rows.push(Default::default())));
    let weak = window.as_weak();
    adapter.on_remove_table_row(move |i| {
        edit_table(&weak, |rows| {
            if let Some(i) = usize::try_from(i).ok().filter(|&i| i < rows.len()) {
                rows.remove(i);
            }
        })
    });
    let weak = window.as_weak();
    adapter.on_table_changed(move || {
        if let Some(w) = weak.upgrade() {
            show_curve(&w.global::<TagsAdapter>());
        }
    });
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_cancel(move || {
        if let Some(w) = weak.upgrade() {
            w.global::<TagsAdapter>().set_editing(false);
            st.borrow_mut().ui.tag_draft = None;
        }
    });
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_save(move |form| {
        let Some(w) = weak.upgrade() else { return };
        let a = w.global::<TagsAdapter>();
        let is_new = a.get_is_new();
        let result = save_form(&mut st.borrow_mut(), &form, is_new);
        match result {
            Ok(()) => {
                a.set_editing(false);
                clear_error(&a);
                st.borrow_mut().ui.tag_draft = None;
                refresh_all(&w, &st.borrow());
            }
            Err(e) => {
                let (field, text) = match &e {
                    StoreError::Input(f) => (f.field.clone(), f.to_string()),
                    other => (String::new(), other.to_string()),
                };
                // The series element a loop error names, read again from the form.
                let row = read_loop(&form).err().map_or(-1, |e| super::error_row(&e));
                a.set_error_field(super::form_field(&field));
                a.set_error_row(row);
                a.set_table_error_row(table_error_row(&form));
                a.set_error_text(text.into());
            }
        }
    });
}

/// No error shown on the form.
fn clear_error(a: &TagsAdapter) {
    a.set_error_field(super::FormField::None);
    a.set_error_row(-1);
    a.set_table_error_row(-1);
    a.set_error_text("".into());
}

/// The table editor is shown when the table is the transfer picked.
fn table_shown(transfer: i32) -> bool {
    TransferChoice::from_index(transfer) == TransferChoice::Table
}

/// The table's rows as the form shows them.
pub fn table_rows(rows: &[(String, String)]) -> slint::ModelRc<super::TableRow> {
    model(
        rows.iter()
            .map(|(input, output)| super::TableRow {
                input: input.clone().into(),
                output: output.clone().into(),
            })
            .collect(),
    )
}

/// The table's rows as typed, (input, output).
pub fn table_rows_of(rows: &slint::ModelRc<super::TableRow>) -> Vec<(String, String)> {
    rows.iter()
        .map(|r| (r.input.to_string(), r.output.to_string()))
        .collect()
}

/// The table's rows as the range form's `IN:OUT` text (`0:0; 1:5,1`), empty when the form
/// has no rows. Rows are joined with `;` so a decimal comma stays inside its number.
fn table_text(rows: &[(String, String)]) -> String {
    rows.iter()
        .map(|(input, output)| format!("{}:{}", input.trim(), output.trim()))
        .collect::<Vec<_>>()
        .join("; ")
}

/// The table row a save error names (-1 when the table is not picked or reads well).
fn table_error_row(form: &super::TagForm) -> i32 {
    if !table_shown(form.transfer) {
        return -1;
    }
    let rows = table_rows_of(&form.table_rows);
    if rows.is_empty() {
        return -1;
    }
    parse_table(&table_text(&rows), &form.table_unit)
        .err()
        .map_or(-1, |e| super::error_row(&e))
}

/// Work the table's curve out again from the form's rows as typed.
fn show_curve(a: &TagsAdapter) {
    let form = a.get_form();
    let c = crate::view::table::curve(
        &table_rows_of(&form.table_rows),
        &form.unit,
        &form.table_unit,
    );
    let dots = |points: &[crate::view::table::PlotPoint]| {
        model(
            points
                .iter()
                .map(|p| super::CurveDot {
                    x: p.x as f32,
                    y: p.y as f32,
                })
                .collect(),
        )
    };
    a.set_table_curve(super::CurveData {
        points: dots(&c.points),
        trace: dots(&c.trace),
        input_low: c.input_low.into(),
        input_high: c.input_high.into(),
        output_low: c.output_low.into(),
        output_high: c.output_high.into(),
        description: c.description.into(),
    });
}

/// Change one table row in place (the row's fields keep their focus while typing), then
/// draw the curve again.
fn edit_table_row(
    weak: &slint::Weak<AppWindow>,
    i: i32,
    change: impl FnOnce(&mut super::TableRow),
) {
    let Some(w) = weak.upgrade() else { return };
    let a = w.global::<TagsAdapter>();
    let rows = a.get_form().table_rows;
    let Some(i) = usize::try_from(i).ok() else {
        return;
    };
    if let Some(mut row) = rows.row_data(i) {
        change(&mut row);
        rows.set_row_data(i, row);
    }
    show_curve(&a);
}

/// Change the form's table rows (add, remove): read the form back, change the rows, set it
/// again, draw the curve again.
fn edit_table(weak: &slint::Weak<AppWindow>, change: impl FnOnce(&mut Vec<(String, String)>)) {
    let Some(w) = weak.upgrade() else { return };
    let a = w.global::<TagsAdapter>();
    let mut form = a.get_form();
    let mut rows = table_rows_of(&form.table_rows);
    change(&mut rows);
    form.table_rows = table_rows(&rows);
    a.set_form(form);
    show_curve(&a);
}

/// The cutoff field is shown for a square root only.
fn cutoff_shown(transfer: i32) -> bool {
    matches!(
        TransferChoice::from_index(transfer),
        TransferChoice::RootInReceiver | TransferChoice::RootInTransmitter
    )
}

/// Change the form's series elements: read the form back (with what is typed in its other
/// fields), change the rows, set it again.
fn edit_elements(
    weak: &slint::Weak<AppWindow>,
    change: impl FnOnce(&mut Vec<(String, String, bool)>),
) {
    let Some(w) = weak.upgrade() else { return };
    let a = w.global::<TagsAdapter>();
    let mut form = a.get_form();
    let mut rows = super::power::elements_of(&form.elements);
    change(&mut rows);
    form.elements = super::power::element_rows(&rows);
    a.set_form(form);
}

/// Save the form: a new tag, or the open tag edited (a changed number renames it and its
/// log follows). The tag becomes the open tag.
pub fn save_form(
    state: &mut AppState,
    form: &super::TagForm,
    is_new: bool,
) -> std::result::Result<(), StoreError> {
    let base = if is_new {
        None
    } else {
        state.open_record().cloned()
    };
    let tag = tag_from_form(form, base.as_ref().map(|r| &r.tag))?;
    let number = match base {
        Some(record) => {
            crate::action::tag::edit_tag(state.store.as_mut(), &record.tag.number, tag)?.number
        }
        None => crate::action::tag::add_tag(state.store.as_mut(), tag)?.number,
    };
    state.ui.open_tag = Some(number);
    state.ui.power.tag.clear();
    super::power::sync_form(state);
    super::check::sync(state);
    Ok(())
}

/// Open a tag: it becomes the tag every screen works on; go back to the screen that asked.
pub fn open(window: &AppWindow, state: &Shared, number: &str) {
    let return_to = {
        let mut s = state.borrow_mut();
        let Some(found) = s.store.tag(number).map(|r| r.tag.number.clone()) else {
            return;
        };
        s.ui.open_tag = Some(found);
        super::power::sync_form(&mut s);
        super::check::sync(&mut s);
        s.ui.return_to.take()
    };
    refresh_all(window, &state.borrow());
    if let Some(screen) = return_to {
        navigate(window, state, screen, false);
        state.borrow_mut().history.pop();
    }
}

/// A new tag's form: 0–100 %, linear, and a common 24 V loop with a 12 V transmitter
/// minimum to start from (emptied when the loop is not known).
pub fn empty_form() -> super::TagForm {
    let loop_part = super::power::form_from("", &LoopConfig::new(24.0, 12.0));
    let mut f = with_loop(
        super::TagForm {
            number: "".into(),
            service: "".into(),
            area: "".into(),
            lrv: "0".into(),
            urv: "100".into(),
            unit: "%".into(),
            transfer: TransferChoice::Linear.index(),
            tolerance: display::fixed(crate::tag::DEFAULT_TOLERANCE_PERCENT, 2).into(),
            ..Default::default()
        },
        &loop_part,
    );
    f.supply = "24".into();
    f
}

/// The form filled from a tag.
pub fn form_of(tag: &Tag) -> super::TagForm {
    let transfer = TransferChoice::of(&tag.scale.transfer).index();
    let mut loop_part = match &tag.loop_config {
        Some(c) => super::power::form_from(&tag.number, c),
        None => PowerForm::default(),
    };
    loop_part.hart = tag.hart;
    with_loop(
        super::TagForm {
            number: tag.number.clone().into(),
            service: tag.service.clone().into(),
            area: tag.area.clone().into(),
            lrv: crate::display::trimmed(tag.scale.lrv).into(),
            urv: crate::display::trimmed(tag.scale.urv).into(),
            unit: tag.scale.unit.clone().into(),
            transfer,
            cutoff: cutoff_text(&tag.scale.transfer).into(),
            cutoff_shown: cutoff_shown(transfer),
            table_rows: table_rows(&table_rows_of_tag(tag)),
            table_unit: match &tag.scale.transfer {
                Transfer::Table(t) => t.output_unit().into(),
                _ => "".into(),
            },
            table_shown: table_shown(transfer),
            tolerance: crate::display::trimmed(tag.tolerance_percent).into(),
            ..Default::default()
        },
        &loop_part,
    )
}

/// A tag's characterisation table as rows the form shows (none for another transfer).
fn table_rows_of_tag(tag: &Tag) -> Vec<(String, String)> {
    match &tag.scale.transfer {
        Transfer::Table(t) => t
            .points()
            .iter()
            .map(|p| (display::trimmed(p.input), display::trimmed(p.output)))
            .collect(),
        _ => Vec::new(),
    }
}

/// The form as typed, to be saved with the screen state.
pub fn draft_of(f: &super::TagForm, is_new: bool) -> TagDraft {
    TagDraft {
        is_new,
        number: f.number.to_string(),
        service: f.service.to_string(),
        area: f.area.to_string(),
        lrv: f.lrv.to_string(),
        urv: f.urv.to_string(),
        unit: f.unit.to_string(),
        transfer: TransferChoice::from_index(f.transfer).label().to_string(),
        cutoff: f.cutoff.to_string(),
        tolerance: f.tolerance.to_string(),
        loop_form: loop_form_of(f),
        table_rows: table_rows_of(&f.table_rows),
        table_unit: f.table_unit.to_string(),
    }
}

/// The form as it was typed before the app closed.
pub fn form_of_draft(d: &TagDraft) -> super::TagForm {
    // A draft from before the picker has the transfer in words, cutoff included.
    let (choice, cutoff_in_words) = choice_from_words(&d.transfer);
    let cutoff = if d.cutoff.trim().is_empty() {
        cutoff_in_words
    } else {
        d.cutoff.clone()
    };
    with_loop(
        super::TagForm {
            number: d.number.clone().into(),
            service: d.service.clone().into(),
            area: d.area.clone().into(),
            lrv: d.lrv.clone().into(),
            urv: d.urv.clone().into(),
            unit: d.unit.clone().into(),
            transfer: choice.index(),
            cutoff: cutoff.into(),
            cutoff_shown: cutoff_shown(choice.index()),
            table_rows: table_rows(&d.table_rows),
            table_unit: d.table_unit.clone().into(),
            table_shown: table_shown(choice.index()),
            tolerance: d.tolerance.clone().into(),
            ..Default::default()
        },
        &d.loop_form,
    )
}

/// Show a tag form left open when the app closed (called once at start-up).
pub fn restore_draft(window: &AppWindow, state: &AppState) {
    if let Some(d) = &state.ui.tag_draft {
        let a = window.global::<TagsAdapter>();
        a.set_form(form_of_draft(d));
        a.set_is_new(d.is_new);
        a.set_editing(true);
        show_curve(&a);
    }
}

/// The form's conductor and its picker (the common sizes, and this size when it is another).
fn set_conductor(f: &mut super::TagForm, size: &str) {
    let sizes = conductor::choices(size);
    f.cable_size = size.into();
    f.cable_size_index = i32::try_from(sizes.current).unwrap_or(0);
    f.cable_sizes = super::model(sizes.options.into_iter().map(Into::into).collect());
}

/// The form's loop fields set from a Power form (the two share the loop's wording).
fn with_loop(mut f: super::TagForm, p: &PowerForm) -> super::TagForm {
    f.supply = p.supply.clone().into();
    f.sag = p.tolerance.clone().into();
    f.tx_min = p.tx_min.clone().into();
    f.fault = p.fault.clone().into();
    f.cable_m = p.cable_m.clone().into();
    set_conductor(&mut f, &p.cable_size);
    f.elements = super::power::element_rows(&p.elements);
    f.hart = p.hart;
    f
}

/// The form's loop as a Power form, so one reader ([`super::power::config_from`]) checks
/// both screens' loops.
pub fn loop_form_of(f: &super::TagForm) -> PowerForm {
    PowerForm {
        tag: f.number.to_string(),
        supply: f.supply.to_string(),
        tolerance: f.sag.to_string(),
        tx_min: f.tx_min.to_string(),
        fault: f.fault.to_string(),
        cable_m: f.cable_m.to_string(),
        cable_size: f.cable_size.to_string(),
        elements: super::power::elements_of(&f.elements),
        hart: f.hart,
    }
}

/// The form's range and transfer as the range form ([`crate::form::range`]); the signal
/// span, which the form does not show, is the tag's own.
pub fn range_form_of(f: &super::TagForm, base: Option<&Tag>) -> RangeForm {
    RangeForm {
        bounds: Bounds::Apart {
            lrv: f.lrv.to_string(),
            urv: f.urv.to_string(),
        },
        unit: f.unit.to_string(),
        transfer: TransferChoice::from_index(f.transfer),
        cutoff: f.cutoff.to_string(),
        cutoff_of: CutoffOf::Flow,
        table: table_text(&table_rows_of(&f.table_rows)),
        table_unit: f.table_unit.to_string(),
        signal: base
            .map(|b| format!("{}..{}", b.scale.signal.low_ma, b.scale.signal.high_ma))
            .unwrap_or_default(),
    }
}

/// The form's loop, read by the loop form.
fn read_loop(f: &super::TagForm) -> std::result::Result<crate::budget::LoopConfig, FormError> {
    super::power::read_loop(&loop_form_of(f))
}

/// Build a tag from the form, keeping what the form does not show from `base`.
pub fn tag_from_form(form: &super::TagForm, base: Option<&Tag>) -> Result<Tag> {
    let number = clean_number(&form.number)?;
    let kept_table = match base.map(|b| &b.scale.transfer) {
        Some(Transfer::Table(t)) => Some(t),
        _ => None,
    };
    let scale = range_form_of(form, base).parse(kept_table)?;
    let mut tag = match base {
        Some(b) => {
            let mut t = b.clone();
            t.number = number;
            t.scale = scale;
            t
        }
        None => Tag::new(&number, scale)?,
    };
    tag.service = form.service.trim().to_string();
    tag.area = form.area.trim().to_string();
    tag.tolerance_percent = parse_number("tolerance", form.tolerance.trim_end_matches('%'))?;
    tag.hart = form.hart;
    let lf = loop_form_of(form);
    let unknown = lf.supply.trim().is_empty() && lf.tx_min.trim().is_empty();
    let described = !lf.elements.is_empty() || !lf.cable_m.trim().is_empty();
    tag.loop_config = if unknown && !described {
        None
    } else {
        let mut config = read_loop(form)?;
        super::power::keep_unshown(&mut config, base.and_then(|b| b.loop_config.as_ref()));
        Some(config)
    };
    tag.validate()
        .map_err(|e| FieldError::from(FormError::from_core(e, Field::Tag)))?;
    Ok(tag)
}

/// Does a tag match the search text (number, service or area, any case)?
pub fn matches(tag: &Tag, search: &str) -> bool {
    let q = search.trim().to_lowercase();
    q.is_empty()
        || [&tag.number, &tag.service, &tag.area]
            .iter()
            .any(|f| f.to_lowercase().contains(&q))
}

/// Copy the (filtered) register and the open tag's sheet into the adapter.
pub fn refresh(window: &AppWindow, state: &AppState) {
    window.global::<TagsAdapter>().set_transfer_options(model(
        TransferChoice::ALL
            .iter()
            .map(|c| c.label().into())
            .collect(),
    ));
    window.global::<TagsAdapter>().set_fault_placeholder(
        format!(
            "{} (default)",
            display::fixed(crate::budget::DEFAULT_FAULT_MA, 1)
        )
        .into(),
    );
    refresh_list(window, state);
    map_sheet(&window.global::<TagsAdapter>(), state);
}

/// Copy the (filtered) register into the adapter; the sheet does not depend on the search,
/// so typing in the search box does not work it out again.
fn refresh_list(window: &AppWindow, state: &AppState) {
    let adapter = window.global::<TagsAdapter>();
    let last = last_entries(state);
    let rows: Vec<super::TagRow> = state
        .store
        .tags()
        .iter()
        .filter(|r| !r.tag.archived && matches(&r.tag, &state.ui.tag_search))
        .map(|r| map_row(&r.tag, last.get(&r.id).copied()))
        .collect();
    let total = state.tags().count();
    adapter.set_count_text(if rows.len() == total {
        format!("{total} tags").into()
    } else {
        format!("{} of {total} tags", rows.len()).into()
    });
    adapter.set_rows(model(rows));
    adapter.set_search_text(state.ui.tag_search.clone().into());
    adapter.set_open_tag(state.ui.open_tag.clone().unwrap_or_default().into());
}

/// The open tag's sheet into the adapter (empty when no tag is open).
fn map_sheet(adapter: &TagsAdapter, state: &AppState) {
    let sheet = state
        .open_record()
        .map(|r| crate::view::tag_sheet::sheet(state.store.as_ref(), r));
    let entries = |rows: &[crate::view::log::Row]| {
        model(
            rows.iter()
                .map(|r| super::SheetEntry {
                    when: r.when.clone().into(),
                    title: r.title.clone().into(),
                    text: r.text.clone().into(),
                    open: r.kind == crate::view::log::RowKind::OpenFollowUp,
                })
                .collect(),
        )
    };
    match sheet {
        Some(s) => {
            adapter.set_sheet_title(s.title.into());
            adapter.set_sheet_facts(model(
                s.facts
                    .into_iter()
                    .map(|f| super::SheetFact {
                        label: f.label.into(),
                        value: f.value.into(),
                    })
                    .collect(),
            ));
            adapter.set_sheet_open(entries(&s.open));
            adapter.set_sheet_recent(entries(&s.recent));
            adapter.set_sheet_summary(s.log_summary.into());
        }
        None => {
            adapter.set_sheet_title("".into());
            adapter.set_sheet_facts(model(Vec::new()));
            adapter.set_sheet_open(model(Vec::new()));
            adapter.set_sheet_recent(model(Vec::new()));
            adapter.set_sheet_summary("".into());
        }
    }
}

/// Each tag's newest log entry (from the snapshot's aid when the log is not read yet).
pub fn last_entries(state: &AppState) -> HashMap<&TagId, &Entry> {
    state.store.newest_by_tag()
}

/// One row: number, service, range, and the tag's last log entry (date and kind).
pub fn map_row(tag: &Tag, last: Option<&Entry>) -> super::TagRow {
    let s = &tag.scale;
    let range = crate::view::range_text(s);
    let last = last
        .map(|e| {
            let closed = std::collections::HashSet::new();
            let kind = crate::view::log::row_kind(e, &closed);
            format!(
                "{} · {}",
                e.time.format("%Y-%m-%d"),
                crate::view::log::title(e, kind)
            )
        })
        .unwrap_or_default();
    super::TagRow {
        number: tag.number.clone().into(),
        service: tag.service.clone().into(),
        range: range.into(),
        last: last.into(),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn form(number: &str, lrv: &str) -> super::super::TagForm {
        let mut f = empty_form();
        f.number = number.into();
        f.lrv = lrv.into();
        f.urv = "4,5".into();
        f.unit = "m".into();
        f
    }

    #[test]
    fn a_form_becomes_a_tag_or_names_the_bad_field() {
        let tag = tag_from_form(&form(" LT-102 ", "0"), None).unwrap();
        assert_eq!(tag.number, "LT-102");
        assert_eq!(tag.scale.urv, 4.5);
        assert_eq!(tag.loop_config.unwrap().supply_volts, 24.0);
        assert_eq!(
            tag_from_form(&form("LT-102", "zero"), None)
                .unwrap_err()
                .field,
            "LRV"
        );
        assert_eq!(
            tag_from_form(&form("", "0"), None).unwrap_err().field,
            "tag"
        );
        let mut f = form("LT-102", "0");
        f.tolerance = "0".into();
        assert_eq!(tag_from_form(&f, None).unwrap_err().field, "tolerance");
    }

    #[test]
    fn the_whole_loop_is_recorded_from_the_tag_form() {
        // A level loop: 24 V card supply that may sag 5 %, a transmitter needing 10,5 V, a
        // 250 Ω card input, an isolating barrier dropping 8 V, and 180 m of 1.0 mm² pair.
        let mut f = form("LT-110", "0");
        f.supply = "24".into();
        f.sag = "5".into();
        f.tx_min = "10,5".into();
        f.fault = "21".into();
        f.elements = super::super::power::element_rows(&[
            ("Card input".into(), "250".into(), false),
            ("Barrier".into(), "8".into(), true),
        ]);
        f.cable_m = "180".into();
        f.cable_size = "1.0 mm²".into();
        f.hart = true;
        let tag = tag_from_form(&f, None).unwrap();
        assert!(tag.hart);
        let c = tag.loop_config.clone().unwrap();
        assert_eq!(c.supply_volts, 24.0);
        assert_eq!(c.supply_tolerance_percent, 5.0);
        assert_eq!(c.tx_min_volts, 10.5);
        assert_eq!(c.fault_ma, Some(21.0));
        assert_eq!(c.elements.len(), 2);
        assert_eq!(c.elements[0].name, "Card input");
        assert_eq!(c.cable.unwrap().one_way_m, 180.0);
        // The form filled from the tag reads back as the same tag.
        assert_eq!(tag_from_form(&form_of(&tag), Some(&tag)).unwrap(), tag);
    }

    #[test]
    fn an_unknown_loop_is_left_empty_and_a_half_loop_is_named() {
        let mut f = form("LT-111", "0");
        f.supply = " ".into();
        f.tx_min = "".into();
        assert_eq!(tag_from_form(&f, None).unwrap().loop_config, None);
        // Elements without a supply: the supply is what is missing.
        f.elements =
            super::super::power::element_rows(&[("Card input".into(), "250".into(), false)]);
        assert_eq!(tag_from_form(&f, None).unwrap_err().field, "supply");
        // A bad element value is a series-element error naming the element, on its row.
        f.supply = "24".into();
        f.tx_min = "12".into();
        f.elements =
            super::super::power::element_rows(&[("Card input".into(), "lots".into(), false)]);
        let e = tag_from_form(&f, None).unwrap_err();
        assert_eq!(e.field, "series element");
        assert!(e.reason.starts_with("Card input:"), "{e}");
        assert_eq!(read_loop(&f).unwrap_err().row, Some(0));
        // A bad supply sag is not taken for the check tolerance.
        f.elements = Default::default();
        f.sag = "-3".into();
        assert_eq!(tag_from_form(&f, None).unwrap_err().field, "supply sag");
    }

    #[test]
    fn the_transfer_is_picked_and_the_cutoff_typed() {
        // FT-311: a DP flow loop, root in the receiver, cutoff 1,5 % of flow.
        let mut f = form("FT-311", "0");
        f.transfer = TransferChoice::RootInReceiver.index();
        f.cutoff = "1,5".into();
        let tag = tag_from_form(&f, None).unwrap();
        assert_eq!(
            tag.scale.transfer,
            Transfer::SquareRoot {
                cutoff_percent: 1.5,
                root_in: crate::scale::RootLocation::Receiver
            }
        );
        // The form filled from the tag shows the same choice and cutoff.
        let back = form_of(&tag);
        assert_eq!(back.transfer, f.transfer);
        assert_eq!(back.cutoff, "1.5");
        assert!(back.cutoff_shown);
        assert!(!form_of(&tag_from_form(&form("LT-1", "0"), None).unwrap()).cutoff_shown);
        // A cutoff outside 0–100 % names the cutoff field.
        f.cutoff = "120".into();
        assert_eq!(tag_from_form(&f, None).unwrap_err().field, "cutoff");
        // A table is kept from the tag when picked on the form; a new tag cannot pick one
        // without its pairs.
        f.transfer = TransferChoice::Table.index();
        assert_eq!(tag_from_form(&f, None).unwrap_err().field, "table");
    }

    #[test]
    fn a_draft_typed_before_the_picker_still_opens() {
        // app-state.json written when Transfer was typed in words.
        let draft: TagDraft = serde_json::from_str(
            r#"{"is_new": true, "number": "FT-312", "lrv": "0", "urv": "300", "unit": "m3/h",
                "transfer": "square root in the transmitter, cutoff 0,01 % of DP",
                "tolerance": "0.5"}"#,
        )
        .unwrap();
        let f = form_of_draft(&draft);
        assert_eq!(f.transfer, TransferChoice::RootInTransmitter.index());
        // 0.01 % of DP is 1 % of flow (flow ∝ √ΔP, ISO 5167 relation).
        assert_eq!(f.cutoff, "1");
        // And the draft as now written reads back the same.
        let again = form_of_draft(&draft_of(&f, true));
        assert_eq!((again.transfer, again.cutoff), (f.transfer, f.cutoff));
    }

    #[test]
    fn a_table_shows_as_rows_and_reads_back_the_same() {
        // LT-140: level 0–2 m read as volume through a horizontal tank's table (r = 1 m,
        // L = 5 m; circular-segment volumes worked by hand: 1 m → 7.854 m³, 2 m → 15.708 m³).
        let mut f = form("LT-140", "0");
        f.urv = "2".into();
        f.transfer = TransferChoice::Table.index();
        f.table_rows = table_rows(&[
            ("0".into(), "0".into()),
            ("1".into(), "7,854".into()),
            ("2".into(), "15,708".into()),
        ]);
        f.table_unit = "m³".into();
        let tag = tag_from_form(&f, None).unwrap();
        let back = form_of(&tag);
        assert!(back.table_shown && !back.cutoff_shown);
        assert_eq!(
            table_rows_of(&back.table_rows),
            [("0", "0"), ("1", "7.854"), ("2", "15.708")]
                .map(|(i, o)| (i.to_string(), o.to_string()))
        );
        assert_eq!(tag_from_form(&back, Some(&tag)).unwrap(), tag);
        // The draft keeps the rows; a draft from before the table editor has none.
        let again = form_of_draft(&draft_of(&f, true));
        assert_eq!(
            table_rows_of(&again.table_rows),
            table_rows_of(&f.table_rows)
        );
        assert_eq!(again.table_unit, "m³");
        let old: TagDraft =
            serde_json::from_str(r#"{"is_new": true, "number": "LT-140", "transfer": "linear"}"#)
                .unwrap();
        assert!(old.table_rows.is_empty());
        // A bad row names its row (from 0) for the editor to outline.
        f.table_rows = table_rows(&[("0".into(), "0".into()), ("1".into(), "lots".into())]);
        assert_eq!(table_error_row(&f), 1);
        assert_eq!(tag_from_form(&f, None).unwrap_err().field, "table");
    }

    #[test]
    fn editing_keeps_what_the_form_does_not_show() {
        let tags = crate::demo::tags().unwrap();
        let ft = &tags[2];
        let edited = tag_from_form(&form_of(ft), Some(ft)).unwrap();
        assert_eq!(edited.scale.transfer, ft.scale.transfer);
        assert_eq!(edited.loop_config, ft.loop_config);
    }
}
