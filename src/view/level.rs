//! DP level ranging's view model: the fields of `loopside level` and of the Level screen
//! read into a [`LevelSetup`], ranged by [`crate::level`], and said in one set of words.
//!
//! [`result`] gives LRV, URV, span and the zero elevation or suppression in the chosen
//! pressure unit; the command line prints [`LevelResult::lines`] and the screen shows the
//! same lines. [`view`] adds what only the screen shows: a tank sketch worked out as
//! fractions of the picture (taps, the transmitter's elevation against the bottom tap, the
//! liquid or the two liquids of an interface, and the leg or capillary fill), and the
//! cautions for the piping chosen, shown where the technician reads the result before going
//! to the tank.
//!
//! Field names in messages are the command line's flags without the dashes (`sg`, `min-m`,
//! `tx-m`, `leg-m`, `fill-sg` …) on both fronts.

use crate::caution::CAUTIONS;
use crate::display;
use crate::error::{FieldError, Result};
use crate::level::{self, LevelSetup, Mount, ZeroShift};
use crate::number::{parse_in, parse_number, parse_quantity};
use crate::units;

/// How the transmitter is piped, as picked.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Piping {
    /// Open (vented) tank, impulse line from the bottom tap.
    Open,
    /// Closed tank, LP leg full of gas.
    DryLeg,
    /// Closed tank, LP leg kept full of a fill liquid.
    WetLeg,
    /// Closed tank, diaphragm seals on both taps with capillaries.
    Seals,
    /// Open tank, one diaphragm seal on the bottom tap.
    OpenSeal,
    /// Interface between two liquids, legs or capillaries full of fill.
    Interface,
}

impl Piping {
    /// All of them, in the order offered.
    pub const ALL: [Piping; 6] = [
        Piping::Open,
        Piping::DryLeg,
        Piping::WetLeg,
        Piping::Seals,
        Piping::OpenSeal,
        Piping::Interface,
    ];

    /// The command line's name (`--mount`).
    pub fn name(self) -> &'static str {
        match self {
            Piping::Open => "open",
            Piping::DryLeg => "dry-leg",
            Piping::WetLeg => "wet-leg",
            Piping::Seals => "seals",
            Piping::OpenSeal => "open-seal",
            Piping::Interface => "interface",
        }
    }

    /// What the screen's picker says.
    pub fn label(self) -> &'static str {
        match self {
            Piping::Open => "Open tank",
            Piping::DryLeg => "Dry leg",
            Piping::WetLeg => "Wet leg",
            Piping::Seals => "Seals",
            Piping::OpenSeal => "Open, 1 seal",
            Piping::Interface => "Interface",
        }
    }

    /// The piping for a command-line name; open for anything else.
    pub fn from_name(name: &str) -> Piping {
        Piping::ALL
            .into_iter()
            .find(|p| p.name() == name.trim())
            .unwrap_or(Piping::Open)
    }

    /// True when every elevation is taken from one datum (seals, interface); false when
    /// `tx-m` is measured from the bottom tap.
    pub fn uses_datum(self) -> bool {
        matches!(self, Piping::Seals | Piping::OpenSeal | Piping::Interface)
    }

    /// The fields this piping reads besides sg, min-m, max-m, tx-m and the unit.
    pub fn fields(self) -> &'static [&'static str] {
        match self {
            Piping::Open | Piping::DryLeg => &[],
            Piping::WetLeg => &["leg-m", "fill-sg"],
            Piping::Seals => &["hp-seal-m", "lp-seal-m", "fill-sg"],
            Piping::OpenSeal => &["hp-seal-m", "fill-sg"],
            Piping::Interface => &["upper-sg", "hp-tap-m", "lp-tap-m", "fill-sg"],
        }
    }
}

