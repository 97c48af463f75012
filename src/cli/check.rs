//! The `check` and `diagnose` subcommands: loop checks and guided fault-finding.
//!
//! Both work on one tag: read from the register (`--tag LT-101`, `--data-dir DIR`), or
//! given inline with the same range and loop flags as `convert` and `budget`
//! (`--range 0..10 --unit bar --supply 24 --min-volts 10,5 --load 250`; `--tag` then only
//! names it). `--save` writes the result to the tag's log.

use super::calc::{LoopArgs, RangeArgs};
use super::{print_json, print_lines, CliError, CliResult};
use crate::action::check::{self as action, SensorInputs};
use crate::caution::CAUTIONS;
use crate::check::{Device, InputRange, LoopCheck, Stage};
use crate::diagnose::measure::Measurement;
use crate::diagnose::procedure::{self, Procedure, StepKind};
use crate::diagnose::session::{Answer, AnswerSheet, Progress, Session};
use crate::diagnose::Settings;
use crate::error::FieldError;
use crate::leave::{self, Item, LeaveList};
use crate::number::{parse_in, parse_list, parse_range};
use crate::rtd::{RtdKind, Wiring};
use crate::sensor::Sensor;
use crate::store::Store;
use crate::tag::Tag;
use crate::thermocouple::TcType;
use crate::view::wording::finding;
use clap::Args;
use std::io::{BufRead, Write};

/// Which tag to work on: a number from the register, or a range (and loop) given inline.
#[derive(Debug, Args)]
#[command(group = super::calc::UNIT_WITH_RANGE())]
pub struct TagArgs {
    /// Tag number, e.g. LT-101: read from the register unless --range is given.
    #[arg(long, value_name = "NUMBER")]
    pub(super) tag: Option<String>,
    #[command(flatten)]
    pub(super) data: super::data::DataArgs,
    /// Save the result to the tag's log (needs --tag of a tag in the register).
    #[arg(long, requires = "tag")]
    pub(super) save: bool,
    /// Initials to sign the saved entry with (stored upper-cased).
    #[arg(long, value_name = "A", requires = "save")]
    pub(super) author: Option<String>,
    #[command(flatten)]
    range: Option<RangeArgs>,
    #[command(flatten)]
    loop_args: LoopArgs,
    /// The transmitter talks HART.
    #[arg(long)]
    hart: bool,
    /// Acceptance tolerance, ± % of span (default: the tag's, else 0.5).
    #[arg(long, allow_hyphen_values = true, value_name = "PCT")]
    tolerance: Option<String>,
}

impl TagArgs {
    /// The tag these flags describe: from the register when only --tag is given.
    pub(super) fn tag(&self) -> Result<Tag, CliError> {
        let Some(range) = &self.range else {
            let Some(number) = &self.tag else {
                return Err(CliError::Input(FieldError::new(
                    "tag",
                    "give --tag NUMBER of a tag in the register, or the range with --range LRV..URV --unit U",
                )));
            };
            let store = self.data.open()?;
            let mut tag = store
                .require_tag(number)
                .map_err(super::data::store_error)?
                .tag
                .clone();
            if let Some(t) = &self.tolerance {
                tag.tolerance_percent = parse_in("tolerance", t, "%")?;
            }
            tag.validate()?;
            return Ok(tag);
        };
        let number = self.tag.as_deref().unwrap_or("loop");
        let mut tag = Tag::new(number, range.scale()?)?;
        if !self.loop_args.is_empty() {
            tag.loop_config = Some(self.loop_args.loop_config()?);
        }
        tag.hart = self.hart;
        if let Some(t) = &self.tolerance {
            tag.tolerance_percent = parse_in("tolerance", t, "%")?;
        }
        tag.validate()?;
        Ok(tag)
    }
}

/// What was put right before leaving the loop (the list in [`crate::leave`]).
#[derive(Debug, Args)]
pub struct LeaveArgs {
    /// Before-you-leave items done, comma-separated: loop (back in its normal mode), links
    /// (closed, meter out, covers on), forces (and bypasses removed), operations (told); or
    /// all. Items not named are recorded as NOT done (not confirmed).
    #[arg(long, value_name = "ITEMS")]
    done: Option<String>,
}

impl LeaveArgs {
    /// The items named, or `None` when `--done` was not given.
    fn items(&self) -> Result<Option<Vec<Item>>, FieldError> {
        self.done
            .as_deref()
            .map(|t| leave::parse_list("done", t))
            .transpose()
    }
}

