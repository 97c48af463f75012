//! Keep the reference instruments: add one, edit one. The store keeps each as a record of
//! its own kind (`reference`, the last definition of an id wins); bundles carry them.

use crate::calibration::reference::Reference;
use crate::error::FieldError;
use crate::form::reference::{edited, new_reference, ReferenceText};
use crate::store::{Store, StoreError};
use std::fmt;

/// A reference instrument saved.
#[derive(Debug, Clone, PartialEq)]
pub struct ReferenceSaved {
    /// The reference as it now stands.
    pub reference: Reference,
    /// Whether it was new.
    pub added: bool,
    /// Whether anything changed (an edit that repeats the definition changes nothing).
    pub changed: bool,
}

impl fmt::Display for ReferenceSaved {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let id = &self.reference.id;
        match (self.added, self.changed) {
            (true, _) => write!(f, "Added reference {id}."),
            (false, true) => write!(f, "Saved reference {id}."),
            (false, false) => write!(f, "Reference {id} unchanged."),
        }
    }
}

/// Add a reference instrument from its form; an id already in the store is refused
/// (edit it instead).
pub fn add_reference(
    store: &mut dyn Store,
    text: ReferenceText<'_>,
) -> Result<ReferenceSaved, StoreError> {
    let reference = new_reference(text)?;
    if let Some(here) = store.reference(&reference.id) {
        return Err(FieldError::new(
            "id",
            format!(
                "reference {} is already in the store; change it with `ref edit {}`",
                here.id, here.id
            ),
        )
        .into());
    }
    store.save_reference(reference.clone())?;
    Ok(ReferenceSaved {
        reference,
        added: true,
        changed: true,
    })
}

/// Change the reference `id` by the fields given in `text` (a new id renames it only when
/// no other reference has that id).
pub fn edit_reference(
    store: &mut dyn Store,
    id: &str,
    text: ReferenceText<'_>,
) -> Result<ReferenceSaved, StoreError> {
    let here = store.require_reference(id)?.clone();
    let reference = edited(&here, text)?;
    if !reference.is(&here.id) {
        return Err(FieldError::new(
            "id",
            format!(
                "a reference keeps its id ({}): checks name it by that id; add the new instrument with `ref add`",
                here.id
            ),
        )
        .into());
    }
    let changed = reference != here;
    if changed {
        store.save_reference(reference.clone())?;
    }
    Ok(ReferenceSaved {
        reference,
        added: false,
        changed,
    })
}
