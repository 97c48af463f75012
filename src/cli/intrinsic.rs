//! `loopside intrinsic …` (and `loopside entity`, the same as `intrinsic check`):
//! intrinsic safety of a loop by the entity concept.
//!
//! - `check`: the circuit from flags, or a tag's stored IS data (`--tag T`) with any flag
//!   given replacing that value and any `--device` / `--hand-held` added to its devices;
//!   `--save` writes the check to the tag's log (`is-check` kind) through
//!   `crate::action::intrinsic`, the same record the app saves;
//! - `set TAG`: store the IS data on the tag (flags given replace the stored values; a
//!   `--device` list replaces the stored devices); `--remove` clears it.
//!
//! Every value takes a unit suffix; without one the units are V, mA, W, nF, mH (see
//! `crate::form::intrinsic`). Bad input exits 2 naming the field; a circuit that fails a
//! check exits 0 with `ok: false` — "not safe" is a valid answer.

use super::data::{now_local, store_error, DataArgs};
use super::{print_json, print_lines, CliError, CliResult};
use crate::action::intrinsic::{self as action, NewIsCheck};
use crate::error::FieldError;
use crate::form::intrinsic::{
    circuit_text, parse_circuit, parse_device_spec, CircuitText, DeviceText,
};
use crate::intrinsic::{self, CableLimit, Circuit, Compared, Quantity, Verdict};
use crate::store::Store;
use crate::view::wording::intrinsic as words;
use clap::{Args, Subcommand};
use serde_json::json;
use std::io::Write;

/// `loopside intrinsic …`
#[derive(Debug, Args)]
#[command(after_help = "Examples:\n  \
    loopside intrinsic check --uo 28 --io 93mA --po 0.65W --co 83nF --lo 4.2mH \\\n    \
      --device \"TT-412 tx:ui=30,ii=100,pi=0.75,ci=5nF,li=10uH,group=IIC,t=T4\" \\\n    \
      --cable-m 200 --cable-pf-per-m 100 --cable-uh-per-m 0.65 --group IIC --t-class T3\n  \
    loopside intrinsic check --tag TT-412 --hand-held \"HART hand-held:ui=30,ii=200,pi=1,ci=10nF\"\n  \
    loopside intrinsic check --tag TT-412 --save --author EF\n  \
    loopside intrinsic set TT-412 --cable-m 260")]
pub struct IntrinsicArgs {
    #[command(subcommand)]
    command: IntrinsicCommand,
}

/// What to do.
#[derive(Debug, Subcommand)]
pub enum IntrinsicCommand {
    /// Check a circuit (from flags, or a tag's IS data); print every check, margin and the
    /// longest cable; `--save` writes it to the tag's log.
    Check(CheckArgs),
    /// Store the IS data (barrier or isolator, devices, cable, area) on a tag.
    Set(SetArgs),
}

