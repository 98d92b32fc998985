//! The menu bar and the keyboard shortcuts.

use super::super::command::Command;
use super::super::workbench::Workbench;
use crate::export::TARGETS;
use egui::{Key, KeyboardShortcut, Modifiers};

/// Shortcuts: file commands always; undo and redo only when no text field
/// has the keyboard (a text field undoes its own typing).
pub fn shortcuts(ui: &mut egui::Ui, w: &mut Workbench) {
    let ctx = ui.ctx().clone();
    let sc = |m: Modifiers, k: Key| KeyboardShortcut::new(m, k);
    let cmd = Modifiers::COMMAND;
    let cmd_shift = Modifiers::COMMAND | Modifiers::SHIFT;
    let pressed = |s: KeyboardShortcut| ctx.input_mut(|i| i.consume_shortcut(&s));
    // Longer combinations first: Ctrl+Shift+S must not also read as Ctrl+S.
    if pressed(sc(cmd_shift, Key::S)) {
        w.queue.push(Command::SaveAs);
    } else if pressed(sc(cmd, Key::S)) {
        w.queue.push(Command::Save);
    }
    if pressed(sc(cmd, Key::N)) {
        w.queue.push(Command::New);
    }
    if pressed(sc(cmd, Key::O)) {
        w.queue.push(Command::Open);
    }
    if !ctx.egui_wants_keyboard_input() {
        if pressed(sc(cmd_shift, Key::Z)) || pressed(sc(cmd, Key::Y)) {
            w.queue.push(Command::Redo);
        } else if pressed(sc(cmd, Key::Z)) {
            w.queue.push(Command::Undo);
        }
    }
}

/// The menu bar.
pub fn show(ui: &mut egui::Ui, w: &mut Workbench) {
    egui::MenuBar::new().ui(ui, |ui| {
        ui.menu_button("File", |ui| {
            if ui
                .button("New (Ctrl+N)")
                .on_hover_text("A fresh project of the same model")
                .clicked()
            {
                w.queue.push(Command::New);
            }
            if ui
                .button("Open… (Ctrl+O)")
                .on_hover_text("Open a project file")
                .clicked()
            {
                w.queue.push(Command::Open);
            }
            ui.menu_button("Open recent", |ui| {
                if w.view.recent.is_empty() {
                    ui.label("(none yet)");
                }
                for p in w.view.recent.clone() {
                    if ui
                        .button(p.display().to_string())
                        .on_hover_text("Open this project")
                        .clicked()
                    {
                        w.queue.push(Command::OpenPath(p));
                    }
                }
            });
            if ui
                .button("Save (Ctrl+S)")
                .on_hover_text("Save to the project's file")
                .clicked()
            {
                w.queue.push(Command::Save);
            }
            if ui
                .button("Save as… (Ctrl+Shift+S)")
                .on_hover_text("Save to a new file")
                .clicked()
            {
                w.queue.push(Command::SaveAs);
            }
            ui.separator();
            ui.menu_button("Export the prior", |ui| {
                for (_, t) in TARGETS {
                    if ui
                        .button(t.title())
                        .on_hover_text(format!("Ready-to-paste prior for {}", t.title()))
                        .clicked()
                    {
                        w.queue.push(Command::ShowExport(t));
                    }
                }
            });
            if ui
                .button("Write a report…")
                .on_hover_text("One HTML file with the judgments, priors, posterior, sensitivity, conflict check, export lines, notes and cautions")
                .clicked()
            {
                w.queue.push(Command::Report);
            }
            ui.separator();
            if ui
                .button("Quit")
                .on_hover_text("Close Priorwright")
                .clicked()
            {
                w.queue.push(Command::Quit);
            }
        });
        ui.menu_button("Edit", |ui| {
            if ui
                .add_enabled(w.history.can_undo(), egui::Button::new("Undo (Ctrl+Z)"))
                .on_hover_text("Undo the last change")
                .clicked()
            {
                w.queue.push(Command::Undo);
            }
            if ui
                .add_enabled(
                    w.history.can_redo(),
                    egui::Button::new("Redo (Ctrl+Shift+Z)"),
                )
                .on_hover_text("Redo the last undone change")
                .clicked()
            {
                w.queue.push(Command::Redo);
            }
        });
        ui.menu_button("View", |ui| {
            ui.checkbox(&mut w.view.dark, "Dark theme")
                .on_hover_text("Light or dark colours (pick what reads best on the projector)");
        });
        ui.menu_button("Help", |ui| {
            ui.label(egui::RichText::new("Responsible use").strong());
            ui.label(super::notices::CAUTION);
        });
        ui.separator();
        let name = w.path.as_ref().and_then(|p| p.file_name()).map_or_else(
            || "unsaved project".to_owned(),
            |n| n.to_string_lossy().into_owned(),
        );
        let marker = if w.dirty() {
            " • changed since saved"
        } else {
            ""
        };
        ui.label(format!("{name}{marker}"))
            .on_hover_text("The project file, and whether it has unsaved changes");
    });
}
