//! The snapshot: a cache of the register that makes opening a large store quick.
//!
//! `loopside.snapshot` holds the tags and entries as they stood after the first
//! `covered` bytes of the journal, in a form that is cheap to read back. On open the
//! snapshot is checked against the journal and, if it fits, its tags are loaded and only
//! the journal after `covered` is read; its entries are read the first time the log is
//! needed. The journal stays the only record: the snapshot is written from it, may be
//! deleted at any time, and whenever it does not fit (damaged, stale, foreign, from
//! another version) the whole journal is read as before.
//!
//! Layout, all integers little-endian:
//!
//! - 16 bytes [`MAGIC`], then fifteen `u64`: format version, journal schema, covered
//!   journal length, the length and check value of the journal's first bytes (up to 4
//!   KiB), the length and check value of the last bytes before `covered` (up to 4 KiB),
//!   the tag count, the length and check value of the tags section, the entry count, the
//!   length and check value of the entries section, the length and check value of the
//!   aid section; then a `u64` check value of everything before it. Check values are
//!   [`check`].
//! - The tags section: for each tag its id, then its definition as JSON, leaving out the
//!   fields that hold the value they take when missing (each a `u32` byte length and
//!   UTF-8).
//! - The entries section: each entry in a compact binary form (see `put_entry`).
//! - The aid section (format 2): what the first text search, the Tags list and the list of
//!   open follow-ups need without decoding every entry: every entry's text in lower case,
//!   each followed by a NUL (a `u64` length first); where each entry starts in the entries
//!   section (one `u64` each); for each tag, in tag order, the position of its newest
//!   entry (`u64::MAX` for none); and the ids of the follow-ups some entry has closed (a
//!   `u64` count, then each id).
//!
//! It is written like every whole file here: a temporary file, synced, renamed over the
//! old one, the folder synced. A crash leaves the old snapshot, the new one, or none (and
//! perhaps a temporary file, removed on the next open), never half of one.

use super::record::{check, write_atomically, SCHEMA_VERSION};
use super::{Folded, TagRecord};
use crate::journal::{Entry, EntryId, FollowUpStatus, Kind, TagId};
use crate::tag::Tag;
use chrono::{DateTime, FixedOffset};
use serde_json::{Map, Value};
use std::fs::{self, File};
use std::io::{self, Read, Seek, SeekFrom};
use std::path::{Path, PathBuf};

/// Name of the snapshot file in the data folder.
pub const SNAPSHOT_FILE: &str = "loopside.snapshot";

/// When this many journal bytes are not covered by the snapshot, a new snapshot is
/// written on open and on close. Reading that much journal takes about a millisecond.
pub const SNAPSHOT_TAIL_BYTES: u64 = 64 * 1024;

/// The first bytes of every snapshot file.
pub const MAGIC: &[u8; 16] = b"loopside-snap\n\0\0";

/// The snapshot layout this build reads and writes; any other is ignored (a format-1
/// snapshot, without the aid section, is then rewritten from the journal).
const FORMAT: u64 = 2;

/// How many journal bytes at each end are checked against the snapshot.
const EDGE: u64 = 4096;

const FIELDS: usize = 15;
const HEADER_LEN: usize = MAGIC.len() + FIELDS * 8 + 8;

/// The fixed-size start of the file.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
struct Head {
    format: u64,
    schema: u64,
    covered: u64,
    first_len: u64,
    first_check: u64,
    last_len: u64,
    last_check: u64,
    tag_count: u64,
    tags_len: u64,
    tags_check: u64,
    entry_count: u64,
    entries_len: u64,
    entries_check: u64,
    aid_len: u64,
    aid_check: u64,
}

impl Head {
    fn fields(&self) -> [u64; FIELDS] {
        [
            self.format,
            self.schema,
            self.covered,
            self.first_len,
            self.first_check,
            self.last_len,
            self.last_check,
            self.tag_count,
            self.tags_len,
            self.tags_check,
            self.entry_count,
            self.entries_len,
            self.entries_check,
            self.aid_len,
            self.aid_check,
        ]
    }

