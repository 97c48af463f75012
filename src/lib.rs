//! loopside core: computations for 4–20 mA loop work.

pub mod level;
pub mod rtd;
pub mod thermocouple;
