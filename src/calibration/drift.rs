//! Drift across visits: the as-found error at each check point over a tag's history, its
//! rate by least squares, when the trend reaches the tolerance, and an interval suggested
//! from a stated policy.
//!
//! - Each as-found check counts at its own date ([`RecordedCheck::date`]), in years of
//!   365.25 days (the Julian year) from the first.
//! - Points are matched across checks by their input (% of span) and direction, so the
//!   rising 50 % point is its own series. For each series with checks on at least two
//!   dates, the least-squares line `error = a + b·t` gives the rate `b` in % of span per
//!   year (ordinary least squares: b = Σ(t − t̄)(e − ē) / Σ(t − t̄)²).
//! - The rate reported is the series with the largest |rate|; *reaches tolerance on* is
//!   the earliest date on which any series' line reaches ± the tag's tolerance (in the
//!   direction it moves; it may lie in the past when the trend is already beyond it).
//! - The fit reads the as-found errors as one trend. That holds when the device was not
//!   adjusted between visits; when it was trimmed back each time, the as-found errors show
//!   the drift of each interval instead, and the trend understates it — the planner
//!   should read the plot as well as the number.
//!
//! # Suggested interval (the policy is stated, and the plant sets it)
//!
//! The drift over an interval of I years is |rate|·I. Not to exceed a fraction `f` of the
//! tolerance before the next visit gives I = f·tolerance / |rate|. One step may lengthen
//! or shorten the tag's current interval by at most a factor `s` (from I₀/s to I₀·s);
//! without a current interval the suggestion is held within 1 day to ten years. With no
//! drift at all the interval is lengthened by the full step. Defaults: f = 0.5 and s = 2
//! (ours, not from a standard: a plant sets its own).

use super::history::RecordedCheck;
use crate::error::{within, FieldError, Result};
use crate::journal::Entry;
use crate::tag::{MAX_INTERVAL_DAYS, MIN_INTERVAL_DAYS};
use chrono::NaiveDate;
use serde::Serialize;

/// Days in the year the rates are per (the Julian year).
pub const DAYS_PER_YEAR: f64 = 365.25;
/// Default fraction of the tolerance not to exceed before the next visit (ours).
pub const DEFAULT_FRACTION: f64 = 0.5;
/// Default largest factor one step may lengthen or shorten an interval by (ours).
pub const DEFAULT_STEP: f64 = 2.0;
/// Two inputs closer than this (% of span) are the same point.
const SAME_POINT_PERCENT: f64 = 1e-6;
/// A trend reaching the tolerance further away than this is not given a date, years.
const HORIZON_YEARS: f64 = 100.0;

/// The plant's policy for suggesting an interval.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Policy {
    /// Fraction of the tolerance the drift may use up before the next visit (0–1].
    pub fraction_of_tolerance: f64,
    /// Largest factor one step may lengthen or shorten the interval by (≥ 1).
    pub max_step: f64,
}

impl Default for Policy {
    fn default() -> Policy {
        Policy {
            fraction_of_tolerance: DEFAULT_FRACTION,
            max_step: DEFAULT_STEP,
        }
    }
}

impl Policy {
    /// Check the policy; the error names the field.
    pub fn validate(&self) -> Result<()> {
        within("fraction", self.fraction_of_tolerance, 0.0, 1.0)?;
        if self.fraction_of_tolerance == 0.0 {
            return Err(FieldError::new("fraction", "must be greater than 0"));
        }
        within("max-step", self.max_step, 1.0, 10.0)?;
        Ok(())
    }
}

/// One check point's errors over the visits and their trend.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct PointTrend {
    /// Input, % of span.
    pub percent: f64,
    /// `rising` or `falling`.
    pub direction: String,
    /// (check date, as-found error % of span), oldest first.
    pub errors: Vec<(NaiveDate, f64)>,
    /// Least-squares rate, % of span per year; `None` with fewer than two dates.
    pub rate_pct_per_year: Option<f64>,
    /// The line's error at the first check's date, % of span.
    pub intercept_pct: Option<f64>,
    /// When the line reaches ± the tolerance.
    pub reaches_tolerance_on: Option<NaiveDate>,
}

/// Why there is no rate.
#[derive(Debug, Clone, PartialEq, Serialize)]
#[serde(tag = "code", rename_all = "kebab-case")]
pub enum NoRate {
    /// No as-found check on record.
    NoChecks,
    /// As-found checks on one date only.
    OneDate {
        /// That date.
        date: NaiveDate,
        /// How many checks on it.
        checks: usize,
    },
}

/// One as-found check in the history.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Visit {
    /// The check's date.
    pub date: NaiveDate,
    /// Its largest |error|, % of span.
    pub max_error_pct: f64,
    /// Whether it was within tolerance (an as-found FAIL is flagged for the planner).
    pub pass: bool,
}

/// A tag's drift.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Drift {
    /// The tolerance the trend is held against, ± % of span (the tag's).
    pub tolerance_pct: f64,
    /// The as-found checks, oldest first.
    pub visits: Vec<Visit>,
    /// Each point's series.
    pub points: Vec<PointTrend>,
    /// The largest |rate| of the series (signed), % of span per year.
    pub rate_pct_per_year: Option<f64>,
    /// Which series that is.
    pub rate_point: Option<usize>,
    /// The earliest date a series' line reaches ± the tolerance.
    pub reaches_tolerance_on: Option<NaiveDate>,
    /// The policy used.
    pub policy: Policy,
    /// The tag's interval the step is taken from, days.
    pub current_interval_days: Option<u32>,
    /// f·tolerance / |rate|, days, before the step limits (`None` with no drift or no
    /// rate).
    pub ideal_interval_days: Option<f64>,
    /// The interval suggested, days.
    pub suggested_interval_days: Option<u32>,
    /// Why there is no rate, when there is none.
    pub no_rate: Option<NoRate>,
}

