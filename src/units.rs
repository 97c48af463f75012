//! Engineering units: what a technician types after a number, and the factors between them.
//!
//! Every known unit is stored as a factor (and, for temperatures, an offset) to its SI base,
//! so a conversion is one multiply into SI and one out of it. The factors are those of
//! NIST Special Publication 811 (2008), Appendix B; the source is named beside each one.
//! A unit that is not in the table (for example `pH` or `%LEL`) is a *free* unit: it is kept
//! as text, shown as typed and never converted.

use crate::error::{FieldError, Result};

/// Standard acceleration of free fall, m/s² (CGPM 1901; NIST SP 811 B.8 "conventional").
pub const STANDARD_GRAVITY: f64 = 9.80665;
/// Conventional density of water used by the "conventional" water-column units, kg/m³
/// (NIST SP 811 B.8: mmH2O conventional = 9.806 65 Pa, i.e. 1000 kg/m³ × g_n × 1 mm).
pub const WATER_DENSITY_KG_M3: f64 = 1000.0;

/// The physical quantity a unit measures; only units of the same quantity convert.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, serde::Serialize, serde::Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum Quantity {
    /// Pressure and differential pressure; SI base pascal.
    Pressure,
    /// Length, level and distance; SI base metre.
    Length,
    /// Temperature (absolute scales with offsets); SI base kelvin.
    Temperature,
    /// Volume (tank contents); SI base cubic metre.
    Volume,
    /// Volume flow; SI base cubic metre per second.
    VolumeFlow,
    /// Mass flow; SI base kilogram per second.
    MassFlow,
    /// Percent of something (span, opening, concentration); base percent.
    Percent,
    /// Electric current; SI base ampere.
    Current,
    /// Voltage; SI base volt.
    Voltage,
    /// Resistance; SI base ohm.
    Resistance,
}

impl Quantity {
    /// The quantity's plain name, for messages.
    pub fn name(self) -> &'static str {
        match self {
            Quantity::Pressure => "pressure",
            Quantity::Length => "length",
            Quantity::Temperature => "temperature",
            Quantity::Volume => "volume",
            Quantity::VolumeFlow => "volume flow",
            Quantity::MassFlow => "mass flow",
            Quantity::Percent => "percent",
            Quantity::Current => "current",
            Quantity::Voltage => "voltage",
            Quantity::Resistance => "resistance",
        }
    }
}

/// One known unit: its display symbol, what it measures and how it maps to SI
/// (`si = value × factor + offset`).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Unit {
    /// The symbol loopside shows, e.g. `bar`, `inH2O`, `m³/h`.
    pub symbol: &'static str,
    /// What the unit measures.
    pub quantity: Quantity,
    /// Multiplier into the SI base of the quantity.
    pub factor: f64,
    /// Offset added after the multiplier (non-zero only for °C and °F).
    pub offset: f64,
    /// Other spellings a technician may type (matched without regard to case).
    pub aliases: &'static [&'static str],
}

impl Unit {
    /// This value expressed in the SI base unit of the quantity.
    pub fn to_si(&self, value: f64) -> f64 {
        value * self.factor + self.offset
    }

    /// A value in the SI base unit expressed in this unit.
    pub fn from_si(&self, si: f64) -> f64 {
        (si - self.offset) / self.factor
    }
}

const fn u(
    symbol: &'static str,
    quantity: Quantity,
    factor: f64,
    aliases: &'static [&'static str],
) -> Unit {
    Unit {
        symbol,
        quantity,
        factor,
        offset: 0.0,
        aliases,
    }
}

use Quantity::*;

