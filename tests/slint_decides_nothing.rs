//! The `.slint` files lay out and bind; they do not decide. A state, a colour class or an
//! error field comes from Rust as an enum or a boolean, never as a string or a number the
//! `.slint` file compares to pick what to show (`kind == 3`, `source == "ma"`).
//!
//! This reads the text of every `ui/**/*.slint` file (no Slint needed) and refuses:
//! - a comparison with a non-empty string literal (`== "supply"`);
//! - a comparison with a bare number (`== 0`, `> 1`, `kind == 4`);
//! - a string literal passed to a callback or function (`edited("supply", t)`,
//!   `export-report("md")`): a field or a choice is named by an enum (`FormField.supply`,
//!   `ReportFormat.markdown`), which Rust matches exhaustively, never by a word Rust must
//!   spell the same way. Text for people goes through `@tr("…")`, which is allowed.
//!
//! Allowed, because they decide nothing about the domain: comparisons with a number that
//! carries a unit (`width > 600px`, layout arithmetic); whether a text is empty (`!= ""`)
//! or a list has anything in it (`.length > 0`); comparisons with enum values or other
//! properties (`i == root.current`, `tone == Tone.good`).

use std::path::{Path, PathBuf};

const OPERATORS: [&str; 6] = ["==", "!=", "<=", ">=", "<", ">"];

/// The code of one line with `//` comments removed and string literals kept.
fn code_of(line: &str) -> &str {
    let mut in_string = false;
    let mut escaped = false;
    let bytes = line.as_bytes();
    for (i, &b) in bytes.iter().enumerate() {
        match b {
            _ if escaped => escaped = false,
            b'\\' if in_string => escaped = true,
            b'"' => in_string = !in_string,
            b'/' if !in_string && bytes.get(i + 1) == Some(&b'/') => return &line[..i],
            _ => {}
        }
    }
    line
}

/// One side of a comparison, as far as this test cares.
enum Operand {
    /// A string literal's contents.
    Text(String),
    /// A bare number.
    Number(f64),
    /// A number with a unit (`600px`, `50%`): layout.
    WithUnit,
    /// Anything else: a property, an enum value, an expression.
    Other,
}

/// The operand right after a comparison operator (leading spaces skipped).
fn operand_after(text: &str) -> Operand {
    let t = text.trim_start();
    if let Some(rest) = t.strip_prefix('"') {
        return Operand::Text(rest.split('"').next().unwrap_or("").to_string());
    }
    number_at_start(t)
}

/// A number at the start of `t`, with or without a unit.
fn number_at_start(t: &str) -> Operand {
    let digits: String = t
        .chars()
        .enumerate()
        .take_while(|(i, c)| c.is_ascii_digit() || *c == '.' || (*i == 0 && *c == '-'))
        .map(|(_, c)| c)
        .collect();
    if !digits.chars().any(|c| c.is_ascii_digit()) {
        return Operand::Other;
    }
    match t[digits.len()..].chars().next() {
        Some(c) if c.is_alphabetic() || c == '%' => Operand::WithUnit,
        _ => digits.parse().map_or(Operand::Other, Operand::Number),
    }
}

/// The operand right before a comparison operator.
fn operand_before(text: &str) -> Operand {
    let t = text.trim_end();
    if let Some(rest) = t.strip_suffix('"') {
        return Operand::Text(rest.rsplit('"').next().unwrap_or("").to_string());
    }
    let start = t
        .rfind(|c: char| !(c.is_ascii_alphanumeric() || c == '.' || c == '-' || c == '%'))
        .map_or(0, |i| i + 1);
    let token = &t[start..];
    if token.starts_with(|c: char| c.is_ascii_digit()) {
        number_at_start(token)
    } else {
        Operand::Other
    }
}

/// The comparisons in one line of `.slint` code that decide from a literal.
fn deciding_comparisons(line: &str) -> Vec<String> {
    let code = code_of(line);
    let mut found = Vec::new();
    let bytes = code.as_bytes();
    let mut in_string = false;
    let mut i = 0;
    while i < bytes.len() {
        if bytes[i] == b'"' && (i == 0 || bytes[i - 1] != b'\\') {
            in_string = !in_string;
            i += 1;
            continue;
        }
        if in_string {
            i += 1;
            continue;
        }
        let Some(op) = OPERATORS.iter().find(|op| code[i..].starts_with(**op)) else {
            i += 1;
            continue;
        };
        // `->`, `=>` and `<=>` are not comparisons.
        let prev = if i > 0 { bytes[i - 1] } else { b' ' };
        let next_i = i + op.len();
        let is_arrow = prev == b'-' || prev == b'=' || code[next_i..].starts_with('>');
        if !is_arrow {
            let (before, after) = (&code[..i], &code[next_i..]);
            let length_of_list = before.trim_end().ends_with(".length");
            for operand in [operand_before(before), operand_after(after)] {
                match operand {
                    Operand::Text(t) if !t.is_empty() => found.push(format!("{op} \"{t}\"")),
                    Operand::Number(n) if !(length_of_list && n == 0.0) => {
                        found.push(format!("{op} {n}"))
                    }
                    _ => {}
                }
            }
        }
        i = next_i;
    }
    found
}

