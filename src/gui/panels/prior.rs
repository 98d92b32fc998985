//! The prior by hand: its density with two handles, and the dials as numbers.
//!
//! The filled handle sits at the centre of the imaginary data; the ring sits
//! at the upper 95% point. Dragging the centre keeps the ESS; dragging the
//! ring sets the ESS that puts the 95% point there. While a handle is held the
//! x-range stays still, so the handle does not run away from the pointer.

use super::super::command::Command;
use super::super::look::{self, Role};
use super::super::workbench::Workbench;
use super::{labelled, num};
use crate::elicit::dials::{self, Dial, Setting};
use egui_plot::{Legend, Line, LineStyle, MarkerShape, Plot, PlotBounds, PlotPoint, Points};

/// The two handles.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Handle {
    /// The centre of the imaginary data.
    Centre,
    /// The 95% point (sets the ESS).
    Spread,
}

/// Pick radius around a handle, in screen points.
const PICK: f32 = 16.0;

/// The prior panel.
pub fn show(ui: &mut egui::Ui, w: &mut Workbench) {
    let Some(prior) = w.prior().cloned() else {
        ui.label("No expert: add one on the left.");
        return;
    };
    let expert = w.view.expert;
    let dark = w.view.dark;
    let Some(view) = w.derived().prior.clone() else {
        return;
    };
    let name = w.project.experts[expert].name.clone();
    ui.heading(format!("Prior of {} — {}", view.unknown, name));
    let available = dials::available(&prior);
    let dial = if available.contains(&w.view.dial) {
        w.view.dial
    } else {
        dials::first(&prior)
    };
    if available.len() > 1 {
        ui.horizontal_wrapped(|ui| {
            ui.label("Dials for:")
                .on_hover_text("Which unknown the handles and fields set: one at a time.");
            for d in &available {
                let text = match d {
                    Dial::Main => "mean μ".to_owned(),
                    Dial::Variance => "variance σ²".to_owned(),
                    Dial::Share(i) => format!("share {}", category_name(&prior, *i)),
                };
                if ui
                    .selectable_label(*d == dial, text)
                    .on_hover_text("Show and set this unknown's prior")
                    .clicked()
                {
                    w.view.dial = *d;
                }
            }
        });
    }
    let (centre_words, ess_words) = dials::meaning(&prior, dial);
    let mut setting = view.setting;
    let mut changed = false;
    ui.horizontal_wrapped(|ui| {
        let id = labelled(
            ui,
            "Centre",
            &format!("The {centre_words}: where the imaginary data sit."),
        );
        let (lo, hi) = dials::centre_range(&prior, dial);
        let speed = (view.range.1 - view.range.0) / 400.0;
        let r = ui
            .add(
                egui::DragValue::new(&mut setting.centre)
                    .speed(speed)
                    .range(next_up(lo)..=next_down(hi))
                    .max_decimals(6),
            )
            .labelled_by(id)
            .on_hover_text(format!("The {centre_words}. Drag or type an exact value."));
        changed |= r.changed();
        let id = labelled(
            ui,
            "Effective sample size",
            &format!("How many {ess_words} the prior is worth: more is tighter."),
        );
        let ess_speed = setting.ess.max(0.1) / 100.0;
        let r = ui
            .add(
                egui::DragValue::new(&mut setting.ess)
                    .speed(ess_speed)
                    .range(dials::ESS_RANGE.0..=dials::ESS_RANGE.1)
                    .max_decimals(4),
            )
            .labelled_by(id)
            .on_hover_text(format!(
                "{ess_words} (effective sample size). Drag or type."
            ));
        changed |= r.changed();
    });
    if changed {
        set(w, expert, &prior, dial, setting, false);
    }
    ui.label(egui::RichText::new(format!("This prior is {}.", view.as_if)).italics())
        .on_hover_text("What the prior amounts to, in imaginary data.");
    if let Some(s) = &view.summary {
        ui.label(format!(
            "mean {}, sd {}, 95% central interval {} to {}",
            s.mean.map_or("–".to_owned(), num),
            s.sd.map_or("–".to_owned(), num),
            num(s.central.lower),
            num(s.central.upper)
        ));
    }
    // The density plot with handles.
    let handles = [view.centre, view.spread];
    let plot = Plot::new(("prior density", expert))
        .height(260.0)
        .legend(Legend::default())
        .allow_drag(false)
        .allow_zoom(false)
        .allow_scroll(false)
        .allow_boxed_zoom(false)
        .allow_double_click_reset(false)
        .x_axis_label(view.unknown.clone())
        .y_axis_label("density");
    let top = view
        .density
        .points
        .iter()
        .chain(view.others.iter().flat_map(|(_, c)| c.points.iter()))
        .map(|p| p[1])
        .fold(0.0, f64::max)
        .max(1e-12);
    let resp = plot.show(ui, |pui| {
        pui.set_plot_bounds(PlotBounds::from_min_max(
            [view.range.0, 0.0],
            [view.range.1, top * 1.12],
        ));
        for (i, c) in &view.others {
            pui.line(
                Line::new(c.name.clone(), c.points.clone())
                    .color(look::expert_color(*i, dark))
                    .style(LineStyle::dashed_loose())
                    .width(1.5),
            );
        }
        if let Some(c) = &view.pooled {
            pui.line(
                Line::new("pooled prior", c.points.clone())
                    .color(look::color(Role::Mark, dark))
                    .style(LineStyle::dotted_dense())
                    .width(2.0),
            );
        }
        pui.line(
            Line::new(name.clone(), view.density.points.clone())
                .color(look::color(Role::Prior, dark))
                .width(3.0),
        );
        pui.points(
            Points::new("centre (drag)", vec![handles[0]])
                .radius(8.0)
                .shape(MarkerShape::Circle)
                .filled(true)
                .color(look::color(Role::Mark, dark)),
        );
        pui.points(
            Points::new("95% point (drag)", vec![handles[1]])
                .radius(8.0)
                .shape(MarkerShape::Diamond)
                .filled(false)
                .color(look::color(Role::Mark, dark)),
        );
    });
    let r = &resp.response;
    let t = resp.transform;
    w.view.prior_transform = Some(t);
    if r.drag_started() {
        if let Some(p) = ui.input(|i| i.pointer.press_origin()) {
            let near = |h: [f64; 2]| {
                t.position_from_point(&PlotPoint::new(h[0], h[1]))
                    .distance(p)
            };
            let (dc, ds) = (near(handles[0]), near(handles[1]));
            let pick = if dc <= ds {
                (Handle::Centre, dc)
            } else {
                (Handle::Spread, ds)
            };
            if pick.1 < PICK {
                w.view.dragging = Some((pick.0, view.range));
            }
        }
    } else if let (true, Some((handle, _)), Some(pos)) =
        (r.dragged(), w.view.dragging, r.interact_pointer_pos())
    {
        let x = t.value_from_position(pos).x;
        let mut s = dials::setting(&prior, dial);
        match handle {
            Handle::Centre => {
                let (lo, hi) = dials::centre_range(&prior, dial);
                s.centre = x.clamp(next_up(lo), next_down(hi));
            }
            Handle::Spread => {
                if let Ok(n) = dials::ess_for_spread_point(&prior, dial, x.max(next_up(s.centre))) {
                    s.ess = n;
                }
            }
        }
        let continuing = w.drag_recorded;
        w.drag_recorded = true;
        set(w, expert, &prior, dial, s, continuing);
    }
    if r.drag_stopped() {
        w.view.dragging = None;
        w.drag_recorded = false;
    }
    ui.label(egui::RichText::new(
        "Drag the dot to move the centre; drag the diamond (the 95% point) to make the prior tighter or wider.",
    ).small());
}

fn set(
    w: &mut Workbench,
    expert: usize,
    prior: &crate::family::Prior,
    dial: Dial,
    s: Setting,
    continuing: bool,
) {
    match dials::with_setting(prior, dial, s) {
        Ok(p) => w.queue.push(Command::SetPrior {
            expert,
            prior: p,
            continuing,
        }),
        Err(e) => w.error(e.to_string()),
    }
}

fn category_name(prior: &crate::family::Prior, i: usize) -> String {
    match prior {
        crate::family::Prior::DirichletMultinomial(p) => p
            .names
            .as_ref()
            .and_then(|n| n.get(i).cloned())
            .unwrap_or_else(|| format!("theta{}", i + 1)),
        _ => String::new(),
    }
}

fn next_up(x: f64) -> f64 {
    if x.is_finite() {
        x + 1e-9 * x.abs().max(1.0)
    } else {
        f64::MIN
    }
}

fn next_down(x: f64) -> f64 {
    if x.is_finite() {
        x - 1e-9 * x.abs().max(1.0)
    } else {
        f64::MAX
    }
}
