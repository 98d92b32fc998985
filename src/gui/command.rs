//! What panels ask for. Panels never edit the project; they push commands,
//! and [`super::Workbench::apply`] carries them out after the frame, with the
//! undo history beside it.

use crate::data::Mapping;
use crate::elicit::PoolMethod;
use crate::export::Target;
use crate::family::Prior;
use crate::project::{DataSource, StoredJudgment};
use std::path::PathBuf;

/// One request from a panel.
#[derive(Clone, Debug, PartialEq)]
pub enum Command {
    /// Replace an expert's prior. `continuing`: part of a drag already recorded.
    SetPrior {
        /// Expert index.
        expert: usize,
        /// The new prior.
        prior: Prior,
        /// True after the first frame of a drag.
        continuing: bool,
    },
    /// Fit an expert's prior to these judgments (and keep them).
    FitJudgments {
        /// Expert index.
        expert: usize,
        /// Stated probabilities.
        judgments: Vec<StoredJudgment>,
    },
    /// Fit an expert's prior to chips in bins.
    FitChips {
        /// Expert index.
        expert: usize,
        /// Bin edges.
        edges: Vec<f64>,
        /// Chips per bin.
        chips: Vec<f64>,
    },
    /// Set the ESS from imagined future data, the centre kept.
    Imagined {
        /// Expert index.
        expert: usize,
        /// The prior mean of the data-scale quantity.
        mean: f64,
        /// key=value text in the family's imagined-data keys.
        text: String,
    },
    /// Fit to judgments about a future observation.
    Observable {
        /// Expert index.
        expert: usize,
        /// The future sample, key=value text.
        future: String,
        /// (p, value) pairs about the future observation.
        judgments: Vec<(f64, f64)>,
    },
    /// Add an expert (a copy of the selected one's prior).
    AddExpert,
    /// Remove an expert.
    RemoveExpert(usize),
    /// Rename an expert.
    RenameExpert(usize, String),
    /// Set an expert's weight; the others are rescaled to keep the sum at one.
    SetWeight(usize, f64),
    /// Linear or logarithmic pool.
    SetPool(PoolMethod),
    /// Robust-mixture weight (None: off).
    SetRobust(Option<f64>),
    /// Ask where to write the HTML report.
    Report,
    /// Write the HTML report to this file.
    ReportTo(std::path::PathBuf),
    /// The alternative priors to compare with (empty: the defaults), as
    /// (name, key=value text) pairs to parse.
    SetAlternatives(Vec<(String, String)>),
    /// The conflict p-value below which a warning shows.
    SetConflictThreshold(f64),
    /// Switch the model family (every expert starts from a plain prior).
    SetFamily(String),
    /// Edit the title.
    SetTitle(String),
    /// Edit the notes.
    SetNotes(String),
    /// Add observed data.
    AddData(DataSource),
    /// Remove observed data.
    RemoveData(usize),
    /// Read a data file with a mapping, then add it.
    ReadData(PathBuf, Mapping),
    /// Undo the last edit.
    Undo,
    /// Redo the last undone edit.
    Redo,
    /// A fresh project (after the unsaved-changes guard).
    New,
    /// Ask for a project file to open (after the guard).
    Open,
    /// Open this project file (after the guard).
    OpenPath(PathBuf),
    /// Save to the current file, or ask where.
    Save,
    /// Ask where to save.
    SaveAs,
    /// Save to this file.
    SaveTo(PathBuf),
    /// Ask for a data file.
    ChooseData,
    /// Set up the column mapping for this data file.
    MapData(PathBuf),
    /// Show the export window for a target.
    ShowExport(Target),
    /// Put text on the clipboard.
    Copy(String),
    /// Close the notice at this index.
    Dismiss(usize),
    /// Quit (after the guard).
    Quit,
}
