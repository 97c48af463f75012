//! How a loop is built: what drives its current and what supplies its voltage.
//!
//! A 4–20 mA loop needs exactly one thing that supplies its voltage. A two-wire (or
//! three-wire) transmitter only *regulates* the current: something else must supply the
//! volts, a DC supply wired into the loop or an input card that powers the loop itself
//! (an active input). A four-wire transmitter, a control system's analog output and an
//! isolator's output side *are* current sources: they drive the current from their own
//! supply, up to their compliance, and want a passive receiver.
//!
//! Two things supplying one loop (an active input card with an external supply as well, a
//! four-wire output into an active input) and nothing supplying it (a two-wire transmitter
//! into a passive input with no supply) are classic commissioning faults; [`Wiring::fault`]
//! reports them as a typed [`TopologyFault`], worded in `crate::view::wording::power`.
//!
//! Cases assumed, stated here once:
//! - a current source's compliance is the same at every current up to its highest one
//!   (its output stage runs from a fixed internal supply); a source given as a maximum
//!   load in Ω is taken to quote it at 20 mA, so its compliance is that load × 20 mA
//!   (data sheets quote the maximum load at full scale; a source that quotes it at
//!   another current is entered as compliance volts instead);
//! - the supply's sag (`supply_tolerance_percent`) applies to a DC supply or an active
//!   input's supply, never to a current source's compliance, which is the source's own
//!   data;
//! - a three-wire transmitter's signal current leaves on the supply conductor and returns
//!   through the receiver to the supply's negative; its own supply current flows in the
//!   supply conductor as well and returns on the common, so the supply conductor carries
//!   both and the transmitter loses that extra I·R too (Kirchhoff's current law).

use crate::error::{within, FieldError, Result};
use serde::{Deserialize, Serialize};

/// What is at the driving end of the loop, from the short list a technician picks from.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize, Default)]
#[serde(tag = "kind", rename_all = "kebab-case")]
pub enum Device {
    /// A two-wire (loop-powered) transmitter: regulates the current, needs its minimum
    /// terminal voltage (lift-off) from a supply or an active input. Today's default.
    #[default]
    TwoWire,
    /// A three-wire transmitter: supply, common and signal; the signal returns on the
    /// common. Needs its minimum from the supply like a two-wire one.
    ThreeWire {
        /// The transmitter's own supply current, mA, which shares the supply conductor
        /// with the signal (0 when not known: the budget then counts the signal alone).
        own_ma: f64,
    },
    /// A four-wire (self-powered) transmitter: its active output is the current source.
    FourWire,
    /// A control system's analog output (or an isolator's output side) driving field
    /// devices: positioners, I/P converters, indicators. Two positioners in series on one
    /// output is split range.
    AnalogOutput,
}

impl Device {
    /// True when the device drives the current from its own supply (a current source).
    pub fn is_current_source(self) -> bool {
        matches!(self, Device::FourWire | Device::AnalogOutput)
    }

    /// The transmitter's own supply current in the supply conductor, mA (three-wire only).
    pub fn own_ma(self) -> f64 {
        match self {
            Device::ThreeWire { own_ma } => own_ma,
            _ => 0.0,
        }
    }

    /// Stable code for JSON and stored records.
    pub fn code(self) -> &'static str {
        match self {
            Device::TwoWire => "two-wire",
            Device::ThreeWire { .. } => "three-wire",
            Device::FourWire => "four-wire",
            Device::AnalogOutput => "analog-output",
        }
    }
}

/// Something in the loop that supplies its voltage.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum SourceKind {
    /// A DC supply wired into the loop (today's default).
    Supply,
    /// An input card that powers the loop itself.
    ActiveInput,
    /// A current source: a four-wire transmitter's output, an analog output card or an
    /// isolator's output side.
    CurrentOutput,
}

impl SourceKind {
    /// Stable code for JSON and the command line (`supply`, `active-input`,
    /// `current-output`).
    pub fn code(self) -> &'static str {
        match self {
            SourceKind::Supply => "supply",
            SourceKind::ActiveInput => "active-input",
            SourceKind::CurrentOutput => "current-output",
        }
    }
}

/// How a current source states what it can drive, as its data sheet gives it.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "kebab-case")]
pub enum Compliance {
    /// Volts the source can drive at 20 mA.
    Volts {
        /// Compliance, V.
        volts: f64,
    },
    /// The largest load it drives 20 mA into.
    MaxLoad {
        /// Maximum load, Ω.
        ohms: f64,
    },
}

/// Highest compliance accepted, V.
pub const MAX_COMPLIANCE_VOLTS: f64 = 1000.0;
/// Highest maximum load accepted, Ω.
pub const MAX_LOAD_OHMS_LIMIT: f64 = 50_000.0;

impl Compliance {
    /// The volts the source has at every current up to its highest (see the module's
    /// assumptions): the given volts, or the maximum load × 20 mA (Ohm's law).
    pub fn volts(self) -> f64 {
        match self {
            Compliance::Volts { volts } => volts,
            Compliance::MaxLoad { ohms } => ohms * 20.0 / 1000.0,
        }
    }