/// The fields as typed (`12,5` and a unit suffix accepted). An empty optional field takes
/// its default (0 for tx-m, hp-seal-m, hp-tap-m); an empty field the piping needs is named.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct LevelInput<'a> {
    /// How the transmitter is piped.
    pub piping: Piping,
    /// Specific gravity of the liquid (interface: the lower, heavier one).
    pub sg: &'a str,
    /// Level at the LRV (4 mA), m above the bottom tap or seal.
    pub min_m: &'a str,
    /// Level at the URV (20 mA), m above the bottom tap or seal.
    pub max_m: &'a str,
    /// Transmitter elevation, m.
    pub tx_m: &'a str,
    /// Wet leg's liquid column above the transmitter, m.
    pub leg_m: &'a str,
    /// Leg or capillary fill's specific gravity.
    pub fill_sg: &'a str,
    /// HP seal elevation, m.
    pub hp_seal_m: &'a str,
    /// LP seal elevation, m.
    pub lp_seal_m: &'a str,
    /// Upper liquid's specific gravity (interface).
    pub upper_sg: &'a str,
    /// Bottom tap elevation (interface), m.
    pub hp_tap_m: &'a str,
    /// Top tap elevation (interface), m.
    pub lp_tap_m: &'a str,
    /// HP and LP ports the other way round.
    pub reversed: bool,
    /// Pressure unit of the results (empty: kPa).
    pub unit: &'a str,
    /// A measured DP (in `unit` unless typed with its own); empty for none.
    pub dp: &'a str,
}

impl Default for LevelInput<'_> {
    fn default() -> Self {
        LevelInput {
            piping: Piping::Open,
            sg: "",
            min_m: "",
            max_m: "",
            tx_m: "",
            leg_m: "",
            fill_sg: "",
            hp_seal_m: "",
            lp_seal_m: "",
            upper_sg: "",
            hp_tap_m: "",
            lp_tap_m: "",
            reversed: false,
            unit: "",
            dp: "",
        }
    }
}

/// The field name a core parameter is shown as (`min_m` → `min-m`, `dp_pa` → `dp`).
pub fn field_name(core: &str) -> String {
    match core {
        "dp_pa" => "dp".to_string(),
        other => other.replace('_', "-"),
    }
}

fn renamed(e: FieldError) -> FieldError {
    let name = field_name(&e.field);
    e.renamed(name)
}

fn required(text: &str, field: &str, piping: Piping) -> Result<f64> {
    if text.trim().is_empty() {
        return Err(FieldError::new(
            field,
            format!("is needed for the {} mount", piping.name()),
        ));
    }
    parse_number(field, text)
}

fn optional(text: &str, field: &str) -> Result<f64> {
    if text.trim().is_empty() {
        Ok(0.0)
    } else {
        parse_number(field, text)
    }
}

/// Read the fields into a setup. Errors name the field.
pub fn setup(input: &LevelInput<'_>) -> Result<LevelSetup> {
    let sg = parse_number("sg", input.sg)?;
    let min_m = parse_in("min-m", input.min_m, "m")?;
    let max_m = parse_in("max-m", input.max_m, "m")?;
    let tx_m = optional(input.tx_m, "tx-m")?;
    let p = input.piping;
    let mount = match p {
        Piping::Open => Mount::OpenTank { tx_m },
        Piping::DryLeg => Mount::DryLeg { tx_m },
        Piping::WetLeg => Mount::WetLeg {
            tx_m,
            leg_m: required(input.leg_m, "leg-m", p)?,
            fill_sg: required(input.fill_sg, "fill-sg", p)?,
        },
        Piping::Seals => Mount::Seals {
            hp_seal_m: optional(input.hp_seal_m, "hp-seal-m")?,
            lp_seal_m: required(input.lp_seal_m, "lp-seal-m", p)?,
            tx_m,
            fill_sg: required(input.fill_sg, "fill-sg", p)?,
        },
        Piping::OpenSeal => Mount::OpenTankSeal {
            hp_seal_m: optional(input.hp_seal_m, "hp-seal-m")?,
            tx_m,
            fill_sg: required(input.fill_sg, "fill-sg", p)?,
        },
        Piping::Interface => Mount::Interface {
            upper_sg: required(input.upper_sg, "upper-sg", p)?,
            hp_tap_m: optional(input.hp_tap_m, "hp-tap-m")?,
            lp_tap_m: required(input.lp_tap_m, "lp-tap-m", p)?,
            tx_m,
            fill_sg: required(input.fill_sg, "fill-sg", p)?,
        },
    };
    Ok(LevelSetup {
        sg,
        min_m,
        max_m,
        mount,
        ports_swapped: input.reversed,
    })
}

