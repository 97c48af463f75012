//! The register and log subcommands, run as a technician would run them.

mod util;

use util::{loopside, loopside_json, loopside_refuses, TempDir};

/// How many tags the demo plant has.
fn demo_tags() -> usize {
    loopside::demo::tags().unwrap().len()
}

/// How many entries the demo plant's log has.
fn demo_entries() -> usize {
    use loopside::store::Store;
    util::brindlemoor(util::afternoon()).entries().len()
}

fn d(dir: &TempDir) -> [String; 2] {
    ["--data-dir".to_string(), dir.arg()]
}

fn run(dir: &TempDir, args: &[&str]) -> String {
    let mut all: Vec<String> = args.iter().map(|s| s.to_string()).collect();
    all.extend(d(dir));
    let refs: Vec<&str> = all.iter().map(String::as_str).collect();
    let out = loopside(&refs);
    assert!(
        out.status.success(),
        "loopside {args:?} failed: {}",
        String::from_utf8_lossy(&out.stderr)
    );
    String::from_utf8(out.stdout).unwrap()
}

fn json(dir: &TempDir, args: &[&str]) -> serde_json::Value {
    let mut all: Vec<String> = args.iter().map(|s| s.to_string()).collect();
    all.extend(d(dir));
    let refs: Vec<&str> = all.iter().map(String::as_str).collect();
    loopside_json(&refs)
}

fn refuses(dir: &TempDir, args: &[&str]) -> String {
    let mut all: Vec<String> = args.iter().map(|s| s.to_string()).collect();
    all.extend(d(dir));
    let refs: Vec<&str> = all.iter().map(String::as_str).collect();
    loopside_refuses(&refs)
}

#[test]
fn demo_fills_an_empty_store_once() {
    let dir = TempDir::new("cli-demo");
    let out = run(&dir, &["demo"]);
    assert!(out.contains("Brindlemoor Water Reclamation Works"));
    let tags = json(&dir, &["tag", "list", "--json"]);
    assert_eq!(
        tags.as_array().unwrap().len(),
        loopside::demo::tags().unwrap().len()
    );
    let before = json(&dir, &["note", "list", "--json"]);
    let e = refuses(&dir, &["demo"]);
    assert!(
        e.contains("data-dir") && e.contains("only fills an empty store"),
        "{e}"
    );
    assert_eq!(json(&dir, &["note", "list", "--json"]), before, "untouched");
}

#[test]
fn add_a_tag_write_notes_and_find_them() {
    let dir = TempDir::new("cli-notes");
    run(
        &dir,
        &[
            "tag",
            "add",
            "LT-101",
            "--range",
            "0..4,5",
            "--unit",
            "m",
            "--service",
            "Inlet wet well level",
            "--supply",
            "24",
            "--min-volts",
            "10,5",
            "--load",
            "PLC input=250",
            "--mm2",
            "1.0",
            "--cable-m",
            "180",
        ],
    );
    let t = json(&dir, &["tag", "show", "LT-101", "--json"]);
    assert_eq!(t["tag"]["scale"]["urv"], 4.5);
    assert_eq!(t["tag"]["loop_config"]["supply_volts"], 24.0);
    assert_eq!(t["tag"]["loop_config"]["cable"]["one_way_m"], 180.0);

    let id = run(
        &dir,
        &[
            "note",
            "add",
            "LT-101",
            "3.2 mA at terminals; loose wire re-made",
            "--kind",
            "fault-finding",
            "--author",
            "CD",
            "--payload",
            "{\"measured_ma\": 3.2}",
        ],
    );
    let id = id.trim();
    assert_eq!(id.len(), 29, "one id on stdout: {id}");
    let follow = run(
        &dir,
        &[
            "note",
            "add",
            "LT-101",
            "Check gland at next shutdown",
            "--kind",
            "follow-up",
            "--author",
            "AB",
        ],
    );

    let list = json(&dir, &["note", "list", "--json"]);
    let arr = list.as_array().unwrap();
    assert_eq!(arr.len(), 2);
    for key in ["id", "tag", "time", "kind", "text"] {
        assert!(arr[0].get(key).is_some(), "note list --json has {key}");
    }
    assert_eq!(arr[0]["id"], id);
    assert_eq!(arr[0]["tag"], "LT-101");
    assert_eq!(arr[0]["kind"], "fault-finding");
    assert_eq!(arr[0]["payload"]["measured_ma"], 3.2);

    let found = json(&dir, &["note", "list", "--search", "LOOSE WIRE", "--json"]);
    assert_eq!(found.as_array().unwrap().len(), 1);
    let open = json(&dir, &["note", "list", "--open", "--json"]);
    assert_eq!(open.as_array().unwrap().len(), 1);

    // Close the follow-up by a short prefix of its id: a new entry, the old one kept.
    run(
        &dir,
        &["note", "done", &follow.trim()[..12], "--author", "EF"],
    );
    assert!(json(&dir, &["note", "list", "--open", "--json"])
        .as_array()
        .unwrap()
        .is_empty());
    assert_eq!(
        json(&dir, &["note", "list", "--json"])
            .as_array()
            .unwrap()
            .len(),
        3
    );
    let e = refuses(&dir, &["note", "done", follow.trim()]);
    assert!(
        e.contains("already done") || e.contains("not an open follow-up"),
        "{e}"
    );

    // Dates: today is included by --until today; nothing since tomorrow.
    let today = chrono::Local::now().format("%Y-%m-%d").to_string();
    let tomorrow = (chrono::Local::now() + chrono::Duration::days(1))
        .format("%Y-%m-%d")
        .to_string();
    assert_eq!(
        json(&dir, &["note", "list", "--until", &today, "--json"])
            .as_array()
            .unwrap()
            .len(),
        3
    );
    assert!(
        json(&dir, &["note", "list", "--since", &tomorrow, "--json"])
            .as_array()
            .unwrap()
            .is_empty()
    );
}

