//! The range form: LRV, URV, unit, signal span and transfer (linear, square root with its
//! cutoff and where the root is taken, or a characterisation table), as typed on the tag
//! form or given with the command line's range flags.

use super::{Field, FormError};
use crate::error::within;
use crate::number::{parse_in, parse_number, parse_range};
use crate::scale::{CharTable, RootLocation, Scale, SignalSpan, TablePoint, Transfer};

/// The transfers a technician picks from (the screens' transfer picker lists these).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum TransferChoice {
    /// The value is linear in current.
    #[default]
    Linear,
    /// DP flow with the root taken in the receiver (the current is linear in ΔP).
    RootInReceiver,
    /// DP flow with the root taken in the transmitter (the current is linear in flow).
    RootInTransmitter,
    /// Through a characterisation table.
    Table,
}

impl TransferChoice {
    /// Every choice, in the picker's order.
    pub const ALL: [TransferChoice; 4] = [
        TransferChoice::Linear,
        TransferChoice::RootInReceiver,
        TransferChoice::RootInTransmitter,
        TransferChoice::Table,
    ];

    /// The words the picker shows.
    pub fn label(self) -> &'static str {
        match self {
            TransferChoice::Linear => "linear",
            TransferChoice::RootInReceiver => "square root in the receiver",
            TransferChoice::RootInTransmitter => "square root in the transmitter",
            TransferChoice::Table => "characterisation table",
        }
    }

    /// The choice a transfer was made from.
    pub fn of(t: &Transfer) -> TransferChoice {
        match t {
            Transfer::Linear => TransferChoice::Linear,
            Transfer::SquareRoot {
                root_in: RootLocation::Receiver,
                ..
            } => TransferChoice::RootInReceiver,
            Transfer::SquareRoot {
                root_in: RootLocation::Transmitter,
                ..
            } => TransferChoice::RootInTransmitter,
            Transfer::Table(_) => TransferChoice::Table,
        }
    }

    /// The choice at `index` in [`TransferChoice::ALL`] (linear for anything else).
    pub fn from_index(index: i32) -> TransferChoice {
        usize::try_from(index)
            .ok()
            .and_then(|i| TransferChoice::ALL.get(i).copied())
            .unwrap_or_default()
    }

    /// This choice's place in [`TransferChoice::ALL`].
    pub fn index(self) -> i32 {
        TransferChoice::ALL
            .iter()
            .position(|c| *c == self)
            .map_or(0, |i| i as i32)
    }
}

/// The signal spans the screens' signal picker offers, mA: 4–20 (the one NAMUR NE 43 is
/// written for), 0–20 and 10–50 (older and some legacy loops; common practice). Any other
/// span can be given on the command line (`--signal 1..5`) and is then kept on the picker.
pub const COMMON_SIGNALS_MA: [(f64, f64); 3] = [(4.0, 20.0), (0.0, 20.0), (10.0, 50.0)];

/// What a signal picker offers: [`COMMON_SIGNALS_MA`] in words, then the span the form
/// already has when it is none of those, and which one is picked.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct SignalChoices {
    /// The options, in words (`4–20 mA`).
    pub options: Vec<String>,
    /// The same spans as the range form's signal text (`4..20`).
    pub texts: Vec<String>,
    /// The one picked.
    pub current: usize,
}

/// A signal span in words: `4–20 mA`.
pub fn signal_label(low_ma: f64, high_ma: f64) -> String {
    format!(
        "{}–{} mA",
        crate::display::trimmed(low_ma),
        crate::display::trimmed(high_ma)
    )
}

/// A signal span as the range form's signal text, every digit kept so it reads back the
/// same: `4..20`.
pub fn signal_text(span: &SignalSpan) -> String {
    format!("{}..{}", span.low_ma, span.high_ma)
}

/// The picker for a signal span as the form holds it (`LOW..HIGH`; empty is 4–20 mA). A
/// text that does not read as a span is offered as typed, so nothing is silently changed
/// (the form names it when saved).
pub fn signal_choices(current: &str) -> SignalChoices {
    let mut options: Vec<String> = COMMON_SIGNALS_MA
        .iter()
        .map(|&(lo, hi)| signal_label(lo, hi))
        .collect();
    let mut texts: Vec<String> = COMMON_SIGNALS_MA
        .iter()
        .map(|&(lo, hi)| {
            signal_text(&SignalSpan {
                low_ma: lo,
                high_ma: hi,
            })
        })
        .collect();
    let current = if current.trim().is_empty() {
        0
    } else {
        let (label, text) = match parse_range(Field::Signal.name(), current) {
            Ok((lo, hi)) => (
                signal_label(lo, hi),
                signal_text(&SignalSpan {
                    low_ma: lo,
                    high_ma: hi,
                }),
            ),
            Err(_) => (current.trim().to_string(), current.trim().to_string()),
        };
        match options.iter().position(|o| *o == label) {
            Some(i) => i,
            None => {
                options.push(label);
                texts.push(text);
                options.len() - 1
            }
        }
    };
    SignalChoices {
        options,
        texts,
        current,
    }
}

