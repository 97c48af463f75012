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
use crate::journal::{parse_period, Bound, Query};
use crate::store::{FileStore, Store, StoreError};
use chrono::{DateTime, FixedOffset, Local};
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
    // The computer's own time zone: a day across a daylight-saving change starts at its
    // own midnight.
    let now = now_local();
    if let Some(s) = since {
        q.since = parse_period("since", s, Bound::Since, now, &Local)?;
    }
    if let Some(u) = until {
        q.until = parse_period("until", u, Bound::Until, now, &Local)?;
    }
    if let (Some(s), Some(u)) = (q.since, q.until) {
        if u <= s {
            return Err(FieldError::new("until", "must be after --since").into());
        }
    }
    Ok(q)
}
