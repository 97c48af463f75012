//! The words of reference instruments and of a check judged with them, written once: a
//! reference's one-line description, each point's share and decision, the warnings, the
//! decision rule named with its source (ILAC-G8:09/2019 §4.2), and the report section.
//! The numbers come from [`crate::check::uncertainty`] and are rounded by
//! [`crate::display`].

use crate::calibration::reference::{FullScaleBasis, Reference};
use crate::check::uncertainty::{Assessment, Decision, DecisionRule, UncertaintyWarning};
use crate::check::CheckResult;
use crate::display;

/// The accuracy as the data sheet states it: `±(0.025 % of reading + 0.01 % of full
/// scale + 0.001 mA)`, leaving out the parts that are zero.
pub fn accuracy(r: &Reference) -> String {
    let a = &r.accuracy;
    let mut parts = Vec::new();
    if a.percent_of_reading > 0.0 {
        parts.push(format!(
            "{} % of reading",
            display::trimmed(a.percent_of_reading)
        ));
    }
    if a.percent_of_full_scale > 0.0 {
        parts.push(format!(
            "{} % of {}",
            display::trimmed(a.percent_of_full_scale),
            match a.basis {
                FullScaleBasis::FullScale => "full scale",
                FullScaleBasis::Range => "range",
            }
        ));
    }
    if a.fixed > 0.0 {
        parts.push(format!("{} {}", display::trimmed(a.fixed), r.unit));
    }
    format!("±({})", parts.join(" + "))
}

/// What a reference measures, from its unit: `pressure`, `current`; the unit itself when
/// loopside does not know it.
pub fn measures(r: &Reference) -> String {
    crate::units::lookup(&r.unit)
        .map(|u| u.quantity.name().to_string())
        .unwrap_or_else(|| r.unit.clone())
}

/// One line for a list: `PM-07 — pressure module: pressure 0 – 10 bar, ±(…), due
/// 2027-03-31`.
pub fn line(r: &Reference) -> String {
    let what = if r.description.is_empty() {
        String::new()
    } else {
        format!(" — {}", r.description)
    };
    format!(
        "{}{what}: {} {} – {} {}, {}, calibration due {}",
        r.id,
        measures(r),
        display::trimmed(r.range_low),
        display::trimmed(r.range_high),
        r.unit,
        accuracy(r),
        r.calibration_due
    )
}

/// The lines of `ref show`: the line, then what it is worth at a few readings.
pub fn detail(r: &Reference) -> Vec<String> {
    let mut out = vec![line(r)];
    let full_scale = r.full_scale();
    out.push(format!(
        "Full scale taken as {} {} ({}).",
        display::trimmed(full_scale),
        r.unit,
        match r.accuracy.basis {
            FullScaleBasis::FullScale => "the top of the range",
            FullScaleBasis::Range => "the whole range",
        }
    ));
    for fraction in [0.0, 0.5, 1.0] {
        let reading = r.range_low + fraction * (r.range_high - r.range_low);
        out.push(format!(
            "At {} {}: ±{} {}",
            display::trimmed(reading),
            r.unit,
            display::significant(r.accuracy_at(reading), 3),
            r.unit
        ));
    }
    out
}

/// A decision in words.
pub fn decision(d: Decision) -> &'static str {
    match d {
        Decision::Pass => "pass",
        Decision::PassWithinUncertainty => "pass, within the uncertainty",
        Decision::FailWithinUncertainty => "FAIL, within the uncertainty",
        Decision::Fail => "FAIL",
    }
}

/// The decision rule named with its source.
pub fn rule(rule: DecisionRule) -> &'static str {
    match rule {
        DecisionRule::Simple => {
            "simple acceptance (ILAC-G8:09/2019 §4.2.1): a point passes when |error| ≤ tolerance"
        }
        DecisionRule::Guarded => {
            "guarded acceptance (ILAC-G8:09/2019 §4.2.3, guard band w = the combined reference accuracy U): pass within tolerance − U; between that and the tolerance, pass within the uncertainty; beyond the tolerance by up to U, FAIL within the uncertainty"
        }
    }
}

