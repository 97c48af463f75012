//! `terminal-volts`: the transmitter's terminal volts against its minimum, worked with the
//! tag's loop budget, projected to the fault current, with the ohms to remove or the supply
//! to raise.

use super::{EXTRA_OHMS_FLOOR, EXTRA_OHMS_FRACTION, NO_VOLTS_BELOW};
use crate::budget::{Budget, PartRole};
use crate::diagnose::measure::Measurement;
use crate::error::{FieldError, Result};
use crate::tag::Tag;
use serde::{Deserialize, Serialize};

/// Terminal volts judged against the transmitter minimum, with what to change.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct VoltageFinding {
    /// Measured at the transmitter terminals, V.
    pub terminal_v: f64,
    /// The transmitter's minimum, V.
    pub min_v: f64,
    /// terminal − minimum, V (negative = short).
    pub headroom_v: f64,
    /// The loop current the terminal volts were measured at, mA, if known.
    pub current_ma: Option<f64>,
    /// Supply used in the sums, V (measured, else the tag's lowest supply).
    pub supply_v: f64,
    /// Fixed drops in the loop (indicators, isolators), V.
    pub fixed_drops_v: f64,
    /// Loop resistance worked out from the measurements, Ω.
    pub loop_ohms_measured: Option<f64>,
    /// Loop resistance from the tag's configuration, Ω.
    pub loop_ohms_configured: f64,
    /// Measured minus configured, Ω, when the difference is more than a rule-of-thumb
    /// allowance.
    pub extra_ohms: Option<f64>,
    /// The current the loop must reach: the fault current (or more if measured higher), mA.
    pub target_ma: f64,
    /// Terminal volts projected at that current, V.
    pub terminal_at_target_v: f64,
    /// Ohms to take out of the loop so the transmitter keeps its minimum at the target
    /// current (None when nothing needs removing).
    pub remove_ohms: Option<f64>,
    /// How far to raise the supply so it does (None when enough already), V.
    pub raise_supply_by_v: Option<f64>,
    /// The supply to raise to, when the supply was measured, V.
    pub raise_supply_to_v: Option<f64>,
    /// The largest element of the budget at the target current, with its volts.
    pub largest_element: Option<(String, f64)>,
    /// `none`, `not-enough`, `short-at-top` or `enough`.
    pub outcome: String,
}

/// Terminal volts against the transmitter minimum, worked with the tag's loop budget (the
/// numbers; the words are [`crate::view::wording::finding::terminal_volts`]).
pub fn terminal_volts(
    tag: &Tag,
    terminal_v: f64,
    tx_ma: Option<f64>,
    supply_v: Option<f64>,
) -> Result<VoltageFinding> {
    let terminal = Measurement::TerminalV.accept(terminal_v)?;
    let config = tag.loop_config.as_ref().ok_or_else(|| {
        FieldError::new(
            "loop",
            format!(
                "tag {} has no loop configuration (supply and transmitter minimum volts); add it before judging terminal volts",
                tag.number
            ),
        )
    })?;
    let budget: Budget = config.budget()?;
    // Only a current a working transmitter draws is used to work out resistance.
    let current = match tx_ma {
        Some(i) => Some(Measurement::TxMa.accept(i)?).filter(|i| *i >= 3.5),
        None => None,
    };
    let supply = match supply_v {
        Some(s) => Measurement::SupplyV.accept(s)?,
        None => budget.lowest_supply_volts,
    };
    let drops = budget.fixed_drop_volts;
    let min = config.tx_min_volts;
    let measured_ohms = match (supply_v, current) {
        (Some(_), Some(i)) => Some(((supply - terminal - drops) / (i / 1000.0)).max(0.0)),
        _ => None,
    };
    let r = measured_ohms.unwrap_or(budget.loop_ohms);
    let extra_ohms = measured_ohms.and_then(|m| {
        let extra = m - budget.loop_ohms;
        (extra > EXTRA_OHMS_FRACTION * budget.loop_ohms + EXTRA_OHMS_FLOOR).then_some(extra)
    });
    let target = config
        .fault_current_ma()
        .max(20.0)
        .max(current.unwrap_or(0.0));
    // Project from the measured point: every extra mA costs R volts per ampere.
    let terminal_at_target = terminal - r * (target - current.unwrap_or(0.0)) / 1000.0;
    let deficit = min - terminal_at_target;
    let short_at_target = deficit > 1e-9;
    let remove_ohms = short_at_target.then(|| deficit / (target / 1000.0));
    let raise_supply_by_v = short_at_target.then_some(deficit);
    let raise_supply_to_v = match supply_v {
        Some(_) if short_at_target => Some(supply + deficit),
        _ => None,
    };
    let largest_element = budget
        .at_fault
        .parts
        .iter()
        .map(|p| {
            let volts = match p.role {
                PartRole::Drop => p.volts,
                // I·R parts scale with the current.
                _ => p.volts * target / budget.at_fault.current_ma.max(1e-9),
            };
            (p.name.clone(), volts)
        })
        .max_by(|a, b| a.1.total_cmp(&b.1));
    let outcome = if terminal < NO_VOLTS_BELOW {
        "none"
    } else if terminal < min - 1e-9 {
        "not-enough"
    } else if short_at_target {
        "short-at-top"
    } else {
        "enough"
    };
    Ok(VoltageFinding {
        terminal_v: terminal,
        min_v: min,
        headroom_v: terminal - min,
        current_ma: current,
        supply_v: supply,
        fixed_drops_v: drops,
        loop_ohms_measured: measured_ohms,
        loop_ohms_configured: budget.loop_ohms,
        extra_ohms,
        target_ma: target,
        terminal_at_target_v: terminal_at_target,
        remove_ohms,
        raise_supply_by_v,
        raise_supply_to_v,
        largest_element,
        outcome: outcome.to_string(),
    })
}
