//! The field log: what a technician writes down about a tag, and how it is found again.
//!
//! Every finding, loop check, fault-finding session, follow-up or plain note is an
//! [`Entry`] attached to one tag. Entries are append-only: a correction is a new entry
//! whose `refers_to` names the old one, and "mark a follow-up done" is a new entry too
//! (a follow-up entry with status [`FollowUpStatus::Done`] referring to the open one).
//! Nothing is ever rewritten in place, so the log is also the audit trail.
//!
//! Entries point at a tag by its stable [`TagId`], not by its number, so a rename of
//! the tag carries its whole history with it.
//!
//! [`search`] is a pure function over a slice of entries; the store calls it, and so can
//! tests and the UI with entries of their own.

use crate::error::{FieldError, Result};
use chrono::{DateTime, Datelike, FixedOffset, TimeZone, Utc};
use serde::{Deserialize, Serialize};
use std::collections::HashSet;
use std::fmt;
use std::hash::{BuildHasher, Hasher};
use std::sync::atomic::{AtomicU64, Ordering};

/// Longest entry text accepted, in characters (a long fault-finding write-up fits).
pub const MAX_TEXT_CHARS: usize = 20_000;
/// Longest author field accepted, in characters: initials, not names.
pub const MAX_AUTHOR_CHARS: usize = 8;

/// A log entry's identity: time-sortable and unique across devices.
///
/// The text is 12 hex digits of milliseconds since 1970 (UTC), a dash, and 16 hex digits
/// of per-process random bits mixed with a counter, e.g. `019a6f3c2b10-8c41d7e2a9f05b36`.
/// Ids made on one device sort by creation time; two devices never make the same id in
/// practice (64 random bits per millisecond).
#[derive(Debug, Clone, PartialEq, Eq, Hash, PartialOrd, Ord, Serialize, Deserialize)]
#[serde(transparent)]
pub struct EntryId(pub String);

/// A tag's identity in the register, kept when the tag number changes (same form as an
/// [`EntryId`]). Log entries refer to tags by this id.
#[derive(Debug, Clone, PartialEq, Eq, Hash, PartialOrd, Ord, Serialize, Deserialize)]
#[serde(transparent)]
pub struct TagId(pub String);

static COUNTER: AtomicU64 = AtomicU64::new(0);

/// A new time-sortable unique id for `now`.
fn new_id(now: DateTime<Utc>) -> String {
    let millis = now.timestamp_millis().max(0) as u64 & 0xffff_ffff_ffff;
    // RandomState is seeded from the operating system's random source once per thread
    // and perturbed per instance; mixing in a counter and the clock makes every id in a
    // process distinct even within one millisecond.
    let mut h = std::collections::hash_map::RandomState::new().build_hasher();
    h.write_u64(COUNTER.fetch_add(1, Ordering::Relaxed));
    h.write_i64(now.timestamp_nanos_opt().unwrap_or_default());
    h.write_u32(std::process::id());
    format!("{millis:012x}-{:016x}", h.finish())
}

impl EntryId {
    /// A fresh id for an entry made at `now`.
    pub fn generate(now: DateTime<Utc>) -> EntryId {
        EntryId(new_id(now))
    }

    /// The id as text.
    pub fn as_str(&self) -> &str {
        &self.0
    }
}

impl TagId {
    /// A fresh id for a tag added at `now`.
    pub fn generate(now: DateTime<Utc>) -> TagId {
        TagId(new_id(now))
    }

    /// The id as text.
    pub fn as_str(&self) -> &str {
        &self.0
    }
}

impl fmt::Display for EntryId {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.0)
    }
}

impl fmt::Display for TagId {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.0)
    }
}

