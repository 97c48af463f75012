//! Signal status: is this loop current a measurement or a failure signal?
//!
//! NAMUR NE 43 reserves 3.8–20.5 mA for measurement information and ≤ 3.6 mA / ≥ 21.0 mA
//! for failure information; the gaps between (3.6–3.8 and 20.5–21.0) are neither and are
//! treated as suspect. Below 1.0 mA nothing is powering the loop at all — a broken wire, a
//! blown fuse or a dead supply (common practice; a two-wire transmitter cannot run on less
//! than about 3.5 mA). Devices that signal failure at other levels get their own
//! [`BandLimits`].
//!
//! NE 43 is written for a 4–20 mA signal. On any other signal span (0–20 mA, 10–50 mA)
//! the NE 43 defaults do not apply: 2 mA on a 0–20 mA signal is a valid 10 %. Such a span
//! gets only "under the span", "within" and "over the span", with no failure or
//! no-current bands, unless the tag sets its own limits ([`BandLimits::for_span`]).

use crate::display;
use crate::error::{finite, FieldError, Result};
use crate::scale::SignalSpan;
use serde::{Deserialize, Serialize};

/// Comparisons at a band edge forgive this much (mA), so that a current computed from a
/// volts reading (0.9 V / 250 Ω) lands on the edge it was meant to hit.
const EDGE_EPSILON_MA: f64 = 1e-9;

/// Where the status bands start and end, mA. Defaults are NAMUR NE 43.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct BandLimits {
    /// Below this there is no loop current (broken or unpowered loop). Common practice: 1.0.
    pub no_current_below_ma: f64,
    /// At or below this the device signals a failure (NE 43: 3.6).
    pub fail_low_at_or_below_ma: f64,
    /// Measurement information starts here (NE 43: 3.8).
    pub measure_low_ma: f64,
    /// Measurement information ends here (NE 43: 20.5).
    pub measure_high_ma: f64,
    /// At or above this the device signals a failure (NE 43: 21.0).
    pub fail_high_at_or_above_ma: f64,
}

impl Default for BandLimits {
    fn default() -> Self {
        // NAMUR NE 43 (measurement 3.8–20.5 mA, failure ≤ 3.6 / ≥ 21.0 mA);
        // 1.0 mA "no loop current" is common practice.
        BandLimits {
            no_current_below_ma: 1.0,
            fail_low_at_or_below_ma: 3.6,
            measure_low_ma: 3.8,
            measure_high_ma: 20.5,
            fail_high_at_or_above_ma: 21.0,
        }
    }
}

impl BandLimits {
    /// No failure, suspect or no-current bands at all: every current is a measurement,
    /// under, within or over the span. What a non-NE 43 signal (0–20 mA) gets by default.
    pub const NONE: BandLimits = BandLimits {
        no_current_below_ma: f64::NEG_INFINITY,
        fail_low_at_or_below_ma: f64::NEG_INFINITY,
        measure_low_ma: f64::NEG_INFINITY,
        measure_high_ma: f64::INFINITY,
        fail_high_at_or_above_ma: f64::INFINITY,
    };

    /// The limits that apply on `span`: these limits, except that the NE 43 defaults on a
    /// signal span other than 4–20 mA become [`BandLimits::NONE`] (NE 43 is defined for
    /// 4–20 mA; a tag that sets its own limits keeps them).
    pub fn for_span(&self, span: &SignalSpan) -> BandLimits {
        if *self == BandLimits::default() && !is_four_to_twenty(span) {
            BandLimits::NONE
        } else {
            *self
        }
    }

    /// True when a current can be judged a failure signal (any failure band is set).
    pub fn has_failure_bands(&self) -> bool {
        self.fail_low_at_or_below_ma.is_finite() || self.fail_high_at_or_above_ma.is_finite()
    }