#[test]
fn rename_and_archive_keep_the_log() {
    let dir = TempDir::new("cli-rename");
    run(&dir, &["demo"]);
    run(&dir, &["tag", "rename", "PT-204", "PT-204A"]);
    let notes = json(&dir, &["note", "list", "PT-204A", "--json"]);
    assert_eq!(
        notes.as_array().unwrap().len(),
        2,
        "the log followed the rename"
    );
    run(&dir, &["tag", "archive", "PT-204A"]);
    let list = json(&dir, &["tag", "list", "--json"]);
    assert_eq!(
        list.as_array().unwrap().len(),
        demo_tags() - 1,
        "archived tags leave the working list"
    );
    let all = json(&dir, &["tag", "list", "--all", "--json"]);
    assert_eq!(
        all.as_array().unwrap().len(),
        demo_tags(),
        "but are never deleted"
    );
    run(
        &dir,
        &[
            "tag",
            "edit",
            "LT-101",
            "--tolerance",
            "0,25",
            "--area",
            "JB-02",
        ],
    );
    let t = json(&dir, &["tag", "show", "LT-101", "--json"]);
    assert_eq!(t["tag"]["tolerance_percent"], 0.25);
    assert_eq!(t["tag"]["area"], "JB-02");
    assert_eq!(
        t["tag"]["loop_config"]["supply_volts"], 24.0,
        "loop kept when not given"
    );
}

#[test]
fn export_and_import_between_devices() {
    let a = TempDir::new("cli-device-a");
    let b = TempDir::new("cli-device-b");
    run(&a, &["demo"]);
    let bundle = a.path().join("handoff.json");
    let msg = run(
        &a,
        &[
            "export",
            "--format",
            "json",
            "--out",
            bundle.to_str().unwrap(),
        ],
    );
    let wrote = format!("Wrote {} entries on {} tags", demo_entries(), demo_tags());
    assert!(msg.contains(&wrote), "{msg}");
    let r1 = json(&b, &["import", bundle.to_str().unwrap(), "--json"]);
    assert_eq!(r1["entries_added"], demo_entries());
    let r2 = json(&b, &["import", bundle.to_str().unwrap(), "--json"]);
    assert_eq!(r2["entries_added"], 0);
    assert_eq!(r2["tags_added"], 0);
    assert_eq!(
        json(&a, &["note", "list", "--json"]),
        json(&b, &["note", "list", "--json"])
    );
    let md = run(&a, &["export", "--format", "md", "--tag", "LT-101"]);
    assert!(md.contains("## LT-101 — Inlet wet well level"));
    assert!(!md.contains("PT-204"));
    let csv = run(&a, &["export", "--format", "csv"]);
    assert_eq!(
        csv.lines().count(),
        1 + demo_entries(),
        "header and one line per entry"
    );
}

