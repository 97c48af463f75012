//! The "before you leave" list: what a technician puts right at the end of a loop check or
//! a fault-finding session, before walking away from the loop.
//!
//! The four items (loop back in its normal mode, links closed, forces and bypasses
//! removed, operations told) are worded here and only here. The technician ticks them on
//! the Check and Find fault screens, or names them on the command line (`--done
//! loop,links,forces,operations`); both fronts record the answer as the same
//! [`LeaveList`], carried in the check result and in the fault-finding session under the
//! payload key [`PAYLOAD_KEY`].
//!
//! Nothing is refused when an item is not ticked: a technician may leave a loop bypassed
//! on purpose for a follow-up. The record then says plainly which items were not done (or
//! not confirmed), and so do the log text and the handoff report, through [`LeaveList::summary`].
//!
//! The record carries its own [`LEAVE_VERSION`] and the words of each item, so a record
//! written today reads the same after the list changes; records written before the list
//! existed have no such field and read as "not recorded" ([`summary_of`]).

use crate::error::{FieldError, Result};
use serde::{Deserialize, Serialize};

/// The version of the record shape this build writes.
pub const LEAVE_VERSION: u32 = 1;

/// The key the record is stored under in a check's or a session's payload.
pub const PAYLOAD_KEY: &str = "before_leaving";

/// The heading the list is shown under.
pub const HEADING: &str = "Before you leave";

/// The word beside a ticked item.
pub const DONE_WORD: &str = "done";

/// The word beside an item not ticked.
pub const NOT_DONE_WORD: &str = "not done";

/// The same, where it must stand out in running text (log, report, command line).
pub const NOT_DONE_LOUD: &str = "NOT done";

/// One thing to put right before leaving the loop.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub enum Item {
    /// The loop back in its normal mode: controller out of manual, transmitter out of a
    /// fixed current or test mode.
    Loop,
    /// Test links closed, terminals tight, the meter out of the loop, covers back on.
    Links,
    /// Forces and bypasses removed in the control and safety systems.
    Forces,
    /// Operations told what state the loop is left in.
    Operations,
}

impl Item {
    /// Every item, in the order shown.
    pub const ALL: [Item; 4] = [Item::Loop, Item::Links, Item::Forces, Item::Operations];

    /// The stable id, as stored and as typed on the command line.
    pub fn id(self) -> &'static str {
        match self {
            Item::Loop => "loop",
            Item::Links => "links",
            Item::Forces => "forces",
            Item::Operations => "operations",
        }
    }

    /// The item with this id (case and surrounding spaces ignored).
    pub fn from_id(text: &str) -> Option<Item> {
        let t = text.trim().to_lowercase();
        Item::ALL.into_iter().find(|i| i.id() == t)
    }

    /// The tick box's label (also its accessible label): a few words.
    pub fn label(self) -> &'static str {
        match self {
            Item::Loop => "Loop in its normal mode",
            Item::Links => "Links closed",
            Item::Forces => "Forces and bypasses removed",
            Item::Operations => "Operations told",
        }
    }

    /// The item in full: shown under the tick box and recorded.
    pub fn text(self) -> &'static str {
        match self {
            Item::Loop => "Loop back in its normal mode: controller out of manual, transmitter out of fixed-current or test mode",
            Item::Links => "Links closed and terminals tight, meter out of the loop, covers back on",
            Item::Forces => "Forces and bypasses removed in the control and safety systems",
            Item::Operations => "Operations told what state the loop is left in",
        }
    }

    /// A few words for the one-line summary in the log.
    pub fn short(self) -> &'static str {
        match self {
            Item::Loop => "loop back in its normal mode",
            Item::Links => "links closed",
            Item::Forces => "forces and bypasses removed",
            Item::Operations => "operations told",
        }
    }
}

/// Read the items named on the command line: ids separated by commas, semicolons or
/// spaces (`loop,links,forces,operations`), or `all`. The error names `field` and the
/// ids allowed.
pub fn parse_list(field: &str, text: &str) -> Result<Vec<Item>> {
    let mut items = Vec::new();
    for word in text
        .split([',', ';', ' '])
        .map(str::trim)
        .filter(|w| !w.is_empty())
    {
        if word.eq_ignore_ascii_case("all") {
            return Ok(Item::ALL.to_vec());
        }
        let item = Item::from_id(word).ok_or_else(|| {
            FieldError::new(
                field,
                format!(
                    "'{word}' is not on the before-you-leave list; use {} or all",
                    Item::ALL.map(Item::id).join(", ")
                ),
            )
        })?;
        if !items.contains(&item) {
            items.push(item);
        }
    }
    if items.is_empty() {
        return Err(FieldError::new(
            field,
            format!(
                "is empty; name what was done: {} or all",
                Item::ALL.map(Item::id).join(", ")
            ),
        ));
    }
    Ok(items)
}

