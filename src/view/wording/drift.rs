//! The words of a tag's drift: the visits (an as-found FAIL flagged first for the
//! planner), each point's trend, the rate, when the trend reaches the tolerance, and how
//! the suggested interval was worked out. The numbers come from
//! [`crate::calibration::drift`] and are rounded by [`crate::display`].

use crate::calibration::drift::{Drift, NoRate, DAYS_PER_YEAR};
use crate::display;

/// A rate: `+0.100 % of span per year`.
pub fn rate(r: f64) -> String {
    format!("{} % of span per year", signed_fine(r))
}

fn signed_fine(v: f64) -> String {
    let s = display::quoted_fixed(v, 3);
    if v > 0.0 && !s.starts_with('+') {
        format!("+{s}")
    } else {
        s
    }
}

/// Why there is no rate, in words.
pub fn no_rate(n: &NoRate) -> String {
    match n {
        NoRate::NoChecks => {
            "No rate: no as-found check of this tag on record gives its date and point errors (check records older than that shape are not read).".to_string()
        }
        NoRate::OneDate { date, checks } => format!(
            "No rate: the as-found results are all from one date ({date}, {checks} check(s)); a trend needs as-found checks on at least two dates."
        ),
    }
}

/// How the suggested interval was worked out.
pub fn interval_reasoning(d: &Drift) -> Option<String> {
    let suggested = d.suggested_interval_days?;
    let f = d.policy.fraction_of_tolerance;
    let mut s = match (d.rate_pct_per_year, d.ideal_interval_days) {
        (Some(r), Some(ideal)) => format!(
            "Policy: drift may use up {} of the ±{} tolerance ({} % of span) before the next visit; at {} that takes {} days ({} × {} / {} × {} days a year)",
            display::trimmed(f),
            display::percent(d.tolerance_pct),
            display::quoted_fixed(f * d.tolerance_pct, 3),
            rate(r),
            display::whole(ideal),
            display::trimmed(f),
            display::trimmed(d.tolerance_pct),
            display::quoted_fixed(r.abs(), 4),
            display::trimmed(DAYS_PER_YEAR)
        ),
        _ => "No drift measured: the interval may be lengthened by the full step".to_string(),
    };
    match d.current_interval_days {
        Some(i0) => s.push_str(&format!(
            "; one step may change the current {i0} days by a factor of up to {} ({} to {} days)",
            display::trimmed(d.policy.max_step),
            display::whole(f64::from(i0) / d.policy.max_step),
            display::whole(f64::from(i0) * d.policy.max_step)
        )),
        None => s.push_str(
            "; the tag has no interval yet, so no step limit applies (1 day to ten years)",
        ),
    }
    s.push_str(&format!(": suggested interval {suggested} days."));
    Some(s)
}

/// The lines `loopside drift` prints.
pub fn lines(tag: &str, d: &Drift) -> Vec<String> {
    let mut out = vec![format!(
        "{tag} — as-found drift against ±{} of span",
        display::percent(d.tolerance_pct)
    )];
    let failed: Vec<String> = d
        .visits
        .iter()
        .filter(|v| !v.pass)
        .map(|v| v.date.to_string())
        .collect();
    if !failed.is_empty() {
        out.push(format!(
            "For the planner: as found OUT OF TOLERANCE on {}.",
            failed.join(", ")
        ));
    }
    for v in &d.visits {
        out.push(format!(
            "{}: largest as-found error {} of span{}",
            v.date,
            display::percent(v.max_error_pct),
            if v.pass { "" } else { " (FAIL)" }
        ));
    }
    for p in &d.points {
        let errors: Vec<String> = p
            .errors
            .iter()
            .map(|(date, e)| format!("{date} {}", display::signed_percent_number(*e)))
            .collect();
        let trend = match p.rate_pct_per_year {
            Some(r) => format!(" → {}", rate(r)),
            None => String::new(),
        };
        out.push(format!(
            "Point {} % {}: {} %{trend}",
            display::test_point(p.percent),
            p.direction,
            errors.join(", ")
        ));
    }
    match (d.rate_pct_per_year, &d.no_rate) {
        (Some(r), _) => {
            out.push(format!("Drift rate (largest of the points): {}", rate(r)));
            out.push(match d.reaches_tolerance_on {
                Some(date) => format!("The trend reaches the tolerance on {date}."),
                None => {
                    "The trend does not reach the tolerance within a hundred years.".to_string()
                }
            });
        }
        (None, Some(n)) => out.push(no_rate(n)),
        (None, None) => {}
    }
    out.extend(interval_reasoning(d));
    out
}