/// US survey-independent international foot and inch (NIST SP 811 B.8: exact).
const FOOT_M: f64 = 0.3048;
const INCH_M: f64 = 0.0254;
/// US liquid gallon, m³ (NIST SP 811 B.8: 3.785 412 E-03, exact 231 in³).
const US_GALLON_M3: f64 = 3.785_411_784e-3;
/// Imperial gallon, m³ (NIST SP 811 B.8: 4.546 09 E-03, exact).
const IMP_GALLON_M3: f64 = 4.546_09e-3;
/// Cubic foot, m³ (NIST SP 811 B.8: 2.831 685 E-02, exact 0.3048³).
const CUBIC_FOOT_M3: f64 = 0.028_316_846_592;
/// Avoirdupois pound, kg (NIST SP 811 B.8: 4.535 924 E-01, exact 0.453 592 37).
const POUND_KG: f64 = 0.453_592_37;

/// Every unit loopside converts. Order matters only for display lists.
pub static UNITS: &[Unit] = &[
    // Pressure — NIST SP 811 (2008) Appendix B.8 factors.
    u("Pa", Pressure, 1.0, &["pascal"]),
    u("kPa", Pressure, 1.0e3, &[]),
    u("MPa", Pressure, 1.0e6, &[]),
    u("bar", Pressure, 1.0e5, &["barg", "bara"]),
    u("mbar", Pressure, 1.0e2, &["mbarg", "mbara"]),
    // psi: 6.894 757 E+03 Pa (exact value 4.448 221 615 260 5 N / 0.0254² m²).
    u(
        "psi",
        Pressure,
        6_894.757_293_168_361,
        &["psig", "psia", "lbf/in2"],
    ),
    // Standard atmosphere: 1.013 25 E+05 Pa (exact).
    u("atm", Pressure, 101_325.0, &[]),
    // Inch of water at 39.2 °F (4 °C): 2.490 82 E+02 Pa.
    u(
        "inH2O",
        Pressure,
        249.082,
        &[
            "inwc",
            "in h2o",
            "inh2o@4c",
            "inh2o@39.2f",
            "inh2o_4c",
            "\"h2o",
            "inwg",
        ],
    ),
    // Inch of water at 60 °F: 2.4884 E+02 Pa.
    u("inH2O@60F", Pressure, 248.84, &["inh2o_60f", "inh2o(60f)"]),
    // Inch of water, conventional: 25.4 mm × 9.806 65 Pa/mm = 249.0889 Pa.
    u(
        "inH2O(conv)",
        Pressure,
        249.088_91,
        &["inh2o_conv", "inh2o@conv"],
    ),
    // Millimetre of water, conventional: 9.806 65 Pa.
    u("mmH2O", Pressure, 9.806_65, &["mmwc", "mmh2o@conv", "mmwg"]),
    // Metre of water, conventional: 9.806 65 E+03 Pa.
    u("mH2O", Pressure, 9_806.65, &["mwc"]),
    // Foot of water at 39.2 °F: 2.988 98 E+03 Pa.
    u("ftH2O", Pressure, 2_988.98, &["ftwc", "fth2o@4c"]),
    // Inch of mercury at 32 °F: 3.386 38 E+03 Pa.
    u("inHg", Pressure, 3_386.38, &["inhg@32f"]),
    // Millimetre of mercury, conventional: 1.333 224 E+02 Pa.
    u("mmHg", Pressure, 133.322_4, &["torr"]),
    // Kilogram-force per square centimetre: 9.806 65 E+04 Pa (exact).
    u(
        "kgf/cm²",
        Pressure,
        98_066.5,
        &["kgf/cm2", "kg/cm2", "kg/cm²"],
    ),
    // Length — exact definitions (NIST SP 811 B.8).
    u("m", Length, 1.0, &["metre", "meter"]),
    u("cm", Length, 0.01, &[]),
    u("mm", Length, 0.001, &[]),
    u("ft", Length, FOOT_M, &["feet", "foot"]),
    u("in", Length, INCH_M, &["inch", "\""]),
    // Volume.
    u("m³", Volume, 1.0, &["m3"]),
    u("L", Volume, 1.0e-3, &["l", "litre", "liter"]),
    u("US gal", Volume, US_GALLON_M3, &["gal", "usgal", "gal(us)"]),
    u(
        "imp gal",
        Volume,
        IMP_GALLON_M3,
        &["impgal", "gal(uk)", "ukgal"],
    ),
    u("ft³", Volume, CUBIC_FOOT_M3, &["ft3", "cf"]),
    // Volume flow.
    u("m³/s", VolumeFlow, 1.0, &["m3/s"]),
    u("m³/h", VolumeFlow, 1.0 / 3600.0, &["m3/h", "m3/hr", "cmh"]),
    u("m³/min", VolumeFlow, 1.0 / 60.0, &["m3/min"]),
    u("L/s", VolumeFlow, 1.0e-3, &["l/s", "lps"]),
    u("L/min", VolumeFlow, 1.0e-3 / 60.0, &["l/min", "lpm"]),
    u("L/h", VolumeFlow, 1.0e-3 / 3600.0, &["l/h", "lph"]),
    u(
        "US gpm",
        VolumeFlow,
        US_GALLON_M3 / 60.0,
        &["gpm", "usgpm", "gal/min"],
    ),
    u(
        "imp gpm",
        VolumeFlow,
        IMP_GALLON_M3 / 60.0,
        &["impgpm", "igpm"],
    ),
    u(
        "ft³/min",
        VolumeFlow,
        CUBIC_FOOT_M3 / 60.0,
        &["cfm", "ft3/min"],
    ),
    // Mass flow.
    u("kg/s", MassFlow, 1.0, &[]),
    u("kg/h", MassFlow, 1.0 / 3600.0, &["kg/hr"]),
    u("kg/min", MassFlow, 1.0 / 60.0, &[]),
    u("t/h", MassFlow, 1000.0 / 3600.0, &["t/hr", "tph"]),
    u("lb/h", MassFlow, POUND_KG / 3600.0, &["lb/hr", "pph"]),
    // Percent.
    u("%", Percent, 1.0, &["percent", "pct"]),
    // Electrical quantities at the loop.
    u("A", Current, 1.0, &["amp"]),
    u("mA", Current, 1.0e-3, &["milliamp"]),
    u("V", Voltage, 1.0, &["volt", "volts", "vdc"]),
    u("mV", Voltage, 1.0e-3, &["millivolt"]),
    u("Ω", Resistance, 1.0, &["ohm", "ohms"]),
    u("kΩ", Resistance, 1.0e3, &["kohm", "kohms"]),
    // Temperature — offsets so that si = value × factor + offset gives kelvin.
    Unit {
        symbol: "°C",
        quantity: Temperature,
        factor: 1.0,
        offset: 273.15,
        aliases: &["c", "degc", "deg c", "celsius", "ºc"],
    },
    // °F: K = (°F + 459.67) × 5/9 (NIST SP 811 B.9, exact).
    Unit {
        symbol: "°F",
        quantity: Temperature,
        factor: 5.0 / 9.0,
        offset: 459.67 * 5.0 / 9.0,
        aliases: &["f", "degf", "deg f", "fahrenheit", "ºf"],
    },
    u("K", Temperature, 1.0, &["kelvin"]),
];

