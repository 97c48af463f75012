//! `loopside export`, `loopside import` and `loopside demo`: hand-over reports, bundles
//! from another device, and the demo plant.

use super::data::{now_local, query_from, store_error, DataArgs};
use super::{print_json, print_lines, CliError, CliResult};
use crate::demo;
use crate::error::FieldError;
use crate::report;
use crate::store::{record::write_atomically, Store};
use clap::Args;
use std::io::Write;
use std::path::PathBuf;

/// `loopside export`
#[derive(Debug, Args)]
#[command(after_help = "Examples:\n  \
    loopside export --format md --since 2026-11-27\n  \
    loopside export --format csv --tag LT-101 --tag PT-204 --out handoff.csv\n  \
    loopside export --format json --out bundle.json")]
pub struct ExportArgs {
    #[command(flatten)]
    data: DataArgs,
    /// md (readable), csv (spreadsheet) or json (for `loopside import`).
    #[arg(long, value_name = "FORMAT", value_parser = ["md", "csv", "json"])]
    format: String,
    /// From this local date (YYYY-MM-DD) or time (RFC 3339).
    #[arg(long, value_name = "DATE")]
    since: Option<String>,
    /// Up to and including this local date, or before this time.
    #[arg(long, value_name = "DATE")]
    until: Option<String>,
    /// Only this tag (repeat for several).
    #[arg(long = "tag", value_name = "NUMBER")]
    tags: Vec<String>,
    /// Write to this file (safely: temporary file, sync, rename) instead of stdout.
    #[arg(long, value_name = "FILE")]
    out: Option<PathBuf>,
}

pub(super) fn export(args: ExportArgs, out: &mut dyn Write) -> CliResult {
    let store = args.data.open()?;
    let q = query_from(&store, &args.tags, &args.since, &args.until)?;
    let bundle = report::select(&store, &q, now_local());
    let text = match args.format.as_str() {
        "md" => report::markdown(&bundle),
        "csv" => report::csv(&bundle),
        _ => report::json(&bundle) + "\n",
    };
    match &args.out {
        Some(path) => {
            write_atomically(path, text.as_bytes())
                .map_err(|e| CliError::Failure(format!("cannot write {}: {e}", path.display())))?;
            print_lines(
                out,
                &[format!(
                    "wrote {} entries on {} tags to {}",
                    bundle.entries.len(),
                    bundle.tags.len(),
                    path.display()
                )],
            )
        }
        None => out.write_all(text.as_bytes()).map_err(super::io_failure),
    }
}

/// `loopside import`
#[derive(Debug, Args)]
#[command(after_help = "Example:\n  loopside import bundle-from-AB.json\n\
    Entries already here (same id) are skipped, so importing twice adds nothing.\n\
    A tag defined differently here is reported and left as it is here.")]
pub struct ImportArgs {
    #[command(flatten)]
    data: DataArgs,
    /// A JSON bundle made by `loopside export --format json`.
    file: PathBuf,
    /// Print one JSON object.
    #[arg(long)]
    json: bool,
}

pub(super) fn import(args: ImportArgs, out: &mut dyn Write) -> CliResult {
    let text = std::fs::read_to_string(&args.file).map_err(|e| {
        FieldError::new("file", format!("cannot read {}: {e}", args.file.display()))
    })?;
    let bundle = report::parse_bundle(&text)?;
    let mut store = args.data.open()?;
    let r = store.import(&bundle).map_err(store_error)?;
    if args.json {
        return print_json(
            out,
            &serde_json::to_value(&r).map_err(|e| CliError::Failure(e.to_string()))?,
        );
    }
    let mut lines = vec![format!(
        "added {} tag(s) and {} entr(ies); {} entr(ies) were already here",
        r.tags_added, r.entries_added, r.entries_already_here
    )];
    for c in &r.conflicts {
        lines.push(format!("conflict: {}: {}", c.number, c.detail));
    }
    print_lines(out, &lines)
}

/// `loopside demo`
#[derive(Debug, Args)]
#[command(after_help = "Example:\n  loopside demo --data-dir /tmp/brindlemoor\n\
    Only an empty store is filled; a store with data is never touched.")]
pub struct DemoArgs {
    #[command(flatten)]
    data: DataArgs,
}

pub(super) fn demo(args: DemoArgs, out: &mut dyn Write) -> CliResult {
    let mut store = args.data.open()?;
    let s = demo::fill(&mut store, now_local()).map_err(store_error)?;
    print_lines(
        out,
        &[format!(
            "{}: added {} tags and {} log entries to {}",
            demo::PLANT,
            s.tags,
            s.entries,
            store.folder().display()
        )],
    )
}
