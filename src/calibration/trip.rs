//! Trip and alarm tests: does a switch, a trip amplifier or a control-system alarm fed by
//! the loop act at its setpoint?
//!
//! The technician ramps the input slowly towards the setpoint, notes the value at which
//! the output changes state (*trip*), ramps back and notes where it changes back
//! (*reset*), and repeats for one or more runs. For each run:
//!
//! - **trip error** = (trip − setpoint) ÷ span × 100, in % of span, signed (positive: it
//!   acted at a higher value than set);
//! - **deadband** = the distance from trip back to reset in % of span: trip − reset for a
//!   rising trip, reset − trip for a falling one (a reset beyond the trip is refused: the
//!   lists are most likely swapped);
//!
//! and over all runs:
//!
//! - the **trip error** reported is the run with the largest magnitude (the worst run);
//! - the **deadband** reported is the largest of the runs;
//! - **repeatability** is the spread of the trip values, max − min, in % of span (our
//!   definition, stated here and in the README; with one run there is none);
//! - **pass** when every run's |trip error| ≤ the tolerance (± % of span).
//!
//! "Span" is the span of the value the trip acts on: the value shown, as for a receiver in
//! a loop check (flow for square-root, the table's output for a table), |value at 100 % −
//! value at 0 %|. The setpoint is in that value's unit. The current to inject for the
//! setpoint, when the trip is tested by injecting mA at the receiver, comes from the tag's
//! own [`Scale`] read backwards ([`Scale::from_value`]), so root extraction, reversed
//! ranges and tables are handled by the code that converts every reading.

use crate::error::{finite, within, FieldError, Result};
use crate::scale::Scale;
use chrono::NaiveDate;
use serde::{Deserialize, Serialize};

/// The kind of log entry a trip test is stored as.
pub const LOG_KIND: &str = "trip-test";
/// Most runs one test may record.
pub const MAX_RUNS: usize = 20;
/// The setpoint must lie within this band, % of signal span (as a check's test points).
pub const SETPOINT_LIMITS_PERCENT: (f64, f64) = (-25.0, 125.0);
/// Comparisons against the tolerance forgive this much (% of span) for rounding.
const EDGE_PERCENT: f64 = 1e-9;

/// Which way the value goes to make the trip act.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum TripDirection {
    /// Acts when the value rises through the setpoint (a high or high-high trip).
    Rising,
    /// Acts when the value falls through the setpoint (a low or low-low trip).
    Falling,
}

impl TripDirection {
    /// Read `rising` or `falling` (also `high`, `low`, `up`, `down`).
    pub fn parse(text: &str) -> Result<TripDirection> {
        match text.trim().to_lowercase().as_str() {
            "rising" | "high" | "up" => Ok(TripDirection::Rising),
            "falling" | "low" | "down" => Ok(TripDirection::Falling),
            other => Err(FieldError::new(
                "direction",
                format!("'{other}' is not a direction; use rising or falling"),
            )),
        }
    }

    /// The stable machine name.
    pub fn as_str(self) -> &'static str {
        match self {
            TripDirection::Rising => "rising",
            TripDirection::Falling => "falling",
        }
    }
}

/// A trip test being set up: the tag's scale, the setpoint and the tolerance.
#[derive(Debug, Clone, PartialEq)]
pub struct TripTest {
    /// The loop's scale (the tag's).
    pub scale: Scale,
    /// Tag number (empty when tested against a range typed in).
    pub tag: String,
    /// Date of the test.
    pub date: NaiveDate,
    /// The setpoint, in the unit of the value shown ([`Scale::value_unit`]).
    pub setpoint: f64,
    /// Which way the value goes to trip.
    pub direction: TripDirection,
    /// Acceptance tolerance on the trip value, ± % of span.
    pub tolerance_pct: f64,
    /// A free note for the record.
    pub note: String,
}

/// One run: where it tripped and where it reset.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct TripRun {
    /// The value at which the output changed state.
    pub trip_at: f64,
    /// The value at which it changed back.
    pub reset_at: f64,
    /// The loop current at the trip value, mA.
    pub trip_ma: f64,
    /// The loop current at the reset value, mA.
    pub reset_ma: f64,
    /// (trip − setpoint) ÷ span × 100, % of span.
    pub trip_error_pct: f64,
    /// Trip to reset, % of span (positive).
    pub deadband_pct: f64,
    /// |trip error| within tolerance.
    pub pass: bool,
}

