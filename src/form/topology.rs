//! The loop's topology as typed: which of the short list it is, what supplies it as wired,
//! a current source's compliance, a three-wire transmitter's own current, and the cable's
//! capacitance for HART. Read together with the [`LoopForm`] (supply, minimum, series
//! elements, cable) into one [`LoopConfig`], by the command line's budget and tag flags
//! and by the Power screen alike.
//!
//! Empty fields mean today's loop: a two-wire transmitter on a DC supply into a passive
//! input. A topology picked without sources gets that topology's own source; sources
//! listed (`supply`, `active-input`, `current-output`, or `none`) say what is wired in,
//! so two sources or none can be described and reported as a topology fault.

use super::loop_form::LoopForm;
use super::{Field, FormError};
use crate::budget::hart::HartCable;
use crate::budget::topology::{Compliance, Device, SourceKind, Topology, Wiring};
use crate::budget::LoopConfig;
use crate::number::{parse_in, parse_number};

/// The topology fields as typed.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct TopologyForm {
    /// A code from the short list ([`Topology::code`]); empty: from the sources.
    pub topology: String,
    /// What supplies the loop as wired, each a [`SourceKind::code`] or `none`; empty:
    /// the topology's own source.
    pub sources: Vec<String>,
    /// A current source's compliance, V at 20 mA.
    pub compliance_volts: String,
    /// A current source's maximum load, Ω.
    pub max_load_ohms: String,
    /// A three-wire transmitter's own supply current, mA.
    pub own_ma: String,
    /// Cable capacitance for HART, pF/m.
    pub cable_pf_per_m: String,
    /// Devices' capacitance for HART, nF.
    pub devices_nf: String,
}

/// The topology codes a technician may type, for messages.
fn topology_codes() -> String {
    Topology::ALL
        .iter()
        .map(|t| t.code())
        .collect::<Vec<_>>()
        .join(", ")
}

/// Read a topology code (case and spaces forgiven).
pub fn parse_topology(text: &str) -> Result<Option<Topology>, FormError> {
    let t = text.trim().to_lowercase().replace([' ', '_'], "-");
    if t.is_empty() {
        return Ok(None);
    }
    Topology::ALL
        .iter()
        .copied()
        .find(|x| x.code() == t || (t == "output" && *x == Topology::AnalogOutput))
        .map(Some)
        .ok_or_else(|| {
            FormError::new(
                Field::Topology,
                format!("must be one of {}, got '{}'", topology_codes(), text.trim()),
            )
        })
}

/// Read the sources as wired: `None` for none listed, `Some(vec![])` for `none`.
fn parse_sources(texts: &[String]) -> Result<Option<Vec<SourceKind>>, FormError> {
    let mut out = Vec::new();
    let mut none = false;
    for text in texts.iter().flat_map(|t| t.split(',')) {
        let t = text.trim().to_lowercase().replace([' ', '_'], "-");
        match t.as_str() {
            "" => continue,
            "supply" => out.push(SourceKind::Supply),
            "active-input" => out.push(SourceKind::ActiveInput),
            "current-output" => out.push(SourceKind::CurrentOutput),
            "none" => none = true,
            _ => {
                return Err(FormError::new(
                    Field::Source,
                    format!(
                        "must be supply, active-input, current-output or none, got '{}'",
                        text.trim()
                    ),
                ))
            }
        }
    }
    if none && !out.is_empty() {
        return Err(FormError::new(
            Field::Source,
            "none cannot be listed with another source",
        ));
    }
    out.dedup();
    Ok((none || !out.is_empty()).then_some(out))
}

fn optional_number(field: Field, text: &str) -> Result<Option<f64>, FormError> {
    if text.trim().is_empty() {
        return Ok(None);
    }
    parse_number(field.name(), text)
        .map(Some)
        .map_err(FormError::at(field))
}

impl TopologyForm {
    /// True when nothing about the topology was typed (today's loop).
    pub fn is_empty(&self) -> bool {
        self.topology.trim().is_empty()
            && self.sources.iter().all(|s| s.trim().is_empty())
            && [
                &self.compliance_volts,
                &self.max_load_ohms,
                &self.own_ma,
                &self.cable_pf_per_m,
                &self.devices_nf,
            ]
            .iter()
            .all(|t| t.trim().is_empty())
    }

