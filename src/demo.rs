//! The demo plant: Brindlemoor Water Reclamation Works, an invented municipal plant.
//!
//! Eight tags (the ranges, transfers and loops of the product brief, and a trip loop) and
//! a few days of plausible log entries (an open follow-up, a loop check that failed as found and
//! passed as left, a fault-finding session that found a loose wire, ordinary notes).
//! People appear by initials only. [`fill`] puts it all into an empty store and refuses
//! a store that already holds anything.
//!
//! TT-412 runs through an intrinsic-safety barrier: its IS data ([`tt412_circuit`]) and
//! one IS check in its log are invented demo values (plausible for a 28 V / 93 mA
//! barrier channel and a temperature transmitter), marked as demo in their names and
//! certificate references.
//!
//! Calibration (invented, for the demo): three reference instruments (a pressure module, a
//! loop calibrator for mA, a decade box, the last one past its calibration due date),
//! calibration intervals on every tag, a trip loop (LT-610, the digester gas holder's
//! high-high level trip to a safety function) with its yearly trip tests, and three years
//! of as-found checks of LT-101 whose error grows visit by visit.
//!
//! Beyond two-wire inputs, five more loops of the same works (all figures INVENTED for
//! the demo): FV-315, an analog output driving the aeration air control valve's positioner
//! (air to open, fails closed); TV-418A/B, a split-range pair of digester heating and
//! cooling water valves on one output; AIT-531, a four-wire turbidity analyser on its own
//! mains supply; PT-208, a pressure loop through an isolator. Their log has stroke checks
//! (one failed as found and passed as left), a four-wire commissioning fault (two sources
//! in one loop) and a note on the isolator's budget.
//!
//! Where the brief gives no figure, the plant standard assumed here is a 24 V supply and
//! a 10.5 V transmitter minimum; those are marked in each tag's notes.

use crate::budget::topology::{Compliance, Device, Topology};
use crate::budget::{Cable, LoopConfig, SeriesElement};
use crate::check::Stage;
use crate::error::{FieldError, Result};
use crate::journal::{Entry, Kind, TagId};
use crate::leave::{Item, LeaveList};
use crate::rtd::{RtdKind, Wiring};
use crate::scale::{CharTable, RootLocation, Scale, SignalSpan, TablePoint, Transfer};
use crate::sensor::Sensor;
use crate::store::{Store, StoreError, StoreResult};
use crate::stroke::{ReadAt, StrokeInput, StrokeRecord, FIVE_POINTS};
use crate::tag::Tag;
use crate::valve::{FailPosition, Valve, ValveAction};
use crate::wire::Conductor;
use chrono::{DateTime, Duration, FixedOffset, NaiveTime, TimeZone};
use serde_json::json;

/// Name of the demo plant.
pub const PLANT: &str = "Brindlemoor Water Reclamation Works";

/// LT-605 tank: inside diameter, m.
pub const TANK_DIAMETER_M: f64 = 2.0;
/// LT-605 tank: volume when full, m³.
pub const TANK_FULL_M3: f64 = 12.0;

/// Volume of liquid in a horizontal cylinder of diameter `d` and full volume `full` at
/// level `h` (from the bottom): length × circular-segment area,
/// A = r²·acos((r − h)/r) − (r − h)·√(2rh − h²).
pub fn horizontal_cylinder_volume(h: f64, d: f64, full: f64) -> f64 {
    let r = d / 2.0;
    let length = full / (std::f64::consts::PI * r * r);
    let h = h.clamp(0.0, d);
    let area = r * r * ((r - h) / r).clamp(-1.0, 1.0).acos()
        - (r - h) * (2.0 * r * h - h * h).max(0.0).sqrt();
    length * area
}

/// The LT-605 level → volume table: 21 points, every 0.1 m from empty to full.
pub fn tank_table() -> Result<CharTable> {
    let points = (0..=20)
        .map(|i| {
            let h = f64::from(i) * TANK_DIAMETER_M / 20.0;
            TablePoint {
                input: h,
                output: horizontal_cylinder_volume(h, TANK_DIAMETER_M, TANK_FULL_M3),
            }
        })
        .collect();
    CharTable::new(points, "m³")
}

