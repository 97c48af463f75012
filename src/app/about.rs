//! About screen glue: version, data folder, licences, theme switch.

use super::{model, AboutAdapter, AppState, AppWindow, Shared, Theme};
use slint::ComponentHandle;

/// Wire the adapter's callbacks and copy in what never changes while the app runs: the
/// version, the licences (483 crates' worth of text, built once) and the cautions.
pub fn connect(window: &AppWindow, state: &Shared) {
    let a = window.global::<AboutAdapter>();
    a.set_version(env!("CARGO_PKG_VERSION").into());
    a.set_licences(model(
        crate::view::about::licence_lines()
            .into_iter()
            .map(Into::into)
            .collect(),
    ));
    a.set_cautions(model(
        crate::view::CAUTIONS.iter().map(|c| (*c).into()).collect(),
    ));
    let weak = window.as_weak();
    let st = state.clone();
    window.global::<AboutAdapter>().on_toggle_theme(move || {
        let Some(w) = weak.upgrade() else { return };
        let dark = {
            let mut s = st.borrow_mut();
            s.ui.dark = !s.ui.dark;
            s.ui.dark
        };
        w.global::<Theme>().set_dark(dark);
    });
}

/// Copy the data folder in (it changes when the store is moved or cleared).
pub fn refresh(window: &AppWindow, state: &AppState) {
    let a = window.global::<AboutAdapter>();
    a.set_data_folder(
        state
            .data_dir
            .as_ref()
            .map(|d| d.display().to_string())
            .unwrap_or_else(|| "(not saved: preview)".to_string())
            .into(),
    );
}
