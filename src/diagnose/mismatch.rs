//! "It reads wrong": which configuration mistake explains the numbers?
//!
//! Two places where a reading can go wrong are tested with the same hypotheses:
//!
//! - **at the receiver**: the transmitter sends current I, the receiver shows A, but the
//!   tag's scale says it should show E = value(I);
//! - **at the transmitter**: the process is at P (applied with a calibrator or read on a
//!   trusted gauge), but the transmitter sends I instead of the current(P) the tag calls for.
//!
//! Each hypothesis predicts what would be seen if it were true; those whose prediction
//! lies within the fit tolerance (% of span) are reported, closest first:
//!
//! - engineering units mixed up — the observed value is the expected one expressed in
//!   another unit of the same quantity (factors from [`crate::units`], NIST SP 811);
//! - square root taken twice (one root too many) or not at all (one too few);
//! - reversed action (4 and 20 mA swapped);
//! - a different input resistor on a voltage input (receiver only): the card reads volts
//!   across R_actual and scales them as if across R_assumed, so it sees I·R_actual/R_assumed;
//! - a characterization table not applied (the receiver shows the measured variable);
//! - a different range — one reading cannot fix both ends, so the range is solved with one
//!   end kept (the LRV, then the URV); a solved end that lands on a round number (two
//!   significant digits) is the likely one. This hypothesis always "fits", so it is listed
//!   after the others.

use crate::error::{finite, FieldError, Result};
use crate::scale::{RootLocation, Scale, Transfer};
use crate::units;
use serde::{Deserialize, Serialize};

/// Input resistors commonly found on voltage inputs, Ω (common practice: 250 Ω gives
/// 1–5 V; 500 Ω gives 2–10 V; 100 Ω and 50 Ω appear on low-voltage cards).
pub const COMMON_INPUT_OHMS: [f64; 4] = [250.0, 500.0, 100.0, 50.0];

/// Where the mismatch was found.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum MismatchAt {
    /// Between the loop current and the receiver's display.
    Receiver,
    /// Between the process and the loop current.
    Transmitter,
}

/// Which end of the range a solved range kept from the tag.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum KeptEnd {
    /// The LRV is the tag's; the URV was solved.
    Lrv,
    /// The URV is the tag's; the LRV was solved.
    Urv,
}

/// One explanation of a mismatch.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "kebab-case")]
pub enum Hypothesis {
    /// Engineering units mixed up: the value is shown in `shown_unit` instead of
    /// `expected_unit`.
    UnitsMixedUp {
        /// The tag's unit.
        expected_unit: String,
        /// The unit the numbers turn out to be in.
        shown_unit: String,
        /// How many `shown_unit` make one `expected_unit` (ratio of SI factors).
        factor: f64,
    },
    /// `roots` square roots more than the tag calls for.
    ExtraSquareRoot {
        /// How many roots too many.
        roots: u8,
    },
    /// A square root the tag calls for is not taken.
    MissingSquareRoot,
    /// 4 and 20 mA swapped.
    Reversed,
    /// Input resistor differs from the one the card's scaling assumes.
    InputResistor {
        /// The resistor fitted, Ω.
        actual_ohms: f64,
        /// The resistor the scaling assumes, Ω.
        assumed_ohms: f64,
    },
    /// The characterization table is not applied: the measured variable is shown.
    TableNotApplied,
    /// The device is ranged differently; solved with one end kept.
    DifferentRange {
        /// Solved (or kept) LRV.
        lrv: f64,
        /// Solved (or kept) URV.
        urv: f64,
        /// Unit of the range.
        unit: String,
        /// Which end was kept.
        kept: KeptEnd,
        /// The solved end is a round number (two significant digits) within tolerance.
        round: bool,
    },
}

impl Hypothesis {
    /// The stable machine name.
    pub fn code(&self) -> &'static str {
        match self {
            Hypothesis::UnitsMixedUp { .. } => "units-mixed-up",
            Hypothesis::ExtraSquareRoot { .. } => "extra-square-root",
            Hypothesis::MissingSquareRoot => "missing-square-root",
            Hypothesis::Reversed => "reversed",
            Hypothesis::InputResistor { .. } => "input-resistor",
            Hypothesis::TableNotApplied => "table-not-applied",
            Hypothesis::DifferentRange { .. } => "different-range",
        }
    }
}

