//! The typed evaluations a fault-finding step can run on its measurements.
//!
//! A procedure file names an evaluation (`terminal-volts`, `leakage` …); here each one
//! declares the measurements it needs, the outcomes it can give (the branch names a
//! procedure must cover), and computes its findings with the core's own arithmetic:
//! [`crate::signal`] for NE 43 bands, [`crate::budget`] for the loop's voltage, the tag's
//! [`crate::scale::Scale`] and [`super::mismatch`] for readings that disagree.
//!
//! One file per evaluation: [`band`], [`supply`], [`terminal_volts`], [`leakage`],
//! [`hart`], `readings` (display, transmitter and indicator-vs-control mismatches),
//! `shield_noise` and `current_swing`; this file holds what they share (the finding, the
//! settings, the dispatch by name).

pub mod band;
mod current_swing;
pub mod hart;
pub mod leakage;
mod readings;
mod shield_noise;
pub mod supply;
pub mod terminal_volts;

pub use band::{signal_band, BandFinding};
pub use hart::{hart_window, HartFinding};
pub use leakage::{leakage, LeakageFinding, LEAKAGE_ASSUMED_LOOP};
pub use supply::{supply, SupplyFinding};
pub use terminal_volts::{terminal_volts, VoltageFinding};

use super::measure::Measurement;
use super::mismatch;
use crate::display;
use crate::error::{FieldError, Result};
use crate::tag::Tag;
use serde::{Deserialize, Serialize};
use std::collections::BTreeMap;

/// Below this (V) nothing reaches the point measured (common practice: a live 24 V loop
/// never reads under 1 V anywhere it is connected).
pub const NO_VOLTS_BELOW: f64 = 1.0;
/// A loop reading over this many ohms with the power off is open, Ω (common practice).
pub const OPEN_LOOP_OHMS: f64 = 1.0e6;
/// Default allowance between two mA readings taken with handheld meters, mA (rule of
/// thumb, from memory: two readings of a 0.05 %-class meter plus placement; set your own).
pub const DEFAULT_METER_TOLERANCE_MA: f64 = 0.05;
/// Default limit of AC volts from shield to ground before noise is suspected, V (rule of
/// thumb, from memory; sites set their own).
pub const DEFAULT_SHIELD_AC_LIMIT_V: f64 = 1.0;
/// Measured loop resistance above the drawing by more than this fraction plus
/// [`EXTRA_OHMS_FLOOR`] is reported as unexplained resistance (rule of thumb).
pub const EXTRA_OHMS_FRACTION: f64 = 0.05;
/// See [`EXTRA_OHMS_FRACTION`], Ω.
pub const EXTRA_OHMS_FLOOR: f64 = 10.0;

/// Settings a session uses when judging measurements.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct Settings {
    /// Allowance between two mA readings (meter tolerance), mA.
    #[serde(default = "default_meter")]
    pub meter_tolerance_ma: f64,
    /// AC volts from shield to ground above which noise is suspected, V.
    #[serde(default = "default_shield")]
    pub shield_ac_limit_v: f64,
}

fn default_meter() -> f64 {
    DEFAULT_METER_TOLERANCE_MA
}

fn default_shield() -> f64 {
    DEFAULT_SHIELD_AC_LIMIT_V
}

impl Default for Settings {
    fn default() -> Self {
        Settings {
            meter_tolerance_ma: DEFAULT_METER_TOLERANCE_MA,
            shield_ac_limit_v: DEFAULT_SHIELD_AC_LIMIT_V,
        }
    }
}

impl Settings {
    /// Check the settings.
    pub fn validate(&self) -> Result<()> {
        crate::error::within("meter_tolerance_ma", self.meter_tolerance_ma, 0.0, 5.0)?;
        crate::error::within("shield_ac_limit_v", self.shield_ac_limit_v, 0.0, 1000.0)?;
        Ok(())
    }

