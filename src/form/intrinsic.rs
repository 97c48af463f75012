//! The intrinsic-safety form: the barrier or isolator, the field devices and the cable as
//! typed, turned into a [`Circuit`], for the command line and the app alike.
//!
//! Every value takes a unit suffix (`93mA`, `0,65W`, `83nF`, `4.2mH`, `10uH`, `10µH`,
//! `55uH/ohm`, `120 pF/m`); without one the units are the ones certificates use: V, mA,
//! W, nF, mH, µH/Ω for Lo/Ro and L/R, pF/m and µH/m per metre of cable, and metres.
//! Decimal commas work (`0,65`). An empty optional field (Lo/Ro, the cable's per-metre
//! data, a device's group or class) means "not known": the core then takes the standard's
//! default or says what was not checked.
//!
//! On the command line one field device is written `NAME:ui=30,ii=100,pi=0.75,ci=5nF,
//! li=10uH,group=IIC,t=T4,cert=TEXT` (`simple` for simple apparatus, `temporary` for a
//! hand-held); with decimal commas, separate the items with `;` instead.

use crate::display;
use crate::error::{FieldError, Result};
use crate::intrinsic::{Cable, Circuit, Device, DeviceKind, GasGroup, Source, TempClass};
use crate::number::parse_number;
use serde::{Deserialize, Serialize};

/// The unit a field is typed in, with the suffixes it accepts.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Typed {
    /// Uo, Ui: volts (default V).
    Volts,
    /// Io, Ii: kept in mA (default mA).
    MilliAmps,
    /// Po, Pi: watts (default W).
    Watts,
    /// Co, Ci: farads (default nF).
    Farads,
    /// Lo, Li: henries (default mH).
    Henries,
    /// Lo/Ro, cable L/R: henries per ohm (default µH/Ω).
    HenriesPerOhm,
    /// Cable capacitance: farads per metre (default pF/m).
    FaradsPerMetre,
    /// Cable inductance: henries per metre (default µH/m).
    HenriesPerMetre,
    /// Cable length: metres (default m).
    Metres,
}

impl Typed {
    /// The suffixes accepted and the factor each gives to the stored unit; the first is
    /// the default (factor applied when no suffix is typed).
    fn suffixes(self) -> &'static [(&'static str, f64)] {
        match self {
            Typed::Volts => &[("V", 1.0), ("mV", 1e-3), ("kV", 1e3)],
            Typed::MilliAmps => &[("mA", 1.0), ("A", 1e3), ("uA", 1e-3), ("µA", 1e-3)],
            Typed::Watts => &[("W", 1.0), ("mW", 1e-3)],
            Typed::Farads => &[
                ("nF", 1e-9),
                ("pF", 1e-12),
                ("uF", 1e-6),
                ("µF", 1e-6),
                ("F", 1.0),
            ],
            Typed::Henries => &[("mH", 1e-3), ("uH", 1e-6), ("µH", 1e-6), ("H", 1.0)],
            Typed::HenriesPerOhm => &[
                ("µH/Ω", 1e-6),
                ("uH/ohm", 1e-6),
                ("µH/ohm", 1e-6),
                ("uH/Ω", 1e-6),
                ("mH/ohm", 1e-3),
                ("mH/Ω", 1e-3),
            ],
            Typed::FaradsPerMetre => &[
                ("pF/m", 1e-12),
                ("pF", 1e-12),
                ("nF/m", 1e-9),
                ("nF/km", 1e-12),
                ("uF/km", 1e-9),
                ("µF/km", 1e-9),
            ],
            Typed::HenriesPerMetre => &[
                ("µH/m", 1e-6),
                ("uH/m", 1e-6),
                ("uH", 1e-6),
                ("µH", 1e-6),
                ("mH/km", 1e-6),
            ],
            Typed::Metres => &[("m", 1.0), ("km", 1e3), ("ft", 0.3048)],
        }
    }

    /// The default unit's symbol, for labels: `nF`.
    pub fn default_symbol(self) -> &'static str {
        self.suffixes()[0].0
    }
}

