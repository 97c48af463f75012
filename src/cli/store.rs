//! Register and log subcommands: tag, note, export, import, demo.
//!
//! Every one works on a data folder: `--data-dir DIR`, else the `LOOPSIDE_DATA`
//! environment variable, else the platform's data folder (found here, at the edge; the
//! core is always handed a path). Recovery notices from opening the store are printed on
//! stderr as `warning:` lines and do not stop the command. A folder another loopside has
//! open (the app, say) is waited for up to [`LOCK_WAIT`], then the command stops saying
//! the folder is in use.

use super::calc::{LoopArgs, RangeArgs};
use super::{print_json, print_lines, CliError, CliResult};
use crate::demo;
use crate::error::FieldError;
use crate::journal::{closed_follow_ups, is_open, Entry, FollowUpStatus, Kind, Query};
use crate::number::parse_in;
use crate::report;
use crate::rtd::{RtdKind, Wiring};
use crate::sensor::Sensor;
use crate::store::{record::write_atomically, FileStore, Store, StoreError, TagRecord};
use crate::tag::Tag;
use crate::thermocouple::TcType;
use chrono::{DateTime, Duration, FixedOffset, Local, NaiveDate, TimeZone, Utc};
use clap::{Args, Subcommand};
use serde_json::json;
use std::io::Write;
use std::path::PathBuf;

/// How long a command waits for a data folder another loopside has open.
pub const LOCK_WAIT: std::time::Duration = std::time::Duration::from_millis(2500);

/// Where the data folder is, as given on the command line.
#[derive(Debug, Clone, Args)]
pub struct DataArgs {
    /// Data folder (default: $LOOPSIDE_DATA, else the platform's data folder).
    #[arg(long, value_name = "DIR", global = true)]
    data_dir: Option<PathBuf>,
}

impl DataArgs {
    fn folder(&self) -> Result<PathBuf, CliError> {
        crate::data_folder::resolve(self.data_dir.clone()).ok_or_else(|| {
            CliError::Failure(
                "no data folder could be found for this user; give --data-dir DIR".into(),
            )
        })
    }

    /// Open the data folder's store, reporting any recovery on stderr. When another
    /// loopside (the app, say) has the folder open, wait up to [`LOCK_WAIT`] for it.
    pub(crate) fn open(&self) -> Result<FileStore, CliError> {
        let store = FileStore::open_waiting(&self.folder()?, LOCK_WAIT).map_err(|e| match e {
            StoreError::InUse { .. } => {
                CliError::Failure(format!("{e} (waited {} s)", LOCK_WAIT.as_secs_f64()))
            }
            other => store_error(other),
        })?;
        for r in store.recoveries() {
            eprintln!("warning: {}", r.message);
        }
        Ok(store)
    }
}

/// A store error as a CLI error: bad input exits 2, the rest 1.
pub(crate) fn store_error(e: StoreError) -> CliError {
    match e {
        StoreError::Input(f) => CliError::Input(f),
        other => CliError::Failure(other.to_string()),
    }
}

/// `loopside tag …`
#[derive(Debug, Args)]
#[command(after_help = "Examples:\n  \
    loopside tag add LT-101 --range 0..4,5 --unit m --service \"Inlet wet well level\" --supply 24 --min-volts 10,5 --load \"PLC input=250\"\n  \
    loopside tag list\n  \
    loopside tag rename LT-101 LT-101A")]
pub struct TagArgs {
    #[command(flatten)]
    data: DataArgs,
    #[command(subcommand)]
    command: TagCommand,
}

/// What to do with the tag register.
#[derive(Debug, Subcommand)]
pub enum TagCommand {
    /// Add a tag with its range, transfer and loop.
    Add(TagAddArgs),
    /// Change a tag's description, range or loop.
    Edit(TagEditArgs),
    /// List the tags (archived ones with --all).
    List(TagListArgs),
    /// Show one tag, its open follow-ups and its latest entries.
    Show(TagShowArgs),
    /// Give a tag a new number; its log follows.
    Rename(TagRenameArgs),
    /// Archive a tag (it keeps its log; --restore brings it back).
    Archive(TagArchiveArgs),
}

