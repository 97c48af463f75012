//! `loopside tag …`: keep the tag register (add, edit, list, show, rename, archive).

use super::calc::{LoopArgs, RangeArgs, TopologyArgs, RANGE_REQUIRED, UNIT_REQUIRED};
use super::data::{store_error, DataArgs};
use super::intrinsic::CircuitArgs;
use super::note::{entry_json, entry_line};
use super::{print_json, print_lines, CliError, CliResult};
use crate::action::tag as action;
use crate::error::FieldError;
use crate::form::{Field, FormError};
use crate::journal::{closed_follow_ups, is_open, Entry};
use crate::number::parse_in;
use crate::sensor::Sensor;
use crate::store::{FileStore, Store, TagRecord};
use crate::tag::Tag;
use crate::valve::{FailPosition, ValveAction};
use clap::{Args, Subcommand};
use serde_json::json;
use std::io::Write;

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
    /// Calibration interval: check the loop every N days (`loopside due` lists what is due).
    #[arg(long, value_name = "DAYS", conflicts_with = "no_interval")]
    interval: Option<String>,
    /// Forget the calibration interval.
    #[arg(long)]
    no_interval: bool,
    /// The valve this output loop drives: air-to-open or air-to-close.
    #[arg(long, value_name = "ACTION", conflicts_with = "no_valve")]
    valve_action: Option<String>,
    /// Where the valve fails: closed, open or last.
    #[arg(long, value_name = "POSITION", conflicts_with = "no_valve")]
    fail: Option<String>,
    /// For one valve of a split-range pair, its part of the signal, mA (e.g. 4..12).
    #[arg(
        long,
        allow_hyphen_values = true,
        value_name = "LOW..HIGH",
        conflicts_with = "no_valve"
    )]
    split: Option<String>,
    /// Forget the valve.
    #[arg(long)]
    no_valve: bool,
}

impl DescribeArgs {
    /// The sensor the flags describe: `Ok(None)` when none was given.
    fn sensor(&self) -> Result<Option<Sensor>, FieldError> {
        use crate::form::sensor::{parse_kind, SensorForm, SensorKind};
        // The flag says which family is meant; the form reads the rest.
        let Some(kind) = self.rtd.as_ref().or(self.tc.as_ref()) else {
            return Ok(None);
        };
        let family_ok = match parse_kind(kind) {
            Ok(SensorKind::Rtd(_)) => self.rtd.is_some(),
            Ok(SensorKind::Thermocouple(_)) => self.rtd.is_none(),
            Err(_) => false,
        };
        if !family_ok {
            let want = if self.rtd.is_some() {
                "pt100, pt500 or pt1000"
            } else {
                "B, E, J, K, N, R, S or T"
            };
            return Err(FormError::new(
                Field::Sensor,
                format!("'{}' is not one of {want}", kind.trim()),
            )
            .on_command_line());
        }
        let text = |t: &Option<String>| t.clone().unwrap_or_default();
        SensorForm {
            kind: kind.clone(),
            wiring: text(&self.wires),
            lead_ohms: text(&self.lead_ohms),
            cold_junction: text(&self.cj_c),
        }
        .parse()
        .map_err(FormError::on_command_line)
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
        if let Some(days) = &self.interval {
            let n = crate::number::parse_number("interval", days)?;
            if n.fract() != 0.0 || n < 0.0 || n > f64::from(u32::MAX) {
                return Err(FieldError::new(
                    "interval",
                    format!("'{}' is not a whole number of days", days.trim()),
                ));
            }
            tag.calibration_interval_days = Some(n as u32);
        }
        if self.no_interval {
            tag.calibration_interval_days = None;
        }
        if self.valve_action.is_some() || self.fail.is_some() || self.split.is_some() {
            let mut valve = tag.valve.unwrap_or_default();
            if let Some(a) = &self.valve_action {
                valve.action = Some(ValveAction::parse(a).map_err(|e| e.renamed("valve-action"))?);
            }
            if let Some(f) = &self.fail {
                valve.fail = Some(FailPosition::parse(f)?);
            }
            if let Some(t) = &self.split {
                valve.split_ma = Some(crate::number::parse_range("split", t)?);
            }
            valve.validate()?;
            tag.valve = Some(valve);
        }
        if self.no_valve {
            tag.valve = None;
        }
        Ok(())
    }
}

/// `loopside tag add`
#[derive(Debug, Args)]
#[command(after_help = "Examples:\n  \
    loopside tag add PT-204 --range 0..10 --unit bar --hart --supply 24 --min-volts 10,5 --load \"HART resistor=250\"\n  \
    loopside tag add FT-310 --range 0..3000 --unit m3/h --sqrt --cutoff 1 --service \"Aeration air header flow\"\n  \
    loopside tag add TT-415 --range 0..150 --unit °C --rtd pt100 --wires 3\n  \
    loopside tag add FV-316 --range 0..100 --unit % --source current-output --compliance-volts 18 --drop positioner=9 --valve-action air-to-open --fail closed\n  \
    loopside tag add AIT-532 --range 0..50 --unit NTU --topology four-wire --max-load-ohms 750 --load 'PLC input=250'\n  \
    loopside tag add TT-420 --range -20..80 --unit °C --uo 28 --io 93 --po 0.65 --co 83nF --lo 4.2mH \\\n    \
      --device \"TT-420 tx:ui=30,ii=100,pi=0.75,ci=5nF,li=10uH,group=IIC,t=T4\" --is-cable-m 150 --group IIC\n\
    The intrinsic-safety flags are the ones `loopside intrinsic set` takes; the IS cable length is\n\
    --is-cable-m here (--cable-m is the loop's cable for the voltage budget).")]
