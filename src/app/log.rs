//! Log screen glue: the open tag's entries or all of them, searched; add a note or a
//! follow-up; mark follow-ups done; write a handoff report; import a bundle. Every change
//! goes through the store and is durable before the screen shows it.

use super::{model, AppState, AppWindow, LogAdapter, Shared};
use crate::error::FieldError;
use crate::journal::{Entry, EntryId, Kind, Query};
use crate::report;
use crate::store::record::write_atomically;
use crate::store::{ImportReport, StoreError};
use crate::view::log::{export_file_name, list, query, Row};
use slint::ComponentHandle;
use std::path::{Path, PathBuf};

/// Longest note accepted, in characters.
pub const MAX_NOTE_CHARS: usize = 2000;

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
            Ok(id) => {
                a.set_note_text("".into());
                a.set_error_text("".into());
                a.set_message(format!("Saved as {id}.").into());
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
        let message = match export(&st.borrow(), &format, &folder) {
            Ok(path) => format!("Written to {}", path.display()),
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
                Ok(r) => import_summary(&r),
                Err(e) => format!("Nothing imported: {e}"),
            }
            .into(),
        );
        refresh(&w, &st.borrow());
        super::tags::refresh(&w, &st.borrow());
    });
}

/// Add a note (or an open follow-up) to the open tag's log; returns its id once durable.
pub fn add_note(
    state: &mut AppState,
    text: &str,
    who: &str,
    follow_up: bool,
) -> Result<EntryId, StoreError> {
    let text = text.trim();
    if text.is_empty() {
        return Err(FieldError::new("note", "is empty; type what you found or did").into());
    }
    if text.chars().count() > MAX_NOTE_CHARS {
        return Err(FieldError::new(
            "note",
            format!("must be {MAX_NOTE_CHARS} characters or fewer"),
        )
        .into());
    }
    let tag = state
        .open_tag_id()
        .ok_or_else(|| FieldError::new("tag", "no tag is open; open one on Tags first"))?;
    let kind = if follow_up {
        Kind::FollowUp
    } else {
        Kind::Note
    };
    let who = who.trim().to_uppercase();
    let entry = Entry::new(&tag, state.now(), &who, kind, text)?;
    let id = state.store.append(entry)?;
    state.ui.initials = who;
    Ok(id)
}

/// Mark the open follow-up `id` done: a new entry that refers to it (nothing is rewritten).
pub fn mark_done(state: &mut AppState, id: &str, who: &str) -> Result<EntryId, StoreError> {
    let open = state.store.find_entry(id)?.clone();
    let closed = crate::journal::closed_follow_ups(state.store.entries());
    if closed.contains(&open.id) {
        return Err(FieldError::new("id", format!("{} is already done", open.id)).into());
    }
    let entry = Entry::closing(&open, state.now(), &who.trim().to_uppercase(), "")?;
    state.store.append(entry)
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

/// Write what the Log shows ([`shown_query`]) as a handoff report in `format` (`md`,
/// `csv`, `json`) into `folder`; returns the file written. The file is written
/// crash-safely ([`write_atomically`]), so it is never half there.
pub fn export(state: &AppState, format: &str, folder: &str) -> Result<PathBuf, StoreError> {
    let folder = export_folder(state, folder)?;
    let q = shown_query(state)?;
    let now = state.now();
    let bundle = report::select(state.store.as_ref(), &q, now);
    let text = match format {
        "md" => report::markdown(&bundle),
        "csv" => report::csv(&bundle),
        "json" => report::json(&bundle),
        other => {
            return Err(FieldError::new(
                "format",
                format!("'{other}' is not a report format; use md, csv or json"),
            )
            .into())
        }
    };
    let path = folder.join(export_file_name(now, format));
    std::fs::create_dir_all(&folder)
        .and_then(|()| write_atomically(&path, text.as_bytes()))
        .map_err(|source| StoreError::Io {
            action: "write",
            path: path.clone(),
            source,
        })?;
    Ok(path)
}

/// Merge a JSON bundle from another device into the store.
pub fn import(state: &mut AppState, path: &Path) -> Result<ImportReport, StoreError> {
    if path.as_os_str().is_empty() {
        return Err(
            FieldError::new("bundle file", "is empty; type the path of a .json bundle").into(),
        );
    }
    let text = std::fs::read_to_string(path).map_err(|source| StoreError::Io {
        action: "read",
        path: path.to_path_buf(),
        source,
    })?;
    let bundle = report::parse_bundle(&text)?;
    state.store.import(&bundle)
}

/// What an import did, in one sentence or two.
pub fn import_summary(r: &ImportReport) -> String {
    let mut s = format!(
        "Imported {} tag(s) and {} entr(ies); {} entr(ies) were already here.",
        r.tags_added, r.entries_added, r.entries_already_here
    );
    for c in &r.conflicts {
        s.push_str(&format!(
            " {} differs from this register's and was kept as it is here ({}).",
            c.number, c.detail
        ));
    }
    s
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
