//! The Find fault screen's view model: the symptom menu, and for a session under way the
//! steps already worked, the step waiting for an answer (with one input per measurement
//! still needed), the findings so far and the conclusion once reached.
//!
//! Everything comes from the procedure engine ([`crate::diagnose`]): the view only words
//! and formats it. Values measured are written through [`crate::display`]; what a step's
//! outcome means is said in plain words; whether a step pointed at a fault is read from the
//! findings that step produced.

use crate::diagnose::evaluate::Finding;
use crate::diagnose::session::{Recorded, Session, StepRecord};
use crate::diagnose::{Measurement, Procedure, StepKind};
use crate::display;
use crate::error::{FieldError, Result};
use crate::tag::Tag;
use crate::view::Tone;
use std::collections::BTreeMap;

/// What the technician has typed at the current step, by measurement (text as typed).
pub type Inputs = BTreeMap<Measurement, String>;

/// One symptom on the menu.
#[derive(Debug, Clone, PartialEq)]
pub struct Symptom {
    /// The procedure's id (what a session is started with).
    pub id: String,
    /// Short title, e.g. "Reading stuck at or below zero".
    pub title: String,
    /// When to use it.
    pub summary: String,
}

/// The symptom menu: one entry per procedure, in the order given.
pub fn symptoms(procedures: &[Procedure]) -> Vec<Symptom> {
    procedures
        .iter()
        .map(|p| Symptom {
            id: p.id.clone(),
            title: p.title.clone(),
            summary: p.summary.clone(),
        })
        .collect()
}

/// A step already worked.
#[derive(Debug, Clone, PartialEq)]
pub struct DoneStep {
    /// 1 for the first step worked.
    pub number: usize,
    /// What the technician was told to do.
    pub instruction: String,
    /// What was measured, one line each: `Loop current at the transmitter: 0.000 mA`;
    /// for a question, the question and the answer.
    pub lines: Vec<String>,
    /// What the step's outcome means, in plain words.
    pub outcome: String,
    /// How the step's findings stand (neutral when it made none).
    pub tone: Tone,
    /// True when a finding of this step points at a fault.
    pub points_to_fault: bool,
}

/// One input at the current step.
#[derive(Debug, Clone, PartialEq)]
pub struct Input {
    /// The measurement it is for.
    pub measurement: Measurement,
    /// The question put to the technician.
    pub label: String,
    /// The unit the answer is in (may be empty for a unitless tag value).
    pub unit: String,
    /// The text as typed.
    pub text: String,
    /// Why the text cannot be used, naming the measurement; empty when it can (or when
    /// nothing is typed yet).
    pub error: String,
}

/// The step waiting for an answer.
#[derive(Debug, Clone, PartialEq)]
pub struct CurrentStep {
    /// Its number in the session (the steps worked plus one).
    pub number: usize,
    /// What to do.
    pub instruction: String,
    /// The safety cautions for what this step asks for (may be empty).
    pub cautions: Vec<String>,
    /// The yes/no question, for a question step.
    pub question: Option<String>,
    /// One input per measurement still needed, for a measure step.
    pub inputs: Vec<Input>,
    /// Measurements this step uses that are already known this session, formatted.
    pub known: Vec<String>,
}

/// A finding, as the screen lists it.
#[derive(Debug, Clone, PartialEq)]
pub struct FindingLine {
    /// What it means, with the numbers.
    pub text: String,
    /// How it stands.
    pub tone: Tone,
}

/// The end the procedure reached.
#[derive(Debug, Clone, PartialEq)]
pub struct ConclusionView {
    /// Heading.
    pub title: String,
    /// The procedure's conclusion text.
    pub detail: String,
    /// The safety cautions for what the conclusion asks for (may be empty).
    pub cautions: Vec<String>,
    /// Bad when a finding points at a fault; neutral otherwise.
    pub tone: Tone,
}

