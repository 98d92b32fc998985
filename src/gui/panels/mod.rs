//! The window's panels. Each draws from the workbench's state and derived
//! numbers and pushes [`super::command::Command`]s; none edits the project.

pub mod data;
pub mod dialogs;
pub mod experts;
pub mod judgments;
pub mod menu;
pub mod notices;
pub mod predictive;
pub mod prior;
pub mod sensitivity;

/// A label tied to the next widget, so tests and screen readers find it by name.
pub fn labelled(ui: &mut egui::Ui, text: &str, tip: &str) -> egui::Id {
    ui.label(text).on_hover_text(tip).id
}

/// A number for display: never NaN or infinity on screen.
pub fn num(x: f64) -> String {
    if x.is_finite() {
        crate::family::words::short(x)
    } else {
        "–".to_owned()
    }
}
