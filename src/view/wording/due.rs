//! The words of what is due: one line per tag, and the status in words. The dates and
//! counts come from [`crate::calibration::due`].

use crate::calibration::due::{DueItem, DueStatus};

/// The status in words.
pub fn status(s: DueStatus) -> &'static str {
    match s {
        DueStatus::Overdue => "OVERDUE",
        DueStatus::NeverChecked => "never checked",
        DueStatus::Due => "due",
        DueStatus::NotDue => "not due",
    }
}

/// Days in words: `3 days`, `1 day`.
fn days(n: i64) -> String {
    if n.abs() == 1 {
        format!("{n} day")
    } else {
        format!("{n} days")
    }
}

/// One line: `PT-204  OVERDUE by 3 days (due 2026-11-28; last calibrated 2025-11-28, every 365 days)`.
pub fn line(i: &DueItem) -> String {
    let when = match (i.due, i.days_left) {
        (Some(due), Some(n)) if n < 0 => format!("{} by {} (due {due}", status(i.status), days(-n)),
        (Some(due), Some(0)) => format!("{} today (on {due}", status(i.status)),
        (Some(due), Some(n)) => format!("{} in {} (on {due}", status(i.status), days(n)),
        _ => format!(
            "{} (no check on record that left it calibrated",
            status(i.status)
        ),
    };
    let last = match i.last_calibrated {
        Some(d) => format!("; last calibrated {d}"),
        None => String::new(),
    };
    format!(
        "{}  {when}{last}; every {})",
        i.tag,
        days(i64::from(i.interval_days))
    )
}

/// The heading of the list: `Due on 2026-12-01 or within 7 days:`.
pub fn heading(today: chrono::NaiveDate, within_days: u32) -> String {
    format!(
        "Overdue on {today}, or due within {}:",
        days(i64::from(within_days))
    )
}

/// What is said when nothing is due.
pub fn nothing_due(within_days: u32) -> String {
    format!(
        "Nothing overdue or due within {}; tags without a calibration interval are not listed (set one with `tag edit TAG --interval DAYS`).",
        days(i64::from(within_days))
    )
}
