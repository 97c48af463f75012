//! The unit converter's view model: a value in one unit of [`crate::units`] into another
//! of the same quantity, the notes that say what a symbol alone does not (which water, gauge
//! or absolute), and, between a gauge and an absolute unit, which atmosphere was used.
//!
//! The command line's `loopside units` prints [`UnitsView::lines`] and the Units screen
//! shows the same fields, so both say the same words. A plain pressure unit (`bar`, `kPa`)
//! is refused against a gauge or absolute one (`barg`, `psia`) with the message of
//! [`crate::units::convert_units_at`]: loopside never guesses which zero a pressure counts
//! from.

use crate::display;
use crate::error::Result;
use crate::number::parse_number;
use crate::units::{self, Quantity, Unit, STANDARD_ATMOSPHERE_PA};

/// Significant figures of a converted value.
const DIGITS: i32 = 7;

/// The quantities offered on the screen, in the order a technician meets them (percent
/// has one unit only, so there is nothing to convert).
pub const QUANTITIES: [Quantity; 9] = [
    Quantity::Pressure,
    Quantity::Length,
    Quantity::Temperature,
    Quantity::Volume,
    Quantity::VolumeFlow,
    Quantity::MassFlow,
    Quantity::Current,
    Quantity::Voltage,
    Quantity::Resistance,
];

/// What the converter was given, as typed.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct UnitsInput<'a> {
    /// The value (`2,5`, `-40`).
    pub value: &'a str,
    /// Its unit (symbol or any spelling [`units::lookup`] knows).
    pub from: &'a str,
    /// The unit wanted.
    pub to: &'a str,
    /// The local atmosphere with its unit (`0,95 bar`); empty for the standard atmosphere.
    pub atm: &'a str,
    /// What this front calls the atmosphere field, for the hint when it is empty
    /// (`--atm` on the command line, `Atmosphere` on the screen).
    pub atm_name: &'a str,
}

/// The converted value and what goes with it.
#[derive(Debug, Clone, PartialEq)]
pub struct UnitsView {
    /// The converted value, full precision (JSON, tests).
    pub value: f64,
    /// The unit's symbol.
    pub unit: String,
    /// `36.25939 psi`.
    pub answer: String,
    /// `inH2O@20C: inch of water at 68 °F (20 °C)…`, one per unit that has a note.
    pub notes: Vec<String>,
    /// The atmosphere used, Pa, when the conversion crossed gauge ↔ absolute.
    pub atm_pa: Option<f64>,
    /// Whether that atmosphere was typed (else the standard one).
    pub atm_given: bool,
    /// The line that says which atmosphere was used; empty when none was.
    pub atm_line: String,
}

impl UnitsView {
    /// The answer as the command line prints it: the value, the notes, the atmosphere.
    pub fn lines(&self) -> Vec<String> {
        let mut lines = vec![self.answer.clone()];
        lines.extend(self.notes.iter().cloned());
        if !self.atm_line.is_empty() {
            lines.push(self.atm_line.clone());
        }
        lines
    }
}

/// The atmosphere a conversion uses, Pa, and whether it was typed: the typed one (field
/// `atm`), or the standard atmosphere when the text is empty.
pub fn atmosphere(text: &str) -> Result<(f64, bool)> {
    if text.trim().is_empty() {
        Ok((STANDARD_ATMOSPHERE_PA, false))
    } else {
        Ok((crate::number::parse_atmosphere("atm", text)?, true))
    }
}

/// The line that says which atmosphere a gauge ↔ absolute conversion used; `atm_name` is
/// what this front calls the atmosphere field.
pub fn atmosphere_line(atm_pa: f64, given: bool, atm_name: &str) -> String {
    if given {
        format!(
            "atmosphere {} kPa, as given",
            display::significant(atm_pa / 1000.0, 6)
        )
    } else {
        format!(
            "atmosphere 101.325 kPa, the standard atmosphere (give {atm_name} for the local one)"
        )
    }
}

/// A unit as typed, or an error naming `field` and listing known units.
pub fn unit_of(field: &str, text: &str) -> Result<&'static Unit> {
    units::lookup(text).ok_or_else(|| units::unknown_unit(field, text))
}

/// Convert as typed. Errors name the field: `value`, `from`, `to` or `atm`.
pub fn view(input: UnitsInput<'_>) -> Result<UnitsView> {
    let value = parse_number("value", input.value)?;
    let from = unit_of("from", input.from)?;
    let to = unit_of("to", input.to)?;
    let (atm_pa, given) = atmosphere(input.atm)?;
    let result = units::convert_units_at(value, from, to, atm_pa)?;
    let crosses = units::crosses_reference(from, to);
    let notes = [from, to]
        .iter()
        .filter(|u| !u.note.is_empty())
        .map(|u| format!("{}: {}", u.symbol, u.note))
        .collect();
    Ok(UnitsView {
        value: result,
        unit: to.symbol.to_string(),
        answer: format!("{} {}", display::significant(result, DIGITS), to.symbol),
        notes,
        atm_pa: crosses.then_some(atm_pa),
        atm_given: crosses && given,
        atm_line: if crosses {
            atmosphere_line(atm_pa, given, input.atm_name)
        } else {
            String::new()
        },
    })
}

