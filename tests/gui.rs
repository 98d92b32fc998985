//! The desktop workbench driven through egui_kittest: no window, no GPU.
//! Each test acts as a user would and checks the project and the visible text.
#![cfg(feature = "gui")]

mod common;

use common::{centre, example};
use egui_kittest::kittest::Queryable as _;
use priorwright::elicit::dials::{self, Dial};
use priorwright::gui::Command;
use priorwright::gui::panels::judgments::Row;

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
    h.state_mut().view.rows = vec![Row::new("0.5", "0.2"), Row::new("0.9", "0.35")];
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
    assert!(h.query_by_label("Posterior").is_some());
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

#[test]
fn ctrl_z_undoes_and_ctrl_shift_z_and_ctrl_y_redo() {
    use egui::{Key, Modifiers};
    let mut h = example();
    let c0 = centre(&h);
    let mut moved = h.state().prior().unwrap().clone();
    let s = dials::setting(&moved, Dial::Main);
    moved = dials::with_setting(
        &moved,
        Dial::Main,
        dials::Setting {
            centre: s.centre * 1.5,
            ess: s.ess,
        },
    )
    .unwrap();
    h.state_mut().apply(Command::SetPrior {
        expert: 0,
        prior: moved,
        continuing: false,
    });
    h.run();
    let c1 = centre(&h);
    assert!((c1 - c0 * 1.5).abs() < 1e-9);
    h.key_press_modifiers(Modifiers::COMMAND, Key::Z);
    h.run();
    assert!((centre(&h) - c0).abs() < 1e-12, "Ctrl+Z undid the change");
    h.key_press_modifiers(Modifiers::COMMAND | Modifiers::SHIFT, Key::Z);
    h.run();
    assert!((centre(&h) - c1).abs() < 1e-12, "Ctrl+Shift+Z redid it");
    h.key_press_modifiers(Modifiers::COMMAND, Key::Z);
    h.run();
    assert!((centre(&h) - c0).abs() < 1e-12);
    h.key_press_modifiers(Modifiers::COMMAND, Key::Y);
    h.run();
    assert!((centre(&h) - c1).abs() < 1e-12, "Ctrl+Y redid it");
}

#[test]
fn the_imagined_data_form_keeps_the_centre_and_sets_the_ess() {
    let mut h = example();
    let c = centre(&h);
    h.get_by_label("Imagined data").click();
    h.run();
    // The form starts with 8 successes in 20 trials moving the estimate to 0.3.
    h.get_by_label("Set the ESS from this").click();
    h.run();
    // Beta posterior mean (c·E + s)/(E + n) = estimate solved for the ESS E
    // (conjugate beta-binomial update, common practice).
    let want = (8.0 - 0.3 * 20.0) / (0.3 - c);
    assert!((centre(&h) - c).abs() < 1e-9, "the centre is kept");
    assert!(
        (common::ess(&h) - want).abs() < 1e-6 * want,
        "ESS {} against {want}",
        common::ess(&h)
    );
    assert_eq!(
        h.state().project.experts[0].method,
        Some(priorwright::project::MethodRecord::Imagined {
            text: "successes=8,trials=20,estimate=0.3".into()
        })
    );
}

#[test]
fn the_future_observation_form_fits_through_the_prior_predictive() {
    let mut h = example();
    h.state_mut()
        .apply(Command::SetFamily("gamma-exponential".into()));
    h.run();
    h.get_by_label("About a future observation").click();
    h.run();
    h.state_mut().view.observable_rows = vec![Row::new("0.5", "400"), Row::new("0.9", "2500")];
    h.run();
    h.get_by_label("Fit through the prior predictive").click();
    h.run();
    let prior = h.state().prior().unwrap().clone();
    let fut = prior.parse_future("n=1").unwrap();
    let priorwright::family::Predictive::Value(law) = prior.predictive(&fut).unwrap() else {
        panic!("a waiting time has a continuous predictive");
    };
    // Two judgments on the two hyperparameters are met exactly.
    assert!((law.cdf(400.0) - 0.5).abs() < 1e-6, "{}", law.cdf(400.0));
    assert!((law.cdf(2500.0) - 0.9).abs() < 1e-6, "{}", law.cdf(2500.0));
    assert!(matches!(
        h.state().project.experts[0].method,
        Some(priorwright::project::MethodRecord::Observable { .. })
    ));
    assert!(h.query_by_label_contains("Prior predictive").is_some());
}

