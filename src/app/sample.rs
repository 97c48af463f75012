//! The invented demo plant, Brindlemoor Water Reclamation Works, as the screens need it
//! until the store lands (`crate::demo` on the `store` branch takes over the register and
//! the log; this file then keeps only the preview data of screens not yet wired).
//!
//! Everything here is fiction: tag numbers, services, initials and events.

use crate::budget::{Cable, LoopConfig, SeriesElement};
use crate::error::Result;
use crate::scale::{CharTable, RootLocation, Scale, SignalSpan, TablePoint, Transfer};
use crate::tag::Tag;
use crate::wire::Conductor;

/// A log entry as the Log screen shows it, until `crate::journal` lands.
#[derive(Debug, Clone, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct SampleEntry {
    /// Stable id.
    pub id: u64,
    /// When, as `YYYY-MM-DD HH:MM` local time.
    pub when: String,
    /// Tag number.
    pub tag: String,
    /// What kind of entry.
    pub kind: EntryKind,
    /// The text.
    pub text: String,
    /// Initials.
    pub who: String,
}

/// Kinds of log entry.
#[derive(Debug, Clone, Copy, PartialEq, Eq, serde::Serialize, serde::Deserialize)]
pub enum EntryKind {
    /// A note.
    Note,
    /// A follow-up still open.
    FollowUp,
    /// A follow-up marked done.
    FollowUpDone,
    /// A loop check that passed.
    CheckPassed,
    /// A loop check that failed.
    CheckFailed,
    /// A fault-finding session.
    Fault,
}

impl EntryKind {
    /// The title shown on the entry.
    pub fn title(self) -> &'static str {
        match self {
            EntryKind::Note => "Note",
            EntryKind::FollowUp => "Follow-up (open)",
            EntryKind::FollowUpDone => "Follow-up (done)",
            EntryKind::CheckPassed => "Check passed",
            EntryKind::CheckFailed => "Check failed",
            EntryKind::Fault => "Fault found",
        }
    }

    /// The colour class the Log screen uses.
    pub fn code(self) -> i32 {
        match self {
            EntryKind::Note => 0,
            EntryKind::FollowUp => 1,
            EntryKind::FollowUpDone => 2,
            EntryKind::CheckPassed => 3,
            EntryKind::CheckFailed => 4,
            EntryKind::Fault => 5,
        }
    }
}

fn with_loop(mut tag: Tag, service: &str, area: &str, config: Option<LoopConfig>) -> Tag {
    tag.service = service.to_string();
    tag.area = area.to_string();
    tag.loop_config = config;
    tag
}

fn cable(one_way_m: f64, mm2: f64) -> Option<Cable> {
    Some(Cable {
        one_way_m,
        conductor: Conductor::Mm2(mm2),
        temp_c: 20.0,
    })
}

