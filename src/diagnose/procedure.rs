//! Fault-finding procedures as data: what a file may say, and the checks it must pass.
//!
//! A procedure is a JSON file: a symptom, a start step and a list of steps. A step is one
//! of three kinds:
//!
//! - **measure** — an instruction, the measurements to take (keys from
//!   [`super::measure`]), optionally an evaluation (names from [`super::evaluate`]), and
//!   `next`: the step to go to for each outcome of the evaluation (`otherwise` covers the
//!   rest; a step without an evaluation has only `otherwise`);
//! - **question** — an instruction and a yes/no question, with `next.yes` and `next.no`;
//! - **conclusion** — the end of a path: what the technician most likely has, and what to
//!   do about it.
//!
//! Any step may carry `cautions`: the safety words for the risky thing that step asks for
//! (opening the loop, opening a field housing, isolating or venting a transmitter, an
//! insulation test, a changed polling address …). They are shown at that step, beside its
//! instruction, and kept in the session record, so the warning is read where the work is
//! done rather than only once at the start.
//!
//! Loading checks that the procedure can be followed to the end whatever is measured:
//! names exist, every outcome has a branch and every branch can be taken, every target
//! exists, every step can be reached from the start, there are no loops (so every path
//! ends in a conclusion), and every evaluation's measurements are taken on every path that
//! leads to it. A plant can therefore add its own file without new code, and a mistake in
//! it is reported with the step's id before a technician meets it in the field.

use super::evaluate::Evaluation;
use super::measure::Measurement;
use crate::budget::topology::Topology;
use crate::error::{FieldError, Result};
use crate::tag::Tag;
use serde::{Deserialize, Serialize};
use std::collections::{BTreeMap, BTreeSet};

/// The `format` value this version of loopside reads.
pub const FORMAT: u32 = 1;

/// The built-in procedure files, embedded at build time: (file name, JSON).
/// The procedures written for every loop or for two- and three-wire transmitters come
/// first, so that [`find`] by symptom name gives them; those for four-wire transmitters and
/// analog outputs follow ([`find_for`] picks them by the tag's loop).
pub const BUILTIN_SOURCES: [(&str, &str); 13] = [
    (
        "stuck-low.json",
        include_str!("../../procedures/stuck-low.json"),
    ),
    (
        "pegged-high.json",
        include_str!("../../procedures/pegged-high.json"),
    ),
    (
        "steady-wrong.json",
        include_str!("../../procedures/steady-wrong.json"),
    ),
    (
        "short-of-top.json",
        include_str!("../../procedures/short-of-top.json"),
    ),
    ("noisy.json", include_str!("../../procedures/noisy.json")),
    (
        "disagree.json",
        include_str!("../../procedures/disagree.json"),
    ),
    (
        "hart-no-answer.json",
        include_str!("../../procedures/hart-no-answer.json"),
    ),
    (
        "stuck-low-four-wire.json",
        include_str!("../../procedures/stuck-low-four-wire.json"),
    ),
    (
        "pegged-high-four-wire.json",
        include_str!("../../procedures/pegged-high-four-wire.json"),
    ),
    (
        "short-of-top-four-wire.json",
        include_str!("../../procedures/short-of-top-four-wire.json"),
    ),
    (
        "stuck-low-output.json",
        include_str!("../../procedures/stuck-low-output.json"),
    ),
    (
        "pegged-high-output.json",
        include_str!("../../procedures/pegged-high-output.json"),
    ),
    (
        "short-of-top-output.json",
        include_str!("../../procedures/short-of-top-output.json"),
    ),
];

/// A procedure file as written.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct ProcedureFile {
    /// File format version; must be [`FORMAT`].
    pub format: u32,
    /// Unique id, e.g. `stuck-low`.
    pub id: String,
    /// The symptom name it answers (what `--symptom` matches).
    pub symptom: String,
    /// Short title, e.g. "Reading stuck at or below zero".
    pub title: String,
    /// One or two sentences on when to use it.
    #[serde(default)]
    pub summary: String,
    /// Id of the first step.
    pub start: String,
    /// The loop topologies it is written for (codes of
    /// [`crate::budget::topology::Topology`]: `two-wire`, `four-wire`, `analog-output` …);
    /// empty for every loop.
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub loops: Vec<String>,
    /// The steps.
    pub steps: Vec<StepFile>,
}