    /// The wiring the fields describe.
    pub fn wiring(&self) -> Result<Wiring, FormError> {
        let topology = parse_topology(&self.topology)?;
        let sources = parse_sources(&self.sources)?;
        let mut wiring = match (topology, &sources) {
            (Some(t), _) => t.wiring(),
            (None, Some(s)) if s.contains(&SourceKind::CurrentOutput) => {
                Topology::AnalogOutput.wiring()
            }
            (None, _) => Wiring::default(),
        };
        if let Some(s) = &sources {
            if s.contains(&SourceKind::CurrentOutput) && !wiring.device.is_current_source() {
                return Err(FormError::new(
                    Field::Source,
                    format!(
                        "current-output needs a topology whose device drives the current (four-wire or analog-output), not {}",
                        topology.map(Topology::code).unwrap_or("two-wire")
                    ),
                ));
            }
            wiring.supply = s.contains(&SourceKind::Supply);
            wiring.active_input = s.contains(&SourceKind::ActiveInput);
        }
        if let Some(own) = optional_number(Field::OwnCurrent, &self.own_ma)? {
            match wiring.device {
                Device::ThreeWire { .. } => {
                    if !(0.0..=100.0).contains(&own) {
                        return Err(FormError::new(
                            Field::OwnCurrent,
                            format!("must be between 0 and 100 mA, got {own}"),
                        ));
                    }
                    wiring.device = Device::ThreeWire { own_ma: own };
                }
                _ => {
                    return Err(FormError::new(
                        Field::OwnCurrent,
                        "applies only to a three-wire transmitter (--topology three-wire)",
                    ))
                }
            }
        }
        Ok(wiring)
    }

    /// Build the loop from these fields and the loop form. The supply is asked for only
    /// when a supply or an active input is wired in, the transmitter minimum only for a
    /// two-wire or three-wire transmitter, the compliance only for a current source; a
    /// figure given where it does not apply is refused rather than ignored.
    pub fn parse(&self, loop_form: &LoopForm) -> Result<LoopConfig, FormError> {
        let wiring = self.wiring()?;
        let current_source = wiring.device.is_current_source();
        let uses_supply = wiring.supply || wiring.active_input;
        let mut form = loop_form.clone();
        if !uses_supply {
            if !form.supply.trim().is_empty() {
                return Err(FormError::new(
                    Field::Supply,
                    "is not used: nothing wired in takes a supply; list it as a source (supply or active-input) if one is wired in",
                ));
            }
            if !form.sag.trim().is_empty() {
                return Err(FormError::new(
                    Field::SupplySag,
                    "is not used: no supply is wired in",
                ));
            }
            form.supply = "0".to_string();
        }
        if current_source {
            if !form.tx_min.trim().is_empty() {
                return Err(FormError::new(
                    Field::TxMin,
                    "is not used: a current source has no lift-off voltage; its compliance counts its own drop",
                ));
            }
            form.tx_min = "0".to_string();
        }
        let mut config = form.parse()?;
        config.wiring = wiring;
        let volts = optional_compliance(Field::Compliance, &self.compliance_volts, "V")?;
        let ohms = optional_compliance(Field::Compliance, &self.max_load_ohms, "Ω")?;
        config.compliance = match (current_source, volts, ohms) {
            (true, Some(_), Some(_)) => {
                return Err(FormError::new(
                    Field::Compliance,
                    "give either the compliance volts or the maximum load, not both",
                ))
            }
            (true, Some(v), None) => Some(Compliance::Volts { volts: v }),
            (true, None, Some(r)) => Some(Compliance::MaxLoad { ohms: r }),
            (true, None, None) => {
                return Err(FormError::new(
                    Field::Compliance,
                    "is empty; a current source needs its compliance: volts at 20 mA (0 to 1000 V) or maximum load (0 to 50000 Ω)",
                ))
            }
            (false, None, None) => None,
            (false, _, _) => {
                return Err(FormError::new(
                    Field::Compliance,
                    "applies only to a loop driven by a current output (four-wire or analog-output)",
                ))
            }
        };
        let pf = optional_number(Field::CableCapacitance, &self.cable_pf_per_m)?;
        let nf = optional_number(Field::DevicesCapacitance, &self.devices_nf)?;
        config.hart_cable = match (pf, nf) {
            (Some(cable_pf_per_m), devices_nf) => Some(HartCable {
                cable_pf_per_m,
                devices_nf,
            }),
            (None, Some(_)) => {
                return Err(FormError::new(
                    Field::DevicesCapacitance,
                    "needs the cable's capacitance per metre as well",
                ))
            }
            (None, None) => None,
        };
        config
            .validate()
            .map_err(|e| FormError::from_core(e, Field::Topology))?;
        Ok(config)
    }
}

