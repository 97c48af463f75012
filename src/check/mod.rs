//! Loop checks: as-found / as-left calibration checks of a transmitter or a receiver.
//!
//! A **transmitter check** applies known inputs to the sensor (engineering values) and
//! reads the loop current; a **receiver check** injects known currents and reads the value
//! the receiver (PLC, DCS, indicator) displays. The default points are 0, 25, 50, 75 and
//! 100 % of the input span, rising and then falling back (common practice, in ISA-51.1
//! terms), so the same input is met once from below and once from above.
//!
//! For each point the expected output comes from the tag's [`Scale`], so square-root and
//! table transfers are handled by the same code that converts readings:
//!
//! - transmitter, linear or table: the transmitter is linear in its measured variable
//!   (the table only changes what the receiver shows);
//! - transmitter, square root: the applied input is ΔP. Give the ΔP range with
//!   [`LoopCheck::input_range`] and apply ΔP in its unit; without it the applied values are
//!   the flows those ΔPs stand for, in the range unit. Points are % of the ΔP span either way;
//! - receiver: the expected display is `Scale::from_ma(injected).value` — root extraction,
//!   low-flow cutoff, table and reversed ranges included.
//!
//! Errors are `measured − expected` in the output (mA for a transmitter, the displayed unit
//! for a receiver) and in % of the output span. Hysteresis is, in the ISA-51.1 sense, the
//! largest difference between the rising and the falling reading at the same input, as %
//! of output span. The reference instrument is judged by its calibration due date and by
//! the test uncertainty ratio, TUR = tolerance / reference accuracy, which should be at
//! least 4:1 (common practice).
//!
//! With reference instruments from the store (one or two, named by id) the check is
//! judged again in [`uncertainty`]: each reference's data-sheet accuracy at each point in
//! % of span, combined by root-sum-square, TUR per point, and the decision rule (simple
//! or guarded acceptance, ILAC-G8).
//!
//! This module computes: results are numbers, verdicts and [`CheckWarning`] codes. The
//! words (the one-line verdict, the log entry's text, the report's Markdown section, the
//! warnings) are written once in [`crate::view::wording::check`].

use crate::display;
use crate::error::{finite, within, FieldError, Result};
use crate::leave::{Item, LeaveList};
use crate::scale::{RootLocation, Scale, Transfer};
use crate::tag::{Tag, DEFAULT_TOLERANCE_PERCENT};
use chrono::NaiveDate;
use serde::{Deserialize, Serialize};

pub mod uncertainty;

/// The kind of log entry a check result is stored as.
pub const LOG_KIND: &str = "loop-check";
/// The default test points, % of input span, in test order: rising then falling (common
/// practice, ISA-51.1 terms).
pub const DEFAULT_POINTS_PERCENT: [f64; 9] = [0.0, 25.0, 50.0, 75.0, 100.0, 75.0, 50.0, 25.0, 0.0];
/// Smallest acceptable test uncertainty ratio (common practice: 4:1).
pub const MIN_TUR: f64 = 4.0;
/// Test points must lie within this band, % of input span.
pub const POINT_LIMITS_PERCENT: (f64, f64) = (-25.0, 125.0);
/// Fewest and most points a check may have.
pub const POINT_COUNT: (usize, usize) = (2, 41);
/// Two inputs closer than this (% of span) count as the same test point for hysteresis.
const SAME_POINT_PERCENT: f64 = 1e-6;
/// Comparisons against the tolerance forgive this much (% of span) for rounding.
const EDGE_PERCENT: f64 = 1e-9;

/// Which device is being checked.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum Device {
    /// Known input on the sensor, loop current read.
    Transmitter,
    /// Known current injected, displayed value read.
    Receiver,
}

impl Device {
    /// Read `transmitter` or `receiver` (also `tx`, `rx`).
    pub fn parse(text: &str) -> Result<Device> {
        match text.trim().to_lowercase().as_str() {
            "transmitter" | "tx" => Ok(Device::Transmitter),
            "receiver" | "rx" => Ok(Device::Receiver),
            other => Err(FieldError::new(
                "device",
                format!("'{other}' is not a device; use transmitter or receiver"),
            )),
        }
    }

