//! Hydrostatic level and the ranging of a DP level transmitter.
//!
//! Responsible for turning a tank's geometry, its liquid's specific gravity and the way the
//! transmitter is piped (open tank, closed tank with a dry or wet reference leg, diaphragm
//! seals with capillaries, interface between two liquids) into the transmitter's lower and
//! upper range values, the span, and the zero elevation or suppression that results; and
//! for the inverse, the level that a measured differential pressure means.
//!
//! Conventions, used everywhere in this module:
//! - Pressures are in pascals; p = ρ·g·h with ρ = SG × 1000 kg/m³ and g = 9.80665 m/s², so
//!   1 m of water at SG 1 is 9.80665 kPa (the conventional metre of water).
//! - Levels (`min_m`, `max_m`, a level read back) are metres above the bottom (HP) tap or
//!   seal — the zero-level tap — as the trade's ranging formulas use them.
//! - For impulse-line mounts the transmitter's elevation `tx_m` is metres above that tap
//!   (a transmitter 1.2 m below it has `tx_m = -1.2`). For seals and interface mounts the
//!   seal, tap and transmitter elevations may be measured from any one datum (grade, the
//!   tank floor); only their differences enter.
//! - DP = P_HP − P_LP at the transmitter. The gas or vapour pressure above the liquid acts
//!   on both sides of a closed tank and cancels; the weight of a gas-filled leg is ignored.
//! - Impulse lines on the HP side are taken as full of process liquid (as a technician
//!   ranging the transmitter assumes); legs and capillaries as full of their fill.
//! - A result with a negative LRV (the zero of DP lies inside the range) is an *elevated
//!   zero*; a positive LRV is a *suppressed zero*, as ISA-51.1 words it. Some texts use the
//!   words the other way round, so each result also states the sign of the LRV.
//! - Swapped HP/LP connections (or a geometry that makes DP fall as level rises) give
//!   negative values and a negative span: they are results, not errors.

use crate::display;
use crate::error::{finite, positive, FieldError, Result};
use crate::units::{self, STANDARD_GRAVITY, WATER_DENSITY_KG_M3};
use serde::{Deserialize, Serialize};

/// Hydrostatic pressure (Pa) at the bottom of a column `height_m` tall of a liquid with
/// specific gravity `sg`: p = SG·1000 kg/m³·9.80665 m/s²·h. A negative height (a point
/// above the liquid's reference) gives a negative pressure.
pub fn head_pa(sg: f64, height_m: f64) -> Result<f64> {
    let sg = check_sg("sg", sg)?;
    let h = finite("height_m", height_m)?;
    Ok(column_pa(sg, h))
}

/// The height (m) of a column of liquid with specific gravity `sg` whose weight makes the
/// pressure `pa` (Pa).
pub fn height_m_from_pa(sg: f64, pa: f64) -> Result<f64> {
    let sg = check_sg("sg", sg)?;
    let p = finite("pa", pa)?;
    Ok(p / (sg * WATER_DENSITY_KG_M3 * STANDARD_GRAVITY))
}

/// [`head_pa`] expressed in any pressure unit the units module knows (`kPa`, `inH2O`,
/// `mbar`, …).
pub fn head_in(sg: f64, height_m: f64, unit: &str) -> Result<f64> {
    let pa = head_pa(sg, height_m)?;
    units::difference_from_pa(pa, unit, "unit")
}

