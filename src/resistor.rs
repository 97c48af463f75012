//! The sense resistor: turning loop current into volts for a voltage input.
//!
//! A 250 Ω resistor turns 4–20 mA into 1–5 V (common practice). The receiver measures the
//! volts and assumes the nominal resistance, so a resistor that is off by its tolerance
//! reads every current off by the same fraction: the error grows toward 20 mA. The power it
//! dissipates matters for its rating: 250 Ω at 22 mA is 0.12 W.

use crate::error::{finite, non_negative, positive, Result};
use crate::scale::SignalSpan;
use serde::Serialize;

/// The resistor at one loop current.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct SensePoint {
    /// Loop current, mA.
    pub current_ma: f64,
    /// Volts across the nominal resistor.
    pub volts: f64,
    /// Power dissipated, W.
    pub watts: f64,
    /// Worst-case reading error from the resistor's tolerance, mA.
    pub error_ma: f64,
    /// The same as a percent of the signal span.
    pub error_percent_of_span: f64,
}

/// A sense resistor worked at the points a technician cares about.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct SenseResistor {
    /// Nominal resistance, Ω.
    pub ohms: f64,
    /// Tolerance, ± %.
    pub tolerance_percent: f64,
    /// At 0 %, 50 %, 100 % of span and at the fault current.
    pub points: Vec<SensePoint>,
}

/// Volts across `ohms` at `ma`: V = I·R.
pub fn volts_at(ohms: f64, ma: f64) -> f64 {
    ohms * ma / 1000.0
}

/// Loop current from volts across a known resistor: I = V / R, in mA.
pub fn ma_from_volts(volts: f64, ohms: f64) -> Result<f64> {
    let v = finite("volts", volts)?;
    let r = positive("ohms", ohms)?;
    Ok(v / r * 1000.0)
}

/// Work a sense resistor over the span and at `fault_ma`.
pub fn sense_resistor(
    ohms: f64,
    tolerance_percent: f64,
    span: &SignalSpan,
    fault_ma: f64,
) -> Result<SenseResistor> {
    let r = positive("ohms", ohms)?;
    let tol = non_negative("tolerance", tolerance_percent)?;
    let fault = finite("fault_ma", fault_ma)?;
    let currents = [span.low_ma, span.ma_at(50.0), span.high_ma, fault];
    let points = currents
        .iter()
        .map(|&ma| {
            let error_ma = ma * tol / 100.0;
            SensePoint {
                current_ma: ma,
                volts: volts_at(r, ma),
                watts: (ma / 1000.0) * (ma / 1000.0) * r,
                error_ma,
                error_percent_of_span: error_ma / span.width_ma() * 100.0,
            }
        })
        .collect();
    Ok(SenseResistor {
        ohms: r,
        tolerance_percent: tol,
        points,
    })
}
