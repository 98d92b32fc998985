//! Judgments: stated probabilities, chips in bins, imagined data and
//! judgments about a future observation, each refitting the prior.

use super::super::command::Command;
use super::super::look::{self, Role};
use super::super::workbench::Workbench;
use super::{labelled, num};
use crate::elicit::dials;
use crate::elicit::methods;
use crate::project::{MethodRecord, StoredJudgment};
use egui_plot::{Line, MarkerShape, Plot, PlotBounds, Points};

/// Which form shows.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Method {
    /// P(unknown ≤ value) = p rows.
    Quantiles,
    /// Chips in bins.
    Chips,
    /// Imagined future data.
    Imagined,
    /// Judgments about a future observation.
    Observable,
}

/// One judgment row as typed: P(about ≤ value) = p.
#[derive(Clone, Debug, Default, PartialEq)]
pub struct Row {
    /// Probability, as typed.
    pub p: String,
    /// Value, as typed.
    pub value: String,
    /// The unknown it is about (None: the one the dials are on).
    pub about: Option<String>,
}

impl Row {
    /// A row about the unknown the dials are on.
    pub fn new(p: impl Into<String>, value: impl Into<String>) -> Self {
        Self {
            p: p.into(),
            value: value.into(),
            about: None,
        }
    }
}

/// Bins in a fresh chips grid.
const BINS: usize = 10;

/// The judgments panel.
pub fn show(ui: &mut egui::Ui, w: &mut Workbench) {
    let Some(prior) = w.prior().cloned() else {
        return;
    };
    let expert = w.view.expert;
    if w.view.rows_for != Some(expert) {
        w.view.rows = w.project.experts[expert]
            .judgments
            .iter()
            .map(|j| Row {
                p: num(j.p),
                value: num(j.value),
                about: j.parameter.clone(),
            })
            .collect();
        if w.view.rows.is_empty() {
            w.view.rows = vec![Row::default(); 3];
        }
        load_form(w, expert);
        w.view.rows_for = Some(expert);
    }
    ui.heading("Judgments");
    ui.horizontal_wrapped(|ui| {
        for (m, text, tip) in [
            (
                Method::Quantiles,
                "Stated probabilities",
                "Type P(unknown ≤ value) = p judgments; the prior is fitted to them.",
            ),
            (
                Method::Chips,
                "Chips in bins",
                "Place chips in bins in proportion to belief; the prior is fitted to them.",
            ),
            (
                Method::Imagined,
                "Imagined data",
                "Say how a future result would move your estimate; that fixes the ESS.",
            ),
            (
                Method::Observable,
                "About a future observation",
                "State probabilities about data you will see; the prior is fitted through the prior predictive.",
            ),
        ] {
            if ui
                .selectable_label(w.view.method == m, text)
                .on_hover_text(tip)
                .clicked()
            {
                w.view.method = m;
                w.view.method_note = None;
            }
        }
    });
    match w.view.method {
        Method::Quantiles => quantiles(ui, w, expert),
        Method::Chips => chips(ui, w, expert),
        Method::Imagined => imagined(ui, w, expert, &prior),
        Method::Observable => observable(ui, w, expert, &prior),
    }
    if let Some(note) = &w.view.method_note {
        ui.colored_label(ui.visuals().warn_fg_color, note);
    }
    cumulative_plot(ui, w, expert);
}

/// Brings back the form an expert last used (chips, imagined sample or
/// future-observation rows) from the project, so a reopened project or an
/// undo shows what the expert said, not an empty grid.
fn load_form(w: &mut Workbench, expert: usize) {
    match w.project.experts[expert].method.clone() {
        Some(MethodRecord::Chips { edges, chips, .. }) if edges.len() == chips.len() + 1 => {
            w.view.edges = edges;
            w.view.chips = chips;
            w.view.method = Method::Chips;
        }
        Some(MethodRecord::Imagined { text }) => {
            w.view.imagined = text;
            w.view.method = Method::Imagined;
        }
        Some(MethodRecord::Observable { future, judgments }) => {
            w.view.observable_future = future;
            w.view.observable_rows = judgments
                .iter()
                .map(|(p, v)| Row::new(num(*p), num(*v)))
                .collect();
            w.view.method = Method::Observable;
        }
        _ => {
            w.view.edges.clear();
            w.view.chips.clear();
        }
    }
}