/// Read `text` typed into `field` in the unit `typed` (a suffix optional), in the stored
/// unit (SI; mA for currents). Suffixes are matched longest first, so `mA` is not read as
/// `A` and `uH/m` not as `m`.
pub fn parse_value(field: &str, text: &str, typed: Typed) -> Result<f64> {
    let t = text.trim();
    let mut suffixes: Vec<&(&str, f64)> = typed.suffixes().iter().collect();
    suffixes.sort_by_key(|(s, _)| std::cmp::Reverse(s.chars().count()));
    for (suffix, factor) in suffixes {
        if let Some(number) = t.strip_suffix(suffix) {
            if number.trim().is_empty() {
                break;
            }
            return parse_number(field, number.trim()).map(|v| v * factor);
        }
    }
    let default_factor = typed.suffixes()[0].1;
    parse_number(field, t)
        .map(|v| v * default_factor)
        .map_err(|e| {
            FieldError::new(
                field,
                format!(
                    "{}; units accepted: {}",
                    e.reason,
                    typed
                        .suffixes()
                        .iter()
                        .map(|(s, _)| *s)
                        .collect::<Vec<_>>()
                        .join(", ")
                ),
            )
        })
}

fn optional(field: &str, text: &str, typed: Typed) -> Result<Option<f64>> {
    if text.trim().is_empty() {
        Ok(None)
    } else {
        parse_value(field, text, typed).map(Some)
    }
}

fn required(field: &str, text: &str, typed: Typed) -> Result<f64> {
    if text.trim().is_empty() {
        return Err(FieldError::new(
            field,
            format!(
                "is missing; type it from the certificate (in {} unless you add a unit)",
                typed.default_symbol()
            ),
        ));
    }
    parse_value(field, text, typed)
}

/// The barrier or isolator as typed.
#[derive(Debug, Clone, Default, PartialEq, Serialize, Deserialize)]
#[serde(default)]
pub struct SourceText {
    /// Its name.
    pub name: String,
    /// Certificate reference.
    pub certificate: String,
    /// Uo.
    pub uo: String,
    /// Io.
    pub io: String,
    /// Po.
    pub po: String,
    /// Co.
    pub co: String,
    /// Lo.
    pub lo: String,
    /// Lo/Ro (may be empty).
    pub lo_ro: String,
    /// Its gas group (may be empty: not checked).
    pub group: String,
}

/// One field device as typed.
#[derive(Debug, Clone, Default, PartialEq, Serialize, Deserialize)]
#[serde(default)]
pub struct DeviceText {
    /// Its name.
    pub name: String,
    /// Certificate reference.
    pub certificate: String,
    /// Simple apparatus (no entity parameters of its own).
    pub simple: bool,
    /// Ui.
    pub ui: String,
    /// Ii.
    pub ii: String,
    /// Pi.
    pub pi: String,
    /// Ci (empty = 0).
    pub ci: String,
    /// Li (empty = 0).
    pub li: String,
    /// Gas group (may be empty: not checked).
    pub group: String,
    /// Temperature class (may be empty: not checked).
    pub t_class: String,
    /// Connected for a while only (a HART hand-held).
    pub temporary: bool,
}

/// The cable as typed.
#[derive(Debug, Clone, Default, PartialEq, Serialize, Deserialize)]
#[serde(default)]
pub struct CableText {
    /// Length.
    pub length: String,
    /// Capacitance per metre (empty = the standard's default).
    pub c_per_m: String,
    /// Inductance per metre (empty = the standard's default).
    pub l_per_m: String,
    /// L/R (empty = not known).
    pub lr: String,
}

/// The whole circuit as typed.
#[derive(Debug, Clone, Default, PartialEq, Serialize, Deserialize)]
#[serde(default)]
pub struct CircuitText {
    /// The source.
    pub source: SourceText,
    /// The devices.
    pub devices: Vec<DeviceText>,
    /// The cable.
    pub cable: CableText,
    /// The area's gas group.
    pub area_group: String,
    /// The area's temperature class (may be empty).
    pub area_t_class: String,
}

