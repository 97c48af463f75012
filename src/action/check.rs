//! Save a loop check to a tag's log, in the one payload shape of the `loop-check` kind.
//!
//! # Payload, version 2
//!
//! The [`CheckResult`] as serialized (points, errors, verdict `pass`, the before-you-leave
//! list...), plus:
//! - `payload_version`: `2` ([`PAYLOAD_VERSION`]);
//! - `sensor`: the sensor the applied values were the input of, as a tag stores it
//!   (`{"kind": "rtd", "element": "pt100", ...}`), only when there was one;
//! - `sensor_inputs`: `{"unit": "Ω", "values": [...]}`, what was applied to the
//!   transmitter's terminals at each point, only when there was a sensor.
//!
//! Older records (no `payload_version`) came in two shapes: the command line's, with
//! `sensor_inputs` only, and the app's, with `sensor` only. Records are never rewritten
//! (an import keeps them as they came); [`sensor_of`] and [`sensor_inputs_of`] read all
//! three shapes.

use super::initials;
use crate::check::{CheckResult, Stage};
use crate::error::FieldError;
use crate::journal::{Entry, EntryId, Kind};
use crate::sensor::Sensor;
use crate::store::{Store, StoreError};
use chrono::{DateTime, FixedOffset};
use serde::{Deserialize, Serialize};
use std::fmt;

/// The version of the loop-check payload written now.
pub const PAYLOAD_VERSION: u64 = 2;

/// What was applied to a transmitter's sensor input at each point of a check.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct SensorInputs {
    /// The sensor the values are the input of.
    #[serde(skip)]
    pub sensor: Option<Sensor>,
    /// Their unit: `Ω`, `mV` or `Pa` ([`Sensor::applied_unit`]).
    pub unit: String,
    /// One value per point, in test order.
    pub values: Vec<f64>,
}

impl SensorInputs {
    /// The inputs as applied at the planned points of `result` to `sensor` (the app's
    /// check applies what its table says): each point's engineering value turned into the
    /// sensor's input. The error names `sensor` when a point is outside what the sensor
    /// can give.
    pub fn planned(sensor: Sensor, result: &CheckResult) -> Result<SensorInputs, FieldError> {
        let values = result
            .points
            .iter()
            .map(|p| sensor.applied_for(p.applied, &result.scale.unit))
            .collect::<Result<Vec<f64>, FieldError>>()
            .map_err(|e| e.renamed("sensor"))?;
        Ok(SensorInputs {
            sensor: Some(sensor),
            unit: sensor.applied_unit().to_string(),
            values,
        })
    }
}

/// A loop check to save.
#[derive(Debug, Clone)]
pub struct NewCheck<'a> {
    /// Tag number.
    pub tag: &'a str,
    /// Initials as typed (upper-cased when stored).
    pub initials: &'a str,
    /// The judged check, with the technician's note and the before-you-leave list.
    pub result: &'a CheckResult,
    /// What was applied to the sensor input, when the applied values were a sensor's.
    pub sensor: Option<SensorInputs>,
}

/// A loop check saved.
#[derive(Debug, Clone, PartialEq)]
pub struct CheckSaved {
    /// The new entry's id.
    pub id: EntryId,
    /// The tag's number.
    pub tag: String,
    /// As found or as left.
    pub stage: Stage,
    /// Whether every point was within tolerance.
    pub pass: bool,
}

impl fmt::Display for CheckSaved {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "Saved the {} check as {}.", self.stage.label(), self.id)
    }
}

/// The payload of a loop-check entry (version [`PAYLOAD_VERSION`]; see the module).
pub fn payload(
    result: &CheckResult,
    sensor: Option<&SensorInputs>,
) -> Result<serde_json::Value, FieldError> {
    let cannot = |e: serde_json::Error| FieldError::new("check", format!("cannot be written: {e}"));
    let mut value = serde_json::to_value(result).map_err(cannot)?;
    value["payload_version"] = serde_json::json!(PAYLOAD_VERSION);
    if let Some(s) = sensor {
        if let Some(kind) = &s.sensor {
            value["sensor"] = serde_json::to_value(kind).map_err(cannot)?;
        }
        value["sensor_inputs"] = serde_json::json!({ "unit": s.unit, "values": s.values });
    }
    Ok(value)
}

/// Save a judged loop check to the tag's log; returns the entry id once durable.
pub fn save_check(
    store: &mut dyn Store,
    now: DateTime<FixedOffset>,
    check: NewCheck<'_>,
) -> Result<CheckSaved, StoreError> {
    let who = initials(check.initials)?;
    let record = store.require_tag(check.tag)?;
    let (tag_id, number) = (record.id.clone(), record.tag.number.clone());
    let mut entry = Entry::new(
        &tag_id,
        now,
        &who,
        Kind::LoopCheck,
        &crate::view::wording::check::log_text(check.result),
    )?;
    entry.payload = Some(payload(check.result, check.sensor.as_ref())?);
    let id = store.append(entry)?;
    Ok(CheckSaved {
        id,
        tag: number,
        stage: check.result.stage,
        pass: check.result.pass,
    })
}

/// The sensor a loop-check payload names, in any of its shapes: `sensor` (version 2 and
/// the app's older records). The command line's older records do not name it: `None`.
pub fn sensor_of(payload: &serde_json::Value) -> Option<Sensor> {
    serde_json::from_value(payload.get("sensor")?.clone()).ok()
}

/// What was applied to the sensor at each point, from a loop-check payload in any of its
/// shapes: `sensor_inputs` (version 2 and the command line's older records), else worked
/// out from `sensor` and the points (the app's older records, whose check applied the
/// planned values). `None` when the check applied engineering values directly.
pub fn sensor_inputs_of(payload: &serde_json::Value) -> Option<SensorInputs> {
    let sensor = sensor_of(payload);
    if let Some(inputs) = payload.get("sensor_inputs") {
        let mut s: SensorInputs = serde_json::from_value(inputs.clone()).ok()?;
        s.sensor = sensor;
        return Some(s);
    }
    let result: CheckResult = serde_json::from_value(payload.clone()).ok()?;
    SensorInputs::planned(sensor?, &result).ok()
}