/// Parses rows into (p, value, about); blank rows are skipped and the first
/// bad cell is named.
fn parse_rows(rows: &[Row]) -> Result<Vec<(f64, f64, Option<String>)>, String> {
    let mut out = Vec::new();
    for (i, Row { p, value: v, about }) in rows.iter().enumerate() {
        if p.trim().is_empty() && v.trim().is_empty() {
            continue;
        }
        let p: f64 = p
            .trim()
            .parse()
            .map_err(|_| format!("row {}: probability '{}' is not a number", i + 1, p.trim()))?;
        let v: f64 = v
            .trim()
            .parse()
            .map_err(|_| format!("row {}: value '{}' is not a number", i + 1, v.trim()))?;
        if !v.is_finite() {
            return Err(format!("row {}: value must be a finite number", i + 1));
        }
        out.push((p, v, about.clone()));
    }
    Ok(out)
}

/// The rows table. `unknowns` lists the unknowns a row can be about; with
/// more than one, each row gets a chooser (a normal-inverse-gamma expert
/// can state judgments on the mean and on the variance in one table).
fn rows_editor(ui: &mut egui::Ui, rows: &mut Vec<Row>, id: &str, unknowns: &[String]) {
    let choose = unknowns.len() > 1;
    egui::Grid::new(id)
        .num_columns(if choose { 4 } else { 3 })
        .min_col_width(100.0)
        .show(ui, |ui| {
            if choose {
                ui.label("about")
                    .on_hover_text("The unknown the judgment is about.");
            }
            ui.label("probability p")
                .on_hover_text("The probability that the quantity is at most the value.");
            ui.label("value")
                .on_hover_text("The value the probability is about.");
            ui.end_row();
            let mut remove = None;
            for (i, row) in rows.iter_mut().enumerate() {
                if choose {
                    let current = row.about.clone().unwrap_or_else(|| unknowns[0].clone());
                    egui::ComboBox::from_id_salt((id, "about", i))
                        .selected_text(&current)
                        .show_ui(ui, |ui| {
                            for u in unknowns {
                                if ui.selectable_label(&current == u, u).clicked() {
                                    row.about = Some(u.clone());
                                }
                            }
                        })
                        .response
                        .on_hover_text(format!("Row {}: which unknown", i + 1))
                        .accessible_name(format!("{id} about{}", i + 1));
                }
                ui.add(
                    egui::TextEdit::singleline(&mut row.p)
                        .desired_width(80.0)
                        .hint_text("0.5"),
                )
                .on_hover_text(format!("Row {}: probability p in (0, 1)", i + 1))
                .accessible_name(format!("{id} p{}", i + 1));
                ui.add(egui::TextEdit::singleline(&mut row.value).desired_width(100.0))
                    .on_hover_text(format!("Row {}: the value", i + 1))
                    .accessible_name(format!("{id} value{}", i + 1));
                if ui
                    .small_button("remove")
                    .on_hover_text(format!("Remove row {}", i + 1))
                    .accessible_name(format!("{id} remove row {}", i + 1))
                    .clicked()
                {
                    remove = Some(i);
                }
                ui.end_row();
            }
            if let Some(i) = remove {
                rows.remove(i);
            }
        });
    if ui
        .button("Add a row")
        .on_hover_text("Another judgment")
        .clicked()
    {
        rows.push(Row::default());
    }
}

fn quantiles(ui: &mut egui::Ui, w: &mut Workbench, expert: usize) {
    ui.label("P(unknown ≤ value) = p. Two judgments fix the prior exactly; more are fitted by least squares.");
    let (unknowns, here) = match w.prior() {
        Some(p) => {
            let laws = p.marginals();
            let here = laws[dials::marginal_index(p, w.view.dial)].name.clone();
            (laws.into_iter().map(|m| m.name).collect::<Vec<_>>(), here)
        }
        None => return,
    };
    let mut rows = std::mem::take(&mut w.view.rows);
    for r in &mut rows {
        if r.about.is_none() {
            r.about = Some(here.clone());
        }
    }
    rows_editor(ui, &mut rows, "judgment", &unknowns);
    w.view.rows = rows;
    if ui
        .button("Fit the prior to these")
        .on_hover_text("Replace this expert's prior by the one that best matches the judgments")
        .clicked()
    {
        match parse_rows(&w.view.rows) {
            Ok(v) if v.len() >= 2 => w.queue.push(Command::FitJudgments {
                expert,
                judgments: v
                    .into_iter()
                    .map(|(p, value, about)| StoredJudgment {
                        parameter: about.or_else(|| Some(here.clone())),
                        p,
                        value,
                    })
                    .collect(),
            }),
            Ok(_) => w.error("give at least two judgments to fit a prior"),
            Err(e) => w.error(format!("judgments: {e}")),
        }
    }
    // Stated vs fitted.
    let e = &w.project.experts[expert];
    if !e.judgments.is_empty() {
        egui::Grid::new("stated vs fitted")
            .striped(true)
            .show(ui, |ui| {
                ui.label("about");
                ui.label("value");
                ui.label("stated p");
                ui.label("fitted p");
                ui.end_row();
                for j in &e.judgments {
                    let (about, fitted) = match j.fitted(&e.prior) {
                        Some((n, f)) if f.is_finite() => (n, format!("{f:.3}")),
                        Some((n, _)) => (n, "–".to_owned()),
                        None => (String::new(), "–".to_owned()),
                    };
                    ui.label(about);
                    ui.label(num(j.value));
                    ui.label(num(j.p));
                    ui.label(fitted);
                    ui.end_row();
                }
            });
    }
}