#[command(group = RANGE_REQUIRED(), group = UNIT_REQUIRED())]
#[command(mut_arg(CircuitArgs::TAG_CABLE_ID, |a| a.long("is-cable-m")))]
#[command(mut_arg(TopologyArgs::HART_CABLE_ID, |a| a.long("hart-cable-pf-per-m")))]
pub struct TagAddArgs {
    /// Tag number, e.g. LT-101 (any text; never used as a file name).
    number: String,
    #[command(flatten)]
    range: RangeArgs,
    #[command(flatten)]
    describe: DescribeArgs,
    #[command(flatten)]
    loop_args: LoopArgs,
    /// The loop's intrinsically safe circuit (as `loopside intrinsic set`).
    #[command(flatten, next_help_heading = "Intrinsic safety (as `intrinsic set`)")]
    intrinsic: CircuitArgs,
}

/// `loopside tag edit`
#[derive(Debug, Args)]
#[command(after_help = "Examples:\n  \
    loopside tag edit LT-101 --area \"Inlet works, JB-02\" --tolerance 0,25\n  \
    loopside tag edit PDT-707 --range 250..0 --unit mbar\n  \
    loopside tag edit TT-412 --is-cable-m 260\n\
    Giving --range replaces the whole range and transfer (give --sqrt/--table again; the unit is kept unless --unit is given);\n\
    giving any loop option replaces the loop (give --supply and --min-volts again); --no-loop removes it.\n\
    Intrinsic-safety flags change the stored IS data as `loopside intrinsic set` does (a --device list replaces\n\
    the devices); the IS cable length is --is-cable-m here; --no-intrinsic removes the IS data.")]
#[command(mut_arg(CircuitArgs::TAG_CABLE_ID, |a| a.long("is-cable-m")))]
#[command(mut_arg(TopologyArgs::HART_CABLE_ID, |a| a.long("hart-cable-pf-per-m")))]
pub struct TagEditArgs {
    /// Tag number.
    number: String,
    /// All optional: giving `--range` replaces the range and transfer, keeping the unit
    /// and the signal span unless `--unit` or `--signal` is given.
    #[command(flatten)]
    range: RangeArgs,
    #[command(flatten)]
    describe: DescribeArgs,
    #[command(flatten)]
    loop_args: LoopArgs,
    /// Forget the loop configuration.
    #[arg(long)]
    no_loop: bool,
    /// The loop's intrinsically safe circuit (as `loopside intrinsic set`).
    #[command(flatten, next_help_heading = "Intrinsic safety (as `intrinsic set`)")]
    intrinsic: CircuitArgs,
    /// Remove the tag's IS data.
    #[arg(long, conflicts_with_all = CircuitArgs::REMOVE_CONFLICTS)]
    no_intrinsic: bool,
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
    let said = match args.command {
        TagCommand::Add(a) => {
            let mut tag = Tag::new(&a.number, a.range.scale()?)?;
            a.describe.apply(&mut tag)?;
            if !a.loop_args.is_empty() {
                tag.loop_config = Some(a.loop_args.loop_config()?);
            }
            if !a.intrinsic.is_empty() {
                tag.intrinsic = Some(a.intrinsic.circuit_over(None)?);
            }
            action::add_tag(&mut store, tag)
                .map_err(store_error)?
                .to_string()
        }
        TagCommand::Edit(a) => {
            let mut tag = store
                .require_tag(&a.number)
                .map_err(store_error)?
                .tag
                .clone();
            if let Some(scale) = a.range.edited_scale(&tag.scale)? {
                tag.scale = scale;
            }
            a.describe.apply(&mut tag)?;
            if a.no_loop {
                tag.loop_config = None;
            } else if !a.loop_args.is_empty() {
                tag.loop_config = Some(a.loop_args.loop_config()?);
            }
            if a.no_intrinsic {
                tag.intrinsic = None;
            } else if !a.intrinsic.is_empty() {
                tag.intrinsic = Some(a.intrinsic.circuit_over(tag.intrinsic.as_ref())?);
            }
            action::edit_tag(&mut store, &a.number, tag)
                .map_err(store_error)?
                .to_string()
        }
        TagCommand::List(a) => return tag_list(&store, a, out),
        TagCommand::Show(a) => return tag_show(&store, a, out),
        TagCommand::Rename(a) => action::rename_tag(&mut store, &a.number, &a.new_number)
            .map_err(store_error)?
            .to_string(),
        TagCommand::Archive(a) => action::archive_tag(&mut store, &a.number, !a.restore)
            .map_err(store_error)?
            .to_string(),
    };
    print_lines(out, &[said])
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

/// `text` padded with spaces to `width` characters (not bytes).
fn pad(text: &str, width: usize) -> String {
    let n = text.chars().count();
    format!("{text}{}", " ".repeat(width.saturating_sub(n)))
}