/// The ranging, in the chosen unit and in pascals.
#[derive(Debug, Clone, PartialEq)]
pub struct LevelResult {
    /// The mount's name (`closed tank, wet leg`).
    pub mount: String,
    /// The pressure unit's symbol.
    pub unit: String,
    /// LRV, URV and span in `unit`.
    pub lrv: f64,
    /// URV in `unit`.
    pub urv: f64,
    /// Span in `unit`.
    pub span: f64,
    /// `none`, `elevated` or `suppressed`.
    pub zero: &'static str,
    /// The elevation or suppression in `unit` (0 when none).
    pub zero_shift: f64,
    /// LRV, Pa.
    pub lrv_pa: f64,
    /// URV, Pa.
    pub urv_pa: f64,
    /// Span, Pa.
    pub span_pa: f64,
    /// The level a typed DP means, m above the bottom tap or seal.
    pub level_m: Option<f64>,
    /// The result as (what, value) rows: `("LRV", "-6653.3 mmH2O")`, the same words on
    /// the screen and the command line.
    pub rows: Vec<(String, String)>,
}

impl LevelResult {
    /// The rows as the command line prints them, one line each (`LRV     -6653.3 mmH2O`).
    pub fn lines(&self) -> Vec<String> {
        self.rows
            .iter()
            .map(|(what, value)| format!("{what:<8}{value}"))
            .collect()
    }
}

/// The elevation or suppression of zero in words, the amount in `unit` (a pressure unit)
/// rounded for the range's `span` in that unit: `suppressed zero by 64.80 inH2O(conv)
/// (LRV above 0)`.
pub fn zero_words(zero: &ZeroShift, unit: &str, span: f64) -> Result<String> {
    Ok(match zero {
        ZeroShift::None => "zero-based (LRV = 0)".to_string(),
        ZeroShift::Elevated { by_pa } => format!(
            "elevated zero by {} (LRV below 0)",
            display::value(units::difference_from_pa(*by_pa, unit, "unit")?, unit, span)
        ),
        ZeroShift::Suppressed { by_pa } => format!(
            "suppressed zero by {} (LRV above 0)",
            display::value(units::difference_from_pa(*by_pa, unit, "unit")?, unit, span)
        ),
    })
}

/// Range the setup typed. The unit is checked first, so its message comes before any
/// other field's.
pub fn result(input: &LevelInput<'_>) -> Result<LevelResult> {
    let unit_text = if input.unit.trim().is_empty() {
        "kPa"
    } else {
        input.unit
    };
    // A plain or gauge pressure unit: a DP or a head is not counted from vacuum.
    units::difference_from_pa(0.0, unit_text, "unit")?;
    let unit = units::lookup(unit_text).map_or(unit_text, |u| u.symbol);
    let setup = setup(input)?;
    let ranging = level::range(&setup).map_err(renamed)?;
    let (lrv, urv, span) = ranging.in_unit(unit).map_err(renamed)?;
    let (zero, zero_shift) = match ranging.zero {
        ZeroShift::None => ("none", 0.0),
        ZeroShift::Elevated { by_pa } => {
            ("elevated", units::difference_from_pa(by_pa, unit, "unit")?)
        }
        ZeroShift::Suppressed { by_pa } => (
            "suppressed",
            units::difference_from_pa(by_pa, unit, "unit")?,
        ),
    };
    let level_m = if input.dp.trim().is_empty() {
        None
    } else {
        // A DP typed with its own unit is a difference: only the factor applies.
        let dp_pa = match parse_quantity("dp", input.dp)? {
            (dp, None) => units::difference_to_pa(dp, unit, "dp")?,
            (dp, Some(typed)) => units::difference_to_pa(dp, typed.symbol, "dp")?,
        };
        Some(level::level_from_dp(&setup, dp_pa).map_err(renamed)?)
    };
    let row = |what: &str, value: String| (what.to_string(), value);
    let mut rows = vec![
        row("mount", setup.mount.name().to_string()),
        row("LRV", display::value(lrv, unit, span)),
        row("URV", display::value(urv, unit, span)),
        row("span", display::value(span, unit, span)),
        row("zero", zero_words(&ranging.zero, unit, span)?),
    ];
    if let Some(h) = level_m {
        rows.push(row("level", display::height(h)));
    }
    Ok(LevelResult {
        mount: setup.mount.name().to_string(),
        unit: unit.to_string(),
        lrv,
        urv,
        span,
        zero,
        zero_shift,
        lrv_pa: ranging.lrv_pa,
        urv_pa: ranging.urv_pa,
        span_pa: ranging.span_pa,
        level_m,
        rows,
    })
}