/// The ticked items among stored ids (unknown ids, from another version, are left out).
pub fn items_of(ids: &[String]) -> Vec<Item> {
    Item::ALL
        .into_iter()
        .filter(|i| ids.iter().any(|id| Item::from_id(id) == Some(*i)))
        .collect()
}

/// One item as recorded: its id, the words the technician saw, and whether it was ticked.
#[derive(Debug, Clone, PartialEq, Eq, Serialize, Deserialize)]
pub struct LeaveTick {
    /// The item's id (`loop`, `links`, `forces`, `operations`).
    pub id: String,
    /// The words beside the tick box when it was recorded.
    pub text: String,
    /// Ticked (on the screen) or named (on the command line). False means not done, or at
    /// least not confirmed done.
    pub done: bool,
}

/// The list as recorded with a check or a session.
#[derive(Debug, Clone, PartialEq, Eq, Serialize, Deserialize)]
pub struct LeaveList {
    /// Shape version ([`LEAVE_VERSION`] when written by this build).
    pub version: u32,
    /// Every item on the list, in the order shown, ticked or not.
    pub items: Vec<LeaveTick>,
}

impl LeaveList {
    /// The record for a list on which `done` were ticked; the rest are recorded not done.
    pub fn from_done(done: &[Item]) -> LeaveList {
        LeaveList {
            version: LEAVE_VERSION,
            items: Item::ALL
                .into_iter()
                .map(|i| LeaveTick {
                    id: i.id().to_string(),
                    text: i.text().to_string(),
                    done: done.contains(&i),
                })
                .collect(),
        }
    }

    /// True when every item was ticked.
    pub fn all_done(&self) -> bool {
        self.items.iter().all(|t| t.done)
    }

    /// The items not ticked, in order.
    pub fn not_done(&self) -> Vec<&LeaveTick> {
        self.items.iter().filter(|t| !t.done).collect()
    }

    /// The one-line summary for the log text and the handoff report, saying plainly which
    /// items were not done: `Before you leave: NOT done (not confirmed): links closed;
    /// operations told. Done: loop back in its normal mode; forces and bypasses removed.`
    pub fn summary(&self) -> String {
        let words = |done: bool| -> String {
            self.items
                .iter()
                .filter(|t| t.done == done)
                .map(short_of)
                .collect::<Vec<_>>()
                .join("; ")
        };
        let (done, not_done) = (words(true), words(false));
        if not_done.is_empty() {
            format!("{HEADING}: all done ({done}).")
        } else if done.is_empty() {
            format!("{HEADING}: {NOT_DONE_LOUD} (not confirmed): {not_done}.")
        } else {
            format!("{HEADING}: {NOT_DONE_LOUD} (not confirmed): {not_done}. Done: {done}.")
        }
    }

    /// One line per item, for text output: `[done] Links closed …` or `[NOT done] …`.
    pub fn lines(&self) -> Vec<String> {
        self.items
            .iter()
            .map(|t| {
                let mark = if t.done { DONE_WORD } else { NOT_DONE_LOUD };
                format!("[{mark}] {}", t.text)
            })
            .collect()
    }
}

/// The short words for a recorded item: this build's own for a known id, else the words
/// recorded with it.
fn short_of(t: &LeaveTick) -> String {
    match Item::from_id(&t.id) {
        Some(i) => i.short().to_string(),
        None => t.text.clone(),
    }
}

/// The summary of a record that may predate the list: records saved before it existed say
/// so instead of claiming anything.
pub fn summary_of(list: Option<&LeaveList>) -> String {
    match list {
        Some(l) => l.summary(),
        None => format!("{HEADING}: not recorded (saved before loopside asked)."),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_command_line_names_what_was_done() {
        assert_eq!(
            parse_list("done", "loop, Links;operations").unwrap(),
            vec![Item::Loop, Item::Links, Item::Operations]
        );
        assert_eq!(parse_list("done", "all").unwrap(), Item::ALL.to_vec());
        let e = parse_list("done", "loop,link").unwrap_err();
        assert_eq!(e.field, "done");
        assert!(e.reason.contains("'link'") && e.reason.contains("forces"));
        assert_eq!(parse_list("done", " , ").unwrap_err().field, "done");
    }

    #[test]
    fn lines_mark_each_item_in_words() {
        let l = LeaveList::from_done(&[Item::Loop]);
        let lines = l.lines();
        assert!(lines[0].starts_with("[done] Loop back"), "{}", lines[0]);
        assert!(lines[1].starts_with("[NOT done] Links"), "{}", lines[1]);
    }

    #[test]
    fn stored_ids_from_another_version_are_left_out() {
        let ids = vec!["operations".to_string(), "lamp".to_string()];
        assert_eq!(items_of(&ids), vec![Item::Operations]);
    }
}
