//! The Slint app: the window, one glue module per screen, and headless rendering.
//!
//! Each screen's `.slint` file exports one global adapter; each module here has a
//! `connect(&window, &state)` that wires the adapter's callbacks to the core, and `refresh`
//! / `map_*` functions that copy view models (from [`crate::view`]) into Slint values.
//! Closures hold `window.as_weak()` and the shared [`AppState`]; nothing here computes
//! anything the core or the view models do not.

slint::include_modules!();

pub mod about;
pub mod check;
pub mod convert;
pub mod fault;
pub mod log;
pub mod power;
pub mod render;
pub mod sample;
pub mod state;
pub mod tags;

use crate::tag::Tag;
use state::UiState;
use std::cell::RefCell;
use std::path::PathBuf;
use std::rc::Rc;

/// Everything the app holds while it runs. The register and the log are in memory until
/// the store lands; [`UiState`] is what survives the app being killed.
#[derive(Debug, Clone, Default)]
pub struct AppState {
    /// The register.
    pub tags: Vec<Tag>,
    /// The log, newest first.
    pub log: Vec<sample::SampleEntry>,
    /// Screen, open tag, half-typed values.
    pub ui: UiState,
    /// True while the demo plant is loaded and not yet cleared.
    pub demo: bool,
    /// Where the data lives (shown on About; `None` when rendering headless).
    pub data_dir: Option<PathBuf>,
    /// Screens visited, for the back button.
    pub history: Vec<Screen>,
}

impl AppState {
    /// A state with the demo plant loaded (first start, screenshots, tests).
    pub fn demo() -> AppState {
        let tags = sample::tags().unwrap_or_default();
        let mut ui = UiState::default();
        ui.open_tag = tags.first().map(|t| t.number.clone());
        AppState {
            tags,
            log: sample::log(),
            ui,
            demo: true,
            data_dir: None,
            history: Vec::new(),
        }
    }

    /// The open tag, if it is in the register.
    pub fn open_tag(&self) -> Option<&Tag> {
        let number = self.ui.open_tag.as_deref()?;
        self.tags.iter().find(|t| t.number == number)
    }
}

/// Shared, single-threaded app state as the callbacks see it.
pub type Shared = Rc<RefCell<AppState>>;

/// The window and its state, wired.
pub struct App {
    /// The Slint window.
    pub window: AppWindow,
    /// The state the callbacks share.
    pub state: Shared,
}

impl App {
    /// Create the window on the current Slint platform, wire every screen and show the
    /// saved (or default) screen.
    pub fn new(mut state: AppState) -> Result<App, slint::PlatformError> {
        power::sync_form(&mut state);
        let window = AppWindow::new()?;
        let state: Shared = Rc::new(RefCell::new(state));
        connect(&window, &state);
        tags::connect(&window, &state);
        convert::connect(&window, &state);
        power::connect(&window, &state);
        fault::connect(&window, &state);
        check::connect(&window, &state);
        log::connect(&window, &state);
        about::connect(&window, &state);
        refresh_all(&window, &state.borrow());
        Ok(App { window, state })
    }

    /// Go to a screen (as the navigation does).
    pub fn show_screen(&self, screen: Screen) {
        navigate(&self.window, &self.state, screen, true);
    }

    /// Switch the light and dark themes.
    pub fn set_dark(&self, dark: bool) {
        self.state.borrow_mut().ui.dark = dark;
        self.window.global::<Theme>().set_dark(dark);
    }

    /// The back button: the previous screen, or `false` when there is none (leave the app).
    pub fn back(&self) -> bool {
        back(&self.window, &self.state)
    }
}

/// Every screen, in navigation order.
pub const SCREENS: [Screen; 7] = [
    Screen::Tags,
    Screen::Convert,
    Screen::Power,
    Screen::Fault,
    Screen::Check,
    Screen::Log,
    Screen::About,
];

/// A short stable name for a screen (file names, saved state).
pub fn screen_name(screen: Screen) -> &'static str {
    match screen {
        Screen::Tags => "tags",
        Screen::Convert => "convert",
        Screen::Power => "power",
        Screen::Fault => "fault",
        Screen::Check => "check",
        Screen::Log => "log",
        Screen::About => "about",
    }
}

