//! The application layer: one function per action a technician takes, called by the
//! command line (`crate::cli`) and by the app (`crate::app`) alike.
//!
//! Each action takes the store, the moment it happens (`now`, with the local offset the
//! front decided) and typed inputs, checks them with one set of limits, writes through
//! [`crate::store::Store`] (durable before it returns), and gives back a typed outcome
//! whose `Display` is the one wording of its result. Fronts parse text into the typed
//! inputs and show the outcome; they do not decide anything the record depends on.
//!
//! - [`note`] — add a note or a follow-up, close a follow-up;
//! - [`tag`] — add, edit, rename, archive a tag;
//! - [`check`] — save a loop check (one versioned payload shape);
//! - [`intrinsic`] — store a tag's IS circuit, save an IS check (`is-check` kind, payload
//!   version 1);
//! - [`reference`] — add and edit reference instruments (store records of their own);
//! - [`trip`] — save a trip or alarm test (`trip-test` kind, payload version 1);
//! - [`session`] — save a fault-finding session;
//! - [`stroke`] — save a valve's stroke check (`stroke-check` kind, payload version 1);
//! - [`bundle`] — export a hand-over, import a bundle.
//!
//! No UI types and no printing here; the only I/O is the store's and the hand-over file
//! written with [`crate::store::record::write_atomically`].

pub mod bundle;
pub mod check;
pub mod intrinsic;
pub mod note;
pub mod reference;
pub mod session;
pub mod stroke;
pub mod tag;
pub mod trip;

use crate::error::FieldError;
use crate::journal::MAX_AUTHOR_CHARS;

/// The initials an entry is signed with, as every front stores them: trimmed and
/// upper-cased (`ef` and `EF` are the same technician; a hand-over sorted or searched by
/// initials must not split them). Empty initials are allowed (unsigned).
pub fn initials(typed: &str) -> Result<String, FieldError> {
    let who = typed.trim().to_uppercase();
    if who.chars().count() > MAX_AUTHOR_CHARS || who.chars().any(char::is_whitespace) {
        return Err(FieldError::new(
            "author",
            format!("initials only: up to {MAX_AUTHOR_CHARS} characters, no spaces (got '{who}')"),
        ));
    }
    Ok(who)
}
