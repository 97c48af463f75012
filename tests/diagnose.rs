//! Guided fault-finding: procedure files, each computed finding with worked numbers, and
//! sessions that save and resume. Tags are from the invented Brindlemoor plant.

mod util;

use loopside::budget::{Cable, LoopConfig, SeriesElement};
use loopside::diagnose::evaluate::{self, Evaluation, Settings};
use loopside::diagnose::evaluate::{ExplanationFinding, Reader};
use loopside::diagnose::measure::Measurement;
use loopside::diagnose::mismatch::{
    explain_display, explain_transmitter, Explanation, Hypothesis, KeptEnd, Mismatch,
};
use loopside::diagnose::procedure::{self, Procedure, StepKind, BUILTIN_SOURCES};
use loopside::diagnose::session::{Answer, AnswerSheet, Progress, Session, LOG_KIND};
use loopside::diagnose::SYMPTOMS;
use loopside::scale::{RootLocation, Scale, SignalSpan, Transfer};
use loopside::signal::SignalStatus;
use loopside::tag::Tag;
use loopside::view::wording::finding;
use loopside::wire::Conductor;
use std::collections::BTreeMap;
use util::close;

/// LT-101: 0–4.5 m, 24 V supply, 10.5 V transmitter minimum, 250 Ω PLC input, 180 m of
/// 1.0 mm² pair (BRIEF demo plant).
fn lt101() -> Tag {
    let mut tag = Tag::new("LT-101", Scale::linear(0.0, 4.5, "m").unwrap()).unwrap();
    let mut config = LoopConfig::new(24.0, 10.5);
    config
        .elements
        .push(SeriesElement::ohms("PLC input", 250.0));
    config.cable = Some(Cable {
        one_way_m: 180.0,
        conductor: Conductor::Mm2(1.0),
        temp_c: 20.0,
    });
    tag.loop_config = Some(config);
    tag
}

fn bar16() -> Scale {
    Scale::linear(0.0, 16.0, "bar").unwrap()
}

fn flow(root_in: RootLocation) -> Scale {
    Scale::new(
        0.0,
        3000.0,
        "m³/h",
        Transfer::SquareRoot {
            cutoff_percent: 1.0,
            root_in,
        },
        SignalSpan::default(),
    )
    .unwrap()
}

fn kinds(m: &loopside::diagnose::mismatch::Mismatch) -> Vec<&'static str> {
    m.explanations.iter().map(|e| e.hypothesis.code()).collect()
}

/// An explanation of a receiver's reading in the words every front shows.
fn words(m: &Mismatch, e: &Explanation) -> String {
    finding::explanation(&ExplanationFinding {
        who: Reader::Receiver,
        explanation: e.clone(),
        reading: m.reading.clone(),
    })
}

// ---------------------------------------------------------------- procedure files

#[test]
fn every_builtin_procedure_file_is_valid() {
    let all = procedure::builtin().expect("built-in procedures validate");
    assert_eq!(all.len(), BUILTIN_SOURCES.len());
    for (symptom, title) in SYMPTOMS {
        let p = procedure::find(symptom, &[]).unwrap();
        assert_eq!(p.title, title, "{symptom}");
        // Every step is reachable and every path ends in a conclusion: walk every branch.
        let mut seen = std::collections::BTreeSet::new();
        let mut stack = vec![p.start.clone()];
        let mut conclusions = 0;
        while let Some(id) = stack.pop() {
            if !seen.insert(id.clone()) {
                continue;
            }
            let step = p.step(&id).unwrap();
            if let StepKind::Conclusion { .. } = step.kind {
                conclusions += 1;
            } else {
                assert!(!step.targets().is_empty(), "{symptom}/{id} leads nowhere");
            }
            stack.extend(step.targets().into_iter().map(str::to_string));
        }
        assert_eq!(seen.len(), p.steps.len(), "{symptom}: unreachable steps");
        assert!(
            conclusions >= 2,
            "{symptom}: a procedure narrows between causes"
        );
    }
}

fn minimal(steps: serde_json::Value) -> String {
    serde_json::json!({
        "format": 1, "id": "test", "symptom": "test", "title": "Test",
        "start": "a", "steps": steps,
    })
    .to_string()
}

#[test]
fn a_plant_can_load_its_own_procedure_without_new_code() {
    let text = minimal(serde_json::json!([
        {"id": "a", "instruction": "Measure the loop current at the transmitter.",
         "measure": ["tx_ma"], "evaluate": "band-at-transmitter",
         "next": {"no-loop-current": "flooded", "otherwise": "b"}},
        {"id": "b", "instruction": "Open junction box JB-3 at the wet well.",
         "question": "Is there water in the box?", "next": {"yes": "flooded", "no": "dry"}},
        {"id": "flooded", "conclusion": "Dry and reseal JB-3, then insulation-test the pair."},
        {"id": "dry", "conclusion": "Carry on with the built-in procedure."}
    ]));
    let p = Procedure::from_json(&text).unwrap();
    let tag = lt101();
    let mut s = Session::start(&p, &tag);
    let values = BTreeMap::from([(Measurement::TxMa, 12.0)]);
    assert_eq!(
        s.answer(&p, &tag, Answer::Values(values)).unwrap(),
        Progress::Next("b".to_string())
    );
    match s.answer(&p, &tag, Answer::YesNo(true)).unwrap() {
        Progress::Concluded(c) => assert_eq!(c.step, "flooded"),
        other => panic!("{other:?}"),
    }
    let found = procedure::find("test", &[p]).unwrap();
    assert_eq!(found.id, "test");
}