/// What sort of record an entry is.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum Kind {
    /// An ordinary remark ("screens cleaned by operations").
    Note,
    /// Something found wrong or worth knowing ("impulse line partly blocked").
    Finding,
    /// A loop check (as-found / as-left) with its results.
    LoopCheck,
    /// A fault-finding session: the symptom, what was measured, what was found.
    FaultFinding,
    /// Work still to do; open until a later entry marks it done.
    FollowUp,
    /// An intrinsic-safety check of the loop's circuit (entity concept) with its inputs
    /// and results (`crate::action::intrinsic`).
    IsCheck,
    /// A trip or alarm test: setpoint, trip and reset values over the runs, verdict
    /// (`crate::action::trip`).
    TripTest,
    /// A control valve's stroke check on an output loop (`crate::action::stroke`).
    StrokeCheck,
}

impl Kind {
    /// Every kind, in the order the UI lists them.
    pub const ALL: [Kind; 8] = [
        Kind::Note,
        Kind::Finding,
        Kind::LoopCheck,
        Kind::FaultFinding,
        Kind::FollowUp,
        Kind::IsCheck,
        Kind::TripTest,
        Kind::StrokeCheck,
    ];

    /// The kind as written on the command line and in files (`loop-check`).
    pub fn as_str(self) -> &'static str {
        match self {
            Kind::Note => "note",
            Kind::Finding => "finding",
            Kind::LoopCheck => "loop-check",
            Kind::FaultFinding => "fault-finding",
            Kind::FollowUp => "follow-up",
            Kind::IsCheck => "is-check",
            Kind::TripTest => "trip-test",
            Kind::StrokeCheck => "stroke-check",
        }
    }

    /// Read a kind as typed (`loop-check`, `loop check`, `LoopCheck` all work).
    pub fn parse(text: &str) -> Result<Kind> {
        let t: String = text
            .trim()
            .to_lowercase()
            .chars()
            .filter(|c| c.is_alphanumeric())
            .collect();
        Kind::ALL
            .into_iter()
            .find(|k| k.as_str().replace('-', "") == t)
            .ok_or_else(|| {
                FieldError::new(
                    "kind",
                    format!(
                        "'{}' is not a kind; use one of note, finding, loop-check, fault-finding, follow-up, is-check, trip-test, stroke-check",
                        text.trim()
                    ),
                )
            })
    }
}

/// Where a follow-up stands.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum FollowUpStatus {
    /// Still to do.
    Open,
    /// Done; on an entry that refers to the follow-up it closes.
    Done,
}

/// One record in the field log.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Entry {
    /// Unique, time-sortable id.
    pub id: EntryId,
    /// The tag the entry is about (stable across renames).
    pub tag: TagId,
    /// When it was written: the UTC instant together with the local offset at the time
    /// (RFC 3339 / ISO 8601 on disk, e.g. `2026-11-30T07:42:00+01:00`).
    pub time: DateTime<FixedOffset>,
    /// Who wrote it: initials only (empty when not given).
    #[serde(default)]
    pub author: String,
    /// What sort of record it is.
    pub kind: Kind,
    /// What happened, in the technician's words.
    pub text: String,
    /// Structured detail: measurements with units, check results. Free-form JSON.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub payload: Option<serde_json::Value>,
    /// For follow-ups: open, or done (on the entry that closes another).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub status: Option<FollowUpStatus>,
    /// The entry this one corrects or closes.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub refers_to: Option<EntryId>,
}

impl Entry {
    /// A new entry about `tag` written at `time`, with a fresh id. Follow-ups start open.
    pub fn new(
        tag: &TagId,
        time: DateTime<FixedOffset>,
        author: &str,
        kind: Kind,
        text: &str,
    ) -> Result<Entry> {
        let entry = Entry {
            id: EntryId::generate(time.with_timezone(&Utc)),
            tag: tag.clone(),
            time,
            author: author.trim().to_string(),
            kind,
            text: text.trim().to_string(),
            payload: None,
            status: (kind == Kind::FollowUp).then_some(FollowUpStatus::Open),
            refers_to: None,
        };
        entry.validate()?;
        Ok(entry)
    }

