//! The Power screen's view model: the loop budget as two stacked bars and the figures that
//! say what to change.
//!
//! Both bars share one scale, the larger of the lowest supply and what the loop needs at
//! the fault current, so a shortfall shows as a red slice past the supply line and the two
//! bars can be compared at a glance.

use crate::budget::topology::SourceKind;
use crate::budget::{Budget, LoopConfig, OperatingPoint, PartRole};
use crate::display;
use crate::error::Result;
use crate::view::Tone;

/// One slice of a budget bar, as fractions of the bar's width.
#[derive(Debug, Clone, PartialEq)]
pub struct Slice {
    /// Left edge, 0..1.
    pub start: f64,
    /// Width, 0..1.
    pub width: f64,
    /// What the slice is.
    pub kind: SliceKind,
    /// Short label drawn inside the slice when it is wide enough (`10.50 V`).
    pub label: String,
}

/// What a slice of the budget bar is.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum SliceKind {
    /// The transmitter's minimum terminal voltage.
    Transmitter,
    /// A resistor or barrier.
    Resistance,
    /// A fixed drop.
    Drop,
    /// The cable.
    Cable,
    /// Volts to spare.
    Spare,
    /// Volts missing (drawn past the supply line).
    Shortfall,
}

/// One line of the legend: the slice's kind and name, its volts at 20 mA and at the fault.
#[derive(Debug, Clone, PartialEq)]
pub struct LegendLine {
    /// Colour class.
    pub kind: SliceKind,
    /// Name.
    pub name: String,
    /// Volts at 20 mA.
    pub full: String,
    /// Volts at the fault current.
    pub fault: String,
}

/// A labelled figure with its tone.
#[derive(Debug, Clone, PartialEq)]
pub struct Figure {
    /// What it is.
    pub label: String,
    /// Its value, formatted.
    pub value: String,
    /// How it stands.
    pub tone: Tone,
}

/// Everything the Power screen shows.
#[derive(Debug, Clone, PartialEq)]
pub struct PowerView {
    /// The worked budget, full precision.
    pub budget: Budget,
    /// Bar title at 20 mA.
    pub full_title: String,
    /// Bar title at the fault current.
    pub fault_title: String,
    /// Slices at 20 mA.
    pub full: Vec<Slice>,
    /// Slices at the fault current.
    pub fault: Vec<Slice>,
    /// Where the lowest supply ends on both bars, 0..1.
    pub supply_pos: f64,
    /// `Supply 24.00 V`.
    pub supply_label: String,
    /// Each bar in words, for screen readers.
    pub full_description: String,
    /// The fault bar in words.
    pub fault_description: String,
    /// Legend lines.
    pub legend: Vec<LegendLine>,
    /// The verdict in a few words.
    pub verdict_title: String,
    /// What limits the loop, with numbers.
    pub verdict_detail: String,
    /// How the verdict stands.
    pub verdict_tone: Tone,
    /// Headroom, spare ohms, maximum cable and so on, each naming the current it holds at.
    pub figures: Vec<Figure>,
    /// What the budget assumed that the technician did not give (no supply sag, the
    /// default fault current), and what the cable figures leave out, in sentences.
    pub notes: Vec<String>,
    /// HART verdict (title, detail, tone) when the tag talks HART.
    pub hart: Option<(String, String, Tone)>,
    /// How the loop is built, in words (`two-wire transmitter on a DC supply into a
    /// passive input`).
    pub topology: String,
    /// The topology fault in words, when the loop has two sources or none.
    pub topology_fault: Option<String>,
}

