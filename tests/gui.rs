//! The desktop workbench driven through egui_kittest: no window, no GPU.
//! Each test acts as a user would and checks the project and the visible text.
#![cfg(feature = "gui")]

use egui_kittest::Harness;
use egui_kittest::kittest::Queryable as _;
use priorwright::elicit::dials::{self, Dial};
use priorwright::gui::files::NoChooser;
use priorwright::gui::{Command, Settings, Workbench, show};

fn settings() -> Settings {
    Settings {
        state_dir: None,
        autosave_secs: None,
    }
}

fn harness(w: Workbench) -> Harness<'static, Workbench> {
    Harness::builder()
        .with_size(egui::vec2(1400.0, 1000.0))
        .with_max_steps(12)
        .build_ui_state(|ui, w: &mut Workbench| show(ui, w), w)
}

fn example() -> Harness<'static, Workbench> {
    let mut h = harness(Workbench::example(Box::new(NoChooser), settings()));
    h.run();
    h
}

fn centre(h: &Harness<'_, Workbench>) -> f64 {
    let w = h.state();
    dials::setting(w.prior().unwrap(), Dial::Main).centre
}

#[test]
fn the_example_opens_with_its_experts_and_the_caution() {
    let h = example();
    assert!(h.get_all_by_label("Product manager").count() >= 1);
    assert!(h.get_all_by_label("Analyst").count() >= 1);
    assert!(h.query_by_label_contains("Responsible use").is_some());
    assert!(h.query_by_label_contains("This prior is as if").is_some());
}

#[test]
fn dragging_the_centre_handle_moves_the_prior_and_undo_takes_the_whole_drag_back() {
    let mut h = example();
    let before = h.state().project.clone();
    let c0 = centre(&h);
    let view = h.state_mut().derived().prior.clone().unwrap();
    let t = h
        .state()
        .view
        .prior_transform
        .expect("the prior plot was drawn");
    let start = t.position_from_point(&egui_plot::PlotPoint::new(view.centre[0], view.centre[1]));
    h.hover_at(start);
    h.drag_at(start);
    h.step();
    for dx in [10.0, 30.0, 50.0, 60.0] {
        h.hover_at(start + egui::vec2(dx, 0.0));
        h.step();
    }
    h.drop_at(start + egui::vec2(60.0, 0.0));
    h.run();
    let picked = (centre(&h) - c0).abs() > 1e-9;
    assert!(picked, "no drag moved the centre");
    assert!(centre(&h) > c0, "dragged right, the centre must grow");
    assert!(h.state().dirty());
    h.state_mut().apply(Command::Undo);
    h.run();
    assert_eq!(
        h.state().project.experts,
        before.experts,
        "one undo takes the whole drag back"
    );
    h.state_mut().apply(Command::Redo);
    h.run();
    assert!(centre(&h) > c0);
}

#[test]
fn typed_judgments_fit_the_prior_and_show_stated_against_fitted() {
    let mut h = example();
    h.get_by_label("judgment p1").focus();
    h.run();
    h.get_by_label("judgment p1").type_text("0.5");
    h.run();
    // The example's first expert already holds two judgments; replace them.
    h.state_mut().view.rows = vec![("0.5".into(), "0.2".into()), ("0.9".into(), "0.35".into())];
    h.run();
    h.get_by_label("Fit the prior to these").click();
    h.run();
    let prior = h.state().prior().unwrap().clone();
    let theta = &prior.marginals()[0].distribution;
    // Two judgments on two hyperparameters are met exactly.
    assert!((theta.tails(0.2).0 - 0.5).abs() < 1e-6);
    assert!((theta.tails(0.35).0 - 0.9).abs() < 1e-6);
    assert!(h.get_all_by_label("0.900").count() >= 1, "fitted p shown");
}

#[test]
fn adding_an_expert_and_pooling_logarithmically_changes_the_pool() {
    let mut h = example();
    let n = h.state().project.experts.len();
    h.get_by_label("Add an expert").click();
    h.run();
    assert_eq!(h.state().project.experts.len(), n + 1);
    let w = h
        .state()
        .project
        .experts
        .iter()
        .map(|e| e.weight)
        .sum::<f64>();
    assert!((w - 1.0).abs() < 1e-12);
    h.get_by_label("logarithmic").click();
    h.run();
    assert_eq!(
        h.state().project.pooling.method,
        priorwright::elicit::PoolMethod::Log
    );
    assert!(h.state().project.pooling.pooled.is_some());
}

