//! Forms: one text → domain parser per form, called by the command line and by the app
//! alike, so a value typed on the ladder and the same value given as a flag at the desk
//! give the same loop, the same scale and the same error.
//!
//! - [`range`] — LRV, URV, unit, signal span and transfer;
//! - [`loop_form`] — supply, sag, transmitter minimum, fault current, series elements, cable;
//! - [`topology`] — how the loop is built, what supplies it, a current source's
//!   compliance, and the cable's capacitance for HART;
//! - [`conductor`] — conductor size and temperature;
//! - [`stroke`] — a valve's stroke check (its own field names, as the core gives them);
//! - [`sensor`] — the temperature sensor (RTD and its wiring, or thermocouple and cold junction);
//! - [`intrinsic`] — an intrinsically safe circuit: barrier or isolator, devices, cable
//!   (its own field names, not the [`Field`] table: values carry unit suffixes);
//! - [`reference`] — a reference instrument: id, unit, range, data-sheet accuracy, due date;
//! - [`trip`] — a trip or alarm test: setpoint, direction, trip and reset values, tolerance
//!   (its own field names, as `intrinsic`);
//! - [`field`] — the one table of field names every form error uses.
//!
//! Each parser returns a [`FormError`] naming a [`Field`]; the screens show its name, the
//! command line adds the flag ([`FormError::on_command_line`]).

pub mod conductor;
pub mod field;
pub mod intrinsic;
pub mod loop_form;
pub mod range;
pub mod reference;
pub mod sensor;
pub mod stroke;
pub mod topology;
pub mod trip;

pub use field::{Field, FormError};
