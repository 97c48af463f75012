//! Handoff reports and bundles: CSV formula neutralisation (OWASP, "CSV Injection"),
//! a round trip through a real CSV parser, Markdown contents, and import merging.

mod util;

use chrono::{DateTime, FixedOffset};
use loopside::demo;
use loopside::journal::{Entry, Kind, Query};
use loopside::report::{self, CSV_COLUMNS};
use loopside::scale::Scale;
use loopside::store::{MemoryStore, Store};
use loopside::tag::Tag;

fn now() -> DateTime<FixedOffset> {
    DateTime::parse_from_rfc3339("2026-12-01T18:00:00+01:00").unwrap()
}

fn demo_store() -> MemoryStore {
    let mut s = MemoryStore::new();
    demo::fill(&mut s, now()).unwrap();
    s
}

/// Cells as a spreadsheet would see them, from the csv crate.
fn parse_csv(text: &str) -> Vec<Vec<String>> {
    csv::ReaderBuilder::new()
        .has_headers(false)
        .from_reader(text.as_bytes())
        .records()
        .map(|r| r.unwrap().iter().map(str::to_string).collect())
        .collect()
}

#[test]
fn csv_neutralises_formula_triggers_per_owasp() {
    // OWASP "CSV Injection": cells beginning with = + - @ tab or carriage return.
    let hostile = [
        "=HYPERLINK(\"http://example.invalid\",\"click\")",
        "+1+1",
        "-2+3",
        "@SUM(A1:A2)",
        "\t=1",
        "\r=1",
    ];
    let mut s = MemoryStore::new();
    let id = s
        .add_tag(Tag::new("-LT-101", Scale::linear(0.0, 4.5, "m").unwrap()).unwrap())
        .unwrap();
    for h in hostile {
        // Entry text is trimmed, so the tab/CR cases go into the payload instead.
        let mut e = Entry::new(&id, now(), "AB", Kind::Note, h).unwrap();
        e.payload = Some(serde_json::json!(h));
        s.append(e).unwrap();
    }
    let b = report::select(&s, &Query::default(), now());
    let rows = parse_csv(&report::csv(&b));
    assert_eq!(rows[0], CSV_COLUMNS);
    let text_col = CSV_COLUMNS.iter().position(|c| *c == "text").unwrap();
    let tag_col = CSV_COLUMNS.iter().position(|c| *c == "tag").unwrap();
    for row in &rows[1..] {
        for cell in row {
            assert!(
                !cell.starts_with(['=', '+', '-', '@', '\t', '\r']),
                "cell {cell:?} would be read as a formula"
            );
        }
        assert_eq!(row[tag_col], "'-LT-101");
    }
    let texts: Vec<&str> = rows[1..].iter().map(|r| r[text_col].as_str()).collect();
    let want: Vec<String> = hostile.iter().map(|h| format!("'{}", h.trim())).collect();
    assert_eq!(texts, want);
    // Entry text is trimmed, so a leading tab or CR cannot reach a cell through it; the
    // rule itself still covers them.
    assert_eq!(report::neutralise("\t=1"), "'\t=1");
    assert_eq!(report::neutralise("\r=1"), "'\r=1");
}

#[test]
fn csv_round_trips_through_a_csv_parser() {
    let mut s = MemoryStore::new();
    let id = s
        .add_tag(Tag::new("LT-101", Scale::linear(0.0, 4.5, "m").unwrap()).unwrap())
        .unwrap();
    let tricky = "quote \" comma , semicolon ; line\nbreak, ünïcødé ΔP, 3.2 mA";
    s.append(Entry::new(&id, now(), "AB", Kind::Finding, tricky).unwrap())
        .unwrap();
    let b = report::select(&s, &Query::default(), now());
    let rows = parse_csv(&report::csv(&b));
    assert_eq!(rows.len(), 2);
    let row = &rows[1];
    assert_eq!(row[0], b.entries[0].id.0);
    assert_eq!(row[1], "2026-12-01T18:00:00+01:00");
    assert_eq!(row[2], "LT-101");
    assert_eq!(row[4], "finding");
    assert_eq!(row[8], tricky);
}

