//! Log screen glue: the open tag's entries or all of them, searched; add a note or a
//! follow-up; mark follow-ups done; write a handoff report; import a bundle. Every change
//! goes through the store and is durable before the screen shows it.

use super::{model, AppState, AppWindow, LogAdapter, Shared};
use crate::action::{
    self,
    bundle::{Destination, Exported, Format, Imported},
    note::{FollowUpClosed, NewNote, NoteAdded},
};
use crate::error::FieldError;
use crate::journal::Query;
use crate::store::StoreError;
use crate::view::log::{list, query, Row};
use slint::ComponentHandle;
use std::path::{Path, PathBuf};

/// Wire the adapter's callbacks.
pub fn connect(window: &AppWindow, state: &Shared) {
    let adapter = window.global::<LogAdapter>();
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_search(move |text| {
        let Some(w) = weak.upgrade() else { return };
        st.borrow_mut().ui.log_search = text.to_string();
        refresh(&w, &st.borrow());
    });
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_since_edited(move |text| {
        let Some(w) = weak.upgrade() else { return };
        st.borrow_mut().ui.log_since = text.to_string();
        refresh(&w, &st.borrow());
    });
    let st = state.clone();
    adapter.on_export_dir_edited(move |text| st.borrow_mut().ui.export_dir = text.to_string());
    let st = state.clone();
    adapter.on_import_path_edited(move |text| st.borrow_mut().ui.import_path = text.to_string());
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_show_all(move |all| {
        let Some(w) = weak.upgrade() else { return };
        st.borrow_mut().ui.log_all = all;
        refresh(&w, &st.borrow());
    });
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_add_note(move |text, who, follow_up| {
        let Some(w) = weak.upgrade() else { return };
        let a = w.global::<LogAdapter>();
        let result = add_note(&mut st.borrow_mut(), &text, &who, follow_up);
        match result {
            Ok(added) => {
                a.set_note_text("".into());
                a.set_error_text("".into());
                a.set_message(added.to_string().into());
                refresh(&w, &st.borrow());
                super::tags::refresh(&w, &st.borrow());
            }
            Err(e) => a.set_error_text(e.to_string().into()),
        }
    });
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_mark_done(move |id| {
        let Some(w) = weak.upgrade() else { return };
        let initials = w.global::<LogAdapter>().get_initials_text();
        let result = mark_done(&mut st.borrow_mut(), &id, &initials);
        let a = w.global::<LogAdapter>();
        match result {
            Ok(_) => a.set_error_text("".into()),
            Err(e) => a.set_error_text(e.to_string().into()),
        }
        refresh(&w, &st.borrow());
        super::tags::refresh(&w, &st.borrow());
    });
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_export_report(move |format| {
        let Some(w) = weak.upgrade() else { return };
        let a = w.global::<LogAdapter>();
        let folder = a.get_export_dir().to_string();
        st.borrow_mut().ui.export_dir = folder.clone();
        let format = match format {
            super::ReportFormat::Markdown => Format::Markdown,
            super::ReportFormat::Csv => Format::Csv,
            super::ReportFormat::Json => Format::Json,
        };
        let message = match export(&st.borrow(), format, &folder) {
            Ok(done) => done.to_string(),
            Err(e) => format!("Not written: {e}"),
        };
        a.set_message(message.into());
    });
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_import_bundle(move || {
        let Some(w) = weak.upgrade() else { return };
        let a = w.global::<LogAdapter>();
        let path = a.get_import_path().to_string();
        st.borrow_mut().ui.import_path = path.clone();
        let result = import(&mut st.borrow_mut(), Path::new(path.trim()));
        a.set_message(
            match result {
                Ok(done) => done.to_string(),
                Err(e) => format!("Nothing imported: {e}"),
            }
            .into(),
        );
        refresh(&w, &st.borrow());
        super::tags::refresh(&w, &st.borrow());
    });
}

/// Add a note (or an open follow-up) to the open tag's log, signed with `who`; the
/// initials are remembered for the next entry. See [`action::note::add_note`].
pub fn add_note(
    state: &mut AppState,
    text: &str,
    who: &str,
    follow_up: bool,
) -> Result<NoteAdded, StoreError> {
    let tag = state
        .open_tag()
        .map(|t| t.number.clone())
        .ok_or_else(|| FieldError::new("tag", "no tag is open; open one on Tags first"))?;
    let now = state.now();
    let added = action::note::add_note(
        state.store.as_mut(),
        now,
        NewNote::new(&tag, text, who, follow_up),
    )?;
    state.ui.initials = added.initials.clone();
    Ok(added)
}