#[test]
fn bad_input_names_the_field() {
    let dir = TempDir::new("cli-bad");
    run(&dir, &["demo"]);
    assert!(refuses(&dir, &["note", "add", "XX-999", "text"]).contains("tag:"));
    assert!(refuses(&dir, &["note", "add", "LT-101", "text", "--kind", "memo"]).contains("kind:"));
    assert!(refuses(&dir, &["note", "add", "LT-101", "   "]).contains("note:"));
    assert!(refuses(
        &dir,
        &["note", "add", "LT-101", "x", "--author", "Anna Brown"]
    )
    .contains("author:"));
    assert!(
        refuses(&dir, &["note", "add", "LT-101", "x", "--payload", "{oops"]).contains("payload:")
    );
    assert!(refuses(&dir, &["note", "list", "--since", "30/11/2026"]).contains("since:"));
    assert!(refuses(&dir, &["note", "done", "abc"]).contains("id:"));
    assert!(refuses(
        &dir,
        &["tag", "add", "LT-101", "--range", "0..1", "--unit", "m"]
    )
    .contains("already"));
    assert!(refuses(
        &dir,
        &["tag", "add", "X-1", "--range", "1..1", "--unit", "m"]
    )
    .contains("range (--range):"));
    assert!(refuses(
        &dir,
        &["tag", "add", "X-1", "--range", "0..1", "--unit", "m", "--supply", "24"]
    )
    .contains("transmitter minimum (--min-volts):"));
    assert!(refuses(&dir, &["tag", "rename", "LT-101", "PT-204"]).contains("new number:"));
    let f = dir.path().join("not-a-bundle.json");
    std::fs::write(&f, "{\"hello\": 1}").unwrap();
    assert!(refuses(&dir, &["import", f.to_str().unwrap()]).contains("bundle:"));
}

#[test]
fn hostile_tag_numbers_from_the_command_line_stay_text() {
    let outer = TempDir::new("cli-hostile");
    let data = outer.path().join("data");
    let data_s = data.to_str().unwrap();
    for n in ["../../x", "CON", "a/b", "..", "/tmp/evil"] {
        let out = loopside(&[
            "tag",
            "add",
            n,
            "--range",
            "0..1",
            "--unit",
            "m",
            "--data-dir",
            data_s,
        ]);
        assert!(
            out.status.success(),
            "{n}: {}",
            String::from_utf8_lossy(&out.stderr)
        );
        let out = loopside(&["note", "add", n, "hello", "--data-dir", data_s]);
        assert!(out.status.success());
    }
    let e = loopside_refuses(&[
        "tag",
        "add",
        "a\u{1b}[2Jb",
        "--range",
        "0..1",
        "--unit",
        "m",
        "--data-dir",
        data_s,
    ]);
    assert!(e.contains("control characters"), "{e}");
    assert_eq!(
        util::files_under(outer.path()),
        vec![
            "data/loopside.journal".to_string(),
            "data/loopside.lock".to_string()
        ]
    );
}

#[test]
fn the_environment_variable_names_the_data_folder() {
    let dir = TempDir::new("cli-env");
    let out = std::process::Command::new(env!("CARGO_BIN_EXE_loopside"))
        .args(["demo"])
        .env("LOOPSIDE_DATA", dir.path())
        .output()
        .unwrap();
    assert!(out.status.success());
    assert!(dir.path().join("loopside.journal").exists());
}

#[test]
fn every_store_subcommand_has_an_example() {
    for args in [
        vec!["tag", "--help"],
        vec!["tag", "add", "--help"],
        vec!["tag", "edit", "--help"],
        vec!["tag", "list", "--help"],
        vec!["tag", "show", "--help"],
        vec!["tag", "rename", "--help"],
        vec!["tag", "archive", "--help"],
        vec!["note", "--help"],
        vec!["note", "add", "--help"],
        vec!["note", "done", "--help"],
        vec!["note", "list", "--help"],
        vec!["export", "--help"],
        vec!["import", "--help"],
        vec!["demo", "--help"],
    ] {
        let out = loopside(&args);
        let text = String::from_utf8_lossy(&out.stdout);
        assert!(text.contains("Example"), "{args:?} shows an example");
        assert!(text.contains("loopside "), "{args:?}");
    }
}

