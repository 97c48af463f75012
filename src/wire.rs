//! Conductor resistance of loop cable, from AWG or mm² and the conductor temperature.
//!
//! - AWG diameter: d = 0.005 in × 92^((36 − n)/39) (ASTM B258), with 0 = 1/0 … −3 = 4/0.
//! - Annealed copper: resistivity 1/58 Ω·mm²/m at 20 °C and temperature coefficient
//!   0.00393 /°C at 20 °C (IEC 60028, the International Annealed Copper Standard).
//!
//! These give the resistance of a solid conductor of nominal cross-section. Stranded
//! cable and the IEC 60228 *maximum* values are a little higher; the tests show by how much.

use crate::error::{finite, non_negative, within, FieldError, Result};
use serde::{Deserialize, Serialize};

/// Resistivity of annealed copper at 20 °C, Ω·mm²/m (IEC 60028: 1/58).
pub const COPPER_RESISTIVITY_20C: f64 = 1.0 / 58.0;
/// Temperature coefficient of resistance of annealed copper at 20 °C, /°C (IEC 60028).
pub const COPPER_ALPHA_20C: f64 = 0.00393;
/// Millimetres in an inch (exact).
const MM_PER_INCH: f64 = 25.4;
/// Conductor temperatures loopside accepts, °C (a cable below −60 °C or above 250 °C is
/// outside any instrument cable's rating).
pub const TEMP_RANGE_C: (f64, f64) = (-60.0, 250.0);

/// A conductor size as the cable's datasheet gives it.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum Conductor {
    /// American Wire Gauge: 40 (thinnest) down to −3 (4/0). 0 is 1/0, −1 is 2/0, −2 is 3/0.
    Awg(i32),
    /// Metric cross-section, mm².
    Mm2(f64),
}

impl Conductor {
    /// Parse an AWG size as written: `18`, `0`, `1/0`, `2/0`, `00`, `4/0`, `0000`.
    pub fn parse_awg(text: &str) -> Result<Conductor> {
        let t = text.trim();
        let gauge = match t {
            "1/0" | "0" => Some(0),
            "2/0" | "00" => Some(-1),
            "3/0" | "000" => Some(-2),
            "4/0" | "0000" => Some(-3),
            _ => t.parse::<i32>().ok(),
        };
        match gauge {
            Some(g) => Conductor::awg(g),
            None => Err(FieldError::new(
                "awg",
                format!("'{t}' is not an AWG size; use 4/0, 3/0, 2/0, 1/0 or 1 to 40"),
            )),
        }
    }

    /// An AWG size, −3 (4/0) to 40.
    pub fn awg(gauge: i32) -> Result<Conductor> {
        if (-3..=40).contains(&gauge) {
            Ok(Conductor::Awg(gauge))
        } else {
            Err(FieldError::new(
                "awg",
                format!("AWG {gauge} is outside 4/0 to 40"),
            ))
        }
    }

    /// A metric size in mm², 0.05 to 1000.
    pub fn mm2(area_mm2: f64) -> Result<Conductor> {
        within("mm2", area_mm2, 0.05, 1000.0).map(Conductor::Mm2)
    }

    /// The size as a technician writes it: `AWG 18`, `AWG 2/0`, `1.5 mm²`.
    pub fn label(&self) -> String {
        match *self {
            Conductor::Awg(g) if g <= 0 => format!("AWG {}/0", 1 - g),
            Conductor::Awg(g) => format!("AWG {g}"),
            Conductor::Mm2(a) => format!("{a} mm²"),
        }
    }

    /// Conductor diameter, mm (for AWG by ASTM B258; for mm² of a round solid conductor).
    pub fn diameter_mm(&self) -> f64 {
        match *self {
            Conductor::Awg(n) => 0.005 * 92f64.powf((36.0 - n as f64) / 39.0) * MM_PER_INCH,
            Conductor::Mm2(a) => (4.0 * a / std::f64::consts::PI).sqrt(),
        }
    }

    /// Cross-sectional area, mm².
    pub fn area_mm2(&self) -> f64 {
        match *self {
            Conductor::Awg(_) => {
                let d = self.diameter_mm();
                std::f64::consts::PI / 4.0 * d * d
            }
            Conductor::Mm2(a) => a,
        }
    }

    /// Resistance of one conductor, Ω/km, at `temp_c` (annealed copper, IEC 60028).
    pub fn ohms_per_km(&self, temp_c: f64) -> Result<f64> {
        let t = within("temp_c", temp_c, TEMP_RANGE_C.0, TEMP_RANGE_C.1)?;
        let r20 = COPPER_RESISTIVITY_20C / self.area_mm2() * 1000.0;
        Ok(r20 * (1.0 + COPPER_ALPHA_20C * (t - 20.0)))
    }

    /// Resistance of one conductor of `length_m`, Ω.
    pub fn ohms(&self, length_m: f64, temp_c: f64) -> Result<f64> {
        let l = non_negative("length_m", length_m)?;
        Ok(self.ohms_per_km(temp_c)? * l / 1000.0)
    }

    /// The conductor length whose resistance is `ohms` at `temp_c` — [`Conductor::ohms`]
    /// read backwards.
    pub fn length_for_ohms(&self, ohms: f64, temp_c: f64) -> Result<f64> {
        let r = non_negative("ohms", ohms)?;
        Ok(r / self.ohms_per_km(temp_c)? * 1000.0)
    }
}

/// Resistance of a cable run as the loop sees it: out and back, so 2 × the one-way length.
pub fn loop_ohms(conductor: &Conductor, one_way_m: f64, temp_c: f64) -> Result<f64> {
    let l = non_negative("cable_m", one_way_m)?;
    conductor.ohms(2.0 * l, temp_c)
}

/// The nearest AWG size whose area is at least `area_mm2` (for "what gauge is 1.5 mm²?").
pub fn awg_at_least(area_mm2: f64) -> Result<i32> {
    let a = finite("mm2", area_mm2)?;
    (-3..=40)
        .rev()
        .find(|&g| Conductor::Awg(g).area_mm2() >= a)
        .ok_or_else(|| FieldError::new("mm2", format!("{a} mm² is larger than AWG 4/0")))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn awg_labels_and_limits() {
        assert_eq!(Conductor::parse_awg("4/0").unwrap().label(), "AWG 4/0");
        assert_eq!(Conductor::parse_awg("18").unwrap().label(), "AWG 18");
        assert_eq!(Conductor::parse_awg("0").unwrap().label(), "AWG 1/0");
        assert!(Conductor::parse_awg("41").is_err());
        assert!(Conductor::parse_awg("5/0").is_err());
        assert_eq!(awg_at_least(1.0).unwrap(), 17);
    }
}