    /// The stable machine name.
    pub fn as_str(self) -> &'static str {
        match self {
            Device::Transmitter => "transmitter",
            Device::Receiver => "receiver",
        }
    }
}

/// Whether a point was approached from below or from above.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum Direction {
    /// Approached from a lower input.
    Rising,
    /// Approached from a higher input.
    Falling,
}

impl Direction {
    /// The stable machine name.
    pub fn as_str(self) -> &'static str {
        match self {
            Direction::Rising => "rising",
            Direction::Falling => "falling",
        }
    }
}

/// As found (before any adjustment) or as left (after the work).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum Stage {
    /// The loop as it was found.
    AsFound,
    /// The loop as it was left.
    AsLeft,
}

impl Stage {
    /// Read `as-found` or `as-left` (also `found`, `left`).
    pub fn parse(text: &str) -> Result<Stage> {
        match text.trim().to_lowercase().replace('_', "-").as_str() {
            "as-found" | "found" => Ok(Stage::AsFound),
            "as-left" | "left" => Ok(Stage::AsLeft),
            other => Err(FieldError::new(
                "stage",
                format!("'{other}' is not a stage; use as-found or as-left"),
            )),
        }
    }

    /// The stable machine name.
    pub fn as_str(self) -> &'static str {
        match self {
            Stage::AsFound => "as-found",
            Stage::AsLeft => "as-left",
        }
    }

    /// The words for a report.
    pub fn label(self) -> &'static str {
        match self {
            Stage::AsFound => "as found",
            Stage::AsLeft => "as left",
        }
    }
}

/// A reference instrument's accuracy, in the terms its certificate gives.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(tag = "kind", content = "value", rename_all = "kebab-case")]
pub enum Accuracy {
    /// ± % of the checked loop's span.
    PercentOfSpan(f64),
    /// ± mA.
    Ma(f64),
    /// ± engineering units: the tag's range unit (or the ΔP unit given as the input range).
    Units(f64),
}

/// The calibrator or meter used for the check.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ReferenceInstrument {
    /// Its asset number or serial, as written on its label.
    pub id: String,
    /// Its accuracy.
    pub accuracy: Accuracy,
    /// The date its own calibration falls due.
    pub calibration_due: NaiveDate,
}

/// The range of the transmitter's input when it differs from the tag's range: the ΔP
/// range of a square-root flow loop.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct InputRange {
    /// Input at 0 % (4 mA).
    pub lrv: f64,
    /// Input at 100 % (20 mA).
    pub urv: f64,
    /// Its unit, e.g. `Pa`.
    pub unit: String,
}

/// Something the technician should know about how the check was made.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(tag = "code", rename_all = "kebab-case")]
pub enum CheckWarning {
    /// The reference instrument's calibration was past due on the check date.
    ReferencePastDue {
        /// Reference id.
        id: String,
        /// Its due date.
        due: NaiveDate,
        /// The date of the check.
        check_date: NaiveDate,
        /// Days past due.
        days_over: i64,
    },
    /// The test uncertainty ratio is below the minimum.
    LowTur {
        /// Tolerance / reference accuracy.
        tur: f64,
        /// The minimum asked for (4).
        minimum: f64,
    },
}

/// One planned test point.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct PlannedPoint {
    /// Input as % of input span.
    pub percent: f64,
    /// Approach direction.
    pub direction: Direction,
    /// What to apply: engineering value (transmitter) or mA (receiver).
    pub applied: f64,
    /// What the output should read.
    pub expected: f64,
}

/// One point of a finished check.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct PointResult {
    /// Input as % of input span.
    pub percent: f64,
    /// Approach direction.
    pub direction: Direction,
    /// What was applied: engineering value (transmitter) or mA (receiver).
    pub applied: f64,
    /// What the output should read: mA (transmitter) or displayed value (receiver).
    pub expected: f64,
    /// What it read.
    pub measured: f64,
    /// `measured − expected`, in the output unit.
    pub error: f64,
    /// The error as % of output span (positive = reads high).
    pub error_pct: f64,
    /// The error as mA of signal span.
    pub error_ma: f64,
    /// The error in engineering units: of the input for a transmitter (range unit or ΔP
    /// unit), of the display for a receiver.
    pub error_units: f64,
    /// Within tolerance.
    pub pass: bool,
}

