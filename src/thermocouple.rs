//! Thermocouples: NIST ITS-90 reference functions, cold-junction compensation and
//! IEC 60584-1 tolerance classes.
//!
//! Responsible for what a temperature transmitter with a thermocouple input should see:
//! the EMF of a letter-designated thermocouple (B, E, J, K, N, R, S, T) at a temperature
//! with the reference junction at 0 °C, the temperature for a measured EMF, the EMF to
//! source from a millivolt calibrator when the transmitter's cold junction sits at some
//! other temperature, and the tolerance class limits.
//!
//! EMF → temperature comes in two forms:
//! - [`TcType::temp_c_at`] inverts the reference function itself by safeguarded Newton
//!   iteration (to 1e-9 °C) over the type's whole range, starting from the NIST inverse
//!   polynomial where one is published. This is the exact inverse of the table.
//! - [`TcType::inverse_polynomial`] evaluates only the NIST approximate inverse polynomial
//!   and refuses EMFs outside the range NIST publishes it for; it reports the polynomial's
//!   published error band with the result.
//!
//! The coefficient tables live in `thermocouple/its90.rs`.

mod its90;

use std::fmt;
use std::str::FromStr;

use crate::display;
use crate::error::{finite, FieldError, Result};
use its90::TypeData;
use serde::{Deserialize, Serialize};

/// Newton stops once a step is below this (°C).
const NEWTON_TOLERANCE_C: f64 = 1e-10;
/// Bisection from a 2000 °C bracket reaches 1e-10 °C in under 50 halvings.
const SOLVER_MAX_STEPS: usize = 200;
/// Type B's EMF falls to a minimum near 21 °C and returns to 0 mV near 42 °C, so EMF →
/// temperature is only single-valued for E ≥ 0 on the rising branch above this point.
const TYPE_B_RISING_FROM_C: f64 = 25.0;

/// The letter-designated thermocouple types of NIST Monograph 175 and IEC 60584-1.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Deserialize)]
pub enum TcType {
    /// Type B: Pt-30%Rh / Pt-6%Rh, 0…1820 °C.
    B,
    /// Type E: Ni-Cr / Cu-Ni (chromel/constantan), −270…1000 °C.
    E,
    /// Type J: Fe / Cu-Ni (iron/constantan), −210…1200 °C.
    J,
    /// Type K: Ni-Cr / Ni-Al (chromel/alumel), −270…1372 °C.
    K,
    /// Type N: Ni-Cr-Si / Ni-Si (nicrosil/nisil), −270…1300 °C.
    N,
    /// Type R: Pt-13%Rh / Pt, −50…1768.1 °C.
    R,
    /// Type S: Pt-10%Rh / Pt, −50…1768.1 °C.
    S,
    /// Type T: Cu / Cu-Ni (copper/constantan), −270…400 °C.
    T,
}

impl TcType {
    /// Every type, in alphabetical order.
    pub const ALL: [TcType; 8] = [
        TcType::B,
        TcType::E,
        TcType::J,
        TcType::K,
        TcType::N,
        TcType::R,
        TcType::S,
        TcType::T,
    ];

    /// The type letter.
    pub fn letter(self) -> char {
        match self {
            TcType::B => 'B',
            TcType::E => 'E',
            TcType::J => 'J',
            TcType::K => 'K',
            TcType::N => 'N',
            TcType::R => 'R',
            TcType::S => 'S',
            TcType::T => 'T',
        }
    }