/// Work out the view. Errors only for invalid input, never for "not enough volts".
pub fn view(config: &LoopConfig, hart: bool) -> Result<PowerView> {
    let b = config.budget()?;
    let driver_min = b.driver_min_volts;
    let need = |p: &OperatingPoint| driver_min + p.parts.iter().map(|x| x.volts).sum::<f64>();
    let total = b
        .lowest_supply_volts
        .max(need(&b.at_full_scale))
        .max(need(&b.at_fault))
        .max(1e-9);
    let current_source = b.worked_from == Some(SourceKind::CurrentOutput);
    let driver = (!current_source).then_some(driver_min);
    let full = slices(driver, &b.at_full_scale, b.lowest_supply_volts, total);
    let fault = slices(driver, &b.at_fault, b.lowest_supply_volts, total);
    let fault_ma = display::ma_setting(b.at_fault.current_ma);

    // A current source's compliance already counts its own drop: no transmitter slice.
    let mut legend = if current_source {
        Vec::new()
    } else {
        vec![LegendLine {
            kind: SliceKind::Transmitter,
            name: "Transmitter minimum".to_string(),
            full: display::volts(driver_min),
            fault: display::volts(driver_min),
        }]
    };
    for (p_full, p_fault) in b.at_full_scale.parts.iter().zip(&b.at_fault.parts) {
        legend.push(LegendLine {
            kind: role_kind(p_full.role),
            name: capitalised(&p_full.name),
            full: display::volts(p_full.volts),
            fault: display::volts(p_fault.volts),
        });
    }
    let spare_line = |p: &OperatingPoint| display::volts_spare(p.headroom_volts);
    legend.push(LegendLine {
        kind: if b.ok {
            SliceKind::Spare
        } else {
            SliceKind::Shortfall
        },
        name: "Spare (− short)".to_string(),
        full: spare_line(&b.at_full_scale),
        fault: spare_line(&b.at_fault),
    });

    let verdict_title = if b.topology_fault.is_some() {
        "Wired with two sources or none: no figure makes it work".to_string()
    } else if b.ok {
        "Enough voltage at 20 mA and at the fault current".to_string()
    } else if b.ok_full_scale {
        format!("Reaches 20 mA but not {fault_ma}: a fault would be hidden")
    } else {
        "Not enough voltage at 20 mA".to_string()
    };
    let tone_of = |ok: bool| if ok { Tone::Good } else { Tone::Bad };
    let mut figures = vec![
        Figure {
            label: "Headroom at 20 mA".to_string(),
            value: spare_line(&b.at_full_scale),
            tone: tone_of(b.at_full_scale.ok),
        },
        Figure {
            label: format!("Headroom at {fault_ma}"),
            value: spare_line(&b.at_fault),
            tone: tone_of(b.at_fault.ok),
        },
        Figure {
            label: "Loop resistance".to_string(),
            value: display::ohms(b.loop_ohms),
            tone: Tone::Neutral,
        },
        Figure {
            label: "Load still available at 20 mA".to_string(),
            value: display::ohms(b.spare_ohms),
            tone: tone_of(b.spare_ohms >= 0.0),
        },
        Figure {
            label: format!("Load still available at {fault_ma}"),
            value: display::ohms(b.spare_fault_ohms),
            tone: tone_of(b.spare_fault_ohms >= 0.0),
        },
        Figure {
            label: if current_source {
                format!("Compliance needed at {fault_ma}")
            } else {
                format!("Lowest supply needed at {fault_ma}")
            },
            value: display::volts(b.min_supply_fault_volts),
            tone: tone_of(b.min_supply_fault_volts <= b.lowest_supply_volts + 1e-9),
        },
    ];
    for (at, cable) in [
        ("20 mA".to_string(), b.max_cable_m),
        (fault_ma.clone(), b.max_cable_fault_m),
    ] {
        if let Some(m) = cable {
            figures.push(Figure {
                label: format!("Longest cable of this size at {at} (one way, by voltage only)"),
                value: display::metres(m),
                tone: Tone::Neutral,
            });
        }
    }
    if let Some(h) = &b.hart_cable {
        if let Some(m) = h.max_cable_m {
            figures.push(Figure {
                label: "Longest cable HART allows (one way, RC at most 65 µs)".to_string(),
                value: display::metres(m),
                tone: match h.time_constant_s {
                    Some(t) if t > crate::budget::hart::MAX_TIME_CONSTANT_S => Tone::Bad,
                    Some(_) => Tone::Good,
                    None => Tone::Neutral,
                },
            });
        }
    }
    let mut notes = notes(
        &b,
        "in the Supply may sag field",
        "in the Fault current field",
    );
    if let Some(h) = &b.hart_cable {
        notes.push(capitalised(&crate::view::wording::power::hart_cable(
            h,
            b.max_cable_fault_m,
        )));
    }
    let hart = hart.then(|| {
        (
            if b.hart_ok {
                "HART: loop resistance in the window".to_string()
            } else {
                "HART: loop resistance outside the window".to_string()
            },
            capitalised(&crate::view::wording::power::hart(&b.hart)),
            if b.hart_ok { Tone::Good } else { Tone::Bad },
        )
    });
    let describe = |p: &OperatingPoint| {
        if current_source {
            format!(
                "At {} the current output has {} of compliance left",
                display::ma(p.current_ma),
                display::volts_spare(p.headroom_volts)
            )
        } else {
            format!(
                "At {} the transmitter keeps {} ({} needed)",
                display::ma(p.current_ma),
                display::volts(p.terminal_volts),
                display::volts(driver_min)
            )
        }
    };
    Ok(PowerView {
        full_title: "At 20 mA".to_string(),
        fault_title: format!("At {fault_ma} (upscale fault)"),
        full_description: describe(&b.at_full_scale),
        fault_description: describe(&b.at_fault),
        full,
        fault,
        supply_pos: b.lowest_supply_volts / total,
        supply_label: if current_source {
            format!("Compliance {}", display::volts(b.lowest_supply_volts))
        } else {
            format!("Supply {}", display::volts(b.lowest_supply_volts))
        },
        legend,
        verdict_title,
        verdict_detail: capitalised(&crate::view::wording::power::verdict(&b)),
        topology: crate::view::wording::power::topology(b.topology).to_string(),
        topology_fault: b
            .topology_fault
            .as_ref()
            .map(|f| capitalised(&crate::view::wording::power::topology_fault(f))),
        verdict_tone: tone_of(b.ok),
        figures,
        notes,
        hart,
        budget: b,
    })
}