    fn encode(&self) -> [u8; HEADER_LEN] {
        let mut out = [0u8; HEADER_LEN];
        out[..MAGIC.len()].copy_from_slice(MAGIC);
        for (i, v) in self.fields().iter().enumerate() {
            let at = MAGIC.len() + i * 8;
            out[at..at + 8].copy_from_slice(&v.to_le_bytes());
        }
        let sum = check(&out[..HEADER_LEN - 8]);
        out[HEADER_LEN - 8..].copy_from_slice(&sum.to_le_bytes());
        out
    }

    fn decode(bytes: &[u8; HEADER_LEN]) -> Option<Head> {
        if &bytes[..MAGIC.len()] != MAGIC {
            return None;
        }
        let word = |at: usize| {
            let mut w = [0u8; 8];
            w.copy_from_slice(&bytes[at..at + 8]);
            u64::from_le_bytes(w)
        };
        if check(&bytes[..HEADER_LEN - 8]) != word(HEADER_LEN - 8) {
            return None;
        }
        let f = |i: usize| word(MAGIC.len() + i * 8);
        Some(Head {
            format: f(0),
            schema: f(1),
            covered: f(2),
            first_len: f(3),
            first_check: f(4),
            last_len: f(5),
            last_check: f(6),
            tag_count: f(7),
            tags_len: f(8),
            tags_check: f(9),
            entry_count: f(10),
            entries_len: f(11),
            entries_check: f(12),
            aid_len: f(13),
            aid_check: f(14),
        })
    }
}

/// Read `len` bytes at `at` from `file`.
fn read_at(mut file: &File, at: u64, len: u64) -> io::Result<Vec<u8>> {
    let len = usize::try_from(len).map_err(io::Error::other)?;
    let mut buf = vec![0u8; len];
    file.seek(SeekFrom::Start(at))?;
    file.read_exact(&mut buf)?;
    Ok(buf)
}

/// The check values of the journal's first bytes and of the last bytes before
/// `covered`: (first_len, first_check, last_len, last_check).
fn journal_edges(journal: &File, covered: u64) -> io::Result<(u64, u64, u64, u64)> {
    let first_len = covered.min(EDGE);
    let first = read_at(journal, 0, first_len)?;
    let last_len = covered.min(EDGE);
    let last = read_at(journal, covered - last_len, last_len)?;
    Ok((first_len, check(&first), last_len, check(&last)))
}

/// A snapshot that fits the journal: its tags, and where its entries are.
pub(super) struct Loaded {
    /// The tags, in register order.
    pub tags: Vec<TagRecord>,
    /// Journal bytes the snapshot covers; the journal after them is still to be read.
    pub covered: u64,
    /// Reads the snapshot's entries (see [`Pending::read`]).
    pub entries: Pending,
}

/// The entries and aid sections of a snapshot that was found to fit, not read yet.
pub(crate) struct Pending {
    file: File,
    at: u64,
    head: Head,
}

impl Pending {
    /// Read and check the entries section's bytes.
    fn entry_bytes(&self) -> Option<Vec<u8>> {
        let bytes = read_at(&self.file, self.at, self.head.entries_len).ok()?;
        (check(&bytes) == self.head.entries_check).then_some(bytes)
    }

    /// Read and check the entries. `None` when they cannot be read or fail their check.
    pub fn read(&self) -> Option<Vec<Entry>> {
        decode_entries(&self.entry_bytes()?, self.head.entry_count)
    }

    /// Read and check the entries section and the aid section, for reading single
    /// entries and searching without decoding them all. `None` when either cannot be read
    /// or fails its check, or the aid does not fit the entries.
    pub fn aid(&self, tag_count: usize) -> Option<Aid> {
        let entries = self.entry_bytes()?;
        let bytes = read_at(
            &self.file,
            self.at + self.head.entries_len,
            self.head.aid_len,
        )
        .ok()?;
        if check(&bytes) != self.head.aid_check {
            return None;
        }
        decode_aid(&bytes, entries, self.head.entry_count, tag_count)
    }
}

/// A snapshot's entries, undecoded, with what finds and reads one of them.
pub(crate) struct Aid {
    /// The entries section.
    entries: Vec<u8>,
    /// Where each entry starts in `entries`.
    offsets: Vec<usize>,
    /// Every entry's lower-cased text, NUL after each.
    pub folded: Folded,
    /// For each snapshot tag, in tag order, the position of its newest entry.
    pub newest: Vec<Option<usize>>,
    /// Ids of the follow-ups some snapshot entry has closed.
    pub closed: Vec<EntryId>,
}

