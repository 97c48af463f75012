//! The on-disk line format and the crash-safe whole-file write.
//!
//! A store file is text, one record per line: 16 hex digits of a check value, one space,
//! the record as compact JSON (serde_json), and a newline. The first line is a header
//! naming the file and its schema version. The check value lets a reader tell a complete,
//! undamaged record from a torn or damaged one, because a JSON line with one changed
//! letter still parses. JSON never contains a raw newline, so a newline always ends a
//! record.
//!
//! Whole-file writes (repairs, migrations, exports) go to a temporary file in the same
//! folder, are synced, renamed over the target, and the folder is synced, so that after a
//! power cut either the old file or the new one is there, never half of one.

use crate::journal::Entry;
use crate::store::TagRecord;
use serde::{Deserialize, Serialize};
use std::fs::{self, File, OpenOptions};
use std::io::{self, Write};
use std::path::{Path, PathBuf};
use std::sync::atomic::{AtomicU64, Ordering};

/// The schema version this build writes. Files with a higher version are refused
/// untouched; lower versions are migrated on open with a backup kept.
pub const SCHEMA_VERSION: u32 = 1;

/// What the first line of a store file says about it.
#[derive(Debug, Clone, PartialEq, Eq, Serialize, Deserialize)]
pub struct Header {
    /// Always `"journal"` for the store file.
    pub loopside: String,
    /// Schema version; files written before versions existed read as 0.
    #[serde(default)]
    pub schema: u32,
}

impl Header {
    /// The header this build writes.
    pub fn current() -> Header {
        Header {
            loopside: "journal".to_string(),
            schema: SCHEMA_VERSION,
        }
    }
}

/// One line of the store after the header: a tag definition (new or changed) or a log
/// entry. The last tag line for an id is that tag's current definition.
// Records live only between encoding and applying; most are entries, so the size of the
// rarer tag variant costs nothing worth an allocation per tag.
#[allow(clippy::large_enum_variant)]
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum Record {
    /// A tag was added, edited, renamed, archived or restored.
    Tag(TagRecord),
    /// A log entry was written.
    Entry(Entry),
    /// A reference instrument was added or edited (the last line for an id, matched
    /// without regard to case, is its current definition). Written since references were
    /// kept in the store; stores without them read as before. A snapshot writes every
    /// reference once more after the part it covers (the snapshot holds only tags and
    /// entries), so the same definition may appear more than once.
    Reference(crate::calibration::reference::Reference),
}

/// A 64-bit check value over `bytes`. Every step is a bijection of the running state, so
/// damage confined to one 8-byte word always changes the value; other damage goes
/// unnoticed with probability 2⁻⁶⁴. It guards against accidents, not against tampering.
pub fn check(bytes: &[u8]) -> u64 {
    const K: u64 = 0x9e37_79b9_7f4a_7c15;
    let mut h: u64 = 0xcbf2_9ce4_8422_2325 ^ (bytes.len() as u64).wrapping_mul(K);
    let mut chunks = bytes.chunks_exact(8);
    for c in &mut chunks {
        let mut word = [0u8; 8];
        word.copy_from_slice(c);
        h = (h ^ u64::from_le_bytes(word))
            .wrapping_mul(K)
            .rotate_left(29);
    }
    let rest = chunks.remainder();
    if !rest.is_empty() {
        let mut word = [0u8; 8];
        word[..rest.len()].copy_from_slice(rest);
        h = (h ^ u64::from_le_bytes(word))
            .wrapping_mul(K)
            .rotate_left(29);
    }
    h ^= h >> 32;
    h = h.wrapping_mul(0xd6e8_feb8_6659_fd93);
    h ^= h >> 29;
    h
}

/// Append one line (check, space, JSON, newline) for `value` to `out`.
pub fn encode_line<T: Serialize>(value: &T, out: &mut Vec<u8>) -> io::Result<()> {
    let json = serde_json::to_vec(value).map_err(io::Error::other)?;
    out.extend_from_slice(format!("{:016x} ", check(&json)).as_bytes());
    out.extend_from_slice(&json);
    out.push(b'\n');
    Ok(())
}

