//! The reference-instrument form: id, description, unit, range, accuracy as the data
//! sheet gives it, calibration due date, as typed, read into a
//! [`Reference`] the same way by the command line (`loopside ref add|edit`) and the app.
//! Numbers are read by [`crate::number`] (`0,05` works); the fixed amount may carry a
//! unit of the reference's quantity (`0.5 mbar` on a bar module). Errors name the field:
//! `id`, `description`, `unit`, `range`, `reading`, `full-scale`, `of`, `fixed`, `due`.

use crate::calibration::reference::{FullScaleBasis, Reference, ReferenceAccuracy};
use crate::error::{FieldError, Result};
use crate::number::{parse_in, parse_number, parse_range};

/// The fields as typed; `None` leaves a field as it is when editing (and is an error for
/// the fields a new reference needs: id, unit, range, due).
#[derive(Debug, Clone, Copy, Default, PartialEq, Eq)]
pub struct ReferenceText<'a> {
    /// Asset number or serial.
    pub id: Option<&'a str>,
    /// What it is.
    pub description: Option<&'a str>,
    /// The unit of its range (`bar`, `mA`).
    pub unit: Option<&'a str>,
    /// Its range, `LOW..HIGH` (`0..10`, `-1..10`).
    pub range: Option<&'a str>,
    /// ± % of reading.
    pub reading: Option<&'a str>,
    /// ± % of full scale (or of range).
    pub full_scale: Option<&'a str>,
    /// What the full-scale part is of: `full-scale` or `range`.
    pub of: Option<&'a str>,
    /// ± a fixed amount, in the unit (a suffix of the same quantity is converted).
    pub fixed: Option<&'a str>,
    /// Calibration due date, `YYYY-MM-DD`.
    pub due: Option<&'a str>,
}

/// A date as typed, `YYYY-MM-DD`; the error names `field`.
fn parse_date(field: &str, text: &str) -> Result<chrono::NaiveDate> {
    chrono::NaiveDate::parse_from_str(text.trim(), "%Y-%m-%d").map_err(|_| {
        FieldError::new(
            field,
            format!("'{}' is not a date; write it as YYYY-MM-DD", text.trim()),
        )
    })
}

/// A percentage as typed (`0,025`, `0.025 %`).
fn percent(field: &str, text: &str) -> Result<f64> {
    parse_in(field, text, "%")
}

/// A new reference from the form; id, unit, range and due date are needed, the accuracy
/// parts default to zero (at least one must be given).
pub fn new_reference(text: ReferenceText<'_>) -> Result<Reference> {
    let need = |field: &str, value: Option<&str>, what: &str| match value {
        Some(v) if !v.trim().is_empty() => Ok(()),
        _ => Err(FieldError::new(field, format!("is needed: {what}"))),
    };
    need("id", text.id, "the reference's asset number")?;
    need("unit", text.unit, "the unit of its range (bar, mA, °C …)")?;
    need("range", text.range, "its range as LOW..HIGH, e.g. 0..10")?;
    need(
        "due",
        text.due,
        "the date its calibration falls due, YYYY-MM-DD",
    )?;
    let blank = Reference {
        id: String::new(),
        description: String::new(),
        unit: String::new(),
        range_low: 0.0,
        range_high: 1.0,
        accuracy: ReferenceAccuracy::default(),
        calibration_due: chrono::NaiveDate::MIN,
    };
    edited(&blank, text)
}

/// `here` with the fields given in `text` changed, checked.
pub fn edited(here: &Reference, text: ReferenceText<'_>) -> Result<Reference> {
    let mut r = here.clone();
    if let Some(id) = text.id {
        r.id = id.trim().to_string();
    }
    if let Some(d) = text.description {
        r.description = d.trim().to_string();
    }
    if let Some(u) = text.unit {
        r.unit = crate::units::EngUnit::parse(u).symbol().to_string();
    }
    if let Some(range) = text.range {
        let (low, high) = parse_range("range", range)?;
        r.range_low = low;
        r.range_high = high;
    }
    if let Some(t) = text.reading {
        r.accuracy.percent_of_reading = percent("reading", t)?;
    }
    if let Some(t) = text.full_scale {
        r.accuracy.percent_of_full_scale = percent("full-scale", t)?;
    }
    if let Some(t) = text.of {
        r.accuracy.basis = FullScaleBasis::parse(t)?;
    }
    if let Some(t) = text.fixed {
        r.accuracy.fixed = if crate::units::lookup(&r.unit).is_some() {
            parse_in("fixed", t, &r.unit)?
        } else {
            parse_number("fixed", t)?
        }
        .abs();
    }
    if let Some(t) = text.due {
        r.calibration_due = parse_date("due", t)?;
    }
    r.validate()?;
    Ok(r)
}
