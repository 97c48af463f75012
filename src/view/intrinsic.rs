//! The intrinsic-safety screen's view model: the caution, the circuit as typed checked by
//! the entity concept, each check pass or FAIL with its numbers and margin, the sums, the
//! longest cable, what was assumed, and a plain picture of the circuit (source, cable,
//! devices) as three labelled boxes. Worked out from [`crate::form::intrinsic`] and
//! [`crate::intrinsic`], worded by [`crate::view::wording::intrinsic`]; no UI toolkit.

use crate::display;
use crate::form::intrinsic::{parse_circuit, CircuitText};
use crate::intrinsic::{self, Circuit, Verdict};
use crate::view::wording::intrinsic as words;
use crate::view::Tone;

/// One check as the screen lists it.
#[derive(Debug, Clone, PartialEq)]
pub struct IsRow {
    /// `pass` or `FAIL`.
    pub mark: String,
    /// What is checked (and for which device).
    pub title: String,
    /// The numbers compared.
    pub numbers: String,
    /// The margin (empty for groups and classes).
    pub margin: String,
    /// How it stands (always with the mark in words).
    pub tone: Tone,
}

/// One box of the circuit picture: what it is and its figures.
#[derive(Debug, Clone, PartialEq)]
pub struct IsBox {
    /// `Source`, `Cable`, a device's name.
    pub title: String,
    /// Its figures on one or two lines.
    pub detail: String,
}

/// What the screen shows.
#[derive(Debug, Clone, PartialEq)]
pub struct IsView {
    /// The caution, shown before anything else.
    pub caution: Vec<String>,
    /// `Every entity check passes …` / `NOT intrinsically safe …`, or what to type next.
    pub verdict_title: String,
    /// The longest cable, under the verdict.
    pub verdict_detail: String,
    /// How the verdict stands.
    pub verdict_tone: Tone,
    /// Every check.
    pub rows: Vec<IsRow>,
    /// The C and L sums.
    pub sums: Vec<String>,
    /// What was assumed or applied, and what was not checked.
    pub notes: Vec<String>,
    /// The circuit picture: the source, the cable, then each device.
    pub picture: Vec<IsBox>,
    /// The first field wrong, named, with the allowed range (empty when none).
    pub problem: String,
    /// The checked circuit, when the form reads (what Save stores).
    pub circuit: Option<Circuit>,
    /// Its verdict.
    pub verdict: Option<Verdict>,
}

fn picture(c: &Circuit, v: &Verdict) -> Vec<IsBox> {
    let s = &c.source;
    let mut out = vec![
        IsBox {
            title: if s.name.is_empty() {
                "Barrier or isolator".to_string()
            } else {
                s.name.clone()
            },
            detail: words::source_parameters(s, " · "),
        },
        IsBox {
            title: format!("Cable {}", display::metres(c.cable.length_m)),
            detail: format!(
                "{} · {}{}",
                display::is_nanofarads(v.cable_farads),
                display::is_millihenries(v.cable_henries),
                if v.cable_c_default || v.cable_l_default {
                    " (default per-metre values)"
                } else {
                    ""
                }
            ),
        },
    ];
    for d in &c.devices {
        let params = format!("{} · ", words::device_parameters(&d.kind, " · "));
        out.push(IsBox {
            title: if d.temporary {
                format!("{} (temporary)", d.name)
            } else {
                d.name.clone()
            },
            detail: format!(
                "{params}Ci {} · Li {}",
                display::is_nanofarads(d.ci_farads),
                display::is_millihenries(d.li_henries)
            ),
        });
    }
    out
}

/// Check the circuit as typed and lay out what the screen shows. A form that does not
/// read yet is not an error of the screen: the verdict says what to type, `problem` names
/// the field.
pub fn view(text: &CircuitText) -> IsView {
    let caution = words::CAUTION.iter().map(|c| c.to_string()).collect();
    let checked = parse_circuit(text).and_then(|c| intrinsic::check(&c).map(|v| (c, v)));
    match checked {
        Ok((circuit, v)) => IsView {
            caution,
            verdict_title: words::verdict_line(&v),
            verdict_detail: words::longest_cable(&v),
            verdict_tone: if v.ok { Tone::Good } else { Tone::Bad },
            rows: v
                .checks
                .iter()
                .map(|c| IsRow {
                    mark: words::mark(c.ok).to_string(),
                    title: words::check_title(c),
                    numbers: words::check_numbers(c),
                    margin: if c.decides {
                        words::check_margin(c)
                    } else {
                        format!(
                            "{} (for information: the L/R route decides)",
                            words::check_margin(c)
                        )
                    },
                    tone: match (c.ok, c.decides) {
                        (true, _) => Tone::Good,
                        (false, true) => Tone::Bad,
                        (false, false) => Tone::Neutral,
                    },
                })
                .collect(),
            sums: words::sums(&v).to_vec(),
            notes: words::notes(&circuit, &v),
            picture: picture(&circuit, &v),
            problem: String::new(),
            circuit: Some(circuit),
            verdict: Some(v),
        },
        Err(e) => IsView {
            caution,
            verdict_title: "Not checked yet".to_string(),
            verdict_detail: format!("Type the certificate values: {e}"),
            verdict_tone: Tone::Neutral,
            rows: Vec::new(),
            sums: Vec::new(),
            notes: Vec::new(),
            picture: Vec::new(),
            problem: e.to_string(),
            circuit: None,
            verdict: None,
        },
    }
}

/// The IS card Power shows for a tag with IS data: the verdict of its stored circuit, the
/// longest cable, and how it stands (`None` for a tag without IS data).
pub fn power_card(tag: &crate::tag::Tag) -> Option<(String, String, Tone)> {
    let circuit = tag.intrinsic.as_ref()?;
    Some(match intrinsic::check(circuit) {
        Ok(v) => (
            format!("Intrinsic safety: {}", words::verdict_line(&v)),
            words::longest_cable(&v),
            if v.ok { Tone::Good } else { Tone::Bad },
        ),
        Err(e) => (
            "Intrinsic safety: the stored IS data do not read".to_string(),
            e.to_string(),
            Tone::Caution,
        ),
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::form::intrinsic::circuit_text;

    #[test]
    fn the_demo_tt412_reads_as_a_pass_with_its_picture() {
        let v = view(&circuit_text(&crate::demo::tt412_circuit()));
        assert_eq!(v.verdict_tone, Tone::Good);
        assert!(v.problem.is_empty());
        assert_eq!(v.picture.len(), 4, "source, cable, transmitter, Pt100");
        assert_eq!(v.picture[1].title, "Cable 185 m");
        assert!(v.rows.iter().all(|r| r.mark == "pass"));
        assert!(v.caution[0].contains("competent person"));
    }

    #[test]
    fn an_empty_form_names_the_first_field_to_type() {
        let v = view(&CircuitText::default());
        assert_eq!(v.verdict_tone, Tone::Neutral);
        assert!(v.problem.starts_with("uo:"), "{}", v.problem);
        assert!(v.circuit.is_none());
    }
}