/// How the DP transmitter is connected to the vessel (see the module notes for where each
/// elevation is measured from).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(tag = "mount", rename_all = "kebab-case")]
pub enum Mount {
    /// Open (vented) tank. The HP port is piped from the bottom tap; the LP port is
    /// vented. The transmitter sits `tx_m` above the tap (below it, negative: a suppressed
    /// zero; above it, with the line kept full: an elevated zero).
    OpenTank {
        /// Transmitter elevation above the bottom (HP) tap.
        tx_m: f64,
    },
    /// Closed tank whose LP leg runs to the vapour space and holds only gas.
    DryLeg {
        /// Transmitter elevation above the bottom (HP) tap.
        tx_m: f64,
    },
    /// Closed tank whose LP leg is kept full of a fill liquid (condensate, glycol…) to a
    /// height `leg_m` above the transmitter, normally up to the top tap.
    WetLeg {
        /// Transmitter elevation above the bottom (HP) tap.
        tx_m: f64,
        /// Height of the liquid column in the LP leg, measured up from the transmitter.
        leg_m: f64,
        /// Specific gravity of the leg's fill.
        fill_sg: f64,
    },
    /// Closed tank with diaphragm seals on both taps, joined to the transmitter by
    /// capillaries filled with `fill_sg`. Each capillary adds fill_sg·(seal − transmitter)
    /// of head to its side.
    Seals {
        /// Elevation of the HP (bottom) seal.
        hp_seal_m: f64,
        /// Elevation of the LP (top) seal.
        lp_seal_m: f64,
        /// Elevation of the transmitter.
        tx_m: f64,
        /// Specific gravity of the capillary fill fluid.
        fill_sg: f64,
    },
    /// Open tank with one diaphragm seal on the bottom tap and a capillary to the HP port;
    /// the LP port is vented.
    OpenTankSeal {
        /// Elevation of the HP seal.
        hp_seal_m: f64,
        /// Elevation of the transmitter.
        tx_m: f64,
        /// Specific gravity of the capillary fill fluid.
        fill_sg: f64,
    },
    /// Interface between a heavier liquid (the range's `sg`) below and a lighter liquid
    /// (`upper_sg`) above, with the vessel full above the top tap. Both connections are
    /// seals or legs full of `fill_sg`; the level is the interface's height above the
    /// bottom tap, which must lie between the taps.
    Interface {
        /// Specific gravity of the lighter, upper liquid.
        upper_sg: f64,
        /// Elevation of the bottom (HP) tap or seal.
        hp_tap_m: f64,
        /// Elevation of the top (LP) tap or seal.
        lp_tap_m: f64,
        /// Elevation of the transmitter.
        tx_m: f64,
        /// Specific gravity of the fill in both legs or capillaries.
        fill_sg: f64,
    },
}

impl Mount {
    /// A short name for reports.
    pub fn name(&self) -> &'static str {
        match self {
            Mount::OpenTank { .. } => "open tank",
            Mount::DryLeg { .. } => "closed tank, dry leg",
            Mount::WetLeg { .. } => "closed tank, wet leg",
            Mount::Seals { .. } => "closed tank, two seals",
            Mount::OpenTankSeal { .. } => "open tank, one seal",
            Mount::Interface { .. } => "interface",
        }
    }
}

/// A DP level measurement to range: the liquid, the level range and the piping.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct LevelSetup {
    /// Specific gravity of the process liquid (for an interface: the lower, heavier one).
    pub sg: f64,
    /// Level at 0 % of range (the LRV level), metres above the bottom tap or seal.
    pub min_m: f64,
    /// Level at 100 % of range (the URV level), metres above the bottom tap or seal.
    pub max_m: f64,
    /// How the transmitter is connected.
    pub mount: Mount,
    /// True if the HP and LP ports are connected the other way round.
    pub ports_swapped: bool,
}

/// Where the zero of differential pressure lies relative to the calibrated range (in words:
/// [`crate::view::level::zero_words`]).
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum ZeroShift {
    /// LRV = 0: a zero-based range.
    None,
    /// LRV < 0: the range is an elevated-zero range; `by_pa` is −LRV.
    Elevated {
        /// How far zero DP sits above the LRV (Pa).
        by_pa: f64,
    },
    /// LRV > 0: the range is a suppressed-zero range; `by_pa` is the LRV.
    Suppressed {
        /// How far zero DP sits below the LRV (Pa).
        by_pa: f64,
    },
}

