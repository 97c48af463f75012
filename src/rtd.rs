//! Platinum resistance thermometers (RTDs) to IEC 60751.
//!
//! Responsible for what a temperature transmitter with an RTD input should see: the
//! resistance of a Pt100, Pt500, Pt1000 or custom-R0 element at a temperature (the
//! Callendar–Van Dusen equation with the IEC 60751 coefficients), the temperature for a
//! measured resistance, whether an element is inside its tolerance class, and the error that
//! the cable adds on a 2-wire connection.
//!
//! Everything here works in °C and Ω over the standard's range −200…850 °C. Resistance →
//! temperature uses the closed-form root of the quadratic at and above 0 °C (R ≥ R0) and
//! Newton iteration on the full equation below 0 °C, converged to 1e-9 °C.

use std::fmt;
use std::str::FromStr;

use crate::display;
use crate::error::{finite, positive, FieldError, Result};
use crate::wire::{self, Conductor};
use serde::{Deserialize, Serialize};

/// Callendar–Van Dusen coefficient A (1/°C), IEC 60751.
pub const CVD_A: f64 = 3.9083e-3;
/// Callendar–Van Dusen coefficient B (1/°C²), IEC 60751.
pub const CVD_B: f64 = -5.775e-7;
/// Callendar–Van Dusen coefficient C (1/°C⁴), IEC 60751; used below 0 °C only.
pub const CVD_C: f64 = -4.183e-12;
/// Lowest temperature IEC 60751 defines the resistance–temperature relation for (°C).
pub const RTD_MIN_TEMP_C: f64 = -200.0;
/// Highest temperature IEC 60751 defines the resistance–temperature relation for (°C).
pub const RTD_MAX_TEMP_C: f64 = 850.0;

/// Stop Newton iteration once a step is smaller than this (°C).
const NEWTON_TOLERANCE_C: f64 = 1e-10;
/// Newton on the Callendar–Van Dusen equation converges in a handful of steps; this cap
/// only guards against a logic error turning into an endless loop.
const NEWTON_MAX_STEPS: usize = 100;

/// The nominal sizes a technician finds on a nameplate: R0 = 100, 500 or 1000 Ω at 0 °C.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Deserialize)]
#[serde(rename_all = "lowercase")]
pub enum RtdKind {
    /// Pt100: 100 Ω at 0 °C, the most common industrial element.
    Pt100,
    /// Pt500: 500 Ω at 0 °C.
    Pt500,
    /// Pt1000: 1000 Ω at 0 °C, common in building services and 2-wire installs.
    Pt1000,
}

impl RtdKind {
    /// Every nominal size, smallest first.
    pub const ALL: [RtdKind; 3] = [RtdKind::Pt100, RtdKind::Pt500, RtdKind::Pt1000];

    /// Resistance at 0 °C in ohms.
    pub fn r0_ohms(self) -> f64 {
        match self {
            RtdKind::Pt100 => 100.0,
            RtdKind::Pt500 => 500.0,
            RtdKind::Pt1000 => 1000.0,
        }
    }

    /// The name as printed on tags and data sheets ("Pt100").
    pub fn name(self) -> &'static str {
        match self {
            RtdKind::Pt100 => "Pt100",
            RtdKind::Pt500 => "Pt500",
            RtdKind::Pt1000 => "Pt1000",
        }
    }
}

impl fmt::Display for RtdKind {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.name())
    }
}

impl FromStr for RtdKind {
    type Err = FieldError;

    /// Accepts `pt100`, `Pt100`, `PT-100`, `pt 1000` and so on.
    fn from_str(text: &str) -> Result<RtdKind> {
        let key: String = text
            .chars()
            .filter(|c| !c.is_whitespace() && *c != '-' && *c != '_')
            .collect::<String>()
            .to_ascii_lowercase();
        match key.as_str() {
            "pt100" => Ok(RtdKind::Pt100),
            "pt500" => Ok(RtdKind::Pt500),
            "pt1000" => Ok(RtdKind::Pt1000),
            _ => Err(FieldError::new(
                "rtd_type",
                format!(
                    "'{}' is not an RTD type; use pt100, pt500 or pt1000",
                    text.trim()
                ),
            )),
        }
    }
}