/// The string literals one line of `.slint` code passes to a callback or a function
/// (`@tr` and `@image-url` take text and paths, not keys, and are allowed).
fn string_arguments(line: &str) -> Vec<String> {
    let code = code_of(line);
    let bytes = code.as_bytes();
    let mut callees: Vec<String> = Vec::new();
    let mut found = Vec::new();
    let mut i = 0;
    while i < bytes.len() {
        match bytes[i] {
            b'"' => {
                let end = code[i + 1..]
                    .char_indices()
                    .scan(false, |escaped, (j, c)| {
                        let stop = c == '"' && !*escaped;
                        *escaped = c == '\\' && !*escaped;
                        Some((j, stop))
                    })
                    .find(|(_, stop)| *stop)
                    .map_or(code.len(), |(j, _)| i + 1 + j);
                let called = callees.last().is_some_and(|c| {
                    !c.is_empty() && !["@tr", "@image-url", "if"].contains(&c.as_str())
                });
                if called {
                    found.push(format!(
                        "{}(\"{}\")",
                        callees[callees.len() - 1],
                        &code[i + 1..end]
                    ));
                }
                i = end + 1;
                continue;
            }
            b'(' => {
                let before = code[..i].trim_end();
                let start = before
                    .rfind(|c: char| !(c.is_ascii_alphanumeric() || "-_.@".contains(c)))
                    .map_or(0, |k| k + 1);
                callees.push(before[start..].to_string());
            }
            b')' => {
                callees.pop();
            }
            _ => {}
        }
        i += 1;
    }
    found
}

fn slint_files(dir: &Path, out: &mut Vec<PathBuf>) {
    for entry in std::fs::read_dir(dir).unwrap() {
        let path = entry.unwrap().path();
        if path.is_dir() {
            slint_files(&path, out);
        } else if path.extension().is_some_and(|e| e == "slint") {
            out.push(path);
        }
    }
}

#[test]
fn the_checker_tells_a_decision_from_layout() {
    // What the screens used to do, and must not do again.
    for bad in [
        "invalid: PowerAdapter.error-field == \"supply\";",
        "source: ConvertAdapter.source == \"ma\";",
        "selected: CheckAdapter.stage == 0;",
        "background: band.kind == 4 ? Theme.ok : Theme.dead;",
        "if FaultAdapter.step-number > 0: Card {",
        "if 1 == row.kind: Text {",
    ] {
        assert!(!deciding_comparisons(bad).is_empty(), "not caught: {bad}");
    }
    // Layout, presence and enums.
    for fine in [
        "property <bool> wide: root.width > 600px;",
        "if root.error-text != \"\": Text {",
        "if TagsAdapter.sheet-open.length > 0: Card {",
        "border-color: i == root.current ? Theme.accent : Theme.border;",
        "return tone == Tone.good ? Theme.ok : Theme.border;",
        "in property <int> error-row: -1;",
        "public pure function of(kind: SliceKind) -> color {",
        "clicked => { root.picked(i); }",
        "text <=> TagsAdapter.form.cutoff;",
        "label: @tr(\"Element {}\", i + 1); // kind == 3 in a comment",
        "text: @tr(\"a == \\\"b\\\" inside a string\");",
        "width: (band.end - band.start) * parent.width;",
    ] {
        assert_eq!(deciding_comparisons(fine), Vec::<String>::new(), "{fine}");
    }
}

#[test]
fn the_checker_tells_a_key_from_text() {
    // What the screens used to pass, and must not pass again.
    for bad in [
        "edited(t) => { PowerAdapter.edited(\"supply\", t); }",
        "clicked => { LogAdapter.export-report(\"md\"); }",
        "clicked => { root.add(\"volts\"); }",
        "edited(t) => { ConvertAdapter.calc-edited( \"cj\", t); }",
    ] {
        assert!(!string_arguments(bad).is_empty(), "not caught: {bad}");
    }
    for fine in [
        "edited(t) => { PowerAdapter.edited(FormField.supply, t); }",
        "text: @tr(\"Edit {}\", TagsAdapter.form.number);",
        "accessible-label: @tr(\"Remove row {}\", i + 1);",
        "unit: \"V\";",
        "label: @tr(\"Row {} input\", i + 1); // add(\"x\") in a comment",
        "text: (root.a + \" · \") + root.b;",
    ] {
        assert_eq!(string_arguments(fine), Vec::<String>::new(), "{fine}");
    }
}

#[test]
fn no_slint_file_names_a_field_or_a_choice_by_a_string() {
    let mut files = Vec::new();
    slint_files(
        &Path::new(env!("CARGO_MANIFEST_DIR")).join("ui"),
        &mut files,
    );
    let mut offending = Vec::new();
    for file in &files {
        let text = std::fs::read_to_string(file).unwrap();
        for (n, line) in text.lines().enumerate() {
            for c in string_arguments(line) {
                offending.push(format!(
                    "{}:{}: {c}: {}",
                    file.display(),
                    n + 1,
                    line.trim()
                ));
            }
        }
    }
    assert!(
        offending.is_empty(),
        "pass an enum (FormField, a per-form enum in widgets/kinds.slint), not a string:\n{}",
        offending.join("\n")
    );
}

#[test]
fn no_slint_file_decides_from_a_string_or_a_number() {
    let mut files = Vec::new();
    slint_files(
        &Path::new(env!("CARGO_MANIFEST_DIR")).join("ui"),
        &mut files,
    );
    assert!(files.len() > 10, "the .slint files are found");
    let mut offending = Vec::new();
    for file in &files {
        let text = std::fs::read_to_string(file).unwrap();
        for (n, line) in text.lines().enumerate() {
            for c in deciding_comparisons(line) {
                offending.push(format!(
                    "{}:{}: {c}: {}",
                    file.display(),
                    n + 1,
                    line.trim()
                ));
            }
        }
    }
    assert!(
        offending.is_empty(),
        "decide these in Rust (an enum or a boolean):\n{}",
        offending.join("\n")
    );
}
