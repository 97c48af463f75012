//! Range scaling: loop current ↔ % of signal span ↔ engineering value, for one tag's range.
//!
//! A [`Scale`] is a validated range (LRV = value at the low end of the signal, URV = value
//! at the high end, so a reversed range simply has LRV > URV), a signal span (4–20 mA by
//! default) and a transfer:
//!
//! - **linear** — the usual case, including elevated and suppressed zero ranges;
//! - **square root** — DP flow, where flow is proportional to √ΔP (ISO 5167). The root is
//!   taken either in the transmitter (the current is linear in flow) or in the receiver
//!   (the current is linear in ΔP). A low-flow cutoff, in % of flow, forces small flows to
//!   zero as receivers do, so that noise on a near-zero ΔP does not show as flow;
//! - **characterization table** — the transmitter is linear in its measured variable (e.g.
//!   level in m) and a piecewise-linear table turns that into the value shown (e.g. volume
//!   in m³ of a horizontal tank).
//!
//! Every conversion goes through the fraction of signal span, so the directions agree by
//! construction: mA → value → mA returns the same current (outside a cutoff region).
//! Currents are carried in mA (`_ma`), the unit the trade reads and writes; they are turned
//! into amperes only where Ohm's law needs it.

use crate::display;
use crate::error::{finite, FieldError, Result};
use serde::{Deserialize, Serialize};

/// The loop current at the two ends of the signal span, mA (4–20 unless the tag says so).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct SignalSpan {
    /// Current at 0 % of span, mA.
    pub low_ma: f64,
    /// Current at 100 % of span, mA.
    pub high_ma: f64,
}

impl Default for SignalSpan {
    fn default() -> Self {
        SignalSpan {
            low_ma: 4.0,
            high_ma: 20.0,
        }
    }
}

impl SignalSpan {
    /// A validated span: both ends finite, 0 ≤ low < high ≤ 50 mA.
    pub fn new(low_ma: f64, high_ma: f64) -> Result<SignalSpan> {
        let low = crate::error::within("signal (low mA)", low_ma, 0.0, 50.0)?;
        let high = crate::error::within("signal (high mA)", high_ma, 0.0, 50.0)?;
        if high <= low {
            return Err(FieldError::new(
                "signal",
                format!(
                    "the high end ({} mA) must be above the low end ({} mA)",
                    display::quoted(high),
                    display::quoted(low)
                ),
            ));
        }
        Ok(SignalSpan {
            low_ma: low,
            high_ma: high,
        })
    }

    /// Width of the span, mA (16 for 4–20).
    pub fn width_ma(&self) -> f64 {
        self.high_ma - self.low_ma
    }

    /// Percent of span for a loop current (may be below 0 or above 100).
    pub fn percent_of(&self, ma: f64) -> f64 {
        (ma - self.low_ma) / self.width_ma() * 100.0
    }

    /// Loop current for a percent of span.
    pub fn ma_at(&self, percent: f64) -> f64 {
        self.low_ma + percent / 100.0 * self.width_ma()
    }
}

/// Where the square root of a DP flow signal is taken.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum RootLocation {
    /// The transmitter extracts the root: its current is linear in flow.
    Transmitter,
    /// The receiver (PLC, DCS, indicator) extracts the root: the current is linear in ΔP.
    Receiver,
}

/// One row of a characterization table: the measured variable (in the range's unit) and
/// the value shown for it (in the table's output unit).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct TablePoint {
    /// Measured variable, e.g. level in m.
    pub input: f64,
    /// Value shown, e.g. volume in m³.
    pub output: f64,
}

/// A validated piecewise-linear characterization (2–32 points, strictly monotonic both ways).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct CharTable {
    points: Vec<TablePoint>,
    output_unit: String,
}

/// Fewest and most points a characterization table may have.
pub const TABLE_POINTS: (usize, usize) = (2, 32);

