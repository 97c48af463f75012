//! The words of an intrinsic-safety check, written once: the caution shown before it, each
//! check's line with its numbers and margin, the verdict, the notes on what was assumed,
//! the log entry's title and text, and the hand-over report's section. The numbers come
//! from [`crate::intrinsic`] and are rounded by [`crate::display`].

use crate::display;
use crate::intrinsic::{
    CableLimit, Check, CheckName, Circuit, Compared, DeviceKind, GasGroup, NotChecked, Quantity,
    Source, TempClass, Verdict, DEFAULT_CABLE_FARADS_PER_M, DEFAULT_CABLE_HENRIES_PER_M,
    SIMPLE_APPARATUS_T4_WATTS,
};

/// The caution shown before the IS card and the `intrinsic` command's answer.
pub const CAUTION: [&str; 3] = [
    "Intrinsic safety is verified by a competent person under the site's rules and the local code (IEC 60079-14 and IEC 60079-25, NEC Article 504 or the CEC where they apply). loopside shows the entity arithmetic; it does not certify a circuit and does not replace the certificates, the site's descriptive system document or that verification.",
    "Take every value from the certificates of the installed equipment, for the area's gas group; a value typed wrongly gives a wrong answer.",
    "Work on an intrinsically safe circuit live only as the site's rules and permits allow, with equipment certified for the area.",
];

/// The tag sheet's line for a tag's IS circuit: `Barrier A (Uo 28 V, …), 2 field devices
/// (TT-412 transmitter, Pt100 in thermowell), cable 185 m; area IIB T3`.
pub fn circuit_summary(c: &Circuit) -> String {
    let source = if c.source.name.is_empty() {
        "barrier or isolator"
    } else {
        &c.source.name
    };
    let names: Vec<&str> = c.devices.iter().map(|d| d.name.as_str()).collect();
    format!(
        "{source} ({}), {} field device{} ({}), cable {}; area {}{}",
        source_parameters(&c.source, ", "),
        c.devices.len(),
        if c.devices.len() == 1 { "" } else { "s" },
        names.join(", "),
        display::metres(c.cable.length_m),
        c.area_group,
        c.area_t_class.map(|t| format!(" {t}")).unwrap_or_default()
    )
}

/// A source's entity output parameters, `Uo 28 V, Io 93 mA, Po 0.65 W, Co 83 nF, Lo 4.2 mH`
/// (joined by `sep`).
pub fn source_parameters(s: &Source, sep: &str) -> String {
    [
        format!("Uo {}", display::is_volts(s.uo_volts)),
        format!("Io {}", display::is_ma(s.io_ma)),
        format!("Po {}", display::is_watts(s.po_watts)),
        format!("Co {}", display::is_nanofarads(s.co_farads)),
        format!("Lo {}", display::is_millihenries(s.lo_henries)),
    ]
    .join(sep)
}

/// A field device's entity input parameters, `Ui 30 V, Ii 100 mA, Pi 0.75 W` (joined by
/// `sep`), or `simple apparatus`.
pub fn device_parameters(kind: &DeviceKind, sep: &str) -> String {
    match *kind {
        DeviceKind::Entity {
            ui_volts,
            ii_ma,
            pi_watts,
            ..
        } => [
            format!("Ui {}", display::is_volts(ui_volts)),
            format!("Ii {}", display::is_ma(ii_ma)),
            format!("Pi {}", display::is_watts(pi_watts)),
        ]
        .join(sep),
        DeviceKind::Simple => "simple apparatus".to_string(),
    }
}

/// The words of a gas group on the IS screen's picker: the group and the gases it stands
/// for (IEC 60079-0 representative gases): `IIC (hydrogen, acetylene)`.
pub fn group_option(g: GasGroup) -> String {
    let gases = match g {
        GasGroup::IIA => "propane",
        GasGroup::IIB => "ethylene",
        GasGroup::IIC => "hydrogen, acetylene",
    };
    format!("{} ({gases})", g.label())
}

/// The words of a temperature class on the IS screen's picker: the class and its highest
/// surface temperature: `T4 (135 °C)`.
pub fn class_option(c: TempClass) -> String {
    format!("{} ({} °C)", c.label(), display::whole(c.max_surface_c()))
}

