//! Calculator subcommands: convert, budget, wire, units, status, resistor.

use super::{print_json, print_lines, CliError, CliResult};
use crate::budget::LoopConfig;
use crate::display;
use crate::error::FieldError;
use crate::form::conductor::parse_conductor;
use crate::form::loop_form::{ElementText, LoopForm};
use crate::form::range::{Bounds, CutoffOf, RangeForm, TransferChoice};
use crate::form::topology::TopologyForm;
use crate::form::FormError;
use crate::number::{parse_in, parse_number, parse_range};
use crate::scale::{Scale, SignalSpan, Transfer};
use crate::signal::{classify, BandLimits};
use crate::units;
use crate::wire::Conductor;
use clap::Args;
use serde_json::json;
use std::io::Write;

/// How a tag's range and transfer are given on the command line: the one declaration of
/// these flags, shared by `convert`, `check`, `diagnose`, `tag add` and `tag edit`. Every
/// flag is optional here and needs `--range`; a command that must have a range says so
/// with [`RANGE_REQUIRED`] and [`UNIT_REQUIRED`] (`tag edit` does not: without `--range`
/// the tag's range is kept, and without `--unit` its unit).
#[derive(Debug, Clone, Default, Args)]
pub struct RangeArgs {
    /// Range as LRV..URV in the engineering unit (LRV > URV for a reversed range).
    #[arg(long, allow_hyphen_values = true, value_name = "LRV..URV")]
    pub range: Option<String>,
    /// Engineering unit of the range (bar, m, °C, m³/h … or free text such as pH).
    #[arg(long, value_name = "U", requires = "range")]
    pub unit: Option<String>,
    /// Square-root (DP flow) transfer.
    #[arg(long, requires = "range")]
    pub sqrt: bool,
    /// Low-flow cutoff for --sqrt, % of flow (0–100); 1 % of flow is 0.01 % of DP.
    #[arg(
        long,
        allow_hyphen_values = true,
        value_name = "PCT",
        requires = "sqrt"
    )]
    pub cutoff: Option<String>,
    /// The same cutoff given in % of DP span instead (0.01 % of DP is 1 % of flow).
    #[arg(
        long,
        allow_hyphen_values = true,
        value_name = "PCT",
        requires = "sqrt",
        conflicts_with = "cutoff"
    )]
    pub cutoff_dp: Option<String>,
    /// Where the square root is taken: receiver (default) or transmitter.
    #[arg(long, value_name = "WHERE", requires = "sqrt", value_parser = ["receiver", "transmitter"])]
    pub root_in: Option<String>,
    /// Characterization table as IN:OUT pairs, e.g. "0:0;1:5.1;2:12" (IN in the range unit).
    #[arg(
        long,
        allow_hyphen_values = true,
        value_name = "IN:OUT;…",
        conflicts_with = "sqrt",
        requires = "range"
    )]
    pub table: Option<String>,
    /// Unit of the table's output (e.g. m³).
    #[arg(long, value_name = "U", requires = "table")]
    pub table_unit: Option<String>,
    /// Signal span in mA, default 4..20.
    #[arg(
        long,
        allow_hyphen_values = true,
        value_name = "LOW..HIGH",
        requires = "range"
    )]
    pub signal: Option<String>,
}

/// For a command that must have a range: `--range` is required
/// (`#[command(group = RANGE_REQUIRED())]`).
#[allow(non_snake_case)]
pub fn RANGE_REQUIRED() -> clap::ArgGroup {
    clap::ArgGroup::new("range-required")
        .arg("range")
        .required(true)
}

/// For a command that must have a range: `--unit` is required too.
#[allow(non_snake_case)]
pub fn UNIT_REQUIRED() -> clap::ArgGroup {
    clap::ArgGroup::new("unit-required")
        .arg("unit")
        .required(true)
}

/// For a command where the range may be left out (the tag's own is used): when `--range`
/// is given, `--unit` is required with it.
#[allow(non_snake_case)]
pub fn UNIT_WITH_RANGE() -> clap::ArgGroup {
    clap::ArgGroup::new("unit-with-range")
        .arg("range")
        .requires("unit")
}

