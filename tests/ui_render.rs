//! Headless screen renders: every screen draws, and the band bar's marker sits where the
//! reading puts it. Uses the same code as `examples/screens.rs`.
#![cfg(feature = "ui")]

use loopside::app::render::{Frame, Headless, DESKTOP, PHONE};
use loopside::app::{AppState, Screen, SCREENS};

/// The marker's colour in the light theme (`Theme.marker`: used for nothing else).
const MARKER: [u8; 3] = [0, 0, 0];
/// The in-range band's colour in the light theme (`Theme.ok`).
const IN_RANGE: [u8; 3] = [0x14, 0x6b, 0x2a];

fn distinct_colours(f: &Frame) -> usize {
    let mut seen = std::collections::HashSet::new();
    for p in f.pixels.iter().step_by(7) {
        seen.insert(p.rgb());
    }
    seen.len()
}

fn share_not(f: &Frame, background: [u8; 3]) -> f64 {
    let n = f.pixels.iter().filter(|p| p.rgb() != background).count();
    n as f64 / f.pixels.len() as f64
}

#[test]
fn every_screen_draws_at_both_sizes_and_themes() {
    let h = Headless::new(AppState::demo()).unwrap();
    for dark in [false, true] {
        h.app.set_dark(dark);
        let background = if dark {
            [0x05, 0x08, 0x0b]
        } else {
            [0xff, 0xff, 0xff]
        };
        for size in [PHONE, DESKTOP] {
            for screen in SCREENS {
                h.show(screen);
                let f = h.render(size);
                assert_eq!(f.pixels.len(), (size.width * size.height) as usize);
                let drawn = share_not(&f, background);
                assert!(
                    drawn > 0.05,
                    "{screen:?} at {} (dark {dark}) is nearly blank: {drawn:.3}",
                    size.name
                );
                assert!(distinct_colours(&f) > 20, "{screen:?} has too few colours");
            }
        }
    }
}

/// Centre of the marker line and the in-range band's left and right edges, in the row
/// half-way down the marker's line.
fn marker_and_band(f: &Frame) -> (f64, f64, f64) {
    let mut rows: Vec<u32> = Vec::new();
    for y in 0..f.height {
        if (0..f.width).any(|x| f.at(x, y) == MARKER) {
            rows.push(y);
        }
    }
    assert!(!rows.is_empty(), "no marker drawn");
    // The line runs from the pointer down through the bar; take a row in its lower half,
    // inside the bar.
    let y = rows[rows.len() * 3 / 4];
    let xs: Vec<u32> = (0..f.width).filter(|&x| f.at(x, y) == MARKER).collect();
    let centre = (xs[0] + xs[xs.len() - 1]) as f64 / 2.0;
    let green: Vec<u32> = (0..f.width).filter(|&x| f.at(x, y) == IN_RANGE).collect();
    assert!(!green.is_empty(), "no in-range band in row {y}");
    (centre, green[0] as f64, green[green.len() - 1] as f64 + 1.0)
}

#[test]
fn band_bar_marker_sits_where_the_reading_puts_it() {
    // The in-range band covers 26 %–82 % of the bar (view::bands); 4 mA at its left edge,
    // 20 mA at its right edge, linear between; below 4 mA the same scale runs on into the
    // narrower bands, so only in-range readings are checked against the green edges.
    for (ma, fraction_of_span) in [("6", 0.125), ("12", 0.5), ("18,5", 0.906_25)] {
        let mut state = AppState::demo();
        state.ui.convert.source = loopside::view::convert::Source::Ma;
        state.ui.convert.text = ma.to_string();
        let h = Headless::new(state).unwrap();
        h.show(Screen::Convert);
        let f = h.render(PHONE);
        let (centre, left, right) = marker_and_band(&f);
        let expected = left + fraction_of_span * (right - left);
        assert!(
            (centre - expected).abs() < 4.0,
            "{ma} mA: marker at x={centre}, expected {expected} (band {left}..{right})"
        );
    }
}

#[test]
fn failure_current_puts_the_marker_left_of_the_span() {
    let mut state = AppState::demo();
    state.ui.convert.text = "3,5".to_string();
    let h = Headless::new(state).unwrap();
    h.show(Screen::Convert);
    let f = h.render(PHONE);
    let (centre, left, _) = marker_and_band(&f);
    assert!(
        centre < left,
        "3.5 mA marker at {centre}, span starts at {left}"
    );
}
