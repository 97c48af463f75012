//! What is due: each tag with a calibration interval, the date of the check that last left
//! it calibrated, and when the next one falls due.
//!
//! - The last calibration is the latest check date in the tag's log of an as-left check,
//!   or of an as-found check that passed with no adjustment (the loop was left as found;
//!   [`RecordedCheck::leaves_calibrated`]). A check's own date counts, not when it was
//!   typed in.
//! - Due date = that date + the interval in days (calendar days: 30 days after 31 January
//!   2026 is 2 March; 365 days after 29 February 2024 is 28 February 2025).
//! - On `today`: *overdue* when the due date is before today; *due* when it is today or
//!   within the next `within_days` days; a tag with an interval and no check on record is
//!   *never checked* and listed with the overdue ones. Archived tags are left out.

use super::history::RecordedCheck;
use crate::error::{FieldError, Result};
use crate::journal::{Entry, TagId};
use crate::tag::{Tag, MAX_INTERVAL_DAYS};
use chrono::NaiveDate;
use serde::Serialize;
use std::collections::HashMap;

/// Where a tag stands.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum DueStatus {
    /// Its due date has passed.
    Overdue,
    /// It has an interval but no check that left it calibrated.
    NeverChecked,
    /// Due today or within the window asked for.
    Due,
    /// Not due within the window.
    NotDue,
}

/// One tag's due date.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct DueItem {
    /// The tag's id.
    pub tag_id: TagId,
    /// The tag's number.
    pub tag: String,
    /// Its calibration interval, days.
    pub interval_days: u32,
    /// The date of the check that last left it calibrated.
    pub last_calibrated: Option<NaiveDate>,
    /// When the next check falls due.
    pub due: Option<NaiveDate>,
    /// Days from today to the due date (negative: overdue by that many).
    pub days_left: Option<i64>,
    /// Where it stands.
    pub status: DueStatus,
}

/// Read a look-ahead window as typed: `7d`, `7 days`, `2w`, `2 weeks`, or a plain number
/// of days; 0 to ten years. (`journal::parse_period` reads a moment back in time for a
/// log's *since*; a window ahead is a length, so it is read here.)
pub fn parse_within(text: &str) -> Result<u32> {
    let t = text.trim().to_lowercase();
    let bad = || {
        FieldError::new(
            "within",
            format!(
                "'{}' is not a window; type days or weeks ahead: 7d, 30 days, 2w",
                text.trim()
            ),
        )
    };
    let (number, per) = [
        ("weeks", 7.0),
        ("week", 7.0),
        ("w", 7.0),
        ("days", 1.0),
        ("day", 1.0),
        ("d", 1.0),
    ]
    .iter()
    .find_map(|(suffix, per)| t.strip_suffix(suffix).map(|n| (n.trim(), *per)))
    .unwrap_or((t.as_str(), 1.0));
    if number.is_empty() {
        return Err(bad());
    }
    let n = crate::number::parse_number("within", number).map_err(|_| bad())?;
    let days = n * per;
    if !(0.0..=f64::from(MAX_INTERVAL_DAYS)).contains(&days) || days.fract() != 0.0 {
        return Err(FieldError::new(
            "within",
            format!(
                "{} is out of range; type whole days from 0 to {MAX_INTERVAL_DAYS}",
                text.trim()
            ),
        ));
    }
    Ok(days as u32)
}

/// The date of the check that last left the tag calibrated, from its entries.
pub fn last_calibrated<'a>(entries: impl IntoIterator<Item = &'a Entry>) -> Option<NaiveDate> {
    entries
        .into_iter()
        .filter_map(RecordedCheck::of)
        .filter(RecordedCheck::leaves_calibrated)
        .map(|c| c.date)
        .max()
}

/// One tag's due date on `today`, with a window of `within_days`.
pub fn due_item(
    tag_id: &TagId,
    tag: &Tag,
    interval_days: u32,
    last: Option<NaiveDate>,
    today: NaiveDate,
    within_days: u32,
) -> DueItem {
    let due = last.and_then(|d| d.checked_add_days(chrono::Days::new(u64::from(interval_days))));
    let days_left = due.map(|d| (d - today).num_days());
    let status = match days_left {
        None => DueStatus::NeverChecked,
        Some(n) if n < 0 => DueStatus::Overdue,
        Some(n) if n <= i64::from(within_days) => DueStatus::Due,
        Some(_) => DueStatus::NotDue,
    };
    DueItem {
        tag_id: tag_id.clone(),
        tag: tag.number.clone(),
        interval_days,
        last_calibrated: last,
        due,
        days_left,
        status,
    }
}

/// Every tag with an interval (archived ones left out) with its due date on `today`,
/// most urgent first: overdue (longest first), never checked, then by due date. With
/// `all` false, tags not due within the window are left out.
pub fn due_list<'a>(
    tags: impl IntoIterator<Item = (&'a TagId, &'a Tag)>,
    entries: &[Entry],
    today: NaiveDate,
    within_days: u32,
    all: bool,
) -> Vec<DueItem> {
    let mut by_tag: HashMap<&TagId, Vec<&Entry>> = HashMap::new();
    for e in entries {
        by_tag.entry(&e.tag).or_default().push(e);
    }
    let mut items: Vec<DueItem> = tags
        .into_iter()
        .filter(|(_, t)| !t.archived)
        .filter_map(|(id, t)| {
            let interval = t.calibration_interval_days?;
            let last = last_calibrated(by_tag.get(id).into_iter().flatten().copied());
            Some(due_item(id, t, interval, last, today, within_days))
        })
        .filter(|i| all || i.status != DueStatus::NotDue)
        .collect();
    items.sort_by(|a, b| {
        a.status
            .cmp(&b.status)
            .then(a.due.cmp(&b.due))
            .then(a.tag.cmp(&b.tag))
    });
    items
}