/// What a typed square-root cutoff is a percentage of.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum CutoffOf {
    /// % of flow span (what the tag keeps).
    #[default]
    Flow,
    /// % of DP span: 0.01 % of DP is 1 % of flow (flow ∝ √ΔP, ISO 5167).
    Dp,
}

/// LRV and URV, typed apart (the tag form) or together as `LRV..URV` (the command line).
#[derive(Debug, Clone, PartialEq)]
pub enum Bounds {
    /// `LRV..URV` in one text.
    Together(String),
    /// LRV and URV in two texts.
    Apart {
        /// The value at the low end of the signal.
        lrv: String,
        /// The value at the high end of the signal.
        urv: String,
    },
}

impl Default for Bounds {
    fn default() -> Self {
        Bounds::Apart {
            lrv: String::new(),
            urv: String::new(),
        }
    }
}

/// A range and its transfer as typed.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct RangeForm {
    /// LRV and URV (LRV above URV for a reversed range: `250..0`).
    pub bounds: Bounds,
    /// The engineering unit (`bar`, `m³/h`, or free text such as `pH`).
    pub unit: String,
    /// The transfer picked.
    pub transfer: TransferChoice,
    /// A square root's low-flow cutoff, % (empty is 0, no cutoff).
    pub cutoff: String,
    /// What the cutoff is a percentage of.
    pub cutoff_of: CutoffOf,
    /// A table's `IN:OUT` pairs (`0:0; 1:5,1; 2:12`); empty keeps the table given to
    /// [`RangeForm::parse`].
    pub table: String,
    /// The unit of the table's output (`m³`).
    pub table_unit: String,
    /// The signal span in mA, `LOW..HIGH` (empty is 4..20).
    pub signal: String,
}

impl RangeForm {
    /// Build the scale; `kept_table` is the tag's table as saved, used when the table is
    /// picked but no pairs were typed (the screens do not retype a table).
    pub fn parse(&self, kept_table: Option<&CharTable>) -> Result<Scale, FormError> {
        let (lrv, urv) = match &self.bounds {
            Bounds::Together(text) => {
                parse_range(Field::Range.name(), text).map_err(FormError::at(Field::Range))?
            }
            Bounds::Apart { lrv, urv } => (
                parse_number(Field::Lrv.name(), lrv).map_err(FormError::at(Field::Lrv))?,
                parse_number(Field::Urv.name(), urv).map_err(FormError::at(Field::Urv))?,
            ),
        };
        let signal = if self.signal.trim().is_empty() {
            SignalSpan::default()
        } else {
            let (lo, hi) = parse_range(Field::Signal.name(), &self.signal)
                .map_err(FormError::at(Field::Signal))?;
            SignalSpan::new(lo, hi).map_err(FormError::at(Field::Signal))?
        };
        let transfer = match self.transfer {
            TransferChoice::Linear => Transfer::Linear,
            TransferChoice::RootInReceiver | TransferChoice::RootInTransmitter => {
                Transfer::SquareRoot {
                    cutoff_percent: self.cutoff_flow_percent()?,
                    root_in: if self.transfer == TransferChoice::RootInTransmitter {
                        RootLocation::Transmitter
                    } else {
                        RootLocation::Receiver
                    },
                }
            }
            TransferChoice::Table => Transfer::Table(if self.table.trim().is_empty() {
                kept_table.cloned().ok_or_else(|| {
                    FormError::new(
                        Field::Table,
                        "is empty; give the table as IN:OUT pairs (loopside tag edit NUMBER --table \"0:0;1:5,1\")",
                    )
                })?
            } else {
                parse_table(&self.table, &self.table_unit)?
            }),
        };
        Scale::new(lrv, urv, &self.unit, transfer, signal)
            .map_err(|e| FormError::from_core(e, Field::Range))
    }

