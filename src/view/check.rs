//! The Check screen's view model: a transmitter check of the open tag at the default points
//! (0, 25, 50, 75, 100 % rising, then falling back), worked by [`crate::check::LoopCheck`].
//!
//! Each row says what to apply at the transmitter's input (the value in the tag's unit, or
//! the ohms / millivolts its sensor needs for that value), the current to expect, and once
//! a reading is typed, its error in % of span against the tag's tolerance. The verdict,
//! hysteresis and the record saved to the log come from the same [`CheckResult`] the
//! command line's `check` prints.

use crate::check::{CheckResult, Device, Direction, LoopCheck, PlannedPoint, Stage};
use crate::display;
use crate::error::{FieldError, Result};
use crate::number::parse_in;
use crate::tag::Tag;
use crate::view::Tone;
use chrono::NaiveDate;

/// One table row.
#[derive(Debug, Clone, PartialEq)]
pub struct Row {
    /// `25 % ↑`.
    pub point: String,
    /// What to apply at the input: `1.125 m`, `107.79 Ω`.
    pub apply: String,
    /// Expected current, `8.000`.
    pub expected: String,
    /// Error in % of span, formatted; `?` when the reading cannot be read; empty when not
    /// read yet.
    pub error: String,
    /// How it stands (neutral when not read).
    pub tone: Tone,
    /// The point's verdict in words: `pass`, `FAIL`, or empty when not judged.
    pub verdict: String,
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
    /// `± 0.50 % of span`.
    pub tolerance_text: String,
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
    /// The first reading that cannot be read, in words (empty when all is well).
    pub problem: String,
}

/// The check the screen runs for `tag`.
pub fn check_for(tag: &Tag, stage: Stage, date: NaiveDate) -> LoopCheck {
    LoopCheck::for_tag(tag, Device::Transmitter, date).stage(stage)
}

fn point_label(p: &PlannedPoint, last_rising: bool) -> String {
    let arrow = match (p.direction, last_rising) {
        (_, true) => "",
        (Direction::Rising, _) => " ↑",
        (Direction::Falling, _) => " ↓",
    };
    format!("{} %{arrow}", display::test_point(p.percent))
}

/// What to apply for a planned point: the sensor's input if the tag has a sensor.
fn apply_text(tag: &Tag, check: &LoopCheck, p: &PlannedPoint) -> String {
    if let Some(sensor) = &tag.sensor {
        if let Ok(v) = sensor.applied_for(p.applied, &tag.scale.unit) {
            let unit = sensor.applied_unit();
            return display::sensor_input(v, unit);
        }
    }
    display::value(p.applied, &check.input_unit(), tag.scale.span().abs())
}

/// Read the typed readings: `Ok(None)` for an empty field, an error naming the point.
fn parse_readings(
    plan: &[PlannedPoint],
    readings: &[String],
) -> Vec<std::result::Result<Option<f64>, FieldError>> {
    let last = plan.len().saturating_sub(1);
    plan.iter()
        .enumerate()
        .map(|(i, p)| {
            let text = readings.get(i).map(String::as_str).unwrap_or("").trim();
            if text.is_empty() {
                return Ok(None);
            }
            let field = format!("reading at {}", point_label(p, i == last / 2));
            parse_in(&field, text, "mA").and_then(|ma| {
                if (0.0..=30.0).contains(&ma) {
                    Ok(Some(ma))
                } else {
                    Err(FieldError::new(
                        field,
                        format!(
                            "{} mA is not a loop current; type the mA read, 0 to 30",
                            display::ma(ma)
                        ),
                    ))
                }
            })
        })
        .collect()
}

/// Judge a complete set of readings: the result to save. The error names the first point
/// that is missing or cannot be read.
pub fn result(check: &LoopCheck, readings: &[String]) -> Result<CheckResult> {
    let plan = check.plan()?;
    let mut measured = Vec::with_capacity(plan.len());
    let last = plan.len().saturating_sub(1);
    for (i, r) in parse_readings(&plan, readings).into_iter().enumerate() {
        match r? {
            Some(ma) => measured.push(ma),
            None => {
                return Err(FieldError::new(
                    format!("reading at {}", point_label(&plan[i], i == last / 2)),
                    "is empty; read every point before saving",
                ))
            }
        }
    }
    check.run_planned(&measured)
}

