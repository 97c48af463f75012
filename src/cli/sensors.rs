//! Sensor subcommands: `rtd`, `tc` and `level` — what a temperature or DP level transmitter
//! should see, for a bench check or for ranging in the field.
//!
//! Errors from the core name its parameters (`max_m`, `cj_temp_c`); here they are renamed
//! to the flag the technician typed (`max-m`, `cj-c`) before they reach stderr.

use super::{print_json, print_lines, CliError, CliResult};
use crate::cli::calc::ConductorArgs;
use crate::display;
use crate::error::FieldError;
use crate::number::{parse_in, parse_number};
use crate::rtd::{ElementBuild, Rtd, RtdClass, RtdKind, Wiring};
use crate::thermocouple::{self, TcClass, TcType};
use clap::Args;
use serde_json::json;
use std::io::Write;

/// The flag a core parameter was given as.
fn flag_for(field: &str) -> String {
    match field {
        "true_temp_c" => "temp-c".to_string(),
        "cj_temp_c" => "cj-c".to_string(),
        "r0_ohms" => "r0".to_string(),
        "dp_pa" => "dp".to_string(),
        "rtd_type" | "tc_type" => "type".to_string(),
        "measured_ohms" => "ohms".to_string(),
        other => other.replace('_', "-"),
    }
}

fn as_flag(e: FieldError) -> CliError {
    let flag = flag_for(&e.field);
    CliError::Input(e.renamed(flag))
}

/// `loopside rtd`
#[derive(Debug, Args)]
#[command(after_help = "Examples:\n  \
    loopside rtd --type pt100 --temp-c 75\n  \
    loopside rtd --type pt100 --ohms 138,51 --class A\n  \
    loopside rtd --type pt100 --temp-c 40 --wires 2 --cable-m 60 --mm2 0.5 --json\n\
    Temperatures are ITS-90 °C; the element follows IEC 60751 (α = 0.00385).")]
pub struct RtdArgs {
    /// Element: pt100, pt500 or pt1000 (default pt100).
    #[arg(long = "type", value_name = "TYPE", conflicts_with = "r0")]
    rtd_type: Option<String>,
    /// A platinum element with another R0 (Ω at 0 °C), instead of --type.
    #[arg(long, allow_hyphen_values = true, value_name = "OHMS")]
    r0: Option<String>,
    /// Temperature, °C: print the resistance to source.
    #[arg(
        long,
        allow_hyphen_values = true,
        value_name = "T",
        group = "rtd_input"
    )]
    temp_c: Option<String>,
    /// Measured element resistance, Ω: print the temperature.
    #[arg(
        long,
        allow_hyphen_values = true,
        value_name = "R",
        group = "rtd_input"
    )]
    ohms: Option<String>,
    /// IEC 60751 tolerance class to report at that temperature: AA, A, B or C.
    #[arg(long, value_name = "CLASS")]
    class: Option<String>,
    /// Element construction for the class ranges: wire-wound (default) or thin-film.
    #[arg(long, value_name = "BUILD", value_parser = ["wire-wound", "thin-film"], requires = "class")]
    element: Option<String>,
    /// Number of wires between element and transmitter: 2, 3 or 4.
    #[arg(long, value_name = "N")]
    wires: Option<String>,
    /// Loop resistance of the two leads, Ω (instead of a cable).
    #[arg(
        long,
        allow_hyphen_values = true,
        value_name = "OHMS",
        requires = "wires"
    )]
    lead_ohms: Option<String>,
    /// One-way cable length, m.
    #[arg(
        long,
        allow_hyphen_values = true,
        value_name = "M",
        requires = "wires",
        conflicts_with = "lead_ohms"
    )]
    cable_m: Option<String>,
    #[command(flatten)]
    conductor: ConductorArgs,
    /// Cable temperature, °C (default 20).
    #[arg(long, allow_hyphen_values = true, value_name = "T")]
    cable_temp_c: Option<String>,
    /// Print one JSON object.
    #[arg(long)]
    json: bool,
}