#[test]
fn procedure_mistakes_are_refused_with_the_step_named() {
    let bad = [
        // unknown measurement
        (
            serde_json::json!([{"id": "a", "instruction": "x", "measure": ["amps"], "next": {"otherwise": "z"}}, {"id": "z", "conclusion": "end"}]),
            "step a",
            "amps",
        ),
        // unknown evaluation
        (
            serde_json::json!([{"id": "a", "instruction": "x", "measure": ["tx_ma"], "evaluate": "guess", "next": {"otherwise": "z"}}, {"id": "z", "conclusion": "end"}]),
            "step a",
            "guess",
        ),
        // outcome without a branch
        (
            serde_json::json!([{"id": "a", "instruction": "x", "measure": ["shield_ac_v"], "evaluate": "shield-noise", "next": {"quiet": "z"}}, {"id": "z", "conclusion": "end"}]),
            "step a",
            "noisy",
        ),
        // branch on an outcome the evaluation never gives
        (
            serde_json::json!([{"id": "a", "instruction": "x", "measure": ["shield_ac_v"], "evaluate": "shield-noise", "next": {"quiet": "z", "noisy": "z", "loud": "z"}}, {"id": "z", "conclusion": "end"}]),
            "step a",
            "loud",
        ),
        // otherwise that can never be taken
        (
            serde_json::json!([{"id": "a", "instruction": "x", "measure": ["shield_ac_v"], "evaluate": "shield-noise", "next": {"quiet": "z", "noisy": "z", "otherwise": "z"}}, {"id": "z", "conclusion": "end"}]),
            "step a",
            "never",
        ),
        // target missing
        (
            serde_json::json!([{"id": "a", "instruction": "x", "question": "ok?", "next": {"yes": "z", "no": "nowhere"}}, {"id": "z", "conclusion": "end"}]),
            "step a",
            "nowhere",
        ),
        // unreachable step
        (
            serde_json::json!([{"id": "a", "instruction": "x", "question": "ok?", "next": {"yes": "z", "no": "z"}}, {"id": "z", "conclusion": "end"}, {"id": "lost", "conclusion": "never shown"}]),
            "steps",
            "lost",
        ),
        // a loop
        (
            serde_json::json!([{"id": "a", "instruction": "x", "question": "ok?", "next": {"yes": "b", "no": "z"}}, {"id": "b", "instruction": "y", "question": "again?", "next": {"yes": "a", "no": "z"}}, {"id": "z", "conclusion": "end"}]),
            "step b",
            "loop",
        ),
        // evaluation input not measured on every path
        (
            serde_json::json!([{"id": "a", "instruction": "x", "question": "ok?", "next": {"yes": "m", "no": "e"}}, {"id": "m", "instruction": "m", "measure": ["rx_ma"], "next": {"otherwise": "e"}}, {"id": "e", "instruction": "e", "measure": ["tx_ma"], "evaluate": "leakage", "next": {"otherwise": "z"}}, {"id": "z", "conclusion": "end"}]),
            "step e",
            "rx_ma",
        ),
        // a step that is neither kind
        (
            serde_json::json!([{"id": "a", "instruction": "x", "next": {"otherwise": "z"}}, {"id": "z", "conclusion": "end"}]),
            "step a",
            "exactly one",
        ),
        // duplicate ids
        (
            serde_json::json!([{"id": "a", "instruction": "x", "question": "ok?", "next": {"yes": "a2", "no": "a2"}}, {"id": "a2", "conclusion": "end"}, {"id": "a2", "conclusion": "again"}]),
            "step a2",
            "more than one",
        ),
    ];
    for (steps, field, word) in bad {
        let e = Procedure::from_json(&minimal(steps.clone())).unwrap_err();
        assert_eq!(e.field, field, "{steps}: {e}");
        assert!(e.reason.contains(word), "{steps}: {e}");
    }
    let e = Procedure::from_json("{ not json").unwrap_err();
    assert_eq!(e.field, "procedure");
    let e = procedure::find("smoke-coming-out", &[]).unwrap_err();
    assert_eq!(e.field, "symptom");
    assert!(e.reason.contains("stuck-low"), "{e}");
}

#[test]
fn every_evaluation_declares_inputs_and_outcomes() {
    for e in evaluate::ALL {
        assert_eq!(Evaluation::from_key(e.key()), Some(e));
        assert!(!e.inputs().is_empty(), "{}", e.key());
        assert!(e.outcomes().len() >= 2, "{}", e.key());
    }
}

// ---------------------------------------------------------------- NE 43 band

#[test]
fn currents_are_classified_by_ne43_band_with_what_it_implies() {
    let tag = lt101();
    // NAMUR NE 43: measurement 3.8–20.5 mA; failure ≤ 3.6 or ≥ 21.0 mA.
    let cases = [
        (0.0, SignalStatus::NoLoopCurrent),
        (3.55, SignalStatus::FailLow),
        (3.7, SignalStatus::SuspectLow),
        (3.9, SignalStatus::UnderRange),
        (12.0, SignalStatus::InRange),
        (20.3, SignalStatus::OverRange),
        (20.8, SignalStatus::SuspectHigh),
        (21.5, SignalStatus::FailHigh),
    ];
    for (ma, status) in cases {
        let f = evaluate::signal_band(&tag, ma, "transmitter").unwrap();
        assert_eq!(f.status, status, "{ma} mA");
        assert!(
            finding::band(&f).contains(status.as_str()),
            "{}",
            finding::band(&f)
        );
    }
    let f = evaluate::signal_band(&tag, 0.0, "transmitter").unwrap();
    assert!(
        finding::band(&f).contains("supply"),
        "{}",
        finding::band(&f)
    );
}

// ---------------------------------------------------------------- voltage

#[test]
fn terminal_volts_9_against_a_10_5_minimum_with_the_supply_measured() {
    // 24 V measured, 9 V at the transmitter at 20 mA: the loop holds (24 − 9)/0.020 =
    // 750 Ω against 250 + 6.21 Ω on the drawing (cable: 360 m × 1/58 Ω·mm²/m, IEC 60028).
    let f = evaluate::terminal_volts(&lt101(), 9.0, Some(20.0), Some(24.0)).unwrap();
    assert_eq!(f.outcome, "not-enough");
    close(f.headroom_v, -1.5, 1e-9, "short by 1.5 V");
    close(f.loop_ohms_measured.unwrap(), 750.0, 1e-9, "measured loop");
    let drawing = 250.0 + 360.0 / 58.0;
    close(f.loop_ohms_configured, drawing, 1e-9, "drawing");
    close(
        f.extra_ohms.unwrap(),
        750.0 - drawing,
        1e-9,
        "unexplained ohms",
    );
    // At the 22 mA fault current (budget default): 9 − 750 × 0.002 = 7.5 V; 3.0 V short.
    close(f.target_ma, 22.0, 1e-12, "target");
    close(f.terminal_at_target_v, 7.5, 1e-9, "projected");
    // Remove 3.0 V / 22 mA = 136.4 Ω, or raise the supply to 10.5 + 750 × 0.022 = 27.0 V.
    close(f.remove_ohms.unwrap(), 3.0 / 0.022, 1e-9, "remove");
    close(f.raise_supply_to_v.unwrap(), 27.0, 1e-9, "raise to");
    close(f.raise_supply_by_v.unwrap(), 3.0, 1e-9, "raise by");
    assert_eq!(f.largest_element.as_ref().unwrap().0, "PLC input");
    assert!(
        finding::terminal_volts(&f).contains("Not enough voltage"),
        "{}",
        finding::terminal_volts(&f)
    );
    assert!(
        finding::terminal_volts(&f).contains("136 Ω"),
        "{}",
        finding::terminal_volts(&f)
    );
    assert!(
        finding::terminal_volts(&f).contains("27.00 V"),
        "{}",
        finding::terminal_volts(&f)
    );
}

#[test]
fn terminal_volts_without_the_supply_use_the_drawing_resistance() {
    // 9 V at 20 mA, supply not measured: project with the drawing's 256.2 Ω.
    let f = evaluate::terminal_volts(&lt101(), 9.0, Some(20.0), None).unwrap();
    let r = 250.0 + 360.0 / 58.0;
    let at22 = 9.0 - r * 0.002;
    close(f.terminal_at_target_v, at22, 1e-9, "projected");
    close(
        f.remove_ohms.unwrap(),
        (10.5 - at22) / 0.022,
        1e-9,
        "remove",
    );
    close(f.raise_supply_by_v.unwrap(), 10.5 - at22, 1e-9, "raise by");
    assert!(f.raise_supply_to_v.is_none());
    assert!(f.loop_ohms_measured.is_none());
}

#[test]
fn enough_now_but_short_at_the_fault_current_clips_near_the_top() {
    // 11.0 V at 16 mA through a 1000 Ω loop: at 22 mA, 11.0 − 1000 × 0.006 = 5.0 V.
    let mut tag = lt101();
    if let Some(c) = tag.loop_config.as_mut() {
        c.elements = vec![SeriesElement::ohms("IS barrier", 1000.0)];
        c.cable = None;
    }
    let f = evaluate::terminal_volts(&tag, 11.0, Some(16.0), None).unwrap();
    assert_eq!(f.outcome, "short-at-top");
    close(f.terminal_at_target_v, 5.0, 1e-9, "at 22 mA");
    close(f.remove_ohms.unwrap(), 5.5 / 0.022, 1e-9, "remove 250 Ω");
    // 18 V at 20 mA: 18 − 1000 × 0.002 = 16 V at 22 mA, enough.
    let f = evaluate::terminal_volts(&tag, 18.0, Some(20.0), None).unwrap();
    assert_eq!(f.outcome, "enough");
    assert!(f.remove_ohms.is_none());
    let f = evaluate::terminal_volts(&tag, 0.3, Some(0.0), None).unwrap();
    assert_eq!(f.outcome, "none");
}

