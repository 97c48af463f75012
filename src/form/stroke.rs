//! The stroke-check form: demands, positions read, tolerance, a split-range valve's part
//! of the signal, its action and fail position, as typed on the command line (and by any
//! screen that strokes a valve). Its own field names (`demand`, `position`, `tolerance`,
//! `split`, `action`, `fail position`), as the core's errors give them, with the range.

use crate::error::{FieldError, Result};
use crate::number::{parse_in, parse_list, parse_range};
use crate::stroke::{FailPosition, StrokeInput, ValveAction, FIVE_POINTS};

/// The stroke check's fields as typed.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct StrokeForm {
    /// Demands, % of signal, comma-separated (`;` when decimal commas are used); empty:
    /// 0, 25, 50, 75, 100.
    pub demand: String,
    /// Positions read, % open, one per demand.
    pub position: String,
    /// Tolerance, ± % of stroke.
    pub tolerance: String,
    /// A split-range valve's part of the signal, mA (`4..12`); empty: the whole signal.
    pub split: String,
    /// `air-to-open` or `air-to-close`; empty: not recorded.
    pub action: String,
    /// `closed`, `open` or `last`; empty: not recorded.
    pub fail: String,
}

impl StrokeForm {
    /// Read the form into a stroke check to judge; the error names the field.
    pub fn parse(&self) -> Result<StrokeInput> {
        let demand_pct = if self.demand.trim().is_empty() {
            FIVE_POINTS.to_vec()
        } else {
            parse_list("demand", &self.demand)?
        };
        if self.position.trim().is_empty() {
            return Err(FieldError::new(
                "position",
                "is empty; type the position read at each demand, % open",
            ));
        }
        let position_pct = parse_list("position", &self.position)?;
        if self.tolerance.trim().is_empty() {
            return Err(FieldError::new(
                "tolerance",
                "is empty; type the acceptance tolerance, % of stroke (above 0, up to 100)",
            ));
        }
        let tolerance_pct = parse_in("tolerance", &self.tolerance, "%")?;
        let split_ma = if self.split.trim().is_empty() {
            None
        } else {
            Some(parse_range("split", &self.split)?)
        };
        let action = (!self.action.trim().is_empty())
            .then(|| ValveAction::parse(&self.action))
            .transpose()?;
        let fail = (!self.fail.trim().is_empty())
            .then(|| FailPosition::parse(&self.fail))
            .transpose()?;
        let input = StrokeInput {
            demand_pct,
            position_pct,
            tolerance_pct,
            signal: Default::default(),
            split_ma,
            action,
            fail,
        };
        input.validate()?;
        Ok(input)
    }
}
