//! How good the proof is: the references of a loop check, their accuracy at each point in
//! % of the loop's span, combined, the test uncertainty ratio, and the decision rule.
//!
//! At each point of a check every reference's accuracy ([`Reference::accuracy_at`] at
//! the reading it made there) is converted to % of the loop's span:
//!
//! - a reference of current (a mA meter or source) read the loop current: the measured
//!   current for a transmitter check, the injected one for a receiver check; its accuracy
//!   is taken as % of the signal span (16 mA on 4–20 mA);
//! - any other reference (a pressure module, a temperature calibrator) gave the input: the
//!   applied value for a transmitter check (in the ΔP range's unit when one was given),
//!   the displayed value for a receiver check; its accuracy is taken as % of that span.
//!   Its unit is converted to the loop's by [`crate::units`] (a difference: factor only).
//!
//! The references' shares are combined by root-sum-square, `U = √(Σ uᵢ²)` (the issue's
//! rule; it treats the references' errors as independent), and the test uncertainty ratio
//! at the point is `TUR = tolerance ÷ U`. Under 4:1 (common practice) the check warns, and
//! so it does for a reference past its calibration due date on the check's date, or a
//! reading outside a reference's range.
//!
//! # Decision rules (ILAC-G8:09/2019, *Guidelines on Decision Rules and Statements of
//! Conformity*, §4.2)
//!
//! - [`DecisionRule::Simple`] — §4.2.1, simple acceptance, guard band w = 0: a point
//!   passes when |error| ≤ tolerance.
//! - [`DecisionRule::Guarded`] — §4.2.3, the non-binary statement with a guard band. We
//!   take the guard band w equal to the combined reference uncertainty U at the point
//!   (the choice ILAC-G8 illustrates, w = U), so the acceptance limit is AL = TL − U:
//!   |error| ≤ AL is *pass*; AL < |error| ≤ TL is *pass, within the uncertainty* (G8's
//!   conditional pass); TL < |error| ≤ TL + U is *FAIL, within the uncertainty*
//!   (conditional fail); beyond TL + U is *FAIL*. A check's `pass` is not changed by the
//!   rule (a conditional pass is still a pass); the words say which zone each point fell
//!   in.

use super::{CheckResult, Device, MIN_TUR};
use crate::calibration::reference::Reference;
use crate::error::{FieldError, Result};
use crate::units::{self, Quantity};
use chrono::NaiveDate;
use serde::{Deserialize, Serialize};

/// Most references one check may name (the input's and the output's).
pub const MAX_REFERENCES: usize = 2;
/// Comparisons against the limits forgive this much (% of span) for rounding.
const EDGE_PERCENT: f64 = 1e-9;

/// How a point's error is judged against the tolerance.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum DecisionRule {
    /// ILAC-G8 §4.2.1: pass when |error| ≤ tolerance.
    #[default]
    Simple,
    /// ILAC-G8 §4.2.3 with w = U: four zones, see the module.
    Guarded,
}

impl DecisionRule {
    /// Read `simple` or `guarded`.
    pub fn parse(text: &str) -> Result<DecisionRule> {
        match text.trim().to_lowercase().as_str() {
            "simple" => Ok(DecisionRule::Simple),
            "guarded" => Ok(DecisionRule::Guarded),
            other => Err(FieldError::new(
                "decision-rule",
                format!("'{other}' is not a decision rule; use simple or guarded"),
            )),
        }
    }

    /// The stable machine name.
    pub fn as_str(self) -> &'static str {
        match self {
            DecisionRule::Simple => "simple",
            DecisionRule::Guarded => "guarded",
        }
    }
}

/// Where a point's error fell.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum Decision {
    /// Within the acceptance limit.
    Pass,
    /// Between the acceptance limit and the tolerance (guarded rule only).
    PassWithinUncertainty,
    /// Beyond the tolerance by no more than the uncertainty (guarded rule only).
    FailWithinUncertainty,
    /// Beyond the tolerance (and, under the guarded rule, beyond it by more than U).
    Fail,
}