/// One step as written.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct StepFile {
    /// Unique id within the procedure.
    pub id: String,
    /// What to do, in plain words.
    #[serde(default)]
    pub instruction: String,
    /// Measurement keys to take.
    #[serde(default)]
    pub measure: Vec<String>,
    /// Evaluation to run.
    #[serde(default)]
    pub evaluate: Option<String>,
    /// A yes/no question.
    #[serde(default)]
    pub question: Option<String>,
    /// Outcome (or `yes`/`no`, or `otherwise`) → next step id.
    #[serde(default)]
    pub next: BTreeMap<String, String>,
    /// The end of a path: the likely cause and what to do.
    #[serde(default)]
    pub conclusion: Option<String>,
    /// Safety cautions for what this step asks for, shown with it.
    #[serde(default)]
    pub cautions: Vec<String>,
}

/// What a step does.
#[derive(Debug, Clone, PartialEq)]
pub enum StepKind {
    /// Take measurements, evaluate, branch.
    Measure {
        /// Measurements to take, in order.
        measure: Vec<Measurement>,
        /// Evaluation to run (None: go to `otherwise`).
        evaluate: Option<Evaluation>,
        /// Outcome → next step id (may include `otherwise`).
        next: BTreeMap<String, String>,
    },
    /// A yes/no question.
    Question {
        /// The question.
        question: String,
        /// Step after "yes".
        yes: String,
        /// Step after "no".
        no: String,
    },
    /// The end of a path.
    Conclusion {
        /// The likely cause and what to do.
        text: String,
    },
}

/// A validated step.
#[derive(Debug, Clone, PartialEq)]
pub struct Step {
    /// Id.
    pub id: String,
    /// What to do.
    pub instruction: String,
    /// What kind of step.
    pub kind: StepKind,
    /// Safety cautions for what this step asks for, shown with it (may be empty).
    pub cautions: Vec<String>,
}

impl Step {
    /// The step to go to for `outcome` (falls back to `otherwise`).
    pub fn next_for(&self, outcome: &str) -> Option<&str> {
        match &self.kind {
            StepKind::Measure { next, .. } => next
                .get(outcome)
                .or_else(|| next.get("otherwise"))
                .map(String::as_str),
            StepKind::Question { yes, no, .. } => match outcome {
                "yes" => Some(yes),
                "no" => Some(no),
                _ => None,
            },
            StepKind::Conclusion { .. } => None,
        }
    }

    /// Ids of the steps this one can lead to.
    pub fn targets(&self) -> Vec<&str> {
        match &self.kind {
            StepKind::Measure { next, .. } => next.values().map(String::as_str).collect(),
            StepKind::Question { yes, no, .. } => vec![yes.as_str(), no.as_str()],
            StepKind::Conclusion { .. } => Vec::new(),
        }
    }

    /// Measurements this step takes.
    pub fn measurements(&self) -> &[Measurement] {
        match &self.kind {
            StepKind::Measure { measure, .. } => measure,
            _ => &[],
        }
    }
}

/// A validated procedure, ready to run.
#[derive(Debug, Clone, PartialEq)]
pub struct Procedure {
    /// Unique id.
    pub id: String,
    /// Symptom name.
    pub symptom: String,
    /// Title.
    pub title: String,
    /// When to use it.
    pub summary: String,
    /// First step id.
    pub start: String,
    /// The loop topologies it is written for; empty for every loop. The physics of a
    /// symptom can differ with who drives the current: a four-wire transmitter has no
    /// lift-off voltage, and no current on an output loop points at the output card, its
    /// configuration or the device.
    pub loops: Vec<Topology>,
    /// Steps, in file order.
    pub steps: Vec<Step>,
}

fn err(field: &str, reason: impl Into<String>) -> FieldError {
    FieldError::new(field, reason)
}

impl Procedure {
    /// Read and validate a procedure file.
    pub fn from_json(text: &str) -> Result<Procedure> {
        let file: ProcedureFile = serde_json::from_str(text)
            .map_err(|e| err("procedure", format!("is not a valid procedure file: {e}")))?;
        Procedure::from_file(file)
    }

