//! Data: loading or typing it, and the posterior over the prior with the
//! scaled likelihood and a summary table.

use super::super::command::Command;
use super::super::look::{self, Role};
use super::super::workbench::Workbench;
use super::{labelled, num};
use crate::project::DataSource;
use egui_plot::{Legend, Line, LineStyle, Plot};

/// Data keys per family, for the typed-statistics hint.
fn data_keys(id: &str) -> &'static str {
    match id {
        "beta-binomial" => "successes=7,trials=40",
        "gamma-poisson" => "events=12,exposure=5.5",
        "gamma-exponential" => "failures=3,time=2500",
        "normal-known-variance" => "n=10,mean=4.2",
        "normal-inverse-gamma" => "n=10,mean=4.2,variance=1.3",
        "dirichlet-multinomial" => "counts=5;9;2",
        _ => "n=10,ss=12.5",
    }
}

/// The data controls (left panel).
pub fn controls(ui: &mut egui::Ui, w: &mut Workbench) {
    ui.heading("Data");
    ui.horizontal(|ui| {
        if ui
            .button("Load a data file…")
            .on_hover_text("Read a CSV or TSV file (you can also drop one onto the window)")
            .clicked()
        {
            w.queue.push(Command::ChooseData);
        }
    });
    let fam = w.project.scenario.family.clone();
    let id = labelled(
        ui,
        "Summary statistics",
        "Data already reduced elsewhere, typed as key=value",
    );
    ui.horizontal(|ui| {
        ui.add(
            egui::TextEdit::singleline(&mut w.view.typed_data)
                .hint_text(data_keys(&fam))
                .desired_width(200.0),
        )
        .labelled_by(id)
        .on_hover_text(format!("For this model: {}", data_keys(&fam)));
        if ui
            .button("Add")
            .on_hover_text("Add these summary statistics as a data set")
            .clicked()
        {
            let text = w.view.typed_data.trim().to_owned();
            match w.prior().map(|p| p.parse_data(&text)) {
                Some(Ok(stats)) => {
                    w.queue.push(Command::AddData(DataSource {
                        name: "typed statistics".to_owned(),
                        path: None,
                        mapping: None,
                        missing_policy: crate::data::Missing::Skip,
                        statistics: stats,
                        rows: 0,
                        missing: 0,
                    }));
                    w.view.typed_data.clear();
                }
                Some(Err(e)) => w.error(format!("summary statistics: {e}")),
                None => {}
            }
        }
    });
    let mut remove = None;
    for (i, d) in w.project.data.iter().enumerate() {
        ui.horizontal(|ui| {
            let rows = if d.rows > 0 {
                format!(" ({} rows)", d.rows)
            } else {
                String::new()
            };
            ui.label(format!("{}{rows}", d.name))
                .on_hover_text(d.path.clone().unwrap_or_else(|| "typed in".to_owned()));
            if ui
                .small_button("remove")
                .on_hover_text("Remove this data set")
                .accessible_name(format!("remove data {}", i + 1))
                .clicked()
            {
                remove = Some(i);
            }
        });
    }
    if let Some(i) = remove {
        w.queue.push(Command::RemoveData(i));
    }
}

