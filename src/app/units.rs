//! Units screen glue: the quantity and the two units picked, the value and the atmosphere
//! typed → [`crate::view::units`] → `UnitsAdapter`. What is picked and typed is kept in the
//! saved state as it changes.

use super::{model, AppState, AppWindow, Shared, UnitsAdapter};
use crate::units::Quantity;
use crate::view::units::{self as vu, quantity_at, UnitsInput, QUANTITIES};
use slint::ComponentHandle;

/// Wire the adapter's callbacks.
pub fn connect(window: &AppWindow, state: &Shared) {
    let adapter = window.global::<UnitsAdapter>();
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_pick_quantity(move |i| {
        let Some(w) = weak.upgrade() else { return };
        {
            let mut s = st.borrow_mut();
            let q = quantity_at(usize::try_from(i).unwrap_or(0));
            let form = &mut s.ui.units;
            if form.quantity != q.name() {
                let (from, to) = vu::default_pair(q);
                form.quantity = q.name().to_string();
                form.from = from.to_string();
                form.to = to.to_string();
            }
        }
        refresh(&w, &st.borrow());
    });
    for to_side in [false, true] {
        let weak = window.as_weak();
        let st = state.clone();
        let pick = move |i: i32| {
            let Some(w) = weak.upgrade() else { return };
            {
                let mut s = st.borrow_mut();
                let list = vu::symbols(quantity(&s));
                if let Some(symbol) = usize::try_from(i).ok().and_then(|i| list.get(i)) {
                    if to_side {
                        s.ui.units.to = symbol.to_string();
                    } else {
                        s.ui.units.from = symbol.to_string();
                    }
                }
            }
            refresh(&w, &st.borrow());
        };
        if to_side {
            adapter.on_pick_to(pick);
        } else {
            adapter.on_pick_from(pick);
        }
    }
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_swap(move || {
        let Some(w) = weak.upgrade() else { return };
        {
            let mut s = st.borrow_mut();
            let form = &mut s.ui.units;
            std::mem::swap(&mut form.from, &mut form.to);
        }
        refresh(&w, &st.borrow());
    });
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_edited(move |field, text| {
        let Some(w) = weak.upgrade() else { return };
        {
            let mut s = st.borrow_mut();
            match field {
                super::UnitsField::Value => s.ui.units.value = text.to_string(),
                super::UnitsField::Atmosphere => s.ui.units.atm = text.to_string(),
            }
        }
        // The typed field keeps its text; only what is worked out is copied in.
        show(&w, &st.borrow());
    });
}

/// The quantity in the saved state (pressure if the name is not one offered).
fn quantity(state: &AppState) -> Quantity {
    QUANTITIES
        .into_iter()
        .find(|q| q.name() == state.ui.units.quantity)
        .unwrap_or(Quantity::Pressure)
}

/// Copy the pickers, the typed fields and the answer in.
pub fn refresh(window: &AppWindow, state: &AppState) {
    let a = window.global::<UnitsAdapter>();
    let q = quantity(state);
    let form = &state.ui.units;
    let list = vu::symbols(q);
    let index_of = |symbol: &str| {
        list.iter()
            .position(|s| *s == symbol)
            .and_then(|i| i32::try_from(i).ok())
            .unwrap_or(0)
    };
    a.set_quantities(model(
        vu::quantity_names().into_iter().map(Into::into).collect(),
    ));
    a.set_quantity_index(
        QUANTITIES
            .iter()
            .position(|x| *x == q)
            .and_then(|i| i32::try_from(i).ok())
            .unwrap_or(0),
    );
    a.set_units(model(list.iter().map(|s| (*s).into()).collect()));
    a.set_from_index(index_of(&form.from));
    a.set_to_index(index_of(&form.to));
    a.set_value_text(form.value.clone().into());
    a.set_atm_text(form.atm.clone().into());
    a.set_shows_atm(q == Quantity::Pressure);
    show(window, state);
}

/// Copy the answer (or the problem) in.
fn show(window: &AppWindow, state: &AppState) {
    let a = window.global::<UnitsAdapter>();
    let form = &state.ui.units;
    let atm = if quantity(state) == Quantity::Pressure {
        form.atm.as_str()
    } else {
        ""
    };
    match vu::view(UnitsInput {
        value: &form.value,
        from: &form.from,
        to: &form.to,
        atm,
        atm_name: "Atmosphere",
    }) {
        Ok(v) => {
            a.set_answer(v.answer.into());
            a.set_notes(model(v.notes.into_iter().map(Into::into).collect()));
            a.set_has_atm_line(!v.atm_line.is_empty());
            a.set_atm_line(v.atm_line.into());
            a.set_problem("".into());
            a.set_has_problem(false);
        }
        Err(e) => {
            a.set_answer("—".into());
            a.set_notes(model(Vec::new()));
            a.set_has_atm_line(false);
            a.set_atm_line("".into());
            a.set_problem(e.to_string().into());
            a.set_has_problem(true);
        }
    }
}