/// Everything the screen shows for a session under way or finished.
#[derive(Debug, Clone, PartialEq)]
pub struct SessionView {
    /// The procedure's title.
    pub title: String,
    /// The tag the session is on.
    pub tag: String,
    /// Steps worked, in order.
    pub done: Vec<DoneStep>,
    /// The step waiting for an answer (None once concluded).
    pub current: Option<CurrentStep>,
    /// Every finding so far, in order.
    pub findings: Vec<FindingLine>,
    /// The conclusion, once reached.
    pub conclusion: Option<ConclusionView>,
}

/// Work out what the screen shows for `session` (a run of `procedure` on `tag`), with the
/// inputs as typed at the current step.
pub fn view(procedure: &Procedure, session: &Session, tag: &Tag, inputs: &Inputs) -> SessionView {
    let done: Vec<DoneStep> = session
        .steps
        .iter()
        .enumerate()
        .map(|(i, r)| done_step(i + 1, r, procedure, session, tag))
        .collect();
    let current = session.current_step(procedure).map(|step| {
        let (question, inputs) = match &step.kind {
            StepKind::Question { question, .. } => (Some(question.clone()), Vec::new()),
            _ => (
                None,
                session
                    .pending(procedure)
                    .into_iter()
                    .map(|m| input(m, tag, inputs.get(&m).map(String::as_str).unwrap_or("")))
                    .collect(),
            ),
        };
        let known = step
            .measurements()
            .iter()
            .filter_map(|m| {
                let value = session.measurements.get(m).cloned().or_else(|| {
                    session.partial.get(m).map(|v| Recorded {
                        value: *v,
                        unit: m.unit(tag),
                    })
                })?;
                Some(measured_line(*m, &value, tag))
            })
            .collect();
        CurrentStep {
            number: done.len() + 1,
            instruction: step.instruction.clone(),
            cautions: step.cautions.clone(),
            question,
            inputs,
            known,
        }
    });
    let findings: Vec<FindingLine> = session
        .findings
        .iter()
        .map(|f| FindingLine {
            text: crate::view::wording::finding::text(f),
            tone: finding_tone(&f.code),
        })
        .collect();
    let any_fault = session.findings.iter().any(points_to_fault);
    let conclusion = session.conclusion.as_ref().map(|c| ConclusionView {
        title: "Conclusion".to_string(),
        detail: c.text.clone(),
        cautions: c.cautions.clone(),
        tone: if any_fault { Tone::Bad } else { Tone::Neutral },
    });
    SessionView {
        title: session.title.clone(),
        tag: session.tag.clone(),
        done,
        current,
        findings,
        conclusion,
    }
}

fn done_step(
    number: usize,
    record: &StepRecord,
    procedure: &Procedure,
    session: &Session,
    tag: &Tag,
) -> DoneStep {
    let mut lines: Vec<String> = record
        .measured
        .iter()
        .map(|(m, r)| measured_line(*m, r, tag))
        .collect();
    if let Some(answer) = record.answer {
        let question = match procedure.step(&record.step).map(|s| &s.kind) {
            Some(StepKind::Question { question, .. }) => question.clone(),
            _ => "Answer".to_string(),
        };
        lines.push(format!("{question} {}", if answer { "Yes" } else { "No" }));
    }
    let own: Vec<&Finding> = session
        .findings
        .iter()
        .filter(|f| f.step == record.step)
        .collect();
    let tone = own
        .iter()
        .map(|f| finding_tone(&f.code))
        .max_by_key(|t| severity(*t))
        .unwrap_or(Tone::Neutral);
    DoneStep {
        number,
        instruction: record.instruction.clone(),
        lines,
        outcome: outcome_words(&record.outcome),
        tone,
        points_to_fault: own.iter().any(|f| points_to_fault(f)),
    }
}