#[test]
fn terminal_volts_need_the_tags_loop() {
    let tag = Tag::new("PT-204", Scale::linear(0.0, 10.0, "bar").unwrap()).unwrap();
    let e = evaluate::terminal_volts(&tag, 9.0, Some(20.0), None).unwrap_err();
    assert_eq!(e.field, "loop");
    let e = evaluate::terminal_volts(&lt101(), -9.0, None, None).unwrap_err();
    assert_eq!(e.field, "terminal_v");
    assert!(e.reason.contains("reversed"), "{e}");
}

#[test]
fn supply_presence_and_level() {
    let tag = lt101();
    assert_eq!(evaluate::supply(&tag, 0.2).unwrap().outcome, "no-supply");
    assert_eq!(evaluate::supply(&tag, 24.1).unwrap().outcome, "ok");
    // The loop needs 10.5 + 256.2 × 0.022 = 16.14 V at the fault current.
    let f = evaluate::supply(&tag, 15.0).unwrap();
    assert_eq!(f.outcome, "low");
    close(
        f.needed_v.unwrap(),
        10.5 + (250.0 + 360.0 / 58.0) * 0.022,
        1e-9,
        "needed",
    );
}

// ---------------------------------------------------------------- leakage

// Every leakage case below assumes the loop the finding states: a loop-powered two-wire
// transmitter that sets its own current, the supply's negative earthed, the receiver in
// the return (negative) leg. The receiver's current is worked out by hand from that
// circuit with Kirchhoff's current law and Ohm's law, not by loopside.

#[test]
fn a_path_across_the_pair_makes_the_receiver_read_more() {
    let tag = lt101();
    // The transmitter regulates 12.00 mA with 22 V across its terminals. A 55 kΩ path
    // (wet junction box) across the pair near it is in parallel with it and takes
    // 22 V / 55 kΩ = 0.40 mA more from the supply; the receiver in series with both
    // carries 12.00 + 0.40 = 12.40 mA.
    // Back from the meters (Ohm's law): 22 V / (12.40 − 12.00) mA = 22 V / 0.40 mA
    // = 55 kΩ; 0.40 mA is 0.40 / 16 = 2.5 % of the 16 mA span.
    let f = evaluate::leakage(&tag, 12.0, 12.4, 0.05, Some(22.0)).unwrap();
    let text = finding::leakage(&f);
    assert_eq!(f.outcome, "across-pair");
    close(f.difference_ma, -0.4, 1e-9, "tx − rx");
    close(f.difference_pct, -2.5, 1e-9, "% of span");
    close(f.leak_path_kohm.unwrap(), 55.0, 1e-9, "path, kΩ");
    assert_eq!(f.terminal_v, Some(22.0));
    assert!(text.starts_with("The receiver reads more than the transmitter sends"));
    assert!(text.contains("path across the pair"), "{}", text);
    assert!(text.contains("roughly 55.0 kΩ"), "{}", text);
    assert!(
        text.contains("loop-powered two-wire transmitter") && text.contains("negative earthed"),
        "the assumed loop is stated: {}",
        text
    );
    assert!(
        text.contains("supply's positive output") && text.contains("lift the shield"),
        "how to tell the two apart: {}",
        text
    );

    // A second case: 18.0 V at the terminals, 12.00 mA sent, 12.20 mA received:
    // 18.0 V / 0.20 mA = 90 kΩ (Ohm's law).
    let f = evaluate::leakage(&tag, 12.0, 12.2, 0.05, Some(18.0)).unwrap();
    assert_eq!(f.outcome, "across-pair");
    close(f.leak_path_kohm.unwrap(), 90.0, 1e-9, "path, kΩ");

    // Without the terminal volts the path is not sized, and the finding says what to
    // measure.
    let f = evaluate::leakage(&tag, 12.0, 12.4, 0.05, None).unwrap();
    let text = finding::leakage(&f);
    assert_eq!(f.leak_path_kohm, None);
    assert!(text.contains("Measure the DC volts across the transmitter's terminals"));

    // The receiver current from the volts across its 250 Ω resistor: 3.10 V / 250 Ω
    // = 12.40 mA (Ohm's law), so the same path across the pair.
    let values = BTreeMap::from([
        (Measurement::TxMa, 12.0),
        (Measurement::ResistorV, 3.1),
        (Measurement::ResistorOhms, 250.0),
        (Measurement::TerminalV, 22.0),
    ]);
    let done = Evaluation::LeakageFromResistor
        .evaluate(&tag, &values, &Settings::default())
        .unwrap();
    assert_eq!(done.outcome, "across-pair");
    assert_eq!(done.findings[0].code, "leak-across-pair");
    close(
        done.findings[0].detail["leak_path_kohm"].as_f64().unwrap(),
        55.0,
        1e-6,
        "path from the resistor volts, kΩ",
    );
}

#[test]
fn current_leaving_the_loop_to_earth_makes_the_receiver_read_less() {
    let tag = lt101();
    // The transmitter regulates 12.00 mA. The return conductor touches earth through
    // 10 kΩ between it and the 250 Ω receiver; the supply's negative is earthed, so the
    // receiver and the fault share the current back to it in inverse ratio to their
    // resistance (cable neglected): I_rx = 12.00 × 10 000 / (10 000 + 250) = 11.707 mA, and
    // 12.00 − 11.707 = 0.293 mA goes through earth (current divider).
    let rx = 12.0 * 10_000.0 / (10_000.0 + 250.0);
    close(rx, 11.707_317, 1e-6, "worked receiver current");
    let f = evaluate::leakage(&tag, 12.0, rx, 0.05, Some(22.0)).unwrap();
    let text = finding::leakage(&f);
    assert_eq!(f.outcome, "to-earth");
    close(f.difference_ma, 12.0 - rx, 1e-9, "tx − rx");
    // 0.293 mA of the 16 mA span is 1.83 %.
    close(
        f.difference_pct,
        (12.0 - rx) / 16.0 * 100.0,
        1e-9,
        "% of span",
    );
    // The path's resistance needs the volts from that conductor to earth at the fault
    // (here 11.707 mA × 250 Ω = 2.93 V), which the leakage step does not measure: the
    // terminal volts do not size a path to earth, so nothing is worked out.
    assert_eq!(f.leak_path_kohm, None);
    assert!(text.starts_with("The receiver reads less than the transmitter sends"));
    assert!(text.contains("to earth"), "{}", text);
    assert!(
        text.contains("is not worked out") && text.contains("not measured here"),
        "{}",
        text
    );
    assert!(text.contains("negative earthed"), "{}", text);
    assert!(!text.contains("kΩ"), "{}", text);
    let done = Evaluation::Leakage
        .evaluate(
            &tag,
            &BTreeMap::from([(Measurement::TxMa, 12.0), (Measurement::RxMa, 11.7)]),
            &Settings::default(),
        )
        .unwrap();
    assert_eq!(done.outcome, "to-earth");
    assert_eq!(done.findings[0].code, "leak-to-earth");
}