    /// The cutoff in % of flow, 0–100.
    fn cutoff_flow_percent(&self) -> Result<f64, FormError> {
        if self.cutoff.trim().is_empty() {
            return Ok(0.0);
        }
        // The words `of DP` (`0,01 % of DP`) say the cutoff is a % of DP, as the flag
        // --cutoff-dp does; `of flow` is the default made explicit.
        let lower = self.cutoff.to_lowercase();
        let (number, of) = match lower.find("of") {
            Some(i) if lower[i..].contains("dp") => (&self.cutoff[..i], CutoffOf::Dp),
            Some(i) if lower[i..].contains("flow") => (&self.cutoff[..i], CutoffOf::Flow),
            _ => (self.cutoff.as_str(), self.cutoff_of),
        };
        let typed = parse_in(Field::Cutoff.name(), number, "%")
            .and_then(|v| within(Field::Cutoff.name(), v, 0.0, 100.0))
            .map_err(FormError::at(Field::Cutoff))?;
        Ok(match of {
            CutoffOf::Flow => typed,
            CutoffOf::Dp => crate::scale::cutoff_flow_percent(typed),
        })
    }
}

/// Read `IN:OUT` pairs separated by `;` (or `,` when no `;` is present).
pub fn parse_table(text: &str, output_unit: &str) -> Result<CharTable, FormError> {
    let rows: Vec<&str> = if text.contains(';') {
        text.split(';').collect()
    } else {
        text.split(',').collect()
    };
    let mut points = Vec::new();
    for (i, row) in rows.iter().enumerate() {
        let row_error = |reason: String| FormError {
            field: Field::Table,
            row: Some(i),
            reason: format!("row {}: {reason}", i + 1),
        };
        let Some((a, b)) = row.split_once(':') else {
            return Err(row_error(format!("'{}' is not an IN:OUT pair", row.trim())));
        };
        let number = |t: &str, which: &str| {
            parse_number(Field::Table.name(), t)
                .map_err(|e| row_error(format!("{which} {}", e.reason)))
        };
        points.push(TablePoint {
            input: number(a, "input")?,
            output: number(b, "output")?,
        });
    }
    // The table's faults are worded here, by the rows as typed and numbered on the
    // screen (the core numbers its points in input order, which may differ).
    let (min, max) = crate::scale::TABLE_POINTS;
    if points.len() < min || points.len() > max {
        return Err(FormError::new(
            Field::Table,
            format!("needs {min} to {max} rows, got {}", points.len()),
        ));
    }
    if let Some(fault) = breaking_row(&points) {
        let (row, p) = (fault.row, points[fault.row]);
        let reason = if fault.shared_input {
            format!(
                "row {}: rows {} and {} share the input {}; give each input once",
                row + 1,
                fault.other + 1,
                row + 1,
                crate::display::trimmed(p.input)
            )
        } else {
            format!(
                "row {}: outputs must rise (or fall) steadily with input; {} → {} breaks that (against row {})",
                row + 1,
                crate::display::trimmed(p.input),
                crate::display::trimmed(p.output),
                fault.other + 1
            )
        };
        return Err(FormError {
            field: Field::Table,
            row: Some(row),
            reason,
        });
    }
    CharTable::new(points, output_unit).map_err(FormError::at(Field::Table))
}

/// A row that breaks a table's order, and the row it clashes with (both as typed, from 0).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
struct OrderFault {
    /// The row named: the later of the two as typed.
    row: usize,
    /// The row it clashes with (its neighbour by input).
    other: usize,
    /// True when the two share an input; false when the output turns back.
    shared_input: bool,
}

/// The row (as typed) that breaks a table's order: the later of two rows sharing an input,
/// or the later of the first two neighbours (by input) whose outputs do not keep rising
/// (or falling) with input.
fn breaking_row(points: &[TablePoint]) -> Option<OrderFault> {
    let mut order: Vec<usize> = (0..points.len()).collect();
    order.sort_by(|&a, &b| points[a].input.total_cmp(&points[b].input));
    let rising = order.len() > 1 && points[order[1]].output > points[order[0]].output;
    order.windows(2).find_map(|pair| {
        let (a, b) = (points[pair[0]], points[pair[1]]);
        let steady = if rising {
            b.output > a.output
        } else {
            b.output < a.output
        };
        let shared_input = a.input == b.input;
        (shared_input || !steady).then(|| OrderFault {
            row: pair[0].max(pair[1]),
            other: pair[0].min(pair[1]),
            shared_input,
        })
    })
}

