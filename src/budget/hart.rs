//! HART's cable limit by the loop's RC time constant.
//!
//! Besides its resistance window, HART needs the loop's RC time constant, the resistance
//! the HART signal sees times the capacitance across the pair, to stay at or below
//! 65 µs, or the 1200/2200 Hz FSK signal is rounded off (HART FSK physical layer,
//! HCF_SPEC-54; the 65 µs figure and the formula below are the ones field-device manuals
//! reproduce in their HART wiring sections, for example the published
//! L = 65×10⁶ / (R·C) − (Cf + 10 000) / C, with L in m, R in Ω, C the cable's pF/m and
//! Cf the field devices' pF, and a level switch manual's t = (R_sense + R_cable·L) ×
//! (C_device + C_cable·L) ≤ 65 µs).
//!
//! Here R is the loop resistance the HART signal sees: every resistive element in series
//! (the sense resistor, a barrier) plus both conductors of the cable; fixed volt drops
//! (indicators, diodes) are not counted as resistance. C is the cable's capacitance per
//! metre × its one-way length plus the devices' capacitance; when the devices' figure is
//! not given, 10 nF is used, the allowance the published formula makes for a host and one
//! field device (5000 pF each for a capacitance number of 1, as the same manuals state).
//! With the cable's own resistance counted, R and C both grow with the length, so the
//! longest cable is the positive root of (R₀ + r·L)(C₀ + c·L) = 65 µs.

use crate::error::{within, Result};
use serde::{Deserialize, Serialize};

/// Largest RC time constant HART allows, s (HART FSK physical layer: 65 µs).
pub const MAX_TIME_CONSTANT_S: f64 = 65e-6;
/// Devices' capacitance used when not given, nF (the published formula's 10 000 pF for a
/// host and one field device).
pub const DEFAULT_DEVICES_NF: f64 = 10.0;

/// The cable and devices' capacitance, as entered for HART.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct HartCable {
    /// Cable capacitance, pF per metre (conductor to conductor and screen, from the
    /// cable's data sheet).
    pub cable_pf_per_m: f64,
    /// The devices' capacitance across the pair, nF; `None`: [`DEFAULT_DEVICES_NF`].
    #[serde(default)]
    pub devices_nf: Option<f64>,
}

impl HartCable {
    /// Check the figures; the error names the field and the allowed range.
    pub fn validate(&self) -> Result<()> {
        within("cable_pf_per_m", self.cable_pf_per_m, 1.0, 10_000.0)?;
        if let Some(nf) = self.devices_nf {
            within("devices_nf", nf, 0.0, 10_000.0)?;
        }
        Ok(())
    }
}

/// Which limit on the cable's length binds.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum Binding {
    /// HART's RC time constant allows the shorter cable.
    Hart,
    /// The voltage budget allows the shorter cable.
    Voltage,
}

/// HART's cable limit for one loop.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct HartCableLimit {
    /// Resistance the HART signal sees without the cable, Ω.
    pub fixed_ohms: f64,
    /// Both conductors of the cable, Ω per metre of route (0 when no conductor is known).
    pub cable_ohms_per_m: f64,
    /// Devices' capacitance, F.
    pub devices_farads: f64,
    /// The devices' figure is [`DEFAULT_DEVICES_NF`] because none was given.
    pub devices_is_default: bool,
    /// Cable capacitance, F per metre.
    pub cable_farads_per_m: f64,
    /// Longest one-way cable HART allows, m (`None`: no resistance at all, so RC sets no
    /// limit; the resistance window does).
    pub max_cable_m: Option<f64>,
    /// The time constant with the cable as entered, s (`None` when no cable length).
    pub time_constant_s: Option<f64>,
    /// Which limit binds, when the voltage budget gives a longest cable too.
    pub binding: Option<Binding>,
}

/// RC time constant of a loop, s: (R₀ + r·L)(C₀ + c·L).
pub fn time_constant_s(
    fixed_ohms: f64,
    ohms_per_m: f64,
    devices_farads: f64,
    farads_per_m: f64,
    length_m: f64,
) -> f64 {
    (fixed_ohms + ohms_per_m * length_m) * (devices_farads + farads_per_m * length_m)
}

/// Longest one-way cable whose time constant stays at or below [`MAX_TIME_CONSTANT_S`],
/// m: the positive root of r·c·L² + (R₀·c + r·C₀)·L + R₀·C₀ − τ = 0, written as
/// 2·(τ − R₀C₀) / (b + √(b² + 4·r·c·(τ − R₀C₀))) so it holds when r is 0 too. Zero when
/// the devices alone already exceed the limit; `None` when there is no resistance at all.
pub fn max_cable_m(
    fixed_ohms: f64,
    ohms_per_m: f64,
    devices_farads: f64,
    farads_per_m: f64,
) -> Option<f64> {
    let slack = MAX_TIME_CONSTANT_S - fixed_ohms * devices_farads;
    if slack <= 0.0 {
        return Some(0.0);
    }
    let a = ohms_per_m * farads_per_m;
    let b = fixed_ohms * farads_per_m + ohms_per_m * devices_farads;
    if b <= 0.0 {
        return None;
    }
    Some(2.0 * slack / (b + (b * b + 4.0 * a * slack).sqrt()))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn without_cable_resistance_the_root_is_the_published_formula() {
        // L = 65×10⁶/(R·C) − (Cf + 10 000)/C with R = 250 Ω, C = 100 pF/m, Cf = 0:
        // 2600 − 100 = 2500 m (published formula, worked by hand).
        let l = max_cable_m(250.0, 0.0, 10e-9, 100e-12).unwrap();
        assert!((l - 2500.0).abs() < 1e-6, "{l}");
        assert_eq!(max_cable_m(0.0, 0.0, 10e-9, 100e-12), None);
        assert_eq!(max_cable_m(10_000.0, 0.0, 10e-9, 100e-12), Some(0.0));
    }
}
