//! `shield-noise`: AC volts from the cable shield to earth against the site's limit.

use super::{Evaluated, Finding, Settings};
use crate::display;
use crate::error::Result;

/// Judge the AC volts `v` measured from shield to earth.
pub(super) fn evaluated(v: f64, settings: &Settings) -> Result<Evaluated> {
    let noisy = v > settings.shield_ac_limit_v;
    let text = if noisy {
        format!(
            "{} AC from shield to earth is above the {} limit. A shield bonded to earth at both ends reads close to 0 V at either end, so this is not a double bond: the shield is not bonded where it was measured (its floating end, or a bond that is broken), and the voltage is a difference in earth potential between the two ends or interference picked up along the cable. Check that the shield is bonded at one end (usually the receiver end) with a sound connection, continuous through every junction box and touching earth nowhere else, and keep the pair away from power cables and drive outputs.",
            display::volts(v),
            display::volts(settings.shield_ac_limit_v)
        )
    } else {
        format!(
            "{} AC from shield to earth is within the {} limit: no sign of interference picked up on the shield. A shield bonded at both ends also reads close to 0 V, so this does not rule out a ground loop: to find one, clamp an AC current meter on the shield, or lift one end of it and see whether the noise changes.",
            display::volts(v),
            display::volts(settings.shield_ac_limit_v)
        )
    };
    let outcome = if noisy { "noisy" } else { "quiet" };
    Ok(Evaluated {
        outcome,
        findings: vec![Finding::new(
            if noisy {
                "shield-noise"
            } else {
                "shield-quiet"
            },
            text,
            serde_json::json!({
                "shield_ac_v": v,
                "limit_v": settings.shield_ac_limit_v,
                "outcome": outcome,
            }),
        )],
    })
}
