//! Notes and follow-ups: add one to a tag's log, close a follow-up.

use super::initials;
use crate::error::FieldError;
use crate::journal::{closed_follow_ups, Entry, EntryId, Kind, MAX_TEXT_CHARS};
use crate::store::{Store, StoreError};
use chrono::{DateTime, FixedOffset};
use std::fmt;

/// Longest note accepted, in characters, on every front: the log's own limit
/// ([`MAX_TEXT_CHARS`]), so a note written at the desk is never refused by the phone (or
/// by an import) and a pasted report is kept whole.
pub const MAX_NOTE_CHARS: usize = MAX_TEXT_CHARS;

/// A note (or follow-up, finding...) to add to a tag's log.
#[derive(Debug, Clone, PartialEq)]
pub struct NewNote<'a> {
    /// Tag number (as typed; matched as the register matches numbers).
    pub tag: &'a str,
    /// What was done or found.
    pub text: &'a str,
    /// Initials as typed (upper-cased when stored; see [`super::initials`]).
    pub initials: &'a str,
    /// What kind of entry: a note, a follow-up to do, a finding...
    pub kind: Kind,
    /// The entry this one corrects: its id or the first characters of it.
    pub refers_to: Option<&'a str>,
    /// Structured detail (measurements with units), kept as given.
    pub payload: Option<serde_json::Value>,
}

impl<'a> NewNote<'a> {
    /// A plain note or an open follow-up, signed with `initials`.
    pub fn new(tag: &'a str, text: &'a str, initials: &'a str, follow_up: bool) -> NewNote<'a> {
        NewNote {
            tag,
            text,
            initials,
            kind: if follow_up {
                Kind::FollowUp
            } else {
                Kind::Note
            },
            refers_to: None,
            payload: None,
        }
    }
}

/// A note saved: its id, once it is durable.
#[derive(Debug, Clone, PartialEq)]
pub struct NoteAdded {
    /// The new entry's id.
    pub id: EntryId,
    /// The tag's number as the register spells it.
    pub tag: String,
    /// The kind saved.
    pub kind: Kind,
    /// The initials as stored.
    pub initials: String,
}

impl fmt::Display for NoteAdded {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "Saved as {}.", self.id)
    }
}

/// Add a note to a tag's log. The text is trimmed and must be 1 to [`MAX_NOTE_CHARS`]
/// characters (field `note`); a `refers_to` that matches no entry is named as `refers-to`.
pub fn add_note(
    store: &mut dyn Store,
    now: DateTime<FixedOffset>,
    note: NewNote<'_>,
) -> Result<NoteAdded, StoreError> {
    let text = note.text.trim();
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
    let who = initials(note.initials)?;
    let record = store.require_tag(note.tag)?;
    let (tag_id, number) = (record.id.clone(), record.tag.number.clone());
    let mut entry = Entry::new(&tag_id, now, &who, note.kind, text)?;
    if let Some(r) = note.refers_to {
        let found = store.find_entry(r).map_err(|e| match e {
            StoreError::Input(f) => StoreError::Input(f.renamed("refers-to")),
            other => other,
        })?;
        entry.refers_to = Some(found.id.clone());
    }
    entry.payload = note.payload;
    let id = store.append(entry)?;
    Ok(NoteAdded {
        id,
        tag: number,
        kind: note.kind,
        initials: who,
    })
}

/// A follow-up closed: the id of the closing entry and of the follow-up.
#[derive(Debug, Clone, PartialEq)]
pub struct FollowUpClosed {
    /// The new entry that marks it done.
    pub id: EntryId,
    /// The follow-up that is now done.
    pub follow_up: EntryId,
}

impl fmt::Display for FollowUpClosed {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(
            f,
            "Follow-up {} marked done as {}.",
            self.follow_up, self.id
        )
    }
}

/// Mark the open follow-up `id` (or the first characters of its id) done: a new entry that
/// refers to it; nothing is rewritten. `text` says what was done (empty: "done"). A
/// follow-up some entry already closed is refused, naming the field `id`.
pub fn close_follow_up(
    store: &mut dyn Store,
    now: DateTime<FixedOffset>,
    id: &str,
    initials_typed: &str,
    text: &str,
) -> Result<FollowUpClosed, StoreError> {
    let who = initials(initials_typed)?;
    let open = store.find_entry(id)?.clone();
    if closed_follow_ups(store.entries()).contains(&open.id) {
        return Err(FieldError::new("id", format!("follow-up {} is already done", open.id)).into());
    }
    let entry = Entry::closing(&open, now, &who, text.trim())?;
    let new_id = store.append(entry)?;
    Ok(FollowUpClosed {
        id: new_id,
        follow_up: open.id,
    })
}
