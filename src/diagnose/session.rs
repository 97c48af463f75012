//! A fault-finding session: one run of a procedure on one tag, as plain data.
//!
//! The session holds everything needed to carry on later — the procedure id, the step
//! waiting for an answer, every measurement with its unit, the findings so far — and
//! nothing that needs the procedure or tag to be kept in memory. The app saves it
//! (serde JSON) when it is closed midway and calls [`Session::resume`] to carry on; when
//! finished, the same JSON is the payload of a log entry of kind [`LOG_KIND`].
//!
//! The cautions are part of the session from its start, and each step's own cautions are
//! kept with its record and with the conclusion, so a saved session shows what the
//! technician was told. A session saved with the old leakage outcome ids is read with
//! today's (see [`super::evaluate::OLD_LEAKAGE_OUTCOMES`]).

use super::evaluate::{Finding, Settings};
use super::measure::Measurement;
use super::procedure::{Procedure, Step, StepKind};
use crate::caution::CAUTIONS;
use crate::error::{FieldError, Result};
use crate::leave::{Item, LeaveList};
use crate::tag::Tag;
use serde::{Deserialize, Serialize};
use std::collections::BTreeMap;

/// The kind of log entry a finished (or paused) session is stored as.
pub const LOG_KIND: &str = "fault-finding";

/// One measurement as recorded: value and unit.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Recorded {
    /// The value.
    pub value: f64,
    /// Its unit.
    pub unit: String,
}

/// One step as it was worked.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct StepRecord {
    /// Step id.
    pub step: String,
    /// What the technician was told to do.
    pub instruction: String,
    /// The cautions shown with the step.
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub cautions: Vec<String>,
    /// Measurements taken at this step.
    #[serde(default)]
    pub measured: BTreeMap<Measurement, Recorded>,
    /// Answer to a question step.
    #[serde(default)]
    pub answer: Option<bool>,
    /// The outcome that chose the next step (an old leakage outcome id is read as
    /// today's, see [`super::evaluate::OLD_LEAKAGE_OUTCOMES`]).
    #[serde(deserialize_with = "read_outcome")]
    pub outcome: String,
}

/// Read a step's outcome, mapping the old leakage ids (`leak` → `to-earth`,
/// `extra-current` → `across-pair`: by the direction measured, since the old names had it
/// backwards).
fn read_outcome<'de, D: serde::Deserializer<'de>>(d: D) -> std::result::Result<String, D::Error> {
    let outcome = String::deserialize(d)?;
    Ok(super::evaluate::current_outcome_id(&outcome).to_string())
}

/// The end a procedure reached.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Conclusion {
    /// The conclusion step's id.
    pub step: String,
    /// Its text.
    pub text: String,
    /// The cautions shown with it.
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub cautions: Vec<String>,
}

/// What the technician gives at a step.
#[derive(Debug, Clone, PartialEq)]
pub enum Answer {
    /// Values for a measure step (in each measurement's unit).
    Values(BTreeMap<Measurement, f64>),
    /// Yes or no to a question step.
    YesNo(bool),
}

/// Where the session went after an answer.
#[derive(Debug, Clone, PartialEq)]
pub enum Progress {
    /// Waiting at this step.
    Next(String),
    /// The procedure reached a conclusion.
    Concluded(Conclusion),
}

/// A fault-finding session: the payload of a `fault-finding` log entry.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Session {
    /// Procedure id.
    pub procedure: String,
    /// The procedure's symptom.
    pub symptom: String,
    /// The procedure's title.
    pub title: String,
    /// Tag number.
    pub tag: String,
    /// The cautions shown before the first step.
    pub cautions: Vec<String>,
    /// Judging settings.
    pub settings: Settings,
    /// Step waiting for an answer (None once concluded).
    pub current: Option<String>,
    /// Steps worked, in order.
    pub steps: Vec<StepRecord>,
    /// Every measurement taken, by key.
    pub measurements: BTreeMap<Measurement, Recorded>,
    /// Values given for the current step that are not yet complete.
    #[serde(default)]
    pub partial: BTreeMap<Measurement, f64>,
    /// Findings, in the order they were made.
    pub findings: Vec<Finding>,
    /// The procedure's conclusion, once reached.
    pub conclusion: Option<Conclusion>,
    /// The technician's own words on what was found and done.
    #[serde(default)]
    pub technician_conclusion: String,
    /// The before-you-leave list as the technician left it (payload key
    /// `before_leaving`); `None` in sessions saved before loopside asked, and until a
    /// front sets it with [`Session::left`].
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub before_leaving: Option<LeaveList>,
}