/// Descriptive options shared by `tag add` and `tag edit`.
#[derive(Debug, Args)]
pub struct DescribeArgs {
    /// What it measures, e.g. "Inlet wet well level".
    #[arg(long, value_name = "TEXT")]
    service: Option<String>,
    /// Where it is: area, building, junction box.
    #[arg(long, value_name = "TEXT")]
    area: Option<String>,
    /// Check tolerance, ± % of span (default 0.5).
    #[arg(long, allow_hyphen_values = true, value_name = "PCT")]
    tolerance: Option<String>,
    /// The transmitter talks HART.
    #[arg(long, conflicts_with = "no_hart")]
    hart: bool,
    /// The transmitter does not talk HART.
    #[arg(long)]
    no_hart: bool,
    /// Free notes.
    #[arg(long, value_name = "TEXT")]
    notes: Option<String>,
    /// The sensor is an RTD: pt100, pt500 or pt1000 (checks then take applied ohms).
    #[arg(long, value_name = "TYPE", conflicts_with_all = ["tc", "no_sensor"])]
    rtd: Option<String>,
    /// RTD connection: 2, 3 or 4 wires (default 3).
    #[arg(long, value_name = "N", requires = "rtd")]
    wires: Option<String>,
    /// Resistance of both RTD leads in series, Ω (matters for 2-wire; default 0).
    #[arg(
        long,
        allow_hyphen_values = true,
        value_name = "OHMS",
        requires = "rtd"
    )]
    lead_ohms: Option<String>,
    /// The sensor is a thermocouple: B, E, J, K, N, R, S or T (checks then take applied mV).
    #[arg(long, value_name = "TYPE", conflicts_with = "no_sensor")]
    tc: Option<String>,
    /// The transmitter's cold-junction temperature for --tc, °C (default 20).
    #[arg(long, allow_hyphen_values = true, value_name = "T", requires = "tc")]
    cj_c: Option<String>,
    /// Forget the sensor.
    #[arg(long)]
    no_sensor: bool,
}

impl DescribeArgs {
    /// The sensor the flags describe: `Ok(None)` when none was given.
    fn sensor(&self) -> Result<Option<Sensor>, FieldError> {
        if let Some(kind) = &self.rtd {
            let element = kind.parse::<RtdKind>().map_err(|e| e.renamed("rtd"))?;
            let wiring = match &self.wires {
                Some(w) => {
                    let n = crate::number::parse_number("wires", w)?;
                    if n.fract() != 0.0 || !(2.0..=4.0).contains(&n) {
                        return Err(FieldError::new(
                            "wires",
                            format!("{} is not an RTD connection; use 2, 3 or 4", w.trim()),
                        ));
                    }
                    Wiring::from_count(n as u32).map_err(|e| e.renamed("wires"))?
                }
                None => Wiring::ThreeWire,
            };
            let lead_ohms = match &self.lead_ohms {
                Some(r) => parse_in("lead-ohms", r, "Ω")?,
                None => 0.0,
            };
            if !(lead_ohms >= 0.0 && lead_ohms.is_finite()) {
                return Err(FieldError::new(
                    "lead-ohms",
                    format!("must be 0 Ω or more, got {lead_ohms}"),
                ));
            }
            return Ok(Some(Sensor::Rtd {
                element,
                wiring,
                lead_ohms,
            }));
        }
        if let Some(kind) = &self.tc {
            let tc = kind.parse::<TcType>().map_err(|e| e.renamed("tc"))?;
            let cj_c = match &self.cj_c {
                Some(t) => parse_in("cj-c", t, "°C")?,
                None => 20.0,
            };
            if !(-50.0..=100.0).contains(&cj_c) {
                return Err(FieldError::new(
                    "cj-c",
                    format!(
                        "{cj_c} °C is not a transmitter's terminal temperature; give −50 to 100 °C"
                    ),
                ));
            }
            return Ok(Some(Sensor::Thermocouple { tc, cj_c }));
        }
        Ok(None)
    }