/// A finished check: the payload of a `loop-check` log entry.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct CheckResult {
    /// Tag number (empty when checked against a range typed in).
    pub tag: String,
    /// Transmitter or receiver.
    pub device: Device,
    /// As found or as left.
    pub stage: Stage,
    /// Date of the check.
    pub date: NaiveDate,
    /// The tag's scale the expected values came from.
    pub scale: Scale,
    /// ΔP range used for a square-root transmitter, if given.
    pub input_range: Option<InputRange>,
    /// Unit of `applied`.
    pub input_unit: String,
    /// Unit of `expected` and `measured`.
    pub output_unit: String,
    /// Output span the errors are divided by (mA or displayed units; positive).
    pub output_span: f64,
    /// Acceptance tolerance, ± % of span.
    pub tolerance_pct: f64,
    /// The points in test order.
    pub points: Vec<PointResult>,
    /// Largest error magnitude, % of span.
    pub max_error_pct: f64,
    /// Index (0-based) of the point with the largest error.
    pub max_error_index: usize,
    /// Largest rising/falling difference at one input, % of span (ISA-51.1 hysteresis);
    /// `None` when no input was met from both directions.
    pub hysteresis_pct: Option<f64>,
    /// The input (% of span) where that largest difference was found.
    pub hysteresis_at_percent: Option<f64>,
    /// Every point within tolerance.
    pub pass: bool,
    /// Whether the technician adjusted the device during this visit.
    pub adjusted: bool,
    /// Free note.
    pub note: String,
    /// The reference instrument, when recorded.
    pub reference: Option<ReferenceInstrument>,
    /// Test uncertainty ratio, when a reference was recorded.
    pub tur: Option<f64>,
    /// Warnings about the reference.
    pub warnings: Vec<CheckWarning>,
    /// The before-you-leave list as the technician left it (payload key
    /// `before_leaving`); `None` in records saved before loopside asked, and until a front
    /// sets it with [`CheckResult::left`].
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub before_leaving: Option<LeaveList>,
    /// The check judged with the reference instruments named from the store (payload key
    /// `uncertainty`): each point's combined reference accuracy, TUR and decision under
    /// the rule chosen ([`uncertainty`]). `None` in records saved
    /// before references were kept in the store, and when none was named; set with
    /// [`CheckResult::with_references`].
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub uncertainty: Option<uncertainty::Assessment>,
}

/// A loop check being set up: the builder the app and the command line use.
///
/// ```
/// use loopside::check::{Device, LoopCheck};
/// use loopside::scale::Scale;
/// # fn main() -> Result<(), Box<dyn std::error::Error>> {
/// let scale = Scale::linear(0.0, 4.5, "m")?;
/// let date = chrono::NaiveDate::from_ymd_opt(2026, 12, 1).ok_or("no such date")?;
/// let check = LoopCheck::new(&scale, Device::Transmitter, date).tolerance(0.5);
/// let result = check.run_planned(&[4.0, 8.0, 12.0, 16.0, 20.0, 16.0, 12.0, 8.0, 4.0])?;
/// assert!(result.pass);
/// # Ok(())
/// # }
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct LoopCheck {
    scale: Scale,
    device: Device,
    date: NaiveDate,
    tag: String,
    tolerance_percent: f64,
    stage: Stage,
    adjusted: bool,
    note: String,
    reference: Option<ReferenceInstrument>,
    points_percent: Vec<f64>,
    input_range: Option<InputRange>,
}

impl LoopCheck {
    /// A check of `device` against `scale` on `date`, with the default points, tolerance
    /// ±0.5 % of span and stage as-found.
    pub fn new(scale: &Scale, device: Device, date: NaiveDate) -> LoopCheck {
        LoopCheck {
            scale: scale.clone(),
            device,
            date,
            tag: String::new(),
            tolerance_percent: DEFAULT_TOLERANCE_PERCENT,
            stage: Stage::AsFound,
            adjusted: false,
            note: String::new(),
            reference: None,
            points_percent: DEFAULT_POINTS_PERCENT.to_vec(),
            input_range: None,
        }
    }

