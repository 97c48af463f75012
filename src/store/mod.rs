//! Where tags and the field log are kept: the only part of the core that does I/O.
//!
//! [`Store`] is the contract the command line, the app and the tests use. Two stores
//! implement it: [`MemoryStore`] (tests, previews) and [`FileStore`] (a data folder handed
//! in by the caller — the core never looks a folder up itself). Both keep the whole
//! register in memory; they differ only in how [`Store::persist`] saves records (and a
//! file store opened from its snapshot reads the log's entries when first asked for).
//!
//! Everything is append-only: adding, editing, renaming, archiving a tag and writing an
//! entry each save one new record; the last record for a tag id is its current
//! definition. A rename changes the tag number, not its [`TagId`], so the log follows.
//! Nothing is ever deleted; archived tags are hidden from the working list only.

pub mod bundle;
mod file;
pub mod record;
pub mod saved;
mod snapshot;

pub use file::{FileStore, Recovery, RecoveryKind, JOURNAL_FILE, LOCK_FILE};
pub use snapshot::{SNAPSHOT_FILE, SNAPSHOT_TAIL_BYTES};

use crate::calibration::reference::Reference;
use crate::error::FieldError;
use crate::journal::{self, Entry, EntryId, Query, TagId};
use crate::tag::{clean_number, Tag};
use bundle::Bundle;
use chrono::Utc;
use record::Record;
use serde::{Deserialize, Serialize};
use std::cell::{Cell, OnceCell, Ref, RefCell};
use std::collections::{HashMap, HashSet};
use std::path::PathBuf;

/// A tag as the register keeps it: its stable id and its current definition.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct TagRecord {
    /// Stable identity; log entries point here, so renames keep the history.
    pub id: TagId,
    /// The tag's definition (number, range, loop …).
    pub tag: Tag,
}

/// Why a store operation failed.
#[derive(Debug, thiserror::Error)]
pub enum StoreError {
    /// The request itself was wrong (unknown tag, duplicate number, empty text …).
    #[error("{0}")]
    Input(#[from] FieldError),
    /// Another loopside holds the data folder open for writing.
    #[error("the data folder {} is in use by another loopside; close it and try again", folder.display())]
    InUse {
        /// The data folder.
        folder: PathBuf,
    },
    /// The store was written by a newer loopside; it is left untouched.
    #[error("{} was written by a newer loopside (schema {found}; this one reads up to {known}); it was not changed — update loopside", path.display())]
    NewerSchema {
        /// The file.
        path: PathBuf,
        /// Version found in the file.
        found: u32,
        /// Highest version this build reads.
        known: u32,
    },
    /// Reading or writing a file failed; nothing was acknowledged.
    #[error("cannot {action} {}: {source}", path.display())]
    Io {
        /// What was being done ("write", "open" …).
        action: &'static str,
        /// The file or folder.
        path: PathBuf,
        /// The operating system's error.
        source: std::io::Error,
    },
}

/// A store operation's result.
pub type StoreResult<T> = std::result::Result<T, StoreError>;

/// Reads the entries a [`Register`] was opened without: those a snapshot covers. An
/// `Err` says why they could not be read at all.
pub(crate) type EntryLoader = Box<dyn FnOnce() -> Result<Vec<Entry>, String> + Send>;

/// Reads the snapshot's aid (its entries undecoded, their lower-cased text, each tag's
/// newest entry, the closed follow-ups); `None` when it cannot be read or checked.
pub(crate) type AidLoader = Box<dyn FnOnce() -> Option<snapshot::Aid> + Send>;

/// The in-memory register both stores share: tags, entries and their indexes.
///
/// A register opened from a snapshot has its tags at once and reads its entries the
/// first time anything asks for them, so listing tags does not wait for the whole log.
///
/// Until then, a text search, each tag's newest entry and the closed follow-ups are
/// answered from the snapshot's aid section, decoding only the entries asked for.
#[derive(Default)]
pub struct Register {
    tags: Vec<TagRecord>,
    tag_pos: OnceCell<HashMap<TagId, usize>>,
    entries: OnceCell<Vec<Entry>>,
    /// Reads the snapshot's entries; taken when they are read.
    deferred: Cell<Option<EntryLoader>>,
    /// Entries applied while the snapshot's were not read yet; they follow them.
    later: Vec<Entry>,
    load_failure: OnceCell<String>,
    entry_pos: OnceCell<HashMap<EntryId, usize>>,
    folded: OnceCell<Folded>,
    /// Reads the aid; taken on first use.
    aid_source: Cell<Option<AidLoader>>,
    /// The aid once read, until all entries are read (then dropped to save memory).
    aid: RefCell<Option<snapshot::Aid>>,
    /// The snapshot entries decoded one by one from the aid, by position.
    single: OnceCell<Box<[OnceCell<Entry>]>>,
    /// The follow-ups the snapshot's entries close, from the aid.
    aid_closed: OnceCell<Vec<EntryId>>,
    /// The reference instruments, each as last defined, in the order first added.
    references: Vec<Reference>,
}

impl std::fmt::Debug for Register {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.debug_struct("Register")
            .field("tags", &self.tags.len())
            .field("entries", &self.entries.get().map(Vec::len))
            .field("load_failure", &self.load_failure.get())
            .finish_non_exhaustive()
    }
}

