//! The words of a fault-finding finding, written once: what each evaluation's numbers mean
//! and what to do next. The core ([`crate::diagnose::evaluate`]) gives a code and a typed
//! detail; the command line (its text and the `text` key of its JSON), the Find fault
//! screen and anything that lists a saved session's findings word them here, with every
//! number rounded by [`crate::display`].
//!
//! A record saved before payload version 3 kept its own words: they are shown only when
//! its detail cannot be worded today (a code loopside no longer makes, or a detail that
//! lacks what the words need), and for an old leakage record, which keeps what the
//! technician was shown with a marked note after it.

use crate::diagnose::evaluate::{
    BandFinding, ComplianceFinding, Detail, ExplanationFinding, Finding, HartFinding,
    LeakageFinding, OutputFinding, Reader, ReadingFinding, ShieldFinding, SupplyFinding,
    SwingFinding, VoltageFinding, OLD_LEAK_PATH_KEY,
};
use crate::diagnose::mismatch::{round2, Hypothesis, KeptEnd, MismatchAt, Reading};
use crate::display;
use crate::scale::RootLocation;
use crate::signal::SignalStatus;

/// The loop the leakage evaluation assumes, in words: its findings hold for this case
/// only, and each says so.
pub const LEAKAGE_ASSUMED_LOOP: &str = "Assumed loop: a loop-powered two-wire transmitter, the supply's negative earthed, the receiver in the return (negative) leg.";

/// How to tell a path across the pair from one to earth.
const TELL_APART: &str = "To tell a path across the pair from one to earth: compare the current at the supply's positive output with both (it equals the receiver's with a path across the pair, the transmitter's with a path to earth); measure the DC volts from each conductor to earth along the route against the drawing; lift the shield's earth for a moment and see whether the difference changes (a conductor touching the shield).";

/// A finding in words: from its code and detail; for a record from an older loopside,
/// the words it kept when its detail cannot be worded today (and an old leakage record's
/// words with the note on what its direction means).
pub fn text(f: &Finding) -> String {
    if let Some(old) = &f.saved_code {
        return old_leakage(f, old);
    }
    match (f.typed(), &f.saved_text) {
        (Some(d), _) => detail(&d),
        (None, Some(t)) => t.clone(),
        (None, None) => format!(
            "Finding '{}' (this loopside has no words for it, and the record kept none).",
            f.code
        ),
    }
}

/// A typed detail in words.
pub fn detail(d: &Detail) -> String {
    match d {
        Detail::Band(f) => band(f),
        Detail::Supply(f) => supply(f),
        Detail::TerminalVolts(f) => terminal_volts(f),
        Detail::Leakage(f) => leakage(f),
        Detail::Reading(f) => reading(f),
        Detail::Explanation(f) => explanation(f),
        Detail::Hart(f) => hart(f),
        Detail::ShieldNoise(f) => shield_noise(f),
        Detail::CurrentSwing(f) => current_swing(f),
        Detail::Output(f) => output(f),
        Detail::Compliance(f) => compliance(f),
    }
}

/// The NE 43 band of a current, what it means and what to look at next.
pub fn band(f: &BandFinding) -> String {
    let next = match f.status {
        SignalStatus::NoLoopCurrent => "Follow the loop from the supply: is there supply voltage, and does it reach the transmitter terminals?",
        SignalStatus::FailLow => "Read the transmitter's diagnostics (display or HART) for the fault it reports, and check its terminal voltage.",
        SignalStatus::SuspectLow | SignalStatus::SuspectHigh => "Compare with the failure levels set in the transmitter.",
        SignalStatus::UnderRange | SignalStatus::OverRange => "The loop itself is working; look at the process and the transmitter's zero and span.",
        SignalStatus::InRange => "The loop carries a valid measurement.",
        SignalStatus::FailHigh => "Read the transmitter's diagnostics for the fault it reports; a sensor break with upscale burnout is the usual cause.",
    };
    format!(
        "{} at the {} ({} of span): {} — {} {next}",
        display::ma(f.ma),
        f.at,
        display::percent(f.percent),
        f.status.as_str(),
        f.status.meaning()
    )
}

