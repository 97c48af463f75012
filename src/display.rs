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

/// Kilohms, one decimal: a leakage path of `55.0 kΩ`.
pub fn kilohms(value: f64) -> String {
    format!("{} kΩ", fixed(value, 1))
}

/// Capacitance in nF, one decimal: a HART loop's devices `10.0 nF`.
pub fn nanofarads(value_nf: f64) -> String {
    format!("{} nF", quoted_fixed(value_nf, 1))
}

/// A time constant in µs, one decimal: `20.1 µs`.
pub fn microseconds(value_us: f64) -> String {
    format!("{} µs", quoted_fixed(value_us, 1))
}

/// A valve position or demand in % of stroke, one decimal, a negative one with the
/// Unicode minus sign: `50.0 %`, `−0.4 %`.
pub fn stroke_percent(value: f64) -> String {
    format!("{} %", quoted_fixed(value, 1))
}

/// An error in % of stroke with its sign, one decimal: `+1.2 %`, `−0.4 %`, `0.0 %`.
pub fn stroke_error(value: f64) -> String {
    let s = quoted_fixed(value, 1);
    if s.starts_with('\u{2212}') || s.chars().all(|c| c == '0' || c == '.') {
        format!("{s} %")
    } else {
        format!("+{s} %")
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

/// A loop current as typed in a field beside its `mA` label, three decimals: `12.000`.
pub fn ma_number(value: f64) -> String {
    fixed(value, 3)
}

/// A current precise to a tenth of a microampere, for a reference's accuracy: `0.0040 mA`.
pub fn ma_fine(value: f64) -> String {
    format!("{} mA", fixed(value, 4))
}

/// A current on a band bar's scale, one decimal with a whole number bare: `4`, `3.6`,
/// `20.5`.
pub fn ma_label(value: f64) -> String {
    let s = fixed(value, 1);
    s.strip_suffix(".0").map(str::to_string).unwrap_or(s)
}

/// A percent of span in a field beside its `%` label, two decimals: `50.00`.
pub fn percent_number(value: f64) -> String {
    fixed(value, 2)
}

/// A small percent of span, three decimals: a resistor's reading error or a reference's
/// accuracy, `0.013 %`.
pub fn percent_fine(value: f64) -> String {
    format!("{} %", fixed(value, 3))
}

/// A check's test point, whole percent of span without the sign: `25`.
pub fn test_point(percent: f64) -> String {
    fixed(percent, 0)
}

/// A ratio such as a test uncertainty ratio, one decimal, written before `:1`: `4.2`.
pub fn ratio(value: f64) -> String {
    fixed(value, 1)
}

/// A whole number: a limit quoted as a round figure (`4`:1, `230`–`1100` Ω).
pub fn whole(value: f64) -> String {
    fixed(value, 0)
}

/// A setting typed in a form, one decimal, for a supply or a fault current beside its
/// unit: `24.0`, `22.0`.
pub fn setting_number(value: f64) -> String {
    fixed(value, 1)
}

/// Volts across a sense resistor, three decimals (1 mV): `3.000 V`.
pub fn sense_volts(value: f64) -> String {
    format!("{} V", sense_volts_number(value))
}

/// [`sense_volts`] in a field beside its `V` label: `3.000`.
pub fn sense_volts_number(value: f64) -> String {
    fixed(value, 3)
}

/// Watts dissipated in a resistor, three decimals: `0.144 W`.
pub fn watts(value: f64) -> String {
    format!("{} W", fixed(value, 3))
}

/// Small resistances (leads, their error), three decimals: `0.360 Ω`.
pub fn ohms_fine(value: f64) -> String {
    format!("{} Ω", fixed(value, 3))
}

/// A platinum RTD's resistance, four decimals (0.1 mΩ, about 0.00026 °C on a Pt100):
/// `109.7351 Ω`.
pub fn sensor_ohms(value: f64) -> String {
    format!("{} Ω", fixed(value, 4))
}

/// An RTD's resistance in the sensor calculator's field beside its `Ω` label, three
/// decimals: `109.735`.
pub fn sensor_ohms_number(value: f64) -> String {
    fixed(value, 3)
}

/// An RTD's sensitivity, five decimals: `0.38506 Ω/°C`.
pub fn ohms_per_degree(value: f64) -> String {
    format!("{} Ω/°C", fixed(value, 5))
}

/// A thermocouple's EMF, three decimals (1 µV): `4.096 mV`.
pub fn millivolts(value: f64) -> String {
    format!("{} mV", millivolts_number(value))
}

/// [`millivolts`] in a field beside its `mV` label: `4.096`.
pub fn millivolts_number(value: f64) -> String {
    fixed(value, 3)
}

/// A thermocouple's sensitivity, two decimals: `40.96 µV/°C`.
pub fn microvolts_per_degree(value: f64) -> String {
    format!("{} µV/°C", fixed(value, 2))
}

/// A temperature in the sensor calculator's field beside its `°C` label, two decimals:
/// `21.50`.
pub fn temperature_number(value_c: f64) -> String {
    fixed(value_c, 2)
}

/// A temperature given as a condition (a cold junction, a cable's), one decimal: `20.0 °C`.
pub fn temperature_setting(value_c: f64) -> String {
    format!("{} °C", fixed(value_c, 1))
}

/// A temperature worked out from an RTD or its error, three decimals: `21.500 °C`.
pub fn temperature_fine(value_c: f64) -> String {
    format!("{} °C", fixed(value_c, 3))
}

/// A conductor's cross-section, three decimals: `1.000 mm²`.
pub fn square_millimetres(value: f64) -> String {
    format!("{} mm²", fixed(value, 3))
}

/// A conductor's diameter, three decimals: `1.128 mm`.
pub fn millimetres(value: f64) -> String {
    format!("{} mm", fixed(value, 3))
}

/// A conductor's resistance per kilometre, three decimals: `18.100 Ω/km`.
pub fn ohms_per_km(value: f64) -> String {
    format!("{} Ω/km", fixed(value, 3))
}

/// A liquid level or height worked out from a DP, three decimals (1 mm): `2.250 m`.
pub fn height(value_m: f64) -> String {
    format!("{} m", fixed(value_m, 3))
}

/// A height on a sketch's label, two decimals, no sign and no unit: `0.60`.
pub fn height_label(value_m: f64) -> String {
    fixed(value_m.abs(), 2)
}

/// An engineering value in a field beside its unit, rounded for its span: `2.2500`.
pub fn value_number(value: f64, span: f64) -> String {
    fixed(value, decimals_for_span(span))
}

/// A value applied to a sensor's input in the sensor's own unit: whole pascals, else three
/// decimals: `109.735 Ω`, `4.096 mV`, `2500 Pa`.
pub fn sensor_input(value: f64, unit: &str) -> String {
    let decimals = if unit == "Pa" { 0 } else { 3 };
    format!("{} {unit}", fixed(value, decimals))
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
fn signed(value: f64, decimals: usize) -> String {
    let s = fixed(value, decimals);
    if s.starts_with('-') || s.chars().all(|c| c == '0' || c == '.') {
        s
    } else {
        format!("+{s}")
    }
}

/// A current error with its sign, three decimals: `+0.010 mA`, `-0.020 mA`.
pub fn signed_ma(value: f64) -> String {
    format!("{} mA", signed(value, 3))
}

/// An engineering-value error with its sign, rounded for the span, with its unit when it
/// has one: `+0.012 bar`, `-1.5`.
pub fn signed_value(value: f64, unit: &str, span: f64) -> String {
    let n = signed(value, decimals_for_span(span));
    if unit.is_empty() {
        n
    } else {
        format!("{n} {unit}")
    }
}

/// An error in % of span with its sign, two decimals, in a column headed `% of span`:
/// `+0.75`.
pub fn signed_percent_number(value: f64) -> String {
    signed(value, 2)
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

/// A number with a fixed count of decimals, never showing `-0.00`: the rounding every
/// named format above uses (private, so a call site says which quantity it shows).
fn fixed(value: f64, decimals: usize) -> String {
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
    fn named_formats_for_the_quantities_on_the_screens() {
        // 12 mA through a 250 Ω sense resistor: 12 mA × 250 Ω = 3 V, 0.036 W (Ohm's law).
        assert_eq!(sense_volts(0.012 * 250.0), "3.000 V");
        assert_eq!(sense_volts_number(0.012 * 250.0), "3.000");
        assert_eq!(watts(0.012 * 0.012 * 250.0), "0.036 W");
        // A Pt100 at 100 °C is 138.5055 Ω (IEC 60751 table), 0.38 Ω/°C near there.
        assert_eq!(sensor_ohms(138.5055), "138.5055 Ω");
        assert_eq!(sensor_ohms_number(138.5055), "138.506");
        assert_eq!(ohms_per_degree(0.379), "0.37900 Ω/°C");
        // A type K thermocouple at 100 °C gives 4.096 mV (NIST ITS-90 table), about
        // 41 µV/°C.
        assert_eq!(millivolts(4.096), "4.096 mV");
        assert_eq!(microvolts_per_degree(41.37), "41.37 µV/°C");
        // NE 43 limits on the band bar: whole numbers bare.
        assert_eq!(ma_label(4.0), "4");
        assert_eq!(ma_label(3.6), "3.6");
        assert_eq!(ma_label(20.5), "20.5");
        // A 1.0 mm² conductor is 1.128 mm across (d = 2·√(A/π)).
        assert_eq!(square_millimetres(1.0), "1.000 mm²");
        assert_eq!(
            millimetres(2.0 * (1.0 / std::f64::consts::PI).sqrt()),
            "1.128 mm"
        );
        assert_eq!(ohms_per_km(18.1), "18.100 Ω/km");
        // LT-101 (0–4.5 m): a value to 0.01 % of span, four decimals.
        assert_eq!(value_number(2.25, 4.5), "2.2500");
        assert_eq!(height(2.25), "2.250 m");
        assert_eq!(height_label(-0.6), "0.60");
        assert_eq!(test_point(25.0), "25");
        assert_eq!(ratio(4.23), "4.2");
        assert_eq!(whole(230.4), "230");
        assert_eq!(setting_number(24.0), "24.0");
        assert_eq!(temperature_setting(20.0), "20.0 °C");
        assert_eq!(sensor_input(2500.4, "Pa"), "2500 Pa");
        assert_eq!(sensor_input(138.5055, "Ω"), "138.506 Ω");
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
            ("kilohms", 1, kilohms),
            ("metres", 2, metres),
            ("trimmed", 6, trimmed),
            ("ma_setting", 1, ma_setting),
            ("ohms_whole", 0, ohms_whole),
            ("temperature", 2, temperature),
            ("quoted", 6, quoted),
            ("value (span 10)", 3, |v| value(v, "bar", 10.0)),
            ("value (span 3000)", 1, |v| value(v, "m³/h", 3000.0)),
            ("fixed 4", 4, |v| fixed(v, 4)),
            ("ma_number", 3, ma_number),
            ("ma_fine", 4, ma_fine),
            ("ma_label", 1, ma_label),
            ("percent_number", 2, percent_number),
            ("percent_fine", 3, percent_fine),
            ("test_point", 0, test_point),
            ("ratio", 1, ratio),
            ("whole", 0, whole),
            ("setting_number", 1, setting_number),
            ("sense_volts", 3, sense_volts),
            ("watts", 3, watts),
            ("ohms_fine", 3, ohms_fine),
            ("sensor_ohms", 4, sensor_ohms),
            ("sensor_ohms_number", 3, sensor_ohms_number),
            ("ohms_per_degree", 5, ohms_per_degree),
            ("millivolts", 3, millivolts),
            ("microvolts_per_degree", 2, microvolts_per_degree),
            ("temperature_number", 2, temperature_number),
            ("temperature_setting", 1, temperature_setting),
            ("temperature_fine", 3, temperature_fine),
            ("square_millimetres", 3, square_millimetres),
            ("millimetres", 3, millimetres),
            ("ohms_per_km", 3, ohms_per_km),
            ("height", 3, height),
            ("height_label", 2, height_label),
            ("value_number (span 10)", 3, |v| value_number(v, 10.0)),
            ("sensor_input (Ω)", 3, |v| sensor_input(v, "Ω")),
            ("sensor_input (Pa)", 0, |v| sensor_input(v, "Pa")),
            ("signed 3", 3, |v| signed(v, 3)),
            ("signed_ma", 3, signed_ma),
            ("signed_value (span 10)", 3, |v| {
                signed_value(v, "bar", 10.0)
            }),
            ("signed_percent_number", 2, signed_percent_number),
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