fn normalise(text: &str) -> String {
    text.trim()
        .replace(['³'], "3")
        .replace(['²'], "2")
        .replace('µ', "u")
        .to_lowercase()
}

/// The known unit a technician means by `text` (symbol or alias, any case), if any.
pub fn lookup(text: &str) -> Option<&'static Unit> {
    let wanted = normalise(text);
    if wanted.is_empty() {
        return None;
    }
    // Exact spelling first, so that `K` (kelvin) is not taken for the `k` alias of kΩ.
    let exact = text.trim();
    UNITS
        .iter()
        .find(|unit| unit.symbol == exact || unit.aliases.contains(&exact))
        .or_else(|| {
            UNITS.iter().find(|unit| {
                normalise(unit.symbol) == wanted
                    || unit.aliases.iter().any(|a| normalise(a) == wanted)
            })
        })
}

/// A tag's engineering unit: either one loopside can convert, or free text kept as typed.
#[derive(Debug, Clone, PartialEq)]
pub enum EngUnit {
    /// A unit from the table; conversions are possible.
    Known(&'static Unit),
    /// Free text such as `pH`; shown as typed, never converted.
    Free(String),
}

impl EngUnit {
    /// Read a unit as typed; an unknown unit becomes free text.
    pub fn parse(text: &str) -> EngUnit {
        match lookup(text) {
            Some(unit) => EngUnit::Known(unit),
            None => EngUnit::Free(text.trim().to_string()),
        }
    }