/// A finished trip test: the payload of a `trip-test` log entry.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct TripResult {
    /// Tag number (empty when tested against a range typed in).
    pub tag: String,
    /// Date of the test.
    pub date: NaiveDate,
    /// The tag's scale the values were judged on.
    pub scale: Scale,
    /// The setpoint, in `unit`.
    pub setpoint: f64,
    /// Unit of the setpoint, trips and resets (the value shown).
    pub unit: String,
    /// Which way the value goes to trip.
    pub direction: TripDirection,
    /// Acceptance tolerance, ± % of span.
    pub tolerance_pct: f64,
    /// The span errors are divided by, in `unit` (positive).
    pub span: f64,
    /// The current to inject at the receiver for the setpoint, mA.
    pub setpoint_ma: f64,
    /// Whether the current rises as the value rises (false for a reversed range).
    pub current_rises_with_value: bool,
    /// The runs in the order made.
    pub runs: Vec<TripRun>,
    /// The worst run's trip error (largest magnitude), % of span, signed.
    pub trip_error_pct: f64,
    /// Index (0-based) of the worst run.
    pub worst_run: usize,
    /// The largest deadband of the runs, % of span.
    pub deadband_pct: f64,
    /// Spread of the trip values (max − min), % of span; `None` with one run.
    pub repeatability_pct: Option<f64>,
    /// Every run within tolerance.
    pub pass: bool,
    /// Free note.
    pub note: String,
}

impl TripTest {
    /// A test of a trip at `setpoint` on `scale`, with tolerance ±`tolerance_pct` of span.
    pub fn new(
        scale: &Scale,
        date: NaiveDate,
        setpoint: f64,
        direction: TripDirection,
        tolerance_pct: f64,
    ) -> TripTest {
        TripTest {
            scale: scale.clone(),
            tag: String::new(),
            date,
            setpoint,
            direction,
            tolerance_pct,
            note: String::new(),
        }
    }

    /// The same test, naming the tag.
    pub fn tag_number(mut self, number: &str) -> TripTest {
        self.tag = number.trim().to_string();
        self
    }

    /// The same test, with a note for the record.
    pub fn note(mut self, note: &str) -> TripTest {
        self.note = note.trim().to_string();
        self
    }

    /// The span of the value the trip acts on, positive.
    fn value_span(&self) -> Result<f64> {
        let low = self.scale.from_percent(0.0)?.value;
        let high = self.scale.from_percent(100.0)?.value;
        let span = (high - low).abs();
        if span <= 0.0 || !span.is_finite() {
            return Err(FieldError::new(
                "range",
                "the value shown does not change over the range; nothing to test a trip against",
            ));
        }
        Ok(span)
    }

    /// The current for a value, the error naming `field`.
    fn ma_of(&self, field: &str, value: f64) -> Result<f64> {
        let value = finite(field, value)?;
        Ok(self
            .scale
            .from_value(value)
            .map_err(|e| e.renamed(field))?
            .ma)
    }

    /// Check the settings; the error names the first wrong one.
    pub fn validate(&self) -> Result<()> {
        let s = &self.scale;
        Scale::new(s.lrv, s.urv, &s.unit, s.transfer.clone(), s.signal)?;
        within("tolerance", self.tolerance_pct, 0.0, 100.0)?;
        if self.tolerance_pct == 0.0 {
            return Err(FieldError::new(
                "tolerance",
                "must be greater than 0 % of span",
            ));
        }
        self.value_span()?;
        let ma = self.ma_of("setpoint", self.setpoint)?;
        let percent = self.scale.signal.percent_of(ma);
        let (lo, hi) = SETPOINT_LIMITS_PERCENT;
        if !(lo..=hi).contains(&percent) {
            return Err(FieldError::new(
                "setpoint",
                format!(
                    "{} {} is {} of span, outside the {} to {} % a loop can carry",
                    crate::display::quoted(self.setpoint),
                    self.scale.value_unit(),
                    crate::display::percent(percent),
                    crate::display::quoted(lo),
                    crate::display::quoted(hi)
                ),
            ));
        }
        Ok(())
    }