    /// A check of one tag: its scale, its number and its tolerance.
    pub fn for_tag(tag: &Tag, device: Device, date: NaiveDate) -> LoopCheck {
        let mut check = LoopCheck::new(&tag.scale, device, date);
        check.tag = tag.number.clone();
        check.tolerance_percent = tag.tolerance_percent;
        check
    }

    /// Set the tag number shown on the result.
    pub fn tag_number(mut self, number: &str) -> LoopCheck {
        self.tag = number.trim().to_string();
        self
    }

    /// Acceptance tolerance, ± % of span.
    pub fn tolerance(mut self, percent: f64) -> LoopCheck {
        self.tolerance_percent = percent;
        self
    }

    /// As found or as left.
    pub fn stage(mut self, stage: Stage) -> LoopCheck {
        self.stage = stage;
        self
    }

    /// Whether an adjustment was made.
    pub fn adjusted(mut self, adjusted: bool) -> LoopCheck {
        self.adjusted = adjusted;
        self
    }

    /// A free note for the record.
    pub fn note(mut self, note: &str) -> LoopCheck {
        self.note = note.trim().to_string();
        self
    }

    /// The reference instrument used.
    pub fn reference(mut self, reference: ReferenceInstrument) -> LoopCheck {
        self.reference = Some(reference);
        self
    }

    /// Test points, % of input span, in test order (the default is
    /// [`DEFAULT_POINTS_PERCENT`]).
    pub fn points(mut self, percents: Vec<f64>) -> LoopCheck {
        self.points_percent = percents;
        self
    }

    /// The transmitter's ΔP range for a square-root loop (applied values are then ΔP).
    pub fn input_range(mut self, range: InputRange) -> LoopCheck {
        self.input_range = Some(range);
        self
    }

    /// Check the settings; the error names the first wrong one.
    pub fn validate(&self) -> Result<()> {
        let s = &self.scale;
        Scale::new(s.lrv, s.urv, &s.unit, s.transfer.clone(), s.signal)?;
        within("tolerance", self.tolerance_percent, 0.0, 100.0)?;
        if self.tolerance_percent == 0.0 {
            return Err(FieldError::new(
                "tolerance",
                "must be greater than 0 % of span",
            ));
        }
        if let Some(r) = &self.input_range {
            finite("input range (LRV)", r.lrv)?;
            finite("input range (URV)", r.urv)?;
            if r.lrv == r.urv {
                return Err(FieldError::new(
                    "input range",
                    format!("LRV and URV are both {}; the span must not be zero", r.lrv),
                ));
            }
        }
        if let Some(reference) = &self.reference {
            if reference.id.trim().is_empty() {
                return Err(FieldError::new(
                    "reference id",
                    "is empty; give the reference instrument's asset number",
                ));
            }
            let v = match reference.accuracy {
                Accuracy::PercentOfSpan(v) | Accuracy::Ma(v) | Accuracy::Units(v) => v,
            };
            crate::error::positive("reference accuracy", v)?;
        }
        let (min, max) = POINT_COUNT;
        let n = self.points_percent.len();
        if n < min || n > max {
            return Err(FieldError::new(
                "points",
                format!("needs {min} to {max} points, got {n}"),
            ));
        }
        for (i, p) in self.points_percent.iter().enumerate() {
            self.check_percent(&format!("points[{}]", i + 1), *p)?;
        }
        Ok(())
    }

    /// The band test points must lie in, % of input span (no negative ΔP for square root).
    fn percent_limits(&self) -> (f64, f64) {
        let (lo, hi) = POINT_LIMITS_PERCENT;
        (if self.sqrt_transmitter() { 0.0 } else { lo }, hi)
    }

    fn check_percent(&self, field: &str, percent: f64) -> Result<f64> {
        let percent = finite(field, percent)?;
        let (lo, hi) = self.percent_limits();
        if percent < lo || percent > hi {
            return Err(FieldError::new(
                field,
                format!(
                    "{} of span is outside the {} to {} % a check may use",
                    display::percent(percent),
                    display::quoted(lo),
                    display::quoted(hi)
                ),
            ));
        }
        Ok(percent)
    }

