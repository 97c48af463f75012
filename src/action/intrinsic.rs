//! Intrinsic safety on a tag: store the loop's IS circuit in the tag's definition, and save
//! an IS check to its log as an entry of its own kind (`is-check`).
//!
//! # Payload, version 1
//!
//! - `payload_version`: `1` ([`PAYLOAD_VERSION`]);
//! - `circuit`: the [`Circuit`] checked, as a tag stores it (SI units: volts, mA, watts,
//!   farads, henries, henries per ohm, metres);
//! - `verdict`: the [`Verdict`] as serialized (`ok`, `halved`, totals, allowed Co and Lo,
//!   `max_cable`, every check with its margin, what was not checked);
//! - `note`: the technician's note, when one was typed.
//!
//! The entry's author is the initials of who checked; its text is the one wording of
//! `crate::view::wording::intrinsic::log_text`.

use super::initials;
use crate::error::FieldError;
use crate::intrinsic::{self, Circuit, Verdict};
use crate::journal::{Entry, EntryId, Kind};
use crate::store::{Store, StoreError};
use crate::view::wording::intrinsic as words;
use chrono::{DateTime, FixedOffset};
use serde::Deserialize;
use std::fmt;

/// The version of the IS check payload written now.
pub const PAYLOAD_VERSION: u64 = 1;

/// The IS circuit stored on a tag (or removed).
#[derive(Debug, Clone, PartialEq)]
pub struct CircuitSaved {
    /// The tag's number.
    pub tag: String,
    /// Whether the tag now has a circuit (false: removed).
    pub stored: bool,
    /// Whether anything changed.
    pub changed: bool,
}

impl fmt::Display for CircuitSaved {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match (self.changed, self.stored) {
            (false, _) => write!(f, "{}: IS data unchanged.", self.tag),
            (true, true) => write!(f, "Saved the IS data of {}.", self.tag),
            (true, false) => write!(f, "Removed the IS data of {}.", self.tag),
        }
    }
}

/// Store `circuit` as the IS circuit of the tag `number` (`None` removes it). The circuit
/// is checked for bad input first; a circuit that fails the entity checks is stored all
/// the same (it is what is installed; the check says what is wrong).
pub fn set_circuit(
    store: &mut dyn Store,
    number: &str,
    circuit: Option<Circuit>,
) -> Result<CircuitSaved, StoreError> {
    if let Some(c) = &circuit {
        c.validate()?;
    }
    let record = store.require_tag(number)?.clone();
    let mut tag = record.tag.clone();
    tag.intrinsic = circuit;
    let changed = tag != record.tag;
    let stored = tag.intrinsic.is_some();
    if changed {
        store.update_tag(&record.id, tag)?;
    }
    Ok(CircuitSaved {
        tag: record.tag.number,
        stored,
        changed,
    })
}

/// An IS check to save.
#[derive(Debug, Clone)]
pub struct NewIsCheck<'a> {
    /// Tag number.
    pub tag: &'a str,
    /// Initials of who checked (upper-cased when stored).
    pub initials: &'a str,
    /// The circuit checked (the tag's, or the tag's with a temporary device added).
    pub circuit: &'a Circuit,
    /// A note (may be empty).
    pub note: &'a str,
}

/// An IS check saved.
#[derive(Debug, Clone, PartialEq)]
pub struct IsCheckSaved {
    /// The new entry's id.
    pub id: EntryId,
    /// The tag's number.
    pub tag: String,
    /// Whether every deciding check passed.
    pub ok: bool,
    /// The verdict saved.
    pub verdict: Verdict,
}

impl fmt::Display for IsCheckSaved {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(
            f,
            "Saved the IS check of {} ({}) as {}.",
            self.tag,
            words::mark(self.ok),
            self.id
        )
    }
}

/// The payload of an IS check entry (version [`PAYLOAD_VERSION`]; see the module).
pub fn payload(
    circuit: &Circuit,
    verdict: &Verdict,
    note: &str,
) -> Result<serde_json::Value, FieldError> {
    let cannot =
        |e: serde_json::Error| FieldError::new("is-check", format!("cannot be written: {e}"));
    let mut value = serde_json::json!({
        "payload_version": PAYLOAD_VERSION,
        "circuit": serde_json::to_value(circuit).map_err(cannot)?,
        "verdict": serde_json::to_value(verdict).map_err(cannot)?,
    });
    if !note.trim().is_empty() {
        value["note"] = serde_json::json!(note.trim());
    }
    Ok(value)
}

/// Check `circuit` and save the result to the tag's log; returns the entry once durable.
pub fn save_is_check(
    store: &mut dyn Store,
    now: DateTime<FixedOffset>,
    check: NewIsCheck<'_>,
) -> Result<IsCheckSaved, StoreError> {
    let who = initials(check.initials)?;
    if check.note.chars().count() > crate::journal::MAX_TEXT_CHARS {
        return Err(FieldError::new(
            "note",
            format!(
                "must be {} characters or fewer",
                crate::journal::MAX_TEXT_CHARS
            ),
        )
        .into());
    }
    let verdict = intrinsic::check(check.circuit)?;
    let record = store.require_tag(check.tag)?;
    let (tag_id, number) = (record.id.clone(), record.tag.number.clone());
    let mut text = words::log_text(check.circuit, &verdict);
    if !check.note.trim().is_empty() {
        text.push_str(&format!(" Note: {}", check.note.trim()));
    }
    let mut entry = Entry::new(&tag_id, now, &who, Kind::IsCheck, &text)?;
    entry.payload = Some(payload(check.circuit, &verdict, check.note)?);
    let id = store.append(entry)?;
    Ok(IsCheckSaved {
        id,
        tag: number,
        ok: verdict.ok,
        verdict,
    })
}

#[derive(Deserialize)]
struct Stored {
    circuit: Circuit,
    verdict: Verdict,
}

/// The circuit and verdict an IS check entry saved (`None` for another kind or a payload
/// that does not read).
pub fn record_of(e: &Entry) -> Option<(Circuit, Verdict)> {
    if e.kind != Kind::IsCheck {
        return None;
    }
    let s: Stored = serde_json::from_value(e.payload.clone()?).ok()?;
    Some((s.circuit, s.verdict))
}

/// Whether an IS check entry passed, read from its payload (`None` when it does not say).
pub fn ok_of(e: &Entry) -> Option<bool> {
    e.payload.as_ref()?.get("verdict")?.get("ok")?.as_bool()
}
