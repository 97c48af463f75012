//! The reference instrument of a loop check, read and judged the same way on both fronts.
//!
//! The command line's `check --reference-id/--reference-accuracy/--reference-due` and the
//! Check screen's three fields both go through [`parse`], so an accuracy of `0,02 %`,
//! `0.004 mA` or `0.5 mbar` means the same thing on either, with the same field names in
//! the messages. [`view`] says, before any reading is taken, what the check will say
//! about the reference: its test uncertainty ratio and the warnings the saved record
//! carries, in the words of [`crate::view::wording::check::warning`] (the ones the command
//! line prints).

use crate::check::{Accuracy, CheckWarning, LoopCheck, ReferenceInstrument, MIN_TUR};
use crate::display;
use crate::error::{FieldError, Result};
use crate::number::parse_quantity;
use crate::view::Tone;
use chrono::NaiveDate;

/// Field name of the reference's id in messages.
pub const ID_FIELD: &str = "reference-id";
/// Field name of the reference's accuracy in messages.
pub const ACCURACY_FIELD: &str = "reference-accuracy";
/// Field name of the reference's calibration due date in messages.
pub const DUE_FIELD: &str = "reference-due";

/// The three reference fields as typed.
#[derive(Debug, Clone, Copy, Default, PartialEq, Eq)]
pub struct ReferenceText<'a> {
    /// Asset number or serial.
    pub id: &'a str,
    /// Accuracy: a plain number or `%` is ± % of span; `mA`; or a unit of the range's
    /// quantity.
    pub accuracy: &'a str,
    /// Calibration due date, `YYYY-MM-DD`.
    pub due: &'a str,
}

impl ReferenceText<'_> {
    /// Nothing typed in any of the three.
    pub fn is_empty(&self) -> bool {
        self.id.trim().is_empty() && self.accuracy.trim().is_empty() && self.due.trim().is_empty()
    }
}

/// A date as the check asks for it, `YYYY-MM-DD`; the error names `field`.
pub fn parse_date(field: &str, text: &str) -> Result<NaiveDate> {
    NaiveDate::parse_from_str(text.trim(), "%Y-%m-%d").map_err(|_| {
        FieldError::new(
            field,
            format!("'{}' is not a date; write it as YYYY-MM-DD", text.trim()),
        )
    })
}

/// Read a reference accuracy: a plain number or `%` is % of span; mA is mA; another unit
/// of the range's quantity is converted into `range_unit` (the tag's unit, or the input
/// unit of a square-root loop).
pub fn parse_accuracy(text: &str, range_unit: &str) -> Result<Accuracy> {
    let field = ACCURACY_FIELD;
    let (value, unit) = parse_quantity(field, text)?;
    let value = value.abs();
    Ok(match unit {
        None => Accuracy::PercentOfSpan(value),
        Some(u) if u.symbol == "%" => Accuracy::PercentOfSpan(value),
        Some(u) if u.symbol == "mA" => Accuracy::Ma(value),
        Some(u) if u.symbol == "A" => Accuracy::Ma(value * 1000.0),
        Some(u) => {
            let to = crate::units::lookup(range_unit).ok_or_else(|| {
                FieldError::new(
                    field,
                    format!(
                        "give it in % of span or mA; the range unit '{range_unit}' cannot be converted"
                    ),
                )
            })?;
            // An accuracy is a difference: only the factor applies (no atmosphere, no offset).
            let v = crate::units::convert_difference(value, u, to).map_err(|e| e.renamed(field))?;
            Accuracy::Units(v.abs())
        }
    })
}

