//! The tag register: add, edit, rename and archive a tag. The fronts build the [`Tag`]
//! from their flags or form; these actions store it and word the result once.
//!
//! A tag carries no time of its own, so these actions take no `now`.

use crate::journal::TagId;
use crate::store::{Store, StoreError};
use crate::tag::Tag;
use std::fmt;

/// A tag added to the register.
#[derive(Debug, Clone, PartialEq)]
pub struct TagAdded {
    /// Its id in the register (kept through renames).
    pub id: TagId,
    /// Its number.
    pub number: String,
}

impl fmt::Display for TagAdded {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "Added {}.", self.number)
    }
}

/// Add `tag` to the register (a number already there is refused, naming `number`).
pub fn add_tag(store: &mut dyn Store, tag: Tag) -> Result<TagAdded, StoreError> {
    let number = tag.number.clone();
    let id = store.add_tag(tag)?;
    Ok(TagAdded { id, number })
}

/// A tag edited.
#[derive(Debug, Clone, PartialEq)]
pub struct TagSaved {
    /// Its id in the register.
    pub id: TagId,
    /// Its number now.
    pub number: String,
    /// Its number before, when the edit changed it (the log follows).
    pub renamed_from: Option<String>,
    /// Whether anything changed at all.
    pub changed: bool,
}

impl fmt::Display for TagSaved {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match (&self.renamed_from, self.changed) {
            (_, false) => write!(f, "{}: nothing changed.", self.number),
            (Some(old), true) => write!(f, "Saved {} (was {old}; its log follows).", self.number),
            (None, true) => write!(f, "Saved {}.", self.number),
        }
    }
}

/// Replace the tag now numbered `number` by `tag` (a new number in `tag` renames it; its
/// log follows).
pub fn edit_tag(store: &mut dyn Store, number: &str, tag: Tag) -> Result<TagSaved, StoreError> {
    let record = store.require_tag(number)?.clone();
    let changed = tag != record.tag;
    let renamed_from = (tag.number != record.tag.number).then(|| record.tag.number.clone());
    let new_number = tag.number.clone();
    store.update_tag(&record.id, tag)?;
    Ok(TagSaved {
        id: record.id,
        number: new_number,
        renamed_from,
        changed,
    })
}

/// A tag given a new number.
#[derive(Debug, Clone, PartialEq)]
pub struct TagRenamed {
    /// Its number before.
    pub old: String,
    /// Its number now.
    pub new: String,
}

impl fmt::Display for TagRenamed {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "Renamed {} to {}; its log follows.", self.old, self.new)
    }
}

/// Give the tag `number` the number `new_number`; its log follows (entries refer to the
/// tag's id, not its number).
pub fn rename_tag(
    store: &mut dyn Store,
    number: &str,
    new_number: &str,
) -> Result<TagRenamed, StoreError> {
    let record = store.require_tag(number)?;
    let (id, old) = (record.id.clone(), record.tag.number.clone());
    store.rename_tag(number, new_number)?;
    let new = store
        .tag_by_id(&id)
        .map(|r| r.tag.number.clone())
        .unwrap_or_else(|| new_number.trim().to_string());
    Ok(TagRenamed { old, new })
}

/// A tag archived or brought back.
#[derive(Debug, Clone, PartialEq)]
pub struct TagArchived {
    /// Its number.
    pub number: String,
    /// True when it is now archived, false when restored.
    pub archived: bool,
}

impl fmt::Display for TagArchived {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        if self.archived {
            write!(f, "{} archived (its log is kept).", self.number)
        } else {
            write!(f, "{} restored.", self.number)
        }
    }
}

/// Archive the tag `number` (`archived = true`; it leaves the working list and keeps its
/// log) or bring it back (`false`).
pub fn archive_tag(
    store: &mut dyn Store,
    number: &str,
    archived: bool,
) -> Result<TagArchived, StoreError> {
    let number = store.require_tag(number)?.tag.number.clone();
    store.set_archived(&number, archived)?;
    Ok(TagArchived { number, archived })
}
