//! Save a fault-finding session to a tag's log.
//!
//! The payload of the `fault-finding` kind is the [`Session`] as serialized, with
//! `payload_version` ([`PAYLOAD_VERSION`]); the text is [`crate::view::wording::fault::log_text`],
//! which keeps the technician's own conclusion.

use super::initials;
use crate::diagnose::Session;
use crate::error::FieldError;
use crate::journal::{Entry, EntryId, Kind};
use crate::store::{Store, StoreError};
use chrono::{DateTime, FixedOffset};
use std::fmt;

/// The version of the fault-finding payload written now (records without the key are
/// version 1, the same fields).
pub const PAYLOAD_VERSION: u64 = 2;

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
    let mut payload = serde_json::to_value(session)
        .map_err(|e| FieldError::new("session", format!("cannot be written: {e}")))?;
    payload["payload_version"] = serde_json::json!(PAYLOAD_VERSION);
    entry.payload = Some(payload);
    let id = store.append(entry)?;
    Ok(SessionSaved {
        id,
        tag: number,
        initials: who,
    })
}
