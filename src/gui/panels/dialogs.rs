//! Dialogs over the window: unsaved changes, a typed path, column mapping,
//! recovery and export.

use super::super::command::Command;
use super::super::workbench::{Dialog, Workbench};
use super::labelled;
use crate::data::Mapping;
use std::path::PathBuf;

/// Shows the open dialog, if any. The dialog is taken out while it is drawn:
/// a button that starts something else (a save that needs a path, an open
/// after discarding) may put up the next dialog, and that one wins.
pub fn show(ui: &mut egui::Ui, w: &mut Workbench) {
    let Some(dialog) = w.dialog.take() else {
        return;
    };
    let ctx = ui.ctx().clone();
    let mut keep: Option<Dialog> = None;
    egui::Modal::new(egui::Id::unique("dialog")).show(&ctx, |ui| {
        ui.set_max_width(640.0);
        match dialog {
            Dialog::Unsaved(then) => {
                ui.heading("Unsaved changes");
                ui.label("This project has changes that are not saved.");
                keep = Some(Dialog::Unsaved(then.clone()));
                ui.horizontal(|ui| {
                    if ui.button("Save first").on_hover_text("Save, then go on").clicked() {
                        keep = None;
                        w.apply_unguarded(Command::Save);
                        if !w.dirty() {
                            w.apply_unguarded(*then.clone());
                        }
                    }
                    if ui.button("Discard the changes").on_hover_text("Go on without saving").clicked() {
                        keep = None;
                        w.apply_unguarded(*then.clone());
                    }
                    if ui.button("Cancel").on_hover_text("Stay with this project").clicked() {
                        keep = None;
                    }
                });
            }
            Dialog::Path { purpose, mut text } => {
                ui.heading(purpose.words());
                ui.label("No file was chosen. If no file dialog appeared, this desktop has none (no portal and no zenity): type the path instead.");
                let id = labelled(ui, "Path", "A file path, absolute or relative to the folder Priorwright was started in");
                let r = ui
                    .add(egui::TextEdit::singleline(&mut text).desired_width(560.0))
                    .labelled_by(id)
                    .on_hover_text("Type the file's path");
                let enter = r.lost_focus() && ui.input(|i| i.key_pressed(egui::Key::Enter));
                keep = Some(Dialog::Path { purpose, text: text.clone() });
                ui.horizontal(|ui| {
                    if (ui.button("Use this path").on_hover_text("Go on with this file").clicked() || enter)
                        && !text.trim().is_empty()
                    {
                        keep = None;
                        w.chosen(purpose, PathBuf::from(text.trim()));
                    }
                    if ui.button("Cancel").on_hover_text("Do nothing").clicked() {
                        keep = None;
                    }
                });
            }
            Dialog::Mapping(mut draft) => {
                ui.heading("Which columns hold what");
                ui.label(format!("{}: columns {}", draft.path.display(), draft.columns.join(", ")));
                mapping_editor(ui, &mut draft.mapping, &draft.columns);
                keep = Some(Dialog::Mapping(draft.clone()));
                ui.horizontal(|ui| {
                    if ui.button("Read the file").on_hover_text("Reduce the file to sufficient statistics with this mapping").clicked() {
                        let before = w.project.data.len();
                        w.apply_unguarded(Command::ReadData(draft.path.clone(), draft.mapping.clone()));
                        // A failed read keeps the dialog open for another try.
                        if w.project.data.len() > before {
                            keep = None;
                        }
                    }
                    if ui.button("Cancel").on_hover_text("Do not read the file").clicked() {
                        keep = None;
                    }
                });
            }
            Dialog::Recover(r) => {
                ui.heading("Recover unsaved work?");
                ui.label(format!(
                    "The last session ended without saving \"{}\" (autosaved {}{}).",
                    r.project.scenario.title,
                    r.written,
                    r.source.as_ref().map(|p| format!(", from {}", p.display())).unwrap_or_default()
                ));
                keep = Some(Dialog::Recover(r.clone()));
                ui.horizontal(|ui| {
                    if ui.button("Recover it").on_hover_text("Open the autosaved work").clicked() {
                        keep = None;
                        w.recover(*r.clone());
                    }
                    if ui.button("Discard it").on_hover_text("Delete the autosaved work").clicked() {
                        keep = None;
                        w.discard_recovery();
                    }
                });
            }
            Dialog::Export(t) => {
                ui.heading(format!("Prior for {}", t.title()));
                let text = match w.project.belief() {
                    Ok(b) => crate::export::export(&b, t).unwrap_or_else(|e| format!("# {e}")),
                    Err(e) => format!("# {e}"),
                };
                keep = Some(Dialog::Export(t));
                egui::ScrollArea::vertical().max_height(360.0).show(ui, |ui| {
                    let mut shown = text.clone();
                    ui.add(egui::TextEdit::multiline(&mut shown).code_editor().desired_width(600.0))
                        .on_hover_text("The exported prior (edits here are not kept)")
                        .accessible_name("exported prior");
                });
                ui.horizontal(|ui| {
                    if ui.button("Copy to clipboard").on_hover_text("Copy the text above").clicked() {
                        ui.ctx().copy_text(text.clone());
                        w.inform(format!("copied the {} prior to the clipboard", t.title()));
                    }
                    if ui.button("Close").on_hover_text("Close this window").clicked() {
                        keep = None;
                    }
                });
            }
        }
    });
    if w.dialog.is_none() {
        w.dialog = keep;
    }
}

