//! What a tag's sensor is, and what an input applied at the transmitter means for it.
//!
//! A temperature loop is checked by putting a known resistance (RTD) or millivolt signal
//! (thermocouple) on the transmitter's input; a DP level loop by applying a known pressure.
//! A tag that knows its sensor turns that applied input into the measured variable in the
//! tag's own range unit, so the loop check can compute the current to expect:
//!
//! - RTD: ohms applied at the transmitter's input terminals → °C by IEC 60751
//!   (Callendar–Van Dusen);
//! - thermocouple: mV at the input, with the transmitter's cold junction at `cj_c`, →
//!   °C by NIST ITS-90 (t = E⁻¹(E + E(t_cj)));
//! - DP level: applied ΔP → level from the tank's geometry and liquid.

use crate::error::{non_negative, FieldError, Result};
use crate::level::{self, LevelSetup};
use crate::rtd::{Rtd, RtdKind, Wiring};
use crate::thermocouple::{self, TcType};
use crate::units;
use serde::{Deserialize, Serialize};

/// The sensor behind a tag's transmitter.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "kebab-case")]
pub enum Sensor {
    /// A platinum RTD (IEC 60751).
    Rtd {
        /// Pt100, Pt500 or Pt1000.
        element: RtdKind,
        /// How it is wired to the transmitter.
        wiring: Wiring,
        /// Resistance of both leads in series, Ω (matters for 2-wire only).
        #[serde(default)]
        lead_ohms: f64,
    },
    /// A thermocouple (NIST ITS-90 reference functions).
    Thermocouple {
        /// Letter type.
        tc: TcType,
        /// Temperature of the transmitter's cold (reference) junction, °C.
        cj_c: f64,
    },
    /// A DP level measurement.
    DpLevel {
        /// The tank, liquid and piping.
        setup: LevelSetup,
    },
}

/// What an applied input means: the measured variable in the tag's range unit.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct AppliedMeaning {
    /// The measured variable in the sensor's own SI-ish unit (°C, or m of level).
    pub measured: f64,
    /// Unit of `measured` (`°C` or `m`).
    pub measured_unit: &'static str,
    /// The same in the tag's range unit.
    pub in_range_unit: f64,
}

impl Sensor {
    /// The unit the technician applies at the transmitter's input for this sensor
    /// (`Ω`, `mV` or `Pa`).
    pub fn applied_unit(&self) -> &'static str {
        match self {
            Sensor::Rtd { .. } => "Ω",
            Sensor::Thermocouple { .. } => "mV",
            Sensor::DpLevel { .. } => "Pa",
        }
    }

    /// What `applied` (in [`Sensor::applied_unit`]) means in the tag's `range_unit`.
    pub fn measured_from_applied(&self, applied: f64, range_unit: &str) -> Result<AppliedMeaning> {
        let (measured, measured_unit) = match *self {
            Sensor::Rtd {
                element, lead_ohms, ..
            } => {
                // Ohms are applied at the transmitter's input terminals, where the leads are
                // out of circuit; `lead_ohms` only says what a 2-wire run adds in service.
                non_negative("lead_ohms", lead_ohms)?;
                let t = Rtd::standard(element)
                    .temp_c_at(applied)
                    .map_err(|e| e.renamed("applied"))?;
                (t, "°C")
            }
            Sensor::Thermocouple { tc, cj_c } => {
                let t = thermocouple::temp_c_from_measured(tc, applied, cj_c).map_err(|e| {
                    if e.field == "measured_mv" {
                        e.renamed("applied")
                    } else {
                        e
                    }
                })?;
                (t, "°C")
            }
            Sensor::DpLevel { setup } => {
                let h = level::level_from_dp(&setup, applied).map_err(|e| e.renamed("applied"))?;
                (h, "m")
            }
        };
        let in_range_unit = to_range_unit(measured, measured_unit, range_unit)?;
        Ok(AppliedMeaning {
            measured,
            measured_unit,
            in_range_unit,
        })
    }

    /// The input to apply at the transmitter for a value `in_range_unit` of the tag's range
    /// (ohms for an RTD, mV for a thermocouple with its cold junction, Pa for DP level).
    pub fn applied_for(&self, value: f64, range_unit: &str) -> Result<f64> {
        let own_unit = match self {
            Sensor::DpLevel { .. } => "m",
            _ => "°C",
        };
        let v = from_range_unit(value, range_unit, own_unit)?;
        match *self {
            Sensor::Rtd { element, .. } => Rtd::standard(element).ohms_at(v),
            Sensor::Thermocouple { tc, cj_c } => thermocouple::source_mv(tc, v, cj_c),
            Sensor::DpLevel { setup } => level::dp_at_level(&setup, v),
        }
    }
}

fn to_range_unit(value: f64, own: &str, range_unit: &str) -> Result<f64> {
    units::convert(value, own, range_unit).map_err(|_| {
        FieldError::new(
            "unit",
            format!("the tag's range unit '{range_unit}' is not a unit of the sensor's {own}"),
        )
    })
}

fn from_range_unit(value: f64, range_unit: &str, own: &str) -> Result<f64> {
    units::convert(value, range_unit, own).map_err(|_| {
        FieldError::new(
            "unit",
            format!("the tag's range unit '{range_unit}' is not a unit of the sensor's {own}"),
        )
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn pt100_at_100c_in_fahrenheit() {
        // IEC 60751:2008 table: 100 °C → 138.5055 Ω.
        let s = Sensor::Rtd {
            element: RtdKind::Pt100,
            wiring: Wiring::ThreeWire,
            lead_ohms: 0.0,
        };
        let m = s.measured_from_applied(138.5055, "°F").unwrap();
        assert!((m.measured - 100.0).abs() < 1e-3);
        assert!((m.in_range_unit - 212.0).abs() < 2e-3);
        assert!((s.applied_for(100.0, "°C").unwrap() - 138.5055).abs() < 1e-4);
    }

    #[test]
    fn type_k_with_cold_junction() {
        // NIST Monograph 175, type K: E(400 °C) = 16.397 mV, E(18 °C) = 0.718 mV.
        let s = Sensor::Thermocouple {
            tc: TcType::K,
            cj_c: 18.0,
        };
        let mv = s.applied_for(400.0, "°C").unwrap();
        assert!((mv - (16.397 - 0.718)).abs() < 0.002);
        let m = s.measured_from_applied(mv, "°C").unwrap();
        assert!((m.measured - 400.0).abs() < 1e-6);
    }

    #[test]
    fn a_pressure_range_unit_is_refused_for_a_temperature_sensor() {
        let s = Sensor::Thermocouple {
            tc: TcType::K,
            cj_c: 20.0,
        };
        assert_eq!(
            s.measured_from_applied(1.0, "bar").unwrap_err().field,
            "unit"
        );
    }
}
