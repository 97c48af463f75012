//! Loop voltage budget: does the transmitter keep enough volts at its terminals?
//!
//! A two-wire transmitter regulates the loop current whatever the supply and load, as long
//! as its terminals keep at least its minimum (lift-off) voltage. Everything else in series
//! takes its share: resistors take I·R, loop-powered indicators and isolators a roughly
//! fixed drop, and the cable I·R of both conductors. The budget is worked at the *lowest*
//! supply (nominal minus tolerance) and at three currents: 4 mA, 20 mA and the upscale
//! fault current, because a loop that reaches 20 mA but not its fault current hides a
//! failure from the control system. The fault current is the device's configured value
//! when the loop gives one, otherwise [`DEFAULT_FAULT_MA`], and the budget says which
//! ([`Budget::fault_ma_is_default`]) so the screens can ask for the configured value.
//!
//! Maximum loop resistance = (supply − transmitter minimum − fixed drops) / 20 mA (common
//! practice). The same figures are worked at the fault current too: the spare load and the
//! longest cable that still leave the transmitter its minimum *at the fault current*, the
//! ones to quote beside a verdict given at that current, since adding the 20 mA spare
//! would starve an upscale failure. Cable lengths are by voltage only; HART and cable
//! capacitance set their own limits. A supply at or below the transmitter minimum is a
//! valid input: the answer is "not enough", with the numbers.
//!
//! How the loop is built ([`topology`]) decides what supplies its voltage and which limit
//! applies: a supply (or an input card that powers the loop) against a two-wire or
//! three-wire transmitter's minimum, or a current source's compliance (a four-wire
//! transmitter, an analog output, an isolator's output side) against everything it
//! drives. The figures (verdict, headroom, maximum load, spare, longest cable) mean the
//! same for every topology: the margin of whatever drives the current. A loop wired with
//! two sources or none gets its figures worked from the first source wired (or from 0 V)
//! and a [`BudgetLimit::Topology`] verdict that is never "ok". A loop through an isolator
//! is budgeted side by side ([`topology::IsolatedLoop`]). HART's cable limit by RC time
//! constant is in [`hart`].
//!
//! The budget returns numbers and codes: what limits the loop is a [`BudgetLimit`] (with
//! the element taking most of the supply), the HART verdict a [`HartVerdict`]; the words
//! are written once in `crate::view::wording::power`.

pub mod hart;
pub mod topology;

use crate::display;
use crate::error::{finite, non_negative, within, FieldError, Result};
use crate::wire::{self, Conductor};
use hart::{Binding, HartCable, HartCableLimit};
use serde::{Deserialize, Serialize};
use topology::{Compliance, Device, SourceKind, Topology, TopologyFault, Wiring};

/// HART needs at least this much loop resistance to develop its signal (HART physical
/// layer, HCF_SPEC-54: 230 Ω minimum; 250 Ω is the usual resistor).
pub const HART_MIN_OHMS: f64 = 230.0;
/// Upper end of the HART loop-resistance window, Ω. From memory of the HART physical
/// layer, unconfirmed: kept configurable per loop.
pub const HART_MAX_OHMS: f64 = 1100.0;
/// Upscale fault current used when the tag does not say, mA (common practice: NE 43
/// devices drive ≥ 21.0 mA; many go to about 22).
pub const DEFAULT_FAULT_MA: f64 = 22.0;

/// What a series element in the loop costs: ohms, or a fixed volt drop.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "kebab-case")]
pub enum ElementKind {
    /// A resistance: receiver input resistor, HART resistor, barrier end-to-end resistance.
    Resistance {
        /// Ohms.
        ohms: f64,
    },
    /// A fixed voltage drop: loop-powered indicator, isolator, diode.
    Drop {
        /// Volts dropped whatever the current.
        volts: f64,
    },
}

/// One device in series in the loop, named as the technician knows it.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct SeriesElement {
    /// e.g. "PLC input", "IS barrier", "field indicator".
    pub name: String,
    /// Its cost in ohms or volts.
    #[serde(flatten)]
    pub kind: ElementKind,
}