impl Aid {
    /// How many entries the snapshot holds.
    pub fn len(&self) -> usize {
        self.offsets.len()
    }

    /// Decode every entry; `None` if they do not all decode.
    pub fn all(&self) -> Option<Vec<Entry>> {
        decode_entries(&self.entries, self.offsets.len() as u64)
    }

    /// Decode entry `i`; `None` if there is no such entry or it does not decode.
    pub fn entry(&self, i: usize) -> Option<Entry> {
        let pos = *self.offsets.get(i)?;
        let mut r = Reader {
            bytes: &self.entries,
            pos,
        };
        r.entry()
    }
}

/// The aid section for `entries` (whose section starts are `offsets`) and `tags`.
fn encode_aid(tags: &[TagRecord], entries: &[Entry], offsets: &[usize]) -> Vec<u8> {
    let mut folded = Folded::default();
    for e in entries {
        folded.push(&e.text);
    }
    let mut out = Vec::with_capacity(folded.text.len() + entries.len() * 8 + tags.len() * 8 + 64);
    out.extend_from_slice(&(folded.text.len() as u64).to_le_bytes());
    out.extend_from_slice(&folded.text);
    for &o in offsets {
        out.extend_from_slice(&(o as u64).to_le_bytes());
    }
    let newest = super::newest_positions(tags, entries);
    for n in newest {
        let v = n.map_or(u64::MAX, |i| i as u64);
        out.extend_from_slice(&v.to_le_bytes());
    }
    let closed = crate::journal::closed_follow_ups(entries);
    let mut closed: Vec<&EntryId> = closed.into_iter().collect();
    closed.sort();
    out.extend_from_slice(&(closed.len() as u64).to_le_bytes());
    for id in closed {
        put_str(&mut out, &id.0);
    }
    out
}

/// Read an aid section made for `count` entries and `tag_count` tags; `None` unless it
/// holds exactly that and every position fits.
fn decode_aid(bytes: &[u8], entries: Vec<u8>, count: u64, tag_count: usize) -> Option<Aid> {
    let count = usize::try_from(count).ok()?;
    let mut r = Reader { bytes, pos: 0 };
    let folded_len = usize::try_from(u64::from_le_bytes(r.array()?)).ok()?;
    let text = r.take(folded_len)?.to_vec();
    let mut starts = Vec::with_capacity(count.min(text.len() + 1));
    let mut at = 0;
    for end in memchr::memchr_iter(0, &text) {
        starts.push(at);
        at = end + 1;
    }
    if starts.len() != count || at != text.len() {
        return None;
    }
    let mut offsets = Vec::with_capacity(count);
    for _ in 0..count {
        let o = usize::try_from(u64::from_le_bytes(r.array()?)).ok()?;
        if o >= entries.len() || offsets.last().is_some_and(|&p| p >= o) {
            return None;
        }
        offsets.push(o);
    }
    let mut newest = Vec::with_capacity(tag_count);
    for _ in 0..tag_count {
        let v = u64::from_le_bytes(r.array()?);
        newest.push(if v == u64::MAX {
            None
        } else {
            let i = usize::try_from(v).ok()?;
            if i >= count {
                return None;
            }
            Some(i)
        });
    }
    let closed_count = u64::from_le_bytes(r.array()?);
    let mut closed = Vec::new();
    for _ in 0..closed_count {
        closed.push(EntryId(r.str()?.to_owned()));
    }
    if r.pos != bytes.len() {
        return None;
    }
    Some(Aid {
        entries,
        offsets,
        folded: Folded { text, starts },
        newest,
        closed,
    })
}