impl CharTable {
    /// Check and store a table. Points may come in either order of input; they are sorted.
    /// Inputs must differ, and outputs must rise (or fall) strictly with input, so that the
    /// table can be read both ways.
    pub fn new(mut points: Vec<TablePoint>, output_unit: &str) -> Result<CharTable> {
        let (min, max) = TABLE_POINTS;
        if points.len() < min || points.len() > max {
            return Err(FieldError::new(
                "table",
                format!("needs {min} to {max} points, got {}", points.len()),
            ));
        }
        for (i, p) in points.iter().enumerate() {
            finite(&format!("table[{}] input", i + 1), p.input)?;
            finite(&format!("table[{}] output", i + 1), p.output)?;
        }
        points.sort_by(|a, b| a.input.total_cmp(&b.input));
        let rising = points[1].output > points[0].output;
        for (i, pair) in points.windows(2).enumerate() {
            if pair[1].input == pair[0].input {
                return Err(FieldError::new(
                    "table",
                    format!(
                        "two points share the input {}",
                        display::quoted(pair[0].input)
                    ),
                ));
            }
            let ok = if rising {
                pair[1].output > pair[0].output
            } else {
                pair[1].output < pair[0].output
            };
            if !ok {
                return Err(FieldError::new(
                    "table",
                    format!(
                        "outputs must rise (or fall) steadily with input; point {} ({} → {}) breaks that",
                        i + 2,
                        display::quoted(pair[1].input),
                        display::quoted(pair[1].output)
                    ),
                ));
            }
        }
        Ok(CharTable {
            points,
            output_unit: crate::units::EngUnit::parse(output_unit)
                .symbol()
                .to_string(),
        })
    }

    /// The points, sorted by input.
    pub fn points(&self) -> &[TablePoint] {
        &self.points
    }

    /// The unit of the table's output (e.g. `m³`).
    pub fn output_unit(&self) -> &str {
        &self.output_unit
    }

    /// True when `input` lies within the table's first and last points (a relative
    /// allowance of 1e-9 of the table's width forgives round-off at the ends).
    pub fn covers(&self, input: f64) -> bool {
        let (first, last) = (
            self.points[0].input,
            self.points[self.points.len() - 1].input,
        );
        let slack = (last - first).abs() * 1e-9;
        input >= first - slack && input <= last + slack
    }

    /// Output for an input, interpolated (extrapolated from the end segments outside; see
    /// [`CharTable::covers`]).
    pub fn output_for(&self, input: f64) -> f64 {
        let seg = segment(&self.points, input, |p| p.input);
        let (a, b) = (self.points[seg], self.points[seg + 1]);
        a.output + (input - a.input) * (b.output - a.output) / (b.input - a.input)
    }

    /// Input for an output — the table read backwards.
    pub fn input_for(&self, output: f64) -> f64 {
        let rising = self.points[1].output > self.points[0].output;
        let seg = if rising {
            segment(&self.points, output, |p| p.output)
        } else {
            // Outputs fall with input: search on the negated outputs, which rise.
            segment(&self.points, -output, |p| -p.output)
        };
        let (a, b) = (self.points[seg], self.points[seg + 1]);
        a.input + (output - a.output) * (b.input - a.input) / (b.output - a.output)
    }
}

/// Index of the segment [i, i+1] that holds `x` on a rising key, clamped to the end segments.
fn segment(points: &[TablePoint], x: f64, key: impl Fn(&TablePoint) -> f64) -> usize {
    let last = points.len() - 2;
    points[1..=last]
        .iter()
        .position(|p| x < key(p))
        .unwrap_or(last)
}

/// How the measured variable becomes the value shown.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "kebab-case")]
pub enum Transfer {
    /// Value is linear in current.
    Linear,
    /// DP flow: flow ∝ √ΔP (ISO 5167).
    SquareRoot {
        /// Flows below this % of flow span read as zero. 0 disables the cutoff.
        cutoff_percent: f64,
        /// Which device extracts the root.
        root_in: RootLocation,
    },
    /// Measured variable (linear in current) → value through a characterization table.
    Table(CharTable),
}

/// The % of DP span that a low-flow cutoff given in % of flow equals. Flow ∝ √ΔP
/// (ISO 5167), so ΔP% = flow%² / 100: a 1 % flow cutoff is 0.01 % of DP, a 10 % one 1 %.
pub fn cutoff_dp_percent(cutoff_flow_percent: f64) -> f64 {
    cutoff_flow_percent * cutoff_flow_percent / 100.0
}

/// The % of flow that a cutoff given in % of DP span equals (the inverse of
/// [`cutoff_dp_percent`]): 0.01 % of DP is 1 % of flow.
pub fn cutoff_flow_percent(cutoff_dp_percent: f64) -> f64 {
    (cutoff_dp_percent.max(0.0) * 100.0).sqrt()
}

/// ISA-51.1 description of where zero lies relative to the range.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum ZeroKind {
    /// The lower end of the range is zero.
    Zero,
    /// Zero of the measured variable lies above the lower range value (e.g. −25…100).
    Elevated,
    /// Zero of the measured variable lies below the lower range value (e.g. 20…100).
    Suppressed,
}

