//! The typed evaluations a fault-finding step can run on its measurements.
//!
//! A procedure file names an evaluation (`terminal-volts`, `leakage` …); here each one
//! declares the measurements it needs, the outcomes it can give (the branch names a
//! procedure must cover), and computes its findings with the core's own arithmetic:
//! [`crate::signal`] for NE 43 bands, [`crate::budget`] for the loop's voltage, the tag's
//! [`crate::scale::Scale`] and [`super::mismatch`] for readings that disagree.

use super::measure::Measurement;
use super::mismatch::{self, Mismatch};
use crate::budget::{Budget, ElementKind, LoopConfig, PartRole, HART_MAX_OHMS, HART_MIN_OHMS};
use crate::display;
use crate::error::{FieldError, Result};
use crate::signal::{classify, SignalStatus};
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
                    &input_resistors(tag),
                )?;
                Ok(mismatch_evaluated(&m, "receiver"))
            }
            Evaluation::TransmitterMismatch => {
                let m = mismatch::explain_transmitter(
                    &tag.scale,
                    get(Measurement::ProcessValue)?,
                    get(Measurement::TxMa)?,
                    settings.fit_tolerance_pct(tag),
                )?;
                Ok(mismatch_evaluated(&m, "transmitter"))
            }
            Evaluation::IndicatorVsControl => {
                let tol = settings.fit_tolerance_pct(tag);
                let ma = get(Measurement::TxMa)?;
                let ind = mismatch::explain_display(
                    &tag.scale,
                    ma,
                    get(Measurement::Displayed)?,
                    tol,
                    &input_resistors(tag),
                )?;
                let ctl = mismatch::explain_display(
                    &tag.scale,
                    ma,
                    get(Measurement::ControlValue)?,
                    tol,
                    &input_resistors(tag),
                )?;
                let outcome = match (ind.agrees, ctl.agrees) {
                    (true, true) => "both-agree",
                    (false, true) => "indicator-wrong",
                    (true, false) => "control-wrong",
                    (false, false) => "both-wrong",
                };
                let mut findings = mismatch_evaluated(&ind, "indicator").findings;
                findings.extend(mismatch_evaluated(&ctl, "control system").findings);
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
                let v = get(Measurement::ShieldAcV)?;
                let noisy = v > settings.shield_ac_limit_v;
                let text = if noisy {
                    format!(
                        "{} AC from shield to earth is above the {} limit. A shield bonded to earth at both ends reads close to 0 V at either end, so this is not a double bond: the shield is not bonded where it was measured (its floating end, or a bond that is broken), and the voltage is a difference in earth potential between the two ends or interference picked up along the cable. Check that the shield is bonded at one end (usually the receiver end) with a sound connection, continuous through every junction box and touching earth nowhere else, and keep the pair away from power cables and drive outputs.",
                        display::volts(v),
                        display::volts(settings.shield_ac_limit_v)
                    )
                } else {
                    format!(
                        "{} AC from shield to earth is within the {} limit: no sign of interference picked up on the shield. A shield bonded at both ends also reads close to 0 V, so this does not rule out a ground loop: to find one, clamp an AC current meter on the shield, or lift one end of it and see whether the noise changes.",
                        display::volts(v),
                        display::volts(settings.shield_ac_limit_v)
                    )
                };
                let outcome = if noisy { "noisy" } else { "quiet" };
                Ok(Evaluated {
                    outcome,
                    findings: vec![Finding::new(
                        if noisy {
                            "shield-noise"
                        } else {
                            "shield-quiet"
                        },
                        text,
                        serde_json::json!({
                            "shield_ac_v": v,
                            "limit_v": settings.shield_ac_limit_v,
                            "outcome": outcome,
                        }),
                    )],
                })
            }
            Evaluation::CurrentSwing => {
                let swing = get(Measurement::SwingMa)?;
                let pct = swing / tag.scale.signal.width_ma() * 100.0;
                let swinging = pct > tag.tolerance_percent;
                let text = if swinging {
                    format!(
                        "The loop current swings {} ({} of span), more than the tag's ±{} tolerance: the signal itself is unsteady at the transmitter — the process, the sensor, a loose connection, or damping set too low.",
                        display::ma(swing),
                        display::percent(pct),
                        display::percent(tag.tolerance_percent)
                    )
                } else {
                    format!(
                        "The loop current is steady (swing {} = {} of span): the jumping is added after the transmitter, at the receiver or its input.",
                        display::ma(swing),
                        display::percent(pct)
                    )
                };
                let outcome = if swinging { "swinging" } else { "steady" };
                Ok(Evaluated {
                    outcome,
                    findings: vec![Finding::new(
                        if swinging {
                            "current-swinging"
                        } else {
                            "current-steady"
                        },
                        text,
                        serde_json::json!({
                            "swing_ma": swing,
                            "swing_pct": pct,
                            "tolerance_pct": tag.tolerance_percent,
                            "outcome": outcome,
                        }),
                    )],
                })
            }
        }
    }
}

