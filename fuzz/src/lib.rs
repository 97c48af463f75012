//! What the fuzz targets share: a scratch data folder, the demo plant as a bundle, and the
//! ways a target turns the fuzzer's bytes into a file that gets past loopside's check
//! values (so the fuzzer reaches the decoding behind them, not only the check).

use loopside::journal::Entry;
use loopside::store::bundle::Bundle;
use loopside::store::record::check;
use loopside::store::{Store, TagRecord};
use std::path::PathBuf;

/// The Brindlemoor demo plant exported as a JSON bundle (`loopside demo`, then `loopside
/// export --format json`): 7 tags and 11 entries with fixed ids.
pub const DEMO_BUNDLE: &str = include_str!("../data/demo-bundle.json");

/// The demo plant as a bundle.
pub fn demo_bundle() -> Bundle {
    loopside::store::bundle::parse_bundle(DEMO_BUNDLE).expect("the demo bundle reads")
}

/// An empty folder for one run of `target`, on a memory file system where there is one
/// (`/dev/shm`: syncing costs nothing there), made anew for every input.
pub fn scratch_dir(target: &str) -> PathBuf {
    let base = if std::path::Path::new("/dev/shm").is_dir() {
        PathBuf::from("/dev/shm")
    } else {
        std::env::temp_dir()
    };
    let dir = base.join(format!("loopside-fuzz-{target}-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).expect("scratch folder");
    dir
}

/// Tags and entries of a store, to compare two stores or a store before and after.
pub fn contents(store: &dyn Store) -> (Vec<TagRecord>, Vec<Entry>) {
    (store.tags().to_vec(), store.entries().to_vec())
}

/// A journal file from the fuzzer's bytes. Each line that starts with `+` is sealed: the
/// `+` becomes the line's correct check value and a space, as loopside writes it; every
/// other line is written as it is (damage, a foreign file, a torn end). A missing final
/// newline stays missing.
pub fn sealed_journal(input: &[u8]) -> Vec<u8> {
    let mut out = Vec::with_capacity(input.len() + 64);
    let mut lines = input.split(|&b| b == b'\n').peekable();
    while let Some(line) = lines.next() {
        match line.strip_prefix(b"+") {
            Some(json) => {
                out.extend_from_slice(format!("{:016x} ", check(json)).as_bytes());
                out.extend_from_slice(json);
            }
            None => out.extend_from_slice(line),
        }
        if lines.peek().is_some() {
            out.push(b'\n');
        }
    }
    out
}

/// Layout of a snapshot file's start (see `store::snapshot`, format 2): 16 bytes of magic,
/// fifteen little-endian `u64` fields, then the check value of all of that; then the tags,
/// entries and aid sections.
pub mod snapshot_layout {
    /// Length of the magic.
    pub const MAGIC_LEN: usize = 16;
    /// Number of `u64` fields after it.
    pub const FIELDS: usize = 15;
    /// The snapshot format these offsets describe.
    pub const FORMAT_VERSION: u64 = 2;
    /// Length of the fixed start, check value included.
    pub const HEADER_LEN: usize = MAGIC_LEN + FIELDS * 8 + 8;
    /// Field numbers.
    pub const FORMAT: usize = 0;
    /// Journal schema.
    pub const SCHEMA: usize = 1;
    /// Journal bytes covered.
    pub const COVERED: usize = 2;
    /// Length and check of the journal's first bytes.
    pub const FIRST_LEN: usize = 3;
    /// Check of the journal's first bytes.
    pub const FIRST_CHECK: usize = 4;
    /// Length of the last bytes before `covered`.
    pub const LAST_LEN: usize = 5;
    /// Their check.
    pub const LAST_CHECK: usize = 6;
    /// Length of the tags section.
    pub const TAGS_LEN: usize = 8;
    /// Its check.
    pub const TAGS_CHECK: usize = 9;
    /// Length of the entries section.
    pub const ENTRIES_LEN: usize = 11;
    /// Its check.
    pub const ENTRIES_CHECK: usize = 12;
    /// Length of the aid section.
    pub const AID_LEN: usize = 13;
    /// Its check.
    pub const AID_CHECK: usize = 14;
    /// How many journal bytes at each end the snapshot checks.
    pub const EDGE: u64 = 4096;
}

fn field(bytes: &[u8], i: usize) -> u64 {
    let at = snapshot_layout::MAGIC_LEN + i * 8;
    let mut w = [0u8; 8];
    w.copy_from_slice(&bytes[at..at + 8]);
    u64::from_le_bytes(w)
}

fn set_field(bytes: &mut [u8], i: usize, v: u64) {
    let at = snapshot_layout::MAGIC_LEN + i * 8;
    bytes[at..at + 8].copy_from_slice(&v.to_le_bytes());
}

/// Make a damaged snapshot (`bytes`, for a journal `journal`) pass every check again while
/// keeping what it says: the magic, format and schema put back, the journal edges and the
/// section checks recomputed, the section lengths made to fit the file, and the header's
/// own check value. The fuzzer then reaches the section decoders with arbitrary content.
pub fn seal_snapshot(bytes: &mut Vec<u8>, journal: &[u8], magic: &[u8; 16]) {
    use snapshot_layout::*;
    if bytes.len() < HEADER_LEN {
        bytes.resize(HEADER_LEN, 0);
    }
    bytes[..MAGIC_LEN].copy_from_slice(magic);
    set_field(bytes, FORMAT, FORMAT_VERSION);
    set_field(bytes, SCHEMA, 1);
    let journal_len = journal.len() as u64;
    let covered = match field(bytes, COVERED) {
        c if c == 0 || c > journal_len => journal_len,
        c => c,
    };
    set_field(bytes, COVERED, covered);
    let edge = covered.min(EDGE);
    let covered_at = covered as usize;
    set_field(bytes, FIRST_LEN, edge);
    set_field(bytes, FIRST_CHECK, check(&journal[..edge as usize]));
    set_field(bytes, LAST_LEN, edge);
    set_field(
        bytes,
        LAST_CHECK,
        check(&journal[covered_at - edge as usize..covered_at]),
    );
    let body = (bytes.len() - HEADER_LEN) as u64;
    let tags_len = field(bytes, TAGS_LEN).min(body);
    let entries_len = field(bytes, ENTRIES_LEN).min(body - tags_len);
    set_field(bytes, TAGS_LEN, tags_len);
    set_field(bytes, ENTRIES_LEN, entries_len);
    set_field(bytes, AID_LEN, body - tags_len - entries_len);
    let tags_end = HEADER_LEN + tags_len as usize;
    let entries_end = tags_end + entries_len as usize;
    let tags_check = check(&bytes[HEADER_LEN..tags_end]);
    let entries_check = check(&bytes[tags_end..entries_end]);
    let aid_check = check(&bytes[entries_end..]);
    set_field(bytes, TAGS_CHECK, tags_check);
    set_field(bytes, ENTRIES_CHECK, entries_check);
    set_field(bytes, AID_CHECK, aid_check);
    let head_check = check(&bytes[..HEADER_LEN - 8]);
    bytes[HEADER_LEN - 8..HEADER_LEN].copy_from_slice(&head_check.to_le_bytes());
}

/// Apply the fuzzer's damage to `original`: the input is a list of patches, each two bytes
/// of offset (little-endian, taken modulo the length), one byte of length and that many
/// bytes to write there (past the end the file grows). Used on files whose genuine form
/// the target makes itself, so that every input is a damaged copy of a real one.
pub fn patched(original: &[u8], mut patches: &[u8]) -> Vec<u8> {
    let mut out = original.to_vec();
    while patches.len() >= 3 {
        let at = usize::from(u16::from_le_bytes([patches[0], patches[1]]));
        let n = usize::from(patches[2]);
        let data = &patches[3..(3 + n).min(patches.len())];
        patches = &patches[(3 + n).min(patches.len())..];
        let at = if out.is_empty() { 0 } else { at % out.len() };
        for (i, &b) in data.iter().enumerate() {
            match out.get_mut(at + i) {
                Some(slot) => *slot = b,
                None => out.push(b),
            }
        }
    }
    out
}
