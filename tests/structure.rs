//! The shape of the source tree: which top-level module may import which.
//!
//! loopside is layered: the core (numbers, codes, the store) at the bottom, the
//! application layer (`view`, `action`, `form`) above it, and the two fronts (`cli`, `app`)
//! on top, with `android` and `main` as entry points. This test reads `src/` and checks,
//! from the `use crate::X…` and `crate::X::…` paths in the code (comments and string
//! literals are skipped):
//!
//! - no import cycle among the top-level modules;
//! - the core imports none of `app`, `cli`, `view`, `action`, `form`;
//! - the application layer (`view`, `action`, `form`) imports neither front;
//! - `app` does not import `cli`, and `cli` does not import `app`.
//!
//! A failure names the file and line of each offending import.

use std::collections::{BTreeMap, BTreeSet};
use std::fs;
use std::path::{Path, PathBuf};

/// Modules above the core: the application layer, the fronts and the entry points.
const NOT_CORE: [&str; 7] = ["app", "cli", "view", "action", "form", "android", "main"];
/// What the core must never import.
const ABOVE_CORE: [&str; 5] = ["app", "cli", "view", "action", "form"];
/// The application layer, shared by both fronts.
const APPLICATION: [&str; 3] = ["view", "action", "form"];
/// The fronts.
const FRONTS: [&str; 2] = ["app", "cli"];

/// One `crate::X` reference: where it is and which top-level module it names.
#[derive(Debug, Clone, PartialEq, Eq)]
struct Import {
    /// The file, relative to the repository (`src/store/mod.rs`).
    file: String,
    /// 1-based line.
    line: usize,
    /// The top-level module the file belongs to (`store`).
    from: String,
    /// The top-level module imported (`report`).
    to: String,
}

impl std::fmt::Display for Import {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        write!(
            f,
            "{}:{}: `{}` imports `crate::{}`",
            self.file, self.line, self.from, self.to
        )
    }
}

/// The source with comments and the contents of string and char literals blanked out
/// (newlines kept, so line numbers stay right).
fn code_only(src: &str) -> String {
    let c: Vec<char> = src.chars().collect();
    let mut out = String::with_capacity(src.len());
    let blank = |ch: char| if ch == '\n' { '\n' } else { ' ' };
    let mut i = 0;
    while i < c.len() {
        // Line comment (also `///` and `//!` doc comments).
        if c[i] == '/' && c.get(i + 1) == Some(&'/') {
            while i < c.len() && c[i] != '\n' {
                out.push(' ');
                i += 1;
            }
            continue;
        }
        // Block comment, nested as Rust allows.
        if c[i] == '/' && c.get(i + 1) == Some(&'*') {
            let mut depth = 0;
            while i < c.len() {
                if c[i] == '/' && c.get(i + 1) == Some(&'*') {
                    depth += 1;
                    out.push_str("  ");
                    i += 2;
                } else if c[i] == '*' && c.get(i + 1) == Some(&'/') {
                    depth -= 1;
                    out.push_str("  ");
                    i += 2;
                    if depth == 0 {
                        break;
                    }
                } else {
                    out.push(blank(c[i]));
                    i += 1;
                }
            }
            continue;
        }
        // Raw string r"…", r#"…"#, br#"…"#.
        let prev_ident = i > 0 && (c[i - 1].is_alphanumeric() || c[i - 1] == '_');
        if !prev_ident && (c[i] == 'r' || (c[i] == 'b' && c.get(i + 1) == Some(&'r'))) {
            let start = if c[i] == 'b' { i + 2 } else { i + 1 };
            let mut j = start;
            while c.get(j) == Some(&'#') {
                j += 1;
            }
            if c.get(j) == Some(&'"') {
                let hashes = j - start;
                out.extend(&c[i..=j]);
                i = j + 1;
                while i < c.len() {
                    if c[i] == '"' && (0..hashes).all(|h| c.get(i + 1 + h) == Some(&'#')) {
                        break;
                    }
                    out.push(blank(c[i]));
                    i += 1;
                }
                continue;
            }
        }
        // Ordinary string.
        if c[i] == '"' {
            out.push('"');
            i += 1;
            while i < c.len() && c[i] != '"' {
                if c[i] == '\\' && i + 1 < c.len() {
                    out.push(' ');
                    out.push(blank(c[i + 1]));
                    i += 2;
                } else {
                    out.push(blank(c[i]));
                    i += 1;
                }
            }
            out.push('"');
            i += 1;
            continue;
        }
        // Char literal ('x', '\n', '\u{…}', '"'); a lifetime ('a) is left alone.
        if c[i] == '\'' {
            let end = if c.get(i + 1) == Some(&'\\') {
                (i + 2..c.len().min(i + 12)).find(|&k| c[k] == '\'')
            } else if c.get(i + 2) == Some(&'\'') {
                Some(i + 2)
            } else {
                None
            };
            if let Some(end) = end {
                out.push('\'');
                for _ in i + 1..end {
                    out.push(' ');
                }
                out.push('\'');
                i = end + 1;
                continue;
            }
        }
        out.push(c[i]);
        i += 1;
    }
    out
}