/// Mark the open follow-up `id` done, signed with `who`. See
/// [`action::note::close_follow_up`].
pub fn mark_done(state: &mut AppState, id: &str, who: &str) -> Result<FollowUpClosed, StoreError> {
    let now = state.now();
    action::note::close_follow_up(state.store.as_mut(), now, id, who, "")
}

/// The folder reports go to: the one typed, else the state's default.
fn export_folder(state: &AppState, typed: &str) -> Result<PathBuf, FieldError> {
    let typed = typed.trim();
    if !typed.is_empty() {
        return Ok(PathBuf::from(typed));
    }
    state
        .export_dir
        .clone()
        .or_else(|| state.data_dir.as_ref().map(|d| d.join("exports")))
        .ok_or_else(|| FieldError::new("export folder", "is empty; type a folder to write to"))
}

/// What the Log shows: the open tag's entries (or all tags' when asked, or when no tag is
/// open), the search, and the start of the period; the error names `since` when the start
/// cannot be read.
pub fn shown_query(state: &AppState) -> Result<Query, FieldError> {
    let mut q = whole_period_query(state);
    q.since = crate::journal::parse_since(&state.ui.log_since, state.now())?;
    Ok(q)
}

/// [`shown_query`] without the start of the period.
fn whole_period_query(state: &AppState) -> Query {
    let tag = if state.ui.log_all {
        None
    } else {
        state.open_tag_id()
    };
    query(tag, &state.ui.log_search)
}

/// Write what the Log shows ([`shown_query`]) as a hand-over in `format` (`md`, `csv`,
/// `json`) into `folder` (the one typed, else the default). See
/// [`action::bundle::export_handover`].
pub fn export(state: &AppState, format: Format, folder: &str) -> Result<Exported, StoreError> {
    let folder = export_folder(state, folder)?;
    let q = shown_query(state)?;
    action::bundle::export_handover(
        state.store.as_ref(),
        state.now(),
        &q,
        format,
        &Destination::Folder(folder),
    )
}

/// Merge a JSON bundle from another device into the store. See
/// [`action::bundle::import_bundle`].
pub fn import(state: &mut AppState, path: &Path) -> Result<Imported, StoreError> {
    action::bundle::import_bundle(state.store.as_mut(), path)
}

/// Copy the entries into the adapter.
pub fn refresh(window: &AppWindow, state: &AppState) {
    let adapter = window.global::<LogAdapter>();
    let tag = state.open_record();
    let all = state.ui.log_all || tag.is_none();
    adapter.set_heading(
        tag.map(|t| t.tag.number.clone())
            .unwrap_or_else(|| "—".to_string())
            .into(),
    );
    adapter.set_all_tags(all);
    adapter.set_search_text(state.ui.log_search.clone().into());
    adapter.set_since_text(state.ui.log_since.clone().into());
    // A start that cannot be read is named under its field; the list then shows the
    // whole period rather than nothing.
    let q = match shown_query(state) {
        Ok(q) => {
            adapter.set_since_error("".into());
            q
        }
        Err(e) => {
            adapter.set_since_error(e.to_string().into());
            whole_period_query(state)
        }
    };
    let l = list(state.store.as_ref(), &q);
    let count = match q.since {
        Some(since) => format!(
            "{} since {}",
            l.count_text,
            since
                .with_timezone(state.now().offset())
                .format("%Y-%m-%d %H:%M")
        ),
        None => l.count_text,
    };
    adapter.set_count_text(count.into());
    adapter.set_rows(model(l.rows.iter().map(map_entry).collect()));
    if adapter.get_initials_text().is_empty() {
        adapter.set_initials_text(state.ui.initials.clone().into());
    }
    let default_dir = export_folder(state, &state.ui.export_dir)
        .map(|p| p.display().to_string())
        .unwrap_or_default();
    adapter.set_export_dir(default_dir.into());
    adapter.set_import_path(state.ui.import_path.clone().into());
    if !state.notices.is_empty() && adapter.get_message().is_empty() {
        adapter.set_message(state.notices.join(" ").into());
    }
}

/// One entry as the Log screen shows it.
pub fn map_entry(r: &Row) -> super::LogRow {
    super::LogRow {
        id: r.id.clone().into(),
        when: r.when.clone().into(),
        tag: r.tag.clone().into(),
        title: r.title.clone().into(),
        text: r.text.clone().into(),
        who: r.who.clone().into(),
        tone: super::tone(r.kind.tone()),
        open: r.kind == crate::view::log::RowKind::OpenFollowUp,
    }
}
