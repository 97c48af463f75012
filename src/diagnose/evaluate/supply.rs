//! `supply`: is there supply voltage, and enough for the loop at its fault current?

use super::NO_VOLTS_BELOW;
use crate::budget::LoopConfig;
use crate::diagnose::measure::Measurement;
use crate::display;
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
    pub outcome: &'static str,
    /// In words.
    pub text: String,
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
    let (outcome, text) = if v < NO_VOLTS_BELOW {
        ("no-supply", format!(
            "No supply voltage ({}): check the supply's output, its fuse or breaker, and the wiring from the supply to the loop.",
            display::volts(v)
        ))
    } else {
        match (lowest_expected_v, needed_v) {
            (Some(lowest), Some(needed)) if v < lowest - 0.005 || v < needed - 0.005 => (
                "low",
                format!(
                    "The supply reads {}, below {} (the lowest it should sag to: {}; the loop needs {} at its fault current). Check the supply under load, its setting, and shared loads.",
                    display::volts(v),
                    display::volts(lowest.max(needed)),
                    display::volts(lowest),
                    display::volts(needed)
                ),
            ),
            (Some(lowest), Some(needed)) => (
                "ok",
                format!(
                    "The supply reads {}: at or above the {} it should hold and the {} the loop needs.",
                    display::volts(v),
                    display::volts(lowest),
                    display::volts(needed)
                ),
            ),
            _ => (
                "ok",
                format!(
                    "The supply reads {}; the tag has no loop configuration to judge it against, so only its presence is confirmed.",
                    display::volts(v)
                ),
            ),
        }
    };
    Ok(SupplyFinding {
        measured_v: v,
        nominal_v,
        lowest_expected_v,
        needed_v,
        outcome,
        text,
    })
}
