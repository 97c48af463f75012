//! The sensor form: which temperature sensor a transmitter reads (a platinum RTD and how it
//! is wired, or a thermocouple and its cold junction), as typed on a screen or given as flags.
//!
//! One reader for every front: the tag's sensor on the command line (`--rtd/--wires/
//! --lead-ohms`, `--tc/--cj-c`) and the sensor calculator on Convert (`Pt100`, `type K`).

use super::{Field, FormError};
use crate::number::{parse_in, parse_number};
use crate::rtd::{RtdKind, Wiring};
use crate::sensor::Sensor;
use crate::thermocouple::TcType;

/// A sensor kind as named on a data sheet or a nameplate.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum SensorKind {
    /// A platinum RTD (IEC 60751): Pt100, Pt500, Pt1000.
    Rtd(RtdKind),
    /// A thermocouple type (IEC 60584 / NIST ITS-90 letters).
    Thermocouple(TcType),
}

/// The cold-junction temperature a transmitter's terminals may be at, °C (common practice:
/// an indoor or field housing; a value outside is a typing slip, not a terminal).
pub const COLD_JUNCTION_RANGE_C: (f64, f64) = (-50.0, 100.0);

/// Read a sensor kind: `Pt100`, `pt1000`, `K`, `type J`, `Type T`.
pub fn parse_kind(text: &str) -> Result<SensorKind, FormError> {
    let t = text.trim();
    if let Ok(k) = t.parse::<RtdKind>() {
        return Ok(SensorKind::Rtd(k));
    }
    let bare = t
        .trim_start_matches("type")
        .trim_start_matches("Type")
        .trim();
    if let Ok(tc) = bare.parse::<TcType>() {
        return Ok(SensorKind::Thermocouple(tc));
    }
    Err(FormError::new(
        Field::Sensor,
        format!(
            "'{t}' is not a sensor; type Pt100, Pt500 or Pt1000, or a thermocouple type (B, E, J, K, N, R, S, T)"
        ),
    ))
}

/// The sensor form as typed. Empty `kind`: no sensor. The other fields may be empty and
/// then take their usual values: three wires, 0 Ω of lead, a 20 °C cold junction.
#[derive(Debug, Clone, Default, PartialEq, Eq)]
pub struct SensorForm {
    /// `Pt100`, `K`, `type J` … (empty: the tag has no sensor recorded).
    pub kind: String,
    /// RTD connection: 2, 3 or 4 wires.
    pub wiring: String,
    /// Resistance of both RTD leads in series, Ω (matters for 2-wire only).
    pub lead_ohms: String,
    /// Thermocouple cold-junction (transmitter terminal) temperature, °C.
    pub cold_junction: String,
}

impl SensorForm {
    /// The sensor the form describes; `Ok(None)` when no kind is given. An RTD-only field
    /// given for a thermocouple (or the other way round) is refused, naming it, so that
    /// nothing typed is silently dropped.
    pub fn parse(&self) -> Result<Option<Sensor>, FormError> {
        if self.kind.trim().is_empty() {
            return Ok(None);
        }
        match parse_kind(&self.kind)? {
            SensorKind::Rtd(element) => {
                if !self.cold_junction.trim().is_empty() {
                    return Err(FormError::new(
                        Field::ColdJunction,
                        "is for a thermocouple; an RTD has no cold junction",
                    ));
                }
                Ok(Some(Sensor::Rtd {
                    element,
                    wiring: parse_wiring(&self.wiring)?,
                    lead_ohms: parse_lead_ohms(&self.lead_ohms)?,
                }))
            }
            SensorKind::Thermocouple(tc) => {
                for (field, text) in [
                    (Field::Wiring, &self.wiring),
                    (Field::LeadOhms, &self.lead_ohms),
                ] {
                    if !text.trim().is_empty() {
                        return Err(FormError::new(
                            field,
                            "is for an RTD; a thermocouple's leads are compensating cable",
                        ));
                    }
                }
                Ok(Some(Sensor::Thermocouple {
                    tc,
                    cj_c: parse_cold_junction(&self.cold_junction)?,
                }))
            }
        }
    }
}