#[test]
fn currents_within_the_meter_allowance_match() {
    let tag = lt101();
    // 12.00 and 12.03 mA differ by 0.03 mA, inside a 0.05 mA allowance for two handheld
    // readings (rule of thumb, from memory).
    let f = evaluate::leakage(&tag, 12.0, 12.03, 0.05, Some(22.0)).unwrap();
    assert_eq!(f.outcome, "match");
    assert_eq!(f.leak_path_kohm, None);
    assert_eq!(
        evaluate::leakage(&tag, 12.0, 11.97, 0.05, None)
            .unwrap()
            .outcome,
        "match"
    );
    // Just outside it, either way.
    assert_eq!(
        evaluate::leakage(&tag, 12.0, 12.06, 0.05, None)
            .unwrap()
            .outcome,
        "across-pair"
    );
    assert_eq!(
        evaluate::leakage(&tag, 12.0, 11.94, 0.05, None)
            .unwrap()
            .outcome,
        "to-earth"
    );
    // Bad terminal volts are named, not used.
    assert_eq!(
        evaluate::leakage(&tag, 12.0, 12.4, 0.05, Some(-3.0))
            .unwrap_err()
            .field,
        "terminal_v"
    );
}

#[test]
fn the_shield_advice_tells_a_floating_end_from_a_double_bond() {
    let tag = lt101();
    let run = |v: f64| {
        Evaluation::ShieldNoise
            .evaluate(
                &tag,
                &BTreeMap::from([(Measurement::ShieldAcV, v)]),
                &Settings::default(),
            )
            .unwrap()
    };
    // 6 V AC at the floating end, over the 1 V default limit (rule of thumb).
    let noisy = run(6.0);
    assert_eq!(noisy.outcome, "noisy");
    let text = &finding::text(&noisy.findings[0]);
    assert!(text.contains("close to 0 V at either end"), "{text}");
    assert!(text.contains("not a double bond"), "{text}");
    assert!(text.contains("difference in earth potential"), "{text}");
    assert!(
        !text.contains("grounded at both ends (a ground loop)"),
        "the old advice is gone: {text}"
    );
    // 0.2 V: quiet, and a shield bonded at both ends would read as little.
    let quiet = run(0.2);
    assert_eq!(quiet.outcome, "quiet");
    let text = &finding::text(&quiet.findings[0]);
    assert!(text.contains("does not rule out a ground loop"), "{text}");
    assert!(
        text.contains("clamp an AC current meter on the shield") && text.contains("lift one end"),
        "{text}"
    );
}

// ---------------------------------------------------------------- readings that disagree

#[test]
fn receiver_ranged_0_10_bar_on_a_0_16_bar_transmitter() {
    // 12 mA is 8 bar on 0–16; a receiver ranged 0–10 bar shows 5 bar. Solve: with the
    // LRV kept, URV = 0 + (5 − 0)/0.5 = 10 bar.
    let m = explain_display(&bar16(), 12.0, 5.0, 0.5, &[]).unwrap();
    assert!(!m.reading.agrees);
    close(m.reading.expected, 8.0, 1e-12, "expected");
    let e = m
        .explanations
        .iter()
        .find(|e| {
            matches!(
                e.hypothesis,
                Hypothesis::DifferentRange {
                    kept: KeptEnd::Lrv,
                    ..
                }
            )
        })
        .expect("range solved");
    match &e.hypothesis {
        Hypothesis::DifferentRange {
            lrv, urv, round, ..
        } => {
            close(*lrv, 0.0, 1e-12, "lrv");
            close(*urv, 10.0, 1e-9, "urv");
            assert!(round);
        }
        _ => unreachable!(),
    }
    assert!(m.explained());
    let text = words(&m, e);
    assert!(text.contains("10.000 bar"), "{text}");
    // The same receiver at 8 mA (4 bar expected) shows 2.5 bar: again 0–10.
    let m = explain_display(&bar16(), 8.0, 2.5, 0.5, &[]).unwrap();
    assert!(m.explanations.iter().any(|e| matches!(
        e.hypothesis,
        Hypothesis::DifferentRange { urv, .. } if (urv - 10.0).abs() < 1e-9
    )));
}

#[test]
fn kpa_shown_as_inh2o() {
    // 0–25 kPa at 12 mA is 12.5 kPa = 12 500 / 249.082 = 50.18 inH2O (NIST SP 811:
    // 1 inH2O at 39.2 °F = 249.082 Pa).
    let scale = Scale::linear(0.0, 25.0, "kPa").unwrap();
    let shown = 12_500.0 / 249.082;
    let m = explain_display(&scale, 12.0, shown, 0.5, &[]).unwrap();
    let first = &m.explanations[0];
    match &first.hypothesis {
        Hypothesis::UnitsMixedUp {
            expected_unit,
            shown_unit,
            factor,
        } => {
            assert_eq!(expected_unit, "kPa");
            assert!(shown_unit.starts_with("inH2O"), "{shown_unit}");
            if shown_unit == "inH2O" {
                close(*factor, 1000.0 / 249.082, 1e-9, "kPa → inH2O");
            }
        }
        other => panic!("units first, got {other:?}"),
    }
    assert!(m.explanations.iter().any(|e| matches!(
        &e.hypothesis,
        Hypothesis::UnitsMixedUp { shown_unit, .. } if shown_unit == "inH2O"
    )));
    // The other way round: a 0–100 inH2O tag showing kPa. 50 inH2O = 12.4541 kPa.
    let scale = Scale::linear(0.0, 100.0, "inH2O").unwrap();
    let m = explain_display(&scale, 12.0, 50.0 * 0.249082, 0.5, &[]).unwrap();
    assert!(m.explanations.iter().any(|e| matches!(
        &e.hypothesis,
        Hypothesis::UnitsMixedUp { shown_unit, .. } if shown_unit == "kPa"
    )));
}

#[test]
fn square_root_taken_twice_or_not_at_all_at_the_receiver() {
    // Root in the transmitter: 8 mA is 25 % of flow = 750 m³/h. A receiver that roots
    // again shows √0.25 = 50 % = 1500 m³/h (ISO 5167 relation).
    let m = explain_display(&flow(RootLocation::Transmitter), 8.0, 1500.0, 0.5, &[]).unwrap();
    close(m.reading.expected, 750.0, 1e-9, "expected");
    assert_eq!(kinds(&m)[0], "extra-square-root");
    assert!(words(&m, &m.explanations[0]).contains("twice"));
    // FT-310, root in the receiver: 8 mA is 25 % ΔP → 1500 m³/h. A receiver that does not
    // root shows 750 m³/h.
    let m = explain_display(&flow(RootLocation::Receiver), 8.0, 750.0, 0.5, &[]).unwrap();
    assert_eq!(kinds(&m)[0], "missing-square-root");
    // … and one that roots twice shows 0.25^¼ = 70.71 % = 2121.3 m³/h.
    let m = explain_display(
        &flow(RootLocation::Receiver),
        8.0,
        3000.0 * 0.25f64.powf(0.25),
        0.5,
        &[],
    )
    .unwrap();
    assert!(matches!(
        m.explanations[0].hypothesis,
        Hypothesis::ExtraSquareRoot { roots: 1 }
    ));
}

#[test]
fn square_root_taken_twice_seen_at_the_transmitter() {
    // FT-310 roots in the receiver, so 1500 m³/h (25 % ΔP) should give 8 mA. A transmitter
    // also set to square root sends 12 mA.
    let m = explain_transmitter(&flow(RootLocation::Receiver), 1500.0, 12.0, 0.5).unwrap();
    close(m.reading.expected, 8.0, 1e-9, "expected mA");
    assert_eq!(kinds(&m)[0], "extra-square-root");
    // Root in the transmitter but it sends linear ΔP: 1500 m³/h → 8 mA instead of 12.
    let m = explain_transmitter(&flow(RootLocation::Transmitter), 1500.0, 8.0, 0.5).unwrap();
    assert_eq!(kinds(&m)[0], "missing-square-root");
}