/// The supply voltage against what the loop needs.
pub fn supply(f: &SupplyFinding) -> String {
    let v = display::volts(f.measured_v);
    match (f.outcome.as_str(), f.lowest_expected_v, f.needed_v) {
        ("no-supply", _, _) => format!(
            "No supply voltage ({v}): check the supply's output, its fuse or breaker, and the wiring from the supply to the loop."
        ),
        ("low", Some(lowest), Some(needed)) => format!(
            "The supply reads {v}, below {} (the lowest it should sag to: {}; the loop needs {} at its fault current). Check the supply under load, its setting, and shared loads.",
            display::volts(lowest.max(needed)),
            display::volts(lowest),
            display::volts(needed)
        ),
        (_, Some(lowest), Some(needed)) => format!(
            "The supply reads {v}: at or above the {} it should hold and the {} the loop needs.",
            display::volts(lowest),
            display::volts(needed)
        ),
        _ => format!(
            "The supply reads {v}; the tag has no loop configuration to judge it against, so only its presence is confirmed."
        ),
    }
}

/// The transmitter's terminal volts against its minimum, and what to change.
pub fn terminal_volts(f: &VoltageFinding) -> String {
    let at = match f.current_ma {
        Some(i) => format!(" at {}", display::ma(i)),
        None => String::new(),
    };
    let terminal = display::volts(f.terminal_v);
    let min = display::volts(f.min_v);
    let target = display::ma(f.target_ma);
    let mut text = match f.outcome.as_str() {
        "none" => format!(
            "Only {terminal} reaches the transmitter terminals: the loop is open between the supply and the transmitter, or the supply is off. Measure the supply, then follow the pair through each junction box."
        ),
        "not-enough" => format!(
            "Not enough voltage: the transmitter gets {terminal}{at}, below its {min} minimum (short by {}). It cannot drive the loop current it wants.",
            display::volts(f.min_v - f.terminal_v)
        ),
        "short-at-top" => format!(
            "Enough voltage now ({terminal}{at}, minimum {min}), but at {target} the transmitter would get only {}: readings near the top clip and the upscale fault signal cannot be reached.",
            display::volts(f.terminal_at_target_v)
        ),
        _ => format!(
            "Enough voltage: the transmitter gets {terminal}{at} against its {min} minimum, and still {} at {target}.",
            display::volts(f.terminal_at_target_v)
        ),
    };
    if let Some(m) = f.loop_ohms_measured {
        text.push_str(&format!(
            " From the measurements the loop holds {} against {} on the tag's configuration.",
            display::ohms(m),
            display::ohms(f.loop_ohms_configured)
        ));
    }
    if let Some(extra) = f.extra_ohms {
        text.push_str(&format!(
            " The extra {} is not on the drawing: look for a corroded or loose terminal, a wrong resistor, or a device added to the loop.",
            display::ohms(extra)
        ));
    }
    if f.outcome == "not-enough" || f.outcome == "short-at-top" {
        let mut fixes = Vec::new();
        if let Some(ohms) = f.remove_ohms {
            let largest = match &f.largest_element {
                Some((name, volts)) => format!(
                    " (the largest part of the budget is {name}, {} at {target})",
                    display::volts(*volts)
                ),
                None => String::new(),
            };
            fixes.push(format!(
                "remove {} from the loop{largest}",
                display::ohms(ohms)
            ));
        }
        match (f.raise_supply_to_v, f.raise_supply_by_v) {
            (Some(to), _) => fixes.push(format!(
                "raise the supply to at least {} (now {}, +{})",
                display::volts(to),
                display::volts(f.supply_v),
                display::volts(to - f.supply_v)
            )),
            (None, Some(by)) => fixes.push(format!(
                "raise the supply by at least {}",
                display::volts(by)
            )),
            _ => {}
        }
        if !fixes.is_empty() {
            text.push_str(&format!(
                " To keep {min} at the transmitter up to {target}: {}.",
                fixes.join(", or ")
            ));
        }
    }
    text
}

