//! The command-line front: the same core, for the desk, for scripts and for our own
//! end-to-end tests.
//!
//! Each subcommand parses its flags with clap, turns text into numbers with
//! [`crate::number`] (so `12,5` works), calls the core, and prints either a short text
//! answer or, with `--json`, one JSON object on stdout. Bad input is reported on stderr as
//! one line naming the field, with exit code 2; other failures (a file that cannot be
//! written) exit with 1.

mod bundle;
mod calc;
mod check;
pub mod data;
mod drift;
mod due;
mod intrinsic;
mod note;
mod reference;
mod sensors;
mod stroke;
mod tag;
mod trip;

use crate::error::FieldError;
use clap::{Parser, Subcommand};
use std::io::Write;

/// Exit code for bad input (also what clap uses for usage errors).
pub const EXIT_BAD_INPUT: i32 = 2;
/// Exit code for a failure that is not the input's fault.
pub const EXIT_FAILURE: i32 = 1;

/// loopside — 4–20 mA loop calculations and field records for instrument technicians.
#[derive(Debug, Parser)]
#[command(name = "loopside", version, about, long_about = None)]
pub struct Cli {
    /// Data folder of the register and log, given before the subcommand
    /// (`loopside --data-dir D note list`; after it works too).
    #[command(flatten)]
    pub data: data::DataArgs,
    /// What to do. With none, the app window opens (when built with the UI).
    #[command(subcommand)]
    pub command: Option<Command>,
}

/// The subcommands.
// Parsed once per run; boxing the larger argument structs would buy nothing.
#[allow(clippy::large_enum_variant)]
#[derive(Debug, Subcommand)]
pub enum Command {
    /// Convert a reading between mA, % of span, engineering value and volts.
    Convert(calc::ConvertArgs),
    /// Work out a loop's voltage budget at 4 mA, 20 mA and the fault current.
    Budget(calc::BudgetArgs),
    /// Resistance of a cable run from its conductor size, length and temperature.
    Wire(calc::WireArgs),
    /// Convert a value between engineering units.
    Units(calc::UnitsArgs),
    /// Classify a loop current: NAMUR NE 43 bands on 4–20 mA, plain under/within/over on another signal span.
    Status(calc::StatusArgs),
    /// Volts, power and reading error of a sense resistor.
    Resistor(calc::ResistorArgs),
    /// Keep the tag register: add, edit, list, show, rename, archive tags.
    Tag(tag::TagArgs),
    /// Write, list and search the field log; close follow-ups.
    Note(note::NoteArgs),
    /// Write a handoff report (Markdown, CSV or a JSON bundle).
    Export(bundle::ExportArgs),
    /// Merge a JSON bundle from another device into this store.
    Import(bundle::ImportArgs),
    /// Fill an empty store with the demo plant (Brindlemoor Water Reclamation Works).
    Demo(bundle::DemoArgs),
    /// Platinum RTD (IEC 60751): resistance ↔ temperature, class tolerance, lead error.
    Rtd(sensors::RtdArgs),
    /// Thermocouple (NIST ITS-90): EMF ↔ temperature with cold-junction compensation.
    Tc(sensors::TcArgs),
    /// DP level transmitter ranging: LRV, URV, span, zero elevation or suppression.
    Level(sensors::LevelArgs),
    /// Judge an as-found / as-left loop check: errors, hysteresis, verdict.
    Check(check::CheckArgs),
    /// List the loops overdue or due for calibration (tags with an interval).
    Due(due::DueArgs),
    /// A tag's as-found drift over its visits: rate, when it reaches tolerance, a suggested interval.
    Drift(drift::DriftArgs),
    /// Keep the reference instruments (calibrators, meters) a check names: add, edit, list, show.
    Ref(reference::RefArgs),
    /// Judge a trip or alarm test: trip error, deadband, repeatability, the mA to inject.
    Trip(trip::TripArgs),
    /// Stroke-check a control valve on an output loop: demand against position, % of stroke.
    Stroke(stroke::StrokeArgs),
    /// Find a fault step by step from a symptom and your measurements.
    Diagnose(check::DiagnoseArgs),
    /// Intrinsic safety by the entity concept: check a barrier or isolator, field devices
    /// and cable; store a tag's IS data; save the check to its log.
    Intrinsic(intrinsic::IntrinsicArgs),
    /// The same as `intrinsic check`: the entity concept's checks, margins and longest cable.
    Entity(intrinsic::CheckArgs),
    /// List loopside's licence and every third-party crate and font it ships, with licences.
    Licences(LicencesArgs),
}