fn mismatch_evaluated(m: &Mismatch, who: &str) -> Evaluated {
    let outcome = if m.agrees {
        "agrees"
    } else if m.explained() {
        "explained"
    } else {
        "unexplained"
    };
    let unit_value = |v: f64| {
        if m.unit == "mA" {
            display::ma(v)
        } else {
            format!("{} {}", display::fixed(v, 4), m.unit)
        }
    };
    let head = if m.agrees {
        format!(
            "The {who} agrees with the loop: {} observed, {} expected ({} of span apart, within ±{}).",
            unit_value(m.observed),
            unit_value(m.expected),
            display::percent(m.difference_pct),
            display::percent(m.fit_tolerance_pct)
        )
    } else {
        format!(
            "The {who} disagrees: {} observed, {} expected ({} of span apart). {}",
            unit_value(m.observed),
            unit_value(m.expected),
            display::percent(m.difference_pct),
            if m.explanations.is_empty() {
                "No configuration mistake explains it.".to_string()
            } else {
                format!("{} explanation(s) fit:", m.explanations.len())
            }
        )
    };
    let mut findings = vec![Finding::new(
        if m.agrees {
            "reading-agrees"
        } else {
            "reading-disagrees"
        },
        head,
        m,
    )];
    for e in &m.explanations {
        findings.push(Finding::new(e.hypothesis.code(), e.text.clone(), e));
    }
    Evaluated { outcome, findings }
}

/// Resistances in the tag's loop that could be a receiver's input resistor.
fn input_resistors(tag: &Tag) -> Vec<f64> {
    tag.loop_config
        .iter()
        .flat_map(|c| c.elements.iter())
        .filter_map(|e| match e.kind {
            ElementKind::Resistance { ohms } if ohms > 0.0 => Some(ohms),
            _ => None,
        })
        .collect()
}

/// The NE 43 band of a current and what it implies.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct BandFinding {
    /// Where it was measured: `transmitter` or `receiver`.
    pub at: String,
    /// The current, mA.
    pub ma: f64,
    /// Its band.
    pub status: SignalStatus,
    /// % of span.
    pub percent: f64,
    /// What it means.
    pub text: String,
}

/// Classify a current by the tag's bands (NE 43 unless the tag says otherwise).
pub fn signal_band(tag: &Tag, ma: f64, at: &str) -> Result<BandFinding> {
    let status = classify(ma, &tag.bands, &tag.scale.signal)?;
    let implication = match status {
        SignalStatus::NoLoopCurrent => " Follow the loop from the supply: is there supply voltage, and does it reach the transmitter terminals?",
        SignalStatus::FailLow => " Read the transmitter's diagnostics (display or HART) for the fault it reports, and check its terminal voltage.",
        SignalStatus::SuspectLow | SignalStatus::SuspectHigh => " Compare with the failure levels set in the transmitter.",
        SignalStatus::UnderRange | SignalStatus::OverRange => " The loop itself is working; look at the process and the transmitter's zero and span.",
        SignalStatus::InRange => " The loop carries a valid measurement.",
        SignalStatus::FailHigh => " Read the transmitter's diagnostics for the fault it reports; a sensor break with upscale burnout is the usual cause.",
    };
    Ok(BandFinding {
        at: at.to_string(),
        ma,
        status,
        percent: tag.scale.signal.percent_of(ma),
        text: format!(
            "{} at the {at} ({} of span): {} — {}{}",
            display::ma(ma),
            display::percent(tag.scale.signal.percent_of(ma)),
            status.as_str(),
            status.meaning(),
            implication
        ),
    })
}