/// What the budget assumed and what its figures leave out, in sentences (shared by the
/// Power screen and `loopside budget`): the supply sag it was worked with, or that none
/// was assumed (so the spare is margin only if the supply holds its nominal); that the
/// fault current is a default when the device's configured one was not given; and that
/// cable lengths are by voltage only. `give_sag` and `give_fault` say where the technician
/// gives the sag and the fault current (`in the Supply may sag field`, `with --fault-ma`).
pub fn notes(b: &Budget, give_sag: &str, give_fault: &str) -> Vec<String> {
    let mut out = Vec::new();
    if b.worked_from == Some(SourceKind::CurrentOutput) {
        out.push(format!(
            "Worked at the current output's compliance, {}, the same at every current up to the highest it drives; no sag applied.",
            display::volts(b.lowest_supply_volts)
        ));
    } else if b.supply_sag_percent > 0.0 {
        out.push(format!(
            "Worked at the lowest supply, {}: the nominal less {} % sag.",
            display::volts(b.lowest_supply_volts),
            display::trimmed(b.supply_sag_percent)
        ));
    } else {
        out.push(format!(
            "No supply sag assumed: worked at the nominal {}. If the supply can droop (load, battery, long feed), give how far {give_sag}.",
            display::volts(b.lowest_supply_volts)
        ));
    }
    if b.fault_ma_is_default {
        out.push(format!(
            "{} is a default upscale fault current, not this device's: give the value the device is configured to drive {give_fault}.",
            display::ma_setting(b.at_fault.current_ma)
        ));
    }
    if b.max_cable_m.is_some() && b.hart_cable.is_none() {
        out.push(
            "Cable lengths are by voltage only: HART and cable capacitance set their own limits."
                .to_string(),
        );
    }
    out
}

fn role_kind(role: PartRole) -> SliceKind {
    match role {
        PartRole::Resistance => SliceKind::Resistance,
        PartRole::Drop => SliceKind::Drop,
        PartRole::Cable => SliceKind::Cable,
    }
}

/// The slices of one bar: transmitter minimum, each part, then spare or shortfall.
/// A current source (`driver` `None`) has no transmitter slice: its compliance is what it
/// has left for the loop.
fn slices(driver: Option<f64>, point: &OperatingPoint, supply: f64, total: f64) -> Vec<Slice> {
    let mut out = Vec::new();
    let mut at = 0.0;
    let mut push = |volts: f64, kind: SliceKind, out: &mut Vec<Slice>| {
        let width = (volts / total).max(0.0);
        out.push(Slice {
            start: at / total,
            width,
            kind,
            label: display::volts(volts),
        });
        at += volts.max(0.0);
    };
    if let Some(min) = driver {
        push(min, SliceKind::Transmitter, &mut out);
    }
    for p in &point.parts {
        push(p.volts, role_kind(p.role), &mut out);
    }
    let used = driver.unwrap_or(0.0) + point.parts.iter().map(|p| p.volts).sum::<f64>();
    if supply >= used {
        push(supply - used, SliceKind::Spare, &mut out);
    } else {
        push(used - supply, SliceKind::Shortfall, &mut out);
        // A shortfall is drawn past the supply line, where the parts went over it.
        if let Some(last) = out.last_mut() {
            last.start = supply / total;
        }
    }
    out
}

