//! The file store: one append-only journal file in a data folder, plus a lock file.
//!
//! Layout of the data folder (handed in by the caller):
//!
//! - `loopside.journal` — header line, then one line per saved record (see
//!   [`super::record`]). Appends write the new lines and sync the file before returning.
//! - `loopside.lock` — held with an exclusive lock while a store is open, so a second
//!   process gets a clear "in use" error (after waiting, if asked to) instead of
//!   interleaving writes.
//! - `loopside.snapshot` — a cache of the register for a quick open (see
//!   [`super::snapshot`]); written when much of the journal is not covered by it, on open
//!   and on close. It may be deleted at any time; the journal is the record.
//! - `loopside.journal.torn-…`, `…damaged-…`, `…v0-backup-…` — copies set aside by
//!   recovery or migration; never deleted by loopside.
//!
//! Tag numbers never become file names; every file name here is fixed.
//!
//! On open, when the snapshot fits the journal, the tags come from it and only the journal
//! after the part it covers is read; the entries are read from the snapshot the first
//! time the log is needed. Before that, a text search, each tag's newest entry (the Tags
//! list) and the closed follow-ups are answered from the snapshot's aid section, which
//! decodes only the entries they return. Otherwise (and whenever that tail is not perfectly clean) the
//! whole journal is read once. A torn last record (power cut mid-append) is cut
//! off into a `torn` file and reported; every complete record before it is kept. Damage
//! elsewhere (unreadable lines, a foreign file) makes a `damaged` copy of the whole file
//! first, then the file is rewritten with the readable records only, and the count of
//! what could not be read is reported.

use super::record::{
    decode_line, encode_line, sync_folder, verified_json, write_aside, write_atomically, Header,
    Record, SCHEMA_VERSION,
};
use super::snapshot::{self, SNAPSHOT_FILE, SNAPSHOT_TAIL_BYTES};
use super::{AidLoader, EntryLoader, Register, Store, StoreError, StoreResult};
use std::fs::{self, File, OpenOptions, TryLockError};
use std::io::{self, Read, Seek, SeekFrom, Write};
use std::path::{Path, PathBuf};
use std::sync::atomic::{AtomicBool, Ordering};
use std::sync::Arc;
use std::time::{Duration, Instant};

/// Name of the journal file in the data folder.
pub const JOURNAL_FILE: &str = "loopside.journal";
/// Name of the lock file in the data folder.
pub const LOCK_FILE: &str = "loopside.lock";

/// What happened to a file on open that the technician should know about.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum RecoveryKind {
    /// The last record was incomplete (power cut or crash while saving) and was cut off.
    TornTail,
    /// Some records could not be read; the file was copied aside and rewritten without
    /// them.
    Damaged,
    /// The file had an older schema and was migrated; the old file was kept as a backup.
    Migrated,
}

/// One recovery action taken when the store was opened.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Recovery {
    /// What was done.
    pub kind: RecoveryKind,
    /// Where the set-aside bytes or the backup are.
    pub aside: PathBuf,
    /// Records kept.
    pub records_kept: usize,
    /// Records (or record-sized pieces) that could not be read.
    pub records_lost: usize,
    /// The message for the technician, one line.
    pub message: String,
}

/// A store in a data folder. Holds the folder's lock until dropped.
#[derive(Debug)]
pub struct FileStore {
    folder: PathBuf,
    journal_path: PathBuf,
    journal: File,
    len: u64,
    /// Journal bytes the snapshot on disk covers (0: no snapshot known to fit).
    covered: u64,
    from_snapshot: bool,
    /// Set when the snapshot's entries turned out unreadable and the journal was read.
    snapshot_failed: Arc<AtomicBool>,
    register: Register,
    recoveries: Vec<Recovery>,
    _lock: File,
}

fn io_err<'a>(action: &'static str, path: &'a Path) -> impl FnOnce(io::Error) -> StoreError + 'a {
    move |source| StoreError::Io {
        action,
        path: path.to_path_buf(),
        source,
    }
}

/// Result of reading the journal bytes.
struct Scan {
    header: Option<Header>,
    records: Vec<Record>,
    /// Byte ranges of the good lines (with their newline) after the header.
    good: Vec<(usize, usize)>,
    /// Lines that could not be read, excluding a trailing torn region.
    bad_inside: usize,
    /// Unreadable lines at the very end (the torn region), and where it starts.
    bad_tail: usize,
    tail_start: usize,
    /// True when the last good record lacked its newline.
    missing_newline: bool,
}

