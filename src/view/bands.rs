//! The signal band bar: where each NE 43 band and the reading sit, as fractions of the bar.
//!
//! The bands are very unequal in mA (the suspect gaps are 0.2 and 0.5 mA wide, the span
//! 16 mA), so the bar is drawn piecewise: each band gets a fixed share of the width and is
//! linear inside it. That keeps every band visible on a 360 px phone while the marker still
//! moves in proportion to the current within a band.

use crate::scale::SignalSpan;
use crate::signal::{BandLimits, SignalStatus};

/// One band on the bar: start and end as fractions of the bar's width, and its status.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct BandSeg {
    /// Left edge, 0..1.
    pub start: f64,
    /// Right edge, 0..1.
    pub end: f64,
    /// The status a current in this band has.
    pub status: SignalStatus,
}

impl BandSeg {
    /// The colour class the UI uses: 0 no current, 1 failure, 2 suspect, 3 measurement
    /// outside the span, 4 within the span.
    pub fn kind(&self) -> i32 {
        match self.status {
            SignalStatus::NoLoopCurrent => 0,
            SignalStatus::FailLow | SignalStatus::FailHigh => 1,
            SignalStatus::SuspectLow | SignalStatus::SuspectHigh => 2,
            SignalStatus::UnderRange | SignalStatus::OverRange => 3,
            SignalStatus::InRange => 4,
        }
    }
}

/// A tick under the bar: position (0..1) and label (empty for an unlabelled tick).
#[derive(Debug, Clone, PartialEq)]
pub struct Tick {
    /// Position, 0..1.
    pub pos: f64,
    /// Label, mA without the unit; empty when the tick is too close to a labelled one.
    pub label: String,
}

/// Everything the bar draws.
#[derive(Debug, Clone, PartialEq)]
pub struct BandBar {
    /// The eight bands, left to right.
    pub bands: Vec<BandSeg>,
    /// Ticks at the band edges and mid-span.
    pub ticks: Vec<Tick>,
    /// Where the reading sits, 0..1, if there is a reading.
    pub marker: Option<f64>,
}

/// Share of the bar's width each band gets, lowest current first (sums to 1).
const SHARES: [f64; 8] = [0.08, 0.08, 0.05, 0.05, 0.56, 0.05, 0.05, 0.08];
/// How far past the upscale failure limit the bar reaches, mA.
const TOP_MARGIN_MA: f64 = 3.0;

/// The band edges in mA, lowest first: 0, no-current, fail-low, measure-low, span low,
/// span high, measure-high, fail-high, and the bar's top.
fn edges(limits: &BandLimits, span: &SignalSpan) -> [f64; 9] {
    [
        0.0,
        limits.no_current_below_ma,
        limits.fail_low_at_or_below_ma,
        limits.measure_low_ma,
        span.low_ma,
        span.high_ma,
        limits.measure_high_ma,
        limits.fail_high_at_or_above_ma,
        limits.fail_high_at_or_above_ma + TOP_MARGIN_MA,
    ]
}

/// Where a current sits on the bar, 0..1 (clamped at both ends).
pub fn position(ma: f64, limits: &BandLimits, span: &SignalSpan) -> f64 {
    let e = edges(limits, span);
    if !ma.is_finite() || ma <= e[0] {
        return 0.0;
    }
    let mut start = 0.0;
    for (i, share) in SHARES.iter().enumerate() {
        let (lo, hi) = (e[i], e[i + 1]);
        if ma <= hi {
            let inside = if hi > lo { (ma - lo) / (hi - lo) } else { 1.0 };
            return (start + share * inside).clamp(0.0, 1.0);
        }
        start += share;
    }
    1.0
}

/// The bar for a signal span and band limits, with the reading marked if there is one.
pub fn band_bar(ma: Option<f64>, limits: &BandLimits, span: &SignalSpan) -> BandBar {
    let statuses = SignalStatus::ALL;
    let mut bands = Vec::with_capacity(8);
    let mut start = 0.0;
    for (share, status) in SHARES.iter().zip(statuses) {
        bands.push(BandSeg {
            start,
            end: start + share,
            status,
        });
        start += share;
    }
    let e = edges(limits, span);
    let mid = (span.low_ma + span.high_ma) / 2.0;
    // Labelled: the failure limits, the span ends and mid-span. The measurement limits and
    // the no-current limit get bare ticks: their labels would collide with their neighbours.
    let labelled = [e[2], e[4], mid, e[5], e[7]];
    let bare = [e[1], e[3], e[6]];
    let mut ticks: Vec<Tick> = labelled
        .iter()
        .map(|&m| Tick {
            pos: position(m, limits, span),
            label: tick_label(m),
        })
        .collect();
    ticks.extend(bare.iter().map(|&m| Tick {
        pos: position(m, limits, span),
        label: String::new(),
    }));
    BandBar {
        bands,
        ticks,
        marker: ma.map(|m| position(m, limits, span)),
    }
}

/// `4`, `3.6`, `20.5`: mA without trailing zeros.
fn tick_label(ma: f64) -> String {
    let s = crate::display::fixed(ma, 1);
    s.strip_suffix(".0").map(str::to_string).unwrap_or(s)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn shares_fill_the_bar() {
        assert!((SHARES.iter().sum::<f64>() - 1.0).abs() < 1e-12);
    }

    #[test]
    fn positions_follow_the_bands() {
        let (l, s) = (BandLimits::default(), SignalSpan::default());
        // 4 mA sits at the start of the span's share, 20 mA at its end, 12 mA half-way.
        assert!((position(4.0, &l, &s) - 0.26).abs() < 1e-12);
        assert!((position(20.0, &l, &s) - 0.82).abs() < 1e-12);
        assert!((position(12.0, &l, &s) - 0.54).abs() < 1e-12);
        assert_eq!(position(-1.0, &l, &s), 0.0);
        assert_eq!(position(99.0, &l, &s), 1.0);
        assert_eq!(position(f64::NAN, &l, &s), 0.0);
    }

    #[test]
    fn a_current_lands_in_the_band_of_its_status() {
        let (l, s) = (BandLimits::default(), SignalSpan::default());
        let bar = band_bar(None, &l, &s);
        for ma in [0.5, 2.0, 3.7, 3.9, 12.0, 20.2, 20.7, 22.0] {
            let status = crate::signal::classify(ma, &l, &s).unwrap();
            let p = position(ma, &l, &s);
            let band = bar.bands.iter().find(|b| b.status == status).unwrap();
            assert!(
                p >= band.start && p <= band.end,
                "{ma} mA at {p} outside {status}"
            );
        }
    }

    #[test]
    fn tick_labels_are_short() {
        let bar = band_bar(Some(12.0), &BandLimits::default(), &SignalSpan::default());
        let labels: Vec<&str> = bar
            .ticks
            .iter()
            .map(|t| t.label.as_str())
            .filter(|l| !l.is_empty())
            .collect();
        assert_eq!(labels, ["3.6", "4", "12", "20", "21"]);
    }
}
