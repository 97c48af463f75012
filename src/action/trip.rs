//! Save a trip or alarm test to a tag's log, as an entry of its own kind (`trip-test`).
//!
//! # Payload, version 1
//!
//! The [`TripResult`] as serialized (setpoint, unit, direction, tolerance, span, the
//! current for the setpoint, each run with its trip and reset values, errors and verdict,
//! the worst trip error, the largest deadband, repeatability, `pass`, note), plus
//! `payload_version`: `1` ([`PAYLOAD_VERSION`]).
//!
//! The entry's author is the initials of who tested; its text is the one wording of
//! `crate::view::wording::trip::log_text`.

use super::initials;
use crate::calibration::trip::TripResult;
use crate::error::FieldError;
use crate::journal::{Entry, EntryId, Kind};
use crate::store::{Store, StoreError};
use chrono::{DateTime, FixedOffset};
use std::fmt;

/// The version of the trip-test payload written now.
pub const PAYLOAD_VERSION: u64 = 1;

/// A trip test to save.
#[derive(Debug, Clone)]
pub struct NewTrip<'a> {
    /// Tag number.
    pub tag: &'a str,
    /// Initials as typed (upper-cased when stored).
    pub initials: &'a str,
    /// The judged test.
    pub result: &'a TripResult,
}

/// A trip test saved.
#[derive(Debug, Clone, PartialEq)]
pub struct TripSaved {
    /// The new entry's id.
    pub id: EntryId,
    /// The tag's number.
    pub tag: String,
    /// Whether every run was within tolerance.
    pub pass: bool,
}

impl fmt::Display for TripSaved {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "Saved the trip test of {} as {}.", self.tag, self.id)
    }
}

/// The payload of a trip-test entry (version [`PAYLOAD_VERSION`]; see the module).
pub fn payload(result: &TripResult) -> Result<serde_json::Value, FieldError> {
    let mut value = serde_json::to_value(result)
        .map_err(|e| FieldError::new("trip test", format!("cannot be written: {e}")))?;
    value["payload_version"] = serde_json::json!(PAYLOAD_VERSION);
    Ok(value)
}

/// The trip test a stored payload holds (any version so far), or `None` when it is not
/// one.
pub fn result_of(payload: &serde_json::Value) -> Option<TripResult> {
    serde_json::from_value(payload.clone()).ok()
}

/// Save a judged trip test to the tag's log; returns the entry id once durable.
pub fn save_trip(
    store: &mut dyn Store,
    now: DateTime<FixedOffset>,
    trip: NewTrip<'_>,
) -> Result<TripSaved, StoreError> {
    let who = initials(trip.initials)?;
    let record = store.require_tag(trip.tag)?;
    let (tag_id, number) = (record.id.clone(), record.tag.number.clone());
    let mut result = trip.result.clone();
    if result.tag.is_empty() {
        result.tag = number.clone();
    }
    let mut entry = Entry::new(
        &tag_id,
        now,
        &who,
        Kind::TripTest,
        &crate::view::wording::trip::log_text(&result),
    )?;
    entry.payload = Some(payload(&result)?);
    let id = store.append(entry)?;
    Ok(TripSaved {
        id,
        tag: number,
        pass: result.pass,
    })
}
