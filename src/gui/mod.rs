//! The desktop workbench (eframe/egui): one window for live elicitation.
//!
//! [`Workbench`] holds the project, the view settings, the undo history and
//! the cached numbers; [`show`] draws one frame from them. Panels push
//! [`command::Command`]s that [`Workbench::apply`] carries out after the
//! frame, so every edit passes one place (undo, the changed marker, autosave).
//! Tests drive [`show`] through egui_kittest without a window or a GPU.

pub mod command;
pub mod derived;
pub mod files;
pub mod history;
pub mod look;
pub mod panels;
pub mod workbench;

pub use command::Command;
pub use workbench::{Settings, Workbench};

use std::path::PathBuf;

/// Draws one frame and applies what it asked for.
pub fn show(ui: &mut egui::Ui, w: &mut Workbench) {
    w.apply_look(ui.ctx());
    panels::menu::shortcuts(ui, w);
    dropped_files(ui, w);
    egui::Panel::top("menu").show(ui, |ui| panels::menu::show(ui, w));
    egui::Panel::bottom("status").show(ui, |ui| {
        panels::notices::show(ui, w);
        ui.horizontal_wrapped(|ui| {
            ui.label(egui::RichText::new("Responsible use:").strong())
                .on_hover_text(panels::notices::CAUTION);
            ui.label(egui::RichText::new(
                "a prior can drive a clinical, safety or financial decision. Record the reasoning, follow the applicable guidance, have it reviewed.",
            ).small());
        });
    });
    egui::Panel::left("project")
        .resizable(true)
        .default_size(340.0)
        .show(ui, |ui| {
            egui::ScrollArea::vertical().show(ui, |ui| {
                panels::experts::show(ui, w);
                ui.separator();
                panels::data::controls(ui, w);
            });
        });
    egui::CentralPanel::default().show(ui, |ui| {
        egui::ScrollArea::vertical().show(ui, |ui| {
            panels::prior::show(ui, w);
            ui.separator();
            ui.columns(2, |cols| {
                panels::judgments::show(&mut cols[0], w);
                panels::predictive::show(&mut cols[1], w);
            });
            ui.separator();
            panels::data::posterior(ui, w);
            ui.separator();
            panels::sensitivity::show(ui, w);
        });
    });
    panels::dialogs::show(ui, w);
    let now = ui.input(|i| i.time);
    w.apply_queue(now);
    if w.waiting() {
        // A file dialog runs on its own thread: look for its answer shortly.
        ui.ctx()
            .request_repaint_after(std::time::Duration::from_millis(100));
    } else if let Some(secs) = w.autosave_due_in(now) {
        ui.ctx()
            .request_repaint_after(std::time::Duration::from_secs_f64(secs));
    }
}

/// Files dropped on the window: a project opens, anything else is data.
fn dropped_files(ui: &mut egui::Ui, w: &mut Workbench) {
    let dropped: Vec<PathBuf> = ui.input(|i| {
        i.raw
            .dropped_files
            .iter()
            .map(|f| f.path().to_path_buf())
            .filter(|p| !p.as_os_str().is_empty())
            .collect()
    });
    for p in dropped {
        let is_project = p.extension().is_some_and(|e| e.eq_ignore_ascii_case("ron"));
        w.queue.push(if is_project {
            Command::OpenPath(p)
        } else {
            Command::MapData(p)
        });
    }
}

/// What the window opens on.
#[derive(Clone, Debug, PartialEq)]
pub enum Start {
    /// The bundled example.
    Example,
    /// A project file.
    File(PathBuf),
}

/// The eframe shell around the workbench.
struct App {
    workbench: Workbench,
}

impl eframe::App for App {
    fn ui(&mut self, ui: &mut egui::Ui, _frame: &mut eframe::Frame) {
        let close = ui.ctx().input(|i| i.viewport().close_requested());
        if close && self.workbench.close_requested() {
            ui.ctx()
                .send_viewport_cmd(egui::ViewportCommand::CancelClose);
        }
        show(ui, &mut self.workbench);
        if self.workbench.quit {
            ui.ctx().send_viewport_cmd(egui::ViewportCommand::Close);
        }
    }
}

/// Opens the window.
pub fn run(start: Start) -> Result<(), String> {
    let chooser: Box<dyn files::Chooser> = if files::dialogs_unavailable() {
        Box::new(files::NoChooser)
    } else {
        Box::new(files::NativeChooser)
    };
    let settings = Settings::desktop();
    let workbench = match &start {
        Start::Example => Workbench::example(chooser, settings),
        Start::File(p) => Workbench::open(p, chooser, settings),
    };
    let options = eframe::NativeOptions {
        viewport: egui::ViewportBuilder::default()
            .with_inner_size([1360.0, 900.0])
            .with_title("Priorwright")
            .with_drag_and_drop(true),
        ..Default::default()
    };
    eframe::run_native(
        "Priorwright",
        options,
        Box::new(move |_cc| Ok(Box::new(App { workbench }))),
    )
    .map_err(|e| format!("the window could not be opened: {e}"))
}