/// `pass` or `FAIL`, as every check is marked (capitals for the one that needs action).
pub fn mark(ok: bool) -> &'static str {
    if ok {
        "pass"
    } else {
        "FAIL"
    }
}

fn number(q: Quantity, v: f64) -> String {
    match q {
        Quantity::Volts => display::is_volts(v),
        Quantity::MilliAmps => display::is_ma(v),
        Quantity::Watts => display::is_watts(v),
        Quantity::Farads => display::is_nanofarads(v),
        Quantity::Henries => display::is_millihenries(v),
        Quantity::HenriesPerOhm => display::is_microhenries_per_ohm(v),
    }
}

/// What a check is, in words: `Voltage Ui ≥ Uo — TT-412 transmitter`.
pub fn check_title(c: &Check) -> String {
    let what = match c.name {
        CheckName::Voltage => "Voltage: Ui ≥ Uo",
        CheckName::Current => "Current: Ii ≥ Io",
        CheckName::Power => "Power: Pi ≥ Po",
        CheckName::Capacitance => "Capacitance: Co ≥ ΣCi + C cable",
        CheckName::Inductance => "Inductance: Lo ≥ ΣLi + L cable",
        CheckName::InductanceLr => "Inductance by L/R: Lo/Ro ≥ L/R cable",
        CheckName::SourceGroup => "Gas group of the barrier or isolator",
        CheckName::DeviceGroup => "Gas group",
        CheckName::TempClass => "Temperature class",
        CheckName::SimpleApparatus => "Simple apparatus: Po within T4 (40 °C ambient)",
    };
    match &c.device {
        Some(d) => format!("{what} — {d}"),
        None => what.to_string(),
    }
}

/// The numbers a check compared: `Uo 28.00 V, Ui 30.00 V`.
pub fn check_numbers(c: &Check) -> String {
    match c.compared {
        Compared::Numbers {
            quantity,
            source,
            field,
            ..
        } => {
            let (s, f) = match c.name {
                CheckName::Voltage => ("Uo", "Ui"),
                CheckName::Current => ("Io", "Ii"),
                CheckName::Power => ("Po", "Pi"),
                CheckName::Capacitance => ("Co allowed", "total"),
                CheckName::Inductance => ("Lo allowed", "total"),
                CheckName::InductanceLr => ("Lo/Ro", "cable L/R"),
                CheckName::SimpleApparatus => ("Po", "limit"),
                _ => ("source", "field"),
            };
            format!(
                "{s} {}, {f} {}",
                number(quantity, source),
                number(quantity, field)
            )
        }
        Compared::Groups { required, given } => {
            format!("area asks {required}, certified {given}")
        }
        Compared::Classes { required, given } => {
            format!("area asks {required}, device {given}")
        }
    }
}

/// How much is left: `margin 2.00 V (6.7 %)`; empty for groups and classes.
pub fn check_margin(c: &Check) -> String {
    match c.compared {
        Compared::Numbers {
            quantity,
            margin,
            margin_percent,
            ..
        } => format!(
            "margin {} ({})",
            number(quantity, margin),
            display::is_margin_percent(margin_percent)
        ),
        _ => String::new(),
    }
}

/// One check on one line: `pass  Voltage: Ui ≥ Uo — tx: Uo 28.00 V, Ui 30.00 V; margin …`.
pub fn check_line(c: &Check) -> String {
    let margin = check_margin(c);
    let info = if c.decides {
        ""
    } else {
        " (for information: the L/R route decides)"
    };
    if margin.is_empty() {
        format!(
            "{}  {}: {}{info}",
            mark(c.ok),
            check_title(c),
            check_numbers(c)
        )
    } else {
        format!(
            "{}  {}: {}; {margin}{info}",
            mark(c.ok),
            check_title(c),
            check_numbers(c)
        )
    }
}

/// The verdict in one sentence.
pub fn verdict_line(v: &Verdict) -> String {
    let failed = v.checks.iter().filter(|c| c.decides && !c.ok).count();
    if v.ok {
        "Every entity check passes (the arithmetic only; see the caution).".to_string()
    } else {
        format!("NOT intrinsically safe by the entity arithmetic: {failed} check(s) FAIL.")
    }
}