fn scan(bytes: &[u8]) -> Scan {
    let mut s = Scan {
        header: None,
        records: Vec::new(),
        good: Vec::new(),
        bad_inside: 0,
        bad_tail: 0,
        tail_start: bytes.len(),
        missing_newline: false,
    };
    let mut pos = 0;
    let mut first = true;
    // Bad lines seen since the last good one; they become "inside" damage if a good line
    // follows, or the torn tail if none does.
    let mut pending_bad = 0;
    let mut pending_start = None;
    while pos < bytes.len() {
        let end = bytes[pos..]
            .iter()
            .position(|&b| b == b'\n')
            .map(|i| pos + i);
        let (line, next, has_newline) = match end {
            Some(e) => (&bytes[pos..e], e + 1, true),
            None => (&bytes[pos..], bytes.len(), false),
        };
        let ok = if first {
            first = false;
            match decode_line::<Header>(line) {
                Some(h) if h.loopside == "journal" => {
                    s.header = Some(h);
                    true
                }
                _ => {
                    // Not a header: maybe a record (header line lost), else damage.
                    match decode_line::<Record>(line) {
                        Some(r) => {
                            s.records.push(r);
                            s.good.push((pos, next));
                            true
                        }
                        None => false,
                    }
                }
            }
        } else {
            match verified_json(line).and_then(|j| serde_json::from_slice::<Record>(j).ok()) {
                Some(r) => {
                    s.records.push(r);
                    s.good.push((pos, next));
                    true
                }
                None => false,
            }
        };
        if ok {
            s.bad_inside += pending_bad;
            pending_bad = 0;
            pending_start = None;
            s.missing_newline = !has_newline;
        } else if !line.is_empty() || !has_newline {
            pending_bad += 1;
            pending_start.get_or_insert(pos);
        }
        pos = next;
    }
    s.bad_tail = pending_bad;
    if let Some(start) = pending_start {
        s.tail_start = start;
    }
    s
}

impl FileStore {
    /// Open (or create) the store in `folder`, taking its lock. Recovery actions taken on
    /// the way are listed by [`FileStore::recoveries`]; none of them loses a readable
    /// record. Fails at once with [`StoreError::InUse`] when another store has it open.
    pub fn open(folder: &Path) -> StoreResult<FileStore> {
        FileStore::open_waiting(folder, Duration::ZERO)
    }

