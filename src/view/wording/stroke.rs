//! The words of a valve's stroke check, written once: its log title and text, and the
//! lines the command line prints. Numbers come from [`crate::stroke`] and are rounded by
//! [`crate::display`].

use crate::display;
use crate::stroke::{FailPosition, StrokePoint, StrokeRecord, ValveAction};
use crate::valve::Valve;

/// The log's title for a stroke check.
pub fn log_title(pass: Option<bool>) -> &'static str {
    match pass {
        Some(true) => "Stroke check passed",
        Some(false) => "Stroke check FAILED",
        None => "Stroke check",
    }
}

/// How the valve moves with its signal, in words.
pub fn action(a: ValveAction) -> &'static str {
    match a {
        ValveAction::AirToOpen => "air to open",
        ValveAction::AirToClose => "air to close",
    }
}

/// Where the valve fails, in words.
pub fn fail(f: FailPosition) -> &'static str {
    match f {
        FailPosition::Closed => "fails closed",
        FailPosition::Open => "fails open",
        FailPosition::Last => "fails in its last position",
    }
}

/// The verdict in one line: `PASS: largest error +1.2 % of stroke at 50 % demand, within
/// ±2.0 %`.
pub fn verdict(r: &StrokeRecord) -> String {
    let res = &r.result;
    let at = res
        .points
        .get(res.max_error_index)
        .map(|p| display::stroke_percent(p.demand_pct))
        .unwrap_or_default();
    format!(
        "{}: largest error {} of stroke at {} demand, tolerance ±{}",
        if res.pass { "PASS" } else { "FAIL" },
        display::stroke_error(res.max_error_pct),
        at,
        display::stroke_percent(res.tolerance_pct)
    )
}

/// What the record says about the valve: its part of a split range, action, fail
/// position and where the position was read.
pub fn valve_line(r: &StrokeRecord) -> String {
    let mut parts = Vec::new();
    if let Some((lo, hi)) = r.result.split_ma {
        parts.push(format!(
            "split range: this valve over {}–{}",
            display::setting_number(lo),
            display::ma_setting(hi)
        ));
    }
    parts.push(match r.result.action {
        Some(a) => action(a).to_string(),
        None => "action not recorded (taken as opening with the signal)".to_string(),
    });
    parts.push(match r.result.fail {
        Some(f) => fail(f).to_string(),
        None => "fail position not recorded".to_string(),
    });
    if let Some(at) = r.read_at {
        parts.push(match at {
            crate::stroke::ReadAt::Valve => "position read at the valve".to_string(),
            crate::stroke::ReadAt::Feedback => "position read from its feedback".to_string(),
        });
    }
    parts.join("; ")
}

/// What a tag records of its valve, in one line: `air to open, fails closed` or with its
/// part of a split range.
pub fn valve_words(v: &Valve) -> String {
    let mut parts = Vec::new();
    if let Some(a) = v.action {
        parts.push(action(a).to_string());
    }
    if let Some(f) = v.fail {
        parts.push(fail(f).to_string());
    }
    if let Some((lo, hi)) = v.split_ma {
        parts.push(format!(
            "split range {}–{}",
            display::setting_number(lo),
            display::ma_setting(hi)
        ));
    }
    if parts.is_empty() {
        "recorded, nothing known of it yet".to_string()
    } else {
        parts.join(", ")
    }
}

/// One point as a table row: demand, signal, expected, read, error, verdict.
pub fn point_line(p: &StrokePoint) -> String {
    format!(
        "{:>7} {:>10} {:>9} {:>9} {:>8}  {}",
        display::stroke_percent(p.demand_pct),
        display::ma(p.signal_ma),
        display::stroke_percent(p.expected_pct),
        display::stroke_percent(p.position_pct),
        display::stroke_error(p.error_pct),
        if p.pass { "ok" } else { "FAIL" }
    )
}

/// The lines the command line prints: header, one row per point, the valve and the
/// verdict.
pub fn lines(r: &StrokeRecord) -> Vec<String> {
    let mut out = vec![format!(
        "{:>7} {:>10} {:>9} {:>9} {:>8}",
        "demand", "signal", "expected", "read", "error"
    )];
    out.extend(r.result.points.iter().map(point_line));
    out.push(valve_line(r));
    out.push(verdict(r));
    out
}

/// The log entry's text: the stage, the verdict, the valve line, the note and the
/// before-you-leave summary.
pub fn log_text(r: &StrokeRecord) -> String {
    let valve = valve_line(r);
    let mut chars = valve.chars();
    let valve: String = match chars.next() {
        Some(first) => first.to_uppercase().chain(chars).collect(),
        None => valve,
    };
    let mut text = format!("Stroke check {}: {}. {valve}.", r.stage.label(), verdict(r),);
    if !r.note.trim().is_empty() {
        text.push(' ');
        text.push_str(r.note.trim());
    }
    if let Some(l) = &r.before_leaving {
        text.push(' ');
        text.push_str(&l.summary());
    }
    text
}
