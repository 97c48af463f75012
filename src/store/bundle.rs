//! A bundle: a selection of the register and log (a date range and/or a set of tags) with
//! the tag definitions it needs — what a hand-over exports and another device imports with
//! [`crate::store::Store::import`]. It lives with the store, below the report that writes it
//! as Markdown, CSV or JSON (`crate::report`), so neither imports the other's caller.

use crate::error::{FieldError, Result};
use crate::journal::{Entry, Query, TagId};
use crate::store::{Store, TagRecord};
use chrono::{DateTime, FixedOffset, Utc};
use serde::{Deserialize, Serialize};
use std::collections::HashSet;

/// Schema version of the JSON bundle this build writes and reads.
pub const BUNDLE_SCHEMA: u32 = 1;

/// A selection of the register and log, ready to hand over or import.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Bundle {
    /// Always `"bundle"`: says what the file is.
    pub loopside: String,
    /// Bundle schema version.
    pub schema: u32,
    /// When it was made (with the exporting device's local offset).
    pub exported: DateTime<FixedOffset>,
    /// Start of the period covered, if limited.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub since: Option<DateTime<Utc>>,
    /// End of the period covered (exclusive), if limited.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub until: Option<DateTime<Utc>>,
    /// The tags the entries belong to (and any tags asked for by number).
    pub tags: Vec<TagRecord>,
    /// The entries, in log order.
    pub entries: Vec<Entry>,
}

/// Gather the entries matching `query` (its date range and tags) and the tags they need.
/// With no tag filter and no dates the whole register is included.
pub fn select(store: &dyn Store, query: &Query, exported: DateTime<FixedOffset>) -> Bundle {
    let entries: Vec<Entry> = store.search(query).into_iter().cloned().collect();
    let mut wanted: HashSet<&TagId> = entries.iter().map(|e| &e.tag).collect();
    wanted.extend(query.tags.iter());
    let everything = query.tags.is_empty() && query.since.is_none() && query.until.is_none();
    let tags = store
        .tags()
        .iter()
        .filter(|t| everything || wanted.contains(&t.id))
        .cloned()
        .collect();
    Bundle {
        loopside: "bundle".to_string(),
        schema: BUNDLE_SCHEMA,
        exported,
        since: query.since,
        until: query.until,
        tags,
        entries,
    }
}

/// Read a JSON bundle; the error says what is wrong with the file.
pub fn parse_bundle(text: &str) -> Result<Bundle> {
    let b: Bundle = serde_json::from_str(text).map_err(|e| {
        FieldError::new(
            "bundle",
            format!("is not a loopside JSON bundle (line {}: {e})", e.line()),
        )
    })?;
    if b.loopside != "bundle" {
        return Err(FieldError::new(
            "bundle",
            format!("says it is a '{}', not a bundle", b.loopside),
        ));
    }
    if b.schema > BUNDLE_SCHEMA {
        return Err(FieldError::new(
            "bundle",
            format!(
                "has schema {} but this loopside reads up to {BUNDLE_SCHEMA}; update loopside",
                b.schema
            ),
        ));
    }
    Ok(b)
}