/// A rectangle as fractions of the sketch (x across, y down from the top).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Frac {
    /// Left edge, 0..1.
    pub x: f64,
    /// Top edge, 0..1.
    pub y: f64,
    /// Width, 0..1.
    pub w: f64,
    /// Height, 0..1.
    pub h: f64,
}

/// What a connecting line holds.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum LineFill {
    /// The process liquid (an impulse line full from the tap).
    Liquid,
    /// The leg's or capillary's fill.
    Fill,
    /// Gas or vapour (a dry leg).
    Gas,
    /// Open to the air (the LP port of an open tank).
    Vent,
}

/// One connecting line: a polyline of horizontal and vertical runs through `points`
/// (fractions of the sketch, x across and y down), and what it holds.
#[derive(Debug, Clone, PartialEq)]
pub struct Line {
    /// The corners, in order.
    pub points: Vec<(f64, f64)>,
    /// What it holds (its colour on the screen).
    pub fill: LineFill,
}

/// A label placed at a fraction of the sketch.
#[derive(Debug, Clone, PartialEq)]
pub struct Label {
    /// Left edge, 0..1.
    pub x: f64,
    /// Vertical centre, 0..1.
    pub y: f64,
    /// The words.
    pub text: String,
}

/// The tank sketch, as fractions of the picture.
#[derive(Debug, Clone, PartialEq)]
pub struct Sketch {
    /// The vessel's walls.
    pub tank: Frac,
    /// Closed vessel (drawn with a roof); open tanks have none.
    pub closed: bool,
    /// The liquid (interface: the lower, heavier one), drawn half-way up the range.
    pub liquid: Frac,
    /// The 0 % and 100 % levels, as fractions of the height (drawn as marks on the tank).
    pub marks: [f64; 2],
    /// The upper liquid of an interface.
    pub upper: Option<Frac>,
    /// The transmitter.
    pub transmitter: Frac,
    /// HP and LP connections.
    pub lines: Vec<Line>,
    /// Taps, levels and the transmitter's elevation, in words.
    pub labels: Vec<Label>,
    /// The whole picture in one sentence (screen readers, tests).
    pub description: String,
}

/// Everything the Level screen shows.
#[derive(Debug, Clone, PartialEq)]
pub struct LevelView {
    /// The result, when every field reads.
    pub result: Option<LevelResult>,
    /// The sketch, when the geometry reads (it is drawn even if the ranging fails).
    pub sketch: Option<Sketch>,
    /// The first field that cannot be read, in words; empty when all is well.
    pub problem: String,
    /// That field's name; empty when none.
    pub problem_field: String,
    /// The cautions for this piping, in the order shown.
    pub cautions: Vec<String>,
}

/// Draining or refilling a wet leg.
pub const WET_LEG_CAUTION: &str = "Wet leg: draining or refilling it opens the LP side to the vessel's pressure and lets out the fill, which may be hot condensate or glycol. Isolate the transmitter at its manifold first, under the site's procedure; refill to the height used here before checking the zero, or the reading is off by the missing head.";
/// Draining condensate from a dry leg.
pub const DRY_LEG_CAUTION: &str = "Dry leg: condensate in the leg makes the level read low. Draining it opens the LP side to the vessel's vapour space under pressure: isolate the transmitter first and drain only to a safe place, under the site's procedure.";
/// Seals and capillaries.
pub const SEAL_CAUTION: &str = "Seals: never loosen a capillary or a seal's fill connection; the fill cannot be put back in the field. Taking a seal off the vessel opens the process: only with the vessel isolated and drained under the site's procedure.";

