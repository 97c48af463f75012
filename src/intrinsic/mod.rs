//! Intrinsic safety by the entity concept: one intrinsically safe circuit with one source
//! of energy (a barrier or an isolator channel), one or more field devices and the cable.
//!
//! # What is compared (IEC 60079-14, clause on intrinsically safe systems with a single
//! associated apparatus; IEC 60079-25; ANSI/ISA-RP12.06.01 states the same rules)
//!
//! For every field device with entity parameters:
//! - `Ui ≥ Uo`, `Ii ≥ Io`, `Pi ≥ Po`;
//! - its gas group covers the area's (a IIC device may go where IIB is asked, not the
//!   reverse) and its temperature class is at least the area's (T6 is the coolest);
//!
//! and for the circuit as a whole:
//! - `Co ≥ ΣCi + Ccable` and `Lo ≥ ΣLi + Lcable`;
//! - or, for the inductance, the L/R route: where the source gives `Lo/Ro` and the cable's
//!   L/R is known, a cable whose L/R does not exceed `Lo/Ro` need not have its inductance
//!   counted (see [`lr_route_allowed`] for the condition this module keeps);
//! - the source's own gas group covers the area's.
//!
//! # The 1 % rule (lumped inductance and capacitance together)
//!
//! Where both the total Ci and the total Li of the devices (the cable not counted) are at
//! least 1 % of Co and Lo, only 50 % of Co and Lo may be used, and the capacitance so
//! reduced (cable included) shall not exceed 1 µF for groups IIA and IIB and 600 nF for
//! IIC; where either total is under 1 %, Co and Lo are used in full. Confirmed as published
//! in the conditions of use of a certified apparatus: Rockwell Automation, "FLEX Ex I/O
//! 24V DC 4 Non-Isolated Source Output Module", publication 1797-5.6 (June 2011), p. 20
//! ("shall be reduced to 50 % when … the total Li of the external circuit (excluding the
//! cable) is ≥ 1 % of the Lo value and the total Ci … is ≥ 1 % of the Co value"; "the
//! reduced capacitance of the external circuit (including cable) shall not be greater
//! than 1 µF for IIB and IIA and 600 nF for IIC"). The clause numbers of the standards it
//! comes from (IEC 60079-14:2013 clause 16.2.4, IEC 60079-11:2011) are from memory: the
//! standards' own text could not be read in this session. Exactly 1 % counts (the
//! published wording says ≥ 1 %); the ceiling can only lower the allowed capacitance.
//!
//! # Cable
//!
//! Per-metre capacitance and inductance from the cable's data; when unknown, the default
//! values for conventional two- or three-core cables: 200 pF/m and 1 µH/m (IEC 60079-14
//! and IEC 60079-25 cable parameters, as summarised in "Calculating Intrinsically Safe
//! Cable Capacitance: IEC 60079-25 Methods", industrialmonitordirect.com knowledge base;
//! clause numbers from memory; the standards' own text could not be read). They are at or
//! above the defaults a North American control drawing gives for unknown field wiring,
//! 60 pF/ft (196.9 pF/m) and 0.2 µH/ft (0.656 µH/m) (OPW "924B Probe Control Drawing",
//! SiteSentinel iTouch manual appendix M, as published at easymanua.ls), so they are on
//! the safe side of both. The same summary gives a default L/R of 30 µH/Ω for Io ≤ 3 A;
//! this module does NOT use a default L/R: the L/R route is taken only with the cable's
//! own L/R typed (safe side).
//!
//! # Simple apparatus
//!
//! Contacts, RTDs, thermocouples, junction boxes: no entity parameters of their own
//! (IEC 60079-11 definition: passive components, or sources of at most 1.5 V, 100 mA and
//! 25 mW). They take the circuit's gas group; their Ci and Li count where known (zero
//! otherwise). Their temperature class is assessed from the source's power: T4 where
//! Po ≤ 1.3 W at an ambient of at most 40 °C ([`SIMPLE_APPARATUS_T4_WATTS`]). The figure
//! is the standard's small-component relaxation for T4 as a published summary gives it:
//! "power dissipation < 1.3 W at 40 °C ambient, < 1.2 W at 60 °C, < 1.0 W at 80 °C"
//! (contractorsunlimited.co.uk toolbox, "Temperature Classification"); that it is applied
//! to a simple apparatus through the source's Po, and the clause numbers (IEC 60079-11
//! clause 5.6, IEC 60079-14), are from memory: the standards' own text could not be read.
//! This tool has no ambient field and takes the 40 °C figure; above 40 °C the lower
//! figures apply and the technician must check them. An area needing T5 or T6 fails this
//! check: showing it needs an assessment this tool does not make. (North American texts define simple
//! apparatus with 1.2 V, 0.1 A, 25 mW and 20 µJ instead: API RP 14FZ as quoted in the
//! IADC lexicon; the tool does not test these, it takes the technician's word that the
//! device is simple apparatus.)
//!
//! # Margins
//!
//! Every numeric check carries its margin, positive when it passes: `Ui − Uo`, `Ii − Io`,
//! `Pi − Po`, `Co(allowed) − Ctotal`, `Lo(allowed) − Ltotal`, `Lo/Ro − L/R(cable)`, and the
//! same as a percent of the limit (`Ui`, `Ii`, `Pi`, the allowed Co, Lo, Lo/Ro).
//!
//! The core returns numbers and codes; the words are in `crate::view::wording::intrinsic`.
//! loopside shows the arithmetic: it does not certify a circuit.