    /// Validate a parsed procedure file.
    pub fn from_file(file: ProcedureFile) -> Result<Procedure> {
        if file.format != FORMAT {
            return Err(err(
                "format",
                format!("must be {FORMAT}, got {}", file.format),
            ));
        }
        for (field, text) in [
            ("id", &file.id),
            ("symptom", &file.symptom),
            ("title", &file.title),
        ] {
            if text.trim().is_empty() {
                return Err(err(field, "is empty"));
            }
        }
        if file.steps.is_empty() {
            return Err(err("steps", "needs at least one step"));
        }
        let mut steps = Vec::with_capacity(file.steps.len());
        let mut ids = BTreeSet::new();
        for raw in &file.steps {
            let step = validate_step(raw)?;
            if !ids.insert(step.id.clone()) {
                return Err(err(
                    &format!("step {}", step.id),
                    "id is used by more than one step",
                ));
            }
            steps.push(step);
        }
        let mut loops = Vec::with_capacity(file.loops.len());
        for code in &file.loops {
            let t = Topology::ALL
                .into_iter()
                .find(|t| t.code() == code.trim())
                .ok_or_else(|| {
                    let codes: Vec<&str> = Topology::ALL.iter().map(|t| t.code()).collect();
                    err(
                        "loops",
                        format!(
                            "'{}' is not a loop topology; use one of {}",
                            code.trim(),
                            codes.join(", ")
                        ),
                    )
                })?;
            if !loops.contains(&t) {
                loops.push(t);
            }
        }
        let procedure = Procedure {
            loops,
            id: file.id.trim().to_string(),
            symptom: file.symptom.trim().to_string(),
            title: file.title.trim().to_string(),
            summary: file.summary.trim().to_string(),
            start: file.start.trim().to_string(),
            steps,
        };
        procedure.check_graph()?;
        Ok(procedure)
    }

    /// Whether it is written for a loop built as `topology` (a procedure with no `loops`
    /// is written for every loop).
    pub fn fits(&self, topology: Topology) -> bool {
        self.loops.is_empty() || self.loops.contains(&topology)
    }

    /// The step with this id.
    pub fn step(&self, id: &str) -> Option<&Step> {
        self.steps.iter().find(|s| s.id == id)
    }

    fn check_graph(&self) -> Result<()> {
        if self.step(&self.start).is_none() {
            return Err(err(
                "start",
                format!("names step '{}', which does not exist", self.start),
            ));
        }
        for s in &self.steps {
            for t in s.targets() {
                if self.step(t).is_none() {
                    return Err(err(
                        &format!("step {}", s.id),
                        format!("goes to '{t}', which does not exist"),
                    ));
                }
            }
        }
        let order = self.topological_order()?;
        if order.len() != self.steps.len() {
            let unreachable: Vec<&str> = self
                .steps
                .iter()
                .filter(|s| !order.contains(&s.id.as_str()))
                .map(|s| s.id.as_str())
                .collect();
            return Err(err(
                "steps",
                format!(
                    "cannot be reached from the start: {}",
                    unreachable.join(", ")
                ),
            ));
        }
        // Measurements known on every path into each step.
        let mut known_in: BTreeMap<&str, BTreeSet<Measurement>> = BTreeMap::new();
        known_in.insert(self.start.as_str(), BTreeSet::new());
        for id in order {
            let Some(step) = self.step(id) else { continue };
            let mut known = known_in.get(id).cloned().unwrap_or_default();
            known.extend(step.measurements().iter().copied());
            if let StepKind::Measure {
                evaluate: Some(e), ..
            } = &step.kind
            {
                for m in e.inputs() {
                    if !known.contains(m) {
                        return Err(err(
                            &format!("step {}", step.id),
                            format!(
                                "evaluation '{}' needs '{}', which is not measured on every path to this step",
                                e.key(),
                                m.key()
                            ),
                        ));
                    }
                }
            }
            for t in step.targets() {
                let entry = known_in.entry(t).or_insert_with(|| known.clone());
                *entry = entry.intersection(&known).copied().collect();
            }
        }
        Ok(())
    }