#[test]
fn a_command_waits_briefly_for_a_folder_in_use_then_says_so() {
    let dir = TempDir::new("cli-lock");
    let held = loopside::store::FileStore::open(dir.path()).unwrap();
    // Held throughout: after its short wait the command says the folder is in use.
    let out = loopside(&["tag", "list", "--data-dir", &dir.arg()]);
    let err = String::from_utf8_lossy(&out.stderr);
    assert_eq!(out.status.code(), Some(1), "{err}");
    assert!(
        err.contains("in use by another loopside") && err.contains("waited"),
        "{err}"
    );
    // Closed while the command waits: it goes ahead.
    let child = std::process::Command::new(env!("CARGO_BIN_EXE_loopside"))
        .args(["tag", "list", "--json", "--data-dir", &dir.arg()])
        .env_remove("LOOPSIDE_DATA")
        .stdin(std::process::Stdio::null())
        .stdout(std::process::Stdio::piped())
        .stderr(std::process::Stdio::piped())
        .spawn()
        .unwrap();
    std::thread::sleep(std::time::Duration::from_millis(300));
    drop(held);
    let out = child.wait_with_output().unwrap();
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    assert_eq!(String::from_utf8_lossy(&out.stdout).trim(), "[]");
}

#[test]
fn a_tag_records_its_sensor_and_a_check_takes_applied_ohms() {
    let dir = TempDir::new("sensor-flags");
    run(
        &dir,
        &[
            "tag", "add", "TT-415", "--range", "0..150", "--unit", "°C", "--rtd", "pt100",
            "--wires", "3",
        ],
    );
    let t = json(&dir, &["tag", "show", "TT-415", "--json"]);
    assert_eq!(t["tag"]["sensor"]["kind"], "rtd");
    assert_eq!(t["tag"]["sensor"]["wiring"], "three-wire");
    // Pt100 at 0, 37.5, 75, 112.5, 150 °C: 100.00, 114.64, 128.99, 143.16, 157.33 Ω
    // (IEC 60751 table values, rounded to 0.01 Ω); a good transmitter reads 4…20 mA.
    let c = json(
        &dir,
        &[
            "check",
            "--tag",
            "TT-415",
            "--device",
            "transmitter",
            "--sensor-input",
            "--applied",
            "100;114.64;128.99;143.16;157.33;143.16;128.99;114.64;100",
            "--measured",
            "4;8;12;16;20;16;12;8;4",
            "--json",
        ],
    );
    assert_eq!(c["pass"], true, "{c}");
    // A thermocouple replaces the RTD; --no-sensor forgets it.
    run(
        &dir,
        &["tag", "edit", "TT-415", "--tc", "K", "--cj-c", "22"],
    );
    let t = json(&dir, &["tag", "show", "TT-415", "--json"]);
    assert_eq!(t["tag"]["sensor"]["kind"], "thermocouple");
    assert_eq!(t["tag"]["sensor"]["cj_c"], 22.0);
    run(&dir, &["tag", "edit", "TT-415", "--no-sensor"]);
    let t = json(&dir, &["tag", "show", "TT-415", "--json"]);
    assert!(t["tag"].get("sensor").is_none() || t["tag"]["sensor"].is_null());
    assert!(refuses(&dir, &["tag", "edit", "TT-415", "--rtd", "pt42"]).contains("rtd"));
    assert!(refuses(
        &dir,
        &["tag", "edit", "TT-415", "--rtd", "pt100", "--wires", "5"]
    )
    .contains("wires"));
    assert!(refuses(
        &dir,
        &["tag", "edit", "TT-415", "--tc", "K", "--cj-c", "400"]
    )
    .contains("cj-c"));
}

#[test]
fn the_data_folder_may_be_given_before_or_after_the_subcommand() {
    let dir = TempDir::new("cli-global-dir");
    let d = dir.arg();
    let out = loopside(&["--data-dir", &d, "demo"]);
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    let before = loopside_json(&["--data-dir", &d, "note", "list", "--json"]);
    let after = loopside_json(&["note", "list", "--data-dir", &d, "--json"]);
    let between = loopside_json(&["note", "--data-dir", &d, "list", "--json"]);
    assert_eq!(before.as_array().unwrap().len(), demo_entries());
    assert_eq!(before, after);
    assert_eq!(before, between);
    // The environment variable still names it when no flag does.
    let out = std::process::Command::new(env!("CARGO_BIN_EXE_loopside"))
        .args(["tag", "list", "--json"])
        .env("LOOPSIDE_DATA", dir.path())
        .output()
        .unwrap();
    let tags: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    assert_eq!(
        tags.as_array().unwrap().len(),
        loopside::demo::tags().unwrap().len()
    );
}