/// The longest cable, in words.
pub fn longest_cable(v: &Verdict) -> String {
    match v.max_cable {
        CableLimit::NoLength => {
            "Longest cable: none — the devices alone take more than the source allows.".to_string()
        }
        CableLimit::Metres { metres, by } => format!(
            "Longest cable that still passes: {} (set by {}).",
            display::metres(metres),
            if by == CheckName::Inductance {
                "inductance"
            } else {
                "capacitance"
            }
        ),
        CableLimit::Unlimited => {
            "Longest cable: not limited by capacitance or inductance with these cable values."
                .to_string()
        }
    }
}

/// The sums: `C: ΣCi 5.0 nF + cable 20.0 nF = 25.0 nF of 83.0 nF allowed`.
pub fn sums(v: &Verdict) -> [String; 2] {
    [
        format!(
            "C: devices {} + cable {} = {} of {} allowed",
            display::is_nanofarads(v.ci_total_farads),
            display::is_nanofarads(v.cable_farads),
            display::is_nanofarads(v.c_total_farads),
            display::is_nanofarads(v.co_allowed_farads)
        ),
        format!(
            "L: devices {} + cable {} = {} of {} allowed",
            display::is_millihenries(v.li_total_henries),
            display::is_millihenries(v.cable_henries),
            display::is_millihenries(v.l_total_henries),
            display::is_millihenries(v.lo_allowed_henries)
        ),
    ]
}

/// What was assumed or applied, one sentence each (the 1 % rule, default cable values,
/// the L/R route, simple apparatus, what could not be checked, a temporary device).
pub fn notes(circuit: &Circuit, v: &Verdict) -> Vec<String> {
    let mut out = Vec::new();
    if v.halved {
        out.push(format!(
            "The devices' Ci and Li are both at least 1 % of Co and Lo, so only half of Co and Lo is used (IEC 60079-14){}.",
            if v.capped {
                format!(
                    ", and the capacitance is held to {} for {}",
                    display::is_nanofarads(v.co_allowed_farads),
                    circuit.area_group
                )
            } else {
                String::new()
            }
        ));
    }
    if v.cable_c_default || v.cable_l_default {
        out.push(format!(
            "Cable data not given: the standard's default {} per metre used (IEC 60079-14 / IEC 60079-25 for conventional cables); the cable's own data give a truer margin.",
            match (v.cable_c_default, v.cable_l_default) {
                (true, true) => format!(
                    "{} pF and {} µH",
                    display::trimmed(DEFAULT_CABLE_FARADS_PER_M * 1e12),
                    display::trimmed(DEFAULT_CABLE_HENRIES_PER_M * 1e6)
                ),
                (true, false) => format!(
                    "capacitance of {} pF",
                    display::trimmed(DEFAULT_CABLE_FARADS_PER_M * 1e12)
                ),
                _ => format!(
                    "inductance of {} µH",
                    display::trimmed(DEFAULT_CABLE_HENRIES_PER_M * 1e6)
                ),
            }
        ));
    }
    if v.lr_route {
        out.push("The cable's L/R is within the source's Lo/Ro and the devices have no Li: the cable's inductance is not counted (L/R route).".to_string());
    }
    if circuit
        .devices
        .iter()
        .any(|d| matches!(d.kind, DeviceKind::Simple))
    {
        out.push(format!(
            "Simple apparatus is taken as passive or within 1.5 V, 100 mA and 25 mW, with the circuit's gas group and T4 where Po ≤ {} (IEC 60079-11); confirm it is simple apparatus and that its insulation and marking meet the site's rules.",
            display::is_watts(SIMPLE_APPARATUS_T4_WATTS)
        ));
    }
    for n in &v.not_checked {
        out.push(match n {
            NotChecked::SourceGroup => {
                "Not checked: the gas group of the barrier or isolator (not given).".to_string()
            }
            NotChecked::DeviceGroup { device } => {
                format!("Not checked: the gas group of {device} (not given).")
            }
            NotChecked::DeviceTempClass { device } => {
                format!("Not checked: the temperature class of {device} (not given).")
            }
            NotChecked::AreaTempClass => {
                "Not checked: temperature classes (the area's is not given).".to_string()
            }
        });
    }
    if let Some(t) = v.temporary {
        let permanent = circuit.devices.iter().any(|d| !d.temporary);
        out.push(if permanent {
            format!(
                "The temporary device(s) add {} and {}; without them the circuit would {}.",
                display::is_nanofarads(t.ci_farads),
                display::is_millihenries(t.li_henries),
                if t.ok_without { "pass" } else { "still FAIL" }
            )
        } else {
            format!(
                "Only temporary devices are entered; they add {} and {}.",
                display::is_nanofarads(t.ci_farads),
                display::is_millihenries(t.li_henries)
            )
        });
    }
    out
}

