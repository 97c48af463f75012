//! Every typed field in the UI says what it takes, so a phone opens the right keyboard: a
//! plain number opens the number pad (Slint's decimal input type on Android), a number that
//! may carry a unit and text keep the full keyboard (ui/widgets/kinds.slint, `Takes`).
//!
//! Read from the `.slint` sources: each `TextField` and `BigNumber` placed on a screen must
//! set `takes:`, and a field left as text must be one a technician types words into (the
//! list below), so a new number field cannot slip in with the full keyboard unnoticed.

use std::fs;
use std::path::Path;

/// The fields that take words, not numbers, by their label or accessible name.
const TEXT_FIELDS: &[&str] = &[
    // Who and what.
    "Tag number",
    "Service",
    "Area",
    "Unit",
    "Table output unit",
    "Pressure unit",
    "Initials",
    "Note",
    "What you found and did",
    "Element {} name",
    "Reference id",
    // A date (YYYY-MM-DD) or a period (12 h, today).
    "Calibration due",
    "Since",
    // Searches and file paths.
    "Search tags",
    "Search the log",
    "Write reports to folder",
    "Bundle file to import",
    // Intrinsic safety: names and certificates (gas groups and temperature classes are
    // picked, not typed).
    "Source name",
    "Name of device {}",
    "Certificate of the source",
    "Certificate of {}",
];

/// One field placed in a `.slint` file.
#[derive(Debug)]
struct Placed {
    file: String,
    line: usize,
    label: String,
    takes: Option<String>,
}

/// The literal of `key: @tr("…")` or `key: "…"` at the block's own level, if any.
fn literal(block: &[&str], key: &str) -> Option<String> {
    block.iter().find_map(|l| {
        let t = l.trim();
        let rest = t.strip_prefix(key)?.trim_start().strip_prefix(':')?.trim();
        let rest = rest.strip_prefix("@tr(").unwrap_or(rest);
        let start = rest.find('"')?;
        let end = rest[start + 1..].find('"')?;
        Some(rest[start + 1..start + 1 + end].to_string())
    })
}

fn placed_in(path: &Path) -> Vec<Placed> {
    let text = fs::read_to_string(path).unwrap();
    let lines: Vec<&str> = text.lines().collect();
    let mut out = Vec::new();
    for (i, l) in lines.iter().enumerate() {
        let t = l.trim_start();
        let widget = ["TextField {", "BigNumber {"].iter().any(|w| {
            t.starts_with(w) || t.contains(&format!(":= {w}")) || t.contains(&format!(": {w}"))
        });
        if !widget || t.starts_with("export component") {
            continue;
        }
        // The block's own lines: depth 1 inside its braces.
        let mut depth = 0i32;
        let mut own: Vec<&str> = Vec::new();
        for (j, m) in lines[i..].iter().enumerate() {
            let before = depth;
            depth += m.matches('{').count() as i32 - m.matches('}').count() as i32;
            if j > 0 && before == 1 {
                own.push(m);
            }
            if depth <= 0 && j > 0 {
                break;
            }
        }
        let takes = own.iter().find_map(|m| {
            let t = m.trim();
            t.strip_prefix("takes:")
                .map(|v| v.trim().trim_end_matches(';').trim().to_string())
        });
        let label = literal(&own, "name")
            .or_else(|| literal(&own, "label"))
            .unwrap_or_else(|| "(label from the model)".to_string());
        out.push(Placed {
            file: path.display().to_string(),
            line: i + 1,
            label,
            takes,
        });
    }
    out
}

fn all_placed() -> Vec<Placed> {
    let mut out = Vec::new();
    for dir in ["ui/views", "ui/widgets", "ui"] {
        let dir = Path::new(env!("CARGO_MANIFEST_DIR")).join(dir);
        let mut files: Vec<_> = fs::read_dir(&dir)
            .unwrap()
            .flatten()
            .map(|e| e.path())
            .filter(|p| p.extension().is_some_and(|x| x == "slint"))
            .collect();
        files.sort();
        for f in files {
            out.extend(placed_in(&f));
        }
    }
    out
}

#[test]
fn every_typed_field_says_what_it_takes() {
    let placed = all_placed();
    assert!(placed.len() > 40, "only {} fields found", placed.len());
    let unsaid: Vec<String> = placed
        .iter()
        .filter(|p| p.takes.is_none())
        .map(|p| format!("{}:{} {}", p.file, p.line, p.label))
        .collect();
    assert!(
        unsaid.is_empty(),
        "fields without `takes:`:\n{}",
        unsaid.join("\n")
    );
}

#[test]
fn only_fields_for_words_keep_the_full_keyboard_as_text() {
    let wrong: Vec<String> = all_placed()
        .iter()
        .filter(|p| p.takes.as_deref() == Some("Takes.text"))
        .filter(|p| !TEXT_FIELDS.contains(&p.label.as_str()))
        .map(|p| format!("{}:{} {}", p.file, p.line, p.label))
        .collect();
    assert!(
        wrong.is_empty(),
        "marked as text but not a field for words (a number? mark it Takes.number or \
         Takes.number-and-unit):\n{}",
        wrong.join("\n")
    );
}

#[test]
fn the_number_pad_is_asked_for_on_android_only() {
    // The desktop keeps free text so a decimal comma types in any locale.
    #[cfg(feature = "ui")]
    assert_eq!(loopside::app::NUMBER_PAD, cfg!(target_os = "android"));
    let widget = fs::read_to_string(concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/ui/widgets/text_field.slint"
    ))
    .unwrap();
    assert!(widget.contains(
        "input-type: root.takes == Takes.number && Keyboard.number-pad ? InputType.decimal : InputType.text;"
    ));
}