/// The transmitter's current against the receiver's, and where a difference goes, for
/// the loop in [`LEAKAGE_ASSUMED_LOOP`] (which the words state).
pub fn leakage(f: &LeakageFinding) -> String {
    let (tx, rx) = (display::ma(f.tx_ma), display::ma(f.rx_ma));
    let mut text = match f.outcome.as_str() {
        "across-pair" => format!(
            "The receiver reads more than the transmitter sends: {rx} at the receiver, {tx} at the transmitter; {} ({} of span) flows through a path across the pair between them, in parallel with the transmitter — moisture in a junction box or gland, a surge protector, a device or damaged insulation between the two conductors.",
            display::ma(-f.difference_ma),
            display::percent(-f.difference_pct)
        ),
        "to-earth" => format!(
            "The receiver reads less than the transmitter sends: {tx} at the transmitter, {rx} at the receiver; {} ({} of span) leaves the loop between them — to earth from the return conductor (damaged insulation, water, a conductor touching the shield or a tray), or into a device fed from the loop that returns its current another way. The resistance of a path to earth is not worked out: it needs the DC volts from that conductor to earth at the fault, which is not measured here.",
            display::ma(f.difference_ma),
            display::percent(f.difference_pct)
        ),
        _ => format!(
            "The currents agree: {tx} at the transmitter, {rx} at the receiver (within ±{}): no leakage between them.",
            display::ma(f.meter_tolerance_ma)
        ),
    };
    match (f.outcome.as_str(), f.leak_path_kohm) {
        (_, Some(k)) => {
            let terminal = display::volts(f.terminal_v.unwrap_or(0.0));
            text.push_str(&format!(
                " With {terminal} across the transmitter's terminals that is a path of roughly {} ({terminal} ÷ {}; a path nearer the receiver sees a little more voltage).",
                display::kilohms(k),
                display::ma(-f.difference_ma)
            ));
        }
        ("across-pair", None) => text.push_str(
            " Measure the DC volts across the transmitter's terminals to work out the rough resistance of the path.",
        ),
        _ => {}
    }
    if f.outcome != "match" {
        text.push(' ');
        text.push_str(TELL_APART);
        text.push(' ');
        text.push_str(LEAKAGE_ASSUMED_LOOP);
    }
    text
}

/// Who read it, as a sentence names them.
fn who(r: Reader) -> &'static str {
    match r {
        Reader::Receiver => "receiver",
        Reader::Transmitter => "transmitter",
        Reader::Indicator => "indicator",
        Reader::ControlSystem => "control system",
    }
}

/// An observed or expected value of a reading, rounded for its span (a current as mA).
fn reading_value(r: &Reading, v: f64) -> String {
    if r.unit == "mA" {
        display::ma(v)
    } else {
        display::value(v, &r.unit, r.value_span)
    }
}

/// A value in the tag's range unit, rounded for the range's span.
fn range_value(r: &Reading, v: f64) -> String {
    display::value(v, &r.range_unit, r.range_urv - r.range_lrv)
}

/// A reading against the loop: agrees, or disagrees with how many explanations fit.
pub fn reading(f: &ReadingFinding) -> String {
    let r = &f.mismatch.reading;
    let (observed, expected) = (reading_value(r, r.observed), reading_value(r, r.expected));
    let apart = display::percent(r.difference_pct);
    if r.agrees {
        format!(
            "The {} agrees with the loop: {observed} observed, {expected} expected ({apart} of span apart, within ±{}).",
            who(f.who),
            display::percent(r.fit_tolerance_pct)
        )
    } else {
        let fit = match f.mismatch.explanations.len() {
            0 => "No configuration mistake explains it.".to_string(),
            n => format!("{n} explanation(s) fit:"),
        };
        format!(
            "The {} disagrees: {observed} observed, {expected} expected ({apart} of span apart). {fit}",
            who(f.who)
        )
    }
}