    /// The entry that marks follow-up `open` done: a new follow-up entry with status
    /// done that refers to it. `text` may be empty ("done" is then written).
    pub fn closing(
        open: &Entry,
        time: DateTime<FixedOffset>,
        author: &str,
        text: &str,
    ) -> Result<Entry> {
        if open.kind != Kind::FollowUp || open.status == Some(FollowUpStatus::Done) {
            return Err(FieldError::new(
                "id",
                format!("{} is not an open follow-up", open.id),
            ));
        }
        let text = if text.trim().is_empty() { "done" } else { text };
        let mut e = Entry::new(&open.tag, time, author, Kind::FollowUp, text)?;
        e.status = Some(FollowUpStatus::Done);
        e.refers_to = Some(open.id.clone());
        Ok(e)
    }

    /// Check the fields a person typed; the error names the first one that is wrong.
    pub fn validate(&self) -> Result<()> {
        if self.id.0.trim().is_empty() || self.id.0.chars().any(char::is_control) {
            return Err(FieldError::new(
                "id",
                "must be non-empty text without control characters",
            ));
        }
        if self.tag.0.trim().is_empty() {
            return Err(FieldError::new("tag", "must name a tag"));
        }
        let author = self.author.chars().count();
        if author > MAX_AUTHOR_CHARS
            || self
                .author
                .chars()
                .any(|c| c.is_control() || c.is_whitespace())
        {
            return Err(FieldError::new(
                "author",
                format!(
                    "initials only: up to {MAX_AUTHOR_CHARS} characters, no spaces (got '{}')",
                    self.author
                ),
            ));
        }
        if self.text.trim().is_empty() {
            return Err(FieldError::new(
                "text",
                "is empty; write what was done or found",
            ));
        }
        if self.text.chars().count() > MAX_TEXT_CHARS {
            return Err(FieldError::new(
                "text",
                format!("must be {MAX_TEXT_CHARS} characters or fewer"),
            ));
        }
        if self
            .text
            .chars()
            .any(|c| c.is_control() && c != '\n' && c != '\t')
        {
            return Err(FieldError::new(
                "text",
                "must not contain control characters other than line breaks and tabs",
            ));
        }
        if self.kind != Kind::FollowUp && self.status.is_some() {
            return Err(FieldError::new(
                "status",
                "only follow-up entries have an open/done status",
            ));
        }
        if self.status == Some(FollowUpStatus::Done) && self.refers_to.is_none() {
            return Err(FieldError::new(
                "refers_to",
                "a 'done' entry must name the follow-up it closes",
            ));
        }
        Ok(())
    }

    /// The instant in UTC.
    pub fn utc(&self) -> DateTime<Utc> {
        self.time.with_timezone(&Utc)
    }
}

/// What to look for in the log. Empty fields match everything.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct Query {
    /// Text that must appear in the entry's text (case-insensitive).
    pub text: Option<String>,
    /// Only these tags (any of them).
    pub tags: Vec<TagId>,
    /// Only these kinds (any of them).
    pub kinds: Vec<Kind>,
    /// Only entries at or after this instant.
    pub since: Option<DateTime<Utc>>,
    /// Only entries before this instant (exclusive).
    pub until: Option<DateTime<Utc>>,
    /// Only follow-ups still open.
    pub open_only: bool,
}

/// The first year a typed period may name (entry ids count from 1970).
pub const FIRST_YEAR: i32 = 1970;
/// The last year a typed period may name.
pub const LAST_YEAR: i32 = 2999;

/// Which end of a period a typed time is read for.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Bound {
    /// The start: a day means from its first moment.
    Since,
    /// The end (exclusive): a day means up to and including it, so to the next midnight.
    Until,
}

/// Read the start of a handover period as typed (the Log screen's *Since*):
/// [`parse_period`] with `now`'s own offset as the local time zone. An empty text is
/// `None`: no start.
pub fn parse_since(text: &str, now: DateTime<FixedOffset>) -> Result<Option<DateTime<Utc>>> {
    parse_period("since", text, Bound::Since, now, now.offset())
}