fn capitalised(text: &str) -> String {
    let mut c = text.chars();
    match c.next() {
        Some(first) => first.to_uppercase().chain(c).collect(),
        None => String::new(),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::budget::{Cable, SeriesElement};
    use crate::wire::Conductor;

    fn lt101() -> LoopConfig {
        // Brindlemoor LT-101: 24 V, 10.5 V transmitter, 250 Ω PLC input, 180 m of 1.0 mm².
        let mut c = LoopConfig::new(24.0, 10.5);
        c.elements.push(SeriesElement::ohms("PLC input", 250.0));
        c.cable = Some(Cable {
            one_way_m: 180.0,
            conductor: Conductor::Mm2(1.0),
            temp_c: 20.0,
        });
        c
    }

    #[test]
    fn enough_voltage_fills_to_the_supply_line() {
        let v = view(&lt101(), false).unwrap();
        assert_eq!(v.verdict_tone, Tone::Good);
        assert!((v.supply_pos - 1.0).abs() < 1e-12);
        let last = v.full.last().unwrap();
        assert_eq!(last.kind, SliceKind::Spare);
        assert!((last.start + last.width - 1.0).abs() < 1e-9);
        assert!(v.hart.is_none());
    }

    #[test]
    fn shortfall_is_drawn_past_the_supply() {
        let mut c = lt101();
        c.supply_volts = 16.0;
        let v = view(&c, true).unwrap();
        assert_eq!(v.verdict_tone, Tone::Bad);
        assert!(v.supply_pos < 1.0);
        let last = v.fault.last().unwrap();
        assert_eq!(last.kind, SliceKind::Shortfall);
        assert!((last.start - v.supply_pos).abs() < 1e-12);
        assert!((last.start + last.width - 1.0).abs() < 1e-9);
        // 16 V is enough at 20 mA (15.62 V needed) but not at 22 mA (16.14 V).
        assert_eq!(v.figures[0].tone, Tone::Good);
        assert!(v.figures[1].value.starts_with('−'), "{:?}", v.figures[1]);
        assert_eq!(v.figures[1].tone, Tone::Bad);
        assert!(
            v.verdict_title.contains("not 22.0 mA"),
            "{}",
            v.verdict_title
        );
        assert!(v.hart.is_some());
    }

    fn figure<'a>(v: &'a PowerView, label: &str) -> &'a Figure {
        v.figures
            .iter()
            .find(|f| f.label == label)
            .unwrap_or_else(|| panic!("no figure {label:?} in {:?}", v.figures))
    }

    #[test]
    fn lt101_quotes_its_spare_and_cable_at_the_fault_current() {
        // Worked by hand (copper 1/58 Ω·mm²/m at 20 °C, IEC 60028; cable at 20 °C):
        // loop 250 + 360/58 = 256.21 Ω; at 22 mA the most the loop may hold is
        // 13.5 V / 0.022 A = 613.64 Ω, so 357 Ω spare, and (613.64 − 250) × 29 = 10 545 m
        // of this cable one way. The classic 20 mA figures (common practice) stay beside
        // them: 675 − 256.21 = 419 Ω and (675 − 250) × 29 = 12 325 m.
        let v = view(&lt101(), false).unwrap();
        assert_eq!(figure(&v, "Load still available at 20 mA").value, "419 Ω");
        assert_eq!(figure(&v, "Load still available at 22.0 mA").value, "357 Ω");
        assert_eq!(
            figure(
                &v,
                "Longest cable of this size at 22.0 mA (one way, by voltage only)"
            )
            .value,
            "10545 m"
        );
        assert_eq!(
            figure(
                &v,
                "Longest cable of this size at 20 mA (one way, by voltage only)"
            )
            .value,
            "12325 m"
        );
        // The verdict is given at 22 mA, and so is the spare it quotes.
        assert!(
            v.verdict_detail
                .contains("7.86 V spare at 22.0 mA, 357 Ω of load still available at 22.0 mA"),
            "{}",
            v.verdict_detail
        );
        assert!(!v.verdict_detail.contains("419"), "{}", v.verdict_detail);
        // Nothing was said about sag or the device's fault current: both are named.
        let notes = v.notes.join(" ");
        assert!(notes.contains("No supply sag assumed"), "{notes}");
        assert!(notes.contains("nominal 24.00 V"), "{notes}");
        assert!(notes.contains("22.0 mA is a default"), "{notes}");
        assert!(notes.contains("configured"), "{notes}");
        assert!(notes.contains("by voltage only"), "{notes}");
    }

    #[test]
    fn a_configured_fault_current_and_a_sag_are_shown_as_given() {
        // The device is configured for 21.5 mA upscale and the 24 V supply may sag 5 %:
        // worked at 24 × 0.95 = 22.80 V. At 21.5 mA the loop may hold
        // (22.8 − 10.5) / 0.0215 = 572.09 Ω, so 572.09 − 256.21 = 315.9 Ω spare
        // (common-practice formula at the fault current).
        let mut c = lt101();
        c.fault_ma = Some(21.5);
        c.supply_tolerance_percent = 5.0;
        let v = view(&c, false).unwrap();
        assert_eq!(v.fault_title, "At 21.5 mA (upscale fault)");
        assert_eq!(figure(&v, "Load still available at 21.5 mA").value, "316 Ω");
        let notes = v.notes.join(" ");
        assert!(!notes.contains("default"), "{notes}");
        assert!(!notes.contains("No supply sag"), "{notes}");
        assert!(notes.contains("22.80 V"), "{notes}");
        assert!(notes.contains("5 % sag"), "{notes}");
    }

    #[test]
    fn invalid_element_names_itself() {
        let mut c = lt101();
        c.elements.push(SeriesElement::drop("indicator", -2.5));
        assert_eq!(view(&c, false).unwrap_err().field, "indicator");
    }
}
