//! `loopside note …`: write, list and search the field log; close follow-ups.

use super::data::{now_local, query_from, store_error, DataArgs};
use super::{print_json, print_lines, CliResult};
use crate::action::note::{self as action, NewNote};
use crate::error::FieldError;
use crate::journal::{is_open, Entry, FollowUpStatus, Kind};
use crate::store::Store;
use clap::{Args, Subcommand};
use serde_json::json;
use std::io::Write;

/// `loopside note …`
#[derive(Debug, Args)]
#[command(after_help = "Examples:\n  \
    loopside note add LT-101 \"3.2 mA at the marshalling terminals; loose wire in the head\" --kind fault-finding --author CD\n  \
    loopside note list --open\n  \
    loopside note done 019a6f3c2b10")]
pub struct NoteArgs {
    #[command(flatten)]
    data: DataArgs,
    #[command(subcommand)]
    command: NoteCommand,
}

/// What to do with the field log.
#[derive(Debug, Subcommand)]
pub enum NoteCommand {
    /// Write an entry for a tag; prints its id once it is safely saved.
    Add(NoteAddArgs),
    /// Mark an open follow-up done (a new entry; the follow-up itself is kept).
    Done(NoteDoneArgs),
    /// List or search entries.
    List(NoteListArgs),
}

/// `loopside note add`
#[derive(Debug, Args)]
#[command(after_help = "Examples:\n  \
    loopside note add FT-310 \"Check DP zero at next blower stop\" --kind follow-up --author AB\n  \
    loopside note add TT-412 \"Correction: reference read 36.4 °C\" --refers-to 019a6f3c2b10\n  \
    loopside note add PT-204 \"As found 12.10 mA at 50 %\" --kind loop-check --payload '{\"measured_ma\":12.1}'")]
pub struct NoteAddArgs {
    /// Tag number.
    number: String,
    /// What was done or found (may begin with `-`: "-5 mbar offset found").
    #[arg(allow_hyphen_values = true)]
    text: String,
    /// note, finding, loop-check, fault-finding or follow-up (default note).
    #[arg(long, value_name = "K")]
    kind: Option<String>,
    /// Author's initials.
    #[arg(long, value_name = "A")]
    author: Option<String>,
    /// The entry this one corrects (id or its first characters).
    #[arg(long, value_name = "ID")]
    refers_to: Option<String>,
    /// Structured detail as JSON (measurements with units, check results).
    #[arg(long, value_name = "JSON")]
    payload: Option<String>,
}

/// `loopside note done`
#[derive(Debug, Args)]
#[command(
    after_help = "Example:\n  loopside note done 019a6f3c2b10 --author EF --text \"Zero checked, within 0.1 %\""
)]
pub struct NoteDoneArgs {
    /// The follow-up's id (or its first characters).
    id: String,
    /// Author's initials.
    #[arg(long, value_name = "A")]
    author: Option<String>,
    /// What was done (default "done").
    #[arg(long, value_name = "TEXT")]
    text: Option<String>,
}

/// `loopside note list`
#[derive(Debug, Args)]
#[command(after_help = "Examples:\n  \
    loopside note list LT-101\n  \
    loopside note list --search \"loose wire\" --since 2026-11-27 --json\n  \
    loopside note list --since 12h\n  \
    loopside note list --open\n\
    Dates are local days: --since 2026-11-27 --until 2026-11-30 covers both days in full.")]
pub struct NoteListArgs {
    /// Only this tag.
    number: Option<String>,
    /// Text to look for (case-insensitive).
    #[arg(long, value_name = "TEXT")]
    search: Option<String>,
    /// From: 12 h or 3 d back, today, yesterday, a local date (YYYY-MM-DD), a local
    /// date and time (YYYY-MM-DD HH:MM) or a time with its offset (RFC 3339).
    #[arg(long, allow_hyphen_values = true, value_name = "WHEN")]
    since: Option<String>,
    /// Up to: the same forms; a day (today, yesterday, a date) is included in full.
    #[arg(long, allow_hyphen_values = true, value_name = "WHEN")]
    until: Option<String>,
    /// Only follow-ups still open.
    #[arg(long)]
    open: bool,
    /// Only this kind (repeat for several).
    #[arg(long, value_name = "K")]
    kind: Vec<String>,
    /// Print a JSON array.
    #[arg(long)]
    json: bool,
}

fn parse_payload(text: &str) -> Result<serde_json::Value, FieldError> {
    serde_json::from_str(text)
        .map_err(|e| FieldError::new("payload", format!("is not valid JSON: {e}")))
}

pub(super) fn entry_json(
    store: &dyn Store,
    e: &Entry,
    closed: &std::collections::HashSet<&crate::journal::EntryId>,
) -> serde_json::Value {
    json!({
        "id": e.id,
        "tag": store.tag_number(&e.tag),
        "time": e.time.to_rfc3339(),
        "kind": e.kind.as_str(),
        "author": e.author,
        "text": e.text,
        "status": e.status.map(|s| match s { FollowUpStatus::Open => "open", FollowUpStatus::Done => "done" }),
        "open": is_open(e, closed),
        "refers_to": e.refers_to,
        "payload": e.payload,
    })
}

pub(super) fn entry_line(store: &dyn Store, e: &Entry) -> String {
    let first = e.text.lines().next().unwrap_or_default();
    format!(
        "{}  {:<10} {:<13} {:<4} {}  [{}]",
        e.time.format("%Y-%m-%d %H:%M %:z"),
        store.tag_number(&e.tag),
        e.kind.as_str(),
        if e.author.is_empty() { "?" } else { &e.author },
        first,
        e.id
    )
}

pub(super) fn note(args: NoteArgs, out: &mut dyn Write) -> CliResult {
    let mut store = args.data.open()?;
    match args.command {
        NoteCommand::Add(a) => {
            let kind = match &a.kind {
                Some(k) => Kind::parse(k)?,
                None => Kind::Note,
            };
            let payload = a.payload.as_deref().map(parse_payload).transpose()?;
            let added = action::add_note(
                &mut store,
                now_local(),
                NewNote {
                    tag: &a.number,
                    text: &a.text,
                    initials: a.author.as_deref().unwrap_or(""),
                    kind,
                    refers_to: a.refers_to.as_deref(),
                    payload,
                },
            )
            .map_err(store_error)?;
            // The bare id, for scripts; printed only after the entry is on disk.
            print_lines(out, &[added.id.to_string()])
        }
        NoteCommand::Done(a) => {
            let closed = action::close_follow_up(
                &mut store,
                now_local(),
                &a.id,
                a.author.as_deref().unwrap_or(""),
                a.text.as_deref().unwrap_or(""),
            )
            .map_err(store_error)?;
            print_lines(out, &[closed.id.to_string()])
        }
        NoteCommand::List(a) => {
            let tags: Vec<String> = a.number.iter().cloned().collect();
            let mut q = query_from(&store, &tags, &a.since, &a.until)?;
            q.text = a.search.clone();
            q.open_only = a.open;
            for k in &a.kind {
                q.kinds.push(Kind::parse(k)?);
            }
            let found = store.search(&q);
            let closed = store.closed_follow_ups();
            if a.json {
                let v: Vec<serde_json::Value> = found
                    .iter()
                    .map(|e| entry_json(&store, e, &closed))
                    .collect();
                return print_json(out, &serde_json::Value::Array(v));
            }
            if found.is_empty() {
                return print_lines(out, &["no entries match".into()]);
            }
            let lines: Vec<String> = found.iter().map(|e| entry_line(&store, e)).collect();
            print_lines(out, &lines)
        }
    }
}
