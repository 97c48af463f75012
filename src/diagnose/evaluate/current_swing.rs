//! `current-swing`: how far the loop current swings, against the tag's tolerance: is the
//! signal unsteady at the transmitter, or is the jumping added after it?

use super::{Detail, Evaluated, Finding};
use crate::error::Result;
use crate::tag::Tag;
use serde::{Deserialize, Serialize};

/// A loop current's swing against the tag's tolerance.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct SwingFinding {
    /// Peak-to-peak swing of the loop current, mA.
    pub swing_ma: f64,
    /// The same, % of span.
    pub swing_pct: f64,
    /// The tag's tolerance, % of span.
    pub tolerance_pct: f64,
    /// `swinging` (more than the tolerance) or `steady`.
    pub outcome: String,
}

/// Judge a loop current swing of `swing` mA on `tag`.
pub(super) fn evaluated(tag: &Tag, swing: f64) -> Result<Evaluated> {
    let pct = swing / tag.scale.signal.width_ma() * 100.0;
    let swinging = pct > tag.tolerance_percent;
    let outcome = if swinging { "swinging" } else { "steady" };
    Ok(Evaluated {
        outcome,
        findings: vec![Finding::new(Detail::CurrentSwing(SwingFinding {
            swing_ma: swing,
            swing_pct: pct,
            tolerance_pct: tag.tolerance_percent,
            outcome: outcome.to_string(),
        }))],
    })
}
