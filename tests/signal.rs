//! NAMUR NE 43 band edges, at and around every limit.

use loopside::scale::SignalSpan;
use loopside::signal::{classify, classify_ne43, BandLimits, SignalStatus as S};

#[test]
fn every_edge_of_the_ne43_bands() {
    // NAMUR NE 43: measurement 3.8–20.5 mA, failure ≤ 3.6 mA or ≥ 21.0 mA.
    // 1.0 mA "no loop current": common practice.
    let cases = [
        (-0.5, S::NoLoopCurrent),
        (0.0, S::NoLoopCurrent),
        (0.999, S::NoLoopCurrent),
        (1.0, S::FailLow),
        (3.2, S::FailLow),
        (3.6, S::FailLow),
        (3.601, S::SuspectLow),
        (3.799, S::SuspectLow),
        (3.8, S::UnderRange),
        (3.999, S::UnderRange),
        (4.0, S::InRange),
        (12.0, S::InRange),
        (20.0, S::InRange),
        (20.001, S::OverRange),
        (20.5, S::OverRange),
        (20.501, S::SuspectHigh),
        (20.999, S::SuspectHigh),
        (21.0, S::FailHigh),
        (22.5, S::FailHigh),
    ];
    for (ma, want) in cases {
        assert_eq!(classify_ne43(ma).unwrap(), want, "{ma} mA");
    }
}

#[test]
fn a_current_computed_from_volts_lands_on_its_edge() {
    // 0.9 V across 250 Ω is 3.6 mA: a failure signal, even after floating-point division.
    let ma = 0.9 / 250.0 * 1000.0;
    assert_eq!(classify_ne43(ma).unwrap(), S::FailLow);
}

#[test]
fn statuses_say_what_they_mean() {
    assert!(S::FailLow.is_failure() && !S::FailLow.is_measurement());
    assert!(S::OverRange.is_measurement());
    assert!(!S::SuspectHigh.is_measurement() && !S::SuspectHigh.is_failure());
    assert!(S::NoLoopCurrent.meaning().contains("open"));
}

#[test]
fn per_tag_limits_for_a_device_that_fails_at_other_levels() {
    // A device that drives 3.5 mA / 22.5 mA on failure, configured per tag (demo values).
    let limits = BandLimits {
        no_current_below_ma: 1.0,
        fail_low_at_or_below_ma: 3.5,
        measure_low_ma: 3.9,
        measure_high_ma: 20.8,
        fail_high_at_or_above_ma: 22.5,
    };
    let span = SignalSpan::default();
    limits.validate(&span).unwrap();
    assert_eq!(classify(3.6, &limits, &span).unwrap(), S::SuspectLow);
    assert_eq!(classify(21.0, &limits, &span).unwrap(), S::SuspectHigh);
    assert_eq!(classify(20.7, &limits, &span).unwrap(), S::OverRange);
    assert_eq!(classify(22.5, &limits, &span).unwrap(), S::FailHigh);
}

#[test]
fn nan_is_refused() {
    assert_eq!(classify_ne43(f64::NAN).unwrap_err().field, "mA");
}