/// Least squares of `(t, e)`: (intercept, slope), or `None` when all t are equal.
fn least_squares(samples: &[(f64, f64)]) -> Option<(f64, f64)> {
    let n = samples.len() as f64;
    let t_mean = samples.iter().map(|s| s.0).sum::<f64>() / n;
    let e_mean = samples.iter().map(|s| s.1).sum::<f64>() / n;
    let sxx: f64 = samples.iter().map(|s| (s.0 - t_mean).powi(2)).sum();
    if sxx <= 0.0 {
        return None;
    }
    let sxy: f64 = samples
        .iter()
        .map(|s| (s.0 - t_mean) * (s.1 - e_mean))
        .sum();
    let slope = sxy / sxx;
    Some((e_mean - slope * t_mean, slope))
}

/// The date `years` after `from`, or `None` beyond the horizon.
fn date_after(from: NaiveDate, years: f64) -> Option<NaiveDate> {
    if !years.is_finite() || years.abs() > HORIZON_YEARS {
        return None;
    }
    let days = (years * DAYS_PER_YEAR).round() as i64;
    from.checked_add_signed(chrono::Duration::days(days))
}

/// The drift of a tag from its log `entries` (any kinds; loop checks are picked out),
/// held against `tolerance_pct`, with the tag's `current_interval_days` and `policy`.
pub fn drift<'a>(
    entries: impl IntoIterator<Item = &'a Entry>,
    tolerance_pct: f64,
    current_interval_days: Option<u32>,
    policy: Policy,
) -> Result<Drift> {
    policy.validate()?;
    within("tolerance", tolerance_pct, 0.0, 100.0)?;
    let mut checks: Vec<RecordedCheck> = entries
        .into_iter()
        .filter_map(RecordedCheck::of)
        .filter(RecordedCheck::is_as_found)
        .collect();
    checks.sort_by_key(|c| c.date);
    let visits = checks
        .iter()
        .map(|c| Visit {
            date: c.date,
            max_error_pct: c
                .points
                .iter()
                .map(|p| p.error_pct.abs())
                .fold(0.0, f64::max),
            pass: c.pass,
        })
        .collect();
    let mut points: Vec<PointTrend> = Vec::new();
    for c in &checks {
        for p in &c.points {
            let series = points.iter_mut().find(|s| {
                (s.percent - p.percent).abs() <= SAME_POINT_PERCENT && s.direction == p.direction
            });
            match series {
                Some(s) => s.errors.push((c.date, p.error_pct)),
                None => points.push(PointTrend {
                    percent: p.percent,
                    direction: p.direction.clone(),
                    errors: vec![(c.date, p.error_pct)],
                    rate_pct_per_year: None,
                    intercept_pct: None,
                    reaches_tolerance_on: None,
                }),
            }
        }
    }
    let first = checks.first().map(|c| c.date);
    if let Some(first) = first {
        for s in &mut points {
            let samples: Vec<(f64, f64)> = s
                .errors
                .iter()
                .map(|(d, e)| ((*d - first).num_days() as f64 / DAYS_PER_YEAR, *e))
                .collect();
            if let Some((a, b)) = least_squares(&samples) {
                s.rate_pct_per_year = Some(b);
                s.intercept_pct = Some(a);
                if b != 0.0 {
                    let limit = tolerance_pct.copysign(b);
                    s.reaches_tolerance_on = date_after(first, (limit - a) / b);
                }
            }
        }
    }
    let rate_point = points
        .iter()
        .enumerate()
        .filter_map(|(i, s)| s.rate_pct_per_year.map(|r| (i, r)))
        .fold(None::<(usize, f64)>, |best, (i, r)| match best {
            Some((_, b)) if b.abs() >= r.abs() => best,
            _ => Some((i, r)),
        })
        .map(|(i, _)| i);
    let rate = rate_point.and_then(|i| points[i].rate_pct_per_year);
    let reaches_tolerance_on = points.iter().filter_map(|s| s.reaches_tolerance_on).min();
    let no_rate = match (rate, first) {
        (Some(_), _) => None,
        (None, None) => Some(NoRate::NoChecks),
        (None, Some(date)) => Some(NoRate::OneDate {
            date,
            checks: checks.len(),
        }),
    };
    let ideal_interval_days = rate
        .filter(|r| *r != 0.0)
        .map(|r| policy.fraction_of_tolerance * tolerance_pct / r.abs() * DAYS_PER_YEAR);
    let suggested_interval_days = rate.map(|_| {
        let (low, high) = match current_interval_days {
            Some(i0) => (
                f64::from(i0) / policy.max_step,
                f64::from(i0) * policy.max_step,
            ),
            None => (f64::from(MIN_INTERVAL_DAYS), f64::from(MAX_INTERVAL_DAYS)),
        };
        let low = low.max(f64::from(MIN_INTERVAL_DAYS));
        let high = high.min(f64::from(MAX_INTERVAL_DAYS)).max(low);
        let ideal = ideal_interval_days.unwrap_or(f64::INFINITY);
        ideal.clamp(low, high).floor() as u32
    });
    Ok(Drift {
        tolerance_pct,
        visits,
        points,
        rate_pct_per_year: rate,
        rate_point,
        reaches_tolerance_on,
        policy,
        current_interval_days,
        ideal_interval_days,
        suggested_interval_days,
        no_rate,
    })
}