#[test]
fn a_data_file_that_cannot_be_read_gives_a_notice_and_changes_nothing() {
    let mut h = example();
    let before = h.state().project.clone();
    h.state_mut()
        .apply(Command::MapData("/no/such/file.csv".into()));
    h.run();
    assert_eq!(h.state().project, before);
    assert!(h.query_by_label_contains("cannot be opened").is_some());
}

#[test]
fn every_family_can_be_chosen_and_drawn() {
    let mut h = example();
    for fam in priorwright::family::FAMILY_IDS {
        h.state_mut().apply(Command::SetFamily(fam.to_owned()));
        h.run();
        assert_eq!(h.state().project.scenario.family, fam);
        assert!(
            h.query_by_label_contains("This prior is as if").is_some(),
            "{fam}"
        );
        let unknown = h.state_mut().derived().prior.clone().unwrap().unknown;
        assert!(
            h.query_by_label_contains(&format!("Prior of {unknown}"))
                .is_some(),
            "{fam}"
        );
    }
}

#[test]
fn dragging_the_spread_handle_left_raises_the_ess() {
    let mut h = example();
    let ess0 = dials::setting(h.state().prior().unwrap(), Dial::Main).ess;
    let view = h.state_mut().derived().prior.clone().unwrap();
    let t = h.state().view.prior_transform.unwrap();
    let start = t.position_from_point(&egui_plot::PlotPoint::new(view.spread[0], view.spread[1]));
    h.hover_at(start);
    h.drag_at(start);
    h.step();
    for dx in [-5.0, -15.0, -30.0] {
        h.hover_at(start + egui::vec2(dx, 0.0));
        h.step();
    }
    h.drop_at(start + egui::vec2(-30.0, 0.0));
    h.run();
    let ess = dials::setting(h.state().prior().unwrap(), Dial::Main).ess;
    assert!(
        ess > ess0 * 1.05,
        "a 95% point nearer the centre is a tighter prior: {ess0} -> {ess}"
    );
}

#[test]
fn chips_in_bins_refit_the_prior() {
    let mut h = example();
    h.get_by_label("Chips in bins").click();
    h.run();
    for b in [3, 4, 4, 5, 5, 5, 6, 6, 7] {
        h.get_by_label(&format!("add a chip to bin {b}")).click();
        h.run();
    }
    let w = h.state();
    let js = &w.project.experts[0].judgments;
    assert!(
        js.len() >= 3,
        "the chips became stated probabilities: {js:?}"
    );
    assert!(w.dirty());
}

#[test]
fn a_data_file_given_by_path_adds_the_posterior_and_save_reopen_gives_the_same_project() {
    let dir = std::env::temp_dir().join(format!("pw-gui-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let csv = dir.join("clicks.csv");
    std::fs::write(&csv, "visitor,bought\n1,1\n2,0\n3,0\n4,1\n5,0\n").unwrap();
    let mut h = example();
    let n = h.state().project.data.len();
    h.state_mut().apply(Command::MapData(csv.clone()));
    h.run();
    // The mapping dialog guesses the first column; choose 'bought'.
    if let Some(priorwright::gui::workbench::Dialog::Mapping(d)) = &mut h.state_mut().dialog {
        d.mapping = priorwright::data::Mapping::Binary {
            column: "bought".into(),
        };
    }
    h.run();
    h.get_by_label("Read the file").click();
    h.run();
    assert_eq!(h.state().project.data.len(), n + 1);
    assert!(h.query_by_label_contains("Posterior").is_some());
    assert!(
        h.query_by_label_contains("prior's share of the information")
            .is_some()
    );
    let file = dir.join("saved.ron");
    h.state_mut().apply(Command::SaveTo(file.clone()));
    h.run();
    assert!(!h.state().dirty());
    let reopened = priorwright::project::load(&file).unwrap();
    assert_eq!(reopened, h.state().project);
    let _ = std::fs::remove_dir_all(&dir);
}