/// The range values a DP level transmitter must be configured with.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct LevelRanging {
    /// Differential pressure at the 0 % level (Pa).
    pub lrv_pa: f64,
    /// Differential pressure at the 100 % level (Pa).
    pub urv_pa: f64,
    /// URV − LRV (Pa); negative when the DP falls as level rises.
    pub span_pa: f64,
    /// Elevation or suppression of zero.
    pub zero: ZeroShift,
}

impl LevelRanging {
    /// (LRV, URV, span) in a pressure unit of the units module.
    pub fn in_unit(&self, unit: &str) -> Result<(f64, f64, f64)> {
        let to = |pa: f64| units::difference_from_pa(pa, unit, "unit");
        Ok((to(self.lrv_pa)?, to(self.urv_pa)?, to(self.span_pa)?))
    }
}

/// LRV, URV, span and zero shift of a DP level transmitter for `setup`.
pub fn range(setup: &LevelSetup) -> Result<LevelRanging> {
    validate(setup)?;
    let lrv_pa = dp_unchecked(setup, setup.min_m);
    let urv_pa = dp_unchecked(setup, setup.max_m);
    let span_pa = urv_pa - lrv_pa;
    // Hydrostatic sums leave round-off of a few µPa where the result should be 0.
    let zero_band = 1e-9 * span_pa.abs().max(1.0);
    let zero = if lrv_pa.abs() <= zero_band {
        ZeroShift::None
    } else if lrv_pa < 0.0 {
        ZeroShift::Elevated { by_pa: -lrv_pa }
    } else {
        ZeroShift::Suppressed { by_pa: lrv_pa }
    };
    Ok(LevelRanging {
        lrv_pa,
        urv_pa,
        span_pa,
        zero,
    })
}

/// The differential pressure (Pa) the transmitter sees with the level at `level_m`.
pub fn dp_at_level(setup: &LevelSetup, level_m: f64) -> Result<f64> {
    validate(setup)?;
    let h = finite("level_m", level_m)?;
    let (low, high) = measurable_levels(setup);
    if h < low || h > high {
        return Err(FieldError::new(
            "level_m",
            format!(
                "{} m is outside the levels this {} installation can see, {}…{} m",
                display::quoted(h),
                setup.mount.name(),
                display::quoted(low),
                display::quoted(high)
            ),
        ));
    }
    Ok(dp_unchecked(setup, h))
}

/// The level (m above the bottom tap or seal) that a measured differential pressure
/// `dp_pa` means:
/// the inverse of the ranging. DPs beyond the LRV…URV range give levels beyond
/// min_m…max_m on the same straight line, as long as they stay within the levels the
/// installation can see (between its taps or seals).
pub fn level_from_dp(setup: &LevelSetup, dp_pa: f64) -> Result<f64> {
    let ranging = range(setup)?;
    let dp = finite("dp_pa", dp_pa)?;
    let per_m = ranging.span_pa / (setup.max_m - setup.min_m);
    let level = setup.min_m + (dp - ranging.lrv_pa) / per_m;
    let (low, high) = measurable_levels(setup);
    let slack = 1e-9 * (1.0 + level.abs());
    if level < low - slack || level > high + slack {
        return Err(FieldError::new(
            "dp_pa",
            format!(
                "{} Pa would mean a level of {} m, outside what this {} installation can see ({}…{} m)",
                display::quoted_fixed(dp, 2),
                display::quoted_fixed(level, 2),
                setup.mount.name(),
                display::quoted(low),
                display::quoted(high)
            ),
        ));
    }
    Ok(level)
}

