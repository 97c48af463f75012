//! Reading numbers the way technicians type them.
//!
//! Accepts `12.5`, `12,5` (decimal comma), a leading `+`, the Unicode minus sign, an
//! exponent (`2.5e-3`), and an optional unit suffix (`250 ohm`, `2,5 bar`, `12mA`). Refuses
//! everything else — thousands separators, NaN, infinity, stray text — with a message that
//! names the field. This is the only place in loopside where text becomes a number.

use crate::error::{FieldError, Result};
use crate::units::{self, Unit};

/// Read a plain number (no unit) typed into `field`.
pub fn parse_number(field: &str, text: &str) -> Result<f64> {
    let (value, unit) = parse_quantity(field, text)?;
    match unit {
        None => Ok(value),
        Some(u) => Err(FieldError::new(
            field,
            format!("expected a plain number here, not one in {}", u.symbol),
        )),
    }
}

/// Read a number with an optional unit suffix: `2,5 bar` → (2.5, Some(bar)).
pub fn parse_quantity(field: &str, text: &str) -> Result<(f64, Option<&'static Unit>)> {
    let cleaned = text.trim().replace('\u{2212}', "-");
    if cleaned.is_empty() {
        return Err(FieldError::new(
            field,
            "is empty; type a number such as 12.5",
        ));
    }
    let split = number_prefix_len(&cleaned);
    let (number_text, unit_text) = cleaned.split_at(split);
    let unit_text = unit_text.trim();
    if number_text.is_empty() {
        return Err(FieldError::new(
            field,
            format!(
                "'{}' is not a number; type a number such as 12.5 or 12,5",
                text.trim()
            ),
        ));
    }
    let value = parse_plain(field, number_text, text)?;
    if unit_text.is_empty() {
        return Ok((value, None));
    }
    match units::lookup(unit_text) {
        Some(unit) => Ok((value, Some(unit))),
        None => Err(FieldError::new(
            field,
            format!(
                "'{}' is not a number or a number with a known unit",
                text.trim()
            ),
        )),
    }
}

/// Read a number that may carry a unit suffix, and express it in `unit`.
///
/// `parse_in("load", "0,25 kohm", "Ω")` gives 250. Without a suffix the number is taken
/// to be in `unit` already. A suffix of another quantity is an error naming the field, and
/// so is a gauge value typed into an absolute field or the reverse (`2 barg` where the
/// range is in `bara`): a field has no atmosphere to add, so it asks for the field's own
/// reference rather than assume the standard atmosphere.
pub fn parse_in(field: &str, text: &str, unit: &str) -> Result<f64> {
    let (value, typed_unit) = parse_quantity(field, text)?;
    match typed_unit {
        None => Ok(value),
        Some(typed) => {
            let target = units::lookup(unit)
                .ok_or_else(|| FieldError::new(field, format!("unknown unit '{unit}'")))?;
            if units::crosses_reference(typed, target) {
                return Err(FieldError::new(
                    field,
                    format!(
                        "{} is {} and this field is in {} ({}); type the value in {} or convert it first with the unit converter, which asks for the local atmosphere",
                        typed.symbol,
                        typed.reference.name(),
                        target.symbol,
                        target.reference.name(),
                        target.symbol
                    ),
                ));
            }
            units::convert_units(value, typed, target).map_err(|e| e.renamed(field))
        }
    }
}

/// Read a comma- or semicolon-separated list of numbers, e.g. `4, 8, 12` or `4,0; 8,0`.
///
/// A list with a `;` anywhere is split on `;` (so decimal commas work inside it);
/// otherwise it is split on `,` and decimal points are expected.
pub fn parse_list(field: &str, text: &str) -> Result<Vec<f64>> {
    let parts: Vec<&str> = if text.contains(';') {
        text.split(';').collect()
    } else {
        text.split(',').collect()
    };
    let mut out = Vec::with_capacity(parts.len());
    for (i, part) in parts.iter().enumerate() {
        if part.trim().is_empty() {
            return Err(FieldError::new(
                field,
                format!("item {} of the list is empty", i + 1),
            ));
        }
        out.push(parse_number(&format!("{field}[{}]", i + 1), part)?);
    }
    Ok(out)
}

/// Read a range written `LRV..URV` (e.g. `0..4,5`, `-20..80`, `250..0`).
pub fn parse_range(field: &str, text: &str) -> Result<(f64, f64)> {
    let Some((low, high)) = text.split_once("..") else {
        return Err(FieldError::new(
            field,
            format!(
                "'{}' is not a range; write it as LRV..URV, e.g. 0..10",
                text.trim()
            ),
        ));
    };
    let lrv = parse_number(&format!("{field} (LRV)"), low)?;
    let urv = parse_number(&format!("{field} (URV)"), high)?;
    Ok((lrv, urv))
}

/// How many leading bytes of `text` look like a number (sign, digits, one separator,
/// exponent). The rest is the unit suffix.
fn number_prefix_len(text: &str) -> usize {
    let bytes = text.as_bytes();
    let mut i = 0;
    if i < bytes.len() && (bytes[i] == b'+' || bytes[i] == b'-') {
        i += 1;
    }
    let start_digits = i;
    while i < bytes.len() && (bytes[i].is_ascii_digit() || bytes[i] == b'.' || bytes[i] == b',') {
        i += 1;
    }
    if i == start_digits {
        return 0;
    }
    // Exponent: e or E followed by optional sign and at least one digit.
    if i < bytes.len() && (bytes[i] == b'e' || bytes[i] == b'E') {
        let mut j = i + 1;
        if j < bytes.len() && (bytes[j] == b'+' || bytes[j] == b'-') {
            j += 1;
        }
        let exp_digits = j;
        while j < bytes.len() && bytes[j].is_ascii_digit() {
            j += 1;
        }
        if j > exp_digits {
            i = j;
        }
    }
    i
}