    /// The current to inject at the receiver for the setpoint, mA.
    pub fn setpoint_ma(&self) -> Result<f64> {
        self.validate()?;
        self.ma_of("setpoint", self.setpoint)
    }

    /// Judge the runs: `trips[i]` and `resets[i]` are run `i + 1`'s trip and reset values.
    pub fn run(&self, trips: &[f64], resets: &[f64]) -> Result<TripResult> {
        self.validate()?;
        let span = self.value_span()?;
        if trips.is_empty() || trips.len() > MAX_RUNS {
            return Err(FieldError::new(
                "trip-at",
                format!(
                    "needs 1 to {MAX_RUNS} values (one per run), got {}",
                    trips.len()
                ),
            ));
        }
        if resets.len() != trips.len() {
            return Err(FieldError::new(
                "reset-at",
                format!(
                    "has {} value(s) but trip-at has {}; give one reset value per run",
                    resets.len(),
                    trips.len()
                ),
            ));
        }
        let unit = self.scale.value_unit().to_string();
        let mut runs = Vec::with_capacity(trips.len());
        for (i, (&trip_at, &reset_at)) in trips.iter().zip(resets).enumerate() {
            let trip_field = format!("trip-at[{}]", i + 1);
            let reset_field = format!("reset-at[{}]", i + 1);
            let trip_ma = self.ma_of(&trip_field, trip_at)?;
            let reset_ma = self.ma_of(&reset_field, reset_at)?;
            let deadband = match self.direction {
                TripDirection::Rising => trip_at - reset_at,
                TripDirection::Falling => reset_at - trip_at,
            } / span
                * 100.0;
            if deadband < -EDGE_PERCENT {
                let (side, word) = match self.direction {
                    TripDirection::Rising => ("above", "below"),
                    TripDirection::Falling => ("below", "above"),
                };
                return Err(FieldError::new(
                    reset_field,
                    format!(
                        "{} {unit} is {side} its trip value {} {unit}; a {} trip resets at or {word} where it tripped (are the lists swapped?)",
                        crate::display::quoted(reset_at),
                        crate::display::quoted(trip_at),
                        self.direction.as_str()
                    ),
                ));
            }
            let trip_error_pct = (trip_at - self.setpoint) / span * 100.0;
            runs.push(TripRun {
                trip_at,
                reset_at,
                trip_ma,
                reset_ma,
                trip_error_pct,
                deadband_pct: deadband.max(0.0),
                pass: trip_error_pct.abs() <= self.tolerance_pct + EDGE_PERCENT,
            });
        }
        let (worst_run, trip_error_pct) =
            runs.iter().enumerate().fold((0, 0.0_f64), |best, (i, r)| {
                if r.trip_error_pct.abs() > best.1.abs() {
                    (i, r.trip_error_pct)
                } else {
                    best
                }
            });
        let deadband_pct = runs.iter().map(|r| r.deadband_pct).fold(0.0, f64::max);
        let repeatability_pct = (runs.len() > 1).then(|| {
            let max = trips.iter().copied().fold(f64::NEG_INFINITY, f64::max);
            let min = trips.iter().copied().fold(f64::INFINITY, f64::min);
            (max - min) / span * 100.0
        });
        let low = self.scale.from_percent(0.0)?.value;
        let high = self.scale.from_percent(100.0)?.value;
        Ok(TripResult {
            tag: self.tag.clone(),
            date: self.date,
            scale: self.scale.clone(),
            setpoint: self.setpoint,
            unit,
            direction: self.direction,
            tolerance_pct: self.tolerance_pct,
            span,
            setpoint_ma: self.ma_of("setpoint", self.setpoint)?,
            current_rises_with_value: high > low,
            pass: runs.iter().all(|r| r.pass),
            runs,
            trip_error_pct,
            worst_run,
            deadband_pct,
            repeatability_pct,
            note: self.note.clone(),
        })
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn directions_read_as_typed() {
        assert_eq!(
            TripDirection::parse(" High ").unwrap(),
            TripDirection::Rising
        );
        assert_eq!(
            TripDirection::parse("falling").unwrap(),
            TripDirection::Falling
        );
        assert_eq!(
            TripDirection::parse("sideways").unwrap_err().field,
            "direction"
        );
    }
}