fn chips(ui: &mut egui::Ui, w: &mut Workbench, expert: usize) {
    let range = w.derived().prior.as_ref().map(|v| v.range);
    if w.view.edges.is_empty() {
        let (lo, hi) = range.unwrap_or((0.0, 1.0));
        w.view.edges = nice_edges(lo, hi, BINS);
        w.view.chips = vec![0.0; w.view.edges.len() - 1];
    }
    ui.label("Click + to put a chip in a bin, − to take one out. Place chips in proportion to your belief; the prior is refitted each time.");
    let edges = w.view.edges.clone();
    let mut changed = false;
    let dark = w.view.dark;
    let colour = look::color(Role::Prior, dark);
    ui.horizontal(|ui| {
        for b in 0..w.view.chips.len() {
            ui.vertical(|ui| {
                let count = w.view.chips[b] as usize;
                let (rect, _) =
                    ui.allocate_exact_size(egui::vec2(34.0, 110.0), egui::Sense::hover());
                let painter = ui.painter_at(rect);
                painter.rect_stroke(
                    rect,
                    2.0,
                    ui.visuals().widgets.noninteractive.bg_stroke,
                    egui::StrokeKind::Inside,
                );
                for c in 0..count.min(12) {
                    let y = rect.bottom() - 4.0 - 9.0 * (c as f32 + 1.0);
                    painter.rect_filled(
                        egui::Rect::from_min_size(
                            egui::pos2(rect.left() + 5.0, y),
                            egui::vec2(24.0, 7.0),
                        ),
                        1.0,
                        colour,
                    );
                }
                if count > 12 {
                    painter.text(
                        rect.center_top() + egui::vec2(0.0, 8.0),
                        egui::Align2::CENTER_CENTER,
                        count.to_string(),
                        egui::FontId::proportional(13.0),
                        ui.visuals().text_color(),
                    );
                }
                let label = format!("bin {} ({} to {})", b + 1, num(edges[b]), num(edges[b + 1]));
                if ui
                    .small_button("+")
                    .on_hover_text(format!("Add a chip to {label}"))
                    .accessible_name(format!("add a chip to bin {}", b + 1))
                    .clicked()
                {
                    w.view.chips[b] += 1.0;
                    changed = true;
                }
                if ui
                    .small_button("-")
                    .on_hover_text(format!("Take a chip from {label}"))
                    .accessible_name(format!("take a chip from bin {}", b + 1))
                    .clicked()
                    && w.view.chips[b] > 0.0
                {
                    w.view.chips[b] -= 1.0;
                    changed = true;
                }
                ui.label(egui::RichText::new(num(edges[b])).small());
            });
        }
    });
    ui.horizontal(|ui| {
        let total: f64 = w.view.chips.iter().sum();
        ui.label(format!("{total} chips"));
        if ui
            .button("Clear the chips")
            .on_hover_text("Start the grid again")
            .clicked()
        {
            w.view.chips.iter_mut().for_each(|c| *c = 0.0);
        }
        if ui
            .button("New bins from the plot")
            .on_hover_text("Bins across the current plot range")
            .clicked()
        {
            w.view.edges.clear();
        }
    });
    if changed {
        let total: f64 = w.view.chips.iter().sum();
        if total >= 2.0 {
            w.view.method_note = None;
            w.queue.push(Command::FitChips {
                expert,
                edges,
                chips: w.view.chips.clone(),
            });
        } else {
            w.view.method_note = Some("place at least two chips".to_owned());
        }
    }
}

/// Round bin edges covering [lo, hi].
pub fn nice_edges(lo: f64, hi: f64, bins: usize) -> Vec<f64> {
    let raw = (hi - lo) / bins as f64;
    let mag = 10f64.powf(raw.log10().floor());
    let step = [1.0, 2.0, 2.5, 5.0, 10.0]
        .iter()
        .map(|m| m * mag)
        .find(|s| *s >= raw)
        .unwrap_or(raw);
    let start = (lo / step).floor() * step;
    let mut e: Vec<f64> = (0..=bins + 1).map(|k| start + k as f64 * step).collect();
    while e.len() > 2 && e[e.len() - 2] >= hi {
        e.pop();
    }
    e
}

