//! Reading and writing project files: RON text, atomic saves.

use super::{FORMAT_VERSION, Project};
use std::io::Write as _;
use std::path::Path;

/// A problem with a project file, naming the file.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
#[error("{path}: {message}")]
pub struct ProjectError {
    /// The file.
    pub path: String,
    /// What is wrong.
    pub message: String,
}

fn fail(path: &str, message: impl Into<String>) -> ProjectError {
    ProjectError {
        path: path.to_owned(),
        message: message.into(),
    }
}

/// Just the version, read before the rest.
#[derive(serde::Deserialize)]
struct Header {
    format_version: u32,
}

/// The RON layout every save uses: the same project always gives the same bytes.
fn pretty() -> ron::ser::PrettyConfig {
    ron::ser::PrettyConfig::new()
        .indentor("    ".to_owned())
        .struct_names(false)
        .new_line("\n".to_owned())
}

/// The project as file text.
pub fn to_text(project: &Project) -> Result<String, ProjectError> {
    let mut s = ron::ser::to_string_pretty(project, pretty())
        .map_err(|e| fail("(project)", e.to_string()))?;
    s.push('\n');
    Ok(s)
}

/// Brings an older file's text up to [`FORMAT_VERSION`]. Version 1 is the
/// first, so today this only accepts it; a later schema change adds its step
/// here (read as `ron::Value`, rewrite, hand on).
pub fn migrate(text: &str, from: u32, path: &str) -> Result<String, ProjectError> {
    match from {
        FORMAT_VERSION => Ok(text.to_owned()),
        v => Err(fail(
            path,
            format!("format_version {v} was never written by Priorwright (the first is 1)"),
        )),
    }
}

/// Parses project text; `path` names it in messages.
pub fn from_text(text: &str, path: &str) -> Result<Project, ProjectError> {
    let text = text.strip_prefix('\u{feff}').unwrap_or(text);
    if text.trim().is_empty() {
        return Err(fail(path, "the file is empty"));
    }
    let header: Header = ron::from_str(text).map_err(|e| {
        // Say "a project" where RON names our private header type.
        let why = e.to_string().replace("struct `Header`", "a project");
        fail(
            path,
            format!("cannot be read as a Priorwright project (at line:column {why})"),
        )
    })?;
    if header.format_version > FORMAT_VERSION {
        return Err(fail(
            path,
            format!(
                "written by a newer Priorwright (format_version {}); this version reads up to format_version {FORMAT_VERSION}",
                header.format_version
            ),
        ));
    }
    let text = migrate(text, header.format_version, path)?;
    let project: Project = ron::from_str(&text).map_err(|e| fail(path, e.to_string()))?;
    project.validate().map_err(|e| fail(path, e.to_string()))?;
    Ok(project)
}

/// Loads a project file.
pub fn load(path: &Path) -> Result<Project, ProjectError> {
    let name = path.display().to_string();
    let bytes = std::fs::read(path).map_err(|e| fail(&name, format!("cannot be read: {e}")))?;
    let text = String::from_utf8(bytes).map_err(|_| fail(&name, "is not UTF-8 text"))?;
    from_text(&text, &name)
}

/// Writes `text` to `path` atomically: a temporary file in the same folder,
/// flushed and synced, then renamed over the target. A crash leaves the whole
/// old file or the whole new one; a failure leaves the old file untouched.
pub fn write_atomic(path: &Path, text: &str) -> Result<(), ProjectError> {
    let name = path.display().to_string();
    let dir = match path.parent() {
        Some(d) if !d.as_os_str().is_empty() => d.to_path_buf(),
        _ => std::path::PathBuf::from("."),
    };
    let file_name = path
        .file_name()
        .map_or_else(|| "project".into(), |f| f.to_string_lossy().into_owned());
    let nanos = std::time::SystemTime::now()
        .duration_since(std::time::UNIX_EPOCH)
        .map_or(0, |d| d.subsec_nanos());
    let tmp = dir.join(format!(".{file_name}.{}-{nanos}.tmp", std::process::id()));
    let result = (|| -> std::io::Result<()> {
        let mut f = std::fs::OpenOptions::new()
            .write(true)
            .create_new(true)
            .open(&tmp)?;
        f.write_all(text.as_bytes())?;
        f.flush()?;
        f.sync_all()?;
        drop(f);
        std::fs::rename(&tmp, path)?;
        // Make the rename itself durable where the platform allows it.
        if let Ok(d) = std::fs::File::open(&dir) {
            let _ = d.sync_all();
        }
        Ok(())
    })();
    if let Err(e) = result {
        let _ = std::fs::remove_file(&tmp);
        return Err(fail(
            &name,
            format!("could not be saved ({e}); the file on disk is unchanged"),
        ));
    }
    Ok(())
}

/// Saves a project atomically.
pub fn save(path: &Path, project: &Project) -> Result<(), ProjectError> {
    project
        .validate()
        .map_err(|e| fail(&path.display().to_string(), e.to_string()))?;
    write_atomic(path, &to_text(project)?)
}
