//! Guided fault-finding: from a symptom, through the technician's measurements, to
//! findings worked out with the tag's own range and loop.
//!
//! - [`procedure`] — procedures as data (JSON files in `procedures/`, embedded at build
//!   time; a plant can load its own) and the checks every file must pass;
//! - [`measure`] — the catalogue of measurements a step can ask for, with units;
//! - [`evaluate`] — the typed evaluations that turn measurements into findings (NE 43 band,
//!   voltage budget, leakage, HART window, noise);
//! - [`mismatch`] — which configuration mistake explains a reading that disagrees;
//! - [`session`] — one run of a procedure on a tag, saved and resumed as plain data.
//!
//! ```
//! use loopside::diagnose::{procedure, session::{Answer, Progress, Session}, measure::Measurement};
//! use loopside::{scale::Scale, tag::Tag};
//! # fn main() -> Result<(), Box<dyn std::error::Error>> {
//! let tag = Tag::new("PT-204", Scale::linear(0.0, 10.0, "bar")?)?;
//! let p = procedure::find("stuck-low", &[])?;
//! let mut s = Session::start(&p, &tag);
//! assert_eq!(s.pending(&p), vec![Measurement::TxMa]);
//! let values = [(Measurement::TxMa, 0.0)].into_iter().collect();
//! let next = s.answer(&p, &tag, Answer::Values(values))?;
//! assert!(matches!(next, Progress::Next(_)));
//! assert_eq!(s.findings()[0].code, "band-no-loop-current");
//! # Ok(())
//! # }
//! ```

pub mod evaluate;
pub mod measure;
pub mod mismatch;
pub mod procedure;
pub mod session;

pub use evaluate::{Evaluation, Finding, Settings};
pub use measure::Measurement;
pub use procedure::{Procedure, Step, StepKind};
pub use session::{Answer, AnswerSheet, Progress, Session, LOG_KIND};

/// The built-in symptom names, in the order a menu shows them, with their titles.
pub const SYMPTOMS: [(&str, &str); 7] = [
    ("stuck-low", "Reading stuck at or below zero"),
    ("pegged-high", "Reading pegged high"),
    ("steady-wrong", "Reading steady but wrong"),
    ("short-of-top", "Reading falls short or clips near the top"),
    ("noisy", "Reading noisy or jumping"),
    ("disagree", "Indicator and control system disagree"),
    ("hart-no-answer", "HART device will not answer"),
];