fn optional_compliance(field: Field, text: &str, unit: &str) -> Result<Option<f64>, FormError> {
    if text.trim().is_empty() {
        return Ok(None);
    }
    parse_in(field.name(), text, unit)
        .map(Some)
        .map_err(FormError::at(field))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::budget::topology::TopologyFault;

    fn output_loop() -> (TopologyForm, LoopForm) {
        (
            TopologyForm {
                sources: vec!["current-output".into()],
                compliance_volts: "18".into(),
                ..Default::default()
            },
            LoopForm::default(),
        )
    }

    #[test]
    fn empty_fields_are_todays_loop() {
        let loop_form = LoopForm {
            supply: "24".into(),
            tx_min: "10,5".into(),
            ..Default::default()
        };
        let c = TopologyForm::default().parse(&loop_form).unwrap();
        assert_eq!(c.wiring, Wiring::default());
        assert_eq!(c, loop_form.parse().unwrap());
    }

    #[test]
    fn a_current_output_needs_only_its_compliance() {
        let (t, l) = output_loop();
        let c = t.parse(&l).unwrap();
        assert_eq!(c.wiring.device, Device::AnalogOutput);
        assert_eq!(c.compliance, Some(Compliance::Volts { volts: 18.0 }));
        let mut l2 = l.clone();
        l2.supply = "24".into();
        assert_eq!(t.parse(&l2).unwrap_err().field, Field::Supply);
        let mut l3 = l;
        l3.tx_min = "10".into();
        assert_eq!(t.parse(&l3).unwrap_err().field, Field::TxMin);
        let t2 = TopologyForm {
            compliance_volts: String::new(),
            ..t
        };
        assert_eq!(
            t2.parse(&LoopForm::default()).unwrap_err().field,
            Field::Compliance
        );
    }

    #[test]
    fn sources_as_wired_describe_the_faults() {
        let loop_form = LoopForm {
            supply: "24".into(),
            tx_min: "10,5".into(),
            ..Default::default()
        };
        let two = TopologyForm {
            sources: vec!["supply".into(), "active-input".into()],
            ..Default::default()
        };
        let c = two.parse(&loop_form).unwrap();
        assert!(matches!(
            c.wiring.fault(),
            Some(TopologyFault::TwoSources { .. })
        ));
        let none = TopologyForm {
            sources: vec!["none".into()],
            ..Default::default()
        };
        let bare = LoopForm {
            tx_min: "10,5".into(),
            ..Default::default()
        };
        assert_eq!(
            none.parse(&bare).unwrap().wiring.fault(),
            Some(TopologyFault::NoSource)
        );
        let bad = TopologyForm {
            sources: vec!["battery".into()],
            ..Default::default()
        };
        assert_eq!(bad.parse(&loop_form).unwrap_err().field, Field::Source);
        let wrong = TopologyForm {
            topology: "three-wire".into(),
            sources: vec!["current-output".into()],
            ..Default::default()
        };
        assert_eq!(wrong.parse(&loop_form).unwrap_err().field, Field::Source);
        let typo = TopologyForm {
            topology: "five-wire".into(),
            ..Default::default()
        };
        let e = typo.parse(&loop_form).unwrap_err();
        assert_eq!(e.field, Field::Topology);
        assert!(e.reason.contains("four-wire"), "{e}");
    }
}