/// The posterior section (central panel).
pub fn posterior(ui: &mut egui::Ui, w: &mut Workbench) {
    let dark = w.view.dark;
    let Some(post) = w.derived().posterior.clone() else {
        return;
    };
    ui.heading("Posterior");
    let v = match post {
        Ok(v) => v,
        Err(e) => {
            ui.colored_label(ui.visuals().error_fg_color, e);
            return;
        }
    };
    Plot::new("posterior")
        .height(240.0)
        .legend(Legend::default())
        .allow_drag(false)
        .allow_zoom(false)
        .allow_scroll(false)
        .allow_boxed_zoom(false)
        .x_axis_label(v.unknown.clone())
        .show(ui, |pui| {
            pui.line(
                Line::new("prior", v.prior.points.clone())
                    .color(look::color(Role::Prior, dark))
                    .style(LineStyle::dashed_dense())
                    .width(2.0),
            );
            pui.line(
                Line::new("scaled likelihood", v.likelihood.points.clone())
                    .color(look::color(Role::Likelihood, dark))
                    .style(LineStyle::dotted_dense())
                    .width(2.0),
            );
            pui.line(
                Line::new("posterior", v.posterior.points.clone())
                    .color(look::color(Role::Posterior, dark))
                    .width(3.0),
            );
        });
    ui.horizontal(|ui| {
        let id = labelled(
            ui,
            "Threshold c",
            "The posterior probability of exceeding this value is shown",
        );
        let mut c = w.view.threshold;
        let speed = v.summary.sd.unwrap_or(1.0).max(1e-9) / 20.0;
        if ui
            .add(egui::DragValue::new(&mut c).speed(speed).max_decimals(6))
            .labelled_by(id)
            .on_hover_text("A value of interest, such as a target or a safety limit")
            .changed()
            && c.is_finite()
        {
            w.view.threshold = c;
        }
    });
    let s = &v.summary;
    egui::Grid::new("posterior summary")
        .striped(true)
        .show(ui, |ui| {
            let row = |ui: &mut egui::Ui, k: &str, val: String, tip: &str| {
                ui.label(k).on_hover_text(tip);
                ui.label(val);
                ui.end_row();
            };
            row(
                ui,
                "mean",
                s.mean.map_or("–".to_owned(), num),
                "Posterior mean",
            );
            row(
                ui,
                "sd",
                s.sd.map_or("–".to_owned(), num),
                "Posterior standard deviation",
            );
            row(ui, "median", num(s.median), "Posterior median");
            row(
                ui,
                "95% central interval",
                format!("{} to {}", num(s.central.lower), num(s.central.upper)),
                "Equal tails of 2.5% each",
            );
            // One interval keeps no pieces: its ends are the set.
            let hpd = if s.hpd.pieces.is_empty() {
                format!("{} to {}", num(s.hpd.lower), num(s.hpd.upper))
            } else {
                s.hpd
                    .pieces
                    .iter()
                    .map(|(a, b)| format!("{} to {}", num(*a), num(*b)))
                    .collect::<Vec<_>>()
                    .join(" and ")
            };
            row(
                ui,
                "95% highest-density set",
                hpd,
                "The shortest set holding 95%",
            );
            if let Some(c) = s.cdf.first() {
                row(
                    ui,
                    &format!("P({} > {})", v.unknown, num(c.x)),
                    format!("{:.4}", c.sf),
                    "Posterior probability of exceeding the threshold",
                );
            }
            if let Some(share) = v.prior_share {
                row(
                    ui,
                    "prior's share of the information",
                    format!("{:.1}%", share * 100.0),
                    "Prior ESS over posterior ESS: how much the posterior still rests on the prior",
                );
            }
            if let Some(c) = &v.conflict {
                row(
                    ui,
                    "prior–data conflict p",
                    format!("{:.3}", c.p_value),
                    "Two-sided prior-predictive tail probability of the observed statistic",
                );
            }
        });
    if let Some(c) = &v.conflict {
        ui.label(egui::RichText::new(format!("Conflict statistic: {}.", c.statistic)).small());
        let mut t = w.project.checks.conflict_threshold;
        ui.horizontal(|ui| {
            let id = labelled(
                ui,
                "Warn below p =",
                "The conflict p-value below which the window, the command line and the report warn",
            );
            if ui
                .add(
                    egui::DragValue::new(&mut t)
                        .range(0.001..=0.5)
                        .speed(0.001)
                        .max_decimals(3),
                )
                .labelled_by(id)
                .on_hover_text("Conflict threshold (0.05 is usual)")
                .changed()
            {
                w.queue.push(Command::SetConflictThreshold(t));
            }
        });
        if let Some(text) = c.warning(w.project.checks.conflict_threshold) {
            ui.colored_label(ui.visuals().warn_fg_color, text);
        }
    }
}
