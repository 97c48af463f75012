//! `current-swing`: how far the loop current swings, against the tag's tolerance: is the
//! signal unsteady at the transmitter, or is the jumping added after it?

use super::{Evaluated, Finding};
use crate::display;
use crate::error::Result;
use crate::tag::Tag;

/// Judge a loop current swing of `swing` mA on `tag`.
pub(super) fn evaluated(tag: &Tag, swing: f64) -> Result<Evaluated> {
    let pct = swing / tag.scale.signal.width_ma() * 100.0;
    let swinging = pct > tag.tolerance_percent;
    let text = if swinging {
        format!(
            "The loop current swings {} ({} of span), more than the tag's ±{} tolerance: the signal itself is unsteady at the transmitter — the process, the sensor, a loose connection, or damping set too low.",
            display::ma(swing),
            display::percent(pct),
            display::percent(tag.tolerance_percent)
        )
    } else {
        format!(
            "The loop current is steady (swing {} = {} of span): the jumping is added after the transmitter, at the receiver or its input.",
            display::ma(swing),
            display::percent(pct)
        )
    };
    let outcome = if swinging { "swinging" } else { "steady" };
    Ok(Evaluated {
        outcome,
        findings: vec![Finding::new(
            if swinging {
                "current-swinging"
            } else {
                "current-steady"
            },
            text,
            serde_json::json!({
                "swing_ma": swing,
                "swing_pct": pct,
                "tolerance_pct": tag.tolerance_percent,
                "outcome": outcome,
            }),
        )],
    })
}
