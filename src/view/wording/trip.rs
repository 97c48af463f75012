//! The words of a trip or alarm test, written once: the caution shown at the step, the
//! one-line verdict, the log entry's text and title, and the report's Markdown section.
//! The numbers come from [`crate::calibration::trip`] and are rounded by
//! [`crate::display`].

use crate::calibration::trip::{TripDirection, TripResult};
use crate::display;

/// The cautions shown before a trip test, at the step that moves the input through the
/// setpoint (before the general [`crate::caution::CAUTIONS`]).
pub const CAUTIONS: [&str; 2] = [
    "A trip test on a live loop can trip the plant or a safety function: bypass the trip or obtain the permit under the site's procedure, and tell operations before you ramp the input.",
    "Afterwards remove the bypass or force, check the trip is back in service and tell operations; loopside supports, and never replaces, the site's procedures.",
];

/// `PASS` or `FAIL`.
fn mark(pass: bool) -> &'static str {
    if pass {
        "PASS"
    } else {
        "FAIL"
    }
}

/// A value in the test's unit, rounded for its span.
fn value(r: &TripResult, v: f64) -> String {
    display::value(v, &r.unit, r.span)
}

/// The direction in words: `rising` / `falling`.
pub fn direction(d: TripDirection) -> &'static str {
    match d {
        TripDirection::Rising => "trips on rising",
        TripDirection::Falling => "trips on falling",
    }
}

/// How to ramp the injected current towards the setpoint.
pub fn ramp(r: &TripResult) -> String {
    let current_up = match r.direction {
        TripDirection::Rising => r.current_rises_with_value,
        TripDirection::Falling => !r.current_rises_with_value,
    };
    format!(
        "inject {} for the setpoint; ramp the current {} slowly to trip",
        display::ma(r.setpoint_ma),
        if current_up { "up" } else { "down" }
    )
}

/// The one-line verdict: `PASS: trip error +0.40 % of span (run 2); deadband 1.20 %;
/// repeatability 0.20 % (max − min of trips); tolerance ±0.50 %`.
pub fn summary(r: &TripResult) -> String {
    let mut s = format!(
        "{}: trip error {} % of span",
        mark(r.pass),
        display::signed_percent_number(r.trip_error_pct)
    );
    if r.runs.len() > 1 {
        s.push_str(&format!(" (worst, run {})", r.worst_run + 1));
    }
    s.push_str(&format!(
        "; deadband {} of span",
        display::percent(r.deadband_pct)
    ));
    match r.repeatability_pct {
        Some(p) => s.push_str(&format!(
            "; repeatability {} (max − min of {} trips)",
            display::percent(p),
            r.runs.len()
        )),
        None => s.push_str("; repeatability not measured (one run)"),
    }
    s.push_str(&format!(
        "; tolerance ±{}",
        display::percent(r.tolerance_pct)
    ));
    s
}

/// The title of a trip-test entry in the log, from its stored verdict (`None`: it does not
/// say).
pub fn log_title(pass: Option<bool>) -> &'static str {
    match pass {
        Some(true) => "Trip test passed",
        Some(false) => "Trip test failed",
        None => "Trip test",
    }
}

/// The text of the log entry: the setpoint and direction, the verdict, the note.
pub fn log_text(r: &TripResult) -> String {
    let head = format!(
        "Trip test at {}, {}: {}",
        value(r, r.setpoint),
        direction(r.direction),
        summary(r)
    );
    let note = r.note.trim();
    if note.is_empty() {
        head
    } else {
        format!("{head}\n{note}")
    }
}

/// Text safe inside a Markdown table cell.
fn cell(text: &str) -> String {
    text.replace('|', "\\|").replace(['\n', '\r'], " ")
}

/// The lines the command line prints and the screen lists: setpoint, current to inject,
/// one line per run, and the verdict.
pub fn lines(r: &TripResult) -> Vec<String> {
    let mut out = vec![
        format!(
            "Setpoint {} ({}), tolerance ±{} of span (span {})",
            value(r, r.setpoint),
            direction(r.direction),
            display::percent(r.tolerance_pct),
            value(r, r.span)
        ),
        format!("Current: {}", ramp(r)),
    ];
    for (i, run) in r.runs.iter().enumerate() {
        out.push(format!(
            "Run {}: trip {} ({}), reset {} ({}): error {} % of span, deadband {}: {}",
            i + 1,
            value(r, run.trip_at),
            display::ma(run.trip_ma),
            value(r, run.reset_at),
            display::ma(run.reset_ma),
            display::signed_percent_number(run.trip_error_pct),
            display::percent(run.deadband_pct),
            if run.pass { "pass" } else { "FAIL" }
        ));
    }
    out.push(summary(r));
    out
}

/// The trip test as a Markdown section for a report.
pub fn markdown(r: &TripResult) -> String {
    let tag = if r.tag.is_empty() {
        "Loop".to_string()
    } else {
        cell(&r.tag)
    };
    let mut md = format!(
        "### {tag} — trip test ({})\n\nSetpoint {}, {} · tolerance ±{} of span · {}\n\n",
        r.date,
        cell(&value(r, r.setpoint)),
        direction(r.direction),
        display::percent(r.tolerance_pct),
        ramp(r)
    );
    md.push_str(
        "| run | trip | reset | trip error (% of span) | deadband (% of span) | result |\n",
    );
    md.push_str("|---|---|---|---|---|---|\n");
    for (i, run) in r.runs.iter().enumerate() {
        md.push_str(&format!(
            "| {} | {} | {} | {} % | {} | {} |\n",
            i + 1,
            cell(&value(r, run.trip_at)),
            cell(&value(r, run.reset_at)),
            display::signed_percent_number(run.trip_error_pct),
            display::percent(run.deadband_pct),
            if run.pass { "pass" } else { "**FAIL**" }
        ));
    }
    md.push_str(&format!("\n**{}**\n", cell(&summary(r))));
    if !r.note.trim().is_empty() {
        md.push_str(&format!("\n{}\n", r.note.trim()));
    }
    md
}
