//! Calibration work around the loop check: what a technician proves besides the five
//! points, and how good the proof is.
//!
//! - [`trip`] — a trip or alarm test: setpoint, direction, trip and reset values over one
//!   or more runs → trip error, deadband and repeatability in % of span, pass or FAIL, and
//!   the current to inject for the setpoint (from the tag's own [`crate::scale::Scale`]);
//! - [`reference`] — reference instruments as the store keeps them, with their accuracy
//!   as the data sheet states it (% of reading + % of full scale or range + fixed). A
//!   loop check judged with them (RSS, TUR, the ILAC-G8 decision rule) is
//!   `crate::check::uncertainty`, beside the check it judges.
//! - [`history`] — the loop checks in a tag's log as planning reads them (date, stage,
//!   errors);
//! - [`due`] — what is due: interval, last calibration, due date, overdue or due soon;
//! - [`drift`] — as-found errors over the visits, least-squares rate, when the trend
//!   reaches the tolerance, a suggested interval from a stated policy.
//!
//! This module computes: results are numbers and codes. The words are written once in
//! `crate::view::wording`.

pub mod drift;
pub mod due;
pub mod history;
pub mod reference;
pub mod trip;
