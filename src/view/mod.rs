//! View models: what each screen shows, worked out from core results and already formatted.
//!
//! Plain Rust with no UI toolkit in sight (the Crux contract: `view(&input) -> ViewModel`),
//! so everything a screen shows is tested without a window. The Slint glue in `crate::app`
//! only copies these into Slint structs. Numbers go through [`crate::display`]; positions
//! for the pictures (band bar, budget bar) are fractions of the picture's width.

pub mod about;
pub mod bands;
pub mod check;
pub mod convert;
pub mod fault;
pub mod intrinsic;
pub mod leave;
pub mod level;
pub mod log;
pub mod power;
pub mod reference;
pub mod sensor_calc;
pub mod table;
pub mod tag_sheet;
pub mod units;
pub mod wording;

use crate::display;
use crate::scale::Scale;

/// The cautions shown before fault-finding and checks: the one list in
/// [`crate::caution`], so the screens, the command line and the saved sessions say the same.
pub use crate::caution::CAUTIONS;

/// A low-flow cutoff, in % of flow and the % of DP it equals (flow ∝ √ΔP):
/// `1 % of flow (0.01 % of DP)`.
pub fn cutoff(flow_percent: f64) -> String {
    format!(
        "{} % of flow ({} % of DP)",
        display::trimmed(flow_percent),
        display::trimmed(crate::scale::cutoff_dp_percent(flow_percent))
    )
}

/// A range as the register lists it: `0 – 4.5 m`, `250 – 0 mbar`.
pub fn range_text(scale: &Scale) -> String {
    format!(
        "{} – {} {}",
        display::trimmed(scale.lrv),
        display::trimmed(scale.urv),
        scale.unit
    )
    .trim_end()
    .to_string()
}

/// How a status or verdict stands, for its colour (always shown together with words).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Tone {
    /// Neither good nor bad.
    Neutral,
    /// Fine: in range, enough voltage, passed.
    Good,
    /// Look again: suspect current, tight margin.
    Caution,
    /// Wrong: failure signal, not enough voltage, failed.
    Bad,
    /// A valid measurement outside the span (under or over range).
    Outside,
    /// No signal at all.
    Dead,
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn plain_numbers() {
        assert_eq!(display::trimmed(250.0), "250");
        assert_eq!(display::trimmed(10.5), "10.5");
        assert_eq!(display::trimmed(-20.0), "-20");
        assert_eq!(display::trimmed(-0.0), "0");
        let s = Scale::linear(250.0, 0.0, "mbar").unwrap();
        assert_eq!(range_text(&s), "250 – 0 mbar");
    }
}