/// Every entry's text in lower case, one after another with a NUL after each, so one
/// substring search covers the whole log. A needle without NUL never matches across two
/// entries.
#[derive(Debug, Default)]
pub(crate) struct Folded {
    text: Vec<u8>,
    /// Where each entry's text starts in `text`, in entry order.
    starts: Vec<usize>,
}

impl Folded {
    /// Positions of the entries whose text holds `needle` (lower case, no NUL), in order,
    /// each once.
    pub(crate) fn hits<'a>(&'a self, needle: &'a str) -> impl Iterator<Item = usize> + 'a {
        let finder = memchr::memmem::Finder::new(needle.as_bytes());
        let mut from = 0;
        std::iter::from_fn(move || {
            let hit = self.text.get(from..).and_then(|t| finder.find(t))?;
            let at = from + hit;
            // The entry whose text holds the hit; then go on from the next entry's text.
            let i = self.starts.partition_point(|&s| s <= at).saturating_sub(1);
            from = self.starts.get(i + 1).copied().unwrap_or(self.text.len());
            Some(i)
        })
    }

    /// Add one entry's text.
    pub(crate) fn push(&mut self, text: &str) {
        self.starts.push(self.text.len());
        if text.is_ascii() {
            // The same as `to_lowercase` for ASCII, without a string per entry.
            self.text
                .extend(text.bytes().map(|b| b.to_ascii_lowercase()));
        } else {
            self.text.extend_from_slice(text.to_lowercase().as_bytes());
        }
        self.text.push(0);
    }
}

impl Register {
    /// A register with `tags`, whose entries `load` reads when first needed, and whose
    /// snapshot aid `aid` reads when a search or a list can be answered without them.
    pub(crate) fn deferred(tags: Vec<TagRecord>, load: EntryLoader, aid: AidLoader) -> Register {
        Register {
            tags,
            deferred: Cell::new(Some(load)),
            aid_source: Cell::new(Some(aid)),
            ..Register::default()
        }
    }