impl RangeArgs {
    /// The flags as the range form ([`crate::form::range`]): the one parser the tag form
    /// on the screen uses too.
    pub fn form(&self) -> RangeForm {
        let transfer = if self.sqrt {
            match self.root_in.as_deref() {
                Some("transmitter") => TransferChoice::RootInTransmitter,
                _ => TransferChoice::RootInReceiver,
            }
        } else if self.table.is_some() {
            TransferChoice::Table
        } else {
            TransferChoice::Linear
        };
        RangeForm {
            bounds: Bounds::Together(self.range.clone().unwrap_or_default()),
            unit: self.unit.clone().unwrap_or_default(),
            transfer,
            cutoff: self
                .cutoff
                .clone()
                .or_else(|| self.cutoff_dp.clone())
                .unwrap_or_default(),
            cutoff_of: if self.cutoff.is_none() && self.cutoff_dp.is_some() {
                CutoffOf::Dp
            } else {
                CutoffOf::Flow
            },
            table: self.table.clone().unwrap_or_default(),
            table_unit: self.table_unit.clone().unwrap_or_default(),
            signal: self.signal.clone().unwrap_or_default(),
        }
    }

    /// Build the core scale from the flags.
    pub fn scale(&self) -> Result<Scale, FieldError> {
        self.form().parse(None).map_err(FormError::on_command_line)
    }

    /// The scale for `tag edit`: `None` when no `--range` is given (the tag's is kept);
    /// else the new range and transfer, with the tag's own unit and signal span where
    /// `--unit` and `--signal` are not given, as on the tag form.
    pub fn edited_scale(&self, current: &Scale) -> Result<Option<Scale>, FieldError> {
        if self.range.is_none() {
            return Ok(None);
        }
        let mut args = self.clone();
        args.unit.get_or_insert_with(|| current.unit.clone());
        args.signal
            .get_or_insert_with(|| crate::form::range::signal_text(&current.signal));
        args.scale().map(Some)
    }
}

/// `loopside convert`
#[derive(Debug, Args)]
#[command(after_help = "Examples:\n  \
    loopside convert --range 0..10 --unit bar --ma 12\n  \
    loopside convert --range 0..3000 --unit m3/h --sqrt --cutoff 1 --percent 25\n  \
    loopside convert --range 0..4,5 --unit m --volts 3,2 --ohms 250 --to ft --json")]
#[command(group = RANGE_REQUIRED(), group = UNIT_REQUIRED())]
pub struct ConvertArgs {
    #[command(flatten)]
    range: RangeArgs,
    /// Loop current, mA.
    #[arg(long, allow_hyphen_values = true, value_name = "X", group = "input")]
    ma: Option<String>,
    /// Percent of signal span.
    #[arg(long, allow_hyphen_values = true, value_name = "X", group = "input")]
    percent: Option<String>,
    /// Engineering value in the range unit (the table's output unit for a table).
    #[arg(long, allow_hyphen_values = true, value_name = "X", group = "input")]
    value: Option<String>,
    /// Volts measured across a known resistor (give --ohms).
    #[arg(
        long,
        allow_hyphen_values = true,
        value_name = "X",
        group = "input",
        requires = "ohms"
    )]
    volts: Option<String>,
    /// The resistor the volts were measured across, Ω.
    #[arg(long, allow_hyphen_values = true, value_name = "R", requires = "volts")]
    ohms: Option<String>,
    /// Show the value in another unit of the same quantity.
    #[arg(long, value_name = "UNIT")]
    to: Option<String>,
    /// Local atmospheric pressure with its unit (`0,95 bar`), used when --to crosses from
    /// gauge to absolute or back; default the standard atmosphere, 101.325 kPa.
    #[arg(long, value_name = "PRESSURE", requires = "to")]
    atm: Option<String>,
    /// Print one JSON object.
    #[arg(long)]
    json: bool,
}

