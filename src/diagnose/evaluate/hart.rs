//! `hart-window`: the loop resistance measured power off against the HART window, with
//! the resistor to add and the spare the voltage budget has for it.

use super::OPEN_LOOP_OHMS;
use crate::budget::{LoopConfig, HART_MAX_OHMS, HART_MIN_OHMS};
use crate::diagnose::measure::Measurement;
use crate::error::Result;
use crate::tag::Tag;
use serde::{Deserialize, Serialize};

/// Loop resistance against the HART window.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct HartFinding {
    /// Measured, Ω.
    pub loop_ohms: f64,
    /// The window, Ω.
    pub window_ohms: (f64, f64),
    /// Spare resistance in the voltage budget, Ω, when the tag has a loop configuration:
    /// at 20 mA or at the fault current, whichever leaves less (adding more would starve
    /// the transmitter at that current).
    pub budget_spare_ohms: Option<f64>,
    /// Ohms to add to reach the window's minimum (too low only).
    pub add_ohms: Option<f64>,
    /// The current the spare is worked at (20 mA or the fault current, whichever leaves
    /// less), mA; `None` in records saved before it was kept.
    #[serde(default)]
    pub budget_spare_at_ma: Option<f64>,
    /// `too-low`, `in-window`, `too-high` or `open`.
    pub outcome: String,
}

/// Why a HART handheld can or cannot talk, from the loop resistance measured power off
/// (the numbers; the words are [`crate::view::wording::finding::hart`]).
pub fn hart_window(tag: &Tag, loop_ohms: f64) -> Result<HartFinding> {
    let r = Measurement::LoopOhms.accept(loop_ohms)?;
    let window = tag
        .loop_config
        .as_ref()
        .map(|c| c.hart_window_ohms)
        .unwrap_or((HART_MIN_OHMS, HART_MAX_OHMS));
    // The spare that still reaches both 20 mA and the fault current, and the current that
    // limits it.
    let spare = tag
        .loop_config
        .as_ref()
        .map(LoopConfig::budget)
        .transpose()?
        .map(|b| {
            if b.spare_fault_ohms < b.spare_ohms {
                (b.spare_fault_ohms, b.at_fault.current_ma)
            } else {
                (b.spare_ohms, 20.0)
            }
        });
    let (lo, hi) = window;
    let (outcome, add) = if r >= OPEN_LOOP_OHMS {
        ("open", None)
    } else if r < lo {
        ("too-low", Some(lo - r))
    } else if r > hi {
        ("too-high", None)
    } else {
        ("in-window", None)
    };
    Ok(HartFinding {
        loop_ohms: r,
        window_ohms: window,
        budget_spare_ohms: spare.map(|(ohms, _)| ohms),
        budget_spare_at_ma: spare.map(|(_, at_ma)| at_ma),
        add_ohms: add,
        outcome: outcome.to_string(),
    })
}