/// A hypothesis that fits, with what it predicts and how closely.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Explanation {
    /// The hypothesis.
    pub hypothesis: Hypothesis,
    /// What it predicts would be observed (value at the receiver, mA at the transmitter).
    pub predicted: f64,
    /// |observed − predicted| as % of span.
    pub residual_pct: f64,
}

/// One reading compared with what the tag's range says it should be, with what the words
/// of its explanations need from the tag (the spans values are rounded for, the range and
/// where a square root is taken).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Reading {
    /// Where.
    pub at: MismatchAt,
    /// The loop current, mA.
    pub current_ma: f64,
    /// The process value (transmitter comparisons only), in the range unit.
    pub process_value: Option<f64>,
    /// What should be observed.
    pub expected: f64,
    /// What was observed.
    pub observed: f64,
    /// Unit of `expected` and `observed`.
    pub unit: String,
    /// (observed − expected) as % of span.
    pub difference_pct: f64,
    /// Tolerance used to call a fit, % of span.
    pub fit_tolerance_pct: f64,
    /// Observed agrees with expected within the tolerance.
    pub agrees: bool,
    /// The span `expected` and `observed` are rounded for (the displayed range's at the
    /// receiver, the tag's range at the transmitter), in `unit` at the receiver and in
    /// `range_unit` at the transmitter.
    pub value_span: f64,
    /// The tag's LRV, in `range_unit`.
    pub range_lrv: f64,
    /// The tag's URV, in `range_unit`.
    pub range_urv: f64,
    /// The unit of the tag's range (the measured variable's, for a table).
    pub range_unit: String,
    /// Where the tag takes the square root of a DP flow signal (`None`: no root).
    #[serde(default)]
    pub root_in: Option<RootLocation>,
}

/// The worked comparison: the reading and the hypotheses that fit it.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Mismatch {
    /// The reading compared.
    #[serde(flatten)]
    pub reading: Reading,
    /// The hypotheses that fit, most specific and closest first.
    pub explanations: Vec<Explanation>,
}

impl Mismatch {
    /// True when at least one hypothesis other than a solved range fits, or a solved
    /// range lands on a round number.
    pub fn explained(&self) -> bool {
        self.explanations.iter().any(|e| match e.hypothesis {
            Hypothesis::DifferentRange { round, .. } => round,
            _ => true,
        })
    }
}

/// Value span of the display (positive).
fn display_span(scale: &Scale) -> Result<f64> {
    let lo = scale.from_percent(0.0)?.value;
    let hi = scale.from_percent(100.0)?.value;
    Ok((hi - lo).abs())
}

/// Round to two significant digits: the round number a solved range end is likely meant
/// to be.
pub fn round2(v: f64) -> f64 {
    if v == 0.0 || !v.is_finite() {
        return v;
    }
    let mag = v.abs().log10().floor() - 1.0;
    let step = 10f64.powf(mag);
    (v / step).round() * step
}

/// Where the tag takes the square root (`None` for a linear loop or a table).
fn root_location(scale: &Scale) -> Option<RootLocation> {
    match &scale.transfer {
        Transfer::SquareRoot { root_in, .. } => Some(*root_in),
        _ => None,
    }
}

/// Receiver roots configured: 1 when the receiver extracts the root.
fn receiver_roots(scale: &Scale) -> Option<u8> {
    match &scale.transfer {
        Transfer::Linear => Some(0),
        Transfer::SquareRoot { root_in, .. } => Some(match root_in {
            RootLocation::Receiver => 1,
            RootLocation::Transmitter => 0,
        }),
        Transfer::Table(_) => None,
    }
}

fn sort_explanations(list: &mut [Explanation]) {
    let rank = |e: &Explanation| match e.hypothesis {
        Hypothesis::DifferentRange { round: true, .. } => 1,
        Hypothesis::DifferentRange { round: false, .. } => 2,
        _ => 0,
    };
    list.sort_by(|a, b| {
        rank(a)
            .cmp(&rank(b))
            .then(a.residual_pct.total_cmp(&b.residual_pct))
    });
}