pub(super) fn convert(args: ConvertArgs, out: &mut dyn Write) -> CliResult {
    let scale = args.range.scale()?;
    let reading = if let Some(t) = &args.ma {
        scale.from_ma(parse_in("ma", t, "mA")?)?
    } else if let Some(t) = &args.percent {
        scale.from_percent(parse_in("percent", t, "%")?)?
    } else if let Some(t) = &args.value {
        scale.from_value(parse_number("value", t)?)?
    } else if let (Some(v), Some(r)) = (&args.volts, &args.ohms) {
        scale.from_volts(parse_in("volts", v, "V")?, parse_in("ohms", r, "Ω")?)?
    } else {
        return Err(CliError::Input(FieldError::new(
            "input",
            "give one of --ma, --percent, --value, or --volts with --ohms",
        )));
    };
    let (value, unit, span, atm) = match &args.to {
        Some(to) => {
            let from = units::lookup(&reading.unit).ok_or_else(|| {
                FieldError::new(
                    "to",
                    format!(
                        "the range unit '{}' is free text and cannot be converted",
                        reading.unit
                    ),
                )
            })?;
            let target = units::lookup(to).ok_or_else(|| units::unknown_unit("to", to))?;
            let (atm_pa, given) =
                crate::view::units::atmosphere(args.atm.as_deref().unwrap_or(""))?;
            let v = units::convert_units_at(reading.value, from, target, atm_pa)?;
            let span_to =
                units::convert_difference(crate::view::convert::value_span(&scale), from, target)?;
            let atm = units::crosses_reference(from, target).then_some((atm_pa, given));
            (v, target.symbol.to_string(), span_to, atm)
        }
        None => (
            reading.value,
            reading.unit.clone(),
            crate::view::convert::value_span(&scale),
            None,
        ),
    };
    let status = classify(reading.ma, &BandLimits::default(), &scale.signal)?;
    if args.json {
        let mut obj = json!({
            "ma": reading.ma,
            "percent": reading.percent,
            "value": value,
            "unit": unit,
            "status": status.as_str(),
            "status_meaning": status.meaning(),
            "cutoff_active": reading.cutoff_active,
        });
        if let Transfer::SquareRoot { cutoff_percent, .. } = scale.transfer {
            obj["cutoff_percent"] = json!(cutoff_percent);
            obj["cutoff_dp_percent"] = json!(crate::scale::cutoff_dp_percent(cutoff_percent));
        }
        if let Some(m) = reading.measured {
            obj["measured"] = json!(m);
            obj["measured_unit"] = json!(scale.unit);
            obj["outside_table"] = json!(reading.outside_table);
        }
        if let Some(dp) = reading.dp_percent {
            obj["dp_percent"] = json!(dp);
        }
        if let Some((atm_pa, given)) = atm {
            obj["atm_kpa"] = json!(atm_pa / 1000.0);
            obj["atm_given"] = json!(given);
        }
        return print_json(out, &obj);
    }
    let mut lines = vec![
        format!("current  {}", display::ma(reading.ma)),
        format!("span     {}", display::percent(reading.percent)),
        format!("value    {}", display::value(value, &unit, span)),
    ];
    if let Some(m) = reading.measured {
        lines.push(format!(
            "measured {}",
            display::value(m, &scale.unit, scale.span())
        ));
    }
    if let Some(dp) = reading.dp_percent {
        lines.push(format!("DP       {} of DP span", display::percent(dp)));
    }
    if reading.outside_table {
        lines.push(format!("warning  {}", crate::view::convert::OUTSIDE_TABLE));
    }
    if let Transfer::SquareRoot { cutoff_percent, .. } = scale.transfer {
        if cutoff_percent > 0.0 {
            let state = if reading.cutoff_active {
                "active: flow shows as zero"
            } else {
                "not active"
            };
            lines.push(format!(
                "cutoff   {} — {state}",
                crate::view::cutoff(cutoff_percent)
            ));
        }
    }
    if let Some((atm_pa, given)) = atm {
        lines.push(crate::view::units::atmosphere_line(atm_pa, given, "--atm"));
    }
    lines.push(format!(
        "status   {} — {}",
        status.as_str(),
        status.meaning()
    ));
    print_lines(out, &lines)
}

