//! The `trip` subcommand: a trip or alarm test on one tag (from the register with
//! `--tag`, or a range given inline), judged by [`crate::form::trip`] and saved with
//! `--save` through [`crate::action::trip`].

use super::check::{save_target, TagArgs};
use super::{print_json, print_lines, CliResult};
use crate::action::trip::{self as action, NewTrip};
use crate::caution::CAUTIONS;
use crate::form::trip::{judge, TripText};
use crate::view::reference::parse_date;
use crate::view::wording::trip as words;
use clap::Args;
use std::io::Write;

/// `loopside trip`
#[derive(Debug, Args)]
#[command(
    group(clap::ArgGroup::new("direction").args(["rising", "falling"]).required(true)),
    after_help = "Examples:\n  \
    loopside trip --tag LT-610 --setpoint 3,2 --rising --trip-at 3.21,3.22,3.21 --reset-at 3.12,3.13,3.12 --tolerance 1\n  \
    loopside trip --range 0..10 --unit bar --setpoint 2 --falling --trip-at \"1,96;1,97\" --reset-at \"2,10;2,11\" --tolerance 0,5 --json\n\
    One trip and one reset value per run, in the order run; use ';' between items to write decimal commas.\n\
    Repeatability is the spread of the trip values (max − min) in % of span."
)]
pub struct TripArgs {
    #[command(flatten)]
    which: TagArgs,
    /// The setpoint, in the unit of the value shown (flow for square root, the table's
    /// output for a table); a suffix of the same quantity is converted (850 kPa).
    #[arg(long, allow_hyphen_values = true, value_name = "V")]
    setpoint: String,
    /// It trips when the value rises through the setpoint (a high alarm or trip).
    #[arg(long)]
    rising: bool,
    /// It trips when the value falls through the setpoint (a low alarm or trip).
    #[arg(long)]
    falling: bool,
    /// The value at which it tripped, one per run (V1,V2,…).
    #[arg(long, allow_hyphen_values = true, value_name = "LIST")]
    trip_at: String,
    /// The value at which it reset, one per run (R1,R2,…).
    #[arg(long, allow_hyphen_values = true, value_name = "LIST")]
    reset_at: String,
    /// A note for the record.
    #[arg(long, value_name = "TEXT")]
    note: Option<String>,
    /// Date of the test, YYYY-MM-DD (default today).
    #[arg(long, value_name = "DATE")]
    date: Option<String>,
    /// Print the result as Markdown (for a report).
    #[arg(long, conflicts_with = "json")]
    markdown: bool,
    /// Print one JSON object: the stored payload (trip_error_pct, deadband_pct,
    /// repeatability_pct, pass, setpoint_ma, runs…).
    #[arg(long)]
    json: bool,
}

pub(super) fn trip(args: TripArgs, out: &mut dyn Write) -> CliResult {
    let mut tag = args.which.tag()?;
    if args.which.tag.is_none() {
        tag.number = String::new();
    }
    let date = match &args.date {
        Some(d) => parse_date("date", d)?,
        None => chrono::Local::now().date_naive(),
    };
    let result = judge(
        &tag,
        date,
        TripText {
            setpoint: &args.setpoint,
            direction: if args.falling { "falling" } else { "rising" },
            trip_at: &args.trip_at,
            reset_at: &args.reset_at,
            tolerance: "",
            note: args.note.as_deref().unwrap_or(""),
        },
    )?;
    let saved = if args.which.save {
        let (number, mut store) = save_target(&args.which)?;
        Some(
            action::save_trip(
                &mut store,
                chrono::Local::now().fixed_offset(),
                NewTrip {
                    tag: number,
                    initials: args.which.author.as_deref().unwrap_or(""),
                    result: &result,
                },
            )
            .map_err(super::data::store_error)?,
        )
    } else {
        None
    };
    if args.json {
        let mut value = action::payload(&result)?;
        if let Some(saved) = &saved {
            value["saved"] = serde_json::json!(saved.id);
        }
        return print_json(out, &value);
    }
    if args.markdown {
        return write!(out, "{}", words::markdown(&result)).map_err(super::io_failure);
    }
    let mut lines: Vec<String> = words::CAUTIONS
        .iter()
        .chain(CAUTIONS.iter())
        .map(|c| format!("! {c}"))
        .collect();
    lines.push(String::new());
    if !result.tag.is_empty() {
        lines.push(format!("{} — trip test ({})", result.tag, result.date));
    }
    lines.extend(words::lines(&result));
    if let Some(saved) = saved {
        lines.push(saved.to_string());
    }
    print_lines(out, &lines)
}
