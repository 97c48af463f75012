//! The measurements a fault-finding step can ask for: a fixed catalogue with units.
//!
//! Procedure files name measurements by their key (`tx_ma`, `terminal_v` …); the key, the
//! question put to the technician, the unit and the range of values accepted live here, in
//! Rust, so that every procedure asks for the same quantity the same way and every
//! evaluation knows what it receives.

use crate::display;
use crate::error::{FieldError, Result};
use crate::number::parse_in;
use crate::tag::Tag;
use serde::{Deserialize, Serialize};

/// One quantity a step can ask the technician to measure or read.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Hash, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Measurement {
    /// Loop current measured at the transmitter, mA.
    TxMa,
    /// Loop current measured at the receiver end of the cable, mA.
    RxMa,
    /// Loop supply voltage at the supply terminals, V DC.
    SupplyV,
    /// Voltage across the transmitter's terminals, V DC.
    TerminalV,
    /// Voltage across the receiver's input resistor, V DC.
    ResistorV,
    /// The receiver input resistor's value (marking or drawing), Ω.
    ResistorOhms,
    /// Loop resistance with the power off and the transmitter disconnected, Ω.
    LoopOhms,
    /// AC voltage from the cable shield to earth, V AC.
    ShieldAcV,
    /// Peak-to-peak swing of the loop current over about half a minute, mA.
    SwingMa,
    /// The value the receiver (indicator, PLC, DCS) displays, in the tag's unit.
    Displayed,
    /// The value the control system shows for the same loop, in the tag's unit.
    ControlValue,
    /// The true process value (applied by a calibrator, or read on a trusted local gauge),
    /// in the tag's range unit.
    ProcessValue,
    /// The demand the control system sends to an output (its output value), % of the
    /// output span.
    DemandPct,
    /// Loop current measured at the field device an output drives (positioner, I/P
    /// converter, indicator), mA.
    DeviceMa,
    /// Voltage across a current source's output terminals (an analog output channel, or a
    /// four-wire transmitter's output), V DC.
    SourceV,
}

/// Every measurement, in catalogue order.
pub const ALL: [Measurement; 15] = [
    Measurement::TxMa,
    Measurement::RxMa,
    Measurement::SupplyV,
    Measurement::TerminalV,
    Measurement::ResistorV,
    Measurement::ResistorOhms,
    Measurement::LoopOhms,
    Measurement::ShieldAcV,
    Measurement::SwingMa,
    Measurement::Displayed,
    Measurement::ControlValue,
    Measurement::ProcessValue,
    Measurement::DemandPct,
    Measurement::DeviceMa,
    Measurement::SourceV,
];