/// Flags of `loopside licences`.
#[derive(Debug, clap::Args)]
pub struct LicencesArgs {
    /// Print one JSON object: `own`, `font`, `crates` (name, version, licence).
    #[arg(long)]
    pub json: bool,
}

/// An error a subcommand reports: bad input (exit 2) or something else (exit 1).
#[derive(Debug, thiserror::Error)]
pub enum CliError {
    /// The input was wrong; the message names the field.
    #[error("{0}")]
    Input(#[from] FieldError),
    /// Something else failed (I/O, a damaged file).
    #[error("{0}")]
    Failure(String),
}

impl CliError {
    /// The process exit code for this error.
    pub fn exit_code(&self) -> i32 {
        match self {
            CliError::Input(_) => EXIT_BAD_INPUT,
            CliError::Failure(_) => EXIT_FAILURE,
        }
    }
}

/// Result of a subcommand.
pub type CliResult = std::result::Result<(), CliError>;

/// Run one parsed subcommand, writing its answer to `out`.
pub fn run_command(command: Command, out: &mut dyn Write) -> CliResult {
    match command {
        Command::Convert(args) => calc::convert(args, out),
        Command::Budget(args) => calc::budget(args, out),
        Command::Wire(args) => calc::wire(args, out),
        Command::Units(args) => calc::units(args, out),
        Command::Status(args) => calc::status(args, out),
        Command::Resistor(args) => calc::resistor(args, out),
        Command::Tag(args) => tag::tag(args, out),
        Command::Note(args) => note::note(args, out),
        Command::Export(args) => bundle::export(args, out),
        Command::Import(args) => bundle::import(args, out),
        Command::Demo(args) => bundle::demo(args, out),
        Command::Rtd(args) => sensors::rtd(args, out),
        Command::Tc(args) => sensors::tc(args, out),
        Command::Level(args) => sensors::level(args, out),
        Command::Check(args) => check::check(args, out),
        Command::Trip(args) => trip::trip(args, out),
        Command::Ref(args) => reference::reference(args, out),
        Command::Due(args) => due::due(args, out),
        Command::Drift(args) => drift::drift_command(args, out),
        Command::Stroke(args) => stroke::stroke(args, out),
        Command::Diagnose(args) => check::diagnose(args, &mut std::io::stdin().lock(), out),
        Command::Intrinsic(args) => intrinsic::intrinsic(args, out),
        Command::Entity(args) => intrinsic::check(args, out),
        Command::Licences(args) => licences(args, out),
    }
}

/// `loopside licences`: the same list as the About screen.
fn licences(args: LicencesArgs, out: &mut dyn Write) -> CliResult {
    if args.json {
        let crates: Vec<serde_json::Value> = crate::licence::third_party()
            .into_iter()
            .map(
                |c| serde_json::json!({"name": c.name, "version": c.version, "licence": c.licence}),
            )
            .collect();
        let (font, font_licence) = crate::licence::FONT;
        return print_json(
            out,
            &serde_json::json!({
                "own": crate::licence::OWN,
                "font": {"name": font, "licence": font_licence},
                "crates": crates,
            }),
        );
    }
    print_lines(out, &crate::view::about::licence_listing())
}

/// Print `value` as one line of JSON.
pub(crate) fn print_json(out: &mut dyn Write, value: &serde_json::Value) -> CliResult {
    writeln!(out, "{value}").map_err(io_failure)
}

/// Print text lines.
pub(crate) fn print_lines(out: &mut dyn Write, lines: &[String]) -> CliResult {
    for line in lines {
        writeln!(out, "{line}").map_err(io_failure)?;
    }
    Ok(())
}

pub(crate) fn io_failure(e: std::io::Error) -> CliError {
    CliError::Failure(format!("cannot write output: {e}"))
}
