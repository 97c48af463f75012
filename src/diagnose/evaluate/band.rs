//! `band-at-transmitter` / `band-at-receiver`: the NAMUR NE 43 band of a loop current
//! (or the tag's own bands). What it means and what to measure next are worded above the
//! core, in [`crate::view::wording::finding`].

use crate::error::Result;
use crate::signal::{classify, SignalStatus};
use crate::tag::Tag;
use serde::{Deserialize, Serialize};

/// The NE 43 band of a current.
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
}

/// Classify a current by the tag's bands (NE 43 unless the tag says otherwise).
pub fn signal_band(tag: &Tag, ma: f64, at: &str) -> Result<BandFinding> {
    let status = classify(ma, &tag.bands, &tag.scale.signal)?;
    Ok(BandFinding {
        at: at.to_string(),
        ma,
        status,
        percent: tag.scale.signal.percent_of(ma),
    })
}
