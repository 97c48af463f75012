//! Fault-finding that follows how the loop is built: a four-wire transmitter has no
//! lift-off voltage to check, and no current on an output loop points at the output card,
//! its configuration, the wiring or the device. Tags are from the invented Brindlemoor
//! plant (FV-315's positioner on a PLC output, AIT-531's four-wire analyser).
//!
//! The laws used, with the expected values worked by hand beside each check:
//! - a 4–20 mA signal is linear in its span: demand d % asks for 4 + 16 × d / 100 mA
//!   (the live-zero current signal of IEC 60381-1 / ANSI/ISA-50.00.01);
//! - a current source drives at most its compliance: given as a maximum load, that is
//!   R_max × 20 mA (Ohm's law), and the load it sees is V ÷ I (Ohm's law);
//! - one series loop carries one current (Kirchhoff's current law).

mod util;

use loopside::budget::topology::{Compliance, Device, Topology};
use loopside::budget::{LoopConfig, SeriesElement};
use loopside::diagnose::evaluate::{Detail, Evaluation, Settings};
use loopside::diagnose::measure::Measurement;
use loopside::diagnose::procedure::{self, Procedure, StepKind};
use loopside::diagnose::session::{Answer, Progress, Session};
use loopside::diagnose::SYMPTOMS;
use loopside::scale::Scale;
use loopside::tag::Tag;
use loopside::view::wording::finding;
use std::collections::BTreeMap;
use util::close;

/// FV-315: the aeration air valve's positioner on a PLC analog output with a 750 Ω
/// maximum load (demo figures), valve position 0–100 %, tolerance 1 % of span.
fn fv315() -> Tag {
    let mut tag = Tag::new("FV-315", Scale::linear(0.0, 100.0, "%").unwrap()).unwrap();
    let mut l =
        LoopConfig::current_output(Device::AnalogOutput, Compliance::MaxLoad { ohms: 750.0 });
    l.elements = vec![SeriesElement::drop("positioner", 9.0)];
    tag.loop_config = Some(l);
    tag.tolerance_percent = 1.0;
    tag
}

/// AIT-531: a four-wire turbidity analyser, 0–50 NTU, active output rated 18 V at 20 mA
/// (demo figure), into a passive 250 Ω PLC input.
fn ait531() -> Tag {
    let mut tag = Tag::new("AIT-531", Scale::linear(0.0, 50.0, "NTU").unwrap()).unwrap();
    let mut l = LoopConfig::current_output(Device::FourWire, Compliance::Volts { volts: 18.0 });
    l.elements = vec![SeriesElement::ohms("PLC input (passive)", 250.0)];
    tag.loop_config = Some(l);
    tag
}

fn values(v: &[(Measurement, f64)]) -> BTreeMap<Measurement, f64> {
    v.iter().copied().collect()
}

fn answer(s: &mut Session, p: &Procedure, tag: &Tag, v: &[(Measurement, f64)]) -> Progress {
    s.answer(p, tag, Answer::Values(values(v))).unwrap()
}

fn yes_no(s: &mut Session, p: &Procedure, tag: &Tag, yes: bool) -> Progress {
    s.answer(p, tag, Answer::YesNo(yes)).unwrap()
}

fn concluded(p: Progress) -> String {
    match p {
        Progress::Concluded(c) => c.step,
        other => panic!("expected a conclusion, got {other:?}"),
    }
}