/// `loopside budget`
#[derive(Debug, Args)]
#[command(after_help = "Examples:\n  \
    loopside budget --supply 24 --min-volts 10,5 --load 250 --cable-m 180 --mm2 1.0\n  \
    loopside budget --supply 24 --supply-tolerance 5 --min-volts 12 --load barrier=340 --drop indicator=2.5 --json\n  \
    loopside budget --source current-output --compliance-volts 18 --drop positioner=9 --cable-m 250 --mm2 1,0\n  \
    loopside budget --topology four-wire --max-load-ohms 750 --load 'PLC input=250'\n  \
    loopside budget --source active-input --supply 24 --min-volts 10,5 --load card=250\n  \
    loopside budget --topology three-wire --own-ma 3 --supply 24 --min-volts 12 --load 250 --cable-m 300 --mm2 1,0\n  \
    loopside budget --supply 24 --min-volts 10,5 --load 250 --cable-m 1500 --mm2 1,0 --hart --cable-pf-per-m 100\n\
    Name an element with NAME=VALUE so the verdict can say which one limits. A positioner or\n\
    I/P converter is a --drop (V at 20 mA) or a --load (input resistance, Ω) as its data sheet\n\
    gives it; a split-range pair is both devices in series. A loop through an isolator is two\n\
    budgets: its input side (--source active-input: the isolator powers the transmitter) and\n\
    each output side (--source current-output with the isolator's compliance).")]
pub struct BudgetArgs {
    #[command(flatten)]
    pub(crate) loop_args: LoopArgs,
    /// Work out HART's cable limit by RC time constant (needs --cable-pf-per-m).
    #[arg(long, requires = TopologyArgs::HART_CABLE_ID)]
    hart: bool,
    /// Print one JSON object.
    #[arg(long)]
    json: bool,
}

/// A loop's power configuration as given on the command line (shared by `budget`,
/// `tag add` and `tag edit`).
#[derive(Debug, Clone, Args)]
pub(crate) struct LoopArgs {
    /// Nominal supply, V.
    #[arg(long, allow_hyphen_values = true, value_name = "V")]
    supply: Option<String>,
    /// How far the supply may sag below nominal, %.
    #[arg(long, allow_hyphen_values = true, value_name = "PCT")]
    supply_tolerance: Option<String>,
    /// Transmitter minimum terminal voltage (lift-off), V.
    #[arg(long, allow_hyphen_values = true, value_name = "V")]
    min_volts: Option<String>,
    /// A resistive element in series, Ω (repeat; NAME=OHMS to name it).
    #[arg(long, allow_hyphen_values = true, value_name = "OHMS")]
    load: Vec<String>,
    /// A fixed volt drop in series, V (repeat; NAME=VOLTS to name it).
    #[arg(long = "drop", allow_hyphen_values = true, value_name = "VOLTS")]
    drops: Vec<String>,
    /// One-way cable length, m.
    #[arg(long, allow_hyphen_values = true, value_name = "M")]
    cable_m: Option<String>,
    #[command(flatten)]
    conductor: ConductorArgs,
    /// Conductor temperature, °C (default 20).
    #[arg(long, allow_hyphen_values = true, value_name = "T")]
    temp_c: Option<String>,
    /// Upscale fault current the device is configured to drive, mA (default 22.0, and the
    /// budget says it is a default).
    #[arg(long, allow_hyphen_values = true, value_name = "I")]
    fault_ma: Option<String>,
    /// Upper end of the HART resistance window, Ω (default 1100).
    #[arg(long, allow_hyphen_values = true, value_name = "OHMS")]
    hart_max_ohms: Option<String>,
    #[command(flatten)]
    topology: TopologyArgs,
}

/// How the loop is built (shared by `budget`, `tag add` and `tag edit`): read by the
/// topology form ([`crate::form::topology`]).
#[derive(Debug, Clone, Default, Args)]
pub(crate) struct TopologyArgs {
    /// How the loop is built: two-wire (default), two-wire-active-input, four-wire,
    /// three-wire or analog-output.
    #[arg(long, value_name = "KIND")]
    topology: Option<String>,
    /// What supplies the loop as wired: supply (default), active-input, current-output, or
    /// none; repeat (or separate with commas) to describe a loop wired with two.
    #[arg(long = "source", value_name = "SOURCE")]
    sources: Vec<String>,
    /// A current source's compliance: volts it can drive at 20 mA.
    #[arg(
        long,
        allow_hyphen_values = true,
        value_name = "V",
        conflicts_with = "max_load_ohms"
    )]
    compliance_volts: Option<String>,
    /// A current source's maximum load at 20 mA, Ω.
    #[arg(long, allow_hyphen_values = true, value_name = "OHMS")]
    max_load_ohms: Option<String>,
    /// A three-wire transmitter's own supply current, mA.
    #[arg(long, allow_hyphen_values = true, value_name = "MA")]
    own_ma: Option<String>,
    /// Cable capacitance for HART's RC limit, pF/m (on `tag add/edit` this is
    /// --hart-cable-pf-per-m: there --cable-pf-per-m is the IS cable's).
    #[arg(
        id = TopologyArgs::HART_CABLE_ID,
        long = "cable-pf-per-m",
        allow_hyphen_values = true,
        value_name = "C"
    )]
    cable_pf_per_m: Option<String>,
    /// The devices' capacitance across the pair for HART's RC limit, nF (default 10).
    #[arg(long, allow_hyphen_values = true, value_name = "N")]
    devices_nf: Option<String>,
}

impl TopologyArgs {
    /// The id of the HART cable capacitance flag, renamed where the IS flags sit beside it.
    pub(crate) const HART_CABLE_ID: &'static str = "hart_cable_pf_per_m";

    /// The flags as the topology form.
    pub(crate) fn form(&self) -> TopologyForm {
        let text = |t: &Option<String>| t.clone().unwrap_or_default();
        TopologyForm {
            topology: text(&self.topology),
            sources: self.sources.clone(),
            compliance_volts: text(&self.compliance_volts),
            max_load_ohms: text(&self.max_load_ohms),
            own_ma: text(&self.own_ma),
            cable_pf_per_m: text(&self.cable_pf_per_m),
            devices_nf: text(&self.devices_nf),
        }
    }
}