#[test]
fn reversed_action_and_a_different_input_resistor() {
    let scale = Scale::linear(0.0, 10.0, "bar").unwrap();
    // 8 mA is 2.5 bar; reversed shows 7.5 bar.
    let m = explain_display(&scale, 8.0, 7.5, 0.5, &[]).unwrap();
    assert_eq!(kinds(&m)[0], "reversed");
    // PT-204 with its 250 Ω resistor, on a card scaled for 500 Ω: at 12 mA it sees 6 mA →
    // 1.25 bar instead of 5 bar.
    let m = explain_display(&scale, 12.0, 1.25, 0.5, &[250.0]).unwrap();
    match &m.explanations[0].hypothesis {
        Hypothesis::InputResistor {
            actual_ohms,
            assumed_ohms,
        } => {
            close(*actual_ohms, 250.0, 1e-12, "fitted");
            close(*assumed_ohms, 500.0, 1e-12, "assumed");
        }
        other => panic!("resistor first, got {other:?}"),
    }
    // Transmitter side: ranged 0–16 bar where the tag says 0–10: at 5 bar it sends
    // 4 + 16 × 5/16 = 9 mA; solved URV = 5 / (5/16) = 16 bar.
    let m = explain_transmitter(&scale, 5.0, 9.0, 0.5).unwrap();
    assert!(m.explanations.iter().any(|e| matches!(
        e.hypothesis,
        Hypothesis::DifferentRange { urv, round: true, .. } if (urv - 16.0).abs() < 1e-9
    )));
}

#[test]
fn a_reading_that_agrees_needs_no_explanation() {
    let m = explain_display(&bar16(), 12.0, 8.02, 0.5, &[]).unwrap();
    assert!(m.reading.agrees);
    assert!(m.explanations.is_empty());
    let m = explain_transmitter(&bar16(), 8.0, 12.01, 0.5).unwrap();
    assert!(m.reading.agrees);
    let e = explain_display(&bar16(), f64::NAN, 8.0, 0.5, &[]).unwrap_err();
    assert_eq!(e.field, "tx_ma");
}

// ---------------------------------------------------------------- HART

#[test]
fn loop_resistance_outside_the_hart_window() {
    let tag = lt101();
    // HART physical layer (HCF_SPEC-54): at least 230 Ω. 180 Ω → add 50 Ω.
    let f = evaluate::hart_window(&tag, 180.0).unwrap();
    assert_eq!(f.outcome, "too-low");
    close(f.add_ohms.unwrap(), 50.0, 1e-9, "add");
    // LT-101's budget at its 22 mA fault current (the tighter one): (24 − 10.5) / 0.022
    // = 613.6 Ω the loop may hold (common-practice formula at the fault current), less
    // 256.2 Ω = 357.4 Ω spare, so 250 Ω more still fits even at 22 mA. (The 20 mA spare,
    // 418.8 Ω, is not the one to add against.)
    close(
        f.budget_spare_ohms.unwrap(),
        13.5 / 0.022 - 250.0 - 360.0 / 58.0,
        1e-9,
        "spare",
    );
    assert!(
        finding::hart(&f).contains("357 Ω spare at 22.000 mA"),
        "{}",
        finding::hart(&f)
    );
    assert!(
        finding::hart(&f).contains("still leaves"),
        "{}",
        finding::hart(&f)
    );
    assert_eq!(
        evaluate::hart_window(&tag, 256.0).unwrap().outcome,
        "in-window"
    );
    // 1100 Ω upper limit: from memory, unconfirmed (budget.rs keeps it configurable).
    assert_eq!(
        evaluate::hart_window(&tag, 1500.0).unwrap().outcome,
        "too-high"
    );
    assert_eq!(evaluate::hart_window(&tag, 2.0e6).unwrap().outcome, "open");
}

// ---------------------------------------------------------------- sessions

fn answer(s: &mut Session, p: &Procedure, tag: &Tag, values: &[(Measurement, f64)]) -> Progress {
    s.answer(p, tag, Answer::Values(values.iter().copied().collect()))
        .unwrap()
}

#[test]
fn stuck_low_session_finds_an_open_loop() {
    let tag = lt101();
    let p = procedure::find("stuck-low", &[]).unwrap();
    let mut s = Session::start(&p, &tag);
    assert_eq!(s.cautions.len(), 5);
    assert!(s.cautions[0].contains("tell operations"));
    assert!(s.cautions[1].contains("IEC 60079-14"));
    assert!(
        s.cautions[3].contains("trapped pressure and process fluid"),
        "the process side is cautioned too: {}",
        s.cautions[3]
    );
    assert_eq!(
        answer(&mut s, &p, &tag, &[(Measurement::TxMa, 0.0)]),
        Progress::Next("supply".to_string())
    );
    answer(&mut s, &p, &tag, &[(Measurement::SupplyV, 24.0)]);
    match answer(&mut s, &p, &tag, &[(Measurement::TerminalV, 0.2)]) {
        Progress::Concluded(c) => assert_eq!(c.step, "open-wiring"),
        other => panic!("{other:?}"),
    }
    assert!(s.is_finished());
    let codes: Vec<&str> = s.findings().iter().map(|f| f.code.as_str()).collect();
    assert_eq!(
        codes,
        vec![
            "band-no-loop-current",
            "supply-ok",
            "no-voltage-at-transmitter"
        ]
    );
    assert_eq!(s.steps.len(), 3);
    assert_eq!(s.measurements[&Measurement::SupplyV].unit, "V");
    assert_eq!(LOG_KIND, "fault-finding");
    // The payload names the measurements by key, with units.
    let json: serde_json::Value = serde_json::from_str(&s.to_json().unwrap()).unwrap();
    assert_eq!(json["measurements"]["terminal_v"]["value"], 0.2);
    assert_eq!(json["conclusion"]["step"], "open-wiring");
    assert_eq!(json["findings"][0]["step"], "tx-current");
}

#[test]
fn a_session_resumes_where_it_was_left() {
    let tag = lt101();
    let p = procedure::find("steady-wrong", &[]).unwrap();
    let mut first = Session::start(&p, &tag);
    answer(&mut first, &p, &tag, &[(Measurement::TxMa, 12.0)]);
    let saved = first.to_json().unwrap();
    let mut resumed = Session::resume(&saved, &p).unwrap();
    assert_eq!(resumed.current, first.current);
    assert_eq!(resumed.steps, first.steps);
    assert_eq!(resumed.findings.len(), first.findings.len());
    assert_eq!(resumed.pending(&p), vec![Measurement::Displayed]);
    // 12 mA is 2.25 m; a display ranged 0–5 m shows 2.5 m.
    match answer(&mut resumed, &p, &tag, &[(Measurement::Displayed, 2.5)]) {
        Progress::Concluded(c) => assert_eq!(c.step, "receiver-config"),
        other => panic!("{other:?}"),
    }
    assert!(resumed
        .findings()
        .iter()
        .any(|f| f.code == "different-range" && finding::text(f).contains("5.0000 m")));
    resumed.conclude("Receiver range corrected to 0–4.5 m; checked at three points.");
    let back: Session = serde_json::from_str(&resumed.to_json().unwrap()).unwrap();
    assert_eq!(back.technician_conclusion, resumed.technician_conclusion);
    // A session cannot be resumed on another procedure.
    let other = procedure::find("noisy", &[]).unwrap();
    assert_eq!(
        Session::resume(&saved, &other).unwrap_err().field,
        "session"
    );
    assert_eq!(
        Session::resume("{}", &p).unwrap_err().field,
        "session",
        "damaged session"
    );
}

