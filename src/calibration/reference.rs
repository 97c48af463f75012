//! Reference instruments: the calibrators and meters a check is made with, kept in the
//! store as records of their own, with their accuracy as the data sheet states it.
//!
//! A data sheet gives accuracy as ± (a % of reading + b % of full scale + c fixed), where
//! "full scale" is either the top of the range (the larger of |low| and |high|: 10 bar
//! for a −1 to 10 bar module) or the whole range (high − low: 11 bar for that module);
//! [`FullScaleBasis`] says which the sheet means. [`Reference::accuracy_at`] turns that
//! into ± units at one reading. We treat the sum as the limit of the reference's error at
//! that reading and use it as its uncertainty in the checks (no coverage factor is
//! applied or assumed; what the data sheet states is what is used).

use crate::error::{finite, non_negative, FieldError, Result};
use chrono::NaiveDate;
use serde::{Deserialize, Serialize};

/// Longest reference id accepted, in characters.
pub const MAX_ID_CHARS: usize = 40;
/// Longest description accepted, in characters.
pub const MAX_DESCRIPTION_CHARS: usize = 200;

/// What "% of full scale" on a data sheet is a percentage of.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum FullScaleBasis {
    /// The top of the range: the larger of |low| and |high|.
    #[default]
    FullScale,
    /// The whole range: high − low.
    Range,
}

impl FullScaleBasis {
    /// Read `full-scale` (also `fs`) or `range` (also `span`).
    pub fn parse(text: &str) -> Result<FullScaleBasis> {
        match text.trim().to_lowercase().as_str() {
            "full-scale" | "fs" | "full scale" => Ok(FullScaleBasis::FullScale),
            "range" | "span" => Ok(FullScaleBasis::Range),
            other => Err(FieldError::new(
                "of",
                format!("'{other}' is not a basis; use full-scale or range"),
            )),
        }
    }

    /// The stable machine name.
    pub fn as_str(self) -> &'static str {
        match self {
            FullScaleBasis::FullScale => "full-scale",
            FullScaleBasis::Range => "range",
        }
    }
}

/// A reference's accuracy as its data sheet states it: ± (% of reading + % of full scale
/// or of range + a fixed amount in the reference's unit).
#[derive(Debug, Clone, Copy, PartialEq, Default, Serialize, Deserialize)]
pub struct ReferenceAccuracy {
    /// ± % of reading.
    #[serde(default)]
    pub percent_of_reading: f64,
    /// ± % of full scale (or of range, per `basis`).
    #[serde(default)]
    pub percent_of_full_scale: f64,
    /// What `percent_of_full_scale` is a percentage of.
    #[serde(default)]
    pub basis: FullScaleBasis,
    /// ± a fixed amount, in the reference's unit (digits, a floor).
    #[serde(default)]
    pub fixed: f64,
}

/// A reference instrument as the store keeps it.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Reference {
    /// Its asset number or serial, as on its label; the key it is found by.
    pub id: String,
    /// What it is ("pressure module, 0–10 bar").
    #[serde(default)]
    pub description: String,
    /// The unit of its range and readings (`bar`, `mA`); what it measures follows from it.
    pub unit: String,
    /// Low end of its range, in `unit`.
    pub range_low: f64,
    /// High end of its range, in `unit`.
    pub range_high: f64,
    /// Its accuracy.
    pub accuracy: ReferenceAccuracy,
    /// The date its own calibration falls due.
    pub calibration_due: NaiveDate,
}

impl Reference {
    /// Check the fields; the error names the first wrong one.
    pub fn validate(&self) -> Result<()> {
        let id = self.id.trim();
        if id.is_empty() {
            return Err(FieldError::new(
                "id",
                "is empty; give the reference's asset number",
            ));
        }
        if id.chars().count() > MAX_ID_CHARS || id.chars().any(char::is_control) {
            return Err(FieldError::new(
                "id",
                format!("must be 1 to {MAX_ID_CHARS} characters without control characters"),
            ));
        }
        if self.description.chars().count() > MAX_DESCRIPTION_CHARS
            || self.description.chars().any(char::is_control)
        {
            return Err(FieldError::new(
                "description",
                format!("must be {MAX_DESCRIPTION_CHARS} characters or fewer, on one line"),
            ));
        }
        if self.unit.trim().is_empty() {
            return Err(FieldError::new(
                "unit",
                "is empty; give the unit of its range (bar, mA, °C …)",
            ));
        }
        finite("range (low)", self.range_low)?;
        finite("range (high)", self.range_high)?;
        if self.range_high <= self.range_low {
            return Err(FieldError::new(
                "range",
                format!(
                    "the high end ({}) must be above the low end ({})",
                    crate::display::quoted(self.range_high),
                    crate::display::quoted(self.range_low)
                ),
            ));
        }
        let a = &self.accuracy;
        crate::error::within("reading", a.percent_of_reading, 0.0, 100.0)?;
        crate::error::within("full-scale", a.percent_of_full_scale, 0.0, 100.0)?;
        non_negative("fixed", a.fixed)?;
        if a.percent_of_reading == 0.0 && a.percent_of_full_scale == 0.0 && a.fixed == 0.0 {
            return Err(FieldError::new(
                "accuracy",
                "is zero; give the data sheet's ± % of reading, % of full scale and/or fixed amount",
            ));
        }
        Ok(())
    }

    /// What `percent_of_full_scale` is taken of, in `unit`.
    pub fn full_scale(&self) -> f64 {
        match self.accuracy.basis {
            FullScaleBasis::FullScale => self.range_low.abs().max(self.range_high.abs()),
            FullScaleBasis::Range => self.range_high - self.range_low,
        }
    }

    /// ± its accuracy at `reading` (in `unit`), in `unit`.
    pub fn accuracy_at(&self, reading: f64) -> f64 {
        let a = &self.accuracy;
        a.percent_of_reading / 100.0 * reading.abs()
            + a.percent_of_full_scale / 100.0 * self.full_scale()
            + a.fixed
    }

    /// Days its calibration was past due on `date` (`None` when it was not).
    pub fn days_past_due(&self, date: NaiveDate) -> Option<i64> {
        (date > self.calibration_due).then(|| (date - self.calibration_due).num_days())
    }

    /// Whether `id` names this reference (ids match without regard to case).
    pub fn is(&self, id: &str) -> bool {
        self.id.trim().eq_ignore_ascii_case(id.trim())
    }
}