/// A loop on the plant standard supply, with the brief's series elements. Tags that get
/// one also get [`ASSUMED`] in their notes.
fn plant_loop(elements: Vec<SeriesElement>) -> LoopConfig {
    let mut l = LoopConfig::new(24.0, 10.5);
    l.elements = elements;
    l
}

const ASSUMED: &str = "Supply 24 V and transmitter minimum 10.5 V are the plant standard.";

fn tag(number: &str, service: &str, area: &str, scale: Scale) -> Result<Tag> {
    let mut t = Tag::new(number, scale)?;
    t.service = service.to_string();
    t.area = area.to_string();
    Ok(t)
}

/// TT-412's intrinsically safe circuit: INVENTED demo values, not from any real
/// certificate. A 28 V / 93 mA / 0.65 W barrier channel with its group IIB output
/// parameters, the transmitter, its Pt100 (simple apparatus) and 185 m of instrument cable,
/// in a digester area classified IIB T3 for the demo.
pub fn tt412_circuit() -> crate::intrinsic::Circuit {
    use crate::intrinsic::{Cable, Circuit, Device, DeviceKind, GasGroup, Source, TempClass};
    Circuit {
        source: Source {
            name: "IS barrier, MCC-2 rack 3 slot 7 (demo)".to_string(),
            certificate: "BWR-DEMO-IS-0412 (invented)".to_string(),
            uo_volts: 28.0,
            io_ma: 93.0,
            po_watts: 0.65,
            co_farads: 650e-9,
            lo_henries: 12.6e-3,
            lo_ro_henries_per_ohm: Some(165e-6),
            group: Some(GasGroup::IIB),
        },
        devices: vec![
            Device {
                name: "TT-412 transmitter".to_string(),
                certificate: "BWR-DEMO-TX-7731 (invented)".to_string(),
                kind: DeviceKind::Entity {
                    ui_volts: 30.0,
                    ii_ma: 100.0,
                    pi_watts: 0.75,
                    group: Some(GasGroup::IIC),
                    t_class: Some(TempClass::T4),
                },
                ci_farads: 5e-9,
                li_henries: 10e-6,
                temporary: false,
            },
            Device {
                name: "Pt100 in thermowell".to_string(),
                certificate: String::new(),
                kind: DeviceKind::Simple,
                ci_farads: 0.0,
                li_henries: 0.0,
                temporary: false,
            },
        ],
        cable: Cable {
            length_m: 185.0,
            farads_per_m: Some(110e-12),
            henries_per_m: Some(0.7e-6),
            lr_henries_per_ohm: None,
        },
        area_group: GasGroup::IIB,
        area_t_class: Some(TempClass::T3),
    }
}

