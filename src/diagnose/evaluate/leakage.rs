//! `leakage` / `leakage-from-resistor`: the current leaving the transmitter against the
//! current reaching the receiver, and where a difference goes (across the pair or to
//! earth), for the loop the evaluation assumes ([`LEAKAGE_ASSUMED_LOOP`]).

use crate::diagnose::measure::Measurement;
use crate::display;
use crate::error::Result;
use crate::tag::Tag;
use serde::{Deserialize, Serialize};

/// The loop the leakage evaluation assumes, in words: its findings hold for this case
/// only.
pub const LEAKAGE_ASSUMED_LOOP: &str = "Assumed loop: a loop-powered two-wire transmitter, the supply's negative earthed, the receiver in the return (negative) leg.";

/// Transmitter current against receiver current, and where the difference goes.
///
/// The physics, for the loop in [`LEAKAGE_ASSUMED_LOOP`]:
/// - a path **across the pair** between the transmitter and the receiver (moisture in a
///   junction box, a surge protector, a device or damaged insulation between the two
///   conductors) is in parallel with the transmitter: the receiver carries the
///   transmitter's current *plus* the path's, so it reads **more**. The path sees about the
///   transmitter's terminal volts, so its resistance is roughly
///   `R ≈ V_terminal / (I_rx − I_tx)` (V / mA = kΩ);
/// - a path **to earth** from the return conductor between the transmitter and the
///   receiver lets part of the current go back to the earthed supply negative without
///   passing the receiver, which reads **less**. A device fed from the loop that returns
///   its current by another path does the same. Its resistance needs the voltage from that
///   conductor to earth at the fault, which no built-in procedure measures, so it is not
///   worked out.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct LeakageFinding {
    /// At the transmitter, mA.
    pub tx_ma: f64,
    /// At the receiver, mA.
    pub rx_ma: f64,
    /// tx − rx, mA (positive = the receiver reads less, negative = it reads more).
    pub difference_ma: f64,
    /// The same, % of span.
    pub difference_pct: f64,
    /// The meter allowance used, mA.
    pub meter_tolerance_ma: f64,
    /// Rough resistance of a path across the pair, kΩ: the transmitter's terminal volts
    /// over the extra current (`across-pair` with the terminal volts measured only).
    pub leak_path_kohm: Option<f64>,
    /// The transmitter's terminal volts used for [`Self::leak_path_kohm`], V.
    #[serde(default)]
    pub terminal_v: Option<f64>,
    /// `match`, `across-pair` (receiver reads more) or `to-earth` (receiver reads less).
    pub outcome: &'static str,
    /// In words.
    pub text: String,
}

/// Compare the current leaving the transmitter with the current reaching the receiver, for
/// the loop in [`LEAKAGE_ASSUMED_LOOP`] (see [`LeakageFinding`] for the physics).
pub fn leakage(
    tag: &Tag,
    tx_ma: f64,
    rx_ma: f64,
    meter_tolerance_ma: f64,
    terminal_v: Option<f64>,
) -> Result<LeakageFinding> {
    let tx = Measurement::TxMa.accept(tx_ma)?;
    let rx = Measurement::RxMa.accept(rx_ma)?;
    let tol = crate::error::within("meter_tolerance_ma", meter_tolerance_ma, 0.0, 5.0)?;
    let terminal = terminal_v
        .map(|v| Measurement::TerminalV.accept(v))
        .transpose()?;
    let diff = tx - rx;
    let pct = diff / tag.scale.signal.width_ma() * 100.0;
    let outcome = if -diff > tol + 1e-9 {
        "across-pair"
    } else if diff > tol + 1e-9 {
        "to-earth"
    } else {
        "match"
    };
    // Ohm's law across the path: volts / mA = kΩ.
    let leak_path_kohm = match (outcome, terminal) {
        ("across-pair", Some(v)) if v > 0.0 => Some(v / -diff),
        _ => None,
    };
    let tell_apart = "To tell a path across the pair from one to earth: compare the current at the supply's positive output with both (it equals the receiver's with a path across the pair, the transmitter's with a path to earth); measure the DC volts from each conductor to earth along the route against the drawing; lift the shield's earth for a moment and see whether the difference changes (a conductor touching the shield).";
    let mut text = match outcome {
        "across-pair" => format!(
            "The receiver reads more than the transmitter sends: {} at the receiver, {} at the transmitter; {} ({} of span) flows through a path across the pair between them, in parallel with the transmitter — moisture in a junction box or gland, a surge protector, a device or damaged insulation between the two conductors.",
            display::ma(rx),
            display::ma(tx),
            display::ma(-diff),
            display::percent(-pct)
        ),
        "to-earth" => format!(
            "The receiver reads less than the transmitter sends: {} at the transmitter, {} at the receiver; {} ({} of span) leaves the loop between them — to earth from the return conductor (damaged insulation, water, a conductor touching the shield or a tray), or into a device fed from the loop that returns its current another way. The resistance of a path to earth is not worked out: it needs the DC volts from that conductor to earth at the fault, which is not measured here.",
            display::ma(tx),
            display::ma(rx),
            display::ma(diff),
            display::percent(pct)
        ),
        _ => format!(
            "The currents agree: {} at the transmitter, {} at the receiver (within ±{}): no leakage between them.",
            display::ma(tx),
            display::ma(rx),
            display::ma(tol)
        ),
    };
    match (outcome, leak_path_kohm) {
        (_, Some(k)) => text.push_str(&format!(
            " With {} across the transmitter's terminals that is a path of roughly {} kΩ ({} ÷ {}; a path nearer the receiver sees a little more voltage).",
            display::volts(terminal.unwrap_or(0.0)),
            display::fixed(k, 1),
            display::volts(terminal.unwrap_or(0.0)),
            display::ma(-diff)
        )),
        ("across-pair", None) => text.push_str(
            " Measure the DC volts across the transmitter's terminals to work out the rough resistance of the path.",
        ),
        _ => {}
    }
    if outcome != "match" {
        text.push(' ');
        text.push_str(tell_apart);
        text.push(' ');
        text.push_str(LEAKAGE_ASSUMED_LOOP);
    }
    Ok(LeakageFinding {
        tx_ma: tx,
        rx_ma: rx,
        difference_ma: diff,
        difference_pct: pct,
        meter_tolerance_ma: tol,
        leak_path_kohm,
        terminal_v: terminal,
        outcome,
        text,
    })
}
