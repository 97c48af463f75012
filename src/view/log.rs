//! The Log screen's view model: entries as a technician reads them (newest first, with the
//! tag's current number, the local time they were written, and what sort of record each
//! is), a search across the log, and the file name a handoff report is written to.

use crate::journal::{self, Entry, FollowUpStatus, Kind, Query, TagId};
use crate::store::Store;
use crate::view::Tone;
use chrono::{DateTime, FixedOffset};
use std::collections::HashSet;

/// Most entries the screen lists at once; the count line says when there are more.
pub const MAX_ROWS: usize = 200;

/// What an entry is, as the list marks it (the Log screen's colour key).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum RowKind {
    /// A note or a finding.
    Note,
    /// A follow-up still to do.
    OpenFollowUp,
    /// A follow-up that is done, or the entry that closed one.
    DoneFollowUp,
    /// A loop check that passed.
    CheckPassed,
    /// A loop check that failed (or whose result is not recorded).
    CheckFailed,
    /// A fault-finding session or a finding.
    Fault,
}

impl RowKind {
    /// How the kind stands, for colour (always shown with the title in words).
    pub fn tone(self) -> Tone {
        match self {
            RowKind::Note | RowKind::DoneFollowUp => Tone::Neutral,
            RowKind::OpenFollowUp => Tone::Caution,
            RowKind::CheckPassed => Tone::Good,
            RowKind::CheckFailed => Tone::Bad,
            RowKind::Fault => Tone::Outside,
        }
    }
}

/// One entry as listed.
#[derive(Debug, Clone, PartialEq)]
pub struct Row {
    /// The entry id (what "mark done" and references use).
    pub id: String,
    /// When it was written, local time at the device that wrote it: `2026-11-30 07:42`.
    pub when: String,
    /// The tag's current number (renames follow).
    pub tag: String,
    /// `Note`, `Follow-up (open)`, `Check passed` …
    pub title: String,
    /// The technician's text.
    pub text: String,
    /// Initials.
    pub who: String,
    /// What it is.
    pub kind: RowKind,
}

/// The list and its count line.
#[derive(Debug, Clone, PartialEq)]
pub struct LogList {
    /// Entries, newest first, at most [`MAX_ROWS`].
    pub rows: Vec<Row>,
    /// `12 entries`, `200 newest of 4 381 entries`, `No entries match "pump"`.
    pub count_text: String,
}

/// Did a loop-check entry pass? Read from its stored result: `pass` (a check result) or
/// `verdict` (`pass` / `fail`, as a hand-written record may put it). `None` when the
/// entry does not say.
fn check_passed(e: &Entry) -> Option<bool> {
    let p = e.payload.as_ref()?;
    if let Some(pass) = p.get("pass").and_then(serde_json::Value::as_bool) {
        return Some(pass);
    }
    match p.get("verdict").and_then(serde_json::Value::as_str) {
        Some(v) if v.eq_ignore_ascii_case("pass") => Some(true),
        Some(v) if v.eq_ignore_ascii_case("fail") => Some(false),
        _ => None,
    }
}

/// Did an IS check entry pass? Read from its stored verdict (`verdict.ok`, payload
/// version 1 of `crate::action::intrinsic`). `None` when the entry does not say.
fn is_check_ok(e: &Entry) -> Option<bool> {
    e.payload.as_ref()?.get("verdict")?.get("ok")?.as_bool()
}

/// Did a trip test or a stroke check pass? Read from its stored verdict (`pass`, payload
/// version 1 of `crate::action::trip` and of `crate::action::stroke`). `None` when the
/// entry does not say.
fn payload_passed(e: &Entry) -> Option<bool> {
    e.payload.as_ref()?.get("pass")?.as_bool()
}

/// What an entry is, given the ids of the follow-ups that are closed.
pub fn row_kind(e: &Entry, closed: &HashSet<&journal::EntryId>) -> RowKind {
    match e.kind {
        Kind::Note => RowKind::Note,
        Kind::Finding | Kind::FaultFinding => RowKind::Fault,
        Kind::LoopCheck => match check_passed(e) {
            Some(true) => RowKind::CheckPassed,
            _ => RowKind::CheckFailed,
        },
        Kind::FollowUp => {
            if e.status == Some(FollowUpStatus::Done) || closed.contains(&e.id) {
                RowKind::DoneFollowUp
            } else {
                RowKind::OpenFollowUp
            }
        }
        Kind::IsCheck => match is_check_ok(e) {
            Some(true) => RowKind::CheckPassed,
            _ => RowKind::CheckFailed,
        },
        Kind::TripTest | Kind::StrokeCheck => match payload_passed(e) {
            Some(true) => RowKind::CheckPassed,
            _ => RowKind::CheckFailed,
        },
    }
}

/// The title shown on an entry.
pub fn title(e: &Entry, kind: RowKind) -> String {
    match (e.kind, kind) {
        (Kind::Note, _) => "Note".to_string(),
        (Kind::Finding, _) => "Finding".to_string(),
        (Kind::FaultFinding, _) => "Fault-finding".to_string(),
        (Kind::LoopCheck, RowKind::CheckPassed) => "Check passed".to_string(),
        (Kind::LoopCheck, _) => match check_passed(e) {
            Some(false) => "Check failed".to_string(),
            _ => "Loop check".to_string(),
        },
        (Kind::FollowUp, _) if e.status == Some(FollowUpStatus::Done) => {
            "Follow-up done".to_string()
        }
        (Kind::FollowUp, RowKind::DoneFollowUp) => "Follow-up (done)".to_string(),
        (Kind::FollowUp, _) => "Follow-up (open)".to_string(),
        (Kind::IsCheck, _) => {
            crate::view::wording::intrinsic::log_title(is_check_ok(e)).to_string()
        }
        (Kind::TripTest, _) => crate::view::wording::trip::log_title(payload_passed(e)).to_string(),
        (Kind::StrokeCheck, _) => {
            crate::view::wording::stroke::log_title(payload_passed(e)).to_string()
        }
    }
}