/// Read an RTD connection: 2, 3 or 4 wires; empty is 3 (the usual field connection).
pub fn parse_wiring(text: &str) -> Result<Wiring, FormError> {
    if text.trim().is_empty() {
        return Ok(Wiring::ThreeWire);
    }
    let n = parse_number(Field::Wiring.name(), text).map_err(FormError::at(Field::Wiring))?;
    if n.fract() != 0.0 || !(2.0..=4.0).contains(&n) {
        return Err(FormError::new(
            Field::Wiring,
            format!("{} is not an RTD connection; use 2, 3 or 4", text.trim()),
        ));
    }
    Wiring::from_count(n as u32).map_err(FormError::at(Field::Wiring))
}

/// Read the resistance of both RTD leads in series, Ω (0 or more); empty is 0 Ω.
pub fn parse_lead_ohms(text: &str) -> Result<f64, FormError> {
    if text.trim().is_empty() {
        return Ok(0.0);
    }
    let r = parse_in(Field::LeadOhms.name(), text, "Ω").map_err(FormError::at(Field::LeadOhms))?;
    if !(r >= 0.0 && r.is_finite()) {
        return Err(FormError::new(
            Field::LeadOhms,
            format!("must be 0 Ω or more, got {}", crate::display::trimmed(r)),
        ));
    }
    Ok(r)
}

/// Read a cold-junction temperature, °C, within [`COLD_JUNCTION_RANGE_C`]; empty is 20 °C.
pub fn parse_cold_junction(text: &str) -> Result<f64, FormError> {
    if text.trim().is_empty() {
        return Ok(20.0);
    }
    let t = parse_in(Field::ColdJunction.name(), text, "°C")
        .map_err(FormError::at(Field::ColdJunction))?;
    let (lo, hi) = COLD_JUNCTION_RANGE_C;
    if !(lo..=hi).contains(&t) {
        return Err(FormError::new(
            Field::ColdJunction,
            format!(
                "{} °C is not a transmitter's terminal temperature; give −50 to 100 °C",
                crate::display::trimmed(t)
            ),
        ));
    }
    Ok(t)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn form(kind: &str, wiring: &str, lead: &str, cj: &str) -> SensorForm {
        SensorForm {
            kind: kind.into(),
            wiring: wiring.into(),
            lead_ohms: lead.into(),
            cold_junction: cj.into(),
        }
    }

    #[test]
    fn kinds_as_written_on_a_nameplate() {
        assert_eq!(
            parse_kind("Pt100").unwrap(),
            SensorKind::Rtd(RtdKind::Pt100)
        );
        assert_eq!(
            parse_kind("type K").unwrap(),
            SensorKind::Thermocouple(TcType::K)
        );
        assert_eq!(
            parse_kind(" J ").unwrap(),
            SensorKind::Thermocouple(TcType::J)
        );
        assert_eq!(parse_kind("Pt42").unwrap_err().field, Field::Sensor);
    }

    #[test]
    fn tt412s_pt100_three_wire_and_a_type_k_at_22_c() {
        // TT-412 (demo plant): a Pt100, three wires, 0,4 Ω of lead in all.
        assert_eq!(
            form("pt100", "3", "0,4 Ω", "").parse().unwrap(),
            Some(Sensor::Rtd {
                element: RtdKind::Pt100,
                wiring: Wiring::ThreeWire,
                lead_ohms: 0.4
            })
        );
        assert_eq!(
            form("K", "", "", "22").parse().unwrap(),
            Some(Sensor::Thermocouple {
                tc: TcType::K,
                cj_c: 22.0
            })
        );
        assert_eq!(form("", "", "", "").parse().unwrap(), None);
    }

    #[test]
    fn each_bad_field_is_named() {
        let field = |f: SensorForm| f.parse().unwrap_err().field;
        assert_eq!(field(form("pt100", "5", "", "")), Field::Wiring);
        assert_eq!(field(form("pt100", "2.5", "", "")), Field::Wiring);
        assert_eq!(field(form("pt100", "", "-1", "")), Field::LeadOhms);
        assert_eq!(field(form("pt100", "", "", "20")), Field::ColdJunction);
        assert_eq!(field(form("K", "", "", "400")), Field::ColdJunction);
        assert_eq!(field(form("K", "3", "", "")), Field::Wiring);
        assert_eq!(field(form("K", "", "1", "")), Field::LeadOhms);
        assert_eq!(field(form("thermistor", "", "", "")), Field::Sensor);
    }
}