fn parse_plain(field: &str, number: &str, original: &str) -> Result<f64> {
    let commas = number.matches(',').count();
    let points = number.matches('.').count();
    if commas + points > 1 {
        return Err(FieldError::new(
            field,
            format!(
                "'{}' has more than one decimal separator; write 1234.5 or 1234,5 without thousands separators",
                original.trim()
            ),
        ));
    }
    let unsigned = number.strip_prefix('+').unwrap_or(number);
    let normal = unsigned.replace(',', ".");
    let digits = normal.trim_start_matches('-');
    if digits.starts_with('.') && digits.len() == 1 {
        return Err(FieldError::new(
            field,
            format!("'{}' is not a number", original.trim()),
        ));
    }
    let value: f64 = normal.parse().map_err(|_| {
        FieldError::new(
            field,
            format!(
                "'{}' is not a number; type a number such as 12.5 or 12,5",
                original.trim()
            ),
        )
    })?;
    crate::error::finite(field, value)
}

/// Read the local atmospheric pressure as typed (`0,95 bar`, `95kPa`, `14.2 psia`) into
/// pascals, for the field `field`.
///
/// The unit is required (a bare number could be bar or kPa) and must not be a gauge unit
/// (the atmosphere is 0 in gauge units by definition). Allowed:
/// [`units::ATMOSPHERE_MIN_PA`]–[`units::ATMOSPHERE_MAX_PA`] (30–110 kPa).
pub fn parse_atmosphere(field: &str, text: &str) -> Result<f64> {
    let (value, unit) = parse_quantity(field, text)?;
    let Some(unit) = unit else {
        return Err(FieldError::new(
            field,
            format!(
                "'{}' has no unit; give the local atmospheric pressure with its unit, such as 0,95 bar or 95 kPa (30 to 110 kPa)",
                text.trim()
            ),
        ));
    };
    if unit.quantity != units::Quantity::Pressure {
        return Err(FieldError::new(
            field,
            format!(
                "{} is not a pressure unit; give the atmospheric pressure such as 0,95 bar or 95 kPa",
                unit.symbol
            ),
        ));
    }
    if unit.reference == units::PressureRef::Gauge {
        return Err(FieldError::new(
            field,
            format!(
                "{} is a gauge unit, in which the atmosphere is 0 by definition; give it in an absolute or plain unit such as 95 kPa or 0,95 bar",
                unit.symbol
            ),
        ));
    }
    let pa = unit.to_si(value);
    if !(units::ATMOSPHERE_MIN_PA..=units::ATMOSPHERE_MAX_PA).contains(&pa) {
        return Err(FieldError::new(
            field,
            format!(
                "{} kPa is outside 30 to 110 kPa, the atmospheric pressures at which plants stand",
                crate::display::quoted_fixed(pa / 1000.0, 3)
            ),
        ));
    }
    Ok(pa)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn accepts_what_technicians_type() {
        assert_eq!(parse_number("ma", "12.5"), Ok(12.5));
        assert_eq!(parse_number("ma", "12,5"), Ok(12.5));
        assert_eq!(parse_number("ma", " +4 "), Ok(4.0));
        assert_eq!(parse_number("ma", "\u{2212}20"), Ok(-20.0));
        assert_eq!(parse_number("ma", "2.5e-3"), Ok(0.0025));
        assert_eq!(parse_number("ma", ",5"), Ok(0.5));
        assert_eq!(parse_in("load", "250 ohm", "Ω"), Ok(250.0));
        assert_eq!(parse_in("load", "0,25 kohm", "Ω"), Ok(250.0));
        assert_eq!(parse_in("p", "2,5 bar", "kPa"), Ok(250.0));
        let (v, u) = parse_quantity("p", "12mA").unwrap();
        assert_eq!((v, u.map(|u| u.symbol)), (12.0, Some("mA")));
    }

    #[test]
    fn refuses_everything_else_naming_the_field() {
        for bad in [
            "",
            "abc",
            "NaN",
            "inf",
            "1.234,5",
            "1,2,3",
            "12 furlongs",
            "-",
            ".",
            "+",
        ] {
            let e = parse_number("supply", bad).unwrap_err();
            assert_eq!(e.field, "supply", "{bad}");
        }
        assert!(parse_number("x", "1e999").is_err());
        assert!(parse_in("load", "2 bar", "Ω").is_err());
        assert!(parse_number("load", "250 ohm").is_err());
    }

    #[test]
    fn lists_and_ranges() {
        assert_eq!(parse_list("a", "4, 8,12"), Ok(vec![4.0, 8.0, 12.0]));
        assert_eq!(parse_list("a", "4,0; 8,5"), Ok(vec![4.0, 8.5]));
        assert!(parse_list("a", "4,,8").is_err());
        assert_eq!(parse_range("range", "-20..80"), Ok((-20.0, 80.0)));
        assert_eq!(parse_range("range", "0..4,5"), Ok((0.0, 4.5)));
        assert!(parse_range("range", "0-10").is_err());
    }
}