/// The snapshot in `folder`, if there is one and it fits the journal (open as `journal`,
/// `journal_len` bytes long). Anything wrong with it gives `None`: the caller then reads
/// the whole journal.
pub(super) fn load(folder: &Path, journal: &mut File, journal_len: u64) -> Option<Loaded> {
    let mut file = File::open(folder.join(SNAPSHOT_FILE)).ok()?;
    let mut raw = [0u8; HEADER_LEN];
    file.read_exact(&mut raw).ok()?;
    let head = Head::decode(&raw)?;
    let file_len = file.metadata().ok()?.len();
    let fits = head.format == FORMAT
        && head.schema == u64::from(SCHEMA_VERSION)
        && head.covered > 0
        && head.covered <= journal_len
        && head
            .tags_len
            .checked_add(head.entries_len)
            .and_then(|n| n.checked_add(head.aid_len))
            .and_then(|n| n.checked_add(HEADER_LEN as u64))
            == Some(file_len);
    if !fits {
        return None;
    }
    let edges = journal_edges(journal, head.covered).ok()?;
    if edges
        != (
            head.first_len,
            head.first_check,
            head.last_len,
            head.last_check,
        )
    {
        return None;
    }
    let tags_bytes = read_at(&file, HEADER_LEN as u64, head.tags_len).ok()?;
    if check(&tags_bytes) != head.tags_check {
        return None;
    }
    let tags = decode_tags(&tags_bytes, head.tag_count)?;
    Some(Loaded {
        tags,
        covered: head.covered,
        entries: Pending {
            file,
            at: HEADER_LEN as u64 + head.tags_len,
            head,
        },
    })
}

/// Write a snapshot of `tags` and `entries`, which are the register after the first
/// `covered` bytes of the journal at `journal_path`. The snapshot is written only if
/// reading it back gives exactly these tags and entries.
pub(super) fn write(
    folder: &Path,
    journal_path: &Path,
    covered: u64,
    tags: &[TagRecord],
    entries: &[Entry],
) -> io::Result<PathBuf> {
    let journal = File::open(journal_path)?;
    if journal.metadata()?.len() < covered || covered == 0 {
        return Err(io::Error::other("the journal is shorter than the register"));
    }
    let (first_len, first_check, last_len, last_check) = journal_edges(&journal, covered)?;
    let tags_part = encode_tags(tags)?;
    let (mut body, offsets) = encode_entries_at(entries);
    let mut aid = encode_aid(tags, entries, &offsets);
    if decode_tags(&tags_part, tags.len() as u64).as_deref() != Some(tags)
        || !same_entries(
            decode_entries(&body, entries.len() as u64).as_deref(),
            entries,
        )
        || decode_aid(&aid, body.clone(), entries.len() as u64, tags.len()).is_none()
    {
        return Err(io::Error::other(
            "the register does not read back the same from a snapshot",
        ));
    }
    let head = Head {
        format: FORMAT,
        schema: u64::from(SCHEMA_VERSION),
        covered,
        first_len,
        first_check,
        last_len,
        last_check,
        tag_count: tags.len() as u64,
        tags_len: tags_part.len() as u64,
        tags_check: check(&tags_part),
        entry_count: entries.len() as u64,
        entries_len: body.len() as u64,
        entries_check: check(&body),
        aid_len: aid.len() as u64,
        aid_check: check(&aid),
    };
    let mut out = Vec::with_capacity(HEADER_LEN + tags_part.len() + body.len() + aid.len());
    out.extend_from_slice(&head.encode());
    out.extend_from_slice(&tags_part);
    out.append(&mut body);
    out.append(&mut aid);
    let path = folder.join(SNAPSHOT_FILE);
    write_atomically(&path, &out)?;
    Ok(path)
}

/// Equal entries, local offsets included (`DateTime` equality compares instants only).
fn same_entries(got: Option<&[Entry]>, want: &[Entry]) -> bool {
    got.is_some_and(|got| {
        got.len() == want.len()
            && got
                .iter()
                .zip(want)
                .all(|(a, b)| a == b && a.time.offset() == b.time.offset())
    })
}

/// Remove temporary files a crash while writing a snapshot may have left in `folder`.
/// Only the holder of the folder's lock calls this, so no such file is being written.
pub(super) fn remove_leftovers(folder: &Path) {
    let prefix = format!(".{SNAPSHOT_FILE}.tmp-");
    let Ok(dir) = fs::read_dir(folder) else {
        return;
    };
    for item in dir.flatten() {
        if item.file_name().to_string_lossy().starts_with(&prefix) {
            let _ = fs::remove_file(item.path());
        }
    }
}

// Entry encoding: id, tag, time, author, kind, text, then flags and the optional parts.
// Strings are a u32 byte length and UTF-8. The time is seconds, nanoseconds and offset
// seconds, or (when those would not give back exactly the same time) the JSON string the
// journal writes.