/// The supply voltage judged against the tag's loop.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct SupplyFinding {
    /// Measured, V.
    pub measured_v: f64,
    /// The tag's nominal supply, V.
    pub nominal_v: Option<f64>,
    /// Lowest the supply should sag to (nominal less tolerance), V.
    pub lowest_expected_v: Option<f64>,
    /// Supply the loop needs at its fault current, V.
    pub needed_v: Option<f64>,
    /// `no-supply`, `low` or `ok`.
    pub outcome: &'static str,
    /// In words.
    pub text: String,
}

/// Is there supply voltage, and enough for the loop?
pub fn supply(tag: &Tag, measured_v: f64) -> Result<SupplyFinding> {
    let v = Measurement::SupplyV.accept(measured_v)?;
    let budget = tag
        .loop_config
        .as_ref()
        .map(LoopConfig::budget)
        .transpose()?;
    let nominal_v = tag.loop_config.as_ref().map(|c| c.supply_volts);
    let lowest_expected_v = budget.as_ref().map(|b| b.lowest_supply_volts);
    let needed_v = budget.as_ref().map(|b| b.min_supply_fault_volts);
    let (outcome, text) = if v < NO_VOLTS_BELOW {
        ("no-supply", format!(
            "No supply voltage ({}): check the supply's output, its fuse or breaker, and the wiring from the supply to the loop.",
            display::volts(v)
        ))
    } else {
        match (lowest_expected_v, needed_v) {
            (Some(lowest), Some(needed)) if v < lowest - 0.005 || v < needed - 0.005 => (
                "low",
                format!(
                    "The supply reads {}, below {} (the lowest it should sag to: {}; the loop needs {} at its fault current). Check the supply under load, its setting, and shared loads.",
                    display::volts(v),
                    display::volts(lowest.max(needed)),
                    display::volts(lowest),
                    display::volts(needed)
                ),
            ),
            (Some(lowest), Some(needed)) => (
                "ok",
                format!(
                    "The supply reads {}: at or above the {} it should hold and the {} the loop needs.",
                    display::volts(v),
                    display::volts(lowest),
                    display::volts(needed)
                ),
            ),
            _ => (
                "ok",
                format!(
                    "The supply reads {}; the tag has no loop configuration to judge it against, so only its presence is confirmed.",
                    display::volts(v)
                ),
            ),
        }
    };
    Ok(SupplyFinding {
        measured_v: v,
        nominal_v,
        lowest_expected_v,
        needed_v,
        outcome,
        text,
    })
}

/// Terminal volts judged against the transmitter minimum, with what to change.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct VoltageFinding {
    /// Measured at the transmitter terminals, V.
    pub terminal_v: f64,
    /// The transmitter's minimum, V.
    pub min_v: f64,
    /// terminal − minimum, V (negative = short).
    pub headroom_v: f64,
    /// The loop current the terminal volts were measured at, mA, if known.
    pub current_ma: Option<f64>,
    /// Supply used in the sums, V (measured, else the tag's lowest supply).
    pub supply_v: f64,
    /// Fixed drops in the loop (indicators, isolators), V.
    pub fixed_drops_v: f64,
    /// Loop resistance worked out from the measurements, Ω.
    pub loop_ohms_measured: Option<f64>,
    /// Loop resistance from the tag's configuration, Ω.
    pub loop_ohms_configured: f64,
    /// Measured minus configured, Ω, when the difference is more than a rule-of-thumb
    /// allowance.
    pub extra_ohms: Option<f64>,
    /// The current the loop must reach: the fault current (or more if measured higher), mA.
    pub target_ma: f64,
    /// Terminal volts projected at that current, V.
    pub terminal_at_target_v: f64,
    /// Ohms to take out of the loop so the transmitter keeps its minimum at the target
    /// current (None when nothing needs removing).
    pub remove_ohms: Option<f64>,
    /// How far to raise the supply so it does (None when enough already), V.
    pub raise_supply_by_v: Option<f64>,
    /// The supply to raise to, when the supply was measured, V.
    pub raise_supply_to_v: Option<f64>,
    /// The largest element of the budget at the target current, with its volts.
    pub largest_element: Option<(String, f64)>,
    /// `none`, `not-enough`, `short-at-top` or `enough`.
    pub outcome: &'static str,
    /// In words.
    pub text: String,
}

