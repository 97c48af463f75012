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
    let s = fixed(value, 6);
    if s.contains('.') {
        s.trim_end_matches('0').trim_end_matches('.').to_string()
    } else {
        s
    }
}

/// A low-flow cutoff, in % of flow and the % of DP it equals (flow ∝ √ΔP):
/// `1 % of flow (0.01 % of DP)`.
pub fn cutoff(flow_percent: f64) -> String {
    format!(
        "{} % of flow ({} % of DP)",
        trimmed(flow_percent),
        trimmed(crate::scale::cutoff_dp_percent(flow_percent))
    )
}

/// A plain-number answer to `digits` significant figures, trailing zeros dropped (unit
/// conversions: `36.25939`, `-0.192175`, `0`).
pub fn significant(value: f64, digits: i32) -> String {
    if value == 0.0 || !value.is_finite() {
        return fixed(value, 0);
    }
    let magnitude = value.abs().log10().floor() as i32;
    let decimals = (digits - 1 - magnitude).clamp(0, 12) as usize;
    let s = fixed(value, decimals);
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

#[cfg(test)]
mod tests {
    use super::*;

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
    }
}