    fn data(self) -> &'static TypeData {
        match self {
            TcType::B => &its90::TYPE_B,
            TcType::E => &its90::TYPE_E,
            TcType::J => &its90::TYPE_J,
            TcType::K => &its90::TYPE_K,
            TcType::N => &its90::TYPE_N,
            TcType::R => &its90::TYPE_R,
            TcType::S => &its90::TYPE_S,
            TcType::T => &its90::TYPE_T,
        }
    }

    /// The temperature range (°C) of the ITS-90 reference function.
    pub fn temp_range_c(self) -> (f64, f64) {
        let forward = self.data().forward;
        let low = forward.first().map_or(0.0, |f| f.low_c);
        let high = forward.last().map_or(0.0, |f| f.high_c);
        (low, high)
    }

    /// The EMF range (mV) that [`TcType::temp_c_at`] accepts: the reference function's
    /// values at the ends of its range; for type B from 0 mV (see [`TcType::temp_c_at`]).
    pub fn mv_range(self) -> (f64, f64) {
        let (low, high) = self.temp_range_c();
        let low_mv = if self == TcType::B {
            0.0
        } else {
            reference_mv(self.data(), low)
        };
        (low_mv, reference_mv(self.data(), high))
    }

    /// EMF (mV) of the thermocouple with its measuring junction at `temp_c` and its
    /// reference junction at 0 °C: the ITS-90 reference function, as tabulated in NIST
    /// Monograph 175.
    pub fn mv_at(self, temp_c: f64) -> Result<f64> {
        let t = self.check_temp("temp_c", temp_c)?;
        Ok(reference_mv(self.data(), t))
    }

    /// Seebeck coefficient dE/dt (mV/°C) at `temp_c`, from the reference function.
    pub fn seebeck_mv_per_c(self, temp_c: f64) -> Result<f64> {
        let t = self.check_temp("temp_c", temp_c)?;
        Ok(reference_slope(self.data(), t))
    }

    /// Temperature (°C) of the measuring junction for an EMF `mv` with the reference
    /// junction at 0 °C: the exact inverse of the reference function.
    ///
    /// The NIST inverse polynomial gives the starting point where it is published;
    /// safeguarded Newton iteration on the reference function then converges to
    /// 1e-9 °C, so the result round-trips through [`TcType::mv_at`]. EMFs outside the
    /// reference function's range are an error. Type B is accepted from 0 mV only: below
    /// about 42 °C its EMF is negative and not single-valued.
    pub fn temp_c_at(self, mv: f64) -> Result<f64> {
        let e = self.check_mv("mv", mv)?;
        let data = self.data();
        let (mut low, high) = self.temp_range_c();
        if self == TcType::B {
            low = TYPE_B_RISING_FROM_C;
        }
        let start = match inverse_for(data, e) {
            Some(inv) => polynomial(inv.d, e).clamp(low, high),
            None => low + (high - low) * 0.5,
        };
        solve_rising(
            |t| reference_mv(data, t) - e,
            |t| reference_slope(data, t),
            low,
            high,
            start,
        )
        .ok_or_else(|| {
            FieldError::new(
                "mv",
                format!(
                    "{} mV: the type {} temperature iteration did not converge",
                    display::quoted(e),
                    self.letter()
                ),
            )
        })
    }

    /// The NIST approximate inverse polynomial alone, for an EMF `mv` with the reference
    /// junction at 0 °C. Refuses EMFs outside the ranges NIST publishes the polynomials
    /// for (for example below −200 °C for type K, or below 250 °C for type B).
    pub fn inverse_polynomial(self, mv: f64) -> Result<InverseEstimate> {
        let e = finite("mv", mv)?;
        let data = self.data();
        match inverse_for(data, e) {
            Some(inv) => Ok(InverseEstimate {
                temp_c: polynomial(inv.d, e),
                error_band_c: inv.error_c,
            }),
            None => {
                let low = data.inverse.first().map_or(0.0, |i| i.low_mv);
                let high = data.inverse.last().map_or(0.0, |i| i.high_mv);
                Err(FieldError::new(
                    "mv",
                    format!(
                        "{} mV is outside the NIST inverse polynomial range for type {}, {}…{} mV",
                        display::quoted(e),
                        self.letter(),
                        display::quoted_fixed(low, 3),
                        display::quoted_fixed(high, 3)
                    ),
                ))
            }
        }
    }

    /// Tolerance (± °C) of IEC 60584-1 `class` at `temp_c` for this type: the larger of a
    /// fixed value and a fraction of |t| over the class's range. An error where the class
    /// does not exist for the type or does not cover the temperature.
    pub fn class_tolerance_c(self, class: TcClass, temp_c: f64) -> Result<f64> {
        let t = finite("temp_c", temp_c)?;
        let bands = tolerance_bands(self, class);
        if bands.is_empty() {
            return Err(FieldError::new(
                "class",
                format!(
                    "IEC 60584-1 has no class {} for type {}",
                    class.number(),
                    self.letter()
                ),
            ));
        }
        let (low, high) = (bands[0].low_c, bands[bands.len() - 1].high_c);
        if t < low || t > high {
            return Err(FieldError::new(
                "temp_c",
                format!(
                    "{} °C is outside class {} for type {}, {}…{} °C (IEC 60584-1)",
                    display::quoted(t),
                    class.number(),
                    self.letter(),
                    display::quoted(low),
                    display::quoted(high)
                ),
            ));
        }
        let band = bands
            .iter()
            .find(|b| t >= b.low_c && t <= b.high_c)
            .unwrap_or(&bands[bands.len() - 1]);
        Ok(band.rule.tolerance_c(t))
    }

    /// Whether a thermocouple that indicates `measured_temp_c` while its junction sits at
    /// `true_temp_c` is within IEC 60584-1 `class`.
    pub fn is_within_class(
        self,
        measured_temp_c: f64,
        true_temp_c: f64,
        class: TcClass,
    ) -> Result<bool> {
        let measured = finite("measured_temp_c", measured_temp_c)?;
        let tolerance = self.class_tolerance_c(class, true_temp_c).map_err(|e| {
            if e.field == "temp_c" {
                e.renamed("true_temp_c")
            } else {
                e
            }
        })?;
        Ok((measured - true_temp_c).abs() <= tolerance)
    }

    fn check_temp(self, field: &str, temp_c: f64) -> Result<f64> {
        let t = finite(field, temp_c)?;
        let (low, high) = self.temp_range_c();
        if t < low || t > high {
            return Err(FieldError::new(
                field,
                format!(
                    "{} °C is outside type {}'s range {}…{} °C",
                    display::quoted(t),
                    self.letter(),
                    display::quoted(low),
                    display::quoted(high)
                ),
            ));
        }
        Ok(t)
    }

    fn check_mv(self, field: &str, mv: f64) -> Result<f64> {
        let e = finite(field, mv)?;
        let (low, high) = self.mv_range();
        if e < low || e > high {
            let why = if self == TcType::B {
                " (type B's EMF is not single-valued below 0 mV)"
            } else {
                ""
            };
            return Err(FieldError::new(
                field,
                format!(
                    "{} mV is outside type {}'s range {}…{} mV{}",
                    display::quoted(e),
                    self.letter(),
                    display::quoted_fixed(low, 3),
                    display::quoted_fixed(high, 3),
                    why
                ),
            ));
        }
        Ok(e)
    }
}

