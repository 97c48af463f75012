//! `shield-noise`: AC volts from the cable shield to earth against the site's limit.

use super::{Detail, Evaluated, Finding, Settings};
use crate::error::Result;
use serde::{Deserialize, Serialize};

/// AC volts from shield to earth against the limit.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ShieldFinding {
    /// Measured from shield to earth, V AC.
    pub shield_ac_v: f64,
    /// The limit used, V AC.
    pub limit_v: f64,
    /// `noisy` (above the limit) or `quiet`.
    pub outcome: String,
}

/// Judge the AC volts `v` measured from shield to earth.
pub(super) fn evaluated(v: f64, settings: &Settings) -> Result<Evaluated> {
    let noisy = v > settings.shield_ac_limit_v;
    let outcome = if noisy { "noisy" } else { "quiet" };
    Ok(Evaluated {
        outcome,
        findings: vec![Finding::new(Detail::ShieldNoise(ShieldFinding {
            shield_ac_v: v,
            limit_v: settings.shield_ac_limit_v,
            outcome: outcome.to_string(),
        }))],
    })
}