    /// The tolerance used to call a hypothesis a fit, % of span: the tag's tolerance plus
    /// the meter allowance.
    pub fn fit_tolerance_pct(&self, tag: &Tag) -> f64 {
        tag.tolerance_percent + self.meter_tolerance_ma / tag.scale.signal.width_ma() * 100.0
    }
}

/// One finding, ready for the log: a stable code, plain words with numbers, and the typed
/// detail as JSON. A finding saved under an old leakage code is read with today's code
/// (see [`OLD_LEAKAGE_CODES`]).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(from = "StoredFinding")]
pub struct Finding {
    /// The step that produced it (filled in by the session).
    #[serde(default)]
    pub step: String,
    /// Stable machine name, e.g. `not-enough-voltage`.
    pub code: String,
    /// What it means, in a technician's words, with the numbers.
    pub text: String,
    /// The computed values.
    pub detail: serde_json::Value,
}

/// A finding as stored, before old leakage codes are mapped.
#[derive(Deserialize)]
struct StoredFinding {
    #[serde(default)]
    step: String,
    code: String,
    text: String,
    detail: serde_json::Value,
}

/// Leakage outcome ids of records saved before the outcomes said where the path is, with
/// the id each is read as today.
///
/// The old ids named the physics backwards: `leak` was given when the receiver read *less*
/// than the transmitter, and its words blamed a path across the pair; `extra-current` when
/// the receiver read *more*, and its words blamed an outside source. What such a record
/// keeps for certain is the measurement — which way the currents differed — so the id is
/// mapped by that direction, not by the old words: receiver less → `to-earth`, receiver
/// more → `across-pair`.
pub const OLD_LEAKAGE_OUTCOMES: [(&str, &str); 2] =
    [("leak", "to-earth"), ("extra-current", "across-pair")];

/// Leakage finding codes of old records and the code each is read as today, mapped by the
/// direction measured as in [`OLD_LEAKAGE_OUTCOMES`]: `leakage` (receiver less) →
/// `leak-to-earth`, `extra-current` (receiver more) → `leak-across-pair`.
pub const OLD_LEAKAGE_CODES: [(&str, &str); 2] = [
    ("leakage", "leak-to-earth"),
    ("extra-current", "leak-across-pair"),
];

/// Today's id for an outcome saved under an old leakage id; any other id as it is.
pub fn current_outcome_id(outcome: &str) -> &str {
    OLD_LEAKAGE_OUTCOMES
        .iter()
        .find(|(old, _)| *old == outcome)
        .map_or(outcome, |(_, new)| new)
}

impl From<StoredFinding> for Finding {
    /// Reads an old leakage finding under today's code. The recorded measurements and
    /// text stay as they were (the text is what the technician was shown); a marked note
    /// is added that says what the direction measured means. An old `leakage` record's
    /// path resistance was worked out as if the path were across the pair, which a
    /// receiver reading less does not show, so it is taken out of the detail and quoted
    /// in the note instead.
    fn from(stored: StoredFinding) -> Finding {
        let StoredFinding {
            step,
            code,
            mut text,
            mut detail,
        } = stored;
        let Some((_, new_code)) = OLD_LEAKAGE_CODES.iter().find(|(old, _)| *old == code) else {
            return Finding {
                step,
                code,
                text,
                detail,
            };
        };
        if let Some(obj) = detail.as_object_mut() {
            if let Some(o) = obj.get("outcome").and_then(|o| o.as_str()) {
                let mapped = current_outcome_id(o).to_string();
                obj.insert("outcome".to_string(), serde_json::Value::String(mapped));
            }
        }
        let note = if *new_code == "leak-to-earth" {
            let old_path = detail
                .get_mut("leak_path_kohm")
                .map(serde_json::Value::take)
                .and_then(|v| v.as_f64());
            let dropped = match old_path {
                Some(k) => format!(
                    " The {} kΩ worked out then assumed a path across the pair and does not apply.",
                    display::fixed(k, 1)
                ),
                None => String::new(),
            };
            format!(
                " [Note added when this record was read: it was saved before loopside corrected the leakage direction. The receiver read less than the transmitter, which points to current leaving the loop to earth between them (or a device fed from the loop), not to a path across the pair.{dropped} {LEAKAGE_ASSUMED_LOOP}]"
            )
        } else {
            format!(
                " [Note added when this record was read: it was saved before loopside corrected the leakage direction. The receiver read more than the transmitter, which points to a path across the pair in parallel with the transmitter (moisture, a surge protector, damaged insulation), not to an outside source. {LEAKAGE_ASSUMED_LOOP}]"
            )
        };
        text.push_str(&note);
        Finding {
            step,
            code: new_code.to_string(),
            text,
            detail,
        }
    }
}