/// The hint printed when not everything was confirmed done.
fn leave_hint(list: &LeaveList) -> Option<String> {
    (!list.all_done()).then(|| {
        format!(
            "(name what was put right with --done {} or --done all)",
            Item::ALL.map(Item::id).join(",")
        )
    })
}

/// `loopside check`
#[derive(Debug, Args)]
#[command(after_help = "Examples:\n  \
    loopside check --tag PT-204 --range 0..10 --unit bar --device transmitter \\\n    \
    --applied 0,2.5,5,7.5,10,7.5,5,2.5,0 --measured 4.01,8.02,12.03,16.02,20.01,16.04,12.05,8.03,4.02 \\\n    \
    --done loop,links,forces,operations\n  \
    loopside check --range 0..4,5 --unit m --device receiver --applied \"4;12;20\" --measured \"0,00;2,26;4,50\" --json\n\
    Lists are in test order, rising then falling; use ';' between items to write decimal commas.\n\
    --done records what was put right before leaving the loop; items not named are recorded as NOT done.")]
pub struct CheckArgs {
    #[command(flatten)]
    which: TagArgs,
    #[command(flatten)]
    leave: LeaveArgs,
    /// transmitter: apply engineering values, read mA; receiver: inject mA, read the display.
    #[arg(long, value_parser = ["transmitter", "receiver"])]
    device: String,
    /// What was applied at each point (engineering values, or mA for a receiver).
    #[arg(long, allow_hyphen_values = true, value_name = "LIST")]
    applied: String,
    /// What was read at each point (mA, or displayed values for a receiver).
    #[arg(long, allow_hyphen_values = true, value_name = "LIST")]
    measured: String,
    /// as-found (default) or as-left.
    #[arg(long, value_parser = ["as-found", "as-left"])]
    stage: Option<String>,
    /// An adjustment was made during this visit.
    #[arg(long)]
    adjusted: bool,
    /// A note for the record.
    #[arg(long, value_name = "TEXT")]
    note: Option<String>,
    /// Reference instrument id (asset number).
    #[arg(long, value_name = "ID", requires_all = ["reference_accuracy", "reference_due"])]
    reference_id: Option<String>,
    /// Reference accuracy: ± % of span (plain number or with %), or with a unit (0.004 mA, 0.5 mbar).
    #[arg(
        long,
        allow_hyphen_values = true,
        value_name = "ACC",
        requires = "reference_id"
    )]
    reference_accuracy: Option<String>,
    /// Date the reference's calibration falls due, YYYY-MM-DD.
    #[arg(long, value_name = "DATE", requires = "reference_id")]
    reference_due: Option<String>,
    /// A reference instrument from the store (`ref add`), by id; give it twice for the
    /// input's and the output's (a pressure module and a mA meter). Each point then gets
    /// the references' combined accuracy (root-sum-square), its TUR and a decision.
    #[arg(
        long = "reference",
        value_name = "ID",
        conflicts_with = "reference_id",
        action = clap::ArgAction::Append
    )]
    references: Vec<String>,
    /// How a point is judged with the references: simple (|error| ≤ tolerance) or
    /// guarded (acceptance limit = tolerance − combined reference accuracy), per
    /// ILAC-G8:09/2019 §4.2. Default simple.
    #[arg(long, value_name = "RULE", value_parser = ["simple", "guarded"], requires = "references")]
    decision_rule: Option<String>,
    /// Date of the check, YYYY-MM-DD (default today).
    #[arg(long, value_name = "DATE")]
    date: Option<String>,
    /// ΔP range of a square-root transmitter, LRV..URV (applied values are then ΔP).
    #[arg(
        long,
        allow_hyphen_values = true,
        value_name = "LRV..URV",
        requires = "input_unit"
    )]
    input_range: Option<String>,
    /// Unit of --input-range.
    #[arg(long, value_name = "U", requires = "input_range")]
    input_unit: Option<String>,
    /// The applied values are a temperature sensor's input: ohms of this RTD
    /// (pt100, pt500, pt1000), turned into the range unit by IEC 60751.
    #[arg(long, value_name = "TYPE", conflicts_with_all = ["tc", "sensor_input"])]
    rtd: Option<String>,
    /// The applied values are millivolts of this thermocouple type (B E J K N R S T),
    /// with the transmitter's cold junction at --cj-c (NIST ITS-90).
    #[arg(
        long,
        value_name = "TYPE",
        requires = "cj_c",
        conflicts_with = "sensor_input"
    )]
    tc: Option<String>,
    /// Cold-junction temperature for --tc, °C.
    #[arg(long, allow_hyphen_values = true, value_name = "T", requires = "tc")]
    cj_c: Option<String>,
    /// The applied values are the input of the sensor stored with the tag (Ω, mV or Pa).
    #[arg(long)]
    sensor_input: bool,
    /// Print the table as Markdown (for a report).
    #[arg(long, conflicts_with = "json")]
    markdown: bool,
    /// Print one JSON object.
    #[arg(long)]
    json: bool,
}

