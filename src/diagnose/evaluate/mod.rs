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
pub mod current_swing;
pub mod hart;
pub mod leakage;
pub mod output;
pub mod readings;
pub mod shield_noise;
pub mod supply;
pub mod terminal_volts;

pub use band::{signal_band, BandFinding};
pub use current_swing::SwingFinding;
pub use hart::{hart_window, HartFinding};
pub use leakage::{leakage, LeakageFinding};
pub use output::{ComplianceFinding, OutputFinding};
pub use readings::{ExplanationFinding, Reader, ReadingFinding};
pub use shield_noise::ShieldFinding;
pub use supply::{supply, SupplyFinding};
pub use terminal_volts::{terminal_volts, VoltageFinding};

use super::measure::Measurement;
use super::mismatch;
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

/// One finding, ready for the log: a stable code and the typed detail as JSON. Its words
/// are written above the core, from the code and the detail, by
/// [`crate::view::wording::finding`].
///
/// Records saved before payload version 3 kept the words too (`text`): where the code and
/// detail cannot be worded today they are read into [`Self::saved_text`] and shown (and
/// saved again with the finding); elsewhere they are dropped on reading, the finding being
/// worded afresh. A finding saved
/// under an old leakage code is read with today's code (see [`OLD_LEAKAGE_CODES`]), the
/// old one kept in [`Self::saved_code`].
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(from = "StoredFinding")]
pub struct Finding {
    /// The step that produced it (filled in by the session).
    #[serde(default)]
    pub step: String,
    /// Stable machine name, e.g. `not-enough-voltage`.
    pub code: String,
    /// The computed values (a [`Detail`] as JSON; see [`Finding::typed`]).
    pub detail: serde_json::Value,
    /// The words a record saved before payload version 3 kept, where its code and detail
    /// cannot be worded today (or it is an old leakage record); `None` for a finding made
    /// today.
    #[serde(rename = "text", default, skip_serializing_if = "Option::is_none")]
    pub saved_text: Option<String>,
    /// The code the record was saved under, when it is read under today's (an old
    /// leakage code, [`OLD_LEAKAGE_CODES`]).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub saved_code: Option<String>,
}