/// The cautions to show for `piping`: its own, then the process-side and the closing
/// cautions of [`crate::caution`].
pub fn cautions(piping: Piping) -> Vec<String> {
    let own = match piping {
        Piping::Open => None,
        Piping::DryLeg => Some(DRY_LEG_CAUTION),
        Piping::WetLeg => Some(WET_LEG_CAUTION),
        Piping::Seals | Piping::OpenSeal | Piping::Interface => Some(SEAL_CAUTION),
    };
    let process = CAUTIONS
        .iter()
        .find(|c| c.starts_with("Process side"))
        .copied();
    let closing = CAUTIONS.last().copied();
    [own, process, closing]
        .into_iter()
        .flatten()
        .map(str::to_string)
        .collect()
}

/// The screen's view of what is typed.
pub fn view(input: &LevelInput<'_>) -> LevelView {
    let cautions = cautions(input.piping);
    let sketch = setup(input).ok().map(|s| sketch(&s));
    match result(input) {
        Ok(r) => LevelView {
            result: Some(r),
            sketch,
            problem: String::new(),
            problem_field: String::new(),
            cautions,
        },
        Err(e) => LevelView {
            result: None,
            sketch,
            problem: e.to_string(),
            problem_field: e.field,
            cautions,
        },
    }
}

/// Elevations (m, from one datum) of what the sketch shows.
struct Heights {
    /// Bottom (HP) tap or seal.
    hp: f64,
    /// Top (LP) tap or seal, if the piping has one.
    lp: Option<f64>,
    /// Transmitter.
    tx: f64,
    /// Top of a wet leg's fill.
    leg_top: Option<f64>,
}

fn heights(s: &LevelSetup) -> Heights {
    match s.mount {
        Mount::OpenTank { tx_m } => Heights {
            hp: 0.0,
            lp: None,
            tx: tx_m,
            leg_top: None,
        },
        Mount::DryLeg { tx_m } => Heights {
            hp: 0.0,
            lp: Some(s.max_m.max(s.min_m) * 1.1),
            tx: tx_m,
            leg_top: None,
        },
        Mount::WetLeg { tx_m, leg_m, .. } => Heights {
            hp: 0.0,
            lp: Some(tx_m + leg_m),
            tx: tx_m,
            leg_top: Some(tx_m + leg_m),
        },
        Mount::Seals {
            hp_seal_m,
            lp_seal_m,
            tx_m,
            ..
        } => Heights {
            hp: hp_seal_m,
            lp: Some(lp_seal_m),
            tx: tx_m,
            leg_top: None,
        },
        Mount::OpenTankSeal {
            hp_seal_m, tx_m, ..
        } => Heights {
            hp: hp_seal_m,
            lp: None,
            tx: tx_m,
            leg_top: None,
        },
        Mount::Interface {
            hp_tap_m,
            lp_tap_m,
            tx_m,
            ..
        } => Heights {
            hp: hp_tap_m,
            lp: Some(lp_tap_m),
            tx: tx_m,
            leg_top: None,
        },
    }
}

/// Left and right walls of the tank, and the transmitter's centre line (fractions).
const TANK_LEFT: f64 = 0.08;
const TANK_RIGHT: f64 = 0.48;
const TX_X: f64 = 0.64;
const TX_W: f64 = 0.12;
const TX_H: f64 = 0.08;

/// Metres and fractions formatted as words for the labels.
fn metres(v: f64) -> String {
    display::height_label(v)
}