/// The screen for a saved name.
pub fn screen_from_name(name: &str) -> Option<Screen> {
    SCREENS.into_iter().find(|s| screen_name(*s) == name)
}

fn connect(window: &AppWindow, state: &Shared) {
    let adapter = window.global::<AppAdapter>();
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_navigate(move |screen| {
        if let Some(w) = weak.upgrade() {
            navigate(&w, &st, screen, true);
        }
    });
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_back(move || match weak.upgrade() {
        Some(w) => back(&w, &st),
        None => false,
    });
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_clear_demo(move || {
        if let Some(w) = weak.upgrade() {
            {
                let mut s = st.borrow_mut();
                s.demo = false;
                s.tags.clear();
                s.log.clear();
                s.ui.open_tag = None;
            }
            refresh_all(&w, &st.borrow());
        }
    });
}

/// Show `screen`, remembering where we came from when `remember` is set.
pub fn navigate(window: &AppWindow, state: &Shared, screen: Screen, remember: bool) {
    let adapter = window.global::<AppAdapter>();
    let current = adapter.get_screen();
    if current == screen {
        return;
    }
    {
        let mut s = state.borrow_mut();
        if remember {
            s.history.push(current);
        }
        s.ui.screen = screen_name(screen).to_string();
    }
    adapter.set_screen(screen);
}

/// Go back one screen; `false` when there is nowhere to go back to.
pub fn back(window: &AppWindow, state: &Shared) -> bool {
    let previous = state.borrow_mut().history.pop();
    match previous {
        Some(screen) => {
            navigate(window, state, screen, false);
            true
        }
        None => false,
    }
}

/// Copy the whole state into every adapter (start-up, demo cleared, tag changed).
pub fn refresh_all(window: &AppWindow, state: &AppState) {
    window.global::<Theme>().set_dark(state.ui.dark);
    let adapter = window.global::<AppAdapter>();
    adapter.set_demo_banner(state.demo);
    adapter.set_open_tag(state.ui.open_tag.clone().unwrap_or_default().into());
    if let Some(screen) = screen_from_name(&state.ui.screen) {
        adapter.set_screen(screen);
    }
    tags::refresh(window, state);
    convert::refresh(window, state);
    power::refresh(window, state);
    fault::refresh(window, state);
    check::refresh(window, state);
    log::refresh(window, state);
    about::refresh(window, state);
}

/// A Slint model from a vector.
pub(crate) fn model<T: Clone + 'static>(items: Vec<T>) -> slint::ModelRc<T> {
    slint::ModelRc::new(slint::VecModel::from(items))
}

/// The state to start with: what was saved in `data_dir`, or the demo plant on first start.
pub fn load_or_demo(data_dir: PathBuf) -> std::io::Result<AppState> {
    let mut state = AppState::demo();
    if let Some(saved) = state::load(&data_dir)? {
        state.ui = saved.ui;
        state.demo = saved.demo;
        if !saved.demo {
            state.tags = saved.tags;
            state.log = saved.log;
        }
    }
    state.data_dir = Some(data_dir);
    Ok(state)
}

/// Save what must survive into the state's data folder (nothing when it has none).
pub fn save(state: &AppState) -> std::io::Result<()> {
    match &state.data_dir {
        Some(dir) => state::save(dir, &state::Saved::from_state(state)),
        None => Ok(()),
    }
}

/// Run the desktop app: store in the platform data folder, the demo plant on first start.
/// (Not on Android, where the data folder comes from the activity: see `crate::android`.)
#[cfg(not(target_os = "android"))]
pub fn run_desktop() -> Result<(), Box<dyn std::error::Error>> {
    let data_dir = directories::ProjectDirs::from("", "", "loopside")
        .map(|d| d.data_dir().to_path_buf())
        .ok_or("no home folder to keep loopside's data in")?;
    let app = App::new(load_or_demo(data_dir)?)?;
    app.window.run()?;
    save(&app.state.borrow())?;
    Ok(())
}