pub(super) fn rtd(args: RtdArgs, out: &mut dyn Write) -> CliResult {
    let element = match (&args.rtd_type, &args.r0) {
        (_, Some(r0)) => Rtd::custom(parse_in("r0", r0, "Ω")?).map_err(as_flag)?,
        (Some(t), None) => Rtd::standard(t.parse::<RtdKind>().map_err(as_flag)?),
        (None, None) => Rtd::pt100(),
    };
    let (temp_c, ohms) = match (&args.temp_c, &args.ohms) {
        (Some(t), _) => {
            let t = parse_in("temp-c", t, "°C")?;
            (t, element.ohms_at(t).map_err(as_flag)?)
        }
        (None, Some(r)) => {
            let r = parse_in("ohms", r, "Ω")?;
            (element.temp_c_at(r).map_err(as_flag)?, r)
        }
        (None, None) => {
            return Err(CliError::Input(FieldError::new(
                "input",
                "give --temp-c or --ohms",
            )))
        }
    };
    let slope = element.slope_ohms_per_c(temp_c).map_err(as_flag)?;
    let class = match &args.class {
        Some(text) => {
            let class = text.parse::<RtdClass>().map_err(as_flag)?;
            let build = match args.element.as_deref() {
                Some("thin-film") => ElementBuild::ThinFilm,
                _ => ElementBuild::WireWound,
            };
            Some((class, class.tolerance_c(temp_c, build).map_err(as_flag)?))
        }
        None => None,
    };
    let lead = match &args.wires {
        Some(text) => {
            let count = parse_number("wires", text)?;
            if count.fract() != 0.0 || !(0.0..=u32::MAX as f64).contains(&count) {
                return Err(CliError::Input(FieldError::new(
                    "wires",
                    format!("{text} is not an RTD connection; use 2, 3 or 4"),
                )));
            }
            let wiring = Wiring::from_count(count as u32)?;
            let conductor = args.conductor.conductor()?;
            let result = match (&args.lead_ohms, &args.cable_m, conductor) {
                (Some(r), _, _) => element
                    .lead_error(wiring, parse_in("lead-ohms", r, "Ω")?, temp_c)
                    .map_err(as_flag)?,
                (None, Some(m), Some(conductor)) => {
                    let cable_temp_c = match &args.cable_temp_c {
                        Some(t) => parse_in("cable-temp-c", t, "°C")?,
                        None => 20.0,
                    };
                    element
                        .lead_error_for_cable(
                            wiring,
                            &conductor,
                            parse_in("cable-m", m, "m")?,
                            cable_temp_c,
                            temp_c,
                        )
                        .map_err(as_flag)?
                }
                (None, Some(_), None) => {
                    return Err(CliError::Input(FieldError::new(
                        "cable-m",
                        "give the conductor size with --awg or --mm2",
                    )))
                }
                (None, None, _) if wiring == Wiring::TwoWire => {
                    return Err(CliError::Input(FieldError::new(
                        "wires",
                        "for a 2-wire error give --cable-m with --awg or --mm2, or --lead-ohms",
                    )))
                }
                (None, None, _) => element.lead_error(wiring, 0.0, temp_c).map_err(as_flag)?,
            };
            Some(result)
        }
        None => None,
    };
    if args.json {
        let mut obj = json!({
            "element": element.name(),
            "r0_ohms": element.r0_ohms(),
            "ohms": ohms,
            "temp_c": temp_c,
            "slope_ohms_per_c": slope,
            "class": class.map(|(c, _)| c.name()),
            "class_tolerance_c": class.map(|(_, t)| t),
            "lead_error_c": lead.as_ref().map(|l| l.error_c),
        });
        if let Some(l) = &lead {
            obj["wires"] = json!(l.wiring.count());
            obj["lead_ohms"] = json!(l.lead_ohms);
            obj["lead_error_ohms"] = json!(l.error_ohms);
            obj["lead_note"] = json!(l.note);
        }
        return print_json(out, &obj);
    }
    let mut lines = vec![
        format!("element      {} (IEC 60751)", element.name()),
        format!("temperature  {}", display::temperature_fine(temp_c)),
        format!("resistance   {}", display::sensor_ohms(ohms)),
        format!("sensitivity  {}", display::ohms_per_degree(slope)),
    ];
    if let Some((c, t)) = class {
        lines.push(format!(
            "class {:<3}    ±{} at this temperature",
            c.name(),
            display::temperature_fine(t)
        ));
    }
    if let Some(l) = &lead {
        lines.push(format!(
            "leads        {} → error {}, {}",
            display::ohms_fine(l.lead_ohms),
            display::ohms_fine(l.error_ohms),
            display::temperature_fine(l.error_c)
        ));
        lines.push(format!("             {}", l.note));
    }
    print_lines(out, &lines)
}

/// `loopside tc`
#[derive(Debug, Args)]
#[command(after_help = "Examples:\n  \
    loopside tc --type K --temp-c 400 --cj-c 18\n  \
    loopside tc --type K --mv 15,679 --cj-c 18 --json\n  \
    loopside tc --type T --temp-c 100 --class 1\n\
    --temp-c gives the EMF to source with the transmitter's cold junction at --cj-c;\n\
    --mv reads a measured EMF back to a temperature. NIST ITS-90 reference functions.")]