/// A finding as stored, before old leakage codes are mapped.
#[derive(Deserialize)]
struct StoredFinding {
    #[serde(default)]
    step: String,
    code: String,
    #[serde(default)]
    text: Option<String>,
    detail: serde_json::Value,
    #[serde(default)]
    saved_code: Option<String>,
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

/// The detail key an old `leakage` record's path resistance is moved to when it is read
/// (kΩ): it was worked out as if the path were across the pair, which a receiver reading
/// less does not show, so it is no longer the finding's `leak_path_kohm`.
pub const OLD_LEAK_PATH_KEY: &str = "old_leak_path_kohm";

/// Today's id for an outcome saved under an old leakage id; any other id as it is.
pub fn current_outcome_id(outcome: &str) -> &str {
    OLD_LEAKAGE_OUTCOMES
        .iter()
        .find(|(old, _)| *old == outcome)
        .map_or(outcome, |(_, new)| new)
}

impl From<StoredFinding> for Finding {
    /// Reads an old leakage finding under today's code, keeping the old code. The recorded
    /// measurements and text stay as they were (the text is what the technician was
    /// shown). An old `leakage` record's path resistance was worked out as if the path
    /// were across the pair, which a receiver reading less does not show, so it is moved
    /// out of `leak_path_kohm` to [`OLD_LEAK_PATH_KEY`].
    fn from(stored: StoredFinding) -> Finding {
        let StoredFinding {
            step,
            code,
            text,
            mut detail,
            saved_code,
        } = stored;
        let Some((old, new_code)) = OLD_LEAKAGE_CODES.iter().find(|(old, _)| *old == code) else {
            // Words are kept only where the code and detail cannot give them today (or
            // where they are what an old leakage record showed).
            let saved_text = match (&saved_code, Detail::read(&code, &detail)) {
                (None, Some(_)) => None,
                _ => text,
            };
            return Finding {
                step,
                code,
                detail,
                saved_text,
                saved_code,
            };
        };
        if let Some(obj) = detail.as_object_mut() {
            if let Some(o) = obj.get("outcome").and_then(|o| o.as_str()) {
                let mapped = current_outcome_id(o).to_string();
                obj.insert("outcome".to_string(), serde_json::Value::String(mapped));
            }
            if *new_code == "leak-to-earth" {
                if let Some(k) = obj.get_mut("leak_path_kohm").map(serde_json::Value::take) {
                    if !k.is_null() {
                        obj.insert(OLD_LEAK_PATH_KEY.to_string(), k);
                    }
                }
            }
        }
        Finding {
            step,
            code: new_code.to_string(),
            detail,
            saved_text: text,
            saved_code: Some(old.to_string()),
        }
    }
}

/// A finding's detail, typed: one variant per evaluation's result.
#[derive(Debug, Clone, PartialEq)]
pub enum Detail {
    /// `band-…`: the NE 43 band of a current.
    Band(BandFinding),
    /// `supply-…`: the supply voltage.
    Supply(SupplyFinding),
    /// `enough-voltage`, `not-enough-voltage`, `short-at-top`,
    /// `no-voltage-at-transmitter`: the transmitter's terminal volts.
    TerminalVolts(VoltageFinding),
    /// `currents-match`, `leak-across-pair`, `leak-to-earth`.
    Leakage(LeakageFinding),
    /// `reading-agrees`, `reading-disagrees`: a reading against the loop.
    Reading(ReadingFinding),
    /// A hypothesis's code (`reversed`, `different-range` …): one explanation of a
    /// reading that disagrees.
    Explanation(ExplanationFinding),
    /// `hart-…`: the loop resistance against the HART window.
    Hart(HartFinding),
    /// `shield-noise`, `shield-quiet`.
    ShieldNoise(ShieldFinding),
    /// `current-swinging`, `current-steady`.
    CurrentSwing(SwingFinding),
    /// `output-…`: the current at an output's field device against the demand.
    Output(OutputFinding),
    /// `source-dead`, `source-has-headroom`, `source-at-compliance`,
    /// `source-compliance-not-recorded`: a current source's output voltage against its compliance.
    Compliance(ComplianceFinding),
}

/// The codes of the explanations of a reading (the hypotheses' codes).
const EXPLANATION_CODES: [&str; 7] = [
    "units-mixed-up",
    "extra-square-root",
    "missing-square-root",
    "reversed",
    "input-resistor",
    "table-not-applied",
    "different-range",
];

impl Detail {
    /// The stable code of a finding with this detail.
    pub fn code(&self) -> String {
        match self {
            Detail::Band(f) => format!("band-{}", f.status.as_str()),
            Detail::Supply(f) => format!("supply-{}", f.outcome),
            Detail::TerminalVolts(f) => match f.outcome.as_str() {
                "enough" => "enough-voltage",
                "short-at-top" => "short-at-top",
                "none" => "no-voltage-at-transmitter",
                _ => "not-enough-voltage",
            }
            .to_string(),
            Detail::Leakage(f) => match f.outcome.as_str() {
                "across-pair" => "leak-across-pair",
                "to-earth" => "leak-to-earth",
                _ => "currents-match",
            }
            .to_string(),
            Detail::Reading(f) => if f.mismatch.reading.agrees {
                "reading-agrees"
            } else {
                "reading-disagrees"
            }
            .to_string(),
            Detail::Explanation(f) => f.explanation.hypothesis.code().to_string(),
            Detail::Hart(f) => format!("hart-{}", f.outcome),
            Detail::ShieldNoise(f) => if f.outcome == "noisy" {
                "shield-noise"
            } else {
                "shield-quiet"
            }
            .to_string(),
            Detail::CurrentSwing(f) => if f.outcome == "swinging" {
                "current-swinging"
            } else {
                "current-steady"
            }
            .to_string(),
            Detail::Output(f) => format!("output-{}", f.outcome),
            Detail::Compliance(f) => match f.outcome.strip_prefix("source-") {
                Some(_) => f.outcome.clone(),
                None => format!("source-{}", f.outcome),
            },
        }
    }