    /// The snapshot's aid, read on first use; `None` when the entries are read already,
    /// there is no snapshot, or its aid could not be read.
    fn aid(&self) -> Option<Ref<'_, snapshot::Aid>> {
        if self.entries.get().is_some() {
            return None;
        }
        if let Some(load) = self.aid_source.take() {
            if let Some(aid) = load() {
                let _ = self.aid_closed.set(aid.closed.clone());
                let slots: Box<[OnceCell<Entry>]> =
                    (0..aid.len()).map(|_| OnceCell::new()).collect();
                let _ = self.single.set(slots);
                if let Ok(mut a) = self.aid.try_borrow_mut() {
                    *a = Some(aid);
                }
            }
        }
        Ref::filter_map(self.aid.try_borrow().ok()?, Option::as_ref).ok()
    }

    /// Snapshot entry `i`, decoded from the aid once and kept.
    fn single_entry(&self, aid: &snapshot::Aid, i: usize) -> Option<&Entry> {
        let slot = self.single.get()?.get(i)?;
        if slot.get().is_none() {
            let _ = slot.set(aid.entry(i)?);
        }
        slot.get()
    }

    /// Apply one saved record.
    pub fn apply(&mut self, record: Record) {
        match record {
            Record::Tag(t) => {
                self.tag_index();
                let Some(index) = self.tag_pos.get_mut() else {
                    return;
                };
                match index.get(&t.id) {
                    Some(&i) => self.tags[i] = t,
                    None => {
                        index.insert(t.id.clone(), self.tags.len());
                        self.tags.push(t);
                    }
                }
            }
            Record::Entry(e) => {
                if self.entries.get().is_none() {
                    if self.deferred.get_mut().is_some() {
                        self.later.push(e);
                        return;
                    }
                    let _ = self.entries.set(Vec::new());
                }
                let Some(entries) = self.entries.get_mut() else {
                    return;
                };
                if let Some(index) = self.entry_pos.get_mut() {
                    if index.contains_key(&e.id) {
                        return;
                    }
                    index.insert(e.id.clone(), entries.len());
                }
                if let Some(f) = self.folded.get_mut() {
                    f.push(&e.text);
                }
                entries.push(e);
            }
            Record::Reference(r) => match self.references.iter_mut().find(|o| o.is(&r.id)) {
                Some(here) => *here = r,
                None => self.references.push(r),
            },
        }
    }

    /// The reference instruments, each as last defined, in the order first added.
    pub fn references(&self) -> &[Reference] {
        &self.references
    }

    /// Every tag, archived ones included, in the order they were first added.
    pub fn tags(&self) -> &[TagRecord] {
        &self.tags
    }

    /// Every entry in the order it was saved (read now if it was deferred).
    pub fn entries(&self) -> &[Entry] {
        self.entries.get_or_init(|| {
            // Everything is decoded now: the aid's copy of the entries is not needed
            // afterwards, and when it was read its checked bytes are decoded rather than
            // read from the snapshot a second time.
            self.aid_source.take();
            let aid = self.aid.try_borrow_mut().ok().and_then(|mut a| a.take());
            let load = self.deferred.take();
            let mut all = match (aid.and_then(|a| a.all()), load) {
                (Some(v), _) => v,
                (None, None) => Vec::new(),
                (None, Some(load)) => match load() {
                    Ok(v) => v,
                    Err(why) => {
                        let _ = self.load_failure.set(why);
                        Vec::new()
                    }
                },
            };
            all.extend(self.later.iter().cloned());
            all
        })
    }

    /// Why deferred entries could not be read, if that was tried and failed. The register
    /// then holds only the entries saved since it was opened.
    pub fn load_failure(&self) -> Option<&str> {
        self.load_failure.get().map(String::as_str)
    }

    fn tag_index(&self) -> &HashMap<TagId, usize> {
        // Built on first use, like the entry index.
        self.tag_pos.get_or_init(|| {
            let mut m = HashMap::with_capacity(self.tags.len());
            for (i, t) in self.tags.iter().enumerate() {
                m.entry(t.id.clone()).or_insert(i);
            }
            m
        })
    }

    fn entry_index(&self) -> &HashMap<EntryId, usize> {
        // Built on first use so that opening a large store does not pay for it.
        self.entry_pos.get_or_init(|| {
            let entries = self.entries();
            let mut m = HashMap::with_capacity(entries.len());
            for (i, e) in entries.iter().enumerate() {
                m.entry(e.id.clone()).or_insert(i);
            }
            m
        })
    }

    /// Entries matching `query`, in log order: the same answer as [`journal::search`]
    /// over [`Register::entries`]. A text query searches a lower-cased copy of every
    /// entry's text, made on first use and kept up to date.
    pub fn search(&self, query: &Query) -> Vec<&Entry> {
        let Some(needle) = journal::needle(query).filter(|n| !n.contains('\0')) else {
            return journal::search(self.entries(), query);
        };
        if !query.open_only {
            if let Some(found) = self.search_aid(query, &needle) {
                return found;
            }
        }
        let entries = self.entries();
        let folded = self.folded.get_or_init(|| {
            let mut f = Folded {
                text: Vec::with_capacity(entries.iter().map(|e| e.text.len() + 1).sum()),
                starts: Vec::with_capacity(entries.len()),
            };
            for e in entries {
                f.push(&e.text);
            }
            f
        });
        let closed = if query.open_only {
            journal::closed_follow_ups(entries)
        } else {
            HashSet::new()
        };
        folded
            .hits(&needle)
            .filter_map(|i| entries.get(i))
            .filter(|e| journal::passes_filters(e, query, &closed))
            .collect()
    }

    /// A text search (not for open follow-ups) answered from the snapshot's aid and the
    /// entries saved since, decoding only the entries whose text matches. `None` when
    /// there is no aid to use (the caller then reads every entry).
    fn search_aid(&self, query: &Query, needle: &str) -> Option<Vec<&Entry>> {
        let aid = self.aid()?;
        let none = HashSet::new();
        let mut found = Vec::new();
        for i in aid.folded.hits(needle) {
            let e = self.single_entry(&aid, i)?;
            if journal::passes_filters(e, query, &none) {
                found.push(e);
            }
        }
        found.extend(journal::search(&self.later, query));
        Some(found)
    }

    /// Each tag's newest entry (latest time; of equal times, the one saved last), for
    /// every tag that has one. Answered from the snapshot's aid when the entries are not
    /// read yet.
    pub fn newest_by_tag(&self) -> HashMap<&TagId, &Entry> {
        let mut newest: HashMap<&TagId, &Entry> = HashMap::new();
        let from_aid = self.aid().and_then(|aid| {
            let mut found = Vec::with_capacity(aid.newest.len());
            for (t, i) in self.tags.iter().zip(&aid.newest) {
                if let Some(i) = *i {
                    found.push((&t.id, self.single_entry(&aid, i)?));
                }
            }
            Some(found)
        });
        let rest: &[Entry] = match from_aid {
            Some(found) => {
                newest.extend(found);
                &self.later
            }
            None => self.entries(),
        };
        for e in rest {
            if supersedes(e, newest.get(&e.tag).copied()) {
                newest.insert(&e.tag, e);
            }
        }
        newest
    }

    /// Ids of the follow-ups some entry has marked done (see
    /// [`journal::closed_follow_ups`]). Answered from the snapshot's aid when the entries
    /// are not read yet.
    pub fn closed_follow_ups(&self) -> HashSet<&EntryId> {
        if self.aid().is_some() {
            if let Some(closed) = self.aid_closed.get() {
                let mut all: HashSet<&EntryId> = closed.iter().collect();
                all.extend(journal::closed_follow_ups(&self.later));
                return all;
            }
        }
        journal::closed_follow_ups(self.entries())
    }
}