/// The demo tags: the seven of the product brief and the trip loop LT-610.
pub fn tags() -> Result<Vec<Tag>> {
    let mut lt101 = tag(
        "LT-101",
        "Inlet wet well level",
        "Inlet works, JB-01",
        Scale::linear(0.0, 4.5, "m")?,
    )?;
    let mut l = plant_loop(vec![SeriesElement::ohms("PLC input", 250.0)]);
    l.cable = Some(Cable {
        one_way_m: 180.0,
        conductor: Conductor::mm2(1.0)?,
        temp_c: 20.0,
    });
    lt101.loop_config = Some(l);
    lt101.notes = "Transmitter minimum 10.5 V from the datasheet; 24 V loop supply.".to_string();

    let mut pt204 = tag(
        "PT-204",
        "Raw pump 2 discharge pressure",
        "Raw pump house",
        Scale::linear(0.0, 10.0, "bar")?,
    )?;
    pt204.hart = true;
    pt204.notes = ASSUMED.to_string();
    pt204.loop_config = Some(plant_loop(vec![SeriesElement::ohms(
        "HART resistor",
        250.0,
    )]));

    let mut ft310 = tag(
        "FT-310",
        "Aeration air header flow",
        "Blower hall",
        Scale::new(
            0.0,
            3000.0,
            "m³/h",
            Transfer::SquareRoot {
                cutoff_percent: 1.0,
                root_in: RootLocation::Receiver,
            },
            SignalSpan::default(),
        )?,
    )?;
    ft310.notes = format!("DP transmitter 0–2500 Pa; square root taken in the PLC. {ASSUMED}");
    ft310.loop_config = Some(plant_loop(vec![SeriesElement::ohms("PLC input", 250.0)]));

    let mut tt412 = tag(
        "TT-412",
        "Digester sludge temperature",
        "Digester 1, hazardous area",
        Scale::linear(-20.0, 80.0, "°C")?,
    )?;
    tt412.notes = ASSUMED.to_string();
    tt412.loop_config = Some(plant_loop(vec![SeriesElement::ohms("IS barrier", 340.0)]));
    // A 3-wire Pt100 in a thermowell: checked by applying ohms at the transmitter's input.
    tt412.sensor = Some(Sensor::Rtd {
        element: RtdKind::Pt100,
        wiring: Wiring::ThreeWire,
        lead_ohms: 0.0,
    });
    tt412.intrinsic = Some(tt412_circuit());

    let mut at520 = tag(
        "AT-520",
        "Final effluent pH",
        "Outfall kiosk",
        Scale::linear(2.0, 12.0, "pH")?,
    )?;
    at520.notes = ASSUMED.to_string();
    at520.loop_config = Some(plant_loop(vec![SeriesElement::drop(
        "field indicator",
        2.5,
    )]));

    let lt605 = tag(
        "LT-605",
        "Ferric dosing tank level (horizontal cylinder)",
        "Chemical dosing bund",
        Scale::new(
            0.0,
            TANK_DIAMETER_M,
            "m",
            Transfer::Table(tank_table()?),
            SignalSpan::default(),
        )?,
    )?;

    let pdt707 = tag(
        "PDT-707",
        "Sand filter 3 differential pressure",
        "Filter gallery",
        Scale::linear(250.0, 0.0, "mbar")?,
    )?;

    let mut lt610 = tag(
        "LT-610",
        "Digester gas holder level",
        "Digester gas holder",
        Scale::linear(0.0, 6.0, "m")?,
    )?;
    lt610.tolerance_percent = 1.0;
    lt610.notes = format!(
        "High-high level trip at {} m (rising) to the gas holder's safety function via a trip amplifier (demo); proof-tested yearly. {ASSUMED}",
        LT610_TRIP_M
    );
    lt610.loop_config = Some(plant_loop(vec![SeriesElement::ohms(
        "trip amplifier input",
        250.0,
    )]));

    let mut all = vec![lt101, pt204, ft310, tt412, at520, lt605, pdt707, lt610];
    // Calibration intervals, days (invented plant policy).
    for (t, days) in all.iter_mut().zip([365, 365, 180, 365, 90, 730, 365, 365]) {
        t.calibration_interval_days = Some(days);
    }
    // The loops beyond two-wire inputs: a yearly check, the analyser every quarter
    // (invented plant policy, as above).
    for mut t in loops_beyond_two_wire()? {
        t.calibration_interval_days = Some(if t.number.starts_with("AIT") { 90 } else { 365 });
        all.push(t);
    }
    Ok(all)
}

/// LT-610's high-high trip setpoint, m.
pub const LT610_TRIP_M: f64 = 5.4;

/// The demo's reference instruments (invented), with due dates set from `today`: the
/// pressure module and the loop calibrator are in date, the decade box 12 days past due.
pub fn references(today: chrono::NaiveDate) -> Vec<crate::calibration::reference::Reference> {
    use crate::calibration::reference::{FullScaleBasis, Reference, ReferenceAccuracy};
    let accuracy = |reading: f64, full_scale: f64, fixed: f64| ReferenceAccuracy {
        percent_of_reading: reading,
        percent_of_full_scale: full_scale,
        basis: FullScaleBasis::FullScale,
        fixed,
    };
    vec![
        Reference {
            id: "PM-07".to_string(),
            description: "Pressure module 0–20 bar (demo)".to_string(),
            unit: "bar".to_string(),
            range_low: 0.0,
            range_high: 20.0,
            accuracy: accuracy(0.025, 0.01, 0.0),
            calibration_due: today + Duration::days(150),
        },
        Reference {
            id: "MC-02".to_string(),
            description: "Loop calibrator, mA measure and source (demo)".to_string(),
            unit: "mA".to_string(),
            range_low: 0.0,
            range_high: 24.0,
            accuracy: accuracy(0.01, 0.005, 0.001),
            calibration_due: today + Duration::days(40),
        },
        Reference {
            id: "DB-03".to_string(),
            description: "Decade resistance box (demo)".to_string(),
            unit: "Ω".to_string(),
            range_low: 0.0,
            range_high: 400.0,
            accuracy: accuracy(0.02, 0.0, 0.01),
            calibration_due: today - Duration::days(12),
        },
    ]
}