impl fmt::Display for TcType {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "type {}", self.letter())
    }
}

impl FromStr for TcType {
    type Err = FieldError;

    /// Accepts the letter in either case, with or without a "type" prefix.
    fn from_str(text: &str) -> Result<TcType> {
        let upper = text.trim().to_ascii_uppercase();
        let key = upper.strip_prefix("TYPE").unwrap_or(&upper).trim();
        TcType::ALL
            .into_iter()
            .find(|t| key.len() == 1 && key.starts_with(t.letter()))
            .ok_or_else(|| {
                FieldError::new(
                    "tc_type",
                    format!(
                        "'{}' is not a thermocouple type; use B, E, J, K, N, R, S or T",
                        text.trim()
                    ),
                )
            })
    }
}

/// A temperature from the NIST approximate inverse polynomial, with the error band NIST
/// publishes for it.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct InverseEstimate {
    /// The polynomial's temperature (°C).
    pub temp_c: f64,
    /// (lowest, highest) error of the polynomial against the reference function (°C).
    pub error_band_c: (f64, f64),
}

/// The EMF (mV) to source into a transmitter input to simulate its thermocouple at
/// `temp_c` when the transmitter's reference (cold) junction sits at `cj_temp_c`:
/// E(t) − E(t_cj). Negative when the simulated temperature is below the cold junction.
pub fn source_mv(tc: TcType, temp_c: f64, cj_temp_c: f64) -> Result<f64> {
    let e = tc.mv_at(temp_c)?;
    let e_cj = tc
        .mv_at(cj_temp_c)
        .map_err(|err| err.renamed("cj_temp_c"))?;
    Ok(e - e_cj)
}

