//! The licences loopside is distributed under and with: its own, the user-interface
//! toolkit's, the font's, and every third-party crate compiled into the app.
//!
//! The crate list is kept in `src/third_party_licences.tsv` (name, version, licence as the
//! crate declares it, one per line), written from `cargo metadata` for the platforms the app
//! is built for. `tests/licences.rs` fails when the file and `Cargo.lock` disagree, and
//! rewrites it when run with `LOOPSIDE_BLESS=1`. No I/O here: the file is compiled in.

/// loopside's own licence.
pub const OWN: &str = "MIT";

/// The font compiled into the app and its licence (see `ui/fonts/B612-LICENSE.txt`).
pub const FONT: (&str, &str) = ("B612 (Airbus and contributors)", "OFL-1.1");

/// The platforms whose dependencies the list covers (desktop and phone builds).
pub const PLATFORMS: [&str; 6] = [
    "x86_64-unknown-linux-gnu",
    "aarch64-unknown-linux-gnu",
    "x86_64-pc-windows-msvc",
    "x86_64-apple-darwin",
    "aarch64-apple-darwin",
    "aarch64-linux-android",
];

/// The list as compiled in.
const THIRD_PARTY_TSV: &str = include_str!("third_party_licences.tsv");

/// One third-party crate shipped in the app.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Crate {
    /// The crate's name on crates.io.
    pub name: &'static str,
    /// The version locked in `Cargo.lock`.
    pub version: &'static str,
    /// The licence expression the crate declares (SPDX, as written by its authors).
    pub licence: &'static str,
}

/// Every third-party crate compiled into the app on any of [`PLATFORMS`], sorted by name
/// and version. Lines that are not `name<TAB>version<TAB>licence` are skipped (the file
/// is generated and checked by a test, so none are expected).
pub fn third_party() -> Vec<Crate> {
    THIRD_PARTY_TSV
        .lines()
        .filter(|l| !l.starts_with('#') && !l.trim().is_empty())
        .filter_map(|l| {
            let mut parts = l.split('\t');
            Some(Crate {
                name: parts.next()?,
                version: parts.next()?,
                licence: parts.next()?,
            })
        })
        .collect()
}

/// The crates grouped by the licence expression they declare, the most common first
/// (equal counts by expression); crate names within a group sorted.
pub fn by_licence() -> Vec<(&'static str, Vec<Crate>)> {
    let mut groups: Vec<(&'static str, Vec<Crate>)> = Vec::new();
    for c in third_party() {
        match groups.iter_mut().find(|(l, _)| *l == c.licence) {
            Some((_, v)) => v.push(c),
            None => groups.push((c.licence, vec![c])),
        }
    }
    groups.sort_by(|a, b| b.1.len().cmp(&a.1.len()).then(a.0.cmp(b.0)));
    groups
}