use crate::error::{finite, FieldError, Result};
use serde::{Deserialize, Serialize};
use std::fmt;

/// The fraction of Co and Lo the devices' lumped Ci and Li must both reach for the 1 %
/// rule to apply (IEC 60079-14, as published in Rockwell Automation publication 1797-5.6,
/// p. 20; see the module).
pub const LUMPED_FRACTION: f64 = 0.01;
/// Relative allowance under which a sum counts as reaching 1 % (binary rounding only:
/// one part in 10⁹, far below any certificate's resolution).
pub const BOUNDARY_ALLOWANCE: f64 = 1e-9;
/// Ceiling on the halved capacitance for groups IIA and IIB, farads (1 µF; Rockwell
/// Automation publication 1797-5.6, p. 20, see the module).
pub const HALVED_CEILING_IIB_FARADS: f64 = 1.0e-6;
/// Ceiling on the halved capacitance for group IIC, farads (600 nF; Rockwell Automation
/// publication 1797-5.6, p. 20, see the module).
pub const HALVED_CEILING_IIC_FARADS: f64 = 600.0e-9;
/// Cable capacitance used when the cable's is unknown, F/m (200 pF/m: IEC 60079-14 /
/// IEC 60079-25 default for conventional cables, see the module).
pub const DEFAULT_CABLE_FARADS_PER_M: f64 = 200.0e-12;
/// Cable inductance used when the cable's is unknown, H/m (1 µH/m: IEC 60079-14 /
/// IEC 60079-25 default for conventional cables, see the module).
pub const DEFAULT_CABLE_HENRIES_PER_M: f64 = 1.0e-6;
/// Source power up to which simple apparatus is given T4 at an ambient of at most 40 °C,
/// watts (the small-component relaxation for T4 as published; see the module).
pub const SIMPLE_APPARATUS_T4_WATTS: f64 = 1.3;

/// Largest voltage accepted for Uo or Ui, V (IS circuits are far below; a larger number is
/// a typing or unit error).
pub const MAX_VOLTS: f64 = 1000.0;
/// Largest current accepted for Io or Ii, mA.
pub const MAX_MA: f64 = 10_000.0;
/// Largest power accepted for Po or Pi, W.
pub const MAX_WATTS: f64 = 100.0;
/// Largest capacitance accepted for Co or Ci, F (1 mF).
pub const MAX_FARADS: f64 = 1.0e-3;
/// Largest inductance accepted for Lo or Li, H (10 H).
pub const MAX_HENRIES: f64 = 10.0;
/// Largest Lo/Ro or cable L/R accepted, H/Ω (10 mH/Ω).
pub const MAX_HENRIES_PER_OHM: f64 = 1.0e-2;
/// Longest cable accepted, m (100 km).
pub const MAX_CABLE_M: f64 = 100_000.0;
/// Largest cable capacitance per metre accepted, F/m (10 nF/m).
pub const MAX_CABLE_FARADS_PER_M: f64 = 10.0e-9;
/// Largest cable inductance per metre accepted, H/m (100 µH/m).
pub const MAX_CABLE_HENRIES_PER_M: f64 = 100.0e-6;
/// Most devices in one circuit.
pub const MAX_DEVICES: usize = 16;
/// Longest name or certificate reference, characters.
pub const MAX_TEXT_CHARS: usize = 120;

/// A gas group (IEC 60079-0): IIC is the most easily ignited gases (hydrogen), IIA the
/// least. Ordered so that a larger group covers a smaller one.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Hash, Serialize, Deserialize)]
pub enum GasGroup {
    /// Propane-like gases.
    #[serde(rename = "IIA")]
    IIA,
    /// Ethylene-like gases.
    #[serde(rename = "IIB")]
    IIB,
    /// Hydrogen and acetylene.
    #[serde(rename = "IIC")]
    IIC,
}

impl GasGroup {
    /// Every group, least to most demanding.
    pub const ALL: [GasGroup; 3] = [GasGroup::IIA, GasGroup::IIB, GasGroup::IIC];

