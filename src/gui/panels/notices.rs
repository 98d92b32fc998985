//! Messages in the window, and the note on responsible use.

use super::super::command::Command;
use super::super::workbench::Workbench;

/// The caution, always reachable from the Help menu and the status bar.
pub const CAUTION: &str = "A prior can decide a clinical, safety or financial decision. Record the reasoning behind every judgment, follow the guidance that applies to your field (for example regulatory guidance on Bayesian methods), and have the prior and its sensitivity reviewed by a qualified statistician before it is used. The numbers here are only as good as the judgments behind them.";

/// The notices, newest last, each with a close button.
pub fn show(ui: &mut egui::Ui, w: &mut Workbench) {
    let mut dismiss = None;
    for (i, n) in w.notices.iter().enumerate() {
        ui.horizontal(|ui| {
            let colour = if n.error {
                ui.visuals().error_fg_color
            } else {
                ui.visuals().text_color()
            };
            ui.colored_label(colour, if n.error { "Problem:" } else { "Note:" });
            ui.colored_label(colour, &n.text);
            if ui
                .small_button("Dismiss")
                .on_hover_text("Close this message")
                .accessible_name(format!("dismiss message {}", i + 1))
                .clicked()
            {
                dismiss = Some(i);
            }
        });
    }
    if let Some(i) = dismiss {
        w.queue.push(Command::Dismiss(i));
    }
}