/// Parse the source; the error names the field.
pub fn parse_source(s: &SourceText) -> Result<Source> {
    let group = if s.group.trim().is_empty() {
        None
    } else {
        Some(GasGroup::parse("source group", &s.group)?)
    };
    let source = Source {
        name: s.name.trim().to_string(),
        certificate: s.certificate.trim().to_string(),
        uo_volts: required("uo", &s.uo, Typed::Volts)?,
        io_ma: required("io", &s.io, Typed::MilliAmps)?,
        po_watts: required("po", &s.po, Typed::Watts)?,
        co_farads: required("co", &s.co, Typed::Farads)?,
        lo_henries: required("lo", &s.lo, Typed::Henries)?,
        lo_ro_henries_per_ohm: optional("lo-ro", &s.lo_ro, Typed::HenriesPerOhm)?,
        group,
    };
    source.validate()?;
    Ok(source)
}

/// Parse one device; the error names the field and the device.
pub fn parse_device(d: &DeviceText) -> Result<Device> {
    let name = d.name.trim();
    let f = |p: &str| format!("{p} ({name})");
    let kind = if d.simple {
        DeviceKind::Simple
    } else {
        DeviceKind::Entity {
            ui_volts: required(&f("ui"), &d.ui, Typed::Volts)?,
            ii_ma: required(&f("ii"), &d.ii, Typed::MilliAmps)?,
            pi_watts: required(&f("pi"), &d.pi, Typed::Watts)?,
            group: if d.group.trim().is_empty() {
                None
            } else {
                Some(GasGroup::parse(&f("group"), &d.group)?)
            },
            t_class: if d.t_class.trim().is_empty() {
                None
            } else {
                Some(TempClass::parse(&f("t-class"), &d.t_class)?)
            },
        }
    };
    let device = Device {
        name: name.to_string(),
        certificate: d.certificate.trim().to_string(),
        kind,
        ci_farads: optional(&f("ci"), &d.ci, Typed::Farads)?.unwrap_or(0.0),
        li_henries: optional(&f("li"), &d.li, Typed::Henries)?.unwrap_or(0.0),
        temporary: d.temporary,
    };
    device.validate()?;
    Ok(device)
}

/// Parse the cable; the error names the field.
pub fn parse_cable(c: &CableText) -> Result<Cable> {
    let cable = Cable {
        length_m: required("cable length", &c.length, Typed::Metres)?,
        farads_per_m: optional("cable capacitance", &c.c_per_m, Typed::FaradsPerMetre)?,
        henries_per_m: optional("cable inductance", &c.l_per_m, Typed::HenriesPerMetre)?,
        lr_henries_per_ohm: optional("cable L/R", &c.lr, Typed::HenriesPerOhm)?,
    };
    cable.validate()?;
    Ok(cable)
}

/// Parse the whole circuit; the error names the first field wrong.
pub fn parse_circuit(c: &CircuitText) -> Result<Circuit> {
    let source = parse_source(&c.source)?;
    let devices = c
        .devices
        .iter()
        .map(parse_device)
        .collect::<Result<Vec<Device>>>()?;
    let cable = parse_cable(&c.cable)?;
    let area_group = if c.area_group.trim().is_empty() {
        return Err(FieldError::new(
            "group",
            "is missing; give the gas group the area asks for (IIA, IIB or IIC)",
        ));
    } else {
        GasGroup::parse("group", &c.area_group)?
    };
    let area_t_class = if c.area_t_class.trim().is_empty() {
        None
    } else {
        Some(TempClass::parse("t-class", &c.area_t_class)?)
    };
    let circuit = Circuit {
        source,
        devices,
        cable,
        area_group,
        area_t_class,
    };
    circuit.validate()?;
    Ok(circuit)
}