/// The measuring-junction temperature (°C) for an EMF `measured_mv` read at the
/// thermocouple's terminals when those terminals (the reference junction) sit at
/// `cj_temp_c`: t = E⁻¹(E_measured + E(t_cj)).
pub fn temp_c_from_measured(tc: TcType, measured_mv: f64, cj_temp_c: f64) -> Result<f64> {
    let e = finite("mv", measured_mv)?;
    let e_cj = tc
        .mv_at(cj_temp_c)
        .map_err(|err| err.renamed("cj_temp_c"))?;
    tc.temp_c_at(e + e_cj).map_err(|err| {
        FieldError::new(
            "mv",
            format!(
                "{} mV measured with the cold junction at {} °C is {} mV referred to 0 °C; {}",
                display::quoted(e),
                display::quoted(cj_temp_c),
                display::quoted(e + e_cj),
                err.reason
            ),
        )
    })
}

/// IEC 60584-1 tolerance classes for thermocouples (class 1 tightest).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Deserialize)]
pub enum TcClass {
    /// Class 1.
    #[serde(rename = "1")]
    One,
    /// Class 2.
    #[serde(rename = "2")]
    Two,
    /// Class 3 (the low-temperature class for E, K, N and T; the wide one for B).
    #[serde(rename = "3")]
    Three,
}

impl TcClass {
    /// The class number as written on a data sheet.
    pub fn number(self) -> u8 {
        match self {
            TcClass::One => 1,
            TcClass::Two => 2,
            TcClass::Three => 3,
        }
    }
}

impl FromStr for TcClass {
    type Err = FieldError;

    /// Accepts `1`, `2`, `3`, with or without a "class" prefix.
    fn from_str(text: &str) -> Result<TcClass> {
        let lower = text.trim().to_ascii_lowercase();
        let key = lower.strip_prefix("class").unwrap_or(&lower).trim();
        match key {
            "1" => Ok(TcClass::One),
            "2" => Ok(TcClass::Two),
            "3" => Ok(TcClass::Three),
            _ => Err(FieldError::new(
                "class",
                format!(
                    "'{}' is not an IEC 60584-1 class; use 1, 2 or 3",
                    text.trim()
                ),
            )),
        }
    }
}

/// How a tolerance is computed within one temperature band.
#[derive(Debug, Clone, Copy)]
enum Rule {
    /// The larger of a fixed value (°C) and a fraction of |t|.
    LargerOf(f64, f64),
    /// Types R and S class 1 above 1100 °C: 1 + 0.003·(t − 1100) °C.
    RsAbove1100,
}

impl Rule {
    fn tolerance_c(self, t: f64) -> f64 {
        match self {
            Rule::LargerOf(fixed, fraction) => fixed.max(fraction * t.abs()),
            Rule::RsAbove1100 => 1.0 + 0.003 * (t - 1100.0),
        }
    }
}

struct Band {
    low_c: f64,
    high_c: f64,
    rule: Rule,
}

const fn band(low_c: f64, high_c: f64, rule: Rule) -> Band {
    Band {
        low_c,
        high_c,
        rule,
    }
}