/// Terminal volts against the transmitter minimum, worked with the tag's loop budget.
pub fn terminal_volts(
    tag: &Tag,
    terminal_v: f64,
    tx_ma: Option<f64>,
    supply_v: Option<f64>,
) -> Result<VoltageFinding> {
    let terminal = Measurement::TerminalV.accept(terminal_v)?;
    let config = tag.loop_config.as_ref().ok_or_else(|| {
        FieldError::new(
            "loop",
            format!(
                "tag {} has no loop configuration (supply and transmitter minimum volts); add it before judging terminal volts",
                tag.number
            ),
        )
    })?;
    let budget: Budget = config.budget()?;
    // Only a current a working transmitter draws is used to work out resistance.
    let current = match tx_ma {
        Some(i) => Some(Measurement::TxMa.accept(i)?).filter(|i| *i >= 3.5),
        None => None,
    };
    let supply = match supply_v {
        Some(s) => Measurement::SupplyV.accept(s)?,
        None => budget.lowest_supply_volts,
    };
    let drops = budget.fixed_drop_volts;
    let min = config.tx_min_volts;
    let measured_ohms = match (supply_v, current) {
        (Some(_), Some(i)) => Some(((supply - terminal - drops) / (i / 1000.0)).max(0.0)),
        _ => None,
    };
    let r = measured_ohms.unwrap_or(budget.loop_ohms);
    let extra_ohms = measured_ohms.and_then(|m| {
        let extra = m - budget.loop_ohms;
        (extra > EXTRA_OHMS_FRACTION * budget.loop_ohms + EXTRA_OHMS_FLOOR).then_some(extra)
    });
    let target = config
        .fault_current_ma()
        .max(20.0)
        .max(current.unwrap_or(0.0));
    // Project from the measured point: every extra mA costs R volts per ampere.
    let terminal_at_target = terminal - r * (target - current.unwrap_or(0.0)) / 1000.0;
    let deficit = min - terminal_at_target;
    let short_at_target = deficit > 1e-9;
    let remove_ohms = short_at_target.then(|| deficit / (target / 1000.0));
    let raise_supply_by_v = short_at_target.then_some(deficit);
    let raise_supply_to_v = match supply_v {
        Some(_) if short_at_target => Some(supply + deficit),
        _ => None,
    };
    let largest_element = budget
        .at_fault
        .parts
        .iter()
        .map(|p| {
            let volts = match p.role {
                PartRole::Drop => p.volts,
                // I·R parts scale with the current.
                _ => p.volts * target / budget.at_fault.current_ma.max(1e-9),
            };
            (p.name.clone(), volts)
        })
        .max_by(|a, b| a.1.total_cmp(&b.1));
    let outcome = if terminal < NO_VOLTS_BELOW {
        "none"
    } else if terminal < min - 1e-9 {
        "not-enough"
    } else if short_at_target {
        "short-at-top"
    } else {
        "enough"
    };
    let at = match current {
        Some(i) => format!(" at {}", display::ma(i)),
        None => String::new(),
    };
    let mut text = match outcome {
        "none" => format!(
            "Only {} reaches the transmitter terminals: the loop is open between the supply and the transmitter, or the supply is off. Measure the supply, then follow the pair through each junction box.",
            display::volts(terminal)
        ),
        "not-enough" => format!(
            "Not enough voltage: the transmitter gets {}{at}, below its {} minimum (short by {}). It cannot drive the loop current it wants.",
            display::volts(terminal),
            display::volts(min),
            display::volts(min - terminal)
        ),
        "short-at-top" => format!(
            "Enough voltage now ({}{at}, minimum {}), but at {} the transmitter would get only {}: readings near the top clip and the upscale fault signal cannot be reached.",
            display::volts(terminal),
            display::volts(min),
            display::ma(target),
            display::volts(terminal_at_target)
        ),
        _ => format!(
            "Enough voltage: the transmitter gets {}{at} against its {} minimum, and still {} at {}.",
            display::volts(terminal),
            display::volts(min),
            display::volts(terminal_at_target),
            display::ma(target)
        ),
    };
    if let Some(m) = measured_ohms {
        text.push_str(&format!(
            " From the measurements the loop holds {} against {} on the tag's configuration.",
            display::ohms(m),
            display::ohms(budget.loop_ohms)
        ));
    }
    if let Some(extra) = extra_ohms {
        text.push_str(&format!(
            " The extra {} is not on the drawing: look for a corroded or loose terminal, a wrong resistor, or a device added to the loop.",
            display::ohms(extra)
        ));
    }
    if outcome == "not-enough" || outcome == "short-at-top" {
        let mut fixes = Vec::new();
        if let Some(ohms) = remove_ohms {
            let largest = match &largest_element {
                Some((name, volts)) => format!(
                    " (the largest part of the budget is {name}, {} at {})",
                    display::volts(*volts),
                    display::ma(target)
                ),
                None => String::new(),
            };
            fixes.push(format!(
                "remove {} from the loop{largest}",
                display::ohms(ohms)
            ));
        }
        match (raise_supply_to_v, raise_supply_by_v) {
            (Some(to), _) => fixes.push(format!(
                "raise the supply to at least {} (now {}, +{})",
                display::volts(to),
                display::volts(supply),
                display::volts(to - supply)
            )),
            (None, Some(by)) => fixes.push(format!(
                "raise the supply by at least {}",
                display::volts(by)
            )),
            _ => {}
        }
        if !fixes.is_empty() {
            text.push_str(&format!(
                " To keep {} at the transmitter up to {}: {}.",
                display::volts(min),
                display::ma(target),
                fixes.join(", or ")
            ));
        }
    }
    Ok(VoltageFinding {
        terminal_v: terminal,
        min_v: min,
        headroom_v: terminal - min,
        current_ma: current,
        supply_v: supply,
        fixed_drops_v: drops,
        loop_ohms_measured: measured_ohms,
        loop_ohms_configured: budget.loop_ohms,
        extra_ohms,
        target_ma: target,
        terminal_at_target_v: terminal_at_target,
        remove_ohms,
        raise_supply_by_v,
        raise_supply_to_v,
        largest_element,
        outcome,
        text,
    })
}