    fn sqrt_transmitter(&self) -> bool {
        self.device == Device::Transmitter
            && matches!(self.scale.transfer, Transfer::SquareRoot { .. })
    }

    /// The unit of what is applied.
    pub fn input_unit(&self) -> String {
        match (self.device, &self.input_range) {
            (Device::Receiver, _) => "mA".to_string(),
            (Device::Transmitter, Some(r)) if self.sqrt_transmitter() => r.unit.clone(),
            (Device::Transmitter, _) => self.scale.unit.clone(),
        }
    }

    /// The unit of what is read.
    pub fn output_unit(&self) -> String {
        match self.device {
            Device::Transmitter => "mA".to_string(),
            Device::Receiver => self.scale.value_unit().to_string(),
        }
    }

    /// Span of the input, in the input unit (signed).
    fn input_span(&self) -> f64 {
        match (self.device, &self.input_range) {
            (Device::Receiver, _) => self.scale.signal.width_ma(),
            (Device::Transmitter, Some(r)) if self.sqrt_transmitter() => r.urv - r.lrv,
            (Device::Transmitter, _) => self.scale.span(),
        }
    }

    /// Span of the output, positive.
    fn output_span(&self) -> Result<f64> {
        Ok(match self.device {
            Device::Transmitter => self.scale.signal.width_ma(),
            Device::Receiver => {
                let low = self.scale.from_percent(0.0)?.value;
                let high = self.scale.from_percent(100.0)?.value;
                (high - low).abs()
            }
        })
    }

    /// The applied value for an input percent.
    fn applied_at(&self, percent: f64) -> f64 {
        let fraction = percent / 100.0;
        match self.device {
            Device::Receiver => self.scale.signal.ma_at(percent),
            Device::Transmitter => match (&self.scale.transfer, &self.input_range) {
                (Transfer::SquareRoot { .. }, Some(r)) => r.lrv + fraction * (r.urv - r.lrv),
                (Transfer::SquareRoot { .. }, None) => {
                    self.scale.lrv + fraction.max(0.0).sqrt() * self.scale.span()
                }
                _ => self.scale.lrv + fraction * self.scale.span(),
            },
        }
    }

    /// The input percent for an applied value (the field names the list item).
    fn percent_of(&self, field: &str, applied: f64) -> Result<f64> {
        let applied = finite(field, applied)?;
        let percent = match self.device {
            Device::Receiver => self.scale.signal.percent_of(applied),
            Device::Transmitter => match (&self.scale.transfer, &self.input_range) {
                (Transfer::SquareRoot { .. }, Some(r)) => {
                    (applied - r.lrv) / (r.urv - r.lrv) * 100.0
                }
                (Transfer::SquareRoot { .. }, None) => {
                    let reading = self
                        .scale
                        .from_value(applied)
                        .map_err(|e| e.renamed(field))?;
                    reading.dp_percent.unwrap_or(reading.percent)
                }
                _ => (applied - self.scale.lrv) / self.scale.span() * 100.0,
            },
        };
        let (lo, hi) = self.percent_limits();
        if !(lo..=hi).contains(&percent) {
            return Err(FieldError::new(
                field,
                format!(
                    "{} {} is {} of span, outside the {} to {} % a check may use",
                    display::quoted(applied),
                    self.input_unit(),
                    display::percent(percent),
                    display::quoted(lo),
                    display::quoted(hi)
                ),
            ));
        }
        Ok(percent)
    }

    /// The output expected for an input percent (and its applied value).
    fn expected_at(&self, percent: f64, applied: f64) -> Result<f64> {
        match self.device {
            Device::Receiver => Ok(self.scale.from_ma(applied)?.value),
            Device::Transmitter => match &self.scale.transfer {
                Transfer::SquareRoot { root_in, .. } => {
                    if self.input_range.is_none() {
                        // Applied as flow: the scale reads it back to the current.
                        return Ok(self.scale.from_value(applied)?.ma);
                    }
                    let dp = percent / 100.0;
                    let current_fraction = match root_in {
                        RootLocation::Receiver => dp,
                        RootLocation::Transmitter => dp.max(0.0).sqrt(),
                    };
                    Ok(self.scale.from_percent(current_fraction * 100.0)?.ma)
                }
                _ => Ok(self.scale.from_percent(percent)?.ma),
            },
        }
    }

