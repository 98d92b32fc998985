//! The workbench's file handling driven through egui_kittest: autosave and
//! recovery, the unsaved-changes guards, open recent, dropped files and the
//! export window.
#![cfg(feature = "gui")]

mod common;

use common::{example, folder, harness, settings_in};
use egui_kittest::kittest::Queryable as _;
use priorwright::gui::files::{self, NoChooser};
use priorwright::gui::workbench::Dialog;
use priorwright::gui::{Command, Workbench};

/// A file dropped on the window, as the windowing layer hands it over.
#[derive(Debug)]
struct OnDisk(std::path::PathBuf);

impl egui::DroppedFile for OnDisk {
    fn path(&self) -> &std::path::Path {
        &self.0
    }
    fn bytes(&self) -> Result<Vec<u8>, String> {
        std::fs::read(&self.0).map_err(|e| e.to_string())
    }
}

fn retitle(h: &mut egui_kittest::Harness<'static, Workbench>, title: &str) {
    h.state_mut().apply(Command::SetTitle(title.into()));
    h.run();
}

#[test]
fn unsaved_work_is_autosaved_and_offered_back_at_the_next_start() {
    let dir = folder("recover");
    let mut h = harness(Workbench::example(Box::new(NoChooser), settings_in(&dir)));
    h.run();
    assert!(
        files::read_recovery(&dir).is_none(),
        "nothing to recover yet"
    );
    retitle(&mut h, "Retitled in the workshop");
    let r = files::read_recovery(&dir).expect("the edit was autosaved");
    assert_eq!(r.project, h.state().project);
    let edited = h.state().project.clone();
    drop(h);

    // The next start offers it; taking it brings the work back, still unsaved.
    let mut next = harness(Workbench::example(Box::new(NoChooser), settings_in(&dir)));
    next.run();
    assert!(matches!(next.state().dialog, Some(Dialog::Recover(_))));
    assert!(
        next.query_by_label_contains("Retitled in the workshop")
            .is_some()
    );
    next.get_by_label("Recover it").click();
    next.run();
    assert_eq!(next.state().project, edited);
    assert!(next.state().dirty(), "recovered work is not yet saved");

    // Saving clears the recovery file.
    let file = dir.join("kept.ron");
    next.state_mut().apply(Command::SaveTo(file));
    next.run();
    assert!(files::read_recovery(&dir).is_none());
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn declining_the_recovered_work_deletes_it() {
    let dir = folder("decline");
    let mut h = harness(Workbench::example(Box::new(NoChooser), settings_in(&dir)));
    h.run();
    retitle(&mut h, "Work to throw away");
    drop(h);
    let mut next = harness(Workbench::example(Box::new(NoChooser), settings_in(&dir)));
    next.run();
    next.get_by_label("Discard it").click();
    next.run();
    assert!(files::read_recovery(&dir).is_none());
    assert_ne!(next.state().project.scenario.title, "Work to throw away");
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn new_with_unsaved_changes_asks_first_and_cancel_keeps_the_work() {
    let mut h = example();
    retitle(&mut h, "Half-done");
    h.state_mut().apply(Command::New);
    h.run();
    assert!(h.query_by_label("Unsaved changes").is_some());
    h.get_by_label("Cancel").click();
    h.run();
    assert_eq!(h.state().project.scenario.title, "Half-done");
    assert!(h.state().dialog.is_none());

    h.state_mut().apply(Command::New);
    h.run();
    h.get_by_label("Discard the changes").click();
    h.run();
    assert_eq!(h.state().project.scenario.title, "Untitled elicitation");
    assert!(!h.state().dirty());
}

#[test]
fn opening_with_unsaved_changes_can_save_first() {
    let dir = folder("save-first");
    let first = dir.join("first.ron");
    let other = dir.join("other.ron");
    let mut h = example();
    h.state_mut().apply(Command::SaveTo(other.clone()));
    h.state_mut().apply(Command::SaveTo(first.clone()));
    retitle(&mut h, "Changed before opening another");
    h.state_mut().apply(Command::OpenPath(other.clone()));
    h.run();
    h.get_by_label("Save first").click();
    h.run();
    assert_eq!(h.state().path.as_deref(), Some(other.as_path()));
    let kept = priorwright::project::load(&first).unwrap();
    assert_eq!(kept.scenario.title, "Changed before opening another");
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn closing_the_window_with_unsaved_changes_is_held_until_answered() {
    let mut h = example();
    assert!(
        !h.state_mut().close_requested(),
        "a saved project closes at once"
    );
    let mut h2 = example();
    retitle(&mut h2, "Not yet saved");
    assert!(h2.state_mut().close_requested(), "the close is held");
    h2.run();
    assert!(!h2.state().quit);
    h2.get_by_label("Discard the changes").click();
    h2.run();
    assert!(h2.state().quit);
    drop(h);
}

#[test]
fn saved_files_appear_under_open_recent_and_open_from_there() {
    let dir = folder("recent");
    let state = dir.join("state");
    let a = dir.join("a.ron");
    let mut h = harness(Workbench::example(
        Box::new(NoChooser),
        priorwright::gui::Settings {
            state_dir: Some(state.clone()),
            autosave_secs: None,
        },
    ));
    h.run();
    retitle(&mut h, "The recent one");
    h.state_mut().apply(Command::SaveTo(a.clone()));
    h.run();
    drop(h);

    let mut next = harness(Workbench::example(
        Box::new(NoChooser),
        priorwright::gui::Settings {
            state_dir: Some(state),
            autosave_secs: None,
        },
    ));
    next.run();
    let listed = a.canonicalize().unwrap();
    assert_eq!(next.state().view.recent.first(), Some(&listed));
    next.get_by_label("File").click();
    next.run();
    next.get_by_label("Open recent").hover();
    next.run();
    next.get_by_label(&listed.display().to_string()).click();
    next.run();
    assert_eq!(next.state().project.scenario.title, "The recent one");
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn a_data_file_dropped_on_the_window_opens_the_mapping_dialog() {
    let dir = folder("drop");
    let csv = dir.join("dropped.csv");
    std::fs::write(&csv, "bought\n1\n0\n0\n").unwrap();
    let mut h = example();
    h.input_mut()
        .dropped_files
        .push(std::sync::Arc::new(OnDisk(csv.clone())));
    h.run();
    assert!(matches!(&h.state().dialog, Some(Dialog::Mapping(d)) if d.path == csv));
    h.get_by_label("Read the file").click();
    h.run();
    let added = h.state().project.data.last().unwrap();
    assert_eq!(added.name, "dropped.csv");
    assert_eq!(added.rows, 3);
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn a_project_dropped_on_the_window_opens_it() {
    let dir = folder("drop-project");
    let file = dir.join("dropped.ron");
    let mut h = example();
    retitle(&mut h, "From a dropped file");
    h.state_mut().apply(Command::SaveTo(file.clone()));
    h.state_mut().apply(Command::New);
    h.run();
    h.input_mut()
        .dropped_files
        .push(std::sync::Arc::new(OnDisk(file.clone())));
    h.run();
    assert_eq!(h.state().project.scenario.title, "From a dropped file");
    assert_eq!(h.state().path.as_deref(), Some(file.as_path()));
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn the_export_window_shows_the_prior_and_copies_it() {
    let mut h = example();
    h.state_mut()
        .apply(Command::ShowExport(priorwright::export::Target::Stan));
    h.run();
    let belief = h.state().project.belief().unwrap();
    let want = priorwright::export::export(&belief, priorwright::export::Target::Stan).unwrap();
    let shown = h.get_by_label("exported prior").value().unwrap_or_default();
    assert_eq!(shown, want);
    h.get_by_label("Copy to clipboard").click();
    h.step();
    let copied = h
        .output()
        .platform_output
        .commands
        .iter()
        .any(|c| matches!(c, egui::OutputCommand::CopyText(t) if *t == want));
    assert!(copied, "the exported text went to the clipboard");
    h.run();
    assert!(h.query_by_label_contains("copied the Stan prior").is_some());
}

#[test]
fn the_report_is_written_from_the_window_and_a_bad_folder_gives_a_notice() {
    let dir = folder("report");
    let mut h = example();
    retitle(&mut h, "Reported from the window");
    let file = dir.join("workshop.html");
    h.state_mut().apply(Command::ReportTo(file.clone()));
    h.run();
    let html = std::fs::read_to_string(&file).expect("the report was written");
    assert!(
        html.contains("<h1>Reported from the window</h1>"),
        "the unsaved edit is in it"
    );
    assert!(html.contains("<h2 id=\"sensitivity\">"));
    assert!(h.query_by_label_contains("wrote the report").is_some());
    h.state_mut()
        .apply(Command::ReportTo("/no/such/folder/r.html".into()));
    h.run();
    assert!(
        h.query_by_label_contains("the report was not written")
            .is_some()
    );
    let _ = std::fs::remove_dir_all(&dir);
}
