//! The words of a loop check, written once: the one-line verdict, the log entry's text,
//! the handoff report's Markdown section and the warnings. The command line, the Check
//! screen, the saved log entry and the report all use these, so they say the same thing.
//! The numbers come from [`crate::check`] and are rounded by [`crate::display`].

use crate::check::{Accuracy, CheckResult, CheckWarning, Device};
use crate::display;
use crate::leave;
use crate::scale::{RootLocation, Transfer};

/// A check warning in plain words.
pub fn warning(w: &CheckWarning) -> String {
    match w {
        CheckWarning::ReferencePastDue {
            id,
            due,
            check_date,
            days_over,
        } => format!(
            "reference {id} was due for calibration on {due}; on {check_date} it was {days_over} day(s) past due, so this check rests on an uncalibrated instrument"
        ),
        CheckWarning::LowTur { tur, minimum } => format!(
            "test uncertainty ratio {}:1 is below {}:1 (common practice): the reference is not accurate enough to judge this tolerance with confidence",
            display::ratio(*tur),
            display::whole(*minimum)
        ),
    }
}

/// Text safe inside a Markdown table cell.
fn cell(text: &str) -> String {
    text.replace('|', "\\|").replace(['\n', '\r'], " ")
}

/// Input value written for people, in the input unit.
fn input_text(r: &CheckResult, value: f64) -> String {
    match r.device {
        Device::Receiver => display::ma(value),
        Device::Transmitter => {
            let span = match &r.input_range {
                Some(range) => range.urv - range.lrv,
                None => r.scale.span(),
            };
            display::value(value, &r.input_unit, span)
        }
    }
}

/// Output value written for people, in the output unit.
fn output_text(r: &CheckResult, value: f64) -> String {
    match r.device {
        Device::Transmitter => display::ma(value),
        Device::Receiver => display::value(value, &r.output_unit, r.output_span),
    }
}

fn output_error_text(r: &CheckResult, error: f64) -> String {
    match r.device {
        Device::Transmitter => display::signed_ma(error),
        Device::Receiver => display::signed_value(error, &r.output_unit, r.output_span),
    }
}

/// The one-line verdict: `PASS` or `FAIL` with the largest error and hysteresis.
pub fn summary(r: &CheckResult) -> String {
    let worst = r.points.get(r.max_error_index);
    let mut s = format!(
        "{}: max error {} of span",
        if r.pass { "PASS" } else { "FAIL" },
        display::percent(r.max_error_pct)
    );
    if let Some(p) = worst {
        s.push_str(&format!(
            " (point {}, {} {})",
            r.max_error_index + 1,
            display::test_point(p.percent),
            "%"
        ));
    }
    match (r.hysteresis_pct, r.hysteresis_at_percent) {
        (Some(h), Some(at)) => s.push_str(&format!(
            "; hysteresis {} of span (at {} %)",
            display::percent(h),
            display::test_point(at)
        )),
        _ => s.push_str("; hysteresis not measured (no input met from both directions)"),
    }
    s.push_str(&format!(
        "; tolerance ±{}",
        display::percent(r.tolerance_pct)
    ));
    s
}

/// The text of the log entry: the kind of check, its verdict, the technician's own words
/// (the check's note) when there are any, and, when recorded, what was and was not put
/// right before leaving (the same words from the app and the
/// command line).
pub fn log_text(r: &CheckResult) -> String {
    let head = format!(
        "{} check, {}: {}",
        r.device.as_str(),
        r.stage.label(),
        summary(r)
    );
    // The technician's own words (the check's note) follow the verdict on both fronts.
    let head = match &r.uncertainty {
        Some(a) => format!("{head}\n{}", super::uncertainty::summary(a)),
        None => head,
    };
    let note = r.note.trim();
    let head = if note.is_empty() {
        head
    } else {
        format!("{head}\n{note}")
    };
    match &r.before_leaving {
        Some(l) => format!("{head}\n{}", l.summary()),
        None => head,
    }
}

/// The check as a Markdown section for the handoff report.
pub fn markdown(r: &CheckResult) -> String {
    let mut md = String::new();
    let tag = if r.tag.is_empty() {
        "Loop".to_string()
    } else {
        cell(&r.tag)
    };
    md.push_str(&format!(
        "### {tag} — {} check, {} ({})\n\n",
        r.device.as_str(),
        r.stage.label(),
        r.date
    ));
    md.push_str(&format!(
        "Range {} to {} {}",
        display::value_number(r.scale.lrv, r.scale.span()),
        display::value_number(r.scale.urv, r.scale.span()),
        cell(&r.scale.unit)
    ));
    match &r.scale.transfer {
        Transfer::Linear => {}
        Transfer::SquareRoot { root_in, .. } => md.push_str(&format!(
            ", square root in the {}",
            match root_in {
                RootLocation::Transmitter => "transmitter",
                RootLocation::Receiver => "receiver",
            }
        )),
        Transfer::Table(t) => {
            md.push_str(&format!(", table to {}", cell(t.output_unit())));
        }
    }
    md.push_str(&format!(
        " · tolerance ±{} of span\n\n",
        display::percent(r.tolerance_pct)
    ));
    md.push_str(
        "| # | direction | applied | expected | measured | error | error (% of span) | result |\n",
    );
    md.push_str("|---|---|---|---|---|---|---|---|\n");
    for (i, p) in r.points.iter().enumerate() {
        md.push_str(&format!(
            "| {} | {} | {} | {} | {} | {} | {} % | {} |\n",
            i + 1,
            p.direction.as_str(),
            cell(&input_text(r, p.applied)),
            cell(&output_text(r, p.expected)),
            cell(&output_text(r, p.measured)),
            cell(&output_error_text(r, p.error)),
            display::signed_percent_number(p.error_pct),
            if p.pass { "pass" } else { "**FAIL**" }
        ));
    }
    md.push('\n');
    md.push_str(&format!("**{}**\n\n", cell(&summary(r))));
    md.push_str(if r.adjusted {
        "Adjustment made during this visit.\n"
    } else {
        "No adjustment made.\n"
    });
    match &r.reference {
        Some(reference) => {
            let accuracy = match reference.accuracy {
                Accuracy::PercentOfSpan(v) => format!("±{} of span", display::percent_fine(v)),
                Accuracy::Ma(v) => format!("±{}", display::ma_fine(v)),
                Accuracy::Units(v) => {
                    format!("±{} {}", display::trimmed(v), cell(&r.input_unit))
                }
            };
            md.push_str(&format!(
                "Reference {} ({accuracy}, calibration due {})",
                cell(&reference.id),
                reference.calibration_due
            ));
            if let Some(tur) = r.tur {
                md.push_str(&format!(", TUR {}:1", display::ratio(tur)));
            }
            md.push_str(".\n");
        }
        None if r.uncertainty.is_some() => {}
        None => md.push_str("Reference instrument not recorded.\n"),
    }
    if !r.note.is_empty() {
        md.push_str(&format!("Note: {}\n", cell(&r.note)));
    }
    md.push_str(&format!(
        "{}\n",
        cell(&leave::summary_of(r.before_leaving.as_ref()))
    ));
    for w in &r.warnings {
        md.push_str(&format!("\n> Warning: {}\n", cell(&warning(w))));
    }
    if let Some(a) = &r.uncertainty {
        md.push('\n');
        md.push_str(&super::uncertainty::markdown(r, a));
    }
    md
}