    fn apply(&self, tag: &mut Tag) -> Result<(), FieldError> {
        if let Some(s) = &self.service {
            tag.service = s.trim().to_string();
        }
        if let Some(a) = &self.area {
            tag.area = a.trim().to_string();
        }
        if let Some(t) = &self.tolerance {
            tag.tolerance_percent = parse_in("tolerance", t, "%")?;
        }
        if self.hart {
            tag.hart = true;
        }
        if self.no_hart {
            tag.hart = false;
        }
        if let Some(n) = &self.notes {
            tag.notes = n.trim().to_string();
        }
        if let Some(sensor) = self.sensor()? {
            tag.sensor = Some(sensor);
        }
        if self.no_sensor {
            tag.sensor = None;
        }
        Ok(())
    }
}

/// `loopside tag add`
#[derive(Debug, Args)]
#[command(after_help = "Examples:\n  \
    loopside tag add PT-204 --range 0..10 --unit bar --hart --supply 24 --min-volts 10,5 --load \"HART resistor=250\"\n  \
    loopside tag add FT-310 --range 0..3000 --unit m3/h --sqrt --cutoff 1 --service \"Aeration air header flow\"\n  \
    loopside tag add TT-415 --range 0..150 --unit °C --rtd pt100 --wires 3")]
pub struct TagAddArgs {
    /// Tag number, e.g. LT-101 (any text; never used as a file name).
    number: String,
    #[command(flatten)]
    range: RangeArgs,
    #[command(flatten)]
    describe: DescribeArgs,
    #[command(flatten)]
    loop_args: LoopArgs,
}

/// `loopside tag edit`
#[derive(Debug, Args)]
#[command(after_help = "Examples:\n  \
    loopside tag edit LT-101 --area \"Inlet works, JB-02\" --tolerance 0,25\n  \
    loopside tag edit PDT-707 --range 250..0 --unit mbar\n\
    Giving --range replaces the whole range and transfer (give --sqrt/--table again; the unit is kept unless --unit is given);\n\
    giving any loop option replaces the loop (give --supply and --min-volts again); --no-loop removes it.")]
pub struct TagEditArgs {
    /// Tag number.
    number: String,
    #[command(flatten)]
    range: EditRangeArgs,
    #[command(flatten)]
    describe: DescribeArgs,
    #[command(flatten)]
    loop_args: LoopArgs,
    /// Forget the loop configuration.
    #[arg(long)]
    no_loop: bool,
}

/// A new range for `tag edit`: the same options as `tag add`, all optional; giving
/// `--range` replaces the range and transfer, keeping the unit unless `--unit` is given.
#[derive(Debug, Args)]
pub struct EditRangeArgs {
    /// New range as LRV..URV in the engineering unit.
    #[arg(long, allow_hyphen_values = true, value_name = "LRV..URV")]
    range: Option<String>,
    /// Engineering unit of the new range.
    #[arg(long, value_name = "U", requires = "range")]
    unit: Option<String>,
    /// Square-root (DP flow) transfer.
    #[arg(long, requires = "range")]
    sqrt: bool,
    /// Low-flow cutoff for --sqrt, % of flow (0–100).
    #[arg(
        long,
        allow_hyphen_values = true,
        value_name = "PCT",
        requires = "sqrt"
    )]
    cutoff: Option<String>,
    /// The same cutoff in % of DP span instead (0.01 % of DP is 1 % of flow).
    #[arg(
        long,
        allow_hyphen_values = true,
        value_name = "PCT",
        requires = "sqrt",
        conflicts_with = "cutoff"
    )]
    cutoff_dp: Option<String>,
    /// Where the square root is taken: receiver (default) or transmitter.
    #[arg(long, value_name = "WHERE", requires = "sqrt", value_parser = ["receiver", "transmitter"])]
    root_in: Option<String>,
    /// Characterization table as IN:OUT pairs.
    #[arg(
        long,
        allow_hyphen_values = true,
        value_name = "IN:OUT;…",
        conflicts_with = "sqrt",
        requires = "range"
    )]
    table: Option<String>,
    /// Unit of the table's output.
    #[arg(long, value_name = "U", requires = "table")]
    table_unit: Option<String>,
    /// Signal span in mA, default 4..20.
    #[arg(
        long,
        allow_hyphen_values = true,
        value_name = "LOW..HIGH",
        requires = "range"
    )]
    signal: Option<String>,
}

