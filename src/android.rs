//! Android entry, and the only Android-only code in loopside.
//!
//! `android/` builds the APK from a five-line `cdylib` whose `android_main` calls [`main`].
//! The data folder is the app's internal storage (`internal_data_path()`), never a
//! `directories` path. State is saved when Android asks for it (the save-state event), when
//! the app is paused or stopped (Android may kill it in the background without another
//! word), and when the window closes. The back button is handled in the UI (`Key.Back`).

use crate::app::{load_or_demo, save_now, App, AppWindow, Shared};
pub use slint::android::android_activity::AndroidApp;
use slint::android::android_activity::{MainEvent, PollEvent};
use std::cell::RefCell;
use std::rc::Rc;

/// Run the app on Android; errors are reported to logcat through stderr.
pub fn main(android: AndroidApp) {
    if let Err(e) = run(android) {
        eprintln!("loopside: {e}");
    }
}

fn run(android: AndroidApp) -> Result<(), Box<dyn std::error::Error>> {
    let data_dir = android
        .internal_data_path()
        .ok_or("Android gave the app no internal data folder")?;
    let for_exports = android.clone();
    // Filled once the window exists: the state and a handle on the window, whose fields
    // hold what is typed but not yet saved.
    type Running = (Shared, slint::Weak<AppWindow>);
    let shared: Rc<RefCell<Option<Running>>> = Rc::new(RefCell::new(None));
    let for_events = shared.clone();
    slint::android::init_with_event_listener(android, move |event| {
        if let PollEvent::Main(MainEvent::SaveState { .. } | MainEvent::Pause | MainEvent::Stop) =
            event
        {
            if let Some((state, weak)) = for_events.borrow().as_ref() {
                // Never panic inside the event loop: a state busy elsewhere is saved by the
                // autosave a moment later.
                if let Some(window) = weak.upgrade() {
                    if let Err(e) = save_now(&window, state) {
                        eprintln!("loopside: could not save state: {e}");
                    }
                }
            }
        }
    })?;
    let mut state = load_or_demo(data_dir.clone())?;
    // Handoff reports go to the app's folder on shared storage, where a file manager or a
    // USB connection reaches them (Android/data/<package>/files); internal storage if none.
    state.export_dir = Some(
        for_exports
            .external_data_path()
            .unwrap_or_else(|| data_dir.join("exports")),
    );
    let app = App::new(state)?;
    *shared.borrow_mut() = Some((
        app.state.clone(),
        slint::ComponentHandle::as_weak(&app.window),
    ));
    // `run` is a method of Slint's ComponentHandle trait, named here as `as_weak` is above.
    slint::ComponentHandle::run(&app.window)?;
    app.save_now()?;
    Ok(())
}