/// Every line the command line prints and the report keeps, in order.
pub fn lines(circuit: &Circuit, v: &Verdict) -> Vec<String> {
    let mut out = vec![verdict_line(v)];
    out.extend(v.checks.iter().map(check_line));
    out.extend(sums(v));
    out.push(longest_cable(v));
    out.extend(notes(circuit, v));
    out
}

/// The Log list's title of an IS check entry.
pub fn log_title(ok: Option<bool>) -> &'static str {
    match ok {
        Some(true) => "IS check passed",
        Some(false) => "IS check FAILED",
        None => "IS check",
    }
}

/// The text of the log entry saved with an IS check.
pub fn log_text(circuit: &Circuit, v: &Verdict) -> String {
    let devices: Vec<&str> = circuit.devices.iter().map(|d| d.name.as_str()).collect();
    let failed: Vec<String> = v
        .checks
        .iter()
        .filter(|c| c.decides && !c.ok)
        .map(check_title)
        .collect();
    let mut text = format!(
        "IS check (entity): {}. {} to {} on {} of cable; C {} of {}, L {} of {}; {}",
        if v.ok { "pass" } else { "FAIL" },
        if circuit.source.name.is_empty() {
            "source"
        } else {
            &circuit.source.name
        },
        devices.join(", "),
        display::metres(circuit.cable.length_m),
        display::is_nanofarads(v.c_total_farads),
        display::is_nanofarads(v.co_allowed_farads),
        display::is_millihenries(v.l_total_henries),
        display::is_millihenries(v.lo_allowed_henries),
        longest_cable(v)
    );
    if !failed.is_empty() {
        text.push_str(&format!(" Failed: {}.", failed.join("; ")));
    }
    text
}

/// Text safe inside a Markdown line.
/// ` (cert. …)` after a name in the report, or nothing when no certificate is given.
fn certificate_note(certificate: &str) -> String {
    if certificate.is_empty() {
        String::new()
    } else {
        format!(" (cert. {})", md(certificate))
    }
}

fn md(text: &str) -> String {
    text.replace('|', "\\|").replace(['\n', '\r'], " ")
}

/// The hand-over report's section for one saved IS check (Markdown).
pub fn report_section(circuit: &Circuit, v: &Verdict) -> Vec<String> {
    let mut out = vec![format!("**{}**", md(&verdict_line(v)))];
    let s = &circuit.source;
    out.push(format!(
        "- Source {}{}: {}{}, {}",
        md(if s.name.is_empty() {
            "(unnamed)"
        } else {
            &s.name
        }),
        certificate_note(&s.certificate),
        source_parameters(s, ", "),
        s.lo_ro_henries_per_ohm
            .map(|r| format!(", Lo/Ro {}", display::is_microhenries_per_ohm(r)))
            .unwrap_or_default(),
        s.group.map(|g| g.label()).unwrap_or("group not given")
    ));
    for d in &circuit.devices {
        let params = device_parameters(&d.kind, ", ");
        out.push(format!(
            "- Device {}{}{}: {params}, Ci {}, Li {}",
            md(&d.name),
            if d.temporary { " (temporary)" } else { "" },
            certificate_note(&d.certificate),
            display::is_nanofarads(d.ci_farads),
            display::is_millihenries(d.li_henries),
        ));
    }
    out.push(format!(
        "- Cable {}; area {}{}",
        display::metres(circuit.cable.length_m),
        circuit.area_group,
        circuit
            .area_t_class
            .map(|t| format!(" {t}"))
            .unwrap_or_default()
    ));
    for c in &v.checks {
        out.push(format!("- {}", md(&check_line(c))));
    }
    for line in sums(v) {
        out.push(format!("- {}", md(&line)));
    }
    out.push(format!("- {}", md(&longest_cable(v))));
    for n in notes(circuit, v) {
        out.push(format!("- {}", md(&n)));
    }
    out
}