impl SeriesElement {
    /// A resistive element.
    pub fn ohms(name: &str, ohms: f64) -> SeriesElement {
        SeriesElement {
            name: name.to_string(),
            kind: ElementKind::Resistance { ohms },
        }
    }

    /// A fixed-drop element.
    pub fn drop(name: &str, volts: f64) -> SeriesElement {
        SeriesElement {
            name: name.to_string(),
            kind: ElementKind::Drop { volts },
        }
    }

    /// Volts this element takes at `ma`.
    pub fn volts_at(&self, ma: f64) -> f64 {
        match self.kind {
            ElementKind::Resistance { ohms } => ohms * ma / 1000.0,
            ElementKind::Drop { volts } => volts,
        }
    }
}

/// The field cable between the transmitter and the rest of the loop.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct Cable {
    /// One-way route length, m (the loop sees twice this).
    pub one_way_m: f64,
    /// Conductor size.
    pub conductor: Conductor,
    /// Conductor temperature, °C (20 unless known).
    pub temp_c: f64,
}

/// Everything about a loop's power, as entered for a tag.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(from = "StoredLoopConfig", into = "StoredLoopConfig")]
pub struct LoopConfig {
    /// Nominal supply, V.
    pub supply_volts: f64,
    /// How far below nominal the supply may sag, % (0 if regulated and trusted).
    #[serde(default)]
    pub supply_tolerance_percent: f64,
    /// The transmitter's minimum terminal voltage (lift-off), V, from its datasheet.
    pub tx_min_volts: f64,
    /// Series elements other than the cable.
    #[serde(default)]
    pub elements: Vec<SeriesElement>,
    /// The field cable, if known.
    #[serde(default)]
    pub cable: Option<Cable>,
    /// Upscale fault current the transmitter is configured to drive, mA; `None` when
    /// nobody gave it, and the budget then works at [`DEFAULT_FAULT_MA`] and says so.
    pub fault_ma: Option<f64>,
    /// HART communication window, Ω (low, high).
    pub hart_window_ohms: (f64, f64),
    /// How the loop is wired: the driving device and what supplies the voltage (today's
    /// two-wire transmitter on a DC supply unless told).
    pub wiring: Wiring,
    /// A current source's compliance (four-wire transmitter, analog output, isolator
    /// output side); `None` for a loop supplied by a supply or an active input.
    pub compliance: Option<Compliance>,
    /// The cable's capacitance for HART's RC limit, when given.
    pub hart_cable: Option<HartCable>,
}

fn default_fault_ma() -> f64 {
    DEFAULT_FAULT_MA
}

fn default_hart_window() -> (f64, f64) {
    (HART_MIN_OHMS, HART_MAX_OHMS)
}

/// A [`LoopConfig`] as it is stored. `fault_ma` is always written as the current the
/// budget works at, so a build from before `fault_ma_configured` reads the same loop;
/// `fault_ma_configured` says whether a person gave it. Those older builds wrote
/// `fault_ma` every time, 22.0 when nobody had typed one, so a record without the flag
/// counts as configured only when its value differs from the default.
#[derive(Serialize, Deserialize)]
struct StoredLoopConfig {
    supply_volts: f64,
    #[serde(default)]
    supply_tolerance_percent: f64,
    tx_min_volts: f64,
    #[serde(default)]
    elements: Vec<SeriesElement>,
    #[serde(default)]
    cable: Option<Cable>,
    #[serde(default = "default_fault_ma")]
    fault_ma: f64,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    fault_ma_configured: Option<bool>,
    #[serde(default = "default_hart_window")]
    hart_window_ohms: (f64, f64),
    #[serde(default, skip_serializing_if = "is_default_wiring")]
    wiring: Wiring,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    compliance: Option<Compliance>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    hart_cable: Option<HartCable>,
}

fn is_default_wiring(w: &Wiring) -> bool {
    *w == Wiring::default()
}