fn is_ident(ch: char) -> bool {
    ch.is_alphanumeric() || ch == '_'
}

/// Every `crate::X` in the code, as (line, X). `use crate::{a, b::c}` gives `a` and `b`.
fn crate_paths(src: &str) -> Vec<(usize, String)> {
    let code: Vec<char> = code_only(src).chars().collect();
    let line_at = |pos: usize| 1 + code[..pos].iter().filter(|&&ch| ch == '\n').count();
    let skip_ws = |mut k: usize| {
        while k < code.len() && code[k].is_whitespace() {
            k += 1;
        }
        k
    };
    let ident_at =
        |k: usize| -> String { code[k..].iter().take_while(|&&ch| is_ident(ch)).collect() };
    let needle: Vec<char> = "crate".chars().collect();
    let mut found = Vec::new();
    let mut i = 0;
    while i + needle.len() < code.len() {
        let before_ok = i == 0 || !(is_ident(code[i - 1]) || code[i - 1] == '$');
        if !(before_ok && code[i..i + needle.len()] == needle[..]) {
            i += 1;
            continue;
        }
        let mut k = skip_ws(i + needle.len());
        if !(code.get(k) == Some(&':') && code.get(k + 1) == Some(&':')) {
            i += 1;
            continue;
        }
        k = skip_ws(k + 2);
        if code.get(k) == Some(&'{') {
            // A group: the first name of each item at depth 1.
            let mut depth = 1;
            let mut expect_name = true;
            k += 1;
            while k < code.len() && depth > 0 {
                let ch = code[k];
                if ch == '{' {
                    depth += 1;
                } else if ch == '}' {
                    depth -= 1;
                } else if ch == ',' && depth == 1 {
                    expect_name = true;
                } else if expect_name && depth == 1 && is_ident(ch) {
                    let name = ident_at(k);
                    found.push((line_at(k), name.clone()));
                    expect_name = false;
                    k += name.chars().count();
                    continue;
                }
                k += 1;
            }
            i = k;
        } else {
            let name = ident_at(k);
            if !name.is_empty() {
                found.push((line_at(k), name));
            }
            i = k.max(i + 1);
        }
    }
    found
}

/// The top-level module a source file belongs to (`src/store/file.rs` → `store`);
/// `None` for `lib.rs`, the crate root.
fn module_of(relative: &Path) -> Option<String> {
    let mut parts = relative
        .components()
        .map(|c| c.as_os_str().to_string_lossy().to_string());
    let first = parts.next()?;
    if first == "lib.rs" {
        return None;
    }
    Some(first.trim_end_matches(".rs").to_string())
}

fn rust_files(dir: &Path, out: &mut Vec<PathBuf>) {
    let Ok(entries) = fs::read_dir(dir) else {
        return;
    };
    let mut entries: Vec<PathBuf> = entries.filter_map(|e| e.ok().map(|e| e.path())).collect();
    entries.sort();
    for path in entries {
        if path.is_dir() {
            rust_files(&path, out);
        } else if path.extension().is_some_and(|e| e == "rs") {
            out.push(path);
        }
    }
}