    /// Check the figure; the error names the field and the allowed range.
    pub fn validate(self) -> Result<()> {
        let (field, value, hi) = match self {
            Compliance::Volts { volts } => ("compliance_volts", volts, MAX_COMPLIANCE_VOLTS),
            Compliance::MaxLoad { ohms } => ("max_load_ohms", ohms, MAX_LOAD_OHMS_LIMIT),
        };
        within(field, value, 0.0, hi)?;
        if value <= 0.0 {
            return Err(FieldError::new(
                field,
                format!("must be greater than 0 and at most {hi}, got 0"),
            ));
        }
        Ok(())
    }
}

/// How the loop is wired: the driving device, and what else supplies voltage.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct Wiring {
    /// What drives or regulates the current.
    #[serde(default)]
    pub device: Device,
    /// A separate DC supply is wired into the loop.
    #[serde(default = "yes")]
    pub supply: bool,
    /// The receiving input card powers the loop (an active input).
    #[serde(default)]
    pub active_input: bool,
}

fn yes() -> bool {
    true
}

impl Default for Wiring {
    /// Today's loop: a two-wire transmitter, a DC supply, a passive input.
    fn default() -> Wiring {
        Wiring {
            device: Device::TwoWire,
            supply: true,
            active_input: false,
        }
    }
}

/// A topology fault: the loop as wired cannot work whatever the figures.
#[derive(Debug, Clone, PartialEq, Eq, Serialize, Deserialize)]
#[serde(tag = "code", rename_all = "kebab-case")]
pub enum TopologyFault {
    /// Nothing supplies the loop: a two-wire or three-wire transmitter with neither a
    /// supply nor an active input.
    NoSource,
    /// More than one thing supplies the loop, named in loop order.
    TwoSources {
        /// The sources wired in.
        sources: Vec<SourceKind>,
    },
}

impl TopologyFault {
    /// Stable code for JSON (`no-source`, `two-sources`).
    pub fn code(&self) -> &'static str {
        match self {
            TopologyFault::NoSource => "no-source",
            TopologyFault::TwoSources { .. } => "two-sources",
        }
    }
}

/// The short list of loop topologies, named as a technician would pick one.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum Topology {
    /// Two-wire transmitter on a DC supply into a passive input (today's).
    TwoWireSupply,
    /// Two-wire transmitter on an input card that powers the loop.
    TwoWireActiveInput,
    /// Four-wire (self-powered) transmitter driving a passive input.
    FourWire,
    /// Three-wire transmitter on a DC supply.
    ThreeWire,
    /// An analog output driving one or more field devices (split range: two in series).
    AnalogOutput,
    /// Wired in a way that cannot work (see [`TopologyFault`]).
    Faulty,
}

impl Topology {
    /// Every topology that can work, in the order the picker lists them.
    pub const ALL: [Topology; 5] = [
        Topology::TwoWireSupply,
        Topology::TwoWireActiveInput,
        Topology::FourWire,
        Topology::ThreeWire,
        Topology::AnalogOutput,
    ];

    /// Stable code for the command line and JSON.
    pub fn code(self) -> &'static str {
        match self {
            Topology::TwoWireSupply => "two-wire",
            Topology::TwoWireActiveInput => "two-wire-active-input",
            Topology::FourWire => "four-wire",
            Topology::ThreeWire => "three-wire",
            Topology::AnalogOutput => "analog-output",
            Topology::Faulty => "faulty",
        }
    }

    /// The wiring this topology stands for (a three-wire transmitter's own current 0).
    pub fn wiring(self) -> Wiring {
        let (device, supply, active_input) = match self {
            Topology::TwoWireSupply | Topology::Faulty => (Device::TwoWire, true, false),
            Topology::TwoWireActiveInput => (Device::TwoWire, false, true),
            Topology::FourWire => (Device::FourWire, false, false),
            Topology::ThreeWire => (Device::ThreeWire { own_ma: 0.0 }, true, false),
            Topology::AnalogOutput => (Device::AnalogOutput, false, false),
        };
        Wiring {
            device,
            supply,
            active_input,
        }
    }
}

impl Wiring {
    /// Everything that supplies voltage to the loop as wired, in loop order: the device's
    /// own output when it is a current source, then the input card, then a supply.
    pub fn sources(&self) -> Vec<SourceKind> {
        let mut out = Vec::new();
        if self.device.is_current_source() {
            out.push(SourceKind::CurrentOutput);
        }
        if self.active_input {
            out.push(SourceKind::ActiveInput);
        }
        if self.supply {
            out.push(SourceKind::Supply);
        }
        out
    }

    /// The one source, or the topology fault.
    pub fn source(&self) -> std::result::Result<SourceKind, TopologyFault> {
        let sources = self.sources();
        match sources.as_slice() {
            [] => Err(TopologyFault::NoSource),
            [one] => Ok(*one),
            _ => Err(TopologyFault::TwoSources { sources }),
        }
    }