#[test]
fn each_loop_gets_the_procedure_written_for_how_it_is_built() {
    let all = procedure::builtin().unwrap();
    let pick = |t: Topology, symptom: &str| {
        procedure::find_for(symptom, t, &[])
            .unwrap_or_else(|e| panic!("{symptom} on {t:?}: {e}"))
            .id
    };
    for t in [
        Topology::TwoWireSupply,
        Topology::TwoWireActiveInput,
        Topology::ThreeWire,
    ] {
        assert_eq!(pick(t, "stuck-low"), "stuck-low");
        assert_eq!(pick(t, "short-of-top"), "short-of-top");
    }
    assert_eq!(pick(Topology::FourWire, "stuck-low"), "stuck-low-four-wire");
    assert_eq!(
        pick(Topology::FourWire, "pegged-high"),
        "pegged-high-four-wire"
    );
    assert_eq!(
        pick(Topology::FourWire, "short-of-top"),
        "short-of-top-four-wire"
    );
    assert_eq!(
        pick(Topology::AnalogOutput, "stuck-low"),
        "stuck-low-output"
    );
    assert_eq!(
        pick(Topology::AnalogOutput, "pegged-high"),
        "pegged-high-output"
    );
    assert_eq!(
        pick(Topology::AnalogOutput, "short-of-top"),
        "short-of-top-output"
    );
    // Symptoms whose physics do not change with the topology keep one procedure.
    assert_eq!(pick(Topology::AnalogOutput, "noisy"), "noisy");
    assert_eq!(pick(Topology::FourWire, "hart-no-answer"), "hart-no-answer");
    // A loop recorded with two sources fits none: the general procedure is offered.
    assert_eq!(pick(Topology::Faulty, "stuck-low"), "stuck-low");
    // An id names one procedure whatever the loop.
    assert_eq!(
        pick(Topology::TwoWireSupply, "stuck-low-output"),
        "stuck-low-output"
    );
    // Every loop's menu has one procedure per symptom, in the menu's order.
    for t in Topology::ALL.into_iter().chain([Topology::Faulty]) {
        let menu = procedure::for_loop(&all, t);
        let symptoms: Vec<&str> = menu.iter().map(|p| p.symptom.as_str()).collect();
        let expected: Vec<&str> = SYMPTOMS.iter().map(|(s, _)| *s).collect();
        assert_eq!(symptoms, expected, "{t:?}");
        assert!(menu.iter().all(|p| p.fits(t) || t == Topology::Faulty));
    }
    // The tag's loop decides: FV-315 is an output loop, a tag without loop data two-wire.
    assert_eq!(procedure::loop_of(&fv315()), Topology::AnalogOutput);
    assert_eq!(procedure::loop_of(&ait531()), Topology::FourWire);
    let bare = Tag::new("PT-204", Scale::linear(0.0, 10.0, "bar").unwrap()).unwrap();
    assert_eq!(procedure::loop_of(&bare), Topology::TwoWireSupply);
}

#[test]
fn every_procedure_for_other_loops_ends_in_conclusions_on_every_path() {
    for p in procedure::builtin().unwrap() {
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
            }
            stack.extend(step.targets().into_iter().map(str::to_string));
        }
        assert_eq!(seen.len(), p.steps.len(), "{}: unreachable steps", p.id);
        assert!(conclusions >= 2, "{}", p.id);
        // No step for a current source asks for the transmitter's terminal volts (there is
        // no lift-off voltage), and none for a two-wire loop asks for a source's output.
        let asks = |m: Measurement| p.steps.iter().any(|s| s.measurements().contains(&m));
        if p.loops.contains(&Topology::FourWire) || p.loops.contains(&Topology::AnalogOutput) {
            assert!(!asks(Measurement::TerminalV), "{}", p.id);
            assert!(!asks(Measurement::SupplyV), "{}", p.id);
        }
        if p.loops.contains(&Topology::TwoWireSupply) {
            assert!(!asks(Measurement::SourceV), "{}", p.id);
        }
    }
}

#[test]
fn the_current_at_the_positioner_against_the_demand() {
    let tag = fv315();
    let run = |demand: f64, ma: f64| {
        Evaluation::OutputFollowsDemand
            .evaluate(
                &tag,
                &values(&[
                    (Measurement::DemandPct, demand),
                    (Measurement::DeviceMa, ma),
                ]),
                &Settings::default(),
            )
            .unwrap()
    };
    // Demand 50 % → 4 + 16 × 0.5 = 12 mA. 11.98 mA is −0.02/16 = −0.125 % of span; the
    // allowance is the tag's 1 % plus the meter's 0.05 mA = 0.3125 %, 1.3125 % in all.
    let e = run(50.0, 11.98);
    assert_eq!(e.outcome, "follows-demand");
    let Some(Detail::Output(f)) = e.findings[0].typed() else {
        panic!("output finding");
    };
    close(f.expected_ma, 12.0, 1e-12, "expected");
    close(f.error_pct, -0.125, 1e-9, "error");
    close(f.tolerance_pct, 1.3125, 1e-9, "allowance");
    // 9 mA at 50 %: (9 − 12)/16 = −18.75 % → short of the demand.
    let e = run(50.0, 9.0);
    assert_eq!(e.outcome, "below-demand");
    assert_eq!(e.findings[0].code, "output-below-demand");
    // Demand 0 % with 5.5 mA: +1.5/16 = +9.375 % → more than asked.
    assert_eq!(run(0.0, 5.5).outcome, "above-demand");
    // Nothing at the device (NE 43: under 1 mA is no loop current... the tag's bands).
    let e = run(60.0, 0.0);
    assert_eq!(e.outcome, "no-current-at-device");
    let words = finding::text(&e.findings[0]);
    assert!(
        words.contains("13.600 mA"),
        "60 % asks for 4 + 9.6 mA: {words}"
    );
    // A demand outside −25…125 % is refused, naming the field.
    let e = Evaluation::OutputFollowsDemand
        .evaluate(
            &tag,
            &values(&[
                (Measurement::DemandPct, 150.0),
                (Measurement::DeviceMa, 12.0),
            ]),
            &Settings::default(),
        )
        .unwrap_err();
    assert_eq!(e.field, "demand_pct");
}

