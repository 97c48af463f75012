//! `leakage` / `leakage-from-resistor`: the current leaving the transmitter against the
//! current reaching the receiver, and where a difference goes (across the pair or to
//! earth), for the loop the evaluation assumes: a loop-powered two-wire transmitter, the
//! supply's negative earthed, the receiver in the return (negative) leg. Its findings hold
//! for that case only, and their words say so
//! ([`crate::view::wording::finding::LEAKAGE_ASSUMED_LOOP`]).

use crate::diagnose::measure::Measurement;
use crate::error::Result;
use crate::tag::Tag;
use serde::{Deserialize, Serialize};

/// Transmitter current against receiver current, and where the difference goes.
///
/// The physics, for the loop this module assumes (see its top):
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
    pub outcome: String,
}

/// Compare the current leaving the transmitter with the current reaching the receiver, for
/// the loop this module assumes (see [`LeakageFinding`] for the physics).
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
    Ok(LeakageFinding {
        tx_ma: tx,
        rx_ma: rx,
        difference_ma: diff,
        difference_pct: pct,
        meter_tolerance_ma: tol,
        leak_path_kohm,
        terminal_v: terminal,
        outcome: outcome.to_string(),
    })
}