    /// The group as marked: `IIC`.
    pub fn label(self) -> &'static str {
        match self {
            GasGroup::IIA => "IIA",
            GasGroup::IIB => "IIB",
            GasGroup::IIC => "IIC",
        }
    }

    /// Read a group as typed (`IIC`, `iic`, `2C`, `II C`); the error names `field`.
    pub fn parse(field: &str, text: &str) -> Result<GasGroup> {
        let t: String = text
            .trim()
            .to_uppercase()
            .chars()
            .filter(|c| !c.is_whitespace())
            .collect();
        let t = t.strip_prefix("GROUP").unwrap_or(&t).to_string();
        let t = t.replace('2', "II");
        GasGroup::ALL
            .into_iter()
            .find(|g| g.label() == t)
            .ok_or_else(|| {
                FieldError::new(
                    field,
                    format!("'{}' is not a gas group; use IIA, IIB or IIC", text.trim()),
                )
            })
    }

    /// Whether equipment of this group may be used where `required` is asked
    /// (IEC 60079-14: IIC equipment is suitable for IIB and IIA, IIB for IIA).
    pub fn covers(self, required: GasGroup) -> bool {
        self >= required
    }

    /// The ceiling on the capacitance left after the 1 % rule halves Co, farads.
    pub fn halved_capacitance_ceiling_farads(self) -> f64 {
        match self {
            GasGroup::IIC => HALVED_CEILING_IIC_FARADS,
            GasGroup::IIA | GasGroup::IIB => HALVED_CEILING_IIB_FARADS,
        }
    }
}

impl fmt::Display for GasGroup {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.label())
    }
}

/// A temperature class (IEC 60079-0): the highest surface temperature a device may reach.
/// Ordered so that a cooler class (T6) is larger and covers a hotter one (T1).
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Hash, Serialize, Deserialize)]
pub enum TempClass {
    /// 450 °C.
    T1,
    /// 300 °C.
    T2,
    /// 200 °C.
    T3,
    /// 135 °C.
    T4,
    /// 100 °C.
    T5,
    /// 85 °C.
    T6,
}

impl TempClass {
    /// Every class, hottest first.
    pub const ALL: [TempClass; 6] = [
        TempClass::T1,
        TempClass::T2,
        TempClass::T3,
        TempClass::T4,
        TempClass::T5,
        TempClass::T6,
    ];

    /// The class as marked: `T4`.
    pub fn label(self) -> &'static str {
        match self {
            TempClass::T1 => "T1",
            TempClass::T2 => "T2",
            TempClass::T3 => "T3",
            TempClass::T4 => "T4",
            TempClass::T5 => "T5",
            TempClass::T6 => "T6",
        }
    }

    /// The highest surface temperature of the class, °C (IEC 60079-0, Table of
    /// temperature classes: 450, 300, 200, 135, 100, 85).
    pub fn max_surface_c(self) -> f64 {
        match self {
            TempClass::T1 => 450.0,
            TempClass::T2 => 300.0,
            TempClass::T3 => 200.0,
            TempClass::T4 => 135.0,
            TempClass::T5 => 100.0,
            TempClass::T6 => 85.0,
        }
    }

    /// Read a class as typed (`T4`, `t4`); the error names `field`.
    pub fn parse(field: &str, text: &str) -> Result<TempClass> {
        let t = text.trim().to_uppercase();
        TempClass::ALL
            .into_iter()
            .find(|c| c.label() == t)
            .ok_or_else(|| {
                FieldError::new(
                    field,
                    format!("'{}' is not a temperature class; use T1 to T6", text.trim()),
                )
            })
    }

    /// Whether a device of this class may be used where `required` is asked (its surface
    /// stays at or below the required class's limit).
    pub fn covers(self, required: TempClass) -> bool {
        self >= required
    }
}

impl fmt::Display for TempClass {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.label())
    }
}

/// The associated apparatus: a barrier or an isolator channel, with its output
/// parameters for the area's gas group as its certificate gives them.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Source {
    /// What the technician calls it, e.g. "Barrier, cabinet MCC-3 slot 12".
    #[serde(default)]
    pub name: String,
    /// Certificate reference, free text.
    #[serde(default)]
    pub certificate: String,
    /// Uo, maximum output voltage, V.
    pub uo_volts: f64,
    /// Io, maximum output current, mA.
    pub io_ma: f64,
    /// Po, maximum output power, W.
    pub po_watts: f64,
    /// Co, maximum external capacitance for the area's group, F.
    pub co_farads: f64,
    /// Lo, maximum external inductance for the area's group, H.
    pub lo_henries: f64,
    /// Lo/Ro, maximum external inductance-to-resistance ratio, H/Ω, when the certificate
    /// gives one.
    #[serde(default)]
    pub lo_ro_henries_per_ohm: Option<f64>,
    /// The gas group the source is certified for; `None` when not given (then not
    /// checked, and said so).
    #[serde(default)]
    pub group: Option<GasGroup>,
}

/// What sort of field device.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "kebab-case")]
pub enum DeviceKind {
    /// A device certified with entity input parameters.
    Entity {
        /// Ui, maximum input voltage, V.
        ui_volts: f64,
        /// Ii, maximum input current, mA.
        ii_ma: f64,
        /// Pi, maximum input power, W.
        pi_watts: f64,
        /// The gas group on its certificate, when known.
        #[serde(default)]
        group: Option<GasGroup>,
        /// The temperature class on its certificate, when known.
        #[serde(default)]
        t_class: Option<TempClass>,
    },
    /// Simple apparatus (contact, RTD, thermocouple, junction box): no certificate of
    /// its own.
    Simple,
}

