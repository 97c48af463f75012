//! `loopside check` and `loopside diagnose`, run as a technician would run them.

mod util;

use std::io::Write;
use std::process::{Command, Stdio};
use util::{close, loopside, loopside_json, loopside_refuses};

/// Run the binary with `stdin` typed in, as on a terminal.
fn loopside_typed(args: &[&str], stdin: &str) -> std::process::Output {
    let mut child = Command::new(env!("CARGO_BIN_EXE_loopside"))
        .args(args)
        .env_remove("LOOPSIDE_DATA")
        .stdin(Stdio::piped())
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .spawn()
        .expect("the loopside binary runs");
    child
        .stdin
        .take()
        .expect("stdin")
        .write_all(stdin.as_bytes())
        .expect("typed");
    child.wait_with_output().expect("finishes")
}

fn temp_file(name: &str, text: &str) -> std::path::PathBuf {
    let dir = std::env::temp_dir().join(format!("loopside-cli-check-{}", std::process::id()));
    std::fs::create_dir_all(&dir).expect("temp dir");
    let path = dir.join(name);
    std::fs::write(&path, text).expect("written");
    path
}

const LT101: [&str; 6] = ["--tag", "LT-101", "--range", "0..4,5", "--unit", "m"];

#[test]
fn check_prints_the_json_keys_with_the_worked_numbers() {
    // Worked table (see tests/check.rs): max 0.225 %, hysteresis 0.1125 % (ISA-51.1 sense).
    let mut args = vec!["check"];
    args.extend(LT101);
    args.extend([
        "--device",
        "transmitter",
        "--applied",
        "0,1.125,2.25,3.375,4.5,3.375,2.25,1.125,0",
        "--measured",
        "4.008,8.016,12.020,16.012,20.004,16.030,12.036,8.024,4.010",
        "--tolerance",
        "0.25",
        "--date",
        "2026-12-01",
        "--json",
    ]);
    let j = loopside_json(&args);
    let points = j["points"].as_array().unwrap();
    assert_eq!(points.len(), 9);
    close(
        points[6]["applied"].as_f64().unwrap(),
        2.25,
        1e-12,
        "applied",
    );
    close(
        points[6]["expected"].as_f64().unwrap(),
        12.0,
        1e-12,
        "expected",
    );
    close(
        points[6]["measured"].as_f64().unwrap(),
        12.036,
        1e-12,
        "measured",
    );
    close(
        points[6]["error_pct"].as_f64().unwrap(),
        0.225,
        1e-9,
        "error",
    );
    assert_eq!(points[6]["pass"], true);
    close(j["max_error_pct"].as_f64().unwrap(), 0.225, 1e-9, "max");
    close(
        j["hysteresis_pct"].as_f64().unwrap(),
        0.1125,
        1e-9,
        "hysteresis",
    );
    assert_eq!(j["pass"], true);
    assert_eq!(j["tag"], "LT-101");
}

#[test]
fn check_receiver_with_decimal_commas_and_a_reference() {
    // FT-310 receiver: 8 mA → 1500 m³/h (ISO 5167 relation: 25 % ΔP → 50 % flow).
    // Reference 0.02 mA on a ±0.25 % tolerance: 0.02/16 = 0.125 % → TUR 2:1 (< 4:1,
    // common practice), and its calibration was due the day before.
    let j = loopside_json(&[
        "check",
        "--tag",
        "FT-310",
        "--range",
        "0..3000",
        "--unit",
        "m3/h",
        "--sqrt",
        "--cutoff",
        "1",
        "--device",
        "receiver",
        "--applied",
        "4;8;12;16;20",
        "--measured",
        "0;1512,0;2121,3;2598,1;3000",
        "--tolerance",
        "0,25",
        "--reference-id",
        "BWR-CAL-07",
        "--reference-accuracy",
        "0.02 mA",
        "--reference-due",
        "2026-11-30",
        "--date",
        "2026-12-01",
        "--json",
    ]);
    close(
        j["points"][1]["expected"].as_f64().unwrap(),
        1500.0,
        1e-9,
        "flow",
    );
    close(
        j["points"][1]["error_pct"].as_f64().unwrap(),
        0.4,
        1e-9,
        "12 of 3000",
    );
    assert_eq!(j["points"][1]["pass"], false);
    assert_eq!(j["pass"], false);
    assert!(j["hysteresis_pct"].is_null(), "rising points only");
    close(j["tur"].as_f64().unwrap(), 2.0, 1e-9, "TUR");
    let codes: Vec<&str> = j["warnings"]
        .as_array()
        .unwrap()
        .iter()
        .map(|w| w["code"].as_str().unwrap())
        .collect();
    assert_eq!(codes, vec!["reference-past-due", "low-tur"]);
}

