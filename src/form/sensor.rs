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

impl SensorKind {
    /// Every kind, in the order the screens' sensor pickers list them: the RTDs, then the
    /// thermocouple letters.
    pub const ALL: [SensorKind; 11] = [
        SensorKind::Rtd(RtdKind::Pt100),
        SensorKind::Rtd(RtdKind::Pt500),
        SensorKind::Rtd(RtdKind::Pt1000),
        SensorKind::Thermocouple(TcType::B),
        SensorKind::Thermocouple(TcType::E),
        SensorKind::Thermocouple(TcType::J),
        SensorKind::Thermocouple(TcType::K),
        SensorKind::Thermocouple(TcType::N),
        SensorKind::Thermocouple(TcType::R),
        SensorKind::Thermocouple(TcType::S),
        SensorKind::Thermocouple(TcType::T),
    ];

    /// The kind as [`parse_kind`] reads it and a nameplate writes it: `Pt100`, `K`.
    pub fn name(self) -> String {
        match self {
            SensorKind::Rtd(k) => k.name().to_string(),
            SensorKind::Thermocouple(tc) => tc.letter().to_string(),
        }
    }

    /// The words a picker shows: `Pt100 RTD`, `type K thermocouple`.
    pub fn label(self) -> String {
        match self {
            SensorKind::Rtd(k) => format!("{} RTD", k.name()),
            SensorKind::Thermocouple(tc) => format!("type {} thermocouple", tc.letter()),
        }
    }

    /// The kind of a recorded sensor (none for a DP level sensor, which has no kind here).
    pub fn of(sensor: &Sensor) -> Option<SensorKind> {
        match *sensor {
            Sensor::Rtd { element, .. } => Some(SensorKind::Rtd(element)),
            Sensor::Thermocouple { tc, .. } => Some(SensorKind::Thermocouple(tc)),
            Sensor::DpLevel { .. } => None,
        }
    }

    /// This kind's place in [`SensorKind::ALL`].
    pub fn index(self) -> usize {
        SensorKind::ALL
            .iter()
            .position(|k| *k == self)
            .unwrap_or_default()
    }
}

/// The words of the tag form's sensor picker's first option: no sensor recorded.
pub const NO_SENSOR: &str = "none recorded";

/// The words for a DP level sensor on the tag form's picker: its setup is kept as it
/// is (it is set in the tag's JSON, not on the form).
pub const KEPT_DP_LEVEL: &str = "DP level (kept as set)";

/// What the tag form's sensor picker offers ([`NO_SENSOR`], then every [`SensorKind`],
/// then [`KEPT_DP_LEVEL`] when the form holds a DP level sensor) and which one is picked.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct SensorChoices {
    /// The options, in words.
    pub options: Vec<String>,
    /// The one picked.
    pub current: usize,
}

/// The picker for a sensor kind as the form holds it (`Pt100`, `K`; `""` is
/// [`NO_SENSOR`]). A kind that does not read is shown as none picked; the form names it
/// when saved.
pub fn choices(kind: &str) -> SensorChoices {
    let mut options: Vec<String> = std::iter::once(NO_SENSOR.to_string())
        .chain(SensorKind::ALL.iter().map(|k| k.label()))
        .collect();
    let kind = kind.trim();
    let current = if kind == KEPT_DP_LEVEL {
        options.push(KEPT_DP_LEVEL.to_string());
        options.len() - 1
    } else if kind.is_empty() {
        0
    } else {
        parse_kind(kind).map_or(0, |k| k.index() + 1)
    };
    SensorChoices { options, current }
}

/// The form's kind text for option `index` of [`choices`] (`""` for [`NO_SENSOR`]).
pub fn picked(choices: &SensorChoices, index: usize) -> String {
    match index {
        0 => String::new(),
        i => match SensorKind::ALL.get(i - 1) {
            Some(k) => k.name(),
            None if choices.options.get(i).is_some_and(|o| o == KEPT_DP_LEVEL) => {
                KEPT_DP_LEVEL.to_string()
            }
            None => String::new(),
        },
    }
}

/// The RTD connections a picker offers, in words, 2, 3 and 4 wires in that order.
pub const WIRINGS: [&str; 3] = ["2-wire", "3-wire", "4-wire"];