/// One configuration mistake that explains a reading, with the numbers it predicts.
pub fn explanation(f: &ExplanationFinding) -> String {
    let r = &f.reading;
    let e = &f.explanation;
    let current = display::ma(r.current_ma);
    match r.at {
        MismatchAt::Receiver => {
            let show = |v: f64| reading_value(r, v);
            match &e.hypothesis {
                Hypothesis::UnitsMixedUp {
                    expected_unit,
                    shown_unit,
                    factor,
                } => format!(
                    "Units mixed up: {} is {}; the numbers shown are in {shown_unit}, not {expected_unit}. Make the ranges agree in one unit.",
                    display::value(r.expected, expected_unit, r.value_span),
                    display::value(e.predicted, shown_unit, r.value_span * factor)
                ),
                Hypothesis::Reversed => format!(
                    "Reversed action: at {current} the receiver shows {}, which is what it would show if 4 and 20 mA were swapped (expected {}). Check the receiver's range direction or the transmitter's output action.",
                    show(r.observed),
                    show(r.expected)
                ),
                Hypothesis::ExtraSquareRoot { .. } | Hypothesis::MissingSquareRoot => {
                    let what = match (&e.hypothesis, r.root_in) {
                        (Hypothesis::MissingSquareRoot, _) => "the receiver does not take the square root: it shows ΔP as if it were flow",
                        (_, Some(RootLocation::Transmitter)) => "the square root is taken twice: the transmitter already extracts it and the receiver takes it again",
                        (_, Some(RootLocation::Receiver)) => "the square root is taken twice in the receiver (input scaling and a function block both extract it)",
                        (_, None) => "the receiver takes a square root this linear loop does not call for",
                    };
                    format!(
                        "Square root: {what}. At {current} that shows {} instead of {}.",
                        show(e.predicted),
                        show(r.expected)
                    )
                }
                Hypothesis::InputResistor {
                    actual_ohms,
                    assumed_ohms,
                } => format!(
                    "Input resistor: the card reads volts across {} but scales them as if across {}, so it sees {} instead of {current} and shows {}. Check the resistor fitted and the card's input setting.",
                    display::ohms(*actual_ohms),
                    display::ohms(*assumed_ohms),
                    display::ma(r.current_ma * actual_ohms / assumed_ohms),
                    show(e.predicted)
                ),
                Hypothesis::TableNotApplied => format!(
                    "Table not applied: the receiver shows {}, the measured variable, instead of {} from the characterization table.",
                    range_value(r, e.predicted),
                    show(r.expected)
                ),
                Hypothesis::DifferentRange { .. } => different_range(r, &e.hypothesis, "receiver"),
            }
        }
        MismatchAt::Transmitter => {
            let p = range_value(r, r.process_value.unwrap_or(f64::NAN));
            let expected = display::ma(r.expected);
            match &e.hypothesis {
                Hypothesis::UnitsMixedUp {
                    expected_unit,
                    shown_unit,
                    factor,
                } => {
                    let value = r.process_value.unwrap_or(f64::NAN);
                    let converted = crate::units::convert(value, expected_unit, shown_unit)
                        .unwrap_or(value * factor);
                    format!(
                        "Units mixed up: the transmitter's range numbers are in {shown_unit} instead of {expected_unit} ({p} is {}), so it sends {current} instead of {expected}.",
                        display::value(
                            converted,
                            shown_unit,
                            (r.range_urv - r.range_lrv) * factor
                        )
                    )
                }
                Hypothesis::Reversed => format!(
                    "Reversed action: at {p} the transmitter sends {current}, as if its 4 and 20 mA ends were swapped (expected {expected}). Check its range direction or output action."
                ),
                Hypothesis::MissingSquareRoot => format!(
                    "Square root not taken: the tag has the transmitter extract the root, but it sends a current linear in ΔP ({current} instead of {expected}). Set its output to square root, or move the root to the receiver."
                ),
                Hypothesis::ExtraSquareRoot { .. } => {
                    let what = if r.root_in.is_some() {
                        "the square root is taken twice: the transmitter extracts it and the receiver takes it again"
                    } else {
                        "the transmitter's output is set to square root on a linear loop"
                    };
                    format!(
                        "Square root: {what}. At {p} it sends {current} instead of {expected}."
                    )
                }
                Hypothesis::DifferentRange { .. } => {
                    different_range(r, &e.hypothesis, "transmitter")
                }
                // Found at the receiver only; worded plainly should a record hold one.
                Hypothesis::InputResistor { .. } | Hypothesis::TableNotApplied => format!(
                    "{}: the transmitter sends {current} instead of {expected}.",
                    e.hypothesis.code().replace('-', " ")
                ),
            }
        }
    }
}

/// A range solved with one end kept: what the other end must be.
fn different_range(r: &Reading, h: &Hypothesis, device: &str) -> String {
    let Hypothesis::DifferentRange {
        lrv,
        urv,
        unit,
        kept,
        ..
    } = h
    else {
        return String::new();
    };
    let span = r.range_urv - r.range_lrv;
    let show = |v: f64| display::value(v, unit, span);
    match kept {
        KeptEnd::Lrv => format!(
            "Different range: if the {device}'s LRV is {} as on the tag, its URV must be {} (about {}) instead of {}.",
            show(*lrv),
            show(*urv),
            show(round2(*urv)),
            show(r.range_urv)
        ),
        KeptEnd::Urv => format!(
            "Different range: if the {device}'s URV is {} as on the tag, its LRV must be {} instead of {}.",
            show(*urv),
            show(*lrv),
            show(r.range_lrv)
        ),
    }
}