    /// Read the detail of a finding coded `code`; `None` when the code is not one loopside
    /// makes today or the detail lacks what its words need (a record from an older
    /// loopside).
    pub fn read(code: &str, detail: &serde_json::Value) -> Option<Detail> {
        fn take<T: serde::de::DeserializeOwned>(v: &serde_json::Value) -> Option<T> {
            serde_json::from_value(v.clone()).ok()
        }
        let typed = if code.starts_with("band-") {
            Detail::Band(take(detail)?)
        } else if code.starts_with("supply-") {
            Detail::Supply(take(detail)?)
        } else if code.starts_with("hart-") {
            Detail::Hart(take(detail)?)
        } else if code.starts_with("output-") {
            Detail::Output(take(detail)?)
        } else if code.starts_with("source-") {
            Detail::Compliance(take(detail)?)
        } else {
            match code {
                "enough-voltage"
                | "not-enough-voltage"
                | "short-at-top"
                | "no-voltage-at-transmitter" => Detail::TerminalVolts(take(detail)?),
                "currents-match" | "leak-across-pair" | "leak-to-earth" => {
                    Detail::Leakage(take(detail)?)
                }
                "reading-agrees" | "reading-disagrees" => Detail::Reading(take(detail)?),
                "shield-noise" | "shield-quiet" => Detail::ShieldNoise(take(detail)?),
                "current-swinging" | "current-steady" => Detail::CurrentSwing(take(detail)?),
                c if EXPLANATION_CODES.contains(&c) => Detail::Explanation(take(detail)?),
                _ => return None,
            }
        };
        // The detail must be the one its code names (a band finding's status, a
        // terminal-volts outcome …), else its words would say something else.
        (typed.code() == code).then_some(typed)
    }

    fn to_json(&self) -> serde_json::Value {
        let value = match self {
            Detail::Band(f) => serde_json::to_value(f),
            Detail::Supply(f) => serde_json::to_value(f),
            Detail::TerminalVolts(f) => serde_json::to_value(f),
            Detail::Leakage(f) => serde_json::to_value(f),
            Detail::Reading(f) => serde_json::to_value(f),
            Detail::Explanation(f) => serde_json::to_value(f),
            Detail::Hart(f) => serde_json::to_value(f),
            Detail::ShieldNoise(f) => serde_json::to_value(f),
            Detail::CurrentSwing(f) => serde_json::to_value(f),
            Detail::Output(f) => serde_json::to_value(f),
            Detail::Compliance(f) => serde_json::to_value(f),
        };
        value.unwrap_or(serde_json::Value::Null)
    }
}

impl Finding {
    /// A finding made today: its code from its detail, no stored words.
    pub fn new(detail: Detail) -> Finding {
        Finding {
            step: String::new(),
            code: detail.code(),
            detail: detail.to_json(),
            saved_text: None,
            saved_code: None,
        }
    }

    /// The detail, typed by the code (see [`Detail::read`]).
    pub fn typed(&self) -> Option<Detail> {
        Detail::read(&self.code, &self.detail)
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
    /// Current at an output's field device against the control system's demand.
    OutputFollowsDemand,
    /// Voltage across a current source's output against its compliance.
    SourceCompliance,
}

/// Every evaluation.
pub const ALL: [Evaluation; 14] = [
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
    Evaluation::OutputFollowsDemand,
    Evaluation::SourceCompliance,
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
            Evaluation::OutputFollowsDemand => "output-follows-demand",
            Evaluation::SourceCompliance => "source-compliance",
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
            Evaluation::OutputFollowsDemand => &[DemandPct, DeviceMa],
            Evaluation::SourceCompliance => &[SourceV],
        }
    }