impl From<StoredLoopConfig> for LoopConfig {
    fn from(s: StoredLoopConfig) -> LoopConfig {
        let configured = s
            .fault_ma_configured
            .unwrap_or(s.fault_ma != DEFAULT_FAULT_MA);
        LoopConfig {
            supply_volts: s.supply_volts,
            supply_tolerance_percent: s.supply_tolerance_percent,
            tx_min_volts: s.tx_min_volts,
            elements: s.elements,
            cable: s.cable,
            fault_ma: configured.then_some(s.fault_ma),
            hart_window_ohms: s.hart_window_ohms,
            wiring: s.wiring,
            compliance: s.compliance,
            hart_cable: s.hart_cable,
        }
    }
}

impl From<LoopConfig> for StoredLoopConfig {
    fn from(c: LoopConfig) -> StoredLoopConfig {
        StoredLoopConfig {
            fault_ma: c.fault_current_ma(),
            fault_ma_configured: Some(c.fault_ma.is_some()),
            supply_volts: c.supply_volts,
            supply_tolerance_percent: c.supply_tolerance_percent,
            tx_min_volts: c.tx_min_volts,
            elements: c.elements,
            cable: c.cable,
            hart_window_ohms: c.hart_window_ohms,
            wiring: c.wiring,
            compliance: c.compliance,
            hart_cable: c.hart_cable,
        }
    }
}

impl LoopConfig {
    /// A loop with a supply and a transmitter, nothing else yet.
    pub fn new(supply_volts: f64, tx_min_volts: f64) -> LoopConfig {
        LoopConfig {
            supply_volts,
            supply_tolerance_percent: 0.0,
            tx_min_volts,
            elements: Vec::new(),
            cable: None,
            fault_ma: None,
            hart_window_ohms: default_hart_window(),
            wiring: Wiring::default(),
            compliance: None,
            hart_cable: None,
        }
    }

    /// A loop driven by a current source (a four-wire transmitter's output when `device`
    /// is [`Device::FourWire`], else an analog output or an isolator's output side) with
    /// this compliance, nothing in series yet. The supply and transmitter-minimum fields
    /// are unused (0).
    pub fn current_output(device: Device, compliance: Compliance) -> LoopConfig {
        let mut c = LoopConfig::new(0.0, 0.0);
        c.wiring = Wiring {
            device,
            supply: false,
            active_input: false,
        };
        c.compliance = Some(compliance);
        c
    }

    /// The source whose figures the budget is worked from: the one source; with two, the
    /// first wired; with none, `None` (0 V).
    pub fn working_source(&self) -> Option<SourceKind> {
        match self.wiring.source() {
            Ok(s) => Some(s),
            Err(TopologyFault::TwoSources { sources }) => sources.first().copied(),
            Err(TopologyFault::NoSource) => None,
        }
    }

    /// Volts the working source has at its lowest (a supply less its sag, or a current
    /// source's compliance; 0 with no source), and the minimum the driving device needs
    /// at its own terminals (a two-wire or three-wire transmitter's minimum; 0 for a
    /// current source, whose compliance already counts its own drop).
    fn available_and_needed_volts(&self) -> (f64, f64) {
        let need = if self.wiring.device.is_current_source() {
            0.0
        } else {
            self.tx_min_volts
        };
        match self.working_source() {
            Some(SourceKind::Supply) | Some(SourceKind::ActiveInput) => (
                self.supply_volts * (1.0 - self.supply_tolerance_percent / 100.0),
                need,
            ),
            Some(SourceKind::CurrentOutput) => {
                (self.compliance.map(Compliance::volts).unwrap_or(0.0), 0.0)
            }
            None => (0.0, need),
        }
    }

    /// The upscale fault current the budget works at, mA: the configured one, else
    /// [`DEFAULT_FAULT_MA`].
    pub fn fault_current_ma(&self) -> f64 {
        self.fault_ma.unwrap_or(DEFAULT_FAULT_MA)
    }