/// Work out the view for `tag` from the readings as typed (one per point; empty = not
/// read yet). A tag whose check cannot be planned gives a view with the reason.
pub fn view(tag: &Tag, stage: Stage, readings: &[String], date: NaiveDate) -> CheckView {
    let check = check_for(tag, stage, date);
    let tolerance = tag.tolerance_percent;
    let tolerance_text = format!("± {} of span", display::percent(tolerance));
    let plan = match check.plan() {
        Ok(p) => p,
        Err(e) => {
            return CheckView {
                tolerance_text,
                rows: Vec::new(),
                points: Vec::new(),
                band: (0.25, 0.75, 0.5),
                y_labels: Vec::new(),
                verdict: (String::new(), String::new(), Tone::Neutral),
                problem: e.to_string(),
            }
        }
    };
    let parsed = parse_readings(&plan, readings);
    // Unread points stand in at their expected current, so one run gives every read
    // point's error; the verdict is shown only when all are read.
    let measured: Vec<f64> = plan
        .iter()
        .zip(&parsed)
        .map(|(p, r)| match r {
            Ok(Some(ma)) => *ma,
            _ => p.expected,
        })
        .collect();
    let run = check.run_planned(&measured);
    let last = plan.len().saturating_sub(1);
    let mut rows = Vec::with_capacity(plan.len());
    let mut problem = String::new();
    let mut worst: f64 = 0.0;
    for (i, (p, r)) in plan.iter().zip(&parsed).enumerate() {
        let mut row = Row {
            point: point_label(p, i == last / 2),
            apply: apply_text(tag, &check, p),
            expected: display::ma_number(p.expected),
            error: String::new(),
            tone: Tone::Neutral,
            verdict: String::new(),
            error_percent: None,
        };
        match r {
            Ok(Some(_)) => {
                if let Some(pr) = run.as_ref().ok().and_then(|res| res.points.get(i)) {
                    row.error = display::percent(pr.error_pct);
                    row.tone = if pr.pass { Tone::Good } else { Tone::Bad };
                    row.verdict = if pr.pass { "pass" } else { "FAIL" }.to_string();
                    row.error_percent = Some(pr.error_pct);
                    worst = worst.max(pr.error_pct.abs());
                }
            }
            Ok(None) => {}
            Err(e) => {
                row.error = "?".to_string();
                row.tone = Tone::Caution;
                if problem.is_empty() {
                    problem = e.to_string();
                }
            }
        }
        rows.push(row);
    }
    // The plot spans ±2 × tolerance, or the worst error with a margin if that is larger.
    let half = (2.0 * tolerance).max(worst * 1.2).max(1e-6);
    let y_of = |e: f64| (0.5 - e / (2.0 * half)).clamp(0.0, 1.0);
    let points = rows
        .iter()
        .zip(&plan)
        .filter_map(|(r, p)| {
            r.error_percent.map(|e| PlotPoint {
                x: 0.05 + 0.9 * p.percent / 100.0,
                y: y_of(e),
                pass: r.tone == Tone::Good,
                rising: p.direction == Direction::Rising,
            })
        })
        .collect();
    let y_labels = [half, tolerance, 0.0, -tolerance, -half]
        .iter()
        .map(|&e| (y_of(e), display::percent(e)))
        .collect();
    let all_read = parsed.iter().all(|r| matches!(r, Ok(Some(_))));
    let verdict = match (&run, all_read) {
        (Ok(res), true) => {
            let mut detail = format!(
                "Worst error {} of span at {} %",
                display::percent(res.max_error_pct),
                res.points
                    .get(res.max_error_index)
                    .map(|p| display::test_point(p.percent))
                    .unwrap_or_default()
            );
            if let Some(h) = res.hysteresis_pct {
                detail.push_str(&format!("; hysteresis {}", display::percent(h)));
            }
            detail.push_str(&format!("; tolerance ± {}", display::percent(tolerance)));
            if res.pass {
                ("Pass".to_string(), detail, Tone::Good)
            } else {
                ("Fail".to_string(), detail, Tone::Bad)
            }
        }
        (Err(e), _) if problem.is_empty() => {
            problem = e.to_string();
            (String::new(), String::new(), Tone::Neutral)
        }
        _ => (String::new(), String::new(), Tone::Neutral),
    };
    CheckView {
        tolerance_text,
        rows,
        points,
        band: (y_of(tolerance), y_of(-tolerance), y_of(0.0)),
        y_labels,
        verdict,
        problem,
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::scale::Scale;

    fn date() -> NaiveDate {
        NaiveDate::from_ymd_opt(2026, 12, 1).unwrap()
    }

    fn level_tag() -> Tag {
        // 0–4.5 m, tolerance ±0.5 % of span (invented demo values).
        let mut t = Tag::new("LT-101", Scale::linear(0.0, 4.5, "m").unwrap()).unwrap();
        t.tolerance_percent = 0.5;
        t
    }

    #[test]
    fn errors_in_percent_of_span_as_typed() {
        let tag = level_tag();
        let mut r = vec![String::new(); 9];
        // 4.08 mA at 0 %: +0.08 mA of a 16 mA span is +0.50 % (on the tolerance edge).
        r[0] = "4,08".to_string();
        r[2] = "12.00 mA".to_string();
        r[4] = "x".to_string();
        let v = view(&tag, Stage::AsFound, &r, date());
        assert_eq!(v.rows[0].point, "0 % ↑");
        assert_eq!(v.rows[0].apply, "0.0000 m");
        assert_eq!(v.rows[2].apply, "2.2500 m");
        assert_eq!(v.rows[4].point, "100 %");
        assert_eq!(v.rows[5].point, "75 % ↓");
        assert_eq!(v.rows[0].error, "0.50 %");
        assert_eq!(v.rows[0].tone, Tone::Good);
        assert_eq!(v.rows[0].verdict, "pass");
        assert_eq!(v.rows[4].verdict, "");
        assert_eq!(v.rows[2].error, "0.00 %");
        assert_eq!(v.rows[4].tone, Tone::Caution);
        assert!(v.problem.contains("reading at 100 %"), "{}", v.problem);
        assert_eq!(v.points.len(), 2);
        assert!(v.verdict.0.is_empty());
    }

    #[test]
    fn a_zero_shift_fails_and_says_where() {
        let tag = level_tag();
        // Every reading 0.12 mA high: +0.75 % of span everywhere.
        let plan = check_for(&tag, Stage::AsFound, date()).plan().unwrap();
        let all: Vec<String> = plan
            .iter()
            .map(|p| format!("{}", p.expected + 0.12))
            .collect();
        let v = view(&tag, Stage::AsFound, &all, date());
        assert_eq!(v.verdict.0, "Fail");
        assert!(v.verdict.1.contains("0.75 %"), "{}", v.verdict.1);
        assert!(v.band.0 < v.band.2 && v.band.2 < v.band.1);
        let saved = result(&check_for(&tag, Stage::AsFound, date()), &all).unwrap();
        assert!(!saved.pass);
        assert_eq!(saved.stage, Stage::AsFound);
    }

    #[test]
    fn saving_needs_every_point() {
        let tag = level_tag();
        let mut r = vec!["12".to_string(); 9];
        r[7] = String::new();
        let e = result(&check_for(&tag, Stage::AsLeft, date()), &r).unwrap_err();
        assert_eq!(e.field, "reading at 25 % ↓");
        r[7] = "45".to_string();
        let e = result(&check_for(&tag, Stage::AsLeft, date()), &r).unwrap_err();
        assert!(e.reason.contains("0 to 30"), "{}", e.reason);
    }

    #[test]
    fn an_rtd_tag_says_which_ohms_to_apply() {
        // A −20…80 °C Pt100 loop: at 0 % apply R(−20 °C) = 92.16 Ω, at 50 % (30 °C)
        // 111.67 Ω (IEC 60751 table values for Pt100, rounded to 0.01 Ω).
        let mut tag = Tag::new("TT-412", Scale::linear(-20.0, 80.0, "°C").unwrap()).unwrap();
        tag.sensor = Some(crate::sensor::Sensor::Rtd {
            element: crate::rtd::RtdKind::Pt100,
            wiring: crate::rtd::Wiring::ThreeWire,
            lead_ohms: 0.0,
        });
        let v = view(&tag, Stage::AsFound, &[], date());
        assert!(v.rows[0].apply.starts_with("92.16"), "{}", v.rows[0].apply);
        assert!(v.rows[0].apply.ends_with(" Ω"));
        assert!(v.rows[2].apply.starts_with("111.67"), "{}", v.rows[2].apply);
    }
}