/// The names of [`QUANTITIES`], for the quantity picker.
pub fn quantity_names() -> Vec<&'static str> {
    QUANTITIES.iter().map(|q| q.name()).collect()
}

/// The quantity at `index` of [`QUANTITIES`] (pressure when out of range).
pub fn quantity_at(index: usize) -> Quantity {
    QUANTITIES.get(index).copied().unwrap_or(Quantity::Pressure)
}

/// The units offered for a quantity, in the units table's order.
pub fn symbols(quantity: Quantity) -> Vec<&'static str> {
    units::symbols_of(quantity)
}

/// The two units first offered for a quantity: the first two of its list.
pub fn default_pair(quantity: Quantity) -> (&'static str, &'static str) {
    let list = symbols(quantity);
    let first = list.first().copied().unwrap_or("");
    let second = list.get(1).copied().unwrap_or(first);
    (first, second)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn input<'a>(value: &'a str, from: &'a str, to: &'a str, atm: &'a str) -> UnitsInput<'a> {
        UnitsInput {
            value,
            from,
            to,
            atm,
            atm_name: "Atmosphere",
        }
    }

    #[test]
    fn two_and_a_half_bar_in_psi() {
        // 1 psi = 6 894.757 Pa (NIST SP 811 B.8); 250 000 / 6 894.757 = 36.259 43 psi.
        let v = view(input("2,5", "bar", "psi", "")).unwrap();
        assert_eq!(v.answer, "36.25943 psi");
        assert!((v.value - 36.259_43).abs() < 5e-6, "{}", v.value);
        assert!(v.notes.is_empty());
        assert_eq!(v.atm_line, "");
        assert_eq!(v.lines(), vec!["36.25943 psi".to_string()]);
    }

    #[test]
    fn minus_forty_is_the_same_on_both_scales() {
        // t/°F = 1.8 t/°C + 32 (NIST SP 811 B.9): −40 °C = −40 °F.
        let v = view(input("-40", "degC", "degF", "")).unwrap();
        assert_eq!(v.answer, "-40 °F");
    }

    #[test]
    fn a_water_column_says_which_water() {
        // 10 in of water at 20 °C: 10 × 0.0254 m × 998.2071 kg/m³ (CRC Handbook, water at
        // 20 °C) × 9.806 65 m/s² (NIST SP 811 B.8, g_n) = 2 486.42 Pa.
        let v = view(input("10", "inH2O@20C", "Pa", "")).unwrap();
        assert!(v.notes[0].starts_with("inH2O@20C: "), "{:?}", v.notes);
        assert!(v.notes[0].contains("68 °F (20 °C)"), "{:?}", v.notes);
        assert!((v.value - 2486.42).abs() < 0.01, "{}", v.value);
    }

    #[test]
    fn gauge_to_absolute_adds_the_atmosphere_and_says_which() {
        // 1 bara = 100 000 Pa; less 101 325 Pa (standard atmosphere, NIST SP 811) is
        // −1 325 Pa = −0.192 175 psig.
        let v = view(input("1", "bara", "psig", "")).unwrap();
        assert_eq!(v.answer, "-0.192175 psig");
        assert_eq!(v.atm_pa, Some(101_325.0));
        assert!(!v.atm_given);
        assert_eq!(
            v.atm_line,
            "atmosphere 101.325 kPa, the standard atmosphere (give Atmosphere for the local one)"
        );
        // 0 psig where the local atmosphere is 0,95 bar is 95 kPa absolute.
        let v = view(input("0", "psig", "kPa(a)", "0,95 bar")).unwrap();
        assert_eq!(v.answer, "95 kPa(a)");
        assert_eq!(v.atm_line, "atmosphere 95 kPa, as given");
        assert_eq!(v.lines().len(), 4, "{:?}", v.lines());
    }

    #[test]
    fn a_plain_pressure_is_refused_against_a_marked_one() {
        let e = view(input("1", "bar", "psig", "")).unwrap_err();
        assert_eq!(e.field, "from");
        assert!(
            e.reason.contains("write barg (gauge) or bara (absolute)"),
            "{}",
            e.reason
        );
        // The same words as the units module gives the command line.
        let same = units::convert(1.0, "bar", "psig").unwrap_err();
        assert_eq!(e, same);
    }

    #[test]
    fn bad_input_names_the_field() {
        assert_eq!(
            view(input("x", "bar", "psi", "")).unwrap_err().field,
            "value"
        );
        assert_eq!(
            view(input("1", "furlong", "psi", "")).unwrap_err().field,
            "from"
        );
        assert_eq!(view(input("1", "bar", "m³/h", "")).unwrap_err().field, "to");
        assert_eq!(
            view(input("1", "bara", "psig", "95")).unwrap_err().field,
            "atm"
        );
    }

    #[test]
    fn every_quantity_offers_two_units() {
        for q in QUANTITIES {
            let (a, b) = default_pair(q);
            assert_ne!(a, b, "{q:?}");
            assert!(view(input("1", a, b, "")).is_ok(), "{q:?}");
        }
        assert_eq!(quantity_at(99), Quantity::Pressure);
        assert_eq!(quantity_names()[0], "pressure");
        assert_eq!(quantity_names().len(), QUANTITIES.len());
    }
}