    /// Check every field; the error names the first one that is wrong.
    pub fn validate(&self) -> Result<()> {
        within("supply_volts", self.supply_volts, 0.0, 1000.0)?;
        within(
            "supply_tolerance_percent",
            self.supply_tolerance_percent,
            0.0,
            50.0,
        )?;
        within("tx_min_volts", self.tx_min_volts, 0.0, 1000.0)?;
        if let Some(ma) = self.fault_ma {
            // Upscale: at or above the top of the signal, where the budget is tightest.
            within("fault_ma", ma, 20.0, 50.0)?;
        }
        for (i, e) in self.elements.iter().enumerate() {
            let field = if e.name.trim().is_empty() {
                format!("element {}", i + 1)
            } else {
                e.name.clone()
            };
            match e.kind {
                ElementKind::Resistance { ohms } => {
                    non_negative(&field, ohms)?;
                }
                ElementKind::Drop { volts } => {
                    non_negative(&field, volts)?;
                }
            }
        }
        if let Some(c) = &self.cable {
            non_negative("cable_m", c.one_way_m)?;
            within(
                "temp_c",
                c.temp_c,
                wire::TEMP_RANGE_C.0,
                wire::TEMP_RANGE_C.1,
            )?;
            if let Conductor::Mm2(a) = c.conductor {
                Conductor::mm2(a)?;
            } else if let Conductor::Awg(g) = c.conductor {
                Conductor::awg(g)?;
            }
        }
        self.wiring.validate()?;
        match (self.wiring.device.is_current_source(), self.compliance) {
            (true, Some(c)) => c.validate()?,
            (true, None) => {
                return Err(FieldError::new(
                    "compliance_volts",
                    "is missing: a current output (four-wire transmitter, analog output, isolator output side) needs its compliance, volts at 20 mA (0 to 1000 V) or maximum load (0 to 50000 Ω)",
                ))
            }
            (false, Some(_)) => {
                return Err(FieldError::new(
                    "compliance_volts",
                    "applies only to a loop driven by a current output; a supply or an active input gives its volts as the supply",
                ))
            }
            (false, None) => {}
        }
        if let Some(h) = &self.hart_cable {
            h.validate()?;
        }
        let (lo, hi) = self.hart_window_ohms;
        non_negative("hart_min_ohms", lo)?;
        finite("hart_max_ohms", hi)?;
        if hi <= lo {
            return Err(FieldError::new(
                "hart_max_ohms",
                format!(
                    "{} Ω must be above the HART minimum {} Ω",
                    display::quoted(hi),
                    display::quoted(lo)
                ),
            ));
        }
        Ok(())
    }