/// One field device in the circuit.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Device {
    /// What the technician calls it, e.g. "TT-412 transmitter".
    pub name: String,
    /// Certificate reference, free text (empty for simple apparatus).
    #[serde(default)]
    pub certificate: String,
    /// Entity parameters, or simple apparatus.
    #[serde(flatten)]
    pub kind: DeviceKind,
    /// Ci, internal capacitance seen at its terminals, F (0 when none).
    #[serde(default)]
    pub ci_farads: f64,
    /// Li, internal inductance seen at its terminals, H (0 when none).
    #[serde(default)]
    pub li_henries: f64,
    /// Connected for a while only (a HART hand-held, a test meter).
    #[serde(default)]
    pub temporary: bool,
}

/// The cable between the source and the devices.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct Cable {
    /// Length from the source to the farthest device, m.
    pub length_m: f64,
    /// Capacitance per metre, F/m; `None` uses [`DEFAULT_CABLE_FARADS_PER_M`].
    #[serde(default)]
    pub farads_per_m: Option<f64>,
    /// Inductance per metre, H/m; `None` uses [`DEFAULT_CABLE_HENRIES_PER_M`].
    #[serde(default)]
    pub henries_per_m: Option<f64>,
    /// Inductance-to-resistance ratio, H/Ω, when the cable's data give it.
    #[serde(default)]
    pub lr_henries_per_ohm: Option<f64>,
}

impl Cable {
    /// Capacitance per metre used: the cable's, else the default.
    pub fn farads_per_m_used(&self) -> f64 {
        self.farads_per_m.unwrap_or(DEFAULT_CABLE_FARADS_PER_M)
    }

    /// Inductance per metre used: the cable's, else the default.
    pub fn henries_per_m_used(&self) -> f64 {
        self.henries_per_m.unwrap_or(DEFAULT_CABLE_HENRIES_PER_M)
    }
}

/// One intrinsically safe circuit: what a tag stores and what is checked.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Circuit {
    /// The barrier or isolator channel.
    pub source: Source,
    /// The field devices, temporary ones included.
    pub devices: Vec<Device>,
    /// The cable.
    pub cable: Cable,
    /// The gas group the area asks for.
    pub area_group: GasGroup,
    /// The temperature class the area asks for, when known.
    #[serde(default)]
    pub area_t_class: Option<TempClass>,
}

/// Which check a [`Check`] is.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum CheckName {
    /// Ui ≥ Uo (one per entity device).
    Voltage,
    /// Ii ≥ Io (one per entity device).
    Current,
    /// Pi ≥ Po (one per entity device).
    Power,
    /// Co (allowed) ≥ ΣCi + Ccable.
    Capacitance,
    /// Lo (allowed) ≥ ΣLi + Lcable.
    Inductance,
    /// Lo/Ro ≥ L/R of the cable (the L/R route).
    InductanceLr,
    /// The source's gas group covers the area's.
    SourceGroup,
    /// A device's gas group covers the area's.
    DeviceGroup,
    /// A device's temperature class covers the area's.
    TempClass,
    /// Simple apparatus: Po within what gives it T4 (and the area asks no more than T4).
    SimpleApparatus,
}

impl CheckName {
    /// The name as written in JSON and the log: `capacitance`.
    pub fn as_str(self) -> &'static str {
        match self {
            CheckName::Voltage => "voltage",
            CheckName::Current => "current",
            CheckName::Power => "power",
            CheckName::Capacitance => "capacitance",
            CheckName::Inductance => "inductance",
            CheckName::InductanceLr => "inductance-lr",
            CheckName::SourceGroup => "source-group",
            CheckName::DeviceGroup => "device-group",
            CheckName::TempClass => "temperature-class",
            CheckName::SimpleApparatus => "simple-apparatus",
        }
    }
}

/// The quantity a numeric check compares, in SI (mA for currents, by house convention).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum Quantity {
    /// Volts.
    Volts,
    /// Milliamperes.
    MilliAmps,
    /// Watts.
    Watts,
    /// Farads.
    Farads,
    /// Henries.
    Henries,
    /// Henries per ohm.
    HenriesPerOhm,
}

/// What a check compared.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(tag = "compares", rename_all = "kebab-case")]
pub enum Compared {
    /// Two numbers. `source` is the source's side (Uo, Io, Po, allowed Co, Lo, Lo/Ro),
    /// `field` the field side (Ui, Ii, Pi, total C, total L, cable L/R).
    Numbers {
        /// Unit of all four numbers.
        quantity: Quantity,
        /// The source's side.
        source: f64,
        /// The field side.
        field: f64,
        /// How much is left; negative when the check fails.
        margin: f64,
        /// The margin as a percent of the limit (the larger-is-safe side).
        margin_percent: f64,
    },
    /// Gas groups: what the area asks and what the equipment is certified for.
    Groups {
        /// The area's group.
        required: GasGroup,
        /// The equipment's group.
        given: GasGroup,
    },
    /// Temperature classes: what the area asks and what the device is certified for (or,
    /// for simple apparatus, is given by the source's power).
    Classes {
        /// The area's class.
        required: TempClass,
        /// The device's class.
        given: TempClass,
    },
}