/// The conductor size flags, `--awg` or `--mm2` (shared by `budget`, `wire`, `rtd` and
/// `tag add/edit`).
#[derive(Debug, Clone, Default, Args)]
pub(crate) struct ConductorArgs {
    /// Conductor size, AWG (4/0 … 40).
    #[arg(
        long,
        allow_hyphen_values = true,
        value_name = "N",
        conflicts_with = "mm2"
    )]
    awg: Option<String>,
    /// Conductor size, mm² (`1.5`, `1,5`, `1.5mm²`).
    #[arg(long, allow_hyphen_values = true, value_name = "A")]
    mm2: Option<String>,
}

impl ConductorArgs {
    /// True when neither size was given.
    pub(crate) fn is_empty(&self) -> bool {
        self.awg.is_none() && self.mm2.is_none()
    }

    /// The size as the conductor form reads it (`AWG 18`, `1,5 mm²`), empty when none.
    pub(crate) fn text(&self) -> String {
        match (&self.awg, &self.mm2) {
            (Some(a), _) => format!("AWG {}", a.trim()),
            (None, Some(m)) => m.trim().to_string(),
            (None, None) => String::new(),
        }
    }

    /// The conductor, if a size was given.
    pub(crate) fn conductor(&self) -> Result<Option<Conductor>, FieldError> {
        if self.is_empty() {
            return Ok(None);
        }
        parse_conductor(&self.text())
            .map(Some)
            .map_err(FormError::on_command_line)
    }
}

impl LoopArgs {
    /// True when no loop option was given at all.
    pub(crate) fn is_empty(&self) -> bool {
        self.supply.is_none()
            && self.supply_tolerance.is_none()
            && self.min_volts.is_none()
            && self.load.is_empty()
            && self.drops.is_empty()
            && self.cable_m.is_none()
            && self.conductor.is_empty()
            && self.temp_c.is_none()
            && self.fault_ma.is_none()
            && self.hart_max_ohms.is_none()
            && self.topology.form().is_empty()
    }

    /// The flags as the loop form ([`crate::form::loop_form`]), the one parser the Power
    /// screen and the tag form use too.
    pub(crate) fn form(&self) -> LoopForm {
        let text = |t: &Option<String>| t.clone().unwrap_or_default();
        let loads = self
            .load
            .iter()
            .enumerate()
            .map(|(i, t)| ElementText::from_flag(t, false, i + 1));
        let drops = self
            .drops
            .iter()
            .enumerate()
            .map(|(i, t)| ElementText::from_flag(t, true, i + 1));
        LoopForm {
            supply: text(&self.supply),
            sag: text(&self.supply_tolerance),
            tx_min: text(&self.min_volts),
            fault: text(&self.fault_ma),
            elements: loads.chain(drops).collect(),
            cable_m: text(&self.cable_m),
            conductor: self.conductor.text(),
            temp_c: text(&self.temp_c),
            hart_max: text(&self.hart_max_ohms),
        }
    }

    /// Build the loop from the flags; `--supply` and `--min-volts` are required where a
    /// supply and a transmitter minimum apply (`--compliance-volts` or `--max-load-ohms`
    /// for a current source instead).
    pub(crate) fn loop_config(&self) -> Result<LoopConfig, FieldError> {
        self.topology
            .form()
            .parse(&self.form())
            .map_err(FormError::on_command_line)
    }
}

