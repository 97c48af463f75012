//! One action, one record, whichever front a technician uses: each action is performed
//! through the command line (the real binary over one data folder) and through the app's
//! path (the `loopside::app` functions the screens call, over a file store in another
//! folder), both starting from the Brindlemoor demo plant, and the stored records are
//! compared field by field: same kind, same payload keys and values, same text, same
//! initials (ids and times differ and are left out).
#![cfg(feature = "ui")]

mod util;

use loopside::app::{self, AppState};
use loopside::journal::Entry;
use loopside::leave::Item;
use loopside::store::{FileStore, Store};
use serde_json::Value;
use util::TempDir;

/// The command line over its own data folder.
struct Desk(TempDir);

impl Desk {
    fn run(&self, args: &[&str]) -> String {
        let d = self.0.arg();
        let mut all = vec!["--data-dir", d.as_str()];
        all.extend_from_slice(args);
        let out = util::loopside(&all);
        assert!(
            out.status.success(),
            "loopside {args:?}: {}",
            String::from_utf8_lossy(&out.stderr)
        );
        String::from_utf8(out.stdout).unwrap()
    }

    /// The store as it is on disk now (opened after each command, then let go).
    fn last(&self) -> Entry {
        let store = FileStore::open(self.0.path()).unwrap();
        store.entries().last().unwrap().clone()
    }

    fn tag(&self, number: &str) -> Value {
        let store = FileStore::open(self.0.path()).unwrap();
        serde_json::to_value(&store.tag(number).unwrap().tag).unwrap()
    }
}

/// The app's path over a file store in its own folder, filled by the same demo.
fn phone(dir: &TempDir) -> AppState {
    let d = dir.arg();
    assert!(util::loopside(&["--data-dir", &d, "demo"]).status.success());
    let store = FileStore::open(dir.path()).unwrap();
    AppState::with_store(Box::new(store))
}

/// Two JSON values alike: the same keys, the same strings and flags, numbers within a
/// part in 10⁹ (a value typed in ohms and turned into °C and back may differ in the last
/// bits).
fn same(a: &Value, b: &Value, path: &str) {
    match (a, b) {
        (Value::Object(x), Value::Object(y)) => {
            let kx: Vec<&String> = x.keys().collect();
            let ky: Vec<&String> = y.keys().collect();
            assert_eq!(kx, ky, "keys at {path}");
            for (k, v) in x {
                same(v, &y[k], &format!("{path}.{k}"));
            }
        }
        (Value::Array(x), Value::Array(y)) => {
            assert_eq!(x.len(), y.len(), "length at {path}");
            for (i, (v, w)) in x.iter().zip(y).enumerate() {
                same(v, w, &format!("{path}[{i}]"));
            }
        }
        (Value::Number(x), Value::Number(y)) => {
            let (x, y) = (x.as_f64().unwrap(), y.as_f64().unwrap());
            assert!(
                (x - y).abs() <= 1e-9 * x.abs().max(y.abs()).max(1.0),
                "{path}: {x} vs {y}"
            );
        }
        _ => assert_eq!(a, b, "at {path}"),
    }
}

/// Two log records alike, but for id, time and the entry referred to (ids differ).
fn same_record(desk: &Entry, app: &Entry) {
    assert_eq!(desk.kind, app.kind);
    assert_eq!(desk.author, app.author);
    assert_eq!(desk.text, app.text);
    assert_eq!(desk.status, app.status);
    assert_eq!(desk.refers_to.is_some(), app.refers_to.is_some());
    match (&desk.payload, &app.payload) {
        (Some(a), Some(b)) => same(a, b, "payload"),
        (a, b) => assert_eq!(a, b),
    }
}

fn last(state: &AppState) -> Entry {
    state.store.entries().last().unwrap().clone()
}

fn open(state: &mut AppState, number: &str) {
    state.ui.open_tag = Some(number.to_string());
    app::check::sync(state);
}