/// 1.0 mm² pair at 20 °C, `m` one way.
fn pair(m: f64) -> Result<Option<Cable>> {
    Ok(Some(Cable {
        one_way_m: m,
        conductor: Conductor::mm2(1.0)?,
        temp_c: 20.0,
    }))
}

/// FV-315, TV-418A, TV-418B, AIT-531 and PT-208: an output loop, a split-range pair, a
/// four-wire analyser and a loop through an isolator (invented figures, see the module).
pub fn loops_beyond_two_wire() -> Result<Vec<Tag>> {
    let mut fv315 = tag(
        "FV-315",
        "Aeration air header control valve",
        "Blower hall",
        Scale::linear(0.0, 100.0, "%")?,
    )?;
    let mut l =
        LoopConfig::current_output(Device::AnalogOutput, Compliance::MaxLoad { ohms: 750.0 });
    l.elements = vec![SeriesElement::drop("positioner", 9.0)];
    l.cable = pair(150.0)?;
    fv315.loop_config = Some(l);
    fv315.valve = Some(Valve {
        action: Some(ValveAction::AirToOpen),
        fail: Some(FailPosition::Closed),
        split_ma: None,
    });
    fv315.notes =
        "PLC analog output, max load 750 Ω; positioner drops 9 V at 20 mA (demo figures)."
            .to_string();

    // One output drives both positioners in series: the split-range pair.
    let mut split_loop =
        LoopConfig::current_output(Device::AnalogOutput, Compliance::Volts { volts: 22.0 });
    split_loop.elements = vec![
        SeriesElement::drop("TV-418A positioner", 9.0),
        SeriesElement::drop("TV-418B positioner", 9.0),
    ];
    split_loop.cable = pair(120.0)?;
    let mut split = Vec::new();
    for (number, service, part) in [
        ("TV-418A", "Digester heating water valve", (4.0, 12.0)),
        ("TV-418B", "Digester cooling water valve", (12.0, 20.0)),
    ] {
        let mut t = tag(
            number,
            service,
            "Digester 1 heat exchanger",
            Scale::linear(0.0, 100.0, "%")?,
        )?;
        t.loop_config = Some(split_loop.clone());
        t.valve = Some(Valve {
            action: Some(ValveAction::AirToOpen),
            fail: Some(FailPosition::Closed),
            split_ma: Some(part),
        });
        t.notes = "Split range on one PLC output (22 V at 20 mA): A over 4–12 mA, B over 12–20 mA (demo figures).".to_string();
        split.push(t);
    }

    let mut ait531 = tag(
        "AIT-531",
        "Final effluent turbidity",
        "Outfall kiosk",
        Scale::linear(0.0, 50.0, "NTU")?,
    )?;
    let mut l = LoopConfig::current_output(Device::FourWire, Compliance::MaxLoad { ohms: 750.0 });
    l.elements = vec![SeriesElement::ohms("PLC input (passive)", 250.0)];
    l.cable = pair(90.0)?;
    ait531.loop_config = Some(l);
    ait531.notes = "Four-wire analyser on its own mains supply; active output, max load 750 Ω (demo figure). The PLC channel must be passive.".to_string();

    let mut pt208 = tag(
        "PT-208",
        "Sludge pump discharge pressure",
        "Sludge pump house",
        Scale::linear(0.0, 16.0, "bar")?,
    )?;
    let mut input = LoopConfig::new(16.5, 10.5);
    input.wiring = Topology::TwoWireActiveInput.wiring();
    input.cable = pair(60.0)?;
    pt208.loop_config = Some(input);
    let mut output =
        LoopConfig::current_output(Device::AnalogOutput, Compliance::MaxLoad { ohms: 600.0 });
    output.elements = vec![SeriesElement::ohms("PLC input", 250.0)];
    output.cable = pair(15.0)?;
    pt208.isolator_outputs = vec![output];
    pt208.notes = "Through an isolator in the MCC: its input side powers the transmitter (16.5 V), its output side drives the PLC input (max load 600 Ω); demo figures.".to_string();

    let mut out = vec![fv315];
    out.extend(split);
    out.push(ait531);
    out.push(pt208);
    for t in &out {
        t.validate()?;
    }
    Ok(out)
}