fn imagined(ui: &mut egui::Ui, w: &mut Workbench, expert: usize, prior: &crate::family::Prior) {
    let keys = methods::imagined_keys(prior.id());
    let setting = dials::setting(prior, dials::Dial::Main);
    ui.label(format!(
        "With the prior mean kept at {}, say what a future sample would be and where your estimate would move. Keys: {}.",
        num(setting.centre),
        keys.join(", ")
    ));
    if w.view.imagined.is_empty() {
        w.view.imagined = match prior.id() {
            "beta-binomial" => "successes=8,trials=20,estimate=0.3".to_owned(),
            _ => keys
                .iter()
                .map(|k| format!("{k}="))
                .collect::<Vec<_>>()
                .join(","),
        };
    }
    let id = labelled(
        ui,
        "Imagined sample",
        "key=value pairs, as on the command line",
    );
    ui.add(egui::TextEdit::singleline(&mut w.view.imagined).desired_width(360.0))
        .labelled_by(id)
        .on_hover_text("For example successes=8,trials=20,estimate=0.3");
    if ui
        .button("Set the ESS from this")
        .on_hover_text(
            "Keep the centre; choose the ESS that makes this sample move the estimate as stated",
        )
        .clicked()
    {
        w.queue.push(Command::Imagined {
            expert,
            mean: setting.centre,
            text: w.view.imagined.clone(),
        });
    }
}

fn observable(ui: &mut egui::Ui, w: &mut Workbench, expert: usize, prior: &crate::family::Prior) {
    if w.view.observable_future.is_empty() {
        w.view.observable_future = match prior.id() {
            "beta-binomial" => "trials=20",
            "gamma-poisson" => "exposure=1",
            "gamma-exponential" => "n=1",
            "dirichlet-multinomial" => "n=20",
            _ => "n=1",
        }
        .to_owned();
        w.view.observable_rows = vec![Row::default(); 3];
    }
    ui.label("P(future observation ≤ value) = p, for the future sample below.");
    let id = labelled(
        ui,
        "Future sample",
        "key=value: trials=m, exposure=t, n=m …",
    );
    ui.add(egui::TextEdit::singleline(&mut w.view.observable_future).desired_width(200.0))
        .labelled_by(id)
        .on_hover_text("The future sample the judgments are about");
    let mut rows = std::mem::take(&mut w.view.observable_rows);
    rows_editor(ui, &mut rows, "observable", &[]);
    w.view.observable_rows = rows;
    if ui
        .button("Fit through the prior predictive")
        .on_hover_text("Fit the prior so that its prior predictive matches these")
        .clicked()
    {
        match parse_rows(&w.view.observable_rows) {
            Ok(v) if v.len() >= 2 => w.queue.push(Command::Observable {
                expert,
                future: w.view.observable_future.clone(),
                judgments: v.into_iter().map(|(p, x, _)| (p, x)).collect(),
            }),
            Ok(_) => w.error("give at least two judgments about the future observation"),
            Err(e) => w.error(format!("future-observation judgments: {e}")),
        }
    }
}

fn cumulative_plot(ui: &mut egui::Ui, w: &mut Workbench, expert: usize) {
    let dark = w.view.dark;
    let Some(view) = w.derived().prior.clone() else {
        return;
    };
    let stated: Vec<[f64; 2]> = w.project.experts[expert]
        .judgments
        .iter()
        .filter(|j| j.parameter.as_deref().is_none_or(|n| n == view.unknown))
        .map(|j| [j.value, j.p])
        .collect();
    let mut typed = Vec::new();
    if w.view.method == Method::Quantiles
        && let Ok(rows) = parse_rows(&w.view.rows)
    {
        typed = rows
            .into_iter()
            .filter(|(_, _, about)| about.as_deref().is_none_or(|n| n == view.unknown))
            .map(|(p, v, _)| [v, p])
            .collect();
    }
    Plot::new(("cumulative", expert))
        .height(200.0)
        .allow_drag(false)
        .allow_zoom(false)
        .allow_scroll(false)
        .allow_boxed_zoom(false)
        .x_axis_label(format!("{} (cumulative probability)", view.unknown))
        .show(ui, |pui| {
            pui.set_plot_bounds(PlotBounds::from_min_max(
                [view.range.0, 0.0],
                [view.range.1, 1.0],
            ));
            pui.line(
                Line::new("fitted", view.cdf.points.clone())
                    .color(look::color(Role::Prior, dark))
                    .width(2.5),
            );
            pui.points(
                Points::new("stated", stated)
                    .radius(6.0)
                    .shape(MarkerShape::Square)
                    .color(look::color(Role::Posterior, dark)),
            );
            pui.points(
                Points::new("typed", typed)
                    .radius(5.0)
                    .shape(MarkerShape::Cross)
                    .color(look::color(Role::Mark, dark)),
            );
        });
}