#[test]
fn demo_csv_has_one_row_per_entry() {
    let s = demo_store();
    let b = report::select(&s, &Query::default(), now());
    let rows = parse_csv(&report::csv(&b));
    assert_eq!(rows.len(), 1 + s.entries().len());
    assert!(rows.iter().all(|r| r.len() == CSV_COLUMNS.len()));
}

#[test]
fn markdown_lists_open_follow_ups_first_then_tags() {
    let s = demo_store();
    let md = report::markdown(&report::select(&s, &Query::default(), now()));
    assert!(md.starts_with("# Field log handoff"));
    let open = md
        .find("## Open follow-ups (1)")
        .expect("one open follow-up");
    let ft = md.find("**FT-310**").expect("FT-310's follow-up is open");
    let tags = md.find("## LT-101 — Inlet wet well level").unwrap();
    assert!(open < ft && ft < tags);
    assert!(md.contains("loose"), "the fault-finding text is there");
    assert!(
        !md.contains("**AT-520**"),
        "the closed follow-up is not listed as open"
    );
}

#[test]
fn export_by_date_and_tag_selects_only_those() {
    let s = demo_store();
    let pt = s.tag("PT-204").unwrap().id.clone();
    let q = Query {
        tags: vec![pt.clone()],
        ..Query::default()
    };
    let b = report::select(&s, &q, now());
    assert_eq!(b.tags.len(), 1);
    assert_eq!(b.entries.len(), 2);
    assert!(b.entries.iter().all(|e| e.tag == pt));
    let q = Query {
        since: Some(now().to_utc() - chrono::Duration::hours(12)),
        ..Query::default()
    };
    let b = report::select(&s, &q, now());
    assert_eq!(b.entries.len(), 2, "the correction and the backwash note");
    assert_eq!(b.tags.len(), 2, "only the tags those entries need");
}

#[test]
fn importing_a_bundle_twice_adds_nothing_the_second_time() {
    let source = demo_store();
    let text = report::json(&report::select(&source, &Query::default(), now()));
    let bundle = report::parse_bundle(&text).unwrap();
    let mut other = MemoryStore::new();
    let first = other.import(&bundle).unwrap();
    assert_eq!(first.tags_added, demo::tags().unwrap().len());
    assert_eq!(first.entries_added, source.entries().len());
    assert!(first.conflicts.is_empty());
    let second = other.import(&bundle).unwrap();
    assert_eq!(second.tags_added, 0);
    assert_eq!(second.entries_added, 0);
    assert_eq!(second.entries_already_here, source.entries().len());
    assert_eq!(other.entries(), source.entries());
    assert_eq!(other.tags(), source.tags());
}

#[test]
fn conflicting_tag_definitions_are_reported_not_overwritten() {
    let source = demo_store();
    let bundle = report::select(&source, &Query::default(), now());
    // Another device has its own LT-101 (different id) with another range.
    let mut other = MemoryStore::new();
    let mut mine = Tag::new("LT-101", Scale::linear(0.0, 5.0, "m").unwrap()).unwrap();
    mine.service = "Inlet wet well level (new radar)".into();
    let my_id = other.add_tag(mine.clone()).unwrap();
    let r = other.import(&bundle).unwrap();
    assert_eq!(r.conflicts.len(), 1);
    assert_eq!(r.conflicts[0].number, "LT-101");
    assert!(
        r.conflicts[0].detail.contains("range"),
        "{}",
        r.conflicts[0].detail
    );
    assert_eq!(
        other.tag("LT-101").unwrap().tag,
        mine,
        "kept the definition here"
    );
    // Its entries joined the tag here: the week's fault-finding and note, and the three
    // yearly as-found checks of the demo history.
    let q = Query {
        tags: vec![my_id],
        ..Query::default()
    };
    assert_eq!(other.search(&q).len(), 5);
}

