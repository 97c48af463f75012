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
    /// The reference instruments of the register (all of them: a check names them by id).
    /// Bundles made before references were kept have none.
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub references: Vec<crate::calibration::reference::Reference>,
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
        references: store.references().to_vec(),
    }
}

/// Read a JSON bundle; the error says what is wrong with the file and where: the entry or
/// tag by its position and id and the field (`entry 4 (id 019a…), field time: …`), then
/// the line and column.
pub fn parse_bundle(text: &str) -> Result<Bundle> {
    let mut de = serde_json::Deserializer::from_str(text);
    let b: Bundle =
        serde_path_to_error::deserialize(&mut de).map_err(|e| not_a_bundle(text, &e))?;
    de.end().map_err(|e| {
        FieldError::new(
            "bundle",
            format!(
                "is not a loopside JSON bundle: there is more after its end (line {}, column {})",
                e.line(),
                e.column()
            ),
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

/// The error for a file that does not read as a bundle, naming the part that is wrong.
fn not_a_bundle(text: &str, e: &serde_path_to_error::Error<serde_json::Error>) -> FieldError {
    use serde_path_to_error::Segment;
    let inner = e.inner();
    let segments: Vec<&Segment> = e.path().iter().collect();
    // The list (`tags` or `entries`) and the item's index, then the field inside it.
    let item = match segments.as_slice() {
        [Segment::Map { key }, Segment::Seq { index }, rest @ ..]
            if key == "tags" || key == "entries" =>
        {
            Some((key.as_str(), *index, rest))
        }
        _ => None,
    };
    let field_of = |rest: &[&Segment]| {
        rest.iter()
            .filter_map(|s| match s {
                Segment::Map { key } => Some(key.clone()),
                Segment::Seq { index } => Some(format!("[{}]", index + 1)),
                Segment::Enum { variant } => Some(variant.clone()),
                Segment::Unknown => None,
            })
            .collect::<Vec<_>>()
            .join(".")
            .replace(".[", "[")
    };
    // The item's id (and a tag's number) when the file is at least valid JSON.
    let whole = || serde_json::from_str::<serde_json::Value>(text).ok();
    let reason = match item {
        Some((list, index, rest)) => {
            let value = whole();
            let item_value = value.as_ref().and_then(|v| v.get(list)?.get(index));
            let id = item_value
                .and_then(|v| v.get("id")?.as_str())
                .map(|id| format!("id {id}"));
            let number = item_value
                .and_then(|v| v.get("tag")?.get("number")?.as_str())
                .map(|n| format!("number '{n}'"));
            let names: Vec<String> = id.into_iter().chain(number).collect();
            let what = if list == "tags" { "tag" } else { "entry" };
            let mut part = format!("{what} {}", index + 1);
            if !names.is_empty() {
                part.push_str(&format!(" ({})", names.join(", ")));
            }
            let field = field_of(rest);
            if !field.is_empty() {
                part.push_str(&format!(", field {field}"));
            }
            format!("{part}: {inner}")
        }
        None => {
            let field = field_of(&segments);
            if field.is_empty() {
                inner.to_string()
            } else {
                format!("field {field}: {inner}")
            }
        }
    };
    FieldError::new("bundle", format!("is not a loopside JSON bundle: {reason}"))
}
