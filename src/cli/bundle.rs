//! `loopside export`, `loopside import` and `loopside demo`: hand-over reports, bundles
//! from another device, and the demo plant.

use super::data::{now_local, query_from, store_error, DataArgs};
use super::{print_json, print_lines, CliError, CliResult};
use crate::action::bundle::{export_handover, handover, import_bundle, Destination, Format};
use crate::demo;
use clap::Args;
use std::io::Write;
use std::path::PathBuf;

/// `loopside export`
#[derive(Debug, Args)]
#[command(after_help = "Examples:\n  \
    loopside export --format md --since 2026-11-27\n  \
    loopside export --format md --since 12h\n  \
    loopside export --format csv --tag LT-101 --tag PT-204 --out handoff.csv\n  \
    loopside export --format json --out bundle.json")]
pub struct ExportArgs {
    #[command(flatten)]
    data: DataArgs,
    /// md (readable), csv (spreadsheet) or json (for `loopside import`).
    #[arg(long, value_name = "FORMAT", value_parser = ["md", "csv", "json"])]
    format: String,
    /// From: 12 h or 3 d back, today, yesterday, a local date (YYYY-MM-DD), a local
    /// date and time (YYYY-MM-DD HH:MM) or a time with its offset (RFC 3339).
    #[arg(long, allow_hyphen_values = true, value_name = "WHEN")]
    since: Option<String>,
    /// Up to: the same forms; a day (today, yesterday, a date) is included in full.
    #[arg(long, allow_hyphen_values = true, value_name = "WHEN")]
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
    let format = Format::parse(&args.format)?;
    match &args.out {
        Some(path) => {
            let done = export_handover(
                &store,
                now_local(),
                &q,
                format,
                &Destination::File(path.clone()),
            )
            .map_err(store_error)?;
            print_lines(out, &[done.to_string()])
        }
        None => {
            let h = handover(&store, now_local(), &q, format);
            out.write_all(h.text.as_bytes()).map_err(super::io_failure)
        }
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
    let mut store = args.data.open()?;
    let done = import_bundle(&mut store, &args.file).map_err(store_error)?;
    if args.json {
        return print_json(
            out,
            &serde_json::to_value(&done.0).map_err(|e| CliError::Failure(e.to_string()))?,
        );
    }
    print_lines(out, &done.lines())
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
