//! The safety cautions loopside shows before every fault-finding procedure and loop check.
//!
//! They are plain words, shown before the first step and carried in every saved session
//! and check record, so the person reading the log later sees what was shown.

/// The cautions, in the order they are shown.
pub const CAUTIONS: [&str; 4] = [
    "Breaking or forcing this loop moves whatever it controls or trips: tell operations first, put the loop in manual or bypass it under the site's procedure, and restore it when you are done.",
    "In a hazardous area use only equipment certified for that area, and follow the intrinsic-safety rules (IEC 60079-14 or the local code) and the site's permits.",
    "Work under the site's permit and isolation (lockout) rules; a 24 V loop cabinet can hold mains voltage too.",
    "loopside supports, and never replaces, local codes, site procedures and licensed practice.",
];

/// The cautions as one Markdown list, for reports.
pub fn markdown() -> String {
    CAUTIONS.iter().map(|c| format!("- {c}\n")).collect()
}
