//! The `due` subcommand: which loops are overdue or due for calibration, from each tag's
//! interval and the last check in its log that left it calibrated.

use super::data::DataArgs;
use super::{print_json, print_lines, CliError, CliResult};
use crate::calibration::due::{due_list, parse_within};
use crate::store::Store;
use crate::view::reference::parse_date;
use crate::view::wording::due as words;
use clap::Args;
use std::io::Write;

/// `loopside due`
#[derive(Debug, Args)]
#[command(after_help = "Examples:\n  \
    loopside due\n  \
    loopside due --within 30d --json\n\
    A tag is listed when it has an interval (tag edit TAG --interval 365). Its last calibration is the\n\
    latest as-left check, or as-found check that passed with no adjustment, at the check's own date.")]
pub struct DueArgs {
    #[command(flatten)]
    data: DataArgs,
    /// Also list what falls due within this long: 7d, 30 days, 2w (default 7d).
    #[arg(long, value_name = "WINDOW")]
    within: Option<String>,
    /// List every tag with an interval, due or not.
    #[arg(long)]
    all: bool,
    /// The day to work from, YYYY-MM-DD (default today).
    #[arg(long, value_name = "DATE")]
    date: Option<String>,
    /// Print one JSON object: `date`, `within_days`, `tags` (tag, interval_days,
    /// last_calibrated, due, days_left, status).
    #[arg(long)]
    json: bool,
}

pub(super) fn due(args: DueArgs, out: &mut dyn Write) -> CliResult {
    let within = parse_within(args.within.as_deref().unwrap_or("7d"))?;
    let today = match &args.date {
        Some(d) => parse_date("date", d)?,
        None => chrono::Local::now().date_naive(),
    };
    let store = args.data.open()?;
    let items = due_list(
        store.tags().iter().map(|t| (&t.id, &t.tag)),
        store.entries(),
        today,
        within,
        args.all,
    );
    if args.json {
        let value = serde_json::json!({
            "date": today,
            "within_days": within,
            "tags": serde_json::to_value(&items).map_err(|e| CliError::Failure(e.to_string()))?,
        });
        return print_json(out, &value);
    }
    if items.is_empty() {
        return print_lines(out, &[words::nothing_due(within)]);
    }
    let mut lines = vec![words::heading(today, within)];
    lines.extend(items.iter().map(words::line));
    print_lines(out, &lines)
}
