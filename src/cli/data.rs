//! The data folder a store subcommand works on, and what the store subcommands share.
//!
//! Every store subcommand works on a data folder: `--data-dir DIR`, else the
//! `LOOPSIDE_DATA` environment variable, else the platform's data folder (found here, at
//! the edge; the core is always handed a path). Recovery notices from opening the store
//! are printed on stderr as `warning:` lines and do not stop the command. A folder another
//! loopside has open (the app, say) is waited for up to [`LOCK_WAIT`], then the command
//! stops saying the folder is in use.

use super::CliError;
use crate::error::FieldError;
use crate::journal::Query;
use crate::store::{FileStore, Store, StoreError};
use chrono::{DateTime, Duration, FixedOffset, Local, NaiveDate, TimeZone, Utc};
use clap::Args;
use std::path::PathBuf;

/// How long a command waits for a data folder another loopside has open.
pub const LOCK_WAIT: std::time::Duration = std::time::Duration::from_millis(2500);

/// Where the data folder is, as given on the command line.
#[derive(Debug, Clone, Args)]
pub struct DataArgs {
    /// Data folder (default: $LOOPSIDE_DATA, else the platform's data folder).
    #[arg(long, value_name = "DIR", global = true)]
    data_dir: Option<PathBuf>,
}

impl DataArgs {
    fn folder(&self) -> Result<PathBuf, CliError> {
        crate::data_folder::resolve(self.data_dir.clone()).ok_or_else(|| {
            CliError::Failure(
                "no data folder could be found for this user; give --data-dir DIR".into(),
            )
        })
    }

    /// Open the data folder's store, reporting any recovery on stderr. When another
    /// loopside (the app, say) has the folder open, wait up to [`LOCK_WAIT`] for it.
    pub(crate) fn open(&self) -> Result<FileStore, CliError> {
        let store = FileStore::open_waiting(&self.folder()?, LOCK_WAIT).map_err(|e| match e {
            StoreError::InUse { .. } => {
                CliError::Failure(format!("{e} (waited {} s)", LOCK_WAIT.as_secs_f64()))
            }
            other => store_error(other),
        })?;
        for r in store.recoveries() {
            eprintln!("warning: {}", r.message);
        }
        Ok(store)
    }
}

/// A store error as a CLI error: bad input exits 2, the rest 1.
pub(crate) fn store_error(e: StoreError) -> CliError {
    match e {
        StoreError::Input(f) => CliError::Input(f),
        other => CliError::Failure(other.to_string()),
    }
}

pub(super) fn now_local() -> DateTime<FixedOffset> {
    Local::now().fixed_offset()
}

/// A local date (start of day, or start of the next day for an inclusive end) or an
/// RFC 3339 time.
fn parse_when(field: &str, text: &str, end_of_day: bool) -> Result<DateTime<Utc>, FieldError> {
    let t = text.trim();
    if let Ok(dt) = DateTime::parse_from_rfc3339(t) {
        return Ok(dt.with_timezone(&Utc));
    }
    let bad = || {
        FieldError::new(
            field,
            format!("'{t}' is not a date; use YYYY-MM-DD such as 2026-11-30, or a time such as 2026-11-30T07:00:00+01:00"),
        )
    };
    let mut date = NaiveDate::parse_from_str(t, "%Y-%m-%d").map_err(|_| bad())?;
    if end_of_day {
        date = date.checked_add_signed(Duration::days(1)).ok_or_else(bad)?;
    }
    let midnight = date.and_hms_opt(0, 0, 0).ok_or_else(bad)?;
    Local
        .from_local_datetime(&midnight)
        .earliest()
        .map(|d| d.with_timezone(&Utc))
        .ok_or_else(bad)
}

pub(super) fn query_from(
    store: &dyn Store,
    tags: &[String],
    since: &Option<String>,
    until: &Option<String>,
) -> Result<Query, CliError> {
    let mut q = Query::default();
    for n in tags {
        q.tags
            .push(store.require_tag(n).map_err(store_error)?.id.clone());
    }
    if let Some(s) = since {
        q.since = Some(parse_when("since", s, false)?);
    }
    if let Some(u) = until {
        q.until = Some(parse_when("until", u, true)?);
    }
    if let (Some(s), Some(u)) = (q.since, q.until) {
        if u <= s {
            return Err(FieldError::new("until", "must be after --since").into());
        }
    }
    Ok(q)
}