    /// Like [`FileStore::open`], but when another store has the folder open, try again
    /// every 50 ms for up to `wait` before failing with [`StoreError::InUse`].
    pub fn open_waiting(folder: &Path, wait: Duration) -> StoreResult<FileStore> {
        let folder = folder.to_path_buf();
        if !folder.is_dir() {
            fs::create_dir_all(&folder).map_err(io_err("create the data folder", &folder))?;
            if let Some(parent) = folder.parent().filter(|p| !p.as_os_str().is_empty()) {
                sync_folder(parent).map_err(io_err("sync", parent))?;
            }
        }
        let lock_path = folder.join(LOCK_FILE);
        let lock = OpenOptions::new()
            .read(true)
            .write(true)
            .create(true)
            .truncate(false)
            .open(&lock_path)
            .map_err(io_err("open", &lock_path))?;
        let started = Instant::now();
        loop {
            match lock.try_lock() {
                Ok(()) => break,
                Err(TryLockError::WouldBlock) => {
                    let left = wait.saturating_sub(started.elapsed());
                    if left.is_zero() {
                        return Err(StoreError::InUse { folder });
                    }
                    std::thread::sleep(left.min(LOCK_POLL));
                }
                Err(TryLockError::Error(e)) => return Err(io_err("lock", &lock_path)(e)),
            }
        }
        snapshot::remove_leftovers(&folder);
        let journal_path = folder.join(JOURNAL_FILE);
        let mut recoveries = Vec::new();
        let mut register = Register::default();
        let mut covered = 0;
        let mut from_snapshot = false;
        let snapshot_failed = Arc::new(AtomicBool::new(false));
        let mut reader = match File::open(&journal_path) {
            Ok(f) => Some(f),
            Err(e) if e.kind() == io::ErrorKind::NotFound => None,
            Err(e) => return Err(io_err("read", &journal_path)(e)),
        };
        if let Some(f) = &mut reader {
            if let Some((r, c)) =
                open_from_snapshot(&folder, &journal_path, f, snapshot_failed.clone())?
            {
                (register, covered, from_snapshot) = (r, c, true);
            }
        }
        let existing = match reader {
            None => None,
            Some(_) if from_snapshot => None,
            Some(mut f) => {
                let mut bytes = Vec::new();
                f.seek(SeekFrom::Start(0))
                    .and_then(|_| f.read_to_end(&mut bytes))
                    .map_err(io_err("read", &journal_path))?;
                Some(bytes)
            }
        };
        match existing {
            None if from_snapshot => {}
            None => {
                let mut buf = Vec::new();
                encode_line(&Header::current(), &mut buf).map_err(io_err("encode", &folder))?;
                write_atomically(&journal_path, &buf).map_err(io_err("create", &journal_path))?;
            }
            Some(bytes) if bytes.is_empty() => {
                // Created but the header never reached the disk: nothing to lose.
                let mut buf = Vec::new();
                encode_line(&Header::current(), &mut buf).map_err(io_err("encode", &folder))?;
                write_atomically(&journal_path, &buf).map_err(io_err("create", &journal_path))?;
            }
            Some(bytes) => {
                let s = scan(&bytes);
                if let Some(h) = &s.header {
                    if h.schema > SCHEMA_VERSION {
                        return Err(StoreError::NewerSchema {
                            path: journal_path,
                            found: h.schema,
                            known: SCHEMA_VERSION,
                        });
                    }
                }
                let kept = s.records.len();
                let header_ok = s.header.is_some();
                if s.bad_inside > 0 || !header_ok {
                    let lost = s.bad_inside + s.bad_tail;
                    let aside = write_aside(&journal_path, "damaged", &bytes)
                        .map_err(io_err("copy aside", &journal_path))?;
                    rewrite(&journal_path, &bytes, &s.good)?;
                    let message = if kept == 0 && !header_ok {
                        format!(
                            "{} was not a loopside store or could not be read at all ({} bytes); it was moved to {} and an empty store started",
                            journal_path.display(),
                            bytes.len(),
                            aside.display()
                        )
                    } else {
                        format!(
                            "{} was damaged: {lost} record(s) could not be read and {kept} were kept; the damaged file was copied to {}",
                            journal_path.display(),
                            aside.display()
                        )
                    };
                    recoveries.push(Recovery {
                        kind: RecoveryKind::Damaged,
                        aside,
                        records_kept: kept,
                        records_lost: lost,
                        message,
                    });
                } else {
                    if s.bad_tail > 0 {
                        let aside = write_aside(&journal_path, "torn", &bytes[s.tail_start..])
                            .map_err(io_err("copy aside", &journal_path))?;
                        cut(&journal_path, s.tail_start as u64)?;
                        recoveries.push(Recovery {
                            kind: RecoveryKind::TornTail,
                            aside: aside.clone(),
                            records_kept: kept,
                            records_lost: s.bad_tail,
                            message: format!(
                                "the last record in {} was incomplete (saving was interrupted) and was cut off into {}; all {kept} complete records were kept",
                                journal_path.display(),
                                aside.display()
                            ),
                        });
                    } else if s.missing_newline {
                        // A whole record whose newline never reached the disk: finish it.
                        let mut f = OpenOptions::new()
                            .append(true)
                            .open(&journal_path)
                            .map_err(io_err("open", &journal_path))?;
                        f.write_all(b"\n")
                            .and_then(|()| f.sync_data())
                            .map_err(io_err("write", &journal_path))?;
                    }
                    // An older file is upgraded on the same open, torn tail or not (the
                    // backup is the file as it stands after the tail was cut off), so the
                    // next open finds nothing left to do.
                    if s.header.as_ref().is_some_and(|h| h.schema < SCHEMA_VERSION) {
                        let old = s.header.as_ref().map_or(0, |h| h.schema);
                        let aside = write_aside(
                            &journal_path,
                            &format!("v{old}-backup"),
                            &bytes[..s.tail_start],
                        )
                        .map_err(io_err("back up", &journal_path))?;
                        rewrite(&journal_path, &bytes, &s.good)?;
                        recoveries.push(Recovery {
                            kind: RecoveryKind::Migrated,
                            aside: aside.clone(),
                            records_kept: kept,
                            records_lost: 0,
                            message: format!(
                                "{} was upgraded from schema {old} to {SCHEMA_VERSION}; the old file was kept as {}",
                                journal_path.display(),
                                aside.display()
                            ),
                        });
                    }
                }
                for r in s.records {
                    register.apply(r);
                }
            }
        }
        let journal = OpenOptions::new()
            .append(true)
            .open(&journal_path)
            .map_err(io_err("open", &journal_path))?;
        let len = journal
            .metadata()
            .map_err(io_err("read", &journal_path))?
            .len();
        let mut store = FileStore {
            folder,
            journal_path,
            journal,
            len,
            covered,
            from_snapshot,
            snapshot_failed,
            register,
            recoveries,
            _lock: lock,
        };
        if store.snapshot_due() {
            // Only a cache: if it cannot be written, the next open reads the journal.
            let _ = store.write_snapshot();
        }
        Ok(store)
    }