/// The imports between different top-level modules, from sources given as
/// (path relative to `src/`, text). Names that are not top-level modules (`crate::Result`,
/// re-exported at the root) are not imports of a module and are left out.
fn imports(sources: &[(PathBuf, String)]) -> Vec<Import> {
    let modules: BTreeSet<String> = sources.iter().filter_map(|(p, _)| module_of(p)).collect();
    let mut out = Vec::new();
    for (path, text) in sources {
        let Some(from) = module_of(path) else {
            continue;
        };
        for (line, to) in crate_paths(text) {
            if to != from && modules.contains(&to) {
                out.push(Import {
                    file: format!("src/{}", path.to_string_lossy().replace('\\', "/")),
                    line,
                    from: from.clone(),
                    to,
                });
            }
        }
    }
    out
}

/// Every source file under `src/`, relative to it, with its text.
fn sources() -> Vec<(PathBuf, String)> {
    let src = Path::new(env!("CARGO_MANIFEST_DIR")).join("src");
    let mut files = Vec::new();
    rust_files(&src, &mut files);
    assert!(
        !files.is_empty(),
        "no Rust files found under {}",
        src.display()
    );
    files
        .into_iter()
        .map(|p| {
            let text = fs::read_to_string(&p).unwrap_or_else(|e| panic!("{}: {e}", p.display()));
            let rel = p.strip_prefix(&src).unwrap_or(&p).to_path_buf();
            (rel, text)
        })
        .collect()
}

/// A cycle among the top-level modules, as the imports that make it (each one's first
/// occurrence), or `None`.
fn find_cycle(imports: &[Import]) -> Option<Vec<Import>> {
    let mut edges: BTreeMap<&str, BTreeMap<&str, &Import>> = BTreeMap::new();
    for imp in imports {
        edges
            .entry(imp.from.as_str())
            .or_default()
            .entry(imp.to.as_str())
            .or_insert(imp);
    }
    // Depth-first search with colours: 0 unvisited, 1 on the stack, 2 done.
    fn visit<'a>(
        node: &'a str,
        edges: &BTreeMap<&'a str, BTreeMap<&'a str, &'a Import>>,
        colour: &mut BTreeMap<&'a str, u8>,
        stack: &mut Vec<&'a Import>,
    ) -> Option<Vec<Import>> {
        colour.insert(node, 1);
        if let Some(next) = edges.get(node) {
            for (&to, &imp) in next {
                match colour.get(to).copied().unwrap_or(0) {
                    1 => {
                        let start = stack.iter().position(|i| i.from == to).unwrap_or(0);
                        let mut cycle: Vec<Import> =
                            stack[start..].iter().map(|&i| i.clone()).collect();
                        cycle.push(imp.clone());
                        return Some(cycle);
                    }
                    0 => {
                        stack.push(imp);
                        if let Some(c) = visit(to, edges, colour, stack) {
                            return Some(c);
                        }
                        stack.pop();
                    }
                    _ => {}
                }
            }
        }
        colour.insert(node, 2);
        None
    }
    let mut colour = BTreeMap::new();
    let nodes: Vec<&str> = edges.keys().copied().collect();
    for node in nodes {
        if colour.get(node).copied().unwrap_or(0) == 0 {
            let mut stack = Vec::new();
            if let Some(c) = visit(node, &edges, &mut colour, &mut stack) {
                return Some(c);
            }
        }
    }
    None
}

/// The imports breaking the layer rules, each with the rule it breaks.
fn layer_violations(imports: &[Import]) -> Vec<String> {
    let mut bad = Vec::new();
    for imp in imports {
        let (from, to) = (imp.from.as_str(), imp.to.as_str());
        let rule = if !NOT_CORE.contains(&from) && ABOVE_CORE.contains(&to) {
            Some("the core imports nothing above it (app, cli, view, action, form)")
        } else if APPLICATION.contains(&from) && FRONTS.contains(&to) {
            Some("the application layer (view, action, form) imports neither front")
        } else if from == "app" && to == "cli" {
            Some("the app does not import the command line")
        } else if from == "cli" && to == "app" {
            Some("the command line does not import the app")
        } else {
            None
        };
        if let Some(rule) = rule {
            bad.push(format!("{imp} — {rule}"));
        }
    }
    bad
}