// The demo's stroke entries' text, as `crate::view::wording::stroke::log_text` words
// their records (tests/topology_demo.rs keeps them alike).
const FV315_FOUND: &str = "Stroke check as found: FAIL: largest error \u{2212}4.0 % of stroke at 75.0 % demand, tolerance \u{b1}2.0 %. Air to open; fails closed; position read at the valve. Blower on manual, operations told. Valve hesitates around 70 %. Before you leave: all done (loop back in its normal mode; links closed; forces and bypasses removed; operations told).";
const FV315_LEFT: &str = "Stroke check as left: PASS: largest error +0.5 % of stroke at 50.0 % demand, tolerance \u{b1}2.0 %. Air to open; fails closed; position read at the valve. Positioner feedback linkage was slipping; re-tightened and auto-calibrated the positioner. Before you leave: all done (loop back in its normal mode; links closed; forces and bypasses removed; operations told).";
const TV418B_FOUND: &str = "Stroke check as found: PASS: largest error \u{2212}1.0 % of stroke at 75.0 % demand, tolerance \u{b1}2.0 %. Split range: this valve over 12.0\u{2013}20.0 mA; air to open; fails closed; position read at the valve. Cooling water valve over its half of the split range (12\u{2013}20 mA). Before you leave: all done (loop back in its normal mode; links closed; forces and bypasses removed; operations told).";

/// A demo stroke check's record: five points rising, ±2 % of stroke, read at the valve.
fn stroke_record(
    position: &[f64],
    valve: Valve,
    stage: Stage,
    date: chrono::NaiveDate,
    note: &str,
) -> Result<StrokeRecord> {
    let result = StrokeInput {
        demand_pct: FIVE_POINTS.to_vec(),
        position_pct: position.to_vec(),
        tolerance_pct: 2.0,
        signal: SignalSpan::default(),
        split_ma: valve.split_ma,
        action: valve.action,
        fail: valve.fail,
    }
    .judge()?;
    Ok(StrokeRecord {
        result,
        date,
        stage,
        read_at: Some(ReadAt::Valve),
        reference: None,
        note: note.to_string(),
        before_leaving: Some(LeaveList::from_done(&Item::ALL)),
    })
}

/// A stroke-check entry in the shape `crate::action::stroke::payload` writes (version 1),
/// with the text `crate::view::wording::stroke::log_text` gives it (a test keeps both
/// alike; the core does not import the wording).
pub fn stroke_entry(
    tag: &TagId,
    time: DateTime<FixedOffset>,
    who: &str,
    record: &StrokeRecord,
    text: &str,
) -> Result<Entry> {
    let mut e = Entry::new(tag, time, who, Kind::StrokeCheck, text)?;
    let mut value =
        serde_json::to_value(record).map_err(|e| FieldError::new("demo", e.to_string()))?;
    value["payload_version"] = json!(1);
    e.payload = Some(value);
    Ok(e)
}

/// What [`fill`] added.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct DemoSummary {
    /// Tags added.
    pub tags: usize,
    /// Entries added.
    pub entries: usize,
}

/// Fill an empty store with the demo plant and log entries from the four days up to
/// `now`. A store that holds anything is refused untouched.
pub fn fill(store: &mut dyn Store, now: DateTime<FixedOffset>) -> StoreResult<DemoSummary> {
    if !store.is_empty() {
        return Err(StoreError::Input(FieldError::new(
            "data-dir",
            format!(
                "the store already holds {} tag(s) and {} entr(ies); the demo only fills an empty store",
                store.tags().len(),
                store.entries().len()
            ),
        )));
    }
    let mut ids = Vec::new();
    for t in tags()? {
        ids.push(store.add_tag(t)?);
    }
    let mut entries = history(&ids, now)?;
    entries.extend(entries_of_the_week(&ids, now)?);
    let n = entries.len();
    for e in entries {
        store.append(e)?;
    }
    for r in references(now.date_naive()) {
        store.save_reference(r)?;
    }
    Ok(DemoSummary {
        tags: ids.len(),
        entries: n,
    })
}

