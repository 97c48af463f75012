//! The "before you leave" list as the Check and Find fault screens show it: one tick box
//! per item of [`crate::leave`], each with the word "done" or "not done" beside it, and a
//! line above *Save to log* that says, before anything is saved, which items the record
//! will call not done.
//!
//! The screens keep the ticked items as their ids in the saved screen state, so a half
//! ticked list survives the app being closed; [`toggle`] changes that list.

use crate::leave::{self, Item, LeaveList};

/// One tick box.
#[derive(Debug, Clone, PartialEq)]
pub struct LeaveRow {
    /// The item.
    pub item: Item,
    /// The box's label (also its accessible label).
    pub label: String,
    /// The item in full, shown under the box.
    pub text: String,
    /// Ticked.
    pub done: bool,
    /// `done` or `not done`, shown beside the box so the state never rests on colour.
    pub state: String,
}

/// Whether the record will say everything was put right.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum LeaveStatus {
    /// Every item ticked.
    AllDone,
    /// At least one item not ticked: the record will say so.
    NotAllDone,
}

/// The list as the screen shows it.
#[derive(Debug, Clone, PartialEq)]
pub struct LeaveView {
    /// The heading.
    pub heading: String,
    /// One row per item, in order.
    pub rows: Vec<LeaveRow>,
    /// Whether everything is ticked.
    pub status: LeaveStatus,
    /// What saving now will record, in words, shown above *Save to log*.
    pub summary: String,
}

/// The view for the ids ticked so far. `more_to_come` is true on an as-found check,
/// where the technician often goes on to adjust and check as-left before leaving.
pub fn view(ticked: &[String], more_to_come: bool) -> LeaveView {
    let done = leave::items_of(ticked);
    let rows: Vec<LeaveRow> = Item::ALL
        .into_iter()
        .map(|item| {
            let on = done.contains(&item);
            LeaveRow {
                item,
                label: item.label().to_string(),
                text: item.text().to_string(),
                done: on,
                state: if on {
                    leave::DONE_WORD
                } else {
                    leave::NOT_DONE_WORD
                }
                .to_string(),
            }
        })
        .collect();
    let record = LeaveList::from_done(&done);
    let (status, summary) = if record.all_done() {
        (
            LeaveStatus::AllDone,
            "All ticked: the record will say the loop was left as it should be.".to_string(),
        )
    } else {
        let missing: Vec<&str> = Item::ALL
            .into_iter()
            .filter(|i| !done.contains(i))
            .map(Item::short)
            .collect();
        let mut text = format!(
            "Not ticked, so the log will say {}: {}. You can still save; if the loop is left so on purpose, add a follow-up on Log saying why.",
            leave::NOT_DONE_LOUD,
            missing.join("; ")
        );
        if more_to_come {
            text.push_str(" Going on to the as-left check? Tick these at its end.");
        }
        (LeaveStatus::NotAllDone, text)
    };
    LeaveView {
        heading: leave::HEADING.to_string(),
        rows,
        status,
        summary,
    }
}

/// Tick (`on`) or untick the item at `index` in the ids kept for the screen. An index
/// past the list changes nothing.
pub fn toggle(ticked: &mut Vec<String>, index: usize, on: bool) {
    let Some(item) = Item::ALL.get(index).copied() else {
        return;
    };
    let mut done = leave::items_of(ticked);
    done.retain(|i| *i != item);
    if on {
        done.push(item);
    }
    *ticked = Item::ALL
        .into_iter()
        .filter(|i| done.contains(i))
        .map(|i| i.id().to_string())
        .collect();
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn unticked_items_are_named_before_saving() {
        let mut ticked = Vec::new();
        toggle(&mut ticked, 0, true);
        toggle(&mut ticked, 2, true);
        toggle(&mut ticked, 9, true);
        assert_eq!(ticked, ["loop", "forces"]);
        let v = view(&ticked, false);
        assert_eq!(v.status, LeaveStatus::NotAllDone);
        assert_eq!(v.rows[0].state, "done");
        assert_eq!(v.rows[1].state, "not done");
        assert!(
            v.summary
                .contains("NOT done: links closed; operations told"),
            "{}",
            v.summary
        );
        assert!(!v.summary.contains("as-left"));
        assert!(view(&ticked, true).summary.contains("as-left"));
        toggle(&mut ticked, 1, true);
        toggle(&mut ticked, 3, true);
        let v = view(&ticked, true);
        assert_eq!(v.status, LeaveStatus::AllDone);
        assert!(v.rows.iter().all(|r| r.done && r.state == "done"));
        toggle(&mut ticked, 0, false);
        assert_eq!(ticked, ["links", "forces", "operations"]);
    }
}