/// The loop resistance against the HART window, and what to add or look at.
pub fn hart(f: &HartFinding) -> String {
    let r = display::ohms(f.loop_ohms);
    let (lo, hi) = f.window_ohms;
    match f.outcome.as_str() {
        "open" => format!(
            "The loop reads {r} with the power off: it is open, so no current and no HART signal can flow. Find the break (a loose terminal, an open fuse, a disconnected resistor)."
        ),
        "too-low" => {
            let mut t = format!(
                "Loop resistance {r} is below the {} HART needs (HART physical layer): the handheld's signal has too little resistance to develop across, so the device cannot hear it or answer. Add at least {} in series (a 250 Ω resistor is usual) or connect the handheld across a resistor already in the loop.",
                display::ohms(lo),
                display::ohms(f.add_ohms.unwrap_or(lo - f.loop_ohms))
            );
            if let Some(s) = f.budget_spare_ohms {
                let at = match f.budget_spare_at_ma {
                    Some(at_ma) => display::ma(at_ma),
                    None => "20 mA or the fault current, whichever leaves less".to_string(),
                };
                t.push_str(&format!(
                    " The voltage budget has {} spare at {at}, so adding 250 Ω {}.",
                    display::ohms(s),
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
            "Loop resistance {r} is above the {} upper limit used for HART (a value from memory, unconfirmed; set on the tag): the signal is attenuated along the loop. Reduce the loop resistance (barrier, long thin cable) or connect the handheld nearer the transmitter.",
            display::ohms(hi)
        ),
        _ => format!(
            "Loop resistance {r} is within the HART window {} to {}: resistance is not what stops the handheld. Check the device's polling address, the handheld's connection and the terminal voltage.",
            display::ohms(lo),
            display::ohms(hi)
        ),
    }
}

/// AC volts from shield to earth, and what they do and do not show.
pub fn shield_noise(f: &ShieldFinding) -> String {
    let (v, limit) = (display::volts(f.shield_ac_v), display::volts(f.limit_v));
    if f.outcome == "noisy" {
        format!(
            "{v} AC from shield to earth is above the {limit} limit. A shield bonded to earth at both ends reads close to 0 V at either end, so this is not a double bond: the shield is not bonded where it was measured (its floating end, or a bond that is broken), and the voltage is a difference in earth potential between the two ends or interference picked up along the cable. Check that the shield is bonded at one end (usually the receiver end) with a sound connection, continuous through every junction box and touching earth nowhere else, and keep the pair away from power cables and drive outputs."
        )
    } else {
        format!(
            "{v} AC from shield to earth is within the {limit} limit: no sign of interference picked up on the shield. A shield bonded at both ends also reads close to 0 V, so this does not rule out a ground loop: to find one, clamp an AC current meter on the shield, or lift one end of it and see whether the noise changes."
        )
    }
}

/// The loop current's swing against the tag's tolerance.
pub fn current_swing(f: &SwingFinding) -> String {
    let (swing, pct) = (display::ma(f.swing_ma), display::percent(f.swing_pct));
    if f.outcome == "swinging" {
        format!(
            "The loop current swings {swing} ({pct} of span), more than the tag's ±{} tolerance: the signal itself is unsteady at the transmitter — the process, the sensor, a loose connection, or damping set too low.",
            display::percent(f.tolerance_pct)
        )
    } else {
        format!(
            "The loop current is steady (swing {swing} = {pct} of span): the jumping is added after the transmitter, at the receiver or its input."
        )
    }
}

/// The current at an output's field device against the control system's demand.
pub fn output(f: &OutputFinding) -> String {
    let (measured, expected) = (display::ma(f.measured_ma), display::ma(f.expected_ma));
    let demand = display::percent(f.demand_pct);
    match f.outcome.as_str() {
        "no-current-at-device" => format!(
            "No current reaches the device ({measured}) although the control system sends {demand} (which asks for {expected}): the output is not driving, or the loop is open between the output and the device."
        ),
        "follows-demand" => format!(
            "The device gets {measured} for a demand of {demand} ({expected} expected; off by {} of span, within ±{}): the output and the loop carry the demand faithfully.",
            display::percent(f.error_pct),
            display::percent(f.tolerance_pct)
        ),
        "below-demand" => format!(
            "The device gets {measured}, short of the {expected} a demand of {demand} asks for ({} of span, beyond ±{}): the source is losing current to a leak, running out of voltage, or is scaled differently.",
            display::percent(f.error_pct),
            display::percent(f.tolerance_pct)
        ),
        _ => format!(
            "The device gets {measured}, more than the {expected} a demand of {demand} asks for ({} of span, beyond ±{}): the output is scaled or calibrated differently, held at a fail-safe value, or a second source feeds the loop.",
            display::percent(f.error_pct),
            display::percent(f.tolerance_pct)
        ),
    }
}

/// A current source's output voltage against its compliance.
pub fn compliance(f: &ComplianceFinding) -> String {
    let v = display::volts(f.measured_v);
    let load = match (f.load_ohms, f.current_ma) {
        (Some(r), Some(i)) => format!(
            " At {} that is a load of {}.",
            display::ma(i),
            display::ohms(r)
        ),
        _ => String::new(),
    };
    match (f.outcome.as_str(), f.compliance_v, f.headroom_v) {
        ("source-dead", _, _) => format!(
            "{v} across the source's output: it is not driving at all (output off, failed, fused, unpowered, or the meter is not on its terminals).{load}"
        ),
        ("source-at-compliance", Some(c), _) => format!(
            "{v} across the source's output, at its {} compliance: it has run out of voltage and cannot push more current through the loop.{load}",
            display::volts(c)
        ),
        ("source-has-headroom", Some(c), Some(h)) => format!(
            "{v} across the source's output, {} below its {} compliance: it has voltage in hand, so it is not the loop's resistance that holds the current back.{load}",
            display::volts(h),
            display::volts(c)
        ),
        _ => format!(
            "{v} across the source's output; the tag records no compliance for it, so compare with the output's data sheet (the most it can drive): a source at its compliance cannot push more current.{load}"
        ),
    }
}

/// An old leakage record: what the technician was shown, with a marked note on what the
/// direction measured means (the record was saved before loopside corrected it).
fn old_leakage(f: &Finding, old_code: &str) -> String {
    let shown = match &f.saved_text {
        Some(t) => t.clone(),
        None => format!("Finding '{old_code}' (saved without words)."),
    };
    let note = if f.code == "leak-to-earth" {
        let dropped = match f.detail.get(OLD_LEAK_PATH_KEY).and_then(|v| v.as_f64()) {
            Some(k) => format!(
                " The {} worked out then assumed a path across the pair and does not apply.",
                display::kilohms(k)
            ),
            None => String::new(),
        };
        format!(
            "The receiver read less than the transmitter, which points to current leaving the loop to earth between them (or a device fed from the loop), not to a path across the pair.{dropped}"
        )
    } else {
        "The receiver read more than the transmitter, which points to a path across the pair in parallel with the transmitter (moisture, a surge protector, damaged insulation), not to an outside source.".to_string()
    };
    format!(
        "{shown} [Note added when this record was read: it was saved before loopside corrected the leakage direction. {note} {LEAKAGE_ASSUMED_LOOP}]"
    )
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::diagnose::evaluate::{Evaluation, Settings};
    use crate::diagnose::Measurement;
    use crate::scale::Scale;
    use crate::tag::Tag;
    use std::collections::BTreeMap;

    /// PT-204, raw pump 2 discharge, 0–10 bar, ±0.5 % of span (Brindlemoor demo plant).
    fn pt204() -> Tag {
        Tag::new("PT-204", Scale::linear(0.0, 10.0, "bar").unwrap()).unwrap()
    }

    #[test]
    fn a_reversed_indicator_is_worded_with_values_rounded_for_the_span() {
        // 8 mA on 0–10 bar is (8 − 4)/16 × 10 = 2.5 bar; an indicator with its ends swapped
        // shows 10 − 2.5 = 7.5 bar. A 10 bar span is shown to 3 decimals (0.01 % of span).
        let values = BTreeMap::from([
            (Measurement::TxMa, 8.0),
            (Measurement::Displayed, 7.5),
            (Measurement::ControlValue, 2.5),
        ]);
        let done = Evaluation::IndicatorVsControl
            .evaluate(&pt204(), &values, &Settings::default())
            .unwrap();
        assert_eq!(done.outcome, "indicator-wrong");
        let words: Vec<String> = done.findings.iter().map(text).collect();
        assert!(
            words[0].starts_with(
                "The indicator disagrees: 7.500 bar observed, 2.500 bar expected (50.00 % of span apart)."
            ),
            "{}",
            words[0]
        );
        let reversed = done
            .findings
            .iter()
            .position(|f| f.code == "reversed")
            .expect("reversed fits");
        assert_eq!(
            words[reversed],
            "Reversed action: at 8.000 mA the receiver shows 7.500 bar, which is what it would show if 4 and 20 mA were swapped (expected 2.500 bar). Check the receiver's range direction or the transmitter's output action."
        );
        // The control system reads 2.5 bar, as the loop says: within the tag's ±0.5 % plus
        // the 0.05 mA meter allowance (0.05/16 = 0.31 % of span), ±0.81 %.
        let control = done
            .findings
            .iter()
            .zip(&words)
            .rfind(|(f, _)| f.code == "reading-agrees")
            .map(|(_, w)| w.clone())
            .unwrap();
        assert_eq!(
            control,
            "The control system agrees with the loop: 2.500 bar observed, 2.500 bar expected (0.00 % of span apart, within ±0.81 %)."
        );
    }

    #[test]
    fn a_transmitter_ranged_in_psi_is_worded_with_the_value_converted() {
        // 5 bar applied to a 0–10 bar tag should give 12 mA. A transmitter whose range
        // numbers were taken as psi sends 4 + 16 × 72.52/10, far over range; at 0.5 bar
        // (7.252 psi: 1 psi = 6.894757 kPa, NIST SP 811) it sends 4 + 16 × 0.7252 =
        // 15.60 mA instead of 4.80 mA. The psi value is rounded for the range in psi,
        // 0–145 psi: two decimals resolve 0.01 % of it.
        let ma = 4.0 + 16.0 * (50.0 / 6.894_757) / 10.0;
        let values = BTreeMap::from([(Measurement::TxMa, ma), (Measurement::ProcessValue, 0.5)]);
        let done = Evaluation::TransmitterMismatch
            .evaluate(&pt204(), &values, &Settings::default())
            .unwrap();
        let units = done
            .findings
            .iter()
            .find(|f| f.code == "units-mixed-up" && f.detail["hypothesis"]["shown_unit"] == "psi")
            .expect("psi fits");
        assert_eq!(
            text(units),
            "Units mixed up: the transmitter's range numbers are in psi instead of bar (0.500 bar is 7.25 psi), so it sends 15.603 mA instead of 4.800 mA."
        );
    }

    #[test]
    fn a_record_whose_numbers_cannot_be_worded_shows_the_words_it_kept() {
        // A band finding coded in-range whose detail says fail-low: its words would
        // contradict its code, so the stored words are shown.
        let detail = serde_json::json!({"at": "transmitter", "ma": 3.5, "status": "fail-low", "percent": -3.125});
        let f = Finding {
            step: "tx-current".to_string(),
            code: "band-in-range".to_string(),
            detail: detail.clone(),
            saved_text: Some("3.500 mA at the transmitter: words as saved.".to_string()),
            saved_code: None,
        };
        assert_eq!(text(&f), "3.500 mA at the transmitter: words as saved.");
        // The same detail under its own code is worded today.
        let f = Finding {
            code: "band-fail-low".to_string(),
            saved_text: None,
            ..f
        };
        // 3.5 mA is (3.5 − 4)/16 = −3.125 % of span, NE 43 failure low (≤ 3.6 mA).
        assert!(
            text(&f).starts_with(
                "3.500 mA at the transmitter (-3.12 % of span): fail-low — Failure signal, downscale"
            ),
            "{}",
            text(&f)
        );
        // A code nobody words, with no words kept: named, not left blank.
        let f = Finding {
            code: "polarity-reversed".to_string(),
            ..f
        };
        assert_eq!(
            text(&f),
            "Finding 'polarity-reversed' (this loopside has no words for it, and the record kept none)."
        );
    }
}
