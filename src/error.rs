//! Typed input errors shared by every computation in the core.
//!
//! A technician sees these messages verbatim, so each one names the field that was wrong
//! and what would have been accepted ("supply_volts: must be a finite number, got NaN").
//! Nothing in the core panics on bad input; it returns a [`FieldError`] instead.

use crate::display::quoted;
use std::fmt;

/// One input that could not be used, with the field's name and the reason in plain words.
#[derive(Debug, Clone, PartialEq, Eq, thiserror::Error)]
pub struct FieldError {
    /// The name of the field as the technician typed it (CLI flag or form label).
    pub field: String,
    /// Why it was refused, including the allowed range where there is one.
    pub reason: String,
}

impl FieldError {
    /// An error for `field` with a `reason` the technician can act on.
    pub fn new(field: impl Into<String>, reason: impl Into<String>) -> Self {
        FieldError {
            field: field.into(),
            reason: reason.into(),
        }
    }

    /// The same error reported under another field name (for example when a form field
    /// feeds a core computation whose own parameter has a different name).
    pub fn renamed(mut self, field: impl Into<String>) -> Self {
        self.field = field.into();
        self
    }
}

impl fmt::Display for FieldError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{}: {}", self.field, self.reason)
    }
}

/// The result of a core computation on technician input.
pub type Result<T> = std::result::Result<T, FieldError>;

/// Accept `value` only if it is a real number (not NaN, not infinite).
pub fn finite(field: &str, value: f64) -> Result<f64> {
    if value.is_finite() {
        Ok(value)
    } else {
        Err(FieldError::new(
            field,
            format!("must be a finite number, got {}", quoted(value)),
        ))
    }
}

/// Accept `value` only if it is finite and strictly above zero.
pub fn positive(field: &str, value: f64) -> Result<f64> {
    let v = finite(field, value)?;
    if v > 0.0 {
        Ok(v)
    } else {
        Err(FieldError::new(
            field,
            format!("must be greater than 0, got {}", quoted(v)),
        ))
    }
}

/// Accept `value` only if it is finite and zero or above.
pub fn non_negative(field: &str, value: f64) -> Result<f64> {
    let v = finite(field, value)?;
    if v >= 0.0 {
        Ok(v)
    } else {
        Err(FieldError::new(
            field,
            format!("must be 0 or more, got {}", quoted(v)),
        ))
    }
}

/// Accept `value` only if it is finite and within `low..=high` (inclusive).
pub fn within(field: &str, value: f64, low: f64, high: f64) -> Result<f64> {
    let v = finite(field, value)?;
    if (low..=high).contains(&v) {
        Ok(v)
    } else {
        Err(FieldError::new(
            field,
            format!(
                "must be between {} and {}, got {}",
                quoted(low),
                quoted(high),
                quoted(v)
            ),
        ))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn messages_name_the_field_and_the_rule() {
        let e = positive("loop_ohms", -3.0).unwrap_err();
        // A negative number is quoted with the minus sign, not a dash.
        assert_eq!(
            e.to_string(),
            "loop_ohms: must be greater than 0, got \u{2212}3"
        );
        // A number is quoted as typed, not with the float's last digits: 0.1 + 0.2 V.
        let e = within("tx_min_volts", 0.1 + 0.2 + 1000.0, 0.0, 1000.0).unwrap_err();
        assert_eq!(
            e.to_string(),
            "tx_min_volts: must be between 0 and 1000, got 1000.3"
        );
        let e = finite("supply_volts", f64::NAN).unwrap_err();
        assert!(e
            .to_string()
            .starts_with("supply_volts: must be a finite number"));
        assert!(within("cutoff_percent", 101.0, 0.0, 100.0).is_err());
        assert_eq!(within("cutoff_percent", 100.0, 0.0, 100.0), Ok(100.0));
        assert_eq!(non_negative("length_m", 0.0), Ok(0.0));
    }
}