/// A tag's validated range, transfer and signal span: everything needed to scale readings.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Scale {
    /// Value at the low end of the signal (LRV), in `unit`.
    pub lrv: f64,
    /// Value at the high end of the signal (URV), in `unit`.
    pub urv: f64,
    /// Unit of LRV/URV: a known unit or free text.
    pub unit: String,
    /// How the measured variable becomes the value shown.
    pub transfer: Transfer,
    /// Current at 0 % and 100 %.
    pub signal: SignalSpan,
}

/// One reading expressed every way a technician needs it.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Reading {
    /// Loop current, mA.
    pub ma: f64,
    /// Percent of signal span (0 at LRV's current, 100 at URV's current).
    pub percent: f64,
    /// The value shown to the operator, in `unit` (flow for square-root, table output for a
    /// table, otherwise the measured variable).
    pub value: f64,
    /// Unit of `value`.
    pub unit: String,
    /// For a table: the measured variable before the table (e.g. level), in the range unit.
    pub measured: Option<f64>,
    /// For square-root: ΔP as % of its span.
    pub dp_percent: Option<f64>,
    /// True when a low-flow cutoff forced the value to zero flow.
    pub cutoff_active: bool,
    /// For a table: true when the measured variable lies beyond the table's first or last
    /// point, so the value is extrapolated from the end segment and may be wrong (a tank's
    /// shape past its table is unknown).
    pub outside_table: bool,
}

impl Scale {
    /// A linear 4–20 mA scale from LRV to URV.
    pub fn linear(lrv: f64, urv: f64, unit: &str) -> Result<Scale> {
        Scale::new(lrv, urv, unit, Transfer::Linear, SignalSpan::default())
    }

    /// Validate and build a scale. LRV may be above URV (reversed); they may not be equal.
    pub fn new(
        lrv: f64,
        urv: f64,
        unit: &str,
        transfer: Transfer,
        signal: SignalSpan,
    ) -> Result<Scale> {
        let lrv = finite("LRV", lrv)?;
        let urv = finite("URV", urv)?;
        if lrv == urv {
            return Err(FieldError::new(
                "range",
                format!(
                    "LRV and URV are both {}; the span must not be zero",
                    display::quoted(lrv)
                ),
            ));
        }
        let signal = SignalSpan::new(signal.low_ma, signal.high_ma)?;
        if let Transfer::SquareRoot { cutoff_percent, .. } = &transfer {
            crate::error::within("cutoff", *cutoff_percent, 0.0, 100.0)?;
        }
        Ok(Scale {
            lrv,
            urv,
            // A known unit is stored by its symbol (m3/h → m³/h); free text as typed.
            unit: crate::units::EngUnit::parse(unit).symbol().to_string(),
            transfer,
            signal,
        })
    }

    /// URV − LRV (negative for a reversed range).
    pub fn span(&self) -> f64 {
        self.urv - self.lrv
    }

    /// True when the value falls as the current rises (LRV > URV).
    pub fn is_reversed(&self) -> bool {
        self.lrv > self.urv
    }

    /// Elevated, suppressed or plain zero, per ISA-51.1 terms.
    pub fn zero_kind(&self) -> ZeroKind {
        let lower = self.lrv.min(self.urv);
        if lower > 0.0 {
            ZeroKind::Suppressed
        } else if lower < 0.0 {
            ZeroKind::Elevated
        } else {
            ZeroKind::Zero
        }
    }

    /// Unit of the value shown (the table's output unit for a table).
    pub fn value_unit(&self) -> &str {
        match &self.transfer {
            Transfer::Table(table) if !table.output_unit().is_empty() => table.output_unit(),
            _ => &self.unit,
        }
    }

    /// Everything about a loop current.
    pub fn from_ma(&self, ma: f64) -> Result<Reading> {
        let ma = finite("mA", ma)?;
        Ok(self.reading(ma, self.signal.percent_of(ma)))
    }

    /// Everything about a percent of signal span.
    pub fn from_percent(&self, percent: f64) -> Result<Reading> {
        let percent = finite("percent", percent)?;
        Ok(self.reading(self.signal.ma_at(percent), percent))
    }