/// A platinum RTD element following IEC 60751 (α = 0.00385), identified by its R0.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Rtd {
    r0_ohms: f64,
}

impl Rtd {
    /// A standard Pt100, Pt500 or Pt1000 element.
    pub fn standard(kind: RtdKind) -> Rtd {
        Rtd {
            r0_ohms: kind.r0_ohms(),
        }
    }

    /// A Pt100 (R0 = 100 Ω).
    pub fn pt100() -> Rtd {
        Rtd::standard(RtdKind::Pt100)
    }

    /// An IEC 60751 platinum element with another resistance at 0 °C (for example a
    /// Pt200, or a Pt100 whose R0 was found by calibration to be 100.04 Ω).
    pub fn custom(r0_ohms: f64) -> Result<Rtd> {
        let r0 = positive("r0_ohms", r0_ohms)?;
        if r0 > 100_000.0 {
            return Err(FieldError::new(
                "r0_ohms",
                format!(
                    "{} Ω is not a platinum RTD's R0; expected up to 100000 Ω",
                    display::quoted(r0)
                ),
            ));
        }
        Ok(Rtd { r0_ohms: r0 })
    }

    /// Resistance at 0 °C in ohms.
    pub fn r0_ohms(&self) -> f64 {
        self.r0_ohms
    }

    /// A short name for messages: "Pt100", or "Pt(R0 = 100.04 Ω)" for a custom element.
    pub fn name(&self) -> String {
        for kind in RtdKind::ALL {
            if self.r0_ohms == kind.r0_ohms() {
                return kind.name().to_string();
            }
        }
        format!("Pt(R0 = {} Ω)", display::quoted(self.r0_ohms))
    }

    /// Resistance of the element at `temp_c` (the value to source into a transmitter to
    /// simulate that temperature), by the Callendar–Van Dusen equation.
    pub fn ohms_at(&self, temp_c: f64) -> Result<f64> {
        let t = check_temp("temp_c", temp_c)?;
        Ok(self.r0_ohms * cvd_ratio(t))
    }

    /// Local sensitivity dR/dT at `temp_c` in Ω/°C (0.3908 Ω/°C for a Pt100 at 0 °C).
    pub fn slope_ohms_per_c(&self, temp_c: f64) -> Result<f64> {
        let t = check_temp("temp_c", temp_c)?;
        Ok(self.r0_ohms * cvd_ratio_slope(t))
    }

    /// The range of resistance the equation covers for this element, at −200 °C and 850 °C.
    pub fn ohms_range(&self) -> (f64, f64) {
        (
            self.r0_ohms * cvd_ratio(RTD_MIN_TEMP_C),
            self.r0_ohms * cvd_ratio(RTD_MAX_TEMP_C),
        )
    }

    /// Temperature for a measured element resistance `ohms`.
    ///
    /// At and above R0 this is the closed-form root of R = R0(1 + A·t + B·t²); below R0 it
    /// is Newton iteration on the full equation (with the C term), converged to 1e-9 °C.
    pub fn temp_c_at(&self, ohms: f64) -> Result<f64> {
        let r = finite("ohms", ohms)?;
        let (low, high) = self.ohms_range();
        // Accept values up to half a table step (0.005 Ω on a Pt100) beyond the ends, so
        // the table's 18.52 Ω for −200 °C reads back as the range end instead of failing;
        // the answer is clamped to −200…850 °C so later steps (slope, class) accept it.
        let slack = 5e-5 * self.r0_ohms;
        if r < low - slack || r > high + slack {
            return Err(FieldError::new(
                "ohms",
                format!(
                    "{} Ω is outside {}'s range {}…{} Ω (−200…850 °C)",
                    display::quoted(r),
                    self.name(),
                    display::quoted_fixed(low, 3),
                    display::quoted_fixed(high, 3)
                ),
            ));
        }
        let ratio = r / self.r0_ohms;
        let quadratic = quadratic_root(ratio);
        if ratio >= 1.0 {
            return Ok(quadratic.min(RTD_MAX_TEMP_C));
        }
        // Below 0 °C: start from the quadratic root (within 0.1 °C of the answer) and let
        // Newton add the C term.
        let mut t = quadratic;
        for _ in 0..NEWTON_MAX_STEPS {
            let step = (cvd_ratio(t) - ratio) / cvd_ratio_slope(t);
            t -= step;
            if step.abs() < NEWTON_TOLERANCE_C {
                return Ok(t.clamp(RTD_MIN_TEMP_C, 0.0));
            }
        }
        Err(FieldError::new(
            "ohms",
            format!(
                "{} Ω: the temperature iteration did not converge",
                display::quoted(r)
            ),
        ))
    }

