//! Handoff reports: what happened on which tags, for the next shift or the planner.
//!
//! A [`Bundle`] is the selection (a date range and/or a set of tags) with the tag
//! definitions it needs. It is written three ways:
//!
//! - **Markdown** — readable on a phone or printed: open follow-ups first, then each tag
//!   with its entries in time order;
//! - **CSV** — one row per entry for a spreadsheet. Every cell that begins with `=`, `+`,
//!   `-`, `@`, a tab or a carriage return is prefixed with a single quote, and every cell
//!   is quoted with inner quotes doubled, as OWASP's "CSV Injection" guidance advises, so
//!   a note such as `=HYPERLINK(…)` is shown as text and never run as a formula;
//! - **JSON** — the bundle itself, which another device imports with
//!   [`crate::store::Store::import`] (merging by entry id).
//!
//! These functions build text only; writing it to a file is the caller's business. The
//! bundle itself (what it holds, how it is selected and read back) is the store's:
//! [`crate::store::bundle`], re-exported here so a report and its bundle are found together.

use crate::journal::{closed_follow_ups, is_open, Entry, FollowUpStatus, TagId};
use crate::store::TagRecord;
use chrono::{DateTime, FixedOffset, Utc};
use std::borrow::Cow;
use std::collections::HashMap;
use std::fmt::Write as _;

pub use crate::store::bundle::{parse_bundle, select, Bundle, BUNDLE_SCHEMA};

/// The bundle as pretty JSON (what `import` reads).
pub fn json(bundle: &Bundle) -> String {
    serde_json::to_string_pretty(bundle).unwrap_or_else(|e| format!("{{\"error\":\"{e}\"}}"))
}

/// Characters that make a spreadsheet treat a cell as a formula (OWASP, CSV Injection).
pub const FORMULA_TRIGGERS: [char; 6] = ['=', '+', '-', '@', '\t', '\r'];

/// A CSV cell made safe to open in a spreadsheet: a leading formula trigger gets a single
/// quote in front (OWASP, CSV Injection). Quoting is done by [`csv`].
pub fn neutralise(cell: &str) -> Cow<'_, str> {
    if cell.starts_with(FORMULA_TRIGGERS) {
        Cow::Owned(format!("'{cell}"))
    } else {
        Cow::Borrowed(cell)
    }
}

/// Column names of the CSV export, in order.
pub const CSV_COLUMNS: [&str; 10] = [
    "id",
    "time",
    "tag",
    "service",
    "kind",
    "author",
    "status",
    "refers_to",
    "text",
    "payload",
];

fn tag_map(bundle: &Bundle) -> HashMap<&TagId, &TagRecord> {
    bundle.tags.iter().map(|t| (&t.id, t)).collect()
}

/// One row per entry, RFC 4180 style (CRLF, every cell quoted), formula-neutralised.
pub fn csv(bundle: &Bundle) -> String {
    let tags = tag_map(bundle);
    let mut out = String::new();
    let mut row = |cells: &[&str]| {
        let line: Vec<String> = cells
            .iter()
            .map(|c| format!("\"{}\"", neutralise(c).replace('"', "\"\"")))
            .collect();
        out.push_str(&line.join(","));
        out.push_str("\r\n");
    };
    row(&CSV_COLUMNS);
    for e in &bundle.entries {
        let (number, service) = match tags.get(&e.tag) {
            Some(t) => (t.tag.number.as_str(), t.tag.service.as_str()),
            None => (e.tag.as_str(), ""),
        };
        let status = match e.status {
            Some(FollowUpStatus::Open) => "open",
            Some(FollowUpStatus::Done) => "done",
            None => "",
        };
        let payload = e
            .payload
            .as_ref()
            .map(|p| p.to_string())
            .unwrap_or_default();
        row(&[
            e.id.as_str(),
            &e.time.to_rfc3339(),
            number,
            service,
            e.kind.as_str(),
            &e.author,
            status,
            e.refers_to.as_ref().map_or("", |r| r.as_str()),
            &e.text,
            &payload,
        ]);
    }
    out
}

fn when(t: &DateTime<FixedOffset>) -> String {
    t.format("%Y-%m-%d %H:%M (UTC%:z)").to_string()
}

fn day(t: &DateTime<Utc>) -> String {
    t.format("%Y-%m-%d %H:%M UTC").to_string()
}