/// For each of `tags`, in order, the position in `entries` of its newest entry (latest
/// time; of equal times, the one saved last), as [`Register::newest_by_tag`] gives it.
pub(crate) fn newest_positions(tags: &[TagRecord], entries: &[Entry]) -> Vec<Option<usize>> {
    let mut newest: HashMap<&TagId, usize> = HashMap::new();
    for (i, e) in entries.iter().enumerate() {
        if supersedes(e, newest.get(&e.tag).map(|&seen| &entries[seen])) {
            newest.insert(&e.tag, i);
        }
    }
    tags.iter().map(|t| newest.get(&t.id).copied()).collect()
}

/// True when `e`, saved after `kept`, takes its place as its tag's newest entry: it is not
/// earlier (of equal times, the one saved last wins).
fn supersedes(e: &Entry, kept: Option<&Entry>) -> bool {
    kept.is_none_or(|k| k.time <= e.time)
}

/// What an import did.
#[derive(Debug, Clone, Default, PartialEq, Serialize)]
pub struct ImportReport {
    /// Tags that were new here and were added.
    pub tags_added: usize,
    /// Entries that were new here and were added.
    pub entries_added: usize,
    /// Entries already here (same id), left as they are.
    pub entries_already_here: usize,
    /// Tags whose definition here differs from the bundle's; the one here was kept.
    pub conflicts: Vec<TagConflict>,
    /// Tags here without a calibration interval that took the bundle's.
    pub intervals_set: usize,
    /// Reference instruments that were new here and were added.
    pub references_added: usize,
    /// Ids of reference instruments defined differently here; the one here was kept.
    pub reference_conflicts: Vec<String>,
}

