//! loopside core: computations for 4–20 mA loop work.