/// Judge an error (% of span) against a tolerance (± % of span) with the combined
/// uncertainty `u_pct` (% of span) under `rule`.
pub fn decide(rule: DecisionRule, error_pct: f64, tolerance_pct: f64, u_pct: f64) -> Decision {
    let e = error_pct.abs();
    match rule {
        DecisionRule::Simple => {
            if e <= tolerance_pct + EDGE_PERCENT {
                Decision::Pass
            } else {
                Decision::Fail
            }
        }
        DecisionRule::Guarded => {
            if e <= tolerance_pct - u_pct + EDGE_PERCENT {
                Decision::Pass
            } else if e <= tolerance_pct + EDGE_PERCENT {
                Decision::PassWithinUncertainty
            } else if e <= tolerance_pct + u_pct + EDGE_PERCENT {
                Decision::FailWithinUncertainty
            } else {
                Decision::Fail
            }
        }
    }
}

/// One point judged with the references.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct PointUncertainty {
    /// Each reference's accuracy at this point, % of span, in the order named.
    pub reference_pct: Vec<f64>,
    /// Their root-sum-square, % of span.
    pub combined_pct: f64,
    /// Tolerance ÷ combined; `None` when the combined accuracy is zero (unlimited).
    pub tur: Option<f64>,
    /// The acceptance limit, % of span: the tolerance (simple) or tolerance − combined
    /// (guarded; may be zero or below when the references are too coarse).
    pub acceptance_limit_pct: f64,
    /// Where the error fell.
    pub decision: Decision,
}

/// Something to know about the references of a check.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(tag = "code", rename_all = "kebab-case")]
pub enum UncertaintyWarning {
    /// A reference was past its calibration due date on the check's date.
    ReferencePastDue {
        /// Reference id.
        id: String,
        /// Its due date.
        due: NaiveDate,
        /// Days past due.
        days_over: i64,
    },
    /// The smallest TUR of the check is under the minimum.
    LowTur {
        /// The smallest TUR.
        tur: f64,
        /// At this point (1-based).
        point: usize,
        /// The minimum asked for (4, common practice).
        minimum: f64,
    },
    /// A reading lay outside a reference's range.
    OutsideRange {
        /// Reference id.
        id: String,
        /// At this point (1-based).
        point: usize,
        /// The reading, in the reference's unit.
        reading: f64,
        /// The reference's unit.
        unit: String,
    },
}

/// A check judged with its references: the record a loop check keeps (payload key
/// `uncertainty`).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Assessment {
    /// The decision rule used.
    pub rule: DecisionRule,
    /// The references as they stood when the check was made (a later edit does not change
    /// what this check rested on).
    pub references: Vec<Reference>,
    /// One per check point, in test order.
    pub points: Vec<PointUncertainty>,
    /// The smallest TUR of the points; `None` when every point's is unlimited.
    pub min_tur: Option<f64>,
    /// Where it is (0-based).
    pub min_tur_index: usize,
    /// The worst decision of the points.
    pub decision: Decision,
    /// What to know about the references.
    pub warnings: Vec<UncertaintyWarning>,
}

/// One reference's accuracy at one point of `result`, % of span, and the reading it made
/// there (in its own unit). The error names the reference when its unit cannot be
/// compared with the loop's.
fn share(result: &CheckResult, index: usize, reference: &Reference) -> Result<(f64, f64)> {
    let p = &result.points[index];
    let field = format!("reference {}", reference.id);
    let ref_unit = units::lookup(&reference.unit);
    let (loop_unit, reading, span) = match ref_unit.map(|u| u.quantity) {
        Some(Quantity::Current) => (
            "mA".to_string(),
            match result.device {
                Device::Transmitter => p.measured,
                Device::Receiver => p.applied,
            },
            result.scale.signal.width_ma(),
        ),
        _ => match result.device {
            Device::Transmitter => {
                let span = match &result.input_range {
                    Some(r) => r.urv - r.lrv,
                    None => result.scale.span(),
                };
                (result.input_unit.clone(), p.applied, span.abs())
            }
            Device::Receiver => (result.output_unit.clone(), p.expected, result.output_span),
        },
    };
    let cannot = || {
        FieldError::new(
            field.clone(),
            format!(
                "reads {}, which cannot be compared with this check's {}",
                reference.unit.trim(),
                if loop_unit.is_empty() {
                    "unitless values"
                } else {
                    &loop_unit
                }
            ),
        )
    };
    let (reading_ref, u_loop) = if reference.unit.trim() == loop_unit.trim() {
        (reading, reference.accuracy_at(reading))
    } else {
        let (Some(from), Some(to)) = (units::lookup(&loop_unit), ref_unit) else {
            return Err(cannot());
        };
        if from.quantity != to.quantity || units::crosses_reference(from, to) {
            return Err(cannot());
        }
        let reading_ref = units::convert_units(reading, from, to).map_err(|_| cannot())?;
        let u = units::convert_difference(reference.accuracy_at(reading_ref), to, from)
            .map_err(|_| cannot())?;
        (reading_ref, u.abs())
    };
    Ok((u_loop / span * 100.0, reading_ref))
}

