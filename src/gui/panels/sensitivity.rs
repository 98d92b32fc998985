//! How much the posterior rests on the prior: the ESS sweep on a log axis,
//! the prior-centre sweep, and the posterior under alternative priors.

use super::super::command::Command;
use super::super::look::{self, Role};
use super::super::workbench::Workbench;
use super::num;
use crate::analysis::sensitivity::{Point, Sensitivity, Sweep};
use egui_plot::{FilledArea, Line, LineStyle, Plot, VLine};

/// The sensitivity section (shown once there are data).
pub fn show(ui: &mut egui::Ui, w: &mut Workbench) {
    let Some(Ok(post)) = w.derived().posterior.clone() else {
        return;
    };
    let dark = w.view.dark;
    ui.heading("Sensitivity to the prior")
        .on_hover_text("How the posterior would change with a weaker or stronger prior, a different centre, or another prior altogether");
    let s = match post.sensitivity {
        Ok(s) => s,
        Err(e) => {
            ui.colored_label(ui.visuals().error_fg_color, format!("sensitivity: {e}"));
            return;
        }
    };
    ui.columns(2, |cols| {
        cols[0].label(format!(
            "Posterior mean and {}% interval of {} as the prior's ESS is scaled",
            (s.ess.level * 100.0).round(),
            s.ess.parameter
        ));
        sweep_plot(&mut cols[0], "ess sweep", &s.ess, true, dark);
        cols[1].label(format!(
            "…and as the prior's centre moves across its own {}% interval",
            (s.centre.level * 100.0).round()
        ));
        sweep_plot(&mut cols[1], "centre sweep", &s.centre, false, dark);
    });
    table(ui, &s);
    editor(ui, w, &s);
}

const EDITOR_HELP: &str = "Each row is a prior of this model, written as on the command line. \
    Saved with the project; the report uses them too.";

/// The alternatives as editable rows: a name and the prior as key=value.
fn editor(ui: &mut egui::Ui, w: &mut Workbench, s: &Sensitivity) {
    let open = w.view.alternatives_open;
    if ui
        .selectable_label(open, "Edit the alternatives")
        .on_hover_text("Type your own priors to compare with, or go back to the defaults")
        .clicked()
    {
        w.view.alternatives_open = !open;
    }
    if !w.view.alternatives_open {
        return;
    }
    ui.group(|ui| {
        if w.view.alternatives.is_empty() {
            w.view.alternatives = s
                .alternatives
                .iter()
                .map(|a| (a.name.clone(), a.prior.to_keys()))
                .collect();
        }
        ui.label(EDITOR_HELP);
        let mut remove = None;
        // Plain rows, not a grid: a grid sizes its text fields to the header.
        for (i, (name, text)) in w.view.alternatives.iter_mut().enumerate() {
            ui.horizontal(|ui| {
                ui.add(egui::TextEdit::singleline(name).desired_width(120.0))
                    .on_hover_text("A short name for this prior")
                    .accessible_name(format!("alternative name {}", i + 1));
                ui.add(egui::TextEdit::singleline(text).desired_width(360.0))
                    .on_hover_text("Hyperparameters as key=value pairs, e.g. alpha=1,beta=1")
                    .accessible_name(format!("alternative prior {}", i + 1));
                if ui
                    .small_button("remove")
                    .on_hover_text("Drop this alternative")
                    .accessible_name(format!("remove alternative {}", i + 1))
                    .clicked()
                {
                    remove = Some(i);
                }
            });
        }
        if let Some(i) = remove {
            w.view.alternatives.remove(i);
        }
        ui.horizontal(|ui| {
            if ui
                .button("Add an alternative")
                .on_hover_text("Another prior to compare with")
                .clicked()
            {
                let keys = w.prior().map(|p| p.to_keys()).unwrap_or_default();
                w.view.alternatives.push((
                    format!("alternative {}", w.view.alternatives.len() + 1),
                    keys,
                ));
            }
            if ui
                .button("Use these alternatives")
                .on_hover_text("Compare the posterior under these priors (kept in the project)")
                .clicked()
            {
                w.queue
                    .push(Command::SetAlternatives(w.view.alternatives.clone()));
            }
            if ui
                .button("Back to the defaults")
                .on_hover_text("Vague, sceptical and enthusiastic, rebuilt from the elicited prior")
                .clicked()
            {
                w.view.alternatives.clear();
                w.queue.push(Command::SetAlternatives(Vec::new()));
            }
        });
    });
}

fn sweep_plot(ui: &mut egui::Ui, id: &str, sweep: &Sweep, log: bool, dark: bool) {
    let x = |p: &Point| if log { p.x.log10() } else { p.x };
    let pts: Vec<&Point> = sweep.points.iter().filter(|p| p.mean.is_some()).collect();
    let xs: Vec<f64> = pts.iter().map(|p| x(p)).collect();
    let lo: Vec<f64> = pts.iter().map(|p| p.lower).collect();
    let hi: Vec<f64> = pts.iter().map(|p| p.upper).collect();
    let mean: Vec<[f64; 2]> = pts
        .iter()
        .filter_map(|p| p.mean.map(|m| [x(p), m]))
        .collect();
    let colour = look::color(Role::Posterior, dark);
    let mut plot = Plot::new(id)
        .height(200.0)
        .allow_drag(false)
        .allow_zoom(false)
        .allow_scroll(false)
        .allow_boxed_zoom(false)
        .y_axis_label(sweep.parameter.clone());
    plot = if log {
        plot.x_axis_label("ESS factor (log scale)")
            .x_axis_formatter(|m, _| format!("x{}", num(10f64.powf(m.value))))
    } else {
        plot.x_axis_label(format!("prior centre of {}", sweep.parameter))
    };
    plot.show(ui, |pui| {
        if xs.len() >= 2 {
            pui.add(
                FilledArea::new("interval", &xs, &lo, &hi).fill_color(colour.gamma_multiply(0.25)),
            );
        }
        pui.line(Line::new("posterior mean", mean).color(colour).width(2.5));
        let here = if log {
            sweep.elicited.log10()
        } else {
            sweep.elicited
        };
        pui.vline(
            VLine::new("elicited", here)
                .color(look::color(Role::Mark, dark))
                .style(LineStyle::dashed_loose()),
        );
    });
}

fn table(ui: &mut egui::Ui, s: &Sensitivity) {
    ui.label(if s.default_alternatives {
        "Posterior under the elicited prior and three default alternatives (how each is built is in its tooltip):"
    } else {
        "Posterior under the elicited prior and the project's stated alternatives:"
    });
    egui::Grid::new("alternatives")
        .striped(true)
        .show(ui, |ui| {
            for h in [
                "prior",
                "prior mean",
                "posterior mean",
                "95% interval",
                "prior's share",
            ] {
                ui.label(egui::RichText::new(h).strong());
            }
            ui.end_row();
            for r in &s.table {
                ui.label(&r.name).on_hover_text(&r.how);
                ui.label(r.prior_mean.map_or("–".to_owned(), num));
                ui.label(r.posterior.mean.map_or("–".to_owned(), num));
                ui.label(format!(
                    "{} to {}",
                    num(r.posterior.lower),
                    num(r.posterior.upper)
                ));
                ui.label(format!("{:.1}%", 100.0 * r.prior_share));
                ui.end_row();
            }
        });
}