impl Measurement {
    /// The key used in procedure and answer files.
    pub fn key(self) -> &'static str {
        match self {
            Measurement::TxMa => "tx_ma",
            Measurement::RxMa => "rx_ma",
            Measurement::SupplyV => "supply_v",
            Measurement::TerminalV => "terminal_v",
            Measurement::ResistorV => "resistor_v",
            Measurement::ResistorOhms => "resistor_ohms",
            Measurement::LoopOhms => "loop_ohms",
            Measurement::ShieldAcV => "shield_ac_v",
            Measurement::SwingMa => "swing_ma",
            Measurement::Displayed => "displayed",
            Measurement::ControlValue => "control_value",
            Measurement::ProcessValue => "process_value",
            Measurement::DemandPct => "demand_pct",
            Measurement::DeviceMa => "device_ma",
            Measurement::SourceV => "source_v",
        }
    }

    /// Look a key up.
    pub fn from_key(key: &str) -> Option<Measurement> {
        ALL.into_iter().find(|m| m.key() == key.trim())
    }

    /// The question put to the technician.
    pub fn label(self) -> &'static str {
        match self {
            Measurement::TxMa => "Loop current at the transmitter",
            Measurement::RxMa => "Loop current at the receiver",
            Measurement::SupplyV => "Supply voltage at the supply terminals (DC)",
            Measurement::TerminalV => "Voltage across the transmitter terminals (DC)",
            Measurement::ResistorV => "Voltage across the receiver's input resistor (DC)",
            Measurement::ResistorOhms => "Value of the receiver's input resistor",
            Measurement::LoopOhms => {
                "Loop resistance, power off, transmitter disconnected (measured from the transmitter end)"
            }
            Measurement::ShieldAcV => "AC voltage from the cable shield to earth",
            Measurement::SwingMa => {
                "How far the loop current swings, highest minus lowest over about 30 s"
            }
            Measurement::Displayed => "Value shown by the receiver (indicator or PLC)",
            Measurement::ControlValue => "Value shown by the control system for this loop",
            Measurement::ProcessValue => {
                "True process value (applied with a calibrator or read on a trusted gauge)"
            }
            Measurement::DemandPct => "Output demand the control system sends now (its output value)",
            Measurement::DeviceMa => "Loop current at the field device (positioner, I/P converter)",
            Measurement::SourceV => {
                "Voltage across the current source's output terminals (output channel or four-wire transmitter, DC)"
            }
        }
    }

    /// The unit the answer is in: a fixed unit, or the tag's unit for process values.
    pub fn unit(self, tag: &Tag) -> String {
        match self {
            Measurement::TxMa
            | Measurement::RxMa
            | Measurement::SwingMa
            | Measurement::DeviceMa => "mA".to_string(),
            Measurement::DemandPct => "%".to_string(),
            Measurement::SupplyV
            | Measurement::TerminalV
            | Measurement::ResistorV
            | Measurement::ShieldAcV
            | Measurement::SourceV => "V".to_string(),
            Measurement::ResistorOhms | Measurement::LoopOhms => "Ω".to_string(),
            Measurement::Displayed | Measurement::ControlValue => {
                tag.scale.value_unit().to_string()
            }
            Measurement::ProcessValue => tag.scale.unit.clone(),
        }
    }

    /// The values accepted, in the answer's unit (None = any finite number).
    pub fn limits(self) -> Option<(f64, f64)> {
        match self {
            Measurement::TxMa | Measurement::RxMa | Measurement::DeviceMa => Some((0.0, 50.0)),
            // An output's demand may run a little past its span (over-range, common
            // practice about −2.5 % to 102.5 %); ±25 % covers any configuration.
            Measurement::DemandPct => Some((-25.0, 125.0)),
            Measurement::SwingMa => Some((0.0, 50.0)),
            Measurement::SupplyV
            | Measurement::TerminalV
            | Measurement::ResistorV
            | Measurement::SourceV => Some((0.0, 1000.0)),
            Measurement::ShieldAcV => Some((0.0, 1000.0)),
            Measurement::ResistorOhms => Some((0.001, 1.0e6)),
            Measurement::LoopOhms => Some((0.0, 1.0e9)),
            Measurement::Displayed | Measurement::ControlValue | Measurement::ProcessValue => None,
        }
    }

    /// Check a value for this measurement; the error names the key and the allowed range.
    pub fn accept(self, value: f64) -> Result<f64> {
        let v = crate::error::finite(self.key(), value)?;
        if let Some((lo, hi)) = self.limits() {
            if v < lo || v > hi {
                let hint = if v < 0.0 {
                    "; a minus sign on the meter means its leads are reversed: give the magnitude and note the polarity"
                } else {
                    ""
                };
                return Err(FieldError::new(
                    self.key(),
                    format!(
                        "must be between {} and {}, got {}{hint}",
                        display::quoted(lo),
                        display::quoted(hi),
                        display::quoted(v)
                    ),
                ));
            }
        }
        Ok(v)
    }

    /// Read an answer as typed (`9,0`, `9 V`, `250 ohm`) for this measurement.
    pub fn parse(self, tag: &Tag, text: &str) -> Result<f64> {
        let unit = self.unit(tag);
        let value = if crate::units::lookup(&unit).is_some() {
            parse_in(self.key(), text, &unit)?
        } else {
            crate::number::parse_number(self.key(), text)?
        };
        self.accept(value)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn keys_round_trip() {
        for m in ALL {
            assert_eq!(Measurement::from_key(m.key()), Some(m));
            let json = serde_json::to_string(&m).unwrap();
            assert_eq!(json, format!("\"{}\"", m.key()));
        }
    }
}