/// IEC 60584-1:2013 tolerance classes (reference junction at 0 °C). Each class's fixed
/// part and fraction of |t| cross at the published band edges (e.g. type K class 1:
/// 1.5 °C to 375 °C, 0.004·|t| above), so "the larger of" reproduces the split table.
fn tolerance_bands(tc: TcType, class: TcClass) -> &'static [Band] {
    use Rule::LargerOf;
    const T1: [Band; 1] = [band(-40.0, 350.0, LargerOf(0.5, 0.004))];
    const T2: [Band; 1] = [band(-40.0, 350.0, LargerOf(1.0, 0.0075))];
    const T3: [Band; 1] = [band(-200.0, 40.0, LargerOf(1.0, 0.015))];
    const E1: [Band; 1] = [band(-40.0, 800.0, LargerOf(1.5, 0.004))];
    const E2: [Band; 1] = [band(-40.0, 900.0, LargerOf(2.5, 0.0075))];
    const EKN3: [Band; 1] = [band(-200.0, 40.0, LargerOf(2.5, 0.015))];
    const J1: [Band; 1] = [band(-40.0, 750.0, LargerOf(1.5, 0.004))];
    const J2: [Band; 1] = [band(-40.0, 750.0, LargerOf(2.5, 0.0075))];
    const KN1: [Band; 1] = [band(-40.0, 1000.0, LargerOf(1.5, 0.004))];
    const KN2: [Band; 1] = [band(-40.0, 1200.0, LargerOf(2.5, 0.0075))];
    const RS1: [Band; 2] = [
        band(0.0, 1100.0, LargerOf(1.0, 0.0)),
        band(1100.0, 1600.0, Rule::RsAbove1100),
    ];
    const RS2: [Band; 1] = [band(0.0, 1600.0, LargerOf(1.5, 0.0025))];
    const B2: [Band; 1] = [band(600.0, 1700.0, LargerOf(0.0, 0.0025))];
    const B3: [Band; 1] = [band(600.0, 1700.0, LargerOf(4.0, 0.005))];
    match (tc, class) {
        (TcType::T, TcClass::One) => &T1,
        (TcType::T, TcClass::Two) => &T2,
        (TcType::T, TcClass::Three) => &T3,
        (TcType::E, TcClass::One) => &E1,
        (TcType::E, TcClass::Two) => &E2,
        (TcType::E | TcType::K | TcType::N, TcClass::Three) => &EKN3,
        (TcType::J, TcClass::One) => &J1,
        (TcType::J, TcClass::Two) => &J2,
        (TcType::K | TcType::N, TcClass::One) => &KN1,
        (TcType::K | TcType::N, TcClass::Two) => &KN2,
        (TcType::R | TcType::S, TcClass::One) => &RS1,
        (TcType::R | TcType::S, TcClass::Two) => &RS2,
        (TcType::B, TcClass::Two) => &B2,
        (TcType::B, TcClass::Three) => &B3,
        (TcType::J | TcType::R | TcType::S, TcClass::Three) | (TcType::B, TcClass::One) => &[],
    }
}

/// The subrange of the reference function that covers `t` (already range-checked); at a
/// shared boundary the lower subrange, whose value there agrees with the upper one.
fn subrange(data: &TypeData, t: f64) -> Option<&'static its90::Forward> {
    data.forward
        .iter()
        .find(|f| t <= f.high_c)
        .or(data.forward.last())
}

/// E(t) on one subrange, with type K's exponential term on the subrange from 0 °C.
fn subrange_mv(data: &TypeData, sub: &its90::Forward, t: f64) -> f64 {
    let mut e = polynomial(sub.c, t);
    if let Some((a0, a1, a2)) = data.exponential {
        if sub.low_c >= 0.0 {
            e += a0 * (a1 * (t - a2) * (t - a2)).exp();
        }
    }
    e
}

/// The reference function at `t` (already range-checked).
fn reference_mv(data: &TypeData, t: f64) -> f64 {
    subrange(data, t).map_or(0.0, |sub| subrange_mv(data, sub, t))
}

