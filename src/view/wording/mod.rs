//! The words above the core, written once: the core returns numbers, codes and the
//! limiting element; these turn them into the sentences the command line prints, the app
//! shows, the log keeps and the report prints.
//!
//! - [`check`] — a loop check's verdict, log text, report section and warnings;
//! - [`drift`] — a tag's drift: visits, trends, rate, the suggested interval and why;
//! - [`due`] — what is due, one line per tag;
//! - [`fault`] — the log text of a fault-finding session;
//! - [`finding`] — what each fault-finding finding means, from its code and detail;
//! - [`intrinsic`] — an intrinsic-safety check: caution, each check, verdict, notes, log
//!   text and report section;
//! - [`trip`] — a trip or alarm test: the caution at the step, verdict, log text, report;
//! - [`uncertainty`] — reference instruments and a check judged with them (TUR, the
//!   ILAC-G8 decision rule);
//! - [`power`] — what limits a loop's voltage budget, its topology and topology faults,
//!   its HART verdict and HART's cable limit;
//! - [`stroke`] — a valve's stroke check: verdict, table lines, log title and text.

pub mod check;
pub mod drift;
pub mod due;
pub mod fault;
pub mod finding;
pub mod intrinsic;
pub mod power;
pub mod stroke;
pub mod trip;
pub mod uncertainty;
