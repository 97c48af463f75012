//! Render timings, `cargo bench --bench render`:
//!
//! - each screen at phone size (1080 × 2400 at 2.75), median of repeated full redraws;
//!   target under 8 ms (half a 60 Hz frame);
//! - process start to first frame with a 2,000-tag register; target under 150 ms (the
//!   Android vitals threshold for an excessive cold start is 5 s). Measured by starting
//!   this bench binary again in a mode that builds the register, renders one frame and
//!   exits, so exec, dynamic loading and font set-up all count.

use loopside::app::render::{Frame, Headless, PHONE};
use loopside::app::{screen_name, AppState, SCREENS};
use loopside::scale::Scale;
use loopside::tag::Tag;
use std::time::{Duration, Instant};

const FIRST_FRAME_MODE: &str = "LOOPSIDE_BENCH_FIRST_FRAME";
const RUNS: usize = 30;
const STARTS: usize = 7;

/// The demo plant plus generated tags up to `n`.
fn register(n: usize) -> AppState {
    let mut state = AppState::demo();
    let mut i = 0;
    while state.tags.len() < n {
        i += 1;
        let scale = Scale::linear(0.0, 10.0 + (i % 50) as f64, "bar").expect("valid range");
        let mut tag = Tag::new(&format!("PT-{:04}", 1000 + i), scale).expect("valid tag");
        tag.service = format!("Generated pressure point {i}");
        state.tags.push(tag);
    }
    state
}

fn median(mut v: Vec<Duration>) -> Duration {
    v.sort();
    v[v.len() / 2]
}

fn first_frame() {
    let h = Headless::new(register(2000)).expect("headless window");
    let frame = h.render(PHONE);
    // Keep the frame alive until here so the render is not optimised away.
    std::hint::black_box(frame.at(0, 0));
}

fn main() {
    if std::env::var_os(FIRST_FRAME_MODE).is_some() {
        first_frame();
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
    let mut starts = Vec::new();
    for _ in 0..STARTS {
        let t = Instant::now();
        let status = std::process::Command::new(&exe)
            .env(FIRST_FRAME_MODE, "1")
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
    let m = median(starts);
    println!(
        "process start to first frame, 2,000 tags, median of {STARTS}: {:.1} ms {}",
        m.as_secs_f64() * 1e3,
        if m < Duration::from_millis(150) {
            "ok (target < 150 ms)"
        } else {
            "OVER TARGET (150 ms)"
        }
    );
}