/// The seven demo tags.
pub fn tags() -> Result<Vec<Tag>> {
    let mut lt101 = LoopConfig::new(24.0, 10.5);
    lt101.elements.push(SeriesElement::ohms("PLC input", 250.0));
    lt101.cable = cable(180.0, 1.0);

    let mut pt204 = LoopConfig::new(24.0, 12.0);
    pt204
        .elements
        .push(SeriesElement::ohms("HART resistor", 250.0));
    pt204.cable = cable(95.0, 1.0);

    let mut ft310 = LoopConfig::new(24.0, 11.0);
    ft310.elements.push(SeriesElement::ohms("PLC input", 250.0));
    ft310.cable = cable(240.0, 0.75);

    let mut tt412 = LoopConfig::new(24.0, 12.0);
    tt412
        .elements
        .push(SeriesElement::ohms("IS barrier", 340.0));
    tt412.elements.push(SeriesElement::ohms("PLC input", 250.0));
    tt412.cable = cable(310.0, 1.0);

    let mut at520 = LoopConfig::new(24.0, 12.0);
    at520
        .elements
        .push(SeriesElement::drop("Field indicator", 2.5));
    at520.elements.push(SeriesElement::ohms("PLC input", 250.0));
    at520.cable = cable(120.0, 1.0);

    let mut lt605 = LoopConfig::new(24.0, 10.5);
    lt605.elements.push(SeriesElement::ohms("PLC input", 250.0));
    lt605.cable = cable(60.0, 1.0);

    let mut pdt707 = LoopConfig::new(24.0, 10.5);
    pdt707
        .elements
        .push(SeriesElement::ohms("PLC input", 250.0));
    pdt707.cable = cable(75.0, 1.0);

    // Horizontal cylinder, 2.0 m across, 12 m³ full: volume fraction by level fraction.
    let table = CharTable::new(
        [
            (0.0, 0.0),
            (0.2, 0.625),
            (0.4, 1.71),
            (0.6, 3.04),
            (0.8, 4.5),
            (1.0, 6.0),
            (1.2, 7.5),
            (1.4, 8.96),
            (1.6, 10.29),
            (1.8, 11.375),
            (2.0, 12.0),
        ]
        .iter()
        .map(|&(input, output)| TablePoint { input, output })
        .collect(),
        "m³",
    )?;

    let mut pt = Tag::new("PT-204", Scale::linear(0.0, 10.0, "bar")?)?;
    pt.hart = true;
    Ok(vec![
        with_loop(
            Tag::new("LT-101", Scale::linear(0.0, 4.5, "m")?)?,
            "Inlet wet well level",
            "Inlet works, JB-01",
            Some(lt101),
        ),
        with_loop(
            pt,
            "Raw pump 2 discharge pressure",
            "Raw pumping station",
            Some(pt204),
        ),
        with_loop(
            Tag::new(
                "FT-310",
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
            )?,
            "Aeration air header flow (0–2500 Pa DP)",
            "Blower house",
            Some(ft310),
        ),
        with_loop(
            Tag::new("TT-412", Scale::linear(-20.0, 80.0, "°C")?)?,
            "Digester sludge temperature",
            "Digester 1, zone 1",
            Some(tt412),
        ),
        with_loop(
            Tag::new("AT-520", Scale::linear(2.0, 12.0, "pH")?)?,
            "Final effluent pH",
            "Outfall kiosk",
            Some(at520),
        ),
        with_loop(
            Tag::new(
                "LT-605",
                Scale::new(0.0, 2.0, "m", Transfer::Table(table), SignalSpan::default())?,
            )?,
            "Ferric dosing tank (horizontal cylinder)",
            "Chemical store",
            Some(lt605),
        ),
        with_loop(
            Tag::new("PDT-707", Scale::linear(250.0, 0.0, "mbar")?)?,
            "Sand filter 3 differential pressure",
            "Filter gallery",
            Some(pdt707),
        ),
    ])
}

/// A few days of log entries (initials only).
pub fn log() -> Vec<SampleEntry> {
    let e = |id, when: &str, tag: &str, kind, text: &str, who: &str| SampleEntry {
        id,
        when: when.to_string(),
        tag: tag.to_string(),
        kind,
        text: text.to_string(),
        who: who.to_string(),
    };
    vec![
        e(6, "2026-11-30 14:20", "LT-101", EntryKind::Fault,
          "Reading froze at 3.5 mA. Loop current fine at the PLC marshalling; 0 V at the transmitter. Loose wire at JB-01 terminal 14, re-terminated. Reads 11.2 mA, matches the dip.", "RK"),
        e(5, "2026-11-30 09:05", "TT-412", EntryKind::FollowUp,
          "Barrier label faded; order a replacement tag plate.", "JM"),
        e(4, "2026-11-29 15:40", "PT-204", EntryKind::CheckPassed,
          "As left: all five points within ±0.25 % of span after zero trim.", "JM"),
        e(3, "2026-11-29 15:10", "PT-204", EntryKind::CheckFailed,
          "As found: zero shifted +0.9 % of span at 0 % and 25 %.", "JM"),
        e(2, "2026-11-28 11:30", "AT-520", EntryKind::Note,
          "Probe cleaned and buffered at pH 4 and 7; indicator checked.", "SO"),
        e(1, "2026-11-27 08:15", "LT-101", EntryKind::Note,
          "Wet well high level alarm tested with operations present.", "RK"),
    ]
}