/// One entry as listed.
pub fn row(store: &dyn Store, e: &Entry, closed: &HashSet<&journal::EntryId>) -> Row {
    let kind = row_kind(e, closed);
    Row {
        id: e.id.to_string(),
        when: e.time.format("%Y-%m-%d %H:%M").to_string(),
        tag: store.tag_number(&e.tag),
        title: title(e, kind),
        text: e.text.clone(),
        who: e.author.clone(),
        kind,
    }
}

/// The query behind the screen: one tag (or all), and the search text.
pub fn query(tag: Option<TagId>, search: &str) -> Query {
    let text = search.trim();
    Query {
        text: (!text.is_empty()).then(|| text.to_string()),
        tags: tag.into_iter().collect(),
        ..Query::default()
    }
}

/// The entries matching `query`, newest first, at most [`MAX_ROWS`], with a count line.
pub fn list(store: &dyn Store, query: &Query) -> LogList {
    let found = store.search(query);
    let closed = store.closed_follow_ups();
    let total = found.len();
    let rows: Vec<Row> = found
        .iter()
        .rev()
        .take(MAX_ROWS)
        .map(|e| row(store, e, &closed))
        .collect();
    let noun = |n: usize| if n == 1 { "entry" } else { "entries" };
    let count_text = match (&query.text, total) {
        (Some(t), 0) => format!("No entries match \u{201c}{t}\u{201d}"),
        (None, 0) => "No entries yet".to_string(),
        (_, n) if n > rows.len() => {
            format!("{} newest of {n} {}", rows.len(), noun(n))
        }
        (_, n) => format!("{n} {}", noun(n)),
    };
    LogList { rows, count_text }
}

/// The file a handoff report made at `now` is written to: `loopside-handoff-2026-12-01-1630.md`.
/// `format` is `md`, `csv` or `json`.
pub fn export_file_name(now: DateTime<FixedOffset>, format: &str) -> String {
    format!("loopside-handoff-{}.{format}", now.format("%Y-%m-%d-%H%M"))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::store::MemoryStore;
    use chrono::TimeZone;

    fn demo() -> MemoryStore {
        let mut store = MemoryStore::new();
        let now = FixedOffset::east_opt(3600)
            .unwrap()
            .with_ymd_and_hms(2026, 12, 1, 16, 30, 0)
            .unwrap();
        crate::demo::fill(&mut store, now).unwrap();
        store
    }

    #[test]
    fn the_whole_log_newest_first() {
        let store = demo();
        let list = list(&store, &Query::default());
        assert_eq!(list.rows.len(), store.entries().len());
        assert_eq!(
            list.count_text,
            format!("{} entries", store.entries().len())
        );
        assert!(list.rows.windows(2).all(|w| w[0].when >= w[1].when));
    }

    #[test]
    fn one_tag_and_a_search() {
        let store = demo();
        let pt = store.tag("PT-204").unwrap().id.clone();
        let mine = list(&store, &query(Some(pt), ""));
        assert!(!mine.rows.is_empty());
        assert!(mine.rows.iter().all(|r| r.tag == "PT-204"));
        // The demo's PT-204 as-found check failed; its row says so.
        assert!(mine
            .rows
            .iter()
            .any(|r| r.kind == RowKind::CheckFailed && r.title == "Check failed"));
        let none = list(&store, &query(None, "no such words here"));
        assert!(none.rows.is_empty());
        assert!(none.count_text.starts_with("No entries match"));
    }

    #[test]
    fn a_closed_follow_up_reads_done() {
        let mut store = demo();
        let tag = store.tag("LT-101").unwrap().id.clone();
        let at = FixedOffset::east_opt(0)
            .unwrap()
            .with_ymd_and_hms(2026, 12, 1, 10, 0, 0)
            .unwrap();
        let open = Entry::new(&tag, at, "CD", Kind::FollowUp, "Replace gland").unwrap();
        let id = store.append(open.clone()).unwrap();
        let l = list(&store, &query(Some(tag.clone()), "gland"));
        assert_eq!(l.rows[0].kind, RowKind::OpenFollowUp);
        assert_eq!(l.rows[0].title, "Follow-up (open)");
        let done = Entry::closing(&open, at + chrono::Duration::minutes(5), "CD", "").unwrap();
        store.append(done).unwrap();
        let l = list(&store, &query(Some(tag), ""));
        let first = l.rows.iter().find(|r| r.id == id.to_string()).unwrap();
        assert_eq!(first.kind, RowKind::DoneFollowUp);
        assert_eq!(l.rows[0].title, "Follow-up done");
    }

    #[test]
    fn report_file_names_sort_by_time() {
        let at = FixedOffset::east_opt(3600)
            .unwrap()
            .with_ymd_and_hms(2026, 12, 1, 16, 30, 0)
            .unwrap();
        assert_eq!(
            export_file_name(at, "csv"),
            "loopside-handoff-2026-12-01-1630.csv"
        );
    }
}
