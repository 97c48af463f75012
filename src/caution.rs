//! The safety cautions loopside shows before every fault-finding procedure and loop check.
//!
//! They are plain words, shown before the first step and carried in every saved session,
//! so the person reading the log later sees what was shown. They cover both sides of a
//! transmitter: the electrical side (the loop and what it drives, hazardous areas, the
//! cabinet) and the process side (pressure, temperature and the fluid itself when a
//! transmitter is valved out, vented or equalised).
//!
//! What to put right before leaving the loop is the companion list in [`crate::leave`].

/// The cautions, in the order they are shown.
pub const CAUTIONS: [&str; 5] = [
    "Breaking or forcing this loop moves whatever it controls or trips: tell operations first, put the loop in manual or bypass it under the site's procedure, and restore it when you are done.",
    "In a hazardous area use only equipment certified for that area, and follow the intrinsic-safety rules (IEC 60079-14 or the local code) and the site's permits.",
    "Work under the site's permit and isolation (lockout) rules; a 24 V loop cabinet can hold mains voltage too.",
    "Process side: valving out, venting, draining or equalising a transmitter lets out trapped pressure and process fluid, which may be hot, toxic or corrosive. Follow the manifold's valve sequence (never open the equaliser while both block valves are open) and the site's isolation procedure, and vent or drain only to a safe place.",
    "loopside supports, and never replaces, local codes, site procedures and licensed practice.",
];

/// The cautions as one Markdown list, for reports.
pub fn markdown() -> String {
    CAUTIONS.iter().map(|c| format!("- {c}\n")).collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_cautions_cover_the_process_side_too() {
        // Valving out a DP transmitter on a live line releases what the line holds
        // (common practice: isolate, equalise, then vent, under the site's procedure).
        let process = CAUTIONS
            .iter()
            .find(|c| c.contains("pressure"))
            .expect("a caution about process pressure");
        for words in [
            "process fluid",
            "hot",
            "toxic",
            "manifold",
            "isolation procedure",
        ] {
            assert!(process.contains(words), "{words}: {process}");
        }
        assert!(CAUTIONS[CAUTIONS.len() - 1].contains("never replaces"));
        assert!(markdown().lines().count() == CAUTIONS.len());
    }
}