/// The receiver shows `shown` while the loop carries `current_ma`: is it configured as the
/// tag says, and if not, what explains it? `resistors` are input resistors known from the
/// tag's loop (tried before the common values).
pub fn explain_display(
    scale: &Scale,
    current_ma: f64,
    shown: f64,
    fit_tolerance_pct: f64,
    resistors: &[f64],
) -> Result<Mismatch> {
    let current = finite("tx_ma", current_ma)?;
    let shown = finite("displayed", shown)?;
    let tol = crate::error::positive("fit tolerance", fit_tolerance_pct)?;
    let span_v = display_span(scale)?;
    if span_v <= 0.0 {
        return Err(FieldError::new(
            "range",
            "the displayed value does not change over the range",
        ));
    }
    let unit = scale.value_unit().to_string();
    let pct = scale.signal.percent_of(current);
    let expected = scale.from_ma(current)?.value;
    let residual = |pred: f64| (shown - pred).abs() / span_v * 100.0;
    let difference_pct = (shown - expected) / span_v * 100.0;
    let agrees = difference_pct.abs() <= tol;
    let mut out = Mismatch {
        reading: Reading {
            at: MismatchAt::Receiver,
            current_ma: current,
            process_value: None,
            expected,
            observed: shown,
            unit: unit.clone(),
            difference_pct,
            fit_tolerance_pct: tol,
            agrees,
            value_span: span_v,
            range_lrv: scale.lrv,
            range_urv: scale.urv,
            range_unit: scale.unit.clone(),
            root_in: root_location(scale),
        },
        explanations: Vec::new(),
    };
    if agrees {
        return Ok(out);
    }
    let mut found: Vec<Explanation> = Vec::new();
    let push = |found: &mut Vec<Explanation>, h: Hypothesis, predicted: f64| {
        let r = residual(predicted);
        if r <= tol {
            found.push(Explanation {
                hypothesis: h,
                predicted,
                residual_pct: r,
            });
        }
    };

    // Engineering units mixed up.
    for (shown_unit, predicted, factor) in unit_alternatives(&unit, expected)? {
        let span_x = unit_span(&unit, &shown_unit, scale)?;
        let r = (shown - predicted).abs() / span_x * 100.0;
        if r <= tol {
            found_units(&mut found, &unit, &shown_unit, predicted, factor, r);
        }
    }

    // Reversed action.
    let reversed = scale.from_percent(100.0 - pct)?.value;
    push(&mut found, Hypothesis::Reversed, reversed);

    // Square root taken twice or not at all.
    if let Some(r0) = receiver_roots(scale) {
        let c = (pct / 100.0).max(0.0);
        let candidates: &[u8] = if r0 == 0 { &[1] } else { &[0, 2] };
        for &r in candidates {
            let fraction = c.powf(0.5f64.powi(r as i32));
            let predicted = scale.lrv + fraction * scale.span();
            let h = if r > r0 {
                Hypothesis::ExtraSquareRoot { roots: r - r0 }
            } else {
                Hypothesis::MissingSquareRoot
            };
            push(&mut found, h, predicted);
        }
    }

    // A different input resistor on a voltage input.
    if current > 0.5 {
        let mut candidates: Vec<f64> = Vec::new();
        for r in resistors.iter().chain(COMMON_INPUT_OHMS.iter()) {
            if r.is_finite() && *r > 0.0 && !candidates.iter().any(|c| (c - r).abs() < 1e-9) {
                candidates.push(*r);
            }
        }
        let mut ratios: Vec<f64> = Vec::new();
        for &actual in &candidates {
            for &assumed in &candidates {
                if (actual - assumed).abs() < 1e-9 {
                    continue;
                }
                let k = actual / assumed;
                if ratios.iter().any(|q| (q - k).abs() < 1e-9) {
                    continue;
                }
                let predicted = scale.from_ma(current * k)?.value;
                if residual(predicted) <= tol {
                    ratios.push(k);
                    push(
                        &mut found,
                        Hypothesis::InputResistor {
                            actual_ohms: actual,
                            assumed_ohms: assumed,
                        },
                        predicted,
                    );
                }
            }
        }
    }

    // A table that is not applied.
    if let Transfer::Table(_) = &scale.transfer {
        let measured = scale.lrv + pct / 100.0 * scale.span();
        let r = (shown - measured).abs() / scale.span().abs() * 100.0;
        if r <= tol {
            found.push(Explanation {
                hypothesis: Hypothesis::TableNotApplied,
                predicted: measured,
                residual_pct: r,
            });
        }
    }

    // A different range, solved with one end kept.
    let to_domain = |v: f64| match &scale.transfer {
        Transfer::Table(t) => t.input_for(v),
        _ => v,
    };
    let t = (to_domain(expected) - scale.lrv) / scale.span();
    let a = to_domain(shown);
    found.extend(solve_ranges(scale, t, a, tol, shown));

    sort_explanations(&mut found);
    out.explanations = found;
    Ok(out)
}