/// One input, with the reason its text cannot be used (if it is typed and cannot).
fn input(m: Measurement, tag: &Tag, text: &str) -> Input {
    let unit = m.unit(tag);
    let error = if text.trim().is_empty() {
        String::new()
    } else {
        match m.parse(tag, text) {
            Ok(_) => String::new(),
            Err(e) => named(m, tag, e).to_string(),
        }
    };
    Input {
        measurement: m,
        label: m.label().to_string(),
        unit,
        text: text.to_string(),
        error,
    }
}

/// The error reported under the measurement's label and unit, as the screen shows it.
fn named(m: Measurement, tag: &Tag, e: FieldError) -> FieldError {
    let unit = m.unit(tag);
    let field = if unit.is_empty() {
        m.label().to_string()
    } else {
        format!("{} ({unit})", m.label())
    };
    FieldError::new(field, e.reason)
}

/// The values typed at the current step, read for [`Session::answer`]: every pending
/// measurement must be typed and valid; the first that is not is the error, named by its
/// label and unit.
pub fn answers(
    procedure: &Procedure,
    session: &Session,
    tag: &Tag,
    inputs: &Inputs,
) -> Result<BTreeMap<Measurement, f64>> {
    let mut values = BTreeMap::new();
    for m in session.pending(procedure) {
        let text = inputs.get(&m).map(String::as_str).unwrap_or("");
        if text.trim().is_empty() {
            return Err(named(
                m,
                tag,
                FieldError::new(m.key(), "is empty; type what the meter shows"),
            ));
        }
        let v = m.parse(tag, text).map_err(|e| named(m, tag, e))?;
        values.insert(m, v);
    }
    Ok(values)
}

/// A measurement as recorded, for people: `Supply voltage at the supply terminals (DC):
/// 24.00 V`.
pub fn measured_line(m: Measurement, r: &Recorded, tag: &Tag) -> String {
    format!("{}: {}", m.label(), measured_value(m, r, tag))
}

/// A recorded value with its unit, rounded as [`crate::display`] rounds that quantity.
pub fn measured_value(m: Measurement, r: &Recorded, tag: &Tag) -> String {
    match m {
        Measurement::TxMa | Measurement::RxMa | Measurement::SwingMa | Measurement::DeviceMa => {
            display::ma(r.value)
        }
        Measurement::DemandPct => display::percent(r.value),
        Measurement::SupplyV
        | Measurement::TerminalV
        | Measurement::ResistorV
        | Measurement::ShieldAcV
        | Measurement::SourceV => display::volts(r.value),
        Measurement::ResistorOhms | Measurement::LoopOhms => display::ohms(r.value),
        Measurement::Displayed | Measurement::ControlValue => display::value(
            r.value,
            &r.unit,
            crate::view::convert::value_span(&tag.scale),
        ),
        Measurement::ProcessValue => display::value(r.value, &r.unit, tag.scale.span()),
    }
}