/// Read one end of a period as typed, on every front (the Log's *Since*, `note list` and
/// `export --since/--until`):
/// - `12 h` (or `12h`, `1,5 hours`) or `3 d` (`3 days`): that long before `now`;
/// - `today`, `yesterday`: from that local day's midnight (for [`Bound::Until`], to the
///   next midnight: the day is included);
/// - a date `2026-11-30`: likewise, its local midnight (the next one for `Until`);
/// - a local date and time `2026-11-30 06:00`, or a full time with its offset
///   (`2026-11-30T06:00:00+01:00`): that moment.
///
/// A typed date lies in the years [`FIRST_YEAR`] to [`LAST_YEAR`].
///
/// "Local" is `zone`: the command line passes the computer's own time zone, so a day
/// across a daylight-saving change starts at that day's own midnight offset; the app
/// passes `now`'s offset. A local midnight that does not exist (a change at midnight) is
/// read as the first moment of that day that does. The error names `field`. An empty text
/// is `None`.
pub fn parse_period<Tz: TimeZone>(
    field: &str,
    text: &str,
    bound: Bound,
    now: DateTime<FixedOffset>,
    zone: &Tz,
) -> Result<Option<DateTime<Utc>>> {
    let t = text.trim();
    if t.is_empty() {
        return Ok(None);
    }
    let what = match bound {
        Bound::Since => "start",
        Bound::Until => "end",
    };
    let bad = || {
        FieldError::new(
            field,
            format!(
                "'{t}' is not a {what}; type hours or days back (12 h, 3 d), today, yesterday, \
                 a date (2026-11-30), a date and time (2026-11-30 06:00) or a time with its \
                 offset (2026-11-30T06:00:00+01:00)"
            ),
        )
    };
    let day_start = |date: chrono::NaiveDate| {
        let date = match bound {
            Bound::Since => date,
            Bound::Until => date.succ_opt().ok_or_else(bad)?,
        };
        // The first local moment of the day: midnight, or the end of a gap that swallowed it.
        (0..=3)
            .filter_map(|h| date.and_hms_opt(h, 0, 0))
            .find_map(|m| zone.from_local_datetime(&m).earliest())
            .map(|d| d.with_timezone(&Utc))
            .ok_or_else(bad)
    };
    let today = now.with_timezone(zone).date_naive();
    let lower = t.to_lowercase();
    match lower.as_str() {
        "today" => return day_start(today).map(Some),
        "yesterday" => return day_start(today.pred_opt().ok_or_else(bad)?).map(Some),
        _ => {}
    }
    for (suffixes, hours_per, limit) in [
        (
            &["hours", "hour", "h"][..],
            1.0,
            "0 to 8784 hours back (one year)",
        ),
        (
            &["days", "day", "d"][..],
            24.0,
            "0 to 366 days back (one year)",
        ),
    ] {
        let Some(number) = suffixes.iter().find_map(|s| lower.strip_suffix(s)) else {
            continue;
        };
        let n = crate::number::parse_number(field, number.trim()).map_err(|_| bad())?;
        let hours = n * hours_per;
        if !(0.0..=24.0 * 366.0).contains(&hours) {
            return Err(FieldError::new(
                field,
                format!("{} is out of range; type {limit}", t),
            ));
        }
        let back = chrono::Duration::milliseconds((hours * 3_600_000.0).round() as i64);
        return Ok(Some((now - back).with_timezone(&Utc)));
    }
    // A typed date is a day of the log: from 1970 (where entry ids start counting) to 2999,
    // not a year such as -26 that the date reader would otherwise take.
    let in_years = |date: chrono::NaiveDate| {
        if (FIRST_YEAR..=LAST_YEAR).contains(&date.year()) {
            Ok(())
        } else {
            Err(FieldError::new(
                field,
                format!("'{t}' is out of range; type a date from {FIRST_YEAR} to {LAST_YEAR}"),
            ))
        }
    };
    if let Ok(dt) = DateTime::parse_from_rfc3339(t) {
        in_years(dt.date_naive())?;
        return Ok(Some(dt.with_timezone(&Utc)));
    }
    if let Ok(date) = chrono::NaiveDate::parse_from_str(t, "%Y-%m-%d") {
        in_years(date)?;
        return day_start(date).map(Some);
    }
    for format in ["%Y-%m-%d %H:%M", "%Y-%m-%dT%H:%M", "%Y-%m-%d %H:%M:%S"] {
        if let Ok(local) = chrono::NaiveDateTime::parse_from_str(t, format) {
            in_years(local.date())?;
            return zone
                .from_local_datetime(&local)
                .earliest()
                .map(|d| Some(d.with_timezone(&Utc)))
                .ok_or_else(bad);
        }
    }
    Err(bad())
}