/// The JSON part of a line whose check value matches, or `None` for a damaged line.
/// `line` excludes the newline.
pub fn verified_json(line: &[u8]) -> Option<&[u8]> {
    if line.len() < 18 || line[16] != b' ' {
        return None;
    }
    // Lower-case hex only, so that even a flipped case bit is seen as damage.
    let mut want: u64 = 0;
    for &b in &line[..16] {
        let digit = match b {
            b'0'..=b'9' => b - b'0',
            b'a'..=b'f' => b - b'a' + 10,
            _ => return None,
        };
        want = (want << 4) | u64::from(digit);
    }
    let json = &line[17..];
    (check(json) == want).then_some(json)
}

/// Decode a line as a `T`, or `None` when it is damaged or not a `T`.
pub fn decode_line<'a, T: Deserialize<'a>>(line: &'a [u8]) -> Option<T> {
    serde_json::from_slice(verified_json(line)?).ok()
}

static TEMP_COUNTER: AtomicU64 = AtomicU64::new(0);

/// Make `path`'s folder entry changes (create, rename) durable. On systems where a folder
/// cannot be opened for syncing this is a no-op.
pub fn sync_folder(folder: &Path) -> io::Result<()> {
    #[cfg(unix)]
    {
        File::open(folder)?.sync_all()
    }
    #[cfg(not(unix))]
    {
        let _ = folder;
        Ok(())
    }
}

/// The folder a file lives in ("." for a bare file name).
pub fn folder_of(path: &Path) -> PathBuf {
    match path.parent() {
        Some(p) if !p.as_os_str().is_empty() => p.to_path_buf(),
        _ => PathBuf::from("."),
    }
}

/// Replace `path` with `bytes` so that a crash at any instant leaves either the old file
/// or the complete new one: temporary file in the same folder, write, sync, rename over
/// `path`, sync the folder.
pub fn write_atomically(path: &Path, bytes: &[u8]) -> io::Result<()> {
    let folder = folder_of(path);
    let name = path
        .file_name()
        .map(|n| n.to_string_lossy().into_owned())
        .unwrap_or_else(|| "file".to_string());
    let temp = folder.join(format!(
        ".{name}.tmp-{}-{}",
        std::process::id(),
        TEMP_COUNTER.fetch_add(1, Ordering::Relaxed)
    ));
    let result = (|| {
        let mut f = OpenOptions::new()
            .write(true)
            .create_new(true)
            .open(&temp)?;
        f.write_all(bytes)?;
        f.sync_all()?;
        drop(f);
        fs::rename(&temp, path)?;
        sync_folder(&folder)
    })();
    if result.is_err() {
        let _ = fs::remove_file(&temp);
    }
    result
}

/// Write `bytes` to a new file next to `base` named `base.<what>-<stamp>` (never
/// replacing an existing file), synced, and return its path. Used to set damaged or torn
/// data aside before anything else touches the store.
pub fn write_aside(base: &Path, what: &str, bytes: &[u8]) -> io::Result<PathBuf> {
    let stamp = chrono::Utc::now().format("%Y%m%dT%H%M%SZ");
    let folder = folder_of(base);
    let name = base
        .file_name()
        .map(|n| n.to_string_lossy().into_owned())
        .unwrap_or_else(|| "store".to_string());
    for n in 0..1000 {
        let suffix = if n == 0 {
            String::new()
        } else {
            format!("-{n}")
        };
        let path = folder.join(format!("{name}.{what}-{stamp}{suffix}"));
        match OpenOptions::new().write(true).create_new(true).open(&path) {
            Ok(mut f) => {
                f.write_all(bytes)?;
                f.sync_all()?;
                sync_folder(&folder)?;
                return Ok(path);
            }
            Err(e) if e.kind() == io::ErrorKind::AlreadyExists => continue,
            Err(e) => return Err(e),
        }
    }
    Err(io::Error::other(format!(
        "cannot find a free name for the {what} copy of {}",
        base.display()
    )))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_flipped_byte_fails_the_check() {
        let mut out = Vec::new();
        encode_line(&Header::current(), &mut out).unwrap();
        let line = &out[..out.len() - 1];
        assert!(decode_line::<Header>(line).is_some());
        for i in 0..line.len() {
            for bit in 0..8 {
                let mut bad = line.to_vec();
                bad[i] ^= 1 << bit;
                assert!(decode_line::<Header>(&bad).is_none(), "byte {i} bit {bit}");
            }
        }
    }
}