impl EditRangeArgs {
    /// The new range, if one was given, as the same flags `tag add` takes.
    fn range_args(&self, current_unit: &str) -> Option<RangeArgs> {
        let range = self.range.clone()?;
        Some(RangeArgs {
            range,
            unit: self
                .unit
                .clone()
                .unwrap_or_else(|| current_unit.to_string()),
            sqrt: self.sqrt,
            cutoff: self.cutoff.clone(),
            cutoff_dp: self.cutoff_dp.clone(),
            root_in: self.root_in.clone(),
            table: self.table.clone(),
            table_unit: self.table_unit.clone(),
            signal: self.signal.clone(),
        })
    }
}

/// `loopside tag list`
#[derive(Debug, Args)]
#[command(after_help = "Examples:\n  loopside tag list\n  loopside tag list --all --json")]
pub struct TagListArgs {
    /// Include archived tags.
    #[arg(long)]
    all: bool,
    /// Print a JSON array.
    #[arg(long)]
    json: bool,
}

/// `loopside tag show`
#[derive(Debug, Args)]
#[command(after_help = "Examples:\n  loopside tag show LT-101\n  loopside tag show FT-310 --json")]
pub struct TagShowArgs {
    /// Tag number.
    number: String,
    /// Print one JSON object.
    #[arg(long)]
    json: bool,
}

/// `loopside tag rename`
#[derive(Debug, Args)]
#[command(after_help = "Example:\n  loopside tag rename LT-101 LT-101A")]
pub struct TagRenameArgs {
    /// Current tag number.
    number: String,
    /// New tag number.
    new_number: String,
}

/// `loopside tag archive`
#[derive(Debug, Args)]
#[command(
    after_help = "Examples:\n  loopside tag archive PT-204\n  loopside tag archive PT-204 --restore"
)]
pub struct TagArchiveArgs {
    /// Tag number.
    number: String,
    /// Bring an archived tag back to the working list.
    #[arg(long)]
    restore: bool,
}

pub(super) fn tag(args: TagArgs, out: &mut dyn Write) -> CliResult {
    let mut store = args.data.open()?;
    match args.command {
        TagCommand::Add(a) => {
            let mut tag = Tag::new(&a.number, a.range.scale()?)?;
            a.describe.apply(&mut tag)?;
            if !a.loop_args.is_empty() {
                tag.loop_config = Some(a.loop_args.loop_config()?);
            }
            store.add_tag(tag.clone()).map_err(store_error)?;
            print_lines(out, &[format!("added {}", tag.number)])
        }
        TagCommand::Edit(a) => {
            let record = store.require_tag(&a.number).map_err(store_error)?.clone();
            let mut tag = record.tag.clone();
            if let Some(r) = a.range.range_args(&tag.scale.unit) {
                tag.scale = r.scale()?;
            }
            a.describe.apply(&mut tag)?;
            if a.no_loop {
                tag.loop_config = None;
            } else if !a.loop_args.is_empty() {
                tag.loop_config = Some(a.loop_args.loop_config()?);
            }
            let changed = tag != record.tag;
            store.update_tag(&record.id, tag).map_err(store_error)?;
            print_lines(
                out,
                &[if changed {
                    format!("saved {}", record.tag.number)
                } else {
                    format!("{}: nothing changed", record.tag.number)
                }],
            )
        }
        TagCommand::List(a) => tag_list(&store, a, out),
        TagCommand::Show(a) => tag_show(&store, a, out),
        TagCommand::Rename(a) => {
            let old = store
                .require_tag(&a.number)
                .map_err(store_error)?
                .tag
                .number
                .clone();
            store
                .rename_tag(&a.number, &a.new_number)
                .map_err(store_error)?;
            print_lines(
                out,
                &[format!(
                    "renamed {old} to {}; its log follows",
                    a.new_number.trim()
                )],
            )
        }
        TagCommand::Archive(a) => {
            let number = store
                .require_tag(&a.number)
                .map_err(store_error)?
                .tag
                .number
                .clone();
            store
                .set_archived(&a.number, !a.restore)
                .map_err(store_error)?;
            let what = if a.restore {
                "restored"
            } else {
                "archived (its log is kept)"
            };
            print_lines(out, &[format!("{number} {what}")])
        }
    }
}