    /// Work out the budget. Errors only for invalid input, never for "not enough volts".
    pub fn budget(&self) -> Result<Budget> {
        self.validate()?;
        let (lowest_supply, need_volts) = self.available_and_needed_volts();
        let current_source = self.working_source() == Some(SourceKind::CurrentOutput);
        let cable_ohms = match &self.cable {
            Some(c) => wire::loop_ohms(&c.conductor, c.one_way_m, c.temp_c)?,
            None => 0.0,
        };
        let element_ohms: f64 = self
            .elements
            .iter()
            .map(|e| match e.kind {
                ElementKind::Resistance { ohms } => ohms,
                ElementKind::Drop { .. } => 0.0,
            })
            .sum();
        let fixed_drop_volts: f64 = self
            .elements
            .iter()
            .map(|e| match e.kind {
                ElementKind::Drop { volts } => volts,
                ElementKind::Resistance { .. } => 0.0,
            })
            .sum();
        let loop_ohms = element_ohms + cable_ohms;
        // A three-wire transmitter's own current also flows in the supply conductor (one
        // of the two the cable figure counts), whatever the signal: a fixed drop.
        let own_ma = self.wiring.device.own_ma();
        let own_volts = own_ma / 1000.0 * cable_ohms / 2.0;
        let fixed_drop_volts = fixed_drop_volts + own_volts;

        let fault_ma = self.fault_current_ma();
        let point =
            |ma: f64| self.operating_point(ma, lowest_supply, need_volts, cable_ohms, own_volts);
        let at_low = point(4.0);
        let at_full_scale = point(20.0);
        let at_fault = point(fault_ma);

        let available = lowest_supply - need_volts - fixed_drop_volts;
        // Largest loop resistance that leaves the transmitter its minimum at `ma` (≥ 20 mA,
        // checked above).
        let max_load_at = |ma: f64| (available / (ma / 1000.0)).max(0.0);
        let max_load_ohms = max_load_at(20.0);
        let max_load_fault_ohms = max_load_at(fault_ma);
        let spare_ohms = max_load_ohms - loop_ohms;
        let spare_fault_ohms = max_load_fault_ohms - loop_ohms;
        let needed_at = |ma: f64| need_volts + fixed_drop_volts + loop_ohms * ma / 1000.0;
        let min_supply_volts = needed_at(20.0);
        let min_supply_fault_volts = needed_at(fault_ma.max(20.0));
        // A current source's compliance is its own data: no sag is applied to it.
        let derate = if current_source {
            1.0
        } else {
            1.0 - self.supply_tolerance_percent / 100.0
        };
        let min_nominal_supply_volts = min_supply_fault_volts / derate;

        // Longest one-way run of this conductor whose two conductors fit in what is left
        // of the maximum load once the other elements are counted.
        let (max_cable_m, max_cable_fault_m) = match &self.cable {
            Some(c) => {
                let per_m_loop = 2.0 * c.conductor.ohms_per_km(c.temp_c)? / 1000.0;
                if own_ma > 0.0 {
                    // Three-wire: at I the cable takes I·(2ρ)·L for the signal and
                    // I_own·ρ·L for the transmitter's own current (Kirchhoff), so
                    // L = (V − V_min − drops − I·R_elements) / (ρ·(2I + I_own)).
                    let elements_fixed = fixed_drop_volts - own_volts;
                    let run = |ma: f64| {
                        let spare = lowest_supply
                            - need_volts
                            - elements_fixed
                            - element_ohms * ma / 1000.0;
                        (spare / (per_m_loop / 2.0 * (2.0 * ma + own_ma) / 1000.0)).max(0.0)
                    };
                    (Some(run(20.0)), Some(run(fault_ma)))
                } else {
                    let run = |max_load: f64| ((max_load - element_ohms) / per_m_loop).max(0.0);
                    (Some(run(max_load_ohms)), Some(run(max_load_fault_ohms)))
                }
            }
            None => (None, None),
        };

        let (hart_low, hart_high) = self.hart_window_ohms;
        let hart_ok = loop_ohms >= hart_low && loop_ohms <= hart_high;
        let hart = if loop_ohms < hart_low {
            HartVerdict::BelowWindow {
                loop_ohms,
                min_ohms: hart_low,
            }
        } else if loop_ohms > hart_high {
            HartVerdict::AboveWindow {
                loop_ohms,
                max_ohms: hart_high,
            }
        } else {
            HartVerdict::Within {
                loop_ohms,
                min_ohms: hart_low,
                max_ohms: hart_high,
            }
        };

        let topology_fault = self.wiring.fault();
        let ok_full_scale = at_full_scale.ok && topology_fault.is_none();
        let ok_fault = at_fault.ok && topology_fault.is_none();
        let limit = match &topology_fault {
            Some(fault) => BudgetLimit::Topology {
                fault: fault.clone(),
            },
            None => self.limit(
                lowest_supply,
                need_volts,
                &at_full_scale,
                &at_fault,
                min_supply_fault_volts,
                (spare_ohms, spare_fault_ohms),
            ),
        };
        let hart_cable = self.hart_cable.map(|h| {
            let per_m = match &self.cable {
                Some(c) => c
                    .conductor
                    .ohms_per_km(c.temp_c)
                    .map(|r| 2.0 * r / 1000.0)
                    .unwrap_or(0.0),
                None => 0.0,
            };
            let devices_nf = h.devices_nf.unwrap_or(hart::DEFAULT_DEVICES_NF);
            let devices_farads = devices_nf * 1e-9;
            let farads_per_m = h.cable_pf_per_m * 1e-12;
            let max_cable_m = hart::max_cable_m(element_ohms, per_m, devices_farads, farads_per_m);
            let binding = match (max_cable_m, max_cable_fault_m) {
                (Some(h), Some(v)) => Some(if h < v {
                    Binding::Hart
                } else {
                    Binding::Voltage
                }),
                (None, Some(_)) => Some(Binding::Voltage),
                _ => None,
            };
            HartCableLimit {
                fixed_ohms: element_ohms,
                cable_ohms_per_m: per_m,
                devices_farads,
                devices_is_default: h.devices_nf.is_none(),
                cable_farads_per_m: farads_per_m,
                max_cable_m,
                time_constant_s: self.cable.as_ref().map(|c| {
                    hart::time_constant_s(
                        element_ohms,
                        per_m,
                        devices_farads,
                        farads_per_m,
                        c.one_way_m,
                    )
                }),
                binding,
            }
        });
        Ok(Budget {
            lowest_supply_volts: lowest_supply,
            cable_ohms,
            loop_ohms,
            fixed_drop_volts,
            at_low,
            at_full_scale,
            at_fault,
            max_load_ohms,
            max_load_fault_ohms,
            spare_ohms,
            spare_fault_ohms,
            min_supply_volts,
            min_supply_fault_volts,
            min_nominal_supply_volts,
            max_cable_m,
            max_cable_fault_m,
            fault_ma_is_default: self.fault_ma.is_none(),
            supply_sag_percent: if current_source {
                0.0
            } else {
                self.supply_tolerance_percent
            },
            driver_min_volts: need_volts,
            source: self.wiring.source().ok(),
            worked_from: self.working_source(),
            topology: self.wiring.topology(),
            topology_fault,
            hart_cable,
            ok: ok_full_scale && ok_fault,
            ok_full_scale,
            ok_fault,
            limit,
            hart_ok,
            hart,
        })
    }

