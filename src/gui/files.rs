//! File dialogs off the UI thread, the recent-files list and the recovery file.
//!
//! rfd's dialogs block, so each runs on a helper thread and hands its answer
//! back through a channel the frame polls. On a bare Linux desktop with no
//! portal and no zenity rfd shows nothing and reports a cancel; we cannot
//! tell the two apart, so after any cancel the app offers a path field.

use crate::project::Project;
use std::path::{Path, PathBuf};
use std::sync::mpsc::{Receiver, channel};

/// What a dialog is for.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Purpose {
    /// Open a project.
    OpenProject,
    /// Save a project.
    SaveProject,
    /// Read a data file.
    Data,
    /// Write the HTML report.
    Report,
}

impl Purpose {
    /// Words for the path field that stands in for the dialog.
    pub fn words(self) -> &'static str {
        match self {
            Self::OpenProject => "Project file to open",
            Self::SaveProject => "Save the project as",
            Self::Data => "Data file to read (CSV or TSV)",
            Self::Report => "Write the report to (an .html file)",
        }
    }
}

/// Shows file dialogs.
pub trait Chooser {
    /// Starts a dialog; the answer (None: cancelled or no dialog) arrives later.
    fn start(&self, purpose: Purpose, folder: Option<&Path>) -> Receiver<Option<PathBuf>>;
}

/// Native dialogs through rfd, each on its own thread.
#[derive(Debug, Default)]
pub struct NativeChooser;

impl Chooser for NativeChooser {
    fn start(&self, purpose: Purpose, folder: Option<&Path>) -> Receiver<Option<PathBuf>> {
        let (tx, rx) = channel();
        let folder = folder.map(Path::to_path_buf);
        std::thread::spawn(move || {
            let mut d = rfd::FileDialog::new();
            if let Some(f) = folder {
                d = d.set_directory(f);
            }
            let picked = match purpose {
                Purpose::OpenProject => d.add_filter("Priorwright project", &["ron"]).pick_file(),
                Purpose::SaveProject => d
                    .add_filter("Priorwright project", &["ron"])
                    .set_file_name("project.ron")
                    .save_file(),
                Purpose::Data => d
                    .add_filter("Data (CSV, TSV)", &["csv", "tsv", "tab", "txt"])
                    .pick_file(),
                Purpose::Report => d
                    .add_filter("HTML report", &["html"])
                    .set_file_name("report.html")
                    .save_file(),
            };
            let _ = tx.send(picked);
        });
        rx
    }
}

/// No dialogs at all (tests, and desktops known to have none): every request
/// is answered at once with None, so the path field appears.
#[derive(Debug, Default)]
pub struct NoChooser;

impl Chooser for NoChooser {
    fn start(&self, _: Purpose, _: Option<&Path>) -> Receiver<Option<PathBuf>> {
        let (tx, rx) = channel();
        let _ = tx.send(None);
        rx
    }
}

/// True when a Linux desktop can show no file dialog: no session bus for the
/// portal and no zenity on the PATH.
pub fn dialogs_unavailable() -> bool {
    if !cfg!(target_os = "linux") {
        return false;
    }
    let bus = std::env::var_os("DBUS_SESSION_BUS_ADDRESS").is_some();
    let zenity = std::env::var_os("PATH")
        .is_some_and(|p| std::env::split_paths(&p).any(|d| d.join("zenity").is_file()));
    !bus && !zenity
}

/// Where the app keeps its own files: `$PRIORWRIGHT_STATE_DIR`, else
/// `$XDG_STATE_HOME/priorwright`, else `~/.local/state/priorwright`.
pub fn state_dir() -> Option<PathBuf> {
    if let Some(d) = std::env::var_os("PRIORWRIGHT_STATE_DIR") {
        return Some(PathBuf::from(d));
    }
    if let Some(d) = std::env::var_os("XDG_STATE_HOME") {
        return Some(PathBuf::from(d).join("priorwright"));
    }
    std::env::var_os("HOME").map(|h| PathBuf::from(h).join(".local/state/priorwright"))
}

/// Unsaved work written every few seconds, offered back after a crash.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct Recovery {
    /// The file the work belongs to, if it had one.
    pub source: Option<PathBuf>,
    /// When it was written (UTC).
    pub written: String,
    /// The project as it was.
    pub project: Project,
}

/// The recovery file in `dir`.
pub fn recovery_path(dir: &Path) -> PathBuf {
    dir.join("recovery.ron")
}

/// Writes the recovery file atomically.
pub fn write_recovery(dir: &Path, recovery: &Recovery) -> Result<(), String> {
    std::fs::create_dir_all(dir).map_err(|e| format!("{}: {e}", dir.display()))?;
    let text = ron::ser::to_string_pretty(recovery, ron::ser::PrettyConfig::default())
        .map_err(|e| e.to_string())?;
    crate::project::write_atomic(&recovery_path(dir), &text).map_err(|e| e.to_string())
}

/// The recovery file, if one is there and readable.
pub fn read_recovery(dir: &Path) -> Option<Recovery> {
    let text = std::fs::read_to_string(recovery_path(dir)).ok()?;
    ron::from_str(&text).ok()
}

/// Removes the recovery file (after a save, or when the user declines it).
pub fn clear_recovery(dir: &Path) {
    let _ = std::fs::remove_file(recovery_path(dir));
}

/// The recent-files list, newest first.
pub fn read_recent(dir: &Path) -> Vec<PathBuf> {
    std::fs::read_to_string(dir.join("recent.txt"))
        .map(|t| {
            t.lines()
                .filter(|l| !l.is_empty())
                .map(PathBuf::from)
                .collect()
        })
        .unwrap_or_default()
}

/// Puts `path` first in the recent list (at most 8 kept).
pub fn push_recent(dir: &Path, path: &Path) -> Vec<PathBuf> {
    let path = path.canonicalize().unwrap_or_else(|_| path.to_path_buf());
    let mut list = read_recent(dir);
    list.retain(|p| p != &path);
    list.insert(0, path);
    list.truncate(8);
    let text: String = list.iter().map(|p| format!("{}\n", p.display())).collect();
    if std::fs::create_dir_all(dir).is_ok() {
        let _ = crate::project::write_atomic(&dir.join("recent.txt"), &text);
    }
    list
}