pub struct TcArgs {
    /// Thermocouple type: B, E, J, K, N, R, S or T.
    #[arg(long = "type", value_name = "TYPE")]
    tc_type: String,
    /// Measuring-junction temperature, °C: print the EMF to source.
    #[arg(long, allow_hyphen_values = true, value_name = "T", group = "tc_input")]
    temp_c: Option<String>,
    /// Measured EMF, mV: print the temperature.
    #[arg(long, allow_hyphen_values = true, value_name = "E", group = "tc_input")]
    mv: Option<String>,
    /// Cold (reference) junction temperature, °C (default 0).
    #[arg(long, allow_hyphen_values = true, value_name = "T")]
    cj_c: Option<String>,
    /// IEC 60584-1 tolerance class to report at that temperature: 1, 2 or 3.
    #[arg(long, value_name = "CLASS")]
    class: Option<String>,
    /// Print one JSON object.
    #[arg(long)]
    json: bool,
}

pub(super) fn tc(args: TcArgs, out: &mut dyn Write) -> CliResult {
    let tc: TcType = args.tc_type.parse().map_err(as_flag)?;
    let cj_c = match &args.cj_c {
        Some(t) => parse_in("cj-c", t, "°C")?,
        None => 0.0,
    };
    let (temp_c, mv) = match (&args.temp_c, &args.mv) {
        (Some(t), _) => {
            let t = parse_in("temp-c", t, "°C")?;
            (t, thermocouple::source_mv(tc, t, cj_c).map_err(as_flag)?)
        }
        (None, Some(e)) => {
            let e = parse_in("mv", e, "mV")?;
            (
                thermocouple::temp_c_from_measured(tc, e, cj_c).map_err(as_flag)?,
                e,
            )
        }
        (None, None) => {
            return Err(CliError::Input(FieldError::new(
                "input",
                "give --temp-c or --mv",
            )))
        }
    };
    let mv_cj = tc
        .mv_at(cj_c)
        .map_err(|e| as_flag(e.renamed("cj_temp_c")))?;
    let seebeck = tc.seebeck_mv_per_c(temp_c).map_err(as_flag)?;
    let class = match &args.class {
        Some(text) => {
            let class = text.parse::<TcClass>().map_err(as_flag)?;
            Some((class, tc.class_tolerance_c(class, temp_c).map_err(as_flag)?))
        }
        None => None,
    };
    if args.json {
        let obj = json!({
            "type": tc.letter().to_string(),
            "temp_c": temp_c,
            "mv": mv,
            "cj_c": cj_c,
            "mv_cj": mv_cj,
            "mv_ref_0c": mv + mv_cj,
            "seebeck_uv_per_c": seebeck * 1000.0,
            "class": class.map(|(c, _)| c.number()),
            "class_tolerance_c": class.map(|(_, t)| t),
        });
        return print_json(out, &obj);
    }
    let mut lines = vec![
        format!("thermocouple {} (NIST ITS-90)", tc),
        format!("temperature  {}", display::temperature(temp_c)),
        format!(
            "EMF          {} with the cold junction at {}",
            display::millivolts(mv),
            display::temperature_setting(cj_c)
        ),
        format!(
            "             {} referred to 0 °C",
            display::millivolts(mv + mv_cj)
        ),
        format!(
            "sensitivity  {}",
            display::microvolts_per_degree(seebeck * 1000.0)
        ),
    ];
    if let Some((c, t)) = class {
        lines.push(format!(
            "class {}      ±{} at this temperature (IEC 60584-1)",
            c.number(),
            display::temperature(t)
        ));
    }
    print_lines(out, &lines)
}

/// `loopside level`
#[derive(Debug, Args)]
#[command(after_help = "Examples:\n  \
    loopside level --sg 1,0 --min-m 0 --max-m 4,5 --tx-m -0,6 --unit mbar\n  \
    loopside level --sg 1,02 --min-m 0,3 --max-m 7 --mount wet-leg --leg-m 8 --fill-sg 1,0\n  \
    loopside level --sg 1,05 --min-m 0,5 --max-m 9 --mount seals --hp-seal-m 0,3 \\\n    \
    --lp-seal-m 9,5 --tx-m 1 --fill-sg 0,93 --unit inH2O --json\n  \
    loopside level --sg 1,0 --min-m 0,2 --max-m 1,8 --mount interface --upper-sg 0,85 \\\n    \
    --lp-tap-m 2 --fill-sg 0,93\n\
    Levels are metres above the bottom (HP) tap or seal. --tx-m is above that tap for\n\
    open, dry-leg and wet-leg; seals, open-seal and interface take every elevation from\n\
    one datum of your choice (only differences matter).\n\
    Mounts: open, dry-leg, wet-leg, seals, open-seal, interface.")]
