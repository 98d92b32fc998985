//! Helpers shared by the GUI test files: a workbench in a kittest harness.
#![allow(dead_code)]

use egui_kittest::Harness;
use priorwright::elicit::dials::{self, Dial};
use priorwright::gui::files::NoChooser;
use priorwright::gui::{Settings, Workbench, show};
use std::path::PathBuf;

/// No state folder and no autosave: nothing outside the test is touched.
pub fn settings() -> Settings {
    Settings {
        state_dir: None,
        autosave_secs: None,
    }
}

/// Settings with a state folder of the test's own and autosave at every frame.
pub fn settings_in(dir: &std::path::Path) -> Settings {
    Settings {
        state_dir: Some(dir.to_path_buf()),
        autosave_secs: Some(0.0),
    }
}

/// A fresh, empty folder for one test.
pub fn folder(name: &str) -> PathBuf {
    let dir = std::env::temp_dir().join(format!("pw-gui-{name}-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).unwrap();
    dir
}

pub fn harness(w: Workbench) -> Harness<'static, Workbench> {
    Harness::builder()
        .with_size(egui::vec2(1400.0, 1000.0))
        .with_max_steps(12)
        .build_ui_state(|ui, w: &mut Workbench| show(ui, w), w)
}

pub fn example() -> Harness<'static, Workbench> {
    let mut h = harness(Workbench::example(Box::new(NoChooser), settings()));
    h.run();
    h
}

/// The workbench on one of the bundled sample projects.
pub fn sample(name: &str) -> Harness<'static, Workbench> {
    let path = std::path::Path::new(env!("CARGO_MANIFEST_DIR"))
        .join(format!("sample-projects/{name}.ron"));
    let mut h = harness(Workbench::open(&path, Box::new(NoChooser), settings()));
    h.run();
    h
}

pub fn centre(h: &Harness<'_, Workbench>) -> f64 {
    dials::setting(h.state().prior().unwrap(), Dial::Main).centre
}

pub fn ess(h: &Harness<'_, Workbench>) -> f64 {
    dials::setting(h.state().prior().unwrap(), Dial::Main).ess
}