    /// Check an element against a tolerance class: `measured_ohms` read from the element
    /// while it sits at the known `true_temp_c` (for example in a dry block), using the
    /// wire-wound validity ranges of IEC 60751:2008.
    pub fn is_within_class(
        &self,
        measured_ohms: f64,
        true_temp_c: f64,
        class: RtdClass,
    ) -> Result<bool> {
        Ok(self
            .check_class(measured_ohms, true_temp_c, class, ElementBuild::WireWound)?
            .within)
    }

    /// Check an element against a tolerance class, with the deviation and the allowed
    /// tolerance in °C, for a wire-wound or thin-film element.
    pub fn check_class(
        &self,
        measured_ohms: f64,
        true_temp_c: f64,
        class: RtdClass,
        build: ElementBuild,
    ) -> Result<ClassCheck> {
        let tolerance_c = class.tolerance_c(true_temp_c, build)?;
        let indicated = self
            .temp_c_at(measured_ohms)
            .map_err(|e| e.renamed("measured_ohms"))?;
        let deviation_c = indicated - true_temp_c;
        Ok(ClassCheck {
            deviation_c,
            tolerance_c,
            within: deviation_c.abs() <= tolerance_c,
        })
    }

    /// The error the connection adds when the element reads `temp_c`, for cable leads
    /// whose two conductors together measure `lead_ohms` (loop resistance).
    ///
    /// On a 2-wire connection the transmitter sees the element plus both leads, so the
    /// error is `lead_ohms` in ohms and `lead_ohms / (dR/dT)` in °C at that temperature (a
    /// reading too high). 3- and 4-wire connections compensate and report no error.
    pub fn lead_error(&self, wiring: Wiring, lead_ohms: f64, temp_c: f64) -> Result<LeadError> {
        let lead = finite("lead_ohms", lead_ohms)?;
        if lead < 0.0 {
            return Err(FieldError::new(
                "lead_ohms",
                format!(
                    "{} Ω: a cable cannot have negative resistance",
                    display::quoted(lead)
                ),
            ));
        }
        let slope = self.slope_ohms_per_c(temp_c)?;
        Ok(match wiring {
            Wiring::TwoWire => LeadError {
                wiring,
                lead_ohms: lead,
                error_ohms: lead,
                error_c: lead / slope,
                note: "2-wire: both leads add to the element resistance; the transmitter \
                       reads high unless the lead resistance is trimmed out",
            },
            Wiring::ThreeWire => LeadError {
                wiring,
                lead_ohms: lead,
                error_ohms: 0.0,
                error_c: 0.0,
                note: "3-wire: compensated, assuming the three leads have equal resistance; \
                       any difference between leads still shows as error",
            },
            Wiring::FourWire => LeadError {
                wiring,
                lead_ohms: lead,
                error_ohms: 0.0,
                error_c: 0.0,
                note: "4-wire: compensated; lead resistance does not enter the measurement",
            },
        })
    }

    /// [`Rtd::lead_error`] for a cable run: `conductor` size, one-way length `cable_m`
    /// and the cable's temperature `cable_temp_c` (not the element's), at element
    /// temperature `temp_c`. The lead resistance is both conductors (out and back).
    pub fn lead_error_for_cable(
        &self,
        wiring: Wiring,
        conductor: &Conductor,
        cable_m: f64,
        cable_temp_c: f64,
        temp_c: f64,
    ) -> Result<LeadError> {
        let lead = wire::loop_ohms(conductor, cable_m, cable_temp_c).map_err(|e| {
            if e.field == "temp_c" {
                e.renamed("cable_temp_c")
            } else {
                e
            }
        })?;
        self.lead_error(wiring, lead, temp_c)
    }
}