/// The sketch for a setup that reads. Elevations map onto the picture's height with a
/// margin; a transmitter far below the tank still shows, with its distance in words.
pub fn sketch(s: &LevelSetup) -> Sketch {
    let h = heights(s);
    let levels = [h.hp + s.min_m, h.hp + s.max_m];
    let mut all = vec![h.hp, h.tx, levels[0], levels[1]];
    all.extend(h.lp);
    all.extend(h.leg_top);
    let lo = all.iter().copied().fold(f64::INFINITY, f64::min);
    let hi = all.iter().copied().fold(f64::NEG_INFINITY, f64::max);
    let range = (hi - lo).max(1e-6);
    // 10 % margin top and bottom; y grows downwards.
    let y = |z: f64| (0.9 - 0.8 * (z - lo) / range).clamp(0.0, 1.0);
    let closed = h.lp.is_some();
    let roof = h.lp.unwrap_or(levels[1].max(levels[0])).max(levels[1]);
    let tank_top = y(roof) - 0.05;
    let tank_bottom = y(h.hp.min(levels[0])) + 0.04;
    let tank = Frac {
        x: TANK_LEFT,
        y: tank_top.max(0.0),
        w: TANK_RIGHT - TANK_LEFT,
        h: (tank_bottom - tank_top).max(0.02),
    };
    let full = y((levels[0] + levels[1]) / 2.0);
    let liquid = Frac {
        x: TANK_LEFT,
        y: full,
        w: TANK_RIGHT - TANK_LEFT,
        h: (tank.y + tank.h - full).max(0.0),
    };
    let (liquid, upper) = match s.mount {
        Mount::Interface { .. } => {
            // The vessel is full above the top tap: the light liquid up to the roof, the
            // heavy one to the interface half-way up the range.
            let upper = Frac {
                x: TANK_LEFT,
                y: tank.y,
                w: TANK_RIGHT - TANK_LEFT,
                h: (full - tank.y).max(0.0),
            };
            (liquid, Some(upper))
        }
        _ => (liquid, None),
    };
    let ty = y(h.tx);
    let transmitter = Frac {
        x: TX_X - TX_W / 2.0,
        y: ty - TX_H / 2.0,
        w: TX_W,
        h: TX_H,
    };
    let hp_y = y(h.hp);
    let hp_fill = match s.mount {
        Mount::OpenTank { .. } | Mount::DryLeg { .. } | Mount::WetLeg { .. } => LineFill::Liquid,
        _ => LineFill::Fill,
    };
    // HP from the bottom tap across to the transmitter's left-hand port.
    let hp_port_x = TX_X - TX_W / 4.0;
    let mut lines = vec![Line {
        points: vec![(TANK_RIGHT, hp_y), (hp_port_x, hp_y), (hp_port_x, ty)],
        fill: hp_fill,
    }];
    let lp_port_x = TX_X + TX_W / 4.0;
    let lp_x = TX_X + TX_W / 2.0 + 0.08;
    match h.lp {
        Some(lp) => {
            let lp_y = y(lp);
            let fill = match s.mount {
                Mount::DryLeg { .. } => LineFill::Gas,
                _ => LineFill::Fill,
            };
            lines.push(Line {
                points: vec![
                    (TANK_RIGHT, lp_y),
                    (lp_x, lp_y),
                    (lp_x, ty),
                    (lp_port_x, ty),
                ],
                fill,
            });
        }
        None => lines.push(Line {
            // The LP port vented: a short open stub upwards.
            points: vec![
                (lp_port_x, ty - TX_H / 2.0),
                (lp_port_x, (ty - TX_H / 2.0 - 0.06).max(0.0)),
            ],
            fill: LineFill::Vent,
        }),
    }
    let mut labels = vec![
        Label {
            x: TANK_LEFT + 0.01,
            y: y(levels[1]),
            text: "100 %".to_string(),
        },
        Label {
            x: TANK_LEFT + 0.01,
            y: y(levels[0]),
            text: "0 %".to_string(),
        },
        Label {
            x: TANK_RIGHT + 0.02,
            y: hp_y - 0.03,
            text: if uses_seals(s) {
                "HP seal".to_string()
            } else {
                "HP tap".to_string()
            },
        },
    ];
    if let Some(lp) = h.lp {
        labels.push(Label {
            x: TANK_RIGHT + 0.02,
            y: y(lp) - 0.03,
            text: if uses_seals(s) {
                "LP seal".to_string()
            } else {
                "LP tap".to_string()
            },
        });
    }
    let tx_rel = h.tx - h.hp;
    let tx_words = if tx_rel.abs() < 5e-4 {
        "transmitter level with the HP tap".to_string()
    } else if tx_rel > 0.0 {
        format!("transmitter {} m above the HP tap", metres(tx_rel))
    } else {
        format!("transmitter {} m below the HP tap", metres(tx_rel))
    };
    labels.push(Label {
        x: TANK_RIGHT,
        y: (ty + TX_H / 2.0 + 0.05).min(0.96),
        text: tx_words.replace("transmitter ", "Tx "),
    });
    let fill_words = match s.mount {
        Mount::OpenTank { .. } => "LP vented".to_string(),
        Mount::DryLeg { .. } => "LP leg dry (gas)".to_string(),
        Mount::WetLeg { leg_m, fill_sg, .. } => format!(
            "LP leg full of SG {} fill, {} m",
            display::trimmed(fill_sg),
            metres(leg_m)
        ),
        Mount::Seals { fill_sg, .. } | Mount::Interface { fill_sg, .. } => {
            format!("capillaries full of SG {} fill", display::trimmed(fill_sg))
        }
        Mount::OpenTankSeal { fill_sg, .. } => format!(
            "capillary full of SG {} fill, LP vented",
            display::trimmed(fill_sg)
        ),
    };
    let liquid_words = match s.mount {
        Mount::Interface { upper_sg, .. } => format!(
            "SG {} below SG {}",
            display::trimmed(s.sg),
            display::trimmed(upper_sg)
        ),
        _ => format!("liquid SG {}", display::trimmed(s.sg)),
    };
    let description = format!(
        "{}: {liquid_words}, 0 % at {} m and 100 % at {} m above the HP {}; {tx_words}; {fill_words}.",
        s.mount.name(),
        metres(s.min_m),
        metres(s.max_m),
        if uses_seals(s) { "seal" } else { "tap" },
    );
    Sketch {
        tank,
        closed,
        liquid,
        marks: [y(levels[0]), y(levels[1])],
        upper,
        transmitter,
        lines,
        labels,
        description,
    }
}