/// Judge `result` with its `references` (one or two) under `rule`.
pub fn assess(
    result: &CheckResult,
    references: &[Reference],
    rule: DecisionRule,
) -> Result<Assessment> {
    if references.is_empty() || references.len() > MAX_REFERENCES {
        return Err(FieldError::new(
            "reference",
            format!(
                "name 1 to {MAX_REFERENCES} references (the input's and the output's), got {}",
                references.len()
            ),
        ));
    }
    for (i, r) in references.iter().enumerate() {
        r.validate()
            .map_err(|e| FieldError::new(format!("reference {}", r.id), e.to_string()))?;
        if references[..i].iter().any(|o| o.is(&r.id)) {
            return Err(FieldError::new(
                "reference",
                format!("{} is named twice", r.id),
            ));
        }
    }
    let mut warnings = Vec::new();
    for r in references {
        if let Some(days_over) = r.days_past_due(result.date) {
            warnings.push(UncertaintyWarning::ReferencePastDue {
                id: r.id.clone(),
                due: r.calibration_due,
                days_over,
            });
        }
    }
    let mut points = Vec::with_capacity(result.points.len());
    let mut outside: Vec<UncertaintyWarning> = Vec::new();
    for (i, p) in result.points.iter().enumerate() {
        let mut reference_pct = Vec::with_capacity(references.len());
        for r in references {
            let (pct, reading) = share(result, i, r)?;
            reference_pct.push(pct);
            let tiny = (r.range_high - r.range_low) * 1e-9;
            if (reading < r.range_low - tiny || reading > r.range_high + tiny)
                && !outside.iter().any(
                    |w| matches!(w, UncertaintyWarning::OutsideRange { id, .. } if id == &r.id),
                )
            {
                outside.push(UncertaintyWarning::OutsideRange {
                    id: r.id.clone(),
                    point: i + 1,
                    reading,
                    unit: r.unit.clone(),
                });
            }
        }
        let combined_pct = reference_pct.iter().map(|u| u * u).sum::<f64>().sqrt();
        let tur = (combined_pct > 0.0).then(|| result.tolerance_pct / combined_pct);
        let acceptance_limit_pct = match rule {
            DecisionRule::Simple => result.tolerance_pct,
            DecisionRule::Guarded => result.tolerance_pct - combined_pct,
        };
        points.push(PointUncertainty {
            decision: decide(rule, p.error_pct, result.tolerance_pct, combined_pct),
            reference_pct,
            combined_pct,
            tur,
            acceptance_limit_pct,
        });
    }
    let (min_tur_index, min_tur) = points
        .iter()
        .enumerate()
        .filter_map(|(i, p)| p.tur.map(|t| (i, t)))
        .fold((0, None::<f64>), |best, (i, t)| match best.1 {
            Some(b) if b <= t => best,
            _ => (i, Some(t)),
        });
    if let Some(tur) = min_tur {
        if tur < MIN_TUR - 1e-9 {
            warnings.push(UncertaintyWarning::LowTur {
                tur,
                point: min_tur_index + 1,
                minimum: MIN_TUR,
            });
        }
    }
    warnings.extend(outside);
    let decision = points
        .iter()
        .map(|p| p.decision)
        .max()
        .unwrap_or(Decision::Pass);
    Ok(Assessment {
        rule,
        references: references.to_vec(),
        points,
        min_tur,
        min_tur_index,
        decision,
        warnings,
    })
}
