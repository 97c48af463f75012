//! Where loopside keeps its data on a desktop system: the one rule both the command line and
//! the desktop window follow, so they open the same store.
//!
//! In order: a folder given explicitly (`--data-dir`), then the `LOOPSIDE_DATA` environment
//! variable, then the platform's data folder for loopside. On Android none of this applies:
//! the activity hands in the app's own folder. Not core: it reads the environment, and only
//! the fronts call it.

use std::path::PathBuf;

/// Environment variable naming the data folder.
pub const DATA_ENV: &str = "LOOPSIDE_DATA";

/// The platform's data folder for loopside (desktop systems only; on Android the folder
/// comes from the activity and the command line must be given one).
#[cfg(not(target_os = "android"))]
pub fn default_data_dir() -> Option<PathBuf> {
    directories::ProjectDirs::from("", "", "loopside").map(|p| p.data_dir().to_path_buf())
}

/// On Android there is no user data folder outside the app's own: none by default.
#[cfg(target_os = "android")]
pub fn default_data_dir() -> Option<PathBuf> {
    None
}

/// The data folder to open: `given` if there is one, else [`DATA_ENV`] when set and not
/// empty, else [`default_data_dir`]; `None` when none can be found.
pub fn resolve(given: Option<PathBuf>) -> Option<PathBuf> {
    given
        .or_else(|| {
            std::env::var_os(DATA_ENV)
                .filter(|d| !d.is_empty())
                .map(PathBuf::from)
        })
        .or_else(default_data_dir)
}
