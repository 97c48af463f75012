//! Log screen glue: the open tag's entries or all of them, searched; add a note or a
//! follow-up; mark follow-ups done. Entries live in memory until `crate::journal` lands;
//! export and import wait for it too and say so.

use super::sample::{EntryKind, SampleEntry};
use super::{model, AppState, AppWindow, LogAdapter, Shared};
use crate::error::{FieldError, Result};
use slint::ComponentHandle;

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
            Ok(()) => {
                a.set_note_text("".into());
                a.set_error_text("".into());
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
        if let Ok(id) = id.parse::<u64>() {
            if let Some(e) = st.borrow_mut().log.iter_mut().find(|e| e.id == id) {
                if e.kind == EntryKind::FollowUp {
                    e.kind = EntryKind::FollowUpDone;
                }
            }
        }
        refresh(&w, &st.borrow());
    });
    let weak = window.as_weak();
    adapter.on_export_report(move |_kind| {
        if let Some(w) = weak.upgrade() {
            w.global::<LogAdapter>().set_message(
                "Export is not available yet: it arrives with the journal (store branch).".into(),
            );
        }
    });
    let weak = window.as_weak();
    adapter.on_import_bundle(move || {
        if let Some(w) = weak.upgrade() {
            w.global::<LogAdapter>().set_message(
                "Import is not available yet: it arrives with the journal (store branch).".into(),
            );
        }
    });
}

/// Add a note (or follow-up) to the open tag's log, newest first.
pub fn add_note(state: &mut AppState, text: &str, who: &str, follow_up: bool) -> Result<()> {
    let text = text.trim();
    if text.is_empty() {
        return Err(FieldError::new(
            "note",
            "is empty; type what you found or did",
        ));
    }
    if text.chars().count() > MAX_NOTE_CHARS {
        return Err(FieldError::new(
            "note",
            format!("must be {MAX_NOTE_CHARS} characters or fewer"),
        ));
    }
    let tag = state
        .ui
        .open_tag
        .clone()
        .ok_or_else(|| FieldError::new("tag", "no tag is open; open one on Tags first"))?;
    let id = state.log.iter().map(|e| e.id).max().unwrap_or(0) + 1;
    state.log.insert(
        0,
        SampleEntry {
            id,
            when: chrono::Local::now().format("%Y-%m-%d %H:%M").to_string(),
            tag,
            kind: if follow_up {
                EntryKind::FollowUp
            } else {
                EntryKind::Note
            },
            text: text.to_string(),
            who: who.trim().to_uppercase(),
        },
    );
    Ok(())
}

/// Does an entry match the search text (text, tag or initials, any case)?
fn matches(e: &SampleEntry, q: &str) -> bool {
    let q = q.trim().to_lowercase();
    q.is_empty()
        || [&e.text, &e.tag, &e.who]
            .iter()
            .any(|f| f.to_lowercase().contains(&q))
}

/// Copy the entries into the adapter.
pub fn refresh(window: &AppWindow, state: &AppState) {
    let adapter = window.global::<LogAdapter>();
    let tag = state.ui.open_tag.clone().unwrap_or_default();
    let all = state.ui.log_all || tag.is_empty();
    adapter.set_heading(
        if tag.is_empty() {
            "—".to_string()
        } else {
            tag.clone()
        }
        .into(),
    );
    adapter.set_all_tags(all);
    adapter.set_search_text(state.ui.log_search.clone().into());
    adapter.set_rows(model(
        state
            .log
            .iter()
            .filter(|e| (all || e.tag == tag) && matches(e, &state.ui.log_search))
            .map(map_entry)
            .collect(),
    ));
}

/// One entry as the Log screen shows it.
pub fn map_entry(e: &SampleEntry) -> super::LogRow {
    super::LogRow {
        id: e.id.to_string().into(),
        when: e.when.clone().into(),
        tag: e.tag.clone().into(),
        title: e.kind.title().into(),
        text: e.text.clone().into(),
        who: e.who.clone().into(),
        kind: e.kind.code(),
    }
}