/// What an evaluation's outcome means, in plain words. (Outcome names are unique across
/// the evaluations in [`crate::diagnose::evaluate`]; a name this list does not know is
/// shown with its dashes as spaces.)
pub fn outcome_words(outcome: &str) -> String {
    let words = match outcome {
        "no-loop-current" => "No loop current",
        "fail-low" => "Failure signal, downscale",
        "suspect-low" => "Below the live zero, but not a failure signal",
        "under-range" => "Below the bottom of the range",
        "in-range" => "Within the range",
        "over-range" => "Above the top of the range",
        "suspect-high" => "Above the top, but not a failure signal",
        "fail-high" => "Failure signal, upscale",
        "no-supply" => "No supply",
        "low" => "Supply too low for the loop",
        "ok" => "Supply is enough",
        "none" => "No voltage at the transmitter",
        "not-enough" => "Not enough voltage at the transmitter",
        "short-at-top" => "Enough voltage now, too little at full scale",
        "enough" => "Enough voltage at the transmitter",
        "match" => "The same current at both ends",
        "across-pair" => "The receiver reads more: a path across the pair",
        "to-earth" => "The receiver reads less: current leaves the loop, to earth",
        "agrees" => "The reading agrees with the loop",
        "explained" => "The reading disagrees; a setting explains it",
        "unexplained" => "The reading disagrees; no setting explains it",
        "both-agree" => "Indicator and control system agree with the loop",
        "indicator-wrong" => "The indicator disagrees with the loop",
        "control-wrong" => "The control system disagrees with the loop",
        "both-wrong" => "Indicator and control system both disagree with the loop",
        "too-low" => "Too little loop resistance for HART",
        "in-window" => "Loop resistance within the HART window",
        "too-high" => "Too much loop resistance for HART",
        "open" => "The loop is open",
        "quiet" => "No interference on the shield",
        "noisy" => "Interference on the shield",
        "steady" => "The loop current is steady",
        "swinging" => "The loop current swings",
        "no-current-at-device" => "No current at the device",
        "follows-demand" => "The current follows the demand",
        "below-demand" => "Less current than the demand asks for",
        "above-demand" => "More current than the demand asks for",
        "source-dead" => "The source is not driving",
        "source-has-headroom" => "The source has voltage in hand",
        "source-at-compliance" => "The source is at its compliance",
        "compliance-not-recorded" => "Compliance not recorded for this tag",
        "yes" => "Yes",
        "no" => "No",
        "otherwise" => "Recorded",
        other => return other.replace('-', " "),
    };
    words.to_string()
}

/// How a finding stands, from its code: the codes of a reading that is as it should be
/// are good, a valid reading outside the span is outside, a doubtful signal is a caution,
/// no current is dead, and everything else (failures, disagreements, the configuration
/// mistakes that explain them) is bad.
pub fn finding_tone(code: &str) -> Tone {
    match code {
        "band-in-range"
        | "supply-ok"
        | "enough-voltage"
        | "currents-match"
        | "reading-agrees"
        | "shield-quiet"
        | "current-steady"
        | "hart-in-window"
        | "output-follows-demand"
        | "source-has-headroom" => Tone::Good,
        "band-under-range" | "band-over-range" => Tone::Outside,
        "band-suspect-low" | "band-suspect-high" | "short-at-top" => Tone::Caution,
        "band-no-loop-current" | "output-no-current-at-device" | "source-dead" => Tone::Dead,
        "source-compliance-not-recorded" => Tone::Caution,
        _ => Tone::Bad,
    }
}

/// True when a finding points at a fault (bad, doubtful or no signal).
pub fn points_to_fault(f: &Finding) -> bool {
    matches!(
        finding_tone(&f.code),
        Tone::Bad | Tone::Caution | Tone::Dead
    )
}