const TIME_PARTS: u8 = 0;
const TIME_TEXT: u8 = 1;
const HAS_PAYLOAD: u8 = 1;
const HAS_REFERS_TO: u8 = 2;
const STATUS_OPEN: u8 = 4;
const STATUS_DONE: u8 = 8;

fn put_str(out: &mut Vec<u8>, s: &str) {
    // Entry fields are far below 4 GiB (text is at most 20,000 characters); a longer one
    // is cut to a length that then fails the read-back comparison, so no snapshot is kept.
    let len = u32::try_from(s.len()).unwrap_or(u32::MAX);
    out.extend_from_slice(&len.to_le_bytes());
    out.extend_from_slice(&s.as_bytes()[..len as usize]);
}

fn time_from_parts(secs: i64, nanos: u32, offset: i32) -> Option<DateTime<FixedOffset>> {
    let offset = FixedOffset::east_opt(offset)?;
    Some(DateTime::from_timestamp(secs, nanos)?.with_timezone(&offset))
}

fn put_entry(out: &mut Vec<u8>, e: &Entry) {
    put_str(out, &e.id.0);
    put_str(out, &e.tag.0);
    let (secs, nanos, offset) = (
        e.time.timestamp(),
        e.time.timestamp_subsec_nanos(),
        e.time.offset().local_minus_utc(),
    );
    let exact = time_from_parts(secs, nanos, offset)
        .is_some_and(|t| t == e.time && t.offset() == e.time.offset());
    let time_text = if exact {
        None
    } else {
        serde_json::to_string(&e.time).ok()
    };
    match &time_text {
        None => {
            out.push(TIME_PARTS);
            out.extend_from_slice(&secs.to_le_bytes());
            out.extend_from_slice(&nanos.to_le_bytes());
            out.extend_from_slice(&offset.to_le_bytes());
        }
        Some(t) => {
            out.push(TIME_TEXT);
            put_str(out, t);
        }
    }
    put_str(out, &e.author);
    let kind = Kind::ALL.iter().position(|k| *k == e.kind).unwrap_or(0);
    out.push(kind as u8);
    put_str(out, &e.text);
    let payload = e.payload.as_ref().map(serde_json::Value::to_string);
    let mut flags = 0;
    if payload.is_some() {
        flags |= HAS_PAYLOAD;
    }
    if e.refers_to.is_some() {
        flags |= HAS_REFERS_TO;
    }
    match e.status {
        Some(FollowUpStatus::Open) => flags |= STATUS_OPEN,
        Some(FollowUpStatus::Done) => flags |= STATUS_DONE,
        None => {}
    }
    out.push(flags);
    if let Some(p) = &payload {
        put_str(out, p);
    }
    if let Some(r) = &e.refers_to {
        put_str(out, &r.0);
    }
}

/// The tags section for `tags`.
fn encode_tags(tags: &[TagRecord]) -> io::Result<Vec<u8>> {
    let defaults = tags
        .first()
        .map(|t| field_defaults(&t.tag))
        .unwrap_or_default();
    let mut out = Vec::with_capacity(tags.len() * 256);
    for t in tags {
        put_str(&mut out, &t.id.0);
        put_str(&mut out, &short_json(&t.tag, &defaults)?);
    }
    Ok(out)
}

/// The value each field of a tag's JSON takes when it is left out, for the fields that
/// may be left out (found by leaving each out of `sample` in turn).
fn field_defaults(sample: &Tag) -> Map<String, Value> {
    let mut defaults = Map::new();
    let Ok(Value::Object(fields)) = serde_json::to_value(sample) else {
        return defaults;
    };
    for key in fields.keys() {
        let mut fewer = fields.clone();
        fewer.remove(key);
        let back = serde_json::from_value::<Tag>(Value::Object(fewer))
            .and_then(|t| serde_json::to_value(&t));
        if let Ok(Value::Object(back)) = back {
            if let Some(v) = back.get(key) {
                defaults.insert(key.clone(), v.clone());
            }
        }
    }
    defaults
}

