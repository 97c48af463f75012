//! `band-at-transmitter` / `band-at-receiver`: the NAMUR NE 43 band of a loop current
//! (or the tag's own bands) and what it implies for the next measurement.

use crate::display;
use crate::error::Result;
use crate::signal::{classify, SignalStatus};
use crate::tag::Tag;
use serde::{Deserialize, Serialize};

/// The NE 43 band of a current and what it implies.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct BandFinding {
    /// Where it was measured: `transmitter` or `receiver`.
    pub at: String,
    /// The current, mA.
    pub ma: f64,
    /// Its band.
    pub status: SignalStatus,
    /// % of span.
    pub percent: f64,
    /// What it means.
    pub text: String,
}

/// Classify a current by the tag's bands (NE 43 unless the tag says otherwise).
pub fn signal_band(tag: &Tag, ma: f64, at: &str) -> Result<BandFinding> {
    let status = classify(ma, &tag.bands, &tag.scale.signal)?;
    let implication = match status {
        SignalStatus::NoLoopCurrent => " Follow the loop from the supply: is there supply voltage, and does it reach the transmitter terminals?",
        SignalStatus::FailLow => " Read the transmitter's diagnostics (display or HART) for the fault it reports, and check its terminal voltage.",
        SignalStatus::SuspectLow | SignalStatus::SuspectHigh => " Compare with the failure levels set in the transmitter.",
        SignalStatus::UnderRange | SignalStatus::OverRange => " The loop itself is working; look at the process and the transmitter's zero and span.",
        SignalStatus::InRange => " The loop carries a valid measurement.",
        SignalStatus::FailHigh => " Read the transmitter's diagnostics for the fault it reports; a sensor break with upscale burnout is the usual cause.",
    };
    Ok(BandFinding {
        at: at.to_string(),
        ma,
        status,
        percent: tag.scale.signal.percent_of(ma),
        text: format!(
            "{} at the {at} ({} of span): {} — {}{}",
            display::ma(ma),
            display::percent(tag.scale.signal.percent_of(ma)),
            status.as_str(),
            status.meaning(),
            implication
        ),
    })
}