/// Markdown escaping for user text at the start of a line, so a note cannot turn itself
/// into a heading or a list.
fn md_text(text: &str) -> String {
    text.lines()
        .map(|l| {
            let l = l.trim_end();
            if l.starts_with(['#', '>', '-', '*', '+', '|', '=']) {
                format!("\\{l}")
            } else {
                l.to_string()
            }
        })
        .collect::<Vec<_>>()
        .join("\n  ")
}

/// A readable handoff: heading, period, open follow-ups, then tag by tag.
pub fn markdown(bundle: &Bundle) -> String {
    markdown_with(bundle, &|_| Vec::new())
}

/// The same handoff, with `detail`'s Markdown lines under each entry it has any for (the
/// application layer words the structured records, such as an intrinsic-safety check's
/// checks and margins; the report itself writes no sentences about them).
pub fn markdown_with(bundle: &Bundle, detail: &dyn Fn(&Entry) -> Vec<String>) -> String {
    let tags = tag_map(bundle);
    let number = |id: &TagId| {
        tags.get(id)
            .map(|t| t.tag.number.clone())
            .unwrap_or_else(|| format!("(unknown tag {id})"))
    };
    let mut s = String::new();
    let _ = writeln!(s, "# Field log handoff\n");
    let period = match (&bundle.since, &bundle.until) {
        (Some(a), Some(b)) => format!("{} to {}", day(a), day(b)),
        (Some(a), None) => format!("from {}", day(a)),
        (None, Some(b)) => format!("until {}", day(b)),
        (None, None) => "all entries".to_string(),
    };
    let _ = writeln!(
        s,
        "Period: {period}  \nTags: {} · Entries: {} · Exported {}\n",
        bundle.tags.len(),
        bundle.entries.len(),
        when(&bundle.exported)
    );
    let closed = closed_follow_ups(&bundle.entries);
    let open: Vec<&Entry> = bundle
        .entries
        .iter()
        .filter(|e| is_open(e, &closed))
        .collect();
    let _ = writeln!(s, "## Open follow-ups ({})\n", open.len());
    if open.is_empty() {
        let _ = writeln!(s, "None in this period.\n");
    }
    for e in &open {
        let _ = writeln!(
            s,
            "- **{}** · {} · {}: {}",
            number(&e.tag),
            when(&e.time),
            if e.author.is_empty() { "?" } else { &e.author },
            md_text(&e.text)
        );
    }
    if !open.is_empty() {
        s.push('\n');
    }
    for t in &bundle.tags {
        let mine: Vec<&Entry> = bundle.entries.iter().filter(|e| e.tag == t.id).collect();
        let title = if t.tag.service.is_empty() {
            t.tag.number.clone()
        } else {
            format!("{} — {}", t.tag.number, t.tag.service)
        };
        let _ = writeln!(
            s,
            "## {}{}\n",
            title,
            if t.tag.archived { " (archived)" } else { "" }
        );
        let mut facts = vec![format!(
            "Range {}..{} {}",
            t.tag.scale.lrv, t.tag.scale.urv, t.tag.scale.unit
        )];
        if !t.tag.area.is_empty() {
            facts.push(format!("Area {}", t.tag.area));
        }
        let _ = writeln!(s, "{}\n", facts.join(" · "));
        if mine.is_empty() {
            let _ = writeln!(s, "No entries in this period.\n");
            continue;
        }
        for e in mine {
            let mut line = format!(
                "- {} · **{}** · {}",
                when(&e.time),
                e.kind.as_str(),
                if e.author.is_empty() { "?" } else { &e.author }
            );
            match (e.status, &e.refers_to) {
                (Some(FollowUpStatus::Done), Some(r)) => {
                    let _ = write!(line, " · closes {r}");
                }
                (_, Some(r)) => {
                    let _ = write!(line, " · refers to {r}");
                }
                (Some(FollowUpStatus::Open), None) if closed.contains(&e.id) => {
                    line.push_str(" · done since");
                }
                (Some(FollowUpStatus::Open), None) => line.push_str(" · OPEN"),
                _ => {}
            }
            let _ = writeln!(s, "{line}  \n  {}  \n  `{}`", md_text(&e.text), e.id);
            for more in detail(e) {
                let _ = writeln!(s, "  {more}");
            }
        }
        s.push('\n');
    }
    s
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn only_leading_triggers_are_neutralised() {
        assert_eq!(neutralise("=1+1"), "'=1+1");
        assert_eq!(neutralise("\tx"), "'\tx");
        assert_eq!(neutralise("a=b"), "a=b");
        assert_eq!(neutralise(""), "");
    }
}