/// A tag defined differently here and in an imported bundle.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct TagConflict {
    /// Tag number here.
    pub number: String,
    /// What differs, in words.
    pub detail: String,
}

/// Storage for the tag register and the field log.
///
/// Implementors provide the register and [`Store::persist`]; everything else is shared.
/// A method that returns `Ok` has saved durably (for the file store: written and synced).
pub trait Store {
    /// The register as it stands.
    fn register(&self) -> &Register;

    /// Save `records` durably, in order, then apply them to the register. Either all are
    /// acknowledged or an error is returned.
    fn persist(&mut self, records: Vec<Record>) -> StoreResult<()>;

    /// Every tag, archived ones included, in the order they were first added.
    fn tags(&self) -> &[TagRecord] {
        self.register().tags()
    }

    /// Every entry in the order it was saved.
    fn entries(&self) -> &[Entry] {
        self.register().entries()
    }

    /// True when the store holds no tags and no entries.
    fn is_empty(&self) -> bool {
        self.tags().is_empty() && self.entries().is_empty()
    }

    /// The tag with this number: exact match first, then a unique case-insensitive one.
    fn tag(&self, number: &str) -> Option<&TagRecord> {
        let n = number.trim();
        if let Some(t) = self.tags().iter().find(|t| t.tag.number == n) {
            return Some(t);
        }
        let lower = n.to_lowercase();
        let mut matches = self
            .tags()
            .iter()
            .filter(|t| t.tag.number.to_lowercase() == lower);
        match (matches.next(), matches.next()) {
            (Some(t), None) => Some(t),
            _ => None,
        }
    }

    /// The tag with this number, or an input error naming `field`.
    fn require_tag(&self, number: &str) -> StoreResult<&TagRecord> {
        self.tag(number).ok_or_else(|| {
            StoreError::Input(FieldError::new(
                "tag",
                format!(
                    "no tag '{}' in the register; add it first with `loopside tag add`",
                    number.trim()
                ),
            ))
        })
    }

    /// The tag with this id.
    fn tag_by_id(&self, id: &TagId) -> Option<&TagRecord> {
        let r = self.register();
        r.tag_index().get(id).and_then(|&i| r.tags.get(i))
    }

    /// The current number of the tag with this id (or the id itself if unknown).
    fn tag_number(&self, id: &TagId) -> String {
        self.tag_by_id(id)
            .map(|t| t.tag.number.clone())
            .unwrap_or_else(|| format!("(unknown tag {id})"))
    }

    /// The entry with this id.
    fn entry(&self, id: &EntryId) -> Option<&Entry> {
        let r = self.register();
        r.entry_index().get(id).and_then(|&i| r.entries().get(i))
    }

    /// The entry whose id is `text` or starts with it (at least 6 characters, unique).
    fn find_entry(&self, text: &str) -> StoreResult<&Entry> {
        let t = text.trim();
        if let Some(e) = self.entry(&EntryId(t.to_string())) {
            return Ok(e);
        }
        let not_found = |why: &str| StoreError::Input(FieldError::new("id", why.to_string()));
        if t.chars().count() < 6 {
            return Err(not_found(&format!(
                "no entry '{t}'; give the whole id or at least its first 6 characters"
            )));
        }
        let mut found = self.entries().iter().filter(|e| e.id.0.starts_with(t));
        match (found.next(), found.next()) {
            (Some(e), None) => Ok(e),
            (None, _) => Err(not_found(&format!("no entry '{t}' in the log"))),
            _ => Err(not_found(&format!(
                "'{t}' matches more than one entry; give more of the id"
            ))),
        }
    }

