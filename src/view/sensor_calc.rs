//! The small temperature-sensor calculator on the Convert screen: what a Pt100 (Pt500,
//! Pt1000) reads in ohms at a temperature and back (IEC 60751), and what a thermocouple
//! gives in millivolts at its terminals with the cold junction at a given temperature and
//! back (NIST ITS-90). The technician types into either field; the other follows.

use crate::display;
use crate::error::{FieldError, Result};
use crate::form::sensor::{parse_kind, SensorKind};
use crate::number::{parse_in, parse_number};
use crate::rtd::Rtd;
use crate::thermocouple;

/// The calculator as typed.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct CalcInput {
    /// `Pt100`, `pt1000`, `K`, `type J` …
    pub sensor: String,
    /// Cold-junction temperature for a thermocouple, °C as typed.
    pub cold_junction: String,
    /// Which field was typed: `temp` or `signal`.
    pub source: String,
    /// Its text.
    pub text: String,
}

/// What the calculator shows.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct CalcView {
    /// Temperature, °C, formatted (the typed text when it is the source).
    pub temp_c: String,
    /// Ohms or millivolts, formatted.
    pub signal: String,
    /// `Ω` or `mV`.
    pub signal_unit: String,
    /// True for a thermocouple (the cold-junction field is shown).
    pub thermocouple: bool,
    /// The standard behind the figures and the sensor's range, in words.
    pub note: String,
    /// The field in error (`sensor`, `temperature`, `ohms`, `millivolts`, `cold junction`).
    pub error_field: String,
    /// The message, naming the field and the allowed range.
    pub error_text: String,
}

/// Work out the other field.
pub fn view(input: &CalcInput) -> CalcView {
    let mut v = CalcView {
        temp_c: String::new(),
        signal: String::new(),
        signal_unit: "Ω".to_string(),
        thermocouple: false,
        note: String::new(),
        error_field: String::new(),
        error_text: String::new(),
    };
    let from_temp = input.source != "signal";
    if from_temp {
        v.temp_c = input.text.clone();
    } else {
        v.signal = input.text.clone();
    }
    if let Err(e) = fill(input, from_temp, &mut v) {
        v.error_field = e.field.clone();
        v.error_text = e.to_string();
    }
    v
}

fn fill(input: &CalcInput, from_temp: bool, v: &mut CalcView) -> Result<()> {
    // The one sensor-kind reader (the command line's --rtd/--tc use it too).
    let kind = parse_kind(&input.sensor).map_err(FieldError::from)?;
    match kind {
        SensorKind::Rtd(k) => {
            let rtd = Rtd::standard(k);
            v.note = format!(
                "{}, IEC 60751 (Callendar–Van Dusen), −200 to 850 °C",
                k.name()
            );
            if input.text.trim().is_empty() {
                return Ok(());
            }
            if from_temp {
                let t = parse_in("temperature", &input.text, "°C")?;
                let ohms = rtd.ohms_at(t).map_err(|e| e.renamed("temperature"))?;
                v.signal = display::sensor_ohms_number(ohms);
            } else {
                let ohms = parse_in("ohms", &input.text, "Ω")?;
                let t = rtd.temp_c_at(ohms).map_err(|e| e.renamed("ohms"))?;
                v.temp_c = display::temperature_number(t);
            }
        }
        SensorKind::Thermocouple(tc) => {
            v.thermocouple = true;
            v.signal_unit = "mV".to_string();
            let cj = if input.cold_junction.trim().is_empty() {
                0.0
            } else {
                parse_number("cold junction", input.cold_junction.trim_end_matches("°C"))?
            };
            let (lo, hi) = tc.temp_range_c();
            v.note = format!(
                "Type {}, NIST ITS-90 tables, {} to {} °C; millivolts at the terminals with the cold junction at {} °C",
                tc.letter(),
                display::whole(lo),
                display::whole(hi),
                crate::display::trimmed(cj)
            );
            if input.text.trim().is_empty() {
                return Ok(());
            }
            if from_temp {
                let t = parse_in("temperature", &input.text, "°C")?;
                let mv = thermocouple::source_mv(tc, t, cj).map_err(|e| {
                    if e.field == "cj_temp_c" {
                        e.renamed("cold junction")
                    } else {
                        e.renamed("temperature")
                    }
                })?;
                v.signal = display::millivolts_number(mv);
            } else {
                let mv = parse_in("millivolts", &input.text, "mV")?;
                let t = thermocouple::temp_c_from_measured(tc, mv, cj).map_err(|e| {
                    if e.field == "cj_temp_c" {
                        e.renamed("cold junction")
                    } else {
                        e.renamed("millivolts")
                    }
                })?;
                v.temp_c = display::temperature_number(t);
            }
        }
    }
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;

    fn calc(sensor: &str, cj: &str, source: &str, text: &str) -> CalcView {
        view(&CalcInput {
            sensor: sensor.to_string(),
            cold_junction: cj.to_string(),
            source: source.to_string(),
            text: text.to_string(),
        })
    }

    #[test]
    fn a_pt100_both_ways() {
        // IEC 60751 table: Pt100 at 75 °C is 128.99 Ω (128.987 unrounded); at 100 °C
        // 138.51 Ω (138.5055 by the Callendar–Van Dusen equation).
        let v = calc("Pt100", "", "temp", "75");
        assert_eq!(v.signal, "128.987");
        assert_eq!(v.signal_unit, "Ω");
        let v = calc("pt100", "", "signal", "138,5055");
        assert_eq!(v.temp_c, "100.00");
        assert!(!v.thermocouple);
    }

    #[test]
    fn a_type_k_with_the_cold_junction() {
        // NIST ITS-90 type K: E(400 °C) = 16.397 mV, E(18 °C) = 0.718 mV, so a calibrator
        // sources about 15.679 mV at terminals that sit at 18 °C (NIST Monograph 175
        // tables; each table value is rounded to 1 µV, so the difference is good to ±2 µV).
        let v = calc("K", "18", "temp", "400");
        let mv: f64 = v.signal.parse().unwrap();
        assert!((mv - 15.679).abs() <= 0.002, "{}", v.signal);
        assert_eq!(v.signal_unit, "mV");
        assert!(v.thermocouple);
        let v = calc("type K", "18", "signal", "15.679");
        let t: f64 = v.temp_c.parse().unwrap();
        assert!((t - 400.0).abs() <= 0.05, "{}", v.temp_c);
    }

    #[test]
    fn bad_input_names_the_field() {
        assert_eq!(calc("Pt42", "", "temp", "20").error_field, "sensor");
        let v = calc("Pt100", "", "temp", "900");
        assert_eq!(v.error_field, "temperature");
        assert!(v.error_text.contains("850"), "{}", v.error_text);
        assert_eq!(calc("K", "hot", "temp", "20").error_field, "cold junction");
        assert_eq!(calc("K", "20", "signal", "lots").error_field, "millivolts");
    }
}