#[test]
fn the_output_voltage_against_the_sources_compliance() {
    let tag = fv315();
    let run = |tag: &Tag, v: &[(Measurement, f64)]| {
        Evaluation::SourceCompliance
            .evaluate(tag, &values(v), &Settings::default())
            .unwrap()
    };
    // 750 Ω maximum load × 20 mA = 15 V available. 14.7 V leaves 0.3 V ≤ 0.5 V: at its
    // compliance. At 19.6 mA that is a load of 14.7 / 0.0196 = 750 Ω.
    let e = run(
        &tag,
        &[(Measurement::SourceV, 14.7), (Measurement::DeviceMa, 19.6)],
    );
    assert_eq!(e.outcome, "source-at-compliance");
    assert_eq!(e.findings[0].code, "source-at-compliance");
    let Some(Detail::Compliance(f)) = e.findings[0].typed() else {
        panic!("compliance finding");
    };
    close(f.compliance_v.unwrap(), 15.0, 1e-12, "compliance");
    close(f.headroom_v.unwrap(), 0.3, 1e-9, "headroom");
    close(f.load_ohms.unwrap(), 750.0, 1e-9, "load");
    // 12 V at 20 mA: 3 V in hand, a 600 Ω load.
    let e = run(
        &tag,
        &[(Measurement::SourceV, 12.0), (Measurement::DeviceMa, 20.0)],
    );
    assert_eq!(e.outcome, "source-has-headroom");
    assert!(finding::text(&e.findings[0]).contains("600"));
    // 0.3 V: the output is not driving at all.
    assert_eq!(
        run(&tag, &[(Measurement::SourceV, 0.3)]).outcome,
        "source-dead"
    );
    // A compliance given in volts is used as it is: 17.6 V of 18 V is at the limit.
    assert_eq!(
        run(&ait531(), &[(Measurement::SourceV, 17.6)]).outcome,
        "source-at-compliance"
    );
    // A tag without the source's data cannot judge it, and says so.
    let bare = Tag::new("FV-999", Scale::linear(0.0, 100.0, "%").unwrap()).unwrap();
    let e = run(&bare, &[(Measurement::SourceV, 14.0)]);
    assert_eq!(e.outcome, "compliance-not-recorded");
    assert_eq!(e.findings[0].code, "source-compliance-not-recorded");
    assert!(finding::text(&e.findings[0]).contains("data sheet"));
}

#[test]
fn fv315_gets_no_current_and_the_output_sits_at_its_compliance_an_open_loop() {
    let tag = fv315();
    let p = procedure::find_for("stuck-low", procedure::loop_of(&tag), &[]).unwrap();
    assert_eq!(p.id, "stuck-low-output");
    let mut s = Session::start(&p, &tag);
    // The first step changes or reads a live output: its cautions say the valve moves.
    let first = &p.step("demand").unwrap().cautions;
    assert!(
        first
            .iter()
            .any(|c| c.contains("valve") && c.contains("operations")),
        "{first:?}"
    );
    assert!(!s.cautions.is_empty(), "the general cautions come first");
    assert_eq!(
        s.pending(&p),
        vec![Measurement::DemandPct, Measurement::DeviceMa]
    );
    // Demand 60 % (13.6 mA asked), 0 mA at the positioner.
    assert_eq!(
        answer(
            &mut s,
            &p,
            &tag,
            &[(Measurement::DemandPct, 60.0), (Measurement::DeviceMa, 0.0)]
        ),
        Progress::Next("source-volts".to_string())
    );
    // 14.9 V across the output: within 0.5 V of the 15 V it can drive.
    assert_eq!(
        concluded(answer(&mut s, &p, &tag, &[(Measurement::SourceV, 14.9)])),
        "open-loop"
    );
    let codes: Vec<&str> = s.findings().iter().map(|f| f.code.as_str()).collect();
    assert_eq!(
        codes,
        vec!["output-no-current-at-device", "source-at-compliance"]
    );
}

