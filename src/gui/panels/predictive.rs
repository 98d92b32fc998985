//! The prior predictive on the observable scale.

use super::super::derived::{PredictiveView, future_words};
use super::super::look::{self, Role};
use super::super::workbench::Workbench;
use super::{labelled, num};
use egui_plot::{Bar, BarChart, Line, Plot};

/// The predictive panel.
pub fn show(ui: &mut egui::Ui, w: &mut Workbench) {
    let dark = w.view.dark;
    ui.heading("Prior predictive");
    let words = w.prior().and_then(future_words);
    if let Some(words) = words {
        ui.horizontal(|ui| {
            let id = labelled(
                ui,
                &format!("Size of the future sample ({words})"),
                "How much future data the prediction is for",
            );
            let whole = words != "future exposure";
            let mut v = w.view.future;
            ui.add(
                egui::DragValue::new(&mut v)
                    .range(if whole { 1.0..=100_000.0 } else { 1e-6..=1e9 })
                    .speed(if whole { 0.5 } else { 0.05 })
                    .max_decimals(if whole { 0 } else { 4 }),
            )
            .labelled_by(id)
            .on_hover_text("Future trials, exposure or values the predictive is for");
            w.view.future = if whole { v.round().max(1.0) } else { v };
        });
    }
    let predicted = w.derived().predictive.clone();
    match predicted {
        Err(e) => {
            ui.colored_label(ui.visuals().error_fg_color, e);
        }
        Ok(p) => {
            let whose = if w.project.experts.len() > 1 {
                " under the pooled prior"
            } else {
                ""
            };
            ui.label(format!("Predicted: {}{whose}.", p.what))
                .on_hover_text("The prior predictive: what the data may look like before they are seen, with the prior's uncertainty included");
            ui.horizontal_wrapped(|ui| {
                for (k, v) in &p.lines {
                    ui.label(format!("{k} {v}"));
                }
            });
            let colour = look::color(Role::Prior, dark);
            match &p.view {
                PredictiveView::Bars(bars) => {
                    let chart = BarChart::new(
                        "probability",
                        bars.iter()
                            .map(|(k, q)| Bar::new(*k, *q).width(0.8))
                            .collect(),
                    )
                    .color(colour);
                    Plot::new("predictive bars")
                        .height(200.0)
                        .allow_drag(false)
                        .allow_zoom(false)
                        .allow_scroll(false)
                        .allow_boxed_zoom(false)
                        .x_axis_label("count")
                        .show(ui, |pui| pui.bar_chart(chart));
                }
                PredictiveView::Density(c) => {
                    Plot::new("predictive density")
                        .height(200.0)
                        .allow_drag(false)
                        .allow_zoom(false)
                        .allow_scroll(false)
                        .allow_boxed_zoom(false)
                        .x_axis_label("future value")
                        .show(ui, |pui| {
                            pui.line(
                                Line::new("density", c.points.clone())
                                    .color(colour)
                                    .width(2.5),
                            );
                        });
                }
                PredictiveView::Categories(rows) => {
                    egui::Grid::new("predictive categories")
                        .striped(true)
                        .show(ui, |ui| {
                            ui.label("category");
                            ui.label("mean count");
                            ui.label("5% point");
                            ui.label("95% point");
                            ui.end_row();
                            for (name, mean, lo, hi) in rows {
                                ui.label(name);
                                ui.label(num(*mean));
                                ui.label(num(*lo));
                                ui.label(num(*hi));
                                ui.end_row();
                            }
                        });
                    let chart = BarChart::new(
                        "mean count",
                        rows.iter()
                            .enumerate()
                            .map(|(i, (n, m, _, _))| Bar::new(i as f64, *m).name(n).width(0.7))
                            .collect(),
                    )
                    .color(colour);
                    Plot::new("predictive categories plot")
                        .height(160.0)
                        .allow_drag(false)
                        .allow_zoom(false)
                        .allow_scroll(false)
                        .allow_boxed_zoom(false)
                        .show(ui, |pui| pui.bar_chart(chart));
                }
            }
        }
    }
}