/// The tag `--save` writes to, and its store.
pub(super) fn save_target(which: &TagArgs) -> Result<(&str, crate::store::FileStore), CliError> {
    let number = which
        .tag
        .as_deref()
        .ok_or_else(|| FieldError::new("tag", "--save needs --tag NUMBER"))?;
    Ok((number, which.data.open()?))
}

use crate::view::reference::parse_date;

pub(super) fn check(args: CheckArgs, out: &mut dyn Write) -> CliResult {
    let tag = args.which.tag()?;
    let device = Device::parse(&args.device)?;
    let date = match &args.date {
        Some(d) => parse_date("date", d)?,
        None => chrono::Local::now().date_naive(),
    };
    let mut check = LoopCheck::for_tag(&tag, device, date)
        .stage(Stage::parse(args.stage.as_deref().unwrap_or("as-found"))?)
        .adjusted(args.adjusted);
    if args.which.tag.is_none() {
        check = check.tag_number("");
    }
    if let Some(n) = &args.note {
        check = check.note(n);
    }
    if let (Some(text), Some(unit)) = (&args.input_range, &args.input_unit) {
        let (lrv, urv) = parse_range("input-range", text)?;
        check = check.input_range(InputRange {
            lrv,
            urv,
            unit: unit.trim().to_string(),
        });
    }
    let reference = crate::view::reference::ReferenceText {
        id: args.reference_id.as_deref().unwrap_or(""),
        accuracy: args.reference_accuracy.as_deref().unwrap_or(""),
        due: args.reference_due.as_deref().unwrap_or(""),
    };
    let range_unit = args.input_unit.as_deref().unwrap_or(&tag.scale.unit);
    if let Some(r) = crate::view::reference::parse(reference, range_unit)? {
        check = check.reference(r);
    }
    let mut applied = parse_list("applied", &args.applied)?;
    let sensor = sensor_for_check(&args, &tag)?;
    let mut sensor_inputs = None;
    if let Some(sensor) = sensor {
        if device != Device::Transmitter {
            return Err(CliError::Input(FieldError::new(
                "device",
                "a sensor input (--rtd, --tc, --sensor-input) is applied to a transmitter",
            )));
        }
        sensor_inputs = Some(SensorInputs {
            sensor: Some(sensor),
            unit: sensor.applied_unit().to_string(),
            values: applied.clone(),
        });
        applied = applied
            .iter()
            .map(|&v| {
                sensor
                    .measured_from_applied(v, &tag.scale.unit)
                    .map(|m| m.in_range_unit)
            })
            .collect::<Result<Vec<f64>, FieldError>>()?;
    }
    let measured = parse_list("measured", &args.measured)?;
    let mut result = check.run(&applied, &measured)?;
    result.left(&args.leave.items()?.unwrap_or_default());
    if !args.references.is_empty() {
        let rule = crate::check::uncertainty::DecisionRule::parse(
            args.decision_rule.as_deref().unwrap_or("simple"),
        )?;
        // The store is opened only to read the references and closed again before a save
        // opens it for writing.
        let references = {
            let store = args.which.data.open()?;
            args.references
                .iter()
                .map(|id| store.require_reference(id).cloned())
                .collect::<Result<Vec<_>, _>>()
                .map_err(super::data::store_error)?
        };
        result.with_references(&references, rule)?;
    }
    let mut value = action::payload(&result, sensor_inputs.as_ref())?;
    let saved = if args.which.save {
        let (number, mut store) = save_target(&args.which)?;
        let saved = action::save_check(
            &mut store,
            chrono::Local::now().fixed_offset(),
            action::NewCheck {
                tag: number,
                initials: args.which.author.as_deref().unwrap_or(""),
                result: &result,
                sensor: sensor_inputs,
            },
        )
        .map_err(super::data::store_error)?;
        Some(saved)
    } else {
        None
    };
    if args.json {
        if let Some(saved) = &saved {
            value["saved"] = serde_json::json!(saved.id);
        }
        return print_json(out, &value);
    }
    if args.markdown {
        return write!(out, "{}", crate::view::wording::check::markdown(&result))
            .map_err(super::io_failure);
    }
    let mut lines: Vec<String> = CAUTIONS.iter().map(|c| format!("! {c}")).collect();
    lines.push(String::new());
    lines.extend(
        crate::view::wording::check::markdown(&result)
            .lines()
            .filter(|l| !l.starts_with("|---"))
            .map(str::to_string),
    );
    lines.extend(result.before_leaving.as_ref().and_then(leave_hint));
    if let Some(saved) = saved {
        lines.push(saved.to_string());
    }
    print_lines(out, &lines)
}