    /// Check that the limits are finite and in order around the signal span:
    /// no-current < fail-low < measure-low ≤ span low < span high ≤ measure-high < fail-high.
    /// The NE 43 defaults on a span other than 4–20 mA pass as [`BandLimits::NONE`].
    pub fn validate(&self, span: &SignalSpan) -> Result<BandLimits> {
        let resolved = self.for_span(span);
        if resolved == BandLimits::NONE {
            return Ok(resolved);
        }
        let named = [
            ("no_current_below_ma", self.no_current_below_ma),
            ("fail_low_at_or_below_ma", self.fail_low_at_or_below_ma),
            ("measure_low_ma", self.measure_low_ma),
            ("measure_high_ma", self.measure_high_ma),
            ("fail_high_at_or_above_ma", self.fail_high_at_or_above_ma),
        ];
        for (name, v) in named {
            finite(name, v)?;
        }
        let order = [
            ("no_current_below_ma", self.no_current_below_ma, false),
            (
                "fail_low_at_or_below_ma",
                self.fail_low_at_or_below_ma,
                false,
            ),
            ("measure_low_ma", self.measure_low_ma, true),
            ("signal low", span.low_ma, false),
            ("signal high", span.high_ma, true),
            ("measure_high_ma", self.measure_high_ma, false),
            (
                "fail_high_at_or_above_ma",
                self.fail_high_at_or_above_ma,
                false,
            ),
        ];
        // The flag says whether the next limit may equal this one.
        for pair in order.windows(2) {
            let (a_name, a, may_equal_next) = pair[0];
            let (b_name, b, _) = pair[1];
            let ok = if may_equal_next { a <= b } else { a < b };
            if !ok {
                return Err(FieldError::new(
                    b_name,
                    format!(
                        "{} mA must be {} {a_name} ({} mA)",
                        display::quoted(b),
                        if may_equal_next {
                            "at or above"
                        } else {
                            "above"
                        },
                        display::quoted(a)
                    ),
                ));
            }
        }
        Ok(*self)
    }
}

/// What a loop current means, with stable machine names (`in-range`, `fail-low`, …).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum SignalStatus {
    /// Below the no-current limit: the loop is open or unpowered.
    NoLoopCurrent,
    /// At or below the low failure limit: the device reports a fault (downscale).
    FailLow,
    /// Between the failure and measurement limits: neither a valid reading nor a fault.
    SuspectLow,
    /// Measurement information below 0 % (e.g. 3.8–4 mA): the process is below LRV.
    UnderRange,
    /// Within the signal span (4–20 mA).
    InRange,
    /// Measurement information above 100 % (e.g. 20–20.5 mA): the process is above URV.
    OverRange,
    /// Between the measurement and failure limits at the top.
    SuspectHigh,
    /// At or above the high failure limit: the device reports a fault (upscale).
    FailHigh,
}

impl SignalStatus {
    /// The stable machine name, as used in JSON and the CLI.
    pub fn as_str(self) -> &'static str {
        match self {
            SignalStatus::NoLoopCurrent => "no-loop-current",
            SignalStatus::FailLow => "fail-low",
            SignalStatus::SuspectLow => "suspect-low",
            SignalStatus::UnderRange => "under-range",
            SignalStatus::InRange => "in-range",
            SignalStatus::OverRange => "over-range",
            SignalStatus::SuspectHigh => "suspect-high",
            SignalStatus::FailHigh => "fail-high",
        }
    }

    /// All statuses from lowest current to highest.
    pub const ALL: [SignalStatus; 8] = [
        SignalStatus::NoLoopCurrent,
        SignalStatus::FailLow,
        SignalStatus::SuspectLow,
        SignalStatus::UnderRange,
        SignalStatus::InRange,
        SignalStatus::OverRange,
        SignalStatus::SuspectHigh,
        SignalStatus::FailHigh,
    ];

    /// Parse a machine name back into a status.
    pub fn from_name(name: &str) -> Option<SignalStatus> {
        SignalStatus::ALL
            .into_iter()
            .find(|s| s.as_str() == name.trim())
    }

    /// True when the current carries a usable measurement (NE 43 measurement band).
    pub fn is_measurement(self) -> bool {
        matches!(
            self,
            SignalStatus::UnderRange | SignalStatus::InRange | SignalStatus::OverRange
        )
    }

    /// True when the current is a failure signal or no signal at all.
    pub fn is_failure(self) -> bool {
        matches!(
            self,
            SignalStatus::NoLoopCurrent | SignalStatus::FailLow | SignalStatus::FailHigh
        )
    }

    /// What it means, in a technician's words.
    pub fn meaning(self) -> &'static str {
        match self {
            SignalStatus::NoLoopCurrent => {
                "No loop current: the loop is open or unpowered (broken wire, blown fuse, supply off, transmitter disconnected)."
            }
            SignalStatus::FailLow => {
                "Failure signal, downscale: the transmitter reports a fault (often a sensor break or internal fault), or the loop is starved of voltage."
            }
            SignalStatus::SuspectLow => {
                "Neither a measurement nor a NE 43 failure signal: check the transmitter's failure setting and the loop voltage."
            }
            SignalStatus::UnderRange => {
                "Valid measurement below the lower range value (process below LRV, or a zero shift)."
            }
            SignalStatus::InRange => "Valid measurement within the range.",
            SignalStatus::OverRange => {
                "Valid measurement above the upper range value (process above URV, or a span shift)."
            }
            SignalStatus::SuspectHigh => {
                "Neither a measurement nor a NE 43 failure signal: check the transmitter's failure setting and its saturation limit."
            }
            SignalStatus::FailHigh => {
                "Failure signal, upscale: the transmitter reports a fault (often a sensor break with upscale burnout), or a short across the loop."
            }
        }
    }
}