/// One comparison and whether it passed.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Check {
    /// Which check.
    pub name: CheckName,
    /// The device it is about (`None` for the circuit-wide ones).
    pub device: Option<String>,
    /// Whether it passed.
    pub ok: bool,
    /// Whether the verdict depends on it: `false` for the Lo comparison when the L/R
    /// route passes instead, shown for information.
    pub decides: bool,
    /// What was compared.
    pub compared: Compared,
}

/// Something that could not be checked for want of data (the verdict does not cover it).
#[derive(Debug, Clone, PartialEq, Eq, Serialize, Deserialize)]
#[serde(tag = "missing", rename_all = "kebab-case")]
pub enum NotChecked {
    /// The source's gas group is not given.
    SourceGroup,
    /// A device's gas group is not given.
    DeviceGroup {
        /// The device.
        device: String,
    },
    /// A device's temperature class is not given while the area's is.
    DeviceTempClass {
        /// The device.
        device: String,
    },
    /// The area's temperature class is not given: no device's class was compared.
    AreaTempClass,
}

/// The longest cable that still passes the capacitance and inductance checks.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(tag = "limit", rename_all = "kebab-case")]
pub enum CableLimit {
    /// No length passes: the devices alone take more than is allowed.
    NoLength,
    /// Up to this many metres, limited by capacitance or inductance.
    Metres {
        /// Longest length, m.
        metres: f64,
        /// What sets it.
        by: CheckName,
    },
    /// The cable's per-metre values add nothing that limits it.
    Unlimited,
}

/// What the temporary devices (a HART hand-held...) add to the circuit.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct TemporaryEffect {
    /// Their total Ci, F.
    pub ci_farads: f64,
    /// Their total Li, H.
    pub li_henries: f64,
    /// Whether the circuit passes without them.
    pub ok_without: bool,
    /// Whether the 1 % rule applies without them.
    pub halved_without: bool,
    /// The capacitance margin without them, F.
    pub c_margin_without_farads: f64,
    /// The inductance margin (Lo route) without them, H.
    pub l_margin_without_henries: f64,
}

/// The result of checking a circuit.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Verdict {
    /// Whether every check that decides passed.
    pub ok: bool,
    /// Whether the 1 % rule applied (Co and Lo halved).
    pub halved: bool,
    /// Whether the halved capacitance was lowered further to the group's ceiling.
    pub capped: bool,
    /// Whether the L/R route decided the inductance.
    pub lr_route: bool,
    /// Devices' total Ci, F (no cable).
    pub ci_total_farads: f64,
    /// Devices' total Li, H (no cable).
    pub li_total_henries: f64,
    /// Cable capacitance, F.
    pub cable_farads: f64,
    /// Cable inductance, H.
    pub cable_henries: f64,
    /// ΣCi + Ccable, F.
    pub c_total_farads: f64,
    /// ΣLi + Lcable, H.
    pub l_total_henries: f64,
    /// The capacitance that may be connected (Co, halved and capped where the 1 % rule
    /// applies), F.
    pub co_allowed_farads: f64,
    /// The inductance that may be connected (Lo, halved where the 1 % rule applies), H.
    pub lo_allowed_henries: f64,
    /// Whether the cable's capacitance per metre is the default (unknown cable).
    pub cable_c_default: bool,
    /// Whether the cable's inductance per metre is the default (unknown cable).
    pub cable_l_default: bool,
    /// The longest cable that still passes.
    pub max_cable: CableLimit,
    /// Every comparison made, the source's and the circuit's first, then per device.
    pub checks: Vec<Check>,
    /// What could not be checked.
    pub not_checked: Vec<NotChecked>,
    /// What temporary devices add, when there are any.
    pub temporary: Option<TemporaryEffect>,
}

fn bounded(field: &str, value: f64, low: f64, high: f64, unit: &str) -> Result<f64> {
    let v = finite(field, value)?;
    if v < low || v > high {
        return Err(FieldError::new(
            field,
            format!("must be between {low} and {high} {unit}, got {v} {unit}"),
        ));
    }
    Ok(v)
}

fn strictly_positive(field: &str, value: f64, high: f64, unit: &str) -> Result<f64> {
    let v = bounded(field, value, 0.0, high, unit)?;
    if v == 0.0 {
        return Err(FieldError::new(
            field,
            format!("must be greater than 0 and at most {high} {unit}"),
        ));
    }
    Ok(v)
}

fn text(field: &str, value: &str) -> Result<()> {
    if value.chars().count() > MAX_TEXT_CHARS || value.chars().any(char::is_control) {
        return Err(FieldError::new(
            field,
            format!("must be {MAX_TEXT_CHARS} characters or fewer, on one line"),
        ));
    }
    Ok(())
}

