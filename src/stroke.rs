//! Stroke check of a control valve on an output loop: does the valve go where the signal
//! sends it?
//!
//! The output is set to a demand (0, 25, 50, 75, 100 % of the signal, and back down when
//! asked), the valve's position is read at the valve (its travel indicator) or from its
//! position feedback, and the error is the position less the position the demand asks
//! for, in % of stroke, judged against a tolerance in % of stroke. Every point must be
//! within tolerance for the check to pass.
//!
//! Cases assumed, stated here once:
//! - demand is in % of the output signal (0 % = 4 mA, 100 % = 20 mA on a 4–20 mA output);
//! - positions are read in % open (0 % closed, 100 % fully open, as a travel indicator
//!   reads); for an air-to-open valve the expected opening follows the signal, for an
//!   air-to-close valve it runs against it (100 % open at the bottom of its signal), with
//!   the positioner acting directly; a valve whose action is not given is taken to open
//!   with the signal;
//! - a valve of a split-range pair works over its own part of the signal (for example
//!   4–12 mA): over that part it strokes fully, and outside it the valve should rest at
//!   the end it reached, so its expected position there is that end.
//!
//! The valve's fail position and action are recorded with the check as the technician
//! gives them; the check does not infer one from the other.

use crate::check::{ReferenceInstrument, Stage};
use crate::error::{within, FieldError, Result};
use crate::leave::LeaveList;
use crate::scale::SignalSpan;
use chrono::NaiveDate;
use serde::{Deserialize, Serialize};

/// The caution shown at the step that strokes a valve, before any demand is set.
pub const CAUTION: &str = "Stroking a valve moves the process: tell operations first, isolate or bypass the valve under the site's procedure (or confirm the process can take the movement), keep hands clear of the stem and linkage, and put the loop back in its normal mode afterwards.";

/// Most points in one stroke check.
pub const MAX_POINTS: usize = 41;

pub use crate::valve::{FailPosition, ValveAction};

/// A stroke check as entered.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct StrokeInput {
    /// Demands in test order, % of the output signal.
    pub demand_pct: Vec<f64>,
    /// Positions read, % open, one per demand.
    pub position_pct: Vec<f64>,
    /// Acceptance tolerance, ± % of stroke.
    pub tolerance_pct: f64,
    /// The output's signal span (4–20 mA unless told).
    #[serde(default)]
    pub signal: SignalSpan,
    /// For one valve of a split-range pair, its part of the signal, mA (low, high).
    #[serde(default)]
    pub split_ma: Option<(f64, f64)>,
    /// How the valve moves with the signal, when known.
    #[serde(default)]
    pub action: Option<ValveAction>,
    /// Where the valve fails, when known.
    #[serde(default)]
    pub fail: Option<FailPosition>,
}

/// One point of a stroke check.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct StrokePoint {
    /// The demand set, % of the output signal.
    pub demand_pct: f64,
    /// The output current at that demand, mA.
    pub signal_ma: f64,
    /// Where the valve should be, % open.
    pub expected_pct: f64,
    /// Where it was read, % open.
    pub position_pct: f64,
    /// Read less expected, % of stroke.
    pub error_pct: f64,
    /// Within tolerance.
    pub pass: bool,
}

/// A judged stroke check.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct StrokeResult {
    /// The points in test order.
    pub points: Vec<StrokePoint>,
    /// The error of largest magnitude, with its sign, % of stroke.
    pub max_error_pct: f64,
    /// Index (0-based) of that point.
    pub max_error_index: usize,
    /// Acceptance tolerance, ± % of stroke.
    pub tolerance_pct: f64,
    /// The valve's part of the signal, mA, for one of a split-range pair.
    pub split_ma: Option<(f64, f64)>,
    /// How the valve moves with the signal, as recorded.
    pub action: Option<ValveAction>,
    /// Where the valve fails, as recorded.
    pub fail: Option<FailPosition>,
    /// Every point within tolerance.
    pub pass: bool,
}

impl StrokeInput {
    /// Check every field; the error names the field and the allowed range.
    pub fn validate(&self) -> Result<()> {
        let n = self.demand_pct.len();
        if n == 0 || n > MAX_POINTS {
            return Err(FieldError::new(
                "demand",
                format!("must list 1 to {MAX_POINTS} points, got {n}"),
            ));
        }
        if self.position_pct.len() != n {
            return Err(FieldError::new(
                "position",
                format!(
                    "must list one reading per demand: {n} demands, {} positions",
                    self.position_pct.len()
                ),
            ));
        }
        for (i, d) in self.demand_pct.iter().enumerate() {
            within(&format!("demand {}", i + 1), *d, 0.0, 100.0)?;
        }
        // A reading a little past an end (overtravel, an indicator off its mark) is a
        // finding, not a typing error.
        for (i, p) in self.position_pct.iter().enumerate() {
            within(&format!("position {}", i + 1), *p, -25.0, 125.0)?;
        }
        within("tolerance", self.tolerance_pct, 0.0, 100.0)?;
        if self.tolerance_pct <= 0.0 {
            return Err(FieldError::new(
                "tolerance",
                "must be greater than 0 % of stroke, up to 100",
            ));
        }
        SignalSpan::new(self.signal.low_ma, self.signal.high_ma)?;
        if let Some((lo, hi)) = self.split_ma {
            let (s_lo, s_hi) = (self.signal.low_ma, self.signal.high_ma);
            within("split (low mA)", lo, s_lo, s_hi)?;
            within("split (high mA)", hi, s_lo, s_hi)?;
            if hi - lo < 0.5 {
                return Err(FieldError::new(
                    "split",
                    format!(
                        "must be a part of the signal at least 0.5 mA wide, low below high, within {s_lo}–{s_hi} mA (got {lo}..{hi})"
                    ),
                ));
            }
        }
        Ok(())
    }