/// The wiring text of [`WIRINGS`] option `index` as [`parse_wiring`] reads it (`3` for
/// anything else).
pub fn wiring_picked(index: usize) -> String {
    match index {
        0 => "2",
        2 => "4",
        _ => "3",
    }
    .to_string()
}

/// The [`WIRINGS`] option a wiring text stands for (empty or unreadable: 3-wire, the
/// default).
pub fn wiring_chosen(text: &str) -> usize {
    parse_wiring(text).map_or(1, |w| w.count() as usize - 2)
}

/// The form filled from a recorded sensor: the fields as [`SensorForm::parse`] reads them
/// back ([`KEPT_DP_LEVEL`] for a DP level sensor).
pub fn form_of(sensor: Option<&Sensor>) -> SensorForm {
    match sensor {
        None => SensorForm::default(),
        Some(Sensor::Rtd {
            element,
            wiring,
            lead_ohms,
        }) => SensorForm {
            kind: element.name().to_string(),
            wiring: wiring.count().to_string(),
            lead_ohms: if *lead_ohms > 0.0 {
                crate::display::trimmed(*lead_ohms)
            } else {
                String::new()
            },
            cold_junction: String::new(),
        },
        Some(Sensor::Thermocouple { tc, cj_c }) => SensorForm {
            kind: tc.letter().to_string(),
            cold_junction: crate::display::trimmed(*cj_c),
            ..Default::default()
        },
        Some(Sensor::DpLevel { .. }) => SensorForm {
            kind: KEPT_DP_LEVEL.to_string(),
            ..Default::default()
        },
    }
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
    /// As [`SensorForm::parse`], but the kind [`KEPT_DP_LEVEL`] gives `kept` when it is a
    /// DP level sensor (the tag's own, as saved; the form does not retype its setup).
    pub fn parse_keeping(&self, kept: Option<&Sensor>) -> Result<Option<Sensor>, FormError> {
        if self.kind.trim() == KEPT_DP_LEVEL {
            return match kept {
                Some(s @ Sensor::DpLevel { .. }) => Ok(Some(*s)),
                _ => Err(FormError::new(
                    Field::Sensor,
                    "has no DP level setup to keep; pick an RTD, a thermocouple or none",
                )),
            };
        }
        self.parse()
    }

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
    fn the_picker_lists_every_kind_and_reads_back_what_it_shows() {
        let c = choices("");
        assert_eq!(c.options.len(), 1 + SensorKind::ALL.len());
        assert_eq!((c.options[0].as_str(), c.current), (NO_SENSOR, 0));
        assert_eq!(c.options[1], "Pt100 RTD");
        assert_eq!(c.options[7], "type K thermocouple");
        for i in 0..c.options.len() {
            assert_eq!(choices(&picked(&c, i)).current, i);
        }
        assert_eq!(choices("type k").current, 7);
        // A DP level sensor (set in the tag's JSON) is offered only when the tag has one.
        let dp = choices(KEPT_DP_LEVEL);
        assert_eq!(dp.options[dp.current], KEPT_DP_LEVEL);
        assert_eq!(picked(&dp, dp.current), KEPT_DP_LEVEL);
        assert_eq!(picked(&c, c.options.len()), "");
        // 2, 3 and 4 wires, picked and read back; empty is 3-wire.
        for i in 0..WIRINGS.len() {
            assert_eq!(wiring_chosen(&wiring_picked(i)), i);
        }
        assert_eq!(WIRINGS[wiring_chosen("")], "3-wire");
    }

    #[test]
    fn a_recorded_sensor_fills_the_form_and_reads_back_the_same() {
        // TT-412 (demo plant): a Pt100 on two wires with 0,8 Ω of lead in all; and a type
        // J with its cold junction at 25 °C.
        for sensor in [
            Sensor::Rtd {
                element: RtdKind::Pt100,
                wiring: Wiring::TwoWire,
                lead_ohms: 0.8,
            },
            Sensor::Thermocouple {
                tc: TcType::J,
                cj_c: 25.0,
            },
        ] {
            assert_eq!(form_of(Some(&sensor)).parse().unwrap(), Some(sensor));
        }
        assert_eq!(form_of(None).parse().unwrap(), None);
        // A DP level sensor is kept as saved; nothing to keep is named.
        let kept = form_of(None);
        let dp = SensorForm {
            kind: KEPT_DP_LEVEL.into(),
            ..kept
        };
        assert_eq!(dp.parse_keeping(None).unwrap_err().field, Field::Sensor);
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
