//! Tags screen glue: search the register, open a tag, add or edit one through
//! [`crate::tag::Tag::validate`]. Every change is saved to the store before it is shown.

use super::{
    model, navigate, refresh_all, screen_from_name, AppState, AppWindow, Shared, TagsAdapter,
};
use crate::display;
use crate::error::Result;
use crate::journal::{Entry, TagId};
use crate::number::parse_number;
use crate::scale::Scale;
use crate::store::StoreError;
use crate::tag::{clean_number, Tag};
use slint::ComponentHandle;
use std::collections::HashMap;

/// Wire the adapter's callbacks.
pub fn connect(window: &AppWindow, state: &Shared) {
    let adapter = window.global::<TagsAdapter>();
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_search(move |text| {
        let Some(w) = weak.upgrade() else { return };
        st.borrow_mut().ui.tag_search = text.to_string();
        refresh(&w, &st.borrow());
    });
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_open(move |number| {
        let Some(w) = weak.upgrade() else { return };
        open(&w, &st, number.as_str());
    });
    let weak = window.as_weak();
    adapter.on_new_tag(move || {
        let Some(w) = weak.upgrade() else { return };
        let a = w.global::<TagsAdapter>();
        a.set_form(empty_form());
        a.set_is_new(true);
        a.set_editing(true);
        a.set_error_field("".into());
        a.set_error_text("".into());
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
            a.set_error_field("".into());
            a.set_error_text("".into());
        }
    });
    let weak = window.as_weak();
    adapter.on_cancel(move || {
        if let Some(w) = weak.upgrade() {
            w.global::<TagsAdapter>().set_editing(false);
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
                refresh_all(&w, &st.borrow());
            }
            Err(e) => {
                let (field, text) = match &e {
                    StoreError::Input(f) => (f.field.clone(), f.to_string()),
                    other => (String::new(), other.to_string()),
                };
                a.set_error_field(field.into());
                a.set_error_text(text.into());
            }
        }
    });
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
    let number = tag.number.clone();
    match base {
        Some(record) => state.store.update_tag(&record.id, tag)?,
        None => {
            state.store.add_tag(tag)?;
        }
    }
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
    if let Some(screen) = return_to.as_deref().and_then(screen_from_name) {
        navigate(window, state, screen, false);
        state.borrow_mut().history.pop();
    }
}

fn empty_form() -> super::TagForm {
    super::TagForm {
        number: "".into(),
        service: "".into(),
        area: "".into(),
        lrv: "0".into(),
        urv: "100".into(),
        unit: "%".into(),
        transfer: "linear".into(),
        supply: "24".into(),
        tx_min: "12".into(),
        tolerance: display::fixed(crate::tag::DEFAULT_TOLERANCE_PERCENT, 2).into(),
    }
}

/// The form filled from a tag.
pub fn form_of(tag: &Tag) -> super::TagForm {
    let detail = super::convert::tag_detail(tag);
    let transfer = detail.rsplit(" · ").next().unwrap_or("linear").to_string();
    let lc = tag.loop_config.as_ref();
    super::TagForm {
        number: tag.number.clone().into(),
        service: tag.service.clone().into(),
        area: tag.area.clone().into(),
        lrv: crate::view::plain(tag.scale.lrv).into(),
        urv: crate::view::plain(tag.scale.urv).into(),
        unit: tag.scale.unit.clone().into(),
        transfer: transfer.into(),
        supply: lc
            .map(|c| crate::view::plain(c.supply_volts))
            .unwrap_or_default()
            .into(),
        tx_min: lc
            .map(|c| crate::view::plain(c.tx_min_volts))
            .unwrap_or_default()
            .into(),
        tolerance: crate::view::plain(tag.tolerance_percent).into(),
    }
}

/// Build a tag from the form, keeping what the form does not show from `base`.
pub fn tag_from_form(form: &super::TagForm, base: Option<&Tag>) -> Result<Tag> {
    let number = clean_number(&form.number)?;
    let lrv = parse_number("LRV", &form.lrv)?;
    let urv = parse_number("URV", &form.urv)?;
    let mut tag = match base {
        Some(b) => {
            let mut t = b.clone();
            t.number = number;
            t.scale = Scale::new(
                lrv,
                urv,
                &form.unit,
                b.scale.transfer.clone(),
                b.scale.signal,
            )?;
            t
        }
        None => Tag::new(&number, Scale::linear(lrv, urv, &form.unit)?)?,
    };
    tag.service = form.service.trim().to_string();
    tag.area = form.area.trim().to_string();
    tag.tolerance_percent = parse_number("tolerance", form.tolerance.trim_end_matches('%'))?;
    let supply = form.supply.trim();
    let tx_min = form.tx_min.trim();
    if !supply.is_empty() || !tx_min.is_empty() {
        let supply = parse_number("supply", supply)?;
        let tx_min = parse_number("transmitter minimum", tx_min)?;
        let mut config = tag
            .loop_config
            .clone()
            .unwrap_or_else(|| crate::budget::LoopConfig::new(supply, tx_min));
        config.supply_volts = supply;
        config.tx_min_volts = tx_min;
        tag.loop_config = Some(config);
    }
    tag.validate().map_err(|e| match e.field.as_str() {
        "supply_volts" => e.renamed("supply"),
        "tx_min_volts" => e.renamed("transmitter minimum"),
        _ => e,
    })?;
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

/// Copy the (filtered) register into the adapter.
pub fn refresh(window: &AppWindow, state: &AppState) {
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

/// Each tag's newest log entry (one pass over the log).
pub fn last_entries(state: &AppState) -> HashMap<&TagId, &Entry> {
    let mut last: HashMap<&TagId, &Entry> = HashMap::new();
    for e in state.store.entries() {
        match last.get(&e.tag) {
            Some(seen) if seen.time > e.time => {}
            _ => {
                last.insert(&e.tag, e);
            }
        }
    }
    last
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
    fn editing_keeps_what_the_form_does_not_show() {
        let tags = crate::demo::tags().unwrap();
        let ft = &tags[2];
        let edited = tag_from_form(&form_of(ft), Some(ft)).unwrap();
        assert_eq!(edited.scale.transfer, ft.scale.transfer);
        assert_eq!(edited.loop_config, ft.loop_config);
    }
}