/// The circuit as flags (every one optional here; the form says which are missing).
#[derive(Debug, Clone, Default, Args)]
pub struct CircuitArgs {
    /// Source (barrier or isolator channel): Uo, maximum output voltage (V).
    #[arg(long, value_name = "V", allow_hyphen_values = true)]
    uo: Option<String>,
    /// Source: Io, maximum output current (mA).
    #[arg(long, value_name = "MA", allow_hyphen_values = true)]
    io: Option<String>,
    /// Source: Po, maximum output power (W).
    #[arg(long, value_name = "W", allow_hyphen_values = true)]
    po: Option<String>,
    /// Source: Co, maximum external capacitance for the area's group (nF).
    #[arg(long, value_name = "NF", allow_hyphen_values = true)]
    co: Option<String>,
    /// Source: Lo, maximum external inductance for the area's group (mH).
    #[arg(long, value_name = "MH", allow_hyphen_values = true)]
    lo: Option<String>,
    /// Source: Lo/Ro, maximum L/R ratio (µH/Ω), when the certificate gives one.
    #[arg(long = "lo-ro", value_name = "UH/OHM", allow_hyphen_values = true)]
    lo_ro: Option<String>,
    /// Source: its name ("barrier, MCC-3 slot 12").
    #[arg(long, value_name = "TEXT")]
    source_name: Option<String>,
    /// Source: certificate reference (free text).
    #[arg(long, value_name = "TEXT")]
    source_cert: Option<String>,
    /// Source: the gas group it is certified for (IIA, IIB, IIC).
    #[arg(long, value_name = "G")]
    source_group: Option<String>,
    /// A field device: "NAME:ui=..,ii=..,pi=..,ci=..,li=..,group=IIC,t=T4,cert=..";
    /// "NAME:simple" for simple apparatus. Repeat for each device.
    #[arg(long, value_name = "SPEC", allow_hyphen_values = true)]
    device: Vec<String>,
    /// A temporary device (HART hand-held, test meter), written like --device.
    #[arg(long, value_name = "SPEC", allow_hyphen_values = true)]
    hand_held: Vec<String>,
    /// A single field device's Ui (V), instead of --device.
    #[arg(long, value_name = "V", allow_hyphen_values = true)]
    ui: Option<String>,
    /// A single field device's Ii (mA).
    #[arg(long, value_name = "MA", allow_hyphen_values = true)]
    ii: Option<String>,
    /// A single field device's Pi (W).
    #[arg(long, value_name = "W", allow_hyphen_values = true)]
    pi: Option<String>,
    /// A single field device's Ci (nF; default 0).
    #[arg(long, value_name = "NF", allow_hyphen_values = true)]
    ci: Option<String>,
    /// A single field device's Li (mH; default 0).
    #[arg(long, value_name = "MH", allow_hyphen_values = true)]
    li: Option<String>,
    /// Cable length from the source to the farthest device (m). (`--is-cable-m` on `tag
    /// add/edit`, where `--cable-m` is the loop's cable for the voltage budget.)
    #[arg(long = "cable-m", value_name = "M", allow_hyphen_values = true)]
    is_cable_m: Option<String>,
    /// Cable capacitance per metre (pF/m); left out, the standard's 200 pF/m.
    #[arg(long = "cable-pf-per-m", value_name = "PF", allow_hyphen_values = true)]
    cable_pf_per_m: Option<String>,
    /// Cable inductance per metre (µH/m); left out, the standard's 1 µH/m.
    #[arg(long = "cable-uh-per-m", value_name = "UH", allow_hyphen_values = true)]
    cable_uh_per_m: Option<String>,
    /// Cable L/R (µH/Ω), for the L/R route.
    #[arg(
        long = "cable-uh-per-ohm",
        value_name = "UH/OHM",
        allow_hyphen_values = true
    )]
    cable_uh_per_ohm: Option<String>,
    /// The gas group the area asks for (IIA, IIB, IIC).
    #[arg(long, value_name = "G")]
    group: Option<String>,
    /// The temperature class the area asks for (T1–T6).
    #[arg(long = "t-class", value_name = "T")]
    t_class: Option<String>,
}

/// `loopside intrinsic check` / `loopside entity`
#[derive(Debug, Args)]
#[command(after_help = "Examples:\n  \
    loopside entity --uo 28 --io 93 --po 0.65 --co 83 --lo 4.2 --ui 30 --ii 100 --pi 0.75 --ci 5 --li 0.01 \\\n    \
      --cable-m 200 --cable-pf-per-m 100 --cable-uh-per-m 0.65 --group IIC --json\n  \
    loopside intrinsic check --tag TT-412 --cable-m 400")]
pub struct CheckArgs {
    #[command(flatten)]
    data: DataArgs,
    #[command(flatten)]
    circuit: CircuitArgs,
    /// Start from this tag's stored IS data (flags given replace its values; --device and
    /// --hand-held add devices).
    #[arg(long, value_name = "T")]
    tag: Option<String>,
    /// Save the check to the tag's log (needs --tag).
    #[arg(long, requires = "tag")]
    save: bool,
    /// Initials of who checked (with --save).
    #[arg(long, value_name = "A")]
    author: Option<String>,
    /// A note saved with the check.
    #[arg(long, value_name = "TEXT", allow_hyphen_values = true)]
    note: Option<String>,
    /// Print one JSON object.
    #[arg(long)]
    json: bool,
}

/// `loopside intrinsic set`
#[derive(Debug, Args)]
#[command(after_help = "Examples:\n  \
    loopside intrinsic set TT-412 --uo 28 --io 93 --po 0.65 --co 83nF --lo 4.2mH --lo-ro 55 --source-group IIC \\\n    \
      --device \"TT-412 tx:ui=30,ii=100,pi=0.75,ci=5nF,li=10uH,group=IIC,t=T4\" --cable-m 185 --group IIC --t-class T3\n  \
    loopside intrinsic set TT-412 --remove")]
pub struct SetArgs {
    #[command(flatten)]
    data: DataArgs,
    /// Tag number.
    number: String,
    #[command(flatten)]
    circuit: CircuitArgs,
    /// Remove the tag's IS data.
    #[arg(long, conflicts_with_all = CircuitArgs::REMOVE_CONFLICTS)]
    remove: bool,
}