/// `tag` as JSON without the fields that hold their default value: less to read when the
/// snapshot is opened. The full JSON when the short one does not read back the same.
fn short_json(tag: &Tag, defaults: &Map<String, Value>) -> io::Result<String> {
    if let Ok(Value::Object(mut fields)) = serde_json::to_value(tag) {
        fields.retain(|k, v| defaults.get(k) != Some(v));
        let short = serde_json::to_string(&fields).map_err(io::Error::other)?;
        if serde_json::from_str::<Tag>(&short).ok().as_ref() == Some(tag) {
            return Ok(short);
        }
    }
    serde_json::to_string(tag).map_err(io::Error::other)
}

/// Read `count` tags from a tags section: `None` unless it holds exactly that.
fn decode_tags(bytes: &[u8], count: u64) -> Option<Vec<TagRecord>> {
    let mut r = Reader { bytes, pos: 0 };
    // Every tag takes at least 8 bytes, so a damaged count cannot ask for a huge
    // allocation.
    let mut out = Vec::with_capacity(usize::try_from(count).ok()?.min(bytes.len() / 8));
    for _ in 0..count {
        let id = TagId(r.str()?.to_owned());
        let tag = serde_json::from_str(r.str()?).ok()?;
        out.push(TagRecord { id, tag });
    }
    (r.pos == bytes.len()).then_some(out)
}

/// The entries section for `entries`.
#[cfg(test)]
fn encode_entries(entries: &[Entry]) -> Vec<u8> {
    encode_entries_at(entries).0
}

/// The entries section for `entries`, and where each entry starts in it.
fn encode_entries_at(entries: &[Entry]) -> (Vec<u8>, Vec<usize>) {
    let mut out = Vec::with_capacity(entries.iter().map(|e| e.text.len() + 96).sum());
    let mut offsets = Vec::with_capacity(entries.len());
    for e in entries {
        offsets.push(out.len());
        put_entry(&mut out, e);
    }
    (out, offsets)
}

/// Reads the entries section, failing (`None`) on anything out of place.
struct Reader<'a> {
    bytes: &'a [u8],
    pos: usize,
}

impl<'a> Reader<'a> {
    fn take(&mut self, n: usize) -> Option<&'a [u8]> {
        let end = self.pos.checked_add(n)?;
        let s = self.bytes.get(self.pos..end)?;
        self.pos = end;
        Some(s)
    }

    fn array<const N: usize>(&mut self) -> Option<[u8; N]> {
        self.take(N)?.try_into().ok()
    }

    fn byte(&mut self) -> Option<u8> {
        Some(self.array::<1>()?[0])
    }

    fn str(&mut self) -> Option<&'a str> {
        let len = u32::from_le_bytes(self.array()?) as usize;
        std::str::from_utf8(self.take(len)?).ok()
    }

    fn entry(&mut self) -> Option<Entry> {
        let id = EntryId(self.str()?.to_owned());
        let tag = TagId(self.str()?.to_owned());
        let time = match self.byte()? {
            TIME_PARTS => {
                let secs = i64::from_le_bytes(self.array()?);
                let nanos = u32::from_le_bytes(self.array()?);
                let offset = i32::from_le_bytes(self.array()?);
                time_from_parts(secs, nanos, offset)?
            }
            TIME_TEXT => serde_json::from_str(self.str()?).ok()?,
            _ => return None,
        };
        let author = self.str()?.to_owned();
        let kind = *Kind::ALL.get(usize::from(self.byte()?))?;
        let text = self.str()?.to_owned();
        let flags = self.byte()?;
        if flags & !(HAS_PAYLOAD | HAS_REFERS_TO | STATUS_OPEN | STATUS_DONE) != 0 {
            return None;
        }
        let status = match (flags & STATUS_OPEN != 0, flags & STATUS_DONE != 0) {
            (false, false) => None,
            (true, false) => Some(FollowUpStatus::Open),
            (false, true) => Some(FollowUpStatus::Done),
            (true, true) => return None,
        };
        let payload = if flags & HAS_PAYLOAD != 0 {
            Some(serde_json::from_str(self.str()?).ok()?)
        } else {
            None
        };
        let refers_to = if flags & HAS_REFERS_TO != 0 {
            Some(EntryId(self.str()?.to_owned()))
        } else {
            None
        };
        Some(Entry {
            id,
            tag,
            time,
            author,
            kind,
            text,
            payload,
            status,
            refers_to,
        })
    }
}