pub(super) fn budget(args: BudgetArgs, out: &mut dyn Write) -> CliResult {
    let config = args.loop_args.loop_config()?;
    if config.hart_cable.is_some() && !args.hart {
        return Err(FieldError::new(
            "cable capacitance (--cable-pf-per-m)",
            "is for HART's cable limit: add --hart",
        )
        .into());
    }
    let b = config.budget()?;
    if args.json {
        let obj = json!({
            "loop_ohms": b.loop_ohms,
            "cable_ohms": b.cable_ohms,
            "max_load_ohms": b.max_load_ohms,
            "max_load_fault_ohms": b.max_load_fault_ohms,
            "spare_ohms": b.spare_ohms,
            "spare_fault_ohms": b.spare_fault_ohms,
            "min_supply_volts": b.min_supply_volts,
            "min_supply_fault_volts": b.min_supply_fault_volts,
            "min_nominal_supply_volts": b.min_nominal_supply_volts,
            "lowest_supply_volts": b.lowest_supply_volts,
            "terminal_volts_4ma": b.at_low.terminal_volts,
            "terminal_volts_20ma": b.at_full_scale.terminal_volts,
            "terminal_volts_fault": b.at_fault.terminal_volts,
            "headroom_4ma_volts": b.at_low.headroom_volts,
            "headroom_volts": b.at_full_scale.headroom_volts,
            "headroom_fault_volts": b.at_fault.headroom_volts,
            "fault_ma": b.at_fault.current_ma,
            "fault_ma_is_default": b.fault_ma_is_default,
            "supply_sag_percent": b.supply_sag_percent,
            "max_cable_m": b.max_cable_m,
            "max_cable_fault_m": b.max_cable_fault_m,
            "ok": b.ok,
            "ok_full_scale": b.ok_full_scale,
            "ok_fault": b.ok_fault,
            "limit": crate::view::wording::power::verdict(&b),
            "hart_ok": b.hart_ok,
            "hart_note": crate::view::wording::power::hart(&b.hart),
            "source": b.source.map(|s| s.code()),
            "topology": b.topology.code(),
            "driver_min_volts": b.driver_min_volts,
        });
        let mut obj = obj;
        if let Some(f) = &b.topology_fault {
            obj["topology_fault"] = json!({
                "code": f.code(),
                "sources": match f {
                    crate::budget::topology::TopologyFault::TwoSources { sources } =>
                        sources.iter().map(|s| s.code()).collect::<Vec<_>>(),
                    crate::budget::topology::TopologyFault::NoSource => Vec::new(),
                },
                "text": crate::view::wording::power::topology_fault(f),
            });
        }
        if let Some(h) = &b.hart_cable {
            obj["hart_max_cable_m"] = json!(h.max_cable_m);
            obj["hart_time_constant_s"] = json!(h.time_constant_s);
            obj["hart_cable_binding"] = json!(h.binding);
            obj["hart_devices_nf"] = json!(h.devices_farads * 1e9);
            obj["hart_cable_note"] = json!(crate::view::wording::power::hart_cable(
                h,
                b.max_cable_fault_m
            ));
        }
        return print_json(out, &obj);
    }
    let current_source = b.worked_from == Some(crate::budget::topology::SourceKind::CurrentOutput);
    let mut lines = Vec::new();
    let default_topology =
        b.topology == crate::budget::topology::Topology::TwoWireSupply && b.hart_cable.is_none();
    if !default_topology {
        lines.push(format!(
            "topology: {}",
            crate::view::wording::power::wiring(&config.wiring)
        ));
    }
    if let Some(f) = &b.topology_fault {
        lines.push(format!(
            "TOPOLOGY FAULT: {}",
            crate::view::wording::power::topology_fault(f)
        ));
        lines.push(match config.working_source() {
            Some(s) => format!(
                "the figures below are worked from {} alone, as if the other were not there",
                crate::view::wording::power::source(s)
            ),
            None => "the figures below are worked from 0 V: nothing drives the loop".to_string(),
        });
    }
    lines.push(format!(
        "{} {}   loop resistance {} (cable {})",
        if current_source {
            "compliance"
        } else {
            "lowest supply"
        },
        display::volts(b.lowest_supply_volts),
        display::ohms(b.loop_ohms),
        display::ohms(b.cable_ohms)
    ));
    for p in [&b.at_low, &b.at_full_scale, &b.at_fault] {
        lines.push(format!(
            "at {:>6}: {} {:>8}, headroom {:>8}  {}",
            display::ma_setting(p.current_ma),
            if current_source {
                "the loads take"
            } else {
                "transmitter gets"
            },
            display::volts(if current_source {
                b.lowest_supply_volts - p.terminal_volts
            } else {
                p.terminal_volts
            }),
            display::volts(p.headroom_volts),
            if !p.ok {
                "NOT ENOUGH"
            } else if b.topology_fault.is_some() {
                "(topology fault)"
            } else {
                "ok"
            }
        ));
    }
    // One line per current, so every spare and cable figure sits beside the current it
    // holds at.
    for (at_ma, max_load, spare, supply, cable) in [
        (
            20.0,
            b.max_load_ohms,
            b.spare_ohms,
            b.min_supply_volts,
            b.max_cable_m,
        ),
        (
            b.at_fault.current_ma,
            b.max_load_fault_ohms,
            b.spare_fault_ohms,
            b.min_supply_fault_volts,
            b.max_cable_fault_m,
        ),
    ] {
        let mut line = format!(
            "limits at {}: max loop resistance {} (spare {}), {} needed {}",
            display::ma_setting(at_ma),
            display::ohms(max_load),
            display::ohms(spare),
            if current_source {
                "compliance"
            } else {
                "supply"
            },
            display::volts(supply)
        );
        if let Some(m) = cable {
            line.push_str(&format!(
                ", longest cable run {} one way",
                display::metres(m)
            ));
        }
        lines.push(line);
    }
    lines.extend(crate::view::power::notes(
        &b,
        "with --supply-tolerance PCT",
        "with --fault-ma I",
    ));
    lines.push(format!(
        "verdict: {} — {}",
        if b.topology_fault.is_some() {
            "TOPOLOGY FAULT"
        } else if b.ok {
            "OK"
        } else {
            "NOT ENOUGH VOLTAGE"
        },
        crate::view::wording::power::verdict(&b)
    ));
    lines.push(format!(
        "HART: {} — {}",
        if b.hart_ok { "ok" } else { "outside window" },
        crate::view::wording::power::hart(&b.hart)
    ));
    if let Some(h) = &b.hart_cable {
        lines.push(format!(
            "HART cable: {}",
            crate::view::wording::power::hart_cable(h, b.max_cable_fault_m)
        ));
    }
    print_lines(out, &lines)
}

