//! Hand-overs and bundles: export what the log holds for a period (Markdown to read, CSV
//! for a spreadsheet, a JSON bundle for another device) and import a bundle.

use crate::error::FieldError;
use crate::journal::Query;
use crate::report;
use crate::store::record::write_atomically;
use crate::store::{ImportReport, Store, StoreError};
use crate::view::log::export_file_name;
use chrono::{DateTime, FixedOffset};
use std::fmt;
use std::path::{Path, PathBuf};

/// A hand-over's file format.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Format {
    /// Markdown, to read (`md`).
    Markdown,
    /// CSV, for a spreadsheet (`csv`).
    Csv,
    /// A JSON bundle, for `import` on another device (`json`).
    Json,
}

impl Format {
    /// Read `md`, `csv` or `json`; the error names `format`.
    pub fn parse(text: &str) -> Result<Format, FieldError> {
        match text.trim().to_lowercase().as_str() {
            "md" => Ok(Format::Markdown),
            "csv" => Ok(Format::Csv),
            "json" => Ok(Format::Json),
            other => Err(FieldError::new(
                "format",
                format!("'{other}' is not a report format; use md, csv or json"),
            )),
        }
    }

    /// The file extension, also the name typed: `md`, `csv`, `json`.
    pub fn extension(self) -> &'static str {
        match self {
            Format::Markdown => "md",
            Format::Csv => "csv",
            Format::Json => "json",
        }
    }
}

/// A hand-over report, made but not yet written anywhere.
#[derive(Debug, Clone, PartialEq)]
pub struct Handover {
    /// The report's text (ends with a line break).
    pub text: String,
    /// The file name it is written under in a folder
    /// (`loopside-handoff-2026-11-30-0715.md`).
    pub file_name: String,
    /// How many log entries it holds.
    pub entries: usize,
    /// How many tags it holds.
    pub tags: usize,
}

/// Make the hand-over of what `query` selects (its tags and period), as of `now`.
pub fn handover(
    store: &dyn Store,
    now: DateTime<FixedOffset>,
    query: &Query,
    format: Format,
) -> Handover {
    let bundle = report::select(store, query, now);
    let mut text = match format {
        Format::Markdown => report::markdown_with(&bundle, &|e| {
            super::intrinsic::record_of(e)
                .map(|(circuit, verdict)| {
                    crate::view::wording::intrinsic::report_section(&circuit, &verdict)
                })
                .unwrap_or_default()
        }),
        Format::Csv => report::csv(&bundle),
        Format::Json => report::json(&bundle),
    };
    if !text.ends_with('\n') {
        text.push('\n');
    }
    Handover {
        text,
        file_name: export_file_name(now, format.extension()),
        entries: bundle.entries.len(),
        tags: bundle.tags.len(),
    }
}

/// Where a hand-over goes.
#[derive(Debug, Clone, PartialEq)]
pub enum Destination {
    /// This file (its folder must exist).
    File(PathBuf),
    /// This folder (made when missing), under the hand-over's own file name.
    Folder(PathBuf),
}

/// A hand-over written.
#[derive(Debug, Clone, PartialEq)]
pub struct Exported {
    /// The file written.
    pub path: PathBuf,
    /// How many log entries it holds.
    pub entries: usize,
    /// How many tags it holds.
    pub tags: usize,
}

impl fmt::Display for Exported {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(
            f,
            "Wrote {} entries on {} tags to {}.",
            self.entries,
            self.tags,
            self.path.display()
        )
    }
}

/// Make the hand-over ([`handover`]) and write it to `to`, crash-safely
/// ([`write_atomically`]): the file is never half there.
pub fn export_handover(
    store: &dyn Store,
    now: DateTime<FixedOffset>,
    query: &Query,
    format: Format,
    to: &Destination,
) -> Result<Exported, StoreError> {
    let h = handover(store, now, query, format);
    let path = match to {
        Destination::File(p) => p.clone(),
        Destination::Folder(folder) => {
            std::fs::create_dir_all(folder).map_err(|source| StoreError::Io {
                action: "create",
                path: folder.clone(),
                source,
            })?;
            folder.join(&h.file_name)
        }
    };
    write_atomically(&path, h.text.as_bytes()).map_err(|source| StoreError::Io {
        action: "write",
        path: path.clone(),
        source,
    })?;
    Ok(Exported {
        path,
        entries: h.entries,
        tags: h.tags,
    })
}

/// What an import did.
#[derive(Debug, Clone, PartialEq)]
pub struct Imported(pub ImportReport);

impl Imported {
    /// The summary, one sentence per line: the counts, then one per tag that differs.
    pub fn lines(&self) -> Vec<String> {
        let r = &self.0;
        let mut lines = vec![format!(
            "Imported {} tag(s) and {} entr(ies); {} entr(ies) were already here.",
            r.tags_added, r.entries_added, r.entries_already_here
        )];
        lines.extend(r.conflicts.iter().map(|c| {
            format!(
                "{} differs from this register's and was kept as it is here ({}).",
                c.number, c.detail
            )
        }));
        if r.intervals_set > 0 {
            lines.push(format!(
                "Took the calibration interval of {} tag(s) that had none here.",
                r.intervals_set
            ));
        }
        if r.references_added > 0 {
            lines.push(format!(
                "Added {} reference instrument(s).",
                r.references_added
            ));
        }
        lines.extend(r.reference_conflicts.iter().map(|id| {
            format!("Reference {id} differs from this store's and was kept as it is here.")
        }));
        lines
    }
}

impl fmt::Display for Imported {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.lines().join(" "))
    }
}

/// Merge the JSON bundle in `file` into the store. Entries already here (same id) are
/// skipped, so importing twice adds nothing; a tag defined differently here is reported
/// and kept as it is here. Records are kept as they came (older payload shapes included).
/// A path that is empty or cannot be read names the field `bundle file`.
pub fn import_bundle(store: &mut dyn Store, file: &Path) -> Result<Imported, StoreError> {
    if file.as_os_str().is_empty() {
        return Err(
            FieldError::new("bundle file", "is empty; give the path of a .json bundle").into(),
        );
    }
    let text = std::fs::read_to_string(file).map_err(|e| {
        FieldError::new(
            "bundle file",
            format!("cannot read {}: {e}", file.display()),
        )
    })?;
    let bundle = report::parse_bundle(&text)?;
    Ok(Imported(store.import(&bundle)?))
}