#[test]
fn a_note_may_begin_with_a_minus_sign() {
    let dir = TempDir::new("cli-minus");
    run(&dir, &["demo"]);
    // PT-204 reads 5 mbar low at zero: the technician writes the offset as found.
    let id = run(
        &dir,
        &[
            "note",
            "add",
            "PT-204",
            "-5 mbar offset found",
            "--author",
            "cd",
        ],
    );
    let listed = json(&dir, &["note", "list", "PT-204", "--json"]);
    let last = listed
        .as_array()
        .unwrap()
        .iter()
        .find(|e| e["id"] == id.trim())
        .unwrap();
    assert_eq!(last["text"], "-5 mbar offset found");
    assert_eq!(last["author"], "CD", "initials are stored in capitals");
}

#[test]
fn note_list_and_export_take_the_same_periods_as_the_log_screen() {
    let dir = TempDir::new("cli-periods");
    run(&dir, &["demo"]);
    for form in util::PERIOD_FORMS {
        run(&dir, &["note", "list", "--since", form]);
        run(&dir, &["export", "--format", "md", "--since", form]);
        run(&dir, &["note", "list", "--until", form]);
    }
    for bad in util::NOT_PERIODS {
        assert!(refuses(&dir, &["note", "list", "--since", bad]).contains("since:"));
        assert!(refuses(&dir, &["export", "--format", "csv", "--until", bad]).contains("until:"));
    }
    // A note written now is in the last 12 hours and today, not in anything up to yesterday.
    let id = run(
        &dir,
        &["note", "add", "LT-101", "Wet well 1.80 m on the PLC"],
    );
    let ids = |args: &[&str]| -> Vec<String> {
        let mut all = vec!["note", "list", "--json"];
        all.extend_from_slice(args);
        json(&dir, &all)
            .as_array()
            .unwrap()
            .iter()
            .map(|e| e["id"].as_str().unwrap().to_string())
            .collect()
    };
    assert!(ids(&["--since", "12 h"]).contains(&id.trim().to_string()));
    assert!(ids(&["--since", "today"]).contains(&id.trim().to_string()));
    assert!(!ids(&["--until", "yesterday"]).contains(&id.trim().to_string()));
}

#[test]
fn a_local_day_across_the_spring_clock_change_starts_at_its_own_midnight() {
    // Europe/London, written as a POSIX rule so no time-zone database is needed: GMT in
    // winter, BST (UTC+1) from 01:00 GMT on the last Sunday of March (29 March 2026).
    const LONDON: &str = "GMT0BST,M3.5.0/1,M10.5.0";
    let a = TempDir::new("cli-dst-a");
    run(&a, &["demo"]);
    let bundle = a.path().join("bundle.json");
    run(
        &a,
        &[
            "export",
            "--format",
            "json",
            "--out",
            bundle.to_str().unwrap(),
        ],
    );
    // Three notes on LT-101 around the change: 23:30 GMT on Saturday 28 March, 00:30 GMT
    // on Sunday 29 March, and 23:30 UTC on Sunday, which is already 00:30 BST on Monday.
    let mut b: serde_json::Value =
        serde_json::from_str(&std::fs::read_to_string(&bundle).unwrap()).unwrap();
    let template = b["entries"][0].clone();
    let times = [
        ("019d36d7e480-0000000000000001", "2026-03-28T23:30:00+00:00"),
        ("019d371ec000-0000000000000002", "2026-03-29T00:30:00+00:00"),
        ("019d3c3d6880-0000000000000003", "2026-03-30T00:30:00+01:00"),
    ];
    b["entries"] = times
        .iter()
        .map(|(id, time)| {
            let mut e = template.clone();
            e["id"] = serde_json::json!(id);
            e["time"] = serde_json::json!(time);
            e["text"] = serde_json::json!(format!("Round at {time}"));
            e
        })
        .collect();
    std::fs::write(&bundle, b.to_string()).unwrap();
    let c = TempDir::new("cli-dst-c");
    let in_london = |args: &[&str]| {
        let mut all: Vec<&str> = args.to_vec();
        let d = c.arg();
        all.extend(["--data-dir", &d]);
        let out = std::process::Command::new(env!("CARGO_BIN_EXE_loopside"))
            .args(&all)
            .env("TZ", LONDON)
            .env_remove("LOOPSIDE_DATA")
            .output()
            .unwrap();
        assert!(
            out.status.success(),
            "{}",
            String::from_utf8_lossy(&out.stderr)
        );
        String::from_utf8(out.stdout).unwrap()
    };
    in_london(&["import", bundle.to_str().unwrap()]);
    let listed: serde_json::Value = serde_json::from_str(&in_london(&[
        "note",
        "list",
        "--since",
        "2026-03-29",
        "--until",
        "2026-03-29",
        "--json",
    ]))
    .unwrap();
    let ids: Vec<&str> = listed
        .as_array()
        .unwrap()
        .iter()
        .map(|e| e["id"].as_str().unwrap())
        .collect();
    // Sunday runs from 00:00 GMT to 00:00 BST (23:00 UTC): only the 00:30 GMT round.
    assert_eq!(ids, vec![times[1].0]);
}