impl Session {
    /// Start `procedure` on `tag` with default settings.
    pub fn start(procedure: &Procedure, tag: &Tag) -> Session {
        Session::start_with(procedure, tag, Settings::default())
    }

    /// Start with explicit settings (check them with [`Settings::validate`]).
    pub fn start_with(procedure: &Procedure, tag: &Tag, settings: Settings) -> Session {
        Session {
            procedure: procedure.id.clone(),
            symptom: procedure.symptom.clone(),
            title: procedure.title.clone(),
            tag: tag.number.clone(),
            cautions: CAUTIONS.iter().map(|c| c.to_string()).collect(),
            settings,
            current: Some(procedure.start.clone()),
            steps: Vec::new(),
            measurements: BTreeMap::new(),
            partial: BTreeMap::new(),
            findings: Vec::new(),
            conclusion: None,
            technician_conclusion: String::new(),
            before_leaving: None,
        }
    }

    /// Carry on with a saved session: the procedure must be the one it was started with
    /// and still contain its current step.
    pub fn resume(json: &str, procedure: &Procedure) -> Result<Session> {
        let session: Session = serde_json::from_str(json)
            .map_err(|e| FieldError::new("session", format!("cannot be read: {e}")))?;
        if session.procedure != procedure.id {
            return Err(FieldError::new(
                "session",
                format!(
                    "was started with procedure '{}', not '{}'",
                    session.procedure, procedure.id
                ),
            ));
        }
        if let Some(id) = &session.current {
            if procedure.step(id).is_none() {
                return Err(FieldError::new(
                    "session",
                    format!(
                        "waits at step '{id}', which procedure '{}' no longer has",
                        procedure.id
                    ),
                ));
            }
        }
        Ok(session)
    }

    /// The session as JSON, to save or to log.
    pub fn to_json(&self) -> Result<String> {
        serde_json::to_string(self)
            .map_err(|e| FieldError::new("session", format!("cannot be written: {e}")))
    }

    /// True once a conclusion is reached.
    pub fn is_finished(&self) -> bool {
        self.current.is_none()
    }

