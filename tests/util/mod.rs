//! Shared helpers for the integration tests: run the binary, compare numbers.
#![allow(dead_code)]

use std::process::{Command, Output};

/// Run the `loopside` binary with `args` and no standard input.
pub fn loopside(args: &[&str]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_loopside"))
        .args(args)
        .env_remove("LOOPSIDE_DATA")
        .stdin(std::process::Stdio::null())
        .output()
        .expect("the loopside binary runs")
}

/// Run the binary expecting success, and parse its single JSON object.
pub fn loopside_json(args: &[&str]) -> serde_json::Value {
    let out = loopside(args);
    assert!(
        out.status.success(),
        "loopside {args:?} failed: {}",
        String::from_utf8_lossy(&out.stderr)
    );
    serde_json::from_slice(&out.stdout).unwrap_or_else(|e| {
        panic!(
            "loopside {args:?} printed no JSON ({e}): {}",
            String::from_utf8_lossy(&out.stdout)
        )
    })
}

/// Run the binary expecting bad-input exit code 2; return stderr.
pub fn loopside_refuses(args: &[&str]) -> String {
    let out = loopside(args);
    let stderr = String::from_utf8_lossy(&out.stderr).to_string();
    assert_eq!(
        out.status.code(),
        Some(2),
        "loopside {args:?} should exit 2; stdout {} stderr {stderr}",
        String::from_utf8_lossy(&out.stdout)
    );
    assert!(out.stdout.is_empty(), "nothing on stdout for bad input");
    assert_eq!(
        stderr.trim().lines().count(),
        1,
        "one-line message: {stderr}"
    );
    stderr
}

/// Assert `actual` is within `tol` of `expected`, with a message naming `what`.
#[track_caller]
pub fn close(actual: f64, expected: f64, tol: f64, what: &str) {
    assert!(
        (actual - expected).abs() <= tol,
        "{what}: got {actual}, expected {expected} ± {tol}"
    );
}

/// A fresh empty folder under the system temp folder, removed when dropped.
pub struct TempDir(pub std::path::PathBuf);

impl TempDir {
    /// A new folder whose name starts with `what`.
    pub fn new(what: &str) -> TempDir {
        use std::sync::atomic::{AtomicU64, Ordering};
        static N: AtomicU64 = AtomicU64::new(0);
        let nanos = std::time::SystemTime::now()
            .duration_since(std::time::UNIX_EPOCH)
            .map(|d| d.as_nanos())
            .unwrap_or(0);
        let p = std::env::temp_dir().join(format!(
            "loopside-test-{what}-{}-{}-{nanos}",
            std::process::id(),
            N.fetch_add(1, Ordering::Relaxed)
        ));
        std::fs::create_dir_all(&p).expect("temp folder");
        TempDir(p)
    }

    /// The folder.
    pub fn path(&self) -> &std::path::Path {
        &self.0
    }

    /// The folder as a string, for command-line arguments.
    pub fn arg(&self) -> String {
        self.0.to_string_lossy().into_owned()
    }
}

impl Drop for TempDir {
    fn drop(&mut self) {
        let _ = std::fs::remove_dir_all(&self.0);
    }
}

/// Every file name (recursively, relative) under `dir`, sorted.
pub fn files_under(dir: &std::path::Path) -> Vec<String> {
    fn walk(base: &std::path::Path, dir: &std::path::Path, out: &mut Vec<String>) {
        if let Ok(rd) = std::fs::read_dir(dir) {
            for e in rd.flatten() {
                let p = e.path();
                if p.is_dir() {
                    walk(base, &p, out);
                } else if let Ok(rel) = p.strip_prefix(base) {
                    out.push(rel.to_string_lossy().into_owned());
                }
            }
        }
    }
    let mut v = Vec::new();
    walk(dir, dir, &mut v);
    v.sort();
    v
}

/// A small deterministic random number source for tests (xorshift64*).
pub struct Rng(pub u64);

impl Rng {
    /// Seeded from the clock, printed so a failure can be replayed.
    pub fn from_clock(what: &str) -> Rng {
        let seed = std::time::SystemTime::now()
            .duration_since(std::time::UNIX_EPOCH)
            .map(|d| d.as_nanos() as u64)
            .unwrap_or(1)
            | 1;
        eprintln!("{what}: seed {seed}");
        Rng(seed)
    }

    /// The next 64 random bits.
    pub fn next(&mut self) -> u64 {
        self.0 ^= self.0 >> 12;
        self.0 ^= self.0 << 25;
        self.0 ^= self.0 >> 27;
        self.0.wrapping_mul(0x2545_f491_4f6c_dd1d)
    }

