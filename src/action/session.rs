//! Save a fault-finding session to a tag's log, and read one back.
//!
//! The payload of the `fault-finding` kind is the [`Session`] as serialized, with
//! `payload_version` ([`PAYLOAD_VERSION`]); the text is [`crate::view::wording::fault::log_text`],
//! which keeps the technician's own conclusion.
//!
//! Versions:
//! - **3** (written now): each finding is `step`, `code` and `detail` — no words. Its words
//!   are written when it is shown, by [`crate::view::wording::finding::text`], so every
//!   front words it alike and a correction to the words reaches old records too.
//! - **2**: the same fields, each finding with its words as `text` too.
//! - **1** (no `payload_version`): as version 2.
//!
//! A version 1 or 2 finding is read with its words kept aside: it is worded from its code
//! and detail when this loopside knows the code (and the detail holds what the words
//! need), else its stored words are shown ([`findings_of`]).

use super::initials;
use crate::diagnose::Session;
use crate::error::FieldError;
use crate::journal::{Entry, EntryId, Kind};
use crate::store::{Store, StoreError};
use chrono::{DateTime, FixedOffset};
use std::fmt;

/// The version of the fault-finding payload written now (see the module for the older
/// ones; records without the key are version 1).
pub const PAYLOAD_VERSION: u64 = 3;

/// A session saved.
#[derive(Debug, Clone, PartialEq)]
pub struct SessionSaved {
    /// The new entry's id.
    pub id: EntryId,
    /// The tag's number.
    pub tag: String,
    /// The initials as stored.
    pub initials: String,
}

impl fmt::Display for SessionSaved {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "Saved to the log as {}.", self.id)
    }
}

/// Save `session` (concluded or not; with the technician's conclusion and the
/// before-you-leave list as recorded) to its tag's log, signed with `initials`.
pub fn save_session(
    store: &mut dyn Store,
    now: DateTime<FixedOffset>,
    session: &Session,
    initials_typed: &str,
) -> Result<SessionSaved, StoreError> {
    let who = initials(initials_typed)?;
    let record = store
        .tag(&session.tag)
        .ok_or_else(|| FieldError::new("tag", format!("{} is not in the register", session.tag)))?;
    let (tag_id, number) = (record.id.clone(), record.tag.number.clone());
    let mut entry = Entry::new(
        &tag_id,
        now,
        &who,
        Kind::FaultFinding,
        &crate::view::wording::fault::log_text(session),
    )?;
    entry.payload = Some(payload(session)?);
    let id = store.append(entry)?;
    Ok(SessionSaved {
        id,
        tag: number,
        initials: who,
    })
}

/// The payload of a fault-finding entry (version [`PAYLOAD_VERSION`]): the session with
/// its findings as code and detail.
pub fn payload(session: &Session) -> Result<serde_json::Value, FieldError> {
    let mut payload = serde_json::to_value(session)
        .map_err(|e| FieldError::new("session", format!("cannot be written: {e}")))?;
    payload["payload_version"] = serde_json::json!(PAYLOAD_VERSION);
    Ok(payload)
}

/// The session a fault-finding payload of any version holds; `None` when it holds none (a
/// hand-written record).
pub fn session_of(payload: &serde_json::Value) -> Option<Session> {
    serde_json::from_value(payload.clone()).ok()
}

/// The findings of a fault-finding payload of any version, each as `(step, words)`: worded
/// from its code and detail where this loopside can, else the words the record kept.
pub fn findings_of(payload: &serde_json::Value) -> Vec<(String, String)> {
    session_of(payload)
        .map(|s| {
            s.findings
                .iter()
                .map(|f| (f.step.clone(), crate::view::wording::finding::text(f)))
                .collect()
        })
        .unwrap_or_default()
}