fn tag_json(store: &dyn Store, t: &TagRecord) -> serde_json::Value {
    let closed = closed_follow_ups(store.entries());
    let mine: Vec<&Entry> = store.entries().iter().filter(|e| e.tag == t.id).collect();
    let open = mine.iter().filter(|e| is_open(e, &closed)).count();
    json!({
        "id": t.id,
        "number": t.tag.number,
        "service": t.tag.service,
        "area": t.tag.area,
        "lrv": t.tag.scale.lrv,
        "urv": t.tag.scale.urv,
        "unit": t.tag.scale.unit,
        "archived": t.tag.archived,
        "entries": mine.len(),
        "open_follow_ups": open,
    })
}

fn tag_list(store: &FileStore, a: TagListArgs, out: &mut dyn Write) -> CliResult {
    let tags: Vec<&TagRecord> = store
        .tags()
        .iter()
        .filter(|t| a.all || !t.tag.archived)
        .collect();
    if a.json {
        let v: Vec<serde_json::Value> = tags.iter().map(|t| tag_json(store, t)).collect();
        return print_json(out, &serde_json::Value::Array(v));
    }
    if tags.is_empty() {
        return print_lines(
            out,
            &["no tags yet: add one with `loopside tag add`, or try `loopside demo`".into()],
        );
    }
    let lines: Vec<String> = tags
        .iter()
        .map(|t| {
            // Pad by characters, not bytes, so units such as m³/h and °C line up.
            let range = format!(
                "{}..{} {}",
                t.tag.scale.lrv, t.tag.scale.urv, t.tag.scale.unit
            );
            format!(
                "{}  {}  {}{}",
                pad(&t.tag.number, 12),
                pad(&range, 16),
                t.tag.service,
                if t.tag.archived { " (archived)" } else { "" }
            )
        })
        .collect();
    print_lines(out, &lines)
}

fn tag_show(store: &FileStore, a: TagShowArgs, out: &mut dyn Write) -> CliResult {
    let t = store.require_tag(&a.number).map_err(store_error)?;
    let closed = closed_follow_ups(store.entries());
    let mine: Vec<&Entry> = store.entries().iter().filter(|e| e.tag == t.id).collect();
    let open: Vec<&Entry> = mine
        .iter()
        .copied()
        .filter(|e| is_open(e, &closed))
        .collect();
    if a.json {
        let mut v = tag_json(store, t);
        v["tag"] = serde_json::to_value(&t.tag).map_err(|e| CliError::Failure(e.to_string()))?;
        v["open"] = open.iter().map(|e| entry_json(store, e, &closed)).collect();
        return print_json(out, &v);
    }
    let tag = &t.tag;
    let mut lines = vec![format!("{}  {}", tag.number, tag.service)];
    lines.extend(
        crate::view::tag_sheet::facts(tag)
            .into_iter()
            .map(|f| format!("{:<10} {}", f.label.to_lowercase(), f.value)),
    );
    lines.push(format!(
        "log        {} entries, {} open follow-up(s)",
        mine.len(),
        open.len()
    ));
    for e in &open {
        lines.push(format!("  OPEN {}", entry_line(store, e)));
    }
    for e in mine.iter().rev().take(5) {
        lines.push(format!("  {}", entry_line(store, e)));
    }
    print_lines(out, &lines)
}

/// `loopside note …`
#[derive(Debug, Args)]
#[command(after_help = "Examples:\n  \
    loopside note add LT-101 \"3.2 mA at the marshalling terminals; loose wire in the head\" --kind fault-finding --author CD\n  \
    loopside note list --open\n  \
    loopside note done 019a6f3c2b10")]
pub struct NoteArgs {
    #[command(flatten)]
    data: DataArgs,
    #[command(subcommand)]
    command: NoteCommand,
}

/// What to do with the field log.
#[derive(Debug, Subcommand)]
pub enum NoteCommand {
    /// Write an entry for a tag; prints its id once it is safely saved.
    Add(NoteAddArgs),
    /// Mark an open follow-up done (a new entry; the follow-up itself is kept).
    Done(NoteDoneArgs),
    /// List or search entries.
    List(NoteListArgs),
}

/// `loopside note add`
#[derive(Debug, Args)]
#[command(after_help = "Examples:\n  \
    loopside note add FT-310 \"Check DP zero at next blower stop\" --kind follow-up --author AB\n  \
    loopside note add TT-412 \"Correction: reference read 36.4 °C\" --refers-to 019a6f3c2b10\n  \
    loopside note add PT-204 \"As found 12.10 mA at 50 %\" --kind loop-check --payload '{\"measured_ma\":12.1}'")]
