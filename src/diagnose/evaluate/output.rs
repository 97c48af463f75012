//! Evaluations for loops driven by a current source — an analog output card driving a
//! positioner or an I/P converter, or a four-wire (self-powered) transmitter:
//!
//! - `output-follows-demand`: the current measured at the field device against the
//!   current the control system's demand asks for (the tag's signal span: 0 % → its low
//!   mA, 100 % → its high mA);
//! - `source-compliance`: the voltage across the source's output terminals against its
//!   compliance (the tag's loop data): a current source that cannot push its current
//!   through the loop sits at its compliance.
//!
//! Physics assumed (stated, as for every loop topology in [`crate::budget::topology`]): the
//! source regulates the current and supplies the voltage; the loop is one series circuit,
//! so the current is the same at the source and at the device unless a path leaves the
//! loop between them. A current source facing an open loop drives its terminals up to its
//! compliance (its open-circuit voltage is at or a little above it, from the output's data
//! sheet); one that is not driving at all leaves its terminals near 0 V.

use super::{Detail, Evaluated, Finding, NO_VOLTS_BELOW};
use crate::diagnose::measure::Measurement;
use crate::error::Result;
use crate::signal::{classify, SignalStatus};
use crate::tag::Tag;
use serde::{Deserialize, Serialize};

/// A source is taken to be at its compliance when the voltage across its output is within
/// this many volts of it, V (common practice: a meter's and a data sheet's tolerance, and
/// the few tenths of a volt an output stage loses as it runs out of headroom; set by us).
pub const AT_COMPLIANCE_WITHIN_VOLTS: f64 = 0.5;

/// The current at the field device against the control system's demand.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct OutputFinding {
    /// The demand the control system sends, % of the output span.
    pub demand_pct: f64,
    /// The current that demand asks for, mA.
    pub expected_ma: f64,
    /// The current measured at the field device, mA.
    pub measured_ma: f64,
    /// Measured − expected, % of span.
    pub error_pct: f64,
    /// The allowance used (the tag's tolerance plus the meter's), % of span.
    pub tolerance_pct: f64,
    /// `no-current-at-device`, `follows-demand`, `below-demand` or `above-demand`.
    pub outcome: String,
}

/// Judge the current at the device against the demand.
pub(super) fn follows_demand(
    tag: &Tag,
    demand_pct: f64,
    measured_ma: f64,
    tolerance_pct: f64,
) -> Result<Evaluated> {
    let demand_pct = Measurement::DemandPct.accept(demand_pct)?;
    let measured_ma = Measurement::DeviceMa.accept(measured_ma)?;
    let span = &tag.scale.signal;
    let expected_ma = span.ma_at(demand_pct);
    let error_pct = (measured_ma - expected_ma) / span.width_ma() * 100.0;
    let outcome = if classify(measured_ma, &tag.bands, span)? == SignalStatus::NoLoopCurrent {
        "no-current-at-device"
    } else if error_pct.abs() <= tolerance_pct {
        "follows-demand"
    } else if error_pct < 0.0 {
        "below-demand"
    } else {
        "above-demand"
    };
    Ok(Evaluated {
        outcome,
        findings: vec![Finding::new(Detail::Output(OutputFinding {
            demand_pct,
            expected_ma,
            measured_ma,
            error_pct,
            tolerance_pct,
            outcome: outcome.to_string(),
        }))],
    })
}

/// The voltage across a current source's output against its compliance.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ComplianceFinding {
    /// Measured across the source's output terminals, V.
    pub measured_v: f64,
    /// The source's compliance from the tag's loop data, V; `None` when not recorded.
    pub compliance_v: Option<f64>,
    /// Compliance − measured, V (how much the source still has in hand).
    pub headroom_v: Option<f64>,
    /// The current measured at the device at the same moment, mA, when given.
    pub current_ma: Option<f64>,
    /// The load the source sees, measured volts ÷ current, Ω (when a current was given
    /// and is above 0.1 mA).
    pub load_ohms: Option<f64>,
    /// `source-dead` (no voltage at all), `source-has-headroom`, `source-at-compliance` or
    /// `compliance-not-recorded`.
    pub outcome: String,
}

/// Judge the voltage across the source's output against its compliance.
pub(super) fn compliance(
    tag: &Tag,
    measured_v: f64,
    current_ma: Option<f64>,
) -> Result<ComplianceFinding> {
    let measured_v = Measurement::SourceV.accept(measured_v)?;
    let current_ma = current_ma
        .map(|i| Measurement::DeviceMa.accept(i))
        .transpose()?;
    let compliance_v = tag
        .loop_config
        .as_ref()
        .and_then(|c| c.compliance)
        .map(|c| c.volts());
    let headroom_v = compliance_v.map(|c| c - measured_v);
    let load_ohms = current_ma
        .filter(|i| *i > 0.1)
        .map(|i| measured_v / i * 1000.0);
    let outcome = match headroom_v {
        _ if measured_v < NO_VOLTS_BELOW => "source-dead",
        Some(h) if h <= AT_COMPLIANCE_WITHIN_VOLTS => "source-at-compliance",
        Some(_) => "source-has-headroom",
        None => "compliance-not-recorded",
    };
    Ok(ComplianceFinding {
        measured_v,
        compliance_v,
        headroom_v,
        current_ma,
        load_ohms,
        outcome: outcome.to_string(),
    })
}
