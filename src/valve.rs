//! A control valve as a tag records it: how it moves with its signal (air to open or air
//! to close), where it fails, and, for one valve of a split-range pair, its part of the
//! signal. Used by the tag register and by the stroke check ([`crate::stroke`]).

use crate::error::{within, FieldError, Result};
use serde::{Deserialize, Serialize};

/// How the valve moves as the air to its actuator rises.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum ValveAction {
    /// Air to open: a rising signal opens the valve; its spring closes it.
    AirToOpen,
    /// Air to close: a rising signal closes the valve; its spring opens it.
    AirToClose,
}

impl ValveAction {
    /// Stable code (`air-to-open`, `air-to-close`).
    pub fn code(self) -> &'static str {
        match self {
            ValveAction::AirToOpen => "air-to-open",
            ValveAction::AirToClose => "air-to-close",
        }
    }

    /// Read a code as typed (`air-to-open`, `ato`, `air to close`, `atc`).
    pub fn parse(text: &str) -> Result<ValveAction> {
        match text.trim().to_lowercase().replace([' ', '_'], "-").as_str() {
            "air-to-open" | "ato" => Ok(ValveAction::AirToOpen),
            "air-to-close" | "atc" => Ok(ValveAction::AirToClose),
            _ => Err(FieldError::new(
                "action",
                format!("must be air-to-open or air-to-close, got '{}'", text.trim()),
            )),
        }
    }
}

/// Where the valve goes when it loses its signal or its air.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum FailPosition {
    /// Fails closed.
    Closed,
    /// Fails open.
    Open,
    /// Stays where it was (fails last).
    Last,
}

impl FailPosition {
    /// Stable code (`closed`, `open`, `last`).
    pub fn code(self) -> &'static str {
        match self {
            FailPosition::Closed => "closed",
            FailPosition::Open => "open",
            FailPosition::Last => "last",
        }
    }

    /// Read a code as typed (`closed`, `fc`, `open`, `fo`, `last`, `fl`).
    pub fn parse(text: &str) -> Result<FailPosition> {
        match text.trim().to_lowercase().as_str() {
            "closed" | "fc" | "fail-closed" => Ok(FailPosition::Closed),
            "open" | "fo" | "fail-open" => Ok(FailPosition::Open),
            "last" | "fl" | "fail-last" => Ok(FailPosition::Last),
            _ => Err(FieldError::new(
                "fail position",
                format!("must be closed, open or last, got '{}'", text.trim()),
            )),
        }
    }
}

/// What a tag records of its valve.
#[derive(Debug, Clone, Copy, PartialEq, Default, Serialize, Deserialize)]
pub struct Valve {
    /// How it moves with its signal, when known.
    #[serde(default)]
    pub action: Option<ValveAction>,
    /// Where it fails, when known.
    #[serde(default)]
    pub fail: Option<FailPosition>,
    /// For one valve of a split-range pair, its part of the signal, mA (low, high).
    #[serde(default)]
    pub split_ma: Option<(f64, f64)>,
}

impl Valve {
    /// Check the split range: within 0–50 mA, low below high by at least 0.5 mA.
    pub fn validate(&self) -> Result<()> {
        if let Some((lo, hi)) = self.split_ma {
            within("split (low mA)", lo, 0.0, 50.0)?;
            within("split (high mA)", hi, 0.0, 50.0)?;
            if hi - lo < 0.5 {
                return Err(FieldError::new(
                    "split",
                    format!(
                        "must be low..high mA with high at least 0.5 mA above low, got {lo}..{hi}"
                    ),
                ));
            }
        }
        Ok(())
    }
}
