//! The loop checks in a tag's log, read for planning: the date each was made (the check's
//! own date, which may be earlier than the moment it was typed in), its stage, whether it
//! passed and was adjusted, and each point's error in % of span.
//!
//! Only the fields planning needs are read from the stored payload, so every shape of the
//! `loop-check` payload written so far reads (they all carry these fields); an entry whose
//! payload does not is skipped.

use crate::journal::{Entry, Kind};
use chrono::NaiveDate;
use serde::Deserialize;

/// One point of a recorded check.
#[derive(Debug, Clone, PartialEq, Deserialize)]
pub struct RecordedPoint {
    /// Input as % of span.
    pub percent: f64,
    /// `rising` or `falling`.
    pub direction: String,
    /// Error, % of span.
    pub error_pct: f64,
}

/// A loop check as planning reads it.
#[derive(Debug, Clone, PartialEq, Deserialize)]
pub struct RecordedCheck {
    /// The date of the check.
    pub date: NaiveDate,
    /// `as-found` or `as-left`.
    pub stage: String,
    /// Every point within tolerance.
    pub pass: bool,
    /// The device was adjusted during the visit.
    #[serde(default)]
    pub adjusted: bool,
    /// The tolerance it was judged by, ± % of span.
    pub tolerance_pct: f64,
    /// The points in test order.
    pub points: Vec<RecordedPoint>,
}

impl RecordedCheck {
    /// The check an entry records, or `None` when it is not a loop check or its payload
    /// does not say.
    pub fn of(entry: &Entry) -> Option<RecordedCheck> {
        if entry.kind != Kind::LoopCheck {
            return None;
        }
        serde_json::from_value(entry.payload.clone()?).ok()
    }

    /// An as-found check.
    pub fn is_as_found(&self) -> bool {
        self.stage == "as-found"
    }

    /// Whether this check left the loop calibrated: an as-left check, or an as-found check
    /// that passed with no adjustment (the loop was left as it was found, and found good).
    pub fn leaves_calibrated(&self) -> bool {
        self.stage == "as-left" || (self.is_as_found() && self.pass && !self.adjusted)
    }
}