impl Finding {
    fn new(code: &str, text: String, detail: impl Serialize) -> Finding {
        Finding {
            step: String::new(),
            code: code.to_string(),
            text,
            detail: serde_json::to_value(detail).unwrap_or(serde_json::Value::Null),
        }
    }
}

/// What an evaluation gives: the branch to take and the findings.
#[derive(Debug, Clone, PartialEq)]
pub struct Evaluated {
    /// The outcome name (one of [`Evaluation::outcomes`]).
    pub outcome: &'static str,
    /// Findings, in the order to show them.
    pub findings: Vec<Finding>,
}

/// The evaluations a procedure may name.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum Evaluation {
    /// NE 43 band of the current at the transmitter.
    BandAtTransmitter,
    /// NE 43 band of the current at the receiver.
    BandAtReceiver,
    /// Is there supply voltage, and enough of it?
    Supply,
    /// Terminal volts against the transmitter minimum, with the budget's numbers.
    TerminalVolts,
    /// Current at the transmitter against current at the receiver.
    Leakage,
    /// The same, with the receiver current from the volts across its resistor.
    LeakageFromResistor,
    /// Receiver display against the loop current.
    DisplayMismatch,
    /// Loop current against the true process value.
    TransmitterMismatch,
    /// Indicator and control system against the loop current.
    IndicatorVsControl,
    /// Loop resistance against the HART window.
    HartWindow,
    /// AC volts from shield to ground.
    ShieldNoise,
    /// Swing of the loop current against the tolerance.
    CurrentSwing,
}

/// Every evaluation.
pub const ALL: [Evaluation; 12] = [
    Evaluation::BandAtTransmitter,
    Evaluation::BandAtReceiver,
    Evaluation::Supply,
    Evaluation::TerminalVolts,
    Evaluation::Leakage,
    Evaluation::LeakageFromResistor,
    Evaluation::DisplayMismatch,
    Evaluation::TransmitterMismatch,
    Evaluation::IndicatorVsControl,
    Evaluation::HartWindow,
    Evaluation::ShieldNoise,
    Evaluation::CurrentSwing,
];

const BAND_OUTCOMES: [&str; 8] = [
    "no-loop-current",
    "fail-low",
    "suspect-low",
    "under-range",
    "in-range",
    "over-range",
    "suspect-high",
    "fail-high",
];