    /// The topology fault, if the loop as wired has one.
    pub fn fault(&self) -> Option<TopologyFault> {
        self.source().err()
    }

    /// The topology from the short list this wiring is.
    pub fn topology(&self) -> Topology {
        match (self.device, self.source()) {
            (_, Err(_)) => Topology::Faulty,
            (Device::TwoWire, Ok(SourceKind::ActiveInput)) => Topology::TwoWireActiveInput,
            (Device::TwoWire, Ok(_)) => Topology::TwoWireSupply,
            (Device::ThreeWire { .. }, Ok(_)) => Topology::ThreeWire,
            (Device::FourWire, Ok(_)) => Topology::FourWire,
            (Device::AnalogOutput, Ok(_)) => Topology::AnalogOutput,
        }
    }

    /// Check the three-wire transmitter's own current (0–100 mA).
    pub fn validate(&self) -> Result<()> {
        if let Device::ThreeWire { own_ma } = self.device {
            within("own_ma", own_ma, 0.0, 100.0)?;
        }
        Ok(())
    }
}

/// A loop through an isolator or signal splitter: the isolator cuts it into an input side
/// (usually the isolator powering the transmitter, an active input) and one or more
/// output sides (each a current source with the isolator's compliance driving its
/// receiver). Each side is budgeted on its own; the loop is good only when every side is.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct IsolatedLoop {
    /// The input side, from the transmitter to the isolator's input.
    pub input: super::LoopConfig,
    /// Each output side, from an isolator output to its receiver.
    pub outputs: Vec<super::LoopConfig>,
}

/// The budgets of a loop through an isolator, side by side.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct IsolatedBudget {
    /// The input side's budget.
    pub input: super::Budget,
    /// Each output side's budget, in order.
    pub outputs: Vec<super::Budget>,
    /// Every side has enough voltage at 20 mA and at its fault current.
    pub ok: bool,
}

/// Most output sides accepted on one isolator or splitter.
pub const MAX_OUTPUT_SIDES: usize = 8;

impl IsolatedLoop {
    /// Budget each side. The error names the side (`output side 2: compliance_volts …`);
    /// an output side must be driven by a current output (the isolator).
    pub fn budget(&self) -> Result<IsolatedBudget> {
        if self.outputs.is_empty() || self.outputs.len() > MAX_OUTPUT_SIDES {
            return Err(FieldError::new(
                "output sides",
                format!(
                    "must be 1 to {MAX_OUTPUT_SIDES}, got {}",
                    self.outputs.len()
                ),
            ));
        }
        let input = self
            .input
            .budget()
            .map_err(|e| FieldError::new(format!("input side: {}", e.field), e.reason))?;
        let mut outputs = Vec::with_capacity(self.outputs.len());
        for (i, side) in self.outputs.iter().enumerate() {
            let name = format!("output side {}", i + 1);
            if side.wiring.device != Device::AnalogOutput {
                return Err(FieldError::new(
                    name,
                    "is driven by the isolator: give it as a current output with the isolator's compliance",
                ));
            }
            outputs.push(
                side.budget()
                    .map_err(|e| FieldError::new(format!("{name}: {}", e.field), e.reason))?,
            );
        }
        let ok = input.ok && outputs.iter().all(|b| b.ok);
        Ok(IsolatedBudget { input, outputs, ok })
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn each_listed_topology_has_exactly_one_source() {
        for t in Topology::ALL {
            assert_eq!(t.wiring().fault(), None, "{t:?}");
            assert_eq!(t.wiring().topology(), t);
        }
    }

    #[test]
    fn the_classic_commissioning_faults() {
        // An active input card with an external supply as well.
        let w = Wiring {
            active_input: true,
            ..Wiring::default()
        };
        assert_eq!(
            w.fault(),
            Some(TopologyFault::TwoSources {
                sources: vec![SourceKind::ActiveInput, SourceKind::Supply]
            })
        );
        // A four-wire output into an active input.
        let w = Wiring {
            active_input: true,
            ..Topology::FourWire.wiring()
        };
        assert_eq!(w.fault().map(|f| f.code()), Some("two-sources"));
        // A two-wire transmitter into a passive input with no supply.
        let w = Wiring {
            supply: false,
            ..Wiring::default()
        };
        assert_eq!(w.fault(), Some(TopologyFault::NoSource));
        assert_eq!(w.topology(), Topology::Faulty);
    }

    #[test]
    fn a_max_load_is_compliance_at_20_ma() {
        // Ohm's law: 600 Ω × 20 mA = 12 V.
        assert_eq!(Compliance::MaxLoad { ohms: 600.0 }.volts(), 12.0);
        assert_eq!(
            Compliance::Volts { volts: 0.0 }
                .validate()
                .unwrap_err()
                .field,
            "compliance_volts"
        );
        assert_eq!(
            Compliance::MaxLoad { ohms: f64::NAN }
                .validate()
                .unwrap_err()
                .field,
            "max_load_ohms"
        );
    }
}