    /// The step waiting for an answer.
    pub fn current_step<'p>(&self, procedure: &'p Procedure) -> Option<&'p Step> {
        self.current.as_deref().and_then(|id| procedure.step(id))
    }

    /// Measurements the current step still needs (those not already taken this session).
    pub fn pending(&self, procedure: &Procedure) -> Vec<Measurement> {
        match self.current_step(procedure) {
            Some(step) => step
                .measurements()
                .iter()
                .copied()
                .filter(|m| !self.measurements.contains_key(m) && !self.partial.contains_key(m))
                .collect(),
            None => Vec::new(),
        }
    }

    /// All findings so far.
    pub fn findings(&self) -> &[Finding] {
        &self.findings
    }

    /// Record the technician's own conclusion.
    pub fn conclude(&mut self, text: &str) {
        self.technician_conclusion = text.trim().to_string();
    }

    /// Record what was put right before leaving the loop: `done` were ticked (or named on
    /// the command line), the rest are recorded as not done.
    pub fn left(&mut self, done: &[Item]) {
        self.before_leaving = Some(LeaveList::from_done(done));
    }

    /// Give the answer to the current step and move on. Values for a measure step may come
    /// in several calls; the step runs once all of its measurements are known. Measure
    /// steps with nothing left to ask run at once (pass an empty map).
    pub fn answer(&mut self, procedure: &Procedure, tag: &Tag, answer: Answer) -> Result<Progress> {
        let step = self
            .current_step(procedure)
            .ok_or_else(|| FieldError::new("session", "is finished; there is no step to answer"))?;
        match (&step.kind, answer) {
            (StepKind::Question { yes, no, .. }, Answer::YesNo(a)) => {
                let next = if a { yes } else { no }.clone();
                self.steps.push(StepRecord {
                    step: step.id.clone(),
                    instruction: step.instruction.clone(),
                    cautions: step.cautions.clone(),
                    measured: BTreeMap::new(),
                    answer: Some(a),
                    outcome: if a { "yes" } else { "no" }.to_string(),
                });
                self.go_to(procedure, next)
            }
            (StepKind::Question { question, .. }, Answer::Values(_)) => Err(FieldError::new(
                "answer",
                format!("step '{}' asks a yes/no question: {question}", step.id),
            )),
            (StepKind::Measure { .. }, Answer::YesNo(_)) => Err(FieldError::new(
                "answer",
                format!("step '{}' asks for measurements, not yes/no", step.id),
            )),
            (
                StepKind::Measure {
                    measure, evaluate, ..
                },
                Answer::Values(values),
            ) => {
                for (m, v) in &values {
                    if !measure.contains(m) {
                        return Err(FieldError::new(
                            m.key(),
                            format!("is not asked for at step '{}'", step.id),
                        ));
                    }
                    m.accept(*v)?;
                }
                self.partial.extend(values);
                if !self.pending(procedure).is_empty() {
                    return Ok(Progress::Next(step.id.clone()));
                }
                // Every measurement is in: evaluate on everything known.
                let mut known: BTreeMap<Measurement, f64> = self
                    .measurements
                    .iter()
                    .map(|(m, r)| (*m, r.value))
                    .collect();
                known.extend(self.partial.iter().map(|(m, v)| (*m, *v)));
                let (outcome, mut findings) = match evaluate {
                    Some(e) => {
                        let done = e.evaluate(tag, &known, &self.settings)?;
                        (done.outcome.to_string(), done.findings)
                    }
                    None => ("otherwise".to_string(), Vec::new()),
                };
                let next = step.next_for(&outcome).map(str::to_string).ok_or_else(|| {
                    FieldError::new(
                        format!("step {}", step.id),
                        format!("has no branch for outcome '{outcome}'"),
                    )
                })?;
                let measured: BTreeMap<Measurement, Recorded> = std::mem::take(&mut self.partial)
                    .into_iter()
                    .map(|(m, v)| {
                        (
                            m,
                            Recorded {
                                value: v,
                                unit: m.unit(tag),
                            },
                        )
                    })
                    .collect();
                self.measurements.extend(measured.clone());
                for f in &mut findings {
                    f.step = step.id.clone();
                }
                self.findings.extend(findings);
                self.steps.push(StepRecord {
                    step: step.id.clone(),
                    instruction: step.instruction.clone(),
                    cautions: step.cautions.clone(),
                    measured,
                    answer: None,
                    outcome,
                });
                self.go_to(procedure, next)
            }
            (StepKind::Conclusion { .. }, _) => Err(FieldError::new(
                "session",
                "is at a conclusion; there is nothing to answer",
            )),
        }
    }

    /// Move to `id`; a conclusion finishes the session.
    fn go_to(&mut self, procedure: &Procedure, id: String) -> Result<Progress> {
        let step = procedure
            .step(&id)
            .ok_or_else(|| FieldError::new("procedure", format!("has no step '{id}'")))?;
        if let StepKind::Conclusion { text } = &step.kind {
            let c = Conclusion {
                step: id,
                text: text.clone(),
                cautions: step.cautions.clone(),
            };
            self.conclusion = Some(c.clone());
            self.current = None;
            return Ok(Progress::Concluded(c));
        }
        self.current = Some(id.clone());
        Ok(Progress::Next(id))
    }

    /// Run as far as `sheet` allows: answer each step from it until the procedure
    /// concludes or a value is missing (then the session waits at that step).
    pub fn run_sheet(
        &mut self,
        procedure: &Procedure,
        tag: &Tag,
        sheet: &AnswerSheet,
    ) -> Result<Progress> {
        // A procedure has no loops, so it ends within as many answers as it has steps.
        for _ in 0..=procedure.steps.len() {
            let Some(step) = self.current_step(procedure) else {
                break;
            };
            let answer = match &step.kind {
                StepKind::Question { .. } => match sheet.questions.get(&step.id) {
                    Some(a) => Answer::YesNo(*a),
                    None => return Ok(Progress::Next(step.id.clone())),
                },
                StepKind::Measure { .. } => {
                    let pending = self.pending(procedure);
                    if pending.iter().any(|m| !sheet.values.contains_key(m)) {
                        return Ok(Progress::Next(step.id.clone()));
                    }
                    Answer::Values(pending.iter().map(|m| (*m, sheet.values[m])).collect())
                }
                StepKind::Conclusion { .. } => break,
            };
            self.answer(procedure, tag, answer)?;
        }
        if let Some(text) = &sheet.conclusion {
            self.conclude(text);
        }
        Ok(match (&self.conclusion, &self.current) {
            (Some(c), None) => Progress::Concluded(c.clone()),
            (_, Some(id)) => Progress::Next(id.clone()),
            (None, None) => Progress::Next(String::new()),
        })
    }
}