    /// Judge the check. Errors only for invalid input.
    pub fn judge(&self) -> Result<StrokeResult> {
        self.validate()?;
        let (s_lo, s_hi) = (self.signal.low_ma, self.signal.high_ma);
        let (v_lo, v_hi) = self.split_ma.unwrap_or((s_lo, s_hi));
        let points: Vec<StrokePoint> = self
            .demand_pct
            .iter()
            .zip(&self.position_pct)
            .map(|(&demand_pct, &position_pct)| {
                let signal_ma = s_lo + (s_hi - s_lo) * demand_pct / 100.0;
                let travel = ((signal_ma - v_lo) / (v_hi - v_lo) * 100.0).clamp(0.0, 100.0);
                let expected_pct = match self.action {
                    Some(ValveAction::AirToClose) => 100.0 - travel,
                    _ => travel,
                };
                let error_pct = position_pct - expected_pct;
                StrokePoint {
                    demand_pct,
                    signal_ma,
                    expected_pct,
                    position_pct,
                    error_pct,
                    pass: error_pct.abs() <= self.tolerance_pct + 1e-9,
                }
            })
            .collect();
        let (max_error_index, max_error_pct) = points
            .iter()
            .enumerate()
            .map(|(i, p)| (i, p.error_pct))
            .fold((0, 0.0_f64), |best, (i, e)| {
                if e.abs() > best.1.abs() {
                    (i, e)
                } else {
                    best
                }
            });
        let pass = points.iter().all(|p| p.pass);
        Ok(StrokeResult {
            points,
            max_error_pct,
            max_error_index,
            tolerance_pct: self.tolerance_pct,
            split_ma: self.split_ma,
            action: self.action,
            fail: self.fail,
            pass,
        })
    }
}

/// Where the valve's position was read.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum ReadAt {
    /// At the valve: its travel indicator or a scale on the stem.
    Valve,
    /// From its position feedback (a position transmitter or the positioner's feedback).
    Feedback,
}

impl ReadAt {
    /// Read `valve` or `feedback` as typed.
    pub fn parse(text: &str) -> Result<ReadAt> {
        match text.trim().to_lowercase().as_str() {
            "valve" | "indicator" => Ok(ReadAt::Valve),
            "feedback" => Ok(ReadAt::Feedback),
            _ => Err(FieldError::new(
                "read-at",
                format!("must be valve or feedback, got '{}'", text.trim()),
            )),
        }
    }

    /// Stable code.
    pub fn code(self) -> &'static str {
        match self {
            ReadAt::Valve => "valve",
            ReadAt::Feedback => "feedback",
        }
    }
}

/// A stroke check as saved.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct StrokeRecord {
    /// The judged check.
    #[serde(flatten)]
    pub result: StrokeResult,
    /// Date of the check.
    pub date: NaiveDate,
    /// As found or as left.
    pub stage: Stage,
    /// Where the position was read, when said.
    #[serde(default)]
    pub read_at: Option<ReadAt>,
    /// The reference instrument (the mA source or calibrator), when recorded.
    #[serde(default)]
    pub reference: Option<ReferenceInstrument>,
    /// Free note.
    #[serde(default)]
    pub note: String,
    /// The before-you-leave list as the technician left it.
    #[serde(default)]
    pub before_leaving: Option<LeaveList>,
}

/// The usual five demands, rising: 0, 25, 50, 75, 100 % (common practice, as a loop
/// check's points).
pub const FIVE_POINTS: [f64; 5] = [0.0, 25.0, 50.0, 75.0, 100.0];

#[cfg(test)]
mod tests {
    use super::*;

    fn input(position: &[f64]) -> StrokeInput {
        StrokeInput {
            demand_pct: FIVE_POINTS.to_vec(),
            position_pct: position.to_vec(),
            tolerance_pct: 2.0,
            signal: SignalSpan::default(),
            split_ma: None,
            action: None,
            fail: None,
        }
    }

    #[test]
    fn a_valve_that_follows_its_signal_passes() {
        let r = input(&[0.0, 25.5, 49.0, 75.0, 99.5]).judge().unwrap();
        assert!(r.pass);
        assert_eq!(r.max_error_index, 2);
        assert!((r.max_error_pct + 1.0).abs() < 1e-12);
    }

    #[test]
    fn mismatched_lists_name_the_field() {
        assert_eq!(input(&[0.0, 25.0]).judge().unwrap_err().field, "position");
        let mut i = input(&[0.0, 25.0, 50.0, 75.0, 100.0]);
        i.demand_pct[1] = 120.0;
        assert_eq!(i.judge().unwrap_err().field, "demand 2");
        let mut i = input(&[0.0, 25.0, 50.0, 75.0, 100.0]);
        i.split_ma = Some((12.0, 4.0));
        assert_eq!(i.judge().unwrap_err().field, "split");
    }
}