fn found_units(
    found: &mut Vec<Explanation>,
    unit: &str,
    shown_unit: &str,
    predicted: f64,
    factor: f64,
    residual_pct: f64,
) {
    found.push(Explanation {
        hypothesis: Hypothesis::UnitsMixedUp {
            expected_unit: unit.to_string(),
            shown_unit: shown_unit.to_string(),
            factor,
        },
        predicted,
        residual_pct,
    });
}

/// A unit a range could have been typed in by mistake instead of `u`: same quantity, same
/// reference (a gauge range mixed up with an absolute one is an offset, not a factor), and
/// a different size (`bar` and `barg` are the same numbers).
fn is_scale_alternative(u: &units::Unit, x: &units::Unit) -> bool {
    x.quantity == u.quantity && x.reference == u.reference && x.factor != u.factor
}

/// Every other unit of the same quantity: (symbol, the expected value in it, factor).
fn unit_alternatives(unit: &str, expected: f64) -> Result<Vec<(String, f64, f64)>> {
    let Some(u) = units::lookup(unit) else {
        return Ok(Vec::new());
    };
    let mut out = Vec::new();
    for x in units::UNITS.iter().filter(|x| is_scale_alternative(u, x)) {
        let v = units::convert_units(expected, u, x)?;
        out.push((x.symbol.to_string(), v, u.factor / x.factor));
    }
    Ok(out)
}

/// Span of the tag's displayed range expressed in another unit (positive).
fn unit_span(unit: &str, other: &str, scale: &Scale) -> Result<f64> {
    let lo = scale.from_percent(0.0)?.value;
    let hi = scale.from_percent(100.0)?.value;
    Ok((units::convert(hi, unit, other)? - units::convert(lo, unit, other)?).abs())
}

/// Solve a different range: the device maps `a` (a value in the range's domain) to the
/// fraction `t` of its span, where the tag's range would not. With one end kept the other
/// follows: U' = LRV + (a − LRV)/t, or L' = (a − URV·t)/(1 − t). At the receiver `t` is
/// the fraction the current stands for and `a` the value shown; at the transmitter `a` is
/// the process value and `t` the fraction of span its current shows. `predicted` is what
/// is observed (the solved range reproduces it exactly).
fn solve_ranges(scale: &Scale, t: f64, a: f64, tol: f64, predicted: f64) -> Vec<Explanation> {
    let (lrv, urv, span) = (scale.lrv, scale.urv, scale.span());
    let unit = scale.unit.clone();
    let mut out = Vec::new();
    if t.abs() > 1e-6 {
        let new_urv = lrv + (a - lrv) / t;
        let uncertainty = tol / 100.0 * span.abs() / t.abs();
        let round = (new_urv - round2(new_urv)).abs() <= uncertainty && new_urv != lrv;
        if new_urv.is_finite() && (new_urv - lrv).abs() > 1e-12 {
            out.push(Explanation {
                hypothesis: Hypothesis::DifferentRange {
                    lrv,
                    urv: new_urv,
                    unit: unit.clone(),
                    kept: KeptEnd::Lrv,
                    round,
                },
                predicted,
                residual_pct: 0.0,
            });
        }
    }
    if (1.0 - t).abs() > 1e-6 {
        let new_lrv = (a - urv * t) / (1.0 - t);
        let uncertainty = tol / 100.0 * span.abs() / (1.0 - t).abs();
        let round = (new_lrv - round2(new_lrv)).abs() <= uncertainty;
        let lrv_solved = out.is_empty();
        if new_lrv.is_finite() && (urv - new_lrv).abs() > 1e-12 && (round || lrv_solved) {
            out.push(Explanation {
                hypothesis: Hypothesis::DifferentRange {
                    lrv: new_lrv,
                    urv,
                    unit: unit.clone(),
                    kept: KeptEnd::Urv,
                    round,
                },
                predicted,
                residual_pct: 0.0,
            });
        }
    }
    out
}