/// Answers prepared in advance (for scripts and tests): measurement values by key, yes/no
/// answers by question step id, and an optional conclusion in the technician's words.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct AnswerSheet {
    /// Values by measurement.
    pub values: BTreeMap<Measurement, f64>,
    /// Yes/no by step id.
    pub questions: BTreeMap<String, bool>,
    /// The technician's conclusion.
    pub conclusion: Option<String>,
}

impl AnswerSheet {
    /// Read a JSON object: measurement keys with numbers (or text such as `"9,0 V"`), step
    /// ids with `true`/`false` or `"yes"`/`"no"`, and `"conclusion"` with text.
    pub fn from_json(text: &str, tag: &Tag) -> Result<AnswerSheet> {
        let value: serde_json::Value = serde_json::from_str(text)
            .map_err(|e| FieldError::new("answers", format!("is not valid JSON: {e}")))?;
        let obj = value.as_object().ok_or_else(|| {
            FieldError::new(
                "answers",
                "must be a JSON object of measurement keys and answers",
            )
        })?;
        let mut sheet = AnswerSheet::default();
        for (key, v) in obj {
            if key == "conclusion" {
                sheet.conclusion = v.as_str().map(str::to_string);
                continue;
            }
            if let Some(m) = Measurement::from_key(key) {
                let value = match v {
                    serde_json::Value::Number(n) => m.accept(n.as_f64().unwrap_or(f64::NAN))?,
                    serde_json::Value::String(s) => m.parse(tag, s)?,
                    _ => {
                        return Err(FieldError::new(
                            key.as_str(),
                            format!("must be a number in {}", m.unit(tag)),
                        ))
                    }
                };
                sheet.values.insert(m, value);
                continue;
            }
            let yes = match v {
                serde_json::Value::Bool(b) => *b,
                serde_json::Value::String(s) => match s.trim().to_lowercase().as_str() {
                    "yes" | "y" | "true" => true,
                    "no" | "n" | "false" => false,
                    _ => {
                        return Err(FieldError::new(
                            key.as_str(),
                            format!("'{s}' is not yes or no"),
                        ))
                    }
                },
                _ => return Err(FieldError::new(
                    key.as_str(),
                    "is neither a measurement key nor a question step; a question takes yes or no",
                )),
            };
            sheet.questions.insert(key.clone(), yes);
        }
        Ok(sheet)
    }
}