    /// Steps reachable from the start, each after every step that leads to it; an error
    /// if the steps form a loop.
    fn topological_order(&self) -> Result<Vec<&str>> {
        // Depth-first from the start: colour 1 = on the current path, 2 = done.
        let mut colour: BTreeMap<&str, u8> = BTreeMap::new();
        let mut post: Vec<&str> = Vec::new();
        let mut stack: Vec<(&str, usize)> = vec![(self.start.as_str(), 0)];
        colour.insert(self.start.as_str(), 1);
        while let Some((id, child)) = stack.pop() {
            let targets = self.step(id).map(Step::targets).unwrap_or_default();
            if child < targets.len() {
                stack.push((id, child + 1));
                let t = targets[child];
                match colour.get(t) {
                    Some(1) => {
                        return Err(err(
                            &format!("step {id}"),
                            format!("goes back to '{t}', making a loop; a procedure must always move on toward a conclusion"),
                        ))
                    }
                    Some(_) => {}
                    None => {
                        colour.insert(t, 1);
                        stack.push((t, 0));
                    }
                }
            } else {
                colour.insert(id, 2);
                post.push(id);
            }
        }
        post.reverse();
        Ok(post)
    }
}

fn validate_step(raw: &StepFile) -> Result<Step> {
    let id = raw.id.trim().to_string();
    if id.is_empty() {
        return Err(err("step", "has an empty id"));
    }
    let field = format!("step {id}");
    let mut cautions = Vec::with_capacity(raw.cautions.len());
    for c in &raw.cautions {
        if c.trim().is_empty() {
            return Err(err(&field, "has an empty caution"));
        }
        cautions.push(c.trim().to_string());
    }
    let has_measure = !raw.measure.is_empty() || raw.evaluate.is_some();
    let kinds = [
        raw.conclusion.is_some(),
        raw.question.is_some(),
        has_measure,
    ]
    .iter()
    .filter(|k| **k)
    .count();
    if kinds != 1 {
        return Err(err(
            &field,
            "must be exactly one of: a conclusion, a question, or measurements (with or without an evaluation)",
        ));
    }
    if let Some(text) = &raw.conclusion {
        if text.trim().is_empty() {
            return Err(err(&field, "has an empty conclusion"));
        }
        if !raw.next.is_empty() {
            return Err(err(&field, "is a conclusion and must not have next steps"));
        }
        return Ok(Step {
            id,
            instruction: raw.instruction.trim().to_string(),
            kind: StepKind::Conclusion {
                text: text.trim().to_string(),
            },
            cautions,
        });
    }
    if raw.instruction.trim().is_empty() {
        return Err(err(&field, "needs an instruction"));
    }
    if let Some(q) = &raw.question {
        let keys: BTreeSet<&str> = raw.next.keys().map(String::as_str).collect();
        if keys != BTreeSet::from(["yes", "no"]) || q.trim().is_empty() {
            return Err(err(
                &field,
                "a question needs its text and exactly two branches, next.yes and next.no",
            ));
        }
        return Ok(Step {
            id,
            instruction: raw.instruction.trim().to_string(),
            kind: StepKind::Question {
                question: q.trim().to_string(),
                yes: raw.next["yes"].trim().to_string(),
                no: raw.next["no"].trim().to_string(),
            },
            cautions,
        });
    }
    let mut measure = Vec::new();
    for key in &raw.measure {
        let m = Measurement::from_key(key).ok_or_else(|| {
            err(
                &field,
                format!(
                    "measures '{key}', which is not a known measurement; known: {}",
                    super::measure::ALL.map(|m| m.key()).join(", ")
                ),
            )
        })?;
        if measure.contains(&m) {
            return Err(err(&field, format!("measures '{key}' twice")));
        }
        measure.push(m);
    }
    let evaluate = match &raw.evaluate {
        Some(key) => Some(Evaluation::from_key(key).ok_or_else(|| {
            err(
                &field,
                format!(
                    "evaluates '{key}', which is not a known evaluation; known: {}",
                    super::evaluate::ALL.map(|e| e.key()).join(", ")
                ),
            )
        })?),
        None => None,
    };
    let next: BTreeMap<String, String> = raw
        .next
        .iter()
        .map(|(k, v)| (k.trim().to_string(), v.trim().to_string()))
        .collect();
    match evaluate {
        Some(e) => {
            let outcomes = e.outcomes();
            for key in next.keys() {
                if key != "otherwise" && !outcomes.contains(&key.as_str()) {
                    return Err(err(
                        &field,
                        format!(
                            "branches on '{key}', which '{}' never gives; its outcomes are {}",
                            e.key(),
                            outcomes.join(", ")
                        ),
                    ));
                }
            }
            let uncovered: Vec<&str> = outcomes
                .iter()
                .copied()
                .filter(|o| !next.contains_key(*o))
                .collect();
            if next.contains_key("otherwise") && uncovered.is_empty() {
                return Err(err(
                    &field,
                    "has an 'otherwise' branch that can never be taken (every outcome has its own)",
                ));
            }
            if !next.contains_key("otherwise") && !uncovered.is_empty() {
                return Err(err(
                    &field,
                    format!(
                        "has no branch for outcome(s) {} of '{}'; add them or 'otherwise'",
                        uncovered.join(", "),
                        e.key()
                    ),
                ));
            }
        }
        None => {
            if next.len() != 1 || !next.contains_key("otherwise") {
                return Err(err(
                    &field,
                    "without an evaluation needs exactly one branch, next.otherwise",
                ));
            }
        }
    }
    Ok(Step {
        id,
        instruction: raw.instruction.trim().to_string(),
        kind: StepKind::Measure {
            measure,
            evaluate,
            next,
        },
        cautions,
    })
}

