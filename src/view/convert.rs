//! The Convert screen's view model: one typed field in, every other field and the status out.
//!
//! The technician types into one of mA, % of span, value, or volts (across a known
//! resistor); that field is the *source*. The others are worked out through the tag's
//! [`Scale`] and shown rounded by [`crate::display`]. The source field keeps the text as
//! typed, so the cursor never jumps.

use crate::display;
use crate::error::Result;
use crate::number::{parse_in, parse_number};
use crate::scale::{Reading, Scale, Transfer};
use crate::signal::{classify, BandLimits, SignalStatus};
use crate::view::bands::{band_bar, BandBar};
use crate::view::Tone;

/// Which field the technician typed into.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Source {
    /// Loop current, mA.
    Ma,
    /// Percent of span.
    Percent,
    /// The tag's value in its unit.
    Value,
    /// Volts across the resistor.
    Volts,
}

impl Source {
    /// The stable name used by the UI (`"ma"`, `"percent"`, `"value"`, `"volts"`).
    pub fn name(self) -> &'static str {
        match self {
            Source::Ma => "ma",
            Source::Percent => "percent",
            Source::Value => "value",
            Source::Volts => "volts",
        }
    }

    /// The source for a UI name, if it is one.
    pub fn from_name(name: &str) -> Option<Source> {
        [Source::Ma, Source::Percent, Source::Value, Source::Volts]
            .into_iter()
            .find(|s| s.name() == name)
    }
}

/// What the Convert screen was given.
#[derive(Debug, Clone, PartialEq)]
pub struct ConvertInput<'a> {
    /// The range to convert through.
    pub scale: &'a Scale,
    /// The band limits to classify against.
    pub bands: &'a BandLimits,
    /// The field typed into.
    pub source: Source,
    /// Its text, as typed (`12,5`, `12.5 mA`).
    pub text: &'a str,
    /// The resistor for the volts field, as typed (`250`, `0,25 kohm`).
    pub ohms_text: &'a str,
}

/// Everything the Convert screen shows.
#[derive(Debug, Clone, PartialEq)]
pub struct ConvertView {
    /// The reading, full precision.
    pub reading: Reading,
    /// mA field text (number only; the unit is beside the field).
    pub ma: String,
    /// % field text.
    pub percent: String,
    /// Value field text.
    pub value: String,
    /// Volts field text (empty when the resistor is not usable).
    pub volts: String,
    /// Unit of the value.
    pub value_unit: String,
    /// The status in a few words.
    pub status_title: String,
    /// What the status means.
    pub status_detail: String,
    /// How the status stands.
    pub tone: Tone,
    /// Extra lines: ΔP for square root, the measured variable for a table, a cutoff.
    pub notes: Vec<String>,
    /// The band bar with the reading marked.
    pub bar: BandBar,
    /// The bar in words, for screen readers.
    pub bar_description: String,
}

/// Work out the view from the typed field. The error names the field that was wrong.
pub fn view(input: &ConvertInput) -> Result<ConvertView> {
    let scale = input.scale;
    let ohms = parse_in("ohms", input.ohms_text, "Ω");
    let reading = match input.source {
        Source::Ma => scale.from_ma(parse_in("mA", input.text, "mA")?)?,
        Source::Percent => scale.from_percent(parse_percent(input.text)?)?,
        Source::Value => scale.from_value(parse_value(scale, input.text)?)?,
        Source::Volts => {
            let volts = parse_in("volts", input.text, "V")?;
            let ohms = ohms.clone()?;
            scale
                .from_volts(volts, ohms)
                .map_err(|e| match e.field.as_str() {
                    "ohms" | "volts" => e,
                    _ => e.renamed("volts"),
                })?
        }
    };
    let status = classify(reading.ma, input.bands, &scale.signal)?;
    let span = value_span(scale);
    let volts = match ohms {
        Ok(r) if r > 0.0 => display::sense_volts_number(reading.ma * r / 1000.0),
        _ => String::new(),
    };
    let bar = band_bar(Some(reading.ma), input.bands, &scale.signal);
    let status_title = status_title(status).to_string();
    let bar_description = format!(
        "{} — {}",
        display::ma(reading.ma),
        status_title.to_lowercase()
    );
    Ok(ConvertView {
        ma: display::ma_number(reading.ma),
        percent: display::percent_number(reading.percent),
        value: display::value_number(reading.value, span),
        volts,
        value_unit: reading.unit.clone(),
        status_title,
        status_detail: status.meaning().to_string(),
        tone: tone(status),
        notes: notes(scale, &reading),
        bar,
        bar_description,
        reading,
    })
}

/// Percent as typed, with or without a `%` sign.
fn parse_percent(text: &str) -> Result<f64> {
    let bare = text.trim().trim_end_matches('%');
    parse_number("percent", bare)
}

/// The value as typed; a unit suffix is converted to the scale's unit when it is a known one.
fn parse_value(scale: &Scale, text: &str) -> Result<f64> {
    let unit = scale.value_unit();
    match crate::units::lookup(unit) {
        Some(_) => parse_in("value", text, unit),
        None => {
            let bare = text.trim().trim_end_matches(unit).trim();
            parse_number("value", bare)
        }
    }
}

/// The span of the value shown (the table's output span for a table), for rounding.
pub fn value_span(scale: &Scale) -> f64 {
    match &scale.transfer {
        Transfer::Table(t) => {
            let pts = t.points();
            pts[pts.len() - 1].output - pts[0].output
        }
        _ => scale.span(),
    }
}

/// The warning for a value read off the ends of a characterisation table, in one wording
/// for every front.
pub const OUTSIDE_TABLE: &str =
    "Outside the table: the value is extrapolated past its first or last point and may be wrong";