/// `loopside diagnose`
#[derive(Debug, Args)]
#[command(
    after_help = "Symptoms: stuck-low, pegged-high, steady-wrong, short-of-top, noisy, disagree, hart-no-answer.\n\
Examples:\n  \
    loopside diagnose --tag LT-101 --range 0..4,5 --unit m --supply 24 --min-volts 10,5 --load \"PLC input=250\" --symptom stuck-low\n  \
    loopside diagnose --range 0..16 --unit bar --symptom steady-wrong --answers answers.json --done all --json\n\
Without --answers the steps are asked on the terminal, and at the end what was put right before leaving\n\
(unless --done names it; items not named or not answered yes are recorded as NOT done).\n\
An answers file is one JSON object: measurement keys (tx_ma, rx_ma, supply_v, terminal_v, resistor_v, resistor_ohms,\n\
loop_ohms, shield_ac_v, swing_ma, displayed, control_value, process_value) with numbers, and question step ids with yes/no."
)]
pub struct DiagnoseArgs {
    #[command(flatten)]
    which: TagArgs,
    #[command(flatten)]
    leave: LeaveArgs,
    /// The symptom (or procedure id).
    #[arg(long, value_name = "NAME")]
    symptom: String,
    /// Answer from a JSON file instead of asking on the terminal.
    #[arg(long, value_name = "FILE")]
    answers: Option<std::path::PathBuf>,
    /// A plant's own procedure file (repeatable); searched before the built-in ones.
    #[arg(long, value_name = "FILE")]
    procedure: Vec<std::path::PathBuf>,
    /// Allowance between two mA readings, mA (default 0.05).
    #[arg(long, allow_hyphen_values = true, value_name = "MA")]
    meter_tolerance: Option<String>,
    /// Print the session (steps, measurements, findings, conclusion) as one JSON object.
    #[arg(long)]
    json: bool,
}

fn read_file(field: &str, path: &std::path::Path) -> Result<String, CliError> {
    std::fs::read_to_string(path).map_err(|e| {
        CliError::Input(FieldError::new(
            field,
            format!("cannot read {}: {e}", path.display()),
        ))
    })
}

pub(super) fn diagnose(
    args: DiagnoseArgs,
    input: &mut dyn BufRead,
    out: &mut dyn Write,
) -> CliResult {
    let tag = args.which.tag()?;
    let mut extra = Vec::new();
    for path in &args.procedure {
        let text = read_file("procedure", path)?;
        extra.push(Procedure::from_json(&text).map_err(|e| {
            FieldError::new(
                format!("procedure {}: {}", path.display(), e.field),
                e.reason,
            )
        })?);
    }
    let procedure = procedure::find_for(&args.symptom, procedure::loop_of(&tag), &extra)?;
    let mut settings = Settings::default();
    if let Some(t) = &args.meter_tolerance {
        settings.meter_tolerance_ma = parse_in("meter-tolerance", t, "mA")?;
    }
    settings.validate()?;
    let mut session = Session::start_with(&procedure, &tag, settings);
    let named = args.leave.items()?;
    match &args.answers {
        Some(path) => {
            let sheet = AnswerSheet::from_json(&read_file("answers", path)?, &tag)?;
            if let Progress::Next(id) = session.run_sheet(&procedure, &tag, &sheet)? {
                let missing = missing_answer(&session, &procedure, &id, &tag);
                return Err(CliError::Input(FieldError::new("answers", missing)));
            }
        }
        None => {
            interactive(&mut session, &procedure, &tag, input, out, !args.json)?;
            if named.is_none() {
                let done = ask_leave(input, out)?;
                session.left(&done);
            }
        }
    }
    if let Some(done) = &named {
        session.left(done);
    } else if session.before_leaving.is_none() {
        session.left(&[]);
    }
    let mut value = serde_json::to_value(&session).map_err(|e| CliError::Failure(e.to_string()))?;
    let saved = if args.which.save {
        let (_, mut store) = save_target(&args.which)?;
        let saved = crate::action::session::save_session(
            &mut store,
            chrono::Local::now().fixed_offset(),
            &session,
            args.which.author.as_deref().unwrap_or(""),
        )
        .map_err(super::data::store_error)?;
        Some(saved)
    } else {
        None
    };
    if args.json {
        // Each finding with its words (the payload keeps the code and detail only).
        if let Some(list) = value["findings"].as_array_mut() {
            for (json, f) in list.iter_mut().zip(&session.findings) {
                json["text"] = serde_json::json!(finding::text(f));
            }
        }
        if let Some(saved) = &saved {
            value["saved"] = serde_json::json!(saved.id);
        }
        return print_json(out, &value);
    }
    let mut lines = Vec::new();
    if args.answers.is_some() {
        lines.push(format!("{} — {}", procedure.title, tag.number));
        lines.extend(CAUTIONS.iter().map(|c| format!("! {c}")));
        lines.push(String::new());
    }
    lines.extend(report_lines(&session));
    if args.answers.is_some() {
        lines.extend(session.before_leaving.as_ref().and_then(leave_hint));
    }
    if let Some(saved) = saved {
        lines.push(saved.to_string());
    }
    print_lines(out, &lines)
}