impl Evaluation {
    /// The name used in procedure files.
    pub fn key(self) -> &'static str {
        match self {
            Evaluation::BandAtTransmitter => "band-at-transmitter",
            Evaluation::BandAtReceiver => "band-at-receiver",
            Evaluation::Supply => "supply",
            Evaluation::TerminalVolts => "terminal-volts",
            Evaluation::Leakage => "leakage",
            Evaluation::LeakageFromResistor => "leakage-from-resistor",
            Evaluation::DisplayMismatch => "display-mismatch",
            Evaluation::TransmitterMismatch => "transmitter-mismatch",
            Evaluation::IndicatorVsControl => "indicator-vs-control",
            Evaluation::HartWindow => "hart-window",
            Evaluation::ShieldNoise => "shield-noise",
            Evaluation::CurrentSwing => "current-swing",
        }
    }

    /// Look a name up.
    pub fn from_key(key: &str) -> Option<Evaluation> {
        ALL.into_iter().find(|e| e.key() == key.trim())
    }

    /// Measurements that must be known before it runs.
    pub fn inputs(self) -> &'static [Measurement] {
        use Measurement::*;
        match self {
            Evaluation::BandAtTransmitter => &[TxMa],
            Evaluation::BandAtReceiver => &[RxMa],
            Evaluation::Supply => &[SupplyV],
            Evaluation::TerminalVolts => &[TerminalV],
            Evaluation::Leakage => &[TxMa, RxMa],
            Evaluation::LeakageFromResistor => &[TxMa, ResistorV, ResistorOhms],
            Evaluation::DisplayMismatch => &[TxMa, Displayed],
            Evaluation::TransmitterMismatch => &[TxMa, ProcessValue],
            Evaluation::IndicatorVsControl => &[TxMa, Displayed, ControlValue],
            Evaluation::HartWindow => &[LoopOhms],
            Evaluation::ShieldNoise => &[ShieldAcV],
            Evaluation::CurrentSwing => &[SwingMa],
        }
    }

    /// Measurements used when known (they sharpen the numbers).
    pub fn optional_inputs(self) -> &'static [Measurement] {
        use Measurement::*;
        match self {
            Evaluation::TerminalVolts => &[TxMa, SupplyV],
            Evaluation::Leakage | Evaluation::LeakageFromResistor => &[TerminalV],
            _ => &[],
        }
    }

    /// The outcomes it can give: a procedure step must branch on each (or `otherwise`).
    pub fn outcomes(self) -> &'static [&'static str] {
        match self {
            Evaluation::BandAtTransmitter | Evaluation::BandAtReceiver => &BAND_OUTCOMES,
            Evaluation::Supply => &["no-supply", "low", "ok"],
            Evaluation::TerminalVolts => &["none", "not-enough", "short-at-top", "enough"],
            Evaluation::Leakage | Evaluation::LeakageFromResistor => {
                &["match", "across-pair", "to-earth"]
            }
            Evaluation::DisplayMismatch | Evaluation::TransmitterMismatch => {
                &["agrees", "explained", "unexplained"]
            }
            Evaluation::IndicatorVsControl => &[
                "both-agree",
                "indicator-wrong",
                "control-wrong",
                "both-wrong",
            ],
            Evaluation::HartWindow => &["too-low", "in-window", "too-high", "open"],
            Evaluation::ShieldNoise => &["quiet", "noisy"],
            Evaluation::CurrentSwing => &["steady", "swinging"],
        }
    }

    /// Run it on the measurements known so far.
    pub fn evaluate(
        self,
        tag: &Tag,
        values: &BTreeMap<Measurement, f64>,
        settings: &Settings,
    ) -> Result<Evaluated> {
        let get = |m: Measurement| {
            values.get(&m).copied().ok_or_else(|| {
                FieldError::new(
                    m.key(),
                    format!(
                        "{} is needed for {}; measure it first",
                        m.label(),
                        self.key()
                    ),
                )
            })
        };
        match self {
            Evaluation::BandAtTransmitter | Evaluation::BandAtReceiver => {
                let (m, at) = if self == Evaluation::BandAtTransmitter {
                    (Measurement::TxMa, "transmitter")
                } else {
                    (Measurement::RxMa, "receiver")
                };
                let f = signal_band(tag, get(m)?, at)?;
                Ok(Evaluated {
                    outcome: f.status.as_str(),
                    findings: vec![Finding::new(
                        &format!("band-{}", f.status.as_str()),
                        f.text.clone(),
                        &f,
                    )],
                })
            }
            Evaluation::Supply => {
                let f = supply(tag, get(Measurement::SupplyV)?)?;
                Ok(Evaluated {
                    outcome: f.outcome,
                    findings: vec![Finding::new(
                        &format!("supply-{}", f.outcome),
                        f.text.clone(),
                        &f,
                    )],
                })
            }
            Evaluation::TerminalVolts => {
                let f = terminal_volts(
                    tag,
                    get(Measurement::TerminalV)?,
                    values.get(&Measurement::TxMa).copied(),
                    values.get(&Measurement::SupplyV).copied(),
                )?;
                let code = match f.outcome {
                    "enough" => "enough-voltage",
                    "short-at-top" => "short-at-top",
                    "none" => "no-voltage-at-transmitter",
                    _ => "not-enough-voltage",
                };
                Ok(Evaluated {
                    outcome: f.outcome,
                    findings: vec![Finding::new(code, f.text.clone(), &f)],
                })
            }
            Evaluation::Leakage | Evaluation::LeakageFromResistor => {
                let rx = if self == Evaluation::Leakage {
                    get(Measurement::RxMa)?
                } else {
                    get(Measurement::ResistorV)? / get(Measurement::ResistorOhms)? * 1000.0
                };
                let f = leakage(
                    tag,
                    get(Measurement::TxMa)?,
                    rx,
                    settings.meter_tolerance_ma,
                    values.get(&Measurement::TerminalV).copied(),
                )?;
                Ok(Evaluated {
                    outcome: f.outcome,
                    findings: vec![Finding::new(
                        match f.outcome {
                            "across-pair" => "leak-across-pair",
                            "to-earth" => "leak-to-earth",
                            _ => "currents-match",
                        },
                        f.text.clone(),
                        &f,
                    )],
                })
            }
            Evaluation::DisplayMismatch => {
                let m = mismatch::explain_display(
                    &tag.scale,
                    get(Measurement::TxMa)?,
                    get(Measurement::Displayed)?,
                    settings.fit_tolerance_pct(tag),
                    &readings::input_resistors(tag),
                )?;
                Ok(readings::mismatch_evaluated(&m, "receiver"))
            }
            Evaluation::TransmitterMismatch => {
                let m = mismatch::explain_transmitter(
                    &tag.scale,
                    get(Measurement::ProcessValue)?,
                    get(Measurement::TxMa)?,
                    settings.fit_tolerance_pct(tag),
                )?;
                Ok(readings::mismatch_evaluated(&m, "transmitter"))
            }
            Evaluation::IndicatorVsControl => {
                let tol = settings.fit_tolerance_pct(tag);
                let ma = get(Measurement::TxMa)?;
                let ind = mismatch::explain_display(
                    &tag.scale,
                    ma,
                    get(Measurement::Displayed)?,
                    tol,
                    &readings::input_resistors(tag),
                )?;
                let ctl = mismatch::explain_display(
                    &tag.scale,
                    ma,
                    get(Measurement::ControlValue)?,
                    tol,
                    &readings::input_resistors(tag),
                )?;
                let outcome = match (ind.agrees, ctl.agrees) {
                    (true, true) => "both-agree",
                    (false, true) => "indicator-wrong",
                    (true, false) => "control-wrong",
                    (false, false) => "both-wrong",
                };
                let mut findings = readings::mismatch_evaluated(&ind, "indicator").findings;
                findings.extend(readings::mismatch_evaluated(&ctl, "control system").findings);
                Ok(Evaluated { outcome, findings })
            }
            Evaluation::HartWindow => {
                let f = hart_window(tag, get(Measurement::LoopOhms)?)?;
                Ok(Evaluated {
                    outcome: f.outcome,
                    findings: vec![Finding::new(
                        &format!("hart-{}", f.outcome),
                        f.text.clone(),
                        &f,
                    )],
                })
            }
            Evaluation::ShieldNoise => {
                shield_noise::evaluated(get(Measurement::ShieldAcV)?, settings)
            }
            Evaluation::CurrentSwing => current_swing::evaluated(tag, get(Measurement::SwingMa)?),
        }
    }
}