/// The status in a few words, for the big status line.
pub fn status_title(status: SignalStatus) -> &'static str {
    match status {
        SignalStatus::NoLoopCurrent => "No loop current",
        SignalStatus::FailLow => "Failure signal, low",
        SignalStatus::SuspectLow => "Suspect: below the measurement band",
        SignalStatus::UnderRange => "Below range, still a measurement",
        SignalStatus::InRange => "In range",
        SignalStatus::OverRange => "Above range, still a measurement",
        SignalStatus::SuspectHigh => "Suspect: above the measurement band",
        SignalStatus::FailHigh => "Failure signal, high",
    }
}

/// How a status stands.
pub fn tone(status: SignalStatus) -> Tone {
    match status {
        SignalStatus::NoLoopCurrent => Tone::Dead,
        SignalStatus::FailLow | SignalStatus::FailHigh => Tone::Bad,
        SignalStatus::SuspectLow | SignalStatus::SuspectHigh => Tone::Caution,
        SignalStatus::UnderRange | SignalStatus::OverRange => Tone::Outside,
        SignalStatus::InRange => Tone::Good,
    }
}

fn notes(scale: &Scale, reading: &Reading) -> Vec<String> {
    let mut out = Vec::new();
    if let Some(dp) = reading.dp_percent {
        out.push(format!("ΔP {} of its span", display::percent(dp)));
    }
    if reading.cutoff_active {
        if let Transfer::SquareRoot { cutoff_percent, .. } = scale.transfer {
            out.push(format!(
                "Below the low-flow cutoff of {}: the receiver shows zero flow",
                crate::view::cutoff(cutoff_percent)
            ));
        }
    }
    if let Some(m) = reading.measured {
        out.push(format!(
            "Measured {} before the table",
            display::value(m, &scale.unit, scale.span())
        ));
    }
    if reading.outside_table {
        out.push(OUTSIDE_TABLE.to_string());
    }
    if scale.is_reversed() {
        out.push(format!(
            "Reversed range: {} at {}",
            display::ma(scale.signal.high_ma),
            display::value(scale.lrv, &scale.unit, scale.span())
        ));
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::scale::{RootLocation, SignalSpan};

    fn input<'a>(
        scale: &'a Scale,
        bands: &'a BandLimits,
        source: Source,
        text: &'a str,
    ) -> ConvertInput<'a> {
        ConvertInput {
            scale,
            bands,
            source,
            text,
            ohms_text: "250",
        }
    }

    #[test]
    fn typed_ma_fills_the_others() {
        // ISA blog, "Linear relationships for 4–20 mA transmitters": 50–250 psig, 150 psig
        // → 12.0 mA.
        let s = Scale::linear(50.0, 250.0, "psi").unwrap();
        let b = BandLimits::default();
        let v = view(&input(&s, &b, Source::Value, "150")).unwrap();
        assert_eq!(v.ma, "12.000");
        assert_eq!(v.percent, "50.00");
        assert_eq!(v.volts, "3.000");
        assert_eq!(v.tone, Tone::Good);
        let v = view(&input(&s, &b, Source::Ma, "12,0")).unwrap();
        assert_eq!(v.value, "150.00");
    }

    #[test]
    fn percent_and_volts_sources() {
        // T. Kuphaldt, Lessons in Industrial Instrumentation §13.2: 34.7 % → 9.552 mA.
        let s = Scale::linear(0.0, 100.0, "%").unwrap();
        let b = BandLimits::default();
        assert_eq!(
            view(&input(&s, &b, Source::Percent, "34,7 %")).unwrap().ma,
            "9.552"
        );
        // 250 Ω sense resistor: 1–5 V over 4–20 mA (common practice).
        let v = view(&input(&s, &b, Source::Volts, "5")).unwrap();
        assert_eq!(v.ma, "20.000");
        assert_eq!(v.percent, "100.00");
    }

    #[test]
    fn failure_currents_say_so() {
        let s = Scale::linear(0.0, 4.5, "m").unwrap();
        let b = BandLimits::default();
        let v = view(&input(&s, &b, Source::Ma, "3.5")).unwrap();
        assert_eq!(v.tone, Tone::Bad);
        assert_eq!(v.status_title, "Failure signal, low");
        assert_eq!(
            view(&input(&s, &b, Source::Ma, "0")).unwrap().tone,
            Tone::Dead
        );
    }

    #[test]
    fn bad_text_names_the_field() {
        let s = Scale::linear(0.0, 4.5, "m").unwrap();
        let b = BandLimits::default();
        assert_eq!(
            view(&input(&s, &b, Source::Ma, "twelve"))
                .unwrap_err()
                .field,
            "mA"
        );
        assert_eq!(
            view(&input(&s, &b, Source::Value, "")).unwrap_err().field,
            "value"
        );
        let mut i = input(&s, &b, Source::Volts, "3");
        i.ohms_text = "0";
        assert_eq!(view(&i).unwrap_err().field, "ohms");
    }

    #[test]
    fn square_root_shows_dp() {
        let s = Scale::new(
            0.0,
            3000.0,
            "m³/h",
            Transfer::SquareRoot {
                cutoff_percent: 1.0,
                root_in: RootLocation::Receiver,
            },
            SignalSpan::default(),
        )
        .unwrap();
        let b = BandLimits::default();
        // ISO 5167 relation: 25 % DP → 50 % flow.
        let v = view(&input(&s, &b, Source::Ma, "8")).unwrap();
        assert_eq!(v.value, "1500.0");
        assert!(v.notes[0].contains("25.00 %"), "{:?}", v.notes);
    }
}