/// IEC 60751:2008 tolerance classes for platinum RTDs: the permitted deviation from the
/// standard table, ±(fixed + factor·|t|) °C, over a validity range that depends on the
/// element's construction.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Deserialize)]
pub enum RtdClass {
    /// Class AA: ±(0.1 + 0.0017·|t|) °C.
    AA,
    /// Class A: ±(0.15 + 0.002·|t|) °C.
    A,
    /// Class B: ±(0.3 + 0.005·|t|) °C.
    B,
    /// Class C: ±(0.6 + 0.01·|t|) °C.
    C,
}

/// How the platinum element is made; IEC 60751:2008 gives thin-film elements narrower
/// validity ranges for each class than wire-wound ones.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum ElementBuild {
    /// Wire-wound element (the default when a data sheet does not say).
    WireWound,
    /// Thin-film element.
    ThinFilm,
}

impl RtdClass {
    /// Every class, tightest first.
    pub const ALL: [RtdClass; 4] = [RtdClass::AA, RtdClass::A, RtdClass::B, RtdClass::C];

    /// The class letter(s) as written on a data sheet.
    pub fn name(self) -> &'static str {
        match self {
            RtdClass::AA => "AA",
            RtdClass::A => "A",
            RtdClass::B => "B",
            RtdClass::C => "C",
        }
    }

    /// (fixed °C, factor per °C of |t|) in the tolerance ±(fixed + factor·|t|).
    pub fn formula(self) -> (f64, f64) {
        match self {
            RtdClass::AA => (0.1, 0.0017),
            RtdClass::A => (0.15, 0.002),
            RtdClass::B => (0.3, 0.005),
            RtdClass::C => (0.6, 0.01),
        }
    }

    /// Temperature range (°C) over which the class applies, per IEC 60751:2008 (tolerance
    /// table). Wire-wound: AA −50…250, A −100…450, B and C −196…600 °C. Thin-film: AA
    /// 0…150, A −30…300, B −50…500, C −50…600 °C (the thin-film ranges are from memory of
    /// the 2008 edition; the 2022 edition renames the classes and changes some ranges).
    pub fn validity_c(self, build: ElementBuild) -> (f64, f64) {
        match (build, self) {
            (ElementBuild::WireWound, RtdClass::AA) => (-50.0, 250.0),
            (ElementBuild::WireWound, RtdClass::A) => (-100.0, 450.0),
            (ElementBuild::WireWound, RtdClass::B) => (-196.0, 600.0),
            (ElementBuild::WireWound, RtdClass::C) => (-196.0, 600.0),
            (ElementBuild::ThinFilm, RtdClass::AA) => (0.0, 150.0),
            (ElementBuild::ThinFilm, RtdClass::A) => (-30.0, 300.0),
            (ElementBuild::ThinFilm, RtdClass::B) => (-50.0, 500.0),
            (ElementBuild::ThinFilm, RtdClass::C) => (-50.0, 600.0),
        }
    }

    /// The permitted deviation (± °C) at `temp_c`; an error outside the class's range.
    pub fn tolerance_c(self, temp_c: f64, build: ElementBuild) -> Result<f64> {
        let t = finite("true_temp_c", temp_c)?;
        let (low, high) = self.validity_c(build);
        if t < low || t > high {
            let build_name = match build {
                ElementBuild::WireWound => "wire-wound",
                ElementBuild::ThinFilm => "thin-film",
            };
            return Err(FieldError::new(
                "true_temp_c",
                format!(
                    "{} °C is outside class {}'s range {}…{} °C for {} elements (IEC 60751)",
                    display::quoted(t),
                    self.name(),
                    display::quoted(low),
                    display::quoted(high),
                    build_name
                ),
            ));
        }
        let (fixed, factor) = self.formula();
        Ok(fixed + factor * t.abs())
    }
}

impl fmt::Display for RtdClass {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.name())
    }
}

impl FromStr for RtdClass {
    type Err = FieldError;

    /// Accepts `AA`, `A`, `B`, `C` in either case, with or without a "class" prefix.
    fn from_str(text: &str) -> Result<RtdClass> {
        let upper = text.trim().to_ascii_uppercase();
        let key = upper.strip_prefix("CLASS").unwrap_or(&upper).trim();
        match key {
            "AA" => Ok(RtdClass::AA),
            "A" => Ok(RtdClass::A),
            "B" => Ok(RtdClass::B),
            "C" => Ok(RtdClass::C),
            _ => Err(FieldError::new(
                "class",
                format!(
                    "'{}' is not an IEC 60751 class; use AA, A, B or C",
                    text.trim()
                ),
            )),
        }
    }
}