impl Source {
    /// Check every parameter; the error names the first one wrong and the allowed range.
    pub fn validate(&self) -> Result<()> {
        text("source name", &self.name)?;
        text("source certificate", &self.certificate)?;
        strictly_positive("uo", self.uo_volts, MAX_VOLTS, "V")?;
        strictly_positive("io", self.io_ma, MAX_MA, "mA")?;
        strictly_positive("po", self.po_watts, MAX_WATTS, "W")?;
        strictly_positive("co", self.co_farads, MAX_FARADS, "F")?;
        strictly_positive("lo", self.lo_henries, MAX_HENRIES, "H")?;
        if let Some(r) = self.lo_ro_henries_per_ohm {
            strictly_positive("lo-ro", r, MAX_HENRIES_PER_OHM, "H/Ω")?;
        }
        Ok(())
    }
}

impl Device {
    /// Check every parameter; the error names the device and the field.
    pub fn validate(&self) -> Result<()> {
        let name = self.name.trim();
        if name.is_empty() {
            return Err(FieldError::new(
                "device name",
                "is empty; name each device (e.g. TT-412 transmitter)",
            ));
        }
        text("device name", &self.name)?;
        let f = |p: &str| format!("{p} ({name})");
        text(&f("certificate"), &self.certificate)?;
        if let DeviceKind::Entity {
            ui_volts,
            ii_ma,
            pi_watts,
            ..
        } = self.kind
        {
            strictly_positive(&f("ui"), ui_volts, MAX_VOLTS, "V")?;
            strictly_positive(&f("ii"), ii_ma, MAX_MA, "mA")?;
            strictly_positive(&f("pi"), pi_watts, MAX_WATTS, "W")?;
        }
        bounded(&f("ci"), self.ci_farads, 0.0, MAX_FARADS, "F")?;
        bounded(&f("li"), self.li_henries, 0.0, MAX_HENRIES, "H")?;
        Ok(())
    }
}

impl Cable {
    /// Check the cable's numbers; the error names the field and the allowed range.
    pub fn validate(&self) -> Result<()> {
        bounded("cable length", self.length_m, 0.0, MAX_CABLE_M, "m")?;
        if let Some(c) = self.farads_per_m {
            bounded("cable capacitance", c, 0.0, MAX_CABLE_FARADS_PER_M, "F/m")?;
        }
        if let Some(l) = self.henries_per_m {
            bounded("cable inductance", l, 0.0, MAX_CABLE_HENRIES_PER_M, "H/m")?;
        }
        if let Some(r) = self.lr_henries_per_ohm {
            bounded("cable L/R", r, 0.0, MAX_HENRIES_PER_OHM, "H/Ω")?;
        }
        Ok(())
    }
}

impl Circuit {
    /// Check every part; the error names the first field wrong.
    pub fn validate(&self) -> Result<()> {
        self.source.validate()?;
        if self.devices.is_empty() {
            return Err(FieldError::new(
                "devices",
                "none given; enter at least the field device",
            ));
        }
        if self.devices.len() > MAX_DEVICES {
            return Err(FieldError::new(
                "devices",
                format!("at most {MAX_DEVICES} in one circuit"),
            ));
        }
        for d in &self.devices {
            d.validate()?;
        }
        self.cable.validate()
    }
}

/// Whether the L/R route may decide the inductance. This module keeps it to a source with
/// Lo/Ro, a cable with its own L/R typed, and devices with no lumped inductance
/// (ΣLi = 0). Published guides may allow it with a small Li; that condition could not be
/// confirmed in this session, so the safe side is kept: with any Li, the Lo route decides.
pub fn lr_route_allowed(circuit: &Circuit) -> bool {
    circuit.source.lo_ro_henries_per_ohm.is_some()
        && circuit.cable.lr_henries_per_ohm.is_some()
        && circuit.devices.iter().all(|d| d.li_henries == 0.0)
}

fn percent_of(margin: f64, limit: f64) -> f64 {
    if limit > 0.0 {
        margin / limit * 100.0
    } else {
        0.0
    }
}

fn numbers(quantity: Quantity, source: f64, field: f64, field_is_limit: bool) -> Compared {
    let (margin, limit) = if field_is_limit {
        (field - source, field)
    } else {
        (source - field, source)
    };
    Compared::Numbers {
        quantity,
        source,
        field,
        margin,
        margin_percent: percent_of(margin, limit),
    }
}