    /// The points to apply, in order, with what each should read.
    pub fn plan(&self) -> Result<Vec<PlannedPoint>> {
        self.validate()?;
        let directions = directions_of(&self.points_percent);
        let mut out = Vec::with_capacity(self.points_percent.len());
        for (p, direction) in self.points_percent.iter().zip(directions) {
            let applied = self.applied_at(*p);
            out.push(PlannedPoint {
                percent: *p,
                direction,
                applied,
                expected: self.expected_at(*p, applied)?,
            });
        }
        Ok(out)
    }

    /// Judge readings taken at the planned points.
    pub fn run_planned(&self, measured: &[f64]) -> Result<CheckResult> {
        let applied: Vec<f64> = self.plan()?.iter().map(|p| p.applied).collect();
        self.run(&applied, measured)
    }

    /// Judge readings taken at the given applied values (test order, rising then falling).
    /// The approach direction of each point is worked out from the order.
    pub fn run(&self, applied: &[f64], measured: &[f64]) -> Result<CheckResult> {
        let mut settings = self.clone();
        settings.points_percent = Vec::new();
        for (i, a) in applied.iter().enumerate() {
            let p = self.percent_of(&format!("applied[{}]", i + 1), *a)?;
            settings.points_percent.push(p);
        }
        settings.validate()?;
        if measured.len() != applied.len() {
            return Err(FieldError::new(
                "measured",
                format!(
                    "has {} value(s) but applied has {}; give one reading per applied point",
                    measured.len(),
                    applied.len()
                ),
            ));
        }
        for (i, m) in measured.iter().enumerate() {
            finite(&format!("measured[{}]", i + 1), *m)?;
        }
        settings.judge(applied, measured)
    }

    fn judge(&self, applied: &[f64], measured: &[f64]) -> Result<CheckResult> {
        let output_span = self.output_span()?;
        if output_span <= 0.0 || !output_span.is_finite() {
            return Err(FieldError::new(
                "range",
                "the displayed value does not change over the range; nothing to check against",
            ));
        }
        let input_span = self.input_span();
        let signal_width = self.scale.signal.width_ma();
        let directions = directions_of(&self.points_percent);
        let mut points = Vec::with_capacity(applied.len());
        for i in 0..applied.len() {
            let percent = self.points_percent[i];
            let expected = self.expected_at(percent, applied[i])?;
            let error = measured[i] - expected;
            let error_pct = error / output_span * 100.0;
            points.push(PointResult {
                percent,
                direction: directions[i],
                applied: applied[i],
                expected,
                measured: measured[i],
                error,
                error_pct,
                error_ma: error_pct / 100.0 * signal_width,
                error_units: match self.device {
                    Device::Transmitter => error_pct / 100.0 * input_span.abs(),
                    Device::Receiver => error,
                },
                pass: error_pct.abs() <= self.tolerance_percent + EDGE_PERCENT,
            });
        }
        let (max_error_index, max_error_pct) = points
            .iter()
            .enumerate()
            .map(|(i, p)| (i, p.error_pct.abs()))
            .fold(
                (0, 0.0_f64),
                |best, cur| if cur.1 > best.1 { cur } else { best },
            );
        let (hysteresis_pct, hysteresis_at_percent) = match hysteresis(&points) {
            Some((h, at)) => (Some(h), Some(at)),
            None => (None, None),
        };
        let (tur, warnings) = self.reference_verdict();
        Ok(CheckResult {
            tag: self.tag.clone(),
            device: self.device,
            stage: self.stage,
            date: self.date,
            scale: self.scale.clone(),
            input_range: if self.sqrt_transmitter() {
                self.input_range.clone()
            } else {
                None
            },
            input_unit: self.input_unit(),
            output_unit: self.output_unit(),
            output_span,
            tolerance_pct: self.tolerance_percent,
            pass: points.iter().all(|p| p.pass),
            points,
            max_error_pct,
            max_error_index,
            hysteresis_pct,
            hysteresis_at_percent,
            adjusted: self.adjusted,
            note: self.note.clone(),
            reference: self.reference.clone(),
            tur,
            warnings,
            before_leaving: None,
            uncertainty: None,
        })
    }