impl std::fmt::Display for SignalStatus {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(self.as_str())
    }
}

/// True for the 4–20 mA signal NE 43 is written for.
fn is_four_to_twenty(span: &SignalSpan) -> bool {
    (span.low_ma - 4.0).abs() < EDGE_EPSILON_MA && (span.high_ma - 20.0).abs() < EDGE_EPSILON_MA
}

/// Classify a loop current against band limits and the signal span.
///
/// Edges: in-range includes both span ends; under-range is measure-low ≤ I < span low;
/// over-range is span high < I ≤ measure-high; fail-low is I ≤ fail-low limit; fail-high
/// is I ≥ fail-high limit; the suspect bands are the open gaps between. The limits are
/// first resolved for the span ([`BandLimits::for_span`]): on a 0–20 mA signal the NE 43
/// defaults give way to plain under / within / over bands.
pub fn classify(ma: f64, limits: &BandLimits, span: &SignalSpan) -> Result<SignalStatus> {
    let i = finite("mA", ma)?;
    let limits = &limits.for_span(span);
    let e = EDGE_EPSILON_MA;
    Ok(if i < limits.no_current_below_ma - e {
        SignalStatus::NoLoopCurrent
    } else if i <= limits.fail_low_at_or_below_ma + e {
        SignalStatus::FailLow
    } else if i < limits.measure_low_ma - e {
        SignalStatus::SuspectLow
    } else if i < span.low_ma - e {
        SignalStatus::UnderRange
    } else if i <= span.high_ma + e {
        SignalStatus::InRange
    } else if i <= limits.measure_high_ma + e {
        SignalStatus::OverRange
    } else if i < limits.fail_high_at_or_above_ma - e {
        SignalStatus::SuspectHigh
    } else {
        SignalStatus::FailHigh
    })
}

/// Classify with NE 43 defaults on a 4–20 mA span.
pub fn classify_ne43(ma: f64) -> Result<SignalStatus> {
    classify(ma, &BandLimits::default(), &SignalSpan::default())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn limits_out_of_order_are_refused() {
        let l = BandLimits {
            measure_low_ma: 3.5,
            ..Default::default()
        };
        let e = l.validate(&SignalSpan::default()).unwrap_err();
        assert_eq!(e.field, "measure_low_ma");
        assert!(BandLimits::default()
            .validate(&SignalSpan::default())
            .is_ok());
    }

    #[test]
    fn a_zero_to_twenty_signal_has_no_failure_bands() {
        // NE 43 is defined for 4–20 mA; on 0–20 mA, 2 mA is 10 % of span (linear).
        let span = SignalSpan::new(0.0, 20.0).unwrap();
        let d = BandLimits::default();
        assert_eq!(classify(2.0, &d, &span).unwrap(), SignalStatus::InRange);
        assert_eq!(classify(0.0, &d, &span).unwrap(), SignalStatus::InRange);
        assert_eq!(classify(21.5, &d, &span).unwrap(), SignalStatus::OverRange);
        assert!(!d.for_span(&span).has_failure_bands());
        assert!(d.validate(&span).is_ok());
        // The same 2 mA on 4–20 mA is a downscale failure signal (NE 43: ≤ 3.6 mA).
        assert_eq!(classify_ne43(2.0).unwrap(), SignalStatus::FailLow);
        assert!(d.for_span(&SignalSpan::default()).has_failure_bands());
    }

    #[test]
    fn names_round_trip() {
        for s in SignalStatus::ALL {
            assert_eq!(SignalStatus::from_name(s.as_str()), Some(s));
        }
    }
}