/// The reference instrument from its three fields: `None` when all three are empty; an
/// error naming the first missing or unreadable field otherwise.
pub fn parse(text: ReferenceText<'_>, range_unit: &str) -> Result<Option<ReferenceInstrument>> {
    if text.is_empty() {
        return Ok(None);
    }
    let id = text.id.trim();
    if id.is_empty() {
        return Err(FieldError::new(
            ID_FIELD,
            "is empty; give the reference's asset number with its accuracy and due date",
        ));
    }
    if text.accuracy.trim().is_empty() {
        return Err(FieldError::new(
            ACCURACY_FIELD,
            "is empty; give ± % of span (0.02), mA (0.004 mA) or a unit of the range",
        ));
    }
    if text.due.trim().is_empty() {
        return Err(FieldError::new(
            DUE_FIELD,
            "is empty; give the date its calibration falls due, YYYY-MM-DD",
        ));
    }
    Ok(Some(ReferenceInstrument {
        id: id.to_string(),
        accuracy: parse_accuracy(text.accuracy, range_unit)?,
        calibration_due: parse_date(DUE_FIELD, text.due)?,
    }))
}

/// What the Check screen says under the reference fields.
#[derive(Debug, Clone, PartialEq)]
pub struct ReferenceView {
    /// `TUR 25.0:1 (4:1 or better asked, common practice)`; empty without a reference.
    pub tur_text: String,
    /// The warnings the saved check will carry, in the command line's words.
    pub warnings: Vec<String>,
    /// How it stands: good, caution when warned, neutral when not given.
    pub tone: Tone,
    /// A field that cannot be read, in words (empty when all is well).
    pub problem: String,
    /// Which field the problem is in (`reference-accuracy`…), empty when none.
    pub problem_field: String,
}

/// The test uncertainty ratio and warnings for `check` with the reference as typed.
/// They do not depend on the readings (the tolerance, the reference's accuracy and the
/// dates decide them), so the screen shows them before the first point is read.
pub fn view(check: &LoopCheck, text: ReferenceText<'_>) -> ReferenceView {
    let mut v = ReferenceView {
        tur_text: String::new(),
        warnings: Vec::new(),
        tone: Tone::Neutral,
        problem: String::new(),
        problem_field: String::new(),
    };
    let reference = match parse(text, &check.input_unit()) {
        Ok(Some(r)) => r,
        Ok(None) => return v,
        Err(e) => {
            v.problem = e.to_string();
            v.problem_field = e.field;
            return v;
        }
    };
    let check = check.clone().reference(reference);
    // Every point read exactly as expected: only the reference verdict matters here.
    let expected: Vec<f64> = match check.plan() {
        Ok(plan) => plan.iter().map(|p| p.expected).collect(),
        Err(e) => {
            v.problem = e.to_string();
            v.problem_field = e.field;
            return v;
        }
    };
    match check.run_planned(&expected) {
        Ok(res) => {
            if let Some(tur) = res.tur {
                v.tur_text = format!(
                    "TUR {}:1 ({}:1 or better asked, common practice)",
                    display::ratio(tur),
                    display::whole(MIN_TUR)
                );
            }
            v.warnings = warnings(&res.warnings);
            v.tone = if v.warnings.is_empty() {
                Tone::Good
            } else {
                Tone::Caution
            };
        }
        Err(e) => {
            v.problem = e.to_string();
            v.problem_field = e.field;
        }
    }
    v
}

