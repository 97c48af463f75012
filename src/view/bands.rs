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
/// span high, measure-high, fail-high, and the bar's top. Limits the span does not use
/// (a 0–20 mA signal has no failure bands) collapse onto the span's ends, so their bands
/// have no width and take no share of the bar.
fn edges(limits: &BandLimits, span: &SignalSpan) -> [f64; 9] {
    let l = limits.for_span(span);
    let low = |x: f64| if x.is_finite() { x.max(0.0) } else { 0.0 };
    let measure_high = if l.measure_high_ma.is_finite() {
        l.measure_high_ma
    } else {
        span.high_ma + TOP_MARGIN_MA
    };
    let (fail_high, top) = if l.fail_high_at_or_above_ma.is_finite() {
        (
            l.fail_high_at_or_above_ma,
            l.fail_high_at_or_above_ma + TOP_MARGIN_MA,
        )
    } else {
        (measure_high, measure_high)
    };
    [
        0.0,
        low(l.no_current_below_ma),
        low(l.fail_low_at_or_below_ma),
        low(l.measure_low_ma),
        span.low_ma,
        span.high_ma,
        measure_high,
        fail_high,
        top,
    ]
}

/// Each band's share of the bar: [`SHARES`], with bands of no width dropped and the rest
/// scaled to fill the bar.
fn shares(e: &[f64; 9]) -> [f64; 8] {
    let mut out = SHARES;
    for (i, share) in out.iter_mut().enumerate() {
        if e[i + 1] <= e[i] {
            *share = 0.0;
        }
    }
    let sum: f64 = out.iter().sum();
    if sum > 0.0 {
        for share in &mut out {
            *share /= sum;
        }
    }
    out
}

/// Where a current sits on the bar, 0..1 (clamped at both ends).
pub fn position(ma: f64, limits: &BandLimits, span: &SignalSpan) -> f64 {
    let e = edges(limits, span);
    if !ma.is_finite() || ma <= e[0] {
        return 0.0;
    }
    let mut start = 0.0;
    for (i, share) in shares(&e).iter().enumerate() {
        let (lo, hi) = (e[i], e[i + 1]);
        if ma <= hi && hi > lo {
            let inside = (ma - lo) / (hi - lo);
            return (start + share * inside).clamp(0.0, 1.0);
        }
        start += share;
    }
    1.0
}

/// The bar for a signal span and band limits, with the reading marked if there is one.
/// Bands the span does not have (failure bands on a 0–20 mA signal) come out with no
/// width.
pub fn band_bar(ma: Option<f64>, limits: &BandLimits, span: &SignalSpan) -> BandBar {
    let e = edges(limits, span);
    let statuses = SignalStatus::ALL;
    debug_assert!(e.windows(2).all(|w| w[0] <= w[1]));
    let mut bands = Vec::with_capacity(8);
    let mut start = 0.0;
    for (share, status) in shares(&e).iter().zip(statuses) {
        bands.push(BandSeg {
            start,
            end: start + share,
            status,
        });
        start += share;
    }
    let mid = (span.low_ma + span.high_ma) / 2.0;
    // Labelled: the failure limits, the span ends and mid-span. The measurement limits and
    // the no-current limit get bare ticks: their labels would collide with their neighbours.
    // A limit the span does not use gets no tick, nor does one on another's place.
    let l = limits.for_span(span);
    let labelled = [
        l.fail_low_at_or_below_ma,
        span.low_ma,
        mid,
        span.high_ma,
        l.fail_high_at_or_above_ma,
    ];
    let bare = [l.no_current_below_ma, l.measure_low_ma, l.measure_high_ma];
    let mut ticks: Vec<Tick> = Vec::new();
    for &m in labelled.iter().filter(|m| m.is_finite()) {
        let pos = position(m, limits, span);
        if !ticks.iter().any(|t| (t.pos - pos).abs() < 1e-9) {
            ticks.push(Tick {
                pos,
                label: tick_label(m),
            });
        }
    }
    for &m in bare.iter().filter(|m| m.is_finite()) {
        let pos = position(m, limits, span);
        if !ticks.iter().any(|t| (t.pos - pos).abs() < 1e-9) {
            ticks.push(Tick {
                pos,
                label: String::new(),
            });
        }
    }
    BandBar {
        bands,
        ticks,
        marker: ma.map(|m| position(m, limits, span)),
    }
}

/// `4`, `3.6`, `20.5`: mA without trailing zeros.
fn tick_label(ma: f64) -> String {
    crate::display::ma_label(ma)
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

    #[test]
    fn a_zero_to_twenty_bar_has_no_failure_bands() {
        // 0–20 mA is not NE 43: under, within and over the span only; 2 mA is 10 %.
        let (l, s) = (BandLimits::default(), SignalSpan::new(0.0, 20.0).unwrap());
        let bar = band_bar(Some(2.0), &l, &s);
        for b in &bar.bands {
            let wide = b.end - b.start > 0.0;
            match b.status {
                SignalStatus::InRange | SignalStatus::OverRange => assert!(wide, "{}", b.status),
                _ => assert!(!wide, "{} has width on 0–20 mA", b.status),
            }
        }
        let within = bar
            .bands
            .iter()
            .find(|b| b.status == SignalStatus::InRange)
            .unwrap();
        let m = bar.marker.unwrap();
        assert!((m - (within.start + 0.1 * (within.end - within.start))).abs() < 1e-12);
        let labels: Vec<&str> = bar.ticks.iter().map(|t| t.label.as_str()).collect();
        assert_eq!(labels, ["0", "10", "20"]);
    }
}
