//! The words of a loop's voltage budget, written once: what limits the loop and the HART
//! verdict. The command line's text and JSON, the Power screen and the tag sheet use these.
//! The numbers come from [`crate::budget`] and are rounded by [`crate::display`].

use crate::budget::hart::{Binding, HartCableLimit};
use crate::budget::topology::{Device, SourceKind, Topology, TopologyFault, Wiring};
use crate::budget::{Budget, BudgetLimit, BudgetPart, HartVerdict};
use crate::display;

/// The verdict of a worked budget in words, for whatever supplies the loop: [`limit`] for
/// a supply or an active input, the same figures against the compliance for a current
/// source, and the topology fault when the loop has two sources or none.
pub fn verdict(b: &Budget) -> String {
    match (&b.limit, b.worked_from) {
        (
            BudgetLimit::Short {
                at_ma,
                short_volts,
                remove_ohms,
                min_supply_volts,
                largest,
            },
            Some(SourceKind::CurrentOutput),
        ) => format!(
            "short by {} at {}; {}: reduce it or remove {}, or use a current source with at least {} of compliance",
            display::volts(*short_volts),
            display::ma_setting(*at_ma),
            largest_drop(largest.as_ref()),
            display::ohms_whole(*remove_ohms),
            display::volts(*min_supply_volts)
        ),
        (l, _) => limit(l),
    }
}

/// What supplies the loop, in a few words (`a DC supply`, `the current output`).
pub fn source(source: SourceKind) -> &'static str {
    match source {
        SourceKind::Supply => "a DC supply",
        SourceKind::ActiveInput => "an input card that powers the loop",
        SourceKind::CurrentOutput => "a current output",
    }
}

/// The topology from the short list, in plain words.
pub fn topology(t: Topology) -> &'static str {
    match t {
        Topology::TwoWireSupply => "two-wire transmitter on a DC supply into a passive input",
        Topology::TwoWireActiveInput => {
            "two-wire transmitter on an input card that powers the loop"
        }
        Topology::FourWire => "four-wire (self-powered) transmitter into a passive input",
        Topology::ThreeWire => "three-wire transmitter on a DC supply",
        Topology::AnalogOutput => {
            "analog output (or an isolator's output side) driving field devices"
        }
        Topology::Faulty => "wired with two sources or none",
    }
}

/// How a loop is wired, in words: its topology from the short list, or with a fault,
/// what is wired in (`two-wire transmitter with an input card that powers the loop and a
/// DC supply`).
pub fn wiring(w: &Wiring) -> String {
    match w.fault() {
        None => topology(w.topology()).to_string(),
        Some(_) => {
            let device = match w.device {
                Device::TwoWire => "two-wire transmitter",
                Device::ThreeWire { .. } => "three-wire transmitter",
                Device::FourWire => "four-wire transmitter",
                Device::AnalogOutput => "analog output",
            };
            let others: Vec<&str> = w
                .sources()
                .into_iter()
                .filter(|s| *s != SourceKind::CurrentOutput)
                .map(source)
                .collect();
            if others.is_empty() {
                format!("{device} with nothing to supply it (no source)")
            } else {
                format!("{device} with {} (two sources)", others.join(" and "))
            }
        }
    }
}

/// A topology fault in words, with what to look for.
pub fn topology_fault(fault: &TopologyFault) -> String {
    match fault {
        TopologyFault::NoSource => "nothing supplies this loop: a two-wire or three-wire transmitter needs a DC supply in the loop or an input card that powers it; wire one in or set the card to power the loop".to_string(),
        TopologyFault::TwoSources { sources } => format!(
            "two sources in one loop ({}): they add or fight, and the current is not the measurement; take all but one out (set the input card passive, or remove the supply)",
            sources.iter().map(|s| source(*s)).collect::<Vec<_>>().join(" and ")
        ),
    }
}

/// HART's cable limit by RC time constant, in words, with the binding limit.
pub fn hart_cable(h: &HartCableLimit, voltage_max_m: Option<f64>) -> String {
    let mut out = match h.max_cable_m {
        Some(m) => format!(
            "HART allows {} of cable one way (RC at most 65 µs with {} of resistance{} and {} of devices{})",
            display::metres(m),
            display::ohms_whole(h.fixed_ohms),
            if h.cable_ohms_per_m > 0.0 { " plus the cable's" } else { ", cable resistance not counted: no conductor given" },
            display::nanofarads(h.devices_farads * 1e9),
            if h.devices_is_default { ", assumed for a host and one device" } else { "" }
        ),
        None => "no resistance in the loop: the RC time constant sets no cable limit (the HART resistance window does)".to_string(),
    };
    if let Some(t) = h.time_constant_s {
        out.push_str(&format!(
            "; with the cable as entered RC is {}",
            display::microseconds(t * 1e6)
        ));
    }
    match (h.binding, voltage_max_m) {
        (Some(Binding::Hart), Some(_)) => out.push_str("; HART is the tighter limit"),
        (Some(Binding::Voltage), Some(v)) => out.push_str(&format!(
            "; the voltage budget is the tighter limit ({} one way)",
            display::metres(v)
        )),
        _ => {}
    }
    out
}

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
        BudgetLimit::Topology { fault } => topology_fault(fault),
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