/// DP at level `h` by the hydrostatics of each mount (setup already validated).
fn dp_unchecked(setup: &LevelSetup, h: f64) -> f64 {
    let sg = setup.sg;
    let dp = match setup.mount {
        Mount::OpenTank { tx_m } | Mount::DryLeg { tx_m } => {
            // HP: liquid above the tap plus the full impulse line down (or up) to the
            // transmitter, i.e. process liquid from the surface to the transmitter.
            column_pa(sg, h - tx_m)
        }
        Mount::WetLeg {
            tx_m,
            leg_m,
            fill_sg,
            ..
        } => column_pa(sg, h - tx_m) - column_pa(fill_sg, leg_m),
        Mount::Seals {
            hp_seal_m,
            lp_seal_m,
            tx_m,
            fill_sg,
        } => {
            let hp = column_pa(sg, h) + column_pa(fill_sg, hp_seal_m - tx_m);
            let lp = column_pa(fill_sg, lp_seal_m - tx_m);
            hp - lp
        }
        Mount::OpenTankSeal {
            hp_seal_m,
            tx_m,
            fill_sg,
        } => column_pa(sg, h) + column_pa(fill_sg, hp_seal_m - tx_m),
        Mount::Interface {
            upper_sg,
            hp_tap_m,
            lp_tap_m,
            tx_m,
            fill_sg,
        } => {
            // Between the taps: heavy liquid below the interface, light above it. The light
            // liquid above the top tap acts on both sides and cancels.
            let hp = column_pa(sg, h)
                + column_pa(upper_sg, lp_tap_m - hp_tap_m - h)
                + column_pa(fill_sg, hp_tap_m - tx_m);
            let lp = column_pa(fill_sg, lp_tap_m - tx_m);
            hp - lp
        }
    };
    if setup.ports_swapped {
        -dp
    } else {
        dp
    }
}

/// The levels over which DP changes linearly with level for this mount: from the bottom
/// tap or seal (0 m) up to the top tap, leg or seal (unbounded for open tanks and dry
/// legs).
fn measurable_levels(setup: &LevelSetup) -> (f64, f64) {
    match setup.mount {
        Mount::OpenTank { .. } | Mount::DryLeg { .. } | Mount::OpenTankSeal { .. } => {
            (0.0, f64::INFINITY)
        }
        Mount::WetLeg { tx_m, leg_m, .. } => (0.0, tx_m + leg_m),
        Mount::Seals {
            hp_seal_m,
            lp_seal_m,
            ..
        } => (0.0, lp_seal_m - hp_seal_m),
        Mount::Interface {
            hp_tap_m, lp_tap_m, ..
        } => (0.0, lp_tap_m - hp_tap_m),
    }
}

