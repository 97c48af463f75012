//! `display-mismatch`, `transmitter-mismatch` and `indicator-vs-control`: a reading that
//! disagrees with the loop current, and the configuration mistakes that explain it
//! (worked out by [`crate::diagnose::mismatch`]).

use super::{Detail, Evaluated, Finding};
use crate::budget::ElementKind;
use crate::diagnose::mismatch::{Explanation, Mismatch, Reading};
use crate::tag::Tag;
use serde::{Deserialize, Serialize};

/// Whose reading was compared with the loop.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum Reader {
    /// The receiver's display (a display mismatch).
    Receiver,
    /// The transmitter's output against the true process value.
    Transmitter,
    /// The local indicator (indicator against control system).
    Indicator,
    /// The control system (indicator against control system).
    ControlSystem,
}

/// One reading compared with the loop: the `reading-agrees` / `reading-disagrees`
/// finding's detail.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ReadingFinding {
    /// Whose reading.
    pub who: Reader,
    /// The comparison and the explanations that fit.
    #[serde(flatten)]
    pub mismatch: Mismatch,
}

/// One explanation of a reading that disagrees, with the reading it explains: the detail
/// of a finding coded by its hypothesis (`reversed`, `different-range` …).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ExplanationFinding {
    /// Whose reading.
    pub who: Reader,
    /// The hypothesis, what it predicts and how closely.
    #[serde(flatten)]
    pub explanation: Explanation,
    /// The reading it explains.
    pub reading: Reading,
}

/// The findings of one reading compared with the loop.
pub(super) fn mismatch_evaluated(m: &Mismatch, who: Reader) -> Evaluated {
    let outcome = if m.reading.agrees {
        "agrees"
    } else if m.explained() {
        "explained"
    } else {
        "unexplained"
    };
    let mut findings = vec![Finding::new(Detail::Reading(ReadingFinding {
        who,
        mismatch: m.clone(),
    }))];
    for e in &m.explanations {
        findings.push(Finding::new(Detail::Explanation(ExplanationFinding {
            who,
            explanation: e.clone(),
            reading: m.reading.clone(),
        })));
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