/// The loop the leakage evaluation assumes, in words: its findings hold for this case
/// only.
pub const LEAKAGE_ASSUMED_LOOP: &str = "Assumed loop: a loop-powered two-wire transmitter, the supply's negative earthed, the receiver in the return (negative) leg.";

/// Transmitter current against receiver current, and where the difference goes.
///
/// The physics, for the loop in [`LEAKAGE_ASSUMED_LOOP`]:
/// - a path **across the pair** between the transmitter and the receiver (moisture in a
///   junction box, a surge protector, a device or damaged insulation between the two
///   conductors) is in parallel with the transmitter: the receiver carries the
///   transmitter's current *plus* the path's, so it reads **more**. The path sees about the
///   transmitter's terminal volts, so its resistance is roughly
///   `R ≈ V_terminal / (I_rx − I_tx)` (V / mA = kΩ);
/// - a path **to earth** from the return conductor between the transmitter and the
///   receiver lets part of the current go back to the earthed supply negative without
///   passing the receiver, which reads **less**. A device fed from the loop that returns
///   its current by another path does the same. Its resistance needs the voltage from that
///   conductor to earth at the fault, which no built-in procedure measures, so it is not
///   worked out.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct LeakageFinding {
    /// At the transmitter, mA.
    pub tx_ma: f64,
    /// At the receiver, mA.
    pub rx_ma: f64,
    /// tx − rx, mA (positive = the receiver reads less, negative = it reads more).
    pub difference_ma: f64,
    /// The same, % of span.
    pub difference_pct: f64,
    /// The meter allowance used, mA.
    pub meter_tolerance_ma: f64,
    /// Rough resistance of a path across the pair, kΩ: the transmitter's terminal volts
    /// over the extra current (`across-pair` with the terminal volts measured only).
    pub leak_path_kohm: Option<f64>,
    /// The transmitter's terminal volts used for [`Self::leak_path_kohm`], V.
    #[serde(default)]
    pub terminal_v: Option<f64>,
    /// `match`, `across-pair` (receiver reads more) or `to-earth` (receiver reads less).
    pub outcome: &'static str,
    /// In words.
    pub text: String,
}