fn validate(setup: &LevelSetup) -> Result<()> {
    check_sg("sg", setup.sg)?;
    let min = finite("min_m", setup.min_m)?;
    let max = finite("max_m", setup.max_m)?;
    if max <= min {
        return Err(FieldError::new(
            "max_m",
            format!(
                "{} m must be above the minimum level ({} m)",
                display::quoted(max),
                display::quoted(min)
            ),
        ));
    }
    match setup.mount {
        Mount::OpenTank { tx_m } | Mount::DryLeg { tx_m } => {
            finite("tx_m", tx_m)?;
        }
        Mount::WetLeg {
            tx_m,
            leg_m,
            fill_sg,
        } => {
            finite("tx_m", tx_m)?;
            positive("leg_m", leg_m)?;
            check_sg("fill_sg", fill_sg)?;
            if tx_m + leg_m <= 0.0 {
                return Err(FieldError::new(
                    "leg_m",
                    format!(
                        "a wet leg of {} m from a transmitter at {} m ends at or below the HP tap",
                        display::quoted(leg_m),
                        display::quoted(tx_m)
                    ),
                ));
            }
        }
        Mount::Seals {
            hp_seal_m,
            lp_seal_m,
            tx_m,
            fill_sg,
        } => {
            finite("hp_seal_m", hp_seal_m)?;
            finite("lp_seal_m", lp_seal_m)?;
            finite("tx_m", tx_m)?;
            check_sg("fill_sg", fill_sg)?;
            if lp_seal_m <= hp_seal_m {
                return Err(FieldError::new(
                    "lp_seal_m",
                    format!(
                        "{} m must be above the HP seal ({} m)",
                        display::quoted(lp_seal_m),
                        display::quoted(hp_seal_m)
                    ),
                ));
            }
        }
        Mount::OpenTankSeal {
            hp_seal_m,
            tx_m,
            fill_sg,
        } => {
            finite("hp_seal_m", hp_seal_m)?;
            finite("tx_m", tx_m)?;
            check_sg("fill_sg", fill_sg)?;
        }
        Mount::Interface {
            upper_sg,
            hp_tap_m,
            lp_tap_m,
            tx_m,
            fill_sg,
        } => {
            check_sg("upper_sg", upper_sg)?;
            finite("hp_tap_m", hp_tap_m)?;
            finite("lp_tap_m", lp_tap_m)?;
            finite("tx_m", tx_m)?;
            check_sg("fill_sg", fill_sg)?;
            if lp_tap_m <= hp_tap_m {
                return Err(FieldError::new(
                    "lp_tap_m",
                    format!(
                        "{} m must be above the HP tap ({} m)",
                        display::quoted(lp_tap_m),
                        display::quoted(hp_tap_m)
                    ),
                ));
            }
            if upper_sg == setup.sg {
                return Err(FieldError::new(
                    "upper_sg",
                    format!(
                        "{} equals the lower liquid's SG; the DP would not change with the interface",
                        display::quoted(upper_sg)
                    ),
                ));
            }
        }
    }
    let (low, high) = measurable_levels(setup);
    if min < low {
        return Err(FieldError::new(
            "min_m",
            format!(
                "{} m is below the bottom tap or seal ({} m); a DP transmitter cannot see level there",
                display::quoted(min),
                display::quoted(low)
            ),
        ));
    }
    if max > high {
        return Err(FieldError::new(
            "max_m",
            format!(
                "{} m is above the top tap, leg or seal ({} m above the bottom one); the DP stops changing with level there",
                display::quoted(max),
                display::quoted(high)
            ),
        ));
    }
    Ok(())
}

fn check_sg(field: &str, sg: f64) -> Result<f64> {
    let v = finite(field, sg)?;
    if v <= 0.0 || v > 25.0 {
        return Err(FieldError::new(
            field,
            format!(
                "{} is not a liquid's specific gravity; expected above 0 and up to 25",
                display::quoted(v)
            ),
        ));
    }
    Ok(v)
}

/// ρ·g·h for a liquid of specific gravity `sg` (validated by the caller).
fn column_pa(sg: f64, height_m: f64) -> f64 {
    sg * WATER_DENSITY_KG_M3 * STANDARD_GRAVITY * height_m
}

#[cfg(test)]
mod tests {
    use super::*;

    fn open(min_m: f64, max_m: f64, tx_m: f64) -> LevelSetup {
        LevelSetup {
            sg: 1.0,
            min_m,
            max_m,
            mount: Mount::OpenTank { tx_m },
            ports_swapped: false,
        }
    }

    #[test]
    fn zero_based_open_tank_has_no_shift() {
        let r = range(&open(0.0, 2.0, 0.0)).unwrap();
        assert_eq!(r.zero, ZeroShift::None);
        assert!((r.urv_pa - 2.0 * 9806.65).abs() < 1e-9);
    }

    #[test]
    fn swapped_ports_negate_every_value() {
        let mut s = open(0.5, 2.0, -1.0);
        let straight = range(&s).unwrap();
        s.ports_swapped = true;
        let swapped = range(&s).unwrap();
        assert_eq!(swapped.lrv_pa, -straight.lrv_pa);
        assert_eq!(swapped.span_pa, -straight.span_pa);
        assert!(matches!(swapped.zero, ZeroShift::Elevated { .. }));
    }
}