/// The outcome of a tolerance-class check.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ClassCheck {
    /// Indicated minus true temperature (°C); positive means the element reads high.
    pub deviation_c: f64,
    /// The class tolerance at the true temperature (± °C).
    pub tolerance_c: f64,
    /// Whether |deviation| is within the tolerance.
    pub within: bool,
}

/// How the element is connected to the transmitter.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum Wiring {
    /// Two wires: the lead resistance adds to the reading.
    TwoWire,
    /// Three wires: the transmitter subtracts one lead from another.
    ThreeWire,
    /// Four wires: current and sense leads are separate.
    FourWire,
}

impl Wiring {
    /// Wiring from the number of wires (2, 3 or 4).
    pub fn from_count(wires: u32) -> Result<Wiring> {
        match wires {
            2 => Ok(Wiring::TwoWire),
            3 => Ok(Wiring::ThreeWire),
            4 => Ok(Wiring::FourWire),
            n => Err(FieldError::new(
                "wires",
                format!("{n} is not an RTD connection; use 2, 3 or 4"),
            )),
        }
    }

    /// The number of wires.
    pub fn count(self) -> u32 {
        match self {
            Wiring::TwoWire => 2,
            Wiring::ThreeWire => 3,
            Wiring::FourWire => 4,
        }
    }
}

/// The error the cable adds to an RTD reading.
#[derive(Debug, Clone, PartialEq)]
pub struct LeadError {
    /// The connection the error is for.
    pub wiring: Wiring,
    /// Resistance of the two conductors in series (Ω).
    pub lead_ohms: f64,
    /// Resistance the transmitter sees on top of the element (Ω).
    pub error_ohms: f64,
    /// That error in °C at the element temperature, via the local slope dR/dT.
    pub error_c: f64,
    /// What the technician should know about this connection.
    pub note: &'static str,
}

/// R(t)/R0 by the Callendar–Van Dusen equation (C term below 0 °C only).
fn cvd_ratio(t: f64) -> f64 {
    let base = 1.0 + CVD_A * t + CVD_B * t * t;
    if t < 0.0 {
        base + CVD_C * (t - 100.0) * t * t * t
    } else {
        base
    }
}

/// d(R/R0)/dt.
fn cvd_ratio_slope(t: f64) -> f64 {
    let base = CVD_A + 2.0 * CVD_B * t;
    if t < 0.0 {
        // d/dt [C (t − 100) t³] = C (4t³ − 300t²)
        base + CVD_C * (4.0 * t * t * t - 300.0 * t * t)
    } else {
        base
    }
}

/// Root of 1 + A·t + B·t² = ratio on the rising branch, written to avoid cancellation.
fn quadratic_root(ratio: f64) -> f64 {
    let disc = CVD_A * CVD_A - 4.0 * CVD_B * (1.0 - ratio);
    // t = (−A + √disc) / 2B = 2(ratio − 1) / (A + √disc)
    2.0 * (ratio - 1.0) / (CVD_A + disc.max(0.0).sqrt())
}

fn check_temp(field: &str, temp_c: f64) -> Result<f64> {
    let t = finite(field, temp_c)?;
    if !(RTD_MIN_TEMP_C..=RTD_MAX_TEMP_C).contains(&t) {
        return Err(FieldError::new(
            field,
            format!(
                "{} °C is outside the IEC 60751 range −200…850 °C",
                display::quoted(t)
            ),
        ));
    }
    Ok(t)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn quadratic_root_inverts_the_positive_branch() {
        for t in [0.0, 0.5, 100.0, 420.0, 850.0] {
            assert!((quadratic_root(cvd_ratio(t)) - t).abs() < 1e-9, "{t}");
        }
    }

    #[test]
    fn slope_matches_a_central_difference() {
        for t in [-199.0, -120.0, -0.5, 0.5, 300.0, 849.0] {
            let h = 1e-4;
            let numeric = (cvd_ratio(t + h) - cvd_ratio(t - h)) / (2.0 * h);
            assert!((numeric - cvd_ratio_slope(t)).abs() < 1e-9, "{t}");
        }
    }
}