    /// A number in `0..n`.
    pub fn below(&mut self, n: u64) -> u64 {
        self.next() % n.max(1)
    }
}

#[cfg(feature = "ui")]
thread_local! {
    static UI_READY: std::cell::Cell<bool> = const { std::cell::Cell::new(false) };
}

/// Slint's testing backend, set up once per test thread (UI tests only).
#[cfg(feature = "ui")]
pub fn ui_backend() {
    UI_READY.with(|r| {
        if !r.get() {
            i_slint_backend_testing::init_no_event_loop();
            r.set(true);
        }
    });
}

/// Ways a technician types the start of a period, accepted alike by the Log screen's
/// *Since* field and by `note list --since` / `export --since`.
pub const PERIOD_FORMS: &[&str] = &[
    "12 h",
    "12h",
    "1,5 hours",
    "3 d",
    "3 days",
    "today",
    "Yesterday",
    "2026-11-28",
    "2026-11-30 06:00",
    "2026-11-30T06:00:00Z",
];

/// Texts that are not a period, refused alike by every front, naming the field.
pub const NOT_PERIODS: &[&str] = &["last week", "-3 h", "9000 h", "400 d", "2026-13-01", "h"];

/// Mid-afternoon at Brindlemoor, 1 December 2026 (UTC+1): the moment the action tests
/// act at.
pub fn afternoon() -> chrono::DateTime<chrono::FixedOffset> {
    chrono::DateTime::parse_from_rfc3339("2026-12-01T15:30:00+01:00").expect("a time")
}

/// The demo plant (Brindlemoor Water Reclamation Works) in a memory store, its log
/// written up to `now`.
pub fn brindlemoor(now: chrono::DateTime<chrono::FixedOffset>) -> loopside::store::MemoryStore {
    let mut store = loopside::store::MemoryStore::new();
    loopside::demo::fill(&mut store, now).expect("the demo fills an empty store");
    store
}

/// Finding and driving the app's elements by accessible label, for the UI tests.
#[cfg(feature = "ui")]
pub mod ui {
    use i_slint_backend_testing::{AccessibleRole, ElementHandle, ElementRoot};
    use loopside::app::{App, AppState};
    use slint::ComponentHandle;

    /// The app on `state` in a `width` × `height` window (logical px); a tall window keeps
    /// every element in view for the search.
    pub fn app_sized(state: AppState, width: f32, height: f32) -> App {
        super::ui_backend();
        let app = App::new(state).unwrap();
        app.window
            .window()
            .set_size(slint::LogicalSize::new(width, height));
        // The window picks its phone or desktop layout in a `changed width` handler, which
        // an event loop runs; the testing backend has none, so it is run here (without it
        // the layout chosen for the backend's default size stays, whatever the width).
        slint::platform::update_timers_and_animations();
        app
    }

    /// Every element with this label and role.
    pub fn all(app: &App, label: &str, role: AccessibleRole) -> Vec<ElementHandle> {
        ElementHandle::find_by_accessible_label(&app.window, label)
            .filter(|e| e.accessible_role() == Some(role))
            .collect()
    }

    /// The one element with this label and role; when there is not exactly one, the
    /// failure lists the labels there are with that role.
    pub fn one(app: &App, label: &str, role: AccessibleRole) -> ElementHandle {
        let mut found = all(app, label, role);
        if found.len() != 1 {
            let labels: Vec<String> = app
                .window
                .root_element()
                .query_descendants()
                .find_all()
                .into_iter()
                .filter(|e| e.accessible_role() == Some(role))
                .filter_map(|e| e.accessible_label().map(|l| l.to_string()))
                .collect();
            panic!(
                "expected one {role:?} labelled {label:?}, found {}; there are {labels:?}",
                found.len()
            );
        }
        found.remove(0)
    }

    /// Type `text` into the field labelled `label`.
    pub fn type_into(app: &App, label: &str, text: &str) {
        one(app, label, AccessibleRole::TextInput).set_accessible_value(text);
    }

    /// Tap the button labelled `label`.
    pub fn tap(app: &App, label: &str) {
        one(app, label, AccessibleRole::Button).invoke_accessible_default_action();
    }

    /// Tap the open tag form's *Save* and check it saved: no field is marked wrong (the
    /// error text is shown if one is).
    pub fn save_tag_form(app: &App) {
        use loopside::app::{FormField, TagsAdapter};
        tap(app, "Save");
        let tags = app.window.global::<TagsAdapter>();
        assert_eq!(
            tags.get_error_field(),
            FormField::None,
            "{}",
            tags.get_error_text()
        );
    }
}
