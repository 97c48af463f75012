//! The trip-test form: setpoint, direction, trip and reset values, tolerance, as typed,
//! read into a judged [`TripResult`] the same way by the command line (`loopside trip`)
//! and the app. Numbers are read by [`crate::number`] (`12,5` works; a list with `;` may
//! use decimal commas); the setpoint may carry a unit of the value's quantity
//! (`850 kPa` on a bar loop). Errors name the field: `setpoint`, `direction`,
//! `trip-at[2]`, `reset-at`, `tolerance`.

use crate::calibration::trip::{TripDirection, TripResult, TripTest};
use crate::error::{FieldError, Result};
use crate::number::{parse_in, parse_list};
use crate::tag::Tag;
use chrono::NaiveDate;

/// The trip-test fields as typed.
#[derive(Debug, Clone, Copy, Default, PartialEq, Eq)]
pub struct TripText<'a> {
    /// The setpoint, in the value's unit (a suffix of the same quantity is converted).
    pub setpoint: &'a str,
    /// `rising` or `falling`.
    pub direction: &'a str,
    /// Trip values, one per run: `3.02, 3.01` or `3,02; 3,01`.
    pub trip_at: &'a str,
    /// Reset values, one per run.
    pub reset_at: &'a str,
    /// ± % of span; empty takes the tag's tolerance.
    pub tolerance: &'a str,
    /// A note (may be empty).
    pub note: &'a str,
}

/// Read the form for `tag` on `date` and judge the runs.
pub fn judge(tag: &Tag, date: NaiveDate, text: TripText<'_>) -> Result<TripResult> {
    let unit = tag.scale.value_unit().to_string();
    if text.setpoint.trim().is_empty() {
        return Err(FieldError::new(
            "setpoint",
            format!("is empty; give the trip's setpoint in {unit}"),
        ));
    }
    let setpoint = if crate::units::lookup(&unit).is_some() {
        parse_in("setpoint", text.setpoint, &unit)?
    } else {
        crate::number::parse_number("setpoint", text.setpoint)?
    };
    let direction = TripDirection::parse(text.direction)?;
    let tolerance = if text.tolerance.trim().is_empty() {
        tag.tolerance_percent
    } else {
        parse_in("tolerance", text.tolerance, "%")?
    };
    if text.trip_at.trim().is_empty() {
        return Err(FieldError::new(
            "trip-at",
            "is empty; give the value at which it tripped, one per run",
        ));
    }
    if text.reset_at.trim().is_empty() {
        return Err(FieldError::new(
            "reset-at",
            "is empty; give the value at which it reset, one per run",
        ));
    }
    let trips = parse_list("trip-at", text.trip_at)?;
    let resets = parse_list("reset-at", text.reset_at)?;
    TripTest::new(&tag.scale, date, setpoint, direction, tolerance)
        .tag_number(&tag.number)
        .note(text.note)
        .run(&trips, &resets)
}
