//! `loopside stroke`: a control valve's stroke check on an output loop, judged point by
//! point against a tolerance in % of stroke, and saved to the tag's log with `--save`
//! (`stroke-check` kind, through [`crate::action::stroke`]).

use super::{print_json, print_lines, CliResult};
use crate::action::stroke as action;
use crate::check::Stage;
use crate::form::stroke::StrokeForm;
use crate::leave::{self, Item, LeaveList};
use crate::stroke::{ReadAt, StrokeRecord, CAUTION};
use crate::view::reference::{parse_date, ReferenceText};
use clap::Args;
use std::io::Write;

/// `loopside stroke`
#[derive(Debug, Args)]
#[command(after_help = "Examples:\n  \
    loopside stroke --demand 0,25,50,75,100 --position 0,5,24,49,76,99 --tolerance 2\n  \
    loopside stroke --position 0,25.5,50.5,75,99.5 --tolerance 2 --action air-to-open --fail closed --tag FV-315 --save --done all\n  \
    loopside stroke --demand 0,25,50,75,100 --position 0,0,0,50,100 --tolerance 2 --split 12..20 --json\n\
    Demands are % of the output signal (0 % = 4 mA); positions are read in % open. --split is one\n\
    valve's part of the signal in mA for a split-range pair. Lists use ',' between items, or ';' to\n\
    write decimal commas. Stroking a valve moves the process: see the caution printed first.")]
pub struct StrokeArgs {
    /// Demands set, % of the output signal (default 0,25,50,75,100).
    #[arg(long, allow_hyphen_values = true, value_name = "LIST")]
    demand: Option<String>,
    /// Positions read, % open, one per demand.
    #[arg(long, allow_hyphen_values = true, value_name = "LIST")]
    position: String,
    /// Acceptance tolerance, ± % of stroke.
    #[arg(long, allow_hyphen_values = true, value_name = "PCT")]
    tolerance: String,
    /// For one valve of a split-range pair, its part of the signal, mA (e.g. 4..12).
    #[arg(long, allow_hyphen_values = true, value_name = "LOW..HIGH")]
    split: Option<String>,
    /// The valve's action: air-to-open or air-to-close.
    #[arg(long, value_name = "ACTION")]
    action: Option<String>,
    /// Where the valve fails: closed, open or last.
    #[arg(long, value_name = "POSITION")]
    fail: Option<String>,
    /// Where the position was read: valve (its indicator) or feedback.
    #[arg(long, value_name = "WHERE")]
    read_at: Option<String>,
    /// as-found (default) or as-left.
    #[arg(long, value_parser = ["as-found", "as-left"])]
    stage: Option<String>,
    /// A note for the record.
    #[arg(long, value_name = "TEXT")]
    note: Option<String>,
    /// Reference instrument id (the mA source or calibrator).
    #[arg(long, value_name = "ID", requires_all = ["reference_accuracy", "reference_due"])]
    reference_id: Option<String>,
    /// Reference accuracy: % or mA.
    #[arg(long, value_name = "ACC", requires = "reference_id")]
    reference_accuracy: Option<String>,
    /// Date the reference's calibration falls due, YYYY-MM-DD.
    #[arg(long, value_name = "DATE", requires = "reference_id")]
    reference_due: Option<String>,
    /// Date of the check, YYYY-MM-DD (default today).
    #[arg(long, value_name = "DATE")]
    date: Option<String>,
    /// Before-you-leave items done, comma-separated: loop, links, forces, operations; or
    /// all. Items not named are recorded as NOT done (not confirmed).
    #[arg(long, value_name = "ITEMS")]
    done: Option<String>,
    /// Tag number (needed with --save).
    #[arg(long, value_name = "NUMBER")]
    tag: Option<String>,
    #[command(flatten)]
    data: super::data::DataArgs,
    /// Save the check to the tag's log.
    #[arg(long, requires = "tag")]
    save: bool,
    /// Initials to sign the saved entry with (stored upper-cased).
    #[arg(long, value_name = "A", requires = "save")]
    author: Option<String>,
    /// Print one JSON object.
    #[arg(long)]
    json: bool,
}

pub(super) fn stroke(args: StrokeArgs, out: &mut dyn Write) -> CliResult {
    let text = |t: &Option<String>| t.clone().unwrap_or_default();
    let form = StrokeForm {
        demand: text(&args.demand),
        position: args.position.clone(),
        tolerance: args.tolerance.clone(),
        split: text(&args.split),
        action: text(&args.action),
        fail: text(&args.fail),
    };
    let result = form.parse()?.judge()?;
    let date = match &args.date {
        Some(d) => parse_date("date", d)?,
        None => chrono::Local::now().date_naive(),
    };
    let reference = crate::view::reference::parse(
        ReferenceText {
            id: args.reference_id.as_deref().unwrap_or(""),
            accuracy: args.reference_accuracy.as_deref().unwrap_or(""),
            due: args.reference_due.as_deref().unwrap_or(""),
        },
        "%",
    )?;
    let done: Vec<Item> = match &args.done {
        Some(t) => leave::parse_list("done", t)?,
        None => Vec::new(),
    };
    let record = StrokeRecord {
        result,
        date,
        stage: Stage::parse(args.stage.as_deref().unwrap_or("as-found"))?,
        read_at: args.read_at.as_deref().map(ReadAt::parse).transpose()?,
        reference,
        note: text(&args.note),
        before_leaving: Some(LeaveList::from_done(&done)),
    };
    let saved = if args.save {
        let number = args.tag.as_deref().unwrap_or("");
        let mut store = args.data.open()?;
        Some(
            action::save_stroke(
                &mut store,
                chrono::Local::now().fixed_offset(),
                action::NewStroke {
                    tag: number,
                    initials: args.author.as_deref().unwrap_or(""),
                    record: &record,
                },
            )
            .map_err(super::data::store_error)?,
        )
    } else {
        None
    };
    if args.json {
        let mut value = action::payload(&record)?;
        if let Some(saved) = &saved {
            value["saved"] = serde_json::json!(saved.id);
        }
        return print_json(out, &value);
    }
    let mut lines = vec![format!("! {CAUTION}"), String::new()];
    if let Some(t) = &args.tag {
        lines.push(format!("Stroke check of {t}, {}", record.stage.label()));
    }
    lines.extend(crate::view::wording::stroke::lines(&record));
    if let Some(l) = &record.before_leaving {
        if !l.all_done() {
            lines.push(l.summary());
        }
    }
    if let Some(saved) = saved {
        lines.push(saved.to_string());
    }
    print_lines(out, &lines)
}
