//! The loop form: supply, sag, transmitter minimum, fault current, series elements and the
//! cable, as typed on the Power screen, the tag form or the command line's loop flags.

use super::conductor::{parse_conductor, parse_temp_c};
use super::{Field, FormError};
use crate::budget::{Cable, LoopConfig, SeriesElement};
use crate::number::parse_in;

/// One series element as typed: its name, its value, and whether it is a volt drop (else a
/// resistance in Ω).
#[derive(Debug, Clone, Default, PartialEq)]
pub struct ElementText {
    /// The element's name (`Card input`, `Barrier`); empty is named by its row.
    pub name: String,
    /// The value as typed, Ω or V (a unit suffix such as `0,25 kohm` is converted).
    pub value: String,
    /// A fixed volt drop (V) rather than a resistance (Ω).
    pub drop: bool,
}

impl ElementText {
    /// An element from a command-line flag, `NAME=VALUE` or just `VALUE` (then named
    /// `load N` or `drop N`, N counting that flag's repeats from 1).
    pub fn from_flag(text: &str, drop: bool, index: usize) -> ElementText {
        let (name, value) = match text.split_once('=') {
            Some((name, value)) if !name.trim().is_empty() => (name.trim().to_string(), value),
            _ => (
                format!("{} {index}", if drop { "drop" } else { "load" }),
                text,
            ),
        };
        ElementText {
            name,
            value: value.to_string(),
            drop,
        }
    }
}

/// The loop's fields as typed. Empty text means "not given": the sag is then 0 %, the
/// fault current the default, the conductor temperature 20 °C and the HART window the
/// standard one; supply and transmitter minimum must be given.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct LoopForm {
    /// Nominal supply, V.
    pub supply: String,
    /// How far the supply may sag below nominal, %.
    pub sag: String,
    /// Transmitter minimum terminal voltage (lift-off), V.
    pub tx_min: String,
    /// Upscale fault current the device drives, mA.
    pub fault: String,
    /// Series elements in loop order.
    pub elements: Vec<ElementText>,
    /// One-way cable length, m (empty: no cable entered).
    pub cable_m: String,
    /// Conductor size, `1.0 mm²` or `AWG 18`.
    pub conductor: String,
    /// Conductor temperature, °C.
    pub temp_c: String,
    /// Top of the HART resistance window, Ω.
    pub hart_max: String,
}

/// Read a required field.
fn required(field: Field, text: &str, unit: &str, what: &str) -> Result<f64, FormError> {
    if text.trim().is_empty() {
        return Err(FormError::new(
            field,
            format!("is empty; type {what} in {unit}"),
        ));
    }
    parse_in(field.name(), text, unit).map_err(FormError::at(field))
}

/// Read an optional field (`None` when empty).
fn optional(field: Field, text: &str, unit: &str) -> Result<Option<f64>, FormError> {
    if text.trim().is_empty() {
        return Ok(None);
    }
    parse_in(field.name(), text, unit)
        .map(Some)
        .map_err(FormError::at(field))
}

impl LoopForm {
    /// True when nothing about the loop was typed.
    pub fn is_empty(&self) -> bool {
        [
            &self.supply,
            &self.sag,
            &self.tx_min,
            &self.fault,
            &self.cable_m,
            &self.conductor,
            &self.temp_c,
            &self.hart_max,
        ]
        .iter()
        .all(|t| t.trim().is_empty())
            && self.elements.is_empty()
    }

