//! Undo and redo over whole project snapshots.
//!
//! Every edit goes through one place ([`super::Workbench::apply`]), which
//! records the project before it; an edit that continues a drag records
//! nothing, so a whole drag undoes in one step. Snapshots are small (a
//! project is a few kilobytes) and the history is capped.

use crate::project::Project;

/// Snapshots before each edit, and the ones undone.
#[derive(Debug, Default)]
pub struct History {
    undo: Vec<Project>,
    redo: Vec<Project>,
}

/// The most edits kept.
const DEPTH: usize = 500;

impl History {
    /// Records `before` as the state an edit starts from.
    pub fn record(&mut self, before: &Project) {
        if self.undo.last() != Some(before) {
            self.undo.push(before.clone());
            if self.undo.len() > DEPTH {
                self.undo.remove(0);
            }
        }
        self.redo.clear();
    }

    /// The state to go back to, given the current one.
    pub fn undo(&mut self, current: &Project) -> Option<Project> {
        let back = self.undo.pop()?;
        self.redo.push(current.clone());
        Some(back)
    }

    /// The state to go forward to, given the current one.
    pub fn redo(&mut self, current: &Project) -> Option<Project> {
        let forward = self.redo.pop()?;
        self.undo.push(current.clone());
        Some(forward)
    }

    /// Whether there is anything to undo.
    pub fn can_undo(&self) -> bool {
        !self.undo.is_empty()
    }

    /// Whether there is anything to redo.
    pub fn can_redo(&self) -> bool {
        !self.redo.is_empty()
    }

    /// Forgets everything (a new or opened project).
    pub fn clear(&mut self) {
        self.undo.clear();
        self.redo.clear();
    }
}