/// The process is at `process_value` (in the range unit) but the transmitter sends
/// `current_ma`: is it configured as the tag says, and if not, what explains it?
pub fn explain_transmitter(
    scale: &Scale,
    process_value: f64,
    current_ma: f64,
    fit_tolerance_pct: f64,
) -> Result<Mismatch> {
    let current = finite("tx_ma", current_ma)?;
    let p = finite("process_value", process_value)?;
    let tol = crate::error::positive("fit tolerance", fit_tolerance_pct)?;
    let width = scale.signal.width_ma();
    // The percent of span the process should produce, from the range unit.
    let pct_e = match &scale.transfer {
        Transfer::SquareRoot { .. } => {
            scale
                .from_value(p)
                .map_err(|e| e.renamed("process_value"))?
                .percent
        }
        _ => (p - scale.lrv) / scale.span() * 100.0,
    };
    let expected = scale.signal.ma_at(pct_e);
    let residual = |pred: f64| (current - pred).abs() / width * 100.0;
    let difference_pct = (current - expected) / width * 100.0;
    let agrees = difference_pct.abs() <= tol;
    let mut out = Mismatch {
        reading: Reading {
            at: MismatchAt::Transmitter,
            current_ma: current,
            process_value: Some(p),
            expected,
            observed: current,
            unit: "mA".to_string(),
            difference_pct,
            fit_tolerance_pct: tol,
            agrees,
            value_span: scale.span(),
            range_lrv: scale.lrv,
            range_urv: scale.urv,
            range_unit: scale.unit.clone(),
            root_in: root_location(scale),
        },
        explanations: Vec::new(),
    };
    if agrees {
        return Ok(out);
    }
    let unit = scale.unit.clone();
    let mut found: Vec<Explanation> = Vec::new();
    let push = |found: &mut Vec<Explanation>, h: Hypothesis, predicted: f64| {
        let r = residual(predicted);
        if r <= tol {
            found.push(Explanation {
                hypothesis: h,
                predicted,
                residual_pct: r,
            });
        }
    };

    let reversed = scale.signal.ma_at(100.0 - pct_e);
    push(&mut found, Hypothesis::Reversed, reversed);

    let linear_domain = !matches!(scale.transfer, Transfer::SquareRoot { .. });
    if let Transfer::Linear | Transfer::SquareRoot { .. } = &scale.transfer {
        let t0 = matches!(
            scale.transfer,
            Transfer::SquareRoot {
                root_in: RootLocation::Transmitter,
                ..
            }
        );
        let c = (pct_e / 100.0).max(0.0);
        if t0 {
            let predicted = scale.signal.ma_at(c * c * 100.0);
            push(&mut found, Hypothesis::MissingSquareRoot, predicted);
        } else {
            let predicted = scale.signal.ma_at(c.sqrt() * 100.0);
            push(
                &mut found,
                Hypothesis::ExtraSquareRoot { roots: 1 },
                predicted,
            );
        }
    }

    if linear_domain {
        // Range numbers entered in another unit of the same quantity.
        if let Some(u) = units::lookup(&unit) {
            for x in units::UNITS.iter().filter(|x| is_scale_alternative(u, x)) {
                let px = units::convert_units(p, u, x)?;
                let predicted = scale.signal.ma_at((px - scale.lrv) / scale.span() * 100.0);
                let r = residual(predicted);
                if r <= tol {
                    found.push(Explanation {
                        hypothesis: Hypothesis::UnitsMixedUp {
                            expected_unit: unit.clone(),
                            shown_unit: x.symbol.to_string(),
                            factor: u.factor / x.factor,
                        },
                        predicted,
                        residual_pct: r,
                    });
                }
            }
        }
        // The transmitter ranged L'..U': c = (p − L')/(U' − L'); solve with one end kept.
        let c = scale.signal.percent_of(current) / 100.0;
        found.extend(solve_ranges(
            scale,
            c,
            p,
            tol,
            scale.signal.ma_at(c * 100.0),
        ));
    }
    sort_explanations(&mut found);
    out.explanations = found;
    Ok(out)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn two_significant_digits() {
        assert_eq!(round2(10.04), 10.0);
        assert_eq!(round2(1.63), 1.6);
        assert_eq!(round2(4.48), 4.5);
        assert_eq!(round2(0.0), 0.0);
    }
}
