//! The Check screen's view model: the five-point table (rising then falling), the error of
//! each reading in % of span against the tag's tolerance, and the error plot's positions.
//!
//! Interim: this works the per-point error itself so the screen can be laid out and
//! tested; when `crate::check` (branch `check`) lands, the rows and verdict come from it
//! (hysteresis, as-found/as-left, reference-instrument ratio) and this keeps only the
//! mapping to rows and plot positions.

use crate::display;
use crate::number::parse_in;
use crate::scale::SignalSpan;
use crate::view::Tone;

/// Test points in % of span, rising then falling (ISA-51.1 terms; common practice).
pub const POINTS: [f64; 9] = [0.0, 25.0, 50.0, 75.0, 100.0, 75.0, 50.0, 25.0, 0.0];

/// One table row.
#[derive(Debug, Clone, PartialEq)]
pub struct Row {
    /// `25 % ↑`.
    pub point: String,
    /// Expected current, `8.000`.
    pub expected: String,
    /// Error in % of span, formatted, or empty when not read yet; or the parse error.
    pub error: String,
    /// How it stands (neutral when not read).
    pub tone: Tone,
    /// Error in % of span, if read.
    pub error_percent: Option<f64>,
}

/// A plotted point: x and y as fractions of the plot (y = 0 at the top).
#[derive(Debug, Clone, PartialEq)]
pub struct PlotPoint {
    /// 0..1 across.
    pub x: f64,
    /// 0..1 down.
    pub y: f64,
    /// Within tolerance.
    pub pass: bool,
    /// Taken on the rising pass.
    pub rising: bool,
}

/// Everything the Check screen shows.
#[derive(Debug, Clone, PartialEq)]
pub struct CheckView {
    /// Table rows.
    pub rows: Vec<Row>,
    /// Plot points for the rows that were read.
    pub points: Vec<PlotPoint>,
    /// Tolerance band top and bottom, and the zero line, as fractions of the plot height.
    pub band: (f64, f64, f64),
    /// Y-axis labels: (fraction, text).
    pub y_labels: Vec<(f64, String)>,
    /// Verdict title, detail and tone (empty until every point is read).
    pub verdict: (String, String, Tone),
}

/// Work out the view from the readings as typed (one per point; empty = not read yet).
pub fn view(readings: &[String], tolerance_percent: f64, signal: &SignalSpan) -> CheckView {
    let mut rows = Vec::with_capacity(POINTS.len());
    let mut worst: f64 = 0.0;
    let mut read = 0;
    for (i, &p) in POINTS.iter().enumerate() {
        let rising = i <= 4;
        let expected_ma = signal.ma_at(p);
        let text = readings.get(i).map(String::as_str).unwrap_or("");
        let arrow = if i == 4 {
            ""
        } else if rising {
            " ↑"
        } else {
            " ↓"
        };
        let mut row = Row {
            point: format!("{}{arrow}", display::fixed(p, 0) + " %"),
            expected: display::fixed(expected_ma, 3),
            error: String::new(),
            tone: Tone::Neutral,
            error_percent: None,
        };
        if !text.trim().is_empty() {
            match parse_in("reading", text, "mA") {
                Ok(ma) => {
                    let e = (ma - expected_ma) / signal.width_ma() * 100.0;
                    row.error = display::percent(e);
                    row.tone = if e.abs() <= tolerance_percent + 1e-12 {
                        Tone::Good
                    } else {
                        Tone::Bad
                    };
                    row.error_percent = Some(e);
                    worst = worst.max(e.abs());
                    read += 1;
                }
                Err(_) => {
                    row.error = "?".to_string();
                    row.tone = Tone::Caution;
                }
            }
        }
        rows.push(row);
    }
    // The plot spans ±2 × tolerance, or the worst error with a margin if that is larger.
    let half = (2.0 * tolerance_percent).max(worst * 1.2).max(1e-6);
    let y_of = |e: f64| (0.5 - e / (2.0 * half)).clamp(0.0, 1.0);
    let points = rows
        .iter()
        .enumerate()
        .filter_map(|(i, r)| {
            r.error_percent.map(|e| PlotPoint {
                x: 0.05 + 0.9 * POINTS[i] / 100.0,
                y: y_of(e),
                pass: r.tone == Tone::Good,
                rising: i <= 4,
            })
        })
        .collect();
    let y_labels = [half, tolerance_percent, 0.0, -tolerance_percent, -half]
        .iter()
        .map(|&e| (y_of(e), display::percent(e)))
        .collect();
    let verdict = if read < POINTS.len() {
        (String::new(), String::new(), Tone::Neutral)
    } else if rows.iter().all(|r| r.tone == Tone::Good) {
        (
            "Pass".to_string(),
            format!("Worst error {} of span", display::percent(worst)),
            Tone::Good,
        )
    } else {
        (
            "Fail".to_string(),
            format!(
                "Worst error {} of span, tolerance ± {}",
                display::percent(worst),
                display::percent(tolerance_percent)
            ),
            Tone::Bad,
        )
    };
    CheckView {
        rows,
        points,
        band: (y_of(tolerance_percent), y_of(-tolerance_percent), y_of(0.0)),
        y_labels,
        verdict,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn errors_in_percent_of_span() {
        let mut r = vec![String::new(); 9];
        r[0] = "4,08".to_string();
        r[2] = "12.00 mA".to_string();
        r[4] = "x".to_string();
        let v = view(&r, 0.5, &SignalSpan::default());
        assert_eq!(v.rows[0].error, "0.50 %");
        assert_eq!(v.rows[0].tone, Tone::Good);
        assert_eq!(v.rows[2].error, "0.00 %");
        assert_eq!(v.rows[4].tone, Tone::Caution);
        assert_eq!(v.points.len(), 2);
        assert!(v.verdict.0.is_empty());
        let all: Vec<String> = POINTS
            .iter()
            .map(|p| format!("{}", 4.0 + p * 0.16 + 0.12))
            .collect();
        let v = view(&all, 0.5, &SignalSpan::default());
        assert_eq!(v.verdict.0, "Fail");
        assert!(v.band.0 < v.band.2 && v.band.2 < v.band.1);
    }
}
