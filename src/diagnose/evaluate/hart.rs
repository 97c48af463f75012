//! `hart-window`: the loop resistance measured power off against the HART window, with
//! the resistor to add and whether the voltage budget can afford it.

use super::OPEN_LOOP_OHMS;
use crate::budget::{LoopConfig, HART_MAX_OHMS, HART_MIN_OHMS};
use crate::diagnose::measure::Measurement;
use crate::display;
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
    /// `too-low`, `in-window`, `too-high` or `open`.
    pub outcome: &'static str,
    /// In words.
    pub text: String,
}

/// Why a HART handheld can or cannot talk, from the loop resistance measured power off.
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
    let text = match outcome {
        "open" => format!(
            "The loop reads {} with the power off: it is open, so no current and no HART signal can flow. Find the break (a loose terminal, an open fuse, a disconnected resistor).",
            display::ohms(r)
        ),
        "too-low" => {
            let mut t = format!(
                "Loop resistance {} is below the {} HART needs (HART physical layer): the handheld's signal has too little resistance to develop across, so the device cannot hear it or answer. Add at least {} in series (a 250 Ω resistor is usual) or connect the handheld across a resistor already in the loop.",
                display::ohms(r),
                display::ohms(lo),
                display::ohms(lo - r)
            );
            if let Some((s, at_ma)) = spare {
                t.push_str(&format!(
                    " The voltage budget has {} spare at {}, so adding 250 Ω {}.",
                    display::ohms(s),
                    display::ma(at_ma),
                    if s >= 250.0 {
                        "still leaves the transmitter its minimum"
                    } else {
                        "would starve the transmitter: raise the supply as well"
                    }
                ));
            }
            t
        }
        "too-high" => format!(
            "Loop resistance {} is above the {} upper limit used for HART (a value from memory, unconfirmed; set on the tag): the signal is attenuated along the loop. Reduce the loop resistance (barrier, long thin cable) or connect the handheld nearer the transmitter.",
            display::ohms(r),
            display::ohms(hi)
        ),
        _ => format!(
            "Loop resistance {} is within the HART window {} to {}: resistance is not what stops the handheld. Check the device's polling address, the handheld's connection and the terminal voltage.",
            display::ohms(r),
            display::ohms(lo),
            display::ohms(hi)
        ),
    };
    Ok(HartFinding {
        loop_ohms: r,
        window_ohms: window,
        budget_spare_ohms: spare.map(|(ohms, _)| ohms),
        add_ohms: add,
        outcome,
        text,
    })
}
