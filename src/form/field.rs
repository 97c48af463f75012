//! The one table of form field names: every error a form reports names one of these, in
//! the same words on the screen and on the command line (where the flag that fills the
//! field is added, so the technician knows what to retype).

use crate::error::FieldError;
use std::fmt;

/// One field of a form, as the technician sees it.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum Field {
    /// The tag number.
    Tag,
    /// What the loop measures or drives.
    Service,
    /// Where the loop is in the plant.
    Area,
    /// The value at the low end of the signal.
    Lrv,
    /// The value at the high end of the signal.
    Urv,
    /// LRV and URV together (a zero span, or `LRV..URV` typed as one).
    Range,
    /// The engineering unit of the range.
    Unit,
    /// How the signal maps to the value: linear, square root, table.
    Transfer,
    /// The square-root low-flow cutoff.
    Cutoff,
    /// A characterisation table's IN:OUT pairs.
    Table,
    /// The signal span in mA (4–20, 0–20 …).
    Signal,
    /// The check tolerance, % of span.
    Tolerance,
    /// The nominal loop supply.
    Supply,
    /// How far the supply may sag below nominal.
    SupplySag,
    /// The transmitter's minimum terminal voltage (lift-off).
    TxMin,
    /// The upscale fault current the device drives.
    FaultCurrent,
    /// A resistor or volt drop in series with the loop.
    SeriesElement,
    /// The top of the HART resistance window.
    HartMax,
    /// One-way cable length.
    CableLength,
    /// Conductor size (mm² or AWG).
    Conductor,
    /// Conductor temperature.
    ConductorTemp,
    /// The sensor: RTD or thermocouple kind.
    Sensor,
    /// RTD lead wiring (2, 3 or 4 wires).
    Wiring,
    /// Resistance of one RTD lead.
    LeadOhms,
    /// A loop current typed on Convert, mA.
    Ma,
    /// A percentage of span typed on Convert.
    Percent,
    /// An engineering value typed on Convert.
    Value,
    /// Volts across the sense resistor typed on Convert.
    Volts,
    /// The sense resistor on Convert.
    Ohms,
    /// A sensor temperature typed in the sensor calculator.
    Temperature,
    /// A thermocouple's EMF typed in the sensor calculator.
    Millivolts,
    /// The thermocouple's cold-junction temperature.
    ColdJunction,
    /// The allowance between two mA readings in fault-finding.
    MeterTolerance,
    /// How the loop is built, from the short list (two-wire, four-wire, analog output …).
    Topology,
    /// What supplies the loop's voltage, as wired (supply, active input, current output).
    Source,
    /// A current source's compliance: volts at 20 mA or maximum load.
    Compliance,
    /// A three-wire transmitter's own supply current.
    OwnCurrent,
    /// The cable's capacitance per metre, for HART's RC limit.
    CableCapacitance,
    /// The devices' capacitance across the pair, for HART's RC limit.
    DevicesCapacitance,
}

impl Field {
    /// Every field, in the order the forms show them.
    pub const ALL: [Field; 39] = [
        Field::Tag,
        Field::Service,
        Field::Area,
        Field::Lrv,
        Field::Urv,
        Field::Range,
        Field::Unit,
        Field::Transfer,
        Field::Cutoff,
        Field::Table,
        Field::Signal,
        Field::Tolerance,
        Field::Supply,
        Field::SupplySag,
        Field::TxMin,
        Field::FaultCurrent,
        Field::SeriesElement,
        Field::HartMax,
        Field::CableLength,
        Field::Conductor,
        Field::ConductorTemp,
        Field::Sensor,
        Field::Wiring,
        Field::LeadOhms,
        Field::Ma,
        Field::Percent,
        Field::Value,
        Field::Volts,
        Field::Ohms,
        Field::Temperature,
        Field::Millivolts,
        Field::ColdJunction,
        Field::MeterTolerance,
        Field::Topology,
        Field::Source,
        Field::Compliance,
        Field::OwnCurrent,
        Field::CableCapacitance,
        Field::DevicesCapacitance,
    ];