/// Compare the current leaving the transmitter with the current reaching the receiver, for
/// the loop in [`LEAKAGE_ASSUMED_LOOP`] (see [`LeakageFinding`] for the physics).
pub fn leakage(
    tag: &Tag,
    tx_ma: f64,
    rx_ma: f64,
    meter_tolerance_ma: f64,
    terminal_v: Option<f64>,
) -> Result<LeakageFinding> {
    let tx = Measurement::TxMa.accept(tx_ma)?;
    let rx = Measurement::RxMa.accept(rx_ma)?;
    let tol = crate::error::within("meter_tolerance_ma", meter_tolerance_ma, 0.0, 5.0)?;
    let terminal = terminal_v
        .map(|v| Measurement::TerminalV.accept(v))
        .transpose()?;
    let diff = tx - rx;
    let pct = diff / tag.scale.signal.width_ma() * 100.0;
    let outcome = if -diff > tol + 1e-9 {
        "across-pair"
    } else if diff > tol + 1e-9 {
        "to-earth"
    } else {
        "match"
    };
    // Ohm's law across the path: volts / mA = kΩ.
    let leak_path_kohm = match (outcome, terminal) {
        ("across-pair", Some(v)) if v > 0.0 => Some(v / -diff),
        _ => None,
    };
    let tell_apart = "To tell a path across the pair from one to earth: compare the current at the supply's positive output with both (it equals the receiver's with a path across the pair, the transmitter's with a path to earth); measure the DC volts from each conductor to earth along the route against the drawing; lift the shield's earth for a moment and see whether the difference changes (a conductor touching the shield).";
    let mut text = match outcome {
        "across-pair" => format!(
            "The receiver reads more than the transmitter sends: {} at the receiver, {} at the transmitter; {} ({} of span) flows through a path across the pair between them, in parallel with the transmitter — moisture in a junction box or gland, a surge protector, a device or damaged insulation between the two conductors.",
            display::ma(rx),
            display::ma(tx),
            display::ma(-diff),
            display::percent(-pct)
        ),
        "to-earth" => format!(
            "The receiver reads less than the transmitter sends: {} at the transmitter, {} at the receiver; {} ({} of span) leaves the loop between them — to earth from the return conductor (damaged insulation, water, a conductor touching the shield or a tray), or into a device fed from the loop that returns its current another way. The resistance of a path to earth is not worked out: it needs the DC volts from that conductor to earth at the fault, which is not measured here.",
            display::ma(tx),
            display::ma(rx),
            display::ma(diff),
            display::percent(pct)
        ),
        _ => format!(
            "The currents agree: {} at the transmitter, {} at the receiver (within ±{}): no leakage between them.",
            display::ma(tx),
            display::ma(rx),
            display::ma(tol)
        ),
    };
    match (outcome, leak_path_kohm) {
        (_, Some(k)) => text.push_str(&format!(
            " With {} across the transmitter's terminals that is a path of roughly {} kΩ ({} ÷ {}; a path nearer the receiver sees a little more voltage).",
            display::volts(terminal.unwrap_or(0.0)),
            display::fixed(k, 1),
            display::volts(terminal.unwrap_or(0.0)),
            display::ma(-diff)
        )),
        ("across-pair", None) => text.push_str(
            " Measure the DC volts across the transmitter's terminals to work out the rough resistance of the path.",
        ),
        _ => {}
    }
    if outcome != "match" {
        text.push(' ');
        text.push_str(tell_apart);
        text.push(' ');
        text.push_str(LEAKAGE_ASSUMED_LOOP);
    }
    Ok(LeakageFinding {
        tx_ma: tx,
        rx_ma: rx,
        difference_ma: diff,
        difference_pct: pct,
        meter_tolerance_ma: tol,
        leak_path_kohm,
        terminal_v: terminal,
        outcome,
        text,
    })
}

