//! The app over a real store: tags, checks, follow-ups and handoff reports go through
//! `crate::store`, the demo plant lives in its own folder, and half-typed work survives a
//! restart. Driven through the screens' adapters (what the widgets call) with Slint's
//! testing backend, no display. What is saved, and how, is tested without the UI on the
//! action layer (`tests/action_*.rs`).
#![cfg(feature = "ui")]

mod util;

use loopside::app::{
    clear_demo, load_or_demo, save, App, AppState, CheckAdapter, FormField, LogAdapter,
    ReportFormat, Screen, SeriesKind, TagForm, TagsAdapter, DEMO_DIR,
};
use loopside::journal::Kind;
use loopside::store::{FileStore, MemoryStore};
use slint::{ComponentHandle, Model};
use std::path::PathBuf;

fn app_over(state: AppState) -> App {
    util::ui_backend();
    App::new(state).unwrap()
}

/// A fresh, empty data folder for one test.
fn data_dir(name: &str) -> PathBuf {
    let dir = std::env::temp_dir().join(format!("loopside-ui-store-{name}-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    dir
}

fn log_texts(app: &App) -> Vec<String> {
    let rows = app.window.global::<LogAdapter>().get_rows();
    (0..rows.row_count())
        .filter_map(|i| rows.row_data(i))
        .map(|r| format!("{} {}: {}", r.tag, r.title, r.text))
        .collect()
}

#[test]
fn a_five_point_check_is_judged_and_saved_to_the_log() {
    let app = app_over(AppState::demo());
    app.show_screen(Screen::Check);
    let check = app.window.global::<CheckAdapter>();
    check.invoke_read_cautions();
    // LT-101 (0–4.5 m, ±0.5 % of span). As found, the zero reads 0.12 mA high all the way
    // up and down: +0.75 % of span at every point, a fail.
    let expected = [4.0, 8.0, 12.0, 16.0, 20.0, 16.0, 12.0, 8.0, 4.0];
    for (i, ma) in expected.iter().enumerate() {
        check.invoke_found_edited(
            i as i32,
            format!("{:.2}", ma + 0.12).replace('.', ",").into(),
        );
    }
    assert_eq!(check.get_verdict_title(), "Fail");
    assert!(check.get_verdict_detail().contains("0.75 %"));
    let row = check.get_rows().row_data(2).unwrap();
    assert_eq!(row.apply, "2.2500 m", "50 % of 0–4.5 m");
    assert_eq!(row.expected, "12.000");
    assert_eq!(
        row.tone,
        loopside::app::Tone::Bad,
        "each point outside tolerance is marked"
    );
    assert_eq!(row.verdict, "FAIL");
    check.set_initials_text("ef".into());
    check.invoke_save();
    assert_eq!(check.get_error_text(), "");
    assert!(check.get_message().starts_with("Saved the as found check"));
    // The form moves on to as-left with an empty table.
    assert_eq!(check.get_stage(), loopside::app::CheckStage::AsLeft);
    assert_eq!(check.get_rows().row_data(0).unwrap().found, "");
    let state = app.state.borrow();
    let saved = state.store.entries().last().unwrap();
    assert_eq!(saved.kind, Kind::LoopCheck);
    assert_eq!(saved.author, "EF");
    assert_eq!(saved.payload.as_ref().unwrap()["pass"], false);
    drop(state);
    app.show_screen(Screen::Log);
    assert!(
        log_texts(&app)[0].starts_with("LT-101 Check failed: transmitter check, as found: FAIL")
    );
}

#[test]
fn a_new_tag_is_in_the_register_and_opens() {
    let app = app_over(AppState::demo());
    let tags = app.window.global::<TagsAdapter>();
    tags.invoke_new_tag();
    let mut form: TagForm = tags.get_form();
    form.number = "LT-606".into();
    form.service = "Sludge holding tank level".into();
    form.lrv = "0".into();
    form.urv = "3,2".into();
    form.unit = "m".into();
    tags.invoke_save(form.clone());
    assert_eq!(tags.get_error_text(), "");
    let state = app.state.borrow();
    assert_eq!(state.open_tag().unwrap().number, "LT-606");
    assert_eq!(state.store.tag("LT-606").unwrap().tag.scale.urv, 3.2);
    drop(state);
    // The same number again is refused and names the field.
    tags.invoke_new_tag();
    tags.invoke_save(form);
    assert_eq!(tags.get_error_field(), loopside::app::FormField::Tag);
    assert!(tags.get_error_text().contains("already in the register"));
}

#[test]
fn handoff_reports_are_written_and_a_bundle_imports_once() {
    // The Log screen's wiring: its folder, its Since field and its messages. The files'
    // contents and the import's counting are tested on the action layer (action_bundle).
    let dir = data_dir("export");
    let app = app_over(AppState::demo());
    app.show_screen(Screen::Log);
    let log = app.window.global::<LogAdapter>();
    log.invoke_show_all(true);
    log.set_export_dir(dir.display().to_string().into());
    for format in [
        ReportFormat::Markdown,
        ReportFormat::Csv,
        ReportFormat::Json,
    ] {
        log.invoke_export_report(format);
        assert!(
            log.get_message().starts_with("Wrote "),
            "{}",
            log.get_message()
        );
    }
    let files: Vec<PathBuf> = std::fs::read_dir(&dir)
        .unwrap()
        .map(|e| e.unwrap().path())
        .collect();
    assert_eq!(files.len(), 3, "{files:?}");
    let md = files
        .iter()
        .find(|p| p.extension().unwrap() == "md")
        .unwrap();
    assert!(std::fs::read_to_string(md).unwrap().contains("PT-204"));
    let bundle = files
        .iter()
        .find(|p| p.extension().unwrap() == "json")
        .unwrap();

    // Another technician's empty app takes the bundle in whole, and only once.
    let other = app_over(AppState::with_store(Box::new(MemoryStore::new())));
    let log2 = other.window.global::<LogAdapter>();
    log2.set_import_path(bundle.display().to_string().into());
    log2.invoke_import_bundle();
    let demo_entries = app.state.borrow().store.entries().len();
    assert!(
        log2.get_message()
            .contains(&format!("{demo_entries} entr(ies)")),
        "{}",
        log2.get_message()
    );
    assert_eq!(other.state.borrow().store.entries().len(), demo_entries);
    log2.invoke_import_bundle();
    assert!(log2
        .get_message()
        .starts_with("Imported 0 tag(s) and 0 entr(ies)"));
    // A file that is not a bundle is refused, and says so.
    log2.set_import_path(md.display().to_string().into());
    log2.invoke_import_bundle();
    assert!(log2.get_message().starts_with("Nothing imported"));

    // A shift's hand-over: only what was written since the shift began goes in the bundle.
    let shift = data_dir("export-shift");
    log.set_export_dir(shift.display().to_string().into());
    log.invoke_export_dir_edited(shift.display().to_string().into());
    log.invoke_since_edited("2026-11-30".into());
    log.invoke_export_report(ReportFormat::Json);
    let written = std::fs::read_dir(&shift)
        .unwrap()
        .next()
        .unwrap()
        .unwrap()
        .path();
    let b = loopside::report::parse_bundle(&std::fs::read_to_string(&written).unwrap()).unwrap();
    assert!(!b.entries.is_empty() && b.entries.len() < demo_entries);
    assert!(b
        .entries
        .iter()
        .all(|e| e.time.date_naive().to_string().as_str() >= "2026-11-30"));
    // A start that cannot be read writes nothing and says why.
    log.invoke_since_edited("fortnight".into());
    log.invoke_export_report(ReportFormat::Markdown);
    assert!(
        log.get_message().starts_with("Not written: since"),
        "{}",
        log.get_message()
    );
    std::fs::remove_dir_all(&dir).unwrap();
    std::fs::remove_dir_all(&shift).unwrap();
}

#[test]
fn the_demo_lives_apart_and_clearing_it_leaves_an_empty_register() {
    let dir = data_dir("demo");
    let state = load_or_demo(dir.clone()).unwrap();
    assert!(state.demo);
    assert_eq!(
        state.store.tags().len(),
        loopside::demo::tags().unwrap().len()
    );
    assert_eq!(state.store.references().len(), 3);
    assert!(dir.join(DEMO_DIR).is_dir());
    let mut state = state;
    clear_demo(&mut state).unwrap();
    assert!(!state.demo);
    assert!(state.store.is_empty());
    assert!(!dir.join(DEMO_DIR).exists());
    save(&state).unwrap();
    drop(state);
    // Next start: the register is still empty and the demo does not come back.
    let state = load_or_demo(dir.clone()).unwrap();
    assert!(!state.demo);
    assert!(state.store.is_empty());
    drop(state);
    // A store with the technician's own data never gets the demo.
    let other = data_dir("own");
    {
        let mut store = FileStore::open(&other).unwrap();
        loopside::demo::fill(&mut store, loopside::app::demo_now()).unwrap();
    }
    let state = load_or_demo(other.clone()).unwrap();
    assert!(!state.demo);
    assert!(!other.join(DEMO_DIR).exists());
    drop(state);
    std::fs::remove_dir_all(&dir).unwrap();
    std::fs::remove_dir_all(&other).unwrap();
}

#[test]
fn an_unfinished_check_and_a_note_survive_a_restart() {
    let dir = data_dir("restart");
    {
        let app = app_over(load_or_demo(dir.clone()).unwrap());
        let check = app.window.global::<CheckAdapter>();
        check.invoke_read_cautions();
        check.invoke_found_edited(0, "4,04".into());
        check.invoke_found_edited(1, "8.0".into());
        let log = app.window.global::<LogAdapter>();
        log.invoke_add_note("Junction box lid seal perished".into(), "IJ".into(), false);
        save(&app.state.borrow()).unwrap();
    }
    let app = app_over(load_or_demo(dir.clone()).unwrap());
    let check = app.window.global::<CheckAdapter>();
    assert!(check.get_cautions_read());
    let rows = check.get_rows();
    assert_eq!(rows.row_data(0).unwrap().found, "4,04");
    assert_eq!(rows.row_data(1).unwrap().found, "8.0");
    assert_eq!(rows.row_data(0).unwrap().error, "0.25 %");
    app.show_screen(Screen::Log);
    assert!(log_texts(&app)[0].ends_with("Junction box lid seal perished"));
    drop(app);
    std::fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn a_loop_edited_on_power_is_saved_to_its_tag() {
    let app = app_over(AppState::demo());
    app.show_screen(Screen::Power);
    let power = app.window.global::<loopside::app::PowerAdapter>();
    assert!(power.get_can_save());
    // The PLC card was swapped for one with a 100 Ω input; a 26 V supply went in.
    power.invoke_edited(FormField::Supply, "26".into());
    power.invoke_save_to_tag();
    assert_eq!(power.get_message(), "Saved this loop to LT-101.");
    let state = app.state.borrow();
    let config = state.open_tag().unwrap().loop_config.clone().unwrap();
    assert_eq!(config.supply_volts, 26.0);
    drop(state);
    // A bad field is named and nothing is saved.
    power.invoke_edited(FormField::Supply, "lots".into());
    power.invoke_save_to_tag();
    assert!(power.get_error_text().starts_with("supply"));
    let state = app.state.borrow();
    assert_eq!(
        state
            .open_tag()
            .unwrap()
            .loop_config
            .as_ref()
            .unwrap()
            .supply_volts,
        26.0
    );
}

#[test]
fn a_half_typed_tag_a_note_and_the_reference_survive_a_restart() {
    let dir = data_dir("drafts");
    {
        let app = app_over(load_or_demo(dir.clone()).unwrap());
        let tags = app.window.global::<TagsAdapter>();
        tags.invoke_new_tag();
        let mut form = tags.get_form();
        form.number = "PT-650".into();
        form.service = "Clarifier drive torque".into();
        tags.set_form(form);
        tags.invoke_add_element(SeriesKind::Resistor);
        app.window
            .global::<LogAdapter>()
            .set_note_text("Gland on JB-04 weeping".into());
        app.window
            .global::<CheckAdapter>()
            .set_reference_id("CAL-07".into());
        // As on close, or when Android pauses the app.
        app.save_now().unwrap();
    }
    // (A global handle keeps the window alive, so each app lives in a block of its own.)
    {
        let app = app_over(load_or_demo(dir.clone()).unwrap());
        let tags = app.window.global::<TagsAdapter>();
        assert!(tags.get_editing(), "the form is open again");
        assert!(tags.get_is_new());
        let form = tags.get_form();
        assert_eq!(form.number, "PT-650");
        assert_eq!(form.service, "Clarifier drive torque");
        assert_eq!(form.elements.row_count(), 1);
        assert_eq!(
            app.window.global::<LogAdapter>().get_note_text(),
            "Gland on JB-04 weeping"
        );
        assert_eq!(
            app.window.global::<CheckAdapter>().get_reference_id(),
            "CAL-07"
        );
        // Once saved, the form is not brought back again.
        tags.invoke_save(form);
        assert_eq!(tags.get_error_text(), "");
        app.save_now().unwrap();
    }
    let app = app_over(load_or_demo(dir.clone()).unwrap());
    assert!(!app.window.global::<TagsAdapter>().get_editing());
    assert!(app.state.borrow().store.tag("PT-650").is_some());
    drop(app);
    std::fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn a_plants_own_procedures_are_offered_on_find_fault() {
    use loopside::app::FaultAdapter;
    let dir = data_dir("procedures");
    let folder = dir.join("procedures");
    std::fs::create_dir_all(&folder).unwrap();
    // The plant's own variant of the noisy-reading procedure (same steps, its own words),
    // and a file that is not a procedure at all.
    let mut own: serde_json::Value = serde_json::from_str(
        &std::fs::read_to_string(concat!(
            env!("CARGO_MANIFEST_DIR"),
            "/procedures/noisy.json"
        ))
        .unwrap(),
    )
    .unwrap();
    own["id"] = "mixer-noise".into();
    own["symptom"] = "mixer-noise".into();
    own["title"] = "Level jumps while the mixer runs".into();
    std::fs::write(folder.join("mixer-noise.json"), own.to_string()).unwrap();
    std::fs::write(folder.join("draft.json"), "{ \"format\": 1 }").unwrap();
    {
        let app = app_over(load_or_demo(dir.clone()).unwrap());
        let fault = app.window.global::<FaultAdapter>();
        let symptoms = fault.get_symptoms();
        let titles: Vec<String> = (0..symptoms.row_count())
            .filter_map(|i| symptoms.row_data(i))
            .map(|s| s.title.to_string())
            .collect();
        assert_eq!(titles[0], "Level jumps while the mixer runs");
        assert_eq!(titles.len(), 8, "the plant's one, then the seven built in");
        assert!(
            fault
                .get_procedure_problems()
                .contains("draft.json is not offered"),
            "{}",
            fault.get_procedure_problems()
        );
        fault.invoke_read_cautions();
        fault.invoke_pick_symptom(0);
        assert!(fault.get_running());
        assert_eq!(
            fault.get_procedure_title(),
            "Level jumps while the mixer runs"
        );
        app.save_now().unwrap();
    }
    // The unfinished session on the plant's procedure resumes after a restart.
    let app = app_over(load_or_demo(dir.clone()).unwrap());
    let fault = app.window.global::<FaultAdapter>();
    assert!(fault.get_running());
    assert_eq!(
        fault.get_procedure_title(),
        "Level jumps while the mixer runs"
    );
    drop(fault);
    drop(app);
    std::fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn a_damaged_screen_state_is_set_aside_and_the_app_starts() {
    // Random bytes where app-state.json should be (a torn write on an old firmware, or a
    // file from a newer loopside): the app must still start, keep the file, and say so.
    let dir = data_dir("damaged-state");
    {
        let app = app_over(load_or_demo(dir.clone()).unwrap());
        save(&app.state.borrow()).unwrap();
    }
    let garbage: Vec<u8> = (0u8..=255).rev().cycle().take(3000).collect();
    std::fs::write(dir.join("app-state.json"), &garbage).unwrap();
    let state = load_or_demo(dir.clone()).expect("the app starts over a damaged state");
    assert!(
        state
            .notices
            .iter()
            .any(|n| n.contains("app-state.unreadable.json")),
        "{:?}",
        state.notices
    );
    assert_eq!(
        std::fs::read(dir.join("app-state.unreadable.json")).unwrap(),
        garbage,
        "kept byte for byte, never deleted"
    );
    assert!(!dir.join("app-state.json").exists());
    let app = app_over(state);
    // Said once, on whatever screen opens first, until the technician taps OK.
    let top = app.window.global::<loopside::app::AppAdapter>();
    assert!(top.get_has_notice());
    assert!(
        top.get_notice().contains("could not be read"),
        "{}",
        top.get_notice()
    );
    top.invoke_dismiss_notice();
    assert!(!top.get_has_notice());
    drop(app);
    // A second damaged file does not overwrite the first one kept.
    std::fs::write(dir.join("app-state.json"), b"{not json").unwrap();
    let (saved, notice) = loopside::app::state::load_or_set_aside(&dir).unwrap();
    assert!(saved.is_none());
    assert!(notice.unwrap().contains("app-state.unreadable-2.json"));
    assert_eq!(
        std::fs::read(dir.join("app-state.unreadable.json")).unwrap(),
        garbage
    );
    assert_eq!(
        std::fs::read(dir.join("app-state.unreadable-2.json")).unwrap(),
        b"{not json"
    );
    std::fs::remove_dir_all(&dir).unwrap();
}
