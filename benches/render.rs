//! Render timings, `cargo bench --bench render`:
//!
//! - each screen at phone size (1080 × 2400 at 2.75), median of repeated full redraws;
//!   target under 8 ms (half a 60 Hz frame);
//! - process start to first frame with a 2,000-tag store on disk; target under 150 ms (the
//!   Android vitals threshold for an excessive cold start is 5 s). The store is written
//!   once beforehand; then this bench binary is started again in a mode that opens the
//!   store as the app does, renders one frame and exits, so exec, dynamic loading, opening
//!   the store and font set-up all count.

use loopside::app::render::{Frame, Headless, PHONE};
use loopside::app::{load_or_demo, screen_name, AppState, SCREENS};
use loopside::journal::TagId;
use loopside::report::{Bundle, BUNDLE_SCHEMA};
use loopside::scale::Scale;
use loopside::store::{FileStore, Store, TagRecord};
use loopside::tag::Tag;
use std::path::{Path, PathBuf};
use std::time::{Duration, Instant};

const FIRST_FRAME_MODE: &str = "LOOPSIDE_BENCH_FIRST_FRAME";
const RUNS: usize = 30;
const STARTS: usize = 7;

/// Generated pressure tags, numbered from `first`.
fn generated(first: usize, count: usize) -> Vec<TagRecord> {
    (first..first + count)
        .map(|i| {
            let scale = Scale::linear(0.0, 10.0 + (i % 50) as f64, "bar").expect("valid range");
            let mut tag = Tag::new(&format!("PT-{:04}", 1000 + i), scale).expect("valid tag");
            tag.service = format!("Generated pressure point {i}");
            TagRecord {
                id: TagId(format!("bench-{i:05}")),
                tag,
            }
        })
        .collect()
}

/// A bundle of generated tags (imported in one durable write).
fn bundle(tags: Vec<TagRecord>) -> Bundle {
    Bundle {
        loopside: "bundle".to_string(),
        schema: BUNDLE_SCHEMA,
        exported: loopside::app::demo_now(),
        since: None,
        until: None,
        tags,
        entries: Vec::new(),
    }
}

/// The demo plant plus generated tags up to `n`, in memory.
fn register(n: usize) -> AppState {
    let mut state = AppState::demo();
    let have = state.store.tags().len();
    let extra = bundle(generated(1, n.saturating_sub(have)));
    state.store.import(&extra).expect("generated tags import");
    state
}

/// A data folder holding a store of `n` generated tags, written once.
fn store_on_disk(n: usize) -> PathBuf {
    let dir = std::env::temp_dir().join(format!("loopside-render-bench-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    let mut store = FileStore::open(&dir).expect("bench store");
    store.import(&bundle(generated(1, n))).expect("bench tags");
    dir
}

fn median(mut v: Vec<Duration>) -> Duration {
    v.sort();
    v[v.len() / 2]
}

fn first_frame(dir: &Path) {
    let state = load_or_demo(dir.to_path_buf()).expect("bench store opens");
    let h = Headless::new(state).expect("headless window");
    let frame = h.render(PHONE);
    // Keep the frame alive until here so the render is not optimised away.
    std::hint::black_box(frame.at(0, 0));
}

fn main() {
    if let Some(dir) = std::env::var_os(FIRST_FRAME_MODE) {
        first_frame(Path::new(&dir));
        return;
    }
    // `cargo bench` passes `--bench`; any other argument filters nothing here.
    let h = Headless::new(register(2000)).expect("headless window");
    h.resize(PHONE);
    let mut frame = Frame {
        width: PHONE.width,
        height: PHONE.height,
        pixels: vec![Default::default(); (PHONE.width * PHONE.height) as usize],
    };
    println!(
        "render at phone size (1080x2400 @2.75), median of {RUNS} full redraws, target < 8 ms:"
    );
    for screen in SCREENS {
        h.show(screen);
        h.draw_into(&mut frame); // first draw lays out and loads glyphs
        let times: Vec<Duration> = (0..RUNS)
            .map(|_| {
                let t = Instant::now();
                h.draw_into(&mut frame);
                t.elapsed()
            })
            .collect();
        let m = median(times);
        println!(
            "  {:<8} {:>7.2} ms {}",
            screen_name(screen),
            m.as_secs_f64() * 1e3,
            if m < Duration::from_millis(8) {
                "ok"
            } else {
                "OVER TARGET"
            }
        );
    }

    let exe = match std::env::current_exe() {
        Ok(e) => e,
        Err(e) => {
            eprintln!("cannot find this bench's executable: {e}");
            return;
        }
    };
    let dir = store_on_disk(2000);
    let mut starts = Vec::new();
    for _ in 0..STARTS {
        let t = Instant::now();
        let status = std::process::Command::new(&exe)
            .env(FIRST_FRAME_MODE, &dir)
            .status();
        match status {
            Ok(s) if s.success() => starts.push(t.elapsed()),
            Ok(s) => {
                eprintln!("first-frame run failed: {s}");
                return;
            }
            Err(e) => {
                eprintln!("first-frame run could not start: {e}");
                return;
            }
        }
    }
    let _ = std::fs::remove_dir_all(&dir);
    let m = median(starts);
    println!(
        "process start to first frame, 2,000-tag store on disk, median of {STARTS}: {:.1} ms {}",
        m.as_secs_f64() * 1e3,
        if m < Duration::from_millis(150) {
            "ok (target < 150 ms)"
        } else {
            "OVER TARGET (150 ms)"
        }
    );
}