#[test]
fn values_can_come_one_at_a_time_and_bad_ones_are_refused() {
    let tag = lt101();
    let p = procedure::find("short-of-top", &[]).unwrap();
    let mut s = Session::start(&p, &tag);
    answer(&mut s, &p, &tag, &[(Measurement::TxMa, 19.0)]);
    assert_eq!(
        s.pending(&p),
        vec![Measurement::SupplyV, Measurement::TerminalV]
    );
    let e = s
        .answer(
            &p,
            &tag,
            Answer::Values(BTreeMap::from([(Measurement::RxMa, 12.0)])),
        )
        .unwrap_err();
    assert_eq!(e.field, "rx_ma");
    let e = s
        .answer(
            &p,
            &tag,
            Answer::Values(BTreeMap::from([(Measurement::SupplyV, 2000.0)])),
        )
        .unwrap_err();
    assert_eq!(e.field, "supply_v");
    assert!(e.reason.contains("between 0 and 1000"), "{e}");
    assert_eq!(
        s.answer(&p, &tag, Answer::YesNo(true)).unwrap_err().field,
        "answer"
    );
    answer(&mut s, &p, &tag, &[(Measurement::SupplyV, 24.0)]);
    assert_eq!(s.pending(&p), vec![Measurement::TerminalV]);
    // 24 V supply, 10 V at 19 mA: 14 V / 19 mA = 736.8 Ω; short.
    match answer(&mut s, &p, &tag, &[(Measurement::TerminalV, 10.0)]) {
        Progress::Concluded(c) => assert_eq!(c.step, "starved"),
        other => panic!("{other:?}"),
    }
    let f = s
        .findings()
        .iter()
        .find(|f| f.code == "not-enough-voltage")
        .unwrap();
    let measured = f.detail["loop_ohms_measured"].as_f64().unwrap();
    close(measured, 14.0 / 0.019, 1e-9, "loop ohms");
}

#[test]
fn an_answer_sheet_runs_a_procedure_to_its_end() {
    let tag = lt101();
    let p = procedure::find("hart-no-answer", &[]).unwrap();
    let sheet = AnswerSheet::from_json(
        r#"{"tx_ma": "12,0 mA", "supply_v": 24, "terminal_v": "20.5 V", "loop_ohms": 180,
            "conclusion": "Added 250 ohm; handheld connects."}"#,
        &tag,
    )
    .unwrap();
    let mut s = Session::start(&p, &tag);
    match s.run_sheet(&p, &tag, &sheet).unwrap() {
        Progress::Concluded(c) => assert_eq!(c.step, "add-resistor"),
        other => panic!("{other:?}"),
    }
    assert!(s.findings().iter().any(|f| f.code == "hart-too-low"));
    assert_eq!(s.technician_conclusion, "Added 250 ohm; handheld connects.");
    // A sheet that stops short leaves the session waiting at the step.
    let short = AnswerSheet::from_json(r#"{"tx_ma": 12}"#, &tag).unwrap();
    let mut s = Session::start(&p, &tag);
    assert_eq!(
        s.run_sheet(&p, &tag, &short).unwrap(),
        Progress::Next("volts".to_string())
    );
    let e = AnswerSheet::from_json(r#"{"tx_ma": "lots"}"#, &tag).unwrap_err();
    assert_eq!(e.field, "tx_ma");
    let e = AnswerSheet::from_json("[1, 2]", &tag).unwrap_err();
    assert_eq!(e.field, "answers");
}

#[test]
fn indicator_and_control_system_disagree() {
    // PT-204 0–10 bar at 12 mA (5 bar). The indicator shows 5.0 bar; the control system
    // shows 8 bar: at 50 % of span that is a 0–16 bar range (8 / 0.5).
    let tag = Tag::new("PT-204", Scale::linear(0.0, 10.0, "bar").unwrap()).unwrap();
    let values = BTreeMap::from([
        (Measurement::TxMa, 12.0),
        (Measurement::Displayed, 5.0),
        (Measurement::ControlValue, 8.0),
    ]);
    let done = Evaluation::IndicatorVsControl
        .evaluate(&tag, &values, &Settings::default())
        .unwrap();
    assert_eq!(done.outcome, "control-wrong");
    assert!(done
        .findings
        .iter()
        .any(|f| f.code == "different-range" && finding::text(f).contains("16.000 bar")));
}

// ---------------------------------------------------------------- leakage in the procedures

#[test]
fn control_system_reads_high_through_a_wet_junction_box() {
    // PT-204, raw pump 2 discharge, 0–10 bar. The transmitter sends 12.00 mA (5 bar) and
    // the local indicator agrees; the control system shows 5.25 bar. At the marshalling
    // the receiver gets 12.40 mA; 22 V across the transmitter's terminals.
    // Worked by hand: 12.40 mA is (12.40 − 4) / 16 × 10 = 5.25 bar, so the control system
    // reads its current right; the extra 0.40 mA comes through a path across the pair of
    // 22 V / 0.40 mA = 55 kΩ (Ohm's law).
    let tag = Tag::new("PT-204", Scale::linear(0.0, 10.0, "bar").unwrap()).unwrap();
    let p = procedure::find("disagree", &[]).unwrap();
    let mut s = Session::start(&p, &tag);
    answer(&mut s, &p, &tag, &[(Measurement::TxMa, 12.0)]);
    assert_eq!(
        answer(
            &mut s,
            &p,
            &tag,
            &[
                (Measurement::Displayed, 5.0),
                (Measurement::ControlValue, 5.25)
            ]
        ),
        Progress::Next("control-current".to_string())
    );
    assert_eq!(
        answer(&mut s, &p, &tag, &[(Measurement::RxMa, 12.4)]),
        Progress::Next("across-pair-volts".to_string())
    );
    // The step that sizes the path reminds to move the red lead first.
    let step = p.step("across-pair-volts").unwrap();
    assert!(step.cautions.iter().any(|c| c.contains(METER_LEAD)));
    match answer(&mut s, &p, &tag, &[(Measurement::TerminalV, 22.0)]) {
        Progress::Concluded(c) => {
            assert_eq!(c.step, "across-pair");
            assert!(c.text.contains("receiver reads more"), "{}", c.text);
            assert!(c
                .cautions
                .iter()
                .any(|c| c.contains("insulation-resistance test")));
        }
        other => panic!("{other:?}"),
    }
    let outcomes: Vec<&str> = s.steps.iter().map(|r| r.outcome.as_str()).collect();
    assert_eq!(
        outcomes,
        vec!["in-range", "control-wrong", "across-pair", "across-pair"]
    );
    let sized = s
        .findings()
        .iter()
        .rfind(|f| f.code == "leak-across-pair")
        .unwrap();
    assert_eq!(sized.step, "across-pair-volts");
    close(
        sized.detail["leak_path_kohm"].as_f64().unwrap(),
        55.0,
        1e-9,
        "path, kΩ",
    );
    assert!(
        finding::text(sized).contains("roughly 55.0 kΩ"),
        "{}",
        finding::text(sized)
    );
    // The saved record keeps the cautions each step showed.
    let json: serde_json::Value = serde_json::from_str(&s.to_json().unwrap()).unwrap();
    assert!(json["steps"][3]["cautions"][0]
        .as_str()
        .unwrap()
        .contains(METER_LEAD));
    assert!(json["conclusion"]["cautions"].as_array().unwrap().len() >= 2);
}

#[test]
fn control_system_reads_low_through_an_earth_fault() {
    // PT-204 again: 12.00 mA sent, the control system shows 4.8125 bar, which is
    // 4 + 4.8125 / 10 × 16 = 11.70 mA; 11.70 mA at the marshalling. 0.30 mA leaves the
    // loop between them: a path to earth, which the procedure does not size.
    let tag = Tag::new("PT-204", Scale::linear(0.0, 10.0, "bar").unwrap()).unwrap();
    let p = procedure::find("disagree", &[]).unwrap();
    let mut s = Session::start(&p, &tag);
    answer(&mut s, &p, &tag, &[(Measurement::TxMa, 12.0)]);
    answer(
        &mut s,
        &p,
        &tag,
        &[
            (Measurement::Displayed, 5.0),
            (Measurement::ControlValue, 4.8125),
        ],
    );
    match answer(&mut s, &p, &tag, &[(Measurement::RxMa, 11.7)]) {
        Progress::Concluded(c) => {
            assert_eq!(c.step, "to-earth");
            assert!(c.text.contains("receiver reads less"), "{}", c.text);
            assert!(c.text.contains("supply's positive output"), "{}", c.text);
            assert!(c.text.contains("each conductor to earth"), "{}", c.text);
            assert!(c.text.contains("shield"), "{}", c.text);
        }
        other => panic!("{other:?}"),
    }
    let f = s.findings().last().unwrap();
    assert_eq!(f.code, "leak-to-earth");
    assert!(f.detail["leak_path_kohm"].is_null());
}

#[test]
fn every_leakage_step_branches_on_where_the_path_is() {
    for p in procedure::builtin().unwrap() {
        for step in &p.steps {
            if let StepKind::Measure {
                evaluate: Some(Evaluation::Leakage | Evaluation::LeakageFromResistor),
                next,
                ..
            } = &step.kind
            {
                let to = |o: &str| next.get(o).or_else(|| next.get("otherwise")).unwrap();
                if step.id == "across-pair-volts" {
                    assert_eq!(to("across-pair"), "across-pair", "{}", p.id);
                    continue;
                }
                assert_eq!(
                    to("across-pair"),
                    "across-pair-volts",
                    "{}/{}",
                    p.id,
                    step.id
                );
                assert_eq!(to("to-earth"), "to-earth", "{}/{}", p.id, step.id);
                let across = p.step("across-pair").unwrap();
                let earth = p.step("to-earth").unwrap();
                match (&across.kind, &earth.kind) {
                    (StepKind::Conclusion { text: a }, StepKind::Conclusion { text: e }) => {
                        assert!(a.contains("reads more"), "{}: {a}", p.id);
                        assert!(e.contains("reads less"), "{}: {e}", p.id);
                    }
                    other => panic!("{}: {other:?}", p.id),
                }
            }
        }
    }
}

/// A session saved by an earlier loopside, before the leakage outcomes said where the path
/// is: steady-wrong on LT-101, 12.00 mA sent and 11.80 mA received, outcome `leak`,
/// finding `leakage` with the path worked out as 18 V / 0.20 mA = 90 kΩ.
const OLD_LEAK_SESSION: &str = r#"{
  "procedure": "steady-wrong", "symptom": "steady-wrong", "title": "Reading steady but wrong",
  "tag": "LT-101", "cautions": ["Breaking or forcing this loop moves whatever it controls or trips: tell operations first."],
  "settings": {"meter_tolerance_ma": 0.05, "shield_ac_limit_v": 1.0},
  "current": null,
  "steps": [
    {"step": "tx-current", "instruction": "At the transmitter, measure the loop current.", "measured": {"tx_ma": {"value": 12.0, "unit": "mA"}}, "answer": null, "outcome": "in-range"},
    {"step": "display", "instruction": "Read the value the receiver shows.", "measured": {"displayed": {"value": 2.0, "unit": "m"}}, "answer": null, "outcome": "unexplained"},
    {"step": "rx-current", "instruction": "At the receiver end of the cable, measure the loop current the same way.", "measured": {"rx_ma": {"value": 11.8, "unit": "mA"}}, "answer": null, "outcome": "leak"}
  ],
  "measurements": {"tx_ma": {"value": 12.0, "unit": "mA"}, "rx_ma": {"value": 11.8, "unit": "mA"}, "displayed": {"value": 2.0, "unit": "m"}},
  "findings": [
    {"step": "rx-current", "code": "leakage", "text": "Leakage: the transmitter sends 12.000 mA but 11.800 mA reaches the receiver. At the transmitter's 18.00 V that is a path of roughly 90.0 kΩ.",
     "detail": {"tx_ma": 12.0, "rx_ma": 11.8, "difference_ma": 0.2, "difference_pct": 1.25, "meter_tolerance_ma": 0.05, "leak_path_kohm": 90.0, "outcome": "leak", "text": "Leakage: …"}}
  ],
  "conclusion": {"step": "leak", "text": "Current is lost between the transmitter and the receiver."},
  "technician_conclusion": "Water in JB-02; dried and resealed."
}"#;

