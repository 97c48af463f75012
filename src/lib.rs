//! # loopside core
//!
//! Computations for instrument technicians working on 4–20 mA current loops, with no UI
//! types, no global state and no I/O outside the store. Start with:
//!
//! - [`number`] — reading numbers as typed (`12,5`, `250 ohm`);
//! - [`units`] — engineering units and NIST SP 811 factors;
//! - [`error`] — the typed error every computation returns;
//! - [`scale`], [`signal`], [`budget`], [`wire`], [`resistor`] — the loop computations;
//! - [`tag`] — one loop in the register; [`display`] — rounding for people;
//! - [`cli`] — the command-line front (prints; not part of the pure core);
//! - [`rtd`], [`thermocouple`] and [`level`] — what a temperature or DP level transmitter
//!   should see for a given temperature or level;
//! - [`intrinsic`] — intrinsic safety of a loop by the entity concept (barrier or isolator,
//!   field devices, cable);
//! - [`calibration`] — trip and alarm tests (and what comes around a loop check);
//! - [`stroke`] and [`valve`] — a control valve's stroke check on an output loop (split
//!   range too), and what a tag records of its valve;
//! - [`caution`] and [`leave`] — the cautions shown before work on a loop, and the
//!   "before you leave" list recorded after it;
//! - [`action`] — one function per action a technician takes (notes, tags, checks,
//!   sessions, hand-overs), called by the command line and the app alike;
//! - [`view`] — what each screen shows, worked out and formatted (no UI toolkit); the
//!   Slint app itself is `app` (feature `ui`), Android's entry `android`.

#![warn(missing_docs)]

pub mod error;
pub mod form;
pub mod number;
pub mod units;

pub use error::{FieldError, Result};
pub mod action;
pub mod budget;
pub mod calibration;
pub mod caution;
pub mod check;
pub mod cli;
pub mod data_folder;
pub mod demo;
pub mod diagnose;
pub mod display;
pub mod intrinsic;
pub mod journal;
pub mod leave;
pub mod level;
pub mod licence;
pub mod report;
pub mod resistor;
pub mod rtd;
pub mod scale;
pub mod sensor;
pub mod signal;
pub mod store;
pub mod stroke;
pub mod tag;
pub mod thermocouple;
pub mod valve;
pub mod view;
pub mod wire;

#[cfg(feature = "ui")]
pub mod app;

#[cfg(all(feature = "ui", target_os = "android"))]
pub mod android;
