//! The number-and-unit parser (`number::parse_quantity` and the readers built on it:
//! `parse_number`, `parse_list`, `parse_range`): `12,5`, `250 ohm`, `1.5mm²`, `93mA`.
//!
//! Invariant: a refused text names the field; an accepted one is a finite number, and
//! shown the ways loopside shows numbers (`display::value_number` for spans giving 0 to 6 decimals,
//! `trimmed`, `quoted` with its Unicode minus, `significant` to 7 digits) with its unit's
//! symbol after it, it reads back as the same unit and the same value within that
//! display's rounding. A plain number and a number with a unit are told apart the same way
//! by every reader.
#![no_main]

use libfuzzer_sys::fuzz_target;
use loopside::display;
use loopside::number::{parse_list, parse_number, parse_quantity, parse_range};

/// Half a unit in the last decimal shown, plus what binary floating point adds.
fn within(back: f64, value: f64, decimals: i32) -> bool {
    let allowed = 0.5 * 10f64.powi(-decimals) * (1.0 + 1e-9) + value.abs() * 1e-15;
    (back - value).abs() <= allowed
}

fuzz_target!(|input: &[u8]| {
    let Ok(text) = std::str::from_utf8(input) else {
        return;
    };
    let field = "reading";
    let plain = parse_number(field, text);
    let (value, unit) = match parse_quantity(field, text) {
        Ok(q) => q,
        Err(e) => {
            assert_eq!(e.field, field);
            assert!(plain.is_err());
            return;
        }
    };
    assert!(value.is_finite(), "{text:?} gave {value}");
    assert_eq!(plain.is_ok(), unit.is_none(), "{text:?}");
    if let Ok(v) = plain {
        assert_eq!(v.to_bits(), value.to_bits());
    }
    let symbol = unit.map(|u| u.symbol);
    if let Some(u) = unit {
        let found = loopside::units::lookup(u.symbol).map(|f| f.symbol);
        assert_eq!(
            found,
            Some(u.symbol),
            "the symbol {} reads as another unit",
            u.symbol
        );
    }
    let read_back = |shown: String, decimals: i32| {
        let typed = match symbol {
            Some(s) => format!("{shown} {s}"),
            None => shown,
        };
        let (back, back_unit) = parse_quantity(field, &typed)
            .unwrap_or_else(|e| panic!("{text:?} shown as {typed:?} does not read back: {e}"));
        assert_eq!(back_unit.map(|u| u.symbol), symbol, "{typed:?}");
        assert!(
            within(back, value, decimals),
            "{text:?} = {value} shown as {typed:?} reads back as {back}"
        );
    };
    // An engineering value rounded for spans from 10⁵ down to 10⁻² (0 to 6 decimals).
    for exponent in -2..=5 {
        let span = 10f64.powi(exponent);
        let decimals = display::decimals_for_span(span);
        read_back(display::value_number(value, span), decimals as i32);
    }
    read_back(display::trimmed(value), 6);
    read_back(display::quoted(value), 6);
    let magnitude = if value == 0.0 {
        0
    } else {
        value.abs().log10().floor() as i32
    };
    read_back(display::significant(value, 7), (6 - magnitude).clamp(0, 12));

    // The list and range readers built on it never panic, and agree on a single number.
    if let Ok(list) = parse_list(field, text) {
        assert!(list.iter().all(|v| v.is_finite()));
    }
    if let Ok((lrv, urv)) = parse_range(field, text) {
        assert!(lrv.is_finite() && urv.is_finite());
    }
    if !text.contains([',', ';']) {
        if let Ok(list) = parse_list(field, text) {
            assert_eq!(list, vec![value]);
        }
    }
});
