//! A tag's sheet: what the register knows of one tag, in plain lines (range and transfer,
//! signal and tolerance, sensor, loop), with its open follow-ups and latest log entries.
//! Shown beside the register on a wide screen, and printed by `loopside tag show`.

use crate::budget::topology::{Compliance, Wiring};
use crate::budget::{ElementKind, LoopConfig};
use crate::display;
use crate::journal::{self, Entry};
use crate::scale::Transfer;
use crate::sensor::Sensor;
use crate::store::{Store, TagRecord};
use crate::tag::Tag;
use crate::view::log::{row, row_kind, Row, RowKind};

/// How many of the tag's newest entries the sheet lists.
pub const RECENT: usize = 5;

/// One line of the sheet: what it is, and its value in words and numbers.
#[derive(Debug, Clone, PartialEq)]
pub struct Fact {
    /// `Range`, `Loop` …
    pub label: String,
    /// `0 – 4.5 m, linear` …
    pub value: String,
}

/// The whole sheet.
#[derive(Debug, Clone, PartialEq)]
pub struct TagSheet {
    /// `LT-101 · Inlet wet well level`.
    pub title: String,
    /// The tag's definition, line by line.
    pub facts: Vec<Fact>,
    /// Follow-ups on this tag still to do, oldest first.
    pub open: Vec<Row>,
    /// The newest entries on this tag, newest first (at most [`RECENT`]).
    pub recent: Vec<Row>,
    /// `12 entries, 1 open follow-up`.
    pub log_summary: String,
}

fn fact(label: &str, value: String) -> Fact {
    Fact {
        label: label.to_string(),
        value,
    }
}

/// The transfer in words: `linear`, `square root, cutoff 1 % of flow (0.01 % of DP)`, `table of 9 points to m³`.
pub fn transfer_words(t: &Transfer) -> String {
    match t {
        Transfer::Linear => "linear".to_string(),
        Transfer::SquareRoot { cutoff_percent, .. } => {
            format!(
                "square root, cutoff {}",
                crate::view::cutoff(*cutoff_percent)
            )
        }
        Transfer::Table(table) => format!(
            "table of {} points to {}",
            table.points().len(),
            table.output_unit()
        ),
    }
}

/// The sensor in words: `Pt100 RTD, 3-wire`, `K thermocouple, cold junction 22 °C`.
pub fn sensor_words(sensor: &Sensor) -> String {
    match sensor {
        Sensor::Rtd {
            element,
            wiring,
            lead_ohms,
        } => format!(
            "{element} RTD, {}-wire{}",
            wiring.count(),
            if *lead_ohms > 0.0 {
                format!(", leads {} Ω", display::trimmed(*lead_ohms))
            } else {
                String::new()
            }
        ),
        Sensor::Thermocouple { tc, cj_c } => {
            format!(
                "{tc} thermocouple, cold junction {} °C",
                display::trimmed(*cj_c)
            )
        }
        Sensor::DpLevel { .. } => "DP level (the setup is in the tag's JSON)".to_string(),
    }
}

/// The tag's definition as lines of the sheet.
pub fn facts(tag: &Tag) -> Vec<Fact> {
    let s = &tag.scale;
    let mut out = vec![
        fact("Area", tag.area.clone()),
        fact(
            "Range",
            format!(
                "{}, {}",
                crate::view::range_text(s),
                transfer_words(&s.transfer)
            ),
        ),
        fact(
            "Signal",
            format!(
                "{} – {} mA, HART {}",
                display::trimmed(s.signal.low_ma),
                display::trimmed(s.signal.high_ma),
                if tag.hart { "yes" } else { "no" }
            ),
        ),
        fact(
            "Tolerance",
            format!("± {} % of span", display::trimmed(tag.tolerance_percent)),
        ),
    ];
    if let Some(sensor) = &tag.sensor {
        out.push(fact("Sensor", sensor_words(sensor)));
    }
    match &tag.loop_config {
        Some(l) => {
            if l.wiring != Wiring::default() {
                out.push(fact(
                    "Topology",
                    crate::view::wording::power::wiring(&l.wiring),
                ));
            }
            out.push(fact("Loop", loop_words(l)));
        }
        None => out.push(fact("Loop", "not recorded".to_string())),
    }
    for (i, side) in tag.isolator_outputs.iter().enumerate() {
        out.push(fact(
            &format!("Isolator output {}", i + 1),
            loop_words(side),
        ));
    }
    if let Some(v) = &tag.valve {
        out.push(fact("Valve", crate::view::wording::stroke::valve_words(v)));
    }
    if let Some(c) = &tag.intrinsic {
        out.push(fact(
            "Intrinsic",
            crate::view::wording::intrinsic::circuit_summary(c),
        ));
    }
    if !tag.notes.is_empty() {
        out.push(fact("Notes", tag.notes.clone()));
    }
    if tag.archived {
        out.push(fact("Archived", "yes".to_string()));
    }
    out
}

