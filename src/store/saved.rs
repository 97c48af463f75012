//! A file the app keeps for itself in the data folder (its saved screen state), read so
//! that damage never stops the app from starting.
//!
//! On a phone the technician cannot reach the data folder to remove a damaged file, so a
//! file that cannot be read as the wanted type (damaged, or written by a newer loopside) is
//! set aside: renamed, never deleted, never overwritten (`app-state.json` becomes
//! `app-state.unreadable.json`, then `app-state.unreadable-2.json` …), and the caller
//! starts from its defaults. The app's own state type lives with the Slint glue
//! (`app::state`); the reading and setting aside live here, free of any UI type, so they
//! can be exercised without the app.

use serde::de::DeserializeOwned;
use std::fs;
use std::io;
use std::path::{Path, PathBuf};

/// What reading a saved file gave.
#[derive(Debug, Clone, PartialEq)]
pub enum SavedRead<T> {
    /// There was no file: start from the defaults, nothing to say.
    Missing,
    /// The file was read.
    Read(T),
    /// The file could not be read as the wanted type; it was renamed to `kept_as`
    /// (byte for byte) and the caller starts from its defaults.
    SetAside {
        /// Where the unreadable file now is.
        kept_as: PathBuf,
        /// Why it could not be read (the parser's words, with line and column).
        why: String,
    },
}

/// The name the `n`-th unreadable copy of `name` is kept under: `app-state.json` →
/// `app-state.unreadable.json` (n = 1), `app-state.unreadable-2.json` (n = 2) …
fn aside_name(name: &str, n: u32) -> String {
    let (stem, ext) = match name.rsplit_once('.') {
        Some((stem, ext)) if !stem.is_empty() => (stem, format!(".{ext}")),
        _ => (name, String::new()),
    };
    if n <= 1 {
        format!("{stem}.unreadable{ext}")
    } else {
        format!("{stem}.unreadable-{n}{ext}")
    }
}

/// The first free name to keep an unreadable `name` under in `dir`.
fn aside_path(dir: &Path, name: &str) -> PathBuf {
    (1..=u32::MAX)
        .map(|n| dir.join(aside_name(name, n)))
        .find(|p| !p.exists())
        .unwrap_or_else(|| dir.join(aside_name(name, 1)))
}

/// Read `dir/name` as JSON of type `T`. A file that cannot be read as `T` is set aside
/// (see the module documentation) and [`SavedRead::SetAside`] says where. Only an I/O
/// failure (a folder that cannot be read, a rename refused) is an error; the file is then
/// left where it was.
pub fn read_or_set_aside<T: DeserializeOwned>(dir: &Path, name: &str) -> io::Result<SavedRead<T>> {
    let path = dir.join(name);
    let bytes = match fs::read(&path) {
        Ok(bytes) => bytes,
        Err(e) if e.kind() == io::ErrorKind::NotFound => return Ok(SavedRead::Missing),
        Err(e) => return Err(e),
    };
    match serde_json::from_slice::<T>(&bytes) {
        Ok(value) => Ok(SavedRead::Read(value)),
        Err(e) => {
            let kept_as = aside_path(dir, name);
            fs::rename(&path, &kept_as)?;
            if let Ok(folder) = fs::File::open(dir) {
                // Make the rename itself durable; a failure here loses nothing.
                let _ = folder.sync_all();
            }
            Ok(SavedRead::SetAside {
                kept_as,
                why: e.to_string(),
            })
        }
    }
}

#[cfg(test)]
mod tests {
    use super::aside_name;

    #[test]
    fn unreadable_copies_keep_the_extension() {
        assert_eq!(aside_name("app-state.json", 1), "app-state.unreadable.json");
        assert_eq!(
            aside_name("app-state.json", 2),
            "app-state.unreadable-2.json"
        );
        assert_eq!(aside_name("state", 3), "state.unreadable-3");
    }
}