impl CircuitArgs {
    /// The flags a "remove the IS data" flag (`intrinsic set --remove`, `tag edit
    /// --no-intrinsic`) cannot be given with.
    pub(crate) const REMOVE_CONFLICTS: [&'static str; 3] = ["device", "uo", "is_cable_m"];

    /// Where `tag add/edit` take the IS cable length (`--cable-m` there is the loop's cable
    /// for the voltage budget): the argument's id and the flag it is given as.
    pub(crate) const TAG_CABLE_ID: &'static str = "is_cable_m";

    /// True when no IS flag was given at all.
    pub(crate) fn is_empty(&self) -> bool {
        let texts = [
            &self.uo,
            &self.io,
            &self.po,
            &self.co,
            &self.lo,
            &self.lo_ro,
            &self.source_name,
            &self.source_cert,
            &self.source_group,
            &self.ui,
            &self.ii,
            &self.pi,
            &self.ci,
            &self.li,
            &self.is_cable_m,
            &self.cable_pf_per_m,
            &self.cable_uh_per_m,
            &self.cable_uh_per_ohm,
            &self.group,
            &self.t_class,
        ];
        texts.iter().all(|t| t.is_none()) && self.device.is_empty() && self.hand_held.is_empty()
    }

    /// The circuit these flags give laid over `stored` (the tag's IS data, if any), as
    /// `intrinsic set` stores it: flags given replace the stored values and a `--device`
    /// list replaces the stored devices. Bad or missing values name the field.
    pub(crate) fn circuit_over(&self, stored: Option<&Circuit>) -> Result<Circuit, FieldError> {
        let base = stored.map(circuit_text).unwrap_or_default();
        parse_circuit(&apply(base, self, true)?)
    }
}

/// Run `loopside intrinsic …`.
pub fn intrinsic(args: IntrinsicArgs, out: &mut dyn Write) -> CliResult {
    match args.command {
        IntrinsicCommand::Check(a) => check(a, out),
        IntrinsicCommand::Set(a) => set(a, out),
    }
}

fn over(slot: &mut String, flag: &Option<String>) {
    if let Some(v) = flag {
        *slot = v.clone();
    }
}

/// The flags laid over `base`; `replace_devices` for `set` (a --device list replaces the
/// stored one), otherwise devices are added.
fn apply(
    mut t: CircuitText,
    a: &CircuitArgs,
    replace_devices: bool,
) -> Result<CircuitText, FieldError> {
    over(&mut t.source.uo, &a.uo);
    over(&mut t.source.io, &a.io);
    over(&mut t.source.po, &a.po);
    over(&mut t.source.co, &a.co);
    over(&mut t.source.lo, &a.lo);
    over(&mut t.source.lo_ro, &a.lo_ro);
    over(&mut t.source.name, &a.source_name);
    over(&mut t.source.certificate, &a.source_cert);
    over(&mut t.source.group, &a.source_group);
    over(&mut t.cable.length, &a.is_cable_m);
    over(&mut t.cable.c_per_m, &a.cable_pf_per_m);
    over(&mut t.cable.l_per_m, &a.cable_uh_per_m);
    over(&mut t.cable.lr, &a.cable_uh_per_ohm);
    over(&mut t.area_group, &a.group);
    over(&mut t.area_t_class, &a.t_class);
    let mut devices: Vec<DeviceText> = Vec::new();
    for spec in &a.device {
        devices.push(parse_device_spec(spec)?);
    }
    if a.ui.is_some() || a.ii.is_some() || a.pi.is_some() || a.ci.is_some() || a.li.is_some() {
        let mut d = DeviceText {
            name: "field device".to_string(),
            ..DeviceText::default()
        };
        over(&mut d.ui, &a.ui);
        over(&mut d.ii, &a.ii);
        over(&mut d.pi, &a.pi);
        over(&mut d.ci, &a.ci);
        over(&mut d.li, &a.li);
        devices.push(d);
    }
    for spec in &a.hand_held {
        let mut d = parse_device_spec(spec)?;
        d.temporary = true;
        devices.push(d);
    }
    if replace_devices && !devices.is_empty() {
        t.devices.clear();
    }
    t.devices.extend(devices);
    Ok(t)
}

fn unit_of(q: Quantity) -> (&'static str, f64) {
    match q {
        Quantity::Volts => ("V", 1.0),
        Quantity::MilliAmps => ("mA", 1.0),
        Quantity::Watts => ("W", 1.0),
        Quantity::Farads => ("nF", 1e9),
        Quantity::Henries => ("mH", 1e3),
        Quantity::HenriesPerOhm => ("uH/ohm", 1e6),
    }
}

/// The verdict as JSON: the keys (`ok`, `halved`, `c_total_nf`, `l_total_mh`,
/// `co_allowed_nf`, `lo_allowed_mh`, `max_cable_m`, `checks`), in the certificates' units,
/// full precision.
pub(crate) fn verdict_json(circuit: &Circuit, v: &Verdict) -> serde_json::Value {
    let checks: Vec<serde_json::Value> = v
        .checks
        .iter()
        .map(|c| match c.compared {
            Compared::Numbers {
                quantity,
                source,
                field,
                margin,
                margin_percent,
            } => {
                let (unit, k) = unit_of(quantity);
                json!({
                    "name": c.name.as_str(), "device": c.device, "ok": c.ok, "decides": c.decides,
                    "unit": unit, "source": source * k, "field": field * k,
                    "margin": margin * k, "margin_percent": margin_percent,
                })
            }
            Compared::Groups { required, given } => json!({
                "name": c.name.as_str(), "device": c.device, "ok": c.ok, "decides": c.decides,
                "source": required.label(), "field": given.label(),
            }),
            Compared::Classes { required, given } => json!({
                "name": c.name.as_str(), "device": c.device, "ok": c.ok, "decides": c.decides,
                "source": required.label(), "field": given.label(),
            }),
        })
        .collect();
    let (max_cable_m, max_cable_limit) = match v.max_cable {
        CableLimit::NoLength => (Some(0.0), "no-length"),
        CableLimit::Metres { metres, by } => (Some(metres), by.as_str()),
        CableLimit::Unlimited => (None, "unlimited"),
    };
    json!({
        "ok": v.ok,
        "halved": v.halved,
        "capped": v.capped,
        "lr_route": v.lr_route,
        "c_total_nf": v.c_total_farads * 1e9,
        "l_total_mh": v.l_total_henries * 1e3,
        "co_allowed_nf": v.co_allowed_farads * 1e9,
        "lo_allowed_mh": v.lo_allowed_henries * 1e3,
        "cable_c_default": v.cable_c_default,
        "cable_l_default": v.cable_l_default,
        "max_cable_m": max_cable_m,
        "max_cable_limit": max_cable_limit,
        "checks": checks,
        "not_checked": serde_json::to_value(&v.not_checked).unwrap_or_default(),
        "temporary": v.temporary.map(|t| json!({
            "ci_nf": t.ci_farads * 1e9, "li_mh": t.li_henries * 1e3, "ok_without": t.ok_without,
        })),
        "notes": words::notes(circuit, v),
        "caution": words::CAUTION,
    })
}

/// Run `loopside intrinsic check` (also `loopside entity`).
pub fn check(args: CheckArgs, out: &mut dyn Write) -> CliResult {
    let mut store = match &args.tag {
        Some(_) => Some(args.data.open()?),
        None => None,
    };
    let base = match (&args.tag, &store) {
        (Some(t), Some(s)) => {
            let record = s.require_tag(t).map_err(store_error)?;
            match &record.tag.intrinsic {
                Some(c) => circuit_text(c),
                None => {
                    return Err(CliError::Input(FieldError::new(
                        "tag",
                        format!(
                            "{} has no IS data; store it with `loopside intrinsic set {}` first",
                            record.tag.number, record.tag.number
                        ),
                    )))
                }
            }
        }
        _ => CircuitText::default(),
    };
    let text = apply(base, &args.circuit, false)?;
    let circuit = parse_circuit(&text)?;
    let verdict = intrinsic::check(&circuit)?;
    let saved = match (args.save, &args.tag, store.as_mut()) {
        (true, Some(tag), Some(s)) => Some(
            action::save_is_check(
                s,
                now_local(),
                NewIsCheck {
                    tag,
                    initials: args.author.as_deref().unwrap_or_default(),
                    circuit: &circuit,
                    note: args.note.as_deref().unwrap_or_default(),
                },
            )
            .map_err(store_error)?,
        ),
        _ => None,
    };
    if args.json {
        let mut v = verdict_json(&circuit, &verdict);
        if let Some(s) = &saved {
            v["saved"] = json!(s.id);
        }
        return print_json(out, &v);
    }
    let mut lines: Vec<String> = words::CAUTION.iter().map(|c| format!("! {c}")).collect();
    lines.push(String::new());
    lines.extend(words::lines(&circuit, &verdict));
    if let Some(s) = saved {
        lines.push(s.to_string());
    }
    print_lines(out, &lines)
}

fn set(args: SetArgs, out: &mut dyn Write) -> CliResult {
    let mut store = args.data.open()?;
    let circuit = if args.remove {
        None
    } else {
        let stored = store.require_tag(&args.number).map_err(store_error)?;
        Some(args.circuit.circuit_over(stored.tag.intrinsic.as_ref())?)
    };
    let saved = action::set_circuit(&mut store, &args.number, circuit).map_err(store_error)?;
    print_lines(out, &[saved.to_string()])
}