#[test]
fn a_bundle_that_is_not_one_is_refused_with_the_reason() {
    for bad in ["", "[]", "{\"loopside\":\"journal\"}", "{\"loopside\":\"bundle\",\"schema\":9,\"exported\":\"2026-12-01T18:00:00Z\",\"tags\":[],\"entries\":[]}"] {
        let e = report::parse_bundle(bad).unwrap_err();
        assert_eq!(e.field, "bundle", "{bad}: {e}");
    }
}

#[test]
fn demo_plant_matches_the_brief() {
    let tags = demo::tags().unwrap();
    let numbers: Vec<&str> = tags.iter().map(|t| t.number.as_str()).collect();
    assert_eq!(
        numbers[..8],
        ["LT-101", "PT-204", "FT-310", "TT-412", "AT-520", "LT-605", "PDT-707", "LT-610"]
    );
    // The trip loop, then the loops beyond two-wire inputs (tests/topology_demo.rs).
    assert_eq!(
        numbers[8..],
        ["FV-315", "TV-418A", "TV-418B", "AIT-531", "PT-208"]
    );
    // LT-605: horizontal cylinder, 2.0 m diameter, 12 m³ full. Half the height holds
    // half the volume by symmetry; the circular-segment formula gives the rest.
    let lt605 = &tags[5];
    let half = lt605.scale.from_ma(12.0).unwrap();
    util::close(half.value, 6.0, 1e-9, "LT-605 at 50 %");
    util::close(lt605.scale.from_ma(20.0).unwrap().value, 12.0, 1e-9, "full");
    // Segment at h = 0.5 m, r = 1: A = acos(0.5) − 0.5·√0.75 = 0.61418 m²; L = 12/π.
    let quarter = lt605
        .scale
        .from_value(0.614_184_7 * 12.0 / std::f64::consts::PI)
        .unwrap();
    util::close(
        quarter.measured.unwrap(),
        0.5,
        1e-4,
        "level at the 0.5 m volume",
    );
    // PDT-707 reversed: 20 mA at 0 mbar.
    util::close(
        tags[6].scale.from_ma(20.0).unwrap().value,
        0.0,
        1e-12,
        "PDT-707",
    );
    // FT-310 square root in the receiver with 1 % cutoff: 25 % DP → 50 % flow (ISO 5167).
    util::close(
        tags[2].scale.from_percent(25.0).unwrap().value,
        1500.0,
        1e-9,
        "FT-310",
    );
    // Loops from the brief.
    let lt101 = tags[0].loop_config.as_ref().unwrap();
    assert_eq!((lt101.supply_volts, lt101.tx_min_volts), (24.0, 10.5));
    assert!(tags[1].hart);
    assert!(format!("{:?}", tags[3].loop_config).contains("340.0"));
    assert!(format!("{:?}", tags[4].loop_config).contains("2.5"));
}

#[test]
fn demo_log_has_the_promised_stories() {
    let s = demo_store();
    let open = s.search(&Query {
        open_only: true,
        ..Query::default()
    });
    assert_eq!(open.len(), 1);
    let checks = s.search(&Query {
        kinds: vec![Kind::LoopCheck],
        ..Query::default()
    });
    // LT-101's three yearly as-found checks (demo history, all passed), then PT-204's
    // check of this week, failed as found and passed as left.
    assert_eq!(checks.len(), 5);
    assert!(checks[..3]
        .iter()
        .all(|c| c.payload.as_ref().unwrap()["pass"] == true));
    assert_eq!(checks[3].payload.as_ref().unwrap()["verdict"], "fail");
    assert_eq!(checks[4].payload.as_ref().unwrap()["verdict"], "pass");
    let ff = s.search(&Query {
        text: Some("LOOSE".into()),
        kinds: vec![Kind::FaultFinding],
        ..Query::default()
    });
    assert_eq!(ff.len(), 1);
    assert!(s.entries().iter().all(|e| e.author.chars().count() <= 3));
    // Demo refuses a store with data.
    let mut s = s;
    let before = s.entries().len();
    assert!(demo::fill(&mut s, now()).is_err());
    assert_eq!(s.entries().len(), before);
}