    /// True when the snapshot leaves more than [`SNAPSHOT_TAIL_BYTES`] of journal to read,
    /// or its entries could not be read.
    fn snapshot_due(&self) -> bool {
        (self.len.saturating_sub(self.covered) > SNAPSHOT_TAIL_BYTES
            || self.snapshot_failed.load(Ordering::Relaxed))
            && self.register.load_failure().is_none()
    }

    /// Write a snapshot of the register now, so the next open reads only what is saved
    /// after this. loopside does this by itself when more than [`SNAPSHOT_TAIL_BYTES`] of
    /// the journal are not covered, on open and on close; the app may also call it when
    /// idle. A failure loses nothing: the journal is the record.
    pub fn write_snapshot(&mut self) -> StoreResult<()> {
        let path = self.folder.join(SNAPSHOT_FILE);
        self.register.entries();
        if let Some(why) = self.register.load_failure() {
            return Err(StoreError::Io {
                action: "write",
                path,
                source: io::Error::other(why.to_string()),
            });
        }
        let covered = self.len;
        // The snapshot's layout holds tags and entries only. The reference instruments are
        // saved once more after the part it covers, so a store opened from it reads them
        // from the journal's tail (the last definition of an id wins: the same one again
        // changes nothing). They are written first: a crash before the snapshot is
        // written leaves the old snapshot, still valid for the longer journal.
        let references = self.register.references().to_vec();
        if !references.is_empty() {
            self.persist(references.into_iter().map(Record::Reference).collect())?;
        }
        snapshot::write(
            &self.folder,
            &self.journal_path,
            covered,
            self.register.tags(),
            self.register.entries(),
        )
        .map_err(io_err("write", &path))?;
        self.covered = covered;
        self.snapshot_failed.store(false, Ordering::Relaxed);
        Ok(())
    }

    /// True when this store was opened from the snapshot (and the journal after it)
    /// rather than by reading the whole journal.
    pub fn opened_from_snapshot(&self) -> bool {
        self.from_snapshot
    }

    /// Recovery actions taken when the store was opened (empty for a healthy store).
    pub fn recoveries(&self) -> &[Recovery] {
        &self.recoveries
    }

    /// The data folder.
    pub fn folder(&self) -> &Path {
        &self.folder
    }

    /// The journal file.
    pub fn journal_path(&self) -> &Path {
        &self.journal_path
    }
}

/// How often [`FileStore::open_waiting`] tries the lock again.
const LOCK_POLL: Duration = Duration::from_millis(50);