/// Ids of follow-ups that some entry has marked done.
pub fn closed_follow_ups(entries: &[Entry]) -> HashSet<&EntryId> {
    entries
        .iter()
        .filter(|e| e.status == Some(FollowUpStatus::Done))
        .filter_map(|e| e.refers_to.as_ref())
        .collect()
}

/// True when `e` is a follow-up that is open and not closed by any entry in `closed`.
pub fn is_open(e: &Entry, closed: &HashSet<&EntryId>) -> bool {
    e.kind == Kind::FollowUp && e.status != Some(FollowUpStatus::Done) && !closed.contains(&e.id)
}

/// Case-insensitive "contains" for a needle already in lower case.
fn contains_folded(haystack: &str, needle_lower: &str) -> bool {
    if haystack.is_ascii() && needle_lower.is_ascii() {
        let (h, n) = (haystack.as_bytes(), needle_lower.as_bytes());
        if n.is_empty() {
            return true;
        }
        if n.len() > h.len() {
            return false;
        }
        let first = n[0];
        let first_upper = first.to_ascii_uppercase();
        (0..=h.len() - n.len()).any(|i| {
            (h[i] == first || h[i] == first_upper) && h[i..i + n.len()].eq_ignore_ascii_case(n)
        })
    } else {
        haystack.to_lowercase().contains(needle_lower)
    }
}

/// The text to look for in `query`, trimmed and lower-cased; `None` when there is none.
pub fn needle(query: &Query) -> Option<String> {
    query
        .text
        .as_deref()
        .map(str::trim)
        .filter(|t| !t.is_empty())
        .map(str::to_lowercase)
}

/// True when `e` passes every part of `query` except its text. `closed` is what
/// [`closed_follow_ups`] gives for the whole log (needed only when `query.open_only`).
pub fn passes_filters(e: &Entry, query: &Query, closed: &HashSet<&EntryId>) -> bool {
    (query.tags.is_empty() || query.tags.contains(&e.tag))
        && (query.kinds.is_empty() || query.kinds.contains(&e.kind))
        && query.since.is_none_or(|s| e.utc() >= s)
        && query.until.is_none_or(|u| e.utc() < u)
        && (!query.open_only || is_open(e, closed))
}

/// The entries matching `query`, in log order (oldest appended first).
pub fn search<'a>(entries: &'a [Entry], query: &Query) -> Vec<&'a Entry> {
    let needle = needle(query);
    let closed = if query.open_only {
        closed_follow_ups(entries)
    } else {
        HashSet::new()
    };
    entries
        .iter()
        .filter(|e| passes_filters(e, query, &closed))
        .filter(|e| {
            needle
                .as_deref()
                .is_none_or(|n| contains_folded(&e.text, n))
        })
        .collect()
}

#[cfg(test)]
mod tests {