#[test]
fn the_top_level_modules_import_each_other_without_a_cycle() {
    let imports = imports(&sources());
    if let Some(cycle) = find_cycle(&imports) {
        let path: Vec<String> = cycle.iter().map(|i| format!("  {i}")).collect();
        panic!(
            "import cycle among the top-level modules:\n{}",
            path.join("\n")
        );
    }
}

#[test]
fn each_layer_imports_only_what_lies_below_it() {
    let bad = layer_violations(&imports(&sources()));
    assert!(
        bad.is_empty(),
        "imports against the layering:\n  {}",
        bad.join("\n  ")
    );
}

#[test]
fn the_reader_sees_the_crate_modules_this_test_is_about() {
    // Guards the reader itself: if it stopped finding imports, the two tests above would
    // pass on anything. The command line certainly uses the core's scaling.
    let imports = imports(&sources());
    assert!(
        imports.iter().any(|i| i.from == "cli" && i.to == "scale"),
        "no import of crate::scale found in src/cli: the reader is broken"
    );
    let modules: BTreeSet<&str> = imports.iter().map(|i| i.from.as_str()).collect();
    for m in ["store", "report", "view", "cli", "app"] {
        assert!(modules.contains(m), "no imports read from src/{m}");
    }
}

/// Format specifiers with a precision (`{:.2}`, `{v:.3}`, `{:>8.1}`, `{x:.prec$}`) on code
/// lines (comments skipped), as (line, specifier).
fn precision_specifiers(src: &str) -> Vec<(usize, String)> {
    let mut found = Vec::new();
    for (n, line) in src.lines().enumerate() {
        if line.trim_start().starts_with("//") {
            continue;
        }
        let mut rest = line;
        while let Some(open) = rest.find('{') {
            let after = &rest[open + 1..];
            let Some(close) = after.find(['}', '{', '"']) else {
                break;
            };
            let inner = &after[..close];
            if after[close..].starts_with('}') {
                if let Some((_, spec)) = inner.split_once(':') {
                    let precise = spec.split_once('.').is_some_and(|(_, p)| {
                        !p.is_empty()
                            && (p.chars().all(|c| c.is_ascii_digit())
                                || p == "*"
                                || (p.ends_with('$')
                                    && p[..p.len() - 1]
                                        .chars()
                                        .all(|c| c.is_alphanumeric() || c == '_')))
                    });
                    if precise {
                        found.push((n + 1, format!("{{{inner}}}")));
                    }
                }
            }
            rest = &after[close..];
        }
    }
    found
}

#[test]
fn numbers_are_rounded_for_people_only_in_display() {
    // RULES: display rounding only in src/display.rs (which never prints -0.00).
    let mut bad = Vec::new();
    for (path, text) in sources() {
        let file = format!("src/{}", path.to_string_lossy().replace('\\', "/"));
        if file == "src/display.rs" {
            continue;
        }
        for (line, spec) in precision_specifiers(&text) {
            bad.push(format!(
                "{file}:{line}: `{spec}` rounds outside display; use a crate::display format"
            ));
        }
    }
    assert!(
        bad.is_empty(),
        "rounding outside src/display.rs:\n  {}",
        bad.join("\n  ")
    );
}

#[test]
fn the_rounding_reader_sees_precision_but_not_plain_or_padded_fields() {
    let text = "let a = format!(\"{v:.2} V\");\n// {:.3} in a comment\nlet b = format!(\"{:>8.1}|{:>8}|{x}|{:.prec$}\", 1.0, 2, 3.0);\n";
    assert_eq!(
        precision_specifiers(text),
        vec![
            (1, "{v:.2}".to_string()),
            (3, "{:>8.1}".to_string()),
            (3, "{:.prec$}".to_string())
        ]
    );
}

// ---- The checker on small invented sources, so each rule is seen to fail. ----

fn sample(files: &[(&str, &str)]) -> Vec<(PathBuf, String)> {
    files
        .iter()
        .map(|(p, t)| (PathBuf::from(p), t.to_string()))
        .collect()
}