/// A warning in plain words.
pub fn warning(w: &UncertaintyWarning) -> String {
    match w {
        UncertaintyWarning::ReferencePastDue { id, due, days_over } => format!(
            "reference {id} was due for calibration on {due}, {days_over} day(s) before this check: the check rests on an instrument out of calibration"
        ),
        UncertaintyWarning::LowTur {
            tur,
            point,
            minimum,
        } => format!(
            "test uncertainty ratio {}:1 at point {point} is below {}:1 (common practice): the references are not accurate enough to judge this tolerance with confidence",
            display::ratio(*tur),
            display::whole(*minimum)
        ),
        UncertaintyWarning::OutsideRange {
            id,
            point,
            reading,
            unit,
        } => format!(
            "at point {point} reference {id} read {} {unit}, outside its range: its accuracy there is not stated",
            display::significant(*reading, 6)
        ),
    }
}

/// A TUR as written: `16.0:1`, or `unlimited` for a zero combined accuracy.
fn tur(t: Option<f64>) -> String {
    match t {
        Some(t) => format!("{}:1", display::ratio(t)),
        None => "unlimited".to_string(),
    }
}

/// The one-line summary: `References PM-07, MM-02; smallest TUR 9.8:1 (point 5);
/// guarded acceptance: pass, within the uncertainty`.
pub fn summary(a: &Assessment) -> String {
    let ids: Vec<&str> = a.references.iter().map(|r| r.id.as_str()).collect();
    format!(
        "References {}; smallest TUR {}{}; {} acceptance: {}",
        ids.join(", "),
        tur(a.min_tur),
        if a.min_tur.is_some() {
            format!(" (point {})", a.min_tur_index + 1)
        } else {
            String::new()
        },
        a.rule.as_str(),
        decision(a.decision)
    )
}

/// One line per point: error, each reference's share, combined, TUR, acceptance limit,
/// decision.
pub fn point_lines(r: &CheckResult, a: &Assessment) -> Vec<String> {
    r.points
        .iter()
        .zip(&a.points)
        .enumerate()
        .map(|(i, (p, u))| {
            let shares: Vec<String> = a
                .references
                .iter()
                .zip(&u.reference_pct)
                .map(|(rf, pct)| format!("{} {}", rf.id, display::percent_fine(*pct)))
                .collect();
            format!(
                "Point {} ({} % {}): error {} %, references ±{} ({}), TUR {}, acceptance ±{}: {}",
                i + 1,
                display::test_point(p.percent),
                p.direction.as_str(),
                display::signed_percent_number(p.error_pct),
                display::percent_fine(u.combined_pct),
                shares.join(", "),
                tur(u.tur),
                display::percent_fine(u.acceptance_limit_pct.max(0.0)),
                decision(u.decision)
            )
        })
        .collect()
}

/// The section of a check's report about its references.
pub fn markdown(r: &CheckResult, a: &Assessment) -> String {
    let mut md = format!("Decision rule: {}.\n\n", rule(a.rule));
    for rf in &a.references {
        md.push_str(&format!("- Reference {}\n", line(rf)));
    }
    md.push_str("\n| # | error (% of span) | references (% of span) | TUR | acceptance (± % of span) | decision |\n");
    md.push_str("|---|---|---|---|---|---|\n");
    for (i, (p, u)) in r.points.iter().zip(&a.points).enumerate() {
        md.push_str(&format!(
            "| {} | {} % | ±{} | {} | {} | {} |\n",
            i + 1,
            display::signed_percent_number(p.error_pct),
            display::percent_fine(u.combined_pct),
            tur(u.tur),
            display::percent_fine(u.acceptance_limit_pct.max(0.0)),
            decision(u.decision)
        ));
    }
    md.push_str(&format!("\n**{}**\n", summary(a)));
    for w in &a.warnings {
        md.push_str(&format!("\n> Warning: {}\n", warning(w)));
    }
    md
}