/// Loop resistance against the HART window.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct HartFinding {
    /// Measured, Ω.
    pub loop_ohms: f64,
    /// The window, Ω.
    pub window_ohms: (f64, f64),
    /// Spare resistance in the voltage budget, Ω, when the tag has a loop configuration:
    /// at 20 mA or at the fault current, whichever leaves less (adding more would starve
    /// the transmitter at that current).
    pub budget_spare_ohms: Option<f64>,
    /// Ohms to add to reach the window's minimum (too low only).
    pub add_ohms: Option<f64>,
    /// `too-low`, `in-window`, `too-high` or `open`.
    pub outcome: &'static str,
    /// In words.
    pub text: String,
}

/// Why a HART handheld can or cannot talk, from the loop resistance measured power off.
pub fn hart_window(tag: &Tag, loop_ohms: f64) -> Result<HartFinding> {
    let r = Measurement::LoopOhms.accept(loop_ohms)?;
    let window = tag
        .loop_config
        .as_ref()
        .map(|c| c.hart_window_ohms)
        .unwrap_or((HART_MIN_OHMS, HART_MAX_OHMS));
    // The spare that still reaches both 20 mA and the fault current, and the current that
    // limits it.
    let spare = tag
        .loop_config
        .as_ref()
        .map(LoopConfig::budget)
        .transpose()?
        .map(|b| {
            if b.spare_fault_ohms < b.spare_ohms {
                (b.spare_fault_ohms, b.at_fault.current_ma)
            } else {
                (b.spare_ohms, 20.0)
            }
        });
    let (lo, hi) = window;
    let (outcome, add) = if r >= OPEN_LOOP_OHMS {
        ("open", None)
    } else if r < lo {
        ("too-low", Some(lo - r))
    } else if r > hi {
        ("too-high", None)
    } else {
        ("in-window", None)
    };
    let text = match outcome {
        "open" => format!(
            "The loop reads {} with the power off: it is open, so no current and no HART signal can flow. Find the break (a loose terminal, an open fuse, a disconnected resistor).",
            display::ohms(r)
        ),
        "too-low" => {
            let mut t = format!(
                "Loop resistance {} is below the {} HART needs (HART physical layer): the handheld's signal has too little resistance to develop across, so the device cannot hear it or answer. Add at least {} in series (a 250 Ω resistor is usual) or connect the handheld across a resistor already in the loop.",
                display::ohms(r),
                display::ohms(lo),
                display::ohms(lo - r)
            );
            if let Some((s, at_ma)) = spare {
                t.push_str(&format!(
                    " The voltage budget has {} spare at {}, so adding 250 Ω {}.",
                    display::ohms(s),
                    display::ma(at_ma),
                    if s >= 250.0 {
                        "still leaves the transmitter its minimum"
                    } else {
                        "would starve the transmitter: raise the supply as well"
                    }
                ));
            }
            t
        }
        "too-high" => format!(
            "Loop resistance {} is above the {} upper limit used for HART (a value from memory, unconfirmed; set on the tag): the signal is attenuated along the loop. Reduce the loop resistance (barrier, long thin cable) or connect the handheld nearer the transmitter.",
            display::ohms(r),
            display::ohms(hi)
        ),
        _ => format!(
            "Loop resistance {} is within the HART window {} to {}: resistance is not what stops the handheld. Check the device's polling address, the handheld's connection and the terminal voltage.",
            display::ohms(r),
            display::ohms(lo),
            display::ohms(hi)
        ),
    };
    Ok(HartFinding {
        loop_ohms: r,
        window_ohms: window,
        budget_spare_ohms: spare.map(|(ohms, _)| ohms),
        add_ohms: add,
        outcome,
        text,
    })
}
