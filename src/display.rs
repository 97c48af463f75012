//! Display rounding, in one place: how loopside writes numbers for people.
//!
//! Machine outputs (JSON, stored files) keep full precision; screens, reports and the
//! text output of the command line go through these functions so that a current always
//! shows as `12.000 mA`, a percent as `50.00 %`, and an engineering value with as many
//! decimals as its span deserves (0.01 % of span resolution).

/// A loop current, three decimals as on a process meter: `12.000 mA`.
pub fn ma(value: f64) -> String {
    format!("{} mA", fixed(value, 3))
}

/// A percent of span, two decimals: `50.00 %`.
pub fn percent(value: f64) -> String {
    format!("{} %", fixed(value, 2))
}

/// Volts, two decimals: `13.50 V`.
pub fn volts(value: f64) -> String {
    format!("{} V", fixed(value, 2))
}

/// Volts that may be short, two decimals, a shortfall with the Unicode minus sign:
/// `1.25 V`, `−0.40 V` (never `−0.00 V`).
pub fn volts_spare(value: f64) -> String {
    format!("{} V", quoted_fixed(value, 2))
}

/// Ohms, no decimals above 100 Ω and one below: `250 Ω`, `12.4 Ω`.
pub fn ohms(value: f64) -> String {
    if value.abs() >= 100.0 {
        format!("{} Ω", fixed(value, 0))
    } else {
        format!("{} Ω", fixed(value, 1))
    }
}

/// Metres of cable, no decimals above 10 m: `1432 m`.
pub fn metres(value: f64) -> String {
    if value.abs() >= 10.0 {
        format!("{} m", fixed(value, 0))
    } else {
        format!("{} m", fixed(value, 2))
    }
}

/// How many decimals an engineering value of this span needs for 0.01 % resolution
/// (span 10 → 3 decimals, span 3000 → 1, span 0.5 → 5), capped at 6.
pub fn decimals_for_span(span: f64) -> usize {
    let step = (span.abs() * 1e-4).max(1e-12);
    let d = -step.log10().floor();
    d.clamp(0.0, 6.0) as usize
}

/// An engineering value with its unit, rounded for its span: `2.250 m`, `1500.0 m³/h`.
pub fn value(value: f64, unit: &str, span: f64) -> String {
    let n = fixed(value, decimals_for_span(span));
    if unit.is_empty() {
        n
    } else {
        format!("{n} {unit}")
    }
}

/// A number as typed: up to six decimals, trailing zeros dropped (`1`, `0.01`, `2.5`).
pub fn trimmed(value: f64) -> String {
    trim_zeros(fixed(value, 6))
}

/// A current named as a setting or a test point, one decimal: `20.0 mA`, `22.0 mA`.
pub fn ma_setting(value: f64) -> String {
    format!("{} mA", fixed(value, 1))
}

/// Ohms rounded to whole ohms, for loop resistances and windows: `250 Ω`, `1100 Ω`.
pub fn ohms_whole(value: f64) -> String {
    format!("{} Ω", fixed(value, 0))
}

/// A temperature, two decimals: `21.50 °C`.
pub fn temperature(value_c: f64) -> String {
    format!("{} °C", fixed(value_c, 2))
}

/// A number with an explicit sign, for errors and deviations: `+0.010`, `-0.020`, `0.000`
/// (zero has no sign).
pub fn signed(value: f64, decimals: usize) -> String {
    let s = fixed(value, decimals);
    if s.starts_with('-') || s.chars().all(|c| c == '0' || c == '.') {
        s
    } else {
        format!("+{s}")
    }
}

/// A number to `digits` significant digits, trailing zeros dropped: unit conversions
/// (`significant(1.2345678, 4)` → `1.235`, `significant(101325.0, 7)` → `101325`).
pub fn significant(value: f64, digits: i32) -> String {
    if value == 0.0 || !value.is_finite() {
        return trimmed(value);
    }
    let magnitude = value.abs().log10().floor() as i32;
    let decimals = (digits - 1 - magnitude).clamp(0, 12) as usize;
    trim_zeros(fixed(value, decimals))
}