pub struct NoteAddArgs {
    /// Tag number.
    number: String,
    /// What was done or found.
    text: String,
    /// note, finding, loop-check, fault-finding or follow-up (default note).
    #[arg(long, value_name = "K")]
    kind: Option<String>,
    /// Author's initials.
    #[arg(long, value_name = "A")]
    author: Option<String>,
    /// The entry this one corrects (id or its first characters).
    #[arg(long, value_name = "ID")]
    refers_to: Option<String>,
    /// Structured detail as JSON (measurements with units, check results).
    #[arg(long, value_name = "JSON")]
    payload: Option<String>,
}

/// `loopside note done`
#[derive(Debug, Args)]
#[command(
    after_help = "Example:\n  loopside note done 019a6f3c2b10 --author EF --text \"Zero checked, within 0.1 %\""
)]
pub struct NoteDoneArgs {
    /// The follow-up's id (or its first characters).
    id: String,
    /// Author's initials.
    #[arg(long, value_name = "A")]
    author: Option<String>,
    /// What was done (default "done").
    #[arg(long, value_name = "TEXT")]
    text: Option<String>,
}

/// `loopside note list`
#[derive(Debug, Args)]
#[command(after_help = "Examples:\n  \
    loopside note list LT-101\n  \
    loopside note list --search \"loose wire\" --since 2026-11-27 --json\n  \
    loopside note list --open\n\
    Dates are local days: --since 2026-11-27 --until 2026-11-30 covers both days in full.")]
pub struct NoteListArgs {
    /// Only this tag.
    number: Option<String>,
    /// Text to look for (case-insensitive).
    #[arg(long, value_name = "TEXT")]
    search: Option<String>,
    /// From this local date (YYYY-MM-DD) or time (RFC 3339).
    #[arg(long, value_name = "DATE")]
    since: Option<String>,
    /// Up to and including this local date, or before this time (RFC 3339).
    #[arg(long, value_name = "DATE")]
    until: Option<String>,
    /// Only follow-ups still open.
    #[arg(long)]
    open: bool,
    /// Only this kind (repeat for several).
    #[arg(long, value_name = "K")]
    kind: Vec<String>,
    /// Print a JSON array.
    #[arg(long)]
    json: bool,
}

fn now_local() -> DateTime<FixedOffset> {
    Local::now().fixed_offset()
}

fn parse_payload(text: &str) -> Result<serde_json::Value, FieldError> {
    serde_json::from_str(text)
        .map_err(|e| FieldError::new("payload", format!("is not valid JSON: {e}")))
}

/// A local date (start of day, or start of the next day for an inclusive end) or an
/// RFC 3339 time.
fn parse_when(field: &str, text: &str, end_of_day: bool) -> Result<DateTime<Utc>, FieldError> {
    let t = text.trim();
    if let Ok(dt) = DateTime::parse_from_rfc3339(t) {
        return Ok(dt.with_timezone(&Utc));
    }
    let bad = || {
        FieldError::new(
            field,
            format!("'{t}' is not a date; use YYYY-MM-DD such as 2026-11-30, or a time such as 2026-11-30T07:00:00+01:00"),
        )
    };
    let mut date = NaiveDate::parse_from_str(t, "%Y-%m-%d").map_err(|_| bad())?;
    if end_of_day {
        date = date.checked_add_signed(Duration::days(1)).ok_or_else(bad)?;
    }
    let midnight = date.and_hms_opt(0, 0, 0).ok_or_else(bad)?;
    Local
        .from_local_datetime(&midnight)
        .earliest()
        .map(|d| d.with_timezone(&Utc))
        .ok_or_else(bad)
}

fn query_from(
    store: &dyn Store,
    tags: &[String],
    since: &Option<String>,
    until: &Option<String>,
) -> Result<Query, CliError> {
    let mut q = Query::default();
    for n in tags {
        q.tags
            .push(store.require_tag(n).map_err(store_error)?.id.clone());
    }
    if let Some(s) = since {
        q.since = Some(parse_when("since", s, false)?);
    }
    if let Some(u) = until {
        q.until = Some(parse_when("until", u, true)?);
    }
    if let (Some(s), Some(u)) = (q.since, q.until) {
        if u <= s {
            return Err(FieldError::new("until", "must be after --since").into());
        }
    }
    Ok(q)
}