/// Which tone wins when a step has several findings.
fn severity(t: Tone) -> u8 {
    match t {
        Tone::Neutral => 0,
        Tone::Good => 1,
        Tone::Outside => 2,
        Tone::Caution => 3,
        Tone::Dead => 4,
        Tone::Bad => 5,
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::diagnose::session::Answer;
    use crate::diagnose::{evaluate, procedure, Progress};

    fn lt101() -> Tag {
        crate::demo::tags()
            .unwrap()
            .into_iter()
            .find(|t| t.number == "LT-101")
            .unwrap()
    }

    fn typed(pairs: &[(Measurement, &str)]) -> Inputs {
        pairs.iter().map(|(m, t)| (*m, t.to_string())).collect()
    }

    /// Submit what is typed, as the screen's Next button does.
    fn next(p: &Procedure, s: &mut Session, tag: &Tag, inputs: &Inputs) -> Progress {
        let values = answers(p, s, tag, inputs).unwrap();
        s.answer(p, tag, Answer::Values(values)).unwrap()
    }

    #[test]
    fn the_menu_lists_every_builtin_symptom_with_its_summary() {
        // A two-wire loop's menu: one procedure per symptom, in the built-in order.
        let two_wire = procedure::for_loop(
            &procedure::builtin().unwrap(),
            crate::budget::topology::Topology::TwoWireSupply,
        );
        let menu = symptoms(&two_wire);
        assert_eq!(menu.len(), crate::diagnose::SYMPTOMS.len());
        for ((id, title), s) in crate::diagnose::SYMPTOMS.iter().zip(&menu) {
            assert_eq!(&s.id, id);
            assert_eq!(&s.title, title);
            assert!(!s.summary.is_empty(), "{id} has no summary");
        }
    }

    #[test]
    fn stuck_low_on_lt101_walked_to_an_open_loop() {
        // LT-101 (Brindlemoor inlet wet well, 0–4.5 m, 24 V supply, 10.5 V minimum):
        // no current, the supply is there, nothing reaches the transmitter → open wiring.
        let tag = lt101();
        let p = procedure::find("stuck-low", &[]).unwrap();
        let mut s = Session::start(&p, &tag);

        // Stage 1: the first step asks for the current at the transmitter.
        let v = view(&p, &s, &tag, &Inputs::new());
        assert_eq!(v.title, "Reading stuck at or below zero");
        assert_eq!(v.tag, "LT-101");
        assert!(v.done.is_empty() && v.findings.is_empty() && v.conclusion.is_none());
        let cur = v.current.unwrap();
        assert_eq!(cur.number, 1);
        assert!(cur
            .instruction
            .starts_with("At the transmitter, measure the loop current"));
        assert_eq!(cur.question, None);
        assert_eq!(cur.inputs.len(), 1);
        assert_eq!(cur.inputs[0].label, "Loop current at the transmitter");
        assert_eq!(cur.inputs[0].unit, "mA");
        assert_eq!(cur.inputs[0].error, "", "nothing typed, nothing wrong yet");
        // The caution for what this step asks (test terminals in the transmitter's
        // housing) is shown with it.
        assert!(cur.cautions.iter().any(|c| c.contains("flameproof")));

        // A decimal comma and a unit suffix are fine.
        let inputs = typed(&[(Measurement::TxMa, "0,0 mA")]);
        assert!(matches!(next(&p, &mut s, &tag, &inputs), Progress::Next(id) if id == "supply"));

        // Stage 2: one step done, pointing at a fault (no loop current); supply asked for.
        let v = view(&p, &s, &tag, &Inputs::new());
        assert_eq!(v.done.len(), 1);
        let d = &v.done[0];
        assert_eq!(d.number, 1);
        assert_eq!(d.lines, vec!["Loop current at the transmitter: 0.000 mA"]);
        assert_eq!(d.outcome, "No loop current");
        assert_eq!(d.tone, Tone::Dead);
        assert!(d.points_to_fault);
        assert_eq!(v.findings.len(), 1);
        assert_eq!(v.findings[0].tone, Tone::Dead);
        // Worded from the finding's code and numbers: 0 mA is (0 − 4)/16 = −25 % of span.
        assert!(
            v.findings[0]
                .text
                .starts_with("0.000 mA at the transmitter (-25.00 % of span): no-loop-current"),
            "{}",
            v.findings[0].text
        );
        let cur = v.current.unwrap();
        assert_eq!(cur.number, 2);
        assert_eq!(cur.inputs.len(), 1);
        assert_eq!(cur.inputs[0].measurement, Measurement::SupplyV);
        assert_eq!(cur.inputs[0].unit, "V");
        // Volts after a current: the meter's red lead goes back to the V socket first.
        assert!(cur
            .cautions
            .iter()
            .any(|c| c.contains("red lead back to the V socket")));

        next(&p, &mut s, &tag, &typed(&[(Measurement::SupplyV, "24,1")]));

        // Stage 3: the supply is fine (a step that does not point at a fault).
        let v = view(&p, &s, &tag, &Inputs::new());
        let d = &v.done[1];
        assert_eq!(
            d.lines,
            vec!["Supply voltage at the supply terminals (DC): 24.10 V"]
        );
        assert_eq!(d.outcome, "Supply is enough");
        assert_eq!(d.tone, Tone::Good);
        assert!(!d.points_to_fault);
        let cur = v.current.unwrap();
        assert_eq!(cur.inputs[0].measurement, Measurement::TerminalV);

        let end = next(&p, &mut s, &tag, &typed(&[(Measurement::TerminalV, "0")]));
        assert!(matches!(end, Progress::Concluded(c) if c.step == "open-wiring"));

        // Stage 4: concluded; no step waits; the conclusion is shown as pointing at a fault.
        let v = view(&p, &s, &tag, &Inputs::new());
        assert!(v.current.is_none());
        assert_eq!(v.done.len(), 3);
        assert_eq!(v.done[2].outcome, "No voltage at the transmitter");
        assert!(v.done[2].points_to_fault);
        assert_eq!(v.findings.len(), 3);
        let c = v.conclusion.unwrap();
        assert!(c
            .detail
            .starts_with("The supply is there but does not reach"));
        assert_eq!(c.tone, Tone::Bad);

        s.conclude("  Loose wire at JB-01 terminal 4, re-terminated  ");
        assert_eq!(
            crate::view::wording::fault::log_text(&s),
            format!(
                "Reading stuck at or below zero: {}\nTechnician: Loose wire at JB-01 terminal 4, re-terminated",
                c.detail
            )
        );
    }

    #[test]
    fn a_question_step_shows_the_question_and_the_answer() {
        // 3.9 mA is under range (NE 43 measurement band below 4 mA): is the process
        // really below the bottom of the range?
        let tag = lt101();
        let p = procedure::find("stuck-low", &[]).unwrap();
        let mut s = Session::start(&p, &tag);
        next(&p, &mut s, &tag, &typed(&[(Measurement::TxMa, "3.9")]));
        let v = view(&p, &s, &tag, &Inputs::new());
        assert_eq!(v.done[0].tone, Tone::Outside);
        assert!(
            !v.done[0].points_to_fault,
            "under range is a reading, not a fault"
        );
        let cur = v.current.unwrap();
        assert!(cur.inputs.is_empty());
        let q = cur.question.unwrap();
        assert!(q.starts_with("Is the process really below"));

        s.answer(&p, &tag, Answer::YesNo(true)).unwrap();
        let v = view(&p, &s, &tag, &Inputs::new());
        assert_eq!(v.done[1].lines, vec![format!("{q} Yes")]);
        assert_eq!(v.done[1].outcome, "Yes");
        assert_eq!(v.done[1].tone, Tone::Neutral);
        let c = v.conclusion.unwrap();
        assert!(c.detail.starts_with("The loop reads the process correctly"));
        assert_eq!(c.tone, Tone::Neutral, "nothing pointed at a fault");
    }

    #[test]
    fn two_inputs_at_one_step_and_what_is_already_known() {
        // 3.5 mA is a downscale failure signal: the next step asks for two voltages.
        let tag = lt101();
        let p = procedure::find("stuck-low", &[]).unwrap();
        let mut s = Session::start(&p, &tag);
        next(&p, &mut s, &tag, &typed(&[(Measurement::TxMa, "3.5")]));
        let inputs = typed(&[(Measurement::SupplyV, "24 V")]);
        let v = view(&p, &s, &tag, &inputs);
        let cur = v.current.unwrap();
        let labels: Vec<&str> = cur.inputs.iter().map(|i| i.label.as_str()).collect();
        assert_eq!(
            labels,
            vec![
                "Supply voltage at the supply terminals (DC)",
                "Voltage across the transmitter terminals (DC)"
            ]
        );
        assert_eq!(cur.inputs[0].text, "24 V");
        assert_eq!(cur.inputs[1].text, "");
        // Submitting with one still empty names it.
        let e = answers(&p, &s, &tag, &inputs).unwrap_err();
        assert_eq!(
            e.to_string(),
            "Voltage across the transmitter terminals (DC) (V): is empty; type what the meter shows"
        );
        assert_eq!(s.steps.len(), 1, "nothing was submitted");
        // A value given on its own (a saved session may hold one) is shown as known, and
        // only the other is asked for.
        let one = [(Measurement::SupplyV, 24.0)].into_iter().collect();
        s.answer(&p, &tag, Answer::Values(one)).unwrap();
        let cur = view(&p, &s, &tag, &Inputs::new()).current.unwrap();
        assert_eq!(
            cur.known,
            vec!["Supply voltage at the supply terminals (DC): 24.00 V"]
        );
        assert_eq!(cur.inputs.len(), 1);
        assert_eq!(cur.inputs[0].measurement, Measurement::TerminalV);
        // 8 V at the terminals is under LT-101's 10.5 V minimum.
        let both = typed(&[(Measurement::SupplyV, "24"), (Measurement::TerminalV, "8")]);
        let end = next(&p, &mut s, &tag, &both);
        assert!(matches!(end, Progress::Concluded(c) if c.step == "starved"));
        let v = view(&p, &s, &tag, &Inputs::new());
        assert_eq!(v.done[1].lines.len(), 2);
        assert!(v.done[1].points_to_fault);
        assert_eq!(v.done[1].outcome, "Not enough voltage at the transmitter");
    }

    #[test]
    fn a_bad_value_names_the_measurement_and_its_range() {
        let tag = lt101();
        let p = procedure::find("stuck-low", &[]).unwrap();
        let s = Session::start(&p, &tag);
        let inputs = typed(&[(Measurement::TxMa, "75")]);
        let v = view(&p, &s, &tag, &inputs);
        let input = &v.current.unwrap().inputs[0];
        assert_eq!(
            input.error,
            "Loop current at the transmitter (mA): must be between 0 and 50, got 75"
        );
        assert_eq!(input.text, "75", "the text is kept as typed");
        let e = answers(&p, &s, &tag, &inputs).unwrap_err();
        assert_eq!(e.to_string(), input.error);
        let e = answers(&p, &s, &tag, &typed(&[(Measurement::TxMa, "twelve")])).unwrap_err();
        assert!(
            e.field.starts_with("Loop current at the transmitter"),
            "{e}"
        );
    }

    #[test]
    fn an_unfinished_session_is_logged_as_not_finished() {
        let tag = lt101();
        let p = procedure::find("stuck-low", &[]).unwrap();
        let s = Session::start(&p, &tag);
        assert_eq!(
            crate::view::wording::fault::log_text(&s),
            "Reading stuck at or below zero: not finished"
        );
    }

    #[test]
    fn every_outcome_has_plain_words() {
        for e in evaluate::ALL {
            for o in e.outcomes() {
                let words = outcome_words(o);
                assert_ne!(
                    words,
                    o.replace('-', " "),
                    "{o} of {} has no words",
                    e.key()
                );
            }
        }
    }

    #[test]
    fn measured_values_are_rounded_per_quantity() {
        let tag = lt101();
        let r = |value: f64, unit: &str| Recorded {
            value,
            unit: unit.to_string(),
        };
        assert_eq!(
            measured_value(Measurement::RxMa, &r(3.2, "mA"), &tag),
            "3.200 mA"
        );
        assert_eq!(
            measured_value(Measurement::LoopOhms, &r(312.44, "Ω"), &tag),
            "312 Ω"
        );
        // LT-101 spans 4.5 m: four decimals resolve 0.01 % of span.
        assert_eq!(
            measured_value(Measurement::ProcessValue, &r(2.25, "m"), &tag),
            "2.2500 m"
        );
    }
}
