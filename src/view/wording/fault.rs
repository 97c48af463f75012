//! The words of a fault-finding session, written once: the text of the log entry it is
//! saved as. The command line, the Fault screen and the saved log entry use this.

use crate::diagnose::Session;

/// The text of the log entry the session is saved as: the procedure's title and its
/// conclusion (or that it is not finished), the technician's own words, and, when
/// recorded, what was and was not put right before leaving (the same words from the app
/// and the command line).
pub fn log_text(session: &Session) -> String {
    let mut text = match &session.conclusion {
        Some(c) => format!("{}: {}", session.title, c.text),
        None => format!("{}: not finished", session.title),
    };
    if !session.technician_conclusion.is_empty() {
        text.push_str(&format!("\nTechnician: {}", session.technician_conclusion));
    }
    if let Some(l) = &session.before_leaving {
        text.push('\n');
        text.push_str(&l.summary());
    }
    text
}