/// The warnings in words, as the command line prints them after `> Warning:`.
pub fn warnings(list: &[CheckWarning]) -> Vec<String> {
    list.iter()
        .map(crate::view::wording::check::warning)
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::check::Device;
    use crate::scale::Scale;
    use crate::tag::Tag;

    fn day(y: i32, m: u32, d: u32) -> NaiveDate {
        NaiveDate::from_ymd_opt(y, m, d).unwrap()
    }

    /// LT-101, 0–4.5 m, ±0.5 % of span, checked on 2026-12-01 (invented demo values).
    fn check() -> LoopCheck {
        let mut t = Tag::new("LT-101", Scale::linear(0.0, 4.5, "m").unwrap()).unwrap();
        t.tolerance_percent = 0.5;
        LoopCheck::for_tag(&t, Device::Transmitter, day(2026, 12, 1))
    }

    fn text<'a>(id: &'a str, accuracy: &'a str, due: &'a str) -> ReferenceText<'a> {
        ReferenceText { id, accuracy, due }
    }

    #[test]
    fn nothing_typed_is_no_reference_and_no_warning() {
        assert_eq!(parse(text(" ", "", ""), "m").unwrap(), None);
        let v = view(&check(), text("", "", ""));
        assert_eq!(v.tur_text, "");
        assert!(v.warnings.is_empty());
        assert_eq!(v.tone, Tone::Neutral);
    }

    #[test]
    fn a_calibrator_good_to_a_fiftieth_of_the_tolerance() {
        // ±0.5 % tolerance / ±0.02 % of span reference = TUR 25:1, above 4:1 (common practice).
        let v = view(&check(), text("CAL-07", "0,02", "2027-03-01"));
        assert_eq!(
            v.tur_text,
            "TUR 25.0:1 (4:1 or better asked, common practice)"
        );
        assert!(v.warnings.is_empty(), "{:?}", v.warnings);
        assert_eq!(v.tone, Tone::Good);
    }

    #[test]
    fn a_meter_in_ma_and_a_gauge_in_the_range_unit() {
        // 0.004 mA of a 16 mA span is 0.025 % of span: TUR 0.5 / 0.025 = 20:1.
        let r = parse(text("DMM-3", "0.004 mA", "2027-01-31"), "m")
            .unwrap()
            .unwrap();
        assert_eq!(r.accuracy, Accuracy::Ma(0.004));
        // 2 cm of water column on a 0–4.5 m range is 0.02 m (0.444 % of span).
        let r = parse(text("LG-1", "2 cm", "2027-01-31"), "m")
            .unwrap()
            .unwrap();
        match r.accuracy {
            Accuracy::Units(v) => assert!((v - 0.02).abs() < 1e-12, "{v}"),
            other => panic!("{other:?}"),
        }
    }

    #[test]
    fn past_due_and_a_poor_ratio_are_both_said_in_the_command_lines_words() {
        // Due 2026-11-20, used 2026-12-01: 11 days past due. ±0.25 % against ±0.5 %:
        // TUR 2:1, under 4:1 (common practice).
        let v = view(&check(), text("CAL-07", "0.25 %", "2026-11-20"));
        assert_eq!(v.tone, Tone::Caution);
        assert_eq!(v.warnings.len(), 2, "{:?}", v.warnings);
        assert!(
            v.warnings[0].contains("11 day(s) past due"),
            "{}",
            v.warnings[0]
        );
        assert!(
            v.warnings[1].starts_with("test uncertainty ratio 2.0:1 is below 4:1"),
            "{}",
            v.warnings[1]
        );
        assert_eq!(
            v.tur_text,
            "TUR 2.0:1 (4:1 or better asked, common practice)"
        );
    }

    #[test]
    fn due_on_the_day_of_the_check_is_not_past_due() {
        let v = view(&check(), text("CAL-07", "0.02", "2026-12-01"));
        assert!(v.warnings.is_empty(), "{:?}", v.warnings);
    }

    #[test]
    fn a_half_filled_reference_names_the_missing_field() {
        let e = parse(text("CAL-07", "", "2027-01-01"), "m").unwrap_err();
        assert_eq!(e.field, ACCURACY_FIELD);
        let e = parse(text("", "0.02", ""), "m").unwrap_err();
        assert_eq!(e.field, ID_FIELD);
        let v = view(&check(), text("CAL-07", "0.02", "1 March"));
        assert_eq!(v.problem_field, DUE_FIELD);
        assert!(v.problem.contains("YYYY-MM-DD"), "{}", v.problem);
        let e = parse(text("CAL-07", "0.5 V", "2027-01-01"), "m").unwrap_err();
        assert_eq!(e.field, ACCURACY_FIELD);
    }
}