/// A loop's figures in one line: what supplies it and the transmitter minimum (today's
/// `24 V supply, transmitter min 10.5 V`, or a current source's compliance), then each
/// series element and the cable.
pub fn loop_words(l: &LoopConfig) -> String {
    let source = if l.wiring.device.is_current_source() {
        match l.compliance {
            Some(Compliance::Volts { volts }) => {
                format!("current output, compliance {} V", display::trimmed(volts))
            }
            Some(Compliance::MaxLoad { ohms }) => {
                format!("current output, max load {} Ω", display::trimmed(ohms))
            }
            None => "current output".to_string(),
        }
    } else {
        format!(
            "{} V {}{}, transmitter min {} V",
            display::trimmed(l.supply_volts),
            if l.wiring.active_input && !l.wiring.supply {
                "from the input card"
            } else {
                "supply"
            },
            if l.supply_tolerance_percent > 0.0 {
                format!(
                    " (may sag {} %)",
                    display::trimmed(l.supply_tolerance_percent)
                )
            } else {
                String::new()
            },
            display::trimmed(l.tx_min_volts)
        )
    };
    let mut parts = vec![source];
    if l.wiring.device.own_ma() > 0.0 {
        parts.push(format!(
            "own current {} mA",
            display::trimmed(l.wiring.device.own_ma())
        ));
    }
    parts.extend(l.elements.iter().map(|e| match e.kind {
        ElementKind::Resistance { ohms } => {
            format!("{} {} Ω", e.name, display::trimmed(ohms))
        }
        ElementKind::Drop { volts } => format!("{} {} V", e.name, display::trimmed(volts)),
    }));
    if let Some(c) = &l.cable {
        parts.push(format!(
            "cable {} m {}",
            display::trimmed(c.one_way_m),
            c.conductor.label()
        ));
    }
    if let Some(h) = &l.hart_cable {
        parts.push(format!("cable {} pF/m", display::trimmed(h.cable_pf_per_m)));
    }
    parts.join(", ")
}

/// The sheet of one tag in `store`.
pub fn sheet(store: &dyn Store, record: &TagRecord) -> TagSheet {
    let entries = store.entries();
    let closed = journal::closed_follow_ups(entries);
    let mine: Vec<&Entry> = entries.iter().filter(|e| e.tag == record.id).collect();
    let open: Vec<Row> = mine
        .iter()
        .filter(|e| row_kind(e, &closed) == RowKind::OpenFollowUp)
        .map(|e| row(store, e, &closed))
        .collect();
    let recent: Vec<Row> = mine
        .iter()
        .rev()
        .take(RECENT)
        .map(|e| row(store, e, &closed))
        .collect();
    let n = mine.len();
    let log_summary = format!(
        "{n} {}, {} open follow-up{}",
        if n == 1 { "entry" } else { "entries" },
        open.len(),
        if open.len() == 1 { "" } else { "s" }
    );
    let tag = &record.tag;
    TagSheet {
        title: if tag.service.is_empty() {
            tag.number.clone()
        } else {
            format!("{} · {}", tag.number, tag.service)
        },
        facts: facts(tag),
        open,
        recent,
        log_summary,
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::store::MemoryStore;

    /// The demo plant as filled on 1 December 2026, 16:30 (+01:00).
    fn demo_store() -> MemoryStore {
        let mut store = MemoryStore::new();
        let now = chrono::TimeZone::with_ymd_and_hms(
            &chrono::FixedOffset::east_opt(3600).unwrap(),
            2026,
            12,
            1,
            16,
            30,
            0,
        )
        .unwrap();
        crate::demo::fill(&mut store, now).unwrap();
        store
    }

    #[test]
    fn a_loop_through_a_barrier_shows_its_is_circuit_on_the_sheet() {
        // TT-412 in the demo plant runs through a barrier (invented entity values: Uo 28 V,
        // Io 93 mA, Po 0.65 W, Co 650 nF, Lo 12.6 mH) to the transmitter and a Pt100 on
        // 185 m of cable, in an area asking IIB T3. LT-101 has no IS circuit and no line.
        let store = demo_store();
        let tt = store.tag("TT-412").unwrap().clone();
        let facts = facts(&tt.tag);
        let is = facts.iter().find(|f| f.label == "Intrinsic").unwrap();
        assert!(
            is.value
                .contains("(Uo 28.00 V, Io 93.0 mA, Po 0.650 W, Co 650.0 nF, Lo 12.600 mH)"),
            "{}",
            is.value
        );
        assert!(
            is.value.ends_with(
                "2 field devices (TT-412 transmitter, Pt100 in thermowell), cable 185 m; area IIB T3"
            ),
            "{}",
            is.value
        );
        let lt = store.tag("LT-101").unwrap().clone();
        assert!(super::facts(&lt.tag).iter().all(|f| f.label != "Intrinsic"));
    }

    #[test]
    fn the_demo_level_loop_reads_as_a_sheet() {
        let store = demo_store();
        let record = store.tag("LT-101").unwrap().clone();
        let s = sheet(&store, &record);
        assert_eq!(s.title, "LT-101 · Inlet wet well level");
        let range = s.facts.iter().find(|f| f.label == "Range").unwrap();
        assert_eq!(range.value, "0 – 4.5 m, linear");
        let lp = s.facts.iter().find(|f| f.label == "Loop").unwrap();
        assert_eq!(
            lp.value,
            "24 V supply, transmitter min 10.5 V, PLC input 250 Ω, cable 180 m 1 mm²"
        );
        assert!(s.recent.len() <= RECENT);
        // Newest first.
        assert!(s.recent.windows(2).all(|w| w[0].when >= w[1].when));
        assert!(s.log_summary.contains("entr"));
    }

    #[test]
    fn a_tag_without_a_loop_says_so() {
        let tag = Tag::new(
            "PT-9",
            crate::scale::Scale::linear(0.0, 10.0, "bar").unwrap(),
        )
        .unwrap();
        let f = facts(&tag);
        assert_eq!(f.last().unwrap().value, "not recorded");
        assert_eq!(f[2].value, "4 – 20 mA, HART no");
    }
}