    /// The reference accuracy as ± % of the span it is compared against.
    fn reference_percent(&self, accuracy: Accuracy) -> f64 {
        match accuracy {
            Accuracy::PercentOfSpan(v) => v,
            Accuracy::Ma(v) => v / self.scale.signal.width_ma() * 100.0,
            Accuracy::Units(v) => {
                let span = match self.device {
                    Device::Transmitter => self.input_span(),
                    Device::Receiver => self.scale.span(),
                };
                v / span.abs() * 100.0
            }
        }
    }

    fn reference_verdict(&self) -> (Option<f64>, Vec<CheckWarning>) {
        let mut warnings = Vec::new();
        let Some(reference) = &self.reference else {
            return (None, warnings);
        };
        if self.date > reference.calibration_due {
            warnings.push(CheckWarning::ReferencePastDue {
                id: reference.id.clone(),
                due: reference.calibration_due,
                check_date: self.date,
                days_over: (self.date - reference.calibration_due).num_days(),
            });
        }
        let tur = self.tolerance_percent / self.reference_percent(reference.accuracy);
        if tur < MIN_TUR - 1e-9 {
            warnings.push(CheckWarning::LowTur {
                tur,
                minimum: MIN_TUR,
            });
        }
        (Some(tur), warnings)
    }
}

/// The approach direction of each point from the test order: a point above the one before
/// is rising, below is falling; the first point, or one equal to the one before, takes the
/// direction of the next change (rising if there is none).
pub fn directions_of(percents: &[f64]) -> Vec<Direction> {
    let step = |a: f64, b: f64| {
        if b > a + SAME_POINT_PERCENT {
            Some(Direction::Rising)
        } else if b < a - SAME_POINT_PERCENT {
            Some(Direction::Falling)
        } else {
            None
        }
    };
    (0..percents.len())
        .map(|i| {
            let from_before = if i > 0 {
                step(percents[i - 1], percents[i])
            } else {
                None
            };
            from_before
                .or_else(|| {
                    percents[i + 1..]
                        .iter()
                        .find_map(|next| step(percents[i], *next))
                })
                .unwrap_or(Direction::Rising)
        })
        .collect()
}

/// Largest |rising − falling| error difference at one input (% of span), and where.
fn hysteresis(points: &[PointResult]) -> Option<(f64, f64)> {
    let mut best: Option<(f64, f64)> = None;
    for up in points.iter().filter(|p| p.direction == Direction::Rising) {
        for down in points.iter().filter(|p| p.direction == Direction::Falling) {
            if (up.percent - down.percent).abs() <= SAME_POINT_PERCENT {
                let d = (up.error_pct - down.error_pct).abs();
                if best.is_none_or(|(h, _)| d > h) {
                    best = Some((d, up.percent));
                }
            }
        }
    }
    best
}

impl CheckResult {
    /// Judge the check again with one or two reference instruments from the store under
    /// `rule`, and keep the result in [`CheckResult::uncertainty`]. The error names the
    /// reference whose unit cannot be compared with the loop's.
    pub fn with_references(
        &mut self,
        references: &[crate::calibration::reference::Reference],
        rule: uncertainty::DecisionRule,
    ) -> Result<()> {
        self.uncertainty = Some(uncertainty::assess(self, references, rule)?);
        Ok(())
    }

    /// Record what was put right before leaving the loop: `done` were ticked (or named on
    /// the command line), the rest are recorded as not done.
    pub fn left(&mut self, done: &[Item]) {
        self.before_leaving = Some(LeaveList::from_done(done));
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn directions_follow_the_test_order() {
        use Direction::*;
        assert_eq!(
            directions_of(&DEFAULT_POINTS_PERCENT),
            vec![Rising, Rising, Rising, Rising, Rising, Falling, Falling, Falling, Falling]
        );
        assert_eq!(
            directions_of(&[0.0, 50.0, 100.0, 100.0, 50.0, 0.0]),
            vec![Rising, Rising, Rising, Falling, Falling, Falling]
        );
        assert_eq!(directions_of(&[100.0, 50.0]), vec![Falling, Falling]);
    }
}