#[test]
fn the_chips_grid_is_saved_with_the_project_and_comes_back_on_open() {
    let dir = common::folder("chips");
    let mut h = example();
    h.get_by_label("Chips in bins").click();
    h.run();
    for b in [2, 3, 3, 4, 4, 4, 5] {
        h.get_by_label(&format!("add a chip to bin {b}")).click();
        h.run();
    }
    let chips = h.state().view.chips.clone();
    let file = dir.join("chips.ron");
    h.state_mut().apply(Command::SaveTo(file.clone()));
    h.run();
    let mut again = common::harness(priorwright::gui::Workbench::open(
        &file,
        Box::new(priorwright::gui::files::NoChooser),
        common::settings(),
    ));
    again.run();
    assert_eq!(again.state().view.chips, chips);
    assert!(again.query_by_label("add a chip to bin 1").is_some());
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn judgments_on_both_unknowns_of_a_normal_inverse_gamma_prior_keep_what_they_are_about() {
    let mut h = common::sample("tablet-coating");
    let before: Vec<Option<String>> = h.state().project.experts[0]
        .judgments
        .iter()
        .map(|j| j.parameter.clone())
        .collect();
    assert!(
        before
            .iter()
            .collect::<std::collections::BTreeSet<_>>()
            .len()
            > 1,
        "the sample states judgments on both unknowns: {before:?}"
    );
    assert!(h.query_by_label("judgment about1").is_some());
    h.get_by_label("Fit the prior to these").click();
    h.run();
    let after: Vec<Option<String>> = h.state().project.experts[0]
        .judgments
        .iter()
        .map(|j| j.parameter.clone())
        .collect();
    assert_eq!(after, before);
}

#[test]
fn with_data_the_window_shows_the_hpd_set_the_sensitivity_table_and_a_threshold_warning() {
    let mut h = common::sample("checkout-button");
    let post = h.state_mut().derived().posterior.clone().unwrap().unwrap();
    let hpd = &post.summary.hpd;
    assert!(hpd.pieces.is_empty(), "one piece here");
    let shown = format!(
        "{} to {}",
        priorwright::gui::panels::num(hpd.lower),
        priorwright::gui::panels::num(hpd.upper)
    );
    assert!(
        h.query_by_label(&shown).is_some(),
        "HPD set {shown} is shown"
    );
    for row in ["elicited", "vague", "sceptical", "enthusiastic"] {
        assert!(h.query_by_label(row).is_some(), "{row} row");
    }
    assert!(
        h.query_by_label_contains("Sensitivity to the prior")
            .is_some()
    );
    assert!(
        h.query_by_label_contains("Prior and data disagree")
            .is_none()
    );
    // Data far above every expert: 60 successes in 100 trials.
    h.state_mut().apply(Command::RemoveData(0));
    let stats = h
        .state()
        .prior()
        .unwrap()
        .parse_data("successes=60,trials=100")
        .unwrap();
    h.state_mut()
        .apply(Command::AddData(priorwright::project::DataSource {
            name: "surprising".into(),
            path: None,
            mapping: None,
            missing_policy: priorwright::data::Missing::Skip,
            statistics: stats,
            rows: 100,
            missing: 0,
        }));
    h.run();
    let p = h
        .state_mut()
        .derived()
        .posterior
        .clone()
        .unwrap()
        .unwrap()
        .conflict
        .unwrap()
        .p_value;
    assert!(p < 0.05, "p = {p}");
    assert!(
        h.query_by_label_contains("Prior and data disagree")
            .is_some()
    );
    h.state_mut().apply(Command::SetConflictThreshold(p / 2.0));
    h.run();
    assert!(
        h.query_by_label_contains("Prior and data disagree")
            .is_none(),
        "below the threshold p/2 no warning"
    );
    h.state_mut().apply(Command::Undo);
    h.run();
    assert_eq!(h.state().project.checks.conflict_threshold, 0.05);
}

#[test]
fn alternatives_typed_in_the_window_replace_the_defaults_and_bad_ones_give_a_notice() {
    let mut h = common::sample("checkout-button");
    // Tall enough that the sensitivity section is on screen (clipped
    // widgets take no clicks).
    h.set_size(egui::vec2(1400.0, 3200.0));
    h.run();
    h.get_by_label("Edit the alternatives").click();
    h.run();
    assert!(h.state().view.alternatives_open, "the editor opened");
    assert_eq!(
        h.state().view.alternatives.len(),
        3,
        "the defaults to start from"
    );
    h.state_mut().view.alternatives = vec![("flat".into(), "alpha=1,beta=1".into())];
    h.run();
    h.get_by_label("Use these alternatives").click();
    h.run();
    assert_eq!(h.state().project.checks.alternatives.len(), 1);
    let post = h.state_mut().derived().posterior.clone().unwrap().unwrap();
    let table = post.sensitivity.unwrap().table;
    assert_eq!(table[1].name, "flat");
    let data = &h.state().project.data[0].statistics;
    let flat = priorwright::family::Prior::parse("beta-binomial", "alpha=1,beta=1")
        .unwrap()
        .update(data)
        .unwrap();
    let want = flat.marginals()[0].distribution.mean().unwrap();
    assert!((table[1].posterior.mean.unwrap() - want).abs() < 1e-12);

    h.state_mut().view.alternatives = vec![("bad".into(), "alpha=-1,beta=1".into())];
    h.run();
    h.get_by_label("Use these alternatives").click();
    h.run();
    assert!(h.query_by_label_contains("alternative 'bad'").is_some());
    assert_eq!(
        h.state().project.checks.alternatives.len(),
        1,
        "nothing lost"
    );

    h.get_by_label("Back to the defaults").click();
    h.run();
    assert!(h.state().project.checks.alternatives.is_empty());
}
