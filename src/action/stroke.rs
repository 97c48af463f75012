//! Save a valve's stroke check to a tag's log, as an entry of its own kind
//! (`stroke-check`), with the same reference and sign-off fields as a loop check.
//!
//! # Payload, version 1
//!
//! A [`StrokeRecord`] (in [`crate::stroke`]) as serialized: the judged [`StrokeResult`] (points, `max_error_pct`,
//! `pass`, the split-range part, action and fail position as recorded) flattened, plus
//! `payload_version` (`1`, [`PAYLOAD_VERSION`]), `date`, `stage` (`as-found`/`as-left`),
//! `read_at` (`valve` or `feedback`), `reference` (the check's reference instrument
//! shape), `note` and `before_leaving` (the before-you-leave list).

use super::initials;
use crate::error::FieldError;
use crate::journal::{Entry, EntryId, Kind};
use crate::store::{Store, StoreError};
use crate::stroke::StrokeRecord;
use chrono::{DateTime, FixedOffset};
use std::fmt;

/// The version of the stroke-check payload written now.
pub const PAYLOAD_VERSION: u64 = 1;

/// A stroke check to save.
#[derive(Debug, Clone)]
pub struct NewStroke<'a> {
    /// Tag number.
    pub tag: &'a str,
    /// Initials as typed (upper-cased when stored).
    pub initials: &'a str,
    /// The record.
    pub record: &'a StrokeRecord,
}

/// A stroke check saved.
#[derive(Debug, Clone, PartialEq)]
pub struct StrokeSaved {
    /// The new entry's id.
    pub id: EntryId,
    /// The tag's number.
    pub tag: String,
    /// Whether every point was within tolerance.
    pub pass: bool,
}

impl fmt::Display for StrokeSaved {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "Saved the stroke check as {}.", self.id)
    }
}

/// The payload of a stroke-check entry (version [`PAYLOAD_VERSION`]).
pub fn payload(record: &StrokeRecord) -> Result<serde_json::Value, FieldError> {
    let mut value = serde_json::to_value(record)
        .map_err(|e| FieldError::new("stroke check", format!("cannot be written: {e}")))?;
    value["payload_version"] = serde_json::json!(PAYLOAD_VERSION);
    Ok(value)
}

/// Read a stroke-check entry's payload back (`None` for another kind or a damaged one).
pub fn record_of(e: &Entry) -> Option<StrokeRecord> {
    if e.kind != Kind::StrokeCheck {
        return None;
    }
    serde_json::from_value(e.payload.clone()?).ok()
}

/// Save a judged stroke check to the tag's log; returns the entry id once durable.
pub fn save_stroke(
    store: &mut dyn Store,
    now: DateTime<FixedOffset>,
    stroke: NewStroke<'_>,
) -> Result<StrokeSaved, StoreError> {
    let who = initials(stroke.initials)?;
    let record = store.require_tag(stroke.tag)?;
    let (tag_id, number) = (record.id.clone(), record.tag.number.clone());
    let mut entry = Entry::new(
        &tag_id,
        now,
        &who,
        Kind::StrokeCheck,
        &crate::view::wording::stroke::log_text(stroke.record),
    )?;
    entry.payload = Some(payload(stroke.record)?);
    let id = store.append(entry)?;
    Ok(StrokeSaved {
        id,
        tag: number,
        pass: stroke.record.result.pass,
    })
}