    /// Add a new tag; its number must not be in use (archived tags included).
    fn add_tag(&mut self, tag: Tag) -> StoreResult<TagId> {
        tag.validate()?;
        if let Some(other) = self.tags().iter().find(|t| t.tag.number == tag.number) {
            return Err(FieldError::new(
                "tag",
                format!(
                    "'{}' is already in the register{}",
                    other.tag.number,
                    if other.tag.archived {
                        " (archived)"
                    } else {
                        ""
                    }
                ),
            )
            .into());
        }
        let id = TagId::generate(Utc::now());
        self.persist(vec![Record::Tag(TagRecord {
            id: id.clone(),
            tag,
        })])?;
        Ok(id)
    }

    /// Save a changed definition for tag `id` (edit, rename, archive). A new number must
    /// not be in use by another tag.
    fn update_tag(&mut self, id: &TagId, tag: Tag) -> StoreResult<()> {
        tag.validate()?;
        let Some(current) = self.tag_by_id(id) else {
            return Err(FieldError::new("tag", format!("no tag with id {id}")).into());
        };
        if current.tag == tag {
            return Ok(());
        }
        if let Some(other) = self
            .tags()
            .iter()
            .find(|t| t.tag.number == tag.number && &t.id != id)
        {
            return Err(FieldError::new(
                "new number",
                format!("'{}' is already in the register", other.tag.number),
            )
            .into());
        }
        self.persist(vec![Record::Tag(TagRecord {
            id: id.clone(),
            tag,
        })])
    }

    /// Give a tag a new number; its log entries follow (they refer to its id).
    fn rename_tag(&mut self, number: &str, new_number: &str) -> StoreResult<()> {
        let new_number = clean_number(new_number).map_err(|e| e.renamed("new number"))?;
        let record = self.require_tag(number)?.clone();
        let mut tag = record.tag;
        tag.number = new_number;
        self.update_tag(&record.id, tag)
    }

    /// Archive (or restore) a tag: it leaves the working list, keeps its log.
    fn set_archived(&mut self, number: &str, archived: bool) -> StoreResult<()> {
        let record = self.require_tag(number)?.clone();
        let mut tag = record.tag;
        tag.archived = archived;
        self.update_tag(&record.id, tag)
    }

    /// Save one entry; returns its id once it is durable. The tag must exist, the id must
    /// be new, and a `refers_to` must name an entry in the log.
    fn append(&mut self, entry: Entry) -> StoreResult<EntryId> {
        self.check_entry(&entry)?;
        let id = entry.id.clone();
        self.persist(vec![Record::Entry(entry)])?;
        Ok(id)
    }

    /// The reference instruments, each as last defined.
    fn references(&self) -> &[Reference] {
        self.register().references()
    }

    /// The reference instrument with this id (matched without regard to case).
    fn reference(&self, id: &str) -> Option<&Reference> {
        self.references().iter().find(|r| r.is(id))
    }

    /// The reference instrument with this id, or an error naming `reference` that lists
    /// the ids there are.
    fn require_reference(&self, id: &str) -> StoreResult<&Reference> {
        self.reference(id).ok_or_else(|| {
            let ids: Vec<&str> = self.references().iter().map(|r| r.id.as_str()).collect();
            let known = if ids.is_empty() {
                "there are none yet; add one with `ref add`".to_string()
            } else {
                format!("there are {}", ids.join(", "))
            };
            FieldError::new(
                "reference",
                format!("no reference instrument '{}'; {known}", id.trim()),
            )
            .into()
        })
    }

    /// Save a reference instrument (new, or a new definition of one with the same id);
    /// durable once it returns. Its fields are checked first.
    fn save_reference(&mut self, reference: Reference) -> StoreResult<()> {
        reference.validate()?;
        self.persist(vec![Record::Reference(reference)])
    }