/// The cutoff as the form's number field shows it, % of flow (empty for none).
pub fn cutoff_text(t: &Transfer) -> String {
    match t {
        Transfer::SquareRoot { cutoff_percent, .. } if *cutoff_percent > 0.0 => {
            crate::display::trimmed(*cutoff_percent)
        }
        _ => String::new(),
    }
}

/// Read a transfer written in words, as the tag form took it before it had a picker
/// (`linear`, `square root in the transmitter, cutoff 1 %`, `sqrt 0,01 % of DP`): kept so
/// a form left open in an older version still opens. Gives the choice and the cutoff in %
/// of flow as the number field shows it.
pub fn choice_from_words(text: &str) -> (TransferChoice, String) {
    let t = text.trim().to_lowercase();
    if t.starts_with("table") || t.starts_with("characterisation") {
        return (TransferChoice::Table, String::new());
    }
    if !(t.contains("root") || t.contains("sqrt")) {
        return (TransferChoice::Linear, String::new());
    }
    let choice = if t.contains("transmitter") {
        TransferChoice::RootInTransmitter
    } else {
        TransferChoice::RootInReceiver
    };
    let words: Vec<&str> = t.split_whitespace().collect();
    let first = words
        .iter()
        .position(|w| w.starts_with(|c: char| c.is_ascii_digit()));
    let cutoff = first
        .and_then(|i| {
            let n = parse_number("cutoff", words[i].trim_end_matches([',', ';', '%'])).ok()?;
            let of_dp = words[i + 1..]
                .iter()
                .take_while(|w| !w.starts_with(|c: char| c.is_ascii_digit() || c == '('))
                .any(|w| w.trim_matches(|c: char| !c.is_alphanumeric()) == "dp");
            Some(crate::display::trimmed(if of_dp {
                crate::scale::cutoff_flow_percent(n)
            } else {
                n
            }))
        })
        .unwrap_or_default();
    (choice, cutoff)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn flow() -> RangeForm {
        // FT-310: 0–3000 m³/h on a DP cell, root in the receiver, 1 % of flow cutoff.
        RangeForm {
            bounds: Bounds::Together("0..3000".into()),
            unit: "m3/h".into(),
            transfer: TransferChoice::RootInReceiver,
            cutoff: "1".into(),
            ..Default::default()
        }
    }

    #[test]
    fn a_flow_range_as_typed() {
        let s = flow().parse(None).unwrap();
        assert_eq!((s.lrv, s.urv, s.unit.as_str()), (0.0, 3000.0, "m³/h"));
        assert_eq!(
            s.transfer,
            Transfer::SquareRoot {
                cutoff_percent: 1.0,
                root_in: RootLocation::Receiver
            }
        );
        // 0.01 % of DP is 1 % of flow: flow ∝ √ΔP (ISO 5167 relation).
        let mut f = flow();
        f.cutoff = "0,01".into();
        f.cutoff_of = CutoffOf::Dp;
        let mut typed = flow();
        typed.cutoff = "0,01 % of DP".into();
        for form in [f, typed] {
            match form.parse(None).unwrap().transfer {
                Transfer::SquareRoot { cutoff_percent, .. } => {
                    assert!((cutoff_percent - 1.0).abs() < 1e-9, "{form:?}")
                }
                other => panic!("{other:?}"),
            }
        }
    }

    #[test]
    fn a_reversed_range_typed_apart() {
        let f = RangeForm {
            bounds: Bounds::Apart {
                lrv: "250".into(),
                urv: "0".into(),
            },
            unit: "mbar".into(),
            signal: "0..20".into(),
            ..Default::default()
        };
        let s = f.parse(None).unwrap();
        assert!(s.is_reversed());
        assert_eq!(s.signal.low_ma, 0.0);
    }

    #[test]
    fn a_table_is_typed_or_kept() {
        let mut f = RangeForm {
            bounds: Bounds::Together("0..2".into()),
            unit: "m".into(),
            transfer: TransferChoice::Table,
            table: "0:0; 1:5,1; 2:12".into(),
            table_unit: "m³".into(),
            ..Default::default()
        };
        let s = f.parse(None).unwrap();
        let Transfer::Table(table) = &s.transfer else {
            panic!("{:?}", s.transfer)
        };
        f.table = String::new();
        assert_eq!(f.parse(Some(table)).unwrap().transfer, s.transfer);
        assert_eq!(f.parse(None).unwrap_err().field, Field::Table);
        f.table = "0:0; 1".into();
        let e = f.parse(None).unwrap_err();
        assert_eq!((e.field, e.row), (Field::Table, Some(1)));
        // A bad number names its row and whether it is the input or the output.
        f.table = "0:0; 1:5,1; 2:lots".into();
        let e = f.parse(None).unwrap_err();
        assert_eq!((e.field, e.row), (Field::Table, Some(2)));
        assert!(e.reason.starts_with("row 3: output "), "{}", e.reason);
        // A volume that falls back at 1.5 m (typed as the fourth row) is that row's fault,
        // though the table sorts it third.
        f.table = "0:0; 1:5,1; 2:12; 1,5:4".into();
        let e = f.parse(None).unwrap_err();
        assert_eq!((e.field, e.row), (Field::Table, Some(3)));
        // Two rows for the same level: the later one is named.
        f.table = "0:0; 1:5; 1:6; 2:12".into();
        let e = f.parse(None).unwrap_err();
        assert_eq!(e.row, Some(2));
        assert_eq!(
            e.reason,
            "row 3: rows 2 and 3 share the input 1; give each input once"
        );
        // The order fault is told by rows as typed, never by the table's sorted points.
        f.table = "0:0; 1:5,1; 2:12; 1,5:4".into();
        assert_eq!(
            f.parse(None).unwrap_err().reason,
            "row 4: outputs must rise (or fall) steadily with input; 1.5 → 4 breaks that (against row 2)"
        );
        f.table = "0:0".into();
        assert_eq!(
            f.parse(None).unwrap_err().reason,
            "needs 2 to 32 rows, got 1"
        );
    }

    #[test]
    fn each_bad_field_is_named() {
        type Spoil = fn(&mut RangeForm);
        let cases: [(Spoil, Field); 7] = [
            (|f| f.bounds = Bounds::Together("0-10".into()), Field::Range),
            (|f| f.bounds = Bounds::Together("5..5".into()), Field::Range),
            (
                |f| {
                    f.bounds = Bounds::Apart {
                        lrv: "low".into(),
                        urv: "1".into(),
                    }
                },
                Field::Lrv,
            ),
            (
                |f| {
                    f.bounds = Bounds::Apart {
                        lrv: "0".into(),
                        urv: "x".into(),
                    }
                },
                Field::Urv,
            ),
            (|f| f.cutoff = "150".into(), Field::Cutoff),
            (|f| f.signal = "20..4".into(), Field::Signal),
            (|f| f.signal = "4-20".into(), Field::Signal),
        ];
        for (spoil, field) in cases {
            let mut f = flow();
            spoil(&mut f);
            assert_eq!(f.parse(None).unwrap_err().field, field, "{f:?}");
        }
    }

    #[test]
    fn the_signal_is_picked_from_the_common_spans_or_kept() {
        let c = signal_choices("");
        assert_eq!(c.options, ["4–20 mA", "0–20 mA", "10–50 mA"]);
        assert_eq!(c.current, 0);
        // 0–20 mA picked reads as a 0–20 mA span (2 mA is then 10 %, not a failure).
        let f = RangeForm {
            bounds: Bounds::Together("0..100".into()),
            signal: c.texts[1].clone(),
            ..Default::default()
        };
        assert_eq!(f.parse(None).unwrap().signal.low_ma, 0.0);
        assert_eq!(signal_choices("0..20").current, 1);
        assert_eq!(signal_choices("10 .. 50").current, 2);
        // A 1–5 mA span given on the command line stays on the list, picked.
        let odd = signal_choices("1..5");
        assert_eq!(odd.options.len(), 4);
        assert_eq!(odd.options[odd.current], "1–5 mA");
        assert_eq!(odd.texts[odd.current], "1..5");
    }

    #[test]
    fn old_transfer_words_still_open() {
        assert_eq!(
            choice_from_words(" Linear "),
            (TransferChoice::Linear, String::new())
        );
        assert_eq!(
            choice_from_words(
                "square root in the transmitter, cutoff 0.8 % of flow (0.0064 % of DP)"
            ),
            (TransferChoice::RootInTransmitter, "0.8".to_string())
        );
        // 1 % of DP is 10 % of flow (ISO 5167 relation).
        assert_eq!(
            choice_from_words("sqrt cutoff 1 % dp"),
            (TransferChoice::RootInReceiver, "10".to_string())
        );
        assert_eq!(choice_from_words("table → m³").0, TransferChoice::Table);
        for c in TransferChoice::ALL {
            assert_eq!(TransferChoice::from_index(c.index()), c);
            assert_eq!(choice_from_words(c.label()).0, c);
        }
    }
}
