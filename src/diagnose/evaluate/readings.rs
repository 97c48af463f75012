//! `display-mismatch`, `transmitter-mismatch` and `indicator-vs-control`: a reading that
//! disagrees with the loop current, and the configuration mistakes that explain it
//! (worked out by [`crate::diagnose::mismatch`]).

use super::{Evaluated, Finding};
use crate::budget::ElementKind;
use crate::diagnose::mismatch::Mismatch;
use crate::display;
use crate::tag::Tag;

/// The findings of one reading compared with the loop (`who`: the receiver, the
/// indicator …).
pub(super) fn mismatch_evaluated(m: &Mismatch, who: &str) -> Evaluated {
    let outcome = if m.agrees {
        "agrees"
    } else if m.explained() {
        "explained"
    } else {
        "unexplained"
    };
    let unit_value = |v: f64| {
        if m.unit == "mA" {
            display::ma(v)
        } else {
            format!("{} {}", display::fixed(v, 4), m.unit)
        }
    };
    let head = if m.agrees {
        format!(
            "The {who} agrees with the loop: {} observed, {} expected ({} of span apart, within ±{}).",
            unit_value(m.observed),
            unit_value(m.expected),
            display::percent(m.difference_pct),
            display::percent(m.fit_tolerance_pct)
        )
    } else {
        format!(
            "The {who} disagrees: {} observed, {} expected ({} of span apart). {}",
            unit_value(m.observed),
            unit_value(m.expected),
            display::percent(m.difference_pct),
            if m.explanations.is_empty() {
                "No configuration mistake explains it.".to_string()
            } else {
                format!("{} explanation(s) fit:", m.explanations.len())
            }
        )
    };
    let mut findings = vec![Finding::new(
        if m.agrees {
            "reading-agrees"
        } else {
            "reading-disagrees"
        },
        head,
        m,
    )];
    for e in &m.explanations {
        findings.push(Finding::new(e.hypothesis.code(), e.text.clone(), e));
    }
    Evaluated { outcome, findings }
}

/// Resistances in the tag's loop that could be a receiver's input resistor.
pub(super) fn input_resistors(tag: &Tag) -> Vec<f64> {
    tag.loop_config
        .iter()
        .flat_map(|c| c.elements.iter())
        .filter_map(|e| match e.kind {
            ElementKind::Resistance { ohms } if ohms > 0.0 => Some(ohms),
            _ => None,
        })
        .collect()
}