    fn operating_point(
        &self,
        ma: f64,
        supply: f64,
        need_volts: f64,
        cable_ohms: f64,
        own_volts: f64,
    ) -> OperatingPoint {
        let mut parts: Vec<BudgetPart> = self
            .elements
            .iter()
            .map(|e| BudgetPart {
                name: e.name.clone(),
                volts: e.volts_at(ma),
                role: match e.kind {
                    ElementKind::Resistance { .. } => PartRole::Resistance,
                    ElementKind::Drop { .. } => PartRole::Drop,
                },
            })
            .collect();
        if self.cable.is_some() {
            parts.push(BudgetPart {
                name: "cable".to_string(),
                volts: cable_ohms * ma / 1000.0,
                role: PartRole::Cable,
            });
            if own_volts > 0.0 {
                parts.push(BudgetPart {
                    name: "cable (transmitter's own current)".to_string(),
                    volts: own_volts,
                    role: PartRole::Cable,
                });
            }
        }
        let used: f64 = parts.iter().map(|p| p.volts).sum();
        let terminal_volts = supply - used;
        let headroom_volts = terminal_volts - need_volts;
        OperatingPoint {
            current_ma: ma,
            terminal_volts,
            headroom_volts,
            ok: headroom_volts >= -1e-9,
            parts,
        }
    }

    #[allow(clippy::too_many_arguments)]
    fn limit(
        &self,
        supply: f64,
        need_volts: f64,
        full: &OperatingPoint,
        fault: &OperatingPoint,
        min_supply: f64,
        (spare_full_ohms, spare_fault_ohms): (f64, f64),
    ) -> BudgetLimit {
        if supply <= need_volts {
            return BudgetLimit::SupplyAtOrBelowMinimum {
                supply_volts: supply,
                tx_min_volts: need_volts,
            };
        }
        // The verdict is given at the tighter current, and the spare load quoted with it is
        // the spare at that same current.
        let (tight, spare_ohms) = if fault.headroom_volts < full.headroom_volts {
            (fault, spare_fault_ohms)
        } else {
            (full, spare_full_ohms)
        };
        let largest = tight
            .parts
            .iter()
            .max_by(|a, b| a.volts.total_cmp(&b.volts))
            .cloned();
        if tight.ok {
            BudgetLimit::Enough {
                at_ma: tight.current_ma,
                headroom_volts: tight.headroom_volts,
                spare_ohms: spare_ohms.max(0.0),
                largest,
            }
        } else {
            BudgetLimit::Short {
                at_ma: tight.current_ma,
                short_volts: -tight.headroom_volts,
                remove_ohms: -tight.headroom_volts / (tight.current_ma / 1000.0),
                min_supply_volts: min_supply,
                largest,
            }
        }
    }
}