/// The calibration history, oldest first: LT-101's as-found checks one, two and three
/// years before `now` (the error growing visit by visit, never adjusted: each passed), and
/// LT-610's yearly trip tests a year ago and last week.
fn history(ids: &[TagId], now: DateTime<FixedOffset>) -> Result<Vec<Entry>> {
    let tags = tags()?;
    let (Some(lt101_id), Some(lt610_id), Some(lt101), Some(lt610)) =
        (ids.first(), ids.get(7), tags.first(), tags.get(7))
    else {
        return Err(FieldError::new("demo", "tag list is shorter than expected"));
    };
    let offset = *now.offset();
    let at = |days_ago: i64, h: u32| -> Result<DateTime<FixedOffset>> {
        let date = now.date_naive() - Duration::days(days_ago);
        offset
            .from_local_datetime(&date.and_hms_opt(h, 0, 0).unwrap_or_default())
            .single()
            .ok_or_else(|| FieldError::new("demo", "bad local time"))
    };
    let to_json = |v: std::result::Result<serde_json::Value, serde_json::Error>| {
        v.map_err(|e| FieldError::new("demo", e.to_string()))
    };
    let mut v = Vec::new();
    // LT-101 as found: +0.10, +0.18, +0.27 % of span at every point (0.016, 0.0288,
    // 0.0432 mA high), within ±0.5 %, left as found.
    for (days_ago, offset_ma) in [(1095, 0.016), (730, 0.0288), (365, 0.0432)] {
        let when = at(days_ago, 9)?;
        let measured: Vec<f64> = [4.0, 8.0, 12.0, 16.0, 20.0, 16.0, 12.0, 8.0, 4.0]
            .iter()
            .map(|m| m + offset_ma)
            .collect();
        let result = crate::check::LoopCheck::for_tag(
            lt101,
            crate::check::Device::Transmitter,
            when.date_naive(),
        )
        .note("Yearly check (demo history); left as found.")
        .run_planned(&measured)?;
        let mut e = Entry::new(
            lt101_id,
            when,
            "AB",
            Kind::LoopCheck,
            &format!(
                "Yearly five-point check as found: pass, every point {} % of span high; left as found.",
                crate::display::signed_percent_number(offset_ma / 16.0 * 100.0)
            ),
        )?;
        // The shape `crate::action::check::payload` writes (version 2); a test keeps the
        // two alike.
        let mut payload = to_json(serde_json::to_value(&result))?;
        payload["payload_version"] = json!(2);
        e.payload = Some(payload);
        v.push(e);
    }
    // LT-610 high-high trip, tested rising three times each year.
    for (days_ago, trips, resets) in [
        (365, [5.43, 5.44, 5.42], [5.31, 5.32, 5.30]),
        (6, [5.44, 5.45, 5.44], [5.32, 5.33, 5.32]),
    ] {
        let when = at(days_ago, 10)?;
        let result = crate::calibration::trip::TripTest::new(
            &lt610.scale,
            when.date_naive(),
            LT610_TRIP_M,
            crate::calibration::trip::TripDirection::Rising,
            lt610.tolerance_percent,
        )
        .tag_number(&lt610.number)
        .note("Yearly proof test of the high-high trip (demo); bypassed under permit, restored, operations told.")
        .run(&trips, &resets)?;
        let mut e = Entry::new(
            lt610_id,
            when,
            "CD",
            Kind::TripTest,
            &format!(
                "Trip test at {} m, trips on rising: {} (demo history)",
                LT610_TRIP_M,
                if result.pass { "PASS" } else { "FAIL" }
            ),
        )?;
        // The shape `crate::action::trip::payload` writes (version 1).
        let mut payload = to_json(serde_json::to_value(&result))?;
        payload["payload_version"] = json!(1);
        e.payload = Some(payload);
        v.push(e);
    }
    Ok(v)
}