#[test]
fn check_text_and_markdown_output() {
    let args = [
        "check",
        "--range",
        "0..10",
        "--unit",
        "bar",
        "--device",
        "transmitter",
        "--applied",
        "0,5,10,5,0",
        "--measured",
        "4,12.12,20,12,4",
        "--date",
        "2026-12-01",
    ];
    let out = loopside(&args);
    assert!(out.status.success());
    let text = String::from_utf8(out.stdout).unwrap();
    assert!(text.contains("FAIL"), "{text}");
    assert!(text.contains("+0.75 %"), "0.12 mA of 16: {text}");
    let mut md_args = args.to_vec();
    md_args.push("--markdown");
    let out = loopside(&md_args);
    let md = String::from_utf8(out.stdout).unwrap();
    assert!(md.contains("|---|"), "{md}");
}

#[test]
fn check_refuses_bad_input_with_one_line_naming_the_field() {
    let base = [
        "check",
        "--range",
        "0..10",
        "--unit",
        "bar",
        "--device",
        "transmitter",
    ];
    let mut a = base.to_vec();
    a.extend(["--applied", "0,5,10", "--measured", "4,12"]);
    assert!(loopside_refuses(&a).contains("measured"));
    let mut a = base.to_vec();
    a.extend(["--applied", "0,5,x", "--measured", "4,12,20"]);
    assert!(loopside_refuses(&a).contains("applied[3]"));
    let mut a = base.to_vec();
    a.extend(["--applied", "0,50", "--measured", "4,20"]);
    assert!(loopside_refuses(&a).contains("outside"));
    let mut a = base.to_vec();
    a.extend([
        "--applied",
        "0,10",
        "--measured",
        "4,20",
        "--date",
        "1/12/2026",
    ]);
    assert!(loopside_refuses(&a).contains("date"));
    let e = loopside_refuses(&[
        "check",
        "--tag",
        "LT-101",
        "--device",
        "transmitter",
        "--applied",
        "0,4.5",
        "--measured",
        "4,20",
        "--data-dir",
        std::env::temp_dir()
            .join(format!("loopside-cli-check-empty-{}", std::process::id()))
            .to_str()
            .unwrap(),
    ]);
    assert!(e.contains("LT-101") && e.contains("register"), "{e}");
}

#[test]
fn diagnose_from_an_answers_file() {
    // LT-101 (BRIEF loop): 24 V measured, 9 V at the transmitter at 19.5 mA, reading short
    // of the top. (24 − 9)/0.0195 = 769.2 Ω in the loop against 256.2 Ω on the drawing.
    let answers = temp_file(
        "lt101.json",
        r#"{"tx_ma": 19.5, "supply_v": 24, "terminal_v": "9,0 V"}"#,
    );
    let j = loopside_json(&[
        "diagnose",
        "--tag",
        "LT-101",
        "--range",
        "0..4,5",
        "--unit",
        "m",
        "--supply",
        "24",
        "--min-volts",
        "10,5",
        "--load",
        "PLC input=250",
        "--cable-m",
        "180",
        "--mm2",
        "1.0",
        "--symptom",
        "short-of-top",
        "--answers",
        answers.to_str().unwrap(),
        "--json",
    ]);
    assert_eq!(j["conclusion"]["step"], "starved");
    let f = j["findings"]
        .as_array()
        .unwrap()
        .iter()
        .find(|f| f["code"] == "not-enough-voltage")
        .expect("voltage finding");
    close(
        f["detail"]["loop_ohms_measured"].as_f64().unwrap(),
        15.0 / 0.0195,
        1e-9,
        "ohms",
    );
    close(
        f["detail"]["min_v"].as_f64().unwrap(),
        10.5,
        1e-12,
        "minimum",
    );
    // The JSON carries each finding's words too, from the same wording as the screen.
    let words = f["text"].as_str().expect("words with the finding");
    assert!(
        words.starts_with("Not enough voltage: the transmitter gets"),
        "{words}"
    );
    assert_eq!(j["cautions"].as_array().unwrap().len(), 5);
    assert!(j["cautions"][3]
        .as_str()
        .unwrap()
        .contains("trapped pressure"));
    assert_eq!(j["tag"], "LT-101");
}