    /// The symbol to show.
    pub fn symbol(&self) -> &str {
        match self {
            EngUnit::Known(unit) => unit.symbol,
            EngUnit::Free(text) => text,
        }
    }
}

/// Convert `value` from one unit to another of the same quantity.
///
/// Errors name the field `from` or `to` when a unit is unknown, and `to` when the two
/// units measure different things (bar to m³/h) — loopside never guesses a density.
pub fn convert(value: f64, from: &str, to: &str) -> Result<f64> {
    crate::error::finite("value", value)?;
    let from_unit = lookup(from).ok_or_else(|| unknown("from", from))?;
    let to_unit = lookup(to).ok_or_else(|| unknown("to", to))?;
    convert_units(value, from_unit, to_unit)
}

/// Convert between two known units; errors if they measure different quantities.
pub fn convert_units(value: f64, from: &Unit, to: &Unit) -> Result<f64> {
    if from.quantity != to.quantity {
        return Err(FieldError::new(
            "to",
            format!(
                "cannot convert {} ({}) to {} ({})",
                from.symbol,
                from.quantity.name(),
                to.symbol,
                to.quantity.name()
            ),
        ));
    }
    Ok(to.from_si(from.to_si(value)))
}

fn unknown(field: &str, text: &str) -> FieldError {
    FieldError::new(
        field,
        format!(
            "unknown unit '{}'; known units include Pa, kPa, bar, mbar, psi, inH2O, mmH2O, m, ft, °C, °F, m³/h, L/s, US gpm, kg/h, %",
            text.trim()
        ),
    )
}

/// All unit symbols of one quantity, for pick lists.
pub fn symbols_of(quantity: Quantity) -> Vec<&'static str> {
    UNITS
        .iter()
        .filter(|u| u.quantity == quantity)
        .map(|u| u.symbol)
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn lookup_accepts_common_spellings() {
        assert_eq!(lookup("m3/h").map(|u| u.symbol), Some("m³/h"));
        assert_eq!(lookup(" PSI ").map(|u| u.symbol), Some("psi"));
        assert_eq!(lookup("degC").map(|u| u.symbol), Some("°C"));
        assert_eq!(lookup("ohm").map(|u| u.symbol), Some("Ω"));
        assert!(lookup("pH").is_none());
        assert!(lookup("").is_none());
    }

    #[test]
    fn temperatures_use_offsets() {
        // NIST SP 811 B.9: t/°F = 1.8 t/°C + 32.
        assert!((convert(100.0, "°C", "°F").unwrap() - 212.0).abs() < 1e-9);
        assert!((convert(-40.0, "°F", "°C").unwrap() + 40.0).abs() < 1e-9);
        assert!((convert(0.0, "°C", "K").unwrap() - 273.15).abs() < 1e-9);
    }

    #[test]
    fn different_quantities_do_not_convert() {
        let e = convert(1.0, "bar", "m³/h").unwrap_err();
        assert_eq!(e.field, "to");
        assert!(convert(1.0, "bar", "furlong").unwrap_err().field == "to");
        assert!(convert(1.0, "pH", "bar").unwrap_err().field == "from");
    }
}