    /// The field's name in every error message, as the screen labels it.
    pub fn name(self) -> &'static str {
        match self {
            Field::Tag => "tag",
            Field::Service => "service",
            Field::Area => "area",
            Field::Lrv => "LRV",
            Field::Urv => "URV",
            Field::Range => "range",
            Field::Unit => "unit",
            Field::Transfer => "transfer",
            Field::Cutoff => "cutoff",
            Field::Table => "table",
            Field::Signal => "signal",
            Field::Tolerance => "tolerance",
            Field::Supply => "supply",
            Field::SupplySag => "supply sag",
            Field::TxMin => "transmitter minimum",
            Field::FaultCurrent => "fault current",
            Field::SeriesElement => "series element",
            Field::HartMax => "HART window top",
            Field::CableLength => "cable length",
            Field::Conductor => "conductor",
            Field::ConductorTemp => "conductor temperature",
            Field::Sensor => "sensor",
            Field::Wiring => "wiring",
            Field::LeadOhms => "lead ohms",
            Field::Ma => "mA",
            Field::Percent => "percent",
            Field::Value => "value",
            Field::Volts => "volts",
            Field::Ohms => "ohms",
            Field::Temperature => "temperature",
            Field::Millivolts => "millivolts",
            Field::ColdJunction => "cold junction",
            Field::MeterTolerance => "meter tolerance",
            Field::Topology => "topology",
            Field::Source => "source",
            Field::Compliance => "compliance",
            Field::OwnCurrent => "transmitter's own current",
            Field::CableCapacitance => "cable capacitance",
            Field::DevicesCapacitance => "devices' capacitance",
        }
    }

    /// The command-line flag(s) that fill this field.
    pub fn flag(self) -> &'static str {
        match self {
            Field::Tag => "NUMBER",
            Field::Service => "--service",
            Field::Area => "--area",
            Field::Lrv | Field::Urv | Field::Range => "--range",
            Field::Unit => "--unit",
            Field::Transfer => "--sqrt / --table",
            Field::Cutoff => "--cutoff / --cutoff-dp",
            Field::Table => "--table",
            Field::Signal => "--signal",
            Field::Tolerance => "--tolerance",
            Field::Supply => "--supply",
            Field::SupplySag => "--supply-tolerance",
            Field::TxMin => "--min-volts",
            Field::FaultCurrent => "--fault-ma",
            Field::SeriesElement => "--load / --drop",
            Field::HartMax => "--hart-max-ohms",
            Field::CableLength => "--cable-m",
            Field::Conductor => "--awg / --mm2",
            Field::ConductorTemp => "--temp-c",
            Field::Sensor => "--rtd / --tc / --type",
            Field::Wiring => "--wires",
            Field::LeadOhms => "--lead-ohms",
            Field::Ma => "--ma",
            Field::Percent => "--percent",
            Field::Value => "--value",
            Field::Volts => "--volts",
            Field::Ohms => "--ohms",
            Field::Temperature => "--temp-c",
            Field::Millivolts => "--mv",
            Field::ColdJunction => "--cj-c",
            Field::MeterTolerance => "--meter-tolerance",
            Field::Topology => "--topology",
            Field::Source => "--source",
            Field::Compliance => "--compliance-volts / --max-load-ohms",
            Field::OwnCurrent => "--own-ma",
            Field::CableCapacitance => "--cable-pf-per-m",
            Field::DevicesCapacitance => "--devices-nf",
        }
    }

    /// The field a name in an error message stands for: a name from this table, or the
    /// parameter name a core computation uses for the same thing (`tx_min_volts`).
    pub fn from_name(name: &str) -> Option<Field> {
        if let Some(f) = Field::ALL.iter().find(|f| f.name() == name) {
            return Some(*f);
        }
        Some(match name {
            "supply_volts" => Field::Supply,
            "supply_tolerance_percent" => Field::SupplySag,
            "tx_min_volts" => Field::TxMin,
            "fault_ma" => Field::FaultCurrent,
            "hart_min_ohms" | "hart_max_ohms" => Field::HartMax,
            "cable_m" | "length_m" => Field::CableLength,
            "awg" | "mm2" => Field::Conductor,
            "temp_c" => Field::ConductorTemp,
            "compliance_volts" | "max_load_ohms" => Field::Compliance,
            "own_ma" => Field::OwnCurrent,
            "cable_pf_per_m" => Field::CableCapacitance,
            "devices_nf" => Field::DevicesCapacitance,
            "signal (low mA)" | "signal (high mA)" => Field::Signal,
            _ if name.starts_with("table") => Field::Table,
            _ => return None,
        })
    }
}

impl fmt::Display for Field {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.name())
    }
}

/// A form's error: the field from the table, the row for a field that repeats (a series
/// element), and the reason with the allowed range.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct FormError {
    /// The field that is wrong.
    pub field: Field,
    /// For a repeated field, which one (0-based), so the screen can mark its row.
    pub row: Option<usize>,
    /// Why it was refused, in words the technician can act on.
    pub reason: String,
}

impl FormError {
    /// An error for `field`.
    pub fn new(field: Field, reason: impl Into<String>) -> FormError {
        FormError {
            field,
            row: None,
            reason: reason.into(),
        }
    }

    /// A core error reported under the form's `field` (the core's own parameter name is
    /// dropped; its reason, with the allowed range, is kept).
    pub fn at(field: Field) -> impl Fn(FieldError) -> FormError {
        move |e| FormError::new(field, e.reason)
    }

    /// A core error from a whole-object check (`LoopConfig::validate`, `Scale::new`),
    /// named by the table when the core's name is known, else under `fallback`.
    pub fn from_core(e: FieldError, fallback: Field) -> FormError {
        let field = Field::from_name(&e.field).unwrap_or(fallback);
        FormError::new(field, e.reason)
    }

    /// The error as the command line prints it: the field's name and its flag.
    pub fn on_command_line(self) -> FieldError {
        FieldError::new(
            format!("{} ({})", self.field.name(), self.field.flag()),
            self.reason,
        )
    }
}

impl fmt::Display for FormError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{}: {}", self.field.name(), self.reason)
    }
}

impl std::error::Error for FormError {}

impl From<FormError> for FieldError {
    /// The error as the screens show it, named by the table.
    fn from(e: FormError) -> FieldError {
        FieldError::new(e.field.name(), e.reason)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_name_in_the_table_reads_back_as_its_field() {
        for f in Field::ALL {
            assert_eq!(Field::from_name(f.name()), Some(f));
            assert!(!f.flag().is_empty());
        }
        assert_eq!(Field::from_name("tx_min_volts"), Some(Field::TxMin));
        assert_eq!(Field::from_name("colour"), None);
    }

    #[test]
    fn the_command_line_adds_the_flag() {
        let e = FormError::new(Field::TxMin, "must be 0 or more, got -1").on_command_line();
        assert_eq!(
            e.to_string(),
            "transmitter minimum (--min-volts): must be 0 or more, got -1"
        );
    }
}