pub struct LevelArgs {
    /// Specific gravity of the liquid (for interface: the lower, heavier liquid).
    #[arg(long, allow_hyphen_values = true, value_name = "S")]
    sg: String,
    /// Level at the LRV (4 mA), m above the bottom (HP) tap or seal.
    #[arg(long, allow_hyphen_values = true, value_name = "H")]
    min_m: String,
    /// Level at the URV (20 mA), m above the bottom (HP) tap or seal.
    #[arg(long, allow_hyphen_values = true, value_name = "H")]
    max_m: String,
    /// How the transmitter is connected (default open).
    #[arg(long, value_name = "MOUNT", value_parser = ["open", "dry-leg", "wet-leg", "seals", "open-seal", "interface"])]
    mount: Option<String>,
    /// Transmitter elevation, m: above the bottom tap for open, dry-leg and wet-leg; on the
    /// same datum as the seal or tap elevations for seals, open-seal and interface
    /// (default 0).
    #[arg(long, allow_hyphen_values = true, value_name = "Z")]
    tx_m: Option<String>,
    /// Bottom (HP) tap elevation for interface, m (default 0).
    #[arg(long, allow_hyphen_values = true, value_name = "Z")]
    hp_tap_m: Option<String>,
    /// Top (LP) tap elevation for interface, m.
    #[arg(long, allow_hyphen_values = true, value_name = "Z")]
    lp_tap_m: Option<String>,
    /// Specific gravity of the wet leg or the capillary fill.
    #[arg(long, allow_hyphen_values = true, value_name = "S")]
    fill_sg: Option<String>,
    /// Height of the wet leg's liquid column above the transmitter, m.
    #[arg(long, allow_hyphen_values = true, value_name = "H")]
    leg_m: Option<String>,
    /// HP seal elevation for seals and open-seal, m (default 0).
    #[arg(long, allow_hyphen_values = true, value_name = "Z")]
    hp_seal_m: Option<String>,
    /// LP seal elevation for seals, m.
    #[arg(long, allow_hyphen_values = true, value_name = "Z")]
    lp_seal_m: Option<String>,
    /// Specific gravity of the upper, lighter liquid for interface.
    #[arg(long, allow_hyphen_values = true, value_name = "S")]
    upper_sg: Option<String>,
    /// HP and LP ports connected the other way round.
    #[arg(long)]
    reversed: bool,
    /// A measured DP in --unit: also print the level it means.
    #[arg(long, allow_hyphen_values = true, value_name = "DP")]
    dp: Option<String>,
    /// Pressure unit for LRV, URV and span (default kPa).
    #[arg(long, value_name = "U")]
    unit: Option<String>,
    /// Print one JSON object.
    #[arg(long)]
    json: bool,
}

/// An optional flag's text, empty when not given.
fn text(v: &Option<String>) -> &str {
    v.as_deref().unwrap_or("")
}

impl LevelArgs {
    fn input(&self) -> crate::view::level::LevelInput<'_> {
        crate::view::level::LevelInput {
            piping: crate::view::level::Piping::from_name(self.mount.as_deref().unwrap_or("open")),
            sg: &self.sg,
            min_m: &self.min_m,
            max_m: &self.max_m,
            tx_m: text(&self.tx_m),
            leg_m: text(&self.leg_m),
            fill_sg: text(&self.fill_sg),
            hp_seal_m: text(&self.hp_seal_m),
            lp_seal_m: text(&self.lp_seal_m),
            upper_sg: text(&self.upper_sg),
            hp_tap_m: text(&self.hp_tap_m),
            lp_tap_m: text(&self.lp_tap_m),
            reversed: self.reversed,
            unit: text(&self.unit),
            dp: text(&self.dp),
        }
    }
}

pub(super) fn level(args: LevelArgs, out: &mut dyn Write) -> CliResult {
    let r = crate::view::level::result(&args.input())?;
    if args.json {
        let mut obj = json!({
            "mount": r.mount,
            "lrv": r.lrv,
            "urv": r.urv,
            "span": r.span,
            "unit": r.unit,
            "zero": r.zero,
            "zero_shift": r.zero_shift,
            "lrv_pa": r.lrv_pa,
            "urv_pa": r.urv_pa,
            "span_pa": r.span_pa,
        });
        if let Some(h) = r.level_m {
            obj["level_m"] = json!(h);
        }
        return print_json(out, &obj);
    }
    print_lines(out, &r.lines())
}