/// A number quoted in a message (an error or a finding), as typed: up to six decimals,
/// trailing zeros dropped, and a negative one with the Unicode minus sign so it cannot be
/// read as a dash: `−200`, `12.5`.
pub fn quoted(value: f64) -> String {
    unicode_minus(trimmed(value))
}

/// A number quoted in a message with a fixed count of decimals and the Unicode minus sign:
/// `quoted_fixed(18.52008, 3)` → `18.520`, `quoted_fixed(-0.5, 2)` → `−0.50`.
pub fn quoted_fixed(value: f64, decimals: usize) -> String {
    unicode_minus(fixed(value, decimals))
}

fn unicode_minus(s: String) -> String {
    match s.strip_prefix('-') {
        Some(rest) => format!("\u{2212}{rest}"),
        None => s,
    }
}

fn trim_zeros(s: String) -> String {
    if s.contains('.') {
        s.trim_end_matches('0').trim_end_matches('.').to_string()
    } else {
        s
    }
}

/// A number with a fixed count of decimals, never showing `-0.00`.
pub fn fixed(value: f64, decimals: usize) -> String {
    let s = format!("{value:.decimals$}");
    if s.starts_with('-') && s[1..].chars().all(|c| c == '0' || c == '.') {
        s[1..].to_string()
    } else {
        s
    }
}

/// Intrinsic-safety quantities, as certificates write them, with the Unicode minus sign
/// on a shortfall: capacitance in nF, one decimal (`83.0 nF`, `−2.0 nF`).
pub fn is_nanofarads(farads: f64) -> String {
    format!("{} nF", quoted_fixed(farads * 1e9, 1))
}

/// Inductance in mH, three decimals: `4.200 mH`, `0.140 mH`.
pub fn is_millihenries(henries: f64) -> String {
    format!("{} mH", quoted_fixed(henries * 1e3, 3))
}

/// An inductance-to-resistance ratio in µH/Ω, one decimal: `55.0 µH/Ω`.
pub fn is_microhenries_per_ohm(henries_per_ohm: f64) -> String {
    format!("{} µH/Ω", quoted_fixed(henries_per_ohm * 1e6, 1))
}

/// Voltage of an IS rating or margin, two decimals: `28.00 V`, `−4.00 V`.
pub fn is_volts(volts: f64) -> String {
    format!("{} V", quoted_fixed(volts, 2))
}

/// Current of an IS rating or margin in mA, one decimal: `93.0 mA`, `−3.0 mA`.
pub fn is_ma(ma: f64) -> String {
    format!("{} mA", quoted_fixed(ma, 1))
}

/// Power of an IS rating or margin in W, three decimals: `0.650 W`, `−0.050 W`.
pub fn is_watts(watts: f64) -> String {
    format!("{} W", quoted_fixed(watts, 3))
}

/// A margin as a percent of its limit, one decimal: `69.9 %`, `−16.7 %`.
pub fn is_margin_percent(percent: f64) -> String {
    format!("{} %", quoted_fixed(percent, 1))
}

#[cfg(test)]
mod tests {
    use super::*;
    use proptest::prelude::*;