/// The register from the snapshot and the journal after it, and the journal length the
/// snapshot covers; `None` when the snapshot does not fit or the journal after it is not
/// a clean run of whole records (the caller then reads the whole journal, which also
/// repairs what needs repair).
fn open_from_snapshot(
    folder: &Path,
    journal_path: &Path,
    journal: &mut File,
    failed: Arc<AtomicBool>,
) -> StoreResult<Option<(Register, u64)>> {
    let len = journal
        .metadata()
        .map_err(io_err("read", journal_path))?
        .len();
    let Some(loaded) = snapshot::load(folder, journal, len) else {
        return Ok(None);
    };
    let mut tail = Vec::new();
    journal
        .seek(SeekFrom::Start(loaded.covered))
        .and_then(|_| journal.read_to_end(&mut tail))
        .map_err(io_err("read", journal_path))?;
    let Some(records) = clean_records(&tail) else {
        return Ok(None);
    };
    let covered = loaded.covered;
    let pending = Arc::new(loaded.entries);
    let tag_count = loaded.tags.len();
    let for_aid = pending.clone();
    let aid: AidLoader = Box::new(move || for_aid.aid(tag_count));
    let path = journal_path.to_path_buf();
    let load: EntryLoader = Box::new(move || {
        if let Some(entries) = pending.read() {
            return Ok(entries);
        }
        // The snapshot's entries are damaged or gone: read them from the journal (and
        // write a new snapshot on close).
        failed.store(true, Ordering::Relaxed);
        let mut bytes = Vec::new();
        File::open(&path)
            .and_then(|f| f.take(covered).read_to_end(&mut bytes))
            .map_err(|e| {
                format!("{e}; the log could not be read back; close loopside and open it again")
            })?;
        Ok(scan(&bytes)
            .records
            .into_iter()
            .filter_map(|r| match r {
                Record::Entry(e) => Some(e),
                Record::Tag(_) | Record::Reference(_) => None,
            })
            .collect())
    });
    let mut register = Register::deferred(loaded.tags, load, aid);
    for r in records {
        register.apply(r);
    }
    Ok(Some((register, covered)))
}

/// The records in `bytes` if it is nothing but whole, intact record lines.
fn clean_records(bytes: &[u8]) -> Option<Vec<Record>> {
    let mut out = Vec::new();
    let mut rest = bytes;
    while !rest.is_empty() {
        let end = rest.iter().position(|&b| b == b'\n')?;
        let json = verified_json(&rest[..end])?;
        out.push(serde_json::from_slice(json).ok()?);
        rest = &rest[end + 1..];
    }
    Some(out)
}

/// Rewrite the journal with a current header and the good lines, byte for byte.
fn rewrite(path: &Path, bytes: &[u8], good: &[(usize, usize)]) -> StoreResult<()> {
    let mut out = Vec::with_capacity(bytes.len());
    encode_line(&Header::current(), &mut out).map_err(io_err("encode", path))?;
    for &(a, b) in good {
        out.extend_from_slice(&bytes[a..b]);
        if out.last() != Some(&b'\n') {
            out.push(b'\n');
        }
    }
    write_atomically(path, &out).map_err(io_err("rewrite", path))
}

/// Cut the journal to `len` bytes and sync.
fn cut(path: &Path, len: u64) -> StoreResult<()> {
    let f = OpenOptions::new()
        .write(true)
        .open(path)
        .map_err(io_err("open", path))?;
    f.set_len(len)
        .and_then(|()| f.sync_all())
        .map_err(io_err("cut", path))
}

impl Drop for FileStore {
    fn drop(&mut self) {
        if self.snapshot_due() {
            // Only a cache: if it cannot be written, the next open reads the journal.
            let _ = self.write_snapshot();
        }
    }
}

impl Store for FileStore {
    fn register(&self) -> &Register {
        &self.register
    }

    fn persist(&mut self, records: Vec<Record>) -> StoreResult<()> {
        if let Some(why) = self.register.load_failure() {
            // Saving on top of a log that could not be read back would check new entries
            // against part of it only.
            return Err(StoreError::Io {
                action: "read",
                path: self.journal_path.clone(),
                source: io::Error::other(why.to_string()),
            });
        }
        let mut buf = Vec::new();
        for r in &records {
            encode_line(r, &mut buf).map_err(io_err("encode", &self.journal_path))?;
        }
        let written = self
            .journal
            .write_all(&buf)
            .and_then(|()| self.journal.sync_data());
        if let Err(e) = written {
            // Take back a partial write so the next append does not follow a broken line.
            let _ = self.journal.set_len(self.len);
            let _ = self.journal.sync_data();
            return Err(io_err("write", &self.journal_path)(e));
        }
        self.len += buf.len() as u64;
        for r in records {
            self.register.apply(r);
        }
        Ok(())
    }
}