    /// Check an entry against the register before saving it.
    fn check_entry(&self, entry: &Entry) -> StoreResult<()> {
        entry.validate()?;
        if self.tag_by_id(&entry.tag).is_none() {
            return Err(FieldError::new("tag", format!("no tag with id {}", entry.tag)).into());
        }
        if self.entry(&entry.id).is_some() {
            return Err(
                FieldError::new("id", format!("{} is already in the log", entry.id)).into(),
            );
        }
        if let Some(r) = &entry.refers_to {
            if self.entry(r).is_none() {
                return Err(
                    FieldError::new("refers_to", format!("no entry {r} in the log")).into(),
                );
            }
        }
        Ok(())
    }

    /// Entries matching `query`, in log order.
    fn search(&self, query: &Query) -> Vec<&Entry> {
        self.register().search(query)
    }

    /// Each tag's newest entry (see [`Register::newest_by_tag`]).
    fn newest_by_tag(&self) -> HashMap<&TagId, &Entry> {
        self.register().newest_by_tag()
    }

    /// Ids of the follow-ups some entry has marked done (see
    /// [`Register::closed_follow_ups`]).
    fn closed_follow_ups(&self) -> HashSet<&EntryId> {
        self.register().closed_follow_ups()
    }

    /// Merge a bundle from another device. Entries are matched by id: ones already here
    /// are skipped, so importing the same bundle twice adds nothing. A bundle tag that
    /// matches a tag here (same id, or same number) is used as that tag; if its
    /// definition differs, the one here is kept and the difference is reported.
    fn import(&mut self, bundle: &Bundle) -> StoreResult<ImportReport> {
        let mut report = ImportReport::default();
        let mut records = Vec::new();
        let mut map: HashMap<TagId, TagId> = HashMap::new();
        // A bundle defines each tag once: two definitions of one id, or two ids under one
        // number, would leave the register unsure which tag a number or id means.
        let mut first_id: HashMap<&TagId, usize> = HashMap::new();
        let mut first_number: HashMap<&str, usize> = HashMap::new();
        for (i, t) in bundle.tags.iter().enumerate() {
            let twice = |first: usize, what: String| {
                FieldError::new("bundle", format!("tags {} and {} {what}", first + 1, i + 1))
            };
            if let Some(&first) = first_id.get(&t.id) {
                return Err(twice(first, format!("both have id {}", t.id)).into());
            }
            if let Some(&first) = first_number.get(t.tag.number.as_str()) {
                return Err(twice(first, format!("are both numbered '{}'", t.tag.number)).into());
            }
            first_id.insert(&t.id, i);
            first_number.insert(&t.tag.number, i);
        }
        for (i, incoming) in bundle.tags.iter().enumerate() {
            incoming.tag.validate().map_err(|e| {
                FieldError::new(
                    "bundle",
                    format!(
                        "tag {} (id {}, number '{}') is not valid: {e}",
                        i + 1,
                        incoming.id,
                        incoming.tag.number
                    ),
                )
            })?;
            let here = self
                .tag_by_id(&incoming.id)
                .or_else(|| {
                    self.tags()
                        .iter()
                        .find(|t| t.tag.number == incoming.tag.number)
                })
                .cloned();
            match here {
                Some(here) => {
                    // A planner's bundle sets calibration intervals: a tag here with none,
                    // and otherwise defined as in the bundle, takes the bundle's (an
                    // interval set here, or a tag defined differently, is kept).
                    let mut with_interval = here.tag.clone();
                    with_interval.calibration_interval_days =
                        incoming.tag.calibration_interval_days;
                    if here.tag.calibration_interval_days.is_none()
                        && incoming.tag.calibration_interval_days.is_some()
                        && with_interval == incoming.tag
                    {
                        records.push(Record::Tag(TagRecord {
                            id: here.id.clone(),
                            tag: with_interval,
                        }));
                        report.intervals_set += 1;
                    } else if here.tag != incoming.tag {
                        report.conflicts.push(TagConflict {
                            number: here.tag.number.clone(),
                            detail: describe_difference(&here.tag, &incoming.tag),
                        });
                    }
                    map.insert(incoming.id.clone(), here.id.clone());
                }
                None => {
                    map.insert(incoming.id.clone(), incoming.id.clone());
                    records.push(Record::Tag(incoming.clone()));
                    report.tags_added += 1;
                }
            }
        }
        let mut seen = HashSet::new();
        for (i, e) in bundle.entries.iter().enumerate() {
            if self.entry(&e.id).is_some() || !seen.insert(e.id.clone()) {
                report.entries_already_here += 1;
                continue;
            }
            let mut e = e.clone();
            match map.get(&e.tag) {
                Some(local) => e.tag = local.clone(),
                None if self.tag_by_id(&e.tag).is_some() => {}
                None => {
                    return Err(FieldError::new(
                        "bundle",
                        format!(
                            "entry {} (id {}), field tag: {} is not a tag the bundle defines or this register holds",
                            i + 1,
                            e.id,
                            e.tag
                        ),
                    )
                    .into())
                }
            }
            e.validate().map_err(|err| {
                FieldError::new(
                    "bundle",
                    format!("entry {} (id {}), field {err}", i + 1, e.id),
                )
            })?;
            records.push(Record::Entry(e));
            report.entries_added += 1;
        }
        for (i, r) in bundle.references.iter().enumerate() {
            r.validate().map_err(|e| {
                FieldError::new(
                    "bundle",
                    format!("reference {} (id {}) is not valid: {e}", i + 1, r.id),
                )
            })?;
            let earlier = bundle.references[..i].iter().any(|o| o.is(&r.id));
            match self.reference(&r.id) {
                _ if earlier => {
                    return Err(FieldError::new(
                        "bundle",
                        format!("reference {} (id {}) is defined twice", i + 1, r.id),
                    )
                    .into())
                }
                Some(here) if here == r => {}
                Some(_) => report.reference_conflicts.push(r.id.clone()),
                None => {
                    records.push(Record::Reference(r.clone()));
                    report.references_added += 1;
                }
            }
        }
        if !records.is_empty() {
            self.persist(records)?;
        }
        Ok(report)
    }
}