/// The demo log of the last few days for tag ids in the order of [`tags`], ending just
/// before `now`.
fn entries_of_the_week(ids: &[TagId], now: DateTime<FixedOffset>) -> Result<Vec<Entry>> {
    let id = |i: usize| {
        ids.get(i)
            .cloned()
            .ok_or_else(|| FieldError::new("demo", "tag list is shorter than expected"))
    };
    let offset = *now.offset();
    let at = |days_ago: i64, h: u32, m: u32| -> Result<DateTime<FixedOffset>> {
        let date = now.date_naive() - Duration::days(days_ago);
        let time = NaiveTime::from_hms_opt(h, m, 0)
            .ok_or_else(|| FieldError::new("demo", "bad time of day"))?;
        offset
            .from_local_datetime(&date.and_time(time))
            .single()
            .ok_or_else(|| FieldError::new("demo", "bad local time"))
    };
    let (lt101, pt204, ft310, tt412, at520, lt605, pdt707) =
        (id(0)?, id(1)?, id(2)?, id(3)?, id(4)?, id(5)?, id(6)?);
    let (fv315, tv418b, ait531, pt208) = (id(7)?, id(9)?, id(10)?, id(11)?);
    let mut v = Vec::new();
    v.push(Entry::new(
        &lt101,
        at(3, 7, 40)?,
        "AB",
        Kind::Note,
        "Start-of-shift walk-down: wet well 1.80 m on the PLC, staff gauge agrees.",
    )?);
    let mut found = Entry::new(
        &pt204,
        at(3, 9, 15)?,
        "AB",
        Kind::LoopCheck,
        "Five-point check as found: worst error +0.62 % of span at 50 %, outside ±0.5 %. Fail as found.",
    )?;
    found.payload = Some(json!({
        "stage": "as-found",
        "tolerance_percent_of_span": 0.5,
        "points": [
            {"percent": 0, "expected_ma": 4.0, "measured_ma": 4.05},
            {"percent": 25, "expected_ma": 8.0, "measured_ma": 8.07},
            {"percent": 50, "expected_ma": 12.0, "measured_ma": 12.099},
            {"percent": 75, "expected_ma": 16.0, "measured_ma": 16.08},
            {"percent": 100, "expected_ma": 20.0, "measured_ma": 20.06}
        ],
        "verdict": "fail"
    }));
    let mut left = Entry::new(
        &pt204,
        at(3, 10, 5)?,
        "AB",
        Kind::LoopCheck,
        "Zero and span trimmed over HART. As left worst error 0.12 % of span. Pass as left.",
    )?;
    left.refers_to = Some(found.id.clone());
    left.payload = Some(json!({
        "stage": "as-left",
        "tolerance_percent_of_span": 0.5,
        "points": [
            {"percent": 0, "expected_ma": 4.0, "measured_ma": 4.01},
            {"percent": 25, "expected_ma": 8.0, "measured_ma": 8.012},
            {"percent": 50, "expected_ma": 12.0, "measured_ma": 12.019},
            {"percent": 75, "expected_ma": 16.0, "measured_ma": 16.01},
            {"percent": 100, "expected_ma": 20.0, "measured_ma": 20.008}
        ],
        "verdict": "pass"
    }));
    v.push(found);
    v.push(left);
    let mut ff = Entry::new(
        &lt101,
        at(2, 13, 30)?,
        "CD",
        Kind::FaultFinding,
        "Operators saw the level drop to 0 m at random. 3.2 mA at the marshalling terminals (NE 43 failure low). \
         Positive wire loose in the transmitter head terminal; re-terminated and tightened. \
         Now 9.8 mA steady = 1.63 m, staff gauge agrees.",
    )?;
    ff.payload = Some(json!({
        "symptom_ma": 3.2,
        "after_ma": 9.8,
        "after_value": {"value": 1.63125, "unit": "m"},
        "cause": "loose wire at transmitter terminal"
    }));
    v.push(ff);
    v.push(Entry::new(
        &ft310,
        at(2, 15, 0)?,
        "CD",
        Kind::FollowUp,
        "Flow reads about 2 % high at low air demand. Check the DP transmitter zero with the impulse lines equalised at the next blower stop.",
    )?);
    let buffers = Entry::new(
        &at520,
        at(1, 8, 20)?,
        "AB",
        Kind::FollowUp,
        "pH 4 and pH 7 buffer bottles expire this month; order replacements before the next calibration.",
    )?;
    let temp = Entry::new(
        &tt412,
        at(1, 10, 10)?,
        "EF",
        Kind::Note,
        "PLC shows 36.8 °C; reference probe in the test thermowell reads 36.6 °C. No action.",
    )?;
    let done = Entry::closing(
        &buffers,
        at(1, 11, 0)?,
        "EF",
        "Buffers received and stored in the lab fridge.",
    )?;
    v.push(buffers);
    v.push(temp.clone());
    v.push(done);
    v.push(Entry::new(
        &lt605,
        at(1, 14, 45)?,
        "EF",
        Kind::Finding,
        "Tank at 1.00 m shows 6.00 m³, half full as the table for the horizontal tank says. Sight glass agrees.",
    )?);
    let circuit = tt412_circuit();
    let verdict = crate::intrinsic::check(&circuit)?;
    let mut is_check = Entry::new(
        &tt412,
        at(1, 15, 30)?,
        "EF",
        Kind::IsCheck,
        "IS check (entity) after the transmitter swap (demo): pass. Barrier to transmitter and Pt100 on 185 m of cable; \
         C about 25 nF of 650 nF allowed, L about 0.14 mH of 12.6 mH; longest cable about 5860 m (set by capacitance).",
    )?;
    // The shape `crate::action::intrinsic::payload` writes (version 1); a test keeps the
    // two alike.
    is_check.payload = Some(json!({
        "payload_version": 1,
        "circuit": serde_json::to_value(&circuit)
            .map_err(|e| FieldError::new("demo", e.to_string()))?,
        "verdict": serde_json::to_value(&verdict)
            .map_err(|e| FieldError::new("demo", e.to_string()))?,
    }));
    v.push(is_check);
    let mut fix = Entry::new(
        &tt412,
        now - Duration::hours(3),
        "EF",
        Kind::Note,
        "Correction: the reference probe read 36.4 °C, not 36.6 °C. Still within tolerance.",
    )?;
    fix.refers_to = Some(temp.id.clone());
    v.push(fix);
    let valve = Valve {
        action: Some(ValveAction::AirToOpen),
        fail: Some(FailPosition::Closed),
        split_ma: None,
    };
    let found = stroke_record(
        &[0.0, 24.5, 50.5, 71.0, 99.5],
        valve,
        Stage::AsFound,
        at(2, 9, 0)?.date_naive(),
        "Blower on manual, operations told. Valve hesitates around 70 %.",
    )?;
    let found = stroke_entry(&fv315, at(2, 9, 0)?, "GH", &found, FV315_FOUND)?;
    let left = stroke_record(
        &[0.0, 25.0, 50.5, 75.5, 99.5],
        valve,
        Stage::AsLeft,
        at(2, 10, 10)?.date_naive(),
        "Positioner feedback linkage was slipping; re-tightened and auto-calibrated the positioner.",
    )?;
    let mut left = stroke_entry(&fv315, at(2, 10, 10)?, "GH", &left, FV315_LEFT)?;
    left.refers_to = Some(found.id.clone());
    v.push(found);
    v.push(left);
    let b = stroke_record(
        &[0.0, 0.0, 0.5, 49.0, 99.0],
        Valve {
            split_ma: Some((12.0, 20.0)),
            ..valve
        },
        Stage::AsFound,
        at(1, 9, 30)?.date_naive(),
        "Cooling water valve over its half of the split range (12–20 mA).",
    )?;
    v.push(stroke_entry(
        &tv418b,
        at(1, 9, 30)?,
        "GH",
        &b,
        TV418B_FOUND,
    )?);
    v.push(Entry::new(
        &ait531,
        at(1, 13, 15)?,
        "CD",
        Kind::Finding,
        "After the PLC card swap turbidity read a steady 21.9 mA. The new channel was set to power the loop while the          analyser's output is active: two sources in one loop. Channel set passive; now 9.60 mA = 17.50 NTU, the analyser's display agrees.",
    )?);
    v.push(Entry::new(
        &pt208,
        at(1, 16, 0)?,
        "EF",
        Kind::Note,
        "Budget through the isolator, each side on its own: input side 5.95 V spare at 22 mA, output side 6.49 V spare at 22 mA into the PLC input.",
    )?);
    v.push(Entry::new(
        &pdt707,
        now - Duration::hours(2),
        "CD",
        Kind::Note,
        "Filter 3 backwashed; differential pressure fell from 180 to 40 mbar (reversed output: 40 mbar is 17.44 mA).",
    )?);
    // The log is appended in time order, as it was written.
    v.sort_by_key(|e| e.time);
    Ok(v)
}
