//! `loopside ref …`: keep the reference instruments (add, edit, list, show), which a check
//! names with `--reference ID`.

use super::data::{store_error, DataArgs};
use super::{print_json, print_lines, CliError, CliResult};
use crate::action::reference as action;
use crate::calibration::reference::Reference;
use crate::form::reference::ReferenceText;
use crate::store::Store;
use crate::view::wording::uncertainty as words;
use clap::{Args, Subcommand};
use std::io::Write;

/// `loopside ref …`
#[derive(Debug, Args)]
#[command(after_help = "Examples:\n  \
    loopside ref add PM-07 --description \"Pressure module\" --unit bar --range 0..10 --reading 0,025 --full-scale 0,01 --due 2027-03-31\n  \
    loopside ref add MM-02 --description \"Loop meter, mA\" --unit mA --range 0..24 --reading 0.01 --fixed 0.002 --due 2027-01-15\n  \
    loopside ref edit PM-07 --due 2028-03-31\n  \
    loopside ref list --json\n\
    Accuracy is the data sheet's: ± % of reading + % of full scale (--of range for % of the whole range) + a fixed amount in the unit.")]
pub struct RefArgs {
    #[command(flatten)]
    data: DataArgs,
    #[command(subcommand)]
    command: RefCommand,
}

/// What to do with the reference instruments.
#[derive(Debug, Subcommand)]
pub enum RefCommand {
    /// Add a reference instrument.
    Add(RefAddArgs),
    /// Change a reference instrument (its accuracy, range, due date, description).
    Edit(RefEditArgs),
    /// List the reference instruments.
    List(RefListArgs),
    /// Show one reference instrument and its accuracy across its range.
    Show(RefShowArgs),
}

/// The fields of a reference, each optional (an edit changes only those given).
#[derive(Debug, Args)]
pub struct RefFields {
    /// What it is ("Pressure module, 0–10 bar").
    #[arg(long, value_name = "TEXT")]
    description: Option<String>,
    /// The unit of its range and readings (bar, mA, °C …): what it measures follows.
    #[arg(long, value_name = "U")]
    unit: Option<String>,
    /// Its range, LOW..HIGH.
    #[arg(long, allow_hyphen_values = true, value_name = "LOW..HIGH")]
    range: Option<String>,
    /// ± % of reading.
    #[arg(long, value_name = "PCT")]
    reading: Option<String>,
    /// ± % of full scale (or of the range, with --of range).
    #[arg(long, value_name = "PCT")]
    full_scale: Option<String>,
    /// What --full-scale is a percentage of: full-scale (the top of the range) or range.
    #[arg(long, value_name = "BASIS", value_parser = ["full-scale", "range"])]
    of: Option<String>,
    /// ± a fixed amount in the unit (a suffix of the same quantity is converted).
    #[arg(long, value_name = "V")]
    fixed: Option<String>,
    /// The date its calibration falls due, YYYY-MM-DD.
    #[arg(long, value_name = "DATE")]
    due: Option<String>,
    /// Print the reference saved as one JSON object.
    #[arg(long)]
    json: bool,
}

impl RefFields {
    fn text<'a>(&'a self, id: Option<&'a str>) -> ReferenceText<'a> {
        ReferenceText {
            id,
            description: self.description.as_deref(),
            unit: self.unit.as_deref(),
            range: self.range.as_deref(),
            reading: self.reading.as_deref(),
            full_scale: self.full_scale.as_deref(),
            of: self.of.as_deref(),
            fixed: self.fixed.as_deref(),
            due: self.due.as_deref(),
        }
    }
}

/// `loopside ref add ID …`
#[derive(Debug, Args)]
pub struct RefAddArgs {
    /// Its asset number or serial, as on its label.
    id: String,
    #[command(flatten)]
    fields: RefFields,
}

/// `loopside ref edit ID …`
#[derive(Debug, Args)]
pub struct RefEditArgs {
    /// The reference's id.
    id: String,
    #[command(flatten)]
    fields: RefFields,
}

/// `loopside ref list`
#[derive(Debug, Args)]
pub struct RefListArgs {
    /// Print a JSON array.
    #[arg(long)]
    json: bool,
}

/// `loopside ref show ID`
#[derive(Debug, Args)]
pub struct RefShowArgs {
    /// The reference's id.
    id: String,
    /// Print one JSON object.
    #[arg(long)]
    json: bool,
}

fn json_of(r: &Reference) -> Result<serde_json::Value, CliError> {
    serde_json::to_value(r).map_err(|e| CliError::Failure(e.to_string()))
}

pub(super) fn reference(args: RefArgs, out: &mut dyn Write) -> CliResult {
    let mut store = args.data.open()?;
    match args.command {
        RefCommand::Add(a) => {
            let saved = action::add_reference(&mut store, a.fields.text(Some(&a.id)))
                .map_err(store_error)?;
            if a.fields.json {
                return print_json(out, &json_of(&saved.reference)?);
            }
            print_lines(out, &[saved.to_string(), words::line(&saved.reference)])
        }
        RefCommand::Edit(a) => {
            let saved = action::edit_reference(&mut store, &a.id, a.fields.text(None))
                .map_err(store_error)?;
            if a.fields.json {
                return print_json(out, &json_of(&saved.reference)?);
            }
            print_lines(out, &[saved.to_string(), words::line(&saved.reference)])
        }
        RefCommand::List(a) => {
            if a.json {
                let all = store
                    .references()
                    .iter()
                    .map(json_of)
                    .collect::<Result<Vec<_>, _>>()?;
                return print_json(out, &serde_json::Value::Array(all));
            }
            if store.references().is_empty() {
                return print_lines(
                    out,
                    &[
                        "No reference instruments yet; add one with `loopside ref add`."
                            .to_string(),
                    ],
                );
            }
            let lines: Vec<String> = store.references().iter().map(words::line).collect();
            print_lines(out, &lines)
        }
        RefCommand::Show(a) => {
            let r = store.require_reference(&a.id).map_err(store_error)?;
            if a.json {
                return print_json(out, &json_of(r)?);
            }
            print_lines(out, &words::detail(r))
        }
    }
}