    #[test]
    fn a_handover_starts_when_the_technician_says() {
        // Evening shift hand-over at 18:30 local time (UTC+1) on 1 December 2026.
        let now = DateTime::parse_from_rfc3339("2026-12-01T18:30:00+01:00").unwrap();
        let utc = |s: &str| Some(DateTime::parse_from_rfc3339(s).unwrap().with_timezone(&Utc));
        assert_eq!(parse_since("", now).unwrap(), None);
        assert_eq!(
            parse_since("12 h", now).unwrap(),
            utc("2026-12-01T06:30:00+01:00")
        );
        assert_eq!(
            parse_since("12h", now).unwrap(),
            utc("2026-12-01T06:30:00+01:00")
        );
        assert_eq!(
            parse_since("1,5 hours", now).unwrap(),
            utc("2026-12-01T17:00:00+01:00")
        );
        assert_eq!(
            parse_since("Today", now).unwrap(),
            utc("2026-12-01T00:00:00+01:00")
        );
        assert_eq!(
            parse_since("yesterday", now).unwrap(),
            utc("2026-11-30T00:00:00+01:00")
        );
        assert_eq!(
            parse_since("2026-11-28", now).unwrap(),
            utc("2026-11-28T00:00:00+01:00")
        );
        assert_eq!(
            parse_since("2026-11-30 06:00", now).unwrap(),
            utc("2026-11-30T06:00:00+01:00")
        );
        assert_eq!(
            parse_since("2026-11-30T06:00:00Z", now).unwrap(),
            utc("2026-11-30T07:00:00+01:00")
        );
        for bad in ["last week", "-3 h", "9000 h", "2026-13-01", "h"] {
            let e = parse_since(bad, now).unwrap_err();
            assert_eq!(e.field, "since", "{bad}");
        }
    }

    use super::*;

    fn t(s: &str) -> DateTime<FixedOffset> {
        DateTime::parse_from_rfc3339(s).unwrap()
    }

    #[test]
    fn ids_are_unique_and_sort_by_time() {
        let a = EntryId::generate(t("2026-11-30T07:00:00Z").with_timezone(&Utc));
        let b = EntryId::generate(t("2026-11-30T07:00:00Z").with_timezone(&Utc));
        let c = EntryId::generate(t("2026-11-30T07:00:01Z").with_timezone(&Utc));
        assert_ne!(a, b);
        assert!(a < c && b < c);
    }

    #[test]
    fn follow_up_closes_by_a_new_entry() {
        let tag = TagId("t1".into());
        let f = Entry::new(
            &tag,
            t("2026-11-30T07:00:00+01:00"),
            "AB",
            Kind::FollowUp,
            "x",
        )
        .unwrap();
        let done = Entry::closing(&f, t("2026-11-30T08:00:00+01:00"), "CD", "").unwrap();
        let all = vec![f.clone(), done.clone()];
        let q = Query {
            open_only: true,
            ..Query::default()
        };
        assert!(search(&all, &q).is_empty());
        assert_eq!(search(&all[..1], &q).len(), 1);
        assert!(Entry::closing(&done, t("2026-11-30T09:00:00Z"), "", "").is_err());
    }

    #[test]
    fn search_folds_case_including_non_ascii() {
        let tag = TagId("t1".into());
        let e = Entry::new(
            &tag,
            t("2026-11-30T07:00:00Z"),
            "",
            Kind::Note,
            "Loose WIRE at ΔP cell",
        )
        .unwrap();
        let all = [e];
        for text in ["wire", "WiRe", "δp"] {
            let q = Query {
                text: Some(text.into()),
                ..Query::default()
            };
            assert_eq!(search(&all, &q).len(), 1, "{text}");
        }
    }

    #[test]
    fn kinds_parse_as_typed() {
        assert_eq!(Kind::parse("Loop check").unwrap(), Kind::LoopCheck);
        assert_eq!(Kind::parse("follow-up").unwrap(), Kind::FollowUp);
        assert_eq!(Kind::parse("memo").unwrap_err().field, "kind");
    }

    #[test]
    fn author_is_initials() {
        let tag = TagId("t1".into());
        let r = Entry::new(
            &tag,
            t("2026-11-30T07:00:00Z"),
            "Anna Brown",
            Kind::Note,
            "x",
        );
        assert_eq!(r.unwrap_err().field, "author");
    }
}