#[test]
fn fv315_with_no_voltage_on_the_output_and_no_current_at_the_card_is_a_dead_channel() {
    let tag = fv315();
    let p = procedure::find_for("stuck-low", Topology::AnalogOutput, &[]).unwrap();
    let mut s = Session::start(&p, &tag);
    answer(
        &mut s,
        &p,
        &tag,
        &[(Measurement::DemandPct, 40.0), (Measurement::DeviceMa, 0.0)],
    );
    assert_eq!(
        answer(&mut s, &p, &tag, &[(Measurement::SourceV, 0.1)]),
        Progress::Next("card-current".to_string())
    );
    assert_eq!(
        concluded(yes_no(&mut s, &p, &tag, false)),
        "output-not-driving"
    );
}

#[test]
fn fv315_short_of_the_demand_with_the_output_at_its_compliance_has_too_much_load() {
    // Split-range style fault: more drop than the output can drive. Demand 100 % asks for
    // 20 mA; 17.2 mA reach the positioner (−17.5 % of span) with 14.8 V across the output
    // (0.2 V under its 15 V): the load, 14.8 / 0.0172 = 860.5 Ω, is past 750 Ω.
    let tag = fv315();
    let p = procedure::find_for("short-of-top", Topology::AnalogOutput, &[]).unwrap();
    let mut s = Session::start(&p, &tag);
    assert_eq!(
        answer(
            &mut s,
            &p,
            &tag,
            &[
                (Measurement::DemandPct, 100.0),
                (Measurement::DeviceMa, 17.2)
            ]
        ),
        Progress::Next("source-volts".to_string())
    );
    assert_eq!(
        concluded(answer(&mut s, &p, &tag, &[(Measurement::SourceV, 14.8)])),
        "load-too-high"
    );
    let Some(Detail::Compliance(f)) = s.findings()[1].typed() else {
        panic!("compliance finding");
    };
    close(f.load_ohms.unwrap(), 14.8 / 0.0172, 1e-9, "load");
}

#[test]
fn ait531_with_no_current_powered_but_no_output_voltage_has_a_dead_output() {
    let tag = ait531();
    let p = procedure::find_for("stuck-low", procedure::loop_of(&tag), &[]).unwrap();
    assert_eq!(p.id, "stuck-low-four-wire");
    let mut s = Session::start(&p, &tag);
    assert_eq!(
        answer(&mut s, &p, &tag, &[(Measurement::TxMa, 0.0)]),
        Progress::Next("powered".to_string())
    );
    // The question about the transmitter's own power carries the mains caution there.
    let powered = p.step("powered").unwrap();
    assert!(powered.cautions.iter().any(|c| c.contains("mains")));
    assert_eq!(
        yes_no(&mut s, &p, &tag, true),
        Progress::Next("source-volts".to_string())
    );
    assert_eq!(
        concluded(answer(&mut s, &p, &tag, &[(Measurement::SourceV, 0.2)])),
        "output-dead"
    );
    // The same loop open between analyser and PLC: the output rises to its compliance.
    let mut s = Session::start(&p, &tag);
    answer(&mut s, &p, &tag, &[(Measurement::TxMa, 0.0)]);
    yes_no(&mut s, &p, &tag, true);
    assert_eq!(
        concluded(answer(&mut s, &p, &tag, &[(Measurement::SourceV, 17.8)])),
        "open-loop"
    );
    // No power at all.
    let mut s = Session::start(&p, &tag);
    answer(&mut s, &p, &tag, &[(Measurement::TxMa, 0.0)]);
    assert_eq!(concluded(yes_no(&mut s, &p, &tag, false)), "no-power");
}

#[test]
fn the_command_line_picks_the_output_procedure_for_fv315_from_the_demo() {
    let dir = util::TempDir::new("diagnose-topology");
    let d = dir.arg();
    assert!(util::loopside(&["--data-dir", &d, "demo"]).status.success());
    let answers = dir.0.join("fv315.json");
    std::fs::write(
        &answers,
        r#"{"demand_pct": "60", "device_ma": 0, "source_v": "14,9"}"#,
    )
    .unwrap();
    let j = util::loopside_json(&[
        "--data-dir",
        &d,
        "diagnose",
        "--tag",
        "FV-315",
        "--symptom",
        "stuck-low",
        "--answers",
        answers.to_str().unwrap(),
        "--json",
    ]);
    assert_eq!(j["procedure"], "stuck-low-output");
    assert_eq!(j["conclusion"]["step"], "open-loop");
}