#[test]
fn diagnose_text_output_shows_cautions_first() {
    let answers = temp_file("pt204.json", r#"{"tx_ma": 12, "displayed": 5}"#);
    let out = loopside(&[
        "diagnose",
        "--tag",
        "PT-204",
        "--range",
        "0..16",
        "--unit",
        "bar",
        "--symptom",
        "steady-wrong",
        "--answers",
        answers.to_str().unwrap(),
    ]);
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    let text = String::from_utf8(out.stdout).unwrap();
    let caution = text.find("tell operations").expect("caution shown");
    let finding = text.find("Findings").expect("findings shown");
    assert!(caution < finding);
    assert!(text.contains("10.000 bar"), "solved range: {text}");
    assert!(text.contains("Conclusion:"), "{text}");
}

#[test]
fn diagnose_interactively_on_the_terminal() {
    // Questions on stdout, answers on stdin; a bad answer is explained and asked again.
    let out = loopside_typed(
        &[
            "diagnose",
            "--tag",
            "AT-520",
            "--range",
            "2..12",
            "--unit",
            "pH",
            "--symptom",
            "stuck-low",
        ],
        "0\nabc\n23.8\n",
    );
    let text = String::from_utf8(out.stdout).unwrap();
    // Ends without a conclusion: the supply step is answered, the terminal step is not.
    assert_eq!(out.status.code(), Some(2), "{text}");
    assert!(text.contains("tell operations"), "{text}");
    assert!(
        text.contains("Loop current at the transmitter [mA]"),
        "{text}"
    );
    assert!(text.contains("no-loop-current"), "{text}");
    assert!(text.contains("supply_v"), "the bad answer is named: {text}");
    assert!(String::from_utf8_lossy(&out.stderr).contains("input"));
    // Each step's cautions come with it: the flameproof housing at the first current
    // reading, the red lead before the first voltage.
    let first_prompt = text.find("Loop current at the transmitter [mA]").unwrap();
    let housing = text
        .find("! In a hazardous area, a flameproof")
        .expect("housing caution");
    assert!(housing < first_prompt, "{text}");
    let lead = text
        .find("! Move the red lead back to the V socket")
        .expect("meter-lead reminder");
    let supply_prompt = text.find("Supply voltage at the supply terminals").unwrap();
    assert!(first_prompt < lead && lead < supply_prompt, "{text}");

    let out = loopside_typed(
        &[
            "diagnose",
            "--tag",
            "AT-520",
            "--range",
            "2..12",
            "--unit",
            "pH",
            "--supply",
            "24",
            "--min-volts",
            "10.5",
            "--drop",
            "indicator=2.5",
            "--load",
            "250",
            "--symptom",
            "hart-no-answer",
            "--json",
        ],
        "12\n24\n0.4\nfound a lifted wire in JB-2\n",
    );
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    let text = String::from_utf8(out.stdout).unwrap();
    let json_line = text.lines().last().unwrap();
    let j: serde_json::Value = serde_json::from_str(json_line).unwrap();
    assert_eq!(j["conclusion"]["step"], "no-power");
    assert_eq!(j["technician_conclusion"], "found a lifted wire in JB-2");
}

#[test]
fn diagnose_refuses_what_it_cannot_use() {
    let e = loopside_refuses(&[
        "diagnose",
        "--range",
        "0..10",
        "--unit",
        "bar",
        "--symptom",
        "smoke",
    ]);
    assert!(e.contains("symptom") && e.contains("stuck-low"), "{e}");
    let answers = temp_file("short.json", r#"{"tx_ma": 12}"#);
    let e = loopside_refuses(&[
        "diagnose",
        "--range",
        "0..10",
        "--unit",
        "bar",
        "--symptom",
        "steady-wrong",
        "--answers",
        answers.to_str().unwrap(),
    ]);
    assert!(e.contains("displayed"), "names the missing value: {e}");
    let bad = temp_file("bad.json", r#"{"tx_ma": 99}"#);
    let e = loopside_refuses(&[
        "diagnose",
        "--range",
        "0..10",
        "--unit",
        "bar",
        "--symptom",
        "steady-wrong",
        "--answers",
        bad.to_str().unwrap(),
    ]);
    assert!(e.contains("tx_ma") && e.contains("50"), "{e}");
}

#[test]
fn diagnose_with_a_plant_procedure_file() {
    let procedure = temp_file(
        "jb3.json",
        r#"{"format": 1, "id": "wet-well-jb3", "symptom": "jb3-flooded", "title": "JB-3 after a storm",
            "start": "look",
            "steps": [
              {"id": "look", "instruction": "Open JB-3 at the inlet wet well.",
               "question": "Is there water in the box?", "next": {"yes": "dry", "no": "fine"}},
              {"id": "dry", "conclusion": "Dry and reseal JB-3; insulation-test every pair in it."},
              {"id": "fine", "conclusion": "JB-3 is dry; use the built-in procedures."}
            ]}"#,
    );
    let answers = temp_file("jb3-answers.json", r#"{"look": "yes"}"#);
    let j = loopside_json(&[
        "diagnose",
        "--range",
        "0..4.5",
        "--unit",
        "m",
        "--procedure",
        procedure.to_str().unwrap(),
        "--symptom",
        "jb3-flooded",
        "--answers",
        answers.to_str().unwrap(),
        "--json",
    ]);
    assert_eq!(j["conclusion"]["step"], "dry");
    assert_eq!(j["procedure"], "wet-well-jb3");
}

#[test]
fn check_and_diagnose_read_the_tag_from_the_register_and_save_to_its_log() {
    let dir = std::env::temp_dir().join(format!("loopside-cli-check-store-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    let d = dir.to_str().unwrap();
    let out = loopside(&[
        "tag",
        "add",
        "LT-101",
        "--range",
        "0..4,5",
        "--unit",
        "m",
        "--supply",
        "24",
        "--min-volts",
        "10,5",
        "--load",
        "PLC input=250",
        "--data-dir",
        d,
    ]);
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    // The range and tolerance come from the register: 2.25 m is 12 mA; 0.01 mA = 0.0625 %.
    let j = loopside_json(&[
        "check",
        "--tag",
        "LT-101",
        "--data-dir",
        d,
        "--device",
        "transmitter",
        "--applied",
        "0,2.25,4.5",
        "--measured",
        "4,12.01,20",
        "--save",
        "--json",
    ]);
    close(
        j["max_error_pct"].as_f64().unwrap(),
        0.0625,
        1e-9,
        "from the register",
    );
    assert!(j["saved"].is_string(), "{j}");
    let answers = temp_file(
        "open.json",
        r#"{"tx_ma": 0, "supply_v": 24, "terminal_v": 0.1}"#,
    );
    let j = loopside_json(&[
        "diagnose",
        "--tag",
        "LT-101",
        "--data-dir",
        d,
        "--symptom",
        "stuck-low",
        "--answers",
        answers.to_str().unwrap(),
        "--save",
        "--json",
    ]);
    assert_eq!(j["conclusion"]["step"], "open-wiring");
    assert!(j["saved"].is_string());
    let out = loopside(&["note", "list", "--data-dir", d]);
    let text = String::from_utf8(out.stdout).unwrap();
    assert!(
        text.contains("loop-check") && text.contains("fault-finding"),
        "{text}"
    );
    let e = loopside_refuses(&[
        "check",
        "--tag",
        "PT-999",
        "--data-dir",
        d,
        "--device",
        "transmitter",
        "--applied",
        "0,10",
        "--measured",
        "4,20",
    ]);
    assert!(e.contains("PT-999"), "{e}");
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn temperature_transmitter_checked_with_applied_ohms_and_millivolts() {
    // IEC 60751:2008 Pt100 table: −20 °C 92.16 Ω, 0 °C 100.00 Ω, 20 °C 107.79 Ω,
    // 40 °C 115.54 Ω, 60 °C 123.24 Ω. On a −20…80 °C range those are 4.0, 7.2, 10.4, 13.6, 16.8 mA.
    let j = util::loopside_json(&[
        "check",
        "--range",
        "-20..80",
        "--unit",
        "degC",
        "--device",
        "transmitter",
        "--rtd",
        "pt100",
        "--applied",
        "92.16,100,107.79,115.54,123.24",
        "--measured",
        "4.0,7.2,10.4,13.6,16.8",
        "--json",
    ]);
    let expected: Vec<f64> = j["points"]
        .as_array()
        .unwrap()
        .iter()
        .map(|p| p["expected"].as_f64().unwrap())
        .collect();
    for (got, want) in expected.iter().zip([4.0, 7.2, 10.4, 13.6, 16.8]) {
        assert!(
            (got - want).abs() < 0.002,
            "expected {want} mA, computed {got}"
        );
    }
    assert_eq!(j["sensor_inputs"]["unit"], "Ω");
    // NIST Monograph 175, type K: E(400 °C) − E(18 °C) = 16.397 − 0.718 = 15.679 mV; on a
    // 0…500 °C range 400 °C is 16.8 mA. At 0 °C with the junction at 18 °C: −0.718 mV → 4 mA.
    let j = util::loopside_json(&[
        "check",
        "--range",
        "0..500",
        "--unit",
        "degC",
        "--device",
        "transmitter",
        "--tc",
        "K",
        "--cj-c",
        "18",
        "--applied",
        "-0.718;15.679",
        "--measured",
        "4;16.8",
        "--json",
    ]);
    let zero = j["points"][0]["expected"].as_f64().unwrap();
    assert!((zero - 4.0).abs() < 0.001, "type K 0 °C: {zero} mA");
    let got = j["points"][1]["expected"].as_f64().unwrap();
    assert!((got - 16.8).abs() < 0.001, "type K 400 °C: {got} mA");
}

#[test]
fn before_you_leave_is_recorded_from_the_command_line() {
    // LT-101 checked as left: the loop is back in auto and the links are closed, but the
    // trip bypass stays on until the spare transmitter arrives (a follow-up), and operations
    // have not been told yet. What is not named is recorded as NOT done.
    let dir = util::TempDir::new("cli-leave");
    let d = dir.arg();
    let out = loopside(&[
        "tag",
        "add",
        "LT-101",
        "--range",
        "0..4,5",
        "--unit",
        "m",
        "--data-dir",
        &d,
    ]);
    assert!(out.status.success());
    let check = |extra: &[&str]| {
        let mut args = vec![
            "check",
            "--tag",
            "LT-101",
            "--data-dir",
            &d,
            "--device",
            "transmitter",
            "--stage",
            "as-left",
            "--applied",
            "0,2.25,4.5",
            "--measured",
            "4,12,20",
        ];
        args.extend_from_slice(extra);
        args.iter().map(|a| a.to_string()).collect::<Vec<String>>()
    };
    let args = check(&["--done", "loop, links", "--save", "--json"]);
    let args: Vec<&str> = args.iter().map(String::as_str).collect();
    let j = loopside_json(&args);
    let items = j["before_leaving"]["items"].as_array().unwrap();
    let done: Vec<(&str, bool)> = items
        .iter()
        .map(|i| (i["id"].as_str().unwrap(), i["done"].as_bool().unwrap()))
        .collect();
    assert_eq!(
        done,
        [
            ("loop", true),
            ("links", true),
            ("forces", false),
            ("operations", false)
        ]
    );
    assert_eq!(j["before_leaving"]["version"], 1);

    // The log entry's text says which were not done, and so does the handoff report.
    let listed = loopside_json(&["note", "list", "--data-dir", &d, "--json"]);
    let text = listed[0]["text"].as_str().unwrap();
    assert!(
        text.ends_with(
            "Before you leave: NOT done (not confirmed): forces and bypasses removed; \
             operations told. Done: loop back in its normal mode; links closed."
        ),
        "{text}"
    );
    assert_eq!(listed[0]["payload"]["before_leaving"], j["before_leaving"]);
    let report = loopside(&["export", "--format", "md", "--data-dir", &d]);
    let report = String::from_utf8(report.stdout).unwrap();
    assert!(
        report.contains("NOT done (not confirmed): forces and bypasses removed; operations told"),
        "{report}"
    );

    // Without --done nothing is claimed: every item is not confirmed, and the text says how
    // to name them.
    let args = check(&[]);
    let args: Vec<&str> = args.iter().map(String::as_str).collect();
    let out = loopside(&args);
    let text = String::from_utf8(out.stdout).unwrap();
    assert!(
        text.contains(
            "Before you leave: NOT done (not confirmed): loop back in its normal mode; links closed; \
             forces and bypasses removed; operations told."
        ),
        "{text}"
    );
    assert!(
        text.contains("--done loop,links,forces,operations"),
        "{text}"
    );
    let args = check(&["--done", "all"]);
    let args: Vec<&str> = args.iter().map(String::as_str).collect();
    let text = String::from_utf8(loopside(&args).stdout).unwrap();
    assert!(text.contains("Before you leave: all done"), "{text}");
    assert!(!text.contains("--done"), "{text}");

    // A misspelt item is refused, naming the flag and the items allowed.
    let args = check(&["--done", "loop,link"]);
    let args: Vec<&str> = args.iter().map(String::as_str).collect();
    let e = loopside_refuses(&args);
    assert!(
        e.contains("done") && e.contains("'link'") && e.contains("operations"),
        "{e}"
    );
}

#[test]
fn diagnose_records_before_you_leave_from_the_flag_or_the_terminal() {
    // LT-101 open wiring (0 mA, 24 V at the supply, 0.1 V at the transmitter), saved with
    // everything put right.
    let dir = util::TempDir::new("cli-leave-diagnose");
    let d = dir.arg();
    let out = loopside(&[
        "tag",
        "add",
        "LT-101",
        "--range",
        "0..4,5",
        "--unit",
        "m",
        "--supply",
        "24",
        "--min-volts",
        "10,5",
        "--load",
        "PLC input=250",
        "--data-dir",
        &d,
    ]);
    assert!(out.status.success());
    let answers = temp_file(
        "leave-open.json",
        r#"{"tx_ma": 0, "supply_v": 24, "terminal_v": 0.1, "conclusion": "re-terminated JB-01/4"}"#,
    );
    let out = loopside(&[
        "diagnose",
        "--tag",
        "LT-101",
        "--data-dir",
        &d,
        "--symptom",
        "stuck-low",
        "--answers",
        answers.to_str().unwrap(),
        "--done",
        "all",
        "--save",
    ]);
    let text = String::from_utf8(out.stdout).unwrap();
    assert!(out.status.success(), "{text}");
    assert!(text.contains("[done] Operations told"), "{text}");
    let listed = loopside_json(&["note", "list", "--data-dir", &d, "--json"]);
    let logged = listed[0]["text"].as_str().unwrap();
    assert!(
        logged.contains("\nTechnician: re-terminated JB-01/4\n"),
        "{logged}"
    );
    assert!(
        logged.ends_with("Before you leave: all done (loop back in its normal mode; links closed; forces and bypasses removed; operations told)."),
        "{logged}"
    );

    // On the terminal each item is asked after the conclusion: yes, no, Enter, yes.
    let out = loopside_typed(
        &[
            "diagnose",
            "--tag",
            "AT-520",
            "--range",
            "2..12",
            "--unit",
            "pH",
            "--supply",
            "24",
            "--min-volts",
            "10.5",
            "--drop",
            "indicator=2.5",
            "--load",
            "250",
            "--symptom",
            "hart-no-answer",
            "--json",
        ],
        "12\n24\n0.4\nfound a lifted wire in JB-2\nyes\nno\n\nmaybe\nyes\n",
    );
    let text = String::from_utf8(out.stdout).unwrap();
    assert!(out.status.success(), "{text}");
    assert!(text.contains("Before you leave"), "{text}");
    assert!(text.contains("Please answer yes or no."), "{text}");
    let j: serde_json::Value = serde_json::from_str(text.lines().last().unwrap()).unwrap();
    let done: Vec<bool> = j["before_leaving"]["items"]
        .as_array()
        .unwrap()
        .iter()
        .map(|i| i["done"].as_bool().unwrap())
        .collect();
    assert_eq!(done, [true, false, false, true]);
}