#[test]
fn a_store_that_imports_the_report_that_imports_it_is_a_cycle_named_by_file_and_line() {
    let src = sample(&[
        (
            "store/mod.rs",
            "//! The store.\n\nuse crate::report::Bundle;\n",
        ),
        ("report.rs", "use crate::{error::Result, store::Store};\n"),
        ("error.rs", "pub struct E;\n"),
    ]);
    let cycle = find_cycle(&imports(&src)).expect("store ⇄ report is a cycle");
    let text: Vec<String> = cycle.iter().map(|i| i.to_string()).collect();
    let text = text.join("\n");
    assert!(
        text.contains("src/store/mod.rs:3: `store` imports `crate::report`"),
        "{text}"
    );
    assert!(
        text.contains("src/report.rs:1: `report` imports `crate::store`"),
        "{text}"
    );
}

#[test]
fn a_core_module_that_formats_through_a_view_is_named_with_its_line() {
    let src = sample(&[
        (
            "budget.rs",
            "fn f() {\n    let s = crate::view::power::line(1.0);\n}\n",
        ),
        ("view/mod.rs", "pub mod power;\n"),
        ("cli/mod.rs", "use crate::app::state;\n"),
        ("app/mod.rs", "use crate::budget;\n"),
    ]);
    let bad = layer_violations(&imports(&src));
    assert_eq!(bad.len(), 2, "{bad:?}");
    assert!(
        bad.iter()
            .any(|b| b.starts_with("src/budget.rs:2: `budget` imports `crate::view`")),
        "{bad:?}"
    );
    assert!(
        bad.iter()
            .any(|b| b.starts_with("src/cli/mod.rs:1: `cli` imports `crate::app`")),
        "{bad:?}"
    );
}

#[test]
fn comments_strings_and_root_items_are_not_imports() {
    let src = sample(&[
        (
            "store/mod.rs",
            "//! Written by [`crate::report::json`].\n/* crate::report */\nconst S: &str = \"crate::report\";\nconst R: &str = r#\"crate::report\"#;\nconst C: char = '\"';\nuse crate::Result;\nfn f<'a>(x: &'a str) {}\n",
        ),
        ("report.rs", "use crate::store::Store;\n"),
    ]);
    let found = imports(&src);
    assert_eq!(found.len(), 1, "{found:?}");
    assert_eq!(
        (found[0].from.as_str(), found[0].to.as_str()),
        ("report", "store")
    );
    assert!(find_cycle(&found).is_none());
}

#[test]
fn nested_groups_give_each_first_name_on_its_own_line() {
    let text = "use crate::{\n    budget::{self, Budget},\n    scale::Range,\n};\n";
    assert_eq!(
        crate_paths(text),
        vec![(2, "budget".to_string()), (3, "scale".to_string())]
    );
}

#[test]
fn fault_finding_evaluations_give_numbers_and_leave_the_words_above_the_core() {
    // Issue 12: the core returns codes and typed details; the sentences (and the numbers
    // rounded for people in them) are written once in src/view/wording/finding.rs. An
    // evaluation that reaches for crate::display is writing words again.
    let mut bad = Vec::new();
    for (path, text) in sources() {
        let file = format!("src/{}", path.to_string_lossy().replace('\\', "/"));
        if !(file.starts_with("src/diagnose/evaluate/") || file == "src/diagnose/mismatch.rs") {
            continue;
        }
        for (line, module) in crate_paths(&text) {
            if module == "display" {
                bad.push(format!("{file}:{line}: rounds for people (crate::display)"));
            }
        }
    }
    assert!(
        bad.is_empty(),
        "words in the fault-finding core; word the finding in view::wording::finding:\n  {}",
        bad.join("\n  ")
    );
}

#[test]
fn the_words_guard_sees_display_used_by_an_evaluation() {
    let text =
        "use crate::error::Result;\nfn t(v: f64) -> String {\n    crate::display::volts(v)\n}\n";
    assert_eq!(
        crate_paths(text),
        vec![(1, "error".to_string()), (3, "display".to_string())]
    );
}