/// The built-in procedures, validated.
pub fn builtin() -> Result<Vec<Procedure>> {
    BUILTIN_SOURCES
        .iter()
        .map(|(name, text)| {
            Procedure::from_json(text)
                .map_err(|e| FieldError::new(format!("{name}: {}", e.field), e.reason))
        })
        .collect()
}

/// How a tag's loop is built, for choosing its procedures: from its loop data, or a
/// two-wire transmitter on a DC supply (the loop most tags are) when it has none.
pub fn loop_of(tag: &Tag) -> Topology {
    tag.loop_config
        .as_ref()
        .map_or(Topology::TwoWireSupply, |c| c.wiring.topology())
}

/// The procedures offered for a loop built as `topology`, one per symptom, in the order
/// given (a plant's own first, then the built-ins): for each symptom, the first procedure
/// that fits the topology (written for it by name, or for every loop), else (none of that
/// symptom fits, for example a loop recorded with two sources) the first of that symptom.
pub fn for_loop(procedures: &[Procedure], topology: Topology) -> Vec<Procedure> {
    let mut symptoms: Vec<&str> = Vec::new();
    for p in procedures {
        if !symptoms.contains(&p.symptom.as_str()) {
            symptoms.push(&p.symptom);
        }
    }
    symptoms
        .into_iter()
        .filter_map(|symptom| {
            let of: Vec<&Procedure> = procedures.iter().filter(|p| p.symptom == symptom).collect();
            of.iter()
                .find(|p| p.fits(topology))
                .or_else(|| of.first())
                .map(|p| (*p).clone())
        })
        .collect()
}

/// The procedure for `symptom` on a loop built as `topology`: a symptom name picks as
/// [`for_loop`] does; any other procedure id names that procedure whatever the loop. Looks first in
/// `extra` (a plant's own files) and then in the built-ins.
pub fn find_for(symptom: &str, topology: Topology, extra: &[Procedure]) -> Result<Procedure> {
    let wanted = symptom.trim();
    let mut all: Vec<Procedure> = extra.to_vec();
    all.extend(builtin()?);
    if let Some(p) = for_loop(&all, topology)
        .into_iter()
        .find(|p| p.symptom == wanted)
    {
        return Ok(p);
    }
    find(wanted, extra)
}

/// The procedure for `symptom` (matched on symptom name or id), looking first in
/// `extra` (a plant's own files) and then in the built-ins.
pub fn find(symptom: &str, extra: &[Procedure]) -> Result<Procedure> {
    let wanted = symptom.trim();
    let builtins = builtin()?;
    let all: Vec<&Procedure> = extra.iter().chain(builtins.iter()).collect();
    all.iter()
        .find(|p| p.symptom == wanted || p.id == wanted)
        .map(|p| (*p).clone())
        .ok_or_else(|| {
            let mut names: Vec<&str> = all.iter().map(|p| p.symptom.as_str()).collect();
            names.dedup();
            FieldError::new(
                "symptom",
                format!(
                    "'{wanted}' is not a known symptom; use one of {}",
                    names.join(", ")
                ),
            )
        })
}