#[test]
fn a_shift_at_brindlemoor_is_recorded_alike_from_the_desk_and_the_phone() {
    let desk = Desk(TempDir::new("cross-desk"));
    desk.run(&["demo"]);
    let phone_dir = TempDir::new("cross-phone");
    let mut state = phone(&phone_dir);

    // A note on PT-204, initials typed in lower case.
    desk.run(&[
        "note",
        "add",
        "PT-204",
        "-5 mbar offset found",
        "--author",
        "cd",
    ]);
    open(&mut state, "PT-204");
    app::log::add_note(&mut state, "-5 mbar offset found", "cd", false).unwrap();
    same_record(&desk.last(), &last(&state));

    // A follow-up on FT-310, then closed.
    let id = desk.run(&[
        "note",
        "add",
        "FT-310",
        "Order a spare 250 Ω input card",
        "--kind",
        "follow-up",
        "--author",
        "GH",
    ]);
    open(&mut state, "FT-310");
    let added =
        app::log::add_note(&mut state, "Order a spare 250 Ω input card", "GH", true).unwrap();
    same_record(&desk.last(), &last(&state));
    desk.run(&["note", "done", id.trim(), "--author", "ij"]);
    app::log::mark_done(&mut state, &added.id.0, "ij").unwrap();
    same_record(&desk.last(), &last(&state));

    // A new tag, edited, renamed and archived.
    desk.run(&[
        "tag",
        "add",
        "LT-606",
        "--range",
        "0..3,2",
        "--unit",
        "m",
        "--service",
        "Sludge holding tank level",
        "--supply",
        "24",
        "--min-volts",
        "12",
    ]);
    let mut form = app::tags::empty_form();
    form.number = "LT-606".into();
    form.service = "Sludge holding tank level".into();
    form.urv = "3,2".into();
    form.unit = "m".into();
    app::tags::save_form(&mut state, &form, true).unwrap();
    same(&desk.tag("LT-606"), &app_tag(&state, "LT-606"), "tag");
    desk.run(&["tag", "edit", "LT-606", "--area", "Sludge building, JB-06"]);
    let mut form = app::tags::form_of(&state.store.tag("LT-606").unwrap().tag);
    form.area = "Sludge building, JB-06".into();
    app::tags::save_form(&mut state, &form, false).unwrap();
    same(
        &desk.tag("LT-606"),
        &app_tag(&state, "LT-606"),
        "edited tag",
    );
    desk.run(&["tag", "rename", "LT-606", "LT-606A"]);
    form.number = "LT-606A".into();
    app::tags::save_form(&mut state, &form, false).unwrap();
    same(
        &desk.tag("LT-606A"),
        &app_tag(&state, "LT-606A"),
        "renamed tag",
    );
    // The app has no archive button; the action the command line calls is the one.
    desk.run(&["tag", "archive", "LT-606A"]);
    loopside::action::tag::archive_tag(state.store.as_mut(), "LT-606A", true).unwrap();
    same(
        &desk.tag("LT-606A"),
        &app_tag(&state, "LT-606A"),
        "archived tag",
    );

    // A five-point as-found check of TT-412 (Pt100), applied in ohms at the terminals,
    // reading a little high (worst 0.07 mA at 50 % rising), with everything put right
    // before leaving.
    open(&mut state, "TT-412");
    let ideal = [4.0, 8.0, 12.0, 16.0, 20.0, 16.0, 12.0, 8.0, 4.0];
    let high = [0.02, 0.03, 0.07, 0.04, 0.02, 0.03, 0.06, 0.03, 0.02];
    let readings: Vec<String> = ideal
        .iter()
        .zip(high)
        .map(|(ma, off): (&f64, f64)| format!("{:.2}", ma + off))
        .collect();
    state.ui.check.readings = readings.clone();
    // The loop calibrator BWR-CAL-07 (±0.004 mA, due mid-2027) reads the mA on both fronts.
    state.ui.check.reference_id = "BWR-CAL-07".into();
    state.ui.check.reference_accuracy = "0,004 mA".into();
    state.ui.check.reference_due = "2027-06-30".into();
    state.ui.check.leave_ticked = Item::ALL.iter().map(|i| i.id().to_string()).collect();
    state.ui.initials = "gh".into();
    let tt412 = state.store.tag("TT-412").unwrap().tag.clone();
    let planned = loopside::view::check::result(
        &loopside::view::check::check_for(
            &tt412,
            loopside::check::Stage::AsFound,
            state.now().date_naive(),
        ),
        &readings,
    )
    .unwrap();
    let ohms = loopside::action::check::SensorInputs::planned(tt412.sensor.unwrap(), &planned)
        .unwrap()
        .values
        .iter()
        .map(f64::to_string)
        .collect::<Vec<_>>()
        .join(";");
    app::check::save(&mut state).unwrap();
    desk.run(&[
        "check",
        "--tag",
        "TT-412",
        "--device",
        "transmitter",
        "--sensor-input",
        "--applied",
        &ohms,
        "--measured",
        &readings.join(";"),
        "--reference-id",
        "BWR-CAL-07",
        "--reference-accuracy",
        "0,004 mA",
        "--reference-due",
        "2027-06-30",
        "--done",
        "all",
        "--save",
        "--author",
        "gh",
    ]);
    let (d, a) = (desk.last(), last(&state));
    assert_eq!(a.payload.as_ref().unwrap()["sensor"]["kind"], "rtd");
    assert_eq!(
        a.payload.as_ref().unwrap()["reference"]["id"],
        "BWR-CAL-07",
        "the reference instrument is a structured part of the record on both fronts"
    );
    same_record(&d, &a);

    // A fault-finding session on LT-101: 0 mA, 24 V at the supply, 0.1 V at the
    // transmitter — open wiring, re-terminated.
    let answers = phone_dir.path().join("answers.json");
    std::fs::write(
        &answers,
        r#"{"tx_ma": 0, "supply_v": 24, "terminal_v": 0.1, "conclusion": "re-terminated JB-01/4"}"#,
    )
    .unwrap();
    desk.run(&[
        "diagnose",
        "--tag",
        "LT-101",
        "--symptom",
        "stuck-low",
        "--answers",
        answers.to_str().unwrap(),
        "--done",
        "all",
        "--save",
        "--author",
        "cd",
    ]);
    open(&mut state, "LT-101");
    let index = loopside::diagnose::SYMPTOMS
        .iter()
        .position(|(id, _)| *id == "stuck-low")
        .unwrap();
    app::fault::start(&mut state, index).unwrap();
    let typed = [("tx_ma", "0"), ("supply_v", "24"), ("terminal_v", "0,1")];
    while let Some(run) = app::fault::current(&state).unwrap() {
        if run.session.is_finished() {
            break;
        }
        let pending = run.session.pending(&run.procedure);
        assert!(
            !pending.is_empty(),
            "stuck-low asks no yes/no question here"
        );
        for m in pending {
            let (_, v) = typed.iter().find(|(k, _)| *k == m.key()).unwrap();
            state
                .ui
                .fault
                .inputs
                .insert(m.key().to_string(), v.to_string());
        }
        app::fault::submit(&mut state).unwrap();
    }
    state.ui.fault.technician = "re-terminated JB-01/4".into();
    state.ui.fault.leave_ticked = Item::ALL.iter().map(|i| i.id().to_string()).collect();
    app::fault::save(&mut state, "cd").unwrap();
    let (d, a) = (desk.last(), last(&state));
    same_record(&d, &a);
    // Version 3 on both: each finding as its code and numbers, no stored words.
    for e in [&d, &a] {
        let p = e.payload.as_ref().unwrap();
        assert_eq!(p["payload_version"], 3);
        let findings = p["findings"].as_array().unwrap();
        assert_eq!(findings.len(), 3, "band, supply and terminal volts");
        assert!(findings.iter().all(|f| f.get("text").is_none()), "{p}");
    }

    // The hand-over: the same entries, in the same words, from both.
    let out = TempDir::new("cross-out");
    let desk_bundle = out.path().join("desk.json");
    let said = desk.run(&[
        "export",
        "--format",
        "json",
        "--out",
        desk_bundle.to_str().unwrap(),
    ]);
    state.ui.log_all = true;
    let written =
        app::log::export(&state, "json", out.path().join("phone").to_str().unwrap()).unwrap();
    assert_eq!(
        said.trim(),
        format!(
            "Wrote {} entries on {} tags to {}.",
            written.entries,
            written.tags,
            desk_bundle.display()
        )
    );
    let read = |p: &std::path::Path| {
        loopside::report::parse_bundle(&std::fs::read_to_string(p).unwrap()).unwrap()
    };
    let (db, ab) = (read(&desk_bundle), read(&written.path));
    assert_eq!(db.entries.len(), ab.entries.len());
    for (d, a) in db.entries.iter().zip(&ab.entries).rev().take(7) {
        same_record(d, a);
    }

    // Each bundle into an empty store: the same summary, the same records.
    let desk2 = Desk(TempDir::new("cross-desk2"));
    let desk_said = desk2.run(&["import", desk_bundle.to_str().unwrap()]);
    let mut empty = AppState::with_store(Box::new(loopside::store::MemoryStore::new()));
    let imported = app::log::import(&mut empty, &written.path).unwrap();
    assert_eq!(
        desk_said.lines().collect::<Vec<_>>().join(" "),
        imported.to_string()
    );
    same_record(&desk2.last(), &last(&empty));
}

fn app_tag(state: &AppState, number: &str) -> Value {
    serde_json::to_value(&state.store.tag(number).unwrap().tag).unwrap()
}

#[test]
fn the_log_screen_reads_every_period_the_command_line_reads() {
    let dir = TempDir::new("cross-periods");
    let mut state = phone(&dir);
    for form in util::PERIOD_FORMS {
        state.ui.log_since = form.to_string();
        assert!(app::log::shown_query(&state).is_ok(), "{form}");
    }
    for bad in util::NOT_PERIODS {
        state.ui.log_since = bad.to_string();
        assert_eq!(app::log::shown_query(&state).unwrap_err().field, "since");
    }
}