/// Check one intrinsically safe circuit by the entity concept (see the module for the
/// rules and where each comes from). Bad input is an error naming the field; a circuit
/// that fails is a valid answer with `ok: false`.
pub fn check(circuit: &Circuit) -> Result<Verdict> {
    circuit.validate()?;
    let mut verdict = check_valid(circuit);
    if circuit.devices.iter().any(|d| d.temporary) {
        let permanent = Circuit {
            devices: circuit
                .devices
                .iter()
                .filter(|d| !d.temporary)
                .cloned()
                .collect(),
            ..circuit.clone()
        };
        let temp = circuit.devices.iter().filter(|d| d.temporary);
        let ci_farads = temp.clone().map(|d| d.ci_farads).sum();
        let li_henries = temp.map(|d| d.li_henries).sum();
        let without = (!permanent.devices.is_empty()).then(|| check_valid(&permanent));
        verdict.temporary = Some(match without {
            Some(w) => TemporaryEffect {
                ci_farads,
                li_henries,
                ok_without: w.ok,
                halved_without: w.halved,
                c_margin_without_farads: w.co_allowed_farads - w.c_total_farads,
                l_margin_without_henries: w.lo_allowed_henries - w.l_total_henries,
            },
            None => TemporaryEffect {
                ci_farads,
                li_henries,
                ok_without: false,
                halved_without: false,
                c_margin_without_farads: 0.0,
                l_margin_without_henries: 0.0,
            },
        });
    }
    Ok(verdict)
}

fn check_valid(circuit: &Circuit) -> Verdict {
    let s = &circuit.source;
    let area = circuit.area_group;
    let mut checks = Vec::new();
    let mut not_checked = Vec::new();

    match s.group {
        Some(given) => checks.push(Check {
            name: CheckName::SourceGroup,
            device: None,
            ok: given.covers(area),
            decides: true,
            compared: Compared::Groups {
                required: area,
                given,
            },
        }),
        None => not_checked.push(NotChecked::SourceGroup),
    }

    // The 1 % rule: the devices' lumped C and L only, the cable not counted.
    let ci_total: f64 = circuit.devices.iter().map(|d| d.ci_farads).sum();
    let li_total: f64 = circuit.devices.iter().map(|d| d.li_henries).sum();
    // Exactly 1 % counts (the published rule says ≥ 1 %); the relative allowance keeps a
    // value typed as exactly 1 % from being missed by binary rounding (42 µH against 1 %
    // of 4.2 mH).
    let threshold = LUMPED_FRACTION * (1.0 - BOUNDARY_ALLOWANCE);
    let halved = ci_total >= threshold * s.co_farads && li_total >= threshold * s.lo_henries;
    let (co_allowed, lo_allowed, capped) = if halved {
        let half = s.co_farads / 2.0;
        let ceiling = area.halved_capacitance_ceiling_farads();
        (half.min(ceiling), s.lo_henries / 2.0, ceiling < half)
    } else {
        (s.co_farads, s.lo_henries, false)
    };

    let cable = &circuit.cable;
    let c_per_m = cable.farads_per_m_used();
    let l_per_m = cable.henries_per_m_used();
    let cable_c = c_per_m * cable.length_m;
    let cable_l = l_per_m * cable.length_m;
    let c_total = ci_total + cable_c;
    let l_total = li_total + cable_l;

    let c_ok = co_allowed >= c_total;
    checks.push(Check {
        name: CheckName::Capacitance,
        device: None,
        ok: c_ok,
        decides: true,
        compared: numbers(Quantity::Farads, co_allowed, c_total, false),
    });

    let lo_ok = lo_allowed >= l_total;
    let lr = if lr_route_allowed(circuit) {
        // The route is only taken with ΣLi = 0, so the 1 % rule cannot have halved Lo;
        // were it ever halved, Lo/Ro is halved too (safe side).
        let factor = if halved { 0.5 } else { 1.0 };
        match (s.lo_ro_henries_per_ohm, cable.lr_henries_per_ohm) {
            (Some(lo_ro), Some(cable_lr)) => Some((lo_ro * factor, cable_lr)),
            _ => None,
        }
    } else {
        None
    };
    let lr_ok = lr.map(|(lo_ro, cable_lr)| lo_ro >= cable_lr);
    let lr_route = !lo_ok && lr_ok == Some(true);
    checks.push(Check {
        name: CheckName::Inductance,
        device: None,
        ok: lo_ok,
        decides: !lr_route,
        compared: numbers(Quantity::Henries, lo_allowed, l_total, false),
    });
    if let (Some((lo_ro, cable_lr)), Some(ok)) = (lr, lr_ok) {
        checks.push(Check {
            name: CheckName::InductanceLr,
            device: None,
            ok,
            decides: lr_route,
            compared: numbers(Quantity::HenriesPerOhm, lo_ro, cable_lr, false),
        });
    }

    for d in &circuit.devices {
        let name = Some(d.name.trim().to_string());
        match d.kind {
            DeviceKind::Entity {
                ui_volts,
                ii_ma,
                pi_watts,
                group,
                t_class,
            } => {
                for (check_name, quantity, source, field) in [
                    (CheckName::Voltage, Quantity::Volts, s.uo_volts, ui_volts),
                    (CheckName::Current, Quantity::MilliAmps, s.io_ma, ii_ma),
                    (CheckName::Power, Quantity::Watts, s.po_watts, pi_watts),
                ] {
                    checks.push(Check {
                        name: check_name,
                        device: name.clone(),
                        ok: field >= source,
                        decides: true,
                        compared: numbers(quantity, source, field, true),
                    });
                }
                match group {
                    Some(g) => checks.push(Check {
                        name: CheckName::DeviceGroup,
                        device: name.clone(),
                        ok: g.covers(area),
                        decides: true,
                        compared: Compared::Groups {
                            required: area,
                            given: g,
                        },
                    }),
                    None => not_checked.push(NotChecked::DeviceGroup {
                        device: d.name.trim().to_string(),
                    }),
                }
                match (circuit.area_t_class, t_class) {
                    (Some(required), Some(given)) => checks.push(Check {
                        name: CheckName::TempClass,
                        device: name.clone(),
                        ok: given.covers(required),
                        decides: true,
                        compared: Compared::Classes { required, given },
                    }),
                    (Some(_), None) => not_checked.push(NotChecked::DeviceTempClass {
                        device: d.name.trim().to_string(),
                    }),
                    (None, _) => {}
                }
            }
            DeviceKind::Simple => {
                // T4 for simple apparatus where Po ≤ 1.3 W (ambient ≤ 40 °C); an area
                // asking for T5 or T6 cannot be shown by this rule (safe side: fails).
                let power_ok = s.po_watts <= SIMPLE_APPARATUS_T4_WATTS;
                let required = circuit.area_t_class.unwrap_or(TempClass::T4);
                let ok = power_ok && TempClass::T4.covers(required);
                checks.push(Check {
                    name: CheckName::SimpleApparatus,
                    device: name.clone(),
                    ok,
                    decides: true,
                    compared: numbers(Quantity::Watts, s.po_watts, SIMPLE_APPARATUS_T4_WATTS, true),
                });
                if let Some(required) = circuit.area_t_class {
                    checks.push(Check {
                        name: CheckName::TempClass,
                        device: name.clone(),
                        ok: power_ok && TempClass::T4.covers(required),
                        decides: true,
                        compared: Compared::Classes {
                            required,
                            given: TempClass::T4,
                        },
                    });
                }
            }
        }
    }
    if circuit.area_t_class.is_none() {
        not_checked.push(NotChecked::AreaTempClass);
    }

    let ok = checks.iter().filter(|c| c.decides).all(|c| c.ok);
    let max_cable = longest_cable(
        co_allowed - ci_total,
        c_per_m,
        if lr_ok == Some(true) {
            None
        } else {
            Some((lo_allowed - li_total, l_per_m))
        },
    );

    Verdict {
        ok,
        halved,
        capped,
        lr_route,
        ci_total_farads: ci_total,
        li_total_henries: li_total,
        cable_farads: cable_c,
        cable_henries: cable_l,
        c_total_farads: c_total,
        l_total_henries: l_total,
        co_allowed_farads: co_allowed,
        lo_allowed_henries: lo_allowed,
        cable_c_default: cable.farads_per_m.is_none(),
        cable_l_default: cable.henries_per_m.is_none(),
        max_cable,
        checks,
        not_checked,
        temporary: None,
    }
}