    /// Build the loop; the error names the first field that is wrong (and the row of a
    /// series element).
    pub fn parse(&self) -> Result<LoopConfig, FormError> {
        let supply = required(Field::Supply, &self.supply, "V", "the nominal loop supply")?;
        let tx_min = required(
            Field::TxMin,
            &self.tx_min,
            "V",
            "the transmitter's minimum terminal voltage",
        )?;
        let mut c = LoopConfig::new(supply, tx_min);
        if let Some(sag) = optional(Field::SupplySag, &self.sag, "%")? {
            c.supply_tolerance_percent = sag;
        }
        c.fault_ma = optional(Field::FaultCurrent, &self.fault, "mA")?;
        if let Some(top) = optional(Field::HartMax, &self.hart_max, "Ω")? {
            c.hart_window_ohms.1 = top;
        }
        for (i, e) in self.elements.iter().enumerate() {
            let name = if e.name.trim().is_empty() {
                format!("element {}", i + 1)
            } else {
                e.name.trim().to_string()
            };
            let unit = if e.drop { "V" } else { "Ω" };
            let row_error = |reason: String| FormError {
                field: Field::SeriesElement,
                row: Some(i),
                reason: format!("{name}: {reason}"),
            };
            if e.value.trim().is_empty() {
                return Err(row_error(format!("is empty; type its value in {unit}")));
            }
            let value = parse_in(&name, &e.value, unit).map_err(|err| row_error(err.reason))?;
            if value < 0.0 || !value.is_finite() {
                return Err(row_error(format!("must be 0 {unit} or more, got {value}")));
            }
            c.elements.push(if e.drop {
                SeriesElement::drop(&name, value)
            } else {
                SeriesElement::ohms(&name, value)
            });
        }
        let temp_c = parse_temp_c(&self.temp_c)?;
        if let Some(one_way_m) = optional(Field::CableLength, &self.cable_m, "m")? {
            if one_way_m < 0.0 {
                return Err(FormError::new(
                    Field::CableLength,
                    format!("must be 0 m or more, got {one_way_m}"),
                ));
            }
            c.cable = Some(Cable {
                one_way_m,
                conductor: parse_conductor(&self.conductor)?,
                temp_c,
            });
        } else if !self.conductor.trim().is_empty() {
            // A size alone says nothing about the loop's resistance: parse it so a typo
            // is still caught, and ask for the length.
            parse_conductor(&self.conductor)?;
            return Err(FormError::new(
                Field::CableLength,
                "is empty; type the one-way cable length in m (or clear the conductor size)",
            ));
        }
        c.validate()
            .map_err(|e| FormError::from_core(e, Field::SeriesElement))?;
        Ok(c)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::wire::Conductor;

    fn level_loop() -> LoopForm {
        // A level loop: 24 V card supply that may sag 5 %, a transmitter needing 10,5 V,
        // a 250 Ω card input, an isolating barrier dropping 8 V, 180 m of 1.0 mm² pair.
        LoopForm {
            supply: "24".into(),
            sag: "5 %".into(),
            tx_min: "10,5".into(),
            fault: "21".into(),
            elements: vec![
                ElementText::from_flag("Card input=250", false, 1),
                ElementText::from_flag("8", true, 1),
            ],
            cable_m: "180".into(),
            conductor: "1.0 mm²".into(),
            ..Default::default()
        }
    }

    #[test]
    fn a_level_loop_as_typed() {
        let c = level_loop().parse().unwrap();
        assert_eq!(c.supply_volts, 24.0);
        assert_eq!(c.supply_tolerance_percent, 5.0);
        assert_eq!(c.tx_min_volts, 10.5);
        assert_eq!(c.fault_ma, Some(21.0));
        assert_eq!(c.elements[0].name, "Card input");
        assert_eq!(c.elements[1].name, "drop 1");
        let cable = c.cable.unwrap();
        assert_eq!(cable.one_way_m, 180.0);
        assert_eq!(cable.conductor, Conductor::Mm2(1.0));
        assert_eq!(cable.temp_c, 20.0);
    }

    #[test]
    fn each_bad_field_is_named() {
        type Spoil = fn(&mut LoopForm);
        let cases: [(Spoil, Field); 9] = [
            (|f| f.supply = "".into(), Field::Supply),
            (|f| f.supply = "-24".into(), Field::Supply),
            (|f| f.tx_min = "lots".into(), Field::TxMin),
            (|f| f.sag = "60".into(), Field::SupplySag),
            (|f| f.fault = "3.6".into(), Field::FaultCurrent),
            (|f| f.cable_m = "-1".into(), Field::CableLength),
            (|f| f.conductor = "thick".into(), Field::Conductor),
            (|f| f.temp_c = "400".into(), Field::ConductorTemp),
            (|f| f.hart_max = "100".into(), Field::HartMax),
        ];
        for (spoil, field) in cases {
            let mut f = level_loop();
            spoil(&mut f);
            assert_eq!(f.parse().unwrap_err().field, field, "{f:?}");
        }
        let mut f = level_loop();
        f.elements[1].value = "-2".into();
        let e = f.parse().unwrap_err();
        assert_eq!((e.field, e.row), (Field::SeriesElement, Some(1)));
        assert!(e.reason.starts_with("drop 1:"), "{e}");
        f.elements[1].value = "".into();
        assert_eq!(f.parse().unwrap_err().row, Some(1));
    }

    #[test]
    fn a_size_without_a_length_asks_for_the_length() {
        let mut f = level_loop();
        f.cable_m = "".into();
        assert_eq!(f.parse().unwrap_err().field, Field::CableLength);
        f.conductor = "".into();
        assert_eq!(f.parse().unwrap().cable, None);
    }
}