/// Read `count` entries from an entries section: `None` unless it holds exactly that.
fn decode_entries(bytes: &[u8], count: u64) -> Option<Vec<Entry>> {
    let mut r = Reader { bytes, pos: 0 };
    // Every entry takes at least 20 bytes, so a damaged count cannot ask for a huge
    // allocation.
    let mut out = Vec::with_capacity(usize::try_from(count).ok()?.min(bytes.len() / 20));
    for _ in 0..count {
        out.push(r.entry()?);
    }
    (r.pos == bytes.len()).then_some(out)
}

#[cfg(test)]
mod tests {
    use super::*;
    use proptest::prelude::*;

    fn json() -> impl Strategy<Value = serde_json::Value> {
        let leaf = prop_oneof![
            Just(serde_json::Value::Null),
            any::<bool>().prop_map(serde_json::Value::from),
            any::<i64>().prop_map(serde_json::Value::from),
            any::<u64>().prop_map(serde_json::Value::from),
            any::<f64>()
                .prop_filter("finite", |f| f.is_finite())
                .prop_map(serde_json::Value::from),
            ".{0,8}".prop_map(serde_json::Value::from),
        ];
        leaf.prop_recursive(3, 24, 4, |inner| {
            prop_oneof![
                proptest::collection::vec(inner.clone(), 0..4).prop_map(serde_json::Value::from),
                proptest::collection::btree_map(".{0,4}", inner, 0..4)
                    .prop_map(|m| serde_json::Value::Object(m.into_iter().collect())),
            ]
        })
    }

    fn entry() -> impl Strategy<Value = Entry> {
        (
            (".{0,12}", ".{0,12}", ".{0,3}", ".{0,40}"),
            (
                -10_000_000_000i64..10_000_000_000,
                0u32..1_000_000_000,
                -86_399i32..86_400,
            ),
            (0..Kind::ALL.len(), 0..3u8, proptest::option::of(json())),
            proptest::option::of(".{0,12}"),
        )
            .prop_map(
                |((id, tag, author, text), (secs, nanos, offset), (kind, status, payload), r)| {
                    Entry {
                        id: EntryId(id),
                        tag: TagId(tag),
                        time: time_from_parts(secs, nanos, offset).unwrap(),
                        author,
                        kind: Kind::ALL[kind],
                        text,
                        payload,
                        status: [None, Some(FollowUpStatus::Open), Some(FollowUpStatus::Done)]
                            [usize::from(status)],
                        refers_to: r.map(EntryId),
                    }
                },
            )
    }

    proptest! {
        #[test]
        fn entries_read_back_exactly(entries in proptest::collection::vec(entry(), 0..8)) {
            let bytes = encode_entries(&entries);
            let back = decode_entries(&bytes, entries.len() as u64);
            prop_assert!(same_entries(back.as_deref(), &entries));
        }

        #[test]
        fn a_short_or_miscounted_section_is_refused(
            entries in proptest::collection::vec(entry(), 1..4),
            cut in any::<prop::sample::Index>(),
        ) {
            let bytes = encode_entries(&entries);
            let cut = cut.index(bytes.len());
            prop_assert!(decode_entries(&bytes[..cut], entries.len() as u64).is_none());
            prop_assert!(decode_entries(&bytes, entries.len() as u64 + 1).is_none());
            prop_assert!(decode_entries(&bytes, entries.len() as u64 - 1).is_none());
        }

        #[test]
        fn any_bytes_decode_without_panic(bytes in proptest::collection::vec(any::<u8>(), 0..200), count in 0u64..1_000_000_000_000) {
            let _ = decode_entries(&bytes, count);
        }
    }

    #[test]
    fn a_header_reads_back_and_any_flip_is_refused() {
        let head = Head {
            format: FORMAT,
            schema: 1,
            covered: 123_456,
            first_len: 4096,
            first_check: 7,
            last_len: 4096,
            last_check: 8,
            tag_count: 2,
            tags_len: 9,
            tags_check: 10,
            entry_count: 11,
            entries_len: 12,
            entries_check: 13,
            aid_len: 14,
            aid_check: 15,
        };
        let bytes = head.encode();
        assert_eq!(Head::decode(&bytes), Some(head));
        for i in 0..HEADER_LEN {
            let mut bad = bytes;
            bad[i] ^= 0x10;
            assert_eq!(Head::decode(&bad), None, "byte {i}");
        }
    }
}
