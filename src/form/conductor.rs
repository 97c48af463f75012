//! The conductor form: size (mm² or AWG) as typed, and the conductor temperature.

use super::{Field, FormError};
use crate::number::{parse_in, parse_number};
use crate::wire::{Conductor, TEMP_RANGE_C};

/// The sizes offered by the screens' conductor picker: the common instrument-cable sizes
/// (metric pairs and the AWG gauges used for loop wiring; common practice). Any other size
/// can still be typed on the command line.
pub const COMMON_SIZES: [Conductor; 9] = [
    Conductor::Mm2(0.5),
    Conductor::Mm2(0.75),
    Conductor::Mm2(1.0),
    Conductor::Mm2(1.5),
    Conductor::Mm2(2.5),
    Conductor::Awg(22),
    Conductor::Awg(20),
    Conductor::Awg(18),
    Conductor::Awg(16),
];

/// The words of the picker's first option: no cable entered (the budget then has no
/// cable resistance of its own).
pub const NO_CABLE: &str = "no cable";

/// What a conductor picker offers: [`NO_CABLE`], then [`COMMON_SIZES`], then the size the
/// loop already has when it is none of those (an imported 0.22 mm² stays on the list
/// instead of being replaced), and which one is picked.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct ConductorChoices {
    /// The options, in words.
    pub options: Vec<String>,
    /// The one picked.
    pub current: usize,
}

/// The picker for a conductor size as the form holds it (`""` is [`NO_CABLE`]).
pub fn choices(current: &str) -> ConductorChoices {
    let mut options: Vec<String> = std::iter::once(NO_CABLE.to_string())
        .chain(COMMON_SIZES.iter().map(|c| c.label()))
        .collect();
    let current = if current.trim().is_empty() {
        0
    } else {
        let label = parse_conductor(current)
            .map(|c| c.label())
            .unwrap_or_else(|_| current.trim().to_string());
        match options.iter().position(|o| *o == label) {
            Some(i) => i,
            None => {
                options.push(label);
                options.len() - 1
            }
        }
    };
    ConductorChoices { options, current }
}

/// The form's text for option `index` of [`choices`] (`""` for [`NO_CABLE`]).
pub fn picked(choices: &ConductorChoices, index: usize) -> String {
    match choices.options.get(index) {
        Some(o) if index > 0 => o.clone(),
        _ => String::new(),
    }
}

/// Read a conductor size as typed: `1.0 mm²`, `1,5 mm2`, `1.5` (mm²), `18 AWG`, `AWG 18`,
/// `2/0 awg`.
pub fn parse_conductor(text: &str) -> Result<Conductor, FormError> {
    let t = text.trim();
    if t.is_empty() {
        return Err(FormError::new(
            Field::Conductor,
            "is empty; type a size such as 1.0 mm² or 18 AWG",
        ));
    }
    let lower = t.to_lowercase();
    if lower.contains("awg") {
        let bare = lower.replace("awg", "");
        return Conductor::parse_awg(bare.trim()).map_err(FormError::at(Field::Conductor));
    }
    let bare = t
        .trim_end_matches("mm²")
        .trim_end_matches("mm2")
        .trim_end_matches("mm^2")
        .trim();
    let area =
        parse_number(Field::Conductor.name(), bare).map_err(FormError::at(Field::Conductor))?;
    Conductor::mm2(area).map_err(FormError::at(Field::Conductor))
}

/// Read a conductor temperature in °C; empty is 20 °C, where resistance tables are given.
pub fn parse_temp_c(text: &str) -> Result<f64, FormError> {
    if text.trim().is_empty() {
        return Ok(20.0);
    }
    let t = parse_in(Field::ConductorTemp.name(), text, "°C")
        .map_err(FormError::at(Field::ConductorTemp))?;
    crate::error::within(
        Field::ConductorTemp.name(),
        t,
        TEMP_RANGE_C.0,
        TEMP_RANGE_C.1,
    )
    .map_err(FormError::at(Field::ConductorTemp))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_picker_keeps_an_uncommon_size_and_offers_no_cable() {
        let c = choices("1.0 mm²");
        assert_eq!(c.options[c.current], "1 mm²");
        assert_eq!(c.options[0], NO_CABLE);
        assert_eq!(picked(&c, 0), "");
        assert_eq!(parse_conductor(&picked(&c, 7)).unwrap(), Conductor::Awg(20));
        // A 0.22 mm² pair from an imported tag stays on the list, picked.
        let odd = choices("0,22 mm2");
        assert_eq!(odd.options.len(), COMMON_SIZES.len() + 2);
        assert_eq!(odd.options[odd.current], "0.22 mm²");
        assert_eq!(choices("").current, 0);
    }

    #[test]
    fn sizes_as_technicians_write_them() {
        assert_eq!(parse_conductor("1,5 mm2").unwrap(), Conductor::Mm2(1.5));
        assert_eq!(parse_conductor("1.0 mm²").unwrap(), Conductor::Mm2(1.0));
        assert_eq!(parse_conductor("0.75").unwrap(), Conductor::Mm2(0.75));
        assert_eq!(parse_conductor("18 AWG").unwrap(), Conductor::Awg(18));
        assert_eq!(parse_conductor("AWG 2/0").unwrap(), Conductor::Awg(-1));
        for size in COMMON_SIZES {
            assert_eq!(parse_conductor(&size.label()).unwrap(), size);
        }
        for bad in ["", "thick", "AWG 41", "0.01 mm²"] {
            assert_eq!(
                parse_conductor(bad).unwrap_err().field,
                Field::Conductor,
                "{bad}"
            );
        }
    }

    #[test]
    fn temperature_defaults_to_20_c_and_stays_in_the_table_range() {
        assert_eq!(parse_temp_c(" ").unwrap(), 20.0);
        assert_eq!(parse_temp_c("40,5").unwrap(), 40.5);
        assert_eq!(parse_temp_c("300").unwrap_err().field, Field::ConductorTemp);
    }
}