    #[test]
    fn rounding_rules() {
        assert_eq!(ma(12.0), "12.000 mA");
        assert_eq!(percent(-0.0001), "0.00 %");
        assert_eq!(decimals_for_span(10.0), 3);
        assert_eq!(decimals_for_span(3000.0), 1);
        assert_eq!(decimals_for_span(-250.0), 2);
        assert_eq!(value(2.25, "m", 4.5), "2.2500 m");
        assert_eq!(ohms(250.0), "250 Ω");
        assert_eq!(ohms(12.44), "12.4 Ω");
        assert_eq!(ma_setting(22.0), "22.0 mA");
        assert_eq!(ohms_whole(1100.4), "1100 Ω");
        assert_eq!(temperature(21.5), "21.50 °C");
        assert_eq!(volts_spare(-0.4), "\u{2212}0.40 V");
        assert_eq!(volts_spare(-0.001), "0.00 V");
        assert_eq!(is_nanofarads(83e-9), "83.0 nF");
        assert_eq!(is_nanofarads(-2e-9), "\u{2212}2.0 nF");
        assert_eq!(is_millihenries(140e-6), "0.140 mH");
        assert_eq!(is_microhenries_per_ohm(55e-6), "55.0 µH/Ω");
        assert_eq!(is_ma(93.0), "93.0 mA");
        assert_eq!(is_watts(0.65), "0.650 W");
        assert_eq!(is_margin_percent(-16.6667), "\u{2212}16.7 %");
    }

    #[test]
    fn signs_and_significant_digits() {
        assert_eq!(signed(0.01, 3), "+0.010");
        assert_eq!(signed(-0.02, 3), "-0.020");
        assert_eq!(signed(-0.0004, 3), "0.000");
        // 1 atm = 101.325 kPa exactly (NIST SP 811).
        assert_eq!(significant(101.325, 6), "101.325");
        assert_eq!(significant(1.2345678, 4), "1.235");
        assert_eq!(significant(0.0, 6), "0");
    }

    #[test]
    fn message_numbers_use_the_minus_sign() {
        assert_eq!(quoted(-200.0), "\u{2212}200");
        assert_eq!(quoted(12.5), "12.5");
        assert_eq!(quoted_fixed(18.52008, 3), "18.520");
        assert_eq!(quoted_fixed(-0.5, 2), "\u{2212}0.50");
    }

    /// A named format: its name, the decimals it rounds to near zero, and the function.
    type Format = (&'static str, usize, fn(f64) -> String);

    /// Every named format, with the decimals it rounds to for a value near zero.
    fn near_zero_formats() -> Vec<Format> {
        vec![
            ("ma", 3, ma),
            ("percent", 2, percent),
            ("volts", 2, volts),
            ("volts_spare", 2, volts_spare),
            ("ohms", 1, ohms),
            ("metres", 2, metres),
            ("trimmed", 6, trimmed),
            ("ma_setting", 1, ma_setting),
            ("ohms_whole", 0, ohms_whole),
            ("temperature", 2, temperature),
            ("quoted", 6, quoted),
            ("value (span 10)", 3, |v| value(v, "bar", 10.0)),
            ("value (span 3000)", 1, |v| value(v, "m³/h", 3000.0)),
            ("fixed 4", 4, |v| fixed(v, 4)),
            ("signed 3", 3, |v| signed(v, 3)),
            ("quoted_fixed 2", 2, |v| quoted_fixed(v, 2)),
        ]
    }

    fn has_minus(s: &str) -> bool {
        s.contains('-') || s.contains('\u{2212}')
    }

    #[test]
    fn negative_zero_itself_prints_without_a_sign() {
        for (name, _, f) in near_zero_formats() {
            assert!(!has_minus(&f(-0.0)), "{name}: {}", f(-0.0));
        }
        assert_eq!(significant(-0.0, 6), "0");
        assert_eq!(trimmed(-1e-9), "0");
    }

    proptest! {
        /// Any negative value small enough to round to zero at a format's decimals prints
        /// as zero, never `-0.00`.
        #[test]
        fn a_value_that_rounds_to_zero_prints_without_a_minus(fraction in 0.0f64..0.999) {
            for (name, decimals, f) in near_zero_formats() {
                let v = -fraction * 0.5 * 10f64.powi(-(decimals as i32));
                let shown = f(v);
                prop_assert!(!has_minus(&shown), "{}({}) = {}", name, v, shown);
            }
        }
    }
}