/// Whether the mount's connections are diaphragm seals.
fn uses_seals(s: &LevelSetup) -> bool {
    matches!(s.mount, Mount::Seals { .. } | Mount::OpenTankSeal { .. })
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The published wet-leg example used by `tests/cli_sensors.rs`
    /// (learninstrumentationengineering.com, "Calibration of DP level transmitter
    /// (elevation)"): SG 1.12 over 5470 mm, transmitter 1250 mm above the HP tap, wet leg
    /// of SG 1.17 filled 4490 mm → −6653.3 to −526.9 mmH2O.
    fn wet_leg() -> LevelInput<'static> {
        LevelInput {
            piping: Piping::WetLeg,
            sg: "1,12",
            min_m: "0",
            max_m: "5,47",
            tx_m: "1,25",
            leg_m: "4,49",
            fill_sg: "1,17",
            unit: "mmH2O",
            ..LevelInput::default()
        }
    }

    #[test]
    fn a_published_wet_leg_ranging() {
        let r = result(&wet_leg()).unwrap();
        assert!((r.lrv - -6653.3).abs() < 1e-6, "{}", r.lrv);
        assert!((r.urv - -526.9).abs() < 1e-6, "{}", r.urv);
        assert!((r.span - 6126.4).abs() < 1e-6, "{}", r.span);
        assert_eq!(r.zero, "elevated");
        assert_eq!(r.lines()[0], "mount   closed tank, wet leg");
        assert!(
            r.lines()[4].starts_with("zero    elevated zero by 6653"),
            "{:?}",
            r.lines()
        );
    }

    #[test]
    fn a_suppressed_zero_below_an_open_tank() {
        // instrumentationtoolbox.com, "Zero Suppression Calibration in Level Measurement":
        // transmitter 6 ft below the base, SG 0.9 → LRV 64.8 "W.C., a suppressed zero.
        let input = LevelInput {
            sg: "0.9",
            min_m: "0",
            max_m: "12.192",
            tx_m: "-1.8288",
            unit: "inH2O(conv)",
            ..LevelInput::default()
        };
        let r = result(&input).unwrap();
        assert_eq!(r.zero, "suppressed");
        assert!(
            r.lines()[4].contains("suppressed zero by 64.80"),
            "{:?}",
            r.lines()
        );
        let v = view(&input);
        let s = v.sketch.unwrap();
        assert!(!s.closed);
        // The transmitter is drawn below the bottom of the tank.
        assert!(s.transmitter.y > s.tank.y + s.tank.h, "{s:?}");
        assert!(
            s.description
                .contains("transmitter 1.83 m below the HP tap"),
            "{}",
            s.description
        );
        assert_eq!(s.lines[1].fill, LineFill::Vent);
    }

    #[test]
    fn seals_and_a_dp_read_back_to_a_level() {
        // mycelectric.com, "Level Calculation for Diaphragm Seal Transmitter": SG 0.96 over
        // 4 m, seals 5 m apart filled with SG 1.05 → −5250 to −1410 mmH2O; −3330 is 2 m.
        let input = LevelInput {
            piping: Piping::Seals,
            sg: "0.96",
            min_m: "0",
            max_m: "4",
            lp_seal_m: "5",
            tx_m: "-1",
            fill_sg: "1.05",
            unit: "mmH2O",
            dp: "-3330",
            ..LevelInput::default()
        };
        let r = result(&input).unwrap();
        assert!((r.lrv - -5250.0).abs() < 1e-6);
        assert!((r.urv - -1410.0).abs() < 1e-6);
        assert_eq!(r.level_m.map(|h| (h * 1e6).round() / 1e6), Some(2.0));
        assert_eq!(r.lines().last().unwrap(), "level   2.000 m");
        let s = view(&input).sketch.unwrap();
        assert!(s.closed);
        assert!(s.lines.iter().all(|l| l.fill == LineFill::Fill));
        assert!(s.description.contains("capillaries full of SG 1.05 fill"));
    }

    #[test]
    fn the_sketch_follows_the_typing() {
        let mut input = wet_leg();
        let a = view(&input).sketch.unwrap();
        // Raise the transmitter: it moves up the picture (y falls).
        input.tx_m = "3";
        let b = view(&input).sketch.unwrap();
        assert!(b.transmitter.y < a.transmitter.y, "{a:?} {b:?}");
        assert_eq!(b.lines[1].fill, LineFill::Fill);
        assert!(b.description.contains("LP leg full of SG 1.17 fill"));
        // Every run of every line is horizontal or vertical, inside the picture.
        for line in &b.lines {
            for w in line.points.windows(2) {
                assert!(w[0].0 == w[1].0 || w[0].1 == w[1].1, "{line:?}");
            }
            assert!(line
                .points
                .iter()
                .all(|(x, y)| (0.0..=1.0).contains(x) && (0.0..=1.0).contains(y)));
        }
        // The liquid is drawn up to the 100 % level, below the roof of the closed tank.
        assert!(b.liquid.y > b.tank.y);
    }

    #[test]
    fn an_interface_shows_two_liquids() {
        let input = LevelInput {
            piping: Piping::Interface,
            sg: "1,0",
            min_m: "0,2",
            max_m: "1,8",
            upper_sg: "0,85",
            lp_tap_m: "2",
            fill_sg: "0,93",
            ..LevelInput::default()
        };
        let v = view(&input);
        assert!(v.result.is_some(), "{}", v.problem);
        let s = v.sketch.unwrap();
        let upper = s.upper.unwrap();
        assert!(upper.y < s.liquid.y);
        assert!(
            s.description.contains("SG 1 below SG 0.85"),
            "{}",
            s.description
        );
    }

    #[test]
    fn a_missing_field_is_named_and_the_typing_kept() {
        let mut input = wet_leg();
        input.leg_m = "";
        let v = view(&input);
        assert_eq!(v.problem_field, "leg-m");
        assert!(
            v.problem.contains("is needed for the wet-leg mount"),
            "{}",
            v.problem
        );
        assert!(v.result.is_none());
        input.leg_m = "4,49";
        input.unit = "bara";
        assert_eq!(view(&input).problem_field, "unit");
        input.unit = "kPa";
        input.max_m = "0";
        assert_eq!(view(&input).problem_field, "max-m");
        input.max_m = "x";
        assert_eq!(view(&input).problem_field, "max-m");
    }

    #[test]
    fn cautions_for_the_leg_or_seal_before_the_process_side_ones() {
        let wet = cautions(Piping::WetLeg);
        assert_eq!(wet[0], WET_LEG_CAUTION);
        assert!(wet[1].starts_with("Process side"));
        assert!(wet.last().unwrap().contains("never replaces"));
        assert_eq!(cautions(Piping::Seals)[0], SEAL_CAUTION);
        assert_eq!(cautions(Piping::Open).len(), 2);
        assert_eq!(Piping::from_name("dry-leg"), Piping::DryLeg);
        assert_eq!(Piping::from_name("??"), Piping::Open);
    }
}
