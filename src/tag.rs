//! A tag: one instrument loop as the register knows it.
//!
//! The tag number (ISA-5.1 style such as `LT-101`, but any text the plant uses) is the
//! key a technician searches by. It is user text and never becomes a file name. A tag
//! carries everything loopside needs to work on its loop: range and transfer, the signal
//! band limits, the loop's power configuration, HART, and the tolerance its checks use.

use crate::budget::LoopConfig;
use crate::error::{within, FieldError, Result};
use crate::scale::Scale;
use crate::signal::BandLimits;
use serde::{Deserialize, Serialize};

/// Longest tag number accepted, in characters.
pub const MAX_TAG_CHARS: usize = 64;
/// Check tolerance used when a tag does not say, % of span (common practice for a
/// transmitter loop: ±0.5 % of span is a usual acceptance limit; sites set their own).
pub const DEFAULT_TOLERANCE_PERCENT: f64 = 0.5;

/// One instrument loop in the register.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Tag {
    /// Tag number, e.g. `LT-101`. Unique in the register (compared exactly, after trimming).
    pub number: String,
    /// What it measures, e.g. "Inlet wet well level".
    #[serde(default)]
    pub service: String,
    /// Where it is: area, building, junction box.
    #[serde(default)]
    pub area: String,
    /// Range, transfer and signal span.
    pub scale: Scale,
    /// Where its signal bands lie (NE 43 unless the device differs).
    #[serde(default)]
    pub bands: BandLimits,
    /// The loop's power: supply, transmitter minimum, series elements, cable.
    #[serde(default)]
    pub loop_config: Option<LoopConfig>,
    /// Whether the transmitter talks HART (so the HART window matters).
    #[serde(default)]
    pub hart: bool,
    /// Acceptance tolerance for loop checks, ± % of span.
    #[serde(default = "default_tolerance")]
    pub tolerance_percent: f64,
    /// Free notes.
    #[serde(default)]
    pub notes: String,
    /// Archived tags stay in the register and their log, hidden from the working list.
    #[serde(default)]
    pub archived: bool,
    /// The sensor behind the transmitter, when known: lets a loop check take applied
    /// ohms, millivolts or pressure and compute the current to expect.
    #[serde(default)]
    pub sensor: Option<crate::sensor::Sensor>,
    /// The loop's intrinsically safe circuit (barrier or isolator, field devices, cable),
    /// when it runs into a hazardous area; `None` for an ordinary loop. Stores written
    /// before this field open unchanged.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub intrinsic: Option<crate::intrinsic::Circuit>,
    /// How often the loop is to be checked, in days (`crate::calibration::due`); `None`
    /// when the plant has not set one. Stores written before this field open unchanged.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub calibration_interval_days: Option<u32>,
    /// The control valve on an output loop (action, fail position, split-range part),
    /// when the tag drives one; `None` otherwise. Stores written before this field open
    /// unchanged.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub valve: Option<crate::valve::Valve>,
    /// For a loop through an isolator or splitter, each output side (a current source
    /// with the isolator's compliance and what it drives); the input side is
    /// `loop_config`. Empty for a loop without one.
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub isolator_outputs: Vec<LoopConfig>,
}

/// Shortest calibration interval a tag may carry, days.
pub const MIN_INTERVAL_DAYS: u32 = 1;
/// Longest calibration interval a tag may carry, days (ten years).
pub const MAX_INTERVAL_DAYS: u32 = 3653;

fn default_tolerance() -> f64 {
    DEFAULT_TOLERANCE_PERCENT
}

impl Tag {
    /// A new tag with a range and defaults for everything else.
    pub fn new(number: &str, scale: Scale) -> Result<Tag> {
        let tag = Tag {
            number: clean_number(number)?,
            service: String::new(),
            area: String::new(),
            scale,
            bands: BandLimits::default(),
            loop_config: None,
            hart: false,
            tolerance_percent: DEFAULT_TOLERANCE_PERCENT,
            notes: String::new(),
            archived: false,
            sensor: None,
            intrinsic: None,
            calibration_interval_days: None,
            valve: None,
            isolator_outputs: Vec::new(),
        };
        tag.validate()?;
        Ok(tag)
    }

    /// Check every field; the error names the first one that is wrong.
    pub fn validate(&self) -> Result<()> {
        clean_number(&self.number)?;
        // Re-validate the scale through its constructor.
        Scale::new(
            self.scale.lrv,
            self.scale.urv,
            &self.scale.unit,
            self.scale.transfer.clone(),
            self.scale.signal,
        )?;
        self.bands.validate(&self.scale.signal)?;
        within("tolerance", self.tolerance_percent, 0.0, 100.0)?;
        if self.tolerance_percent == 0.0 {
            return Err(FieldError::new(
                "tolerance",
                "must be greater than 0 % of span",
            ));
        }
        if let Some(l) = &self.loop_config {
            l.validate()?;
        }
        if let Some(c) = &self.intrinsic {
            c.validate()?;
        }
        if let Some(days) = self.calibration_interval_days {
            if !(MIN_INTERVAL_DAYS..=MAX_INTERVAL_DAYS).contains(&days) {
                return Err(FieldError::new(
                    "interval",
                    format!(
                        "{days} days is outside {MIN_INTERVAL_DAYS} to {MAX_INTERVAL_DAYS} days (one day to ten years)"
                    ),
                ));
            }
        }
        if let Some(v) = &self.valve {
            v.validate()?;
        }
        if !self.isolator_outputs.is_empty() {
            let Some(input) = &self.loop_config else {
                return Err(FieldError::new(
                    "isolator outputs",
                    "need the loop's input side as well (the transmitter to the isolator)",
                ));
            };
            crate::budget::topology::IsolatedLoop {
                input: input.clone(),
                outputs: self.isolator_outputs.clone(),
            }
            .budget()?;
        }
        for (field, text) in [("service", &self.service), ("area", &self.area)] {
            if text.chars().count() > 200 {
                return Err(FieldError::new(field, "must be 200 characters or fewer"));
            }
        }
        Ok(())
    }
}

/// Check a tag number as typed: trimmed, 1–64 characters, no control characters.
/// Any other Unicode is fine (`LT-101`, `FT 310/A`, `ΔP-7`); it is never used as a path.
pub fn clean_number(text: &str) -> Result<String> {
    let t = text.trim();
    if t.is_empty() {
        return Err(FieldError::new(
            "tag",
            "is empty; type a tag number such as LT-101",
        ));
    }
    if t.chars().any(char::is_control) {
        return Err(FieldError::new(
            "tag",
            "must not contain control characters (tabs, line breaks)",
        ));
    }
    if t.chars().count() > MAX_TAG_CHARS {
        return Err(FieldError::new(
            "tag",
            format!("must be {MAX_TAG_CHARS} characters or fewer"),
        ));
    }
    Ok(t.to_string())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn tag_numbers_are_text_not_paths() {
        let s = Scale::linear(0.0, 1.0, "m").unwrap();
        assert_eq!(Tag::new(" LT-101 ", s.clone()).unwrap().number, "LT-101");
        assert_eq!(Tag::new("../../x", s.clone()).unwrap().number, "../../x");
        assert_eq!(Tag::new("a\nb", s.clone()).unwrap_err().field, "tag");
        assert_eq!(Tag::new("", s).unwrap_err().field, "tag");
    }
}