/// dE/dt of the reference function at `t`.
fn reference_slope(data: &TypeData, t: f64) -> f64 {
    let Some(sub) = subrange(data, t) else {
        return 0.0;
    };
    let mut slope = polynomial_slope(sub.c, t);
    if let Some((a0, a1, a2)) = data.exponential {
        if sub.low_c >= 0.0 {
            slope += a0 * (a1 * (t - a2) * (t - a2)).exp() * 2.0 * a1 * (t - a2);
        }
    }
    slope
}

/// The inverse subrange for `e`. Where two published subranges overlap (types R and S
/// around 1064–1200 °C) the later, tighter one is used.
fn inverse_for(data: &TypeData, e: f64) -> Option<&'static its90::Inverse> {
    data.inverse
        .iter()
        .rev()
        .find(|inv| e >= inv.low_mv && e <= inv.high_mv)
}

fn polynomial(c: &[f64], x: f64) -> f64 {
    c.iter().rev().fold(0.0, |acc, &ci| acc * x + ci)
}

fn polynomial_slope(c: &[f64], x: f64) -> f64 {
    c.iter()
        .enumerate()
        .skip(1)
        .rev()
        .fold(0.0, |acc, (i, &ci)| acc * x + i as f64 * ci)
}

/// Root of an increasing `f` in [low, high] by Newton steps kept inside a shrinking
/// bracket (bisection when a step would leave it or the slope vanishes).
fn solve_rising(
    f: impl Fn(f64) -> f64,
    slope: impl Fn(f64) -> f64,
    low: f64,
    high: f64,
    start: f64,
) -> Option<f64> {
    let (mut lo, mut hi) = (low, high);
    if f(lo) > 0.0 {
        return (f(lo).abs() < 1e-12).then_some(lo);
    }
    if f(hi) < 0.0 {
        return (f(hi).abs() < 1e-12).then_some(hi);
    }
    let mut t = start.clamp(lo, hi);
    for _ in 0..SOLVER_MAX_STEPS {
        let value = f(t);
        if value == 0.0 {
            return Some(t);
        }
        if value < 0.0 {
            lo = t;
        } else {
            hi = t;
        }
        let d = slope(t);
        let newton = if d > 0.0 { t - value / d } else { f64::NAN };
        let next = if newton > lo && newton < hi {
            newton
        } else {
            0.5 * (lo + hi)
        };
        if (next - t).abs() < NEWTON_TOLERANCE_C || hi - lo < NEWTON_TOLERANCE_C {
            return Some(next);
        }
        t = next;
    }
    None
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn subranges_meet_at_their_boundaries() {
        // The published subranges are fitted to join; a typo in a coefficient shows here.
        for tc in TcType::ALL {
            let data = tc.data();
            for pair in data.forward.windows(2) {
                let edge = pair[0].high_c;
                let below = subrange_mv(data, &pair[0], edge);
                let above = subrange_mv(data, &pair[1], edge);
                assert!((below - above).abs() < 2e-6, "{tc} at {edge} °C");
            }
        }
    }

    #[test]
    fn slope_matches_a_central_difference() {
        for tc in TcType::ALL {
            let (low, high) = tc.temp_range_c();
            let data = tc.data();
            for i in 1..20 {
                let t = low + (high - low) * f64::from(i) / 20.0;
                let h = 1e-3;
                let numeric = (reference_mv(data, t + h) - reference_mv(data, t - h)) / (2.0 * h);
                assert!(
                    (numeric - reference_slope(data, t)).abs() < 1e-7,
                    "{tc} at {t}"
                );
            }
        }
    }

    #[test]
    fn polynomial_slope_is_the_derivative() {
        let c = [1.0, 2.0, 3.0, 4.0];
        // d/dx (1 + 2x + 3x² + 4x³) at 2 = 2 + 12 + 48
        assert_eq!(polynomial_slope(&c, 2.0), 62.0);
        assert_eq!(polynomial(&c, 2.0), 1.0 + 4.0 + 12.0 + 32.0);
    }
}