/// Read a device written on the command line: `NAME:ui=30,ii=100,pi=0.75,ci=5nF,li=10uH,
/// group=IIC,t=T4,cert=TEXT,simple,temporary` (items separated by `;` instead of `,` when
/// values use decimal commas). The error names `device` and the item.
pub fn parse_device_spec(text: &str) -> Result<DeviceText> {
    let (name, items) = text.split_once(':').unwrap_or((text, ""));
    let name = name.trim();
    if name.is_empty() {
        return Err(FieldError::new(
            "device",
            format!(
                "'{}' has no name; write NAME:ui=..,ii=..,pi=..",
                text.trim()
            ),
        ));
    }
    let mut d = DeviceText {
        name: name.to_string(),
        ..DeviceText::default()
    };
    let sep = if items.contains(';') { ';' } else { ',' };
    for item in items.split(sep).map(str::trim).filter(|i| !i.is_empty()) {
        let (key, value) = item.split_once('=').unwrap_or((item, ""));
        let value = value.trim().to_string();
        match key.trim().to_lowercase().as_str() {
            "ui" => d.ui = value,
            "ii" => d.ii = value,
            "pi" => d.pi = value,
            "ci" => d.ci = value,
            "li" => d.li = value,
            "group" | "gas" => d.group = value,
            "t" | "t-class" | "tclass" => d.t_class = value,
            "cert" | "certificate" => d.certificate = value,
            "simple" => d.simple = true,
            "temporary" | "hand-held" => d.temporary = true,
            other => {
                return Err(FieldError::new(
                    format!("device ({name})"),
                    format!(
                        "'{other}' is not an item; use ui, ii, pi, ci, li, group, t, cert, simple or temporary"
                    ),
                ))
            }
        }
    }
    Ok(d)
}

fn show(value: f64, factor: f64) -> String {
    display::trimmed(value / factor)
}

/// The circuit as a form shows it (for editing a stored circuit), in the default units.
pub fn circuit_text(c: &Circuit) -> CircuitText {
    let s = &c.source;
    CircuitText {
        source: SourceText {
            name: s.name.clone(),
            certificate: s.certificate.clone(),
            uo: show(s.uo_volts, 1.0),
            io: show(s.io_ma, 1.0),
            po: show(s.po_watts, 1.0),
            co: show(s.co_farads, 1e-9),
            lo: show(s.lo_henries, 1e-3),
            lo_ro: s
                .lo_ro_henries_per_ohm
                .map(|v| show(v, 1e-6))
                .unwrap_or_default(),
            group: s.group.map(|g| g.label().to_string()).unwrap_or_default(),
        },
        devices: c.devices.iter().map(device_text).collect(),
        cable: CableText {
            length: show(c.cable.length_m, 1.0),
            c_per_m: c
                .cable
                .farads_per_m
                .map(|v| show(v, 1e-12))
                .unwrap_or_default(),
            l_per_m: c
                .cable
                .henries_per_m
                .map(|v| show(v, 1e-6))
                .unwrap_or_default(),
            lr: c
                .cable
                .lr_henries_per_ohm
                .map(|v| show(v, 1e-6))
                .unwrap_or_default(),
        },
        area_group: c.area_group.label().to_string(),
        area_t_class: c
            .area_t_class
            .map(|t| t.label().to_string())
            .unwrap_or_default(),
    }
}

