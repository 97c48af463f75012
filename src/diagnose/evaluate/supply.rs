//! `supply`: is there supply voltage, and enough for the loop at its fault current?

use super::NO_VOLTS_BELOW;
use crate::budget::LoopConfig;
use crate::diagnose::measure::Measurement;
use crate::error::Result;
use crate::tag::Tag;
use serde::{Deserialize, Serialize};

/// The supply voltage judged against the tag's loop.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct SupplyFinding {
    /// Measured, V.
    pub measured_v: f64,
    /// The tag's nominal supply, V.
    pub nominal_v: Option<f64>,
    /// Lowest the supply should sag to (nominal less tolerance), V.
    pub lowest_expected_v: Option<f64>,
    /// Supply the loop needs at its fault current, V.
    pub needed_v: Option<f64>,
    /// `no-supply`, `low` or `ok`.
    pub outcome: String,
}

/// Is there supply voltage, and enough for the loop?
pub fn supply(tag: &Tag, measured_v: f64) -> Result<SupplyFinding> {
    let v = Measurement::SupplyV.accept(measured_v)?;
    let budget = tag
        .loop_config
        .as_ref()
        .map(LoopConfig::budget)
        .transpose()?;
    let nominal_v = tag.loop_config.as_ref().map(|c| c.supply_volts);
    let lowest_expected_v = budget.as_ref().map(|b| b.lowest_supply_volts);
    let needed_v = budget.as_ref().map(|b| b.min_supply_fault_volts);
    let outcome = if v < NO_VOLTS_BELOW {
        "no-supply"
    } else {
        match (lowest_expected_v, needed_v) {
            (Some(lowest), Some(needed)) if v < lowest - 0.005 || v < needed - 0.005 => "low",
            _ => "ok",
        }
    };
    Ok(SupplyFinding {
        measured_v: v,
        nominal_v,
        lowest_expected_v,
        needed_v,
        outcome: outcome.to_string(),
    })
}