/// What limits the loop: the verdict's reason, with the numbers to act on and the element
/// that takes most of the supply. Worded by `crate::view::wording::power::limit`.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(tag = "code", rename_all = "kebab-case")]
pub enum BudgetLimit {
    /// The lowest supply is at or below the transmitter minimum: no loop can work.
    SupplyAtOrBelowMinimum {
        /// The lowest supply, V.
        supply_volts: f64,
        /// The transmitter minimum, V.
        tx_min_volts: f64,
    },
    /// Enough voltage at the tighter of 20 mA and the fault current.
    Enough {
        /// The tighter current, mA: the verdict is given there.
        at_ma: f64,
        /// Volts to spare at the transmitter at that current.
        headroom_volts: f64,
        /// Load that could still be added and reach that current, Ω (never negative).
        spare_ohms: f64,
        /// The part of the loop that takes most of the supply at that current.
        largest: Option<BudgetPart>,
    },
    /// Not enough voltage at the tighter of 20 mA and the fault current.
    Short {
        /// The tighter current, mA.
        at_ma: f64,
        /// Volts missing at the transmitter at that current.
        short_volts: f64,
        /// Loop resistance to take out so the transmitter keeps its minimum, Ω.
        remove_ohms: f64,
        /// Lowest supply that would do at the fault current, V.
        min_supply_volts: f64,
        /// The part of the loop that takes most of the supply at that current.
        largest: Option<BudgetPart>,
    },
    /// The loop as wired has two sources or none: no figure makes it work.
    Topology {
        /// What is wrong with the wiring.
        fault: TopologyFault,
    },
}

/// The loop resistance against the HART window. Worded by
/// `crate::view::wording::power::hart`.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(tag = "code", rename_all = "kebab-case")]
pub enum HartVerdict {
    /// Below the window's minimum: a handheld cannot develop its signal.
    BelowWindow {
        /// Loop resistance, Ω.
        loop_ohms: f64,
        /// The window's minimum, Ω.
        min_ohms: f64,
    },
    /// Above the window's maximum: the signal is attenuated.
    AboveWindow {
        /// Loop resistance, Ω.
        loop_ohms: f64,
        /// The window's maximum, Ω.
        max_ohms: f64,
    },
    /// Within the window.
    Within {
        /// Loop resistance, Ω.
        loop_ohms: f64,
        /// The window's minimum, Ω.
        min_ohms: f64,
        /// The window's maximum, Ω.
        max_ohms: f64,
    },
}

/// What one part of the loop is, for drawing the budget bar.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum PartRole {
    /// A resistor or barrier (I·R).
    Resistance,
    /// A fixed drop.
    Drop,
    /// The cable (I·R of both conductors).
    Cable,
}

/// One slice of the supply at one current.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct BudgetPart {
    /// Element name, or "cable".
    pub name: String,
    /// Volts it takes at this current.
    pub volts: f64,
    /// What it is.
    pub role: PartRole,
}

/// The loop at one current, at the lowest supply.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct OperatingPoint {
    /// Loop current, mA.
    pub current_ma: f64,
    /// Volts left at the transmitter terminals.
    pub terminal_volts: f64,
    /// Terminal volts minus the transmitter minimum (negative = not enough).
    pub headroom_volts: f64,
    /// True when the transmitter keeps at least its minimum.
    pub ok: bool,
    /// Where the rest of the supply goes.
    pub parts: Vec<BudgetPart>,
}