/// The fields that differ between two definitions of a tag, in words.
fn describe_difference(here: &Tag, there: &Tag) -> String {
    let mut parts = Vec::new();
    if here.number != there.number {
        parts.push(format!("number '{}' vs '{}'", here.number, there.number));
    }
    if here.service != there.service {
        parts.push(format!("service '{}' vs '{}'", here.service, there.service));
    }
    if here.area != there.area {
        parts.push("area".to_string());
    }
    if here.scale != there.scale {
        parts.push(format!(
            "range {}..{} {} vs {}..{} {}",
            here.scale.lrv,
            here.scale.urv,
            here.scale.unit,
            there.scale.lrv,
            there.scale.urv,
            there.scale.unit
        ));
    }
    if here.loop_config != there.loop_config {
        parts.push("loop".to_string());
    }
    if here.hart != there.hart {
        parts.push("HART".to_string());
    }
    if here.tolerance_percent != there.tolerance_percent {
        parts.push("tolerance".to_string());
    }
    if here.bands != there.bands {
        parts.push("signal bands".to_string());
    }
    if here.notes != there.notes {
        parts.push("notes".to_string());
    }
    if here.archived != there.archived {
        parts.push("archived".to_string());
    }
    if here.calibration_interval_days != there.calibration_interval_days {
        parts.push("calibration interval".to_string());
    }
    format!("differs in {}; kept the definition here", parts.join(", "))
}

/// A store that lives only in memory: for tests, previews and the UI's first draft.
#[derive(Debug, Default)]
pub struct MemoryStore {
    register: Register,
}

impl MemoryStore {
    /// An empty store.
    pub fn new() -> MemoryStore {
        MemoryStore::default()
    }
}

impl Store for MemoryStore {
    fn register(&self) -> &Register {
        &self.register
    }

    fn persist(&mut self, records: Vec<Record>) -> StoreResult<()> {
        for r in records {
            self.register.apply(r);
        }
        Ok(())
    }
}
