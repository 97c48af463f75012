//! Level screen glue: the piping picked and the fields typed → [`crate::view::level`] →
//! `LevelAdapter`: the range rows, the tank sketch and the cautions for that piping. What is
//! typed is kept in the saved state as it changes.

use super::state::LevelForm;
use super::{model, AppState, AppWindow, LevelAdapter, LevelField, LevelRow, Shared};
use super::{LineFill, SketchLabel, SketchLine, SketchRect};
use crate::view::level::{self as vl, Frac, LevelInput, Piping};
use slint::ComponentHandle;

/// Wire the adapter's callbacks.
pub fn connect(window: &AppWindow, state: &Shared) {
    let adapter = window.global::<LevelAdapter>();
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_pick_piping(move |i| {
        let Some(w) = weak.upgrade() else { return };
        if let Some(p) = usize::try_from(i).ok().and_then(|i| Piping::ALL.get(i)) {
            st.borrow_mut().ui.level.piping = p.name().to_string();
        }
        refresh(&w, &st.borrow());
    });
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_toggle_reversed(move |on| {
        let Some(w) = weak.upgrade() else { return };
        st.borrow_mut().ui.level.reversed = on;
        w.global::<LevelAdapter>().set_reversed(on);
        show(&w, &st.borrow());
    });
    let weak = window.as_weak();
    let st = state.clone();
    adapter.on_edited(move |field, text| {
        let Some(w) = weak.upgrade() else { return };
        *field_of(&mut st.borrow_mut().ui.level, field) = text.to_string();
        // The typed field keeps its text; only what is worked out is copied in.
        show(&w, &st.borrow());
    });
}

/// The form's text for a field of the card.
fn field_of(form: &mut LevelForm, field: LevelField) -> &mut String {
    match field {
        LevelField::Sg => &mut form.sg,
        LevelField::MinM => &mut form.min_m,
        LevelField::MaxM => &mut form.max_m,
        LevelField::TxM => &mut form.tx_m,
        LevelField::LegM => &mut form.leg_m,
        LevelField::FillSg => &mut form.fill_sg,
        LevelField::HpSealM => &mut form.hp_seal_m,
        LevelField::LpSealM => &mut form.lp_seal_m,
        LevelField::UpperSg => &mut form.upper_sg,
        LevelField::HpTapM => &mut form.hp_tap_m,
        LevelField::LpTapM => &mut form.lp_tap_m,
        LevelField::Unit => &mut form.unit,
        LevelField::Dp => &mut form.dp,
    }
}

fn input(form: &LevelForm) -> LevelInput<'_> {
    LevelInput {
        piping: Piping::from_name(&form.piping),
        sg: &form.sg,
        min_m: &form.min_m,
        max_m: &form.max_m,
        tx_m: &form.tx_m,
        leg_m: &form.leg_m,
        fill_sg: &form.fill_sg,
        hp_seal_m: &form.hp_seal_m,
        lp_seal_m: &form.lp_seal_m,
        upper_sg: &form.upper_sg,
        hp_tap_m: &form.hp_tap_m,
        lp_tap_m: &form.lp_tap_m,
        reversed: form.reversed,
        unit: &form.unit,
        dp: &form.dp,
    }
}

/// Copy the picker, the typed fields and what is worked out in.
pub fn refresh(window: &AppWindow, state: &AppState) {
    let a = window.global::<LevelAdapter>();
    let form = &state.ui.level;
    let piping = Piping::from_name(&form.piping);
    a.set_pipings(model(
        Piping::ALL.iter().map(|p| p.label().into()).collect(),
    ));
    a.set_piping(
        Piping::ALL
            .iter()
            .position(|p| *p == piping)
            .and_then(|i| i32::try_from(i).ok())
            .unwrap_or(0),
    );
    let t = |text: &String| slint::SharedString::from(text.as_str());
    a.set_sg(t(&form.sg));
    a.set_min_m(t(&form.min_m));
    a.set_max_m(t(&form.max_m));
    a.set_tx_m(t(&form.tx_m));
    a.set_leg_m(t(&form.leg_m));
    a.set_fill_sg(t(&form.fill_sg));
    a.set_hp_seal_m(t(&form.hp_seal_m));
    a.set_lp_seal_m(t(&form.lp_seal_m));
    a.set_upper_sg(t(&form.upper_sg));
    a.set_hp_tap_m(t(&form.hp_tap_m));
    a.set_lp_tap_m(t(&form.lp_tap_m));
    a.set_unit(t(&form.unit));
    a.set_dp(t(&form.dp));
    a.set_reversed(form.reversed);
    let fields = piping.fields();
    let needs = |f: &str| fields.contains(&f);
    a.set_needs_leg(needs("leg-m"));
    a.set_needs_fill(needs("fill-sg"));
    a.set_needs_hp_seal(needs("hp-seal-m"));
    a.set_needs_lp_seal(needs("lp-seal-m"));
    a.set_needs_interface(needs("upper-sg"));
    a.set_tx_label(
        if piping.uses_datum() {
            "Transmitter elevation (same datum)"
        } else {
            "Transmitter above the HP tap (below: negative)"
        }
        .into(),
    );
    a.set_cautions(model(
        vl::cautions(piping).into_iter().map(Into::into).collect(),
    ));
    show(window, state);
}

fn rect(f: &Frac) -> SketchRect {
    SketchRect {
        x: f.x as f32,
        y: f.y as f32,
        w: f.w as f32,
        h: f.h as f32,
    }
}

/// Copy the rows, the problem and the sketch in.
fn show(window: &AppWindow, state: &AppState) {
    let a = window.global::<LevelAdapter>();
    let v = vl::view(&input(&state.ui.level));
    a.set_rows(model(
        v.result
            .iter()
            .flat_map(|r| r.rows.iter())
            .map(|(what, value)| LevelRow {
                what: what.clone().into(),
                value: value.clone().into(),
            })
            .collect(),
    ));
    a.set_has_problem(!v.problem.is_empty());
    a.set_problem(v.problem.into());
    // A sketch that cannot be drawn (a field not read yet) keeps the last one.
    if let Some(s) = v.sketch {
        a.set_tank(rect(&s.tank));
        a.set_closed(s.closed);
        a.set_liquid(rect(&s.liquid));
        a.set_marks(model(s.marks.iter().map(|m| *m as f32).collect()));
        a.set_has_upper(s.upper.is_some());
        if let Some(u) = &s.upper {
            a.set_upper(rect(u));
        }
        a.set_transmitter(rect(&s.transmitter));
        a.set_lines(model(
            s.lines
                .iter()
                .flat_map(|l| {
                    let fill = match l.fill {
                        vl::LineFill::Liquid => LineFill::Liquid,
                        vl::LineFill::Fill => LineFill::Fill,
                        vl::LineFill::Gas => LineFill::Gas,
                        vl::LineFill::Vent => LineFill::Vent,
                    };
                    l.points.windows(2).map(move |w| SketchLine {
                        x1: w[0].0 as f32,
                        y1: w[0].1 as f32,
                        x2: w[1].0 as f32,
                        y2: w[1].1 as f32,
                        fill,
                    })
                })
                .collect(),
        ));
        a.set_labels(model(
            s.labels
                .iter()
                .map(|l| SketchLabel {
                    x: l.x as f32,
                    y: l.y as f32,
                    text: l.text.clone().into(),
                })
                .collect(),
        ));
        a.set_sketch_description(s.description.into());
    }
}