/// `loopside wire`
#[derive(Debug, Args)]
#[command(after_help = "Examples:\n  \
    loopside wire --awg 18 --length-m 300\n  \
    loopside wire --mm2 1,5 --length-m 180 --temp-c 40 --json")]
pub struct WireArgs {
    #[command(flatten)]
    conductor: ConductorArgs,
    /// One-way length of the pair, m.
    #[arg(long, allow_hyphen_values = true, value_name = "M")]
    length_m: String,
    /// Conductor temperature, °C (default 20).
    #[arg(long, allow_hyphen_values = true, value_name = "T")]
    temp_c: Option<String>,
    /// Print one JSON object.
    #[arg(long)]
    json: bool,
}

pub(super) fn wire(args: WireArgs, out: &mut dyn Write) -> CliResult {
    let conductor = args
        .conductor
        .conductor()?
        .ok_or_else(|| FieldError::new("awg", "give the conductor size with --awg or --mm2"))?;
    let length = parse_in("length-m", &args.length_m, "m")?;
    let temp_c = match &args.temp_c {
        Some(t) => parse_in("temp-c", t, "°C")?,
        None => 20.0,
    };
    let per_km = conductor.ohms_per_km(temp_c)?;
    let loop_ohms = crate::wire::loop_ohms(&conductor, length, temp_c).map_err(|e| {
        if e.field == "cable_m" {
            e.renamed("length-m")
        } else {
            e
        }
    })?;
    if args.json {
        return print_json(
            out,
            &json!({
                "ohms": loop_ohms,
                "one_way_ohms": loop_ohms / 2.0,
                "ohms_per_km": per_km,
                "ohms_per_1000ft": per_km * 0.3048,
                "area_mm2": conductor.area_mm2(),
                "diameter_mm": conductor.diameter_mm(),
                "conductor": conductor.label(),
                "temp_c": temp_c,
            }),
        );
    }
    print_lines(
        out,
        &[
            format!(
                "{}: {}, {} diameter, {} per conductor at {}",
                conductor.label(),
                display::square_millimetres(conductor.area_mm2()),
                display::millimetres(conductor.diameter_mm()),
                display::ohms_per_km(per_km),
                display::temperature_setting(temp_c)
            ),
            format!(
                "{} of pair: {} round trip ({} each conductor)",
                display::metres(length),
                display::ohms(loop_ohms),
                display::ohms(loop_ohms / 2.0)
            ),
        ],
    )
}

/// `loopside units`
#[derive(Debug, Args)]
#[command(after_help = "Examples:\n  \
    loopside units 2,5 bar psi\n  \
    loopside units 100 inH2O kPa --json\n  \
    loopside units 1 bara psig\n  \
    loopside units 0 psig kPa(a) --atm 0,95bar\n  \
    loopside units -40 degC degF\n\n\
Gauge and absolute pressure: barg, mbarg, psig, kPa(g), MPa(g) count from the atmosphere;\n\
bara, mbara, psia, kPa(a), MPa(a) from vacuum. Between the two the standard atmosphere\n\
(101.325 kPa) is added or subtracted unless --atm gives the local one. A plain unit (bar,\n\
psi, kPa, inH2O) says neither and does not convert to or from a gauge or absolute one.")]
pub struct UnitsArgs {
    /// The value to convert.
    #[arg(allow_hyphen_values = true)]
    value: String,
    /// Its unit.
    from: String,
    /// The unit wanted.
    to: String,
    /// Local atmospheric pressure, with its unit (`0,95 bar`, `95kPa`), used between gauge
    /// and absolute units; default the standard atmosphere, 101.325 kPa.
    #[arg(long, value_name = "PRESSURE")]
    atm: Option<String>,
    /// Print one JSON object.
    #[arg(long)]
    json: bool,
}