/// One device as a form shows it.
pub fn device_text(d: &Device) -> DeviceText {
    let mut t = DeviceText {
        name: d.name.clone(),
        certificate: d.certificate.clone(),
        simple: matches!(d.kind, DeviceKind::Simple),
        ci: show(d.ci_farads, 1e-9),
        li: show(d.li_henries, 1e-3),
        temporary: d.temporary,
        ..DeviceText::default()
    };
    if let DeviceKind::Entity {
        ui_volts,
        ii_ma,
        pi_watts,
        group,
        t_class,
    } = d.kind
    {
        t.ui = show(ui_volts, 1.0);
        t.ii = show(ii_ma, 1.0);
        t.pi = show(pi_watts, 1.0);
        t.group = group.map(|g| g.label().to_string()).unwrap_or_default();
        t.t_class = t_class.map(|c| c.label().to_string()).unwrap_or_default();
    }
    t
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn values_take_the_suffixes_on_a_certificate() {
        let close = |a: f64, b: f64| assert!((a - b).abs() <= b.abs() * 1e-12, "{a} vs {b}");
        close(parse_value("io", "93mA", Typed::MilliAmps).unwrap(), 93.0);
        close(
            parse_value("io", "0,093 A", Typed::MilliAmps).unwrap(),
            93.0,
        );
        close(parse_value("po", "0,65W", Typed::Watts).unwrap(), 0.65);
        close(parse_value("co", "83nF", Typed::Farads).unwrap(), 83e-9);
        close(parse_value("co", "83", Typed::Farads).unwrap(), 83e-9);
        close(parse_value("co", "0.083 µF", Typed::Farads).unwrap(), 83e-9);
        close(parse_value("lo", "4.2mH", Typed::Henries).unwrap(), 4.2e-3);
        close(parse_value("li", "10uH", Typed::Henries).unwrap(), 10e-6);
        close(parse_value("li", "10µH", Typed::Henries).unwrap(), 10e-6);
        close(
            parse_value("lr", "55 uH/ohm", Typed::HenriesPerOhm).unwrap(),
            55e-6,
        );
        close(
            parse_value("c", "120 pF/m", Typed::FaradsPerMetre).unwrap(),
            120e-12,
        );
        close(
            parse_value("l", "0,65", Typed::HenriesPerMetre).unwrap(),
            0.65e-6,
        );
        close(parse_value("len", "1.2 km", Typed::Metres).unwrap(), 1200.0);
        let e = parse_value("co", "83 mH", Typed::Farads).unwrap_err();
        assert_eq!(e.field, "co");
        assert!(e.reason.contains("nF"), "{e}");
    }

    #[test]
    fn a_device_spec_reads_with_commas_or_semicolons() {
        let d = parse_device_spec("TT-412 tx:ui=30,ii=100mA,pi=0.75,ci=5nF,li=10uH,group=IIC,t=T4")
            .unwrap();
        assert_eq!(d.name, "TT-412 tx");
        assert_eq!(d.li, "10uH");
        let d = parse_device_spec("tx:ui=28,5;ii=93;pi=0,65").unwrap();
        assert_eq!(d.ui, "28,5");
        assert_eq!(
            parse_device_spec("tx:uo=3").unwrap_err().field,
            "device (tx)"
        );
        let d = parse_device_spec("Pt100:simple").unwrap();
        assert!(d.simple);
        assert!(parse_device(&d).is_ok());
    }

    #[test]
    fn a_circuit_reads_back_from_its_own_form() {
        let text = CircuitText {
            source: SourceText {
                name: "barrier".into(),
                uo: "28".into(),
                io: "93".into(),
                po: "0.65".into(),
                co: "83".into(),
                lo: "4.2".into(),
                lo_ro: "55".into(),
                group: "IIC".into(),
                ..SourceText::default()
            },
            devices: vec![parse_device_spec("tx:ui=30,ii=100,pi=0.75,ci=5,li=0.01").unwrap()],
            cable: CableText {
                length: "200".into(),
                c_per_m: "100".into(),
                ..CableText::default()
            },
            area_group: "IIC".into(),
            area_t_class: "T3".into(),
        };
        let c = parse_circuit(&text).unwrap();
        assert_eq!(parse_circuit(&circuit_text(&c)).unwrap(), c);
        let mut missing = text.clone();
        missing.source.co.clear();
        assert_eq!(parse_circuit(&missing).unwrap_err().field, "co");
        let mut bad = text;
        bad.area_group = "IID".into();
        assert_eq!(parse_circuit(&bad).unwrap_err().field, "group");
    }
}
