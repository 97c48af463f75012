//! Every error a form can give names a field from the one table (`loopside::form::Field`),
//! in the same words on the screen and on the command line.
//!
//! Each form is driven with bad text in each of its fields; every field named must be in
//! the table, read back by name, and the command line's message must start with that name
//! followed by its flag.

use loopside::form::conductor::{parse_conductor, parse_temp_c};
use loopside::form::loop_form::{ElementText, LoopForm};
use loopside::form::range::{Bounds, CutoffOf, RangeForm, TransferChoice};
use loopside::form::sensor::SensorForm;
use loopside::form::{Field, FormError};
use loopside::FieldError;
use std::collections::BTreeSet;

/// What technicians mistype: nothing, words, negatives, absurd sizes, NaN, a zero span,
/// a range backwards, half a table pair.
const BAD: [&str; 12] = [
    "", "lots", "-1", "1e9", "NaN", "0", "150", "5..5", "20..4", "0:0;1", "4-20", "1 bar",
];

/// A 24 V level loop that parses (LT-110 at Brindlemoor, as on the tag form).
fn good_loop() -> LoopForm {
    LoopForm {
        supply: "24".into(),
        sag: "5".into(),
        tx_min: "10,5".into(),
        fault: "21".into(),
        elements: vec![ElementText::from_flag("Card input=250", false, 1)],
        cable_m: "180".into(),
        conductor: "1.0 mm²".into(),
        temp_c: "20".into(),
        hart_max: "1100".into(),
    }
}

/// FT-310's range: 0–3000 m³/h, square root in the receiver, 1 % cutoff.
fn good_range() -> RangeForm {
    RangeForm {
        bounds: Bounds::Apart {
            lrv: "0".into(),
            urv: "3000".into(),
        },
        unit: "m3/h".into(),
        transfer: TransferChoice::RootInReceiver,
        cutoff: "1".into(),
        cutoff_of: CutoffOf::Flow,
        signal: "4..20".into(),
        ..Default::default()
    }
}

/// The field named, checked on both fronts' wording.
fn named(e: FormError, seen: &mut BTreeSet<&'static str>) {
    let screen = FieldError::from(e.clone());
    assert_eq!(
        Field::from_name(&screen.field),
        Some(e.field),
        "{screen} reads back as its field"
    );
    let cli = e.clone().on_command_line().to_string();
    assert!(
        cli.starts_with(&format!("{} ({})", e.field.name(), e.field.flag())),
        "{cli}"
    );
    seen.insert(e.field.name());
}

#[test]
fn every_field_a_loop_form_names_is_in_the_table() {
    let mut seen = BTreeSet::new();
    let setters: [fn(&mut LoopForm, &str); 10] = [
        |f, t| f.supply = t.into(),
        |f, t| f.sag = t.into(),
        |f, t| f.tx_min = t.into(),
        |f, t| f.fault = t.into(),
        |f, t| f.elements[0].value = t.into(),
        |f, t| f.cable_m = t.into(),
        |f, t| f.conductor = t.into(),
        |f, t| f.temp_c = t.into(),
        |f, t| f.hart_max = t.into(),
        |f, t| f.elements.push(ElementText::from_flag(t, true, 1)),
    ];
    for set in setters {
        for bad in BAD {
            let mut f = good_loop();
            set(&mut f, bad);
            if let Err(e) = f.parse() {
                named(e, &mut seen);
            }
        }
    }
    let expected: BTreeSet<&str> = [
        Field::Supply,
        Field::SupplySag,
        Field::TxMin,
        Field::FaultCurrent,
        Field::SeriesElement,
        Field::CableLength,
        Field::Conductor,
        Field::ConductorTemp,
        Field::HartMax,
    ]
    .iter()
    .map(|f| f.name())
    .collect();
    assert_eq!(seen, expected, "each loop field is named when it is wrong");
}

#[test]
fn every_field_a_range_form_names_is_in_the_table() {
    let mut seen = BTreeSet::new();
    let setters: [fn(&mut RangeForm, &str); 7] = [
        |f, t| {
            f.bounds = Bounds::Apart {
                lrv: t.into(),
                urv: "3000".into(),
            }
        },
        |f, t| {
            f.bounds = Bounds::Apart {
                lrv: "0".into(),
                urv: t.into(),
            }
        },
        |f, t| f.bounds = Bounds::Together(t.into()),
        |f, t| f.cutoff = t.into(),
        |f, t| f.signal = t.into(),
        |f, t| {
            f.transfer = TransferChoice::Table;
            f.table = t.into();
        },
        |f, t| f.unit = t.into(),
    ];
    for set in setters {
        for bad in BAD {
            let mut f = good_range();
            set(&mut f, bad);
            if let Err(e) = f.parse(None) {
                named(e, &mut seen);
            }
        }
    }
    let expected: BTreeSet<&str> = [
        Field::Lrv,
        Field::Urv,
        Field::Range,
        Field::Cutoff,
        Field::Signal,
        Field::Table,
    ]
    .iter()
    .map(|f| f.name())
    .collect();
    assert_eq!(seen, expected, "each range field is named when it is wrong");
}

#[test]
fn the_conductor_form_names_its_fields() {
    let mut seen = BTreeSet::new();
    for bad in BAD {
        if let Err(e) = parse_conductor(bad) {
            named(e, &mut seen);
        }
        if let Err(e) = parse_temp_c(bad) {
            named(e, &mut seen);
        }
    }
    let expected: BTreeSet<&str> = [Field::Conductor.name(), Field::ConductorTemp.name()].into();
    assert_eq!(seen, expected);
}

#[test]
fn the_sensor_form_names_its_fields() {
    // A Pt100 with every other field bad in turn, then a type K likewise.
    let mut seen = BTreeSet::new();
    let pt100 = || SensorForm {
        kind: "Pt100".into(),
        ..SensorForm::default()
    };
    let type_k = || SensorForm {
        kind: "type K".into(),
        ..SensorForm::default()
    };
    for bad in BAD {
        for form in [
            SensorForm {
                kind: bad.to_string(),
                ..SensorForm::default()
            },
            SensorForm {
                wiring: bad.to_string(),
                ..pt100()
            },
            SensorForm {
                lead_ohms: bad.to_string(),
                ..pt100()
            },
            SensorForm {
                cold_junction: bad.to_string(),
                ..type_k()
            },
        ] {
            if let Err(e) = form.parse() {
                named(e, &mut seen);
            }
        }
    }
    let expected: BTreeSet<&str> = [
        Field::Sensor.name(),
        Field::Wiring.name(),
        Field::LeadOhms.name(),
        Field::ColdJunction.name(),
    ]
    .into();
    assert_eq!(seen, expected);
}

#[test]
fn the_table_has_one_name_per_field() {
    let names: BTreeSet<&str> = Field::ALL.iter().map(|f| f.name()).collect();
    assert_eq!(names.len(), Field::ALL.len(), "no two fields share a name");
}