    /// Everything about a value shown, found by reading the transfer backwards.
    pub fn from_value(&self, value: f64) -> Result<Reading> {
        let value = finite("value", value)?;
        let percent = match &self.transfer {
            Transfer::Linear => (value - self.lrv) / self.span() * 100.0,
            Transfer::SquareRoot { root_in, .. } => {
                let flow_fraction = (value - self.lrv) / self.span();
                if flow_fraction < -1e-12 {
                    return Err(FieldError::new(
                        "value",
                        format!(
                            "{} {} is beyond the zero-flow end of the range ({} {}); square-root flow has no values there",
                            display::quoted(value),
                            self.unit,
                            display::quoted(self.lrv),
                            self.unit
                        ),
                    ));
                }
                let flow_fraction = flow_fraction.max(0.0);
                match root_in {
                    RootLocation::Transmitter => flow_fraction * 100.0,
                    RootLocation::Receiver => flow_fraction * flow_fraction * 100.0,
                }
            }
            Transfer::Table(table) => {
                let measured = table.input_for(value);
                (measured - self.lrv) / self.span() * 100.0
            }
        };
        Ok(self.reading(self.signal.ma_at(percent), percent))
    }

    /// Everything about the volts measured across a known series resistor (measuring the
    /// loop current without breaking the loop): I = V / R.
    pub fn from_volts(&self, volts: f64, ohms: f64) -> Result<Reading> {
        let volts = finite("volts", volts)?;
        let ohms = crate::error::positive("ohms", ohms)?;
        self.from_ma(volts / ohms * 1000.0)
    }

    fn reading(&self, ma: f64, percent: f64) -> Reading {
        let fraction = percent / 100.0;
        let mut reading = Reading {
            ma,
            percent,
            value: self.lrv + fraction * self.span(),
            unit: self.value_unit().to_string(),
            measured: None,
            dp_percent: None,
            cutoff_active: false,
            outside_table: false,
        };
        match &self.transfer {
            Transfer::Linear => {}
            Transfer::SquareRoot {
                cutoff_percent,
                root_in,
            } => {
                let flow_fraction = match root_in {
                    RootLocation::Transmitter => fraction.max(0.0),
                    RootLocation::Receiver => fraction.max(0.0).sqrt(),
                };
                reading.dp_percent = Some(match root_in {
                    RootLocation::Transmitter => flow_fraction * flow_fraction * 100.0,
                    RootLocation::Receiver => percent,
                });
                if flow_fraction * 100.0 < *cutoff_percent || fraction <= 0.0 {
                    reading.cutoff_active = *cutoff_percent > 0.0 && fraction > 0.0;
                    reading.value = self.lrv;
                } else {
                    reading.value = self.lrv + flow_fraction * self.span();
                }
            }
            Transfer::Table(table) => {
                let measured = self.lrv + fraction * self.span();
                reading.measured = Some(measured);
                reading.value = table.output_for(measured);
                reading.outside_table = !table.covers(measured);
            }
        }
        reading
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn linear_mid_scale() {
        let s = Scale::linear(0.0, 10.0, "bar").unwrap();
        let r = s.from_ma(12.0).unwrap();
        assert!((r.percent - 50.0).abs() < 1e-12);
        assert!((r.value - 5.0).abs() < 1e-12);
    }

    #[test]
    fn zero_kinds() {
        assert_eq!(
            Scale::linear(-25.0, 100.0, "kPa").unwrap().zero_kind(),
            ZeroKind::Elevated
        );
        assert_eq!(
            Scale::linear(20.0, 100.0, "kPa").unwrap().zero_kind(),
            ZeroKind::Suppressed
        );
        assert_eq!(
            Scale::linear(250.0, 0.0, "mbar").unwrap().zero_kind(),
            ZeroKind::Zero
        );
    }

    #[test]
    fn table_reads_both_ways_even_when_falling() {
        let pts = vec![
            TablePoint {
                input: 0.0,
                output: 10.0,
            },
            TablePoint {
                input: 1.0,
                output: 6.0,
            },
            TablePoint {
                input: 2.0,
                output: 0.0,
            },
        ];
        let t = CharTable::new(pts, "m³").unwrap();
        assert!((t.output_for(1.5) - 3.0).abs() < 1e-12);
        assert!((t.input_for(3.0) - 1.5).abs() < 1e-12);
        assert!((t.input_for(8.0) - 0.5).abs() < 1e-12);
    }

    #[test]
    fn zero_span_is_refused() {
        assert_eq!(Scale::linear(5.0, 5.0, "bar").unwrap_err().field, "range");
    }
}