#[test]
fn an_old_session_is_read_by_the_direction_it_measured() {
    let p = procedure::find("steady-wrong", &[]).unwrap();
    let s = Session::resume(OLD_LEAK_SESSION, &p).unwrap();
    // The receiver read less than the transmitter: today that is `to-earth`.
    assert_eq!(s.steps[2].outcome, "to-earth");
    assert_eq!(
        s.steps[0].outcome, "in-range",
        "other outcomes as they were"
    );
    let f = &s.findings[0];
    assert_eq!(f.code, "leak-to-earth");
    assert_eq!(f.detail["outcome"], "to-earth");
    // What was measured is kept as it was …
    assert_eq!(s.measurements[&Measurement::TxMa].value, 12.0);
    assert_eq!(s.measurements[&Measurement::RxMa].value, 11.8);
    assert_eq!(f.detail["tx_ma"], 12.0);
    assert_eq!(f.detail["rx_ma"], 11.8);
    // … and so is what the technician was shown, with a marked note after it.
    let text = finding::text(f);
    assert!(text.starts_with("Leakage: the transmitter sends 12.000 mA"));
    assert!(
        text.contains("[Note added when this record was read"),
        "{text}"
    );
    assert!(text.contains("receiver read less"), "{text}");
    // The 90 kΩ was worked out as if the path were across the pair: it is not kept as
    // a path resistance, only quoted in the note.
    assert!(f.detail["leak_path_kohm"].is_null());
    assert!(text.contains("The 90.0 kΩ worked out then"), "{text}");
    assert_eq!(
        s.technician_conclusion,
        "Water in JB-02; dried and resealed."
    );
    // Saved again, it stays mapped and the note is not added twice.
    let again = Session::resume(&s.to_json().unwrap(), &p).unwrap();
    assert_eq!(again, s);

    // An old `extra-current` record (receiver 12.30 mA, more than the 12.00 mA sent) is
    // read as a path across the pair; its numbers stay, and no path is invented.
    let old = OLD_LEAK_SESSION
        .replace("\"value\": 11.8", "\"value\": 12.3")
        .replace("\"rx_ma\": 11.8", "\"rx_ma\": 12.3")
        .replace("\"difference_ma\": 0.2", "\"difference_ma\": -0.3")
        .replace("\"leak_path_kohm\": 90.0", "\"leak_path_kohm\": null")
        .replace("\"outcome\": \"leak\"", "\"outcome\": \"extra-current\"")
        .replace("\"code\": \"leakage\"", "\"code\": \"extra-current\"");
    let s = Session::resume(&old, &p).unwrap();
    assert_eq!(s.steps[2].outcome, "across-pair");
    let f = &s.findings[0];
    assert_eq!(f.code, "leak-across-pair");
    assert_eq!(f.detail["outcome"], "across-pair");
    assert_eq!(f.detail["rx_ma"], 12.3);
    assert!(f.detail["leak_path_kohm"].is_null());
    let text = finding::text(f);
    assert!(text.contains("receiver read more"), "{text}");
}