fn missing_answer(session: &Session, procedure: &Procedure, id: &str, tag: &Tag) -> String {
    match procedure.step(id).map(|s| &s.kind) {
        Some(StepKind::Question { question, .. }) => {
            format!("no yes/no answer for step '{id}' ({question})")
        }
        _ => {
            let pending = session.pending(procedure);
            let list: Vec<String> = pending
                .iter()
                .map(|m| format!("'{}' ({}, {})", m.key(), m.label(), m.unit(tag)))
                .collect();
            format!("step '{id}' needs {}", list.join(" and "))
        }
    }
}

fn report_lines(session: &Session) -> Vec<String> {
    let mut lines = vec!["Findings:".to_string()];
    for f in &session.findings {
        lines.push(format!("- [{}] {}", f.step, finding::text(f)));
    }
    if let Some(c) = &session.conclusion {
        lines.push(String::new());
        lines.push(format!("Conclusion: {}", c.text));
        lines.extend(c.cautions.iter().map(|c| format!("  ! {c}")));
    }
    if !session.technician_conclusion.is_empty() {
        lines.push(format!("Technician: {}", session.technician_conclusion));
    }
    if let Some(l) = &session.before_leaving {
        lines.push(String::new());
        lines.push(format!("{}:", leave::HEADING));
        lines.extend(l.lines().into_iter().map(|line| format!("  {line}")));
    }
    lines
}

/// Ask on the terminal which before-you-leave items were done: yes or no for each; Enter
/// or the end of input counts as not confirmed.
fn ask_leave(input: &mut dyn BufRead, out: &mut dyn Write) -> Result<Vec<Item>, CliError> {
    print_lines(
        out,
        &[format!(
            "{} (yes for each thing done; Enter or no leaves it recorded as NOT done):",
            leave::HEADING
        )],
    )?;
    let mut done = Vec::new();
    'items: for item in Item::ALL {
        loop {
            prompt(out, &format!("  {} (yes/no): ", item.text()))?;
            let mut line = String::new();
            let n = input
                .read_line(&mut line)
                .map_err(|e| CliError::Failure(format!("cannot read the answer: {e}")))?;
            if n == 0 {
                print_lines(out, &[String::new()])?;
                break 'items;
            }
            match line.trim().to_lowercase().as_str() {
                "y" | "yes" => {
                    done.push(item);
                    break;
                }
                "" | "n" | "no" => break,
                _ => print_lines(out, &["  Please answer yes or no.".to_string()])?,
            }
        }
    }
    print_lines(out, &[String::new()])?;
    Ok(done)
}

fn prompt(out: &mut dyn Write, text: &str) -> CliResult {
    write!(out, "{text}").map_err(super::io_failure)?;
    out.flush().map_err(super::io_failure)
}

fn read_answer(input: &mut dyn BufRead) -> Result<String, CliError> {
    let mut line = String::new();
    let n = input
        .read_line(&mut line)
        .map_err(|e| CliError::Failure(format!("cannot read the answer: {e}")))?;
    if n == 0 {
        return Err(CliError::Input(FieldError::new(
            "input",
            "ended before the procedure reached a conclusion; run again, or use --answers FILE",
        )));
    }
    Ok(line.trim().to_string())
}

