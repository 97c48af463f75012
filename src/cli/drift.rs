//! The `drift` subcommand: a tag's as-found errors over its visits, the drift rate by
//! least squares, when the trend reaches the tolerance, and a suggested interval.

use super::data::{store_error, DataArgs};
use super::{print_json, print_lines, CliError, CliResult};
use crate::calibration::drift::{drift, Policy};
use crate::number::parse_number;
use crate::store::Store;
use crate::view::wording::drift as words;
use clap::Args;
use std::io::Write;

/// `loopside drift`
#[derive(Debug, Args)]
#[command(after_help = "Examples:\n  \
    loopside drift PT-208\n  \
    loopside drift PT-208 --fraction 0,25 --max-step 1,5 --json\n\
    The policy: drift may use up --fraction of the tolerance before the next visit (default 0.5),\n\
    and one step may change the interval by a factor of up to --max-step (default 2).")]
pub struct DriftArgs {
    #[command(flatten)]
    data: DataArgs,
    /// Tag number.
    tag: String,
    /// Fraction of the tolerance drift may use up before the next visit (0–1, default 0.5).
    #[arg(long, value_name = "F")]
    fraction: Option<String>,
    /// Largest factor one step may lengthen or shorten the interval by (1–10, default 2).
    #[arg(long, value_name = "S")]
    max_step: Option<String>,
    /// Print one JSON object (rate_pct_per_year, reaches_tolerance_on,
    /// suggested_interval_days, visits, points, policy …).
    #[arg(long)]
    json: bool,
}

pub(super) fn drift_command(args: DriftArgs, out: &mut dyn Write) -> CliResult {
    let mut policy = Policy::default();
    if let Some(f) = &args.fraction {
        policy.fraction_of_tolerance = parse_number("fraction", f)?;
    }
    if let Some(s) = &args.max_step {
        policy.max_step = parse_number("max-step", s)?;
    }
    policy.validate()?;
    let store = args.data.open()?;
    let record = store.require_tag(&args.tag).map_err(store_error)?;
    let entries = store.entries().iter().filter(|e| e.tag == record.id);
    let d = drift(
        entries,
        record.tag.tolerance_percent,
        record.tag.calibration_interval_days,
        policy,
    )?;
    if args.json {
        let mut value = serde_json::to_value(&d).map_err(|e| CliError::Failure(e.to_string()))?;
        value["tag"] = serde_json::json!(record.tag.number);
        if let Some(n) = &d.no_rate {
            value["no_rate_reason"] = serde_json::json!(words::no_rate(n));
        }
        if let Some(w) = words::interval_reasoning(&d) {
            value["suggested_interval_reasoning"] = serde_json::json!(w);
        }
        return print_json(out, &value);
    }
    print_lines(out, &words::lines(&record.tag.number, &d))
}