fn entry_json(
    store: &dyn Store,
    e: &Entry,
    closed: &std::collections::HashSet<&crate::journal::EntryId>,
) -> serde_json::Value {
    json!({
        "id": e.id,
        "tag": store.tag_number(&e.tag),
        "time": e.time.to_rfc3339(),
        "kind": e.kind.as_str(),
        "author": e.author,
        "text": e.text,
        "status": e.status.map(|s| match s { FollowUpStatus::Open => "open", FollowUpStatus::Done => "done" }),
        "open": is_open(e, closed),
        "refers_to": e.refers_to,
        "payload": e.payload,
    })
}

fn entry_line(store: &dyn Store, e: &Entry) -> String {
    let first = e.text.lines().next().unwrap_or_default();
    format!(
        "{}  {:<10} {:<13} {:<4} {}  [{}]",
        e.time.format("%Y-%m-%d %H:%M %:z"),
        store.tag_number(&e.tag),
        e.kind.as_str(),
        if e.author.is_empty() { "?" } else { &e.author },
        first,
        e.id
    )
}

pub(super) fn note(args: NoteArgs, out: &mut dyn Write) -> CliResult {
    let mut store = args.data.open()?;
    match args.command {
        NoteCommand::Add(a) => {
            let tag = store
                .require_tag(&a.number)
                .map_err(store_error)?
                .id
                .clone();
            let kind = match &a.kind {
                Some(k) => Kind::parse(k)?,
                None => Kind::Note,
            };
            let mut entry = Entry::new(
                &tag,
                now_local(),
                a.author.as_deref().unwrap_or(""),
                kind,
                &a.text,
            )?;
            if let Some(r) = &a.refers_to {
                entry.refers_to = Some(
                    store
                        .find_entry(r)
                        .map_err(|e| match e {
                            StoreError::Input(f) => StoreError::Input(f.renamed("refers-to")),
                            other => other,
                        })
                        .map_err(store_error)?
                        .id
                        .clone(),
                );
            }
            if let Some(p) = &a.payload {
                entry.payload = Some(parse_payload(p)?);
            }
            // The id is printed only after append returns: the entry is on disk by then.
            let id = store.append(entry).map_err(store_error)?;
            print_lines(out, &[id.to_string()])
        }
        NoteCommand::Done(a) => {
            let open = store.find_entry(&a.id).map_err(store_error)?.clone();
            let closed = closed_follow_ups(store.entries());
            if closed.contains(&open.id) {
                return Err(FieldError::new(
                    "id",
                    format!("follow-up {} is already done", open.id),
                )
                .into());
            }
            let entry = Entry::closing(
                &open,
                now_local(),
                a.author.as_deref().unwrap_or(""),
                a.text.as_deref().unwrap_or(""),
            )?;
            let id = store.append(entry).map_err(store_error)?;
            print_lines(out, &[id.to_string()])
        }
        NoteCommand::List(a) => {
            let tags: Vec<String> = a.number.iter().cloned().collect();
            let mut q = query_from(&store, &tags, &a.since, &a.until)?;
            q.text = a.search.clone();
            q.open_only = a.open;
            for k in &a.kind {
                q.kinds.push(Kind::parse(k)?);
            }
            let found = store.search(&q);
            let closed = closed_follow_ups(store.entries());
            if a.json {
                let v: Vec<serde_json::Value> = found
                    .iter()
                    .map(|e| entry_json(&store, e, &closed))
                    .collect();
                return print_json(out, &serde_json::Value::Array(v));
            }
            if found.is_empty() {
                return print_lines(out, &["no entries match".into()]);
            }
            let lines: Vec<String> = found.iter().map(|e| entry_line(&store, e)).collect();
            print_lines(out, &lines)
        }
    }
}

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

/// `text` padded with spaces to `width` characters (not bytes).
fn pad(text: &str, width: usize) -> String {
    let n = text.chars().count();
    format!("{text}{}", " ".repeat(width.saturating_sub(n)))
}
