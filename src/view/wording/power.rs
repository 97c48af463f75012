//! The words of a loop's voltage budget, written once: what limits the loop and the HART
//! verdict. The command line's text and JSON, the Power screen and the tag sheet use these.
//! The numbers come from [`crate::budget`] and are rounded by [`crate::display`].

use crate::budget::{BudgetLimit, BudgetPart, HartVerdict};
use crate::display;

/// What limits the loop, with the numbers to act on: `enough voltage: 7.86 V spare at
/// 22.0 mA, …` or `short by …`.
pub fn limit(limit: &BudgetLimit) -> String {
    match limit {
        BudgetLimit::SupplyAtOrBelowMinimum {
            supply_volts,
            tx_min_volts,
        } => format!(
            "supply {} (lowest) is at or below the transmitter minimum {}: no loop can work; raise the supply",
            display::volts(*supply_volts),
            display::volts(*tx_min_volts)
        ),
        BudgetLimit::Enough {
            at_ma,
            headroom_volts,
            spare_ohms,
            largest,
        } => format!(
            "enough voltage: {} spare at {}, {} of load still available at {}; {}",
            display::volts(*headroom_volts),
            display::ma_setting(*at_ma),
            display::ohms_whole(*spare_ohms),
            display::ma_setting(*at_ma),
            largest_drop(largest.as_ref())
        ),
        BudgetLimit::Short {
            at_ma,
            short_volts,
            remove_ohms,
            min_supply_volts,
            largest,
        } => format!(
            "short by {} at {}; {}: reduce it or remove {}, or raise the lowest supply to at least {}",
            display::volts(*short_volts),
            display::ma_setting(*at_ma),
            largest_drop(largest.as_ref()),
            display::ohms_whole(*remove_ohms),
            display::volts(*min_supply_volts)
        ),
    }
}

/// The element that takes most of the supply, or that there is none.
fn largest_drop(part: Option<&BudgetPart>) -> String {
    match part {
        Some(p) => format!("largest drop is {} ({})", p.name, display::volts(p.volts)),
        None => "nothing in series but the transmitter".to_string(),
    }
}

/// The loop resistance against the HART window, in words.
pub fn hart(verdict: &HartVerdict) -> String {
    match *verdict {
        HartVerdict::BelowWindow {
            loop_ohms,
            min_ohms,
        } => format!(
            "loop resistance {} is below the {} HART needs: a handheld cannot develop its signal; add a resistor (250 Ω is usual)",
            display::ohms_whole(loop_ohms),
            display::ohms_whole(min_ohms)
        ),
        HartVerdict::AboveWindow {
            loop_ohms,
            max_ohms,
        } => format!(
            "loop resistance {} is above the {} HART window: the signal is attenuated; reduce the loop resistance",
            display::ohms_whole(loop_ohms),
            display::ohms_whole(max_ohms)
        ),
        HartVerdict::Within {
            loop_ohms,
            min_ohms,
            max_ohms,
        } => format!(
            "loop resistance {} is within the HART window {}–{}",
            display::ohms_whole(loop_ohms),
            display::whole(min_ohms),
            display::ohms_whole(max_ohms)
        ),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::budget::PartRole;

    #[test]
    fn a_starved_loop_names_the_largest_drop_and_what_to_change() {
        // 24 V supply, 12 V transmitter at 20 mA through 700 Ω: 24 − 12 − 14 = −2 V, so
        // short by 2 V; remove 2 V / 20 mA = 100 Ω (Ohm's law, worked by hand).
        let text = limit(&BudgetLimit::Short {
            at_ma: 20.0,
            short_volts: 2.0,
            remove_ohms: 100.0,
            min_supply_volts: 26.0,
            largest: Some(BudgetPart {
                name: "IS barrier".to_string(),
                volts: 7.0,
                role: PartRole::Resistance,
            }),
        });
        assert_eq!(
            text,
            "short by 2.00 V at 20.0 mA; largest drop is IS barrier (7.00 V): reduce it or remove 100 Ω, or raise the lowest supply to at least 26.00 V"
        );
    }

    #[test]
    fn the_hart_window_is_quoted_in_whole_ohms() {
        // HCF_SPEC-54: 230 Ω minimum; 1100 Ω upper end from memory (see budget).
        let text = hart(&HartVerdict::Within {
            loop_ohms: 250.4,
            min_ohms: 230.0,
            max_ohms: 1100.0,
        });
        assert_eq!(
            text,
            "loop resistance 250 Ω is within the HART window 230–1100 Ω"
        );
    }
}
