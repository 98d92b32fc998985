//! The left panel: the model, the experts and their pool.

use super::super::command::Command;
use super::super::workbench::Workbench;
use super::labelled;
use crate::elicit::PoolMethod;
use crate::family::FAMILY_IDS;

/// One line per family for the chooser's tooltip.
fn family_words(id: &str) -> &'static str {
    match id {
        "beta-binomial" => "a success probability θ, with successes in trials",
        "gamma-poisson" => "an event rate λ, with counts over an exposure",
        "gamma-exponential" => "a failure rate λ, with times to failure (censoring allowed)",
        "normal-known-variance" => "a mean μ, with values of known spread σ",
        "normal-inverse-gamma" => "a mean μ and variance σ², both unknown",
        "dirichlet-multinomial" => "shares of several categories, with counts per category",
        _ => "a variance σ², with values about a known mean",
    }
}

/// The panel.
pub fn show(ui: &mut egui::Ui, w: &mut Workbench) {
    ui.heading("Project");
    let mut title = w.project.scenario.title.clone();
    let id = labelled(ui, "Title", "What is being elicited, in a few words");
    if ui
        .add(egui::TextEdit::singleline(&mut title).desired_width(f32::INFINITY))
        .labelled_by(id)
        .on_hover_text("The project's title (shown in exports and the report)")
        .lost_focus()
        && title != w.project.scenario.title
    {
        w.queue.push(Command::SetTitle(title));
    }
    if w.project.scenario.high_stakes {
        ui.colored_label(
            ui.visuals().warn_fg_color,
            "A safety, clinical or financial decision rests on this prior: follow the applicable guidance and have it reviewed.",
        );
    }
    let fam = w.project.scenario.family.clone();
    egui::ComboBox::from_label("Model")
        .selected_text(fam.clone())
        .show_ui(ui, |ui| {
            for id in FAMILY_IDS {
                if ui
                    .selectable_label(fam == id, id)
                    .on_hover_text(family_words(id))
                    .clicked()
                {
                    w.queue.push(Command::SetFamily(id.to_owned()));
                }
            }
        })
        .response
        .on_hover_text(format!("The conjugate model: {}", family_words(&fam)));
    ui.separator();
    ui.heading("Experts");
    let n = w.project.experts.len();
    let mut select = None;
    for i in 0..n {
        let e = &w.project.experts[i];
        let (name, weight) = (e.name.clone(), e.weight);
        ui.horizontal(|ui| {
            if ui
                .selectable_label(w.view.expert == i, &name)
                .on_hover_text("Show and edit this expert's prior")
                .clicked()
            {
                select = Some(i);
            }
            let mut wgt = weight;
            let r = ui
                .add(egui::DragValue::new(&mut wgt).range(0.0..=1.0).speed(0.005).max_decimals(3))
                .on_hover_text("This expert's weight in the pool; the others are rescaled so the weights sum to one")
                .accessible_name(format!("weight of {name}"));
            if r.changed() && n > 1 {
                w.queue.push(Command::SetWeight(i, wgt));
            }
            if n > 1
                && ui
                    .small_button("remove")
                    .on_hover_text(format!("Remove {name}"))
                    .accessible_name(format!("remove {name}"))
                    .clicked()
            {
                w.queue.push(Command::RemoveExpert(i));
            }
        });
    }
    if let Some(i) = select {
        w.view.expert = i;
        w.view.rows_for = None;
    }
    let i = w.view.expert.min(n.saturating_sub(1));
    if let Some(e) = w.project.experts.get(i) {
        let mut name = e.name.clone();
        let id = labelled(
            ui,
            "Name of the selected expert",
            "Rename the selected expert",
        );
        if ui
            .add(egui::TextEdit::singleline(&mut name).desired_width(200.0))
            .labelled_by(id)
            .on_hover_text("Type a new name and press Enter")
            .lost_focus()
            && name != e.name
        {
            w.queue.push(Command::RenameExpert(i, name));
        }
    }
    if ui
        .button("Add an expert")
        .on_hover_text("A new expert, starting from a copy of the selected expert's prior; weights become equal")
        .clicked()
    {
        w.queue.push(Command::AddExpert);
    }
    ui.separator();
    ui.heading("Pooling");
    let method = w.project.pooling.method;
    ui.horizontal(|ui| {
        if ui
            .radio(method == PoolMethod::Linear, "linear")
            .on_hover_text("Linear pool: the weighted mixture of the experts' priors (keeps disagreement visible)")
            .clicked()
        {
            w.queue.push(Command::SetPool(PoolMethod::Linear));
        }
        if ui
            .radio(method == PoolMethod::Log, "logarithmic")
            .on_hover_text("Logarithmic pool: one prior of the same family, the weighted geometric mean (tighter)")
            .clicked()
        {
            w.queue.push(Command::SetPool(PoolMethod::Log));
        }
    });
    let robust = w.project.pooling.robust_weight;
    let mut on = robust.is_some();
    if ui
        .checkbox(&mut on, "robust mixture")
        .on_hover_text("Mix in a vague unit-information prior, so data that clash with the experts can overrule them")
        .changed()
    {
        w.queue.push(Command::SetRobust(on.then_some(0.1)));
    }
    if let Some(rw) = robust {
        let mut v = rw;
        ui.horizontal(|ui| {
            let id = labelled(ui, "Robust weight", "Weight of the vague component");
            if ui
                .add(
                    egui::DragValue::new(&mut v)
                        .range(0.01..=0.99)
                        .speed(0.005)
                        .max_decimals(3),
                )
                .labelled_by(id)
                .on_hover_text("Weight of the unit-information component, in (0, 1)")
                .changed()
            {
                w.queue.push(Command::SetRobust(Some(v)));
            }
        });
    }
    if n > 1
        && let Some(p) = &w.project.pooling.pooled
    {
        ui.label(format!("last logarithmic pool: {}", p.as_if()));
    }
    ui.separator();
    ui.collapsing("Notes", |ui| {
        let mut notes = w.project.notes.clone();
        let id = labelled(
            ui,
            "Notes for the record",
            "Reasoning, sources, who was present",
        );
        if ui
            .add(
                egui::TextEdit::multiline(&mut notes)
                    .desired_rows(4)
                    .desired_width(f32::INFINITY),
            )
            .labelled_by(id)
            .on_hover_text("Record the reasoning behind the judgments")
            .lost_focus()
            && notes != w.project.notes
        {
            w.queue.push(Command::SetNotes(notes));
        }
    });
}