/// Ask on the terminal until the procedure concludes. Bad answers are explained and asked
/// again; the end of input stops with an error.
fn interactive(
    session: &mut Session,
    procedure: &Procedure,
    tag: &Tag,
    input: &mut dyn BufRead,
    out: &mut dyn Write,
    show_findings: bool,
) -> CliResult {
    let mut lines = vec![
        format!("{} — {}", procedure.title, tag.number),
        String::new(),
    ];
    lines.push("Before you start:".to_string());
    lines.extend(CAUTIONS.iter().map(|c| format!("! {c}")));
    print_lines(out, &lines)?;
    let mut shown = 0;
    while let Some(step) = session.current_step(procedure) {
        let mut shown_step = vec![String::new(), format!("» {}", step.instruction)];
        shown_step.extend(step.cautions.iter().map(|c| format!("  ! {c}")));
        print_lines(out, &shown_step)?;
        let answer = match &step.kind {
            StepKind::Question { question, .. } => loop {
                prompt(out, &format!("  {question} (yes/no): "))?;
                match read_answer(input)?.to_lowercase().as_str() {
                    "y" | "yes" => break Answer::YesNo(true),
                    "n" | "no" => break Answer::YesNo(false),
                    _ => print_lines(out, &["  Please answer yes or no.".to_string()])?,
                }
            },
            StepKind::Measure { .. } => {
                let mut values = std::collections::BTreeMap::new();
                for m in session.pending(procedure) {
                    let v = ask_value(m, tag, input, out)?;
                    values.insert(m, v);
                }
                Answer::Values(values)
            }
            StepKind::Conclusion { .. } => break,
        };
        session.answer(procedure, tag, answer)?;
        if show_findings {
            let new: Vec<String> = session.findings[shown..]
                .iter()
                .map(|f| format!("  → {}", finding::text(f)))
                .collect();
            print_lines(out, &new)?;
        }
        shown = session.findings.len();
    }
    if let Some(c) = &session.conclusion {
        let mut shown_end = vec![String::new(), format!("Conclusion: {}", c.text)];
        shown_end.extend(c.cautions.iter().map(|c| format!("  ! {c}")));
        print_lines(out, &shown_end)?;
    }
    prompt(out, "Your own conclusion (optional, Enter to skip): ")?;
    let mut line = String::new();
    if input.read_line(&mut line).is_ok() {
        session.conclude(&line);
    }
    print_lines(out, &[String::new()])
}

fn ask_value(
    m: Measurement,
    tag: &Tag,
    input: &mut dyn BufRead,
    out: &mut dyn Write,
) -> Result<f64, CliError> {
    loop {
        let unit = m.unit(tag);
        let unit_text = if unit.is_empty() {
            String::new()
        } else {
            format!(" [{unit}]")
        };
        prompt(out, &format!("  {}{unit_text}: ", m.label()))?;
        let text = read_answer(input)?;
        match m.parse(tag, &text) {
            Ok(v) => return Ok(v),
            Err(e) => print_lines(out, &[format!("  {e}")])?,
        }
    }
}

/// The sensor whose input the applied values are, if the technician said so.
fn sensor_for_check(args: &CheckArgs, tag: &Tag) -> Result<Option<Sensor>, CliError> {
    if let Some(kind) = &args.rtd {
        let element = kind
            .parse::<RtdKind>()
            .map_err(|e| CliError::Input(e.renamed("rtd")))?;
        return Ok(Some(Sensor::Rtd {
            element,
            wiring: Wiring::FourWire,
            lead_ohms: 0.0,
        }));
    }
    if let Some(kind) = &args.tc {
        let tc = kind
            .parse::<TcType>()
            .map_err(|e| CliError::Input(e.renamed("tc")))?;
        let cj_c = match &args.cj_c {
            Some(t) => parse_in("cj-c", t, "°C")?,
            None => 0.0,
        };
        return Ok(Some(Sensor::Thermocouple { tc, cj_c }));
    }
    if args.sensor_input {
        return match tag.sensor {
            Some(s) => Ok(Some(s)),
            None => Err(CliError::Input(FieldError::new(
                "sensor-input",
                format!(
                    "tag {} has no sensor recorded; use --rtd or --tc",
                    tag.number
                ),
            ))),
        };
    }
    Ok(None)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn dates_must_be_iso() {
        assert!(parse_date("date", "2026-12-01").is_ok());
        assert_eq!(parse_date("date", "01/12/2026").unwrap_err().field, "date");
    }
}