fn column_box(ui: &mut egui::Ui, label: &str, tip: &str, value: &mut String, columns: &[String]) {
    egui::ComboBox::from_label(label)
        .selected_text(value.clone())
        .show_ui(ui, |ui| {
            for c in columns {
                ui.selectable_value(value, c.clone(), c)
                    .on_hover_text("Use this column");
            }
        })
        .response
        .on_hover_text(tip);
}

fn optional_box(
    ui: &mut egui::Ui,
    label: &str,
    tip: &str,
    value: &mut Option<String>,
    columns: &[String],
) {
    egui::ComboBox::from_label(label)
        .selected_text(value.clone().unwrap_or_else(|| "(none)".to_owned()))
        .show_ui(ui, |ui| {
            ui.selectable_value(value, None, "(none)")
                .on_hover_text("No such column");
            for c in columns {
                ui.selectable_value(value, Some(c.clone()), c)
                    .on_hover_text("Use this column");
            }
        })
        .response
        .on_hover_text(tip);
}

/// Column choices for each kind of mapping.
fn mapping_editor(ui: &mut egui::Ui, m: &mut Mapping, columns: &[String]) {
    let first = columns.first().cloned().unwrap_or_default();
    match m {
        Mapping::Binary { column } => {
            column_box(
                ui,
                "0/1 outcome column",
                "One row per trial: 1 success, 0 failure",
                column,
                columns,
            );
            if ui
                .button("Successes and trials per row instead")
                .on_hover_text("Each row holds a number of successes and of trials")
                .clicked()
            {
                *m = Mapping::SuccessesTrials {
                    successes: first.clone(),
                    trials: first,
                };
            }
        }
        Mapping::SuccessesTrials { successes, trials } => {
            column_box(
                ui,
                "successes column",
                "Successes in each row",
                successes,
                columns,
            );
            column_box(ui, "trials column", "Trials in each row", trials, columns);
            if ui
                .button("One 0/1 column instead")
                .on_hover_text("One row per trial")
                .clicked()
            {
                *m = Mapping::Binary { column: first };
            }
        }
        Mapping::Counts { count, exposure } => {
            column_box(ui, "count column", "Events in each row", count, columns);
            optional_box(
                ui,
                "exposure column",
                "Exposure of each row (1 if none)",
                exposure,
                columns,
            );
        }
        Mapping::Times { time, event } => {
            column_box(
                ui,
                "time column",
                "Time on test of each unit",
                time,
                columns,
            );
            optional_box(
                ui,
                "event flag column",
                "1 = failed, 0 = still running (censored); all failures if none",
                event,
                columns,
            );
        }
        Mapping::Values { column } => {
            column_box(ui, "value column", "The measured values", column, columns);
        }
        Mapping::Category { column, labels } => {
            column_box(
                ui,
                "category column",
                "One category label per row",
                column,
                columns,
            );
            ui.label(format!(
                "labels, in the prior's order: {}",
                labels.join(", ")
            ));
            if ui
                .button("One count column per category instead")
                .on_hover_text("Each row holds a count per category")
                .clicked()
            {
                *m = Mapping::CountColumns {
                    columns: vec![first; labels.len()],
                };
            }
        }
        Mapping::CountColumns { columns: cols } => {
            for (k, c) in cols.iter_mut().enumerate() {
                column_box(
                    ui,
                    &format!("category {} count column", k + 1),
                    "Counts of this category",
                    c,
                    columns,
                );
            }
        }
    }
}