#[test]
fn a_new_range_keeps_the_tags_signal_span_and_unit() {
    // PT-520 sends 0–20 mA to an old recorder; the range is re-set from 0–10 to 0–16 bar.
    // As on the tag form, what is not given again (unit, signal span) is the tag's own.
    let dir = TempDir::new("edit-range");
    run(
        &dir,
        &[
            "tag", "add", "PT-520", "--range", "0..10", "--unit", "bar", "--signal", "0..20",
        ],
    );
    run(&dir, &["tag", "edit", "PT-520", "--range", "0..16"]);
    let t = json(&dir, &["tag", "show", "PT-520", "--json"]);
    assert_eq!(t["tag"]["scale"]["urv"], 16.0, "{t}");
    assert_eq!(t["tag"]["scale"]["unit"], "bar");
    assert_eq!(t["tag"]["scale"]["signal"]["low_ma"], 0.0, "{t}");
}

/// The range flags a `--help` text lists (`--range`, `--unit`, `--sqrt` …), in order.
fn range_flags(help: &str) -> Vec<String> {
    const RANGE: [&str; 9] = [
        "--range",
        "--unit",
        "--sqrt",
        "--cutoff",
        "--cutoff-dp",
        "--root-in",
        "--table",
        "--table-unit",
        "--signal",
    ];
    help.lines()
        .filter_map(|l| l.split_whitespace().next())
        .filter(|w| RANGE.contains(w))
        .map(str::to_string)
        .collect()
}

#[test]
fn tag_add_and_tag_edit_take_the_same_range_flags() {
    // One declaration of the range flags: `tag add` must have a range and a unit, `tag
    // edit` may leave both out (the tag's own are kept), and every other range flag
    // needs --range in both.
    let help = |sub: &str| {
        let out = loopside(&["tag", sub, "--help"]);
        assert!(out.status.success());
        String::from_utf8(out.stdout).unwrap()
    };
    let (add, edit) = (help("add"), help("edit"));
    assert_eq!(range_flags(&add).len(), 9, "{add}");
    assert_eq!(range_flags(&add), range_flags(&edit));
    let dir = TempDir::new("range-flags");
    let d = dir.arg();
    assert!(loopside(&["--data-dir", &d, "demo"]).status.success());
    // A usage error from the command line's parser: exit code 2, the flag named.
    let refuses = |args: &[&str]| {
        let out = loopside(args);
        assert_eq!(out.status.code(), Some(2), "{args:?}");
        String::from_utf8(out.stderr).unwrap()
    };
    let refused = refuses(&["--data-dir", &d, "tag", "add", "PT-990", "--unit", "bar"]);
    assert!(refused.contains("--range"), "{refused}");
    let refused = refuses(&["--data-dir", &d, "tag", "add", "PT-990", "--range", "0..10"]);
    assert!(refused.contains("--unit"), "{refused}");
    for lone in [
        ["--unit", "ft"],
        ["--signal", "0..20"],
        ["--table", "0:0;1:1"],
    ] {
        let mut args = vec!["--data-dir", d.as_str(), "tag", "edit", "LT-101"];
        args.extend(lone);
        let refused = refuses(&args);
        assert!(refused.contains("--range"), "{lone:?}: {refused}");
    }
    assert!(
        loopside(&["--data-dir", &d, "tag", "edit", "LT-101", "--range", "0..5"])
            .status
            .success()
    );
}