/// The worked budget of a loop.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Budget {
    /// Nominal supply less its tolerance, V: the budget is worked at this. For a loop
    /// driven by a current source, its compliance (no sag applied); with no source, 0.
    pub lowest_supply_volts: f64,
    /// Both conductors of the cable, Ω.
    pub cable_ohms: f64,
    /// All resistive elements plus the cable, Ω.
    pub loop_ohms: f64,
    /// Sum of fixed drops, V (with a three-wire transmitter's own current in the supply
    /// conductor).
    pub fixed_drop_volts: f64,
    /// At 4 mA.
    pub at_low: OperatingPoint,
    /// At 20 mA.
    pub at_full_scale: OperatingPoint,
    /// At the upscale fault current.
    pub at_fault: OperatingPoint,
    /// Largest total loop resistance that still leaves the transmitter its minimum at 20 mA.
    pub max_load_ohms: f64,
    /// The same at the fault current.
    pub max_load_fault_ohms: f64,
    /// `max_load_ohms` − `loop_ohms`: load that could be added and still reach 20 mA
    /// (negative = that much too much).
    pub spare_ohms: f64,
    /// `max_load_fault_ohms` − `loop_ohms`: load that could be added and still reach the
    /// fault current, the figure to quote beside a verdict at the fault current.
    pub spare_fault_ohms: f64,
    /// Supply the loop needs at 20 mA, V (compare with the lowest supply).
    pub min_supply_volts: f64,
    /// Supply the loop needs at the fault current, V.
    pub min_supply_fault_volts: f64,
    /// Nominal supply needed at the fault current once the tolerance is allowed for, V.
    pub min_nominal_supply_volts: f64,
    /// Longest one-way cable run of this conductor that still works at 20 mA, m, by
    /// voltage only (HART and cable capacitance set their own limits).
    pub max_cable_m: Option<f64>,
    /// The same at the fault current, m.
    pub max_cable_fault_m: Option<f64>,
    /// The fault current is [`DEFAULT_FAULT_MA`] because the loop does not give the
    /// device's configured value.
    pub fault_ma_is_default: bool,
    /// How far below nominal the supply was allowed to sag, % (0: none assumed; the
    /// budget is worked at the nominal supply).
    pub supply_sag_percent: f64,
    /// What the driving device needs at its own terminals, V: the transmitter minimum for
    /// a two-wire or three-wire transmitter, 0 for a current source (its compliance is
    /// what it has left for the loop).
    pub driver_min_volts: f64,
    /// What supplies the loop, when exactly one thing does.
    pub source: Option<SourceKind>,
    /// The source the figures are worked from: [`Budget::source`], or with two sources the
    /// first wired; `None` with no source (worked from 0 V).
    pub worked_from: Option<SourceKind>,
    /// The topology from the short list (or [`Topology::Faulty`]).
    pub topology: Topology,
    /// Two sources or none, when the loop is wired so.
    pub topology_fault: Option<TopologyFault>,
    /// HART's cable limit by RC time constant, when the cable's capacitance was given.
    pub hart_cable: Option<HartCableLimit>,
    /// Enough voltage at 20 mA and at the fault current (never with a topology fault).
    pub ok: bool,
    /// Enough voltage at 20 mA.
    pub ok_full_scale: bool,
    /// Enough voltage at the fault current.
    pub ok_fault: bool,
    /// What limits the loop, with the numbers to act on and the largest element.
    pub limit: BudgetLimit,
    /// Loop resistance within the HART window.
    pub hart_ok: bool,
    /// The loop resistance against the HART window.
    pub hart: HartVerdict,
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn starved_supply_is_an_answer_not_an_error() {
        let b = LoopConfig::new(10.0, 10.5).budget().unwrap();
        assert!(!b.ok);
        assert_eq!(b.max_load_ohms, 0.0);
        assert!(matches!(
            b.limit,
            BudgetLimit::SupplyAtOrBelowMinimum { .. }
        ));
    }

    #[test]
    fn negative_resistor_names_the_element() {
        let mut c = LoopConfig::new(24.0, 10.5);
        c.elements.push(SeriesElement::ohms("PLC input", -250.0));
        assert_eq!(c.budget().unwrap_err().field, "PLC input");
    }
}