// ---------------------------------------------------------------- safe wording

/// The words of the reminder after a current measurement.
const METER_LEAD: &str = "red lead back to the V socket";

fn takes_current(m: &Measurement) -> bool {
    matches!(
        m,
        Measurement::TxMa | Measurement::RxMa | Measurement::SwingMa
    )
}

fn takes_volts_or_ohms(m: &Measurement) -> bool {
    matches!(
        m,
        Measurement::SupplyV
            | Measurement::TerminalV
            | Measurement::ResistorV
            | Measurement::ShieldAcV
            | Measurement::LoopOhms
    )
}

/// Steps that measure volts or ohms after a current was measured on some path to them,
/// and that do not remind to move the red lead.
fn missing_meter_lead_reminders(p: &Procedure) -> Vec<String> {
    let mut missing = Vec::new();
    // Every path from the start: (step, a current was measured before it).
    let mut stack = vec![(p.start.clone(), false)];
    let mut seen = std::collections::BTreeSet::new();
    while let Some((id, after_current)) = stack.pop() {
        if !seen.insert((id.clone(), after_current)) {
            continue;
        }
        let step = p.step(&id).unwrap();
        let ms = step.measurements();
        if after_current
            && ms.iter().any(takes_volts_or_ohms)
            && !step.cautions.iter().any(|c| c.contains(METER_LEAD))
        {
            missing.push(format!("{}/{}", p.id, id));
        }
        let now = after_current || ms.iter().any(takes_current);
        stack.extend(step.targets().into_iter().map(|t| (t.to_string(), now)));
    }
    missing.sort();
    missing.dedup();
    missing
}

#[test]
fn every_voltage_step_after_a_current_step_reminds_to_move_the_red_lead() {
    // A meter left on its mA socket is a near short: put across terminals to read volts,
    // it shorts the loop (common practice).
    let mut checked = 0;
    for p in procedure::builtin().unwrap() {
        assert_eq!(missing_meter_lead_reminders(&p), Vec::<String>::new());
        checked += p
            .steps
            .iter()
            .filter(|s| s.cautions.iter().any(|c| c.contains(METER_LEAD)))
            .count();
    }
    assert!(checked >= 10, "only {checked} reminders");
    // The check itself finds a step without it.
    let text = minimal(serde_json::json!([
        {"id": "a", "instruction": "Measure the current.", "measure": ["tx_ma"], "next": {"otherwise": "b"}},
        {"id": "b", "instruction": "Measure the terminal volts.", "measure": ["terminal_v"], "next": {"otherwise": "z"}},
        {"id": "z", "conclusion": "end"}
    ]));
    assert_eq!(
        missing_meter_lead_reminders(&Procedure::from_json(&text).unwrap()),
        vec!["test/b"]
    );
}

/// Every built-in step's text (instruction, question or conclusion) with its cautions.
fn builtin_steps() -> Vec<(String, String, Vec<String>)> {
    let mut all = Vec::new();
    for p in procedure::builtin().unwrap() {
        for s in &p.steps {
            let mut text = s.instruction.clone();
            match &s.kind {
                StepKind::Question { question, .. } => text.push_str(&format!(" {question}")),
                StepKind::Conclusion { text: c } => text.push_str(&format!(" {c}")),
                StepKind::Measure { .. } => {}
            }
            all.push((format!("{}/{}", p.id, s.id), text, s.cautions.clone()));
        }
    }
    all
}

#[test]
fn the_first_current_reading_keeps_the_loop_closed_where_it_can() {
    for p in procedure::builtin().unwrap() {
        let first = p.step(&p.start).unwrap();
        // The first current read: at the transmitter, or (an output loop, after the
        // demand the control system sends) at the field device.
        let current = match first.measurements() {
            [Measurement::DemandPct, m, ..] => *m,
            [m, ..] => *m,
            [] => panic!("{}: the first step measures nothing", p.id),
        };
        let expected = if p
            .loops
            .contains(&loopside::budget::topology::Topology::AnalogOutput)
        {
            Measurement::DeviceMa
        } else {
            Measurement::TxMa
        };
        assert_eq!(current, expected, "{}", p.id);
        let i = &first.instruction;
        assert!(
            i.contains("test terminals") && i.contains("the loop stays closed"),
            "{}: {i}",
            p.id
        );
        assert!(i.contains("in manual or bypassed first"), "{}: {i}", p.id);
        assert!(i.contains("clamp-on mA meter"), "{}: {i}", p.id);
        assert!(
            first.cautions.iter().any(|c| c.contains("flameproof")),
            "{}",
            p.id
        );
    }
    for (id, text, _) in builtin_steps() {
        assert!(
            !text.contains("open the loop at the transmitter's test terminals"),
            "{id}"
        );
    }
}

#[test]
fn cautions_are_at_the_step_that_asks_for_the_risky_thing() {
    let mut counted = BTreeMap::new();
    let mut missing = Vec::new();
    for (id, text, cautions) in builtin_steps() {
        let lower = text.to_lowercase();
        let has = |words: &str| cautions.iter().any(|c| c.contains(words));
        let mut need = |rule: &'static str, asks: bool, ok: bool| {
            if asks {
                *counted.entry(rule).or_insert(0) += 1;
                if !ok {
                    missing.push(format!("{id} asks for {rule} without its caution: {text}"));
                }
            }
        };
        // Opening a field housing: the terminals, a junction box, the housing itself.
        need(
            "a field housing opened",
            lower.contains("junction box")
                || lower.contains("housing")
                || lower.contains("transmitter's terminals")
                || lower.contains("terminals at the transmitter")
                || (lower.contains("test terminals") && lower.contains("at the transmitter"))
                || lower.contains("every terminal"),
            has("flameproof") && has("gas-free permit"),
        );
        // Isolating, venting or equalising, or a calibrator on the process input.
        need(
            "the transmitter isolated or vented",
            lower.contains("calibrator")
                || lower.contains("equalis")
                || lower.contains("isolating valve")
                || lower.contains("impulse line")
                || lower.contains("process connection")
                || lower.contains("transmitter check")
                || lower.contains("five-point check"),
            has("equalising valve") && has("both block valves") && has("trapped pressure"),
        );
        // An insulation-resistance test.
        need(
            "an insulation test",
            lower.contains("insulation-test") || lower.contains("insulation test"),
            has("disconnect the transmitter, the receiver input, barriers, isolators and surge protectors")
                && has("instrument cable")
                && has("permit"),
        );
        // The polling address changed.
        need(
            "a changed polling address",
            lower.contains("address") && (lower.contains("set it") || lower.contains("change")),
            has("4 mA") && has("manual"),
        );
    }
    assert!(missing.is_empty(), "{missing:#?}");
    // Each rule was met somewhere (the rules are not vacuous).
    assert_eq!(counted.len(), 4, "{counted:?}");
}