    /// Measurements used when known (they sharpen the numbers).
    pub fn optional_inputs(self) -> &'static [Measurement] {
        use Measurement::*;
        match self {
            Evaluation::TerminalVolts => &[TxMa, SupplyV],
            Evaluation::Leakage | Evaluation::LeakageFromResistor => &[TerminalV],
            Evaluation::SourceCompliance => &[DeviceMa],
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
            Evaluation::OutputFollowsDemand => &[
                "no-current-at-device",
                "follows-demand",
                "below-demand",
                "above-demand",
            ],
            Evaluation::SourceCompliance => &[
                "source-dead",
                "source-has-headroom",
                "source-at-compliance",
                "compliance-not-recorded",
            ],
        }
    }

    /// The outcome named `name` as this evaluation lists it (a name it does not list
    /// reads as `otherwise`, which no evaluation gives).
    fn outcome(self, name: &str) -> &'static str {
        self.outcomes()
            .iter()
            .find(|o| **o == name)
            .copied()
            .unwrap_or("otherwise")
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
                    findings: vec![Finding::new(Detail::Band(f))],
                })
            }
            Evaluation::Supply => {
                let f = supply(tag, get(Measurement::SupplyV)?)?;
                Ok(Evaluated {
                    outcome: self.outcome(&f.outcome),
                    findings: vec![Finding::new(Detail::Supply(f))],
                })
            }
            Evaluation::TerminalVolts => {
                let f = terminal_volts(
                    tag,
                    get(Measurement::TerminalV)?,
                    values.get(&Measurement::TxMa).copied(),
                    values.get(&Measurement::SupplyV).copied(),
                )?;
                Ok(Evaluated {
                    outcome: self.outcome(&f.outcome),
                    findings: vec![Finding::new(Detail::TerminalVolts(f))],
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
                    outcome: self.outcome(&f.outcome),
                    findings: vec![Finding::new(Detail::Leakage(f))],
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
                Ok(readings::mismatch_evaluated(&m, Reader::Receiver))
            }
            Evaluation::TransmitterMismatch => {
                let m = mismatch::explain_transmitter(
                    &tag.scale,
                    get(Measurement::ProcessValue)?,
                    get(Measurement::TxMa)?,
                    settings.fit_tolerance_pct(tag),
                )?;
                Ok(readings::mismatch_evaluated(&m, Reader::Transmitter))
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
                let outcome = match (ind.reading.agrees, ctl.reading.agrees) {
                    (true, true) => "both-agree",
                    (false, true) => "indicator-wrong",
                    (true, false) => "control-wrong",
                    (false, false) => "both-wrong",
                };
                let mut findings = readings::mismatch_evaluated(&ind, Reader::Indicator).findings;
                findings.extend(readings::mismatch_evaluated(&ctl, Reader::ControlSystem).findings);
                Ok(Evaluated { outcome, findings })
            }
            Evaluation::HartWindow => {
                let f = hart_window(tag, get(Measurement::LoopOhms)?)?;
                Ok(Evaluated {
                    outcome: self.outcome(&f.outcome),
                    findings: vec![Finding::new(Detail::Hart(f))],
                })
            }
            Evaluation::ShieldNoise => {
                shield_noise::evaluated(get(Measurement::ShieldAcV)?, settings)
            }
            Evaluation::CurrentSwing => current_swing::evaluated(tag, get(Measurement::SwingMa)?),
            Evaluation::OutputFollowsDemand => output::follows_demand(
                tag,
                get(Measurement::DemandPct)?,
                get(Measurement::DeviceMa)?,
                settings.fit_tolerance_pct(tag),
            ),
            Evaluation::SourceCompliance => {
                let f = output::compliance(
                    tag,
                    get(Measurement::SourceV)?,
                    values.get(&Measurement::DeviceMa).copied(),
                )?;
                Ok(Evaluated {
                    outcome: self.outcome(&f.outcome),
                    findings: vec![Finding::new(Detail::Compliance(f))],
                })
            }
        }
    }
}
