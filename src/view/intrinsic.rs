//! The intrinsic-safety screen's view model: the caution, the circuit as typed checked by
//! the entity concept, each check pass or FAIL with its numbers and margin, the sums, the
//! longest cable, what was assumed, and a plain picture of the circuit (source, cable,
//! devices) as three labelled boxes. Worked out from [`crate::form::intrinsic`] and
//! [`crate::intrinsic`], worded by [`crate::view::wording::intrinsic`]; no UI toolkit.

use crate::display;
use crate::form::intrinsic::{parse_circuit, CircuitText};
use crate::intrinsic::{self, Circuit, GasGroup, TempClass, Verdict};
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

/// A gas-group or temperature-class picker on the IS screen: what each option shows, the
/// form text it stands for, and the one picked.
#[derive(Debug, Clone, PartialEq)]
pub struct IsChoices {
    /// The words of each option, [`NOT_GIVEN`] first.
    pub options: Vec<String>,
    /// The form's text for each option (empty for [`NOT_GIVEN`]).
    pub texts: Vec<String>,
    /// The option picked.
    pub current: usize,
}

impl IsChoices {
    /// The form's text for option `index` (what a tap on it stores); `None` past the end.
    pub fn text_of(&self, index: usize) -> Option<&str> {
        self.texts.get(index).map(String::as_str)
    }
}

/// The words of each picker's first option: nothing recorded (the check then lists what
/// it could not check; the area's gas group is asked for by name).
pub const NOT_GIVEN: &str = "not given";

/// The picker for `current` (the form's text) over `listed` (words, text) pairs; a text
/// that does not read as one of them (typed before the picker, or on the command line) is
/// offered as typed, so nothing changes unseen: the check names it.
fn choices(
    current: &str,
    listed: Vec<(String, String)>,
    read: impl Fn(&str) -> Option<String>,
) -> IsChoices {
    let (mut options, mut texts): (Vec<String>, Vec<String>) =
        std::iter::once((NOT_GIVEN.to_string(), String::new()))
            .chain(listed)
            .unzip();
    let typed = current.trim();
    let current = if typed.is_empty() {
        0
    } else {
        match read(typed).and_then(|t| texts.iter().position(|x| *x == t)) {
            Some(i) => i,
            None => {
                options.push(typed.to_string());
                texts.push(typed.to_string());
                options.len() - 1
            }
        }
    };
    IsChoices {
        options,
        texts,
        current,
    }
}

/// The gas-group picker (IIA, IIB, IIC, each with its gases) for a group as the form
/// holds it (`IIC`, `2c`; empty: not given).
pub fn group_choices(current: &str) -> IsChoices {
    choices(
        current,
        GasGroup::ALL
            .iter()
            .map(|&g| (words::group_option(g), g.label().to_string()))
            .collect(),
        |t| {
            GasGroup::parse("group", t)
                .ok()
                .map(|g| g.label().to_string())
        },
    )
}

/// The temperature-class picker (T1 to T6, each with its surface temperature) for a class
/// as the form holds it (`T4`; empty: not given).
pub fn class_choices(current: &str) -> IsChoices {
    choices(
        current,
        TempClass::ALL
            .iter()
            .map(|&c| (words::class_option(c), c.label().to_string()))
            .collect(),
        |t| {
            TempClass::parse("class", t)
                .ok()
                .map(|c| c.label().to_string())
        },
    )
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
    fn the_pickers_list_every_group_and_class_in_words_and_read_back_what_they_show() {
        let g = group_choices("");
        assert_eq!(
            g.options,
            [
                "not given",
                "IIA (propane)",
                "IIB (ethylene)",
                "IIC (hydrogen, acetylene)"
            ]
        );
        assert_eq!(g.current, 0);
        for i in 0..g.options.len() {
            let text = g.text_of(i).unwrap();
            assert_eq!(group_choices(text).current, i, "{text:?}");
        }
        // As technicians type it: `2c`, ` iic `.
        assert_eq!(group_choices(" 2c ").current, 3);
        let t = class_choices("t4");
        assert_eq!(t.options.len(), 7);
        assert_eq!(t.options[4], "T4 (135 °C)");
        assert_eq!(t.options[6], "T6 (85 °C)");
        assert_eq!(t.current, 4);
        assert_eq!(t.text_of(4), Some("T4"));
        assert_eq!(t.text_of(7), None);
        // A text that does not read is offered as typed (the check names it), not lost.
        let odd = group_choices("IID");
        assert_eq!(odd.options.len(), 5);
        assert_eq!(odd.current, 4);
        assert_eq!(odd.text_of(4), Some("IID"));
    }

    #[test]
    fn an_empty_form_names_the_first_field_to_type() {
        let v = view(&CircuitText::default());
        assert_eq!(v.verdict_tone, Tone::Neutral);
        assert!(v.problem.starts_with("uo:"), "{}", v.problem);
        assert!(v.circuit.is_none());
    }
}