/// The longest cable for the capacitance left (and the inductance left, unless the L/R
/// route passes and the cable's inductance is not counted).
fn longest_cable(c_left: f64, c_per_m: f64, l: Option<(f64, f64)>) -> CableLimit {
    let mut best: Option<(f64, CheckName)> = None;
    let mut limits = vec![(c_left, c_per_m, CheckName::Capacitance)];
    if let Some((l_left, l_per_m)) = l {
        limits.push((l_left, l_per_m, CheckName::Inductance));
    }
    for (left, per_m, by) in limits {
        if left < 0.0 {
            return CableLimit::NoLength;
        }
        if per_m > 0.0 {
            let m = left / per_m;
            if best.is_none_or(|(b, _)| m < b) {
                best = Some((m, by));
            }
        }
    }
    match best {
        Some((metres, by)) => CableLimit::Metres { metres, by },
        None => CableLimit::Unlimited,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn groups_and_classes_read_as_marked() {
        assert_eq!(GasGroup::parse("group", " iic ").unwrap(), GasGroup::IIC);
        assert_eq!(GasGroup::parse("group", "2B").unwrap(), GasGroup::IIB);
        assert_eq!(GasGroup::parse("group", "IID").unwrap_err().field, "group");
        assert!(GasGroup::IIC.covers(GasGroup::IIB));
        assert!(!GasGroup::IIB.covers(GasGroup::IIC));
        assert_eq!(TempClass::parse("t", "t4").unwrap(), TempClass::T4);
        assert!(TempClass::T6.covers(TempClass::T4));
        assert!(!TempClass::T3.covers(TempClass::T4));
        assert!(TempClass::parse("t", "T7").is_err());
    }

    #[test]
    fn a_cable_of_zero_per_metre_is_not_a_limit() {
        assert_eq!(longest_cable(1.0, 0.0, None), CableLimit::Unlimited);
        assert_eq!(longest_cable(-1.0, 1.0, None), CableLimit::NoLength);
    }
}