pub(super) fn units(args: UnitsArgs, out: &mut dyn Write) -> CliResult {
    let v = crate::view::units::view(crate::view::units::UnitsInput {
        value: &args.value,
        from: &args.from,
        to: &args.to,
        atm: args.atm.as_deref().unwrap_or(""),
        atm_name: "--atm",
    })?;
    if args.json {
        let from = crate::view::units::unit_of("from", &args.from)?;
        let to = crate::view::units::unit_of("to", &args.to)?;
        let mut obj = json!({ "value": v.value, "unit": v.unit, "atm_kpa": null });
        if let Some(atm_pa) = v.atm_pa {
            obj["atm_kpa"] = json!(atm_pa / 1000.0);
            obj["atm_given"] = json!(v.atm_given);
        }
        for (key, unit) in [("from_note", from), ("to_note", to)] {
            if !unit.note.is_empty() {
                obj[key] = json!(unit.note);
            }
        }
        return print_json(out, &obj);
    }
    print_lines(out, &v.lines())
}

/// `loopside status`
#[derive(Debug, Args)]
#[command(after_help = "Examples:\n  \
    loopside status 3.55\n  \
    loopside status 20,7 --json\n  \
    loopside status 2 --signal 0..20")]
pub struct StatusArgs {
    /// Loop current, mA.
    #[arg(allow_hyphen_values = true)]
    ma: String,
    /// Signal span in mA, default 4..20. NE 43 bands apply to 4–20 mA only; on another
    /// span (0..20) a current is under, within or over the span.
    #[arg(long, allow_hyphen_values = true, value_name = "LOW..HIGH")]
    signal: Option<String>,
    /// Print one JSON object.
    #[arg(long)]
    json: bool,
}

pub(super) fn status(args: StatusArgs, out: &mut dyn Write) -> CliResult {
    let ma = parse_in("ma", &args.ma, "mA")?;
    let span = match &args.signal {
        Some(text) => {
            let (lo, hi) = parse_range("signal", text)?;
            SignalSpan::new(lo, hi)?
        }
        None => SignalSpan::default(),
    };
    let status = classify(ma, &BandLimits::default(), &span)?;
    if args.json {
        return print_json(
            out,
            &json!({
                "ma": ma,
                "status": status.as_str(),
                "measurement": status.is_measurement(),
                "failure": status.is_failure(),
                "meaning": status.meaning(),
            }),
        );
    }
    print_lines(
        out,
        &[format!(
            "{}: {} — {}",
            display::ma(ma),
            status.as_str(),
            status.meaning()
        )],
    )
}

/// `loopside resistor`
#[derive(Debug, Args)]
#[command(after_help = "Examples:\n  \
    loopside resistor --ohms 250\n  \
    loopside resistor --ohms 250 --tolerance 0.1 --json")]
pub struct ResistorArgs {
    /// Nominal resistance, Ω.
    #[arg(long, allow_hyphen_values = true, value_name = "R")]
    ohms: String,
    /// Tolerance, ± % (default 0.1).
    #[arg(long, allow_hyphen_values = true, value_name = "PCT")]
    tolerance: Option<String>,
    /// Upscale fault current, mA (default 22.0).
    #[arg(long, allow_hyphen_values = true, value_name = "I")]
    fault_ma: Option<String>,
    /// Print one JSON object.
    #[arg(long)]
    json: bool,
}

pub(super) fn resistor(args: ResistorArgs, out: &mut dyn Write) -> CliResult {
    let ohms = parse_in("ohms", &args.ohms, "Ω")?;
    let tol = match &args.tolerance {
        Some(t) => parse_in("tolerance", t, "%")?,
        None => 0.1,
    };
    let fault = match &args.fault_ma {
        Some(t) => parse_in("fault-ma", t, "mA")?,
        None => crate::budget::DEFAULT_FAULT_MA,
    };
    let r = crate::resistor::sense_resistor(ohms, tol, &SignalSpan::default(), fault)?;
    if args.json {
        return print_json(
            out,
            &serde_json::to_value(&r).map_err(|e| CliError::Failure(e.to_string()))?,
        );
    }
    let mut lines = vec![format!(
        "{} ± {}",
        display::ohms(r.ohms),
        display::percent(r.tolerance_percent)
    )];
    for p in &r.points {
        lines.push(format!(
            "{:>10}  {:>8}  {}  reading error up to {} ({} of span)",
            display::ma(p.current_ma),
            display::sense_volts(p.volts),
            display::watts(p.watts),
            display::ma(p.error_ma),
            display::percent_fine(p.error_percent_of_span)
        ));
    }
    print_lines(out, &lines)
}
