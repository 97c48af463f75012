//! What the About screen and `loopside licences` say about licences: the one wording.

use crate::licence;

/// The licences loopside ships under and with, before the third-party crates.
pub const LICENCES: [&str; 3] = [
    "loopside: MIT licence.",
    "User interface: Slint, used under the Slint Royalty-free Desktop, Mobile and Web Applications Licence 2.0 (its attribution is on the About screen).",
    "Font: B612 by Airbus and contributors, SIL Open Font License 1.1 (ui/fonts/B612-LICENSE.txt).",
];

/// One paragraph per licence expression declared by the third-party crates compiled into
/// the app: `MIT OR Apache-2.0 (252 crates): ab_glyph 0.2.32, …`, the most common first.
pub fn third_party_paragraphs() -> Vec<String> {
    licence::by_licence()
        .into_iter()
        .map(|(expr, crates)| {
            let names: Vec<String> = crates
                .iter()
                .map(|c| format!("{} {}", c.name, c.version))
                .collect();
            let count = if crates.len() == 1 {
                "1 crate".to_string()
            } else {
                format!("{} crates", crates.len())
            };
            format!("{expr} ({count}): {}.", names.join(", "))
        })
        .collect()
}

/// Everything the About screen lists under Licences: loopside's own, the toolkit's and the
/// font's, a heading line, then the third-party paragraphs.
pub fn licence_lines() -> Vec<String> {
    let crates = licence::third_party().len();
    let mut lines: Vec<String> = LICENCES.iter().map(|l| (*l).to_string()).collect();
    lines.push(format!(
        "Third-party crates compiled into the app ({crates}), each under the licence it declares; where it offers a choice (OR), loopside uses it under any of them:"
    ));
    lines.extend(third_party_paragraphs());
    lines
}

/// `loopside licences` as text: one line per crate, `name version  licence`, after the
/// app's own licences.
pub fn licence_listing() -> Vec<String> {
    let mut lines: Vec<String> = LICENCES.iter().map(|l| (*l).to_string()).collect();
    lines.push(String::new());
    for c in licence::third_party() {
        lines.push(format!("{} {}  {}", c.name, c.version, c.licence));
    }
    lines
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_crate_appears_once_in_the_paragraphs() {
        let text = third_party_paragraphs().join("\n");
        for c in licence::third_party() {
            assert!(
                text.contains(&format!("{} {}", c.name, c.version)),
                "{} missing",
                c.name
            );
        }
        let total: usize = licence::by_licence().iter().map(|(_, v)| v.len()).sum();
        assert_eq!(total, licence::third_party().len());
    }
}
